package org.incipit.io;

import ch.randelshofer.fastdoubleparser.JavaDoubleParser;
import java.nio.charset.StandardCharsets;
import java.time.DateTimeException;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.time.temporal.ChronoUnit;
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.FutureTask;
import java.util.regex.Pattern;

/** Decides whether a file's time columns hold day numbers or dates, and parses them. */
final class TimeScale {

    static final Pattern NUMBER = Pattern.compile("[-+]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][-+]?\\d+)?");
    static final Pattern DATE = Pattern.compile("\\d{4}-\\d{2}-\\d{2}");

    final boolean dates;
    final LocalDate origin; // null for day numbers without a given origin
    private final CsvTable table;
    // For a file of day numbers: per time column (in the order given to of()) and row, the value
    // read during the scan, or NaN where the scan could not read one; null for dates.
    private final double[][] read;

    private TimeScale(CsvTable table, boolean dates, LocalDate origin, double[][] read) {
        this.table = table;
        this.dates = dates;
        this.origin = origin;
        this.read = read;
    }

    /** Files of at least this many data rows have their time columns scanned in parallel. */
    static final int PARALLEL_ROWS = 20_000;

    /**
     * Scans the time columns. Faults of the file (a column mixing kinds, columns of different
     * kinds) raise an {@link InputException}; unparsable values are left to {@link #parse}. Day
     * numbers are read during the scan (see {@link #time}), so that each is checked and parsed
     * once. Large files have their columns scanned in parallel (each column on its own; faults
     * are then reported exactly as a scan column by column would report them).
     */
    static TimeScale of(CsvTable table, List<String> timeColumns, ReadOptions options) {
        return of(table, timeColumns, options, PARALLEL_ROWS);
    }

    /** As {@link #of(CsvTable, List, ReadOptions)}, in parallel from {@code parallelRows} rows on. */
    static TimeScale of(CsvTable table, List<String> timeColumns, ReadOptions options, int parallelRows) {
        int n = timeColumns.size();
        ColumnScan[] scans = new ColumnScan[n];
        if (n > 1 && table.size() >= parallelRows && Runtime.getRuntime().availableProcessors() > 1) {
            FutureTask<Void> rest = new FutureTask<>(() -> {
                for (int k = 1; k < n; k++) {
                    scans[k] = ColumnScan.of(table, timeColumns.get(k));
                }
                return null;
            });
            Thread helper = new Thread(rest, "incipit-time-scan");
            helper.setDaemon(true);
            helper.start();
            scans[0] = ColumnScan.of(table, timeColumns.get(0));
            await(rest);
        } else {
            for (int k = 0; k < n; k++) {
                scans[k] = ColumnScan.of(table, timeColumns.get(k));
            }
        }
        Boolean fileDates = null;
        String firstColumn = null;
        int firstLine = 0;
        LocalDate earliest = null;
        double[][] read = new double[n][];
        for (int k = 0; k < n; k++) {
            ColumnScan scan = scans[k];
            if (scan == null || scan.dates == null) {
                continue; // no such column, or nothing readable in it
            }
            String column = timeColumns.get(k);
            int line = table.line(scan.first);
            if (fileDates == null) {
                fileDates = scan.dates;
                firstColumn = column;
                firstLine = line;
            } else if (!fileDates.equals(scan.dates)) {
                throw new InputException(table.file, line, table.number(column),
                        "column '" + column + "' holds " + kind(scan.dates) + " but column '"
                                + firstColumn + "' holds " + kind(fileDates) + " (line " + firstLine
                                + "); use one kind for all time columns");
            }
            if (scan.mixed >= 0) {
                throw new InputException(table.file, table.line(scan.mixed), table.number(column),
                        "column '" + column + "' mixes day numbers and dates: line " + line
                                + " has " + kind1(scan.dates) + ", this line has " + kind1(!scan.dates));
            }
            if (scan.earliest != null && (earliest == null || scan.earliest.isBefore(earliest))) {
                earliest = scan.earliest;
            }
            read[k] = scan.values;
        }
        boolean dates = Boolean.TRUE.equals(fileDates);
        LocalDate origin = options.origin() != null ? options.origin() : (dates ? earliest : null);
        return new TimeScale(table, dates, origin, dates ? null : read);
    }

    /** The task's result, once it has run; its exception if it threw one. */
    static <T> T await(FutureTask<T> task) {
        boolean interrupted = false;
        try {
            while (true) {
                try {
                    return task.get();
                } catch (InterruptedException e) {
                    interrupted = true; // the scan is short: finish it, then keep the interrupt
                } catch (ExecutionException e) {
                    if (e.getCause() instanceof RuntimeException r) {
                        throw r;
                    }
                    if (e.getCause() instanceof Error err) {
                        throw err;
                    }
                    throw new IllegalStateException(e.getCause());
                }
            }
        } finally {
            if (interrupted) {
                Thread.currentThread().interrupt();
            }
        }
    }

