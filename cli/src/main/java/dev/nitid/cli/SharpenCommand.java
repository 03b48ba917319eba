package dev.nitid.cli;

import dev.nitid.fits.FitsException;
import dev.nitid.image.AsinhStretch;
import dev.nitid.image.Image;
import dev.nitid.psf.PsfFigures;
import dev.nitid.psf.PsfModel;
import dev.nitid.quality.ObservedQuality;
import dev.nitid.quality.QualityReport;
import dev.nitid.quality.QualitySettings;
import dev.nitid.quality.StarSite;
import dev.nitid.stars.MeasureSettings;
import dev.nitid.stars.PlateScale;
import dev.nitid.stars.PsfSource;
import dev.nitid.stars.StarMeasurement;
import dev.nitid.stars.StarMeasurer;
import java.awt.image.BufferedImage;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import javax.imageio.ImageIO;
import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.FitsImage;
import dev.nitid.fits.FitsReader;
import dev.nitid.fits.ReadOptions;
import dev.nitid.fits.FitsWriter;
import dev.nitid.fits.WriteOptions;
import dev.nitid.fits.WriteReport;
import dev.nitid.restore.EdgeHandling;
import dev.nitid.restore.Method;
import dev.nitid.restore.PlaneReport;
import dev.nitid.restore.ProgressListener;
import dev.nitid.restore.RestorationResult;
import dev.nitid.restore.RestoreSettings;
import dev.nitid.restore.Restorers;
import dev.nitid.restore.StarProtection;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code nitid sharpen IN.fits --psf PSF.fits -o OUT.fits}: restores detail by deconvolution with a given PSF.
 * Parses, builds {@link RestoreSettings}, calls {@link Restorers}, writes the result with the input header
 * plus HISTORY and parameter cards.
 */
@Command(name = "sharpen", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Restores detail in an image by deconvolution with its PSF (Richardson-Lucy with a light "
                + "total-variation regulariser and vector-extrapolation acceleration by default, with protection against dark rings around bright stars "
                + "and an automatic stop when the residual reaches the noise), then prints what changed: star FWHM "
                + "before and after, the worst dark ring, sky noise before and after, star flux kept.",
            "",
            "The PSF comes from --psf FILE, from the model options of 'nitid psf' (--model ...), or, with "
                + "neither, is measured from the image's own stars.",
            "",
            "Deconvolved images are for viewing and morphology, not for photometry or astrometry, unless the "
                + "restoration has been validated for that purpose. The input is never written.",
            ""},
        footerHeading = "%nOutput:%n",
        footer = {"The output keeps the input header and adds HISTORY cards and these parameter cards:",
            "  NTDMETH  method, NTDITER iterations run, NTDSTOP why it stopped, NTDEDGE edge handling,",
            "  NTDGUARD star protection, NTDPSF PSF file name."})
public final class SharpenCommand implements Callable<Integer> {
    /**
     * Float planes of the image's size the command holds at its peak: input, output, the restorer's
     * buffers and the figures' masks (measured with the accelerated default, which keeps one more frame-sized
     * buffer than plain TV-RL: 831–844 MB resident for a 24-megapixel plane of 96 MB, about 8.7 planes). The
     * reader refuses, with memory advice, an image this many copies of which exceed the heap.
     */
    static final int WORKING_COPIES = 9;

    /** The preview's faint-region crop looks for smooth light this many sky σ above the sky. */
    static final double FAINT_SIGMA = 4;

    /** The method names the command accepts. */
    enum MethodName {
        /** Richardson-Lucy with total-variation regularisation, the default. */
        rl,
        /** Wiener filter, one pass. */
        wiener
    }

    /** Edge handling names. */
    enum EdgeName {
        /** mirrored edges (default). */
        reflect,
        /** restore on a larger domain than the frame (Bertero and Boccacci 2005). */
        extended,
        /** circular. */
        periodic,
        /** dark outside. */
        zero
    }

    /** Star protection names. */
    enum GuardName {
        /** annulus means kept above the local sky (default). */
        rings,
        /** every pixel kept above the local sky. */
        pixels,
        /** no protection. */
        none
    }

    @Spec
    CommandSpec spec;

    @Mixin
    CommonOptions common;

