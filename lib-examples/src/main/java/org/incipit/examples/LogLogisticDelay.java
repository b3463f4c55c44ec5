package org.incipit.examples;

import java.util.List;
import java.util.function.DoubleUnaryOperator;

import org.apache.commons.rng.UniformRandomProvider;
import org.incipit.distributions.DailyMasses;
import org.incipit.distributions.DelayDistribution;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.Discretisation;
import org.incipit.distributions.ParametricDelay;

/**
 * Extension example (docs/extending.md): the log-logistic delay, a family added outside
 * lib-distributions by implementing {@link ParametricDelay} and {@link DelayFamily}. Immutable,
 * thread-safe.
 *
 * <p>With shape &beta; &gt; 0 and scale &alpha; &gt; 0 days, z = (x/&alpha;)<sup>&beta;</sup>:
 * F(x) = z / (1 + z), S(x) = 1 / (1 + z), f(x) = (&beta;/&alpha;)(x/&alpha;)<sup>&beta;&minus;1</sup>
 * / (1 + z)&sup2;, quantile Q(u) = &alpha; (u / (1 &minus; u))<sup>1/&beta;</sup>; with b = &pi;/&beta;,
 * mean &alpha; b / sin b (&beta; &gt; 1), variance &alpha;&sup2;(2b / sin 2b &minus; b&sup2; / sin&sup2; b)
 * (&beta; &gt; 2) (Johnson, Kotz &amp; Balakrishnan 1995, <i>Continuous Univariate Distributions</i>
 * vol. 2, ch. 23, from memory; checked against scipy.stats.fisk in the tests). The mean and
 * variance are +&infin; where they do not exist. The right tail is polynomial, so
 * E[e<sup>&minus;sX</sup>] is finite only for s &ge; 0: the abscissa is 0 and declining
 * epidemics (tilt r &lt; 0) are refused.
 *
 * <p>The Laplace transform, tilted distribution and daily masses are integrals over the
 * probability scale, E[g(X)] = &int;<sub>0</sub><sup>1</sup> g(Q(u)) du, by the tanh&ndash;sinh rule
 * (Takahasi &amp; Mori 1974), step 1/32, about 1e-12 relative on these smooth integrands.
 */
public final class LogLogisticDelay implements ParametricDelay {

    /** The log-logistic family; parameters (shape, scale). */
    public static final DelayFamily FAMILY = new DelayFamily() {
        @Override
        public String name() {
            return "loglogistic";
        }

        @Override
        public List<String> parameterNames() {
            return List.of("shape", "scale");
        }

        @Override
        public List<Domain> parameterDomains() {
            return List.of(Domain.POSITIVE, Domain.POSITIVE);
        }

        @Override
        public ParametricDelay of(double... parameters) {
            if (parameters == null || parameters.length != 2) {
                throw new IllegalArgumentException("log-logistic needs 2 parameters (shape, scale), had "
                        + (parameters == null ? "null" : parameters.length));
            }
            return ofShapeScale(parameters[0], parameters[1]);
        }

        @Override
        public ParametricDelay ofMeanSd(double mean, double sd) {
            return LogLogisticDelay.ofMeanSd(mean, sd);
        }

        @Override
        public String toString() {
            return name();
        }
    };

    private final double shape;
    private final double scale;

    private LogLogisticDelay(double shape, double scale) {
        this.shape = shape;
        this.scale = scale;
    }

    /**
     * @param shape &beta;, finite and &gt; 0
     * @param scale &alpha; in days (the median), finite and &gt; 0
     * @return the distribution
     * @throws IllegalArgumentException if a parameter is out of range
     */
    public static LogLogisticDelay ofShapeScale(double shape, double scale) {
        return new LogLogisticDelay(positive("shape", shape), positive("scale", scale));
    }

