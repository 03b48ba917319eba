package dev.nitid.quality.internal;

import java.util.Arrays;

/** Median and MAD of double samples. */
public final class Robust {
    /** 1/Φ⁻¹(3/4): MAD to σ for Gaussian data (Rousseeuw &amp; Croux 1993, JASA 88, 1273). */
    public static final double MAD_TO_SIGMA = 1.482602218505602;

    private Robust() {
    }

    /**
     * @param v samples (input, not modified)
     * @param n how many of them to use (the first n)
     * @return the median (mean of the two middle values for even n), NaN if n = 0
     */
    public static double median(double[] v, int n) {
        if (n == 0) {
            return Double.NaN;
        }
        double[] c = Arrays.copyOf(v, n);
        Arrays.sort(c);
        return (n % 2 == 1) ? c[n / 2] : 0.5 * (c[n / 2 - 1] + c[n / 2]);
    }

    /**
     * @param v samples (input, not modified)
     * @param n how many of them to use
     * @return 1.4826 · median(|v − median(v)|), NaN if n = 0
     */
    public static double madSigma(double[] v, int n) {
        double m = median(v, n);
        double[] d = new double[n];
        for (int i = 0; i < n; i++) {
            d[i] = Math.abs(v[i] - m);
        }
        return MAD_TO_SIGMA * median(d, n);
    }
}
