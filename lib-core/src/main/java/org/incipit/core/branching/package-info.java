/**
 * Galton&ndash;Watson branching processes for the early phase of an outbreak: offspring laws
 * (Poisson, negative binomial) with their generating functions and samplers, the extinction
 * probability, the probability of a major outbreak from several introductions, and expected
 * generation sizes conditioned on survival.
 *
 * <p>Start with {@link org.incipit.core.branching.OffspringLaw}.
 */
package org.incipit.core.branching;
