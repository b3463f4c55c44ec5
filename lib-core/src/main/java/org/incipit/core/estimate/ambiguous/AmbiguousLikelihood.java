package org.incipit.core.estimate.ambiguous;

import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ForkJoinPool;

import org.incipit.core.likelihood.LogLikelihood;

/**
 * The ambiguous-start log-likelihood on the unconstrained vector theta = (phi1, phi2, logit p_1,
 * ..., logit p_K) (K = 0: a plain fit of the family, one candidate per case, no p), with
 * analytic gradient and Hessian. Stateless over prepared arrays; thread-safe.
 *
 * <p><b>Per case.</b> With terms t_j = log h(d_j) + s_j, s_j = log p_(k_j) + &Sigma;_(l&lt;j)
 * log q_(k_l), the case contributes log &Sigma;_j exp(t_j) = T + log &Sigma;_j exp(t_j &minus; T),
 * T = max_j t_j (log-sum-exp). With weights w_j = exp(t_j)/&Sigma; exp(t), the gradient is
 * E_w[&nabla;t] and the Hessian E_w[&nabla;&sup2;t] + Cov_w(&nabla;t) (the log-partition identity).
 * For gamma and lognormal, &nabla;t is linear in the per-candidate features (log d, d or
 * log&sup2; d) and in the rank, so one pass accumulates weighted first and second moments and
 * the chain rule to phi is applied once per evaluation. d s_j / d logit p_c =
 * [k_j = c] q_c &minus; n_jc p_c and d&sup2; s_j / d(logit p_c)&sup2; = &minus;p_c q_c([k_j = c] + n_jc),
 * n_jc the number of earlier candidates of category c (for K = 1, n_j = j &minus; 1).
 *
 * <p><b>Normalisers</b> (see {@link ExposureHistory} for their derivation): with
 * S = &Sigma;_c n_c log q_c, log P(case) = log(&minus;expm1(S)), d/dS = &minus;e^S/(1 &minus; e^S),
 * d&sup2;/dS&sup2; = &minus;e^S/(1 &minus; e^S)&sup2;, dS/dlogit p_c = &minus;n_c p_c,
 * d&sup2;S/d(logit p_c)&sup2; = &minus;n_c p_c q_c. Cases with equal count vectors are grouped.
 * Poisson total: log(&minus;expm1(&minus;&mu;p)) with x = &mu;p, dx/dlogit p = &mu;pq,
 * d&sup2;x/d(logit p)&sup2; = &mu;pq(q &minus; p).
 *
 * <p><b>Speed and determinism.</b> Per candidate one exp (the table-driven {@link FastExp},
 * within 0.52 ulp) and a few FMAs (in the gamma / lognormal pass with at most one category, no
 * exp for the first candidate of a case, which is the log-sum-exp reference there, and none
 * at all for single-candidate cases; cases are visited in blocks of equal candidate count, see
 * {@link Prepared}); Newton's evaluations get value, gradient and Hessian from one pass
 * ({@link #valueGradientHessian}); per case no log
 * (the per-case sums, each in [1, m] with the largest term as reference and in [1, 1e20] with
 * the first, are multiplied and their log taken when the product
 * exceeds 1e280). Data with at least {@link #SPLIT} candidates are split into two halves of
 * the cases, evaluated concurrently and added in a fixed order, so the result depends only on
 * the data, not on the threads.
 */
final class AmbiguousLikelihood implements LogLikelihood {

    /** Candidates from which an evaluation is split into two concurrently computed halves. */
    static final int SPLIT = 40_000;

    private final Prepared data;
    private final Family family;
    private final int k;           // categories (0: plain)
    private final int q;           // 2 + k
    private final int[] groupCounts;  // G x k count vectors (complete / known total)
    private final int[] groupMult;
    private final double poissonMean; // > 0 for poisson total
    private final int split;       // case index of the split, or n
    private final boolean general; // force the general per-term pass (tests)
    /** {theta, Hessian} of the latest valueGradientHessian call (immutable entries; thread-safe). */
    private final java.util.concurrent.atomic.AtomicReference<double[][]> lastHessian =
            new java.util.concurrent.atomic.AtomicReference<>();

    AmbiguousLikelihood(Prepared data, Family family, ExposureHistory history) {
        this(data, family, history, false, false);
    }

