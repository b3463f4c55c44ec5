package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.branching.OffspringLaw;
import org.incipit.core.growth.EulerLotka;
import org.incipit.core.simulate.ExposureModel;
import org.incipit.core.simulate.ExposureRecords;
import org.incipit.core.simulate.ExposureSampler;
import org.incipit.core.simulate.OutbreakOptions;
import org.incipit.core.simulate.OutbreakSimulator;
import org.incipit.core.simulate.SimulatedData;
import org.incipit.core.simulate.SimulatedOutbreak;
import org.incipit.core.observe.DelayPairs;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.GammaDelay;
import org.incipit.io.JsonOutput;

/**
 * A simulated outbreak written as the four input files plus its true values. The defaults are
 * the shipped demo scenario (an invented place and pathogen); {@code incipit simulate} with no
 * option other than {@code --out} regenerates the shipped files byte for byte.
 *
 * <p>Files: {@code counts.csv} (onsets, deaths, recoveries and the imported index case by
 * date), {@code delays.csv} (onset-to-death pairs by date, right-truncated at the last complete
 * day), {@code intervals.csv} (traced cases: every recorded contact with a possible source
 * before onset, as candidate starts of the exposure-to-onset interval; day numbers),
 * {@code incubation.csv} (a separate sample of cases with 4 contacts in 4 days: window from the first to the last
 * recorded contact, and onset; day numbers) and {@code truth.json}.
 */
