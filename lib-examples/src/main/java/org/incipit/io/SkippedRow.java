package org.incipit.io;

/**
 * A data row left out because it was bad and skipping was requested.
 *
 * @param file   the file as named by the user
 * @param line   1-based line number
 * @param reason why the row was left out
 */
public record SkippedRow(String file, int line, String reason) {

    /** @return {@code file:line: reason} */
    @Override
    public String toString() {
        return file + ":" + line + ": " + reason;
    }
}
