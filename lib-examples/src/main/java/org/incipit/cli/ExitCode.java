package org.incipit.cli;

/** Exit codes of the {@code incipit} application. */
public final class ExitCode {

    /** Success. */
    public static final int OK = 0;
    /** An unexpected internal error (a bug): the stack trace is printed. */
    public static final int INTERNAL = 1;
    /** Bad usage or bad input; the message names the option or the file, line and column. */
    public static final int BAD_INPUT = 2;
    /** No estimate could be produced ({@link org.incipit.core.EstimationException}). */
    public static final int ESTIMATION_FAILED = 3;

    private ExitCode() {
    }
}
