package dev.nitid.psf;

/**
 * One parameter of a PSF model as it goes into a file header: a short keyword of at most 8 characters
 * (upper case letters, digits, '-' or '_'), a value (number or text) and a one-line comment with the unit.
 *
 * @param key     keyword, 1–8 characters
 * @param value   a {@link Double}, {@link Long}, {@link Boolean} or {@link String}
 * @param comment meaning and unit
 */
public record PsfParameter(String key, Object value, String comment) {

    /** Validates the keyword and the value type. */
    public PsfParameter {
        if (key == null || !key.matches("[A-Z0-9_-]{1,8}")) {
            throw new IllegalArgumentException("keyword '" + key
                    + "' is not 1-8 upper-case letters, digits, '-' or '_': use a FITS-style keyword");
        }
        if (!(value instanceof Double || value instanceof Long || value instanceof Boolean
                || value instanceof String)) {
            throw new IllegalArgumentException("value of " + key + " is "
                    + (value == null ? "null" : value.getClass().getSimpleName())
                    + ": use a Double, Long, Boolean or String");
        }
        if (comment == null) {
            comment = "";
        }
    }

    /** @return a numeric parameter */
    public static PsfParameter of(String key, double value, String comment) {
        return new PsfParameter(key, value, comment);
    }

    /** @return an integer parameter */
    public static PsfParameter of(String key, long value, String comment) {
        return new PsfParameter(key, value, comment);
    }

    /** @return a text parameter */
    public static PsfParameter of(String key, String value, String comment) {
        return new PsfParameter(key, value, comment);
    }
}
