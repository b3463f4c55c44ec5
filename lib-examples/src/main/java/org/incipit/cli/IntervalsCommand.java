package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.incipit.core.EstimationException;
import org.incipit.core.estimate.ambiguous.AmbiguousStartEm;
import org.incipit.core.estimate.ambiguous.AmbiguousStartEstimator;
import org.incipit.core.estimate.ambiguous.AmbiguousStartFit;
import org.incipit.core.estimate.ambiguous.AmbiguousStartMoments;
import org.incipit.core.estimate.ambiguous.ExposureHistory;
import org.incipit.core.estimate.ambiguous.GridFit;
import org.incipit.core.estimate.ambiguous.MomentFit;
import org.incipit.core.estimate.ambiguous.NaiveFit;
import org.incipit.core.estimate.ambiguous.NaiveRule;
import org.incipit.core.inference.ModelComparison;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.distributions.DelayFamily;
import org.incipit.io.CsvInput;
import org.incipit.io.FitSummary;
import org.incipit.io.JsonOutput;
import org.incipit.io.ReadResult;
import org.incipit.io.TextTable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * {@code incipit intervals --input F}: distribution of an interval whose start is ambiguous
 * (several candidate starts per case), by maximum likelihood with the transmission probability
 * per exposure, by moments, by a nonparametric EM, or by a naive single-start rule (for
 * comparison only).
 */
@Command(name = "intervals",
        mixinStandardHelpOptions = true,
        description = {"Intervals with several candidate starts per case.",
            "Corrects for not knowing which exposure (or infector) started it.", ""},
        footer = {"",
            "Input: case,end,start[,kind][,exposures_total], one row per candidate start.",
            "Methods: likelihood (each exposure transmits with probability p, the first",
            "to transmit starts the interval; default), moments (open Poisson stream of",
            "exposures, no family), nonparametric (EM on daily bins, open stream), and",
            "the naive rules nearest, earliest, midpoint, single-only, which pick one",
            "start per case and are biased (shown for comparison).",
            "Exposure history: open = exposures go on until onset; complete = the",
            "recorded exposures are the whole history; known-total = the",
            "exposures_total column gives the number of exposures in the period",
            "(default when every case has it, else open; the output states which)."})
public final class IntervalsCommand extends AbstractCommand {

    @Option(names = "--input", required = true, paramLabel = "FILE", description = "Cases with candidate starts (CSV).")
    Path file;

    @Option(names = "--family", paramLabel = "FAMILY",
            description = "gamma, weibull, lognormal or all (default all: fit each, best by AIC).")
    String family;

    @Option(names = "--method", paramLabel = "METHOD", defaultValue = "likelihood",
            description = "likelihood, moments, nonparametric, nearest, earliest, midpoint or "
                    + "single-only (default ${DEFAULT-VALUE}).")
    String method;

    @Option(names = "--exposure-history", paramLabel = "HISTORY",
            description = "open, complete or known-total (default: known-total if every case has "
                    + "exposures_total, else open).")
    String history;

    @Option(names = "--level", paramLabel = "LEVEL", defaultValue = "0.95", description = "Interval level (default ${DEFAULT-VALUE}).")
    double level;

    @Option(names = "--seed", paramLabel = "N", defaultValue = "1",
            description = "Bootstrap seed for moments and nonparametric (default ${DEFAULT-VALUE}).")
    long seed;

    @Option(names = "--replicates", paramLabel = "N", defaultValue = "200",
            description = "Bootstrap replicates for moments and nonparametric (default ${DEFAULT-VALUE}).")
    int replicates;

    @Mixin
    InputOptions input;

    /** Creates the command. */
    public IntervalsCommand() {
    }

    @Override
    protected int run() {
        Cli.level(level);
        String m = method.trim().toLowerCase(Locale.ROOT);
        ReadResult<AmbiguousStartCases> read = CsvInput.intervals(file, input.readOptions());
        reportSkipped(read);
        AmbiguousStartCases cases = read.data();
        switch (m) {
            case "likelihood" -> likelihood(cases);
            case "moments" -> moments(cases);
            case "nonparametric" -> nonparametric(cases);
            case "nearest", "earliest", "midpoint", "single-only" -> naive(cases, m);
            default -> throw new IllegalArgumentException("--method must be likelihood, moments, nonparametric, "
                    + "nearest, earliest, midpoint or single-only, was '" + method + "'");
        }
        return ExitCode.OK;
    }

