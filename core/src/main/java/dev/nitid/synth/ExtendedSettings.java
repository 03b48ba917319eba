package dev.nitid.synth;

/**
 * Extended (non-stellar) structure of a synthetic field; every brightness is in ADU per pixel of the
 * unblurred truth. Zero turns a component off.
 *
 * @param nebulaPeak     peak of the smooth nebula (a sum of a few broad Gaussian clouds), ≥ 0
 * @param filaments      number of fine filaments (random smooth curves), ≥ 0
 * @param filamentPeak   peak brightness across a filament, ≥ 0
 * @param filamentWidth  FWHM of a filament's Gaussian cross-section in pixels, &gt; 0
 * @param galaxies       number of galaxy-like blobs (elliptical exponential discs), ≥ 0
 * @param galaxyPeak     central brightness of the brightest galaxy, ≥ 0 (others down to a quarter of it)
 */
public record ExtendedSettings(double nebulaPeak, int filaments, double filamentPeak, double filamentWidth,
                               int galaxies, double galaxyPeak) {

    /** Validates the settings. */
    public ExtendedSettings {
        if (!(nebulaPeak >= 0) || !(filamentPeak >= 0) || !(galaxyPeak >= 0)
                || Double.isInfinite(nebulaPeak + filamentPeak + galaxyPeak)) {
            throw new IllegalArgumentException("extended brightness (nebula " + nebulaPeak + ", filaments "
                    + filamentPeak + ", galaxies " + galaxyPeak + ") must be finite and ≥ 0");
        }
        if (filaments < 0 || galaxies < 0) {
            throw new IllegalArgumentException("filament count " + filaments + " and galaxy count " + galaxies
                    + " must be ≥ 0");
        }
        if (!(filamentWidth > 0) || Double.isInfinite(filamentWidth)) {
            throw new IllegalArgumentException("filament width is " + filamentWidth + ": use a FWHM > 0 pixels");
        }
    }

    /** @return no extended structure */
    public static ExtendedSettings none() {
        return new ExtendedSettings(0, 0, 0, 1.0, 0, 0);
    }

    /** @return true if every component is off */
    public boolean isEmpty() {
        return nebulaPeak == 0 && (filaments == 0 || filamentPeak == 0) && (galaxies == 0 || galaxyPeak == 0);
    }

    /** @return these settings with another nebula peak */
    public ExtendedSettings withNebula(double peak) {
        return new ExtendedSettings(peak, filaments, filamentPeak, filamentWidth, galaxies, galaxyPeak);
    }

    /** @return these settings with other filaments */
    public ExtendedSettings withFilaments(int n, double peak, double width) {
        return new ExtendedSettings(nebulaPeak, n, peak, width, galaxies, galaxyPeak);
    }

    /** @return these settings with other galaxies */
    public ExtendedSettings withGalaxies(int n, double peak) {
        return new ExtendedSettings(nebulaPeak, filaments, filamentPeak, filamentWidth, n, peak);
    }
}
