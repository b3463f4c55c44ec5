package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Path;
import java.util.List;
import org.incipit.core.estimate.delay.DelayEstimator;
import org.incipit.core.estimate.delay.DelayOptions;
import org.incipit.core.estimate.delay.GrowthWeightedEstimator;
import org.incipit.core.estimate.delay.GrowthWeightedFit;
import org.incipit.core.inference.Estimate;
import org.incipit.core.observe.DelayPairs;
import org.incipit.distributions.DelayFamily;
import org.incipit.io.CsvInput;
import org.incipit.io.JsonOutput;
import org.incipit.io.ReadResult;
import org.incipit.io.TextTable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * {@code incipit delays --input F --cutoff T}: a delay distribution (e.g. onset to death) from
 * pairs seen only if the second event happened by the cut-off (right truncation), or followed up
 * to it (right censoring), or, with {@code --growth-rate}, from delays whose primaries grew
 * exponentially ({@link DelayEstimator}).
 */
@Command(name = "delays",
        mixinStandardHelpOptions = true,
        description = {"Delay distribution corrected for right truncation at the cut-off.", ""},
        footer = {"",
            "Input: case,primary,secondary[,daily]; an empty secondary means not yet",
            "observed at the cut-off (right-censored: every primary is then known).",
            "With --cutoff and no empty secondary: right-truncated likelihood, a pair is",
            "seen only if its secondary event fell by the cut-off. Without --cutoff:",
            "plain fit (no truncation). With --growth-rate: growth-weighted form, for",
            "delays whose primaries grew as exp(r t) and are not known one by one.",
            "Dates are known to the day (double interval censoring)."})
public final class DelaysCommand extends AbstractCommand {

    @Option(names = "--input", required = true, paramLabel = "FILE", description = "Pairs (CSV).")
    Path file;

    @Option(names = "--cutoff", paramLabel = "TIME", description = "The cut-off (day number or date, like the file).")
    String cutoff;

    @Option(names = "--family", paramLabel = "FAMILY", defaultValue = "all",
            description = "gamma, weibull, lognormal or all (default ${DEFAULT-VALUE}: best by AIC).")
    String family;

    @Option(names = "--growth-rate", paramLabel = "R", description = "Growth rate per day: growth-weighted form.")
    Double growthRate;

    @Option(names = "--growth-rate-ci", paramLabel = "LO,HI", description = "Interval of r (carried into the result).")
    String growthRateCi;

    @Option(names = "--level", paramLabel = "LEVEL", defaultValue = "0.95", description = "Interval level (default ${DEFAULT-VALUE}).")
    double level;

    @Mixin
    InputOptions input;

    /** Creates the command. */
    public DelaysCommand() {
    }

    @Override
    protected int run() {
        Cli.level(level);
        List<DelayFamily> fams = Fits.families("--family", family);
        ReadResult<DelayPairs> read = CsvInput.delays(file, input.readOptions(), cutoff);
        reportSkipped(read);
        DelayPairs pairs = read.data();
        DelayOptions opts = DelayOptions.defaults().withLevel(level);
        if (growthRate != null) {
            growthWeighted(pairs, fams, opts);
            return ExitCode.OK;
        }
        if (growthRateCi != null) {
            throw new IllegalArgumentException("--growth-rate-ci needs --growth-rate");
        }
        String method;
        Fits.DelayFits f;
        if (pairs.censoredCount() > 0) {
            method = "right-censored";
            f = Fits.fitAll(fams, fam -> DelayEstimator.censored(pairs, fam, opts));
        } else if (pairs.cutoff().isPresent()) {
            method = "right-truncated";
            f = Fits.fitAll(fams, fam -> DelayEstimator.rightTruncated(pairs, fam, opts));
        } else {
            method = "none";
            f = Fits.fitAll(fams, fam -> DelayEstimator.censored(pairs, fam, opts));
        }
        ObjectNode json = Fits.json(f);
        json.put("correction", method);
        if (pairs.cutoff().isPresent()) {
            json.put("cutoff", pairs.cutoff().getAsDouble());
        }
        json.put("pairs", pairs.size());
        json.put("censored", pairs.censoredCount());
        if (json()) {
            emit(json, Fits.table(f));
        } else {
            out().print(Fits.table(f).render());
            out().println();
            out().println("correction: " + method + (method.equals("none") ? " (no --cutoff given)" : "")
                    + (f.fits().size() > 1 ? "; best by AIC: " + f.best().family().name() : ""));
            out().flush();
        }
        return ExitCode.OK;
    }

    private void growthWeighted(DelayPairs pairs, List<DelayFamily> fams, DelayOptions opts) {
        if (fams.size() != 1) {
            throw new IllegalArgumentException("--growth-rate needs one --family (gamma, weibull or lognormal)");
        }
        if (!Double.isFinite(growthRate)) {
            throw new IllegalArgumentException("--growth-rate must be finite, was " + growthRate);
        }
        double[] d = new double[pairs.observedCount()];
        int k = 0;
        for (int i = 0; i < pairs.size(); i++) {
            if (pairs.isObserved(i)) {
                d[k] = pairs.secondary(i) - pairs.primary(i);
                if (!(d[k] > 0)) {
                    throw new IllegalArgumentException("case '" + pairs.id(i) + "': the growth-weighted form needs "
                            + "delays > 0, was " + d[k]);
                }
                k++;
            }
        }
        DelayFamily fam = fams.get(0);
        ObjectNode json;
        TextTable t = Fits.table();
        if (growthRateCi == null) {
            var f = Fits.converged(DelayEstimator.growthWeighted(d, fam, growthRate, opts));
            json = JsonOutput.fit(Fits.summary(f));
            Fits.row(t, Fits.summary(f));
        } else {
            double[] ci = Cli.pair("--growth-rate-ci", growthRateCi);
            if (!(ci[0] <= growthRate && growthRate <= ci[1])) {
                throw new IllegalArgumentException("--growth-rate-ci [" + ci[0] + ", " + ci[1]
                        + "] must contain the estimate " + growthRate);
            }
            GrowthWeightedFit g = GrowthWeightedEstimator.fit(d, fam, new Estimate(growthRate, ci[0], ci[1], level,
                    "given"), opts);
            Fits.converged(g.conditional());
            var s = new org.incipit.io.FitSummary(fam.name(), Fits.parameters(g.conditional().parameterNames(),
                    g.parameters()), g.mean(), g.sd(), g.conditional().logLikelihood(), g.conditional().aic(),
                    g.conditional().observations(), g.conditional().converged());
            json = JsonOutput.fit(s);
            Fits.row(t, s);
        }
        json.put("correction", "growth-weighted");
        json.put("growthRate", growthRate);
        emit(json, t);
    }
}
