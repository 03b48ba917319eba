package dev.nitid.cli;

import static dev.nitid.cli.CliRun.run;
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
import dev.nitid.synth.SyntheticModelPsf;
import dev.nitid.synth.Placement;
import dev.nitid.synth.StarSettings;
import dev.nitid.synth.SyntheticField;
import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

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



    @BeforeAll
    static void scene() throws Exception {
        field = FieldGenerator.generate(new FieldSettings(256, 256, 31,
                new StarSettings(49, FluxLaw.UNIFORM_MAGNITUDE, 3e3, 3e5, 1, Placement.GRID, 30),
                new ExtendedSettings(80, 4, 30, 1.2, 0, 100), SyntheticModelPsf.moffat(3.2, 3).withSize(31),
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
        CliRun r = run("sharpen", observed.toString(), "--psf", psf.toString(), "-o", out.toString(),
                "--preview", png.toString(), "--report", json.toString());
        assertEquals(ExitCode.OK, r.code(), r.err());

        FitsImage restored = FitsReader.read(out);
        QualityReport truth = QualityReference.of(field, QualitySettings.defaults()).evaluate(restored.image());
        double printedRatio = number(r.out(), "star FWHM .*\\(ratio ([0-9.]+)");
        assertEquals(truth.fwhmRatio(), printedRatio, FWHM_RATIO_TOL, r.out() + " harness stars " + truth.fwhm().stars() + " in " + truth.fwhm().inputFwhm() + " out " + truth.fwhm().outputFwhm());
        double ring = number(r.out(), "dark rings worst (-?[0-9.]+) sigma");
        assertTrue(ring <= RING_LIMIT, "printed ring depth " + ring + " > " + RING_LIMIT + "\n" + r.out());
        assertTrue(truth.ringDepth() <= RING_LIMIT, "harness ring depth " + truth.ringDepth());

        // The preview decodes with the JDK's ImageIO and has the size the README documents: two 256-px panels
        // side by side, and below them a row of magnified crops.
        BufferedImage p = ImageIO.read(png.toFile());
        assertTrue(p.getWidth() >= 2 * 256, "two panels side by side: width " + p.getWidth());
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
        CliRun r = run("sharpen", copy.toString(), "--iterations", "5");
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
        CliRun r = run("sharpen", flat.toString(), "-o", dir.resolve("flat-out.fits").toString());
        assertEquals(ExitCode.DATA, r.code(), r.err());
        assertTrue(r.err().startsWith("nitid: "), r.err());
        assertTrue(r.err().contains("--psf"), r.err());
        assertEquals(1, r.err().strip().lines().count(), "one line: " + r.err());
        assertFalse(Files.exists(dir.resolve("flat-out.fits")));
    }

    @Test
    void psfFileAndModelTogetherIsAUsageError() {
        CliRun r = run("sharpen", observed.toString(), "--psf", psf.toString(), "--model", "moffat", "--fwhm", "3",
                "-o", dir.resolve("x.fits").toString());
        assertEquals(ExitCode.USAGE, r.code(), r.err());
        assertTrue(r.err().contains("--psf and --model"), r.err());
    }

    @Test
    void modelOptionsBuildThePsf() {
        CliRun r = run("sharpen", observed.toString(), "--model", "moffat", "--fwhm", "3.2", "--beta", "3",
                "--iterations", "3", "-o", dir.resolve("model.fits").toString());
        assertEquals(ExitCode.OK, r.code(), r.err());
        assertTrue(r.out().contains("PSF        model"), r.out());
    }

    @Test
    void colourCubeWithANaNRegionRestoresEveryPlaneAndFillsTheHole() throws Exception {
        // Three planes of the same field at different brightness, one with a 10x10 hole of NaN (masked pixels
        // carry no weight and are filled by the restoration: restorer issue, "Masks").
        float[][] planes = new float[3][];
        for (int p = 0; p < 3; p++) {
            planes[p] = field.observed().plane(0).clone();
            for (int i = 0; i < planes[p].length; i++) {
                planes[p][i] *= 1f - 0.2f * p;
            }
        }
        for (int y = 100; y < 110; y++) {
            for (int x = 60; x < 70; x++) {
                planes[1][y * 256 + x] = Float.NaN;
            }
        }
        Path cube = dir.resolve("cube.fits");
        dev.nitid.fits.FitsWriter.write(cube, dev.nitid.image.Image.wrap(256, 256, planes),
                dev.nitid.fits.FitsHeader.empty(), dev.nitid.fits.WriteOptions.defaults());
        Path out = dir.resolve("cube-out.fits");
        CliRun r = run("sharpen", cube.toString(), "--psf", psf.toString(), "-o", out.toString(), "--iterations", "10");
        assertEquals(ExitCode.OK, r.code(), r.err());
        FitsImage back = FitsReader.read(out);
        assertEquals(3, back.image().planes());
        for (int p = 0; p < 3; p++) {
            assertEquals(0, back.image().stats(p).nonFinite(), "plane " + p + " has no NaN left");
        }
        float filled = back.image().get(1, 65, 105);
        double sky = 200 * (1 - 0.2);
        assertTrue(Math.abs(filled - sky) < 0.5 * sky, "hole filled near the sky level: " + filled);
    }
}
