package org.incipit.cli;

import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import org.incipit.core.EstimationException;
import org.incipit.io.InputException;
import picocli.CommandLine;

/** Entry point of the {@code incipit} command-line application. */
public final class Main {

    private Main() {
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
        int code = commandLine(out, err).execute(args);
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
        CommandLine cl = new CommandLine(new IncipitCommand());
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
