package org.incipit.benchmarks;

import java.util.concurrent.TimeUnit;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.branching.OffspringLaw;
import org.incipit.core.simulate.ExposureModel;
import org.incipit.core.simulate.OutbreakOptions;
import org.incipit.core.simulate.OutbreakSimulator;
import org.incipit.core.simulate.SimulatedOutbreak;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.GammaDelay;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;

/**
 * Outbreak simulator throughput. Each invocation simulates one outbreak of {@code cases}
 * infections (conditioned on survival, negative binomial offspring R = 2, k = 0.5, gamma
 * delays); infections per second = cases / (seconds per operation). Target: at least 10^6
 * infections per second.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class SimulatorBenchmarks {

    @Param({"100000"})
    public int cases;

    private OutbreakOptions plain;
    private OutbreakOptions withOutcomesAndExposures;
    private UniformRandomProvider rng;

    @Setup(Level.Trial)
    public void setUp() {
        OffspringLaw law = OffspringLaw.negativeBinomial(2, 0.5);
        DelayDistribution gi = GammaDelay.ofShapeRate(4, 0.8);
        DelayDistribution inc = GammaDelay.ofShapeRate(5, 1);
        plain = OutbreakOptions.builder(law, gi, inc).maxCases(cases).conditionOnSurvival(1000).build();
        withOutcomesAndExposures = OutbreakOptions.builder(law, gi, inc)
            .outcomes(0.05, GammaDelay.ofShapeRate(3, 0.2), GammaDelay.ofShapeRate(6, 0.4))
            .exposures(ExposureModel.open(0.3, 1.0))
            .maxCases(cases).conditionOnSurvival(1000).build();
        rng = RandomSource.XO_RO_SHI_RO_128_PP.create(20261201L);
    }

    @Benchmark
    public SimulatedOutbreak transmissionOnly() {
        return OutbreakSimulator.simulate(rng, plain);
    }

    @Benchmark
    public SimulatedOutbreak withOutcomesAndOpenExposures() {
        return OutbreakSimulator.simulate(rng, withOutcomesAndExposures);
    }
}
