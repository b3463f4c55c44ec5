package org.incipit.core.branching;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.DiscreteSampler;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

class OffspringLawTest {

    private static final long SEED = 20261201L;

    /** Rows of extinction_reference.csv (mpmath 1.3, reference/branching_reference.py). */
    static Stream<Arguments> referenceRows() throws IOException {
        List<Arguments> rows = new ArrayList<>();
        try (BufferedReader in = new BufferedReader(new InputStreamReader(
                OffspringLawTest.class.getResourceAsStream("extinction_reference.csv"),
                StandardCharsets.UTF_8))) {
            String line;
            boolean header = true;
            while ((line = in.readLine()) != null) {
                if (line.startsWith("#")) {
                    continue;
                }
                if (header) {
                    header = false;
                    continue;
                }
                rows.add(Arguments.of((Object[]) line.split(",", -1)));
            }
        }
        return rows.stream();
    }

    private static OffspringLaw law(String family, String r, String k) {
        return family.equals("poisson")
            ? OffspringLaw.poisson(Double.parseDouble(r))
            : OffspringLaw.negativeBinomial(Double.parseDouble(r), Double.parseDouble(k));
    }

    // Source: mpmath 1.3 root of f(s) = s in s (60 digits), Lambert W closed form for the
    // Poisson, q = 1/R for the geometric; reference/branching_reference.py.
    @ParameterizedTest(name = "{0} R={1} k={2} {3}")
    @MethodSource("referenceRows")
    void extinctionMatchesMpmath(String family, String r, String k, String method, String q,
                                 String oneMinusQ, String c1, String c2, String c3) {
        OffspringLaw law = law(family, r, k);
        double expectedQ = Double.parseDouble(q);
        double expectedU = Double.parseDouble(oneMinusQ);
        // 1e-13 relative (required: 1e-10; worst seen 5e-15), on both q and 1 - q (the latter
        // matters when q is close to 1, e.g. R = 1.000001, k = 0.001)
        assertEquals(expectedQ, law.extinctionProbability(), 1e-13 * expectedQ + Double.MIN_VALUE, "q");
        assertEquals(expectedU, law.survivalProbability(), 1e-13 * expectedU + Double.MIN_VALUE, "1 - q");
        String[] cond = {c1, c2, c3};
        for (int n = 1; n <= 3; n++) {
            if (!cond[n - 1].isEmpty()) {
                double expected = Double.parseDouble(cond[n - 1]);
                assertEquals(expected, law.conditionedMeanGenerationSize(n), 1e-13 * expected,
                    "conditioned mean, generation " + n);
            }
        }
    }

    @Test
    void knownClosedForms() {
        // Lambert W: q = -W(-2 e^-2)/2, mpmath 1.3 lambertw (value also in the CSV)
        assertEquals(0.20318786997997995384, OffspringLaw.poisson(2).extinctionProbability(), 1e-15);
        // geometric offspring (k = 1): q = 1/R, exact
        assertEquals(1 / 3.0, OffspringLaw.negativeBinomial(3, 1).extinctionProbability(), 1e-15);
        // Poisson R = 1.5, generation 1: R (1 + q) ~ 2.13 (formula with q from the CSV)
        assertEquals(1.5 * (1 + 0.41718835613418861396),
            OffspringLaw.poisson(1.5).conditionedMeanGenerationSize(1), 1e-14);
        assertEquals(1.0, OffspringLaw.poisson(1).extinctionProbability());
        assertEquals(1.0, OffspringLaw.negativeBinomial(0.7, 0.01).extinctionProbability());
        assertEquals(0.0, OffspringLaw.poisson(0.9).majorOutbreakProbability(10));
    }

    @Test
    void majorOutbreakFromSeveralIntroductions() {
        OffspringLaw law = OffspringLaw.negativeBinomial(2.5, 0.2);
        double q = law.extinctionProbability();
        for (int n = 0; n <= 20; n++) {
            assertEquals(1 - Math.pow(q, n), law.majorOutbreakProbability(n), 1e-14, "n=" + n);
        }
        // near criticality the direct form keeps accuracy: 1 - q^n ~ n (1 - q)
        OffspringLaw near = OffspringLaw.negativeBinomial(1.0001, 0.01);
        double u = near.survivalProbability();
        assertEquals(-Math.expm1(3 * Math.log1p(-u)), near.majorOutbreakProbability(3), 1e-22);
        assertTrue(near.majorOutbreakProbability(3) > 2.9 * u);
    }

    @Test
    void pgfAndDerivativeClosedForms() {
        OffspringLaw p = OffspringLaw.poisson(1.7);
        OffspringLaw nb = OffspringLaw.negativeBinomial(1.7, 0.4);
        for (double s = 0; s <= 1; s += 0.125) {
            assertEquals(Math.exp(1.7 * (s - 1)), p.pgf(s), 1e-15);
            assertEquals(1.7 * Math.exp(1.7 * (s - 1)), p.pgfDerivative(s), 1e-14);
            assertEquals(Math.pow(1 + 1.7 * (1 - s) / 0.4, -0.4), nb.pgf(s), 1e-15);
            assertEquals(1.7 * Math.pow(1 + 1.7 * (1 - s) / 0.4, -1.4), nb.pgfDerivative(s), 1e-14);
        }
        assertEquals(1.7, nb.pgfDerivative(1), 0);
        double q = nb.extinctionProbability();
        assertEquals(q, nb.pgf(q), 1e-15, "q is a fixed point");
    }

