package org.incipit.core.estimate.fatality;

import java.util.Arrays;
import java.util.function.DoubleUnaryOperator;

import org.apache.commons.numbers.rootfinder.BrentSolver;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.statistics.distribution.ChiSquaredDistribution;
import org.incipit.core.EstimationException;
import org.incipit.core.estimate.delay.DelayFit;
import org.incipit.core.inference.Estimate;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.core.observe.DailyCounts;
import org.incipit.distributions.DailyMasses;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.Discretisation;
import org.incipit.distributions.DelayFamily;

/**
 * Fatality ratio p (probability that a case dies) from daily counts of cases by onset day and
 * deaths (and recoveries) by day, for outcomes that come with a delay (docs/methods.md
 * section 5).
 *
 * <p><b>Convention.</b> T is the last day of the counts; a case with onset on day t has died
 * by the end of day T if its whole-day onset-to-death delay &lfloor;X&rfloor; is at most
 * T &minus; t, probability &Sigma;<sub>d &le; T&minus;t</sub> [F(d + 1) &minus; F(d)] =
 * F(T &minus; t + 1) (the {@code DAY_INTERVAL} discretisation of the distribution layer; a
 * delay of 0 days is death on the day of onset). Expected deaths by T are
 * p u, u = &Sigma;<sub>t</sub> c<sub>t</sub> F(T &minus; t + 1) (Nishiura et al. 2009, from
 * memory). As the time step shrinks the sum tends to the continuous-time
 * &int; c(t) F(T &minus; t) dt (tested).
 *
 * <p><b>Intervals.</b> Likelihood-ratio (profile) intervals of one-parameter likelihoods in p,
 * the set {p : 2[l(p&#770;) &minus; l(p)] &le; &chi;&sup2;<sub>1</sub>(level)}, bounds by Brent's
 * method to 1e-12; a bound is 0 or 1 when the likelihood stays above the threshold there.
 */
public final class FatalityEstimator {

    private FatalityEstimator() {
    }

    /**
     * Crude ratio D(T) / C(T): total deaths over total cases, binomial likelihood-ratio interval.
     *
     * @param counts cases and deaths
     * @param level  coverage in (0, 1)
     * @return the estimate
     * @throws IllegalArgumentException if deaths are not recorded or there are no cases
     * @throws EstimationException      if deaths exceed cases
     */
    public static Estimate crude(DailyCounts counts, double level) {
        checkLevel(level);
        long c = counts.totalCases();
        long d = sum(deaths(counts));
        if (c == 0) {
            throw new IllegalArgumentException("counts have no cases");
        }
        return binomial(d, c, 1.0, level, "crude");
    }

    /**
     * Growth-asymptotic adjustment: during exponential growth at rate r the crude ratio tends
     * to p M_f(&minus;r), so p&#770; = crude / M_f(&minus;r); the crude interval is scaled the
     * same way (capped at 1).
     *
     * @param counts      cases and deaths
     * @param onsetToDeath the onset-to-death delay f
     * @param growthRate  r per day, finite, with M_f(&minus;r) finite
     * @param level       coverage
     * @return the estimate, method "growth-asymptotic"
     * @throws EstimationException if M_f(&minus;r) is infinite
     */
    public static Estimate growthAsymptotic(DailyCounts counts, DelayDistribution onsetToDeath, double growthRate,
                                            double level) {
        if (!Double.isFinite(growthRate)) {
            throw new IllegalArgumentException("growthRate must be finite, was " + growthRate);
        }
        double m = onsetToDeath.laplaceTransform(growthRate);
        if (!(m > 0 && m < Double.POSITIVE_INFINITY)) {
            throw new EstimationException("M_f(-r) is " + m + " at r = " + growthRate + ": no growth-asymptotic ratio");
        }
        Estimate c = crude(counts, level);
        double p = c.estimate() / m;
        if (p > 1) {
            throw new EstimationException("growth-asymptotic ratio " + p + " exceeds 1: the crude ratio "
                    + c.estimate() + " is above M_f(-r) = " + m);
        }
        return new Estimate(p, c.lower() / m, Math.min(1, c.upper() / m), level, "growth-asymptotic");
    }

