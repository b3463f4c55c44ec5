package org.incipit.core.estimate.delay;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.inference.Estimate;
import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.junit.jupiter.api.Test;

/**
 * Seeded simulation recovery by direct sampling. Bias checks compare the average over
 * replicates with the truth to 4 standard errors of that average (normal approximation,
 * false-alarm rate about 6e-5 per check); "short" checks compare with margins far outside the
 * sampling error. Truths: common practice invented scenario values.
 */
class DelaySimulationTest {

    private static final long SEED = 20261201L;
    private static final DelayOptions OPTIONS = DelayOptions.defaults().withQuantiles(List.of(0.5));

    /** Primary times with density proportional to exp(r s) on [0, t]. */
    static double growthPrimary(UniformRandomProvider rng, double r, double t) {
        return Math.log1p(rng.nextDouble() * Math.expm1(r * t)) / r;
    }

    static DelayPairs truncatedPairs(UniformRandomProvider rng, DelayDistribution f, int n, double cutoff,
                                     boolean daily) {
        DelayPairs.Builder b = DelayPairs.builder(cutoff);
        int i = 0;
        while (b.size() < n) {
            double s = growthPrimary(rng, 0.1, cutoff);
            double q = s + f.sample(rng);
            if (daily) {
                double p = Math.floor(s);
                double qd = Math.floor(q);
                if (qd <= cutoff) {
                    b.addObserved("p" + i++, p, qd, true);
                }
            } else if (q <= cutoff) {
                b.addObserved("p" + i++, s, q);
            }
        }
        return b.build();
    }

    /** Same pairs without the cut-off: the naive fit that ignores truncation. */
    static DelayPairs withoutCutoff(DelayPairs pairs) {
        DelayPairs.Builder b = DelayPairs.builder();
        for (int i = 0; i < pairs.size(); i++) {
            b.addObserved(pairs.id(i), pairs.primary(i), pairs.secondary(i), pairs.isDaily(i));
        }
        return b.build();
    }

    /**
     * Draw from the density proportional to exp(-r x) f(x), r &gt; 0, by rejection from f with
     * acceptance probability exp(-r x) &le; 1 (von Neumann 1951). Written here rather than
     * taken from the tilted distribution's own sampler, which is checked independently.
     */
    static double tiltedSample(UniformRandomProvider rng, DelayDistribution f, double r) {
        while (true) {
            double x = f.sample(rng);
            if (rng.nextDouble() < Math.exp(-r * x)) {
                return x;
            }
        }
    }

    private static void assertUnbiased(double truth, double[] estimates, String what) {
        double m = 0;
        for (double e : estimates) {
            m += e;
        }
        m /= estimates.length;
        double v = 0;
        for (double e : estimates) {
            v += (e - m) * (e - m);
        }
        double se = Math.sqrt(v / (estimates.length - 1) / estimates.length);
        assertEquals(truth, m, 4 * se, what + ": average within 4 standard errors of the truth");
    }

