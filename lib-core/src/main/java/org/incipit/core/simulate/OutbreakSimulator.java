package org.incipit.core.simulate;

import java.util.Arrays;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.DiscreteSampler;
import org.incipit.core.EstimationException;
import org.incipit.distributions.DelayDistribution;

/**
 * Individual-based, continuous-time outbreak simulator (a stochastic branching process in
 * calendar time; the "Crump&ndash;Mode&ndash;Jagers" type of Jagers 1975, <i>Branching Processes
 * with Biological Applications</i>).
 *
 * <p>Every infected person draws an offspring count from the offspring law; each offspring is
 * infected at the person's infection time plus an independent generation interval. Onset is
 * infection plus an incubation period; the outcome is death with probability p at onset plus
 * an onset-to-death delay, else recovery at onset plus an onset-to-recovery delay. Pending
 * infections wait in a 4-ary heap keyed by infection time and are processed in calendar order,
 * so the stop rules are exact: the line list is precisely the set of people infected before
 * the stop day, or the first maxCases infected, or everyone infected up to the maxOnsets-th
 * symptom onset (that onset is found exactly: once the next pending infection is no earlier
 * than the largest of the maxOnsets smallest onsets seen, no later infection can have an
 * earlier onset). The first rule met ends the outbreak. Memory is linear in the number of infections
 * processed (flat primitive arrays grown by doubling; no per-person objects).
 *
 * <p>With conditioning on survival, outbreaks that die out before a stop rule is met are drawn
 * again from the same generator (rejection; exact conditioning on "not extinct at the stop").
 * When the stop is a large case count this approximates conditioning on eventual survival
 * (the chance of later extinction is q raised to the number of pending infections).
 *
 * <p>Usage:
 * <pre>{@code
 * OutbreakOptions opts = OutbreakOptions.builder(OffspringLaw.negativeBinomial(2.0, 0.5),
 *         GammaDelay.ofShapeRate(4, 0.8), LogNormalDelay.ofMeanLogSdLog(1.6, 0.4))
 *     .outcomes(0.02, GammaDelay.ofShapeRate(3, 0.2), GammaDelay.ofShapeRate(5, 0.3))
 *     .maxCases(2000).conditionOnSurvival(100)
 *     .exposures(ExposureModel.open(0.2, 1.5))
 *     .build();
 * SimulatedOutbreak o = OutbreakSimulator.simulate(RandomSource.XO_RO_SHI_RO_128_PP.create(7L), opts);
 * }</pre>
 */
public final class OutbreakSimulator {

    private OutbreakSimulator() {
    }

    /**
     * Simulates one outbreak.
     *
     * @param rng     source of randomness (not stored); same seed, same outbreak
     * @param options configuration
     * @return the outbreak
     * @throws IllegalArgumentException if an argument is null
     * @throws EstimationException if conditioning on survival found no surviving outbreak in
     *         {@link OutbreakOptions#maxAttempts()} draws
     */
    public static SimulatedOutbreak simulate(UniformRandomProvider rng, OutbreakOptions options) {
        if (rng == null || options == null) {
            throw new IllegalArgumentException("rng and options must not be null");
        }
        DiscreteSampler offspring = options.offspring().sampler(rng);
        int attempts = 0;
        while (true) {
            attempts++;
            Run run = new Run(rng, options, offspring);
            run.execute();
            if (!options.conditionOnSurvival() || run.reason != StopReason.EXTINCT) {
                return run.result(attempts);
            }
            if (attempts >= options.maxAttempts()) {
                throw new EstimationException("no outbreak survived to a stop rule in " + attempts
                    + " attempts (offspring " + options.offspring() + ", extinction probability "
                    + options.offspring().extinctionProbability() + ")");
            }
        }
    }

    /** One draw; mutable, confined to the simulating thread. */
    private static final class Run {
        private final UniformRandomProvider rng;
        private final OutbreakOptions o;
        private final DiscreteSampler offspringSampler;
        private final DelayDistribution gi;
        private final DelayDistribution incubation;
        private final DelayDistribution toDeath;
        private final DelayDistribution toRecovery;
        private final double p;
        private final ExposureGenerator exposures;

