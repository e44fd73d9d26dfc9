#!/usr/bin/env python3
"""Hunt for a false pass in `loopform check`: random loops, an independent sampled-loop analysis.

For ~150 random loops (fixed seed) this script writes a loop file, runs
`java -jar target/loopform.jar check LOOP --format json`, and computes, with numpy/scipy only and
no code shared with loopform's Java, the as-left sampled loop:

- the process sampled exactly under a zero-order hold (Astrom and Wittenmark, Computer-Controlled
  Systems, 3rd ed., 1997, ch. 2 - from memory for the chapter): x(k+1) = Phi x(k) + Ga u(k-m-1)
  + Gb u(k-m) with L = m h + tau, Phi = e^(A h), Gb = int_0^(h-tau) e^(A s) ds B,
  Ga = e^(A (h-tau)) int_0^tau e^(A s) ds B; the delayed inputs are extra states;
- the target's discrete controller written out from its form file's documented algorithm
  (forms-catalog/README.md, `algorithm`: forward s = (z-1)/h, backward s = (z-1)/(z h),
  trapezoidal s = (2/h)(z-1)/(z+1), step invariant = zero-order-hold equivalent, ramp invariant =
  triangle-hold equivalent, Wittenmark, Astrom and Arzen, Computer Control: An Overview, IFAC
  Professional Brief, 2002, Table 3): the integrator 1/s and the filtered derivative s/(1 + Tf s)
  (the series lead-lag (1 + Td s)/(1 + Tf s), the measurement filter 1/(1 + Tf s)) each discretized
  by the form's method, by polynomial substitution or scipy.signal.cont2discrete ('zoh', 'foh');
  without a filter (Tf = 0) the derivative is the backward difference (the documented fallback);
- the closed-loop eigenvalues (largest magnitude, stability), and on a dense grid of 40,000
  log-spaced frequencies up to the Nyquist frequency, refined by brentq / minimize_scalar: the
  gain margin (smallest 1/|L| > 1 over the passes of L across the negative real axis, z = -1
  included), lower gain margin (largest 1/|L| < 1), the phase margin at the gain crossover nearest
  -1 (signed, wrapped into (-180, 180]), the crossover, Ms = max 1/|1 + L|, and the delay margin
  both as loopform defines it (min over crossovers of (PM mod 360 in rad)/w) and exactly (the
  least extra process dead time that puts a closed-loop eigenvalue on the unit circle, found by
  bisection on the eigenvalues).

Each figure is compared with loopform's JSON; every disagreement is printed, and a loop whose
independent figures cross a fail threshold of the default policy (unstable, Ms > 3, PM < 20 deg,
GM < 1.5, delay margin < 1 scan, h wc > 1 rad) while loopform does not say `fail` is a FALSE PASS.

Usage (from the repository root, after `mvn -q -o -B -DskipTests package`):
    python3 src/test/python/hunt_false_pass.py [--loops 150] [--work /tmp/hunt] [--csv OUT.csv]
"""
import argparse
import json
import math
import os
import subprocess
import sys

import numpy as np
from scipy.linalg import expm
from scipy.optimize import brentq, minimize_scalar
from scipy.signal import cont2discrete, tf2ss

SEED = 20261203
JAR = os.path.join("target", "loopform.jar")

# ---------------------------------------------------------------------------------------------
# Forms: catalog ones and invented variants of the algorithm (written into the work folder).
# Each entry: id -> dict(structure, gain_as, basis, sign, int_as, int_unit, der_as, der_unit,
# filter_kind, ratio, placement, c, alg_int, alg_der, kind, scans)
# ---------------------------------------------------------------------------------------------

def form(structure, gain_as="gain", basis="percent", sign="signed", int_as="time", int_unit="s",
         der_as=None, der_unit="s", filter_kind="ratio", ratio=10.0, placement="derivative", b=1.0, c=1.0,
         alg_int="backward", alg_der="backward", kind="positional", scans=None, file=None):
    if der_as is None:
        der_as = "gain" if structure == "parallel" else "time"
    return dict(structure=structure, gain_as=gain_as, basis=basis, sign=sign, int_as=int_as,
                int_unit=int_unit, der_as=der_as, der_unit=der_unit, filter_kind=filter_kind, ratio=ratio,
                placement=placement, b=b, c=c, alg_int=alg_int, alg_der=alg_der, kind=kind, scans=scans,
                file=file)


CATALOG = {
    "ideal": form("ideal"),
    "ideal-min": form("ideal", int_unit="min", der_unit="min"),
    "ideal-pb-repeats": form("ideal", gain_as="band", sign="action", int_as="rate", int_unit="min", der_unit="min"),
    "ideal-pb-repeats-s": form("ideal", gain_as="band", sign="action", int_as="rate", int_unit="s"),
    "ideal-pv-derivative": form("ideal", int_unit="min", der_unit="min", c=0.0),
    "ideal-2dof": form("ideal", b=1.0, c=0.0),
    "ideal-fixed-n8": form("ideal", int_unit="min", der_unit="min", filter_kind="fixed_ratio", ratio=8.0),
    "ideal-velocity": form("ideal", int_unit="min", der_unit="min", filter_kind="fixed_ratio", c=0.0,
                           kind="velocity"),
    "ideal-pv-filter": form("ideal", filter_kind="time_constant", placement="measurement", c=0.0),
    "ideal-unfiltered": form("ideal", filter_kind="none"),
    "parallel": form("parallel", int_as="gain"),
    "parallel-min": form("parallel", int_as="gain", int_unit="min", der_unit="min"),
    "parallel-eu": form("parallel", basis="engineering", int_as="gain"),
    "parallel-scan": form("parallel", int_as="per_scan", der_as="per_scan"),
    "series": form("series"),
    "series-pb-min": form("series", gain_as="band", sign="action", int_unit="min", der_unit="min"),
    "series-pv-derivative": form("series", gain_as="band", sign="action", int_unit="min", der_unit="min", c=0.0),
    "plant-k7-target": form("ideal", sign="action", int_unit="min", der_unit="min", filter_kind="fixed_ratio",
                            c=0.0, scans=[0.1, 0.25, 0.5, 1.0, 2.0, 5.0], file="examples/plant-k7-target.yaml"),
}

