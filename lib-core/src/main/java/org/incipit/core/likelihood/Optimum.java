package org.incipit.core.likelihood;

import java.util.Arrays;

/**
 * Result of a maximisation. Non-convergence is a status ({@link #converged()} false, with a
 * {@link #message()}), never a silent number.
 *
 * @param argmax       best point found (unconstrained scale); copied in and out
 * @param value        log-likelihood at {@code argmax}, finite
 * @param gradient     gradient at {@code argmax}; copied in and out
 * @param iterations   iterations of the final (best) run, &ge; 0
 * @param evaluations  likelihood evaluations over all runs (value or value+gradient), &ge; 1
 * @param converged    true if the convergence criterion of {@link Maximiser} was met
 * @param message      what stopped the iteration
 */
public record Optimum(double[] argmax, double value, double[] gradient, int iterations, int evaluations,
                      boolean converged, String message) {

    public Optimum {
        if (argmax == null || gradient == null || argmax.length != gradient.length || argmax.length == 0) {
            throw new IllegalArgumentException("argmax and gradient must be non-empty and of equal length");
        }
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException("value must be finite, was " + value);
        }
        if (iterations < 0 || evaluations < 1) {
            throw new IllegalArgumentException("iterations must be >= 0 and evaluations >= 1, were "
                    + iterations + ", " + evaluations);
        }
        argmax = argmax.clone();
        gradient = gradient.clone();
        message = message == null ? "" : message;
    }

    @Override
    public double[] argmax() {
        return argmax.clone();
    }

    @Override
    public double[] gradient() {
        return gradient.clone();
    }

    /** @return Euclidean norm of {@link #gradient()} */
    public double gradientNorm() {
        double s = 0;
        for (double g : gradient) {
            s += g * g;
        }
        return Math.sqrt(s);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Optimum other && Arrays.equals(argmax, other.argmax) && value == other.value
                && Arrays.equals(gradient, other.gradient) && iterations == other.iterations
                && evaluations == other.evaluations && converged == other.converged
                && message.equals(other.message);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(argmax) + Double.hashCode(value);
    }

    @Override
    public String toString() {
        return "Optimum[argmax=" + Arrays.toString(argmax) + ", value=" + value + ", |gradient|="
                + gradientNorm() + ", iterations=" + iterations + ", evaluations=" + evaluations
                + ", converged=" + converged + ", message=" + message + "]";
    }
}
