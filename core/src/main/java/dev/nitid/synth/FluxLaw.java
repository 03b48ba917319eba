package dev.nitid.synth;

/** How star fluxes are distributed between {@link StarSettings#minFlux()} and {@link StarSettings#maxFlux()}. */
public enum FluxLaw {
    /**
     * Power-law counts: the number of stars brighter than F goes as {@code N(>F) ∝ F^(−γ)} with
     * γ = {@link StarSettings#slope()}; drawn by inverting the truncated cumulative distribution. γ = 1 gives
     * many faint stars and few bright ones, as in a real field (common practice, no source).
     */
    POWER_LAW,
    /**
     * Magnitudes uniform between the faintest and the brightest flux, {@code m = −2.5 log₁₀ F}: as many
     * stars per magnitude at every brightness, a flat test of the whole dynamic range.
     */
    UNIFORM_MAGNITUDE
}
