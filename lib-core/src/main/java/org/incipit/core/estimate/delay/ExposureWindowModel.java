package org.incipit.core.estimate.delay;

/**
 * How the time of infection is distributed inside an exposure window [a, b], for
 * {@link IncubationEstimator}. With onset o and incubation density f:
 * <ul>
 *   <li>{@link #intervalCensored()}: the incubation period is only known to lie in
 *       [o &minus; b, o &minus; a]: log[F(o &minus; a) &minus; F(o &minus; b)];</li>
 *   <li>{@link #uniform()}: exposure uniform in the window, density of the onset
 *       (1/(b &minus; a)) &int;<sub>a</sub><sup>b</sup> f(o &minus; e) de =
 *       [F(o &minus; a) &minus; F(o &minus; b)] / (b &minus; a). This differs from the interval-censored
 *       form by the constant &minus;log(b &minus; a) only: the estimates coincide, the
 *       log-likelihoods (and so AIC across data with exact exposures) do not;</li>
 *   <li>{@link #growing(double)}: exposure density &prop; exp(r e) inside the window (exposure
 *       to a growing epidemic): r e<sup>ro</sup> / (e<sup>rb</sup> &minus; e<sup>ra</sup>)
 *       &int;<sub>o&minus;b</sub><sup>o&minus;a</sup> e<sup>&minus;rx</sup> f(x) dx.</li>
 * </ul>
 * An exact exposure (a = b) contributes log f(o &minus; a) under every model.
 *
 * @param kind       the model
 * @param growthRate r per day for {@link Kind#GROWING}, 0 otherwise
 */
public record ExposureWindowModel(Kind kind, double growthRate) {

    /** The three models. */
    public enum Kind {
        /** Interval-censored incubation period. */
        INTERVAL_CENSORED,
        /** Exposure uniform in the window. */
        UNIFORM,
        /** Exposure density proportional to exp(r e). */
        GROWING
    }

    public ExposureWindowModel {
        if (kind == null) {
            throw new IllegalArgumentException("kind must not be null");
        }
        if (kind == Kind.GROWING ? !(Double.isFinite(growthRate) && growthRate != 0) : growthRate != 0) {
            throw new IllegalArgumentException("growthRate must be finite and non-zero for GROWING (use UNIFORM for"
                    + " r = 0) and 0 otherwise, was " + growthRate + " for " + kind);
        }
    }

    /** @return the interval-censored model */
    public static ExposureWindowModel intervalCensored() {
        return new ExposureWindowModel(Kind.INTERVAL_CENSORED, 0);
    }

    /** @return exposure uniform in the window */
    public static ExposureWindowModel uniform() {
        return new ExposureWindowModel(Kind.UNIFORM, 0);
    }

    /**
     * @param growthRate r per day, finite and non-zero
     * @return exposure density proportional to exp(r e) in the window
     */
    public static ExposureWindowModel growing(double growthRate) {
        return new ExposureWindowModel(Kind.GROWING, growthRate);
    }
}
