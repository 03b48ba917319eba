package dev.nitid.psf;

import dev.nitid.image.Image;
import dev.nitid.psf.internal.Grids;
import java.util.List;

/**
 * An elliptical 2-D Gaussian PSF of unit integral:
 * <pre>  P(u, v) = exp(−u²/2σa² − v²/2σb²) / (2π σa σb),   σ = FWHM / (2√(2 ln 2))</pre>
 * with {@code (u, v)} the offsets along the major axis (at {@code angleDeg} from +x towards +y) and the
 * minor axis. FWHM = 2√(2 ln 2) σ = 2.354820045 σ (any statistics handbook).
 *
 * @param fwhmMajor FWHM along the major axis, pixels, &gt; 0
 * @param fwhmMinor FWHM along the minor axis, pixels, 0 &lt; fwhmMinor ≤ fwhmMajor
 * @param angleDeg  position angle of the major axis, degrees from +x towards +y
 */
public record GaussianPsf(double fwhmMajor, double fwhmMinor, double angleDeg) implements AnalyticPsf {

    /** 2√(2 ln 2): FWHM over σ of a Gaussian. */
    public static final double FWHM_PER_SIGMA = 2.0 * Math.sqrt(2.0 * Math.log(2.0));

    /** Validates the widths and the angle. */
    public GaussianPsf {
        Grids.positive("Gaussian FWHM (major axis)", fwhmMajor, "pixels");
        Grids.positive("Gaussian FWHM (minor axis)", fwhmMinor, "pixels");
        Grids.finite("Gaussian angle", angleDeg);
        if (fwhmMinor > fwhmMajor) {
            throw new IllegalArgumentException("Gaussian minor-axis FWHM " + fwhmMinor
                    + " exceeds the major-axis FWHM " + fwhmMajor + ": swap them and add 90° to the angle");
        }
    }

    /** @return a round Gaussian of the given FWHM in pixels */
    public static GaussianPsf ofFwhm(double fwhm) {
        return new GaussianPsf(fwhm, fwhm, 0);
    }

    /** @return a round Gaussian of the given σ in pixels */
    public static GaussianPsf ofSigma(double sigma) {
        Grids.positive("Gaussian sigma", sigma, "pixels");
        return ofFwhm(sigma * FWHM_PER_SIGMA);
    }

    /**
     * An elliptical Gaussian from its major-axis FWHM and its ellipticity {@code e = 1 − b/a}
     * (minor over major axis; common practice, no source).
     *
     * @param fwhmMajor   major-axis FWHM, pixels
     * @param ellipticity {@code 1 − fwhmMinor/fwhmMajor}, in [0, 1)
     * @param angleDeg    position angle of the major axis
     * @return the model
     */
    public static GaussianPsf ofFwhmEllipticity(double fwhmMajor, double ellipticity, double angleDeg) {
        checkEllipticity(ellipticity);
        return new GaussianPsf(fwhmMajor, fwhmMajor * (1 - ellipticity), angleDeg);
    }

    static void checkEllipticity(double e) {
        if (!(e >= 0 && e < 1)) {
            throw new IllegalArgumentException("ellipticity " + e
                    + " must be in [0, 1): it is 1 − minor/major axis, 0 for a round PSF");
        }
    }

    /** @return σ along the major axis, pixels */
    public double sigmaMajor() {
        return fwhmMajor / FWHM_PER_SIGMA;
    }

    /** @return σ along the minor axis, pixels */
    public double sigmaMinor() {
        return fwhmMinor / FWHM_PER_SIGMA;
    }

    /** @return {@code 1 − fwhmMinor/fwhmMajor} */
    public double ellipticity() {
        return 1 - fwhmMinor / fwhmMajor;
    }

    /** @return this PSF with another major-axis FWHM, keeping the axis ratio */
    public GaussianPsf withFwhm(double fwhm) {
        return new GaussianPsf(fwhm, fwhm * fwhmMinor / fwhmMajor, angleDeg);
    }

    /** @return this PSF with another angle */
    public GaussianPsf withAngle(double deg) {
        return new GaussianPsf(fwhmMajor, fwhmMinor, deg);
    }

    @Override
    public double value(double x, double y) {
        return shape().value(x, y);
    }

    /** The quadratic form and norm, computed once per render rather than per sample. */
    private EllipticalProfile shape() {
        double sa = sigmaMajor();
        double sb = sigmaMinor();
        return new EllipticalProfile(angleDeg, sa, sb, 1 / (2 * Math.PI * sa * sb),
                q -> Math.exp(-0.5 * q));
    }

    @Override
    public java.util.function.DoubleBinaryOperator evaluator() {
        return shape()::value;
    }

    @Override
    public Image renderOversampled(int size, int oversample, double dx, double dy) {
        return shape().renderOversampled(size, oversample, dx, dy);
    }

    @Override
    public String description() {
        return fwhmMinor == fwhmMajor
                ? String.format(java.util.Locale.ROOT, "Gaussian, FWHM %s px", Psfs.num(fwhmMajor))
                : String.format(java.util.Locale.ROOT, "Gaussian, FWHM %s x %s px at %s deg",
                        Psfs.num(fwhmMajor), Psfs.num(fwhmMinor), Psfs.num(angleDeg));
    }

    @Override
    public String family() {
        return "gaussian";
    }

    @Override
    public List<PsfParameter> parameters() {
        return List.of(
                PsfParameter.of("PSFMODEL", "gaussian", "PSF model family"),
                PsfParameter.of("PSFFWHMA", fwhmMajor, "[px] model FWHM along the major axis"),
                PsfParameter.of("PSFFWHMB", fwhmMinor, "[px] model FWHM along the minor axis"),
                PsfParameter.of("PSFANGLE", angleDeg, "[deg] major axis angle from +x towards +y"));
    }
}
