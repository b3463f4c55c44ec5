package org.incipit.examples;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

import org.incipit.core.EstimationException;
import org.incipit.core.likelihood.LogLikelihood;
import org.incipit.core.likelihood.MaximumLikelihoodFit;
import org.incipit.core.likelihood.Maximiser;
import org.incipit.core.likelihood.ParameterTransform;
import org.incipit.core.likelihood.Parameterisation;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.ParametricDelay;

/**
 * Extension example (docs/extending.md): a new observation scheme is one observation type and
 * one {@link LogLikelihood}; the engine's maximiser, intervals (Wald, delta, profile), bootstrap,
 * model comparison and the study harness then apply unchanged.
 *
 * <p>The scheme: <b>left-truncated delays</b>. A delay d<sub>i</sub> is recorded only because it
 * exceeded an entry time u<sub>i</sub> &le; d<sub>i</sub> (e.g. people enrolled u<sub>i</sub> days
 * after their primary event, so shorter delays were never seen). The conditional density is
 * f(d<sub>i</sub>) / S(u<sub>i</sub>), so
 * log L = &Sigma;<sub>i</sub> [log f(d<sub>i</sub>) &minus; log S(u<sub>i</sub>)] (Klein &amp;
 * Moeschberger 2003, <i>Survival Analysis</i>, 2nd ed., section 3.4, from memory). The test
 * checks the maximum against an independent scipy maximisation of the same likelihood.
 */
public final class CustomLikelihoodExample {

    private CustomLikelihoodExample() {
    }

    /**
     * The observation type: delays with their entry (left-truncation) times, validated and
     * copied.
     *
     * @param delays  delays d<sub>i</sub> in days, finite and &gt; 0
     * @param entries entry times u<sub>i</sub> in days, in [0, d<sub>i</sub>)
     */
    public record LeftTruncatedDelays(double[] delays, double[] entries) {
        /** @throws IllegalArgumentException naming the row if a value is out of range */
        public LeftTruncatedDelays {
            if (delays == null || entries == null || delays.length != entries.length || delays.length == 0) {
                throw new IllegalArgumentException("delays and entries must be non-empty arrays of equal length");
            }
            delays = delays.clone();
            entries = entries.clone();
            for (int i = 0; i < delays.length; i++) {
                if (!(delays[i] > 0 && delays[i] < Double.POSITIVE_INFINITY)) {
                    throw new IllegalArgumentException("row " + i + ": delay must be finite and > 0, was " + delays[i]);
                }
                if (!(entries[i] >= 0 && entries[i] < delays[i])) {
                    throw new IllegalArgumentException("row " + i + ": entry must be in [0, delay = " + delays[i]
                            + "), was " + entries[i]);
                }
            }
        }

        @Override
        public double[] delays() {
            return delays.clone();
        }

        @Override
        public double[] entries() {
            return entries.clone();
        }

        /** @return number of delays */
        public int size() {
            return delays.length;
        }

        /**
         * @param rows row indices (a bootstrap resample; repeats allowed)
         * @return the rows, in that order
         */
        public LeftTruncatedDelays subset(int[] rows) {
            double[] d = new double[rows.length];
            double[] u = new double[rows.length];
            for (int i = 0; i < rows.length; i++) {
                d[i] = delays[rows[i]];
                u[i] = entries[rows[i]];
            }
            return new LeftTruncatedDelays(d, u);
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof LeftTruncatedDelays t && Arrays.equals(delays, t.delays)
                    && Arrays.equals(entries, t.entries);
        }

        @Override
        public int hashCode() {
            return Arrays.hashCode(delays) * 31 + Arrays.hashCode(entries);
        }

        @Override
        public String toString() {
            return "LeftTruncatedDelays[n=" + delays.length + "]";
        }
    }

    /**
     * The one new piece: log L(&theta;) = &Sigma; [log f(d<sub>i</sub>) &minus; log S(u<sub>i</sub>)]
     * over the family's natural parameters, with its analytic gradient from the family's
     * {@link ParametricDelay#logDensityGradient} and {@link ParametricDelay#logSurvivalGradient}.
     * Parameters outside the family's domain give &minus;&infin; (a rejected step).
     *
     * @param data   the delays
     * @param family any delay family (the built-in ones, or {@link LogLogisticDelay#FAMILY})
     * @return the log-likelihood; thread-safe
     */
    public static LogLikelihood logLikelihood(LeftTruncatedDelays data, DelayFamily family) {
        double[] d = data.delays();
        double[] u = data.entries();
        int k = family.dimension();
        return new LogLikelihood() {
            @Override
            public int dimension() {
                return k;
            }

            @Override
            public double value(double[] theta) {
                return valueAndGradient(theta, new double[k]);
            }

            @Override
            public double valueAndGradient(double[] theta, double[] gradient) {
                ParametricDelay h;
                try {
                    h = family.of(theta);
                } catch (IllegalArgumentException e) {
                    return Double.NEGATIVE_INFINITY;
                }
                Arrays.fill(gradient, 0);
                double v = 0;
                for (int i = 0; i < d.length; i++) {
                    v += h.logDensity(d[i]) - h.logSurvival(u[i]);
                    double[] gf = h.logDensityGradient(d[i]);
                    double[] gs = h.logSurvivalGradient(u[i]);
                    for (int j = 0; j < k; j++) {
                        gradient[j] += gf[j] - gs[j];
                    }
                }
                return v;
            }
        };
    }

    /**
     * Everything after the likelihood comes from the engine: the fit on the log scale of
     * positive parameters, from the family member with the delays' mean and sd.
     *
     * @param data   the delays
     * @param family the family
     * @return the engine fit (Wald, delta, profile intervals; AIC; covariance)
     * @throws EstimationException if the maximiser does not converge
     */
    public static MaximumLikelihoodFit fit(LeftTruncatedDelays data, DelayFamily family) {
        List<ParameterTransform> t = new ArrayList<>();
        for (DelayFamily.Domain dom : family.parameterDomains()) {
            t.add(dom == DelayFamily.Domain.POSITIVE ? ParameterTransform.log() : ParameterTransform.identity());
        }
        Parameterisation p = Parameterisation.of(family.parameterNames(), t);
        double[] d = data.delays();
        double mean = Arrays.stream(d).average().orElseThrow();
        double ss = 0;
        for (double x : d) {
            ss += (x - mean) * (x - mean);
        }
        double sd = Math.sqrt(ss / Math.max(1, d.length - 1));
        double[] start = family.ofMeanSd(mean, sd > 0 ? sd : mean).parameters();
        MaximumLikelihoodFit f = MaximumLikelihoodFit.maximise(p, logLikelihood(data, family), List.of(start),
                d.length, Maximiser.bfgs());
        if (!f.converged()) {
            throw new EstimationException(family.name() + " left-truncated fit: " + f.message());
        }
        return f;
    }
}
