package org.incipit.core.estimate.ambiguous;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.ForkJoinPool;

import org.incipit.core.inference.BootstrapResult;
import org.incipit.core.likelihood.LogLikelihood;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.distributions.DelayFamilies;
import org.junit.jupiter.api.Test;

/** The likelihood, the bare maximisation and the bootstrap as public entry points. */
class EngineAccessTest {

    @Test
    void logLikelihoodAtScipyArgmaxIsScipyMaximum() {
        // maxima.csv (scipy 1.17.1): open_one_kind, gamma, open: -875.6514997741104 at
        // shape 3.372325496738151, rate 0.6729091857171681, p 0.31723166040817663
        LogLikelihood ll = AmbiguousStartEstimator.logLikelihood(ReferenceData.cases("open_one_kind"),
                DelayFamilies.GAMMA, ExposureHistory.open());
        double p = 0.31723166040817663;
        double v = ll.value(new double[] {Math.log(3.372325496738151), Math.log(0.6729091857171681),
            Math.log(p / (1 - p))});
        assertEquals(-875.6514997741104, v, 1e-9);
    }

    @Test
    void maximumLikelihoodAndBootstrap() {
        AmbiguousStartCases cases = ReferenceData.cases("open_one_kind");
        MaximumLikelihoodFit f = AmbiguousStartEstimator.maximumLikelihood(cases, DelayFamilies.GAMMA,
                ExposureHistory.open());
        assertTrue(f.converged(), f.message());
        assertEquals(-875.6514997741104, f.logLikelihood(), 1e-6);
        assertEquals(java.util.List.of("shape", "rate", "p"), f.parameterisation().names());
        ExecutorService one = Executors.newSingleThreadExecutor();
        try {
            BootstrapResult a = AmbiguousStartEstimator.bootstrap(cases, DelayFamilies.GAMMA, ExposureHistory.open(), 40,
                    3L, one);
            BootstrapResult b = AmbiguousStartEstimator.bootstrap(cases, DelayFamilies.GAMMA, ExposureHistory.open(), 40,
                    3L, ForkJoinPool.commonPool());
            assertEquals(a, b);
            assertEquals(40, a.successful() + a.failed());
            assertEquals(f.naturalEstimate()[0], a.observed()[0], 0);
            assertTrue(a.percentile(3, 0.9).contains(a.observed()[3]), "mean interval");
        } finally {
            one.shutdown();
        }
    }
}
