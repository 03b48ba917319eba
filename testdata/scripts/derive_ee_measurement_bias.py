#!/usr/bin/python3
"""Where the encircled energy measured by dev.nitid.psf.PsfFigures departs from 15/16 at r = FWHM for a
pixel-integrated Gaussian (sigma = 3 px, 61 px stamp, 8 x 8 sub-pixels), as in
AnalyticModelsTest.encircledEnergyCurveOfRenderedGaussian (EE_AT_FWHM_ATOL). Models the measurement:
each pixel's flux spread evenly over 8 x 8 parts, the curve sampled every 1/2 px and interpolated
linearly. Run with Debian's /usr/bin/python3 (numpy 1.24.2); prints

    EE(7.0) 0.930785  EE(7.5) 0.953728
    at r = FWHM_eff 7.097091: direct -1.490e-03, interpolated -2.260e-03 (vs 15/16)
"""
import numpy as np

SIGMA, N, K = 3.0, 61, 8
C = N // 2
sub = (np.arange(N * K) + 0.5) / K - 0.5 - C
g = np.exp(-sub ** 2 / (2 * SIGMA ** 2)).reshape(N, K).mean(1)
img = np.outer(g, g)
img /= img.sum()

off = (np.arange(K) + 0.5) / K - 0.5
x = ((np.arange(N) - C)[:, None] + off[None, :]).ravel()
XX, YY = np.meshgrid(x, x)
R = np.hypot(XX, YY)
F = np.repeat(np.repeat(img, K, 0), K, 1) / K ** 2


def ee(r):
    return F[R <= r].sum()


r_fwhm = 2.354820045 * np.sqrt(SIGMA ** 2 + 1 / 12)
lo = np.floor(2 * r_fwhm) / 2
interp = ee(lo) + (r_fwhm - lo) / 0.5 * (ee(lo + 0.5) - ee(lo))
print("EE(%.1f) %.6f  EE(%.1f) %.6f" % (lo, ee(lo), lo + 0.5, ee(lo + 0.5)))
print("at r = FWHM_eff %.6f: direct %.3e, interpolated %.3e (vs 15/16)"
      % (r_fwhm, ee(r_fwhm) - 15 / 16, interp - 15 / 16))
