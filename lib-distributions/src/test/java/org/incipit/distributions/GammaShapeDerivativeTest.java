package org.incipit.distributions;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Gamma logCdf / logSurvival gradients against mpmath 1.3 at 40 digits on a dense grid
 * (reference/gamma_shape_derivative_reference.py, gamma_shape_derivative.csv): shapes 1e-9 to
 * 5000, rates 1 and 2.5, y = rate x from 1e-12 to the far upper tail (Q ~ 1e-220), including both
 * sides of the series / continued-fraction switch at y = shape + 1.
 *
 * <p>Tolerance 1e-10 relative on every component (the measured maximum is about 2e-12, at shape
 * 5000 near y = shape and at shape 1e-6 in the upper tail). A reference value below 1e-300 lies
 * below the range where doubles keep relative precision; there the computed value must be below
 * 1e-300 too.
 */
class GammaShapeDerivativeTest {
    private static final double TOL = 1e-10;
    private static final double UNDER = 1e-300;

    @Test
    void gradientsMatchMpmathOnDenseGrid() {
        List<String> failures = new ArrayList<>();
        int n = 0;
        for (String[] r : ReferenceTable.rows("gamma_shape_derivative.csv")) {
            GammaDelay d = GammaDelay.ofShapeRate(Double.parseDouble(r[0]), Double.parseDouble(r[1]));
            double x = Double.parseDouble(r[2]);
            double[] gc = d.logCdfGradient(x);
            double[] gs = d.logSurvivalGradient(x);
            double[] got = {gc[0], gc[1], gs[0], gs[1]};
            String[] what = {"dlogF/dshape", "dlogF/drate", "dlogS/dshape", "dlogS/drate"};
            for (int k = 0; k < 4; k++) {
                double expected = Double.parseDouble(r[3 + k]);
                boolean ok = Math.abs(expected) < UNDER
                        ? Math.abs(got[k]) < UNDER
                        : ReferenceTable.relErr(got[k], expected, 0) <= TOL;
                if (!ok) {
                    failures.add(d + " x=" + x + " " + what[k] + ": actual " + got[k] + " expected " + expected
                            + " rel err " + ReferenceTable.relErr(got[k], expected, 0));
                }
                n++;
            }
        }
        assertTrue(n >= 1000, "expected the full table, read " + n + " components");
        assertTrue(failures.isEmpty(), () -> failures.size() + " failures:\n" + String.join("\n", failures));
    }

    /**
     * Limits at the ends of the support (common practice: F ~ (rate x)^shape / Gamma(shape + 1)
     * as x -&gt; 0, so d log F / d rate -&gt; shape / rate and d log F / d shape -&gt; -Infinity; S = 1
     * for x &le; 0; F = 1 and log S -&gt; -Infinity as x -&gt; Infinity).
     */
    @Test
    void limitsAtTheEndsOfTheSupport() {
        GammaDelay d = GammaDelay.ofShapeRate(2.5, 0.5);
        double inf = Double.POSITIVE_INFINITY;
        assertArrayEquals(new double[] {-inf, 5.0}, d.logCdfGradient(0));
        assertArrayEquals(new double[] {-inf, 5.0}, d.logCdfGradient(Double.MIN_VALUE));
        assertArrayEquals(new double[] {0, 0}, d.logCdfGradient(inf));
        assertArrayEquals(new double[] {0, 0}, d.logSurvivalGradient(0));
        assertArrayEquals(new double[] {0, 0}, d.logSurvivalGradient(-1));
        assertArrayEquals(new double[] {0, 0}, d.logSurvivalGradient(Double.MIN_VALUE));
        assertArrayEquals(new double[] {inf, -inf}, d.logSurvivalGradient(inf));
        assertArrayEquals(new double[] {inf, -inf},
                GammaDelay.ofShapeRate(2.5, 10).logSurvivalGradient(Double.MAX_VALUE));
        assertTrue(Double.isNaN(d.logCdfGradient(-1)[0]) && Double.isNaN(d.logCdfGradient(Double.NaN)[1]));
        assertTrue(Double.isNaN(d.logSurvivalGradient(Double.NaN)[0]));
    }
}
