package org.incipit.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.LongStream;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.observe.AmbiguousStartCases;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The intervals reader gives the same cases and the same skipped rows whichever way the file is
 * scanned: by the plain byte scan, or by commons-csv (the reference parser), which reads it when
 * one non-ASCII character (here in a comment) makes the text not plain; and both agree with a
 * direct model of the file computed here with {@link Double#parseDouble} (cases in order of first
 * appearance, candidates sorted by start, bad rows skipped). A third file with non-ASCII case
 * ids goes through commons-csv and the UTF-8 byte ranges. Seeded generated files (bounded in
 * number): one case's end written in different forms of the same number ({@code 12.5},
 * {@code 1.25e1}, {@code +12.50}, with spaces around), unreadable starts and starts after the end.
 */
class IntervalsReaderPathsTest {

    @TempDir
    Path dir;

    static LongStream seeds() {
        return LongStream.range(0, 60).map(i -> 20261202L * 31 + i);
    }

    /** A number written in one of several forms of the same value. */
    private static String written(double x, UniformRandomProvider rng) {
        String plain = Double.toString(x);
        String s = switch (rng.nextInt(5)) {
            case 0 -> plain;
            case 1 -> new java.math.BigDecimal(plain).toPlainString() + "0";
            case 2 -> "+" + plain;
            case 3 -> new java.math.BigDecimal(plain).movePointLeft(1).toPlainString() + "e1";
            default -> new java.math.BigDecimal(plain).movePointRight(2).toPlainString() + "E-2";
        };
        return rng.nextInt(4) == 0 ? " " + s + "\t" : s;
    }

    private record Row(String id, String end, String start) {
    }

