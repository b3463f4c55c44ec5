"""Continuous-time expected deaths for the fatality-ratio convention test
(org.incipit.core.estimate.fatality).

Tools: python3, scipy 1.17 (scipy.stats.gamma.cdf, scipy.integrate.quad).
Case incidence c(t) = exp(r t) on [0, T]; onset-to-death delay gamma(shape a, rate b).
Continuous expected deaths by T per unit fatality ratio: E = int_0^T c(t) F(T - t) dt.
Also the growth limit check: M_f(-r) = (b / (b + r))^a (closed form for the gamma).
Writes lib-core/src/test/resources/org/incipit/core/estimate/fatality/continuous.csv.
Run from the repository root:  python3 reference/fatality_reference.py
"""
import numpy as np
import scipy
import scipy.stats as st
import scipy.integrate as si

OUT = "lib-core/src/test/resources/org/incipit/core/estimate/fatality/continuous.csv"
rows = []
for (r, T, a, b) in [(0.1, 30.0, 3.0, 0.25), (0.2, 25.0, 2.0, 0.15), (0.05, 40.0, 5.0, 0.5)]:
    F = st.gamma(a, scale=1.0 / b).cdf
    e = si.quad(lambda t: np.exp(r * t) * F(T - t), 0, T, epsabs=0, epsrel=1e-13, limit=400)[0]
    rows.append((r, T, a, b, e))
with open(OUT, "w") as f:
    f.write("# tool: python3 numpy %s scipy %s; call: python3 reference/fatality_reference.py\n"
            % (np.__version__, scipy.__version__))
    f.write("# expected = quad(exp(r t) * gamma(shape, rate).cdf(T - t), 0, T)\n")
    f.write("r,T,shape,rate,expected\n")
    for row in rows:
        f.write("%r,%r,%r,%r,%.15g\n" % row)
