#!/usr/bin/env python3
"""Reference values for org.incipit.core.branching (extinction probabilities and
survival-conditioned generation means).

Independent of the Java algorithm: the extinction probability q is the root of
g(s) = f(s) - s in the ORIGINAL variable s, found by mpmath.findroot (bisection, 400 steps,
bracket [0, 1 - 1e-40]) at 60 significant digits; the bracket is valid because g(0) = f(0) > 0
and g(1 - d) ~ -(R - 1) d < 0 for tiny d. Then a few Newton steps at the same precision.
Closed forms as extra rows: Poisson q = -W0(-R exp(-R)) / R (Lambert W, mpmath.lambertw);
negative binomial with k = 1 (geometric offspring) q = 1/R.
Conditioned means: (R^n - q f'(q)^n) / (1 - q) evaluated at 60 digits (formula check).

Run: python3 reference/branching_reference.py > \
  lib-core/src/test/resources/org/incipit/core/branching/extinction_reference.csv
"""
import mpmath as mp

mp.mp.dps = 60


def pgf(family, R, k, s):
    if family == "poisson":
        return mp.exp(R * (s - 1))
    return (1 + R * (1 - s) / k) ** (-k)


def dpgf(family, R, k, s):
    if family == "poisson":
        return R * mp.exp(R * (s - 1))
    return R * (1 + R * (1 - s) / k) ** (-k - 1)


def extinction(family, R, k):
    if R <= 1:
        return mp.mpf(1)
    g = lambda s: pgf(family, R, k, s) - s
    a, b = mp.mpf(0), 1 - mp.mpf(10) ** -40
    assert g(a) > 0 and g(b) < 0, (family, R, k)
    q = mp.findroot(g, (a, b), solver="bisect", maxsteps=400, verify=False)
    for _ in range(5):
        q = q - g(q) / (dpgf(family, R, k, q) - 1)
    assert 0 <= q < 1 and abs(g(q)) < mp.mpf(10) ** -50, (family, R, k, q)
    return q


def cond_mean(family, R, k, q, n):
    if R <= 1:
        return None
    return (R ** n - q * dpgf(family, R, k, q) ** n) / (1 - q)


def fmt(x):
    return "" if x is None else mp.nstr(x, 20, min_fixed=-1, max_fixed=-1)


print("# mpmath %s, mp.dps = 60; python3 reference/branching_reference.py" % mp.__version__)
print("# q: mpmath.findroot(f(s) - s, (0, 1 - 1e-40), solver='bisect', maxsteps=400) + Newton; "
      "closed-form rows: lambertw / 1/R")
print("family,R,k,method,q,one_minus_q,cond_mean_1,cond_mean_2,cond_mean_3")
Rs = ["0.5", "1", "1.000001", "1.00001", "1.0001", "1.001", "1.01", "1.1", "1.5", "2", "3", "5", "10", "20"]
ks = ["0.001", "0.01", "0.02", "0.1", "0.5", "1", "2", "10", "100"]
rows = []
for Rs_ in Rs:
    rows.append(("poisson", Rs_, ""))
    for k in ks:
        rows.append(("negbin", Rs_, k))
for family, Rs_, ks_ in rows:
    # the double nearest to the decimal, exactly as the Java test passes it
    R = mp.mpf(float(Rs_))
    k = mp.mpf(float(ks_)) if ks_ else None
    q = extinction(family, R, k)
    cm = [cond_mean(family, R, k, q, n) for n in (1, 2, 3)]
    print(",".join([family, Rs_, ks_, "root", fmt(q), fmt(1 - q)] + [fmt(c) for c in cm]))
# closed forms
for Rs_ in ["1.5", "2", "3", "5"]:
    R = mp.mpf(float(Rs_))
    q = -mp.lambertw(-R * mp.exp(-R), 0).real / R
    print(",".join(["poisson", Rs_, "", "lambertw", fmt(q), fmt(1 - q), "", "", ""]))
for Rs_ in ["1.0001", "1.5", "2", "4", "10"]:
    R = mp.mpf(float(Rs_))
    q = 1 / R
    print(",".join(["negbin", Rs_, "1", "geometric", fmt(q), fmt(1 - q), "", "", ""]))
