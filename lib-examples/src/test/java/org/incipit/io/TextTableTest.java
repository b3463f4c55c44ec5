package org.incipit.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;

class TextTableTest {

    private static final String NL = System.lineSeparator();

    @Test
    void alignsTextLeftAndNumbersRight() {
        String s = TextTable.of("quantity", "estimate", "upper")
                .row("mean", "5.123", "inf")
                .row("standard deviation", "12", "7.5")
                .render();
        assertEquals("quantity            estimate  upper" + NL
                + "mean                   5.123    inf" + NL
                + "standard deviation        12    7.5" + NL, s);
    }

    @Test
    void formatsNumbersToFourSignificantDigits() {
        assertEquals("5.123", TextTable.number(5.12345));
        assertEquals("0.0001235", TextTable.number(0.00012345), "rounds the decimal form, half up");
        assertEquals("2.5", TextTable.number(2.50000001));
        assertEquals("1235000", TextTable.number(1234567));
        assertEquals("1.235e+07", TextTable.number(12345678));
        assertEquals("-2.5", TextTable.number(-2.5));
        assertEquals("3", TextTable.number(3));
        assertEquals("0", TextTable.number(0));
        assertEquals("inf", TextTable.number(Double.POSITIVE_INFINITY));
        assertEquals("-inf", TextTable.number(Double.NEGATIVE_INFINITY));
        assertThrows(IllegalArgumentException.class, () -> TextTable.number(Double.NaN));
    }

    @Test
    void rejectsRaggedRows() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> TextTable.of("a", "b").row("x"));
        assertEquals("row must have 2 cells, had 1", e.getMessage());
    }
}
