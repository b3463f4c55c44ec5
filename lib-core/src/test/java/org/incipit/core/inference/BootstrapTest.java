package org.incipit.core.inference;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;
import java.util.concurrent.ForkJoinPool;
import java.util.function.Function;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.ZigguratSampler;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.EstimationException;
import org.junit.jupiter.api.Test;

class BootstrapTest {

    private static final long SEED = 20240501L;

    private static double[] data(int n) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        ZigguratSampler.NormalizedGaussian z = ZigguratSampler.NormalizedGaussian.of(rng);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = 5 + 2 * z.sample();
        }
        return x;
    }

    private static double mean(double[] x) {
        double s = 0;
        for (double v : x) {
            s += v;
        }
        return s / x.length;
    }

    private static Function<int[], double[]> meanOf(double[] x) {
        return idx -> {
            double s = 0;
            for (int i : idx) {
                s += x[i];
            }
            return new double[] {s / idx.length};
        };
    }

    @Test
    void identicalForOneAndTwoThreads() {
        double[] x = data(40);
        ForkJoinPool one = new ForkJoinPool(1);
        ForkJoinPool two = new ForkJoinPool(2);
        try {
            BootstrapResult a = Bootstrap.nonparametric(SEED, 300, x.length, meanOf(x), new double[] {mean(x)}, one);
            BootstrapResult b = Bootstrap.nonparametric(SEED, 300, x.length, meanOf(x), new double[] {mean(x)}, two);
            assertEquals(300, a.successful());
            double[][] ra = a.replicates();
            double[][] rb = b.replicates();
            for (int i = 0; i < ra.length; i++) {
                assertArrayEquals(ra[i], rb[i], 0.0, "replicate " + i + " bit-identical");
            }
            assertEquals(a, b);
            // and the same as replicate i computed alone from its own stream
            UniformRandomProvider r7 = Bootstrap.replicateStream(SEED, 7);
            int[] idx = new int[x.length];
            for (int j = 0; j < idx.length; j++) {
                idx[j] = r7.nextInt(x.length);
            }
            assertEquals(meanOf(x).apply(idx)[0], ra[7][0], 0.0);
        } finally {
            one.shutdown();
            two.shutdown();
        }
    }

    /**
     * The ideal bootstrap SE of a mean is s_n / sqrt(n), s_n with divisor n (Efron &amp;
     * Tibshirani 1993, sec. 6.2; from memory). With B = 4000 replicates of nearly normal
     * means the relative simulation SD of the estimated SE is about 1/sqrt(2(B-1)) = 1.1%;
     * tolerance 4 x 1.1% = 4.5% (false alarm ~6e-5).
     */
    @Test
    void standardErrorOfMean() {
        double[] x = data(50);
        double m = mean(x);
        double ss = 0;
        for (double v : x) {
            ss += (v - m) * (v - m);
        }
        double ideal = Math.sqrt(ss / x.length) / Math.sqrt(x.length);
        BootstrapResult r = Bootstrap.nonparametric(SEED + 3, 4000, x.length, meanOf(x), new double[] {m},
                ForkJoinPool.commonPool());
        assertEquals(ideal, r.standardError(0), 0.045 * ideal);
        Estimate pct = r.percentile(0, 0.95);
        Estimate basic = r.basic(0, 0.95);
        // both intervals have width about 2 * 1.96 * SE for a near-normal bootstrap distribution
        assertEquals(2 * 1.96 * ideal, pct.width(), 0.1 * 2 * 1.96 * ideal);
        assertEquals(pct.width(), basic.width(), 1e-12);
        assertEquals(2 * m - pct.upper(), basic.lower(), 1e-12);
    }

    @Test
    void failuresAreCountedWithReasons() {
        // parametric: a replicate "fails" when its first uniform draw is below 0.2
        Function<UniformRandomProvider, double[]> task = rng -> {
            double u = rng.nextDouble();
            if (u < 0.2) {
                throw new EstimationException("did not converge");
            }
            if (u > 0.95) {
                return new double[] {Double.NaN};
            }
            return new double[] {u};
        };
        BootstrapResult r = Bootstrap.parametric(SEED, 500, task, new double[] {0.5}, ForkJoinPool.commonPool());
        int expectFail = 0;
        int expectNaN = 0;
        for (int i = 0; i < 500; i++) {
            double u = Bootstrap.replicateStream(SEED, i).nextDouble();
            expectFail += u < 0.2 ? 1 : 0;
            expectNaN += u > 0.95 ? 1 : 0;
        }
        assertEquals(Map.of("EstimationException: did not converge", expectFail, "non-finite statistic", expectNaN),
                r.failureReasons());
        assertEquals(500 - expectFail - expectNaN, r.successful());
        assertEquals(expectFail + expectNaN, r.failed());
        assertTrue(expectFail > 50 && expectNaN > 5);
    }

    @Test
    void rejectsBadArguments() {
        assertThrows(IllegalArgumentException.class,
                () -> Bootstrap.nonparametric(1, 0, 5, i -> new double[1], new double[1], ForkJoinPool.commonPool()));
        assertThrows(IllegalArgumentException.class,
                () -> Bootstrap.nonparametric(1, 5, 0, i -> new double[1], new double[1], ForkJoinPool.commonPool()));
        assertThrows(IllegalArgumentException.class,
                () -> Bootstrap.parametric(1, 5, r -> new double[1], new double[] {Double.NaN}, ForkJoinPool.commonPool()));
        BootstrapResult none = Bootstrap.parametric(1, 3, r -> {
            throw new IllegalStateException("x");
        }, new double[] {1}, ForkJoinPool.commonPool());
        assertThrows(EstimationException.class, () -> none.percentile(0, 0.95));
    }
}
