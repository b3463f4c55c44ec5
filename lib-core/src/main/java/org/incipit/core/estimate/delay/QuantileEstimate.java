package org.incipit.core.estimate.delay;

import org.incipit.core.inference.Estimate;

/**
 * A quantile of a fitted delay with its interval.
 *
 * @param probability in (0, 1)
 * @param value       the quantile in days, with interval
 */
public record QuantileEstimate(double probability, Estimate value) {
    public QuantileEstimate {
        if (!(probability > 0 && probability < 1)) {
            throw new IllegalArgumentException("probability must be in (0, 1), was " + probability);
        }
        if (value == null) {
            throw new IllegalArgumentException("value must not be null");
        }
    }
}
