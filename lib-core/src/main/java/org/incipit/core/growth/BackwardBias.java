package org.incipit.core.growth;

/**
 * Reproduction number from the intrinsic generation interval and from its backward-traced
 * (tilted) version used naively; see {@link EulerLotka#backwardBias}.
 *
 * @param rate  growth rate per day
 * @param trueR R from the intrinsic interval, &gt; 0
 * @param naiveR R from the tilted interval taken as intrinsic, &gt; 0
 */
public record BackwardBias(double rate, double trueR, double naiveR) {

    public BackwardBias {
        if (!(trueR > 0 && trueR < Double.POSITIVE_INFINITY)
                || !(naiveR > 0 && naiveR < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("R values must be finite and > 0, were " + trueR
                    + " and " + naiveR);
        }
    }

    /**
     * @return naiveR / trueR = L(r)&sup2; / L(2r) with L(s) = E[e<sup>&minus;sG</sup>]; by the
     *         Cauchy&ndash;Schwarz inequality at most 1 for any r, growth or decline: the naive R
     *         is too small.
     */
    public double ratio() {
        return naiveR / trueR;
    }
}
