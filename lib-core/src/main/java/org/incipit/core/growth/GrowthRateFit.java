package org.incipit.core.growth;

import java.util.List;
import java.util.Optional;
import org.incipit.core.inference.Estimate;

/**
 * Result of a log-linear growth-rate fit, log E[c<sub>t</sub>] = a + r t (+ day-of-week
 * effects), t the day number.
 *
 * <p>Coefficients are named {@code "intercept"} (log expected count at day 0),
 * {@code "rate"} (r, per day) and {@code "dow<j>"} (log rate ratio of days with
 * {@code floorMod(day, 7) == j} against the reference residue).
 *
 * <p>Doubling and halving times come from the profile interval of r: doubling time ln 2 / r
 * exists only for r &gt; 0, with interval [ln 2 / r<sub>upper</sub>, ln 2 / r<sub>lower</sub>];
 * if r<sub>lower</sub> &le; 0 the upper bound is {@code +Infinity} (the data do not exclude
 * no growth). Halving time ln 2 / |r| likewise for r &lt; 0.
 *
 * @param model              count model fitted
 * @param firstDay           first day of the window
 * @param lastDay            last day of the window
 * @param days               number of days with an observation in the window
 * @param coefficientNames   names, in order (copied)
 * @param coefficients       ML estimates (copied)
 * @param standardErrors     Wald standard errors from the inverse Fisher information of the
 *                           coefficients at the fitted k (copied)
 * @param rateWald           r with Wald interval r &plusmn; z se
 * @param rateProfile        r with profile-likelihood interval (k re-maximised for NB)
 * @param dispersion         NB2 dispersion k (Var = &mu; + &mu;&sup2;/k); +&infin; for Poisson
 * @param logLikelihood      maximised log-likelihood (full, with the log y! terms)
 * @param deviance           residual deviance (at the fitted k for NB)
 * @param pearsonDispersion  Pearson X&sup2; / (days &minus; number of coefficients)
 * @param iterations         total IRLS iterations
 * @param converged          whether the iterations met their tolerance
 */
public record GrowthRateFit(CountModel model, int firstDay, int lastDay, int days,
                            List<String> coefficientNames, double[] coefficients,
                            double[] standardErrors, Estimate rateWald, Estimate rateProfile,
                            double dispersion, double logLikelihood, double deviance,
                            double pearsonDispersion, int iterations, boolean converged) {

    private static final double LN2 = Math.log(2);

    public GrowthRateFit {
        if (model == null || coefficientNames == null || coefficients == null
                || standardErrors == null || rateWald == null || rateProfile == null) {
            throw new IllegalArgumentException("fit components must not be null");
        }
        coefficientNames = List.copyOf(coefficientNames);
        coefficients = coefficients.clone();
        standardErrors = standardErrors.clone();
        if (coefficients.length != coefficientNames.size()
                || standardErrors.length != coefficientNames.size()) {
            throw new IllegalArgumentException("coefficient arrays must match the names, sizes "
                    + coefficients.length + ", " + standardErrors.length + " vs "
                    + coefficientNames.size());
        }
        if (!(dispersion > 0)) {
            throw new IllegalArgumentException("dispersion must be > 0, was " + dispersion);
        }
    }

    @Override
    public double[] coefficients() {
        return coefficients.clone();
    }

    @Override
    public double[] standardErrors() {
        return standardErrors.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof GrowthRateFit f && model == f.model && firstDay == f.firstDay
                && lastDay == f.lastDay && days == f.days
                && coefficientNames.equals(f.coefficientNames)
                && java.util.Arrays.equals(coefficients, f.coefficients)
                && java.util.Arrays.equals(standardErrors, f.standardErrors)
                && rateWald.equals(f.rateWald) && rateProfile.equals(f.rateProfile)
                && Double.compare(dispersion, f.dispersion) == 0
                && Double.compare(logLikelihood, f.logLikelihood) == 0
                && Double.compare(deviance, f.deviance) == 0
                && Double.compare(pearsonDispersion, f.pearsonDispersion) == 0
                && iterations == f.iterations && converged == f.converged;
    }

    @Override
    public int hashCode() {
        return java.util.Objects.hash(model, firstDay, lastDay, days, coefficientNames,
                java.util.Arrays.hashCode(coefficients), rateProfile, logLikelihood);
    }

    @Override
    public String toString() {
        return "GrowthRateFit[" + model + " days " + firstDay + ".." + lastDay + " (n=" + days
                + "), " + coefficientNames + "=" + java.util.Arrays.toString(coefficients)
                + ", se=" + java.util.Arrays.toString(standardErrors) + ", rate " + rateProfile
                + ", k=" + dispersion + ", logLik=" + logLikelihood + ", deviance=" + deviance
                + ", converged=" + converged + "]";
    }

    /** @return the growth rate r per day (ML estimate). */
    public double rate() {
        return rateProfile.estimate();
    }

    /**
     * @param name coefficient name
     * @return its estimate
     * @throws IllegalArgumentException if there is no such coefficient
     */
    public double coefficient(String name) {
        return coefficients[indexOf(name)];
    }

    /**
     * @param name coefficient name
     * @return its standard error
     * @throws IllegalArgumentException if there is no such coefficient
     */
    public double standardError(String name) {
        return standardErrors[indexOf(name)];
    }

    private int indexOf(String name) {
        int i = coefficientNames.indexOf(name);
        if (i < 0) {
            throw new IllegalArgumentException("no coefficient named " + name + "; have "
                    + coefficientNames);
        }
        return i;
    }

    /**
     * Doubling time ln 2 / r in days, interval from the profile interval of r.
     *
     * @return empty if r &le; 0; else the estimate, upper bound +&infin; when the r interval
     *         reaches 0
     */
    public Optional<Estimate> doublingTime() {
        return timeScale(rateProfile.estimate(), rateProfile.lower(), rateProfile.upper());
    }

    /**
     * Halving time ln 2 / |r| in days, for declining counts.
     *
     * @return empty if r &ge; 0; else the estimate, upper bound +&infin; when the r interval
     *         reaches 0
     */
    public Optional<Estimate> halvingTime() {
        return timeScale(-rateProfile.estimate(), -rateProfile.upper(), -rateProfile.lower());
    }

    private Optional<Estimate> timeScale(double r, double lo, double hi) {
        if (!(r > 0)) {
            return Optional.empty();
        }
        double t = LN2 / r;
        double lower = hi == Double.POSITIVE_INFINITY ? 0 : LN2 / hi;
        double upper = lo <= 0 ? Double.POSITIVE_INFINITY : LN2 / lo;
        return Optional.of(new Estimate(t, lower, upper, rateProfile.level(),
                "profile-transformed"));
    }
}
