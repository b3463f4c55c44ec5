package org.incipit.core.observe;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

class AmbiguousStartCasesTest {

    static void rejects(String field, String message, Runnable r) {
        ObservationException e = assertThrows(ObservationException.class, r::run);
        assertEquals(field, e.field());
        assertEquals(message, e.getMessage());
    }

    @Test
    void sizeHintMustNotBeNegative() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> AmbiguousStartCases.builder(-1));
        assertEquals("expectedCandidates must be >= 0, was -1", e.getMessage());
        AmbiguousStartCases c = AmbiguousStartCases.builder(0).addCandidate("a", 5, 1).addCandidate("a", 5, 2).build();
        assertEquals(2, c.candidateCount());
    }

    @Test
    void roundTripSortsCandidatesWithinCaseStablyAndKeepsCaseOrder() {
        AmbiguousStartCases c = AmbiguousStartCases.builder()
                .addCandidate("B", 20, 15, "work", 4)
                .addCase("A", 10, new double[] {9, 3, 9, 5},
                        new String[] {"school", "home", "work", "home"}, AmbiguousStartCases.UNKNOWN_TOTAL)
                .addCandidate("B", 20, 12, "home", 4)
                .addCandidate("B", 20, 15, "school", 4)
                .build();
        assertEquals(2, c.caseCount());
        assertEquals(List.of("B", "A"), c.ids());
        assertEquals("A", c.id(1));
        assertEquals(7, c.candidateCount());
        assertArrayEquals(new int[] {0, 3, 7}, c.offsets());
        assertEquals(3, c.offset(1));
        assertEquals(3, c.candidateCount(0));
        assertArrayEquals(new double[] {20, 10}, c.ends());
        assertEquals(10, c.end(1));
        assertArrayEquals(new double[] {12, 15, 15, 3, 5, 9, 9}, c.starts());
        assertEquals(12, c.start(0));
        assertEquals(List.of("work", "school", "home"), c.categoryNames());
        // B: 12 home, 15 work, 15 school (tie kept in insertion order);
        // A: 3 home, 5 home, 9 school, 9 work
        assertArrayEquals(new int[] {2, 0, 1, 2, 2, 1, 0}, c.categoryCodes());
        assertEquals(2, c.categoryCode(0));
        assertTrue(c.hasCategories());
        assertEquals(4, c.totalExposures(0));
        assertEquals(AmbiguousStartCases.UNKNOWN_TOTAL, c.totalExposures(1));
        assertTrue(c.hasTotalExposures());
        assertEquals(1, c.indexOf("A"));
        assertEquals(-1, c.indexOf("Z"));
    }

    @Test
    void withoutCategoriesOrTotals() {
        AmbiguousStartCases c = AmbiguousStartCases.builder().addCase("A", 5, 5, 1).build();
        assertFalse(c.hasCategories());
        assertFalse(c.hasTotalExposures());
        assertEquals(List.of(), c.categoryNames());
        assertArrayEquals(new int[] {-1, -1}, c.categoryCodes());
        assertArrayEquals(new double[] {1, 5}, c.starts(), "start equal to end is allowed");
    }

    @Test
    void arraysAreCopiedOut() {
        AmbiguousStartCases c = AmbiguousStartCases.builder().addCase("A", 5, 1).build();
        c.starts()[0] = 99;
        c.ends()[0] = 99;
        c.offsets()[0] = 99;
        c.categoryCodes()[0] = 99;
        assertEquals(1, c.start(0));
        assertEquals(5, c.end(0));
        assertEquals(0, c.offset(0));
        assertEquals(-1, c.categoryCode(0));
    }

    @Test
    void arraysAreCopiedIn() {
        double[] starts = {1, 2};
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder().addCase("A", 5, starts);
        starts[0] = 4;
        assertArrayEquals(new double[] {1, 2}, b.build().starts());
    }

    @Test
    void rejectsStartAfterEnd() {
        rejects("start", "case 'A': start 11.0 is after end 10.0 (a start must not be after the end)",
                () -> AmbiguousStartCases.builder().addCandidate("A", 10, 11));
    }

    @Test
    void rejectsCaseWithoutCandidates() {
        rejects("start", "case 'A' has no candidate start (at least one is required)",
                () -> AmbiguousStartCases.builder().addCase("A", 10));
    }

    @Test
    void rejectsTotalBelowCandidateCount() {
        rejects("totalExposures", "case 'A' has 2 candidate starts, more than its total number of exposures 1",
                () -> AmbiguousStartCases.builder().addCase("A", 10, new double[] {1, 2}, null, 1));
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder().addCandidate("A", 10, 1, null, 1);
        rejects("totalExposures", "case 'A' has 2 candidate starts, more than its total number of exposures 1",
                () -> b.addCandidate("A", 10, 2, null, 1));
        rejects("totalExposures", "case 'B': total number of exposures must be >= 1 (or unknown), was 0",
                () -> b.addCandidate("B", 10, 2, null, 0));
    }

    @Test
    void rejectsDisagreementWithEarlierRowsOfTheCase() {
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder().addCandidate("A", 10, 1, null, 3);
        rejects("end", "case 'A': end 11.0 disagrees with end 10.0 given for the case before",
                () -> b.addCandidate("A", 11, 1, null, 3));
        rejects("totalExposures",
                "case 'A': total number of exposures 4 disagrees with 3 given for the case before",
                () -> b.addCandidate("A", 10, 1, null, 4));
        rejects("totalExposures",
                "case 'A': total number of exposures (unknown) disagrees with 3 given for the case before",
                () -> b.addCandidate("A", 10, 1));
        assertEquals(1, b.build().candidateCount(), "rejected rows leave the builder unchanged");
    }

    @Test
    void rejectsMixedCategories() {
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder().addCandidate("A", 10, 1, "home", -1);
        rejects("category", "case 'B': candidate has no category, but earlier candidates have one",
                () -> b.addCandidate("B", 10, 1));
        AmbiguousStartCases.Builder b2 = AmbiguousStartCases.builder().addCandidate("A", 10, 1);
        rejects("category", "case 'B': candidate has category 'x', but earlier candidates have none",
                () -> b2.addCandidate("B", 10, 1, "x", -1));
        rejects("category", "case 'B': category must not be blank",
                () -> b2.addCandidate("B", 10, 1, " ", -1));
        rejects("category", "case 'B': 1 categories for 2 candidate starts",
                () -> b2.addCase("B", 10, new double[] {1, 2}, new String[] {"x"}, -1));
    }

    @Test
    void failedAddCaseLeavesNoTrace() {
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder();
        rejects("start", "case 'A': start 12.0 is after end 10.0 (a start must not be after the end)",
                () -> b.addCase("A", 10, new double[] {1, 12}, new String[] {"new", "new"}, -1));
        assertEquals(0, b.caseCount());
        AmbiguousStartCases c = b.addCase("A", 10, 1, 2).build();
        assertFalse(c.hasCategories());
        assertEquals(2, c.candidateCount());
    }

    @Test
    void failedAddCaseAfterOtherCasesRemovesOnlyItsOwnCandidates() {
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder()
                .addCandidate("A", 10, 4, "home", -1)
                .addCandidate("B", 8, 1, "home", -1)
                .addCandidate("A", 10, 2, "home", -1);
        rejects("start", "case 'C': start 13.0 is after end 12.0 (a start must not be after the end)",
                () -> b.addCase("C", 12, new double[] {1, 3, 13}, new String[] {"work", "home", "work"}, -1));
        assertEquals(2, b.caseCount());
        AmbiguousStartCases c = b.addCandidate("A", 10, 3, "home", -1).build();
        assertEquals(List.of("A", "B"), c.ids());
        assertArrayEquals(new int[] {0, 3, 4}, c.offsets());
        assertArrayEquals(new double[] {2, 3, 4, 1}, c.starts());
        assertEquals(List.of("home"), c.categoryNames(), "the category 'work' of the failed case is gone");
        assertEquals(-1, c.indexOf("C"));
    }

    @Test
    void rejectsDuplicateCaseInAddCase() {
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder().addCase("A", 10, 1);
        rejects("id", "case 'A' was added before (case ids must be unique)", () -> b.addCase("A", 10, 2));
    }

    @Test
    void rejectsNonFiniteTimesAndBlankIds() {
        rejects("end", "case 'A': end must be a finite number of days, was NaN",
                () -> AmbiguousStartCases.builder().addCandidate("A", Double.NaN, 1));
        rejects("start", "case 'A': start must be a finite number of days, was -Infinity",
                () -> AmbiguousStartCases.builder().addCandidate("A", 1, Double.NEGATIVE_INFINITY));
        rejects("id", "case id must not be empty", () -> AmbiguousStartCases.builder().addCandidate(" ", 1, 1));
        rejects("id", "case id must not be empty", () -> AmbiguousStartCases.builder().addCandidate(null, 1, 1));
    }

    @Test
    void rejectsEmptyBuild() {
        rejects("id", "no cases (at least one case is required)", () -> AmbiguousStartCases.builder().build());
    }
}
