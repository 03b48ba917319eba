#!/usr/bin/python3
"""FWHM of an Airy pattern convolved with a square pixel, measured like dev.nitid.psf.PsfFigures
(diameter of the circle whose area equals the half-maximum region). Used for the bound in
core/src/test/java/dev/nitid/psf/PsfsTest.java (PIXEL_AIRY_FWHM_RATIO). Run with Debian's
/usr/bin/python3 (scipy 1.10.1, numpy 1.24.2); prints

    airy      equal-area FWHM 2.263272 px (1.028760 lambda/D)
    airy*box  equal-area FWHM 2.340537 px (1.063880 lambda/D)
    ratio 1.034138
"""
import numpy as np
from scipy.ndimage import uniform_filter
from scipy.special import j1

LAMBDA_OVER_D_PX = 2.2  # 550 nm, D = 200 mm, f = 2000 mm, 2.5 um pixels
SUB = 40                # grid samples per pixel
H = 1.0 / SUB
N = 10 * SUB            # +-10 px

x = np.arange(-N, N + 1) * H
X, Y = np.meshgrid(x, x)
v = np.pi * np.hypot(X, Y) / LAMBDA_OVER_D_PX
with np.errstate(invalid="ignore", divide="ignore"):
    airy = (2 * j1(v) / v) ** 2
airy[v == 0] = 1
box = uniform_filter(airy, size=SUB, mode="constant")  # mean over a 1 x 1 px square


def equal_area_fwhm(a):
    area = (a >= a.max() / 2).sum() * H * H
    return 2 * np.sqrt(area / np.pi)


fa = equal_area_fwhm(airy)
fb = equal_area_fwhm(box)
print("airy      equal-area FWHM %.6f px (%.6f lambda/D)" % (fa, fa / LAMBDA_OVER_D_PX))
print("airy*box  equal-area FWHM %.6f px (%.6f lambda/D)" % (fb, fb / LAMBDA_OVER_D_PX))
print("ratio %.6f" % (fb / fa))
