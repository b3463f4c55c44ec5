package org.incipit.core.estimate.ambiguous;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Executor;
import java.util.function.ToDoubleFunction;

import org.incipit.core.EstimationException;
import org.incipit.core.inference.Bootstrap;
import org.incipit.core.inference.BootstrapResult;
import org.incipit.core.inference.Estimate;
import org.incipit.core.inference.ModelComparison;
import org.incipit.core.likelihood.LogLikelihood;
import org.incipit.core.likelihood.Maximiser;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.core.likelihood.Optimum;
import org.incipit.core.likelihood.ParameterTransform;
import org.incipit.core.likelihood.Parameterisation;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.distributions.DelayFamily;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Maximum likelihood for ambiguous-start intervals: a gamma, Weibull or lognormal H together
 * with the transmission probabilities, under a chosen {@link ExposureHistory}
 * (docs/methods.md, section 1). Stateless; thread-safe.
 *
 * <p><b>Likelihood.</b> log L = &Sigma;_i [log &Sigma;_j p_(k_j) &Pi;_(l&lt;j)(1 &minus; p_(k_l))
 * h(d_ij) &minus; log P(case_i)], see {@link ExposureHistory} for P(case). Maximised on
 * (log shape, log rate | log shape, log scale | meanLog, log sdLog, logit p_1..p_K) by damped
 * Newton on the analytic Hessian (the engine's {@link Maximiser#newton()}), from a start built
 * from the moments of the earliest-candidate durations (mean scaled by 0.7, since the earliest
 * candidate overstates the interval; p from the mean number of candidates); if that start does
 * not converge, from two more (scales 1.0 and 1.3, p = 0.5). From 4,000 cases on, Newton starts
 * instead from the maximum over every 8th case (found the same way) and runs to relative
 * gradient 1e-12, falling back to the moment starts if that does not converge.
 *
 * <p><b>Prepared data.</b> The first call on an {@link AmbiguousStartCases} object turns it into
 * flat arrays (log-durations, durations, categories; about 20 bytes per candidate) that later
 * calls on the same object reuse for as long as it is reachable (held weakly).
 *
 * <p><b>Intervals</b> ({@link Options#intervals()}): by default ({@link Intervals#AUTOMATIC}),
 * below {@value #PROFILE_BELOW_CASES} cases profile-likelihood intervals for the family
 * parameters and the mean, sd and quantiles of H ({@link ProfileIntervals}: each profile point
 * an unconstrained Newton maximisation with the profiled quantity eliminating one coordinate)
 * and Wald on the logit scale for p; from {@value #PROFILE_BELOW_CASES} cases on, Wald on the
 * estimation scale and the delta method on the log scale for the quantities of H (engine
 * {@link MaximumLikelihoodFit#delta}). The delta-method intervals are too narrow in small
 * samples (95% intervals of the mean covered 86% at 30 cases, 88% at 60, 93% at 120 for
 * gamma H; the profile 92%, 92%, 95%: docs/methods.md, section 1). If a profile point lies
 * above the fitted maximum (the fit was a local maximum: small samples can have two modes),
 * the fit is redone from that point and the intervals recomputed. Each {@link Estimate} names
 * its method. A transmission probability within 1e-6 of 0 or 1 is a maximum on the boundary
 * (what a wrong exposure-history model produces): the fit is then reported as not converged,
 * with the uninformative intervals of {@link AmbiguousStartFit}.
 */
public final class AmbiguousStartEstimator {

    private static final Logger LOG = LoggerFactory.getLogger(AmbiguousStartEstimator.class);

    private AmbiguousStartEstimator() {
    }

    /** How the intervals of a converged fit are made. */
    public enum Intervals {
        /**
         * Below {@link AmbiguousStartEstimator#PROFILE_BELOW_CASES} cases: profile likelihood
         * for the family parameters and the mean, sd and quantiles of H, Wald on the logit
         * scale for p (which covers at least as well as the profile there: 95.4&ndash;96.2% against
         * 93.8&ndash;95.1% in the study of docs/methods.md, section 1); from there on
         * {@link #DELTA}, where the two agree and the profile would cost a few hundred
         * extra Newton runs on large data.
         */
        AUTOMATIC,
        /**
         * Wald on the estimation scale (log, logit) for the parameters and p, delta method on
         * the log scale for the mean, sd and quantiles of H (methods "wald-log", "wald-logit",
         * "delta-log"): the cheapest, and too narrow in small samples (docs/methods.md,
         * section 1).
         */
        DELTA,
        /** Profile likelihood for every parameter, p and every quantity of H (method "profile"). */
        PROFILE
    }

    /**
     * Below this many cases {@link Intervals#AUTOMATIC} makes profile-likelihood intervals. At
     * 500 cases both kinds cover 94&ndash;96% (docs/methods.md, section 1); below 120 the delta
     * method falls to 85&ndash;93%. The profile costs about 100 extra Newton runs on the whole
     * data (0.1 s at 500 cases).
     */
    public static final int PROFILE_BELOW_CASES = 1000;

    /**
     * Options of the maximum-likelihood fit.
     *
     * @param level          interval coverage in (0, 1)
     * @param quantileLevels probabilities in (0, 1) of the quantiles of H to report (copied)
     * @param intervals      how intervals are made, not null
     */
    public record Options(double level, List<Double> quantileLevels, Intervals intervals) {
        /** @throws IllegalArgumentException if level or a quantile probability is outside (0, 1), or intervals is null */
        public Options {
            if (!(level > 0 && level < 1)) {
                throw new IllegalArgumentException("level must be in (0, 1), was " + level);
            }
            quantileLevels = List.copyOf(quantileLevels);
            for (double p : quantileLevels) {
                if (!(p > 0 && p < 1)) {
                    throw new IllegalArgumentException("quantile levels must be in (0, 1), one was " + p);
                }
            }
            if (intervals == null) {
                throw new IllegalArgumentException("intervals must be one of " + java.util.Arrays.toString(
                        Intervals.values()) + ", was null");
            }
        }

        /**
         * Options with {@link Intervals#AUTOMATIC} intervals.
         *
         * @param level          interval coverage in (0, 1)
         * @param quantileLevels probabilities in (0, 1) of the quantiles of H (copied)
         */
        public Options(double level, List<Double> quantileLevels) {
            this(level, quantileLevels, Intervals.AUTOMATIC);
        }

        /** @return level 0.95, quantiles at 0.5 and 0.95, {@link Intervals#AUTOMATIC} intervals */
        public static Options defaults() {
            return new Options(0.95, List.of(0.5, 0.95), Intervals.AUTOMATIC);
        }

        /**
         * @param method how intervals are made, not null
         * @return these options with that interval method
         */
        public Options withIntervals(Intervals method) {
            return new Options(level, quantileLevels, method);
        }
    }

    /**
     * Fits with default options ({@link Options#defaults()}).
     *
     * @param cases   the cases
     * @param family  gamma, Weibull or lognormal (by {@link DelayFamily#name()})
     * @param history the exposure-history model (see {@link ExposureHistory}); no default
     * @return the fit; check {@link AmbiguousStartFit#converged()}
     * @throws IllegalArgumentException if the family is not one of the three, a case has no
     *                                  candidate before its end, or the history does not fit the
     *                                  data (known total without totals; categories with a
     *                                  known or Poisson total)
     */
    public static AmbiguousStartFit fit(AmbiguousStartCases cases, DelayFamily family, ExposureHistory history) {
        return fit(cases, family, history, Options.defaults());
    }

    /**
     * @param cases   the cases
     * @param family  gamma, Weibull or lognormal
     * @param history the exposure-history model
     * @param options level, quantiles and interval method
     * @return the fit; check {@link AmbiguousStartFit#converged()}
     * @throws IllegalArgumentException as {@link #fit(AmbiguousStartCases, DelayFamily, ExposureHistory)}
     * @throws EstimationException      if profile intervals keep finding maxima above the fit
     *                                  (more than 5 refits; not seen in the simulation studies)
     */
    public static AmbiguousStartFit fit(AmbiguousStartCases cases, DelayFamily family, ExposureHistory history,
                                        Options options) {
        requireNonNull(cases, family, history, options);
        return fit(Prepared.from(cases), Family.byName(family.name()), history, options,
                cases.hasCategories() ? cases.categoryNames() : List.of("all"));
    }

    /**
     * Fits each family under the same history and ranks them by the criterion (AIC, AICc or BIC;
     * n = number of cases). Fits that did not converge are left out of the ranking (their
     * log-likelihood is not a maximum) and listed in {@link Comparison#fits()} with their status.
     *
     * @param cases     the cases
     * @param families  one or more of gamma, Weibull, lognormal
     * @param history   the exposure-history model
     * @param criterion the information criterion
     * @param options   level and quantiles
     * @return every fit, and the ranking of the converged ones
     * @throws EstimationException if no family converged
     */
    public static Comparison compare(AmbiguousStartCases cases, List<? extends DelayFamily> families,
                                     ExposureHistory history, ModelComparison.Criterion criterion, Options options) {
        requireNonNull(cases, families, history, options);
        List<AmbiguousStartFit> fits = new ArrayList<>();
        for (DelayFamily f : families) {
            fits.add(fit(cases, f, history, options));
        }
        return new Comparison(fits, compare(fits, criterion));
    }

    /**
     * Fits of several families and their ranking.
     *
     * @param fits    every fit, in the order of the families
     * @param ranking ranking of the converged fits
     */
    public record Comparison(List<AmbiguousStartFit> fits, ModelComparison ranking) {
        /** Copies the list. */
        public Comparison {
            fits = List.copyOf(fits);
            if (ranking == null) {
                throw new IllegalArgumentException("ranking must not be null");
            }
        }
    }

    /**
     * A naive rule followed by a plain maximum-likelihood fit of the family (no p), for showing
     * the bias of the rule next to {@link #fit}.
     *
     * @param cases  the cases
     * @param family gamma, Weibull or lognormal
     * @param rule   which start to take
     * @param level  interval coverage in (0, 1)
     * @return the fit
     * @throws EstimationException if fewer than 2 cases remain or the fit does not converge
     */
    public static NaiveFit naive(AmbiguousStartCases cases, DelayFamily family, NaiveRule rule, double level) {
        requireNonNull(cases, family, rule, level);
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
        return naive(Prepared.from(cases), Family.byName(family.name()), rule, level);
    }

    /**
     * The log-likelihood itself, for method developers (custom maximisers, profiles, timing):
     * over the unconstrained vector (phi1, phi2, logit p_1, ..., logit p_K) with phi = (log shape,
     * log rate) for gamma, (log shape, log scale) for Weibull, (meanLog, log sdLog) for
     * lognormal; analytic gradient and Hessian; thread-safe. Data with at least 40,000 candidates
     * are evaluated in two halves concurrently (on the common fork-join pool) and added in a
     * fixed order, so values do not depend on the threads.
     *
     * @param cases   the cases
     * @param family  gamma, Weibull or lognormal
     * @param history the exposure-history model
     * @return the log-likelihood
     * @throws IllegalArgumentException as {@link #fit(AmbiguousStartCases, DelayFamily, ExposureHistory)}
     */
    public static LogLikelihood logLikelihood(AmbiguousStartCases cases, DelayFamily family, ExposureHistory history) {
        requireNonNull(cases, family, history);
        return new AmbiguousLikelihood(Prepared.from(cases), Family.byName(family.name()), history);
    }

    /**
     * The maximisation alone (no intervals): the engine fit on the scale of
     * {@link #logLikelihood}, parameters named as in {@link AmbiguousStartFit}.
     *
     * @param cases   the cases
     * @param family  gamma, Weibull or lognormal
     * @param history the exposure-history model
     * @return the engine fit; check its status
     */
    public static MaximumLikelihoodFit maximumLikelihood(AmbiguousStartCases cases, DelayFamily family,
                                                         ExposureHistory history) {
        requireNonNull(cases, family, history);
        Prepared d = Prepared.from(cases);
        return maximumLikelihood(d, Family.byName(family.name()), history,
                cases.hasCategories() ? cases.categoryNames() : List.of("all"));
    }

    /**
     * Nonparametric bootstrap of the ML fit over cases (Bootstrap.nonparametric, seeded;
     * identical for any executor): each replicate refits and returns {param1, param2, p_1..p_K,
     * mean, sd}; a replicate whose fit does not converge counts as failed.
     *
     * @param cases      the cases
     * @param family     gamma, Weibull or lognormal
     * @param history    the exposure-history model
     * @param replicates &ge; 1
     * @param seed       master seed
     * @param executor   where replicates run
     * @return the bootstrap result (percentile or basic intervals per component)
     * @throws EstimationException if the fit to the full data does not converge
     */
    public static BootstrapResult bootstrap(AmbiguousStartCases cases, DelayFamily family, ExposureHistory history,
                                            int replicates, long seed, Executor executor) {
        requireNonNull(cases, family, history, executor);
        return bootstrap(Prepared.from(cases), Family.byName(family.name()), history, replicates, seed, executor);
    }

    static BootstrapResult bootstrap(Prepared d, Family family, ExposureHistory history, int replicates, long seed,
                                     Executor executor) {
        MaximumLikelihoodFit full = maximumLikelihood(d, family, history, null);
        if (!full.converged()) {
            throw new EstimationException("fit to the full data did not converge: " + full.message());
        }
        return Bootstrap.nonparametric(seed, replicates, d.n, idx -> {
            MaximumLikelihoodFit f = maximumLikelihood(d.subset(idx), family, history, null);
            if (!f.converged()) {
                throw new EstimationException("replicate fit: " + f.message());
            }
            return statistic(f, family);
        }, statistic(full, family), executor);
    }

    private static double[] statistic(MaximumLikelihoodFit f, Family family) {
        double[] x = f.naturalEstimate();
        double[] out = java.util.Arrays.copyOf(x, x.length + 2);
        out[x.length] = family.mean(x[0], x[1]);
        out[x.length + 1] = family.sd(x[0], x[1]);
        return out;
    }

    private static void requireNonNull(Object... args) {
        for (Object a : args) {
            if (a == null) {
                throw new IllegalArgumentException("arguments must not be null");
            }
        }
    }

    // -------------------------------------------------------------------------------------
    // package-private core on prepared data

    static AmbiguousStartFit fit(Prepared data, Family family, ExposureHistory history, Options options,
                                 List<String> categoryLabels) {
        if (data.categories < 1) {
            throw new IllegalArgumentException("data must have >= 1 transmission category");
        }
        if (data.n < 2) {
            throw new EstimationException("maximum likelihood of a two-parameter family needs at least 2 cases, the"
                    + " data have " + data.n + " (with one case the likelihood has no maximum)");
        }
        int k = data.categories;
        List<String> labels = categoryLabels != null ? categoryLabels : defaultLabels(k);
        MaximumLikelihoodFit fit = maximumLikelihood(data, family, history, labels);
        boolean profile = options.intervals() == Intervals.PROFILE
                || (options.intervals() == Intervals.AUTOMATIC && data.n < PROFILE_BELOW_CASES);
        for (int attempt = 0; ; attempt++) {
            try {
                return assemble(data, family, history, options, labels, fit, profile);
            } catch (ProfileIntervals.HigherMaximum h) {
                // the profile left the fitted mode for a higher one: refit from there
                if (attempt >= MAX_REFITS) {
                    throw new EstimationException("profile intervals kept finding higher maxima than the fit ("
                            + (attempt + 1) + " refits, last log-likelihood " + h.value + ")");
                }
                LOG.debug("profile found log-likelihood {} above the fit's {}; refitting", h.value,
                        fit.logLikelihood());
                Optimum o = Maximiser.newton().maximise(fit.likelihood(), h.theta);
                fit = MaximumLikelihoodFit.of(fit.parameterisation(), fit.likelihood(), Maximiser.newton(), o, data.n);
            }
        }
    }

    /** Refits allowed when the profile finds a higher maximum than the fit. */
    private static final int MAX_REFITS = 5;

    private static AmbiguousStartFit assemble(Prepared data, Family family, ExposureHistory history, Options options,
                                              List<String> labels, MaximumLikelihoodFit fit, boolean profile) {
        int k = data.categories;
        List<ParameterTransform> transforms = family.transforms();
        LOG.debug("{} fit under {}: {}", family.label, history.label(), fit);
        double[] nat = fit.naturalEstimate();
        // A p within BOUNDARY of 0 or 1 is a supremum on the edge of the parameter space: the
        // engine may call it converged (gradient vanishing as logit p -> -+infinity), but Wald
        // and delta intervals mean nothing there.
        StringBuilder edge = new StringBuilder();
        for (int c = 0; c < k; c++) {
            if (nat[2 + c] < BOUNDARY || nat[2 + c] > 1 - BOUNDARY) {
                edge.append(edge.length() == 0 ? "" : ", ").append(fit.parameterisation().names().get(2 + c))
                        .append(" = ").append(nat[2 + c]);
            }
        }
        boolean interior = fit.converged() && edge.length() == 0;
        String message = edge.length() == 0 ? fit.message()
                : "maximum on the boundary of the parameter space (" + edge + "): the " + history.label()
                        + " exposure history may be wrong for these data, or (in small samples) they hold too little"
                        + " information about p; " + fit.message();
        double level = options.level();
        ProfileIntervals pi = interior && profile
                ? new ProfileIntervals(fit.likelihood(), family, fit.unconstrainedEstimate(), fit.logLikelihood())
                : null;
        double[][] cov = interior ? fit.unconstrainedCovariance() : null;
        List<Estimate> params = new ArrayList<>();
        for (int i = 0; i < 2; i++) {
            params.add(!interior ? none(nat[i], transforms.get(i), level)
                    : pi != null ? pi.coordinate(i, transforms.get(i), level, Math.sqrt(cov[i][i]))
                    : fit.wald(i, level));
        }
        List<Estimate> ps = new ArrayList<>();
        for (int c = 0; c < k; c++) {
            int i = 2 + c;
            ps.add(!interior ? none(nat[i], ParameterTransform.logit(), level)
                    : pi != null && options.intervals() == Intervals.PROFILE
                    ? pi.coordinate(i, ParameterTransform.logit(), level, Math.sqrt(cov[i][i]))
                    : fit.wald(i, level));
        }
        Estimate mean = derived(fit, interior, pi, x -> family.mean(x[0], x[1]), nat, level);
        Estimate sd = derived(fit, interior, pi, x -> family.sd(x[0], x[1]), nat, level);
        List<Estimate> qs = new ArrayList<>();
        for (double pr : options.quantileLevels()) {
            qs.add(derived(fit, interior, pi, x -> family.quantile(x[0], x[1], pr), nat, level));
        }
        return new AmbiguousStartFit(family.label, history, List.of(family.name1, family.name2), params, labels, ps,
                mean, sd, options.quantileLevels(), qs, fit.logLikelihood(), fit.aic(), data.n, data.candidates(),
                interior, message, fit);
    }

    static MaximumLikelihoodFit maximumLikelihood(Prepared data, Family family, ExposureHistory history,
                                                  List<String> categoryLabels) {
        if (data.categories < 1) {
            throw new IllegalArgumentException("data must have >= 1 transmission category");
        }
        LogLikelihood ll = new AmbiguousLikelihood(data, family, history);
        int k = data.categories;
        List<String> names = new ArrayList<>(List.of(family.name1, family.name2));
        List<ParameterTransform> transforms = new ArrayList<>(family.transforms());
        List<String> labels = categoryLabels != null ? categoryLabels : defaultLabels(k);
        for (int c = 0; c < k; c++) {
            names.add(k == 1 ? "p" : "p[" + labels.get(c) + "]");
            transforms.add(ParameterTransform.logit());
        }
        Parameterisation param = Parameterisation.of(names, transforms);
        Optimum best = optimum(data, family, history, ll);
        return MaximumLikelihoodFit.of(param, ll, Maximiser.newton(), best, data.n);
    }

    /** From this many cases on, the maximisation starts from the maximum of a subsample. */
    static final int WARM_START_CASES = 4000;
    /** Every WARM_STRIDE-th case forms the subsample. */
    private static final int WARM_STRIDE = 8;
    /**
     * Newton for the warm-started full run: relative gradient tolerance 1e-12 rather than the
     * default 1e-9, so that the maximum is at least as accurate as from the moment start (one
     * more quadratically convergent step at most; a stall within 1000 x tolerance still counts
     * as converged).
     */
    private static final Maximiser WARM_NEWTON = Maximiser.of(Maximiser.Method.NEWTON, 200, 1e-12);

    /**
     * The maximum. For at least {@link #WARM_START_CASES} cases, Newton first maximises over
     * every {@value #WARM_STRIDE}th case (itself warm-started the same way when large) and
     * starts the full-data Newton from that maximum, which is within sampling error
     * (~1/sqrt(n/8) relative) of the full one, so that fewer full passes are needed. The
     * maximum is the same (to the convergence tolerance; the full run uses 1e-12); if the
     * subsample or the warm-started run does not converge, the moment starts below are used
     * as for small data. The returned optimum counts the full-data iterations only.
     */
    private static Optimum optimum(Prepared data, Family family, ExposureHistory history, LogLikelihood ll) {
        if (data.n >= WARM_START_CASES) {
            int[] idx = new int[data.n / WARM_STRIDE];
            for (int r = 0; r < idx.length; r++) {
                idx[r] = r * WARM_STRIDE + WARM_STRIDE / 2;
            }
            Prepared sub = data.subset(idx);
            Optimum so = optimum(sub, family, history, new AmbiguousLikelihood(sub, family, history));
            if (so.converged()) {
                Optimum o = WARM_NEWTON.maximise(ll, so.argmax());
                if (o.converged()) {
                    return o;
                }
            }
        }
        int k = data.categories;
        double[] d1 = data.earliest();
        double meanCand = (double) data.candidates() / data.n;
        double p0 = Math.max(0.05, Math.min(0.95, 1 / meanCand));
        Optimum best = maximise(ll, family, d1, k, new double[] {0.7}, p0);
        if (!best.converged()) {
            Optimum more = maximise(ll, family, d1, k, new double[] {1.0, 1.3}, 0.5);
            if (more.converged() || more.value() > best.value()) {
                best = more;
            }
        }
        return best;
    }

    static List<String> defaultLabels(int k) {
        List<String> l = new ArrayList<>();
        for (int c = 0; c < k; c++) {
            l.add(Integer.toString(c));
        }
        return l;
    }

    private static Optimum maximise(LogLikelihood ll, Family family, double[] d1, int k, double[] scales, double p0) {
        double mean = 0;
        for (double d : d1) {
            mean += d;
        }
        mean /= d1.length;
        double var = 0;
        for (double d : d1) {
            var += (d - mean) * (d - mean);
        }
        double sd = Math.sqrt(var / Math.max(1, d1.length - 1));
        double cv = Math.max(0.2, Math.min(3, sd / mean));
        if (!(cv > 0)) {
            cv = 0.5;
        }
        List<double[]> starts = new ArrayList<>();
        for (double s : scales) {
            double[] nat = family.fromMeanSd(mean * s, cv * mean * s);
            double[] u = family.unconstrained(nat[0], nat[1]);
            double[] start = new double[2 + k];
            start[0] = u[0];
            start[1] = u[1];
            for (int c = 0; c < k; c++) {
                start[2 + c] = Math.log(p0 / (1 - p0));
            }
            starts.add(start);
        }
        Maximiser newton = Maximiser.newton();
        return starts.size() == 1 ? newton.maximise(ll, starts.get(0)) : newton.maximise(ll, starts);
    }

    /** p closer than this to 0 or 1 is reported as a boundary maximum. */
    static final double BOUNDARY = 1e-6;

    /** Profile or delta-method (log scale) interval, or the uninformative interval. */
    private static Estimate derived(MaximumLikelihoodFit fit, boolean interior, ProfileIntervals pi,
                                    ToDoubleFunction<double[]> f, double[] nat, double level) {
        double v;
        try {
            v = f.applyAsDouble(nat);
        } catch (IllegalArgumentException | ArithmeticException e) {
            // e.g. a quantile root search failing at extreme parameters: no estimate, not bad input
            throw new EstimationException("derived quantity of H cannot be computed at the estimate "
                    + java.util.Arrays.toString(nat) + ": " + e.getMessage(), e);
        }
        if (!Double.isFinite(v)) {
            throw new EstimationException("derived quantity of H is not finite at the estimate " + java.util.Arrays.toString(nat));
        }
        if (!interior) {
            return new Estimate(v, 0, Double.POSITIVE_INFINITY, level, AmbiguousStartFit.NO_INTERVAL);
        }
        Estimate delta = fit.delta(f, level, ParameterTransform.log());
        if (pi == null) {
            return delta;
        }
        double z = org.apache.commons.statistics.distribution.NormalDistribution.of(0, 1)
                .inverseCumulativeProbability(0.5 + 0.5 * level);
        double seLog = (Math.log(delta.upper()) - Math.log(delta.lower())) / (2 * z);
        return pi.quantity(f, level, seLog);
    }

    private static Estimate none(double v, ParameterTransform t, double level) {
        return new Estimate(v, Math.min(v, t.lowerBound()), Math.max(v, t.upperBound()), level,
                AmbiguousStartFit.NO_INTERVAL);
    }

    /**
     * Plain maximum-likelihood fit of the family to one duration per case (no p). Used by the
     * naive rules.
     */
    static MaximumLikelihoodFit plainFit(double[] durations, Family family) {
        Prepared data = Prepared.plain(durations);
        AmbiguousLikelihood ll = new AmbiguousLikelihood(data, family, null);
        Parameterisation param = Parameterisation.of(List.of(family.name1, family.name2), family.transforms());
        Optimum o = maximise(ll, family, durations, 0, new double[] {1.0}, 0.5);
        if (!o.converged()) {
            o = maximise(ll, family, durations, 0, new double[] {0.7, 1.3}, 0.5);
        }
        return MaximumLikelihoodFit.of(param, ll, Maximiser.newton(), o, data.n);
    }

    static NaiveFit naive(Prepared data, Family family, NaiveRule rule, double level) {
        double[] d = rule.durations(data);
        if (d.length < 2) {
            throw new EstimationException("naive rule " + rule + " keeps " + d.length
                    + " cases; a two-parameter family needs at least 2");
        }
        MaximumLikelihoodFit fit = plainFit(d, family);
        if (!fit.converged()) {
            throw new EstimationException("plain " + family.label + " fit for rule " + rule + " did not converge after "
                    + fit.optimum().iterations() + " iterations: " + fit.message());
        }
        Estimate mean = fit.delta(x -> family.mean(x[0], x[1]), level, ParameterTransform.log());
        Estimate sd = fit.delta(x -> family.sd(x[0], x[1]), level, ParameterTransform.log());
        return new NaiveFit(rule, family.label, List.of(family.name1, family.name2),
                List.of(fit.wald(0, level), fit.wald(1, level)), mean, sd, fit.logLikelihood(), fit.aic(), d.length,
                true);
    }

    /** Candidates for model comparison, one per converged fit. */
    static ModelComparison compare(List<AmbiguousStartFit> fits, ModelComparison.Criterion criterion) {
        List<ModelComparison.Candidate> c = new ArrayList<>();
        for (AmbiguousStartFit f : fits) {
            if (f.converged()) {
                c.add(f.fit().candidate(f.family()));
            }
        }
        if (c.isEmpty()) {
            throw new EstimationException("no family converged: " + fits.stream().map(AmbiguousStartFit::message).toList());
        }
        return ModelComparison.of(criterion, c);
    }
}
