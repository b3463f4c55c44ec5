package org.incipit.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.List;
import java.util.function.Function;
import java.util.stream.Stream;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.observe.DailyCounts;
import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

class CsvInputTest {

    private static final ReadOptions STRICT = ReadOptions.defaults();
    private static final ReadOptions SKIP = new ReadOptions(null, true);

    @TempDir
    Path dir;

    private Path file(String name, String text) throws IOException {
        Path p = dir.resolve(name);
        Files.writeString(p, text, StandardCharsets.UTF_8);
        return p;
    }

    @Test
    void intervalsWithDayNumbers() throws IOException {
        Path p = file("i.csv", "# a comment\ncase,end,start,kind,exposures_total\n"
                + "A,10,7,home,3\n\nA,10,4,work,3\n# another\nB,12.5,12.5,home,\n");
        ReadResult<AmbiguousStartCases> r = CsvInput.intervals(p, STRICT);
        AmbiguousStartCases c = r.data();
        assertEquals(List.of("A", "B"), c.ids());
        assertArrayEquals(new double[] {10, 12.5}, c.ends());
        assertArrayEquals(new double[] {4, 7, 12.5}, c.starts());
        assertEquals(List.of("home", "work"), c.categoryNames());
        assertArrayEquals(new int[] {1, 0, 0}, c.categoryCodes());
        assertEquals(3, c.totalExposures(0));
        assertEquals(AmbiguousStartCases.UNKNOWN_TOTAL, c.totalExposures(1));
        assertEquals(3, r.dataRows());
        assertFalse(r.dates());
        assertNull(r.origin());
        assertTrue(r.skipped().isEmpty());
        assertEquals(p.toString(), r.file());
    }

    @Test
    void intervalsWithDatesUseEarliestDateAsOrigin() throws IOException {
        Path p = file("i.csv", "CASE, End ,start\nA,2024-03-10,2024-03-05\nA,2024-03-10,2024-02-28\n");
        ReadResult<AmbiguousStartCases> r = CsvInput.intervals(p, STRICT);
        assertTrue(r.dates());
        assertEquals(LocalDate.of(2024, 2, 28), r.origin());
        // 2024 is a leap year: 28 Feb -> 10 Mar is 11 days
        assertArrayEquals(new double[] {11}, r.data().ends());
        assertArrayEquals(new double[] {0, 6}, r.data().starts());
        assertEquals(LocalDate.of(2024, 3, 10), r.dateOf(11));
        assertEquals(LocalDate.of(2024, 3, 10), r.dateOf(11.7));
    }

