package dev.nitid.psf;

import dev.nitid.image.Image;
import dev.nitid.psf.internal.Grids;
import java.util.List;

/**
 * An elliptical Moffat PSF of unit integral (Moffat 1969, A&amp;A 3, 455; normalised form from
 * Trujillo et al. 2001, MNRAS 328, 977, eqs. 1–2):
 * <pre>  P(u, v) = (β − 1) / (π αa αb) · [1 + u²/αa² + v²/αb²]^(−β),
 *  FWHM = 2α √(2^(1/β) − 1)</pre>
 * with {@code (u, v)} the offsets along the major axis (at {@code angleDeg} from +x towards +y) and the
 * minor axis. β must exceed 1 for the flux to be finite; β = 4.765 describes Kolmogorov seeing
 * (Trujillo et al. 2001).
 *
 * @param fwhmMajor FWHM along the major axis, pixels, &gt; 0
 * @param fwhmMinor FWHM along the minor axis, pixels, 0 &lt; fwhmMinor ≤ fwhmMajor
 * @param beta      power index β &gt; 1
 * @param angleDeg  position angle of the major axis, degrees from +x towards +y
 */
public record MoffatPsf(double fwhmMajor, double fwhmMinor, double beta, double angleDeg) implements AnalyticPsf {

    /** β of a Moffat profile that matches Kolmogorov seeing (Trujillo et al. 2001, MNRAS 328, 977). */
    public static final double KOLMOGOROV_BETA = 4.765;

    /** Validates the widths, β and the angle. */
    public MoffatPsf {
        Grids.positive("Moffat FWHM (major axis)", fwhmMajor, "pixels");
        Grids.positive("Moffat FWHM (minor axis)", fwhmMinor, "pixels");
        Grids.finite("Moffat angle", angleDeg);
        if (!(beta > 1) || !Double.isFinite(beta)) {
            throw new IllegalArgumentException("Moffat beta " + beta
                    + " must be a finite number above 1 (the flux diverges otherwise); 2.5 to 4.765 is typical");
        }
        if (fwhmMinor > fwhmMajor) {
            throw new IllegalArgumentException("Moffat minor-axis FWHM " + fwhmMinor
                    + " exceeds the major-axis FWHM " + fwhmMajor + ": swap them and add 90° to the angle");
        }
    }

    /** @return a round Moffat of the given FWHM (pixels) and β */
    public static MoffatPsf ofFwhm(double fwhm, double beta) {
        return new MoffatPsf(fwhm, fwhm, beta, 0);
    }

    /** @return a round Moffat of core width α (pixels) and β */
    public static MoffatPsf ofAlpha(double alpha, double beta) {
        Grids.positive("Moffat alpha", alpha, "pixels");
        if (!(beta > 1) || !Double.isFinite(beta)) {
            throw new IllegalArgumentException("Moffat beta " + beta + " must be a finite number above 1");
        }
        return ofFwhm(fwhmFromAlpha(alpha, beta), beta);
    }

    /**
     * An elliptical Moffat from its major-axis FWHM and ellipticity {@code e = 1 − b/a}.
     *
     * @param fwhmMajor   major-axis FWHM, pixels
     * @param ellipticity {@code 1 − fwhmMinor/fwhmMajor}, in [0, 1)
     * @param beta        power index &gt; 1
     * @param angleDeg    position angle of the major axis
     * @return the model
     */
    public static MoffatPsf ofFwhmEllipticity(double fwhmMajor, double ellipticity, double beta, double angleDeg) {
        GaussianPsf.checkEllipticity(ellipticity);
        return new MoffatPsf(fwhmMajor, fwhmMajor * (1 - ellipticity), beta, angleDeg);
    }

    /** @return FWHM = 2α√(2^(1/β) − 1) (Trujillo et al. 2001, eq. 2) */
    public static double fwhmFromAlpha(double alpha, double beta) {
        return 2 * alpha * Math.sqrt(Math.pow(2, 1 / beta) - 1);
    }

    /** @return α = FWHM / (2√(2^(1/β) − 1)) */
    public static double alphaFromFwhm(double fwhm, double beta) {
        return fwhm / (2 * Math.sqrt(Math.pow(2, 1 / beta) - 1));
    }

    /** @return α along the major axis, pixels */
    public double alphaMajor() {
        return alphaFromFwhm(fwhmMajor, beta);
    }

    /** @return α along the minor axis, pixels */
    public double alphaMinor() {
        return alphaFromFwhm(fwhmMinor, beta);
    }

    /** @return {@code 1 − fwhmMinor/fwhmMajor} */
    public double ellipticity() {
        return 1 - fwhmMinor / fwhmMajor;
    }

    /** @return this PSF with another β, keeping the FWHMs */
    public MoffatPsf withBeta(double b) {
        return new MoffatPsf(fwhmMajor, fwhmMinor, b, angleDeg);
    }

    /** @return this PSF with another major-axis FWHM, keeping the axis ratio */
    public MoffatPsf withFwhm(double fwhm) {
        return new MoffatPsf(fwhm, fwhm * fwhmMinor / fwhmMajor, beta, angleDeg);
    }

    /** @return this PSF with another angle */
    public MoffatPsf withAngle(double deg) {
        return new MoffatPsf(fwhmMajor, fwhmMinor, beta, deg);
    }

    @Override
    public double value(double x, double y) {
        return shape().value(x, y);
    }

    /** The quadratic form and norm, computed once per render rather than per sample. */
    private EllipticalProfile shape() {
        double aa = alphaMajor();
        double ab = alphaMinor();
        double b = beta;
        return new EllipticalProfile(angleDeg, aa, ab, (b - 1) / (Math.PI * aa * ab), q -> Math.pow(1 + q, -b));
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
        return (fwhmMinor == fwhmMajor
                ? String.format(java.util.Locale.ROOT, "Moffat, FWHM %s px", Psfs.num(fwhmMajor))
                : String.format(java.util.Locale.ROOT, "Moffat, FWHM %s x %s px at %s deg",
                        Psfs.num(fwhmMajor), Psfs.num(fwhmMinor), Psfs.num(angleDeg)))
                + String.format(java.util.Locale.ROOT, ", beta %s", Psfs.num(beta));
    }

    @Override
    public String family() {
        return "moffat";
    }

    @Override
    public List<PsfParameter> parameters() {
        return List.of(
                PsfParameter.of("PSFMODEL", "moffat", "PSF model family"),
                PsfParameter.of("PSFFWHMA", fwhmMajor, "[px] model FWHM along the major axis"),
                PsfParameter.of("PSFFWHMB", fwhmMinor, "[px] model FWHM along the minor axis"),
                PsfParameter.of("PSFBETA", beta, "Moffat power index beta"),
                PsfParameter.of("PSFALPHA", alphaMajor(), "[px] Moffat core width alpha, major axis"),
                PsfParameter.of("PSFANGLE", angleDeg, "[deg] major axis angle from +x towards +y"));
    }
}
