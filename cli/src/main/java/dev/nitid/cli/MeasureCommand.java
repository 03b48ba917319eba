package dev.nitid.cli;

import dev.nitid.fits.FitsException;
import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.FitsImage;
import dev.nitid.fits.FitsReader;
import dev.nitid.fits.FitsWriter;
import dev.nitid.fits.ReadOptions;
import dev.nitid.fits.WriteOptions;
import dev.nitid.psf.PupilPsf;
import dev.nitid.stars.BlurBudget;
import dev.nitid.stars.BlurSplit;
import dev.nitid.stars.FieldMap;
import dev.nitid.stars.MeasureSettings;
import dev.nitid.stars.PlateScale;
import dev.nitid.stars.ProfileSummary;
import dev.nitid.stars.RegionSummary;
import dev.nitid.stars.RejectReason;
import dev.nitid.stars.StarMeasurement;
import dev.nitid.stars.StarMeasurer;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import javax.imageio.ImageIO;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code nitid measure IN.fits [--json] [--psf-out PSF.fits] [--plot MAP.png]}: finds the stars, measures
 * their FWHM, ellipticity and β, maps them across the field and builds the PSF the restorers use.
 */
@Command(name = "measure", mixinStandardHelpOptions = true,
        description = {"Finds the stars of an image and measures them: FWHM (pixels, and arcseconds when the "
                + "plate scale is known), ellipticity, angle and Moffat beta, from elliptical Gaussian and Moffat "
                + "fits. Says how many detections were rejected and why, maps FWHM and ellipticity on a grid of "
                + "regions, and builds the measured PSF (stacked from the stars, or the fitted model).",
            "With --aperture, --focal-length and --pixel-size it also splits the blur into optics, seeing and "
                + "tracking. Colour images are measured on the mean of their planes."})
