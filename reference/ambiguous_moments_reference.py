#!/usr/bin/env python3
"""Independent reference for the ambiguous-start moment estimator (docs/methods.md, section 2).

Computed with numpy from the equations alone on the seeded open-stream data sets written by
reference/ambiguous_start_reference.py:

    lambda = sum(m - 1) / sum(D1);  a = mean(m) - 1;  c = var(m, ddof=1);  b = var(D1, ddof=1)
    lambda*mu = (a + c - lambda^2 b) / 2;  q/p = (a - c + lambda^2 b) / 2
    sigma^2 = b - (q/p + (q/p)(1 + q/p)) / lambda^2

Run from the repository root:  python3 reference/ambiguous_moments_reference.py
"""
import csv
import os

import numpy as np

DIR = "lib-core/src/test/resources/org/incipit/core/estimate/ambiguous"


def moments(name):
    rows = []
    with open(os.path.join(DIR, name + ".csv")) as fh:
        for r in csv.DictReader(line for line in fh if not line.startswith("#")):
            rows.append((r["case"], float(r["end"]), float(r["start"])))
    cases = {}
    for c, e, s in rows:
        cases.setdefault(c, []).append(e - s)
    m = np.array([len(v) for v in cases.values()], dtype=float)
    d1 = np.array([max(v) for v in cases.values()])
    lam = np.sum(m - 1) / np.sum(d1)
    a = np.mean(m) - 1
    c = np.var(m, ddof=1)
    b = np.var(d1, ddof=1)
    lam_mu = (a + c - lam ** 2 * b) / 2
    odds = (a - c + lam ** 2 * b) / 2
    var = b - (odds + odds * (1 + odds)) / lam ** 2
    return [name, len(m), repr(float(lam)), repr(float(lam_mu / lam)), repr(float(var)),
            repr(float(1 / (1 + odds)))]


def main():
    out = [moments(n) for n in ("open_one_kind", "open_two_kinds", "complete", "known_total")]
    with open(os.path.join(DIR, "moments.csv"), "w", newline="") as fh:
        fh.write("# python3 + numpy %s; script reference/ambiguous_moments_reference.py\n" % np.__version__)
        fh.write("# moment equations of docs/methods.md section 2 (variances with ddof=1)\n")
        w = csv.writer(fh)
        w.writerow(["dataset", "cases", "rate", "mean", "variance", "p"])
        w.writerows(out)


if __name__ == "__main__":
    main()
