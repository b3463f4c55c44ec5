package org.incipit.core.estimate.ambiguous;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.stream.Stream;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Maximum log-likelihood and argmax against an independent scipy implementation of the same
 * model (reference/ambiguous_start_reference.py; python3 + numpy 2.4.6 + scipy 1.17.1; BFGS then
 * Nelder-Mead polish from 3 starts), on its 4 seeded data sets, every family x history.
 */
class ReferenceMaximaTest {

    static Stream<Arguments> maxima() {
        return ReferenceData.rows("maxima.csv").stream().map(f -> Arguments.of((Object) f));
    }

    static ExposureHistory history(String s) {
        switch (s) {
            case "open":
                return ExposureHistory.open();
            case "complete":
                return ExposureHistory.complete();
            case "known-total":
                return ExposureHistory.knownTotal();
            default:
                throw new IllegalArgumentException(s);
        }
    }

    static double number(String s) {
        String t = s.startsWith("np.float64(") ? s.substring(11, s.length() - 1) : s;
        return Double.parseDouble(t);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("maxima")
    void reproducesScipyMaximum(String[] row) {
        ReferenceData ref = ReferenceData.read(row[0]);
        Family family = Family.byName(row[1]);
        ExposureHistory history = history(row[2]);
        assertEquals(Integer.parseInt(row[3]), ref.data.n, "cases");
        assertEquals(Integer.parseInt(row[4]), ref.data.candidates(), "candidates");
        AmbiguousStartFit fit = AmbiguousStartEstimator.fit(ref.data, family, history,
                AmbiguousStartEstimator.Options.defaults(), ref.kinds);
        double refLl = number(row[5]);
        // maximum log-likelihood: 1e-6 absolute (scipy's optimum polished by Nelder-Mead to 1e-13 in f)
        assertEquals(refLl, fit.logLikelihood(), 1e-6, "max log-likelihood");
        assertTrue(fit.logLikelihood() >= refLl - 1e-6, "not below the reference maximum");
        boolean boundary = false;
        for (int c = 0; c < ref.kinds.size(); c++) {
            double p = number(row[8 + c]);
            boundary |= p < 1e-6 || p > 1 - 1e-6;
        }
        if (boundary) {
            // only the supremum is comparable; our p must be at the same edge
            for (int c = 0; c < ref.kinds.size(); c++) {
                double p = number(row[8 + c]);
                double ours = fit.transmission().get(c).estimate();
                assertEquals(p, ours, 1e-4, "boundary p " + c);
            }
            return;
        }
        assertTrue(fit.converged(), fit.message());
        // interior argmax: 1e-5 relative (the reference argmax is itself accurate to about this,
        // its log-likelihood being flat to 1e-13 around it)
        assertEquals(number(row[6]), fit.parameters().get(0).estimate(), 1e-5 * Math.abs(number(row[6])), "param1");
        assertEquals(number(row[7]), fit.parameters().get(1).estimate(), 1e-5 * Math.abs(number(row[7])), "param2");
        for (int c = 0; c < ref.kinds.size(); c++) {
            double p = number(row[8 + c]);
            assertEquals(p, fit.transmission().get(c).estimate(), 1e-5 * p, "p " + c);
        }
    }
}
