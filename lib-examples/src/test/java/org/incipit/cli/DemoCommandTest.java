package org.incipit.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.incipit.io.JsonOutput;
import org.incipit.report.HtmlReport;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code incipit demo} and {@code incipit analyse}: the report folder and its contents. */
class DemoCommandTest {

    @TempDir
    static Path dir;

    static CliRun demo;
    static Path out;

    @BeforeAll
    static void runDemoOnce() {
        out = dir.resolve("demo");
        demo = CliRun.of("demo", "--out", out.toString(), "--json");
    }

    @Test
    void demoWritesTheReportFolder() {
        assertEquals(0, demo.code(), demo.err());
        for (String f : new String[] {"report.html", "results.json", "figures/growth.png",
            "figures/reproduction-comparison.png", "figures/reproduction-over-time.png",
            "figures/intervals-fit.png", "figures/intervals-comparison.png", "figures/delays-fit.png",
            "figures/delays-comparison.png", "figures/incubation-fit.png", "figures/incubation-comparison.png",
            "figures/fatality-comparison.png", "data/counts.csv",
            "data/truth.json"}) {
            assertTrue(Files.isRegularFile(out.resolve(f)), f);
        }
        assertTrue(demo.err().contains("incipit: [1/"), "progress on stderr: " + demo.err());
    }

    @Test
    void demoJsonOnStdoutIsTheResultsFile() throws IOException {
        JsonNode stdout = JsonOutput.read(demo.out());
        JsonNode file = JsonOutput.read(Files.readString(out.resolve("results.json")));
        assertEquals(file, stdout);
        assertEquals(0, file.get("failures").size(), file.get("failures").toString());
        assertEquals(HtmlReport.CAUTION, file.get("caution").asText());
        assertTrue(file.get("truth").get("place").asText().contains("invented"));
    }

    @Test
    void demoEstimatesCoverTheTruthOfTheShippedScenario() throws IOException {
        JsonNode j = JsonOutput.read(Files.readString(out.resolve("results.json")));
        JsonNode t = j.get("truth");
        assertCovers(j.at("/growth/growthRate"), t.get("growthRate").asDouble(), "growth rate");
        assertCovers(j.at("/reproduction/reproductionNumber"), t.get("reproductionNumber").asDouble(), "R");
        JsonNode naive = j.at("/reproduction/naiveBackwardTraced");
        assertTrue(naive.get("estimate").asDouble() < j.at("/reproduction/reproductionNumber/estimate").asDouble(),
                "backward-traced interval used as intrinsic gives a smaller R (methods, section 3)");
        assertTrue(j.get("reproductionOverTime").size() > 10);
        // the shipped intervals are exposure-to-onset durations: truth = the incubation period
        double mean = t.at("/incubationPeriod/mean").asDouble();
        String best = j.at("/intervals/corrected/best").asText();
        for (JsonNode f : j.at("/intervals/corrected/fits")) {
            if (f.get("family").asText().equals(best)) {
                assertCovers(f.get("mean"), mean, "corrected mean interval");
                assertCovers(f.get("transmissionProbability"), t.at("/contacts/infectionProbability").asDouble(),
                        "transmission probability");
            }
        }
        assertTrue(j.at("/intervals/naive/nearest/mean/upper").asDouble() < mean, "nearest start: too short");
        assertTrue(j.at("/intervals/naive/earliest/mean/lower").asDouble() > mean, "earliest start: too long");
        assertCovers(best(j.at("/incubation/corrected")).get("mean"), mean, "incubation from windows");
        double death = t.at("/onsetToDeath/mean").asDouble();
        assertCovers(best(j.at("/delays/corrected")).get("mean"), death, "onset-to-death mean");
        assertTrue(best(j.at("/delays/naive")).at("/mean/estimate").asDouble() < death, "truncation ignored: short");
        double p = t.get("fatalityRatio").asDouble();
        assertCovers(j.at("/fatality/adjusted"), p, "adjusted fatality ratio");
        assertTrue(j.at("/fatality/crudeInterval/upper").asDouble() < p, "crude ratio too low while deaths are due");
    }

    static JsonNode best(JsonNode fits) {
        if (!fits.has("fits")) {
            return fits;
        }
        for (JsonNode f : fits.get("fits")) {
            if (f.get("family").asText().equals(fits.get("best").asText())) {
                return f;
            }
        }
        throw new AssertionError("best fit missing in " + fits);
    }

    static void assertCovers(JsonNode e, double truth, String what) {
        assertTrue(e.get("lower").asDouble() <= truth && truth <= e.get("upper").asDouble(),
                what + ": " + e + " should contain " + truth);
    }

