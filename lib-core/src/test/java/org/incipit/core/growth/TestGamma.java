package org.incipit.core.growth;

import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;
import org.incipit.distributions.DailyMasses;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.Discretisation;
import org.incipit.distributions.ParametricDelay;

/**
 * Test-local gamma(shape, rate) until the library's families are merged: only what the
 * growth package uses. Laplace transform E[e^{-sX}] = (rate / (rate + s))^shape for s > -rate
 * (gamma moment generating function, common practice; e.g. Johnson, Kotz &amp; Balakrishnan
 * 1994, ch. 17).
 */
final class TestGamma implements ParametricDelay {

    static final DelayFamily FAMILY = new DelayFamily() {
        @Override
        public String name() {
            return "gamma";
        }

        @Override
        public List<String> parameterNames() {
            return List.of("shape", "rate");
        }

        @Override
        public List<Domain> parameterDomains() {
            return List.of(Domain.POSITIVE, Domain.POSITIVE);
        }

        @Override
        public ParametricDelay of(double... p) {
            return new TestGamma(p[0], p[1]);
        }

        @Override
        public ParametricDelay ofMeanSd(double mean, double sd) {
            double shape = mean * mean / (sd * sd);
            return new TestGamma(shape, shape / mean);
        }
    };

    final double shape;
    final double rate;

    TestGamma(double shape, double rate) {
        if (!(shape > 0 && rate > 0)) {
            throw new IllegalArgumentException("shape, rate must be > 0, were " + shape + ", "
                    + rate);
        }
        this.shape = shape;
        this.rate = rate;
    }

    @Override
    public String familyName() {
        return "gamma";
    }

    @Override
    public DelayFamily family() {
        return FAMILY;
    }

    @Override
    public double[] parameters() {
        return new double[] {shape, rate};
    }

    @Override
    public double laplaceTransform(double s) {
        return s > -rate ? Math.pow(rate / (rate + s), shape) : Double.POSITIVE_INFINITY;
    }

    @Override
    public double laplaceAbscissa() {
        return -rate;
    }

    @Override
    public DelayDistribution tilt(double r) {
        return new TestGamma(shape, rate + r);
    }

    @Override
    public double mean() {
        return shape / rate;
    }

    @Override
    public double variance() {
        return shape / (rate * rate);
    }

    @Override
    public double density(double x) {
        return Math.exp(logDensity(x));
    }

    @Override
    public double logDensity(double x) {
        return x <= 0 ? Double.NEGATIVE_INFINITY : shape * Math.log(rate) + (shape - 1) * Math.log(x)
                - rate * x - org.apache.commons.numbers.gamma.LogGamma.value(shape);
    }

    @Override
    public double cdf(double x) {
        return x <= 0 ? 0 : org.apache.commons.numbers.gamma.RegularizedGamma.P.value(shape, rate * x);
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
    public double quantile(double p) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }

    @Override
    public DailyMasses discretise(int maxDay, Discretisation scheme) {
        double[] m = new double[maxDay + 1];
        for (int d = 0; d <= maxDay; d++) {
            m[d] = cdf(d + 1) - cdf(d);
        }
        return new DailyMasses(m, Math.max(0, survival(maxDay + 1)));
    }

    @Override
    public double sample(UniformRandomProvider rng) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }

    @Override
    public double[] logDensityGradient(double x) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }

    @Override
    public double[] logCdfGradient(double x) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }

    @Override
    public double[] logSurvivalGradient(double x) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }
}
