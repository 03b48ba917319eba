package dev.nitid.cli;

import dev.nitid.restore.IterationRecord;
import dev.nitid.restore.ProgressListener;
import java.io.PrintWriter;
import java.util.Locale;

/**
 * A one-line progress display on stderr for long steps: rewritten in place with a carriage return, and
 * shown only when stderr is a terminal (never in logs or pipes). With {@code --verbose} and no terminal,
 * each iteration is printed on its own line instead.
 */
final class ProgressLine implements ProgressListener {
    private static final int BAR = 24;
    private final PrintWriter err;
    private final boolean inPlace;
    private final boolean lines;
    private final int expected;
    private boolean dirty;

    private ProgressLine(PrintWriter err, boolean inPlace, boolean lines, int expected) {
        this.err = err;
        this.inPlace = inPlace;
        this.lines = lines;
        this.expected = expected;
    }

    /**
     * @param err      where to draw (the command's stderr)
     * @param terminal whether stderr is a terminal ({@code System.console() != null})
     * @param common   the quiet/verbose choice
     * @param expected iterations expected (the cap when stopping automatically), ≥ 1
     * @return the listener
     */
    static ProgressLine create(PrintWriter err, boolean terminal, CommonOptions common, int expected) {
        boolean quiet = common != null && common.quiet();
        boolean verbose = common != null && common.verbose();
        return new ProgressLine(err, terminal && !quiet, !terminal && verbose && !quiet, Math.max(1, expected));
    }

    @Override
    public void onIteration(IterationRecord r) {
        if (!inPlace && !lines) {
            return;
        }
        String text = String.format(Locale.ROOT, "plane %d  iteration %d  chi2/N %.3f  change %.2e  %.1f s",
                r.plane(), r.iteration(), r.chiSquare(), r.relativeChange(), r.elapsedNanos() / 1e9);
        if (inPlace) {
            int filled = Math.min(BAR, (int) Math.round(BAR * Math.min(1.0, r.iteration() / (double) expected)));
            err.print("\r[" + "#".repeat(filled) + " ".repeat(BAR - filled) + "] " + text + "   ");
            dirty = true;
        } else {
            err.println(text);
        }
        err.flush();
    }

    /** Ends the in-place line so that the next message starts on a fresh line. */
    void finish() {
        if (dirty) {
            err.println();
            err.flush();
            dirty = false;
        }
    }
}
