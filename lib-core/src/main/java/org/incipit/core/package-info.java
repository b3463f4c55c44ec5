/**
 * Incipit core: observations, likelihoods, inference, estimators, growth, branching processes,
 * the outbreak simulator and simulation studies.
 */
package org.incipit.core;
