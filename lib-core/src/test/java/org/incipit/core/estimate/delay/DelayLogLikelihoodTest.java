package org.incipit.core.estimate.delay;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.stream.Stream;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.ParametricDelay;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Identities of the delay likelihood (common practice): the closed-form gamma/lognormal paths
 * equal the term-by-term sums through the distribution layer; analytic gradients equal central
 * differences; day-level masses P(k) sum with the censored tail to 1 and telescope to A(K);
 * P(k) matches the DOUBLE_CENSORED discretisation of the distribution layer.
 */
class DelayLogLikelihoodTest {

    private static final long SEED = 20261205L;

    static Stream<Arguments> cases() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        return Stream.generate(() -> {
            DelayFamily fam = DelayFamilies.all().get(rng.nextInt(3));
            double mean = 2 + 10 * rng.nextDouble();
            double sd = mean * (0.3 + 1.2 * rng.nextDouble());
            return Arguments.of(fam, fam.ofMeanSd(mean, sd).parameters(), rng.nextLong());
        }).limit(30);
    }

    static DelayLogLikelihood sample(DelayFamily fam, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        ParametricDelay f = fam.ofMeanSd(6, 4);
        DelayLogLikelihood.Builder b = DelayLogLikelihood.builder(fam);
        for (int i = 0; i < 40; i++) {
            double d = f.sample(rng) + 1e-3;
            b.density(d).cdf(d + 5 * rng.nextDouble(), -1);
            b.survival(20 * rng.nextDouble());
            b.interval(d, d + 2);
            b.cdf(0.5 + d, 1);
            b.dailyMass(i % 15).dailyCdf(i % 20, -1).dailySurvival(i % 10);
        }
        return b.build();
    }

    @ParameterizedTest
    @MethodSource("cases")
    void closedFormEqualsGenericAndGradientMatches(DelayFamily fam, double[] theta, long seed) {
        DelayLogLikelihood ll = sample(fam, seed);
        DelayLogLikelihood gen = ll.generic();
        double[] g = new double[2];
        double[] gg = new double[2];
        double v = ll.valueAndGradient(theta, g);
        double vg = gen.valueAndGradient(theta, gg);
        assertEquals(vg, v, 1e-11 * Math.abs(vg), "closed form = generic to 1e-11 relative");
        for (int j = 0; j < 2; j++) {
            assertEquals(gg[j], g[j], 1e-9 * Math.max(1, Math.abs(gg[j])), "gradient closed form = generic");
            double h = 1e-5 * Math.max(1, Math.abs(theta[j]));
            double[] up = theta.clone();
            double[] dn = theta.clone();
            up[j] += h;
            dn[j] -= h;
            double fd = (gen.value(up) - gen.value(dn)) / (2 * h);
            // central difference error ~ h^2 f''' + eps |l| / h
            assertEquals(fd, gg[j], 1e-5 * Math.max(1, Math.abs(fd)), "analytic vs central difference");
        }
    }

    @ParameterizedTest
    @MethodSource("cases")
    void lognormalHessianMatchesDifferences(DelayFamily fam, double[] theta, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        ParametricDelay f = DelayFamilies.LOGNORMAL.ofMeanSd(6, 4);
        DelayLogLikelihood.Builder b = DelayLogLikelihood.builder(DelayFamilies.LOGNORMAL);
        for (int i = 0; i < 40; i++) {
            double d = f.sample(rng);
            b.density(d).cdf(d + 5 * rng.nextDouble(), -1).survival(30 * rng.nextDouble()).cdf(0.01 + d / 20, 1);
        }
        DelayLogLikelihood ll = b.build();
        double[] t = fam == DelayFamilies.LOGNORMAL ? theta : new double[] {1.5, 0.7};
        double[] h = new double[4];
        ll.hessian(t, h);
        for (int j = 0; j < 2; j++) {
            double step = 1e-6 * Math.max(1, Math.abs(t[j]));
            double[] up = t.clone();
            double[] dn = t.clone();
            up[j] += step;
            dn[j] -= step;
            double[] gu = new double[2];
            double[] gd = new double[2];
            ll.valueAndGradient(up, gu);
            ll.valueAndGradient(dn, gd);
            for (int i = 0; i < 2; i++) {
                double fd = (gu[i] - gd[i]) / (2 * step);
                assertEquals(fd, h[i * 2 + j], 1e-5 * Math.max(1, Math.abs(fd)), "Hessian vs central difference of gradient");
            }
        }
    }

    @ParameterizedTest
    @MethodSource("cases")
    void dayLevelIdentities(DelayFamily fam, double[] theta, long seed) {
        ParametricDelay f = fam.of(theta);
        double total = 0;
        for (int k = 0; k <= 25; k++) {
            total += Math.exp(DelayLogLikelihood.logDailyMass(f, k, null));
            double a = Math.exp(DelayLogLikelihood.logDailyCdf(f, k, null, false));
            assertEquals(total, a, 1e-12, "sum of P(0..K) = A(K)");
            double s = Math.exp(DelayLogLikelihood.logDailyCdf(f, k, null, true));
            assertEquals(1, a + s, 1e-12, "A(K) + (1 - A(K)) = 1");
        }
        double[] masses = f.discretise(25, org.incipit.distributions.Discretisation.DOUBLE_CENSORED).masses();
        for (int k = 0; k <= 25; k++) {
            assertEquals(masses[k], Math.exp(DelayLogLikelihood.logDailyMass(f, k, null)), 1e-10,
                    "P(k) = distribution layer's DOUBLE_CENSORED mass");
        }
    }
}
