/**
 * Estimators, one package or class per observation scheme; each takes observations, a family
 * and options and returns a result record with estimates and intervals. Delay estimation
 * (truncated, censored, growth-weighted, backward-traced, incubation windows) is in
 * {@link org.incipit.core.estimate.delay}; fatality ratios for delayed outcomes are in
 * {@link org.incipit.core.estimate.fatality}.
 */
package org.incipit.core.estimate;
