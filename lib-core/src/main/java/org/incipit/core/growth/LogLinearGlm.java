package org.incipit.core.growth;

import org.apache.commons.numbers.gamma.Digamma;
import org.apache.commons.numbers.gamma.LogGamma;
import org.apache.commons.numbers.gamma.Trigamma;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;
import org.incipit.core.EstimationException;

/**
 * Maximum-likelihood fit of a log-link count GLM, log &mu; = offset + X&beta;, Poisson or NB2.
 * &beta; by iteratively reweighted least squares (McCullagh &amp; Nelder 1989, sec. 2.5);
 * for NB2 the dispersion k is updated by Newton steps on log k between IRLS fits, until the
 * log-likelihood is stable (the alternation of Venables &amp; Ripley 2002, sec. 7.4).
 * Package-private engine; EJML stays inside.
 */
final class LogLinearGlm {

    static final int MAX_IRLS = 100;
    static final int MAX_OUTER = 200;
    /** k beyond this is treated as the Poisson limit inside profiles. */
    static final double K_CAP = 1e10;

    /** Result of one fit (arrays owned by the caller after return). */
    record Result(double[] beta, double[][] covariance, double k, double logLik, double deviance,
                  double pearson, int iterations, boolean converged, double[] mu) {
    }

    private LogLinearGlm() {
    }

    /**
     * @param x       design, n rows by p columns (not modified)
     * @param y       counts
     * @param offset  offset per row (not modified)
     * @param negBin  NB2 if true, else Poisson
     * @param capK    if true (profiles), a diverging k is capped at K_CAP instead of failing
     */
    static Result fit(double[][] x, double[] y, double[] offset, boolean negBin, boolean capK) {
        return fit(x, y, offset, negBin, capK, null, Double.NaN, true);
    }

    /**
     * @param betaStart      starting coefficients (warm start, e.g. inside a profile), or null
     *                       to start from mu = y + 0.1
     * @param kStart         starting dispersion for NB, NaN for the moment start
     * @param withCovariance compute the covariance and Pearson statistic (not needed in profiles)
     */
    static Result fit(double[][] x, double[] y, double[] offset, boolean negBin, boolean capK,
                      double[] betaStart, double kStart, boolean withCovariance) {
        return fit(x, y, offset, negBin, capK, betaStart, kStart, withCovariance,
                new CountSums(y));
    }

