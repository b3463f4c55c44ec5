package org.incipit.core.likelihood;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.rng.simple.RandomSource;
import org.incipit.core.EstimationException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/** Test problems with known optima (Rosenbrock 1960; Nocedal &amp; Wright 2006, sec. 2.1). */
class MaximiserTest {

    /** Minus the Rosenbrock function, maximum 0 at (1, 1). */
    static final LogLikelihood ROSENBROCK = new LogLikelihood() {
        public int dimension() {
            return 2;
        }

        public double value(double[] t) {
            return valueAndGradient(t, new double[2]);
        }

        public double valueAndGradient(double[] t, double[] g) {
            double a = t[1] - t[0] * t[0];
            double b = 1 - t[0];
            g[0] = -(-400 * t[0] * a - 2 * b);
            g[1] = -(200 * a);
            return -(100 * a * a + b * b);
        }
    };

    /** Quadratic with curvatures 1e8 and 1e-4 (condition number 1e12); maximum at (1, 2). */
    static final LogLikelihood BADLY_SCALED = new LogLikelihood() {
        public int dimension() {
            return 2;
        }

        public double value(double[] t) {
            return valueAndGradient(t, new double[2]);
        }

        public double valueAndGradient(double[] t, double[] g) {
            double a = 1e4 * (t[0] - 1);
            double b = 1e-2 * (t[1] - 2);
            g[0] = -2e4 * a;
            g[1] = -2e-2 * b;
            return -(a * a + b * b);
        }
    };

