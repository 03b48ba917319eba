package dev.nitid.stars;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.stars.internal.EllipticalProfileModel;
import dev.nitid.testdata.SeededCases;
import java.util.Arrays;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

class StarProfileFitTest {
    /** Noise-free, same sampling as the model: only float32 rounding of the stamp separates fit and truth. */
    private static final double EXACT_REL = 2e-4;
    /** Centroid tolerance in pixels for noise-free stamps (float32 rounding only). */
    private static final double EXACT_POS = 1e-3;
    /** Analytic vs central-difference Jacobian (step 1e-6 relative): truncation ≈ h², rounding ≈ ε/h. */
    private static final double JACOBIAN_REL = 1e-6;
    /**
     * 3×3 Gauss–Legendre pixel integration vs a 16×16 midpoint average: both approximate the pixel integral;
     * their difference for FWHM ≥ 2 px is far below this (common practice, no source: checked by halving).
     */
    private static final double INTEGRATED_REL = 3e-3;
    /** Noise-free angle, radians: float32 rounding only, for ellipticities ≥ 0.05 (project margin, no source). */
    private static final double EXACT_ANGLE_RAD = 1e-3;
    /** Noise-free background, ADU on a level of 100 (float32 rounding of the stamp, project margin). */
    private static final double EXACT_BACKGROUND = 0.05;
    /**
     * Noise-free β, relative: β is the least constrained parameter (its derivative is small where the data
     * are), so rounding moves it ~10× more than the FWHM (project margin, no source).
     */
    private static final double EXACT_BETA_REL = 2e-3;
    /**
     * Standard deviation of 200 pulls against 1: its own sampling error is 1/√(2·199) ≈ 0.05 (from memory, the
     * standard error of a normal sample's σ), so 0.2 is 4 standard errors.
     */
    private static final double PULL_STD_TOL = 0.2;
    /** A noise-free Moffat with a masked column: fewer pixels, rounding only; β within 0.01 (project margin). */
    private static final double MASKED_BETA_ABS = 0.01;
    /** ... and FWHM within 5 × {@link #EXACT_REL} (project margin for the lost column). */
    private static final double MASKED_FWHM_REL = 5 * EXACT_REL;

