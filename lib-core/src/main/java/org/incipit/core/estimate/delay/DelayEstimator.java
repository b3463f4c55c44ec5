package org.incipit.core.estimate.delay;

import java.util.ArrayList;
import java.util.List;

import org.incipit.core.EstimationException;
import org.incipit.core.inference.ModelComparison;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.core.observe.CensoredDelays;
import org.incipit.core.observe.DelayPairs;
import org.incipit.distributions.DelayFamily;

/**
 * Parametric delay estimation by maximum likelihood for right-truncated, right-censored,
 * interval-censored, day-level (double interval censored) and growth-weighted delays. Every
 * method returns a {@link DelayFit} with intervals from the likelihood engine; compare
 * families with {@link #compare(List)}.
 *
 * <p><b>Likelihood terms</b> (docs/methods.md sections 3&ndash;4; f, F, S the delay's density,
 * distribution and survival functions, T the cut-off):
 * <ul>
 *   <li>exact pair (primary s, secondary s + d): log f(d); right-truncated at T: also
 *       &minus;log F(T &minus; s) (Kalbfleisch &amp; Lawless 1989, from memory), evaluated as
 *       the family's log-cdf so that tiny F(T &minus; s) keeps its accuracy;</li>
 *   <li>day-level pair (days p and q, both events known only to the day, the primary uniform
 *       in [p, p + 1), the secondary somewhere in [q, q + 1)): log P(k), k = q &minus; p,
 *       P(k) = &int;<sub>0</sub><sup>1</sup> [F(k + 1 &minus; u) &minus; F(k &minus; u)] du
 *       (Reich et al. 2009, from memory); truncated at day T (a pair is seen if its secondary
 *       day is &le; T, i.e. day T is wholly inside the data): &minus;log A(T &minus; p) with
 *       A(K) = &Sigma;<sub>k &le; K</sub> P(k) = &int;<sub>0</sub><sup>1</sup> F(K + 1 &minus; u) du,
 *       the same censoring model; censored at day T: log(1 &minus; A(T &minus; p));</li>
 *   <li>right-censored at c: log S(c); left-censored at c: log F(c); interval [L, R]:
 *       log(F(R) &minus; F(L)), computed from the survival side above the median;</li>
 *   <li>growth-weighted delays d (primaries growing at rate r, not known one by one): the
 *       tilted density log f(d) &minus; r d &minus; log M(&minus;r).</li>
 * </ul>
 * Integrals over the day are 32-point Gauss&ndash;Legendre (with the substitution
 * u = 1 &minus; y<sup>4</sup> where F's argument reaches 0); equal observations are merged
 * into one weighted term. Log-likelihoods are on the density scale of the delays in days
 * (probabilities for censored terms), comparable with survreg's.
 */
public final class DelayEstimator {

    private DelayEstimator() {
    }

    /**
     * Fits a delay from pairs observed only because their secondary event happened by the
     * cut-off (right truncation). Every pair must be observed; exact and day-level pairs may
     * be mixed. With more than 20,000 pairs a pilot fit to a systematic subsample (every
     * (n / 5000)-th pair) supplies the first start; the estimate is that of the full data.
     *
     * @param pairs   observed pairs with a cut-off; day-level pairs need integer days and an
     *                integer cut-off
     * @param family  the family
     * @param options options
     * @return the fit
     * @throws IllegalArgumentException if there is no cut-off, a pair is censored, an exact pair
     *                                  has delay 0, or a day-level pair has non-integer days
     * @throws EstimationException      if the likelihood is not finite at any start
     */
    public static DelayFit rightTruncated(DelayPairs pairs, DelayFamily family, DelayOptions options) {
        if (pairs.cutoff().isEmpty()) {
            throw new IllegalArgumentException("right truncation needs a cut-off; the pairs have none");
        }
        double t = pairs.cutoff().getAsDouble();
        if (pairs.censoredCount() > 0) {
            throw new IllegalArgumentException("a right-truncated fit takes observed pairs only, but "
                    + pairs.censoredCount() + " pairs are censored (if every primary is known, use censored())");
        }
        int n = pairs.size();
        double[] guess = new double[n];
        DelayLogLikelihood full = truncatedLikelihood(pairs, family, t, 1, guess);
        List<double[]> starts = new ArrayList<>();
        if (n > PILOT_THRESHOLD) {
            // pilot fit on a systematic subsample gives a start near the maximum, so the full
            // data need only a few Newton steps
            int stride = n / PILOT_SIZE;
            double[] g = new double[(n + stride - 1) / stride];
            DelayLogLikelihood pilot = truncatedLikelihood(pairs, family, t, stride, g);
            double[] ms = DelayFits.meanSd(g);
            MaximumLikelihoodFit pf = DelayFits.maximise(family, pilot, DelayFits.starts(family, ms[0], ms[1]),
                    g.length, options);
            if (pf.converged()) {
                starts.add(pf.naturalEstimate());
            }
        }
        double[] ms = DelayFits.meanSd(guess);
        starts.addAll(DelayFits.starts(family, ms[0], ms[1]));
        return DelayFits.summarise(family, DelayFits.maximise(family, full, starts, n, options), options);
    }

