#!/usr/bin/env python3
"""Independent scipy benchmark: fit of the OPEN ambiguous-start likelihood, gamma delay H,
one transmission probability p.

Model (written from the model statement, not from any Java code). Case i has onset (end) t_i
and candidate exposure times e_i1 < e_i2 < ... (all exposures recorded before onset). With an
open stream of exposures each infecting with probability p, the first infecting exposure is
the j-th with probability p (1-p)^(j-1), so

    L_i = sum_j p (1-p)^(j-1) h(t_i - e_ij),     h = gamma density (shape a, rate b),

    log L = sum_i logsumexp_j [ log p + (j-1) log(1-p) + log h(d_ij) ],   d_ij = t_i - e_ij.

Gradient (weights w_ij = softmax_j of the terms within case i):
    d/da = sum w (log b - digamma(a) + log d),   d/db = sum w (a/b - d),
    d/dp = sum w (1/p - (j-1)/(1-p)),
and on the unconstrained scale (log a, log b, logit p) multiply by a, b and p(1-p).
Maximised with scipy BFGS (analytic gradient, gtol = 1e-8 n on max|gradient|) from the fixed
start a = 1, b = 1, p = 0.3.

Simulated data (seeded): infection time tau ~ U(0, 30); J ~ Geometric(p) exposures up to
and including the infecting one, spaced by Exponential(lambda) gaps before tau; delay
X ~ Gamma(a, b); onset tau + X; Poisson(lambda X) further exposures uniform in (tau, tau + X).
True values a = 2, b = 0.5 (mean 4 days), p = 0.5, lambda = 0.25/day: about 3 candidates
per case (1/p + lambda E[X] = 2 + 1).

Commands (from the repository root):
    python3 benchmarks/scipy_ambiguous_gamma.py generate N FILE [SEED]   # CSV case,end,start
    python3 benchmarks/scipy_ambiguous_gamma.py selftest                 # value vs loop, gradient vs FD
    python3 benchmarks/scipy_ambiguous_gamma.py time [REPEATS]           # warm fits, n = 1e4 and 1e5
    python3 benchmarks/scipy_ambiguous_gamma.py whole FILE OUT.json      # read, fit, Wald, write
    /usr/bin/time -p python3 benchmarks/scipy_ambiguous_gamma.py whole FILE OUT.json
'time' simulates with seed 20261201 + n and prints one line per n:
    RESULT n=<n> candidates=<c> median_s=<s> min_s=<s> repeats=<k> loglik=<v> shape=<a> rate=<b> p=<p>
           iterations=<i> evaluations=<e> converged=<bool>     (one line)
'whole' prints:
    WHOLE n=<n> read_s=<s> fit_s=<s> wald_s=<s> write_s=<s> total_in_process_s=<s> loglik=<v>
"""
import json
import statistics
import sys
import time

import numpy as np
import scipy
import scipy.stats
from scipy import optimize, special

START = np.array([0.0, 0.0, np.log(0.3 / 0.7)])  # log a, log b, logit p at a = 1, b = 1, p = 0.3
TRUE = dict(shape=2.0, rate=0.5, p=0.5, lam=0.25)


def simulate(n, seed, shape=TRUE["shape"], rate=TRUE["rate"], p=TRUE["p"], lam=TRUE["lam"]):
    """Returns (case, end, start) flat arrays, candidates in time order within a case."""
    rng = np.random.default_rng(seed)
    tau = rng.uniform(0.0, 30.0, n)
    x = rng.gamma(shape, 1.0 / rate, n)
    end = tau + x
    j = rng.geometric(p, n)                       # exposures up to and including the infecting one
    k = rng.poisson(lam * x)                      # exposures after infection, before onset
    pre_case = np.repeat(np.arange(n), j - 1)
    gaps = rng.exponential(1.0 / lam, pre_case.size)
    # distance back from tau: cumulative gaps within each case (csum0[first[c]] = gaps of earlier cases)
    csum0 = np.concatenate(([0.0], np.cumsum(gaps)))
    first = np.concatenate(([0], np.cumsum(j - 1)[:-1]))
    back = csum0[1:] - np.repeat(csum0[first], j - 1)
    pre = tau[pre_case] - back
    post_case = np.repeat(np.arange(n), k)
    post = tau[post_case] + rng.uniform(0.0, 1.0, post_case.size) * x[post_case]
    case = np.concatenate((pre_case, np.arange(n), post_case))
    start = np.concatenate((pre, tau, post))
    order = np.lexsort((start, case))
    case, start = case[order], start[order]
    return case, end[case], start


