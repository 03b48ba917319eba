package dev.nitid.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.FitsException;
import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.FitsWriter;
import dev.nitid.fits.WriteOptions;
import dev.nitid.image.Image;
import dev.nitid.testdata.Reference;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code nitid info} and the shared failure mapping ({@link Failures}, exit codes of {@link ExitCode}). */
class InfoCommandTest {
    @TempDir
    Path tmp;

    private Path golden(String name) throws Exception {
        Path p = tmp.resolve(name);
        Files.write(p, Reference.bytes("golden/" + name));
        return p;
    }

    @Test
    void describesTheUnsigned16BitGoldenFile() throws Exception {
        Path f = golden("fits_u16_bzero32768.fits");
        CliRun r = CliRun.of("info", f.toString());
        assertEquals(0, r.exit(), r.err());
        assertEquals("", r.err());
        assertTrue(r.out().contains("4 x 3 pixels, 1 plane"), r.out());
        assertTrue(r.out().contains("16-bit unsigned integer, stored with BZERO 32768"), r.out());
        // Values written by astropy 5.2.1 (gen_fits_golden.py): 0, 1, 2, 32767, 32768, 32769, 65534, 65535,
        // 1000..4000; their median is (3000 + 4000) / 2 = 3500 (numpy.median of the same list).
        assertTrue(r.out().contains("min 0.00000  max 65535.0  median 3500.00"), r.out());
        assertTrue(r.out().contains("HDU:         0 (primary)"), r.out());
    }

