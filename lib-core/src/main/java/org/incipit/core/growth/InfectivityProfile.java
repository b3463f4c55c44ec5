package org.incipit.core.growth;

import java.util.Arrays;
import org.incipit.distributions.DailyMasses;

/**
 * Daily weights w<sub>s</sub> of the discrete renewal equation, s = 0, 1, ... (index = days
 * since infection of the infector), with the convention w<sub>0</sub> = 0 (no one infects on the
 * day of their own infection, Cori et al. 2013, Am J Epidemiol 178, appendix) and
 * &Sigma; w<sub>s</sub> = 1.
 *
 * @param weights weights, w[0] == 0, non-negative, sum 1 within 1e-9 (copied in and out)
 */
public record InfectivityProfile(double[] weights) {

    public InfectivityProfile {
        if (weights == null || weights.length < 2) {
            throw new IllegalArgumentException("weights must cover at least days 0 and 1");
        }
        weights = weights.clone();
        if (weights[0] != 0) {
            throw new IllegalArgumentException("weights[0] must be 0 (renewal convention w_0 = 0), "
                    + "was " + weights[0] + "; use fromMasses to drop a day-0 mass");
        }
        double sum = 0;
        for (int s = 0; s < weights.length; s++) {
            if (!(weights[s] >= 0 && weights[s] < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("weights[" + s + "] must be finite and >= 0, was "
                        + weights[s]);
            }
            sum += weights[s];
        }
        if (!(Math.abs(sum - 1) <= 1e-9)) {
            throw new IllegalArgumentException("weights must sum to 1 within 1e-9, sum was " + sum
                    + "; use normalised");
        }
    }

    /**
     * @param weights w<sub>s</sub> with w[0] == 0, any positive sum (not modified)
     * @return the profile with weights divided by their sum
     * @throws IllegalArgumentException if w[0] != 0, a weight is negative or the sum is 0
     */
    public static InfectivityProfile normalised(double[] weights) {
        if (weights == null || weights.length < 2) {
            throw new IllegalArgumentException("weights must cover at least days 0 and 1");
        }
        double sum = 0;
        for (double w : weights) {
            sum += w;
        }
        if (!(sum > 0 && sum < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("weights must have a finite positive sum, was " + sum);
        }
        double[] w = new double[weights.length];
        for (int s = 0; s < w.length; s++) {
            w[s] = weights[s] / sum;
        }
        return new InfectivityProfile(w);
    }

    /**
     * From daily masses: the day-0 mass and the tail are dropped and the masses of days
     * 1 .. n&minus;1 renormalised (i.e. the distribution conditioned on an interval of at least one
     * day, within the days kept).
     *
     * @param masses daily masses with some mass on days &ge; 1
     * @return the profile
     * @throws IllegalArgumentException if no mass lies on days &ge; 1
     */
    public static InfectivityProfile fromMasses(DailyMasses masses) {
        if (masses == null) {
            throw new IllegalArgumentException("masses must not be null");
        }
        double[] w = masses.masses();
        if (w.length < 2) {
            throw new IllegalArgumentException("masses must cover day 1 or later, had " + w.length
                    + " day(s)");
        }
        w[0] = 0;
        return normalised(w);
    }

    @Override
    public double[] weights() {
        return weights.clone();
    }

    /** @return w<sub>s</sub>, 0 beyond the last day. */
    public double weight(int s) {
        return s >= 0 && s < weights.length ? weights[s] : 0;
    }

    /** @return number of days covered (last day + 1). */
    public int length() {
        return weights.length;
    }

    /** @return mean &Sigma; s w<sub>s</sub> in days. */
    public double mean() {
        double m = 0;
        for (int s = 0; s < weights.length; s++) {
            m += s * weights[s];
        }
        return m;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof InfectivityProfile p && Arrays.equals(weights, p.weights);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(weights);
    }

    @Override
    public String toString() {
        return "InfectivityProfile" + Arrays.toString(weights);
    }
}
