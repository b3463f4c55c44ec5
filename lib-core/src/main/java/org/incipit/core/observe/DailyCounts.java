package org.incipit.core.observe;

/**
 * Counts per day on consecutive integer day numbers: new cases, and optionally new deaths,
 * new recoveries and the number of the day's cases that were imported (infected elsewhere).
 * Immutable and thread-safe.
 *
 * <p>Days must be consecutive ({@code d, d + 1, d + 2, ...}): a missing day is an error, not a
 * silent zero, because "no report" and "zero cases" differ; a day with no cases is entered as
 * an explicit 0. Imported cases are part of the day's cases ({@code imported <= cases}).
 * Deaths and recoveries are counted on the day they are reported and are not checked against
 * cases (they may concern cases reported earlier).
 *
 * <pre>{@code
 * DailyCounts counts = DailyCounts.builder().withDeaths()
 *         .add(0, 3, 0, DailyCounts.ABSENT, DailyCounts.ABSENT)
 *         .add(1, 5, 1, DailyCounts.ABSENT, DailyCounts.ABSENT)
 *         .build();
 * }</pre>
 */
public final class DailyCounts {

    /** Value passed for a series the builder does not record. */
    public static final int ABSENT = -1;

    private final int firstDay;
    private final int[] cases;
    private final int[] deaths;      // null if not recorded
    private final int[] recoveries;  // null if not recorded
    private final int[] imported;    // null if not recorded

    private DailyCounts(int firstDay, int[] cases, int[] deaths, int[] recoveries, int[] imported) {
        this.firstDay = firstDay;
        this.cases = cases;
        this.deaths = deaths;
        this.recoveries = recoveries;
        this.imported = imported;
    }

    /** @return a builder recording cases only; add series with {@code with...()} */
    public static Builder builder() {
        return new Builder();
    }

    /** @return number of days, &ge; 1 */
    public int size() {
        return cases.length;
    }

    /** @return the first day number */
    public int firstDay() {
        return firstDay;
    }

    /** @return the last day number, {@code firstDay() + size() - 1} */
    public int lastDay() {
        return firstDay + cases.length - 1;
    }

    /**
     * @param i day index in {@code [0, size())}
     * @return the day number {@code firstDay() + i}
     */
    public int day(int i) {
        if (i < 0 || i >= cases.length) {
            throw new IndexOutOfBoundsException("day index must be in [0, " + cases.length + "), was " + i);
        }
        return firstDay + i;
    }

    /** @return a copy of the day numbers */
    public int[] days() {
        int[] d = new int[cases.length];
        for (int i = 0; i < d.length; i++) {
            d[i] = firstDay + i;
        }
        return d;
    }

    /**
     * @param i day index
     * @return new cases on day {@code day(i)}
     */
    public int cases(int i) {
        return cases[i];
    }

    /** @return a copy of the case counts */
    public int[] cases() {
        return cases.clone();
    }

    /** @return sum of the case counts */
    public long totalCases() {
        long s = 0;
        for (int c : cases) {
            s += c;
        }
        return s;
    }

    /** @return true if deaths were recorded */
    public boolean hasDeaths() {
        return deaths != null;
    }

    /** @return true if recoveries were recorded */
    public boolean hasRecoveries() {
        return recoveries != null;
    }

    /** @return true if imported cases were recorded */
    public boolean hasImported() {
        return imported != null;
    }

    /**
     * @return a copy of the death counts
     * @throws IllegalStateException if deaths were not recorded
     */
    public int[] deaths() {
        return series(deaths, "deaths");
    }

    /**
     * @return a copy of the recovery counts
     * @throws IllegalStateException if recoveries were not recorded
     */
    public int[] recoveries() {
        return series(recoveries, "recoveries");
    }

    /**
     * @return a copy of the imported-case counts
     * @throws IllegalStateException if imported cases were not recorded
     */
    public int[] imported() {
        return series(imported, "imported");
    }

    private static int[] series(int[] s, String name) {
        if (s == null) {
            throw new IllegalStateException(name + " were not recorded in these counts");
        }
        return s.clone();
    }

    @Override
    public String toString() {
        return "DailyCounts[days " + firstDay + ".." + lastDay() + ", cases=" + totalCases()
                + (hasDeaths() ? ", deaths" : "") + (hasRecoveries() ? ", recoveries" : "")
                + (hasImported() ? ", imported" : "") + "]";
    }

