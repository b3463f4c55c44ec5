package org.incipit.core.study;

import java.io.Serializable;
import java.util.List;

/**
 * One replicate of a study as plain values, so that a distributed runner can ship it: the
 * scenario name, the estimator names, the sample size, the replicate index and the master seed.
 * {@link Study#run(ReplicateTask)} turns it into a {@link ReplicateResult}; the result depends
 * on nothing else (see {@link Study#replicateStream(long, int, int)}).
 *
 * @param scenario   scenario name
 * @param estimators estimator names, in study order; copied
 * @param sampleSize sample size, &ge; 1
 * @param replicate  replicate index, &ge; 0
 * @param seed       master seed of the study
 */
public record ReplicateTask(String scenario, List<String> estimators, int sampleSize, int replicate, long seed)
        implements Serializable {

    private static final long serialVersionUID = 1L;

    /**
     * Validates and copies.
     *
     * @param scenario   scenario name
     * @param estimators estimator names
     * @param sampleSize sample size, &ge; 1
     * @param replicate  replicate index, &ge; 0
     * @param seed       master seed
     * @throws IllegalArgumentException if a value is out of range
     */
    public ReplicateTask {
        Scenario.requireName("scenario name", scenario);
        if (estimators == null || estimators.isEmpty()) {
            throw new IllegalArgumentException("a task needs at least one estimator");
        }
        estimators = List.copyOf(estimators);
        if (sampleSize < 1) {
            throw new IllegalArgumentException("sampleSize must be >= 1, was " + sampleSize);
        }
        if (replicate < 0) {
            throw new IllegalArgumentException("replicate must be >= 0, was " + replicate);
        }
    }
}
