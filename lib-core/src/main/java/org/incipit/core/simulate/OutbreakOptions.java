package org.incipit.core.simulate;

import org.incipit.core.branching.OffspringLaw;
import org.incipit.distributions.DelayDistribution;

/**
 * Configuration of {@link OutbreakSimulator}: the offspring law, the delay distributions, the
 * fatality probability, the index cases, the stop rules, conditioning and the exposure
 * recording. Immutable; build with {@link #builder(OffspringLaw, DelayDistribution, DelayDistribution)}.
 *
 * @param offspring           law of the number of people each case infects
 * @param generationInterval  infection of infector to infection of infectee, days
 * @param incubationPeriod    infection to symptom onset, days
 * @param fatalityProbability p in [0, 1]; death with probability p, else recovery
 * @param onsetToDeath        onset to death, days; null if outcomes are not simulated
 * @param onsetToRecovery     onset to recovery, days; null if outcomes are not simulated
 * @param indexCases          number of cases infected at time 0, &ge; 1
 * @param maxCases            stop at the infection of the maxCases-th person, &ge; 1
 * @param maxOnsets           stop at the maxOnsets-th symptom onset, &ge; 1
 *                            ({@code Integer.MAX_VALUE}: no onset rule)
 * @param stopDay             stop at this calendar day (infections at times &ge; stopDay are
 *                            not simulated), &gt; 0, may be +&infin;
 * @param conditionOnSurvival redraw outbreaks that die out before a stop rule is reached
 * @param maxAttempts         cap on draws when conditioning, &ge; 1
 * @param exposures           candidate-exposure recording, or null for none
 */
