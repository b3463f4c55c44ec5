package org.incipit.core.growth;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.apache.commons.numbers.gamma.Digamma;
import org.apache.commons.numbers.gamma.Trigamma;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

class LogLinearGlmTest {

    // Recurrence psi(x + 1) = psi(x) + 1/x (Abramowitz & Stegun 6.3.5) and
    // psi'(x + 1) = psi'(x) - 1/x^2 (A&S 6.4.6) against commons-numbers Digamma / Trigamma.
    // Cancellation in the reference difference limits agreement to ~1e-13 absolute.
    @ParameterizedTest
    @ValueSource(doubles = {0.05, 0.7, 3.2, 8.1, 40, 1e4})
    void shiftedPolygammaSums(double k) {
        for (int y = 0; y <= 40; y++) {
            double dig = Digamma.value(y + k) - Digamma.value(k);
            double tri = Trigamma.value(y + k) - Trigamma.value(k);
            double scale = Math.max(1, Math.abs(Digamma.value(k)));
            assertEquals(dig, LogLinearGlm.digammaShift(y, k, Digamma.value(k)), 1e-13 * scale,
                    "digamma y=" + y);
            double tscale = Math.max(1, Trigamma.value(k));
            assertEquals(tri, LogLinearGlm.trigammaShift(y, k, Trigamma.value(k)), 1e-13 * tscale,
                    "trigamma y=" + y);
        }
    }
}
