/**
 * Parametric delay estimation (gamma, Weibull, lognormal): right-truncated and right-censored
 * pairs, day-level (double interval censored) pairs, interval-censored survival data,
 * growth-weighted delays, backward-traced generation intervals and incubation periods from
 * exposure windows. Results ({@link org.incipit.core.estimate.delay.DelayFit}) give parameters,
 * mean, sd and quantiles with intervals, the log-likelihood and AIC; families are compared with
 * {@link org.incipit.core.estimate.delay.DelayEstimator#compare(java.util.List)}.
 */
package org.incipit.core.estimate.delay;
