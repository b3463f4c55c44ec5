package org.incipit.core.estimate.ambiguous;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.stream.Stream;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Consistency on simulated open-stream data with known H and p (seeded, bounded): ML approaches
 * the truth as n grows; under a wrong family the moment and EM estimators still recover mean
 * and sd; the naive rules are biased in the expected direction.
 */
class ConsistencyTest {

    private static final long SEED = 20261203L;

    /** Families and true parameters: (family, p1, p2, p). */
    static Stream<Arguments> truths() {
        return Stream.of(Arguments.of(Family.GAMMA, 3.0, 0.6, 0.3), Arguments.of(Family.WEIBULL, 2.0, 5.5, 0.4),
                Arguments.of(Family.LOGNORMAL, 1.5, 0.5, 0.25));
    }

    static Sim.Delay sampler(Family f, double a, double b) {
        return f == Family.GAMMA ? Sim.gamma(a, b) : f == Family.WEIBULL ? Sim.weibull(a, b) : Sim.lognormal(a, b);
    }

    /**
     * The error in the mean shrinks with n: at n = 4000 within 4 delta-method se of the truth,
     * and the se itself is about half of that at n = 1000 (1/sqrt(n): ratio 0.5; accept 0.4-0.6).
     */
    @ParameterizedTest(name = "{0}")
    @MethodSource("truths")
    void maximumLikelihoodApproachesTruth(Family f, double a, double b, double p) {
        double mean = f.mean(a, b);
        double sd = f.sd(a, b);
        double[] se = new double[2];
        int[] ns = {1000, 4000};
        for (int r = 0; r < 2; r++) {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + r);
            Prepared d = Sim.open(rng, ns[r], sampler(f, a, b), p, 0.5);
            AmbiguousStartFit fit = AmbiguousStartEstimator.fit(d, f, ExposureHistory.open(),
                    AmbiguousStartEstimator.Options.defaults(), null);
            assertTrue(fit.converged(), fit.message());
            se[r] = ExposureHistorySimulationTest.se(fit.mean());
            assertEquals(mean, fit.mean().estimate(), 4 * se[r], "mean at n=" + ns[r]);
            assertEquals(sd, fit.sd().estimate(), 4 * ExposureHistorySimulationTest.se(fit.sd()), "sd at n=" + ns[r]);
            double pse = (fit.p().upper() - fit.p().lower()) / 3.92;
            assertEquals(p, fit.p().estimate(), 4 * pse, "p at n=" + ns[r]);
        }
        double ratio = se[1] / se[0];
        assertTrue(ratio > 0.4 && ratio < 0.6, "se ratio " + ratio);
    }

    /**
     * Data lognormal(1.5, 0.5) (mean 5.078, sd 2.695), open stream, p = 0.3, lambda 0.5,
     * n = 20,000. The gamma ML fit would be misspecified; the moment estimator (no family) and
     * the EM histogram (daily bins) still recover the mean and sd. Tolerances from a seeded
     * study of 20 replicates at n = 4000 (sampling sd, to be divided by sqrt(5) for n = 20,000):
     * moment mean 0.28 (-> 0.125, 2.5%), moment sd 0.60 (-> 0.27, 10%; the moment variance is a
     * difference of noisy moments); EM mean 0.12 (-> 0.055, 1.1%), EM sd 0.25 (-> 0.11, 4%). The
     * EM sd is biased upwards at finite n (the nonparametric MLE puts small spurious masses in
     * the far tail: +12% at n = 4000, +8% at 20,000, +5% at 80,000 in single seeded data sets;
     * the sampling sds above were measured with the grid capped at 40 days). Accepted:
     * moment mean 8%, moment sd 30%, EM mean 3%, EM sd 15% (bias + about 2 sd).
     */
    @Test
    void momentAndEmRecoverUnderWrongFamily() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 7);
        Prepared d = Sim.open(rng, 20_000, Sim.lognormal(1.5, 0.5), 0.3, 0.5);
        double mean = Family.LOGNORMAL.mean(1.5, 0.5);
        double sd = Family.LOGNORMAL.sd(1.5, 0.5);
        double[] m = AmbiguousStartMoments.solve(d);
        assertEquals(0.5, m[0], 0.03 * 0.5, "lambda");
        assertEquals(mean, m[1], 0.08 * mean, "moment mean");
        assertEquals(sd, Math.sqrt(m[2]), 0.30 * sd, "moment sd");
        assertEquals(0.3, m[3], 0.03, "moment p");
        double maxD = 0;
        for (double x : d.dur) {
            maxD = Math.max(maxD, x);
        }
        AmbiguousStartEm.Run em = AmbiguousStartEm.run(d, (int) maxD + 1, 1.0, 1e-10, 20_000);
        assertTrue(em.converged, "EM converged in " + em.iterations);
        assertEquals(mean, em.mean, 0.03 * mean, "EM mean");
        assertEquals(sd, em.sd, 0.15 * sd, "EM sd");
        assertEquals(0.3, em.p[0], 0.015, "EM p");
    }

    /**
     * Naive rules on open-stream gamma(3, 0.6) data (mean 5), p = 0.3, lambda = 0.5, n = 4000:
     * latest start too short, earliest too long (adds the waiting time W before infection,
     * E[W] = (1/p - 1)/lambda = 4.67 days), single-candidate cases too short (tilted by
     * exp(-lambda x)); each by more than 6 of its own standard errors.
     */
    @Test
    void naiveRulesAreBiasedAsExpected() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 9);
        Prepared d = Sim.open(rng, 4000, Sim.gamma(3, 0.6), 0.3, 0.5);
        double truth = 5;
        NaiveFit latest = AmbiguousStartEstimator.naive(d, Family.GAMMA, NaiveRule.LATEST, 0.95);
        NaiveFit earliest = AmbiguousStartEstimator.naive(d, Family.GAMMA, NaiveRule.EARLIEST, 0.95);
        NaiveFit single = AmbiguousStartEstimator.naive(d, Family.GAMMA, NaiveRule.SINGLE_ONLY, 0.95);
        NaiveFit mid = AmbiguousStartEstimator.naive(d, Family.GAMMA, NaiveRule.MIDPOINT, 0.95);
        assertTrue(latest.mean().upper() < truth && truth - latest.mean().estimate() > 6 * seOf(latest),
                "latest " + latest.mean());
        assertTrue(earliest.mean().lower() > truth && earliest.mean().estimate() - truth > 6 * seOf(earliest),
                "earliest " + earliest.mean());
        assertTrue(single.mean().upper() < truth && truth - single.mean().estimate() > 6 * seOf(single),
                "single " + single.mean());
        assertTrue(mid.mean().estimate() > latest.mean().estimate() && mid.mean().estimate() < earliest.mean().estimate());
        assertTrue(single.cases() < d.n);
        // E[D_1] = E[W] + E[X] = 4.67 + 5: earliest mean within 4 se of 9.67
        assertEquals((1 / 0.3 - 1) / 0.5 + truth, earliest.mean().estimate(), 4 * seOf(earliest));
    }

    static double seOf(NaiveFit f) {
        return ExposureHistorySimulationTest.se(f.mean());
    }

    @Test
    void plainFitMatchesClosedFormLognormal() {
        // lognormal MLE is closed form: meanLog = mean(log d), sdLog = sqrt(mean((log d - meanLog)^2)) (common practice)
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 11);
        double[] d = new double[500];
        double s = 0;
        for (int i = 0; i < d.length; i++) {
            d[i] = Sim.lognormal(1.2, 0.6).applyAsDouble(rng);
            s += Math.log(d[i]);
        }
        double ml = s / d.length;
        double v = 0;
        for (double x : d) {
            v += (Math.log(x) - ml) * (Math.log(x) - ml);
        }
        MaximumLikelihoodFit fit = AmbiguousStartEstimator.plainFit(d, Family.LOGNORMAL);
        assertEquals(ml, fit.naturalEstimate()[0], 1e-9 * Math.abs(ml));
        assertEquals(Math.sqrt(v / d.length), fit.naturalEstimate()[1], 1e-9);
    }
}
