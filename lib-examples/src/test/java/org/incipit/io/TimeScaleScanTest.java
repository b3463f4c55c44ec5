package org.incipit.io;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The hand-written scans for day numbers and ISO dates accept exactly the strings that the
 * documented regular expressions accept (the regexes are the reference; seeded strings over an
 * alphabet that exercises every branch, bounded in number), both as strings and as a range of
 * UTF-8 bytes inside a longer text (digits on both sides, so that a scan reading past its range
 * would be caught); and a date read from the bytes is the one {@link LocalDate#parse} gives, or
 * none where that throws (e.g. 2023-02-29, month 13, day 00).
 */
class TimeScaleScanTest {

    // with two non-ASCII characters: an accented letter and an Arabic-Indic digit three, which
    // java.util.regex's \\d does not match (it means [0-9] unless UNICODE_CHARACTER_CLASS is set)
    private static final String ALPHABET = "0123456789-+.eE x\u00e9\u0663";

    static Stream<String> strings() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(20261201L);
        Stream<String> fixed = Stream.of("", "1", "-1", "+.5", "1.", ".", "1e5", "1e", "1e+", "2024-02-29",
                "2024-2-29", "20240229", "2024-02-2x", "-0.5e-3", "12.5E+07", "1..2", "e5");
        Stream<String> random = Stream.generate(() -> {
            int n = rng.nextInt(13);
            StringBuilder b = new StringBuilder();
            for (int i = 0; i < n; i++) {
                b.append(ALPHABET.charAt(rng.nextInt(ALPHABET.length())));
            }
            return b.toString();
        }).limit(3000);
        // date-shaped strings, so that the date branch is reached often
        Stream<String> dates = Stream.generate(() -> {
            char[] c = "0000-00-00".toCharArray();
            for (int i = 0; i < c.length; i++) {
                if (rng.nextInt(20) == 0) {
                    c[i] = ALPHABET.charAt(rng.nextInt(ALPHABET.length()));
                } else if (i != 4 && i != 7) {
                    c[i] = (char) ('0' + rng.nextInt(10));
                }
            }
            return new String(c);
        }).limit(1000);
        return Stream.concat(fixed, Stream.concat(random, dates));
    }

    @ParameterizedTest
    @MethodSource("strings")
    void scansAgreeWithTheRegularExpressions(String s) {
        assertEquals(TimeScale.NUMBER.matcher(s).matches(), TimeScale.isNumber(s), () -> "number: '" + s + "'");
        assertEquals(TimeScale.DATE.matcher(s).matches(), TimeScale.isDate(s), () -> "date: '" + s + "'");
        byte[] v = s.getBytes(StandardCharsets.UTF_8);
        byte[] text = new byte[v.length + 2];
        text[0] = '7';
        System.arraycopy(v, 0, text, 1, v.length);
        text[v.length + 1] = '7';
        assertEquals(TimeScale.NUMBER.matcher(s).matches(), TimeScale.isNumber(text, 1, v.length + 1),
                () -> "number in a text: '" + s + "'");
        assertEquals(TimeScale.DATE.matcher(s).matches(), TimeScale.isDate(text, 1, v.length + 1),
                () -> "date in a text: '" + s + "'");
        if (TimeScale.DATE.matcher(s).matches()) {
            LocalDate expected;
            try {
                expected = LocalDate.parse(s); // the JDK's ISO parser is the reference
            } catch (DateTimeParseException e) {
                expected = null;
            }
            assertEquals(expected, TimeScale.date(text, 1), () -> "date value: '" + s + "'");
        }
    }
}
