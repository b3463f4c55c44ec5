package org.incipit.distributions;

import org.apache.commons.numbers.gamma.Gamma;
import org.apache.commons.numbers.gamma.LogGamma;
import org.apache.commons.numbers.gamma.RegularizedGamma;
import org.apache.commons.numbers.rootfinder.BrentSolver;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.ZigguratSampler;

/**
 * Weibull-distributed delay in days, survival S(x) = exp(-(x/scale)^shape). Immutable,
 * thread-safe.
 *
 * <p>Mean scale Gamma(1 + 1/shape), variance scale^2 [Gamma(1 + 2/shape) - Gamma(1 + 1/shape)^2]
 * (Johnson, Kotz &amp; Balakrishnan, Continuous Univariate Distributions, Vol. 1, 2nd ed., 1994,
 * ch. 21; cited from memory). The Laplace transform has no closed form except for shape 1; it
 * is integrated over g = log E (X = scale E^(1/shape), E standard exponential) around the mode
 * of the integrand: for s &gt; 0 by a trapezoidal rule on a one-sided double-exponential map
 * ({@code SaddleTrapezoid}), for s &lt; 0 (shape &gt; 1) and partial transforms by the adaptive
 * {@code PeakQuadrature}. It diverges for s &lt; 0 when shape &lt; 1 and for
 * s &le; -1/scale when shape = 1.
 */
public final class WeibullDelay extends AbstractDelay implements ParametricDelay, LogSpaceIntegrable {
    private static final double MIN_SHAPE = 0.02;
    private static final double MAX_SHAPE = 1e4;

    private final double shape;
    private final double scale;
    private final double logShapeOverScale;
    private final double logScale;

    private WeibullDelay(double shape, double scale) {
        this.shape = shape;
        this.scale = scale;
        this.logScale = Math.log(scale);
        this.logShapeOverScale = Math.log(shape) - logScale;
    }

    /**
     * @param shape finite and &gt; 0
     * @param scale days, finite and &gt; 0
     * @return the Weibull distribution
     * @throws IllegalArgumentException if a parameter is out of range
     */
    public static WeibullDelay ofShapeScale(double shape, double scale) {
        return new WeibullDelay(Checks.positiveFinite("shape", shape), Checks.positiveFinite("scale", scale));
    }

    /**
     * The Weibull with a given mean and sd. The coefficient of variation depends only on the
     * shape, CV^2 = Gamma(1 + 2/k)/Gamma(1 + 1/k)^2 - 1, decreasing in k; it is solved for k by
     * Brent's method (commons-numbers-rootfinder) on log k in [log 0.02, log 1e4].
     *
     * @param mean days, finite and &gt; 0
     * @param sd   days, finite and &gt; 0
     * @return the Weibull with that mean and sd
     * @throws IllegalArgumentException if an argument is out of range or the coefficient of
     *         variation sd/mean is outside what shapes in [0.02, 1e4] give (no solution)
     */
    public static WeibullDelay ofMeanSd(double mean, double sd) {
        Checks.positiveFinite("mean", mean);
        Checks.positiveFinite("sd", sd);
        double target = Math.log(sd / mean);
        double lo = Math.log(MIN_SHAPE);
        double hi = Math.log(MAX_SHAPE);
        double flo = logCv(MIN_SHAPE) - target;
        double fhi = logCv(MAX_SHAPE) - target;
        if (!(flo >= 0 && fhi <= 0)) {
            throw new IllegalArgumentException("no Weibull shape in [" + MIN_SHAPE + ", " + MAX_SHAPE
                    + "] gives coefficient of variation sd/mean = " + (sd / mean) + " (mean " + mean + ", sd " + sd
                    + "); attainable range is [" + Math.exp(logCv(MAX_SHAPE)) + ", " + Math.exp(logCv(MIN_SHAPE)) + "]");
        }
        double logK = new BrentSolver(1e-15, 1e-15, 0).findRoot(u -> logCv(Math.exp(u)) - target, lo, hi);
        double k = Math.exp(logK);
        double scale = mean / Gamma.value(1 + 1 / k);
        return ofShapeScale(k, scale);
    }

