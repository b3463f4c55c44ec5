package org.incipit.cli;

import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.time.temporal.ChronoUnit;
import java.util.regex.Pattern;
import org.incipit.core.inference.Estimate;
import org.incipit.io.ReadResult;
import org.incipit.io.TextTable;

/** Small helpers shared by the commands: option values and table cells. */
final class Cli {

    private static final Pattern DATE = Pattern.compile("\\d{4}-\\d{2}-\\d{2}");

    private Cli() {
    }

    /**
     * Reads a time given on the command line on the time scale of a file that was read.
     *
     * @throws IllegalArgumentException naming the option if it cannot be
     */
    static double time(ReadResult<?> read, String option, String text) {
        String t = text.trim();
        if (DATE.matcher(t).matches()) {
            if (read.origin() == null) {
                throw new IllegalArgumentException(option + " '" + text + "' is a date, but the times of "
                        + read.file() + " are day numbers without an origin date (give --origin)");
            }
            try {
                return ChronoUnit.DAYS.between(read.origin(), LocalDate.parse(t));
            } catch (DateTimeParseException e) {
                throw new IllegalArgumentException(option + " '" + text + "' is not a valid date");
            }
        }
        try {
            double x = Double.parseDouble(t);
            if (Double.isFinite(x)) {
                if (read.dates()) {
                    throw new IllegalArgumentException(option + " '" + text + "' is a day number, but the times of "
                            + read.file() + " are dates; give a date (yyyy-MM-dd)");
                }
                return x;
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        throw new IllegalArgumentException(option + " '" + text + "' is neither a day number nor a date (yyyy-MM-dd)");
    }

    /**
     * Parses {@code LO,HI}.
     *
     * @throws IllegalArgumentException naming the option unless two finite numbers with LO &le; HI
     */
    static double[] pair(String option, String text) {
        String[] parts = text.split(",", -1);
        if (parts.length == 2) {
            try {
                double lo = Double.parseDouble(parts[0].trim());
                double hi = Double.parseDouble(parts[1].trim());
                if (Double.isFinite(lo) && Double.isFinite(hi) && lo <= hi) {
                    return new double[] {lo, hi};
                }
            } catch (NumberFormatException e) {
                // reported below
            }
        }
        throw new IllegalArgumentException(option + " must be LO,HI with finite numbers LO <= HI, was '" + text + "'");
    }

    /** @return {@code "5.1 (4.2 to 6.3)"} */
    static String cell(Estimate e) {
        return TextTable.number(e.estimate()) + " (" + TextTable.number(e.lower()) + " to "
                + TextTable.number(e.upper()) + ")";
    }

    /** @return {@code "95% profile"} */
    static String interval(Estimate e) {
        return TextTable.number(100 * e.level()) + "% " + e.method();
    }

    static double positive(String option, double x) {
        if (!(x > 0 && x < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(option + " must be finite and > 0, was " + x);
        }
        return x;
    }

    static double level(double level) {
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("--level must be in (0, 1), was " + level);
        }
        return level;
    }
}
