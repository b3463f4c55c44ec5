"""Reference values for the likelihood engine tests (lib-core, org.incipit.core.likelihood).

Tools: python3, numpy (data generation), scipy 1.17 (scipy.stats.*.fit with floc=0,
scipy.optimize.minimize), mpmath 1.3 (50-digit refinement of the MLE by findroot on the
score, 50-digit central-difference Hessian, likelihood-ratio interval roots).

Writes into lib-core/src/test/resources/org/incipit/core/likelihood/:
  weibull_data.csv, gamma_data.csv   seeded samples, one value per line (repr, round-trips)
  engine_reference.csv               key,value pairs

Run from the repository root:  python3 reference/engine_reference.py
"""
import os
import numpy as np
import scipy
import scipy.stats as st
import scipy.optimize as so
import mpmath as mp

mp.mp.dps = 50
OUT = "lib-core/src/test/resources/org/incipit/core/likelihood"
HEADER = ("# tool: python3 numpy %s scipy %s mpmath %s; call: reference/engine_reference.py\n"
          % (np.__version__, scipy.__version__, mp.__version__))

rng = np.random.default_rng(20240501)
weib = st.weibull_min.rvs(1.7, scale=5.0, size=80, random_state=rng)
gam = st.gamma.rvs(2.3, scale=3.0, size=80, random_state=rng)

def write_data(name, x, call):
    with open(os.path.join(OUT, name), "w") as f:
        f.write(HEADER)
        f.write("# " + call + "\n")
        for v in x:
            f.write(repr(float(v)) + "\n")

write_data("weibull_data.csv", weib, "scipy.stats.weibull_min.rvs(1.7, scale=5.0, size=80, numpy default_rng(20240501))")
write_data("gamma_data.csv", gam, "scipy.stats.gamma.rvs(2.3, scale=3.0, size=80, same generator after the Weibull draw)")

W = [mp.mpf(float(v)) for v in weib]
G = [mp.mpf(float(v)) for v in gam]

def ll_weibull(k, lam):
    n = len(W)
    return (n * mp.log(k) - n * k * mp.log(lam) + (k - 1) * mp.fsum(mp.log(x) for x in W)
            - mp.fsum((x / lam) ** k for x in W))

def ll_gamma(a, b):  # shape a, rate b
    n = len(G)
    return (n * a * mp.log(b) - n * mp.loggamma(a) + (a - 1) * mp.fsum(mp.log(x) for x in G)
            - b * mp.fsum(G))

def grad(f, p, h=mp.mpf("1e-15")):
    g = []
    for i in range(len(p)):
        up = list(p); dn = list(p)
        up[i] += h; dn[i] -= h
        g.append((f(*up) - f(*dn)) / (2 * h))
    return g

def hessian(f, p, h=mp.mpf("1e-12")):
    k = len(p)
    H = mp.matrix(k, k)
    for i in range(k):
        for j in range(k):
            def fv(di, dj):
                q = list(p); q[i] += di; q[j] += dj
                return f(*q)
            H[i, j] = (fv(h, h) - fv(h, -h) - fv(-h, h) + fv(-h, -h)) / (4 * h * h)
    return H

rows = []
def put(key, value):
    rows.append((key, mp.nstr(mp.mpf(value), 20) if not isinstance(value, str) else value))

# --- Weibull ---
c, loc, scale = st.weibull_min.fit(weib, floc=0)
res = so.minimize(lambda p: -float(ll_weibull(mp.mpf(p[0]), mp.mpf(p[1]))), [c, scale],
                  method="Nelder-Mead", options={"xatol": 1e-12, "fatol": 1e-14, "maxiter": 20000})
opt = mp.findroot(lambda k, l: grad(ll_weibull, [k, l]), (mp.mpf(c), mp.mpf(scale)))
k_hat, l_hat = opt[0], opt[1]
H = hessian(ll_weibull, [k_hat, l_hat])
C = (-H) ** -1
put("weibull.scipy_fit.shape", c); put("weibull.scipy_fit.scale", scale)
put("weibull.minimize.shape", res.x[0]); put("weibull.minimize.scale", res.x[1])
put("weibull.shape", k_hat); put("weibull.scale", l_hat)
put("weibull.loglik", ll_weibull(k_hat, l_hat))
put("weibull.cov.shape.shape", C[0, 0]); put("weibull.cov.shape.scale", C[0, 1])
put("weibull.cov.scale.scale", C[1, 1])