    /** As above, with the count sums of {@code y} precomputed by the caller. */
    static Result fit(double[][] x, double[] y, double[] offset, boolean negBin, boolean capK,
                      double[] betaStart, double kStart, boolean withCovariance, CountSums cs) {
        int n = y.length;
        int p = n == 0 ? 0 : x[0].length;
        double[] mu = new double[n];
        double[] beta = new double[p];
        if (betaStart == null) {
            for (int i = 0; i < n; i++) {
                mu[i] = y[i] + 0.1; // common practice start (as R's poisson()$initialize)
            }
        } else {
            System.arraycopy(betaStart, 0, beta, 0, p);
            updateMu(x, offset, beta, mu, y, Double.POSITIVE_INFINITY);
        }
        double k = Double.POSITIVE_INFINITY;
        int iterations = 0;
        boolean converged;
        if (!negBin) {
            IrlsOut o = irls(x, y, offset, mu, beta, k, p == 0);
            iterations = o.iterations;
            converged = o.converged;
        } else {
            IrlsOut o;
            if (Double.isNaN(kStart)) {
                o = irls(x, y, offset, mu, beta, Double.POSITIVE_INFINITY, p == 0);
                iterations += o.iterations;
                // Score for 1/k at the Poisson fit, sum[(y - mu)^2 - y] (Cameron & Trivedi 1986,
                // J Appl Econometrics 1, eq. for the LM test of alpha = 0): if it is not positive
                // the likelihood increases (locally) towards k = infinity: no finite NB2 maximum there.
                double score = 0;
                for (int i = 0; i < n; i++) {
                    double d = y[i] - mu[i];
                    score += d * d - y[i];
                }
                if (!(score > 0) && !capK) {
                    throw new EstimationException("negative binomial growth fit: the counts show no "
                            + "overdispersion around the Poisson fit (sum[(y - mu)^2 - y] = " + score
                            + " <= 0), so the maximum-likelihood dispersion k is infinite; use the "
                            + "Poisson model");
                }
                k = startK(y, mu);
            } else {
                k = kStart;
            }
            double prev = Double.NEGATIVE_INFINITY;
            converged = false;
            for (int outer = 0; outer < MAX_OUTER; outer++) {
                k = mlK(y, mu, k, capK, cs);
                o = irls(x, y, offset, mu, beta, k, p == 0);
                iterations += o.iterations;
                double ll = logLik(y, mu, k, cs);
                if (o.converged && Math.abs(ll - prev) <= 1e-7 * (Math.abs(ll) + 1) && p > 0) {
                    // close: polish (beta, log k) jointly by Newton (quadratic convergence)
                    double[] theta = new double[p + 1];
                    double llN = newtonNegBin(x, y, offset, beta, k, cs, theta);
                    if (!Double.isNaN(llN)) {
                        if (theta[p] > Math.log(K_CAP) && !capK) {
                            throw new EstimationException("negative binomial growth fit: the "
                                    + "maximum-likelihood dispersion k diverges (k > " + K_CAP
                                    + "); the counts show no overdispersion; use the Poisson model");
                        }
                        System.arraycopy(theta, 0, beta, 0, p);
                        k = Math.exp(theta[p]);
                        updateMu(x, offset, beta, mu, y, k);
                        converged = true;
                        break;
                    }
                }
                if (o.converged && Math.abs(ll - prev) <= 1e-13 * (Math.abs(ll) + 1)) {
                    converged = true;
                    k = mlK(y, mu, k, capK, cs);
                    break;
                }
                prev = ll;
            }
        }
        double ll = logLik(y, mu, k, cs);
        if (!withCovariance) {
            return new Result(beta, null, k, ll, Double.NaN, Double.NaN, iterations, converged, mu);
        }
        double dev = deviance(y, mu, k);
        double pearson = 0;
        for (int i = 0; i < n; i++) {
            double r = y[i] - mu[i];
            pearson += r * r / variance(mu[i], k);
        }
        double[][] cov = p == 0 ? new double[0][0] : covariance(x, mu, k);
        return new Result(beta, cov, k, ll, dev, pearson, iterations, converged, mu);
    }

    private record IrlsOut(int iterations, boolean converged) {
    }

    /** IRLS from the current mu; updates mu and beta in place. */
    private static IrlsOut irls(double[][] x, double[] y, double[] offset, double[] mu,
                                double[] beta, double k, boolean noColumns) {
        int n = y.length;
        if (noColumns) {
            for (int i = 0; i < n; i++) {
                mu[i] = Math.exp(offset[i]);
            }
            return new IrlsOut(0, true);
        }
        int p = beta.length;
        DMatrixRMaj a = new DMatrixRMaj(p, p);
        DMatrixRMaj b = new DMatrixRMaj(p, 1);
        DMatrixRMaj sol = new DMatrixRMaj(p, 1);
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.symmPosDef(p);
        double devOld = deviance(y, mu, k);
        boolean first = true;
        for (int it = 1; it <= MAX_IRLS; it++) {
            a.zero();
            b.zero();
            for (int i = 0; i < n; i++) {
                double eta = Math.log(mu[i]);
                double w = mu[i] / (1 + mu[i] / k);
                double z = eta - offset[i] + (y[i] - mu[i]) / mu[i];
                double[] xi = x[i];
                for (int r = 0; r < p; r++) {
                    double wx = w * xi[r];
                    b.data[r] += wx * z;
                    for (int c = 0; c <= r; c++) {
                        a.data[r * p + c] += wx * xi[c];
                    }
                }
            }
            for (int r = 0; r < p; r++) {
                for (int c = 0; c < r; c++) {
                    a.data[c * p + r] = a.data[r * p + c];
                }
            }
            if (!solver.setA(a)) {
                throw new EstimationException("growth regression: weighted cross-product matrix is "
                        + "singular at IRLS iteration " + it + " (design not identifiable)");
            }
            solver.solve(b, sol);
            double[] oldBeta = beta.clone();
            double[] oldMu = mu.clone();
            for (int r = 0; r < p; r++) {
                beta[r] = sol.data[r];
            }
            double dev = updateMu(x, offset, beta, mu, y, k);
            // Step halving if the deviance grew or became non-finite (as R's glm.fit).
            int halvings = 0;
            while (!(dev <= devOld * (1 + 1e-12) + 1e-12) && !first && halvings < 30) {
                for (int r = 0; r < p; r++) {
                    beta[r] = 0.5 * (beta[r] + oldBeta[r]);
                }
                dev = updateMu(x, offset, beta, mu, y, k);
                halvings++;
            }
            if (!Double.isFinite(dev)) {
                System.arraycopy(oldMu, 0, mu, 0, n);
                throw new EstimationException("growth regression: deviance not finite at IRLS "
                        + "iteration " + it);
            }
            first = false;
            if (Math.abs(dev - devOld) / (Math.abs(dev) + 0.1) < 1e-14 || dev == devOld) {
                return new IrlsOut(it, true);
            }
            devOld = dev;
        }
        return new IrlsOut(MAX_IRLS, false);
    }

