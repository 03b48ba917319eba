package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;

/** FitsHeader value rules, from the FITS Standard 4.0 §4.1–4.2 (keywords, strings, numbers, commentary). */
class FitsHeaderTest {
    @Test
    void withReplacesInPlaceAndAppendsNewKeys() {
        FitsHeader h = FitsHeader.empty().with("A", 1L, null).with("B", 2L, null).with("a", 3L, "again");
        assertEquals(List.of("A", "B"), h.cards().stream().map(Card::key).toList());
        assertEquals(3.0, h.getDouble("A").getAsDouble());
        assertEquals("again", h.cards().get(0).comment());
    }

    @Test
    void stringsAreQuotedWithDoubledQuotes() {
        // FITS 4.0 §4.2.1.1: a quote inside a string is written as two quotes.
        FitsHeader h = FitsHeader.empty().with("OBSERVER", "O'Neil", null);
        assertEquals("'O''Neil'", h.cards().get(0).value());
        assertEquals("O'Neil", h.getString("OBSERVER").orElseThrow());
        assertTrue(h.getDouble("OBSERVER").isEmpty(), "a string is not a number");
    }

    @Test
    void numbersAcceptTheDExponent() {
        // FITS 4.0 §4.2.4: 'D' may mark the exponent of a floating-point value.
        FitsHeader h = FitsHeader.of(List.of(new Card("X", "1.5D3", null), new Card("L", "T", null)));
        assertEquals(OptionalDouble.of(1500.0), h.getDouble("X"));
        assertEquals("T", h.getString("L").orElseThrow());
    }

    @Test
    void historyIsSplitAtSpacesWithinOneCard() {
        String text = "word ".repeat(40).strip();
        FitsHeader h = FitsHeader.empty().withHistory(text);
        assertTrue(h.cards().size() >= 3);
        StringBuilder joined = new StringBuilder();
        for (Card c : h.cards()) {
            assertEquals("HISTORY", c.key());
            assertTrue(c.comment().length() <= FitsHeader.COMMENTARY_WIDTH, c.comment());
            joined.append(joined.length() > 0 ? " " : "").append(c.comment());
        }
        assertEquals(text, joined.toString());
    }

    @Test
    void illegalKeysAndTextAreCallerMistakes() {
        FitsHeader h = FitsHeader.empty();
        assertThrows(IllegalArgumentException.class, () -> h.with("TOOLONGKEY", 1L, null));
        assertThrows(IllegalArgumentException.class, () -> h.with("BAD KEY", 1L, null));
        assertThrows(IllegalArgumentException.class, () -> h.with("OBJECT", "caf\u00e9", null));
        assertThrows(IllegalArgumentException.class, () -> h.with("X", Double.NaN, null));
        assertThrows(IllegalArgumentException.class, () -> h.withHistory("tab\there"));
    }

    @Test
    void headersAreImmutable() {
        FitsHeader a = FitsHeader.empty().with("A", 1L, null);
        FitsHeader b = a.with("A", 2L, null).withHistory("x");
        assertEquals(1.0, a.getDouble("A").getAsDouble());
        assertEquals(1, a.cards().size());
        assertEquals(2, b.cards().size());
        assertThrows(UnsupportedOperationException.class, () -> a.cards().add(new Card("B", "1", null)));
    }
}
