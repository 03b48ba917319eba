package dev.nitid.quality.internal;

import dev.nitid.stars.internal.Parallel;

/**
 * Separable convolution with a sampled, unit-sum Gaussian of a given FWHM, the image extended by reflection
 * at its edges (half-sample symmetric, as {@code scipy.ndimage}'s "reflect").
 *
 * <p>Each output pixel is summed in double in the same order (taps −r..r) whatever the thread count and
 * whether the pixel is near an edge, so the result is bit-identical for any {@code threads}. The column
 * pass runs row by row over a double accumulator row, so it streams memory instead of striding it.
 */
public final class GaussianSmoothing {
    /** Kernel half-width in σ: the Gaussian beyond 4σ holds less than 1e-4 of the flux. */
    static final double TRUNCATE_SIGMA = 4.0;
    /** Rows per parallel task: large enough to amortise scheduling, small enough to balance two cores. */
    static final int ROWS_PER_TASK = 64;

    private GaussianSmoothing() {
    }

    /**
     * Single-threaded {@link #smooth(float[], int, int, double, int)}.
     *
     * @param in     pixels, row-major (input, not modified)
     * @param width  columns
     * @param height rows
     * @param fwhm   Gaussian FWHM in pixels, &gt; 0
     * @return the smoothed pixels, a new array
     */
    public static float[] smooth(float[] in, int width, int height, double fwhm) {
        return smooth(in, width, height, fwhm, 1);
    }

    /**
     * @param in      pixels, row-major (input, not modified)
     * @param width   columns
     * @param height  rows
     * @param fwhm    Gaussian FWHM in pixels, &gt; 0
     * @param threads worker threads, ≥ 1 (the result does not depend on it)
     * @return the smoothed pixels, a new array
     */
    public static float[] smooth(float[] in, int width, int height, double fwhm, int threads) {
        double sigma = fwhm / (2 * Math.sqrt(2 * Math.log(2)));
        int r = Math.max(1, (int) Math.ceil(TRUNCATE_SIGMA * sigma));
        double[] k = new double[2 * r + 1];
        double sum = 0;
        for (int i = -r; i <= r; i++) {
            k[i + r] = Math.exp(-0.5 * i * i / (sigma * sigma));
            sum += k[i + r];
        }
        for (int i = 0; i < k.length; i++) {
            k[i] /= sum;
        }
        float[] tmp = new float[in.length];
        int tasks = (height + ROWS_PER_TASK - 1) / ROWS_PER_TASK;
        Parallel.forEach(tasks, threads, (t, worker) -> {
            int y1 = Math.min(height, (t + 1) * ROWS_PER_TASK);
            for (int y = t * ROWS_PER_TASK; y < y1; y++) {
                rowPass(in, tmp, y * width, width, k, r);
            }
        });
        float[] out = new float[in.length];
        Parallel.forEach(tasks, threads, (t, worker) -> {
            double[] acc = new double[width];
            int y1 = Math.min(height, (t + 1) * ROWS_PER_TASK);
            for (int y = t * ROWS_PER_TASK; y < y1; y++) {
                java.util.Arrays.fill(acc, 0);
                for (int i = -r; i <= r; i++) {
                    double kk = k[i + r];
                    int src = reflect(y + i, height) * width;
                    for (int x = 0; x < width; x++) {
                        acc[x] += kk * tmp[src + x];
                    }
                }
                int row = y * width;
                for (int x = 0; x < width; x++) {
                    out[row + x] = (float) acc[x];
                }
            }
        });
        return out;
    }

    private static void rowPass(float[] in, float[] tmp, int row, int width, double[] k, int r) {
        int inner0 = Math.min(r, width);
        int inner1 = Math.max(inner0, width - r);
        for (int x = 0; x < inner0; x++) {
            tmp[row + x] = edgeTap(in, row, x, width, k, r);
        }
        for (int x = inner0; x < inner1; x++) {
            double acc = 0;
            int base = row + x - r;
            for (int j = 0; j < k.length; j++) {
                acc += k[j] * in[base + j];
            }
            tmp[row + x] = (float) acc;
        }
        for (int x = inner1; x < width; x++) {
            tmp[row + x] = edgeTap(in, row, x, width, k, r);
        }
    }

    private static float edgeTap(float[] in, int row, int x, int width, double[] k, int r) {
        double acc = 0;
        for (int i = -r; i <= r; i++) {
            acc += k[i + r] * in[row + reflect(x + i, width)];
        }
        return (float) acc;
    }

    private static int reflect(int i, int n) {
        int m = Math.floorMod(i, 2 * n);
        return m < n ? m : 2 * n - 1 - m;
    }
}
