package org.incipit.core.estimate.ambiguous;

import java.util.Arrays;

/**
 * Ambiguous-start data prepared once for the likelihood kernels: flat primitive arrays, per
 * candidate the log-duration, the duration and the category (the rank within its case is the
 * position from the case's offset: starts are sorted and unusable ones come last); per case an
 * offset. Immutable (arrays never leave the package). 20 bytes per candidate (two doubles and
 * an int) and about 16 per case.
 *
 * <p><b>Ties and starts at or after the end.</b> A candidate with d = t &minus; e &le; 0 cannot
 * have started the interval (H is continuous on (0, &infin;), so X = 0 has probability 0): its
 * term h(d) is taken as 0 whatever the family's density does at 0 (which may be 0, finite or
 * &infin;). It is kept out of the likelihood sum but still counted as a recorded exposure (in
 * the complete-history normaliser). Since starts are sorted, such candidates are the last of
 * their case. A case none of whose candidates precedes the end has likelihood 0 for every
 * parameter and is rejected.
 *
 * <p><b>Case order.</b> Cases are stored sorted (stably) by their number of usable candidates
 * m, so that the kernels run through blocks of equal m: the length of the per-case loop is
 * then the same case after case (predictable branches, see {@link #blockStart}). Everything
 * computed from a Prepared is a sum over cases, so the order only changes rounding; case ids
 * travel with their cases, so messages name the right case.
 */
final class Prepared {

    /** Number of cases. */
    final int n;
    /** Number of transmission categories K &ge; 1, or 0 for a plain fit (no p; one candidate per case). */
    final int categories;
    /** Case i's usable candidates are [offset[i], offset[i+1]). */
    final int[] offset;
    /** log d per usable candidate. */
    final double[] logD;
    /** d per usable candidate. */
    final double[] dur;
    /** Category code in [0, K) per usable candidate; all 0 if K &le; 1. */
    final int[] cat;
    /** Recorded exposures per case and category (including those with d &le; 0), flat n &times; max(K,1). */
    final int[] recorded;
    /** Usable candidates from which the arrays are filled by two threads (each element as by one). */
    static final int PARALLEL_FILL = 20_000;
    /** Marker of an unknown total in {@link #total}. */
    static final int UNKNOWN = -1;
    /** Total exposure count M per case ({@link #UNKNOWN} if not known), or null. */
    final int[] total;
    /** Largest number of usable candidates in one case. */
    final int maxM;
    /** Case ids (for messages) in the caller's order, may be null. */
    final String[] ids;
    /** Caller's index of each stored case, or null (stored order is the caller's). */
    final int[] original;
    /** Cases with m usable candidates are [blockStart[m], blockStart[m + 1]), m = 1..maxM. */
    final int[] blockStart;

    private Prepared(int n, int categories, int[] offset, double[] logD, double[] dur, int[] cat,
                     int[] recorded, int[] total, String[] ids, int[] original) {
        this.n = n;
        this.categories = categories;
        this.offset = offset;
        this.logD = logD;
        this.dur = dur;
        this.cat = cat;
        this.recorded = recorded;
        this.total = total;
        this.ids = ids;
        this.original = original;
        int mm = 0;
        for (int i = 0; i < n; i++) {
            int m = offset[i + 1] - offset[i];
            if (m < mm) {
                throw new IllegalStateException("cases must be sorted by candidate count");
            }
            mm = m;
        }
        this.maxM = mm;
        int[] bs = new int[mm + 2];
        int i = 0;
        for (int m = 1; m <= mm + 1; m++) {
            while (i < n && offset[i + 1] - offset[i] < m) {
                i++;
            }
            bs[m] = i;
        }
        this.blockStart = bs;
    }

    /**
     * A stable counting sort of case indices by their number of usable candidates.
     *
     * @param cases  case indices (into the arrays below), possibly repeated
     * @param usable usable candidates per case index
     * @return the indices reordered
     */
    private static int[] sortByCount(int[] cases, int[] usable) {
        int max = 0;
        for (int c : cases) {
            max = Math.max(max, usable[c]);
        }
        int[] start = new int[max + 2];
        for (int c : cases) {
            start[usable[c] + 1]++;
        }
        for (int m = 1; m <= max + 1; m++) {
            start[m] += start[m - 1];
        }
        int[] out = new int[cases.length];
        for (int c : cases) {
            out[start[usable[c]]++] = c;
        }
        return out;
    }

