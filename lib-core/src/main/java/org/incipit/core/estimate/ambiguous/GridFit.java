package org.incipit.core.estimate.ambiguous;

import java.util.List;

import org.incipit.core.inference.Estimate;

/**
 * Nonparametric EM estimate of H on a grid of equal bins, with the transmission probabilities,
 * under the open exposure history.
 *
 * @param history       the exposure-history model used (always {@link ExposureHistory#open()})
 * @param binWidth      bin width in days
 * @param masses        probability of each bin [b w, (b + 1) w) (copied in and out)
 * @param categories    category labels
 * @param transmission  p per category, bootstrap percentile intervals
 * @param mean          mean of H (uniform within bins), bootstrap percentile interval
 * @param sd            standard deviation of H (uniform within bins), bootstrap percentile interval
 * @param logLikelihood log-likelihood at the EM fixed point (histogram density)
 * @param iterations    EM iterations used
 * @param converged     true if the relative log-likelihood change fell below the tolerance
 * @param tolerance     the convergence tolerance on |&Delta;l| / (1 + |l|)
 * @param cases         number of cases
 * @param replicates    successful bootstrap replicates
 * @param failed        failed bootstrap replicates (EM not converged within the iteration limit)
 */
public record GridFit(ExposureHistory history, double binWidth, double[] masses, List<String> categories,
                      List<Estimate> transmission, Estimate mean, Estimate sd, double logLikelihood, int iterations,
                      boolean converged, double tolerance, int cases, int replicates, int failed) {

    /** Validates and copies. */
    public GridFit {
        if (history == null || masses == null || mean == null || sd == null) {
            throw new IllegalArgumentException("history, masses, mean and sd must not be null");
        }
        if (!(binWidth > 0 && binWidth < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("binWidth must be finite and > 0, was " + binWidth);
        }
        masses = masses.clone();
        categories = List.copyOf(categories);
        transmission = List.copyOf(transmission);
        if (categories.size() != transmission.size()) {
            throw new IllegalArgumentException("one transmission estimate per category");
        }
    }

    @Override
    public double[] masses() {
        return masses.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof GridFit g && history.equals(g.history) && binWidth == g.binWidth
                && java.util.Arrays.equals(masses, g.masses) && categories.equals(g.categories)
                && transmission.equals(g.transmission) && mean.equals(g.mean) && sd.equals(g.sd)
                && Double.compare(logLikelihood, g.logLikelihood) == 0 && iterations == g.iterations
                && converged == g.converged && tolerance == g.tolerance && cases == g.cases
                && replicates == g.replicates && failed == g.failed;
    }

    @Override
    public int hashCode() {
        return java.util.Objects.hash(history, binWidth, java.util.Arrays.hashCode(masses), transmission, mean, sd,
                logLikelihood, iterations);
    }

    @Override
    public String toString() {
        return "GridFit[binWidth=" + binWidth + ", bins=" + masses.length + ", p=" + transmission + ", mean=" + mean
                + ", sd=" + sd + ", logLikelihood=" + logLikelihood + ", iterations=" + iterations + ", converged="
                + converged + "]";
    }
}
