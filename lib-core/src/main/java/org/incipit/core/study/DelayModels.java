package org.incipit.core.study;

import java.util.List;
import java.util.Map;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.PoissonSampler;
import org.apache.commons.statistics.distribution.NormalDistribution;
import org.incipit.core.EstimationException;
import org.incipit.core.estimate.delay.BackwardIntervalFit;
import org.incipit.core.estimate.delay.DelayEstimator;
import org.incipit.core.estimate.delay.DelayFit;
import org.incipit.core.estimate.delay.DelayOptions;
import org.incipit.core.estimate.delay.GrowthWeightedEstimator;
import org.incipit.core.estimate.delay.GrowthWeightedFit;
import org.incipit.core.estimate.delay.IncubationEstimator;
import org.incipit.core.estimate.fatality.FatalityEstimator;
import org.incipit.core.inference.Estimate;
import org.incipit.core.observe.DailyCounts;
import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.Discretisation;
import org.incipit.distributions.ParametricDelay;

/**
 * Study generators and estimators for delays (right-truncated, right-censored, backward-traced
 * during growth), incubation periods from exposure windows, and fatality ratios (registered in
 * {@link StudyRegistry#standard()}; names and settings in docs/scenarios.md).
 *
 * <p>Primary events on [0, T] (setting {@code cutoff} T, default 40) have density proportional
 * to e^(g s) (setting {@code primary-growth} g, default 0.1 per day; drawn by inversion); the
 * delay is the scenario's {@code family} with the true {@code mean} and {@code sd}.
 */
final class DelayModels {

    private DelayModels() {
    }

    static void register(StudyRegistry.Builder b) {
        b.generator("truncated-delays", DelayPairs.class, s -> pairs(s, true));
        b.generator("censored-delays", DelayPairs.class, s -> pairs(s, false));
        b.estimator("delay-truncated", DelayPairs.class, (s, level) -> delay("delay-truncated", s, level,
                (p, f, o) -> DelayEstimator.rightTruncated(p, f, o)));
        b.estimator("delay-censored", DelayPairs.class, (s, level) -> delay("delay-censored", s, level,
                (p, f, o) -> DelayEstimator.censored(p, f, o)));
        b.estimator("delay-observed-only", DelayPairs.class, (s, level) -> delay("delay-observed-only", s, level,
                (p, f, o) -> DelayEstimator.censored(p.observedOnly(), f, o)));
        b.generator("backward-intervals", double[].class, DelayModels::backwardIntervals);
        b.estimator("interval-growth-weighted", double[].class, (s, level) -> growthWeighted(s, level));
        b.estimator("interval-backward-naive", double[].class, (s, level) -> backwardNaive(s, level));
        b.estimator("backward-R-corrected", double[].class, (s, level) -> backwardR(s, level, true));
        b.estimator("backward-R-naive", double[].class, (s, level) -> backwardR(s, level, false));
        b.generator("incubation-windows", ExposureWindows.class, DelayModels::windows);
        b.estimator("incubation-interval-censored", ExposureWindows.class, (s, level) -> incubation(
                "incubation-interval-censored", s, level,
                org.incipit.core.estimate.delay.ExposureWindowModel.intervalCensored()));
        b.estimator("incubation-uniform", ExposureWindows.class, (s, level) -> incubation("incubation-uniform", s,
                level, org.incipit.core.estimate.delay.ExposureWindowModel.uniform()));
        b.estimator("incubation-growing", ExposureWindows.class, (s, level) -> incubation("incubation-growing", s,
                level, org.incipit.core.estimate.delay.ExposureWindowModel.growing(s.truth("r"))));
        b.generator("fatality-counts", DailyCounts.class, DelayModels::fatalityCounts);
        b.estimator("fatality-crude", DailyCounts.class, (s, level) -> StudyEstimator.of("fatality-crude",
                List.of("fatality"), (rng, data) -> Map.of("fatality", FatalityEstimator.crude(data, level))));
        b.estimator("fatality-window-adjusted", DailyCounts.class, (s, level) -> {
            DelayDistribution f = deathDelay(s);
            return StudyEstimator.of("fatality-window-adjusted", List.of("fatality"), (rng, data) -> Map.of("fatality",
                    FatalityEstimator.windowAdjusted(data, f, Discretisation.DOUBLE_CENSORED, level)));
        });
    }

    private static DelayFamily family(Scenario s) {
        return DelayFamilies.byName(s.option("family", ""));
    }

    /** A draw from density proportional to e^(g s) on [0, t] by inversion. */
    private static double primary(UniformRandomProvider rng, double g, double t) {
        double u = rng.nextDouble();
        if (Math.abs(g * t) < 1e-12) {
            return u * t;
        }
        return Math.log1p(u * Math.expm1(g * t)) / g;
    }

