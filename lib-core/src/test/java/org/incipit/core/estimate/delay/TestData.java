package org.incipit.core.estimate.delay;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/** Reads the reference CSVs: '#' comment lines, one header line, comma-separated rows. */
final class TestData {

    private TestData() {
    }

    /** Rows as maps from column name to text ("" for an empty cell). */
    static List<Map<String, String>> read(String resource) {
        InputStream in = TestData.class.getResourceAsStream(resource);
        if (in == null) {
            throw new IllegalStateException("missing test resource " + resource);
        }
        try (BufferedReader r = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8))) {
            String[] header = null;
            List<Map<String, String>> rows = new ArrayList<>();
            String line;
            while ((line = r.readLine()) != null) {
                if (line.startsWith("#") || line.isBlank()) {
                    continue;
                }
                String[] cells = line.split(",", -1);
                if (header == null) {
                    header = cells;
                    continue;
                }
                Map<String, String> row = new HashMap<>();
                for (int i = 0; i < header.length; i++) {
                    row.put(header[i], i < cells.length ? cells[i] : "");
                }
                rows.add(row);
            }
            return rows;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    static double num(Map<String, String> row, String column) {
        String s = row.get(column);
        if (s == null) {
            throw new IllegalStateException("no column " + column);
        }
        return Double.parseDouble(s);
    }
}
