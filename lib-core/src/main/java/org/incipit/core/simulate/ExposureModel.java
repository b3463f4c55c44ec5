package org.incipit.core.simulate;

import java.util.Arrays;

/**
 * How candidate exposures are generated and recorded for each case: a regime
 * ({@link ExposureRecording}), the per-exposure infection probability (optionally per contact
 * category) and the regime's timing parameters. Immutable, thread-safe.
 *
 * <h2>Constructions</h2>
 * Exposure histories are generated per case, independently of the transmission tree: the tree
 * fixes the infection time t and the onset t + X; the exposures are placed around t so that
 * the infecting exposure is at exactly t. Write p&#772; = &Sigma;<sub>c</sub> w<sub>c</sub>
 * p<sub>c</sub> for the chance that an exposure infects (w<sub>c</sub> the category weights;
 * one category with p<sub>1</sub> = p when none are given). Each exposure independently has
 * category c and infects with probability w<sub>c</sub> p<sub>c</sub>.
 * <ul>
 * <li>{@link ExposureRecording#OPEN}: the number F of failed exposures before the infecting one
 * is geometric, P(F = f) = (1 &minus; p&#772;)<sup>f</sup> p&#772; (so J = F + 1 is the index of
 * the infecting exposure); they lie at t &minus; G<sub>1</sub>, t &minus; G<sub>1</sub> &minus;
 * G<sub>2</sub>, &hellip; with G<sub>i</sub> ~ Exp(&lambda;), their categories drawn in
 * proportion to w<sub>c</sub>(1 &minus; p<sub>c</sub>), the infecting one's in proportion to
 * w<sub>c</sub> p<sub>c</sub>. Exposures go on as a Poisson process of rate &lambda; on (t, t + X)
 * with categories in proportion to w<sub>c</sub>. All exposures before onset are recorded; the
 * expected number is 1/p&#772; + &lambda; E[X]. Given the first candidate, the candidate times
 * have density &lambda;<sup>n&minus;1</sup> e<sup>&minus;&lambda;(onset &minus; e<sub>1</sub>)</sup>
 * whichever candidate infected, so the likelihood in the infecting index is
 * &Sigma;<sub>j</sub> &prod;<sub>l&lt;j</sub>(1 &minus; p(c<sub>l</sub>))
 * p(c<sub>j</sub>) h(onset &minus; e<sub>j</sub>), with no normaliser.</li>
 * <li>{@link ExposureRecording#COMPLETE} and {@link ExposureRecording#KNOWN_TOTAL}: a history of
 * M exposures (M = m fixed, or Poisson(&mu;) for KNOWN_TOTAL) at window-start + w U<sub>(i)</sub>,
 * U<sub>(1)</sub> &le; &hellip; &le; U<sub>(M)</sub> sorted uniforms on [0, 1) and w the window
 * width; categories and infection flags are drawn in time order and the history is kept only
 * if some exposure infects (rejection: the sample is conditioned on being a case). The window
 * start is taken uniform on the calendar (translation invariance), so that, given the
 * infection time t, the history is simply shifted to put the infecting exposure J at t:
 * e<sub>i</sub> = t + w (U<sub>(i)</sub> &minus; U<sub>(J)</sub>). Because the onset is drawn as
 * t + X with no selection on X, the likelihood is exactly
 * &Sigma;<sub>j</sub> p(1 &minus; p)<sup>j&minus;1</sup> h(onset &minus; e<sub>j</sub>) /
 * (1 &minus; (1 &minus; p)<sup>M</sup>) (with categories, the product form over
 * 1 &minus; &prod;<sub>i</sub>(1 &minus; p(c<sub>i</sub>))).
 * COMPLETE records all M exposures and, as the {@code complete} exposure history of the
 * estimators defines it, they all precede onset: a history whose last exposure falls at or after
 * the onset t + X is redrawn (categories, infection flags and positions; X, fixed by the
 * transmission tree, is not), so the sample is conditioned on "a case, with every exposure
 * before onset". Given X = x that event has probability A(x) = 1 &minus; (1 &minus; p)<sup>M</sup>
 * whenever x &ge; w (every later exposure lies within w of the infection) and less for shorter
 * x, so the likelihood is &Sigma;<sub>j</sub> p(1 &minus; p)<sup>j&minus;1</sup>
 * h(d<sub>j</sub>) / A(d<sub>j</sub>): exactly the complete form for a case whose
 * candidate durations d<sub>j</sub> = onset &minus; e<sub>j</sub> are all &ge; w, which holds
 * whenever its incubation period is at least 2w (d<sub>j</sub> &ge; x &minus; w). Choose w
 * small against the incubation period (P(X &lt; 2w) small; w = 0: all exposures at one
 * instant) for data on which the complete normaliser is right; with a wide window the
 * conditioning favours short durations and the complete fit is biased.
 * KNOWN_TOTAL records the exposures before onset and the
 * total M; the ones after onset could not have infected and do not enter the sum.</li>
 * </ul>
 */