    /** @param general use the per-term pass for every family; @param noSplit never split (tests) */
    AmbiguousLikelihood(Prepared data, Family family, ExposureHistory history, boolean general, boolean noSplit) {
        this.general = general;
        this.data = data;
        this.family = family;
        this.k = data.categories;
        this.q = 2 + k;
        double pm = 0;
        int[] gc = new int[0];
        int[] gm = new int[0];
        if (k == 0) {
            if (history != null) {
                throw new IllegalArgumentException("a plain fit has no exposure history");
            }
        } else if (history instanceof ExposureHistory.Complete) {
            Map<String, int[]> groups = new LinkedHashMap<>();
            Map<String, Integer> mult = new LinkedHashMap<>();
            for (int i = 0; i < data.n; i++) {
                int[] v = Arrays.copyOfRange(data.recorded, i * k, i * k + k);
                String key = Arrays.toString(v);
                groups.putIfAbsent(key, v);
                mult.merge(key, 1, Integer::sum);
            }
            gc = new int[groups.size() * k];
            gm = new int[groups.size()];
            int g = 0;
            for (Map.Entry<String, int[]> e : groups.entrySet()) {
                System.arraycopy(e.getValue(), 0, gc, g * k, k);
                gm[g++] = mult.get(e.getKey());
            }
        } else if (history instanceof ExposureHistory.KnownTotal) {
            if (k != 1) {
                throw new IllegalArgumentException("the known-total exposure history needs one category (the categories of"
                        + " unrecorded exposures are unknown), data have " + k);
            }
            if (data.total == null) {
                throw new IllegalArgumentException("the known-total exposure history needs the total exposure count of"
                        + " every case; the data have none");
            }
            Map<Integer, Integer> mult = new LinkedHashMap<>();
            for (int i = 0; i < data.n; i++) {
                if (data.total[i] == Prepared.UNKNOWN) {
                    throw new IllegalArgumentException("the known-total exposure history needs the total exposure count"
                            + " of every case; case " + data.caseName(i) + " has none");
                }
                mult.merge(data.total[i], 1, Integer::sum);
            }
            gc = new int[mult.size()];
            gm = new int[mult.size()];
            int g = 0;
            for (Map.Entry<Integer, Integer> e : mult.entrySet()) {
                gc[g] = e.getKey();
                gm[g++] = e.getValue();
            }
        } else if (history instanceof ExposureHistory.PoissonTotal pt) {
            if (k != 1) {
                throw new IllegalArgumentException("the Poisson-total exposure history needs one category, data have " + k);
            }
            pm = pt.mean();
        } else if (!(history instanceof ExposureHistory.Open)) {
            throw new IllegalArgumentException("exposure history must not be null");
        }
        this.groupCounts = gc;
        this.groupMult = gm;
        this.poissonMean = pm;
        this.split = !noSplit && data.candidates() >= SPLIT ? splitPoint(data) : data.n;
    }

    private static int splitPoint(Prepared d) {
        int half = d.candidates() / 2;
        int i = Arrays.binarySearch(d.offset, half);
        return i >= 0 ? i : -i - 1;
    }

    @Override
    public int dimension() {
        return q;
    }

    @Override
    public double value(double[] theta) {
        return evaluate(theta, null, null);
    }

    @Override
    public double valueAndGradient(double[] theta, double[] gradientOut) {
        return evaluate(theta, gradientOut, null);
    }

    @Override
    public boolean hasHessian() {
        return true;
    }

    /**
     * The Hessian; if theta is the point of the latest {@link #valueGradientHessian} call, the
     * Hessian computed there (so that the observed information after Newton's method costs no
     * pass).
     */
    @Override
    public void hessian(double[] theta, double[] outRowMajor) {
        double[][] e = lastHessian.get();
        if (e != null && Arrays.equals(e[0], theta)) {
            System.arraycopy(e[1], 0, outRowMajor, 0, q * q);
        } else {
            evaluate(theta, new double[q], outRowMajor);
        }
    }

    /** Value, gradient and Hessian in one pass; the Hessian is kept for {@link #hessian}. */
    @Override
    public double valueGradientHessian(double[] theta, double[] gradientOut, double[] hessianOut) {
        double v = evaluate(theta, gradientOut, hessianOut);
        lastHessian.set(new double[][] {theta.clone(), hessianOut.clone()});
        return v;
    }

