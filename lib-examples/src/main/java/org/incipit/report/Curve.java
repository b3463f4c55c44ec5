package org.incipit.report;

/**
 * A named curve {@code y(x)} for a figure, e.g. a fitted density or a fitted growth line.
 *
 * @param name legend text, not blank
 * @param x    abscissae, finite, at least two; copied
 * @param y    ordinates, same length, finite; copied
 */
public record Curve(String name, double[] x, double[] y) {

    /**
     * Validates and copies the arrays.
     *
     * @param name legend text, not blank
     * @param x    abscissae, finite, at least two; copied
     * @param y    ordinates, same length, finite; copied
     * @throws IllegalArgumentException if a component is invalid
     */
    public Curve {
        if (name == null || name.isBlank()) {
            throw new IllegalArgumentException("curve name must not be blank");
        }
        if (x == null || y == null || x.length != y.length || x.length < 2) {
            throw new IllegalArgumentException("curve '" + name + "' needs x and y of the same length >= 2, had "
                    + (x == null ? "null" : x.length) + " and " + (y == null ? "null" : y.length));
        }
        Charts.requireFinite("curve '" + name + "' x", x);
        Charts.requireFinite("curve '" + name + "' y", y);
        x = x.clone();
        y = y.clone();
    }

    /** @return a copy of the abscissae */
    @Override
    public double[] x() {
        return x.clone();
    }

    /** @return a copy of the ordinates */
    @Override
    public double[] y() {
        return y.clone();
    }
}