    /**
     * Finite-window adjustment p&#770; = D(T) / u, u = &Sigma; c_t F(T &minus; t + 1), with the
     * likelihood D ~ Binomial(C, p u / C) (every case dies with probability p and has died by T
     * with probability F(T &minus; t + 1); the mixture over onset days approximated by one
     * binomial of the same mean) and its likelihood-ratio interval. If D &gt; u the estimate is
     * the boundary 1.
     *
     * @param counts       cases and deaths
     * @param onsetToDeath the onset-to-death delay
     * @param level        coverage
     * @return the estimate, method "profile"
     * @throws EstimationException if no case can have died by T (u = 0)
     */
    public static Estimate windowAdjusted(DailyCounts counts, DelayDistribution onsetToDeath, double level) {
        return windowAdjusted(counts, onsetToDeath, Discretisation.DAY_INTERVAL, level);
    }

    /**
     * {@link #windowAdjusted(DailyCounts, DelayDistribution, double)} with a choice of day
     * convention: {@code DAY_INTERVAL} (the default) counts a case of day t as dead by T with
     * probability F(T &minus; t + 1), exact when the whole-day delay &lfloor;X&rfloor; is what
     * separates the onset day from the death day; {@code DOUBLE_CENSORED} uses
     * &int;<sub>0</sub><sup>1</sup> F(T &minus; t + 1 &minus; u) du, exact when onsets are
     * continuous and uniform within their day and deaths are counted on the day they happen
     * (the sum of the distribution layer's DOUBLE_CENSORED masses up to T &minus; t).
     *
     * @param counts       cases and deaths
     * @param onsetToDeath the onset-to-death delay
     * @param convention   day convention
     * @param level        coverage
     * @return the estimate, method "profile"
     * @throws EstimationException if no case can have died by T
     */
    public static Estimate windowAdjusted(DailyCounts counts, DelayDistribution onsetToDeath,
                                          Discretisation convention, double level) {
        checkLevel(level);
        long c = counts.totalCases();
        long d = sum(deaths(counts));
        double u = expectedResolved(counts, onsetToDeath, convention);
        if (!(u > 0)) {
            throw new EstimationException("no case can have died by the last day (sum of c_t F(T - t + 1) is 0)");
        }
        return binomial(d, c, u / c, level, "profile");
    }