    @Parameters(index = "0", paramLabel = "IN.fits", description = "The image to sharpen (one plane or a colour cube).")
    Path input;

    /** The saturation level from the option or the header, read once right after the input. */
    private OptionalDouble headerSaturation = OptionalDouble.empty();

    @Option(names = "--psf", paramLabel = "PSF.fits",
            description = "The PSF: one plane for all image planes, or a cube with one PSF per plane. Its centre is "
                    + "pixel (floor(w/2), floor(h/2)); it is normalised to unit sum. Default: measured from the "
                    + "image's stars, or built from the model options below.")
    Path psfFile;

    @Mixin
    PsfOptions model;

    @Option(names = "--psf-size", paramLabel = "PX",
            description = "With the model options: side of the PSF stamp in pixels, odd (default: wide enough for "
                    + "the model's wings).")
    Integer psfSize;

    @Option(names = {"-o", "--output"}, paramLabel = "OUT.fits",
            description = "Where to write the result (float32). Default: IN-sharp.fits next to the input.")
    Path output;

    @Option(names = "--preview", paramLabel = "OUT.png",
            description = "Also draw the input and the result side by side on the same asinh stretch, with magnified "
                    + "crops of bright stars and of a faint region.")
    Path preview;

    @Option(names = "--report", paramLabel = "OUT.json",
            description = "Also write every figure of the summary and every parameter as JSON.")
    Path report;

    @Option(names = "--method", paramLabel = "rl|wiener", description = "rl (default) or wiener.")
    MethodName method = MethodName.rl;

    @Option(names = "--iterations", paramLabel = "N",
            description = "Run exactly N Richardson-Lucy iterations. Default: stop automatically when the residual "
                    + "reaches the noise (at most " + dev.nitid.restore.Stopping.ACCELERATED_CAP + ").")
    Integer iterations;

    @Option(names = "--overwrite", description = "Replace OUT.fits if it exists.")
    boolean overwrite;

    @Option(names = "--saturation", paramLabel = "LEVEL",
            description = "Pixels at or above LEVEL are ignored and filled by the restoration. Default: the "
                    + "header's SATURATE card, else the ceiling of an integer data type.")
    Double saturation;

    @Option(names = "--edges", paramLabel = "MODE", description = "Edge handling: reflect (default), extended, periodic or zero.")
    EdgeName edges = EdgeName.reflect;

    @Option(names = "--star-guard", paramLabel = "KIND",
            description = "Protection against dark rings around bright stars: rings (default), pixels or none.")
    GuardName guard = GuardName.rings;

