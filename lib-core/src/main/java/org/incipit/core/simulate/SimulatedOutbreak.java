package org.incipit.core.simulate;

import java.util.Arrays;
import java.util.Optional;

/**
 * One simulated outbreak: a line list in flat primitive arrays, daily counts, and optionally
 * the recorded candidate exposures of every case. Immutable; arrays are copied out.
 *
 * <p>Row i is the person with id i; ids are assigned in order of infection time, the index
 * cases first (ids 0 .. indexCases &minus; 1, infected at time 0, infector &minus;1,
 * generation 0). The line list holds every person infected before the observation end
 * {@link #observationEnd()}; onsets and outcomes are simulated for all of them even when they
 * fall after the observation end (ground truth). An estimator test that wants what an analyst
 * would see at the observation end keeps onsets (and outcomes) &le; observationEnd: this set
 * is complete, because onset follows infection and every infection before the end is in the
 * list.
 *
 * <p>Daily counts cover days 0 .. {@link #days()} &minus; 1, day d being [d, d + 1), and count
 * only events at or before the observation end (the last day is partial when the end is not a
 * whole number); when the outbreak died out with no day limit the end is +&infin; and the days cover
 * every event.
 */
public final class SimulatedOutbreak {

    /** Outcome code: recovery. */
    public static final byte RECOVERY = 0;
    /** Outcome code: death. */
    public static final byte DEATH = 1;

    private final OutbreakOptions options;
    private final int size;
    private final int[] infector;
    private final double[] infection;
    private final double[] onset;
    private final byte[] outcome;
    private final double[] outcomeTime;
    private final int[] generation;
    private final int[] offspring;
    private final double observationEnd;
    private final StopReason stopReason;
    private final int attempts;
    private final ExposureRecords exposures;
    private final int[] dailyInfections;
    private final int[] dailyOnsets;
    private final int[] dailyDeaths;
    private final int[] dailyRecoveries;

    SimulatedOutbreak(OutbreakOptions options, int size, int[] infector, double[] infection,
                      double[] onset, byte[] outcome, double[] outcomeTime, int[] generation,
                      int[] offspring, double observationEnd, StopReason stopReason, int attempts,
                      ExposureRecords exposures) {
        this.options = options;
        this.size = size;
        this.infector = infector;
        this.infection = infection;
        this.onset = onset;
        this.outcome = outcome;
        this.outcomeTime = outcomeTime;
        this.generation = generation;
        this.offspring = offspring;
        this.observationEnd = observationEnd;
        this.stopReason = stopReason;
        this.attempts = attempts;
        this.exposures = exposures;
        int days;
        if (observationEnd < Double.POSITIVE_INFINITY) {
            days = Math.max(1, (int) Math.ceil(observationEnd));
        } else {
            double last = 0;
            for (int i = 0; i < size; i++) {
                last = Math.max(last, Math.max(onset[i], outcomeTime == null ? 0 : outcomeTime[i]));
            }
            days = (int) Math.floor(last) + 1;
        }
        dailyInfections = new int[days];
        dailyOnsets = new int[days];
        dailyDeaths = new int[days];
        dailyRecoveries = new int[days];
        for (int i = 0; i < size; i++) {
            count(dailyInfections, infection[i]);
            count(dailyOnsets, onset[i]);
            if (outcome != null) {
                count(outcome[i] == DEATH ? dailyDeaths : dailyRecoveries, outcomeTime[i]);
            }
        }
    }

    private void count(int[] daily, double t) {
        if (t <= observationEnd) {
            int d = (int) Math.floor(t);
            if (d >= 0 && d < daily.length) {
                daily[d]++;
            }
        }
    }

    /** @return the options used. */
    public OutbreakOptions options() {
        return options;
    }

    /** @return number of people in the line list (infected before the observation end). */
    public int size() {
        return size;
    }

    /**
     * @return the observation end in days: the stop day, the time of the last (maxCases-th)
     *         infection when the case limit stopped the outbreak, or the time of the
     *         maxOnsets-th onset when the onset limit did; +&infin; if it died out with no
     *         day limit
     */
    public double observationEnd() {
        return observationEnd;
    }

    /** @return why the outbreak ended. */
    public StopReason stopReason() {
        return stopReason;
    }

    /** @return number of outbreaks drawn (1 without conditioning; the accepted one included). */
    public int attempts() {
        return attempts;
    }

