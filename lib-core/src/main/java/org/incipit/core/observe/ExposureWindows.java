package org.incipit.core.observe;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * Cases with an exposure window {@code [exposureFrom, exposureTo]} and an onset time, in days:
 * infection happened somewhere in the window, so the incubation period lies in
 * {@code [onset - exposureTo, onset - exposureFrom]}. Immutable and thread-safe.
 *
 * <p>Requirement: {@code exposureFrom <= exposureTo <= onset}. An exposure that went on past
 * onset cannot have caused that onset, so a window reaching beyond the onset must be cut at the
 * onset by whoever records the data; the builder rejects it rather than cut it silently. A
 * single known exposure time is a window with {@code exposureFrom == exposureTo}.
 *
 * <pre>{@code
 * ExposureWindows w = ExposureWindows.builder()
 *         .add("C1", 2.0, 4.0, 9.0)   // exposed on days 2 to 4, onset on day 9
 *         .build();
 * }</pre>
 */
public final class ExposureWindows {

    private final String[] ids;
    private final double[] from;
    private final double[] to;
    private final double[] onsets;

    private ExposureWindows(String[] ids, double[] from, double[] to, double[] onsets) {
        this.ids = ids;
        this.from = from;
        this.to = to;
        this.onsets = onsets;
    }

    /** @return a new, empty builder */
    public static Builder builder() {
        return new Builder();
    }

    /** @return number of cases, &ge; 1 */
    public int size() {
        return ids.length;
    }

    /**
     * @param i case index in {@code [0, size())}
     * @return the case id
     */
    public String id(int i) {
        return ids[i];
    }

    /** @return the case ids in order (unmodifiable) */
    public List<String> ids() {
        return List.of(ids);
    }

    /**
     * @param i case index
     * @return start of the exposure window in days
     */
    public double exposureFrom(int i) {
        return from[i];
    }

    /**
     * @param i case index
     * @return end of the exposure window in days
     */
    public double exposureTo(int i) {
        return to[i];
    }

    /**
     * @param i case index
     * @return onset time in days
     */
    public double onset(int i) {
        return onsets[i];
    }

    /** @return a copy of the window starts */
    public double[] exposureFroms() {
        return from.clone();
    }

    /** @return a copy of the window ends */
    public double[] exposureTos() {
        return to.clone();
    }

    /** @return a copy of the onset times */
    public double[] onsets() {
        return onsets.clone();
    }

    @Override
    public String toString() {
        return "ExposureWindows[cases=" + size() + "]";
    }

    /** Collects cases; each row is checked when added. Not thread-safe. */
    public static final class Builder {
        private final Set<String> seen = new HashSet<>();
        private final List<String> ids = new ArrayList<>();
        private final Rows.Doubles from = new Rows.Doubles();
        private final Rows.Doubles to = new Rows.Doubles();
        private final Rows.Doubles onsets = new Rows.Doubles();

        private Builder() {
        }

        /**
         * @param id           case id, not blank, unique
         * @param exposureFrom start of the exposure window in days, finite
         * @param exposureTo   end of the window, finite, &ge; {@code exposureFrom}
         * @param onset        onset time, finite, &ge; {@code exposureTo}
         * @return this builder
         * @throws ObservationException if the row is invalid
         */
        public Builder add(String id, double exposureFrom, double exposureTo, double onset) {
            Rows.id(id, "case");
            String what = "case " + Rows.quote(id);
            if (seen.contains(id)) {
                throw new ObservationException("id", what + " was added before (case ids must be unique)");
            }
            Rows.finite("exposureFrom", exposureFrom, what);
            Rows.finite("exposureTo", exposureTo, what);
            Rows.finite("onset", onset, what);
            if (exposureTo < exposureFrom) {
                throw new ObservationException("exposureTo", what + ": exposure_to " + exposureTo
                        + " is before exposure_from " + exposureFrom);
            }
            if (onset < exposureTo) {
                throw new ObservationException("onset", what + ": onset " + onset
                        + " is before exposure_to " + exposureTo
                        + " (cut the exposure window at the onset)");
            }
            seen.add(id);
            ids.add(id);
            from.add(exposureFrom);
            to.add(exposureTo);
            onsets.add(onset);
            return this;
        }

        /** @return number of cases added so far */
        public int size() {
            return ids.size();
        }

        /**
         * @return the observations
         * @throws ObservationException (field {@code "id"}) if no case was added
         */
        public ExposureWindows build() {
            if (ids.isEmpty()) {
                throw new ObservationException("id", "no cases (at least one case is required)");
            }
            return new ExposureWindows(ids.toArray(new String[0]), from.toArray(), to.toArray(),
                    onsets.toArray());
        }
    }
}
