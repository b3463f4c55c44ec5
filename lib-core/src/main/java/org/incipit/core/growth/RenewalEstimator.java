package org.incipit.core.growth;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.numbers.rootfinder.BrentSolver;
import org.apache.commons.statistics.distribution.GammaDistribution;
import org.apache.commons.statistics.distribution.NormalDistribution;
import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;

/**
 * The discrete renewal equation i<sub>t</sub> = R &Lambda;<sub>t</sub>, with total
 * infectiousness &Lambda;<sub>t</sub> = &Sigma;<sub>s&ge;1</sub> (i<sub>t&minus;s</sub> +
 * m<sub>t&minus;s</sub>) w<sub>s</sub>, where i are local cases, m imported cases (infectors,
 * never counted as infected), and w an {@link InfectivityProfile} (w<sub>0</sub> = 0). Days are
 * indices 0 .. T&minus;1 of consecutive daily counts; cases before day 0 are taken as none.
 *
 * <p>Observation model: i<sub>t</sub> ~ Poisson(R &Lambda;<sub>t</sub>) given the past
 * (Fraser 2007, PLoS ONE 2, e758; Cori, Ferguson, Fraser &amp; Cauchemez 2013, Am J Epidemiol 178,
 * 1505&ndash;1512). Stateless and thread-safe; input arrays are not modified.
 */
public final class RenewalEstimator {

    private RenewalEstimator() {
    }

    /**
     * &Lambda;<sub>t</sub> for t = 0 .. T&minus;1 (&Lambda;<sub>0</sub> = 0).
     *
     * @param local    local incidence, &ge; 0
     * @param imported imported cases per day, &ge; 0, same length, or null for none
     * @param w        infectivity profile
     * @return total infectiousness per day (new array)
     */
    public static double[] totalInfectiousness(long[] local, long[] imported, InfectivityProfile w) {
        check(local, imported, w);
        int n = local.length;
        double[] ws = w.weights();
        double[] lambda = new double[n];
        for (int t = 1; t < n; t++) {
            double s = 0;
            int smax = Math.min(t, ws.length - 1);
            for (int k = 1; k <= smax; k++) {
                long c = local[t - k] + (imported == null ? 0 : imported[t - k]);
                s += c * ws[k];
            }
            lambda[t] = s;
        }
        return lambda;
    }

    /**
     * Maximum-likelihood R over days [firstDay, lastDay] with a constant R (e.g. R<sub>0</sub>
     * from the first weeks): R&#770; = &Sigma; i<sub>t</sub> / &Sigma; &Lambda;<sub>t</sub>, and
     * the profile-likelihood interval {R : 2[&#8467;(R&#770;) &minus; &#8467;(R)] &le;
     * &chi;&sup2;<sub>1,level</sub>} with &#8467;(R) = I log R &minus; R &Lambda; (limits by Brent's
     * method; lower limit 0 when no case is observed).
     *
     * @param local    local incidence, days 0 .. T&minus;1
     * @param imported imported cases or null
     * @param w        infectivity profile
     * @param firstDay first day fitted, &ge; 1
     * @param lastDay  last day fitted, &lt; T
     * @param level    coverage in (0, 1)
     * @return R with profile interval (method "profile")
     * @throws IllegalArgumentException on bad input or a window with &Sigma; &Lambda; = 0 (no
     *                                  infectors before or within the window)
     */
    public static Estimate constantReproductionNumber(long[] local, long[] imported,
                                                      InfectivityProfile w, int firstDay,
                                                      int lastDay, double level) {
        double[] lambda = totalInfectiousness(local, imported, w);
        checkWindow(firstDay, lastDay, local.length);
        checkLevel(level);
        double cases = 0;
        double lam = 0;
        for (int t = firstDay; t <= lastDay; t++) {
            cases += local[t];
            lam += lambda[t];
        }
        if (!(lam > 0)) {
            throw new IllegalArgumentException("total infectiousness over days [" + firstDay + ", "
                    + lastDay + "] is 0: no earlier cases to act as infectors");
        }
        double z = NormalDistribution.of(0, 1).inverseSurvivalProbability((1 - level) / 2);
        double crit = z * z;
        double rHat = cases / lam;
        final double ii = cases;
        final double ll = lam;
        java.util.function.DoubleUnaryOperator dev = rr -> 2 * ((ii > 0 ? ii * Math.log(rHat / rr)
                : 0) - ll * (rHat - rr)) - crit;
        BrentSolver solver = new BrentSolver(1e-15, 1e-300, 0);
        double lower;
        if (cases == 0) {
            lower = 0;
        } else {
            double lo = rHat / 2;
            while (dev.applyAsDouble(lo) < 0) {
                lo /= 2;
            }
            lower = solver.findRoot(dev, lo, rHat);
        }
        double hi = Math.max(rHat * 2, crit / lam);
        while (dev.applyAsDouble(hi) < 0) {
            hi *= 2;
        }
        double upper = solver.findRoot(dev, rHat, hi);
        return new Estimate(rHat, lower, upper, level, "profile");
    }

