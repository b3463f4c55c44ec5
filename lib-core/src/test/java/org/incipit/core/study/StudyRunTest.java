package org.incipit.core.study;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.ObjectInputStream;
import java.io.ObjectOutputStream;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.ForkJoinPool;

import org.incipit.core.inference.Estimate;
import org.junit.jupiter.api.Test;

/** Determinism, failure accounting, tasks and progress of {@link Study}. */
class StudyRunTest {

    private static final double MU = 5;
    private static final double SIGMA = 2;

    private static Study<double[]> flakyStudy(int replicates) {
        Scenario sc = StudyTestModels.normal(MU, SIGMA);
        return Study.builder(sc, StudyTestModels.normalGenerator(sc))
                .estimator(CalibrationModels.meanT(0.95))
                .estimator(StudyTestModels.flaky(MU, SIGMA, 0.95))
                .sampleSizes(5, 10).replicates(replicates).seed(StudyTestModels.SEED).build();
    }

    @Test
    void identicalForOneTwoThreadsAndCallingThread() {
        Study<double[]> study = flakyStudy(300);
        ForkJoinPool one = new ForkJoinPool(1);
        ForkJoinPool two = new ForkJoinPool(2);
        try {
            StudyResult a = study.run(one, StudyListener.NONE);
            StudyResult b = study.run(two, StudyListener.NONE);
            StudyResult c = study.run(Runnable::run, StudyListener.NONE);
            assertEquals(a.results(), b.results());
            assertEquals(a.results(), c.results());
            // record equality compares doubles bit for bit (Double.compare)
            assertEquals(a.summaries(), b.summaries());
            assertEquals(a.summaries(), c.summaries());
        } finally {
            one.shutdown();
            two.shutdown();
        }
    }

    @Test
    void estimatorResultsDoNotDependOnTheOtherEstimators() {
        Study<double[]> both = flakyStudy(100);
        Study<double[]> alone = both.withEstimators("normal-mean-t");
        List<StudySummary> a = alone.run().summaries();
        List<StudySummary> b = both.run().summaries().subList(0, 2);
        assertEquals(a, b);
        // and sample sizes are independent too: n = 10 alone equals n = 10 within {5, 10}
        assertEquals(b.get(1), both.withEstimators("normal-mean-t").withSampleSizes(10).run().summaries().get(0));
    }

    @Test
    void failuresAreCountedWithReasonsNeverDropped() {
        int reps = 200;
        Study<double[]> study = flakyStudy(reps);
        List<StudySummary> rows = study.run().summaries();
        // expected counts from the data, regenerated independently from the replicate streams
        for (int n : new int[] {5, 10}) {
            int thrown = 0;
            int missing = 0;
            int undeclared = 0;
            for (int r = 0; r < reps; r++) {
                double[] x = StudyTestModels.normalGenerator(study.scenario())
                        .generate(Study.replicateStream(StudyTestModels.SEED, n, r), study.scenario(), n);
                if (x[0] > MU + SIGMA) {
                    thrown++;
                } else if (x[0] < MU - SIGMA) {
                    missing++;
                } else if (x[1] > MU + 1.5 * SIGMA) {
                    undeclared++;
                }
            }
            assertTrue(thrown > 10 && missing > 10 && undeclared > 3, "the test data exercise every path");
            StudySummary mean = find(rows, "flaky", "mean", n);
            StudySummary sd = find(rows, "flaky", "sd", n);
            Map<String, Integer> meanWhy = new TreeMap<>(Map.of("EstimationException: first value too large", thrown,
                    "undeclared target 'extra'", undeclared));
            assertEquals(meanWhy, mean.failureReasons());
            assertEquals(reps - thrown - undeclared, mean.successes());
            Map<String, Integer> sdWhy = new TreeMap<>(meanWhy);
            sdWhy.put("missing target 'sd'", missing);
            assertEquals(sdWhy, sd.failureReasons());
            assertEquals(reps - thrown - undeclared - missing, sd.successes());
            assertEquals((double) sd.failures() / reps, sd.failureRate(), 0);
            // the well-behaved estimator on the same data sets is unaffected
            assertEquals(0, find(rows, "normal-mean-t", "mean", n).failures());
        }
    }

    @Test
    void generatorFailuresAndWrongLevelsAreFailuresOfEveryTarget() {
        Scenario sc = StudyTestModels.normal(MU, SIGMA);
        DataGenerator<double[]> good = StudyTestModels.normalGenerator(sc);
        DataGenerator<double[]> bad = (rng, s, n) -> {
            double[] x = good.generate(rng, s, n);
            if (x[0] > MU) {
                throw new IllegalStateException("simulated outbreak died out");
            }
            return x[1] > MU ? null : x;
        };
        StudyResult r = Study.builder(sc, bad)
                .estimator(CalibrationModels.meanT(0.90)) // wrong level for a 0.95 study
                .estimator(CalibrationModels.varianceMle(0.95))
                .estimator(StudyEstimator.of("null-result", List.of("mean"), (rng, x) -> null))
                .sampleSizes(4).replicates(100).seed(7).build().run();
        int died = 0;
        int nulls = 0;
        for (int i = 0; i < 100; i++) {
            double[] x = good.generate(Study.replicateStream(7, 4, i), sc, 4);
            died += x[0] > MU ? 1 : 0;
            nulls += x[0] <= MU && x[1] > MU ? 1 : 0;
        }
        List<StudySummary> rows = r.summaries();
        assertEquals(Map.of("data generation failed: IllegalStateException: simulated outbreak died out", died,
                "data generation returned null", nulls,
                "interval level 0.9 differs from the study level 0.95", 100 - died - nulls),
                rows.get(0).failureReasons());
        assertEquals(100 - died - nulls, rows.get(1).successes());
        assertEquals(Map.of("data generation failed: IllegalStateException: simulated outbreak died out", died,
                "data generation returned null", nulls, "estimator returned null", 100 - died - nulls),
                rows.get(2).failureReasons());
        assertEquals(0, rows.get(0).successes());
        assertTrue(Double.isNaN(rows.get(0).meanEstimate()) && Double.isNaN(rows.get(0).coverage()));
    }

