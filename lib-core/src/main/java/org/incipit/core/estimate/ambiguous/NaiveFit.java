package org.incipit.core.estimate.ambiguous;

import java.util.List;

import org.incipit.core.inference.Estimate;

/**
 * A plain maximum-likelihood fit of a family to the one duration per case chosen by a
 * {@link NaiveRule}. Biased by construction (see the rule); for comparison only.
 *
 * @param rule           the rule
 * @param family         "gamma", "weibull" or "lognormal"
 * @param parameterNames natural parameter names
 * @param parameters     Wald intervals (estimation scale mapped back), same order
 * @param mean           mean of H in days, delta method on the log scale
 * @param sd             standard deviation of H in days, delta method on the log scale
 * @param logLikelihood  maximised log-likelihood of the chosen durations
 * @param aic            2k &minus; 2 log-likelihood
 * @param cases          cases used (fewer than all for {@link NaiveRule#SINGLE_ONLY})
 * @param converged      true (a non-converged fit throws instead)
 */
public record NaiveFit(NaiveRule rule, String family, List<String> parameterNames, List<Estimate> parameters,
                       Estimate mean, Estimate sd, double logLikelihood, double aic, int cases, boolean converged) {

    /** Validates and copies. */
    public NaiveFit {
        if (rule == null || family == null || mean == null || sd == null) {
            throw new IllegalArgumentException("rule, family, mean and sd must not be null");
        }
        parameterNames = List.copyOf(parameterNames);
        parameters = List.copyOf(parameters);
        if (parameterNames.size() != parameters.size()) {
            throw new IllegalArgumentException("one estimate per parameter name");
        }
        if (cases < 1) {
            throw new IllegalArgumentException("cases must be >= 1, was " + cases);
        }
    }
}