        // 4-ary min-heap of pending infections, entries interleaved as (time bits, infector):
        // the four children of a node are contiguous (one or two cache lines). Times are
        // non-negative, so their raw IEEE bits order like the times. The infectee's generation
        // is the infector's plus one, so it is not stored.
        private long[] heap = new long[128];
        private int hSize;

        // line list
        private int n;
        private int[] infector = new int[64];
        private double[] infection = new double[64];
        private double[] onset = new double[64];
        private byte[] outcome;
        private double[] outcomeTime;
        private int[] generation = new int[64];
        private int[] offspring = new int[64];

        // max-heap of the smallest onsets (onset stop rule only)
        private double[] oHeap = new double[64];
        private int oSize;

        private StopReason reason;
        private double end;

        Run(UniformRandomProvider rng, OutbreakOptions o, DiscreteSampler offspringSampler) {
            this.rng = rng;
            this.o = o;
            this.offspringSampler = offspringSampler;
            this.gi = o.generationInterval();
            this.incubation = o.incubationPeriod();
            this.toDeath = o.onsetToDeath();
            this.toRecovery = o.onsetToRecovery();
            this.p = o.fatalityProbability();
            this.exposures = o.exposures() == null ? null : new ExposureGenerator(o.exposures());
            if (o.simulatesOutcomes()) {
                outcome = new byte[64];
                outcomeTime = new double[64];
            }
        }

        void execute() {
            for (int i = 0; i < o.indexCases(); i++) {
                push(0, -1);
            }
            double stopDay = o.stopDay();
            int maxCases = o.maxCases();
            int maxOnsets = o.maxOnsets();
            while (true) {
                double t = hSize == 0 ? Double.POSITIVE_INFINITY : Double.longBitsToDouble(heap[0]);
                // Onset rule: once maxOnsets onsets are known and the next infection is no
                // earlier than the largest of the maxOnsets smallest onsets, no later infection
                // can change that value (onset >= infection): it is the maxOnsets-th onset.
                if (oSize == maxOnsets && t >= oHeap[0] && oHeap[0] <= stopDay) {
                    reason = StopReason.ONSET_LIMIT;
                    end = oHeap[0];
                    trimAfter(end);
                    return;
                }
                if (hSize == 0) {
                    reason = StopReason.EXTINCT;
                    end = stopDay;
                    return;
                }
                if (t >= stopDay) {
                    reason = StopReason.DAY_LIMIT;
                    end = stopDay;
                    return;
                }
                int from = (int) heap[1];
                pop();
                record(t, from, from < 0 ? 0 : generation[from] + 1);
                if (maxOnsets != Integer.MAX_VALUE) {
                    offerOnset(onset[n - 1], maxOnsets);
                }
                if (n == maxCases) {
                    reason = StopReason.CASE_LIMIT;
                    end = t;
                    return;
                }
            }
        }

        /** Keeps the maxOnsets smallest onsets in a max-heap (root = largest kept). */
        private void offerOnset(double s, int cap) {
            if (oSize < cap) {
                if (oSize == oHeap.length) {
                    oHeap = Arrays.copyOf(oHeap, 2 * oHeap.length);
                }
                int i = oSize++;
                while (i > 0) {
                    int parent = (i - 1) >>> 1;
                    if (oHeap[parent] >= s) {
                        break;
                    }
                    oHeap[i] = oHeap[parent];
                    i = parent;
                }
                oHeap[i] = s;
                return;
            }
            if (s >= oHeap[0]) {
                return;
            }
            int i = 0;
            while (true) {
                int child = 2 * i + 1;
                if (child >= oSize) {
                    break;
                }
                if (child + 1 < oSize && oHeap[child + 1] > oHeap[child]) {
                    child++;
                }
                if (oHeap[child] <= s) {
                    break;
                }
                oHeap[i] = oHeap[child];
                i = child;
            }
            oHeap[i] = s;
        }