    /**
     * One time column read in row order up to its first value of the other kind: the kind of
     * its first readable value (null if none), that row, the first row of the other kind (or
     * -1), the earliest date, and the day numbers read (NaN where none was).
     */
    private static final class ColumnScan {
        Boolean dates;
        int first = -1;
        int mixed = -1;
        LocalDate earliest;
        double[] values;

        static ColumnScan of(CsvTable table, String column) {
            if (!table.has(column)) {
                return null;
            }
            ColumnScan s = new ColumnScan();
            int c = table.column(column);
            double[] values = new double[table.size()];
            Arrays.fill(values, Double.NaN);
            s.values = values;
            byte[] text = table.text();
            for (int r = 0; r < table.size(); r++) {
                if (table.fault(r) != null) {
                    continue;
                }
                int from = table.start(r, c);
                int to = table.end(r, c);
                boolean isDate = isDate(text, from, to);
                if (!isDate && !isNumber(text, from, to)) {
                    continue;
                }
                if (s.dates == null) {
                    s.dates = isDate;
                    s.first = r;
                } else if (s.dates != isDate) {
                    s.mixed = r;
                    break;
                }
                if (isDate) {
                    LocalDate d = date(text, from); // null if not a valid date: reported by parse()
                    if (d != null && (s.earliest == null || d.isBefore(s.earliest))) {
                        s.earliest = d;
                    }
                } else {
                    double x = decimal(text, from, to);
                    if (Double.isFinite(x)) {
                        values[r] = x; // else left to parse(), which reports it
                    }
                }
            }
            return s;
        }
    }

    /**
     * The time of data row {@code r} in a time column, as {@link #parse} gives it, without
     * reading the text again where the scan of {@link #of} has read it.
     *
     * @param k      the column's index in the list given to {@link #of}
     * @param r      the data row, which has no fault of its own
     * @param column the column's name
     * @return the time in days; a {@link RowFault} if the value is empty or unreadable
     */
    double time(int k, int r, String column) {
        if (read != null && read[k] != null) {
            double x = read[k][r];
            if (x == x) { // not NaN
                return x;
            }
        }
        int c = table.column(column);
        if (dates) {
            int from = table.start(r, c);
            if (isDate(table.text(), from, table.end(r, c))) {
                LocalDate d = date(table.text(), from);
                if (d != null) {
                    return d.toEpochDay() - origin.toEpochDay();
                }
            }
        }
        return parse(column, table.value(r, c));
    }

    /**
     * The date {@code b[from, from + 10)}, which {@link #isDate(byte[], int, int)} accepts, as
     * {@link LocalDate#parse(CharSequence)} reads it (ISO {@code yyyy-MM-dd}, strict: no
     * 30 February), or null if it is not a valid date.
     */
    static LocalDate date(byte[] b, int from) {
        int year = 1000 * (b[from] - '0') + 100 * (b[from + 1] - '0') + 10 * (b[from + 2] - '0') + (b[from + 3] - '0');
        int month = 10 * (b[from + 5] - '0') + (b[from + 6] - '0');
        int day = 10 * (b[from + 8] - '0') + (b[from + 9] - '0');
        try {
            return LocalDate.of(year, month, day);
        } catch (DateTimeException e) {
            return null;
        }
    }

    /** Whether {@code v} matches {@link #DATE}; see {@link #isDate(byte[], int, int)}. */
    static boolean isDate(String v) {
        byte[] b = v.getBytes(StandardCharsets.UTF_8);
        return isDate(b, 0, b.length);
    }

    /**
     * Whether the UTF-8 text {@code b[from, to)} matches {@link #DATE}
     * ({@code \\d{4}-\\d{2}-\\d{2}}); a hand-written scan, because the readers test every time
     * value and a regex per value dominated large files. (A byte of a non-ASCII character is
     * never an ASCII digit or sign, so the bytes decide as the characters would.)
     */
    static boolean isDate(byte[] b, int from, int to) {
        if (to - from != 10 || b[from + 4] != '-' || b[from + 7] != '-') {
            return false;
        }
        for (int i = 0; i < 10; i++) {
            if (i != 4 && i != 7 && !digit(b[from + i])) {
                return false;
            }
        }
        return true;
    }

    /** Whether {@code v} matches {@link #NUMBER}; see {@link #isNumber(byte[], int, int)}. */
    static boolean isNumber(String v) {
        byte[] b = v.getBytes(StandardCharsets.UTF_8);
        return isNumber(b, 0, b.length);
    }

