package org.incipit.io;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;
import org.incipit.core.inference.Estimate;

/**
 * What the output contract shows of one fitted delay family; a command fills it from the
 * estimator's fit.
 *
 * @param family        lower-case family name, e.g. {@code "gamma"}
 * @param parameters    natural parameters by name in the family's order, each finite
 * @param mean          estimate of the mean delay in days
 * @param sd            estimate of the standard deviation in days
 * @param logLikelihood maximised log-likelihood, finite
 * @param aic           Akaike information criterion, finite
 * @param n             number of observations used, &ge; 1
 * @param converged     whether the maximiser reported convergence
 */
public record FitSummary(String family, Map<String, Double> parameters, Estimate mean, Estimate sd,
                         double logLikelihood, double aic, int n, boolean converged) {

    /**
     * Validates and copies the parameters, keeping their order.
     *
     * @param family        lower-case family name, e.g. {@code "gamma"}
     * @param parameters    natural parameters by name in the family's order, each finite
     * @param mean          estimate of the mean delay in days
     * @param sd            estimate of the standard deviation in days
     * @param logLikelihood maximised log-likelihood, finite
     * @param aic           Akaike information criterion, finite
     * @param n             number of observations used, &ge; 1
     * @param converged     whether the maximiser reported convergence
     * @throws IllegalArgumentException if a component is invalid
     */
    public FitSummary {
        if (family == null || family.isBlank()) {
            throw new IllegalArgumentException("family must be named");
        }
        if (parameters == null || parameters.isEmpty()) {
            throw new IllegalArgumentException("parameters must not be empty");
        }
        for (Map.Entry<String, Double> p : parameters.entrySet()) {
            if (p.getValue() == null || !Double.isFinite(p.getValue())) {
                throw new IllegalArgumentException("parameter " + p.getKey() + " must be finite, was "
                        + p.getValue());
            }
        }
        parameters = Collections.unmodifiableMap(new LinkedHashMap<>(parameters));
        if (mean == null || sd == null) {
            throw new IllegalArgumentException("mean and sd estimates are required");
        }
        if (!Double.isFinite(logLikelihood)) {
            throw new IllegalArgumentException("logLikelihood must be finite, was " + logLikelihood);
        }
        if (!Double.isFinite(aic)) {
            throw new IllegalArgumentException("aic must be finite, was " + aic);
        }
        if (n < 1) {
            throw new IllegalArgumentException("n must be >= 1, was " + n);
        }
    }
}
