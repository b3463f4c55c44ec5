package org.incipit.core.estimate.delay;

import java.util.Arrays;

import org.apache.commons.numbers.gamma.Digamma;
import org.apache.commons.numbers.gamma.Erfc;
import org.apache.commons.numbers.gamma.Erfcx;
import org.apache.commons.numbers.gamma.LogGamma;
import org.incipit.core.likelihood.LogLikelihood;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.ParametricDelay;

/**
 * Log-likelihood of delay observations over a family's natural parameters, as a sum of
 * weighted terms of a few kinds (equal observations are merged into one weighted term, so
 * day-level data cost one term per distinct day difference). Analytic gradient from the
 * family's log-density, log-cdf and log-survival gradients; the growth normaliser
 * log M(&minus;r) is differentiated numerically (five-point central differences). Values
 * outside the family's domain are {@code -Infinity}. Immutable, thread-safe.
 */
final class DelayLogLikelihood implements LogLikelihood {

    private final DelayFamily family;
    private final int k;
    private final double constant;
    // exact delays: w log f(x)
    private final double[] densX;
    private final double[] densW;
    // right-censored: w log S(x)
    private final double[] survX;
    private final double[] survW;
    // left-censored: w log F(x); truncation: -w log F(x) (merged: signed weights)
    private final double[] cdfX;
    private final double[] cdfW;
    // interval-censored: w log(F(R) - F(L))
    private final double[] intL;
    private final double[] intR;
    private final double[] intW;
    // daily: w log P(k), k = day difference, primary uniform in its day
    private final int[] dayK;
    private final double[] dayW;
    // daily: w log A(K) (A = P(day difference <= K)), signed weights (truncation: negative)
    private final int[] dayCdfK;
    private final double[] dayCdfW;
    // daily censored: w log(1 - A(K))
    private final int[] daySurvK;
    private final double[] daySurvW;
    // exposure density proportional to exp(r e) in a window: w log int_lo^hi exp(-r x) f(x) dx
    private final double[] expLo;
    private final double[] expHi;
    private final double[] expW;
    private final double exposureRate;
    // growth tilt normaliser: -tiltWeight * log M(-tiltRate)
    private final double tiltRate;
    private final double tiltWeight;
    // closed-form paths: density terms through sufficient statistics (gamma, lognormal), and
    // lognormal cdf/survival terms fused over precomputed log-delays
    private final Kind kind;
    private final double densTotal;  // sum of density weights
    private final double densLog;    // sum w log x
    private final double densLog2;   // sum w (log x)^2 (lognormal)
    private final double densLin;    // sum w x (gamma)
    private final double[] cdfLogX;  // log of cdfX (lognormal)
    private final double[] survLogX; // log of survX (lognormal)

    private enum Kind { GENERIC, GAMMA, LOGNORMAL }

    private static final double SQRT2 = Math.sqrt(2);
    private static final double HALF_LOG_2PI = 0.5 * Math.log(2 * Math.PI);
    private static final double SQRT_2_OVER_PI = Math.sqrt(2 / Math.PI);

