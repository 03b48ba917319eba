package dev.nitid.stars.fit;

/**
 * Settings of a {@link LevenbergMarquardt} fit.
 *
 * @param maxIterations   trial steps allowed (accepted or rejected), ≥ 1
 * @param initialLambda   starting damping λ (Marquardt 1963 suggests 0.01), &gt; 0
 * @param lambdaUp        factor applied to λ after a rejected step, &gt; 1
 * @param lambdaDown      divisor applied to λ after an accepted step, &gt; 1
 * @param maxLambda       damping at which the fit gives up (see {@link FitStopReason#LAMBDA_LIMIT}), &gt; initialLambda
 * @param chi2Tolerance   stop when an accepted step lowers χ² by less than this fraction, ≥ 0
 * @param stepTolerance   stop when every |δp_k| ≤ stepTolerance·(|p_k| + stepTolerance), ≥ 0
 * @param covariance      how the covariance is scaled
 */
public record FitSettings(int maxIterations, double initialLambda, double lambdaUp, double lambdaDown,
                          double maxLambda, double chi2Tolerance, double stepTolerance,
                          CovarianceScaling covariance) {

    /** How the parameter covariance {@code (JᵀWJ)⁻¹} is scaled. */
    public enum CovarianceScaling {
        /**
         * Multiply by the reduced χ², {@code χ²/(n − p)}: right when the weights are known only up to a
         * common factor (for example all 1). This is what scipy's {@code curve_fit} does by default
         * ({@code absolute_sigma=False}) and what Press et al., Numerical Recipes 3rd ed. 2007, §15.6
         * recommend when σ is unknown.
         */
        REDUCED_CHI2,
        /** Use {@code (JᵀWJ)⁻¹} as is: right when the weights are true inverse variances 1/σᵢ². */
        ABSOLUTE
    }

    /** Validates the settings. */
    public FitSettings {
        if (maxIterations < 1) {
            throw new IllegalArgumentException("maxIterations is " + maxIterations + ": use at least 1");
        }
        if (!(initialLambda > 0) || !Double.isFinite(initialLambda)) {
            throw new IllegalArgumentException("initialLambda is " + initialLambda + ": use a finite value > 0, e.g. 1e-3");
        }
        if (!(lambdaUp > 1) || !(lambdaDown > 1)) {
            throw new IllegalArgumentException("lambdaUp " + lambdaUp + " and lambdaDown " + lambdaDown
                    + " must both be > 1, e.g. 10 and 10");
        }
        if (!(maxLambda > initialLambda)) {
            throw new IllegalArgumentException("maxLambda " + maxLambda + " must exceed initialLambda " + initialLambda);
        }
        if (!(chi2Tolerance >= 0) || !(stepTolerance >= 0)) {
            throw new IllegalArgumentException("chi2Tolerance " + chi2Tolerance + " and stepTolerance " + stepTolerance
                    + " must be ≥ 0");
        }
        if (covariance == null) {
            throw new IllegalArgumentException("covariance is null: choose REDUCED_CHI2 or ABSOLUTE");
        }
    }

    /**
     * @return 200 steps, λ from 1e-3 with factors 10 (Press et al., Numerical Recipes 3rd ed. 2007, §15.5.2),
     *         relative χ² and step tolerances 1e-10, covariance scaled by the reduced χ²
     */
    public static FitSettings defaults() {
        return new FitSettings(200, 1e-3, 10, 10, 1e16, 1e-10, 1e-10, CovarianceScaling.REDUCED_CHI2);
    }

    /** @return these settings with another iteration limit */
    public FitSettings withMaxIterations(int n) {
        return new FitSettings(n, initialLambda, lambdaUp, lambdaDown, maxLambda, chi2Tolerance, stepTolerance, covariance);
    }

    /** @return these settings with other relative tolerances on χ² and on the step */
    public FitSettings withTolerances(double chi2Tol, double stepTol) {
        return new FitSettings(maxIterations, initialLambda, lambdaUp, lambdaDown, maxLambda, chi2Tol, stepTol, covariance);
    }

    /** @return these settings with another covariance scaling */
    public FitSettings withCovariance(CovarianceScaling c) {
        return new FitSettings(maxIterations, initialLambda, lambdaUp, lambdaDown, maxLambda, chi2Tolerance, stepTolerance, c);
    }
}
