package org.incipit.core.estimate.fatality;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.PoissonSampler;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.estimate.delay.DelayEstimator;
import org.incipit.core.estimate.delay.DelayFit;
import org.incipit.core.estimate.delay.DelayOptions;
import org.incipit.core.inference.Estimate;
import org.incipit.core.observe.CensoredDelays;
import org.incipit.core.observe.DailyCounts;
import org.incipit.distributions.DailyMasses;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.Discretisation;
import org.junit.jupiter.api.Test;

/**
 * Fatality-ratio estimators: the day convention against the distribution layer and against the
 * continuous-time limit (scipy quad reference, reference/fatality_reference.py), the growth
 * limit of the resolved-only ratio (docs/methods.md section 5, checked by brute-force sums),
 * and seeded simulation recovery. Bias checks: average of replicates within 4 standard errors
 * of the truth (about 6e-5 false alarms per check, normal approximation).
 */
class FatalityEstimatorTest {

    private static final long SEED = 20261204L;
    private static final DelayDistribution TO_DEATH = DelayFamilies.GAMMA.of(3, 0.25);    // mean 12
    private static final DelayDistribution TO_RECOVERY = DelayFamilies.GAMMA.of(2, 0.4);  // mean 5

    @Test
    void conventionIsDayIntervalDiscretisation() {
        // sum_{d <= K} [F(d + 1) - F(d)] = F(K + 1): the DAY_INTERVAL masses of the distribution layer
        DailyMasses m = TO_DEATH.discretise(60, Discretisation.DAY_INTERVAL);
        for (int K = 0; K <= 40; K++) {
            double s = 0;
            for (int d = 0; d <= K; d++) {
                s += m.mass(d);
            }
            assertEquals(TO_DEATH.cdf(K + 1), s, 1e-13, "cumulative DAY_INTERVAL mass to day " + K);
        }
        // a case on the last day (t = T) counts with F(1), one on day 0 with F(T + 1)
        DailyCounts c = DailyCounts.builder().withDeaths().add(0, 1, 0, -1, -1).add(1, 0, 0, -1, -1)
                .add(2, 2, 0, -1, -1).build();
        assertEquals(TO_DEATH.cdf(3) + 2 * TO_DEATH.cdf(1), FatalityEstimator.expectedResolved(c, TO_DEATH), 1e-15);
    }

    /** Cases exp(r t) per unit time on [0, T] grouped in steps of width h; outcome by T. */
    static double stepSum(double r, double t, DelayDistribution f, double h, boolean plusOne) {
        int n = (int) Math.round(t / h);
        double s = 0;
        for (int j = 0; j < n; j++) {
            // cases in step j = integral of exp(r u) over [j h, (j + 1) h]
            double c = (Math.exp(r * (j + 1) * h) - Math.exp(r * j * h)) / r;
            s += c * f.cdf((n - j - (plusOne ? 0 : 1)) * h);
        }
        return s;
    }

    @Test
    void conventionConvergesToContinuousTime() throws IOException {
        for (String[] row : rows("/org/incipit/core/estimate/fatality/continuous.csv")) {
            double r = Double.parseDouble(row[0]);
            double t = Double.parseDouble(row[1]);
            DelayDistribution f = DelayFamilies.GAMMA.of(Double.parseDouble(row[2]), Double.parseDouble(row[3]));
            double exact = Double.parseDouble(row[4]);
            double previous = Double.POSITIVE_INFINITY;
            for (int k = 0; k <= 10; k++) {
                double h = Math.pow(0.5, k);
                double plus = stepSum(r, t, f, h, true);   // F(T - t + 1): the library's convention
                double minus = stepSum(r, t, f, h, false); // F(T - t)
                assertTrue(minus <= exact && exact <= plus, "the two conventions bracket the continuous value");
                double err = plus - exact;
                assertTrue(err < previous, "error decreases as the step shrinks");
                if (k > 2) {
                    // first-order convergence: halving the step about halves the error
                    assertEquals(0.5, err / previous, 0.05, "error ratio at step " + h);
                }
                previous = err;
            }
            assertTrue(previous / exact < 2e-3, "within 2e-3 relative at step 1/1024");
        }
        // at step 1 the library's sum is the h = 1 step sum
        DailyCounts.Builder b = DailyCounts.builder().withDeaths();
        for (int d = 0; d < 30; d++) {
            b.add(d, 1, 0, -1, -1);
        }
        double lib = FatalityEstimator.expectedResolved(b.build(), TO_DEATH);
        double s = 0;
        for (int d = 0; d < 30; d++) {
            s += TO_DEATH.cdf(30 - d);
        }
        assertEquals(s, lib, 1e-12 * s);
    }

