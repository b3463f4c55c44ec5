package org.incipit.core.study;

import java.util.List;
import java.util.Map;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.ZigguratSampler;
import org.apache.commons.statistics.distribution.ChiSquaredDistribution;
import org.apache.commons.statistics.distribution.NormalDistribution;
import org.apache.commons.statistics.distribution.TDistribution;
import org.incipit.core.inference.Estimate;

/**
 * Models with exactly known behaviour, to check the study machinery (and a machine) end to end:
 * independent normal or exponential samples, and estimators whose intervals have exact coverage.
 * The formulas are textbook (Casella &amp; Berger 2002, <i>Statistical Inference</i>, 2nd ed.,
 * sections 9.2.1 and 9.2.2; pivots t, &chi;&sup2;<sub>n&minus;1</sub> and
 * 2&lambda;&Sigma;x ~ &chi;&sup2;<sub>2n</sub>).
 */
final class CalibrationModels {

    private CalibrationModels() {
    }

    static void register(StudyRegistry.Builder b) {
        b.generator("sample", double[].class, CalibrationModels::sample);
        b.estimator("normal-mean-t", double[].class, (s, level) -> meanT(level));
        b.estimator("normal-mean-z", double[].class, (s, level) -> meanZ(s.truth("sd"), level));
        b.estimator("normal-variance-mle", double[].class, (s, level) -> {
            if (s.hasTruth("sd") && s.hasTruth("variance")) {
                double sd = s.truth("sd");
                double v = s.truth("variance");
                if (Math.abs(v - sd * sd) > 1e-12 * sd * sd) {
                    throw new IllegalArgumentException("truth 'variance' (" + v + ") must equal sd^2 (" + sd * sd + ")");
                }
            }
            return varianceMle(level);
        });
        b.estimator("exponential-rate-mle", double[].class, (s, level) -> rateMle(level));
    }

    /** Generator "sample": n independent values of the scenario's family. */
    static DataGenerator<double[]> sample(Scenario s) {
        String family = s.option("family", "");
        switch (family) {
            case "normal" -> {
                double mean = s.truth("mean");
                double sd = s.truth("sd");
                if (!(sd > 0)) {
                    throw new IllegalArgumentException("truth 'sd' must be > 0, was " + sd);
                }
                return (rng, sc, n) -> {
                    ZigguratSampler.NormalizedGaussian z = ZigguratSampler.NormalizedGaussian.of(rng);
                    double[] x = new double[n];
                    for (int i = 0; i < n; i++) {
                        x[i] = mean + sd * z.sample();
                    }
                    return x;
                };
            }
            case "exponential" -> {
                double rate = s.truth("rate");
                if (!(rate > 0)) {
                    throw new IllegalArgumentException("truth 'rate' must be > 0, was " + rate);
                }
                if (s.hasTruth("mean") && Math.abs(s.truth("mean") * rate - 1) > 1e-12) {
                    throw new IllegalArgumentException("truth 'mean' (" + s.truth("mean") + ") must equal 1/rate ("
                            + 1 / rate + ")");
                }
                return (rng, sc, n) -> {
                    ZigguratSampler.Exponential e = ZigguratSampler.Exponential.of(rng);
                    double[] x = new double[n];
                    for (int i = 0; i < n; i++) {
                        x[i] = e.sample() / rate;
                    }
                    return x;
                };
            }
            default -> throw new IllegalArgumentException("generator 'sample' needs family = normal or exponential, was '"
                    + family + "'");
        }
    }

    /** x&#772; &plusmn; t<sub>n&minus;1,(1+L)/2</sub> s/&radic;n; needs n &ge; 2. */
    static StudyEstimator<double[]> meanT(double level) {
        return StudyEstimator.of("normal-mean-t", List.of("mean"), (UniformRandomProvider rng, double[] x) -> {
            int n = need(x, 2);
            double m = mean(x);
            double s = Math.sqrt(ss(x, m) / (n - 1));
            double h = TDistribution.of(n - 1).inverseSurvivalProbability(0.5 * (1 - level)) * s / Math.sqrt(n);
            return Map.of("mean", new Estimate(m, m - h, m + h, level, "t"));
        });
    }

    /** x&#772; &plusmn; z<sub>(1+L)/2</sub> &sigma;/&radic;n with &sigma; known. */
    static StudyEstimator<double[]> meanZ(double sigma, double level) {
        double z = NormalDistribution.of(0, 1).inverseSurvivalProbability(0.5 * (1 - level));
        return StudyEstimator.of("normal-mean-z", List.of("mean"), (UniformRandomProvider rng, double[] x) -> {
            int n = need(x, 1);
            double m = mean(x);
            double h = z * sigma / Math.sqrt(n);
            return Map.of("mean", new Estimate(m, m - h, m + h, level, "z"));
        });
    }

    /** SS/n with [SS/&chi;&sup2;<sub>n&minus;1,(1+L)/2</sub>, SS/&chi;&sup2;<sub>n&minus;1,(1&minus;L)/2</sub>]. */
    static StudyEstimator<double[]> varianceMle(double level) {
        return StudyEstimator.of("normal-variance-mle", List.of("variance"), (UniformRandomProvider rng, double[] x) -> {
            int n = need(x, 2);
            double ss = ss(x, mean(x));
            ChiSquaredDistribution c = ChiSquaredDistribution.of(n - 1);
            double a = 0.5 * (1 - level);
            return Map.of("variance", new Estimate(ss / n, ss / c.inverseSurvivalProbability(a),
                    ss / c.inverseCumulativeProbability(a), level, "chi-square"));
        });
    }

    /** n/&Sigma;x with [&chi;&sup2;<sub>2n,(1&minus;L)/2</sub>, &chi;&sup2;<sub>2n,(1+L)/2</sub>] / (2&Sigma;x). */
    static StudyEstimator<double[]> rateMle(double level) {
        return StudyEstimator.of("exponential-rate-mle", List.of("rate"), (UniformRandomProvider rng, double[] x) -> {
            int n = need(x, 1);
            double sum = 0;
            for (double v : x) {
                sum += v;
            }
            ChiSquaredDistribution c = ChiSquaredDistribution.of(2.0 * n);
            double a = 0.5 * (1 - level);
            return Map.of("rate", new Estimate(n / sum, c.inverseCumulativeProbability(a) / (2 * sum),
                    c.inverseSurvivalProbability(a) / (2 * sum), level, "chi-square"));
        });
    }

    private static int need(double[] x, int min) {
        if (x.length < min) {
            throw new IllegalArgumentException("need at least " + min + " values, had " + x.length);
        }
        return x.length;
    }

    private static double mean(double[] x) {
        double s = 0;
        for (double v : x) {
            s += v;
        }
        return s / x.length;
    }

    private static double ss(double[] x, double m) {
        double s = 0;
        for (double v : x) {
            s += (v - m) * (v - m);
        }
        return s;
    }
}
