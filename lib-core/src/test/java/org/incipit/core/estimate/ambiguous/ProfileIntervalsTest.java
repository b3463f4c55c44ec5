package org.incipit.core.estimate.ambiguous;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

import org.incipit.core.inference.Estimate;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Profile-likelihood intervals of the ambiguous-start fit against an independent scipy
 * computation (reference/ambiguous_profile_reference.py; python3 + numpy 2.4.6 + scipy 1.17.1:
 * SLSQP constrained maxima with the equality constraint q(theta) = c, brentq for the bounds) on
 * the first 40 cases of the seeded data set open_one_kind, open exposure history.
 */
class ProfileIntervalsTest {

    private static final Map<String, Family> FAMILIES = Map.of("gamma", Family.GAMMA, "weibull", Family.WEIBULL,
            "lognormal", Family.LOGNORMAL);

    static Prepared firstCases(int n) {
        Prepared all = ReferenceData.read("open_one_kind").data;
        // the first n cases of the file (Prepared stores cases in candidate-count order)
        int[] idx = new int[n];
        int w = 0;
        for (int i = 0; i < all.n; i++) {
            if ((all.original == null ? i : all.original[i]) < n) {
                idx[w++] = i;
            }
        }
        return all.subset(idx);
    }

    static AmbiguousStartFit fit(Family family, AmbiguousStartEstimator.Intervals method) {
        AmbiguousStartEstimator.Options o = new AmbiguousStartEstimator.Options(0.95, List.of(0.5), method);
        return AmbiguousStartEstimator.fit(firstCases(40), family, ExposureHistory.open(), o, null);
    }

    static Stream<Arguments> rows() {
        return ReferenceData.rows("profile_intervals.csv").stream().map(f -> Arguments.of((Object) f));
    }

    static Estimate pick(AmbiguousStartFit f, String quantity) {
        return switch (quantity) {
            case "param1" -> f.parameters().get(0);
            case "param2" -> f.parameters().get(1);
            case "p" -> f.p();
            case "mean" -> f.mean();
            case "sd" -> f.sd();
            case "median" -> f.quantiles().get(0);
            default -> throw new IllegalArgumentException(quantity);
        };
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("rows")
    void boundsMatchScipy(String[] row) {
        AmbiguousStartFit f = fit(FAMILIES.get(row[0]), AmbiguousStartEstimator.Intervals.PROFILE);
        assertTrue(f.converged(), f.message());
        assertEquals(Double.parseDouble(row[2]), f.logLikelihood(), 1e-7, "log-likelihood");
        Estimate e = pick(f, row[1]);
        assertEquals("profile", e.method());
        // estimate 1e-6 relative (scipy's optimum is polished to 1e-13 in f; the argmax is
        // accurate to about 1e-6); bounds 1e-6 relative: at a bound the profile has slope
        // of order 1 per unit of log q, so an error of 1e-12 in the profile value (either side)
        // moves the root by far less; the rest is the argmax error
        double est = Double.parseDouble(row[3]);
        assertEquals(est, e.estimate(), 1e-6 * Math.abs(est), row[1] + " estimate");
        double lo = Double.parseDouble(row[4]);
        double hi = Double.parseDouble(row[5]);
        assertEquals(lo, e.lower(), 1e-6 * Math.abs(lo), row[1] + " lower");
        assertEquals(hi, e.upper(), 1e-6 * Math.abs(hi), row[1] + " upper");
    }

    @Test
    void deltaIntervalsAreTheCheapOption() {
        AmbiguousStartFit f = fit(Family.GAMMA, AmbiguousStartEstimator.Intervals.DELTA);
        assertEquals("delta-log", f.mean().method());
        assertEquals("wald-logit", f.p().method());
        assertEquals("wald-log", f.parameters().get(0).method());
        // AUTOMATIC: below PROFILE_BELOW_CASES cases profile for H, logit-Wald for p
        AmbiguousStartFit a = fit(Family.GAMMA, AmbiguousStartEstimator.Intervals.AUTOMATIC);
        assertEquals("profile", a.mean().method());
        assertEquals("profile", a.sd().method());
        assertEquals("profile", a.quantiles().get(0).method());
        assertEquals("profile", a.parameters().get(1).method());
        assertEquals("wald-logit", a.p().method());
        assertEquals(f.p(), a.p());
        // the same maximum either way
        assertEquals(f.logLikelihood(), a.logLikelihood(), 0);
    }
}
