package org.incipit.distributions;

import java.util.List;

/**
 * A delay distribution from a named parametric family, with gradients of its log-density,
 * log-cdf and log-survival with respect to the family's natural parameters (in the order of
 * {@link DelayFamily#parameterNames()}).
 */
public interface ParametricDelay extends DelayDistribution {

    /** @return the family that made this distribution. */
    DelayFamily family();

    /** @return a copy of the natural parameters, in the family's order. */
    double[] parameters();

    /** @return the family's parameter names, in order. */
    default List<String> parameterNames() {
        return family().parameterNames();
    }

    /**
     * @param x delay in days, &gt; 0
     * @return d logDensity(x) / d parameters (new array)
     */
    double[] logDensityGradient(double x);

    /**
     * @param x delay in days, &gt; 0
     * @return d logCdf(x) / d parameters (new array)
     */
    double[] logCdfGradient(double x);

    /**
     * @param x delay in days, &ge; 0
     * @return d logSurvival(x) / d parameters (new array)
     */
    double[] logSurvivalGradient(double x);
}
