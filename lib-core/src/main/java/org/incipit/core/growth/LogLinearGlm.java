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
        int n = y.length;
        int p = n == 0 ? 0 : x[0].length;
        double[] mu = new double[n];
        for (int i = 0; i < n; i++) {
            mu[i] = y[i] + 0.1; // common practice start (as R's poisson()$initialize)
        }
        double[] beta = new double[p];
        double k = Double.POSITIVE_INFINITY;
        int iterations = 0;
        boolean converged;
        if (!negBin) {
            IrlsOut o = irls(x, y, offset, mu, beta, k, p == 0);
            iterations = o.iterations;
            converged = o.converged;
        } else {
            IrlsOut o = irls(x, y, offset, mu, beta, Double.POSITIVE_INFINITY, p == 0);
            iterations += o.iterations;
            k = startK(y, mu);
            double prev = Double.NEGATIVE_INFINITY;
            converged = false;
            for (int outer = 0; outer < MAX_OUTER; outer++) {
                k = mlK(y, mu, k, capK);
                o = irls(x, y, offset, mu, beta, k, p == 0);
                iterations += o.iterations;
                double ll = logLik(y, mu, k);
                if (o.converged && Math.abs(ll - prev) <= 1e-13 * (Math.abs(ll) + 1)) {
                    converged = true;
                    break;
                }
                prev = ll;
            }
            k = mlK(y, mu, k, capK);
        }
        double ll = logLik(y, mu, k);
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
        double s = 0;
        if (Double.isInfinite(k)) {
            for (int i = 0; i < y.length; i++) {
                s += (y[i] > 0 ? y[i] * Math.log(mu[i]) : 0) - mu[i] - LogGamma.value(y[i] + 1);
            }
            return s;
        }
        double lgk = LogGamma.value(k);
        for (int i = 0; i < y.length; i++) {
            double km = k + mu[i];
            s += LogGamma.value(y[i] + k) - lgk - LogGamma.value(y[i] + 1)
                    + k * Math.log(k / km) + (y[i] > 0 ? y[i] * Math.log(mu[i] / km) : 0);
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

    /** Maximises the NB2 log-likelihood in k at fixed mu by safeguarded Newton on log k. */
    static double mlK(double[] y, double[] mu, double kStart, boolean capK) {
        double u = Math.log(kStart);
        double ll = logLik(y, mu, Math.exp(u));
        for (int it = 1; it <= 200; it++) {
            double k = Math.exp(u);
            double s = 0;
            double h = 0;
            for (int i = 0; i < y.length; i++) {
                double km = k + mu[i];
                s += Digamma.value(y[i] + k) - Digamma.value(k) + Math.log(k / km)
                        + (mu[i] - y[i]) / km;
                h += Trigamma.value(y[i] + k) - Trigamma.value(k) + 1 / k - 2 / km
                        + (y[i] + k) / (km * km);
            }
            double gu = k * s;
            double hu = k * s + k * k * h;
            double step = hu < 0 ? -gu / hu : (gu > 0 ? 1.0 : -1.0);
            step = Math.max(-3, Math.min(3, step));
            double uNew = u + step;
            double llNew = logLik(y, mu, Math.exp(uNew));
            int halvings = 0;
            while (!(llNew >= ll - 1e-12 * Math.abs(ll)) && halvings < 40) {
                step *= 0.5;
                uNew = u + step;
                llNew = logLik(y, mu, Math.exp(uNew));
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
