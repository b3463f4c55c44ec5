package org.incipit.core.study;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * Draws one simulated data set of a simulation study.
 *
 * <p>Must be a pure function of its arguments (no shared mutable state), so that a study gives
 * the same result on any number of threads. The data set it returns is passed to every
 * estimator of the replicate, which must not modify it.
 *
 * @param <D> data set type, e.g. {@code double[]} or an observation type of
 *            {@code org.incipit.core.observe}
 */
@FunctionalInterface
public interface DataGenerator<D> {

    /**
     * @param rng      the replicate's own generator
     * @param scenario true values and settings
     * @param n        sample size (its meaning, e.g. cases or pairs, is the generator's), &ge; 1
     * @return a data set, not null
     */
    D generate(UniformRandomProvider rng, Scenario scenario, int n);
}
