"""Reference values for org.incipit.core.growth.RenewalEstimator.

Run from the repository root:  python3 reference/renewal_reference.py
Writes lib-core/src/test/resources/org/incipit/core/growth/renewal_*.csv.

Invented scenario: seeded simulated renewal-process incidence (numpy default_rng(20261201)),
with a few imported cases. Direct closed-form computation, independent of the Java code:
  * total infectiousness Lambda_t = sum_{s>=1} (local + imported)_{t-s} w_s;
  * Cori, Ferguson, Fraser & Cauchemez 2013 (Am J Epidemiol 178) posterior per window of 7 days:
    Gamma(shape = a + sum i, scale = 1 / (1/b + sum Lambda)), prior a = 1, b = 5,
    scipy.stats.gamma(shape, scale=scale).mean/std/ppf(0.025, 0.5, 0.975);
  * constant-R Poisson likelihood over days 1..20: R_hat = sum i / sum Lambda, profile limits
    2[l(R_hat) - l(R)] = chi2.ppf(0.95, 1) by scipy.optimize.brentq (xtol 1e-15);
  * projection of expected incidence 10 days ahead at R = 1.3.
"""
import numpy as np
import scipy
from scipy import stats, optimize

out = "lib-core/src/test/resources/org/incipit/core/growth/"
header = "# python3 numpy %s scipy %s; script reference/renewal_reference.py\n" % (
    np.__version__, scipy.__version__)

w = np.array([0.0, 0.05, 0.15, 0.22, 0.2, 0.15, 0.1, 0.07, 0.04, 0.02])
w = w / w.sum()
rng = np.random.default_rng(20261201)
T = 45
imported = np.zeros(T, dtype=np.int64)
imported[[0, 2, 5, 11]] = [3, 2, 1, 4]
local = np.zeros(T, dtype=np.int64)
local[0] = 1
R_true = np.where(np.arange(T) < 25, 1.6, 0.8)


def lam_of(local, imported):
    n = len(local)
    lam = np.zeros(n)
    for t in range(1, n):
        for s in range(1, min(t, len(w) - 1) + 1):
            lam[t] += (local[t - s] + imported[t - s]) * w[s]
    return lam


for t in range(1, T):
    lam_t = sum((local[t - s] + imported[t - s]) * w[s] for s in range(1, min(t, len(w) - 1) + 1))
    local[t] = rng.poisson(R_true[t] * lam_t)
lam = lam_of(local, imported)

with open(out + "renewal_data.csv", "w") as f:
    f.write(header)
    f.write("day,local,imported,lambda\n")
    for t in range(T):
        f.write("%d,%d,%d,%.17g\n" % (t, local[t], imported[t], lam[t]))
with open(out + "renewal_weights.csv", "w") as f:
    f.write(header)
    f.write("s,w\n")
    for s, v in enumerate(w):
        f.write("%d,%.17g\n" % (s, v))

a, b, width = 1.0, 5.0, 7
with open(out + "renewal_windows.csv", "w") as f:
    f.write(header)
    f.write("first,last,shape,scale,mean,sd,q025,q500,q975\n")
    for end in range(width, T):
        start = end - width + 1
        shape = a + local[start:end + 1].sum()
        scale = 1.0 / (1.0 / b + lam[start:end + 1].sum())
        g = stats.gamma(shape, scale=scale)
        f.write("%d,%d,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g\n" % (
            start, end, shape, scale, g.mean(), g.std(), g.ppf(0.025), g.ppf(0.5), g.ppf(0.975)))

first, last = 1, 20
I = local[first:last + 1].sum()
L = lam[first:last + 1].sum()
rhat = I / L
crit = stats.chi2.ppf(0.95, 1)
dev = lambda r: 2 * (I * np.log(rhat / r) - L * (rhat - r)) - crit
lo = optimize.brentq(dev, rhat * 1e-3, rhat, xtol=1e-15, rtol=4 * np.finfo(float).eps)
hi = optimize.brentq(dev, rhat, rhat * 10, xtol=1e-15, rtol=4 * np.finfo(float).eps)
with open(out + "renewal_constant.csv", "w") as f:
    f.write(header)
    f.write("first,last,estimate,lower,upper\n")
    f.write("%d,%d,%.17g,%.17g,%.17g\n" % (first, last, rhat, lo, hi))

R_proj, days = 1.3, 10
allc = list((local + imported).astype(float))
proj = []
for t in range(T, T + days):
    v = R_proj * sum(allc[t - s] * w[s] for s in range(1, len(w)))
    allc.append(v)
    proj.append(v)
with open(out + "renewal_projection.csv", "w") as f:
    f.write(header)
    f.write("day,expected\n")
    for k, v in enumerate(proj):
        f.write("%d,%.17g\n" % (T + k, v))
