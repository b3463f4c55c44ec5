package org.incipit.core.inference;

import java.util.Arrays;
import java.util.Collections;
import java.util.Map;
import java.util.TreeMap;

import org.incipit.core.EstimationException;

/**
 * Bootstrap replicates of a statistic vector, with failures counted by reason.
 *
 * @param observed       statistic on the original data; copied
 * @param replicates     successful replicates in replicate order, each of observed's length; copied
 * @param requested      number of replicates requested, &ge; replicates.length
 * @param failureReasons failed replicates by reason (sorted); copied, unmodifiable
 */
public record BootstrapResult(double[] observed, double[][] replicates, int requested,
                              Map<String, Integer> failureReasons) {

    public BootstrapResult {
        if (observed == null || replicates == null || failureReasons == null) {
            throw new IllegalArgumentException("observed, replicates and failureReasons must not be null");
        }
        int failed = failureReasons.values().stream().mapToInt(Integer::intValue).sum();
        if (replicates.length + failed != requested) {
            throw new IllegalArgumentException("successful (" + replicates.length + ") + failed (" + failed
                    + ") must equal requested (" + requested + ")");
        }
        observed = observed.clone();
        double[][] copy = new double[replicates.length][];
        for (int i = 0; i < copy.length; i++) {
            if (replicates[i].length != observed.length) {
                throw new IllegalArgumentException("replicate " + i + " has length " + replicates[i].length
                        + ", expected " + observed.length);
            }
            copy[i] = replicates[i].clone();
        }
        replicates = copy;
        failureReasons = Collections.unmodifiableMap(new TreeMap<>(failureReasons));
    }

    @Override
    public double[] observed() {
        return observed.clone();
    }

    @Override
    public double[][] replicates() {
        double[][] c = new double[replicates.length][];
        for (int i = 0; i < c.length; i++) {
            c[i] = replicates[i].clone();
        }
        return c;
    }

    /** @return number of successful replicates */
    public int successful() {
        return replicates.length;
    }

    /** @return number of failed replicates */
    public int failed() {
        return requested - replicates.length;
    }

    /**
     * @param j component of the statistic
     * @return the successful replicates of component j, in replicate order (new array)
     */
    public double[] component(int j) {
        if (j < 0 || j >= observed.length) {
            throw new IllegalArgumentException("component must be in [0, " + observed.length + "), was " + j);
        }
        double[] c = new double[replicates.length];
        for (int i = 0; i < c.length; i++) {
            c[i] = replicates[i][j];
        }
        return c;
    }

    /**
     * @param j component
     * @return bootstrap standard error (sample standard deviation, divisor B&minus;1)
     * @throws EstimationException if fewer than 2 replicates succeeded
     */
    public double standardError(int j) {
        double[] c = requireTwo(j);
        double mean = 0;
        for (double v : c) {
            mean += v;
        }
        mean /= c.length;
        double ss = 0;
        for (double v : c) {
            ss += (v - mean) * (v - mean);
        }
        return Math.sqrt(ss / (c.length - 1));
    }

    /**
     * Percentile interval [q_(1-level)/2, q_(1+level)/2] of the successful replicates (quantiles by
     * linear interpolation, Hyndman &amp; Fan 1996 type 7; Efron &amp; Tibshirani 1993, ch. 13).
     *
     * @param j     component
     * @param level coverage in (0, 1)
     * @return the interval around the observed statistic, method "bootstrap-percentile"
     * @throws EstimationException if fewer than 2 replicates succeeded or the interval excludes
     *                             the observed statistic (a strongly biased bootstrap distribution)
     */
    public Estimate percentile(int j, double level) {
        double[] q = quantiles(j, level);
        return make(observed[j], q[0], q[1], level, "bootstrap-percentile");
    }

    /**
     * Basic (reverse percentile) interval [2t &minus; q_(1+level)/2, 2t &minus; q_(1-level)/2]
     * (Davison &amp; Hinkley 1997, eq. 5.6).
     *
     * @param j     component
     * @param level coverage in (0, 1)
     * @return the interval, method "bootstrap-basic"
     * @throws EstimationException as {@link #percentile(int, double)}
     */
    public Estimate basic(int j, double level) {
        double[] q = quantiles(j, level);
        double t = observed[j];
        return make(t, 2 * t - q[1], 2 * t - q[0], level, "bootstrap-basic");
    }

    private double[] quantiles(int j, double level) {
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
        double[] c = requireTwo(j);
        Arrays.sort(c);
        return new double[] {quantile(c, 0.5 - 0.5 * level), quantile(c, 0.5 + 0.5 * level)};
    }

    private static double quantile(double[] sorted, double p) {
        double h = (sorted.length - 1) * p;
        int lo = (int) Math.floor(h);
        int hi = Math.min(lo + 1, sorted.length - 1);
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }

    private double[] requireTwo(int j) {
        double[] c = component(j);
        if (c.length < 2) {
            throw new EstimationException("only " + c.length + " of " + requested
                    + " bootstrap replicates succeeded; failures: " + failureReasons);
        }
        return c;
    }

    private static Estimate make(double t, double lo, double hi, double level, String method) {
        if (!(lo <= t && t <= hi)) {
            throw new EstimationException(method + " interval [" + lo + ", " + hi + "] excludes the estimate " + t
                    + "; the bootstrap distribution is strongly biased");
        }
        return new Estimate(t, lo, hi, level, method);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof BootstrapResult b && Arrays.equals(observed, b.observed)
                && Arrays.deepEquals(replicates, b.replicates) && requested == b.requested
                && failureReasons.equals(b.failureReasons);
    }

    @Override
    public int hashCode() {
        return Arrays.deepHashCode(replicates) * 31 + requested;
    }

    @Override
    public String toString() {
        return "BootstrapResult[observed=" + Arrays.toString(observed) + ", successful=" + successful()
                + ", failed=" + failed() + ", failureReasons=" + failureReasons + "]";
    }
}
