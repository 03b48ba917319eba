package dev.nitid.cli;

import dev.nitid.fits.FitsException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.logging.Level;
import java.util.logging.Logger;
import picocli.CommandLine.Model.CommandSpec;

/**
 * The one place that turns a failure into {@code nitid: FILE: what is wrong (what to do)} on stderr and a
 * documented exit code ({@link ExitCode}). No stack trace unless {@code --debug}.
 *
 * <table>
 * <caption>Mapping</caption>
 * <tr><th>failure</th><th>exit code</th></tr>
 * <tr><td>{@link FitsException.Kind#NOT_FOUND}, {@code UNREADABLE}</td><td>66</td></tr>
 * <tr><td>{@code BAD_DATA}</td><td>65</td></tr>
 * <tr><td>{@code TOO_LARGE}, {@link OutOfMemoryError}</td><td>75</td></tr>
 * <tr><td>{@code OUTPUT_EXISTS}, {@code CANNOT_CREATE}</td><td>73</td></tr>
 * <tr><td>{@code WRITE_FAILED}</td><td>74</td></tr>
 * <tr><td>{@link IllegalArgumentException} (a setting the command line let through)</td><td>2</td></tr>
 * <tr><td>anything else: a bug</td><td>1</td></tr>
 * </table>
 */
public final class Failures {
    /**
     * nom-tam-fits logs through java.util.logging, whose default handler writes to the terminal; the
     * reader validates files itself, so the library's messages are noise for users. Held strongly so the
     * level set here is not lost when the logger is garbage-collected.
     */
    private static final Logger NOM_TAM = Logger.getLogger("nom.tam");

    private Failures() {
    }

    /** A command's work. */
    @FunctionalInterface
    public interface Body {
        /**
         * @return the exit code
         * @throws Exception any failure, mapped by {@link Failures#exitCode(Throwable)}
         */
        Integer call() throws Exception;
    }

    /**
     * Runs a command's body and maps any failure to one line on stderr and an exit code.
     *
     * @param spec   the command's spec (for its error writer)
     * @param common the shared options ({@code --debug})
     * @param body   the work
     * @return the exit code
     */
    public static int run(CommandSpec spec, CommonOptions common, Body body) {
        boolean debug = common != null && common.debug();
        NOM_TAM.setLevel(debug ? Level.ALL : Level.OFF);
        try {
            if (common != null) {
                common.validate();
            }
            Integer code = body.call();
            return code == null ? ExitCode.OK : code;
        } catch (Throwable t) {
            if (t instanceof Error && !(t instanceof OutOfMemoryError) && !(t instanceof StackOverflowError)) {
                throw (Error) t;
            }
            return report(spec.commandLine().getErr(), t, debug);
        }
    }

    /**
     * Prints one line for {@code t} (and its stack trace if {@code debug}) and returns its exit code.
     *
     * @param err   where to print
     * @param t     the failure
     * @param debug print the stack trace too
     * @return the exit code
     */
    public static int report(PrintWriter err, Throwable t, boolean debug) {
        err.println(line(t));
        if (debug) {
            t.printStackTrace(err);
        }
        err.flush();
        return exitCode(t);
    }

    /**
     * @param t a failure
     * @return the one-line message, starting with {@code nitid: }
     */
    public static String line(Throwable t) {
        if (t instanceof FitsException f) {
            return "nitid: " + where(f.file()) + oneLine(f.getMessage());
        }
        if (t instanceof IllegalArgumentException) {
            return "nitid: " + oneLine(t.getMessage());
        }
        if (t instanceof OutOfMemoryError) {
            return "nitid: not enough memory for this job (raise the Java heap, e.g. JAVA_OPTS=-Xmx8g, "
                    + "or process a smaller region)";
        }
        return "nitid: internal error: " + t.getClass().getSimpleName()
                + (t.getMessage() == null ? "" : ": " + oneLine(t.getMessage()))
                + " (this is a bug: rerun with --debug and report the output)";
    }

    /**
     * @param t a failure
     * @return its documented exit code
     */
    public static int exitCode(Throwable t) {
        if (t instanceof FitsException f) {
            return switch (f.kind()) {
                case NOT_FOUND, UNREADABLE -> ExitCode.NO_INPUT;
                case BAD_DATA -> ExitCode.DATA;
                case TOO_LARGE -> ExitCode.MEMORY;
                case OUTPUT_EXISTS, CANNOT_CREATE -> ExitCode.CANNOT_CREATE;
                case WRITE_FAILED -> ExitCode.IO;
            };
        }
        if (t instanceof IllegalArgumentException) {
            return ExitCode.USAGE;
        }
        if (t instanceof OutOfMemoryError) {
            return ExitCode.MEMORY;
        }
        return ExitCode.INTERNAL;
    }

    private static String where(Path file) {
        return file == null ? "" : file + ": ";
    }

    private static String oneLine(String s) {
        return s == null ? "" : s.replaceAll("[\\r\\n]+", " ").trim();
    }
}
