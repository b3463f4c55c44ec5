package org.incipit.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

/** The storage of rows: values as byte ranges, its size limit, and its guards (common practice). */
class CsvTableCellsTest {

    @Test
    void storageBeyondTheArrayLimitIsRefusedWithAReason() {
        // 2^11 rows of 2^20 values need 2^32 bounds: more than an array can hold
        CsvTable.Cells.TooLarge e = assertThrows(CsvTable.Cells.TooLarge.class,
                () -> new CsvTable.Cells(1 << 20, 1 << 11, new byte[0]));
        assertEquals("the file is too large to hold in memory (more than " + (Integer.MAX_VALUE - 16)
                + " value bounds)", e.getMessage());
    }

    @Test
    void rowsGivenAsStringsAndAsRangesHoldTheSameValues() {
        String[] row = {"Zo\u00eb", "", "12.5"};
        byte[] text = "Zo\u00eb,,12.5".getBytes(StandardCharsets.UTF_8);
        CsvTable.Cells own = new CsvTable.Cells(3, 1);
        CsvTable.Cells ranges = new CsvTable.Cells(3, 1, text);
        for (int r = 0; r < 40; r++) { // past the first capacity: the storage grows
            own.add(row, 3, r + 2);
            ranges.add(new int[] {0, 4, 5, 5, 6, 10}, 3, r + 2);
        }
        own.add(new String[] {"a"}, 1, 42);
        ranges.add(new int[] {0, 1}, 1, 42);
        for (int r = 0; r < 40; r++) {
            for (int c = 0; c < 3; c++) {
                assertEquals(row[c], own.value(r, c), "own text, row " + r);
                assertEquals(row[c], ranges.value(r, c), "ranges, row " + r);
            }
        }
        assertNull(own.faults[0]);
        assertEquals("row has 1 value, the header has 3 columns", own.faults[40]);
        assertEquals(own.faults[40], ranges.faults[40]);
        assertEquals(42, ranges.lines[40]);
    }

    @Test
    void onlyRowsOfTheSameTextCanBeAppended() {
        CsvTable.Cells a = new CsvTable.Cells(1, 1, new byte[] {'1'});
        CsvTable.Cells b = new CsvTable.Cells(1, 1, new byte[] {'1'});
        assertThrows(IllegalArgumentException.class, () -> a.append(b, 0));
        assertThrows(IllegalStateException.class, () -> a.add(new String[] {"x"}, 1, 1));
    }
}
