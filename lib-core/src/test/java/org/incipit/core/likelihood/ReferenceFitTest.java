package org.incipit.core.likelihood;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;

import org.incipit.core.inference.Estimate;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/**
 * Weibull and gamma MLEs, covariances and profile intervals against
 * reference/engine_reference.py (scipy 1.17 stats.*.fit(floc=0), refined and differentiated at
 * 50 digits with mpmath 1.3); binomial likelihood-ratio interval from mpmath root finding.
 */
class ReferenceFitTest {

    private static final String DIR = "/org/incipit/core/likelihood/";
    private static final Map<String, Double> REF = TestLikelihoods.readReference(DIR + "engine_reference.csv");

    private static double ref(String key) {
        Double v = REF.get(key);
        if (v == null) {
            throw new IllegalStateException("reference value missing: " + key);
        }
        return v;
    }

    private static void assertRelative(double expected, double actual, double rel, String what) {
        assertEquals(expected, actual, rel * Math.abs(expected), what + " to " + rel + " relative");
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void weibull(Maximiser.Method method) {
        double[] x = TestLikelihoods.readColumn(DIR + "weibull_data.csv");
        Parameterisation p = Parameterisation.of(List.of("shape", "scale"),
                List.of(ParameterTransform.log(), ParameterTransform.log()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, TestLikelihoods.weibull(x),
                List.of(new double[] {1, 1}), x.length, method == Maximiser.Method.BFGS ? Maximiser.bfgs() : Maximiser.newton());
        assertTrue(fit.converged(), fit.message());
        assertEquals(ref("weibull.loglik"), fit.logLikelihood(), 1e-8, "log-likelihood to 1e-8");
        assertRelative(ref("weibull.shape"), fit.naturalEstimate("shape"), 1e-6, "shape");
        assertRelative(ref("weibull.scale"), fit.naturalEstimate("scale"), 1e-6, "scale");
        double[][] c = fit.naturalCovariance();
        assertRelative(ref("weibull.cov.shape.shape"), c[0][0], 1e-4, "cov shape");
        assertRelative(ref("weibull.cov.shape.scale"), c[0][1], 1e-4, "cov shape-scale");
        assertRelative(ref("weibull.cov.scale.scale"), c[1][1], 1e-4, "cov scale");
        Estimate prof = fit.profile("shape", 0.95);
        // Brent to 1e-10 in log-shape; nuisance re-maximised to relative gradient 1e-9
        assertRelative(ref("weibull.profile95.shape.lower"), prof.lower(), 1e-7, "profile lower");
        assertRelative(ref("weibull.profile95.shape.upper"), prof.upper(), 1e-7, "profile upper");
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void gamma(Maximiser.Method method) {
        double[] x = TestLikelihoods.readColumn(DIR + "gamma_data.csv");
        Parameterisation p = Parameterisation.of(List.of("shape", "rate"),
                List.of(ParameterTransform.log(), ParameterTransform.log()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, TestLikelihoods.gamma(x),
                List.of(new double[] {1, 1}), x.length, method == Maximiser.Method.BFGS ? Maximiser.bfgs() : Maximiser.newton());
        assertTrue(fit.converged(), fit.message());
        assertEquals(ref("gamma.loglik"), fit.logLikelihood(), 1e-8, "log-likelihood to 1e-8");
        assertRelative(ref("gamma.shape"), fit.naturalEstimate("shape"), 1e-6, "shape");
        assertRelative(ref("gamma.rate"), fit.naturalEstimate("rate"), 1e-6, "rate");
        double[][] c = fit.naturalCovariance();
        assertRelative(ref("gamma.cov.shape.shape"), c[0][0], 1e-4, "cov shape");
        assertRelative(ref("gamma.cov.shape.rate"), c[0][1], 1e-4, "cov shape-rate");
        assertRelative(ref("gamma.cov.rate.rate"), c[1][1], 1e-4, "cov rate");
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void binomialLikelihoodRatioInterval(Maximiser.Method method) {
        int x = (int) ref("binomial.x");
        int n = (int) ref("binomial.n");
        Parameterisation p = Parameterisation.of(List.of("p"), List.of(ParameterTransform.logit()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, TestLikelihoods.binomial(x, n),
                List.of(new double[] {0.5}), n, method == Maximiser.Method.BFGS ? Maximiser.bfgs() : Maximiser.newton());
        assertTrue(fit.converged(), fit.message());
        assertRelative((double) x / n, fit.naturalEstimate()[0], 1e-9, "p-hat");
        Estimate prof = fit.profile(0, 0.95);
        assertRelative(ref("binomial.lr95.lower"), prof.lower(), 1e-8, "LR lower");
        assertRelative(ref("binomial.lr95.upper"), prof.upper(), 1e-8, "LR upper");
        assertEquals("profile", prof.method());
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void weibullFromFarStart(Maximiser.Method method) {
        // start shape e^3 = 20, scale e^-3 = 0.05: log-likelihood about -4e17, gradient ~1e19
        double[] x = TestLikelihoods.readColumn(DIR + "weibull_data.csv");
        Parameterisation p = Parameterisation.of(List.of("shape", "scale"),
                List.of(ParameterTransform.log(), ParameterTransform.log()));
        Optimum o = Maximiser.of(method, 1000, 1e-9).maximise(p.unconstrained(TestLikelihoods.weibull(x)),
                new double[] {3, -3});
        assertTrue(o.converged(), o.toString());
        assertEquals(ref("weibull.loglik"), o.value(), 1e-8, "log-likelihood to 1e-8");
        assertRelative(ref("weibull.shape"), Math.exp(o.argmax()[0]), 1e-6, "shape");
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void weibullMeanProfileInterval(Maximiser.Method method) {
        double[] x = TestLikelihoods.readColumn(DIR + "weibull_data.csv");
        Parameterisation p = Parameterisation.of(List.of("shape", "scale"),
                List.of(ParameterTransform.log(), ParameterTransform.log()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, TestLikelihoods.weibull(x),
                List.of(new double[] {1, 1}), x.length, Maximiser.of(method, 1000, 1e-10));
        assertTrue(fit.converged(), fit.message());
        java.util.function.ToDoubleFunction<double[]> mean =
                t -> t[1] * Math.exp(org.apache.commons.numbers.gamma.LogGamma.value(1 + 1 / t[0]));
        Estimate prof = fit.profile(mean, 0.95);
        assertRelative(ref("weibull.mean"), prof.estimate(), 1e-8, "mean");
        // constraint met to 1e-10 relative, Brent to 1e-10 relative, nuisance to relative gradient 1e-10
        assertRelative(ref("weibull.profile95.mean.lower"), prof.lower(), 1e-7, "profile lower");
        assertRelative(ref("weibull.profile95.mean.upper"), prof.upper(), 1e-7, "profile upper");
        // the derived-quantity profile of a parameter itself equals the parameter profile
        Estimate shapeByQuantity = fit.profile(t -> t[0], 0.95);
        assertRelative(ref("weibull.profile95.shape.lower"), shapeByQuantity.lower(), 1e-7, "shape lower");
        assertRelative(ref("weibull.profile95.shape.upper"), shapeByQuantity.upper(), 1e-7, "shape upper");
    }
}