    /**
     * Whether the UTF-8 text {@code b[from, to)} matches {@link #NUMBER}
     * ({@code [-+]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][-+]?\\d+)?}), by a hand-written scan.
     */
    static boolean isNumber(byte[] b, int from, int to) {
        int i = from;
        if (i < to && (b[i] == '-' || b[i] == '+')) {
            i++;
        }
        int digitsFrom = i;
        while (i < to && digit(b[i])) {
            i++;
        }
        int digits = i - digitsFrom;
        if (i < to && b[i] == '.') {
            i++;
            int fractionFrom = i;
            while (i < to && digit(b[i])) {
                i++;
            }
            digits += i - fractionFrom;
        }
        if (digits == 0) {
            return false;
        }
        if (i < to && (b[i] == 'e' || b[i] == 'E')) {
            i++;
            if (i < to && (b[i] == '-' || b[i] == '+')) {
                i++;
            }
            int exponentFrom = i;
            while (i < to && digit(b[i])) {
                i++;
            }
            if (i == exponentFrom) {
                return false;
            }
        }
        return i == to;
    }

    /** The double nearest to a decimal that {@link #isNumber} accepts; see {@link #decimal(byte[], int, int)}. */
    static double decimal(String text) {
        byte[] b = text.getBytes(StandardCharsets.UTF_8);
        return decimal(b, 0, b.length);
    }

    /**
     * The double nearest to the decimal {@code b[from, to)}, which {@link #isNumber} accepts, as
     * {@link Double#parseDouble} gives it (both round correctly), by the fastdoubleparser
     * library (Lemire 2021, "Number parsing at a gigabyte per second", Software: Practice and
     * Experience 51(8)), straight from the file's bytes: the JDK 17 parser falls back to
     * big-integer arithmetic for inputs of more than 15 significant digits, which made it the
     * largest single cost of reading a file of full-precision day numbers, and it needs a
     * string per value.
     */
    static double decimal(byte[] b, int from, int to) {
        return JavaDoubleParser.parseDouble(b, from, to - from);
    }

    private static boolean digit(byte c) {
        return c >= '0' && c <= '9';
    }

    private static String kind(boolean dates) {
        return dates ? "dates" : "day numbers";
    }

    private static String kind1(boolean dates) {
        return dates ? "a date" : "a day number";
    }

    /** @return the time in days; a {@link RowFault} if the value is empty or unreadable */
    double parse(String column, String text) {
        if (text.isEmpty()) {
            throw new RowFault(column, "column '" + column + "': value is missing");
        }
        if (dates) {
            if (!isDate(text)) {
                throw new RowFault(column, "column '" + column + "': cannot read '" + text
                        + "' as a date (yyyy-MM-dd)");
            }
            try {
                return ChronoUnit.DAYS.between(origin, LocalDate.parse(text));
            } catch (DateTimeParseException e) {
                throw new RowFault(column, "column '" + column + "': '" + text + "' is not a valid date");
            }
        }
        if (!isNumber(text)) {
            throw new RowFault(column, "column '" + column + "': cannot read '" + text
                    + "' as a day number or a date (yyyy-MM-dd)");
        }
        double x = decimal(text);
        if (!Double.isFinite(x)) {
            throw new RowFault(column, "column '" + column + "': day number '" + text + "' is out of range");
        }
        return x;
    }

    /** Parses an integer day (a whole day number or a date). */
    int parseDay(String column, String text) {
        double x = parse(column, text);
        if (x != Math.rint(x) || Math.abs(x) > Integer.MAX_VALUE / 2) {
            throw new RowFault(column, "column '" + column + "': day '" + text + "' is not a whole day number");
        }
        return (int) x;
    }

    /**
     * Parses a time given outside the file (e.g. a cut-off) on this scale.
     *
     * @throws IllegalArgumentException with a reason if it cannot be
     */
    double parseExternal(String what, String text) {
        String t = text.trim();
        if (isDate(t)) {
            if (origin == null) {
                throw new IllegalArgumentException(what + " '" + text
                        + "' is a date, but the file's times are day numbers without an origin date");
            }
            try {
                return ChronoUnit.DAYS.between(origin, LocalDate.parse(t));
            } catch (DateTimeParseException e) {
                throw new IllegalArgumentException(what + " '" + text + "' is not a valid date");
            }
        }
        if (isNumber(t)) {
            if (dates) {
                throw new IllegalArgumentException(what + " '" + text
                        + "' is a day number, but the file's times are dates; give it as a date (yyyy-MM-dd)");
            }
            double x = decimal(t);
            if (Double.isFinite(x)) {
                return x;
            }
        }
        throw new IllegalArgumentException(what + " '" + text + "' is neither a day number nor a date (yyyy-MM-dd)");
    }
}
