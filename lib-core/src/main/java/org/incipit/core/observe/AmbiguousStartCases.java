package org.incipit.core.observe;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Cases whose interval has a known end but an ambiguous start: for each case an end time
 * {@code t} (e.g. the onset of a secondary case) and candidate start times
 * {@code e_1 <= ... <= e_m} (e.g. the onsets of its possible infectors), optionally a contact
 * category per candidate and optionally the total number of exposures {@code M >= m} (for a
 * likelihood in which only some of a case's exposures were recorded). Immutable and
 * thread-safe.
 *
 * <p>Storage is flat: the candidates of case {@code i} are the indices
 * {@code offset(i) <= j < offset(i + 1)} of {@link #starts()} and {@link #categoryCodes()},
 * sorted by start time within each case (ties kept in the order they were added). Cases keep
 * the order in which their ids first appeared.
 *
 * <pre>{@code
 * AmbiguousStartCases cases = AmbiguousStartCases.builder()
 *         .addCase("B1", 12.0, 7.0, 9.5)               // two possible infectors
 *         .addCandidate("B2", 15.0, 10.0, "household", 3)
 *         .addCandidate("B2", 15.0, 11.0, "work", 3)   // 2 of 3 exposures recorded
 *         .build();
 * }</pre>
 */
public final class AmbiguousStartCases {

    /** Value of {@link #totalExposures(int)} when the total is not known. */
    public static final int UNKNOWN_TOTAL = -1;

    /** Value of a category code when the data set has no categories. */
    public static final int NO_CATEGORY = -1;

    private final String[] ids;
    private final double[] ends;
    private final int[] offsets;
    private final double[] starts;
    private final int[] categories;
    private final int[] totals;
    private final List<String> categoryNames;

    private AmbiguousStartCases(String[] ids, double[] ends, int[] offsets, double[] starts,
                                int[] categories, int[] totals, List<String> categoryNames) {
        this.ids = ids;
        this.ends = ends;
        this.offsets = offsets;
        this.starts = starts;
        this.categories = categories;
        this.totals = totals;
        this.categoryNames = categoryNames;
    }

    /** @return a new, empty builder */
    public static Builder builder() {
        return new Builder();
    }

    /** @return number of cases, &ge; 1 */
    public int caseCount() {
        return ids.length;
    }

    /** @return total number of candidate starts over all cases */
    public int candidateCount() {
        return starts.length;
    }

    /**
     * @param caseIndex in {@code [0, caseCount()]}; {@code offset(caseCount())} is
     *                  {@link #candidateCount()}
     * @return index of the first candidate of the case in the flat arrays
     * @throws IndexOutOfBoundsException if the index is out of range
     */
    public int offset(int caseIndex) {
        return offsets[caseIndex];
    }

    /** @return a copy of the offsets, length {@code caseCount() + 1} */
    public int[] offsets() {
        return offsets.clone();
    }

    /**
     * @param caseIndex in {@code [0, caseCount())}
     * @return number of candidate starts of the case, &ge; 1
     */
    public int candidateCount(int caseIndex) {
        return offsets[caseIndex + 1] - offsets[caseIndex];
    }

    /**
     * @param caseIndex in {@code [0, caseCount())}
     * @return the case id
     */
    public String id(int caseIndex) {
        return ids[caseIndex];
    }

    /** @return the case ids in case order (unmodifiable) */
    public List<String> ids() {
        return List.of(ids);
    }

    /**
     * @param caseIndex in {@code [0, caseCount())}
     * @return the end time in days
     */
    public double end(int caseIndex) {
        return ends[caseIndex];
    }

    /** @return a copy of the end times, one per case */
    public double[] ends() {
        return ends.clone();
    }

    /**
     * @param candidate flat index in {@code [0, candidateCount())}
     * @return its start time
     */
    public double start(int candidate) {
        return starts[candidate];
    }

    /** @return a copy of the candidate start times, flat, sorted within each case */
    public double[] starts() {
        return starts.clone();
    }

    /** @return true if every candidate has a contact category */
    public boolean hasCategories() {
        return !categoryNames.isEmpty();
    }

    /**
     * @param candidate flat index in {@code [0, candidateCount())}
     * @return the category code, an index into {@link #categoryNames()}, or {@link #NO_CATEGORY}
     */
    public int categoryCode(int candidate) {
        return categories[candidate];
    }

    /** @return a copy of the category codes, flat (all {@link #NO_CATEGORY} if none) */
    public int[] categoryCodes() {
        return categories.clone();
    }

    /** @return category names indexed by code, in order of first appearance (unmodifiable) */
    public List<String> categoryNames() {
        return categoryNames;
    }

    /**
     * @param caseIndex in {@code [0, caseCount())}
     * @return the total number of exposures {@code M >= candidateCount(caseIndex)}, or
     *     {@link #UNKNOWN_TOTAL}
     */
    public int totalExposures(int caseIndex) {
        return totals[caseIndex];
    }

    /** @return true if at least one case has a known total number of exposures */
    public boolean hasTotalExposures() {
        for (int m : totals) {
            if (m != UNKNOWN_TOTAL) {
                return true;
            }
        }
        return false;
    }

    /**
     * @param id a case id
     * @return its case index, or -1 if there is no such case
     */
    public int indexOf(String id) {
        for (int i = 0; i < ids.length; i++) {
            if (ids[i].equals(id)) {
                return i;
            }
        }
        return -1;
    }

    @Override
    public String toString() {
        return "AmbiguousStartCases[cases=" + caseCount() + ", candidates=" + candidateCount()
                + ", categories=" + categoryNames + "]";
    }

    /**
     * Collects candidate starts row by row. Every method checks its row at once and throws an
     * {@link ObservationException} naming the field, the case and the values; a rejected row
     * leaves the builder as it was. Not thread-safe.
     */
    public static final class Builder {

        private static final class Acc {
            final String id;
            final double end;
            final int total;
            final Rows.Doubles starts = new Rows.Doubles();
            final Rows.Ints categories = new Rows.Ints();

            Acc(String id, double end, int total) {
                this.id = id;
                this.end = end;
                this.total = total;
            }
        }

        private final Map<String, Acc> cases = new LinkedHashMap<>();
        private final Map<String, Integer> categoryCodes = new HashMap<>();
        private final List<String> categoryNames = new ArrayList<>();
        private Boolean withCategories; // null until the first candidate

        private Builder() {
        }

        /**
         * Adds one candidate start to a case, creating the case on its first candidate.
         *
         * @param caseId         case id, not blank
         * @param end            the case's end time in days, finite; must equal the end given
         *                       with the case's earlier candidates
         * @param start          a candidate start time in days, finite, &le; {@code end}
         * @param category       contact category name, or null if the data set has none; either
         *                       every candidate has one or none has
         * @param totalExposures the case's total number of exposures {@code M}, or
         *                       {@link #UNKNOWN_TOTAL}; must agree across the case's candidates
         *                       and be &ge; the number of its candidates
         * @return this builder
         * @throws ObservationException if the row is invalid or contradicts the case's earlier rows
         */
        public Builder addCandidate(String caseId, double end, double start, String category,
                                    int totalExposures) {
            Rows.id(caseId, "case");
            String what = "case " + Rows.quote(caseId);
            Rows.finite("end", end, what);
            Rows.finite("start", start, what);
            if (start > end) {
                throw new ObservationException("start", what + ": start " + start
                        + " is after end " + end + " (a start must not be after the end)");
            }
            if (totalExposures != UNKNOWN_TOTAL && totalExposures < 1) {
                throw new ObservationException("totalExposures", what
                        + ": total number of exposures must be >= 1 (or unknown), was " + totalExposures);
            }
            if (category != null && category.isBlank()) {
                throw new ObservationException("category", what + ": category must not be blank");
            }
            if (withCategories != null && withCategories != (category != null)) {
                throw new ObservationException("category", what + (category == null
                        ? ": candidate has no category, but earlier candidates have one"
                        : ": candidate has category '" + category + "', but earlier candidates have none"));
            }
            Acc acc = cases.get(caseId);
            if (acc != null) {
                if (Double.compare(acc.end, end) != 0) {
                    throw new ObservationException("end", what + ": end " + end
                            + " disagrees with end " + acc.end + " given for the case before");
                }
                if (acc.total != totalExposures) {
                    throw new ObservationException("totalExposures", what + ": total number of exposures "
                            + totalText(totalExposures) + " disagrees with " + totalText(acc.total)
                            + " given for the case before");
                }
            }
            int count = acc == null ? 1 : acc.starts.size() + 1;
            if (totalExposures != UNKNOWN_TOTAL && count > totalExposures) {
                throw new ObservationException("totalExposures", what + " has " + count
                        + " candidate starts, more than its total number of exposures " + totalExposures);
            }
            // all checks passed: now change state
            if (acc == null) {
                acc = new Acc(caseId, end, totalExposures);
                cases.put(caseId, acc);
            }
            withCategories = category != null;
            int code = NO_CATEGORY;
            if (category != null) {
                code = categoryCodes.computeIfAbsent(category, c -> {
                    categoryNames.add(c);
                    return categoryNames.size() - 1;
                });
            }
            acc.starts.add(start);
            acc.categories.add(code);
            return this;
        }

        /**
         * Adds one candidate start without category or total.
         *
         * @param caseId case id, not blank
         * @param end    the case's end time in days, finite
         * @param start  a candidate start time in days, finite, &le; {@code end}
         * @return this builder
         * @throws ObservationException if the row is invalid
         * @see #addCandidate(String, double, double, String, int)
         */
        public Builder addCandidate(String caseId, double end, double start) {
            return addCandidate(caseId, end, start, null, UNKNOWN_TOTAL);
        }

        /**
         * Adds a whole case with its candidate starts (any order), no categories, total unknown.
         *
         * @param caseId a new case id (an id already added is an error)
         * @param end    end time in days, finite
         * @param starts at least one candidate start, each finite and &le; {@code end}; not modified
         * @return this builder
         * @throws ObservationException if the case is invalid or its id already exists
         */
        public Builder addCase(String caseId, double end, double... starts) {
            return addCase(caseId, end, starts, null, UNKNOWN_TOTAL);
        }

        /**
         * Adds a whole case. Either all candidates are added or, on an error, none.
         *
         * @param caseId         a new case id (an id already added is an error)
         * @param end            end time in days, finite
         * @param starts         at least one candidate start, each finite and &le; {@code end};
         *                       not modified
         * @param categories     category name per candidate (same length as {@code starts}),
         *                       or null
         * @param totalExposures {@code M >= starts.length}, or {@link #UNKNOWN_TOTAL}
         * @return this builder
         * @throws ObservationException if the case is invalid or its id already exists
         */
        public Builder addCase(String caseId, double end, double[] starts, String[] categories,
                               int totalExposures) {
            Rows.id(caseId, "case");
            String what = "case " + Rows.quote(caseId);
            if (cases.containsKey(caseId)) {
                throw new ObservationException("id", what + " was added before (case ids must be unique)");
            }
            if (starts == null || starts.length == 0) {
                throw new ObservationException("start", what + " has no candidate start (at least one is required)");
            }
            if (categories != null && categories.length != starts.length) {
                throw new ObservationException("category", what + ": " + categories.length
                        + " categories for " + starts.length + " candidate starts");
            }
            if (totalExposures != UNKNOWN_TOTAL && totalExposures < starts.length) {
                throw new ObservationException("totalExposures", what + " has " + starts.length
                        + " candidate starts, more than its total number of exposures " + totalExposures);
            }
            Boolean savedFlag = withCategories;
            int savedNames = categoryNames.size();
            try {
                for (int k = 0; k < starts.length; k++) {
                    addCandidate(caseId, end, starts[k], categories == null ? null : categories[k],
                            totalExposures);
                }
            } catch (ObservationException e) {
                cases.remove(caseId);
                withCategories = savedFlag;
                while (categoryNames.size() > savedNames) {
                    categoryCodes.remove(categoryNames.remove(categoryNames.size() - 1));
                }
                throw e;
            }
            return this;
        }

        /** @return number of cases added so far */
        public int caseCount() {
            return cases.size();
        }

        /**
         * @return the observations, candidates sorted by start within each case
         * @throws ObservationException (field {@code "id"}) if no case was added
         */
        public AmbiguousStartCases build() {
            if (cases.isEmpty()) {
                throw new ObservationException("id", "no cases (at least one case is required)");
            }
            int n = cases.size();
            String[] ids = new String[n];
            double[] ends = new double[n];
            int[] totals = new int[n];
            int[] offsets = new int[n + 1];
            int total = 0;
            for (Acc acc : cases.values()) {
                total += acc.starts.size();
            }
            double[] starts = new double[total];
            int[] cats = new int[total];
            int i = 0;
            int j = 0;
            for (Acc acc : cases.values()) {
                ids[i] = acc.id;
                ends[i] = acc.end;
                totals[i] = acc.total;
                offsets[i] = j;
                int m = acc.starts.size();
                Integer[] order = new Integer[m];
                for (int k = 0; k < m; k++) {
                    order[k] = k;
                }
                // stable sort: ties keep insertion order
                Arrays.sort(order, (a, b) -> Double.compare(acc.starts.get(a), acc.starts.get(b)));
                for (int k = 0; k < m; k++) {
                    starts[j] = acc.starts.get(order[k]);
                    cats[j] = acc.categories.get(order[k]);
                    j++;
                }
                i++;
            }
            offsets[n] = j;
            return new AmbiguousStartCases(ids, ends, offsets, starts, cats, totals,
                    Collections.unmodifiableList(new ArrayList<>(categoryNames)));
        }

        private static String totalText(int m) {
            return m == UNKNOWN_TOTAL ? "(unknown)" : Integer.toString(m);
        }
    }
}