    /** Value, and gradient / Hessian if the arrays are non-null. */
    double evaluate(double[] theta, double[] grad, double[] hess) {
        boolean hs = hess != null;
        Acc acc;
        if (split < data.n) {
            CompletableFuture<Acc> second = CompletableFuture.supplyAsync(() -> pass(theta, split, data.n, hs),
                    ForkJoinPool.commonPool());
            Acc first = pass(theta, 0, split, hs);
            acc = first.add(second.join());
        } else {
            acc = pass(theta, 0, data.n, hs);
        }
        return assemble(theta, acc, grad, hess);
    }

    /** Sums over cases [from, to) in the coordinates (beta1, beta2 | phi1, phi2 for Weibull, logit p). */
    private Acc pass(double[] theta, int from, int to, boolean hs) {
        if (!general && family.linear() && k <= 1) {
            return linearPass(theta, from, to, hs);
        }
        return generalPass(theta, from, to, hs);
    }

    /** Sums per evaluation; for a chunk of cases. */
    private final class Acc {
        double value;
        final double[] g = new double[q];
        final double[] h = new double[q * q];
        final double[] hw = new double[3];
        final double[] ht = new double[Math.max(k, 1)];

        Acc add(Acc o) {
            Acc r = new Acc();
            r.value = value + o.value;
            for (int i = 0; i < g.length; i++) {
                r.g[i] = g[i] + o.g[i];
            }
            for (int i = 0; i < h.length; i++) {
                r.h[i] = h[i] + o.h[i];
            }
            for (int i = 0; i < 3; i++) {
                r.hw[i] = hw[i] + o.hw[i];
            }
            for (int i = 0; i < ht.length; i++) {
                r.ht[i] = ht[i] + o.ht[i];
            }
            return r;
        }
    }

    private static final double RESCALE = 1e280;
    /** Largest per-case sum kept with the first-candidate reference (1e280 * 1e20 < 1e308). */
    private static final double LARGE = 1e20;

    /**
     * The fallback for one case of {@link #linearPass}: reference max_j t_j, so that every
     * weight is in (0, 1] and the sum in [1, m]. Writes {ref, s0, s1, s2, s3, s11, s12, s13,
     * s22, s23, s33} to out. NaN terms give NaN sums, as they should.
     */
    private void maxReferenceCase(int a, int b, double b1, double b2, double logp, double logq, boolean square,
                                  double[] out) {
        final double[] u = data.logD;
        final double[] du = data.dur;
        double mx = Double.NEGATIVE_INFINITY;
        for (int j = a; j < b; j++) {
            double y2 = square ? u[j] * u[j] : du[j];
            double tj = Math.fma(b1, u[j], Math.fma(b2, y2, Math.fma(j - a, logq, logp)));
            mx = Double.isNaN(tj) ? tj : Math.max(mx, tj);
        }
        Arrays.fill(out, 0);
        out[0] = mx;
        for (int j = a; j < b; j++) {
            double y1 = u[j];
            double y2 = square ? y1 * y1 : du[j];
            double y3 = j - a;
            double w = FastExp.exp(Math.fma(b1, y1, Math.fma(b2, y2, Math.fma(y3, logq, logp))) - mx);
            out[1] += w;
            out[2] = Math.fma(w, y1, out[2]);
            out[3] = Math.fma(w, y2, out[3]);
            out[4] = Math.fma(w, y3, out[4]);
            out[5] = Math.fma(w * y1, y1, out[5]);
            out[6] = Math.fma(w * y1, y2, out[6]);
            out[7] = Math.fma(w * y1, y3, out[7]);
            out[8] = Math.fma(w * y2, y2, out[8]);
            out[9] = Math.fma(w * y2, y3, out[9]);
            out[10] = Math.fma(w * y3, y3, out[10]);
        }
    }

