package org.incipit.core.growth;

/** Count distribution for the log-linear growth regression. */
public enum CountModel {
    /** Poisson counts: Var = &mu;. */
    POISSON,
    /**
     * Negative binomial, NB2 parametrisation: Var = &mu; + &mu;&sup2;/k, with the dispersion k
     * estimated by maximum likelihood (k &rarr; &infin; is the Poisson limit).
     */
    NEGATIVE_BINOMIAL
}
