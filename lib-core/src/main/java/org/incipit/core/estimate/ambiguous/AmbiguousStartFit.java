package org.incipit.core.estimate.ambiguous;

import java.util.List;

import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;
import org.incipit.core.likelihood.MaximumLikelihoodFit;

/**
 * Maximum-likelihood fit of an ambiguous-start interval distribution H (a parametric family)
 * together with the transmission probabilities p per contact category.
 *
 * <p>Intervals, as chosen by {@link AmbiguousStartEstimator.Options#intervals()} and named by
 * each {@link Estimate#method()}: profile likelihood ("profile"), or Wald on the estimation
 * scale (log for positive parameters, logit for p) mapped back ("wald-log", "wald-logit") and
 * the delta method on the log scale for the mean, sd and quantiles of H ("delta-log"). If the fit did not
 * reach an interior maximum with a positive-definite observed information ({@link #converged()}
 * false, e.g. p&#770; on the boundary 0 or 1, which a wrong exposure-history model produces),
 * every interval is the whole parameter domain with method
 * {@value #NO_INTERVAL} and {@link #message()} says why; the point estimates are then the
 * point where the maximiser stopped (for a boundary maximum, a point whose log-likelihood is
 * within rounding of the supremum).
 *
 * @param family          "gamma", "weibull" or "lognormal"
 * @param history         the exposure-history model used for P(case)
 * @param parameterNames  the family's natural parameter names
 * @param parameters      estimates and intervals of the family parameters, same order
 * @param categories      category labels, one per transmission probability
 * @param transmission    p per category, same order
 * @param mean            mean of H in days
 * @param sd              standard deviation of H in days
 * @param quantileLevels  probabilities of the reported quantiles
 * @param quantiles       quantiles of H in days, same order
 * @param logLikelihood   maximised log-likelihood (conditional on being a case, per the history)
 * @param aic             2k &minus; 2 log-likelihood
 * @param cases           number of cases n
 * @param candidates      number of candidate starts before the end
 * @param converged       true if an interior maximum (every p more than 1e-6 from 0 and 1) with
 *                        positive-definite information was found
 * @param message         the maximiser's message
 * @param fit             the engine fit (profile intervals, covariance, AICc, BIC)
 */
public record AmbiguousStartFit(String family, ExposureHistory history, List<String> parameterNames,
                                List<Estimate> parameters, List<String> categories, List<Estimate> transmission,
                                Estimate mean, Estimate sd, List<Double> quantileLevels, List<Estimate> quantiles,
                                double logLikelihood, double aic, int cases, int candidates, boolean converged,
                                String message, MaximumLikelihoodFit fit) {

    /** Method label of the intervals of a fit without usable information. */
    public static final String NO_INTERVAL = "none (no interior maximum with positive-definite information)";

    /** Validates and copies the lists. */
    public AmbiguousStartFit {
        if (family == null || history == null || mean == null || sd == null || fit == null || message == null) {
            throw new IllegalArgumentException("family, history, mean, sd, message and fit must not be null");
        }
        parameterNames = List.copyOf(parameterNames);
        parameters = List.copyOf(parameters);
        categories = List.copyOf(categories);
        transmission = List.copyOf(transmission);
        quantileLevels = List.copyOf(quantileLevels);
        quantiles = List.copyOf(quantiles);
        if (parameterNames.size() != parameters.size() || categories.size() != transmission.size()
                || quantileLevels.size() != quantiles.size()) {
            throw new IllegalArgumentException("names and estimates must pair up: " + parameterNames.size() + "/"
                    + parameters.size() + ", " + categories.size() + "/" + transmission.size() + ", "
                    + quantileLevels.size() + "/" + quantiles.size());
        }
        if (cases < 1 || candidates < cases) {
            throw new IllegalArgumentException("cases must be >= 1 and candidates >= cases, were " + cases + ", "
                    + candidates);
        }
        if (Double.isNaN(logLikelihood)) {
            throw new IllegalArgumentException("logLikelihood must not be NaN");
        }
    }

    /**
     * @param name a family parameter name
     * @return its estimate
     * @throws IllegalArgumentException if unknown
     */
    public Estimate parameter(String name) {
        int i = parameterNames.indexOf(name);
        if (i < 0) {
            throw new IllegalArgumentException("unknown parameter '" + name + "', known: " + parameterNames);
        }
        return parameters.get(i);
    }

    /** @return the transmission probability of the only category */
    public Estimate p() {
        if (transmission.size() != 1) {
            throw new IllegalStateException("fit has " + transmission.size() + " categories; use transmission()");
        }
        return transmission.get(0);
    }

    /**
     * @return this fit, if {@link #converged()}
     * @throws EstimationException with the message otherwise
     */
    public AmbiguousStartFit requireConverged() {
        if (!converged) {
            throw new EstimationException(family + " fit under the " + history.label() + " exposure history: " + message);
        }
        return this;
    }
}
