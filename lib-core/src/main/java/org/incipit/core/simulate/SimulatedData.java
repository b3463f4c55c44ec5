package org.incipit.core.simulate;

import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.observe.DailyCounts;
import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;

/**
 * Turns simulated outbreaks into the observation types that the estimators take, so that a
 * simulated data set and a file read from disk are indistinguishable downstream. Each method
 * keeps only what an analyst could see at the observation end; the ground truth stays on the
 * simulated objects.
 */
public final class SimulatedData {

    private SimulatedData() {
    }

    /**
     * The recorded candidate exposures as ambiguous-start cases: end = onset, starts = the
     * recorded candidate times. Cases are named {@code prefix + index}. Contact categories are
     * named {@code "category" + code} when the model has more than one; the total exposure
     * count is carried when the regime knows it.
     *
     * <p>Records taken from a {@link SimulatedOutbreak} cover every infected person, also those
     * whose onset falls after the observation end; keeping only onsets before a cut-off would
     * right-truncate the intervals (recent infections with long intervals are not yet cases),
     * which the ambiguous-start likelihood does not correct.
     *
     * @param records recorded exposures
     * @param prefix  prefix of the case ids, not null
     * @return the cases, in the order of the records
     */
    public static AmbiguousStartCases ambiguousStarts(ExposureRecords records, String prefix) {
        boolean categories = records.model().categories() > 1;
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder();
        for (int i = 0; i < records.size(); i++) {
            String id = prefix + i;
            int total = records.totalExposures(i);
            int m = records.candidateCount(i);
            for (int j = 0; j < m; j++) {
                String category = categories ? "category" + records.candidateCategory(i, j) : null;
                b.addCandidate(id, records.onset(i), records.candidateTime(i, j), category,
                        total < 0 ? AmbiguousStartCases.UNKNOWN_TOTAL : total);
            }
        }
        return b.build();
    }

    /**
     * Exposure windows for incubation-period estimation: each case's window runs from its first
     * to its last recorded candidate exposure, with its onset.
     *
     * <p>Caution: under the {@code OPEN} regime exposures keep coming until onset, so the window's
     * end is tied to the onset and a longer incubation period collects more exposures; windows
     * made this way are not independent of the incubation period and bias the window estimators
     * (a mean of about 3.4 days was found for a true 5.5). Use records whose exposure history is
     * fixed before infection (the {@code COMPLETE} regime) for window studies.
     *
     * @param records recorded exposures
     * @param prefix  prefix of the case ids
     * @return the windows
     */
    public static ExposureWindows exposureWindows(ExposureRecords records, String prefix) {
        ExposureWindows.Builder b = ExposureWindows.builder();
        for (int i = 0; i < records.size(); i++) {
            int m = records.candidateCount(i);
            b.add(prefix + i, records.candidateTime(i, 0), records.candidateTime(i, m - 1),
                    records.onset(i));
        }
        return b.build();
    }

    /**
     * Daily counts by symptom-onset day (cases), and deaths and recoveries by outcome day when
     * the outbreak has outcomes, over days 0 .. {@code outbreak.days() - 1}, counting only
     * events at or before the observation end.
     *
     * @param outbreak simulated outbreak
     * @return the daily counts
     */
    public static DailyCounts dailyCounts(SimulatedOutbreak outbreak) {
        int[] onsets = outbreak.dailyOnsets();
        DailyCounts.Builder b = DailyCounts.builder();
        if (!outbreak.hasOutcomes()) {
            for (int d = 0; d < onsets.length; d++) {
                b.add(d, onsets[d]);
            }
            return b.build();
        }
        int[] deaths = outbreak.dailyDeaths();
        int[] recoveries = outbreak.dailyRecoveries();
        b.withDeaths().withRecoveries();
        for (int d = 0; d < onsets.length; d++) {
            b.add(d, onsets[d], deaths[d], recoveries[d], DailyCounts.ABSENT);
        }
        return b.build();
    }

    /**
     * Onset-to-death pairs as seen at the observation end T: every death at or before T with
     * its onset, right-truncated at T (the cut-off of the pairs). With {@code daily} both times
     * are reduced to their day numbers (floor) and flagged as known only to the day; the cut-off
     * is then the last complete day, ceil(T) &minus; 1, and only deaths on or before it are kept,
     * so that "secondary day &le; cut-off" is exactly the truncation that the data underwent.
     *
     * @param outbreak simulated outbreak with outcomes and a finite observation end
     * @param daily    whether to report day numbers only
     * @return the pairs, named by the person's row id
     * @throws IllegalArgumentException if the outbreak has no outcomes or no finite end
     */
    public static DelayPairs onsetToDeath(SimulatedOutbreak outbreak, boolean daily) {
        if (!outbreak.hasOutcomes()) {
            throw new IllegalArgumentException("outbreak was simulated without outcomes");
        }
        double end = outbreak.observationEnd();
        if (!(end < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("outbreak has no finite observation end, was " + end);
        }
        double cutoff = daily ? Math.ceil(end) - 1 : end;
        double last = daily ? cutoff + 1 : end; // daily: deaths before the end of the cut-off day
        DelayPairs.Builder b = DelayPairs.builder(cutoff);
        for (int i = 0; i < outbreak.size(); i++) {
            double death = outbreak.outcomeTime(i);
            if (outbreak.outcome(i) != SimulatedOutbreak.DEATH
                    || !(daily ? death < last : death <= last)) {
                continue;
            }
            double onset = outbreak.onsetTime(i);
            if (daily) {
                b.addObserved("p" + i, Math.floor(onset), Math.floor(death), true);
            } else {
                b.addObserved("p" + i, onset, death);
            }
        }
        return b.build();
    }
}
