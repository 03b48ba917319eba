package dev.nitid.synth;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.synth.internal.PoissonSampler;
import java.util.SplittableRandom;
import org.hipparchus.distribution.continuous.ChiSquaredDistribution;
import org.hipparchus.distribution.discrete.PoissonDistribution;
import org.hipparchus.special.Gamma;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** The Poisson deviates against Hipparchus 4.0.3's Poisson distribution. */
class PoissonSamplerTest {
    /** Samples per mean: ≥ 1e5 as the reference notes ask for statistical checks on simulated noise. */
    static final int SAMPLES = 200_000;
    /** Goodness-of-fit p-value below which the test fails; 1e-4 keeps false alarms negligible over all means. */
    static final double MIN_P_VALUE = 1e-4;
    /** ln k! against Hipparchus' logGamma: Stirling's series with three terms is good to ~1e-13 for k ≥ 30. */
    static final double LOG_FACTORIAL_RTOL = 1e-12;
    /**
     * Width of the bands for the sample mean and variance, in standard errors: 4, so a correct sampler
     * fails one with probability 6.3e-5 (two-sided normal tail; common practice, no source). Wider than the
     * reference README §7's 3σ because 7 means × 2 moments make 14 checks.
     */
    static final double SE_BAND = 4;

    @ParameterizedTest(name = "mean {0}")
    @ValueSource(doubles = {0.3, 2.0, 9.99, 10.0, 37.5, 1000.0, 250_000.0})
    void matchesPoissonDistribution(double mean) {
        // Oracle: Hipparchus 4.0.3 PoissonDistribution pmf; Pearson's χ² test (any statistics text).
        PoissonDistribution dist = new PoissonDistribution(mean);
        SplittableRandom rnd = new SplittableRandom(Double.doubleToLongBits(mean));
        long[] draws = new long[SAMPLES];
        double sum = 0;
        for (int i = 0; i < SAMPLES; i++) {
            draws[i] = PoissonSampler.sample(mean, rnd);
            sum += draws[i];
        }
        double sampleMean = sum / SAMPLES;
        double var = 0;
        for (long d : draws) {
            var += (d - sampleMean) * (d - sampleMean);
        }
        var /= SAMPLES - 1;
        // Mean and variance within SE_BAND standard errors; for the variance Var s² ≈ (μ4 − σ⁴)/n with
        // μ4 = λ(1 + 3λ) for a Poisson variable, Johnson, Kemp & Kotz 2005, Univariate Discrete Distributions §4.3, from memory).
        assertEquals(mean, sampleMean, SE_BAND * Math.sqrt(mean / SAMPLES), "sample mean");
        double varSe = Math.sqrt((mean * (1 + 3 * mean) - mean * mean) / SAMPLES);
        assertEquals(mean, var, SE_BAND * varSe, "sample variance");

        // χ² over bins between the 0.1% and 99.9% quantiles, tails pooled.
        int lo = dist.inverseCumulativeProbability(0.001);
        int hi = dist.inverseCumulativeProbability(0.999);
        int width = Math.max(1, (hi - lo) / 40);
        int bins = (hi - lo) / width + 3;
        long[] observed = new long[bins];
        for (long d : draws) {
            int b = d < lo ? 0 : d > hi ? bins - 1 : 1 + (int) ((d - lo) / width);
            b = Math.min(b, bins - 1);
            observed[b]++;
        }
        double[] expected = new double[bins];
        expected[0] = dist.cumulativeProbability(lo - 1);
        for (int b = 1; b < bins - 1; b++) {
            int a = lo + (b - 1) * width;
            int z = Math.min(a + width - 1, hi);
            expected[b] = dist.cumulativeProbability(z) - dist.cumulativeProbability(a - 1);
        }
        expected[bins - 1] = 1 - dist.cumulativeProbability(hi);
        double chi2 = 0;
        int used = 0;
        for (int b = 0; b < bins; b++) {
            double e = expected[b] * SAMPLES;
            if (e > 0) {
                chi2 += (observed[b] - e) * (observed[b] - e) / e;
                used++;
            }
        }
        double p = 1 - new ChiSquaredDistribution(used - 1).cumulativeProbability(chi2);
        assertTrue(p > MIN_P_VALUE, "chi2 " + chi2 + " over " + used + " bins, p = " + p);
    }

    @Test
    void logFactorialMatchesLogGamma() {
        // Oracle: Hipparchus 4.0.3 Gamma.logGamma(k + 1) = ln k!.
        for (long k : new long[] {0, 1, 2, 5, 29, 30, 31, 100, 12_345, 10_000_000L}) {
            double expected = Gamma.logGamma(k + 1.0);
            assertEquals(expected, PoissonSampler.logFactorial(k), LOG_FACTORIAL_RTOL * Math.max(1, expected), "k = " + k);
        }
    }
}
