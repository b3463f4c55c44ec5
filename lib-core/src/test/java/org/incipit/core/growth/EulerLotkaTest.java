package org.incipit.core.growth;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.function.DoubleUnaryOperator;
import java.util.stream.Stream;
import org.apache.commons.numbers.gamma.LogGamma;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.inference.Estimate;
import org.incipit.distributions.DailyMasses;
import org.incipit.distributions.DelayDistribution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.junit.jupiter.params.provider.ValueSource;

class EulerLotkaTest {

    private static final long SEED = 20261201L;

    static DoubleUnaryOperator gammaDensity(double shape, double rate) {
        return x -> x <= 0 ? 0 : Math.exp(shape * Math.log(rate) + (shape - 1) * Math.log(x)
                - rate * x - LogGamma.value(shape));
    }

    static NumericDelay lognormal(double mu, double sigma) {
        return new NumericDelay("lognormal", x -> x <= 0 ? 0 : Math.exp(-Math.pow(Math.log(x) - mu, 2)
                / (2 * sigma * sigma)) / (x * sigma * Math.sqrt(2 * Math.PI)), 400, 0);
    }

    // Wallinga & Lipsitch 2007, Proc R Soc B 274 (section numbers not cited; formula common practice): gamma generation interval,
    // R = (1 + r/rate)^shape. Transform by Simpson integration of the density (smooth for shape 3,
    // h = 0.005: error ~ h^4 f'''' well below 1e-10), hence 1e-9 relative.
    @ParameterizedTest
    @ValueSource(doubles = {-0.2, -0.05, 0.05, 0.2, 0.5})
    void gammaClosedForm(double r) {
        double shape = 3;
        double rate = 0.6;
        NumericDelay g = new NumericDelay("gamma", gammaDensity(shape, rate), 200, -rate);
        double expected = Math.pow(1 + r / rate, shape);
        assertEquals(expected, EulerLotka.reproductionNumber(g, r), 1e-9 * expected);
    }

    // Wallinga & Lipsitch 2007 (exponential): R = 1 + r * mean. Simpson on [0, 1000]
    // (truncation at r = -0.2 leaves exp(-50)), 1e-9 relative.
    @ParameterizedTest
    @ValueSource(doubles = {-0.2, 0.01, 0.3})
    void exponentialClosedForm(double r) {
        double mean = 4;
        NumericDelay g = new NumericDelay("exponential", x -> Math.exp(-x / mean) / mean, 1000,
                -1 / mean);
        assertEquals(1 + r * mean, EulerLotka.reproductionNumber(g, r), 1e-9 * (1 + r * mean));
    }

    // Wallinga & Lipsitch 2007 (fixed generation interval T): R = exp(r T). Masses: one point mass.
    @ParameterizedTest
    @ValueSource(doubles = {-0.3, 0.0, 0.1, 0.7})
    void pointMassIsFixedInterval(double r) {
        double[] w = new double[8];
        w[5] = 1;
        double expected = Math.exp(5 * r);
        assertEquals(expected, EulerLotka.reproductionNumber(w, r), 2 * Math.ulp(expected));
        assertEquals(expected, EulerLotka.reproductionNumber(new DailyMasses(w, 0), r),
                2 * Math.ulp(expected));
    }

    // Wallinga & Lipsitch 2007 (normal): R = exp(r mu - r^2 sigma^2 / 2). What is tested:
    // masses w_s proportional to exp(-(s - mu)^2 / (2 sigma^2)) on the integers s = 0..60 with
    // mu = 30, sigma = 2.5. By the Poisson summation formula the lattice sum of a Gaussian times
    // exp(-r s) equals the integral up to a relative error ~ 2 exp(-2 pi^2 sigma^2) ~ 1e-53 and the
    // truncation at +-12 sigma adds ~ exp(-72); so the discrete form must equal the normal formula
    // to rounding (1e-12 relative).
    @ParameterizedTest
    @ValueSource(doubles = {-0.2, -0.05, 0.03, 0.15, 0.3})
    void latticeNormalMatchesNormalFormula(double r) {
        double mu = 30;
        double sigma = 2.5;
        double[] w = new double[61];
        for (int s = 0; s < w.length; s++) {
            w[s] = 7 * Math.exp(-(s - mu) * (s - mu) / (2 * sigma * sigma)); // unnormalised on purpose
        }
        double expected = Math.exp(r * mu - r * r * sigma * sigma / 2);
        assertEquals(expected, EulerLotka.reproductionNumber(w, r), 1e-12 * expected);
    }

