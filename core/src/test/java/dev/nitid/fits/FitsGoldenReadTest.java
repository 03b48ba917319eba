package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import dev.nitid.testdata.Reference;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Reads the golden files written by astropy 5.2.1 ({@code reference/gen_fits_golden.py}) and compares every
 * pixel with the physical values astropy recorded in {@code golden/fits_expected_values.csv}.
 */
class FitsGoldenReadTest {
    @TempDir
    Path tmp;

    private Path golden(String name) throws IOException {
        Path p = tmp.resolve(name);
        Files.write(p, Reference.bytes("golden/" + name));
        return p;
    }

    /** Expected physical values of one golden file, from astropy 5.2.1: NaN for undefined/NaN. */
    private static List<double[]> expected(String name) {
        List<double[]> out = new ArrayList<>();
        for (String line : Reference.lines("golden/fits_expected_values.csv")) {
            String[] f = line.split(",");
            if (f.length == 5 && f[0].equals(name)) {
                String v = f[3];
                double d = v.equals("nan") || v.startsWith("BLANK") ? Double.NaN : Double.parseDouble(v);
                out.add(new double[] {Integer.parseInt(f[1]), Integer.parseInt(f[2]), d});
            }
        }
        return out;
    }

    private static void assertPixels(String name, Image img) {
        List<double[]> exp = expected(name);
        assertTrue(exp.size() > 0, "no expected values for " + name);
        for (double[] e : exp) {
            int row = (int) e[0];
            int col = (int) e[1];
            float got = img.get(col, row);
            if (Double.isNaN(e[2])) {
                assertTrue(Float.isNaN(got), name + " (" + col + "," + row + ") expected NaN got " + got);
            } else {
                // float32 holds every expected value exactly (uint16/int16 integers, float32 values).
                assertEquals((float) e[2], got, 0f, name + " pixel (" + col + "," + row + ")");
            }
        }
    }

    @Test
    void unsigned16ThroughBzero() throws Exception {
        FitsImage fi = FitsReader.read(golden("fits_u16_bzero32768.fits"));
        assertEquals(4, fi.image().width());
        assertEquals(3, fi.image().height());
        assertEquals(16, fi.bitpix());
        assertEquals(0, fi.maskedPixels());
        assertEquals("adu", fi.header().getString("BUNIT").orElseThrow());
        assertPixels("fits_u16_bzero32768.fits", fi.image());
    }

    @Test
    void float32WithNan() throws Exception {
        FitsImage fi = FitsReader.read(golden("fits_f32_nan.fits"));
        assertEquals(-32, fi.bitpix());
        assertEquals(1, fi.maskedPixels());
        assertPixels("fits_f32_nan.fits", fi.image());
    }

    @Test
    void int16BlankBecomesNan() throws Exception {
        FitsImage fi = FitsReader.read(golden("fits_i16_blank.fits"));
        assertEquals(1, fi.maskedPixels());
        assertPixels("fits_i16_blank.fits", fi.image());
    }

    @Test
    void float64CubeAsPlanes() throws Exception {
        FitsImage fi = FitsReader.read(golden("fits_f64_cube.fits"));
        Image img = fi.image();
        assertEquals(2, img.planes());
        // gen_fits_golden.py: np.arange(8).reshape(2,2,2)*0.5 - 1.0 with shape (NAXIS3, NAXIS2, NAXIS1).
        for (int p = 0; p < 2; p++) {
            for (int y = 0; y < 2; y++) {
                for (int x = 0; x < 2; x++) {
                    assertEquals((p * 4 + y * 2 + x) * 0.5f - 1.0f, img.get(p, x, y), 0f);
                }
            }
        }
    }

    /**
     * The second golden set ({@code testdata/scripts/gen_fits_golden_extra.py}, astropy 5.2.1): an image in
     * an extension with BSCALE/BZERO, a gzip file, a uint8 colour cube, int64. Every pixel must equal
     * astropy's physical value rounded to float32 (the reader's pixel type), NaN where astropy has NaN.
     */
    @Test
    void extraGoldenFilesMatchAstropy() throws Exception {
        int checked = 0;
        java.util.Map<String, FitsImage> cache = new java.util.HashMap<>();
        for (String line : Reference.lines("golden/fits_extra_expected.csv")) {
            if (line.startsWith("#") || line.startsWith("file,")) {
                continue;
            }
            String[] f = line.split(",");
            int hdu = Integer.parseInt(f[1]);
            FitsImage fi = cache.get(f[0] + "#" + hdu);
            if (fi == null) {
                fi = FitsReader.read(golden(f[0]), new ReadOptions(hdu));
                cache.put(f[0] + "#" + hdu, fi);
            }
            float got = fi.image().get(Integer.parseInt(f[2]), Integer.parseInt(f[4]), Integer.parseInt(f[3]));
            if (f[5].equals("nan")) {
                assertTrue(Float.isNaN(got), line);
            } else {
                assertEquals((float) Double.parseDouble(f[5]), got, 0f, line);
            }
            checked++;
        }
        assertEquals(84, checked, "values in fits_extra_expected.csv");
        FitsImage first = FitsReader.read(golden("fits_ext_image.fits"));
        assertEquals(1, first.hdu(), "the empty primary is skipped");
        assertEquals("SCI", first.header().getString("EXTNAME").orElseThrow());
        assertEquals(3, FitsReader.read(golden("fits_i8_rgb_cube.fits")).image().planes());
        // |det CD| = (2.5e-4 deg)^2, so the scale is 2.5e-4 deg = 0.9 arcsec (Greisen & Calabretta 2002, §2.1).
        assertEquals(0.9, Wcs.pixelScaleArcsec(cache.get("fits_i8_rgb_cube.fits#0").header()).getAsDouble(),
                1e-12);
    }

    @Test
    void writeThenReadIsBitExact() throws Exception {
        Image img = Image.create(5, 3);
        for (int i = 0; i < 15; i++) {
            img.plane(0)[i] = (float) Math.scalb(1.0 + i / 7.0, i - 7);
        }
        img.plane(0)[4] = Float.NaN;
        Path out = tmp.resolve("rt.fits");
        FitsWriter.write(out, img, FitsHeader.empty().with("OBJECT", "made-up field", null),
                WriteOptions.defaults());
        FitsImage back = FitsReader.read(out);
        for (int i = 0; i < 15; i++) {
            assertEquals(Float.floatToRawIntBits(img.plane(0)[i]), Float.floatToRawIntBits(back.image().plane(0)[i]));
        }
        assertEquals("made-up field", back.header().getString("OBJECT").orElseThrow());
        assertEquals(0, Files.size(out) % 2880);
    }
}
