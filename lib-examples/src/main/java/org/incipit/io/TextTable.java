package org.incipit.io;

import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;

/**
 * A plain-text table with aligned columns: text left-aligned, numbers right-aligned.
 *
 * <pre>{@code
 * String s = TextTable.of("quantity", "estimate").row("mean", TextTable.number(5.1234)).render();
 * }</pre>
 */
public final class TextTable {

    private final String[] header;
    private final List<String[]> rows = new ArrayList<>();

    private TextTable(String[] header) {
        this.header = header.clone();
    }

    /**
     * @param header column headings, at least one
     * @return an empty table
     */
    public static TextTable of(String... header) {
        if (header.length == 0) {
            throw new IllegalArgumentException("a table needs at least one column");
        }
        return new TextTable(header);
    }

    /**
     * @param cells one cell per column
     * @return this table
     * @throws IllegalArgumentException if the number of cells differs from the header
     */
    public TextTable row(String... cells) {
        if (cells.length != header.length) {
            throw new IllegalArgumentException("row must have " + header.length + " cells, had " + cells.length);
        }
        rows.add(cells.clone());
        return this;
    }

    /** @return the table, header and rows separated by two spaces, each line ending in a newline */
    public String render() {
        int[] width = new int[header.length];
        boolean[] numeric = new boolean[header.length];
        Arrays.fill(numeric, !rows.isEmpty());
        for (int c = 0; c < header.length; c++) {
            width[c] = header[c].length();
            for (String[] r : rows) {
                width[c] = Math.max(width[c], r[c].length());
                numeric[c] &= isNumber(r[c]);
            }
        }
        StringBuilder sb = new StringBuilder();
        line(sb, header, width, numeric);
        for (String[] r : rows) {
            line(sb, r, width, numeric);
        }
        return sb.toString();
    }

    private static void line(StringBuilder sb, String[] cells, int[] width, boolean[] numeric) {
        StringBuilder l = new StringBuilder();
        for (int c = 0; c < cells.length; c++) {
            if (c > 0) {
                l.append("  ");
            }
            String pad = " ".repeat(width[c] - cells[c].length());
            l.append(numeric[c] ? pad + cells[c] : cells[c] + pad);
        }
        sb.append(l.toString().stripTrailing()).append(System.lineSeparator());
    }

    private static boolean isNumber(String s) {
        return s.isEmpty() || s.equals("inf") || s.equals("-inf")
                || s.matches("[-+]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][-+]?\\d+)?");
    }

    /**
     * Formats a number for reading: 4 significant digits, plain notation between 1e-4 and 1e7,
     * otherwise scientific; infinities as {@code inf}/{@code -inf}.
     *
     * @param x a number (NaN is an error: results never contain NaN)
     * @return the text
     * @throws IllegalArgumentException if {@code x} is NaN
     */
    public static String number(double x) {
        if (Double.isNaN(x)) {
            throw new IllegalArgumentException("x must not be NaN");
        }
        if (Double.isInfinite(x)) {
            return x > 0 ? "inf" : "-inf";
        }
        if (x == 0) {
            return "0";
        }
        double a = Math.abs(x);
        if (a >= 1e-4 && a < 1e7) {
            // round the shortest decimal form (what a reader sees), not the binary value:
            // 0.00012345 is stored just below 0.00012345 but should show as 0.0001235
            BigDecimal d = BigDecimal.valueOf(x).round(new MathContext(4, RoundingMode.HALF_UP));
            String s = d.toPlainString();
            if (s.contains(".")) {
                s = s.replaceAll("0+$", "").replaceAll("\\.$", "");
            }
            return s;
        }
        return String.format(Locale.ROOT, "%.3e", x);
    }
}