public record OutbreakOptions(OffspringLaw offspring, DelayDistribution generationInterval,
                              DelayDistribution incubationPeriod, double fatalityProbability,
                              DelayDistribution onsetToDeath, DelayDistribution onsetToRecovery,
                              int indexCases, int maxCases, int maxOnsets, double stopDay,
                              boolean conditionOnSurvival, int maxAttempts, ExposureModel exposures) {

    /** Default {@link #maxCases()}. */
    public static final int DEFAULT_MAX_CASES = 10_000;
    /** Default {@link #maxAttempts()}. */
    public static final int DEFAULT_MAX_ATTEMPTS = 1_000;

    /**
     * Validates.
     *
     * @param offspring           law of the number of people each case infects
     * @param generationInterval  generation-interval distribution
     * @param incubationPeriod    incubation-period distribution
     * @param fatalityProbability p in [0, 1] (0 when outcomes are not simulated)
     * @param onsetToDeath        onset-to-death delay, or null (with onsetToRecovery) for no outcomes
     * @param onsetToRecovery     onset-to-recovery delay, or null
     * @param indexCases          &ge; 1
     * @param maxCases            &ge; 1
     * @param maxOnsets           &ge; 1, {@code Integer.MAX_VALUE} for none
     * @param stopDay             &gt; 0, may be +&infin;
     * @param conditionOnSurvival whether to redraw outbreaks that die out
     * @param maxAttempts         &ge; 1
     * @param exposures           exposure recording, or null
     * @throws IllegalArgumentException if a value is out of range or a required one is null
     */
    public OutbreakOptions {
        if (offspring == null || generationInterval == null || incubationPeriod == null) {
            throw new IllegalArgumentException("offspring, generationInterval and incubationPeriod must not be null");
        }
        if (!(fatalityProbability >= 0 && fatalityProbability <= 1)) {
            throw new IllegalArgumentException("fatalityProbability must be in [0, 1], was " + fatalityProbability);
        }
        if ((onsetToDeath == null) != (onsetToRecovery == null)) {
            throw new IllegalArgumentException("onsetToDeath and onsetToRecovery must both be given or both null");
        }
        if (onsetToDeath == null && fatalityProbability != 0) {
            throw new IllegalArgumentException("fatalityProbability must be 0 when outcomes are not simulated, was "
                + fatalityProbability);
        }
        if (indexCases < 1) {
            throw new IllegalArgumentException("indexCases must be >= 1, was " + indexCases);
        }
        if (maxCases < 1) {
            throw new IllegalArgumentException("maxCases must be >= 1, was " + maxCases);
        }
        if (maxOnsets < 1) {
            throw new IllegalArgumentException("maxOnsets must be >= 1, was " + maxOnsets);
        }
        if (!(stopDay > 0)) {
            throw new IllegalArgumentException("stopDay must be > 0 (or +infinity), was " + stopDay);
        }
        if (maxAttempts < 1) {
            throw new IllegalArgumentException("maxAttempts must be >= 1, was " + maxAttempts);
        }
    }

    /** @return whether deaths and recoveries are simulated. */
    public boolean simulatesOutcomes() {
        return onsetToDeath != null;
    }

    /**
     * Starts a builder with defaults: one index case, no outcomes, {@value #DEFAULT_MAX_CASES}
     * cases at most, no day limit, no conditioning, no exposure recording.
     *
     * @param offspring          offspring law
     * @param generationInterval generation-interval distribution
     * @param incubationPeriod   incubation-period distribution
     * @return a builder
     */
    public static Builder builder(OffspringLaw offspring, DelayDistribution generationInterval,
                                  DelayDistribution incubationPeriod) {
        return new Builder(offspring, generationInterval, incubationPeriod);
    }

    /** Builder of {@link OutbreakOptions}; validation happens in {@link #build()}. Not thread-safe. */
    public static final class Builder {
        private final OffspringLaw offspring;
        private final DelayDistribution generationInterval;
        private final DelayDistribution incubationPeriod;
        private double fatalityProbability;
        private DelayDistribution onsetToDeath;
        private DelayDistribution onsetToRecovery;
        private int indexCases = 1;
        private int maxCases = DEFAULT_MAX_CASES;
        private int maxOnsets = Integer.MAX_VALUE;
        private double stopDay = Double.POSITIVE_INFINITY;
        private boolean conditionOnSurvival;
        private int maxAttempts = DEFAULT_MAX_ATTEMPTS;
        private ExposureModel exposures;

        private Builder(OffspringLaw offspring, DelayDistribution gi, DelayDistribution incubation) {
            this.offspring = offspring;
            this.generationInterval = gi;
            this.incubationPeriod = incubation;
        }

        /**
         * Simulates outcomes: death with probability p at onset + onsetToDeath, else recovery at
         * onset + onsetToRecovery.
         *
         * @param p               fatality probability in [0, 1]
         * @param onsetToDeath    delay distribution
         * @param onsetToRecovery delay distribution
         * @return this builder
         */
        public Builder outcomes(double p, DelayDistribution onsetToDeath, DelayDistribution onsetToRecovery) {
            this.fatalityProbability = p;
            this.onsetToDeath = onsetToDeath;
            this.onsetToRecovery = onsetToRecovery;
            return this;
        }

        /**
         * @param n index cases infected at time 0, &ge; 1
         * @return this builder
         */
        public Builder indexCases(int n) {
            this.indexCases = n;
            return this;
        }

        /**
         * @param n stop at the n-th infection, &ge; 1
         * @return this builder
         */
        public Builder maxCases(int n) {
            this.maxCases = n;
            return this;
        }

        /**
         * Stops at the n-th symptom onset in calendar time; the observation end is then that
         * onset's time. The case limit still applies (raise it if it should not bind).
         *
         * @param n stop at the n-th onset, &ge; 1
         * @return this builder
         */
        public Builder maxOnsets(int n) {
            this.maxOnsets = n;
            return this;
        }

        /**
         * @param day stop at this calendar day, &gt; 0
         * @return this builder
         */
        public Builder stopDay(double day) {
            this.stopDay = day;
            return this;
        }

        /**
         * Conditions on survival by rejection: outbreaks that die out before a stop rule is met
         * are redrawn, at most maxAttempts times in all.
         *
         * @param maxAttempts cap on draws, &ge; 1
         * @return this builder
         */
        public Builder conditionOnSurvival(int maxAttempts) {
            this.conditionOnSurvival = true;
            this.maxAttempts = maxAttempts;
            return this;
        }

        /**
         * @param model candidate-exposure recording (null for none)
         * @return this builder
         */
        public Builder exposures(ExposureModel model) {
            this.exposures = model;
            return this;
        }

        /**
         * @return the options
         * @throws IllegalArgumentException if a value is out of range
         */
        public OutbreakOptions build() {
            return new OutbreakOptions(offspring, generationInterval, incubationPeriod, fatalityProbability,
                onsetToDeath, onsetToRecovery, indexCases, maxCases, maxOnsets, stopDay, conditionOnSurvival,
                maxAttempts, exposures);
        }
    }
}
