#!/usr/bin/env python3
"""Reference same-size convolutions for Nitid's FFT convolver, computed with scipy.ndimage.convolve.

Run from anywhere:  python3 testdata/scripts/gen_convolution_reference.py
Writes CSV files (headerless, one image row per line, '%.9g') into
testdata/src/main/resources/dev/nitid/testdata/convolution/ and a manifest with the library versions.

Boundary modes, ours -> scipy.ndimage (scipy's 'reflect' is half-sample symmetric d c b a | a b c d,
which is ours; scipy's 'mirror' d c b | a b c d would not be):
  ZERO     -> mode='constant', cval=0
  REFLECT  -> mode='reflect'
  PERIODIC -> mode='wrap'
PSF centre: scipy.ndimage.convolve centres a kernel of size n on index n // 2 (origin 0), which is
Nitid's rule (floor(pw/2), floor(ph/2)); even sizes are included to pin that down.
Inputs are drawn as float32 and convolved in float64.
"""
import os
import sys

import numpy as np
import scipy
import scipy.ndimage as ndi

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "src", "main", "resources",
                   "dev", "nitid", "testdata", "convolution")
MODES = {"ZERO": "constant", "REFLECT": "reflect", "PERIODIC": "wrap"}
# name, image width, height, PSF width, height: odd, even, prime, one-pixel sizes.
CASES = [
    ("odd", 9, 7, 3, 3),
    ("even", 12, 10, 4, 4),
    ("prime", 13, 11, 5, 3),
    ("evenpsf", 11, 8, 6, 5),
    ("onepixel", 1, 1, 1, 1),
    ("column", 1, 9, 1, 5),
]


def save(name, a):
    np.savetxt(os.path.join(OUT, name), np.atleast_2d(a), fmt="%.9g", delimiter=",")


def main():
    os.makedirs(OUT, exist_ok=True)
    rng = np.random.default_rng(20261201)
    manifest = ["# made by testdata/scripts/gen_convolution_reference.py",
                f"# python {sys.version.split()[0]}, numpy {np.__version__}, scipy {scipy.__version__}",
                "case,width,height,psf_width,psf_height,boundary,scipy_mode,output_file"]
    for name, w, h, pw, ph in CASES:
        img = rng.random((h, w)).astype(np.float32)
        psf = (0.05 + rng.random((ph, pw))).astype(np.float32)
        save(f"{name}_input.csv", img)
        save(f"{name}_psf.csv", psf)
        for ours, mode in MODES.items():
            out = ndi.convolve(img.astype(np.float64), psf.astype(np.float64), mode=mode, cval=0.0)
            fname = f"{name}_{ours.lower()}.csv"
            save(fname, out)
            manifest.append(f"{name},{w},{h},{pw},{ph},{ours},{mode},{fname}")
    with open(os.path.join(OUT, "manifest.csv"), "w") as f:
        f.write("\n".join(manifest) + "\n")


if __name__ == "__main__":
    main()