    private static List<String[]> rows(String resource) throws IOException {
        List<String[]> out = new ArrayList<>();
        try (BufferedReader in = new BufferedReader(new InputStreamReader(
                FatalityEstimatorTest.class.getResourceAsStream(resource), StandardCharsets.UTF_8))) {
            String line;
            boolean header = true;
            while ((line = in.readLine()) != null) {
                if (line.startsWith("#")) {
                    continue;
                }
                if (header) {
                    header = false;
                    continue;
                }
                out.add(line.split(","));
            }
        }
        return out;
    }

    @Test
    void doubleCensoredConventionIsTheIntegralOverTheOnsetDay() {
        // sum_t c_t int_0^1 F(T - t + 1 - u) du by composite Simpson with 2000 panels (common practice)
        DailyCounts.Builder b = DailyCounts.builder().withDeaths();
        int[] c = {3, 0, 5, 8, 2, 9, 12, 4};
        for (int t = 0; t < c.length; t++) {
            b.add(t, c[t], 0, -1, -1);
        }
        int last = c.length - 1;
        double expected = 0;
        int m = 2000;
        for (int t = 0; t < c.length; t++) {
            double s = 0;
            for (int j = 0; j <= m; j++) {
                double u = (double) j / m;
                double w = j == 0 || j == m ? 1 : (j % 2 == 1 ? 4 : 2);
                s += w * TO_DEATH.cdf(last - t + 1 - u);
            }
            expected += c[t] * s / (3.0 * m);
        }
        double got = FatalityEstimator.expectedResolved(b.build(), TO_DEATH, Discretisation.DOUBLE_CENSORED);
        assertEquals(expected, got, 1e-9 * expected);
        double plus = FatalityEstimator.expectedResolved(b.build(), TO_DEATH);
        assertTrue(got < plus, "the whole-day convention counts more expected deaths");
    }

    @Test
    void resolvedOnlyGrowthLimitMatchesBruteForce() {
        // long growth, fine steps: D/(D+Rec) -> p M_f(-r) / (p M_f(-r) + (1 - p) M_h(-r))
        double r = 0.1;
        double p = 0.2;
        double h = 1.0 / 64;
        double t = 250;
        double d = p * stepSum(r, t, TO_DEATH, h, true);
        double rec = (1 - p) * stepSum(r, t, TO_RECOVERY, h, true);
        double limit = FatalityEstimator.resolvedOnlyGrowthLimit(p, TO_DEATH, TO_RECOVERY, r);
        assertEquals(d / (d + rec), limit, 0.01 * limit, "within 1% (step 1/64 is first order)");
        // gamma closed forms M(-r) = (b / (b + r))^a
        double mf = Math.pow(0.25 / 0.35, 3);
        double mh = Math.pow(0.4 / 0.5, 2);
        assertEquals(p * mf / (p * mf + (1 - p) * mh), limit, 1e-12);
        assertEquals(p, FatalityEstimator.resolvedOnlyGrowthLimit(p, TO_DEATH, TO_DEATH, r), 1e-15,
                "equal delays: no bias");
    }

    /** Cases Poisson(5 exp(r t)); each dies with probability p after floor(X) whole days, else recovers. */
    static DailyCounts simulate(UniformRandomProvider rng, double p, double r, int days, DelayDistribution toDeath,
                                DelayDistribution toRecovery) {
        int[] cases = new int[days];
        int[] deaths = new int[days];
        int[] recs = new int[days];
        for (int t = 0; t < days; t++) {
            cases[t] = PoissonSampler.of(rng, 5 * Math.exp(r * t)).sample();
            for (int i = 0; i < cases[t]; i++) {
                boolean dies = rng.nextDouble() < p;
                int day = t + (int) Math.floor((dies ? toDeath : toRecovery).sample(rng));
                if (day < days) {
                    if (dies) {
                        deaths[day]++;
                    } else {
                        recs[day]++;
                    }
                }
            }
        }
        DailyCounts.Builder b = DailyCounts.builder().withDeaths().withRecoveries();
        for (int t = 0; t < days; t++) {
            b.add(t, cases[t], deaths[t], recs[t], DailyCounts.ABSENT);
        }
        return b.build();
    }

    private static void assertUnbiased(double truth, double[] x, String what) {
        double m = 0;
        for (double v : x) {
            m += v;
        }
        m /= x.length;
        double v = 0;
        for (double e : x) {
            v += (e - m) * (e - m);
        }
        double se = Math.sqrt(v / (x.length - 1) / x.length);
        assertEquals(truth, m, 4 * se, what + ": average within 4 standard errors");
    }