    /** log CV(k) = 0.5 log(Gamma(1+2/k)/Gamma(1+1/k)^2 - 1). */
    static double logCv(double k) {
        double d = LogGamma.value(1 + 2 / k) - 2 * LogGamma.value(1 + 1 / k);
        return 0.5 * Math.log(Math.expm1(d));
    }

    /** @return the shape. */
    public double shape() {
        return shape;
    }

    /** @return the scale in days. */
    public double scale() {
        return scale;
    }

    @Override
    public DelayFamily family() {
        return DelayFamilies.WEIBULL;
    }

    @Override
    public double[] parameters() {
        return new double[] {shape, scale};
    }

    @Override
    public String familyName() {
        return "weibull";
    }

    @Override
    public double density(double x) {
        return Math.exp(logDensity(x));
    }

    @Override
    public double logDensity(double x) {
        if (x > 0) {
            double lz = Math.log(x) - logScale;
            return logShapeOverScale + (shape - 1) * lz - Math.exp(shape * lz);
        }
        if (x == 0) {
            return shape < 1 ? Double.POSITIVE_INFINITY : shape == 1 ? -logScale : Double.NEGATIVE_INFINITY;
        }
        return x < 0 ? Double.NEGATIVE_INFINITY : Double.NaN;
    }

    private double z(double x) {
        return Math.pow(x / scale, shape);
    }