    @Override
    public Integer call() {
        return Failures.run(spec, common, () -> {
            long start = System.nanoTime();
            Stages stages = new Stages();
            if (iterations != null && iterations < 1) {
                throw new IllegalArgumentException("--iterations is " + iterations
                        + ", but at least 1 iteration is needed (give a positive count or leave it out)");
            }
            if (saturation != null && !(saturation > 0)) {
                throw new IllegalArgumentException("--saturation is " + saturation
                        + ", but a saturation level must be a positive number (or leave it out)");
            }
            if (psfFile != null && model.given()) {
                throw new IllegalArgumentException("--psf and --model both give a PSF (use one of them)");
            }
            Path out = output != null ? output : defaultOutput(input);
            checkSideOutput(preview);
            checkSideOutput(report);
            FitsImage in = FitsReader.read(input, new ReadOptions(-1, WORKING_COPIES));
            headerSaturation = saturation != null ? OptionalDouble.of(saturation) : HeaderNumbers.saturation(input, in);
            Optional<PlateScale> headerScale = model.focalLength != null && model.pixelSize != null
                    ? Optional.empty() : HeaderNumbers.plateScale(input, in, "--focal-length with --pixel-size");
            stages.mark("read");
            RestoreSettings s = settings(in);
            PsfChoice psf = psf(in);
            stages.mark("psf");
            Image luminanceIn = StarMeasurer.luminance(in.image());
            StarMeasurement stars = psf.measurement() != null ? psf.measurement()
                    : StarMeasurer.measure(luminanceIn, measureSettings(s));
            double satLevel = Double.isInfinite(s.saturation()) ? Double.NaN : s.saturation();
            ObservedQuality check = ObservedQuality.of(luminanceIn, stars, satLevel, QualitySettings.defaults(),
                    s.threads());
            stages.mark("stars for the figures");

            PrintWriter err = spec.commandLine().getErr();
            ProgressLine progress = ProgressLine.create(err, System.console() != null, common,
                    iterations != null ? iterations : s.stopping().maxIterations());
            long restoreStart = System.nanoTime();
            RestorationResult r = Restorers.create(s).restore(in.image(), psf.image(), progress, () -> false);
            progress.finish();
            double restoreSeconds = (System.nanoTime() - restoreStart) / 1e9;
            stages.mark("restore");
            QualityReport f = check.evaluate(StarMeasurer.luminance(r.image()));
            stages.mark("figures");

            Optional<PlateScale> scale = model.focalLength != null && model.pixelSize != null
                    ? Optional.of(PlateScale.fromOptics(model.pixelSize, model.focalLength, 1,
                            "--focal-length and --pixel-size"))
                    : headerScale;
            FitsHeader h = header(in.header(), s, r, psf, f);
            WriteReport wr = FitsWriter.write(out, r.image(), h,
                    WriteOptions.defaults().withOverwrite(overwrite).withProtectedInputs(protectedInputs()));
            stages.mark("write");
            if (preview != null) {
                writePreview(in.image(), r.image(), check);
                stages.mark("preview");
            }
            double seconds = (System.nanoTime() - start) / 1e9;
            Summary sum = new Summary(in, psf, s, r, f, scale, seconds, restoreSeconds, wr.file(), stages);
            if (report != null) {
                writeReport(sum);
            }
            if (!common.quiet()) {
                PrintWriter o = spec.commandLine().getOut();
                o.print(sum.text());
                o.flush();
            }
            return ExitCode.OK;
        });
    }

    /** Where the PSF came from, the PSF itself, and the star measurement if one was made for it. */
    record PsfChoice(Image image, String source, StarMeasurement measurement) {
    }

    private PsfChoice psf(FitsImage in) throws FitsException {
        if (psfFile != null) {
            FitsImage p = FitsReader.read(psfFile);
            if (p.image().planes() != 1 && p.image().planes() != in.image().planes()) {
                throw new IllegalArgumentException(psfFile + " has " + p.image().planes() + " planes but "
                        + input + " has " + in.image().planes()
                        + " (give one PSF for all planes or one PSF per plane)");
            }
            return new PsfChoice(p.image(), "file " + psfFile.getFileName(), null);
        }
        if (model.given()) {
            PsfModel m = model.toModel();
            return new PsfChoice(m.render(model.side(psfSize, "--psf-size"), model.oversample(), 0, 0),
                    "model " + m.description(), null);
        }
        StarMeasurement m = StarMeasurer.measure(in, measureSettings(settings(in)));
        if (!m.enoughStars() || m.psf() == null) {
            throw new FitsException(FitsException.Kind.BAD_DATA, input, in.hdu(), null,
                    "found only " + m.stars().size() + " usable stars among " + m.detections().size()
                            + " detections, too few to measure the PSF (give --psf FILE, or the PSF model options "
                            + "such as --model moffat --fwhm PX)");
        }
        String kind = m.psfSource() == PsfSource.EMPIRICAL ? "stacked star images"
                : "fitted " + m.bestShape().name().toLowerCase(Locale.ROOT) + " profile";
        return new PsfChoice(m.psf(), "measured from " + m.stars().size() + " stars (" + kind + ")", m);
    }

    private MeasureSettings measureSettings(RestoreSettings s) {
        MeasureSettings ms = MeasureSettings.defaults().withThreads(s.threads());
        return Double.isFinite(s.saturation()) ? ms.withSaturation(s.saturation()) : ms;
    }

    /** {@code IN-sharp.fits} beside the input, with the FITS or gzip extension replaced. */
    static Path defaultOutput(Path in) {
        String name = in.getFileName().toString();
        String base = name.replaceFirst("(?i)\\.(fits|fit|fts)(\\.gz)?$", "");
        if (base.equals(name)) {
            base = name.replaceFirst("(?i)\\.gz$", "");
        }
        Path dir = in.toAbsolutePath().getParent();
        return dir.resolve(base + "-sharp.fits");
    }

