package dev.nitid.stars.fit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.testdata.SeededCases;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.junit.jupiter.api.Test;

class LevenbergMarquardtTest {
    /** Closed-form and iterative answers agree to rounding for a well-conditioned line fit. */
    private static final double LINE_TOL = 1e-9;
    /** Noise-free nonlinear data: the solver should land on the truth to near machine precision. */
    private static final double EXACT_TOL = 1e-7;

    /** y = p0 + p1·x: a linear model, so LM must give the ordinary least-squares closed form. */
    static final class Line implements Model {
        final double[] xs;

        Line(double[] xs) {
            this.xs = xs;
        }

        @Override
        public int parameterCount() {
            return 2;
        }

        @Override
        public int pointCount() {
            return xs.length;
        }

        @Override
        public void evaluate(double[] p, double[] v, double[] j) {
            for (int i = 0; i < xs.length; i++) {
                v[i] = p[0] + p[1] * xs[i];
                if (j != null) {
                    j[2 * i] = 1;
                    j[2 * i + 1] = xs[i];
                }
            }
        }
    }

    /** y = p0·exp(−p1·x) + p2. */
    static final class Decay implements Model {
        final double[] xs;

        Decay(double[] xs) {
            this.xs = xs;
        }

        @Override
        public int parameterCount() {
            return 3;
        }

        @Override
        public int pointCount() {
            return xs.length;
        }

        @Override
        public boolean isValid(double[] p) {
            return p[1] > 0 && Model.super.isValid(p);
        }

        @Override
        public void evaluate(double[] p, double[] v, double[] j) {
            for (int i = 0; i < xs.length; i++) {
                double e = Math.exp(-p[1] * xs[i]);
                v[i] = p[0] * e + p[2];
                if (j != null) {
                    j[3 * i] = e;
                    j[3 * i + 1] = -p[0] * xs[i] * e;
                    j[3 * i + 2] = 1;
                }
            }
        }
    }

    static Stream<Long> lineSeeds() {
        return SeededCases.seeds("lm-line", 20);
    }

