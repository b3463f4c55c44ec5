package org.incipit.distributions;

import org.apache.commons.numbers.gamma.Erfc;
import org.apache.commons.numbers.gamma.Erfcx;
import org.apache.commons.numbers.gamma.InverseErfc;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.ZigguratSampler;

/**
 * Lognormal delay in days: log X ~ Normal(meanLog, sdLog^2). Immutable, thread-safe.
 *
 * <p>Mean exp(meanLog + sdLog^2/2), variance exp(2 meanLog + sdLog^2)(exp(sdLog^2) - 1)
 * (Johnson, Kotz &amp; Balakrishnan, Continuous Univariate Distributions, Vol. 1, 2nd ed.,
 * 1994, ch. 14; cited from memory). The cdf is Phi(w) = erfc(-w/sqrt 2)/2 with
 * w = (log x - meanLog)/sdLog; far tails on the log scale use the scaled erfcx. The Laplace
 * transform has no closed form; it is integrated over z (x = exp(meanLog + sdLog z)) around
 * the mode of exp(-s x) phi(z), located through Lambert's W, by the trapezoidal rule
 * ({@code SaddleTrapezoid}); partial transforms use the adaptive {@code PeakQuadrature}. It
 * diverges for every s &lt; 0.
 */
public final class LogNormalDelay extends AbstractDelay implements ParametricDelay, LogSpaceIntegrable {
    private static final double SQRT2 = Math.sqrt(2);
    private static final double HALF_LOG_2PI = 0.5 * Math.log(2 * Math.PI);
    private static final double SQRT_2_OVER_PI = Math.sqrt(2 / Math.PI);

    private final double meanLog;
    private final double sdLog;
    private final double logNorm; // -log(sdLog) - log(2 pi)/2

    private LogNormalDelay(double meanLog, double sdLog) {
        this.meanLog = meanLog;
        this.sdLog = sdLog;
        this.logNorm = -Math.log(sdLog) - HALF_LOG_2PI;
    }

    /**
     * @param meanLog mean of log X, finite
     * @param sdLog   sd of log X, finite and &gt; 0
     * @return the lognormal distribution
     * @throws IllegalArgumentException if a parameter is out of range
     */
    public static LogNormalDelay ofMeanLogSdLog(double meanLog, double sdLog) {
        return new LogNormalDelay(Checks.finite("meanLog", meanLog), Checks.positiveFinite("sdLog", sdLog));
    }

    /**
     * sdLog^2 = log(1 + (sd/mean)^2), meanLog = log(mean) - sdLog^2/2.
     *
     * @param mean days, finite and &gt; 0
     * @param sd   days, finite and &gt; 0
     * @return the lognormal with that mean and sd
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static LogNormalDelay ofMeanSd(double mean, double sd) {
        Checks.positiveFinite("mean", mean);
        Checks.positiveFinite("sd", sd);
        double cv = sd / mean;
        double v = Math.log1p(cv * cv);
        double sdLog = Math.sqrt(v);
        if (!(sdLog > 0 && sdLog < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("no lognormal with mean " + mean + " and sd " + sd
                    + ": sdLog " + sdLog + " not finite and > 0");
        }
        return ofMeanLogSdLog(Math.log(mean) - 0.5 * v, sdLog);
    }

    /** @return meanLog. */
    public double meanLog() {
        return meanLog;
    }

    /** @return sdLog. */
    public double sdLog() {
        return sdLog;
    }

    @Override
    public DelayFamily family() {
        return DelayFamilies.LOGNORMAL;
    }

    @Override
    public double[] parameters() {
        return new double[] {meanLog, sdLog};
    }

    @Override
    public String familyName() {
        return "lognormal";
    }

    @Override
    public double density(double x) {
        return Math.exp(logDensity(x));
    }

    @Override
    public double logDensity(double x) {
        if (x > 0) {
            double lx = Math.log(x);
            double w = (lx - meanLog) / sdLog;
            return logNorm - lx - 0.5 * w * w;
        }
        return x <= 0 ? Double.NEGATIVE_INFINITY : Double.NaN;
    }

