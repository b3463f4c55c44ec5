package org.incipit.io;

import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.List;

/**
 * A one-pass scan of the bytes of a plain CSV file, giving exactly what the commons-csv parser
 * with {@link CsvTable}'s format gives for it; for any other file it declines and the caller
 * uses commons-csv. Plain means: ASCII, no double quote, and no control character other than
 * tab, CR and LF. For such text the format comes down to: records end at CR, LF or CRLF;
 * values are split at commas; a line starting with {@code #} is a comment; a line with nothing
 * on it is skipped; spaces and tabs around a value are dropped. It exists because commons-csv
 * reads one character at a time through several layers, which made it the largest cost of
 * reading a file of a few hundred thousand rows; {@code PlainCsvTest} checks it against
 * commons-csv on generated texts.
 */
final class PlainCsv {

    /** The scan's result: the header values and line, and the data records (null if no header). */
    record Result(List<String> header, int headerLine, CsvTable.Cells cells) {
    }

    private final byte[] text;
    private final int length;
    private int pos;
    private int line; // line terminators passed so far
    private boolean declined;
    private String[] values = new String[8];
    private int count; // values of the current record

    private PlainCsv(byte[] text) {
        this.text = text;
        this.length = text.length;
    }

    /**
     * @param text the whole file
     * @return the header (empty if the text has no record) and records, or null if the text is
     *     not plain (see the class comment)
     */
    static Result scan(byte[] text) {
        PlainCsv s = new PlainCsv(text);
        if (!s.nextRecord()) {
            return s.declined ? null : new Result(List.of(), 0, null);
        }
        List<String> header = List.of(Arrays.copyOf(s.values, s.count));
        int headerLine = s.line;
        CsvTable.Cells cells = new CsvTable.Cells(header.size(), 16 + text.length / (8 * header.size()));
        while (s.nextRecord()) {
            cells.add(s.values, s.count, s.line);
        }
        return s.declined ? null : new Result(header, headerLine, cells);
    }

    /** Whether {@code b} may appear in plain text: printable ASCII or tab (line ends apart). */
    private static boolean plain(byte b) {
        return b >= ' ' ? b != '"' : b == '\t';
    }

    /**
     * Reads the next record into {@link #values}, skipping blank and comment lines.
     *
     * @return false at the end of the text, or if the text is not plain (then {@link #declined})
     */
    private boolean nextRecord() {
        count = 0;
        // blank lines and comment lines; pos is at the start of a line here
        while (true) {
            if (pos >= length) {
                return false;
            }
            byte c = text[pos];
            if (c == '\n' || c == '\r') {
                pos = skipEnd(pos);
                line++;
            } else if (c == '#') {
                int end = pos;
                while (end < length && text[end] != '\n' && text[end] != '\r') {
                    if (!plain(text[end])) {
                        declined = true;
                        return false;
                    }
                    end++;
                }
                pos = end < length ? skipEnd(end) : end;
                line++;
            } else {
                break;
            }
        }
        int from = pos;
        for (int i = pos; ; i++) {
            byte c = i < length ? text[i] : (byte) '\n';
            if (c == ',' || c == '\n' || c == '\r') {
                if (count == values.length) {
                    values = Arrays.copyOf(values, 2 * count);
                }
                values[count++] = value(from, i);
                if (c == ',') {
                    from = i + 1;
                    continue;
                }
                pos = i < length ? skipEnd(i) : i;
                line++;
                return true;
            }
            if (!plain(c)) {
                declined = true;
                return false;
            }
        }
    }

    /** @return the position after the line terminator at {@code i} (CR, LF or CRLF) */
    private int skipEnd(int i) {
        return text[i] == '\r' && i + 1 < length && text[i + 1] == '\n' ? i + 2 : i + 1;
    }

    private String value(int from, int to) {
        while (from < to && (text[from] == ' ' || text[from] == '\t')) {
            from++;
        }
        while (to > from && (text[to - 1] == ' ' || text[to - 1] == '\t')) {
            to--;
        }
        return new String(text, from, to - from, StandardCharsets.ISO_8859_1);
    }
}