    private DelayLogLikelihood(Builder b) {
        this.family = b.family;
        this.k = b.family.dimension();
        this.constant = b.constant;
        double[][] d = merge(b.densX, b.densW);
        densX = d[0];
        densW = d[1];
        double[][] s = merge(b.survX, b.survW);
        survX = s[0];
        survW = s[1];
        double[][] c = merge(b.cdfX, b.cdfW);
        cdfX = c[0];
        cdfW = c[1];
        intL = b.intL.toArray();
        intR = b.intR.toArray();
        intW = b.intW.toArray();
        double[][] dk = merge(b.dayK, b.dayW);
        dayK = toInt(dk[0]);
        dayW = dk[1];
        double[][] dc = merge(b.dayCdfK, b.dayCdfW);
        dayCdfK = toInt(dc[0]);
        dayCdfW = dc[1];
        double[][] ds = merge(b.daySurvK, b.daySurvW);
        daySurvK = toInt(ds[0]);
        daySurvW = ds[1];
        expLo = b.expLo.toArray();
        expHi = b.expHi.toArray();
        expW = b.expW.toArray();
        exposureRate = b.exposureRate;
        tiltRate = b.tiltRate;
        tiltWeight = b.tiltWeight;
        kind = !b.closedForm ? Kind.GENERIC : family == DelayFamilies.LOGNORMAL ? Kind.LOGNORMAL
                : family == DelayFamilies.GAMMA ? Kind.GAMMA : Kind.GENERIC;
        double tw = 0;
        double sl = 0;
        double sl2 = 0;
        double sx = 0;
        for (int i = 0; i < densX.length; i++) {
            double lx = Math.log(densX[i]);
            tw += densW[i];
            sl += densW[i] * lx;
            sl2 += densW[i] * lx * lx;
            sx += densW[i] * densX[i];
        }
        densTotal = tw;
        densLog = sl;
        densLog2 = sl2;
        densLin = sx;
        cdfLogX = logs(cdfX);
        survLogX = logs(survX);
    }

    /**
     * Analytic Hessian only for the closed-form lognormal path with density, log-cdf and
     * log-survival terms (the right-truncated and right-censored fits of exact pairs).
     */
    @Override
    public boolean hasHessian() {
        return kind == Kind.LOGNORMAL && intL.length == 0 && dayK.length == 0 && dayCdfK.length == 0
                && daySurvK.length == 0 && expLo.length == 0 && tiltWeight == 0;
    }

    /**
     * Second derivatives in (meanLog, sdLog): with z = (log x - mu)/sigma and
     * lambda = phi/Phi, d log Phi / dz = lambda, d^2 log Phi / dz^2 = -lambda (z + lambda).
     */
    @Override
    public void hessian(double[] theta, double[] out) {
        if (!hasHessian()) {
            throw new UnsupportedOperationException("no analytic Hessian for this likelihood");
        }
        double mu = theta[0];
        double sigma = theta[1];
        double s2 = sigma * sigma;
        double hmm = 0;
        double hms = 0;
        double hss = 0;
        if (densX.length > 0) {
            double q = densLog2 - 2 * mu * densLog + mu * mu * densTotal;
            hmm += -densTotal / s2;
            hms += -2 * (densLog - mu * densTotal) / (s2 * sigma);
            hss += densTotal / s2 - 3 * q / (s2 * s2);
        }
        for (int i = 0; i < cdfLogX.length; i++) {
            double z = (cdfLogX[i] - mu) / sigma;
            double lambda = millsInverse(z);
            double d2 = -lambda * (z + lambda);
            double w = cdfW[i] / s2;
            hmm += w * d2;
            hms += w * (d2 * z + lambda);
            hss += w * (d2 * z * z + 2 * lambda * z);
        }
        for (int i = 0; i < survLogX.length; i++) {
            double v = -(survLogX[i] - mu) / sigma;
            double lambda = millsInverse(v);
            double d2 = -lambda * (v + lambda);
            double w = survW[i] / s2;
            hmm += w * d2;
            hms += -w * (d2 * v + lambda);
            hss += w * (d2 * v * v + 2 * lambda * v);
        }
        out[0] = hmm;
        out[1] = hms;
        out[2] = hms;
        out[3] = hss;
    }

    /**
     * log Phi(w), and phi(w)/Phi(w) into mills[0], from one erfc / erfcx value (erfcx below
     * w = -5, where Phi underflows: log Phi = log(erfcx/2) - w^2/2, phi/Phi = sqrt(2/pi)/erfcx).
     */
    private static double logPhiWithMills(double w, double[] mills) {
        if (w < -5) {
            double e = Erfcx.value(-w / SQRT2);
            mills[0] = SQRT_2_OVER_PI / e;
            return Math.log(0.5 * e) - 0.5 * w * w;
        }
        double c = 0.5 * Erfc.value(-w / SQRT2);
        mills[0] = Math.exp(-0.5 * w * w - HALF_LOG_2PI) / c;
        return Math.log(c);
    }

