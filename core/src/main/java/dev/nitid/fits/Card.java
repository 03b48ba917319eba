package dev.nitid.fits;

/**
 * One FITS header card (FITS Standard 4.0 §4.1).
 *
 * <p>{@code value} is the value exactly as FITS text: a string in single quotes with embedded quotes
 * doubled ({@code 'O''Neil'}), a logical {@code T} or {@code F}, or a number as written ({@code 1.5E-3},
 * {@code 42}). It is null for commentary cards (COMMENT, HISTORY, blank keyword, or any keyword without
 * {@code "= "}), whose text is in {@code comment}. Use {@link FitsHeader#getString(String)} and
 * {@link FitsHeader#getDouble(String)} to read values without the quoting.
 *
 * @param key     the keyword, upper case (up to 8 characters, or a longer HIERARCH-style key)
 * @param value   the value as FITS text, or null for commentary cards
 * @param comment the comment or commentary text, or null
 */
public record Card(String key, String value, String comment) {
    /**
     * Validates the card.
     *
     * @throws IllegalArgumentException if the key is null or any text has characters outside printable
     *                                  ASCII (0x20–0x7E), which FITS headers cannot hold
     */
    public Card {
        if (key == null) {
            throw new IllegalArgumentException("card key is null: use \"\" for a blank-keyword comment card");
        }
        checkAscii("key", key);
        if (value != null) {
            checkAscii("value of " + key, value);
        }
        if (comment != null) {
            checkAscii("comment of " + key, comment);
        }
    }

    /** @return true for a card without a value (COMMENT, HISTORY, blank keyword) */
    public boolean isCommentary() {
        return value == null;
    }

    /** @return true if the value is a quoted FITS string */
    public boolean isString() {
        return value != null && value.length() >= 2 && value.charAt(0) == '\'';
    }

    static void checkAscii(String what, String text) {
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (c < 0x20 || c > 0x7E) {
                throw new IllegalArgumentException(what + " contains character U+"
                        + String.format("%04X", (int) c) + " at position " + i
                        + ": FITS headers hold printable ASCII only (0x20-0x7E); replace or remove it");
            }
        }
    }
}