record Scenario(long seed, double reproductionNumber, double dispersion,
                double generationMean, double generationSd,
                String incubationFamily, double incubationMean, double incubationSd,
                double fatality, double deathMean, double deathSd, double recoveryMean, double recoverySd,
                int days, int traced, int windows, double contactInfection, double contactRate,
                LocalDate origin) {

    /** Name of the invented place of the demo. */
    static final String PLACE = "Port Avenell";
    /** Name of the invented pathogen of the demo. */
    static final String PATHOGEN = "Quillon fever";
    /** The shipped files, in the order written. */
    static final List<String> FILES = List.of("counts.csv", "delays.csv", "intervals.csv", "incubation.csv",
            "truth.json");

    Scenario {
        if (traced < 1 || windows < 0) {
            throw new IllegalArgumentException("--traced must be >= 1 and --windows >= 0, were " + traced
                    + " and " + windows);
        }
        if (days < 10 || days > 365) {
            throw new IllegalArgumentException("--days must be in [10, 365], was " + days);
        }
        DelayFamilies.byName(incubationFamily);
    }

    /** @return the demo scenario */
    static Scenario demo() {
        return new Scenario(20260401L, 1.8, 0.5, 6.0, 3.0, "lognormal", 5.5, 2.2,
                0.08, 12.0, 5.0, 14.0, 4.0, 56, 80, 80, 0.3, 1.0, LocalDate.of(2031, 4, 6));
    }

    GammaDelay generationInterval() {
        return GammaDelay.ofMeanSd(generationMean, generationSd);
    }

    DelayDistribution incubation() {
        return DelayFamilies.byName(incubationFamily).ofMeanSd(incubationMean, incubationSd);
    }

    GammaDelay onsetToDeath() {
        return GammaDelay.ofMeanSd(deathMean, deathSd);
    }

    GammaDelay onsetToRecovery() {
        return GammaDelay.ofMeanSd(recoveryMean, recoverySd);
    }

    /** @return the true exponential growth rate per day (Euler-Lotka with the generation interval) */
    double growthRate() {
        return EulerLotka.growthRate(generationInterval(), reproductionNumber);
    }

    OutbreakOptions options() {
        return OutbreakOptions.builder(OffspringLaw.negativeBinomial(reproductionNumber, dispersion),
                        generationInterval(), incubation())
                .outcomes(fatality, onsetToDeath(), onsetToRecovery())
                .stopDay(days)
                .maxCases(200_000)
                .conditionOnSurvival(1000)
                .exposures(ExposureModel.open(contactInfection, contactRate))
                .build();
    }

    SimulatedOutbreak simulate() {
        return OutbreakSimulator.simulate(RandomSource.XO_RO_SHI_RO_128_PP.create(seed), options());
    }

    /**
     * Simulates and writes the files into {@code dir}, creating it.
     *
     * @param dir output folder
     * @param command the command line that regenerates the files (for the file headers)
     * @return the files written
     */
    List<Path> write(Path dir, String command) throws IOException {
        Files.createDirectories(dir);
        SimulatedOutbreak o = simulate();
        ExposureRecords rec = o.exposures().orElseThrow();
        String head = "# " + (isDemo() ? PATHOGEN + " in " + PLACE + " (both invented): " : "")
                + "simulated data, not a real outbreak.\n"
                + "# Generated by the Incipit simulator, seed " + seed + ": " + command + "\n";
        List<Path> out = new ArrayList<>();
        int complete = o.days(); // stopDay is a whole number: days 0 .. days-1 are complete
        // traced cases: the earliest infected, so that all have their onset before the end
        int tracedCount = Math.min(traced, rec.size());
        int windowCount = windows;
        StringBuilder sb = new StringBuilder(head)
                .append("# Daily counts by date of symptom onset, deaths and recoveries by date of outcome;\n")
                .append("# imported = the index case (infected elsewhere).\n")
                .append("day,cases,deaths,recoveries,imported\n");
        int[] onsets = o.dailyOnsets();
        int[] deaths = o.dailyDeaths();
        int[] recoveries = o.dailyRecoveries();
        int[] imported = new int[complete];
        for (int i = 0; i < o.size(); i++) {
            if (o.generation(i) == 0 && o.onsetTime(i) < complete) {
                imported[(int) Math.floor(o.onsetTime(i))]++;
            }
        }
        for (int d = 0; d < complete; d++) {
            sb.append(origin.plusDays(d)).append(',').append(onsets[d]).append(',').append(deaths[d]).append(',')
                    .append(recoveries[d]).append(',').append(imported[d]).append('\n');
        }
        out.add(write(dir.resolve("counts.csv"), sb));

        DelayPairs pairs = SimulatedData.onsetToDeath(o, true);
        int cutoff = (int) pairs.cutoff().getAsDouble();
        sb = new StringBuilder(head)
                .append("# Onset-to-death pairs of the deaths reported by ").append(origin.plusDays(cutoff))
                .append(" (the cut-off: right-truncated).\n")
                .append("case,primary,secondary\n");
        for (int i = 0; i < pairs.size(); i++) {
            sb.append(pairs.id(i)).append(',').append(origin.plusDays((long) pairs.primary(i))).append(',')
                    .append(origin.plusDays((long) pairs.secondary(i))).append('\n');
        }
        out.add(write(dir.resolve("delays.csv"), sb));

        sb = new StringBuilder(head)
                .append("# Traced cases: one row per recorded contact with a possible source before onset\n")
                .append("# (start), with the case's symptom onset (end). Day numbers, day 0 = ").append(origin)
                .append(".\n")
                .append("case,end,start\n");
        for (int i = 0; i < tracedCount; i++) {
            for (int j = 0; j < rec.candidateCount(i); j++) {
                sb.append('T').append(i + 1).append(',').append(fixed(rec.onset(i))).append(',')
                        .append(fixed(rec.candidateTime(i, j))).append('\n');
            }
        }
        out.add(write(dir.resolve("intervals.csv"), sb));

        // Exposure windows come from a separate survey of cases with a few known contacts in a short
        // period (the library's exposure sampler, COMPLETE regime: 4 contacts spread over 4 days, all
        // before onset), so that the window hardly depends on the incubation period (only a history
        // reaching onset, possible for incubation periods under 4 days, is redrawn); drawn from its
        // own stream.
        sb = new StringBuilder(head)
                .append("# Cases with a known exposure period: window from the first to the last of their contacts\n")
                .append("# (all before onset), and onset. Day numbers, day 0 = ").append(origin).append(".\n")
                .append("case,exposure_from,exposure_to,onset\n");
        if (windowCount > 0) {
            ExposureRecords w = ExposureSampler.sample(RandomSource.XO_RO_SHI_RO_128_PP.create(seed + 1),
                    ExposureModel.complete(contactInfection, 4, 4.0), incubation(), windowCount);
            // the sampler puts each infection at time 0: move each case to a calendar day of its own
            UniformRandomProvider days = RandomSource.XO_RO_SHI_RO_128_PP.create(seed + 2);
            for (int i = 0; i < windowCount; i++) {
                double shift = Math.floor(days.nextDouble() * (this.days - 10)) + 0.5;
                int m = w.candidateCount(i);
                double onset = w.onset(i) + shift;
                double from = w.candidateTime(i, 0) + shift;
                double to = w.candidateTime(i, m - 1) + shift; // the sampler keeps every contact before onset
                sb.append('W').append(i + 1).append(',').append(fixed(from)).append(',')
                        .append(fixed(to)).append(',').append(fixed(onset)).append('\n');
            }
        }
        out.add(write(dir.resolve("incubation.csv"), sb));

        ObjectNode t = truth(o, cutoff, tracedCount, windowCount);
        out.add(write(dir.resolve("truth.json"), new StringBuilder(JsonOutput.write(t).replace("\r\n", "\n"))));
        return out;
    }

    boolean isDemo() {
        return equals(demo());
    }

    private ObjectNode truth(SimulatedOutbreak o, int cutoff, int tracedCount, int windowCount) {
        ObjectNode t = JsonOutput.object();
        if (isDemo()) {
            t.put("place", PLACE + " (invented)");
            t.put("pathogen", PATHOGEN + " (invented)");
        }
        t.put("note", "true values of the simulation that produced these files");
        t.put("seed", seed);
        t.put("origin", origin.toString());
        t.put("days", days);
        t.put("cutoff", origin.plusDays(cutoff).toString());
        t.put("infected", o.size());
        t.put("tracedIntervalCases", tracedCount);
        t.put("tracedWindowCases", windowCount);
        t.put("reproductionNumber", reproductionNumber);
        t.put("dispersion", dispersion);
        t.put("growthRate", growthRate());
        t.put("doublingTime", Math.log(2) / growthRate());
        t.set("generationInterval", delay(generationInterval()));
        t.set("incubationPeriod", delay(incubation()));
        t.set("onsetToDeath", delay(onsetToDeath()));
        t.set("onsetToRecovery", delay(onsetToRecovery()));
        t.put("fatalityRatio", fatality);
        ObjectNode c = t.putObject("contacts");
        c.put("infectionProbability", contactInfection);
        c.put("ratePerDay", contactRate);
        c.put("exposureHistory", "open");
        ObjectNode w = t.putObject("exposureWindows");
        w.put("note", "incubation.csv: separate sample, COMPLETE regime");
        w.put("contacts", 4);
        w.put("windowDays", 4.0);
        return t;
    }

    private static ObjectNode delay(DelayDistribution d) {
        ObjectNode o = JsonOutput.object();
        o.put("family", d.familyName());
        ObjectNode p = o.putObject("parameters");
        double[] v = ((org.incipit.distributions.ParametricDelay) d).parameters();
        List<String> names = ((org.incipit.distributions.ParametricDelay) d).family().parameterNames();
        for (int i = 0; i < v.length; i++) {
            p.put(names.get(i).toLowerCase(Locale.ROOT), v[i]);
        }
        o.put("mean", d.mean());
        o.put("sd", d.sd());
        return o;
    }

    private static Path write(Path file, StringBuilder text) throws IOException {
        Files.writeString(file, text, StandardCharsets.UTF_8);
        return file;
    }

    /** Two decimals, locale-independent, never "-0.00". */
    static String fixed(double x) {
        String s = String.format(Locale.ROOT, "%.2f", x);
        return s.equals("-0.00") ? "0.00" : s;
    }
}