METHODS_I = ["forward", "backward", "trapezoidal"]
METHODS_D = ["forward", "backward", "trapezoidal", "ramp_invariant", "step_invariant"]


def invented_forms():
    """Invented target forms that vary the algorithm (none copies a real product)."""
    out = {}
    for mi in METHODS_I:
        for md in METHODS_D:
            out[f"hunt-ideal-{mi}-{md}"] = form("ideal", alg_int=mi, alg_der=md)
    for md in ["forward", "trapezoidal", "step_invariant", "ramp_invariant"]:
        out[f"hunt-series-c1-{md}"] = form("series", alg_int="trapezoidal", alg_der=md)
        out[f"hunt-series-c0-{md}"] = form("series", int_unit="min", der_unit="min", c=0.0, alg_int="forward",
                                           alg_der=md)
        out[f"hunt-pvfilter-{md}"] = form("ideal", filter_kind="time_constant", placement="measurement", c=0.0,
                                          alg_int="trapezoidal", alg_der=md)
        out[f"hunt-parscan-{md}"] = form("parallel", int_as="per_scan", der_as="per_scan", alg_int="forward",
                                         alg_der=md)
    out["hunt-velocity-trap-ramp"] = form("ideal", sign="action", gain_as="band", int_as="rate", int_unit="min",
                                          der_unit="min", c=0.0, b=0.0, kind="velocity", alg_int="trapezoidal",
                                          alg_der="ramp_invariant")
    out["hunt-unfiltered-forward"] = form("ideal", filter_kind="none", alg_int="forward", alg_der="forward")
    out["hunt-unfiltered-trap"] = form("ideal", filter_kind="none", alg_int="trapezoidal", alg_der="trapezoidal")
    out["hunt-series-fixed8-velocity"] = form("series", filter_kind="fixed_ratio", ratio=8.0, kind="velocity",
                                              alg_int="backward", alg_der="trapezoidal", c=0.0)
    return out


def form_yaml(fid, f):
    lines = [f"# INVENTED target form for src/test/python/hunt_false_pass.py (a variant of the algorithm).",
             f"id: {fid}", f"title: Invented hunt form {fid}", f"structure: {f['structure']}",
             f"gain: {{as: {f['gain_as']}, basis: {f['basis']}, sign: {f['sign']}}}",
             f"integral: {{as: {f['int_as']}, unit: {f['int_unit']}, off: 0}}",
             f"derivative: {{as: {f['der_as']}, unit: {f['der_unit']}}}"]
    if f["filter_kind"] in ("ratio", "fixed_ratio"):
        lines.append(f"filter: {{kind: {f['filter_kind']}, ratio: {f['ratio']}, placement: {f['placement']}}}")
    elif f["filter_kind"] == "time_constant":
        lines.append(f"filter: {{kind: time_constant, placement: {f['placement']}, unit: s, default: 0}}")
    else:
        lines.append(f"filter: {{kind: none, placement: {f['placement']}}}")
    lines.append(f"weights: {{b: {f['b']}, c: {f['c']}}}")
    lines.append(f"algorithm: {{kind: {f['kind']}, integral: {f['alg_int']}, derivative: {f['alg_der']}, "
                 f"anti_windup: clamping, output: -1000..1000}}")
    return "\n".join(lines) + "\n"


# ---------------------------------------------------------------------------------------------
# Processes
# ---------------------------------------------------------------------------------------------

def process_tf(p):
    """(num, den, dead time) of the process in s, gain %/%."""
    k, L = p["gain"], p["dead_time"]
    if p["model"] == "fopdt":
        return [k], [p["time_constant"], 1.0], L
    if p["model"] == "sopdt":
        z, wn = p["damping"], p["natural_frequency"]
        return [k * wn * wn], [1.0, 2 * z * wn, wn * wn], L
    if p["model"] == "integrating":
        lag = p.get("lag", 0.0)
        return [k], np.polymul([1.0, 0.0], [lag, 1.0]).tolist() if lag > 0 else [1.0, 0.0], L
    if p["model"] == "tf":
        return list(p["num"]), list(p["den"]), L
    raise ValueError(p["model"])


def process_yaml(p):
    if p["model"] == "fopdt":
        return (f"{{model: fopdt, gain: {p['gain']!r}, time_constant: {p['time_constant']!r} s, "
                f"dead_time: {p['dead_time']!r} s}}")
    if p["model"] == "sopdt":
        return (f"{{model: sopdt, gain: {p['gain']!r}, damping: {p['damping']!r}, "
                f"natural_frequency: {p['natural_frequency']!r}, dead_time: {p['dead_time']!r} s}}")
    if p["model"] == "integrating":
        return (f"{{model: integrating, gain: {p['gain']!r}, lag: {p['lag']!r} s, "
                f"dead_time: {p['dead_time']!r} s}}")
    return (f"{{model: tf, num: [{', '.join(repr(x) for x in p['num'])}], "
            f"den: [{', '.join(repr(x) for x in p['den'])}], dead_time: {p['dead_time']!r} s}}")