    /** Collects days in order; each row is checked when added. Not thread-safe. */
    public static final class Builder {
        private boolean withDeaths;
        private boolean withRecoveries;
        private boolean withImported;
        private int firstDay;
        private final Rows.Ints cases = new Rows.Ints();
        private final Rows.Ints deaths = new Rows.Ints();
        private final Rows.Ints recoveries = new Rows.Ints();
        private final Rows.Ints imported = new Rows.Ints();

        private Builder() {
        }

        /**
         * @return this builder, now recording deaths
         * @throws IllegalStateException if rows were added already
         */
        public Builder withDeaths() {
            requireEmpty();
            withDeaths = true;
            return this;
        }

        /**
         * @return this builder, now recording recoveries
         * @throws IllegalStateException if rows were added already
         */
        public Builder withRecoveries() {
            requireEmpty();
            withRecoveries = true;
            return this;
        }

        /**
         * @return this builder, now recording imported cases
         * @throws IllegalStateException if rows were added already
         */
        public Builder withImported() {
            requireEmpty();
            withImported = true;
            return this;
        }

        private void requireEmpty() {
            if (cases.size() > 0) {
                throw new IllegalStateException("series must be chosen before the first day is added");
            }
        }

        /**
         * Adds a day with cases only (the builder must record no other series).
         *
         * @param day   the next day number
         * @param cases new cases, &ge; 0
         * @return this builder
         * @throws ObservationException if the row is invalid
         * @see #add(int, int, int, int, int)
         */
        public Builder add(int day, int cases) {
            return add(day, cases, ABSENT, ABSENT, ABSENT);
        }

        /**
         * Adds the next day.
         *
         * @param day        day number: any integer for the first day, then exactly one more
         *                   than the previous day
         * @param cases      new cases, &ge; 0
         * @param deaths     new deaths, &ge; 0 if recorded, else {@link #ABSENT}
         * @param recoveries new recoveries, &ge; 0 if recorded, else {@link #ABSENT}
         * @param imported   imported among the day's cases, in {@code [0, cases]} if recorded,
         *                   else {@link #ABSENT}
         * @return this builder
         * @throws ObservationException if the row is invalid
         */
        public Builder add(int day, int cases, int deaths, int recoveries, int imported) {
            String what = "day " + day;
            int n = this.cases.size();
            if (n > 0 && day != firstDay + n) {
                int previous = firstDay + n - 1;
                throw new ObservationException("day", what + " follows day " + previous
                        + ": days must be consecutive"
                        + (day > previous ? " (enter days without cases as explicit zeros; "
                        + "missing days " + (previous + 1) + " to " + (day - 1) + ")"
                        : " and increasing"));
            }
            if (cases < 0) {
                throw new ObservationException("cases", what + ": cases must be >= 0, was " + cases);
            }
            checkSeries("deaths", deaths, withDeaths, what);
            checkSeries("recoveries", recoveries, withRecoveries, what);
            checkSeries("imported", imported, withImported, what);
            if (withImported && imported > cases) {
                throw new ObservationException("imported", what + ": imported " + imported
                        + " exceeds cases " + cases + " (imported cases are part of the day's cases)");
            }
            if (n == 0) {
                firstDay = day;
            }
            this.cases.add(cases);
            if (withDeaths) {
                this.deaths.add(deaths);
            }
            if (withRecoveries) {
                this.recoveries.add(recoveries);
            }
            if (withImported) {
                this.imported.add(imported);
            }
            return this;
        }

        private static void checkSeries(String name, int value, boolean recorded, String what) {
            if (recorded && value < 0) {
                throw new ObservationException(name, what + ": " + name + " must be >= 0, was " + value);
            }
            if (!recorded && value != ABSENT) {
                throw new ObservationException(name, what + ": " + name + " given as " + value
                        + ", but the builder does not record " + name + " (pass ABSENT)");
            }
        }

        /** @return number of days added so far */
        public int size() {
            return cases.size();
        }

        /**
         * @return the counts
         * @throws ObservationException (field {@code "day"}) if no day was added
         */
        public DailyCounts build() {
            if (cases.size() == 0) {
                throw new ObservationException("day", "no days (at least one day is required)");
            }
            return new DailyCounts(firstDay, cases.toArray(),
                    withDeaths ? deaths.toArray() : null,
                    withRecoveries ? recoveries.toArray() : null,
                    withImported ? imported.toArray() : null);
        }
    }
}
