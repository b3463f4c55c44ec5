package org.incipit.core.growth;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.PoissonSampler;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.inference.Estimate;
import org.incipit.distributions.DailyMasses;
import org.junit.jupiter.api.Test;

/**
 * Renewal-equation estimators against direct closed-form computation in scipy 1.17.1
 * (reference/renewal_reference.py; CSV headers name the tool and calls).
 */
class RenewalEstimatorTest {

    private static final long SEED = 20261201L;

    static List<String[]> csv(String name) {
        return GrowthRateEstimatorTest.csv(name);
    }

    static long[] column(List<String[]> rows, int c) {
        return rows.stream().mapToLong(r -> Long.parseLong(r[c])).toArray();
    }

    static InfectivityProfile weights() {
        return new InfectivityProfile(csv("renewal_weights.csv").stream()
                .mapToDouble(r -> Double.parseDouble(r[1])).toArray());
    }

    static void assertRel(double expected, double actual, double tol, String what) {
        assertEquals(expected, actual, tol * Math.abs(expected), what);
    }

    @Test
    void totalInfectivenessMatchesDirectSum() {
        List<String[]> d = csv("renewal_data.csv");
        double[] lam = RenewalEstimator.totalInfectiousness(column(d, 1), column(d, 2), weights());
        for (int t = 0; t < d.size(); t++) {
            double expected = Double.parseDouble(d.get(t)[3]);
            assertEquals(expected, lam[t], 1e-13 * Math.max(1, expected), "Lambda_" + t);
        }
    }

    // Cori et al. 2013 posterior, scipy gamma mean/std/ppf; quantiles by commons-statistics
    // inversion: 1e-10 relative (both sides invert the regularised incomplete gamma).
    @Test
    void coriPosteriorMatchesScipy() {
        List<String[]> d = csv("renewal_data.csv");
        List<String[]> ref = csv("renewal_windows.csv");
        List<WindowReproduction> win = RenewalEstimator.slidingWindows(column(d, 1), column(d, 2),
                weights(), 7, GammaPrior.vague(), 0.95);
        assertEquals(ref.size(), win.size());
        for (int i = 0; i < ref.size(); i++) {
            String[] r = ref.get(i);
            WindowReproduction w = win.get(i);
            assertEquals(Integer.parseInt(r[0]), w.firstDay());
            assertEquals(Integer.parseInt(r[1]), w.lastDay());
            assertRel(Double.parseDouble(r[2]), w.posterior().shape(), 1e-15, "shape");
            assertRel(Double.parseDouble(r[3]), w.posterior().scale(), 1e-13, "scale");
            assertRel(Double.parseDouble(r[4]), w.reproductionNumber().estimate(), 1e-13, "mean");
            assertRel(Double.parseDouble(r[5]), w.sd(), 1e-13, "sd");
            assertRel(Double.parseDouble(r[6]), w.reproductionNumber().lower(), 1e-10, "q025");
            assertRel(Double.parseDouble(r[7]), w.median(), 1e-10, "median");
            assertRel(Double.parseDouble(r[8]), w.reproductionNumber().upper(), 1e-10, "q975");
        }
    }

    @Test
    void importedCasesAreInfectorsOnly() {
        long[] local = {0, 2, 3, 4};
        long[] imported = {5, 0, 0, 0};
        InfectivityProfile w = new InfectivityProfile(new double[] {0, 0.5, 0.5});
        List<WindowReproduction> win = RenewalEstimator.slidingWindows(local, imported, w, 3,
                new GammaPrior(1, 5), 0.95);
        // Lambda = [0, 2.5, 3.5, 2.5] -> sum over days 1..3 = 8.5, local cases 9
        assertEquals(9, win.get(0).localCases());
        assertEquals(8.5, win.get(0).totalInfectiousness(), 1e-15);
        assertEquals(10, win.get(0).posterior().shape(), 0.0);
        assertEquals(1 / (0.2 + 8.5), win.get(0).posterior().scale(), 1e-16);
    }

    @Test
    void constantRMatchesScipyProfile() {
        List<String[]> d = csv("renewal_data.csv");
        String[] r = csv("renewal_constant.csv").get(0);
        Estimate e = RenewalEstimator.constantReproductionNumber(column(d, 1), column(d, 2),
                weights(), Integer.parseInt(r[0]), Integer.parseInt(r[1]), 0.95);
        assertRel(Double.parseDouble(r[2]), e.estimate(), 1e-14, "R hat");
        assertRel(Double.parseDouble(r[3]), e.lower(), 1e-12, "lower");
        assertRel(Double.parseDouble(r[4]), e.upper(), 1e-12, "upper");
    }

    @Test
    void projectionMatchesScipy() {
        List<String[]> d = csv("renewal_data.csv");
        List<String[]> ref = csv("renewal_projection.csv");
        double[] p = RenewalEstimator.project(column(d, 1), column(d, 2), weights(), 1.3, 10);
        for (int k = 0; k < ref.size(); k++) {
            assertRel(Double.parseDouble(ref.get(k)[1]), p[k], 1e-13, "day " + ref.get(k)[0]);
        }
    }

