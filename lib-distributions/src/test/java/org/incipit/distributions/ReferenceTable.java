package org.incipit.distributions;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

/** Reads the CSV tables written by reference/distributions_reference.py. */
final class ReferenceTable {
    private ReferenceTable() {
    }

    /** @return data rows (header and '#' lines dropped), split on commas */
    static List<String[]> rows(String name) {
        InputStream in = ReferenceTable.class.getResourceAsStream(name);
        if (in == null) {
            throw new IllegalStateException("missing test resource " + name);
        }
        List<String[]> out = new ArrayList<>();
        try (BufferedReader r = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8))) {
            String line;
            boolean header = true;
            while ((line = r.readLine()) != null) {
                if (line.startsWith("#") || line.isBlank()) {
                    continue;
                }
                if (header) {
                    header = false;
                    continue;
                }
                out.add(line.split(","));
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        if (out.isEmpty()) {
            throw new IllegalStateException("no rows in " + name);
        }
        return out;
    }

    static ParametricDelay distribution(String family, String p1, String p2) {
        return DelayFamilies.byName(family).of(Double.parseDouble(p1), Double.parseDouble(p2));
    }

    /** Relative error, with the denominator floored at {@code floor} (for values near 0). */
    static double relErr(double actual, double expected, double floor) {
        if (actual == expected) {
            return 0;
        }
        return Math.abs(actual - expected) / Math.max(Math.abs(expected), floor);
    }
}
