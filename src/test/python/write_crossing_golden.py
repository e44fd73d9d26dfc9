#!/usr/bin/env python3
"""Writes the crossing-*.yaml loop files and crossing-golden.csv into src/test/resources/org/loopform/audit/.

Reference margins for CrossingGoldenTest: invented loops whose crossings are hard to find (a phase
crossover exactly at the Nyquist frequency of the sampled loop, several gain crossovers around
a lightly damped resonance, two gain crossovers 1.6 % apart, a conditionally stable loop, a
derivative filter with N = 100 whose crossover lies far above 20/L), computed independently of
the Java code with numpy and scipy.

Run from the repository root:  python3 src/test/python/write_crossing_golden.py

Design loop: L(s) = C(s) P(s) e^(-s L), the ideal PID written out from its definition,
C(s) = K (1 + 1/(Ti s) + Td s / (1 + s Td/N)) (Astrom and Hagglund, PID Controllers: Theory,
Design and Tuning, 2nd ed., ISA 1995, ch. 3 - from memory), the processes from their textbook
forms: K/(T s + 1); K wn^2/(s^2 + 2 zeta wn s + wn^2); Kv/(s (Tlag s + 1)).

Target loop: L(z) = C(z) P(z) at z = exp(i w h), 0 < w <= pi/h.
- P(z): the process in state space (a companion form written out here), sampled through a
  zero-order hold with scipy.linalg.expm: Phi(t) = e^(A t), Gamma(t) = int_0^t e^(A s) ds B, both
  read off expm([[A, B], [0, 0]] t). The dead time L = d h + tau (0 <= tau < h) is carried by
  state augmentation: the state is x plus the last d + 1 inputs, and
  x(k+1) = Phi(h) x(k) + Gamma(h - tau) u(k-d) + Phi(h - tau) Gamma(tau) u(k-d-1)
  (Astrom and Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 2, sampling a system
  with a time delay - from memory). The augmented system is checked against a fine-step
  simulation of the delayed process, and its pulse transfer function Ca (zI - Phia)^-1 Gammaa is
  checked against the closed form C (zI - Phi)^-1 (Gamma0 + Gamma1 / z) z^-d used on the dense
  grid (the augmented one, of dimension up to 55, is solved at a few frequencies only).
- C(z): forms-catalog/ideal.yaml has no algorithm section, so the target runs the catalog's
  default algorithm (forms-catalog/README.md: positional, backward differences for the integral
  and the filtered derivative): with q = 1/z and Tf = Td/N,
  C(z) = K (1 + h / (Ti (1 - q)) + (Td / (Tf + h)) (1 - q) / (1 - q Tf / (Tf + h)))
  (s replaced by (1 - q)/h; Wittenmark, Astrom and Arzen, "Computer Control: An Overview",
  IFAC Professional Brief, 2002, Table 3).

Margins (Astrom and Murray, Feedback Systems, 2008, ch. 9-10 - from memory): numpy evaluates each
loop on a log-spaced grid of 2,000,001 points, the phase is unwrapped along it, every gain
crossover (sign change of |L| - 1) and every pass of the unwrapped phase through -180 + 360 k
degrees is refined with scipy.optimize.brentq; a top of the band where L is real and negative (the
sampled loop at z = -1) is a phase crossover. Gain margin: the smallest 1/|L| >= 1 over the phase
crossovers; lower gain margin: the largest below 1. Phase margin: 180 + arg L wrapped into
(-180, 180] degrees at the gain crossover where it is smallest in size, the crossover nearest -1
(the least phase change, lag or lead, that puts the loop on -1), with its sign; on a stable loop
with several crossovers a crossover whose wrapped value is near -180 sits near +1, not -1, and
does not set the margin. Delay margin: the smallest
((PM mod 360) in rad) / w over the gain crossovers, and for the target that over h in scans.
Ms: 1 / min |1 + L|, refined with scipy.optimize.minimize_scalar.
"""
import csv
import math
import os

