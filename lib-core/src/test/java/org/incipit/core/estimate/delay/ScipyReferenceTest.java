package org.incipit.core.estimate.delay;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Truncated, day-level (double interval censored), right-censored, growth-weighted and
 * exposure-window likelihood maxima against an independent scipy 1.17 implementation written
 * from the formulas (reference/delay_reference.py: scipy.stats densities and cdfs,
 * scipy.integrate.quad for every integral, Nelder-Mead maxima; output maxima.csv and the data
 * CSVs in the same directory). Maximum log-likelihood to 1e-6 absolute; parameters to 1e-5
 * relative (Nelder-Mead stops at xatol 1e-12 on the log scale, but a flat maximum moves the
 * parameters by about sqrt(2 * 1e-13 / curvature)).
 */
class ScipyReferenceTest {

    private static final String DIR = "/org/incipit/core/estimate/delay/";
    private static final double T = 40;
    private static final double R = 0.1;

    static Stream<Arguments> maxima() {
        return TestData.read(DIR + "maxima.csv").stream().map(r -> Arguments.of(r.get("dataset"), r.get("variant"),
                r.get("family"), r));
    }

    static DelayPairs truncated() {
        DelayPairs.Builder b = DelayPairs.builder(T);
        List<Map<String, String>> rows = TestData.read(DIR + "truncated.csv");
        for (int i = 0; i < rows.size(); i++) {
            b.addObserved("p" + i, TestData.num(rows.get(i), "primary"), TestData.num(rows.get(i), "secondary"));
        }
        return b.build();
    }

    static DelayPairs daily() {
        DelayPairs.Builder b = DelayPairs.builder(T);
        List<Map<String, String>> rows = TestData.read(DIR + "daily.csv");
        for (int i = 0; i < rows.size(); i++) {
            b.addObserved("p" + i, TestData.num(rows.get(i), "primary_day"),
                    TestData.num(rows.get(i), "secondary_day"), true);
        }
        return b.build();
    }

    static DelayPairs censored() {
        DelayPairs.Builder b = DelayPairs.builder(T);
        List<Map<String, String>> rows = TestData.read(DIR + "censored.csv");
        for (int i = 0; i < rows.size(); i++) {
            double s = TestData.num(rows.get(i), "primary");
            if (rows.get(i).get("secondary").isEmpty()) {
                b.addCensored("p" + i, s, false);
            } else {
                b.addObserved("p" + i, s, TestData.num(rows.get(i), "secondary"));
            }
        }
        return b.build();
    }

    static double[] growth() {
        return TestData.read(DIR + "growth.csv").stream().mapToDouble(r -> TestData.num(r, "delay")).toArray();
    }

    static ExposureWindows incubation() {
        ExposureWindows.Builder b = ExposureWindows.builder();
        List<Map<String, String>> rows = TestData.read(DIR + "incubation.csv");
        for (int i = 0; i < rows.size(); i++) {
            b.add("c" + i, TestData.num(rows.get(i), "exposure_from"), TestData.num(rows.get(i), "exposure_to"),
                    TestData.num(rows.get(i), "onset"));
        }
        return b.build();
    }

    static DelayFit fit(String dataset, String variant, DelayFamily family) {
        DelayOptions o = DelayOptions.defaults();
        return switch (dataset) {
            case "truncated" -> DelayEstimator.rightTruncated(truncated(), family, o);
            case "daily" -> DelayEstimator.rightTruncated(daily(), family, o);
            case "censored" -> DelayEstimator.censored(censored(), family, o);
            case "growth" -> DelayEstimator.growthWeighted(growth(), family, R, o);
            case "incubation" -> IncubationEstimator.fit(incubation(), family, switch (variant) {
                case "interval" -> ExposureWindowModel.intervalCensored();
                case "uniform" -> ExposureWindowModel.uniform();
                default -> ExposureWindowModel.growing(R);
            }, o);
            default -> throw new IllegalStateException(dataset);
        };
    }

    @ParameterizedTest(name = "{0} {1} {2}")
    @MethodSource("maxima")
    void maximumMatchesScipy(String dataset, String variant, String familyName, Map<String, String> ref) {
        DelayFamily family = DelayFamilies.byName(familyName);
        DelayFit fit = fit(dataset, variant, family);
        assertTrue(fit.converged(), fit.message());
        assertEquals(TestData.num(ref, "loglik"), fit.logLikelihood(), 1e-6, "maximum log-likelihood to 1e-6");
        double p1 = fit.parameters().get(0).estimate();
        double p2 = fit.parameters().get(1).estimate();
        assertEquals(TestData.num(ref, "param1"), p1, 1e-5 * Math.abs(TestData.num(ref, "param1")), "param1");
        assertEquals(TestData.num(ref, "param2"), p2, 1e-5 * Math.abs(TestData.num(ref, "param2")), "param2");
    }
}