    /**
     * Finite-window adjustment that also carries the uncertainty of the fitted delay: draws
     * &theta;<sub>b</sub> from the normal approximation N(&theta;&#770;, &Sigma;) of the delay fit on
     * its unconstrained scale, and for each draw p<sub>b</sub> = exp(log(D / u<sub>b</sub>) +
     * z<sub>b</sub> se), se&sup2; = (1 &minus; D/C) / D the binomial variance of log D/C,
     * z<sub>b</sub> standard normal; the interval is the percentile interval of p<sub>b</sub>
     * (capped at 1), the estimate D / u at &theta;&#770;.
     *
     * @param rng          randomness (not stored)
     * @param counts       cases and deaths, with D &ge; 1
     * @param onsetToDeath a converged delay fit
     * @param draws        Monte Carlo draws, &ge; 100
     * @param level        coverage
     * @return the estimate, method "monte-carlo"
     * @throws EstimationException if the fit did not converge or D = 0
     */
    public static Estimate windowAdjusted(UniformRandomProvider rng, DailyCounts counts, DelayFit onsetToDeath,
                                          int draws, double level) {
        checkLevel(level);
        if (draws < 100) {
            throw new IllegalArgumentException("draws must be >= 100, was " + draws);
        }
        if (!onsetToDeath.converged()) {
            throw new EstimationException("the onset-to-death fit did not converge: " + onsetToDeath.message());
        }
        long c = counts.totalCases();
        long d = sum(deaths(counts));
        if (d == 0) {
            throw new EstimationException("no deaths: the Monte Carlo interval needs D >= 1");
        }
        MaximumLikelihoodFit fit = onsetToDeath.fit();
        DelayFamily family = onsetToDeath.family();
        double[] mu = fit.unconstrainedEstimate();
        double[][] chol = cholesky(fit.unconstrainedCovariance());
        int k = mu.length;
        double se = Math.sqrt((1 - (double) d / c) / d);
        double[] p = new double[draws];
        double[] z = new double[k];
        double[] theta = new double[k];
        for (int b = 0; b < draws; b++) {
            for (int j = 0; j < k; j++) {
                z[j] = gaussian(rng);
            }
            for (int i = 0; i < k; i++) {
                double s = mu[i];
                for (int j = 0; j <= i; j++) {
                    s += chol[i][j] * z[j];
                }
                theta[i] = s;
            }
            double ub = expectedResolved(counts, family.of(fit.parameterisation().toNatural(theta)));
            p[b] = Math.exp(Math.log(d / ub) + gaussian(rng) * se);
        }
        Arrays.sort(p);
        double est = d / expectedResolved(counts, onsetToDeath.distribution());
        double lo = p[(int) Math.floor((0.5 - 0.5 * level) * (draws - 1))];
        double hi = Math.min(1, p[(int) Math.ceil((0.5 + 0.5 * level) * (draws - 1))]);
        return new Estimate(Math.min(est, 1), Math.min(lo, Math.min(est, 1)), Math.max(hi, Math.min(est, 1)), level,
                "monte-carlo");
    }

    /**
     * Resolved-only ratio D / (D + Rec) with a binomial likelihood-ratio interval. Biased during
     * growth unless the times to death and recovery have equal M(&minus;r): see
     * {@link #resolvedOnlyGrowthLimit}.
     *
     * @param counts cases, deaths and recoveries
     * @param level  coverage
     * @return the estimate
     * @throws IllegalArgumentException if deaths or recoveries are not recorded
     * @throws EstimationException      if no outcome is resolved
     */
    public static Estimate resolvedOnly(DailyCounts counts, double level) {
        checkLevel(level);
        long d = sum(deaths(counts));
        long rec = sum(recoveries(counts));
        if (d + rec == 0) {
            throw new EstimationException("no resolved cases (no deaths and no recoveries)");
        }
        return binomial(d, d + rec, 1.0, level, "resolved-only");
    }

    /**
     * Joint estimate from deaths and recoveries: D ~ Poisson(p u_D), Rec ~ Poisson((1 &minus; p)
     * u_R), u_D = &Sigma; c_t F_D(T &minus; t + 1), u_R = &Sigma; c_t F_R(T &minus; t + 1), with
     * log-likelihood D log p &minus; p u_D + Rec log(1 &minus; p) + (1 &minus; p) u_R + const,
     * maximised over p in [0, 1] (root of the score by Brent's method), likelihood-ratio interval.
     *
     * @param counts         cases, deaths and recoveries
     * @param onsetToDeath   delay to death F_D
     * @param onsetToRecovery delay to recovery F_R
     * @param level          coverage
     * @return the estimate, method "profile"
     * @throws EstimationException if no outcome is resolved
     */
    public static Estimate resolvedAdjusted(DailyCounts counts, DelayDistribution onsetToDeath,
                                            DelayDistribution onsetToRecovery, double level) {
        checkLevel(level);
        long d = sum(deaths(counts));
        long rec = sum(recoveries(counts));
        if (d + rec == 0) {
            throw new EstimationException("no resolved cases (no deaths and no recoveries)");
        }
        double uD = expectedResolved(counts, onsetToDeath);
        double uR = expectedResolved(counts, onsetToRecovery);
        DoubleUnaryOperator ll = p -> xlogy(d, p) - p * uD + xlogy(rec, 1 - p) - (1 - p) * uR;
        double pHat;
        if (d == 0) {
            pHat = 0;
        } else if (rec == 0) {
            pHat = 1;
        } else {
            // score D/p - uD - Rec/(1-p) + uR is decreasing from +inf to -inf on (0, 1)
            DoubleUnaryOperator score = p -> d / p - uD - rec / (1 - p) + uR;
            pHat = new BrentSolver(1e-15, 1e-15, 0).findRoot(score::applyAsDouble, 1e-300 + Double.MIN_NORMAL,
                    1 - 1e-16);
        }
        return likelihoodRatio(ll, pHat, level, "profile");
    }

