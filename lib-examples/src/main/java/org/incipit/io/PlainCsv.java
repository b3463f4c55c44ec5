package org.incipit.io;

import java.util.ArrayList;
import java.util.List;

/**
 * A one-pass scan of CSV text that uses no quotes, giving exactly what the commons-csv parser
 * with {@link CsvTable}'s format gives for it; for any other text it declines and the caller
 * uses commons-csv. Without quotes the format comes down to: records end at CR, LF or CRLF;
 * values are split at commas; a line starting with {@code #} is a comment; a line with nothing
 * on it is skipped; spaces and tabs around a value are dropped. The scan declines text with a
 * double quote, a control character other than tab, CR and LF, or a non-ASCII white-space
 * character (where the two trimming rules of the format would need care). It exists because
 * commons-csv reads one character at a time through several layers, which made it the largest
 * cost of reading a file of a few hundred thousand rows; {@code PlainCsvTest} checks it against
 * commons-csv on generated texts.
 */
final class PlainCsv {

    /** The scan's result: the header values and line, and the data records. */
    record Result(List<String> header, int headerLine, CsvTable.Cells cells) {
    }

    private final String text;
    private final int length;
    private int pos;
    private int line; // line terminators passed so far
    private final List<String> values = new ArrayList<>();

    private PlainCsv(String text) {
        this.text = text;
        this.length = text.length();
    }

    /**
     * @param text the whole file, without a byte-order mark
     * @return the header (empty if the text has no record) and records, or null if the text is
     *     not plain (see the class comment)
     */
    static Result scan(String text) {
        PlainCsv s = new PlainCsv(text);
        if (!s.nextRecord()) {
            return s.pos < 0 ? null : new Result(List.of(), 0, null);
        }
        List<String> header = List.copyOf(s.values);
        int headerLine = s.line;
        CsvTable.Cells cells = new CsvTable.Cells(header.size(), s.remainingLines());
        while (s.nextRecord()) {
            cells.add(s.values, s.line);
        }
        return s.pos < 0 ? null : new Result(header, headerLine, cells);
    }

    /** @return a first guess of the number of records after the header: its number of lines */
    private int remainingLines() {
        int n = 0;
        for (int i = text.indexOf('\n', pos); i >= 0; i = text.indexOf('\n', i + 1)) {
            n++;
        }
        return Math.max(16, n + 1);
    }

    /**
     * Reads the next record into {@link #values}, skipping blank and comment lines.
     *
     * @return false at the end of the text, or if the text is not plain (then {@code pos < 0})
     */
    private boolean nextRecord() {
        values.clear();
        // blank lines and comment lines; pos is at the start of a line here
        while (true) {
            if (pos >= length) {
                return false;
            }
            char c = text.charAt(pos);
            if (c == '\n' || c == '\r') {
                pos = skipEnd(pos);
                line++;
            } else if (c == '#') {
                int end = pos;
                while (end < length && text.charAt(end) != '\n' && text.charAt(end) != '\r') {
                    end++;
                }
                if (!plain(pos, end)) {
                    pos = -1;
                    return false;
                }
                pos = end < length ? skipEnd(end) : end;
                line++;
            } else {
                break;
            }
        }
        int from = pos;
        int i = pos;
        while (true) {
            char c = i < length ? text.charAt(i) : '\n';
            if (c == ',' || c == '\n' || c == '\r') {
                values.add(value(from, i));
                if (c == ',') {
                    from = i + 1;
                    i++;
                    continue;
                }
                pos = i < length ? skipEnd(i) : i;
                line++;
                return true;
            }
            if (c < ' ' ? c != '\t' : c == '"' || c >= 0x80 && Character.isWhitespace(c)) {
                pos = -1;
                return false;
            }
            i++;
        }
    }

    /** @return the position after the line terminator at {@code i} (CR, LF or CRLF) */
    private int skipEnd(int i) {
        return text.charAt(i) == '\r' && i + 1 < length && text.charAt(i + 1) == '\n' ? i + 2 : i + 1;
    }

    private String value(int from, int to) {
        while (from < to && (text.charAt(from) == ' ' || text.charAt(from) == '\t')) {
            from++;
        }
        while (to > from && (text.charAt(to - 1) == ' ' || text.charAt(to - 1) == '\t')) {
            to--;
        }
        return text.substring(from, to);
    }

    /** Whether a comment line's characters are all allowed in plain text. */
    private boolean plain(int from, int to) {
        for (int i = from; i < to; i++) {
            char c = text.charAt(i);
            if (c < ' ' ? c != '\t' : c == '"' || c >= 0x80 && Character.isWhitespace(c)) {
                return false;
            }
        }
        return true;
    }
}
