package org.incipit.distributions;

/** A base distribution whose tilted partial moments can be integrated in log-space. */
interface LogSpaceIntegrable {
    /**
     * @param s     tilt / transform argument (s must lie where the transform is finite)
     * @param m     moment order 0, 1 or 2
     * @param x     split point, &ge; 0
     * @param upper integrate over [x, infinity) when true, else over [0, x]
     * @return log of the integral of t^m exp(-s t) f(t) over the chosen range
     */
    double logPartialTransform(double s, int m, double x, boolean upper);
}
