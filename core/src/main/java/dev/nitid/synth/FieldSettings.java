package dev.nitid.synth;

/**
 * Everything that defines a synthetic field. The same settings always give the same field, bit for bit.
 *
 * @param width    columns, ≥ 1
 * @param height   rows, ≥ 1
 * @param seed     random seed; stars, extended structure and noise draw from separate streams split from
 *                 it, so changing the noise settings does not move the stars
 * @param stars    the stars
 * @param extended the extended structure
 * @param psf      the PSF
 * @param detector the noise model
 */
public record FieldSettings(int width, int height, long seed, StarSettings stars, ExtendedSettings extended,
                            FieldPsf psf, DetectorSettings detector) {

    /** Validates the settings. */
    public FieldSettings {
        if (width < 1 || height < 1 || (long) width * height > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("field size " + width + "x" + height
                    + " is invalid: use positive sizes with at most 2^31 pixels");
        }
        if (stars == null || extended == null || psf == null || detector == null) {
            throw new IllegalArgumentException("stars, extended, psf and detector settings must all be given");
        }
        if (2 * stars.margin() >= Math.min(width, height) && stars.count() > 0) {
            throw new IllegalArgumentException("star margin " + stars.margin() + " leaves no room in a "
                    + width + "x" + height + " field: use a margin below half the smaller side");
        }
    }

    /**
     * A field with default stars (see {@link StarSettings#defaults()}), no extended structure, a Moffat PSF of
     * FWHM 3 px and β 3, and the default detector.
     *
     * @param width  columns
     * @param height rows
     * @param seed   random seed
     * @return the settings
     */
    public static FieldSettings of(int width, int height, long seed) {
        return new FieldSettings(width, height, seed, StarSettings.defaults(), ExtendedSettings.none(),
                SyntheticModelPsf.moffat(3, 3), DetectorSettings.defaults());
    }

    /** @return these settings with another seed */
    public FieldSettings withSeed(long s) {
        return new FieldSettings(width, height, s, stars, extended, psf, detector);
    }

    /** @return these settings with other stars */
    public FieldSettings withStars(StarSettings s) {
        return new FieldSettings(width, height, seed, s, extended, psf, detector);
    }

    /** @return these settings with other extended structure */
    public FieldSettings withExtended(ExtendedSettings e) {
        return new FieldSettings(width, height, seed, stars, e, psf, detector);
    }

    /** @return these settings with another PSF */
    public FieldSettings withPsf(FieldPsf p) {
        return new FieldSettings(width, height, seed, stars, extended, p, detector);
    }

    /** @return these settings with another detector */
    public FieldSettings withDetector(DetectorSettings d) {
        return new FieldSettings(width, height, seed, stars, extended, psf, d);
    }
}
