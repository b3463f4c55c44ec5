package org.incipit.io;

/**
 * An input file could not be read into observations. The message has the form
 * {@code file:line:column: reason}, leaving out the line or column where they do not apply.
 */
public class InputException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    /** The file as named by the user. */
    private final String file;
    /** 1-based line, or 0. */
    private final int line;
    /** 1-based column, or 0. */
    private final int column;
    /** The fault without the position. */
    private final String reason;

    /**
     * @param file   the file as named by the user
     * @param line   1-based line number, or 0 if the fault concerns the whole file
     * @param column 1-based column number, or 0 if the fault concerns no single column
     * @param reason what is wrong, e.g. {@code "column 'start': cannot read 'x' as a number"}
     */
    public InputException(String file, int line, int column, String reason) {
        super(format(file, line, column, reason));
        this.file = file;
        this.line = line;
        this.column = column;
        this.reason = reason;
    }

    /**
     * @param file   the file as named by the user
     * @param reason what is wrong
     * @param cause  the underlying failure
     */
    public InputException(String file, String reason, Throwable cause) {
        super(format(file, 0, 0, reason), cause);
        this.file = file;
        this.line = 0;
        this.column = 0;
        this.reason = reason;
    }

    static String format(String file, int line, int column, String reason) {
        StringBuilder sb = new StringBuilder(file);
        if (line > 0) {
            sb.append(':').append(line);
            if (column > 0) {
                sb.append(':').append(column);
            }
        }
        return sb.append(": ").append(reason).toString();
    }

    /** @return the file as named by the user */
    public String file() {
        return file;
    }

    /** @return 1-based line number, or 0 */
    public int line() {
        return line;
    }

    /** @return 1-based column number, or 0 */
    public int column() {
        return column;
    }

    /** @return the fault without the position */
    public String reason() {
        return reason;
    }
}
