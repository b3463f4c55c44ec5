#!/usr/bin/env python3
"""Reference values for org.incipit.distributions, computed with mpmath at 40 digits.

Writes CSV files into lib-distributions/src/test/resources/org/incipit/distributions/.
Each file starts with '#' lines naming the tool, version and the calls used.
Closed forms (from memory, Johnson, Kotz & Balakrishnan 1994, Vol. 1): gamma cdf is the
regularised lower incomplete gamma P(shape, rate x); Weibull cdf 1 - exp(-(x/scale)^shape);
lognormal cdf Phi((log x - meanLog)/sdLog).  Laplace transforms: gamma (1 + s/rate)^-shape;
Weibull and lognormal by mpmath.quad in log-space split at the integrand's mode.
scipy is used only as a cross-check at double precision (asserted, not written).
Run: python3 reference/distributions_reference.py
"""
import os
import sys
import mpmath as mp
import scipy
from scipy import stats

mp.mp.dps = 40
OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), '..', 'lib-distributions', 'src', 'test',
                   'resources', 'org', 'incipit', 'distributions')

GAMMA = [(0.2, 1.0), (1.0, 0.5), (2.5, 0.8), (50.0, 10.0)]
WEIBULL = [(0.5, 3.0), (1.0, 2.0), (1.5, 5.0), (5.0, 10.0)]
LOGNORMAL = [(1.0, 2.0), (1.5, 0.5), (2.0, 0.1)]
CASES = [('gamma', p) for p in GAMMA] + [('weibull', p) for p in WEIBULL] + [('lognormal', p) for p in LOGNORMAL]


def M(v):
    return mp.mpf(v)


def logpdf(fam, a, b, x):
    x = M(x)
    a = M(a)
    b = M(b)
    if fam == 'gamma':
        return a * mp.log(b) - mp.loggamma(a) + (a - 1) * mp.log(x) - b * x
    if fam == 'weibull':
        return mp.log(a / b) + (a - 1) * mp.log(x / b) - (x / b) ** a
    w = (mp.log(x) - a) / b
    return -mp.log(x) - mp.log(b) - mp.log(2 * mp.pi) / 2 - w * w / 2


def cdf(fam, a, b, x):
    x = M(x); a = M(a); b = M(b)
    if fam == 'gamma':
        return mp.gammainc(a, 0, b * x, regularized=True)
    if fam == 'weibull':
        return -mp.expm1(-(x / b) ** a)
    return mp.ncdf((mp.log(x) - a) / b)


def sf(fam, a, b, x):
    x = M(x); a = M(a); b = M(b)
    if fam == 'gamma':
        return mp.gammainc(a, b * x, mp.inf, regularized=True)
    if fam == 'weibull':
        return mp.exp(-(x / b) ** a)
    return mp.ncdf(-(mp.log(x) - a) / b)


def mean(fam, a, b):
    a = M(a); b = M(b)
    if fam == 'gamma':
        return a / b
    if fam == 'weibull':
        return b * mp.gamma(1 + 1 / a)
    return mp.exp(a + b * b / 2)


def solve_log(fun, target, lo, hi):
    """Root of fun(t) = target for increasing fun of t = log x, by bisection then secant."""
    flo, fhi = fun(lo) - target, fun(hi) - target
    while flo > 0:
        lo -= 2 * (hi - lo) + 1; flo = fun(lo) - target
    while fhi < 0:
        hi += 2 * (hi - lo) + 1; fhi = fun(hi) - target
    for _ in range(70):
        mid = (lo + hi) / 2
        fm = fun(mid) - target
        if fm > 0:
            hi = mid
        else:
            lo = mid
    return mp.findroot(lambda t: fun(t) - target, (lo, hi), solver='anderson')


def quantile(fam, a, b, p):
    """x with cdf(x) = p (p <= 1/2) or sf(x) = 1 - p, p an exact binary double."""
    p = M(p)
    m = mp.log(mean(fam, a, b))
    if p <= mp.mpf('0.5'):
        return mp.exp(solve_log(lambda t: mp.log(cdf(fam, a, b, mp.exp(t))), mp.log(p), m - 5, m))
    q = 1 - p
    return mp.exp(solve_log(lambda t: -mp.log(sf(fam, a, b, mp.exp(t))), -mp.log(q), m, m + 5))


def quantile_sf(fam, a, b, q):
    m = mp.log(mean(fam, a, b))
    return mp.exp(solve_log(lambda t: -mp.log(sf(fam, a, b, mp.exp(t))), -mp.log(M(q)), m, m + 5))


