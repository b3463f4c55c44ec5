package org.incipit.distributions;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * An exponentially tilted delay: density exp(-r x) f(x) / L_f(r), where f is the base density and
 * L_f its Laplace transform. Immutable, thread-safe.
 *
 * <p>The density is exact; the cdf, survival, moments and Laplace transform
 * L(s) = L_f(s + r)/L_f(r) are integrals of x^m exp(-r x) f(x) in the base family's log-space
 * variable by {@code PeakQuadrature} (the moments by direct quadrature of x exp(-r x) f(x) and
 * x^2 exp(-r x) f(x), not by differences of log L). Tilting composes on the base:
 * {@code tilt(r).tilt(s)} is {@code base.tilt(r + s)}. Gamma distributions tilt to gamma
 * distributions and never give a {@code TiltedDelay}.
 */
public final class TiltedDelay extends AbstractDelay {
    private final AbstractDelay base;
    private final LogSpaceIntegrable integrable;
    private final double r;
    private final double logNorm;
    private final double mean;
    private final double variance;

    private TiltedDelay(AbstractDelay base, double r, double logNorm) {
        this.base = base;
        this.integrable = (LogSpaceIntegrable) base;
        this.r = r;
        this.logNorm = logNorm;
        this.mean = Math.exp(integrable.logPartialTransform(r, 1, 0, true) - logNorm);
        double m2 = Math.exp(integrable.logPartialTransform(r, 2, 0, true) - logNorm);
        this.variance = m2 - mean * mean;
    }

    static DelayDistribution tilt(AbstractDelay base, double r) {
        Checks.notNaN("r", r);
        if (r == 0) {
            return base;
        }
        double l = base.laplaceTransform(r);
        if (!(l > 0 && l < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("r must give a finite Laplace transform (abscissa "
                    + base.laplaceAbscissa() + ") and a normalisable tilted density, was " + r
                    + " (transform " + l + ")");
        }
        double logNorm = ((LogSpaceIntegrable) base).logPartialTransform(r, 0, 0, true);
        return new TiltedDelay(base, r, logNorm);
    }

    /** @return the untilted distribution. */
    public DelayDistribution base() {
        return base;
    }

    /** @return the tilt r per day. */
    public double tiltRate() {
        return r;
    }

    @Override
    public String familyName() {
        return "tilted";
    }

    @Override
    public double density(double x) {
        return Math.exp(logDensity(x));
    }

    @Override
    public double logDensity(double x) {
        if (!(x > 0)) {
            return x == 0 ? base.logDensity(x) - logNorm : base.logDensity(x);
        }
        return base.logDensity(x) - r * x - logNorm;
    }

    @Override
    public double cdf(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 0;
        }
        return Math.exp(logCdf(x));
    }

    @Override
    public double survival(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 1;
        }
        return Math.exp(logSurvival(x));
    }

    @Override
    public double logCdf(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : Double.NEGATIVE_INFINITY;
        }
        if (x == Double.POSITIVE_INFINITY) {
            return 0;
        }
        return Math.min(0, integrable.logPartialTransform(r, 0, x, false) - logNorm);
    }

    @Override
    public double logSurvival(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 0;
        }
        if (x == Double.POSITIVE_INFINITY) {
            return Double.NEGATIVE_INFINITY;
        }
        return Math.min(0, integrable.logPartialTransform(r, 0, x, true) - logNorm);
    }

    @Override
    public double mean() {
        return mean;
    }

    /** E[X^2] - mean^2 from quadratures of the first two moments. */
    @Override
    public double variance() {
        return variance;
    }

    /** L_f(s + r) / L_f(r); +Infinity where L_f(s + r) diverges. */
    @Override
    public double laplaceTransform(double s) {
        checkS(s);
        if (s == 0) {
            return 1;
        }
        double t = s + r;
        double lb = base.laplaceTransform(t);
        if (lb == Double.POSITIVE_INFINITY || lb == 0) {
            return lb;
        }
        if (t == 0) {
            return Math.exp(-logNorm);
        }
        return Math.exp(integrable.logPartialTransform(t, 0, 0, true) - logNorm);
    }

    @Override
    public double laplaceAbscissa() {
        return base.laplaceAbscissa() - r;
    }

    /** @return {@code base().tilt(tiltRate() + s)}; this for s = 0 */
    @Override
    public DelayDistribution tilt(double s) {
        Checks.notNaN("r", s);
        if (s == 0) {
            return this;
        }
        return base.tilt(r + s);
    }

    @Override
    double lowerPartialMean(double x) {
        if (!(x > 0)) {
            return 0;
        }
        return Math.exp(integrable.logPartialTransform(r, 1, x, false) - logNorm);
    }

    @Override
    double upperPartialMean(double x) {
        if (!(x > 0)) {
            return mean;
        }
        return Math.exp(integrable.logPartialTransform(r, 1, x, true) - logNorm);
    }

    /** Inversion: quantile of a uniform variate. */
    @Override
    public double sample(UniformRandomProvider rng) {
        return quantile(rng.nextDouble());
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof TiltedDelay t && base.equals(t.base) && Double.compare(r, t.r) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * base.hashCode() + Double.hashCode(r);
    }

    @Override
    public String toString() {
        return "TiltedDelay[base=" + base + ", r=" + r + "]";
    }
}
