package org.incipit.core.branching;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.DiscreteSampler;

/**
 * The law of the number of people one case infects (the offspring distribution of a
 * Galton&ndash;Watson branching process), with its probability generating function (pgf)
 * f(s) = E[s<sup>Z</sup>], the extinction probability and survival-conditioned generation sizes.
 *
 * <p>Two families: {@link #poisson(double)} and {@link #negativeBinomial(double, double)}.
 * Values are immutable and thread-safe; randomness enters only as an argument.
 *
 * <h2>Extinction</h2>
 * The extinction probability q of the process started by one case is the smallest root of
 * f(s) = s in [0, 1] (Harris 1963, <i>The Theory of Branching Processes</i>, Thm I.6.1): q = 1
 * when R &le; 1, q &lt; 1 when R &gt; 1. It is computed in the variable u = 1 &minus; s: the
 * function &phi;(u) = (1 &minus; f(1 &minus; u)) / u, the slope of the chord of the concave
 * function 1 &minus; f(1 &minus; u) from 0, decreases from &phi;(0+) = R to &phi;(1) =
 * 1 &minus; f(0), and the non-trivial root is the unique solution of &phi;(u) = 1. Dividing by u
 * removes the trivial root at s = 1, so the bracket [0, 1] is valid however close R is to 1,
 * and &phi;(u) &minus; 1 is evaluated as (R &minus; 1) minus non-negative remainders
 * (x + expm1(&minus;x), a &minus; log1p(a)) summed by their Taylor series where small, so its
 * sign is right even for R &minus; 1 ~ 1e-6 and k ~ 1e-3 (relative error of q and of 1 &minus; q
 * below 1e-14 on the test grid). The root is found by bisection to the last bit, then, when q &lt; 1/2, polished
 * by Newton steps on f(s) &minus; s in the original variable so that small q keeps its relative
 * accuracy.
 */
public abstract sealed class OffspringLaw permits PoissonOffspring, NegativeBinomialOffspring {

    private final double mean;
    /** Dispersion k; +infinity for the Poisson. Set before the root is solved. */
    private final double k;
    /** u = 1 - q, computed once. */
    private final double survival;
    private final double extinction;

    OffspringLaw(double mean, double dispersion) {
        this.mean = mean;
        this.k = dispersion;
        double[] uq = solveExtinction();
        this.survival = uq[0];
        this.extinction = uq[1];
    }

    /**
     * Poisson offspring law with mean R.
     *
     * @param meanOffspring R, finite and &ge; 0
     * @return the law
     * @throws IllegalArgumentException if R is negative, infinite or NaN
     */
    public static PoissonOffspring poisson(double meanOffspring) {
        return new PoissonOffspring(checkMean(meanOffspring));
    }

