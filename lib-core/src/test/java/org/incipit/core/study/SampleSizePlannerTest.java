package org.incipit.core.study;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.concurrent.ForkJoinPool;

import org.apache.commons.numbers.gamma.LogGamma;
import org.apache.commons.statistics.distribution.TDistribution;
import org.incipit.core.study.SampleSizePlanner.Plan;
import org.incipit.core.study.SampleSizePlanner.WidthStatistic;
import org.junit.jupiter.api.Test;

/** The planner against published width formulas of normal-mean intervals. */
class SampleSizePlannerTest {

    private static final double SIGMA = 2;
    private static final double Z = 1.959963984540054; // mpmath 1.3: sqrt(2)*erfinv(0.95)

    private static Study<double[]> study(int replicates) {
        Scenario sc = StudyTestModels.normal(10, SIGMA);
        return Study.builder(sc, StudyTestModels.normalGenerator(sc))
                .estimator(CalibrationModels.meanZ(SIGMA, 0.95))
                .estimator(CalibrationModels.meanT(0.95))
                .sampleSizes(1).replicates(replicates).seed(StudyTestModels.SEED).build();
    }

    /**
     * z interval with known sigma: width 2 z sigma / sqrt(n) (e.g. Casella &amp; Berger 2002,
     * 9.2.1), so width &lt;= w first at n = ceil((2 z sigma / w)^2). For w = 1: (4 z)^2 =
     * 61.46 -&gt; n = 62; for w = 0.5: 245.85 -&gt; n = 246.
     */
    @Test
    void zIntervalFindsTheFormulaSampleSize() {
        Study<double[]> s = study(20);
        for (double w : new double[] {1.0, 0.5}) {
            int expected = (int) Math.ceil(Math.pow(2 * Z * SIGMA / w, 2));
            Plan bis = SampleSizePlanner.bisect(s, "normal-mean-z", "mean", w, WidthStatistic.MEDIAN, 2, 1000,
                    ForkJoinPool.commonPool(), StudyListener.NONE);
            assertEquals(expected, bis.sampleSize().getAsInt(), "bisection, width " + w);
            for (SampleSizePlanner.WidthAtSize x : bis.widths()) {
                assertEquals(2 * Z * SIGMA / Math.sqrt(x.sampleSize()), x.width(), 1e-13 * x.width());
            }
            int[] grid = {expected - 2, expected - 1, expected, expected + 1, 2000};
            Plan g = SampleSizePlanner.grid(s, "normal-mean-z", "mean", w, WidthStatistic.MEAN, grid,
                    ForkJoinPool.commonPool(), StudyListener.NONE);
            assertEquals(expected, g.sampleSize().getAsInt(), "grid, width " + w);
            assertEquals(5, g.widths().size());
        }
        Plan none = SampleSizePlanner.grid(s, "normal-mean-z", "mean", 0.01, WidthStatistic.MEDIAN, new int[] {10, 20},
                ForkJoinPool.commonPool(), StudyListener.NONE);
        assertFalse(none.sampleSize().isPresent());
        assertEquals(2, none.widths().size());
    }

    /**
     * t interval: E[width] = 2 t_(n-1) c4(n) sigma / sqrt(n), c4(n) = E[s]/sigma =
     * sqrt(2/(n-1)) Gamma(n/2)/Gamma((n-1)/2) (e.g. Montgomery, Introduction to Statistical
     * Quality Control, appendix table of c4; formula from memory). The width is proportional to s, so the
     * mean width of R = 2000 replicates has relative MC SE sqrt(1 - c4^2)/c4/sqrt(R) (0.0072 at
     * n = 6, 0.0029 at n = 30); accept 3.29 SE (0.1% two-sided).
     */
    @Test
    void tIntervalMeanWidthMatchesFormula() {
        int reps = 2000;
        Study<double[]> s = study(reps);
        Plan p = SampleSizePlanner.grid(s, "normal-mean-t", "mean", 0.5, WidthStatistic.MEAN, new int[] {6, 30},
                ForkJoinPool.commonPool(), StudyListener.NONE);
        for (SampleSizePlanner.WidthAtSize x : p.widths()) {
            int n = x.sampleSize();
            double c4 = Math.sqrt(2.0 / (n - 1)) * Math.exp(LogGamma.value(n / 2.0) - LogGamma.value((n - 1) / 2.0));
            double t = TDistribution.of(n - 1).inverseSurvivalProbability(0.025);
            double expected = 2 * t * c4 * SIGMA / Math.sqrt(n);
            double relSe = Math.sqrt(1 - c4 * c4) / c4 / Math.sqrt(reps);
            assertEquals(expected, x.width(), 3.29 * relSe * expected, "n = " + n);
        }
    }

    @Test
    void rejectsBadArguments() {
        Study<double[]> s = study(5);
        ForkJoinPool pool = ForkJoinPool.commonPool();
        assertThrows(IllegalArgumentException.class, () -> SampleSizePlanner.bisect(s, "normal-mean-z", "mean", 1,
                WidthStatistic.MEDIAN, 10, 5, pool, StudyListener.NONE));
        assertThrows(IllegalArgumentException.class, () -> SampleSizePlanner.bisect(s, "normal-mean-z", "sd", 1,
                WidthStatistic.MEDIAN, 1, 5, pool, StudyListener.NONE));
        assertThrows(IllegalArgumentException.class, () -> SampleSizePlanner.bisect(s, "nope", "mean", 1,
                WidthStatistic.MEDIAN, 1, 5, pool, StudyListener.NONE));
        assertThrows(IllegalArgumentException.class, () -> SampleSizePlanner.grid(s, "normal-mean-z", "mean", 0,
                WidthStatistic.MEDIAN, new int[] {3}, pool, StudyListener.NONE));
    }
}
