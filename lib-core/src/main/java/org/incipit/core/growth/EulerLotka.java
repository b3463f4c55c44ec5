package org.incipit.core.growth;

import org.apache.commons.numbers.rootfinder.BrentSolver;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.ZigguratSampler;
import org.apache.commons.statistics.distribution.NormalDistribution;
import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;
import org.incipit.distributions.DailyMasses;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.ParametricDelay;

/**
 * The Euler&ndash;Lotka link between the exponential growth rate r and the reproduction number
 * R for a generation-interval distribution g (Wallinga &amp; Lipsitch 2007, Proc R Soc B 274,
 * 599&ndash;604): 1 = R &int; e<sup>&minus;r t</sup> g(t) dt, i.e.
 * R = 1 / M<sub>g</sub>(&minus;r) with M<sub>g</sub> the moment generating function, which is
 * {@code 1 / g.laplaceTransform(r)} in the {@link DelayDistribution} convention
 * (laplaceTransform(s) = E[e<sup>&minus;sX</sup>]).
 *
 * <p>For daily masses w<sub>s</sub>, s = 0, 1, ... (index = day), the discrete form is
 * R = 1 / &Sigma;<sub>s</sub> w<sub>s</sub> e<sup>&minus;r s</sup> (Wallinga &amp; Lipsitch 2007,
 * the form for intervals recorded to the whole day); the masses are renormalised to sum 1, so
 * a {@link DailyMasses} tail is dropped (truncate where the tail is negligible).
 *
 * <p>Declining epidemics (r &lt; 0) are supported where E[e<sup>|r|X</sup>] is finite: r must lie
 * above {@link DelayDistribution#laplaceAbscissa()} (gamma: r &gt; &minus;rate; lognormal and
 * Weibull with shape &lt; 1: never). Elsewhere the methods refuse with an
 * {@link IllegalArgumentException} that names the reason. Stateless and thread-safe.
 */
public final class EulerLotka {

    private EulerLotka() {
    }

    /**
     * R = 1 / E[e<sup>&minus;r G</sup>].
     *
     * @param g generation-interval distribution, days
     * @param r growth rate per day, finite
     * @return R &gt; 0
     * @throws IllegalArgumentException if r is not finite, or E[e<sup>&minus;r G</sup>] is infinite
     *                                  (r below the distribution's abscissa of convergence)
     */
    public static double reproductionNumber(DelayDistribution g, double r) {
        double m = transform(g, r);
        return 1 / m;
    }

