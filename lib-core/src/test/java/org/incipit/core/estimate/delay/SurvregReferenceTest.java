package org.incipit.core.estimate.delay;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

import org.incipit.core.observe.CensoredDelays;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Right- and interval-censored fits against R 4.2.2 survival 3.5.3 survreg(Surv(...) ~ 1,
 * dist = "weibull" | "lognormal") on survival's open data sets lung and veteran, and on lung
 * grouped into 30-day intervals (reference/survival_reference.R, output
 * survreg_reference.csv). Mapping: Weibull shape = 1 / survreg scale, scale = exp(intercept);
 * lognormal meanLog = intercept, sdLog = survreg scale. Standard errors compared on survreg's
 * scale (intercept, log scale), where both are the inverse observed information.
 */
class SurvregReferenceTest {

    private static final String DIR = "/org/incipit/core/estimate/";

    static Stream<Arguments> cases() {
        return TestData.read(DIR + "survreg_reference.csv").stream().map(r -> Arguments.of(r.get("case"),
                r.get("dist"), r));
    }

    static CensoredDelays data(String name) {
        CensoredDelays.Builder b = CensoredDelays.builder();
        if (name.equals("lung_interval")) {
            List<Map<String, String>> rows = TestData.read(DIR + "lung_interval.csv");
            for (int i = 0; i < rows.size(); i++) {
                String lo = rows.get(i).get("left");
                String hi = rows.get(i).get("right");
                if (lo.isEmpty()) {
                    b.addLeftCensored("r" + i, Double.parseDouble(hi));
                } else if (hi.isEmpty()) {
                    b.addRightCensored("r" + i, Double.parseDouble(lo));
                } else {
                    b.addInterval("r" + i, Double.parseDouble(lo), Double.parseDouble(hi));
                }
            }
        } else {
            List<Map<String, String>> rows = TestData.read(DIR + name + ".csv");
            for (int i = 0; i < rows.size(); i++) {
                double t = TestData.num(rows.get(i), "time");
                if (TestData.num(rows.get(i), "event") == 1) {
                    b.addExact("r" + i, t);
                } else {
                    b.addRightCensored("r" + i, t);
                }
            }
        }
        return b.build();
    }

    private static void assertRelative(double expected, double actual, double rel, String what) {
        assertEquals(expected, actual, rel * Math.abs(expected), what + " to " + rel + " relative");
    }

    @ParameterizedTest(name = "{0} {1}")
    @MethodSource("cases")
    void matchesSurvreg(String name, String dist, Map<String, String> ref) {
        DelayFamily family = dist.equals("weibull") ? DelayFamilies.WEIBULL : DelayFamilies.LOGNORMAL;
        DelayFit fit = DelayEstimator.intervalCensored(data(name), family, DelayOptions.defaults());
        assertTrue(fit.converged(), fit.message());
        assertRelative(TestData.num(ref, "loglik"), fit.logLikelihood(), 1e-9, "log-likelihood");
        boolean weibull = dist.equals("weibull");
        double p1 = fit.parameter(weibull ? "shape" : "meanLog").estimate();
        double p2 = fit.parameter(weibull ? "scale" : "sdLog").estimate();
        assertRelative(TestData.num(ref, "param1"), p1, 1e-6, "param1");
        assertRelative(TestData.num(ref, "param2"), p2, 1e-6, "param2");
        double[][] cov = fit.fit().unconstrainedCovariance();
        // unconstrained = (log shape, log scale) for the Weibull, (meanLog, log sdLog) for the lognormal
        // survreg intercept = log scale (Weibull) or meanLog; survreg log scale = -log shape or log sdLog
        int iIntercept = fit.parameterNames().indexOf(weibull ? "scale" : "meanLog");
        int iLogScale = fit.parameterNames().indexOf(weibull ? "shape" : "sdLog");
        double seIntercept = Math.sqrt(cov[iIntercept][iIntercept]);
        double seLogScale = Math.sqrt(cov[iLogScale][iLogScale]);
        double covMixed = (weibull ? -1 : 1) * cov[iIntercept][iLogScale];
        assertRelative(TestData.num(ref, "se_intercept"), seIntercept, 1e-4, "se(intercept)");
        assertRelative(TestData.num(ref, "se_log_scale"), seLogScale, 1e-4, "se(log scale)");
        assertEquals(TestData.num(ref, "cov_intercept_log_scale"), covMixed,
                1e-4 * seIntercept * seLogScale, "cov(intercept, log scale) to 1e-4 of se*se");
    }
}
