package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Path;
import org.incipit.core.estimate.fatality.FatalityEstimator;
import org.incipit.core.inference.Estimate;
import org.incipit.core.observe.DailyCounts;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.ParametricDelay;
import org.incipit.io.CsvInput;
import org.incipit.io.JsonOutput;
import org.incipit.io.ReadResult;
import org.incipit.io.TextTable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * {@code incipit fatality --input COUNTS --delay-family F --delay-mean M --delay-sd S}: the
 * crude, resolved-only and delay-adjusted fatality ratios ({@link FatalityEstimator}).
 */
@Command(name = "fatality",
        mixinStandardHelpOptions = true,
        description = {"Fatality ratio adjusted for deaths still to come.", ""},
        footer = {"",
            "Input: day,cases,deaths[,recoveries] by onset day (cases) and day of death.",
            "crude = deaths / cases (too low while deaths are still to come);",
            "resolved = deaths / (deaths + recoveries) (needs recoveries; biased when",
            "the times to death and to recovery differ); adjusted = deaths / sum of",
            "cases(t) F(T - t + 1) with the onset-to-death delay F (Nishiura et al.",
            "2009), profile-likelihood interval with the delay taken as known;",
            "resolved-adjusted (with --recovery-family/-mean/-sd and a recoveries",
            "column) = the p that balances deaths against expected deaths and",
            "recoveries against expected recoveries, each by its own delay",
            "(docs/methods.md section 5)."})
public final class FatalityCommand extends AbstractCommand {

    @Option(names = "--input", required = true, paramLabel = "FILE", description = "Daily counts with deaths (CSV).")
    Path file;

    @Option(names = "--delay-family", required = true, paramLabel = "FAMILY", description = "Onset-to-death family.")
    String delayFamily;

    @Option(names = "--delay-mean", required = true, paramLabel = "DAYS", description = "Onset-to-death mean.")
    double delayMean;

    @Option(names = "--delay-sd", required = true, paramLabel = "DAYS", description = "Onset-to-death sd.")
    double delaySd;

    @Option(names = "--recovery-family", paramLabel = "FAMILY",
            description = "Onset-to-recovery family (with --recovery-mean and --recovery-sd).")
    String recoveryFamily;

    @Option(names = "--recovery-mean", paramLabel = "DAYS", description = "Onset-to-recovery mean.")
    Double recoveryMean;

    @Option(names = "--recovery-sd", paramLabel = "DAYS", description = "Onset-to-recovery sd.")
    Double recoverySd;

    @Option(names = "--level", paramLabel = "LEVEL", defaultValue = "0.95", description = "Interval level (default ${DEFAULT-VALUE}).")
    double level;

    @Mixin
    InputOptions input;

    /** Creates the command. */
    public FatalityCommand() {
    }

    @Override
    protected int run() {
        Cli.level(level);
        DelayFamily fam = DelayFamilies.byName(delayFamily);
        ParametricDelay f = fam.ofMeanSd(Cli.positive("--delay-mean", delayMean), Cli.positive("--delay-sd", delaySd));
        ParametricDelay recovery = recoveryDelay();
        ReadResult<DailyCounts> read = CsvInput.dailyCounts(file, input.readOptions());
        DailyCounts c = read.data();
        if (!c.hasDeaths()) {
            throw new IllegalArgumentException(read.file() + ": a fatality ratio needs a deaths column");
        }
        if (recovery != null && !c.hasRecoveries()) {
            throw new IllegalArgumentException(read.file() + ": --recovery-family needs a recoveries column");
        }
        Estimate resolvedAdjusted = recovery == null ? null : FatalityEstimator.resolvedAdjusted(c, f, recovery, level);
        Estimate crude = FatalityEstimator.crude(c, level);
        Estimate resolved = c.hasRecoveries() ? FatalityEstimator.resolvedOnly(c, level) : null;
        Estimate adjusted = FatalityEstimator.windowAdjusted(c, f, level);
        ObjectNode json = JsonOutput.object();
        json.put("crude", crude.estimate());
        if (resolved != null) {
            json.put("resolved", resolved.estimate());
        } else {
            json.putNull("resolved");
        }
        json.set("adjusted", JsonOutput.estimate(adjusted));
        if (resolvedAdjusted != null) {
            json.set("resolvedAdjusted", JsonOutput.estimate(resolvedAdjusted));
        }
        json.set("crudeInterval", JsonOutput.estimate(crude));
        if (resolved != null) {
            json.set("resolvedInterval", JsonOutput.estimate(resolved));
        }
        json.put("cases", c.totalCases());
        long deaths = 0;
        for (int x : c.deaths()) {
            deaths += x;
        }
        json.put("deaths", deaths);
        ObjectNode d = json.putObject("delay");
        d.put("family", fam.name());
        d.put("mean", delayMean);
        d.put("sd", delaySd);
        if (recovery != null) {
            ObjectNode rd = json.putObject("recoveryDelay");
            rd.put("family", DelayFamilies.byName(recoveryFamily).name());
            rd.put("mean", recoveryMean);
            rd.put("sd", recoverySd);
        }
        TextTable t = TextTable.of("ratio", "estimate (95% interval)", "note")
                .row("crude", Cli.cell(crude), "too low while deaths are still to come")
                .row("resolved", resolved == null ? "no recoveries column" : Cli.cell(resolved),
                        resolved == null ? "" : "deaths / (deaths + recoveries)")
                .row("adjusted", Cli.cell(adjusted), "for deaths still to come (" + fam.name() + " delay, mean "
                        + TextTable.number(delayMean) + ", sd " + TextTable.number(delaySd) + ")");
        if (resolvedAdjusted != null) {
            t.row("resolved-adjusted", Cli.cell(resolvedAdjusted), "deaths and recoveries, each for its own delay");
        }
        emit(json, t);
        return ExitCode.OK;
    }

    /** The onset-to-recovery delay, or null if none of its three options is given. */
    private ParametricDelay recoveryDelay() {
        int given = (recoveryFamily != null ? 1 : 0) + (recoveryMean != null ? 1 : 0) + (recoverySd != null ? 1 : 0);
        if (given == 0) {
            return null;
        }
        if (given < 3) {
            throw new IllegalArgumentException("--recovery-family, --recovery-mean and --recovery-sd go together;"
                    + " give all three or none");
        }
        return DelayFamilies.byName(recoveryFamily).ofMeanSd(Cli.positive("--recovery-mean", recoveryMean),
                Cli.positive("--recovery-sd", recoverySd));
    }
}