def flat(case, end, start):
    """Candidates in time order within each case, as flat arrays: delays d, rank j-1 within the
    case, the index of each case's first candidate and the case index of every candidate."""
    case = np.asarray(case)
    order = np.lexsort((start, case))
    case, end, start = case[order], end[order], start[order]
    uniq, first, counts = np.unique(case, return_index=True, return_counts=True)
    d = end - start
    if np.any(d <= 0):
        raise ValueError("every candidate start must precede its end")
    rank = (np.arange(case.size) - np.repeat(first, counts)).astype(float)
    row = np.repeat(np.arange(uniq.size), counts)
    return d, rank, first, row


class OpenGamma:
    """Negative log-likelihood and gradient on (log a, log b, logit p), over flat candidate
    arrays (no padding): per-case max and sums by np.maximum.reduceat / np.add.reduceat."""

    def __init__(self, d, rank, first, row):
        self.d, self.logd, self.jm1, self.first, self.row = d, np.log(d), rank, first, row
        self.n = first.size

    def __call__(self, theta):
        a, b = np.exp(theta[0]), np.exp(theta[1])
        p = special.expit(theta[2])
        log1mp = -np.logaddexp(0.0, theta[2])     # log(1 - p), stable
        logp = -np.logaddexp(0.0, -theta[2])      # log p, stable
        logb = theta[1]
        terms = (logp + a * logb - special.gammaln(a)) + self.jm1 * log1mp + (a - 1.0) * self.logd - b * self.d
        m = np.maximum.reduceat(terms, self.first)
        e = np.exp(terms - m[self.row])
        s = np.add.reduceat(e, self.first)
        ll = float(np.sum(np.log(s) + m))
        w = e / s[self.row]                       # weights sum to 1 within each case
        sw_logd, sw_d, sw_j = w @ self.logd, w @ self.d, w @ self.jm1
        n = self.n
        ga = n * (logb - special.digamma(a)) + sw_logd
        gb = n * a / b - sw_d
        gp = n / p - sw_j / (1.0 - p)
        g = np.array([ga * a, gb * b, gp * p * (1.0 - p)])
        return -ll, -g


def fit(model, start=START):
    # gtol is absolute on max|gradient|; log L grows like n, so scale it by n (about 1e-9 relative
    # to |log L|, the rounding level of a sum of n terms)
    res = optimize.minimize(model, start, jac=True, method="BFGS", options=dict(gtol=1e-8 * model.n, maxiter=500))
    return res


def natural(theta):
    return np.exp(theta[0]), np.exp(theta[1]), special.expit(theta[2])


def wald(model, theta, level=0.95):
    """Hessian of -log L by central differences of the analytic gradient (unconstrained scale),
    inverted; intervals theta_k +- z sqrt(V_kk) mapped back through exp / expit."""
    k = theta.size
    h = np.empty((k, k))
    for i in range(k):
        step = 1e-5 * max(1.0, abs(theta[i]))
        tp, tm = theta.copy(), theta.copy()
        tp[i] += step
        tm[i] -= step
        h[:, i] = (model(tp)[1] - model(tm)[1]) / (2 * step)
    h = 0.5 * (h + h.T)
    cov = np.linalg.inv(h)
    z = scipy.stats.norm.isf(0.5 * (1 - level))
    se = np.sqrt(np.diag(cov))
    maps = [np.exp, np.exp, special.expit]
    names = ["shape", "rate", "p"]
    return {nm: dict(estimate=float(f(theta[i])), lower=float(f(theta[i] - z * se[i])),
                     upper=float(f(theta[i] + z * se[i])), se_unconstrained=float(se[i]))
            for i, (nm, f) in enumerate(zip(names, maps))}