    /**
     * The member with a given mean and sd: the coefficient of variation fixes &beta; (&gt; 2, by
     * bisection on the monotone CV(&beta;)), then &alpha; = mean sin(b) / b.
     *
     * @param mean days, finite and &gt; 0
     * @param sd   days, finite and &gt; 0
     * @return the distribution
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static LogLogisticDelay ofMeanSd(double mean, double sd) {
        positive("mean", mean);
        positive("sd", sd);
        double cv2 = (sd / mean) * (sd / mean);
        double lo = 2 + 1e-9;
        double hi = 1e6;
        for (int i = 0; i < 200 && hi - lo > 1e-14 * hi; i++) {
            double mid = 0.5 * (lo + hi);
            if (cv2(mid) > cv2) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        double beta = 0.5 * (lo + hi);
        double b = Math.PI / beta;
        return new LogLogisticDelay(beta, mean * Math.sin(b) / b);
    }

    /** Squared coefficient of variation for shape beta &gt; 2: (2b/sin 2b) / (b/sin b)^2 - 1. */
    private static double cv2(double beta) {
        double b = Math.PI / beta;
        double r = b / Math.sin(b);
        return (2 * b / Math.sin(2 * b)) / (r * r) - 1;
    }

    private static double positive(String name, double v) {
        if (!(v > 0 && v < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(name + " must be finite and > 0, was " + v);
        }
        return v;
    }

    /** @return &beta; */
    public double shape() {
        return shape;
    }

    /** @return &alpha;, days */
    public double scale() {
        return scale;
    }

    @Override
    public DelayFamily family() {
        return FAMILY;
    }

    @Override
    public double[] parameters() {
        return new double[] {shape, scale};
    }

    @Override
    public String familyName() {
        return FAMILY.name();
    }

    /** log z = beta (log x - log alpha). */
    private double logZ(double x) {
        return shape * (Math.log(x) - Math.log(scale));
    }

    /** log(1 + z) from log z without overflow. */
    private static double log1pZ(double logZ) {
        return logZ > 0 ? logZ + Math.log1p(Math.exp(-logZ)) : Math.log1p(Math.exp(logZ));
    }

    @Override
    public double density(double x) {
        return Math.exp(logDensity(x));
    }

    @Override
    public double logDensity(double x) {
        if (!(x > 0)) {
            return Double.NEGATIVE_INFINITY;
        }
        double lz = logZ(x);
        return Math.log(shape) - Math.log(x) + lz - 2 * log1pZ(lz);
    }

    @Override
    public double cdf(double x) {
        return x > 0 ? Math.exp(logCdf(x)) : 0;
    }

    @Override
    public double survival(double x) {
        return x > 0 ? Math.exp(logSurvival(x)) : 1;
    }

    @Override
    public double logCdf(double x) {
        if (!(x > 0)) {
            return Double.NEGATIVE_INFINITY;
        }
        double lz = logZ(x);
        return lz - log1pZ(lz);
    }

    @Override
    public double logSurvival(double x) {
        return x > 0 ? -log1pZ(logZ(x)) : 0;
    }

    @Override
    public double quantile(double p) {
        if (!(p >= 0 && p <= 1)) {
            throw new IllegalArgumentException("p must be in [0, 1], was " + p);
        }
        return quantile(p, 1 - p);
    }

    /** Q from u and 1 - u (both given, so that u near 1 keeps its accuracy). */
    private double quantile(double u, double oneMinusU) {
        return scale * Math.exp((Math.log(u) - Math.log(oneMinusU)) / shape);
    }

    @Override
    public double mean() {
        if (!(shape > 1)) {
            return Double.POSITIVE_INFINITY;
        }
        double b = Math.PI / shape;
        return scale * b / Math.sin(b);
    }

    @Override
    public double variance() {
        if (!(shape > 2)) {
            return Double.POSITIVE_INFINITY;
        }
        double b = Math.PI / shape;
        double r = b / Math.sin(b);
        return scale * scale * (2 * b / Math.sin(2 * b) - r * r);
    }

    /** E[exp(-s X)] = integral over u of exp(-s Q(u)); +infinity for s &lt; 0. */
    @Override
    public double laplaceTransform(double s) {
        if (Double.isNaN(s)) {
            throw new IllegalArgumentException("s must not be NaN");
        }
        if (s < 0) {
            return Double.POSITIVE_INFINITY;
        }
        if (s == 0) {
            return 1;
        }
        return integrateProbability(1, (u, v) -> Math.exp(-s * quantile(u, v)));
    }

    @Override
    public double laplaceAbscissa() {
        return 0;
    }

    @Override
    public DelayDistribution tilt(double r) {
        if (Double.isNaN(r)) {
            throw new IllegalArgumentException("r must not be NaN");
        }
        if (r == 0) {
            return this;
        }
        if (r < 0) {
            throw new IllegalArgumentException("r must be >= 0 for the log-logistic (its Laplace transform"
                    + " diverges for r < 0, abscissa 0), was " + r);
        }
        return new Tilted(this, r);
    }

    @Override
    public DailyMasses discretise(int maxDay, Discretisation scheme) {
        return masses(this, maxDay, scheme);
    }

    @Override
    public double sample(UniformRandomProvider rng) {
        double u = rng.nextDouble();
        return quantile(u, 1 - u);
    }

    @Override
    public double[] logDensityGradient(double x) {
        double l = Math.log(x) - Math.log(scale);
        double z = Math.exp(shape * l);
        double w = (1 - z) / (1 + z);
        // d/dshape = 1/beta + L (1 - z)/(1 + z); d/dscale = -(beta/alpha)(1 - z)/(1 + z)
        return new double[] {1 / shape + l * w, -shape / scale * w};
    }

    @Override
    public double[] logCdfGradient(double x) {
        double l = Math.log(x) - Math.log(scale);
        double s = 1 / (1 + Math.exp(shape * l));
        return new double[] {l * s, -shape / scale * s};
    }

    @Override
    public double[] logSurvivalGradient(double x) {
        if (!(x > 0)) {
            return new double[] {0, 0};
        }
        double l = Math.log(x) - Math.log(scale);
        double f = 1 / (1 + Math.exp(-shape * l)); // z / (1 + z)
        return new double[] {-l * f, shape / scale * f};
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof LogLogisticDelay d && Double.compare(shape, d.shape) == 0
                && Double.compare(scale, d.scale) == 0;
    }

    @Override
    public int hashCode() {
        return Double.hashCode(shape) * 31 + Double.hashCode(scale);
    }

    @Override
    public String toString() {
        return "LogLogisticDelay[shape=" + shape + ", scale=" + scale + "]";
    }

    // ------------------------------------------------------------------ numerics

    /** g(u, 1 - u) for u in (0, 1). */
    @FunctionalInterface
    interface ProbabilityIntegrand {
        double value(double u, double oneMinusU);
    }

    private static final double STEP = 1.0 / 32;
    private static final int HALF_NODES = 112; // |k h| <= 3.5: weights below 1e-300 beyond

    /**
     * &int;<sub>0</sub><sup>a</sup> g(u) du by the tanh&ndash;sinh rule, u = a(1 + t)/2; the
     * distance 1 &minus; u is passed exactly where a = 1.
     */
    static double integrateProbability(double a, ProbabilityIntegrand g) {
        double sum = 0;
        for (int k = -HALF_NODES; k <= HALF_NODES; k++) {
            double y = 0.5 * Math.PI * Math.sinh(k * STEP);
            double c = Math.cosh(y);
            double w = 0.5 * Math.PI * Math.cosh(k * STEP) / (c * c);
            // 1 + t = 2 / (1 + e^{-2y}), 1 - t = 2 / (1 + e^{2y})
            double onePlusT = 2 / (1 + Math.exp(-2 * y));
            double oneMinusT = 2 / (1 + Math.exp(2 * y));
            double u = 0.5 * a * onePlusT;
            double rest = a == 1 ? 0.5 * oneMinusT : 1 - u;
            if (u <= 0 || rest <= 0) {
                continue;
            }
            double v = g.value(u, rest);
            if (v != 0) {
                sum += w * v;
            }
        }
        return 0.5 * a * STEP * sum;
    }

    /** Integral of a smooth function over [lo, hi] (tanh-sinh). */
    static double integrate(double lo, double hi, DoubleUnaryOperator f) {
        double width = hi - lo;
        return integrateProbability(1, (u, v) -> f.applyAsDouble(lo + width * u)) * width;
    }

    static DailyMasses masses(DelayDistribution d, int maxDay, Discretisation scheme) {
        if (maxDay < 0) {
            throw new IllegalArgumentException("maxDay must be >= 0, was " + maxDay);
        }
        double[] m = new double[maxDay + 1];
        double total = 0;
        for (int day = 0; day <= maxDay; day++) {
            int dd = day;
            m[day] = switch (scheme) {
                case DAY_INTERVAL -> Math.max(0, d.cdf(dd + 1) - d.cdf(dd));
                case DOUBLE_CENSORED -> Math.max(0, integrate(0, 1, u -> d.cdf(dd + 1 - u) - d.cdf(dd - u)));
            };
            total += m[day];
        }
        return new DailyMasses(m, Math.max(0, 1 - total));
    }

    /**
     * The tilted law, density e^(&minus;r x) f(x) / L(r), r &gt; 0, on the probability scale of the
     * base: F_r(x) = &int;<sub>0</sub><sup>F(x)</sup> e<sup>&minus;r Q(u)</sup> du / L(r).
     */
    private static final class Tilted implements DelayDistribution {
        private final LogLogisticDelay base;
        private final double r;
        private final double norm;
        private final double mean;
        private final double variance;

        Tilted(LogLogisticDelay base, double r) {
            this.base = base;
            this.r = r;
            this.norm = base.laplaceTransform(r);
            this.mean = integrateProbability(1, (u, v) -> {
                double q = base.quantile(u, v);
                return q * Math.exp(-r * q);
            }) / norm;
            double m2 = integrateProbability(1, (u, v) -> {
                double q = base.quantile(u, v);
                return q * q * Math.exp(-r * q);
            }) / norm;
            this.variance = m2 - mean * mean;
        }

        @Override
        public String familyName() {
            return base.familyName() + "-tilted";
        }

        @Override
        public double density(double x) {
            return Math.exp(logDensity(x));
        }

        @Override
        public double logDensity(double x) {
            return base.logDensity(x) - r * x - Math.log(norm);
        }

        @Override
        public double cdf(double x) {
            if (!(x > 0)) {
                return 0;
            }
            double fx = base.cdf(x);
            if (fx > 0.5) {
                return Math.max(0, 1 - survival(x));
            }
            return Math.min(1, integrateProbability(fx, (u, v) -> Math.exp(-r * base.quantile(u, 1 - u))) / norm);
        }

        @Override
        public double survival(double x) {
            if (!(x > 0)) {
                return 1;
            }
            double s = base.survival(x);
            // integral over u in (F(x), 1) = integral over w = 1 - u in (0, S(x))
            return Math.min(1, integrateProbability(s, (w, rest) -> Math.exp(-r * base.quantile(1 - w, w))) / norm);
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
            if (!(p >= 0 && p <= 1)) {
                throw new IllegalArgumentException("p must be in [0, 1], was " + p);
            }
            if (p == 0) {
                return 0;
            }
            if (p == 1) {
                return Double.POSITIVE_INFINITY;
            }
            double lo = 0;
            double hi = Math.max(1, base.quantile(p));
            while (cdf(hi) < p) {
                hi *= 2;
            }
            for (int i = 0; i < 200 && hi - lo > 1e-13 * hi; i++) {
                double mid = 0.5 * (lo + hi);
                if (cdf(mid) < p) {
                    lo = mid;
                } else {
                    hi = mid;
                }
            }
            return 0.5 * (lo + hi);
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
        public double laplaceTransform(double s) {
            if (Double.isNaN(s)) {
                throw new IllegalArgumentException("s must not be NaN");
            }
            return s + r < 0 ? Double.POSITIVE_INFINITY : base.laplaceTransform(s + r) / norm;
        }

        @Override
        public double laplaceAbscissa() {
            return -r;
        }

        @Override
        public DelayDistribution tilt(double s) {
            return base.tilt(r + s);
        }

        @Override
        public DailyMasses discretise(int maxDay, Discretisation scheme) {
            return masses(this, maxDay, scheme);
        }

        @Override
        public double sample(UniformRandomProvider rng) {
            return quantile(rng.nextDouble());
        }
    }
}
