package org.incipit.core.likelihood;

import java.util.List;
import java.util.function.ToDoubleFunction;

import org.apache.commons.numbers.rootfinder.BrentSolver;
import org.apache.commons.statistics.distribution.ChiSquaredDistribution;
import org.apache.commons.statistics.distribution.NormalDistribution;
import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;
import org.incipit.core.inference.InformationCriteria;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * A maximum-likelihood fit: the estimate on the unconstrained and natural scales, the
 * observed-information covariance, the maximised log-likelihood and the convergence status,
 * with Wald, delta-method and profile-likelihood intervals. Immutable; thread-safe if the
 * likelihood is.
 *
 * <p><b>Covariance.</b> The observed information is minus the Hessian of the unconstrained
 * log-likelihood at the optimum (analytic if available, else central differences of the
 * analytic gradient, symmetrised); the covariance is its inverse, computed only if a Cholesky
 * factorisation succeeds (positive definite). The natural-scale covariance is J &Sigma; J with
 * J = diag(dx/du) (delta method); at a stationary point it equals the inverse observed
 * information of the natural parameters. If the information is not positive definite the
 * status is {@link Status#INFORMATION_NOT_POSITIVE_DEFINITE} and every covariance-based
 * method throws {@link EstimationException}.
 */
public final class MaximumLikelihoodFit {

    /** Outcome of fitting. */
    public enum Status {
        /** Maximiser converged and the observed information is positive definite. */
        CONVERGED,
        /** Maximiser did not meet its convergence criterion (see {@link #message()}). */
        NOT_CONVERGED,
        /** Maximiser converged, but the observed information is not positive definite (a saddle, a ridge, or a non-identified parameter). */
        INFORMATION_NOT_POSITIVE_DEFINITE
    }

    private static final Logger LOG = LoggerFactory.getLogger(MaximumLikelihoodFit.class);

    private final Parameterisation parameterisation;
    private final LogLikelihood likelihood;
    private final Maximiser maximiser;
    private final Optimum optimum;
    private final int observations;
    private final double[] covariance; // unconstrained, row-major, or null
    private final Status status;

    private MaximumLikelihoodFit(Parameterisation parameterisation, LogLikelihood likelihood, Maximiser maximiser,
                                 Optimum optimum, int observations) {
        this.parameterisation = parameterisation;
        this.likelihood = likelihood;
        this.maximiser = maximiser;
        this.optimum = optimum;
        this.observations = observations;
        int k = parameterisation.dimension();
        double[] h = Derivatives.hessian(likelihood, optimum.argmax());
        double[] cov = null;
        if (h != null) {
            double[] info = new double[k * k];
            for (int i = 0; i < k * k; i++) {
                info[i] = -h[i];
            }
            cov = Derivatives.inverseIfPositiveDefinite(info, k);
        }
        this.covariance = cov;
        this.status = !optimum.converged() ? Status.NOT_CONVERGED
                : cov == null ? Status.INFORMATION_NOT_POSITIVE_DEFINITE : Status.CONVERGED;
        LOG.debug("fit {}: status {}, log-likelihood {}, {}", parameterisation, status, optimum.value(),
                optimum.message());
    }

    /**
     * Maximises a likelihood written on natural parameters (see
     * {@link Parameterisation#unconstrained(LogLikelihood)}) from one or more natural starts.
     *
     * @param parameterisation names and transforms
     * @param natural          log-likelihood over natural parameters
     * @param naturalStarts    one or more starts inside the natural domain
     * @param observations     number of observations n used in AICc and BIC, &ge; 1
     * @param maximiser        the maximiser
     * @return the fit (check {@link #status()})
     * @throws IllegalArgumentException if a start is outside the domain, n &lt; 1, or no start has a finite value
     */
    public static MaximumLikelihoodFit maximise(Parameterisation parameterisation, LogLikelihood natural,
                                                List<double[]> naturalStarts, int observations,
                                                Maximiser maximiser) {
        LogLikelihood u = parameterisation.unconstrained(natural);
        List<double[]> starts = naturalStarts.stream().map(parameterisation::toUnconstrained).toList();
        Optimum o = starts.size() == 1 ? maximiser.maximise(u, starts.get(0)) : maximiser.maximise(u, starts);
        return of(parameterisation, u, maximiser, o, observations);
    }

    /**
     * Wraps an optimum found by the caller (e.g. by custom multi-start).
     *
     * @param parameterisation names and transforms
     * @param unconstrained    the unconstrained log-likelihood that was maximised
     * @param maximiser        used for re-maximisation in profile intervals
     * @param optimum          the optimum of {@code unconstrained}
     * @param observations     n, &ge; 1
     * @return the fit
     */
    public static MaximumLikelihoodFit of(Parameterisation parameterisation, LogLikelihood unconstrained,
                                          Maximiser maximiser, Optimum optimum, int observations) {
        if (observations < 1) {
            throw new IllegalArgumentException("observations must be >= 1, was " + observations);
        }
        if (unconstrained.dimension() != parameterisation.dimension()
                || optimum.argmax().length != parameterisation.dimension()) {
            throw new IllegalArgumentException("likelihood, optimum and parameterisation must have dimension "
                    + parameterisation.dimension());
        }
        return new MaximumLikelihoodFit(parameterisation, unconstrained, maximiser, optimum, observations);
    }

    /** @return the parameterisation */
    public Parameterisation parameterisation() {
        return parameterisation;
    }

    /** @return the unconstrained log-likelihood that was maximised */
    public LogLikelihood likelihood() {
        return likelihood;
    }

    /** @return the maximiser's result */
    public Optimum optimum() {
        return optimum;
    }

    /** @return fit status */
    public Status status() {
        return status;
    }

    /** @return true if {@link #status()} is {@link Status#CONVERGED} */
    public boolean converged() {
        return status == Status.CONVERGED;
    }

    /** @return the maximiser's message, with the information status appended */
    public String message() {
        return optimum.message() + (status == Status.INFORMATION_NOT_POSITIVE_DEFINITE
                ? "; observed information not positive definite" : "");
    }

    /** @return estimate on the unconstrained scale (new array) */
    public double[] unconstrainedEstimate() {
        return optimum.argmax();
    }

    /** @return estimate on the natural scale (new array) */
    public double[] naturalEstimate() {
        return parameterisation.toNatural(optimum.argmax());
    }

    /** @param name parameter name @return its natural estimate */
    public double naturalEstimate(String name) {
        return naturalEstimate()[parameterisation.indexOf(name)];
    }

    /** @return maximised log-likelihood */
    public double logLikelihood() {
        return optimum.value();
    }

    /** @return number of observations n */
    public int observations() {
        return observations;
    }

    /** @return number of estimated parameters k */
    public int parameters() {
        return parameterisation.dimension();
    }

    /** @return AIC = 2k - 2 l (Akaike 1974) */
    public double aic() {
        return InformationCriteria.aic(logLikelihood(), parameters());
    }

    /** @return AICc (Hurvich &amp; Tsai 1989), +&infin; if n &le; k + 1 */
    public double aicc() {
        return InformationCriteria.aicc(logLikelihood(), parameters(), observations);
    }

    /** @return BIC = k ln n - 2 l (Schwarz 1978) */
    public double bic() {
        return InformationCriteria.bic(logLikelihood(), parameters(), observations);
    }

    /**
     * @param name label of the model
     * @return this fit as a candidate for {@link org.incipit.core.inference.ModelComparison}
     * @throws EstimationException if the fit did not converge (its log-likelihood is not a maximum)
     */
    public org.incipit.core.inference.ModelComparison.Candidate candidate(String name) {
        requireConverged();
        return new org.incipit.core.inference.ModelComparison.Candidate(name, logLikelihood(), parameters(),
                observations);
    }

    /** @return true if a covariance is available (information positive definite) */
    public boolean hasCovariance() {
        return covariance != null;
    }

    /**
     * @return unconstrained covariance, k&times;k (new array)
     * @throws EstimationException if the information is not positive definite
     */
    public double[][] unconstrainedCovariance() {
        return toMatrix(requireCovariance());
    }

    /**
     * @return natural covariance J &Sigma; J, k&times;k (new array)
     * @throws EstimationException if the information is not positive definite
     */
    public double[][] naturalCovariance() {
        double[] c = requireCovariance();
        double[] j = parameterisation.jacobianDiagonal(optimum.argmax());
        int k = j.length;
        double[][] m = new double[k][k];
        for (int a = 0; a < k; a++) {
            for (int b = 0; b < k; b++) {
                m[a][b] = j[a] * c[a * k + b] * j[b];
            }
        }
        return m;
    }

    /**
     * @param i parameter index
     * @return delta-method standard error of the natural parameter i
     * @throws EstimationException if the information is not positive definite
     */
    public double naturalStandardError(int i) {
        return Math.sqrt(naturalCovariance()[i][i]);
    }

    /**
     * Wald interval computed on the unconstrained scale, u &plusmn; z se(u), and mapped back by
     * the parameter's transform, so a positive parameter keeps a positive interval (for the log
     * transform this is the log-Wald interval).
     *
     * @param i     parameter index
     * @param level coverage in (0, 1)
     * @return the interval, method "wald-" + transform
     * @throws EstimationException if the fit did not converge or has no covariance
     */
    public Estimate wald(int i, double level) {
        requireConverged();
        double z = normalQuantile(level);
        double u = optimum.argmax()[i];
        double se = Math.sqrt(requireCovariance()[i * parameters() + i]);
        ParameterTransform t = parameterisation.transform(i);
        return new Estimate(t.toNatural(u), t.toNatural(u - z * se), t.toNatural(u + z * se), level,
                "wald-" + t);
    }

    /** @param name parameter name @param level coverage @return {@link #wald(int, double)} */
    public Estimate wald(String name, double level) {
        return wald(parameterisation.indexOf(name), level);
    }

    /**
     * Delta-method interval for a derived quantity q = f(natural parameters), on the scale of
     * q: q &plusmn; z sqrt(g' &Sigma;_u g), g = dq/du by central differences in u with step
     * eps^(1/3) max(1,|u_j|) (so the parameters never leave their domain).
     *
     * @param f     derived quantity of the natural vector (which it must not keep); finite at the estimate
     * @param level coverage
     * @return the interval, method "delta"
     * @throws EstimationException if not converged, no covariance, or f or its gradient is not finite
     */
    public Estimate delta(ToDoubleFunction<double[]> f, double level) {
        return delta(f, level, ParameterTransform.identity());
    }

    /**
     * Delta-method interval made on a transformed scale of q (e.g. {@link ParameterTransform#log()}
     * for a positive q) and mapped back: t^-1( t(q) &plusmn; z se(t(q)) ).
     *
     * @param f     derived quantity of the natural parameters
     * @param level coverage
     * @param scale transform whose domain contains q
     * @return the interval, method "delta-" + scale
     */
    public Estimate delta(ToDoubleFunction<double[]> f, double level, ParameterTransform scale) {
        requireConverged();
        double z = normalQuantile(level);
        double[] c = requireCovariance();
        ToDoubleFunction<double[]> h = u -> scale.toUnconstrained(f.applyAsDouble(parameterisation.toNatural(u)));
        double q;
        try {
            q = h.applyAsDouble(optimum.argmax());
        } catch (IllegalArgumentException e) {
            throw new EstimationException("derived quantity outside the domain of " + scale + ": " + e.getMessage(), e);
        }
        double[] g;
        try {
            g = Derivatives.numericalGradient(h, optimum.argmax());
        } catch (IllegalArgumentException e) {
            throw new EstimationException("derived quantity left the domain of " + scale
                    + " within a difference step: " + e.getMessage(), e);
        }
        int k = g.length;
        double var = 0;
        for (int a = 0; a < k; a++) {
            for (int b = 0; b < k; b++) {
                var += g[a] * c[a * k + b] * g[b];
            }
        }
        if (!Double.isFinite(q) || !Double.isFinite(var)) {
            throw new EstimationException("derived quantity or its gradient is not finite at the estimate");
        }
        double se = Math.sqrt(var);
        return new Estimate(scale.toNatural(q), scale.toNatural(q - z * se), scale.toNatural(q + z * se), level,
                scale == ParameterTransform.identity() ? "delta" : "delta-" + scale);
    }

    /**
     * Profile-likelihood interval for natural parameter i: the set of values whose profile
     * log-likelihood (nuisance parameters re-maximised, warm-started from the neighbouring
     * point) is within chi&sup2;_1(level)/2 of the maximum (Pawitan 2001, sec. 3.4; Venzon &amp;
     * Moolgavkar 1988). Each bound is bracketed by stepping away from the estimate on the
     * unconstrained scale in growing steps (first step one standard error, or 0.5 without
     * covariance; factor 1.6) and refined by Brent's method to 1e-10 in u. If the drop is not
     * reached before |u - u_hat| exceeds 40 (for the log transform: a factor e^40) the bound
     * is reported as the edge of the natural domain ({@code -Infinity}/{@code +Infinity}, or 0
     * for a log-transformed parameter, 0/1 for a logit one).
     *
     * @param i     parameter index
     * @param level coverage in (0, 1)
     * @return the interval, method "profile"
     * @throws EstimationException if the fit did not converge, a nuisance re-maximisation failed,
     *                             or a profile point exceeds the maximum (the fit was not global)
     */
    public Estimate profile(int i, double level) {
        requireConverged();
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
        double target = logLikelihood() - 0.5 * ChiSquaredDistribution.of(1).inverseCumulativeProbability(level);
        double uHat = optimum.argmax()[i];
        double step = covariance != null ? Math.sqrt(covariance[i * parameters() + i]) : 0.5;
        ParameterTransform t = parameterisation.transform(i);
        double lo = profileBound(i, uHat, -step, target);
        double hi = profileBound(i, uHat, step, target);
        double lower = Double.isInfinite(lo) ? t.lowerBound() : t.toNatural(lo);
        double upper = Double.isInfinite(hi) ? t.upperBound() : t.toNatural(hi);
        return new Estimate(t.toNatural(uHat), lower, upper, level, "profile");
    }

    /** @param name parameter name @param level coverage @return {@link #profile(int, double)} */
    public Estimate profile(String name, double level) {
        return profile(parameterisation.indexOf(name), level);
    }

    /**
     * Profile-likelihood interval for a derived quantity q = f(natural parameters): the set of
     * c with max{ l(theta) : q(theta) = c } &ge; l_hat &minus; chi&sup2;_1(level)/2. The constrained
     * maximum is found by the augmented-Lagrangian method (Nocedal &amp; Wright 2006, Alg. 17.4;
     * penalty starting at 10/se&sup2;, times 10 until |q &minus; c| &le; 1e-10 max(1, |c|); gradient
     * of q by central differences in u), warm-started from the neighbouring point. Bounds are
     * bracketed by steps from q_hat growing by 1.6 (first step the delta-method standard error,
     * or 0.1 max(1, |q_hat|)) and refined by Brent's method to 1e-10 relative. A value c that
     * q cannot reach counts as below the threshold, so a bound may be the edge of q's range.
     * If the drop is not reached after 40 steps the bound is &plusmn;&infin;.
     *
     * @param quantity derived quantity of the natural vector (which it must not keep); finite near the estimate
     * @param level    coverage in (0, 1)
     * @return the interval, method "profile"
     * @throws EstimationException if the fit did not converge, q is not finite at the estimate,
     *                             or a profile point exceeds the maximum
     */
    public Estimate profile(ToDoubleFunction<double[]> quantity, double level) {
        requireConverged();
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
        double target = logLikelihood() - 0.5 * ChiSquaredDistribution.of(1).inverseCumulativeProbability(level);
        ToDoubleFunction<double[]> q = u -> quantity.applyAsDouble(parameterisation.toNatural(u));
        double qHat = q.applyAsDouble(optimum.argmax());
        if (!Double.isFinite(qHat)) {
            throw new EstimationException("derived quantity is not finite at the estimate: " + qHat);
        }
        double se = Double.NaN;
        if (covariance != null) {
            double[] g = Derivatives.numericalGradient(q, optimum.argmax());
            double var = 0;
            int k = g.length;
            for (int a = 0; a < k; a++) {
                for (int b = 0; b < k; b++) {
                    var += g[a] * covariance[a * k + b] * g[b];
                }
            }
            se = Math.sqrt(var);
        }
        if (!(se > 0 && Double.isFinite(se))) {
            se = 0.1 * Math.max(1, Math.abs(qHat));
        }
        double lower = derivedBound(q, qHat, -se, target);
        double upper = derivedBound(q, qHat, se, target);
        return new Estimate(qHat, lower, upper, level, "profile");
    }

    private double derivedBound(ToDoubleFunction<double[]> q, double qHat, double step, double target) {
        ConstrainedProfile p = new ConstrainedProfile(q, Math.abs(step));
        double inner = qHat;
        double delta = step;
        for (int j = 0; j < 40; j++) {
            double c = qHat + delta;
            if (p.value(c) < target) {
                double a = Math.min(inner, c);
                double b = Math.max(inner, c);
                double tol = 1e-10 * Math.max(Math.abs(a), Math.abs(b));
                return new BrentSolver(tol, 1e-14, 0).findRoot(x -> p.value(x) - target, a, b);
            }
            inner = c;
            delta *= 1.6;
        }
        return Math.signum(step) * Double.POSITIVE_INFINITY;
    }

    /** max l subject to q = c by augmented Lagrangian; warm-started; not thread-safe. */
    private final class ConstrainedProfile {
        private final ToDoubleFunction<double[]> q;
        private final double scale;
        private double[] theta = optimum.argmax();

        ConstrainedProfile(ToDoubleFunction<double[]> q, double scale) {
            this.q = q;
            this.scale = scale;
        }

        double value(double c) {
            double mu = 10 / (scale * scale);
            double lambda = 0;
            double[] t = theta.clone();
            double tol = 1e-10 * Math.max(1, Math.abs(c));
            double lastViolation = Double.POSITIVE_INFINITY;
            for (int outer = 0; outer < 40; outer++) {
                LogLikelihood aug = new Augmented(c, lambda, mu);
                if (!Double.isFinite(aug.value(t))) {
                    t = optimum.argmax();
                }
                Optimum o = maximiser.maximise(aug, t);
                t = o.argmax();
                double r = q.applyAsDouble(t) - c;
                if (!Double.isFinite(r)) {
                    return Double.NEGATIVE_INFINITY;
                }
                if (Math.abs(r) <= tol && o.converged()) {
                    theta = t;
                    double v = likelihood.value(t);
                    if (v > logLikelihood() + 1e-6 * Math.max(1, Math.abs(logLikelihood()))) {
                        throw new EstimationException("profile of the derived quantity at " + c + " has log-likelihood "
                                + v + " above the fitted maximum " + logLikelihood()
                                + "; the fit is not the global maximum (try more starts)");
                    }
                    LOG.debug("derived profile at {}: {} after {} outer iterations", c, v, outer + 1);
                    return v;
                }
                lambda += mu * r;
                if (Math.abs(r) > 0.25 * lastViolation) {
                    mu *= 10;
                }
                lastViolation = Math.abs(r);
                if (mu > 1e14 / (scale * scale)) {
                    break;
                }
            }
            LOG.debug("derived profile at {}: constraint not met (value treated as -Infinity)", c);
            return Double.NEGATIVE_INFINITY;
        }

        private final class Augmented implements LogLikelihood {
            private final double c;
            private final double lambda;
            private final double mu;

            Augmented(double c, double lambda, double mu) {
                this.c = c;
                this.lambda = lambda;
                this.mu = mu;
            }

            @Override
            public int dimension() {
                return likelihood.dimension();
            }

            @Override
            public double value(double[] t) {
                double r = q.applyAsDouble(t) - c;
                return likelihood.value(t) - lambda * r - 0.5 * mu * r * r;
            }

            @Override
            public double valueAndGradient(double[] t, double[] g) {
                double v = likelihood.valueAndGradient(t, g);
                if (!Double.isFinite(v)) {
                    return v;
                }
                double r = q.applyAsDouble(t) - c;
                double[] dq = Derivatives.numericalGradient(q, t);
                for (int i = 0; i < g.length; i++) {
                    g[i] -= (lambda + mu * r) * dq[i];
                }
                return v - lambda * r - 0.5 * mu * r * r;
            }
        }
    }

    private static final double PROFILE_REACH = 40;

    private double profileBound(int i, double uHat, double step, double target) {
        Profile p = new Profile(i);
        double inner = uHat;
        double delta = step;
        while (Math.abs(delta) <= PROFILE_REACH) {
            double v = uHat + delta;
            double pv = p.value(v);
            if (pv < target) {
                double a = Math.min(inner, v);
                double b = Math.max(inner, v);
                return new BrentSolver(1e-10, 1e-14, 0).findRoot(x -> p.value(x) - target, a, b);
            }
            inner = v;
            delta *= 1.6;
        }
        double v = uHat + Math.signum(step) * PROFILE_REACH;
        if (p.value(v) < target) {
            double a = Math.min(inner, v);
            double b = Math.max(inner, v);
            return new BrentSolver(1e-10, 1e-14, 0).findRoot(x -> p.value(x) - target, a, b);
        }
        return Math.signum(step) * Double.POSITIVE_INFINITY;
    }

    /** Profile log-likelihood in u_i with warm-started nuisance; not thread-safe (local use). */
    private final class Profile {
        private final int index;
        private final double[] nuisance;

        Profile(int index) {
            this.index = index;
            double[] all = optimum.argmax();
            nuisance = new double[all.length - 1];
            for (int j = 0, m = 0; j < all.length; j++) {
                if (j != index) {
                    nuisance[m++] = all[j];
                }
            }
        }

        double value(double v) {
            int k = parameters();
            double result;
            if (k == 1) {
                result = likelihood.value(new double[] {v});
            } else {
                LogLikelihood sub = new FixedCoordinate(likelihood, index, v);
                if (!Double.isFinite(sub.value(nuisance.clone()))) {
                    System.arraycopy(dropIndex(optimum.argmax()), 0, nuisance, 0, nuisance.length);
                }
                if (!Double.isFinite(sub.value(nuisance.clone()))) {
                    return Double.NEGATIVE_INFINITY;
                }
                Optimum o = maximiser.maximise(sub, nuisance);
                if (!o.converged()) {
                    throw new EstimationException("profile of " + parameterisation.names().get(index)
                            + " at u = " + v + ": nuisance maximisation did not converge after "
                            + o.iterations() + " iterations (" + o.message() + ")");
                }
                System.arraycopy(o.argmax(), 0, nuisance, 0, nuisance.length);
                result = o.value();
            }
            if (result > logLikelihood() + 1e-6 * Math.max(1, Math.abs(logLikelihood()))) {
                throw new EstimationException("profile of " + parameterisation.names().get(index) + " at u = " + v
                        + " has log-likelihood " + result + " above the fitted maximum " + logLikelihood()
                        + "; the fit is not the global maximum (try more starts)");
            }
            LOG.debug("profile {} at u = {}: {}", index, v, result);
            return Double.isNaN(result) ? Double.NEGATIVE_INFINITY : result;
        }

        private double[] dropIndex(double[] all) {
            double[] out = new double[all.length - 1];
            for (int j = 0, m = 0; j < all.length; j++) {
                if (j != index) {
                    out[m++] = all[j];
                }
            }
            return out;
        }
    }

    /** The likelihood with coordinate {@code index} held at {@code fixed}. */
    private static final class FixedCoordinate implements LogLikelihood {
        private final LogLikelihood full;
        private final int index;
        private final double fixed;

        FixedCoordinate(LogLikelihood full, int index, double fixed) {
            this.full = full;
            this.index = index;
            this.fixed = fixed;
        }

        @Override
        public int dimension() {
            return full.dimension() - 1;
        }

        private double[] expand(double[] sub) {
            double[] t = new double[full.dimension()];
            for (int j = 0, m = 0; j < t.length; j++) {
                t[j] = j == index ? fixed : sub[m++];
            }
            return t;
        }

        @Override
        public double value(double[] theta) {
            return full.value(expand(theta));
        }

        @Override
        public double valueAndGradient(double[] theta, double[] gradientOut) {
            double[] g = new double[full.dimension()];
            double v = full.valueAndGradient(expand(theta), g);
            for (int j = 0, m = 0; j < g.length; j++) {
                if (j != index) {
                    gradientOut[m++] = g[j];
                }
            }
            return v;
        }

        @Override
        public boolean hasHessian() {
            return full.hasHessian();
        }

        @Override
        public void hessian(double[] theta, double[] out) {
            int k = full.dimension();
            double[] h = new double[k * k];
            full.hessian(expand(theta), h);
            int m = 0;
            for (int a = 0; a < k; a++) {
                for (int b = 0; b < k; b++) {
                    if (a != index && b != index) {
                        out[m++] = h[a * k + b];
                    }
                }
            }
        }
    }

    private void requireConverged() {
        if (status == Status.NOT_CONVERGED) {
            throw new EstimationException("fit did not converge after " + optimum.iterations() + " iterations: "
                    + optimum.message());
        }
    }

    private double[] requireCovariance() {
        if (covariance == null) {
            throw new EstimationException("no covariance: the observed information at the optimum is not positive definite ("
                    + optimum.message() + ")");
        }
        return covariance;
    }

    private static double normalQuantile(double level) {
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
        return NormalDistribution.of(0, 1).inverseCumulativeProbability(0.5 + 0.5 * level);
    }

    private double[][] toMatrix(double[] c) {
        int k = parameters();
        double[][] m = new double[k][k];
        for (int a = 0; a < k; a++) {
            System.arraycopy(c, a * k, m[a], 0, k);
        }
        return m;
    }

    @Override
    public String toString() {
        return "MaximumLikelihoodFit[" + parameterisation.names() + " = " + java.util.Arrays.toString(naturalEstimate())
                + ", logLikelihood=" + logLikelihood() + ", status=" + status + "]";
    }
}
