package org.incipit.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.distributions.GammaDelay;
import org.incipit.io.JsonOutput;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** End-to-end runs of {@code incipit delays}, {@code incubation} and {@code fatality}. */
class DelayCommandsTest {

    private static final long SEED = 20261203L;
    /** True delay: gamma, mean 10, sd 4. */
    private static final GammaDelay F = GammaDelay.ofMeanSd(10, 4);

    @TempDir
    Path dir;

    private static String f(double x) {
        return String.format(Locale.ROOT, "%.6f", x);
    }

    /** Pairs with primaries uniform on [0, 40], kept only if the secondary is by day 40 (truncation). */
    private Path truncatedPairs(UniformRandomProvider rng, String name, int n) throws IOException {
        StringBuilder sb = new StringBuilder("case,primary,secondary\n");
        int k = 0;
        while (k < n) {
            double p = 40 * rng.nextDouble();
            double s = p + F.sample(rng);
            if (s <= 40) {
                sb.append('p').append(k++).append(',').append(f(p)).append(',').append(f(s)).append('\n');
            }
        }
        Path file = dir.resolve(name);
        Files.writeString(file, sb);
        return file;
    }

    private static boolean covers(JsonNode e, double truth) {
        return e.get("lower").asDouble() <= truth && truth <= e.get("upper").asDouble();
    }

    @Test
    void truncationCorrectedIntervalsCoverTheTrueMean() throws IOException {
        // 40 seeded files of 120 right-truncated pairs: accept 33..40 intervals containing the
        // true mean (P(X <= 32) = 0.0007, X ~ Binomial(40, 0.95), scipy 1.17 binom.cdf(32, 40, 0.95)).
        // The same files without the cut-off give the naive fit, whose mean is too short on
        // average (a pair with a long delay is seen only if its primary is early).
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        int cover = 0;
        double naiveSum = 0;
        double correctedSum = 0;
        for (int i = 0; i < 40; i++) {
            Path p = truncatedPairs(rng, "d" + i + ".csv", 120);
            CliRun r = CliRun.of("delays", "--input", p.toString(), "--cutoff", "40", "--family", "gamma", "--json");
            assertEquals(0, r.code(), r.err());
            JsonNode j = JsonOutput.read(r.out());
            assertEquals("right-truncated", j.get("correction").asText());
            cover += covers(j.get("mean"), 10) ? 1 : 0;
            correctedSum += j.at("/mean/estimate").asDouble();
            CliRun naive = CliRun.of("delays", "--input", p.toString(), "--family", "gamma", "--json");
            naiveSum += JsonOutput.read(naive.out()).at("/mean/estimate").asDouble();
        }
        assertTrue(cover >= 33, "corrected intervals containing the truth: " + cover + " of 40");
        assertTrue(naiveSum / 40 < 10 && naiveSum < correctedSum,
                "ignoring truncation shortens the mean: naive average " + naiveSum / 40 + ", corrected "
                        + correctedSum / 40);
    }

    @Test
    void delaysJsonAllFamiliesAndBadUsage() throws IOException {
        Path p = truncatedPairs(RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 1), "d.csv", 80);
        CliRun r = CliRun.of("delays", "--input", p.toString(), "--cutoff", "40", "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode j = JsonOutput.read(r.out());
        assertEquals(3, j.get("fits").size());
        assertTrue(j.get("best").isTextual());
        for (JsonNode fit : j.get("fits")) {
            String fam = fit.get("family").asText();
            String[] names = fam.equals("gamma") ? new String[] {"shape", "rate"}
                    : fam.equals("weibull") ? new String[] {"shape", "scale"} : new String[] {"meanlog", "sdlog"};
            for (String n : names) {
                assertTrue(fit.get("parameters").get(n).isNumber(), fam + " " + n);
            }
            assertEquals(80, fit.get("n").asInt());
        }
        r = CliRun.of("delays", "--input", p.toString(), "--cutoff", "30");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertTrue(r.err().startsWith("incipit: " + p + ":"), r.err());
        r = CliRun.of("delays", "--input", p.toString(), "--growth-rate", "0.1");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: --growth-rate needs one --family (gamma, weibull or lognormal)" + CliRun.NL, r.err());
        r = CliRun.of("delays", "--input", p.toString(), "--family", "beta");
        assertEquals("incipit: --family must be gamma, weibull, lognormal or all, was 'beta'" + CliRun.NL, r.err());
    }

