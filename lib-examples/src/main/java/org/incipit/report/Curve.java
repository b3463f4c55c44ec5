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

    /**
     * Samples a function on an even grid, e.g. a fitted density:
     * {@code Curve.of("gamma fit", fit::density, 0, 20, 200)}.
     *
     * @param name   legend text
     * @param f      the function; its values must be finite on the grid
     * @param from   first abscissa, finite
     * @param to     last abscissa, finite, &gt; {@code from}
     * @param points number of grid points, &ge; 2
     * @return the sampled curve
     * @throws IllegalArgumentException if an argument is out of range or {@code f} is not finite
     */
    public static Curve of(String name, java.util.function.DoubleUnaryOperator f, double from, double to,
                           int points) {
        if (!(Double.isFinite(from) && Double.isFinite(to) && to > from)) {
            throw new IllegalArgumentException("need finite from < to, was [" + from + ", " + to + "]");
        }
        if (points < 2) {
            throw new IllegalArgumentException("points must be >= 2, was " + points);
        }
        double[] x = new double[points];
        double[] y = new double[points];
        for (int i = 0; i < points; i++) {
            x[i] = i == points - 1 ? to : from + (to - from) * i / (points - 1);
            y[i] = f.applyAsDouble(x[i]);
        }
        return new Curve(name, x, y);
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
