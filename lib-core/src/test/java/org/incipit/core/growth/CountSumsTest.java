package org.incipit.core.growth;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Arrays;
import java.util.stream.Stream;
import org.apache.commons.numbers.gamma.Digamma;
import org.apache.commons.numbers.gamma.LogGamma;
import org.apache.commons.numbers.gamma.Trigamma;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The NB2 count sums (finite sums by the recurrences A&amp;S 6.1.15, 6.3.5, 6.4.6 below the direct
 * limit, special functions per distinct count above it) against mpmath 1.3 at 50 digits:
 * count_sums.csv, made by reference/count_sums_reference.py (40 seeded count sets with zeros and
 * repeats, k from 0.05 to 2e4).
 */
class CountSumsTest {

    static Stream<Arguments> referenceSets() {
        return GrowthRateEstimatorTest.csv("count_sums.csv").stream().map(r -> Arguments.of(
                Integer.parseInt(r[0]), Double.parseDouble(r[1]),
                Arrays.stream(r[2].split(" ")).mapToDouble(Double::parseDouble).toArray(),
                Double.parseDouble(r[3]), Double.parseDouble(r[4]), Double.parseDouble(r[5])));
    }

    @ParameterizedTest
    @MethodSource("referenceSets")
    void sumsMatchMpmath(int set, double k, double[] y, double l, double d, double t) {
        CountSums cs = new CountSums(y);
        int n = y.length;
        double[] lg = new double[n];
        cs.logGammaRatios(k, lg);
        double sum = 0;
        double lf = 0;
        for (int i = 0; i < n; i++) {
            // per observation against commons-numbers LogGamma (accurate to a few ulp of
            // lnGamma(y + k); the difference then loses that much to cancellation)
            double scale = Math.abs(LogGamma.value(y[i] + k)) + Math.abs(LogGamma.value(k)) + 1;
            assertEquals(LogGamma.value(y[i] + k) - LogGamma.value(k), lg[i], 1e-14 * scale,
                    "set " + set + " y=" + y[i]);
            sum += lg[i];
            lf += LogGamma.value(y[i] + 1);
        }
        // Rounding scale of the terms: n times the size of lnGamma(k), psi(k), psi'(k).
        double lScale = Math.abs(l) + n * (Math.abs(LogGamma.value(k)) + 1);
        assertEquals(l, sum, 1e-13 * lScale, "L, set " + set + " (relative 1e-13 of the terms)");
        double[] out = new double[2];
        cs.digammaSums(k, out);
        double dScale = Math.abs(d) + n * Math.max(1, Math.abs(Digamma.value(k)));
        assertEquals(d, out[0], 1e-13 * dScale, "D, set " + set);
        boolean direct = Arrays.stream(y).max().orElse(0) <= CountSums.DIRECT_LIMIT;
        // Above the direct limit T uses commons-numbers Trigamma, which is only accurate to about
        // 2e-12 relative (e.g. Trigamma(28.30135423783965) = 0.035965594456819405, mpmath
        // 0.035965594456886636): tolerance 1e-11 of the terms there, 1e-13 for the finite sums.
        double tScale = Math.abs(t) + n * Trigamma.value(k);
        assertEquals(t, out[1], (direct ? 1e-13 : 1e-11) * tScale, "T, set " + set);
        assertEquals(lf, cs.logFactorialSum(), 1e-15 * Math.max(1, lf), "sum log y!");
    }
}
