package org.incipit.core.simulate;

/**
 * How the candidate exposures of a case came to be recorded (the sampling of exposure
 * histories). In all three, exposures occur in time order and each infects independently with
 * probability p (p<sub>c</sub> for contact category c); the first that infects is the true
 * infection, and symptom onset follows it by an incubation period X ~ H. They differ in which
 * exposures exist and which are recorded, and hence in the probability of being a case that an
 * estimator must divide by. See {@link ExposureModel} for the exact constructions.
 */
public enum ExposureRecording {
    /**
     * An open stream: exposures form a Poisson process of rate &lambda; that goes on until
     * onset; every exposure before onset is recorded, including those after the (unknown)
     * infection. Everyone exposed long enough becomes a case.
     */
    OPEN,
    /**
     * A complete, finite history: the person's whole exposure history is m exposures in a
     * window of given width, all before onset (a history reaching onset is redrawn, see
     * {@link ExposureModel}); all m are recorded; the person is a case only if one of them
     * infects, probability 1 &minus; &prod;(1 &minus; p<sub>c</sub>) (1 &minus; (1 &minus; p)<sup>m</sup>
     * without categories).
     */
    COMPLETE,
    /**
     * A finite exposure period with M exposures in total (M fixed or Poisson), some possibly
     * after onset: the exposures before onset are recorded, together with the total M.
     */
    KNOWN_TOTAL
}
