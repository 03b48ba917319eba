package dev.nitid.stars;

import dev.nitid.stars.fit.FitResult;

/**
 * A fitted star profile. Coordinates are in the stamp's pixels, pixel {@code (i, j)} centred at
 * {@code x = i, y = j}; angles are in radians from +x towards +y, in [0, π).
 *
 * @param shape      the profile fitted
 * @param x          centre x
 * @param y          centre y
 * @param amplitude  peak above the background
 * @param background constant under the star
 * @param fwhmMajor  FWHM along the major axis, pixels
 * @param fwhmMinor  FWHM along the minor axis, pixels
 * @param angle      direction of the major axis, radians in [0, π)
 * @param beta       Moffat β (NaN for a Gaussian)
 * @param flux       integral of the profile above the background (analytic, infinite extent)
 * @param errors     1-σ standard errors of each quantity, propagated from the fit covariance
 * @param fit        the solver's result (raw parameters in {@code a, b, c} form, χ², steps)
 */
public record StarProfile(ProfileShape shape, double x, double y, double amplitude, double background,
                          double fwhmMajor, double fwhmMinor, double angle, double beta, double flux,
                          Errors errors, FitResult fit) {

    /**
     * 1-σ standard errors (delta method: {@code σ_g² = ∇gᵀ C ∇g}); NaN when the covariance is singular.
     *
     * @param x          of the centre x
     * @param y          of the centre y
     * @param amplitude  of the amplitude
     * @param background of the background
     * @param fwhmMajor  of the major FWHM
     * @param fwhmMinor  of the minor FWHM
     * @param fwhm       of the geometric-mean FWHM
     * @param ellipticity of the ellipticity
     * @param angle      of the angle (radians; large for round stars, where the angle is undefined)
     * @param beta       of β (NaN for a Gaussian)
     * @param flux       of the flux
     */
    public record Errors(double x, double y, double amplitude, double background, double fwhmMajor,
                         double fwhmMinor, double fwhm, double ellipticity, double angle, double beta,
                         double flux) {
    }

    /** @return the geometric-mean FWHM {@code √(major·minor)}, pixels */
    public double fwhm() {
        return Math.sqrt(fwhmMajor * fwhmMinor);
    }

    /** @return ellipticity {@code 1 − minor/major}, 0 for a round star */
    public double ellipticity() {
        return 1 - fwhmMinor / fwhmMajor;
    }

    /** @return true if the solver met a convergence criterion */
    public boolean converged() {
        return fit.converged();
    }
}