    private static double millsInverse(double w) {
        if (w < -5) {
            return SQRT_2_OVER_PI / Erfcx.value(-w / SQRT2);
        }
        return Math.exp(-0.5 * w * w - HALF_LOG_2PI) / (0.5 * Erfc.value(-w / SQRT2));
    }

    private static double[] logs(double[] x) {
        double[] l = new double[x.length];
        for (int i = 0; i < x.length; i++) {
            l[i] = Math.log(x[i]);
        }
        return l;
    }

    /** Same likelihood without the closed-form paths (for tests). */
    DelayLogLikelihood generic() {
        return new DelayLogLikelihood(this);
    }

    private DelayLogLikelihood(DelayLogLikelihood o) {
        family = o.family;
        k = o.k;
        constant = o.constant;
        densX = o.densX;
        densW = o.densW;
        survX = o.survX;
        survW = o.survW;
        cdfX = o.cdfX;
        cdfW = o.cdfW;
        intL = o.intL;
        intR = o.intR;
        intW = o.intW;
        dayK = o.dayK;
        dayW = o.dayW;
        dayCdfK = o.dayCdfK;
        dayCdfW = o.dayCdfW;
        daySurvK = o.daySurvK;
        daySurvW = o.daySurvW;
        expLo = o.expLo;
        expHi = o.expHi;
        expW = o.expW;
        exposureRate = o.exposureRate;
        tiltRate = o.tiltRate;
        tiltWeight = o.tiltWeight;
        kind = Kind.GENERIC;
        densTotal = o.densTotal;
        densLog = o.densLog;
        densLog2 = o.densLog2;
        densLin = o.densLin;
        cdfLogX = o.cdfLogX;
        survLogX = o.survLogX;
    }

    static Builder builder(DelayFamily family) {
        return new Builder(family);
    }

    @Override
    public int dimension() {
        return k;
    }

    @Override
    public double value(double[] theta) {
        return evaluate(theta, null);
    }

    @Override
    public double valueAndGradient(double[] theta, double[] gradientOut) {
        return evaluate(theta, gradientOut);
    }

    /** @return the distribution at theta, or null outside the family's domain. */
    ParametricDelay distribution(double[] theta) {
        for (double t : theta) {
            if (!Double.isFinite(t)) {
                return null;
            }
        }
        try {
            return family.of(theta);
        } catch (IllegalArgumentException e) {
            return null;
        }
    }