    /**
     * SEIR with Erlang latent (m stages, mean L) and infectious (n stages, mean D) periods:
     * Wearing, Rohani &amp; Keeling 2005, PLoS Med 2(7) e174 (formula as recalled, re-derived below):
     * R = r (1 + r L/m)^m / [(1/D)(1 - (1 + r D/n)^(-n))].
     * Derivation: the generation interval is E + U, E ~ Erlang(m, m/L), U with density
     * S_I(u)/D (time of an infection during the infectious period, weighted by the chance of
     * still being infectious; mean E[I^2]/(2D) = D(n+1)/(2n)). E[e^{-rU}] = (1 - (1 + rD/n)^(-n))
     * / (r D), so 1/M_g(-r) is the formula. Here each factor's transform is a Simpson integral of
     * its density, independent of the closed form; 1e-9 relative.
     */
    @ParameterizedTest
    @ValueSource(doubles = {-0.1, 0.05, 0.15, 0.3})
    void seirErlangFormula(double r) {
        int m = 2;
        double latent = 3;
        int n = 3;
        double infectious = 5;
        NumericDelay e = new NumericDelay("erlang", gammaDensity(m, m / latent), 300, -m / latent);
        NumericDelay u = new NumericDelay("infectious-age", x -> {
            double z = n * x / infectious;
            double s = 0;
            double term = 1;
            for (int j = 0; j < n; j++) {
                s += term;
                term *= z / (j + 1);
            }
            return Math.exp(-z) * s / infectious;
        }, 300, -n / infectious);
        assertEquals(infectious * (n + 1) / (2.0 * n), u.mean(), 1e-9, "mean of U");
        DelayDistribution g = new SumDelay(e, u);
        double expected = r * Math.pow(1 + r * latent / m, m)
                / ((1 / infectious) * (1 - Math.pow(1 + r * infectious / n, -n)));
        assertEquals(expected, EulerLotka.reproductionNumber(g, r), 1e-9 * expected);
        assertEquals(r, EulerLotka.growthRate(g, expected), 1e-8);
    }