    @Test
    void reportIsSelfContainedWithCautionAssumptionsAndFigures() throws IOException {
        String html = Files.readString(out.resolve("report.html"), StandardCharsets.UTF_8);
        assertTrue(html.contains("class=\"caution\""), "caution");
        assertTrue(html.contains("inform but do not replace the judgement of the responsible public-health "
                + "authority"), "caution text");
        assertTrue(html.contains("invented"), "scenario is said to be invented");
        Matcher m = Pattern.compile("<img src=\"data:image/png;base64,").matcher(html);
        int figures = 0;
        while (m.find()) {
            figures++;
        }
        try (var pngs = Files.list(out.resolve("figures"))) {
            assertEquals(pngs.count(), figures, "every figure embedded");
        }
        int sections = html.split("<h2>", -1).length - 1;
        int assumptions = html.split("class=\"assumptions\"", -1).length - 1;
        assertEquals(sections, assumptions, "every section states its assumptions");
        assertTrue(html.contains("<th>true value</th>"), "true values beside the estimates");
        assertTrue(!html.contains("src=\"http"), "no external resources");
    }

    @Test
    void demoTableSummarises() {
        CliRun r = CliRun.of("demo", "--out", dir.resolve("again").toString());
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().contains("report.html"), r.out());
        assertTrue(r.out().contains("growth rate (per day)"), r.out());
        assertTrue(r.out().contains("reproduction number"), r.out());
    }

    @Test
    void analyseOnCountsOnlyLeavesOutTheReproductionNumber() {
        Path o = dir.resolve("analyse");
        CliRun r = CliRun.of("analyse", "--counts", out.resolve("data/counts.csv").toString(), "--out", o.toString(),
                "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode j = JsonOutput.read(r.out());
        assertTrue(j.get("growth").get("growthRate").isObject());
        assertTrue(j.get("reproduction").isNull());
        assertTrue(!j.has("truth"));
        assertTrue(Files.isRegularFile(o.resolve("report.html")));
    }

    @Test
    void analyseWithTheGenerationIntervalGivesR() {
        Path o = dir.resolve("analyse-r");
        CliRun r = CliRun.of("analyse", "--counts", out.resolve("data/counts.csv").toString(), "--out", o.toString(),
                "--generation-mean", "6", "--generation-sd", "3", "--generation-mean-ci", "5,7", "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode j = JsonOutput.read(r.out());
        assertTrue(j.at("/reproduction/reproductionNumber/estimate").asDouble() > 1);
    }

    @Test
    void analyseBadUsage() throws IOException {
        Path o = dir.resolve("bad");
        CliRun r = CliRun.of("analyse", "--counts", out.resolve("data/counts.csv").toString(), "--out", o.toString(),
                "--generation-mean", "6");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: give both --generation-mean and --generation-sd, or neither" + CliRun.NL, r.err());
        r = CliRun.of("analyse", "--out", o.toString());
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertTrue(r.err().startsWith("incipit: Missing required option: '--counts=FILE'"), r.err());
        Path bad = dir.resolve("bad.csv");
        Files.writeString(bad, "day,cases\n0,1\n2,3\n");
        r = CliRun.of("analyse", "--counts", bad.toString(), "--out", o.toString());
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertTrue(r.err().startsWith("incipit: " + bad + ":3:1: day '2' does not follow day '0'"), r.err());
    }

    @Test
    void analyseOnAllFilesGivesEverySectionWithoutTruth() {
        Path o = dir.resolve("analyse-all");
        Path data = out.resolve("data");
        CliRun r = CliRun.of("analyse", "--counts", data.resolve("counts.csv").toString(),
                "--intervals", data.resolve("intervals.csv").toString(),
                "--incubation", data.resolve("incubation.csv").toString(),
                "--delays", data.resolve("delays.csv").toString(),
                "--generation-mean", "6", "--generation-sd", "3", "--out", o.toString(), "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode j = JsonOutput.read(r.out());
        assertEquals(0, j.get("failures").size(), j.get("failures").toString());
        for (String k : new String[] {"growth", "reproduction", "reproductionOverTime", "intervals", "incubation",
            "delays", "fatality"}) {
            assertTrue(j.has(k) && !j.get(k).isNull(), k);
        }
        // without --cutoff the latest death in the file is the cut-off (2031-05-31 in the demo data)
        JsonNode demo = JsonOutput.read(demo().out());
        assertEquals(demo.at("/delays/cutoff").asDouble(), j.at("/delays/cutoff").asDouble());
        assertTrue(!j.has("truth"));
    }

    private static CliRun demo() {
        return DemoCommandTest.demo;
    }
}
