package org.incipit.distributions;

/**
 * Shared algorithms: quantile by safeguarded Newton, discretisation through partial first
 * moments, log forms. Package-private.
 */
abstract class AbstractDelay implements DelayDistribution {

    /** @return the integral of t f(t) over [0, x]. */
    abstract double lowerPartialMean(double x);

    /** @return the integral of t f(t) over [x, infinity). */
    abstract double upperPartialMean(double x);

    /** First guess for the quantile, refined by {@link #quantile(double)}; may be exact. */
    double quantileGuess(double p) {
        return Double.NaN;
    }

    /** Whether {@link #quantileGuess(double)} is already accurate to a few ulps. */
    boolean quantileGuessExact() {
        return false;
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
        Checks.probability("p", p);
        if (p == 0) {
            return 0;
        }
        if (p == 1) {
            return Double.POSITIVE_INFINITY;
        }
        double x = quantileGuess(p);
        if (quantileGuessExact() && x >= 0) {
            return x;
        }
        // Newton on log F(x) - log p (p <= 1/2) or log S(x) - log(1 - p), inside a bracket.
        boolean lower = p <= 0.5;
        double target = lower ? Math.log(p) : Math.log1p(-p);
        double lo = 0;
        double hi = Double.POSITIVE_INFINITY;
        if (!(x > 0 && x < Double.POSITIVE_INFINITY)) {
            x = mean();
        }
        for (int it = 0; it < 300; it++) {
            double g = lower ? logCdf(x) - target : target - logSurvival(x);
            if (g == 0) {
                return x;
            }
            if (g > 0) {
                hi = x;
            } else {
                lo = x;
            }
            double slope = lower ? Math.exp(logDensity(x) - logCdf(x)) : Math.exp(logDensity(x) - logSurvival(x));
            double xn = x - g / slope;
            if (Math.abs(xn - x) <= 4e-16 * x) {
                return xn;
            }
            if (!(xn > lo && xn < hi)) {
                xn = hi == Double.POSITIVE_INFINITY ? 2 * x + 1 : 0.5 * (lo + hi);
            }
            if (hi < Double.POSITIVE_INFINITY && hi - lo <= 4e-16 * hi) { // bracket closed
                return xn;
            }
            x = xn;
        }
        return x;
    }

    /** F(b) - F(a) for 0 <= a < b, from whichever side avoids cancellation. */
    final double mass(double a, double b) {
        double fa = cdf(a);
        if (fa < 0.5) {
            return cdf(b) - fa;
        }
        return survival(a) - survival(b);
    }

    /** The integral of t f(t) over [a, b], from whichever side avoids cancellation. */
    final double partialMean(double a, double b) {
        double la = lowerPartialMean(a);
        if (la < 0.5 * mean()) {
            return lowerPartialMean(b) - la;
        }
        return upperPartialMean(a) - upperPartialMean(b);
    }

    @Override
    public DailyMasses discretise(int maxDay, Discretisation scheme) {
        Checks.nonNegative("maxDay", maxDay);
        if (scheme == null) {
            throw new IllegalArgumentException("scheme must not be null");
        }
        if (maxDay == Integer.MAX_VALUE) {
            throw new IllegalArgumentException("maxDay must be < " + Integer.MAX_VALUE + ", was " + maxDay);
        }
        double[] m = new double[maxDay + 1];
        if (scheme == Discretisation.DAY_INTERVAL) {
            for (int d = 0; d <= maxDay; d++) {
                m[d] = clamp(mass(d, d + 1.0));
            }
            return new DailyMasses(m, clamp(survival(maxDay + 1.0)));
        }
        // Double censoring: weight 1 - |x - d| on [d - 1, d + 1]. On each [j, j + 1]:
        // B_j = int (x - j) f = M_j - j dF_j and C_j = int (j + 1 - x) f = (j + 1) dF_j - M_j;
        // P(D = d) = C_d + B_(d-1); tail = S(n + 1) + B_n.
        double prevB = 0;
        for (int d = 0; d <= maxDay; d++) {
            double df = mass(d, d + 1.0);
            double pm = partialMean(d, d + 1.0);
            double c = (d + 1.0) * df - pm;
            double b = pm - d * df;
            m[d] = clamp(Math.max(0, c) + prevB);
            prevB = Math.max(0, b);
        }
        return new DailyMasses(m, clamp(survival(maxDay + 1.0) + prevB));
    }

    private static double clamp(double v) {
        return v < 0 ? 0 : Math.min(v, 1);
    }

    static double checkS(double s) {
        return Checks.notNaN("s", s);
    }
}
