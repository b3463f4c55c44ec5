package org.incipit.core.estimate.delay;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.observe.DelayPairs;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamilies;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * Coverage of the 95% delta-method interval for the mean of a right-truncated gamma delay in
 * repeated seeded simulation. Default: 200 data sets, accept 180 to 199 contained: at exact
 * coverage X ~ Binomial(200, 0.95), P(X &le; 179) &asymp; 0.0009 and P(X = 200) = 0.95^200
 * &asymp; 3.5e-5, about 0.1% false alarms in all. Validation: 2000 sets, accept 1870 to 1930
 * (mean 1900, sd 9.7; &plusmn;3.1 sd, about 0.2% false alarms).
 */
class DelayCoverageTest {

    private static final DelayOptions OPTIONS = DelayOptions.defaults().withQuantiles(List.of(0.5));

    static int covered(long seed, int sets, int n) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        DelayDistribution truth = DelayFamilies.GAMMA.of(2, 0.25);
        int hits = 0;
        for (int k = 0; k < sets; k++) {
            DelayPairs pairs = DelaySimulationTest.truncatedPairs(rng, truth, n, 40, false);
            if (DelayEstimator.rightTruncated(pairs, DelayFamilies.GAMMA, OPTIONS).mean().contains(truth.mean())) {
                hits++;
            }
        }
        return hits;
    }

    @Test
    void truncatedMeanCoverage() {
        int hits = covered(20261202L, 200, 150);
        assertTrue(hits >= 180 && hits <= 199, "95% intervals containing the mean: " + hits + " of 200");
    }

    @Test
    @Tag("validation")
    void truncatedMeanCoverageLarge() {
        int hits = covered(20261203L, 2000, 150);
        assertTrue(hits >= 1870 && hits <= 1930, "95% intervals containing the mean: " + hits + " of 2000");
    }
}