    private static double updateMu(double[][] x, double[] offset, double[] beta, double[] mu,
                                   double[] y, double k) {
        for (int i = 0; i < mu.length; i++) {
            double eta = offset[i];
            for (int r = 0; r < beta.length; r++) {
                eta += x[i][r] * beta[r];
            }
            mu[i] = Math.exp(eta);
        }
        return deviance(y, mu, k);
    }

    /** Inverse of the Fisher information X'WX for beta at fixed k. */
    private static double[][] covariance(double[][] x, double[] mu, double k) {
        int p = x[0].length;
        DMatrixRMaj a = new DMatrixRMaj(p, p);
        for (int i = 0; i < mu.length; i++) {
            double w = mu[i] / (1 + mu[i] / k);
            for (int r = 0; r < p; r++) {
                for (int c = 0; c < p; c++) {
                    a.data[r * p + c] += w * x[i][r] * x[i][c];
                }
            }
        }
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.symmPosDef(p);
        if (!solver.setA(a)) {
            throw new EstimationException("growth regression: information matrix is singular");
        }
        DMatrixRMaj inv = new DMatrixRMaj(p, p);
        solver.invert(inv);
        double[][] out = new double[p][p];
        for (int r = 0; r < p; r++) {
            for (int c = 0; c < p; c++) {
                out[r][c] = inv.data[r * p + c];
            }
        }
        return out;
    }

    static double variance(double mu, double k) {
        return mu + mu * mu / k; // k = +inf gives mu
    }

    static double logLik(double[] y, double[] mu, double k) {
        return logLik(y, mu, k, new CountSums(y));
    }

    static double sumLogFactorial(double[] y) {
        double s = 0;
        for (double v : y) {
            s += LogGamma.value(v + 1);
        }
        return s;
    }

    /** Full log-likelihood; {@code cs} holds the sums over the counts (computed once). */
    static double logLik(double[] y, double[] mu, double k, CountSums cs) {
        double s = -cs.logFactorialSum();
        if (Double.isInfinite(k)) {
            for (int i = 0; i < y.length; i++) {
                s += (y[i] > 0 ? y[i] * Math.log(mu[i]) : 0) - mu[i];
            }
            return s;
        }
        double[] lg = new double[y.length];
        cs.logGammaRatios(k, lg);
        for (int i = 0; i < y.length; i++) {
            double km = k + mu[i];
            s += lg[i] + k * Math.log(k / km) + (y[i] > 0 ? y[i] * Math.log(mu[i] / km) : 0);
        }
        return s;
    }

    static double deviance(double[] y, double[] mu, double k) {
        double d = 0;
        for (int i = 0; i < y.length; i++) {
            double yi = y[i];
            double m = mu[i];
            double t = yi > 0 ? yi * Math.log(yi / m) : 0;
            if (Double.isInfinite(k)) {
                d += 2 * (t - (yi - m));
            } else {
                d += 2 * (t - (yi + k) * Math.log((yi + k) / (m + k)));
            }
        }
        return d;
    }

    /**
     * NB2 log-likelihood maximised over (beta, log k) by Newton's method with the observed
     * Hessian and step halving, from a warm start (used inside profiles, where the start is
     * close). Returns NaN if Newton fails to increase the likelihood, so that the caller can fall
     * back to the IRLS/k alternation.
     */
    static double newtonNegBinLogLik(double[][] x, double[] y, double[] offset, double[] betaStart,
                                     double kStart, CountSums cs) {
        return newtonNegBin(x, y, offset, betaStart, kStart, cs, null);
    }