    /**
     * Gamma / lognormal with at most one category: moments of (u, f2, rank) under w.
     *
     * <p>The reference of each case's log-sum-exp is its first candidate's term (weight exactly
     * 1, no exp; rank 0), not the largest term: the sums are then at least 1 and, for any data
     * where the terms of one case differ by less than log(1e20) ~ 46, at most m 1e20. The
     * exponent of candidate r of a case is t_r &minus; t_0 = beta1 (u_r &minus; u_0) + beta2
     * (f_r &minus; f_0) + r log q (log p cancels). A case whose sum exceeds {@link #LARGE} (or
     * is NaN) is redone with the largest term as reference, so the product of the sums (see
     * below) cannot overflow. Cases come in blocks of equal candidate count m
     * ({@link Prepared#blockStart}), so the per-case loop has the same length case after case;
     * single-candidate cases need no exp at all. Straight-line arithmetic, no scratch arrays.
     */
    private Acc linearPass(double[] theta, int from, int to, boolean hs) {
        double[] c = new double[18];
        family.linearCoefficients(theta[0], theta[1], c);
        final double b1 = c[1];
        final double b2 = c[2];
        final boolean square = family == Family.LOGNORMAL;
        double logp = 0;
        double logq = 0;
        if (k == 1) {
            logp = -softplus(-theta[2]);
            logq = -softplus(theta[2]);
        }
        final double[] u = data.logD;
        final double[] du = data.dur;
        final int[] off = data.offset;
        final int[] bs = data.blockStart;
        final double[] fb = new double[11];
        double sumRef = 0;
        double logProd = 0;
        double prod = 1;
        double g0 = 0, g1 = 0, g2 = 0;
        double h00 = 0, h01 = 0, h02 = 0, h11 = 0, h12 = 0, h22 = 0;
        // m = 1: weight 1, the case adds its term and features, no covariance
        final int lo1 = Math.max(from, bs[1]);
        final int hi1 = Math.min(to, bs[2]);
        if (hi1 > lo1) {
            double su = 0;
            double sf = 0;
            for (int i = lo1; i < hi1; i++) {
                final double x1 = u[off[i]];
                su += x1;
                sf += square ? x1 * x1 : du[off[i]];
            }
            sumRef = Math.fma(b1, su, Math.fma(b2, sf, (hi1 - lo1) * logp));
            g0 = su;
            g1 = sf;
        }
        for (int m = 2; m <= data.maxM; m++) {
            final int lo = Math.max(from, bs[m]);
            final int hi = Math.min(to, bs[m + 1]);
            for (int i = lo; i < hi; i++) {
                final int a = off[i];
                final double x1 = u[a];
                final double x2 = square ? x1 * x1 : du[a];
                double ref = Math.fma(b1, x1, Math.fma(b2, x2, logp));
                double s0 = 1, s1 = x1, s2 = x2, s3 = 0;
                if (!hs) {
                    for (int r = 1; r < m; r++) {
                        final double y1 = u[a + r];
                        final double y2 = square ? y1 * y1 : du[a + r];
                        final double w = FastExp.exp(Math.fma(b1, y1 - x1, Math.fma(b2, y2 - x2, r * logq)));
                        s0 += w;
                        s1 = Math.fma(w, y1, s1);
                        s2 = Math.fma(w, y2, s2);
                        s3 = Math.fma(w, r, s3);
                    }
                    if (!(s0 <= LARGE)) {
                        maxReferenceCase(a, a + m, b1, b2, logp, logq, square, fb);
                        ref = fb[0];
                        s0 = fb[1];
                        s1 = fb[2];
                        s2 = fb[3];
                        s3 = fb[4];
                    }
                    final double inv = 1 / s0;
                    g0 = Math.fma(s1, inv, g0);
                    g1 = Math.fma(s2, inv, g1);
                    g2 = Math.fma(s3, inv, g2);
                } else {
                    double s11 = x1 * x1, s12 = x1 * x2, s22 = x2 * x2, s13 = 0, s23 = 0, s33 = 0;
                    for (int r = 1; r < m; r++) {
                        final double y1 = u[a + r];
                        final double y2 = square ? y1 * y1 : du[a + r];
                        final double w = FastExp.exp(Math.fma(b1, y1 - x1, Math.fma(b2, y2 - x2, r * logq)));
                        final double w1 = w * y1;
                        final double w2 = w * y2;
                        final double w3 = w * r;
                        s0 += w;
                        s1 += w1;
                        s2 += w2;
                        s3 += w3;
                        s11 = Math.fma(w1, y1, s11);
                        s12 = Math.fma(w1, y2, s12);
                        s13 = Math.fma(w1, r, s13);
                        s22 = Math.fma(w2, y2, s22);
                        s23 = Math.fma(w2, r, s23);
                        s33 = Math.fma(w3, r, s33);
                    }
                    if (!(s0 <= LARGE)) {
                        maxReferenceCase(a, a + m, b1, b2, logp, logq, square, fb);
                        ref = fb[0];
                        s0 = fb[1];
                        s1 = fb[2];
                        s2 = fb[3];
                        s3 = fb[4];
                        s11 = fb[5];
                        s12 = fb[6];
                        s13 = fb[7];
                        s22 = fb[8];
                        s23 = fb[9];
                        s33 = fb[10];
                    }
                    final double inv = 1 / s0;
                    final double m1 = s1 * inv;
                    final double m2 = s2 * inv;
                    final double m3 = s3 * inv;
                    g0 += m1;
                    g1 += m2;
                    g2 += m3;
                    h00 += s11 * inv - m1 * m1;
                    h01 += s12 * inv - m1 * m2;
                    h02 += s13 * inv - m1 * m3;
                    h11 += s22 * inv - m2 * m2;
                    h12 += s23 * inv - m2 * m3;
                    h22 += s33 * inv - m3 * m3;
                }
                sumRef += ref;
                prod *= s0;
                if (prod > RESCALE) {
                    logProd += Math.log(prod);
                    prod = 1;
                }
            }
        }
        Acc acc = new Acc();
        acc.value = sumRef + logProd + Math.log(prod);
        acc.g[0] = g0;
        acc.g[1] = g1;
        if (k == 1) {
            // d s / d logit p = q - r p, so E_w = q - p E_w[r]; d2 s = -p q (1 + r)
            double p = 1 / (1 + Math.exp(-theta[2]));
            double qq = 1 / (1 + Math.exp(theta[2]));
            int nCases = to - from;
            acc.g[2] = nCases * qq - p * g2;
            acc.ht[0] = -p * qq * (nCases + g2);
            if (hs) {
                acc.h[0] = h00;
                acc.h[1] = h01;
                acc.h[2] = -p * h02;
                acc.h[4] = h11;
                acc.h[5] = -p * h12;
                acc.h[8] = p * p * h22;
                symmetrise(acc.h, 3);
            }
        } else if (hs) {
            acc.h[0] = h00;
            acc.h[1] = h01;
            acc.h[3] = h11;
            symmetrise(acc.h, 2);
        }
        return acc;
    }