    /**
     * Expected incidence projected forward: for t = T .. T + days &minus; 1,
     * E[i<sub>t</sub>] = R &Sigma;<sub>s&ge;1</sub> E[i<sub>t&minus;s</sub>] w<sub>s</sub>, the
     * observed history (local plus imported, as infectors) feeding the first days. No further
     * imports are assumed.
     *
     * @param local              observed local incidence, days 0 .. T&minus;1
     * @param imported           imported cases or null
     * @param w                  infectivity profile
     * @param reproductionNumber R, finite and &ge; 0
     * @param days               days to project, &ge; 1
     * @return expected local incidence for days T .. T + days &minus; 1 (new array)
     */
    public static double[] project(long[] local, long[] imported, InfectivityProfile w,
                                   double reproductionNumber, int days) {
        check(local, imported, w);
        if (!(reproductionNumber >= 0 && reproductionNumber < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("reproductionNumber must be finite and >= 0, was "
                    + reproductionNumber);
        }
        if (days < 1) {
            throw new IllegalArgumentException("days must be >= 1, was " + days);
        }
        int n = local.length;
        double[] all = new double[n + days];
        for (int t = 0; t < n; t++) {
            all[t] = local[t] + (imported == null ? 0 : imported[t]);
        }
        double[] ws = w.weights();
        for (int t = n; t < n + days; t++) {
            double s = 0;
            int smax = Math.min(t, ws.length - 1);
            for (int k = 1; k <= smax; k++) {
                s += all[t - k] * ws[k];
            }
            all[t] = reproductionNumber * s;
        }
        return java.util.Arrays.copyOfRange(all, n, n + days);
    }

    /**
     * Time-varying R over sliding windows of {@code width} days, by the conjugate gamma
     * posterior of Cori, Ferguson, Fraser &amp; Cauchemez 2013 (Am J Epidemiol 178, 1505&ndash;1512;
     * Methods / Web Appendix 1): for the window ending on day t,
     * R ~ Gamma(shape = a + &Sigma; i<sub>s</sub>, scale = 1 / (1/b + &Sigma; &Lambda;<sub>s</sub>)),
     * sums over s = t &minus; width + 1 .. t, prior Gamma(a, b). Windows end on days
     * width .. T&minus;1 (so every window starts on day &ge; 1). A window with &Sigma; &Lambda; = 0
     * returns the prior; check {@link WindowReproduction#totalInfectiousness()} (the authors
     * advise starting once enough cases have accumulated).
     *
     * @param local    local incidence, days 0 .. T&minus;1
     * @param imported imported cases (infectors only) or null
     * @param w        infectivity profile
     * @param width    window width in days, 1 .. T&minus;1
     * @param prior    gamma prior
     * @param level    credible level in (0, 1), equal-tailed
     * @return one entry per window, in order of end day
     */
    public static List<WindowReproduction> slidingWindows(long[] local, long[] imported,
                                                          InfectivityProfile w, int width,
                                                          GammaPrior prior, double level) {
        double[] lambda = totalInfectiousness(local, imported, w);
        int n = local.length;
        if (width < 1 || width > n - 1) {
            throw new IllegalArgumentException("width must be in [1, " + (n - 1) + "], was " + width);
        }
        if (prior == null) {
            throw new IllegalArgumentException("prior must not be null");
        }
        checkLevel(level);
        List<WindowReproduction> out = new ArrayList<>(n - width);
        for (int end = width; end < n; end++) {
            int start = end - width + 1;
            long cases = 0;
            double lam = 0;
            for (int t = start; t <= end; t++) {
                cases += local[t];
                lam += lambda[t];
            }
            double shape = prior.shape() + cases;
            double scale = 1 / (1 / prior.scale() + lam);
            GammaDistribution g = GammaDistribution.of(shape, scale);
            double alpha = (1 - level) / 2;
            double mean = shape * scale;
            double lo = g.inverseCumulativeProbability(alpha);
            double hi = g.inverseSurvivalProbability(alpha);
            if (!(lo <= mean && mean <= hi)) {
                throw new EstimationException("gamma posterior quantiles out of order for window ["
                        + start + ", " + end + "]");
            }
            out.add(new WindowReproduction(start, end, cases, lam, new GammaPrior(shape, scale),
                    new Estimate(mean, lo, hi, level, "gamma-posterior"),
                    g.inverseCumulativeProbability(0.5), Math.sqrt(shape) * scale));
        }
        return List.copyOf(out);
    }

    /**
     * {@link #slidingWindows(long[], long[], InfectivityProfile, int, GammaPrior, double)} on a
     * {@link org.incipit.core.observe.DailyCounts}: local cases = cases &minus; imported (imported
     * cases are part of the day's cases there), imported = the imported series if recorded. The
     * windows' first and last days are reported as day numbers of {@code counts}.
     *
     * @param counts daily counts
     * @param w      infectivity profile
     * @param width  window width in days
     * @param prior  gamma prior
     * @param level  credible level
     * @return one entry per window
     */
    public static List<WindowReproduction> slidingWindows(org.incipit.core.observe.DailyCounts counts,
                                                          InfectivityProfile w, int width,
                                                          GammaPrior prior, double level) {
        long[][] li = split(counts);
        List<WindowReproduction> byIndex = slidingWindows(li[0], li[1], w, width, prior, level);
        List<WindowReproduction> out = new ArrayList<>(byIndex.size());
        int d0 = counts.firstDay();
        for (WindowReproduction x : byIndex) {
            out.add(new WindowReproduction(x.firstDay() + d0, x.lastDay() + d0, x.localCases(),
                    x.totalInfectiousness(), x.posterior(), x.reproductionNumber(), x.median(),
                    x.sd()));
        }
        return List.copyOf(out);
    }

    /**
     * {@link #constantReproductionNumber(long[], long[], InfectivityProfile, int, int, double)} on
     * a {@link org.incipit.core.observe.DailyCounts}, window given as day numbers.
     *
     * @param counts   daily counts (local = cases &minus; imported)
     * @param w        infectivity profile
     * @param firstDay first day number fitted, after counts.firstDay()
     * @param lastDay  last day number fitted
     * @param level    coverage
     * @return R with profile interval
     */
    public static Estimate constantReproductionNumber(org.incipit.core.observe.DailyCounts counts,
                                                      InfectivityProfile w, int firstDay,
                                                      int lastDay, double level) {
        long[][] li = split(counts);
        return constantReproductionNumber(li[0], li[1], w, firstDay - counts.firstDay(),
                lastDay - counts.firstDay(), level);
    }

    private static long[][] split(org.incipit.core.observe.DailyCounts counts) {
        if (counts == null) {
            throw new IllegalArgumentException("counts must not be null");
        }
        int[] c = counts.cases();
        long[] local = new long[c.length];
        long[] imp = counts.hasImported() ? new long[c.length] : null;
        int[] im = counts.hasImported() ? counts.imported() : null;
        for (int i = 0; i < c.length; i++) {
            local[i] = c[i] - (im == null ? 0 : im[i]);
            if (imp != null) {
                imp[i] = im[i];
            }
        }
        return new long[][] {local, imp};
    }

    private static void check(long[] local, long[] imported, InfectivityProfile w) {
        if (local == null || w == null) {
            throw new IllegalArgumentException("incidence and profile must not be null");
        }
        if (local.length < 2) {
            throw new IllegalArgumentException("incidence must cover at least 2 days, had "
                    + local.length);
        }
        if (imported != null && imported.length != local.length) {
            throw new IllegalArgumentException("imported must have the length of the incidence "
                    + local.length + ", had " + imported.length);
        }
        for (int t = 0; t < local.length; t++) {
            if (local[t] < 0) {
                throw new IllegalArgumentException("local[" + t + "] must be >= 0, was " + local[t]);
            }
            if (imported != null && imported[t] < 0) {
                throw new IllegalArgumentException("imported[" + t + "] must be >= 0, was "
                        + imported[t]);
            }
        }
    }

    private static void checkWindow(int firstDay, int lastDay, int n) {
        if (firstDay < 1 || lastDay < firstDay || lastDay >= n) {
            throw new IllegalArgumentException("window must satisfy 1 <= firstDay <= lastDay < " + n
                    + ", was [" + firstDay + ", " + lastDay + "]");
        }
    }

    private static void checkLevel(double level) {
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
    }
}