    private double evaluate(double[] theta, double[] g) {
        ParametricDelay f = distribution(theta);
        if (f == null) {
            return Double.NEGATIVE_INFINITY;
        }
        if (g != null) {
            Arrays.fill(g, 0.0);
        }
        double sum = constant;
        switch (kind) {
            case LOGNORMAL -> sum += lognormalTerms(theta[0], theta[1], g);
            case GAMMA -> {
                sum += gammaDensityTerms(theta[0], theta[1], g);
                sum += genericCdfSurvival(f, g);
            }
            default -> {
                for (int i = 0; i < densX.length; i++) {
                    sum += densW[i] * f.logDensity(densX[i]);
                    if (g != null) {
                        addScaled(g, densW[i], f.logDensityGradient(densX[i]));
                    }
                }
                sum += genericCdfSurvival(f, g);
            }
        }
        double[] tmp = g == null ? null : new double[k];
        for (int i = 0; i < intL.length; i++) {
            sum += intW[i] * logIntervalProbability(f, intL[i], intR[i], tmp);
            if (g != null) {
                addScaled(g, intW[i], tmp);
            }
        }
        for (int i = 0; i < dayK.length; i++) {
            sum += dayW[i] * logDailyMass(f, dayK[i], tmp);
            if (g != null) {
                addScaled(g, dayW[i], tmp);
            }
        }
        for (int i = 0; i < dayCdfK.length; i++) {
            sum += dayCdfW[i] * logDailyCdf(f, dayCdfK[i], tmp, false);
            if (g != null) {
                addScaled(g, dayCdfW[i], tmp);
            }
        }
        for (int i = 0; i < daySurvK.length; i++) {
            sum += daySurvW[i] * logDailyCdf(f, daySurvK[i], tmp, true);
            if (g != null) {
                addScaled(g, daySurvW[i], tmp);
            }
        }
        for (int i = 0; i < expLo.length; i++) {
            sum += expW[i] * logTiltedWindow(f, exposureRate, expLo[i], expHi[i], tmp);
            if (g != null) {
                addScaled(g, expW[i], tmp);
            }
        }
        if (tiltWeight != 0) {
            double lm = logLaplace(f, tiltRate);
            sum -= tiltWeight * lm;
            if (g != null && Double.isFinite(lm)) {
                double[] dl = logLaplaceGradient(theta, tiltRate);
                addScaled(g, -tiltWeight, dl);
            }
        }
        if (Double.isNaN(sum)) {
            return Double.NEGATIVE_INFINITY;
        }
        return sum;
    }

    private double genericCdfSurvival(ParametricDelay f, double[] g) {
        double sum = 0;
        for (int i = 0; i < survX.length; i++) {
            sum += survW[i] * f.logSurvival(survX[i]);
            if (g != null) {
                addScaled(g, survW[i], f.logSurvivalGradient(survX[i]));
            }
        }
        for (int i = 0; i < cdfX.length; i++) {
            sum += cdfW[i] * f.logCdf(cdfX[i]);
            if (g != null) {
                addScaled(g, cdfW[i], f.logCdfGradient(cdfX[i]));
            }
        }
        return sum;
    }

    /**
     * Gamma(shape a, rate b) density terms from sufficient statistics:
     * sum w [a log b - lnGamma(a) + (a - 1) log x - b x].
     */
    private double gammaDensityTerms(double a, double b, double[] g) {
        if (densX.length == 0) {
            return 0;
        }
        double lb = Math.log(b);
        double v = densTotal * (a * lb - LogGamma.value(a)) + (a - 1) * densLog - b * densLin;
        if (g != null) {
            g[0] += densTotal * (lb - Digamma.value(a)) + densLog;
            g[1] += densTotal * a / b - densLin;
        }
        return v;
    }

    /**
     * Lognormal(mu, sigma): density terms from sums of log x and (log x)^2; log-cdf and
     * log-survival terms fused over precomputed log x, with log Phi(w) and phi(w)/Phi(w) from
     * erfc (erfcx below w = -5), the formulas of the distribution layer.
     */
    private double lognormalTerms(double mu, double sigma, double[] g) {
        double sum = 0;
        double g0 = 0;
        double g1 = 0;
        if (densX.length > 0) {
            double q = densLog2 - 2 * mu * densLog + mu * mu * densTotal; // sum w (log x - mu)^2
            sum += -densLog - densTotal * (Math.log(sigma) + HALF_LOG_2PI) - 0.5 * q / (sigma * sigma);
            g0 += (densLog - mu * densTotal) / (sigma * sigma);
            g1 += -densTotal / sigma + q / (sigma * sigma * sigma);
        }
        double[] mills = new double[1];
        for (int i = 0; i < cdfLogX.length; i++) {
            double w = (cdfLogX[i] - mu) / sigma;
            double lp = logPhiWithMills(w, mills);
            double lambda = mills[0];
            sum += cdfW[i] * lp;
            double r = cdfW[i] * lambda / sigma;
            g0 -= r;
            g1 -= r * w;
        }
        for (int i = 0; i < survLogX.length; i++) {
            double w = -(survLogX[i] - mu) / sigma; // log S(x) = log Phi(-w(x))
            double lp = logPhiWithMills(w, mills);
            double lambda = mills[0];
            sum += survW[i] * lp;
            double r = survW[i] * lambda / sigma;
            g0 += r;
            g1 -= r * w;
        }
        if (g != null) {
            g[0] += g0;
            g[1] += g1;
        }
        return sum;
    }

