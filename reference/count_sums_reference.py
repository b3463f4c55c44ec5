"""Reference values for org.incipit.core.growth.CountSums (sums over counts of the NB2 terms).

For each seeded count set and dispersion k: L = sum_i [lnGamma(y_i + k) - lnGamma(k)],
D = sum_i [psi(y_i + k) - psi(k)], T = sum_i [psi'(y_i + k) - psi'(k)], by mpmath at 50 digits.
Output: lib-core/src/test/resources/org/incipit/core/growth/count_sums.csv
"""
import random
import sys

import mpmath as mp

mp.mp.dps = 50
rng = random.Random(20261201)
out = sys.stdout
out.write("# mpmath %s, python %s; reference/count_sums_reference.py; "
          "mp.loggamma, mp.psi(0, .), mp.psi(1, .) at 50 digits\n"
          % (mp.__version__, sys.version.split()[0]))
out.write("set,k,counts,L,D,T\n")
for s in range(40):
    n = rng.randint(1, 70)
    top = rng.randint(1, 300) if s % 2 == 0 else rng.randint(5000, 20000)
    y = [0 if rng.random() < 0.25 else rng.randint(0, top) for _ in range(n)]
    k = float(mp.e ** (-3 + 13 * rng.random()))  # 0.05 .. 2e4, rounded to a double
    kk = mp.mpf(k)
    L = sum(mp.loggamma(v + kk) - mp.loggamma(kk) for v in y)
    D = sum(mp.psi(0, v + kk) - mp.psi(0, kk) for v in y)
    T = sum(mp.psi(1, v + kk) - mp.psi(1, kk) for v in y)
    out.write("%d,%r,%s,%s,%s,%s\n" % (s, k, " ".join(map(str, y)),
                                      mp.nstr(L, 20), mp.nstr(D, 20), mp.nstr(T, 20)))
