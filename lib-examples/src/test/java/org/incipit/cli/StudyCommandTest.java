package org.incipit.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.awt.image.BufferedImage;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import javax.imageio.ImageIO;
import org.incipit.core.study.ScenarioSpec;
import org.incipit.core.study.StudyListener;
import org.incipit.core.study.StudyRegistry;
import org.incipit.core.study.StudyTables;
import org.incipit.io.JsonOutput;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** End-to-end runs of {@code incipit study}. */
class StudyCommandTest {

    @TempDir
    Path dir;

    record Run(int code, String out, String err) {
    }

    private static Run run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(new PrintWriter(out), new PrintWriter(err), args);
        return new Run(code, out.toString(), err.toString());
    }

    private static final String SCENARIO = String.join("\n",
            "name = tiny",
            "generator = sample",
            "estimators = normal-mean-t, normal-variance-mle",
            "family = normal",
            "mean = 1",
            "sd = 0.5",
            "truth.variance = 0.25",
            "sizes = 1, 4, 8",
            "replicates = 40",
            "seed = 99",
            "");

    @Test
    void writesCsvMarkdownAndPngIdenticallyForOneAndTwoThreads() throws IOException {
        Path file = dir.resolve("tiny.scenario");
        Files.writeString(file, SCENARIO, StandardCharsets.UTF_8);
        Run one = run("study", "--scenario", file.toString(), "--out", dir.resolve("one").toString(), "--threads", "1");
        assertEquals(0, one.code(), one.err());
        Run two = run("study", "--scenario", file.toString(), "--out", dir.resolve("two").toString(), "--threads", "2");
        assertEquals(0, two.code(), two.err());
        String csv = Files.readString(dir.resolve("one/tiny-summary.csv"));
        assertEquals(csv, Files.readString(dir.resolve("two/tiny-summary.csv")));
        // the file is the library's table of the same study
        String expected = StudyTables.csv(StudyRegistry.standard().study(ScenarioSpec.parse(SCENARIO, "x"))
                .run(Runnable::run, StudyListener.NONE).summaries());
        assertEquals(expected, csv);
        assertEquals(7, csv.lines().count());
        // n = 1 cannot give a t interval or a variance: every replicate fails, with its reason
        assertTrue(csv.contains("normal-mean-t,mean,1,1.0,0.95,40,0,40,1.0,NA,"), csv);
        assertTrue(csv.contains("IllegalArgumentException: need at least 2 values, had 1 (40)"), csv);
        String md = Files.readString(dir.resolve("one/tiny-summary.md"));
        assertTrue(md.startsWith("# Simulation study: tiny\n"), md);
        assertTrue(md.contains("- normal-mean-t, mean, n = 1: 40 × IllegalArgumentException: need at least 2 values"));
        BufferedImage img = ImageIO.read(dir.resolve("one/tiny-summary.png").toFile());
        assertEquals(800, img.getWidth());
        assertTrue(one.err().contains("incipit: study tiny: 120/120 replicates, 80 failed estimates"), one.err());
        assertTrue(one.err().contains("incipit: 80 estimates failed; reasons in"), one.err());
        assertTrue(one.out().contains("normal-variance-mle"), one.out());
    }

    @Test
    void shippedScenariosRunByNameAndJson() throws IOException {
        for (String name : StudyCommand.SHIPPED) {
            // parse and resolve every shipped scenario (a full run takes a few seconds each)
            try (var in = StudyCommand.class.getResourceAsStream("/org/incipit/scenarios/" + name + ".scenario")) {
                ScenarioSpec spec = ScenarioSpec.parse(new String(in.readAllBytes(), StandardCharsets.UTF_8), name);
                assertEquals(name, spec.scenario().name());
                StudyRegistry.standard().study(spec);
            }
        }
        Path file = dir.resolve("exp.scenario");
        Files.writeString(file, String.join("\n", "name = exp", "generator = sample",
                "estimators = exponential-rate-mle", "family = exponential", "truth.rate = 2", "sizes = 3",
                "replicates = 10", "seed = 1"), StandardCharsets.UTF_8);
        Run r = run("study", "--scenario", file.toString(), "--out", dir.toString(), "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode j = JsonOutput.read(r.out());
        assertEquals("exp", j.get("scenario").asText());
        assertEquals(1, j.get("summaries").size());
        assertEquals(0, j.get("summaries").get(0).get("failures").asInt());
        assertTrue(Files.exists(dir.resolve("exp-summary.png")));
    }

    @Test
    void badScenariosExitTwoWithFileAndLine() throws IOException {
        Path file = dir.resolve("bad.scenario");
        Files.writeString(file, SCENARIO.replace("sizes = 1, 4, 8", "sizes = 1, x"), StandardCharsets.UTF_8);
        Run r = run("study", "--scenario", file.toString(), "--out", dir.toString());
        assertEquals(2, r.code());
        assertEquals("incipit: " + file + ":8: 'sizes' must hold integers, had 'x'" + System.lineSeparator(), r.err());
        r = run("study", "--scenario", dir.resolve("none").toString());
        assertEquals(2, r.code());
        assertTrue(r.err().contains("no such scenario file (shipped scenarios: "
                + String.join(", ", StudyCommand.SHIPPED) + ")"), r.err());
        Files.writeString(file, SCENARIO.replace("generator = sample", "generator = outbreak"), StandardCharsets.UTF_8);
        r = run("study", "--scenario", file.toString(), "--out", dir.toString());
        assertEquals(2, r.code());
        assertTrue(r.err().startsWith("incipit: unknown generator 'outbreak'; known: [") && r.err().contains("sample"),
                r.err());
        r = run("study", "--scenario", file.toString(), "--threads", "0");
        assertEquals(2, r.code());
        assertTrue(List.of(r.err().split(System.lineSeparator())).contains("incipit: --threads must be >= 1, was 0"));
    }
}
