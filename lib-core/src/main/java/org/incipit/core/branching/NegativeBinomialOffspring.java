package org.incipit.core.branching;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.AhrensDieterMarsagliaTsangGammaSampler;
import org.apache.commons.rng.sampling.distribution.DiscreteSampler;
import org.apache.commons.rng.sampling.distribution.PoissonSampler;
import org.apache.commons.rng.sampling.distribution.SharedStateContinuousSampler;
import org.apache.commons.rng.sampling.distribution.ZigguratSampler;

/**
 * Negative binomial offspring law with mean R and dispersion k: pgf
 * f(s) = (1 + R(1 &minus; s)/k)<sup>&minus;k</sup>, variance R + R&sup2;/k. Immutable,
 * thread-safe. Made by {@link OffspringLaw#negativeBinomial(double, double)}.
 */
public final class NegativeBinomialOffspring extends OffspringLaw {

    /** Poisson means above this are drawn from a rounded normal approximation (never reached in practice). */
    private static final double MAX_POISSON_MEAN = 1e9;

    /** Laws with mean below this are sampled by inversion, above by the gamma-Poisson mixture. */
    private static final double INVERSION_MAX_MEAN = 50;

    private final double dispersion;

    NegativeBinomialOffspring(double mean, double dispersion) {
        super(mean, dispersion);
        this.dispersion = dispersion;
    }

    /** @return the dispersion k &gt; 0. */
    public double dispersion() {
        return dispersion;
    }

    @Override
    public String familyName() {
        return "negative-binomial";
    }

    @Override
    public double variance() {
        return mean() + mean() * mean() / dispersion;
    }

    @Override
    public DiscreteSampler sampler(UniformRandomProvider rng) {
        if (mean() == 0) {
            return () -> 0;
        }
        SharedStateContinuousSampler gamma =
            AhrensDieterMarsagliaTsangGammaSampler.of(rng, dispersion, mean() / dispersion);
        DiscreteSampler mixture = () -> {
            double lambda = gamma.sample();
            if (!(lambda > 0)) {
                return 0;
            }
            if (lambda > MAX_POISSON_MEAN) {
                // Poisson(lambda) ~ N(lambda, lambda) to relative error 1/sqrt(lambda) < 3e-5.
                double z = ZigguratSampler.NormalizedGaussian.of(rng).sample();
                return (int) Math.min(Integer.MAX_VALUE, Math.round(lambda + Math.sqrt(lambda) * z));
            }
            return PoissonSampler.of(rng, lambda).sample();
        };
        if (mean() >= INVERSION_MAX_MEAN) {
            return mixture;
        }
        // Inversion by sequential search (Devroye 1986, Non-Uniform Random Variate Generation,
        // sec. III.2 and X.4): P(0) = (k/(k+R))^k, P(n+1) = P(n) (n+k)/(n+1) R/(k+R).
        // Expected work R + 1 steps; one uniform per draw. If the summed masses stall below u
        // (u within rounding of 1), the gamma-Poisson mixture draws instead.
        double p0 = Math.exp(-dispersion * Math.log1p(mean() / dispersion));
        double ratio = mean() / (dispersion + mean());
        double k = dispersion;
        return () -> {
            double u = rng.nextDouble();
            double p = p0;
            double cdf = p0;
            int n = 0;
            while (u > cdf) {
                p *= (n + k) / (n + 1) * ratio;
                n++;
                double next = cdf + p;
                if (next == cdf) {
                    return mixture.sample();
                }
                cdf = next;
            }
            return n;
        };
    }

    @Override
    double complementPgf(double u) {
        // 1 - (1 + R u / k)^(-k) = -expm1(-k log1p(R u / k))
        return -Math.expm1(-dispersionOf() * Math.log1p(mean() * u / dispersionOf()));
    }

    @Override
    double chordExcess(double u) {
        // with a = Ru/k, L = log1p(a), c = 1 - e^{-kL}:
        // c - u = (R - 1) u - (k a - c) and k a - c = k (a - L) + (kL + expm1(-kL))
        double k = dispersionOf();
        double a = mean() * u / k;
        double l = Math.log1p(a);
        return (mean() - 1) - (k * logTail(a) + expTail(k * l)) / u;
    }

    @Override
    double directPgf(double s) {
        return Math.exp(-dispersionOf() * Math.log1p(mean() * (1 - s) / dispersionOf()));
    }

    @Override
    double pgfDerivativeAt(double u) {
        double k = dispersionOf();
        return mean() * Math.exp(-(k + 1) * Math.log1p(mean() * u / k));
    }

    @Override
    double logDerivativeRatioAtRoot(double u, double logQ) {
        // f'(s) = R f(s) / (1 + R(1-s)/k), and f(q) = q
        return logQ - Math.log1p(mean() * u / dispersionOf());
    }

    @Override
    public String toString() {
        return "NegativeBinomialOffspring[mean=" + mean() + ", dispersion=" + dispersion + "]";
    }
}