# Profile likelihood interval for the Weibull shape; the nuisance scale has the closed form
# lambda(k) = (mean(x^k))^(1/k).
crit = mp.mpf(st.chi2.ppf(0.95, 1))
def prof_w(k):
    lam = (mp.fsum(x ** k for x in W) / len(W)) ** (1 / k)
    return ll_weibull(k, lam)
lw = ll_weibull(k_hat, l_hat)
lo = mp.findroot(lambda k: 2 * (lw - prof_w(k)) - crit, k_hat * 0.85)
hi = mp.findroot(lambda k: 2 * (lw - prof_w(k)) - crit, k_hat * 1.15)
put("weibull.profile95.shape.lower", lo); put("weibull.profile95.shape.upper", hi)

# Profile likelihood interval for the derived Weibull mean m = scale * Gamma(1 + 1/shape):
# for fixed m, scale = m / Gamma(1 + 1/k) and the shape is re-maximised (root of d/dk).
def prof_mean(m):
    f = lambda k: ll_weibull(k, m / mp.gamma(1 + 1 / k))
    k = mp.findroot(lambda kk: mp.diff(f, kk), k_hat)
    return f(k)
m_hat = l_hat * mp.gamma(1 + 1 / k_hat)
lo = mp.findroot(lambda m: 2 * (lw - prof_mean(m)) - crit, m_hat * 0.9)
hi = mp.findroot(lambda m: 2 * (lw - prof_mean(m)) - crit, m_hat * 1.1)
put("weibull.mean", m_hat)
put("weibull.profile95.mean.lower", lo); put("weibull.profile95.mean.upper", hi)

# --- Gamma (shape, rate) ---
a, loc, gscale = st.gamma.fit(gam, floc=0)
res = so.minimize(lambda p: -float(ll_gamma(mp.mpf(p[0]), mp.mpf(p[1]))), [a, 1 / gscale],
                  method="Nelder-Mead", options={"xatol": 1e-12, "fatol": 1e-14, "maxiter": 20000})
opt = mp.findroot(lambda s, r: grad(ll_gamma, [s, r]), (mp.mpf(a), 1 / mp.mpf(gscale)))
a_hat, b_hat = opt[0], opt[1]
H = hessian(ll_gamma, [a_hat, b_hat])
C = (-H) ** -1
put("gamma.scipy_fit.shape", a); put("gamma.scipy_fit.rate", 1 / gscale)
put("gamma.minimize.shape", res.x[0]); put("gamma.minimize.rate", res.x[1])
put("gamma.shape", a_hat); put("gamma.rate", b_hat)
put("gamma.loglik", ll_gamma(a_hat, b_hat))
put("gamma.cov.shape.shape", C[0, 0]); put("gamma.cov.shape.rate", C[0, 1])
put("gamma.cov.rate.rate", C[1, 1])

# --- Binomial proportion, likelihood-ratio interval: 2[l(p_hat) - l(p)] = chi2_1(0.95) ---
x, n = 7, 23
def ll_b(p):
    return x * mp.log(p) + (n - x) * mp.log(1 - p)
ph = mp.mpf(x) / n
lo = mp.findroot(lambda p: 2 * (ll_b(ph) - ll_b(p)) - crit, (mp.mpf("0.05"), ph), solver="anderson")
hi = mp.findroot(lambda p: 2 * (ll_b(ph) - ll_b(p)) - crit, (ph, mp.mpf("0.7")), solver="anderson")
put("binomial.x", x); put("binomial.n", n)
put("binomial.chi2_1_0.95", crit)
put("binomial.lr95.lower", lo); put("binomial.lr95.upper", hi)

with open(os.path.join(OUT, "engine_reference.csv"), "w") as f:
    f.write(HEADER)
    f.write("# MLEs refined by mpmath.findroot on the 50-digit central-difference score, started at\n")
    f.write("# scipy.stats.*.fit(floc=0); covariance = inverse of minus the 50-digit Hessian (natural\n")
    f.write("# parameters); LR roots by mpmath.findroot; chi2 quantile scipy.stats.chi2.ppf(0.95, 1).\n")
    f.write("key,value\n")
    for k, v in rows:
        f.write("%s,%s\n" % (k, v))
