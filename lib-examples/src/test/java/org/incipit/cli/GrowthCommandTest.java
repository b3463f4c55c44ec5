package org.incipit.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.PoissonSampler;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.io.JsonOutput;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** End-to-end runs of {@code incipit growth}. */
class GrowthCommandTest {

    private static final long SEED = 20261201L;

    @TempDir
    Path dir;

    /** Counts c_t ~ Poisson(exp(a + r t)), t = 0 .. days-1: the model the regression assumes. */
    private Path poissonCounts(UniformRandomProvider rng, String name, double a, double r, int days)
            throws IOException {
        StringBuilder sb = new StringBuilder("day,cases\n");
        for (int t = 0; t < days; t++) {
            sb.append(t).append(',').append(PoissonSampler.of(rng, Math.exp(a + r * t)).sample()).append('\n');
        }
        Path p = dir.resolve(name);
        Files.writeString(p, sb);
        return p;
    }

    @Test
    void intervalsCoverTheTrueRateOnPoissonCounts() throws IOException {
        // 40 seeded data sets from the Poisson log-linear model itself, r = 0.12 per day over 30
        // days from exp(1) cases: the 95% profile interval should contain r in 33..40 of them
        // (P(X <= 32) = 0.0007 for X ~ Binomial(40, 0.95), scipy 1.17 binom.cdf(32, 40, 0.95)).
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        double r = 0.12;
        int cover = 0;
        int doublingCover = 0;
        for (int i = 0; i < 40; i++) {
            Path p = poissonCounts(rng, "c" + i + ".csv", 1.0, r, 30);
            CliRun run = CliRun.of("growth", "--input", p.toString(), "--json");
            assertEquals(0, run.code(), run.err());
            JsonNode j = JsonOutput.read(run.out());
            JsonNode g = j.get("growthRate");
            cover += g.get("lower").asDouble() <= r && r <= g.get("upper").asDouble() ? 1 : 0;
            JsonNode td = j.get("doublingTime");
            double t = Math.log(2) / r;
            doublingCover += td.get("lower").asDouble() <= t && t <= td.get("upper").asDouble() ? 1 : 0;
        }
        assertTrue(cover >= 33, "growth-rate intervals containing the truth: " + cover + " of 40");
        // the doubling-time interval is the image of the rate interval: same coverage
        assertEquals(cover, doublingCover);
    }

