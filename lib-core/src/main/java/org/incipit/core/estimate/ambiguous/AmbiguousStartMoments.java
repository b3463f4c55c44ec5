package org.incipit.core.estimate.ambiguous;

import java.util.concurrent.Executor;
import java.util.concurrent.ForkJoinPool;

import org.incipit.core.EstimationException;
import org.incipit.core.inference.Bootstrap;
import org.incipit.core.inference.BootstrapResult;
import org.incipit.core.inference.Estimate;
import org.incipit.core.observe.AmbiguousStartCases;

/**
 * Moment estimator of the mean and variance of H, the transmission probability p and the
 * exposure rate lambda, assuming open sampling with exposures arriving as a Poisson process
 * (docs/methods.md, section 2). No family is assumed for H. Stateless; thread-safe.
 *
 * <p><b>Derivation.</b> The number of candidates is m = J + N(X), J ~ Geometric(p) on
 * {1, 2, ...}, N(X) ~ Poisson(lambda X) the exposures between infection and onset; the earliest
 * duration is D_1 = W + X, W the sum of J &minus; 1 Exp(lambda) gaps. By Wald's identity
 * E[m &minus; 1] = lambda E[D_1], so lambda&#770; = &Sigma;(m_i &minus; 1) / &Sigma; D_1i. With
 * a = E[m] &minus; 1 = q/p + lambda mu, c = Var(m) = q/p&sup2; + lambda mu + lambda&sup2; sigma&sup2;,
 * b = Var(D_1) = (q/p + q/p&sup2;)/lambda&sup2; + sigma&sup2;:
 * lambda mu = (a + c &minus; lambda&sup2; b)/2, q/p = (a &minus; c + lambda&sup2; b)/2,
 * sigma&sup2; = b &minus; (q/p + (q/p)(1 + q/p))/lambda&sup2;. Sample moments (variances with
 * divisor n &minus; 1) replace a, b, c. Intervals: nonparametric bootstrap over cases,
 * percentile method ({@link Bootstrap#nonparametric}), seeded.
 *
 * <p>m counts every recorded candidate of the case (those with d &le; 0 too).
 */
public final class AmbiguousStartMoments {

    private AmbiguousStartMoments() {
    }

    /**
     * Options.
     *
     * @param level      interval coverage in (0, 1)
     * @param replicates bootstrap replicates, &ge; 10
     * @param seed       bootstrap seed
     */
    public record Options(double level, int replicates, long seed) {
        /** @throws IllegalArgumentException if level is outside (0, 1) or replicates &lt; 10 */
        public Options {
            if (!(level > 0 && level < 1)) {
                throw new IllegalArgumentException("level must be in (0, 1), was " + level);
            }
            if (replicates < 10) {
                throw new IllegalArgumentException("replicates must be >= 10, was " + replicates);
            }
        }

        /**
         * @param seed bootstrap seed
         * @return level 0.95, 1000 replicates
         */
        public static Options defaults(long seed) {
            return new Options(0.95, 1000, seed);
        }
    }

    /**
     * @param cases   the cases; categories are ignored (if each exposure's category is drawn
     *                independently with probabilities pi_c, J is still geometric and p is the
     *                per-exposure average &Sigma; pi_c p_c)
     * @param options level, replicates and seed
     * @return the moment estimates with bootstrap intervals and the status of the solution
     * @throws EstimationException if no case has a second candidate, or the mean solves to &le; 0
     */
    public static MomentFit fit(AmbiguousStartCases cases, Options options) {
        return fit(cases, options, ForkJoinPool.commonPool());
    }

    /**
     * @param cases    the cases
     * @param options  level, replicates and seed
     * @param executor where bootstrap replicates run (results do not depend on it)
     * @return as {@link #fit(AmbiguousStartCases, Options)}
     */
    public static MomentFit fit(AmbiguousStartCases cases, Options options, Executor executor) {
        if (cases == null || options == null || executor == null) {
            throw new IllegalArgumentException("cases, options and executor must not be null");
        }
        return fit(Prepared.from(cases), options, executor);
    }

    /** Raw solution {lambda, mu, sigma^2, p, q/p}; throws if lambda or mu is not positive. */
    static double[] solve(Prepared d) {
        int n = d.n;
        if (n < 2) {
            throw new EstimationException("moment estimator needs >= 2 cases, had " + n);
        }
        double sumM = 0;
        double sumD = 0;
        for (int i = 0; i < n; i++) {
            sumM += d.recordedCount(i);
            sumD += d.dur[d.offset[i]];
        }
        double meanM = sumM / n;
        double meanD = sumD / n;
        double vm = 0;
        double vd = 0;
        for (int i = 0; i < n; i++) {
            double x = d.recordedCount(i) - meanM;
            double y = d.dur[d.offset[i]] - meanD;
            vm += x * x;
            vd += y * y;
        }
        vm /= n - 1;
        vd /= n - 1;
        double lambda = (sumM - n) / sumD;
        if (!(lambda > 0)) {
            throw new EstimationException("moment estimator: no case has a second candidate, so the exposure rate is "
                    + lambda + " and nothing separates J from the exposures after infection");
        }
        double a = meanM - 1;
        double l2b = lambda * lambda * vd;
        double lambdaMu = 0.5 * (a + vm - l2b);
        double odds = 0.5 * (a - vm + l2b); // q/p
        double mu = lambdaMu / lambda;
        if (!(mu > 0)) {
            throw new EstimationException("moment estimator: the equations give a mean of H of " + mu
                    + " (a = " + a + ", c = " + vm + ", lambda^2 b = " + l2b + ")");
        }
        if (odds == -1) {
            throw new EstimationException("moment estimator: q/p = -1, p is infinite");
        }
        double var = vd - (odds + odds * (1 + odds)) / (lambda * lambda);
        double p = 1 / (1 + odds);
        return new double[] {lambda, mu, var, p, odds};
    }

    static MomentFit fit(Prepared d, Options options, Executor executor) {
        double[] s = solve(d);
        double[] observed = {s[0], s[1], s[2], s[3]};
        BootstrapResult br = Bootstrap.nonparametric(options.seed(), options.replicates(), d.n, idx -> {
            double[] r = solve(d.subset(idx));
            return new double[] {r[0], r[1], r[2], r[3]};
        }, observed, executor);
        double level = options.level();
        boolean negVar = !(s[2] > 0);
        boolean pOut = s[4] < 0;
        MomentFit.Status status = negVar && pOut ? MomentFit.Status.NEGATIVE_VARIANCE_AND_P_OUTSIDE
                : negVar ? MomentFit.Status.NEGATIVE_VARIANCE
                : pOut ? MomentFit.Status.P_OUTSIDE_UNIT_INTERVAL : MomentFit.Status.OK;
        String message = status == MomentFit.Status.OK ? "moment solution inside the parameter space"
                : "moment solution outside the parameter space: variance of H " + s[2] + ", q/p " + s[4] + " (p "
                        + s[3] + "); the data do not fit an open Poisson exposure stream, or n is too small";
        return new MomentFit(interval(br, 0, level), interval(br, 1, level), interval(br, 2, level),
                interval(br, 3, level), status, message, d.n, br.successful(), br.failed());
    }

    private static Estimate interval(BootstrapResult br, int j, double level) {
        return br.percentile(j, level);
    }

}
