package org.incipit.core.simulate;

import org.apache.commons.rng.UniformRandomProvider;
import org.incipit.distributions.DelayDistribution;

/**
 * Direct sampler of ambiguous-start case data alone, without a transmission tree: n
 * independent cases, each infected at time 0 with onset X ~ H, with candidate exposures
 * recorded by the given {@link ExposureModel} (so candidate times are relative to the
 * infection, the first one usually negative). For estimator tests that need only the
 * exposure-onset data.
 */
public final class ExposureSampler {

    private ExposureSampler() {
    }

    /**
     * Samples n cases.
     *
     * @param rng        source of randomness (not stored)
     * @param model      exposure regime and infection probabilities
     * @param incubation the incubation-period distribution H (infecting exposure to onset)
     * @param cases      n &ge; 1
     * @return the records
     * @throws IllegalArgumentException if n &lt; 1 or an argument is null
     * @throws org.incipit.core.EstimationException if a finite history with an infecting
     *         exposure cannot be drawn in {@code 10^7} tries (infection probability too small)
     */
    public static ExposureRecords sample(UniformRandomProvider rng, ExposureModel model,
                                         DelayDistribution incubation, int cases) {
        if (rng == null || model == null || incubation == null) {
            throw new IllegalArgumentException("rng, model and incubation must not be null");
        }
        if (cases < 1) {
            throw new IllegalArgumentException("cases must be >= 1, was " + cases);
        }
        ExposureGenerator g = new ExposureGenerator(model);
        for (int i = 0; i < cases; i++) {
            double x = incubation.sample(rng);
            g.addCase(rng, 0, x);
        }
        return g.build();
    }
}
