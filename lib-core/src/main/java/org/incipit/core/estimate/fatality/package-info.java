/**
 * Fatality ratios for outcomes that follow onset with a delay: crude, growth-asymptotic,
 * finite-window (delay-adjusted) with binomial profile-likelihood intervals and optional
 * delay-parameter uncertainty, resolved-only and the joint deaths-and-recoveries estimator
 * (docs/methods.md section 5).
 */
package org.incipit.core.estimate.fatality;
