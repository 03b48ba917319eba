package dev.nitid.image;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.testdata.Reference;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** Statistics against values from scipy/astropy ({@code reference/constants.csv}) and numpy's definitions. */
class ImageStatsTest {
    /** constants.csv prints 12 significant digits. */
    private static final double CSV_TOL = 1e-10;

    private static double constant(String name) {
        for (String line : Reference.lines("constants.csv")) {
            String key = line.startsWith("\"") ? line.substring(1, line.indexOf('"', 1)) : line.split(",")[0];
            if (key.equals(name)) {
                String rest = line.startsWith("\"") ? line.substring(line.indexOf('"', 1) + 2) : line.substring(key.length() + 1);
                return Double.parseDouble(rest.split(",")[0]);
            }
        }
        throw new IllegalStateException("constants.csv has no row " + name);
    }

    @Test
    void madSigmaOfWorkedExample() {
        // reference/README.md §7: [1,2,3,4,100] has MAD = 1 (scipy.stats.median_abs_deviation) and
        // σ̂ = 1.482602218505602 (astropy.stats.mad_std), factor 1/Φ⁻¹(3/4) (scipy.stats.norm.ppf).
        ImageStats s = ImageStats.of(new float[] {4, 100, 1, 3, 2});
        assertEquals(3.0, s.median(), 0.0);
        assertEquals(constant("mad_to_sigma"), ImageStats.MAD_TO_SIGMA, CSV_TOL);
        assertEquals(constant("mad_example_[1,2,3,4,100]_raw") * ImageStats.MAD_TO_SIGMA, s.madSigma(), CSV_TOL);
        assertEquals(constant("mad_example_[1,2,3,4,100]_normal"), s.madSigma(), CSV_TOL);
    }

    @Test
    void medianOfEvenCountIsMeanOfMiddlePair() {
        // numpy.median definition (numpy 1.24 docs): mean of the two middle values for even counts.
        assertEquals(2.5, ImageStats.of(new float[] {4, 1, 3, 2}).median(), 0.0);
        assertEquals(7.0, ImageStats.of(new float[] {7}).median(), 0.0);
    }

    @Test
    void nonFinitePixelsAreMaskedAndCounted() {
        ImageStats s = ImageStats.of(new float[] {Float.NaN, 1, Float.POSITIVE_INFINITY, 3});
        assertEquals(2, s.count());
        assertEquals(2, s.nonFinite());
        assertEquals(4.0, s.sum(), 0.0);
        assertEquals(2.0, s.mean(), 0.0);
        assertEquals(1.0, s.min(), 0.0);
        assertEquals(3.0, s.max(), 0.0);
        ImageStats none = ImageStats.of(new float[] {Float.NaN});
        assertTrue(Double.isNaN(none.median()) && Double.isNaN(none.madSigma()) && none.count() == 0);
    }

    @Test
    void sumsAccumulateInDouble() {
        // 2²⁴ + 1 ones: a float accumulator would stop at 2²⁴ = 16777216 (IEEE 754 binary32, 24-bit significand).
        float[] ones = new float[(1 << 24) + 1];
        java.util.Arrays.fill(ones, 1f);
        assertEquals((1 << 24) + 1.0, ImageStats.of(ones).sum(), 0.0);
    }

    @Test
    void madSigmaEstimatesGaussianSigma() {
        // The MAD estimator's asymptotic standard error is about 1.166 σ/√n (37 % efficiency; Rousseeuw &
        // Croux 1993, JASA 88, 1273; figure from memory). n = 10⁵, σ = 2.5: 3-sigma band ≈ 0.0277.
        SplittableRandom rnd = new SplittableRandom(12345);
        int n = 100_000;
        double sigma = 2.5;
        float[] v = new float[n];
        for (int i = 0; i < n; i++) {
            v[i] = (float) (10 + sigma * rnd.nextGaussian());
        }
        double band = 3 * 1.166 * sigma / Math.sqrt(n);
        assertEquals(sigma, ImageStats.of(v).madSigma(), band);
    }
}
