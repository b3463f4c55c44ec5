package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.ForkJoinPool;
import org.incipit.core.study.ScenarioSpec;
import org.incipit.core.study.Study;
import org.incipit.core.study.StudyRegistry;
import org.incipit.core.study.StudyResult;
import org.incipit.core.study.StudySummary;
import org.incipit.core.study.StudyTables;
import org.incipit.io.InputException;
import org.incipit.io.TextTable;
import org.incipit.report.Charts;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code incipit study --scenario FILE [--out DIR] [--threads N]}: runs the simulation study a
 * scenario file describes (docs/scenarios.md) and writes {@code NAME-summary.csv},
 * {@code NAME-summary.md} and {@code NAME-summary.png} into the output folder, with progress
 * on stderr. Generators and estimators come from
 * {@link StudyRegistry#standard()}.
 */
@Command(name = "study",
        mixinStandardHelpOptions = true,
        description = {"Run a simulation study of estimator performance (bias, coverage,",
            "interval width) described by a scenario file.", ""},
        footer = {"",
            "Scenario file: 'key = value' lines (see docs/scenarios.md), e.g.",
            "  name = normal-calibration     generator = sample",
            "  estimators = normal-mean-t    family = normal",
            "  mean = 5   sd = 2   sizes = 5, 10, 20   replicates = 1000",
            "  seed = 20261201",
            "Shipped scenarios (give the name instead of a file):",
            "  normal-calibration, exponential-calibration, ambiguous-open-gamma,",
            "  ambiguous-open-weibull, ambiguous-open-lognormal, ambiguous-known-total-gamma,",
            "  ambiguous-poisson-total-gamma, ambiguous-complete-gamma, ambiguous-open-gamma-em,",
            "  growth-poisson, growth-negative-binomial, euler-lotka, delays-truncated-lognormal,",
            "  delays-truncated-daily-lognormal, delays-censored-lognormal, delays-truncated-gamma,",
            "  delays-truncated-daily-gamma, delays-censored-gamma, incubation-uniform-lognormal,",
            "  incubation-growing-lognormal, backward-intervals-gamma, fatality-growing",
            "Results are identical for any --threads."})
public final class StudyCommand extends AbstractCommand {

    /** Scenarios shipped as resources, runnable by name. */
    static final List<String> SHIPPED = List.of("normal-calibration", "exponential-calibration",
            "ambiguous-open-gamma", "ambiguous-open-weibull", "ambiguous-open-lognormal",
            "ambiguous-known-total-gamma", "ambiguous-poisson-total-gamma", "ambiguous-complete-gamma",
            "ambiguous-open-gamma-em",
            "growth-poisson", "growth-negative-binomial", "euler-lotka", "delays-truncated-lognormal",
            "delays-truncated-daily-lognormal", "delays-censored-lognormal", "delays-truncated-gamma",
            "delays-truncated-daily-gamma", "delays-censored-gamma", "incubation-uniform-lognormal",
            "incubation-growing-lognormal", "backward-intervals-gamma", "fatality-growing");

    @Option(names = "--scenario", required = true, paramLabel = "FILE",
            description = "Scenario file, or the name of a shipped scenario.")
    String scenario;

    @Option(names = "--out", paramLabel = "DIR", defaultValue = ".",
            description = "Output folder (created if missing; default: ${DEFAULT-VALUE}).")
    Path out;

    @Option(names = "--threads", paramLabel = "N",
            description = "Worker threads (default: the number of processors).")
    Integer threads;

    /** Creates the command. */
    public StudyCommand() {
    }

    @Override
    protected int run() throws IOException {
        int n = threads == null ? Runtime.getRuntime().availableProcessors() : threads;
        if (n < 1) {
            throw new IllegalArgumentException("--threads must be >= 1, was " + n);
        }
        ScenarioSpec spec = read();
        Study<?> study = StudyRegistry.standard().study(spec);
        String name = spec.scenario().name();
        int total = study.sampleSizes().length * study.replicates();
        err().println("incipit: study " + name + ": " + total + " replicates (" + study.sampleSizes().length
                + " sample sizes x " + study.replicates() + "), estimators " + String.join(", ",
                study.estimatorNames()) + ", " + n + (n == 1 ? " thread" : " threads"));
        err().flush();
        int step = Math.max(1, total / 10);
        ForkJoinPool pool = new ForkJoinPool(n);
        StudyResult result;
        try {
            result = study.run(pool, (done, all, failed) -> {
                if (done % step == 0 || done == all) {
                    err().println("incipit: study " + name + ": " + done + "/" + all + " replicates, " + failed
                            + " failed estimates");
                    err().flush();
                }
            });
        } finally {
            pool.shutdown();
        }
        List<StudySummary> rows = result.summaries();
        Files.createDirectories(out);
        Path csv = out.resolve(name + "-summary.csv");
        Path md = out.resolve(name + "-summary.md");
        Path png = out.resolve(name + "-summary.png");
        Files.writeString(csv, StudyTables.csv(rows), StandardCharsets.UTF_8);
        Files.writeString(md, "# Simulation study: " + name + "\n\n"
                + (spec.description().isEmpty() ? "" : spec.description() + "\n\n")
                + "Replicates per sample size: " + study.replicates() + "; seed " + study.seed() + "; level "
                + study.level() + "; true values " + spec.scenario().truths() + ".\n\n"
                + StudyTables.markdown(rows), StandardCharsets.UTF_8);
        Charts.studySummary(png, "Simulation study: " + name, rows);
        int failed = rows.stream().mapToInt(StudySummary::failures).sum();
        if (failed > 0) {
            err().println("incipit: " + failed + " estimates failed; reasons in " + md + " and " + csv);
            err().flush();
        }
        ObjectNode json = org.incipit.io.JsonOutput.object();
        json.put("command", "study");
        json.put("scenario", name);
        json.put("replicates", study.replicates());
        json.put("seed", study.seed());
        json.put("level", study.level());
        ObjectNode files = json.putObject("files");
        files.put("csv", csv.toString());
        files.put("markdown", md.toString());
        files.put("png", png.toString());
        ArrayNode arr = json.putArray("summaries");
        TextTable table = TextTable.of("estimator", "target", "n", "bias", "rel.bias", "coverage", "median width",
                "failures");
        for (StudySummary s : rows) {
            ObjectNode o = arr.addObject();
            o.put("estimator", s.estimator());
            o.put("target", s.target());
            o.put("n", s.sampleSize());
            putNumber(o, "bias", s.bias());
            putNumber(o, "biasStandardError", s.biasStandardError());
            putNumber(o, "coverage", s.coverage());
            putNumber(o, "medianWidth", s.medianWidth());
            o.put("failures", s.failures());
            table.row(s.estimator(), s.target(), Integer.toString(s.sampleSize()), text(s.bias()),
                    text(s.relativeBias()), text(s.coverage()), text(s.medianWidth()),
                    s.failures() + "/" + s.replicates());
        }
        for (Path p : List.of(csv, md, png)) {
            err().println("incipit: wrote " + p);
        }
        err().flush();
        emit(json, table);
        return ExitCode.OK;
    }

    private ScenarioSpec read() throws IOException {
        Path file = Path.of(scenario);
        if (!Files.exists(file) && SHIPPED.contains(scenario)) {
            String resource = "/org/incipit/scenarios/" + scenario + ".scenario";
            try (InputStream in = StudyCommand.class.getResourceAsStream(resource)) {
                if (in == null) {
                    throw new IllegalStateException("shipped scenario " + resource + " is missing from the build");
                }
                return ScenarioSpec.parse(new String(in.readAllBytes(), StandardCharsets.UTF_8), scenario);
            }
        }
        if (!Files.isRegularFile(file)) {
            throw new InputException(scenario, 0, 0, "no such scenario file (shipped scenarios: "
                    + String.join(", ", SHIPPED) + ")");
        }
        return ScenarioSpec.read(file);
    }

    private static String text(double v) {
        return Double.isNaN(v) ? "NA" : Double.isInfinite(v) ? (v > 0 ? "Inf" : "-Inf") : TextTable.number(v);
    }

    private static void putNumber(ObjectNode o, String name, double v) {
        if (Double.isFinite(v)) {
            o.put(name, v);
        } else {
            o.putNull(name);
        }
    }
}
