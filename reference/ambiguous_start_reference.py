#!/usr/bin/env python3
"""Independent reference for the ambiguous-start interval likelihood.

Written from the model statement alone (docs/methods.md, section 1), with scipy only, so that
the Java implementation can be checked against a second implementation on the same data:

    L_i = sum_j p_(k_j) prod_(l<j) (1 - p_(k_l)) h(t_i - e_ij)  /  P(case_i)

with P(case) = 1 ('open'), 1 - prod_j (1 - p_(k_j)) over the m recorded exposures
('complete'), or 1 - (1 - p)^M for a known total M ('known-total', single category).

Writes seeded data sets and, for each family and exposure-history choice, the maximum
log-likelihood and its argmax, into
lib-core/src/test/resources/org/incipit/core/estimate/ambiguous/.
Run from the repository root:  python3 reference/ambiguous_start_reference.py
"""
import csv
import os

import numpy as np
import scipy
from scipy import optimize, special, stats

OUT = "lib-core/src/test/resources/org/incipit/core/estimate/ambiguous"
HEADER = ("# python3 + numpy %s + scipy %s; script reference/ambiguous_start_reference.py"
          % (np.__version__, scipy.__version__))


def simulate_open(rng, n, shape, rate, p_by_kind, kind_probs, lam):
    """Open stream: Poisson(lam) exposures; J-1 failures before infection; more until onset."""
    rows = []
    for i in range(n):
        x = rng.gamma(shape, 1.0 / rate)
        tau = rng.uniform(0, 30)
        # With categories J is not geometric, so draw the exposure sequence forward from the
        # first exposure until one infects, then shift it so that the infecting one is at tau.
        seq_times, seq_kinds = [], []
        t = 0.0
        while True:
            k = rng.choice(len(kind_probs), p=kind_probs)
            seq_times.append(t)
            seq_kinds.append(k)
            if rng.uniform() < p_by_kind[k]:
                break
            t += rng.exponential(1.0 / lam)
        shift = tau - seq_times[-1]
        times = [s + shift for s in seq_times]
        onset = tau + x
        t = tau
        while True:
            t += rng.exponential(1.0 / lam)
            if t >= onset:
                break
            times.append(t)
            seq_kinds.append(rng.choice(len(kind_probs), p=kind_probs))
        for e, k in zip(times, seq_kinds):
            rows.append((i, onset, e, k, -1))
    return rows


def simulate_complete(rng, n, shape, rate, p, window):
    """Whole history: m = 1 + Poisson(2) exposures uniform in [0, window]; cases only."""
    rows = []
    i = 0
    while i < n:
        m = 1 + rng.poisson(2.0)
        e = np.sort(rng.uniform(0, window, size=m))
        inf = rng.uniform(size=m) < p
        if not inf.any():
            continue
        j = int(np.argmax(inf))
        onset = e[j] + rng.gamma(shape, 1.0 / rate)
        if e[-1] >= onset:
            continue  # the recorded history must precede onset (rare with these values)
        for t in e:
            rows.append((i, onset, t, 0, -1))
        i += 1
    return rows


def simulate_known_total(rng, n, shape, rate, p, period):
    """M = 1 + Poisson(3) exposures uniform in [0, period]; record those before onset, and M."""
    rows = []
    i = 0
    while i < n:
        big_m = 1 + rng.poisson(3.0)
        e = np.sort(rng.uniform(0, period, size=big_m))
        inf = rng.uniform(size=big_m) < p
        if not inf.any():
            continue
        j = int(np.argmax(inf))
        onset = e[j] + rng.gamma(shape, 1.0 / rate)
        for t in e[e < onset]:
            rows.append((i, onset, t, 0, big_m))
        i += 1
    return rows


def log_h(family, theta, d):
    if family == "gamma":
        a, b = np.exp(theta[0]), np.exp(theta[1])
        return stats.gamma.logpdf(d, a, scale=1.0 / b)
    if family == "weibull":
        k, lam = np.exp(theta[0]), np.exp(theta[1])
        return stats.weibull_min.logpdf(d, k, scale=lam)
    if family == "lognormal":
        mu, sig = theta[0], np.exp(theta[1])
        return stats.lognorm.logpdf(d, sig, scale=np.exp(mu))
    raise ValueError(family)


def natural(family, theta):
    if family == "lognormal":
        return [theta[0], np.exp(theta[1])]
    return [np.exp(theta[0]), np.exp(theta[1])]


class Data:
    def __init__(self, rows):
        rows = sorted(rows, key=lambda r: (r[0], r[2]))
        self.case = np.array([r[0] for r in rows])
        self.end = np.array([r[1] for r in rows])
        self.start = np.array([r[2] for r in rows])
        self.kind = np.array([r[3] for r in rows])
        self.total = np.array([r[4] for r in rows])
        _, self.first, self.m = np.unique(self.case, return_index=True, return_counts=True)
        self.rank = np.arange(len(rows)) - np.repeat(self.first, self.m)  # j - 1
        self.n = len(self.first)
        self.d = self.end - self.start


