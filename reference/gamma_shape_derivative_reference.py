#!/usr/bin/env python3
"""Dense reference for the gamma logCdf / logSurvival gradients, computed with mpmath at 40 digits.

Shapes 1e-9 .. 5000 (tiny shapes, where psi(a) ~ -1/a, to large ones, where P and Q are ~1/2 at
y ~ a), at y = rate x from 1e-12 to the far upper tail (Q ~ 1e-220), including both sides of the
series / continued-fraction switch at y = a + 1.  Shape part: mp.diff of the log of the smaller of
P = gammainc(a, 0, y, regularized=True) and Q = gammainc(a, y, inf, regularized=True); the other
side by P' = -Q' (P + Q = 1; differentiating log P directly where P = 1 - 1e-200 would need more
than 40 digits).  Rate part: d log F / d rate = x f(x) / F(x), d log S / d rate = -x f(x) / S(x)
(chain rule on F(x) = P(a, rate x)), cross-checked against mp.diff in the rate below.
Writes lib-distributions/src/test/resources/org/incipit/distributions/gamma_shape_derivative.csv.
Run: python3 reference/gamma_shape_derivative_reference.py
"""
import os
import sys
import mpmath as mp

mp.mp.dps = 40
OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), '..', 'lib-distributions', 'src', 'test',
                   'resources', 'org', 'incipit', 'distributions', 'gamma_shape_derivative.csv')
SHAPES = [1e-9, 1e-6, 0.01, 0.2, 0.7, 1.0, 2.5, 10.0, 50.0, 300.0, 5000.0]
RATES = [1.0, 2.5]


def ys(a):
    sq = a ** 0.5
    return sorted({1e-12, 1e-4, 0.1, 0.5 * a, a, (a + 1) * (1 - 1e-9), (a + 1) * (1 + 1e-9),
                   a + 1 + sq, a + 1 + 3 * sq, 2 * a + 10, a + 30 * sq + 30, a + 10 * sq + 500})


def row(a, rate, x):
    A, R, X = mp.mpf(a), mp.mpf(rate), mp.mpf(x)
    lower = lambda s, r: mp.gammainc(s, 0, r * X, regularized=True)
    upper = lambda s, r: mp.gammainc(s, r * X, mp.inf, regularized=True)
    p, q = lower(A, R), upper(A, R)
    if p < q:
        dp = mp.diff(lambda s: mp.log(lower(s, R)), A)
        dq = -dp * p / q
    else:
        dq = mp.diff(lambda s: mp.log(upper(s, R)), A)
        dp = -dq * q / p
    xf = mp.exp(A * mp.log(R * X) - R * X - mp.loggamma(A))  # x f(x) = y^a e^-y / Gamma(a)
    rp, rq = xf / (R * p), -xf / (R * q)
    small, dsmall, rsmall = (lower, dp, rp) if p < q else (upper, dq, rq)
    check = mp.diff(lambda r: mp.log(small(A, r)), R)
    if abs(check - rsmall) > mp.mpf(10) ** -25 * abs(rsmall):
        sys.exit('rate derivative cross-check failed at a=%r rate=%r x=%r' % (a, rate, x))
    return [repr(a), repr(rate), repr(x)] + [mp.nstr(v, 20) for v in (dp, rp, dq, rq, p, q)]


def main():
    with open(OUT, 'w') as f:
        f.write('# tool: python3 %s, mpmath %s (mp.dps=40)\n' % (sys.version.split()[0], mp.__version__))
        f.write('# script: reference/gamma_shape_derivative_reference.py\n')
        f.write('# call: mp.diff(lambda s: mp.log(mp.gammainc(s, 0, rate*x, regularized=True)), shape) on the smaller'
                ' side (P or Q), the other by P\' = -Q\'; rate part x f(x)/F, -x f(x)/S\n')
        f.write('shape,rate,x,dlogcdf_dshape,dlogcdf_drate,dlogsf_dshape,dlogsf_drate,cdf,sf\n')
        for a in SHAPES:
            for rate in RATES:
                for y in ys(a):
                    f.write(','.join(row(a, rate, y / rate)) + '\n')


if __name__ == '__main__':
    main()