    private double w(double x) {
        return (Math.log(x) - meanLog) / sdLog;
    }

    /** Phi(w). */
    static double phiCdf(double w) {
        return 0.5 * Erfc.value(-w / SQRT2);
    }

    /** log Phi(w), accurate for w far below 0. */
    static double logPhiCdf(double w) {
        if (w < -5) {
            return Math.log(0.5 * Erfcx.value(-w / SQRT2)) - 0.5 * w * w;
        }
        return Math.log(phiCdf(w));
    }

    /** phi(w)/Phi(w) without underflow. */
    static double millsInverse(double w) {
        if (w < -5) {
            return SQRT_2_OVER_PI / Erfcx.value(-w / SQRT2);
        }
        return Math.exp(-0.5 * w * w - HALF_LOG_2PI) / phiCdf(w);
    }

    @Override
    public double cdf(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 0;
        }
        return phiCdf(w(x));
    }

    @Override
    public double survival(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 1;
        }
        return phiCdf(-w(x));
    }

    @Override
    public double logCdf(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : Double.NEGATIVE_INFINITY;
        }
        return logPhiCdf(w(x));
    }

    @Override
    public double logSurvival(double x) {
        if (!(x > 0)) {
            return Double.isNaN(x) ? x : 0;
        }
        return logPhiCdf(-w(x));
    }

    @Override
    double quantileGuess(double p) {
        double z = p <= 0.5 ? -SQRT2 * InverseErfc.value(2 * p) : SQRT2 * InverseErfc.value(2 * (1 - p));
        return Math.exp(meanLog + sdLog * z);
    }

    @Override
    public double mean() {
        return Math.exp(meanLog + 0.5 * sdLog * sdLog);
    }

    @Override
    public double variance() {
        double v = sdLog * sdLog;
        return Math.exp(2 * meanLog + v) * Math.expm1(v);
    }

    @Override
    public double laplaceTransform(double s) {
        checkS(s);
        if (s == 0) {
            return 1;
        }
        if (s < 0) {
            return Double.POSITIVE_INFINITY;
        }
        if (s == Double.POSITIVE_INFINITY) {
            return 0;
        }
        double fast = saddleLaplace(s);
        return fast >= 0 ? fast : Math.exp(logPartialTransform(s, 0, 0, true));
    }

    /** Trapezoid step: at most 0.5 of the saddle scale and 0.3/sdLog (strip of analyticity). */
    private static final double STEP_SCALE = 0.5;
    private static final double STEP_STRIP = 0.3;

    /**
     * E exp(-sX) for s &gt; 0 by the trapezoidal rule about the saddle; NaN where the a-priori
     * criterion sends the case to the adaptive rule. With z = (log x - meanLog)/sdLog the
     * log-integrand -z^2/2 - s exp(meanLog + sdLog z) has its mode at z* = -u/sdLog, where
     * u e^u = s sdLog^2 e^meanLog (u = W(.), Lambert's function, by Newton on u + log u), and
     * curvature 1 + u there; relative to the mode it is E(t) = (u/sdLog) t - t^2/2
     * - (u/sdLog^2)(e^(sdLog t) - 1).
     */
    double saddleLaplace(double s) {
        double sig = sdLog;
        double arg = Math.log(s) + 2 * Math.log(sig) + meanLog;
        if (!(arg > -600 && arg < 600)) {
            return Double.NaN;
        }
        double u = lambertW(arg);
        double t0 = 1 / Math.sqrt(1 + u);
        double h = t0 * Math.min(STEP_SCALE, STEP_STRIP / (sig * t0));
        double sum = SaddleTrapezoid.integral(u / sig, 1, u / (sig * sig), sig, 0, 0, h);
        if (!(sum > 0 && sum < Double.POSITIVE_INFINITY)) {
            return Double.NaN;
        }
        double hStar = -u * (u + 2) / (2 * sig * sig);
        return Math.exp(hStar - HALF_LOG_2PI + Math.log(sum));
    }

    /** u &gt; 0 with u + log u = arg (u = W(e^arg)): Winitzki's start, then Newton on u + log u. */
    static double lambertW(double arg) {
        double u = lambertWStart(arg);
        for (int it = 0; it < 20; it++) {
            double du = (u + Math.log(u) - arg) * u / (1 + u);
            u -= du;
            if (Math.abs(du) <= 1e-15 * u) {
                break;
            }
        }
        return u;
    }

    /** Winitzki's approximation to u = W(e^arg) (u + log u = arg): the start of {@link #lambertW}. */
    static double lambertWStart(double arg) {
        if (arg < 0) {
            double t = Math.exp(arg);
            double l = Math.log1p(t);
            return l * (1 - Math.log1p(l) / (2 + l));
        }
        return Math.max(arg - Math.log(Math.max(arg, 1)) + 0.5, 0.5);
    }

    @Override
    public double laplaceAbscissa() {
        return 0;
    }

    @Override
    public DelayDistribution tilt(double r) {
        return TiltedDelay.tilt(this, r);
    }

    @Override
    public double logPartialTransform(double s, int m, double x, boolean upper) {
        final double sig = sdLog;
        final double mu = meanLog;
        final double ms = m * sig;
        PeakQuadrature.LogIntegrand h = new PeakQuadrature.LogIntegrand() {
            @Override
            public double value(double z) {
                double e = s == 0 ? 0 : s * Math.exp(mu + sig * z);
                return -0.5 * z * z - e + ms * z;
            }

            @Override
            public double slope(double z) {
                double e = s == 0 ? 0 : s * Math.exp(mu + sig * z);
                return -z - sig * e + ms;
            }

            @Override
            public double curvature(double z) {
                double e = s == 0 ? 0 : s * Math.exp(mu + sig * z);
                return -1 - sig * sig * e;
            }
        };
        // Mode z* = ms - u/sig with u e^u = s sig^2 exp(mu + sig ms): Winitzki's approximation to
        // Lambert W as the starting point.
        double guess = ms;
        if (s > 0) {
            double arg = Math.log(s * sig * sig) + mu + sig * ms;
            guess = ms - lambertWStart(arg) / sig;
        }
        double split = x > 0 ? w(x) : Double.NEGATIVE_INFINITY;
        double lo = upper ? split : Double.NEGATIVE_INFINITY;
        double hi = upper ? Double.POSITIVE_INFINITY : split;
        return m * mu - HALF_LOG_2PI + PeakQuadrature.logIntegral(h, lo, hi, guess);
    }

    @Override
    double lowerPartialMean(double x) {
        return x > 0 ? mean() * phiCdf(w(x) - sdLog) : 0;
    }

    @Override
    double upperPartialMean(double x) {
        return x > 0 ? mean() * phiCdf(sdLog - w(x)) : mean();
    }

    /** exp(meanLog + sdLog Z), Z by the ziggurat method (commons-rng-sampling). */
    @Override
    public double sample(UniformRandomProvider rng) {
        return Math.exp(meanLog + sdLog * ZigguratSampler.NormalizedGaussian.of(rng).sample());
    }

    /** (w/sdLog, (w^2 - 1)/sdLog). */
    @Override
    public double[] logDensityGradient(double x) {
        double w = w(x);
        return new double[] {w / sdLog, (w * w - 1) / sdLog};
    }

    /** -(phi/Phi)(w) (1, w)/sdLog. */
    @Override
    public double[] logCdfGradient(double x) {
        double w = w(x);
        double r = millsInverse(w) / sdLog;
        return new double[] {-r, -r * w};
    }

    /** (phi/Phi)(-w) (1, w)/sdLog. */
    @Override
    public double[] logSurvivalGradient(double x) {
        if (x == 0) {
            return new double[] {0, 0};
        }
        double w = w(x);
        double r = millsInverse(-w) / sdLog;
        return new double[] {r, r * w};
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof LogNormalDelay l && Double.compare(meanLog, l.meanLog) == 0
                && Double.compare(sdLog, l.sdLog) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Double.hashCode(meanLog) + Double.hashCode(sdLog);
    }

    @Override
    public String toString() {
        return "LogNormalDelay[meanLog=" + meanLog + ", sdLog=" + sdLog + "]";
    }
}
