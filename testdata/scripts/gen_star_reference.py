#!/usr/bin/python3
"""Reference data for Nitid's star measurement, computed with external libraries.

Run from the repository root with the Debian interpreter (Debian 12 packages python3-numpy,
python3-scipy, python3-astropy, python3-photutils):

    /usr/bin/python3 testdata/scripts/gen_star_reference.py

Writes, under testdata/src/main/resources/dev/nitid/testdata/stars/:

  golden_field.f32          an invented 320x240 star field, float32 little-endian, row-major (row 0 first)
  golden_field_truth.csv    the true star positions and peaks (0-based x = column, y = row)
  golden_field_dao.csv      photutils DAOStarFinder detections on that field
  lsq_stamps.csv            two 15x15 noisy stamps (elliptical Gaussian, elliptical Moffat), one row per stamp
  lsq_curve_fit.csv         scipy.optimize.curve_fit (MINPACK Levenberg-Marquardt) parameters and standard errors
                            for the same models Nitid fits, on those stamps
  dss_cutout_dao.csv        photutils DAOStarFinder on the Digitized Sky Survey cutout that python3-astropy
                            ships (wcs/tests/data/dss.14.29.56-62.41.05.fits.gz): positions only, the image
                            itself is read from the installed package by the tests, never copied
  versions.txt              library versions used

Everything is deterministic (numpy PCG64 with fixed seeds). Coordinates: pixel (i, j) has its centre at
x = i, y = j.
"""
import os
import sys

import numpy as np
import scipy
import scipy.optimize
import astropy
from astropy.stats import sigma_clipped_stats
import photutils
from photutils.detection import DAOStarFinder

OUT = "testdata/src/main/resources/dev/nitid/testdata/stars"

W, H = 320, 240
N_STARS = 70
FWHM_MAJOR, FWHM_MINOR, ANGLE, BETA = 3.4, 3.0, 0.5, 3.0
SKY, GRADIENT = 200.0, 0.15


def moffat(dx, dy, fmaj, fmin, ang, beta):
    """Unit-peak elliptical Moffat; alpha = FWHM / (2 sqrt(2^(1/beta) - 1)) (Trujillo et al. 2001, eq. 2)."""
    k = 2 * np.sqrt(2 ** (1 / beta) - 1)
    au, av = fmaj / k, fmin / k
    c, s = np.cos(ang), np.sin(ang)
    u = dx * c + dy * s
    v = -dx * s + dy * c
    return (1 + (u / au) ** 2 + (v / av) ** 2) ** (-beta)


def make_field():
    rng = np.random.default_rng(20240611)
    img = np.zeros((H, W))
    yy, xx = np.mgrid[0:H, 0:W]
    truth = []
    sub = 5  # 5x5 midpoint average per pixel: pixel-integrated stars
    offs = (np.arange(sub) + 0.5) / sub - 0.5
    while len(truth) < N_STARS:
        x, y = rng.uniform(10, W - 10), rng.uniform(10, H - 10)
        if any((x - t[0]) ** 2 + (y - t[1]) ** 2 < 12 ** 2 for t in truth):
            continue
        peak = 150 * (20000 / 150) ** rng.uniform()
        x0, x1 = int(x) - 15, int(x) + 16
        y0, y1 = int(y) - 15, int(y) + 16
        x0, y0 = max(x0, 0), max(y0, 0)
        x1, y1 = min(x1, W), min(y1, H)
        acc = np.zeros((y1 - y0, x1 - x0))
        for oy in offs:
            for ox in offs:
                acc += moffat(xx[y0:y1, x0:x1] + ox - x, yy[y0:y1, x0:x1] + oy - y,
                              FWHM_MAJOR, FWHM_MINOR, ANGLE, BETA)
        img[y0:y1, x0:x1] += peak * acc / sub ** 2
        truth.append((x, y, peak))
    img += SKY + GRADIENT * (xx + 0.5 * yy)
    img = rng.poisson(img).astype(np.float32)
    return img, truth


def stamp_models():
    """Two 15x15 stamps with the quadratic-form models Nitid uses, point-sampled at pixel centres."""
    n = 15
    yy, xx = np.mgrid[0:n, 0:n]
    X = np.vstack([xx.ravel(), yy.ravel()]).astype(float)

    def gauss(X, A, x0, y0, a, b, c, B):
        dx, dy = X[0] - x0, X[1] - y0
        return A * np.exp(-0.5 * (a * dx * dx + 2 * b * dx * dy + c * dy * dy)) + B

    def moff(X, A, x0, y0, a, b, c, beta, B):
        dx, dy = X[0] - x0, X[1] - y0
        return A * (1 + a * dx * dx + 2 * b * dx * dy + c * dy * dy) ** (-beta) + B

    rng = np.random.default_rng(7)
    rows = []
    g_true = (800.0, 7.3, 6.8, 0.55, 0.08, 0.40, 50.0)
    g = gauss(X, *g_true) + rng.normal(0, 12.0, n * n)
    m_true = (800.0, 6.9, 7.2, 0.14, -0.02, 0.11, 2.8, 50.0)
    m = moff(X, *m_true) + rng.normal(0, 12.0, n * n)
    # Start points of the same kind Nitid uses (simple statistics), so both solvers reach the same minimum.
    pg, cg = scipy.optimize.curve_fit(gauss, X, g, p0=(g.max() - 50, 7, 7, 0.4, 0.0, 0.4, 50))
    pm, cm = scipy.optimize.curve_fit(moff, X, m, p0=(m.max() - 50, 7, 7, 0.1, 0.0, 0.1, 3.0, 50))
    rows.append(("gaussian", g, g_true, pg, np.sqrt(np.diag(cg)), np.sum((g - gauss(X, *pg)) ** 2)))
    rows.append(("moffat", m, m_true, pm, np.sqrt(np.diag(cm)), np.sum((m - moff(X, *pm)) ** 2)))
    return rows


