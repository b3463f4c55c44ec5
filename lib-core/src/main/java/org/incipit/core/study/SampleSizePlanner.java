package org.incipit.core.study;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;
import java.util.OptionalInt;
import java.util.TreeMap;
import java.util.concurrent.Executor;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Finds, by simulation, the smallest sample size at which one estimator's interval for one
 * target is narrow enough: its typical width (by default the median over the replicates, see
 * {@link WidthStatistic}) is at most the target width.
 *
 * <p>Replicate streams depend only on (seed, n, replicate), so the width at a given n is the
 * same whether it was found on a grid or by bisection. Failed replicates do not enter the width;
 * their count is reported per n. A sample size at which every replicate failed never qualifies.
 */
public final class SampleSizePlanner {

    private static final Logger LOG = LoggerFactory.getLogger(SampleSizePlanner.class);

    private SampleSizePlanner() {
    }

    /** Which typical width is compared with the target. */
    public enum WidthStatistic {
        /**
         * Median width of the successful replicates' intervals, an unbounded interval counting
         * as +&infin;: robust to the few very wide intervals that small-sample fits give, and
         * still honest about unbounded ones (the default).
         */
        MEDIAN,
        /** Mean width; +&infin; as soon as one interval is unbounded. */
        MEAN
    }

    /**
     * The width found at one sample size.
     *
     * @param sampleSize sample size
     * @param width      the chosen width statistic (NaN if every replicate failed)
     * @param successes  replicates with an interval
     * @param failures   failed replicates
     */
    public record WidthAtSize(int sampleSize, double width, int successes, int failures) {
    }

    /**
     * The outcome of a search.
     *
     * @param estimator   estimator name
     * @param target      target name
     * @param targetWidth the width asked for
     * @param statistic   width statistic used
     * @param widths      the widths found, by increasing sample size (unmodifiable)
     * @param sampleSize  the smallest sample size reaching the target, empty if none did
     */
    public record Plan(String estimator, String target, double targetWidth, WidthStatistic statistic,
                       List<WidthAtSize> widths, OptionalInt sampleSize) {

        /**
         * Copies the widths.
         *
         * @param estimator   estimator name
         * @param target      target name
         * @param targetWidth target width
         * @param statistic   statistic
         * @param widths      widths found
         * @param sampleSize  result
         */
        public Plan {
            widths = List.copyOf(widths);
        }
    }

    /**
     * Tries every candidate sample size (in one study run) and returns the smallest whose width
     * reaches the target. No monotonicity is assumed.
     *
     * @param study       the study (its replicate count and seed are used; its sample sizes are not)
     * @param estimator   estimator name in the study
     * @param target      one of its targets
     * @param targetWidth finite and &gt; 0
     * @param statistic   width statistic
     * @param candidates  candidate sample sizes, distinct, &ge; 1
     * @param executor    where replicates run
     * @param listener    progress
     * @return the plan
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static Plan grid(Study<?> study, String estimator, String target, double targetWidth,
                            WidthStatistic statistic, int[] candidates, Executor executor, StudyListener listener) {
        Study<?> s = restrict(study, estimator, target, targetWidth, statistic);
        StudyResult r = s.withSampleSizes(candidates).run(executor, listener);
        TreeMap<Integer, WidthAtSize> found = new TreeMap<>();
        for (StudySummary sum : r.summaries()) {
            if (sum.target().equals(target)) {
                found.put(sum.sampleSize(), width(sum, statistic));
            }
        }
        return plan(estimator, target, targetWidth, statistic, found);
    }

    /**
     * Bisection over the integers in [lo, hi], assuming the width decreases with n (true of
     * the typical width of most intervals, but a simulated width is noisy: near the answer the
     * result can be off by the Monte Carlo error, which more replicates reduce). Evaluates hi
     * first; if hi does not reach the target the plan is empty; if lo does, lo is returned.
     *
     * @param study       the study (replicates and seed are used)
     * @param estimator   estimator name
     * @param target      one of its targets
     * @param targetWidth finite and &gt; 0
     * @param statistic   width statistic
     * @param lo          smallest sample size to consider, &ge; 1
     * @param hi          largest, &ge; lo
     * @param executor    where replicates run
     * @param listener    progress (per sample size evaluated)
     * @return the plan, with every n evaluated
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static Plan bisect(Study<?> study, String estimator, String target, double targetWidth,
                              WidthStatistic statistic, int lo, int hi, Executor executor, StudyListener listener) {
        if (lo < 1 || hi < lo) {
            throw new IllegalArgumentException("need 1 <= lo <= hi, had lo = " + lo + ", hi = " + hi);
        }
        Study<?> s = restrict(study, estimator, target, targetWidth, statistic);
        TreeMap<Integer, WidthAtSize> found = new TreeMap<>();
        if (!reaches(s, target, targetWidth, statistic, hi, found, executor, listener)) {
            return plan(estimator, target, targetWidth, statistic, found);
        }
        if (lo < hi && !reaches(s, target, targetWidth, statistic, lo, found, executor, listener)) {
            int a = lo; // fails
            int b = hi; // reaches
            while (b - a > 1) {
                int mid = a + (b - a) / 2;
                if (reaches(s, target, targetWidth, statistic, mid, found, executor, listener)) {
                    b = mid;
                } else {
                    a = mid;
                }
            }
        }
        return plan(estimator, target, targetWidth, statistic, found);
    }

    private static boolean reaches(Study<?> s, String target, double w, WidthStatistic stat, int n,
                                   TreeMap<Integer, WidthAtSize> found, Executor ex, StudyListener l) {
        for (StudySummary sum : s.withSampleSizes(n).run(ex, l).summaries()) {
            if (sum.target().equals(target)) {
                WidthAtSize x = width(sum, stat);
                found.put(n, x);
                LOG.debug("planner: n = {}, {} width {} (target {})", n, stat, x.width(), w);
                return x.width() <= w;
            }
        }
        throw new IllegalStateException("no summary for target " + target);
    }

    private static Study<?> restrict(Study<?> study, String estimator, String target, double targetWidth,
                                     WidthStatistic statistic) {
        Objects.requireNonNull(statistic, "statistic");
        if (!(targetWidth > 0 && targetWidth < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("targetWidth must be finite and > 0, was " + targetWidth);
        }
        Study<?> s = study.withEstimators(estimator);
        if (!s.estimators().get(0).targets().contains(target)) {
            throw new IllegalArgumentException("estimator '" + estimator + "' has no target '" + target + "'; it has "
                    + s.estimators().get(0).targets());
        }
        return s;
    }

    private static WidthAtSize width(StudySummary s, WidthStatistic stat) {
        double w = stat == WidthStatistic.MEAN ? s.meanWidth() : s.medianWidth();
        return new WidthAtSize(s.sampleSize(), w, s.successes(), s.failures());
    }

    private static Plan plan(String estimator, String target, double w, WidthStatistic stat,
                             TreeMap<Integer, WidthAtSize> found) {
        OptionalInt best = OptionalInt.empty();
        for (WidthAtSize x : found.values()) {
            if (x.width() <= w) { // NaN never qualifies
                best = OptionalInt.of(x.sampleSize());
                break;
            }
        }
        LOG.debug("planner: {} {} width <= {}: n = {} from {}", estimator, target, w, best,
                Arrays.toString(found.keySet().toArray()));
        return new Plan(estimator, target, w, stat, new ArrayList<>(found.values()), best);
    }
}