def sampled_process(num, den, L, h):
    """Augmented state space (F, G, H) of the ZOH-sampled process with dead time L: y(k) = H x(k)."""
    num = np.atleast_1d(np.trim_zeros(np.asarray(num, float), "f"))
    A, B, C, D = tf2ss(num, den)
    assert np.allclose(D, 0), "process must be strictly proper"
    n = A.shape[0]
    m = int(math.floor(L / h + 1e-12))
    tau = L - m * h
    if tau < 1e-12 * h:
        tau = 0.0

    def integ(t):
        M = np.zeros((n + 1, n + 1))
        M[:n, :n] = A * t
        M[:n, n:] = B * t
        E = expm(M)
        return E[:n, :n], E[:n, n:]

    Phi, _ = integ(h)
    Eb, Gb = integ(h - tau)
    _, Gi = integ(tau)
    Ga = Eb @ Gi
    # states: x (n), w_1..w_{m+1} with w_j(k) = u(k-j)
    nw = m + 1
    N = n + nw
    F = np.zeros((N, N))
    Gu = np.zeros((N, 1))
    F[:n, :n] = Phi
    F[:n, n + m:n + m + 1] += Ga          # u(k-m-1) = w_{m+1}
    if m == 0:
        Gu[:n] += Gb                        # u(k)
    else:
        F[:n, n + m - 1:n + m] += Gb        # u(k-m) = w_m
    Gu[n, 0] = 1.0                          # w_1(k+1) = u(k)
    for j in range(1, nw):
        F[n + j, n + j - 1] = 1.0
    H = np.zeros((1, N))
    H[0, :n] = C[0]
    return dict(F=F, G=Gu, H=H, Phi=Phi, Ga=Ga, Gb=Gb, C=C, m=m, n=n)


def process_response(sp, theta):
    """G(e^(i theta)) for an array of theta."""
    Phi, Ga, Gb, C, m, n = sp["Phi"], sp["Ga"], sp["Gb"], sp["C"], sp["m"], sp["n"]
    z = np.exp(1j * np.asarray(theta, float))
    Zm = z[:, None, None] * np.eye(n)[None, :, :] - Phi[None, :, :]
    rhs = (Gb[None, :, :] + Ga[None, :, :] / z[:, None, None]) * (z ** (-m))[:, None, None]
    v = np.linalg.solve(Zm, rhs)
    return (C[None, :, :] @ v)[:, 0, 0]


# ---------------------------------------------------------------------------------------------
# Controller: rational functions in q = z^-1, coefficients ascending in q
# ---------------------------------------------------------------------------------------------

class Q:
    def __init__(self, num, den):
        self.num = np.asarray(num, float)
        self.den = np.asarray(den, float)

    def __add__(self, o):
        if not isinstance(o, Q):
            o = Q([o], [1.0])
        return Q(padd(np.convolve(self.num, o.den), np.convolve(o.num, self.den)), np.convolve(self.den, o.den))

    __radd__ = __add__

    def __mul__(self, o):
        if not isinstance(o, Q):
            return Q(self.num * o, self.den)
        return Q(np.convolve(self.num, o.num), np.convolve(self.den, o.den))

    __rmul__ = __mul__

    def __call__(self, theta):
        q = np.exp(-1j * np.asarray(theta))
        return np.polynomial.polynomial.polyval(q, self.num) / np.polynomial.polynomial.polyval(q, self.den)


def padd(a, b):
    n = max(len(a), len(b))
    return np.pad(a, (0, n - len(a))) + np.pad(b, (0, n - len(b)))


def discretize(cnum, cden, h, method):
    """A proper continuous rational (descending s) discretized by the named method, as Q in z^-1."""
    cnum = np.asarray(cnum, float)
    cden = np.asarray(cden, float)
    if method in ("step_invariant", "ramp_invariant"):
        n_, d_, _ = cont2discrete((cnum, cden), h, method="zoh" if method == "step_invariant" else "foh")
        n_ = np.atleast_1d(np.squeeze(n_))
        d_ = np.atleast_1d(np.squeeze(d_))
        k = max(len(n_), len(d_))
        n_ = np.pad(n_, (k - len(n_), 0))
        d_ = np.pad(d_, (k - len(d_), 0))
        return Q(n_, d_)       # descending z = ascending z^-1 after dividing by z^(k-1)
    # substitution s = a(q)/c(q), a, c polynomials in q = z^-1 (ascending)
    if method == "forward":        # s = (z - 1)/h = (1 - q)/(h q)
        a, c = np.array([1.0, -1.0]), np.array([0.0, h])
    elif method == "backward":     # s = (1 - q)/h
        a, c = np.array([1.0, -1.0]), np.array([h])
    elif method == "trapezoidal":  # s = (2/h)(1 - q)/(1 + q)
        a, c = np.array([2.0, -2.0]), np.array([h, h])
    else:
        raise ValueError(method)
    deg = max(len(cnum), len(cden)) - 1
    cnum = np.pad(cnum, (deg + 1 - len(cnum), 0))
    cden = np.pad(cden, (deg + 1 - len(cden), 0))

    def sub(p):
        acc = np.zeros(1)
        for j, coef in enumerate(p[::-1]):           # coefficient of s^j
            term = np.array([coef])
            for _ in range(j):
                term = np.convolve(term, a)
            for _ in range(deg - j):
                term = np.convolve(term, c)
            acc = padd(acc, term)
        return acc

    num, den = sub(cnum), sub(cden)
    # strip leading zero powers of q common to both (forward difference)
    while len(num) > 1 and len(den) > 1 and abs(num[0]) < 1e-300 and abs(den[0]) < 1e-300:
        num, den = num[1:], den[1:]
    return Q(num, den)


def integrator(h, method):
    if method == "forward":
        return Q([0.0, h], [1.0, -1.0])
    if method == "backward":
        return Q([h], [1.0, -1.0])
    return Q([h / 2, h / 2], [1.0, -1.0])


def filtered_derivative(tf, h, method):
    if tf == 0:
        return Q([1.0 / h, -1.0 / h], [1.0])
    return discretize([1.0, 0.0], [tf, 1.0], h, method)