public final class ExposureModel {

    private final ExposureRecording recording;
    private final double[] categoryWeights;       // normalised, sum 1
    private final double[] infectionProbabilities;
    private final double rate;                    // OPEN: exposures per day
    private final int exposures;                  // COMPLETE / KNOWN_TOTAL fixed M; 0 if Poisson
    private final double meanExposures;           // KNOWN_TOTAL Poisson mean; 0 if fixed
    private final double window;                  // COMPLETE / KNOWN_TOTAL, days

    private ExposureModel(ExposureRecording recording, double[] weights, double[] probabilities,
                          double rate, int exposures, double meanExposures, double window) {
        this.recording = recording;
        this.categoryWeights = weights;
        this.infectionProbabilities = probabilities;
        this.rate = rate;
        this.exposures = exposures;
        this.meanExposures = meanExposures;
        this.window = window;
    }

    /**
     * Open stream: a Poisson process of exposures, rate &lambda;, until onset.
     *
     * @param infectionProbability p in (0, 1]
     * @param ratePerDay           &lambda; &gt; 0, finite, exposures per day
     * @return the model
     * @throws IllegalArgumentException if a parameter is out of range
     */
    public static ExposureModel open(double infectionProbability, double ratePerDay) {
        checkProbability("infectionProbability", infectionProbability);
        if (!(ratePerDay > 0 && ratePerDay < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("ratePerDay must be finite and > 0, was " + ratePerDay);
        }
        return new ExposureModel(ExposureRecording.OPEN, new double[] {1},
            new double[] {infectionProbability}, ratePerDay, 0, 0, 0);
    }

    /**
     * Complete history of m exposures in a window of width w days, all before onset (histories
     * reaching onset are redrawn, see the class comment); all are recorded.
     *
     * @param infectionProbability p in (0, 1]
     * @param exposures            m &ge; 1
     * @param windowDays           w, finite and &ge; 0
     * @return the model
     * @throws IllegalArgumentException if a parameter is out of range
     */
    public static ExposureModel complete(double infectionProbability, int exposures, double windowDays) {
        checkProbability("infectionProbability", infectionProbability);
        checkCount(exposures);
        checkWindow(windowDays);
        return new ExposureModel(ExposureRecording.COMPLETE, new double[] {1},
            new double[] {infectionProbability}, 0, exposures, 0, windowDays);
    }

    /**
     * Known total: M = m exposures in a window of width w days; those before onset are
     * recorded, with the total m.
     *
     * @param infectionProbability p in (0, 1]
     * @param exposures            m &ge; 1
     * @param windowDays           w, finite and &ge; 0
     * @return the model
     * @throws IllegalArgumentException if a parameter is out of range
     */
    public static ExposureModel knownTotal(double infectionProbability, int exposures, double windowDays) {
        checkProbability("infectionProbability", infectionProbability);
        checkCount(exposures);
        checkWindow(windowDays);
        return new ExposureModel(ExposureRecording.KNOWN_TOTAL, new double[] {1},
            new double[] {infectionProbability}, 0, exposures, 0, windowDays);
    }

    /**
     * Known total with M ~ Poisson(&mu;) exposures per person (before selection on being a case;
     * among cases M follows the size-biased law P(M = m)(1 &minus; (1 &minus; p)<sup>m</sup>) /
     * (1 &minus; e<sup>&minus;&mu;p</sup>)).
     *
     * @param infectionProbability p in (0, 1]
     * @param meanExposures        &mu;, finite and &gt; 0
     * @param windowDays           w, finite and &ge; 0
     * @return the model
     * @throws IllegalArgumentException if a parameter is out of range
     */
    public static ExposureModel knownPoissonTotal(double infectionProbability, double meanExposures,
                                                  double windowDays) {
        checkProbability("infectionProbability", infectionProbability);
        if (!(meanExposures > 0 && meanExposures < 1e8)) {
            throw new IllegalArgumentException("meanExposures must be in (0, 1e8), was " + meanExposures);
        }
        checkWindow(windowDays);
        return new ExposureModel(ExposureRecording.KNOWN_TOTAL, new double[] {1},
            new double[] {infectionProbability}, 0, 0, meanExposures, windowDays);
    }

    /**
     * The same model with contact categories: an exposure is of category c with probability
     * proportional to {@code weights[c]} and then infects with probability
     * {@code infectionProbabilities[c]}. Replaces the single infection probability.
     *
     * @param weights                non-negative, finite, positive sum; copied
     * @param infectionProbabilities in [0, 1], same length, with &Sigma; w<sub>c</sub> p<sub>c</sub> &gt; 0; copied
     * @return a new model
     * @throws IllegalArgumentException if the arrays are empty, differ in length or hold bad values
     */
    public ExposureModel withCategories(double[] weights, double[] infectionProbabilities) {
        if (weights.length == 0 || weights.length != infectionProbabilities.length) {
            throw new IllegalArgumentException("weights and infectionProbabilities must be non-empty and of equal "
                + "length, were " + weights.length + " and " + infectionProbabilities.length);
        }
        double sum = 0;
        double infecting = 0;
        for (int c = 0; c < weights.length; c++) {
            if (!(weights[c] >= 0 && weights[c] < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("weights[" + c + "] must be finite and >= 0, was " + weights[c]);
            }
            double p = infectionProbabilities[c];
            if (!(p >= 0 && p <= 1)) {
                throw new IllegalArgumentException("infectionProbabilities[" + c + "] must be in [0, 1], was " + p);
            }
            sum += weights[c];
            infecting += weights[c] * p;
        }
        if (!(infecting > 0)) {
            throw new IllegalArgumentException("sum of weights[c] * infectionProbabilities[c] must be > 0, was " + infecting);
        }
        double[] w = new double[weights.length];
        for (int c = 0; c < w.length; c++) {
            w[c] = weights[c] / sum;
        }
        return new ExposureModel(recording, w, infectionProbabilities.clone(), rate, exposures,
            meanExposures, window);
    }

    /** @return the recording regime. */
    public ExposureRecording recording() {
        return recording;
    }

    /** @return the number of contact categories (1 without categories). */
    public int categories() {
        return categoryWeights.length;
    }

    /** @return category probabilities w<sub>c</sub>, normalised to sum 1 (copy). */
    public double[] categoryWeights() {
        return categoryWeights.clone();
    }

    /** @return per-category infection probabilities p<sub>c</sub> (copy). */
    public double[] infectionProbabilities() {
        return infectionProbabilities.clone();
    }

    /** @return p&#772; = &Sigma; w<sub>c</sub> p<sub>c</sub>, the chance that one exposure infects. */
    public double meanInfectionProbability() {
        double s = 0;
        for (int c = 0; c < categoryWeights.length; c++) {
            s += categoryWeights[c] * infectionProbabilities[c];
        }
        return s;
    }

    /** @return OPEN: exposure rate &lambda; per day; 0 for the other regimes. */
    public double ratePerDay() {
        return rate;
    }

    /** @return fixed number of exposures m (COMPLETE, KNOWN_TOTAL); 0 if open or Poisson. */
    public int exposures() {
        return exposures;
    }

    /** @return Poisson mean &mu; of the total (KNOWN_TOTAL); 0 otherwise. */
    public double meanExposures() {
        return meanExposures;
    }

    /** @return window width w in days (COMPLETE, KNOWN_TOTAL); 0 for OPEN. */
    public double windowDays() {
        return window;
    }

    double[] weightsInternal() {
        return categoryWeights;
    }

    double[] probabilitiesInternal() {
        return infectionProbabilities;
    }

    private static void checkProbability(String name, double p) {
        if (!(p > 0 && p <= 1)) {
            throw new IllegalArgumentException(name + " must be in (0, 1], was " + p);
        }
    }

    private static void checkCount(int m) {
        if (m < 1) {
            throw new IllegalArgumentException("exposures must be >= 1, was " + m);
        }
    }

    private static void checkWindow(double w) {
        if (!(w >= 0 && w < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("windowDays must be finite and >= 0, was " + w);
        }
    }

    @Override
    public String toString() {
        return "ExposureModel[" + recording + ", weights=" + Arrays.toString(categoryWeights)
            + ", p=" + Arrays.toString(infectionProbabilities) + ", rate=" + rate + ", m=" + exposures
            + ", mu=" + meanExposures + ", window=" + window + "]";
    }
}