    @Test
    void jsonHasTheContractKeys() throws IOException {
        Path p = poissonCounts(RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 1), "c.csv", 2.0, 0.1, 25);
        CliRun run = CliRun.of("growth", "--input", p.toString(), "--json", "--from", "5", "--to", "20");
        assertEquals(0, run.code(), run.err());
        JsonNode j = JsonOutput.read(run.out());
        for (String k : new String[] {"estimate", "lower", "upper", "level", "method"}) {
            assertTrue(j.get("growthRate").has(k), k);
            assertTrue(j.get("doublingTime").has(k), k);
        }
        assertEquals("poisson", j.get("model").asText());
        assertEquals(5, j.get("from").asInt());
        assertEquals(20, j.get("to").asInt());
        assertEquals(16, j.get("days").asInt());
        assertTrue(j.get("converged").asBoolean());
        assertEquals(0.95, j.get("growthRate").get("level").asDouble());
        double est = j.get("growthRate").get("estimate").asDouble();
        assertEquals(Math.log(2) / est, j.get("doublingTime").get("estimate").asDouble(), 1e-12 * Math.log(2) / est);
    }

    @Test
    void tableIsReadable() throws IOException {
        Path p = poissonCounts(RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 2), "c.csv", 2.0, 0.1, 25);
        CliRun run = CliRun.of("growth", "--input", p.toString());
        assertEquals(0, run.code(), run.err());
        assertTrue(run.out().startsWith("quantity "), run.out());
        assertTrue(run.out().contains("growth rate (per day)"), run.out());
        assertTrue(run.out().contains("doubling time (days)"), run.out());
        assertTrue(run.out().contains("95% profile"), run.out());
    }

    @Test
    void datesInTheWindowFollowTheFile() throws IOException {
        Path p = dir.resolve("d.csv");
        Files.writeString(p, "day,cases\n2031-01-01,1\n2031-01-02,2\n2031-01-03,2\n2031-01-04,4\n2031-01-05,7\n"
                + "2031-01-06,9\n");
        CliRun run = CliRun.of("growth", "--input", p.toString(), "--from", "2031-01-02", "--json");
        assertEquals(0, run.code(), run.err());
        JsonNode j = JsonOutput.read(run.out());
        assertEquals(1, j.get("from").asInt());
        assertEquals("2031-01-02", j.get("fromDate").asText());
        assertEquals("2031-01-06", j.get("toDate").asText());
        run = CliRun.of("growth", "--input", p.toString(), "--from", "3");
        assertEquals(ExitCode.BAD_INPUT, run.code());
        assertEquals("incipit: --from '3' is a day number, but the times of " + p
                + " are dates; give a date (yyyy-MM-dd)" + CliRun.NL, run.err());
    }

    @Test
    void badUsage() throws IOException {
        Path p = poissonCounts(RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 3), "c.csv", 2.0, 0.1, 10);
        CliRun run = CliRun.of("growth", "--input", p.toString(), "--model", "binomial");
        assertEquals(ExitCode.BAD_INPUT, run.code());
        assertEquals("incipit: --model must be poisson or negative-binomial, was 'binomial'" + CliRun.NL, run.err());
        run = CliRun.of("growth", "--input", p.toString(), "--from", "8", "--to", "12");
        assertEquals(ExitCode.BAD_INPUT, run.code());
        assertEquals("incipit: --from/--to must give a window inside days 0 to 9 of " + p
                + " with from <= to, was 8 to 12" + CliRun.NL, run.err());
        run = CliRun.of("growth", "--input", p.toString(), "--level", "95");
        assertEquals(ExitCode.BAD_INPUT, run.code());
        assertEquals("incipit: --level must be in (0, 1), was 95.0" + CliRun.NL, run.err());
        run = CliRun.of("growth");
        assertEquals(ExitCode.BAD_INPUT, run.code());
        assertTrue(run.err().startsWith("incipit: Missing required option: '--input=FILE'"), run.err());
        Path bad = dir.resolve("bad.csv");
        Files.writeString(bad, "day,cases\n0,1\n1,x\n");
        run = CliRun.of("growth", "--input", bad.toString());
        assertEquals(ExitCode.BAD_INPUT, run.code());
        assertEquals("incipit: " + bad + ":3:2: column 'cases': 'x' is not a whole number >= 0" + CliRun.NL, run.err());
    }

    @Test
    void noGrowthSignalFailsWithExitThree() throws IOException {
        Path p = dir.resolve("z.csv");
        Files.writeString(p, "day,cases\n0,0\n1,0\n2,3\n3,0\n4,0\n");
        CliRun run = CliRun.of("growth", "--input", p.toString());
        assertTrue(run.code() == ExitCode.BAD_INPUT || run.code() == ExitCode.ESTIMATION_FAILED, run.err());
        assertTrue(run.err().startsWith("incipit: "), run.err());
    }

    @Test
    void negativeBinomialOnTheDemoCounts() throws IOException {
        Path p = dir.resolve("counts.csv");
        try (var in = GrowthCommandTest.class.getResourceAsStream(DemoCommand.RESOURCES + "counts.csv")) {
            Files.write(p, in.readAllBytes());
        }
        CliRun run = CliRun.of("growth", "--input", p.toString(), "--model", "negative-binomial", "--json");
        assertEquals(0, run.code(), run.err());
        JsonNode j = JsonOutput.read(run.out());
        assertEquals("negative-binomial", j.get("model").asText());
        assertTrue(j.get("dispersion").asDouble() > 0, j.toString());
        JsonNode poisson = JsonOutput.read(CliRun.of("growth", "--input", p.toString(), "--json").out());
        // the NB interval is at least as wide as the Poisson one (extra variance)
        double wNb = j.at("/growthRate/upper").asDouble() - j.at("/growthRate/lower").asDouble();
        double wP = poisson.at("/growthRate/upper").asDouble() - poisson.at("/growthRate/lower").asDouble();
        assertTrue(wNb >= wP, wNb + " >= " + wP);
    }
}
