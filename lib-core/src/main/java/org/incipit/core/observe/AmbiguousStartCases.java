package org.incipit.core.observe;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.HashMap;
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
    private final List<String> idList; // an unmodifiable view of ids, which never change

    private AmbiguousStartCases(String[] ids, double[] ends, int[] offsets, double[] starts,
                                int[] categories, int[] totals, List<String> categoryNames) {
        this.ids = ids;
        this.ends = ends;
        this.offsets = offsets;
        this.starts = starts;
        this.categories = categories;
        this.totals = totals;
        this.categoryNames = categoryNames;
        this.idList = Collections.unmodifiableList(Arrays.asList(ids));
    }

    /** @return a new, empty builder */
    public static Builder builder() {
        return new Builder(16);
    }

    /**
     * A new, empty builder with room for {@code expectedCandidates} candidate starts (and as many
     * cases) before its storage grows; for readers that know the size of their input. The hint
     * is not a limit: more candidates may be added.
     *
     * @param expectedCandidates expected number of candidate starts, &ge; 0
     * @return a new, empty builder
     * @throws IllegalArgumentException if {@code expectedCandidates < 0}
     */
    public static Builder builder(int expectedCandidates) {
        if (expectedCandidates < 0) {
            throw new IllegalArgumentException("expectedCandidates must be >= 0, was " + expectedCandidates);
        }
        return new Builder(Math.min(expectedCandidates, MAX_HINT));
    }

    /** The largest storage a size hint reserves at once (later growth is by doubling). */
    private static final int MAX_HINT = 1 << 22;

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
        return idList;
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

        /** A case so far: its index in first-appearance order and what its rows must agree on. */
        private static final class Acc {
            final int index;
            final double end;
            final int total;
            int count;

            Acc(int index, double end, int total) {
                this.index = index;
                this.end = end;
                this.total = total;
            }
        }

        // Flat storage in the order added (one entry per candidate, no object per candidate);
        // build() groups the candidates by case with a counting sort.
        private final Map<String, Acc> cases;
        private final List<String> ids;
        private final Rows.Doubles ends;
        private final Rows.Ints totals;
        private final Rows.Ints candidateCase;
        private final Rows.Doubles candidateStart;
        private final Rows.Ints candidateCategory;
        private final Map<String, Integer> categoryCodes = new HashMap<>();
        private final List<String> categoryNames = new ArrayList<>();
        private Boolean withCategories; // null until the first candidate
        private String lastId; // the case of the last candidate added, and its entry
        private Acc last;

        /** @param capacity candidates (and cases) to make room for, 0 to 2^22 */
        private Builder(int capacity) {
            cases = new HashMap<>(capacity * 4 / 3 + 1); // no rehashing up to capacity cases
            ids = new ArrayList<>(capacity);
            ends = new Rows.Doubles(capacity);
            totals = new Rows.Ints(capacity);
            candidateCase = new Rows.Ints(capacity);
            candidateStart = new Rows.Doubles(capacity);
            candidateCategory = new Rows.Ints(capacity);
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
            // the checks run once per row of large files: the message is built only on a fault
            if (!Double.isFinite(end)) {
                Rows.finite("end", end, what(caseId));
            }
            if (!Double.isFinite(start)) {
                Rows.finite("start", start, what(caseId));
            }
            if (start > end) {
                throw new ObservationException("start", what(caseId) + ": start " + start
                        + " is after end " + end + " (a start must not be after the end)");
            }
            if (totalExposures != UNKNOWN_TOTAL && totalExposures < 1) {
                throw new ObservationException("totalExposures", what(caseId)
                        + ": total number of exposures must be >= 1 (or unknown), was " + totalExposures);
            }
            if (category != null && category.isBlank()) {
                throw new ObservationException("category", what(caseId) + ": category must not be blank");
            }
            if (withCategories != null && withCategories != (category != null)) {
                throw new ObservationException("category", what(caseId) + (category == null
                        ? ": candidate has no category, but earlier candidates have one"
                        : ": candidate has category '" + category + "', but earlier candidates have none"));
            }
            Acc acc = caseId.equals(lastId) ? last : cases.get(caseId);
            if (acc != null) {
                if (Double.compare(acc.end, end) != 0) {
                    throw new ObservationException("end", what(caseId) + ": end " + end
                            + " disagrees with end " + acc.end + " given for the case before");
                }
                if (acc.total != totalExposures) {
                    throw new ObservationException("totalExposures", what(caseId) + ": total number of exposures "
                            + totalText(totalExposures) + " disagrees with " + totalText(acc.total)
                            + " given for the case before");
                }
            }
            int count = acc == null ? 1 : acc.count + 1;
            if (totalExposures != UNKNOWN_TOTAL && count > totalExposures) {
                throw new ObservationException("totalExposures", what(caseId) + " has " + count
                        + " candidate starts, more than its total number of exposures " + totalExposures);
            }
            // all checks passed: now change state
            if (acc == null) {
                acc = new Acc(ids.size(), end, totalExposures);
                cases.put(caseId, acc);
                ids.add(caseId);
                ends.add(end);
                totals.add(totalExposures);
            }
            withCategories = category != null;
            int code = NO_CATEGORY;
            if (category != null) {
                Integer known = categoryCodes.get(category);
                if (known == null) {
                    code = categoryNames.size();
                    categoryNames.add(category);
                    categoryCodes.put(category, code);
                } else {
                    code = known;
                }
            }
            acc.count = count;
            lastId = caseId;
            last = acc;
            candidateCase.add(acc.index);
            candidateStart.add(start);
            candidateCategory.add(code);
            return this;
        }

        private static String what(String caseId) {
            return "case " + Rows.quote(caseId);
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
            int savedCases = ids.size();
            int savedCandidates = candidateCase.size();
            try {
                for (int k = 0; k < starts.length; k++) {
                    addCandidate(caseId, end, starts[k], categories == null ? null : categories[k],
                            totalExposures);
                }
            } catch (ObservationException e) {
                // the case is new, so it and its candidates are the last entries: cut them off
                cases.remove(caseId);
                lastId = null;
                last = null;
                ids.subList(savedCases, ids.size()).clear();
                ends.truncate(savedCases);
                totals.truncate(savedCases);
                candidateCase.truncate(savedCandidates);
                candidateStart.truncate(savedCandidates);
                candidateCategory.truncate(savedCandidates);
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
            int n = ids.size();
            int total = candidateCase.size();
            int[] offsets = new int[n + 1];
            for (int c = 0; c < total; c++) {
                offsets[candidateCase.get(c) + 1]++;
            }
            for (int i = 0; i < n; i++) {
                offsets[i + 1] += offsets[i];
            }
            // counting sort by case: stable, so each case's candidates stay in the order added
            double[] starts = new double[total];
            int[] cats = new int[total];
            int[] next = Arrays.copyOf(offsets, n);
            for (int c = 0; c < total; c++) {
                int j = next[candidateCase.get(c)]++;
                starts[j] = candidateStart.get(c);
                cats[j] = candidateCategory.get(c);
            }
            for (int i = 0; i < n; i++) {
                sortByStart(starts, cats, offsets[i], offsets[i + 1]);
            }
            return new AmbiguousStartCases(ids.toArray(new String[0]), ends.toArray(), offsets, starts, cats,
                    totals.toArray(), Collections.unmodifiableList(new ArrayList<>(categoryNames)));
        }

        /**
         * Sorts {@code starts[from, to)} ascending, moving {@code cats} along; stable (ties keep
         * the order added). Cases have few candidates and files are often in order already, so
         * an insertion sort, with a stable library sort for long cases.
         */
        private static void sortByStart(double[] starts, int[] cats, int from, int to) {
            int m = to - from;
            if (m <= 32) {
                for (int k = from + 1; k < to; k++) {
                    double x = starts[k];
                    int code = cats[k];
                    int j = k - 1;
                    while (j >= from && Double.compare(starts[j], x) > 0) {
                        starts[j + 1] = starts[j];
                        cats[j + 1] = cats[j];
                        j--;
                    }
                    starts[j + 1] = x;
                    cats[j + 1] = code;
                }
                return;
            }
            Integer[] order = new Integer[m];
            for (int k = 0; k < m; k++) {
                order[k] = k;
            }
            Arrays.sort(order, (a, b) -> Double.compare(starts[from + a], starts[from + b])); // stable
            double[] s = Arrays.copyOfRange(starts, from, to);
            int[] c = Arrays.copyOfRange(cats, from, to);
            for (int k = 0; k < m; k++) {
                starts[from + k] = s[order[k]];
                cats[from + k] = c[order[k]];
            }
        }

        private static String totalText(int m) {
            return m == UNKNOWN_TOTAL ? "(unknown)" : Integer.toString(m);
        }
    }
}