    /**
     * All four estimates side by side.
     *
     * @param counts          cases, deaths and recoveries
     * @param onsetToDeath    delay to death
     * @param onsetToRecovery delay to recovery
     * @param level           coverage
     * @return crude, resolved-only, window-adjusted and resolved-adjusted estimates
     */
    public static FatalitySummary summary(DailyCounts counts, DelayDistribution onsetToDeath,
                                          DelayDistribution onsetToRecovery, double level) {
        return new FatalitySummary(crude(counts, level), resolvedOnly(counts, level),
                windowAdjusted(counts, onsetToDeath, level),
                resolvedAdjusted(counts, onsetToDeath, onsetToRecovery, level));
    }

    /**
     * The limit of D / (D + Rec) during exponential growth at rate r:
     * p M_f(&minus;r) / (p M_f(&minus;r) + (1 &minus; p) M_h(&minus;r)) (docs/methods.md section 5).
     *
     * @param p               fatality ratio in [0, 1]
     * @param onsetToDeath    f
     * @param onsetToRecovery h
     * @param growthRate      r per day with both transforms finite
     * @return the limit
     * @throws IllegalArgumentException if p is outside [0, 1] or a transform is infinite
     */
    public static double resolvedOnlyGrowthLimit(double p, DelayDistribution onsetToDeath,
                                                 DelayDistribution onsetToRecovery, double growthRate) {
        if (!(p >= 0 && p <= 1)) {
            throw new IllegalArgumentException("p must be in [0, 1], was " + p);
        }
        double mf = onsetToDeath.laplaceTransform(growthRate);
        double mh = onsetToRecovery.laplaceTransform(growthRate);
        if (!(mf < Double.POSITIVE_INFINITY && mh < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("M(-r) must be finite for both delays at r = " + growthRate);
        }
        return p * mf / (p * mf + (1 - p) * mh);
    }

    /**
     * u = &Sigma;<sub>t</sub> c<sub>t</sub> F(T &minus; t + 1), T the last day: the expected number of
     * outcomes by T per unit probability.
     *
     * @param counts cases by onset day
     * @param delay  onset-to-outcome delay
     * @return u, in [0, C]
     */
    public static double expectedResolved(DailyCounts counts, DelayDistribution delay) {
        return expectedResolved(counts, delay, Discretisation.DAY_INTERVAL);
    }

    /**
     * @param counts     cases by onset day
     * @param delay      onset-to-outcome delay
     * @param convention {@code DAY_INTERVAL}: &Sigma; c<sub>t</sub> F(T &minus; t + 1);
     *                   {@code DOUBLE_CENSORED}: &Sigma; c<sub>t</sub> &Sigma;<sub>d &le; T&minus;t</sub>
     *                   (double-censored mass of day d)
     * @return u, in [0, C]
     */
    public static double expectedResolved(DailyCounts counts, DelayDistribution delay, Discretisation convention) {
        if (convention == Discretisation.DOUBLE_CENSORED) {
            int[] c = counts.cases();
            int n = c.length;
            DailyMasses m = delay.discretise(n - 1, Discretisation.DOUBLE_CENSORED);
            double[] cum = new double[n];
            double s = 0;
            for (int d = 0; d < n; d++) {
                s += m.mass(d);
                cum[d] = s;
            }
            double u = 0;
            for (int i = 0; i < n; i++) {
                u += c[i] * cum[n - 1 - i];
            }
            return u;
        }
        int[] c = counts.cases();
        int n = c.length;
        double u = 0;
        for (int i = 0; i < n; i++) {
            if (c[i] > 0) {
                u += c[i] * delay.cdf(n - i); // T - t + 1 with T = n - 1, t = i
            }
        }
        return u;
    }

    // ---- helpers ----

    /** Binomial(n, pi = p * scale): LR interval for p in [0, 1]. */
    private static Estimate binomial(long d, long n, double scale, double level, String method) {
        if (d > n) {
            throw new EstimationException("deaths " + d + " exceed cases " + n);
        }
        DoubleUnaryOperator ll = p -> xlogy(d, p * scale) + xlogy(n - d, 1 - p * scale);
        double pHat = Math.min(1, d / (n * scale));
        Estimate e = likelihoodRatio(ll, pHat, level, "profile");
        return new Estimate(e.estimate(), e.lower(), e.upper(), level, method.equals("profile") ? "profile"
                : method + "-profile");
    }

    private static Estimate likelihoodRatio(DoubleUnaryOperator ll, double pHat, double level, String method) {
        double target = ll.applyAsDouble(pHat) - 0.5 * ChiSquaredDistribution.of(1).inverseCumulativeProbability(level);
        DoubleUnaryOperator g = p -> ll.applyAsDouble(p) - target;
        double lower = 0;
        if (pHat > 0 && g.applyAsDouble(0) < 0) {
            lower = new BrentSolver(1e-14, 1e-14, 0).findRoot(g::applyAsDouble, 0, pHat);
        }
        double upper = 1;
        if (pHat < 1 && g.applyAsDouble(1) < 0) {
            upper = new BrentSolver(1e-14, 1e-14, 0).findRoot(g::applyAsDouble, pHat, 1);
        }
        return new Estimate(pHat, Math.min(lower, pHat), Math.max(upper, pHat), level, method);
    }

    /** x log y with 0 log 0 = 0 and x log 0 = -inf for x > 0. */
    private static double xlogy(double x, double y) {
        if (x == 0) {
            return 0;
        }
        return x * Math.log(y);
    }

    private static int[] deaths(DailyCounts counts) {
        if (!counts.hasDeaths()) {
            throw new IllegalArgumentException("counts must record deaths");
        }
        return counts.deaths();
    }

    private static int[] recoveries(DailyCounts counts) {
        if (!counts.hasRecoveries()) {
            throw new IllegalArgumentException("counts must record recoveries");
        }
        return counts.recoveries();
    }

    private static long sum(int[] x) {
        long s = 0;
        for (int v : x) {
            s += v;
        }
        return s;
    }

    private static void checkLevel(double level) {
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
    }

    private static double[][] cholesky(double[][] a) {
        int k = a.length;
        double[][] l = new double[k][k];
        for (int i = 0; i < k; i++) {
            for (int j = 0; j <= i; j++) {
                double s = a[i][j];
                for (int m = 0; m < j; m++) {
                    s -= l[i][m] * l[j][m];
                }
                if (i == j) {
                    if (!(s > 0)) {
                        throw new EstimationException("delay covariance is not positive definite");
                    }
                    l[i][i] = Math.sqrt(s);
                } else {
                    l[i][j] = s / l[j][j];
                }
            }
        }
        return l;
    }

    private static double gaussian(UniformRandomProvider rng) {
        // Box-Muller (one variate per call; adequate for Monte Carlo intervals)
        double u1 = rng.nextDouble();
        double u2 = rng.nextDouble();
        return Math.sqrt(-2 * Math.log1p(-u1)) * Math.cos(2 * Math.PI * u2);
    }
}
