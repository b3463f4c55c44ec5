/**
 * Delay distributions on [0, &infin;): gamma, Weibull and lognormal families, exponential
 * tilting, daily discretisation, Laplace transforms and parameter gradients. Pure functions of
 * numbers: no I/O, no logging, no stored randomness.
 */
package org.incipit.distributions;
