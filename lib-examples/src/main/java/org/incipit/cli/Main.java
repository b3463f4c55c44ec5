package org.incipit.cli;

import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.util.List;
import org.incipit.core.EstimationException;
import org.incipit.io.InputException;
import picocli.CommandLine;

/** Entry point of the {@code incipit} command-line application. */
public final class Main {

    /** The subcommands of {@link IncipitCommand}, in the order of its usage help. */
    static final List<String> SUBCOMMANDS = List.of("check", "simulate", "growth", "reproduction", "intervals",
            "delays", "incubation", "fatality", "study", "demo", "analyse", "help");

    private Main() {
    }

    /** A new instance of the named subcommand (one of {@link #SUBCOMMANDS}). */
    static Object subcommand(String name) {
        return switch (name) {
            case "check" -> new CheckCommand();
            case "simulate" -> new SimulateCommand();
            case "growth" -> new GrowthCommand();
            case "reproduction" -> new ReproductionCommand();
            case "intervals" -> new IntervalsCommand();
            case "delays" -> new DelaysCommand();
            case "incubation" -> new IncubationCommand();
            case "fatality" -> new FatalityCommand();
            case "study" -> new StudyCommand();
            case "demo" -> new DemoCommand();
            case "analyse" -> new AnalyseCommand();
            case "help" -> new CommandLine.HelpCommand();
            default -> throw new IllegalArgumentException("no subcommand '" + name + "'");
        };
    }

    /**
     * Runs the application and exits with its exit code (see {@link ExitCode}).
     *
     * @param args command-line arguments
     */
    public static void main(String[] args) {
        System.setProperty("java.awt.headless", "true"); // figures are drawn without a display
        PrintWriter out = new PrintWriter(new java.io.OutputStreamWriter(System.out, StandardCharsets.UTF_8), true);
        PrintWriter err = new PrintWriter(new java.io.OutputStreamWriter(System.err, StandardCharsets.UTF_8), true);
        int code = run(out, err, args);
        System.exit(code);
    }

    /**
     * Runs the application without exiting, writing to the given streams (for tests and
     * embedding).
     *
     * @param out  standard output
     * @param err  standard error
     * @param args command-line arguments
     * @return the exit code (see {@link ExitCode})
     */
    public static int run(PrintWriter out, PrintWriter err, String... args) {
        // picocli reads the annotations of every command it is given when the command line is
        // built (about 0.1 s for all of them at start-up); a run of one subcommand needs only
        // that one, while the top command's help, 'help' and a mistyped name need them all.
        boolean one = args.length > 0 && !args[0].equals("help") && SUBCOMMANDS.contains(args[0]);
        int code = commandLine(out, err, one ? List.of(args[0]) : SUBCOMMANDS).execute(args);
        out.flush();
        err.flush();
        return code;
    }

    /**
     * @param out standard output
     * @param err standard error
     * @return the configured top-level command line (all subcommands registered)
     */
    public static CommandLine commandLine(PrintWriter out, PrintWriter err) {
        return commandLine(out, err, SUBCOMMANDS);
    }

    private static CommandLine commandLine(PrintWriter out, PrintWriter err, List<String> subcommands) {
        CommandLine cl = new CommandLine(new IncipitCommand());
        for (String name : subcommands) {
            cl.addSubcommand(subcommand(name));
        }
        cl.setOut(out);
        cl.setErr(err);
        cl.setCaseInsensitiveEnumValuesAllowed(true);
        cl.setParameterExceptionHandler((ex, args) -> {
            CommandLine c = ex.getCommandLine();
            err.println("incipit: " + ex.getMessage());
            err.println("Try '" + c.getCommandSpec().qualifiedName() + " --help' for more information.");
            return ExitCode.BAD_INPUT;
        });
        cl.setExecutionExceptionHandler((ex, c, parseResult) -> {
            PrintWriter e = err; // the streams given, also for subcommands added later
            if (ex instanceof InputException) {
                e.println("incipit: " + ex.getMessage());
                return ExitCode.BAD_INPUT;
            }
            if (ex instanceof EstimationException) {
                e.println("incipit: estimation failed: " + ex.getMessage());
                return ExitCode.ESTIMATION_FAILED;
            }
            if (ex instanceof IllegalArgumentException) {
                e.println("incipit: " + ex.getMessage());
                return ExitCode.BAD_INPUT;
            }
            e.println("incipit: internal error (please report): " + ex);
            ex.printStackTrace(e);
            return ExitCode.INTERNAL;
        });
        return cl;
    }
}
