package dev.nitid.fits;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.regex.Pattern;

/**
 * An immutable, ordered FITS header: the cards of one HDU in file order. Every {@code with…} method returns
 * a new header; the original is never modified, so a header read from a file can be shared freely.
 *
 * <p>Keys are compared upper-case. A {@code with…} call replaces the first card with that key in place
 * (keeping its position) and drops any later duplicates, or appends a new card at the end. Commentary cards
 * (COMMENT, HISTORY) are only ever appended.
 *
 * <p>Thread-safe (immutable).
 */
public final class FitsHeader {
    /**
     * Text per COMMENT/HISTORY card. The standard gives bytes 9–80 (72 characters, FITS Standard 4.0
     * §4.4.2.4); nom-tam-fits 1.21.2 writes a space in byte 9 and starts the text in byte 10, leaving 71,
     * and 70 keeps a margin.
     */
    static final int COMMENTARY_WIDTH = 70;

    private static final FitsHeader EMPTY = new FitsHeader(List.of());

    private final List<Card> cards;

    private FitsHeader(List<Card> cards) {
        this.cards = cards;
    }

    /** @return a header without cards */
    public static FitsHeader empty() {
        return EMPTY;
    }

    /**
     * A header holding the given cards in order.
     *
     * @param cards the cards (input, copied)
     * @return the header
     */
    public static FitsHeader of(List<Card> cards) {
        for (Card c : cards) {
            if (c == null) {
                throw new IllegalArgumentException("null card in header list: remove it");
            }
        }
        return new FitsHeader(List.copyOf(cards));
    }

    /** @return the cards in order (unmodifiable) */
    public List<Card> cards() {
        return cards;
    }

    /**
     * The first card with the given key.
     *
     * @param key keyword, any case
     * @return the card, if present
     */
    public Optional<Card> card(String key) {
        String k = key.toUpperCase(Locale.ROOT);
        for (Card c : cards) {
            if (c.key().equals(k)) {
                return Optional.of(c);
            }
        }
        return Optional.empty();
    }

    /**
     * The value of the first card with this key as text: a FITS string without its quotes (embedded
     * {@code ''} turned back into {@code '}, trailing spaces removed as FITS 4.0 §4.2.1 makes them
     * insignificant), or the raw text of a number or logical.
     *
     * @param key keyword, any case
     * @return the value, or empty if the key is absent or the card has no value
     */
    public Optional<String> getString(String key) {
        return card(key).filter(c -> c.value() != null).map(c -> unquote(c.value()));
    }

    /**
     * The numeric value of the first card with this key, read leniently: empty both when the card is absent
     * and when its value is not a number. Where a malformed value must not pass for a missing one (a
     * saturation level, a plate scale), ask {@link #malformedNumber(String)} too.
     *
     * @param key keyword, any case
     * @return the value, or empty if absent, without value, a string, a logical or not a number
     * @see #parseNumber(String) the number format accepted
     */
    public OptionalDouble getDouble(String key) {
        Optional<Card> c = card(key);
        if (c.isEmpty() || c.get().value() == null || c.get().isString()) {
            return OptionalDouble.empty();
        }
        return parseNumber(c.get().value());
    }

    /**
     * The value of the first card with this key as written, when the card has a value that is not a FITS
     * number ({@link #parseNumber(String)}): a string ({@code 'abc'}), a logical ({@code T}), or text such as
     * {@code 12,5}. This is what tells a malformed number from a missing one: {@link #getDouble(String)} is
     * empty for both.
     *
     * @param key keyword, any case
     * @return the offending value text (quotes kept), or empty when the key is absent, its value field is
     *         blank (an undefined value, FITS Standard 4.0 §4.1.2.3), or it holds a number
     */
    public Optional<String> malformedNumber(String key) {
        Optional<Card> c = card(key);
        if (c.isEmpty() || c.get().value() == null || c.get().value().isBlank()) {
            return Optional.empty();
        }
        String v = c.get().value();
        return !c.get().isString() && parseNumber(v).isPresent() ? Optional.empty() : Optional.of(v.trim());
    }

    /**
     * Reads FITS number text: an integer (FITS Standard 4.0 §4.2.3: optional sign, decimal digits) or a
     * real floating-point number (§4.2.4: optional sign, digits with an optional decimal point, an optional
     * exponent introduced by {@code E} or {@code D}); leading and trailing spaces are ignored, embedded
     * spaces are not. Lower-case {@code e}/{@code d} are accepted as well (lenient; the standard asks for
     * upper case). Java-only forms that {@link Double#parseDouble} would take ({@code NaN},
     * {@code Infinity}, hexadecimal, a trailing {@code f}) are not FITS numbers and are refused, as is a
     * value too large for a double.
     *
     * @param text the value text of a card
     * @return the number, or empty if the text is not a finite FITS number
     */
    public static OptionalDouble parseNumber(String text) {
        if (text == null) {
            return OptionalDouble.empty();
        }
        String t = text.trim();
        if (!NUMBER.matcher(t).matches()) {
            return OptionalDouble.empty();
        }
        double v = Double.parseDouble(t.replace('D', 'E').replace('d', 'e'));
        return Double.isFinite(v) ? OptionalDouble.of(v) : OptionalDouble.empty();
    }

    /** FITS Standard 4.0 §4.2.3–4.2.4 number text (see {@link #parseNumber(String)}). */
    private static final Pattern NUMBER = Pattern.compile("[+-]?(\\d+\\.?\\d*|\\.\\d+)([EeDd][+-]?\\d+)?");

