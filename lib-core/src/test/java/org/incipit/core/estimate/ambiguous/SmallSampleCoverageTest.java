package org.incipit.core.estimate.ambiguous;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.IntStream;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.apache.commons.statistics.distribution.BinomialDistribution;
import org.incipit.core.inference.Estimate;
import org.incipit.core.likelihood.ParameterTransform;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.simulate.ExposureModel;
import org.incipit.core.simulate.ExposureSampler;
import org.incipit.core.simulate.SimulatedData;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.GammaDelay;
import org.incipit.distributions.LogNormalDelay;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * Coverage of the default 95% intervals below 1000 cases (profile likelihood for the mean and
 * sd of H, Wald on the logit scale for p) in small samples, next to the delta-method intervals
 * of the same fits. Data
 * from the library's sampler: open exposure stream (p = 0.3, 0.5 exposures a day), H gamma(3,
 * 0.6) (mean 5, sd 2.89 days) or lognormal(1.5, 0.5) (mean 5.08, sd 2.71 days). Coverage is
 * counted over the fits with an interior maximum; fits whose maximum is on the boundary of p
 * (reported as not converged, with no interval) are counted separately.
 *
 * <p>Acceptance: a count X of m intervals containing the truth is accepted if it is not in
 * either 0.0006 tail of Binomial(m, 0.95) (commons-statistics BinomialDistribution; for m = 200
 * this is 180..199, as scipy.stats.binom 1.17 gives P(X &le; 179) + P(X = 200) = 0.0012), so
 * about 0.12% false alarms per count at exact coverage.
 */
class SmallSampleCoverageTest {

    private static final double P = 0.3;
    private static final double RATE = 0.5;

    /** Hits of one (family, n) study. */
    record Counts(String family, int n, int sets, int interior, int[] profile, int[] delta) {
    }

    static DelayDistribution truth(String family) {
        return family.equals("gamma") ? GammaDelay.ofShapeRate(3, 0.6) : LogNormalDelay.ofMeanLogSdLog(1.5, 0.5);
    }

    /** One data set: {interior, default mean, sd, p, delta mean, delta sd, profile p} as 0/1. */
    static int[] one(String family, int n, long seed) {
        DelayDistribution h = truth(family);
        DelayFamily fam = family.equals("gamma") ? DelayFamilies.GAMMA : DelayFamilies.LOGNORMAL;
        Family f = Family.byName(family);
        double mean = h.mean();
        double sd = Math.sqrt(h.variance());
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        AmbiguousStartCases cases = SimulatedData.ambiguousStarts(
                ExposureSampler.sample(rng, ExposureModel.open(P, RATE), h, n), "c");
        AmbiguousStartFit fit = AmbiguousStartEstimator.fit(cases, fam, ExposureHistory.open(),
                new AmbiguousStartEstimator.Options(0.95, List.of(), AmbiguousStartEstimator.Intervals.AUTOMATIC));
        int[] r = new int[7];
        if (!fit.converged()) {
            return r;
        }
        assertTrue(fit.mean().method().equals("profile") && fit.p().method().equals("wald-logit"),
                "default intervals below " + AmbiguousStartEstimator.PROFILE_BELOW_CASES + " cases");
        r[0] = 1;
        r[1] = fit.mean().contains(mean) ? 1 : 0;
        r[2] = fit.sd().contains(sd) ? 1 : 0;
        r[3] = fit.p().contains(P) ? 1 : 0;
        // the delta-method intervals of the same (final) maximum
        Estimate dm = fit.fit().delta(x -> f.mean(x[0], x[1]), 0.95, ParameterTransform.log());
        Estimate ds = fit.fit().delta(x -> f.sd(x[0], x[1]), 0.95, ParameterTransform.log());
        // and the profile interval of p (what Intervals.PROFILE reports; if its profile finds a
        // higher maximum, the PROFILE fit, which refits from there)
        Estimate dp;
        try {
            dp = new ProfileIntervals(fit.fit().likelihood(), f, fit.fit().unconstrainedEstimate(),
                    fit.logLikelihood()).coordinate(2, ParameterTransform.logit(), 0.95,
                    Math.sqrt(fit.fit().unconstrainedCovariance()[2][2]));
        } catch (ProfileIntervals.HigherMaximum e) {
            AmbiguousStartFit pf = AmbiguousStartEstimator.fit(cases, fam, ExposureHistory.open(),
                    new AmbiguousStartEstimator.Options(0.95, List.of(), AmbiguousStartEstimator.Intervals.PROFILE));
            dp = pf.p();
        }
        r[4] = dm.contains(mean) ? 1 : 0;
        r[5] = ds.contains(sd) ? 1 : 0;
        r[6] = dp.contains(P) ? 1 : 0;
        return r;
    }