def write_csv(path, case, end, start):
    with open(path, "w") as f:
        f.write("case,end,start\n")
        np.savetxt(f, np.column_stack((case, end, start)), fmt=["%d", "%.17g", "%.17g"], delimiter=",")


def read_csv(path):
    a = np.loadtxt(path, delimiter=",", skiprows=1)
    return a[:, 0].astype(np.int64), a[:, 1], a[:, 2]


def cmd_time(repeats):
    for n in (10_000, 100_000):
        case, end, start = simulate(n, seed=20261201 + n)
        model = OpenGamma(*flat(case, end, start))
        fit(model)  # warm-up
        times, res = [], None
        for _ in range(repeats):
            t0 = time.perf_counter()
            res = fit(model)
            times.append(time.perf_counter() - t0)
        a, b, p = natural(res.x)
        print("RESULT n=%d candidates=%d median_s=%.4f min_s=%.4f repeats=%d loglik=%.10f shape=%.8f rate=%.8f "
              "p=%.8f iterations=%d evaluations=%d converged=%s"
              % (n, case.size, statistics.median(times), min(times), repeats, -res.fun, a, b, p, res.nit, res.nfev,
                 res.success))


def cmd_whole(path, out):
    t0 = time.perf_counter()
    case, end, start = read_csv(path)
    model = OpenGamma(*flat(case, end, start))
    t1 = time.perf_counter()
    res = fit(model)
    t2 = time.perf_counter()
    intervals = wald(model, res.x)
    t3 = time.perf_counter()
    with open(out, "w") as f:
        json.dump(dict(cases=model.n, candidates=int(case.size), logLikelihood=-res.fun, converged=bool(res.success),
                       iterations=int(res.nit), estimates=intervals, level=0.95,
                       tool="numpy %s, scipy %s" % (np.__version__, scipy.__version__)), f, indent=2)
    t4 = time.perf_counter()
    print("WHOLE n=%d read_s=%.4f fit_s=%.4f wald_s=%.4f write_s=%.4f total_in_process_s=%.4f loglik=%.10f"
          % (model.n, t1 - t0, t2 - t1, t3 - t2, t4 - t3, t4 - t0, -res.fun))


def cmd_selftest():
    """Vectorised value against a plain loop with scipy.stats.gamma.pdf, and the analytic
    gradient against finite differences (scipy.optimize.check_grad)."""
    case, end, start = simulate(500, seed=5)
    model = OpenGamma(*flat(case, end, start))
    theta = np.array([0.3, -0.5, 0.2])
    a, b, p = natural(theta)
    loop = 0.0
    for c in np.unique(case):
        st = np.sort(start[case == c])
        t = end[case == c][0]
        loop += np.log(sum(p * (1 - p) ** j * scipy.stats.gamma.pdf(t - e, a, scale=1 / b) for j, e in enumerate(st)))
    err = optimize.check_grad(lambda t: model(t)[0], lambda t: model(t)[1], theta)
    print("SELFTEST loglik_vectorised=%.12f loglik_loop=%.12f rel_diff=%.2e gradient_fd_error=%.2e gradient_norm=%.2e"
          % (-model(theta)[0], loop, abs(-model(theta)[0] - loop) / abs(loop), err, np.linalg.norm(model(theta)[1])))


def main(argv):
    if len(argv) >= 3 and argv[0] == "generate":
        n = int(argv[1])
        seed = int(argv[3]) if len(argv) > 3 else 20261201
        write_csv(argv[2], *simulate(n, seed))
    elif len(argv) >= 1 and argv[0] == "time":
        cmd_time(int(argv[1]) if len(argv) > 1 else 5)
    elif len(argv) == 1 and argv[0] == "selftest":
        cmd_selftest()
    elif len(argv) == 3 and argv[0] == "whole":
        cmd_whole(argv[1], argv[2])
    else:
        sys.exit(__doc__)


if __name__ == "__main__":
    main(sys.argv[1:])
