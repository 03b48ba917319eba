package dev.nitid.cli;

import dev.nitid.fits.FitsException;
import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.FitsReader;
import dev.nitid.fits.FitsWriter;
import dev.nitid.fits.WriteOptions;
import dev.nitid.fits.WriteReport;
import dev.nitid.image.Image;
import dev.nitid.psf.GaussianPsf;
import dev.nitid.psf.MoffatPsf;
import dev.nitid.psf.PsfHeader;
import dev.nitid.psf.PsfModel;
import dev.nitid.psf.Psfs;
import dev.nitid.synth.DetectorSettings;
import dev.nitid.synth.ExtendedSettings;
import dev.nitid.synth.FieldGenerator;
import dev.nitid.synth.FieldPsf;
import dev.nitid.synth.FieldSettings;
import dev.nitid.synth.FluxLaw;
import dev.nitid.synth.ImagePsf;
import dev.nitid.synth.SyntheticModelPsf;
import dev.nitid.synth.Placement;
import dev.nitid.synth.RenderedModelPsf;
import dev.nitid.synth.StarSettings;
import dev.nitid.synth.SyntheticField;
import dev.nitid.synth.TruthCatalogue;
import dev.nitid.synth.TruthStar;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code nitid simulate -o FIELD.fits [options]}: a synthetic star field with its exact truth, for testing
 * restorers and other software. Writes {@code FIELD.fits} (observed), {@code FIELD-truth.fits},
 * {@code FIELD-stars.csv} and {@code FIELD-psf.fits}, every FITS header carrying the parameters.
 */
@Command(name = "simulate", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Makes a synthetic star field with known truth: the observed image (PSF-blurred, with sky, "
            + "Poisson and read noise averaged over a stack of frames), the truth image (unblurred star fluxes "
            + "plus extended structure), the star list as CSV (x, y, flux, peak, saturated; x and y 0-based, "
            + "pixel centres at whole numbers) and the PSF. The same options and --seed give the same files."},
        footer = {"%nThe PSF options are those of 'nitid psf' (default: --model moffat --fwhm 3 --beta 4.765).",
            "%nExample:%n  nitid simulate -o field.fits --image-size 512 --stars 300 --nebula 200 --filaments 10 \\",
            "      --model moffat --fwhm 4 --beta 3 --sky 200 --gain 1.5 --read-noise 6 --frames 4 --seed 7"})