    private static void addScaled(double[] g, double w, double[] d) {
        for (int j = 0; j < g.length; j++) {
            g[j] += w * d[j];
        }
    }

    // ---- interval probability ----

    /** log(F(R) - F(L)) for 0 &le; L &lt; R &le; &infin;, gradient into out. */
    static double logIntervalProbability(ParametricDelay f, double lo, double hi, double[] out) {
        if (hi == Double.POSITIVE_INFINITY) {
            if (out != null) {
                if (lo > 0) {
                    copy(f.logSurvivalGradient(lo), out);
                } else {
                    Arrays.fill(out, 0.0);
                }
            }
            return lo > 0 ? f.logSurvival(lo) : 0.0;
        }
        if (!(lo > 0)) {
            if (out != null) {
                copy(f.logCdfGradient(hi), out);
            }
            return f.logCdf(hi);
        }
        double cHi = f.cdf(hi);
        boolean gradient = out != null;
        if (cHi <= 0.5) {
            // F(R) - F(L) = F(R) (1 - exp(lF(L) - lF(R))): no cancellation in the lower part
            return logDifference(f.logCdf(hi), f.logCdf(lo), gradient ? f.logCdfGradient(hi) : null,
                    gradient ? f.logCdfGradient(lo) : null, out);
        }
        // S(L) - S(R) = S(L) (1 - exp(lS(R) - lS(L)))
        return logDifference(f.logSurvival(lo), f.logSurvival(hi), gradient ? f.logSurvivalGradient(lo) : null,
                gradient ? f.logSurvivalGradient(hi) : null, out);
    }

    /**
     * log(A &minus; B) = log A + log1p(&minus;exp(log B &minus; log A)) for 0 &lt; B &lt; A, and, if
     * {@code out} is not null, its gradient (gA &minus; e gB) / (1 &minus; e) with e = B / A from the
     * gradients {@code gA}, {@code gB} of log A and log B.
     */
    private static double logDifference(double logA, double logB, double[] gA, double[] gB, double[] out) {
        double e = Math.exp(logB - logA);
        if (out != null) {
            for (int j = 0; j < out.length; j++) {
                out[j] = (gA[j] - e * gB[j]) / (1 - e);
            }
        }
        return logA + Math.log1p(-e);
    }

    private static void copy(double[] src, double[] dst) {
        System.arraycopy(src, 0, dst, 0, dst.length);
    }

    // ---- double interval censoring ----

