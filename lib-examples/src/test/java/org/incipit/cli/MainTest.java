package org.incipit.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;
import org.incipit.core.EstimationException;
import org.incipit.io.JsonOutput;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/** End-to-end runs of the command line with captured streams. */
class MainTest {

    private static final String NL = System.lineSeparator();

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

    private Path file(String name, String text) throws IOException {
        Path p = dir.resolve(name);
        Files.writeString(p, text, StandardCharsets.UTF_8);
        return p;
    }

    @Test
    void helpListsCommandsCautionAndExitCodes() {
        Run r = run("--help");
        assertEquals(0, r.code());
        assertEquals("", r.err());
        assertTrue(r.out().startsWith("Usage: incipit [-hV] [COMMAND]" + NL), r.out());
        assertTrue(r.out().matches("(?s).*\\n  check +Read an input file and describe what was read.*"), r.out());
        assertTrue(r.out().contains("Model-based estimates from early, sparse data inform but do not replace"));
        assertTrue(r.out().contains("Exit codes: 0 success, 1 internal error, 2 bad usage or input," + NL
                + "            3 estimation failed." + NL));
        for (String line : r.out().split(NL)) {
            assertTrue(line.length() <= 80, "help fits 80 columns: " + line);
        }
    }

    @Test
    void helpOfCheckDescribesTheFileKinds() {
        Run r = run("help", "check");
        assertEquals(0, r.code());
        assertTrue(r.out().startsWith("Usage: incipit check "), r.out());
        assertTrue(r.out().contains("intervals   case,end,start[,kind][,exposures_total]"));
        assertTrue(r.out().contains("--skip-bad-rows"));
        assertTrue(r.out().contains("--json"));
        assertTrue(r.out().contains("--origin=DATE"));
        for (String line : r.out().split(NL)) {
            assertTrue(line.length() <= 80, "help fits 80 columns: " + line);
        }
    }

    @Test
    void versionComesFromTheBuild() {
        Run r = run("--version");
        assertEquals(0, r.code());
        assertTrue(r.out().matches("incipit \\d+\\.\\d+\\.\\d+(-SNAPSHOT)?" + NL + "Java .*" + NL), r.out());
    }

    @Test
    void noCommandIsBadUsage() {
        Run r = run();
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertTrue(r.err().startsWith("incipit: a command is required" + NL + "Usage: incipit"), r.err());
        assertEquals("", r.out());
    }

