package org.incipit.core.simulate;

import java.util.Arrays;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.DiscreteSampler;
import org.apache.commons.rng.sampling.distribution.PoissonSampler;
import org.incipit.core.EstimationException;

/**
 * Appends one case's recorded candidate exposures to growing flat arrays; see
 * {@link ExposureModel} for the constructions. Not thread-safe; one per simulation.
 */
final class ExposureGenerator {

    /** Rejection cap for COMPLETE / KNOWN_TOTAL histories with no infecting exposure. */
    static final int MAX_REJECTIONS = 10_000_000;

    private final ExposureModel model;
    private final double[] weights;
    private final double[] probs;
    private final double pBar;
    private final double logFail;               // log(1 - pBar)
    private final double[] cumAll;              // categories ~ w
    private final double[] cumFailed;           // ~ w (1 - p)
    private final double[] cumInfecting;        // ~ w p
    private final double rate;

    // outputs
    private int cases;
    private int[] offsets = new int[17];
    private int[] totals = new int[16];
    private int[] infecting = new int[16];
    private double[] infectionTimes = new double[16];
    private double[] onsets = new double[16];
    private double[] times = new double[64];
    private int[] categories = new int[64];
    private int n;                               // exposures written

    // scratch for finite histories
    private double[] scratchU = new double[16];
    private int[] scratchCat = new int[16];

    ExposureGenerator(ExposureModel model) {
        this.model = model;
        this.weights = model.weightsInternal();
        this.probs = model.probabilitiesInternal();
        this.pBar = model.meanInfectionProbability();
        this.logFail = Math.log1p(-pBar);
        int k = weights.length;
        double[] a = new double[k];
        double[] f = new double[k];
        double[] i = new double[k];
        for (int c = 0; c < k; c++) {
            a[c] = weights[c];
            f[c] = weights[c] * (1 - probs[c]);
            i[c] = weights[c] * probs[c];
        }
        this.cumAll = cumulative(a);
        this.cumFailed = cumulative(f);
        this.cumInfecting = cumulative(i);
        this.rate = model.ratePerDay();
    }

    private static double[] cumulative(double[] w) {
        double[] c = new double[w.length];
        double s = 0;
        for (int i = 0; i < w.length; i++) {
            s += w[i];
            c[i] = s;
        }
        if (s > 0) {
            for (int i = 0; i < w.length; i++) {
                c[i] /= s;
            }
            c[w.length - 1] = 1;
        }
        return c;
    }

    private static int pick(double[] cum, UniformRandomProvider rng) {
        if (cum.length == 1) {
            return 0;
        }
        double u = rng.nextDouble();
        int c = 0;
        while (c < cum.length - 1 && u >= cum[c]) {
            c++;
        }
        return c;
    }

    private static double standardExponential(UniformRandomProvider rng) {
        return -Math.log1p(-rng.nextDouble()); // Exp(1); 1 - U in (0, 1]
    }

    /** Appends the candidates of one case infected at {@code t} with onset {@code onset}. */
    void addCase(UniformRandomProvider rng, double t, double onset) {
        ensureCase();
        offsets[cases] = n;
        infectionTimes[cases] = t;
        onsets[cases] = onset;
        if (model.recording() == ExposureRecording.OPEN) {
            addOpen(rng, t, onset);
        } else {
            addFinite(rng, t, onset);
        }
        cases++;
        offsets[cases] = n;
    }

    private void addOpen(UniformRandomProvider rng, double t, double onset) {
        // failures before infection: geometric on {0, 1, ...} with success pBar
        int failures = 0;
        if (pBar < 1) {
            double g = Math.floor(Math.log1p(-rng.nextDouble()) / logFail);
            if (g > 1e8) {
                throw new EstimationException("open exposure stream: " + g
                    + " failed exposures before infection (infection probability " + pBar + " too small)");
            }
            failures = (int) g;
        }
        ensureExposures(failures + 1);
        // backwards from t, written in ascending order
        double s = t;
        for (int i = failures - 1; i >= 0; i--) {
            s -= standardExponential(rng) / rate;
            times[n + i] = s;
            categories[n + i] = pick(cumFailed, rng);
        }
        n += failures;
        infecting[cases] = failures;
        times[n] = t;
        categories[n] = pick(cumInfecting, rng);
        n++;
        totals[cases] = -1;
        // after infection: Poisson process of rate lambda on (t, onset)
        double e = t + standardExponential(rng) / rate;
        while (e < onset) {
            ensureExposures(1);
            times[n] = e;
            categories[n] = pick(cumAll, rng);
            n++;
            e += standardExponential(rng) / rate;
        }
    }

