/**
 * The {@code nitid} command line: {@link dev.nitid.cli.NitidCommand} and one picocli command per
 * subcommand. Each parses its options, builds the core settings records, calls {@code nitid-core} and
 * prints; failures become one stderr line and an {@link dev.nitid.cli.ExitCode} through
 * {@link dev.nitid.cli.Failures}. No algorithm lives here.
 */
package dev.nitid.cli;
