package dev.nitid.fft;

import dev.nitid.image.Image;
import java.util.SplittableRandom;

/** Naive definitions in double precision, written from the formulas, used as test oracles. */
final class Oracles {
    private Oracles() {
    }

    /**
     * Direct 2-D DFT {@code X(k,l) = Σ x(n,m) exp(−2πi(kn/W + lm/H))} (Bracewell 2000, ch. 18), returned
     * as {@code [re, im]} arrays of {@code H × W}.
     */
    static double[][] dft(float[] x, int w, int h) {
        double[] re = new double[w * h];
        double[] im = new double[w * h];
        for (int l = 0; l < h; l++) {
            for (int k = 0; k < w; k++) {
                double sr = 0;
                double si = 0;
                for (int m = 0; m < h; m++) {
                    for (int n = 0; n < w; n++) {
                        // Reduce the phase index exactly in integers before the trig call.
                        long p = ((long) k * n % w) * h + ((long) l * m % h) * w;
                        double ang = -2 * Math.PI * (p % ((long) w * h)) / ((double) w * h);
                        sr += x[m * w + n] * Math.cos(ang);
                        si += x[m * w + n] * Math.sin(ang);
                    }
                }
                re[l * w + k] = sr;
                im[l * w + k] = si;
            }
        }
        return new double[][] {re, im};
    }

    /** Source index along one axis under a boundary rule, or −1 for a zero pixel (scipy.ndimage modes). */
    static int map(int x, int n, Boundary b) {
        return switch (b) {
            case ZERO -> (x >= 0 && x < n) ? x : -1;
            case PERIODIC -> Math.floorMod(x, n);
            case REFLECT -> {
                int m = Math.floorMod(x, 2 * n);
                yield m < n ? m : 2 * n - 1 - m;
            }
        };
    }

    /** Direct same-size convolution by the definition in {@link Convolver}, in double. */
    static double[] convolve(float[] img, int w, int h, Image psf, Boundary b) {
        double[] out = new double[w * h];
        int cx = psf.width() / 2;
        int cy = psf.height() / 2;
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                double s = 0;
                for (int j = 0; j < psf.height(); j++) {
                    int sy = map(y - (j - cy), h, b);
                    if (sy < 0) {
                        continue;
                    }
                    for (int i = 0; i < psf.width(); i++) {
                        int sx = map(x - (i - cx), w, b);
                        if (sx >= 0) {
                            s += psf.get(i, j) * (double) img[sy * w + sx];
                        }
                    }
                }
                out[y * w + x] = s;
            }
        }
        return out;
    }

    /** Uniform random values in [0, 1). */
    static float[] random(SplittableRandom rnd, int n) {
        float[] a = new float[n];
        for (int i = 0; i < n; i++) {
            a[i] = (float) rnd.nextDouble();
        }
        return a;
    }

    /** A positive random PSF of the given size. */
    static Image randomPsf(SplittableRandom rnd, int pw, int ph) {
        Image psf = Image.create(pw, ph);
        float[] k = psf.plane(0);
        for (int i = 0; i < k.length; i++) {
            k[i] = (float) (0.05 + rnd.nextDouble());
        }
        return psf;
    }

    static double dot(float[] a, float[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += (double) a[i] * b[i];
        }
        return s;
    }

    static double maxAbs(float[] a) {
        double m = 0;
        for (float v : a) {
            m = Math.max(m, Math.abs(v));
        }
        return m;
    }
}
