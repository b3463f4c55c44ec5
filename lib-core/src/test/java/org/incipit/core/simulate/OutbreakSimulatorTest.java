package org.incipit.core.simulate;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.EstimationException;
import org.incipit.core.branching.OffspringLaw;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.GammaDelay;
import org.incipit.distributions.LogNormalDelay;
import org.incipit.distributions.WeibullDelay;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Statistical checks use "within 4 standard errors": two-sided false-alarm probability
 * 6.3e-5 per check under a normal sampling distribution (common practice); with about 25
 * such checks in this class the chance of any false alarm is below 0.2%; plus four chi-square
 * checks at alpha = 0.001 (0.4%).
 */
class OutbreakSimulatorTest {

    private static final long SEED = 20261201L;

    private static UniformRandomProvider rng(long seed) {
        return RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
    }

    private static DelayDistribution gi() {
        return GammaDelay.exponential(1 / 5.0);
    }

    private static DelayDistribution incubation() {
        return LogNormalDelay.ofMeanLogSdLog(1.6, 0.4);
    }

    private static void assertWithin4Se(double expected, double[] x, String what) {
        double mean = Arrays.stream(x).average().orElseThrow();
        double var = Arrays.stream(x).map(v -> (v - mean) * (v - mean)).sum() / (x.length - 1);
        assertEquals(expected, mean, 4 * Math.sqrt(var / x.length), what);
    }

    // scipy 1.17.1: chi2.ppf(0.999, 9) = 27.877164871256568 (alpha = 0.001, 10 bins)
    private static final double CHI2_9DF_999 = 27.877164871256568;

    /** Chi-square on 10 equal-probability bins of d (STYLE.md sampler check), alpha = 0.001. */
    private static void assertChiSquare(DelayDistribution d, double[] x, String what) {
        double[] edges = new double[9];
        for (int b = 1; b <= 9; b++) {
            edges[b - 1] = d.quantile(b / 10.0);
        }
        long[] counts = new long[10];
        for (double v : x) {
            int b = 0;
            while (b < 9 && v > edges[b]) {
                b++;
            }
            counts[b]++;
        }
        double expected = x.length / 10.0;
        double chi2 = 0;
        for (long c : counts) {
            chi2 += (c - expected) * (c - expected) / expected;
        }
        assertTrue(chi2 < CHI2_9DF_999, what + ": chi-square " + chi2 + " counts " + Arrays.toString(counts));
    }

    private static OutbreakOptions.Builder standard() {
        return OutbreakOptions.builder(OffspringLaw.negativeBinomial(2, 0.5), gi(), incubation())
            .outcomes(0.1, WeibullDelay.ofShapeScale(1.5, 12), GammaDelay.ofShapeRate(4, 0.4))
            .maxCases(3000)
            .exposures(ExposureModel.open(0.3, 2.0));
    }

    @Test
    void sameSeedSameOutbreak() {
        OutbreakOptions opts = standard().conditionOnSurvival(100).build();
        SimulatedOutbreak a = OutbreakSimulator.simulate(rng(SEED), opts);
        SimulatedOutbreak b = OutbreakSimulator.simulate(rng(SEED), opts);
        assertEquals(a, b);
        assertArrayEquals(a.onsetTimes(), b.onsetTimes());
        assertArrayEquals(a.exposures().orElseThrow().candidateTimes(), b.exposures().orElseThrow().candidateTimes());
        assertEquals(3000, a.size());
        SimulatedOutbreak c = OutbreakSimulator.simulate(rng(SEED + 1), opts);
        assertNotEquals(a, c);
    }

