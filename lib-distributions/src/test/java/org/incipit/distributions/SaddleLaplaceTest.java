package org.incipit.distributions;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The fixed-step Laplace rules (SaddleTrapezoid) against the independent adaptive rule
 * (PeakQuadrature, panels of 16-point Gauss-Legendre), over the ranges the fast rules claim:
 * sdLog 0.1..2 and shape 0.5..5, s mean from 1e-4 to 1e3 (log-uniform). The mpmath table
 * laplace.csv (ReferenceValuesTest) is the outside check; this one covers the parameter range
 * densely. Tolerance 1e-10 relative, as for laplace.csv: the adaptive rule itself is good to
 * about 1e-11 here (mpmath 1.3 quad, mp.dps=25, on the worst cases of a denser grid: e.g.
 * Weibull(7.6, 2) at s = 6.43, exact 5.7762083771204477e-5, adaptive 5.776208377180173e-5,
 * fixed-step 5.7762083771203536e-5), so it cannot referee more tightly.
 */
class SaddleLaplaceTest {
    private static final long SEED = 20261201L;

    static Stream<Arguments> lognormalCases() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        return Stream.generate(() -> Arguments.of(-2 + 6 * rng.nextDouble(), 0.1 + 1.9 * rng.nextDouble(),
                Math.pow(10, -4 + 7 * rng.nextDouble()))).limit(300);
    }

    static Stream<Arguments> weibullCases() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 1);
        return Stream.generate(() -> Arguments.of(0.5 + 4.5 * rng.nextDouble(), 0.2 + 20 * rng.nextDouble(),
                Math.pow(10, -4 + 7 * rng.nextDouble()))).limit(300);
    }

    @ParameterizedTest
    @MethodSource("lognormalCases")
    void lognormalMatchesAdaptiveRule(double meanLog, double sdLog, double sMean) {
        LogNormalDelay d = LogNormalDelay.ofMeanLogSdLog(meanLog, sdLog);
        double s = sMean / d.mean();
        double adaptive = Math.exp(d.logPartialTransform(s, 0, 0, true));
        double fast = d.saddleLaplace(s);
        assertEquals(adaptive, fast, 1e-10 * adaptive, d + " s=" + s);
        assertEquals(fast, d.laplaceTransform(s), 0.0, "public method takes the fast rule");
    }

    @ParameterizedTest
    @MethodSource("weibullCases")
    void weibullMatchesAdaptiveRule(double shape, double scale, double sMean) {
        WeibullDelay d = WeibullDelay.ofShapeScale(shape, scale);
        double s = sMean / d.mean();
        double adaptive = Math.exp(d.logPartialTransform(s, 0, 0, true));
        double fast = d.saddleLaplace(s * scale);
        assertEquals(adaptive, fast, 1e-10 * adaptive, d + " s=" + s);
        assertEquals(fast, d.laplaceTransform(s), 0.0, "public method takes the fast rule");
    }
}
