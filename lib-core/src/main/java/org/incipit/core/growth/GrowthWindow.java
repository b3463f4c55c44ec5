package org.incipit.core.growth;

import java.util.Optional;

/**
 * One candidate window of {@link GrowthRateEstimator#compareWindows}: the fit, or why there is
 * none.
 *
 * @param firstDay first day of the window
 * @param lastDay  last day of the window
 * @param fit      the fit, empty if it could not be made
 * @param failure  reason the fit is missing, empty string when present
 */
public record GrowthWindow(int firstDay, int lastDay, Optional<GrowthRateFit> fit, String failure) {

    public GrowthWindow {
        if (fit == null || failure == null) {
            throw new IllegalArgumentException("fit and failure must not be null");
        }
        if (fit.isPresent() == !failure.isEmpty()) {
            throw new IllegalArgumentException("exactly one of fit and failure must be given");
        }
    }
}
