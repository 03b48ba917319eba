package dev.nitid.psf;

import dev.nitid.image.Image;
import dev.nitid.psf.internal.Grids;
import dev.nitid.psf.internal.PupilEngine;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;

/**
 * The diffraction PSF of a telescope: a circular aperture of diameter D with a central obstruction of
 * linear ratio ε, N radial spider vanes, and optional Zernike aberrations, computed as |FFT(pupil)|²
 * (Fraunhofer diffraction: Goodman, Introduction to Fourier Optics, ch. 4) at each wavelength of a
 * {@link Spectrum} and sampled on the detector through the focal length f and the pixel size p.
 *
 * <p>For ε = 0, no vanes and no aberration, this is the Airy pattern {@code I/I0 = [2J1(v)/v]²},
 * {@code v = πDθ/λ} (Airy 1835; Born &amp; Wolf, Principles of Optics, §8.5.2); with ε &gt; 0 it is the
 * annular pattern {@code [2J1(v)/v − ε²·2J1(εv)/(εv)]² / (1 − ε²)²} (Schroeder, Astronomical Optics, §10.2).
 *
 * <p>Plate scale: {@code 206.264806·p[µm]/f[mm]} arcsec per pixel (206264.806 arcsec per radian).
 * Zernike coefficients are waves RMS over the full circular pupil at the band centre
 * ({@link Spectrum#centreNm()}): the optical path error is fixed, so the phase at λ scales as λ_centre/λ.
 * Vanes run radially from the centre to the rim, the first at {@code vaneAngleDeg} from +x towards +y
 * and the others every 360°/N; a '+' spider of two full-diameter bars is 4 vanes.
 *
 * <p>Accuracy is set by {@code pupilSamples}, the fewest samples across the pupil diameter
 * (default {@value #DEFAULT_PUPIL_SAMPLES}); see {@code docs/psf.md} for measured errors.
 *
 * @param apertureMm    aperture diameter D, mm
 * @param obstruction   central obstruction ratio ε (obstruction diameter / D), 0 ≤ ε &lt; 1
 * @param vanes         number of spider vanes, 0 … 16
 * @param vaneWidthMm   vane width, mm (ignored without vanes)
 * @param vaneAngleDeg  angle of the first vane, degrees
 * @param focalLengthMm focal length f, mm
 * @param pixelSizeUm   detector pixel pitch p, µm
 * @param spectrum      wavelengths and photon weights
 * @param zernike       aberrations, waves RMS (Noll 4–11)
 * @param pupilSamples  fewest samples across the pupil diameter, 32 … 4096
 * @param threads       worker threads for rendering, ≥ 1 (how the work is run, not what the PSF is: renders are
 *                      identical bit for bit whatever the count; {@link #parameters()} leaves it out, but
 *                      as a record component it takes part in {@code equals}: compare {@code withThreads(1)}
 *                      copies to compare optics)
 */