    private static List<Row> rows(long seed, String... ids) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        Map<String, Double> ends = new LinkedHashMap<>();
        List<Row> rows = new ArrayList<>();
        int n = 1 + rng.nextInt(40);
        for (int i = 0; i < n; i++) {
            String id = ids[rng.nextInt(ids.length)];
            double end = ends.computeIfAbsent(id, k -> Math.rint(rng.nextDouble() * 400) / 8);
            String start = switch (rng.nextInt(10)) {
                case 0 -> "x" + rng.nextInt(9);                       // unreadable
                case 1 -> written(end + 1 + rng.nextInt(5), rng);     // after the end
                default -> written(Math.rint(rng.nextDouble() * end * 64) / 64, rng);
            };
            rows.add(new Row(id, written(end, rng), start));
        }
        return rows;
    }

    private Path write(String name, String firstLine, List<Row> rows) throws IOException {
        StringBuilder b = new StringBuilder(firstLine).append("case,end,start\n");
        for (Row r : rows) {
            b.append(r.id()).append(',').append(r.end()).append(',').append(r.start()).append('\n');
        }
        Path p = dir.resolve(name);
        Files.writeString(p, b.toString(), StandardCharsets.UTF_8);
        return p;
    }

    /** The model: ids, ends, starts (sorted per case) and skipped data rows (0-based), or null if none usable. */
    private static String model(List<Row> rows) {
        Map<String, List<Double>> starts = new LinkedHashMap<>();
        Map<String, Double> ends = new LinkedHashMap<>();
        List<Integer> skipped = new ArrayList<>();
        for (int i = 0; i < rows.size(); i++) {
            Row r = rows.get(i);
            double end = Double.parseDouble(r.end().strip());
            double start;
            try {
                start = Double.parseDouble(r.start().strip());
            } catch (NumberFormatException e) {
                skipped.add(i);
                continue;
            }
            if (start > end) {
                skipped.add(i);
                continue;
            }
            ends.put(r.id(), end);
            starts.computeIfAbsent(r.id(), k -> new ArrayList<>()).add(start);
        }
        if (ends.isEmpty()) {
            return null;
        }
        StringBuilder b = new StringBuilder();
        for (String id : ends.keySet()) {
            List<Double> s = starts.get(id);
            s.sort(Comparator.naturalOrder());
            b.append(id).append(" end ").append(ends.get(id)).append(" starts ").append(s).append('\n');
        }
        return b.append("skipped ").append(skipped).toString();
    }

    /** The same view of what the reader gave; data rows of skipped lines counted from {@code firstDataLine}. */
    private static String shown(ReadResult<AmbiguousStartCases> r, int firstDataLine) {
        AmbiguousStartCases c = r.data();
        StringBuilder b = new StringBuilder();
        for (int i = 0; i < c.caseCount(); i++) {
            List<Double> s = new ArrayList<>();
            for (int j = c.offset(i); j < c.offset(i + 1); j++) {
                s.add(c.start(j));
            }
            b.append(c.id(i)).append(" end ").append(c.end(i)).append(" starts ").append(s).append('\n');
        }
        List<Integer> skipped = new ArrayList<>();
        for (SkippedRow k : r.skipped()) {
            skipped.add(k.line() - firstDataLine);
        }
        return b.append("skipped ").append(skipped).toString();
    }

    private static String read(Path p, int firstDataLine) {
        try {
            return shown(CsvInput.intervals(p, new ReadOptions(null, true)), firstDataLine);
        } catch (InputException e) {
            return e.getMessage().contains("no usable data rows") ? null : e.getMessage();
        }
    }

    @ParameterizedTest
    @MethodSource("seeds")
    void plainScanAndCommonsCsvGiveTheModelsCases(long seed) throws IOException {
        List<Row> rows = rows(seed, "c1", "c2", "c3", "k-10", "k-11");
        Path plain = write("plain.csv", "", rows);
        Path other = write("other.csv", "# r\u00e9sum\u00e9 of the exposures\n", rows);
        assertNotNull(PlainCsv.scan(Files.readAllBytes(plain)), "the first file is read by the plain scan");
        assertNull(PlainCsv.scan(Files.readAllBytes(other)), "the second is read by commons-csv");
        String expected = model(rows);
        assertEquals(expected, read(plain, 2), "plain scan");
        assertEquals(expected, read(other, 3), "commons-csv");
    }

    @ParameterizedTest
    @MethodSource("seeds")
    void nonAsciiCaseIdsAreReadFromTheirUtf8Bytes(long seed) throws IOException {
        List<Row> rows = rows(seed, "Zo\u00eb", "\u0663\u0661", "case \u00c5", "c\u00e9", "c\u00e9\u00e9");
        Path p = write("utf8.csv", "", rows);
        assertEquals(model(rows), read(p, 2));
    }

    @ParameterizedTest
    @MethodSource("seeds")
    void sameIdsGiveTheSameStringsAndOrder(long seed) throws IOException {
        List<Row> rows = rows(seed, "a", "ab", "b", "ba"); // ids that are prefixes of others
        Path p = write("ids.csv", "", rows);
        String m = model(rows);
        assertEquals(m, read(p, 2));
        if (m == null) {
            return; // no usable row: the reader refused the file, as the line above checked
        }
        ReadResult<AmbiguousStartCases> r = CsvInput.intervals(p, new ReadOptions(null, true));
        List<String> firstSeen = new ArrayList<>();
        for (String line : m.split("\n")) {
            if (!line.startsWith("skipped")) {
                firstSeen.add(line.substring(0, line.indexOf(" end ")));
            }
        }
        assertEquals(firstSeen, r.data().ids());
        assertArrayEquals(firstSeen.stream().mapToInt(id -> (int) rows.stream()
                .filter(x -> x.id().equals(id)).filter(x -> usable(x)).count()).toArray(),
                java.util.stream.IntStream.range(0, r.data().caseCount()).map(i -> r.data().candidateCount(i)).toArray());
    }

    private static boolean usable(Row r) {
        try {
            return Double.parseDouble(r.start().strip()) <= Double.parseDouble(r.end().strip());
        } catch (NumberFormatException e) {
            return false;
        }
    }
}
