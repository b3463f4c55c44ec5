package org.incipit.core.estimate.ambiguous;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

import org.apache.commons.numbers.gamma.LogGamma;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/** The kernel: value against a direct sum, derivatives against central differences. */
class AmbiguousLikelihoodTest {

    private static final long SEED = 20261201L;

    static Stream<Arguments> settings() {
        List<Arguments> out = new ArrayList<>();
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        ExposureHistory[] hs = {ExposureHistory.open(), ExposureHistory.complete(), ExposureHistory.knownTotal(),
            ExposureHistory.poissonTotal(3.5)};
        for (Family f : Family.values()) {
            for (int k = 1; k <= 2; k++) {
                for (ExposureHistory h : hs) {
                    if (k == 2 && !(h instanceof ExposureHistory.Open || h instanceof ExposureHistory.Complete)) {
                        continue;
                    }
                    double[] theta = new double[2 + k];
                    theta[0] = f == Family.LOGNORMAL ? 1 + 0.5 * rng.nextDouble() : Math.log(1.5 + 3 * rng.nextDouble());
                    theta[1] = f == Family.LOGNORMAL ? Math.log(0.4 + 0.4 * rng.nextDouble())
                            : f == Family.GAMMA ? Math.log(0.3 + rng.nextDouble()) : Math.log(3 + 3 * rng.nextDouble());
                    for (int c = 0; c < k; c++) {
                        theta[2 + c] = -1.5 + 2 * rng.nextDouble();
                    }
                    out.add(Arguments.of(f, k, h, theta));
                }
            }
        }
        return out.stream();
    }

