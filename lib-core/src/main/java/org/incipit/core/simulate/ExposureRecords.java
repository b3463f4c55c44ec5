package org.incipit.core.simulate;

import java.util.Arrays;

/**
 * Recorded candidate exposures of a set of cases, as contact tracing would record them, plus
 * the simulated truth. Case i has onset {@link #onset(int)} and candidates
 * j = 0 .. {@link #candidateCount(int)} &minus; 1 in time order, stored in flat arrays at
 * positions {@code offsets()[i] .. offsets()[i+1] - 1}; {@link #totalExposures(int)} is the
 * total exposure count M where the regime knows it (&minus;1 otherwise). The true infecting
 * candidate ({@link #infectingCandidate(int)}) and infection time are ground truth for tests,
 * not observable data. Immutable; arrays are copied out.
 */
public final class ExposureRecords {

    private final ExposureModel model;
    private final int cases;
    private final int[] offsets;
    private final double[] times;
    private final int[] categories;
    private final int[] totals;
    private final int[] infecting;
    private final double[] infectionTimes;
    private final double[] onsets;

    ExposureRecords(ExposureModel model, int cases, int[] offsets, double[] times, int[] categories,
                    int[] totals, int[] infecting, double[] infectionTimes, double[] onsets) {
        this.model = model;
        this.cases = cases;
        this.offsets = offsets;
        this.times = times;
        this.categories = categories;
        this.totals = totals;
        this.infecting = infecting;
        this.infectionTimes = infectionTimes;
        this.onsets = onsets;
    }

    /** @return the model that generated the records. */
    public ExposureModel model() {
        return model;
    }

    /** @return the recording regime. */
    public ExposureRecording recording() {
        return model.recording();
    }

    /** @return number of cases. */
    public int size() {
        return cases;
    }

    /** @return total number of recorded candidates over all cases. */
    public int candidateTotal() {
        return offsets[cases];
    }

    /**
     * @param i case index in [0, size())
     * @return onset time of case i, days
     */
    public double onset(int i) {
        return onsets[check(i)];
    }

    /**
     * @param i case index
     * @return number of recorded candidates of case i, &ge; 1
     */
    public int candidateCount(int i) {
        check(i);
        return offsets[i + 1] - offsets[i];
    }

    /**
     * @param i case index
     * @param j candidate index in [0, candidateCount(i))
     * @return time of candidate j of case i, days
     */
    public double candidateTime(int i, int j) {
        return times[position(i, j)];
    }

    /**
     * @param i case index
     * @param j candidate index
     * @return contact category of candidate j of case i (0 without categories)
     */
    public int candidateCategory(int i, int j) {
        return categories[position(i, j)];
    }

    /**
     * @param i case index
     * @return total exposures M (COMPLETE, KNOWN_TOTAL), or &minus;1 (OPEN: not known)
     */
    public int totalExposures(int i) {
        return totals[check(i)];
    }

    /**
     * Ground truth: which candidate infected case i.
     *
     * @param i case index
     * @return candidate index of the infecting exposure
     */
    public int infectingCandidate(int i) {
        return infecting[check(i)];
    }

    /**
     * Ground truth: the infection time of case i (equal to its infecting candidate's time).
     *
     * @param i case index
     * @return infection time, days
     */
    public double infectionTime(int i) {
        return infectionTimes[check(i)];
    }

    /** @return onset times, one per case (copy). */
    public double[] onsets() {
        return onsets.clone();
    }

    /** @return offsets into the flat candidate arrays, length size() + 1 (copy). */
    public int[] offsets() {
        return offsets.clone();
    }

    /** @return all candidate times, case by case, each case in time order (copy). */
    public double[] candidateTimes() {
        return times.clone();
    }

    /** @return all candidate categories, aligned with {@link #candidateTimes()} (copy). */
    public int[] candidateCategories() {
        return categories.clone();
    }

    /** @return total exposures per case, &minus;1 where unknown (copy). */
    public int[] totalExposures() {
        return totals.clone();
    }

    /** @return ground truth infecting candidate per case (copy). */
    public int[] infectingCandidates() {
        return infecting.clone();
    }

    /** @return ground truth infection time per case (copy). */
    public double[] infectionTimes() {
        return infectionTimes.clone();
    }

    private int check(int i) {
        if (i < 0 || i >= cases) {
            throw new IndexOutOfBoundsException("case index must be in [0, " + cases + "), was " + i);
        }
        return i;
    }

    private int position(int i, int j) {
        int c = candidateCount(i);
        if (j < 0 || j >= c) {
            throw new IndexOutOfBoundsException("candidate index must be in [0, " + c + "), was " + j);
        }
        return offsets[i] + j;
    }

    @Override
    public boolean equals(Object o) {
        if (!(o instanceof ExposureRecords)) {
            return false;
        }
        ExposureRecords r = (ExposureRecords) o;
        return cases == r.cases && Arrays.equals(offsets, r.offsets) && Arrays.equals(times, r.times)
            && Arrays.equals(categories, r.categories) && Arrays.equals(totals, r.totals)
            && Arrays.equals(infecting, r.infecting) && Arrays.equals(onsets, r.onsets)
            && Arrays.equals(infectionTimes, r.infectionTimes);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(times) + Arrays.hashCode(onsets);
    }

    @Override
    public String toString() {
        return "ExposureRecords[" + model.recording() + ", cases=" + cases + ", candidates=" + offsets[cases] + "]";
    }
}
