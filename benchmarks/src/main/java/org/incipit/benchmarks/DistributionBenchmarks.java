package org.incipit.benchmarks;

import java.util.concurrent.TimeUnit;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.ParametricDelay;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;

/**
 * Per-call cost of the distribution layer. Targets: logDensity &le; 30 ns, cdf &le; 150 ns,
 * Weibull and lognormal Laplace transform &le; 5 &micro;s, gamma logCdfGradient and
 * logSurvivalGradient &le; 0.5 &micro;s. The argument cycles over 64 points
 * spread over the bulk and tails so that no branch is favoured.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
public class DistributionBenchmarks {

    @Param({"gamma", "weibull", "lognormal"})
    public String family;

    private ParametricDelay d;
    private double[] xs;
    private double[] ss;
    private int i;

    @Setup
    public void setUp() {
        d = switch (family) {
            case "gamma" -> DelayFamilies.GAMMA.of(2.5, 0.5);
            case "weibull" -> DelayFamilies.WEIBULL.of(1.7, 5.0);
            default -> DelayFamilies.LOGNORMAL.of(1.5, 0.6);
        };
        xs = new double[64];
        ss = new double[64];
        for (int k = 0; k < 64; k++) {
            xs[k] = d.quantile((k + 0.5) / 64);
            ss[k] = 5.0 / d.mean() * (k + 0.5) / 64;
        }
    }

    private double nextX() {
        i = (i + 1) & 63;
        return xs[i];
    }

    @Benchmark
    public double logDensity() {
        return d.logDensity(nextX());
    }

    @Benchmark
    public double cdf() {
        return d.cdf(nextX());
    }

    @Benchmark
    public double logSurvival() {
        return d.logSurvival(nextX());
    }

    @Benchmark
    public double[] logDensityGradient() {
        return d.logDensityGradient(nextX());
    }

    @Benchmark
    public double[] logCdfGradient() {
        return d.logCdfGradient(nextX());
    }

    @Benchmark
    public double[] logSurvivalGradient() {
        return d.logSurvivalGradient(nextX());
    }

    @Benchmark
    public double laplaceTransform() {
        i = (i + 1) & 63;
        return d.laplaceTransform(ss[i]);
    }
}
