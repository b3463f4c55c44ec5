package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.List;
import org.incipit.io.JsonOutput;
import org.incipit.io.TextTable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code incipit simulate --out DIR [options]}: simulates an outbreak with the library's
 * simulator and writes the four input files and the true values ({@link Scenario}). With no
 * option but {@code --out} it regenerates the shipped demo data byte for byte.
 */
@Command(name = "simulate",
        mixinStandardHelpOptions = true,
        description = {"Simulate an outbreak; write input files and the true values.",
            "Defaults: the shipped demo scenario (invented place and pathogen).", ""},
        footer = {"",
            "Writes counts.csv, delays.csv, intervals.csv, incubation.csv and truth.json.",
            "For study design, vary --traced (cases in intervals.csv) and --seed,",
            "and see how the interval widths of 'incipit intervals' shrink."})
public final class SimulateCommand extends AbstractCommand {

    @Option(names = "--out", required = true, paramLabel = "DIR", description = "Output folder (created).")
    Path out;

    @Option(names = "--seed", paramLabel = "N", description = "Random seed (default ${DEFAULT-VALUE}).")
    long seed = Scenario.demo().seed();

    @Option(names = "--reproduction-number", paramLabel = "R", description = "Mean offspring number (default ${DEFAULT-VALUE}).")
    double reproductionNumber = Scenario.demo().reproductionNumber();

    @Option(names = "--dispersion", paramLabel = "K", description = "Negative-binomial dispersion k of the offspring number (default ${DEFAULT-VALUE}).")
    double dispersion = Scenario.demo().dispersion();

    @Option(names = "--generation-mean", paramLabel = "DAYS", description = "Gamma generation interval mean (default ${DEFAULT-VALUE}).")
    double generationMean = Scenario.demo().generationMean();

    @Option(names = "--generation-sd", paramLabel = "DAYS", description = "Gamma generation interval sd (default ${DEFAULT-VALUE}).")
    double generationSd = Scenario.demo().generationSd();

    @Option(names = "--incubation-family", paramLabel = "FAMILY", description = "gamma, weibull or lognormal (default ${DEFAULT-VALUE}).")
    String incubationFamily = Scenario.demo().incubationFamily();

    @Option(names = "--incubation-mean", paramLabel = "DAYS", description = "Incubation period mean (default ${DEFAULT-VALUE}).")
    double incubationMean = Scenario.demo().incubationMean();

    @Option(names = "--incubation-sd", paramLabel = "DAYS", description = "Incubation period sd (default ${DEFAULT-VALUE}).")
    double incubationSd = Scenario.demo().incubationSd();

    @Option(names = "--fatality", paramLabel = "P", description = "Probability that a case dies (default ${DEFAULT-VALUE}).")
    double fatality = Scenario.demo().fatality();

    @Option(names = "--death-mean", paramLabel = "DAYS", description = "Gamma onset-to-death mean (default ${DEFAULT-VALUE}).")
    double deathMean = Scenario.demo().deathMean();

    @Option(names = "--death-sd", paramLabel = "DAYS", description = "Gamma onset-to-death sd (default ${DEFAULT-VALUE}).")
    double deathSd = Scenario.demo().deathSd();

    @Option(names = "--recovery-mean", paramLabel = "DAYS", description = "Gamma onset-to-recovery mean (default ${DEFAULT-VALUE}).")
    double recoveryMean = Scenario.demo().recoveryMean();

    @Option(names = "--recovery-sd", paramLabel = "DAYS", description = "Gamma onset-to-recovery sd (default ${DEFAULT-VALUE}).")
    double recoverySd = Scenario.demo().recoverySd();

    @Option(names = "--days", paramLabel = "N", description = "Observed days (the stop day; default ${DEFAULT-VALUE}).")
    int days = Scenario.demo().days();

    @Option(names = "--traced", paramLabel = "N", description = "Traced cases with candidate contacts in intervals.csv (default ${DEFAULT-VALUE}).")
    int traced = Scenario.demo().traced();

    @Option(names = "--windows", paramLabel = "N", description = "Traced cases with an exposure window in incubation.csv (default ${DEFAULT-VALUE}).")
    int windows = Scenario.demo().windows();

    @Option(names = "--contact-infection", paramLabel = "P", description = "Chance that a contact infects (default ${DEFAULT-VALUE}).")
    double contactInfection = Scenario.demo().contactInfection();

    @Option(names = "--contact-rate", paramLabel = "PER_DAY", description = "Contacts per day, open stream until onset (default ${DEFAULT-VALUE}).")
    double contactRate = Scenario.demo().contactRate();

    @Option(names = "--origin-date", paramLabel = "DATE", converter = InputOptions.DateConverter.class,
            description = "Date of day 0 in the files (default ${DEFAULT-VALUE}).")
    LocalDate origin = Scenario.demo().origin();

    /** Creates the command. */
    public SimulateCommand() {
    }

    @Override
    protected int run() throws Exception {
        Scenario s = new Scenario(seed, reproductionNumber, dispersion, generationMean, generationSd,
                incubationFamily, incubationMean, incubationSd, fatality, deathMean, deathSd, recoveryMean,
                recoverySd, days, traced, windows, contactInfection, contactRate, origin);
        err().println("incipit: simulating (seed " + seed + ") ...");
        err().flush();
        List<Path> files = s.write(out, s.isDemo() ? "incipit simulate --out DIR" : commandLine(s));
        ObjectNode json = JsonOutput.object();
        json.put("command", "simulate");
        json.put("out", out.toString());
        ArrayNode a = json.putArray("files");
        TextTable table = TextTable.of("file written");
        for (Path p : files) {
            a.add(p.toString());
            table.row(p.toString());
        }
        json.put("demoScenario", s.isDemo());
        emit(json, table);
        return ExitCode.OK;
    }

    private static String commandLine(Scenario s) {
        return "incipit simulate --out DIR --seed " + s.seed() + " --reproduction-number " + s.reproductionNumber()
                + " --dispersion " + s.dispersion() + " --generation-mean " + s.generationMean()
                + " --generation-sd " + s.generationSd() + " --incubation-family " + s.incubationFamily()
                + " --incubation-mean " + s.incubationMean() + " --incubation-sd " + s.incubationSd()
                + " --fatality " + s.fatality() + " --death-mean " + s.deathMean() + " --death-sd " + s.deathSd()
                + " --recovery-mean " + s.recoveryMean() + " --recovery-sd " + s.recoverySd()
                + " --days " + s.days() + " --traced " + s.traced() + " --windows " + s.windows()
                + " --contact-infection " + s.contactInfection() + " --contact-rate " + s.contactRate()
                + " --origin-date " + s.origin();
    }
}