    // Worked example: w = (0, 1/2, 1/2), R = 2, one case on day 0 -> i_t = i_{t-1} + i_{t-2}, the
    // Fibonacci numbers (common practice).
    @Test
    void projectionFibonacci() {
        InfectivityProfile w = new InfectivityProfile(new double[] {0, 0.5, 0.5});
        double[] p = RenewalEstimator.project(new long[] {1, 1}, null, w, 2, 8);
        assertArrayEquals(new double[] {2, 3, 5, 8, 13, 21, 34, 55}, p, 0.0);
    }

    // Asymptotic growth of the projection is e^r with r the discrete Euler-Lotka root
    // (R sum_s w_s e^{-rs} = 1; Wallinga & Lipsitch 2007). Ratio after 400 days: the subdominant
    // roots have decayed by > 1e-12.
    @Test
    void projectionGrowsAtEulerLotkaRate() {
        InfectivityProfile w = weights();
        double r = EulerLotka.growthRate(w.weights(), 1.4);
        double[] p = RenewalEstimator.project(new long[] {10, 5, 3}, null, w, 1.4, 400);
        assertEquals(Math.exp(r), p[399] / p[398], 1e-10);
    }

    // R0 recovery: 200 seeded renewal epidemics, R = 1.8, days 1..34 fitted. 95% profile
    // intervals: count covering the truth; accept 180..199 (binomial(200, 0.95): P(X < 180) ~ 1e-3,
    // P(X = 200) ~ 3.5e-5).
    @Test
    void recoversR0OnSimulatedRenewalData() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        InfectivityProfile w = weights();
        double truth = 1.8;
        int covered = 0;
        double meanEst = 0;
        for (int rep = 0; rep < 200; rep++) {
            long[] local = new long[35];
            long[] imported = new long[35];
            imported[0] = 5;
            for (int t = 1; t < 35; t++) {
                double lam = RenewalEstimator.totalInfectiousness(java.util.Arrays.copyOf(local, t + 1),
                        java.util.Arrays.copyOf(imported, t + 1), w)[t];
                local[t] = lam > 0 ? PoissonSampler.of(rng, truth * lam).sample() : 0;
            }
            Estimate e = RenewalEstimator.constantReproductionNumber(local, imported, w, 1, 34, 0.95);
            if (e.contains(truth)) {
                covered++;
            }
            meanEst += e.estimate() / 200;
        }
        assertTrue(covered >= 180 && covered <= 199, "coverage " + covered + "/200");
        assertEquals(truth, meanEst, 0.05, "mean of 200 estimates");
    }

    @Test
    void dailyCountsOverloadsSplitImportedFromLocal() {
        List<String[]> d = csv("renewal_data.csv");
        long[] local = column(d, 1);
        long[] imported = column(d, 2);
        org.incipit.core.observe.DailyCounts.Builder b = org.incipit.core.observe.DailyCounts
                .builder().withImported();
        for (int t = 0; t < local.length; t++) {
            // day numbers start at 100; DailyCounts counts imported cases among the day's cases
            b.add(100 + t, (int) (local[t] + imported[t]), org.incipit.core.observe.DailyCounts.ABSENT,
                    org.incipit.core.observe.DailyCounts.ABSENT, (int) imported[t]);
        }
        org.incipit.core.observe.DailyCounts counts = b.build();
        List<WindowReproduction> byArrays = RenewalEstimator.slidingWindows(local, imported,
                weights(), 7, GammaPrior.vague(), 0.95);
        List<WindowReproduction> byCounts = RenewalEstimator.slidingWindows(counts, weights(), 7,
                GammaPrior.vague(), 0.95);
        assertEquals(byArrays.size(), byCounts.size());
        for (int i = 0; i < byArrays.size(); i++) {
            assertEquals(byArrays.get(i).firstDay() + 100, byCounts.get(i).firstDay());
            assertEquals(byArrays.get(i).posterior(), byCounts.get(i).posterior());
        }
        assertEquals(RenewalEstimator.constantReproductionNumber(local, imported, weights(), 1, 20,
                0.95), RenewalEstimator.constantReproductionNumber(counts, weights(), 101, 120, 0.95));
    }

    @Test
    void zeroCasesGiveZeroLowerLimit() {
        InfectivityProfile w = new InfectivityProfile(new double[] {0, 1});
        Estimate e = RenewalEstimator.constantReproductionNumber(new long[] {4, 0, 0}, null, w, 1, 2,
                0.95);
        assertEquals(0, e.estimate());
        assertEquals(0, e.lower());
        // 2 R Lambda = chi2_{1,0.95}, Lambda = 4
        assertEquals(1.959963984540054 * 1.959963984540054 / 8, e.upper(), 1e-14);
    }

    @Test
    void profileConventionsAndErrors() {
        assertThrows(IllegalArgumentException.class,
                () -> new InfectivityProfile(new double[] {0.1, 0.9}));
        InfectivityProfile fromMasses = InfectivityProfile.fromMasses(
                new DailyMasses(new double[] {0.2, 0.4, 0.4}, 0));
        assertArrayEquals(new double[] {0, 0.5, 0.5}, fromMasses.weights(), 1e-16);
        assertThrows(IllegalArgumentException.class, () -> RenewalEstimator
                .constantReproductionNumber(new long[] {0, 0, 2}, null, fromMasses, 1, 2, 0.95));
        assertThrows(IllegalArgumentException.class, () -> RenewalEstimator
                .slidingWindows(new long[] {1, 3, 2}, new long[] {1}, fromMasses, 1,
                        GammaPrior.vague(), 0.95));
    }
}
