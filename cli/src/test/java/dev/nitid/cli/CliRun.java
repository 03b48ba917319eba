package dev.nitid.cli;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.List;
import picocli.CommandLine;

/**
 * Runs {@code nitid} in-process through picocli's {@code execute}, with captured stdout and stderr, as the
 * tests of every command do.
 *
 * @param exit the exit code
 * @param out  what went to stdout
 * @param err  what went to stderr
 */
record CliRun(int exit, String out, String err) {

    /**
     * @param args the command line, without {@code nitid}
     * @return the exit code and both streams
     */
    static CliRun of(String... args) {
        CommandLine cl = NitidCommand.commandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int code = cl.execute(args);
        return new CliRun(code, out.toString(), err.toString());
    }

    /** Same as {@link #of}, for static import. */
    static CliRun run(String... args) {
        return of(args);
    }

    /** @return the exit code (same as {@link #exit()}) */
    int code() {
        return exit;
    }

    /** @return stderr lines */
    List<String> errLines() {
        return err.lines().toList();
    }
}