    /** As {@link #newtonNegBinLogLik}; if thetaOut is not null it receives (beta, log k). */
    static double newtonNegBin(double[][] x, double[] y, double[] offset, double[] betaStart,
                               double kStart, CountSums cs, double[] thetaOut) {
        int n = y.length;
        int p = betaStart.length;
        int q = p + 1;
        double[] theta = new double[q];
        System.arraycopy(betaStart, 0, theta, 0, p);
        theta[p] = Math.log(kStart);
        double[] mu = new double[n];
        double[] logRatio = new double[n]; // log(k / (k + mu_i)) at the current point
        double ll = nbAt(x, offset, theta, mu, y, cs, logRatio);
        DMatrixRMaj h = new DMatrixRMaj(q, q);
        DMatrixRMaj grad = new DMatrixRMaj(q, 1);
        DMatrixRMaj step = new DMatrixRMaj(q, 1);
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.symmPosDef(q);
        double[] sums = new double[2];
        for (int it = 0; it < 50; it++) {
            double k = Math.exp(theta[p]);
            h.zero();
            grad.zero();
            cs.digammaSums(k, sums);
            double dk = sums[0];
            double dkk = sums[1];
            double invK = 1 / k;
            for (int i = 0; i < n; i++) {
                double m = mu[i];
                double inv = 1 / (k + m);
                double inv2 = inv * inv;
                double ge = k * (y[i] - m) * inv;          // dl/deta
                double hee = (y[i] + k) * k * m * inv2;    // -d2l/deta2
                double hek = k * (y[i] - m) * m * inv2;    // d2l/deta du
                double[] xi = x[i];
                for (int r = 0; r < p; r++) {
                    grad.data[r] += ge * xi[r];
                    for (int c = 0; c <= r; c++) {
                        h.data[r * q + c] += hee * xi[r] * xi[c];
                    }
                    h.data[p * q + r] -= hek * xi[r];
                }
                dk += logRatio[i] + 1 - (y[i] + k) * inv;
                dkk += invK - 2 * inv + (y[i] + k) * inv2;
            }
            double gu = k * dk;
            grad.data[p] = gu;
            h.data[p * q + p] = -(gu + k * k * dkk);
            for (int r = 0; r < q; r++) {
                for (int c = 0; c < r; c++) {
                    h.data[c * q + r] = h.data[r * q + c];
                }
            }
            if (!solver.setA(h)) {
                return Double.NaN; // negative Hessian not definite here
            }
            solver.solve(grad, step);
            double[] old = theta.clone();
            double t = 1;
            double llNew = Double.NaN;
            for (int half = 0; half < 30; half++) {
                for (int r = 0; r < q; r++) {
                    theta[r] = old[r] + t * step.data[r];
                }
                llNew = nbAt(x, offset, theta, mu, y, cs, logRatio);
                if (llNew >= ll - 1e-12 * Math.abs(ll)) {
                    break;
                }
                t *= 0.5;
            }
            if (!(llNew >= ll - 1e-12 * Math.abs(ll)) || theta[p] > Math.log(K_CAP)) {
                return Double.NaN;
            }
            double change = llNew - ll;
            ll = llNew;
            double maxStep = 0;
            for (int r = 0; r < q; r++) {
                maxStep = Math.max(maxStep, Math.abs(t * step.data[r]));
            }
            if (maxStep < 1e-10 || Math.abs(change) < 1e-14 * Math.abs(ll)) {
                if (thetaOut != null) {
                    System.arraycopy(theta, 0, thetaOut, 0, q);
                }
                return ll;
            }
        }
        return Double.NaN;
    }

    /** Sets mu at theta = (beta, log k), fills logRatio, returns the log-likelihood. */
    private static double nbAt(double[][] x, double[] offset, double[] theta, double[] mu,
                               double[] y, CountSums cs, double[] logRatio) {
        int p = theta.length - 1;
        for (int i = 0; i < mu.length; i++) {
            double eta = offset[i];
            for (int r = 0; r < p; r++) {
                eta += x[i][r] * theta[r];
            }
            mu[i] = Math.exp(eta);
        }
        double k = Math.exp(theta[p]);
        if (Double.isInfinite(k)) {
            return logLik(y, mu, k, cs);
        }
        cs.logGammaRatios(k, logRatio); // logRatio used as scratch for the ln Gamma ratios first
        double s = -cs.logFactorialSum();
        for (int i = 0; i < y.length; i++) {
            double km = k + mu[i];
            double lr = Math.log(k / km);
            s += logRatio[i] + k * lr + (y[i] > 0 ? y[i] * Math.log(mu[i] / km) : 0);
            logRatio[i] = lr;
        }
        return s;
    }

