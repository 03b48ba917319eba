package dev.nitid.stars;

/** Why a detection was not used to measure the PSF. */
public enum RejectReason {
    /** Its stamp crosses the image edge. */
    EDGE("edge"),
    /** Masked (NaN) pixels inside its core. */
    MASKED("masked"),
    /**
     * A core pixel reaches the saturation level, or the peak is a flat top of ≥ 3 equal pixels at or above half
     * the frame's maximum.
     */
    SATURATED("saturated"),
    /** Another detection inside its stamp is at least {@code blendFraction} as bright. */
    BLEND("blend"),
    /** Hot pixel or cosmic ray: too sharp a peak, or a FWHM below the limits. */
    TOO_SHARP("too_sharp"),
    /** Galaxy, nebula knot or defocused blob: FWHM above {@code extendedFactor} × the median. */
    EXTENDED("extended"),
    /** Fitted peak below {@code minPeakSnr} × the local background σ: too faint to measure its shape. */
    FAINT("faint"),
    /** The profile fit did not converge, or its centre left the detection. */
    FIT_FAILED("fit_failed");

    private final String key;

    RejectReason(String key) {
        this.key = key;
    }

    /** @return a lower-case name for reports and JSON keys */
    public String key() {
        return key;
    }
}