    /**
     * @param ends        end time per case
     * @param caseOffsets n + 1 offsets into {@code starts}
     * @param starts      candidate starts, sorted within each case
     * @param categories  category per candidate in [0, k), or null (one category)
     * @param k           number of categories, &ge; 1
     * @param totals      total exposures per case (&ge; recorded count), or null
     * @param ids         case ids or null
     */
    static Prepared of(double[] ends, int[] caseOffsets, double[] starts, int[] categories, int k, int[] totals,
                       String[] ids) {
        int n = ends.length;
        if (n < 1) {
            throw new IllegalArgumentException("cases must number >= 1, was " + n);
        }
        if (caseOffsets.length != n + 1 || caseOffsets[0] != 0 || caseOffsets[n] != starts.length) {
            throw new IllegalArgumentException("caseOffsets must have length n + 1 = " + (n + 1)
                    + ", start at 0 and end at the number of starts " + starts.length);
        }
        if (k < 1) {
            throw new IllegalArgumentException("number of categories must be >= 1, was " + k);
        }
        if (categories != null && categories.length != starts.length) {
            throw new IllegalArgumentException("categories must have one entry per start (" + starts.length
                    + "), had " + categories.length);
        }
        if (totals != null && totals.length != n) {
            throw new IllegalArgumentException("totals must have one entry per case (" + n + "), had " + totals.length);
        }
        int[] use = new int[n];
        int usable = 0;
        for (int i = 0; i < n; i++) {
            int a = caseOffsets[i];
            int b = caseOffsets[i + 1];
            if (b <= a) {
                throw new IllegalArgumentException("case " + name(ids, i) + " must have >= 1 candidate start");
            }
            int u = 0;
            for (int j = a; j < b; j++) {
                if (!Double.isFinite(starts[j])) {
                    throw new IllegalArgumentException("start of case " + name(ids, i) + " must be finite, was "
                            + starts[j]);
                }
                if (j > a && starts[j] < starts[j - 1]) {
                    throw new IllegalArgumentException("starts of case " + name(ids, i)
                            + " must be sorted ascending, found " + starts[j - 1] + " before " + starts[j]);
                }
                if (categories != null && (categories[j] < 0 || categories[j] >= k)) {
                    throw new IllegalArgumentException("category of a start of case " + name(ids, i)
                            + " must be in [0, " + k + "), was " + categories[j]);
                }
                if (ends[i] - starts[j] > 0) {
                    u++;
                }
            }
            if (!Double.isFinite(ends[i])) {
                throw new IllegalArgumentException("end of case " + name(ids, i) + " must be finite, was " + ends[i]);
            }
            if (u == 0) {
                throw new IllegalArgumentException("case " + name(ids, i) + " (end " + ends[i]
                        + ") has no candidate start before its end; its likelihood would be 0");
            }
            if (totals != null && totals[i] != UNKNOWN && totals[i] < b - a) {
                throw new IllegalArgumentException("total exposures of case " + name(ids, i) + " must be >= its "
                        + (b - a) + " recorded starts, was " + totals[i]);
            }
            use[i] = u;
            usable += u;
        }
        int[] identity = new int[n];
        for (int i = 0; i < n; i++) {
            identity[i] = i;
        }
        int[] order = sortByCount(identity, use);
        int[] off = new int[n + 1];
        for (int r = 0; r < n; r++) {
            off[r + 1] = off[r] + use[order[r]];
        }
        double[] logD = new double[usable];
        double[] dur = new double[usable];
        int[] cat = new int[usable];
        int[] recorded = new int[n * k];
        int[] tot = totals == null ? null : new int[n];
        Runnable[] fill = new Runnable[2];
        int half = usable >= PARALLEL_FILL ? n / 2 : n;
        for (int part = 0; part < 2; part++) {
            int lo = part == 0 ? 0 : half;
            int hi = part == 0 ? half : n;
            fill[part] = () -> {
                for (int r = lo; r < hi; r++) {
                    int i = order[r];
                    int a = caseOffsets[i];
                    int w = off[r];
                    if (tot != null) {
                        tot[r] = totals[i];
                    }
                    for (int j = a; j < caseOffsets[i + 1]; j++) {
                        int c = categories == null ? 0 : categories[j];
                        recorded[r * k + c]++;
                        double d = ends[i] - starts[j];
                        if (d > 0) {
                            dur[w] = d;
                            logD[w] = Math.log(d);
                            cat[w] = c;
                            w++;
                        }
                    }
                }
            };
        }
        if (half < n) {
            java.util.concurrent.CompletableFuture<Void> second = java.util.concurrent.CompletableFuture.runAsync(fill[1],
                    java.util.concurrent.ForkJoinPool.commonPool());
            fill[0].run();
            second.join();
        } else {
            fill[0].run();
        }
        return new Prepared(n, k, off, logD, dur, cat, recorded, tot, ids == null ? null : ids.clone(), order);
    }