    /**
     * log P(day difference = k) = log int_0^1 [F(k + 1 - u) - F(k - u)] du: primary uniform in
     * its day, secondary's day observed. Gauss-Legendre in u; for k &le; 1 the integrand has
     * F's singularity at argument 0 (u = 1) and the substitution u = 1 - y^4 removes it.
     */
    static double logDailyMass(ParametricDelay f, int day, double[] out) {
        int k = f.family().dimension();
        double sum = 0;
        if (out != null) {
            Arrays.fill(out, 0.0);
        }
        boolean substitute = day <= 1;
        for (int i = 0; i < GaussLegendre.NODES; i++) {
            double y = GaussLegendre.X[i];
            double u;
            double w;
            if (substitute) {
                double y3 = y * y * y;
                u = 1 - y3 * y;
                w = GaussLegendre.W[i] * 4 * y3;
            } else {
                u = GaussLegendre.X[i];
                w = GaussLegendre.W[i];
            }
            double x = day - u; // lower end of the delay interval [x, x + 1)
            if (!(x > 0)) {
                double c = f.cdf(x + 1);
                sum += w * c;
                if (out != null && c > 0) {
                    addScaled(out, w * c, f.logCdfGradient(x + 1));
                }
            } else if (f.cdf(x) < 0.5) {
                double c1 = f.cdf(x + 1);
                double c0 = f.cdf(x);
                sum += w * (c1 - c0);
                if (out != null) {
                    addScaled(out, w * c1, f.logCdfGradient(x + 1));
                    if (c0 > 0) {
                        addScaled(out, -w * c0, f.logCdfGradient(x));
                    }
                }
            } else {
                double s0 = f.survival(x);
                double s1 = f.survival(x + 1);
                sum += w * (s0 - s1);
                if (out != null) {
                    // d(S0 - S1) = S0 dlS0 - S1 dlS1
                    addScaled(out, w * s0, f.logSurvivalGradient(x));
                    if (s1 > 0) {
                        addScaled(out, -w * s1, f.logSurvivalGradient(x + 1));
                    }
                }
            }
        }
        if (out != null) {
            for (int j = 0; j < k; j++) {
                out[j] /= sum;
            }
        }
        return Math.log(sum);
    }

    /**
     * log A(K) = log P(day difference &le; K) = log int_0^1 F(K + 1 - u) du (the sum of P(k),
     * k = 0..K, telescopes), or with {@code survival} log(1 - A(K)) = log int_0^1 S(K + 1 - u) du.
     */
    static double logDailyCdf(ParametricDelay f, int day, double[] out, boolean survival) {
        int k = f.family().dimension();
        if (out != null) {
            Arrays.fill(out, 0.0);
        }
        boolean substitute = day == 0;
        if (!survival) {
            // log-sum-exp over nodes keeps accuracy when F is tiny
            double[] terms = new double[GaussLegendre.NODES];
            double max = Double.NEGATIVE_INFINITY;
            for (int i = 0; i < GaussLegendre.NODES; i++) {
                double[] uw = node(i, substitute);
                double x = day + 1 - uw[0];
                terms[i] = Math.log(uw[1]) + f.logCdf(x);
                max = Math.max(max, terms[i]);
            }
            if (max == Double.NEGATIVE_INFINITY) {
                return max;
            }
            double s = 0;
            for (int i = 0; i < GaussLegendre.NODES; i++) {
                double e = Math.exp(terms[i] - max);
                s += e;
                if (out != null && e > 0) {
                    double[] uw = node(i, substitute);
                    addScaled(out, e, f.logCdfGradient(day + 1 - uw[0]));
                }
            }
            if (out != null) {
                for (int j = 0; j < k; j++) {
                    out[j] /= s;
                }
            }
            return max + Math.log(s);
        }
        double sum = 0;
        for (int i = 0; i < GaussLegendre.NODES; i++) {
            double[] uw = node(i, substitute);
            double x = day + 1 - uw[0];
            double sv = f.survival(x);
            sum += uw[1] * sv;
            if (out != null && sv > 0) {
                addScaled(out, uw[1] * sv, f.logSurvivalGradient(x));
            }
        }
        if (out != null) {
            for (int j = 0; j < k; j++) {
                out[j] /= sum;
            }
        }
        return Math.log(sum);
    }

    private static double[] node(int i, boolean substitute) {
        double y = GaussLegendre.X[i];
        if (!substitute) {
            return new double[] {y, GaussLegendre.W[i]};
        }
        double y3 = y * y * y;
        return new double[] {1 - y3 * y, GaussLegendre.W[i] * 4 * y3};
    }

    // ---- exposure window with growing exposure ----

