package org.incipit.distributions;

/**
 * Integrals over the whole line of exp(E(t)), where t is measured from the mode of a smooth
 * log-concave integrand and
 * E(t) = alpha t - beta t^2/2 - b1 (e^(s1 t) - 1) - b2 (e^(s2 t) - 1), with E(0) = 0 = E'(0).
 *
 * <p>Algorithm: the trapezoidal rule with a fixed step on the whole line, which converges
 * geometrically for integrands analytic in a strip about the real axis (Trefethen &amp; Weideman,
 * "The exponentially convergent trapezoidal rule", SIAM Review 56, 2014, sec. 5). The sum runs
 * outwards from the mode on both sides until E has dropped below -46 (a relative contribution
 * under 1e-20). On the equally spaced nodes e^(s t) is a geometric sequence, so each node costs
 * one exponential; the sequence is re-anchored exactly every 16 nodes to stop rounding drift.
 * Callers choose the step; the accuracy of their choice is checked against the adaptive
 * {@code PeakQuadrature} and against mpmath tables in the tests.
 */
final class SaddleTrapezoid {
    private static final double DROP = -46;
    private static final int MAX_NODES = 4000;
    /** Weight of the exponential part of the map; 0.2 keeps the right side nearly linear. */
    private static final double MU = 0.2; 

    private SaddleTrapezoid() {
    }

    /** @return the integral of exp(E(t)) over the line, or NaN if the sum did not terminate. */
    static double integral(double alpha, double beta, double b1, double s1, double b2, double s2, double h) {
        return h * (1 + side(alpha, beta, b1, s1, b2, s2, h) + side(-alpha, beta, b1, -s1, b2, -s2, h));
    }

    private static double side(double alpha, double beta, double b1, double s1, double b2, double s2, double h) {
        double q1 = Math.exp(s1 * h);
        double q2 = Math.exp(s2 * h);
        double e1 = 1;
        double e2 = 1;
        double sum = 0;
        for (int j = 1; j <= MAX_NODES; j++) {
            double t = j * h;
            if ((j & 15) == 0) {
                e1 = Math.exp(s1 * t);
                e2 = Math.exp(s2 * t);
            } else {
                e1 *= q1;
                e2 *= q2;
            }
            double e = t * (alpha - 0.5 * beta * t) - b1 * (e1 - 1) - b2 * (e2 - 1);
            if (e < DROP) {
                return sum;
            }
            sum += Math.exp(e);
        }
        return Double.NaN;
    }

    /**
     * The integral over the line of exp(E(t)), E(t) = t - w (e^t - 1) - v (e^(t/k) - 1), by the
     * trapezoidal rule in tau with t = len psi(tau), psi(tau) = tau - MU (e^-tau - 1 + tau), MU = 0.2:
     * psi is tau to first order at 0, linear (slope 0.8) for tau to +infinity (where E already falls
     * double-exponentially) and falls double-exponentially for tau to -infinity, so the slow
     * e^t decay of the left tail is reached in a few nodes (the idea of the double-exponential
     * rules, Takahasi &amp; Mori, 1974, applied to one side).
     *
     * @return the integral, or NaN if the sum did not terminate
     */
    static double mappedIntegral(double w, double v, double k, double len, double h) {
        double invK = 1 / k;
        double r = Math.exp(-h);
        double sum = 1;
        for (int dir = -1; dir <= 1; dir += 2) {
            double q = dir > 0 ? r : 1 / r;
            double et = 1; // e^-tau
            boolean done = false;
            for (int j = 1; j <= MAX_NODES; j++) {
                double tau = dir * j * h;
                et = (j & 15) == 0 ? Math.exp(-tau) : et * q;
                double t = len * (tau - MU * (et - 1 + tau));
                double e = t - w * (Math.exp(t) - 1) - v * (Math.exp(t * invK) - 1);
                if (e < DROP) {
                    done = true;
                    break;
                }
                sum += (1 - MU + MU * et) * Math.exp(e);
            }
            if (!done) {
                return Double.NaN;
            }
        }
        return len * h * sum;
    }
}
