package org.incipit.core.inference;

/**
 * Information criteria of a maximised log-likelihood.
 *
 * <p>AIC = 2k &minus; 2l (Akaike 1974); AICc = AIC + 2k(k+1)/(n&minus;k&minus;1) (Hurvich &amp;
 * Tsai 1989), +&infin; when n &le; k + 1; BIC = k ln n &minus; 2l (Schwarz 1978).
 */
public final class InformationCriteria {

    private InformationCriteria() {
    }

    /**
     * @param logLikelihood finite maximised log-likelihood
     * @param parameters    k &ge; 0
     * @return AIC
     */
    public static double aic(double logLikelihood, int parameters) {
        check(logLikelihood, parameters, 1);
        return 2.0 * parameters - 2 * logLikelihood;
    }

    /**
     * @param logLikelihood finite maximised log-likelihood
     * @param parameters    k &ge; 0
     * @param observations  n &ge; 1
     * @return AICc, or +&infin; if n &le; k + 1
     */
    public static double aicc(double logLikelihood, int parameters, int observations) {
        check(logLikelihood, parameters, observations);
        if (observations <= parameters + 1) {
            return Double.POSITIVE_INFINITY;
        }
        return aic(logLikelihood, parameters)
                + 2.0 * parameters * (parameters + 1) / (observations - parameters - 1.0);
    }

    /**
     * @param logLikelihood finite maximised log-likelihood
     * @param parameters    k &ge; 0
     * @param observations  n &ge; 1
     * @return BIC
     */
    public static double bic(double logLikelihood, int parameters, int observations) {
        check(logLikelihood, parameters, observations);
        return parameters * Math.log(observations) - 2 * logLikelihood;
    }

    private static void check(double ll, int k, int n) {
        if (!Double.isFinite(ll)) {
            throw new IllegalArgumentException("logLikelihood must be finite, was " + ll);
        }
        if (k < 0) {
            throw new IllegalArgumentException("parameters must be >= 0, was " + k);
        }
        if (n < 1) {
            throw new IllegalArgumentException("observations must be >= 1, was " + n);
        }
    }
}
