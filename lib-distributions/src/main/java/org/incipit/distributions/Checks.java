package org.incipit.distributions;

/** Argument checks shared by the families. NaN fails every check. */
final class Checks {
    private Checks() {
    }

    static double positiveFinite(String name, double x) {
        if (!(x > 0 && x < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(name + " must be finite and > 0, was " + x);
        }
        return x;
    }

    static double finite(String name, double x) {
        if (!(Math.abs(x) < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(name + " must be finite, was " + x);
        }
        return x;
    }

    static double probability(String name, double p) {
        if (!(p >= 0 && p <= 1)) {
            throw new IllegalArgumentException(name + " must be in [0, 1], was " + p);
        }
        return p;
    }

    static double notNaN(String name, double x) {
        if (Double.isNaN(x)) {
            throw new IllegalArgumentException(name + " must not be NaN, was " + x);
        }
        return x;
    }

    static int nonNegative(String name, int n) {
        if (n < 0) {
            throw new IllegalArgumentException(name + " must be >= 0, was " + n);
        }
        return n;
    }

    static void length(double[] parameters, int n, String names) {
        if (parameters == null || parameters.length != n) {
            throw new IllegalArgumentException("parameters must be " + n + " values (" + names + "), was "
                    + (parameters == null ? "null" : parameters.length + " values"));
        }
    }
}
