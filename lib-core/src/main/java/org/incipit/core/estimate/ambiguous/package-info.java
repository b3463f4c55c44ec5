/**
 * Intervals whose start is ambiguous: each case has an end (onset) and several candidate starts
 * (exposures), of which the first to transmit started the interval (docs/methods.md, sections 1
 * and 2).
 *
 * <p>The per-case likelihood is L_i = &Sigma;_j p_(k_j) &Pi;_(l&lt;j) (1 &minus; p_(k_l)) h(t_i &minus; e_ij),
 * divided by the probability P(case) of becoming a case under an {@link
 * org.incipit.core.estimate.ambiguous.ExposureHistory} that the analyst chooses. Estimators:
 * maximum likelihood for a parametric family ({@link
 * org.incipit.core.estimate.ambiguous.AmbiguousStartEstimator}), the moment estimator for open
 * Poisson exposure streams ({@link org.incipit.core.estimate.ambiguous.AmbiguousStartMoments}),
 * a nonparametric EM on a grid ({@link org.incipit.core.estimate.ambiguous.AmbiguousStartEm}) and
 * the naive single-start rules ({@link org.incipit.core.estimate.ambiguous.NaiveRule}), kept so
 * that their bias can be shown next to the corrected estimates.
 */
package org.incipit.core.estimate.ambiguous;