    /**
     * log int_lo^hi exp(-r x) f(x) dx. Away from the origin (lo &gt; width / 4) Gauss-Legendre on
     * the smooth integrand; near it, integration by parts,
     * exp(-r hi) F(hi) - exp(-r lo) F(lo) + r int_lo^hi exp(-r x) F(x) dx, with the substitution
     * x = lo + (hi - lo) y^4 for F's behaviour at 0.
     */
    static double logTiltedWindow(ParametricDelay f, double r, double lo, double hi, double[] out) {
        int k = f.family().dimension();
        double width = hi - lo;
        if (out != null) {
            Arrays.fill(out, 0.0);
        }
        double sum = 0;
        if (lo > 0.25 * width) {
            for (int i = 0; i < GaussLegendre.NODES; i++) {
                double x = lo + width * GaussLegendre.X[i];
                double v = GaussLegendre.W[i] * width * Math.exp(-r * x + f.logDensity(x));
                sum += v;
                if (out != null && v > 0) {
                    addScaled(out, v, f.logDensityGradient(x));
                }
            }
        } else {
            double cHi = f.cdf(hi);
            double eHi = Math.exp(-r * hi);
            sum = eHi * cHi;
            if (out != null && cHi > 0) {
                addScaled(out, eHi * cHi, f.logCdfGradient(hi));
            }
            if (lo > 0) {
                double cLo = f.cdf(lo);
                double eLo = Math.exp(-r * lo);
                sum -= eLo * cLo;
                if (out != null && cLo > 0) {
                    addScaled(out, -eLo * cLo, f.logCdfGradient(lo));
                }
            }
            for (int i = 0; i < GaussLegendre.NODES; i++) {
                double y = GaussLegendre.X[i];
                double y3 = y * y * y;
                double x = lo + width * y3 * y;
                double c = f.cdf(x);
                double v = r * GaussLegendre.W[i] * 4 * y3 * width * Math.exp(-r * x) * c;
                sum += v;
                if (out != null && c > 0) {
                    addScaled(out, v, f.logCdfGradient(x));
                }
            }
        }
        if (out != null) {
            for (int j = 0; j < k; j++) {
                out[j] /= sum;
            }
        }
        return Math.log(sum);
    }

    // ---- growth normaliser ----

    static double logLaplace(ParametricDelay f, double r) {
        // +Infinity where the transform diverges, so the likelihood is -Infinity there
        return Math.log(f.laplaceTransform(r));
    }

    /** d log M(-r) / d theta by five-point central differences (error O(h^4)). */
    private double[] logLaplaceGradient(double[] theta, double r) {
        double[] out = new double[k];
        double[] t = theta.clone();
        for (int j = 0; j < k; j++) {
            boolean positive = family.parameterDomains().get(j) == DelayFamily.Domain.POSITIVE;
            double h = positive ? 1e-3 * theta[j] : 1e-3 * Math.max(1, Math.abs(theta[j]));
            double[] v = new double[4];
            double[] steps = {2 * h, h, -h, -2 * h};
            for (int s = 0; s < 4; s++) {
                t[j] = theta[j] + steps[s];
                v[s] = logLaplace(family.of(t), r);
            }
            t[j] = theta[j];
            out[j] = (-v[0] + 8 * v[1] - 8 * v[2] + v[3]) / (12 * h);
        }
        return out;
    }

    // ---- merging equal observations ----

    /** Sorts terms and merges equal x with equal-sign weights into one term (primitive sorts by weight group). */
    private static double[][] merge(Grow xs, Grow ws) {
        double[] x = xs.toArray();
        double[] w = ws.toArray();
        java.util.TreeMap<Double, Grow> groups = new java.util.TreeMap<>();
        for (int i = 0; i < x.length; i++) {
            groups.computeIfAbsent(w[i], key -> new Grow()).add(x[i]);
        }
        Grow mx = new Grow();
        Grow mw = new Grow();
        for (java.util.Map.Entry<Double, Grow> e : groups.entrySet()) {
            double[] v = e.getValue().toArray();
            Arrays.sort(v);
            double weight = e.getKey();
            int i = 0;
            while (i < v.length) {
                int j = i;
                while (j < v.length && v[j] == v[i]) {
                    j++;
                }
                mx.add(v[i]);
                mw.add(weight * (j - i));
                i = j;
            }
        }
        return new double[][] {mx.toArray(), mw.toArray()};
    }