    private Path[] protectedInputs() {
        return psfFile != null ? new Path[] {input, psfFile} : new Path[] {input};
    }

    private void checkSideOutput(Path p) throws FitsException {
        if (p == null) {
            return;
        }
        if (Files.exists(p) && !overwrite) {
            throw new FitsException(FitsException.Kind.OUTPUT_EXISTS, p, -1, null,
                    "already exists (give --overwrite to replace it, or choose another name)");
        }
        for (Path in : protectedInputs()) {
            if (Files.exists(p) && sameFile(p, in)) {
                throw new FitsException(FitsException.Kind.CANNOT_CREATE, p, -1, null,
                        "is an input file (choose another output name)");
            }
        }
    }

    private static boolean sameFile(Path a, Path b) {
        try {
            return Files.isSameFile(a, b);
        } catch (IOException e) {
            return a.toAbsolutePath().normalize().equals(b.toAbsolutePath().normalize());
        }
    }

    private void writePreview(Image before, Image after, ObservedQuality check) throws FitsException {
        Image lum = StarMeasurer.luminance(before);
        AsinhStretch stretch = AsinhStretch.forSky(lum.stats(0));
        List<int[]> crops = new ArrayList<>();
        for (StarSite st : check.fwhmStars().subList(0, Math.min(3, check.fwhmStars().size()))) {
            crops.add(new int[] {(int) Math.round(st.x()), (int) Math.round(st.y())});
        }
        StarSite faint = check.faintRegion(FAINT_SIGMA, ComparisonPreview.CROP);
        crops.add(new int[] {(int) faint.x(), (int) faint.y()});
        BufferedImage img = ComparisonPreview.draw(before, after, stretch, crops,
                "nitid sharpen " + input.getFileName() + "  (left: input, right: restored, same stretch)");
        try {
            writePng(img, preview);
        } catch (IOException e) {
            throw new FitsException(FitsException.Kind.WRITE_FAILED, preview, -1, null,
                    "could not be written: " + e.getMessage() + " (check the folder and free space)");
        }
    }