def negloglik(theta, family, data, history, n_kinds):
    logit = theta[2:2 + n_kinds]
    logp = -np.logaddexp(0.0, -logit)      # log p_k
    logq = -np.logaddexp(0.0, logit)       # log (1 - p_k)
    lp = logp[data.kind]
    lq = logq[data.kind]
    # prod_(l<j) (1 - p_(k_l)) within each case: exclusive cumulative sum of log q
    cum = np.cumsum(lq)
    case_start_cum = np.repeat(cum[data.first] - lq[data.first], data.m)
    excl = cum - lq - case_start_cum
    with np.errstate(divide="ignore"):
        terms = lp + excl + log_h(family, theta[:2], data.d)
    # per-case log-sum-exp, vectorised: subtract each case's maximum term
    case_max = np.maximum.reduceat(terms, data.first)
    case_max = np.where(np.isfinite(case_max), case_max, 0.0)
    ll = np.sum(np.log(np.add.reduceat(np.exp(terms - np.repeat(case_max, data.m)), data.first))
                + case_max)
    if history == "complete":
        # log(1 - prod_j q_(k_j)) over all recorded exposures of the case
        tot = np.add.reduceat(lq, data.first)
        ll -= np.sum(np.log(-np.expm1(tot)))
    elif history == "known-total":
        big_m = data.total[data.first]
        ll -= np.sum(np.log(-np.expm1(big_m * logq[0])))
    if not np.isfinite(ll):
        return 1e300
    return -ll


def fit(family, data, history, n_kinds, starts):
    best = None
    for s in starts:
        try:
            r = optimize.minimize(negloglik, s, args=(family, data, history, n_kinds),
                                  method="BFGS", options={"gtol": 1e-10, "maxiter": 2000})
            r2 = optimize.minimize(negloglik, r.x, args=(family, data, history, n_kinds),
                                   method="Nelder-Mead",
                                   options={"xatol": 1e-11, "fatol": 1e-13, "maxiter": 20000,
                                            "maxfev": 40000})
            x = r2.x if r2.fun <= r.fun else r.x
            f = min(r.fun, r2.fun)
        except (ValueError, FloatingPointError):
            continue
        if best is None or f < best[1]:
            best = (x, f)
    return best


def starts_for(family, data, n_kinds):
    dm = np.mean(data.d[data.first])  # earliest-candidate durations
    sd = np.std(data.d[data.first])
    out = []
    for scale in (0.7, 1.0, 1.3):
        mean = dm * scale
        cv = max(sd / dm, 0.2)
        if family == "gamma":
            a = 1 / cv ** 2
            th = [np.log(a), np.log(a / mean)]
        elif family == "weibull":
            k = 1.2 / cv
            th = [np.log(k), np.log(mean / special.gamma(1 + 1 / k))]
        else:
            s2 = np.log(1 + cv ** 2)
            th = [np.log(mean) - s2 / 2, 0.5 * np.log(s2)]
        out.append(np.array(th + [0.0] * n_kinds))
    return out


def write_data(name, data, kind_names):
    with open(os.path.join(OUT, name + ".csv"), "w", newline="") as fh:
        fh.write(HEADER + "\n")
        fh.write("# seeded simulated data: one row per candidate start; times in days\n")
        w = csv.writer(fh)
        w.writerow(["case", "end", "start", "kind", "exposures_total"])
        for c, e, s, k, t in zip(data.case, data.end, data.start, data.kind, data.total):
            w.writerow(["c%04d" % c, repr(float(e)), repr(float(s)), kind_names[k],
                        "" if t < 0 else int(t)])


def main():
    os.makedirs(OUT, exist_ok=True)
    rng = np.random.default_rng(20261201)
    sets = [
        ("open_one_kind", Data(simulate_open(rng, 300, 3.0, 0.6, [0.3], [1.0], 0.5)),
         ["contact"], ["open", "complete"]),
        ("open_two_kinds", Data(simulate_open(rng, 300, 2.5, 0.5, [0.5, 0.15], [0.4, 0.6], 0.6)),
         ["household", "other"], ["open"]),
        ("complete", Data(simulate_complete(rng, 300, 6.0, 1.0, 0.35, 1.5)),
         ["contact"], ["complete", "open"]),
        ("known_total", Data(simulate_known_total(rng, 300, 4.0, 0.8, 0.25, 10.0)),
         ["contact"], ["known-total", "open"]),
    ]
    results = []
    for name, data, kind_names, histories in sets:
        write_data(name, data, kind_names)
        nk = len(kind_names)
        for family in ("gamma", "weibull", "lognormal"):
            for history in histories:
                x, f = fit(family, data, history, nk, starts_for(family, data, nk))
                nat = natural(family, x)
                ps = list(special.expit(x[2:2 + nk]))
                results.append([name, family, history, data.n, len(data.d), repr(float(-f))]
                               + [repr(float(v)) for v in nat]
                               + [repr(float(v)) for v in ps] + [""] * (2 - nk))
    with open(os.path.join(OUT, "maxima.csv"), "w", newline="") as fh:
        fh.write(HEADER + "\n")
        fh.write("# maximum log-likelihood by BFGS then Nelder-Mead polish from 3 starts;"
                 " param1/param2 = shape,rate | shape,scale | meanLog,sdLog; p1, p2 = transmission"
                 " probability by kind (open_two_kinds: household, other); a p within 1e-6 of 0"
                 " or 1 is a maximum on the boundary, where only the log-likelihood (a supremum)"
                 " is comparable\n")
        w = csv.writer(fh)
        w.writerow(["dataset", "family", "history", "cases", "candidates", "loglik",
                    "param1", "param2", "p1", "p2"])
        w.writerows(results)
    print("wrote", len(results), "maxima")


if __name__ == "__main__":
    main()
