package dev.nitid.fits;

import java.nio.file.Path;
import java.util.Objects;

/**
 * A problem with a file (input or output): never a caller mistake, never a bug. It names the file, the HDU
 * (0 = primary, −1 if not applicable) and the header keyword involved (null if none).
 *
 * <p>{@link #getMessage()} is one sentence saying what is wrong followed, in parentheses, by what to do,
 * prefixed by the HDU and keyword when known, e.g. {@code "HDU 0, NAXIS2: the axis length is -5, which is
 * negative (the file is damaged; re-export it from the program that made it)"}. The file itself is not
 * part of the message: {@link #file()} carries it, so that a front end can print
 * {@code FILE: message}.
 */
public class FitsException extends Exception {
    private static final long serialVersionUID = 1L;

    /** The closed set of file problems; each maps to one documented exit code in the command line. */
    public enum Kind {
        /** The input file does not exist. */
        NOT_FOUND,
        /** The input exists but cannot be read (permissions, a folder, an I/O error while reading). */
        UNREADABLE,
        /** The content is not valid FITS, is truncated, or has a layout this library does not handle. */
        BAD_DATA,
        /** The image would not fit in the memory available to the Java heap. */
        TOO_LARGE,
        /** The output file already exists and overwriting was not allowed. */
        OUTPUT_EXISTS,
        /** The output cannot be created: missing folder, no permission, or it would replace an input. */
        CANNOT_CREATE,
        /** An I/O error while writing the output (disk full, device error); nothing was published. */
        WRITE_FAILED
    }

    private final transient Path file;
    private final int hdu;
    private final String keyword;
    private final Kind kind;
    private final String detail;

    /**
     * A {@link Kind#BAD_DATA} problem.
     *
     * @param file    the file concerned
     * @param hdu     the HDU index, 0 = primary, −1 if not applicable
     * @param keyword the header keyword concerned, or null
     * @param message one sentence: what is wrong, then what to do in parentheses
     */
    public FitsException(Path file, int hdu, String keyword, String message) {
        this(Kind.BAD_DATA, file, hdu, keyword, message, null);
    }

    /**
     * A problem of the given kind.
     *
     * @param kind    what sort of problem
     * @param file    the file concerned
     * @param hdu     the HDU index, 0 = primary, −1 if not applicable
     * @param keyword the header keyword concerned, or null
     * @param message one sentence: what is wrong, then what to do in parentheses
     */
    public FitsException(Kind kind, Path file, int hdu, String keyword, String message) {
        this(kind, file, hdu, keyword, message, null);
    }

    /**
     * A problem of the given kind with its underlying cause (kept for {@code --debug} stack traces).
     *
     * @param kind    what sort of problem
     * @param file    the file concerned
     * @param hdu     the HDU index, 0 = primary, −1 if not applicable
     * @param keyword the header keyword concerned, or null
     * @param message one sentence: what is wrong, then what to do in parentheses
     * @param cause   the underlying exception, or null
     */
    public FitsException(Kind kind, Path file, int hdu, String keyword, String message, Throwable cause) {
        super(compose(hdu, keyword, message), cause);
        this.kind = Objects.requireNonNull(kind, "kind");
        this.file = file;
        this.hdu = hdu < 0 ? -1 : hdu;
        this.keyword = keyword;
        this.detail = message;
    }

    private static String compose(int hdu, String keyword, String message) {
        StringBuilder sb = new StringBuilder();
        if (hdu >= 0) {
            sb.append("HDU ").append(hdu);
        }
        if (keyword != null) {
            sb.append(sb.length() > 0 ? ", " : "").append(keyword);
        }
        if (sb.length() > 0) {
            sb.append(": ");
        }
        return sb.append(message).toString();
    }

    /** @return the file concerned (may be null only when no file is involved) */
    public Path file() {
        return file;
    }

    /** @return the HDU index, 0 = primary, or −1 if not applicable */
    public int hdu() {
        return hdu;
    }

    /** @return the header keyword concerned, or null */
    public String keyword() {
        return keyword;
    }

    /** @return what sort of problem this is */
    public Kind kind() {
        return kind;
    }

    /** @return the sentence given at construction, without the HDU/keyword prefix */
    public String detail() {
        return detail;
    }
}
