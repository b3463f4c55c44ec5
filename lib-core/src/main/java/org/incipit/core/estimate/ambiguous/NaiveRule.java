package org.incipit.core.estimate.ambiguous;

/**
 * Naive rules that pick one start per case and then fit the family as if that start were
 * known. They ignore the selection of the infecting exposure and are biased; they are offered
 * only so that reports can show that bias next to the corrected estimates
 * ({@link AmbiguousStartEstimator}).
 */
public enum NaiveRule {
    /**
     * The nearest candidate (latest start before the end). Its duration is at most that of the
     * infecting candidate (later candidates are exposures after infection), so the interval is
     * estimated too short.
     */
    LATEST,
    /**
     * The earliest candidate. Its duration is at least that of the infecting one (it adds the
     * waiting time W before infection), so the interval is estimated too long.
     */
    EARLIEST,
    /** Midpoint of the first and last candidate start: between the two, biased either way. */
    MIDPOINT,
    /**
     * Only cases with exactly one recorded candidate. Under an open stream of exposures at rate
     * lambda a case has one candidate iff the first exposure infected and no other exposure
     * came before onset, probability p e^(&minus;lambda X): the retained intervals are tilted
     * towards short ones (density proportional to e^(&minus;lambda x) h(x)), so too short; cases
     * are also discarded, widening intervals.
     */
    SINGLE_ONLY;

    /** Durations selected by this rule (new array); for SINGLE_ONLY only the single-candidate cases. */
    double[] durations(Prepared d) {
        switch (this) {
            case LATEST:
                return d.latest();
            case EARLIEST:
                return d.earliest();
            case MIDPOINT: {
                double[] a = d.earliest();
                double[] b = d.latest();
                for (int i = 0; i < a.length; i++) {
                    a[i] = 0.5 * (a[i] + b[i]);
                }
                return a;
            }
            default: {
                int count = 0;
                for (int i = 0; i < d.n; i++) {
                    if (d.recordedCount(i) == 1) {
                        count++;
                    }
                }
                double[] out = new double[count];
                int w = 0;
                for (int i = 0; i < d.n; i++) {
                    if (d.recordedCount(i) == 1) {
                        out[w++] = d.dur[d.offset[i]];
                    }
                }
                return out;
            }
        }
    }
}
