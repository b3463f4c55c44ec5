package org.incipit.core.estimate.ambiguous;

import java.util.function.DoubleUnaryOperator;
import java.util.function.ToDoubleFunction;

import org.apache.commons.statistics.distribution.ChiSquaredDistribution;
import org.incipit.core.inference.Estimate;
import org.incipit.core.likelihood.LogLikelihood;
import org.incipit.core.likelihood.Maximiser;
import org.incipit.core.likelihood.Optimum;
import org.incipit.core.likelihood.ParameterTransform;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Profile-likelihood intervals for the ambiguous-start fit: the connected set of values around
 * the estimate whose profile log-likelihood is within chi&sup2;_1(level)/2 of the maximum
 * (Pawitan 2001, In All Likelihood, sec. 3.4 and 9.4, from memory). Not thread-safe; one per
 * fit.
 *
 * <p><b>Constraint by elimination.</b> Every quantity profiled here pins one unconstrained
 * coordinate in closed form, so that each profile point is an unconstrained maximisation over
 * the remaining coordinates by Newton's method on the analytic Hessian (no penalty or Lagrange
 * multiplier):
 * <ul>
 * <li>a coordinate theta_i itself (family parameters, logit p): theta_i = x;</li>
 * <li>a scale-equivariant quantity q of H (mean, sd, any quantile: q scales with the
 *     distribution's scale), with x = log q: gamma q(a, b) = q(a, 1)/b, so log b =
 *     G(log a) &minus; x; Weibull q(k, &lambda;) = &lambda; q(k, 1), so log &lambda; = x &minus;
 *     G(log k); lognormal q(&mu;, &sigma;) = e^&mu; q(0, &sigma;), so &mu; = x &minus; G(log &sigma;),
 *     with G(s) = log q at unit scale. G' and G'' are taken by five-point central differences
 *     (step 2e-3; truncation error O(h^4) ~ 1e-11, rounding ~1e-13 for G').</li>
 * </ul>
 *
 * <p><b>Profile points.</b> Each is maximised from the neighbouring point's maximum; a point
 * found below the threshold there (or not converged) is maximised again from the overall
 * maximum's remaining coordinates and the higher value kept, so that a profile that passes
 * between two local modes of the likelihood (which happens in small samples, where a long H
 * with early infectors and a short H with late ones explain the data about equally well) is
 * not cut short by the lower one. (A value above the threshold needs no second start: the
 * profile is at least that high.) A profile point above the maximum means the fit was not the
 * global maximum: {@link HigherMaximum} carries the better point so that the caller can refit.
 *
 * <p><b>Bounds.</b> Bracketed by steps away from the estimate (first step the delta-method
 * standard error on the profiled scale, clipped to [0.01, 1], growing by 1.6) and refined by
 * the Illinois variant of regula falsi (Dowell &amp; Jarratt 1971, BIT 11:168, from memory) to
 * 1e-9 (absolute on the profiled scale, i.e. relative for log q). A bound not reached within
 * 40 units of the profiled scale (a factor e^40 for log q) is the edge of the domain.
 */
final class ProfileIntervals {

    private static final Logger LOG = LoggerFactory.getLogger(ProfileIntervals.class);

    /** Largest distance from the estimate searched for a bound, on the profiled scale. */
    static final double REACH = 40;
    private static final double STEP_GROWTH = 1.6;
    private static final double TOLERANCE = 1e-9;
    private static final double DIFF_STEP = 2e-3;

    /** The profile found a point above the fitted maximum. */
    static final class HigherMaximum extends RuntimeException {
        private static final long serialVersionUID = 1L;
        final transient double[] theta;
        final double value;

        HigherMaximum(double[] theta, double value) {
            super("profile point above the fitted maximum", null, false, false);
            this.theta = theta;
            this.value = value;
        }
    }

    private final LogLikelihood ll;
    private final Family family;
    private final double[] thetaHat;
    private final double logLikelihoodHat;
    private final Maximiser newton = Maximiser.newton();

    /**
     * @param ll               the full unconstrained log-likelihood (with Hessian)
     * @param family           the family of H
     * @param thetaHat         the maximum, unconstrained (copied)
     * @param logLikelihoodHat the maximised value
     */
    ProfileIntervals(LogLikelihood ll, Family family, double[] thetaHat, double logLikelihoodHat) {
        this.ll = ll;
        this.family = family;
        this.thetaHat = thetaHat.clone();
        this.logLikelihoodHat = logLikelihoodHat;
    }

    /**
     * Profile interval of unconstrained coordinate i, reported on the natural scale.
     *
     * @param i     coordinate index
     * @param t     its transform (natural = t.toNatural(theta_i))
     * @param level coverage
     * @param se    a standard error of theta_i for the first bracketing step (NaN if unknown)
     */
    Estimate coordinate(int i, ParameterTransform t, double level, double se) {
        Pin pin = new Pin(i, -1, 0, null);
        double[] b = bounds(pin, thetaHat[i], level, se);
        double lower = Double.isInfinite(b[0]) ? t.lowerBound() : t.toNatural(b[0]);
        double upper = Double.isInfinite(b[1]) ? t.upperBound() : t.toNatural(b[1]);
        double v = t.toNatural(thetaHat[i]);
        return new Estimate(v, Math.min(lower, v), Math.max(upper, v), level, "profile");
    }

    /**
     * Profile interval of a scale-equivariant quantity of H.
     *
     * @param q     the quantity as a function of the natural parameters (p1, p2) of H
     * @param level coverage
     * @param seLog a standard error of log q for the first bracketing step (NaN if unknown)
     */
    Estimate quantity(ToDoubleFunction<double[]> q, double level, double seLog) {
        DoubleUnaryOperator g;
        Pin pin;
        switch (family) {
            case GAMMA -> {
                g = s -> Math.log(q.applyAsDouble(new double[] {Math.exp(s), 1}));
                pin = new Pin(1, 0, -1, g);
            }
            case WEIBULL -> {
                g = s -> Math.log(q.applyAsDouble(new double[] {Math.exp(s), 1}));
                pin = new Pin(1, 0, 1, g);
            }
            case LOGNORMAL -> {
                g = s -> Math.log(q.applyAsDouble(new double[] {0, Math.exp(s)}));
                pin = new Pin(0, 1, 1, g);
            }
            default -> throw new IllegalStateException("family " + family);
        }
        double[] nat = family.natural(thetaHat[0], thetaHat[1]);
        double v = q.applyAsDouble(nat);
        double[] b = bounds(pin, Math.log(v), level, seLog);
        double lower = Double.isInfinite(b[0]) ? 0 : Math.exp(b[0]);
        double upper = Double.isInfinite(b[1]) ? Double.POSITIVE_INFINITY : Math.exp(b[1]);
        return new Estimate(v, Math.min(lower, v), Math.max(upper, v), level, "profile");
    }

    /**
     * Which coordinate x pins: theta[pinned] = x (dep &lt; 0), or sign (x &minus; G(theta[dep])).
     */
    private record Pin(int pinned, int dep, double sign, DoubleUnaryOperator g) {

        double pinnedValue(double x, double[] theta) {
            return dep < 0 ? x : sign * (x - safe(theta[dep]));
        }

        /** G, or NaN where the quantity cannot be computed (e.g. a quantile at an extreme shape). */
        private double safe(double s) {
            try {
                return g.applyAsDouble(s);
            } catch (ArithmeticException | IllegalArgumentException e) {
                return Double.NaN;
            }
        }

        /** {d theta_pinned / d theta_dep, d^2 theta_pinned / d theta_dep^2}. */
        double[] derivatives(double s) {
            double h = DIFF_STEP;
            double f2m = safe(s - 2 * h);
            double f1m = safe(s - h);
            double f0 = safe(s);
            double f1p = safe(s + h);
            double f2p = safe(s + 2 * h);
            double d1 = (8 * (f1p - f1m) - (f2p - f2m)) / (12 * h);
            double d2 = (-f2p + 16 * f1p - 30 * f0 + 16 * f1m - f2m) / (12 * h * h);
            return new double[] {-sign * d1, -sign * d2};
        }
    }

    /** The log-likelihood over the free coordinates at a fixed value x of the profiled quantity. */
    private final class Sub implements LogLikelihood {
        private final Pin pin;
        private final double x;
        private final int dim = thetaHat.length;
        private double[] lastTheta;
        private double[] lastGradient;

        Sub(Pin pin, double x) {
            this.pin = pin;
            this.x = x;
        }

        @Override
        public int dimension() {
            return dim - 1;
        }

        double[] full(double[] y) {
            double[] t = new double[dim];
            for (int j = 0, m = 0; j < dim; j++) {
                if (j != pin.pinned) {
                    t[j] = y[m++];
                }
            }
            t[pin.pinned] = pin.pinnedValue(x, t);
            return t;
        }

        double[] free(double[] t) {
            double[] y = new double[dim - 1];
            for (int j = 0, m = 0; j < dim; j++) {
                if (j != pin.pinned) {
                    y[m++] = t[j];
                }
            }
            return y;
        }

        /** Index of theta coordinate j among the free ones. */
        private int freeIndex(int j) {
            return j < pin.pinned ? j : j - 1;
        }

        @Override
        public double value(double[] y) {
            double[] t = full(y);
            return Double.isFinite(t[pin.pinned]) ? ll.value(t) : Double.NaN;
        }

        @Override
        public double valueAndGradient(double[] y, double[] out) {
            double[] t = full(y);
            if (!Double.isFinite(t[pin.pinned])) {
                return Double.NaN;
            }
            double[] g = new double[dim];
            double v = ll.valueAndGradient(t, g);
            lastTheta = t;
            lastGradient = g;
            for (int j = 0; j < dim; j++) {
                if (j != pin.pinned) {
                    out[freeIndex(j)] = g[j];
                }
            }
            if (pin.dep >= 0) {
                out[freeIndex(pin.dep)] += g[pin.pinned] * pin.derivatives(t[pin.dep])[0];
            }
            return v;
        }

        @Override
        public boolean hasHessian() {
            return true;
        }

        @Override
        public void hessian(double[] y, double[] out) {
            double[] t = full(y);
            double[] h = new double[dim * dim];
            ll.hessian(t, h);
            int f = dim - 1;
            // J: free -> full; column freeIndex(j) is e_j, plus c1 e_pinned in the dep column
            double c1 = 0;
            double c2 = 0;
            double gp = 0;
            if (pin.dep >= 0) {
                double[] d = pin.derivatives(t[pin.dep]);
                c1 = d[0];
                c2 = d[1];
                double[] g = lastGradient;
                if (lastTheta == null || !java.util.Arrays.equals(lastTheta, t)) {
                    g = new double[dim];
                    ll.valueAndGradient(t, g);
                }
                gp = g[pin.pinned];
            }
            for (int a = 0; a < dim; a++) {
                if (a == pin.pinned) {
                    continue;
                }
                for (int b = 0; b < dim; b++) {
                    if (b == pin.pinned) {
                        continue;
                    }
                    double v = h[a * dim + b];
                    if (a == pin.dep) {
                        v += c1 * h[pin.pinned * dim + b];
                    }
                    if (b == pin.dep) {
                        v += c1 * h[a * dim + pin.pinned];
                    }
                    if (a == pin.dep && b == pin.dep) {
                        v += c1 * c1 * h[pin.pinned * dim + pin.pinned] + gp * c2;
                    }
                    out[freeIndex(a) * f + freeIndex(b)] = v;
                }
            }
        }
    }

    /** One evaluated profile point: x, its profile value and the maximising free coordinates. */
    private record Point(double x, double value, double[] y) {
    }

    private Point evaluate(Pin pin, double x, Point near, double target) {
        Sub sub = new Sub(pin, x);
        double[] fromHat = sub.free(thetaHat);
        Optimum best = null;
        for (double[] start : near == null ? new double[][] {fromHat} : new double[][] {near.y, fromHat}) {
            if (best != null && best.converged() && best.value() >= target) {
                break; // a value above the threshold is above it whatever the other start finds
            }
            if (!Double.isFinite(sub.value(start))) {
                continue;
            }
            Optimum o = newton.maximise(sub, start);
            if (!o.converged()) {
                Optimum b = Maximiser.bfgs().maximise(sub, o.argmax());
                if (b.value() >= o.value()) {
                    o = b;
                }
            }
            if (best == null || (o.converged() && !best.converged())
                    || (o.converged() == best.converged() && o.value() > best.value())) {
                best = o;
            }
        }
        if (best == null || !Double.isFinite(best.value())) {
            LOG.debug("profile at {}: no finite value", x);
            return new Point(x, Double.NEGATIVE_INFINITY, near != null ? near.y : fromHat);
        }
        if (!best.converged()) {
            // a lower bound of the profile; only used as such (it can only end a bracket early)
            LOG.debug("profile at {}: nuisance maximisation did not converge ({})", x, best.message());
        }
        double tol = 1e-8 * Math.max(1, Math.abs(logLikelihoodHat));
        if (best.value() > logLikelihoodHat + tol) {
            throw new HigherMaximum(sub.full(best.argmax()), best.value());
        }
        return new Point(x, best.value(), best.argmax());
    }

    private double[] bounds(Pin pin, double xHat, double level, double se) {
        double target = logLikelihoodHat - 0.5 * ChiSquaredDistribution.of(1).inverseCumulativeProbability(level);
        double step = se > 0 && Double.isFinite(se) ? Math.max(0.01, Math.min(1, se)) : 0.3;
        Point hat = new Point(xHat, logLikelihoodHat, new Sub(pin, xHat).free(thetaHat));
        return new double[] {bound(pin, hat, -step, target), bound(pin, hat, step, target)};
    }

    private double bound(Pin pin, Point hat, double step, double target) {
        Point inner = hat;
        double delta = step;
        while (true) {
            double x = hat.x + (Math.abs(delta) > REACH ? Math.signum(delta) * REACH : delta);
            Point p = evaluate(pin, x, inner, target);
            if (p.value < target) {
                return refine(pin, inner, p, target);
            }
            if (Math.abs(delta) >= REACH) {
                return Math.signum(step) * Double.POSITIVE_INFINITY;
            }
            inner = p;
            delta *= STEP_GROWTH;
        }
    }

    /** Illinois regula falsi on value - target between inner (above) and outer (below). */
    private double refine(Pin pin, Point inner, Point outer, double target) {
        double fa = inner.value - target;
        double fb = Double.isFinite(outer.value) ? outer.value - target : -Math.max(1, fa);
        Point a = inner;
        Point b = outer;
        int side = 0;
        for (int it = 0; it < 100 && Math.abs(b.x - a.x) > TOLERANCE * Math.max(1, Math.abs(b.x)); it++) {
            double x = b.x - fb * (b.x - a.x) / (fb - fa);
            if (!(x > Math.min(a.x, b.x) && x < Math.max(a.x, b.x))) {
                x = 0.5 * (a.x + b.x);
            }
            Point c = evaluate(pin, x, a, target);
            double fc = Double.isFinite(c.value) ? c.value - target : -Math.max(1, fa);
            if (Math.abs(fc) < 1e-12 * Math.max(1, Math.abs(target))) {
                return c.x;
            }
            if (fc >= 0) {
                a = c;
                fa = fc;
                if (side == -1) {
                    fb *= 0.5;
                }
                side = -1;
            } else {
                b = c;
                fb = fc;
                if (side == 1) {
                    fa *= 0.5;
                }
                side = 1;
            }
        }
        return fa <= -fb ? a.x : b.x;
    }
}
