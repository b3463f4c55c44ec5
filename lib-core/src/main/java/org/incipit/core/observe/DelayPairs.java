package org.incipit.core.observe;

import java.util.HashSet;
import java.util.List;
import java.util.OptionalDouble;
import java.util.Set;

/**
 * Pairs of a primary and a secondary event time (e.g. onset and hospitalisation, or infector's
 * and infectee's onset), in days. Immutable and thread-safe.
 *
 * <p>Optionally the data were collected up to a cut-off time {@code T}:
 * <ul>
 *   <li>an <em>observed</em> pair has {@code primary <= secondary <= T}; a likelihood may treat
 *       it as right-truncated at {@code T - primary} (only pairs whose secondary event happened
 *       by {@code T} could be seen);</li>
 *   <li>a <em>censored</em> pair has {@code primary <= T} and a secondary event not yet
 *       observed at {@code T}: its delay is right-censored at {@code T - primary}.</li>
 * </ul>
 * Censored pairs require a cut-off. A pair may also be flagged <em>daily</em>: both of its
 * times are known only to the day, i.e. the true times lie in {@code [primary, primary + 1)}
 * and {@code [secondary, secondary + 1)} (day-level interval censoring).
 *
 * <pre>{@code
 * DelayPairs pairs = DelayPairs.builder(30.0)          // cut-off at day 30
 *         .addObserved("P1", 3.0, 8.0, true)           // known to the day
 *         .addCensored("P2", 27.0, true)               // secondary not yet seen on day 30
 *         .build();
 * }</pre>
 */
public final class DelayPairs {

    private final String[] ids;
    private final double[] primaries;
    private final double[] secondaries;
    private final boolean[] observed;
    private final boolean[] daily;
    private final double cutoff; // NaN if none

    private DelayPairs(String[] ids, double[] primaries, double[] secondaries, boolean[] observed,
                       boolean[] daily, double cutoff) {
        this.ids = ids;
        this.primaries = primaries;
        this.secondaries = secondaries;
        this.observed = observed;
        this.daily = daily;
        this.cutoff = cutoff;
    }

    /** @return a builder without cut-off (no censored pairs, no truncation) */
    public static Builder builder() {
        return new Builder(Double.NaN);
    }

    /**
     * @param cutoff the cut-off time {@code T} in days, finite
     * @return a builder whose pairs were collected up to {@code cutoff}
     * @throws IllegalArgumentException if {@code cutoff} is not finite
     */
    public static Builder builder(double cutoff) {
        if (!Double.isFinite(cutoff)) {
            throw new IllegalArgumentException("cutoff must be a finite number of days, was " + cutoff);
        }
        return new Builder(cutoff);
    }

    /** @return number of pairs, &ge; 1 */
    public int size() {
        return ids.length;
    }

    /**
     * @param i pair index in {@code [0, size())}
     * @return the pair id
     */
    public String id(int i) {
        return ids[i];
    }

    /** @return the pair ids in order (unmodifiable) */
    public List<String> ids() {
        return List.of(ids);
    }

    /**
     * @param i pair index
     * @return the primary time in days
     */
    public double primary(int i) {
        return primaries[i];
    }

    /** @return a copy of the primary times */
    public double[] primaries() {
        return primaries.clone();
    }

    /**
     * @param i pair index
     * @return true if the secondary event was observed, false if right-censored at the cut-off
     */
    public boolean isObserved(int i) {
        return observed[i];
    }

    /** @return a copy of the observed flags (false = right-censored at the cut-off) */
    public boolean[] observedFlags() {
        return observed.clone();
    }

    /**
     * @param i pair index of an observed pair
     * @return the secondary time in days
     * @throws IllegalStateException if the pair is censored (see {@link #isObserved(int)})
     */
    public double secondary(int i) {
        if (!observed[i]) {
            throw new IllegalStateException("pair '" + ids[i] + "' is censored at the cut-off: its secondary time is not known");
        }
        return secondaries[i];
    }

    /**
     * @return a copy of the secondary times; for a censored pair the entry is the cut-off
     *     (the time up to which the secondary event is known not to have happened)
     */
    public double[] secondaries() {
        return secondaries.clone();
    }

    /**
     * @param i pair index
     * @return true if both times are known only to the day
     */
    public boolean isDaily(int i) {
        return daily[i];
    }

    /** @return a copy of the day-level interval-censoring flags */
    public boolean[] dailyFlags() {
        return daily.clone();
    }

    /** @return the cut-off time in days, if the data were collected up to one */
    public OptionalDouble cutoff() {
        return Double.isNaN(cutoff) ? OptionalDouble.empty() : OptionalDouble.of(cutoff);
    }

    /** @return number of observed pairs */
    public int observedCount() {
        int k = 0;
        for (boolean b : observed) {
            if (b) {
                k++;
            }
        }
        return k;
    }

    /** @return number of pairs right-censored at the cut-off */
    public int censoredCount() {
        return size() - observedCount();
    }

    /**
     * The observed pairs alone, without a cut-off: the data as a fit that ignores truncation and
     * censoring sees them (censored pairs are left out).
     *
     * @return the observed pairs, in order, with no cut-off
     * @throws ObservationException if no pair is observed
     */
    public DelayPairs observedOnly() {
        return copy(Double.NaN);
    }