    /** Writes a PNG through a temporary file in the same folder, so no partial file is left. */
    static void writePng(BufferedImage img, Path target) throws IOException {
        Path dir = target.toAbsolutePath().getParent();
        Files.createDirectories(dir);
        Path tmp = Files.createTempFile(dir, ".nitid-", ".png.tmp");
        try {
            if (!ImageIO.write(img, "png", tmp.toFile())) {
                throw new IOException("no PNG writer in this Java runtime");
            }
            Files.move(tmp, target, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } finally {
            Files.deleteIfExists(tmp);
        }
    }

    private void writeReport(Summary sum) throws FitsException {
        try {
            Path dir = report.toAbsolutePath().getParent();
            Files.createDirectories(dir);
            Path tmp = Files.createTempFile(dir, ".nitid-", ".json.tmp");
            try {
                Files.writeString(tmp, sum.json().toString() + System.lineSeparator(), StandardCharsets.UTF_8);
                Files.move(tmp, report, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
            } finally {
                Files.deleteIfExists(tmp);
            }
        } catch (IOException e) {
            throw new FitsException(FitsException.Kind.WRITE_FAILED, report, -1, null,
                    "could not be written: " + e.getMessage() + " (check the folder and free space)");
        }
    }

    /** Wall-clock time of each stage of the command, in the order they ran. */
    static final class Stages {
        private final java.util.LinkedHashMap<String, Double> seconds = new java.util.LinkedHashMap<>();
        private long last = System.nanoTime();

        void mark(String name) {
            long now = System.nanoTime();
            seconds.merge(name, (now - last) / 1e9, Double::sum);
            last = now;
        }

        String text() {
            StringBuilder b = new StringBuilder();
            seconds.forEach((k, v) -> {
                if (v >= 0.05) {
                    b.append(b.length() == 0 ? "" : ", ").append(k).append(' ')
                            .append(String.format(Locale.ROOT, "%.1f", v));
                }
            });
            return b.toString();
        }

        Json json() {
            Json j = Json.object();
            seconds.forEach(j::put);
            return j;
        }
    }

    /** Everything the summary and the JSON report say. */
    private record Summary(FitsImage in, PsfChoice psf, RestoreSettings s, RestorationResult r,
                           QualityReport f, Optional<PlateScale> scale, double seconds,
                           double restoreSeconds, Path written, Stages stages) {

        double psfFwhm() {
            return PsfFigures.of(psf.image().planeImage(0)).fwhmPx();
        }

        String text() {
            StringBuilder b = new StringBuilder();
            Image img = in.image();
            line(b, "input", in.image().width() + " x " + img.height() + " pixels, " + img.planes()
                    + (img.planes() == 1 ? " plane" : " planes"));
            double fw = psfFwhm();
            line(b, "PSF", psf.source() + ", FWHM " + fmt(fw, 2) + " px"
                    + scale.map(p -> " = " + fmt(p.toArcsec(fw), 2) + " arcsec").orElse(" (arcsec unknown: no pixel scale)"));
            PlaneReport p0 = r.planes().get(0);
            line(b, "method", methodText(s.method()) + ", " + p0.iterations() + " iterations ("
                    + stopText(p0) + ")" + (r.planes().size() > 1 ? " on plane 0" : ""));
            if (f.fwhm().stars() > 0) {
                line(b, "star FWHM", fmt(f.fwhm().inputFwhm(), 2) + " -> " + fmt(f.fwhm().outputFwhm(), 2) + " px (ratio "
                        + fmt(f.fwhmRatio(), 2) + ", median of " + f.fwhm().stars() + " stars)");
                line(b, "dark rings", "worst " + fmt(f.ringDepth(), 2) + " sigma of the input sky noise ("
                        + f.ring().stars() + " brightest stars; 0 = none)");
                line(b, "flux kept", fmt(100 * f.flux().ratio(), 1) + " % (median aperture ratio, " + f.flux().stars()
                        + " stars)");
            } else {
                line(b, "star FWHM", "not measured: no isolated unsaturated star above "
                        + fmt(QualitySettings.defaults().minPeakSigma(), 0) + " sigma");
            }
            line(b, "sky noise", fmt(f.noiseIn(), 3) + " -> " + fmt(f.noiseOut(), 3) + " (ratio "
                    + fmt(f.noiseRatio(), 2) + ")");
            line(b, "time", fmt(seconds, 1) + " s on " + s.threads() + " threads (" + stages.text() + ")");
            line(b, "wrote", written.toString());
            return b.toString();
        }

        Json json() {
            PlaneReport p0 = r.planes().get(0);
            List<Object> planes = new ArrayList<>();
            for (PlaneReport pr : r.planes()) {
                planes.add(Json.object().put("iterations", pr.iterations()).put("stop_reason", pr.stopReason().name())
                        .put("masked_pixels", pr.maskedPixels()).put("protected_stars", pr.protectedStars()));
            }
            double fw = psfFwhm();
            return Json.object()
                    .put("tool", "nitid " + NitidCommand.toolVersion())
                    .put("input", in.image().width() + "x" + in.image().height() + "x" + in.image().planes())
                    .put("output", written.toString())
                    .put("psf_source", psf.source())
                    .put("psf_fwhm_px", fw)
                    .put("psf_fwhm_arcsec", scale.map(p -> (Object) p.toArcsec(fw)).orElse(null))
                    .put("pixel_scale_arcsec", scale.map(p -> (Object) p.arcsecPerPixel()).orElse(null))
                    .put("method", s.method().name())
                    .put("edges", s.edges().name())
                    .put("star_protection", s.protection().guard().name())
                    .put("iterations", p0.iterations())
                    .put("stop_reason", p0.stopReason().name())
                    .put("planes", planes)
                    .put("star_fwhm_in_px", f.fwhm().inputFwhm())
                    .put("star_fwhm_out_px", f.fwhm().outputFwhm())
                    .put("fwhm_ratio", f.fwhmRatio())
                    .put("fwhm_stars", f.fwhm().stars())
                    .put("ring_depth_sigma", f.ringDepth())
                    .put("ring_stars", f.ring().stars())
                    .put("sky_noise_in", f.noiseIn())
                    .put("sky_noise_out", f.noiseOut())
                    .put("noise_ratio", f.noiseRatio())
                    .put("flux_ratio", f.flux().ratio())
                    .put("flux_stars", f.flux().stars())
                    .put("threads", s.threads())
                    .put("seconds", seconds)
                    .put("restore_seconds", restoreSeconds)
                    .put("stage_seconds", stages.json());
        }

        private static void line(StringBuilder b, String label, String text) {
            b.append(String.format(Locale.ROOT, "%-11s%s%n", label, text));
        }

        private static String fmt(double v, int decimals) {
            return Double.isFinite(v) ? String.format(Locale.ROOT, "%." + decimals + "f", v) : "n/a";
        }
    }

    private RestoreSettings settings(FitsImage in) {
        RestoreSettings s = RestoreSettings.defaults().withThreads(common.threads());
        if (method == MethodName.wiener) {
            s = s.withMethod(Method.WIENER);
        }
        if (iterations != null) {
            s = s.withIterations(iterations);
        }
        // the likelihood costs a logarithm per pixel; only --verbose shows it
        s = s.withStopping(s.stopping().withRecordLikelihood(common.verbose()));
        s = s.withEdges(switch (edges) {
            case reflect -> EdgeHandling.REFLECT;
            case extended -> EdgeHandling.EXTENDED_DOMAIN;
            case periodic -> EdgeHandling.PERIODIC;
            case zero -> EdgeHandling.ZERO;
        });
        s = s.withProtection(switch (guard) {
            case rings -> StarProtection.ringFloor();
            case pixels -> StarProtection.skyFloor();
            case none -> StarProtection.none();
        });
        OptionalDouble level = headerSaturation;
        if (level.isPresent()) {
            s = s.withSaturation(level.getAsDouble());
        }
        return s;
    }

    private FitsHeader header(FitsHeader h, RestoreSettings s, RestorationResult r, PsfChoice psf,
                              QualityReport f) {
        PlaneReport p0 = r.planes().get(0);
        String psfName = psf.source();
        h = h.withHistory("nitid " + NitidCommand.toolVersion() + " sharpen: " + methodText(s.method()) + ", "
                + p0.iterations() + " iterations (" + stopText(p0) + "), edges " + edges + ", star guard " + guard
                + ", PSF " + psfName);
        h = h.withHistory(String.format(Locale.ROOT, "star FWHM %.3f -> %.3f px, worst dark ring %.2f sigma, "
                + "sky noise ratio %.3f, flux ratio %.4f", f.fwhm().inputFwhm(), f.fwhm().outputFwhm(), f.ringDepth(), f.noiseRatio(),
                f.flux().ratio()));
        h = h.withHistory("Deconvolved image: for viewing and morphology, not photometry unless validated.");
        h = h.with("NTDMETH", s.method().name(), "restoration method");
        h = h.with("NTDITER", (long) p0.iterations(), "iterations run (plane 0)");
        h = h.with("NTDSTOP", p0.stopReason().name(), "why the iterations stopped");
        h = h.with("NTDEDGE", s.edges().name(), "edge handling");
        h = h.with("NTDGUARD", s.protection().guard().name(), "star-ringing protection");
        h = h.with("NTDPSF", psfName.length() > 60 ? psfName.substring(0, 60) : psfName, "PSF source");
        return h;
    }

    private static String methodText(Method m) {
        return switch (m) {
            case ACCELERATED_RL -> "accelerated Richardson-Lucy";
            case RICHARDSON_LUCY -> "Richardson-Lucy";
            case TV_RL -> "TV-regularised Richardson-Lucy";
            case ACCELERATED_TV_RL -> "accelerated TV-regularised Richardson-Lucy";
            case DAMPED_RL -> "damped Richardson-Lucy";
            case WIENER -> "Wiener filter";
            case TIKHONOV -> "Tikhonov filter";
        };
    }

    private static String stopText(PlaneReport p) {
        return switch (p.stopReason()) {
            case FIXED_COUNT_REACHED -> "as requested";
            case CHI_SQUARE_REACHED -> "residual reached the noise";
            case LIKELIHOOD_CONVERGED -> "likelihood stopped improving";
            case STALLED -> "estimate stopped changing";
            case ITERATION_CAP -> "iteration cap reached";
            case CANCELLED -> "cancelled";
            case SINGLE_PASS -> "single pass";
        };
    }
}