    @Test
    void rightTruncationRecoveredNaiveShort() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        DelayDistribution truth = DelayFamilies.GAMMA.of(2, 0.25); // mean 8
        int reps = 20;
        double[] corrected = new double[reps];
        double[] naive = new double[reps];
        for (int k = 0; k < reps; k++) {
            DelayPairs pairs = truncatedPairs(rng, truth, 300, 40, false);
            corrected[k] = DelayEstimator.rightTruncated(pairs, DelayFamilies.GAMMA, OPTIONS).mean().estimate();
            naive[k] = DelayEstimator.censored(withoutCutoff(pairs), DelayFamilies.GAMMA, OPTIONS).mean().estimate();
        }
        assertUnbiased(8, corrected, "truncation-corrected mean");
        for (double n : naive) {
            assertTrue(n < 0.85 * 8, "naive mean " + n + " is short of 8 (truncation at 40, growth 0.1)");
        }
    }

    @Test
    void dailyTruncationRecovered() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 1);
        DelayDistribution truth = DelayFamilies.LOGNORMAL.of(1.8, 0.5); // mean exp(1.925) = 6.86
        int reps = 15;
        double[] mean = new double[reps];
        double[] naive = new double[reps];
        for (int k = 0; k < reps; k++) {
            DelayPairs pairs = truncatedPairs(rng, truth, 300, 40, true);
            mean[k] = DelayEstimator.rightTruncated(pairs, DelayFamilies.LOGNORMAL, OPTIONS).mean().estimate();
            naive[k] = DelayEstimator.censored(withoutCutoff(pairs), DelayFamilies.LOGNORMAL, OPTIONS).mean()
                    .estimate();
        }
        assertUnbiased(truth.mean(), mean, "day-level truncation-corrected mean");
        for (double n : naive) {
            assertTrue(n < 0.9 * truth.mean(), "naive day-level mean " + n + " is short of " + truth.mean());
        }
    }

    @Test
    void growthWeightedRecoversIntrinsic() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 2);
        DelayDistribution intrinsic = DelayFamilies.WEIBULL.of(2.2, 7);
        double r = 0.12;
        int reps = 15;
        double[] mean = new double[reps];
        for (int k = 0; k < reps; k++) {
            double[] d = new double[300];
            for (int i = 0; i < d.length; i++) {
                d[i] = tiltedSample(rng, intrinsic, r);
            }
            mean[k] = DelayEstimator.growthWeighted(d, DelayFamilies.WEIBULL, r, OPTIONS).mean().estimate();
        }
        assertUnbiased(intrinsic.mean(), mean, "growth-weighted mean");
    }

    @Test
    void backwardTracedIntervalsAndReproductionNumber() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 3);
        double a = 3;
        double b = 0.5;
        double r = 0.15;
        // gamma(a, b) tilted by r is gamma(a, b + r) (docs/methods.md section 3)
        DelayDistribution observed = DelayFamilies.GAMMA.of(a, b + r);
        double[] x = new double[4000];
        for (int i = 0; i < x.length; i++) {
            x[i] = observed.sample(rng);
        }
        Estimate rate = new Estimate(r, r - 0.02, r + 0.02, 0.95, "given");
        BackwardIntervalFit fit = GrowthWeightedEstimator.backwardTraced(x, DelayFamilies.GAMMA, rate, OPTIONS);
        // Euler-Lotka for the gamma: R = (1 + r/b)^a (Wallinga & Lipsitch 2007)
        double rTrue = Math.pow(1 + r / b, a);
        double rNaive = Math.pow(1 + r / (b + r), a);
        assertEquals(a / b, fit.corrected().mean().estimate(), 0.04 * a / b, "corrected mean within 4%");
        assertEquals(a / (b + r), fit.naive().mean().estimate(), 0.04 * a / (b + r), "naive mean within 4%");
        assertEquals(rTrue, fit.correctedReproduction().estimate(), 0.04 * rTrue, "corrected R within 4%");
        assertEquals(rNaive, fit.naiveReproduction().estimate(), 0.04 * rNaive, "naive R within 4%");
        assertTrue(fit.correctedReproduction().contains(rTrue), fit.correctedReproduction().toString());
        // the growth rate's uncertainty widens the interval of R beyond the conditional one
        DelayFit conditional = fit.corrected().conditional();
        Estimate rCond = conditional.fit().delta(t -> 1 / DelayFamilies.GAMMA.of(t).laplaceTransform(r), 0.95);
        assertTrue(fit.correctedReproduction().width() > 1.5 * rCond.width(),
                "R interval with r's uncertainty " + fit.correctedReproduction() + " vs conditional " + rCond);
    }

    @Test
    void incubationVariants() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 4);
        DelayDistribution incubation = DelayFamilies.LOGNORMAL.of(1.6, 0.45);
        double r = 0.3;
        int reps = 10;
        double[] uniformOnUniform = new double[reps];
        double[] growingOnGrowing = new double[reps];
        for (int k = 0; k < reps; k++) {
            ExposureWindows.Builder u = ExposureWindows.builder();
            ExposureWindows.Builder g = ExposureWindows.builder();
            for (int i = 0; i < 300; i++) {
                double a = Math.floor(30 * rng.nextDouble());
                double w = i % 10 == 0 ? 0 : 1 + Math.floor(6 * rng.nextDouble());
                double eu = a + w * rng.nextDouble();
                // exposure density proportional to exp(r e) on [a, a + w]: inverse cdf
                double eg = a + (w == 0 ? 0 : Math.log1p(rng.nextDouble() * Math.expm1(r * w)) / r);
                // a window reaching past the onset is cut at the onset (the observation type
                // requires it); the cut changes the likelihood only by a factor free of the
                // parameters, so the estimates are unaffected
                double ou = eu + incubation.sample(rng);
                double og = eg + incubation.sample(rng);
                u.add("u" + i, a, Math.min(a + w, ou), ou);
                g.add("g" + i, a, Math.min(a + w, og), og);
            }
            ExposureWindows uw = u.build();
            ExposureWindows gw = g.build();
            DelayFit uni = IncubationEstimator.fit(uw, DelayFamilies.LOGNORMAL, ExposureWindowModel.uniform(), OPTIONS);
            DelayFit cens = IncubationEstimator.fit(uw, DelayFamilies.LOGNORMAL, ExposureWindowModel.intervalCensored(),
                    OPTIONS);
            // identity: the uniform-exposure likelihood is the interval-censored one minus sum log(b - a)
            assertEquals(cens.mean().estimate(), uni.mean().estimate(), 1e-6 * uni.mean().estimate(),
                    "uniform and interval-censored estimates coincide");
            uniformOnUniform[k] = uni.mean().estimate();
            growingOnGrowing[k] = IncubationEstimator.fit(gw, DelayFamilies.LOGNORMAL, ExposureWindowModel.growing(r),
                    OPTIONS).mean().estimate();
        }
        assertUnbiased(incubation.mean(), uniformOnUniform, "uniform exposure model on uniform exposures");
        assertUnbiased(incubation.mean(), growingOnGrowing, "growing exposure model on growing exposures");
    }

    @Test
    void familiesCompared() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 5);
        DelayPairs pairs = truncatedPairs(rng, DelayFamilies.LOGNORMAL.of(1.5, 0.8), 2000, 40, false);
        List<DelayFit> fits = DelayFamilies.all().stream()
                .map(f -> DelayEstimator.rightTruncated(pairs, f, OPTIONS)).toList();
        var cmp = DelayEstimator.compare(fits);
        assertEquals("lognormal", cmp.best().name(), "lognormal data: lognormal has the smallest AIC");
        double sum = cmp.ranked().stream().mapToDouble(x -> x.weight()).sum();
        assertEquals(1, sum, 1e-12, "Akaike weights sum to 1");
    }

    static DelayFamily gamma() {
        return DelayFamilies.GAMMA;
    }
}
