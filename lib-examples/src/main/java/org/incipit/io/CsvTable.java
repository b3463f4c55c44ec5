package org.incipit.io;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;

/**
 * A CSV file read into memory: header and data rows with their line numbers. Rows are
 * addressed by index {@code 0 <= r < size()} and columns by their index in the header
 * ({@link #column(String)}); the values are kept as ranges of one byte array (see
 * {@link Cells}), so that a file of many rows costs no object per row or value. Plain ASCII text without
 * quotes is read by {@link PlainCsv}, other text by commons-csv; both give the same rows.
 */
final class CsvTable {

    static final CSVFormat FORMAT = CSVFormat.RFC4180.builder()
            .setHeader()
            .setSkipHeaderRecord(true)
            .setCommentMarker('#')
            .setIgnoreEmptyLines(true)
            .setIgnoreSurroundingSpaces(true)
            .setTrim(true)
            .setAllowMissingColumnNames(true)
            .build();

    /**
     * Growing storage of data rows. The values are kept as UTF-8 bytes: each value is a range
     * {@code [start, end)} of one byte array, the ranges row-major ({@code width} per row), so
     * that a file of a few hundred thousand rows costs no object per value; a value is made a
     * string only when asked for. The plain scan ({@link PlainCsv}) points the ranges into the
     * file's own bytes; rows from commons-csv are encoded into an array of their own. Also a
     * line per row, and a fault for a row whose number of values differs from the header (its
     * values are then not kept).
     */
    static final class Cells {
        /** The most values (or bytes of own text) kept: array lengths stay below the JVM's limit. */
        static final long MAX_LENGTH = Integer.MAX_VALUE - 16;

        /** Thrown when the rows would need more storage than {@link #MAX_LENGTH}. */
        static final class TooLarge extends RuntimeException {
            TooLarge(String what) {
                super("the file is too large to hold in memory (more than " + MAX_LENGTH + " " + what + ")");
            }
        }

        /** {@code n} as an array length, checked against {@link #MAX_LENGTH}. */
        private static int length(long n, String what) {
            if (n > MAX_LENGTH) {
                throw new TooLarge(what);
            }
            return (int) n;
        }

        final int width;
        int size;
        byte[] text;
        private final boolean ownText; // whether add(String[]...) may write into text
        private int textLength;        // used part of an own text
        int[] bounds;                  // start and end of each value, 2 * width per row
        int[] lines;
        String[] faults; // null while no row has a fault

        /** Storage for values that are ranges of {@code text} (which is not copied). */
        Cells(int width, int capacity, byte[] text) {
            this(width, capacity, text, false);
        }

        /** Storage for values given as strings, encoded into an array of its own. */
        Cells(int width, int capacity) {
            this(width, capacity, new byte[64], true);
        }

        private Cells(int width, int capacity, byte[] text, boolean ownText) {
            this.width = width;
            this.text = text;
            this.ownText = ownText;
            this.bounds = new int[length(2L * capacity * width, "value bounds")];
            this.lines = new int[capacity];
        }

        private void grow() {
            if (size == lines.length) {
                int capacity = length(Math.max(16, 2L * size), "rows");
                bounds = Arrays.copyOf(bounds, length(2L * capacity * width, "value bounds"));
                lines = Arrays.copyOf(lines, capacity);
                faults = faults == null ? null : Arrays.copyOf(faults, capacity);
            }
        }

        private boolean fits(int count) {
            if (count == width) {
                return true;
            }
            // a row fault, not a file fault: it can be skipped
            if (faults == null) {
                faults = new String[lines.length];
            }
            faults[size] = "row has " + count + (count == 1 ? " value" : " values") + ", the header has "
                    + width + " columns";
            return false;
        }

        /**
         * Appends the rows of {@code more}, whose values are ranges of the same text, their
         * line numbers shifted by {@code lines}.
         */
        void append(Cells more, int lines) {
            if (more.text != text || ownText) {
                throw new IllegalArgumentException("the rows appended must point into the same text");
            }
            int n = size + more.size;
            if (n > this.lines.length) {
                bounds = Arrays.copyOf(bounds, length(2L * n * width, "value bounds"));
                this.lines = Arrays.copyOf(this.lines, n);
                faults = faults == null ? null : Arrays.copyOf(faults, n);
            }
            System.arraycopy(more.bounds, 0, bounds, 2 * size * width, 2 * more.size * width);
            for (int r = 0; r < more.size; r++) {
                this.lines[size + r] = more.lines[r] + lines;
            }
            if (more.faults != null) {
                if (faults == null) {
                    faults = new String[this.lines.length];
                }
                System.arraycopy(more.faults, 0, faults, size, more.size);
            }
            size = n;
        }

