/**
 * The {@code incipit} command-line application (picocli).
 *
 * <p>{@link org.incipit.cli.Main} runs the top command {@link org.incipit.cli.IncipitCommand};
 * each subcommand extends {@link org.incipit.cli.AbstractCommand} and mixes in
 * {@link org.incipit.cli.InputOptions} (reading) and {@link org.incipit.cli.OutputOptions}
 * ({@code --json}). Exit codes ({@link org.incipit.cli.ExitCode}): 0 success, 2 bad usage or
 * input (message on stderr naming file, line and column), 3 estimation failed, 1 internal
 * error.
 *
 * <h2>Commands</h2>
 * {@code check} (read a file, no estimation), {@code simulate} (write a simulated scenario in the
 * input formats with its true values; the defaults regenerate the shipped demo data),
 * {@code growth}, {@code reproduction}, {@code intervals}, {@code delays}, {@code incubation},
 * {@code fatality} (one estimator each, {@code --json} for one JSON object), {@code study},
 * and {@code demo} / {@code analyse} (the whole analysis written as a report folder with
 * {@code report.html}, {@code results.json} and {@code figures/}).
 *
 * <h2>Adding a command</h2>
 * <pre>{@code
 * @Command(name = "delays", mixinStandardHelpOptions = true, description = "...")
 * public final class DelaysCommand extends AbstractCommand {
 *     @Parameters(index = "0", paramLabel = "FILE") Path file;
 *     @Option(names = "--cutoff", paramLabel = "TIME") String cutoff;
 *     @Mixin InputOptions input;
 *
 *     protected int run() {
 *         ReadResult<DelayPairs> read = CsvInput.delays(file, input.readOptions(), cutoff);
 *         reportSkipped(read);                       // skipped rows -> stderr
 *         ... estimate (EstimationException -> exit 3) ...
 *         emit(JsonOutput.fits(summaries, best),     // --json
 *              TextTable.of("family", "mean", ...)); // otherwise
 *         return ExitCode.OK;
 *     }
 * }
 * }</pre>
 * and add it to {@code Main}'s list of subcommands ({@code SUBCOMMANDS} and {@code subcommand}).
 */
package org.incipit.cli;