    private void addFinite(UniformRandomProvider rng, double t, double onset) {
        boolean poissonTotal = model.exposures() == 0;
        DiscreteSampler poisson = poissonTotal ? PoissonSampler.of(rng, model.meanExposures()) : null;
        boolean all = model.recording() == ExposureRecording.COMPLETE;
        double w = model.windowDays();
        int tries = 0;
        int total;
        int j;
        double sum;
        double uj;
        while (true) {
            if (++tries > MAX_REJECTIONS) {
                throw new EstimationException("no exposure history with an infecting exposure"
                    + (all ? " and every exposure before onset (onset " + (onset - t) + " days after infection)" : "")
                    + " in " + MAX_REJECTIONS + " tries (" + model + ")");
            }
            total = poissonTotal ? poisson.sample() : model.exposures();
            if (total == 0) {
                continue;
            }
            if (scratchCat.length < total) {
                scratchCat = new int[Math.max(total, 2 * scratchCat.length)];
                scratchU = new double[scratchCat.length + 1];
            }
            j = -1;
            for (int i = 0; i < total; i++) {
                int c = pick(cumAll, rng);
                scratchCat[i] = c;
                if (rng.nextDouble() < probs[c]) {
                    j = i;
                    break;
                }
            }
            if (j < 0) {
                continue;
            }
            for (int i = j + 1; i < total; i++) {
                scratchCat[i] = pick(cumAll, rng);
            }
            // sorted uniforms U_(1..total) by normalised exponential spacings
            if (scratchU.length < total + 1) {
                scratchU = new double[total + 1];
            }
            sum = 0;
            for (int i = 0; i < total; i++) {
                sum += standardExponential(rng);
                scratchU[i] = sum;
            }
            sum += standardExponential(rng);
            uj = scratchU[j] / sum;
            // COMPLETE: the whole history precedes onset by definition; a history with its last
            // exposure at or after onset is redrawn (conditioning documented on ExposureModel)
            if (!all || j == total - 1 || t + w * (scratchU[total - 1] / sum - uj) < onset) {
                break;
            }
        }
        ensureExposures(total);
        int start = n;
        for (int i = 0; i < total; i++) {
            double e = i == j ? t : t + w * (scratchU[i] / sum - uj);
            if (all || e < onset) {
                times[n] = e;
                categories[n] = scratchCat[i];
                n++;
            }
        }
        infecting[cases] = j; // every exposure up to j precedes onset, so j indexes the recorded list
        totals[cases] = total;
        if (n - start <= j) {
            throw new IllegalStateException("infecting exposure lost");
        }
    }

    private void ensureCase() {
        if (cases + 2 > offsets.length) {
            int cap = 2 * offsets.length;
            offsets = Arrays.copyOf(offsets, cap);
        }
        if (cases + 1 > totals.length) {
            int cap = 2 * totals.length;
            totals = Arrays.copyOf(totals, cap);
            infecting = Arrays.copyOf(infecting, cap);
            infectionTimes = Arrays.copyOf(infectionTimes, cap);
            onsets = Arrays.copyOf(onsets, cap);
        }
    }

    private void ensureExposures(int extra) {
        if (n + extra > times.length) {
            int cap = Math.max(n + extra, 2 * times.length);
            times = Arrays.copyOf(times, cap);
            categories = Arrays.copyOf(categories, cap);
        }
    }

    ExposureRecords build() {
        return build(cases);
    }

    /** @param keep number of leading cases to keep, &le; cases */
    ExposureRecords build(int keep) {
        int m = offsets[keep];
        return new ExposureRecords(model, keep, Arrays.copyOf(offsets, keep + 1),
            Arrays.copyOf(times, m), Arrays.copyOf(categories, m), Arrays.copyOf(totals, keep),
            Arrays.copyOf(infecting, keep), Arrays.copyOf(infectionTimes, keep),
            Arrays.copyOf(onsets, keep));
    }
}