def as_left_law(f, entered, pv_span, out_span, h):
    """SI law of the entered values: dict(structure, k, ki, kd, ti, td, tf, sign)."""
    v = dict(entered)
    tmul = {"s": 1.0, "min": 60.0, "h": 3600.0}
    sign = 1.0
    if f["sign"] == "action" and v.get("action", "reverse") == "direct":
        sign = -1.0
    if f["gain_as"] == "band":
        k = 100.0 / v["pb"]
    else:
        k = v["kp" if f["structure"] == "parallel" else "kc"]
    if f["basis"] == "engineering":
        k *= pv_span / out_span
    k *= sign
    s = 1.0 if k > 0 else -1.0
    if f["structure"] == "parallel":
        ki_w = v.get("ki", 0.0)
        kd_w = v.get("kd", 0.0)
        if f["int_as"] == "gain":
            ki = ki_w / tmul[f["int_unit"]]
        elif f["int_as"] == "per_scan":
            ki = ki_w / h
        elif f["int_as"] == "time":
            ki = (1.0 / (ki_w * tmul[f["int_unit"]])) if ki_w > 0 else 0.0
        else:
            ki = ki_w / tmul[f["int_unit"]]
        kd = kd_w * h if f["der_as"] == "per_scan" else kd_w * tmul[f["der_unit"]]
        if f["basis"] == "engineering":
            ki *= pv_span / out_span
            kd *= pv_span / out_span
        ki *= s
        kd *= s
        td = kd / k if k != 0 else 0.0
        ti = k / ki if ki != 0 else math.inf
    else:
        if f["int_as"] == "rate":
            r = v.get("reset", 0.0)
            ti = tmul[f["int_unit"]] / r if r > 0 else math.inf
        else:
            t = v.get("ti", 0.0)
            ti = t * tmul[f["int_unit"]] if t > 0 else math.inf
        td = v.get("td", 0.0) * tmul[f["der_unit"]]
        ki = k / ti
        kd = k * td
    if f["filter_kind"] in ("ratio", "fixed_ratio"):
        n = v.get("n", f["ratio"]) if f["filter_kind"] == "ratio" else f["ratio"]
        tf = td / n if td > 0 else 0.0
    elif f["filter_kind"] == "time_constant":
        tf = v.get("tf", 0.0)
    else:
        tf = 0.0
    return dict(k=k, ki=ki, kd=kd, ti=ti, td=td, tf=tf)


def controller_feedback(f, law, h):
    """C_y(z) as Q, from the form's documented algorithm (linear; velocity = positional)."""
    I = integrator(h, f["alg_int"])
    md = f["alg_der"]
    k, ki, kd, tf, td = law["k"], law["ki"], law["kd"], law["tf"], law["td"]
    if f["structure"] == "series":
        if tf == 0:
            LL = Q([1.0 + td / h, -td / h], [1.0])
        else:
            LL = discretize([td, 1.0], [tf, 1.0], h, md)
        pi = k + ki * I if ki != 0 else Q([k], [1.0])
        return pi * LL
    if f["placement"] == "measurement":
        F = Q([1.0], [1.0]) if tf == 0 else discretize([1.0], [tf, 1.0], h, md)
        pi = k + ki * I if ki != 0 else Q([k], [1.0])
        Cy = pi * F
        if kd != 0:
            Cy = Cy + kd * filtered_derivative(tf, h, md)
        return Cy
    Cy = Q([k], [1.0])
    if ki != 0:
        Cy = Cy + ki * I
    if kd != 0:
        Cy = Cy + kd * filtered_derivative(tf, h, md)
    return Cy


# ---------------------------------------------------------------------------------------------
# Closed loop: eigenvalues, margins
# ---------------------------------------------------------------------------------------------

def controller_ss(Cy):
    num, den = Cy.num, Cy.den
    k = max(len(num), len(den))
    num = np.pad(num, (0, k - len(num)))
    den = np.pad(den, (0, k - len(den)))
    # ascending in q = descending in z after multiplying by z^(k-1)
    return tf2ss(num, den)


def closed_loop_matrix(sp, Cy):
    Ac, Bc, Cc, Dc = controller_ss(Cy)
    F, G, H = sp["F"], sp["G"], sp["H"]
    N, nc = F.shape[0], Ac.shape[0]
    M = np.zeros((N + nc, N + nc))
    # u = Cc xc - Dc H x ;  x+ = F x + G u ;  xc+ = Ac xc - Bc H x
    M[:N, :N] = F - G @ (Dc @ H)
    M[:N, N:] = G @ Cc
    M[N:, :N] = -Bc @ H
    M[N:, N:] = Ac
    return M


def largest_pole(sp, Cy):
    return float(np.max(np.abs(np.linalg.eigvals(closed_loop_matrix(sp, Cy)))))


def margins(Lf, h):
    """Figures of the sampled open loop Lf(theta) over (0, pi]."""
    th = np.concatenate([np.logspace(-6, math.log10(math.pi), 40000)])
    th[-1] = math.pi
    L = Lf(th)
    mag = np.abs(L)
    res = {}
    # gain crossovers
    g = mag - 1.0
    gc = []
    for i in np.nonzero(np.sign(g[:-1]) * np.sign(g[1:]) < 0)[0]:
        t = brentq(lambda x: abs(Lf(np.array([x]))[0]) - 1.0, th[i], th[i + 1], xtol=1e-14, rtol=1e-13)
        gc.append(t)
    # phase crossovers: Im L changes sign with Re L < 0
    pc = []
    im = L.imag
    for i in np.nonzero(np.sign(im[:-1]) * np.sign(im[1:]) < 0)[0]:
        if L.real[i] < 0 or L.real[i + 1] < 0:
            t = brentq(lambda x: Lf(np.array([x]))[0].imag, th[i], th[i + 1], xtol=1e-14, rtol=1e-13)
            Lt = Lf(np.array([t]))[0]
            if Lt.real < 0:
                pc.append((t, 1.0 / abs(Lt)))
    if L[-1].real < 0:
        pc.append((math.pi, 1.0 / abs(L[-1])))
    ups = [x for x in pc if x[1] >= 1.0]
    lows = [x for x in pc if x[1] < 1.0]
    res["gm"] = min(x[1] for x in ups) if ups else None
    res["lgm"] = max(x[1] for x in lows) if lows else None
    pms = []
    for t in gc:
        Lt = Lf(np.array([t]))[0]
        pm = math.degrees(np.angle(-Lt))  # 180 + arg L wrapped into (-180, 180]
        pms.append((abs(pm), pm, t))
    if pms:
        best = min(pms)
        res["pm"] = best[1]
        res["wc"] = best[2] / h
        res["dm"] = min(((p[1] % 360.0) * math.pi / 180.0) / (p[2] / h) for p in pms)
    else:
        res["pm"] = res["wc"] = res["dm"] = None
    # Ms
    s = np.abs(1.0 + L)
    i = int(np.argmin(s))
    lo, hi = th[max(i - 1, 0)], th[min(i + 1, len(th) - 1)]
    if hi > lo:
        r = minimize_scalar(lambda x: abs(1.0 + Lf(np.array([x]))[0]), bounds=(lo, hi), method="bounded",
                            options={"xatol": 1e-13})
        smin = min(r.fun, s[i])
    else:
        smin = s[i]
    res["ms"] = 1.0 / smin
    res["n_gc"] = len(gc)
    return res


