package org.incipit.core.estimate.ambiguous;

import java.math.BigDecimal;
import java.math.MathContext;

/**
 * A table-driven exponential for the likelihood kernels: within 0.52 ulp of e^x for
 * |x| &le; {@value #FAST_LIMIT} (and {@link Math#exp} outside that range and for NaN), with no
 * branch on the common path and about a dozen floating-point operations.
 *
 * <p><b>Algorithm</b> (Tang 1989, <i>Table-driven implementation of the exponential function
 * in IEEE floating-point arithmetic</i>, ACM TOMS 15(2):144&ndash;157, with N = 128). Write
 * x = (128 e + j) ln2/128 + r with integers e, j (0 &le; j &lt; 128) and |r| &le; ln2/256; then
 * e^x = 2^e &middot; 2^(j/128) &middot; e^r. k = 128 e + j is the integer nearest to x &middot; 128/ln2,
 * r = x &minus; k &middot; ln2/128 is formed with two fused multiply-adds on a two-part ln2/128
 * (the first product is exact), e^r &minus; 1 is its Taylor polynomial of degree 5 (remainder
 * below r^6/720 &le; 5.4e-19, i.e. 0.003 ulp), and 2^(j/128) = T_j (1 + &tau;_j) is held as a
 * double T_j with its relative tail &tau;_j. The result is the single rounding of
 * s + s(&tau;_j + p(r)) with s = 2^e T_j (exact), so the error is one rounding (0.5 ulp) plus
 * terms of order |r| ulp, below 0.52 ulp. The table is computed at class initialisation in
 * 60-digit decimal arithmetic (Newton for 2^(1/128), then powers), not copied from anywhere.
 *
 * <p>Checked against mpmath (correctly rounded values, {@code reference/fast_exp_reference.py})
 * and against {@link StrictMath#exp} on random arguments in FastExpTest.
 */
final class FastExp {

    /** Arguments up to this magnitude take the table path; the result is a normal double. */
    static final double FAST_LIMIT = 708.0;

    private static final int BITS = 7;
    private static final int N = 1 << BITS;
    private static final double INV_LN2_N = N / Math.log(2);
    /** ln2/N in two parts: the high part keeps 24 significant bits, so k * LN2_N_HI is exact for |k| < 2^29. */
    private static final double LN2_N_HI;
    private static final double LN2_N_LO;
    /** Bits of T_j = 2^(j/N) rounded to nearest. */
    private static final long[] SCALE_BITS = new long[N];
    /** Relative tails tau_j = (2^(j/N) - T_j) / T_j. */
    private static final double[] TAIL = new double[N];

    private static final double C2 = 1.0 / 2;
    private static final double C3 = 1.0 / 6;
    private static final double C4 = 1.0 / 24;
    private static final double C5 = 1.0 / 120;

    static {
        MathContext mc = new MathContext(60);
        BigDecimal two = BigDecimal.valueOf(2);
        // y = 2^(1/N) by Newton on y^N = 2: y <- y - (y^N - 2) / (N y^(N-1))
        BigDecimal y = new BigDecimal(Math.pow(2, 1.0 / N));
        for (int it = 0; it < 6; it++) {
            BigDecimal yn1 = y.pow(N - 1, mc);
            BigDecimal f = yn1.multiply(y, mc).subtract(two, mc);
            y = y.subtract(f.divide(yn1.multiply(BigDecimal.valueOf(N), mc), mc), mc);
        }
        BigDecimal t = BigDecimal.ONE;
        for (int j = 0; j < N; j++) {
            double hi = t.doubleValue(); // correctly rounded
            SCALE_BITS[j] = Double.doubleToRawLongBits(hi);
            BigDecimal h = new BigDecimal(hi);
            TAIL[j] = t.subtract(h, mc).divide(h, mc).doubleValue();
            t = t.multiply(y, mc);
        }
        // ln2 / N = log2(y)... from y: ln y = ln2 / N; ln y by the atanh series ln y = 2 atanh((y-1)/(y+1))
        BigDecimal z = y.subtract(BigDecimal.ONE, mc).divide(y.add(BigDecimal.ONE, mc), mc);
        BigDecimal z2 = z.multiply(z, mc);
        BigDecimal term = z;
        BigDecimal sum = BigDecimal.ZERO;
        for (int i = 1; i < 80; i += 2) {
            sum = sum.add(term.divide(BigDecimal.valueOf(i), mc), mc);
            term = term.multiply(z2, mc);
        }
        BigDecimal ln2N = sum.multiply(two, mc);
        double full = ln2N.doubleValue();
        double hi = Double.longBitsToDouble(Double.doubleToRawLongBits(full) & 0xFFFFFFFFE0000000L); // 24 significant bits
        LN2_N_HI = hi;
        LN2_N_LO = ln2N.subtract(new BigDecimal(hi), mc).doubleValue();
    }

    private FastExp() {
    }

    /**
     * e^x.
     *
     * @param x any double
     * @return e^x within 0.52 ulp for |x| &le; 708; {@link Math#exp} otherwise (so 0, +&infin;,
     *         subnormals and NaN as there)
     */
    static double exp(double x) {
        if (!(Math.abs(x) <= FAST_LIMIT)) {
            return Math.exp(x);
        }
        double kd = Math.rint(x * INV_LN2_N);
        long k = (long) kd;
        double r = Math.fma(-kd, LN2_N_LO, Math.fma(-kd, LN2_N_HI, x));
        int j = (int) (k & (N - 1));
        double s = Double.longBitsToDouble(SCALE_BITS[j] + ((k >> BITS) << 52));
        double r2 = r * r;
        double p = Math.fma(r2, Math.fma(r2, Math.fma(r, C5, C4), Math.fma(r, C3, C2)), r);
        return Math.fma(s, TAIL[j] + p, s);
    }
}
