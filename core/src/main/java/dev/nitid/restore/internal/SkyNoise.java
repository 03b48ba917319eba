package dev.nitid.restore.internal;

import dev.nitid.image.internal.Select;

/**
 * Robust sky level and sky noise of a frame, insensitive to smooth extended light and to stars.
 *
 * <ul>
 *   <li>Noise: {@code σ = 1.4826 · median|d(x+1, y) − d(x, y)| / √2}. The difference of neighbouring pixels
 *       cancels smooth structure (nebulae, gradients) and has variance 2σ² for white noise; the median
 *       ignores stars (common practice for robust noise estimates, no single source; 1.4826 = 1/Φ⁻¹(3/4),
 *       Rousseeuw &amp; Croux 1993, JASA 88, 1273).</li>
 *   <li>Sky: the median of the pixels within 3σ of the current estimate, iterated {@link #CLIP_ROUNDS}
 *       times from the plain median (sigma clipping; common practice).</li>
 * </ul>
 * At most {@link #MAX_SAMPLES} pixels are used, taken on a regular stride.
 */
public final class SkyNoise {
    /** Rounds of 3σ clipping (common practice: a few rounds converge). */
    public static final int CLIP_ROUNDS = 5;
    /** Clip at this many σ (common practice). */
    public static final double CLIP_SIGMA = 3.0;
    /** Sample cap: the statistics of 2²² pixels are precise to well under 1 % (our choice). */
    public static final int MAX_SAMPLES = 1 << 22;

    /**
     * Sky level and noise.
     *
     * @param sky   sky level
     * @param sigma noise σ (0 for noise-free data)
     */
    public record Estimate(double sky, double sigma) {
    }

    private SkyNoise() {
    }

    /**
     * @param d      frame (input, not modified); non-finite pixels ignored
     * @param valid  per-pixel validity or null (input, not modified)
     * @param width  frame columns
     * @param height frame rows
     * @return the estimate; NaN sky if no pixel is usable
     */
    public static Estimate of(float[] d, boolean[] valid, int width, int height) {
        int n = d.length;
        int stride = Math.max(1, (int) Math.ceil(n / (double) MAX_SAMPLES));
        float[] diff = new float[n / stride + 1];
        int nd = 0;
        for (int i = 0; i < n; i += stride) {
            int x = i % width;
            if (x + 1 < width && ok(d, valid, i) && ok(d, valid, i + 1)) {
                diff[nd++] = Math.abs(d[i + 1] - d[i]);
            }
        }
        double sigma = nd > 0 ? 1.482602218505602 * median(diff, nd) / Math.sqrt(2) : 0;
        float[] v = new float[n / stride + 1];
        int nv = 0;
        for (int i = 0; i < n; i += stride) {
            if (ok(d, valid, i)) {
                v[nv++] = d[i];
            }
        }
        if (nv == 0) {
            return new Estimate(Double.NaN, sigma);
        }
        float[] work = new float[nv];
        System.arraycopy(v, 0, work, 0, nv);
        double sky = median(work, nv);
        for (int r = 0; r < CLIP_ROUNDS && sigma > 0; r++) {
            int k = 0;
            for (int i = 0; i < nv; i++) {
                if (Math.abs(v[i] - sky) <= CLIP_SIGMA * sigma) {
                    work[k++] = v[i];
                }
            }
            if (k == 0) {
                break;
            }
            double next = median(work, k);
            if (next == sky) {
                break;
            }
            sky = next;
        }
        return new Estimate(sky, sigma);
    }

    private static boolean ok(float[] d, boolean[] valid, int i) {
        return Float.isFinite(d[i]) && (valid == null || valid[i]);
    }

    /**
     * The sample median of {@code a[0, n)}, the same value as after {@code Arrays.sort} (middle value, or
     * the mean of the two middle values), found by selection in O(n) instead of sorting: the sort took
     * most of the restoration's set-up on a 24-megapixel frame. Reorders {@code a[0, n)}. The selection
     * is the project's one float quickselect, {@code image.internal.Select}.
     */
    static double median(float[] a, int n) {
        return Select.median(a, n);
    }
}
