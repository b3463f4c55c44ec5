"""Independent reference for the delay likelihoods of org.incipit.core.estimate.delay.

Written from the formulas (docs/methods.md sections 3-4), not from the Java code.
Tools: python3, numpy (seeded data generation), scipy 1.17 (scipy.special gammainc, gammaincc,
gammaln, ndtr, log_ndtr for f, F, S of the three families; scipy.integrate.quad for integrals; scipy.optimize.minimize,
Nelder-Mead from a start near the truth, restarted once from its result, for the maxima).

Parameters: gamma (shape, rate); Weibull (shape, scale); lognormal (meanLog, sdLog).

Data sets (invented scenario, seeded; times in days):
  truncated.csv   continuous pairs observed only if secondary <= T = 40:
                  l = sum log f(d_i) - log F(T - s_i)
  daily.csv       both times known only to the day (day numbers p, q), observed only if
                  q <= T = 40: primary uniform in [p, p + 1), secondary in [q, q + 1);
                  P(k) = int_0^1 [F(k + 1 - u) - F(k - u)] du for k = q - p,
                  truncation A(K) = P(q - p <= K) = int_0^1 F(K + 1 - u) du, K = T - p;
                  l = sum log P(k_i) - log A(T - p_i)
  censored.csv    continuous pairs followed to T = 40, secondary missing if after T:
                  l = sum_obs log f(d_i) + sum_cens log S(T - s_i)
  growth.csv      delays only, primaries growing at r = 0.1 per day:
                  l = sum [log f(d_i) - r d_i] - n log M(-r), M(-r) = int exp(-r x) f(x) dx
  incubation.csv  exposure window [a, b], onset o; variants
                  interval: log[F(o - a) - F(o - b)]  (log f(o - a) if a = b)
                  uniform:  interval - log(b - a)       (log f(o - a) if a = b)
                  growth:   log[ r e^{r o} / (e^{r b} - e^{r a}) int_{o-b}^{o-a} e^{-r x} f(x) dx ]
                            with r = 0.1 (log f(o - a) if a = b)
Writes into lib-core/src/test/resources/org/incipit/core/estimate/delay/:
  the five data CSVs and maxima.csv (dataset, variant, family, param1, param2, loglik).

Run from the repository root:  python3 reference/delay_reference.py
"""
import os
import sys
import numpy as np
import scipy
import scipy.stats as st
import scipy.optimize as so
import scipy.integrate as si
import scipy.special as sc

OUT = "lib-core/src/test/resources/org/incipit/core/estimate/delay"
os.makedirs(OUT, exist_ok=True)
HEADER = ("# tool: python3 numpy %s scipy %s; call: python3 reference/delay_reference.py\n"
          % (np.__version__, scipy.__version__))
T = 40.0
R_GROWTH = 0.1


class Dist:
    """f, F, S and their logs from scipy.special (the formulas of scipy.stats, without the
    frozen-distribution overhead): gamma via gammainc/gammaincc/gammaln, Weibull in closed form,
    lognormal via ndtr/log_ndtr."""

    def __init__(self, family, p1, p2):
        self.family, self.p1, self.p2 = family, p1, p2

    def logpdf(self, x):
        x = np.asarray(x, dtype=float)
        a, b = self.p1, self.p2
        with np.errstate(divide="ignore", invalid="ignore"):
            if self.family == "gamma":
                v = a * np.log(b) - sc.gammaln(a) + (a - 1) * np.log(x) - b * x
            elif self.family == "weibull":
                v = np.log(a / b) + (a - 1) * np.log(x / b) - (x / b) ** a
            else:
                lx = np.log(x)
                v = -lx - np.log(b) - 0.5 * np.log(2 * np.pi) - 0.5 * ((lx - a) / b) ** 2
        return np.where(x > 0, v, -np.inf)

    def pdf(self, x):
        return np.exp(self.logpdf(x))

    def cdf(self, x):
        x = np.asarray(x, dtype=float)
        a, b = self.p1, self.p2
        xp = np.maximum(x, 1e-300)
        if self.family == "gamma":
            v = sc.gammainc(a, b * xp)
        elif self.family == "weibull":
            v = -np.expm1(-(xp / b) ** a)
        else:
            v = sc.ndtr((np.log(xp) - a) / b)
        return np.where(x > 0, v, 0.0)

    def sf(self, x):
        x = np.asarray(x, dtype=float)
        a, b = self.p1, self.p2
        xp = np.maximum(x, 1e-300)
        if self.family == "gamma":
            v = sc.gammaincc(a, b * xp)
        elif self.family == "weibull":
            v = np.exp(-(xp / b) ** a)
        else:
            v = sc.ndtr(-(np.log(xp) - a) / b)
        return np.where(x > 0, v, 1.0)

    def logcdf(self, x):
        if self.family == "lognormal":
            return sc.log_ndtr((np.log(x) - self.p1) / self.p2)
        c, s = self.cdf(x), self.sf(x)
        with np.errstate(divide="ignore"):
            return np.where(c < 0.5, np.log(c), np.log1p(-s))

    def logsf(self, x):
        if self.family == "lognormal":
            return sc.log_ndtr(-(np.log(x) - self.p1) / self.p2)
        if self.family == "weibull":
            return -(np.asarray(x, dtype=float) / self.p2) ** self.p1
        c, s = self.cdf(x), self.sf(x)
        with np.errstate(divide="ignore"):
            return np.where(s < 0.5, np.log(s), np.log1p(-c))


