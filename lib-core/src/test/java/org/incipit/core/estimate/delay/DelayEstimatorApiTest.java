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
        assertThrows(IllegalArgumentException.class, () -> ExposureWindowModel.growing(0));
        assertThrows(IllegalArgumentException.class, () -> new DelayOptions(1.0, List.of(0.5), O.maximiser()));
        assertThrows(IllegalArgumentException.class,
                () -> DelayEstimator.growthWeighted(new double[] {1, -2}, DelayFamilies.GAMMA, 0.1, O));
        ExposureWindows atOnset = ExposureWindows.builder().add("c", 3, 3, 3).build();
        assertThrows(IllegalArgumentException.class,
                () -> IncubationEstimator.fit(atOnset, DelayFamilies.GAMMA, ExposureWindowModel.uniform(), O));
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

    @Test
    void growthRateUncertaintyComposition() {
        org.apache.commons.rng.UniformRandomProvider rng =
                org.apache.commons.rng.simple.RandomSource.XO_RO_SHI_RO_128_PP.create(11L);
        double[] d = new double[400];
        for (int i = 0; i < d.length; i++) {
            d[i] = DelayFamilies.GAMMA.of(2, 0.5).sample(rng);
        }
        double r = 0.1;
        GrowthWeightedFit exact = GrowthWeightedEstimator.fit(d, DelayFamilies.GAMMA, new Estimate(r, r, r, 0.95, "known"), O);
        assertEquals(exact.conditional().mean(), exact.mean(), "se(r) = 0: the conditional interval");
        GrowthWeightedFit small = GrowthWeightedEstimator.fit(d, DelayFamilies.GAMMA,
                new Estimate(r, r - 0.01, r + 0.01, 0.95, "wald"), O);
        GrowthWeightedFit large = GrowthWeightedEstimator.fit(d, DelayFamilies.GAMMA,
                new Estimate(r, r - 0.04, r + 0.04, 0.95, "wald"), O);
        assertEquals(exact.mean().estimate(), small.mean().estimate(), 0.0, "same point estimate");
        assertTrue(exact.mean().width() < small.mean().width() && small.mean().width() < large.mean().width(),
                "wider r interval, wider mean interval");
        // gamma tilt (docs/methods.md section 3): the fitted intrinsic rate is the observed-law rate minus r,
        // the shape does not depend on r, so d log(mean) / dr = 1 / rate
        double b = exact.conditional().parameter("rate").estimate();
        double seR = 0.04 / 1.959963984540054;
        double seCond = (Math.log(exact.mean().upper()) - Math.log(exact.mean().estimate())) / 1.959963984540054;
        double dLogMean = 1 / b; // d log(a / b) / dr with b(r) = b_obs - r and a fixed: 1 / b
        double expected = Math.sqrt(seCond * seCond + dLogMean * dLogMean * seR * seR);
        double got = (Math.log(large.mean().upper()) - Math.log(large.mean().estimate())) / 1.959963984540054;
        assertEquals(expected, got, 0.02 * expected, "delta composition for the gamma (closed-form tilt)");
    }
}
