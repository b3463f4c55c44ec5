package org.incipit.distributions;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Identities every family must satisfy (common practice), over seeded generated parameter sets.
 * One abstract class; a subclass per family supplies {@link #distributions()}.
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
abstract class DelayContractTest {
    static final long SEED = 20240501L;
    static final int CASES = 12;

    /** Parameter sets for the identities (bounded in number). */
    abstract Stream<Arguments> distributions();

    /** Parameter sets with moderate tails for the sampler checks (bounded in number). */
    abstract Stream<Arguments> samplingDistributions();

    /** A tilt r per day with a finite transform, for this distribution. */
    abstract double tiltFor(ParametricDelay d, UniformRandomProvider rng);

    static UniformRandomProvider rng(long salt) {
        return RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + salt);
    }

    static double[] probabilities() {
        return new double[] {1e-12, 1e-6, 1e-3, 0.01, 0.1, 0.25, 0.5, 0.75, 0.9, 0.99, 0.999, 1 - 1e-6};
    }

    @ParameterizedTest
    @MethodSource("distributions")
    void cdfIsMonotoneAndComplementsSurvival(ParametricDelay d) {
        double prev = 0;
        for (double p : probabilities()) {
            double x = d.quantile(p);
            double c = d.cdf(x);
            assertTrue(c >= prev, () -> d + " cdf not monotone at " + x);
            prev = c;
            assertEquals(1.0, c + d.survival(x), 4 * Math.ulp(1.0), "cdf + survival = 1 within 4 ulp");
            assertEquals(Math.log(c), d.logCdf(x), 1e-13 * Math.max(1, Math.abs(Math.log(c))));
        }
        assertEquals(0.0, d.cdf(-1));
        assertEquals(1.0, d.survival(-1));
        assertEquals(0.0, d.density(-1));
        assertEquals(Double.NEGATIVE_INFINITY, d.logDensity(-1));
        assertTrue(Double.isNaN(d.cdf(Double.NaN)));
    }

    @ParameterizedTest
    @MethodSource("distributions")
    void quantileInvertsCdf(ParametricDelay d) {
        for (double p : probabilities()) {
            double x = d.quantile(p);
            // Compare on the side where the probability is small, so that the check is relative.
            // Tolerance: 1e-13 relative plus the effect of rounding x to a double (x f(x) ulp).
            if (p <= 0.5) {
                double tol = 1e-13 * p + 2 * Math.ulp(x) * d.density(x);
                assertEquals(p, d.cdf(x), tol, () -> d + " cdf(quantile(" + p + "))");
            } else {
                double q = 1 - p;
                double tol = 1e-13 * q + 2 * Math.ulp(x) * d.density(x);
                assertEquals(q, d.survival(x), tol, () -> d + " survival(quantile(" + p + "))");
            }
        }
        assertEquals(0.0, d.quantile(0));
        assertEquals(Double.POSITIVE_INFINITY, d.quantile(1));
        assertThrows(IllegalArgumentException.class, () -> d.quantile(-0.1));
        assertThrows(IllegalArgumentException.class, () -> d.quantile(1.5));
        assertThrows(IllegalArgumentException.class, () -> d.quantile(Double.NaN));
    }

    @ParameterizedTest
    @MethodSource("distributions")
    void laplaceIsOneAtZeroDecreasingAndLogConvex(ParametricDelay d) {
        assertEquals(1.0, d.laplaceTransform(0));
        double h = 0.25 / d.mean();
        double prev = 1;
        for (int i = 1; i <= 20; i++) {
            double l = d.laplaceTransform(i * h);
            assertTrue(l < prev, () -> d + " laplace not decreasing");
            prev = l;
            double l0 = Math.log(d.laplaceTransform((i - 1) * h));
            double l2 = Math.log(d.laplaceTransform((i + 1) * h));
            // log-convexity (Hoelder): log L(s-h) + log L(s+h) >= 2 log L(s), up to 1e-12 relative
            assertTrue(l0 + l2 - 2 * Math.log(l) >= -1e-12 * Math.abs(l0 + l2), () -> d + " not log-convex");
        }
        assertThrows(IllegalArgumentException.class, () -> d.laplaceTransform(Double.NaN));
        double a = d.laplaceAbscissa();
        if (a > Double.NEGATIVE_INFINITY) {
            assertEquals(Double.POSITIVE_INFINITY, d.laplaceTransform(a - 1));
        }
    }

    @ParameterizedTest
    @MethodSource("distributions")
    void meanSdFactoryRoundTrips(ParametricDelay d) {
        ParametricDelay e = d.family().ofMeanSd(d.mean(), d.sd());
        assertEquals(d.mean(), e.mean(), 1e-12 * d.mean(), "mean round trip");
        assertEquals(d.sd(), e.sd(), 1e-10 * d.sd(), "sd round trip (Weibull: Brent on log shape)");
        double[] p = d.parameters();
        double[] q = e.parameters();
        for (int i = 0; i < p.length; i++) {
            assertEquals(p[i], q[i], 1e-8 * Math.max(1, Math.abs(p[i])), d + " parameter " + i);
        }
    }

    @ParameterizedTest
    @MethodSource("distributions")
    void tiltIdentityAndComposition(ParametricDelay d) {
        UniformRandomProvider rng = rng(d.hashCode());
        assertSame(d, d.tilt(0));
        double r = tiltFor(d, rng);
        double s = 0.5 * r;
        DelayDistribution twice = d.tilt(r).tilt(s);
        DelayDistribution once = d.tilt(r + s);
        DelayDistribution tilted = d.tilt(r);
        assertSame(tilted, tilted.tilt(0));
        double x = d.quantile(0.5);
        assertEquals(once.cdf(x), twice.cdf(x), 1e-12 * once.cdf(x));
        assertEquals(once.mean(), twice.mean(), 1e-12 * once.mean());
        assertThrows(IllegalArgumentException.class, () -> d.tilt(Double.NaN));
        if (d.laplaceAbscissa() > Double.NEGATIVE_INFINITY) {
            assertThrows(IllegalArgumentException.class, () -> d.tilt(d.laplaceAbscissa() - 1));
        }
    }

    @ParameterizedTest
    @MethodSource("distributions")
    void tiltedMeanIsMinusDerivativeOfLogLaplace(ParametricDelay d) {
        double r = tiltFor(d, rng(d.hashCode() + 7));
        DelayDistribution t = d.tilt(r);
        double h = 1e-4 / d.sd();
        double fd = -(Math.log(d.laplaceTransform(r + h)) - Math.log(d.laplaceTransform(r - h))) / (2 * h);
        // central difference: truncation h^2 kappa_3 / 6 and rounding 1e-16 / h, both ~1e-8
        // relative for these cases; 1e-6 leaves room, the quadrature mean itself is checked
        // against mpmath at 1e-12 in ReferenceValuesTest.
        assertEquals(fd, t.mean(), 1e-6 * t.mean(), () -> t + " mean vs -d log L/ds");
        assertEquals(t.laplaceTransform(0.3) * d.laplaceTransform(r), d.laplaceTransform(r + 0.3),
                1e-12 * d.laplaceTransform(r + 0.3), "L_tilted(s) L(r) = L(r + s)");
        // density of the tilt integrates to the cdf: check cdf + survival = 1
        double x = t.quantile(0.3);
        assertEquals(1.0, t.cdf(x) + t.survival(x), 1e-13);
        assertEquals(0.3, t.cdf(x), 1e-12);
    }

    @ParameterizedTest
    @MethodSource("distributions")
    void discretisedMassesSumToOne(ParametricDelay d) {
        int maxDay = (int) Math.ceil(d.quantile(0.9)) + 1;
        for (Discretisation scheme : Discretisation.values()) {
            DailyMasses m = d.discretise(maxDay, scheme);
            double sum = m.tail();
            for (int i = 0; i < m.days(); i++) {
                sum += m.mass(i);
            }
            assertEquals(1.0, sum, 1e-13, d + " " + scheme + " masses + tail");
        }
        DailyMasses di = d.discretise(maxDay, Discretisation.DAY_INTERVAL);
        assertEquals(d.cdf(1), di.mass(0), 1e-15);
        assertEquals(d.survival(maxDay + 1.0), di.tail(), 1e-15 * Math.max(d.survival(maxDay + 1.0), 1e-300));
        assertThrows(IllegalArgumentException.class, () -> d.discretise(-1, Discretisation.DAY_INTERVAL));
    }

    @ParameterizedTest
    @MethodSource("distributions")
    void gradientsAgreeWithCentralDifferences(ParametricDelay d) {
        double[] p = d.parameters();
        for (double prob : new double[] {0.05, 0.5, 0.95}) {
            double x = d.quantile(prob);
            double[] gd = d.logDensityGradient(x);
            double[] gc = d.logCdfGradient(x);
            double[] gs = d.logSurvivalGradient(x);
            for (int i = 0; i < p.length; i++) {
                double h = 1e-5 * Math.max(Math.abs(p[i]), 0.1);
                double[] up = p.clone();
                double[] dn = p.clone();
                up[i] += h;
                dn[i] -= h;
                ParametricDelay du = d.family().of(up);
                ParametricDelay dd = d.family().of(dn);
                // central differences: error ~ h^2 f''' + 1e-16/h ~ 1e-9; tolerance 1e-6
                // relative (floor 1e-3 for components near 0).
                check(d + " dlogf/dp" + i, gd[i], (du.logDensity(x) - dd.logDensity(x)) / (2 * h));
                check(d + " dlogF/dp" + i, gc[i], (du.logCdf(x) - dd.logCdf(x)) / (2 * h));
                check(d + " dlogS/dp" + i, gs[i], (du.logSurvival(x) - dd.logSurvival(x)) / (2 * h));
            }
        }
    }

    private static void check(String what, double actual, double fd) {
        assertEquals(fd, actual, 1e-6 * Math.max(Math.abs(fd), 1e-3), what);
    }

    /**
     * Sample mean and variance within 4 standard errors. The variance's standard error uses the
     * sample fourth central moment. Two-sided 4-sigma false-alarm rate about 6.3e-5 per check
     * (normal approximation; parameters restricted to moderate tails, kurtosis small enough for
     * n = 20000).
     */
    @ParameterizedTest
    @MethodSource("samplingDistributions")
    void sampleMomentsMatch(ParametricDelay d) {
        UniformRandomProvider rng = rng(42 + d.hashCode());
        int n = 20000;
        double[] x = new double[n];
        double sum = 0;
        for (int i = 0; i < n; i++) {
            x[i] = d.sample(rng);
            assertTrue(x[i] >= 0);
            sum += x[i];
        }
        double m = sum / n;
        double m2 = 0;
        double m4 = 0;
        for (double v : x) {
            double e = (v - m) * (v - m);
            m2 += e;
            m4 += e * e;
        }
        m2 /= n;
        m4 /= n;
        assertEquals(d.mean(), m, 4 * d.sd() / Math.sqrt(n), d + " sample mean");
        assertEquals(d.variance(), m2, 4 * Math.sqrt((m4 - m2 * m2) / n), d + " sample variance");
        UniformRandomProvider a = RandomSource.XO_RO_SHI_RO_128_PP.create(7L);
        UniformRandomProvider b = RandomSource.XO_RO_SHI_RO_128_PP.create(7L);
        assertEquals(d.sample(a), d.sample(b), "reproducible by seed");
    }

    /**
     * Chi-square on 10 equal-probability bins, n = 5000, alpha = 0.001: critical value
     * scipy.stats.chi2.ppf(0.999, 9) = 27.877 (scipy 1.17).
     */
    @ParameterizedTest
    @MethodSource("samplingDistributions")
    void sampleChiSquareOnEqualProbabilityBins(ParametricDelay d) {
        UniformRandomProvider rng = rng(99 + d.hashCode());
        int n = 5000;
        int[] counts = new int[10];
        double[] edges = new double[9];
        for (int j = 0; j < 9; j++) {
            edges[j] = d.quantile((j + 1) / 10.0);
        }
        for (int i = 0; i < n; i++) {
            double v = d.sample(rng);
            int k = 0;
            while (k < 9 && v > edges[k]) {
                k++;
            }
            counts[k]++;
        }
        double chi = 0;
        for (int c : counts) {
            chi += (c - n / 10.0) * (c - n / 10.0) / (n / 10.0);
        }
        assertTrue(chi < 27.877, d + " chi-square " + chi);
    }
}
