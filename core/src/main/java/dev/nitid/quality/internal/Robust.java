package dev.nitid.quality.internal;

import java.util.Arrays;
import java.util.SplittableRandom;

/** Median and MAD of double samples. */
public final class Robust {
    /** 1/Φ⁻¹(3/4): MAD to σ for Gaussian data (Rousseeuw &amp; Croux 1993, JASA 88, 1273). */
    public static final double MAD_TO_SIGMA = 1.482602218505602;

    private Robust() {
    }

    /** Quickselect rounds after which a range is sorted instead (guards against a quadratic worst case). */
    static final int MAX_SELECT_ROUNDS = 64;

    /**
     * @param v samples (input, not modified)
     * @param n how many of them to use (the first n)
     * @return the median (mean of the two middle values for even n), NaN if n = 0
     */
    public static double median(double[] v, int n) {
        if (n == 0) {
            return Double.NaN;
        }
        return medianInPlace(Arrays.copyOf(v, n), n);
    }

    /**
     * The median by selection (Hoare's quickselect with three-way partitioning), O(n) on average instead
     * of the O(n log n) of a sort; the value is exactly the one a sort gives, only the work differs.
     *
     * @param v samples, finite (input, reordered)
     * @param n how many of them to use (the first n)
     * @return the median (mean of the two middle values for even n), NaN if n = 0
     */
    public static double medianInPlace(double[] v, int n) {
        if (n == 0) {
            return Double.NaN;
        }
        int k = n / 2;
        double hi = select(v, n, k);
        if (n % 2 == 1) {
            return hi;
        }
        // select leaves every value below index k at most v[k]: the (k−1)-th order statistic is their maximum.
        double lo = v[0];
        for (int i = 1; i < k; i++) {
            lo = Math.max(lo, v[i]);
        }
        return 0.5 * (lo + hi);
    }

    /**
     * Reorders {@code v[0..n)} so that {@code v[k]} holds the k-th smallest value, every value before it is
     * at most it and every value after it at least it (Hoare 1961, CACM 4, 321, "FIND"; three-way
     * partitioning after Bentley &amp; McIlroy 1993, Software—Practice and Experience 23, 1249, so runs of
     * equal values cost nothing).
     *
     * @param v samples, no NaN (input, reordered)
     * @param n how many of them to use
     * @param k the order statistic wanted, 0 ≤ k &lt; n
     * @return the k-th smallest value
     */
    public static double select(double[] v, int n, int k) {
        int lo = 0;
        int hi = n - 1;
        for (int round = 0; lo < hi; round++) {
            if (round >= MAX_SELECT_ROUNDS) {
                Arrays.sort(v, lo, hi + 1);
                return v[k];
            }
            // Median of three as pivot: deterministic, and no quadratic case on sorted or reversed input.
            int mid = (lo + hi) >>> 1;
            double a = v[lo];
            double b = v[mid];
            double c = v[hi];
            double pivot = a < b ? (b < c ? b : Math.max(a, c)) : (a < c ? a : Math.max(b, c));
            // Dutch national flag: [lo, lt) < pivot, [lt, i) == pivot, (gt, hi] > pivot.
            int lt = lo;
            int gt = hi;
            int i = lo;
            while (i <= gt) {
                double x = v[i];
                if (x < pivot) {
                    v[i++] = v[lt];
                    v[lt++] = x;
                } else if (x > pivot) {
                    v[i] = v[gt];
                    v[gt--] = x;
                } else {
                    i++;
                }
            }
            if (k < lt) {
                hi = lt - 1;
            } else if (k > gt) {
                lo = gt + 1;
            } else {
                return pivot;
            }
        }
        return v[k];
    }

    /**
     * @param v samples (input, not modified)
     * @param n how many of them to use
     * @return 1.4826 · median(|v − median(v)|), NaN if n = 0
     */
    public static double madSigma(double[] v, int n) {
        return madSigmaInPlace(Arrays.copyOf(v, n), n);
    }

    /**
     * {@link #madSigma} without a copy: one selection for the median, one for the median absolute
     * deviation.
     *
     * @param v samples, finite (input, overwritten with the absolute deviations in some order)
     * @param n how many of them to use
     * @return 1.4826 · median(|v − median(v)|), NaN if n = 0
     */
    public static double madSigmaInPlace(double[] v, int n) {
        double m = medianInPlace(v, n);
        for (int i = 0; i < n; i++) {
            v[i] = Math.abs(v[i] - m);
        }
        return MAD_TO_SIGMA * medianInPlace(v, n);
    }

    /** Seed of the dither: fixed, so the estimate is reproducible. */
    static final long DITHER_SEED = 0x5EEDL;

    /**
     * Robust σ of samples that may be quantised: if every sample is a whole number (integer data such as
     * 16-bit images), the MAD would itself be a whole or half number and σ̂ biased by up to several per cent
     * when σ is a few units; each sample then gets a deterministic uniform dither u ∈ [−½, ½) before the MAD,
     * and the dither's variance 1/12 is removed in quadrature (quantisation noise theory: Widrow &amp; Kollár
     * 2008, <i>Quantization Noise</i>, ch. 4 and 19 — from memory). Otherwise this is {@link #madSigma}.
     *
     * @param v samples (input, not modified)
     * @param n how many of them to use
     * @return σ̂, NaN if n = 0
     */
    public static double madSigmaDequantised(double[] v, int n) {
        boolean integral = n > 0;
        for (int i = 0; i < n && integral; i++) {
            integral = v[i] == Math.rint(v[i]);
        }
        if (!integral) {
            return madSigma(v, n);
        }
        SplittableRandom rnd = new SplittableRandom(DITHER_SEED);
        double[] d = new double[n];
        for (int i = 0; i < n; i++) {
            d[i] = v[i] + rnd.nextDouble() - 0.5;
        }
        double s = madSigmaInPlace(d, n);
        return Math.sqrt(Math.max(0, s * s - 1.0 / 12));
    }
}
