package org.incipit.core.growth;

import org.incipit.core.inference.Estimate;

/**
 * Posterior of the reproduction number over one window of days, from
 * {@link RenewalEstimator#slidingWindows}.
 *
 * @param firstDay            first day (index into the incidence) of the window
 * @param lastDay             last day of the window
 * @param localCases          &Sigma; i<sub>t</sub> of local cases in the window
 * @param totalInfectiousness &Sigma; &Lambda;<sub>t</sub> over the window
 * @param posterior           gamma posterior (shape, scale)
 * @param reproductionNumber  posterior mean with equal-tailed credible interval
 *                            (method "gamma-posterior")
 * @param median              posterior median
 * @param sd                  posterior standard deviation
 */
public record WindowReproduction(int firstDay, int lastDay, long localCases,
                                 double totalInfectiousness, GammaPrior posterior,
                                 Estimate reproductionNumber, double median, double sd) {

    public WindowReproduction {
        if (lastDay < firstDay || posterior == null || reproductionNumber == null) {
            throw new IllegalArgumentException("invalid window [" + firstDay + ", " + lastDay + "]");
        }
    }
}