    /**
     * Truncated: n pairs with secondary by the cut-off (drawn until n are kept). Censored: n
     * primaries, the pairs whose secondary falls after the cut-off reported as censored. With
     * option {@code daily = yes} both events are reduced to their day numbers and the cut-off is
     * the last complete day T &minus; 1 (T must then be an integer).
     */
    static DataGenerator<DelayPairs> pairs(Scenario s, boolean truncated) {
        ParametricDelay h = OutbreakModels.trueDelay(s, "family");
        double t = s.setting("cutoff", 40);
        double g = s.setting("primary-growth", 0.1);
        boolean daily = s.option("daily", "no").equals("yes");
        if (!(t > 0) || daily && t != Math.rint(t)) {
            throw new IllegalArgumentException("setting 'cutoff' must be > 0 (an integer for daily data), was " + t);
        }
        double cut = daily ? t - 1 : t;
        return (rng, sc, n) -> {
            DelayPairs.Builder b = DelayPairs.builder(cut);
            int kept = 0;
            long tries = 0;
            while (kept < n) {
                if (++tries > 1000L * n + 1_000_000) {
                    throw new EstimationException("fewer than 1 in 1000 pairs is seen by the cut-off");
                }
                double p = primary(rng, g, t);
                double q = p + h.sample(rng);
                double pd = daily ? Math.floor(p) : p;
                double qd = daily ? Math.floor(q) : q;
                boolean seen = qd <= cut;
                if (seen) {
                    b.addObserved("d" + kept, pd, qd, daily);
                } else if (truncated) {
                    continue;
                } else {
                    b.addCensored("d" + kept, pd, daily);
                }
                kept++;
            }
            return b.build();
        };
    }

    interface PairFit {
        DelayFit fit(DelayPairs p, DelayFamily f, DelayOptions o);
    }

    static StudyEstimator<DelayPairs> delay(String name, Scenario s, double level, PairFit fit) {
        DelayFamily fam = family(s);
        DelayOptions o = DelayOptions.defaults().withLevel(level).withQuantiles(List.of());
        return StudyEstimator.of(name, List.of("mean", "sd"), (rng, data) -> {
            DelayFit f = fit.fit(data, fam, o);
            if (!f.converged()) {
                throw new EstimationException(name + ": " + f.message());
            }
            return Map.of("mean", f.mean(), "sd", f.sd());
        });
    }

    /** n backward-traced intervals: draws from the intrinsic interval tilted by the true r. */
    static DataGenerator<double[]> backwardIntervals(Scenario s) {
        ParametricDelay g = OutbreakModels.trueDelay(s, "family");
        DelayDistribution tilted = g.tilt(s.truth("r"));
        OutbreakModels.checkTruthR(s, g);
        return (rng, sc, n) -> {
            double[] x = new double[n];
            for (int i = 0; i < n; i++) {
                x[i] = tilted.sample(rng);
            }
            return x;
        };
    }

    /** The true r with the interval r &plusmn; z se, se = setting r-se (default 0: r known). */
    private static Estimate rate(Scenario s, double level) {
        double r = s.truth("r");
        double se = s.setting("r-se", 0);
        double z = NormalDistribution.of(0, 1).inverseSurvivalProbability(0.5 * (1 - level));
        return new Estimate(r, r - z * se, r + z * se, level, "scenario");
    }

    static StudyEstimator<double[]> growthWeighted(Scenario s, double level) {
        DelayFamily fam = family(s);
        DelayOptions o = DelayOptions.defaults().withLevel(level).withQuantiles(List.of());
        Estimate r = rate(s, level);
        return StudyEstimator.of("interval-growth-weighted", List.of("mean", "sd"), (rng, x) -> {
            GrowthWeightedFit f = GrowthWeightedEstimator.fit(x, fam, r, o);
            if (!f.conditional().converged()) {
                throw new EstimationException(f.conditional().message());
            }
            return Map.of("mean", f.mean(), "sd", f.sd());
        });
    }

    static StudyEstimator<double[]> backwardNaive(Scenario s, double level) {
        DelayFamily fam = family(s);
        DelayOptions o = DelayOptions.defaults().withLevel(level).withQuantiles(List.of());
        return StudyEstimator.of("interval-backward-naive", List.of("mean", "sd"), (rng, x) -> {
            DelayFit f = DelayEstimator.growthWeighted(x, fam, 0.0, o);
            if (!f.converged()) {
                throw new EstimationException(f.message());
            }
            return Map.of("mean", f.mean(), "sd", f.sd());
        });
    }

