package dev.nitid.cli;

import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * Options every {@code nitid} command shares; mix it in with {@code @Mixin CommonOptions common;} and run
 * the command's body through {@link Failures#run(CommandSpec, CommonOptions, Failures.Body)}.
 */
public final class CommonOptions {
    @Spec(Spec.Target.MIXEE)
    CommandSpec mixee;

    @Option(names = "--debug", description = "On error, print the full stack trace as well.")
    boolean debug;

    @Option(names = {"-q", "--quiet"}, description = "Print only errors.")
    boolean quiet;

    @Option(names = {"-v", "--verbose"}, description = "Print progress and details.")
    boolean verbose;

    @Option(names = "--threads", paramLabel = "N",
            description = "Worker threads (default: all available processors). Results do not depend on it.")
    int threads = 0;

    /**
     * Checks the values picocli cannot check by type; {@link Failures#run} calls it before the command's body.
     *
     * @throws IllegalArgumentException naming the option and the fix
     */
    public void validate() {
        if (threads < 0 || (threads == 0 && threadsGiven())) {
            throw new IllegalArgumentException("--threads is " + threads
                    + ", but at least 1 thread is needed (give a positive number or leave the option out)");
        }
    }

    private boolean threadsGiven() {
        return mixee != null && mixee.commandLine() != null
                && mixee.commandLine().getParseResult() != null
                && mixee.commandLine().getParseResult().hasMatchedOption("--threads");
    }

    /** @return true if stack traces are wanted */
    public boolean debug() {
        return debug;
    }

    /** @return true if only errors should be printed */
    public boolean quiet() {
        return quiet;
    }

    /** @return true if details should be printed (never together with quiet: quiet wins) */
    public boolean verbose() {
        return verbose && !quiet;
    }

    /** @return the worker thread count: the option's value, or the available processors */
    public int threads() {
        return threads > 0 ? threads : Runtime.getRuntime().availableProcessors();
    }
}
