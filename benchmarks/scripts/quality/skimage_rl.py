#!/usr/bin/env python3
"""Restores a harness scene with scikit-image's Richardson-Lucy, for comparison.

Usage: skimage_rl.py SCENE_DIR [ITERATIONS]
Reads SCENE_DIR/observed.npy and SCENE_DIR/psf.npy (float32, written by the Java harness), runs
skimage.restoration.richardson_lucy(observed, psf, num_iter=ITERATIONS, clip=False) in float64, and writes
SCENE_DIR/skimage_rl.npy (float32) and SCENE_DIR/skimage_rl.seconds. Prints the scikit-image version.
Tested with Debian 12's python3-skimage 0.19.3 and python3-numpy 1.24.2.
"""
import sys
import time
from pathlib import Path

import numpy as np
import skimage
from skimage.restoration import richardson_lucy


def main():
    scene = Path(sys.argv[1])
    iterations = int(sys.argv[2]) if len(sys.argv) > 2 else 30
    observed = np.load(scene / "observed.npy").astype(np.float64)
    psf = np.load(scene / "psf.npy").astype(np.float64)
    t0 = time.perf_counter()
    # 0.19 names the count num_iter; clip=False keeps the data's units (no clipping to [-1, 1]).
    restored = richardson_lucy(observed, psf, num_iter=iterations, clip=False)
    seconds = time.perf_counter() - t0
    np.save(scene / "skimage_rl.npy", restored.astype(np.float32))
    (scene / "skimage_rl.seconds").write_text(f"{seconds:.3f}\n")
    print(skimage.__version__)


if __name__ == "__main__":
    main()
