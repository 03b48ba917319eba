package dev.nitid.restore;

/** When an iterative restorer stops. */
public enum StopRule {
    /** Run exactly {@link Stopping#maxIterations()} iterations (unless cancelled). */
    FIXED_COUNT,
    /**
     * Stop at the first iteration whose residual {@code χ²/N = (1/N) Σ w (d − K o)² / v} under the noise
     * model's variance {@code v} falls to {@link Stopping#threshold()} (1 by default): the discrepancy
     * principle — past that point the restoration fits noise (Morozov 1966; common practice in
     * astronomical deconvolution, no single source). The sum runs over the pixels whose model lies 3 sky σ
     * above the sky — those that carry the scene's light — so that on a sparse field a flat sky, fitted at
     * once, cannot end the iterations while the stars are still blurred (all valid pixels when fewer than
     * 100 qualify). Also stops when the likelihood gain rule below fires, or at the iteration cap.
     */
    CHI_SQUARE,
    /**
     * Stop when the Poisson log-likelihood gain per pixel, in photo-electrons' units,
     * {@code (L_k − L_{k−1}) / N}, falls below {@link Stopping#threshold()}, or at the iteration cap.
     */
    LIKELIHOOD_GAIN
}
