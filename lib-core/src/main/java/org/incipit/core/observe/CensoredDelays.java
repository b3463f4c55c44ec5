package org.incipit.core.observe;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * Delays (durations in days, e.g. survival times) each known to lie in an interval
 * {@code [lower, upper]}: exact ({@code lower == upper}), right-censored
 * ({@code upper = +Infinity}), left-censored ({@code lower = 0}) or interval-censored.
 * Immutable and thread-safe.
 *
 * <pre>{@code
 * CensoredDelays d = CensoredDelays.builder()
 *         .addExact("A", 4.5)
 *         .addRightCensored("B", 10.0)     // still waiting after 10 days
 *         .addInterval("C", 3.0, 5.0)      // between 3 and 5 days
 *         .addLeftCensored("D", 2.0)       // at most 2 days
 *         .build();
 * }</pre>
 */
public final class CensoredDelays {

    private final String[] ids;
    private final double[] lower;
    private final double[] upper;

    private CensoredDelays(String[] ids, double[] lower, double[] upper) {
        this.ids = ids;
        this.lower = lower;
        this.upper = upper;
    }

    /** @return a new, empty builder */
    public static Builder builder() {
        return new Builder();
    }

    /** @return number of delays, &ge; 1 */
    public int size() {
        return ids.length;
    }

    /** @param i index in {@code [0, size())} @return the id */
    public String id(int i) {
        return ids[i];
    }

    /** @param i index @return the lower bound in days, &ge; 0 (0 for a left-censored delay) */
    public double lower(int i) {
        return lower[i];
    }

    /** @param i index @return the upper bound in days, {@code +Infinity} if right-censored */
    public double upper(int i) {
        return upper[i];
    }

    /** @return a copy of the lower bounds */
    public double[] lowers() {
        return lower.clone();
    }

    /** @return a copy of the upper bounds */
    public double[] uppers() {
        return upper.clone();
    }

    /** @param i index @return true if the delay is known exactly */
    public boolean isExact(int i) {
        return lower[i] == upper[i];
    }

    @Override
    public String toString() {
        return "CensoredDelays[" + size() + "]";
    }

    /** Collects delays; each row is checked when added. Not thread-safe. */
    public static final class Builder {
        private final Set<String> seen = new HashSet<>();
        private final List<String> ids = new ArrayList<>();
        private final Rows.Doubles lower = new Rows.Doubles();
        private final Rows.Doubles upper = new Rows.Doubles();

        private Builder() {
        }

        /**
         * @param id    unique, not blank
         * @param delay exact delay in days, finite and &gt; 0
         * @return this builder
         * @throws ObservationException if the row is invalid
         */
        public Builder addExact(String id, double delay) {
            String what = check(id);
            positive("delay", delay, what);
            return append(id, delay, delay);
        }

        /**
         * @param id    unique, not blank
         * @param delay the delay exceeds this many days; finite and &ge; 0
         * @return this builder
         * @throws ObservationException if the row is invalid
         */
        public Builder addRightCensored(String id, double delay) {
            String what = check(id);
            Rows.finite("lower", delay, what);
            if (delay < 0) {
                throw new ObservationException("lower", what + ": lower must be >= 0, was " + delay);
            }
            return append(id, delay, Double.POSITIVE_INFINITY);
        }

        /**
         * @param id    unique, not blank
         * @param delay the delay is at most this many days; finite and &gt; 0
         * @return this builder
         * @throws ObservationException if the row is invalid
         */
        public Builder addLeftCensored(String id, double delay) {
            String what = check(id);
            positive("upper", delay, what);
            return append(id, 0.0, delay);
        }

        /**
         * @param id    unique, not blank
         * @param lower lower bound in days, finite and &ge; 0
         * @param upper upper bound, finite and &gt; {@code lower}
         * @return this builder
         * @throws ObservationException if the row is invalid
         */
        public Builder addInterval(String id, double lower, double upper) {
            String what = check(id);
            Rows.finite("lower", lower, what);
            Rows.finite("upper", upper, what);
            if (lower < 0) {
                throw new ObservationException("lower", what + ": lower must be >= 0, was " + lower);
            }
            if (!(upper > lower)) {
                throw new ObservationException("upper", what + ": upper " + upper
                        + " must be > lower " + lower + " (use addExact for an exact delay)");
            }
            return append(id, lower, upper);
        }

        private static void positive(String field, double x, String what) {
            Rows.finite(field, x, what);
            if (!(x > 0)) {
                throw new ObservationException(field, what + ": " + field + " must be > 0, was " + x);
            }
        }

        private String check(String id) {
            Rows.id(id, "delay");
            String what = "delay " + Rows.quote(id);
            if (seen.contains(id)) {
                throw new ObservationException("id", what + " was added before (ids must be unique)");
            }
            return what;
        }

        private Builder append(String id, double lo, double hi) {
            seen.add(id);
            ids.add(id);
            lower.add(lo);
            upper.add(hi);
            return this;
        }

        /** @return number of delays added so far */
        public int size() {
            return ids.size();
        }

        /**
         * @return the observations
         * @throws ObservationException (field {@code "id"}) if none was added
         */
        public CensoredDelays build() {
            if (ids.isEmpty()) {
                throw new ObservationException("id", "no delays (at least one is required)");
            }
            return new CensoredDelays(ids.toArray(new String[0]), lower.toArray(), upper.toArray());
        }
    }
}
