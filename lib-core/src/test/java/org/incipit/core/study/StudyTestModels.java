package org.incipit.core.study;

import java.util.List;
import java.util.Map;

import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;

/** Test-only estimators and scenarios. */
final class StudyTestModels {

    static final long SEED = 20261201L;

    private StudyTestModels() {
    }

    static Scenario normal(double mean, double sd) {
        return new Scenario("normal-test", Map.of("mean", mean, "sd", sd, "variance", sd * sd), Map.of(),
                Map.of("family", "normal"));
    }

    static DataGenerator<double[]> normalGenerator(Scenario s) {
        return CalibrationModels.sample(s);
    }

    /**
     * Fails in known ways depending on the data: x[0] &gt; mean + sd throws; x[0] &lt; mean - sd
     * leaves out "sd"; otherwise x[1] &gt; mean + 1.5 sd returns an undeclared target; otherwise
     * estimates both (mean by the t interval, sd by a crude +-50% interval).
     */
    static StudyEstimator<double[]> flaky(double mean, double sd, double level) {
        StudyEstimator<double[]> t = CalibrationModels.meanT(level);
        return StudyEstimator.of("flaky", List.of("mean", "sd"), (rng, x) -> {
            if (x[0] > mean + sd) {
                throw new EstimationException("first value too large");
            }
            Estimate m = t.estimate(rng, x).get("mean");
            if (x[0] < mean - sd) {
                return Map.of("mean", m);
            }
            if (x[1] > mean + 1.5 * sd) {
                return Map.of("mean", m, "extra", m);
            }
            double s = sd(x);
            return Map.of("mean", m, "sd", new Estimate(s, 0.5 * s, 1.5 * s, level, "crude"));
        });
    }

    static double sd(double[] x) {
        double m = 0;
        for (double v : x) {
            m += v;
        }
        m /= x.length;
        double ss = 0;
        for (double v : x) {
            ss += (v - m) * (v - m);
        }
        return Math.sqrt(ss / (x.length - 1));
    }
}
