#!/usr/bin/env python3
"""Independent reference for the profile-likelihood intervals of the ambiguous-start fit.

Uses the likelihood of reference/ambiguous_start_reference.py (written from docs/methods.md,
section 1) on the first 40 cases of its seeded data set open_one_kind (open exposure history),
and computes 95% profile-likelihood intervals {c : max_{q(theta) = c} l(theta) >= l_hat -
chi2_1(0.95)/2} by a different method from the Java code: each constrained maximum by scipy
SLSQP with the equality constraint q(theta) = c (from 3 starts, best kept), each bound by
brentq on the profile minus the threshold. Quantities: the two family parameters, p, and the
mean, sd and median of H; families gamma, Weibull and lognormal.

Writes lib-core/src/test/resources/org/incipit/core/estimate/ambiguous/profile_intervals.csv.
Run from the repository root:  python3 reference/ambiguous_profile_reference.py
"""
import csv
import os
import sys

import numpy as np
import scipy
from scipy import optimize, special, stats

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import ambiguous_start_reference as ref  # noqa: E402

OUT = ref.OUT
CASES = 40
LEVEL = 0.95


def read_rows(name):
    rows = []
    with open(os.path.join(OUT, name + ".csv")) as fh:
        lines = [l for l in fh if not l.startswith("#")]
    for r in csv.DictReader(lines):
        c = int(r["case"][1:])
        if c < CASES:
            rows.append((c, float(r["end"]), float(r["start"]), 0, -1))
    return rows


def quantity(family, name, theta):
    a, b = ref.natural(family, theta[:2])
    if family == "gamma":
        dist = stats.gamma(a, scale=1.0 / b)
    elif family == "weibull":
        dist = stats.weibull_min(a, scale=b)
    else:
        dist = stats.lognorm(b, scale=np.exp(a))
    if name == "param1":
        return a
    if name == "param2":
        return b
    if name == "p":
        return special.expit(theta[2])
    if name == "mean":
        return dist.mean()
    if name == "sd":
        return dist.std()
    if name == "median":
        return dist.median()
    raise ValueError(name)


def main():
    data = ref.Data(read_rows("open_one_kind"))
    rows = []
    threshold = stats.chi2.ppf(LEVEL, 1) / 2
    for family in ("gamma", "weibull", "lognormal"):
        x, f = ref.fit(family, data, "open", 1, ref.starts_for(family, data, 1))
        lhat = -f
        for name in ("param1", "param2", "p", "mean", "sd", "median"):
            qhat = quantity(family, name, x)

            def profile(c, x=x, name=name):
                best = np.inf
                for jitter in (0.0, 0.3, -0.3):
                    s = x + jitter * np.array([1.0, -1.0, 0.5])
                    r = optimize.minimize(ref.negloglik, s, args=(family, data, "open", 1), method="SLSQP",
                                          constraints=[{"type": "eq",
                                                        "fun": lambda t: quantity(family, name, t) / c - 1}],
                                          options={"ftol": 1e-13, "maxiter": 1000})
                    if r.success and abs(quantity(family, name, r.x) / c - 1) < 1e-9:
                        best = min(best, r.fun)
                return -best

            def g(c):
                return profile(c) - (lhat - threshold)

            bounds = []
            for direction in (-1, 1):
                step = 0.05
                inner = qhat
                while True:
                    outer = qhat * np.exp(direction * step) if name != "param1" or family != "lognormal" \
                        else qhat + direction * step * max(1.0, abs(qhat))
                    if g(outer) < 0:
                        break
                    inner = outer
                    step *= 1.6
                bounds.append(optimize.brentq(g, min(inner, outer), max(inner, outer), xtol=1e-12, rtol=1e-11))
            rows.append([family, name, repr(float(lhat)), repr(float(qhat)), repr(float(bounds[0])),
                         repr(float(bounds[1]))])
    with open(os.path.join(OUT, "profile_intervals.csv"), "w", newline="") as fh:
        fh.write(ref.HEADER.replace("ambiguous_start_reference.py", "ambiguous_profile_reference.py") + "\n")
        fh.write("# first %d cases of open_one_kind.csv, open history; %g profile-likelihood intervals by"
                 " SLSQP constrained maxima (3 starts) and brentq; param1/param2 = shape,rate | shape,scale | meanLog,sdLog\n"
                 % (CASES, LEVEL))
        w = csv.writer(fh)
        w.writerow(["family", "quantity", "loglik", "estimate", "lower", "upper"])
        w.writerows(rows)
    print("wrote", len(rows), "intervals")


if __name__ == "__main__":
    main()
