package org.incipit.core.estimate.ambiguous;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.function.ToDoubleFunction;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.AhrensDieterMarsagliaTsangGammaSampler;
import org.apache.commons.rng.sampling.distribution.PoissonSampler;
import org.apache.commons.rng.sampling.distribution.ZigguratSampler;

/**
 * Small exposure-process sampler for tests: draws ambiguous-start case data forward in time
 * under the three exposure regimes of docs/methods.md section 1.
 */
final class Sim {

    private Sim() {
    }

    /** Sampler of H. */
    interface Delay extends ToDoubleFunction<UniformRandomProvider> {
    }

    static Delay gamma(double shape, double rate) {
        return rng -> AhrensDieterMarsagliaTsangGammaSampler.of(rng, shape, 1 / rate).sample();
    }

    static Delay lognormal(double meanLog, double sdLog) {
        return rng -> Math.exp(meanLog + sdLog * ZigguratSampler.NormalizedGaussian.of(rng).sample());
    }

    static Delay weibull(double shape, double scale) {
        return rng -> scale * Math.pow(-Math.log(1 - rng.nextDouble()), 1 / shape);
    }

    /** Builder of case arrays. */
    static final class Cases {
        final List<Double> ends = new ArrayList<>();
        final List<Integer> offsets = new ArrayList<>(List.of(0));
        final List<Double> starts = new ArrayList<>();
        final List<Integer> cats = new ArrayList<>();
        final List<Integer> totals = new ArrayList<>();

        void add(double end, double[] s, int[] c, int total) {
            ends.add(end);
            for (int j = 0; j < s.length; j++) {
                starts.add(s[j]);
                cats.add(c == null ? 0 : c[j]);
            }
            offsets.add(starts.size());
            totals.add(total);
        }

        Prepared prepare(int k, boolean withTotals) {
            return Prepared.of(ends.stream().mapToDouble(Double::doubleValue).toArray(),
                    offsets.stream().mapToInt(Integer::intValue).toArray(),
                    starts.stream().mapToDouble(Double::doubleValue).toArray(),
                    cats.stream().mapToInt(Integer::intValue).toArray(), k,
                    withTotals ? totals.stream().mapToInt(Integer::intValue).toArray() : null, null);
        }
    }

    /**
     * Open stream: exposures at rate lambda; each infects with p[kind], kinds drawn with
     * kindProbs; after infection exposures go on until onset (all recorded).
     */
    static Prepared open(UniformRandomProvider rng, int n, Delay h, double[] p, double[] kindProbs, double lambda) {
        Cases out = new Cases();
        for (int i = 0; i < n; i++) {
            List<Double> t = new ArrayList<>();
            List<Integer> c = new ArrayList<>();
            double time = 0;
            while (true) {
                int kind = draw(rng, kindProbs);
                t.add(time);
                c.add(kind);
                if (rng.nextDouble() < p[kind]) {
                    break;
                }
                time += -Math.log(1 - rng.nextDouble()) / lambda;
            }
            double onset = time + h.applyAsDouble(rng);
            double e = time;
            while (true) {
                e += -Math.log(1 - rng.nextDouble()) / lambda;
                if (e >= onset) {
                    break;
                }
                t.add(e);
                c.add(draw(rng, kindProbs));
            }
            out.add(onset, t.stream().mapToDouble(Double::doubleValue).toArray(),
                    c.stream().mapToInt(Integer::intValue).toArray(), -1);
        }
        return out.prepare(kindProbs.length, false);
    }

    static Prepared open(UniformRandomProvider rng, int n, Delay h, double p, double lambda) {
        return open(rng, n, h, new double[] {p}, new double[] {1}, lambda);
    }

    /**
     * Complete history: m = 1 + Poisson(extra) exposures uniform on [0, window]; kept if one
     * infects and all precede onset.
     */
    static Prepared complete(UniformRandomProvider rng, int n, Delay h, double p, double window, double extra) {
        Cases out = new Cases();
        PoissonSampler pois = new PoissonSampler(rng, extra);
        while (out.ends.size() < n) {
            int m = 1 + pois.sample();
            double[] e = new double[m];
            for (int j = 0; j < m; j++) {
                e[j] = window * rng.nextDouble();
            }
            Arrays.sort(e);
            int inf = -1;
            for (int j = 0; j < m; j++) {
                if (rng.nextDouble() < p) {
                    inf = j;
                    break;
                }
            }
            if (inf < 0) {
                continue;
            }
            double onset = e[inf] + h.applyAsDouble(rng);
            if (e[m - 1] >= onset) {
                continue;
            }
            out.add(onset, e, null, m);
        }
        return out.prepare(1, true);
    }

    /**
     * Total M exposures (M = offset + Poisson(mean)) uniform on [0, period]; those before onset
     * recorded, with M.
     */
    static Prepared total(UniformRandomProvider rng, int n, Delay h, double p, double period, int offset,
                          double mean) {
        Cases out = new Cases();
        PoissonSampler pois = new PoissonSampler(rng, mean);
        while (out.ends.size() < n) {
            int m = offset + pois.sample();
            if (m == 0) {
                continue;
            }
            double[] e = new double[m];
            for (int j = 0; j < m; j++) {
                e[j] = period * rng.nextDouble();
            }
            Arrays.sort(e);
            int inf = -1;
            for (int j = 0; j < m; j++) {
                if (rng.nextDouble() < p) {
                    inf = j;
                    break;
                }
            }
            if (inf < 0) {
                continue;
            }
            double onset = e[inf] + h.applyAsDouble(rng);
            int before = 0;
            while (before < m && e[before] < onset) {
                before++;
            }
            out.add(onset, Arrays.copyOf(e, before), null, m);
        }
        return out.prepare(1, true);
    }

    private static int draw(UniformRandomProvider rng, double[] probs) {
        double u = rng.nextDouble();
        for (int c = 0; c < probs.length - 1; c++) {
            u -= probs[c];
            if (u < 0) {
                return c;
            }
        }
        return probs.length - 1;
    }
}
