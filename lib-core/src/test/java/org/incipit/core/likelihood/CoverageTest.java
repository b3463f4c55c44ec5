package org.incipit.core.likelihood;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

/** Seeded coverage of the log-Wald interval for an exponential rate. */
class CoverageTest {

    private static final long SEED = 20240501L;

    /**
     * 200 data sets of 30 exponential(0.7) durations; count the 95% log-Wald intervals that
     * contain 0.7 and accept 180 to 199. Under exact 95% coverage the count is Binomial(200,
     * 0.95): P(X &le; 179) = 0.00116 and P(X = 200) = 0.95^200 = 3.5e-5, so the false-alarm
     * rate is 0.12% (scipy.stats.binom, computed for this comment).
     */
    @Test
    void waldCoverageOfExponentialRate() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        Parameterisation p = Parameterisation.of(List.of("rate"), List.of(ParameterTransform.log()));
        double truth = 0.7;
        int covered = 0;
        for (int r = 0; r < 200; r++) {
            double[] x = new double[30];
            for (int i = 0; i < x.length; i++) {
                x[i] = -Math.log(1 - rng.nextDouble()) / truth;
            }
            MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, TestLikelihoods.exponential(x),
                    List.of(new double[] {1}), x.length, Maximiser.bfgs());
            assertTrue(fit.converged(), fit.message());
            if (fit.wald(0, 0.95).contains(truth)) {
                covered++;
            }
        }
        assertTrue(covered >= 180 && covered <= 199, "covered " + covered + " of 200");
    }
}
