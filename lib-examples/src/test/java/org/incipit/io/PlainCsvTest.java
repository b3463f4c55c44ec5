package org.incipit.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.stream.Stream;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * {@link PlainCsv} gives, for plain ASCII text, exactly what commons-csv 1.12.0 gives with
 * {@link CsvTable#FORMAT} (the reference): header values and line, and every record's values
 * and line ({@code getCurrentLineNumber()} after the record, as {@link CsvTable} uses it); and
 * it declines exactly the texts it is documented to decline; scanned in one part and in two
 * parts in parallel. Seeded texts over an alphabet
 * that reaches every branch (line ends CR, LF, CRLF, blank and comment lines, spaces and tabs
 * around values, a last line without a line end), bounded in number.
 */
class PlainCsvTest {

    private static final String[] PLAIN = {"a", "1", "2.5", ",", ",", ",", " ", "\t", "\n", "\n", "\r", "\r\n",
        "#", "-", "case", "x y", "  ,", " # ", "#a,b\n", ",,", "\r\r", "\n\r", "\u007f", "'"};
    private static final String[] NOT_PLAIN = {"\"", "\u0001", "\u000b", "\u001c", "\u0000", "é", "\u00a0",
        "\u2003", "\uFEFF"};

    static Stream<String> texts() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(20261201L);
        Stream<String> fixed = Stream.of("", "\n", "#only\n", "case,end,start", "case,end,start\n",
                "case,end,start\nA,1,2", "case,end,start\r\nA,1,2\r\n", "h\n \n", "h\n\t,\n", "h\nA,1,2,\n",
                "\n\n#c\r\nh\rA\r\n\r\nB");
        Stream<String> random = Stream.generate(() -> {
            StringBuilder b = new StringBuilder();
            int n = rng.nextInt(40);
            for (int k = 0; k < n; k++) {
                b.append(rng.nextInt(60) == 0 ? NOT_PLAIN[rng.nextInt(NOT_PLAIN.length)]
                        : PLAIN[rng.nextInt(PLAIN.length)]);
            }
            return b.toString();
        }).limit(1000);
        return Stream.concat(fixed, random);
    }

    @ParameterizedTest
    @MethodSource("texts")
    void agreesWithCommonsCsvOrDeclines(String text) throws IOException {
        PlainCsv.Result plain = PlainCsv.scan(text.getBytes(StandardCharsets.UTF_8));
        boolean declines = Arrays.stream(NOT_PLAIN).anyMatch(text::contains);
        if (declines) {
            assertNull(plain, "text with a quote, a control character or a non-ASCII character is left to commons-csv");
            assertNull(PlainCsv.scan(text.getBytes(StandardCharsets.UTF_8), 1), "also when scanned in two parts");
            return;
        }
        assertNotNull(plain);
        List<String> expected = new ArrayList<>();
        try (CSVParser p = CSVParser.parse(text, CsvTable.FORMAT)) {
            List<String> header = p.getHeaderNames();
            // the header line is used only when there is a header
            expected.add("header " + header + (header.isEmpty() ? "" : " line " + p.getCurrentLineNumber()));
            for (CSVRecord r : p) {
                String[] v = r.values();
                expected.add((v.length == header.size() ? Arrays.toString(v) : v.length + " values")
                        + " line " + p.getCurrentLineNumber());
            }
        }
        assertEquals(expected, shown(plain), "one part");
        assertEquals(expected, shown(PlainCsv.scan(text.getBytes(StandardCharsets.UTF_8), 1)), "two parts in parallel");
    }

    private static List<String> shown(PlainCsv.Result plain) {
        List<String> actual = new ArrayList<>();
        actual.add("header " + plain.header() + (plain.header().isEmpty() ? "" : " line " + plain.headerLine()));
        CsvTable.Cells c = plain.cells();
        for (int r = 0; c != null && r < c.size; r++) {
            String fault = c.faults == null ? null : c.faults[r];
            String[] values = new String[c.width];
            for (int k = 0; fault == null && k < c.width; k++) {
                values[k] = c.value(r, k);
            }
            actual.add((fault == null
                    ? Arrays.toString(values)
                    : fault.substring("row has ".length(), fault.indexOf(" value")) + " values")
                    + " line " + c.lines[r]);
        }
        return actual;
    }
}
