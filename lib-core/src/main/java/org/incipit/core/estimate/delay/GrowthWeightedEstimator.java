package org.incipit.core.estimate.delay;

import java.util.ArrayList;
import java.util.List;
import java.util.function.DoubleFunction;

import org.apache.commons.statistics.distribution.NormalDistribution;
import org.incipit.core.EstimationException;
import org.incipit.core.growth.EulerLotka;
import org.incipit.core.inference.Estimate;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.core.likelihood.ParameterTransform;
import org.incipit.distributions.DelayFamily;

/**
 * Growth-weighted delays with an uncertain growth rate, and backward-traced intervals.
 *
 * <p><b>Propagating r.</b> The growth rate enters as an {@link Estimate}; its standard error is
 * taken as (upper &minus; lower) / (2 z), z the normal quantile of its level (exact for a
 * symmetric Wald interval, an approximation otherwise). For each reported quantity q (on the
 * log scale for positive quantities) the variance is composed by the delta method over the two
 * independent sources,
 * Var = Var(q | r) + (dq/dr)&sup2; se(r)&sup2;, where Var(q | r) is the engine's delta-method
 * variance at r&#770; and dq/dr is a central difference of q(&theta;&#770;(r), r) between refits
 * at r&#770; &plusmn; se(r)/2 (warm-started). The interval is q &plusmn; z sqrt(Var) on that scale,
 * method {@code "delta-growth"}. With se(r) = 0 the intervals are the conditional ones.
 */
public final class GrowthWeightedEstimator {

    private GrowthWeightedEstimator() {
    }

    /**
     * @param delays     observed delays in days, finite and &gt; 0 (not modified)
     * @param family     family of the intrinsic delay
     * @param growthRate growth rate per day with an interval (finite bounds)
     * @param options    options
     * @return the fit with r's uncertainty carried
     * @throws IllegalArgumentException if a delay is not positive or the rate's interval is not finite
     * @throws EstimationException      if a fit fails
     */
    public static GrowthWeightedFit fit(double[] delays, DelayFamily family, Estimate growthRate,
                                        DelayOptions options) {
        return fit(new Composer(delays, family, growthRate, options), family, growthRate);
    }

    private static GrowthWeightedFit fit(Composer c, DelayFamily family, Estimate growthRate) {
        List<Estimate> params = new ArrayList<>();
        for (int i = 0; i < family.dimension(); i++) {
            int j = i;
            boolean positive = family.parameterDomains().get(i) == DelayFamily.Domain.POSITIVE;
            params.add(c.compose((t, r) -> t[j], positive ? ParameterTransform.log() : ParameterTransform.identity()));
        }
        Estimate mean = c.compose((t, r) -> family.of(t).mean(), ParameterTransform.log());
        Estimate sd = c.compose((t, r) -> family.of(t).sd(), ParameterTransform.log());
        return new GrowthWeightedFit(c.center, growthRate, params, mean, sd);
    }

    /**
     * Backward-traced generation or serial intervals: fits the observed intervals naively and
     * as the tilt of the intrinsic interval by r, and reports R = 1 / M(&minus;r) for both
     * (docs/methods.md section 3), computed by {@link EulerLotka#reproductionNumber}.
     *
     * @param intervals  observed backward-traced intervals in days, finite and &gt; 0
     * @param family     family of the intrinsic interval
     * @param growthRate growth rate per day with an interval
     * @param options    options
     * @return naive and corrected fits and reproduction numbers
     * @throws EstimationException if a fit fails or M(&minus;r) is infinite (no Euler&ndash;Lotka solution)
     */
    public static BackwardIntervalFit backwardTraced(double[] intervals, DelayFamily family, Estimate growthRate,
                                                     DelayOptions options) {
        Composer c = new Composer(intervals, family, growthRate, options);
        GrowthWeightedFit corrected = fit(c, family, growthRate);
        DelayFit naive = DelayEstimator.growthWeighted(intervals, family, 0.0, options);
        Estimate rCorrected = c.compose((t, r) -> reproduction(family, t, r), ParameterTransform.log());
        Composer n = new Composer(naive, growthRate, options);
        Estimate rNaive = n.compose((t, r) -> reproduction(family, t, r), ParameterTransform.log());
        return new BackwardIntervalFit(naive, corrected, rNaive, rCorrected);
    }

