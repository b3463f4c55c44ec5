package org.incipit.distributions;

import org.apache.commons.numbers.gamma.LogGamma;

/**
 * Log-scale regularised incomplete gamma functions and their derivative in the shape.
 *
 * <p>Lower series (Abramowitz &amp; Stegun 6.5.29): P(a, y) = y^a e^-y / Gamma(a + 1) *
 * sum_n y^n / ((a + 1) ... (a + n)). Upper continued fraction (Legendre; A&amp;S 6.5.31,
 * evaluated by the modified Lentz method, Press et al., Numerical Recipes, 3rd ed., 6.2).
 *
 * <p>Shape derivatives (A&amp;S references cited from memory):
 * <ul>
 * <li>y &lt; a + 1: the series terms t_n = y^(a+n) e^-y / Gamma(a + n + 1) each have log-derivative
 * log y - psi(a + n + 1), so d log P / da = log y - sum_n w_n psi(a + n + 1) with the normalised
 * weights w_n = t_n / sum t (all positive, no cancellation in the weights); psi(a + n + 1) by
 * the recurrence psi(z + 1) = psi(z) + 1/z (A&amp;S 6.3.5) from psi(a + 1).</li>
 * <li>y &gt; a + 1: Q = y^a e^-y h / Gamma(a) with h the continued fraction, so
 * d log Q / da = log y - psi(a) + d log h / da; the Lentz factors C_j, D_j are differentiated
 * alongside (forward recurrences), d log h / da = sum_j (C_j'/C_j + D_j'/D_j) - b_0'/b_0.
 * log y - psi(a) &gt; 0 there (psi(a) &lt; log a; common practice), and d log h / da was
 * positive on every point of a check grid (shapes 1e-9 to 5000, y from a + 1 to 50 (a + 1)),
 * so the sum does not cancel.</li>
 * </ul>
 * The other side follows from P' = -Q' (P + Q = 1). Accuracy against mpmath: see
 * GammaShapeDerivativeTest.
 */
final class IncompleteGammaLog {
    private static final double TINY = 1e-300;
    private static final double HALF_LOG_2PI = 0.5 * Math.log(2 * Math.PI);

    private IncompleteGammaLog() {
    }

    /** log P(a, y) by the series; for y &lt; a + 1 (converges for any y, slowly for large y). */
    static double logLowerSeries(double a, double y) {
        return a * Math.log(y) - y - LogGamma.value(a + 1) + Math.log(seriesSum(a, y));
    }

    private static double seriesSum(double a, double y) {
        double sum = 1;
        double term = 1;
        for (int n = 1; n < 100000; n++) {
            term *= y / (a + n);
            sum += term;
            if (term < 1e-17 * sum) {
                break;
            }
        }
        return sum;
    }

    /** log Q(a, y) by the continued fraction; for y &gt; a + 1. */
    static double logUpperFraction(double a, double y) {
        double b = y + 1 - a;
        double c = 1 / TINY;
        double d = 1 / b;
        double h = d;
        for (int i = 1; i < 100000; i++) {
            double an = -i * (i - a);
            b += 2;
            d = an * d + b;
            if (Math.abs(d) < TINY) {
                d = TINY;
            }
            c = b + an / c;
            if (Math.abs(c) < TINY) {
                c = TINY;
            }
            d = 1 / d;
            double del = d * c;
            h *= del;
            if (Math.abs(del - 1) < 1e-16) {
                break;
            }
        }
        return a * Math.log(y) - y - LogGamma.value(a) + Math.log(h);
    }

    /**
     * d log P / da by the differentiated series, with P itself; for 0 &lt; y &lt; a + 1.
     *
     * @param logy     log y
     * @param psi1     psi(a + 1), directly (not psi(a) + 1/a, which cancels for small a)
     * @param out      receives {d log P / da, y^a e^-y / (Gamma(a) P)}; log P = {@link #logPrefix}
     *                 - log out[1]
     */
    static void lowerWithDerivative(double a, double y, double logy, double psi1, double[] out) {
        double psin = psi1;
        double sum = 1;
        double term = 1;
        double u = psin - logy; // sum_n t_n (psi(a+n+1) - log y), t_0 = 1
        for (int n = 1; n < 1000000; n++) {
            double inv = 1 / (a + n);
            term *= y * inv;
            psin += inv;
            double c = psin - logy;
            sum += term;
            u += term * c;
            if (term < 1e-17 * sum && term * Math.abs(c) < 1e-17 * Math.abs(u)) {
                break;
            }
        }
        out[0] = -u / sum;
        out[1] = a / sum;
    }