    /**
     * Subcritical outbreaks run to extinction: every person's offspring count, generation
     * interval, incubation period, outcome and outcome delay is observed, all independent draws
     * from the configured laws.
     */
    @Test
    void drawsFollowTheConfiguredDistributions() {
        OffspringLaw law = OffspringLaw.negativeBinomial(0.8, 0.7);
        DelayDistribution toDeath = WeibullDelay.ofShapeScale(1.5, 12);
        DelayDistribution toRecovery = GammaDelay.ofShapeRate(4, 0.4);
        OutbreakOptions opts = OutbreakOptions.builder(law, gi(), incubation())
            .outcomes(0.1, toDeath, toRecovery).indexCases(4000).maxCases(1_000_000).build();
        SimulatedOutbreak o = OutbreakSimulator.simulate(rng(SEED), opts);
        assertEquals(StopReason.EXTINCT, o.stopReason());
        int n = o.size();
        assertTrue(n > 15_000, "size " + n);
        // mean offspring: law mean, SE from the law variance
        double meanOffspring = Arrays.stream(o.offspringCounts()).average().orElseThrow();
        assertEquals(law.mean(), meanOffspring, 4 * Math.sqrt(law.variance() / n), "mean offspring");
        // total offspring equals non-index persons (nobody lost)
        assertEquals(n - 4000, Arrays.stream(o.offspringCounts()).sum());
        double[] gis = new double[n - 4000];
        double[] inc = new double[n];
        int g = 0;
        int deaths = 0;
        double[] dd = new double[n];
        double[] rd = new double[n];
        int nd = 0;
        int nr = 0;
        for (int i = 0; i < n; i++) {
            int from = o.infectorId(i);
            if (from >= 0) {
                assertTrue(from < i, "infector precedes infectee");
                assertEquals(o.generation(from) + 1, o.generation(i));
                gis[g++] = o.infectionTime(i) - o.infectionTime(from);
            } else {
                assertEquals(0, o.generation(i));
                assertEquals(0.0, o.infectionTime(i));
            }
            inc[i] = o.onsetTime(i) - o.infectionTime(i);
            if (o.outcome(i) == SimulatedOutbreak.DEATH) {
                deaths++;
                dd[nd++] = o.outcomeTime(i) - o.onsetTime(i);
            } else {
                rd[nr++] = o.outcomeTime(i) - o.onsetTime(i);
            }
        }
        assertWithin4Se(5.0, gis, "generation interval mean (exponential, mean 5)");
        assertWithin4Se(incubation().mean(), inc, "incubation mean (lognormal)");
        assertWithin4Se(toDeath.mean(), Arrays.copyOf(dd, nd), "onset to death mean (Weibull)");
        assertWithin4Se(10.0, Arrays.copyOf(rd, nr), "onset to recovery mean (gamma 4, 0.4: 10)");
        // exponential: variance = mean^2, checked through E[X^2] = 50 within 4 SE of X^2
        assertWithin4Se(50.0, Arrays.stream(gis).map(v -> v * v).toArray(), "generation interval E[X^2]");
        assertChiSquare(gi(), gis, "generation interval");
        assertChiSquare(incubation(), inc, "incubation period");
        assertChiSquare(toDeath, Arrays.copyOf(dd, nd), "onset to death");
        assertChiSquare(toRecovery, Arrays.copyOf(rd, nr), "onset to recovery");
        // fatality fraction: binomial proportion within 4 SE
        assertEquals(0.1, (double) deaths / n, 4 * Math.sqrt(0.1 * 0.9 / n), "fatality fraction");
        assertEquals(Double.POSITIVE_INFINITY, o.observationEnd());
        assertEquals(n, Arrays.stream(o.dailyInfections()).sum());
        assertEquals(n, Arrays.stream(o.dailyOnsets()).sum());
        assertEquals(deaths, Arrays.stream(o.dailyDeaths()).sum());
        assertEquals(n - deaths, Arrays.stream(o.dailyRecoveries()).sum());
    }

    /**
     * Stop rules are exact in calendar time: people are processed in order of infection time, so
     * a run stopped earlier (same seed) is exactly the prefix of a run stopped later.
     */
    @Test
    void stopRulesAreExactPrefixes() {
        // 20 index cases: all lines die out with probability q^20 < 1e-4 (q < 0.6 for NB(2, 0.5))
        OutbreakOptions longRun = standard().indexCases(20).maxCases(5000).build();
        SimulatedOutbreak full = OutbreakSimulator.simulate(rng(SEED + 3), longRun);
        assertEquals(StopReason.CASE_LIMIT, full.stopReason());
        double[] inf = full.infectionTimes();
        for (int i = 1; i < inf.length; i++) {
            assertTrue(inf[i - 1] <= inf[i], "ids in infection-time order");
        }
        assertEquals(inf[inf.length - 1], full.observationEnd());
        double day = Math.floor(inf[2500]);
        SimulatedOutbreak byDay = OutbreakSimulator.simulate(rng(SEED + 3), standard().indexCases(20).maxCases(5000).stopDay(day).build());
        assertEquals(StopReason.DAY_LIMIT, byDay.stopReason());
        int expected = (int) Arrays.stream(inf).filter(t -> t < day).count();
        assertEquals(expected, byDay.size());
        assertArrayEquals(Arrays.copyOf(full.onsetTimes(), expected), byDay.onsetTimes());
        assertArrayEquals(Arrays.copyOf(full.infectorIds(), expected), byDay.infectorIds());
        SimulatedOutbreak byCount = OutbreakSimulator.simulate(rng(SEED + 3), standard().indexCases(20).maxCases(1234).build());
        assertArrayEquals(Arrays.copyOf(full.infectionTimes(), 1234), byCount.infectionTimes());
        assertEquals(inf[1233], byCount.observationEnd());
        // daily counts up to the end
        int[] onsets = byDay.dailyOnsets();
        assertEquals((int) Math.ceil(day), onsets.length);
        long observed = Arrays.stream(byDay.onsetTimes()).filter(t -> t <= day).count();
        assertEquals(observed, Arrays.stream(onsets).sum());
        int d = (int) day - 3;
        final double lo = d;
        assertEquals(Arrays.stream(full.onsetTimes()).filter(t -> t >= lo && t < lo + 1).count(), onsets[d],
            "onsets on a complete day equal those of the longer run");
    }

