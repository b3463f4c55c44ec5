package org.incipit.core.study;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.observe.DailyCounts;
import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;
import org.junit.jupiter.api.Test;

/** The delay, incubation, backward-interval and fatality study models (fast checks). */
class DelayModelsTest {

    private static final long SEED = 20261231L;

    private static StudyResult run(String text) {
        return StudyRegistry.standard().study(ScenarioSpec.parse(text, "test")).run(Runnable::run, StudyListener.NONE);
    }

    private static void allSucceed(StudyResult r) {
        for (StudySummary s : r.summaries()) {
            assertEquals(s.replicates(), s.successes(), s.estimator() + " " + s.failureReasons());
        }
    }

    @Test
    void truncatedPairsRespectTheCutoffAndTheCorrectedFitRuns() {
        Scenario s = new Scenario("t", Map.of("mean", 8.0, "sd", 4.0), Map.of("cutoff", 40.0),
                Map.of("family", "gamma"));
        DelayPairs p = DelayModels.pairs(s, true).generate(RandomSource.XO_RO_SHI_RO_128_PP.create(SEED), s, 300);
        assertEquals(300, p.size());
        assertEquals(0, p.censoredCount());
        for (int i = 0; i < p.size(); i++) {
            assertTrue(p.secondary(i) <= 40);
        }
        DelayPairs c = DelayModels.pairs(s, false).generate(RandomSource.XO_RO_SHI_RO_128_PP.create(SEED), s, 300);
        assertTrue(c.censoredCount() > 0 && c.observedCount() > 0);
        allSucceed(run("""
                name = t
                generator = truncated-delays
                estimators = delay-truncated, delay-observed-only
                family = gamma
                mean = 8
                sd = 4
                option.daily = yes
                sizes = 200
                replicates = 4
                seed = 1
                """));
    }

    /**
     * Primary times drawn by inversion of the density g e^(g s) / (e^(g T) - 1) on [0, T]:
     * their mean is T / (1 - e^(-g T)) - 1/g (integration by parts; common practice). Windows:
     * onset after the window start, incubation from the window's end at least as short.
     */
    @Test
    void generatorsDrawWhatTheyState() {
        Scenario s = new Scenario("c", Map.of("mean", 8.0, "sd", 4.0), Map.of("cutoff", 40.0,
                "primary-growth", 0.1), Map.of("family", "gamma"));
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        DelayPairs c = DelayModels.pairs(s, false).generate(rng, s, 20_000);
        double m = 0;
        for (int i = 0; i < c.size(); i++) {
            m += c.primary(i);
        }
        m /= c.size();
        double expected = 40 / (1 - Math.exp(-4.0)) - 10;
        // sd of a primary is below 40/sqrt(12) = 11.5, so the SE of the mean is below 0.082
        assertEquals(expected, m, 4 * 0.082);

        Scenario w = new Scenario("w", Map.of("mean", 5.5, "sd", 2.5), Map.of(), Map.of("family", "lognormal"));
        ExposureWindows win = DelayModels.windows(w).generate(rng, w, 500);
        for (int i = 0; i < win.size(); i++) {
            assertTrue(win.exposureFrom(i) <= win.exposureTo(i) && win.exposureTo(i) - win.exposureFrom(i) <= 4);
        }
    }

    @Test
    void backwardAndIncubationAndFatalityStudiesRun() {
        allSucceed(run("""
                name = b
                generator = backward-intervals
                estimators = interval-growth-weighted, interval-backward-naive, backward-R-corrected, backward-R-naive
                family = gamma
                mean = 5
                sd = 2
                r = 0.1
                truth.R = 1.617701811416207
                sizes = 200
                replicates = 3
                seed = 2
                """));
        allSucceed(run("""
                name = i
                generator = incubation-windows
                estimators = incubation-interval-censored, incubation-uniform, incubation-growing
                family = lognormal
                mean = 5.5
                sd = 2.5
                r = 0.3
                option.in-window = growing
                sizes = 200
                replicates = 3
                seed = 3
                """));
        StudyResult f = run("""
                name = f
                generator = fatality-counts
                estimators = fatality-window-adjusted, fatality-crude
                r = 0.1
                fatality = 0.05
                setting.days = 40
                sizes = 2000
                replicates = 3
                seed = 4
                """);
        allSucceed(f);
        Scenario s = new Scenario("f", Map.of("r", 0.1, "fatality", 0.05), Map.of("days", 40.0), Map.of());
        DailyCounts d = DelayModels.fatalityCounts(s).generate(RandomSource.XO_RO_SHI_RO_128_PP.create(SEED), s, 2000);
        assertEquals(40, d.size());
        assertTrue(d.hasDeaths());
    }
}
