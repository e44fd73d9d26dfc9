#!/usr/bin/env python3
"""Writes the loop files and check-golden.csv into src/test/resources/org/loopform/audit/.

Reference margins for LoopCheckGoldenTest, computed independently of the Java code with numpy
and scipy, for invented loops (first order, second order and integrating processes with dead
time; ideal PID with N = 10 and PI; dead times that are and are not whole numbers of scans).

Run from the repository root:  python3 src/test/python/write_check_golden.py

Design loop: L(s) = C(s) P(s) e^(-s L), with the ideal PID written out from its definition,
C(s) = K (1 + 1/(Ti s) + Td s / (1 + s Td/N)) (Astrom and Hagglund, PID Controllers: Theory,
Design and Tuning, 2nd ed., ISA 1995, ch. 3 - from memory for the section).

Target loop: L(z) = C(z) P(z) at z = exp(i w h), 0 < w <= pi/h.
- P(z): the rational part put into state space by scipy.signal.tf2ss and sampled by
  scipy.signal.cont2discrete(method='zoh'); the dead time L = d h + tau (0 <= tau < h) carried
  by state augmentation, x(k+1) = Phi x(k) + Gamma0 u(k-d) + Gamma1 u(k-d-1), with
  Gamma0 = Gamma(h - tau) and Gamma1 = Phi(h - tau) Gamma(tau) (Astrom and Wittenmark,
  Computer-Controlled Systems, 3rd ed., 1997, ch. 2, sampling a system with a time delay - from
  memory). The script checks these matrices against a fine-step simulation (an input held per
  scan, the delay a whole number of fine steps) before it uses them.
- C(z): the target forms here run the positional PID with backward differences for both the
  integral and the filtered derivative (their algorithm section is the default one; see
  `loopform forms show ideal`): with q = 1/z and Tf = Td/N,
  C(z) = K (1 + h / (Ti (1 - q)) + (Td / (Tf + h)) (1 - q) / (1 - q Tf / (Tf + h)))
  (s replaced by (1 - q)/h; Wittenmark, Astrom and Arzen, "Computer Control: An Overview",
  IFAC Professional Brief, 2002, Table 3).

Margins (definitions after Astrom and Murray, Feedback Systems, 2008, ch. 9-10 - from
memory): numpy evaluates each loop on a log-spaced grid of 2,000,001 points, the phase is
unwrapped along it, every gain crossover and every pass of the unwrapped phase through
-180 + 360 k degrees is refined with scipy.optimize.brentq, and the peak of 1/|1 + L| with
scipy.optimize.minimize_scalar. The gain margin is the smallest 1/|L| at or above 1 over the
phase crossovers, the lower gain margin the largest below 1; a sampled loop whose L(-1) is real
and negative has a phase crossover at the Nyquist frequency itself (its Nyquist plot passes the
axis there and continues into its mirror image). Each phase margin is wrapped into (-180, 180]
degrees and the one smallest in size (the crossover nearest -1) reported with its sign; the delay margin is the smallest ((PM mod 360) in rad) / w.

Earlier versions skipped the Nyquist end point as "a touch, not a pass", which is wrong: the
plot of a sampled loop crosses the negative real axis at z = -1. No loop here has its crossover
there, so no row changed; the conventions changed with the definitions above.
"""
import csv
import math
import os

import numpy as np
from scipy.optimize import brentq, minimize_scalar
from scipy.signal import cont2discrete, dlsim, ss2tf, tf2ss

DENSE_POINTS = 2_000_001
OUT_DIR = os.path.join("src", "test", "resources", "org", "loopform", "audit")
BAND_BOTTOM_RAD_S = 1e-4

