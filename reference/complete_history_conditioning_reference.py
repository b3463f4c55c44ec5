#!/usr/bin/env python3
"""Reference for the simulator's COMPLETE exposure regime conditioned on every exposure
preceding onset (ExposureModel Javadoc).

M = 2 exposures at w*U_(1) < w*U_(2) (sorted uniforms; the gap G = w (U_(2) - U_(1)) has
density 2 (1 - g/w) / w on [0, w]), each infecting with probability p in time order, the
infecting one J followed by onset after X ~ H. The history is redrawn (X kept) until one
exposure infects and, if J = 1, the second precedes onset (G < X). Given X = x, J = 1 with
probability p F_G(x) / (p F_G(x) + (1 - p) p), F_G(x) = 1 - (1 - x/w)^2 for x < w, else 1.
So P(J = 1) = E_H[F_G(X) / (F_G(X) + 1 - p)], computed by scipy.integrate.quad.

Writes lib-core/src/test/resources/org/incipit/core/simulate/complete_conditioning.csv.
Run from the repository root:  python3 reference/complete_history_conditioning_reference.py
"""
import os

import numpy as np
import scipy
from scipy import integrate, stats

OUT = "lib-core/src/test/resources/org/incipit/core/simulate"


def p_first(p, w, shape, rate):
    h = stats.gamma(shape, scale=1.0 / rate)

    def f_gap(x):
        return 1.0 - (1.0 - x / w) ** 2 if x < w else 1.0

    inner, _ = integrate.quad(lambda x: f_gap(x) / (f_gap(x) + 1 - p) * h.pdf(x), 0, w,
                              epsabs=1e-14, epsrel=1e-13, limit=200)
    tail = h.sf(w) * 1.0 / (2 - p)
    return inner + tail


def main():
    os.makedirs(OUT, exist_ok=True)
    rows = []
    for p, w, shape, rate in [(0.4, 3.0, 2.0, 1.0), (0.7, 1.0, 1.0, 1.0)]:
        rows.append((p, w, shape, rate, p_first(p, w, shape, rate)))
    with open(os.path.join(OUT, "complete_conditioning.csv"), "w") as fh:
        fh.write("# python3 + numpy %s + scipy %s; script reference/complete_history_conditioning_reference.py\n"
                 % (np.__version__, scipy.__version__))
        fh.write("# P(J = 1) for M = 2 exposures in a window w, H = gamma(shape, rate), histories reaching"
                 " onset redrawn; E_H[F_G(X) / (F_G(X) + 1 - p)] by scipy.integrate.quad\n")
        fh.write("p,window,shape,rate,p_first\n")
        for r in rows:
            fh.write(",".join(repr(float(v)) for v in r) + "\n")
    print(rows)


if __name__ == "__main__":
    main()
