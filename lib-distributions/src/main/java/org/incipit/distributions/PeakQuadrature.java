package org.incipit.distributions;

/**
 * Integrals of exp(h(y)) for a unimodal log-integrand h on an interval [a, b] (ends may be
 * infinite), returned on the log scale.
 *
 * <p>Algorithm (common practice): locate the mode p by safeguarded Newton on h'; take the
 * local scale t0 = 1/sqrt(-h''(p)); integrate exp(h(y) - h(p)) with 16-point Gauss-Legendre on
 * geometric panels [0, 2 t0], [2 t0 2^(j-1), 2 t0 2^j] on each side of p until h has dropped by more than
 * 46 (a relative contribution below 1e-20) or the end of the interval is reached. Working
 * relative to h(p) makes the result free of overflow and underflow.
 */
final class PeakQuadrature {

    /** A smooth unimodal log-integrand with first and second derivatives. */
    interface LogIntegrand {
        double value(double y);

        double slope(double y);

        double curvature(double y);
    }

    private static final int N = 16;
    private static final double[] NODE = new double[N];
    private static final double[] WEIGHT = new double[N];
    private static final double DROP = 46;

    static {
        // Gauss-Legendre nodes on [-1, 1] by Newton iteration on P_N (Golub-Welsch not needed).
        for (int i = 0; i < N; i++) {
            double x = Math.cos(Math.PI * (i + 0.75) / (N + 0.5));
            double dp = 0;
            for (int it = 0; it < 100; it++) {
                double p0 = 1;
                double p1 = x;
                for (int k = 2; k <= N; k++) {
                    double p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
                    p0 = p1;
                    p1 = p2;
                }
                dp = N * (x * p1 - p0) / (x * x - 1);
                double dx = p1 / dp;
                x -= dx;
                if (Math.abs(dx) < 1e-16) {
                    break;
                }
            }
            NODE[i] = x;
            WEIGHT[i] = 2 / ((1 - x * x) * dp * dp);
        }
    }

    private PeakQuadrature() {
    }

    /**
     * @return log of the integral of exp(h) over [a, b]; -Infinity if it is 0
     */
    static double logIntegral(LogIntegrand h, double a, double b, double guess) {
        if (!(a < b)) {
            return Double.NEGATIVE_INFINITY;
        }
        double p = mode(h, a, b, guess);
        double hp = h.value(p);
        if (hp == Double.NEGATIVE_INFINITY) {
            return hp;
        }
        double c = -h.curvature(p);
        double t0 = c > 0 ? 1 / Math.sqrt(c) : 1;
        if (!(t0 > 0 && t0 < Double.POSITIVE_INFINITY)) {
            t0 = 1;
        }
        // A mode on an end of [a, b] with a non-zero slope there: the integrand falls off like
        // exp(-|slope| t), which the curvature (possibly ~0 on a nearly linear log-integrand)
        // does not see; panels must start at that e-folding length.
        double slope = Math.abs(h.slope(p));
        if (slope > 0 && 1 / slope < t0) {
            t0 = 1 / slope;
        }
        double sum = side(h, p, hp, b - p, t0, 1) + side(h, p, hp, p - a, t0, -1);
        return hp + Math.log(sum);
    }

    private static double side(LogIntegrand h, double p, double hp, double room, double t0, int dir) {
        if (!(room > 0)) {
            return 0;
        }
        double sum = 0;
        double prev = 0;
        double t = 2 * t0;
        for (int j = 0; j < 1100; j++) {
            double end = Math.min(t, room);
            double mid = 0.5 * (prev + end);
            double half = 0.5 * (end - prev);
            double s = 0;
            for (int i = 0; i < N; i++) {
                double y = p + dir * (mid + half * NODE[i]);
                double v = h.value(y) - hp;
                if (v > -745) {
                    s += WEIGHT[i] * Math.exp(v);
                }
            }
            sum += half * s;
            if (end >= room) {
                break;
            }
            double drop = hp - h.value(p + dir * end);
            if (!(drop <= DROP)) {
                break;
            }
            prev = end;
            t *= 2;
        }
        return sum;
    }

    /** Mode of a unimodal h on [a, b] by Newton steps kept inside a shrinking bracket. */
    static double mode(LogIntegrand h, double a, double b, double guess) {
        if (a > Double.NEGATIVE_INFINITY && h.slope(a) <= 0) {
            return a;
        }
        if (b < Double.POSITIVE_INFINITY && h.slope(b) >= 0) {
            return b;
        }
        double lo = a;
        double hi = b;
        double y = Math.min(Math.max(guess, a), b);
        if (y == a || y == b) {
            y = Double.isInfinite(a) ? (Double.isInfinite(b) ? 0 : b - 1) : (Double.isInfinite(b) ? a + 1 : 0.5 * (a + b));
        }
        for (int it = 0; it < 400; it++) {
            double s = h.slope(y);
            if (s == 0) {
                return y;
            }
            if (s > 0) {
                lo = y;
            } else {
                hi = y;
            }
            double c = h.curvature(y);
            double yn = c < 0 ? y - s / c : Double.NaN;
            if (!(yn > lo && yn < hi)) {
                if (lo > Double.NEGATIVE_INFINITY && hi < Double.POSITIVE_INFINITY) {
                    yn = 0.5 * (lo + hi);
                } else if (hi == Double.POSITIVE_INFINITY) {
                    yn = lo + 2 * Math.max(1, Math.abs(lo));
                } else {
                    yn = hi - 2 * Math.max(1, Math.abs(hi));
                }
            }
            if (Math.abs(yn - y) <= 1e-13 * (1 + Math.abs(y)) || hi - lo <= 1e-13 * (1 + Math.abs(y))) {
                return yn;
            }
            y = yn;
        }
        return y;
    }
}