# Invented loops. Process: (model, numerator, denominator, dead time s, YAML process block);
# tuning in the ideal form (kc %/%, ti s, td s, n); target form and scan s.
LOOPS = [
    dict(name="golden-fopdt-pid-whole-scans",
         note="first order, ideal PID, dead time 20 scans, written as band and repeats",
         num=[2.0], den=[60.0, 1.0], dead=10.0,
         process="{model: fopdt, gain: 2.0, time_constant: 60 s, dead_time: 10 s}",
         kc=1.2, ti=60.0, td=4.0, n=10.0, target="ideal-pb-repeats", scan=0.5),
    dict(name="golden-fopdt-pi-fractional",
         note="first order, PI, dead time 3.25 scans",
         num=[1.0], den=[10.0, 1.0], dead=1.3,
         process="{model: fopdt, gain: 1.0, time_constant: 10 s, dead_time: 1.3 s}",
         kc=3.8, ti=10.0, td=0.0, n=10.0, target="ideal", scan=0.4),
    dict(name="golden-sopdt-pid-whole-scans",
         note="second order, ideal PID, dead time 8 scans, written in minutes",
         num=[1.5], den=np.polymul([8.0, 1.0], [3.0, 1.0]).tolist(), dead=2.0,
         process="{model: sopdt, gain: 1.5, time_constant: 8 s, time_constant_2: 3 s, dead_time: 2 s}",
         kc=1.8, ti=11.0, td=2.2, n=10.0, target="ideal-min", scan=0.25),
    dict(name="golden-integrating-pi-fractional",
         note="integrating, PI, dead time 6.67 scans",
         num=[0.05], den=[1.0, 0.0], dead=2.0,
         process="{model: integrating, gain: 0.05, dead_time: 2 s}",
         kc=5.0, ti=16.0, td=0.0, n=10.0, target="ideal", scan=0.3),
    dict(name="golden-sopdt-pid-fractional",
         note="second order, ideal PID, dead time 2.33 scans, filter shorter than the scan",
         num=[1.0], den=np.polymul([4.0, 1.0], [1.0, 1.0]).tolist(), dead=0.7,
         process="{model: sopdt, gain: 1.0, time_constant: 4 s, time_constant_2: 1 s, dead_time: 0.7 s}",
         kc=2.5, ti=5.0, td=0.8, n=10.0, target="ideal", scan=0.3),
]


def controller_s(lp, s):
    c = np.full_like(s, lp["kc"], dtype=complex)
    if lp["ti"] > 0:
        c = c + lp["kc"] / (lp["ti"] * s)
    if lp["td"] > 0:
        c = c + lp["kc"] * lp["td"] * s / (1 + s * lp["td"] / lp["n"])
    return c


def design_loop(lp):
    def response(w):
        s = 1j * np.asarray(w, dtype=float)
        p = np.polyval(lp["num"], s) / np.polyval(lp["den"], s) * np.exp(-s * lp["dead"])
        return controller_s(lp, s) * p
    return response


def split_delay(dead, h):
    d = int(math.floor(dead / h + 1e-9))
    tau = dead - d * h
    if tau < 1e-12 * h:
        tau = 0.0
    return d, tau


def sampled_matrices(lp):
    """Phi, Gamma0, Gamma1, C, d of the process sampled through a zero-order hold."""
    a, b, c, dd = tf2ss(lp["num"], lp["den"])
    assert np.allclose(dd, 0), "strictly proper processes only"
    h = lp["scan"]
    d, tau = split_delay(lp["dead"], h)
    phi, _, _, _, _ = cont2discrete((a, b, c, dd), h, method="zoh")
    if tau == 0.0:
        _, gamma0, _, _, _ = cont2discrete((a, b, c, dd), h, method="zoh")
        gamma1 = np.zeros_like(gamma0)
    else:
        phi_rest, gamma0, _, _, _ = cont2discrete((a, b, c, dd), h - tau, method="zoh")
        _, gamma_tau, _, _, _ = cont2discrete((a, b, c, dd), tau, method="zoh")
        gamma1 = phi_rest @ gamma_tau
    return phi, gamma0, gamma1, c, d, tau


