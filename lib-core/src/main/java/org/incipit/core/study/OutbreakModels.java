package org.incipit.core.study;

import java.util.List;
import java.util.Map;
import java.util.concurrent.Executor;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.AhrensDieterMarsagliaTsangGammaSampler;
import org.apache.commons.rng.sampling.distribution.PoissonSampler;
import org.incipit.core.EstimationException;
import org.incipit.core.estimate.ambiguous.AmbiguousStartEm;
import org.incipit.core.estimate.ambiguous.AmbiguousStartEstimator;
import org.incipit.core.estimate.ambiguous.AmbiguousStartFit;
import org.incipit.core.estimate.ambiguous.AmbiguousStartMoments;
import org.incipit.core.estimate.ambiguous.ExposureHistory;
import org.incipit.core.estimate.ambiguous.GridFit;
import org.incipit.core.estimate.ambiguous.MomentFit;
import org.incipit.core.estimate.ambiguous.NaiveFit;
import org.incipit.core.estimate.ambiguous.NaiveRule;
import org.incipit.core.estimate.delay.DelayEstimator;
import org.incipit.core.estimate.delay.DelayFit;
import org.incipit.core.estimate.delay.DelayOptions;
import org.incipit.core.growth.CountModel;
import org.incipit.core.growth.EulerLotka;
import org.incipit.core.growth.GrowthRateEstimator;
import org.incipit.core.growth.GrowthRateFit;
import org.incipit.core.growth.GrowthRateOptions;
import org.incipit.core.inference.Estimate;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.core.likelihood.Maximiser;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.observe.DailyCounts;
import org.incipit.core.simulate.ExposureModel;
import org.incipit.core.simulate.ExposureSampler;
import org.incipit.core.simulate.SimulatedData;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.ParametricDelay;

/**
 * Generators and estimators of outbreak quantities for simulation studies (registered in
 * {@link StudyRegistry#standard()}; names and settings in docs/scenarios.md).
 *
 * <p>Generators: {@code ambiguous-starts} (n cases from {@link ExposureSampler} under the
 * exposure regime of option {@code exposure}, H of option {@code family} with the true mean and
 * sd) and {@code growth-counts} (n consecutive daily counts, Poisson or negative binomial around
 * a&middot;e<sup>r t</sup>).
 *
 * <p>Estimators: ambiguous-start maximum likelihood per family, moments, nonparametric EM, the
 * four naive rules, growth-rate regression (Poisson, negative binomial) and the Euler&ndash;Lotka
 * reproduction number with a known or an estimated generation interval.
 */
final class OutbreakModels {

    private static final Executor DIRECT = Runnable::run;

    private OutbreakModels() {
    }

    static void register(StudyRegistry.Builder b) {
        b.generator("ambiguous-starts", AmbiguousStartCases.class, OutbreakModels::ambiguousStarts);
        for (DelayFamily f : DelayFamilies.all()) {
            String name = "ambiguous-ml-" + f.name();
            b.estimator(name, AmbiguousStartCases.class, (s, level) -> ambiguousMl(name, f, history(s), level));
        }
        b.estimator("ambiguous-moments", AmbiguousStartCases.class, (s, level) -> moments(s, level));
        b.estimator("ambiguous-em", AmbiguousStartCases.class, (s, level) -> em(s, level));
        for (NaiveRule rule : NaiveRule.values()) {
            String name = naiveName(rule);
            b.estimator(name, AmbiguousStartCases.class, (s, level) -> naive(name, rule, s, level));
        }
        b.generator("growth-counts", DailyCounts.class, OutbreakModels::growthCounts);
        b.estimator("growth-poisson", DailyCounts.class, (s, level) -> growth("growth-poisson", CountModel.POISSON,
                level));
        b.estimator("growth-nb", DailyCounts.class, (s, level) -> growth("growth-nb", CountModel.NEGATIVE_BINOMIAL,
                level));
        b.estimator("euler-lotka-known-gi", DailyCounts.class, (s, level) -> eulerLotka(s, level, false));
        b.estimator("euler-lotka-estimated-gi", DailyCounts.class, (s, level) -> eulerLotka(s, level, true));
    }

    /** Registry name of a naive rule: naive-latest, naive-earliest, naive-midpoint, naive-single-only. */
    static String naiveName(NaiveRule rule) {
        return "naive-" + rule.name().toLowerCase(java.util.Locale.ROOT).replace('_', '-');
    }

    // ---------------------------------------------------------------- ambiguous starts

    /** H from option family and truths mean, sd. */
    static ParametricDelay trueDelay(Scenario s, String familyOption) {
        String fam = s.option(familyOption, "");
        if (fam.isEmpty()) {
            throw new IllegalArgumentException("scenario '" + s.name() + "' needs option '" + familyOption
                    + "' (gamma, weibull or lognormal)");
        }
        return DelayFamilies.byName(fam).ofMeanSd(s.truth("mean"), s.truth("sd"));
    }

