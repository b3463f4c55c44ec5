package org.incipit.core.simulate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.branching.OffspringLaw;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.observe.DailyCounts;
import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;
import org.incipit.distributions.GammaDelay;
import org.incipit.distributions.LogNormalDelay;
import org.junit.jupiter.api.Test;

/** The conversions lose nothing that an analyst could see and add nothing that they could not. */
class SimulatedDataTest {

    private static SimulatedOutbreak outbreak(long seed) {
        OutbreakOptions opts = OutbreakOptions.builder(OffspringLaw.negativeBinomial(2.0, 0.5),
                        GammaDelay.ofShapeRate(4, 0.8), LogNormalDelay.ofMeanLogSdLog(1.6, 0.4))
                .outcomes(0.1, GammaDelay.ofShapeRate(3, 0.2), GammaDelay.ofShapeRate(5, 0.3))
                .maxOnsets(400).maxCases(100_000).conditionOnSurvival(100)
                .exposures(ExposureModel.open(0.3, 1.0).withCategories(new double[] {0.5, 0.5},
                        new double[] {0.5, 0.2}))
                .build();
        return OutbreakSimulator.simulate(RandomSource.XO_RO_SHI_RO_128_PP.create(seed), opts);
    }

    @Test
    void ambiguousStartsCarryEveryRecordedCandidate() {
        SimulatedOutbreak o = outbreak(11L);
        ExposureRecords r = o.exposures().orElseThrow();
        AmbiguousStartCases c = SimulatedData.ambiguousStarts(r, "s");
        assertEquals(r.size(), c.caseCount());
        assertEquals(r.candidateTotal(), c.candidateCount());
        assertTrue(c.hasCategories());
        for (int i = 0; i < r.size(); i++) {
            assertEquals("s" + i, c.id(i));
            assertEquals(r.onset(i), c.end(i));
            for (int j = 0; j < r.candidateCount(i); j++) {
                assertEquals(r.candidateTime(i, j), c.start(c.offset(i) + j));
                assertEquals("category" + r.candidateCategory(i, j),
                        c.categoryNames().get(c.categoryCode(c.offset(i) + j)));
            }
        }
    }

    @Test
    void windowsSpanFirstToLastCandidate() {
        ExposureRecords r = outbreak(12L).exposures().orElseThrow();
        ExposureWindows w = SimulatedData.exposureWindows(r, "w");
        assertEquals(r.size(), w.size());
        for (int i = 0; i < r.size(); i++) {
            assertEquals(r.candidateTime(i, 0), w.exposureFrom(i));
            assertEquals(r.candidateTime(i, r.candidateCount(i) - 1), w.exposureTo(i));
            assertEquals(r.onset(i), w.onset(i));
        }
    }

    @Test
    void dailyCountsMatchTheSimulatorsCounts() {
        SimulatedOutbreak o = outbreak(13L);
        DailyCounts d = SimulatedData.dailyCounts(o);
        assertEquals(0, d.firstDay());
        assertEquals(o.days(), d.size());
        assertEquals(java.util.Arrays.stream(o.dailyOnsets()).sum(), d.totalCases());
        assertEquals(java.util.Arrays.toString(o.dailyDeaths()), java.util.Arrays.toString(d.deaths()));
        assertEquals(java.util.Arrays.toString(o.dailyRecoveries()),
                java.util.Arrays.toString(d.recoveries()));
    }

    @Test
    void onsetToDeathKeepsExactlyTheDeathsSeenByTheEnd() {
        SimulatedOutbreak o = outbreak(14L);
        double end = o.observationEnd();
        int expected = 0;
        int expectedDaily = 0;
        for (int i = 0; i < o.size(); i++) {
            if (o.outcome(i) == SimulatedOutbreak.DEATH && o.outcomeTime(i) <= end) {
                expected++;
            }
            if (o.outcome(i) == SimulatedOutbreak.DEATH && o.outcomeTime(i) < Math.ceil(end)) {
                expectedDaily++;
            }
        }
        DelayPairs exact = SimulatedData.onsetToDeath(o, false);
        assertEquals(expected, exact.size());
        assertEquals(end, exact.cutoff().getAsDouble());
        for (int i = 0; i < exact.size(); i++) {
            assertTrue(exact.secondary(i) <= end);
            assertTrue(exact.secondary(i) >= exact.primary(i));
        }
        DelayPairs daily = SimulatedData.onsetToDeath(o, true);
        double cutoffDay = Math.ceil(end) - 1;
        assertEquals(cutoffDay, daily.cutoff().getAsDouble());
        assertEquals(expectedDaily, daily.size());
        for (int i = 0; i < daily.size(); i++) {
            assertTrue(daily.isDaily(i));
            assertEquals(Math.floor(daily.secondary(i)), daily.secondary(i));
            assertTrue(daily.secondary(i) <= cutoffDay);
        }
    }

    @Test
    void refusesWithoutOutcomes() {
        OutbreakOptions opts = OutbreakOptions.builder(OffspringLaw.poisson(2.0),
                GammaDelay.ofShapeRate(4, 0.8), GammaDelay.ofShapeRate(5, 1)).maxCases(50).build();
        SimulatedOutbreak o = OutbreakSimulator.simulate(RandomSource.XO_RO_SHI_RO_128_PP.create(1L), opts);
        assertThrows(IllegalArgumentException.class, () -> SimulatedData.onsetToDeath(o, false));
    }
}
