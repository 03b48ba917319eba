#!/usr/bin/env python3
"""Richardson-Lucy time per iteration, side by side in one run:

  nitid   : JMH RlIterationBenchmark (plain RL, reflective edges, 2 FFT threads) from benchmarks.jar
  peer    : numpy/scipy.fft with a precomputed OTF: 4 real transforms per iteration (rfft2/irfft2,
            workers=2, float32, periodic), the minimum an FFT-based RL needs
  skimage : skimage.restoration.richardson_lucy(image, psf, num_iter=N, clip=False)

Same frame (flat sky 100-110 plus 200 bright points) and Gaussian PSF (sigma = side/8) for all.
Run from the repository root after `mvn -o -q -pl benchmarks -am package -DskipTests`:

  /usr/bin/python3 benchmarks/scripts/restore_speed/restore_speed.py --sizes 2048 4096 --psfs 31 65

(/usr/bin/python3 is the Debian interpreter that sees the python3-* packages.)

Versions used for the recorded figures: Debian 12 python3-numpy 1.24.2, python3-scipy 1.10.1,
python3-skimage 0.19.3; see notes/restore.md.
"""
import argparse
import json
import os
import subprocess
import sys
import tempfile
import time

import numpy as np
import scipy
import scipy.fft as sfft


def scene(size, psf_side):
    rng = np.random.default_rng(1)
    img = (100 + 10 * rng.random((size, size))).astype(np.float32)
    idx = rng.integers(0, size * size, 200)
    img.flat[idx] += 50000
    c = psf_side // 2
    sigma = psf_side / 8.0
    y, x = np.mgrid[0:psf_side, 0:psf_side]
    psf = np.exp(-((x - c) ** 2 + (y - c) ** 2) / (2 * sigma ** 2)).astype(np.float32)
    return img, psf / psf.sum()


def peer_rl(img, psf, iters, workers=2):
    """Plain RL with the OTF precomputed once; returns seconds per iteration."""
    pad = np.zeros_like(img)
    pad[:psf.shape[0], :psf.shape[1]] = psf
    pad = np.roll(pad, (-(psf.shape[0] // 2), -(psf.shape[1] // 2)), axis=(0, 1))
    H = sfft.rfft2(pad, workers=workers)
    Hc = np.conj(H)
    o = np.full_like(img, img.mean())
    shape = img.shape
    t = time.perf_counter()
    for _ in range(iters):
        conv = sfft.irfft2(sfft.rfft2(o, workers=workers) * H, s=shape, workers=workers)
        ratio = img / conv
        o *= sfft.irfft2(sfft.rfft2(ratio, workers=workers) * Hc, s=shape, workers=workers)
    return (time.perf_counter() - t) / iters


def skimage_rl(img, psf, iters):
    from skimage.restoration import richardson_lucy
    t = time.perf_counter()
    richardson_lucy(img, psf, num_iter=iters, clip=False)
    return (time.perf_counter() - t) / iters


def nitid_rl(jar, size, psf_side, threads):
    with tempfile.TemporaryDirectory() as d:
        out = os.path.join(d, "jmh.json")
        # the JMH lock is machine-wide; other users' runs must not block this comparison
        cmd = ["java", "-Djmh.ignoreLock=true", "-jar", jar, "RlIterationBenchmark", "-p", f"size={size}", "-p", f"psfSize={psf_side}",
               "-p", f"threads={threads}", "-rf", "json", "-rff", out]
        subprocess.run(cmd, check=True, stdout=subprocess.DEVNULL)
        with open(out) as f:
            res = json.load(f)
        return res[0]["primaryMetric"]["score"] / 1000.0  # ms -> s


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--sizes", type=int, nargs="+", default=[2048, 4096])
    ap.add_argument("--psfs", type=int, nargs="+", default=[31, 65])
    ap.add_argument("--jar", default="benchmarks/target/benchmarks.jar")
    ap.add_argument("--peer-iters", type=int, default=5)
    ap.add_argument("--skimage-iters", type=int, default=2)
    ap.add_argument("--no-skimage", action="store_true")
    ap.add_argument("--threads", type=int, default=2)
    a = ap.parse_args()
    import skimage
    print(f"numpy {np.__version__}, scipy {scipy.__version__}, skimage {skimage.__version__}, "
          f"cpus {os.cpu_count()}, load {os.getloadavg()[0]:.1f}")
    print(f"{'size':>6} {'psf':>4} {'nitid ms':>9} {'peer ms':>8} {'skimage ms':>11} {'peer/nitid':>11} {'skimage/nitid':>14}")
    for size in a.sizes:
        for p in a.psfs:
            img, psf = scene(size, p)
            peer = peer_rl(img, psf, a.peer_iters, a.threads)
            sk = float("nan") if a.no_skimage else skimage_rl(img, psf, a.skimage_iters)
            nit = nitid_rl(a.jar, size, p, a.threads)
            print(f"{size:>6} {p:>4} {1000 * nit:>9.0f} {1000 * peer:>8.0f} {1000 * sk:>11.0f} "
                  f"{peer / nit:>11.2f} {sk / nit:>14.2f}", flush=True)


if __name__ == "__main__":
    sys.exit(main())