    /** @return whether outcomes were simulated. */
    public boolean hasOutcomes() {
        return outcome != null;
    }

    /**
     * @param i id
     * @return infector id, &minus;1 for an index case
     */
    public int infectorId(int i) {
        return infector[check(i)];
    }

    /**
     * @param i id
     * @return infection time, days
     */
    public double infectionTime(int i) {
        return infection[check(i)];
    }

    /**
     * @param i id
     * @return symptom onset time, days
     */
    public double onsetTime(int i) {
        return onset[check(i)];
    }

    /**
     * @param i id
     * @return generation (0 for index cases)
     */
    public int generation(int i) {
        return generation[check(i)];
    }

    /**
     * @param i id
     * @return number of people person i infects, including those infected after the observation
     *         end (not in the line list)
     */
    public int offspringCount(int i) {
        return offspring[check(i)];
    }

    /**
     * @param i id
     * @return {@link #DEATH} or {@link #RECOVERY}
     * @throws IllegalStateException if outcomes were not simulated
     */
    public byte outcome(int i) {
        return outcomes0()[check(i)];
    }

    /**
     * @param i id
     * @return time of death or recovery, days
     * @throws IllegalStateException if outcomes were not simulated
     */
    public double outcomeTime(int i) {
        outcomes0();
        return outcomeTime[check(i)];
    }

    /** @return infector ids (copy). */
    public int[] infectorIds() {
        return infector.clone();
    }

    /** @return infection times (copy). */
    public double[] infectionTimes() {
        return infection.clone();
    }

    /** @return onset times (copy). */
    public double[] onsetTimes() {
        return onset.clone();
    }

    /** @return generations (copy). */
    public int[] generations() {
        return generation.clone();
    }

    /** @return offspring counts (copy), see {@link #offspringCount(int)}. */
    public int[] offspringCounts() {
        return offspring.clone();
    }

    /**
     * @return outcome codes (copy)
     * @throws IllegalStateException if outcomes were not simulated
     */
    public byte[] outcomes() {
        return outcomes0().clone();
    }

    /**
     * @return outcome times (copy)
     * @throws IllegalStateException if outcomes were not simulated
     */
    public double[] outcomeTimes() {
        outcomes0();
        return outcomeTime.clone();
    }

    /** @return recorded candidate exposures, one entry per line-list row, if configured. */
    public Optional<ExposureRecords> exposures() {
        return Optional.ofNullable(exposures);
    }

    /** @return number of days covered by the daily counts. */
    public int days() {
        return dailyOnsets.length;
    }

    /** @return infections per day up to the observation end (copy). */
    public int[] dailyInfections() {
        return dailyInfections.clone();
    }

    /** @return symptom onsets per day up to the observation end (copy). */
    public int[] dailyOnsets() {
        return dailyOnsets.clone();
    }

    /** @return deaths per day up to the observation end (copy; zeros without outcomes). */
    public int[] dailyDeaths() {
        return dailyDeaths.clone();
    }

    /** @return recoveries per day up to the observation end (copy; zeros without outcomes). */
    public int[] dailyRecoveries() {
        return dailyRecoveries.clone();
    }

    private byte[] outcomes0() {
        if (outcome == null) {
            throw new IllegalStateException("outcomes were not simulated (no OutbreakOptions.Builder.outcomes)");
        }
        return outcome;
    }

    private int check(int i) {
        if (i < 0 || i >= size) {
            throw new IndexOutOfBoundsException("id must be in [0, " + size + "), was " + i);
        }
        return i;
    }

    @Override
    public boolean equals(Object o) {
        if (!(o instanceof SimulatedOutbreak)) {
            return false;
        }
        SimulatedOutbreak s = (SimulatedOutbreak) o;
        return size == s.size && Arrays.equals(infector, s.infector) && Arrays.equals(infection, s.infection)
            && Arrays.equals(onset, s.onset) && Arrays.equals(outcome, s.outcome)
            && Arrays.equals(outcomeTime, s.outcomeTime) && Arrays.equals(generation, s.generation)
            && Arrays.equals(offspring, s.offspring) && Double.compare(observationEnd, s.observationEnd) == 0
            && stopReason == s.stopReason && attempts == s.attempts
            && java.util.Objects.equals(exposures, s.exposures);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(infection) + size;
    }

    @Override
    public String toString() {
        return "SimulatedOutbreak[size=" + size + ", end=" + observationEnd + ", " + stopReason
            + ", attempts=" + attempts + "]";
    }
}
