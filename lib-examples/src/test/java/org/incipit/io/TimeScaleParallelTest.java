package org.incipit.io;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * {@link TimeScale#of} decides the kind of the time columns, the origin and the faults of the
 * file exactly as the plain rule does (the reference below: columns in order, rows in order,
 * stop at the first fault), whether it scans the columns one after another or in parallel.
 * Seeded incubation files (three time columns; 300, bounded) of one kind with now and then
 * a value of the other kind, an invalid date, junk, an empty value or a short row: about
 * 70% of them are read, the others fail by a mixed column or by columns of different kinds.
 */
class TimeScaleParallelTest {

    private static final List<String> COLUMNS = List.of("exposure_from", "exposure_to", "onset");

    @TempDir
    Path dir;

    static Stream<Long> seeds() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(20261203L);
        return Stream.generate(rng::nextLong).limit(300);
    }

    /** The rule as first written: one column after another, one row after another. */
    private static String reference(CsvTable table) {
        Boolean fileDates = null;
        String firstColumn = null;
        int firstLine = 0;
        LocalDate earliest = null;
        for (String column : COLUMNS) {
            Boolean columnDates = null;
            int columnLine = 0;
            for (int r = 0; r < table.size(); r++) {
                if (table.fault(r) != null) {
                    continue;
                }
                String v = table.value(r, column);
                boolean isDate = TimeScale.DATE.matcher(v).matches();
                if (!isDate && !TimeScale.NUMBER.matcher(v).matches()) {
                    continue;
                }
                String at = table.file + ":" + table.line(r) + ":" + table.number(column) + ": ";
                if (columnDates == null) {
                    columnDates = isDate;
                    columnLine = table.line(r);
                    if (fileDates == null) {
                        fileDates = isDate;
                        firstColumn = column;
                        firstLine = table.line(r);
                    } else if (fileDates != isDate) {
                        return at + "column '" + column + "' holds " + (isDate ? "dates" : "day numbers")
                                + " but column '" + firstColumn + "' holds " + (fileDates ? "dates" : "day numbers")
                                + " (line " + firstLine + "); use one kind for all time columns";
                    }
                } else if (columnDates != isDate) {
                    return at + "column '" + column + "' mixes day numbers and dates: line " + columnLine
                            + " has " + (columnDates ? "a date" : "a day number") + ", this line has "
                            + (isDate ? "a date" : "a day number");
                }
                if (isDate) {
                    try {
                        LocalDate d = LocalDate.parse(v);
                        earliest = earliest == null || d.isBefore(earliest) ? d : earliest;
                    } catch (DateTimeParseException e) {
                        // a row fault, not a file fault
                    }
                }
            }
        }
        return "dates " + Boolean.TRUE.equals(fileDates) + " earliest " + (Boolean.TRUE.equals(fileDates) ? earliest : null);
    }

    private static String actual(CsvTable table, int parallelRows) {
        try {
            TimeScale s = TimeScale.of(table, COLUMNS, ReadOptions.defaults(), parallelRows);
            StringBuilder b = new StringBuilder("dates " + s.dates + " earliest " + s.origin);
            if (!s.dates) {
                for (int r = 0; r < table.size(); r++) {
                    for (int k = 0; k < COLUMNS.size(); k++) {
                        String v = table.fault(r) != null ? null : table.value(r, COLUMNS.get(k));
                        if (v != null && TimeScale.NUMBER.matcher(v).matches() && Double.isFinite(Double.parseDouble(v))) {
                            assertEquals(Double.parseDouble(v), s.time(k, r, COLUMNS.get(k)), v);
                        }
                    }
                }
            }
            return b.toString();
        } catch (InputException e) {
            return e.getMessage();
        }
    }

    @ParameterizedTest
    @MethodSource("seeds")
    void parallelAndSequentialScansFollowTheRule(long seed) throws IOException {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        // mostly one kind, sometimes another value slipped in, so that files both pass and fail
        boolean dates = rng.nextBoolean();
        int rows = 1 + rng.nextInt(30);
        StringBuilder text = new StringBuilder("case,exposure_from,exposure_to,onset\n");
        for (int r = 0; r < rows; r++) {
            List<String> values = new ArrayList<>();
            for (int k = 0; k < 3; k++) {
                int pick = rng.nextInt(rows * 3 * 4); // about one odd value in four files
                boolean date = pick == 3 ? !dates : dates;
                values.add(pick == 0 ? "x" : pick == 1 ? "" : pick == 2 ? "2024-02-30"
                        : date ? LocalDate.of(2024, 1, 1).plusDays(rng.nextInt(60)).toString()
                        : Double.toString(60 * rng.nextDouble()));
            }
            text.append(rng.nextInt(25) == 0 ? "bad,row" : "c" + r + "," + String.join(",", values)).append('\n');
        }
        Path p = dir.resolve("w.csv");
        Files.writeString(p, text, StandardCharsets.UTF_8);
        CsvTable table = CsvTable.read(p, CsvInput.INCUBATION_COLUMNS, List.of());
        String expected = reference(table);
        assertEquals(expected, actual(table, Integer.MAX_VALUE), "column by column");
        assertEquals(expected, actual(table, 1), "columns in parallel");
    }
}