    /**
     * The onset rule stops exactly at the n-th onset: compared with a longer run (same seed),
     * the end is the n-th smallest onset of the long run and the line list is the long run's
     * prefix of people infected up to then.
     */
    @Test
    void onsetRuleStopsAtTheNthOnset() {
        SimulatedOutbreak full = OutbreakSimulator.simulate(rng(SEED + 4), standard().indexCases(20).maxCases(20_000).build());
        assertEquals(StopReason.CASE_LIMIT, full.stopReason());
        int n = 1500;
        SimulatedOutbreak o = OutbreakSimulator.simulate(rng(SEED + 4),
            standard().indexCases(20).maxCases(20_000).maxOnsets(n).build());
        assertEquals(StopReason.ONSET_LIMIT, o.stopReason());
        double[] sorted = full.onsetTimes();
        Arrays.sort(sorted);
        assertTrue(sorted[n - 1] < full.observationEnd(), "long run covers the n-th onset");
        assertEquals(sorted[n - 1], o.observationEnd());
        double end = o.observationEnd();
        int expected = (int) Arrays.stream(full.infectionTimes()).filter(t -> t <= end).count();
        assertEquals(expected, o.size());
        assertArrayEquals(Arrays.copyOf(full.onsetTimes(), expected), o.onsetTimes());
        assertEquals(n, Arrays.stream(o.onsetTimes()).filter(t -> t <= end).count());
        assertEquals(n, Arrays.stream(o.dailyOnsets()).sum());
        assertEquals(expected, o.exposures().orElseThrow().size());
    }

    /**
     * Conditioned generation means vs the branching formula (Athreya and Ney 1972; see
     * OffspringLaw). One index case, generation intervals gamma(400, 400) (mean 1 day,
     * sd 0.05) so that generations are separated in time and generations 0..2 are complete when
     * the 400th infection stops the run (checked). Survival = reaching 400 infections; the chance
     * of extinction after that is q^P with P pending infections (sum of offspring counts minus
     * non-index cases); in a 5000-run check P was at least 116, so q^P < 1e-43 for Poisson(1.5).
     * Z_n is the sum of the offspring counts of generation n - 1.
     */
    @Test
    void conditionedGenerationMeansMatchFormula() {
        checkConditionedMeans(OffspringLaw.poisson(1.5), 3000, SEED + 11);
    }

    /**
     * Larger run, strong superspreading: NB(R = 2, k = 0.25), q = 0.7707 (mpmath 1.3 root; about 4.4 draws per
     * accepted outbreak); survival = 400 infections; in a 5000-run check at least 155 infections
     * were pending then, so the chance of later extinction is below q^155 < 3e-18.
     */
    @Test
    @Tag("validation")
    void conditionedGenerationMeansMatchFormulaSuperspreading() {
        checkConditionedMeans(OffspringLaw.negativeBinomial(2, 0.25), 40_000, SEED + 12);
    }