def exact_delay_margin(num, den, L, h, Cy, upper, steps=50):
    """Least extra dead time (s) that puts a closed-loop eigenvalue on or outside the unit circle."""
    def unstable(extra):
        return largest_pole(sampled_process(num, den, L + extra, h), Cy) >= 1.0

    step = upper / steps
    x = 0.0
    while x < upper * 1.5 + h:
        nx = x + step
        if unstable(nx):
            a, b = x, nx
            for _ in range(40):
                c = 0.5 * (a + b)
                if unstable(c):
                    b = c
                else:
                    a = c
            return 0.5 * (a + b)
        x = nx
    return None


# ---------------------------------------------------------------------------------------------
# Random loops
# ---------------------------------------------------------------------------------------------

def ultimate(num, den, L):
    """Continuous w180 and Ku of the process with dead time (first -180 deg crossing)."""
    w = np.logspace(-5, 3, 200000) / max(L, 1e-3)
    G = np.polyval(num, 1j * w) / np.polyval(den, 1j * w) * np.exp(-1j * w * L)
    ph = np.unwrap(np.angle(G))
    ph = ph - 2 * math.pi * round(ph[0] / (2 * math.pi)) if ph[0] > 0.5 else ph
    idx = np.nonzero(ph < -math.pi)[0]
    i = idx[0] if len(idx) else len(w) - 1
    return w[i], 1.0 / abs(G[i])


def draw_process(rng, i):
    kind = ["fopdt", "sopdt", "integrating", "tf"][i % 4]
    sign = -1.0 if rng.random() < 0.35 else 1.0
    if kind == "fopdt":
        T = float(np.round(10 ** rng.uniform(0.5, 2.3), 3))
        L = float(np.round(T * 10 ** rng.uniform(-1.3, 0.3), 4))
        return dict(model="fopdt", gain=float(np.round(sign * 10 ** rng.uniform(-0.3, 0.5), 4)),
                    time_constant=T, dead_time=L)
    if kind == "sopdt":
        wn = float(np.round(10 ** rng.uniform(-1.5, 0), 5))
        z = float(np.round(rng.uniform(0.1, 0.7), 3))
        L = float(np.round((1.0 / wn) * 10 ** rng.uniform(-1.0, 0.0), 4))
        return dict(model="sopdt", gain=float(np.round(sign * 10 ** rng.uniform(-0.3, 0.4), 4)), damping=z,
                    natural_frequency=wn, dead_time=L)
    if kind == "integrating":
        lag = float(np.round(10 ** rng.uniform(0, 1.7), 3))
        L = float(np.round(lag * 10 ** rng.uniform(-1, 0.5), 4))
        return dict(model="integrating", gain=float(np.round(sign * 10 ** rng.uniform(-2.5, -1), 6)), lag=lag,
                    dead_time=L)
    T1 = float(np.round(10 ** rng.uniform(0.7, 2), 3))
    T2 = float(np.round(T1 * rng.uniform(0.1, 0.6), 3))
    a = float(np.round(T2 * rng.uniform(0.2, 1.5), 3))   # right-half-plane zero at s = 1/a
    L = float(np.round(T2 * 10 ** rng.uniform(-1, 0), 4))
    k = float(np.round(sign * 10 ** rng.uniform(-0.3, 0.3), 4))
    return dict(model="tf", num=[-k * a, k], den=[T1 * T2, T1 + T2, 1.0], dead_time=L, gain=k)


def fmt(x):
    return float(f"{x:.6g}")


def tuning_in_form(fid, f, kc, ti, td, h, pv_span, out_span):
    """The ideal-law tuning (kc signed, ti, td in s) written in form f's own parameters."""
    tmul = {"s": 1.0, "min": 60.0, "h": 3600.0}
    v = {}
    direct = kc < 0
    if f["structure"] == "series":
        # take the series values Kc', Ti', Td' directly (a series tuning of the same size)
        pass
    if f["structure"] == "parallel":
        kp = kc
        ki = abs(kc) / ti
        kd = abs(kc) * td
        if f["basis"] == "engineering":
            kp *= out_span / pv_span
            ki *= out_span / pv_span
            kd *= out_span / pv_span
        v["kp"] = fmt(kp)
        v["ki"] = fmt(ki * h if f["int_as"] == "per_scan" else ki * tmul[f["int_unit"]])
        v["kd"] = fmt(kd / h if f["der_as"] == "per_scan" else kd / tmul[f["der_unit"]])
    else:
        if f["gain_as"] == "band":
            v["pb"] = fmt(100.0 / abs(kc))
        elif f["sign"] == "action":
            v["kc"] = fmt(abs(kc))
        else:
            v["kc"] = fmt(kc)
        if f["int_as"] == "rate":
            v["reset"] = fmt(tmul[f["int_unit"]] / ti)
        else:
            v["ti"] = fmt(ti / tmul[f["int_unit"]])
        v["td"] = fmt(td / tmul[f["der_unit"]])
    if f["filter_kind"] == "ratio":
        v["n"] = 10.0
    if f["filter_kind"] == "time_constant":
        v["tf"] = fmt(td / 10.0 if td > 0 else h * 0.5)
    if f["sign"] == "action":
        v["action"] = "direct" if direct else "reverse"
    return v


