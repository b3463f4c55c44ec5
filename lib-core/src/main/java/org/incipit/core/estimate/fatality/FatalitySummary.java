package org.incipit.core.estimate.fatality;

import org.incipit.core.inference.Estimate;

/**
 * Crude, resolved-only and delay-adjusted fatality ratios side by side, all at the same level.
 *
 * @param crude            D(T) / C(T), biased low while deaths are still to come
 * @param resolvedOnly     D / (D + Rec), biased when the times to death and to recovery differ
 * @param windowAdjusted   D(T) / &Sigma; c_t F_D(T &minus; t + 1)
 * @param resolvedAdjusted joint estimate from deaths and recoveries with both delays
 */
public record FatalitySummary(Estimate crude, Estimate resolvedOnly, Estimate windowAdjusted,
                              Estimate resolvedAdjusted) {
    public FatalitySummary {
        if (crude == null || resolvedOnly == null || windowAdjusted == null || resolvedAdjusted == null) {
            throw new IllegalArgumentException("all four estimates are required");
        }
    }
}