    static Stream<Arguments> randomLaws() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        return Stream.generate(() -> {
            double r = 1.0001 + 6 * rng.nextDouble();
            double k = Math.exp(Math.log(0.005) + rng.nextDouble() * Math.log(2e4));
            return Arguments.of(r, k);
        }).limit(100);
    }

    // Property (Athreya and Ney 1972): conditioning on survival cannot lower the expected
    // generation size, and it tends to R^n / (1 - q).
    @ParameterizedTest
    @MethodSource("randomLaws")
    void conditionedAtLeastUnconditioned(double r, double k) {
        for (OffspringLaw law : new OffspringLaw[] {OffspringLaw.poisson(r), OffspringLaw.negativeBinomial(r, k)}) {
            double q = law.extinctionProbability();
            assertEquals(q, law.pgf(q), 1e-12 * Math.max(q, 1e-300) + 1e-15, "fixed point");
            assertTrue(law.pgfDerivative(q) < 1, "attracting root");
            for (int n = 1; n <= 6; n++) {
                double c = law.conditionedMeanGenerationSize(n);
                assertTrue(c >= law.meanGenerationSize(n), "n=" + n);
                assertTrue(c <= law.meanGenerationSize(n) / law.survivalProbability() * (1 + 1e-12), "n=" + n);
            }
        }
    }

    @Test
    void samplerMomentsMatch() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        for (OffspringLaw law : new OffspringLaw[] {OffspringLaw.poisson(2.5),
                OffspringLaw.negativeBinomial(2.5, 0.3), OffspringLaw.negativeBinomial(1.2, 0.02),
                OffspringLaw.negativeBinomial(80, 2), OffspringLaw.negativeBinomial(60, 0.05)}) {
            // R >= 50: gamma-Poisson mixture path; R < 50: inversion path
            DiscreteSampler s = law.sampler(rng);
            int n = 400_000;
            double sum = 0;
            double sumSq = 0;
            long zeros = 0;
            for (int i = 0; i < n; i++) {
                int z = s.sample();
                sum += z;
                sumSq += (double) z * z;
                zeros += z == 0 ? 1 : 0;
            }
            double mean = sum / n;
            // mean within 4 standard errors (two-sided false alarm ~6e-5 per check)
            assertEquals(law.mean(), mean, 4 * Math.sqrt(law.variance() / n), law.toString());
            // P(Z = 0) = f(0): binomial proportion within 4 SE
            double p0 = law.pgf(0);
            assertEquals(p0, (double) zeros / n, 4 * Math.sqrt(p0 * (1 - p0) / n), law + " P(0)");
        }
    }

    // Conditioned generation means vs a direct generation-wise Monte Carlo (independent of the
    // formula): survival is declared once 300 individuals are alive in one generation; the
    // chance that such a line still dies out is q^300 (< 1e-40 for both laws here), so the error is nil.
    // Each mean within 4 standard errors: two-sided false alarm 6.3e-5 per check, 6 checks,
    // about 4e-4 for the test.
    @Test
    void conditionedMeansMatchGenerationWiseSimulation() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 7);
        for (OffspringLaw law : new OffspringLaw[] {OffspringLaw.poisson(1.5), OffspringLaw.negativeBinomial(2, 0.5)}) {
            DiscreteSampler s = law.sampler(rng);
            double[] sum = new double[4];
            double[] sumSq = new double[4];
            int kept = 0;
            while (kept < 20_000) {
                long[] z = new long[4];
                z[0] = 1;
                long alive = 1;
                int gen = 0;
                while (alive > 0 && alive < 300) {
                    long next = 0;
                    for (long i = 0; i < alive; i++) {
                        next += s.sample();
                    }
                    gen++;
                    if (gen <= 3) {
                        z[gen] = next;
                    }
                    alive = next;
                }
                if (alive == 0) {
                    continue;
                }
                if (gen < 3) { // reached 300 before generation 3: finish generations to 3
                    long cur = alive;
                    for (int g = gen + 1; g <= 3; g++) {
                        long next = 0;
                        for (long i = 0; i < cur; i++) {
                            next += s.sample();
                        }
                        z[g] = next;
                        cur = next;
                    }
                }
                kept++;
                for (int g = 1; g <= 3; g++) {
                    sum[g] += z[g];
                    sumSq[g] += (double) z[g] * z[g];
                }
            }
            for (int g = 1; g <= 3; g++) {
                double mean = sum[g] / kept;
                double se = Math.sqrt((sumSq[g] / kept - mean * mean) / kept);
                assertEquals(law.conditionedMeanGenerationSize(g), mean, 4 * se, law + " gen " + g);
            }
        }
    }

    @Test
    void rejectsBadParameters() {
        assertThrows(IllegalArgumentException.class, () -> OffspringLaw.poisson(-1));
        assertThrows(IllegalArgumentException.class, () -> OffspringLaw.poisson(Double.NaN));
        assertThrows(IllegalArgumentException.class, () -> OffspringLaw.negativeBinomial(2, 0));
        assertThrows(IllegalArgumentException.class, () -> OffspringLaw.negativeBinomial(2, Double.POSITIVE_INFINITY));
        assertThrows(IllegalArgumentException.class, () -> OffspringLaw.poisson(2).pgf(1.5));
        assertThrows(IllegalArgumentException.class, () -> OffspringLaw.poisson(0.8).conditionedMeanGenerationSize(1));
        assertThrows(IllegalArgumentException.class, () -> OffspringLaw.poisson(2).majorOutbreakProbability(-1));
        assertEquals(0, OffspringLaw.poisson(0).sample(RandomSource.XO_RO_SHI_RO_128_PP.create(1L)));
    }
}