    @Test
    void decliningEpidemicRefusedWhereTransformDiverges() {
        NumericDelay logn = lognormal(1.5, 0.5);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> EulerLotka.reproductionNumber(logn, -0.05));
        assertTrue(e.getMessage().contains("infinite") && e.getMessage().contains("lognormal"),
                e.getMessage());
        NumericDelay weibull = new NumericDelay("weibull", x -> x <= 0 ? 0
                : 0.7 / 4 * Math.pow(x / 4, -0.3) * Math.exp(-Math.pow(x / 4, 0.7)), 400, 0);
        assertThrows(IllegalArgumentException.class, () -> EulerLotka.reproductionNumber(weibull,
                -0.01));
        TestGamma g = new TestGamma(2, 0.5);
        assertThrows(IllegalArgumentException.class, () -> EulerLotka.reproductionNumber(g, -0.5));
        assertThrows(IllegalArgumentException.class, () -> EulerLotka.reproductionNumber(g, -0.7));
        IllegalArgumentException inv = assertThrows(IllegalArgumentException.class,
                () -> EulerLotka.growthRate(logn, 0.8));
        assertTrue(inv.getMessage().contains("r < 0"), inv.getMessage());
        // gamma: R -> 0 as r -> -rate, so every R < 1 is reachable
        double r = EulerLotka.growthRate(g, 0.01);
        assertTrue(r > -0.5 && r < 0);
        assertEquals(0.01, EulerLotka.reproductionNumber(g, r), 1e-12);
        // growth is fine for the lognormal
        assertTrue(EulerLotka.reproductionNumber(logn, 0.1) > 1);
    }

    @Test
    void massesAllOnDayZeroCannotGiveRNotOne() {
        assertThrows(IllegalArgumentException.class,
                () -> EulerLotka.growthRate(new double[] {1, 0, 0}, 1.5));
        assertThrows(IllegalArgumentException.class,
                () -> EulerLotka.reproductionNumber(new double[] {0, -0.1, 1}, 0.1));
    }

    static Stream<Arguments> gammaCases() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        return Stream.generate(() -> {
            double shape = 0.5 + 10 * rng.nextDouble();
            double rate = 0.1 + 2 * rng.nextDouble();
            double r = -0.9 * rate + 1.5 * rate * rng.nextDouble();
            return Arguments.of(shape, rate, r);
        }).limit(100);
    }

    // Property: r -> R -> r round trip and R increasing in r; closed form (1 + r/rate)^shape.
    @ParameterizedTest
    @MethodSource("gammaCases")
    void roundTripAndMonotoneGamma(double shape, double rate, double r) {
        TestGamma g = new TestGamma(shape, rate);
        double bigR = EulerLotka.reproductionNumber(g, r);
        assertEquals(Math.pow(1 + r / rate, shape), bigR, 1e-13 * bigR);
        assertEquals(r, EulerLotka.growthRate(g, bigR), 1e-10 * Math.max(1, Math.abs(r)));
        double dr = 1e-3 * rate;
        assertTrue(EulerLotka.reproductionNumber(g, r + dr) > bigR);
    }

    static Stream<Arguments> massCases() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 1);
        return Stream.generate(() -> {
            double[] w = new double[2 + rng.nextInt(20)];
            for (int s = 1; s < w.length; s++) {
                w[s] = rng.nextDouble();
            }
            return Arguments.of(w, -0.3 + 0.8 * rng.nextDouble());
        }).limit(100);
    }

    @ParameterizedTest
    @MethodSource("massCases")
    void roundTripAndMonotoneMasses(double[] w, double r) {
        double[] copy = w.clone();
        double bigR = EulerLotka.reproductionNumber(w, r);
        assertArrayEquals(copy, w, "masses not modified");
        assertEquals(r, EulerLotka.growthRate(w, bigR), 1e-10);
        assertTrue(EulerLotka.reproductionNumber(w, r + 1e-4) > bigR);
    }

    // Backward-traced bias, gamma closed form: the tilted gamma is gamma(shape, rate + r), so
    // R_naive = (1 + r/(rate + r))^shape and R_true = (1 + r/rate)^shape.
    @ParameterizedTest
    @ValueSource(doubles = {-0.1, 0.05, 0.2})
    void backwardBiasGamma(double r) {
        double shape = 2.5;
        double rate = 0.5;
        BackwardBias b = EulerLotka.backwardBias(new TestGamma(shape, rate), r);
        assertEquals(Math.pow(1 + r / rate, shape), b.trueR(), 1e-14 * b.trueR());
        assertEquals(Math.pow(1 + r / (rate + r), shape), b.naiveR(), 1e-14 * b.naiveR());
        assertEquals(b.naiveR() / b.trueR(), b.ratio(), 0.0);
        // ratio = [1 - r^2/(rate + r)^2]^shape < 1 for every r != 0, decline included
        assertEquals(Math.pow(1 - r * r / ((rate + r) * (rate + r)), shape), b.ratio(), 1e-13);
    }

    // Numerical family: the tilted transform at r is M(2r)/M(r) in the E[e^{-sX}] convention, so
    // R_naive = L(r)/L(2r) (Simpson both ways; 1e-9 relative).
    @Test
    void backwardBiasLognormalNumerical() {
        NumericDelay g = lognormal(1.6, 0.4);
        double r = 0.12;
        BackwardBias b = EulerLotka.backwardBias(g, r);
        double expected = g.laplaceTransform(r) / g.laplaceTransform(2 * r);
        assertEquals(expected, b.naiveR(), 1e-9 * expected);
        assertTrue(b.ratio() < 1);
    }

    // Delta method against the analytic gradient of log R = shape log(1 + r/rate):
    // d/dr = shape/(rate + r), d/dshape = log(1 + r/rate), d/drate = -shape r / (rate (rate + r)).
    // Numerical central differences with relative step 1e-5: 1e-7 relative on the bounds.
    @Test
    void deltaMatchesAnalyticGradient() {
        double shape = 4;
        double rate = 0.8;
        double[][] cov = {{0.25, 0.04}, {0.04, 0.01}};
        Estimate rEst = new Estimate(0.1, 0.08, 0.12, 0.95, "wald");
        double z = 1.959963984540054; // qnorm(0.975)
        double seR = 0.02 / z;
        double r = 0.1;
        double[] gr = {Math.log(1 + r / rate), -shape * r / (rate * (rate + r))};
        double dr = shape / (rate + r);
        double var = dr * dr * seR * seR;
        for (int i = 0; i < 2; i++) {
            for (int j = 0; j < 2; j++) {
                var += gr[i] * cov[i][j] * gr[j];
            }
        }
        double logR = shape * Math.log(1 + r / rate);
        Estimate est = EulerLotka.reproductionNumberDelta(new TestGamma(shape, rate), cov, rEst);
        assertEquals(Math.exp(logR), est.estimate(), 1e-14 * est.estimate());
        double lo = Math.exp(logR - z * Math.sqrt(var));
        double hi = Math.exp(logR + z * Math.sqrt(var));
        assertEquals(lo, est.lower(), 1e-7 * lo);
        assertEquals(hi, est.upper(), 1e-7 * hi);
        assertEquals("delta", est.method());
    }

    // Monte Carlo vs delta: relative se of R here ~ 3%, so the second-order (skewness) difference
    // between a log-normal-theory interval and percentiles is ~ 0.1%; the 2.5% / 97.5% sample
    // quantiles from 40000 draws have relative sd ~ 0.3%. 2% leaves > 6 sd. Same seed, same bytes.
    @Test
    void monteCarloAgreesWithDeltaAndIsReproducible() {
        TestGamma g = new TestGamma(4, 0.8);
        double[][] cov = {{0.04, 0.006}, {0.006, 0.0016}};
        Estimate rEst = new Estimate(0.1, 0.09, 0.11, 0.95, "wald");
        Estimate delta = EulerLotka.reproductionNumberDelta(g, cov, rEst);
        Estimate mc = EulerLotka.reproductionNumberMonteCarlo(
                RandomSource.XO_RO_SHI_RO_128_PP.create(SEED), g, cov, rEst, 40000);
        assertEquals(delta.lower(), mc.lower(), 0.02 * delta.lower());
        assertEquals(delta.upper(), mc.upper(), 0.02 * delta.upper());
        Estimate again = EulerLotka.reproductionNumberMonteCarlo(
                RandomSource.XO_RO_SHI_RO_128_PP.create(SEED), g, cov, rEst, 40000);
        assertEquals(mc, again);
    }

    @Test
    void monteCarloRefusesIntervalBelowAbscissa() {
        TestGamma g = new TestGamma(4, 0.8);
        double[][] cov = {{0, 0}, {0, 0}};
        assertThrows(IllegalArgumentException.class, () -> EulerLotka.reproductionNumberMonteCarlo(
                RandomSource.XO_RO_SHI_RO_128_PP.create(SEED), g, cov,
                new Estimate(-0.7, -0.9, -0.5, 0.95, "wald"), 1000));
    }

    /** Test-local sum of two independent delays: transform is the product. */
    private static final class SumDelay implements DelayDistribution {
        private final NumericDelay a;
        private final NumericDelay b;

        SumDelay(NumericDelay a, NumericDelay b) {
            this.a = a;
            this.b = b;
        }

        @Override
        public String familyName() {
            return "sum";
        }

        @Override
        public double laplaceTransform(double s) {
            return a.laplaceTransform(s) * b.laplaceTransform(s);
        }

        @Override
        public double laplaceAbscissa() {
            return Math.max(a.laplaceAbscissa(), b.laplaceAbscissa());
        }

        @Override
        public double mean() {
            return a.mean() + b.mean();
        }

        @Override
        public double variance() {
            return a.variance() + b.variance();
        }

        @Override
        public double density(double x) {
            throw new UnsupportedOperationException();
        }

        @Override
        public double logDensity(double x) {
            throw new UnsupportedOperationException();
        }

        @Override
        public double cdf(double x) {
            throw new UnsupportedOperationException();
        }

        @Override
        public double survival(double x) {
            throw new UnsupportedOperationException();
        }

        @Override
        public double logCdf(double x) {
            throw new UnsupportedOperationException();
        }

        @Override
        public double logSurvival(double x) {
            throw new UnsupportedOperationException();
        }

        @Override
        public double quantile(double p) {
            throw new UnsupportedOperationException();
        }

        @Override
        public DelayDistribution tilt(double r) {
            throw new UnsupportedOperationException();
        }

        @Override
        public DailyMasses discretise(int maxDay, org.incipit.distributions.Discretisation scheme) {
            throw new UnsupportedOperationException();
        }

        @Override
        public double sample(UniformRandomProvider rng) {
            throw new UnsupportedOperationException();
        }
    }
}