    @Test
    void aTaskRunsAloneToTheSameResultAndSerialises() throws IOException, ClassNotFoundException {
        Study<double[]> study = flakyStudy(20);
        StudyResult all = study.run();
        List<ReplicateTask> tasks = study.tasks();
        assertEquals(40, tasks.size());
        ReplicateTask t = tasks.get(27);
        assertEquals(new ReplicateTask("normal-test", List.of("normal-mean-t", "flaky"), 10, 7, StudyTestModels.SEED), t);
        ReplicateTask copy = roundTrip(t);
        assertEquals(t, copy);
        ReplicateResult alone = study.run(copy);
        assertEquals(all.results().get(27), alone);
        assertEquals(alone, roundTrip(alone));
        // a distributed runner returns results in any order
        List<ReplicateResult> shuffled = new ArrayList<>(all.results());
        Collections.reverse(shuffled);
        assertEquals(all.summaries(), StudyResult.of(study, shuffled).summaries());
        assertThrows(IllegalArgumentException.class, () -> StudyResult.of(study, shuffled.subList(1, 40)));
        assertThrows(IllegalArgumentException.class,
                () -> study.run(new ReplicateTask("other", t.estimators(), 10, 7, StudyTestModels.SEED)));
    }

    @SuppressWarnings("unchecked")
    private static <T> T roundTrip(T o) throws IOException, ClassNotFoundException {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        try (ObjectOutputStream out = new ObjectOutputStream(b)) {
            out.writeObject(o);
        }
        try (ObjectInputStream in = new ObjectInputStream(new ByteArrayInputStream(b.toByteArray()))) {
            return (T) in.readObject();
        }
    }

    @Test
    void progressIsReportedOncePerReplicateInOrder() {
        Study<double[]> study = flakyStudy(50);
        List<int[]> calls = Collections.synchronizedList(new ArrayList<>());
        ForkJoinPool two = new ForkJoinPool(2);
        StudyResult r;
        try {
            r = study.run(two, (done, total, failed) -> calls.add(new int[] {done, total, failed}));
        } finally {
            two.shutdown();
        }
        assertEquals(100, calls.size());
        for (int i = 0; i < calls.size(); i++) {
            assertEquals(i + 1, calls.get(i)[0]);
            assertEquals(100, calls.get(i)[1]);
        }
        int failed = 0;
        for (ReplicateResult rr : r.results()) {
            for (TargetOutcome o : rr.outcomes()) {
                failed += o.succeeded() ? 0 : 1;
            }
        }
        assertEquals(failed, calls.get(99)[2]);
    }

    @Test
    void buildRejectsInconsistentStudies() {
        Scenario sc = Scenario.of("s", Map.of("mean", 1.0));
        DataGenerator<double[]> g = (rng, s, n) -> new double[n];
        StudyEstimator<double[]> v = CalibrationModels.varianceMle(0.95);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Study.builder(sc, g).estimator(v).sampleSizes(5).build());
        assertTrue(e.getMessage().contains("no true value"), e.getMessage());
        StudyEstimator<double[]> t = CalibrationModels.meanT(0.95);
        assertThrows(IllegalArgumentException.class, () -> Study.builder(sc, g).estimator(t).estimator(t)
                .sampleSizes(5).build());
        assertThrows(IllegalArgumentException.class, () -> Study.builder(sc, g).estimator(t).sampleSizes(5, 5).build());
        assertThrows(IllegalArgumentException.class, () -> Study.builder(sc, g).estimator(t).sampleSizes(0).build());
        assertThrows(IllegalArgumentException.class, () -> Study.builder(sc, g).estimator(t).build());
        assertThrows(IllegalArgumentException.class, () -> Study.builder(sc, g).sampleSizes(3).build());
        assertThrows(IllegalArgumentException.class,
                () -> Study.builder(sc, g).estimator(t).sampleSizes(3).replicates(0).build());
        assertThrows(IllegalArgumentException.class,
                () -> Study.builder(sc, g).estimator(t).sampleSizes(3).level(1).build());
        assertThrows(IllegalArgumentException.class, () -> StudyEstimator.of("x", List.of(), (rng, d) -> Map.of()));
        assertThrows(IllegalArgumentException.class,
                () -> new Scenario("bad name", Map.of(), Map.of(), Map.of()));
        assertThrows(IllegalArgumentException.class,
                () -> Scenario.of("s", Map.of("mean", Double.NaN)));
        assertFalse(sc.hasTruth("sd"));
        assertThrows(IllegalArgumentException.class, () -> sc.truth("sd"));
        Estimate e1 = new Estimate(1, 0, 2, 0.95, "x");
        assertTrue(TargetOutcome.success("a", "b", e1).succeeded());
    }

    static StudySummary find(List<StudySummary> rows, String estimator, String target, int n) {
        return rows.stream().filter(s -> s.estimator().equals(estimator) && s.target().equals(target)
                && s.sampleSize() == n).findFirst().orElseThrow();
    }
}
