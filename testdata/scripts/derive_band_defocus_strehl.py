#!/usr/bin/python3
"""Band-averaged Strehl of 0.05 waves RMS of defocus on an annular pupil (eps = 0.33), with and without a
'+' spider of 2 mm bars on a 200 mm aperture. Supports STREHL_ATOL in
cli/src/test/java/dev/nitid/cli/PsfCommandTest.java: the test uses the exact annulus formula, and this
script shows how far the spider moves the answer. Run with Debian's /usr/bin/python3 (numpy 1.24.2); prints

    annulus exact band 0.922694 (Marechal, full-disk RMS: 0.904393)
    sampled pupil, no vanes 0.922690
    sampled pupil, 2 mm vanes 0.922838
"""
import numpy as np

EPS = 0.33
SIGMA = 0.05                                    # waves RMS at the band centre, 550 nm
LAMBDAS = np.array([510, 530, 550, 570, 590.0])  # 500-600 nm, 5 bin centres
W = 1 / LAMBDAS ** 2                            # each wavelength weighs as its unaberrated peak


def exact(s):
    x = 2 * np.sqrt(3) * np.pi * s * (1 - EPS ** 2)
    return (np.sin(x) / x) ** 2


s_l = SIGMA * 550 / LAMBDAS
print("annulus exact band %.6f (Marechal, full-disk RMS: %.6f)"
      % (np.sum(W * exact(s_l)) / W.sum(), np.sum(W * np.exp(-(2 * np.pi * s_l) ** 2)) / W.sum()))

N = 1024
c = (np.arange(N) - N / 2 + 0.5) / (N / 2)     # pupil radius 1
X, Y = np.meshgrid(c, c)
r2 = X ** 2 + Y ** 2
for label, half_width in (("no vanes", 0.0), ("2 mm vanes", 0.01)):  # 2 mm on a 100 mm radius
    mask = (r2 <= 1) & (r2 >= EPS ** 2) & ~((np.abs(X) < half_width) | (np.abs(Y) < half_width))
    strehl = []
    for s in s_l:
        phi = 2 * np.pi * s * np.sqrt(3) * (2 * r2 - 1)   # Noll Z4 = sqrt(3)(2 rho^2 - 1)
        strehl.append(abs(np.exp(1j * phi[mask]).mean()) ** 2)
    print("sampled pupil, %s %.6f" % (label, np.sum(W * np.array(strehl)) / W.sum()))
