package org.incipit.io;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.math.BigDecimal;
import java.nio.charset.StandardCharsets;
import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * {@link TimeScale#decimal} (the fastdoubleparser library), on a string and on a range of bytes
 * inside a longer text, gives bit for bit the double of
 * {@link Double#parseDouble} (the reference: the JDK parser, correctly rounded to nearest, ties
 * to even) on the decimals the readers accept. Seeded strings (bounded in number): random
 * digits of 1 to 25 significant figures with random point and exponent, full-precision
 * day numbers as {@link Double#toString} writes them, and the hardest inputs, decimals exactly
 * halfway between two adjacent doubles and a hair either side of halfway.
 */
class TimeScaleDecimalTest {

    static Stream<String> decimals() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(20261202L);
        Stream<String> fixed = Stream.of("0", "-0", "+0.0", "1", "-1", ".5", "5.", "1e-400", "1e400",
                "4.9e-324", "2.2250738585072011e-308", "1.7976931348623157e308", "9007199254740993",
                "14.240254484426233", "0.1", "123456789012345678901234567890");
        Stream<String> random = Stream.generate(() -> {
            StringBuilder b = new StringBuilder(rng.nextInt(4) == 0 ? "-" : "");
            int digits = 1 + rng.nextInt(25);
            int point = rng.nextInt(digits + 1);
            for (int i = 0; i < digits; i++) {
                if (i == point) {
                    b.append('.');
                }
                b.append((char) ('0' + rng.nextInt(10)));
            }
            if (rng.nextBoolean()) {
                b.append(rng.nextBoolean() ? 'e' : 'E').append(rng.nextInt(640) - 330);
            }
            return b.toString();
        }).limit(1000);
        Stream<String> days = Stream.generate(() -> Double.toString(60 * rng.nextDouble())).limit(300);
        Stream<String> halfway = Stream.generate(() -> {
            double d = Math.scalb(1 + rng.nextDouble(), rng.nextInt(200) - 100);
            BigDecimal mid = new BigDecimal(d).add(new BigDecimal(Math.nextUp(d))).divide(BigDecimal.valueOf(2));
            return switch (rng.nextInt(3)) {
                case 0 -> mid.toPlainString();
                case 1 -> mid.subtract(mid.ulp()).toPlainString();
                default -> mid.add(mid.ulp()).toPlainString();
            };
        }).limit(700);
        return Stream.concat(Stream.concat(fixed, random), Stream.concat(days, halfway));
    }

    @ParameterizedTest
    @MethodSource("decimals")
    void agreesBitForBitWithTheJdkParser(String s) {
        assertEquals(true, TimeScale.isNumber(s), "the generated string is a decimal the readers accept");
        assertEquals(Double.doubleToRawLongBits(Double.parseDouble(s)), Double.doubleToRawLongBits(TimeScale.decimal(s)),
                () -> "'" + s + "'");
        byte[] v = s.getBytes(StandardCharsets.US_ASCII);
        byte[] text = new byte[v.length + 2];
        text[0] = '9';
        System.arraycopy(v, 0, text, 1, v.length);
        text[v.length + 1] = '9';
        assertEquals(Double.doubleToRawLongBits(Double.parseDouble(s)),
                Double.doubleToRawLongBits(TimeScale.decimal(text, 1, v.length + 1)), () -> "in a text: '" + s + "'");
    }
}