    /** Data sets larger than this start from a pilot fit to about {@link #PILOT_SIZE} pairs. */
    static final int PILOT_THRESHOLD = 20_000;
    static final int PILOT_SIZE = 5_000;

    private static DelayLogLikelihood truncatedLikelihood(DelayPairs pairs, DelayFamily family, double t, int stride,
                                                          double[] guess) {
        DelayLogLikelihood.Builder b = DelayLogLikelihood.builder(family);
        for (int i = 0, j = 0; i < pairs.size(); i += stride, j++) {
            double s = pairs.primary(i);
            double q = pairs.secondary(i);
            if (pairs.isDaily(i)) {
                int p = day(pairs, i, s, "primary");
                int k = day(pairs, i, q, "secondary") - p;
                int cut = integerCutoff(t);
                b.dailyMass(k).dailyCdf(cut - p, -1);
                guess[j] = Math.max(k, 0.5);
            } else {
                double d = positiveDelay(pairs, i, q - s);
                b.density(d).cdf(t - s, -1);
                guess[j] = d;
            }
        }
        return b.build();
    }

    /**
     * Fits a delay from pairs followed up to the cut-off, every primary known: observed pairs
     * contribute their delay, censored pairs log S(T &minus; s) (or, day-level,
     * log(1 &minus; A(T &minus; p))). Without a cut-off all pairs are observed and this is an
     * ordinary fit to the delays.
     *
     * @param pairs   pairs; day-level pairs need integer days
     * @param family  the family
     * @param options options
     * @return the fit
     * @throws IllegalArgumentException if an exact pair has delay 0 or a day-level pair has
     *                                  non-integer days
     * @throws EstimationException      if the likelihood is not finite at any start
     */
    public static DelayFit censored(DelayPairs pairs, DelayFamily family, DelayOptions options) {
        DelayLogLikelihood.Builder b = DelayLogLikelihood.builder(family);
        List<Double> guess = new ArrayList<>();
        for (int i = 0; i < pairs.size(); i++) {
            double s = pairs.primary(i);
            if (pairs.isObserved(i)) {
                double q = pairs.secondary(i);
                if (pairs.isDaily(i)) {
                    int k = day(pairs, i, q, "secondary") - day(pairs, i, s, "primary");
                    b.dailyMass(k);
                    guess.add(Math.max(k, 0.5));
                } else {
                    double d = positiveDelay(pairs, i, q - s);
                    b.density(d);
                    guess.add(d);
                }
            } else {
                double t = pairs.cutoff().getAsDouble();
                if (pairs.isDaily(i)) {
                    b.dailySurvival(integerCutoff(t) - day(pairs, i, s, "primary"));
                } else {
                    b.survival(t - s);
                }
                guess.add(t - s + 1);
            }
        }
        return fit(b.build(), family, guess.stream().mapToDouble(Double::doubleValue).toArray(), pairs.size(),
                options);
    }

