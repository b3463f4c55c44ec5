package org.incipit.distributions;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * A continuous delay distribution on [0, &infin;), times in days.
 *
 * <p>Implementations are immutable and thread-safe. For {@code x < 0} the density is 0,
 * {@code logDensity} is {@code -Infinity}, {@code cdf} is 0 and {@code survival} is 1.
 * A NaN argument gives NaN.
 */
public interface DelayDistribution {

    /** @return short lower-case family name, e.g. {@code "gamma"}, {@code "tilted"}. */
    String familyName();

    /** @return probability density at {@code x} (days); 0 for {@code x < 0}. */
    double density(double x);

    /** @return natural log of the density; {@code -Infinity} where the density is 0. */
    double logDensity(double x);

    /** @return P(X &le; x); 0 for {@code x < 0}. */
    double cdf(double x);

    /** @return P(X &gt; x), computed directly so that it stays accurate in the upper tail. */
    double survival(double x);

    /** @return log P(X &le; x), accurate where the cdf is tiny. */
    double logCdf(double x);

    /** @return log P(X &gt; x), accurate where the survival is tiny. */
    double logSurvival(double x);

    /**
     * @param p probability in [0, 1]
     * @return the smallest x with cdf(x) &ge; p; 0 for p = 0, +&infin; for p = 1
     * @throws IllegalArgumentException if p is outside [0, 1] or NaN
     */
    double quantile(double p);

    /** @return the mean in days. */
    double mean();

    /** @return the variance in days&sup2;. */
    double variance();

    /** @return the standard deviation in days. */
    default double sd() {
        return Math.sqrt(variance());
    }

    /**
     * The Laplace transform E[exp(&minus;s X)], i.e. the moment generating function M(&minus;s).
     *
     * <p>Defined for every s &gt; {@link #laplaceAbscissa()} (and at the abscissa itself where
     * the integral converges there). Where the integral diverges (s below the abscissa, e.g. any
     * s &lt; 0 for the lognormal) the result is {@code Double.POSITIVE_INFINITY}, never a
     * finite number.
     *
     * @param s transform argument, per day; must not be NaN
     * @return E[exp(&minus;s X)], or +&infin; where it diverges
     * @throws IllegalArgumentException if s is NaN
     */
    double laplaceTransform(double s);

    /**
     * The abscissa of convergence: the infimum of the s for which {@link #laplaceTransform(double)}
     * is finite. Gamma: &minus;rate; Weibull: &minus;&infin; for shape &gt; 1, &minus;1/scale for
     * shape = 1, 0 for shape &lt; 1; lognormal: 0.
     *
     * @return abscissa, possibly {@code Double.NEGATIVE_INFINITY}
     */
    double laplaceAbscissa();

    /**
     * Exponential tilting: the distribution with density proportional to exp(&minus;r x) f(x).
     * This is how intervals look when traced backwards from cases in an epidemic growing at
     * rate r. Tilting by 0 returns this distribution; tilting by r then by s equals tilting by
     * r + s.
     *
     * @param r tilt per day; the tilted density must be normalisable, i.e.
     *          {@code laplaceTransform(r)} finite
     * @return the tilted distribution
     * @throws IllegalArgumentException if r is NaN or the transform at r is infinite
     */
    DelayDistribution tilt(double r);

    /**
     * Daily probability masses, P(D = d) for d = 0 .. maxDay, with the mass beyond maxDay
     * reported as the tail.
     *
     * @param maxDay last day kept, &ge; 0
     * @param scheme how continuous time maps to whole days
     * @return masses plus tail, which sum to 1
     */
    DailyMasses discretise(int maxDay, Discretisation scheme);

    /**
     * Draws one value.
     *
     * @param rng source of randomness (not stored)
     * @return a non-negative variate in days
     */
    double sample(UniformRandomProvider rng);
}
