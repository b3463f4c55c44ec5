package org.incipit.core.likelihood;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.CholeskyDecomposition_F64;

/** Numerical helpers shared by the maximiser and the fit. Package-private. */
final class Derivatives {

    /** Cube root of the double epsilon: optimal relative step for central differences. */
    static final double CENTRAL_STEP = Math.cbrt(Math.ulp(1.0));

    private Derivatives() {
    }

    /**
     * Hessian of the log-likelihood at theta: analytic if available, else central differences
     * of the analytic gradient with step h_j = eps^(1/3) max(1, |theta_j|), symmetrised.
     * Returns null if any needed gradient is not finite.
     */
    static double[] hessian(LogLikelihood ll, double[] theta) {
        int k = theta.length;
        double[] h = new double[k * k];
        if (ll.hasHessian()) {
            ll.hessian(theta.clone(), h);
        } else {
            double[] t = theta.clone();
            double[] gp = new double[k];
            double[] gm = new double[k];
            for (int j = 0; j < k; j++) {
                double step = CENTRAL_STEP * Math.max(1, Math.abs(theta[j]));
                double tj = theta[j];
                t[j] = tj + step;
                double vp = ll.valueAndGradient(t, gp);
                t[j] = tj - step;
                double vm = ll.valueAndGradient(t, gm);
                t[j] = tj;
                if (!Double.isFinite(vp) || !Double.isFinite(vm)) {
                    return null;
                }
                double width = (tj + step) - (tj - step);
                for (int i = 0; i < k; i++) {
                    h[i * k + j] = (gp[i] - gm[i]) / width;
                }
            }
        }
        for (int i = 0; i < k; i++) {
            for (int j = 0; j < i; j++) {
                double s = 0.5 * (h[i * k + j] + h[j * k + i]);
                h[i * k + j] = s;
                h[j * k + i] = s;
            }
        }
        for (double v : h) {
            if (!Double.isFinite(v)) {
                return null;
            }
        }
        return h;
    }

    /** Inverse of a symmetric positive-definite matrix (row-major), or null if not PD. */
    static double[] inverseIfPositiveDefinite(double[] a, int k) {
        DMatrixRMaj m = new DMatrixRMaj(k, k, true, a);
        CholeskyDecomposition_F64<DMatrixRMaj> chol = DecompositionFactory_DDRM.chol(k, true);
        if (!chol.decompose(m.copy())) {
            return null;
        }
        DMatrixRMaj inv = new DMatrixRMaj(k, k);
        if (!CommonOps_DDRM.invertSPD(m.copy(), inv)) {
            return null;
        }
        double[] out = inv.getData().clone();
        for (int i = 0; i < k; i++) {
            if (!(out[i * k + i] > 0) || !Double.isFinite(out[i * k + i])) {
                return null;
            }
            for (int j = 0; j < i; j++) {
                double s = 0.5 * (out[i * k + j] + out[j * k + i]);
                out[i * k + j] = s;
                out[j * k + i] = s;
            }
        }
        return out;
    }

    /** Central-difference gradient of a scalar function, step eps^(1/3) max(1,|x_j|). */
    static double[] numericalGradient(java.util.function.ToDoubleFunction<double[]> f, double[] x) {
        double[] g = new double[x.length];
        double[] t = x.clone();
        for (int j = 0; j < x.length; j++) {
            double step = CENTRAL_STEP * Math.max(1, Math.abs(x[j]));
            double xj = x[j];
            t[j] = xj + step;
            double fp = f.applyAsDouble(t.clone());
            t[j] = xj - step;
            double fm = f.applyAsDouble(t.clone());
            t[j] = xj;
            g[j] = (fp - fm) / ((xj + step) - (xj - step));
        }
        return g;
    }
}
