package org.incipit.core.likelihood;

import java.util.ArrayList;
import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Maximiser of a {@link LogLikelihood} over unconstrained parameters. Immutable, thread-safe.
 *
 * <p><b>Methods.</b> {@link Method#BFGS}: quasi-Newton with the BFGS inverse-Hessian update,
 * initial scaling H0 = (s'y / y'y) I after the first step, update skipped when the curvature
 * condition s'y &gt; 0 fails (Nocedal &amp; Wright 2006, <i>Numerical Optimization</i>, 2nd ed.,
 * Alg. 6.1 and eq. 6.20). {@link Method#NEWTON}: damped Newton on the analytic Hessian if the
 * likelihood has one, else on central differences of the analytic gradient; the Hessian of
 * &minus;l is made positive definite by replacing each eigenvalue &lambda; by
 * max(|&lambda;|, 1e-14 max|&lambda;|) (Nocedal &amp; Wright 2006, sec. 3.4). With an analytic
 * Hessian every trial point is evaluated by {@link LogLikelihood#valueGradientHessian}, so a
 * kernel that gets the three in one pass over the data costs one pass per trial.
 * Both use a backtracking line search: a step is accepted on Armijo sufficient increase
 * (c1 = 1e-4) or, where value differences are at rounding level, on the approximate-Wolfe test
 * of Hager &amp; Zhang (2005, SIAM J. Optim. 16:170); otherwise the step is halved. A non-finite
 * value or NaN counts as a failed trial (step times 0.1), so the search backs off from
 * {@code -Infinity} regions.
 *
 * <p><b>Convergence.</b> Converged when the relative gradient
 * max_i |g_i| max(1, |theta_i|) / max(1, |l|) &le; {@code gradientTolerance}
 * (Dennis &amp; Schnabel 1983, sec. 7.2). The iteration also stops, without convergence unless
 * the relative gradient is below {@code 1000 * gradientTolerance}, when the line search cannot
 * increase the value or when both the relative value change and the relative step are below
 * machine precision (BFGS first restarts once from the identity inverse Hessian); the message
 * says which. Reaching {@code maxIterations}, or a value that
 * keeps increasing without bound (|theta| beyond 1e8 or l beyond 1e300), is reported as
 * non-convergence.
 */
public final class Maximiser {

    /** Search method. */
    public enum Method {
        /** Quasi-Newton (BFGS). Gradient only; default. */
        BFGS,
        /** Damped Newton with eigenvalue-modified Hessian (analytic or by differences of the gradient). */
        NEWTON
    }

    private static final Logger LOG = LoggerFactory.getLogger(Maximiser.class);
    private static final double ARMIJO = 1e-4;
    private static final int MAX_BACKTRACK = 60;
    private static final double DIVERGENCE_THETA = 1e8;

    private final Method method;
    private final int maxIterations;
    private final double gradientTolerance;

    private Maximiser(Method method, int maxIterations, double gradientTolerance) {
        this.method = method;
        this.maxIterations = maxIterations;
        this.gradientTolerance = gradientTolerance;
    }

    /** @return BFGS with at most 1000 iterations and relative gradient tolerance 1e-9 */
    public static Maximiser bfgs() {
        return new Maximiser(Method.BFGS, 1000, 1e-9);
    }

    /** @return damped Newton with at most 200 iterations and relative gradient tolerance 1e-9 */
    public static Maximiser newton() {
        return new Maximiser(Method.NEWTON, 200, 1e-9);
    }

    /**
     * @param method            search method
     * @param maxIterations     &ge; 1
     * @param gradientTolerance relative gradient tolerance in (0, 1)
     * @return a maximiser
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static Maximiser of(Method method, int maxIterations, double gradientTolerance) {
        if (method == null) {
            throw new IllegalArgumentException("method must not be null");
        }
        if (maxIterations < 1) {
            throw new IllegalArgumentException("maxIterations must be >= 1, was " + maxIterations);
        }
        if (!(gradientTolerance > 0 && gradientTolerance < 1)) {
            throw new IllegalArgumentException("gradientTolerance must be in (0, 1), was " + gradientTolerance);
        }
        return new Maximiser(method, maxIterations, gradientTolerance);
    }

    /** @return the method */
    public Method method() {
        return method;
    }

    /**
     * Maximises from one start.
     *
     * @param ll    unconstrained log-likelihood
     * @param start start point, length ll.dimension(), value there must be finite; not modified
     * @return the optimum with its convergence status
     * @throws IllegalArgumentException if the start has the wrong length or a non-finite value
     */
    public Optimum maximise(LogLikelihood ll, double[] start) {
        if (start.length != ll.dimension()) {
            throw new IllegalArgumentException("start must have length " + ll.dimension() + ", was " + start.length);
        }
        return method == Method.BFGS ? bfgs(ll, start.clone()) : newton(ll, start.clone());
    }

    /**
     * Maximises from each start and returns the best converged optimum (highest value); if none
     * converged, the best non-converged one (status false). Starts whose value is not finite are
     * skipped; evaluations are summed over all runs and the message counts converged runs.
     *
     * @param ll     unconstrained log-likelihood
     * @param starts one or more start points
     * @return the best optimum
     * @throws IllegalArgumentException if a start has the wrong length or no start has a finite value
     */
    public Optimum maximise(LogLikelihood ll, List<double[]> starts) {
        if (starts.isEmpty()) {
            throw new IllegalArgumentException("starts must be non-empty");
        }
        Optimum best = null;
        int evaluations = 0;
        int converged = 0;
        int usable = 0;
        for (double[] s : starts) {
            if (s.length != ll.dimension()) {
                throw new IllegalArgumentException("every start must have length " + ll.dimension() + ", one has "
                        + s.length);
            }
            if (!Double.isFinite(ll.value(s.clone()))) {
                evaluations++;
                continue;
            }
            usable++;
            Optimum o = maximise(ll, s);
            evaluations += o.evaluations();
            if (o.converged()) {
                converged++;
            }
            if (best == null || (o.converged() && !best.converged())
                    || (o.converged() == best.converged() && o.value() > best.value())) {
                best = o;
            }
        }
        if (best == null) {
            throw new IllegalArgumentException("no start of " + starts.size() + " has a finite log-likelihood");
        }
        return new Optimum(best.argmax(), best.value(), best.gradient(), best.iterations(), evaluations,
                best.converged(), best.message() + "; " + converged + " of " + usable + " usable starts converged"
                        + (usable < starts.size() ? " (" + (starts.size() - usable)
                                + " starts skipped: non-finite log-likelihood)" : ""));
    }

    /**
     * Multi-start from {@code start} plus {@code extraStarts} points jittered uniformly by
     * &plusmn;{@code spread} in each unconstrained coordinate.
     *
     * @param rng         source of the jitter
     * @param ll          unconstrained log-likelihood
     * @param start       first start
     * @param extraStarts &ge; 0 jittered starts
     * @param spread      finite and &gt; 0
     * @return best optimum as in {@link #maximise(LogLikelihood, List)}
     */
    public Optimum maximise(UniformRandomProvider rng, LogLikelihood ll, double[] start, int extraStarts,
                            double spread) {
        if (extraStarts < 0) {
            throw new IllegalArgumentException("extraStarts must be >= 0, was " + extraStarts);
        }
        if (!(spread > 0 && spread < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("spread must be finite and > 0, was " + spread);
        }
        List<double[]> starts = new ArrayList<>();
        starts.add(start.clone());
        for (int s = 0; s < extraStarts; s++) {
            double[] p = start.clone();
            for (int i = 0; i < p.length; i++) {
                p[i] += spread * (2 * rng.nextDouble() - 1);
            }
            starts.add(p);
        }
        return maximise(ll, starts);
    }

    // ---------------------------------------------------------------------------------------

    private double relativeGradient(double[] x, double[] g, double f) {
        double m = 0;
        double scale = Math.max(1, Math.abs(f));
        for (int i = 0; i < x.length; i++) {
            m = Math.max(m, Math.abs(g[i]) * Math.max(1, Math.abs(x[i])) / scale);
        }
        return m;
    }

    private static boolean diverging(double[] x, double f) {
        if (f > 1e300) {
            return true;
        }
        for (double v : x) {
            if (Math.abs(v) > DIVERGENCE_THETA) {
                return true;
            }
        }
        return false;
    }

    /** Mutable state of one run. */
    private static final class Run {
        int evaluations;
    }

    private Optimum bfgs(LogLikelihood ll, double[] x) {
        int k = x.length;
        Run run = new Run();
        double[] g = new double[k];
        double f = eval(ll, x, g, run);
        if (!Double.isFinite(f)) {
            throw new IllegalArgumentException("log-likelihood at the start must be finite, was " + f);
        }
        double[] hinv = identity(k);
        boolean scaled = false;
        boolean justReset = false;
        double[] d = new double[k];
        double[] xn = new double[k];
        double[] gn = new double[k];
        for (int it = 0; it < maxIterations; it++) {
            double rg = relativeGradient(x, g, f);
            LOG.debug("BFGS iteration {}: value {}, relative gradient {}", it, f, rg);
            if (rg <= gradientTolerance) {
                return new Optimum(x, f, g, it, run.evaluations, true, "relative gradient " + rg + " <= " + gradientTolerance);
            }
            if (diverging(x, f)) {
                return new Optimum(x, f, g, it, run.evaluations, false, "no maximum: value still increasing at |theta| > 1e8 or value > 1e300 (unbounded likelihood?)");
            }
            // ascent direction d = H g (H approximates the inverse of -Hessian)
            multiply(hinv, g, d);
            double slope = dot(g, d);
            if (!(slope > 0)) {
                hinv = identity(k);
                System.arraycopy(g, 0, d, 0, k);
                slope = dot(g, g);
                scaled = false;
            }
            double alpha = 1;
            if (!scaled) {
                // first step (or after reset): limit to unit length in theta
                double dn = Math.sqrt(dot(d, d));
                alpha = Math.min(1, 1 / dn);
            }
            double fn = lineSearch(ll, x, d, f, slope, alpha, xn, gn, null, run);
            if (Double.isNaN(fn)) {
                boolean ok = rg <= 1000 * gradientTolerance;
                return new Optimum(x, f, g, it, run.evaluations, ok,
                        "line search could not increase the value; relative gradient " + rg
                                + (ok ? " (accepted: within 1000 x tolerance)" : ""));
            }
            double[] s = new double[k];
            double[] y = new double[k];
            double stepRel = 0;
            for (int i = 0; i < k; i++) {
                s[i] = xn[i] - x[i];
                y[i] = g[i] - gn[i]; // gradient of -l changes by -(gn - g)
                stepRel = Math.max(stepRel, Math.abs(s[i]) / Math.max(1, Math.abs(xn[i])));
            }
            double valueRel = Math.abs(fn - f) / Math.max(1, Math.abs(fn));
            double sy = dot(s, y);
            if (sy > 1e-12 * Math.sqrt(dot(s, s) * dot(y, y))) {
                if (!scaled) {
                    double scale = sy / dot(y, y);
                    for (int i = 0; i < k * k; i++) {
                        hinv[i] = (i % (k + 1) == 0) ? scale : 0;
                    }
                    scaled = true;
                }
                updateInverse(hinv, s, y, sy);
            }
            System.arraycopy(xn, 0, x, 0, k);
            System.arraycopy(gn, 0, g, 0, k);
            f = fn;
            if (valueRel <= Math.ulp(1.0) && stepRel <= Math.ulp(1.0)) {
                double rgn = relativeGradient(x, g, f);
                boolean ok = rgn <= 1000 * gradientTolerance;
                if (!ok && !justReset) {
                    // stalled on a badly scaled inverse-Hessian estimate: restart from a
                    // unit-length steepest-ascent step before giving up
                    hinv = identity(k);
                    scaled = false;
                    justReset = true;
                    continue;
                }
                return new Optimum(x, f, g, it + 1, run.evaluations, ok,
                        "value and step changes below machine precision; relative gradient " + rgn);
            }
            justReset = false;
        }
        double rg = relativeGradient(x, g, f);
        return new Optimum(x, f, g, maxIterations, run.evaluations, rg <= gradientTolerance,
                "iteration limit " + maxIterations + " reached; relative gradient " + rg);
    }

    private Optimum newton(LogLikelihood ll, double[] x) {
        int k = x.length;
        Run run = new Run();
        double[] g = new double[k];
        // with an analytic Hessian every evaluation returns it too (one call), so that the
        // Hessian at an accepted point is already there
        boolean analytic = ll.hasHessian();
        double[] h = analytic ? new double[k * k] : null;
        double[] hn = analytic ? new double[k * k] : null;
        double f = analytic ? evalWithHessian(ll, x, g, h, run) : eval(ll, x, g, run);
        if (!Double.isFinite(f)) {
            throw new IllegalArgumentException("log-likelihood at the start must be finite, was " + f);
        }
        double[] d = new double[k];
        double[] xn = new double[k];
        double[] gn = new double[k];
        for (int it = 0; it < maxIterations; it++) {
            double rg = relativeGradient(x, g, f);
            LOG.debug("Newton iteration {}: value {}, relative gradient {}", it, f, rg);
            if (rg <= gradientTolerance) {
                return new Optimum(x, f, g, it, run.evaluations, true, "relative gradient " + rg + " <= " + gradientTolerance);
            }
            if (diverging(x, f)) {
                return new Optimum(x, f, g, it, run.evaluations, false, "no maximum: value still increasing at |theta| > 1e8 or value > 1e300 (unbounded likelihood?)");
            }
            if (!analytic) {
                h = Derivatives.hessian(ll, x);
                run.evaluations += 2 * k;
            }
            boolean newtonStep = h != null && modifiedNewtonDirection(h, g, d, k);
            if (!newtonStep) {
                System.arraycopy(g, 0, d, 0, k);
                double dn = Math.sqrt(dot(d, d));
                for (int i = 0; i < k; i++) {
                    d[i] /= Math.max(1, dn);
                }
            }
            double slope = dot(g, d);
            double alpha = 1;
            double fn = lineSearch(ll, x, d, f, slope, alpha, xn, gn, hn, run);
            if (Double.isNaN(fn)) {
                boolean ok = rg <= 1000 * gradientTolerance;
                return new Optimum(x, f, g, it, run.evaluations, ok,
                        "line search could not increase the value; relative gradient " + rg
                                + (ok ? " (accepted: within 1000 x tolerance)" : ""));
            }
            double stepRel = 0;
            for (int i = 0; i < k; i++) {
                stepRel = Math.max(stepRel, Math.abs(xn[i] - x[i]) / Math.max(1, Math.abs(xn[i])));
            }
            double valueRel = Math.abs(fn - f) / Math.max(1, Math.abs(fn));
            System.arraycopy(xn, 0, x, 0, k);
            System.arraycopy(gn, 0, g, 0, k);
            if (analytic) {
                System.arraycopy(hn, 0, h, 0, k * k);
            }
            f = fn;
            if (valueRel <= Math.ulp(1.0) && stepRel <= Math.ulp(1.0)) {
                double rgn = relativeGradient(x, g, f);
                boolean ok = rgn <= 1000 * gradientTolerance;
                return new Optimum(x, f, g, it + 1, run.evaluations, ok,
                        "value and step changes below machine precision; relative gradient " + rgn);
            }
        }
        double rg = relativeGradient(x, g, f);
        return new Optimum(x, f, g, maxIterations, run.evaluations, rg <= gradientTolerance,
                "iteration limit " + maxIterations + " reached; relative gradient " + rg);
    }

    /** d = (modified -H)^-1 g with eigenvalues of -H replaced by max(|lambda|, 1e-14 max|lambda|). */
    private static boolean modifiedNewtonDirection(double[] hessianOfL, double[] g, double[] d, int k) {
        double[] a = new double[k * k];
        for (int i = 0; i < k * k; i++) {
            a[i] = -hessianOfL[i];
        }
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(k, true, true);
        if (!eig.decompose(new DMatrixRMaj(k, k, true, a))) {
            return false;
        }
        double maxAbs = 0;
        for (int i = 0; i < k; i++) {
            maxAbs = Math.max(maxAbs, Math.abs(eig.getEigenvalue(i).real));
        }
        if (!(maxAbs > 0) || !Double.isFinite(maxAbs)) {
            return false;
        }
        java.util.Arrays.fill(d, 0);
        for (int e = 0; e < k; e++) {
            double lambda = Math.max(Math.abs(eig.getEigenvalue(e).real), 1e-14 * maxAbs);
            DMatrixRMaj v = eig.getEigenVector(e);
            double proj = 0;
            for (int i = 0; i < k; i++) {
                proj += v.get(i) * g[i];
            }
            for (int i = 0; i < k; i++) {
                d[i] += v.get(i) * proj / lambda;
            }
        }
        for (double v : d) {
            if (!Double.isFinite(v)) {
                return false;
            }
        }
        return true;
    }

    /**
     * Armijo sufficient increase, or (near the optimum, where value differences drown in
     * rounding) the approximate-Wolfe test of Hager &amp; Zhang (2005): value not below f by more
     * than 1e-14|f| and the directional derivative reduced to at most 0.9 of its initial size.
     */
    /**
     * Backtracking line search along d from x (value f, directional slope {@code slope > 0}),
     * starting at step alpha: halves the step after a finite but unacceptable value, divides it
     * by 10 after a non-finite one. On success xn and gn hold the accepted point and its
     * gradient, and hn (if not null) its Hessian.
     *
     * @return the accepted value, or NaN if no step in {@code MAX_BACKTRACK} tries was acceptable
     */
    private static double lineSearch(LogLikelihood ll, double[] x, double[] d, double f, double slope,
                                     double alpha, double[] xn, double[] gn, double[] hn, Run run) {
        int k = x.length;
        for (int b = 0; b < MAX_BACKTRACK; b++) {
            for (int i = 0; i < k; i++) {
                xn[i] = x[i] + alpha * d[i];
            }
            double fn = hn != null ? evalWithHessian(ll, xn, gn, hn, run) : eval(ll, xn, gn, run);
            if (acceptable(f, fn, alpha, slope, dot(gn, d))) {
                return fn;
            }
            alpha *= (Double.isFinite(fn) ? 0.5 : 0.1);
        }
        return Double.NaN;
    }

    private static boolean acceptable(double f, double fn, double alpha, double slope, double slopeNew) {
        if (!Double.isFinite(fn)) {
            return false;
        }
        if (fn >= f + ARMIJO * alpha * slope) {
            return true;
        }
        return fn >= f - 1e-14 * Math.abs(f) && Math.abs(slopeNew) <= 0.9 * slope;
    }

    private static double eval(LogLikelihood ll, double[] x, double[] g, Run run) {
        run.evaluations++;
        return checked(ll.valueAndGradient(x, g), g);
    }

    /** As {@link #eval}, with the Hessian (a non-finite one later gives a gradient step, as without it). */
    private static double evalWithHessian(LogLikelihood ll, double[] x, double[] g, double[] h, Run run) {
        run.evaluations++;
        return checked(ll.valueGradientHessian(x, g, h), g);
    }

    private static double checked(double v, double[] g) {
        if (Double.isNaN(v) || v == Double.POSITIVE_INFINITY) {
            return Double.NEGATIVE_INFINITY;
        }
        if (Double.isFinite(v)) {
            for (double gi : g) {
                if (!Double.isFinite(gi)) {
                    return Double.NEGATIVE_INFINITY;
                }
            }
        }
        return v;
    }

    private static double[] identity(int k) {
        double[] m = new double[k * k];
        for (int i = 0; i < k; i++) {
            m[i * k + i] = 1;
        }
        return m;
    }

    private static void multiply(double[] m, double[] v, double[] out) {
        int k = v.length;
        for (int i = 0; i < k; i++) {
            double s = 0;
            for (int j = 0; j < k; j++) {
                s += m[i * k + j] * v[j];
            }
            out[i] = s;
        }
    }

    private static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

    /** H <- (I - rho s y') H (I - rho y s') + rho s s', rho = 1/(s'y) (N&amp;W eq. 6.17). */
    private static void updateInverse(double[] h, double[] s, double[] y, double sy) {
        int k = s.length;
        double rho = 1 / sy;
        double[] hy = new double[k];
        multiply(h, y, hy);
        double yhy = dot(y, hy);
        for (int i = 0; i < k; i++) {
            for (int j = 0; j < k; j++) {
                h[i * k + j] += -rho * (hy[i] * s[j] + s[i] * hy[j]) + (rho * rho * yhy + rho) * s[i] * s[j];
            }
        }
    }
}
