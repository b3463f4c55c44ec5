/**
 * Estimators: one sub-package per question. {@link org.incipit.core.estimate.delay} fits
 * parametric delay distributions (truncated, censored, growth-weighted, backward-traced,
 * incubation windows); {@link org.incipit.core.estimate.fatality} estimates fatality ratios for
 * outcomes that happen with a delay. Every estimator returns estimates with intervals from the
 * likelihood engine ({@link org.incipit.core.likelihood}).
 */
package org.incipit.core.estimate;
