package org.incipit.core.study;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/** Summary arithmetic on hand-made inputs, Clopper-Pearson against scipy, and the table writers. */
class StudySummaryTest {

    static Stream<Arguments> clopperPearson() throws IOException {
        // mpmath 1.3 roots of the regularised incomplete beta; reference/study_reference.py
        try (InputStream in = StudySummaryTest.class.getResourceAsStream("clopper_pearson.csv")) {
            String text = new String(in.readAllBytes(), StandardCharsets.UTF_8);
            return text.lines().filter(l -> !l.startsWith("#") && !l.startsWith("x,")).map(l -> l.split(","))
                    .map(f -> Arguments.of(Integer.parseInt(f[0]), Integer.parseInt(f[1]),
                            Double.parseDouble(f[2]), Double.parseDouble(f[3])))
                    .toList().stream();
        }
    }

    @ParameterizedTest
    @MethodSource
    void clopperPearson(int x, int m, double lower, double upper) {
        double[] ci = StudySummary.clopperPearson(x, m, 0.95);
        // commons-statistics beta quantile vs 40-digit mpmath: 1e-12 relative
        assertEquals(lower, ci[0], 1e-12 * lower, "lower");
        assertEquals(upper, ci[1], 1e-12 * upper, "upper");
    }

    /**
     * Estimates {1, 3, 3, 3, 3, 3, 3, 3, 5}, truth 2: mean 3, bias 1, relative bias 0.5,
     * SD sqrt(8/8) = 1, bias SE 1/3, RMSE sqrt(17/9) (errors -1, 1 x 7, 3); intervals
     * estimate +- 1 except the last, [4, +Inf): [0, 2] and [2, 4] x 7 contain the truth 2 (bounds
     * included), [4, Inf) does not -> 8 of 9 covered; widths 2 x 8 and Inf: median 2, mean Inf;
     * one failure, so 10 replicates.
     */
    private static StudySummary handMade() {
        double[] est = {1, 3, 3, 3, 3, 3, 3, 3, 5};
        double[] lo = {0, 2, 2, 2, 2, 2, 2, 2, 4};
        double[] hi = {2, 4, 4, 4, 4, 4, 4, 4, Double.POSITIVE_INFINITY};
        return StudySummary.of("fit, \"open\"", "mean|x", 10, 2.0, 0.95, est, lo, hi,
                Map.of("EstimationException: no fit, 3 iterations", 1));
    }

    @Test
    void handMadeSummary() {
        StudySummary s = handMade();
        assertEquals(10, s.replicates());
        assertEquals(9, s.successes());
        assertEquals(1, s.failures());
        assertEquals(0.1, s.failureRate(), 0);
        assertEquals(3.0, s.meanEstimate(), 0);
        assertEquals(1.0, s.bias(), 0);
        assertEquals(0.5, s.relativeBias(), 0);
        assertEquals(1.0, s.empiricalSd(), 0);
        assertEquals(1.0 / 3, s.biasStandardError(), 0);
        assertEquals(Math.sqrt(17.0 / 9), s.rmse(), 0);
        assertEquals(8, s.covered());
        assertEquals(8.0 / 9, s.coverage(), 0);
        assertEquals(Math.sqrt(8.0 / 9 * (1.0 / 9) / 9), s.coverageStandardError(), 1e-16);
        assertEquals(Double.POSITIVE_INFINITY, s.meanWidth());
        assertEquals(2.0, s.medianWidth(), 0);
        assertEquals(1, s.unboundedIntervals());
        assertThrows(IllegalArgumentException.class, () -> StudySummary.of("e", "t", 1, 0, 0.95,
                new double[] {1}, new double[] {2}, new double[] {3}, Map.of()));
    }

    @Test
    void csvIsExact() {
        StudySummary s = handMade();
        double[] cp = StudySummary.clopperPearson(8, 9, 0.95);
        String expected = String.join(",", StudyTables.CSV_COLUMNS) + "\n"
                + "\"fit, \"\"open\"\"\",mean|x,10,2.0,0.95,10,9,1,0.1,3.0,1.0," + (1.0 / 3) + ",0.5,"
                + Math.sqrt(17.0 / 9) + ",1.0,8," + (8.0 / 9) + "," + s.coverageStandardError() + "," + cp[0] + ","
                + cp[1] + ",Inf,2.0,1,\"EstimationException: no fit, 3 iterations (1)\"\n";
        assertEquals(expected, StudyTables.csv(List.of(s)));
        assertEquals("estimator,target,n,truth,level,replicates,successes,failures,failure_rate,mean,bias,bias_se,"
                + "relative_bias,rmse,empirical_sd,covered,coverage,coverage_se,coverage_lower,coverage_upper,"
                + "mean_width,median_width,unbounded,failure_reasons\n", StudyTables.csv(List.of()));
    }

    @Test
    void markdownIsExact() {
        StudySummary s = handMade();
        // Clopper-Pearson 8 of 9: scipy 0.51750348508, 0.99719086325 (4 significant digits below)
        String expected = "| estimator | target | n | truth | mean | bias (MC SE) | rel. bias | RMSE | emp. SD "
                + "| coverage (SE) | coverage 95% CI | mean width | median width | failures |\n"
                + "|---|---|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|\n"
                + "| fit, \"open\" | mean\\|x | 10 | 2.000 | 3.000 | 1.000 (0.3333) | 0.5000 | 1.374 | 1.000 "
                + "| 0.8889 (0.1048) | 0.5175–0.9972 | Inf | 2.000 | 1/10 |\n"
                + "\nFailures:\n\n"
                + "- fit, \"open\", mean\\|x, n = 10: 1 × EstimationException: no fit, 3 iterations\n";
        assertEquals(expected, StudyTables.markdown(List.of(s)));
    }
}
