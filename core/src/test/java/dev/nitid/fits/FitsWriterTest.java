package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import dev.nitid.testdata.Reference;
import dev.nitid.testdata.SeededCases;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import nom.tam.fits.utilities.FitsCheckSum;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The writer against the FITS Standard 4.0 layout rules, fitsverify 4.20 (0 errors, 0 warnings) and
 * astropy 5.2.1 (same values, same cards, valid CHECKSUM/DATASUM), plus exact round trips.
 */
class FitsWriterTest {
    /** Exact: float32 through a float32 file must keep every bit (FITS 4.0 §5.2.3, IEEE-754 big-endian). */
    private static final float EXACT = 0f;

    @TempDir
    Path tmp;

    static Stream<Long> seeds() {
        return SeededCases.seeds("fits-float32-roundtrip", 12);
    }

    /** A realistic header for a made-up field: full TAN WCS so that fitsverify has nothing to warn about. */
    static FitsHeader wcsHeader() {
        return FitsHeader.empty()
                .with("OBJECT", "Invented Field 7", "a made-up target")
                .with("TELESCOP", "Fictional 0.3 m", null)
                .with("WCSAXES", 2L, null)
                .with("CTYPE1", "RA---TAN", null).with("CTYPE2", "DEC--TAN", null)
                .with("CRPIX1", 12.5, null).with("CRPIX2", 8.25, null)
                .with("CRVAL1", 150.123456789012, "deg").with("CRVAL2", -12.3456789, "deg")
                .with("CUNIT1", "deg", null).with("CUNIT2", "deg", null)
                .with("CD1_1", -2.7777777777778E-4, null).with("CD1_2", 1.0E-6, null)
                .with("CD2_1", 1.0E-6, null).with("CD2_2", 2.7777777777778E-4, null)
                .with("EXPTIME", 120.0, "s")
                .with("FLIPPED", false, "a logical card")
                .withComment("An invented observation for tests.")
                .withHistory("first processing step, with a long description that has to be split over two "
                        + "HISTORY cards because it is longer than one card");
    }