def check_against_fine_steps(lp, phi, gamma0, gamma1, c, d):
    """The sampled model must reproduce a fine-step simulation of the delayed process exactly."""
    a, b, cc, dd = tf2ss(lp["num"], lp["den"])
    h = lp["scan"]
    # the fewest fine steps per scan (at least 10) that also divide the dead time
    per_scan = next(m for m in range(10, 1000)
                    if abs(lp["dead"] / (h / m) - round(lp["dead"] / (h / m))) < 1e-9)
    step = h / per_scan
    delay_steps = round(lp["dead"] / step)
    assert abs(delay_steps * step - lp["dead"]) < 1e-12, "the fine step must divide the dead time"
    scans = 200
    u = np.random.default_rng(7).standard_normal(scans)
    fine_u = np.concatenate([np.zeros(delay_steps), np.repeat(u, per_scan)])[: scans * per_scan]
    fine = cont2discrete((a, b, cc, dd), step, method="zoh")
    _, y_fine, _ = dlsim(fine[:4] + (step,), fine_u)
    x = np.zeros((phi.shape[0], 1))
    y = np.zeros(scans)
    for k in range(scans):
        y[k] = (c @ x).item()
        now = u[k - d] if k - d >= 0 else 0.0
        before = u[k - d - 1] if k - d - 1 >= 0 else 0.0
        x = phi @ x + gamma0 * now + gamma1 * before
    err = np.max(np.abs(y - y_fine[::per_scan, 0]))
    assert err < 1e-9 * max(1.0, np.max(np.abs(y))), (lp["name"], err)


def target_loop(lp):
    phi, gamma0, gamma1, c, d, _ = sampled_matrices(lp)
    check_against_fine_steps(lp, phi, gamma0, gamma1, c, d)
    num0, den = ss2tf(phi, gamma0, c, np.zeros((1, 1)))
    num1, _ = ss2tf(phi, gamma1, c, np.zeros((1, 1)))
    num0, num1 = num0[0], num1[0]
    h = lp["scan"]
    k, ti, td = lp["kc"], lp["ti"], lp["td"]
    tf = td / lp["n"]

    def response(w):
        z = np.exp(1j * np.asarray(w, dtype=float) * h)
        q = 1 / z
        p = (np.polyval(num0, z) + np.polyval(num1, z) * q) / np.polyval(den, z) * q ** d
        cz = np.full_like(z, k)
        if ti > 0:
            cz = cz + k * h / (ti * (1 - q))
        if td > 0:
            cz = cz + k * (td / (tf + h)) * (1 - q) / (1 - q * tf / (tf + h))
        return cz * p
    return response


def margins(response, low, high):
    w = np.geomspace(low, high, DENSE_POINTS)
    w[0], w[-1] = low, high
    l = response(w)
    phase = np.unwrap(np.angle(l))
    if phase[0] > math.pi / 2:
        phase = phase - 2 * math.pi
    mag = np.abs(l)

    def at(x):
        return complex(response(np.array([x]))[0])

    pm, wc, dm = math.inf, None, math.inf
    for k in np.nonzero(np.diff(np.sign(mag - 1.0)))[0]:
        x = brentq(lambda v: abs(at(v)) - 1.0, w[k], w[k + 1], xtol=1e-15, rtol=1e-14)
        p = np.angle(at(x))
        p += 2 * math.pi * round((phase[k] - p) / (2 * math.pi))
        margin = math.degrees(math.pi + p)
        margin -= 360 * math.ceil((margin - 180) / 360)  # into (-180, 180]
        if wc is None or abs(margin) < abs(pm):
            pm, wc = margin, x  # the crossover nearest -1: least lag or lead
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

        def from_level(v):
            a = np.angle(at(v))
            return a + 2 * math.pi * round((phase[k] - a) / (2 * math.pi)) - level
        x = brentq(from_level, w[k], w[k + 1], xtol=1e-15, rtol=1e-14)
        factors.append((1.0 / abs(at(x)), x))
    upper = [f for f in factors if f[0] >= 1]
    gm, wpc = min(upper) if upper else (math.inf, None)
    lower = [f[0] for f in factors if f[0] < 1]
    lgm = max(lower) if lower else None

    k = int(np.argmin(np.abs(1 + l)))
    lo, hi = w[max(k - 1, 0)], w[min(k + 1, len(w) - 1)]
    res = minimize_scalar(lambda v: abs(1 + at(v)), bounds=(lo, hi), method="bounded",
                          options={"xatol": 1e-13 * w[k]})
    wms = res.x if res.fun < abs(1 + l[k]) else w[k]
    ms = 1.0 / min(res.fun, abs(1 + l[k]))
    return dict(gain_margin=gm, phase_crossover_rad_s=wpc, phase_margin_deg=pm, crossover_rad_s=wc,
                delay_margin_s=dm, ms=ms, ms_rad_s=wms, lower_gain_margin=lgm)


