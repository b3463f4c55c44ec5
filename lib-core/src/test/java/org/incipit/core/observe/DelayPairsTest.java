package org.incipit.core.observe;

import static org.incipit.core.observe.AmbiguousStartCasesTest.rejects;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;

class DelayPairsTest {

    /** An observed day-level pair, a pair censored at the cut-off 30, and an exact pair. */
    private static DelayPairs threePairs() {
        return DelayPairs.builder(30)
                .addObserved("P1", 3, 8, true)
                .addCensored("P2", 27, false)
                .addObserved("P3", 5, 5)
                .build();
    }

    @Test
    void roundTripWithCutoff() {
        DelayPairs p = threePairs();
        assertEquals(3, p.size());
        assertEquals(List.of("P1", "P2", "P3"), p.ids());
        assertArrayEquals(new double[] {3, 27, 5}, p.primaries());
        assertArrayEquals(new double[] {8, 30, 5}, p.secondaries(), "censored entry holds the cut-off");
        assertArrayEquals(new boolean[] {true, false, true}, p.observedFlags());
        assertArrayEquals(new boolean[] {true, false, false}, p.dailyFlags());
        assertEquals(OptionalDouble.of(30), p.cutoff());
        assertEquals(2, p.observedCount());
        assertEquals(1, p.censoredCount());
        assertEquals(8, p.secondary(0));
        assertTrue(p.isDaily(0));
        assertFalse(p.isObserved(1));
        IllegalStateException e = assertThrows(IllegalStateException.class, () -> p.secondary(1));
        assertEquals("pair 'P2' is censored at the cut-off: its secondary time is not known", e.getMessage());
    }

    @Test
    void observedOnlyAndWithCutoffCopyThePairs() {
        DelayPairs p = threePairs();
        DelayPairs o = p.observedOnly();
        assertEquals(List.of("P1", "P3"), o.ids());
        assertArrayEquals(new double[] {3, 5}, o.primaries());
        assertArrayEquals(new double[] {8, 5}, o.secondaries());
        assertArrayEquals(new boolean[] {true, false}, o.dailyFlags());
        assertEquals(OptionalDouble.empty(), o.cutoff());
        DelayPairs later = p.withCutoff(40);
        assertEquals(p.ids(), later.ids());
        assertArrayEquals(new double[] {8, 40, 5}, later.secondaries(), "the censored pair now runs to 40");
        assertArrayEquals(p.observedFlags(), later.observedFlags());
        assertArrayEquals(p.dailyFlags(), later.dailyFlags());
        assertEquals(OptionalDouble.of(40), later.cutoff());
        assertEquals(OptionalDouble.of(12), o.withCutoff(12).cutoff());
        assertThrows(IllegalArgumentException.class, () -> p.withCutoff(Double.NaN));
        assertThrows(ObservationException.class, () -> p.withCutoff(7), "P1's secondary 8 is after 7");
        rejects("id", "no pairs (at least one pair is required)",
                () -> DelayPairs.builder(30).addCensored("C", 1, false).build().observedOnly());
    }

    @Test
    void withoutCutoff() {
        DelayPairs p = DelayPairs.builder().addObserved("A", 1, 100).build();
        assertEquals(OptionalDouble.empty(), p.cutoff());
        assertEquals(0, p.censoredCount());
    }

    @Test
    void rejectsSecondaryBeforePrimary() {
        rejects("secondary", "pair 'A': secondary 2.0 is before primary 3.0 (a delay must be >= 0)",
                () -> DelayPairs.builder().addObserved("A", 3, 2));
    }

    @Test
    void rejectsTimesAfterCutoff() {
        rejects("secondary", "pair 'A': secondary 31.0 is after the cut-off 30.0",
                () -> DelayPairs.builder(30).addObserved("A", 3, 31));
        rejects("primary", "pair 'A': primary 31.0 is after the cut-off 30.0",
                () -> DelayPairs.builder(30).addCensored("A", 31, false));
    }

    @Test
    void rejectsCensoredWithoutCutoff() {
        rejects("secondary",
                "pair 'A': secondary not observed, but no cut-off was given (a censored pair needs one)",
                () -> DelayPairs.builder().addCensored("A", 1, false));
    }

    @Test
    void rejectsDuplicatesNonFiniteAndEmpty() {
        DelayPairs.Builder b = DelayPairs.builder().addObserved("A", 1, 2);
        rejects("id", "pair 'A' was added before (pair ids must be unique)", () -> b.addObserved("A", 1, 2));
        rejects("primary", "pair 'B': primary must be a finite number of days, was NaN",
                () -> b.addObserved("B", Double.NaN, 2));
        rejects("secondary", "pair 'B': secondary must be a finite number of days, was Infinity",
                () -> b.addObserved("B", 1, Double.POSITIVE_INFINITY));
        rejects("id", "pair id must not be empty", () -> b.addObserved("", 1, 2));
        assertEquals(1, b.size());
        rejects("id", "no pairs (at least one pair is required)", () -> DelayPairs.builder().build());
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> DelayPairs.builder(Double.NaN));
        assertEquals("cutoff must be a finite number of days, was NaN", e.getMessage());
    }
}
