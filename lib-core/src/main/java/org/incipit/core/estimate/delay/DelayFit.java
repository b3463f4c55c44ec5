package org.incipit.core.estimate.delay;

import java.util.List;

import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;
import org.incipit.core.inference.ModelComparison;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.ParametricDelay;

/**
 * A fitted parametric delay distribution: natural parameters, mean, standard deviation and
 * quantiles, each with an interval, and the maximised log-likelihood.
 *
 * <p>Intervals: parameters by Wald on the estimation scale (log for positive parameters,
 * mapped back); mean, sd and quantiles by the delta method on the log scale
 * ({@link MaximumLikelihoodFit#delta}). If the fit did not converge ({@link #converged()} false)
 * the point values are those where the maximiser stopped and every interval is
 * (&minus;&infin;, &infin;) with method {@code "unavailable"}: read {@link #message()}.
 *
 * @param family         the family
 * @param parameterNames natural parameter names, in order
 * @param parameters     natural parameter estimates, same order
 * @param mean           mean delay in days
 * @param sd             standard deviation in days
 * @param quantiles      quantiles in days at the probabilities of the options
 * @param logLikelihood  maximised log-likelihood (the likelihood's own scale; see the estimator)
 * @param aic            2k &minus; 2 logLikelihood
 * @param observations   number of observations n
 * @param status         the engine's fit status
 * @param message        maximiser message
 * @param fit            the underlying engine fit (profile intervals, covariance, ...)
 */
public record DelayFit(DelayFamily family, List<String> parameterNames, List<Estimate> parameters,
                       Estimate mean, Estimate sd, List<QuantileEstimate> quantiles,
                       double logLikelihood, double aic, int observations,
                       MaximumLikelihoodFit.Status status, String message, MaximumLikelihoodFit fit) {

    public DelayFit {
        if (family == null || fit == null || status == null) {
            throw new IllegalArgumentException("family, fit and status must not be null");
        }
        parameterNames = List.copyOf(parameterNames);
        parameters = List.copyOf(parameters);
        quantiles = List.copyOf(quantiles);
        if (parameters.size() != parameterNames.size()) {
            throw new IllegalArgumentException("one estimate per parameter required, got " + parameters.size()
                    + " for " + parameterNames.size());
        }
    }

    /** @return true if the maximiser converged and the information is positive definite */
    public boolean converged() {
        return status == MaximumLikelihoodFit.Status.CONVERGED;
    }

    /** @param name a natural parameter name @return its estimate */
    public Estimate parameter(String name) {
        int i = parameterNames.indexOf(name);
        if (i < 0) {
            throw new IllegalArgumentException("unknown parameter '" + name + "', known: " + parameterNames);
        }
        return parameters.get(i);
    }

    /** @return the fitted distribution at the point estimate */
    public ParametricDelay distribution() {
        return family.of(fit.naturalEstimate());
    }

    /**
     * @param probability one of the probabilities in the options
     * @return the quantile estimate
     * @throws IllegalArgumentException if that quantile was not requested
     */
    public Estimate quantile(double probability) {
        for (QuantileEstimate q : quantiles) {
            if (q.probability() == probability) {
                return q.value();
            }
        }
        throw new IllegalArgumentException("quantile " + probability + " was not requested; requested "
                + quantiles.stream().map(QuantileEstimate::probability).toList());
    }

    /**
     * @return this fit as a candidate for {@link ModelComparison}, named by the family
     * @throws EstimationException if the fit did not converge
     */
    public ModelComparison.Candidate candidate() {
        return fit.candidate(family.name());
    }
}
