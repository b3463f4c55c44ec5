package org.incipit.core.observe;

import static org.incipit.core.observe.AmbiguousStartCasesTest.rejects;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class DailyCountsTest {

    private static final int A = DailyCounts.ABSENT;

    @Test
    void roundTrip() {
        DailyCounts d = DailyCounts.builder().withDeaths().withImported()
                .add(-2, 3, 0, A, 3).add(-1, 0, 1, A, 0).add(0, 7, 0, A, 2).build();
        assertEquals(3, d.size());
        assertEquals(-2, d.firstDay());
        assertEquals(0, d.lastDay());
        assertEquals(-1, d.day(1));
        assertArrayEquals(new int[] {-2, -1, 0}, d.days());
        assertArrayEquals(new int[] {3, 0, 7}, d.cases());
        assertEquals(7, d.cases(2));
        assertEquals(10, d.totalCases());
        assertTrue(d.hasDeaths());
        assertFalse(d.hasRecoveries());
        assertTrue(d.hasImported());
        assertArrayEquals(new int[] {0, 1, 0}, d.deaths());
        assertArrayEquals(new int[] {3, 0, 2}, d.imported());
        IllegalStateException e = assertThrows(IllegalStateException.class, d::recoveries);
        assertEquals("recoveries were not recorded in these counts", e.getMessage());
        assertThrows(IndexOutOfBoundsException.class, () -> d.day(3));
    }

    @Test
    void rejectsGapsAndDisorder() {
        DailyCounts.Builder b = DailyCounts.builder().add(5, 1);
        rejects("day", "day 8 follows day 5: days must be consecutive "
                + "(enter days without cases as explicit zeros; missing days 6 to 7)", () -> b.add(8, 1));
        rejects("day", "day 5 follows day 5: days must be consecutive and increasing", () -> b.add(5, 1));
        assertEquals(1, b.size());
    }

    @Test
    void rejectsBadCounts() {
        rejects("cases", "day 0: cases must be >= 0, was -1", () -> DailyCounts.builder().add(0, -1));
        rejects("deaths", "day 0: deaths must be >= 0, was -2",
                () -> DailyCounts.builder().withDeaths().add(0, 1, -2, A, A));
        rejects("recoveries", "day 0: recoveries given as 4, but the builder does not record recoveries (pass ABSENT)",
                () -> DailyCounts.builder().add(0, 1, A, 4, A));
        rejects("imported", "day 0: imported 3 exceeds cases 2 (imported cases are part of the day's cases)",
                () -> DailyCounts.builder().withImported().add(0, 2, A, A, 3));
        rejects("day", "no days (at least one day is required)", () -> DailyCounts.builder().build());
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> DailyCounts.builder().add(0, 1).withDeaths());
        assertEquals("series must be chosen before the first day is added", e.getMessage());
    }
}
