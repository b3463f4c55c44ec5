package org.incipit.core.estimate.ambiguous;

/**
 * How the recorded exposures of a case were sampled, which fixes the probability P(case) that a
 * person with that exposure history became a case at all. The ambiguous-start likelihood of a
 * case is L_i / P(case_i) (docs/methods.md, section 1): the data hold infected people only, so
 * each case's likelihood is conditional on infection having happened. There is no default: the
 * analyst chooses, and every result records the choice.
 *
 * <p>Write q_k = 1 &minus; p_k. Exposures transmit independently, so the probability that none
 * of a set of exposures transmits is the product of their q; P(case) is one minus the
 * probability that no exposure in the whole exposure history transmits.
 *
 * <ul>
 * <li>{@link Open}: exposures keep arriving (e.g. a Poisson stream) until onset, so anyone
 *     exposed long enough is eventually infected: P(case) = 1. The recorded candidates after
 *     the infecting one are exposures between infection and onset and carry no information
 *     about p beyond the factor &Pi;_(l&lt;j) q_(k_l).</li>
 * <li>{@link Complete}: the m recorded exposures are the person's whole exposure history, all
 *     before onset. The person became a case iff one of them transmitted:
 *     P(case) = 1 &minus; &Pi;_(j=1..m) q_(k_j) (with one category, 1 &minus; q^m).</li>
 * <li>{@link KnownTotal}: the person had M exposures in the exposure period (M from the data,
 *     M &ge; m), of which those after onset were not recorded (they could no longer infect).
 *     The person became a case iff one of the M transmitted: P(case) = 1 &minus; q^M. Only one
 *     category is allowed: the categories of the unrecorded exposures are unknown, so the
 *     product over them cannot be formed; estimators refuse categorised data under this model.</li>
 * <li>{@link PoissonTotal}: as {@link KnownTotal} but M is not recorded and is modelled as
 *     Poisson(&mu;), &mu; given. Then P(case) = 1 &minus; E[q^M] = 1 &minus; exp(&minus;&mu; p),
 *     using the Poisson probability generating function E[s^M] = exp(&mu;(s &minus; 1)) at
 *     s = q. One category only, for the same reason as {@link KnownTotal}.</li>
 * </ul>
 *
 * <p>Each normaliser is right under its own sampling and biased under the others (shown by
 * simulation in this package's tests): with an open stream the complete normaliser rewards
 * small p (1 &minus; q^m shrinks faster than the numerator), driving p&#770; towards 0 and the
 * mean towards the short durations; with a complete history in a short window before onset the
 * open form drives p&#770; to 1.
 */
public sealed interface ExposureHistory {

    /** @return a short name for output: "open", "complete", "known-total", "poisson-total(mu)" */
    String label();

    /** @return the open-stream model, P(case) = 1 */
    static ExposureHistory open() {
        return Open.INSTANCE;
    }

    /** @return the complete-history model, P(case) = 1 &minus; &Pi; q_(k_j) over recorded exposures */
    static ExposureHistory complete() {
        return Complete.INSTANCE;
    }

    /** @return the known-total model, P(case) = 1 &minus; q^M with M from the data */
    static ExposureHistory knownTotal() {
        return KnownTotal.INSTANCE;
    }

    /**
     * @param mean the Poisson mean &mu; of the total exposure count, finite and &gt; 0
     * @return the Poisson-total model, P(case) = 1 &minus; exp(&minus;&mu; p)
     * @throws IllegalArgumentException if mean is not finite and &gt; 0
     */
    static ExposureHistory poissonTotal(double mean) {
        return new PoissonTotal(mean);
    }

    /** Open exposure stream until onset: P(case) = 1. */
    enum Open implements ExposureHistory {
        /** The one instance. */
        INSTANCE;

        @Override
        public String label() {
            return "open";
        }
    }

    /** Recorded exposures are the whole history: P(case) = 1 &minus; &Pi;_j q_(k_j). */
    enum Complete implements ExposureHistory {
        /** The one instance. */
        INSTANCE;

        @Override
        public String label() {
            return "complete";
        }
    }

    /** Total exposure count M known per case: P(case) = 1 &minus; q^M. */
    enum KnownTotal implements ExposureHistory {
        /** The one instance. */
        INSTANCE;

        @Override
        public String label() {
            return "known-total";
        }
    }

    /**
     * Total exposure count M ~ Poisson(mean): P(case) = 1 &minus; exp(&minus;mean &middot; p).
     *
     * @param mean Poisson mean &mu;, finite and &gt; 0
     */
    record PoissonTotal(double mean) implements ExposureHistory {
        /** @throws IllegalArgumentException if mean is not finite and &gt; 0 */
        public PoissonTotal {
            if (!(mean > 0 && mean < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("mean must be finite and > 0, was " + mean);
            }
        }

        @Override
        public String label() {
            return "poisson-total(" + mean + ")";
        }
    }
}
