#!/usr/bin/env python3
"""Reference values of e^x for the table-driven exponential of the likelihood kernels (FastExp).

mpmath 1.3 at 60 significant digits gives e^x for each double x; the CSV holds x exactly (as
float.hex) and e^x to 25 significant digits, so the test can measure its error in fractions
of an ulp. The points: 2,000 uniform in [-708, 708], 1,000 uniform in [-1, 1], 500 in
[-1e-3, 1e-3], the points k ln2/256 (nearest doubles) that lie halfway between two table
nodes for k odd in [-4001, 4001] (the largest |r| of the reduction), and the ends +-708.
Seed 20261201.

Run from the repository root:  python3 reference/fast_exp_reference.py
"""
import random

import mpmath

mpmath.mp.dps = 60
OUT = "lib-core/src/test/resources/org/incipit/core/estimate/ambiguous/fast_exp.csv"


def main():
    rng = random.Random(20261201)
    xs = [rng.uniform(-708, 708) for _ in range(2000)]
    xs += [rng.uniform(-1, 1) for _ in range(1000)]
    xs += [rng.uniform(-1e-3, 1e-3) for _ in range(500)]
    ln2 = mpmath.log(2)
    xs += [float(k * ln2 / 256) for k in range(-4001, 4002, 2)]
    xs += [708.0, -708.0, 0.0, 1e-300, -1e-300]
    with open(OUT, "w") as fh:
        fh.write("# e^x by mpmath %s at %d digits; reference/fast_exp_reference.py\n" % (mpmath.__version__, mpmath.mp.dps))
        fh.write("x_hex,exp\n")
        for x in xs:
            fh.write("%s,%s\n" % (float.hex(x), mpmath.nstr(mpmath.exp(mpmath.mpf(x)), 25, min_fixed=1, max_fixed=0)))


if __name__ == "__main__":
    main()
