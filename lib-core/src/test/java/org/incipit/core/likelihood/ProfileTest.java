package org.incipit.core.likelihood;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.incipit.core.inference.Estimate;
import org.junit.jupiter.api.Test;

/** Profile intervals whose bounds leave the domain. */
class ProfileTest {

    /**
     * l(x) = -c w/(1+w), w = (x-1)^2, x &gt; 0 on a log scale, c = 1.5: the drop from the maximum
     * never exceeds 1.5 as x -&gt; infinity and is 0.75 at x -&gt; 0, both below chi2_1(0.95)/2 =
     * 1.92, so the 95% profile interval is the whole domain [0, +infinity] (arithmetic by hand).
     */
    @Test
    void unreachedBoundsAreTheDomainEdges() {
        double c = 1.5;
        LogLikelihood plateau = new LogLikelihood() {
            public int dimension() {
                return 1;
            }

            public double value(double[] t) {
                return valueAndGradient(t, new double[1]);
            }

            public double valueAndGradient(double[] t, double[] g) {
                double d = t[0] - 1;
                double w = d * d;
                g[0] = -c * 2 * d / ((1 + w) * (1 + w));
                return -c * w / (1 + w);
            }
        };
        Parameterisation p = Parameterisation.of(List.of("x"), List.of(ParameterTransform.log()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, plateau, List.of(new double[] {2}), 10,
                Maximiser.bfgs());
        assertTrue(fit.converged(), fit.message());
        Estimate e = fit.profile(0, 0.95);
        assertEquals(0, e.lower());
        assertEquals(Double.POSITIVE_INFINITY, e.upper());
        // At level 0.5 the drop is chi2_1(0.5)/2 = 0.2275: finite bounds where
        // 1.5 w/(1+w) = 0.2275 -> w = 0.2275/1.2725, x = 1 -+ sqrt(w)
        double chi = 0.454936423119572 / 2; // scipy.stats.chi2.ppf(0.5, 1)/2, from memory to 15 digits
        double w = chi / (c - chi);
        Estimate half = fit.profile(0, 0.5);
        assertEquals(1 - Math.sqrt(w), half.lower(), 1e-8);
        assertEquals(1 + Math.sqrt(w), half.upper(), 1e-8);
    }
}