    /**
     * d log Q / da by the differentiated continued fraction, with Q itself; for y &gt; a + 1.
     *
     * @param logy     log y
     * @param psi      psi(a)
     * @param out      receives {d log Q / da, y^a e^-y / (Gamma(a) Q)}; log Q = {@link #logPrefix}
     *                 - log out[1]
     */
    static void upperWithDerivative(double a, double y, double logy, double psi, double[] out) {
        // h = 1/(b_0 + a_1/(b_1 + a_2/(b_2 + ...))), b_j = y + 1 - a + 2j (b_j' = -1),
        // a_j = -j (j - a) (a_j' = j). Lentz: D_j = 1/(b_j + a_j D_{j-1}), C_j = b_j + a_j/C_{j-1},
        // C_1 = b_1 (C_0 = infinity), h = D_0 prod_j C_j D_j.
        double b = y + 1 - a;
        double d = 1 / b;
        double dd = d * d; // D_0' = -b_0'/b_0^2
        double g = d; // d log h / da so far: -b_0'/b_0
        double h = d;
        double c = 0;
        double ic = 0; // 1 / C_{j-1}
        double dc = 0;
        for (int i = 1; i < 100000; i++) {
            double an = -i * (i - a);
            b += 2;
            double den = an * d + b;
            double dden = i * d + an * dd - 1;
            if (Math.abs(den) < TINY) {
                den = TINY;
            }
            d = 1 / den;
            double dlogd = -dden * d; // D_j'/D_j
            dd = dlogd * d;
            if (i == 1) {
                c = b;
                dc = -1;
            } else {
                dc = -1 + i * ic - an * dc * ic * ic;
                c = b + an * ic;
            }
            if (Math.abs(c) < TINY) {
                c = TINY;
            }
            ic = 1 / c;
            double del = d * c;
            double dl = dc * ic + dlogd;
            h *= del;
            g += dl;
            if (Math.abs(del - 1) < 1e-16 && Math.abs(dl) < 1e-17 * Math.abs(g)) {
                break;
            }
        }
        out[0] = logy - psi + g;
        out[1] = 1 / h;
    }

    /**
     * log(y^a e^-y / Gamma(a)). For a &ge; 10 in the Stirling form
     * a log(y/a) - (y - a) + log(a)/2 - log(2 pi)/2 - c(a), with the correction
     * c(a) = log Gamma(a) - (a - 1/2) log a + a - log(2 pi)/2 by its asymptotic series
     * (A&amp;S 6.1.41, seven terms, truncation error below 1e-16 for a &ge; 10), log(y/a) by
     * log1p((y - a)/a) when |y - a| &lt; a/2 (y - a exact there, Sterbenz lemma): the direct form
     * loses about log(a) a eps absolutely near y = a, which matters where P/Q is needed.
     */
    static double logPrefix(double a, double y, double logy, double logGamma) {
        if (a < 10) {
            return a * logy - y - logGamma;
        }
        double d = y - a;
        double r = 1 / a;
        double r2 = r * r;
        double c = r * (1.0 / 12 + r2 * (-1.0 / 360 + r2 * (1.0 / 1260 + r2 * (-1.0 / 1680
                + r2 * (1.0 / 1188 + r2 * (-691.0 / 360360 + r2 * (1.0 / 156)))))));
        double logRatio = Math.abs(d) < 0.5 * a ? Math.log1p(d * r) : Math.log(y * r); // log(y/a)
        return a * logRatio - d + 0.5 * Math.log(a) - HALF_LOG_2PI - c;
    }
}
