package dev.nitid.stars.fit;

/** Why a {@link LevenbergMarquardt} fit stopped. */
public enum FitStopReason {
    /** The relative decrease of χ² in an accepted step fell below {@link FitSettings#chi2Tolerance()}. */
    CHI2_CONVERGED,
    /** Every parameter step fell below {@link FitSettings#stepTolerance()} relative to the parameter. */
    STEP_CONVERGED,
    /** χ² reached zero (exact data): nothing left to improve. */
    EXACT_FIT,
    /** {@link FitSettings#maxIterations()} accepted or rejected steps were tried. Not converged. */
    MAX_ITERATIONS,
    /**
     * The damping reached {@link FitSettings#maxLambda()} without finding a better point: the start is
     * already at a minimum to working precision, or the model leaves its domain in every direction.
     * Reported as converged only if the gradient is negligible.
     */
    LAMBDA_LIMIT,
    /** Fewer usable data points (finite, weight &gt; 0) than parameters: the problem is underdetermined. */
    TOO_FEW_POINTS,
    /** The model is not valid or not finite at the start point. */
    INVALID_START
}
