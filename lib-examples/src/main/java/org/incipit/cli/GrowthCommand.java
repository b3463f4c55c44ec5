package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Path;
import java.util.Optional;
import org.incipit.core.EstimationException;
import org.incipit.core.growth.CountModel;
import org.incipit.core.growth.GrowthRateEstimator;
import org.incipit.core.growth.GrowthRateFit;
import org.incipit.core.growth.GrowthRateOptions;
import org.incipit.core.inference.Estimate;
import org.incipit.core.observe.DailyCounts;
import org.incipit.io.CsvInput;
import org.incipit.io.JsonOutput;
import org.incipit.io.ReadResult;
import org.incipit.io.TextTable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * {@code incipit growth --input COUNTS}: exponential growth rate and doubling time of daily
 * counts by log-linear count regression ({@link GrowthRateEstimator}).
 */
@Command(name = "growth",
        mixinStandardHelpOptions = true,
        description = {"Exponential growth rate and doubling time of daily counts.", ""},
        footer = {"",
            "Input: day,cases[,deaths][,recoveries][,imported] (see 'incipit help check').",
            "Fits log E[cases] = a + r day by maximum likelihood; the interval of r is",
            "a profile-likelihood interval, the doubling time ln 2 / r takes its",
            "interval from it. Assumes steady exponential growth over the window and",
            "a constant ascertainment fraction."})
public final class GrowthCommand extends AbstractCommand {

    /** Count models on the command line. */
    enum Model {
        poisson(CountModel.POISSON), negative_binomial(CountModel.NEGATIVE_BINOMIAL);

        final CountModel model;

        Model(CountModel model) {
            this.model = model;
        }

        static Model parse(String s) {
            return switch (s.trim().toLowerCase(java.util.Locale.ROOT)) {
                case "poisson" -> poisson;
                case "negative-binomial", "negative_binomial", "nb" -> negative_binomial;
                default -> throw new IllegalArgumentException("--model must be poisson or negative-binomial, was '"
                        + s + "'");
            };
        }

        String label() {
            return this == poisson ? "poisson" : "negative-binomial";
        }
    }

    @Option(names = "--input", required = true, paramLabel = "FILE", description = "Daily counts (CSV).")
    Path file;

    @Option(names = "--from", paramLabel = "DAY", description = "First day of the window (day number or date; default: first day).")
    String from;

    @Option(names = "--to", paramLabel = "DAY", description = "Last day of the window (default: last day).")
    String to;

    @Option(names = "--model", paramLabel = "MODEL", defaultValue = "poisson",
            description = "poisson or negative-binomial (default ${DEFAULT-VALUE}).")
    String model;

    @Option(names = "--day-of-week", description = "Add a day-of-week effect.")
    boolean dayOfWeek;

    @Option(names = "--level", paramLabel = "LEVEL", defaultValue = "0.95", description = "Interval level (default ${DEFAULT-VALUE}).")
    double level;

    @Mixin
    InputOptions input;

    /** Creates the command. */
    public GrowthCommand() {
    }

    @Override
    protected int run() {
        Model m = Model.parse(model);
        Cli.level(level);
        ReadResult<DailyCounts> read = CsvInput.dailyCounts(file, input.readOptions());
        DailyCounts c = read.data();
        int first = from == null ? c.firstDay() : day(read, "--from", from);
        int last = to == null ? c.lastDay() : day(read, "--to", to);
        if (first < c.firstDay() || last > c.lastDay() || first > last) {
            throw new IllegalArgumentException("--from/--to must give a window inside days " + c.firstDay() + " to "
                    + c.lastDay() + " of " + read.file() + " with from <= to, was " + first + " to " + last);
        }
        GrowthRateFit fit = fit(c, first, last, m.model, dayOfWeek, level);
        ObjectNode json = json(fit, m.label());
        json.put("file", read.file());
        if (read.origin() != null) {
            json.put("fromDate", read.dateOf(first).toString());
            json.put("toDate", read.dateOf(last).toString());
        }
        emit(json, table(fit, m.label()));
        return ExitCode.OK;
    }

    static GrowthRateFit fit(DailyCounts c, int first, int last, CountModel model, boolean dayOfWeek, double level) {
        GrowthRateFit fit = GrowthRateEstimator.fit(c, first, last,
                GrowthRateOptions.defaults().withModel(model).withDayOfWeek(dayOfWeek).withLevel(level));
        if (!fit.converged()) {
            throw new EstimationException("growth-rate regression did not converge after " + fit.iterations()
                    + " iterations");
        }
        return fit;
    }

    private static int day(ReadResult<?> read, String option, String text) {
        double d = Cli.time(read, option, text);
        if (d != Math.rint(d)) {
            throw new IllegalArgumentException(option + " must be a whole day, was " + text);
        }
        return (int) d;
    }

    static ObjectNode json(GrowthRateFit fit, String model) {
        ObjectNode o = JsonOutput.object();
        o.set("growthRate", JsonOutput.estimate(fit.rateProfile()));
        Optional<Estimate> td = fit.doublingTime();
        if (td.isPresent()) {
            o.set("doublingTime", JsonOutput.estimate(td.get()));
        } else {
            o.putNull("doublingTime");
        }
        fit.halvingTime().ifPresent(h -> o.set("halvingTime", JsonOutput.estimate(h)));
        o.put("model", model);
        o.set("growthRateWald", JsonOutput.estimate(fit.rateWald()));
        if (Double.isFinite(fit.dispersion())) {
            o.put("dispersion", fit.dispersion());
        } else {
            o.putNull("dispersion");
        }
        o.put("from", fit.firstDay());
        o.put("to", fit.lastDay());
        o.put("days", fit.days());
        o.put("logLikelihood", fit.logLikelihood());
        o.put("deviance", fit.deviance());
        o.put("pearsonDispersion", fit.pearsonDispersion());
        o.put("converged", fit.converged());
        return o;
    }

    static TextTable table(GrowthRateFit fit, String model) {
        TextTable t = TextTable.of("quantity", "estimate", "interval");
        t.row("growth rate (per day)", Cli.cell(fit.rateProfile()), Cli.interval(fit.rateProfile()));
        fit.doublingTime().ifPresent(e -> t.row("doubling time (days)", Cli.cell(e), Cli.interval(e)));
        fit.halvingTime().ifPresent(e -> t.row("halving time (days)", Cli.cell(e), Cli.interval(e)));
        t.row("model", model, "");
        if (Double.isFinite(fit.dispersion())) {
            t.row("dispersion k", TextTable.number(fit.dispersion()), "");
        }
        t.row("window (day numbers)", fit.firstDay() + " to " + fit.lastDay(), fit.days() + " days");
        t.row("Pearson dispersion", TextTable.number(fit.pearsonDispersion()), "1 if Poisson fits");
        return t;
    }
}
