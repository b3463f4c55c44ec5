package org.incipit.io;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import org.incipit.core.observe.AmbiguousStartCases;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Dates to day numbers checked against Python's datetime (reference/io/day_numbers.py, output in
 * day_numbers.csv): leap-year edge cases and 40 seeded dates; exact integers.
 */
class DayNumberReferenceTest {

    @TempDir
    Path dir;

    @Test
    void datesBecomeDaysSinceTheEarliestDate() throws IOException {
        List<String> dates = new ArrayList<>();
        List<Integer> days = new ArrayList<>();
        try (InputStream in = getClass().getResourceAsStream("day_numbers.csv")) {
            for (String line : new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\n")) {
                if (line.startsWith("#") || line.startsWith("date") || line.isBlank()) {
                    continue;
                }
                String[] f = line.split(",");
                dates.add(f[0]);
                days.add(Integer.parseInt(f[1].trim()));
            }
        }
        assertEquals(50, dates.size());
        StringBuilder csv = new StringBuilder("case,end,start\n");
        for (int i = 0; i < dates.size(); i++) {
            csv.append("c").append(i).append(',').append(dates.get(i)).append(',').append(dates.get(i)).append('\n');
        }
        Path p = dir.resolve("dates.csv");
        Files.writeString(p, csv.toString(), StandardCharsets.UTF_8);
        ReadResult<AmbiguousStartCases> r = CsvInput.intervals(p, ReadOptions.defaults());
        assertEquals(LocalDate.of(1900, 2, 28), r.origin());
        for (int i = 0; i < dates.size(); i++) {
            assertEquals(days.get(i), r.data().end(i), 0.0, dates.get(i));
            assertEquals(LocalDate.parse(dates.get(i)), r.dateOf(r.data().end(i)), "maps back");
        }
    }
}
