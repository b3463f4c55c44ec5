/**
 * The {@code incipit} command-line application (picocli).
 *
 * <p>{@link org.incipit.cli.Main} runs the top command {@link org.incipit.cli.IncipitCommand};
 * each subcommand extends {@link org.incipit.cli.AbstractCommand} and mixes in
 * {@link org.incipit.cli.InputOptions} (reading) and {@link org.incipit.cli.OutputOptions}
 * ({@code --json}). Exit codes ({@link org.incipit.cli.ExitCode}): 0 success, 2 bad usage or
 * input (message on stderr naming file, line and column), 3 estimation failed, 1 internal
 * error.
 */
package org.incipit.cli;