    /**
     * Every valid flavour of the issue, as written by astropy 5.2.1 (gen_fits_golden.py and
     * testdata/scripts/gen_fits_golden_extra.py): info succeeds and reports astropy's shape.
     */
    @org.junit.jupiter.params.ParameterizedTest(name = "{0}")
    @org.junit.jupiter.params.provider.CsvSource({
        "fits_u16_bzero32768.fits, 0, 4, 3, 1, 16",
        "fits_f32_nan.fits, 0, 4, 2, 1, -32",
        "fits_i16_blank.fits, 0, 5, 1, 1, 16",
        "fits_f64_cube.fits, 0, 2, 2, 2, -64",
        "fits_ext_image.fits, 1, 3, 2, 1, 32",
        "fits_u16_gzip.fits.gz, 0, 4, 3, 1, 16",
        "fits_i8_rgb_cube.fits, 0, 5, 4, 3, 8",
        "fits_i64.fits, 0, 3, 1, 1, 64"})
    void worksOnEveryValidFlavour(String name, int hdu, int w, int h, int planes, int bitpix) throws Exception {
        CliRun r = CliRun.of("info", "--json", golden(name).toString());
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.out().contains("\"hdu\":" + hdu + ",\"width\":" + w + ",\"height\":" + h + ",\"planes\":"
                + planes + ",\"bitpix\":" + bitpix + ","), r.out());
    }

    @Test
    void jsonReportsMaskedPixelsAndPlanes() throws Exception {
        CliRun r = CliRun.of("info", "--json", golden("fits_f32_nan.fits").toString());
        assertEquals(0, r.exit(), r.err());
        // fits_f32_nan.fits: 4 x 2 float32 with one NaN (astropy 5.2.1).
        assertTrue(r.out().contains("\"width\":4,\"height\":2,\"planes\":1,\"bitpix\":-32,\"maskedPixels\":1"), r.out());
        assertTrue(r.out().trim().startsWith("{") && r.out().trim().endsWith("}"), r.out());
        CliRun cube = CliRun.of("info", "--json", golden("fits_f64_cube.fits").toString());
        assertTrue(cube.out().contains("\"planes\":2"), cube.out());
    }

    @Test
    void pixelScaleComesFromTheWcs() throws Exception {
        // Greisen & Calabretta 2002 (A&A 395, 1061), §2.1: M = CDELT x PC. A 30-degree rotation with
        // CDELT = 5e-4 deg has |det M| = (5e-4)^2, so the scale is 5e-4 deg = 1.8 arcsec per pixel.
        double c = Math.cos(Math.toRadians(30));
        double s = Math.sin(Math.toRadians(30));
        FitsHeader h = FitsHeader.empty().with("CTYPE1", "RA---TAN", null).with("CTYPE2", "DEC--TAN", null)
                .with("CDELT1", -5e-4, null).with("CDELT2", 5e-4, null)
                .with("PC1_1", c, null).with("PC1_2", -s, null).with("PC2_1", s, null).with("PC2_2", c, null);
        Path f = tmp.resolve("wcs.fits");
        FitsWriter.write(f, Image.create(8, 8), h, WriteOptions.defaults());
        CliRun r = CliRun.of("info", f.toString());
        assertTrue(r.out().contains("pixel scale: 1.800 arcsec/pixel"), r.out());
    }

    @Test
    void hduOptionChoosesTheHdu() throws Exception {
        Path f = golden("fits_f32_nan.fits");
        CliRun bad = CliRun.of("info", "--hdu", "3", f.toString());
        assertEquals(ExitCode.DATA, bad.exit());
        assertEquals(1, bad.errLines().size(), bad.err());
        assertTrue(bad.err().startsWith("nitid: " + f + ": HDU 3: there is no HDU 3"), bad.err());
        CliRun neg = CliRun.of("info", "--hdu", "-4", f.toString());
        assertEquals(ExitCode.USAGE, neg.exit());
        assertEquals(1, neg.errLines().size(), neg.err());
    }

    @Test
    void missingFileExits66WithOneLineAndDebugAddsTheTrace() {
        Path f = tmp.resolve("absent.fits");
        CliRun r = CliRun.of("info", f.toString());
        assertEquals(ExitCode.NO_INPUT, r.exit());
        assertEquals(1, r.errLines().size(), r.err());
        assertEquals("nitid: " + f + ": the file does not exist (check the name and the folder)", r.errLines().get(0));
        assertEquals("", r.out());
        CliRun d = CliRun.of("info", "--debug", f.toString());
        assertEquals(ExitCode.NO_INPUT, d.exit());
        assertTrue(d.errLines().size() > 2 && d.err().contains("at dev.nitid.fits.FitsReader"), d.err());
    }

    @Test
    void everyFailureKindHasItsDocumentedExitCode() {
        Path f = Path.of("x.fits");
        // The table of the issue: 65 bad data, 66 input missing or unreadable, 73 output cannot be created
        // or exists, 74 I/O error while writing, 75 not enough memory, 2 usage, 1 internal.
        int[][] expected = {
            {FitsException.Kind.NOT_FOUND.ordinal(), 66}, {FitsException.Kind.UNREADABLE.ordinal(), 66},
            {FitsException.Kind.BAD_DATA.ordinal(), 65}, {FitsException.Kind.TOO_LARGE.ordinal(), 75},
            {FitsException.Kind.OUTPUT_EXISTS.ordinal(), 73}, {FitsException.Kind.CANNOT_CREATE.ordinal(), 73},
            {FitsException.Kind.WRITE_FAILED.ordinal(), 74}};
        for (int[] e : expected) {
            FitsException.Kind k = FitsException.Kind.values()[e[0]];
            assertEquals(e[1], Failures.exitCode(new FitsException(k, f, -1, null, "x (y)")), k.name());
        }
        assertEquals(75, Failures.exitCode(new OutOfMemoryError("Java heap space")));
        assertEquals(2, Failures.exitCode(new IllegalArgumentException("bad")));
        assertEquals(1, Failures.exitCode(new IllegalStateException("bug")));
        assertTrue(Failures.line(new OutOfMemoryError()).contains("-Xmx"));
        assertTrue(Failures.line(new NullPointerException()).contains("--debug"));
    }

    @Test
    void threadsMustBePositive() throws Exception {
        CliRun r = CliRun.of("info", "--threads", "0", golden("fits_f32_nan.fits").toString());
        assertEquals(ExitCode.USAGE, r.exit());
    }
}
