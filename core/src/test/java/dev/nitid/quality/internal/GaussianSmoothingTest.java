package dev.nitid.quality.internal;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** The separable Gaussian smoothing against scipy, and its independence of the thread count. */
class GaussianSmoothingTest {
    /** float32 output of sums of ≤ 225 terms of order 10: a few float ulps of 10, 1e-5. */
    static final double FLOAT_TOL = 1e-5;

    @Test
    void matchesScipyGaussianFilterWithReflection() {
        // Oracle: scipy 1.17.1, scipy.ndimage.gaussian_filter(a, sigma=4/(2*sqrt(2 ln 2)), mode='reflect',
        // truncate=4.0) on a = ((7x + 13y) mod 17) with 100 added at (x=10, y=5), 23 x 17, float64. scipy's
        // radius int(4σ + 0.5) = 7 equals ceil(4σ) = 7 here.
        int w = 23;
        int h = 17;
        float[] a = new float[w * h];
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                a[y * w + x] = (7 * x + 13 * y) % 17;
            }
        }
        a[5 * w + 10] += 100;
        double[][] expect = {
            {0, 0, 7.222813983001947}, {0, 22, 7.374963865402728}, {16, 0, 8.042261179077961},
            {16, 22, 8.189719693797429}, {5, 10, 13.659668242152962}, {8, 11, 8.856966501368245},
            {0, 11, 8.553034606913624}, {9, 1, 8.199804071576464}, {3, 20, 8.215901986043527},
        };
        for (int threads : new int[] {1, 2}) {
            float[] s = GaussianSmoothing.smooth(a, w, h, 4.0, threads);
            for (double[] e : expect) {
                assertEquals(e[2], s[(int) e[0] * w + (int) e[1]], FLOAT_TOL, "pixel y=" + e[0] + " x=" + e[1]);
            }
        }
    }

    @Test
    void sameBitsForAnyThreadCount() {
        SplittableRandom rnd = new SplittableRandom(11);
        for (int[] size : new int[][] {{300, 200}, {5, 4}, {1, 130}}) {
            float[] a = new float[size[0] * size[1]];
            for (int i = 0; i < a.length; i++) {
                a[i] = (float) rnd.nextDouble(-1, 1);
            }
            float[] one = GaussianSmoothing.smooth(a, size[0], size[1], 4.0, 1);
            for (int threads : new int[] {2, 3, 7}) {
                assertArrayEquals(one, GaussianSmoothing.smooth(a, size[0], size[1], 4.0, threads),
                        size[0] + "x" + size[1] + ", " + threads + " threads");
            }
        }
    }
}
