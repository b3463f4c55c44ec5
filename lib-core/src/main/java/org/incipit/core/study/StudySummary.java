package org.incipit.core.study;

import java.util.Arrays;
import java.util.Collections;
import java.util.Map;
import java.util.TreeMap;

import org.apache.commons.statistics.distribution.BetaDistribution;

/**
 * Performance of one estimator for one target at one sample size over the replicates of a
 * study (definitions as in Morris, White &amp; Crowther 2019, Statistics in Medicine 38:2074,
 * table 6). Statistics over the {@code successes} replicates that produced an estimate; a
 * statistic that needs more successes than there are (e.g. a standard deviation from one) is
 * NaN, written "NA" by {@link StudyTables}.
 *
 * @param estimator             estimator name
 * @param target                target name
 * @param sampleSize            sample size
 * @param truth                 true value, finite
 * @param level                 nominal interval level
 * @param replicates            replicates run
 * @param successes             replicates with an estimate
 * @param meanEstimate          mean of the estimates
 * @param bias                  meanEstimate &minus; truth
 * @param biasStandardError     Monte Carlo SE of the bias: empiricalSd / &radic;successes
 * @param relativeBias          bias / truth (NaN if truth is 0)
 * @param rmse                  &radic;(mean of (estimate &minus; truth)&sup2;)
 * @param empiricalSd           sample SD of the estimates (divisor successes &minus; 1)
 * @param covered               intervals containing the truth (bounds included)
 * @param coverage              covered / successes
 * @param coverageStandardError &radic;(coverage (1 &minus; coverage) / successes), the binomial SE
 * @param coverageLower         Clopper&ndash;Pearson 95% lower bound for the coverage
 * @param coverageUpper         Clopper&ndash;Pearson 95% upper bound for the coverage
 * @param meanWidth             mean interval width; +&infin; if an interval is unbounded
 * @param medianWidth           median interval width (unbounded intervals count as +&infin;)
 * @param unboundedIntervals    intervals with an infinite bound
 * @param failureReasons        failed replicates by reason (sorted); copied, unmodifiable
 */
