package org.incipit.core.simulate;

import org.apache.commons.rng.UniformRandomProvider;
import org.incipit.distributions.DailyMasses;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.Discretisation;

/**
 * Test-scope uniform delay on [a, b], for the one check that needs an incubation period bounded
 * away from 0 (a complete exposure history wholly before onset); the parametric families all
 * start at 0. Only what that test uses is implemented: tilt and discretise throw.
 */
final class TestDelays {

    private TestDelays() {
    }

    /** Uniform on [a, b]: mean (a+b)/2, variance (b-a)^2/12. */
    static DelayDistribution uniform(double a, double b) {
        return new Closed("uniform", 0.5 * (a + b), (b - a) * (b - a) / 12) {
            @Override
            public double cdf(double x) {
                return x <= a ? 0 : x >= b ? 1 : (x - a) / (b - a);
            }

            @Override
            public double density(double x) {
                return x < a || x > b ? 0 : 1 / (b - a);
            }

            @Override
            public double quantile(double p) {
                return a + p * (b - a);
            }

            @Override
            public double laplaceTransform(double s) {
                return s == 0 ? 1 : (Math.exp(-s * a) - Math.exp(-s * b)) / (s * (b - a));
            }

            @Override
            public double laplaceAbscissa() {
                return Double.NEGATIVE_INFINITY;
            }
        };
    }

    private abstract static class Closed implements DelayDistribution {
        private final String name;
        private final double mean;
        private final double variance;

        Closed(String name, double mean, double variance) {
            this.name = name;
            this.mean = mean;
            this.variance = variance;
        }

        @Override
        public String familyName() {
            return name;
        }

        @Override
        public double logDensity(double x) {
            return Math.log(density(x));
        }

        @Override
        public double survival(double x) {
            return 1 - cdf(x);
        }

        @Override
        public double logCdf(double x) {
            return Math.log(cdf(x));
        }

        @Override
        public double logSurvival(double x) {
            return Math.log(survival(x));
        }

        @Override
        public double mean() {
            return mean;
        }

        @Override
        public double variance() {
            return variance;
        }

        @Override
        public DelayDistribution tilt(double r) {
            throw new UnsupportedOperationException("not needed in simulator tests");
        }

        @Override
        public DailyMasses discretise(int maxDay, Discretisation scheme) {
            throw new UnsupportedOperationException("not needed in simulator tests");
        }

        @Override
        public double sample(UniformRandomProvider rng) {
            return quantile(rng.nextDouble());
        }
    }
}