    /** Any family, any number of categories: per-term gradient vectors. */
    private Acc generalPass(double[] theta, int from, int to, boolean hs) {
        boolean linear = family.linear();
        double[] c = new double[18];
        double b1 = 0;
        double b2 = 0;
        if (linear) {
            family.linearCoefficients(theta[0], theta[1], c);
            b1 = c[1];
            b2 = c[2];
        }
        final boolean square = family == Family.LOGNORMAL;
        double shape = Math.exp(theta[0]);
        double logScale = theta[1];
        int kk = Math.max(k, 1);
        double[] logp = new double[kk];
        double[] logq = new double[kk];
        double[] p = new double[kk];
        double[] qq = new double[kk];
        for (int cc = 0; cc < k; cc++) {
            logp[cc] = -softplus(-theta[2 + cc]);
            logq[cc] = -softplus(theta[2 + cc]);
            p[cc] = 1 / (1 + Math.exp(-theta[2 + cc]));
            qq[cc] = 1 / (1 + Math.exp(theta[2 + cc]));
        }
        int m = data.maxM;
        double[] t = new double[m];
        double[] f = new double[m * q];
        double[] hwj = new double[m * 3];
        double[] d2s = new double[m * kk];
        int[] cnt = new int[kk];
        double[] s1 = new double[q];
        double[] s2 = new double[q * q];
        double[] sw = new double[3];
        double[] st = new double[kk];
        Acc acc = new Acc();
        double sumMax = 0;
        double logProd = 0;
        double prod = 1;
        for (int i = from; i < to; i++) {
            int a = data.offset[i];
            int b = data.offset[i + 1];
            Arrays.fill(cnt, 0);
            double cum = 0;
            double mx = Double.NEGATIVE_INFINITY;
            for (int j = a; j < b; j++) {
                int r = j - a;
                double uj = data.logD[j];
                double lh;
                int base = r * q;
                if (linear) {
                    double f2 = square ? uj * uj : data.dur[j];
                    lh = b1 * uj + b2 * f2;
                    f[base] = uj;
                    f[base + 1] = f2;
                } else {
                    double kv = shape * (uj - logScale);
                    double z = FastExp.exp(kv);
                    lh = theta[0] + kv - uj - z;
                    f[base] = 1 + kv * (1 - z);
                    f[base + 1] = shape * (z - 1);
                    hwj[r * 3] = kv * (1 - z) - z * kv * kv;
                    hwj[r * 3 + 1] = shape * (z - 1) + shape * z * kv;
                    hwj[r * 3 + 2] = -shape * shape * z;
                }
                double s = 0;
                if (k > 0) {
                    int cj = data.cat[j];
                    s = logp[cj] + cum;
                    cum += logq[cj];
                    for (int cc = 0; cc < k; cc++) {
                        int ind = cc == cj ? 1 : 0;
                        f[base + 2 + cc] = ind * qq[cc] - cnt[cc] * p[cc];
                        d2s[r * kk + cc] = -p[cc] * qq[cc] * (ind + cnt[cc]);
                    }
                    cnt[cj]++;
                }
                double tj = lh + s;
                t[r] = tj;
                if (tj > mx) {
                    mx = tj;
                }
            }
            if (!(mx > Double.NEGATIVE_INFINITY) || Double.isNaN(mx)) {
                acc.value = Double.NEGATIVE_INFINITY;
                return acc;
            }
            double s0 = 0;
            Arrays.fill(s1, 0);
            if (hs) {
                Arrays.fill(s2, 0);
                Arrays.fill(sw, 0);
                Arrays.fill(st, 0);
            }
            for (int r = 0; r < b - a; r++) {
                double w = FastExp.exp(t[r] - mx);
                if (!(w > 0)) {
                    continue; // a term with h = 0 (or underflow) adds nothing; avoids 0 * inf
                }
                s0 += w;
                int base = r * q;
                for (int x = 0; x < q; x++) {
                    s1[x] += w * f[base + x];
                }
                if (hs) {
                    for (int x = 0; x < q; x++) {
                        double wf = w * f[base + x];
                        for (int y = x; y < q; y++) {
                            s2[x * q + y] += wf * f[base + y];
                        }
                    }
                    if (!linear) {
                        for (int x = 0; x < 3; x++) {
                            sw[x] += w * hwj[r * 3 + x];
                        }
                    }
                    for (int cc = 0; cc < k; cc++) {
                        st[cc] += w * d2s[r * kk + cc];
                    }
                }
            }
            double inv = 1 / s0;
            for (int x = 0; x < q; x++) {
                acc.g[x] += s1[x] * inv;
            }
            if (hs) {
                for (int x = 0; x < q; x++) {
                    for (int y = x; y < q; y++) {
                        acc.h[x * q + y] += s2[x * q + y] * inv - s1[x] * inv * s1[y] * inv;
                    }
                }
                for (int x = 0; x < 3; x++) {
                    acc.hw[x] += sw[x] * inv;
                }
                for (int cc = 0; cc < k; cc++) {
                    acc.ht[cc] += st[cc] * inv;
                }
            }
            sumMax += mx;
            prod *= s0;
            if (prod > RESCALE) {
                logProd += Math.log(prod);
                prod = 1;
            }
        }
        if (hs) {
            symmetrise(acc.h, q);
        }
        acc.value = sumMax + logProd + Math.log(prod);
        return acc;
    }