public record StudySummary(String estimator, String target, int sampleSize, double truth, double level,
                           int replicates, int successes, double meanEstimate, double bias,
                           double biasStandardError, double relativeBias, double rmse, double empiricalSd,
                           int covered, double coverage, double coverageStandardError, double coverageLower,
                           double coverageUpper, double meanWidth, double medianWidth, int unboundedIntervals,
                           Map<String, Integer> failureReasons) {

    /** Confidence level of the Clopper&ndash;Pearson interval for the coverage. */
    public static final double COVERAGE_CONFIDENCE = 0.95;

    /**
     * Validates the counts and copies the reasons.
     *
     * @param estimator             estimator name
     * @param target                target name
     * @param sampleSize            sample size, &ge; 1
     * @param truth                 finite
     * @param level                 in (0, 1)
     * @param replicates            &ge; 1
     * @param successes             in [0, replicates]
     * @param meanEstimate          see the record description
     * @param bias                  see the record description
     * @param biasStandardError     see the record description
     * @param relativeBias          see the record description
     * @param rmse                  see the record description
     * @param empiricalSd           see the record description
     * @param covered               in [0, successes]
     * @param coverage              see the record description
     * @param coverageStandardError see the record description
     * @param coverageLower         see the record description
     * @param coverageUpper         see the record description
     * @param meanWidth             see the record description
     * @param medianWidth           see the record description
     * @param unboundedIntervals    in [0, successes]
     * @param failureReasons        counts summing to replicates &minus; successes
     * @throws IllegalArgumentException if the counts are inconsistent
     */
    public StudySummary {
        if (estimator == null || target == null) {
            throw new IllegalArgumentException("estimator and target must be named");
        }
        if (sampleSize < 1 || replicates < 1 || successes < 0 || successes > replicates) {
            throw new IllegalArgumentException("need sampleSize >= 1, replicates >= 1 and 0 <= successes <= replicates,"
                    + " had " + sampleSize + ", " + replicates + ", " + successes);
        }
        if (!Double.isFinite(truth) || !(level > 0 && level < 1)) {
            throw new IllegalArgumentException("truth must be finite and level in (0, 1), had " + truth + ", " + level);
        }
        if (covered < 0 || covered > successes || unboundedIntervals < 0 || unboundedIntervals > successes) {
            throw new IllegalArgumentException("covered (" + covered + ") and unboundedIntervals ("
                    + unboundedIntervals + ") must be in [0, successes = " + successes + "]");
        }
        if (failureReasons == null) {
            throw new IllegalArgumentException("failureReasons must not be null");
        }
        int failed = 0;
        for (Map.Entry<String, Integer> e : failureReasons.entrySet()) {
            if (e.getKey() == null || e.getValue() == null || e.getValue() < 1) {
                throw new IllegalArgumentException("failure counts must be >= 1, had " + e);
            }
            failed += e.getValue();
        }
        if (failed != replicates - successes) {
            throw new IllegalArgumentException("failure counts sum to " + failed + ", expected replicates - successes = "
                    + (replicates - successes));
        }
        failureReasons = Collections.unmodifiableMap(new TreeMap<>(failureReasons));
    }

    /**
     * Computes the summary from the successful replicates' estimates and intervals.
     *
     * @param estimator      estimator name
     * @param target         target name
     * @param sampleSize     sample size, &ge; 1
     * @param truth          true value, finite
     * @param level          nominal level
     * @param estimates      estimates of the successful replicates, finite, in replicate order; not modified
     * @param lower          their lower bounds (may be &minus;&infin;); not modified
     * @param upper          their upper bounds (may be +&infin;); not modified
     * @param failureReasons failed replicates by reason
     * @return the summary
     * @throws IllegalArgumentException if the arrays differ in length or hold invalid intervals
     */
    public static StudySummary of(String estimator, String target, int sampleSize, double truth, double level,
                                  double[] estimates, double[] lower, double[] upper,
                                  Map<String, Integer> failureReasons) {
        if (estimates == null || lower == null || upper == null || failureReasons == null) {
            throw new IllegalArgumentException("estimates, lower, upper and failureReasons must not be null");
        }
        int m = estimates.length;
        if (lower.length != m || upper.length != m) {
            throw new IllegalArgumentException("estimates, lower and upper must have the same length, had " + m
                    + ", " + lower.length + ", " + upper.length);
        }
        int failed = failureReasons.values().stream().mapToInt(Integer::intValue).sum();
        for (int i = 0; i < m; i++) {
            if (!Double.isFinite(estimates[i]) || !(lower[i] <= estimates[i]) || !(upper[i] >= estimates[i])) {
                throw new IllegalArgumentException("replicate " + i + ": need a finite estimate in [lower, upper], had "
                        + estimates[i] + " in [" + lower[i] + ", " + upper[i] + "]");
            }
        }
        double nan = Double.NaN;
        double mean = m > 0 ? sum(estimates) / m : nan;
        double ss = 0;
        double se2 = 0;
        int covered = 0;
        int unbounded = 0;
        double[] widths = new double[m];
        for (int i = 0; i < m; i++) {
            double d = estimates[i] - mean;
            ss += d * d;
            double e = estimates[i] - truth;
            se2 += e * e;
            covered += lower[i] <= truth && truth <= upper[i] ? 1 : 0;
            widths[i] = upper[i] - lower[i];
            if (!Double.isFinite(widths[i])) {
                unbounded++;
            }
        }
        double widthSum = sum(widths);
        double sd = m > 1 ? Math.sqrt(ss / (m - 1)) : nan;
        double bias = mean - truth;
        double coverage = m > 0 ? (double) covered / m : nan;
        double[] cp = m > 0 ? clopperPearson(covered, m, COVERAGE_CONFIDENCE) : new double[] {nan, nan};
        Arrays.sort(widths);
        double median = m == 0 ? nan : m % 2 == 1 ? widths[m / 2] : 0.5 * (widths[m / 2 - 1] + widths[m / 2]);
        return new StudySummary(estimator, target, sampleSize, truth, level, m + failed, m, mean, bias,
                m > 1 ? sd / Math.sqrt(m) : nan, truth != 0 ? bias / truth : nan, m > 0 ? Math.sqrt(se2 / m) : nan,
                sd, covered, coverage, m > 0 ? Math.sqrt(coverage * (1 - coverage) / m) : nan, cp[0], cp[1],
                m > 0 ? widthSum / m : nan, median, unbounded, failureReasons);
    }

    /** Neumaier's compensated sum (Neumaier 1974, ZAMM 54:39), so means of many replicates keep full precision. */
    private static double sum(double[] x) {
        double s = 0;
        double c = 0;
        for (double v : x) {
            double t = s + v;
            c += Math.abs(s) >= Math.abs(v) ? (s - t) + v : (v - t) + s;
            s = t;
        }
        double r = s + c;
        return Double.isNaN(r) ? s : r; // infinite terms: s is +-Inf and c NaN
    }

    /**
     * Exact (Clopper &amp; Pearson 1934, Biometrika 26:404) confidence interval for a binomial
     * proportion: lower = Beta(x, m &minus; x + 1) quantile (1 &minus; c)/2 (0 if x = 0), upper =
     * Beta(x + 1, m &minus; x) quantile (1 + c)/2 (1 if x = m).
     *
     * @param x          successes, in [0, m]
     * @param m          trials, &ge; 1
     * @param confidence in (0, 1)
     * @return {lower, upper}
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static double[] clopperPearson(int x, int m, double confidence) {
        if (m < 1 || x < 0 || x > m) {
            throw new IllegalArgumentException("need m >= 1 and 0 <= x <= m, had x = " + x + ", m = " + m);
        }
        if (!(confidence > 0 && confidence < 1)) {
            throw new IllegalArgumentException("confidence must be in (0, 1), was " + confidence);
        }
        double a = 0.5 * (1 - confidence);
        double lo = x == 0 ? 0 : BetaDistribution.of(x, m - x + 1).inverseCumulativeProbability(a);
        double hi = x == m ? 1 : BetaDistribution.of(x + 1, m - x).inverseSurvivalProbability(a);
        return new double[] {lo, hi};
    }

    /** @return replicates &minus; successes */
    public int failures() {
        return replicates - successes;
    }

    /** @return failures / replicates */
    public double failureRate() {
        return (double) failures() / replicates;
    }
}
