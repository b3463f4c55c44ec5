package org.incipit.core.estimate.ambiguous;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** Tiny CSV reader for the reference data sets (case,end,start,kind,exposures_total). */
final class ReferenceData {

    final Prepared data;
    final List<String> kinds;

    private ReferenceData(Prepared data, List<String> kinds) {
        this.data = data;
        this.kinds = kinds;
    }

    static List<String[]> rows(String resource) {
        InputStream in = ReferenceData.class.getResourceAsStream(resource);
        if (in == null) {
            throw new IllegalStateException("missing resource " + resource);
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
                out.add(line.split(",", -1));
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return out;
    }

    /** The same data set through the public observation builder. */
    static org.incipit.core.observe.AmbiguousStartCases cases(String name) {
        org.incipit.core.observe.AmbiguousStartCases.Builder b = org.incipit.core.observe.AmbiguousStartCases.builder();
        for (String[] f : rows(name + ".csv")) {
            b.addCandidate(f[0], Double.parseDouble(f[1]), Double.parseDouble(f[2]), f[3],
                    f[4].isEmpty() ? org.incipit.core.observe.AmbiguousStartCases.UNKNOWN_TOTAL : Integer.parseInt(f[4]));
        }
        return b.build();
    }

    static ReferenceData read(String name) {
        List<String[]> rows = rows(name + ".csv");
        Map<String, Integer> kindIndex = new LinkedHashMap<>();
        List<Double> ends = new ArrayList<>();
        List<Integer> offsets = new ArrayList<>(List.of(0));
        List<Double> starts = new ArrayList<>();
        List<Integer> cats = new ArrayList<>();
        List<Integer> totals = new ArrayList<>();
        List<String> ids = new ArrayList<>();
        String current = null;
        for (String[] f : rows) {
            if (!f[0].equals(current)) {
                if (current != null) {
                    offsets.add(starts.size());
                }
                current = f[0];
                ids.add(current);
                ends.add(Double.parseDouble(f[1]));
                totals.add(f[4].isEmpty() ? -1 : Integer.parseInt(f[4]));
            }
            starts.add(Double.parseDouble(f[2]));
            cats.add(kindIndex.computeIfAbsent(f[3], s -> kindIndex.size()));
        }
        offsets.add(starts.size());
        boolean hasTotals = totals.stream().allMatch(t -> t >= 0);
        Prepared p = Prepared.of(ends.stream().mapToDouble(Double::doubleValue).toArray(),
                offsets.stream().mapToInt(Integer::intValue).toArray(),
                starts.stream().mapToDouble(Double::doubleValue).toArray(),
                cats.stream().mapToInt(Integer::intValue).toArray(), kindIndex.size(),
                hasTotals ? totals.stream().mapToInt(Integer::intValue).toArray() : null,
                ids.toArray(new String[0]));
        return new ReferenceData(p, new ArrayList<>(kindIndex.keySet()));
    }
}