    @Test
    void unknownOptionIsBadUsage() {
        Run r = run("--bogus");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: Unknown option: '--bogus'" + NL
                + "Try 'incipit --help' for more information." + NL, r.err());
    }

    @Test
    void badOptionValueIsBadUsage() throws IOException {
        Path p = file("i.csv", "case,end,start\nA,1,1\n");
        Run r = run("check", "intervals", p.toString(), "--origin", "March");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: Invalid value for option '--origin': 'March' is not a date (yyyy-MM-dd)" + NL
                + "Try 'incipit check --help' for more information." + NL, r.err());
        r = run("check", "sideways", p.toString());
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertTrue(r.err().startsWith("incipit: Invalid value for positional parameter at index 0 (KIND): "
                + "expected one of [intervals, delays, incubation, counts]"), r.err());
    }

    @Test
    void checkPrintsAnAlignedTable() throws IOException {
        Path p = file("i.csv", "case,end,start\nA,2024-03-10,2024-03-05\nA,2024-03-10,2024-03-02\n"
                + "B,2024-03-12,2024-03-09\n");
        Run r = run("check", "intervals", p.toString());
        assertEquals(0, r.code(), r.err());
        assertEquals("", r.err());
        assertEquals("item                        value" + NL
                + "file                        " + p + NL
                + "kind                        intervals" + NL
                + "dataRows                    3" + NL
                + "times                       dates" + NL
                + "origin                      2024-03-02 (day 0)" + NL
                + "cases                       2" + NL
                + "candidates                  3" + NL
                + "casesWithSeveralCandidates  1" + NL
                + "casesWithTotalExposures     0" + NL
                + "categories                  none" + NL
                + "endRange                    day 8 (2024-03-10) to day 10 (2024-03-12)" + NL, r.out());
    }

    @Test
    void checkWritesOneJsonObject() throws IOException {
        Path p = file("d.csv", "case,primary,secondary\nA,1,4\nB,5,\n");
        Run r = run("check", "delays", p.toString(), "--cutoff", "9", "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode j = JsonOutput.read(r.out());
        assertEquals("check", j.get("command").asText());
        assertEquals("delays", j.get("kind").asText());
        assertEquals(2, j.get("pairs").asInt());
        assertEquals(1, j.get("censored").asInt());
        assertEquals(9.0, j.get("cutoff").asDouble());
        assertTrue(j.get("origin").isNull());
        assertEquals(0, j.get("skipped").size());
    }

    @Test
    void checkOtherKinds() throws IOException {
        Run r = run("check", "incubation",
                file("w.csv", "case,exposure_from,exposure_to,onset\nA,1,3,8\nB,2,2,4\n").toString(), "--json");
        assertEquals(0, r.code(), r.err());
        assertEquals(1, JsonOutput.read(r.out()).get("singleExposureTime").asInt());
        r = run("check", "counts", file("c.csv", "day,cases,deaths\n0,1,0\n1,3,1\n").toString(), "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode j = JsonOutput.read(r.out());
        assertEquals(4, j.get("totalCases").asInt());
        assertEquals(1, j.get("totalDeaths").asInt());
    }

    static Stream<Arguments> badInputs() {
        return Stream.of(
                Arguments.of("intervals", "", ": empty file (expected a header line: case,end,start)"),
                Arguments.of("intervals", "case,end,start\n", ": no data rows (only a header on line 1)"),
                Arguments.of("intervals", "case,start\nA,1\n",
                        ":1: header: missing column 'end' (required columns: case,end,start)"),
                Arguments.of("intervals", "case,end,start\nA,10,1O\n",
                        ":2:3: column 'start': cannot read '1O' as a day number or a date (yyyy-MM-dd)"),
                Arguments.of("intervals", "case,end,start\nA,2024-01-10,2024-01-01\nB,12,3\n",
                        ":3:2: column 'end' mixes day numbers and dates: line 2 has a date, this line has a day number"),
                Arguments.of("intervals", "case,end,start\nA,2024-01-10,2024-01-12\n",
                        ":2:3: case 'A': start '2024-01-12' is after end '2024-01-10'"),
                Arguments.of("intervals", "case,end,start\nA,10,1\nB,9,1\nA,12,2\n",
                        ":4:2: case 'A': end '12' disagrees with end '10' on line 2"),
                Arguments.of("delays", "case,primary,secondary\nA,7,4\n",
                        ":2:3: case 'A': secondary '4' is before primary '7'"),
                Arguments.of("incubation", "case,exposure_from,exposure_to,onset\nA,1,x,3\n",
                        ":2:3: column 'exposure_to': cannot read 'x' as a day number or a date (yyyy-MM-dd)"),
                Arguments.of("counts", "day,cases\n2024-01-01,4\n2024-01-03,5\n",
                        ":3:1: day '2024-01-03' does not follow day '2024-01-01' (line 2): days must be consecutive"
                                + " and increasing; enter days without cases as explicit zeros"));
    }

    @ParameterizedTest
    @MethodSource("badInputs")
    void badInputExitsWithTwoAndNamesFileLineColumn(String kind, String content, String expected) throws IOException {
        Path p = file(kind + ".csv", content);
        Run r = run("check", kind, p.toString());
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: " + p + expected + NL, r.err());
        assertEquals("", r.out());
    }

    @Test
    void missingFile() {
        Path p = dir.resolve("nope.csv");
        Run r = run("check", "counts", p.toString());
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: " + p + ": cannot read the file (NoSuchFileException: " + p + ")" + NL, r.err());
    }

    @Test
    void badCutoffIsBadUsage() throws IOException {
        Path d = file("d.csv", "case,primary,secondary\nA,2024-01-01,2024-01-04\n");
        Run r = run("check", "delays", d.toString(), "--cutoff", "30");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: cut-off '30' is a day number, but the file's times are dates; "
                + "give it as a date (yyyy-MM-dd)" + NL, r.err());
        r = run("check", "intervals", d.toString(), "--cutoff", "30");
        assertEquals(ExitCode.BAD_INPUT, r.code());
        assertEquals("incipit: --cutoff applies only to delays files" + NL, r.err());
    }

    @Test
    void skippedRowsAreListedOnStderrWithTheirCount() throws IOException {
        Path p = file("i.csv", "case,end,start\nA,10,1\nB,10,11\nC,x,1\nD,4,4\n");
        Run r = run("check", "intervals", p.toString(), "--skip-bad-rows", "--json");
        assertEquals(0, r.code(), r.err());
        assertEquals(p + ":3: case 'B': start '11' is after end '10'" + NL
                + p + ":4: column 'end': cannot read 'x' as a day number or a date (yyyy-MM-dd)" + NL
                + "incipit: skipped 2 of 4 data rows of " + p + NL, r.err());
        JsonNode j = JsonOutput.read(r.out());
        assertEquals(2, j.get("cases").asInt());
        assertEquals(2, j.get("skipped").size());
        assertEquals(3, j.get("skipped").get(0).get("line").asInt());
    }

    @Command(name = "failing")
    static final class Failing extends AbstractCommand {
        @Override
        protected int run() {
            throw new EstimationException("maximiser did not converge after 200 iterations");
        }
    }

    @Command(name = "broken")
    static final class Broken extends AbstractCommand {
        @Override
        protected int run() {
            throw new IllegalStateException("a bug");
        }
    }

    @Test
    void everySubcommandIsRegisteredUnderItsOwnNameInOrder() {
        CommandLine cl = Main.commandLine(new PrintWriter(new StringWriter()), new PrintWriter(new StringWriter()));
        assertEquals(Main.SUBCOMMANDS, java.util.List.copyOf(cl.getSubcommands().keySet()));
        for (String name : Main.SUBCOMMANDS) {
            assertEquals(name, Main.subcommand(name).getClass().getAnnotation(Command.class).name());
        }
    }

    @Test
    void aRunOfOneSubcommandReportsLikeTheFullCommandLine() {
        // Main.run registers only the subcommand named first; help and errors must not change
        Run one = run("intervals", "--level", "x");
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.commandLine(new PrintWriter(out, true), new PrintWriter(err, true))
                .execute("intervals", "--level", "x");
        assertEquals(new Run(code, out.toString(), err.toString()), one);
        assertEquals(ExitCode.BAD_INPUT, one.code());
        assertTrue(one.err().contains("Try 'incipit intervals --help'"), one.err());
    }

    @Test
    void estimationFailureExitsWithThreeAndBugsWithOne() {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = Main.commandLine(new PrintWriter(out, true), new PrintWriter(err, true));
        cl.addSubcommand(new Failing());
        cl.addSubcommand(new Broken());
        assertEquals(ExitCode.ESTIMATION_FAILED, cl.execute("failing"));
        assertEquals("incipit: estimation failed: maximiser did not converge after 200 iterations" + NL,
                err.toString());
        err.getBuffer().setLength(0);
        assertEquals(ExitCode.INTERNAL, cl.execute("broken"));
        assertTrue(err.toString().startsWith("incipit: internal error (please report): "
                + "java.lang.IllegalStateException: a bug" + NL), err.toString());
    }
}
