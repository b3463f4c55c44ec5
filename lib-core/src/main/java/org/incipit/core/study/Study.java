package org.incipit.core.study;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import java.util.concurrent.Executor;
import java.util.concurrent.ForkJoinPool;

import org.apache.commons.rng.UniformRandomProvider;
import org.incipit.core.inference.Bootstrap;
import org.incipit.core.inference.Estimate;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * A simulation study: a {@link Scenario}, a {@link DataGenerator}, named
 * {@link StudyEstimator}s, sample sizes, a replicate count, a master seed and a level.
 * Immutable; build with {@link #builder(Scenario, DataGenerator)}.
 *
 * <p>For each sample size n and replicate r the generator draws one data set from
 * {@link #replicateStream(long, int, int)} and every estimator is applied to that same data
 * set (paired comparison), each with its own generator
 * ({@link #estimatorStream(long, int, int, String)}). A replicate is therefore a pure function
 * of its {@link ReplicateTask}: results are bit-identical for any executor and thread count,
 * and an estimator's results do not depend on which other estimators are in the study.
 *
 * <p><b>Failures</b> are counted per estimator, target and sample size with their reasons,
 * never dropped: the generator throwing (all estimators fail), an estimator throwing (all its
 * targets fail, reason = exception class and message), returning null, leaving out a declared
 * target (that target fails), returning an undeclared target or an interval at another level
 * (all its targets fail).
 *
 * <p>Summaries follow the usual definitions of simulation-study performance measures (Morris,
 * White &amp; Crowther 2019, Statistics in Medicine 38:2074, table 6): bias, empirical SE, RMSE,
 * coverage, each with its Monte Carlo standard error; see {@link StudySummary}.
 *
 * @param <D> data set type
 */
public final class Study<D> {

    private static final Logger LOG = LoggerFactory.getLogger(Study.class);
    private static final int CHUNK = 8;

    private final Scenario scenario;
    private final DataGenerator<D> generator;
    private final List<StudyEstimator<D>> estimators;
    private final int[] sampleSizes;
    private final int replicates;
    private final long seed;
    private final double level;

    private Study(Scenario scenario, DataGenerator<D> generator, List<StudyEstimator<D>> estimators,
                  int[] sampleSizes, int replicates, long seed, double level) {
        this.scenario = Objects.requireNonNull(scenario, "scenario");
        this.generator = Objects.requireNonNull(generator, "generator");
        if (estimators.isEmpty()) {
            throw new IllegalArgumentException("a study needs at least one estimator");
        }
        LinkedHashSet<String> names = new LinkedHashSet<>();
        for (StudyEstimator<D> e : estimators) {
            if (!names.add(e.name())) {
                throw new IllegalArgumentException("estimator name '" + e.name() + "' is used twice");
            }
            for (String t : e.targets()) {
                if (!scenario.hasTruth(t)) {
                    throw new IllegalArgumentException("estimator '" + e.name() + "' estimates '" + t
                            + "' but scenario '" + scenario.name() + "' has no true value for it; it has "
                            + scenario.truths().keySet());
                }
            }
        }
        this.estimators = List.copyOf(estimators);
        if (sampleSizes == null || sampleSizes.length == 0) {
            throw new IllegalArgumentException("a study needs at least one sample size");
        }
        for (int n : sampleSizes) {
            if (n < 1) {
                throw new IllegalArgumentException("sample sizes must be >= 1, had " + n);
            }
        }
        if (Arrays.stream(sampleSizes).distinct().count() != sampleSizes.length) {
            throw new IllegalArgumentException("sample sizes must be distinct, were " + Arrays.toString(sampleSizes));
        }
        this.sampleSizes = sampleSizes.clone();
        if (replicates < 1) {
            throw new IllegalArgumentException("replicates must be >= 1, was " + replicates);
        }
        if ((long) replicates * sampleSizes.length > Integer.MAX_VALUE) {
            throw new IllegalArgumentException("replicates x sample sizes must be <= " + Integer.MAX_VALUE);
        }
        this.replicates = replicates;
        this.seed = seed;
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
        this.level = level;
    }

    /**
     * @param <D>       data set type
     * @param scenario  true values and settings
     * @param generator data generator
     * @return a builder (defaults: replicates 1000, seed 1, level 0.95; estimators and sample
     *         sizes required)
     */
    public static <D> Builder<D> builder(Scenario scenario, DataGenerator<D> generator) {
        return new Builder<>(scenario, generator);
    }

    /**
     * Builder of a {@link Study}.
     *
     * @param <D> data set type
     */
    public static final class Builder<D> {
        private final Scenario scenario;
        private final DataGenerator<D> generator;
        private final List<StudyEstimator<D>> estimators = new ArrayList<>();
        private int[] sampleSizes;
        private int replicates = 1000;
        private long seed = 1;
        private double level = 0.95;

        private Builder(Scenario scenario, DataGenerator<D> generator) {
            this.scenario = scenario;
            this.generator = generator;
        }

        /** @param e an estimator (names must be distinct) @return this builder */
        public Builder<D> estimator(StudyEstimator<D> e) {
            estimators.add(Objects.requireNonNull(e, "estimator"));
            return this;
        }

        /** @param n sample sizes, distinct, &ge; 1, in output order @return this builder */
        public Builder<D> sampleSizes(int... n) {
            sampleSizes = n == null ? null : n.clone();
            return this;
        }

        /** @param r replicates per sample size, &ge; 1 @return this builder */
        public Builder<D> replicates(int r) {
            replicates = r;
            return this;
        }

        /** @param s master seed @return this builder */
        public Builder<D> seed(long s) {
            seed = s;
            return this;
        }

        /** @param l nominal interval level in (0, 1) @return this builder */
        public Builder<D> level(double l) {
            level = l;
            return this;
        }

        /**
         * @return the study
         * @throws IllegalArgumentException if a part is missing or out of range, or an
         *                                  estimator's target has no true value in the scenario
         */
        public Study<D> build() {
            return new Study<>(scenario, generator, estimators, sampleSizes, replicates, seed, level);
        }
    }

    /** @return the scenario */
    public Scenario scenario() {
        return scenario;
    }

    /** @return the estimators, in study order */
    public List<StudyEstimator<D>> estimators() {
        return estimators;
    }

    /** @return the estimator names, in study order */
    public List<String> estimatorNames() {
        return estimators.stream().map(StudyEstimator::name).toList();
    }

    /** @return the sample sizes (new array) */
    public int[] sampleSizes() {
        return sampleSizes.clone();
    }

    /** @return replicates per sample size */
    public int replicates() {
        return replicates;
    }

    /** @return the master seed */
    public long seed() {
        return seed;
    }

    /** @return the nominal interval level */
    public double level() {
        return level;
    }

    /**
     * @param n sample sizes, distinct, &ge; 1
     * @return the same study at other sample sizes (replicate streams depend only on seed, n and
     *         index, so shared sizes give identical results)
     */
    public Study<D> withSampleSizes(int... n) {
        return new Study<>(scenario, generator, estimators, n, replicates, seed, level);
    }

    /**
     * @param r replicates per sample size, &ge; 1
     * @return the same study with another replicate count (the first replicates are unchanged)
     */
    public Study<D> withReplicates(int r) {
        return new Study<>(scenario, generator, estimators, sampleSizes, r, seed, level);
    }

    /**
     * @param names estimator names of this study, at least one
     * @return the study restricted to these estimators, in the given order
     * @throws IllegalArgumentException if a name is not an estimator of this study
     */
    public Study<D> withEstimators(String... names) {
        List<StudyEstimator<D>> chosen = new ArrayList<>();
        for (String name : names) {
            chosen.add(estimator(name));
        }
        return new Study<>(scenario, generator, chosen, sampleSizes, replicates, seed, level);
    }

    StudyEstimator<D> estimator(String name) {
        for (StudyEstimator<D> e : estimators) {
            if (e.name().equals(name)) {
                return e;
            }
        }
        throw new IllegalArgumentException("no estimator '" + name + "' in the study; it has " + estimatorNames());
    }

    /**
     * The data generator of replicate {@code replicate} at sample size {@code n}:
     * {@code Bootstrap.replicateStream(s, replicate)} with
     * {@code s = Bootstrap.replicateStream(seed, n).nextLong()} (see
     * {@link Bootstrap#replicateStream(long, int)}).
     *
     * @param seed      master seed
     * @param n         sample size, &ge; 1
     * @param replicate replicate index, &ge; 0
     * @return a new generator
     */
    public static UniformRandomProvider replicateStream(long seed, int n, int replicate) {
        return Bootstrap.replicateStream(sizeSeed(seed, n), replicate);
    }

    /**
     * The generator an estimator receives in replicate {@code replicate} at sample size
     * {@code n}: {@code Bootstrap.replicateStream(s ^ h, replicate)}, s as in
     * {@link #replicateStream(long, int, int)} and h the first output of
     * {@code Bootstrap.replicateStream(name.hashCode(), 0)}.
     *
     * @param seed      master seed
     * @param n         sample size, &ge; 1
     * @param replicate replicate index, &ge; 0
     * @param estimator estimator name
     * @return a new generator
     */
    public static UniformRandomProvider estimatorStream(long seed, int n, int replicate, String estimator) {
        long h = Bootstrap.replicateStream(estimator.hashCode(), 0).nextLong();
        return Bootstrap.replicateStream(sizeSeed(seed, n) ^ h, replicate);
    }

    private static long sizeSeed(long seed, int n) {
        if (n < 1) {
            throw new IllegalArgumentException("sample size must be >= 1, was " + n);
        }
        return Bootstrap.replicateStream(seed, n).nextLong();
    }

    /** @return the tasks of this study: sample sizes in study order, replicates 0..R-1 within each */
    public List<ReplicateTask> tasks() {
        List<String> names = estimatorNames();
        List<ReplicateTask> tasks = new ArrayList<>(sampleSizes.length * replicates);
        for (int n : sampleSizes) {
            for (int r = 0; r < replicates; r++) {
                tasks.add(new ReplicateTask(scenario.name(), names, n, r, seed));
            }
        }
        return tasks;
    }

    /**
     * Runs one replicate. Estimator exceptions and invalid outputs become failed outcomes.
     *
     * @param task a task of this study (same scenario name, estimators and seed)
     * @return its result
     * @throws IllegalArgumentException if the task belongs to another study
     */
    public ReplicateResult run(ReplicateTask task) {
        if (!task.scenario().equals(scenario.name()) || task.seed() != seed
                || !task.estimators().equals(estimatorNames())) {
            throw new IllegalArgumentException("task " + task + " does not belong to the study of scenario '"
                    + scenario.name() + "' with estimators " + estimatorNames() + " and seed " + seed);
        }
        int n = task.sampleSize();
        int r = task.replicate();
        List<TargetOutcome> out = new ArrayList<>();
        D data = null;
        String dataFailure = null;
        try {
            data = generator.generate(replicateStream(seed, n, r), scenario, n);
            if (data == null) {
                dataFailure = "data generation returned null";
            }
        } catch (RuntimeException e) {
            dataFailure = "data generation failed: " + describe(e);
        }
        for (StudyEstimator<D> e : estimators) {
            if (dataFailure != null) {
                failAll(out, e, dataFailure);
                continue;
            }
            Map<String, Estimate> m;
            try {
                m = e.estimate(estimatorStream(seed, n, r, e.name()), data);
            } catch (RuntimeException ex) {
                failAll(out, e, describe(ex));
                continue;
            }
            String bad = check(e, m);
            if (bad != null) {
                failAll(out, e, bad);
                continue;
            }
            for (String t : e.targets()) {
                Estimate est = m.get(t);
                out.add(est == null ? TargetOutcome.failure(e.name(), t, "missing target '" + t + "'")
                        : TargetOutcome.success(e.name(), t, est));
            }
        }
        return new ReplicateResult(task, out);
    }

    private String check(StudyEstimator<D> e, Map<String, Estimate> m) {
        if (m == null) {
            return "estimator returned null";
        }
        for (Map.Entry<String, Estimate> en : m.entrySet()) {
            if (!e.targets().contains(en.getKey())) {
                return "undeclared target '" + en.getKey() + "'";
            }
            Estimate est = en.getValue();
            if (est != null && est.level() != level) {
                return "interval level " + est.level() + " differs from the study level " + level;
            }
        }
        return null;
    }

    private static void failAll(List<TargetOutcome> out, StudyEstimator<?> e, String reason) {
        for (String t : e.targets()) {
            out.add(TargetOutcome.failure(e.name(), t, reason));
        }
    }

    private static String describe(RuntimeException e) {
        String m = e.getMessage();
        return e.getClass().getSimpleName() + (m == null ? "" : ": " + m);
    }

    /**
     * Runs all tasks on the common fork-join pool without progress reports.
     *
     * @return the result
     */
    public StudyResult run() {
        return run(ForkJoinPool.commonPool(), StudyListener.NONE);
    }

    /**
     * Runs all tasks on {@code executor} (e.g. {@code ForkJoinPool.commonPool()} for all
     * cores, or {@code Runnable::run} for the calling thread). The result is identical for any
     * executor.
     *
     * @param executor where replicates run
     * @param listener progress callback (serialised calls)
     * @return every replicate's result, in task order
     * @throws IllegalStateException if the executor fails outside a replicate
     */
    public StudyResult run(Executor executor, StudyListener listener) {
        Objects.requireNonNull(executor, "executor");
        Objects.requireNonNull(listener, "listener");
        List<ReplicateTask> tasks = tasks();
        int total = tasks.size();
        ReplicateResult[] results = new ReplicateResult[total];
        Object lock = new Object();
        int[] progress = new int[2]; // completed, failed outcomes
        int step = Math.max(1, total / 10);
        List<CompletableFuture<Void>> futures = new ArrayList<>();
        LOG.debug("study {}: {} tasks ({} sample sizes x {} replicates), estimators {}", scenario.name(), total,
                sampleSizes.length, replicates, estimatorNames());
        for (int start = 0; start < total; start += CHUNK) {
            int from = start;
            int to = Math.min(total, start + CHUNK);
            futures.add(CompletableFuture.runAsync(() -> {
                for (int i = from; i < to; i++) {
                    ReplicateResult res = run(tasks.get(i));
                    results[i] = res;
                    int failed = 0;
                    for (TargetOutcome o : res.outcomes()) {
                        failed += o.succeeded() ? 0 : 1;
                    }
                    synchronized (lock) {
                        progress[0]++;
                        progress[1] += failed;
                        listener.progress(progress[0], total, progress[1]);
                        if (progress[0] % step == 0 || progress[0] == total) {
                            LOG.debug("study {}: {}/{} replicates, {} failed outcomes", scenario.name(),
                                    progress[0], total, progress[1]);
                        }
                    }
                }
            }, executor));
        }
        try {
            CompletableFuture.allOf(futures.toArray(new CompletableFuture<?>[0])).join();
        } catch (CompletionException e) {
            throw new IllegalStateException("study task failed outside a replicate", e.getCause());
        }
        return StudyResult.of(this, Arrays.asList(results));
    }

    Map<String, List<String>> targetsByEstimator() {
        Map<String, List<String>> m = new LinkedHashMap<>();
        for (StudyEstimator<D> e : estimators) {
            m.put(e.name(), e.targets());
        }
        return m;
    }

    @Override
    public String toString() {
        return "Study[scenario=" + scenario.name() + ", estimators=" + estimatorNames() + ", sampleSizes="
                + Arrays.toString(sampleSizes) + ", replicates=" + replicates + ", seed=" + seed + ", level="
                + level + "]";
    }
}
