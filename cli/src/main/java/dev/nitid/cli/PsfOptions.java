package dev.nitid.cli;

import dev.nitid.psf.ConvolvedPsf;
import dev.nitid.psf.GaussianPsf;
import dev.nitid.psf.MoffatPsf;
import dev.nitid.psf.PsfModel;
import dev.nitid.psf.Psfs;
import dev.nitid.psf.Seeing;
import dev.nitid.psf.Spectrum;
import java.util.Locale;
import picocli.CommandLine.Option;

/**
 * The PSF model options shared by {@code nitid psf}, {@code nitid sharpen} and {@code nitid simulate}
 * (mix in with {@code @Mixin PsfOptions psf;}): the telescope options of {@link OpticsOptions} plus the
 * model family, the analytic shapes, seeing, jitter and oversampling. Parsing only: {@link #toModel()}
 * builds the core model and every rule about which options go together lives there, in one place.
 */
public final class PsfOptions extends OpticsOptions {

    /** PSF model families selectable with {@code --model}. */
    public enum Family {
        /** Elliptical Gaussian: {@code --fwhm}, optional {@code --ellipticity}, {@code --angle}. */
        gaussian,
        /** Elliptical Moffat: {@code --fwhm}, {@code --beta}, optional {@code --ellipticity}, {@code --angle}. */
        moffat,
        /** Diffraction from the pupil: {@code --aperture}, {@code --focal-length}, {@code --pixel-size}, … */
        airy
    }

    /** Default Moffat β when {@code --beta} is not given: 4.765, Kolmogorov seeing (Trujillo et al. 2001). */
    static final double DEFAULT_BETA = MoffatPsf.KOLMOGOROV_BETA;
    /** Largest automatic stamp side, pixels. */
    static final int MAX_AUTO_SIZE = 1025;

    @Option(names = "--model", paramLabel = "MODEL",
            description = "PSF model: ${COMPLETION-CANDIDATES}.")
    Family model;

    @Option(names = "--fwhm", paramLabel = "PX",
            description = "FWHM in pixels (gaussian, moffat); the major-axis FWHM when --ellipticity is given.")
    Double fwhm;

    @Option(names = "--beta", paramLabel = "B",
            description = "Moffat power index beta > 1 (default 4.765, Kolmogorov seeing).")
    Double beta;

    @Option(names = "--ellipticity", paramLabel = "E",
            description = "1 - minor/major axis, 0 <= E < 1 (gaussian, moffat; default 0).")
    Double ellipticity;

    @Option(names = "--angle", paramLabel = "DEG",
            description = "Major-axis angle in degrees from +x towards +y (gaussian, moffat; default 0).")
    Double angle;

    @Option(names = "--seeing", paramLabel = "ARCSEC",
            description = "Seeing FWHM in arcsec convolved onto the model (needs --focal-length and --pixel-size).")
    Double seeing;

    @Option(names = "--seeing-profile", paramLabel = "SHAPE",
            description = "Seeing profile: moffat (beta 4.765, default) or gaussian.")
    String seeingProfile;

    @Option(names = "--jitter", paramLabel = "PX", description = "Tracking jitter, Gaussian sigma in pixels.")
    Double jitter;

    @Option(names = "--oversample", paramLabel = "N",
            description = "Sub-pixels per pixel per axis for pixel integration; 1 = point sampling (default 5).")
    Integer oversample;

    /** @return true if {@code --model} was given */
    public boolean given() {
        return model != null;
    }

    /** @return the model family, or null */
    public Family family() {
        return model;
    }

    /** @return the oversampling, {@link PsfModel#DEFAULT_OVERSAMPLE} unless given */
    public int oversample() {
        int os = oversample == null ? PsfModel.DEFAULT_OVERSAMPLE : oversample;
        if (os < 1 || os > PsfModel.MAX_OVERSAMPLE) {
            throw new IllegalArgumentException("--oversample is " + os + ", but it must be between 1 (point sampling) and "
                    + PsfModel.MAX_OVERSAMPLE + " (5 is plenty for most PSFs)");
        }
        return os;
    }

