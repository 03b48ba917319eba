package dev.nitid.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.restore.IterationRecord;
import java.io.PrintWriter;
import java.io.StringWriter;
import org.junit.jupiter.api.Test;

/** Progress goes to stderr only on a terminal (in place) or with --verbose (one line per iteration). */
class ProgressLineTest {
    private static final IterationRecord REC = new IterationRecord(0, 5, -1, 1.25, 3e-3, 2_000_000_000L);

    @Test
    void silentWhenStderrIsNotATerminal() {
        StringWriter s = new StringWriter();
        ProgressLine p = ProgressLine.create(new PrintWriter(s), false, new CommonOptions(), 10);
        p.onIteration(REC);
        p.finish();
        assertEquals("", s.toString());
    }

    @Test
    void redrawsInPlaceOnATerminal() {
        StringWriter s = new StringWriter();
        ProgressLine p = ProgressLine.create(new PrintWriter(s), true, new CommonOptions(), 10);
        p.onIteration(REC);
        p.finish();
        assertTrue(s.toString().startsWith("\r[############            ] plane 0  iteration 5  chi2/N 1.250"), s.toString());
        assertTrue(s.toString().endsWith(System.lineSeparator()), "finish ends the line");
    }

    @Test
    void verboseWithoutTerminalPrintsLines() {
        StringWriter s = new StringWriter();
        CommonOptions c = new CommonOptions();
        c.verbose = true;
        ProgressLine p = ProgressLine.create(new PrintWriter(s), false, c, 10);
        p.onIteration(REC);
        assertEquals("plane 0  iteration 5  chi2/N 1.250  change 3.00e-03  2.0 s" + System.lineSeparator(), s.toString());
    }
}
