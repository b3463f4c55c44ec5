package org.incipit.distributions;

import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.params.provider.Arguments;

class LogNormalContractTest extends DelayContractTest {
    @Override
    Stream<Arguments> distributions() {
        UniformRandomProvider rng = rng(5);
        return Stream.generate(() -> Arguments.of(LogNormalDelay.ofMeanLogSdLog(-0.5 + 3 * rng.nextDouble(),
                0.1 + 1.9 * rng.nextDouble()))).limit(CASES);
    }

    @Override
    Stream<Arguments> samplingDistributions() {
        UniformRandomProvider rng = rng(6);
        return Stream.generate(() -> Arguments.of(LogNormalDelay.ofMeanLogSdLog(-0.5 + 3 * rng.nextDouble(),
                0.1 + 0.7 * rng.nextDouble()))).limit(5);
    }

    @Override
    double tiltFor(ParametricDelay d, UniformRandomProvider rng) {
        return (0.05 + rng.nextDouble()) / d.mean();
    }
}