public final class SimulateCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    CommonOptions common;

    /** The PSF model options of {@code nitid psf} (--model, --fwhm, --beta, --aperture, --size, ...). */
    @Mixin
    PsfOptions psfOptions;

    @Option(names = {"-o", "--output"}, required = true, paramLabel = "FILE",
            description = "The observed image to write (FITS). The truth, star list and PSF go next to it, named "
                    + "FILE-truth.fits, FILE-stars.csv and FILE-psf.fits.")
    Path output;

    @Option(names = "--overwrite", description = "Replace existing output files.")
    boolean overwrite;

    @Option(names = "--seed", paramLabel = "N", description = "Random seed (default: ${DEFAULT-VALUE}).")
    long seed = 1;

    @Option(names = "--psf-size", paramLabel = "PX",
            description = "Side of the PSF stamp in pixels, odd (default: wide enough for the model's wings).")
    Integer psfSize;

    @Option(names = "--image-size", paramLabel = "W[xH]", description = "Field size in pixels, e.g. 1024 or 1200x800 (default: ${DEFAULT-VALUE}).")
    String size = "1024";

    @Option(names = "--bitpix", paramLabel = "16|-32",
            description = "Data type of the observed image: 16 (unsigned 16-bit through BZERO, values rounded and "
                    + "clipped to 0..65535) or -32 (float, default). Truth and PSF are always -32.")
    int bitpix = -32;

    @Option(names = "--pixel-scale", paramLabel = "ARCSEC",
            description = "Pixel scale to record in the headers as a linear WCS (CDELT1/2 in degrees), so that "
                    + "other tools can report sizes in arcseconds (default: from --focal-length and --pixel-size "
                    + "when both are given, else none).")
    double pixelScale = Double.NaN;

    @Option(names = "--stars", paramLabel = "N", description = "Number of stars (default: ${DEFAULT-VALUE}).")
    int stars = 200;

    @Option(names = "--flux-law", paramLabel = "power|magnitudes",
            description = "Star brightness distribution: 'power' (counts brighter than F fall as F^-slope, many faint "
                    + "stars) or 'magnitudes' (as many stars per magnitude at every brightness). Default: ${DEFAULT-VALUE}.")
    String fluxLaw = "power";

    @Option(names = "--faintest", paramLabel = "ADU", description = "Total flux of the faintest star (default: ${DEFAULT-VALUE}).")
    double faintest = 100;

    @Option(names = "--brightest", paramLabel = "ADU", description = "Total flux of the brightest star (default: ${DEFAULT-VALUE}).")
    double brightest = 1e6;

    @Option(names = "--slope", paramLabel = "G", description = "Slope of the power law (default: ${DEFAULT-VALUE}).")
    double slope = 1.0;

    @Option(names = "--grid", description = "Put the stars on a regular grid instead of at random positions.")
    boolean grid;

    @Option(names = "--margin", paramLabel = "PX", description = "Keep stars this far from the edges (default: ${DEFAULT-VALUE}).")
    double margin = 8;

    @Option(names = "--nebula", paramLabel = "ADU", description = "Peak brightness of a smooth nebula (default: none).")
    double nebula = 0;

    @Option(names = "--filaments", paramLabel = "N", description = "Number of fine filaments (default: none).")
    int filaments = 0;

    @Option(names = "--filament-peak", paramLabel = "ADU", description = "Brightness across the brightest filament (default: ${DEFAULT-VALUE}).")
    double filamentPeak = 50;

    @Option(names = "--filament-width", paramLabel = "PX", description = "Width (FWHM) of the filaments (default: ${DEFAULT-VALUE}).")
    double filamentWidth = 1.2;

    @Option(names = "--galaxies", paramLabel = "N", description = "Number of small galaxy-like blobs (default: none).")
    int galaxies = 0;

    @Option(names = "--galaxy-peak", paramLabel = "ADU", description = "Central brightness of the brightest galaxy (default: ${DEFAULT-VALUE}).")
    double galaxyPeak = 200;

    @Option(names = "--fwhm-gradient", paramLabel = "GX,GY", split = ",", arity = "1",
            description = "Linear change of the FWHM across the field, as a fraction over the full width and height, "
                    + "e.g. 0.2,0 makes stars 20%% wider at the right edge than at the left (round --model gaussian "
                    + "or moffat only; default: none).")
    double[] gradient = {0, 0};

    @Option(names = "--psf-file", paramLabel = "FILE",
            description = "Use this PSF image (FITS, square, odd side) instead of --model; stars then sit on pixel centres.")
    Path psfFile;

    @Option(names = "--sky", paramLabel = "ADU", description = "Sky level per frame (default: ${DEFAULT-VALUE}).")
    double sky = 100;

    @Option(names = "--gain", paramLabel = "E/ADU", description = "Detector gain in electrons per ADU (default: ${DEFAULT-VALUE}).")
    double gain = 1;

    @Option(names = "--read-noise", paramLabel = "E", description = "Read noise per frame in electrons (default: ${DEFAULT-VALUE}).")
    double readNoise = 5;

    @Option(names = "--frames", paramLabel = "N", description = "Frames averaged into the stack (default: ${DEFAULT-VALUE}).")
    int frames = 1;

    @Option(names = "--saturation", paramLabel = "ADU", description = "Level where a frame clips (default: none).")
    double saturation = Double.POSITIVE_INFINITY;

    @Override
    public Integer call() {
        return Failures.run(spec, common, this::simulate);
    }

    private Integer simulate() throws FitsException, IOException {
        if (bitpix != 16 && bitpix != -32) {
            throw new IllegalArgumentException("--bitpix is " + bitpix + ", but only 16 and -32 are written (choose one)");
        }
        if (gradient.length != 2) {
            throw new IllegalArgumentException("--fwhm-gradient needs two numbers GX,GY (for example 0.2,0)");
        }
        if (!Double.isNaN(pixelScale) && !(pixelScale > 0 && Double.isFinite(pixelScale))) {
            throw new IllegalArgumentException("--pixel-scale is " + pixelScale + ", but it must be a positive number of arcseconds");
        }
        if (Double.isNaN(pixelScale) && psfOptions.focalLength != null && psfOptions.pixelSize != null) {
            pixelScale = Psfs.plateScaleArcsec(psfOptions.pixelSize, psfOptions.focalLength);
        }
        int[] wh = parseSize(size);
        FieldPsf psf = psf();
        FieldSettings settings = new FieldSettings(wh[0], wh[1], seed,
                new StarSettings(stars, law(), faintest, brightest, slope, grid ? Placement.GRID : Placement.RANDOM, margin),
                new ExtendedSettings(nebula, filaments, filamentPeak, filamentWidth, galaxies, galaxyPeak),
                psf, new DetectorSettings(sky, gain, readNoise, frames, saturation));

        String base = output.getFileName().toString().replaceFirst("(?i)\\.(fits|fit|fts)$", "");
        Path truthPath = output.resolveSibling(base + "-truth.fits");
        Path csvPath = output.resolveSibling(base + "-stars.csv");
        Path psfPath = output.resolveSibling(base + "-psf.fits");
        List<Path> protectedInputs = psfFile == null ? List.of() : List.of(psfFile);
        for (Path p : List.of(output, truthPath, csvPath, psfPath)) {
            if (protectedInputs.stream().anyMatch(q -> samePath(p, q))) {
                throw new FitsException(FitsException.Kind.CANNOT_CREATE, p, -1, null,
                        "this output would replace the input PSF file (choose another output name)");
            }
            if (!overwrite && Files.exists(p)) {
                throw new FitsException(FitsException.Kind.OUTPUT_EXISTS, p, -1, null,
                        "already exists (add --overwrite to replace it, or choose another output name)");
            }
        }

        SyntheticField f = FieldGenerator.generate(settings);
        FitsHeader header = header(settings);
        WriteOptions opts = WriteOptions.defaults().withOverwrite(overwrite)
                .withProtectedInputs(protectedInputs.toArray(Path[]::new));
        WriteReport obs = FitsWriter.write(output, f.observed(),
                header.with("SIMROLE", "observed", "noisy stacked image"), opts.withBitpix(bitpix));
        FitsWriter.write(truthPath, f.truth(),
                header.with("SIMROLE", "truth", "unblurred stars and extended structure, no sky").with("BUNIT", "adu", ""),
                opts.withBitpix(-32));
        FitsWriter.write(psfPath, f.psf(),
                header.with("SIMROLE", "psf", "unit-sum PSF at the field centre"), opts.withBitpix(-32));
        Files.writeString(csvPath, TruthCatalogue.toCsv(f.catalogue()), StandardCharsets.UTF_8);

        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (obs.clippedPixels() > 0) {
            err.printf(Locale.ROOT, "nitid: %s: %d pixels fell outside 0..65535 and were clipped (use --bitpix -32 to keep them)%n",
                    output, obs.clippedPixels());
        }
        if (!common.quiet()) {
            long sat = f.catalogue().stream().filter(TruthStar::saturated).count();
            out.printf(Locale.ROOT, "wrote %s (observed, BITPIX %d), %s, %s, %s%n", output, bitpix, truthPath, csvPath, psfPath);
            out.printf(Locale.ROOT, "%dx%d pixels, %d stars (%d saturated), PSF: %s; sky noise %.4g ADU%n",
                    wh[0], wh[1], f.catalogue().size(), sat, psf.describe(), settings.detector().skySigma());
        }
        out.flush();
        err.flush();
        return ExitCode.OK;
    }

    private static boolean samePath(Path a, Path b) {
        return a.toAbsolutePath().normalize().equals(b.toAbsolutePath().normalize());
    }

    private FluxLaw law() {
        return switch (fluxLaw.toLowerCase(Locale.ROOT)) {
            case "power" -> FluxLaw.POWER_LAW;
            case "magnitudes" -> FluxLaw.UNIFORM_MAGNITUDE;
            default -> throw new IllegalArgumentException("--flux-law is '" + fluxLaw
                    + "', but it must be 'power' or 'magnitudes'");
        };
    }

    /** FWHM of the PSF when no --model is given, pixels (a typical well-sampled seeing disc). */
    static final double DEFAULT_FWHM = 3.0;

    /**
     * The field's PSF: a PSF file; a round Gaussian/Moffat with a FWHM gradient; an analytic model drawn at
     * each star's sub-pixel phase; or, for pupil models and models with seeing or jitter (expensive to
     * render), the model rendered once with stars on pixel centres.
     */
    private FieldPsf psf() throws FitsException {
        boolean varies = gradient[0] != 0 || gradient[1] != 0;
        if (psfFile != null) {
            if (psfOptions.given() || varies) {
                throw new IllegalArgumentException("--psf-file gives the PSF itself: leave out --model and --fwhm-gradient");
            }
            Image k = FitsReader.read(psfFile).image();
            return ImagePsf.of(k, psfFile.getFileName().toString());
        }
        if (!psfOptions.given()) {
            return SyntheticModelPsf.moffat(DEFAULT_FWHM, PsfOptions.DEFAULT_BETA).withGradient(gradient[0], gradient[1]);
        }
        PsfModel model = psfOptions.toModel();
        int side = psfOptions.side(psfSize, "--psf-size");
        int os = psfOptions.oversample();
        boolean analytic = model instanceof MoffatPsf || model instanceof GaussianPsf;
        if (varies) {
            boolean round = model instanceof MoffatPsf m ? m.fwhmMajor() == m.fwhmMinor()
                    : model instanceof GaussianPsf g && g.fwhmMajor() == g.fwhmMinor();
            if (!analytic || !round) {
                throw new IllegalArgumentException("--fwhm-gradient works with a round --model gaussian or moffat "
                        + "without --seeing or --jitter (leave it out, or drop --ellipticity)");
            }
            return model instanceof MoffatPsf m
                    ? new SyntheticModelPsf(SyntheticModelPsf.Shape.MOFFAT, m.fwhmMajor(), m.beta(), side, os, gradient[0], gradient[1])
                    : new SyntheticModelPsf(SyntheticModelPsf.Shape.GAUSSIAN, ((GaussianPsf) model).fwhmMajor(), 2.5, side, os,
                            gradient[0], gradient[1]);
        }
        if (analytic) {
            return new RenderedModelPsf(model, side, os);
        }
        return ImagePsf.of(model.render(side, os, 0, 0), PsfCommand.title(model));
    }

    /** The model's own header cards, as {@code nitid psf} writes them. */
    private FitsHeader modelCards(FitsHeader h) {
        if (psfFile != null || !psfOptions.given()) {
            return h;
        }
        h = PsfHeader.withModel(h, psfOptions.toModel());
        return h.with("SUBPIXEL", (long) psfOptions.oversample(), "sub-pixels per pixel per axis (1 = point sampled)");
    }

    static int[] parseSize(String s) {
        String[] parts = s.toLowerCase(Locale.ROOT).split("x", -1);
        try {
            if (parts.length == 1) {
                int n = Integer.parseInt(parts[0].trim());
                return checkSize(n, n, s);
            }
            if (parts.length == 2) {
                return checkSize(Integer.parseInt(parts[0].trim()), Integer.parseInt(parts[1].trim()), s);
            }
        } catch (NumberFormatException e) {
            // fall through to the message below
        }
        throw new IllegalArgumentException("--image-size is '" + s + "', but it must be W or WxH in pixels (for example 1024 or 1200x800)");
    }

    private static int[] checkSize(int w, int h, String s) {
        if (w < 1 || h < 1) {
            throw new IllegalArgumentException("--image-size is '" + s + "', but both sides must be at least 1 pixel");
        }
        return new int[] {w, h};
    }

    private FitsHeader header(FieldSettings s) {
        StarSettings st = s.stars();
        ExtendedSettings e = s.extended();
        DetectorSettings d = s.detector();
        FitsHeader h = FitsHeader.empty()
                .with("BUNIT", "adu", "stacked frame, analogue-to-digital units")
                .with("SIMSEED", s.seed(), "random seed of the synthetic field")
                .with("NSTARS", (long) st.count(), "stars in the field")
                .with("FLUXLAW", st.law().name(), "star flux distribution")
                .with("FLUXMIN", st.minFlux(), "[adu] faintest star's total flux")
                .with("FLUXMAX", st.maxFlux(), "[adu] brightest star's total flux")
                .with("FLUXSLOP", st.slope(), "power-law slope of N(>F)")
                .with("STARGRID", st.placement() == Placement.GRID, "stars on a regular grid")
                .with("MARGIN", st.margin(), "[px] star-free border")
                .with("NEBPEAK", e.nebulaPeak(), "[adu] smooth nebula peak")
                .with("NFILAMNT", (long) e.filaments(), "fine filaments")
                .with("FILPEAK", e.filamentPeak(), "[adu] brightest filament")
                .with("FILWIDTH", e.filamentWidth(), "[px] filament FWHM")
                .with("NGALAXY", (long) e.galaxies(), "galaxy-like blobs")
                .with("GALPEAK", e.galaxyPeak(), "[adu] brightest galaxy centre")
                .with("PSFDESC", s.psf().describe(), "PSF of the field")
                .with("PSFSIZE", (long) s.psf().size(), "[px] PSF stamp side")
                .with("SKYLEVEL", d.sky(), "[adu] sky per frame")
                .with("GAIN", d.gain(), "[e-/adu] detector gain")
                .with("RDNOISE", d.readNoise(), "[e-] read noise per frame")
                .with("NCOMBINE", (long) d.frames(), "frames averaged into the stack")
                .with("SKYSIGMA", d.skySigma(), "[adu] expected sky noise of the stack");
        h = modelCards(h);
        if (s.psf() instanceof SyntheticModelPsf m) {
            h = h.with("PSFFWHM", m.fwhm(), "[px] PSF FWHM at the field centre")
                    .with("PSFGRADX", m.gradientX(), "FWHM change across the width")
                    .with("PSFGRADY", m.gradientY(), "FWHM change across the height");
            if (m.shape() == SyntheticModelPsf.Shape.MOFFAT) {
                h = h.with("PSFBETA", m.beta(), "Moffat power index");
            }
        }
        if (!Double.isNaN(pixelScale)) {
            // Linear WCS (Greisen & Calabretta 2002, A&A 395, 1061): x grows to the west, hence CDELT1 < 0.
            // The field is invented and has no sky position, so the axes are plain linear offsets from the
            // field centre (CTYPEi not in the 4-3 projection form, §2.1.1) rather than a projection whose
            // reference point would have to be made up; written complete so that checkers find every
            // WCS keyword of both axes.
            h = h.with("CTYPE1", "LINEAR", "offset from the field centre along x (no sky position)")
                    .with("CTYPE2", "LINEAR", "offset from the field centre along y (no sky position)")
                    .with("CRVAL1", 0.0, "[deg] offset at the reference pixel")
                    .with("CRVAL2", 0.0, "[deg] offset at the reference pixel")
                    .with("CRPIX1", (s.width() + 1) / 2.0, "reference pixel: field centre")
                    .with("CRPIX2", (s.height() + 1) / 2.0, "reference pixel: field centre")
                    .with("CDELT1", -pixelScale / 3600, "[deg] pixel scale along x")
                    .with("CDELT2", pixelScale / 3600, "[deg] pixel scale along y")
                    .with("CUNIT1", "deg", "")
                    .with("CUNIT2", "deg", "");
        }
        if (Double.isFinite(d.saturation())) {
            h = h.with("SATURATE", d.saturation(), "[adu] level where a frame clips");
        }
        return h.withHistory("Synthetic field made by nitid simulate " + NitidCommand.toolVersion()
                + "; invented scene, not an observation.");
    }
}
