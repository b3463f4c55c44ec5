package org.incipit.core.study;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * Every replicate result of a study run, and their {@link StudySummary summaries}. Immutable.
 */
public final class StudyResult {

    private final Scenario scenario;
    private final Map<String, List<String>> targets;
    private final int[] sampleSizes;
    private final int replicates;
    private final long seed;
    private final double level;
    private final List<ReplicateResult> results;

    private StudyResult(Study<?> study, List<ReplicateResult> results) {
        this.scenario = study.scenario();
        this.targets = study.targetsByEstimator();
        this.sampleSizes = study.sampleSizes();
        this.replicates = study.replicates();
        this.seed = study.seed();
        this.level = study.level();
        this.results = List.copyOf(results);
    }

    /**
     * Collects results computed elsewhere (e.g. by a distributed runner calling
     * {@link Study#run(ReplicateTask)}); they are put in task order.
     *
     * @param study   the study
     * @param results one result per task of {@link Study#tasks()}, in any order
     * @return the result
     * @throws IllegalArgumentException if a task is missing, repeated or foreign
     */
    public static StudyResult of(Study<?> study, List<ReplicateResult> results) {
        List<ReplicateTask> tasks = study.tasks();
        Map<ReplicateTask, Integer> index = new HashMap<>();
        for (int i = 0; i < tasks.size(); i++) {
            index.put(tasks.get(i), i);
        }
        ReplicateResult[] ordered = new ReplicateResult[tasks.size()];
        for (ReplicateResult r : results) {
            Integer i = r == null ? null : index.get(r.task());
            if (i == null) {
                throw new IllegalArgumentException("result " + (r == null ? null : r.task())
                        + " is not a task of " + study);
            }
            if (ordered[i] != null) {
                throw new IllegalArgumentException("task " + r.task() + " has two results");
            }
            ordered[i] = r;
        }
        for (int i = 0; i < ordered.length; i++) {
            if (ordered[i] == null) {
                throw new IllegalArgumentException("task " + tasks.get(i) + " has no result");
            }
        }
        return new StudyResult(study, List.of(ordered));
    }

    /** @return the scenario */
    public Scenario scenario() {
        return scenario;
    }

    /** @return the nominal interval level */
    public double level() {
        return level;
    }

    /** @return the master seed */
    public long seed() {
        return seed;
    }

    /** @return replicates per sample size */
    public int replicates() {
        return replicates;
    }

    /** @return the sample sizes (new array) */
    public int[] sampleSizes() {
        return sampleSizes.clone();
    }

    /** @return the replicate results in task order (unmodifiable) */
    public List<ReplicateResult> results() {
        return results;
    }

    /**
     * One summary per estimator &times; target &times; sample size, in study order
     * (estimators, their targets, sample sizes). Sums run in replicate order, so the summaries
     * are bit-identical whatever executor ran the study.
     *
     * @return the summaries
     */
    public List<StudySummary> summaries() {
        // per (estimator, target, n): outcomes in replicate order
        Map<String, List<TargetOutcome>> byKey = new LinkedHashMap<>();
        for (ReplicateResult r : results) {
            for (TargetOutcome o : r.outcomes()) {
                byKey.computeIfAbsent(key(o.estimator(), o.target(), r.task().sampleSize()), k -> new ArrayList<>())
                        .add(o);
            }
        }
        List<StudySummary> out = new ArrayList<>();
        for (Map.Entry<String, List<String>> e : targets.entrySet()) {
            for (String t : e.getValue()) {
                for (int n : sampleSizes) {
                    List<TargetOutcome> os = byKey.getOrDefault(key(e.getKey(), t, n), List.of());
                    int m = 0;
                    for (TargetOutcome o : os) {
                        m += o.succeeded() ? 1 : 0;
                    }
                    double[] est = new double[m];
                    double[] lo = new double[m];
                    double[] hi = new double[m];
                    Map<String, Integer> why = new TreeMap<>();
                    int k = 0;
                    for (TargetOutcome o : os) {
                        if (o.succeeded()) {
                            est[k] = o.estimate();
                            lo[k] = o.lower();
                            hi[k] = o.upper();
                            k++;
                        } else {
                            why.merge(o.failureReason(), 1, Integer::sum);
                        }
                    }
                    out.add(StudySummary.of(e.getKey(), t, n, scenario.truth(t), level, est, lo, hi, why));
                }
            }
        }
        return out;
    }

    private static String key(String estimator, String target, int n) {
        return estimator + '\u0000' + target + '\u0000' + n;
    }
}
