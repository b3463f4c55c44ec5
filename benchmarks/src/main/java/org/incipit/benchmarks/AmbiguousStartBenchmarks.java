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

    /** Full gamma fit: maximisation and observed information, no intervals. */
    @Benchmark
    public MaximumLikelihoodFit fitGamma() {
        return AmbiguousStartEstimator.maximumLikelihood(data, DelayFamilies.GAMMA, ExposureHistory.open());
    }

    /** 1,000 nonparametric bootstrap refits of n = 200 (gamma, open) on the common pool. */
    @Benchmark
    @OutputTimeUnit(TimeUnit.MILLISECONDS)
    public BootstrapResult bootstrap1000() {
        return AmbiguousStartEstimator.bootstrap(small, DelayFamilies.GAMMA, ExposureHistory.open(), 1000, 11L,
                ForkJoinPool.commonPool());
    }
}