import numpy as np
from scipy.signal import tf2ss
from scipy.linalg import expm
from scipy.optimize import brentq, minimize_scalar

DENSE_POINTS = 2_000_001
OUT_DIR = os.path.join("src", "test", "resources", "org", "loopform", "audit")
BAND_BOTTOM_RAD_S = 1e-5

# Invented loops. The design band reaches where |L| is far below 0.01.
LOOPS = [
    dict(name="crossing-nyquist-end-point", note="target phase crossover exactly at z = -1",
         process="{model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}",
         kind="fopdt", gain=1.0, tau=10.0, dead=1.0, kc=2.0, ti=8.0, td=0.0, n=10.0, scan=5.0, top=1e3),
    dict(name="crossing-nyquist-end-point-no-dead-time", note="target at the edge of instability, crossover at z = -1",
         process="{model: fopdt, gain: 1, time_constant: 10 s, dead_time: 0 s}",
         kind="fopdt", gain=1.0, tau=10.0, dead=0.0, kc=3.0, ti=8.0, td=0.0, n=10.0, scan=5.0, top=1e3),
    dict(name="crossing-resonance-several-crossovers", note="several gain crossovers around a resonance",
         process="{model: sopdt, gain: 1, damping: 0.05, natural_frequency: 1, dead_time: 5.21 s}",
         kind="sopdt", gain=1.0, zeta=0.05, wn=1.0, dead=5.21, kc=0.15, ti=5.0, td=0.0, n=10.0, scan=0.5, top=1e3),
    dict(name="crossing-resonance-close-pair", note="two gain crossovers 1.6 % apart at a resonance",
         process="{model: sopdt, gain: 1, damping: 0.01, natural_frequency: 1, dead_time: 5.21 s}",
         kind="sopdt", gain=1.0, zeta=0.01, wn=1.0, dead=5.21, kc=0.025, ti=5.0, td=0.0, n=10.0, scan=0.1, top=1e3),
    dict(name="crossing-conditionally-stable", note="stable for gains between about 0.56x and 56.5x",
         process="{model: integrating, gain: 0.1, lag: 10 s, dead_time: 0.1 s}",
         kind="integrating", gain=0.1, lag=10.0, dead=0.1, kc=2.0, ti=5.0, td=8.0, n=10.0, scan=0.05, top=1e4),
    dict(name="crossing-filter-n100", note="derivative filter N = 100, crossover far above 20/L",
         process="{model: fopdt, gain: 1, time_constant: 1 s, dead_time: 0.05 s}",
         kind="fopdt", gain=1.0, tau=1.0, dead=0.05, kc=5.0, ti=1.0, td=0.5, n=100.0, scan=0.01, top=1e5),
]


def process_tf(lp):
    """Numerator and denominator of the rational part, descending powers of s."""
    if lp["kind"] == "fopdt":
        return [lp["gain"]], [lp["tau"], 1.0]
    if lp["kind"] == "sopdt":
        wn, z = lp["wn"], lp["zeta"]
        return [lp["gain"] * wn * wn], [1.0, 2 * z * wn, wn * wn]
    return [lp["gain"]], [lp["lag"], 1.0, 0.0]


def controller_s(lp, s):
    c = np.full_like(s, lp["kc"], dtype=complex)
    if lp["ti"] > 0:
        c = c + lp["kc"] / (lp["ti"] * s)
    if lp["td"] > 0:
        c = c + lp["kc"] * lp["td"] * s / (1 + s * lp["td"] / lp["n"])
    return c


def design_loop(lp):
    num, den = process_tf(lp)

    def response(w):
        s = 1j * np.asarray(w, dtype=float)
        return controller_s(lp, s) * np.polyval(num, s) / np.polyval(den, s) * np.exp(-s * lp["dead"])
    return response