    @Test
    void givenOriginIsUsedForDatesAndReportedForNumbers() throws IOException {
        Path dates = file("d.csv", "case,end,start\nA,2024-03-10,2024-03-05\n");
        ReadResult<AmbiguousStartCases> r = CsvInput.intervals(dates, new ReadOptions(LocalDate.of(2024, 3, 1), false));
        assertArrayEquals(new double[] {9}, r.data().ends());
        assertArrayEquals(new double[] {4}, r.data().starts());
        Path numbers = file("n.csv", "case,end,start\nA,9,4\n");
        ReadResult<AmbiguousStartCases> n = CsvInput.intervals(numbers, new ReadOptions(LocalDate.of(2024, 3, 1), false));
        assertEquals(LocalDate.of(2024, 3, 10), n.dateOf(9));
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> CsvInput.intervals(numbers, STRICT).dateOf(1));
        assertEquals(numbers + ": times are day numbers without an origin date", e.getMessage());
    }

    @Test
    void delaysWithCensoringAndCutoff() throws IOException {
        Path p = file("d.csv", "case,primary,secondary,daily\nA,1,4,\nB,5,,\nC,2,2.5,false\nD,3,6,yes\n");
        ReadResult<DelayPairs> r = CsvInput.delays(p, STRICT, "8");
        DelayPairs d = r.data();
        assertEquals(4, d.size());
        assertEquals(8, d.cutoff().getAsDouble());
        assertArrayEquals(new boolean[] {true, false, true, true}, d.observedFlags());
        assertArrayEquals(new double[] {4, 8, 2.5, 6}, d.secondaries());
        assertArrayEquals(new boolean[] {false, false, false, true}, d.dailyFlags(), "numbers default to exact");
    }

    @Test
    void delaysWithDatesAreDailyByDefaultAndTakeADateCutoff() throws IOException {
        Path p = file("d.csv", "case,primary,secondary\nA,2024-01-01,2024-01-04\nB,2024-01-03,\n");
        DelayPairs d = CsvInput.delays(p, STRICT, "2024-01-11").data();
        assertEquals(10, d.cutoff().getAsDouble());
        assertArrayEquals(new boolean[] {true, true}, d.dailyFlags());
        assertArrayEquals(new double[] {0, 2}, d.primaries());
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> CsvInput.delays(p, STRICT, "10"));
        assertEquals("cut-off '10' is a day number, but the file's times are dates; give it as a date (yyyy-MM-dd)",
                e.getMessage());
        Path n = file("n.csv", "case,primary,secondary\nA,1,4\n");
        e = assertThrows(IllegalArgumentException.class, () -> CsvInput.delays(n, STRICT, "2024-01-11"));
        assertEquals("cut-off '2024-01-11' is a date, but the file's times are day numbers without an origin date",
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> CsvInput.delays(n, STRICT, "soon"));
        assertEquals("cut-off 'soon' is neither a day number nor a date (yyyy-MM-dd)", e.getMessage());
    }

    @Test
    void incubationAndCounts() throws IOException {
        ExposureWindows w = CsvInput.incubation(file("w.csv",
                "case,exposure_from,exposure_to,onset\nA,1,3,8\nB,2,2,4\n"), STRICT).data();
        assertArrayEquals(new double[] {1, 2}, w.exposureFroms());
        assertArrayEquals(new double[] {3, 2}, w.exposureTos());
        assertArrayEquals(new double[] {8, 4}, w.onsets());
        DailyCounts d = CsvInput.dailyCounts(file("c.csv",
                "day,cases,deaths,imported\n2024-02-28,3,0,3\n2024-02-29,0,0,0\n2024-03-01,5,1,1\n"), STRICT).data();
        assertEquals(0, d.firstDay());
        assertArrayEquals(new int[] {3, 0, 5}, d.cases());
        assertArrayEquals(new int[] {0, 0, 1}, d.deaths());
        assertArrayEquals(new int[] {3, 0, 1}, d.imported());
        assertFalse(d.hasRecoveries());
        DailyCounts n = CsvInput.dailyCounts(file("n.csv", "day,cases\n-1,3\n0,4\n"), STRICT).data();
        assertEquals(-1, n.firstDay());
    }

    /** Every fault with the exact message: file name, line, column and reason. */
    static Stream<Arguments> badFiles() {
        return Stream.of(
                // kind, content, expected message after "<file>"
                Arguments.of("intervals", "", ": empty file (expected a header line: case,end,start)"),
                Arguments.of("intervals", "# only a comment\n", ": empty file (expected a header line: case,end,start)"),
                Arguments.of("intervals", "case,end,start\n", ": no data rows (only a header on line 1)"),
                Arguments.of("intervals", "case,end\nA,1\n",
                        ":1: header: missing column 'start' (required columns: case,end,start)"),
                Arguments.of("intervals", "# c\ncase,end,start,kinds\nA,1,1,x\n",
                        ":2:4: header: unknown column 'kinds' (known columns: case, end, start, kind, exposures_total)"),
                Arguments.of("intervals", "case,end,start,end\nA,1,1,1\n", ":1:4: header: column 'end' appears twice"),
                Arguments.of("intervals", "case,end,start\nA,10,abc\n",
                        ":2:3: column 'start': cannot read 'abc' as a day number or a date (yyyy-MM-dd)"),
                Arguments.of("intervals", "case,end,start\nA,10,\n", ":2:3: column 'start': value is missing"),
                Arguments.of("intervals", "case,end,start\n,10,1\n", ":2:1: column 'case': value is missing"),
                Arguments.of("intervals", "case,end,start\nA,10,1,7\n", ":2: row has 4 values, the header has 3 columns"),
                Arguments.of("intervals", "case,end,start\nA,10,1\nB,10,2024-01-01\n",
                        ":3:3: column 'start' mixes day numbers and dates: line 2 has a day number, this line has a date"),
                Arguments.of("intervals", "case,end,start\nA,2024-01-05,1\n",
                        ":2:3: column 'start' holds day numbers but column 'end' holds dates (line 2); "
                                + "use one kind for all time columns"),
                Arguments.of("intervals", "case,end,start\nA,2024-02-30,2024-02-01\n",
                        ":2:2: column 'end': '2024-02-30' is not a valid date"),
                Arguments.of("intervals", "case,end,start\nA,10,1\n#\nA,10,12\n",
                        ":4:3: case 'A': start '12' is after end '10'"),
                Arguments.of("intervals", "case,end,start\nA,10,1\nA,11,2\n",
                        ":3:2: case 'A': end '11' disagrees with end '10' on line 2"),
                Arguments.of("intervals", "case,end,start,exposures_total\nA,10,1,2\nA,10,2,\n",
                        ":3:4: case 'A': exposures_total (empty) disagrees with '2' on line 2"),
                Arguments.of("intervals", "case,end,start,exposures_total\nA,10,1,1\nA,10,2,1\n",
                        ":3:4: case 'A' has 2 candidate starts, more than its total number of exposures 1"),
                Arguments.of("intervals", "case,end,start,exposures_total\nA,10,1,0\n",
                        ":2:4: column 'exposures_total': must be >= 1, was 0"),
                Arguments.of("intervals", "case,end,start,kind\nA,10,1,home\nB,10,1,\n",
                        ":3:4: column 'kind': value is missing"),
                Arguments.of("delays", "case,primary,secondary\nA,5,3\n",
                        ":2:3: case 'A': secondary '3' is before primary '5'"),
                Arguments.of("delays", "case,primary,secondary\nA,5,\n",
                        ":2:3: case 'A': secondary is empty (not yet observed), but no cut-off was given"),
                Arguments.of("delays", "case,primary,secondary\nA,5,6\nA,1,2\n",
                        ":3:1: pair 'A' was added before (pair ids must be unique)"),
                Arguments.of("delays", "case,primary,secondary,daily\nA,5,6,maybe\n",
                        ":2:4: column 'daily': 'maybe' is not one of true, false, yes, no, 1, 0"),
                Arguments.of("incubation", "case,exposure_from,exposure_to,onset\nA,3,2,5\n",
                        ":2:3: case 'A': exposure_to '2' is before exposure_from '3'"),
                Arguments.of("incubation", "case,exposure_from,exposure_to,onset\nA,1,4,3\n",
                        ":2:4: case 'A': onset '3' is before exposure_to '4' (cut the exposure window at the onset)"),
                Arguments.of("counts", "day,cases\n1,2\n3,4\n",
                        ":3:1: day '3' does not follow day '1' (line 2): days must be consecutive and increasing;"
                                + " enter days without cases as explicit zeros"),
                Arguments.of("counts", "day,cases\n1,-2\n", ":2:2: column 'cases': '-2' is not a whole number >= 0"),
                Arguments.of("counts", "day,cases\n1.5,2\n", ":2:1: column 'day': day '1.5' is not a whole day number"),
                Arguments.of("counts", "day,cases,imported\n1,2,3\n",
                        ":2:3: day 1: imported 3 exceeds cases 2 (imported cases are part of the day's cases)"),
                Arguments.of("counts", "day,cases,deaths\n1,2,\n", ":2:3: column 'deaths': value is missing"));
    }

    @ParameterizedTest
    @MethodSource("badFiles")
    void badInputNamesFileLineColumnAndFault(String kind, String content, String expected) throws IOException {
        Path p = file(kind + ".csv", content);
        InputException e = assertThrows(InputException.class, () -> read(kind).apply(p));
        assertEquals(p + expected, e.getMessage());
    }

    static Function<Path, Object> read(String kind) {
        return switch (kind) {
            case "intervals" -> p -> CsvInput.intervals(p, STRICT);
            case "delays" -> p -> CsvInput.delays(p, STRICT, null);
            case "incubation" -> p -> CsvInput.incubation(p, STRICT);
            case "counts" -> p -> CsvInput.dailyCounts(p, STRICT);
            default -> throw new IllegalArgumentException(kind);
        };
    }

    @Test
    void positionFieldsOfTheException() throws IOException {
        Path p = file("i.csv", "case,end,start\nA,10,abc\n");
        InputException e = assertThrows(InputException.class, () -> CsvInput.intervals(p, STRICT));
        assertEquals(p.toString(), e.file());
        assertEquals(2, e.line());
        assertEquals(3, e.column());
        assertEquals("column 'start': cannot read 'abc' as a day number or a date (yyyy-MM-dd)", e.reason());
    }

    @Test
    void missingFileAndBadEncoding() throws IOException {
        Path missing = dir.resolve("missing.csv");
        InputException e = assertThrows(InputException.class, () -> CsvInput.intervals(missing, STRICT));
        assertEquals(missing + ": cannot read the file (NoSuchFileException: " + missing + ")", e.getMessage());
        Path latin1 = dir.resolve("latin1.csv");
        Files.write(latin1, new byte[] {'c', 'a', 's', 'e', ',', 'e', 'n', 'd', ',', 's', 't', 'a', 'r', 't', '\n',
            (byte) 0xe9, ',', '1', ',', '1', '\n'});
        e = assertThrows(InputException.class, () -> CsvInput.intervals(latin1, STRICT));
        assertEquals(latin1 + ": not valid UTF-8 text", e.getMessage());
    }

    @Test
    void byteOrderMarkIsIgnored() throws IOException {
        Path p = file("bom.csv", "\uFEFFcase,end,start\nA,1,1\n");
        assertEquals(1, CsvInput.intervals(p, STRICT).data().caseCount());
    }

    @Test
    void quotedMultiLineValueReportsTheLineWhereTheRowStarts() throws IOException {
        Path p = file("q.csv", "case,end,start\n\"A\nB\",10,1\nC,10,x\n");
        InputException e = assertThrows(InputException.class, () -> CsvInput.intervals(p, STRICT));
        assertEquals(p + ":4:3: column 'start': cannot read 'x' as a day number or a date (yyyy-MM-dd)",
                e.getMessage());
    }

    @Test
    void skippingListsEveryBadRow() throws IOException {
        Path p = file("i.csv", "case,end,start\nA,10,1\nA,10,12\nB,x,1\nC,5,1,9\nA,11,2\nD,3,3\n");
        ReadResult<AmbiguousStartCases> r = CsvInput.intervals(p, SKIP);
        assertEquals(List.of("A", "D"), r.data().ids());
        assertEquals(6, r.dataRows());
        List<String> skipped = r.skipped().stream().map(SkippedRow::toString).toList();
        assertEquals(List.of(
                p + ":3: case 'A': start '12' is after end '10'",
                p + ":4: column 'end': cannot read 'x' as a day number or a date (yyyy-MM-dd)",
                p + ":5: row has 4 values, the header has 3 columns",
                p + ":6: case 'A': end '11' disagrees with end '10' on line 2"), skipped);
    }

    @Test
    void skippingEveryRowIsStillAnError() throws IOException {
        Path p = file("i.csv", "case,end,start\nA,10,12\nB,x,1\n");
        InputException e = assertThrows(InputException.class, () -> CsvInput.intervals(p, SKIP));
        assertEquals(p + ": no usable data rows (all 2 were bad and skipped)", e.getMessage());
    }

    @Test
    void fileFaultsAreNotSkipped() throws IOException {
        Path p = file("i.csv", "case,end,start\nA,10,1\nB,10,2024-01-01\n");
        InputException e = assertThrows(InputException.class, () -> CsvInput.intervals(p, SKIP));
        assertEquals(p + ":3:3: column 'start' mixes day numbers and dates: line 2 has a day number, "
                + "this line has a date", e.getMessage());
    }

    @Test
    void dailyCountRowsAreNeverSkipped() throws IOException {
        Path p = file("c.csv", "day,cases\n1,2\n2,x\n3,4\n");
        InputException e = assertThrows(InputException.class, () -> CsvInput.dailyCounts(p, SKIP));
        assertEquals(p + ":3:2: column 'cases': 'x' is not a whole number >= 0"
                + " (rows of daily counts are not skipped: a left-out day would leave a gap)", e.getMessage());
    }

    @Test
    void cutoffViolationsAreReportedAtTheRow() throws IOException {
        Path p = file("d.csv", "case,primary,secondary\nA,1,4\nB,2,9\n");
        InputException e = assertThrows(InputException.class, () -> CsvInput.delays(p, STRICT, "8"));
        assertEquals(p + ":3:3: pair 'B': secondary 9.0 is after the cut-off 8.0", e.getMessage());
    }
}