        /**
         * Adds the row of the first {@code count} values whose ranges of the text are in
         * {@code rowBounds} (start and end of each), which starts on {@code line}.
         */
        void add(int[] rowBounds, int count, int line) {
            grow();
            lines[size] = line;
            if (fits(count)) {
                System.arraycopy(rowBounds, 0, bounds, 2 * size * width, 2 * width);
            }
            size++;
        }

        /** Adds the row of the first {@code count} values of {@code row}, which starts on {@code line}. */
        void add(String[] row, int count, int line) {
            if (!ownText) {
                throw new IllegalStateException("these rows point into a text of their own");
            }
            grow();
            lines[size] = line;
            if (fits(count)) {
                int at = 2 * size * width;
                for (int k = 0; k < width; k++) {
                    byte[] v = row[k].getBytes(StandardCharsets.UTF_8);
                    if (textLength + v.length > text.length) {
                        text = Arrays.copyOf(text, length(Math.max(Math.min(2L * text.length, MAX_LENGTH),
                                (long) textLength + v.length), "bytes of values"));
                    }
                    System.arraycopy(v, 0, text, textLength, v.length);
                    bounds[at + 2 * k] = textLength;
                    textLength += v.length;
                    bounds[at + 2 * k + 1] = textLength;
                }
            }
            size++;
        }

        /** @return the value of row {@code r} (without a fault) in column {@code c} */
        String value(int r, int c) {
            int i = 2 * (r * width + c);
            return new String(text, bounds[i], bounds[i + 1] - bounds[i], StandardCharsets.UTF_8);
        }
    }

    final String file;
    final int headerLine;
    final List<String> columns;  // lower case, header order
    private final int width;
    private final int size;
    private final Cells cells;

    private CsvTable(String file, int headerLine, List<String> columns, Cells rows) {
        this.file = file;
        this.headerLine = headerLine;
        this.columns = columns;
        this.width = columns.size();
        this.size = rows.size;
        this.cells = rows;
    }

    /**
     * Reads the file and checks the header: required columns present, no unknown or duplicate
     * column, at least one data row.
     */
    static CsvTable read(Path path, List<String> required, List<String> optional) {
        String file = path.toString();
        byte[] bytes;
        try {
            bytes = Files.readAllBytes(path);
        } catch (IOException e) {
            throw new InputException(file, "cannot read the file (" + e.getClass().getSimpleName() + ": "
                    + e.getMessage() + ")", e);
        }
        try {
            return read(file, bytes, required, optional);
        } catch (Cells.TooLarge e) {
            throw new InputException(file, 0, 0, e.getMessage());
        }
    }

    private static CsvTable read(String file, byte[] bytes, List<String> required, List<String> optional) {
        PlainCsv.Result plain = PlainCsv.scan(bytes);
        if (plain != null) {
            List<String> columns = header(file, plain.header(), plain.headerLine(), required, optional);
            return table(file, plain.headerLine(), columns, plain.cells());
        }
        String text;
        try {
            text = decode(bytes);
        } catch (CharacterCodingException e) {
            throw new InputException(file, 0, 0, "not valid UTF-8 text");
        }
        if (text.startsWith("\uFEFF")) {
            text = text.substring(1);
        }
        try (CSVParser parser = CSVParser.parse(text, FORMAT)) {
            int headerLine = (int) parser.getCurrentLineNumber();
            List<String> columns = header(file, parser.getHeaderNames(), headerLine, required, optional);
            Cells rows = new Cells(columns.size(), 16);
            for (CSVRecord record : parser) {
                String[] values = record.values();
                int newlines = 0;
                for (String v : values) {
                    if (v.indexOf('\n') >= 0) {
                        newlines += newlines(v);
                    }
                }
                rows.add(values, values.length, (int) parser.getCurrentLineNumber() - newlines);
            }
            return table(file, headerLine, columns, rows);
        } catch (IOException | UncheckedIOException | IllegalStateException | IllegalArgumentException e) {
            throw new InputException(file, "malformed CSV (" + e.getMessage() + ")", e);
        }
    }