    /** Counts up to this use the recurrence sums below instead of two special-function calls. */
    private static final int SHIFT_SUM_LIMIT = 24;

    /**
     * psi(y + k) - psi(k) for a count y: by the recurrence psi(x + 1) = psi(x) + 1/x
     * (Abramowitz &amp; Stegun 6.3.5) the sum of 1/(k + j), j &lt; y, for small y.
     */
    static double digammaShift(double y, double k, double digammaK) {
        if (y <= SHIFT_SUM_LIMIT) {
            double s = 0;
            for (int j = 0; j < (int) y; j++) {
                s += 1 / (k + j);
            }
            return s;
        }
        return Digamma.value(y + k) - digammaK;
    }

    /** psi'(y + k) - psi'(k) = -sum 1/(k + j)^2, j &lt; y (A&amp;S 6.4.6) for small y. */
    static double trigammaShift(double y, double k, double trigammaK) {
        if (y <= SHIFT_SUM_LIMIT) {
            double s = 0;
            for (int j = 0; j < (int) y; j++) {
                double d = k + j;
                s -= 1 / (d * d);
            }
            return s;
        }
        return Trigamma.value(y + k) - trigammaK;
    }

    /** Moment start for k (as in Venables &amp; Ripley's theta.ml). */
    private static double startK(double[] y, double[] mu) {
        double s = 0;
        for (int i = 0; i < y.length; i++) {
            double q = y[i] / mu[i] - 1;
            s += q * q;
        }
        double k0 = y.length / s;
        return Double.isFinite(k0) && k0 > 0 ? Math.min(k0, 1e6) : 1.0;
    }

    /** Relative size of the k-score below which it is rounding noise (common practice). */
    private static final double SCORE_NOISE = 32 * 0x1.0p-52;

    /**
     * Maximises the NB2 log-likelihood in k at fixed mu by safeguarded Newton on log k; stops when
     * the step is below 1e-12 or the score is at its rounding level.
     */
    static double mlK(double[] y, double[] mu, double kStart, boolean capK, CountSums cs) {
        double u = Math.log(kStart);
        double ll = logLik(y, mu, Math.exp(u), cs);
        double[] sums = new double[2];
        for (int it = 1; it <= 200; it++) {
            double k = Math.exp(u);
            cs.digammaSums(k, sums);
            double s = sums[0];
            double h = sums[1];
            double scale = Math.abs(s); // sum of the magnitudes added into s (rounding scale)
            for (int i = 0; i < y.length; i++) {
                double km = k + mu[i];
                double lr = Math.log(k / km);
                double d = (mu[i] - y[i]) / km;
                s += lr + d;
                scale += Math.abs(lr) + Math.abs(d);
                h += 1 / k - 2 / km + (y[i] + k) / (km * km);
            }
            double gu = k * s;
            double hu = k * s + k * k * h;
            if (hu < 0 && Math.abs(s) <= SCORE_NOISE * scale) {
                // the score is at its rounding level: Newton steps would only be noise (this
                // happens for large k, where the k-likelihood is flat and s cancels heavily)
                return k;
            }
            double step = hu < 0 ? -gu / hu : (gu > 0 ? 1.0 : -1.0);
            step = Math.max(-3, Math.min(3, step));
            double uNew = u + step;
            double llNew = logLik(y, mu, Math.exp(uNew), cs);
            int halvings = 0;
            while (!(llNew >= ll - 1e-12 * Math.abs(ll)) && halvings < 40) {
                step *= 0.5;
                uNew = u + step;
                llNew = logLik(y, mu, Math.exp(uNew), cs);
                halvings++;
            }
            u = uNew;
            ll = llNew;
            if (Math.exp(u) > K_CAP) {
                if (capK) {
                    return K_CAP;
                }
                throw new EstimationException("negative binomial growth fit: the maximum-likelihood "
                        + "dispersion k diverges (k > " + K_CAP + " after " + it + " Newton steps): "
                        + "the counts show no overdispersion; use the Poisson model");
            }
            if (Math.abs(step) < 1e-12) {
                return Math.exp(u);
            }
        }
        throw new EstimationException("negative binomial growth fit: dispersion k did not converge "
                + "after 200 Newton steps");
    }
}