    static ExposureModel exposureModel(Scenario s) {
        double p = s.truth("p");
        String regime = s.option("exposure", "open");
        return switch (regime) {
            case "open" -> ExposureModel.open(p, s.setting("rate", 0.5));
            case "complete" -> ExposureModel.complete(p, count(s, "exposures", 5), s.setting("window", 10));
            case "known-total" -> ExposureModel.knownTotal(p, count(s, "exposures", 5), s.setting("window", 10));
            case "poisson-total" -> ExposureModel.knownPoissonTotal(p, s.setting("exposures", 5),
                    s.setting("window", 10));
            default -> throw new IllegalArgumentException("option 'exposure' must be open, complete, known-total"
                    + " or poisson-total, was '" + regime + "'");
        };
    }

    /** The exposure history matching the generator's regime (option history overrides it). */
    static ExposureHistory history(Scenario s) {
        String h = s.option("history", s.option("exposure", "open"));
        return switch (h) {
            case "open" -> ExposureHistory.open();
            case "complete" -> ExposureHistory.complete();
            case "known-total" -> ExposureHistory.knownTotal();
            case "poisson-total" -> ExposureHistory.poissonTotal(s.setting("exposures", 5));
            default -> throw new IllegalArgumentException("option 'history' must be open, complete, known-total"
                    + " or poisson-total, was '" + h + "'");
        };
    }

    private static int count(Scenario s, String key, int fallback) {
        double v = s.setting(key, fallback);
        if (!(v >= 1 && v <= 1e6 && v == Math.rint(v))) {
            throw new IllegalArgumentException("setting '" + key + "' must be an integer in [1, 1e6], was " + v);
        }
        return (int) v;
    }

    static DataGenerator<AmbiguousStartCases> ambiguousStarts(Scenario s) {
        ParametricDelay h = trueDelay(s, "family");
        ExposureModel model = exposureModel(s);
        return (rng, sc, n) -> SimulatedData.ambiguousStarts(ExposureSampler.sample(rng, model, h, n), "c");
    }

    static StudyEstimator<AmbiguousStartCases> ambiguousMl(String name, DelayFamily family, ExposureHistory history,
                                                           double level) {
        AmbiguousStartEstimator.Options o = new AmbiguousStartEstimator.Options(level, List.of());
        return StudyEstimator.of(name, List.of("mean", "sd", "p"), (rng, data) -> {
            AmbiguousStartFit f = AmbiguousStartEstimator.fit(data, family, history, o).requireConverged();
            return Map.of("mean", f.mean(), "sd", f.sd(), "p", f.p());
        });
    }

    private static void requireOpen(Scenario s, String estimator) {
        String regime = s.option("exposure", "open");
        if (!regime.equals("open")) {
            throw new IllegalArgumentException("estimator '" + estimator + "' assumes the open exposure stream;"
                    + " scenario '" + s.name() + "' has exposure = " + regime);
        }
    }

    static StudyEstimator<AmbiguousStartCases> moments(Scenario s, double level) {
        requireOpen(s, "ambiguous-moments");
        int b = count(s, "bootstrap", 200);
        return StudyEstimator.of("ambiguous-moments", List.of("mean", "sd", "p"), (rng, data) -> {
            MomentFit f = AmbiguousStartMoments.fit(data, new AmbiguousStartMoments.Options(level, b, rng.nextLong()),
                    DIRECT);
            if (f.status() != MomentFit.Status.OK) {
                throw new EstimationException(f.message());
            }
            return Map.of("mean", f.mean(), "sd", f.sd(), "p", f.p());
        });
    }

    static StudyEstimator<AmbiguousStartCases> em(Scenario s, double level) {
        requireOpen(s, "ambiguous-em");
        int b = count(s, "bootstrap", 200);
        double w = s.setting("bin-width", 1);
        return StudyEstimator.of("ambiguous-em", List.of("mean", "sd", "p"), (rng, data) -> {
            GridFit f = AmbiguousStartEm.fit(data, new AmbiguousStartEm.Options(w, 1e-10, 20_000, level, b,
                    rng.nextLong()), DIRECT);
            if (!f.converged()) {
                throw new EstimationException("EM did not converge in " + f.iterations() + " iterations");
            }
            return Map.of("mean", f.mean(), "sd", f.sd(), "p", f.transmission().get(0));
        });
    }

    static StudyEstimator<AmbiguousStartCases> naive(String name, NaiveRule rule, Scenario s, double level) {
        DelayFamily fam = DelayFamilies.byName(s.option("naive-family", s.option("family", "gamma")));
        return StudyEstimator.of(name, List.of("mean"), (rng, data) -> {
            NaiveFit f = AmbiguousStartEstimator.naive(data, fam, rule, level);
            return Map.of("mean", f.mean());
        });
    }

    // ---------------------------------------------------------------- growth

