package org.incipit.core.estimate.ambiguous;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.inference.ModelComparison;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.simulate.ExposureModel;
import org.incipit.core.simulate.ExposureRecords;
import org.incipit.core.simulate.ExposureSampler;
import org.incipit.distributions.DelayFamilies;
import org.junit.jupiter.api.Test;

/**
 * The public entry points end to end on data from the library's own exposure sampler
 * (org.incipit.core.simulate.ExposureSampler), with the library's delay families.
 */
class PublicApiTest {

    private static final long SEED = 20261205L;

    static AmbiguousStartCases cases(ExposureRecords r) {
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder();
        for (int i = 0; i < r.size(); i++) {
            for (int j = 0; j < r.candidateCount(i); j++) {
                b.addCandidate("c" + i, r.onset(i), r.candidateTime(i, j), null,
                        r.totalExposures(i) < 0 ? AmbiguousStartCases.UNKNOWN_TOTAL : r.totalExposures(i));
            }
        }
        return b.build();
    }

    @Test
    void openStreamUsageExample() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        ExposureRecords rec = ExposureSampler.sample(rng, ExposureModel.open(0.3, 0.5), DelayFamilies.GAMMA.of(3, 0.6),
                2000);
        AmbiguousStartCases cases = cases(rec);

        AmbiguousStartFit fit = AmbiguousStartEstimator.fit(cases, DelayFamilies.GAMMA, ExposureHistory.open());
        assertTrue(fit.converged(), fit.message());
        assertEquals("open", fit.history().label());
        assertEquals(List.of("shape", "rate"), fit.parameterNames());
        assertEquals(2000, fit.cases());
        // truth mean 5, p 0.3: within 4 standard errors (false-alarm rate ~6e-5 each)
        assertEquals(5, fit.mean().estimate(), 4 * ExposureHistorySimulationTest.se(fit.mean()));
        assertEquals(0.3, fit.p().estimate(), 4 * (fit.p().upper() - fit.p().lower()) / 3.92);
        assertEquals(2, fit.quantiles().size());
        assertTrue(fit.quantiles().get(0).estimate() < fit.quantiles().get(1).estimate());
        assertEquals(fit.fit().aic(), fit.aic(), 0);

        AmbiguousStartEstimator.Comparison cmp = AmbiguousStartEstimator.compare(cases,
                List.of(DelayFamilies.GAMMA, DelayFamilies.WEIBULL, DelayFamilies.LOGNORMAL), ExposureHistory.open(),
                ModelComparison.Criterion.AICC, AmbiguousStartEstimator.Options.defaults());
        assertEquals(3, cmp.fits().size());
        assertEquals(3, cmp.ranking().ranked().size());
        double weights = cmp.ranking().ranked().stream().mapToDouble(ModelComparison.Ranked::weight).sum();
        assertEquals(1, weights, 1e-12);

        NaiveFit latest = AmbiguousStartEstimator.naive(cases, DelayFamilies.GAMMA, NaiveRule.LATEST, 0.95);
        assertTrue(latest.mean().estimate() < fit.mean().lower(), "nearest-start rule is too short");
    }

    @Test
    void poissonTotalRecoversPAndMean() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 1);
        ExposureRecords rec = ExposureSampler.sample(rng, ExposureModel.knownPoissonTotal(0.25, 4, 10),
                DelayFamilies.GAMMA.of(4, 0.8), 2000);
        AmbiguousStartCases c = cases(rec);
        for (AmbiguousStartFit f : List.of(
                AmbiguousStartEstimator.fit(c, DelayFamilies.GAMMA, ExposureHistory.poissonTotal(4)),
                AmbiguousStartEstimator.fit(c, DelayFamilies.GAMMA, ExposureHistory.knownTotal()))) {
            assertTrue(f.converged(), f.message());
            assertEquals(5, f.mean().estimate(), 4 * ExposureHistorySimulationTest.se(f.mean()), f.history().label());
            assertEquals(0.25, f.p().estimate(), 4 * (f.p().upper() - f.p().lower()) / 3.92, f.history().label());
        }
    }

    @Test
    void refusesWhatTheModelCannotDo() {
        AmbiguousStartCases cat = AmbiguousStartCases.builder()
                .addCandidate("a", 10, 2, "home", 3).addCandidate("a", 10, 4, "work", 3)
                .addCandidate("b", 12, 5, "home", 2).build();
        // categories of unrecorded exposures are unknown: known total refused
        assertThrows(IllegalArgumentException.class,
                () -> AmbiguousStartEstimator.fit(cat, DelayFamilies.GAMMA, ExposureHistory.knownTotal()));
        AmbiguousStartCases noTotal = AmbiguousStartCases.builder().addCase("a", 10, 2, 4).addCase("b", 9, 1).build();
        assertThrows(IllegalArgumentException.class,
                () -> AmbiguousStartEstimator.fit(noTotal, DelayFamilies.GAMMA, ExposureHistory.knownTotal()));
        assertThrows(IllegalArgumentException.class, () -> ExposureHistory.poissonTotal(0));
        assertThrows(IllegalArgumentException.class,
                () -> AmbiguousStartEstimator.fit(noTotal, null, ExposureHistory.open()));
        // a case whose only start equals its end cannot have started the interval
        AmbiguousStartCases tie = AmbiguousStartCases.builder().addCase("a", 10, 10).addCase("b", 9, 1).build();
        assertThrows(IllegalArgumentException.class,
                () -> AmbiguousStartEstimator.fit(tie, DelayFamilies.GAMMA, ExposureHistory.open()));
    }

    @Test
    void twoCategoriesOnReferenceData() {
        AmbiguousStartFit f = AmbiguousStartEstimator.fit(ReferenceData.cases("open_two_kinds"), DelayFamilies.GAMMA,
                ExposureHistory.open());
        assertEquals(List.of("household", "other"), f.categories());
        assertEquals(2, f.transmission().size());
        // scipy reference (maxima.csv): -867.2172549324043
        assertEquals(-867.2172549324043, f.logLikelihood(), 1e-6);
        assertTrue(f.fit().profile("p[household]", 0.95).contains(f.transmission().get(0).estimate()));
    }

    /**
     * Data with no maximum are an estimation failure, not bad input (common practice: one
     * observation cannot fix two parameters; with identical durations the likelihood grows
     * without bound as the shape grows).
     */
    @Test
    void dataWithoutAMaximumFailAsEstimation() {
        AmbiguousStartCases one = AmbiguousStartCases.builder().addCase("A", 10, 3).build();
        org.incipit.core.EstimationException e = assertThrows(org.incipit.core.EstimationException.class,
                () -> AmbiguousStartEstimator.fit(one, DelayFamilies.GAMMA, ExposureHistory.open()));
        assertTrue(e.getMessage().contains("at least 2 cases"), e.getMessage());
        AmbiguousStartCases same = AmbiguousStartCases.builder().addCase("A", 10, 3).addCase("B", 10, 3).build();
        assertThrows(org.incipit.core.EstimationException.class,
                () -> AmbiguousStartEstimator.fit(same, DelayFamilies.GAMMA, ExposureHistory.open()));
    }
}
