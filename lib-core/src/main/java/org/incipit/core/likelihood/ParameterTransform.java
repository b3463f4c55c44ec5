package org.incipit.core.likelihood;

/**
 * A smooth strictly increasing bijection between an unconstrained real {@code u} and a
 * natural parameter {@code x} with a (possibly bounded) domain. Immutable, thread-safe.
 *
 * <p>Transforms: identity ({@code x = u}), log ({@code x = exp(u)}, x &gt; 0), shifted log
 * ({@code x = a + exp(u)}, x &gt; a), logit ({@code x = 1/(1+exp(-u))}, 0 &lt; x &lt; 1) and
 * scaled logit ({@code x = a + (b-a)/(1+exp(-u))}, a &lt; x &lt; b). Common practice for
 * maximum likelihood on bounded parameters (e.g. Pawitan 2001, <i>In All Likelihood</i>, ch. 2).
 */
public final class ParameterTransform {

    private enum Kind { IDENTITY, SHIFTED_LOG, SCALED_LOGIT }

    private static final ParameterTransform IDENTITY =
            new ParameterTransform(Kind.IDENTITY, Double.NEGATIVE_INFINITY, Double.POSITIVE_INFINITY);
    private static final ParameterTransform LOG =
            new ParameterTransform(Kind.SHIFTED_LOG, 0, Double.POSITIVE_INFINITY);
    private static final ParameterTransform LOGIT = new ParameterTransform(Kind.SCALED_LOGIT, 0, 1);

    private final Kind kind;
    private final double lower;
    private final double upper;

    private ParameterTransform(Kind kind, double lower, double upper) {
        this.kind = kind;
        this.lower = lower;
        this.upper = upper;
    }

    /** @return x = u on the whole real line */
    public static ParameterTransform identity() {
        return IDENTITY;
    }

    /** @return x = exp(u), for x &gt; 0 */
    public static ParameterTransform log() {
        return LOG;
    }

    /** @return x = 1/(1+exp(-u)), for 0 &lt; x &lt; 1 */
    public static ParameterTransform logit() {
        return LOGIT;
    }

    /**
     * @param lower finite lower bound
     * @return x = lower + exp(u), for x &gt; lower
     * @throws IllegalArgumentException if lower is not finite
     */
    public static ParameterTransform shiftedLog(double lower) {
        if (!Double.isFinite(lower)) {
            throw new IllegalArgumentException("lower must be finite, was " + lower);
        }
        return lower == 0 ? LOG : new ParameterTransform(Kind.SHIFTED_LOG, lower, Double.POSITIVE_INFINITY);
    }

    /**
     * @param lower finite lower bound
     * @param upper finite upper bound, &gt; lower
     * @return x = lower + (upper-lower)/(1+exp(-u)), for lower &lt; x &lt; upper
     * @throws IllegalArgumentException if a bound is not finite or upper &le; lower
     */
    public static ParameterTransform scaledLogit(double lower, double upper) {
        if (!Double.isFinite(lower) || !Double.isFinite(upper) || !(upper > lower)) {
            throw new IllegalArgumentException("bounds must be finite with lower < upper, were ["
                    + lower + ", " + upper + "]");
        }
        return new ParameterTransform(Kind.SCALED_LOGIT, lower, upper);
    }

    /** @return infimum of the natural domain (may be -&infin;) */
    public double lowerBound() {
        return lower;
    }

    /** @return supremum of the natural domain (may be +&infin;) */
    public double upperBound() {
        return upper;
    }

    /**
     * @param x natural value strictly inside the domain
     * @return u with toNatural(u) = x
     * @throws IllegalArgumentException if x is outside the open domain or NaN
     */
    public double toUnconstrained(double x) {
        if (!(x > lower && x < upper) && !(kind == Kind.IDENTITY && Double.isFinite(x))) {
            throw new IllegalArgumentException("natural value must be in (" + lower + ", " + upper
                    + "), was " + x);
        }
        switch (kind) {
            case IDENTITY:
                return x;
            case SHIFTED_LOG:
                return Math.log(x - lower);
            default:
                double p = (x - lower) / (upper - lower);
                return Math.log(p) - Math.log1p(-p);
        }
    }

    /**
     * @param u unconstrained value
     * @return natural value; may reach a bound in floating point for very large |u|
     */
    public double toNatural(double u) {
        switch (kind) {
            case IDENTITY:
                return u;
            case SHIFTED_LOG:
                return lower + Math.exp(u);
            default:
                return lower + (upper - lower) * logistic(u);
        }
    }

    /**
     * @param u unconstrained value
     * @return dx/du at u, &ge; 0
     */
    public double derivative(double u) {
        switch (kind) {
            case IDENTITY:
                return 1;
            case SHIFTED_LOG:
                return Math.exp(u);
            default:
                double p = logistic(u);
                return (upper - lower) * p * (1 - p);
        }
    }

    /**
     * @param u unconstrained value
     * @return d&sup2;x/du&sup2; at u
     */
    public double secondDerivative(double u) {
        switch (kind) {
            case IDENTITY:
                return 0;
            case SHIFTED_LOG:
                return Math.exp(u);
            default:
                double p = logistic(u);
                return (upper - lower) * p * (1 - p) * (1 - 2 * p);
        }
    }

    private static double logistic(double u) {
        return u >= 0 ? 1 / (1 + Math.exp(-u)) : Math.exp(u) / (1 + Math.exp(u));
    }

    @Override
    public String toString() {
        switch (kind) {
            case IDENTITY:
                return "identity";
            case SHIFTED_LOG:
                return lower == 0 ? "log" : "log(x - " + lower + ")";
            default:
                return lower == 0 && upper == 1 ? "logit" : "logit on (" + lower + ", " + upper + ")";
        }
    }
}