    static Counts study(String family, int n, int sets, long seed) {
        int[] total = IntStream.range(0, sets).parallel().mapToObj(s -> one(family, n, seed + s))
                .reduce(new int[7], (a, b) -> {
                    int[] c = new int[7];
                    for (int i = 0; i < 7; i++) {
                        c[i] = a[i] + b[i];
                    }
                    return c;
                });
        return new Counts(family, n, sets, total[0], new int[] {total[1], total[2], total[3]},
                new int[] {total[4], total[5], total[6]});
    }

    /** True if x is in neither 0.0006 tail of Binomial(m, 0.95). */
    static boolean accepted(int x, int m) {
        BinomialDistribution b = BinomialDistribution.of(m, 0.95);
        return b.cumulativeProbability(x) > 0.0006 && b.survivalProbability(x - 1) > 0.0006;
    }

    /**
     * 200 data sets of 120 cases, gamma H: the default intervals of the mean, sd and p each
     * contain the truth at the nominal rate (a seeded, bounded version of the validation study).
     */
    @Test
    void defaultIntervalsCoverAtHundredTwentyCases() {
        Counts c = study("gamma", 120, 200, 20261230L);
        assertTrue(c.interior() >= 195, "interior maxima: " + c.interior() + " of 200");
        String[] names = {"mean", "sd", "p"};
        for (int i = 0; i < 3; i++) {
            assertTrue(accepted(c.profile()[i], c.interior()),
                    names[i] + " interval covered " + c.profile()[i] + " of " + c.interior());
        }
    }

    /**
     * 1000 data sets at each of n = 30, 60, 120, 500 for gamma and lognormal H. Written to
     * target/ambiguous-small-sample-coverage.csv (the table in docs/methods.md, section 1).
     * Asserted: from n = 120 on, the default intervals of mean, sd and p cover at the nominal
     * rate (binomial band above); p (Wald on the logit scale) also at n = 30 and 60. At n = 30
     * and 60 the profile intervals of the mean and sd still fall short (about 92% at 30): the
     * chi-square calibration of the likelihood ratio itself is off at that size (the mean of the
     * profile likelihood-ratio statistic at the true gamma mean is about 1.25 at n = 30 and 1.09
     * at 60 rather than 1, measured while writing this test), so there only at least 90%
     * coverage, and no less than the delta-method interval's, are asserted.
     */
    @Test
    @Tag("validation")
    void smallSampleCoverageTable() {
        List<Counts> all = new ArrayList<>();
        long seed = 20261231L;
        for (String family : List.of("gamma", "lognormal")) {
            for (int n : new int[] {30, 60, 120, 500}) {
                all.add(study(family, n, 1000, seed));
                seed += 1_000_000L;
            }
        }
        StringBuilder sb = new StringBuilder("# SmallSampleCoverageTest.smallSampleCoverageTable: 95% intervals, open"
                + " stream p = 0.3, 0.5 exposures/day; coverage over interior fits\n"
                + "family,n,sets,interior,profile_mean,profile_sd,wald_p,delta_mean,delta_sd,profile_p\n");
        for (Counts c : all) {
            sb.append(c.family()).append(',').append(c.n()).append(',').append(c.sets()).append(',')
                    .append(c.interior());
            for (int h : c.profile()) {
                sb.append(',').append(String.format(java.util.Locale.ROOT, "%.4f", (double) h / c.interior()));
            }
            for (int h : c.delta()) {
                sb.append(',').append(String.format(java.util.Locale.ROOT, "%.4f", (double) h / c.interior()));
            }
            sb.append('\n');
        }
        try {
            Files.writeString(Path.of("target", "ambiguous-small-sample-coverage.csv"), sb);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        String[] names = {"mean", "sd", "p"};
        for (Counts c : all) {
            for (int i = 0; i < 3; i++) {
                String what = c.family() + " n = " + c.n() + " " + names[i] + ": default " + c.profile()[i]
                        + ", alternative " + c.delta()[i] + " of " + c.interior() + "\n" + sb;
                if (c.n() >= 120 || i == 2) {
                    assertTrue(accepted(c.profile()[i], c.interior()), what);
                } else {
                    assertTrue(c.profile()[i] >= 0.90 * c.interior() && c.profile()[i] >= c.delta()[i], what);
                }
            }
        }
    }
}
