package dev.nitid.quality.internal;

import java.util.Arrays;
import java.util.SplittableRandom;

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
        double s = madSigma(d, n);
        return Math.sqrt(Math.max(0, s * s - 1.0 / 12));
    }
}
