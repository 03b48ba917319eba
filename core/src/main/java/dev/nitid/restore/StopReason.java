package dev.nitid.restore;

/** Why an iterative restoration stopped. */
public enum StopReason {
    /** The requested fixed number of iterations ran. */
    FIXED_COUNT_REACHED,
    /** The residual χ²/N reached the target. */
    CHI_SQUARE_REACHED,
    /** The log-likelihood gain per pixel fell below the threshold. */
    LIKELIHOOD_CONVERGED,
    /** An automatic rule stopped because an update barely changed the estimate ({@link Stopping#minChange()}). */
    STALLED,
    /** An automatic rule had not fired when the iteration cap was reached. */
    ITERATION_CAP,
    /** The caller cancelled; the result holds the last completed iterate. */
    CANCELLED,
    /** Not iterative (Wiener, Tikhonov): one pass. */
    SINGLE_PASS
}
