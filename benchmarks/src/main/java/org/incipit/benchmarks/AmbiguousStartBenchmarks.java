package org.incipit.benchmarks;

import java.util.concurrent.ForkJoinPool;
import java.util.concurrent.TimeUnit;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.estimate.ambiguous.AmbiguousStartEstimator;
import org.incipit.core.estimate.ambiguous.ExposureHistory;
import org.incipit.core.inference.BootstrapResult;
import org.incipit.core.likelihood.LogLikelihood;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.simulate.ExposureModel;
import org.incipit.core.simulate.ExposureRecords;
import org.incipit.core.simulate.ExposureSampler;
import org.incipit.distributions.DelayFamilies;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;

/**
 * Ambiguous-start likelihood: one log-likelihood-plus-gradient pass (gamma, open history) over
 * n cases with about 3 candidates each (open stream, p = 0.5, rate 0.2/day, gamma(3, 0.6));
 * the full gamma fit (Newton on the analytic Hessian, observed information; no intervals); and
 * 1,000 bootstrap refits of n = 200 on the common pool. Data seeded, from the library's
 * exposure sampler. Candidate terms per second = candidates / time per pass.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
public class AmbiguousStartBenchmarks {

    @Param({"10000", "100000"})
    public int cases;

    private AmbiguousStartCases data;
    private AmbiguousStartCases small;
    private LogLikelihood likelihood;
    private final double[] theta = {Math.log(3), Math.log(0.6), 0};
    private final double[] gradient = new double[3];
    private final double[] hessian = new double[9];

    static AmbiguousStartCases sample(long seed, int n) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        ExposureRecords r = ExposureSampler.sample(rng, ExposureModel.open(0.5, 0.2), DelayFamilies.GAMMA.of(3, 0.6), n);
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder();
        double[] onsets = r.onsets();
        int[] off = r.offsets();
        double[] times = r.candidateTimes();
        for (int i = 0; i < n; i++) {
            double[] s = java.util.Arrays.copyOfRange(times, off[i], off[i + 1]);
            b.addCase("c" + i, onsets[i], s);
        }
        return b.build();
    }

    @Setup
    public void setUp() {
        data = sample(20261201L, cases);
        small = sample(7L, 200);
        likelihood = AmbiguousStartEstimator.logLikelihood(data, DelayFamilies.GAMMA, ExposureHistory.open());
    }

    /** One value-and-gradient pass over all candidates. */
    @Benchmark
    public double valueAndGradient() {
        return likelihood.valueAndGradient(theta, gradient) + gradient[0];
    }

    /** One value, gradient and Hessian pass (what each Newton iteration costs). */
    @Benchmark
    public double valueGradientHessian() {
        likelihood.hessian(theta, hessian);
        return hessian[0];
    }

    /**
     * Full gamma fit: maximisation and observed information, no intervals, on cases whose flat
     * arrays were prepared once (the estimator keeps them per cases object).
     */
    @Benchmark
    public MaximumLikelihoodFit fitGamma() {
        return AmbiguousStartEstimator.maximumLikelihood(data, DelayFamilies.GAMMA, ExposureHistory.open());
    }

    /** A new cases object (same data) for every call of {@link #fitGammaFreshCases}; copying is not timed. */
    @State(Scope.Thread)
    public static class FreshCases {
        AmbiguousStartCases cases;

        @Setup(org.openjdk.jmh.annotations.Level.Invocation)
        public void copy(AmbiguousStartBenchmarks b) {
            AmbiguousStartCases.Builder builder = AmbiguousStartCases.builder();
            AmbiguousStartCases d = b.data;
            for (int i = 0; i < d.caseCount(); i++) {
                double[] s = new double[d.candidateCount(i)];
                for (int j = 0; j < s.length; j++) {
                    s[j] = d.start(d.offset(i) + j);
                }
                builder.addCase(d.id(i), d.end(i), s);
            }
            cases = builder.build();
        }
    }

    /** As {@link #fitGamma}, including the one-time preparation of the flat arrays. */
    @Benchmark
    public MaximumLikelihoodFit fitGammaFreshCases(FreshCases fresh) {
        return AmbiguousStartEstimator.maximumLikelihood(fresh.cases, DelayFamilies.GAMMA, ExposureHistory.open());
    }

    /** 1,000 nonparametric bootstrap refits of n = 200 (gamma, open) on the common pool. */
    @Benchmark
    @OutputTimeUnit(TimeUnit.MILLISECONDS)
    public BootstrapResult bootstrap1000() {
        return AmbiguousStartEstimator.bootstrap(small, DelayFamilies.GAMMA, ExposureHistory.open(), 1000, 11L,
                ForkJoinPool.commonPool());
    }

    /**
     * Thread and process CPU time per operation (ThreadMXBean), to tell cost from contention on
     * a shared machine: {@code java -cp benchmarks.jar
     * 'org.incipit.benchmarks.AmbiguousStartBenchmarks$CpuTime'}. Prints, per n, wall, calling
     * thread CPU and process CPU per pass and per fit, and candidate terms per process-CPU second
     * (below 40,000 candidates the pass runs on the calling thread alone).
     */
    public static final class CpuTime {
        private CpuTime() {
        }

        public static void main(String[] args) {
            java.lang.management.ThreadMXBean tb = java.lang.management.ManagementFactory.getThreadMXBean();
            com.sun.management.OperatingSystemMXBean os = (com.sun.management.OperatingSystemMXBean)
                    java.lang.management.ManagementFactory.getOperatingSystemMXBean();
            double[] th = {Math.log(3), Math.log(0.6), 0};
            double[] g = new double[3];
            double sink = 0;
            for (int n : new int[] {10_000, 100_000}) {
                AmbiguousStartCases d = sample(20261201L, n);
                LogLikelihood ll = AmbiguousStartEstimator.logLikelihood(d, DelayFamilies.GAMMA, ExposureHistory.open());
                int cand = d.offsets()[n] - d.offsets()[0];
                int reps = 20_000_000 / n;
                int fits = 400_000 / n;
                for (int round = 0; round < 4; round++) {
                    long c0 = tb.getCurrentThreadCpuTime();
                    long p0 = os.getProcessCpuTime();
                    long t0 = System.nanoTime();
                    for (int r = 0; r < reps; r++) {
                        sink += ll.valueAndGradient(th, g);
                    }
                    long c1 = tb.getCurrentThreadCpuTime();
                    long p1 = os.getProcessCpuTime();
                    long t1 = System.nanoTime();
                    for (int r = 0; r < fits; r++) {
                        sink += AmbiguousStartEstimator.maximumLikelihood(d, DelayFamilies.GAMMA, ExposureHistory.open())
                                .logLikelihood();
                    }
                    long c2 = tb.getCurrentThreadCpuTime();
                    long p2 = os.getProcessCpuTime();
                    long t2 = System.nanoTime();
                    System.out.printf("n=%d (%d candidates) round %d: pass wall %.3f ms, thread cpu %.3f ms, process cpu"
                            + " %.3f ms, %.1f M terms per process-cpu s; fit wall %.2f ms, thread cpu %.2f ms, process cpu"
                            + " %.2f ms%n", n, cand, round, (t1 - t0) / 1e6 / reps, (c1 - c0) / 1e6 / reps,
                            (p1 - p0) / 1e6 / reps, cand / ((p1 - p0) / 1e3 / reps), (t2 - t1) / 1e6 / fits,
                            (c2 - c1) / 1e6 / fits, (p2 - p1) / 1e6 / fits);
                }
            }
            System.out.println(sink == 0 ? "" : " ");
        }
    }
}
