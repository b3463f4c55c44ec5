package org.incipit.distributions;

import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.params.provider.Arguments;

class GammaContractTest extends DelayContractTest {
    @Override
    Stream<Arguments> distributions() {
        UniformRandomProvider rng = rng(1);
        return Stream.generate(() -> Arguments.of(GammaDelay.ofShapeRate(0.2 + 30 * rng.nextDouble(),
                0.05 + 5 * rng.nextDouble()))).limit(CASES);
    }

    @Override
    Stream<Arguments> samplingDistributions() {
        UniformRandomProvider rng = rng(2);
        return Stream.generate(() -> Arguments.of(GammaDelay.ofShapeRate(0.5 + 20 * rng.nextDouble(),
                0.1 + 3 * rng.nextDouble()))).limit(5);
    }

    @Override
    double tiltFor(ParametricDelay d, UniformRandomProvider rng) {
        return (rng.nextDouble() - 0.3) * ((GammaDelay) d).rate();
    }
}
