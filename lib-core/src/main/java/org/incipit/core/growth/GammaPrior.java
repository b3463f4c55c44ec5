package org.incipit.core.growth;

/**
 * Gamma prior (or posterior) for a reproduction number, shape a and scale b (mean a b,
 * variance a b&sup2;).
 *
 * @param shape a, finite and &gt; 0
 * @param scale b, finite and &gt; 0
 */
public record GammaPrior(double shape, double scale) {

    public GammaPrior {
        if (!(shape > 0 && shape < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("shape must be finite and > 0, was " + shape);
        }
        if (!(scale > 0 && scale < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("scale must be finite and > 0, was " + scale);
        }
    }

    /**
     * @return shape 1, scale 5 (mean 5, sd 5): the vague prior used by Cori et al. 2013,
     *         Am J Epidemiol 178, Methods
     */
    public static GammaPrior vague() {
        return new GammaPrior(1, 5);
    }

    /** @return a &times; b. */
    public double mean() {
        return shape * scale;
    }
}