    /**
     * Parametric survival fit to exact, right-, left- and interval-censored delays: the
     * likelihood of survival::survreg's intercept-only model on the time scale (Therneau,
     * R package survival), with log f, log S, log F and log(F(R) &minus; F(L)) terms.
     *
     * @param delays  the delays
     * @param family  the family
     * @param options options
     * @return the fit
     * @throws EstimationException if the likelihood is not finite at any start
     */
    public static DelayFit intervalCensored(CensoredDelays delays, DelayFamily family, DelayOptions options) {
        DelayLogLikelihood.Builder b = DelayLogLikelihood.builder(family);
        double[] guess = new double[delays.size()];
        for (int i = 0; i < delays.size(); i++) {
            double lo = delays.lower(i);
            double hi = delays.upper(i);
            if (lo == hi) {
                b.density(lo);
                guess[i] = lo;
            } else if (hi == Double.POSITIVE_INFINITY) {
                b.survival(lo);
                guess[i] = lo + 1;
            } else {
                b.interval(lo, hi);
                guess[i] = 0.5 * (lo + hi);
            }
        }
        return fit(b.build(), family, guess, delays.size(), options);
    }

    /**
     * Fits the intrinsic delay f from delays observed when their primaries grow as
     * exp(r t) and are not known one by one: observed density exp(&minus;r d) f(d) / M_f(&minus;r),
     * the tilt of f by r (docs/methods.md section 3). The growth rate is treated as known; see
     * {@link GrowthWeightedEstimator} to carry its uncertainty.
     *
     * @param delays     observed delays in days, finite and &gt; 0 (not modified)
     * @param family     the family of f
     * @param growthRate r per day, finite; for the lognormal r must be &ge; 0 (M(&minus;r) is
     *                   infinite for r &lt; 0)
     * @param options    options
     * @return the fit of f (its log-likelihood is that of the tilted density)
     * @throws IllegalArgumentException if a delay is not positive or r is not finite
     * @throws EstimationException      if the tilted density cannot be normalised at any start
     */
    public static DelayFit growthWeighted(double[] delays, DelayFamily family, double growthRate,
                                          DelayOptions options) {
        return fit(growthLikelihood(delays, family, growthRate), family, delays, delays.length, options);
    }

    static DelayLogLikelihood growthLikelihood(double[] delays, DelayFamily family, double r) {
        if (!Double.isFinite(r)) {
            throw new IllegalArgumentException("growthRate must be finite, was " + r);
        }
        if (delays.length == 0) {
            throw new IllegalArgumentException("delays must not be empty");
        }
        DelayLogLikelihood.Builder b = DelayLogLikelihood.builder(family);
        double sum = 0;
        for (int i = 0; i < delays.length; i++) {
            double d = delays[i];
            if (!(d > 0 && d < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("delays[" + i + "] must be finite and > 0, was " + d);
            }
            b.density(d);
            sum += d;
        }
        if (r != 0) {
            b.constant(-r * sum).tilt(r, delays.length);
        }
        return b.build();
    }

    /**
     * Ranks fits of different families to the same data by AIC, with Akaike weights.
     *
     * @param fits converged fits to the same observations
     * @return the comparison
     * @throws EstimationException      if a fit did not converge
     * @throws IllegalArgumentException if the fits have different n or repeat a family
     */
    public static ModelComparison compare(List<DelayFit> fits) {
        return ModelComparison.of(ModelComparison.Criterion.AIC, fits.stream().map(DelayFit::candidate).toList());
    }

    static DelayFit fit(DelayLogLikelihood ll, DelayFamily family, double[] guess, int n, DelayOptions options) {
        double[] ms = DelayFits.meanSd(guess);
        return DelayFits.summarise(family, DelayFits.maximise(family, ll, DelayFits.starts(family, ms[0], ms[1]),
                n, options), options);
    }

    private static int day(DelayPairs pairs, int i, double x, String what) {
        if (x != Math.rint(x) || Math.abs(x) > 1e9) {
            throw new IllegalArgumentException("pair '" + pairs.id(i) + "' is day-level, so its " + what
                    + " must be a whole day number, was " + x);
        }
        return (int) x;
    }

    private static int integerCutoff(double t) {
        if (t != Math.rint(t) || Math.abs(t) > 1e9) {
            throw new IllegalArgumentException("day-level pairs need a whole-day cut-off, was " + t);
        }
        return (int) t;
    }

    private static double positiveDelay(DelayPairs pairs, int i, double d) {
        if (!(d > 0)) {
            throw new IllegalArgumentException("pair '" + pairs.id(i) + "' has delay " + d
                    + ": an exact delay must be > 0 (flag the pair as day-level if times are whole days)");
        }
        return d;
    }
}
