/**
 * The likelihood engine shared by every estimator: {@link org.incipit.core.likelihood.LogLikelihood}
 * over unconstrained parameters, {@link org.incipit.core.likelihood.ParameterTransform} and
 * {@link org.incipit.core.likelihood.Parameterisation} to map natural parameters,
 * the {@link org.incipit.core.likelihood.Maximiser} (BFGS and damped Newton, multi-start) with its
 * {@link org.incipit.core.likelihood.Optimum}, and
 * {@link org.incipit.core.likelihood.MaximumLikelihoodFit} (observed-information covariance, Wald,
 * delta-method and profile-likelihood intervals, information criteria).
 */
package org.incipit.core.likelihood;