    private static void checkConditionedMeans(OffspringLaw law, int runs, long seed) {
        OutbreakOptions opts = OutbreakOptions.builder(law, GammaDelay.ofShapeRate(400, 400), incubation())
            .maxCases(400).conditionOnSurvival(1000).build();
        UniformRandomProvider r = rng(seed);
        double[][] z = new double[3][runs];
        long attempts = 0;
        for (int k = 0; k < runs; k++) {
            SimulatedOutbreak o = OutbreakSimulator.simulate(r, opts);
            attempts += o.attempts();
            assertEquals(StopReason.CASE_LIMIT, o.stopReason());
            int[] genCount = new int[4];
            long[] genOffspring = new long[4];
            for (int i = 0; i < o.size(); i++) {
                int g = o.generation(i);
                if (g <= 3) {
                    genCount[g]++;
                    genOffspring[g] += o.offspringCount(i);
                }
            }
            for (int g = 1; g <= 2; g++) {
                assertEquals(genOffspring[g - 1], genCount[g], "generation " + g + " complete");
            }
            for (int g = 1; g <= 3; g++) {
                z[g - 1][k] = genOffspring[g - 1];
            }
        }
        for (int g = 1; g <= 3; g++) {
            assertWithin4Se(law.conditionedMeanGenerationSize(g), z[g - 1], "conditioned Z_" + g);
            double mean = Arrays.stream(z[g - 1]).average().orElseThrow();
            assertTrue(mean > law.meanGenerationSize(g), "conditioned above unconditioned");
        }
        // acceptance rate ~ 1 - q = 0.583: attempts per accepted run within 4 SE of 1/(1 - q)
        double perRun = (double) attempts / runs;
        double u = law.survivalProbability();
        assertEquals(1 / u, perRun, 4 * Math.sqrt((1 - u) / (u * u) / runs), "attempts per accepted outbreak");
    }

    @Test
    void conditioningCapIsReported() {
        OutbreakOptions sub = OutbreakOptions.builder(OffspringLaw.poisson(0.5), gi(), incubation())
            .maxCases(100).conditionOnSurvival(20).build();
        EstimationException e = assertThrows(EstimationException.class, () -> OutbreakSimulator.simulate(rng(SEED), sub));
        assertTrue(e.getMessage().contains("20 attempts"), e.getMessage());
    }

    static Stream<ExposureModel> exposureModels() {
        return Stream.of(ExposureModel.open(0.3, 2.0),
            ExposureModel.open(0.5, 1.0).withCategories(new double[] {1, 2}, new double[] {0.8, 0.2}),
            ExposureModel.complete(0.2, 5, 1.5), ExposureModel.knownTotal(0.25, 8, 10),
            ExposureModel.knownPoissonTotal(0.2, 6, 10));
    }

    @ParameterizedTest
    @MethodSource("exposureModels")
    void exposuresAreRecordedForEveryCase(ExposureModel model) {
        SimulatedOutbreak o = OutbreakSimulator.simulate(rng(SEED + 5),
            standard().exposures(model).conditionOnSurvival(100).build());
        ExposureRecords x = o.exposures().orElseThrow();
        assertEquals(o.size(), x.size());
        for (int i = 0; i < o.size(); i++) {
            assertEquals(o.infectionTime(i), x.infectionTime(i));
            assertEquals(o.onsetTime(i), x.onset(i));
            assertEquals(o.infectionTime(i), x.candidateTime(i, x.infectingCandidate(i)));
        }
        ExposureSamplerTest.checkStructure(x);
        assertEquals(model.recording(), x.recording());
    }

    @Test
    void rejectsBadOptions() {
        OffspringLaw law = OffspringLaw.poisson(2);
        assertThrows(IllegalArgumentException.class, () -> OutbreakOptions.builder(law, gi(), incubation()).maxCases(0).build());
        assertThrows(IllegalArgumentException.class, () -> OutbreakOptions.builder(law, gi(), incubation()).stopDay(0).build());
        assertThrows(IllegalArgumentException.class, () -> OutbreakOptions.builder(law, gi(), incubation()).maxOnsets(0).build());
        assertThrows(IllegalArgumentException.class, () -> OutbreakOptions.builder(law, gi(), incubation()).indexCases(0).build());
        assertThrows(IllegalArgumentException.class, () -> OutbreakOptions.builder(law, gi(), null).build());
        assertThrows(IllegalArgumentException.class,
            () -> OutbreakOptions.builder(law, gi(), incubation()).outcomes(1.5, gi(), gi()).build());
        SimulatedOutbreak o = OutbreakSimulator.simulate(rng(1L), OutbreakOptions.builder(law, gi(), incubation()).maxCases(5).build());
        assertThrows(IllegalStateException.class, () -> o.outcome(0));
        assertThrows(IndexOutOfBoundsException.class, () -> o.onsetTime(5));
    }
}
