package org.incipit.core.inference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.List;

import org.junit.jupiter.api.Test;

/**
 * Definitions: Akaike (1974), Hurvich &amp; Tsai (1989), Schwarz (1978); Akaike weights from
 * Burnham &amp; Anderson (2002), sec. 2.9 (formulas from memory; values by hand).
 */
class InformationCriteriaTest {

    @Test
    void definitions() {
        assertEquals(2 * 3 + 2 * 100.5, InformationCriteria.aic(-100.5, 3), 1e-12);
        assertEquals(2 * 3 + 2 * 100.5 + 2.0 * 3 * 4 / (20 - 3 - 1), InformationCriteria.aicc(-100.5, 3, 20), 1e-12);
        assertEquals(3 * Math.log(20) + 2 * 100.5, InformationCriteria.bic(-100.5, 3, 20), 1e-12);
        assertEquals(Double.POSITIVE_INFINITY, InformationCriteria.aicc(-1, 3, 4));
        assertThrows(IllegalArgumentException.class, () -> InformationCriteria.aic(Double.NaN, 1));
    }

    @Test
    void rankingDeltasAndWeights() {
        ModelComparison c = ModelComparison.of(ModelComparison.Criterion.AIC, List.of(
                new ModelComparison.Candidate("gamma", -50, 2, 30),
                new ModelComparison.Candidate("weibull", -49, 2, 30),
                new ModelComparison.Candidate("exponential", -52, 1, 30)));
        assertEquals("weibull", c.best().name());
        // AIC: weibull 102, gamma 104, exponential 106 -> deltas 0, 2, 4
        assertEquals(List.of("weibull", "gamma", "exponential"),
                c.ranked().stream().map(r -> r.candidate().name()).toList());
        assertEquals(2, c.ranked().get(1).delta(), 1e-12);
        double s = 1 + Math.exp(-1) + Math.exp(-2);
        assertEquals(1 / s, c.ranked().get(0).weight(), 1e-15);
        assertEquals(Math.exp(-2) / s, c.ranked().get(2).weight(), 1e-15);
        assertThrows(IllegalArgumentException.class, () -> ModelComparison.of(ModelComparison.Criterion.BIC, List.of(
                new ModelComparison.Candidate("a", -1, 1, 10), new ModelComparison.Candidate("b", -1, 1, 11))));
    }
}