    /**
     * The same pairs collected up to another cut-off.
     *
     * @param cutoff the cut-off in days, finite; every observed secondary time must be at or
     *               before it
     * @return the pairs, in order, with that cut-off
     * @throws IllegalArgumentException if {@code cutoff} is not finite
     * @throws ObservationException     if a pair does not fit the cut-off
     */
    public DelayPairs withCutoff(double cutoff) {
        if (!Double.isFinite(cutoff)) {
            throw new IllegalArgumentException("cutoff must be a finite number of days, was " + cutoff);
        }
        return copy(cutoff);
    }

    /** The pairs with cut-off {@code t} (NaN: none, and then the observed pairs only). */
    private DelayPairs copy(double t) {
        Builder b = new Builder(t);
        for (int i = 0; i < size(); i++) {
            if (observed[i]) {
                b.addObserved(ids[i], primaries[i], secondaries[i], daily[i]);
            } else if (!Double.isNaN(t)) {
                b.addCensored(ids[i], primaries[i], daily[i]);
            }
        }
        return b.build();
    }

    @Override
    public String toString() {
        return "DelayPairs[pairs=" + size() + ", censored=" + censoredCount() + ", cutoff="
                + (Double.isNaN(cutoff) ? "none" : cutoff) + "]";
    }

    /**
     * Collects pairs; each method checks its row at once and throws an
     * {@link ObservationException} naming the field and the pair. Not thread-safe.
     */
    public static final class Builder {
        private final double cutoff;
        private final Set<String> seen = new HashSet<>();
        private final java.util.List<String> ids = new java.util.ArrayList<>();
        private final Rows.Doubles primaries = new Rows.Doubles();
        private final Rows.Doubles secondaries = new Rows.Doubles();
        private final Rows.Booleans observed = new Rows.Booleans();
        private final Rows.Booleans daily = new Rows.Booleans();

        private Builder(double cutoff) {
            this.cutoff = cutoff;
        }

        /**
         * Adds a pair whose secondary event was observed.
         *
         * @param id        pair id, not blank, unique
         * @param primary   primary time in days, finite, &le; cut-off if there is one
         * @param secondary secondary time in days, finite, &ge; {@code primary}, &le; cut-off
         *                  if there is one
         * @param daily     true if both times are known only to the day
         * @return this builder
         * @throws ObservationException if the row is invalid
         */
        public Builder addObserved(String id, double primary, double secondary, boolean daily) {
            String what = check(id, primary);
            Rows.finite("secondary", secondary, what);
            if (secondary < primary) {
                throw new ObservationException("secondary", what + ": secondary " + secondary
                        + " is before primary " + primary + " (a delay must be >= 0)");
            }
            if (!Double.isNaN(cutoff) && secondary > cutoff) {
                throw new ObservationException("secondary", what + ": secondary " + secondary
                        + " is after the cut-off " + cutoff);
            }
            append(id, primary, secondary, true, daily);
            return this;
        }

        /**
         * Adds an observed pair with exact times (not day-level).
         *
         * @param id        pair id, not blank, unique
         * @param primary   primary time in days
         * @param secondary secondary time in days, &ge; {@code primary}
         * @return this builder
         * @throws ObservationException if the row is invalid
         * @see #addObserved(String, double, double, boolean)
         */
        public Builder addObserved(String id, double primary, double secondary) {
            return addObserved(id, primary, secondary, false);
        }

        /**
         * Adds a pair whose secondary event had not been observed by the cut-off.
         *
         * @param id      pair id, not blank, unique
         * @param primary primary time in days, finite, &le; cut-off
         * @param daily   true if the primary time is known only to the day
         * @return this builder
         * @throws ObservationException if the row is invalid or the builder has no cut-off
         */
        public Builder addCensored(String id, double primary, boolean daily) {
            String what = check(id, primary);
            if (Double.isNaN(cutoff)) {
                throw new ObservationException("secondary", what
                        + ": secondary not observed, but no cut-off was given (a censored pair needs one)");
            }
            append(id, primary, cutoff, false, daily);
            return this;
        }

        private String check(String id, double primary) {
            Rows.id(id, "pair");
            String what = "pair " + Rows.quote(id);
            if (seen.contains(id)) {
                throw new ObservationException("id", what + " was added before (pair ids must be unique)");
            }
            Rows.finite("primary", primary, what);
            if (!Double.isNaN(cutoff) && primary > cutoff) {
                throw new ObservationException("primary", what + ": primary " + primary
                        + " is after the cut-off " + cutoff);
            }
            return what;
        }

        private void append(String id, double p, double s, boolean obs, boolean day) {
            seen.add(id);
            ids.add(id);
            primaries.add(p);
            secondaries.add(s);
            observed.add(obs);
            daily.add(day);
        }

        /** @return number of pairs added so far */
        public int size() {
            return ids.size();
        }

        /**
         * @return the observations
         * @throws ObservationException (field {@code "id"}) if no pair was added
         */
        public DelayPairs build() {
            if (ids.isEmpty()) {
                throw new ObservationException("id", "no pairs (at least one pair is required)");
            }
            return new DelayPairs(ids.toArray(new String[0]), primaries.toArray(),
                    secondaries.toArray(), observed.toArray(), daily.toArray(), cutoff);
        }
    }
}
