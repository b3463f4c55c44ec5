package org.incipit.core.estimate.delay;

/**
 * The incubation period fitted under the three exposure models, side by side.
 *
 * @param intervalCensored fit under {@link ExposureWindowModel#intervalCensored()}
 * @param uniform          fit under {@link ExposureWindowModel#uniform()}
 * @param growing          fit under {@link ExposureWindowModel#growing(double)}
 */
public record IncubationVariants(DelayFit intervalCensored, DelayFit uniform, DelayFit growing) {
    public IncubationVariants {
        if (intervalCensored == null || uniform == null || growing == null) {
            throw new IllegalArgumentException("all three fits are required");
        }
    }
}
