#!/usr/bin/env python3
"""Ms of a loop with many sensitivity dips, for MarginSearchEdgesTest (prints the figures; no file).

Run from the repository root:  python3 src/test/python/check_many_dips_ms.py
Independent of loopform's Java code: numpy and scipy only. L(s) = k (1 + s/a)/(1 + s/b) e^(-s tau)
(INVENTED: k 0.45, a 1 rad/s, b 2 rad/s, tau 1 s) over [1e-3, 100] rad/s: every local minimum of
|1 + L(i w)| on a 2,000,001-point log grid is refined by scipy.optimize.minimize_scalar (bounded,
xatol 1e-13) between its grid neighbours, and the smallest (or a band end, were it smaller) gives
Ms = 1 / min |1 + L|. Prints: w at the peak (rad/s), Ms, the number of dips.
"""
import numpy as np
from scipy.optimize import minimize_scalar
k, a, b, tau = 0.45, 1.0, 2.0, 1.0
def L(w):
    s = 1j * w
    return k * (1 + s / a) / (1 + s / b) * np.exp(-s * tau)
f = lambda w: abs(1 + L(w))
w = np.geomspace(1e-3, 100, 2_000_001)
v = f(w)
best = None
idx = np.where((v[1:-1] < v[:-2]) & (v[1:-1] < v[2:]))[0] + 1
for i in idx:
    r = minimize_scalar(f, bounds=(w[i - 1], w[i + 1]), method="bounded", options={"xatol": 1e-13})
    if best is None or r.fun < best[1]:
        best = (r.x, r.fun)
ends = [(w[0], v[0]), (w[-1], v[-1])]
for e in ends:
    if e[1] < best[1]:
        best = e
print(repr(best[0]), repr(1 / best[1]), len(idx))