    /** Two Gaussian bumps: heights 0.4 at (-2, -2) and 0.6 at (3, 3); global maximum near (3, 3). */
    static final LogLikelihood BIMODAL = new LogLikelihood() {
        public int dimension() {
            return 2;
        }

        public double value(double[] t) {
            return valueAndGradient(t, new double[2]);
        }

        public double valueAndGradient(double[] t, double[] g) {
            double da = (t[0] + 2) * (t[0] + 2) + (t[1] + 2) * (t[1] + 2);
            double db = (t[0] - 3) * (t[0] - 3) + (t[1] - 3) * (t[1] - 3);
            double la = Math.log(0.4) - da / 2;
            double lb = Math.log(0.6) - db / 2;
            double m = Math.max(la, lb);
            double wa = Math.exp(la - m);
            double wb = Math.exp(lb - m);
            double s = wa + wb;
            g[0] = (wa * -(t[0] + 2) + wb * -(t[0] - 3)) / s;
            g[1] = (wa * -(t[1] + 2) + wb * -(t[1] - 3)) / s;
            return m + Math.log(s);
        }
    };

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void rosenbrockConverges(Maximiser.Method method) {
        Optimum o = Maximiser.of(method, 2000, 1e-10).maximise(ROSENBROCK, new double[] {-1.2, 1});
        assertTrue(o.converged(), o.toString());
        // relative gradient 1e-10 on a problem with smallest curvature ~0.4 at the optimum
        assertEquals(1, o.argmax()[0], 1e-7);
        assertEquals(1, o.argmax()[1], 1e-7);
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void badlyScaledConverges(Maximiser.Method method) {
        Optimum o = Maximiser.of(method, 2000, 1e-10).maximise(BADLY_SCALED, new double[] {0, 0});
        assertTrue(o.converged(), o.toString());
        assertEquals(1, o.argmax()[0], 1e-9);
        // gradient criterion 1e-10 with curvature 2e-4 bounds |y - 2| by about 1e-10 * 1 / (2e-4 * 2)
        assertEquals(2, o.argmax()[1], 1e-6);
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void unboundedReportsNonConvergence(Maximiser.Method method) {
        // exponential rate with all durations 0: l(rate) = n log(rate), increasing without bound
        LogLikelihood natural = TestLikelihoods.exponential(new double[] {0, 0, 0});
        Parameterisation p = Parameterisation.of(List.of("rate"), List.of(ParameterTransform.log()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, natural, List.of(new double[] {1}), 3,
                Maximiser.of(method, 300, 1e-9));
        assertFalse(fit.optimum().converged(), fit.optimum().toString());
        assertEquals(MaximumLikelihoodFit.Status.NOT_CONVERGED, fit.status());
        assertThrows(EstimationException.class, () -> fit.wald(0, 0.95));
        assertThrows(EstimationException.class, () -> fit.profile(0, 0.95));
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void minusInfinityRegionIsBacktrackedFrom(Maximiser.Method method) {
        // natural likelihood on the identity scale: steps into rate <= 0 give -Infinity
        Parameterisation p = Parameterisation.of(List.of("rate"), List.of(ParameterTransform.identity()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, TestLikelihoods.exponential(new double[] {10, 20, 30}),
                List.of(new double[] {5}), 3, Maximiser.of(method, 500, 1e-10));
        assertTrue(fit.converged(), fit.message());
        assertEquals(0.05, fit.naturalEstimate()[0], 1e-10);
    }

    @ParameterizedTest
    @EnumSource(Maximiser.Method.class)
    void multiStartFindsGlobalMaximum(Maximiser.Method method) {
        Maximiser m = Maximiser.of(method, 500, 1e-10);
        Optimum local = m.maximise(BIMODAL, new double[] {-1.5, -1.5});
        assertTrue(local.converged());
        assertEquals(-2, local.argmax()[0], 1e-3, "single start stays in the lower mode");
        Optimum global = m.maximise(RandomSource.XO_RO_SHI_RO_128_PP.create(7L), BIMODAL, new double[] {-1.5, -1.5}, 10, 6);
        assertTrue(global.converged(), global.toString());
        assertEquals(3, global.argmax()[0], 1e-3);
        assertEquals(3, global.argmax()[1], 1e-3);
        assertTrue(global.value() > local.value());
        Optimum listed = m.maximise(BIMODAL, List.of(new double[] {-1.5, -1.5}, new double[] {2, 2}));
        assertEquals(3, listed.argmax()[0], 1e-3);
    }

    @Test
    void saddleIsReportedAsNotPositiveDefinite() {
        // l = -(x^2) + y^2 / (1 + y^2)... a maximum in x but l increasing in |y| with a flat
        // direction at y = 0: started at y = 0 the gradient vanishes at a saddle (0, 0)
        LogLikelihood saddle = new LogLikelihood() {
            public int dimension() {
                return 2;
            }

            public double value(double[] t) {
                return valueAndGradient(t, new double[2]);
            }

            public double valueAndGradient(double[] t, double[] g) {
                double w = 1 + t[1] * t[1];
                g[0] = -2 * t[0];
                g[1] = 2 * t[1] / (w * w);
                return -t[0] * t[0] + t[1] * t[1] / w;
            }
        };
        Parameterisation p = Parameterisation.of(List.of("x", "y"),
                List.of(ParameterTransform.identity(), ParameterTransform.identity()));
        MaximumLikelihoodFit fit = MaximumLikelihoodFit.maximise(p, saddle, List.of(new double[] {0.5, 0}), 10,
                Maximiser.bfgs());
        assertTrue(fit.optimum().converged());
        assertEquals(MaximumLikelihoodFit.Status.INFORMATION_NOT_POSITIVE_DEFINITE, fit.status());
        assertFalse(fit.hasCovariance());
        assertThrows(EstimationException.class, fit::naturalCovariance);
        assertThrows(EstimationException.class, () -> fit.wald(0, 0.95));
    }

    @Test
    void invalidArgumentsAreRejected() {
        assertThrows(IllegalArgumentException.class, () -> Maximiser.of(Maximiser.Method.BFGS, 0, 1e-8));
        assertThrows(IllegalArgumentException.class, () -> Maximiser.of(Maximiser.Method.BFGS, 10, 0));
        assertThrows(IllegalArgumentException.class, () -> Maximiser.bfgs().maximise(ROSENBROCK, new double[1]));
        LogLikelihood nowhere = TestLikelihoods.exponential(new double[] {1});
        assertThrows(IllegalArgumentException.class, () -> Maximiser.bfgs().maximise(nowhere, new double[] {-1}));
    }

    /**
     * Rosenbrock with its analytic Hessian (Rosenbrock 1960; the second derivatives by hand):
     * Newton takes value, gradient and Hessian in one call per trial point when the likelihood
     * offers it, and reaches the same maximum as when the Hessian is asked for separately.
     */
    @Test
    void newtonUsesTheCombinedCallOncePerTrialPoint() {
        int[] calls = new int[3]; // valueAndGradient, hessian, valueGradientHessian
        class Counted implements LogLikelihood {
            final boolean combined;

            Counted(boolean combined) {
                this.combined = combined;
            }

            public int dimension() {
                return 2;
            }

            public double value(double[] t) {
                return ROSENBROCK.value(t);
            }

            public double valueAndGradient(double[] t, double[] g) {
                calls[0]++;
                return ROSENBROCK.valueAndGradient(t, g);
            }

            public boolean hasHessian() {
                return true;
            }

            public void hessian(double[] t, double[] h) {
                calls[1]++;
                h[0] = -(1200 * t[0] * t[0] - 400 * t[1] + 2);
                h[1] = 400 * t[0];
                h[2] = 400 * t[0];
                h[3] = -200;
            }

            public double valueGradientHessian(double[] t, double[] g, double[] h) {
                if (!combined) {
                    return LogLikelihood.super.valueGradientHessian(t, g, h);
                }
                calls[2]++;
                hessian(t, h);
                calls[1]--;
                return ROSENBROCK.valueAndGradient(t, g);
            }
        }
        Optimum viaDefault = Maximiser.newton().maximise(new Counted(false), new double[] {-1.2, 1});
        assertEquals(calls[0], calls[1], "default: one gradient and one Hessian call per point");
        java.util.Arrays.fill(calls, 0);
        Optimum combined = Maximiser.newton().maximise(new Counted(true), new double[] {-1.2, 1});
        assertEquals(0, calls[0]);
        assertEquals(0, calls[1]);
        assertEquals(combined.evaluations(), calls[2]);
        assertTrue(combined.converged());
        assertEquals(1, combined.argmax()[0], 1e-8);
        assertEquals(1, combined.argmax()[1], 1e-8);
        assertEquals(viaDefault.iterations(), combined.iterations());
        assertEquals(viaDefault.value(), combined.value(), 0);
    }
}
