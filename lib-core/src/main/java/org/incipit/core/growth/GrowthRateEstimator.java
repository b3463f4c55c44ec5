package org.incipit.core.growth;

import java.util.ArrayList;
import java.util.List;
import java.util.TreeSet;
import org.apache.commons.numbers.rootfinder.BrentSolver;
import org.apache.commons.statistics.distribution.NormalDistribution;
import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Exponential growth rate from daily counts by a log-linear count regression,
 * log E[c<sub>t</sub>] = a + r t (+ day-of-week effects), fitted by maximum likelihood
 * (IRLS; for the negative binomial NB2 model the dispersion k is estimated by ML too).
 *
 * <p>Intervals for r: Wald (r &plusmn; z<sub>(1+level)/2</sub> se, se from the inverse Fisher
 * information at the fitted k, as printed by R's {@code summary.glm}/{@code glm.nb}) and profile
 * likelihood {r : 2[&#8467;(r&#770;) &minus; &#8467;<sub>p</sub>(r)] &le;
 * &chi;&sup2;<sub>1,level</sub>} with all other coefficients and, for NB, k re-maximised at each r
 * (limits found by safeguarded Newton steps on the signed root from the Wald limits, with the
 * score at the profile maximum as derivative; Brent's method on a bracket as fallback). A profile
 * limit that cannot be bracketed within 50 standard errors (z se) is reported as infinite.
 *
 * <p>Days absent from the input are treated as missing, not as zero counts: pass zero counts
 * explicitly. Zero counts are used as observations. Stateless and thread-safe.
 */
public final class GrowthRateEstimator {

    private static final Logger LOG = LoggerFactory.getLogger(GrowthRateEstimator.class);
    private static final double MAX_SE_STEPS = 50;

    private GrowthRateEstimator() {
    }

    /**
     * Fits all the days given.
     *
     * @param days    day numbers, strictly increasing (not modified)
     * @param counts  counts &ge; 0, same length (not modified)
     * @param options model, day-of-week flag, level
     * @return the fit
     * @throws IllegalArgumentException if arrays are null, of different length, days not strictly
     *                                  increasing, a count negative, or fewer than 3 days have a
     *                                  non-zero count
     * @throws EstimationException      if the likelihood has no finite maximum (e.g. NB with no
     *                                  overdispersion, where k diverges, or a day-of-week level
     *                                  whose counts are all zero)
     */
    public static GrowthRateFit fit(int[] days, long[] counts, GrowthRateOptions options) {
        check(days, counts);
        if (days.length == 0) {
            throw new IllegalArgumentException("days must not be empty");
        }
        return fit(days, counts, days[0], days[days.length - 1], options);
    }

    /**
     * Fits the case series of {@code counts} over all its days.
     *
     * @param counts  daily counts (cases; deaths, recoveries and the imported split are not used)
     * @param options model, day-of-week flag, level
     * @return the fit
     * @throws IllegalArgumentException if fewer than 3 days have a non-zero count
     * @throws EstimationException      if the likelihood has no finite maximum
     */
    public static GrowthRateFit fit(org.incipit.core.observe.DailyCounts counts,
                                    GrowthRateOptions options) {
        return fit(counts, counts.firstDay(), counts.lastDay(), options);
    }

    /**
     * Fits the case series of {@code counts} over the day numbers [firstDay, lastDay].
     *
     * @param counts   daily counts
     * @param firstDay first day number of the window
     * @param lastDay  last day number, &ge; firstDay
     * @param options  model, day-of-week flag, level
     * @return the fit
     * @throws IllegalArgumentException as {@link #fit(int[], long[], int, int, GrowthRateOptions)}
     * @throws EstimationException      if the likelihood has no finite maximum
     */
    public static GrowthRateFit fit(org.incipit.core.observe.DailyCounts counts, int firstDay,
                                    int lastDay, GrowthRateOptions options) {
        if (counts == null) {
            throw new IllegalArgumentException("counts must not be null");
        }
        int[] c = counts.cases();
        long[] lc = new long[c.length];
        for (int i = 0; i < c.length; i++) {
            lc[i] = c[i];
        }
        return fit(counts.days(), lc, firstDay, lastDay, options);
    }

    /**
     * Fits the days in [firstDay, lastDay].
     *
     * @param days     day numbers, strictly increasing (not modified)
     * @param counts   counts &ge; 0, same length (not modified)
     * @param firstDay first day of the window
     * @param lastDay  last day of the window, &ge; firstDay
     * @param options  model, day-of-week flag, level
     * @return the fit
     * @throws IllegalArgumentException as {@link #fit(int[], long[], GrowthRateOptions)}, or if
     *                                  lastDay &lt; firstDay
     * @throws EstimationException      if the likelihood has no finite maximum
     */
    public static GrowthRateFit fit(int[] days, long[] counts, int firstDay, int lastDay,
                                    GrowthRateOptions options) {
        check(days, counts);
        if (options == null) {
            throw new IllegalArgumentException("options must not be null");
        }
        if (lastDay < firstDay) {
            throw new IllegalArgumentException("lastDay must be >= firstDay " + firstDay + ", was "
                    + lastDay);
        }
        int lo = 0;
        while (lo < days.length && days[lo] < firstDay) {
            lo++;
        }
        int hi = lo;
        while (hi < days.length && days[hi] <= lastDay) {
            hi++;
        }
        int n = hi - lo;
        int nonZero = 0;
        for (int i = lo; i < hi; i++) {
            if (counts[i] > 0) {
                nonZero++;
            }
        }
        if (nonZero < 3) {
            throw new IllegalArgumentException("growth fit needs at least 3 days with a non-zero "
                    + "count in the window [" + firstDay + ", " + lastDay + "], found " + nonZero);
        }
        double[] y = new double[n];
        double tBar = 0;
        for (int i = 0; i < n; i++) {
            y[i] = counts[lo + i];
            tBar += days[lo + i];
        }
        tBar /= n;
        // Day-of-week levels present, reference = smallest residue.
        TreeSet<Integer> levels = new TreeSet<>();
        if (options.dayOfWeek()) {
            for (int i = lo; i < hi; i++) {
                levels.add(Math.floorMod(days[i], 7));
            }
        }
        for (int level : levels) {
            long sum = 0;
            for (int i = lo; i < hi; i++) {
                if (Math.floorMod(days[i], 7) == level) {
                    sum += counts[i];
                }
            }
            if (sum == 0) {
                throw new EstimationException("day-of-week effect for residue " + level
                        + " (floorMod(day, 7)) is not estimable in [" + firstDay + ", " + lastDay
                        + "]: all its counts are zero, so its maximum-likelihood log rate ratio is "
                        + "-infinity; fit without the day-of-week factor or widen the window");
            }
        }
        List<Integer> dummies = new ArrayList<>(levels);
        if (!dummies.isEmpty()) {
            dummies.remove(0);
        }
        int p = 2 + dummies.size();
        if (n <= p) {
            throw new IllegalArgumentException("growth fit needs more days than coefficients (" + p
                    + "), found " + n + " days in [" + firstDay + ", " + lastDay + "]");
        }
        // Centred time for conditioning; the intercept is moved back to day 0 afterwards.
        double[][] x = new double[n][p];
        double[][] xProfile = new double[n][p - 1];
        double[] tc = new double[n];
        for (int i = 0; i < n; i++) {
            tc[i] = days[lo + i] - tBar;
            x[i][0] = 1;
            x[i][1] = tc[i];
            xProfile[i][0] = 1;
            int res = Math.floorMod(days[lo + i], 7);
            for (int j = 0; j < dummies.size(); j++) {
                double v = res == dummies.get(j) ? 1 : 0;
                x[i][2 + j] = v;
                xProfile[i][1 + j] = v;
            }
        }
        boolean nb = options.model() == CountModel.NEGATIVE_BINOMIAL;
        double[] zero = new double[n];
        CountSums sums = new CountSums(y);
        LogLinearGlm.Result r = LogLinearGlm.fit(x, y, zero, nb, false, null, Double.NaN, true,
                sums);
        double rate = r.beta()[1];
        double[][] cov = r.covariance();
        double seRate = Math.sqrt(cov[1][1]);
        // Back to day-0 intercept: a0 = a_c - tBar * r.
        double[] coef = r.beta().clone();
        coef[0] = r.beta()[0] - tBar * rate;
        double[] se = new double[p];
        se[0] = Math.sqrt(cov[0][0] + tBar * tBar * cov[1][1] - 2 * tBar * cov[0][1]);
        for (int j = 1; j < p; j++) {
            se[j] = Math.sqrt(cov[j][j]);
        }
        List<String> names = new ArrayList<>();
        names.add("intercept");
        names.add("rate");
        for (int d : dummies) {
            names.add("dow" + d);
        }
        double z = NormalDistribution.of(0, 1).inverseSurvivalProbability((1 - options.level()) / 2);
        Estimate wald = new Estimate(rate, rate - z * seRate, rate + z * seRate, options.level(),
                "wald");
        double llMax = r.logLik();
        // Profile fits are warm-started from the ML coefficients without the rate column.
        double[] betaRest = new double[p - 1];
        betaRest[0] = r.beta()[0];
        for (int j = 2; j < p; j++) {
            betaRest[j - 1] = r.beta()[j];
        }
        double kHat = r.k();
        // NB profile warm start: (beta without rate, log k) extrapolated linearly from the last
        // two profile points (rs[1], thetas[1]) and (rs[0], thetas[0]); at first the maximum.
        double[] thetaHat = java.util.Arrays.copyOf(betaRest, p);
        thetaHat[p - 1] = Math.log(kHat);
        double[] rs = {Double.NaN, rate};
        double[][] thetas = {null, thetaHat};
        // derivative of the last statistic computed, d g / d r (NaN if not available)
        double[] slope = new double[1];
        java.util.function.DoubleUnaryOperator g;
        if (nb) {
            double[] off = new double[n];
            double[] start = new double[p - 1];
            g = rr -> {
                for (int i = 0; i < n; i++) {
                    off[i] = rr * tc[i];
                }
                double[] last = thetas[1];
                double[] theta = new double[p];
                double llNewton = Double.NaN;
                if (!Double.isNaN(rs[0]) && rs[1] != rs[0]) {
                    double f = (rr - rs[1]) / (rs[1] - rs[0]);
                    for (int j = 0; j < p; j++) {
                        theta[j] = last[j] + f * (last[j] - thetas[0][j]);
                    }
                    System.arraycopy(theta, 0, start, 0, p - 1);
                    llNewton = LogLinearGlm.newtonNegBin(xProfile, y, off, start,
                            Math.exp(theta[p - 1]), sums, theta);
                }
                if (Double.isNaN(llNewton)) {
                    System.arraycopy(last, 0, start, 0, p - 1);
                    llNewton = LogLinearGlm.newtonNegBin(xProfile, y, off, start,
                            Math.exp(last[p - 1]), sums, theta);
                }
                double ll;
                double score = 0; // d l / d r at the profile maximum (envelope theorem)
                if (!Double.isNaN(llNewton)) {
                    rs[0] = rs[1];
                    thetas[0] = last;
                    rs[1] = rr;
                    thetas[1] = theta;
                    ll = llNewton;
                    double k = Math.exp(theta[p - 1]);
                    for (int i = 0; i < n; i++) {
                        double eta = off[i];
                        for (int j = 0; j < p - 1; j++) {
                            eta += xProfile[i][j] * theta[j];
                        }
                        double m = Math.exp(eta);
                        score += tc[i] * k * (y[i] - m) / (k + m);
                    }
                } else {
                    LogLinearGlm.Result pr = LogLinearGlm.fit(xProfile, y, off, nb, true,
                            betaRest, kHat, false, sums);
                    ll = pr.logLik();
                    double[] m = pr.mu();
                    double k = pr.k();
                    for (int i = 0; i < n; i++) {
                        score += tc[i] * k * (y[i] - m[i]) / (k + m[i]);
                    }
                }
                return rootStatistic(llMax - ll, score, z, slope);
            };
        } else {
            // Poisson with only an intercept and day-of-week cells left: the profile maximum is
            // closed form, exp(a + delta_g) = Y_g / sum_{i in g} exp(r t_i) per cell g, giving
            // l_p(r) = r sum y_i t_i + sum_g Y_g log(Y_g / S_g(r)) - sum_g Y_g - sum log y_i!.
            int[] cell = new int[n];
            int cells = 1 + dummies.size();
            for (int i = 0; i < n; i++) {
                int res = Math.floorMod(days[lo + i], 7);
                cell[i] = 1 + dummies.indexOf(res); // 0 = reference residue
            }
            double[] yCell = new double[cells];
            double syt = 0;
            for (int i = 0; i < n; i++) {
                yCell[cell[i]] += y[i];
                syt += y[i] * tc[i];
            }
            double lfy = LogLinearGlm.sumLogFactorial(y);
            final double sumYt = syt;
            double[] sCell = new double[cells];
            double[] dCell = new double[cells];
            g = rr -> {
                java.util.Arrays.fill(sCell, 0);
                java.util.Arrays.fill(dCell, 0);
                for (int i = 0; i < n; i++) {
                    double e = Math.exp(rr * tc[i]);
                    sCell[cell[i]] += e;
                    dCell[cell[i]] += tc[i] * e;
                }
                double ll = rr * sumYt - lfy;
                double score = sumYt; // d l_p / d r = sum y t - sum_g Y_g S_g'(r) / S_g(r)
                for (int c = 0; c < cells; c++) {
                    if (yCell[c] > 0) {
                        ll += yCell[c] * (Math.log(yCell[c] / sCell[c]) - 1);
                        score -= yCell[c] * dCell[c] / sCell[c];
                    }
                }
                return rootStatistic(llMax - ll, score, z, slope);
            };
        }
        double lower = profileLimit(g, slope, rate, -z * seRate);
        rs[0] = Double.NaN; // the other side starts again from the maximum
        rs[1] = rate;
        thetas[1] = thetaHat;
        double upper = profileLimit(g, slope, rate, z * seRate);
        Estimate profile = new Estimate(rate, Math.min(lower, rate), Math.max(upper, rate),
                options.level(), "profile");
        LOG.debug("growth fit [{}, {}] {}: r={} se={} iterations={}", firstDay, lastDay,
                options.model(), rate, seRate, r.iterations());
        double pearson = r.pearson() / (n - p);
        return new GrowthRateFit(options.model(), firstDay, lastDay, n, names, coef, se, wald,
                profile, r.k(), r.logLik(), r.deviance(), pearson, r.iterations(), r.converged());
    }

    /**
     * sqrt(2 drop) - z, the root statistic minus z, for a log-likelihood drop from the maximum;
     * slope[0] receives its derivative in r, -score / sqrt(2 drop) (NaN at the maximum).
     */
    private static double rootStatistic(double drop, double score, double z, double[] slope) {
        double root = Math.sqrt(Math.max(0, 2 * drop));
        slope[0] = root > 0 ? -score / root : Double.NaN;
        return root - z;
    }

    /** Newton steps on the signed root stop when they are below this relative size. */
    private static final double NEWTON_TOL = 1e-13;

    /**
     * Profile limit on the side of sign(step), step = z se (the Wald half-width). g is the root
     * statistic minus z, nearly linear in r, so Newton's method from the Wald limit (with the
     * derivative from the score at the profile maximum, slope[0] after each call) converges in
     * about three evaluations. The step is safeguarded: it must stay on its side of the
     * maximum, inside the known bracket and within 40 half-widths, and g must increase away from
     * the maximum; otherwise, or without convergence in 30 steps, the bracketing search with
     * Brent's method below decides (it also reports unbounded limits).
     */
    private static double profileLimit(java.util.function.DoubleUnaryOperator g, double[] slope,
                                       double rate, double step) {
        double r = rate + step;
        double inner = rate;                // g < 0 here
        double outer = rate + 40 * step;    // g >= 0 here once an evaluation shows it
        for (int it = 0; it < 30; it++) {
            double v = g.applyAsDouble(r);
            double d = slope[0];
            if (v == 0) {
                return r;
            }
            if (v < 0) {
                inner = r;
            } else {
                outer = r;
            }
            double next = r - v / d;
            boolean inside = (next - inner) * step > 0 && (outer - next) * step > 0;
            if (!(d * step > 0) || !inside) {
                break;
            }
            if (Math.abs(next - r) <= NEWTON_TOL * (Math.abs(r) + Math.abs(step))) {
                return next;
            }
            r = next;
        }
        return bracketedLimit(g, rate, step);
    }

    /**
     * Fallback for {@link #profileLimit}: the bracket starts at 0.8 and 1.25 Wald half-widths and
     * grows geometrically; Brent's method then finds the root. A limit not bracketed within 50
     * half-widths is infinite.
     */
    private static double bracketedLimit(java.util.function.DoubleUnaryOperator g, double rate,
                                         double step) {
        double inner = rate + 0.8 * step;
        if (!(g.applyAsDouble(inner) < 0)) {
            inner = rate;
        }
        double width = 1.25 * step;
        for (int tries = 0; tries < 12; tries++) {
            double outer = rate + width;
            double v = g.applyAsDouble(outer);
            if (v >= 0) {
                BrentSolver solver = new BrentSolver(1e-12, 1e-15, 0);
                return solver.findRoot(g, Math.min(inner, outer), Math.max(inner, outer));
            }
            inner = outer;
            width *= 2;
            if (Math.abs(width) > MAX_SE_STEPS * Math.abs(step)) {
                break;
            }
        }
        return step < 0 ? Double.NEGATIVE_INFINITY : Double.POSITIVE_INFINITY;
    }

    /**
     * Fits each window [firstDays[i], lastDay] and reports how r moves with the start day.
     * A window that cannot be fitted is kept in the list with the reason.
     *
     * @param days      day numbers, strictly increasing (not modified)
     * @param counts    counts &ge; 0 (not modified)
     * @param firstDays candidate first days, each &le; lastDay (not modified)
     * @param lastDay   common last day
     * @param options   model, day-of-week flag, level
     * @return one entry per candidate, in the order given
     * @throws IllegalArgumentException on invalid arrays or a first day after lastDay
     */
    public static List<GrowthWindow> compareWindows(int[] days, long[] counts, int[] firstDays,
                                                    int lastDay, GrowthRateOptions options) {
        check(days, counts);
        if (firstDays == null || firstDays.length == 0) {
            throw new IllegalArgumentException("firstDays must not be empty");
        }
        List<GrowthWindow> out = new ArrayList<>(firstDays.length);
        for (int f : firstDays) {
            if (f > lastDay) {
                throw new IllegalArgumentException("firstDays must be <= lastDay " + lastDay
                        + ", was " + f);
            }
            try {
                out.add(new GrowthWindow(f, lastDay,
                        java.util.Optional.of(fit(days, counts, f, lastDay, options)), ""));
            } catch (IllegalArgumentException | EstimationException e) {
                out.add(new GrowthWindow(f, lastDay, java.util.Optional.empty(), e.getMessage()));
            }
        }
        return List.copyOf(out);
    }

    private static void check(int[] days, long[] counts) {
        if (days == null || counts == null) {
            throw new IllegalArgumentException("days and counts must not be null");
        }
        if (days.length != counts.length) {
            throw new IllegalArgumentException("days and counts must have the same length, were "
                    + days.length + " and " + counts.length);
        }
        for (int i = 0; i < days.length; i++) {
            if (i > 0 && days[i] <= days[i - 1]) {
                throw new IllegalArgumentException("days must be strictly increasing, days[" + i
                        + "] = " + days[i] + " after " + days[i - 1]);
            }
            if (counts[i] < 0) {
                throw new IllegalArgumentException("counts[" + i + "] must be >= 0, was "
                        + counts[i]);
            }
        }
    }
}
