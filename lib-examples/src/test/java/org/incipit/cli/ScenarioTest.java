package org.incipit.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.incipit.io.JsonOutput;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The shipped demo data are exactly what the simulator makes from the demo seed. */
class ScenarioTest {

    @TempDir
    Path dir;

    private static byte[] shipped(String name) throws IOException {
        try (InputStream s = ScenarioTest.class.getResourceAsStream(DemoCommand.RESOURCES + name)) {
            assertNotNull(s, "shipped demo file " + name);
            return s.readAllBytes();
        }
    }

    @Test
    void simulateWithDefaultsRegeneratesTheShippedFilesByteForByte() throws IOException {
        CliRun r = CliRun.of("simulate", "--out", dir.toString(), "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode j = JsonOutput.read(r.out());
        assertTrue(j.get("demoScenario").asBoolean());
        assertEquals(Scenario.FILES.size(), j.get("files").size());
        for (String f : Scenario.FILES) {
            assertArrayEquals(shipped(f), Files.readAllBytes(dir.resolve(f)), f + " differs from the shipped file");
        }
    }

    @Test
    void truthFileHoldsTheSimulationParameters() throws IOException {
        JsonNode t = JsonOutput.read(new String(shipped("truth.json"), StandardCharsets.UTF_8));
        Scenario s = Scenario.demo();
        assertEquals(s.seed(), t.get("seed").asLong());
        assertEquals(1.8, t.get("reproductionNumber").asDouble());
        // gamma generation interval: r = b (R^(1/a) - 1) solves 1 = R (b / (b + r))^a
        // (Wallinga & Lipsitch 2007, gamma closed form); a = 4, b = 2/3
        double r = (2.0 / 3) * (Math.pow(1.8, 0.25) - 1);
        assertEquals(r, t.get("growthRate").asDouble(), 1e-12 * r);
        assertEquals(Math.log(2) / r, t.get("doublingTime").asDouble(), 1e-12 * Math.log(2) / r);
        assertEquals("lognormal", t.at("/incubationPeriod/family").asText());
        assertEquals(5.5, t.at("/incubationPeriod/mean").asDouble(), 1e-12);
        assertTrue(t.at("/incubationPeriod/parameters/meanlog").isNumber(), "lower-case parameter names");
        assertTrue(t.get("place").asText().contains("invented"));
    }

    @Test
    void otherOptionsGiveOtherDataAndSayHowToRegenerate() throws IOException {
        CliRun r = CliRun.of("simulate", "--out", dir.toString(), "--seed", "7", "--traced", "20", "--json");
        assertEquals(0, r.code(), r.err());
        assertTrue(!JsonOutput.read(r.out()).get("demoScenario").asBoolean());
        String intervals = Files.readString(dir.resolve("intervals.csv"));
        assertTrue(intervals.contains("--seed 7 "), intervals.substring(0, 300));
        assertTrue(intervals.contains("\nT20,") && !intervals.contains("\nT21,"), "20 traced cases");
        CliRun again = CliRun.of("simulate", "--out", dir.resolve("b").toString(), "--seed", "7", "--traced", "20");
        assertEquals(0, again.code(), again.err());
        assertEquals(intervals, Files.readString(dir.resolve("b").resolve("intervals.csv")), "same seed, same bytes");
    }

    @Test
    void badSimulationOptionsAreBadUsage() {
        CliRun r = CliRun.of("simulate", "--out", dir.toString(), "--traced", "0");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: --traced must be >= 1 and --windows >= 0, were 0 and 80" + CliRun.NL, r.err());
        r = CliRun.of("simulate", "--out", dir.toString(), "--incubation-family", "beta");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: family must be one of gamma, weibull, lognormal, was beta" + CliRun.NL, r.err());
        r = CliRun.of("simulate");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertTrue(r.err().startsWith("incipit: Missing required option: '--out=DIR'"), r.err());
    }
}
