package org.incipit.core.observe;

import static org.incipit.core.observe.AmbiguousStartCasesTest.rejects;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;

class ExposureWindowsTest {

    @Test
    void roundTrip() {
        ExposureWindows w = ExposureWindows.builder().add("C1", 2, 4, 9).add("C2", 5, 5, 5).build();
        assertEquals(2, w.size());
        assertEquals(List.of("C1", "C2"), w.ids());
        assertEquals("C2", w.id(1));
        assertArrayEquals(new double[] {2, 5}, w.exposureFroms());
        assertArrayEquals(new double[] {4, 5}, w.exposureTos());
        assertArrayEquals(new double[] {9, 5}, w.onsets());
        assertEquals(2, w.exposureFrom(0));
        assertEquals(4, w.exposureTo(0));
        assertEquals(9, w.onset(0));
    }

    @Test
    void rejectsBadWindows() {
        rejects("exposureTo", "case 'A': exposure_to 1.0 is before exposure_from 2.0",
                () -> ExposureWindows.builder().add("A", 2, 1, 5));
        rejects("onset", "case 'A': onset 3.0 is before exposure_to 4.0 (cut the exposure window at the onset)",
                () -> ExposureWindows.builder().add("A", 2, 4, 3));
        rejects("onset", "case 'A': onset must be a finite number of days, was NaN",
                () -> ExposureWindows.builder().add("A", 2, 4, Double.NaN));
        ExposureWindows.Builder b = ExposureWindows.builder().add("A", 1, 2, 3);
        rejects("id", "case 'A' was added before (case ids must be unique)", () -> b.add("A", 1, 2, 3));
        rejects("id", "no cases (at least one case is required)", () -> ExposureWindows.builder().build());
    }
}
