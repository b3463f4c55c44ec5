package org.incipit.core.likelihood;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

import org.apache.commons.numbers.gamma.Digamma;
import org.apache.commons.numbers.gamma.LogGamma;
import org.apache.commons.numbers.gamma.Trigamma;

/** Log-likelihoods written out by hand for the engine tests, on natural parameters. */
final class TestLikelihoods {

    private TestLikelihoods() {
    }

    /** Normal(mean, variance); natural (mean, variance). */
    static LogLikelihood normal(double[] x) {
        return new LogLikelihood() {
            public int dimension() {
                return 2;
            }

            public double value(double[] t) {
                return valueAndGradient(t, new double[2]);
            }

            public double valueAndGradient(double[] t, double[] g) {
                double mu = t[0];
                double v = t[1];
                if (!(v > 0)) {
                    return Double.NEGATIVE_INFINITY;
                }
                double s = 0;
                double ss = 0;
                for (double xi : x) {
                    s += xi - mu;
                    ss += (xi - mu) * (xi - mu);
                }
                int n = x.length;
                g[0] = s / v;
                g[1] = -n / (2 * v) + ss / (2 * v * v);
                return -0.5 * n * Math.log(2 * Math.PI * v) - ss / (2 * v);
            }
        };
    }

    /** Exponential(rate); natural (rate). */
    static LogLikelihood exponential(double[] x) {
        double sum = 0;
        for (double xi : x) {
            sum += xi;
        }
        double total = sum;
        int n = x.length;
        return new LogLikelihood() {
            public int dimension() {
                return 1;
            }

            public double value(double[] t) {
                return valueAndGradient(t, new double[1]);
            }

            public double valueAndGradient(double[] t, double[] g) {
                double r = t[0];
                if (!(r > 0)) {
                    return Double.NEGATIVE_INFINITY;
                }
                g[0] = n / r - total;
                return n * Math.log(r) - r * total;
            }
        };
    }

    /** Poisson regression log mu = b0 + b1 z, with analytic Hessian; natural = unconstrained. */
    static LogLikelihood poissonRegression(double[] z, int[] y) {
        return new LogLikelihood() {
            public int dimension() {
                return 2;
            }

            public double value(double[] t) {
                return valueAndGradient(t, new double[2]);
            }

            public double valueAndGradient(double[] t, double[] g) {
                double v = 0;
                g[0] = 0;
                g[1] = 0;
                for (int i = 0; i < z.length; i++) {
                    double eta = t[0] + t[1] * z[i];
                    double mu = Math.exp(eta);
                    v += y[i] * eta - mu - LogGamma.value(y[i] + 1.0);
                    g[0] += y[i] - mu;
                    g[1] += (y[i] - mu) * z[i];
                }
                return v;
            }

            @Override
            public boolean hasHessian() {
                return true;
            }

            @Override
            public void hessian(double[] t, double[] h) {
                java.util.Arrays.fill(h, 0);
                for (int i = 0; i < z.length; i++) {
                    double mu = Math.exp(t[0] + t[1] * z[i]);
                    h[0] -= mu;
                    h[1] -= mu * z[i];
                    h[3] -= mu * z[i] * z[i];
                }
                h[2] = h[1];
            }
        };
    }

    /** Weibull(shape k, scale lambda): n log k - n k log lambda + (k-1) sum log x - sum (x/lambda)^k. */
    static LogLikelihood weibull(double[] x) {
        double[] logx = new double[x.length];
        double sl = 0;
        for (int i = 0; i < x.length; i++) {
            logx[i] = Math.log(x[i]);
            sl += logx[i];
        }
        double sumLog = sl;
        int n = x.length;
        return new LogLikelihood() {
            public int dimension() {
                return 2;
            }

            public double value(double[] t) {
                return valueAndGradient(t, new double[2]);
            }

            public double valueAndGradient(double[] t, double[] g) {
                double k = t[0];
                double lam = t[1];
                if (!(k > 0 && lam > 0)) {
                    return Double.NEGATIVE_INFINITY;
                }
                double logLam = Math.log(lam);
                double sp = 0;
                double spl = 0;
                for (double lx : logx) {
                    double z = lx - logLam;
                    double p = Math.exp(k * z);
                    sp += p;
                    spl += p * z;
                }
                g[0] = n / k - n * logLam + sumLog - spl;
                g[1] = (k / lam) * (sp - n);
                return n * Math.log(k) - n * k * logLam + (k - 1) * sumLog - sp;
            }
        };
    }

    /** Gamma(shape a, rate b), with analytic Hessian. */
    static LogLikelihood gamma(double[] x) {
        double s = 0;
        double sl = 0;
        for (double xi : x) {
            s += xi;
            sl += Math.log(xi);
        }
        double sum = s;
        double sumLog = sl;
        int n = x.length;
        return new LogLikelihood() {
            public int dimension() {
                return 2;
            }

            public double value(double[] t) {
                return valueAndGradient(t, new double[2]);
            }

            public double valueAndGradient(double[] t, double[] g) {
                double a = t[0];
                double b = t[1];
                if (!(a > 0 && b > 0)) {
                    return Double.NEGATIVE_INFINITY;
                }
                g[0] = n * Math.log(b) - n * Digamma.value(a) + sumLog;
                g[1] = n * a / b - sum;
                return n * a * Math.log(b) - n * LogGamma.value(a) + (a - 1) * sumLog - b * sum;
            }

            @Override
            public boolean hasHessian() {
                return true;
            }

            @Override
            public void hessian(double[] t, double[] h) {
                h[0] = -n * Trigamma.value(t[0]);
                h[1] = n / t[1];
                h[2] = h[1];
                h[3] = -n * t[0] / (t[1] * t[1]);
            }
        };
    }

    /** Binomial x of n, natural p. */
    static LogLikelihood binomial(int x, int n) {
        return new LogLikelihood() {
            public int dimension() {
                return 1;
            }

            public double value(double[] t) {
                return valueAndGradient(t, new double[1]);
            }

            public double valueAndGradient(double[] t, double[] g) {
                double p = t[0];
                if (!(p > 0 && p < 1)) {
                    return Double.NEGATIVE_INFINITY;
                }
                g[0] = x / p - (n - x) / (1 - p);
                return x * Math.log(p) + (n - x) * Math.log1p(-p);
            }
        };
    }

    /** Reads one column of doubles, skipping '#' lines. */
    static double[] readColumn(String resource) {
        List<Double> v = new ArrayList<>();
        for (String line : lines(resource)) {
            if (!line.startsWith("#") && !line.isBlank()) {
                v.add(Double.parseDouble(line.trim()));
            }
        }
        return v.stream().mapToDouble(Double::doubleValue).toArray();
    }

    /** Reads key,value lines after the "key,value" header. */
    static Map<String, Double> readReference(String resource) {
        Map<String, Double> m = new HashMap<>();
        for (String line : lines(resource)) {
            if (line.startsWith("#") || line.isBlank() || line.equals("key,value")) {
                continue;
            }
            String[] kv = line.split(",");
            m.put(kv[0], Double.parseDouble(kv[1]));
        }
        return m;
    }

    private static List<String> lines(String resource) {
        try (InputStream in = TestLikelihoods.class.getResourceAsStream(resource)) {
            if (in == null) {
                throw new IllegalStateException("missing test resource " + resource);
            }
            BufferedReader r = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8));
            return r.lines().toList();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