def laplace(fam, a, b, s, moment=0, lower=None, upper=None):
    """Integral of x^moment exp(-s x) f(x) over [lower, upper] (None = 0 / infinity)."""
    s = M(s); a = M(a); b = M(b)
    if fam == 'gamma' and moment == 0 and lower is None and upper is None:
        return (1 + s / b) ** (-a)
    if fam == 'lognormal':
        h = lambda z: -z * z / 2 - s * mp.exp(a + b * z) + moment * (a + b * z) - mp.log(2 * mp.pi) / 2
        dh = lambda z: -z - s * b * mp.exp(a + b * z) + moment * b
        d2h = lambda z: -1 - s * b * b * mp.exp(a + b * z)
        tr = lambda x: (mp.log(x) - a) / b
    elif fam == 'weibull':
        h = lambda g: g - mp.exp(g) - s * b * mp.exp(g / a) + moment * (mp.log(b) + g / a)
        dh = lambda g: 1 + moment / a - mp.exp(g) - s * b / a * mp.exp(g / a)
        d2h = lambda g: -mp.exp(g) - s * b / a / a * mp.exp(g / a)
        tr = lambda x: a * (mp.log(x) - mp.log(b))
    else:  # gamma in g = log(rate x)
        h = lambda g: (a + moment) * g - mp.exp(g) * (1 + s / b) - mp.loggamma(a) - moment * mp.log(b)
        dh = lambda g: a + moment - mp.exp(g) * (1 + s / b)
        d2h = lambda g: -mp.exp(g) * (1 + s / b)
        tr = lambda x: mp.log(b * x)
    # mode: h' decreases through 0 once (unimodal h); bisection on a wide bracket
    lo, hi = mp.mpf(-400), mp.mpf(60)
    for _ in range(160):
        mid = (lo + hi) / 2
        if dh(mid) > 0:
            lo = mid
        else:
            hi = mid
    zp = (lo + hi) / 2
    wdt = 1 / mp.sqrt(-d2h(zp))
    # finite ends instead of +-inf (mpmath would evaluate exp at ~1e100): the left tails decay at
    # least like exp(0.2 g), the right ones at least like a Gaussian of width wdt; both cut far
    # below 1e-100 relative.
    zlo = zp - 5000 if lower is None else tr(M(lower))
    zhi = zp + max(80 * wdt, 80) if upper is None else tr(M(upper))
    zc = min(max(zp, zlo), zhi)
    pts = [zlo] + [zc + k * wdt for k in (-40, -12, -4, -1, 0, 1, 4, 12, 40) if zlo < zc + k * wdt < zhi] + [zhi]
    hp = h(zc)
    val = mp.quad(lambda z: mp.exp(h(z) - hp), pts)
    return val * mp.exp(hp)


def header(f, calls):
    f.write('# tool: python3 %s, mpmath %s (mp.dps=%d), scipy %s (cross-check only)\n'
            % (sys.version.split()[0], mp.__version__, mp.mp.dps, scipy.__version__))
    f.write('# script: reference/distributions_reference.py\n')
    for c in calls:
        f.write('# call: %s\n' % c)


def s20(v):
    return mp.nstr(v, 20, min_fixed=1, max_fixed=0) if v != 0 else '0'


def r17(v):
    return repr(float(v))


def write_points():
    lower = [1e-300, 1e-100, 1e-30, 1e-10, 1e-3, 0.1, 0.5]
    upper = [0.5, 0.1, 1e-3, 1e-10, 1e-30, 1e-100, 1e-300, mp.mpf('1e-1000'), mp.mpf('1e-5000')]
    with open(os.path.join(OUT, 'points.csv'), 'w') as f:
        header(f, ['x = double nearest quantile at lower probability p or survival q (findroot)',
                   'logpdf closed form; cdf, sf: gamma mp.gammainc(a,0,rate*x,regularized=True) / '
                   'mp.gammainc(a,rate*x,inf,regularized=True); weibull -expm1(-z), exp(-z); lognormal mp.ncdf(+-w)',
                   'logcdf = mp.log(cdf), logsf = mp.log(sf)'])
        f.write('family,p1,p2,x,logpdf,cdf,sf,logcdf,logsf\n')
        for fam, (a, b) in CASES:
            xs = []
            for p in lower:
                xs.append(quantile(fam, a, b, p))
            for q in upper:
                xs.append(quantile_sf(fam, a, b, q))
            for x in xs:
                xd = float(x)
                if not (0 < xd < 1.7e308):
                    continue
                c = cdf(fam, a, b, xd); s = sf(fam, a, b, xd)
                f.write(','.join([fam, r17(a), r17(b), r17(xd), s20(logpdf(fam, a, b, xd)), s20(c), s20(s),
                                  s20(mp.log(c)), s20(mp.log(s))]) + '\n')
                # scipy cross-check at double precision (bulk only)
                if fam == 'gamma' and 1e-200 < c < 1 - 1e-12 and 1e-200 < s:
                    assert abs(stats.gamma.cdf(xd, a, scale=1 / b) / float(c) - 1) < 1e-9