    /**
     * Days 0..D&minus;1 (setting {@code days}, default 30) with counts ~ Poisson(a e^(r t)), or
     * negative binomial (NB2, Var = mu + mu^2/k, drawn as a gamma-Poisson mixture) if option
     * {@code counts = negative-binomial} with setting {@code k}. The sample size n is the expected
     * total count: a = n (e^r &minus; 1) / (e^(r D) &minus; 1) (a = n / D if r = 0).
     */
    static DataGenerator<DailyCounts> growthCounts(Scenario s) {
        double r = s.truth("r");
        int days = count(s, "days", 30);
        if (days < 3) {
            throw new IllegalArgumentException("setting 'days' must be >= 3, was " + days);
        }
        String counts = s.option("counts", "poisson");
        double k;
        switch (counts) {
            case "poisson" -> k = Double.POSITIVE_INFINITY;
            case "negative-binomial" -> {
                k = s.setting("k");
                if (!(k > 0)) {
                    throw new IllegalArgumentException("setting 'k' must be > 0, was " + k);
                }
            }
            default -> throw new IllegalArgumentException("option 'counts' must be poisson or negative-binomial, was '"
                    + counts + "'");
        }
        // sum_{t<D} e^{rt} = expm1(rD)/expm1(r)
        double sum = r == 0 ? days : Math.expm1(r * days) / Math.expm1(r);
        return (rng, sc, n) -> {
            double a = n / sum;
            DailyCounts.Builder b = DailyCounts.builder();
            for (int t = 0; t < days; t++) {
                double mu = a * Math.exp(r * t);
                if (k < Double.POSITIVE_INFINITY) {
                    mu = AhrensDieterMarsagliaTsangGammaSampler.of(rng, k, mu / k).sample();
                }
                b.add(t, mu > 0 ? PoissonSampler.of(rng, mu).sample() : 0);
            }
            return b.build();
        };
    }

    static StudyEstimator<DailyCounts> growth(String name, CountModel model, double level) {
        GrowthRateOptions o = GrowthRateOptions.defaults().withModel(model).withLevel(level);
        return StudyEstimator.of(name, List.of("r"), (rng, data) -> {
            GrowthRateFit f = GrowthRateEstimator.fit(data, o);
            if (!f.converged()) {
                throw new EstimationException("growth-rate IRLS did not converge");
            }
            return Map.of("r", f.rateProfile());
        });
    }

    /**
     * R = 1 / M_g(&minus;r) from the Poisson growth-rate fit and a generation interval (option
     * gi-family, settings gi-mean, gi-sd): known, or estimated by maximum likelihood from
     * gi-pairs intervals drawn from the true one with the estimator's own stream (standing for a
     * separate study of transmission pairs), its covariance propagated by the delta method.
     */
    static StudyEstimator<DailyCounts> eulerLotka(Scenario s, double level, boolean estimated) {
        String name = estimated ? "euler-lotka-estimated-gi" : "euler-lotka-known-gi";
        ParametricDelay gi = DelayFamilies.byName(s.option("gi-family", "gamma"))
                .ofMeanSd(s.setting("gi-mean"), s.setting("gi-sd"));
        checkTruthR(s, gi);
        int pairs = estimated ? count(s, "gi-pairs", 100) : 0;
        GrowthRateOptions o = GrowthRateOptions.defaults().withLevel(level);
        return StudyEstimator.of(name, List.of("R"), (rng, data) -> {
            GrowthRateFit f = GrowthRateEstimator.fit(data, o);
            if (!f.converged()) {
                throw new EstimationException("growth-rate IRLS did not converge");
            }
            Estimate rate = f.rateWald();
            if (!estimated) {
                int k = gi.family().dimension();
                return Map.of("R", EulerLotka.reproductionNumberDelta(gi, new double[k][k], rate));
            }
            double[] x = new double[pairs];
            for (int i = 0; i < pairs; i++) {
                x[i] = gi.sample(rng);
            }
            MaximumLikelihoodFit g = fitDelay(gi.family(), x);
            ParametricDelay gHat = gi.family().of(g.naturalEstimate());
            return Map.of("R", EulerLotka.reproductionNumberDelta(gHat, g.naturalCovariance(), rate));
        });
    }

    /**
     * Checks that a scenario's truth 'R', where given, is 1 / M_g(&minus;r) for its truth r (which
     * it must have) and generation (or serial) interval g, to 1e-6 relative.
     */
    static void checkTruthR(Scenario s, ParametricDelay g) {
        double expected = EulerLotka.reproductionNumber(g, s.truth("r")); // truth r is required
        if (s.hasTruth("R") && Math.abs(s.truth("R") - expected) > 1e-6 * expected) {
            throw new IllegalArgumentException("truth 'R' (" + s.truth("R") + ") must equal 1 / M_g(-r) = "
                    + expected + " for the scenario's r and generation interval");
        }
    }

    /**
     * Plain maximum likelihood of a family for exactly observed delays: the delay estimator's
     * fit with no growth weighting (r = 0), BFGS from the member with the sample mean and sd, no
     * quantiles reported.
     */
    static MaximumLikelihoodFit fitDelay(DelayFamily family, double[] x) {
        DelayFit f = DelayEstimator.growthWeighted(x, family, 0, EXACT_DELAYS);
        if (!f.converged() || !f.fit().hasCovariance()) {
            throw new EstimationException("generation-interval fit: " + f.message());
        }
        return f.fit();
    }

    private static final DelayOptions EXACT_DELAYS = new DelayOptions(0.95, List.of(), Maximiser.bfgs());
}
