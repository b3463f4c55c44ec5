package org.incipit.benchmarks;

import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.function.IntFunction;
import java.util.function.Supplier;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.branching.OffspringLaw;
import org.incipit.core.estimate.ambiguous.AmbiguousStartEstimator;
import org.incipit.core.estimate.ambiguous.ExposureHistory;
import org.incipit.core.estimate.delay.DelayEstimator;
import org.incipit.core.estimate.delay.DelayOptions;
import org.incipit.core.estimate.delay.IncubationEstimator;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;
import org.incipit.core.simulate.ExposureModel;
import org.incipit.core.simulate.ExposureSampler;
import org.incipit.core.simulate.OutbreakOptions;
import org.incipit.core.simulate.OutbreakSimulator;
import org.incipit.core.simulate.SimulatedData;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.GammaDelay;
import org.incipit.distributions.LogNormalDelay;

/**
 * Scaling table: time and peak heap of the main estimators at n = 10^3 .. 10^6 (or a smaller
 * maximum given as the first argument), printed as a Markdown table.
 *
 * <p>Not a JMH benchmark: each cell is the best of a few warm repetitions of one full call
 * (with intervals), which is what a pipeline pays; the peak heap is the rise of the heap pools'
 * peak usage over the level after a GC with the data already built, so it counts the
 * estimator's working memory, not the input. Run with
 * {@code java -Xmx8g -cp benchmarks/target/benchmarks.jar org.incipit.benchmarks.ScalingTable [maxN]}.
 */
public final class ScalingTable {

    private static final long SEED = 20261201L;

    private ScalingTable() {
    }

    /** @param args optional maximum n (default 1,000,000) */
    public static void main(String[] args) {
        int maxN = args.length > 0 ? Integer.parseInt(args[0]) : 1_000_000;
        List<String> rows = new ArrayList<>();
        rows.add("| estimator | n | time (ms) | peak working heap (MB) | time per unit (µs) |");
        rows.add("|---|---|---|---|---|");
        for (int n = 1000; n <= maxN; n *= 10) {
            final int size = n;
            AmbiguousStartCases cases = ambiguous(size);
            row(rows, "ambiguous-start gamma ML, open (cases)", size,
                    () -> AmbiguousStartEstimator.fit(cases, DelayFamilies.GAMMA, ExposureHistory.open()));
            DelayPairs pairs = truncatedPairs(size);
            row(rows, "right-truncated lognormal delays (pairs)", size,
                    () -> DelayEstimator.rightTruncated(pairs, DelayFamilies.LOGNORMAL, DelayOptions.defaults()));
            ExposureWindows windows = windows(size);
            row(rows, "incubation, interval-censored gamma (cases)", size,
                    () -> IncubationEstimator.fit(windows, DelayFamilies.GAMMA,
                            org.incipit.core.estimate.delay.ExposureWindowModel.intervalCensored(),
                            DelayOptions.defaults()));
            row(rows, "outbreak simulator (infections)", size, simulate(size));
            System.err.println("done n = " + size);
        }
        rows.forEach(System.out::println);
    }

    private static UniformRandomProvider rng(long salt) {
        return RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + salt);
    }

    private static AmbiguousStartCases ambiguous(int n) {
        return SimulatedData.ambiguousStarts(ExposureSampler.sample(rng(1), ExposureModel.open(0.4, 0.8),
                GammaDelay.ofShapeRate(2.5, 0.5), n), "c");
    }

    private static DelayPairs truncatedPairs(int n) {
        UniformRandomProvider rng = rng(2);
        DelayDistribution f = LogNormalDelay.ofMeanLogSdLog(1.5, 0.6);
        double t = 60;
        DelayPairs.Builder b = DelayPairs.builder(t);
        int i = 0;
        while (b.size() < n) {
            double s = Math.log1p(rng.nextDouble() * Math.expm1(0.1 * t)) / 0.1; // growing primaries
            double q = s + f.sample(rng);
            if (q <= t) {
                b.addObserved("p" + i++, s, q);
            }
        }
        return b.build();
    }

    private static ExposureWindows windows(int n) {
        return SimulatedData.exposureWindows(ExposureSampler.sample(rng(3), ExposureModel.open(0.4, 0.8),
                GammaDelay.ofShapeRate(2.5, 0.5), n), "w");
    }

    private static Supplier<Object> simulate(int n) {
        OutbreakOptions opts = OutbreakOptions.builder(OffspringLaw.negativeBinomial(2.0, 0.5),
                        GammaDelay.ofShapeRate(4, 0.8), LogNormalDelay.ofMeanLogSdLog(1.6, 0.4))
                .maxCases(n).conditionOnSurvival(1000).build();
        IntFunction<Object> run = seed -> OutbreakSimulator.simulate(rng(100 + seed), opts);
        return () -> run.apply(7);
    }

    private static void row(List<String> rows, String name, int n, Supplier<Object> call) {
        int reps = n >= 1_000_000 ? 2 : n >= 100_000 ? 3 : 5;
        double best = Double.POSITIVE_INFINITY;
        long peak = 0;
        for (int r = 0; r < reps; r++) {
            System.gc();
            long base = heapUsed();
            resetPeaks();
            long t0 = System.nanoTime();
            Object result = call.get();
            long t1 = System.nanoTime();
            peak = Math.max(peak, heapPeak() - base);
            best = Math.min(best, (t1 - t0) / 1e6);
            if (result == null) {
                throw new IllegalStateException(name + " returned null");
            }
        }
        rows.add(String.format(Locale.ROOT, "| %s | %,d | %.1f | %.1f | %.2f |", name, n, best,
                Math.max(0, peak) / 1e6, 1000 * best / n));
    }

    private static List<MemoryPoolMXBean> heapPools() {
        List<MemoryPoolMXBean> out = new ArrayList<>();
        for (MemoryPoolMXBean p : ManagementFactory.getMemoryPoolMXBeans()) {
            if (p.getType() == MemoryType.HEAP) {
                out.add(p);
            }
        }
        return out;
    }

    private static long heapUsed() {
        long s = 0;
        for (MemoryPoolMXBean p : heapPools()) {
            s += p.getUsage().getUsed();
        }
        return s;
    }

    private static void resetPeaks() {
        heapPools().forEach(MemoryPoolMXBean::resetPeakUsage);
    }

    private static long heapPeak() {
        long s = 0;
        for (MemoryPoolMXBean p : heapPools()) {
            s += p.getPeakUsage().getUsed();
        }
        return s;
    }
}