def companion(num, den):
    """Controllable companion form of a strictly proper num/den (descending powers)."""
    den = np.asarray(den, dtype=float)
    num = np.asarray(num, dtype=float) / den[0]
    den = den / den[0]
    n = len(den) - 1
    a = np.zeros((n, n))
    a[0, :] = -den[1:]
    a[1:, :-1] = np.eye(n - 1)
    b = np.zeros((n, 1))
    b[0, 0] = 1.0
    c = np.zeros((1, n))
    c[0, n - len(num):] = num
    return a, b, c


def zoh(a, b, t):
    """Phi(t), Gamma(t) from one matrix exponential of [[A, B], [0, 0]] t."""
    n = a.shape[0]
    m = np.zeros((n + 1, n + 1))
    m[:n, :n] = a
    m[:n, n:] = b
    e = expm(m * t)
    return e[:n, :n], e[:n, n:]


def split_delay(dead, h):
    d = int(math.floor(dead / h + 1e-9))
    tau = dead - d * h
    if tau < 1e-12 * h:
        tau = 0.0
    return d, tau


def sampled_process(lp):
    a, b, c = companion(*process_tf(lp))
    h = lp["scan"]
    d, tau = split_delay(lp["dead"], h)
    phi, _ = zoh(a, b, h)
    phi_rest, gamma0 = zoh(a, b, h - tau)
    _, gamma_tau = zoh(a, b, tau) if tau > 0 else (None, np.zeros_like(b))
    gamma1 = phi_rest @ gamma_tau
    return a, b, c, phi, gamma0, gamma1, d


def augmented(phi, gamma0, gamma1, c, d):
    """State x and the inputs u(k-1) ... u(k-d-1): x(k+1) = Phi x + Gamma0 u(k-d) + Gamma1 u(k-d-1)."""
    n = phi.shape[0]
    m = d + 1
    pa = np.zeros((n + m, n + m))
    ga = np.zeros((n + m, 1))
    pa[:n, :n] = phi
    # slot j holds u(k-1-j); u(k-d) is u itself when d = 0
    if d == 0:
        ga[:n] = gamma0
    else:
        pa[:n, n + d - 1:n + d] = gamma0
    pa[:n, n + d:n + d + 1] = gamma1
    ga[n, 0] = 1.0
    for j in range(1, m):
        pa[n + j, n + j - 1] = 1.0
    ca = np.zeros((1, n + m))
    ca[:, :n] = c
    return pa, ga, ca


