package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.nio.ByteBuffer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * Number cards: a malformed value is told apart from a missing one, and the reader refuses a malformed
 * structural keyword. The number format is the FITS Standard 4.0 §4.2.3 (integer) and §4.2.4 (real
 * floating-point: sign, digits, decimal point, exponent letter E or D), as summarised from memory; BLANK
 * being a stored integer is §4.4.2.5 (reference README §6, rule 6).
 */
class HeaderNumbersTest {
    @TempDir
    Path tmp;

    private static FitsHeader one(String key, String valueText) {
        return FitsHeader.of(List.of(new Card(key, valueText, null)));
    }

    @ParameterizedTest
    @CsvSource({
        // text as written in the card, value (FITS 4.0 §4.2.3-4.2.4 examples of the forms allowed)
        "42, 42",
        "+42, 42",
        "-7, -7",
        "1.5, 1.5",
        "'.5', 0.5",
        "'5.', 5",
        "1.5E3, 1500",
        "1.5D3, 1500",
        "-2.5E-2, -0.025",
        "'   65535   ', 65535"})
    void fitsNumbersRead(String text, double expected) {
        assertEquals(OptionalDouble.of(expected), FitsHeader.parseNumber(text), text);
        FitsHeader h = one("X", text);
        assertEquals(OptionalDouble.of(expected), h.getDouble("X"), text);
        assertEquals(Optional.empty(), h.malformedNumber("X"), text);
    }

    @ParameterizedTest
    @ValueSource(strings = {
        // Java's Double.parseDouble takes all of these; none is a FITS number (§4.2.3-4.2.4)
        "NaN", "Infinity", "-Infinity", "0x1p3", "5f", "5d", "1E400",
        // plain junk, a decimal comma, embedded space, a logical
        "abc", "12,5", "1 000", "T", "E5", "."})
    void notNumbersAreMalformedNotMissing(String text) {
        assertTrue(FitsHeader.parseNumber(text).isEmpty(), text);
        FitsHeader h = one("SATURATE", text);
        assertTrue(h.getDouble("SATURATE").isEmpty(), "lenient reader: empty for " + text);
        assertEquals(Optional.of(text), h.malformedNumber("SATURATE"), "malformed, not missing: " + text);
    }

    @Test
    void aStringIsMalformedAndAbsentOrBlankIsMissing() {
        FitsHeader h = FitsHeader.empty().with("SATURATE", "abc", null).with("FOCALLEN", "1000", null)
                .with("TEMP", -10.0, null);
        assertEquals(Optional.of("'abc'"), h.malformedNumber("SATURATE"));
        // a number inside quotes is a string (FITS 4.0 §4.2.1), not a number
        assertEquals(Optional.of("'1000'"), h.malformedNumber("FOCALLEN"));
        assertTrue(h.getDouble("FOCALLEN").isEmpty());
        assertEquals(Optional.empty(), h.malformedNumber("TEMP"));
        assertEquals(Optional.empty(), h.malformedNumber("NOSUCH"), "absent");
        // a blank value field is an undefined value (FITS 4.0 §4.1.2.3), not a malformed one
        assertEquals(Optional.empty(), one("UNDEF", "").malformedNumber("UNDEF"));
        assertEquals(Optional.empty(), FitsHeader.empty().withHistory("x").malformedNumber("HISTORY"));
    }

    /** A 2×1 BITPIX 16 image with the given extra cards; pixels 1 and -32768 (big-endian). */
    private Path tinyI16(String name, String... extra) throws Exception {
        String[] cards = new String[5 + extra.length];
        cards[0] = ReaderLimitsTest.card("SIMPLE", "T");
        cards[1] = ReaderLimitsTest.card("BITPIX", 16);
        cards[2] = ReaderLimitsTest.card("NAXIS", 2);
        cards[3] = ReaderLimitsTest.card("NAXIS1", 2);
        cards[4] = ReaderLimitsTest.card("NAXIS2", 1);
        System.arraycopy(extra, 0, cards, 5, extra.length);
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        out.write(ReaderLimitsTest.header(cards));
        byte[] data = new byte[2880];
        ByteBuffer.wrap(data).putShort((short) 1).putShort((short) -32768);
        out.write(data);
        Path f = tmp.resolve(name);
        Files.write(f, out.toByteArray());
        return f;
    }

    @Test
    void wellFormedScalingAndBlankAreApplied() throws Exception {
        // physical = BZERO + BSCALE × stored; BLANK names the stored value (FITS 4.0 §5.3, README §6 rules 5-6)
        Path f = tinyI16("ok.fits", ReaderLimitsTest.card("BZERO", "1.0D1"), ReaderLimitsTest.card("BSCALE", 2),
                ReaderLimitsTest.card("BLANK", -32768));
        FitsImage img = FitsReader.read(f);
        assertEquals(12f, img.image().get(0, 0), 0f);
        assertTrue(Float.isNaN(img.image().get(1, 0)));
        assertEquals(1, img.maskedPixels());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        "BZERO|'abc'",
        "BZERO|0x10",
        "BSCALE|NaN",
        "BSCALE|T",
        "BLANK|'x'",
        "BLANK|3.5",
        "BLANK|40000"})
    void malformedStructuralNumberIsBadData(String key, String value) throws Exception {
        Path f = tinyI16("bad.fits", ReaderLimitsTest.card(key, value));
        FitsException e = assertThrows(FitsException.class, () -> FitsReader.read(f));
        assertEquals(FitsException.Kind.BAD_DATA, e.kind(), e.getMessage());
        assertEquals(key, e.keyword(), e.getMessage());
        assertEquals(0, e.hdu());
        assertTrue(e.getMessage().contains("FITS Standard 4.0"), e.getMessage());
    }

    @Test
    void blankValueFieldKeepsTheDefault() throws Exception {
        // an undefined value (FITS 4.0 §4.1.2.3) is treated as absent: defaults 0 and 1 (README §6 rule 5)
        Path f = tinyI16("undef.fits", "BZERO   =");
        assertArrayEquals(new float[] {1f, -32768f}, FitsReader.read(f).image().plane(0));
    }
}
