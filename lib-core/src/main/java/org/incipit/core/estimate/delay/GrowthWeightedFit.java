package org.incipit.core.estimate.delay;

import java.util.List;

import org.incipit.core.inference.Estimate;

/**
 * A growth-weighted delay fit whose intervals also carry the growth rate's uncertainty.
 *
 * @param conditional the fit at the point estimate of r (intervals conditional on r)
 * @param growthRate  the growth rate used, per day, with its interval
 * @param parameters  natural parameters with intervals widened for r's uncertainty
 * @param mean        mean delay in days, interval widened for r's uncertainty
 * @param sd          sd in days, interval widened for r's uncertainty
 */
public record GrowthWeightedFit(DelayFit conditional, Estimate growthRate, List<Estimate> parameters,
                                Estimate mean, Estimate sd) {
    public GrowthWeightedFit {
        if (conditional == null || growthRate == null || mean == null || sd == null) {
            throw new IllegalArgumentException("conditional, growthRate, mean and sd must not be null");
        }
        parameters = List.copyOf(parameters);
    }
}