    /**
     * Negative binomial offspring law with mean R and dispersion k: variance R + R&sup2;/k,
     * pgf f(s) = (1 + R(1 &minus; s)/k)<sup>&minus;k</sup> (Lloyd-Smith et al. 2005, Nature 438:355).
     * Small k means strong superspreading; k = 1 is the geometric law; k &rarr; &infin; tends
     * to the Poisson.
     *
     * @param meanOffspring R, finite and &ge; 0
     * @param dispersion    k, finite and &gt; 0
     * @return the law
     * @throws IllegalArgumentException if a parameter is out of range
     */
    public static NegativeBinomialOffspring negativeBinomial(double meanOffspring, double dispersion) {
        checkMean(meanOffspring);
        if (!(dispersion > 0 && dispersion < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(
                "dispersion must be finite and > 0, was " + dispersion);
        }
        return new NegativeBinomialOffspring(meanOffspring, dispersion);
    }

    private static double checkMean(double r) {
        if (!(r >= 0 && r < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("meanOffspring must be finite and >= 0, was " + r);
        }
        return r;
    }

    /** @return short lower-case family name: {@code "poisson"} or {@code "negative-binomial"}. */
    public abstract String familyName();

    /** @return the mean number of offspring R. */
    public final double mean() {
        return mean;
    }

    /** @return the variance of the number of offspring. */
    public abstract double variance();

    /**
     * The probability generating function f(s) = E[s<sup>Z</sup>].
     *
     * @param s argument in [0, 1]
     * @return f(s)
     * @throws IllegalArgumentException if s is outside [0, 1] or NaN
     */
    public final double pgf(double s) {
        checkUnit(s);
        return 1 - complementPgf(1 - s);
    }

    /**
     * The derivative f'(s) = E[Z s<sup>Z&minus;1</sup>] of the pgf; f'(1) = R.
     *
     * @param s argument in [0, 1]
     * @return f'(s)
     * @throws IllegalArgumentException if s is outside [0, 1] or NaN
     */
    public final double pgfDerivative(double s) {
        checkUnit(s);
        return pgfDerivativeAt(1 - s);
    }

    /**
     * A sampler of offspring counts drawing from {@code rng}. The sampler holds {@code rng} and
     * is for one thread; the law itself stores no randomness. Poisson counts come from
     * commons-rng's {@code PoissonSampler}. Negative binomial counts are drawn by inversion
     * (sequential search on the mass recurrence) when R &lt; 50, else as a gamma&ndash;Poisson
     * mixture (Poisson with a Gamma(k, R/k) mean); both are exact.
     *
     * @param rng source of randomness, used by the returned sampler
     * @return sampler of non-negative offspring counts
     */
    public abstract DiscreteSampler sampler(UniformRandomProvider rng);

    /**
     * Draws one offspring count. For many draws use {@link #sampler(UniformRandomProvider)}.
     *
     * @param rng source of randomness (not stored)
     * @return a non-negative count
     */
    public final int sample(UniformRandomProvider rng) {
        return sampler(rng).sample();
    }

    /**
     * The probability q that the process started by one case dies out: the smallest root of
     * f(s) = s in [0, 1]; exactly 1 when R &le; 1. See the class description for the algorithm.
     *
     * @return q in [0, 1]
     */
    public final double extinctionProbability() {
        return extinction;
    }

    /**
     * The probability 1 &minus; q that the process started by one case never dies out,
     * computed directly (not as 1 &minus; q) so that it stays accurate when q is close to 1.
     *
     * @return 1 &minus; q in [0, 1]
     */
    public final double survivalProbability() {
        return survival;
    }

    /**
     * The probability 1 &minus; q<sup>n</sup> that at least one of n independent introductions
     * starts a process that never dies out (a major outbreak), computed as
     * &minus;expm1(n log1p(&minus;(1 &minus; q))).
     *
     * @param introductions n &ge; 0
     * @return 1 &minus; q<sup>n</sup>
     * @throws IllegalArgumentException if n is negative
     */
    public final double majorOutbreakProbability(int introductions) {
        if (introductions < 0) {
            throw new IllegalArgumentException("introductions must be >= 0, was " + introductions);
        }
        if (introductions == 0 || survival == 0) {
            return 0;
        }
        if (survival == 1) {
            return 1;
        }
        return -Math.expm1(introductions * Math.log1p(-survival));
    }

    /**
     * The unconditioned expected size of generation n from one case, E[Z<sub>n</sub>] =
     * R<sup>n</sup> (generation 0 is the initial case).
     *
     * @param generation n &ge; 0
     * @return R<sup>n</sup>
     * @throws IllegalArgumentException if n is negative
     */
    public final double meanGenerationSize(int generation) {
        checkGeneration(generation);
        return Math.pow(mean, generation);
    }

    /**
     * The expected size of generation n from one case, conditioned on the process never dying
     * out:
     * <pre>
     *   E[Z_n | survival] = (R^n &minus; q f'(q)^n) / (1 &minus; q)  &rarr;  R^n / (1 &minus; q).
     * </pre>
     * Derivation (Athreya and Ney 1972, <i>Branching Processes</i>, ch. I, for the facts used):
     * extinction is the event that every one of the Z<sub>n</sub> lines dies out, so
     * P(extinction | Z<sub>n</sub>) = q<sup>Z<sub>n</sub></sup> and
     * E[Z<sub>n</sub>; survival] = E[Z<sub>n</sub>] &minus; E[Z<sub>n</sub>; extinction]
     * = R<sup>n</sup> &minus; E[Z<sub>n</sub> q<sup>Z<sub>n</sub></sup>]. With f<sub>n</sub> the
     * n-fold composition of f (the pgf of Z<sub>n</sub>), E[Z<sub>n</sub> s<sup>Z<sub>n</sub></sup>]
     * = s f<sub>n</sub>'(s), and by the chain rule with f(q) = q, f<sub>n</sub>'(q) = f'(q)<sup>n</sup>.
     * Dividing by P(survival) = 1 &minus; q gives the formula. Since f'(q) &lt; 1 the second
     * term vanishes geometrically. Example: Poisson R = 1.5, n = 1 gives R(1 + q) &asymp; 2.13.
     *
     * <p>Evaluated without cancellation as R<sup>n</sup> (&minus;expm1(log q + n log(f'(q)/R)))
     * / (1 &minus; q), with log q = log1p(&minus;(1 &minus; q)) and log(f'(q)/R) written in closed form
     * for each family.
     *
     * @param generation n &ge; 0 (n = 0 gives 1)
     * @return the conditioned mean, &ge; {@link #meanGenerationSize(int)}
     * @throws IllegalArgumentException if n is negative, or if R &le; 1 (extinction is then
     *         certain and the condition has probability 0)
     */
    public final double conditionedMeanGenerationSize(int generation) {
        checkGeneration(generation);
        if (!(survival > 0)) {
            throw new IllegalArgumentException("conditioning on survival needs meanOffspring > 1 "
                + "(survival probability > 0), was meanOffspring " + mean);
        }
        if (generation == 0) {
            return 1;
        }
        double logQ = Math.log1p(-survival);
        double exponent = logQ + generation * logDerivativeRatioAtRoot(survival, logQ);
        double head = Math.pow(mean, generation);
        return head * (-Math.expm1(exponent)) / survival;
    }

    private static void checkGeneration(int n) {
        if (n < 0) {
            throw new IllegalArgumentException("generation must be >= 0, was " + n);
        }
    }

    private static void checkUnit(double s) {
        if (!(s >= 0 && s <= 1)) {
            throw new IllegalArgumentException("s must be in [0, 1], was " + s);
        }
    }

    /** @return the dispersion k, +infinity for the Poisson; usable during construction. */
    final double dispersionOf() {
        return k;
    }

    /** @return 1 - f(1 - u), for u in [0, 1], accurate for small u. */
    abstract double complementPgf(double u);

    /**
     * &phi;(u) &minus; 1 = (1 &minus; f(1 &minus; u) &minus; u)/u, written as (R &minus; 1) minus
     * non-negative terms evaluated by series where they are small, so that the sign is right
     * even when R &minus; 1 and u are tiny (R &minus; 1 is exact for R in [0.5, 2]).
     */
    abstract double chordExcess(double u);

    /** @return x + expm1(-x) = x^2/2 - x^3/6 + ..., accurate for x &ge; 0. */
    static double expTail(double x) {
        if (x < 1) {
            double term = x * x / 2;
            double sum = 0;
            for (int n = 3; n < 40 && term != 0; n++) {
                sum += term;
                term *= -x / n;
                if (Math.abs(term) < 1e-18 * sum) {
                    break;
                }
            }
            return sum;
        }
        return x + Math.expm1(-x);
    }

    /** @return a - log1p(a) = a^2/2 - a^3/3 + ..., accurate for a &ge; 0. */
    static double logTail(double a) {
        if (a < 0.5) {
            double power = a * a;
            double sum = 0;
            for (int n = 2; n < 80; n++) {
                double term = power / n;
                sum += (n % 2 == 0) ? term : -term;
                if (term < 1e-18 * sum) {
                    break;
                }
                power *= a;
            }
            return sum;
        }
        return a - Math.log1p(a);
    }

    /** @return f(s) computed directly in s (accurate relative to f when f is small). */
    abstract double directPgf(double s);

    /** @return f'(1 - u). */
    abstract double pgfDerivativeAt(double u);

    /**
     * @param u    1 - q at the root
     * @param logQ log q
     * @return log(f'(q) / R), using f(q) = q
     */
    abstract double logDerivativeRatioAtRoot(double u, double logQ);

    /** @return {u, q}: survival and extinction probability. */
    private double[] solveExtinction() {
        if (!(mean > 1)) {
            return new double[] {0, 1};
        }
        // phi(u) = (1 - f(1-u))/u decreases from R (u -> 0+) to 1 - f(0) (u = 1);
        // the root of phi(u) = 1 is the non-trivial fixed point. Bisection to the last bit.
        double lo = 0;   // phi(lo) > 1 (limit R > 1)
        double hi = 1;
        if (complementPgf(1) >= 1) { // f(0) underflows to 0: q = 0
            return new double[] {1, 0};
        }
        for (int i = 0; i < 2000; i++) {
            double mid = 0.5 * (lo + hi);
            if (mid <= lo || mid >= hi) {
                break;
            }
            if (chordExcess(mid) > 0) { // phi(mid) > 1: root above mid
                lo = mid;
            } else {
                hi = mid;
            }
        }
        double u = 0.5 * (lo + hi);
        double q = 1 - u;
        if (q < 0.5) {
            // Newton on g(s) = f(s) - s in s, to keep relative accuracy of a small q;
            // f'(q) < 1 at the attracting root, so g' = f' - 1 is bounded away from 0 here.
            for (int i = 0; i < 8; i++) {
                double g = directPgf(q) - q;
                double step = g / (pgfDerivativeAt(1 - q) - 1);
                double next = q - step;
                if (!(next >= 0 && next < 1)) {
                    break;
                }
                boolean done = Math.abs(next - q) <= 2 * Math.ulp(q);
                q = next;
                if (done) {
                    break;
                }
            }
            u = 1 - q;
        }
        return new double[] {u, q};
    }
}
