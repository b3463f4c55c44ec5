package org.incipit.core.growth;

import java.util.function.DoubleUnaryOperator;
import org.apache.commons.rng.UniformRandomProvider;
import org.incipit.distributions.DailyMasses;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.Discretisation;

/**
 * Test-local delay given by a density on [0, upper], whose Laplace transform is computed by
 * composite Simpson integration (common practice; 2 * 20000 panels), +Infinity below the stated
 * abscissa. Used to check Euler-Lotka against closed forms independently of any family code.
 */
final class NumericDelay implements DelayDistribution {

    private static final int PANELS = 40000;
    private final String name;
    private final DoubleUnaryOperator density;
    private final double upper;
    private final double abscissa;

    NumericDelay(String name, DoubleUnaryOperator density, double upper, double abscissa) {
        this.name = name;
        this.density = density;
        this.upper = upper;
        this.abscissa = abscissa;
    }

    static double simpson(DoubleUnaryOperator f, double a, double b, int panels) {
        double h = (b - a) / panels;
        double s = f.applyAsDouble(a) + f.applyAsDouble(b);
        for (int i = 1; i < panels; i++) {
            s += (i % 2 == 1 ? 4 : 2) * f.applyAsDouble(a + i * h);
        }
        return s * h / 3;
    }

    @Override
    public String familyName() {
        return name;
    }

    @Override
    public double density(double x) {
        return x < 0 || x > upper ? 0 : density.applyAsDouble(x);
    }

    @Override
    public double logDensity(double x) {
        return Math.log(density(x));
    }

    @Override
    public double laplaceTransform(double s) {
        if (s < abscissa) {
            return Double.POSITIVE_INFINITY;
        }
        return simpson(x -> Math.exp(-s * x) * density.applyAsDouble(x), 0, upper, PANELS);
    }

    @Override
    public double laplaceAbscissa() {
        return abscissa;
    }

    @Override
    public double mean() {
        return simpson(x -> x * density.applyAsDouble(x), 0, upper, PANELS);
    }

    @Override
    public double variance() {
        double m = mean();
        return simpson(x -> (x - m) * (x - m) * density.applyAsDouble(x), 0, upper, PANELS);
    }

    @Override
    public DelayDistribution tilt(double r) {
        double norm = laplaceTransform(r);
        return new NumericDelay(name + "-tilted", x -> Math.exp(-r * x) * density.applyAsDouble(x)
                / norm, upper, abscissa - r);
    }

    @Override
    public double cdf(double x) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }

    @Override
    public double survival(double x) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }

    @Override
    public double logCdf(double x) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }

    @Override
    public double logSurvival(double x) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }

    @Override
    public double quantile(double p) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }

    @Override
    public DailyMasses discretise(int maxDay, Discretisation scheme) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }

    @Override
    public double sample(UniformRandomProvider rng) {
        throw new UnsupportedOperationException("not needed by the growth tests");
    }
}
