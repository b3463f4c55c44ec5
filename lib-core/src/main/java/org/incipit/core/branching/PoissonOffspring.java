package org.incipit.core.branching;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.DiscreteSampler;
import org.apache.commons.rng.sampling.distribution.PoissonSampler;

/**
 * Poisson offspring law with mean R: pgf f(s) = exp(R(s &minus; 1)), variance R. Immutable,
 * thread-safe. Made by {@link OffspringLaw#poisson(double)}.
 */
public final class PoissonOffspring extends OffspringLaw {

    PoissonOffspring(double mean) {
        super(mean, Double.POSITIVE_INFINITY);
    }

    @Override
    public String familyName() {
        return "poisson";
    }

    @Override
    public double variance() {
        return mean();
    }

    @Override
    public DiscreteSampler sampler(UniformRandomProvider rng) {
        if (mean() == 0) {
            return () -> 0;
        }
        return PoissonSampler.of(rng, mean());
    }

    @Override
    double complementPgf(double u) {
        return -Math.expm1(-mean() * u);
    }

    @Override
    double chordExcess(double u) {
        // 1 - e^{-Ru} - u = (R - 1) u - (Ru + expm1(-Ru))
        return (mean() - 1) - expTail(mean() * u) / u;
    }

    @Override
    double directPgf(double s) {
        return Math.exp(mean() * (s - 1));
    }

    @Override
    double pgfDerivativeAt(double u) {
        return mean() * Math.exp(-mean() * u);
    }

    @Override
    double logDerivativeRatioAtRoot(double u, double logQ) {
        return logQ; // f'(q) = R f(q) = R q
    }

    @Override
    public String toString() {
        return "PoissonOffspring[mean=" + mean() + "]";
    }
}
