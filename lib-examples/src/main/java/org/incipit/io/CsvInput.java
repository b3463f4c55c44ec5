package org.incipit.io;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Pattern;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.observe.DailyCounts;
import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;
import org.incipit.core.observe.ObservationException;

/**
 * Reads the four input file kinds into observations. File layout, time handling and error
 * reporting are described in the {@linkplain org.incipit.io package documentation}.
 */
public final class CsvInput {

    /** Columns of an intervals file: required, then optional. */
    public static final List<String> INTERVAL_COLUMNS = List.of("case", "end", "start");
    /** Optional columns of an intervals file. */
    public static final List<String> INTERVAL_OPTIONAL = List.of("kind", "exposures_total");
    /** Columns of a delays file. */
    public static final List<String> DELAY_COLUMNS = List.of("case", "primary", "secondary");
    /** Optional columns of a delays file. */
    public static final List<String> DELAY_OPTIONAL = List.of("daily");
    /** Columns of an incubation file. */
    public static final List<String> INCUBATION_COLUMNS = List.of("case", "exposure_from", "exposure_to", "onset");
    /** Columns of a daily-counts file. */
    public static final List<String> COUNT_COLUMNS = List.of("day", "cases");
    /** Optional columns of a daily-counts file. */
    public static final List<String> COUNT_OPTIONAL = List.of("deaths", "recoveries", "imported");

    private static final Pattern COUNT = Pattern.compile("\\d+");

    private CsvInput() {
    }

    @FunctionalInterface
    private interface RowReader {
        /** Reads data row {@code r} (which has no fault of its own). */
        void read(int r);
    }

    /**
     * Reads an intervals file: {@code case,end,start[,kind][,exposures_total]}, one row per
     * candidate start. A case's rows must agree on {@code end} and on {@code exposures_total}
     * (an empty {@code exposures_total} means "unknown"); a start after the end is an error.
     * Cases keep the order of their first row; candidates are sorted by start.
     *
     * @param path    the file
     * @param options origin and skipping
     * @return the cases
     * @throws InputException naming file, line, column and fault
     */
    public static ReadResult<AmbiguousStartCases> intervals(Path path, ReadOptions options) {
        CsvTable t = CsvTable.read(path, INTERVAL_COLUMNS, INTERVAL_OPTIONAL);
        TimeScale scale = TimeScale.of(t, List.of("end", "start"), options);
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder(t.size());
        // what a case's later rows must agree with, and where it was first seen (for messages)
        record Seen(String id, int row, int line, double end, int total) {
        }
        Map<String, Seen> seen = new HashMap<>(Math.min(t.size(), 1 << 22) * 4 / 3 + 1); // no rehashing
        Seen[] last = new Seen[1]; // the case of the last row read: files often list a case's rows together
        int[] idRow = {-1}; // the last row whose case id was made a string, and that string
        String[] idText = new String[1];
        int caseColumn = t.column("case");
        int endColumn = t.column("end");
        int startColumn = t.column("start");
        int kindColumn = t.column("kind");
        int totalColumn = t.column("exposures_total");
        List<SkippedRow> skipped = readRows(t, options, Map.of("id", "case", "end", "end", "start", "start",
                "category", "kind", "totalExposures", "exposures_total"), r -> {
            // the texts of the row are made strings only where needed: this runs once per row of
            // large files, and messages (built only for a bad row) read them again
            String id;
            if (idRow[0] >= 0 && t.same(r, idRow[0], caseColumn)) {
                id = idText[0];
            } else {
                id = required(t, r, caseColumn, "case");
                idRow[0] = r;
                idText[0] = id;
            }
            double end = scale.time(0, r, "end");
            double start = scale.time(1, r, "start");
            String kind = null;
            if (kindColumn >= 0) {
                kind = required(t, r, kindColumn, "kind");
            }
            int total = AmbiguousStartCases.UNKNOWN_TOTAL;
            if (totalColumn >= 0 && !t.empty(r, totalColumn)) {
                String totalText = t.value(r, totalColumn);
                total = count(totalText, "exposures_total");
                if (total < 1) {
                    throw new RowFault("exposures_total", "column 'exposures_total': must be >= 1, was " + totalText);
                }
            }
            Seen before = last[0] != null && last[0].id().equals(id) ? last[0] : seen.get(id);
            if (before != null && Double.compare(before.end(), end) != 0) {
                throw new RowFault("end", what(id) + ": end '" + t.value(r, endColumn) + "' disagrees with end '"
                        + t.value(before.row(), endColumn) + "' on line " + before.line());
            }
            if (before != null && before.total() != total) {
                throw new RowFault("exposures_total", what(id) + ": exposures_total "
                        + shown(t.value(r, totalColumn)) + " disagrees with "
                        + shown(t.value(before.row(), totalColumn)) + " on line " + before.line());
            }
            if (start > end) {
                throw new RowFault("start", what(id) + ": start '" + t.value(r, startColumn) + "' is after end '"
                        + t.value(r, endColumn) + "'");
            }
            b.addCandidate(id, end, start, kind, total);
            if (before == null) {
                before = new Seen(id, r, t.line(r), end, total);
                seen.put(id, before);
            }
            last[0] = before;
        });
        return new ReadResult<>(b.build(), t.file, t.size(), scale.dates, scale.origin, skipped);
    }

