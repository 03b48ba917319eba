package dev.nitid.cli;

import java.io.PrintWriter;
import java.io.StringWriter;
import picocli.CommandLine;

/** Runs {@code nitid} in-process with captured stdout and stderr, as the house style asks. */
record CliRun(int exit, String out, String err) {
    static CliRun of(String... args) {
        CommandLine cl = NitidCommand.commandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int code = cl.execute(args);
        return new CliRun(code, out.toString(), err.toString());
    }

    /** @return stderr lines */
    java.util.List<String> errLines() {
        return err.lines().toList();
    }
}
