package org.incipit.examples;

import java.io.PrintStream;
import java.util.Locale;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.branching.OffspringLaw;
import org.incipit.core.estimate.ambiguous.AmbiguousStartEstimator;
import org.incipit.core.estimate.ambiguous.AmbiguousStartFit;
import org.incipit.core.estimate.ambiguous.ExposureHistory;
import org.incipit.core.estimate.ambiguous.NaiveFit;
import org.incipit.core.estimate.ambiguous.NaiveRule;
import org.incipit.core.growth.EulerLotka;
import org.incipit.core.growth.GrowthRateEstimator;
import org.incipit.core.growth.GrowthRateFit;
import org.incipit.core.growth.GrowthRateOptions;
import org.incipit.core.inference.Estimate;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.observe.DailyCounts;
import org.incipit.core.simulate.ExposureModel;
import org.incipit.core.simulate.ExposureRecords;
import org.incipit.core.simulate.OutbreakOptions;
import org.incipit.core.simulate.OutbreakSimulator;
import org.incipit.core.simulate.SimulatedData;
import org.incipit.core.simulate.SimulatedOutbreak;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.GammaDelay;
import org.incipit.distributions.LogNormalDelay;

/**
 * A tour of the library for embedding: simulate an outbreak with known parameters, turn it into
 * the observation types an analyst would have, estimate, and print the estimates beside the
 * truth. Run it with {@code java -cp lib-examples/target/incipit-app.jar
 * org.incipit.examples.EmbeddingExample}.
 */
public final class EmbeddingExample {

    private EmbeddingExample() {
    }

    /**
     * Runs the tour, printing to standard output.
     *
     * @param args ignored
     */
    public static void main(String[] args) {
        run(System.out, 20240501L);
    }

    /**
     * Runs the tour.
     *
     * @param out  where to print
     * @param seed random seed: same seed, same output
     */
    public static void run(PrintStream out, long seed) {
        // 1. Simulate: R = 1.8 with superspreading (k = 0.5), gamma generation interval
        //    (mean 6, sd 3 days), lognormal incubation period, 60 days of observation.
        GammaDelay generation = GammaDelay.ofMeanSd(6, 3);
        OutbreakOptions options = OutbreakOptions.builder(OffspringLaw.negativeBinomial(1.8, 0.5),
                        generation, LogNormalDelay.ofMeanSd(5.5, 2.2))
                .outcomes(0.05, GammaDelay.ofMeanSd(12, 5), GammaDelay.ofMeanSd(14, 4))
                .stopDay(60)
                .maxCases(200_000)
                .conditionOnSurvival(1000)
                .exposures(ExposureModel.open(0.3, 1.0))
                .build();
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        SimulatedOutbreak outbreak = OutbreakSimulator.simulate(rng, options);

        // 2. Observe: what an analyst would have: daily counts by onset day, and for 80 traced
        //    cases every recorded contact before onset (which one infected is unknown).
        DailyCounts counts = SimulatedData.dailyCounts(outbreak);
        ExposureRecords records = outbreak.exposures().orElseThrow();
        AmbiguousStartCases.Builder traced = AmbiguousStartCases.builder();
        for (int i = 0; i < 80; i++) {
            for (int j = 0; j < records.candidateCount(i); j++) {
                traced.addCandidate("case" + i, records.onset(i), records.candidateTime(i, j), null,
                        AmbiguousStartCases.UNKNOWN_TOTAL);
            }
        }
        AmbiguousStartCases cases = traced.build();

        // 3. Estimate: growth rate by Poisson regression, then R by the Euler-Lotka equation
        //    (generation interval taken as known here: zero covariance of its parameters).
        GrowthRateFit growth = GrowthRateEstimator.fit(counts, GrowthRateOptions.defaults());
        Estimate r = growth.rateProfile();
        Estimate bigR = EulerLotka.reproductionNumberDelta(generation, new double[2][2], r);

        //    Incubation period from the ambiguous exposures: lognormal by maximum likelihood,
        //    exposures going on until onset ("open" history), then the naive nearest-contact rule.
        AmbiguousStartFit incubation = AmbiguousStartEstimator.fit(cases, DelayFamilies.LOGNORMAL,
                ExposureHistory.open()).requireConverged();
        NaiveFit nearest = AmbiguousStartEstimator.naive(cases, DelayFamilies.LOGNORMAL, NaiveRule.LATEST, 0.95);

        // 4. Print, with the truth of the simulation.
        double trueRate = EulerLotka.growthRate(generation, 1.8);
        out.println("simulated " + outbreak.size() + " infections, " + counts.totalCases() + " onsets in "
                + counts.size() + " days");
        out.println(line("growth rate per day", r, trueRate));
        growth.doublingTime().ifPresent(td -> out.println(line("doubling time, days", td, Math.log(2) / trueRate)));
        out.println(line("reproduction number", bigR, 1.8));
        out.println(line("incubation mean", incubation.mean(), 5.5));
        out.println(line("  naive (nearest)", nearest.mean(), 5.5));
        out.println(line("p per contact", incubation.p(), 0.3));
    }

    private static String line(String what, Estimate e, double truth) {
        return String.format(Locale.ROOT, "%-20s %8.4f  (95%% %s interval %.4f to %.4f)  true %.4f", what,
                e.estimate(), e.method(), e.lower(), e.upper(), truth);
    }
}
