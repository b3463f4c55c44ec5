#!/usr/bin/env python3
"""Reference values for org.incipit.examples.LogLogisticDelay from scipy.stats.fisk
(scipy 1.17; fisk(c = shape, scale = scale) is the log-logistic) and mpmath 1.3: the survival
function as 1 / (1 + (x/scale)^shape) at 40 digits (scipy's fisk.sf is computed as 1 - cdf in
effect and loses relative accuracy in the upper tail: it returns 0 for 1.68e-17 at x = 25 scale,
shape 12), and quadrature for the Laplace transform E[exp(-s X)] (mpmath.quad over [0, inf)).

Writes lib-examples/src/test/resources/org/incipit/examples/loglogistic_reference.csv:
shape,scale,x,logpdf,cdf,sf,p,ppf,mean,var,s,laplace
"""
import mpmath
import scipy
import scipy.stats

OUT = "lib-examples/src/test/resources/org/incipit/examples/loglogistic_reference.csv"
mpmath.mp.dps = 40


def laplace(c, scale, s):
    c, scale, s = mpmath.mpf(c), mpmath.mpf(scale), mpmath.mpf(s)
    f = lambda x: c / scale * (x / scale) ** (c - 1) / (1 + (x / scale) ** c) ** 2 * mpmath.exp(-s * x)
    return mpmath.quad(f, [0, scale, 10 * scale, mpmath.inf])


rows = []
for c, scale in [(2.5, 4.0), (3.2, 5.5), (6.0, 2.0), (1.5, 10.0), (12.0, 7.0)]:
    d = scipy.stats.fisk(c, scale=scale)
    for x, p, s in [(0.3, 0.01, 0.05), (1.7, 0.3, 0.2), (scale, 0.5, 0.7), (3 * scale, 0.9, 1.5),
                    (25 * scale, 0.999, 3.0)]:
        mean = d.mean() if c > 1 else float("inf")
        var = d.var() if c > 2 else float("inf")
        sf = 1 / (1 + (mpmath.mpf(x) / scale) ** c)
        rows.append((c, scale, x, d.logpdf(x), d.cdf(x), float(sf), p, d.ppf(p), mean, var, s,
                     float(laplace(c, scale, s))))

with open(OUT, "w") as f:
    f.write("# scipy %s scipy.stats.fisk(c=shape, scale=scale): logpdf, cdf, ppf, mean, var;"
            " sf by mpmath %s as 1/(1+(x/scale)^shape); mpmath quad: laplace = E[exp(-s X)]\n" % (scipy.__version__, mpmath.__version__))
    f.write("shape,scale,x,logpdf,cdf,sf,p,ppf,mean,var,s,laplace\n")
    for r in rows:
        f.write(",".join(repr(float(v)) for v in r) + "\n")