    /**
     * Reads a delays file: {@code case,primary,secondary[,daily]}. An empty {@code secondary}
     * means the secondary event had not been observed at the cut-off: the pair is right-censored
     * at the cut-off (which must then be given). With a cut-off every observed pair must have its
     * secondary time at or before it. {@code daily} ({@code true/false/yes/no/1/0}) says whether
     * both times are known only to the day; by default it is true when the file's times are
     * dates and false for day numbers.
     *
     * @param path    the file
     * @param options origin and skipping
     * @param cutoff  the cut-off as a day number or date (same kind as the file), or null
     * @return the pairs
     * @throws InputException           naming file, line, column and fault
     * @throws IllegalArgumentException if the cut-off cannot be read on the file's time scale
     */
    public static ReadResult<DelayPairs> delays(Path path, ReadOptions options, String cutoff) {
        CsvTable t = CsvTable.read(path, DELAY_COLUMNS, DELAY_OPTIONAL);
        TimeScale scale = TimeScale.of(t, List.of("primary", "secondary"), options);
        DelayPairs.Builder b = cutoff == null ? DelayPairs.builder()
                : DelayPairs.builder(scale.parseExternal("cut-off", cutoff));
        List<SkippedRow> skipped = readRows(t, options, Map.of("id", "case", "primary", "primary",
                "secondary", "secondary"), r -> {
            String id = required(t, r, "case");
            String primaryText = t.value(r, "primary");
            String secondaryText = t.value(r, "secondary");
            double primary = scale.time(0, r, "primary");
            boolean daily = scale.dates;
            if (t.has("daily") && !t.value(r, "daily").isEmpty()) {
                daily = bool(t.value(r, "daily"), "daily");
            }
            if (secondaryText.isEmpty()) {
                if (cutoff == null) {
                    throw new RowFault("secondary", what(id)
                            + ": secondary is empty (not yet observed), but no cut-off was given");
                }
                b.addCensored(id, primary, daily);
                return;
            }
            double secondary = scale.time(1, r, "secondary");
            if (secondary < primary) {
                throw new RowFault("secondary", what(id) + ": secondary '" + secondaryText
                        + "' is before primary '" + primaryText + "'");
            }
            b.addObserved(id, primary, secondary, daily);
        });
        return new ReadResult<>(b.build(), t.file, t.size(), scale.dates, scale.origin, skipped);
    }

    /**
     * Reads an incubation file: {@code case,exposure_from,exposure_to,onset}, requiring
     * {@code exposure_from <= exposure_to <= onset} (see {@link ExposureWindows}).
     *
     * @param path    the file
     * @param options origin and skipping
     * @return the exposure windows
     * @throws InputException naming file, line, column and fault
     */
    public static ReadResult<ExposureWindows> incubation(Path path, ReadOptions options) {
        CsvTable t = CsvTable.read(path, INCUBATION_COLUMNS, List.of());
        TimeScale scale = TimeScale.of(t, List.of("exposure_from", "exposure_to", "onset"), options);
        ExposureWindows.Builder b = ExposureWindows.builder();
        List<SkippedRow> skipped = readRows(t, options, Map.of("id", "case", "exposureFrom", "exposure_from",
                "exposureTo", "exposure_to", "onset", "onset"), r -> {
            String id = required(t, r, "case");
            String fromText = t.value(r, "exposure_from");
            String toText = t.value(r, "exposure_to");
            String onsetText = t.value(r, "onset");
            double from = scale.time(0, r, "exposure_from");
            double to = scale.time(1, r, "exposure_to");
            double onset = scale.time(2, r, "onset");
            if (to < from) {
                throw new RowFault("exposure_to", what(id) + ": exposure_to '" + toText
                        + "' is before exposure_from '" + fromText + "'");
            }
            if (onset < to) {
                throw new RowFault("onset", what(id) + ": onset '" + onsetText + "' is before exposure_to '"
                        + toText + "' (cut the exposure window at the onset)");
            }
            b.add(id, from, to, onset);
        });
        return new ReadResult<>(b.build(), t.file, t.size(), scale.dates, scale.origin, skipped);
    }

