package org.incipit.core.growth;

import org.apache.commons.numbers.gamma.Digamma;
import org.apache.commons.numbers.gamma.LogGamma;
import org.apache.commons.numbers.gamma.Trigamma;

/**
 * The parts of the NB2 log-likelihood and its k-derivatives that depend on the counts and k
 * only: L(k) = &Sigma;<sub>i</sub> [ln&Gamma;(y<sub>i</sub> + k) &minus; ln&Gamma;(k)],
 * D(k) = &Sigma;<sub>i</sub> [&psi;(y<sub>i</sub> + k) &minus; &psi;(k)] and
 * T(k) = &Sigma;<sub>i</sub> [&psi;'(y<sub>i</sub> + k) &minus; &psi;'(k)], and the constant
 * &Sigma; ln y<sub>i</sub>!.
 *
 * <p>For integer counts up to {@link #DIRECT_LIMIT} the recurrences &Gamma;(x + 1) = x&Gamma;(x),
 * &psi;(x + 1) = &psi;(x) + 1/x and &psi;'(x + 1) = &psi;'(x) &minus; 1/x&sup2; (Abramowitz
 * &amp; Stegun 6.1.15, 6.3.5, 6.4.6) turn the sums into finite sums with no special function:
 * with N<sub>j</sub> = #{i : y<sub>i</sub> &gt; j}, L = &Sigma;<sub>j</sub> N<sub>j</sub>
 * ln(k + j), D = &Sigma;<sub>j</sub> N<sub>j</sub>/(k + j), T = &minus;&Sigma;<sub>j</sub>
 * N<sub>j</sub>/(k + j)&sup2;. N<sub>j</sub> is constant between consecutive distinct counts, so
 * the cumulative sums take one logarithm of a product per run (products are flushed before they
 * can overflow).
 * Larger or non-integer counts use the special functions once per distinct count.
 */
final class CountSums {

    /** Largest count for the special-function-free sums (cost is linear in the largest count). */
    static final int DIRECT_LIMIT = 4096;

    private final double[] values; // distinct positive counts, ascending
    private final int[] above;     // number of observations with count >= values[m]
    private final int[] mult;      // multiplicity of values[m]
    private final boolean direct;
    private final double logFactorialSum;
    private final int[] index;     // observation -> distinct count, -1 for a zero count
    private final double[] perValue; // work array, ln Gamma(v + k) - ln Gamma(k) per distinct v

    CountSums(double[] y) {
        double[] s = y.clone();
        java.util.Arrays.sort(s);
        int n = s.length;
        int start = 0;
        while (start < n && !(s[start] > 0)) {
            start++;
        }
        int distinct = 0;
        for (int i = start; i < n; i++) {
            if (i == start || s[i] != s[i - 1]) {
                distinct++;
            }
        }
        values = new double[distinct];
        mult = new int[distinct];
        above = new int[distinct];
        int m = -1;
        boolean integer = true;
        for (int i = start; i < n; i++) {
            if (i == start || s[i] != s[i - 1]) {
                values[++m] = s[i];
                above[m] = n - i;
                integer &= s[i] == Math.rint(s[i]);
            }
            mult[m]++;
        }
        direct = integer && (distinct == 0 || values[distinct - 1] <= DIRECT_LIMIT);
        logFactorialSum = LogLinearGlm.sumLogFactorial(y);
        index = new int[n];
        perValue = new double[distinct];
        for (int i = 0; i < n; i++) {
            index[i] = y[i] > 0 ? java.util.Arrays.binarySearch(values, y[i]) : -1;
        }
    }

    /**
     * Fills out[i] = ln&Gamma;(y<sub>i</sub> + k) &minus; ln&Gamma;(k) per observation, so that
     * the caller can add it into each observation's log-likelihood term (the terms then stay
     * small and the total keeps its precision). Direct path: the cumulative sums
     * &Sigma;<sub>j&lt;v</sub> ln(k + j) over the distinct counts v, with compensated
     * (Neumaier) addition.
     */
    void logGammaRatios(double k, double[] out) {
        if (direct) {
            double hi = 0;
            double lo = 0;
            double j = 0;
            for (int m = 0; m < values.length; m++) {
                double end = values[m];
                double prod = 1;
                for (; j < end; j++) {
                    prod *= k + j;
                    if (prod > 1e250 || prod < 1e-250) {
                        double a = Math.log(prod);
                        double t = hi + a;
                        lo += Math.abs(hi) >= Math.abs(a) ? (hi - t) + a : (a - t) + hi;
                        hi = t;
                        prod = 1;
                    }
                }
                double a = Math.log(prod);
                double t = hi + a;
                lo += Math.abs(hi) >= Math.abs(a) ? (hi - t) + a : (a - t) + hi;
                hi = t;
                perValue[m] = hi + lo;
            }
        } else {
            double lgk = LogGamma.value(k);
            for (int m = 0; m < values.length; m++) {
                perValue[m] = LogGamma.value(values[m] + k) - lgk;
            }
        }
        for (int i = 0; i < index.length; i++) {
            out[i] = index[i] < 0 ? 0 : perValue[index[i]];
        }
    }

    /** &Sigma; ln y<sub>i</sub>!. */
    double logFactorialSum() {
        return logFactorialSum;
    }

    /**
     * Fills out[0] = &Sigma;<sub>i</sub> [&psi;(y<sub>i</sub> + k) &minus; &psi;(k)] and
     * out[1] = &Sigma;<sub>i</sub> [&psi;'(y<sub>i</sub> + k) &minus; &psi;'(k)].
     */
    void digammaSums(double k, double[] out) {
        double d = 0;
        double t = 0;
        if (direct) {
            double j = 0;
            for (int m = 0; m < values.length; m++) {
                double end = values[m];
                double rd = 0;
                double rt = 0;
                for (; j < end; j++) {
                    double inv = 1 / (k + j);
                    rd += inv;
                    rt += inv * inv;
                }
                d += above[m] * rd;
                t -= above[m] * rt;
            }
        } else {
            double digK = Digamma.value(k);
            double trigK = Trigamma.value(k);
            for (int m = 0; m < values.length; m++) {
                d += mult[m] * LogLinearGlm.digammaShift(values[m], k, digK);
                t += mult[m] * LogLinearGlm.trigammaShift(values[m], k, trigK);
            }
        }
        out[0] = d;
        out[1] = t;
    }
}