    @Test
    void adjustedRecoversCrudeLowResolvedOnlyBiased() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        double p = 0.2;
        double r = 0.1;
        int reps = 40;
        double[] window = new double[reps];
        double[] joint = new double[reps];
        double[] crude = new double[reps];
        double[] resolved = new double[reps];
        double[] jointEqual = new double[reps];
        double[] resolvedEqual = new double[reps];
        for (int k = 0; k < reps; k++) {
            DailyCounts c = simulate(rng, p, r, 40, TO_DEATH, TO_RECOVERY);
            FatalitySummary s = FatalityEstimator.summary(c, TO_DEATH, TO_RECOVERY, 0.95);
            window[k] = s.windowAdjusted().estimate();
            joint[k] = s.resolvedAdjusted().estimate();
            crude[k] = s.crude().estimate();
            resolved[k] = s.resolvedOnly().estimate();
            DailyCounts e = simulate(rng, p, r, 40, TO_DEATH, TO_DEATH);
            jointEqual[k] = FatalityEstimator.resolvedAdjusted(e, TO_DEATH, TO_DEATH, 0.95).estimate();
            resolvedEqual[k] = FatalityEstimator.resolvedOnly(e, 0.95).estimate();
        }
        assertUnbiased(p, window, "window-adjusted");
        assertUnbiased(p, joint, "resolved-adjusted (different delays)");
        assertUnbiased(p, jointEqual, "resolved-adjusted (equal delays)");
        assertUnbiased(p, resolvedEqual, "resolved-only with equal delays: no bias");
        for (int k = 0; k < reps; k++) {
            assertTrue(crude[k] < 0.6 * p, "crude " + crude[k] + " far below p");
            assertTrue(resolved[k] < 0.75 * p, "resolved-only " + resolved[k] + " below p when death is slower");
        }
    }

    @Test
    void windowAdjustedCoverage() {
        // 200 sets, accept 180..199 (Binomial(200, 0.95): P(X <= 179) ~ 0.0009, P(X = 200) ~ 3.5e-5).
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 1);
        int hits = 0;
        for (int k = 0; k < 200; k++) {
            DailyCounts c = simulate(rng, 0.2, 0.1, 40, TO_DEATH, TO_RECOVERY);
            if (FatalityEstimator.windowAdjusted(c, TO_DEATH, 0.95).contains(0.2)) {
                hits++;
            }
        }
        assertTrue(hits >= 180 && hits <= 199, "window-adjusted 95% intervals containing p: " + hits);
    }

    @Test
    void delayUncertaintyWidensInterval() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 2);
        DailyCounts c = simulate(rng, 0.2, 0.1, 40, TO_DEATH, TO_RECOVERY);
        CensoredDelays.Builder b = CensoredDelays.builder();
        for (int i = 0; i < 60; i++) {
            b.addExact("d" + i, TO_DEATH.sample(rng));
        }
        DelayFit fit = DelayEstimator.intervalCensored(b.build(), DelayFamilies.GAMMA, DelayOptions.defaults());
        Estimate plain = FatalityEstimator.windowAdjusted(c, fit.distribution(), 0.95);
        Estimate mc = FatalityEstimator.windowAdjusted(RandomSource.XO_RO_SHI_RO_128_PP.create(7), c, fit, 2000, 0.95);
        assertEquals(plain.estimate(), mc.estimate(), 1e-12, "same point estimate");
        assertTrue(mc.width() > plain.width(), "delay uncertainty widens: " + mc + " vs " + plain);
        Estimate again = FatalityEstimator.windowAdjusted(RandomSource.XO_RO_SHI_RO_128_PP.create(7), c, fit, 2000, 0.95);
        assertEquals(mc, again, "same seed, same interval");
    }

    @Test
    void growthAsymptoticAndErrors() {
        // crude 10/100 = 0.1 under r = 0.1 with gamma(3, 0.25): p = 0.1 / (0.25/0.35)^3
        DailyCounts.Builder b = DailyCounts.builder().withDeaths();
        b.add(0, 100, 10, -1, -1);
        Estimate g = FatalityEstimator.growthAsymptotic(b.build(), TO_DEATH, 0.1, 0.95);
        assertEquals(0.1 / Math.pow(0.25 / 0.35, 3), g.estimate(), 1e-12);
        DailyCounts none = DailyCounts.builder().add(0, 3).build();
        assertThrows(IllegalArgumentException.class, () -> FatalityEstimator.crude(none, 0.95));
        assertThrows(IllegalArgumentException.class, () -> FatalityEstimator.crude(b.build(), 1.5));
    }

    @Test
    void binomialIntervalMatchesLikelihoodRatioDefinition() {
        // 7 deaths of 50 cases: the bounds solve 2[l(7/50) - l(p)] = chi2_1(0.95) = 3.841458820694124
        // (chi-square quantile from memory, checked against commons-statistics in the engine tests)
        DailyCounts c = DailyCounts.builder().withDeaths().add(0, 50, 7, -1, -1).build();
        Estimate e = FatalityEstimator.crude(c, 0.95);
        double pHat = 0.14;
        for (double p : new double[] {e.lower(), e.upper()}) {
            double dev = 2 * (7 * Math.log(pHat / p) + 43 * Math.log((1 - pHat) / (1 - p)));
            assertEquals(3.841458820694124, dev, 1e-9);
        }
    }
}
