package dev.nitid.cli;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.Properties;
import picocli.AutoComplete;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * The {@code nitid} command: PSF modelling, measurement and deconvolution of astronomical images.
 * Each subcommand parses its options, builds a settings record, calls {@code nitid-core} and prints.
 */
@Command(name = "nitid",
        mixinStandardHelpOptions = true,
        versionProvider = NitidCommand.Version.class,
        description = {
            "Restores detail in astronomical images by PSF-based deconvolution, models and measures "
                    + "PSFs, and makes synthetic star fields with known truth.",
            "",
            "Caution: deconvolved images are for viewing and morphology, not for photometry or "
                    + "astrometry unless you have validated them for that use.",
            ""},
        subcommands = {
            CommandLine.HelpCommand.class,
            SharpenCommand.class,
            PsfCommand.class,
            SimulateCommand.class,
            InfoCommand.class,
            MeasureCommand.class,
            AutoComplete.GenerateCompletion.class,
        },
        footerHeading = "%nExit codes:%n",
        footer = {
            "  0   success",
            "  1   internal error (rerun with --debug and report it)",
            "  2   wrong command line",
            "  65  bad input data",
            "  66  input missing or unreadable",
            "  73  output cannot be created or already exists",
            "  74  I/O error while writing",
            "  75  not enough memory (raise -Xmx in JAVA_OPTS)"})
public final class NitidCommand implements Runnable {

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    /**
     * Builds the command line with Nitid's error handling: usage errors exit 2, other exceptions 1.
     *
     * @return the configured command line
     */
    public static CommandLine commandLine() {
        CommandLine cl = new CommandLine(new NitidCommand());
        cl.setExitCodeExceptionMapper(t -> t instanceof CommandLine.ParameterException ? ExitCode.USAGE : ExitCode.INTERNAL);
        return cl;
    }

    /**
     * Runs the command and exits the JVM with its code, so that no worker pool keeps the JVM alive.
     *
     * @param args command-line arguments
     */
    public static void main(String[] args) {
        int code = commandLine().execute(args);
        System.exit(code);
    }

    /** @return this tool's version from the build, or "unknown" when run from unpackaged classes */
    public static String toolVersion() {
        try (InputStream in = NitidCommand.class.getResourceAsStream("version.properties")) {
            if (in == null) {
                return "unknown";
            }
            Properties p = new Properties();
            p.load(in);
            return p.getProperty("version", "unknown");
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Prints the tool and Java versions. */
    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            return new String[] {
                "nitid " + toolVersion(),
                "Java " + System.getProperty("java.version") + " (" + System.getProperty("java.vm.name") + ", "
                        + System.getProperty("java.vendor") + ")"};
        }
    }
}