    @Test
    void growthWeightedDelaysRecoverTheIntrinsicGamma() throws IOException {
        // delays observed while primaries grow at rate r have the tilted density, for the gamma
        // Gamma(a, b + r) (docs/methods.md section 3); fitting with --growth-rate recovers (a, b)
        double r = 0.1;
        GammaDelay tilted = GammaDelay.ofShapeRate(F.shape(), F.rate() + r);
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 2);
        StringBuilder sb = new StringBuilder("case,primary,secondary\n");
        for (int i = 0; i < 300; i++) {
            sb.append('g').append(i).append(",0,").append(f(tilted.sample(rng))).append('\n');
        }
        Path p = dir.resolve("g.csv");
        Files.writeString(p, sb);
        CliRun run = CliRun.of("delays", "--input", p.toString(), "--family", "gamma", "--growth-rate", "0.1",
                "--growth-rate-ci", "0.08,0.12", "--json");
        assertEquals(0, run.code(), run.err());
        JsonNode j = JsonOutput.read(run.out());
        assertEquals("growth-weighted", j.get("correction").asText());
        assertTrue(covers(j.get("mean"), 10), j.get("mean").toString());
        JsonNode plain = JsonOutput.read(CliRun.of("delays", "--input", p.toString(), "--family", "gamma", "--json")
                .out());
        assertTrue(plain.at("/mean/upper").asDouble() < 10, "without the growth correction the mean is short");
    }

    @Test
    void incubationWindowsCoverTheTrueMean() throws IOException {
        // exposure uniform in a window [a, a + 3] independent of the incubation period X ~ F,
        // onset = exposure + X; the window is cut at onset. 40 files of 100 cases: accept 33..40.
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 3);
        int cover = 0;
        for (int k = 0; k < 40; k++) {
            StringBuilder sb = new StringBuilder("case,exposure_from,exposure_to,onset\n");
            for (int i = 0; i < 100; i++) {
                double a = 30 * rng.nextDouble();
                double e = a + 3 * rng.nextDouble();
                double onset = e + F.sample(rng);
                sb.append('w').append(i).append(',').append(f(a)).append(',').append(f(Math.min(a + 3, onset)))
                        .append(',').append(f(onset)).append('\n');
            }
            Path p = dir.resolve("w" + k + ".csv");
            Files.writeString(p, sb);
            CliRun r = CliRun.of("incubation", "--input", p.toString(), "--family", "gamma", "--json");
            assertEquals(0, r.code(), r.err());
            cover += covers(JsonOutput.read(r.out()).get("mean"), 10) ? 1 : 0;
        }
        assertTrue(cover >= 33, "incubation intervals containing the truth: " + cover + " of 40");
    }

    @Test
    void incubationOptions() throws IOException {
        Path p = dir.resolve("w.csv");
        Files.writeString(p, "case,exposure_from,exposure_to,onset\nA,0,2,7\nB,1,1,6\nC,3,5,12\nD,0,4,9\nE,2,3,8\n");
        CliRun r = CliRun.of("incubation", "--input", p.toString(), "--family", "gamma", "--window", "uniform",
                "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode u = JsonOutput.read(r.out());
        assertEquals("uniform", u.get("window").asText());
        JsonNode i = JsonOutput.read(CliRun.of("incubation", "--input", p.toString(), "--family", "gamma",
                "--json").out());
        // the uniform model differs from interval censoring by a constant: same estimates
        // (IncubationEstimator documentation)
        assertEquals(i.at("/mean/estimate").asDouble(), u.at("/mean/estimate").asDouble(),
                1e-6 * i.at("/mean/estimate").asDouble());
        r = CliRun.of("incubation", "--input", p.toString(), "--window", "growth");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: --window growth needs --growth-rate" + CliRun.NL, r.err());
        r = CliRun.of("incubation", "--input", p.toString(), "--window", "growth", "--growth-rate", "0.1",
                "--family", "gamma", "--json");
        assertEquals(0, r.code(), r.err());
        r = CliRun.of("incubation", "--input", p.toString(), "--window", "box");
        assertEquals("incipit: --window must be interval, uniform or growth, was 'box'" + CliRun.NL, r.err());
    }

    @Test
    void fatalityRatiosFollowTheirFormulas() throws IOException {
        // 10 days of counts; the adjusted ratio is D / sum_t c_t F(T - t + 1) with T the last day
        // (Nishiura et al. 2009, docs/methods.md section 5), computed here by hand
        int[] cases = {2, 3, 5, 8, 12, 18, 25, 30, 40, 52};
        int[] deaths = {0, 0, 0, 0, 1, 0, 1, 2, 1, 3};
        int[] recoveries = {0, 0, 0, 1, 2, 4, 6, 9, 12, 15};
        StringBuilder sb = new StringBuilder("day,cases,deaths,recoveries\n");
        long c = 0;
        long d = 0;
        long rec = 0;
        double u = 0;
        for (int t = 0; t < cases.length; t++) {
            sb.append(t).append(',').append(cases[t]).append(',').append(deaths[t]).append(',').append(recoveries[t])
                    .append('\n');
            c += cases[t];
            d += deaths[t];
            rec += recoveries[t];
            u += cases[t] * F.cdf(9 - t + 1);
        }
        Path p = dir.resolve("c.csv");
        Files.writeString(p, sb);
        CliRun r = CliRun.of("fatality", "--input", p.toString(), "--delay-family", "gamma", "--delay-mean", "10",
                "--delay-sd", "4", "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode j = JsonOutput.read(r.out());
        assertEquals((double) d / c, j.get("crude").asDouble(), 1e-15);
        assertEquals((double) d / (d + rec), j.get("resolved").asDouble(), 1e-15);
        assertEquals(d / u, j.at("/adjusted/estimate").asDouble(), 1e-12 * d / u);
        assertTrue(j.at("/adjusted/lower").asDouble() < d / u && d / u < j.at("/adjusted/upper").asDouble());
        r = CliRun.of("fatality", "--input", p.toString(), "--delay-family", "gamma", "--delay-mean", "10",
                "--delay-sd", "0");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: --delay-sd must be finite and > 0, was 0.0" + CliRun.NL, r.err());
        // with an onset-to-recovery delay G (gamma, mean 14, sd 5): the score of the two-outcome
        // likelihood d log p - p uD + rec log(1 - p) - (1 - p) uR vanishes where
        // (uD - uR) p^2 - (uD - uR + d + rec) p + d = 0 (docs/methods.md section 5; solved by hand)
        GammaDelay g = GammaDelay.ofMeanSd(14, 5);
        double uR = 0;
        for (int t = 0; t < cases.length; t++) {
            uR += cases[t] * g.cdf(9 - t + 1);
        }
        double delta = u - uR;
        double bq = delta + d + rec;
        double pHat = (bq - Math.sqrt(bq * bq - 4 * delta * d)) / (2 * delta);
        r = CliRun.of("fatality", "--input", p.toString(), "--delay-family", "gamma", "--delay-mean", "10",
                "--delay-sd", "4", "--recovery-family", "gamma", "--recovery-mean", "14", "--recovery-sd", "5", "--json");
        assertEquals(0, r.code(), r.err());
        j = JsonOutput.read(r.out());
        assertEquals(pHat, j.at("/resolvedAdjusted/estimate").asDouble(), 1e-10);
        assertTrue(j.at("/resolvedAdjusted/lower").asDouble() < pHat && pHat < j.at("/resolvedAdjusted/upper").asDouble());
        assertEquals(14, j.at("/recoveryDelay/mean").asDouble(), 0);
        r = CliRun.of("fatality", "--input", p.toString(), "--delay-family", "gamma", "--delay-mean", "10",
                "--delay-sd", "4", "--recovery-family", "gamma", "--recovery-mean", "14");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: --recovery-family, --recovery-mean and --recovery-sd go together; give all three or none"
                + CliRun.NL, r.err());
        Path norec = dir.resolve("nr.csv");
        Files.writeString(norec, "day,cases,deaths\n0,3,0\n1,4,1\n");
        r = CliRun.of("fatality", "--input", norec.toString(), "--delay-family", "gamma", "--delay-mean", "10",
                "--delay-sd", "4", "--recovery-family", "gamma", "--recovery-mean", "14", "--recovery-sd", "5");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: " + norec + ": --recovery-family needs a recoveries column" + CliRun.NL, r.err());
        Path nod = dir.resolve("n.csv");
        Files.writeString(nod, "day,cases\n0,3\n1,4\n");
        r = CliRun.of("fatality", "--input", nod.toString(), "--delay-family", "gamma", "--delay-mean", "10",
                "--delay-sd", "4");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: " + nod + ": a fatality ratio needs a deaths column" + CliRun.NL, r.err());
    }
}