    private static int[] toInt(double[] x) {
        int[] r = new int[x.length];
        for (int i = 0; i < x.length; i++) {
            r[i] = (int) x[i];
        }
        return r;
    }

    /** Growable double array. */
    static final class Grow {
        private double[] a = new double[16];
        private int n;

        void add(double x) {
            if (n == a.length) {
                a = Arrays.copyOf(a, 2 * n);
            }
            a[n++] = x;
        }

        double[] toArray() {
            return Arrays.copyOf(a, n);
        }
    }

    /** Collects terms; not thread-safe. */
    static final class Builder {
        private final DelayFamily family;
        private double constant;
        private final Grow densX = new Grow();
        private final Grow densW = new Grow();
        private final Grow survX = new Grow();
        private final Grow survW = new Grow();
        private final Grow cdfX = new Grow();
        private final Grow cdfW = new Grow();
        private final Grow intL = new Grow();
        private final Grow intR = new Grow();
        private final Grow intW = new Grow();
        private final Grow dayK = new Grow();
        private final Grow dayW = new Grow();
        private final Grow dayCdfK = new Grow();
        private final Grow dayCdfW = new Grow();
        private final Grow daySurvK = new Grow();
        private final Grow daySurvW = new Grow();
        private final Grow expLo = new Grow();
        private final Grow expHi = new Grow();
        private final Grow expW = new Grow();
        private double exposureRate = Double.NaN;
        private double tiltRate;
        private double tiltWeight;
        private boolean closedForm = true;

        private Builder(DelayFamily family) {
            this.family = family;
        }

        Builder constant(double c) {
            constant += c;
            return this;
        }

        /** log f(x). */
        Builder density(double x) {
            densX.add(x);
            densW.add(1);
            return this;
        }

        /** log S(x). */
        Builder survival(double x) {
            if (x > 0) {
                survX.add(x);
                survW.add(1);
            }
            return this;
        }

        /** w log F(x), x &gt; 0 (w = -1 for a truncation term). */
        Builder cdf(double x, double w) {
            cdfX.add(x);
            cdfW.add(w);
            return this;
        }

        /** log(F(hi) - F(lo)); lo &le; 0 = left-censored, hi = +&infin; = right-censored. */
        Builder interval(double lo, double hi) {
            intL.add(lo);
            intR.add(hi);
            intW.add(1);
            return this;
        }

        /** log P(day difference = k). */
        Builder dailyMass(int day) {
            dayK.add(day);
            dayW.add(1);
            return this;
        }

        /** w log P(day difference &le; K). */
        Builder dailyCdf(int day, double w) {
            dayCdfK.add(day);
            dayCdfW.add(w);
            return this;
        }

        /** log P(day difference &gt; K). */
        Builder dailySurvival(int day) {
            daySurvK.add(day);
            daySurvW.add(1);
            return this;
        }

        /** log int_lo^hi exp(-r x) f(x) dx at the builder's exposure rate. */
        Builder tiltedWindow(double r, double lo, double hi) {
            if (!Double.isNaN(exposureRate) && exposureRate != r) {
                throw new IllegalStateException("one exposure growth rate per likelihood");
            }
            exposureRate = r;
            expLo.add(lo);
            expHi.add(hi);
            expW.add(1);
            return this;
        }

        /** -weight log M(-r). */
        Builder tilt(double r, double weight) {
            tiltRate = r;
            tiltWeight += weight;
            return this;
        }

        DelayLogLikelihood build() {
            return new DelayLogLikelihood(this);
        }
    }
}
