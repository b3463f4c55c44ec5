package org.incipit.core.estimate.ambiguous;

import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;

/**
 * Moment estimates for ambiguous starts under an open Poisson stream of exposures
 * (docs/methods.md, section 2), with nonparametric bootstrap percentile intervals.
 *
 * <p>The moment equations can be solved by values outside the parameter space: a negative
 * variance of H, or q/p &lt; 0 (p outside (0, 1]). These are reported, not hidden:
 * {@link #status()} says which, {@link #message()} gives the raw values, and the estimates hold
 * the raw solution of the equations (so {@link #variance()} may be negative and {@link #p()}
 * above 1). Only where no solution exists (no second candidate anywhere, so the exposure rate
 * is 0, or a non-positive mean) does the estimator throw {@link EstimationException}.
 *
 * @param rate      exposure rate lambda per day, &Sigma;(m &minus; 1) / &Sigma; D_1
 * @param mean      mean of H in days
 * @param variance  variance of H in days&sup2; (raw solution; may be negative, see status)
 * @param p         transmission probability (raw solution; may lie outside (0, 1], see status)
 * @param status    whether the solution lies inside the parameter space
 * @param message   human-readable account of the status, with the raw values
 * @param cases     number of cases
 * @param replicates successful bootstrap replicates
 * @param failed    failed bootstrap replicates (a replicate fails when it has no second candidate)
 */
public record MomentFit(Estimate rate, Estimate mean, Estimate variance, Estimate p, Status status, String message,
                        int cases, int replicates, int failed) {

    /** Where the moment solution lies. */
    public enum Status {
        /** Variance &gt; 0 and p in (0, 1]. */
        OK,
        /** The equations give a variance &le; 0 for H. */
        NEGATIVE_VARIANCE,
        /** The equations give q/p &lt; 0, i.e. p outside (0, 1]. */
        P_OUTSIDE_UNIT_INTERVAL,
        /** Both a variance &le; 0 and p outside (0, 1]. */
        NEGATIVE_VARIANCE_AND_P_OUTSIDE
    }

    /** Validates. */
    public MomentFit {
        if (rate == null || mean == null || variance == null || p == null || status == null || message == null) {
            throw new IllegalArgumentException("components must not be null");
        }
        if (cases < 1 || replicates < 0 || failed < 0) {
            throw new IllegalArgumentException("cases must be >= 1, replicate counts >= 0; were " + cases + ", "
                    + replicates + ", " + failed);
        }
    }

    /**
     * @return the standard deviation of H in days, with the bootstrap interval of the variance
     *         mapped by the square root (lower bound clipped at 0)
     * @throws EstimationException if the variance estimate is not positive
     */
    public Estimate sd() {
        if (!(variance.estimate() > 0)) {
            throw new EstimationException("no standard deviation: the moment variance of H is " + variance.estimate());
        }
        return new Estimate(Math.sqrt(variance.estimate()), Math.sqrt(Math.max(0, variance.lower())),
                Math.sqrt(variance.upper()), variance.level(), variance.method());
    }
}
