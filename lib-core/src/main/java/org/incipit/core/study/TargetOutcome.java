package org.incipit.core.study;

import java.io.Serializable;

import org.incipit.core.inference.Estimate;

/**
 * What one estimator gave for one target in one replicate: an estimate with its interval, or
 * the reason it failed. Plain values, serialisable.
 *
 * @param estimator     estimator name
 * @param target        target name
 * @param estimate      point estimate (NaN if failed)
 * @param lower         interval lower bound, may be &minus;&infin; (NaN if failed)
 * @param upper         interval upper bound, may be +&infin; (NaN if failed)
 * @param failureReason why it failed, or null if it succeeded
 */
public record TargetOutcome(String estimator, String target, double estimate, double lower, double upper,
                            String failureReason) implements Serializable {

    private static final long serialVersionUID = 1L;

    /**
     * Validates.
     *
     * @param estimator     estimator name
     * @param target        target name
     * @param estimate      finite if succeeded
     * @param lower         &le; estimate if succeeded
     * @param upper         &ge; estimate if succeeded
     * @param failureReason null if succeeded, else not blank
     * @throws IllegalArgumentException if inconsistent
     */
    public TargetOutcome {
        if (estimator == null || target == null) {
            throw new IllegalArgumentException("estimator and target must be named");
        }
        if (failureReason == null) {
            if (!Double.isFinite(estimate) || !(lower <= estimate) || !(upper >= estimate)) {
                throw new IllegalArgumentException("a successful outcome needs a finite estimate inside [lower, upper],"
                        + " was " + estimate + " in [" + lower + ", " + upper + "]");
            }
        } else if (failureReason.isBlank()) {
            throw new IllegalArgumentException("a failure reason must not be blank");
        }
    }

    /**
     * @param estimator estimator name
     * @param target    target name
     * @param e         the estimate
     * @return a successful outcome
     */
    public static TargetOutcome success(String estimator, String target, Estimate e) {
        return new TargetOutcome(estimator, target, e.estimate(), e.lower(), e.upper(), null);
    }

    /**
     * @param estimator estimator name
     * @param target    target name
     * @param reason    why it failed
     * @return a failed outcome
     */
    public static TargetOutcome failure(String estimator, String target, String reason) {
        return new TargetOutcome(estimator, target, Double.NaN, Double.NaN, Double.NaN, reason);
    }

    /** @return true if an estimate was produced */
    public boolean succeeded() {
        return failureReason == null;
    }
}
