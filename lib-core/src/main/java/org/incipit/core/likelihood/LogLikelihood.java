package org.incipit.core.likelihood;

/**
 * A log-likelihood over a parameter vector {@code theta} of fixed {@link #dimension()}.
 *
 * <p>Implementations used by the {@link Maximiser} are defined over an unconstrained vector
 * (every point of R^k is admissible); {@link Parameterisation#unconstrained(LogLikelihood)}
 * turns a likelihood written on natural parameters into one. The value may be
 * {@code -Infinity} (outside the support of the data); it must never be {@code +Infinity}.
 * NaN is treated by the maximiser like {@code -Infinity} (a rejected step).
 *
 * <p>Implementations must not modify {@code theta} and must be safe to call from several
 * threads at once if they are used in a bootstrap or in multi-start maximisation (stateless
 * implementations over prepared primitive arrays are).
 */
public interface LogLikelihood {

    /** @return number of parameters, &ge; 1 */
    int dimension();

    /**
     * @param theta parameter vector of length {@link #dimension()}; not modified
     * @return the log-likelihood, finite or {@code -Infinity}
     */
    double value(double[] theta);

    /**
     * Value and analytic gradient.
     *
     * @param theta       parameter vector; not modified
     * @param gradientOut receives d value / d theta (length {@link #dimension()}); its content
     *                    is unspecified when the value is not finite
     * @return the log-likelihood, as {@link #value(double[])}
     */
    double valueAndGradient(double[] theta, double[] gradientOut);

    /** @return true if {@link #hessian(double[], double[])} is implemented analytically. */
    default boolean hasHessian() {
        return false;
    }

    /**
     * Analytic Hessian of the log-likelihood, row-major.
     *
     * @param theta        parameter vector; not modified
     * @param outRowMajor  receives the k&times;k second derivatives, row-major (length k*k)
     * @throws UnsupportedOperationException if {@link #hasHessian()} is false
     */
    default void hessian(double[] theta, double[] outRowMajor) {
        throw new UnsupportedOperationException("no analytic Hessian; hasHessian() is false");
    }

    /**
     * Value, gradient and analytic Hessian at one point, for Newton's method, which needs all
     * three at every accepted point. The default calls {@link #valueAndGradient} and then, if
     * the value is finite, {@link #hessian}; kernels that obtain the three in one pass over the
     * data override it.
     *
     * @param theta       parameter vector; not modified
     * @param gradientOut receives the gradient (as {@link #valueAndGradient})
     * @param hessianOut  receives the Hessian, row-major, when the value is finite; otherwise
     *                    its content is unspecified
     * @return the log-likelihood, as {@link #value(double[])}
     * @throws UnsupportedOperationException if {@link #hasHessian()} is false
     */
    default double valueGradientHessian(double[] theta, double[] gradientOut, double[] hessianOut) {
        double v = valueAndGradient(theta, gradientOut);
        if (Double.isFinite(v)) {
            hessian(theta, hessianOut);
        }
        return v;
    }
}
