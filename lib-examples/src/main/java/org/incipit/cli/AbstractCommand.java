package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.PrintWriter;
import java.util.concurrent.Callable;
import org.incipit.io.JsonOutput;
import org.incipit.io.ReadResult;
import org.incipit.io.SkippedRow;
import org.incipit.io.TextTable;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;

/**
 * Base of the subcommands: output and reading options, streams, and the one way results are
 * printed. A subcommand implements {@link #run()} and returns an {@link ExitCode}; it reports
 * bad input by throwing {@link org.incipit.io.InputException} or
 * {@link IllegalArgumentException} and a failed estimate by throwing
 * {@link org.incipit.core.EstimationException}; {@link Main} turns them into exit codes.
 */
public abstract class AbstractCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Mixin
    OutputOptions output;

    /** For subclasses. */
    protected AbstractCommand() {
    }

    /**
     * @return the exit code
     * @throws Exception turned into an exit code by {@link Main}
     */
    protected abstract int run() throws Exception;

    @Override
    public final Integer call() throws Exception {
        return run();
    }

    /** @return standard output */
    protected PrintWriter out() {
        return spec.commandLine().getOut();
    }

    /** @return standard error */
    protected PrintWriter err() {
        return spec.commandLine().getErr();
    }

    /** @return true if {@code --json} was given */
    protected boolean json() {
        return output.json();
    }

    /**
     * Prints the result: the JSON object with {@code --json}, else the table.
     *
     * @param result JSON form
     * @param table  readable form
     */
    protected void emit(ObjectNode result, TextTable table) {
        if (json()) {
            out().print(JsonOutput.write(result));
        } else {
            out().print(table.render());
        }
        out().flush();
    }

    /**
     * Lists the skipped rows of a read on stderr ({@code file:line: reason}) followed by their
     * count; prints nothing if none was skipped.
     *
     * @param read what was read
     */
    protected void reportSkipped(ReadResult<?> read) {
        if (read.skipped().isEmpty()) {
            return;
        }
        for (SkippedRow row : read.skipped()) {
            err().println(row);
        }
        err().println("incipit: skipped " + read.skipped().size() + " of " + read.dataRows()
                + " data rows of " + read.file());
        err().flush();
    }
}
