package org.incipit.distributions;

import org.apache.commons.numbers.gamma.Digamma;
import org.apache.commons.numbers.gamma.LogGamma;
import org.apache.commons.numbers.gamma.RegularizedGamma;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.AhrensDieterMarsagliaTsangGammaSampler;
import org.apache.commons.statistics.distribution.GammaDistribution;

/**
 * Gamma-distributed delay in days, density f(x) = rate^shape x^(shape-1) e^(-rate x) /
 * Gamma(shape). Immutable, thread-safe.
 *
 * <p>Mean shape/rate, variance shape/rate^2, Laplace transform (1 + s/rate)^(-shape) for
 * s &gt; -rate (Johnson, Kotz &amp; Balakrishnan, Continuous Univariate Distributions, Vol. 1,
 * 2nd ed., 1994, ch. 17; cited from memory). The cdf is the regularised incomplete gamma
 * function P(shape, rate x) (commons-numbers-gamma); far tails on the log scale use a series
 * and Legendre's continued fraction.
 */
public final class GammaDelay extends AbstractDelay implements ParametricDelay {
    private final double shape;
    private final double rate;
    private final double logNorm; // shape*log(rate) - logGamma(shape)
    private final double logGammaShape;
    private final double digammaShape;
    private final double digammaShape1; // psi(shape + 1)

    private GammaDelay(double shape, double rate) {
        this.shape = shape;
        this.rate = rate;
        this.logGammaShape = LogGamma.value(shape);
        this.logNorm = shape * Math.log(rate) - logGammaShape;
        this.digammaShape = Digamma.value(shape);
        this.digammaShape1 = Digamma.value(shape + 1);
    }

    /**
     * @param shape finite and &gt; 0
     * @param rate  per day, finite and &gt; 0
     * @return the gamma distribution
     * @throws IllegalArgumentException if a parameter is out of range
     */
    public static GammaDelay ofShapeRate(double shape, double rate) {
        return new GammaDelay(Checks.positiveFinite("shape", shape), Checks.positiveFinite("rate", rate));
    }

    /**
     * Exponential distribution (gamma with shape 1).
     *
     * @param rate per day, finite and &gt; 0
     * @return gamma(1, rate)
     * @throws IllegalArgumentException if rate is out of range
     */
    public static GammaDelay exponential(double rate) {
        return ofShapeRate(1, rate);
    }

    /**
     * Method of moments: shape = (mean/sd)^2, rate = mean/sd^2.
     *
     * @param mean days, finite and &gt; 0
     * @param sd   days, finite and &gt; 0
     * @return the gamma distribution with that mean and sd
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static GammaDelay ofMeanSd(double mean, double sd) {
        Checks.positiveFinite("mean", mean);
        Checks.positiveFinite("sd", sd);
        double cv = sd / mean;
        double shape = 1 / (cv * cv);
        double rate = mean / (sd * sd);
        if (!(shape > 0 && shape < Double.POSITIVE_INFINITY && rate > 0 && rate < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("no gamma distribution with mean " + mean + " and sd " + sd
                    + ": shape " + shape + " or rate " + rate + " not finite and > 0");
        }
        return new GammaDelay(shape, rate);
    }

    /** @return the shape. */
    public double shape() {
        return shape;
    }

    /** @return the rate per day. */
    public double rate() {
        return rate;
    }

    @Override
    public DelayFamily family() {
        return DelayFamilies.GAMMA;
    }

    @Override
    public double[] parameters() {
        return new double[] {shape, rate};
    }

    @Override
    public String familyName() {
        return "gamma";
    }

    @Override
    public double density(double x) {
        return Math.exp(logDensity(x));
    }

    @Override
    public double logDensity(double x) {
        if (x > 0) {
            return logNorm + (shape - 1) * Math.log(x) - rate * x;
        }
        if (x == 0) {
            return shape < 1 ? Double.POSITIVE_INFINITY : shape == 1 ? Math.log(rate) : Double.NEGATIVE_INFINITY;
        }
        return x < 0 ? Double.NEGATIVE_INFINITY : Double.NaN;
    }