    private static double transform(DelayDistribution g, double r) {
        if (g == null) {
            throw new IllegalArgumentException("generation interval must not be null");
        }
        if (!Double.isFinite(r)) {
            throw new IllegalArgumentException("growth rate r must be finite, was " + r);
        }
        double m = g.laplaceTransform(r);
        if (!(m < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("growth rate r = " + r + ": E[exp(-r G)] is infinite "
                    + "for the " + g.familyName() + " generation interval (its moment generating "
                    + "function diverges below s = " + g.laplaceAbscissa() + " per day, here at "
                    + (-r) + "); R is not defined by the Euler-Lotka equation for this decline");
        }
        if (!(m > 0)) {
            throw new EstimationException("E[exp(-r G)] = " + m + " at r = " + r
                    + " underflows; R overflows");
        }
        return m;
    }

    /**
     * Discrete form R = 1 / &Sigma;<sub>s</sub> w<sub>s</sub> e<sup>&minus;r s</sup>, masses
     * renormalised to sum 1.
     *
     * @param masses w<sub>s</sub> for days s = 0, 1, ... (not modified), non-negative, finite,
     *               positive sum
     * @param r      growth rate per day, finite
     * @return R
     * @throws IllegalArgumentException on invalid masses or r
     */
    public static double reproductionNumber(double[] masses, double r) {
        double[] w = normalised(masses);
        if (!Double.isFinite(r)) {
            throw new IllegalArgumentException("growth rate r must be finite, was " + r);
        }
        double bigR = Math.exp(-logDiscreteTransform(w, r));
        if (!(bigR > 0 && bigR < Double.POSITIVE_INFINITY)) {
            throw new EstimationException("R = exp(" + -logDiscreteTransform(w, r) + ") at r = " + r
                    + " is not representable as a double");
        }
        return bigR;
    }

    /**
     * As {@link #reproductionNumber(double[], double)} with the masses of {@code masses}
     * (tail dropped, masses renormalised).
     *
     * @param masses daily masses
     * @param r      growth rate per day
     * @return R
     */
    public static double reproductionNumber(DailyMasses masses, double r) {
        if (masses == null) {
            throw new IllegalArgumentException("masses must not be null");
        }
        return reproductionNumber(masses.masses(), r);
    }

    /** log of sum_s w_s exp(-r s), by log-sum-exp so that large |r| neither overflows nor underflows. */
    static double logDiscreteTransform(double[] w, double r) {
        if (Math.abs(r) * w.length < 600) {
            // no overflow or underflow possible: direct sum
            double s = 0;
            for (int d = 0; d < w.length; d++) {
                if (w[d] > 0) {
                    s += w[d] * Math.exp(-r * d);
                }
            }
            return Math.log(s);
        }
        double max = Double.NEGATIVE_INFINITY;
        for (int d = 0; d < w.length; d++) {
            if (w[d] > 0) {
                max = Math.max(max, Math.log(w[d]) - r * d);
            }
        }
        double s = 0;
        for (int d = 0; d < w.length; d++) {
            if (w[d] > 0) {
                s += Math.exp(Math.log(w[d]) - r * d - max);
            }
        }
        return max + Math.log(s);
    }

    static double[] normalised(double[] masses) {
        if (masses == null || masses.length == 0) {
            throw new IllegalArgumentException("masses must have at least one day");
        }
        double sum = 0;
        for (int d = 0; d < masses.length; d++) {
            if (!(masses[d] >= 0 && masses[d] < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("masses[" + d + "] must be finite and >= 0, was "
                        + masses[d]);
            }
            sum += masses[d];
        }
        if (!(sum > 0)) {
            throw new IllegalArgumentException("masses must have a positive sum, was " + sum);
        }
        double[] w = new double[masses.length];
        for (int d = 0; d < w.length; d++) {
            w[d] = masses[d] / sum;
        }
        return w;
    }

    /**
     * Inverse: the growth rate r with {@code reproductionNumber(g, r) == reproductionNumber}, by
     * Brent's method on the monotone map r &rarr; R.
     *
     * @param g                  generation-interval distribution
     * @param reproductionNumber R, finite and &gt; 0
     * @return r per day (negative for R &lt; 1)
     * @throws IllegalArgumentException if R is out of range, or R &lt; 1 is not reachable because
     *                                  the transform diverges for every r &lt; 0 (e.g. lognormal)
     *                                  or stays below it down to the abscissa
     */
    public static double growthRate(DelayDistribution g, double reproductionNumber) {
        if (g == null) {
            throw new IllegalArgumentException("generation interval must not be null");
        }
        checkR(reproductionNumber);
        double target = Math.log(reproductionNumber);
        if (target == 0) {
            return 0;
        }
        // f(r) = log R(r) - log R*, increasing in r.
        java.util.function.DoubleUnaryOperator f = r -> -Math.log(g.laplaceTransform(r)) - target;
        double scale = 1 / Math.max(g.mean(), 1e-300);
        if (target > 0) {
            double hi = scale;
            int tries = 0;
            while (f.applyAsDouble(hi) < 0) {
                hi *= 2;
                if (++tries > 200) {
                    throw new EstimationException("no growth rate gives R = " + reproductionNumber
                            + " (bracket search failed after 200 doublings)");
                }
            }
            return solve(f, 0, hi);
        }
        double a = g.laplaceAbscissa();
        if (!(a < 0)) {
            throw new IllegalArgumentException("reproductionNumber = " + reproductionNumber
                    + " < 1 needs r < 0, but E[exp(-r G)] is infinite for every r < 0 for the "
                    + g.familyName() + " generation interval (abscissa " + a + ")");
        }
        double lo;
        if (a == Double.NEGATIVE_INFINITY) {
            lo = -scale;
            int tries = 0;
            while (f.applyAsDouble(lo) > 0) {
                lo *= 2;
                if (++tries > 200) {
                    throw new EstimationException("no growth rate gives R = " + reproductionNumber
                            + " (bracket search failed after 200 doublings)");
                }
            }
        } else {
            // approach the abscissa from above; the transform may converge at it
            double gap = -a;
            lo = a + gap;
            for (int i = 0; i < 1100 && f.applyAsDouble(lo) > 0; i++) {
                gap *= 0.5;
                lo = a + gap;
                if (lo == a) {
                    break;
                }
            }
            double fa = Double.isFinite(g.laplaceTransform(lo)) ? f.applyAsDouble(lo) : -1;
            if (!(fa <= 0)) {
                throw new IllegalArgumentException("reproductionNumber = " + reproductionNumber
                        + " is below the smallest R reachable (" + Math.exp(fa + target)
                        + ") before E[exp(-r G)] diverges at r = " + a + " for the "
                        + g.familyName() + " generation interval");
            }
        }
        return solve(f, lo, 0);
    }

    /**
     * Inverse of the discrete form: r with R = 1 / &Sigma; w<sub>s</sub> e<sup>&minus;r s</sup>.
     *
     * @param masses             w<sub>s</sub> (not modified), renormalised
     * @param reproductionNumber R, finite and &gt; 0
     * @return r per day
     * @throws IllegalArgumentException if R &ne; 1 while all mass is on day 0 (R does not depend
     *                                  on r), or on invalid input
     */
    public static double growthRate(double[] masses, double reproductionNumber) {
        double[] w = normalised(masses);
        checkR(reproductionNumber);
        double target = Math.log(reproductionNumber);
        if (target == 0) {
            return 0;
        }
        if (w[0] == 1) {
            throw new IllegalArgumentException("all generation-interval mass is on day 0, so R = 1 "
                    + "for every r; reproductionNumber " + reproductionNumber + " is unreachable");
        }
        double mean = 0;
        for (int d = 0; d < w.length; d++) {
            mean += d * w[d];
        }
        java.util.function.DoubleUnaryOperator f = r -> -logDiscreteTransform(w, r) - target;
        double step = (target > 0 ? 1 : -1) / mean;
        double b = step;
        int tries = 0;
        while (f.applyAsDouble(b) * Math.signum(target) < 0) {
            // not yet past the root
            b *= 2;
            if (++tries > 60) {
                throw new EstimationException("no growth rate gives R = " + reproductionNumber);
            }
        }
        return target > 0 ? solve(f, 0, b) : solve(f, b, 0);
    }

    private static void checkR(double reproductionNumber) {
        if (!(reproductionNumber > 0 && reproductionNumber < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("reproductionNumber must be finite and > 0, was "
                    + reproductionNumber);
        }
    }

    private static double solve(java.util.function.DoubleUnaryOperator f, double lo, double hi) {
        return new BrentSolver(1e-15, 1e-17, 0).findRoot(f, lo, hi);
    }

    /**
     * The bias from using a backward-traced generation interval as if it were intrinsic. In an
     * epidemic growing at rate r, intervals traced back from infectees have the tilted density
     * &prop; e<sup>&minus;r t</sup> g(t) ({@link DelayDistribution#tilt(double)}; Britton &amp;
     * Scalia Tomba 2019, J R Soc Interface). Plugging that into Euler&ndash;Lotka gives
     * R<sub>naive</sub> = 1 / E<sub>tilted</sub>[e<sup>&minus;rX</sup>]; for gamma(shape, rate),
     * R<sub>true</sub> = (1 + r/rate)<sup>shape</sup> and R<sub>naive</sub> =
     * (1 + r/(rate + r))<sup>shape</sup>.
     *
     * @param intrinsic intrinsic generation interval g
     * @param r         growth rate per day; both g.tilt(r) and its transform at r must be finite
     * @return true R, naive R and their ratio
     * @throws IllegalArgumentException if either transform diverges
     */
    public static BackwardBias backwardBias(DelayDistribution intrinsic, double r) {
        double rTrue = reproductionNumber(intrinsic, r);
        if (!(intrinsic.laplaceTransform(r) < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("cannot tilt by r = " + r);
        }
        DelayDistribution backward = intrinsic.tilt(r);
        double rNaive = reproductionNumber(backward, r);
        return new BackwardBias(r, rTrue, rNaive);
    }

    /**
     * R with an interval by the delta method on log R, propagating the standard error of r
     * (taken as (upper &minus; lower) / (2 z) from {@code rate}'s interval, z the normal quantile
     * at its level) and the covariance of the generation interval's natural parameters
     * (gradient by central differences, step 1e-5 relative). The interval is
     * exp(log R &plusmn; z se(log R)) at the level of {@code rate}.
     *
     * @param g          generation interval from a parametric family
     * @param covariance covariance of g's natural parameters (k by k, symmetric; zeros if known)
     * @param rate       growth-rate estimate with interval
     * @return R estimate, method "delta"
     * @throws IllegalArgumentException on mismatched sizes or a diverging transform
     */
    public static Estimate reproductionNumberDelta(ParametricDelay g, double[][] covariance,
                                                   Estimate rate) {
        double[] theta = g.parameters();
        checkCov(covariance, theta.length);
        double z = zOf(rate.level());
        double seR = rateSe(rate, z);
        double r = rate.estimate();
        double logR = Math.log(reproductionNumber(g, r));
        double h = 1e-5 * Math.max(Math.abs(r), 1e-3);
        double dr = (Math.log(reproductionNumber(g, r + h))
                - Math.log(reproductionNumber(g, r - h))) / (2 * h);
        double var = dr * dr * seR * seR;
        double[] grad = new double[theta.length];
        DelayFamily fam = g.family();
        for (int j = 0; j < theta.length; j++) {
            double hj = 1e-5 * Math.max(Math.abs(theta[j]), 1e-8);
            double[] up = theta.clone();
            double[] dn = theta.clone();
            up[j] += hj;
            dn[j] -= hj;
            grad[j] = (Math.log(reproductionNumber(fam.of(up), r))
                    - Math.log(reproductionNumber(fam.of(dn), r))) / (2 * hj);
        }
        for (int i = 0; i < theta.length; i++) {
            for (int j = 0; j < theta.length; j++) {
                var += grad[i] * covariance[i][j] * grad[j];
            }
        }
        double se = Math.sqrt(var);
        return new Estimate(Math.exp(logR), Math.exp(logR - z * se), Math.exp(logR + z * se),
                rate.level(), "delta");
    }

    /**
     * R with a Monte Carlo percentile interval: draws r ~ Normal(r&#770;, se) (se as in
     * {@link #reproductionNumberDelta}) and the generation-interval parameters from a
     * multivariate normal with the given covariance &mdash; on the log scale for parameters in
     * {@link DelayFamily.Domain#POSITIVE} (covariance mapped by the delta method), so that draws
     * stay in the domain. Draws of r at or below the abscissa of a draw's transform are redrawn
     * (truncation, documented); the point estimate is R at the estimates.
     *
     * @param rng        randomness (not stored)
     * @param g          generation interval from a parametric family
     * @param covariance covariance of the natural parameters
     * @param rate       growth-rate estimate with interval
     * @param draws      number of draws, 100 .. 10<sup>7</sup>
     * @return R estimate, method "monte-carlo-percentile"
     * @throws IllegalArgumentException if rate's lower limit is at or below g's abscissa (the
     *                                  interval of r includes rates with no R), or on bad input
     */
    public static Estimate reproductionNumberMonteCarlo(UniformRandomProvider rng, ParametricDelay g,
                                                        double[][] covariance, Estimate rate,
                                                        int draws) {
        if (rng == null) {
            throw new IllegalArgumentException("rng must not be null");
        }
        if (draws < 100 || draws > 10_000_000) {
            throw new IllegalArgumentException("draws must be in [100, 1e7], was " + draws);
        }
        double[] theta = g.parameters();
        int k = theta.length;
        checkCov(covariance, k);
        if (!(rate.lower() > g.laplaceAbscissa())) {
            throw new IllegalArgumentException("rate interval lower limit " + rate.lower()
                    + " is at or below the abscissa " + g.laplaceAbscissa() + " of the "
                    + g.familyName() + " generation interval: R is undefined for part of the "
                    + "interval of r");
        }
        double z = zOf(rate.level());
        double seR = rateSe(rate, z);
        DelayFamily fam = g.family();
        java.util.List<DelayFamily.Domain> dom = fam.parameterDomains();
        double[] centre = new double[k];
        double[][] c = new double[k][k];
        for (int i = 0; i < k; i++) {
            boolean li = dom.get(i) == DelayFamily.Domain.POSITIVE;
            centre[i] = li ? Math.log(theta[i]) : theta[i];
            for (int j = 0; j < k; j++) {
                boolean lj = dom.get(j) == DelayFamily.Domain.POSITIVE;
                c[i][j] = covariance[i][j] / (li ? theta[i] : 1) / (lj ? theta[j] : 1);
            }
        }
        double[][] chol = cholesky(c);
        ZigguratSampler.NormalizedGaussian normal = ZigguratSampler.NormalizedGaussian.of(rng);
        double[] values = new double[draws];
        double[] e = new double[k];
        double[] p = new double[k];
        for (int d = 0; d < draws; d++) {
            for (int i = 0; i < k; i++) {
                e[i] = normal.sample();
            }
            for (int i = 0; i < k; i++) {
                double v = centre[i];
                for (int j = 0; j <= i; j++) {
                    v += chol[i][j] * e[j];
                }
                p[i] = dom.get(i) == DelayFamily.Domain.POSITIVE ? Math.exp(v) : v;
            }
            ParametricDelay gd = fam.of(p);
            double rd;
            int redraws = 0;
            do {
                rd = rate.estimate() + seR * normal.sample();
                if (++redraws > 1000) {
                    throw new EstimationException("Monte Carlo R: could not draw r above the "
                            + "abscissa " + gd.laplaceAbscissa() + " in 1000 tries");
                }
            } while (!(gd.laplaceTransform(rd) < Double.POSITIVE_INFINITY));
            values[d] = reproductionNumber(gd, rd);
        }
        java.util.Arrays.sort(values);
        double alpha = (1 - rate.level()) / 2;
        double lo = quantileSorted(values, alpha);
        double hi = quantileSorted(values, 1 - alpha);
        double est = reproductionNumber(g, rate.estimate());
        return new Estimate(est, Math.min(lo, est), Math.max(hi, est), rate.level(),
                "monte-carlo-percentile");
    }

    /** Type-7 (linear interpolation) sample quantile of sorted values, common practice. */
    static double quantileSorted(double[] v, double q) {
        double h = (v.length - 1) * q;
        int i = (int) Math.floor(h);
        if (i >= v.length - 1) {
            return v[v.length - 1];
        }
        return v[i] + (h - i) * (v[i + 1] - v[i]);
    }

    private static double[][] cholesky(double[][] a) {
        int n = a.length;
        double[][] l = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j <= i; j++) {
                double s = a[i][j];
                for (int m = 0; m < j; m++) {
                    s -= l[i][m] * l[j][m];
                }
                if (i == j) {
                    if (s < -1e-12 * Math.abs(a[i][i])) {
                        throw new IllegalArgumentException("covariance must be positive "
                                + "semi-definite; pivot " + i + " is " + s);
                    }
                    l[i][i] = Math.sqrt(Math.max(s, 0));
                } else {
                    l[i][j] = l[j][j] > 0 ? s / l[j][j] : 0;
                }
            }
        }
        return l;
    }

    private static double zOf(double level) {
        return NormalDistribution.of(0, 1).inverseSurvivalProbability((1 - level) / 2);
    }

    private static double rateSe(Estimate rate, double z) {
        if (rate == null) {
            throw new IllegalArgumentException("rate must not be null");
        }
        if (!Double.isFinite(rate.lower()) || !Double.isFinite(rate.upper())) {
            throw new IllegalArgumentException("rate interval must be finite, was ["
                    + rate.lower() + ", " + rate.upper() + "]");
        }
        return (rate.upper() - rate.lower()) / (2 * z);
    }

    private static void checkCov(double[][] cov, int k) {
        if (cov == null || cov.length != k) {
            throw new IllegalArgumentException("covariance must be " + k + " by " + k);
        }
        for (int i = 0; i < k; i++) {
            if (cov[i] == null || cov[i].length != k) {
                throw new IllegalArgumentException("covariance row " + i + " must have " + k
                        + " entries");
            }
            for (int j = 0; j < k; j++) {
                if (!Double.isFinite(cov[i][j]) || Math.abs(cov[i][j] - cov[j][i])
                        > 1e-12 * (Math.abs(cov[i][j]) + Math.abs(cov[j][i]))) {
                    throw new IllegalArgumentException("covariance must be finite and symmetric; "
                            + "entry [" + i + "][" + j + "] = " + cov[i][j]);
                }
            }
        }
    }
}
