package org.incipit.core.inference;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;

/**
 * Ranking of candidate models fitted to the same data by an information criterion, with
 * differences to the best and Akaike weights w_i = exp(-&Delta;_i/2) / &Sigma; exp(-&Delta;_j/2)
 * (Burnham &amp; Anderson 2002, <i>Model Selection and Multimodel Inference</i>, sec. 2.9).
 *
 * @param criterion the criterion used
 * @param ranked    candidates from best (smallest criterion) to worst; unmodifiable
 */
public record ModelComparison(Criterion criterion, List<Ranked> ranked) {

    /** Which criterion ranks the models. */
    public enum Criterion {
        /** {@link InformationCriteria#aic(double, int)} */
        AIC,
        /** {@link InformationCriteria#aicc(double, int, int)} */
        AICC,
        /** {@link InformationCriteria#bic(double, int, int)} */
        BIC
    }

    /**
     * A fitted candidate.
     *
     * @param name          non-blank label
     * @param logLikelihood finite maximised log-likelihood
     * @param parameters    number of estimated parameters, &ge; 0
     * @param observations  n, &ge; 1 (the same for all candidates)
     */
    public record Candidate(String name, double logLikelihood, int parameters, int observations) {
        public Candidate {
            if (name == null || name.isBlank()) {
                throw new IllegalArgumentException("name must be non-blank, was '" + name + "'");
            }
            InformationCriteria.aic(logLikelihood, parameters);
            if (observations < 1) {
                throw new IllegalArgumentException("observations must be >= 1, was " + observations);
            }
        }
    }

    /**
     * @param candidate the candidate
     * @param value     its criterion value
     * @param delta     value minus the best value, &ge; 0 (+&infin; if the value is)
     * @param weight    Akaike weight in [0, 1]
     */
    public record Ranked(Candidate candidate, double value, double delta, double weight) {
    }

    public ModelComparison {
        if (criterion == null || ranked == null || ranked.isEmpty()) {
            throw new IllegalArgumentException("criterion and a non-empty ranking are required");
        }
        ranked = List.copyOf(ranked);
    }

    /**
     * @param criterion  criterion
     * @param candidates one or more candidates with distinct names and equal n
     * @return the comparison
     * @throws IllegalArgumentException if empty, names repeat, or n differs
     */
    public static ModelComparison of(Criterion criterion, List<Candidate> candidates) {
        if (candidates.isEmpty()) {
            throw new IllegalArgumentException("candidates must be non-empty");
        }
        int n = candidates.get(0).observations();
        List<String> names = new ArrayList<>();
        for (Candidate c : candidates) {
            if (c.observations() != n) {
                throw new IllegalArgumentException("all candidates must have the same observations, "
                        + c.name() + " has " + c.observations() + " not " + n);
            }
            if (names.contains(c.name())) {
                throw new IllegalArgumentException("candidate names must be distinct, '" + c.name() + "' repeats");
            }
            names.add(c.name());
        }
        double[] v = new double[candidates.size()];
        double best = Double.POSITIVE_INFINITY;
        for (int i = 0; i < v.length; i++) {
            Candidate c = candidates.get(i);
            v[i] = switch (criterion) {
                case AIC -> InformationCriteria.aic(c.logLikelihood(), c.parameters());
                case AICC -> InformationCriteria.aicc(c.logLikelihood(), c.parameters(), n);
                case BIC -> InformationCriteria.bic(c.logLikelihood(), c.parameters(), n);
            };
            best = Math.min(best, v[i]);
        }
        if (best == Double.POSITIVE_INFINITY) {
            throw new IllegalArgumentException("every candidate has an infinite " + criterion + " (n <= k + 1)");
        }
        double sum = 0;
        for (double x : v) {
            sum += Math.exp(-0.5 * (x - best));
        }
        List<Ranked> r = new ArrayList<>();
        for (int i = 0; i < v.length; i++) {
            r.add(new Ranked(candidates.get(i), v[i], v[i] - best, Math.exp(-0.5 * (v[i] - best)) / sum));
        }
        r.sort(Comparator.comparingDouble(Ranked::value));
        return new ModelComparison(criterion, r);
    }

    /** @return the best candidate */
    public Candidate best() {
        return ranked.get(0).candidate();
    }
}
