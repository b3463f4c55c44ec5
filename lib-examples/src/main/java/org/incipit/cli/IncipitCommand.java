package org.incipit.cli;

import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;

/**
 * The top command {@code incipit}: lists the subcommands; does nothing by itself. Its
 * subcommands are registered by {@link Main#commandLine}.
 */
@Command(name = "incipit",
        mixinStandardHelpOptions = true,
        versionProvider = VersionProvider.class,
        description = {
            "Early-outbreak parameter estimation with growth, truncation and censoring corrections.",
            "",
            "Model-based estimates from early, sparse data inform but do not replace the judgement "
                    + "of the responsible public-health authority."},
        footer = {"",
            "Exit codes: 0 success, 1 internal error, 2 bad usage or input,",
            "            3 estimation failed.",
            "Input files: see 'incipit help check'."})
public final class IncipitCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    /** Creates the top command. */
    public IncipitCommand() {
    }

    /** Without a subcommand: prints the usage to stderr and returns {@link ExitCode#BAD_INPUT}. */
    @Override
    public Integer call() {
        spec.commandLine().getErr().println("incipit: a command is required");
        spec.commandLine().usage(spec.commandLine().getErr());
        return ExitCode.BAD_INPUT;
    }
}