    @Override
    public double cdf(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 0;
        }
        return RegularizedGamma.P.value(shape, rate * x);
    }

    @Override
    public double survival(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 1;
        }
        return RegularizedGamma.Q.value(shape, rate * x);
    }

    @Override
    public double logCdf(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : Double.NEGATIVE_INFINITY;
        }
        double y = rate * x;
        if (y < shape + 1) {
            return IncompleteGammaLog.logLowerSeries(shape, y);
        }
        return Math.log1p(-RegularizedGamma.Q.value(shape, y));
    }

    @Override
    public double logSurvival(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 0;
        }
        double y = rate * x;
        if (y > shape + 1) {
            return IncompleteGammaLog.logUpperFraction(shape, y);
        }
        return Math.log1p(-RegularizedGamma.P.value(shape, y));
    }

    @Override
    double quantileGuess(double p) {
        GammaDistribution g = GammaDistribution.of(shape, 1 / rate);
        return p <= 0.5 ? g.inverseCumulativeProbability(p) : g.inverseSurvivalProbability(1 - p);
    }

    @Override
    public double mean() {
        return shape / rate;
    }

    @Override
    public double variance() {
        return shape / (rate * rate);
    }

    /**
     * (1 + s/rate)^(-shape) for s &gt; -rate, +Infinity otherwise.
     */
    @Override
    public double laplaceTransform(double s) {
        checkS(s);
        if (!(s > -rate)) {
            return Double.POSITIVE_INFINITY;
        }
        return Math.exp(-shape * Math.log1p(s / rate));
    }

    @Override
    public double laplaceAbscissa() {
        return -rate;
    }

    /**
     * @return gamma(shape, rate + r); this for r = 0
     * @throws IllegalArgumentException if r is NaN or rate + r &le; 0
     */
    @Override
    public GammaDelay tilt(double r) {
        Checks.notNaN("r", r);
        if (r == 0) {
            return this;
        }
        double nr = rate + r;
        if (!(nr > 0 && nr < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("r must be > -rate = " + (-rate) + " (finite), was " + r);
        }
        return new GammaDelay(shape, nr);
    }

    @Override
    double lowerPartialMean(double x) {
        return x > 0 ? mean() * RegularizedGamma.P.value(shape + 1, rate * x) : 0;
    }

    @Override
    double upperPartialMean(double x) {
        return x > 0 ? mean() * RegularizedGamma.Q.value(shape + 1, rate * x) : mean();
    }

    /** Marsaglia &amp; Tsang (2000) / Ahrens &amp; Dieter (1974) via commons-rng-sampling. */
    @Override
    public double sample(UniformRandomProvider rng) {
        return AhrensDieterMarsagliaTsangGammaSampler.of(rng, shape, 1 / rate).sample();
    }

    /** d/d(shape, rate) of log f: (log(rate x) - psi(shape), shape/rate - x). */
    @Override
    public double[] logDensityGradient(double x) {
        return new double[] {Math.log(rate * x) - digammaShape, shape / rate - x};
    }

    /**
     * d log F / d(shape, rate). With y = rate x, the shape part by the differentiated series
     * (y &lt; shape + 1) or continued fraction (y &gt; shape + 1) ({@code IncompleteGammaLog};
     * psi(shape), psi(shape + 1) and log Gamma(shape) cached); on the fraction side
     * d log P = -d log Q * Q/P. The rate part is x f(x) / (rate F(x)). Limits: (-Infinity,
     * shape/rate) where rate x is 0 (x = 0, or so small that rate x underflows), (0, 0) at
     * x = +Infinity or where rate x overflows; NaN components for x &lt; 0 or NaN.
     */
    @Override
    public double[] logCdfGradient(double x) {
        if (!(x > 0 && x < Double.POSITIVE_INFINITY)) {
            double v = x == 0 ? Double.NEGATIVE_INFINITY : x == Double.POSITIVE_INFINITY ? 0 : Double.NaN;
            return new double[] {v, x == 0 ? shape / rate : x == Double.POSITIVE_INFINITY ? 0 : Double.NaN};
        }
        double y = rate * x;
        if (y == 0) {
            return new double[] {Double.NEGATIVE_INFINITY, shape / rate};
        }
        if (y == Double.POSITIVE_INFINITY) {
            return new double[] {0, 0};
        }
        double logy = Math.log(y);
        double[] s = new double[2];
        if (y < shape + 1) {
            IncompleteGammaLog.lowerWithDerivative(shape, y, logy, digammaShape1, s);
            return new double[] {s[0], s[1] / rate};
        }
        IncompleteGammaLog.upperWithDerivative(shape, y, logy, digammaShape, s);
        double q = Math.exp(IncompleteGammaLog.logPrefix(shape, y, logy, logGammaShape)) / s[1];
        double ratio = q / (1 - q); // Q/P
        return new double[] {-s[0] * ratio, s[1] * ratio / rate};
    }

    /**
     * d log S / d(shape, rate); as {@link #logCdfGradient}, with the rate part
     * -x f(x) / (rate S(x)). Limits: (0, 0) for x &le; 0 and where rate x underflows to 0,
     * (+Infinity, -Infinity) at x = +Infinity or where rate x overflows; NaN components for NaN.
     */
    @Override
    public double[] logSurvivalGradient(double x) {
        if (Double.isNaN(x)) {
            return new double[] {Double.NaN, Double.NaN};
        }
        double y = rate * x;
        if (y == Double.POSITIVE_INFINITY) {
            return new double[] {Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY};
        }
        if (!(y > 0)) {
            return new double[] {0, 0};
        }
        double logy = Math.log(y);
        double[] s = new double[2];
        if (y > shape + 1) {
            IncompleteGammaLog.upperWithDerivative(shape, y, logy, digammaShape, s);
            return new double[] {s[0], -s[1] / rate};
        }
        IncompleteGammaLog.lowerWithDerivative(shape, y, logy, digammaShape1, s);
        double p = Math.exp(IncompleteGammaLog.logPrefix(shape, y, logy, logGammaShape)) / s[1];
        // Q = 1 - P loses digits as P -> 1 (small shapes); there Q directly (commons-numbers).
        double ratio = p / (p < 0.5 ? 1 - p : RegularizedGamma.Q.value(shape, y)); // P/Q
        return new double[] {-s[0] * ratio, -s[1] * ratio / rate};
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof GammaDelay g && Double.compare(shape, g.shape) == 0 && Double.compare(rate, g.rate) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Double.hashCode(shape) + Double.hashCode(rate);
    }

    @Override
    public String toString() {
        return "GammaDelay[shape=" + shape + ", rate=" + rate + "]";
    }
}
