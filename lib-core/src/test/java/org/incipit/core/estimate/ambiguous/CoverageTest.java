package org.incipit.core.estimate.ambiguous;

import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * Coverage of the 95% delta-method / Wald intervals of the ML fit (gamma H, open stream;
 * delta-method interval on the log scale for the mean, Wald on the logit scale for p) in seeded
 * simulated data sets of 200 cases, where they are adequate ({@link SmallSampleCoverageTest}
 * covers the profile intervals used below 1000 cases).
 */
class CoverageTest {

    private static final long SEED = 20261204L;

    /** Counts of intervals containing the truth: {mean, sd, p, shape}. */
    static int[] cover(int sets, int n, long seed, AmbiguousStartEstimator.Intervals intervals) {
        int[] hit = new int[4];
        double mean = 5;
        double sd = Math.sqrt(3) / 0.6;
        for (int s = 0; s < sets; s++) {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed + s);
            Prepared d = Sim.open(rng, n, Sim.gamma(3, 0.6), 0.3, 0.5);
            AmbiguousStartFit f = AmbiguousStartEstimator.fit(d, Family.GAMMA, ExposureHistory.open(),
                    AmbiguousStartEstimator.Options.defaults().withIntervals(intervals), null);
            assertTrue(f.converged(), f.message());
            hit[0] += f.mean().contains(mean) ? 1 : 0;
            hit[1] += f.sd().contains(sd) ? 1 : 0;
            hit[2] += f.p().contains(0.3) ? 1 : 0;
            hit[3] += f.parameter("shape").contains(3) ? 1 : 0;
        }
        return hit;
    }

    /**
     * 200 data sets of n = 200 cases: accept 180 to 199 hits of 200. At exact 95% coverage,
     * P(X &le; 179) + P(X = 200) = 0.00116 + 0.00004 = 0.0012 for X ~ Binomial(200, 0.95)
     * (scipy.stats.binom 1.17), so about 0.12% false alarms per interval checked.
     */
    @Test
    void smallCoverage() {
        int[] hit = cover(200, 200, SEED, AmbiguousStartEstimator.Intervals.DELTA);
        String[] names = {"mean", "sd", "p", "shape"};
        for (int i = 0; i < hit.length; i++) {
            assertTrue(hit[i] >= 180 && hit[i] <= 199, names[i] + " covered " + hit[i] + " of 200");
        }
    }

    /**
     * 2000 data sets of n = 200 with the default intervals (profile below 1000 cases, logit-Wald
     * for p): accept 1868 to 1931 of 2000 (P(X &le; 1867) + P(X &ge; 1932) = 0.0010 for
     * Binomial(2000, 0.95), scipy.stats.binom 1.17). The delta-method intervals on the same data
     * sets cover the mean 1864, the sd 1870, p 1900 and the shape 1882 times of 2000 (measured
     * 2026-12-01): the mean's falls just short of the band, which is why the default uses profile
     * intervals at this size (SmallSampleCoverageTest, docs/methods.md section 1). The default
     * covers 1868 (the band's lower edge; 93.4%), 1884, 1900 and 1895 times: the profile interval
     * of the mean still covers slightly less than 95% at 200 cases (the likelihood-ratio
     * statistic is larger than chi-square(1) in small samples; SmallSampleCoverageTest).
     */
    @Test
    @Tag("validation")
    void largeCoverage() {
        int[] hit = cover(2000, 200, SEED + 100_000, AmbiguousStartEstimator.Intervals.AUTOMATIC);
        String[] names = {"mean", "sd", "p", "shape"};
        for (int i = 0; i < hit.length; i++) {
            assertTrue(hit[i] >= 1868 && hit[i] <= 1931, names[i] + " covered " + hit[i] + " of 2000");
        }
    }
}
