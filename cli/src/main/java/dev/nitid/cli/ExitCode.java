package dev.nitid.cli;

/**
 * The documented exit codes of {@code nitid}, following the BSD {@code sysexits.h} numbers where one fits
 * (common practice, no source beyond that header).
 */
public final class ExitCode {
    private ExitCode() {
    }

    /** The work was done. */
    public static final int OK = 0;
    /** An internal error: a bug; rerun with {@code --debug} and report the stack trace. */
    public static final int INTERNAL = 1;
    /** The command line is wrong: unknown option, missing or invalid value. */
    public static final int USAGE = 2;
    /** The input data are bad: not FITS, truncated, unsupported layout, no usable stars. */
    public static final int DATA = 65;
    /** An input file is missing or unreadable. */
    public static final int NO_INPUT = 66;
    /** The output cannot be created, or exists and {@code --overwrite} was not given. */
    public static final int CANNOT_CREATE = 73;
    /** An I/O error while writing. */
    public static final int IO = 74;
    /** Not enough memory for the job: raise the heap ({@code JAVA_OPTS=-Xmx…}) or process a smaller region. */
    public static final int MEMORY = 75;
}
