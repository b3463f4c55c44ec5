package org.incipit.core.observe;

import java.util.Arrays;

/** Shared checks and growable arrays for the builders. */
final class Rows {

    private Rows() {
    }

    static String id(String id, String what) {
        if (id == null || id.isBlank()) {
            throw new ObservationException("id", what + " id must not be empty");
        }
        return id;
    }

    static double finite(String field, double value, String what) {
        if (!Double.isFinite(value)) {
            throw new ObservationException(field, what + ": " + field + " must be a finite number of days, was "
                    + value);
        }
        return value;
    }

    static String quote(String id) {
        return "'" + id + "'";
    }

    /** Growable double array. */
    static final class Doubles {
        private double[] a;
        private int n;

        Doubles() {
            this(16);
        }

        /** Room for {@code capacity} elements before the storage grows. */
        Doubles(int capacity) {
            a = new double[Math.max(16, capacity)];
        }

        void add(double x) {
            if (n == a.length) {
                a = Arrays.copyOf(a, 2 * n);
            }
            a[n++] = x;
        }

        double get(int i) {
            return a[i];
        }

        int size() {
            return n;
        }

        double[] toArray() {
            return Arrays.copyOf(a, n);
        }

        /** Keeps the first {@code size} elements, {@code 0 <= size <= size()}. */
        void truncate(int size) {
            n = size;
        }
    }

    /** Growable int array. */
    static final class Ints {
        private int[] a;
        private int n;

        Ints() {
            this(16);
        }

        /** Room for {@code capacity} elements before the storage grows. */
        Ints(int capacity) {
            a = new int[Math.max(16, capacity)];
        }

        void add(int x) {
            if (n == a.length) {
                a = Arrays.copyOf(a, 2 * n);
            }
            a[n++] = x;
        }

        int get(int i) {
            return a[i];
        }

        int size() {
            return n;
        }

        int[] toArray() {
            return Arrays.copyOf(a, n);
        }

        /** Keeps the first {@code size} elements, {@code 0 <= size <= size()}. */
        void truncate(int size) {
            n = size;
        }
    }

    /** Growable boolean array. */
    static final class Booleans {
        private boolean[] a = new boolean[16];
        private int n;

        void add(boolean x) {
            if (n == a.length) {
                a = Arrays.copyOf(a, 2 * n);
            }
            a[n++] = x;
        }

        int size() {
            return n;
        }

        boolean[] toArray() {
            return Arrays.copyOf(a, n);
        }
    }
}