    static Stream<Long> jacobianSeeds() {
        return SeededCases.seeds("profile-jacobian", 8);
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("jacobianSeeds")
    void analyticJacobianMatchesFiniteDifferences(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        for (boolean moffat : new boolean[] {false, true}) {
            for (boolean integrated : new boolean[] {false, true}) {
                EllipticalProfileModel m = new EllipticalProfileModel(moffat, integrated, 9, 7);
                double a = rnd.nextDouble(0.2, 1);
                double c = rnd.nextDouble(0.2, 1);
                double b = rnd.nextDouble(-0.5, 0.5) * Math.sqrt(a * c);
                double[] q = moffat
                        ? new double[] {rnd.nextDouble(10, 100), rnd.nextDouble(3, 5), rnd.nextDouble(2, 4), a, b, c,
                            rnd.nextDouble(1.5, 6), rnd.nextDouble(-5, 5)}
                        : new double[] {rnd.nextDouble(10, 100), rnd.nextDouble(3, 5), rnd.nextDouble(2, 4), a, b, c,
                            rnd.nextDouble(-5, 5)};
                int p = q.length;
                int n = m.pointCount();
                double[] v = new double[n];
                double[] jac = new double[n * p];
                m.evaluate(q, v, jac);
                double[] up = new double[n];
                double[] dn = new double[n];
                for (int k = 0; k < p; k++) {
                    double h = 1e-6 * Math.max(1, Math.abs(q[k]));
                    double[] qq = q.clone();
                    qq[k] += h;
                    m.evaluate(qq, up, null);
                    qq[k] = q[k] - h;
                    m.evaluate(qq, dn, null);
                    for (int i = 0; i < n; i++) {
                        double fd = (up[i] - dn[i]) / (2 * h);
                        double scale = Math.abs(q[0]) + 1;
                        assertEquals(fd, jac[i * p + k], JACOBIAN_REL * scale,
                                "moffat=" + moffat + " integrated=" + integrated + " param " + k + " point " + i);
                    }
                }
            }
        }
    }

    static Stream<Long> shapeSeeds() {
        return SeededCases.seeds("profile-noise-free", 12);
    }

    /** Noise-free, point-sampled stars with random ellipses: the fit recovers the rendering parameters. */
    @ParameterizedTest(name = "seed {0}")
    @MethodSource("shapeSeeds")
    void recoversNoiseFreeEllipticalProfiles(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        for (ProfileShape shape : ProfileShape.values()) {
            int w = 21;
            double major = rnd.nextDouble(2.2, 5);
            double minor = major * rnd.nextDouble(0.6, 0.95);
            double angle = rnd.nextDouble(0, Math.PI);
            double beta = shape == ProfileShape.MOFFAT ? rnd.nextDouble(1.8, 6) : Double.NaN;
            double x0 = 10 + rnd.nextDouble(-1, 1);
            double y0 = 10 + rnd.nextDouble(-1, 1);
            float[] s = new float[w * w];
            Arrays.fill(s, 100f);
            TestStars.addStar(s, w, w, x0, y0, 5000, major, minor, angle, beta, 1, w);
            StarProfile f = StarProfileFit.fit(s, w, w, shape);
            assertTrue(f.converged(), () -> shape + " not converged: " + f.fit().reason());
            assertEquals(x0, f.x(), EXACT_POS, shape + " x");
            assertEquals(y0, f.y(), EXACT_POS, shape + " y");
            assertEquals(major, f.fwhmMajor(), EXACT_REL * major, shape + " major");
            assertEquals(minor, f.fwhmMinor(), EXACT_REL * minor, shape + " minor");
            assertEquals(0, Math.IEEEremainder(f.angle() - angle, Math.PI), EXACT_ANGLE_RAD, shape + " angle");
            assertEquals(5000, f.amplitude(), EXACT_REL * 5000, shape + " amplitude");
            assertEquals(100, f.background(), EXACT_BACKGROUND, shape + " background");
            if (shape == ProfileShape.MOFFAT) {
                assertEquals(beta, f.beta(), EXACT_BETA_REL * beta, "beta");
            }
        }
    }

    /**
     * Pixel-integrated stars (16×16 midpoint average in the test renderer) fitted with INTEGRATED sampling:
     * the FWHM of the continuous profile comes back; point sampling would read it about σ²+1/12 wider.
     */
    @Test
    void integratedSamplingRemovesPixelBroadening() {
        int w = 15;
        double fwhm = 2.2;
        float[] s = new float[w * w];
        TestStars.addStar(s, w, w, 7.3, 6.8, 1000, fwhm, fwhm, 0, Double.NaN, 16, w);
        StarProfile integ = StarProfileFit.fit(s, null, w, w, ProfileShape.GAUSSIAN,
                ProfileFitSettings.defaults().withSampling(PixelSampling.INTEGRATED));
        StarProfile point = StarProfileFit.fit(s, w, w, ProfileShape.GAUSSIAN);
        assertEquals(fwhm, integ.fwhm(), INTEGRATED_REL * fwhm, "integrated fit");
        // Variances add (box of width 1 has variance 1/12): expected point-sampled FWHM.
        double sigma = fwhm / 2.354820045;
        double broadened = 2.354820045 * Math.sqrt(sigma * sigma + 1.0 / 12);
        assertEquals(broadened, point.fwhm(), 0.01 * broadened, "point-sampled fit of an integrated star");
    }

    static Stream<Long> noiseSeeds() {
        return SeededCases.seeds("profile-pulls", 1);
    }

    /**
     * Reported errors are honest: over many noisy stamps, (fit − truth)/error has a standard deviation near 1
     * (Press et al. 2007, §15.6: the covariance gives the 1-σ confidence of each parameter).
     * 200 trials: the sample std of a unit normal has std ≈ 1/√400 = 0.05, so a ±0.2 band is 4σ.
     */
    @ParameterizedTest(name = "seed {0}")
    @MethodSource("noiseSeeds")
    void uncertaintiesMatchScatter(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        int trials = 200;
        int w = 15;
        double[] pullX = new double[trials];
        double[] pullF = new double[trials];
        for (int t = 0; t < trials; t++) {
            float[] s = new float[w * w];
            double x0 = 7 + rnd.nextDouble(-0.5, 0.5);
            double y0 = 7 + rnd.nextDouble(-0.5, 0.5);
            TestStars.addStar(s, w, w, x0, y0, 300, 3.2, 2.8, 0.4, Double.NaN, 1, w);
            for (int i = 0; i < s.length; i++) {
                s[i] += (float) (20 + 10 * rnd.nextGaussian());
            }
            StarProfile f = StarProfileFit.fitGaussian(s, w, w);
            pullX[t] = (f.x() - x0) / f.errors().x();
            pullF[t] = (f.fwhm() - Math.sqrt(3.2 * 2.8)) / f.errors().fwhm();
        }
        assertEquals(1, std(pullX), PULL_STD_TOL, "pull of x");
        assertEquals(1, std(pullF), PULL_STD_TOL, "pull of FWHM");
    }

    private static double std(double[] v) {
        double m = Arrays.stream(v).average().orElseThrow();
        return Math.sqrt(Arrays.stream(v).map(x -> (x - m) * (x - m)).sum() / (v.length - 1));
    }

    /** NaN pixels (bad columns, masked cosmic rays) are ignored. */
    @Test
    void ignoresNaNPixels() {
        int w = 15;
        float[] s = new float[w * w];
        TestStars.addStar(s, w, w, 7.2, 7.1, 1000, 3, 3, 0, 3.0, 1, w);
        for (int y = 0; y < w; y++) {
            s[y * w + 9] = Float.NaN;
        }
        StarProfile f = StarProfileFit.fitMoffat(s, w, w);
        assertEquals(3, f.fwhm(), MASKED_FWHM_REL * 3, "FWHM with a masked column");
        assertEquals(3, f.beta(), MASKED_BETA_ABS, "beta with a masked column");
    }

    @Test
    void rejectsWrongSizes() {
        assertThrows(IllegalArgumentException.class, () -> StarProfileFit.fitGaussian(new float[10], 3, 3));
        float[] nan = new float[25];
        Arrays.fill(nan, Float.NaN);
        assertThrows(IllegalArgumentException.class, () -> StarProfileFit.fitGaussian(nan, 5, 5));
    }
}
