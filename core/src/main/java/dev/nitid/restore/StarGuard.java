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
    SKY_FLOOR
}
