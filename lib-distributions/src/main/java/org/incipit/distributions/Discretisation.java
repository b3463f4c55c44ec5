package org.incipit.distributions;

/** How a continuous delay is turned into whole-day probability masses. */
public enum Discretisation {
    /** P(D = d) = F(d + 1) &minus; F(d): the delay itself falls in [d, d + 1). */
    DAY_INTERVAL,
    /**
     * Double interval censoring: both events known only to the day, the primary event uniform
     * within its day, P(D = d) = &int;<sub>0</sub><sup>1</sup> [F(d + 1 &minus; u) &minus;
     * F(d &minus; u)] du (d = 0 includes only the part of the integral with d &minus; u &lt; 0
     * contributing F = 0).
     */
    DOUBLE_CENSORED
}
