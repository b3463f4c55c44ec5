package org.incipit.distributions;

import org.apache.commons.numbers.gamma.Digamma;
import org.apache.commons.numbers.gamma.LogGamma;

/**
 * Log-scale regularised incomplete gamma functions and their derivative in the shape.
 *
 * <p>Lower series (Abramowitz &amp; Stegun 6.5.29): P(a, y) = y^a e^-y / Gamma(a + 1) *
 * sum_n y^n / ((a + 1) ... (a + n)). Upper continued fraction (Legendre; A&amp;S 6.5.31,
 * evaluated by the modified Lentz method, Press et al., Numerical Recipes, 3rd ed., 6.2).
 * Shape derivative: dP/da = int_0^y (log t - psi(a)) t^(a-1) e^-t dt / Gamma(a); the series
 * term by term gives sum_n c_n (log y - psi(a + n + 1)), all terms of one sign when
 * y &le; exp(psi(a)); otherwise the upper integral int_y^inf (log t - psi(a)) ... is used, whose
 * integrand is positive, by log-space quadrature. No cancellation on either branch.
 */
final class IncompleteGammaLog {
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
        final double tiny = 1e-300;
        double b = y + 1 - a;
        double c = 1 / tiny;
        double d = 1 / b;
        double h = d;
        for (int i = 1; i < 100000; i++) {
            double an = -i * (i - a);
            b += 2;
            d = an * d + b;
            if (Math.abs(d) < tiny) {
                d = tiny;
            }
            c = b + an / c;
            if (Math.abs(c) < tiny) {
                c = tiny;
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
     * @return {d log P / da, d log Q / da} at (a, y), y &gt; 0
     */
    static double[] dLogDa(double a, double y, double logP, double logQ) {
        double psi = Digamma.value(a);
        double logy = Math.log(y);
        if (logy <= psi) {
            // dP/da / P = sum c_n (log y - psi(a+n+1)) / sum c_n, terms all negative.
            double sum = 1;
            double term = 1;
            double psin = psi + 1 / a; // psi(a + 1)
            double num = logy - psin;
            for (int n = 1; n < 1000000; n++) {
                term *= y / (a + n);
                psin += 1 / (a + n);
                sum += term;
                num += term * (logy - psin);
                if (term < 1e-17 * sum) {
                    break;
                }
            }
            double dlogP = num / sum;
            double dlogQ = -dlogP * Math.exp(logP - logQ);
            return new double[] {dlogP, dlogQ};
        }
        // dQ/da = int_{log y}^inf (u - psi) exp(a u - e^u) du / Gamma(a), integrand positive.
        final double p0 = psi;
        PeakQuadrature.LogIntegrand num = new PeakQuadrature.LogIntegrand() {
            @Override
            public double value(double u) {
                return a * u - Math.exp(u) + Math.log(u - p0);
            }

            @Override
            public double slope(double u) {
                return a - Math.exp(u) + 1 / (u - p0);
            }

            @Override
            public double curvature(double u) {
                double v = u - p0;
                return -Math.exp(u) - 1 / (v * v);
            }
        };
        double logNum = PeakQuadrature.logIntegral(num, logy, Double.POSITIVE_INFINITY, Math.max(logy, Math.log(a)));
        double logDq = logNum - LogGamma.value(a);
        double dlogQ = Math.exp(logDq - logQ);
        double dlogP = -Math.exp(logDq - logP);
        return new double[] {dlogP, dlogQ};
    }
}
