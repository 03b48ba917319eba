package dev.nitid.stars;

/** How a fitted profile is compared with pixel values. */
public enum PixelSampling {
    /**
     * The profile's value at each pixel centre. Cheapest, and what astropy's {@code Gaussian2D} fits and
     * photutils use; the FWHM then includes the pixel's own width (about +2.5 % for a 3-pixel FWHM,
     * since the variances add: σ² + 1/12).
     */
    POINT,
    /**
     * The profile averaged over each pixel's square (2×2-point Gauss–Legendre quadrature): the FWHM is
     * that of the optical PSF before the pixels sampled it. Four times the cost of {@link #POINT}.
     */
    INTEGRATED
}