    /** The exposure history from the option, or the stated default. */
    static ExposureHistory history(String option, AmbiguousStartCases cases) {
        if (option == null) {
            boolean all = cases.caseCount() > 0;
            for (int i = 0; i < cases.caseCount(); i++) {
                all &= cases.totalExposures(i) != AmbiguousStartCases.UNKNOWN_TOTAL;
            }
            return all ? ExposureHistory.knownTotal() : ExposureHistory.open();
        }
        return switch (option.trim().toLowerCase(Locale.ROOT)) {
            case "open" -> ExposureHistory.open();
            case "complete" -> ExposureHistory.complete();
            case "known-total" -> {
                for (int i = 0; i < cases.caseCount(); i++) {
                    if (cases.totalExposures(i) == AmbiguousStartCases.UNKNOWN_TOTAL) {
                        throw new IllegalArgumentException("--exposure-history known-total needs exposures_total "
                                + "for every case; case '" + cases.id(i) + "' has none");
                    }
                }
                yield ExposureHistory.knownTotal();
            }
            default -> throw new IllegalArgumentException("--exposure-history must be open, complete or known-total, "
                    + "was '" + option + "'");
        };
    }

    private void put(ObjectNode json, ExposureHistory h) {
        json.put("method", method.trim().toLowerCase(Locale.ROOT));
        json.put("exposureHistory", h.label());
        json.put("exposureHistorySource", history == null ? "default" : "option");
    }

    private void likelihood(AmbiguousStartCases cases) {
        ExposureHistory h = history(history, cases);
        List<DelayFamily> fams = Fits.families("--family", family == null ? "all" : family);
        AmbiguousStartEstimator.Options opts = new AmbiguousStartEstimator.Options(level,
                AmbiguousStartEstimator.Options.defaults().quantileLevels());
        ObjectNode json;
        TextTable t = Fits.table();
        String note;
        if (fams.size() == 1) {
            AmbiguousStartFit f = AmbiguousStartEstimator.fit(cases, fams.get(0), h, opts);
            f.requireConverged();
            json = Fits.json(f);
            Fits.row(t, Fits.summary(f));
            note = transmissionNote(f);
        } else {
            AmbiguousStartEstimator.Comparison c = AmbiguousStartEstimator.compare(cases, fams, h,
                    ModelComparison.Criterion.AIC, opts);
            json = JsonOutput.object();
            ArrayNode a = json.putArray("fits");
            AmbiguousStartFit best = null;
            for (AmbiguousStartFit f : c.fits()) {
                a.add(Fits.json(f));
                Fits.row(t, Fits.summary(f));
                if (f.family().equals(c.ranking().best().name())) {
                    best = f;
                }
            }
            json.put("best", c.ranking().best().name());
            json.put("criterion", "AIC");
            note = "best by AIC: " + c.ranking().best().name() + "; " + transmissionNote(best);
        }
        put(json, h);
        emitWithNotes(json, t, note, h);
    }

    private static String transmissionNote(AmbiguousStartFit f) {
        StringBuilder sb = new StringBuilder("transmission probability per exposure");
        for (int i = 0; i < f.categories().size(); i++) {
            sb.append(f.categories().size() > 1 ? " " + f.categories().get(i) : "").append(' ')
                    .append(Cli.cell(f.transmission().get(i)));
        }
        return sb.toString();
    }

    private void emitWithNotes(ObjectNode json, TextTable t, String note, ExposureHistory h) {
        if (json()) {
            emit(json, t);
            return;
        }
        out().print(t.render());
        out().println();
        out().println(note);
        out().println("exposure history: " + h.label() + (history == null ? " (default; see --exposure-history)" : ""));
        out().println("method: " + method.trim().toLowerCase(Locale.ROOT));
        out().flush();
    }

    private void naive(AmbiguousStartCases cases, String m) {
        if (history != null) {
            throw new IllegalArgumentException("--exposure-history does not apply to the naive rule " + m);
        }
        NaiveRule rule = switch (m) {
            case "nearest" -> NaiveRule.LATEST;
            case "earliest" -> NaiveRule.EARLIEST;
            case "midpoint" -> NaiveRule.MIDPOINT;
            default -> NaiveRule.SINGLE_ONLY;
        };
        List<DelayFamily> fams = Fits.families("--family", family == null ? "all" : family);
        List<FitSummary> fits = new ArrayList<>();
        TextTable t = Fits.table();
        for (DelayFamily f : fams) {
            NaiveFit n = AmbiguousStartEstimator.naive(cases, f, rule, level);
            fits.add(Fits.summary(n));
            Fits.row(t, Fits.summary(n));
        }
        ObjectNode json;
        String best = fits.get(0).family();
        if (fits.size() == 1) {
            json = JsonOutput.fit(fits.get(0));
        } else {
            double aic = Double.POSITIVE_INFINITY;
            for (FitSummary f : fits) {
                if (f.aic() < aic) {
                    aic = f.aic();
                    best = f.family();
                }
            }
            json = JsonOutput.fits(fits, best);
            json.put("criterion", "AIC");
        }
        json.put("method", m);
        json.put("naive", true);
        json.put("warning", "a naive rule: it takes one start per case as if it were known and is biased; "
                + "use --method likelihood for the corrected estimate");
        if (json()) {
            emit(json, t);
        } else {
            out().print(t.render());
            out().println();
            out().println("method: " + m + " (naive: biased, for comparison only)"
                    + (fits.size() > 1 ? "; best by AIC: " + best : ""));
            out().flush();
        }
    }

