package org.incipit.core.study;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;

import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * Long run (-Pvalidation): exact coverage of the calibration intervals at small n with
 * R = 20000 replicates. Accept covered in [18897, 19100]: for X ~ Binomial(20000, 0.95),
 * P(X &lt; 18897) = 0.00047 and P(X &gt; 19100) = 0.00047 (scipy 1.17 stats.binom), about 0.09%
 * false alarms per check; a coverage error of 0.5 percentage point (100 intervals) would be
 * detected.
 */
@Tag("validation")
class StudyValidationTest {

    @Test
    void exactCoverageAtSmallSampleSizes() {
        int reps = 20000;
        Scenario normal = StudyTestModels.normal(1, 3);
        StudyResult a = Study.builder(normal, StudyTestModels.normalGenerator(normal))
                .estimator(CalibrationModels.meanT(0.95)).estimator(CalibrationModels.varianceMle(0.95))
                .estimator(CalibrationModels.meanZ(3, 0.95))
                .sampleSizes(2, 3, 6).replicates(reps).seed(StudyTestModels.SEED + 10).build().run();
        Scenario exp = new Scenario("exp", Map.of("rate", 3.0), Map.of(), Map.of("family", "exponential"));
        StudyResult b = Study.builder(exp, CalibrationModels.sample(exp)).estimator(CalibrationModels.rateMle(0.95))
                .sampleSizes(1, 2, 6).replicates(reps).seed(StudyTestModels.SEED + 11).build().run();
        for (StudyResult r : new StudyResult[] {a, b}) {
            for (StudySummary s : r.summaries()) {
                assertEquals(reps, s.successes());
                assertTrue(s.covered() >= 18897 && s.covered() <= 19100,
                        () -> s.estimator() + " n=" + s.sampleSize() + ": covered " + s.covered());
            }
        }
    }
}
