package org.incipit.core.estimate.ambiguous;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.math.BigDecimal;
import java.math.MathContext;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The kernels' exponential against mpmath (60 digits; reference/fast_exp_reference.py, CSV
 * fast_exp.csv) and against {@link StrictMath#exp} (fdlibm; documented within 1 ulp of the
 * exact result).
 */
class FastExpTest {

    private record Point(double x, BigDecimal exp) {
    }

    private static List<Point> reference() throws IOException {
        List<Point> out = new ArrayList<>();
        try (BufferedReader r = new BufferedReader(new InputStreamReader(
                FastExpTest.class.getResourceAsStream("fast_exp.csv"), StandardCharsets.UTF_8))) {
            String line;
            while ((line = r.readLine()) != null) {
                if (line.startsWith("#") || line.startsWith("x_hex")) {
                    continue;
                }
                String[] f = line.split(",");
                out.add(new Point(Double.parseDouble(f[0]), new BigDecimal(f[1])));
            }
        }
        return out;
    }

    /** Error in ulps of the computed value, from the 25-digit reference. */
    private static double ulpError(double computed, BigDecimal exact) {
        BigDecimal diff = new BigDecimal(computed).subtract(exact, MathContext.DECIMAL128);
        return diff.abs().divide(new BigDecimal(Math.ulp(computed)), MathContext.DECIMAL64).doubleValue();
    }

    @Test
    void within052UlpOfMpmathEverywhereOnTheTablePath() throws IOException {
        List<Point> pts = reference();
        assertTrue(pts.size() > 7000, "reference rows: " + pts.size());
        double worst = 0;
        int correctlyRounded = 0;
        for (Point p : pts) {
            double e = ulpError(FastExp.exp(p.x()), p.exp());
            worst = Math.max(worst, e);
            if (e <= 0.5) {
                correctlyRounded++;
            }
        }
        // the bound of the Javadoc: one rounding plus O(|r|) ulp
        assertTrue(worst <= 0.52, "worst error " + worst + " ulp");
        // and nearly always the correctly rounded result (common practice for Tang's method: > 99%)
        assertTrue(correctlyRounded >= 0.99 * pts.size(), correctlyRounded + " of " + pts.size());
    }

    @ParameterizedTest
    @ValueSource(doubles = {708.0, 1.0, 1e-3})
    void withinOneUlpOfStrictMathOnSeededRandomArguments(double range) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(Double.doubleToLongBits(range));
        long worst = 0;
        for (int i = 0; i < 300_000; i++) {
            double x = (2 * rng.nextDouble() - 1) * range;
            double a = FastExp.exp(x);
            double b = StrictMath.exp(x);
            long ulps = Math.abs(Double.doubleToRawLongBits(a) - Double.doubleToRawLongBits(b));
            worst = Math.max(worst, ulps);
        }
        // ours <= 0.52 ulp and fdlibm < 1 ulp from the exact value: they differ by at most 1 ulp
        assertTrue(worst <= 1, "worst difference " + worst + " ulp");
    }

    @Test
    void outsideTheTableRangeAndSpecialValuesAsMathExp() {
        double[] xs = {709.78, 709.79, 710, 1e10, -708.5, -745.1, -745.2, -1e4, Double.POSITIVE_INFINITY,
            Double.NEGATIVE_INFINITY, Double.NaN, -0.0, Double.MIN_VALUE};
        for (double x : xs) {
            assertEquals(Math.exp(x), FastExp.exp(x), 0.0, "x = " + x);
        }
        assertEquals(1.0, FastExp.exp(0.0), 0.0);
        assertEquals(Double.POSITIVE_INFINITY, FastExp.exp(710), 0.0);
        assertEquals(0.0, FastExp.exp(-1e4), 0.0);
        assertTrue(Double.isNaN(FastExp.exp(Double.NaN)));
    }

    @Test
    void exactAtIntegerMultiplesOfLn2OverSmallPowersOfTwo() {
        // e^(k ln 2) = 2^k: the nearest double to k ln2 gives 2^k within 0.52 ulp (k ln2 is
        // inexact, so allow the derivative times its rounding error: |x| ulp(x)/2 relative)
        for (int k = -1000; k <= 1000; k++) {
            double x = k * Math.log(2);
            if (Math.abs(x) > FastExp.FAST_LIMIT) {
                continue;
            }
            double rel = Math.abs(FastExp.exp(x) / Math.scalb(1.0, k) - 1);
            assertTrue(rel <= Math.ulp(x) + 2 * Math.ulp(1.0), "k = " + k + ": " + rel);
        }
    }

    /**
     * The tables written out in FastExp, derived again in 60-digit decimal arithmetic (common
     * practice): 2^(1/N) by Newton on y^N = 2, T_j = y^j rounded to nearest (BigDecimal's
     * doubleValue rounds correctly), tau_j = (y^j &minus; T_j) / T_j, and ln2/N = ln y by the series
     * ln y = 2 atanh((y &minus; 1)/(y + 1)), split after 24 significant bits. Bit for bit.
     */
    @Test
    void tablesAreTheSixtyDigitValues() {
        int n = FastExp.N;
        MathContext mc = new MathContext(60);
        BigDecimal two = BigDecimal.valueOf(2);
        BigDecimal y = new BigDecimal(Math.pow(2, 1.0 / n));
        for (int it = 0; it < 6; it++) {
            BigDecimal yn1 = y.pow(n - 1, mc);
            BigDecimal f = yn1.multiply(y, mc).subtract(two, mc);
            y = y.subtract(f.divide(yn1.multiply(BigDecimal.valueOf(n), mc), mc), mc);
        }
        BigDecimal t = BigDecimal.ONE;
        for (int j = 0; j < n; j++) {
            double hi = t.doubleValue();
            assertEquals(Double.doubleToRawLongBits(hi), FastExp.SCALE_BITS[j], "T_" + j);
            BigDecimal h = new BigDecimal(hi);
            assertEquals(t.subtract(h, mc).divide(h, mc).doubleValue(), FastExp.TAIL[j], 0.0, "tau_" + j);
            t = t.multiply(y, mc);
        }
        BigDecimal z = y.subtract(BigDecimal.ONE, mc).divide(y.add(BigDecimal.ONE, mc), mc);
        BigDecimal z2 = z.multiply(z, mc);
        BigDecimal term = z;
        BigDecimal sum = BigDecimal.ZERO;
        for (int i = 1; i < 80; i += 2) {
            sum = sum.add(term.divide(BigDecimal.valueOf(i), mc), mc);
            term = term.multiply(z2, mc);
        }
        BigDecimal ln2N = sum.multiply(two, mc);
        double hi = Double.longBitsToDouble(Double.doubleToRawLongBits(ln2N.doubleValue()) & 0xFFFFFFFFE0000000L);
        assertEquals(hi, FastExp.LN2_N_HI, 0.0);
        assertEquals(ln2N.subtract(new BigDecimal(hi), mc).doubleValue(), FastExp.LN2_N_LO, 0.0);
        // and against the JDK: ln2/N to double precision
        assertEquals(Math.log(2) / n, FastExp.LN2_N_HI + FastExp.LN2_N_LO, Math.ulp(Math.log(2) / n));
    }
}
