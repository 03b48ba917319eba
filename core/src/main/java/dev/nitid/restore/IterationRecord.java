package dev.nitid.restore;

/**
 * One iteration's figures, reported to a {@link ProgressListener} and kept in the result's history.
 *
 * @param plane          image plane, 0-based
 * @param iteration      iterations completed, 1-based
 * @param logLikelihood  Poisson log-likelihood of the estimate before this update,
 *                       {@code L = g Σ w [(d + c) ln(K o + c) − (K o + c)]} (no {@code ln d!} term);
 *                       NaN unless {@link Stopping#needsLikelihood()}
 * @param chiSquare      residual {@code χ²/N} of that estimate under the noise model
 * @param relativeChange {@code Σ|o_new − o| / Σ|o|} of this update
 * @param elapsedNanos   time since the iterations of this plane started
 */
public record IterationRecord(int plane, int iteration, double logLikelihood, double chiSquare,
                              double relativeChange, long elapsedNanos) {
}
