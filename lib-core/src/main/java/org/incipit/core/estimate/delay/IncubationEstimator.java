package org.incipit.core.estimate.delay;

import org.incipit.core.EstimationException;
import org.incipit.core.observe.ExposureWindows;
import org.incipit.distributions.DelayFamily;

/**
 * Incubation period from exposure windows [a_i, b_i] and onsets o_i under a chosen
 * {@link ExposureWindowModel}. Windows far from the origin are integrated by 32-point
 * Gauss&ndash;Legendre; windows reaching near incubation 0 by parts, through F, so that a
 * density singular at 0 stays accurate (see {@link DelayEstimator}).
 */
public final class IncubationEstimator {

    private IncubationEstimator() {
    }

    /**
     * @param windows exposure windows; an exact exposure needs onset &gt; exposure
     * @param family  family of the incubation period
     * @param model   exposure model
     * @param options options
     * @return the fit (log-likelihood on the model's own scale: probabilities for
     *     interval-censored windows, onset densities otherwise)
     * @throws IllegalArgumentException if an exact exposure coincides with its onset
     * @throws EstimationException      if the likelihood is not finite at any start
     */
    public static DelayFit fit(ExposureWindows windows, DelayFamily family, ExposureWindowModel model,
                               DelayOptions options) {
        DelayLogLikelihood.Builder b = DelayLogLikelihood.builder(family);
        double[] guess = new double[windows.size()];
        double r = model.growthRate();
        for (int i = 0; i < windows.size(); i++) {
            double a = windows.exposureFrom(i);
            double e = windows.exposureTo(i);
            double o = windows.onset(i);
            if (a == e) {
                if (!(o > a)) {
                    throw new IllegalArgumentException("case '" + windows.id(i) + "': exact exposure " + a
                            + " at the onset gives incubation 0, which has no density (an incubation period must be > 0)");
                }
                b.density(o - a);
                guess[i] = o - a;
                continue;
            }
            double lo = o - e;
            double hi = o - a;
            guess[i] = Math.max(0.5 * (lo + hi), 0.1);
            switch (model.kind()) {
                case INTERVAL_CENSORED -> b.interval(lo, hi);
                case UNIFORM -> b.interval(lo, hi).constant(-Math.log(e - a));
                case GROWING -> {
                    double w = e - a;
                    double c = r > 0
                            ? Math.log(r) + r * o - r * e - Math.log(-Math.expm1(-r * w))
                            : Math.log(-r) + r * o - r * a - Math.log(-Math.expm1(r * w));
                    b.tiltedWindow(r, lo, hi).constant(c);
                }
                default -> throw new IllegalStateException("unknown model " + model.kind());
            }
        }
        return DelayEstimator.fit(b.build(), family, guess, windows.size(), options);
    }

    /**
     * Fits all three exposure models.
     *
     * @param windows    exposure windows
     * @param family     family
     * @param growthRate r for the growing model, finite and non-zero
     * @param options    options
     * @return the three fits
     */
    public static IncubationVariants variants(ExposureWindows windows, DelayFamily family, double growthRate,
                                              DelayOptions options) {
        return new IncubationVariants(fit(windows, family, ExposureWindowModel.intervalCensored(), options),
                fit(windows, family, ExposureWindowModel.uniform(), options),
                fit(windows, family, ExposureWindowModel.growing(growthRate), options));
    }
}