    private static void symmetrise(double[] h, int n) {
        for (int x = 0; x < n; x++) {
            for (int y = x + 1; y < n; y++) {
                h[y * n + x] = h[x * n + y];
            }
        }
    }

    /** Chain rule to the unconstrained coordinates, plus the normaliser. */
    private double assemble(double[] theta, Acc acc, double[] grad, double[] hess) {
        double value = acc.value;
        if (!Double.isFinite(value)) {
            return value;
        }
        int n = data.n;
        double[] c = new double[18];
        boolean linear = family.linear();
        if (linear) {
            family.linearCoefficients(theta[0], theta[1], c);
            value += n * c[0];
        }
        double[] ng = new double[Math.max(k, 1)];
        double[] nh = new double[Math.max(k, 1) * Math.max(k, 1)];
        double norm = k == 0 ? 0 : normaliser(theta, ng, nh);
        value -= norm;
        if (grad != null) {
            if (linear) {
                // g_phi_a = n dc0/dphi_a + sum_m J_ma G_m
                grad[0] = n * c[3] + c[8] * acc.g[0] + c[10] * acc.g[1];
                grad[1] = n * c[4] + c[9] * acc.g[0] + c[11] * acc.g[1];
            } else {
                grad[0] = acc.g[0];
                grad[1] = acc.g[1];
            }
            for (int cc = 0; cc < k; cc++) {
                grad[2 + cc] = acc.g[2 + cc] - ng[cc];
            }
        }
        if (hess != null) {
            double[] h = acc.h;
            if (linear) {
                double[] jm = {c[8], c[9], c[10], c[11]}; // J[m][a] at m*2+a
                for (int a = 0; a < 2; a++) {
                    for (int b = 0; b < 2; b++) {
                        int ab = a == 0 ? (b == 0 ? 0 : 1) : (b == 0 ? 1 : 2);
                        double v = n * c[5 + ab] + acc.g[0] * c[12 + ab] + acc.g[1] * c[15 + ab];
                        for (int m1 = 0; m1 < 2; m1++) {
                            for (int m2 = 0; m2 < 2; m2++) {
                                v += jm[m1 * 2 + a] * h[m1 * q + m2] * jm[m2 * 2 + b];
                            }
                        }
                        hess[a * q + b] = v;
                    }
                    for (int cc = 0; cc < k; cc++) {
                        double v = jm[a] * h[2 + cc] + jm[2 + a] * h[q + 2 + cc];
                        hess[a * q + 2 + cc] = v;
                        hess[(2 + cc) * q + a] = v;
                    }
                }
            } else {
                hess[0] = h[0] + acc.hw[0];
                hess[1] = h[1] + acc.hw[1];
                hess[q] = h[q] + acc.hw[1];
                hess[q + 1] = h[q + 1] + acc.hw[2];
                for (int a = 0; a < 2; a++) {
                    for (int cc = 0; cc < k; cc++) {
                        hess[a * q + 2 + cc] = h[a * q + 2 + cc];
                        hess[(2 + cc) * q + a] = h[a * q + 2 + cc];
                    }
                }
            }
            for (int x = 0; x < k; x++) {
                for (int y = 0; y < k; y++) {
                    hess[(2 + x) * q + 2 + y] = h[(2 + x) * q + 2 + y] + (x == y ? acc.ht[x] : 0) - nh[x * k + y];
                }
            }
        }
        return value;
    }