    static double reproduction(DelayFamily family, double[] theta, double r) {
        try {
            return EulerLotka.reproductionNumber(family.of(theta), r);
        } catch (IllegalArgumentException e) {
            throw new EstimationException("Euler-Lotka has no solution for the " + family.name() + ": "
                    + e.getMessage(), e);
        }
    }

    /** A quantity of natural parameters and r. */
    interface Quantity {
        double at(double[] theta, double r);
    }

    /** Fits at r-hat and r-hat +- se/2, and composes variances. */
    private static final class Composer {
        final DelayFit center;
        final MaximumLikelihoodFit lower; // refits at r -+ h: only their estimates are used
        final MaximumLikelihoodFit upper;
        final double r;
        final double se;
        final double h;
        final double level;

        /** Growth-weighted fits, which depend on r. */
        Composer(double[] delays, DelayFamily family, Estimate growthRate, DelayOptions options) {
            this.r = growthRate.estimate();
            this.se = se(growthRate);
            this.h = 0.5 * se;
            this.level = options.level();
            center = DelayEstimator.growthWeighted(delays, family, r, options);
            if (se > 0) {
                DoubleFunction<MaximumLikelihoodFit> refit = rr -> DelayFits.maximise(family,
                        DelayEstimator.growthLikelihood(delays, family, rr),
                        List.of(center.fit().naturalEstimate()), delays.length, options);
                lower = refit.apply(r - h);
                upper = refit.apply(r + h);
            } else {
                lower = center.fit();
                upper = center.fit();
            }
            for (MaximumLikelihoodFit f : new MaximumLikelihoodFit[] {center.fit(), lower, upper}) {
                if (!f.converged()) {
                    throw new EstimationException("growth-weighted " + family.name() + " fit did not converge: "
                            + f.message());
                }
            }
        }

        /** A fit that does not depend on r (quantities may). */
        Composer(DelayFit fixed, Estimate growthRate, DelayOptions options) {
            this.r = growthRate.estimate();
            this.se = se(growthRate);
            this.h = 0.5 * se;
            this.level = options.level();
            this.center = fixed;
            this.lower = fixed.fit();
            this.upper = fixed.fit();
            if (!fixed.converged()) {
                throw new EstimationException("fit did not converge: " + fixed.message());
            }
        }

        Estimate compose(Quantity q, ParameterTransform scale) {
            MaximumLikelihoodFit f = center.fit();
            Estimate cond = f.delta(t -> q.at(t, r), level, scale);
            double z = NormalDistribution.of(0, 1).inverseCumulativeProbability(0.5 + 0.5 * level);
            double qs = scale.toUnconstrained(cond.estimate());
            double seCond = (scale.toUnconstrained(cond.upper()) - qs) / z;
            double var = seCond * seCond;
            if (se > 0) {
                double qUp = scale.toUnconstrained(q.at(upper.naturalEstimate(), r + h));
                double qDn = scale.toUnconstrained(q.at(lower.naturalEstimate(), r - h));
                double dq = (qUp - qDn) / (2 * h);
                var += dq * dq * se * se;
            }
            double s = Math.sqrt(var);
            if (!Double.isFinite(s)) {
                throw new EstimationException("composed standard error is not finite");
            }
            return new Estimate(cond.estimate(), scale.toNatural(qs - z * s), scale.toNatural(qs + z * s), level,
                    se > 0 ? "delta-growth" : cond.method());
        }

        private static double se(Estimate e) {
            if (!Double.isFinite(e.lower()) || !Double.isFinite(e.upper())) {
                throw new IllegalArgumentException("growthRate needs a finite interval, was [" + e.lower() + ", "
                        + e.upper() + "]");
            }
            double z = NormalDistribution.of(0, 1).inverseCumulativeProbability(0.5 + 0.5 * e.level());
            return (e.upper() - e.lower()) / (2 * z);
        }
    }
}
