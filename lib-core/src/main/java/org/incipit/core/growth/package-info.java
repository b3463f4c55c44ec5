/**
 * Epidemic growth: log-linear growth-rate regression of daily counts (Poisson and negative
 * binomial), the Euler&ndash;Lotka link between growth rate and reproduction number, and the
 * discrete renewal equation (initial R, projection, time-varying R with a conjugate gamma prior).
 */
package org.incipit.core.growth;
