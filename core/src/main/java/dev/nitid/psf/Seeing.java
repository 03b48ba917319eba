package dev.nitid.psf;

import dev.nitid.psf.internal.Grids;

/**
 * Atmospheric seeing as a blur of given FWHM in arcseconds, to convolve onto any model
 * (see {@link Psfs#withSeeingAndJitter}).
 *
 * @param profile    the blur's shape
 * @param fwhmArcsec FWHM, arcsec, &gt; 0
 * @param beta       Moffat β (used by {@link Profile#MOFFAT} only), &gt; 1
 */
public record Seeing(Profile profile, double fwhmArcsec, double beta) {

    /** The shape of the seeing blur. */
    public enum Profile {
        /** Moffat profile; β = 4.765 matches Kolmogorov turbulence (Trujillo et al. 2001, MNRAS 328, 977). */
        MOFFAT,
        /** Gaussian profile: the long-exposure core without the Moffat's wings. */
        GAUSSIAN
    }

    /** Validates the settings. */
    public Seeing {
        if (profile == null) {
            throw new IllegalArgumentException("seeing profile is null: choose MOFFAT or GAUSSIAN");
        }
        Grids.positive("seeing FWHM", fwhmArcsec, "arcsec");
        if (!(beta > 1) || !Double.isFinite(beta)) {
            throw new IllegalArgumentException("seeing Moffat beta " + beta + " must be above 1 (4.765 is typical)");
        }
    }

    /** @return Kolmogorov-like Moffat seeing (β = 4.765) of the given FWHM in arcsec: the default */
    public static Seeing moffat(double fwhmArcsec) {
        return new Seeing(Profile.MOFFAT, fwhmArcsec, MoffatPsf.KOLMOGOROV_BETA);
    }

    /** @return Gaussian seeing of the given FWHM in arcsec */
    public static Seeing gaussian(double fwhmArcsec) {
        return new Seeing(Profile.GAUSSIAN, fwhmArcsec, MoffatPsf.KOLMOGOROV_BETA);
    }

    /**
     * The blur kernel in detector pixels.
     *
     * @param plateScaleArcsec arcsec per pixel
     * @return a round Moffat or Gaussian of FWHM {@code fwhmArcsec / plateScale} pixels
     */
    public AnalyticPsf kernel(double plateScaleArcsec) {
        Grids.positive("plate scale", plateScaleArcsec, "arcsec per pixel");
        double fwhmPx = fwhmArcsec / plateScaleArcsec;
        return profile == Profile.MOFFAT ? MoffatPsf.ofFwhm(fwhmPx, beta) : GaussianPsf.ofFwhm(fwhmPx);
    }
}
