package dev.nitid.cli;

import static dev.nitid.cli.CliRun.run;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import dev.nitid.fits.FitsImage;
import dev.nitid.fits.FitsReader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SimulateCommandTest {
    @TempDir
    Path dir;



    /** A small field without PSF options. */
    private String[] base(Path out, String... extra) {
        List<String> a = new java.util.ArrayList<>(List.of("simulate", "-o", out.toString(), "--image-size", "96x80",
                "--stars", "12", "--nebula", "40", "--filaments", "2", "--seed", "5"));
        a.addAll(List.of(extra));
        return a.toArray(String[]::new);
    }

    /** A small field with a Moffat PSF of FWHM 2.5 px. */
    private String[] small(Path out, String... extra) {
        List<String> a = new java.util.ArrayList<>(List.of(base(out, "--model", "moffat", "--fwhm", "2.5")));
        a.addAll(List.of(extra));
        return a.toArray(String[]::new);
    }

    @Test
    void writesFourFilesWithParametersInTheHeaders() throws Exception {
        Path out = dir.resolve("field.fits");
        CliRun r = run(small(out));
        assertEquals(ExitCode.OK, r.code(), r.err());
        FitsImage obs = FitsReader.read(out);
        assertEquals(96, obs.image().width());
        assertEquals(80, obs.image().height());
        assertEquals(-32, obs.bitpix());
        assertEquals(5.0, obs.header().getDouble("SIMSEED").orElseThrow());
        assertEquals(12.0, obs.header().getDouble("NSTARS").orElseThrow());
        assertEquals("observed", obs.header().getString("SIMROLE").orElseThrow());
        assertEquals(2.5, obs.header().getDouble("PSFFWHMA").orElseThrow(), "the psf command's keywords");
        assertEquals("moffat", obs.header().getString("PSFMODEL").orElseThrow());
        FitsImage truth = FitsReader.read(dir.resolve("field-truth.fits"));
        assertEquals("truth", truth.header().getString("SIMROLE").orElseThrow());
        FitsImage psf = FitsReader.read(dir.resolve("field-psf.fits"));
        double sum = 0;
        for (float v : psf.image().plane(0)) {
            sum += v;
        }
        assertEquals(1.0, sum, 1e-5, "PSF sums to 1");
        List<String> csv = Files.readAllLines(dir.resolve("field-stars.csv"));
        assertEquals("x,y,flux,peak,saturated", csv.get(0));
        assertEquals(13, csv.size());
        // Truth catalogue flux = the star's pixel in the truth image minus the extended structure there:
        // at least it is never more than the truth pixel (common practice, no source).
        String[] first = csv.get(1).split(",");
        double x = Double.parseDouble(first[0]);
        double y = Double.parseDouble(first[1]);
        double flux = Double.parseDouble(first[2]);
        assertTrue(truth.image().get((int) Math.round(x), (int) Math.round(y)) >= flux * (1 - 1e-6));
    }

    @Test
    void pixelScaleIsReadBackFromTheWcs() throws Exception {
        // Worked example, reference README §4: 3.76 µm pixels at 1000 mm give 0.775556 arcsec/px (astropy 5.2.1).
        Path out = dir.resolve("scale.fits");
        assertEquals(ExitCode.OK, run(small(out, "--pixel-scale", "0.775556")).code());
        double s = dev.nitid.fits.Wcs.pixelScaleArcsec(FitsReader.read(out).header()).orElseThrow();
        assertEquals(0.775556, s, 1e-9);
    }

    @Test
    void pupilModelFromThePsfOptionsWithPlateScale() throws Exception {
        // The psf command's airy options drive the field; the plate scale follows from focal length and pixel
        // size: 206.264806 × 3.76 / 1000 = 0.775556 arcsec/px (reference README §4, astropy 5.2.1).
        Path out = dir.resolve("airy.fits");
        CliRun r = run(base(out, "--model", "airy", "--aperture", "200", "--focal-length", "1000", "--pixel-size",
                "3.76", "--obstruction", "0.3", "--vanes", "4", "--vane-width", "2", "--psf-size", "31"));
        assertEquals(ExitCode.OK, r.code(), r.err());
        FitsImage f = FitsReader.read(out);
        assertEquals("airy", f.header().getString("PSFMODEL").orElseThrow());
        assertEquals(0.775556, dev.nitid.fits.Wcs.pixelScaleArcsec(f.header()).orElseThrow(), 1e-6);
        assertEquals(31, FitsReader.read(dir.resolve("airy-psf.fits")).image().width());
    }

    @Test
    void sameSeedGivesTheSameFile() throws Exception {
        Path a = dir.resolve("a.fits");
        Path b = dir.resolve("b.fits");
        assertEquals(ExitCode.OK, run(small(a)).code());
        assertEquals(ExitCode.OK, run(small(b)).code());
        assertArrayEquals(FitsReader.read(a).image().plane(0), FitsReader.read(b).image().plane(0));
        assertEquals(Files.readString(dir.resolve("a-stars.csv")), Files.readString(dir.resolve("b-stars.csv")));
    }

    @Test
    void sixteenBitOutputIsTheRoundedFloatField() throws Exception {
        // Same seed, two data types: the unsigned 16-bit file (BZERO 32768, the FITS Standard 4.0 convention for
        // unsigned integers — section from memory) holds the float field rounded to whole ADU (all within
        // 0..65535 here), whatever the rounding rule for ties: |u16 − f32| ≤ ½.
        Path f32 = dir.resolve("f32.fits");
        Path u16 = dir.resolve("u16.fits");
        assertEquals(ExitCode.OK, run(small(f32)).code());
        assertEquals(ExitCode.OK, run(small(u16, "--bitpix", "16")).code());
        FitsImage a = FitsReader.read(f32);
        FitsImage b = FitsReader.read(u16);
        assertEquals(16, b.bitpix());
        float[] pa = a.image().plane(0);
        float[] pb = b.image().plane(0);
        for (int i = 0; i < pa.length; i++) {
            assertEquals(pa[i], pb[i], 0.5 + 1e-3, "pixel " + i);
            assertEquals(Math.rint(pb[i]), pb[i], 0.0, "whole ADU at pixel " + i);
        }
    }

    @Test
    void refusesToOverwriteWithoutTheOption() {
        Path out = dir.resolve("f.fits");
        assertEquals(ExitCode.OK, run(small(out)).code());
        CliRun again = run(small(out));
        assertEquals(ExitCode.CANNOT_CREATE, again.code());
        assertTrue(again.err().startsWith("nitid: ") && again.err().contains("--overwrite"), again.err());
        assertEquals(ExitCode.OK, run(small(out, "--overwrite")).code());
    }

    @Test
    void optionErrorsAreOneLineWithExitCode2() {
        Path out = dir.resolve("g.fits");
        for (String[] bad : new String[][] {{"--bitpix", "8"}, {"--gain", "0"}, {"--oversample", "99"},
                {"--flux-law", "linear"}, {"--fwhm-gradient", "0.1"}, {"--ellipticity", "0.3", "--fwhm-gradient", "0.1,0"},
                {"--psf-file", "x.fits"}}) {
            CliRun r = run(small(out, bad));
            assertEquals(ExitCode.USAGE, r.code(), String.join(" ", bad) + ": " + r.err());
            assertEquals(1, r.err().strip().lines().count(), r.err());
            assertTrue(r.err().startsWith("nitid: "), r.err());
        }
        CliRun size = run("simulate", "-o", out.toString(), "--image-size", "12xx");
        assertEquals(ExitCode.USAGE, size.code(), size.err());
        assertTrue(size.err().contains("--image-size is '12xx'"), size.err());
        assertEquals(ExitCode.USAGE, run(base(out, "--model", "cubic")).code(), "unknown model");
        assertEquals(ExitCode.USAGE, run("simulate").code(), "missing -o");
    }

    @Test
    void psfFileIsUsedAsGivenWithStarsOnPixelCentres() throws Exception {
        // Round trip: the PSF written by one run drives a second run; its PSF output is the same kernel.
        Path first = dir.resolve("one.fits");
        assertEquals(ExitCode.OK, run(base(first, "--model", "gaussian", "--fwhm", "2")).code());
        Path second = dir.resolve("two.fits");
        CliRun r = run(base(second, "--psf-file", dir.resolve("one-psf.fits").toString()));
        assertEquals(ExitCode.OK, r.code(), r.err());
        float[] a = FitsReader.read(dir.resolve("one-psf.fits")).image().plane(0);
        float[] b = FitsReader.read(dir.resolve("two-psf.fits")).image().plane(0);
        dev.nitid.testdata.ArrayAssert.assertClose(a, b, (int) Math.round(Math.sqrt(a.length)), 1e-6, 1e-9);
        for (String line : Files.readAllLines(dir.resolve("two-stars.csv")).subList(1, 13)) {
            double x = Double.parseDouble(line.split(",")[0]);
            assertEquals(Math.rint(x), x, 0.0, "star on a pixel centre: " + line);
        }
    }

    @Test
    void missingPsfFileExits66() {
        CliRun r = run(base(dir.resolve("h.fits"), "--psf-file", dir.resolve("nope.fits").toString()));
        assertEquals(ExitCode.NO_INPUT, r.code(), r.err());
    }

    @Test
    void writtenFilesPassFitsverify() throws Exception {
        // fitsverify 4.20 (CFITSIO 4.02), the HEASARC FITS checker; skipped where it is not installed.
        Path fv = Path.of("/usr/bin/fitsverify");
        assumeTrue(Files.isExecutable(fv), "fitsverify not installed");
        // No warnings either (no -e): the plate scale's linear WCS must be complete on both axes.
        Path out = dir.resolve("v.fits");
        assertEquals(ExitCode.OK, run(small(out, "--bitpix", "16", "--pixel-scale", "0.775556")).code());
        for (String name : List.of("v.fits", "v-truth.fits", "v-psf.fits")) {
            Process p = new ProcessBuilder(fv.toString(), "-q", dir.resolve(name).toString())
                    .redirectErrorStream(true).start();
            String log = new String(p.getInputStream().readAllBytes());
            assertEquals(0, p.waitFor(), name + ": " + log);
        }
    }
}