    /**
     * Weighted straight-line fit against the closed form of Press et al., Numerical Recipes 3rd ed. 2007,
     * §15.2, eqs. 15.2.4–15.2.9 (S, Sx, Sy, Sxx, Sxy, Δ; σ_a² = Sxx/Δ, σ_b² = S/Δ), with absolute weights.
     */
    @ParameterizedTest(name = "seed {0}")
    @MethodSource("lineSeeds")
    void weightedLineMatchesClosedForm(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        int n = 5 + rnd.nextInt(40);
        double[] x = new double[n];
        double[] y = new double[n];
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = rnd.nextDouble(-10, 10);
            double sig = rnd.nextDouble(0.1, 2);
            w[i] = 1 / (sig * sig);
            y[i] = 3 - 0.7 * x[i] + sig * rnd.nextGaussian();
        }
        double s = 0, sx = 0, sy = 0, sxx = 0, sxy = 0;
        for (int i = 0; i < n; i++) {
            s += w[i];
            sx += w[i] * x[i];
            sy += w[i] * y[i];
            sxx += w[i] * x[i] * x[i];
            sxy += w[i] * x[i] * y[i];
        }
        double delta = s * sxx - sx * sx;
        double a = (sxx * sy - sx * sxy) / delta;
        double b = (s * sxy - sx * sy) / delta;
        FitResult r = LevenbergMarquardt.fit(new Line(x), new double[] {0, 0}, y, w,
                FitSettings.defaults().withCovariance(FitSettings.CovarianceScaling.ABSOLUTE));
        assertTrue(r.converged(), () -> "not converged: " + r.reason());
        assertEquals(a, r.params()[0], LINE_TOL * (1 + Math.abs(a)), "intercept");
        assertEquals(b, r.params()[1], LINE_TOL * (1 + Math.abs(b)), "slope");
        assertEquals(Math.sqrt(sxx / delta), r.sigmas()[0], LINE_TOL * Math.sqrt(sxx / delta), "σ intercept");
        assertEquals(Math.sqrt(s / delta), r.sigmas()[1], LINE_TOL * Math.sqrt(s / delta), "σ slope");
        assertEquals(-sx / delta, r.covariance(0, 1), LINE_TOL * Math.abs(sx / delta) + 1e-15, "cov(a,b)");
        assertEquals(n - 2, r.dof());
    }

    /** Reduced-χ² scaling multiplies the covariance by χ²/(n−p) (Press et al. 2007, §15.6; scipy curve_fit). */
    @Test
    void reducedChi2ScalingMultipliesCovariance() {
        double[] x = {0, 1, 2, 3, 4, 5};
        double[] y = {1.1, 2.9, 5.2, 6.8, 9.1, 11.0};
        FitResult abs = LevenbergMarquardt.fit(new Line(x), new double[] {0, 1}, y, null,
                FitSettings.defaults().withCovariance(FitSettings.CovarianceScaling.ABSOLUTE));
        FitResult red = LevenbergMarquardt.fit(new Line(x), new double[] {0, 1}, y, null, FitSettings.defaults());
        double scale = red.chi2() / (x.length - 2);
        for (int k = 0; k < 4; k++) {
            assertEquals(abs.covariance()[k] * scale, red.covariance()[k], 1e-12 * Math.abs(abs.covariance()[k] * scale));
        }
        assertEquals(scale, red.reducedChi2(), 1e-15);
    }

    static Stream<Long> decaySeeds() {
        return SeededCases.seeds("lm-decay", 15);
    }

    /** Noise-free exponential: the truth is the exact minimum, reached from a distant start. */
    @ParameterizedTest(name = "seed {0}")
    @MethodSource("decaySeeds")
    void recoversNoiseFreeExponential(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        double[] truth = {rnd.nextDouble(1, 100), rnd.nextDouble(0.05, 2), rnd.nextDouble(-5, 5)};
        double[] x = new double[30];
        double[] y = new double[30];
        for (int i = 0; i < x.length; i++) {
            x[i] = i * 0.25;
            y[i] = truth[0] * Math.exp(-truth[1] * x[i]) + truth[2];
        }
        double[] start = {truth[0] * rnd.nextDouble(0.3, 3), truth[1] * rnd.nextDouble(0.3, 3), 0};
        FitResult r = LevenbergMarquardt.fit(new Decay(x), start, y);
        assertTrue(r.converged(), () -> "not converged: " + r.reason() + " after " + r.iterations());
        for (int k = 0; k < 3; k++) {
            assertEquals(truth[k], r.params()[k], EXACT_TOL * (1 + Math.abs(truth[k])), "parameter " + k);
        }
    }

    /** NaN data and zero weights are ignored, as if the points were absent. */
    @Test
    void ignoresNaNAndZeroWeight() {
        double[] x = {0, 1, 2, 3, 4, 5, 6};
        double[] y = {1, 3, Double.NaN, 7, 1000, 11, 13};
        double[] w = {1, 1, 1, 1, 0, 1, 1};
        FitResult r = LevenbergMarquardt.fit(new Line(x), new double[] {0, 0}, y, w, FitSettings.defaults());
        assertEquals(1, r.params()[0], 1e-9);
        assertEquals(2, r.params()[1], 1e-9);
        assertEquals(5 - 2, r.dof());
    }

    @Test
    void tooFewPointsIsReportedNotThrown() {
        double[] x = {0, 1};
        double[] y = {1, Double.NaN};
        FitResult r = LevenbergMarquardt.fit(new Line(x), new double[] {0, 0}, y);
        assertFalse(r.converged());
        assertEquals(FitStopReason.TOO_FEW_POINTS, r.reason());
    }

    @Test
    void callerMistakesNameTheValue() {
        double[] x = {0, 1, 2};
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> LevenbergMarquardt.fit(new Line(x), new double[] {0}, new double[] {1, 2, 3}));
        assertTrue(e.getMessage().contains("start has 1"), e.getMessage());
        assertThrows(IllegalArgumentException.class,
                () -> LevenbergMarquardt.fit(new Line(x), new double[] {0, 0}, new double[] {1, 2, 3},
                        new double[] {1, -1, 1}, FitSettings.defaults()));
        assertThrows(IllegalArgumentException.class, () -> FitSettings.defaults().withMaxIterations(0));
    }
}
