/**
 * Inference on top of a likelihood fit: the {@link org.incipit.core.inference.Estimate} record,
 * the seeded, thread-count-independent {@link org.incipit.core.inference.Bootstrap},
 * {@link org.incipit.core.inference.InformationCriteria} and
 * {@link org.incipit.core.inference.ModelComparison}. Wald, delta-method and profile intervals
 * are computed by {@link org.incipit.core.likelihood.MaximumLikelihoodFit}.
 */
package org.incipit.core.inference;
