/**
 * The outbreak simulator, ground truth for estimator tests and demos: an individual-based,
 * continuous-time branching process ({@link org.incipit.core.simulate.OutbreakSimulator},
 * configured by {@link org.incipit.core.simulate.OutbreakOptions}) producing a line list and
 * daily counts ({@link org.incipit.core.simulate.SimulatedOutbreak}), with candidate exposures
 * recorded under one of three regimes ({@link org.incipit.core.simulate.ExposureModel},
 * {@link org.incipit.core.simulate.ExposureRecording}); and a direct sampler of
 * ambiguous-start case data alone ({@link org.incipit.core.simulate.ExposureSampler}).
 */
package org.incipit.core.simulate;