    private void noFamily(String m) {
        if (family != null) {
            throw new IllegalArgumentException("--family does not apply to --method " + m + " (no family is assumed)");
        }
        if (history != null && !history.trim().equalsIgnoreCase("open")) {
            throw new IllegalArgumentException("--method " + m + " assumes an open exposure stream; "
                    + "--exposure-history " + history + " is not supported by it");
        }
    }

    private void moments(AmbiguousStartCases cases) {
        noFamily("moments");
        MomentFit f = AmbiguousStartMoments.fit(cases, new AmbiguousStartMoments.Options(level, replicates, seed));
        if (f.status() != MomentFit.Status.OK) {
            throw new EstimationException("moment equations have no solution inside the parameter space: "
                    + f.message());
        }
        ObjectNode json = JsonOutput.object();
        json.set("mean", JsonOutput.estimate(f.mean()));
        json.set("sd", JsonOutput.estimate(f.sd()));
        json.set("transmissionProbability", JsonOutput.estimate(f.p()));
        json.set("exposureRate", JsonOutput.estimate(f.rate()));
        json.put("n", f.cases());
        json.put("replicates", f.replicates());
        json.put("failedReplicates", f.failed());
        json.put("status", f.status().name());
        put(json, ExposureHistory.open());
        TextTable t = TextTable.of("quantity", "estimate (95% interval)")
                .row("mean (days)", Cli.cell(f.mean()))
                .row("sd (days)", Cli.cell(f.sd()))
                .row("transmission probability", Cli.cell(f.p()))
                .row("exposures per day", Cli.cell(f.rate()))
                .row("cases", Integer.toString(f.cases()))
                .row("bootstrap", f.replicates() + " replicates (seed " + seed + ")");
        emit(json, t);
    }

    private void nonparametric(AmbiguousStartCases cases) {
        noFamily("nonparametric");
        AmbiguousStartEm.Options d = AmbiguousStartEm.Options.defaults(seed);
        GridFit f = AmbiguousStartEm.fit(cases, new AmbiguousStartEm.Options(d.binWidth(), d.tolerance(),
                d.maxIterations(), level, replicates, seed));
        if (!f.converged()) {
            throw new EstimationException("EM did not converge after " + f.iterations() + " iterations");
        }
        ObjectNode json = JsonOutput.object();
        json.set("mean", JsonOutput.estimate(f.mean()));
        json.set("sd", JsonOutput.estimate(f.sd()));
        if (f.categories().size() == 1) {
            json.set("transmissionProbability", JsonOutput.estimate(f.transmission().get(0)));
        } else {
            ObjectNode tp = json.putObject("transmissionProbability");
            for (int i = 0; i < f.categories().size(); i++) {
                tp.set(f.categories().get(i), JsonOutput.estimate(f.transmission().get(i)));
            }
        }
        json.put("binWidth", f.binWidth());
        ArrayNode masses = json.putArray("masses");
        for (double x : f.masses()) {
            masses.add(x);
        }
        json.put("logLikelihood", f.logLikelihood());
        json.put("iterations", f.iterations());
        json.put("n", f.cases());
        json.put("replicates", f.replicates());
        json.put("failedReplicates", f.failed());
        json.put("converged", f.converged());
        put(json, ExposureHistory.open());
        TextTable t = TextTable.of("quantity", "estimate (95% interval)")
                .row("mean (days)", Cli.cell(f.mean()))
                .row("sd (days)", Cli.cell(f.sd()))
                .row("cases", Integer.toString(f.cases()))
                .row("bins", f.masses().length + " of " + TextTable.number(f.binWidth()) + " day(s)")
                .row("bootstrap", f.replicates() + " replicates (seed " + seed + ")");
        for (int i = 0; i < f.categories().size(); i++) {
            t.row("transmission probability" + (f.categories().size() > 1 ? " " + f.categories().get(i) : ""),
                    Cli.cell(f.transmission().get(i)));
        }
        emit(json, t);
    }
}
