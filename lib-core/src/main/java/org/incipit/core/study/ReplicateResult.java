package org.incipit.core.study;

import java.io.Serializable;
import java.util.List;

/**
 * The outcome of one {@link ReplicateTask}: one {@link TargetOutcome} per estimator and
 * target, in study order (estimators, then their targets). Plain values, serialisable.
 *
 * @param task     the task
 * @param outcomes outcomes; copied
 */
public record ReplicateResult(ReplicateTask task, List<TargetOutcome> outcomes) implements Serializable {

    private static final long serialVersionUID = 1L;

    /**
     * Validates and copies.
     *
     * @param task     the task, not null
     * @param outcomes outcomes, not null
     * @throws IllegalArgumentException if null
     */
    public ReplicateResult {
        if (task == null || outcomes == null) {
            throw new IllegalArgumentException("task and outcomes must not be null");
        }
        outcomes = List.copyOf(outcomes);
    }
}