public final class MeasureCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    CommonOptions common;

    @Parameters(index = "0", paramLabel = "IN", description = "The image (FITS).")
    Path input;

    @Option(names = "--json", description = "Print one JSON object instead of a table.")
    boolean json;

    @Option(names = "--psf-out", paramLabel = "PSF.fits",
            description = "Write the measured PSF (odd size, centred, sum 1) as a 32-bit float FITS file.")
    Path psfOut;

    @Option(names = "--plot", paramLabel = "MAP.png", description = "Draw the field map (PNG).")
    Path plot;

    @Option(names = "--overwrite", description = "Replace existing output files.")
    boolean overwrite;

    @Option(names = "--hdu", paramLabel = "N", description = "HDU to read (default: the first with an image).")
    int hdu = -1;

    @Option(names = "--saturation", paramLabel = "LEVEL",
            description = "Pixel value at which stars saturate. Default: the SATURATE keyword, else the ceiling "
                    + "of the file's integer type; none for float data.")
    Double saturation;

    @Option(names = "--pixel-scale", paramLabel = "ARCSEC",
            description = "Arcseconds per pixel. Default: from the WCS, else from FOCALLEN with the pixel-size keywords.")
    Double pixelScale;

    @Mixin
    OpticsOptions optics;

    @Option(names = "--binning", paramLabel = "N",
            description = "Pixel binning: each image pixel is N x N detector pixels of --pixel-size. Default: 1.")
    int binning = 1;

    @Option(names = "--threshold", paramLabel = "SIGMA",
            description = "Detection threshold in sigma of the filtered image. Default: ${DEFAULT-VALUE}.")
    double threshold = MeasureSettings.defaults().thresholdSigma();

    @Option(names = "--fwhm-guess", paramLabel = "PX",
            description = "FWHM of the detection filter, pixels; a rough guess is enough. Default: ${DEFAULT-VALUE}.")
    double fwhmGuess = MeasureSettings.defaults().detectionFwhm();

    @Option(names = "--grid", paramLabel = "CxR", description = "Field grid, columns x rows. Default: ${DEFAULT-VALUE}.")
    String grid = "3x3";

    @Option(names = "--max-stars", paramLabel = "N", description = "Fit at most N stars, brightest first. Default: ${DEFAULT-VALUE}.")
    int maxStars = MeasureSettings.defaults().maxStars();

    @Override
    public Integer call() {
        return Failures.run(spec, common, () -> {
            MeasureSettings settings = settings();
            PlateScale optionScale = optionScale();
            checkOutput(psfOut);
            checkOutput(plot);
            FitsImage frame = FitsReader.read(input, new ReadOptions(hdu));
            PlateScale scale = optionScale != null ? optionScale : HeaderNumbers.plateScale(input, frame, "--pixel-scale").orElse(null);
            if (saturation == null) {
                OptionalDouble level = HeaderNumbers.saturation(input, frame);
                if (level.isPresent()) {
                    settings = settings.withSaturation(level.getAsDouble());
                }
            }
            StarMeasurement m = StarMeasurer.measure(frame, settings);
            PrintWriter out = spec.commandLine().getOut();
            PrintWriter err = spec.commandLine().getErr();
            if (m.stars().isEmpty()) {
                throw new FitsException(FitsException.Kind.BAD_DATA, input, frame.hdu(), null,
                        "found no usable star among " + m.detections().size() + " detections (rejected: "
                                + rejections(m) + ") (lower --threshold, set --fwhm-guess near the stars' FWHM, "
                                + "or check that the image has unsaturated stars)");
            }
            if (!m.enoughStars() && !common.quiet()) {
                err.println("nitid: " + input + ": only " + m.stars().size()
                        + " usable stars: the figures are uncertain");
            }
            if (psfOut != null) {
                FitsHeader h = FitsHeader.empty()
                        .with("PSFSRC", m.psfSource().name().toLowerCase(Locale.ROOT), "measured PSF: empirical or model")
                        .with("PSFSHAPE", m.bestShape().name().toLowerCase(Locale.ROOT), "best-fitting profile")
                        .with("NSTARS", (long) m.stars().size(), "stars measured")
                        .with("FWHM", m.best().fwhm(), "[px] median FWHM, sqrt(major*minor)")
                        .with("ELLIP", m.best().ellipticity(), "median 1 - minor/major")
                        .withHistory("nitid measure " + input.getFileName() + ": " + m.psfReason());
                FitsWriter.write(psfOut, m.psf(), h, WriteOptions.defaults().withOverwrite(overwrite)
                        .withProtectedInputs(input));
            }
            if (plot != null) {
                writePng(FieldMap.draw(m, scale, input.getFileName().toString()));
            }
            BlurSplit split = split(m, settings);
            if (json) {
                out.println(json(m, scale, split));
            } else {
                table(out, m, scale, split);
            }
            out.flush();
            return ExitCode.OK;
        });
    }

    /** The optics/seeing/tracking split when the optics are given, else null. */
    private BlurSplit split(StarMeasurement m, MeasureSettings settings) {
        if (optics.aperture == null) {
            return null;
        }
        if (optics.focalLength == null || optics.pixelSize == null) {
            throw new IllegalArgumentException("--aperture needs --focal-length and --pixel-size to model the optics "
                    + "(give all three)");
        }
        PupilPsf pupil = optics.pupil(optics.aperture, optics.focalLength, optics.pixelSize * binning);
        double scale = PlateScale.fromOptics(optics.pixelSize, optics.focalLength, binning, "optics").arcsecPerPixel();
        int radius = Math.max(settings.stampRadius(), (int) Math.ceil(3 * m.best().fwhmMajor()));
        return BlurBudget.split(m.best(), pupil, scale, settings.sampling(), radius);
    }

    private MeasureSettings settings() {
        String[] g = grid.toLowerCase(Locale.ROOT).split("x");
        int cols;
        int rows;
        try {
            cols = Integer.parseInt(g[0].trim());
            rows = g.length == 2 ? Integer.parseInt(g[1].trim()) : -1;
        } catch (NumberFormatException e) {
            cols = -1;
            rows = -1;
        }
        if (g.length != 2 || cols < 1 || rows < 1) {
            throw new IllegalArgumentException("--grid is '" + grid + "' (give columns x rows, e.g. 3x3)");
        }
        if (optics.aperture == null && optics.givenApertureOption() != null) {
            throw new IllegalArgumentException(optics.givenApertureOption() + " describes the optics of the blur split, "
                    + "which needs --aperture (add --aperture with --focal-length and --pixel-size, or remove it)");
        }
        if (binning < 1) {
            throw new IllegalArgumentException("--binning is " + binning + " (give 1 or more)");
        }
        if (saturation != null && !Double.isFinite(saturation)) {
            throw new IllegalArgumentException("--saturation is " + saturation + " (give a pixel value)");
        }
        MeasureSettings s = MeasureSettings.defaults().withThresholdSigma(threshold).withDetectionFwhm(fwhmGuess)
                .withGrid(cols, rows).withMaxStars(maxStars).withThreads(common.threads());
        return saturation != null ? s.withSaturation(saturation) : s;
    }

    private PlateScale optionScale() {
        if (pixelScale != null) {
            return new PlateScale(pixelScale, "--pixel-scale");
        }
        Double focalLength = optics.focalLength;
        Double pixelSize = optics.pixelSize;
        if (focalLength != null || pixelSize != null) {
            if (focalLength == null || pixelSize == null) {
                throw new IllegalArgumentException("--focal-length and --pixel-size go together (give both, or "
                        + "--pixel-scale)");
            }
            return PlateScale.fromOptics(pixelSize, focalLength, binning, "--focal-length and --pixel-size");
        }
        return null;
    }

    private void checkOutput(Path p) throws FitsException {
        if (p == null) {
            return;
        }
        if (p.toAbsolutePath().normalize().equals(input.toAbsolutePath().normalize())) {
            throw new FitsException(FitsException.Kind.CANNOT_CREATE, p, -1, null,
                    "is the input image (choose another output name)");
        }
        if (Files.exists(p) && !overwrite) {
            throw new FitsException(FitsException.Kind.OUTPUT_EXISTS, p, -1, null,
                    "already exists (choose another name or add --overwrite)");
        }
    }

    private void writePng(java.awt.image.BufferedImage img) throws FitsException {
        try {
            if (!ImageIO.write(img, "png", plot.toFile())) {
                throw new IOException("no PNG writer in this Java runtime");
            }
        } catch (IOException e) {
            throw new FitsException(FitsException.Kind.WRITE_FAILED, plot, -1, null,
                    "could not write the map: " + e.getMessage() + " (check that the folder exists and is writable)", e);
        }
    }

    private static String rejections(StarMeasurement m) {
        List<String> parts = new ArrayList<>();
        for (Map.Entry<RejectReason, Integer> e : m.rejected().entrySet()) {
            if (e.getValue() > 0) {
                parts.add(e.getValue() + " " + e.getKey().key().replace('_', ' '));
            }
        }
        return parts.isEmpty() ? "none" : String.join(", ", parts);
    }

    private static Double arcsec(PlateScale s, double px) {
        return s == null || !Double.isFinite(px) ? null : s.toArcsec(px);
    }

    private static Double deg(double rad) {
        return Double.isFinite(rad) ? Math.toDegrees(rad) : null;
    }

    private Json summary(ProfileSummary p, PlateScale s) {
        return Json.object().put("stars", p.count()).put("fwhm_px", p.fwhm()).put("fwhm_spread_px", p.fwhmSpread())
                .put("fwhm_major_px", p.fwhmMajor()).put("fwhm_minor_px", p.fwhmMinor())
                .put("fwhm_arcsec", arcsec(s, p.fwhm())).put("ellipticity", p.ellipticity())
                .put("ellipticity_spread", p.ellipticitySpread()).put("angle_deg", deg(p.angle()))
                .put("beta", p.beta()).put("beta_spread", p.betaSpread()).put("bic", p.bic());
    }

    private String json(StarMeasurement m, PlateScale s, BlurSplit split) {
        ProfileSummary b = m.best();
        Map<String, Object> rejected = new LinkedHashMap<>();
        for (Map.Entry<RejectReason, Integer> e : m.rejected().entrySet()) {
            rejected.put(e.getKey().key(), e.getValue());
        }
        List<Object> regions = new ArrayList<>();
        for (RegionSummary r : m.regions()) {
            regions.add(Json.object().put("column", r.column()).put("row", r.row()).put("x0", r.x0())
                    .put("y0", r.y0()).put("x1", r.x1()).put("y1", r.y1()).put("stars", r.count())
                    .put("fwhm_px", r.fwhm()).put("fwhm_major_px", r.fwhmMajor()).put("fwhm_minor_px", r.fwhmMinor())
                    .put("fwhm_arcsec", arcsec(s, r.fwhm())).put("ellipticity", r.ellipticity())
                    .put("angle_deg", deg(r.angle())));
        }
        Map<String, Object> timings = new LinkedHashMap<>(m.timings());
        return Json.object()
                .put("file", input.toString())
                .put("width", m.width()).put("height", m.height())
                .put("stars_used", m.stars().size())
                .put("model", m.bestShape().name().toLowerCase(Locale.ROOT))
                .put("fwhm_px", b.fwhm())
                .put("fwhm_major_px", b.fwhmMajor())
                .put("fwhm_minor_px", b.fwhmMinor())
                .put("fwhm_arcsec", arcsec(s, b.fwhm()))
                .put("ellipticity", b.ellipticity())
                .put("angle_deg", deg(b.angle()))
                .put("beta", b.beta())
                .put("plate_scale_arcsec", s == null ? null : s.arcsecPerPixel())
                .put("plate_scale_source", s == null ? null : s.source())
                .put("detections", m.detections().size())
                .put("fitted", m.fitted())
                .put("rejected", rejected)
                .put("not_fitted", m.skipped())
                .put("enough_stars", m.enoughStars())
                .put("background", m.backgroundLevel())
                .put("noise", m.backgroundNoise())
                .put("psf_source", m.psfSource().name().toLowerCase(Locale.ROOT))
                .put("psf_reason", m.psfReason())
                .put("psf_mismatch", m.psfMismatch())
                .put("gaussian", summary(m.gaussian(), s))
                .put("moffat", summary(m.moffat(), s))
                .put("grid", Json.object().put("columns", m.gridColumns()).put("rows", m.gridRows()))
                .put("regions", regions)
                .put("blur_split", split == null ? null : Json.object()
                        .put("optics_fwhm_px", split.opticsFwhmPx())
                        .put("seeing_fwhm_arcsec", split.seeingFwhmArcsec())
                        .put("seeing_fwhm_px", split.seeingFwhmPx())
                        .put("tracking_fwhm_px", split.trackingFwhmPx())
                        .put("tracking_angle_deg", deg(split.trackingAngle()))
                        .put("optics_share", split.opticsShare())
                        .put("seeing_share", split.seeingShare())
                        .put("tracking_share", split.trackingShare())
                        .put("model_fwhm_major_px", split.modelMajorPx())
                        .put("model_fwhm_minor_px", split.modelMinorPx())
                        .put("note", split.note().isEmpty() ? null : split.note()))
                .put("timings_ms", timings)
                .toString();
    }

    private void table(PrintWriter out, StarMeasurement m, PlateScale s, BlurSplit split) {
        ProfileSummary b = m.best();
        out.printf(Locale.ROOT, "file:         %s (%d x %d)%n", input, m.width(), m.height());
        out.printf(Locale.ROOT, "stars:        %d used of %d detections; rejected: %s%s%n", m.stars().size(),
                m.detections().size(), rejections(m), m.skipped() > 0 ? "; not fitted: " + m.skipped() : "");
        out.printf(Locale.ROOT, "model:        %s (lower BIC)%n", m.bestShape().name().toLowerCase(Locale.ROOT));
        out.printf(Locale.ROOT, "FWHM:         %.3f px (major %.3f, minor %.3f), spread %.3f px%n", b.fwhm(),
                b.fwhmMajor(), b.fwhmMinor(), b.fwhmSpread());
        out.printf(Locale.ROOT, "              %s%n", s == null ? "arcsec unknown (no WCS or focal length and pixel "
                + "size in the header; give --pixel-scale or --focal-length with --pixel-size)"
                : String.format(Locale.ROOT, "%.3f arcsec at %.4f arcsec/px (%s)", s.toArcsec(b.fwhm()),
                s.arcsecPerPixel(), s.source()));
        out.printf(Locale.ROOT, "ellipticity:  %.3f, major axis at %.1f deg%n", b.ellipticity(), Math.toDegrees(b.angle()));
        if (Double.isFinite(b.beta())) {
            out.printf(Locale.ROOT, "beta:         %.2f (spread %.2f)%n", b.beta(), b.betaSpread());
        }
        out.printf(Locale.ROOT, "gaussian fit: FWHM %.3f px, ellipticity %.3f, %d stars%n", m.gaussian().fwhm(),
                m.gaussian().ellipticity(), m.gaussian().count());
        if (m.moffat().count() > 0) {
            out.printf(Locale.ROOT, "moffat fit:   FWHM %.3f px, ellipticity %.3f, beta %.2f, %d stars%n",
                    m.moffat().fwhm(), m.moffat().ellipticity(), m.moffat().beta(), m.moffat().count());
        } else {
            out.println("moffat fit:   did not converge on any star (beta runs to a Gaussian or the stars are faint)");
        }
        out.printf(Locale.ROOT, "background:   %.6g, noise %.4g%n", m.backgroundLevel(), m.backgroundNoise());
        out.printf(Locale.ROOT, "PSF:          %s%n", m.psfReason());
        if (split != null) {
            out.printf(Locale.ROOT, "blur split:   optics %.2f px (%.0f%%), seeing %.2f arcsec = %.2f px (%.0f%%), "
                    + "tracking %.2f px at %.0f deg (%.0f%%)%n", split.opticsFwhmPx(), 100 * split.opticsShare(),
                    split.seeingFwhmArcsec(), split.seeingFwhmPx(), 100 * split.seeingShare(), split.trackingFwhmPx(),
                    Math.toDegrees(split.trackingAngle()), 100 * split.trackingShare());
            if (!split.note().isEmpty()) {
                out.printf(Locale.ROOT, "              %s%n", split.note());
            }
        }
        out.println("regions (row 0 = first image row):");
        out.println("  col row  stars  FWHM px  ellipticity  angle deg");
        for (RegionSummary r : m.regions()) {
            out.printf(Locale.ROOT, "  %3d %3d  %5d  %7s  %11s  %9s%n", r.column(), r.row(), r.count(),
                    fmt("%.3f", r.fwhm()), fmt("%.3f", r.ellipticity()), fmt("%.1f", Math.toDegrees(r.angle())));
        }
    }

    private static String fmt(String f, double v) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, f, v) : "-";
    }

    /** @return the scale as given by the user, for tests */
    Optional<PlateScale> scaleOption() {
        return Optional.ofNullable(optionScale());
    }
}
