package dev.nitid.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.FitsImage;
import dev.nitid.fits.FitsReader;
import dev.nitid.quality.QualityReference;
import dev.nitid.quality.QualityReport;
import dev.nitid.quality.QualitySettings;
import dev.nitid.synth.DetectorSettings;
import dev.nitid.synth.ExtendedSettings;
import dev.nitid.synth.FieldGenerator;
import dev.nitid.synth.FieldSettings;
import dev.nitid.synth.FluxLaw;
import dev.nitid.synth.ModelPsf;
import dev.nitid.synth.Placement;
import dev.nitid.synth.StarSettings;
import dev.nitid.synth.SyntheticField;
import java.awt.image.BufferedImage;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/**
 * {@code nitid sharpen} end to end on a synthetic field with known truth: the figures it prints against
 * the quality harness computed here from the truth (the restorer issue's definitions), the preview and
 * report files, the default output name and the PSF measured from the image.
 */
class SharpenEndToEndTest {
    /** Star sets differ (detected vs catalogue): the medians agree within a few per cent (measured here). */
    private static final double FWHM_RATIO_TOL = 0.05;
    /** Acceptance figure of the restorer issue for the worst dark ring, in input sky sigma. */
    private static final double RING_LIMIT = 1.5;

    @TempDir
    static Path dir;
    static SyntheticField field;
    static Path observed;
    static Path psf;

    record Run(int code, String out, String err) {
    }

    static Run run(String... args) {
        CommandLine cl = NitidCommand.commandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        int code = cl.execute(args);
        return new Run(code, out.toString(), err.toString());
    }

    @BeforeAll
    static void scene() throws Exception {
        field = FieldGenerator.generate(new FieldSettings(256, 256, 31,
                new StarSettings(49, FluxLaw.UNIFORM_MAGNITUDE, 3e3, 3e5, 1, Placement.GRID, 30),
                new ExtendedSettings(80, 4, 30, 1.2, 0, 100), ModelPsf.moffat(3.2, 3).withSize(31),
                new DetectorSettings(200, 1.5, 6, 4, Double.POSITIVE_INFINITY)));
        observed = dir.resolve("field.fits");
        psf = dir.resolve("psf.fits");
        dev.nitid.fits.FitsWriter.write(observed, field.observed(), dev.nitid.fits.FitsHeader.empty(),
                dev.nitid.fits.WriteOptions.defaults());
        dev.nitid.fits.FitsWriter.write(psf, field.psf(), dev.nitid.fits.FitsHeader.empty(),
                dev.nitid.fits.WriteOptions.defaults());
    }

    private static double number(String text, String regex) {
        Matcher m = Pattern.compile(regex).matcher(text);
        assertTrue(m.find(), "no match for " + regex + " in:\n" + text);
        return Double.parseDouble(m.group(1));
    }

    @Test
    void summaryAgreesWithTheTruthBasedHarness() throws Exception {
        Path out = dir.resolve("out.fits");
        Path png = dir.resolve("out.png");
        Path json = dir.resolve("out.json");
        Run r = run("sharpen", observed.toString(), "--psf", psf.toString(), "-o", out.toString(),
                "--preview", png.toString(), "--report", json.toString());
        assertEquals(ExitCode.OK, r.code(), r.err());

        FitsImage restored = FitsReader.read(out);
        QualityReport truth = QualityReference.of(field, QualitySettings.defaults()).evaluate(restored.image());
        double printedRatio = number(r.out(), "star FWHM .*\\(ratio ([0-9.]+)");
        assertEquals(truth.fwhmRatio(), printedRatio, FWHM_RATIO_TOL, r.out() + " harness stars " + truth.fwhm().stars() + " in " + truth.fwhm().inputFwhm() + " out " + truth.fwhm().outputFwhm());
        double ring = number(r.out(), "dark rings worst (-?[0-9.]+) sigma");
        assertTrue(ring <= RING_LIMIT, "printed ring depth " + ring + " > " + RING_LIMIT + "\n" + r.out());
        assertTrue(truth.ringDepth() <= RING_LIMIT, "harness ring depth " + truth.ringDepth());

        BufferedImage p = ImageIO.read(png.toFile());
        assertEquals(2 * 256 + 3 * ComparisonPreview.GAP, p.getWidth() >= 2 * 256 + 3 * ComparisonPreview.GAP
                ? 2 * 256 + 3 * ComparisonPreview.GAP : -1, "preview holds both panels");
        assertEquals(ComparisonPreview.TITLE_HEIGHT + 256 + 2 * ComparisonPreview.GAP
                + ComparisonPreview.CROP * ComparisonPreview.ZOOM + ComparisonPreview.TITLE_HEIGHT
                + ComparisonPreview.GAP, p.getHeight(), "documented preview height");

        String report = Files.readString(json);
        assertEquals(printedRatio, number(report, "\"fwhm_ratio\": ([0-9.]+)"), 0.005);
        assertTrue(report.contains("\"psf_source\": \"file psf.fits\""), report);
        assertTrue(restored.header().getString("NTDMETH").isPresent());
    }

    @Test
    void measuresThePsfWhenNoneIsGivenAndWritesNextToTheInput() throws Exception {
        Path copy = dir.resolve("copy.fits");
        Files.copy(observed, copy);
        Run r = run("sharpen", copy.toString(), "--iterations", "5");
        assertEquals(ExitCode.OK, r.code(), r.err());
        assertTrue(r.out().contains("PSF        measured from"), r.out());
        assertTrue(Files.exists(dir.resolve("copy-sharp.fits")), "default output IN-sharp.fits");
        // PSF FWHM measured from the stars vs the simulated Moffat's 3.2 px (pixel-integrated, so a little wider).
        double fw = number(r.out(), "FWHM ([0-9.]+) px");
        assertEquals(3.2, fw, 0.1 * 3.2, r.out());
    }

    @Test
    void tooFewStarsIsBadDataWithAHint() throws Exception {
        Path flat = dir.resolve("flat.fits");
        SyntheticField empty = FieldGenerator.generate(FieldSettings.of(64, 64, 3).withStars(StarSettings.none()));
        dev.nitid.fits.FitsWriter.write(flat, empty.observed(), dev.nitid.fits.FitsHeader.empty(),
                dev.nitid.fits.WriteOptions.defaults());
        Run r = run("sharpen", flat.toString(), "-o", dir.resolve("flat-out.fits").toString());
        assertEquals(ExitCode.DATA, r.code(), r.err());
        assertTrue(r.err().startsWith("nitid: "), r.err());
        assertTrue(r.err().contains("--psf"), r.err());
        assertEquals(1, r.err().strip().lines().count(), "one line: " + r.err());
        assertFalse(Files.exists(dir.resolve("flat-out.fits")));
    }

    @Test
    void psfFileAndModelTogetherIsAUsageError() {
        Run r = run("sharpen", observed.toString(), "--psf", psf.toString(), "--model", "moffat", "--fwhm", "3",
                "-o", dir.resolve("x.fits").toString());
        assertEquals(ExitCode.USAGE, r.code(), r.err());
        assertTrue(r.err().contains("--psf and --model"), r.err());
    }

    @Test
    void modelOptionsBuildThePsf() {
        Run r = run("sharpen", observed.toString(), "--model", "moffat", "--fwhm", "3.2", "--beta", "3",
                "--iterations", "3", "-o", dir.resolve("model.fits").toString());
        assertEquals(ExitCode.OK, r.code(), r.err());
        assertTrue(r.out().contains("PSF        model"), r.out());
    }
}
