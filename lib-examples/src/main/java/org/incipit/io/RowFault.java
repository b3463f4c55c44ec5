package org.incipit.io;

/** A fault of one data row, in one column (or none); converted to a position by the reader. */
final class RowFault extends RuntimeException {

    private static final long serialVersionUID = 1L;

    final String column; // null if no single column

    RowFault(String column, String reason) {
        super(reason, null, false, false);
        this.column = column;
    }
}
