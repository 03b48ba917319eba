package dev.nitid.image.internal;

/**
 * Order statistics by Hoare's selection (Hoare 1961, CACM 4, 321, "Algorithm 65: Find"), in place and
 * without allocation: average O(n) against O(n log n) for sorting.
 */
public final class Select {
    /** 1/Φ⁻¹(3/4): MAD → σ for Gaussian data (Hampel 1974; equals astropy.stats.mad_std's factor). */
    public static final double MAD_TO_SIGMA = 1.482602218505602;

    private Select() {
    }

    /**
     * The k-th smallest of the first n values (k 0-based); reorders them.
     *
     * @param a values (input, reordered)
     * @param n how many leading values to use
     * @param k rank, 0 ≤ k &lt; n
     * @return the k-th smallest value
     */
    public static float kth(float[] a, int n, int k) {
        int lo = 0;
        int hi = n - 1;
        while (hi > lo) {
            // Median-of-three pivot keeps sorted or constant input from degrading to O(n²).
            int mid = (lo + hi) >>> 1;
            if (a[mid] < a[lo]) {
                swap(a, mid, lo);
            }
            if (a[hi] < a[lo]) {
                swap(a, hi, lo);
            }
            if (a[hi] < a[mid]) {
                swap(a, hi, mid);
            }
            float pivot = a[mid];
            int i = lo;
            int j = hi;
            while (i <= j) {
                while (a[i] < pivot) {
                    i++;
                }
                while (a[j] > pivot) {
                    j--;
                }
                if (i <= j) {
                    swap(a, i, j);
                    i++;
                    j--;
                }
            }
            if (k <= j) {
                hi = j;
            } else if (k >= i) {
                lo = i;
            } else {
                return a[k];
            }
        }
        return a[k];
    }

    /**
     * Median of the first n values (mean of the two middle ones for even n); reorders them.
     *
     * @param a values (input, reordered)
     * @param n count, ≥ 1
     * @return the median
     */
    public static double median(float[] a, int n) {
        float upper = kth(a, n, n / 2);
        if ((n & 1) == 1) {
            return upper;
        }
        // After selection every value below index n/2 is ≤ upper; the lower middle is their maximum.
        float lower = Float.NEGATIVE_INFINITY;
        for (int i = 0; i < n / 2; i++) {
            lower = Math.max(lower, a[i]);
        }
        return 0.5 * ((double) lower + upper);
    }

    /** Median of a double array (copied, not modified); NaN when empty. */
    public static double median(double[] v) {
        if (v.length == 0) {
            return Double.NaN;
        }
        double[] s = v.clone();
        java.util.Arrays.sort(s);
        int n = s.length;
        return (n & 1) == 1 ? s[n / 2] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
    }

    /**
     * Weighted median: the smallest value at which the cumulative weight of the sorted values reaches half the
     * total, averaged with the next value when it lands exactly on half (Edgeworth 1888; the minimiser of
     * Σ wᵢ|vᵢ − m|). NaN values or non-positive weights are skipped; NaN when nothing is left.
     *
     * @param v values (not modified)
     * @param w weights, same length (not modified)
     * @return the weighted median
     */
    public static double weightedMedian(double[] v, double[] w) {
        Integer[] order = new Integer[v.length];
        int n = 0;
        double total = 0;
        for (int i = 0; i < v.length; i++) {
            if (!Double.isNaN(v[i]) && w[i] > 0 && Double.isFinite(w[i])) {
                order[n++] = i;
                total += w[i];
            }
        }
        if (n == 0) {
            return Double.NaN;
        }
        Integer[] idx = java.util.Arrays.copyOf(order, n);
        java.util.Arrays.sort(idx, (a, b) -> Double.compare(v[a], v[b]));
        double acc = 0;
        for (int k = 0; k < n; k++) {
            acc += w[idx[k]];
            if (acc > 0.5 * total) {
                return v[idx[k]];
            }
            if (acc == 0.5 * total) {
                return k + 1 < n ? 0.5 * (v[idx[k]] + v[idx[k + 1]]) : v[idx[k]];
            }
        }
        return v[idx[n - 1]];
    }

    /** 1.4826 × median absolute deviation of a double array (not modified); NaN when empty. */
    public static double madSigma(double[] v) {
        double m = median(v);
        double[] d = new double[v.length];
        for (int i = 0; i < v.length; i++) {
            d[i] = Math.abs(v[i] - m);
        }
        return MAD_TO_SIGMA * median(d);
    }

    private static void swap(float[] a, int i, int j) {
        float t = a[i];
        a[i] = a[j];
        a[j] = t;
    }
}
