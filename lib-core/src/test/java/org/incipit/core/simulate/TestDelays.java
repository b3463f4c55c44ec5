package org.incipit.core.simulate;

import org.apache.commons.rng.UniformRandomProvider;
import org.incipit.distributions.DailyMasses;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.Discretisation;

/**
 * Test-scope delay distributions with closed forms (exponential; uniform on [a, b]), used so
 * that simulator tests do not depend on the parametric families. Only what the simulator and
 * its tests use is implemented: tilt and discretise are not needed and throw.
 */
final class TestDelays {

    private TestDelays() {
    }

    /** Exp(rate): mean 1/rate, variance 1/rate^2; sampled by inversion. */
    static DelayDistribution exponential(double rate) {
        return new Closed("exponential", 1 / rate, 1 / (rate * rate)) {
            @Override
            public double cdf(double x) {
                return x <= 0 ? 0 : -Math.expm1(-rate * x);
            }

            @Override
            public double density(double x) {
                return x < 0 ? 0 : rate * Math.exp(-rate * x);
            }

            @Override
            public double quantile(double p) {
                return -Math.log1p(-p) / rate;
            }

            @Override
            public double laplaceTransform(double s) {
                return s > -rate ? rate / (rate + s) : Double.POSITIVE_INFINITY;
            }

            @Override
            public double laplaceAbscissa() {
                return -rate;
            }
        };
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