def dist(family, p1, p2):
    return Dist(family, p1, p2)


# the special-function forms agree with scipy.stats to rounding
for fam, p1, p2, ref in [("gamma", 2.5, 0.5, st.gamma(2.5, scale=2.0)),
                         ("weibull", 1.8, 6.0, st.weibull_min(1.8, scale=6.0)),
                         ("lognormal", 1.5, 0.5, st.lognorm(0.5, scale=np.exp(1.5)))]:
    xs = np.array([0.3, 1.0, 4.0, 9.0, 25.0])
    D = Dist(fam, p1, p2)
    for mine, theirs in [(D.logpdf(xs), ref.logpdf(xs)), (D.cdf(xs), ref.cdf(xs)), (D.sf(xs), ref.sf(xs)),
                         (D.logcdf(xs), ref.logcdf(xs)), (D.logsf(xs), ref.logsf(xs))]:
        assert np.allclose(mine, theirs, rtol=1e-11, atol=1e-15), (fam, mine, theirs)


def growth_primaries(rng, r, t_end, n):
    u = rng.random(n)
    return np.log1p(u * np.expm1(r * t_end)) / r


rng = np.random.default_rng(20261201)

# 1. continuous right-truncated pairs: delays gamma(shape 2.5, rate 0.5), primaries growing at 0.15
trunc = []
while len(trunc) < 400:
    s = growth_primaries(rng, 0.15, T, 1)[0]
    d = rng.gamma(2.5, 2.0)
    if s + d <= T:
        trunc.append((s, s + d))
trunc = np.array(trunc)

# 2. daily right-truncated pairs: delays lognormal(1.5, 0.5)
daily = []
while len(daily) < 400:
    s = growth_primaries(rng, 0.15, T, 1)[0]
    d = rng.lognormal(1.5, 0.5)
    p, q = np.floor(s), np.floor(s + d)
    if q <= T:
        daily.append((p, q))
daily = np.array(daily)

# 3. right-censored pairs: delays Weibull(shape 1.8, scale 6), followed up to T
cens = []
for s in growth_primaries(rng, 0.12, T, 300):
    d = 6.0 * rng.weibull(1.8)
    cens.append((s, s + d if s + d <= T else np.nan))
cens = np.array(cens)

# 4. growth-weighted delays: intrinsic gamma(2, rate 0.4) tilted by r = 0.1 is gamma(2, rate 0.5)
growth = rng.gamma(2.0, 1.0 / 0.5, size=300)

# 5. incubation windows: exposure uniform in [a, a + w], w in {0, ..., 5}, lognormal(1.6, 0.45)
inc = []
for i in range(200):
    a = float(rng.integers(0, 30))
    w = float(rng.integers(0, 6))
    e = a + w * rng.random()
    o = e + rng.lognormal(1.6, 0.45)
    # a window reaching past the onset is cut at the onset (exposure after onset cannot have
    # caused it; the observation type requires exposure_to <= onset)
    inc.append((a, min(a + w, o), o))
inc = np.array(inc)


def write(name, cols, rows, call):
    with open(os.path.join(OUT, name), "w") as f:
        f.write(HEADER)
        f.write("# " + call + "\n")
        f.write(",".join(cols) + "\n")
        for row in rows:
            f.write(",".join("" if np.isnan(v) else repr(float(v)) for v in row) + "\n")


write("truncated.csv", ["primary", "secondary"], trunc,
      "pairs with secondary <= 40; delays gamma(2.5, rate 0.5); primaries density ~ exp(0.15 s) on [0, 40]")
write("daily.csv", ["primary_day", "secondary_day"], daily,
      "day numbers with secondary_day <= 40; delays lognormal(1.5, 0.5); primaries ~ exp(0.15 s)")
write("censored.csv", ["primary", "secondary"], cens,
      "followed to 40, secondary empty = not observed by 40; delays Weibull(1.8, 6); primaries ~ exp(0.12 s)")
write("growth.csv", ["delay"], growth.reshape(-1, 1),
      "delays gamma(2, rate 0.5) = gamma(2, rate 0.4) tilted by r = 0.1")
write("incubation.csv", ["exposure_from", "exposure_to", "onset"], inc,
      "exposure uniform in [a, a + w], w in {0..5}, window cut at the onset; incubation lognormal(1.6, 0.45)")


def ll_truncated(D):
    s, q = trunc[:, 0], trunc[:, 1]
    return np.sum(D.logpdf(q - s) - D.logcdf(T - s))


