/**
 * Epidemic growth: log-linear growth-rate regression of daily counts (Poisson and negative
 * binomial), the Euler&ndash;Lotka link between growth rate and reproduction number, and the
 * discrete renewal equation (constant R, projection, time-varying R with a conjugate gamma
 * prior).
 *
 * <pre>{@code
 * GrowthRateFit fit = GrowthRateEstimator.fit(days, counts,
 *         GrowthRateOptions.defaults().withModel(CountModel.NEGATIVE_BINOMIAL));
 * Estimate r = fit.rateProfile();                       // per day, profile interval
 * Optional<Estimate> td = fit.doublingTime();           // empty when r <= 0
 * double bigR = EulerLotka.reproductionNumber(generationInterval, r.estimate());
 *
 * InfectivityProfile w = InfectivityProfile.normalised(new double[] {0, 0.2, 0.5, 0.3});
 * List<WindowReproduction> rt = RenewalEstimator.slidingWindows(local, imported, w, 7,
 *         GammaPrior.vague(), 0.95);
 * }</pre>
 */
package org.incipit.core.growth;
