package org.incipit.core.estimate.delay;

/**
 * Gauss&ndash;Legendre nodes and weights on [0, 1], computed once by Newton's method on the
 * Legendre recurrence (Press et al. 2007, <i>Numerical Recipes</i> 3rd ed., sec. 4.6.1).
 */
final class GaussLegendre {

    /** Number of nodes used by the delay likelihoods. */
    static final int NODES = 32;

    /** Nodes on (0, 1), increasing. */
    static final double[] X = new double[NODES];
    /** Weights, summing to 1. */
    static final double[] W = new double[NODES];

    static {
        int n = NODES;
        for (int i = 0; i < (n + 1) / 2; i++) {
            double z = Math.cos(Math.PI * (i + 0.75) / (n + 0.5));
            double pp;
            while (true) {
                double p1 = 1;
                double p2 = 0;
                for (int j = 0; j < n; j++) {
                    double p3 = p2;
                    p2 = p1;
                    p1 = ((2 * j + 1) * z * p2 - j * p3) / (j + 1);
                }
                pp = n * (z * p1 - p2) / (z * z - 1);
                double z1 = z;
                z = z1 - p1 / pp;
                if (Math.abs(z - z1) <= 1e-15) {
                    break;
                }
            }
            double w = 2 / ((1 - z * z) * pp * pp);
            // map [-1, 1] to [0, 1]
            X[i] = 0.5 * (1 - z);
            X[n - 1 - i] = 0.5 * (1 + z);
            W[i] = 0.5 * w;
            W[n - 1 - i] = 0.5 * w;
        }
    }

    private GaussLegendre() {
    }
}
