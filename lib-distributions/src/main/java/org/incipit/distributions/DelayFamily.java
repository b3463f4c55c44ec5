package org.incipit.distributions;

import java.util.List;

/**
 * A parametric family of delay distributions: builds members from a parameter vector or from a
 * mean and standard deviation. Implementations are immutable singletons; the built-in ones are
 * {@link DelayFamilies#GAMMA}, {@link DelayFamilies#WEIBULL} and {@link DelayFamilies#LOGNORMAL}.
 */
public interface DelayFamily {

    /** Where a natural parameter lives; estimators map it to an unconstrained scale. */
    enum Domain {
        /** (0, &infin;): estimated on the log scale. */
        POSITIVE,
        /** (&minus;&infin;, &infin;): estimated as it is. */
        REAL
    }

    /** @return lower-case family name as used in output: "gamma", "weibull", "lognormal". */
    String name();

    /** @return natural parameter names in order, e.g. ["shape", "rate"]. */
    List<String> parameterNames();

    /** @return the domain of each natural parameter, same order. */
    List<Domain> parameterDomains();

    /** @return number of parameters. */
    default int dimension() {
        return parameterNames().size();
    }

    /**
     * @param parameters natural parameters in order (not modified)
     * @return the distribution
     * @throws IllegalArgumentException naming the parameter if one is out of its domain
     */
    ParametricDelay of(double... parameters);

    /**
     * @param mean mean delay in days, finite and &gt; 0
     * @param sd   standard deviation in days, finite and &gt; 0
     * @return the member with that mean and sd
     * @throws IllegalArgumentException if no member has them (saying why)
     */
    ParametricDelay ofMeanSd(double mean, double sd);
}
