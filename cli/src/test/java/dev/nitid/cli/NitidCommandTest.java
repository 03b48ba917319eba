package dev.nitid.cli;

import static dev.nitid.cli.CliRun.run;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/** The root command: version, help, completion script and the usage exit code. */
class NitidCommandTest {



    @Test
    void versionNamesToolAndJava() {
        CliRun r = run("--version");
        assertEquals(ExitCode.OK, r.code());
        assertTrue(r.out().startsWith("nitid "), r.out());
        assertTrue(r.out().contains("Java " + System.getProperty("java.version")), r.out());
    }

    @Test
    void helpListsCommandsExitCodesAndTheCaution() {
        CliRun r = run("--help");
        assertEquals(ExitCode.OK, r.code());
        assertTrue(r.out().contains("generate-completion"), r.out());
        assertTrue(r.out().contains("not for photometry"), r.out());
        assertTrue(r.out().contains("75  not enough memory"), r.out());
    }

    @Test
    void unknownOptionIsAUsageError() {
        CliRun r = run("--no-such-option");
        assertEquals(ExitCode.USAGE, r.code());
        assertTrue(r.err().contains("--no-such-option"), r.err());
    }

    @Test
    void completionScriptIsABashFunctionThatZshCanLoad() {
        CliRun r = run("generate-completion");
        assertEquals(ExitCode.OK, r.code());
        // picocli's script defines a completion function and registers it with `complete`;
        // zsh runs it through bashcompinit (picocli 4.7 documentation, "Autocomplete").
        assertTrue(r.out().contains("complete -F"), r.out().substring(0, Math.min(400, r.out().length())));
        assertTrue(r.out().contains("bashcompinit"), "zsh support line");
    }
}