def draw_loop(rng, i, forms):
    p = draw_process(rng, i)
    num, den, L = process_tf(p)
    fids = sorted(forms)
    fid = fids[i % len(fids)] if i < 2 * len(fids) else fids[rng.integers(len(fids))]
    f = forms[fid]
    ratio = 10 ** rng.uniform(-1, math.log10(3))
    h = L * ratio
    if f["scans"]:
        h = min(f["scans"], key=lambda s: abs(math.log(s / h)))
        # rescale the process's times so the scan is the drawn share of the dead time
        scale = h / (L * ratio)
        p = rescale(p, scale)
        num, den, L = process_tf(p)
    h = fmt(h)
    w180, ku = ultimate(num, den, L)
    tu = 2 * math.pi / w180
    pid = rng.random() < 0.7
    f_gain = 10 ** rng.uniform(math.log10(0.15), math.log10(1.0))
    if pid:
        kc, ti, td = 0.6 * ku * f_gain, tu / 2 * 10 ** rng.uniform(-0.2, 0.3), tu / 8 * 10 ** rng.uniform(-0.3, 0.2)
    else:
        kc, ti, td = 0.45 * ku * f_gain, tu / 1.2 * 10 ** rng.uniform(-0.2, 0.3), 0.0
    if p["model"] == "integrating":
        ti = max(ti, 2 * tu)
    sgn = 1.0 if (p["gain"] > 0) else -1.0
    kc = sgn * kc
    pv_span, out_span = 150.0, 100.0
    tuning = tuning_in_form(fid, f, kc, ti, td, h, pv_span, out_span)
    return dict(i=i, process=p, fid=fid, form=f, h=h, tuning=tuning, pv_span=pv_span, out_span=out_span)


def rescale(p, s):
    q = dict(p)
    if p["model"] == "fopdt":
        q["time_constant"] = fmt(p["time_constant"] * s)
    elif p["model"] == "sopdt":
        q["natural_frequency"] = fmt(p["natural_frequency"] / s)
    elif p["model"] == "integrating":
        q["lag"] = fmt(p["lag"] * s)
        q["gain"] = fmt(p["gain"] / s)
    else:
        T1T2, T12 = p["den"][0], p["den"][1]
        q["den"] = [fmt(T1T2 * s * s), fmt(T12 * s), 1.0]
        q["num"] = [fmt(p["num"][0] * s), p["num"][1]]
    q["dead_time"] = fmt(p["dead_time"] * s)
    return q


def form_ref(loop, workdir):
    f = loop["form"]
    if f["file"]:
        return os.path.abspath(f["file"])
    if loop["fid"] in CATALOG:
        return loop["fid"]
    return os.path.join(workdir, loop["fid"] + ".yaml")


def loop_yaml(loop, workdir):
    ref = form_ref(loop, workdir)
    tun = ", ".join(f"{k}: {v}" for k, v in loop["tuning"].items())
    return (f"# INVENTED loop for src/test/python/hunt_false_pass.py\n"
            f"tag: HUNT-{loop['i']:03d}\n"
            f"process: {process_yaml(loop['process'])}\n"
            f"tuning: {{form: {ref}, {tun}}}\n"
            f"target: {{form: {ref}, scan: {loop['h']!r} s}}\n"
            f"ranges: {{pv: 0..{loop['pv_span']:g}, output: 0..{loop['out_span']:g}}}\n")


def independent(loop, entered, exact=True):
    f, h = loop["form"], loop["h"]
    num, den, L = process_tf(loop["process"])
    law = as_left_law(f, entered, loop["pv_span"], loop["out_span"], h)
    Cy = controller_feedback(f, law, h)
    sp = sampled_process(num, den, L, h)
    rho = largest_pole(sp, Cy)
    res = dict(rho=rho, stable=rho < 1.0 - 1e-9)

    def Lf(theta):
        return Cy(theta) * process_response(sp, np.atleast_1d(theta))

    res.update(margins(Lf, h))
    res["dm_exact"] = None
    if exact and res["stable"] and res["dm"] is not None:
        res["dm_exact"] = exact_delay_margin(num, den, L, h, Cy, res["dm"])
    res["law"] = law
    return res


def delay_candidates(rng, count, forms):
    """Loops whose delay margin read as PM/wc lies at 1 to 1.3 scans, with an exact one below 1 scan."""
    out = []
    for i in range(count):
        loop = draw_loop(rng, 1000 + i, forms)
        try:
            law_entered = dict(loop["tuning"])
            mine = independent(loop, law_entered, exact=False)
        except Exception:
            continue
        h = loop["h"]
        if not mine["stable"] or mine["dm"] is None or not (h <= mine["dm"] <= 1.3 * h):
            continue
        if mine["ms"] > 3 or mine["pm"] < 20 or (mine["gm"] or 9) < 1.5 or mine["wc"] * h > 1 \
                or (mine["lgm"] or 0) > 1 / 1.5:
            continue
        num, den, L = process_tf(loop["process"])
        law = mine["law"]
        Cy = controller_feedback(loop["form"], law, h)
        exact = exact_delay_margin(num, den, L, h, Cy, mine["dm"])
        if exact is not None and exact < 0.97 * h:
            out.append(loop)
    print(f"{len(out)} delay-margin candidates out of {count} drawn")
    return out


