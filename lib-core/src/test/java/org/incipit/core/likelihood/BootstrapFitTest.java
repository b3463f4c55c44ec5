package org.incipit.core.likelihood;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.concurrent.ForkJoinPool;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.EstimationException;
import org.incipit.core.inference.Bootstrap;
import org.incipit.core.inference.BootstrapResult;
import org.junit.jupiter.api.Test;

/** Parametric bootstrap of a refitted exponential rate, end to end through the engine. */
class BootstrapFitTest {

    private static final long SEED = 20240503L;
    private static final Parameterisation RATE = Parameterisation.of(List.of("rate"),
            List.of(ParameterTransform.log()));

    private static MaximumLikelihoodFit fit(double[] x) {
        return MaximumLikelihoodFit.maximise(RATE, TestLikelihoods.exponential(x), List.of(new double[] {1}),
                x.length, Maximiser.bfgs());
    }

    /**
     * With sum x* ~ Gamma(n, rate-hat), the refitted rate n / sum x* has standard deviation
     * n rate / ((n-1) sqrt(n-2)) (inverse-gamma moments; from memory). B = 2000: the relative
     * simulation SD of a bootstrap SE is about sqrt((excess kurtosis + 2)/(4B)) =
     * sqrt(3.2/8000) = 2% (excess kurtosis of the inverse gamma(30) about 1.2), tolerance 4 x 2%.
     */
    @Test
    void parametricStandardErrorOfRefittedRate() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        int n = 30;
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = -Math.log(1 - rng.nextDouble()) / 0.5;
        }
        MaximumLikelihoodFit original = fit(x);
        double rateHat = original.naturalEstimate()[0];
        BootstrapResult r = Bootstrap.parametric(SEED, 2000, stream -> {
            double[] sim = new double[n];
            for (int i = 0; i < n; i++) {
                sim[i] = -Math.log(1 - stream.nextDouble()) / rateHat;
            }
            MaximumLikelihoodFit f = fit(sim);
            if (!f.converged()) {
                throw new EstimationException("replicate fit: " + f.message());
            }
            return f.naturalEstimate();
        }, original.naturalEstimate(), ForkJoinPool.commonPool());
        assertEquals(0, r.failed(), r.failureReasons().toString());
        double exact = n * rateHat / ((n - 1) * Math.sqrt(n - 2));
        assertEquals(exact, r.standardError(0), 0.08 * exact);
        assertTrue(r.percentile(0, 0.95).contains(rateHat));
    }
}
