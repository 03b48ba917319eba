package dev.nitid.restore;

/** How a restorer keeps dark rings out of the sky around bright stars. */
public enum StarGuard {
    /** No protection: plain behaviour of the chosen method. */
    NONE,
    /**
     * Sky floor around bright stars: stars brighter than {@link StarProtection#detectSigma()} are found in
     * the observed frame, the local sky around each is measured in the observed data (median of an annulus
     * just outside the protected disc), and inside the disc the estimate is kept at or above
     * {@code local sky − margin·σ} after every iteration. The star's core still sharpens (it is far above
     * the floor); only the undershoot that makes a dark ring is cut off. Our own method.
     */
    SKY_FLOOR,
    /**
     * Ring floor: the same stars, local sky and margin as {@link #SKY_FLOOR}, but the constraint is on the
     * mean of each 1-px annulus around the star rather than on each pixel: after every iteration an
     * annulus whose mean lies below {@code local sky − margin·σ} is lifted by the difference. A star plus sky
     * is never darker than the sky on average at any radius, so this removes the systematic dark ring while
     * leaving the pixel noise untouched (no positive bias from clipping noise). The light added to the
     * annuli is taken back from the star's 3×3 core, so each star keeps its flux. Our own method.
     */
    RING_FLOOR
}
