package dev.nitid.synth;

/** Where stars are placed. */
public enum Placement {
    /** Uniformly random positions inside the margin, sub-pixel. */
    RANDOM,
    /**
     * A regular grid filling the field inside the margin, in the order of the drawn fluxes, each star
     * nudged by a random sub-pixel offset so that the pixel phase varies. Good for measuring PSF variation.
     */
    GRID
}