    /**
     * Reads a daily-counts file: {@code day,cases[,deaths][,recoveries][,imported]}, one row per
     * day in consecutive order (see {@link DailyCounts}); counts are whole numbers &ge; 0. Rows
     * of daily counts are never skipped, even when skipping is requested, because a left-out day
     * would leave a gap in the series.
     *
     * @param path    the file
     * @param options origin ({@code skipBadRows} is not honoured, see above)
     * @return the counts
     * @throws InputException naming file, line, column and fault
     */
    public static ReadResult<DailyCounts> dailyCounts(Path path, ReadOptions options) {
        CsvTable t = CsvTable.read(path, COUNT_COLUMNS, COUNT_OPTIONAL);
        TimeScale scale = TimeScale.of(t, List.of("day"), options);
        DailyCounts.Builder b = DailyCounts.builder();
        if (t.has("deaths")) {
            b.withDeaths();
        }
        if (t.has("recoveries")) {
            b.withRecoveries();
        }
        if (t.has("imported")) {
            b.withImported();
        }
        String[] previous = new String[1];
        int[] previousLine = new int[1];
        ReadOptions strict = new ReadOptions(options.origin(), false);
        String suffix = options.skipBadRows()
                ? " (rows of daily counts are not skipped: a left-out day would leave a gap)" : "";
        readRows(t, strict, Map.of("day", "day", "cases", "cases", "deaths", "deaths",
                "recoveries", "recoveries", "imported", "imported"), suffix, r -> {
            String dayText = t.value(r, "day");
            int day = scale.parseDay("day", dayText);
            int cases = count(required(t, r, "cases"), "cases");
            int deaths = optionalCount(t, r, "deaths");
            int recoveries = optionalCount(t, r, "recoveries");
            int imported = optionalCount(t, r, "imported");
            int n = b.size();
            if (n > 0) {
                double expected = scale.parseDay("day", previous[0]) + 1;
                if (day != expected) {
                    throw new RowFault("day", "day '" + dayText + "' does not follow day '" + previous[0]
                            + "' (line " + previousLine[0] + "): days must be consecutive and increasing;"
                            + " enter days without cases as explicit zeros");
                }
            }
            b.add(day, cases, deaths, recoveries, imported);
            previous[0] = dayText;
            previousLine[0] = t.line(r);
        });
        return new ReadResult<>(b.build(), t.file, t.size(), scale.dates, scale.origin, List.of());
    }

    private static List<SkippedRow> readRows(CsvTable t, ReadOptions options, Map<String, String> fields,
                                             RowReader reader) {
        return readRows(t, options, fields, "", reader);
    }

    private static List<SkippedRow> readRows(CsvTable t, ReadOptions options, Map<String, String> fields,
                                             String suffix, RowReader reader) {
        List<SkippedRow> skipped = new ArrayList<>();
        int used = 0;
        for (int r = 0; r < t.size(); r++) {
            String column = null;
            String reason = t.fault(r);
            if (reason == null) {
                try {
                    reader.read(r);
                    used++;
                    continue;
                } catch (RowFault e) {
                    column = e.column;
                    reason = e.getMessage();
                } catch (ObservationException e) {
                    column = fields.get(e.field());
                    reason = e.getMessage();
                }
            }
            if (!options.skipBadRows()) {
                int number = column != null && t.has(column) ? t.number(column) : 0;
                throw new InputException(t.file, t.line(r), number, reason + suffix);
            }
            skipped.add(new SkippedRow(t.file, t.line(r), reason));
        }
        if (used == 0) {
            throw new InputException(t.file, 0, 0, "no usable data rows (all " + t.size()
                    + " were bad and skipped)");
        }
        return skipped;
    }

    private static String required(CsvTable t, int r, String column) {
        return required(t, r, t.column(column), column);
    }

    private static String required(CsvTable t, int r, int index, String column) {
        String v = t.value(r, index);
        if (v.isEmpty()) {
            throw new RowFault(column, "column '" + column + "': value is missing");
        }
        return v;
    }

    private static int count(String text, String column) {
        if (text.isEmpty()) {
            throw new RowFault(column, "column '" + column + "': value is missing");
        }
        if (!COUNT.matcher(text).matches()) {
            throw new RowFault(column, "column '" + column + "': '" + text + "' is not a whole number >= 0");
        }
        try {
            return Integer.parseInt(text);
        } catch (NumberFormatException e) {
            throw new RowFault(column, "column '" + column + "': " + text + " is too large");
        }
    }

    /** How a row's message names its case; built only for a bad row. */
    private static String what(String id) {
        return "case '" + id + "'";
    }

    private static String shown(String text) {
        return text.isEmpty() ? "(empty)" : "'" + text + "'";
    }

    private static int optionalCount(CsvTable t, int r, String column) {
        return t.has(column) ? count(t.value(r, column), column) : DailyCounts.ABSENT;
    }

    private static boolean bool(String text, String column) {
        switch (text.toLowerCase(Locale.ROOT)) {
            case "true", "yes", "1":
                return true;
            case "false", "no", "0":
                return false;
            default:
                throw new RowFault(column, "column '" + column + "': '" + text
                        + "' is not one of true, false, yes, no, 1, 0");
        }
    }
}