def main():
    os.makedirs(OUT, exist_ok=True)
    img, truth = make_field()
    img.astype("<f4").tofile(os.path.join(OUT, "golden_field.f32"))
    with open(os.path.join(OUT, "golden_field_truth.csv"), "w") as f:
        f.write(f"# gen_star_reference.py: {W}x{H} field, {N_STARS} elliptical Moffat stars FWHM {FWHM_MAJOR}/"
                f"{FWHM_MINOR} px angle {ANGLE} rad beta {BETA}, pixel-integrated (5x5), sky {SKY} + {GRADIENT}*(x+0.5y), "
                f"Poisson noise (numpy {np.__version__} PCG64 seed 20240611)\n")
        f.write("x,y,peak\n")
        for x, y, p in truth:
            f.write(f"{x:.6f},{y:.6f},{p:.4f}\n")
    mean, med, std = sigma_clipped_stats(img, sigma=3.0, maxiters=10)
    finder = DAOStarFinder(fwhm=3.0, threshold=5.0 * std)
    tab = finder(img - med)
    with open(os.path.join(OUT, "golden_field_dao.csv"), "w") as f:
        f.write(f"# photutils {photutils.__version__} DAOStarFinder(fwhm=3.0, threshold=5*std) on data - median; "
                f"astropy {astropy.__version__} sigma_clipped_stats(sigma=3, maxiters=10): median={med:.6g} "
                f"std={std:.6g}; 0-based x=col, y=row\n")
        f.write("x,y,peak,flux,sharpness,roundness1,roundness2\n")
        for t in tab:
            f.write(f"{float(t['xcentroid']):.5f},{float(t['ycentroid']):.5f},{float(t['peak']):.6g},"
                    f"{float(t['flux']):.6g},{float(t['sharpness']):.5f},{float(t['roundness1']):.5f},"
                    f"{float(t['roundness2']):.5f}\n")
    dss = os.path.join(os.path.dirname(astropy.__file__), "wcs/tests/data/dss.14.29.56-62.41.05.fits.gz")
    from astropy.io import fits
    ddata = fits.getdata(dss, 0).astype(np.float64)
    dmean, dmed, dstd = sigma_clipped_stats(ddata, sigma=3.0, maxiters=10)
    dtab = DAOStarFinder(fwhm=3.0, threshold=5.0 * dstd)(ddata - dmed)
    with open(os.path.join(OUT, "dss_cutout_dao.csv"), "w") as f:
        f.write(f"# photutils {photutils.__version__} DAOStarFinder(fwhm=3.0, threshold=5*std) on data - median of "
                f"python3-astropy's wcs/tests/data/dss.14.29.56-62.41.05.fits.gz; sigma_clipped_stats(sigma=3, "
                f"maxiters=10): median={dmed:.6g} std={dstd:.6g}; 0-based x=col, y=row\n")
        f.write("x,y,peak,flux\n")
        for t in dtab:
            f.write(f"{float(t['xcentroid']):.5f},{float(t['ycentroid']):.5f},{float(t['peak']):.6g},"
                    f"{float(t['flux']):.6g}\n")
    rows = stamp_models()
    with open(os.path.join(OUT, "lsq_stamps.csv"), "w") as f:
        f.write("# 15x15 stamps, row-major (y*15 + x), one stamp per line: gaussian, moffat; numpy PCG64 seed 7\n")
        for name, data, *_ in rows:
            f.write(name + "," + ",".join(f"{v:.17g}" for v in data) + "\n")
    with open(os.path.join(OUT, "lsq_curve_fit.csv"), "w") as f:
        f.write(f"# scipy {scipy.__version__} optimize.curve_fit (MINPACK lmdif, absolute_sigma=False: covariance "
                f"scaled by chi2/(n-p)); gaussian params A,x0,y0,a,b,c,B; moffat params A,x0,y0,a,b,c,beta,B\n")
        f.write("model,kind,values...\n")
        for name, data, true, p, e, chi2 in rows:
            f.write(name + ",truth," + ",".join(f"{v:.17g}" for v in true) + "\n")
            f.write(name + ",params," + ",".join(f"{v:.17g}" for v in p) + "\n")
            f.write(name + ",sigmas," + ",".join(f"{v:.17g}" for v in e) + "\n")
            f.write(name + f",chi2,{chi2:.17g}\n")
    with open(os.path.join(OUT, "versions.txt"), "w") as f:
        f.write(f"python {sys.version.split()[0]}\nnumpy {np.__version__}\nscipy {scipy.__version__}\n"
                f"astropy {astropy.__version__}\nphotutils {photutils.__version__}\n")
    print("stars:", len(truth), "dao:", len(tab), "median", med, "std", std)


if __name__ == "__main__":
    main()
