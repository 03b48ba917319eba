#!/usr/bin/env python3
"""scipy.fft timing of the same same-size convolution as dev.nitid.fft.Convolver (REFLECT boundary).

Extends the image by half-sample symmetry (numpy.pad mode 'symmetric' = scipy.ndimage 'reflect'), pads
to the same FFT size Nitid chooses for the whole plane (smallest even 2-3-5-smooth size), rfft2 in
float32 with the given workers, multiplies by the PSF's transfer function, irfft2, crops.
Prints the best wall time and the smallest process CPU time (all threads) over the repetitions, and a
checksum.

Usage: scipy_conv.py WIDTH HEIGHT PSF WORKERS REPS
"""
import sys
import time

import numpy as np
import scipy
import scipy.fft as sfft


def next_fast(n):
    m = max(2, n + (n & 1))
    while True:
        k = m
        for f in (2, 3, 5):
            while k % f == 0:
                k //= f
        if k == 1:
            return m
        m += 2


def main():
    w, h, p, workers, reps = (int(a) for a in sys.argv[1:6])
    rng = np.random.default_rng(1)
    img = rng.random((h, w), dtype=np.float32)
    psf = np.full((p, p), 1.0 / (p * p), dtype=np.float32)
    c = p // 2
    off = p - 1 - c
    ny, nx = next_fast(h + p - 1), next_fast(w + p - 1)
    k = np.zeros((ny, nx), np.float32)
    k[:p, :p] = psf
    k = np.roll(k, (-c, -c), axis=(0, 1))
    otf = sfft.rfft2(k, workers=workers)
    best = float("inf")
    best_cpu = float("inf")
    out = None
    for _ in range(reps + 1):
        t0 = time.perf_counter()
        c0 = time.process_time()
        ext = np.pad(img, ((off, c), (off, c)), mode="symmetric")
        spec = sfft.rfft2(ext, s=(ny, nx), workers=workers)
        spec *= otf
        full = sfft.irfft2(spec, s=(ny, nx), workers=workers)
        out = full[off:off + h, off:off + w]
        best = min(best, time.perf_counter() - t0)
        best_cpu = min(best_cpu, time.process_time() - c0)
    print(f"scipy whole {w}x{h} fft {nx}x{ny} workers {workers} best_ms {best * 1e3:.2f} cpu_ms {best_cpu * 1e3:.2f} "
          f"checksum {float(out.mean()):.6e} scipy {scipy.__version__} numpy {np.__version__}")


if __name__ == "__main__":
    main()
