package org.incipit.core.observe;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Seeded random data sets (100, bounded): candidates added interleaved across cases come out
 * grouped by case in order of first appearance, sorted by start within each case, with every
 * (start, category) pair kept; and the order within a case is exactly that of a stable sort by
 * start (the reference is {@link List#sort}, documented as stable), also for cases with many
 * candidates.
 */
class AmbiguousStartCasesPropertyTest {

    private static final long SEED = 20240501L;

    static Stream<Long> seeds() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        return Stream.generate(rng::nextLong).limit(100);
    }

    @ParameterizedTest
    @MethodSource("seeds")
    void groupsSortsAndKeepsEveryCandidate(long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int cases = 1 + rng.nextInt(8);
        String[] categories = {"home", "work", "school"};
        record Row(String id, double end, double start, String category) {
        }
        List<Row> rows = new ArrayList<>();
        Map<String, Double> ends = new LinkedHashMap<>();
        for (int c = 0; c < cases; c++) {
            double end = 30 * rng.nextDouble();
            ends.put("c" + c, end);
            int m = 1 + rng.nextInt(5);
            for (int k = 0; k < m; k++) {
                // whole days make ties likely
                double start = rng.nextBoolean() ? Math.floor(end * rng.nextDouble()) : end * rng.nextDouble();
                rows.add(new Row("c" + c, end, start, categories[rng.nextInt(3)]));
            }
        }
        Collections.shuffle(rows, new java.util.Random(seed));
        // with or without a size hint, which may be below the number of rows (the storage grows)
        AmbiguousStartCases.Builder b = rng.nextBoolean() ? AmbiguousStartCases.builder()
                : AmbiguousStartCases.builder(rng.nextInt(2 * rows.size() + 1));
        List<String> firstSeen = new ArrayList<>();
        for (Row r : rows) {
            b.addCandidate(r.id(), r.end(), r.start(), r.category(), AmbiguousStartCases.UNKNOWN_TOTAL);
            if (!firstSeen.contains(r.id())) {
                firstSeen.add(r.id());
            }
        }
        AmbiguousStartCases a = b.build();
        assertEquals(firstSeen, a.ids());
        assertEquals(rows.size(), a.candidateCount());
        assertEquals(0, a.offset(0));
        assertEquals(rows.size(), a.offset(a.caseCount()));
        for (int i = 0; i < a.caseCount(); i++) {
            String id = a.id(i);
            assertEquals(ends.get(id), a.end(i));
            List<String> expected = new ArrayList<>();
            for (Row r : rows) {
                if (r.id().equals(id)) {
                    expected.add(r.start() + "/" + r.category());
                }
            }
            List<String> actual = new ArrayList<>();
            for (int j = a.offset(i); j < a.offset(i + 1); j++) {
                if (j > a.offset(i)) {
                    assertTrue(a.start(j - 1) <= a.start(j), "sorted within case");
                }
                assertTrue(a.start(j) <= a.end(i));
                actual.add(a.start(j) + "/" + a.categoryNames().get(a.categoryCode(j)));
            }
            Collections.sort(expected);
            Collections.sort(actual);
            assertEquals(expected, actual);
        }
    }

    @ParameterizedTest
    @MethodSource("seeds")
    void ordersEachCaseLikeAStableSortByStart(long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int cases = 1 + rng.nextInt(6);
        record Row(String id, double end, double start, int category) {
        }
        List<Row> rows = new ArrayList<>();
        for (int c = 0; c < cases; c++) {
            double end = 20 + 10 * rng.nextDouble();
            // up to 80 candidates: both the short-case and the long-case sort are reached
            int m = 1 + rng.nextInt(rng.nextBoolean() ? 8 : 80);
            for (int k = 0; k < m; k++) {
                double start = rng.nextInt(3) == 0 ? rng.nextInt(20) : end * rng.nextDouble(); // many ties
                rows.add(new Row("c" + c, end, start, rng.nextInt(4)));
            }
        }
        Collections.shuffle(rows, new java.util.Random(seed));
        String[] names = {"a", "b", "c", "d"};
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder();
        for (Row r : rows) {
            b.addCandidate(r.id(), r.end(), r.start(), names[r.category()], AmbiguousStartCases.UNKNOWN_TOTAL);
        }
        AmbiguousStartCases a = b.build();
        for (int i = 0; i < a.caseCount(); i++) {
            String id = a.id(i);
            List<Row> expected = new ArrayList<>();
            for (Row r : rows) {
                if (r.id().equals(id)) {
                    expected.add(r);
                }
            }
            expected.sort(java.util.Comparator.comparingDouble(Row::start));
            assertEquals(expected.size(), a.candidateCount(i));
            for (int k = 0; k < expected.size(); k++) {
                int j = a.offset(i) + k;
                assertEquals(expected.get(k).start(), a.start(j), "start " + k + " of case " + id);
                assertEquals(names[expected.get(k).category()], a.categoryNames().get(a.categoryCode(j)),
                        "category " + k + " of case " + id + " (ties keep the order added)");
            }
        }
    }
}
