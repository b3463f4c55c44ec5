package org.incipit.core.estimate.delay;

import java.util.ArrayList;
import java.util.List;
import java.util.function.ToDoubleFunction;

import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;
import org.incipit.core.likelihood.LogLikelihood;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.core.likelihood.Optimum;
import org.incipit.core.likelihood.ParameterTransform;
import org.incipit.core.likelihood.Parameterisation;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.ParametricDelay;

/** Shared fitting and summarising for the delay estimators. */
final class DelayFits {

    private DelayFits() {
    }

    static Parameterisation parameterisation(DelayFamily family) {
        List<ParameterTransform> t = new ArrayList<>();
        for (DelayFamily.Domain d : family.parameterDomains()) {
            t.add(d == DelayFamily.Domain.POSITIVE ? ParameterTransform.log() : ParameterTransform.identity());
        }
        return Parameterisation.of(family.parameterNames(), t);
    }

    /** Natural starts from a mean and sd guess: the moment member, then a wider and a narrower one. */
    static List<double[]> starts(DelayFamily family, double mean, double sd) {
        List<double[]> s = new ArrayList<>();
        double m = mean > 0 && Double.isFinite(mean) ? mean : 1;
        double v = sd > 0 && Double.isFinite(sd) ? sd : m;
        double[][] pairs = {{m, v}, {m, 0.5 * m}, {2 * m, 2 * m}, {0.5 * m, 0.3 * m}, {m, 1.5 * m}};
        for (double[] p : pairs) {
            try {
                s.add(family.ofMeanSd(p[0], p[1]).parameters());
            } catch (IllegalArgumentException e) {
                // no member with these moments: skip the start
            }
        }
        if (s.isEmpty()) {
            throw new IllegalArgumentException("no start for family " + family.name());
        }
        return s;
    }

    /** Maximises from the first start that converges, trying the others only if needed. */
    static MaximumLikelihoodFit maximise(DelayFamily family, LogLikelihood natural, List<double[]> starts,
                                         int n, DelayOptions options) {
        Parameterisation p = parameterisation(family);
        LogLikelihood u = p.unconstrained(natural);
        MaximumLikelihoodFit best = null;
        for (double[] start : starts) {
            if (!Double.isFinite(natural.value(start))) {
                continue;
            }
            Optimum o = options.maximiser().maximise(u, p.toUnconstrained(start));
            MaximumLikelihoodFit f = MaximumLikelihoodFit.of(p, u, options.maximiser(), o, n);
            if (best == null || (f.converged() && (!best.converged() || f.logLikelihood() > best.logLikelihood()))) {
                best = f;
            }
            if (best.converged()) {
                break;
            }
        }
        if (best == null) {
            throw new EstimationException("the " + family.name()
                    + " log-likelihood is not finite at any starting value (" + starts.size() + " tried)");
        }
        return best;
    }

    static DelayFit summarise(DelayFamily family, MaximumLikelihoodFit fit, DelayOptions options) {
        double level = options.level();
        double[] theta = fit.naturalEstimate();
        ParametricDelay at = family.of(theta);
        boolean ok = fit.converged();
        List<Estimate> params = new ArrayList<>();
        for (int i = 0; i < theta.length; i++) {
            params.add(ok ? fit.wald(i, level) : unavailable(theta[i], level));
        }
        Estimate mean = derived(fit, ok, t -> family.of(t).mean(), at.mean(), level);
        Estimate sd = derived(fit, ok, t -> family.of(t).sd(), at.sd(), level);
        List<QuantileEstimate> qs = new ArrayList<>();
        for (double p : options.quantiles()) {
            qs.add(new QuantileEstimate(p, derived(fit, ok, t -> family.of(t).quantile(p), at.quantile(p), level)));
        }
        return new DelayFit(family, family.parameterNames(), params, mean, sd, qs, fit.logLikelihood(), fit.aic(),
                fit.observations(), fit.status(), fit.message(), fit);
    }

    private static Estimate derived(MaximumLikelihoodFit fit, boolean ok, ToDoubleFunction<double[]> q,
                                    double value, double level) {
        if (!ok) {
            return unavailable(value, level);
        }
        return fit.delta(q, level, ParameterTransform.log());
    }

    static Estimate unavailable(double value, double level) {
        return new Estimate(value, Double.NEGATIVE_INFINITY, Double.POSITIVE_INFINITY, level, "unavailable");
    }

    static double[] meanSd(double[] x) {
        double m = 0;
        for (double v : x) {
            m += v;
        }
        m /= x.length;
        double s = 0;
        for (double v : x) {
            s += (v - m) * (v - m);
        }
        return new double[] {m, x.length > 1 ? Math.sqrt(s / (x.length - 1)) : m};
    }
}
