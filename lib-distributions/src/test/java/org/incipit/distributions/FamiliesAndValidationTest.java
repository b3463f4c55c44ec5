package org.incipit.distributions;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

/** Family registry, validation messages, divergence conventions and closed forms. */
class FamiliesAndValidationTest {

    @Test
    void familiesHaveContractNamesAndDomains() {
        assertEquals(List.of(DelayFamilies.GAMMA, DelayFamilies.WEIBULL, DelayFamilies.LOGNORMAL), DelayFamilies.all());
        assertEquals("gamma", DelayFamilies.GAMMA.name());
        assertEquals(List.of("shape", "rate"), DelayFamilies.GAMMA.parameterNames());
        assertEquals(List.of("shape", "scale"), DelayFamilies.WEIBULL.parameterNames());
        assertEquals(List.of("meanLog", "sdLog"), DelayFamilies.LOGNORMAL.parameterNames());
        assertEquals(List.of(DelayFamily.Domain.REAL, DelayFamily.Domain.POSITIVE),
                DelayFamilies.LOGNORMAL.parameterDomains());
        assertEquals(2, DelayFamilies.WEIBULL.dimension());
        assertSame(DelayFamilies.WEIBULL, DelayFamilies.byName("Weibull"));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> DelayFamilies.byName("beta"));
        assertTrue(e.getMessage().contains("gamma, weibull, lognormal") && e.getMessage().contains("beta"));
        for (DelayFamily f : DelayFamilies.all()) {
            ParametricDelay d = f.of(1.5, 2.0);
            assertSame(f, d.family());
            assertEquals(f.name(), d.familyName());
            assertArrayEquals(new double[] {1.5, 2.0}, d.parameters());
            assertEquals(f.parameterNames(), d.parameterNames());
            assertThrows(IllegalArgumentException.class, () -> f.of(1.0));
        }
    }

    @Test
    void invalidParametersNameParameterAndValue() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> GammaDelay.ofShapeRate(Double.NaN, 1));
        assertTrue(e.getMessage().contains("shape") && e.getMessage().contains("NaN"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> GammaDelay.ofShapeRate(1, -2));
        assertTrue(e.getMessage().contains("rate") && e.getMessage().contains("-2.0"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> GammaDelay.ofShapeRate(0, 1));
        assertThrows(IllegalArgumentException.class, () -> GammaDelay.ofShapeRate(Double.POSITIVE_INFINITY, 1));
        assertThrows(IllegalArgumentException.class, () -> WeibullDelay.ofShapeScale(1, 0));
        e = assertThrows(IllegalArgumentException.class, () -> LogNormalDelay.ofMeanLogSdLog(Double.NaN, 1));
        assertTrue(e.getMessage().contains("meanLog"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> LogNormalDelay.ofMeanLogSdLog(0, -1));
        for (DelayFamily f : DelayFamilies.all()) {
            assertThrows(IllegalArgumentException.class, () -> f.ofMeanSd(0, 1));
            assertThrows(IllegalArgumentException.class, () -> f.ofMeanSd(1, Double.NaN));
        }
        e = assertThrows(IllegalArgumentException.class, () -> WeibullDelay.ofMeanSd(1, 1e-6));
        assertTrue(e.getMessage().contains("no Weibull shape"), e.getMessage());
    }

    @Test
    void divergentTransformsAreInfinite() {
        GammaDelay g = GammaDelay.ofShapeRate(2, 0.5);
        assertEquals(Double.POSITIVE_INFINITY, g.laplaceTransform(-0.5));
        assertEquals(-0.5, g.laplaceAbscissa());
        WeibullDelay w05 = WeibullDelay.ofShapeScale(0.5, 2);
        assertEquals(Double.POSITIVE_INFINITY, w05.laplaceTransform(-1e-9));
        assertEquals(0.0, w05.laplaceAbscissa());
        WeibullDelay w1 = WeibullDelay.ofShapeScale(1, 2);
        assertEquals(Double.POSITIVE_INFINITY, w1.laplaceTransform(-0.5));
        assertEquals(-0.5, w1.laplaceAbscissa());
        assertEquals(Double.NEGATIVE_INFINITY, WeibullDelay.ofShapeScale(1.5, 2).laplaceAbscissa());
        LogNormalDelay l = LogNormalDelay.ofMeanLogSdLog(1, 0.5);
        assertEquals(Double.POSITIVE_INFINITY, l.laplaceTransform(-1e-12));
        assertThrows(IllegalArgumentException.class, () -> l.tilt(-0.1));
        assertThrows(IllegalArgumentException.class, () -> g.tilt(-0.6));
        assertThrows(IllegalArgumentException.class, () -> w05.tilt(-0.1));
    }

    @Test
    void gammaTiltIsGammaAndOthersAreTilted() {
        GammaDelay g = GammaDelay.ofShapeRate(2, 0.5);
        DelayDistribution t = g.tilt(0.25);
        assertInstanceOf(GammaDelay.class, t);
        assertEquals(0.75, ((GammaDelay) t).rate());
        DelayDistribution lt = LogNormalDelay.ofMeanLogSdLog(1, 0.5).tilt(0.2);
        TiltedDelay td = assertInstanceOf(TiltedDelay.class, lt);
        assertEquals("tilted", td.familyName());
        assertEquals(0.2, td.tiltRate());
        assertSame(td.base(), td.tilt(-0.2));
        assertEquals(GammaDelay.exponential(3), GammaDelay.ofShapeRate(1, 3));
    }

    @Test
    void gammaLaplaceClosedForm() {
        // Published closed form (1 + s/rate)^(-shape) (Johnson, Kotz & Balakrishnan 1994, ch. 17,
        // from memory); mpmath 1.3: (1 + mpf(1.5)/mpf(0.8))**(-mpf(2.5))
        double expected = 0.07135187292184058522;
        GammaDelay g = GammaDelay.ofShapeRate(2.5, 0.8);
        assertEquals(expected, g.laplaceTransform(1.5), 4 * Math.ulp(expected), "4 ulp");
    }
}
