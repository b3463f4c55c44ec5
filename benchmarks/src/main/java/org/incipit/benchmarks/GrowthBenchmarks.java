package org.incipit.benchmarks;

import java.util.concurrent.TimeUnit;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.PoissonSampler;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.growth.CountModel;
import org.incipit.core.growth.EulerLotka;
import org.incipit.core.growth.GrowthRateEstimator;
import org.incipit.core.growth.GrowthRateFit;
import org.incipit.core.growth.GrowthRateOptions;
import org.incipit.distributions.LogNormalDelay;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;

/**
 * Growth-rate fit of 60 days (target &le; 1 ms, including both profile limits) and Euler-Lotka
 * evaluation for a lognormal generation interval (target &le; 10 us) and from 60 daily masses. Data: seeded Poisson counts with r = 0.08 (invented).
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
public class GrowthBenchmarks {

    private int[] days;
    private long[] counts;
    private double[] masses;
    private final LogNormalDelay lognormal = LogNormalDelay.ofMeanSd(5.2, 2.8);
    private final GrowthRateOptions poisson = GrowthRateOptions.defaults();
    private final GrowthRateOptions negBin = GrowthRateOptions.defaults()
            .withModel(CountModel.NEGATIVE_BINOMIAL);
    private final GrowthRateOptions poissonDow = GrowthRateOptions.defaults().withDayOfWeek(true);

    @Setup
    public void setUp() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(20261201L);
        days = new int[60];
        counts = new long[60];
        for (int t = 0; t < 60; t++) {
            days[t] = t;
            double mu = 2 * Math.exp(0.08 * t);
            // gamma-Poisson mixture (shape 5) so that the NB fit has a finite dispersion
            double g = 0;
            for (int k = 0; k < 5; k++) {
                g -= Math.log(rng.nextDouble());
            }
            counts[t] = PoissonSampler.of(rng, mu * g / 5).sample();
        }
        masses = new double[60];
        for (int s = 1; s < 60; s++) {
            masses[s] = s * s * Math.exp(-s / 2.0);
        }
    }

    @Benchmark
    public GrowthRateFit poissonFit60Days() {
        return GrowthRateEstimator.fit(days, counts, poisson);
    }

    @Benchmark
    public GrowthRateFit poissonDayOfWeekFit60Days() {
        return GrowthRateEstimator.fit(days, counts, poissonDow);
    }

    @Benchmark
    public GrowthRateFit negativeBinomialFit60Days() {
        return GrowthRateEstimator.fit(days, counts, negBin);
    }

    /** Target: Euler-Lotka for a lognormal generation interval &le; 10 us. */
    @Benchmark
    public double eulerLotkaLognormal() {
        return EulerLotka.reproductionNumber(lognormal, 0.1);
    }

    @Benchmark
    public double eulerLotkaInverseLognormal() {
        return EulerLotka.growthRate(lognormal, 1.8);
    }

    @Benchmark
    public double eulerLotkaMasses60() {
        return EulerLotka.reproductionNumber(masses, 0.1);
    }

    @Benchmark
    public double eulerLotkaInverseMasses60() {
        return EulerLotka.growthRate(masses, 1.8);
    }
}