def write_quantiles():
    ps = [1e-300, 1e-100, 1e-20, 1e-8, 1e-3, 0.01, 0.1, 0.25, 0.5, 0.75, 0.9, 0.99, 0.999, 1 - 1e-8, 1 - 1e-12]
    with open(os.path.join(OUT, 'quantile.csv'), 'w') as f:
        header(f, ['x solving cdf(x) = p (p <= 1/2) or sf(x) = 1 - p exactly, bisection + mp.findroot(anderson) on log x'])
        f.write('family,p1,p2,p,x\n')
        for fam, (a, b) in CASES:
            for p in ps:
                x = quantile(fam, a, b, p)
                f.write(','.join([fam, r17(a), r17(b), r17(p), s20(x)]) + '\n')


def write_laplace():
    with open(os.path.join(OUT, 'laplace.csv'), 'w') as f:
        header(f, ['gamma: (1 + s/rate)^-shape', 'weibull, lognormal: mp.quad of exp(h) in log-space, split at the mode',
                   'self-check: the log-space mp.quad reproduces the gamma closed form to 1e-25 (asserted)'])
        f.write('family,p1,p2,s,laplace\n')
        for fam, (a, b) in CASES:
            m = float(mean(fam, a, b))
            ss = [5.0 / m * i / 10 for i in range(0, 11)] + [20.0 / m, 100.0 / m]
            if fam == 'gamma':
                ss += [-0.5 * b, -0.9 * b]
            if fam == 'weibull' and a > 1:
                ss += [-0.5 / m, -2.0 / m]
            if fam == 'weibull' and a == 1:
                ss += [-0.5 / b]
            for s in ss:
                v = laplace(fam, a, b, s)
                f.write(','.join([fam, r17(a), r17(b), r17(s), s20(v)]) + '\n')
        # quadrature self-check on gamma: log-space quad against the closed form
        for a, b in GAMMA:
            for s in (0.3 * b, 3 * b):
                v = laplace('gamma', a, b, s, upper=1e300)  # forces the log-space quadrature path
                assert abs(v / (1 + M(s) / b) ** (-M(a)) - 1) < mp.mpf('1e-25'), (a, b, s)


def write_tilted():
    with open(os.path.join(OUT, 'tilted.csv'), 'w') as f:
        header(f, ['L_m(r) = mp.quad of x^m exp(-r x) f(x) in log-space; mean = L1/L0, var = L2/L0 - mean^2',
                   'cdf at x0 = integral over [0, x0] / L0, sf over [x0, inf) / L0; laplace(s) = L0(r + s)/L0(r)'])
        f.write('family,p1,p2,r,mean,variance,x0,cdf,sf,s,laplace\n')
        rows = [('weibull', (0.5, 3.0), [0.1, 0.5]), ('weibull', (1.5, 5.0), [0.1, 0.5, -0.1]),
                ('weibull', (5.0, 10.0), [0.2, -0.3]), ('lognormal', (1.0, 2.0), [0.1, 0.5]),
                ('lognormal', (1.5, 0.5), [0.1, 1.0]), ('lognormal', (2.0, 0.1), [0.3])]
        for fam, (a, b), rs in rows:
            for r in rs:
                l0 = laplace(fam, a, b, r)
                l1 = laplace(fam, a, b, r, moment=1)
                l2 = laplace(fam, a, b, r, moment=2)
                mu = l1 / l0
                var = l2 / l0 - mu * mu
                x0 = float(mean(fam, a, b))
                c = laplace(fam, a, b, r, lower=None, upper=x0) / l0
                s_ = laplace(fam, a, b, r, lower=x0, upper=None) / l0
                s = 0.7
                lt = laplace(fam, a, b, r + s) / l0
                f.write(','.join([fam, r17(a), r17(b), r17(r), s20(mu), s20(var), r17(x0), s20(c), s20(s_),
                                  r17(s), s20(lt)]) + '\n')


def write_gradients():
    with open(os.path.join(OUT, 'gradient.csv'), 'w') as f:
        header(f, ['mp.diff of logpdf / mp.log(cdf) / mp.log(sf) with respect to each natural parameter'])
        f.write('family,p1,p2,x,kind,d1,d2\n')
        for fam, (a, b) in CASES:
            xs = [float(quantile(fam, a, b, p)) for p in (1e-6, 0.01, 0.5, 0.99)] + [float(quantile_sf(fam, a, b, 1e-12))]
            for x in xs:
                for kind, fn in (('logpdf', logpdf), ('logcdf', lambda F, A, B, X: mp.log(cdf(F, A, B, X))),
                                 ('logsf', lambda F, A, B, X: mp.log(sf(F, A, B, X)))):
                    d1 = mp.diff(lambda u: fn(fam, u, b, x), M(a))
                    d2 = mp.diff(lambda u: fn(fam, a, u, x), M(b))
                    f.write(','.join([fam, r17(a), r17(b), r17(x), kind, s20(d1), s20(d2)]) + '\n')