    /**
     * Sets a string-valued card.
     *
     * @param key     keyword: 1–8 characters of A–Z, 0–9, '-', '_' (lower case is upper-cased)
     * @param value   the string (printable ASCII; not yet quoted)
     * @param comment the comment, or null
     * @return a new header
     * @throws IllegalArgumentException if the key is illegal or a text is not printable ASCII
     */
    public FitsHeader with(String key, String value, String comment) {
        if (value == null) {
            throw new IllegalArgumentException("value for " + key + " is null: pass \"\" for an empty string");
        }
        Card.checkAscii("value of " + key, value);
        return set(new Card(checkKey(key), quote(value), comment));
    }

    /**
     * Sets a real-valued card.
     *
     * @param key     keyword, as for {@link #with(String, String, String)}
     * @param value   a finite number (FITS has no NaN or infinity in headers)
     * @param comment the comment, or null
     * @return a new header
     * @throws IllegalArgumentException if the key is illegal or the value is not finite
     */
    public FitsHeader with(String key, double value, String comment) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException("value for " + key + " is " + value
                    + ": FITS header numbers must be finite; store it as a string or leave the card out");
        }
        return set(new Card(checkKey(key), Double.toString(value), comment));
    }

    /**
     * Sets an integer-valued card.
     *
     * @param key     keyword, as for {@link #with(String, String, String)}
     * @param value   the integer
     * @param comment the comment, or null
     * @return a new header
     */
    public FitsHeader with(String key, long value, String comment) {
        return set(new Card(checkKey(key), Long.toString(value), comment));
    }

    /**
     * Sets a logical card ({@code T} or {@code F}).
     *
     * @param key     keyword, as for {@link #with(String, String, String)}
     * @param value   the logical value
     * @param comment the comment, or null
     * @return a new header
     */
    public FitsHeader with(String key, boolean value, String comment) {
        return set(new Card(checkKey(key), value ? "T" : "F", comment));
    }

    /**
     * Appends HISTORY cards holding {@code text}, split at spaces into pieces of at most 70 characters
     * (a word longer than that is cut).
     *
     * @param text printable ASCII text
     * @return a new header
     * @throws IllegalArgumentException if the text is not printable ASCII
     */
    public FitsHeader withHistory(String text) {
        return withCommentary("HISTORY", text);
    }

    /**
     * Appends COMMENT cards holding {@code text}, split like {@link #withHistory(String)}.
     *
     * @param text printable ASCII text
     * @return a new header
     */
    public FitsHeader withComment(String text) {
        return withCommentary("COMMENT", text);
    }

    /**
     * Removes every card with this key.
     *
     * @param key keyword, any case
     * @return a new header
     */
    public FitsHeader without(String key) {
        String k = key.toUpperCase(Locale.ROOT);
        List<Card> out = new ArrayList<>(cards.size());
        for (Card c : cards) {
            if (!c.key().equals(k)) {
                out.add(c);
            }
        }
        return out.size() == cards.size() ? this : new FitsHeader(Collections.unmodifiableList(out));
    }

    private FitsHeader withCommentary(String key, String text) {
        if (text == null) {
            throw new IllegalArgumentException(key + " text is null: pass a string");
        }
        Card.checkAscii(key + " text", text);
        List<Card> out = new ArrayList<>(cards);
        for (String piece : split(text, COMMENTARY_WIDTH)) {
            out.add(new Card(key, null, piece));
        }
        return new FitsHeader(Collections.unmodifiableList(out));
    }

    static List<String> split(String text, int width) {
        List<String> pieces = new ArrayList<>();
        String rest = text.strip();
        while (rest.length() > width) {
            int cut = rest.lastIndexOf(' ', width);
            if (cut <= 0) {
                cut = width;
            }
            pieces.add(rest.substring(0, cut).stripTrailing());
            rest = rest.substring(cut).stripLeading();
        }
        pieces.add(rest);
        return pieces;
    }

    private FitsHeader set(Card card) {
        List<Card> out = new ArrayList<>(cards.size() + 1);
        boolean placed = false;
        for (Card c : cards) {
            if (c.key().equals(card.key()) && !c.isCommentary()) {
                if (!placed) {
                    out.add(card);
                    placed = true;
                }
            } else {
                out.add(c);
            }
        }
        if (!placed) {
            out.add(card);
        }
        return new FitsHeader(Collections.unmodifiableList(out));
    }

    private static String checkKey(String key) {
        if (key == null || key.isEmpty() || key.length() > 8) {
            throw new IllegalArgumentException("keyword '" + key
                    + "' must have 1 to 8 characters (FITS Standard 4.0 §4.1.2.1): shorten it");
        }
        String k = key.toUpperCase(Locale.ROOT);
        for (int i = 0; i < k.length(); i++) {
            char c = k.charAt(i);
            if (!((c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '-' || c == '_')) {
                throw new IllegalArgumentException("keyword '" + key + "' has character '" + c
                        + "': FITS keywords use A-Z, 0-9, '-' and '_' only");
            }
        }
        if (k.equals("COMMENT") || k.equals("HISTORY")) {
            throw new IllegalArgumentException("keyword " + k + " is commentary: use withHistory/withComment");
        }
        return k;
    }

    /** Quotes a string as FITS text, doubling embedded quotes (FITS Standard 4.0 §4.2.1.1). */
    static String quote(String s) {
        return "'" + s.replace("'", "''") + "'";
    }

    /** Inverse of {@link #quote(String)}; returns other text unchanged. */
    static String unquote(String v) {
        if (v.length() >= 2 && v.charAt(0) == '\'' && v.charAt(v.length() - 1) == '\'') {
            return v.substring(1, v.length() - 1).replace("''", "'").stripTrailing();
        }
        return v;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof FitsHeader h && h.cards.equals(cards);
    }

    @Override
    public int hashCode() {
        return cards.hashCode();
    }

    @Override
    public String toString() {
        return "FitsHeader[" + cards.size() + " cards]";
    }
}
