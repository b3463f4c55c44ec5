package org.incipit.core.likelihood;

import java.util.Arrays;
import java.util.List;

/**
 * Named natural parameters, each with its own {@link ParameterTransform} to the unconstrained
 * scale on which maximisation runs. Immutable, thread-safe.
 *
 * <p>Because every transform acts on one coordinate, the Jacobian dx/du is diagonal; the
 * gradient chain rule is dl/du_i = dl/dx_i &middot; dx_i/du_i.
 */
public final class Parameterisation {

    private final String[] names;
    private final ParameterTransform[] transforms;

    private Parameterisation(String[] names, ParameterTransform[] transforms) {
        this.names = names;
        this.transforms = transforms;
    }

    /**
     * @param names      distinct non-blank parameter names
     * @param transforms one transform per name
     * @return the parameterisation
     * @throws IllegalArgumentException if lengths differ, a name is blank or repeated, or the list is empty
     */
    public static Parameterisation of(List<String> names, List<ParameterTransform> transforms) {
        if (names.isEmpty() || names.size() != transforms.size()) {
            throw new IllegalArgumentException("names and transforms must be non-empty and of equal length, were "
                    + names.size() + " and " + transforms.size());
        }
        String[] n = names.toArray(new String[0]);
        for (int i = 0; i < n.length; i++) {
            if (n[i] == null || n[i].isBlank()) {
                throw new IllegalArgumentException("parameter name " + i + " must be non-blank, was '" + n[i] + "'");
            }
            for (int j = 0; j < i; j++) {
                if (n[i].equals(n[j])) {
                    throw new IllegalArgumentException("parameter names must be distinct, '" + n[i] + "' repeats");
                }
            }
            if (transforms.get(i) == null) {
                throw new IllegalArgumentException("transform for '" + n[i] + "' must not be null");
            }
        }
        return new Parameterisation(n, transforms.toArray(new ParameterTransform[0]));
    }

    /** @return number of parameters */
    public int dimension() {
        return names.length;
    }

    /** @return the parameter names, in order (unmodifiable) */
    public List<String> names() {
        return List.of(names);
    }

    /**
     * @param name a parameter name
     * @return its index
     * @throws IllegalArgumentException if unknown
     */
    public int indexOf(String name) {
        for (int i = 0; i < names.length; i++) {
            if (names[i].equals(name)) {
                return i;
            }
        }
        throw new IllegalArgumentException("unknown parameter '" + name + "', known: " + Arrays.toString(names));
    }

    /** @param i index in [0, dimension) @return the transform of parameter i */
    public ParameterTransform transform(int i) {
        return transforms[i];
    }

    /**
     * @param natural natural parameters inside their domains; not modified
     * @return a new unconstrained vector
     */
    public double[] toUnconstrained(double[] natural) {
        checkLength("natural", natural);
        double[] u = new double[names.length];
        for (int i = 0; i < u.length; i++) {
            try {
                u[i] = transforms[i].toUnconstrained(natural[i]);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(names[i] + ": " + e.getMessage(), e);
            }
        }
        return u;
    }

    /**
     * @param theta unconstrained vector; not modified
     * @return a new natural vector
     */
    public double[] toNatural(double[] theta) {
        checkLength("theta", theta);
        double[] x = new double[names.length];
        toNatural(theta, x);
        return x;
    }

    void toNatural(double[] theta, double[] out) {
        for (int i = 0; i < out.length; i++) {
            out[i] = transforms[i].toNatural(theta[i]);
        }
    }

    /**
     * @param theta unconstrained vector; not modified
     * @return diagonal of the Jacobian dx/du at theta (new array)
     */
    public double[] jacobianDiagonal(double[] theta) {
        checkLength("theta", theta);
        double[] d = new double[names.length];
        for (int i = 0; i < d.length; i++) {
            d[i] = transforms[i].derivative(theta[i]);
        }
        return d;
    }

    /**
     * Wraps a log-likelihood written on the natural parameters into one on the unconstrained
     * scale. The natural likelihood's gradient is mapped by the chain rule; if it has an
     * analytic Hessian, so does the wrapper
     * (H_u = J H_x J + diag(g_x &middot; d&sup2;x/du&sup2;)).
     *
     * @param natural likelihood over natural parameters, same dimension
     * @return the unconstrained likelihood
     * @throws IllegalArgumentException if dimensions differ
     */
    public LogLikelihood unconstrained(LogLikelihood natural) {
        if (natural.dimension() != names.length) {
            throw new IllegalArgumentException("likelihood dimension must be " + names.length + ", was "
                    + natural.dimension());
        }
        return new Unconstrained(natural);
    }

    private void checkLength(String what, double[] v) {
        if (v.length != names.length) {
            throw new IllegalArgumentException(what + " must have length " + names.length + ", was " + v.length);
        }
    }

    @Override
    public String toString() {
        StringBuilder b = new StringBuilder("Parameterisation[");
        for (int i = 0; i < names.length; i++) {
            b.append(i == 0 ? "" : ", ").append(names[i]).append(": ").append(transforms[i]);
        }
        return b.append(']').toString();
    }

    private final class Unconstrained implements LogLikelihood {
        private final LogLikelihood natural;

        Unconstrained(LogLikelihood natural) {
            this.natural = natural;
        }

        @Override
        public int dimension() {
            return names.length;
        }

        @Override
        public double value(double[] theta) {
            double[] x = new double[names.length];
            toNatural(theta, x);
            return natural.value(x);
        }

        @Override
        public double valueAndGradient(double[] theta, double[] gradientOut) {
            double[] x = new double[names.length];
            toNatural(theta, x);
            double v = natural.valueAndGradient(x, gradientOut);
            for (int i = 0; i < x.length; i++) {
                gradientOut[i] *= transforms[i].derivative(theta[i]);
            }
            return v;
        }

        @Override
        public boolean hasHessian() {
            return natural.hasHessian();
        }

        @Override
        public void hessian(double[] theta, double[] out) {
            int k = names.length;
            double[] x = new double[k];
            toNatural(theta, x);
            double[] g = new double[k];
            natural.valueAndGradient(x, g);
            natural.hessian(x, out);
            for (int i = 0; i < k; i++) {
                double di = transforms[i].derivative(theta[i]);
                for (int j = 0; j < k; j++) {
                    out[i * k + j] *= di * transforms[j].derivative(theta[j]);
                }
                out[i * k + i] += g[i] * transforms[i].secondDerivative(theta[i]);
            }
        }
    }
}
