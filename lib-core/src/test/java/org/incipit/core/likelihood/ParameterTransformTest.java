package org.incipit.core.likelihood;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.List;
import java.util.stream.Stream;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/** Identities of the transforms and the chain rule (common practice). */
class ParameterTransformTest {

    private static final long SEED = 20240502L;

    static Stream<Arguments> cases() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        List<ParameterTransform> ts = List.of(ParameterTransform.identity(), ParameterTransform.log(),
                ParameterTransform.logit(), ParameterTransform.shiftedLog(-3), ParameterTransform.scaledLogit(2, 7));
        return Stream.generate(() -> Arguments.of(ts.get(rng.nextInt(ts.size())), -6 + 12 * rng.nextDouble()))
                .limit(100);
    }

    @ParameterizedTest
    @MethodSource("cases")
    void inverseAndDerivatives(ParameterTransform t, double u) {
        double x = t.toNatural(u);
        assertEquals(u, t.toUnconstrained(x), 1e-12 * Math.max(1, Math.abs(u)) / Math.min(1, t.derivative(u)) * 4);
        double h = 1e-5;
        double d = (t.toNatural(u + h) - t.toNatural(u - h)) / (2 * h);
        assertEquals(d, t.derivative(u), 1e-8 * Math.max(1, Math.abs(d)), "central difference, O(h^2)");
        double d2 = (t.derivative(u + h) - t.derivative(u - h)) / (2 * h);
        assertEquals(d2, t.secondDerivative(u), 1e-8 * Math.max(1, Math.abs(d2)));
    }

    @Test
    void chainRuleGradientAndHessian() {
        double[] x = TestLikelihoods.readColumn("/org/incipit/core/likelihood/gamma_data.csv");
        Parameterisation p = Parameterisation.of(List.of("shape", "rate"),
                List.of(ParameterTransform.log(), ParameterTransform.log()));
        LogLikelihood u = p.unconstrained(TestLikelihoods.gamma(x));
        double[] theta = {0.3, -0.9};
        double[] g = new double[2];
        u.valueAndGradient(theta, g);
        double[] num = Derivatives.numericalGradient(u::value, theta);
        assertEquals(num[0], g[0], 1e-6 * Math.max(1, Math.abs(g[0])));
        assertEquals(num[1], g[1], 1e-6 * Math.max(1, Math.abs(g[1])));
        double[] h = new double[4];
        u.hessian(theta, h);
        LogLikelihood noHessian = p.unconstrained(TestLikelihoods.weibull(x)); // just the API path
        assertEquals(false, noHessian.hasHessian());
        double[] fd = Derivatives.hessian(new LogLikelihood() {
            public int dimension() {
                return 2;
            }

            public double value(double[] t) {
                return u.value(t);
            }

            public double valueAndGradient(double[] t, double[] gg) {
                return u.valueAndGradient(t, gg);
            }
        }, theta);
        for (int i = 0; i < 4; i++) {
            assertEquals(fd[i], h[i], 1e-6 * Math.max(1, Math.abs(h[i])), "entry " + i);
        }
    }

    @Test
    void invalidInputsNameTheProblem() {
        assertThrows(IllegalArgumentException.class, () -> ParameterTransform.log().toUnconstrained(0));
        assertThrows(IllegalArgumentException.class, () -> ParameterTransform.logit().toUnconstrained(1));
        assertThrows(IllegalArgumentException.class, () -> ParameterTransform.scaledLogit(1, 1));
        assertThrows(IllegalArgumentException.class, () -> Parameterisation.of(List.of("a", "a"),
                List.of(ParameterTransform.log(), ParameterTransform.log())));
        Parameterisation p = Parameterisation.of(List.of("rate"), List.of(ParameterTransform.log()));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> p.toUnconstrained(new double[] {-1}));
        assertEquals(true, e.getMessage().startsWith("rate:"));
    }
}
