package org.incipit.core.estimate.delay;

import java.util.List;

import org.incipit.core.likelihood.Maximiser;

/**
 * Options shared by the delay estimators.
 *
 * @param level       coverage of every interval, in (0, 1)
 * @param quantiles   probabilities in (0, 1) at which quantiles are reported (copied)
 * @param maximiser   the maximiser
 */
public record DelayOptions(double level, List<Double> quantiles, Maximiser maximiser) {

    /** Default quantile probabilities: 0.025, 0.05, 0.25, 0.5, 0.75, 0.95, 0.975. */
    public static final List<Double> DEFAULT_QUANTILES = List.of(0.025, 0.05, 0.25, 0.5, 0.75, 0.95, 0.975);

    public DelayOptions {
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
        if (quantiles == null) {
            throw new IllegalArgumentException("quantiles must not be null");
        }
        quantiles = List.copyOf(quantiles);
        for (double p : quantiles) {
            if (!(p > 0 && p < 1)) {
                throw new IllegalArgumentException("quantile probabilities must be in (0, 1), was " + p);
            }
        }
        if (maximiser == null) {
            throw new IllegalArgumentException("maximiser must not be null");
        }
    }

    /**
     * @return level 0.95, {@link #DEFAULT_QUANTILES}, the engine's Newton maximiser (analytic
     *     Hessian where the likelihood has one, else differences of the analytic gradient)
     */
    public static DelayOptions defaults() {
        return new DelayOptions(0.95, DEFAULT_QUANTILES, Maximiser.newton());
    }

    /** @param level coverage in (0, 1) @return a copy with that level */
    public DelayOptions withLevel(double level) {
        return new DelayOptions(level, quantiles, maximiser);
    }

    /** @param probabilities quantile probabilities in (0, 1) @return a copy reporting those quantiles */
    public DelayOptions withQuantiles(List<Double> probabilities) {
        return new DelayOptions(level, probabilities, maximiser);
    }
}
