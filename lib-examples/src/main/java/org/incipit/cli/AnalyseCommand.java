package org.incipit.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Path;
import org.incipit.io.TextTable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * {@code incipit analyse --counts F [...] --out DIR}: the report of {@code demo} on the user's
 * own files. Every estimator whose file is given runs; the others are left out of the report.
 */
@Command(name = "analyse",
        mixinStandardHelpOptions = true,
        description = {"Run the whole analysis on your own files (same report as demo).",
            "Writes a report folder (report.html, results.json, figures/).", ""},
        footer = {"",
            "Only --counts is required; each other file adds its sections. Without",
            "--generation-mean and --generation-sd there is no reproduction number.",
            "File formats: see 'incipit help check'."})
public final class AnalyseCommand extends AbstractCommand {

    @Option(names = "--counts", required = true, paramLabel = "FILE", description = "Daily counts (CSV).")
    Path counts;

    @Option(names = "--delays", paramLabel = "FILE", description = "Onset-to-death pairs (CSV).")
    Path delays;

    @Option(names = "--cutoff", paramLabel = "TIME", description = "Cut-off of the delays file (default: its last secondary time).")
    String cutoff;

    @Option(names = "--intervals", paramLabel = "FILE", description = "Cases with candidate starts (CSV).")
    Path intervals;

    @Option(names = "--exposure-history", paramLabel = "HISTORY",
            description = "For --intervals: open, complete or known-total (default as in 'intervals').")
    String exposureHistory;

    @Option(names = "--incubation", paramLabel = "FILE", description = "Exposure windows and onsets (CSV).")
    Path incubation;

    @Option(names = "--generation-family", paramLabel = "FAMILY", defaultValue = "gamma",
            description = "Generation interval family (default ${DEFAULT-VALUE}).")
    String generationFamily;

    @Option(names = "--generation-mean", paramLabel = "DAYS", description = "Generation interval mean.")
    Double generationMean;

    @Option(names = "--generation-sd", paramLabel = "DAYS", description = "Generation interval sd.")
    Double generationSd;

    @Option(names = "--generation-mean-ci", paramLabel = "LO,HI", description = "95%% interval of the mean.")
    String generationMeanCi;

    @Option(names = "--generation-sd-ci", paramLabel = "LO,HI", description = "95%% interval of the sd.")
    String generationSdCi;

    @Option(names = "--from", paramLabel = "DAY", description = "First day of the growth window.")
    String from;

    @Option(names = "--to", paramLabel = "DAY", description = "Last day of the growth window.")
    String to;

    @Option(names = "--out", paramLabel = "DIR", defaultValue = "incipit-out",
            description = "Report folder (default ${DEFAULT-VALUE}); files in it are overwritten.")
    Path out;

    @Mixin
    InputOptions input;

    /** Creates the command. */
    public AnalyseCommand() {
    }

    @Override
    protected int run() throws IOException {
        if ((generationMean == null) != (generationSd == null)) {
            throw new IllegalArgumentException("give both --generation-mean and --generation-sd, or neither");
        }
        double mean = generationMean == null ? Double.NaN : Cli.positive("--generation-mean", generationMean);
        double sd = generationSd == null ? Double.NaN : Cli.positive("--generation-sd", generationSd);
        double[] mci = generationMeanCi == null ? new double[] {mean, mean}
                : Cli.pair("--generation-mean-ci", generationMeanCi);
        double[] sci = generationSdCi == null ? new double[] {sd, sd} : Cli.pair("--generation-sd-ci", generationSdCi);
        if (generationMean != null) {
            org.incipit.distributions.DelayFamilies.byName(generationFamily);
            if (!(mci[0] <= mean && mean <= mci[1]) || !(sci[0] <= sd && sd <= sci[1])) {
                throw new IllegalArgumentException("--generation-mean-ci and --generation-sd-ci must contain the "
                        + "mean and the sd");
            }
        }
        Analysis.Inputs in = new Analysis.Inputs(counts, delays, cutoff, intervals, incubation,
                generationMean == null ? null : generationFamily, mean, sd, mci, sci, from, to,
                input.readOptions(), null, "Early-phase analysis", null, "from candidate start to end", null, exposureHistory);
        return finish(this, new Analysis(in, out, err()).run(), out);
    }

    /** Prints the summary (or the results JSON) and returns the exit code. */
    static int finish(AbstractCommand c, ObjectNode results, Path out) {
        TextTable t = TextTable.of("result", "value");
        t.row("report", out.resolve("report.html").toString());
        t.row("results", out.resolve("results.json").toString());
        summary(t, results, "growth", "growthRate", "growth rate (per day)");
        summary(t, results, "growth", "doublingTime", "doubling time (days)");
        summary(t, results, "reproduction", "reproductionNumber", "reproduction number");
        JsonNode iv = results.at("/intervals/corrected");
        if (iv.isObject()) {
            for (JsonNode fit : iv.get("fits")) {
                if (fit.get("family").asText().equals(iv.get("best").asText())) {
                    JsonNode e = fit.get("mean");
                    t.row("interval mean (days, " + fit.get("family").asText() + ")",
                            TextTable.number(e.get("estimate").asDouble()) + " (" + bound(e.get("lower")) + " to "
                                    + bound(e.get("upper")) + ")");
                }
            }
        }
        JsonNode f = results.get("failures");
        for (JsonNode x : f) {
            t.row("failed", x.asText());
        }
        c.emit(results, t);
        return ExitCode.OK;
    }

    private static void summary(TextTable t, ObjectNode results, String section, String key, String label) {
        JsonNode s = results.get(section);
        if (s != null && s.get(key) != null && s.get(key).isObject()) {
            JsonNode e = s.get(key);
            t.row(label, TextTable.number(e.get("estimate").asDouble()) + " (" + bound(e.get("lower")) + " to "
                    + bound(e.get("upper")) + ")");
        }
    }

    private static String bound(JsonNode n) {
        return n == null || n.isNull() ? "inf" : TextTable.number(n.asDouble());
    }
}
