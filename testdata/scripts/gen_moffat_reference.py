#!/usr/bin/python3
"""Golden values for Nitid's Moffat and Gaussian PSF models, from astropy's Moffat2D and Gaussian2D.

Run from anywhere with the Debian interpreter:  /usr/bin/python3 testdata/scripts/gen_moffat_reference.py
Writes (next to the test data resources):
  testdata/src/main/resources/dev/nitid/testdata/psf/moffat2d_astropy.csv
  testdata/src/main/resources/dev/nitid/testdata/psf/gaussian2d_astropy.csv

Reference environment: Debian 12 python3-astropy 5.2.1, python3-numpy 1.24.2 (versions are written into
the CSV header by this script).

Naming trap: astropy's Moffat2D(amplitude, x_0, y_0, gamma, alpha) uses *gamma* for the core width and
*alpha* for the power index; Moffat (1969) and Trujillo et al. (2001) call them alpha and beta. The
amplitude is set to (beta-1)/(pi*gamma^2) so that the profile has unit integral, as Nitid's MoffatPsf.
"""
import csv
import math
import os

import astropy
import numpy as np
from astropy.modeling.models import Gaussian2D, Moffat2D

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "..", "src", "main", "resources", "dev", "nitid", "testdata", "psf")
os.makedirs(OUT, exist_ok=True)

POINTS = [(0.0, 0.0), (0.5, 0.0), (1.0, 1.0), (-2.0, 0.5), (3.0, -4.0), (0.25, -0.75), (7.0, 2.0)]

with open(os.path.join(OUT, "moffat2d_astropy.csv"), "w", newline="") as f:
    f.write(f"# astropy {astropy.__version__} Moffat2D, numpy {np.__version__}; "
            "core width = astropy gamma, power index = astropy alpha; amplitude (beta-1)/(pi*gamma^2)\n")
    w = csv.writer(f)
    w.writerow(["core_width_alpha", "beta", "x", "y", "value", "fwhm"])
    for core, beta in [(2.0, 2.5), (2.0, 3.0), (2.0, 4.765), (1.3, 1.5), (3.7, 8.0)]:
        amp = (beta - 1) / (math.pi * core * core)
        m = Moffat2D(amplitude=amp, x_0=0.0, y_0=0.0, gamma=core, alpha=beta)
        for x, y in POINTS:
            w.writerow([core, beta, x, y, repr(float(m(x, y))), repr(float(m.fwhm))])

with open(os.path.join(OUT, "gaussian2d_astropy.csv"), "w", newline="") as f:
    f.write(f"# astropy {astropy.__version__} Gaussian2D, numpy {np.__version__}; "
            "theta in radians counter-clockwise from +x; amplitude 1/(2 pi sx sy)\n")
    w = csv.writer(f)
    w.writerow(["x_stddev", "y_stddev", "theta_deg", "x", "y", "value", "x_fwhm", "y_fwhm"])
    for sx, sy, deg in [(1.0, 1.0, 0.0), (2.0, 1.0, 30.0), (3.0, 1.5, -65.0), (1.7, 0.9, 90.0)]:
        amp = 1.0 / (2 * math.pi * sx * sy)
        g = Gaussian2D(amplitude=amp, x_mean=0.0, y_mean=0.0, x_stddev=sx, y_stddev=sy,
                       theta=math.radians(deg))
        for x, y in POINTS:
            w.writerow([sx, sy, deg, x, y, repr(float(g(x, y))), repr(float(g.x_fwhm)), repr(float(g.y_fwhm))])

print("wrote", os.path.normpath(OUT))