# Sampled loops whose delay margin read as PM / wc differs from the exact one (invented; found by
# the delay-margin hunt on FOPDT 1 %/%, 1 s under the catalog's `ideal` form, values rounded).
GOLDEN_LOOPS = [
    # dead time s, scan s, kc, ti s, td s
    (0.3323, 0.6115, 1.256, 1.763, 0.2664),
    (0.04421, 0.1156, 4.407, 9.587, 0.1466),
    (0.2221, 0.8757, 1.333, 8.065, 0.04585),
    (0.238, 0.3203, 2.206, 1.858, 0.06936),
    (0.7731, 1.204, 1.055, 2.768, 0.0),
    (1.319, 0.9113, 0.8871, 2.962, 0.2231),
]
GOLDEN = os.path.join("src", "test", "resources", "org", "loopform", "check", "delay-margin-golden.csv")


def write_delay_golden():
    """Exact delay margins by eigenvalue bisection (400 steps up to twice PM/wc, then 50 halvings)."""
    f = CATALOG["ideal"]
    rows = []
    for L, h, kc, ti, td in GOLDEN_LOOPS:
        loop = dict(process=dict(model="fopdt", gain=1.0, time_constant=1.0, dead_time=L), form=f, h=h,
                    pv_span=100.0, out_span=100.0)
        m = independent(loop, dict(kc=kc, ti=ti, td=td, n=10.0), exact=False)
        num, den, LL = process_tf(loop["process"])
        Cy = controller_feedback(f, m["law"], h)
        ex = exact_delay_margin(num, den, LL, h, Cy, m["dm"], steps=400)
        # the boundary is a boundary: stable just below, unstable just above
        below = largest_pole(sampled_process(num, den, LL + ex * (1 - 1e-6), h), Cy)
        above = largest_pole(sampled_process(num, den, LL + ex * (1 + 1e-6), h), Cy)
        assert below < 1.0 <= above, (L, h, below, above)
        rows.append((L, h, kc, ti, td, ex, m["dm"]))
        print(f"L {L} h {h}: exact {ex:.10g} s, PM/wc {m['dm']:.10g} s")
    os.makedirs(os.path.dirname(GOLDEN), exist_ok=True)
    with open(GOLDEN, "w") as fh:
        fh.write("# Written by src/test/python/hunt_false_pass.py --write-golden (numpy/scipy); do not edit.\n")
        fh.write("# Invented loops: FOPDT gain 1 %/%, time constant 1 s, the dead time below, under the catalog's\n")
        fh.write("# ideal form (N 10, backward differences) at the scan below. exact_delay_margin_s: the least extra\n")
        fh.write("# process dead time that puts a closed-loop eigenvalue of the exactly sampled loop on the unit circle\n")
        fh.write("# (bisection on the eigenvalues); pm_over_wc_s: the reading PM / wc of the sampled response.\n")
        fh.write("dead_time_s,scan_s,kc,ti_s,td_s,exact_delay_margin_s,pm_over_wc_s\n")
        for r in rows:
            fh.write(",".join(repr(float(x)) for x in r) + "\n")


def rel(a, b):
    if a is None or b is None:
        return None
    return abs(a - b) / max(abs(b), 1e-12)


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--loops", type=int, default=150)
    ap.add_argument("--work", default="/tmp/hunt")
    ap.add_argument("--csv", default=None)
    ap.add_argument("--only", type=int, default=None)
    ap.add_argument("--write-golden", action="store_true",
                    help="write src/test/resources/org/loopform/check/delay-margin-golden.csv and stop")
    ap.add_argument("--hunt-delay", type=int, default=0,
                    help="draw this many extra loops and check with loopform only those whose delay margin as "
                         "PM/wc is 1 to 1.3 scans while the exact one is under 1 scan, all else passing")
    args = ap.parse_args()
    os.makedirs(args.work, exist_ok=True)
    if args.write_golden:
        write_delay_golden()
        return
    forms = dict(CATALOG)
    inv = invented_forms()
    for fid, f in inv.items():
        with open(os.path.join(args.work, fid + ".yaml"), "w") as fh:
            fh.write(form_yaml(fid, f))
    forms.update(inv)
    rng = np.random.default_rng(SEED)
    loops = [draw_loop(rng, i, forms) for i in range(args.loops)]
    if args.hunt_delay:
        loops = delay_candidates(np.random.default_rng(SEED + 1), args.hunt_delay, forms)
    rows = []
    for loop in loops:
        if args.only is not None and loop["i"] != args.only:
            continue
        path = os.path.join(args.work, f"hunt-{loop['i']:03d}.yaml")
        with open(path, "w") as fh:
            fh.write(loop_yaml(loop, args.work))
        pr = subprocess.run(["java", "-jar", JAR, "check", path, "--format", "json"], capture_output=True, text=True)
        if pr.returncode not in (0, 1):
            print(f"loop {loop['i']} {loop['fid']}: exit {pr.returncode}: {pr.stderr.strip()[:300]}")
            rows.append(dict(i=loop["i"], fid=loop["fid"], error=pr.stderr.strip()[:200]))
            continue
        js = json.loads(pr.stdout)
        entered = dict(js["parameters"]["entered"])
        if "action" in js["parameters"]:
            entered["action"] = js["parameters"]["action"]
        for k, v in loop["tuning"].items():
            if k != "action" and k in entered and rel(entered[k], v) > 1e-5:
                print(f"loop {loop['i']} {loop['fid']}: entered {k} = {entered[k]} but written {v}")
        mine = independent(loop, entered)
        t = js["target"]
        row = dict(i=loop["i"], fid=loop["fid"], model=loop["process"]["model"], h=loop["h"],
                   dead=loop["process"]["dead_time"], verdict=js["verdict"],
                   lf_stab=t["stability"], my_stable=mine["stable"], lf_rho=t["largest_pole_magnitude"],
                   my_rho=mine["rho"], lf_gm=t["gain_margin"], my_gm=mine["gm"], lf_lgm=t["lower_gain_margin"],
                   my_lgm=mine["lgm"], lf_pm=t["phase_margin_deg"], my_pm=mine["pm"], lf_wc=t["crossover_rad_s"],
                   my_wc=mine["wc"], lf_ms=t["ms"], my_ms=mine["ms"], lf_dm=t["delay_margin_s"], my_dm=mine["dm"],
                   my_dm_exact=mine["dm_exact"], n_gc=mine["n_gc"],
                   fails=[x["topic"] for x in js["findings"] if x["severity"] == "fail"])
        rows.append(row)
        report(row)
    summarize(rows)
    if args.csv:
        import csv
        keys = sorted({k for r in rows for k in r})
        with open(args.csv, "w", newline="") as fh:
            w = csv.DictWriter(fh, keys)
            w.writeheader()
            for r in rows:
                w.writerow(r)


