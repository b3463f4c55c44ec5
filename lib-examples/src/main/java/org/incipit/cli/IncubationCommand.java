package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import org.incipit.core.estimate.delay.DelayOptions;
import org.incipit.core.estimate.delay.ExposureWindowModel;
import org.incipit.core.estimate.delay.IncubationEstimator;
import org.incipit.core.observe.ExposureWindows;
import org.incipit.distributions.DelayFamily;
import org.incipit.io.CsvInput;
import org.incipit.io.ReadResult;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * {@code incipit incubation --input F}: incubation period from exposure windows and onsets
 * ({@link IncubationEstimator}).
 */
@Command(name = "incubation",
        mixinStandardHelpOptions = true,
        description = {"Incubation period from exposure windows and onsets.", ""},
        footer = {"",
            "Input: case,exposure_from,exposure_to,onset.",
            "Windows: interval = the incubation period lies between onset - exposure_to",
            "and onset - exposure_from (interval censoring; default); uniform = exposure",
            "uniform in the window (same estimates, other log-likelihood); growth =",
            "exposure density proportional to exp(r t) in the window, for exposure to a",
            "growing epidemic (needs --growth-rate)."})
public final class IncubationCommand extends AbstractCommand {

    @Option(names = "--input", required = true, paramLabel = "FILE", description = "Exposure windows (CSV).")
    Path file;

    @Option(names = "--family", paramLabel = "FAMILY", defaultValue = "all",
            description = "gamma, weibull, lognormal or all (default ${DEFAULT-VALUE}: best by AIC).")
    String family;

    @Option(names = "--window", paramLabel = "MODEL", defaultValue = "interval",
            description = "interval, uniform or growth (default ${DEFAULT-VALUE}).")
    String window;

    @Option(names = "--growth-rate", paramLabel = "R", description = "Growth rate per day for --window growth.")
    Double growthRate;

    @Option(names = "--level", paramLabel = "LEVEL", defaultValue = "0.95", description = "Interval level (default ${DEFAULT-VALUE}).")
    double level;

    @Mixin
    InputOptions input;

    /** Creates the command. */
    public IncubationCommand() {
    }

    static ExposureWindowModel model(String window, Double growthRate) {
        String w = window.trim().toLowerCase(Locale.ROOT);
        if (!w.equals("growth") && growthRate != null) {
            throw new IllegalArgumentException("--growth-rate applies only to --window growth");
        }
        return switch (w) {
            case "interval" -> ExposureWindowModel.intervalCensored();
            case "uniform" -> ExposureWindowModel.uniform();
            case "growth" -> {
                if (growthRate == null) {
                    throw new IllegalArgumentException("--window growth needs --growth-rate");
                }
                if (!(Double.isFinite(growthRate) && growthRate != 0)) {
                    throw new IllegalArgumentException("--growth-rate must be finite and non-zero, was " + growthRate);
                }
                yield ExposureWindowModel.growing(growthRate);
            }
            default -> throw new IllegalArgumentException("--window must be interval, uniform or growth, was '"
                    + window + "'");
        };
    }

    @Override
    protected int run() {
        Cli.level(level);
        List<DelayFamily> fams = Fits.families("--family", family);
        ExposureWindowModel m = model(window, growthRate);
        ReadResult<ExposureWindows> read = CsvInput.incubation(file, input.readOptions());
        reportSkipped(read);
        DelayOptions opts = DelayOptions.defaults().withLevel(level);
        Fits.DelayFits f = Fits.fitAll(fams, fam -> IncubationEstimator.fit(read.data(), fam, m, opts));
        ObjectNode json = Fits.json(f);
        json.put("window", window.trim().toLowerCase(Locale.ROOT));
        if (growthRate != null) {
            json.put("growthRate", growthRate);
        }
        if (json()) {
            emit(json, Fits.table(f));
        } else {
            out().print(Fits.table(f).render());
            out().println();
            out().println("window: " + window.trim().toLowerCase(Locale.ROOT)
                    + (f.fits().size() > 1 ? "; best by AIC: " + f.best().family().name() : ""));
            out().flush();
        }
        return ExitCode.OK;
    }
}