    @Override
    public double cdf(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 0;
        }
        return -Math.expm1(-z(x));
    }

    @Override
    public double survival(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 1;
        }
        return Math.exp(-z(x));
    }

    @Override
    public double logCdf(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : Double.NEGATIVE_INFINITY;
        }
        double z = z(x);
        return z < 0.693 ? Math.log(-Math.expm1(-z)) : Math.log1p(-Math.exp(-z));
    }

    @Override
    public double logSurvival(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 0;
        }
        return -z(x);
    }

    @Override
    double quantileGuess(double p) {
        return scale * Math.pow(-Math.log1p(-p), 1 / shape);
    }

    @Override
    boolean quantileGuessExact() {
        return true;
    }

    @Override
    public double mean() {
        return scale * Gamma.value(1 + 1 / shape);
    }

    @Override
    public double variance() {
        double g1 = Gamma.value(1 + 1 / shape);
        double g2 = Gamma.value(1 + 2 / shape);
        return scale * scale * (g2 - g1 * g1);
    }

    @Override
    public double laplaceTransform(double s) {
        checkS(s);
        if (s == 0) {
            return 1;
        }
        if (shape == 1) {
            return s * scale > -1 ? 1 / (1 + s * scale) : Double.POSITIVE_INFINITY;
        }
        if (s < 0 && shape < 1) {
            return Double.POSITIVE_INFINITY;
        }
        if (s == Double.POSITIVE_INFINITY) {
            return 0;
        }
        double fast = s > 0 ? saddleLaplace(s * scale) : Double.NaN;
        return fast >= 0 ? fast : Math.exp(logPartialTransform(s, 0, 0, true));
    }

    /**
     * Node spacing in t at the mode: at most 0.5 of the saddle scale and 0.3/max(1, 1/shape)
     * (the strip of analyticity of e^t and e^(t/shape)); the mapped rule has step 0.25 in tau.
     */
    private static final double STEP_SCALE = 0.5;
    private static final double STEP_STRIP = 0.3;
    private static final double STEP = 0.25;

    /**
     * E exp(-sX) for c = s scale &gt; 0 by the trapezoidal rule about the saddle; NaN where the
     * case is left to the adaptive rule. With g = log E (E = (X/scale)^shape, standard
     * exponential) the log-integrand is g - e^g - c e^(g/k); its mode g* solves
     * log(e^g + (c/k) e^(g/k)) = 0 (Newton; the left side is nearly linear in g). With
     * w = e^g*, v = c e^(g* / k) it is E(t) = t - w (e^t - 1) - v (e^(t/k) - 1) relative to the
     * mode, with curvature w + v/k^2.
     */
    double saddleLaplace(double c) {
        double k = shape;
        double ck = c / k;
        double g = Math.min(0, k * Math.log(k / c));
        double w = 0;
        double v = 0;
        for (int it = 0; it < 60; it++) {
            w = Math.exp(g);
            v = c * Math.exp(g / k);
            double f = w + v / k;
            double dg = Math.log(f) * f / (w + v / (k * k));
            g -= dg;
            if (Math.abs(dg) <= 1e-14 * Math.max(1, Math.abs(g))) {
                break;
            }
        }
        w = Math.exp(g);
        v = c * Math.exp(g / k);
        if (!(w > 0 && v < Double.POSITIVE_INFINITY) || ck == Double.POSITIVE_INFINITY) {
            return Double.NaN;
        }
        double curv = w + v / (k * k);
        double t0 = 1 / Math.sqrt(curv);
        double len = Math.min(STEP_SCALE * t0, STEP_STRIP / Math.max(1, 1 / k)) / STEP;
        double sum = SaddleTrapezoid.mappedIntegral(w, v, k, len, STEP);
        if (!(sum > 0 && sum < Double.POSITIVE_INFINITY)) {
            return Double.NaN;
        }
        return Math.exp(g - w - v + Math.log(sum));
    }

    @Override
    public double laplaceAbscissa() {
        return shape > 1 ? Double.NEGATIVE_INFINITY : shape == 1 ? -1 / scale : 0;
    }

    @Override
    public DelayDistribution tilt(double r) {
        return TiltedDelay.tilt(this, r);
    }

    @Override
    public double logPartialTransform(double s, int m, double x, boolean upper) {
        final double c = s * scale;
        final double a = 1 + m / shape;
        final double invK = 1 / shape;
        final double ck = c / shape;
        final double ckk = ck / shape;
        PeakQuadrature.LogIntegrand h = new PeakQuadrature.LogIntegrand() {
            @Override
            public double value(double g) {
                return a * g - Math.exp(g) - c * Math.exp(g * invK);
            }

            @Override
            public double slope(double g) {
                return a - Math.exp(g) - ck * Math.exp(g * invK);
            }

            @Override
            public double curvature(double g) {
                return -Math.exp(g) - ckk * Math.exp(g * invK);
            }
        };
        double guess = Math.log(a);
        if (c > 0) {
            guess = Math.min(guess, shape * Math.log(a / ck));
        }
        double split = x > 0 ? shape * (Math.log(x) - logScale) : Double.NEGATIVE_INFINITY;
        double lo = upper ? split : Double.NEGATIVE_INFINITY;
        double hi = upper ? Double.POSITIVE_INFINITY : split;
        return m * logScale + PeakQuadrature.logIntegral(h, lo, hi, guess);
    }

    @Override
    double lowerPartialMean(double x) {
        return x > 0 ? mean() * RegularizedGamma.P.value(1 + 1 / shape, z(x)) : 0;
    }

    @Override
    double upperPartialMean(double x) {
        return x > 0 ? mean() * RegularizedGamma.Q.value(1 + 1 / shape, z(x)) : mean();
    }

    /** scale E^(1/shape), E exponential by the ziggurat method (commons-rng-sampling). */
    @Override
    public double sample(UniformRandomProvider rng) {
        return scale * Math.pow(ZigguratSampler.Exponential.of(rng).sample(), 1 / shape);
    }

    /** Closed form: z = (x/scale)^k, d/dk = 1/k + (1 - z) log(x/scale), d/dscale = k(z - 1)/scale. */
    @Override
    public double[] logDensityGradient(double x) {
        double lz = Math.log(x) - logScale;
        double z = Math.exp(shape * lz);
        return new double[] {1 / shape + (1 - z) * lz, shape * (z - 1) / scale};
    }

    /** d log(1 - e^-z) = dz / expm1(z). */
    @Override
    public double[] logCdfGradient(double x) {
        double lz = Math.log(x) - logScale;
        double z = Math.exp(shape * lz);
        double f = z / Math.expm1(z);
        return new double[] {f * lz, -f * shape / scale};
    }

    /** d(-z): (-z log(x/scale), k z/scale). */
    @Override
    public double[] logSurvivalGradient(double x) {
        if (x == 0) {
            return new double[] {0, 0};
        }
        double lz = Math.log(x) - logScale;
        double z = Math.exp(shape * lz);
        return new double[] {-z * lz, shape * z / scale};
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof WeibullDelay w && Double.compare(shape, w.shape) == 0 && Double.compare(scale, w.scale) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Double.hashCode(shape) + Double.hashCode(scale);
    }

    @Override
    public String toString() {
        return "WeibullDelay[shape=" + shape + ", scale=" + scale + "]";
    }
}
