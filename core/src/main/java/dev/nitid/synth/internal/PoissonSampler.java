package dev.nitid.synth.internal;

import java.util.SplittableRandom;

/**
 * Poisson deviates from a {@link SplittableRandom}, exact in distribution for every mean.
 *
 * <p>Means below {@value #PTRS_THRESHOLD} use the multiplication (inversion) method (Knuth, <i>The Art of
 * Computer Programming</i> vol. 2, 3rd ed. 1997, §3.4.1 F — from memory); larger means use the transformed
 * rejection method with squeeze, PTRS (Hörmann 1993, <i>Insurance: Mathematics and Economics</i> 12, 39 —
 * constants from memory, checked in the tests against Hipparchus' Poisson distribution).
 *
 * <p>Stateless; thread-safe if each thread passes its own random source.
 */
public final class PoissonSampler {
    /** Below this mean the inversion loop is faster and exact; PTRS needs a mean ≥ 10. */
    static final double PTRS_THRESHOLD = 10.0;

    private PoissonSampler() {
    }

    /**
     * Draws one Poisson deviate.
     *
     * @param mean the mean, ≥ 0 and finite
     * @param rnd  the random source (modified: advanced)
     * @return a non-negative count
     */
    public static long sample(double mean, SplittableRandom rnd) {
        if (!(mean >= 0) || Double.isInfinite(mean)) {
            throw new IllegalArgumentException("Poisson mean is " + mean + ": it must be finite and ≥ 0");
        }
        if (mean == 0) {
            return 0;
        }
        return mean < PTRS_THRESHOLD ? inversion(mean, rnd) : ptrs(mean, rnd);
    }

    private static long inversion(double mean, SplittableRandom rnd) {
        double limit = Math.exp(-mean);
        double prod = rnd.nextDouble();
        long k = 0;
        while (prod > limit) {
            prod *= rnd.nextDouble();
            k++;
        }
        return k;
    }

    private static long ptrs(double mean, SplittableRandom rnd) {
        double slam = Math.sqrt(mean);
        double loglam = Math.log(mean);
        double b = 0.931 + 2.53 * slam;
        double a = -0.059 + 0.02483 * b;
        double invalpha = 1.1239 + 1.1328 / (b - 3.4);
        double vr = 0.9277 - 3.6224 / (b - 2);
        while (true) {
            double u = rnd.nextDouble() - 0.5;
            double v = rnd.nextDouble();
            double us = 0.5 - Math.abs(u);
            long k = (long) Math.floor((2 * a / us + b) * u + mean + 0.43);
            if (us >= 0.07 && v <= vr) {
                return k;
            }
            if (k < 0 || (us < 0.013 && v > us)) {
                continue;
            }
            if (Math.log(v) + Math.log(invalpha) - Math.log(a / (us * us) + b)
                    <= -mean + k * loglam - logFactorial(k)) {
                return k;
            }
        }
    }

    /**
     * ln(k!) — exact sums below 30, Stirling's series with three correction terms above (Abramowitz &amp;
     * Stegun 1964, eq. 6.1.41; relative error below 1e-12 for k ≥ 30, from memory, tested against
     * Hipparchus' {@code Gamma.logGamma}).
     *
     * @param k a count ≥ 0
     * @return ln(k!)
     */
    public static double logFactorial(long k) {
        if (k < 30) {
            double s = 0;
            for (long i = 2; i <= k; i++) {
                s += Math.log(i);
            }
            return s;
        }
        double n = k + 1.0;
        double inv = 1.0 / n;
        double inv2 = inv * inv;
        return (n - 0.5) * Math.log(n) - n + 0.5 * Math.log(2 * Math.PI)
                + inv * (1.0 / 12 - inv2 * (1.0 / 360 - inv2 / 1260));
    }
}