TOL = dict(rho=1e-4, gm=0.02, lgm=0.02, pm=0.02, wc=0.02, ms=0.01, dm=0.03)


def disagreements(r):
    out = []
    if (r["lf_stab"] == "stable") != r["my_stable"]:
        out.append(f"stability {r['lf_stab']} vs mine {'stable' if r['my_stable'] else 'unstable'} "
                   f"(my largest pole {r['my_rho']:.6f})")
    if r["lf_rho"] is not None and rel(r["lf_rho"], r["my_rho"]) > TOL["rho"]:
        out.append(f"largest pole {r['lf_rho']:.6f} vs {r['my_rho']:.6f}")
    if r["lf_stab"] == "stable" and r["my_stable"]:
        # the delay margin is compared with the exact one below; PM / wc (my_dm) holds for whole scans only
        for key in ("gm", "lgm", "pm", "wc", "ms"):
            a, b = r["lf_" + key], r["my_" + key]
            if (a is None) != (b is None):
                out.append(f"{key} {a} vs mine {b}")
            elif a is not None:
                d = abs(a - b) / max(abs(b), 1e-12) if key != "pm" else abs(a - b) / max(abs(b), 5.0)
                if d > TOL[key]:
                    out.append(f"{key} {a:.5g} vs mine {b:.5g} ({100 * d:.2f} %)")
        if r["my_dm_exact"] is not None and r["lf_dm"] is not None and rel(r["lf_dm"], r["my_dm_exact"]) > 0.03:
            out.append(f"delay margin {r['lf_dm']:.5g} s vs exact (eigenvalues) {r['my_dm_exact']:.5g} s "
                       f"({100 * rel(r['lf_dm'], r['my_dm_exact']):.1f} %)")
    return out


def should_fail(r):
    why = []
    if not r["my_stable"]:
        why.append("unstable")
        return why
    if r["my_ms"] is not None and r["my_ms"] > 3.0 * 1.001:
        why.append(f"Ms {r['my_ms']:.3f} > 3")
    if r["my_pm"] is not None and r["my_pm"] < 20.0 - 0.05:
        why.append(f"PM {r['my_pm']:.2f} < 20 deg")
    if r["my_gm"] is not None and r["my_gm"] < 1.5 * 0.999:
        why.append(f"GM {r['my_gm']:.3f} < 1.5")
    if r["my_lgm"] is not None and r["my_lgm"] > 1 / 1.5 * 1.001:
        why.append(f"lower GM {r['my_lgm']:.3f} > 1/1.5")
    dm = r["my_dm_exact"] if r["my_dm_exact"] is not None else r["my_dm"]
    if dm is not None and dm < r["h"] * 0.999:
        why.append(f"delay margin {dm:.4g} s < 1 scan")
    if r["my_wc"] is not None and r["my_wc"] * r["h"] > 1.001:
        why.append(f"h wc {r['my_wc'] * r['h']:.3f} > 1")
    return why


def report(r):
    if "error" in r:
        return
    d = disagreements(r)
    sf = should_fail(r)
    fp = sf and r["verdict"] != "fail"
    tag = "FALSE PASS " if fp else ""
    if d or fp:
        print(f"loop {r['i']:3d} {r['fid']:28s} {r['model']:11s} h {r['h']:.4g} L {r['dead']:.4g} "
              f"verdict {r['verdict']}: {tag}{'; '.join(d)} {'(should fail: ' + ', '.join(sf) + ')' if fp else ''}")


def summarize(rows):
    ok = [r for r in rows if "error" not in r]
    print(f"\n{len(ok)} loops compared ({len(rows) - len(ok)} refused)")
    per_form = {}
    for r in ok:
        per_form[r["fid"]] = per_form.get(r["fid"], 0) + 1
    print("loops per form: " + ", ".join(f"{k} {v}" for k, v in sorted(per_form.items())))
    both = [r for r in ok if r["lf_stab"] == "stable" and r["my_stable"]]
    print(f"stable by both: {len(both)}; unstable by both: "
          f"{sum(1 for r in ok if r['lf_stab'] != 'stable' and not r['my_stable'])}; "
          f"stability disagreements: {sum(1 for r in ok if (r['lf_stab'] == 'stable') != r['my_stable'])}")
    for key in ("rho", "gm", "lgm", "pm", "wc", "ms"):
        ds = []
        for r in (ok if key == "rho" else both):
            a, b = r["lf_" + key], r["my_" + key]
            if a is not None and b is not None:
                ds.append((rel(a, b), r["i"]))
        if ds:
            m = max(ds)
            print(f"{key:4s}: {len(ds)} compared, largest relative difference {m[0]:.3g} (loop {m[1]})")
    ds = [(rel(r["lf_dm"], r["my_dm_exact"]), r["i"]) for r in both
          if r["lf_dm"] is not None and r["my_dm_exact"] is not None]
    if ds:
        print(f"delay margin vs exact (eigenvalue) delay margin: {len(ds)} compared, largest relative difference "
              f"{max(ds)[0]:.3g} (loop {max(ds)[1]})")
    fps = [r for r in ok if should_fail(r) and r["verdict"] != "fail"]
    print(f"false passes: {len(fps)}")
    verdicts = {}
    for r in ok:
        verdicts[r["verdict"]] = verdicts.get(r["verdict"], 0) + 1
    print("verdicts: " + ", ".join(f"{k} {v}" for k, v in sorted(verdicts.items())))


if __name__ == "__main__":
    main()
