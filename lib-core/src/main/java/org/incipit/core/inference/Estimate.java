package org.incipit.core.inference;

/**
 * A point estimate with a confidence (or credible) interval.
 *
 * @param estimate point estimate, finite
 * @param lower    lower bound (may be -&infin;), &le; estimate
 * @param upper    upper bound (may be +&infin;), &ge; estimate
 * @param level    nominal coverage in (0, 1), e.g. 0.95
 * @param method   how the interval was made, e.g. "wald", "delta", "profile", "bootstrap-percentile"
 */
public record Estimate(double estimate, double lower, double upper, double level, String method) {

    public Estimate {
        if (!Double.isFinite(estimate)) {
            throw new IllegalArgumentException("estimate must be finite, was " + estimate);
        }
        if (Double.isNaN(lower) || Double.isNaN(upper) || lower > estimate || upper < estimate) {
            throw new IllegalArgumentException(
                    "interval must satisfy lower <= estimate <= upper, was [" + lower + ", " + upper
                            + "] around " + estimate);
        }
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
        if (method == null || method.isBlank()) {
            throw new IllegalArgumentException("method must be named");
        }
    }

    /** @return true if the interval contains {@code value}. */
    public boolean contains(double value) {
        return value >= lower && value <= upper;
    }

    /** @return upper &minus; lower. */
    public double width() {
        return upper - lower;
    }
}
