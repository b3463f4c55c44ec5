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
    python3 benchmarks/scipy_ambiguous_gamma.py time [REPEATS]           # warm fits, n = 1e4 and 1e5
    python3 benchmarks/scipy_ambiguous_gamma.py whole FILE OUT.json      # read, fit, Wald, write
    /usr/bin/time -p python3 benchmarks/scipy_ambiguous_gamma.py whole FILE OUT.json
'time' prints one line per n:
    RESULT n=<n> median_s=<s> min_s=<s> repeats=<k> loglik=<v> shape=<a> rate=<b> p=<p> iterations=<i>
'whole' prints:
    WHOLE n=<n> read_s=<s> fit_s=<s> wald_s=<s> write_s=<s> total_in_process_s=<s> loglik=<v>
"""
import json
import statistics
import sys
import time

import numpy as np
import scipy
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
    # cumulative gaps backwards from tau within each case
    csum = np.cumsum(gaps)
    first = np.concatenate(([0], np.cumsum(j - 1)[:-1]))
    offset = np.repeat(csum[first - 1] * (first > 0) if csum.size else np.zeros(n), j - 1) if csum.size else csum
    back = csum - offset if csum.size else csum
    pre = tau[pre_case] - back
    post_case = np.repeat(np.arange(n), k)
    post = tau[post_case] + rng.uniform(0.0, 1.0, post_case.size) * x[post_case]
    case = np.concatenate((pre_case, np.arange(n), post_case))
    start = np.concatenate((pre, tau, post))
    order = np.lexsort((start, case))
    case, start = case[order], start[order]
    return case, end[case], start


def padded(case, end, start):
    """Delays d[i, r] for candidate rank r (0-based) of case i, and a mask of real entries."""
    case = np.asarray(case)
    order = np.lexsort((start, case))
    case, end, start = case[order], end[order], start[order]
    uniq, first, counts = np.unique(case, return_index=True, return_counts=True)
    width = counts.max()
    rank = np.arange(case.size) - np.repeat(first, counts)
    row = np.repeat(np.arange(uniq.size), counts)
    d = np.ones((uniq.size, width))
    mask = np.zeros((uniq.size, width), dtype=bool)
    d[row, rank] = end - start
    mask[row, rank] = True
    if np.any(d[mask] <= 0):
        raise ValueError("every candidate start must precede its end")
    return d, mask


class OpenGamma:
    """Negative log-likelihood and gradient on (log a, log b, logit p)."""

    def __init__(self, d, mask):
        self.mask = mask
        self.d = d
        self.logd = np.where(mask, np.log(d), 0.0)
        self.jm1 = np.broadcast_to(np.arange(d.shape[1], dtype=float), d.shape)
        self.n = d.shape[0]

    def __call__(self, theta):
        a, b = np.exp(theta[0]), np.exp(theta[1])
        p = special.expit(theta[2])
        log1mp = -np.logaddexp(0.0, theta[2])     # log(1 - p), stable
        logp = -np.logaddexp(0.0, -theta[2])      # log p, stable
        terms = (logp + self.jm1 * log1mp + a * np.log(b) - special.gammaln(a)
                 + (a - 1.0) * self.logd - b * self.d)
        terms = np.where(self.mask, terms, -np.inf)
        m = terms.max(axis=1, keepdims=True)
        e = np.exp(terms - m)
        s = e.sum(axis=1, keepdims=True)
        ll = float(np.sum(np.log(s[:, 0]) + m[:, 0]))
        w = e / s
        ga = np.sum(w * (np.log(b) - special.digamma(a) + self.logd))
        gb = np.sum(w * (a / b - self.d))
        gp = np.sum(w * (1.0 / p - self.jm1 / (1.0 - p)))
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
        model = OpenGamma(*padded(case, end, start))
        fit(model)  # warm-up
        times, res = [], None
        for _ in range(repeats):
            t0 = time.perf_counter()
            res = fit(model)
            times.append(time.perf_counter() - t0)
        a, b, p = natural(res.x)
        print("RESULT n=%d candidates=%d median_s=%.4f min_s=%.4f repeats=%d loglik=%.10f shape=%.8f rate=%.8f "
              "p=%.8f iterations=%d converged=%s"
              % (n, case.size, statistics.median(times), min(times), repeats, -res.fun, a, b, p, res.nit,
                 res.success))


def cmd_whole(path, out):
    t0 = time.perf_counter()
    case, end, start = read_csv(path)
    model = OpenGamma(*padded(case, end, start))
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


def main(argv):
    if len(argv) >= 3 and argv[0] == "generate":
        n = int(argv[1])
        seed = int(argv[3]) if len(argv) > 3 else 20261201
        write_csv(argv[2], *simulate(n, seed))
    elif len(argv) >= 1 and argv[0] == "time":
        cmd_time(int(argv[1]) if len(argv) > 1 else 5)
    elif len(argv) == 3 and argv[0] == "whole":
        cmd_whole(argv[1], argv[2])
    else:
        sys.exit(__doc__)


if __name__ == "__main__":
    main(sys.argv[1:])