    /**
     * Builds the model the options describe.
     *
     * @return the model, with seeing and jitter convolved on when given
     * @throws IllegalArgumentException naming the option that is missing, out of range or does not apply
     */
    public PsfModel toModel() {
        if (model == null) {
            throw new IllegalArgumentException("no PSF model given (add --model gaussian, moffat or airy)");
        }
        PsfModel base = switch (model) {
            case gaussian -> {
                refuse("--beta", beta, "moffat");
                refuseOptics();
                double f = need("--fwhm", fwhm, "the FWHM in pixels, e.g. --fwhm 3");
                yield GaussianPsf.ofFwhmEllipticity(f, orZero(ellipticity), orZero(angle));
            }
            case moffat -> {
                refuseOptics();
                double f = need("--fwhm", fwhm, "the FWHM in pixels, e.g. --fwhm 3");
                double b = beta == null ? DEFAULT_BETA : beta;
                yield MoffatPsf.ofFwhmEllipticity(f, orZero(ellipticity), b, orZero(angle));
            }
            case airy -> {
                refuse("--fwhm", fwhm, "gaussian or moffat");
                refuse("--beta", beta, "moffat");
                refuse("--ellipticity", ellipticity, "gaussian or moffat");
                refuse("--angle", angle, "gaussian or moffat (use --vane-angle for the spider)");
                double d = need("--aperture", aperture, "the aperture diameter in mm, e.g. --aperture 200");
                double f = need("--focal-length", focalLength, "the focal length in mm, e.g. --focal-length 1000");
                double p = need("--pixel-size", pixelSize, "the pixel pitch in micrometres, e.g. --pixel-size 3.76");
                yield pupil(d, f, p);
            }
        };
        double scale = Double.NaN;
        if (focalLength != null && pixelSize != null) {
            scale = Psfs.plateScaleArcsec(pixelSize, focalLength);
        }
        Seeing s = null;
        if (seeing != null) {
            if (Double.isNaN(scale)) {
                throw new IllegalArgumentException("--seeing is in arcsec, so it needs the plate scale: "
                        + "add --focal-length (mm) and --pixel-size (micrometres)");
            }
            String prof = seeingProfile == null ? "moffat" : seeingProfile.toLowerCase(Locale.ROOT);
            s = switch (prof) {
                case "moffat" -> Seeing.moffat(seeing);
                case "gaussian" -> Seeing.gaussian(seeing);
                default -> throw new IllegalArgumentException("--seeing-profile is '" + seeingProfile
                        + "' (use moffat or gaussian)");
            };
        } else if (seeingProfile != null) {
            throw new IllegalArgumentException("--seeing-profile needs --seeing (the seeing FWHM in arcsec)");
        }
        PsfModel blurred = Psfs.withSeeingAndJitter(base, s, jitter == null ? 0 : jitter, scale);
        return blurred instanceof ConvolvedPsf c ? c.withThreads(threads()) : blurred;
    }

    /**
     * The PSF side a command uses: the one its own option asked for, checked to be odd, or
     * {@link #autoSize()}.
     *
     * @param requested  the value of the command's size option, or null when not given
     * @param optionName that option's name, for the error message
     * @return an odd side in pixels
     * @throws IllegalArgumentException if the requested side is not a positive odd number
     */
    public int side(Integer requested, String optionName) {
        if (requested == null) {
            return autoSize();
        }
        if (requested < 1 || requested % 2 == 0) {
            throw new IllegalArgumentException(optionName + " is " + requested
                    + ", but the PSF side must be odd so its centre is a pixel (try " + Math.max(1, requested | 1) + ")");
        }
        return requested;
    }

    /**
     * A stamp side that holds the model's wings: ±3 FWHM for a Gaussian, ±8 FWHM for a Moffat, ±12 λ/D for a
     * pupil model at the longest wavelength, widened by the seeing (4 FWHM) and the jitter (3σ), odd, at
     * most {@value #MAX_AUTO_SIZE} (project choice). The stamp side itself is not an option here, because
     * commands name it differently ({@code nitid psf --size}, {@code nitid simulate --psf-size}).
     *
     * @return an odd side in pixels
     * @throws IllegalArgumentException if the model options are incomplete (see {@link #toModel()})
     */
    public int autoSize() {
        toModel(); // validates the options the size depends on
        double half = switch (model) {
            case gaussian -> 3 * fwhm;
            case moffat -> 8 * fwhm;
            case airy -> {
                Spectrum sp = spectrum();
                yield 12 * sp.longestNm() * 1e-3 * focalLength / aperture / pixelSize;
            }
        };
        if (seeing != null && focalLength != null && pixelSize != null) {
            half += 4 * seeing / Psfs.plateScaleArcsec(pixelSize, focalLength);
        }
        if (jitter != null) {
            half += 3 * jitter;
        }
        int h = (int) Math.min(MAX_AUTO_SIZE / 2, Math.max(3, Math.ceil(half)));
        return 2 * h + 1;
    }

    private void refuseOptics() {
        refuse("--aperture", aperture, "airy");
        refuse("--obstruction", obstruction, "airy");
        refuse("--vanes", vanes, "airy");
        refuse("--vane-width", vaneWidth, "airy");
        refuse("--vane-angle", vaneAngle, "airy");
        refuse("--wavelength", wavelength, "airy");
        refuse("--band", band, "airy");
        refuse("--zernike", zernike, "airy");
    }

    private void refuse(String name, Object value, String models) {
        if (value != null) {
            throw new IllegalArgumentException(name + " does not apply to --model " + model
                    + " (it is for --model " + models + "; remove it or change the model)");
        }
    }

    private double need(String name, Double value, String what) {
        if (value == null) {
            throw new IllegalArgumentException("--model " + model + " needs " + name + " (" + what + ")");
        }
        return value;
    }

    private static double orZero(Double v) {
        return v == null ? 0 : v;
    }
}