    /**
     * Prepared arrays of each observation object, computed once: the cases are immutable, and
     * analysts fit the same cases several times (families, rules, bootstrap). Weak keys (identity:
     * AmbiguousStartCases does not override equals), so an entry lives as long as its cases do;
     * it holds no reference to them.
     */
    private static final java.util.Map<org.incipit.core.observe.AmbiguousStartCases, Prepared> CACHE =
            java.util.Collections.synchronizedMap(new java.util.WeakHashMap<>());

    /**
     * Adapter from the observation type: prepared once per cases object and then reused (two
     * threads asking at once may both prepare; either result is the same).
     */
    static Prepared from(org.incipit.core.observe.AmbiguousStartCases c) {
        Prepared p = CACHE.get(c);
        if (p == null) {
            p = prepare(c);
            CACHE.put(c, p);
        }
        return p;
    }

    private static Prepared prepare(org.incipit.core.observe.AmbiguousStartCases c) {
        int n = c.caseCount();
        int k = Math.max(1, c.categoryNames().size());
        int[] totals = null;
        if (c.hasTotalExposures()) {
            totals = new int[n];
            for (int i = 0; i < n; i++) {
                totals[i] = c.totalExposures(i);
            }
        }
        String[] ids = c.ids().toArray(new String[0]);
        return of(c.ends(), c.offsets(), c.starts(), c.hasCategories() ? c.categoryCodes() : null, k, totals, ids);
    }

    /** One duration per case, no p: for plain fits (naive rules). */
    static Prepared plain(double[] durations) {
        int n = durations.length;
        if (n < 1) {
            throw new IllegalArgumentException("durations must number >= 1, was " + n);
        }
        int[] off = new int[n + 1];
        double[] logD = new double[n];
        for (int i = 0; i < n; i++) {
            if (!(durations[i] > 0 && durations[i] < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("duration " + i + " must be finite and > 0, was " + durations[i]);
            }
            off[i + 1] = i + 1;
            logD[i] = Math.log(durations[i]);
        }
        return new Prepared(n, 0, off, logD, durations.clone(), new int[n], new int[n], null, null, null);
    }

    /** The cases cases[0], cases[1], ... (with repetition, stored in candidate-count order), e.g. a bootstrap resample. */
    Prepared subset(int[] cases) {
        int[] usable = new int[n];
        for (int i = 0; i < n; i++) {
            usable[i] = offset[i + 1] - offset[i];
        }
        int[] idx = sortByCount(cases, usable);
        int kk = Math.max(categories, 1);
        int[] off = new int[idx.length + 1];
        for (int r = 0; r < idx.length; r++) {
            int i = idx[r];
            off[r + 1] = off[r] + offset[i + 1] - offset[i];
        }
        int m = off[idx.length];
        double[] l = new double[m];
        double[] d = new double[m];
        int[] c = new int[m];
        int[] rec = new int[idx.length * kk];
        int[] tot = total == null ? null : new int[idx.length];
        for (int r = 0; r < idx.length; r++) {
            int i = idx[r];
            int len = offset[i + 1] - offset[i];
            System.arraycopy(logD, offset[i], l, off[r], len);
            System.arraycopy(dur, offset[i], d, off[r], len);
            System.arraycopy(cat, offset[i], c, off[r], len);
            System.arraycopy(recorded, i * kk, rec, r * kk, kk);
            if (tot != null) {
                tot[r] = total[i];
            }
        }
        return new Prepared(idx.length, categories, off, l, d, c, rec, tot, null, null);
    }

    /** Number of usable candidates. */
    int candidates() {
        return offset[n];
    }

    /** Recorded exposures of case i (all categories, including d &le; 0). */
    int recordedCount(int i) {
        int kk = Math.max(categories, 1);
        int s = 0;
        for (int c = 0; c < kk; c++) {
            s += recorded[i * kk + c];
        }
        return s;
    }

    /** Duration of the earliest candidate of every case (new array). */
    double[] earliest() {
        double[] out = new double[n];
        for (int i = 0; i < n; i++) {
            out[i] = dur[offset[i]];
        }
        return out;
    }

    /** Duration of the latest usable candidate of every case (new array). */
    double[] latest() {
        double[] out = new double[n];
        for (int i = 0; i < n; i++) {
            out[i] = dur[offset[i + 1] - 1];
        }
        return out;
    }

    /** Name of stored case i for messages (its id, or its position in the caller's data). */
    String caseName(int i) {
        return name(ids, original == null ? i : original[i]);
    }

    private static String name(String[] ids, int i) {
        return ids == null ? "#" + i : "'" + ids[i] + "'";
    }

    @Override
    public String toString() {
        return "Prepared[n=" + n + ", candidates=" + candidates() + ", categories=" + categories + ", offsets="
                + Arrays.toString(Arrays.copyOf(offset, Math.min(5, offset.length))) + "...]";
    }
}
