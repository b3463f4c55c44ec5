package org.incipit.distributions;

import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.params.provider.Arguments;

class WeibullContractTest extends DelayContractTest {
    @Override
    Stream<Arguments> distributions() {
        UniformRandomProvider rng = rng(3);
        return Stream.generate(() -> Arguments.of(WeibullDelay.ofShapeScale(0.5 + 4.5 * rng.nextDouble(),
                0.5 + 15 * rng.nextDouble()))).limit(CASES);
    }

    @Override
    Stream<Arguments> samplingDistributions() {
        UniformRandomProvider rng = rng(4);
        return Stream.generate(() -> Arguments.of(WeibullDelay.ofShapeScale(0.8 + 4 * rng.nextDouble(),
                0.5 + 10 * rng.nextDouble()))).limit(5);
    }

    @Override
    double tiltFor(ParametricDelay d, UniformRandomProvider rng) {
        WeibullDelay w = (WeibullDelay) d;
        // negative tilts only where the transform is finite everywhere (shape > 1)
        double lo = w.shape() > 1 ? -0.3 : 0.05;
        return (lo + rng.nextDouble() * (1 - lo)) / w.mean();
    }
}
