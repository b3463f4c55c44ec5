package org.incipit.core.study;

import java.util.List;
import java.util.Map;
import java.util.Objects;

import org.apache.commons.rng.UniformRandomProvider;
import org.incipit.core.inference.Estimate;

/**
 * An estimator as a simulation study sees it: a name, the targets it estimates (names of true
 * values in the {@link Scenario}) and a function from a data set to one {@link Estimate} per
 * target.
 *
 * <p>The function must not modify the data set (the same one goes to every estimator of a
 * replicate) and must be free of shared mutable state. An estimator that needs randomness (e.g.
 * bootstrap intervals) uses only the generator it is given, and runs any inner bootstrap on a
 * direct executor ({@code Runnable::run}): the study already uses all threads.
 *
 * @param <D> data set type
 */
public interface StudyEstimator<D> {

    /** @return the estimator's name (letters, digits, '.', '_' or '-') */
    String name();

    /** @return the targets estimated, in output order, not empty, no duplicates */
    List<String> targets();

    /**
     * @param rng  the estimator's own generator for this replicate (ignore it if not needed)
     * @param data the replicate's data set; not to be modified
     * @return an estimate per target, at the study's level; a missing target counts as a failure
     * @throws RuntimeException if no estimate exists; counted as a failure with its message
     */
    Map<String, Estimate> estimate(UniformRandomProvider rng, D data);

    /**
     * Estimator function of {@link #of}.
     *
     * @param <D> data set type
     */
    @FunctionalInterface
    interface EstimateFunction<D> {
        /**
         * @param rng  the estimator's own generator
         * @param data the data set
         * @return estimates by target
         */
        Map<String, Estimate> apply(UniformRandomProvider rng, D data);
    }

    /**
     * @param <D>     data set type
     * @param name    estimator name
     * @param targets targets, not empty, distinct names
     * @param f       the estimator function
     * @return the estimator
     * @throws IllegalArgumentException if the name or a target is invalid
     */
    static <D> StudyEstimator<D> of(String name, List<String> targets, EstimateFunction<D> f) {
        Scenario.requireName("estimator name", name);
        Objects.requireNonNull(f, "estimator function");
        if (targets == null || targets.isEmpty()) {
            throw new IllegalArgumentException("estimator '" + name + "' must declare at least one target");
        }
        for (String t : targets) {
            Scenario.requireName("target name", t);
        }
        if (targets.stream().distinct().count() != targets.size()) {
            throw new IllegalArgumentException("estimator '" + name + "' declares a target twice: " + targets);
        }
        List<String> copy = List.copyOf(targets);
        return new StudyEstimator<>() {
            @Override
            public String name() {
                return name;
            }

            @Override
            public List<String> targets() {
                return copy;
            }

            @Override
            public Map<String, Estimate> estimate(UniformRandomProvider rng, D data) {
                return f.apply(rng, data);
            }

            @Override
            public String toString() {
                return "StudyEstimator[" + name + " -> " + copy + "]";
            }
        };
    }
}