    /** Sum over cases of log P(case); its gradient and Hessian in logit p. */
    private double normaliser(double[] theta, double[] g, double[] h) {
        if (poissonMean > 0) {
            double p = 1 / (1 + Math.exp(-theta[2]));
            double qq = 1 / (1 + Math.exp(theta[2]));
            double x = poissonMean * p;
            double em = -Math.expm1(-x);               // 1 - e^-x
            double d1 = Math.exp(-x) / em;             // d log(1 - e^-x) / dx
            double d2 = -Math.exp(-x) / (em * em);     // second derivative
            double dx = poissonMean * p * qq;
            double dxx = dx * (qq - p);
            int n = data.n;
            g[0] = n * d1 * dx;
            h[0] = n * (d2 * dx * dx + d1 * dxx);
            return n * Math.log(em);
        }
        if (groupMult.length == 0) {
            return 0;
        }
        double[] logq = new double[k];
        double[] p = new double[k];
        double[] qq = new double[k];
        for (int c = 0; c < k; c++) {
            logq[c] = -softplus(theta[2 + c]);
            p[c] = 1 / (1 + Math.exp(-theta[2 + c]));
            qq[c] = 1 / (1 + Math.exp(theta[2 + c]));
        }
        double total = 0;
        double[] ds = new double[k];
        for (int gi = 0; gi < groupMult.length; gi++) {
            double s = 0;
            for (int c = 0; c < k; c++) {
                s += groupCounts[gi * k + c] * logq[c];
            }
            double em = -Math.expm1(s); // P(case) = 1 - e^S
            double es = Math.exp(s);
            double d1 = -es / em;
            double d2 = -es / (em * em);
            int mult = groupMult[gi];
            total += mult * Math.log(em);
            for (int c = 0; c < k; c++) {
                ds[c] = -groupCounts[gi * k + c] * p[c];
            }
            for (int c = 0; c < k; c++) {
                g[c] += mult * d1 * ds[c];
                for (int e = 0; e < k; e++) {
                    double v = d2 * ds[c] * ds[e];
                    if (c == e) {
                        v += d1 * (-groupCounts[gi * k + c] * p[c] * qq[c]);
                    }
                    h[c * k + e] += mult * v;
                }
            }
        }
        return total;
    }

    /** log(1 + e^x) without overflow. */
    static double softplus(double x) {
        return x > 0 ? x + Math.log1p(Math.exp(-x)) : Math.log1p(Math.exp(x));
    }
}
