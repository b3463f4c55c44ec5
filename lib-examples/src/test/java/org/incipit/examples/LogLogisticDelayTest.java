package org.incipit.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.growth.EulerLotka;
import org.incipit.core.inference.Estimate;
import org.incipit.core.inference.ModelComparison;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.Discretisation;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/** The log-logistic example family against scipy.stats.fisk and mpmath, and fitted by the engine. */
class LogLogisticDelayTest {

    private static final long SEED = 20261222L;

    /** Rows of reference/loglogistic_reference.py (scipy 1.17 fisk, mpmath 1.3 quad). */
    static Stream<double[]> reference() throws IOException {
        try (InputStream in = LogLogisticDelayTest.class.getResourceAsStream("loglogistic_reference.csv")) {
            List<double[]> rows = new ArrayList<>();
            for (String line : new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\n")) {
                if (line.startsWith("#") || line.startsWith("shape") || line.isBlank()) {
                    continue;
                }
                String[] f = line.split(",");
                double[] v = new double[f.length];
                for (int i = 0; i < f.length; i++) {
                    v[i] = f[i].equals("inf") ? Double.POSITIVE_INFINITY : Double.parseDouble(f[i]); // python repr
                }
                rows.add(v);
            }
            return rows.stream();
        }
    }

    private static void rel(double expected, double actual, double tol, String what) {
        if (Double.isInfinite(expected)) {
            assertEquals(expected, actual, what);
        } else {
            assertEquals(expected, actual, tol * Math.abs(expected), what + " (relative " + tol + ")");
        }
    }

    @ParameterizedTest
    @MethodSource("reference")
    void matchesScipyFisk(double[] r) {
        LogLogisticDelay d = LogLogisticDelay.ofShapeScale(r[0], r[1]);
        double x = r[2];
        rel(r[3], d.logDensity(x), 1e-13, "logpdf");
        rel(r[4], d.cdf(x), 1e-13, "cdf");
        rel(r[5], d.survival(x), 1e-13, "sf");
        rel(r[7], d.quantile(r[6]), 1e-13, "ppf");
        rel(r[8], d.mean(), 1e-13, "mean");
        rel(r[9], d.variance(), 1e-12, "var");
        // tanh-sinh rule, step 1/32: about 1e-12 on these integrands (mpmath quad to 40 digits)
        rel(r[11], d.laplaceTransform(r[10]), 1e-11, "laplace");
        assertEquals(1 / r[11], EulerLotka.reproductionNumber(d, r[10]), 1e-11 / r[11], "Euler-Lotka R");
    }