    static Image randomImage(SplittableRandom rnd) {
        int w = 1 + rnd.nextInt(40);
        int h = 1 + rnd.nextInt(30);
        int planes = 1 + rnd.nextInt(4);
        Image img = Image.create(w, h, planes);
        for (int p = 0; p < planes; p++) {
            float[] px = img.plane(p);
            for (int i = 0; i < px.length; i++) {
                // Any bit pattern: normals, subnormals, zeros of both signs, infinities, NaNs.
                px[i] = Float.intBitsToFloat(rnd.nextInt());
            }
        }
        return img;
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("seeds")
    void float32RoundTripIsBitExact(long seed) throws Exception {
        Image img = randomImage(new SplittableRandom(seed));
        Path out = tmp.resolve("rt.fits");
        WriteReport r = FitsWriter.write(out, img, wcsHeader(), WriteOptions.defaults());
        assertEquals(0, r.clippedPixels());
        assertFalse(r.rounded());
        FitsImage back = FitsReader.read(out);
        assertEquals(-32, back.bitpix());
        assertTrue(img.sameShape(back.image()), "shape");
        long nonFinite = 0;
        for (int p = 0; p < img.planes(); p++) {
            for (int i = 0; i < img.pixelCount(); i++) {
                float a = img.plane(p)[i];
                float b = back.image().plane(p)[i];
                nonFinite += Float.isFinite(a) ? 0 : 1;
                // floatToIntBits folds NaN payloads: the JVM may quieten signalling NaNs (Float Javadoc).
                assertEquals(Float.floatToIntBits(a), Float.floatToIntBits(b),
                        "plane " + p + " pixel " + i + ": " + a + " vs " + b);
            }
        }
        assertEquals(nonFinite, back.maskedPixels());
        assertLayout(out);
    }

    @Test
    void uint16RoundTripIsExactAndReportsClipping() throws Exception {
        Image img = Image.create(256, 256);
        float[] px = img.plane(0);
        for (int i = 0; i < px.length; i++) {
            px[i] = i;  // 0..65535: every unsigned 16-bit value once
        }
        Path out = tmp.resolve("u16.fits");
        WriteReport r = FitsWriter.write(out, img, FitsHeader.empty(), WriteOptions.defaults().withBitpix(16));
        assertEquals(0, r.clippedPixels());
        assertFalse(r.rounded());
        FitsImage back = FitsReader.read(out);
        assertEquals(16, back.bitpix());
        for (int i = 0; i < px.length; i++) {
            assertEquals(px[i], back.image().plane(0)[i], EXACT, "pixel " + i);
        }
        // BZERO = 32768, BSCALE = 1 is the unsigned 16-bit convention (FITS 4.0 Table 11).
        assertEquals(32768.0, back.header().getDouble("BZERO").orElseThrow(), 0.0);
        assertLayout(out);
        ExternalTools.assertFitsverifyClean(out);

        Image odd = Image.wrap(6, 1, new float[] {-1f, 0.4f, 65535.6f, Float.NaN, 70000f, 3f});
        WriteReport r2 = FitsWriter.write(tmp.resolve("clip.fits"), odd, FitsHeader.empty(),
                WriteOptions.defaults().withBitpix(16));
        // -1 (below 0), 65535.6 (rounds to 65536), NaN, 70000 are clipped; 0.4 is rounded.
        assertEquals(4, r2.clippedPixels());
        assertTrue(r2.rounded());
        float[] got = FitsReader.read(tmp.resolve("clip.fits")).image().plane(0);
        assertEquals(List.of(0f, 0f, 65535f, 0f, 65535f, 3f),
                List.of(got[0], got[1], got[2], got[3], got[4], got[5]));
    }

    @Test
    void headerCardsAreKeptAndStaleOnesDropped() throws Exception {
        FitsHeader h = wcsHeader()
                .with("BZERO", 32768L, "stale").with("BSCALE", 2.0, "stale").with("BLANK", -1L, "stale")
                .with("DATAMIN", 0.0, "stale").with("DATAMAX", 9.0, "stale")
                .with("CHECKSUM", "0000000000000000", "stale").with("DATASUM", "0", "stale")
                .with("DATE", "1999-01-01", "stale");
        Image img = Image.create(9, 7);
        img.fill(1.5f);
        Path out = tmp.resolve("cards.fits");
        FitsWriter.write(out, img, h, WriteOptions.defaults());
        FitsHeader back = FitsReader.read(out).header();
        for (String stale : List.of("BZERO", "BSCALE", "BLANK", "DATAMIN", "DATAMAX")) {
            assertTrue(back.card(stale).isEmpty(), stale + " was copied");
        }
        assertTrue(back.getString("DATE").orElseThrow().matches("\\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\d"),
                "DATE format of FITS 4.0 §4.4.2.1");
        assertFalse(back.getString("DATE").orElseThrow().startsWith("1999"));
        assertFalse(back.getString("CHECKSUM").orElseThrow().equals("0000000000000000"));
        // Every non-structural card of the input, in the same order, with the same value.
        List<Card> expected = new ArrayList<>();
        for (Card c : h.cards()) {
            if (!FitsWriter.DROPPED.contains(c.key())) {
                expected.add(c);
            }
        }
        List<Card> actual = new ArrayList<>();
        for (Card c : back.cards()) {
            if (!FitsWriter.DROPPED.contains(c.key()) && !c.key().matches("NAXIS\\d*")) {
                actual.add(c);
            }
        }
        assertEquals(expected.size(), actual.size(), "cards: " + actual);
        for (int i = 0; i < expected.size(); i++) {
            Card e = expected.get(i);
            Card a = actual.get(i);
            assertEquals(e.key(), a.key());
            if (e.isCommentary()) {
                assertEquals(e.comment().strip(), a.comment().strip(), e.key());
            } else if (e.isString()) {
                assertEquals(h.getString(e.key()), back.getString(e.key()), e.key());
            } else {
                assertEquals(e.value(), a.value().equals("T") || a.value().equals("F") ? a.value() : e.value());
                assertEquals(h.getDouble(e.key()), back.getDouble(e.key()), e.key());
            }
        }
        assertChecksumValid(out);
        ExternalTools.assertFitsverifyClean(out);
    }

    /**
     * The nom-tam-fits pitfall: copying an integer file's header into a float HDU carried BZERO/BSCALE along,
     * and astropy then read 1.5 back as 32769.5. Here the unsigned 16-bit golden file (astropy 5.2.1) is read,
     * halved, written as float32 with its own header, and astropy must read the halves exactly.
     */
    @Test
    void integerHeaderDoesNotScaleFloatOutput() throws Exception {
        Path in = tmp.resolve("u16.fits");
        Files.write(in, Reference.bytes("golden/fits_u16_bzero32768.fits"));
        FitsImage fi = FitsReader.read(in);
        Image half = fi.image().copy();
        for (int i = 0; i < half.pixelCount(); i++) {
            half.plane(0)[i] *= 0.5f;
        }
        Path out = tmp.resolve("half.fits");
        FitsWriter.write(out, half, fi.header(), WriteOptions.defaults().withProtectedInputs(in));
        ExternalTools.assertFitsverifyClean(out);
        String values = ExternalTools.python(
                "import sys\nfrom astropy.io import fits\n"
                        + "d = fits.getdata(sys.argv[1])\nprint(d.dtype.kind, ' '.join(repr(float(v)) for v in d.ravel()))",
                out.toString());
        String[] parts = values.trim().split(" ");
        assertEquals("f", parts[0], "astropy dtype kind");
        for (int i = 0; i < half.pixelCount(); i++) {
            assertEquals(half.plane(0)[i], pyFloat(parts[i + 1]), 0.0, "pixel " + i);
        }
    }

    /** Python snippet: prints checksum status, dtype, shape, pixels and typed cards as astropy 5.2.1 sees them. */
    static final String ASTROPY_DUMP = String.join("\n",
            "import sys, warnings",
            "warnings.simplefilter('error')",
            "import numpy as np",
            "from astropy.io import fits",
            "for name in sys.argv[1:]:",
            "  print('FILE', name)",
            "  with fits.open(name, checksum=True) as hl:",
            "    h = hl[0]",
            "    print('SUMS', h.verify_checksum(), h.verify_datasum())",
            "    print('DTYPE', h.data.dtype.kind, h.data.dtype.itemsize)",
            "    print('SHAPE', ' '.join(str(n) for n in h.data.shape))",
            "    print('DATA', ' '.join(repr(float(v)) for v in h.data.astype(np.float64).ravel()))",
            "    for c in h.header.cards:",
            "        v = c.value",
            "        t = 'L' if isinstance(v, bool) else 'I' if isinstance(v, int) else 'F' if isinstance(v, float) "
                    + "else 'S'",
            "        print('CARD', c.keyword, t, str(v).strip() if t != 'F' else repr(v))");

    @Test
    void astropyReadsTheSameValuesAndCards() throws Exception {
        ExternalTools.assumePython();
        SplittableRandom rnd = new SplittableRandom(20261201L);
        Image img = Image.create(13, 5, 3);
        for (int p = 0; p < 3; p++) {
            for (int i = 0; i < img.pixelCount(); i++) {
                img.plane(p)[i] = (float) (rnd.nextGaussian() * 1000);
            }
        }
        img.plane(1)[7] = Float.NaN;
        FitsHeader h = wcsHeader().with("LONGSTR", "x".repeat(90) + " end", "needs CONTINUE cards");
        int[] types = {-32, -64, 8, 16, 32};
        String[] paths = new String[types.length];
        for (int t = 0; t < types.length; t++) {
            Path out = tmp.resolve("astropy" + types[t] + ".fits");
            FitsWriter.write(out, img, h, WriteOptions.defaults().withBitpix(types[t]));
            paths[t] = out.toString();
        }
        // One Python process for all files: interpreter and astropy start-up dominate the cost.
        String dump = ExternalTools.python(ASTROPY_DUMP, paths);
        String[] perFile = dump.split("(?m)^FILE .*\\R");
        assertEquals(types.length + 1, perFile.length, dump);
        for (int t = 0; t < types.length; t++) {
            int bitpix = types[t];
            Path out = Path.of(paths[t]);
            ExternalTools.assertFitsverifyClean(out);
            assertLayout(out);
            assertChecksumValid(out);
            FitsImage ours = FitsReader.read(out);
            List<String> lines = perFile[t + 1].lines().toList();
            assertEquals("SUMS 1 1", lines.get(0), "astropy checksum and datasum verification (1 = valid)");
            assertEquals("SHAPE 3 5 13", lines.get(2), "numpy shape is (NAXIS3, NAXIS2, NAXIS1)");
            String[] data = lines.get(3).substring(5).split(" ");
            int k = 0;
            for (int p = 0; p < 3; p++) {
                for (int i = 0; i < img.pixelCount(); i++) {
                    double a = pyFloat(data[k++]);
                    float o = ours.image().plane(p)[i];
                    if (Double.isNaN(a) || Float.isNaN(o)) {
                        // NaN stays NaN in float files; integer files hold the clipped 0 (see WriteOptions).
                        assertTrue(bitpix > 0 ? a == 0 && o == 0 : Double.isNaN(a) && Float.isNaN(o));
                    } else {
                        assertEquals((float) a, o, EXACT, "bitpix " + bitpix + " plane " + p + " pixel " + i);
                    }
                }
            }
            for (String line : lines) {
                if (!line.startsWith("CARD ")) {
                    continue;
                }
                String[] f = line.split(" ", 4);
                String key = f[1];
                String val = f.length > 3 ? f[3] : "";
                if (key.equals("COMMENT") || key.equals("HISTORY") || key.isEmpty()) {
                    continue;
                }
                switch (f[2]) {
                    case "S" -> assertEquals(val, ours.header().getString(key).orElseThrow().strip(), key);
                    case "L" -> assertEquals(val.equals("True") ? "T" : "F", ours.header().card(key).orElseThrow()
                            .value(), key);
                    default -> assertEquals(Double.parseDouble(val), ours.header().getDouble(key).orElseThrow(),
                            0.0, key);
                }
            }
            assertEquals("x".repeat(90) + " end", ours.header().getString("LONGSTR").orElseThrow());
        }
    }

    /**
     * A HIERARCH card (ESO HIERARCH convention, registered with the IAU FITS Working Group) read from a file
     * is written back with the same key and value, and fitsverify accepts it.
     */
    @Test
    void hierarchCardsSurviveARoundTrip() throws Exception {
        String hdr = String.format("%-80s%-80s%-80s%-80s%-80s%-80s%-80s", "SIMPLE  =                    T",
                "BITPIX  =                  -32", "NAXIS   =                    2", "NAXIS1  =                    2",
                "NAXIS2  =                    2", "HIERARCH ESO DET CHIP TEMP = 150.5 / detector temperature",
                "END");
        byte[] b = new byte[2 * 2880];
        System.arraycopy(hdr.getBytes(StandardCharsets.US_ASCII), 0, b, 0, hdr.length());
        java.util.Arrays.fill(b, hdr.length(), 2880, (byte) ' ');
        Path in = tmp.resolve("hierarch.fits");
        Files.write(in, b);
        FitsImage fi = FitsReader.read(in);
        Path out = tmp.resolve("hierarch-out.fits");
        FitsWriter.write(out, fi.image(), fi.header(), WriteOptions.defaults());
        FitsHeader back = FitsReader.read(out).header();
        Card c = back.cards().stream().filter(k -> k.key().contains("CHIP")).findFirst().orElseThrow();
        assertEquals(fi.header().card(c.key()).orElseThrow().value(), c.value());
        assertEquals(150.5, back.getDouble(c.key()).getAsDouble(), 0.0);
        ExternalTools.assertFitsverifyClean(out);
    }

    /** A keyword may appear once (FITS Standard 4.0 §4.4.2): the writer keeps the first, as getString reads it. */
    @Test
    void repeatedKeywordIsWrittenOnce() throws Exception {
        FitsHeader h = FitsHeader.of(List.of(new Card("OBJECT", "'first'", null), new Card("HISTORY", null, "a"),
                new Card("OBJECT", "'second'", null), new Card("HISTORY", null, "b")));
        Path out = tmp.resolve("dup.fits");
        FitsWriter.write(out, Image.create(3, 3), h, WriteOptions.defaults());
        FitsHeader back = FitsReader.read(out).header();
        assertEquals(1, back.cards().stream().filter(c -> c.key().equals("OBJECT")).count());
        assertEquals("first", back.getString("OBJECT").orElseThrow());
        assertEquals(2, back.cards().stream().filter(c -> c.key().equals("HISTORY")).count());
        ExternalTools.assertFitsverifyClean(out);
    }

    @Test
    void writtenFilesOfEveryTypePassFitsverify() throws Exception {
        ExternalTools.assumeFitsverify();
        Image img = randomImage(new SplittableRandom(7));
        for (int i = 0; i < img.pixelCount(); i++) {
            float v = img.plane(0)[i];
            img.plane(0)[i] = Float.isFinite(v) ? v : 0f;
        }
        for (int bitpix : new int[] {-32, -64, 8, 16, 32}) {
            Path out = tmp.resolve("v" + bitpix + ".fits");
            FitsWriter.write(out, img, wcsHeader(), WriteOptions.defaults().withBitpix(bitpix));
            ExternalTools.assertFitsverifyClean(out);
        }
    }

    /** Parses Python's repr of a float ("nan", "inf", "-inf" included). */
    static double pyFloat(String s) {
        return switch (s) {
            case "nan" -> Double.NaN;
            case "inf" -> Double.POSITIVE_INFINITY;
            case "-inf" -> Double.NEGATIVE_INFINITY;
            default -> Double.parseDouble(s);
        };
    }

    /**
     * Layout rules of FITS Standard 4.0: size a multiple of 2880 (§3.1), 80-byte cards of printable ASCII
     * (§4.1), mandatory keywords first and in order (§4.4.1.1), END then spaces to the block end (§4.4.1).
     */
    static void assertLayout(Path file) throws Exception {
        byte[] b = Files.readAllBytes(file);
        assertEquals(0, b.length % 2880, "file size " + b.length + " is not a multiple of 2880");
        List<String> cards = new ArrayList<>();
        int end = -1;
        for (int off = 0; off + 80 <= b.length && end < 0; off += 80) {
            String c = new String(b, off, 80, StandardCharsets.US_ASCII);
            for (int i = 0; i < 80; i++) {
                int ch = b[off + i] & 0xFF;
                assertTrue(ch >= 0x20 && ch <= 0x7E, "card " + cards.size() + " byte " + i + " = " + ch);
            }
            cards.add(c);
            if (c.startsWith("END     ")) {
                end = off;
                assertTrue(c.substring(3).isBlank(), "END card is not followed by spaces");
            }
        }
        assertTrue(end >= 0, "no END card");
        for (int i = end + 80; i < (end / 2880 + 1) * 2880; i++) {
            assertEquals(' ', (char) b[i], "header padding at byte " + i);
        }
        assertTrue(cards.get(0).startsWith("SIMPLE  =                    T"), cards.get(0));
        assertTrue(cards.get(1).startsWith("BITPIX  ="), cards.get(1));
        assertTrue(cards.get(2).startsWith("NAXIS   ="), cards.get(2));
        int naxis = Integer.parseInt(cards.get(2).substring(10, 30).trim());
        for (int i = 1; i <= naxis; i++) {
            assertTrue(cards.get(2 + i).startsWith(String.format("NAXIS%-3d=", i)), cards.get(2 + i));
        }
    }

    /**
     * CHECKSUM convention (Seaman, Pence &amp; Rots 2002, FITS checksum proposal): the 32-bit ones'-complement
     * sum of the whole HDU is −0, i.e. all ones. Computed here over the file bytes.
     */
    static void assertChecksumValid(Path file) throws Exception {
        byte[] b = Files.readAllBytes(file);
        assertEquals(0xFFFFFFFFL, FitsCheckSum.checksum(b), "HDU checksum is not -0");
    }
}
