#!/usr/bin/env python3
"""Writes src/test/resources/org/loopform/analysis/margin-golden.csv.

Reference margins for MarginAnalysisGoldenTest, computed independently of the Java code:
numpy evaluates each open loop on a very dense log-spaced grid (2,000,001 points), the phase
is unwrapped along that grid with numpy.unwrap, every sign change is refined with
scipy.optimize.brentq, and the peak of 1/|1 + L| with scipy.optimize.minimize_scalar.

Run from the repository root:  python3 src/test/python/write_margin_golden.py

The processes follow the shapes of Astrom and Hagglund, "Benchmark systems for PID control",
IFAC Workshop on Digital Control: Past, Present and Future of PID Control, 2000 (from memory):
first order with dead time, second order with dead time, a fourth-order lag, integrating with
dead time, non-minimum phase; plus a lightly damped process and a sampled loop. The controller
settings are moderate values chosen for the test; they are inputs, not checks.

Conventions shared with the Java code (definitions, not computed values): the controller is
ideal PID, C(s) = K (1 + 1/(Ti s) + Td s / (1 + s Td/N)), Ti = 0 meaning no integral action and
Td = 0 no derivative action; phase is unwrapped from the bottom of the band (the branch there
does not matter: every figure is read modulo 360 degrees); the gain margin is the smallest
1/|L| at or above 1 over the passes of the phase through -180 + 360 k degrees (a band top on
the negative real axis, a sampled loop at z = -1, counts as one), the lower gain margin the
largest below 1; each phase margin is wrapped into (-180, 180] degrees and the one smallest
in size (the crossover nearest -1) reported with its sign; the delay margin is the smallest ((PM mod 360) in rad) / omega over the gain
crossovers (Astrom and Murray, Feedback Systems, 2008, ch. 9-10 - from memory). A sampled loop
("z") gives its loop polynomials in z and is evaluated at z = exp(i omega h) up to the Nyquist
frequency pi / h.

Earlier versions of this script reported the smallest 1/|L| over all phase crossovers as the
gain margin and the unwrapped phase margin; the row fopdt_unstable_p changed with the
definitions (its only crossover below 1 is now the lower gain margin).
"""
import csv
import math
import os

import numpy as np
from scipy.optimize import brentq, minimize_scalar

DENSE_POINTS = 2_000_001
OUT = os.path.join("src", "test", "resources", "org", "loopform", "analysis", "margin-golden.csv")

# id, domain, process numerator, process denominator (descending powers), dead time s,
# K, Ti s, Td s, N, scan s, band bottom rad/s, band top rad/s
LOOPS = [
    ("fopdt_t1_pi", "s", [1.0], [1.0, 1.0], 1.0, 0.25, 1.0, 0.0, 10.0, 0.0, 1e-3, 1e2),
    ("fopdt_t10_pid", "s", [1.0], [10.0, 1.0], 1.0, 4.7, 4.2, 0.485, 10.0, 0.0, 1e-3, 1e3),
    ("fopdt_t1_pi_tight", "s", [1.0], [1.0, 1.0], 1.0, 0.8, 1.2, 0.0, 10.0, 0.0, 1e-3, 1e2),
    ("sopdt_t1_pid", "s", [1.0], [1.0, 2.0, 1.0], 1.0, 1.0, 2.0, 0.5, 10.0, 0.0, 1e-3, 1e3),
    ("lag4_pid", "s", [1.0], [1.0, 4.0, 6.0, 4.0, 1.0], 0.0, 2.4, math.pi, math.pi / 4, 10.0, 0.0, 1e-3, 1e3),
    ("integrating_pi", "s", [1.0], [1.0, 0.0], 1.0, 0.5, 8.0, 0.0, 10.0, 0.0, 1e-3, 1e2),
    ("integrating_lag_pid", "s", [1.0], [1.0, 1.0, 0.0], 0.5, 0.4, 10.0, 1.0, 8.0, 0.0, 1e-3, 1e3),
    ("nonminimum_phase_pi", "s", [-0.5, 1.0], [1.0, 3.0, 3.0, 1.0], 0.0, 0.5, 1.5, 0.0, 10.0, 0.0, 1e-3, 1e2),
    ("lag2_pi_no_phase_crossover", "s", [1.0], [1.0, 2.0, 1.0], 0.0, 2.0, 2.0, 0.0, 10.0, 0.0, 1e-3, 1e3),
    ("resonant_pi", "s", [1.0], [1.0, 0.2, 1.0], 0.2, 0.2, 2.0, 0.0, 10.0, 0.0, 1e-2, 1e2),
    ("fopdt_unstable_p", "s", [1.0], [1.0, 1.0], 1.0, 3.0, 0.0, 0.0, 10.0, 0.0, 1e-2, 1e2),
    ("sampled_integrator_p", "z", [0.1], [1.0, -1.0, 0.0], 0.0, 2.0, 0.0, 0.0, 10.0, 0.1, 1e-3, math.pi / 0.1),
]


def loop_response(row, w):
    _, domain, num, den, dead, k, ti, td, n, h, _, _ = row
    if domain == "z":
        z = np.exp(1j * w * h)
        return k * np.polyval(num, z) / np.polyval(den, z)
    s = 1j * w
    c = np.full_like(s, k)
    if ti > 0:
        c = c + k / (ti * s)
    if td > 0:
        c = c + k * td * s / (1 + s * td / n)
    return c * np.polyval(num, s) / np.polyval(den, s) * np.exp(-s * dead)


