package org.incipit.io;

import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.FutureTask;

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
    private final int length; // end of the part scanned
    private int pos;
    private int line; // line terminators passed so far
    private boolean declined;
    private int[] bounds = new int[16]; // start and end of each value of the current record
    private int count; // values of the current record

    /** Files with at least this many bytes of records are scanned in two halves in parallel. */
    static final int PARALLEL_BYTES = 1 << 20;

    /** A scan of {@code text[from, to)}, where {@code from} is the start of a line. */
    private PlainCsv(byte[] text, int from, int to) {
        this.text = text;
        this.pos = from;
        this.length = to;
    }

    /**
     * @param text the whole file
     * @return the header (empty if the text has no record) and records, or null if the text is
     *     not plain (see the class comment)
     */
    static Result scan(byte[] text) {
        return scan(text, PARALLEL_BYTES);
    }

    /**
     * As {@link #scan(byte[])}; from {@code parallelBytes} bytes of records on, the records
     * are scanned in two parts split at a line end, in parallel. Without quotes no record spans
     * lines, so the parts give the same records; the line numbers of the second part are
     * shifted by the line ends of the first.
     */
    static Result scan(byte[] text, int parallelBytes) {
        PlainCsv s = new PlainCsv(text, 0, text.length);
        if (!s.nextRecord()) {
            return s.declined ? null : new Result(List.of(), 0, null);
        }
        String[] names = new String[s.count];
        for (int k = 0; k < s.count; k++) {
            names[k] = new String(text, s.bounds[2 * k], s.bounds[2 * k + 1] - s.bounds[2 * k],
                    StandardCharsets.ISO_8859_1);
        }
        List<String> header = List.of(names);
        int headerLine = s.line;
        int width = header.size();
        int split = split(text, s.pos, parallelBytes);
        if (split == text.length) {
            CsvTable.Cells cells = s.records(width, text.length);
            return s.declined ? null : new Result(header, headerLine, cells);
        }
        PlainCsv second = new PlainCsv(text, split, text.length);
        FutureTask<CsvTable.Cells> later = new FutureTask<>(() -> second.records(width, text.length - split));
        Thread helper = new Thread(later, "incipit-csv-scan");
        helper.setDaemon(true);
        helper.start();
        PlainCsv first = new PlainCsv(text, s.pos, split);
        first.line = s.line;
        CsvTable.Cells cells = first.records(width, split - s.pos);
        CsvTable.Cells rest = TimeScale.await(later);
        if (first.declined || second.declined) {
            return null;
        }
        cells.append(rest, first.line);
        return new Result(header, headerLine, cells);
    }

    /** @return the start of the line after the middle of {@code text[from, )}, or its length */
    private static int split(byte[] text, int from, int parallelBytes) {
        if (text.length - from >= parallelBytes && Runtime.getRuntime().availableProcessors() > 1) {
            for (int i = from + (text.length - from) / 2; i < text.length; i++) {
                if (text[i] == '\n') {
                    return i + 1;
                }
            }
        }
        return text.length;
    }

    /** Reads the records of the rest of the part (of about {@code bytes} bytes). */
    private CsvTable.Cells records(int width, int bytes) {
        CsvTable.Cells cells = new CsvTable.Cells(width, 16 + bytes / (8 * width), text);
        while (nextRecord()) {
            cells.add(bounds, count, line);
        }
        return cells;
    }

    /** Whether {@code b} may appear in plain text: printable ASCII or tab (line ends apart). */
    private static boolean plain(byte b) {
        return b >= ' ' ? b != '"' : b == '\t';
    }

    /**
     * Reads the next record into {@link #bounds}, skipping blank and comment lines.
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
                if (2 * count == bounds.length) {
                    bounds = Arrays.copyOf(bounds, 4 * count);
                }
                value(from, i);
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

    /** Records {@code text[from, to)} without the spaces and tabs around it as the next value. */
    private void value(int from, int to) {
        while (from < to && (text[from] == ' ' || text[from] == '\t')) {
            from++;
        }
        while (to > from && (text[to - 1] == ' ' || text[to - 1] == '\t')) {
            to--;
        }
        bounds[2 * count] = from;
        bounds[2 * count + 1] = to;
        count++;
    }
}
