package org.incipit.core.inference;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import java.util.concurrent.Executor;
import java.util.concurrent.ForkJoinPool;
import java.util.function.Function;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Nonparametric and parametric bootstrap (Efron &amp; Tibshirani 1993, <i>An Introduction to
 * the Bootstrap</i>, ch. 6 and 10) on any {@link Executor}.
 *
 * <p><b>Determinism.</b> Replicate i draws from its own generator,
 * XO_RO_SHI_RO_128_PP seeded with two SplitMix64 outputs of (seed, i) (see
 * {@link #replicateStream(long, int)}), and its result is stored at index i. The result is
 * therefore bit-identical for any executor and thread count, provided the caller's function is
 * itself deterministic and free of shared mutable state.
 *
 * <p><b>Failures.</b> A replicate whose function throws a {@link RuntimeException} or returns
 * a vector with a non-finite entry or of the wrong length is counted as failed with its reason
 * ({@link BootstrapResult#failureReasons()}); it is never silently dropped.
 */
public final class Bootstrap {

    private static final Logger LOG = LoggerFactory.getLogger(Bootstrap.class);
    private static final long GOLDEN = 0x9E3779B97F4A7C15L;
    private static final int CHUNK = 16;

    private Bootstrap() {
    }

    /**
     * Nonparametric bootstrap: each replicate resamples {@code units} indices in [0, units) with
     * replacement and passes them to {@code statistic}, which builds the replicate data set
     * (e.g. the selected cases) and returns the statistic vector (e.g. a refitted estimate).
     *
     * @param seed       master seed
     * @param replicates number of replicates, &ge; 1
     * @param units      number of resampling units, &ge; 1
     * @param statistic  indices (a fresh array it may keep) -&gt; statistic vector
     * @param observed   statistic on the original data (copied), finite
     * @param executor   where replicates run, e.g. {@link ForkJoinPool#commonPool()}
     * @return replicates and failures
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static BootstrapResult nonparametric(long seed, int replicates, int units,
                                                Function<int[], double[]> statistic, double[] observed,
                                                Executor executor) {
        if (units < 1) {
            throw new IllegalArgumentException("units must be >= 1, was " + units);
        }
        return run(seed, replicates, rng -> {
            int[] idx = new int[units];
            for (int j = 0; j < units; j++) {
                idx[j] = rng.nextInt(units);
            }
            return statistic.apply(idx);
        }, observed, executor);
    }

    /**
     * Parametric bootstrap: {@code simulateAndRefit} draws a data set from the fitted model with
     * the given generator, refits, and returns the statistic vector.
     *
     * @param seed             master seed
     * @param replicates       number of replicates, &ge; 1
     * @param simulateAndRefit generator -&gt; statistic vector; the generator is the replicate's own
     * @param observed         statistic on the original data (copied), finite
     * @param executor         where replicates run
     * @return replicates and failures
     */
    public static BootstrapResult parametric(long seed, int replicates,
                                             Function<UniformRandomProvider, double[]> simulateAndRefit,
                                             double[] observed, Executor executor) {
        return run(seed, replicates, simulateAndRefit, observed, executor);
    }

    /**
     * The generator of replicate {@code i}: XO_RO_SHI_RO_128_PP seeded with
     * (splitmix64(seed + (2i+1)&gamma;), splitmix64(seed + (2i+2)&gamma;)), &gamma; the golden-ratio
     * increment (Steele, Lea &amp; Flood 2014).
     *
     * @param seed master seed
     * @param i    replicate index, &ge; 0
     * @return a new generator
     */
    public static UniformRandomProvider replicateStream(long seed, int i) {
        if (i < 0) {
            throw new IllegalArgumentException("replicate index must be >= 0, was " + i);
        }
        long base = seed + (2L * i + 1) * GOLDEN;
        return RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {mix(base), mix(base + GOLDEN)});
    }

    private static long mix(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    private static BootstrapResult run(long seed, int replicates, Function<UniformRandomProvider, double[]> task,
                                       double[] observed, Executor executor) {
        if (replicates < 1) {
            throw new IllegalArgumentException("replicates must be >= 1, was " + replicates);
        }
        if (observed == null || observed.length == 0) {
            throw new IllegalArgumentException("observed must be a non-empty statistic vector");
        }
        for (double v : observed) {
            if (!Double.isFinite(v)) {
                throw new IllegalArgumentException("observed statistic must be finite, was " + v);
            }
        }
        if (executor == null || task == null) {
            throw new IllegalArgumentException("executor and replicate function must not be null");
        }
        int m = observed.length;
        double[][] results = new double[replicates][];
        String[] reasons = new String[replicates];
        List<CompletableFuture<Void>> futures = new ArrayList<>();
        for (int start = 0; start < replicates; start += CHUNK) {
            int from = start;
            int to = Math.min(replicates, start + CHUNK);
            futures.add(CompletableFuture.runAsync(() -> {
                for (int i = from; i < to; i++) {
                    try {
                        double[] r = task.apply(replicateStream(seed, i));
                        if (r == null || r.length != m) {
                            reasons[i] = "statistic has length " + (r == null ? "null" : r.length) + ", expected " + m;
                            continue;
                        }
                        boolean finite = true;
                        for (double v : r) {
                            finite &= Double.isFinite(v);
                        }
                        if (finite) {
                            results[i] = r.clone();
                        } else {
                            reasons[i] = "non-finite statistic";
                        }
                    } catch (RuntimeException e) {
                        reasons[i] = e.getClass().getSimpleName() + ": " + e.getMessage();
                    }
                }
            }, executor));
        }
        try {
            CompletableFuture.allOf(futures.toArray(new CompletableFuture<?>[0])).join();
        } catch (CompletionException e) {
            throw new IllegalStateException("bootstrap task failed outside a replicate", e.getCause());
        }
        List<double[]> ok = new ArrayList<>();
        Map<String, Integer> why = new TreeMap<>();
        for (int i = 0; i < replicates; i++) {
            if (results[i] != null) {
                ok.add(results[i]);
            } else {
                why.merge(reasons[i] == null ? "no result" : reasons[i], 1, Integer::sum);
            }
        }
        LOG.debug("bootstrap: {} of {} replicates succeeded; failures {}", ok.size(), replicates, why);
        return new BootstrapResult(observed, ok.toArray(new double[0][]), replicates, why);
    }
}