        /** Drops people infected after {@code end} (a time-ordered suffix of the ids). */
        private void trimAfter(double end) {
            int keep = n;
            while (keep > 0 && infection[keep - 1] > end) {
                keep--;
            }
            n = keep;
        }

        private void record(double t, int from, int gen) {
            if (n == infection.length) {
                grow();
            }
            int i = n++;
            infector[i] = from;
            infection[i] = t;
            generation[i] = gen;
            double s = t + incubation.sample(rng);
            onset[i] = s;
            if (outcome != null) {
                if (rng.nextDouble() < p) {
                    outcome[i] = SimulatedOutbreak.DEATH;
                    outcomeTime[i] = s + toDeath.sample(rng);
                } else {
                    outcome[i] = SimulatedOutbreak.RECOVERY;
                    outcomeTime[i] = s + toRecovery.sample(rng);
                }
            }
            if (exposures != null) {
                exposures.addCase(rng, t, s);
            }
            int z = offspringSampler.sample();
            offspring[i] = z;
            for (int c = 0; c < z; c++) {
                double child = t + gi.sample(rng);
                if (!(child >= t)) {
                    throw new IllegalArgumentException("generationInterval sampled " + (child - t)
                        + ", must be >= 0 (" + gi.familyName() + ")");
                }
                push(child, i);
            }
        }

        private void grow() {
            int cap = 2 * infection.length;
            infector = Arrays.copyOf(infector, cap);
            infection = Arrays.copyOf(infection, cap);
            onset = Arrays.copyOf(onset, cap);
            generation = Arrays.copyOf(generation, cap);
            offspring = Arrays.copyOf(offspring, cap);
            if (outcome != null) {
                outcome = Arrays.copyOf(outcome, cap);
                outcomeTime = Arrays.copyOf(outcomeTime, cap);
            }
        }

        private void push(double t, int from) {
            if (2 * hSize + 2 > heap.length) {
                heap = Arrays.copyOf(heap, 2 * heap.length);
            }
            long key = Double.doubleToRawLongBits(t);
            int i = hSize++;
            while (i > 0) {
                int parent = (i - 1) >>> 2;
                long pk = heap[2 * parent];
                if (pk <= key) {
                    break;
                }
                heap[2 * i] = pk;
                heap[2 * i + 1] = heap[2 * parent + 1];
                i = parent;
            }
            heap[2 * i] = key;
            heap[2 * i + 1] = from;
        }

        private void pop() {
            int last = --hSize;
            if (last == 0) {
                return;
            }
            long key = heap[2 * last];
            long from = heap[2 * last + 1];
            int i = 0;
            while (true) {
                int first = 4 * i + 1;
                if (first >= last) {
                    break;
                }
                int best = first;
                long bk = heap[2 * first];
                int stop = Math.min(first + 4, last);
                for (int c = first + 1; c < stop; c++) {
                    long ck = heap[2 * c];
                    if (ck < bk) {
                        bk = ck;
                        best = c;
                    }
                }
                if (key <= bk) {
                    break;
                }
                heap[2 * i] = bk;
                heap[2 * i + 1] = heap[2 * best + 1];
                i = best;
            }
            heap[2 * i] = key;
            heap[2 * i + 1] = from;
        }

        SimulatedOutbreak result(int attempts) {
            double observationEnd = end;
            return new SimulatedOutbreak(o, n, Arrays.copyOf(infector, n), Arrays.copyOf(infection, n),
                Arrays.copyOf(onset, n), outcome == null ? null : Arrays.copyOf(outcome, n),
                outcomeTime == null ? null : Arrays.copyOf(outcomeTime, n), Arrays.copyOf(generation, n),
                Arrays.copyOf(offspring, n), observationEnd, reason, attempts,
                exposures == null ? null : exposures.build(n));
        }
    }
}
