#!/usr/bin/env python3
"""Reference values for the simulation-study summaries (org.incipit.core.study).

Clopper-Pearson (1934) exact 95% intervals for a binomial proportion x of m:
lower = root of I_x(x, m-x+1) = 0.025, upper = root of I_x(x+1, m-x) = 0.975, solved with
mpmath 1.3 (40 digits; mpmath.betainc(..., regularized=True), mpmath.findroot, Illinois method
bracketed around scipy's value). scipy.stats.binomtest(x, m).proportion_ci(0.95, 'exact') is
written beside it: it differs from mpmath by 1e-16 to 7.5e-10 relative (worst: lower bound at
x = 3, m = 2000; scipy's beta quantile), so the tests use the mpmath columns.
Run from the repository root:  python3 reference/study_reference.py
"""
import mpmath as mp
import numpy as np
import scipy
from scipy import stats

OUT = "lib-core/src/test/resources/org/incipit/core/study/clopper_pearson.csv"
CASES = [(0, 1), (1, 1), (0, 10), (1, 10), (5, 10), (9, 10), (10, 10), (0, 400), (371, 400),
         (380, 400), (400, 400), (950, 1000), (999, 1000), (3, 2000), (1900, 2000)]
mp.mp.dps = 40


def root(a, b, target, guess):
    f = lambda t: mp.betainc(a, b, 0, t, regularized=True) - mp.mpf(target)
    lo, hi = mp.mpf(guess) * (1 - mp.mpf("1e-6")), min(mp.mpf(guess) * (1 + mp.mpf("1e-6")), mp.mpf(1))
    return float(mp.findroot(f, (lo, hi), solver="illinois"))


with open(OUT, "w") as f:
    f.write("# mpmath %s (40 digits) Clopper-Pearson 95%%: roots of betainc(x, m-x+1, 0, t) = 0.025 and "
            "betainc(x+1, m-x, 0, t) = 0.975; scipy %s binomtest(x, m).proportion_ci(0.95, 'exact') beside; "
            "script reference/study_reference.py\n" % (mp.__version__, scipy.__version__))
    f.write("x,m,lower,upper,scipy_lower,scipy_upper\n")
    for x, m in CASES:
        ci = stats.binomtest(x, m).proportion_ci(confidence_level=0.95, method="exact")
        lo = 0.0 if x == 0 else root(x, m - x + 1, "0.025", ci.low)
        hi = 1.0 if x == m else root(x + 1, m - x, "0.975", ci.high)
        f.write("%d,%d,%r,%r,%r,%r\n" % (x, m, lo, hi, float(ci.low), float(ci.high)))
