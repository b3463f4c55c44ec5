package org.incipit.core.estimate.delay;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;
import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;
import org.incipit.distributions.DelayFamilies;
import org.junit.jupiter.api.Test;

/** Input checks and result contracts of the delay estimators (common practice). */
class DelayEstimatorApiTest {

    private static final DelayOptions O = DelayOptions.defaults();

    @Test
    void rejectsInvalidInput() {
        DelayPairs noCutoff = DelayPairs.builder().addObserved("a", 0, 3).build();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> DelayEstimator.rightTruncated(noCutoff, DelayFamilies.GAMMA, O));
        assertTrue(e.getMessage().contains("cut-off"), e.getMessage());
        DelayPairs withCensored = DelayPairs.builder(10).addObserved("a", 0, 3).addCensored("b", 8, false).build();
        assertThrows(IllegalArgumentException.class,
                () -> DelayEstimator.rightTruncated(withCensored, DelayFamilies.GAMMA, O));
        DelayPairs zero = DelayPairs.builder(10).addObserved("a", 2, 2).build();
        e = assertThrows(IllegalArgumentException.class, () -> DelayEstimator.rightTruncated(zero, DelayFamilies.GAMMA, O));
        assertTrue(e.getMessage().contains("'a'"), e.getMessage());
        DelayPairs fractionalDay = DelayPairs.builder(10).addObserved("a", 2.5, 4, true).build();
        assertThrows(IllegalArgumentException.class,
                () -> DelayEstimator.rightTruncated(fractionalDay, DelayFamilies.GAMMA, O));
        assertThrows(IllegalArgumentException.class, () -> ExposureModel.growing(0));
        assertThrows(IllegalArgumentException.class, () -> new DelayOptions(1.0, List.of(0.5), O.maximiser()));
        assertThrows(IllegalArgumentException.class,
                () -> DelayEstimator.growthWeighted(new double[] {1, -2}, DelayFamilies.GAMMA, 0.1, O));
        ExposureWindows atOnset = ExposureWindows.builder().add("c", 3, 3, 3).build();
        assertThrows(IllegalArgumentException.class,
                () -> IncubationEstimator.fit(atOnset, DelayFamilies.GAMMA, ExposureModel.uniform(), O));
    }

    @Test
    void lognormalCannotBeTiltedByNegativeRate() {
        // M(-r) = E[exp(-r X)] diverges for the lognormal when r < 0 (docs/methods.md section 3)
        double[] d = {1, 2, 3, 4, 5, 6};
        assertThrows(EstimationException.class,
                () -> DelayEstimator.growthWeighted(d, DelayFamilies.LOGNORMAL, -0.1, O));
    }

    @Test
    void resultContract() {
        DelayPairs.Builder b = DelayPairs.builder();
        double[] d = {2.1, 3.5, 4.0, 5.2, 6.8, 3.3, 2.9, 7.5, 4.4, 5.9, 3.8, 4.9};
        for (int i = 0; i < d.length; i++) {
            b.addObserved("p" + i, 0, d[i]);
        }
        DelayFit fit = DelayEstimator.censored(b.build(), DelayFamilies.GAMMA, O);
        assertTrue(fit.converged());
        assertEquals(List.of("shape", "rate"), fit.parameterNames());
        assertEquals(d.length, fit.observations());
        assertEquals(2 * 2 - 2 * fit.logLikelihood(), fit.aic(), 1e-12);
        double mean = 0;
        for (double x : d) {
            mean += x;
        }
        // gamma MLE reproduces the sample mean: shape/rate = mean (score equation for the rate)
        assertEquals(mean / d.length, fit.mean().estimate(), 1e-8 * mean / d.length);
        Estimate median = fit.quantile(0.5);
        assertEquals(fit.distribution().quantile(0.5), median.estimate(), 1e-12);
        assertTrue(median.lower() < median.estimate() && median.estimate() < median.upper());
        assertThrows(IllegalArgumentException.class, () -> fit.quantile(0.9));
    }
}