def P_day(D, k):
    g = lambda u: float(D.cdf(k + 1 - u) - D.cdf(k - u))
    return si.quad(g, 0, 1, epsabs=0, epsrel=1e-13, limit=200)[0]


def A_day(D, K):
    return si.quad(lambda u: float(D.cdf(K + 1 - u)), 0, 1, epsabs=0, epsrel=1e-13, limit=200)[0]


def ll_daily(D):
    p, q = daily[:, 0], daily[:, 1]
    total = 0.0
    for k, c in zip(*np.unique(q - p, return_counts=True)):
        total += c * np.log(P_day(D, k))
    for K, c in zip(*np.unique(T - p, return_counts=True)):
        total -= c * np.log(A_day(D, K))
    return total


def ll_censored(D):
    s, q = cens[:, 0], cens[:, 1]
    obs = ~np.isnan(q)
    return np.sum(D.logpdf(q[obs] - s[obs])) + np.sum(D.logsf(T - s[~obs]))


def laplace(D, r):
    return si.quad(lambda x: float(np.exp(-r * x) * D.pdf(x)), 0, np.inf, epsabs=0, epsrel=1e-13, limit=400)[0]


def ll_growth(D):
    return np.sum(D.logpdf(growth) - R_GROWTH * growth) - len(growth) * np.log(laplace(D, R_GROWTH))


def ll_incubation(D, variant):
    total = 0.0
    for a, b, o in inc:
        if a == b:
            total += float(D.logpdf(o - a))
            continue
        if variant == "interval":
            total += np.log(D.cdf(o - a) - D.cdf(o - b))
        elif variant == "uniform":
            total += np.log(D.cdf(o - a) - D.cdf(o - b)) - np.log(b - a)
        else:
            r = R_GROWTH
            integral = si.quad(lambda x: float(np.exp(-r * x) * D.pdf(x)), o - b, o - a,
                               epsabs=0, epsrel=1e-13, limit=200)[0]
            total += np.log(r) + r * o - np.log(np.exp(r * b) - np.exp(r * a)) + np.log(integral)
    return total


def fit(ll, family, starts):
    def neg(x):
        if family == "lognormal":
            p1, p2 = x[0], np.exp(x[1])
        else:
            p1, p2 = np.exp(x[0]), np.exp(x[1])
        with np.errstate(all="ignore"):
            v = ll(dist(family, p1, p2))
        return -v if np.isfinite(v) else 1e300
    best = None
    for s0 in starts[:1]:
        x0 = [s0[0] if family == "lognormal" else np.log(s0[0]), np.log(s0[1])]
        r = so.minimize(neg, x0, method="Nelder-Mead",
                        options={"xatol": 1e-9, "fatol": 1e-11, "maxiter": 4000, "maxfev": 8000})
        # restart from the result (guards against a collapsed simplex)
        r = so.minimize(neg, r.x, method="Nelder-Mead",
                        options={"xatol": 1e-10, "fatol": 1e-12, "maxiter": 4000, "maxfev": 8000})
        if best is None or r.fun < best.fun:
            best = r
    x = best.x
    p1 = x[0] if family == "lognormal" else np.exp(x[0])
    return p1, np.exp(x[1]), -best.fun


STARTS = {"gamma": [(2.0, 0.4), (1.0, 0.2), (5.0, 1.0)],
          "weibull": [(1.5, 5.0), (1.0, 3.0), (3.0, 8.0)],
          "lognormal": [(1.5, 0.5), (1.0, 1.0), (2.0, 0.3)]}

# Optional arguments: family names to compute (rows printed to stdout as CSV, maxima.csv not
# written), e.g. to run the families in parallel and paste the rows into maxima.csv.
FAMILIES = sys.argv[1:] or ["gamma", "weibull", "lognormal"]
rows = []
for family in FAMILIES:
    for name, ll in [("truncated", ll_truncated), ("daily", ll_daily), ("censored", ll_censored),
                     ("growth", ll_growth)]:
        p1, p2, v = fit(ll, family, STARTS[family])
        rows.append((name, "-", family, p1, p2, v))
        print(name, family, p1, p2, v, file=sys.stderr, flush=True)
    for variant in ["interval", "uniform", "growth"]:
        p1, p2, v = fit(lambda D: ll_incubation(D, variant), family, STARTS[family])
        rows.append(("incubation", variant, family, p1, p2, v))
        print("incubation", variant, family, p1, p2, v, file=sys.stderr, flush=True)

if sys.argv[1:]:
    for row in rows:
        print("%s,%s,%s,%.15g,%.15g,%.15g" % row)
    sys.exit(0)

with open(os.path.join(OUT, "maxima.csv"), "w") as f:
    f.write(HEADER)
    f.write("# maxima of the log-likelihoods in the header of reference/delay_reference.py; "
            "param1/param2 = gamma shape/rate, Weibull shape/scale, lognormal meanLog/sdLog; "
            "cut-off T = 40, r = 0.1\n")
    f.write("dataset,variant,family,param1,param2,loglik\n")
    for row in rows:
        f.write("%s,%s,%s,%.15g,%.15g,%.15g\n" % row)
