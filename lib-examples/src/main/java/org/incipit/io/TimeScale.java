package org.incipit.io;

import com.fasterxml.jackson.core.io.NumberInput;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.time.temporal.ChronoUnit;
import java.util.Arrays;
import java.util.List;
import java.util.regex.Pattern;

/** Decides whether a file's time columns hold day numbers or dates, and parses them. */
final class TimeScale {

    static final Pattern NUMBER = Pattern.compile("[-+]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][-+]?\\d+)?");
    static final Pattern DATE = Pattern.compile("\\d{4}-\\d{2}-\\d{2}");

    final boolean dates;
    final LocalDate origin; // null for day numbers without a given origin
    // For a file of day numbers: per time column (in the order given to of()) and row, the value
    // read during the scan, or NaN where the scan could not read one; null for dates.
    private final double[][] read;

    private TimeScale(boolean dates, LocalDate origin, double[][] read) {
        this.dates = dates;
        this.origin = origin;
        this.read = read;
    }

    /**
     * Scans the time columns. Faults of the file (a column mixing kinds, columns of different
     * kinds) raise an {@link InputException}; unparsable values are left to {@link #parse}. Day
     * numbers are read during the scan (see {@link #time}), so that each is checked and parsed
     * once.
     */
    static TimeScale of(CsvTable table, List<String> timeColumns, ReadOptions options) {
        Boolean fileDates = null;
        String firstColumn = null;
        int firstLine = 0;
        LocalDate earliest = null;
        double[][] read = new double[timeColumns.size()][];
        for (int k = 0; k < timeColumns.size(); k++) {
            String column = timeColumns.get(k);
            if (!table.has(column)) {
                continue;
            }
            int c = table.column(column);
            double[] values = new double[table.size()];
            Arrays.fill(values, Double.NaN);
            read[k] = values;
            Boolean columnDates = null;
            int columnLine = 0;
            for (int r = 0; r < table.size(); r++) {
                if (table.fault(r) != null) {
                    continue;
                }
                String v = table.value(r, c);
                boolean isDate = isDate(v);
                boolean isNumber = isNumber(v);
                if (!isDate && !isNumber) {
                    continue;
                }
                if (columnDates == null) {
                    columnDates = isDate;
                    columnLine = table.line(r);
                    if (fileDates == null) {
                        fileDates = isDate;
                        firstColumn = column;
                        firstLine = table.line(r);
                    } else if (fileDates != isDate) {
                        throw new InputException(table.file, table.line(r), table.number(column),
                                "column '" + column + "' holds " + kind(isDate) + " but column '"
                                        + firstColumn + "' holds " + kind(fileDates) + " (line " + firstLine
                                        + "); use one kind for all time columns");
                    }
                } else if (columnDates != isDate) {
                    throw new InputException(table.file, table.line(r), table.number(column),
                            "column '" + column + "' mixes day numbers and dates: line " + columnLine
                                    + " has " + kind1(columnDates) + ", this line has " + kind1(isDate));
                }
                if (isDate) {
                    try {
                        LocalDate d = LocalDate.parse(v);
                        if (earliest == null || d.isBefore(earliest)) {
                            earliest = d;
                        }
                    } catch (DateTimeParseException e) {
                        // reported as a row fault by parse()
                    }
                } else {
                    double x = decimal(v);
                    if (Double.isFinite(x)) {
                        values[r] = x; // else left to parse(), which reports it
                    }
                }
            }
        }
        boolean dates = Boolean.TRUE.equals(fileDates);
        LocalDate origin = options.origin() != null ? options.origin() : (dates ? earliest : null);
        return new TimeScale(dates, origin, dates ? null : read);
    }

    /**
     * The time of data row {@code r} in a time column, as {@link #parse} gives it, without
     * reading the text again where the scan of {@link #of} has read it.
     *
     * @param k      the column's index in the list given to {@link #of}
     * @param r      the data row
     * @param column the column's name
     * @param text   the row's value in that column
     * @return the time in days; a {@link RowFault} if the value is empty or unreadable
     */
    double time(int k, int r, String column, String text) {
        if (read != null && read[k] != null) {
            double x = read[k][r];
            if (x == x) { // not NaN
                return x;
            }
        }
        return parse(column, text);
    }

    /**
     * Whether {@code v} matches {@link #DATE} ({@code \\d{4}-\\d{2}-\\d{2}}); a hand-written scan,
     * because the readers test every time value and a regex per value dominated large files.
     */
    static boolean isDate(String v) {
        if (v.length() != 10 || v.charAt(4) != '-' || v.charAt(7) != '-') {
            return false;
        }
        for (int i = 0; i < 10; i++) {
            if (i != 4 && i != 7 && !digit(v.charAt(i))) {
                return false;
            }
        }
        return true;
    }

    /**
     * Whether {@code v} matches {@link #NUMBER}
     * ({@code [-+]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][-+]?\\d+)?}), by a hand-written scan.
     */
    static boolean isNumber(String v) {
        int n = v.length();
        int i = 0;
        if (i < n && (v.charAt(i) == '-' || v.charAt(i) == '+')) {
            i++;
        }
        int intDigits = 0;
        while (i < n && digit(v.charAt(i))) {
            i++;
            intDigits++;
        }
        int fracDigits = 0;
        if (i < n && v.charAt(i) == '.') {
            i++;
            while (i < n && digit(v.charAt(i))) {
                i++;
                fracDigits++;
            }
        }
        if (intDigits == 0 && fracDigits == 0) {
            return false;
        }
        if (i < n && (v.charAt(i) == 'e' || v.charAt(i) == 'E')) {
            i++;
            if (i < n && (v.charAt(i) == '-' || v.charAt(i) == '+')) {
                i++;
            }
            int expDigits = 0;
            while (i < n && digit(v.charAt(i))) {
                i++;
                expDigits++;
            }
            if (expDigits == 0) {
                return false;
            }
        }
        return i == n;
    }

    /**
     * The double nearest to a decimal that {@link #isNumber} accepts, as
     * {@link Double#parseDouble} gives it (both round correctly), by jackson-core's fast
     * parser (Lemire 2021, "Number parsing at a gigabyte per second"): the JDK 17 parser falls
     * back to big-integer arithmetic for inputs of more than 15 significant digits, which made
     * it the largest single cost of reading a file of full-precision day numbers.
     */
    static double decimal(String text) {
        return NumberInput.parseDouble(text, true);
    }

    private static boolean digit(char c) {
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