public record PupilPsf(double apertureMm, double obstruction, int vanes, double vaneWidthMm, double vaneAngleDeg,
                       double focalLengthMm, double pixelSizeUm, Spectrum spectrum, Zernike zernike,
                       int pupilSamples, int threads) implements PsfModel {

    /** Arcseconds per radian, 648000/π. */
    public static final double ARCSEC_PER_RADIAN = 648000 / Math.PI;

    /**
     * Default fewest pupil samples across the diameter. Edges are grey, so 128 samples keep the pattern within
     * 2e-4 of the peak of the analytic (annular) Airy pattern out to 10 λ/D (measured; docs/psf.md).
     */
    public static final int DEFAULT_PUPIL_SAMPLES = 128;

    /** Validates every setting. */
    public PupilPsf {
        Grids.positive("aperture", apertureMm, "mm");
        Grids.positive("focal length", focalLengthMm, "mm");
        Grids.positive("pixel size", pixelSizeUm, "µm");
        if (!(obstruction >= 0 && obstruction < 1)) {
            throw new IllegalArgumentException("obstruction " + obstruction
                    + " must be a ratio in [0, 1): obstruction diameter over aperture diameter");
        }
        if (vanes < 0 || vanes > 16) {
            throw new IllegalArgumentException("vanes " + vanes + " must be between 0 and 16");
        }
        Grids.finite("vane angle", vaneAngleDeg);
        if (vanes > 0) {
            Grids.positive("vane width", vaneWidthMm, "mm (or use 0 vanes)");
            if (vaneWidthMm >= apertureMm / 2) {
                throw new IllegalArgumentException("vane width " + vaneWidthMm + " mm is not below the aperture radius "
                        + apertureMm / 2 + " mm: give the width of one vane in mm");
            }
        } else if (!(vaneWidthMm >= 0) || !Double.isFinite(vaneWidthMm)) {
            throw new IllegalArgumentException("vane width " + vaneWidthMm + " mm must be ≥ 0");
        }
        if (spectrum == null) {
            throw new IllegalArgumentException("spectrum is null: use Spectrum.monochromatic(550) or Spectrum.band(500, 600)");
        }
        if (zernike == null) {
            zernike = Zernike.none();
        }
        if (pupilSamples < 32 || pupilSamples > 4096) {
            throw new IllegalArgumentException("pupil samples " + pupilSamples + " must be between 32 and 4096");
        }
        if (threads < 1) {
            throw new IllegalArgumentException("threads " + threads + " must be at least 1 (use "
                    + "Runtime.getRuntime().availableProcessors() for all of them)");
        }
    }

    /**
     * A pupil rendered with all available processors ({@link Runtime#availableProcessors()}).
     *
     * @param apertureMm    aperture diameter D, mm
     * @param obstruction   central obstruction ratio ε
     * @param vanes         number of spider vanes
     * @param vaneWidthMm   vane width, mm
     * @param vaneAngleDeg  angle of the first vane, degrees
     * @param focalLengthMm focal length f, mm
     * @param pixelSizeUm   detector pixel pitch p, µm
     * @param spectrum      wavelengths and photon weights
     * @param zernike       aberrations, waves RMS (Noll 4–11)
     * @param pupilSamples  fewest samples across the pupil diameter
     */
    public PupilPsf(double apertureMm, double obstruction, int vanes, double vaneWidthMm, double vaneAngleDeg,
                    double focalLengthMm, double pixelSizeUm, Spectrum spectrum, Zernike zernike, int pupilSamples) {
        this(apertureMm, obstruction, vanes, vaneWidthMm, vaneAngleDeg, focalLengthMm, pixelSizeUm, spectrum, zernike,
                pupilSamples, Runtime.getRuntime().availableProcessors());
    }

    /**
     * An unobstructed, unaberrated aperture (the Airy pattern), without vanes.
     *
     * @param apertureMm    D, mm
     * @param focalLengthMm f, mm
     * @param pixelSizeUm   p, µm
     * @param spectrum      wavelengths
     * @return the model
     */
    public static PupilPsf of(double apertureMm, double focalLengthMm, double pixelSizeUm, Spectrum spectrum) {
        return new PupilPsf(apertureMm, 0, 0, 0, 0, focalLengthMm, pixelSizeUm, spectrum, Zernike.none(),
                DEFAULT_PUPIL_SAMPLES);
    }

    /**
     * A pupil whose detector pixel is {@code pixelOverLambdaD} λ/D at the given wavelength: convenient for
     * tests and for reasoning in diffraction units (aperture 100 mm, f = 1000 mm).
     *
     * @param pixelOverLambdaD pixel size in units of λ/D
     * @param wavelengthNm     λ, nm
     * @return the model
     */
    public static PupilPsf ofSampling(double pixelOverLambdaD, double wavelengthNm) {
        Grids.positive("pixel in λ/D", pixelOverLambdaD, "");
        double focal = 1000;
        double aperture = 100;
        double pixelUm = pixelOverLambdaD * wavelengthNm * 1e-3 * focal / aperture;
        return of(aperture, focal, pixelUm, Spectrum.monochromatic(wavelengthNm));
    }

    /** @return this pupil with another central obstruction ratio */
    public PupilPsf withObstruction(double eps) {
        return new PupilPsf(apertureMm, eps, vanes, vaneWidthMm, vaneAngleDeg, focalLengthMm, pixelSizeUm, spectrum,
                zernike, pupilSamples, threads);
    }

    /** @return this pupil with {@code count} vanes of the given width (mm), the first at {@code angleDeg} */
    public PupilPsf withVanes(int count, double widthMm, double angleDeg) {
        return new PupilPsf(apertureMm, obstruction, count, widthMm, angleDeg, focalLengthMm, pixelSizeUm, spectrum,
                zernike, pupilSamples, threads);
    }

    /** @return this pupil with other aberrations */
    public PupilPsf withZernike(Zernike z) {
        return new PupilPsf(apertureMm, obstruction, vanes, vaneWidthMm, vaneAngleDeg, focalLengthMm, pixelSizeUm,
                spectrum, z, pupilSamples, threads);
    }

    /** @return this pupil at other wavelengths */
    public PupilPsf withSpectrum(Spectrum s) {
        return new PupilPsf(apertureMm, obstruction, vanes, vaneWidthMm, vaneAngleDeg, focalLengthMm, pixelSizeUm,
                s, zernike, pupilSamples, threads);
    }

    /** @return this pupil sampled with at least {@code n} samples across its diameter */
    public PupilPsf withPupilSamples(int n) {
        return new PupilPsf(apertureMm, obstruction, vanes, vaneWidthMm, vaneAngleDeg, focalLengthMm, pixelSizeUm,
                spectrum, zernike, n, threads);
    }

    /**
     * @param n worker threads for rendering, ≥ 1 (the render does not depend on it)
     * @return this pupil rendered with {@code n} threads
     */
    public PupilPsf withThreads(int n) {
        return new PupilPsf(apertureMm, obstruction, vanes, vaneWidthMm, vaneAngleDeg, focalLengthMm, pixelSizeUm,
                spectrum, zernike, pupilSamples, n);
    }

    /** @return this pupil on another detector (focal length mm, pixel µm) */
    public PupilPsf withDetector(double focalMm, double pixelUm) {
        return new PupilPsf(apertureMm, obstruction, vanes, vaneWidthMm, vaneAngleDeg, focalMm, pixelUm,
                spectrum, zernike, pupilSamples, threads);
    }

    /** @return plate scale {@code 206.264806·p[µm]/f[mm]}, arcsec per pixel */
    public static double plateScaleArcsec(double pixelSizeUm, double focalLengthMm) {
        return ARCSEC_PER_RADIAN * pixelSizeUm * 1e-3 / focalLengthMm;
    }

    @Override
    public OptionalDouble plateScaleArcsec() {
        return OptionalDouble.of(plateScaleArcsec(pixelSizeUm, focalLengthMm));
    }

    /** @return λ/D on the detector at {@code nm}, in pixels */
    public double lambdaOverDPixels(double nm) {
        return nm * 1e-3 * focalLengthMm / apertureMm / pixelSizeUm;
    }

    /** @return pixel over the Nyquist pixel λ/(2D) at the shortest wavelength; above 1 is under-sampled */
    @Override
    public OptionalDouble pixelOverNyquist() {
        return OptionalDouble.of(2 / lambdaOverDPixels(spectrum.shortestNm()));
    }

    /**
     * Strehl ratio at the Gaussian image point, {@code |Σ t·e^{iφ}|² / (Σt)²} per wavelength, combined over
     * the band with the weights each wavelength's unaberrated peak carries (∝ weight/λ²).
     *
     * @return the Strehl ratio, 1 without aberrations
     */
    @Override
    public OptionalDouble strehl() {
        if (zernike.isNone()) {
            return OptionalDouble.of(1);
        }
        PupilEngine.Aperture ap = aperture();
        double num = 0;
        double den = 0;
        for (int i = 0; i < spectrum.size(); i++) {
            double l = spectrum.wavelength(i);
            double w = spectrum.weight(i) / (l * l);
            num += w * PupilEngine.strehlAtCentre(ap, Math.max(256, pupilSamples), spectrum.centreNm() / l);
            den += w;
        }
        return OptionalDouble.of(num / den);
    }

    PupilEngine.Aperture aperture() {
        return new PupilEngine.Aperture(obstruction, vanes, 2 * vaneWidthMm / apertureMm, vaneAngleDeg,
                zernike.toArray());
    }

    /**
     * Renders the fine grid and reports how it was computed.
     *
     * <p>The samples are normalised to the total flux of the whole pattern (not of the stamp), so their sum is
     * the energy on the stamp and, with {@code oversample = 1}, the centre sample of an unaberrated pupil is
     * {@code Σt·m²/N²}, the open area over N² (Parseval).
     *
     * @param size       stamp side, odd
     * @param oversample sub-pixels per pixel
     * @param dx         offset in x, pixels
     * @param dy         offset in y, pixels
     * @return the fine grid and the FFT grid used
     */
    public Rendering renderDetailed(int size, int oversample, double dx, double dy) {
        Grids.checkRender(size, oversample, dx, dy);
        int nl = spectrum.size();
        double[] s = new double[nl];
        double[] w = new double[nl];
        double[] scale = new double[nl];
        double fineUm = pixelSizeUm / oversample;
        for (int i = 0; i < nl; i++) {
            double l = spectrum.wavelength(i);
            s[i] = fineUm / (l * 1e-3 * focalLengthMm / apertureMm);
            w[i] = spectrum.weight(i);
            scale[i] = spectrum.centreNm() / l;
        }
        int c = size / 2;
        // Fine sample g sits at (g − gc)/k pixels from the centre, gc = c·k + (k − 1)/2 (see Grids.fineOffset).
        double gc = c * (double) oversample + (oversample - 1) / 2.0;
        int gi = (int) Math.floor(gc);
        double frac = gc - gi;
        PupilEngine.Result r = PupilEngine.render(aperture(), s, w, scale, size * oversample,
                frac + oversample * dx, frac + oversample * dy, gi, pupilSamples, threads);
        int n = size * oversample;
        return new Rendering(Image.wrap(n, n, r.fine()), r.fftSize(), r.refine(), r.pupilDiameter(), r.sumT(), r.sumT2());
    }

    @Override
    public Image renderOversampled(int size, int oversample, double dx, double dy) {
        return renderDetailed(size, oversample, dx, dy).fine();
    }

    @Override
    public String description() {
        StringBuilder sb = new StringBuilder(String.format(Locale.ROOT, "diffraction: D %s mm", Psfs.num(apertureMm)));
        if (obstruction > 0) {
            sb.append(String.format(Locale.ROOT, ", obstruction %s", Psfs.num(obstruction)));
        }
        if (vanes > 0) {
            sb.append(String.format(Locale.ROOT, ", %d vanes %s mm", vanes, Psfs.num(vaneWidthMm)));
        }
        sb.append(String.format(Locale.ROOT, ", f %s mm, %s um pixels, ", Psfs.num(focalLengthMm),
                Psfs.num(pixelSizeUm)));
        sb.append(spectrum.size() == 1 ? String.format(Locale.ROOT, "%s nm", Psfs.num(spectrum.wavelength(0)))
                : String.format(Locale.ROOT, "%s-%s nm (%d wavelengths)", Psfs.num(spectrum.edgesNm()[0]), 
                        Psfs.num(spectrum.edgesNm()[1]), spectrum.size()));
        if (!zernike.isNone()) {
            sb.append(", Zernike ").append(zernike);
        }
        return sb.toString();
    }

    @Override
    public String family() {
        return "airy";
    }

    @Override
    public List<PsfParameter> parameters() {
        List<PsfParameter> p = new ArrayList<>();
        p.add(PsfParameter.of("PSFMODEL", "airy", "PSF model family (diffraction from the pupil)"));
        p.add(PsfParameter.of("APERTURE", apertureMm, "[mm] aperture diameter"));
        p.add(PsfParameter.of("OBSTRUCT", obstruction, "central obstruction ratio (diameters)"));
        p.add(PsfParameter.of("VANES", (long) vanes, "number of spider vanes"));
        p.add(PsfParameter.of("VANEWID", vaneWidthMm, "[mm] spider vane width"));
        p.add(PsfParameter.of("VANEANG", vaneAngleDeg, "[deg] first vane angle from +x towards +y"));
        p.add(PsfParameter.of("FOCALLEN", focalLengthMm, "[mm] focal length"));
        p.add(PsfParameter.of("PIXSIZE", pixelSizeUm, "[um] detector pixel pitch"));
        p.add(PsfParameter.of("WAVEMIN", spectrum.shortestNm(), "[nm] shortest wavelength sampled"));
        p.add(PsfParameter.of("WAVEMAX", spectrum.longestNm(), "[nm] longest wavelength sampled"));
        if (spectrum.size() > 1) {
            p.add(PsfParameter.of("BANDLO", spectrum.edgesNm()[0], "[nm] short edge of the band"));
            p.add(PsfParameter.of("BANDHI", spectrum.edgesNm()[1], "[nm] long edge of the band"));
        }
        p.add(PsfParameter.of("NLAMBDA", (long) spectrum.size(), "wavelengths summed, equal photon weights"));
        for (Map.Entry<Integer, Double> e : zernike.nonZero().entrySet()) {
            p.add(PsfParameter.of("ZERN" + e.getKey(), e.getValue(), "[waves RMS] Zernike Noll " + e.getKey()
                    + " at the band centre"));
        }
        p.add(PsfParameter.of("PUPILSMP", (long) pupilSamples, "fewest pupil samples across the diameter"));
        return p;
    }

    /**
     * A rendered fine grid and the grid that produced it.
     *
     * @param fine          the fine samples, flux per sub-pixel of the whole pattern
     * @param fftSize       N, the FFT side
     * @param refine        m, extra refinement (1 unless the sub-pixel is coarser than λ/(2D))
     * @param pupilDiameter samples across the pupil diameter, per wavelength
     * @param pupilSum      Σt, per wavelength
     * @param pupilSumSq    Σt², per wavelength
     */
    public record Rendering(Image fine, int fftSize, int refine, double[] pupilDiameter, double[] pupilSum,
                            double[] pupilSumSq) {
    }
}
