#!/usr/bin/env python3
"""Writes edge loops for ContinuousStability: right-half-plane pole counts of continuous dead-time loops.

Run from the repository root:  python3 src/test/python/write_continuous_edges_golden.py
It writes src/test/resources/org/loopform/analysis/continuous-edges-golden.csv (deterministic).
ContinuousStabilityEdgesTest reads it.

Independent of loopform's Java code: numpy only. The count is the argument principle (Astrom and
Murray, Feedback Systems, 2008, ch. 9 - from memory for the section) on the rectangle
[eps, rho] x [-rho, rho] round every zero of F(s) = den R + num R e^(-s L) with Re s >= 0, walked
with steps bisected until arg F moves less than 0.2 rad, as in write_delay_loop_golden.py (whose
pid and process builders this script imports). A zero with Re s >= 0 needs |R(s)| >= 1; rho here
starts at twice the largest pole or zero of R and doubles until |R| < 0.9 on 400 half circles
spread over [rho, 1000 rho] (a lightly damped resonance lies between the few half circles the
other script checks, so its rho is not used for these loops). Each count is confirmed by Newton's
method: from a grid of starts in the rectangle, the distinct zeros found with Re s > eps must be
as many as the count.

Loops (all INVENTED), each chosen where the Nyquist path must reach a feature the ends of the path
do not show:
- a lightly damped resonance under proportional control whose loop gain is small (0.3) at low
  frequency but peaks far above 1: the path must run past the resonance, not stop where |L| is
  first small;
- the same resonance far above the loop's slowest frequency and with a very light damping, so that
  only points placed round its poles see the peak;
- a slow lag with a long dead time, and a resonance with a PI;
- a first-order lag under a gain so high that |L| is still above 1 ten times past every corner: the
  path must go on until |L| is small, or it misses the encirclements beyond.
"""
import csv
import os
import sys

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from write_delay_loop_golden import pid, process  # noqa: E402

EPS = 1e-9


def rhp_count(num, den, dead):
    def r(s):
        return np.polyval(num, s) / np.polyval(den, s)

    def f(s):
        return np.polyval(den, s) + np.polyval(num, s) * np.exp(-s * dead)

    def df(s):
        return (np.polyval(np.polyder(den), s) + np.polyval(np.polyder(num), s) * np.exp(-s * dead)
                - dead * np.polyval(num, s) * np.exp(-s * dead))

    corners = [abs(x) for x in np.roots(den)] + [abs(x) for x in np.roots(num)] + [1.0]
    rho = 2 * max(corners)
    angles = np.linspace(-np.pi / 2, np.pi / 2, 2001)
    while max(np.max(np.abs(r(radius * np.exp(1j * angles)))) for radius in np.geomspace(rho, 1000 * rho, 400)) >= 0.9:
        rho *= 2
    corners = [EPS - 1j * rho, rho - 1j * rho, rho + 1j * rho, EPS + 1j * rho, EPS - 1j * rho]
    total = 0.0
    for a, b in zip(corners[:-1], corners[1:]):
        t = list(np.linspace(0.0, 1.0, 20001))
        fa = f(a + (b - a) * t[0])
        i = 0
        while i < len(t) - 1:
            fb = f(a + (b - a) * t[i + 1])
            step = np.angle(fb / fa)
            if abs(step) > 0.2:
                t.insert(i + 1, 0.5 * (t[i] + t[i + 1]))
                continue
            total += step
            fa = fb
            i += 1
    turns = total / (2 * np.pi)
    whole = round(turns)
    assert abs(turns - whole) < 1e-6, turns
    found = []
    for x in np.linspace(0, rho, 41):
        for y in np.linspace(-rho, rho, 81):
            z = complex(x, y)
            for _ in range(200):
                step = f(z) / df(z)
                z -= step
                if abs(step) < 1e-13 * max(1.0, abs(z)):
                    break
            if abs(f(z)) < 1e-8 * max(1.0, abs(np.polyval(den, z))) and EPS < z.real < rho and abs(z.imag) < rho:
                if all(abs(z - q) > 1e-6 * max(1.0, abs(q)) for q in found):
                    found.append(z)
    assert len(found) == whole, (whole, found)
    return int(whole), found


OUT = os.path.join("src", "test", "resources", "org", "loopform", "analysis", "continuous-edges-golden.csv")


def main():
    np.seterr(all="ignore")  # Newton starts in the left half plane overflow e^(-s L); those starts are discarded
    cases = [
        # id, process, (K, Ti, Td, N), dead time s, slowest rad/s
        ("resonance-small-low-gain-unstable", ("res", 1.0, 1.0, 0.02), (0.3, None, 0.0, None), 1.0, 0.01),
        ("resonance-small-low-gain-stable", ("res", 1.0, 1.0, 0.4), (0.3, None, 0.0, None), 1.0, 0.01),
        ("resonance-high-light-unstable", ("res", 1.0, 50.0, 0.002), (0.2, None, 0.0, None), 0.05, 0.01),
        ("resonance-high-light-pi-unstable", ("res", 1.0, 50.0, 0.002), (0.2, 40.0, 0.0, None), 0.3, 0.01),
        ("resonance-high-light-stable", ("res", 1.0, 50.0, 0.002), (0.001, None, 0.0, None), 0.05, 0.01),
        ("resonance-pi-just-stable", ("res", 1.0, 3.0, 0.1), (0.15, 2.0, 0.0, None), 0.2, 0.05),
        ("slow-lag-long-delay-pi-stable", ("fo", 1.0, 200.0), (2.0, 150.0, 0.0, None), 30.0, 0.001),
        ("slow-lag-long-delay-pi-unstable", ("fo", 1.0, 200.0), (14.0, 150.0, 0.0, None), 30.0, 0.001),
        ("high-gain-lag-p-unstable", ("fo", 1.0, 1.0), (25.0, None, 0.0, None), 1.0, 0.01),
        ("high-gain-lag-p-unstable-short-delay", ("fo", 1.0, 1.0), (60.0, None, 0.0, None), 0.2, 0.01),
    ]
    rows = []
    for ident, proc, (k, ti, td, n), dead, slowest in cases:
        pn, pd = process(*proc)
        cn, cd = pid(k, ti, td, n)
        num = np.polymul(cn, pn)
        den = np.polymul(cd, pd)
        count, _ = rhp_count(num, den, dead)
        verdict = "stable" if count == 0 else "unstable"
        rows.append([ident, " ".join(repr(float(x)) for x in num), " ".join(repr(float(x)) for x in den),
                     repr(float(dead)), repr(float(slowest)), verdict, str(count)])
        print(ident, verdict, count)
    with open(OUT, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["id", "num_desc", "den_desc", "dead_time_s", "slowest_rad_s", "verdict", "unstable_poles"])
        w.writerows(rows)


if __name__ == "__main__":
    main()
