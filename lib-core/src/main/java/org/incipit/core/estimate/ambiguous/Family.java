package org.incipit.core.estimate.ambiguous;

import java.util.List;

import org.apache.commons.numbers.gamma.Digamma;
import org.apache.commons.numbers.gamma.LogGamma;
import org.apache.commons.numbers.gamma.Trigamma;
import org.apache.commons.statistics.distribution.GammaDistribution;
import org.apache.commons.statistics.distribution.LogNormalDistribution;
import org.apache.commons.statistics.distribution.WeibullDistribution;
import org.incipit.core.likelihood.ParameterTransform;

/**
 * The three families the kernels know, with their unconstrained coordinates
 * (phi1, phi2): gamma (log shape, log rate), Weibull (log shape, log scale), lognormal
 * (meanLog, log sdLog).
 *
 * <p>Gamma and lognormal log-densities are linear in two per-candidate features with
 * coefficients beta(phi): log h(d) = c0 + beta1 u + beta2 f2, u = log d, f2 = d (gamma:
 * c0 = a log b &minus; ln&Gamma;(a), beta = (a &minus; 1, &minus;b)) or f2 = u&sup2; (lognormal:
 * with tau = 1/sigma&sup2;, c0 = &minus;log sigma &minus; log(2 pi)/2 &minus; tau mu&sup2;/2,
 * beta = (tau mu &minus; 1, &minus;tau/2)). Weibull is not, and is evaluated term by term.
 */
enum Family {
    GAMMA("gamma", "shape", "rate"),
    WEIBULL("weibull", "shape", "scale"),
    LOGNORMAL("lognormal", "meanLog", "sdLog");

    private static final double HALF_LOG_TWO_PI = 0.5 * Math.log(2 * Math.PI);

    final String label;
    final String name1;
    final String name2;

    Family(String label, String name1, String name2) {
        this.label = label;
        this.name1 = name1;
        this.name2 = name2;
    }

    static Family byName(String name) {
        for (Family f : values()) {
            if (f.label.equals(name)) {
                return f;
            }
        }
        throw new IllegalArgumentException("family must be one of gamma, weibull, lognormal, was '" + name + "'");
    }

    boolean linear() {
        return this != WEIBULL;
    }

    List<ParameterTransform> transforms() {
        return this == LOGNORMAL ? List.of(ParameterTransform.identity(), ParameterTransform.log())
                : List.of(ParameterTransform.log(), ParameterTransform.log());
    }

    double[] natural(double phi1, double phi2) {
        return this == LOGNORMAL ? new double[] {phi1, Math.exp(phi2)} : new double[] {Math.exp(phi1), Math.exp(phi2)};
    }

    double[] unconstrained(double nat1, double nat2) {
        return this == LOGNORMAL ? new double[] {nat1, Math.log(nat2)} : new double[] {Math.log(nat1), Math.log(nat2)};
    }

    /**
     * Linear coefficients and their derivatives in phi: out = {c0, beta1, beta2,
     * dc0/dphi1, dc0/dphi2, d2c0 11, 12, 22, J11, J12, J21, J22 (J_mk = dbeta_m/dphi_k),
     * d2beta1 11, 12, 22, d2beta2 11, 12, 22}.
     */
    void linearCoefficients(double phi1, double phi2, double[] out) {
        if (this == GAMMA) {
            double a = Math.exp(phi1);
            double b = Math.exp(phi2);
            double psi = Digamma.value(a);
            out[0] = a * phi2 - LogGamma.value(a);
            out[1] = a - 1;
            out[2] = -b;
            out[3] = a * phi2 - a * psi;
            out[4] = a;
            out[5] = a * phi2 - a * psi - a * a * Trigamma.value(a);
            out[6] = a;
            out[7] = 0;
            out[8] = a;
            out[9] = 0;
            out[10] = 0;
            out[11] = -b;
            out[12] = a;
            out[13] = 0;
            out[14] = 0;
            out[15] = 0;
            out[16] = 0;
            out[17] = -b;
        } else if (this == LOGNORMAL) {
            double mu = phi1;
            double tau = Math.exp(-2 * phi2);
            out[0] = -phi2 - HALF_LOG_TWO_PI - 0.5 * tau * mu * mu;
            out[1] = tau * mu - 1;
            out[2] = -0.5 * tau;
            out[3] = -tau * mu;
            out[4] = -1 + tau * mu * mu;
            out[5] = -tau;
            out[6] = 2 * tau * mu;
            out[7] = -2 * tau * mu * mu;
            out[8] = tau;
            out[9] = -2 * tau * mu;
            out[10] = 0;
            out[11] = tau;
            out[12] = 0;
            out[13] = -2 * tau;
            out[14] = 4 * tau * mu;
            out[15] = 0;
            out[16] = 0;
            out[17] = -2 * tau;
        } else {
            throw new IllegalStateException("Weibull has no linear form");
        }
    }

    /** Mean in days of the member with natural parameters (p1, p2). */
    double mean(double p1, double p2) {
        switch (this) {
            case GAMMA:
                return p1 / p2;
            case WEIBULL:
                return p2 * Math.exp(LogGamma.value(1 + 1 / p1));
            default:
                return Math.exp(p1 + 0.5 * p2 * p2);
        }
    }

    /** Standard deviation in days. */
    double sd(double p1, double p2) {
        switch (this) {
            case GAMMA:
                return Math.sqrt(p1) / p2;
            case WEIBULL: {
                double g1 = LogGamma.value(1 + 1 / p1);
                double g2 = LogGamma.value(1 + 2 / p1);
                // Var = scale^2 (Gamma(1+2/k) - Gamma(1+1/k)^2) = scale^2 e^{g2} (1 - e^{2 g1 - g2})
                return p2 * Math.exp(0.5 * g2) * Math.sqrt(-Math.expm1(2 * g1 - g2));
            }
            default:
                return Math.exp(p1 + 0.5 * p2 * p2) * Math.sqrt(Math.expm1(p2 * p2));
        }
    }

    /** Quantile in days. */
    double quantile(double p1, double p2, double prob) {
        switch (this) {
            case GAMMA:
                return GammaDistribution.of(p1, 1 / p2).inverseCumulativeProbability(prob);
            case WEIBULL:
                return WeibullDistribution.of(p1, p2).inverseCumulativeProbability(prob);
            default:
                return LogNormalDistribution.of(p1, p2).inverseCumulativeProbability(prob);
        }
    }

    /** Natural parameters of the member with this mean and sd (for starting values). */
    double[] fromMeanSd(double mean, double sd) {
        double cv = sd / mean;
        switch (this) {
            case GAMMA: {
                double a = 1 / (cv * cv);
                return new double[] {a, a / mean};
            }
            case WEIBULL: {
                double k = Math.max(0.2, Math.min(50, 1.2 / cv)); // rough inverse of cv(k) ~ 1.2/k (common practice)
                return new double[] {k, mean / Math.exp(LogGamma.value(1 + 1 / k))};
            }
            default: {
                double s2 = Math.log1p(cv * cv);
                return new double[] {Math.log(mean) - 0.5 * s2, Math.sqrt(s2)};
            }
        }
    }
}