    /** Checks the header and returns its column names in lower case. */
    private static List<String> header(String file, List<String> header, int headerLine, List<String> required,
                                       List<String> optional) {
        String expected = String.join(",", required);
        if (header.isEmpty()) {
            throw new InputException(file, 0, 0, "empty file (expected a header line: " + expected + ")");
        }
        List<String> columns = new ArrayList<>();
        for (int i = 0; i < header.size(); i++) {
            String name = header.get(i).trim().toLowerCase(Locale.ROOT);
            if (name.isEmpty()) {
                throw new InputException(file, headerLine, i + 1, "header: column " + (i + 1) + " has no name");
            }
            if (columns.contains(name)) {
                throw new InputException(file, headerLine, i + 1, "header: column '" + name
                        + "' appears twice");
            }
            if (!required.contains(name) && !optional.contains(name)) {
                List<String> known = new ArrayList<>(required);
                known.addAll(optional);
                throw new InputException(file, headerLine, i + 1, "header: unknown column '" + name
                        + "' (known columns: " + String.join(", ", known) + ")");
            }
            columns.add(name);
        }
        for (String r : required) {
            if (!columns.contains(r)) {
                throw new InputException(file, headerLine, 0, "header: missing column '" + r
                        + "' (required columns: " + expected + ")");
            }
        }
        return List.copyOf(columns);
    }

    private static CsvTable table(String file, int headerLine, List<String> columns, Cells rows) {
        if (rows.size == 0) {
            throw new InputException(file, 0, 0, "no data rows (only a header"
                    + (headerLine > 0 ? " on line " + headerLine : "") + ")");
        }
        return new CsvTable(file, headerLine, columns, rows);
    }

    /**
     * Strict UTF-8 decoding. {@code new String(bytes, UTF_8)} is much faster than a
     * {@code CharsetDecoder} but replaces malformed input by U+FFFD; so when its result holds a
     * U+FFFD the bytes are decoded again strictly, which throws if they are malformed (a
     * U+FFFD written in the file is valid and kept). Both give the same text for valid UTF-8.
     */
    static String decode(byte[] bytes) throws CharacterCodingException {
        String text = new String(bytes, StandardCharsets.UTF_8);
        if (text.indexOf('\uFFFD') >= 0) {
            return StandardCharsets.UTF_8.newDecoder().decode(ByteBuffer.wrap(bytes)).toString();
        }
        return text;
    }

    private static int newlines(String s) {
        int n = 0;
        for (int i = s.indexOf('\n'); i >= 0; i = s.indexOf('\n', i + 1)) {
            n++;
        }
        return n;
    }

    /** @return number of data rows, &ge; 1 */
    int size() {
        return size;
    }

    /** @return 1-based line where data row {@code r} starts */
    int line(int r) {
        return cells.lines[r];
    }

    /**
     * @return the fault of data row {@code r} (its number of values differs from the header; then
     *     it has no values), or null
     */
    String fault(int r) {
        return cells.faults == null ? null : cells.faults[r];
    }

    /** @return the column's index in the header, or -1 if the file has no such column */
    int column(String name) {
        return columns.indexOf(name);
    }

    boolean has(String column) {
        return columns.contains(column);
    }

    /** @return 1-based column number */
    int number(String column) {
        return columns.indexOf(column) + 1;
    }

    /** @return the trimmed value of row {@code r} in column index {@code c}; row without fault */
    String value(int r, int c) {
        return cells.value(r, c);
    }

    /** @return the UTF-8 text that the values are ranges of (see {@link #start}); not to be changed */
    byte[] text() {
        return cells.text;
    }

    /** @return where the value of row {@code r} (without a fault) in column {@code c} starts in {@link #text} */
    int start(int r, int c) {
        return cells.bounds[2 * (r * width + c)];
    }

    /** @return where the value of row {@code r} (without a fault) in column {@code c} ends in {@link #text} */
    int end(int r, int c) {
        return cells.bounds[2 * (r * width + c) + 1];
    }

    /** @return whether the value of row {@code r} (without a fault) in column {@code c} is empty */
    boolean empty(int r, int c) {
        int i = 2 * (r * width + c);
        return cells.bounds[i] == cells.bounds[i + 1];
    }

    /** @return whether rows {@code r} and {@code q} (without faults) have the same value in column {@code c} */
    boolean same(int r, int q, int c) {
        int i = 2 * (r * width + c);
        int j = 2 * (q * width + c);
        int[] b = cells.bounds;
        return Arrays.equals(cells.text, b[i], b[i + 1], cells.text, b[j], b[j + 1]);
    }

    /** @return the trimmed value of row {@code r} in the named column, which the file has */
    String value(int r, String column) {
        return value(r, columns.indexOf(column));
    }
}