    static Prepared data(int k) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + k);
        Sim.Cases c = new Sim.Cases();
        for (int i = 0; i < 40; i++) {
            int m = 1 + rng.nextInt(5);
            double end = 10 + 5 * rng.nextDouble();
            double[] s = new double[m];
            int[] cat = new int[m];
            for (int j = 0; j < m; j++) {
                s[j] = end - 0.5 - 9 * rng.nextDouble();
                cat[j] = rng.nextInt(k);
            }
            java.util.Arrays.sort(s);
            c.add(end, s, cat, m + rng.nextInt(3));
        }
        return c.prepare(k, true);
    }

    /** Direct evaluation of sum_i log( sum_j p_kj prod_{l<j} q_kl h(d_ij) / P(case_i) ). */
    static double direct(Prepared d, Family f, ExposureHistory h, double[] theta) {
        int k = d.categories;
        double[] nat = f.natural(theta[0], theta[1]);
        double[] p = new double[k];
        for (int c = 0; c < k; c++) {
            p[c] = 1 / (1 + Math.exp(-theta[2 + c]));
        }
        double ll = 0;
        for (int i = 0; i < d.n; i++) {
            double sum = 0;
            double surv = 1;
            for (int j = d.offset[i]; j < d.offset[i + 1]; j++) {
                int c = d.cat[j];
                sum += p[c] * surv * density(f, nat, d.dur[j]);
                surv *= 1 - p[c];
            }
            double pc;
            if (h instanceof ExposureHistory.Open) {
                pc = 1;
            } else if (h instanceof ExposureHistory.Complete) {
                double none = 1;
                for (int c = 0; c < k; c++) {
                    none *= Math.pow(1 - p[c], d.recorded[i * k + c]);
                }
                pc = 1 - none;
            } else if (h instanceof ExposureHistory.KnownTotal) {
                pc = 1 - Math.pow(1 - p[0], d.total[i]);
            } else {
                pc = 1 - Math.exp(-((ExposureHistory.PoissonTotal) h).mean() * p[0]);
            }
            ll += Math.log(sum / pc);
        }
        return ll;
    }

    /** Textbook densities (common practice). */
    static double density(Family f, double[] x, double d) {
        switch (f) {
            case GAMMA:
                return Math.exp(x[0] * Math.log(x[1]) - LogGamma.value(x[0]) + (x[0] - 1) * Math.log(d) - x[1] * d);
            case WEIBULL:
                return x[0] / x[1] * Math.pow(d / x[1], x[0] - 1) * Math.exp(-Math.pow(d / x[1], x[0]));
            default:
                double z = (Math.log(d) - x[0]) / x[1];
                return Math.exp(-0.5 * z * z) / (d * x[1] * Math.sqrt(2 * Math.PI));
        }
    }

    @ParameterizedTest(name = "{0} K={1} {2}")
    @MethodSource("settings")
    void valueGradientHessian(Family f, int k, ExposureHistory h, double[] theta) {
        Prepared d = data(k);
        for (boolean general : new boolean[] {false, true}) {
            AmbiguousLikelihood ll = new AmbiguousLikelihood(d, f, h, general, true);
            int q = ll.dimension();
            double v = ll.value(theta);
            double expected = direct(d, f, h, theta);
            assertEquals(expected, v, 1e-11 * Math.abs(expected), "value vs direct sum");
            double[] g = new double[q];
            assertEquals(v, ll.valueAndGradient(theta, g), 0, "same value with gradient");
            double[] hess = new double[q * q];
            ll.hessian(theta, hess);
            for (int a = 0; a < q; a++) {
                // central differences, step 1e-5: truncation error O(h^2 f''') ~ 1e-10 relative
                double hstep = 1e-5;
                double[] tp = theta.clone();
                double[] tm = theta.clone();
                tp[a] += hstep;
                tm[a] -= hstep;
                double num = (ll.value(tp) - ll.value(tm)) / (2 * hstep);
                assertEquals(num, g[a], 1e-6 * Math.max(1, Math.abs(num)), "gradient " + a);
                double[] gp = new double[q];
                double[] gm = new double[q];
                ll.valueAndGradient(tp, gp);
                ll.valueAndGradient(tm, gm);
                for (int b = 0; b < q; b++) {
                    double nh = (gp[b] - gm[b]) / (2 * hstep);
                    assertEquals(nh, hess[a * q + b], 1e-6 * Math.max(1, Math.abs(nh)), "hessian " + a + "," + b);
                }
            }
        }
    }

    /**
     * The gamma / lognormal pass takes each case's first candidate as log-sum-exp reference and
     * redoes a case with the largest term when its sum exceeds 1e20 (a later term more than
     * log(1e20) ~ 46 above the first; beyond ~709 the exp overflows). Here first candidates lie
     * 300 and 2000 days back (terms ~ -180 and ~ -1200 against ~ -2): value against the direct
     * sum of textbook densities, value and derivatives against the general (largest-term) pass.
     */
    @ParameterizedTest
    @MethodSource("farFirstFamilies")
    void farFirstCandidateFallsBackToLargestTermReference(Family f, double[] theta) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 7);
        Sim.Cases c = new Sim.Cases();
        for (int i = 0; i < 30; i++) {
            int m = 1 + rng.nextInt(4);
            double end = 2500 + 5 * rng.nextDouble();
            double[] s = new double[m + 1];
            s[0] = end - (i % 3 == 0 ? 2000 : i % 3 == 1 ? 300 : 8);
            for (int j = 1; j <= m; j++) {
                s[j] = end - 0.5 - 9 * rng.nextDouble();
            }
            java.util.Arrays.sort(s);
            c.add(end, s, new int[m + 1], m + 1);
        }
        Prepared d = c.prepare(1, true);
        ExposureHistory h = ExposureHistory.open();
        AmbiguousLikelihood fast = new AmbiguousLikelihood(d, f, h, false, true);
        AmbiguousLikelihood general = new AmbiguousLikelihood(d, f, h, true, true);
        double expected = direct(d, f, h, theta);
        double v = fast.value(theta);
        assertEquals(expected, v, 1e-11 * Math.abs(expected), "value vs direct sum");
        double[] g1 = new double[3];
        double[] g2 = new double[3];
        assertEquals(v, fast.valueAndGradient(theta, g1), 0, "same value with gradient");
        assertEquals(general.valueAndGradient(theta, g2), v, 1e-12 * Math.abs(v), "value vs general pass");
        double[] h1 = new double[9];
        double[] h2 = new double[9];
        fast.hessian(theta, h1);
        general.hessian(theta, h2);
        for (int a = 0; a < 3; a++) {
            assertEquals(g2[a], g1[a], 1e-10 * Math.max(1, Math.abs(g2[a])), "gradient " + a);
            for (int b = 0; b < 3; b++) {
                assertEquals(h2[a * 3 + b], h1[a * 3 + b], 1e-10 * Math.max(1, Math.abs(h2[a * 3 + b])),
                        "hessian " + a + "," + b);
            }
        }
    }

    static Stream<Arguments> farFirstFamilies() {
        return Stream.of(Arguments.of(Family.GAMMA, new double[] {Math.log(3), Math.log(0.6), -0.3}),
                Arguments.of(Family.LOGNORMAL, new double[] {1.2, Math.log(0.5), 0.4}));
    }

    @Test
    void splitEvaluationEqualsSinglePass() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        Prepared d = Sim.open(rng, 20_000, Sim.gamma(3, 0.6), 0.3, 0.5);
        double[] theta = {Math.log(3), Math.log(0.6), Math.log(0.3 / 0.7)};
        AmbiguousLikelihood split = new AmbiguousLikelihood(d, Family.GAMMA, ExposureHistory.open());
        AmbiguousLikelihood single = new AmbiguousLikelihood(d, Family.GAMMA, ExposureHistory.open(), false, true);
        double[] g1 = new double[3];
        double[] g2 = new double[3];
        double v1 = split.valueAndGradient(theta, g1);
        double v2 = single.valueAndGradient(theta, g2);
        assertEquals(v2, v1, 1e-10 * Math.abs(v2));
        for (int i = 0; i < 3; i++) {
            assertEquals(g2[i], g1[i], 1e-9 * Math.max(1, Math.abs(g2[i])));
        }
        // deterministic: repeated evaluation gives the same bits
        assertEquals(v1, split.value(theta), 0);
    }

    @Test
    void rejectsCaseWithoutUsableStartAndTreatsTieAsZeroDensity() {
        assertThrows(IllegalArgumentException.class, () -> Prepared.of(new double[] {1}, new int[] {0, 1},
                new double[] {1}, null, 1, null, null));
        Prepared tie = Prepared.of(new double[] {5}, new int[] {0, 2}, new double[] {2, 5}, null, 1, null, null);
        assertEquals(1, tie.candidates());
        assertEquals(2, tie.recordedCount(0));
        assertThrows(IllegalArgumentException.class, () -> new AmbiguousLikelihood(data(2), Family.GAMMA,
                ExposureHistory.knownTotal()));
    }

    /**
     * Cases are stored in blocks of equal candidate count: the likelihood is a sum over cases,
     * so any input order gives the same value, gradient and Hessian (to rounding), the blocks
     * are contiguous, and messages still name the right case (common practice: a sum is
     * invariant under permutation of its terms).
     */
    @Test
    void caseOrderDoesNotMatterAndMessagesNameTheCase() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 7);
        int n = 300;
        double[] ends = new double[n];
        double[][] starts = new double[n][];
        for (int i = 0; i < n; i++) {
            int m = 1 + rng.nextInt(7);
            ends[i] = 10 + 5 * rng.nextDouble();
            starts[i] = new double[m];
            for (int j = 0; j < m; j++) {
                starts[i][j] = ends[i] - 0.2 - 9 * rng.nextDouble();
            }
            java.util.Arrays.sort(starts[i]);
        }
        int[] reversed = new int[n];
        for (int i = 0; i < n; i++) {
            reversed[i] = n - 1 - i;
        }
        int[] identity = new int[n];
        for (int i = 0; i < n; i++) {
            identity[i] = i;
        }
        Prepared a = build(ends, starts, identity);
        Prepared b = build(ends, starts, reversed);
        for (int i = 1; i < a.n; i++) {
            assertTrue(a.offset[i + 1] - a.offset[i] >= a.offset[i] - a.offset[i - 1], "sorted by count");
        }
        for (int m = 1; m <= a.maxM; m++) {
            for (int i = a.blockStart[m]; i < a.blockStart[m + 1]; i++) {
                assertEquals(m, a.offset[i + 1] - a.offset[i]);
            }
        }
        assertEquals(a.n, a.blockStart[a.maxM + 1]);
        double[] theta = {Math.log(2.5), Math.log(0.5), -0.4};
        for (Family f : Family.values()) {
            for (boolean general : new boolean[] {false, true}) {
                AmbiguousLikelihood la = new AmbiguousLikelihood(a, f, ExposureHistory.open(), general, true);
                AmbiguousLikelihood lb = new AmbiguousLikelihood(b, f, ExposureHistory.open(), general, true);
                double[] ga = new double[3];
                double[] gb = new double[3];
                double[] ha = new double[9];
                double[] hb = new double[9];
                double va = la.valueAndGradient(theta, ga);
                assertEquals(va, lb.valueAndGradient(theta, gb), 1e-12 * Math.abs(va));
                la.hessian(theta, ha);
                lb.hessian(theta, hb);
                for (int i = 0; i < 3; i++) {
                    assertEquals(ga[i], gb[i], 1e-11 * Math.max(1, Math.abs(ga[i])));
                }
                for (int i = 0; i < 9; i++) {
                    assertEquals(ha[i], hb[i], 1e-11 * Math.max(1, Math.abs(ha[i])));
                }
            }
        }
        // a known-total history with one case lacking its total names that case, whatever its position
        int[] totals = new int[n];
        for (int i = 0; i < n; i++) {
            totals[i] = starts[i].length + 1;
        }
        totals[17] = Prepared.UNKNOWN;
        int[] off = new int[n + 1];
        List<Double> flat = new ArrayList<>();
        String[] ids = new String[n];
        for (int i = 0; i < n; i++) {
            off[i + 1] = off[i] + starts[i].length;
            for (double x : starts[i]) {
                flat.add(x);
            }
            ids[i] = "case-" + i;
        }
        Prepared t = Prepared.of(ends, off, flat.stream().mapToDouble(Double::doubleValue).toArray(), null, 1, totals,
                ids);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new AmbiguousLikelihood(t, Family.GAMMA, ExposureHistory.knownTotal()));
        assertTrue(e.getMessage().contains("'case-17'"), e.getMessage());
        // a bootstrap-style subset is stored in count order too
        Prepared sub = a.subset(new int[] {n - 1, 0, 5, 5, 120});
        for (int i = 1; i < sub.n; i++) {
            assertTrue(sub.offset[i + 1] - sub.offset[i] >= sub.offset[i] - sub.offset[i - 1]);
        }
    }

    private static Prepared build(double[] ends, double[][] starts, int[] order) {
        int n = ends.length;
        double[] e = new double[n];
        int[] off = new int[n + 1];
        List<Double> flat = new ArrayList<>();
        for (int r = 0; r < n; r++) {
            int i = order[r];
            e[r] = ends[i];
            off[r + 1] = off[r] + starts[i].length;
            for (double x : starts[i]) {
                flat.add(x);
            }
        }
        return Prepared.of(e, off, flat.stream().mapToDouble(Double::doubleValue).toArray(), null, 1, null, null);
    }

    /** The prepared arrays of a cases object are built once and reused; another object gets its own. */
    @Test
    void preparedOncePerCasesObject() {
        org.incipit.core.observe.AmbiguousStartCases a = org.incipit.core.observe.AmbiguousStartCases.builder()
                .addCase("A", 10, 3, 5).addCase("B", 8, 2).build();
        org.incipit.core.observe.AmbiguousStartCases b = org.incipit.core.observe.AmbiguousStartCases.builder()
                .addCase("A", 10, 3, 5).addCase("B", 8, 2).build();
        Prepared pa = Prepared.from(a);
        assertTrue(pa == Prepared.from(a));
        assertTrue(pa != Prepared.from(b));
        assertEquals(3, pa.candidates());
        assertEquals(java.util.Arrays.toString(pa.logD), java.util.Arrays.toString(Prepared.from(b).logD));
    }
}