def partial_mean(fam, a, b, x):
    """Integral of t f(t) over [0, x] in closed form (size-biased law)."""
    x = M(x); a = M(a); b = M(b)
    if x <= 0:
        return mp.mpf(0)
    if fam == 'gamma':
        return a / b * mp.gammainc(a + 1, 0, b * x, regularized=True)
    if fam == 'weibull':
        return mean(fam, a, b) * mp.gammainc(1 + 1 / a, 0, (x / b) ** a, regularized=True)
    return mean(fam, a, b) * mp.ncdf((mp.log(x) - a) / b - b)


def write_masses():
    with mp.workdps(80):
        _write_masses()


def _write_masses():
    with open(os.path.join(OUT, 'masses.csv'), 'w') as f:
        header(f, ['mp.dps raised to 80 for this table',
                   'DAY_INTERVAL: cdf(d+1) - cdf(d); tail sf(n+1)',
                   'DOUBLE_CENSORED: mass = int (1 - |x - d|) f(x) dx over [d-1, d+1] = C_d + B_(d-1) with '
                   'C_j = (j+1) dF_j - dM_j, B_j = dM_j - j dF_j, dM_j = partial first moments in closed form '
                   '(gamma: mean P(a+1, rate x); weibull: mean P(1+1/k, z); lognormal: mean Phi(w - sdLog)); '
                   'tail = sf(n+1) + B_n; cross-checked against mp.quad of the weighted density where the mass > 1e-20',
                   'd = -1 rows hold the tail for maxDay = 12'])
        f.write('family,p1,p2,scheme,d,mass\n')
        n = 12
        for fam, (a, b) in CASES:
            pdf = lambda x: mp.exp(logpdf(fam, a, b, x))
            dF = [cdf(fam, a, b, j + 1) - cdf(fam, a, b, j) if j > 0 else cdf(fam, a, b, 1) for j in range(n + 1)]
            dM = [partial_mean(fam, a, b, j + 1) - partial_mean(fam, a, b, j) for j in range(n + 1)]
            for d in range(n + 1):
                f.write(','.join([fam, r17(a), r17(b), 'DAY_INTERVAL', str(d), s20(dF[d])]) + '\n')
            f.write(','.join([fam, r17(a), r17(b), 'DAY_INTERVAL', '-1', s20(sf(fam, a, b, n + 1))]) + '\n')
            B = [dM[j] - j * dF[j] for j in range(n + 1)]
            C = [(j + 1) * dF[j] - dM[j] for j in range(n + 1)]
            for d in range(n + 1):
                m = C[d] + (B[d - 1] if d > 0 else 0)
                if m > mp.mpf('1e-20') and d > 0:
                    with mp.workdps(30):
                        right = mp.quad(lambda x: (d + 1 - x) * pdf(x), [d, d + 1])
                        left = mp.quad(lambda x: (x - d + 1) * pdf(x), [d - 1, d])
                    assert abs((right + left) / m - 1) < 1e-8, (fam, a, b, d, m, right + left)
                f.write(','.join([fam, r17(a), r17(b), 'DOUBLE_CENSORED', str(d), s20(m)]) + '\n')
            tail = sf(fam, a, b, n + 1) + B[n]
            total = sum(C[d] + (B[d - 1] if d > 0 else 0) for d in range(n + 1)) + tail
            assert abs(total - 1) < mp.mpf('1e-30')
            f.write(','.join([fam, r17(a), r17(b), 'DOUBLE_CENSORED', '-1', s20(tail)]) + '\n')


def write_moments():
    with open(os.path.join(OUT, 'moments.csv'), 'w') as f:
        header(f, ['mean = mp.quad of x f(x), variance = mp.quad of x^2 f(x) - mean^2, both in log-space',
                   'checks the handbook closed forms (Johnson, Kotz & Balakrishnan 1994, from memory) independently'])
        f.write('family,p1,p2,mean,variance\n')
        for fam, (a, b) in CASES:
            m1 = laplace(fam, a, b, 0, moment=1)
            m2 = laplace(fam, a, b, 0, moment=2)
            f.write(','.join([fam, r17(a), r17(b), s20(m1), s20(m2 - m1 * m1)]) + '\n')


if __name__ == '__main__':
    os.makedirs(OUT, exist_ok=True)
    which = sys.argv[1:] or ['points', 'quantiles', 'laplace', 'tilted', 'gradients', 'masses']
    for w in which:
        globals()['write_' + w]()
