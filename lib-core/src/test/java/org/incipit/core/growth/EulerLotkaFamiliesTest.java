package org.incipit.core.growth;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.inference.Estimate;
import org.incipit.distributions.GammaDelay;
import org.incipit.distributions.LogNormalDelay;
import org.incipit.distributions.WeibullDelay;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** Euler-Lotka with the library's distribution families. */
class EulerLotkaFamiliesTest {

    // Wallinga & Lipsitch 2007 gamma form R = (1 + r/rate)^shape; the family's transform is
    // closed form, so agreement to a few ulp of the power (1e-13 relative).
    @ParameterizedTest
    @ValueSource(doubles = {-0.4, -0.1, 0.02, 0.3})
    void gammaFamilyClosedForm(double r) {
        GammaDelay g = GammaDelay.ofShapeRate(2.7, 0.55);
        double expected = Math.pow(1 + r / 0.55, 2.7);
        assertEquals(expected, EulerLotka.reproductionNumber(g, r), 1e-13 * expected);
        assertEquals(r, EulerLotka.growthRate(g, expected), 1e-12);
        // exponential: R = 1 + r mean
        GammaDelay e = GammaDelay.exponential(0.55);
        assertEquals(1 + r / 0.55, EulerLotka.reproductionNumber(e, r), 1e-13);
    }

    @Test
    void familiesRefuseDeclineWhereTransformDiverges() {
        LogNormalDelay ln = LogNormalDelay.ofMeanLogSdLog(1.5, 0.5);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> EulerLotka.reproductionNumber(ln, -0.05));
        assertTrue(e.getMessage().contains("lognormal") && e.getMessage().contains("infinite"),
                e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> EulerLotka.growthRate(ln, 0.9));
        WeibullDelay heavy = WeibullDelay.ofShapeScale(0.7, 4);
        assertThrows(IllegalArgumentException.class,
                () -> EulerLotka.reproductionNumber(heavy, -0.01));
        GammaDelay g = GammaDelay.ofShapeRate(2, 0.5);
        assertThrows(IllegalArgumentException.class, () -> EulerLotka.reproductionNumber(g, -0.5));
        assertThrows(IllegalArgumentException.class, () -> EulerLotka.reproductionNumber(g, -0.6));
        // Weibull with shape > 1: transform finite for every s, decline fine, R < 1
        WeibullDelay light = WeibullDelay.ofShapeScale(2, 5);
        double rDecl = EulerLotka.growthRate(light, 0.7);
        assertTrue(rDecl < 0);
        assertEquals(0.7, EulerLotka.reproductionNumber(light, rDecl), 1e-10);
    }

    // Lognormal in growth against the numerical transform of the test-local Simpson integral
    // (independent quadrature; Simpson error ~1e-10 at 40000 panels on [0, 400]): 1e-8.
    @ParameterizedTest
    @ValueSource(doubles = {0.05, 0.2})
    void lognormalAgreesWithIndependentQuadrature(double r) {
        LogNormalDelay ln = LogNormalDelay.ofMeanLogSdLog(1.6, 0.4);
        NumericDelay ref = EulerLotkaTest.lognormal(1.6, 0.4);
        double expected = EulerLotka.reproductionNumber(ref, r);
        assertEquals(expected, EulerLotka.reproductionNumber(ln, r), 1e-8 * expected);
        BackwardBias b = EulerLotka.backwardBias(ln, r);
        double naive = ref.laplaceTransform(r) / ref.laplaceTransform(2 * r);
        assertEquals(naive, b.naiveR(), 1e-8 * naive);
    }

    // Backward bias with the family's own tilt: gamma closed forms.
    @Test
    void backwardBiasWithGammaFamily() {
        double shape = 3.1;
        double rate = 0.7;
        double r = 0.15;
        BackwardBias b = EulerLotka.backwardBias(GammaDelay.ofShapeRate(shape, rate), r);
        assertEquals(Math.pow(1 + r / rate, shape), b.trueR(), 1e-13 * b.trueR());
        assertEquals(Math.pow(1 + r / (rate + r), shape), b.naiveR(), 1e-13 * b.naiveR());
    }

    // Delta and Monte Carlo with the real gamma family: same checks as with the test-local
    // gamma (analytic gradient: see EulerLotkaTest.deltaMatchesAnalyticGradient).
    @Test
    void uncertaintyWithGammaFamily() {
        GammaDelay g = GammaDelay.ofShapeRate(4, 0.8);
        double[][] cov = {{0.04, 0.006}, {0.006, 0.0016}};
        Estimate rEst = new Estimate(0.1, 0.09, 0.11, 0.95, "wald");
        Estimate viaFamily = EulerLotka.reproductionNumberDelta(g, cov, rEst);
        Estimate viaLocal = EulerLotka.reproductionNumberDelta(new TestGamma(4, 0.8), cov, rEst);
        assertEquals(viaLocal.lower(), viaFamily.lower(), 1e-8 * viaLocal.lower());
        assertEquals(viaLocal.upper(), viaFamily.upper(), 1e-8 * viaLocal.upper());
        Estimate mc = EulerLotka.reproductionNumberMonteCarlo(
                RandomSource.XO_RO_SHI_RO_128_PP.create(7L), g, cov, rEst, 20000);
        assertEquals(viaFamily.lower(), mc.lower(), 0.02 * viaFamily.lower());
        assertEquals(viaFamily.upper(), mc.upper(), 0.02 * viaFamily.upper());
    }
}