def loop_yaml(lp):
    tuning = "{form: ideal, kc: %r, ti: %r, td: %r, n: %r}" % (lp["kc"], lp["ti"], lp["td"], lp["n"])
    return ("# INVENTED LOOP for LoopCheckGoldenTest: %s.\n"
            "# Written by src/test/python/write_check_golden.py; edit the script, not this file.\n"
            "tag: %s\nprocess: %s\ntuning: %s\ntarget: {form: %s, scan: %r s}\n"
            % (lp["note"], lp["name"].upper(), lp["process"], tuning, lp["target"], lp["scan"]))


def fmt(x):
    return "" if x is None or x == math.inf else repr(float(x))


from delay_margin_reference import least_destabilizing_extra_dead_time, pid_pulse, closed_loop_largest_pole  # noqa: E402 (shared with the other golden scripts)


def target_delay_margin(lp, estimate):
    """The exact delay margin of the target loop (see least_destabilizing_extra_dead_time)."""
    h, k, ti, td = lp["scan"], lp["kc"], lp["ti"], lp["td"]
    cnum, cden = pid_pulse(k, ti, td, td / lp["n"], h)

    def largest_pole(extra):
        phi, gamma0, gamma1, c, d, _ = sampled_matrices(dict(lp, dead=lp["dead"] + extra))
        n = phi.shape[0]
        # state x and the inputs u(k-1) ... u(k-d-1)
        pa = np.zeros((n + d + 1, n + d + 1))
        ga = np.zeros((n + d + 1, 1))
        pa[:n, :n] = phi
        if d == 0:
            ga[:n] = gamma0
        else:
            pa[:n, n + d - 1:n + d] = gamma0
        pa[:n, n + d:n + d + 1] = gamma1
        ga[n, 0] = 1.0
        for j in range(1, d + 1):
            pa[n + j, n + j - 1] = 1.0
        ca = np.zeros((1, n + d + 1))
        ca[:, :n] = c
        return closed_loop_largest_pole(pa, ga, ca, cnum, cden)
    if largest_pole(0.0) >= 1.0:
        return estimate  # an unstable loop: loopform shows no margins for it and keeps the reading PM / wc
    return least_destabilizing_extra_dead_time(largest_pole, h, estimate)


def main():
    os.makedirs(OUT_DIR, exist_ok=True)
    keys = ["gain_margin", "phase_crossover_rad_s", "phase_margin_deg", "crossover_rad_s", "delay_margin_s",
            "ms", "ms_rad_s", "lower_gain_margin"]
    rows = []
    for lp in LOOPS:
        with open(os.path.join(OUT_DIR, lp["name"] + ".yaml"), "w") as f:
            f.write(loop_yaml(lp))
        # the design band reaches far above any crossover of these loops
        design = margins(design_loop(lp), BAND_BOTTOM_RAD_S, 1e3)
        target = margins(target_loop(lp), BAND_BOTTOM_RAD_S, math.pi / lp["scan"])
        if target["delay_margin_s"] is not None:
            target["delay_margin_s"] = target_delay_margin(lp, target["delay_margin_s"])
        for which, m in (("design", design), ("target", target)):
            rows.append([lp["name"] + ".yaml", which] + [fmt(m[k]) for k in keys])
            print(lp["name"], which, " ".join("%s=%s" % (k, fmt(m[k])) for k in keys))
    with open(os.path.join(OUT_DIR, "check-golden.csv"), "w", newline="") as f:
        out = csv.writer(f, lineterminator="\n")
        out.writerow(["file", "loop"] + keys)
        out.writerows(rows)


if __name__ == "__main__":
    main()
