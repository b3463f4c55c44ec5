package org.incipit.benchmarks;

import java.io.IOException;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;

import org.incipit.core.likelihood.LogLikelihood;
import org.incipit.core.likelihood.Maximiser;
import org.incipit.core.likelihood.Optimum;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;

/**
 * Warm fit of the open ambiguous-start gamma likelihood on the SAME data files as the scipy
 * reference ({@code scipy_ambiguous_gamma.py generate N FILE 20261201+N}), from the same start
 * (shape 1, rate 1, p 0.3): maximisation only (no intervals), Newton on the analytic Hessian and
 * BFGS on the gradient. Files are read from the folder of system property
 * {@code incipit.scipy.dir} (default {@code benchmarks/target/scipy-data}) as
 * {@code ambiguous-gamma-N.csv}; {@code benchmarks/compare_scipy.sh} makes them and runs both.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class ScipyComparisonBenchmarks {

    @Param({"10000", "100000"})
    public int cases;

    private LogLikelihood likelihood;

    @Setup
    public void setUp() throws IOException {
        Path dir = Path.of(System.getProperty("incipit.scipy.dir", "benchmarks/target/scipy-data"));
        likelihood = ScipyComparison.likelihood(ScipyComparison.read(dir.resolve("ambiguous-gamma-" + cases + ".csv")));
    }

    /** Newton (analytic Hessian) from the common start. */
    @Benchmark
    public Optimum newtonFromCommonStart() {
        return Maximiser.newton().maximise(likelihood, ScipyComparison.START.clone());
    }

    /** BFGS (the scipy script's algorithm) from the common start. */
    @Benchmark
    public Optimum bfgsFromCommonStart() {
        return Maximiser.bfgs().maximise(likelihood, ScipyComparison.START.clone());
    }
}