def check_sampling(lp, a, b, c, pa, ga, ca):
    """The augmented system must reproduce a fine-step simulation of the delayed process."""
    h = lp["scan"]
    per_scan = next(m for m in range(20, 2000)
                    if abs(lp["dead"] / (h / m) - round(lp["dead"] / (h / m))) < 1e-9)
    step = h / per_scan
    delay_steps = round(lp["dead"] / step)
    scans = 120
    u = np.random.default_rng(11).standard_normal(scans)
    fine_u = np.concatenate([np.zeros(delay_steps), np.repeat(u, per_scan)])[: scans * per_scan]
    fphi, fgam = zoh(a, b, step)
    x = np.zeros((a.shape[0], 1))
    y_fine = np.zeros(scans)
    for k in range(scans * per_scan):
        if k % per_scan == 0:
            y_fine[k // per_scan] = (c @ x).item()
        x = fphi @ x + fgam * fine_u[k]
    xa = np.zeros((pa.shape[0], 1))
    y = np.zeros(scans)
    for k in range(scans):
        y[k] = (ca @ xa).item()
        xa = pa @ xa + ga * u[k]
    err = np.max(np.abs(y - y_fine))
    assert err < 1e-9 * max(1.0, np.max(np.abs(y))), (lp["name"], err)


def target_loop(lp):
    a, b, c, phi, gamma0, gamma1, d = sampled_process(lp)
    pa, ga, ca = augmented(phi, gamma0, gamma1, c, d)
    check_sampling(lp, a, b, c, pa, ga, ca)
    h, k, ti, td = lp["scan"], lp["kc"], lp["ti"], lp["td"]
    tf = td / lp["n"]
    lam, vec = np.linalg.eig(phi)
    left = (c @ vec).ravel()
    right0 = np.linalg.solve(vec, gamma0).ravel()
    right1 = np.linalg.solve(vec, gamma1).ravel()

    def process(z):
        # C (zI - Phi)^-1 (Gamma0 + Gamma1 / z) z^-d through the eigenvectors of Phi (distinct eigenvalues here)
        z = np.asarray(z)
        g = np.zeros_like(z, dtype=complex)
        for i in range(len(lam)):
            g = g + left[i] * (right0[i] + right1[i] / z) / (z - lam[i])
        return g * z ** (-d)

    # the closed form against the augmented system's own pulse transfer function
    for w in np.geomspace(1e-3, math.pi / h, 40):
        z = np.exp(1j * w * h)
        direct = (ca @ np.linalg.solve(z * np.eye(pa.shape[0]) - pa, ga)).item()
        assert abs(direct - process(np.array([z]))[0]) < 1e-9 * max(1.0, abs(direct)), (lp["name"], w)

    def response(w):
        z = np.exp(1j * np.asarray(w, dtype=float) * h)
        q = 1 / z
        cz = np.full_like(z, k)
        if ti > 0:
            cz = cz + k * h / (ti * (1 - q))
        if td > 0:
            cz = cz + k * (td / (tf + h)) * (1 - q) / (1 - q * tf / (tf + h))
        return cz * process(z)
    return response


from delay_margin_reference import least_destabilizing_extra_dead_time, pid_pulse, closed_loop_largest_pole  # noqa: E402 (shared with the other golden scripts)


def target_delay_margin(lp, estimate):
    """The exact delay margin of the target loop (see least_destabilizing_extra_dead_time)."""
    h, k, ti, td = lp["scan"], lp["kc"], lp["ti"], lp["td"]
    cnum, cden = pid_pulse(k, ti, td, td / lp["n"], h)

    def largest_pole(extra):
        _, _, c, phi, gamma0, gamma1, d = sampled_process(dict(lp, dead=lp["dead"] + extra))
        pa, ga, ca = augmented(phi, gamma0, gamma1, c, d)
        return closed_loop_largest_pole(pa, ga, ca, cnum, cden)
    if largest_pole(0.0) >= 1.0:
        return estimate  # an unstable loop: loopform shows no margins for it and keeps the reading PM / wc
    return least_destabilizing_extra_dead_time(largest_pole, h, estimate)


def margins(response, low, high):
    w = np.geomspace(low, high, DENSE_POINTS)
    w[0], w[-1] = low, high
    l = response(w)
    phase = np.unwrap(np.angle(l))
    mag = np.abs(l)

    def at(x):
        return complex(response(np.array([x]))[0])

    def unwrapped(x, k):
        p = np.angle(at(x))
        return p + 2 * math.pi * round((phase[k] - p) / (2 * math.pi))

    pm, wc, dm = math.inf, None, math.inf
    for k in np.nonzero(np.diff(np.sign(mag - 1.0)))[0]:
        x = brentq(lambda v: abs(at(v)) - 1.0, w[k], w[k + 1], xtol=1e-15, rtol=1e-14)
        margin = math.degrees(math.pi + unwrapped(x, k))
        margin -= 360 * math.ceil((margin - 180) / 360)  # into (-180, 180]
        if wc is None or abs(margin) < abs(pm):
            pm, wc = margin, x  # the crossover nearest -1: the smallest phase change, lag or lead
        dm = min(dm, math.radians(margin % 360) / x)

    factors = []
    top_level = round((phase[-1] + math.pi) / (2 * math.pi))
    top_on_axis = abs(phase[-1] - (-math.pi + 2 * math.pi * top_level)) < 1e-9
    if top_on_axis:
        phase[-1] = -math.pi + 2 * math.pi * top_level
        factors.append((1.0 / abs(l[-1]), w[-1]))
    turns = np.floor((phase + math.pi) / (2 * math.pi))
    for k in np.nonzero(np.diff(turns))[0]:
        if top_on_axis and k == len(w) - 2:
            continue  # the end point, counted above
        level = -math.pi + 2 * math.pi * max(turns[k], turns[k + 1])
        x = brentq(lambda v: unwrapped(v, k) - level, w[k], w[k + 1], xtol=1e-15, rtol=1e-14)
        factors.append((1.0 / abs(at(x)), x))
    upper = [f for f in factors if f[0] >= 1]
    gm, wpc = min(upper) if upper else (None, None)
    lower = [f[0] for f in factors if f[0] < 1]

    k = int(np.argmin(np.abs(1 + l)))
    lo, hi = w[max(k - 1, 0)], w[min(k + 1, len(w) - 1)]
    res = minimize_scalar(lambda v: abs(1 + at(v)), bounds=(lo, hi), method="bounded",
                          options={"xatol": 1e-13 * w[k]})
    wms = res.x if res.fun < abs(1 + l[k]) else w[k]
    ms = 1.0 / min(res.fun, abs(1 + l[k]))
    return dict(gain_margin=gm, phase_crossover_rad_s=wpc, lower_gain_margin=max(lower) if lower else None,
                phase_margin_deg=pm if wc else None, crossover_rad_s=wc, delay_margin_s=dm if wc else None,
                ms=ms, ms_rad_s=wms)


def loop_yaml(lp):
    tuning = "{form: ideal, kc: %r, ti: %r, td: %r, n: %r}" % (lp["kc"], lp["ti"], lp["td"], lp["n"])
    return ("# INVENTED LOOP for CrossingGoldenTest: %s.\n"
            "# Written by src/test/python/write_crossing_golden.py; edit the script, not this file.\n"
            "tag: %s\nprocess: %s\ntuning: %s\ntarget: {form: ideal, scan: %r s}\n"
            % (lp["note"], lp["name"].upper(), lp["process"], tuning, lp["scan"]))


def fmt(x):
    return "" if x is None or x == math.inf else repr(float(x))


KEYS = ["gain_margin", "phase_crossover_rad_s", "lower_gain_margin", "phase_margin_deg", "crossover_rad_s",
        "delay_margin_s", "delay_margin_scans", "ms", "ms_rad_s"]


def main():
    os.makedirs(OUT_DIR, exist_ok=True)
    rows = []
    for lp in LOOPS:
        with open(os.path.join(OUT_DIR, lp["name"] + ".yaml"), "w") as f:
            f.write(loop_yaml(lp))
        design = margins(design_loop(lp), BAND_BOTTOM_RAD_S, lp["top"])
        design["delay_margin_scans"] = None
        target = margins(target_loop(lp), BAND_BOTTOM_RAD_S, math.pi / lp["scan"])
        dm = target["delay_margin_s"]
        if dm is not None:
            dm = target["delay_margin_s"] = target_delay_margin(lp, dm)
        target["delay_margin_scans"] = None if dm is None else dm / lp["scan"]
        for which, m in (("design", design), ("target", target)):
            rows.append([lp["name"] + ".yaml", which] + [fmt(m[k]) for k in KEYS])
            print(lp["name"], which, " ".join("%s=%s" % (k, fmt(m[k])) for k in KEYS))
    with open(os.path.join(OUT_DIR, "crossing-golden.csv"), "w", newline="") as f:
        out = csv.writer(f, lineterminator="\n")
        out.writerow(["file", "loop"] + KEYS)
        out.writerows(rows)


if __name__ == "__main__":
    main()