    static Stream<double[]> parameters() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        return Stream.generate(() -> new double[] {0.6 + 8 * rng.nextDouble(), 0.5 + 10 * rng.nextDouble(),
                0.05 + 3 * rng.nextDouble()}).limit(60);
    }

    /** Gradients against central differences (step 1e-6 relative; agreement to 1e-6 relative). */
    @ParameterizedTest
    @MethodSource("parameters")
    void gradientsMatchCentralDifferences(double[] a) {
        LogLogisticDelay d = LogLogisticDelay.ofShapeScale(a[0], a[1]);
        double x = a[2] * a[1];
        double[][] analytic = {d.logDensityGradient(x), d.logCdfGradient(x), d.logSurvivalGradient(x)};
        for (int j = 0; j < 2; j++) {
            double[] up = {a[0], a[1]};
            double[] dn = {a[0], a[1]};
            double h = 1e-6 * up[j];
            up[j] += h;
            dn[j] -= h;
            LogLogisticDelay u = LogLogisticDelay.ofShapeScale(up[0], up[1]);
            LogLogisticDelay l = LogLogisticDelay.ofShapeScale(dn[0], dn[1]);
            double[] fd = {(u.logDensity(x) - l.logDensity(x)) / (2 * h), (u.logCdf(x) - l.logCdf(x)) / (2 * h),
                    (u.logSurvival(x) - l.logSurvival(x)) / (2 * h)};
            for (int k = 0; k < 3; k++) {
                assertEquals(fd[k], analytic[k][j], 1e-6 * Math.max(1, Math.abs(fd[k])), "gradient " + k + "/" + j);
            }
        }
        assertEquals(x, d.quantile(d.cdf(x)), 1e-12 * x, "quantile(cdf(x))");
        assertEquals(1, d.cdf(x) + d.survival(x), 1e-15, "cdf + survival");
    }

    @Test
    void meanSdRoundTripAndTilt() {
        LogLogisticDelay d = LogLogisticDelay.ofMeanSd(6, 3);
        assertEquals(6, d.mean(), 1e-12);
        assertEquals(3, d.sd(), 1e-10);
        DelayDistribution t = d.tilt(0.2);
        // identities: tilting by r then s equals tilting by r + s; Laplace of the tilt = L(r + s)/L(r);
        // tilted cdf at its own quantile; tilted mean = -d/ds log L(s) at s = r (central difference)
        assertEquals(d.laplaceTransform(0.5) / d.laplaceTransform(0.2), t.laplaceTransform(0.3), 1e-13);
        assertEquals(d.tilt(0.5).mean(), t.tilt(0.3).mean(), 1e-12);
        assertEquals(0.3, t.cdf(t.quantile(0.3)), 1e-11);
        assertEquals(1, t.cdf(4) + t.survival(4), 1e-12);
        double h = 1e-4;
        double dl = -(Math.log(d.laplaceTransform(0.2 + h)) - Math.log(d.laplaceTransform(0.2 - h))) / (2 * h);
        assertEquals(dl, t.mean(), 1e-7 * dl);
        assertTrue(t.mean() < d.mean(), "tilting by r > 0 shortens the delays");
        assertThrows(IllegalArgumentException.class, () -> d.tilt(-0.1));
        assertEquals(Double.POSITIVE_INFINITY, d.laplaceTransform(-0.1));
        double sum = 0;
        var m = d.discretise(200, Discretisation.DOUBLE_CENSORED);
        for (double v : m.masses()) {
            sum += v;
        }
        assertEquals(1, sum + m.tail(), 1e-12);
        assertEquals(d.cdf(1) - d.cdf(0), d.discretise(3, Discretisation.DAY_INTERVAL).mass(0), 1e-15);
    }

    /**
     * The engine fits the new family with no change to the library: 4,000 seeded draws from
     * log-logistic(3.2, 5.5); Wald intervals should contain the truth (a 95% interval misses with
     * probability 0.05 per parameter, so this seed-fixed check is deterministic, not a coverage
     * claim); AIC prefers the log-logistic to the gamma and the Weibull on its own data.
     */
    @Test
    void engineFitsTheNewFamily() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        LogLogisticDelay truth = LogLogisticDelay.ofShapeScale(3.2, 5.5);
        double[] x = new double[4000];
        for (int i = 0; i < x.length; i++) {
            x[i] = truth.sample(rng);
        }
        // exactly observed delays = left-truncated delays with entry 0
        var data = new CustomLikelihoodExample.LeftTruncatedDelays(x, new double[x.length]);
        MaximumLikelihoodFit ll = CustomLikelihoodExample.fit(data, LogLogisticDelay.FAMILY);
        Estimate shape = ll.wald("shape", 0.95);
        Estimate scale = ll.wald("scale", 0.95);
        assertTrue(shape.contains(3.2), shape.toString());
        assertTrue(scale.contains(5.5), scale.toString());
        ModelComparison cmp = ModelComparison.of(ModelComparison.Criterion.AIC, List.of(
                ll.candidate("loglogistic"),
                CustomLikelihoodExample.fit(data, DelayFamilies.GAMMA).candidate("gamma"),
                CustomLikelihoodExample.fit(data, DelayFamilies.WEIBULL).candidate("weibull")));
        assertEquals("loglogistic", cmp.best().name());
    }

    /**
     * The library's right-truncation estimator takes the new family unchanged: 3,000 seeded pairs
     * with primaries uniform on [0, 30], log-logistic(3.2, 5.5) delays, seen only by day 30; the
     * truncation-corrected fit matches the general engine fit of the same likelihood written
     * independently here (to 1e-6 relative: two maximisers stopping on gradient tolerances), and
     * its mean interval contains the truth.
     */
    @Test
    void libraryTruncationEstimatorTakesTheNewFamily() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 1);
        LogLogisticDelay truth = LogLogisticDelay.ofShapeScale(3.2, 5.5);
        org.incipit.core.observe.DelayPairs.Builder b = org.incipit.core.observe.DelayPairs.builder(30);
        List<double[]> kept = new ArrayList<>();
        while (kept.size() < 3000) {
            double p = 30 * rng.nextDouble();
            double q = p + truth.sample(rng);
            if (q <= 30) {
                b.addObserved("p" + kept.size(), p, q);
                kept.add(new double[] {p, q});
            }
        }
        var fit = org.incipit.core.estimate.delay.DelayEstimator.rightTruncated(b.build(), LogLogisticDelay.FAMILY,
                org.incipit.core.estimate.delay.DelayOptions.defaults());
        assertTrue(fit.converged(), fit.message());
        // the same likelihood through the engine: sum log f(d) - log F(30 - primary)
        org.incipit.core.likelihood.LogLikelihood ll = new org.incipit.core.likelihood.LogLikelihood() {
            @Override
            public int dimension() {
                return 2;
            }

            @Override
            public double value(double[] t) {
                if (!(t[0] > 0 && t[1] > 0)) {
                    return Double.NEGATIVE_INFINITY;
                }
                LogLogisticDelay d = LogLogisticDelay.ofShapeScale(t[0], t[1]);
                double v = 0;
                for (double[] k : kept) {
                    v += d.logDensity(k[1] - k[0]) - d.logCdf(30 - k[0]);
                }
                return v;
            }

            @Override
            public double valueAndGradient(double[] t, double[] g) {
                double v = value(t);
                for (int j = 0; j < 2; j++) {
                    double[] up = t.clone();
                    double[] dn = t.clone();
                    double h = 1e-6 * t[j];
                    up[j] += h;
                    dn[j] -= h;
                    g[j] = (value(up) - value(dn)) / (2 * h);
                }
                return v;
            }
        };
        MaximumLikelihoodFit ref = MaximumLikelihoodFit.maximise(org.incipit.core.likelihood.Parameterisation.of(
                List.of("shape", "scale"), List.of(org.incipit.core.likelihood.ParameterTransform.log(),
                        org.incipit.core.likelihood.ParameterTransform.log())), ll, List.of(new double[] {2, 4}),
                kept.size(), org.incipit.core.likelihood.Maximiser.bfgs());
        assertEquals(ref.naturalEstimate()[0], fit.parameter("shape").estimate(), 1e-6 * ref.naturalEstimate()[0]);
        assertEquals(ref.naturalEstimate()[1], fit.parameter("scale").estimate(), 1e-6 * ref.naturalEstimate()[1]);
        assertTrue(fit.mean().contains(truth.mean()), fit.mean().toString());
    }
}
