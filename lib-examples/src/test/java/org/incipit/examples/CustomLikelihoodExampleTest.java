package org.incipit.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import org.incipit.core.inference.Bootstrap;
import org.incipit.core.inference.BootstrapResult;
import org.incipit.core.inference.Estimate;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.core.study.Scenario;
import org.incipit.core.study.Study;
import org.incipit.core.study.StudyEstimator;
import org.incipit.core.study.StudyListener;
import org.incipit.core.study.StudySummary;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.GammaDelay;
import org.junit.jupiter.api.Test;

/** The left-truncated-delay example: likelihood against scipy, and the engine's tools on top. */
class CustomLikelihoodExampleTest {

    private static List<String[]> csv(String name) throws IOException {
        try (InputStream in = CustomLikelihoodExampleTest.class.getResourceAsStream(name)) {
            List<String[]> rows = new ArrayList<>();
            String[] lines = new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\n");
            for (int i = 0; i < lines.length; i++) {
                if (!lines[i].startsWith("#") && !lines[i].isBlank() && !lines[i].startsWith("entry")
                        && !lines[i].startsWith("family")) {
                    rows.add(lines[i].split(","));
                }
            }
            return rows;
        }
    }

    private static CustomLikelihoodExample.LeftTruncatedDelays referenceData() throws IOException {
        List<String[]> rows = csv("left_truncated_data.csv");
        double[] u = new double[rows.size()];
        double[] d = new double[rows.size()];
        for (int i = 0; i < u.length; i++) {
            u[i] = Double.parseDouble(rows.get(i)[0]);
            d[i] = Double.parseDouble(rows.get(i)[1]);
        }
        return new CustomLikelihoodExample.LeftTruncatedDelays(d, u);
    }

    /**
     * Maximum against an independent scipy 1.17 maximisation (reference/left_truncated_reference.py):
     * log-likelihood to 1e-10 relative, parameters to 1e-5 relative (both optimisers stop on a
     * gradient tolerance; near the maximum the parameters are determined to about the square root
     * of the log-likelihood's precision).
     */
    @Test
    void maximumMatchesScipy() throws IOException {
        CustomLikelihoodExample.LeftTruncatedDelays data = referenceData();
        for (String[] r : csv("left_truncated_reference.csv")) {
            DelayFamily fam = DelayFamilies.byName(r[0]);
            MaximumLikelihoodFit f = CustomLikelihoodExample.fit(data, fam);
            double expected = Double.parseDouble(r[2]);
            assertEquals(expected, f.naturalEstimate(r[1]), 1e-5 * expected, r[0] + " " + r[1]);
            double ll = Double.parseDouble(r[3]);
            assertEquals(ll, f.logLikelihood(), 1e-10 * Math.abs(ll), r[0] + " log-likelihood");
        }
    }

    /** Profile intervals and the bootstrap come from the engine without further code. */
    @Test
    void engineToolsApply() throws IOException {
        CustomLikelihoodExample.LeftTruncatedDelays data = referenceData();
        MaximumLikelihoodFit f = CustomLikelihoodExample.fit(data, DelayFamilies.GAMMA);
        Estimate wald = f.wald("shape", 0.95);
        Estimate profile = f.profile("shape", 0.95);
        assertTrue(profile.lower() < f.naturalEstimate("shape") && profile.upper() > f.naturalEstimate("shape"));
        // Wald and profile intervals agree to first order at n = 300: widths within 25% (common practice)
        assertEquals(wald.width(), profile.width(), 0.25 * wald.width());
        Estimate mean = f.delta(t -> t[0] / t[1], 0.95);
        assertTrue(mean.lower() < mean.estimate() && mean.estimate() < mean.upper());
        BootstrapResult b = Bootstrap.nonparametric(11L, 200, data.size(),
                idx -> CustomLikelihoodExample.fit(data.subset(idx), DelayFamilies.GAMMA).naturalEstimate(),
                f.naturalEstimate(), Runnable::run);
        assertEquals(200, b.successful());
        // bootstrap SE of the shape within 30% of the Wald SE (200 replicates: its own relative
        // sampling error is about 1/sqrt(2 * 200) = 5%; the rest is allowance for skewness)
        assertEquals(f.naturalStandardError(0), b.standardError(0), 0.3 * f.naturalStandardError(0));
        assertThrows(IllegalArgumentException.class,
                () -> new CustomLikelihoodExample.LeftTruncatedDelays(new double[] {1}, new double[] {2}));
    }

    /**
     * The study harness runs the new estimator: 200 seeded data sets of 200 left-truncated
     * gamma(2.5, 0.4) delays (entry uniform on (0, 3)); accept 180 to 199 Wald intervals of the
     * mean containing the truth (about 0.12% false alarms at exact coverage, scipy.stats.binom
     * 1.17: P(X &le; 179) + P(X = 200) for Binomial(200, 0.95)).
     */
    @Test
    void studyHarnessRunsTheNewEstimator() {
        GammaDelay truth = GammaDelay.ofShapeRate(2.5, 0.4);
        Scenario s = Scenario.of("left-truncated", Map.of("mean", truth.mean()));
        Study<CustomLikelihoodExample.LeftTruncatedDelays> study = Study.<CustomLikelihoodExample.LeftTruncatedDelays>
                builder(s, (rng, sc, n) -> {
                    double[] d = new double[n];
                    double[] u = new double[n];
                    for (int i = 0; i < n; i++) {
                        u[i] = 3 * rng.nextDouble();
                        double x;
                        do {
                            x = truth.sample(rng);
                        } while (!(x > u[i]));
                        d[i] = x;
                    }
                    return new CustomLikelihoodExample.LeftTruncatedDelays(d, u);
                })
                .estimator(StudyEstimator.of("left-truncated-gamma", List.of("mean"), (rng, data) -> Map.of("mean",
                        CustomLikelihoodExample.fit(data, DelayFamilies.GAMMA).delta(t -> t[0] / t[1], 0.95))))
                .sampleSizes(200).replicates(200).seed(20261223L).build();
        StudySummary sum = study.run(Runnable::run, StudyListener.NONE).summaries().get(0);
        assertEquals(200, sum.successes(), sum.failureReasons().toString());
        assertTrue(sum.covered() >= 180 && sum.covered() <= 199, "covered " + sum.covered());
    }
}
