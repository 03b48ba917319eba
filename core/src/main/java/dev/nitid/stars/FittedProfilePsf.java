package dev.nitid.stars;

import dev.nitid.image.Image;
import dev.nitid.psf.GaussianPsf;
import dev.nitid.psf.MoffatPsf;
import dev.nitid.psf.PsfModel;

/**
 * Turns a fitted elliptical Gaussian or Moffat profile into a PSF image for the restorers through the
 * project's PSF models ({@link GaussianPsf}, {@link MoffatPsf}): odd size, centred on the middle pixel
 * ({@code (⌊w/2⌋, ⌊h/2⌋)}), pixel-integrated by {@value PsfModel#DEFAULT_OVERSAMPLE}² sub-pixels, sum 1.
 */
public final class FittedProfilePsf {
    private FittedProfilePsf() {
    }

    /**
     * The PSF model of a fitted profile.
     *
     * @param shape     Gaussian or Moffat
     * @param fwhmMajor major-axis FWHM, px, &gt; 0
     * @param fwhmMinor minor-axis FWHM, px, in (0, fwhmMajor]
     * @param angle     major-axis angle, radians from +x towards +y
     * @param beta      Moffat β &gt; 1 (ignored for a Gaussian)
     * @return the model
     */
    public static PsfModel model(ProfileShape shape, double fwhmMajor, double fwhmMinor, double angle, double beta) {
        double minor = Math.min(fwhmMinor, fwhmMajor);
        double deg = Math.toDegrees(angle);
        return shape == ProfileShape.MOFFAT ? new MoffatPsf(fwhmMajor, minor, beta, deg)
                : new GaussianPsf(fwhmMajor, minor, deg);
    }

    /**
     * Renders a fitted profile as a PSF image.
     *
     * @param shape     Gaussian or Moffat
     * @param fwhmMajor major-axis FWHM, px, &gt; 0
     * @param fwhmMinor minor-axis FWHM, px, in (0, fwhmMajor]
     * @param angle     major-axis angle, radians from +x towards +y
     * @param beta      Moffat β &gt; 1 (ignored for a Gaussian)
     * @param radius    the image is (2·radius+1)², radius ≥ 1
     * @return the PSF image, sum 1
     */
    public static Image render(ProfileShape shape, double fwhmMajor, double fwhmMinor, double angle, double beta,
                               int radius) {
        if (radius < 1) {
            throw new IllegalArgumentException("radius is " + radius + ": use at least 1");
        }
        return model(shape, fwhmMajor, fwhmMinor, angle, beta).render(2 * radius + 1);
    }
}
