package org.incipit.core.simulate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.LogNormalDelay;
import org.junit.jupiter.api.Test;

/**
 * Exposure regimes against their model predictions (derivations in ExposureModel's Javadoc and
 * docs/methods.md section 2). Means within 4 standard errors: two-sided false alarm 6.3e-5 per
 * check (normal approximation, common practice), about 1e-3 for the class.
 */
class ExposureSamplerTest {

    private static final long SEED = 20261202L;
    private static final int N = 40_000;

    private static UniformRandomProvider rng(long s) {
        return RandomSource.XO_RO_SHI_RO_128_PP.create(s);
    }

    private static final DelayDistribution H = LogNormalDelay.ofMeanLogSdLog(1.6, 0.4);
    /** Incubation bounded below by 3 days, so a 2-day complete history wholly precedes onset. */
    private static final DelayDistribution BOUNDED = TestDelays.uniform(3, 8);

    private static void assertMean(double expected, double sum, double sumSq, int n, String what) {
        double mean = sum / n;
        double var = (sumSq - n * mean * mean) / (n - 1);
        assertEquals(expected, mean, 4 * Math.sqrt(var / n), what);
    }

    /** Structural facts that hold in every regime. */
    static void checkStructure(ExposureRecords x) {
        for (int i = 0; i < x.size(); i++) {
            int m = x.candidateCount(i);
            assertTrue(m >= 1);
            int j = x.infectingCandidate(i);
            assertTrue(j >= 0 && j < m);
            assertEquals(x.infectionTime(i), x.candidateTime(i, j), "true infection among candidates");
            assertTrue(x.candidateTime(i, 0) <= x.infectionTime(i), "first candidate precedes infection");
            assertTrue(x.infectionTime(i) <= x.onset(i), "infection precedes onset");
            for (int k = 1; k < m; k++) {
                assertTrue(x.candidateTime(i, k - 1) <= x.candidateTime(i, k), "time order");
            }
        }
        assertEquals(x.candidateTotal(), x.offsets()[x.size()]);
    }

    // OPEN: E[candidates] = 1/p + lambda E[X] (docs/methods.md section 2: m = J + N(X))
    @Test
    void openStreamHasPredictedCandidateCount() {
        ExposureModel model = ExposureModel.open(0.25, 1.5);
        ExposureRecords x = ExposureSampler.sample(rng(SEED), model, H, N);
        checkStructure(x);
        double s = 0;
        double ss = 0;
        double sj = 0;
        double ssj = 0;
        for (int i = 0; i < N; i++) {
            int m = x.candidateCount(i);
            s += m;
            ss += (double) m * m;
            int j = x.infectingCandidate(i) + 1;
            sj += j;
            ssj += (double) j * j;
            assertEquals(-1, x.totalExposures(i));
            assertTrue(x.candidateTime(i, m - 1) < x.onset(i), "all recorded before onset");
        }
        assertMean(1 / 0.25 + 1.5 * H.mean(), s, ss, N, "open: mean candidates");
        assertMean(1 / 0.25, sj, ssj, N, "open: mean index J of the infecting exposure (geometric)");
    }

    // OPEN with categories: the infecting exposure has category c with probability w_c p_c / sum
    @Test
    void openStreamCategories() {
        ExposureModel model = ExposureModel.open(0.5, 1.0).withCategories(new double[] {1, 3}, new double[] {0.6, 0.1});
        ExposureRecords x = ExposureSampler.sample(rng(SEED + 1), model, H, N);
        checkStructure(x);
        int c0 = 0;
        for (int i = 0; i < N; i++) {
            c0 += x.candidateCategory(i, x.infectingCandidate(i)) == 0 ? 1 : 0;
        }
        double p0 = 0.25 * 0.6 / (0.25 * 0.6 + 0.75 * 0.1);
        assertEquals(p0, (double) c0 / N, 4 * Math.sqrt(p0 * (1 - p0) / N), "infecting category share");
        assertEquals(0.225, model.meanInfectionProbability(), 1e-15);
    }

    // COMPLETE: all m recorded; window 2 days < minimum incubation 3 days, so all precede onset;
    // J ~ geometric truncated to 1..m: E[J] = (1/p - (m + 1/p) q^m) / (1 - q^m), q = 1 - p
    // (truncated-geometric mean, derived from sum_j j p q^(j-1) over 1..m)
    @Test
    void completeHistory() {
        double p = 0.2;
        int m = 6;
        ExposureModel model = ExposureModel.complete(p, m, 2.0);
        ExposureRecords x = ExposureSampler.sample(rng(SEED + 2), model, BOUNDED, N);
        checkStructure(x);
        double sj = 0;
        double ssj = 0;
        for (int i = 0; i < N; i++) {
            assertEquals(m, x.candidateCount(i));
            assertEquals(m, x.totalExposures(i));
            assertTrue(x.candidateTime(i, m - 1) < x.onset(i), "all exposures precede onset");
            assertTrue(x.candidateTime(i, m - 1) - x.candidateTime(i, 0) <= 2.0, "within the window");
            int j = x.infectingCandidate(i) + 1;
            sj += j;
            ssj += (double) j * j;
        }
        double q = 1 - p;
        double expected = (1 / p - (m + 1 / p) * Math.pow(q, m)) / (1 - Math.pow(q, m));
        assertMean(expected, sj, ssj, N, "complete: mean J");
    }

