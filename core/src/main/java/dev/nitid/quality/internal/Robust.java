package dev.nitid.quality.internal;

import dev.nitid.stars.internal.Parallel;
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

    /** Below this many samples the parallel median is plain selection (the histogram would not pay). */
    static final int PARALLEL_MIN = 1 << 20;
    /** Bins of the histogram that locates the middle order statistics. */
    static final int BINS = 1 << 16;
    /** Fixed blocks of the parallel passes (independent of the thread count). */
    static final int BLOCKS = 64;

    /**
     * {@link #madSigmaInPlace} for millions of samples on several threads: the same value exactly (each
     * median is the exact order statistic, see {@link #medianParallel}), whatever the thread count.
     *
     * @param v       samples, finite (input, overwritten with the absolute deviations)
     * @param n       how many of them to use
     * @param threads worker threads, ≥ 1
     * @return 1.4826 · median(|v − median(v)|), NaN if n = 0
     */
    public static double madSigmaParallel(double[] v, int n, int threads) {
        double m = medianParallel(v, n, threads);
        Parallel.forEach(BLOCKS, threads, (b, worker) -> {
            for (int i = blockStart(b, n), end = blockStart(b + 1, n); i < end; i++) {
                v[i] = Math.abs(v[i] - m);
            }
        });
        return MAD_TO_SIGMA * medianParallel(v, n, threads);
    }

    /**
     * The exact median of many samples in a few parallel passes instead of a sort: a histogram of
     * {@link #BINS} equal bins over [min, max] (the bin index is a non-decreasing function of the value, so
     * the k-th smallest sample lies in the bin where the cumulative count passes k) locates the middle
     * order statistics; only the samples of that bin are then selected. Integer counts and the exact order
     * statistic make the result independent of the thread count and of the sample order.
     *
     * @param v       samples, finite (input, not modified)
     * @param n       how many of them to use
     * @param threads worker threads, ≥ 1
     * @return the median (mean of the two middle values for even n), NaN if n = 0
     */
    public static double medianParallel(double[] v, int n, int threads) {
        if (n < PARALLEL_MIN) {
            return medianInPlace(Arrays.copyOf(v, n), n);
        }
        int kHi = n / 2;
        int kLo = n % 2 == 1 ? kHi : kHi - 1;
        double[] lo = new double[BLOCKS];
        double[] hi = new double[BLOCKS];
        Parallel.forEach(BLOCKS, threads, (b, worker) -> {
            double a = Double.POSITIVE_INFINITY;
            double z = Double.NEGATIVE_INFINITY;
            for (int i = blockStart(b, n), end = blockStart(b + 1, n); i < end; i++) {
                a = Math.min(a, v[i]);
                z = Math.max(z, v[i]);
            }
            lo[b] = a;
            hi[b] = z;
        });
        double min = Double.POSITIVE_INFINITY;
        double max = Double.NEGATIVE_INFINITY;
        for (int b = 0; b < BLOCKS; b++) {
            min = Math.min(min, lo[b]);
            max = Math.max(max, hi[b]);
        }
        if (!(max > min)) {
            return min;
        }
        double vmin = min;
        double scale = BINS / (max - min);
        int workers = Math.max(1, Math.min(threads, BLOCKS));
        int[][] partial = new int[workers][BINS];
        Parallel.forEach(BLOCKS, workers, (b, worker) -> {
            int[] hist = partial[worker];
            for (int i = blockStart(b, n), end = blockStart(b + 1, n); i < end; i++) {
                hist[bin(v[i], vmin, scale)]++;
            }
        });
        int[] hist = partial[0];
        for (int w = 1; w < workers; w++) {
            for (int j = 0; j < BINS; j++) {
                hist[j] += partial[w][j];
            }
        }
        int bLo = -1;
        int bHi = -1;
        long below = 0;
        long belowHi = 0;
        for (int j = 0; j < BINS && bHi < 0; j++) {
            if (bLo < 0 && below + hist[j] > kLo) {
                bLo = j;
            }
            if (below + hist[j] > kHi) {
                bHi = j;
                belowHi = below;
            }
            below += hist[j];
        }
        if (bLo != bHi) {
            // Adjacent order statistics in different bins: the lower is its bin's largest, the upper its bin's
            // smallest.
            double a = Double.NEGATIVE_INFINITY;
            double z = Double.POSITIVE_INFINITY;
            for (int i = 0; i < n; i++) {
                int j = bin(v[i], vmin, scale);
                if (j == bLo) {
                    a = Math.max(a, v[i]);
                } else if (j == bHi) {
                    z = Math.min(z, v[i]);
                }
            }
            return 0.5 * (a + z);
        }
        double[] g = new double[hist[bHi]];
        int m = 0;
        for (int i = 0; i < n; i++) {
            if (bin(v[i], vmin, scale) == bHi) {
                g[m++] = v[i];
            }
        }
        int kk = (int) (kHi - belowHi);
        double top = select(g, m, kk);
        if (kLo == kHi) {
            return top;
        }
        double a = g[0];
        for (int i = 1; i < kk; i++) {
            a = Math.max(a, g[i]);
        }
        return 0.5 * (a + top);
    }

    private static int bin(double x, double min, double scale) {
        return Math.min(BINS - 1, (int) ((x - min) * scale));
    }

    private static int blockStart(int b, int n) {
        return (int) ((long) b * n / BLOCKS);
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