    static StudyEstimator<double[]> backwardR(Scenario s, double level, boolean corrected) {
        DelayFamily fam = family(s);
        DelayOptions o = DelayOptions.defaults().withLevel(level).withQuantiles(List.of());
        Estimate r = rate(s, level);
        String name = corrected ? "backward-R-corrected" : "backward-R-naive";
        return StudyEstimator.of(name, List.of("R"), (rng, x) -> {
            BackwardIntervalFit f = GrowthWeightedEstimator.backwardTraced(x, fam, r, o);
            return Map.of("R", corrected ? f.correctedReproduction() : f.naiveReproduction());
        });
    }

    /**
     * n exposure windows: window width w ~ U(0, W) (setting {@code window}, default 4 days);
     * infection inside it uniform (option {@code in-window = uniform}, default) or with density
     * proportional to e^(r e) ({@code growing}, truth r); onset = infection + incubation; a window
     * reaching past the onset is cut there (as an analyst records it: the interval-censored term
     * is unchanged since F = 0 below 0, and the uniform and growing normalisers depend on the data
     * only, so the estimates are those of the uncut window).
     */
    static DataGenerator<ExposureWindows> windows(Scenario s) {
        ParametricDelay h = OutbreakModels.trueDelay(s, "family");
        double wMax = s.setting("window", 4);
        String mode = s.option("in-window", "uniform");
        double r = mode.equals("growing") ? s.truth("r") : 0;
        if (!mode.equals("uniform") && !mode.equals("growing")) {
            throw new IllegalArgumentException("option 'in-window' must be uniform or growing, was '" + mode + "'");
        }
        return (rng, sc, n) -> {
            ExposureWindows.Builder b = ExposureWindows.builder();
            for (int i = 0; i < n; i++) {
                double w = wMax * rng.nextDouble();
                double a = 0;
                double offset = r == 0 ? w * rng.nextDouble() : primary(rng, r, w);
                double e = a + offset;
                double onset = e + h.sample(rng);
                // an analyst cuts the window at the onset; the likelihoods change by a constant only
                b.add("w" + i, a, Math.min(a + w, onset), onset);
            }
            return b.build();
        };
    }

    static StudyEstimator<ExposureWindows> incubation(String name, Scenario s, double level,
                                                      org.incipit.core.estimate.delay.ExposureWindowModel model) {
        DelayFamily fam = family(s);
        DelayOptions o = DelayOptions.defaults().withLevel(level).withQuantiles(List.of());
        return StudyEstimator.of(name, List.of("mean", "sd"), (rng, w) -> {
            DelayFit f = IncubationEstimator.fit(w, fam, model, o);
            if (!f.converged()) {
                throw new EstimationException(name + ": " + f.message());
            }
            return Map.of("mean", f.mean(), "sd", f.sd());
        });
    }

    /** Onset-to-death delay: option death-family (default gamma), settings death-mean, death-sd. */
    static ParametricDelay deathDelay(Scenario s) {
        return DelayFamilies.byName(s.option("death-family", "gamma")).ofMeanSd(s.setting("death-mean", 15),
                s.setting("death-sd", 6));
    }

    /**
     * Days 0..D&minus;1 (setting days, default 30): cases ~ Poisson(a e^(r t)) with onsets uniform in
     * their day (n = expected total, as in growth-counts); each dies with probability
     * {@code fatality} after the onset-to-death delay, counted on the day it happens if by day
     * D &minus; 1.
     */
    static DataGenerator<DailyCounts> fatalityCounts(Scenario s) {
        double r = s.truth("r");
        double p = s.truth("fatality");
        if (!(p > 0 && p <= 1)) {
            throw new IllegalArgumentException("truth 'fatality' must be in (0, 1], was " + p);
        }
        int days = (int) s.setting("days", 30);
        if (days < 3 || days != s.setting("days", 30)) {
            throw new IllegalArgumentException("setting 'days' must be an integer >= 3");
        }
        ParametricDelay f = deathDelay(s);
        double sum = r == 0 ? days : Math.expm1(r * days) / Math.expm1(r);
        return (rng, sc, n) -> {
            double a = n / sum;
            int[] cases = new int[days];
            int[] deaths = new int[days];
            for (int t = 0; t < days; t++) {
                double mu = a * Math.exp(r * t);
                cases[t] = PoissonSampler.of(rng, mu).sample();
                for (int i = 0; i < cases[t]; i++) {
                    if (rng.nextDouble() < p) {
                        double death = t + rng.nextDouble() + f.sample(rng);
                        if (death < days) {
                            deaths[(int) Math.floor(death)]++;
                        }
                    }
                }
            }
            DailyCounts.Builder b = DailyCounts.builder().withDeaths();
            for (int t = 0; t < days; t++) {
                b.add(t, cases[t], deaths[t], DailyCounts.ABSENT, DailyCounts.ABSENT);
            }
            return b.build();
        };
    }
}
