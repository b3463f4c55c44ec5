package org.incipit.core.estimate.delay;

import org.incipit.core.inference.Estimate;

/**
 * Generation or serial intervals traced backwards (from infectee to infector) during growth at
 * rate r: the naive fit that ignores r, the corrected fit of the intrinsic interval, and the
 * reproduction number each implies by the Euler&ndash;Lotka equation R = 1 / M_g(&minus;r)
 * (Wallinga &amp; Lipsitch 2007).
 *
 * @param naive                 fit of the observed intervals as if they were intrinsic
 * @param corrected             fit of the intrinsic interval g (observed density = g tilted by r)
 * @param naiveReproduction     1 / M_naive(&minus;r), interval with r's uncertainty
 * @param correctedReproduction 1 / M_g(&minus;r), interval with r's uncertainty
 */
public record BackwardIntervalFit(DelayFit naive, GrowthWeightedFit corrected, Estimate naiveReproduction,
                                  Estimate correctedReproduction) {
    public BackwardIntervalFit {
        if (naive == null || corrected == null || naiveReproduction == null || correctedReproduction == null) {
            throw new IllegalArgumentException("all components are required");
        }
    }
}