def anchored_unwrapped_phase(l):
    phase = np.unwrap(np.angle(l))
    if phase[0] > math.pi / 2:
        phase = phase - 2 * math.pi
    return phase


def margins(row):
    low, high = row[10], row[11]
    w = np.geomspace(low, high, DENSE_POINTS)
    w[0], w[-1] = low, high
    l = loop_response(row, w)
    phase = anchored_unwrapped_phase(l)
    mag = np.abs(l)

    def lv(x):
        return complex(loop_response(row, np.array([x]))[0])

    pm_deg, wc, dm = math.inf, None, math.inf
    for k in np.nonzero(np.diff(np.sign(mag - 1.0)))[0]:
        x = brentq(lambda v: abs(lv(v)) - 1.0, w[k], w[k + 1], xtol=1e-15, rtol=1e-14)
        # unwrapped phase at the root: its principal value moved to the branch of the neighbour
        p = np.angle(lv(x))
        p += 2 * math.pi * round((phase[k] - p) / (2 * math.pi))
        margin = math.degrees(math.pi + p)
        margin -= 360 * math.ceil((margin - 180) / 360)  # into (-180, 180]
        if wc is None or abs(margin) < abs(pm_deg):  # the crossover nearest -1: least lag or lead
            pm_deg, wc = margin, x
        dm = min(dm, math.radians(margin % 360) / x)

    factors = []
    # the unwrapped phase passes -180 + 360 m
    top_level = round((phase[-1] + math.pi) / (2 * math.pi))
    top_on_axis = abs(phase[-1] - (-math.pi + 2 * math.pi * top_level)) < 1e-9
    if top_on_axis:
        phase[-1] = -math.pi + 2 * math.pi * top_level
        factors.append((1.0 / abs(l[-1]), w[-1]))
    shifted = np.floor((phase + math.pi) / (2 * math.pi))
    for k in np.nonzero(np.diff(shifted))[0]:
        if top_on_axis and k == len(w) - 2:
            continue  # the end point, counted above
        level = -math.pi + 2 * math.pi * max(shifted[k], shifted[k + 1])
        base = phase[k] - np.angle(l[k])
        x = brentq(lambda v: base + np.angle(lv(v)) + 2 * math.pi * round(
            (np.angle(l[k]) - np.angle(lv(v))) / (2 * math.pi)) - level, w[k], w[k + 1], xtol=1e-15, rtol=1e-14)
        factors.append((1.0 / abs(lv(x)), x))
    upper = [f for f in factors if f[0] >= 1]
    gm, wpc = min(upper) if upper else (math.inf, None)
    lower = [f[0] for f in factors if f[0] < 1]
    lgm = max(lower) if lower else None

    k = int(np.argmin(np.abs(1 + l)))
    lo, hi = w[max(k - 1, 0)], w[min(k + 1, len(w) - 1)]
    res = minimize_scalar(lambda v: abs(1 + lv(v)), bounds=(lo, hi), method="bounded",
                          options={"xatol": 1e-13 * w[k]})
    wms = res.x if res.fun < abs(1 + l[k]) else w[k]
    ms = 1.0 / min(res.fun, abs(1 + l[k]))
    return gm, wpc, pm_deg, wc, dm, ms, wms, unstable_poles(row, w, l), lgm


def unstable_poles(row, w, l):
    """Closed-loop poles outside the stability region, found without looking at crossings.

    Sampled loop: numpy.roots of den(z) + K num(z), counting roots with |z| >= 1.
    Continuous loop (no open-loop poles in the right half plane): the argument principle on
    1 + L along the imaginary axis, indented right of the integrators at the origin. The arc
    around the origin turns arg(1 + L) by twice its value at the band bottom, so the count is
    -(unwrapped arg(1 + L) at the band top) / pi, the phase anchored in (-270, 90] degrees at a
    band bottom low enough that |L| >> 1 there for an integrating loop.
    """
    _, domain, num, den, _, k, _, _, _, _, _, _ = row
    if domain == "z":
        char = np.polyadd(den, k * np.array(num))
        return int(np.sum(np.abs(np.roots(char)) >= 1.0))
    phase = anchored_unwrapped_phase(1 + l)
    count = -phase[-1] / math.pi
    # the remainder is arg(1 + L) at the band top, small where |L| << 1
    assert abs(count - round(count)) < 0.05, (row[0], count)
    return int(round(count))


def fmt(x):
    return "" if x is None or x == math.inf else repr(float(x))


def main():
    header = ["id", "domain", "process_num", "process_den", "dead_time_s", "kc", "ti_s", "td_s", "n",
              "scan_s", "band_low_rad_s", "band_high_rad_s", "gain_margin", "phase_crossover_rad_s",
              "phase_margin_deg", "crossover_rad_s", "delay_margin_s", "ms", "ms_rad_s",
              "closed_loop_unstable_poles", "lower_gain_margin"]
    with open(OUT, "w", newline="") as f:
        out = csv.writer(f, lineterminator="\n")
        out.writerow(header)
        for row in LOOPS:
            gm, wpc, pm, wc, dm, ms, wms, poles, lgm = margins(row)
            out.writerow([row[0], row[1], " ".join(repr(c) for c in row[2]), " ".join(repr(c) for c in row[3])]
                         + [repr(float(v)) for v in row[4:12]]
                         + [fmt(gm), fmt(wpc), fmt(pm), fmt(wc), fmt(dm), fmt(ms), fmt(wms), str(poles), fmt(lgm)])
            print(row[0], "GM", fmt(gm), "PM", fmt(pm), "wc", fmt(wc), "Ms", fmt(ms), "unstable", poles)


if __name__ == "__main__":
    main()
