package org.incipit.core.likelihood;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.ZigguratSampler;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.inference.Estimate;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/**
 * Closed-form MLEs and observed information (Casella &amp; Berger 2002, Statistical Inference,
 * 2nd ed., sec. 7.2 and 10.1; formulas from memory): normal x-bar and (1/n) sum (x - x-bar)^2
 * with information diag(n/v, n/(2 v^2)); exponential rate n / sum x with variance rate^2/n;
 * Poisson regression score equations X'(y - mu) = 0 and covariance (X' W X)^-1, W = diag(mu)
 * (McCullagh &amp; Nelder 1989, Generalized Linear Models, sec. 2.5).
 */
class ClosedFormFitTest {

    private static final long SEED = 20240501L;

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void normalMeanAndVariance(Maximiser.Method method) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        ZigguratSampler.NormalizedGaussian z = ZigguratSampler.NormalizedGaussian.of(rng);
        double[] x = new double[60];
        for (int i = 0; i < x.length; i++) {
            x[i] = 10 + 3 * z.sample();
        }
        double mean = 0;
        for (double v : x) {
            mean += v;
        }
        mean /= x.length;
        double ss = 0;
        for (double v : x) {
            ss += (v - mean) * (v - mean);
        }
        double var = ss / x.length;
        Parameterisation p = Parameterisation.of(List.of("mean", "variance"),
                List.of(ParameterTransform.identity(), ParameterTransform.log()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, TestLikelihoods.normal(x),
                List.of(new double[] {0, 1}), x.length, Maximiser.of(method, 1000, 1e-10));
        assertTrue(fit.converged(), fit.message());
        // argmax accuracy: relative gradient 1e-10 -> about 1e-10 relative in theta
        assertEquals(mean, fit.naturalEstimate("mean"), 1e-9 * Math.abs(mean), "1e-9 relative");
        assertEquals(var, fit.naturalEstimate("variance"), 1e-9 * var, "1e-9 relative");
        double[][] c = fit.naturalCovariance();
        // central-difference Hessian: relative error about eps^(2/3) ~ 1e-10, plus the argmax error
        assertEquals(var / x.length, c[0][0], 1e-6 * var / x.length);
        assertEquals(2 * var * var / x.length, c[1][1], 1e-6 * 2 * var * var / x.length);
        assertEquals(0, c[0][1], 1e-6 * Math.sqrt(c[0][0] * c[1][1]));
        double expectedLl = -0.5 * x.length * (Math.log(2 * Math.PI * var) + 1);
        assertEquals(expectedLl, fit.logLikelihood(), 1e-12 * Math.abs(expectedLl));
        assertEquals(2 * 2 - 2 * expectedLl, fit.aic(), 1e-9);
        org.incipit.core.inference.ModelComparison.Candidate c2 = fit.candidate("normal");
        assertEquals(fit.logLikelihood(), c2.logLikelihood());
        assertEquals(2, c2.parameters());
        assertEquals(x.length, c2.observations());
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void exponentialRateAndWaldInterval(Maximiser.Method method) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 1);
        double[] x = new double[25];
        double sum = 0;
        for (int i = 0; i < x.length; i++) {
            x[i] = -Math.log(rng.nextDouble()) / 0.4;
            sum += x[i];
        }
        double rate = x.length / sum;
        Parameterisation p = Parameterisation.of(List.of("rate"), List.of(ParameterTransform.log()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, TestLikelihoods.exponential(x),
                List.of(new double[] {1}), x.length, Maximiser.of(method, 1000, 1e-12));
        assertTrue(fit.converged(), fit.message());
        assertEquals(rate, fit.naturalEstimate()[0], 1e-10 * rate);
        assertEquals(rate / Math.sqrt(x.length), fit.naturalStandardError(0), 1e-7 * rate / Math.sqrt(x.length));
        // log-scale Wald interval, exact formula: rate * exp(-+ z / sqrt(n)), z = 1.959963984540054
        // (z from scipy.stats.norm.ppf(0.975), a value from memory to 16 digits)
        double zq = 1.959963984540054;
        Estimate w = fit.wald("rate", 0.95);
        assertEquals(rate * Math.exp(-zq / Math.sqrt(x.length)), w.lower(), 1e-7 * rate);
        assertEquals(rate * Math.exp(zq / Math.sqrt(x.length)), w.upper(), 1e-7 * rate);
        assertEquals("wald-log", w.method());
        // delta method on the rate itself: rate +- z rate / sqrt(n)
        Estimate d = fit.delta(t -> t[0], 0.95);
        assertEquals(rate - zq * rate / Math.sqrt(x.length), d.lower(), 1e-7 * rate);
        assertEquals(rate + zq * rate / Math.sqrt(x.length), d.upper(), 1e-7 * rate);
        // delta on the log scale of the mean 1/rate: exp(log(1/rate) -+ z/sqrt(n))
        Estimate m = fit.delta(t -> 1 / t[0], 0.95, ParameterTransform.log());
        assertEquals(Math.exp(-zq / Math.sqrt(x.length)) / rate, m.lower(), 1e-7 / rate);
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void poissonRegressionScoreAndInformation(Maximiser.Method method) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 2);
        int n = 40;
        double[] z = new double[n];
        int[] y = new int[n];
        for (int i = 0; i < n; i++) {
            z[i] = i / 10.0;
            double mu = Math.exp(0.5 + 0.3 * z[i]);
            // Poisson draw by inversion
            double u = rng.nextDouble();
            double pk = Math.exp(-mu);
            double cdf = pk;
            int k = 0;
            while (u > cdf) {
                k++;
                pk *= mu / k;
                cdf += pk;
            }
            y[i] = k;
        }
        Parameterisation p = Parameterisation.of(List.of("intercept", "slope"),
                List.of(ParameterTransform.identity(), ParameterTransform.identity()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, TestLikelihoods.poissonRegression(z, y),
                List.of(new double[] {0, 0}), n, Maximiser.of(method, 1000, 1e-11));
        assertTrue(fit.converged(), fit.message());
        double[] b = fit.naturalEstimate();
        double s0 = 0;
        double s1 = 0;
        double w00 = 0;
        double w01 = 0;
        double w11 = 0;
        double ysum = 0;
        for (int i = 0; i < n; i++) {
            double mu = Math.exp(b[0] + b[1] * z[i]);
            s0 += y[i] - mu;
            s1 += (y[i] - mu) * z[i];
            w00 += mu;
            w01 += mu * z[i];
            w11 += mu * z[i] * z[i];
            ysum += y[i];
        }
        assertEquals(0, s0, 1e-8 * ysum, "score equation 1");
        assertEquals(0, s1, 1e-8 * ysum, "score equation 2");
        double det = w00 * w11 - w01 * w01;
        double[][] c = fit.naturalCovariance();
        // analytic Hessian: covariance equals (X'WX)^-1 up to rounding and the argmax error
        assertEquals(w11 / det, c[0][0], 1e-8 * w11 / det);
        assertEquals(-w01 / det, c[0][1], 1e-8 * Math.abs(w01 / det));
        assertEquals(w00 / det, c[1][1], 1e-8 * w00 / det);
    }
}