    /**
     * COMPLETE with an incubation period that can be shorter than the window: histories reaching
     * onset are redrawn, so every recorded exposure precedes onset and the records are valid
     * ambiguous-start cases; the share of cases infected by the first of M = 2 exposures follows
     * the conditioned law, E_H[F_G(X) / (F_G(X) + 1 - p)] (F_G the law of the gap between the two
     * exposures), from reference/complete_history_conditioning_reference.py (scipy 1.17 quad),
     * within 4 binomial standard errors. Without the conditioning the share would be p / (1 - q^2)
     * (0.625 and 0.769 for the two rows).
     */
    @Test
    void completeHistoryIsConditionedOnPrecedingOnset() throws java.io.IOException {
        java.util.List<String> lines;
        try (java.io.InputStream in = ExposureSamplerTest.class.getResourceAsStream("complete_conditioning.csv")) {
            lines = new String(in.readAllBytes(), java.nio.charset.StandardCharsets.UTF_8).lines()
                    .filter(l -> !l.startsWith("#") && !l.isBlank()).skip(1).toList();
        }
        assertEquals(2, lines.size());
        for (String line : lines) {
            String[] f = line.split(",");
            double p = Double.parseDouble(f[0]);
            double w = Double.parseDouble(f[1]);
            DelayDistribution h = org.incipit.distributions.GammaDelay.ofShapeRate(Double.parseDouble(f[2]),
                    Double.parseDouble(f[3]));
            double expected = Double.parseDouble(f[4]);
            ExposureRecords x = ExposureSampler.sample(rng(SEED + 7), ExposureModel.complete(p, 2, w), h, N);
            checkStructure(x);
            int first = 0;
            for (int i = 0; i < N; i++) {
                assertEquals(2, x.candidateCount(i));
                assertTrue(x.candidateTime(i, 1) < x.onset(i), "every exposure precedes onset");
                first += x.infectingCandidate(i) == 0 ? 1 : 0;
            }
            assertEquals(expected, (double) first / N, 4 * Math.sqrt(expected * (1 - expected) / N),
                    "share infected by the first exposure, " + line);
            // and the records are valid observations
            assertEquals(2 * N, SimulatedData.ambiguousStarts(x, "c").candidateCount());
        }
    }

    // KNOWN TOTAL, Poisson(mu) exposures: among cases E[M] = mu (1 - (1 - p) e^(-mu p)) / (1 - e^(-mu p))
    // (from E[M s^M] = mu s e^(mu (s - 1)) at s = 1 - p)
    @Test
    void knownPoissonTotal() {
        double p = 0.15;
        double mu = 8;
        ExposureModel model = ExposureModel.knownPoissonTotal(p, mu, 10.0);
        ExposureRecords x = ExposureSampler.sample(rng(SEED + 3), model, H, N);
        checkStructure(x);
        double s = 0;
        double ss = 0;
        boolean someAfterOnset = false;
        for (int i = 0; i < N; i++) {
            int total = x.totalExposures(i);
            int m = x.candidateCount(i);
            assertTrue(m <= total, "recorded <= M");
            assertTrue(x.candidateTime(i, m - 1) < x.onset(i), "recorded ones precede onset");
            someAfterOnset |= m < total;
            s += total;
            ss += (double) total * total;
        }
        assertTrue(someAfterOnset, "a 10-day window with a ~5-day incubation leaves some exposures after onset");
        double e = Math.exp(-mu * p);
        assertMean(mu * (1 - (1 - p) * e) / (1 - e), s, ss, N, "known total: mean M among cases");
    }

    @Test
    void knownFixedTotal() {
        ExposureRecords x = ExposureSampler.sample(rng(SEED + 4), ExposureModel.knownTotal(0.3, 5, 12.0), H, 5000);
        checkStructure(x);
        for (int i = 0; i < x.size(); i++) {
            assertEquals(5, x.totalExposures(i));
            assertTrue(x.candidateCount(i) <= 5);
        }
    }

    @Test
    void rejectsBadModels() {
        assertThrows(IllegalArgumentException.class, () -> ExposureModel.open(0, 1));
        assertThrows(IllegalArgumentException.class, () -> ExposureModel.open(0.5, 0));
        assertThrows(IllegalArgumentException.class, () -> ExposureModel.complete(0.5, 0, 1));
        assertThrows(IllegalArgumentException.class, () -> ExposureModel.knownTotal(0.5, 3, -1));
        assertThrows(IllegalArgumentException.class,
            () -> ExposureModel.open(0.5, 1).withCategories(new double[] {1}, new double[] {0.1, 0.2}));
        assertThrows(IllegalArgumentException.class,
            () -> ExposureModel.open(0.5, 1).withCategories(new double[] {1, 1}, new double[] {0, 0}));
        assertThrows(IllegalArgumentException.class, () -> ExposureSampler.sample(rng(1), ExposureModel.open(0.5, 1), H, 0));
    }
}
