package dev.nitid.stars.internal;

import dev.nitid.image.internal.Select;
import java.util.Arrays;

/**
 * Exact median of float values by histogram narrowing: count the values into equal-width bins between their
 * minimum and maximum, keep only the bin(s) that hold the middle rank(s), and repeat on those few values. The
 * bin of a value is a non-decreasing function of it, so ranks carry over from bins to values and the result is
 * exactly the order statistic that selection or sorting gives (the mean of the two middle values for an even
 * count, as {@link Select#median(float[], int)}). Counting has no data-dependent branches, unlike the
 * partitioning of quickselect, which is why it is faster on the few thousand noisy values of a background
 * cell (bucket selection; common practice, no source).
 *
 * <p>Not thread-safe (scratch space): one instance per worker. Values must not be NaN.
 */
public final class HistogramMedian {
    /** Bins per level. */
    private static final int BINS = 1024;
    /** Below this many values the rest is sorted. */
    private static final int SMALL = 48;
    /** Levels before the remaining values are sorted (each level cuts the range ~BINS-fold). */
    private static final int MAX_LEVELS = 6;

    /**
     * Four interleaved histograms: consecutive values of a noisy sky often fall in the same bin, and one
     * counter would then be a chain of dependent memory increments.
     */
    private final int[] counts = new int[4 * BINS];
    private float[] keep;

    /**
     * @param capacity largest count this instance will be asked for (grows if exceeded)
     */
    public HistogramMedian(int capacity) {
        this.keep = new float[Math.max(1, capacity)];
    }

    /**
     * Median of the first n values.
     *
     * @param a values, none NaN (input, not modified)
     * @param n count, ≥ 1
     * @return the median (mean of the two middle values for even n)
     */
    public double median(float[] a, int n) {
        if (n < 1) {
            throw new IllegalArgumentException("n is " + n + ": the median needs at least one value");
        }
        if (keep.length < n) {
            keep = new float[n];
        }
        int r1 = n / 2;
        int r0 = (n & 1) == 1 ? r1 : r1 - 1;
        float[] src = a;
        int m = n;
        float lo = Float.POSITIVE_INFINITY;
        float hi = Float.NEGATIVE_INFINITY;
        for (int i = 0; i < m; i++) {
            lo = Math.min(lo, src[i]);
            hi = Math.max(hi, src[i]);
        }
        for (int level = 0; ; level++) {
            if (lo == hi) {
                return lo;
            }
            if (m <= SMALL || level == MAX_LEVELS) {
                if (src != keep) {
                    System.arraycopy(src, 0, keep, 0, m);
                }
                Arrays.sort(keep, 0, m);
                return r0 == r1 ? keep[r0] : 0.5 * ((double) keep[r0] + keep[r1]);
            }
            double base = lo;
            double scale = BINS / ((double) hi - lo);
            Arrays.fill(counts, 0);
            int i4 = 0;
            for (; i4 + 3 < m; i4 += 4) {
                counts[Math.min(BINS - 1, (int) ((src[i4] - base) * scale))]++;
                counts[BINS + Math.min(BINS - 1, (int) ((src[i4 + 1] - base) * scale))]++;
                counts[2 * BINS + Math.min(BINS - 1, (int) ((src[i4 + 2] - base) * scale))]++;
                counts[3 * BINS + Math.min(BINS - 1, (int) ((src[i4 + 3] - base) * scale))]++;
            }
            for (; i4 < m; i4++) {
                counts[Math.min(BINS - 1, (int) ((src[i4] - base) * scale))]++;
            }
            for (int b = 0; b < BINS; b++) {
                counts[b] += counts[BINS + b] + counts[2 * BINS + b] + counts[3 * BINS + b];
            }
            int b0 = -1;
            int b1 = -1;
            int before0 = 0;
            int before1 = 0;
            int cum = 0;
            for (int b = 0; b < BINS && b1 < 0; b++) {
                int next = cum + counts[b];
                if (b0 < 0 && r0 < next) {
                    b0 = b;
                    before0 = cum;
                }
                if (r1 < next) {
                    b1 = b;
                    before1 = cum;
                }
                cum = next;
            }
            if (b0 != b1) {
                // Rank r0 is the largest value of bin b0 and r1 = r0 + 1 the smallest of bin b1.
                float v0 = Float.NEGATIVE_INFINITY;
                float v1 = Float.POSITIVE_INFINITY;
                for (int i = 0; i < m; i++) {
                    float v = src[i];
                    int b = Math.min(BINS - 1, (int) ((v - base) * scale));
                    if (b == b0) {
                        v0 = Math.max(v0, v);
                    } else if (b == b1) {
                        v1 = Math.min(v1, v);
                    }
                }
                return 0.5 * ((double) v0 + v1);
            }
            // Keep the values of bin b0 (in place once they are in the scratch: writes never pass reads).
            int k = 0;
            float nlo = Float.POSITIVE_INFINITY;
            float nhi = Float.NEGATIVE_INFINITY;
            for (int i = 0; i < m; i++) {
                float v = src[i];
                // Written always, kept only when in the bin: no unpredictable branch.
                keep[k] = v;
                k += Math.min(BINS - 1, (int) ((v - base) * scale)) == b0 ? 1 : 0;
            }
            for (int i = 0; i < k; i++) {
                nlo = Math.min(nlo, keep[i]);
                nhi = Math.max(nhi, keep[i]);
            }
            src = keep;
            m = k;
            r0 -= before0;
            r1 -= before1;
            lo = nlo;
            hi = nhi;
        }
    }
}
