#!/usr/bin/env python3
"""Writes the continuous dead-time loop reference: closed-loop poles in the right half plane.

Run from the repository root:  python3 src/test/python/write_delay_loop_golden.py
It writes src/test/resources/org/loopform/analysis/delay-loop-golden.csv (deterministic, seconds).
DelayLoopGoldenTest reads it.

Independent of loopform's Java code: numpy and scipy only.

Loop (all INVENTED): L(s) = R(s) e^(-s L), R = C P, C the ideal PID written from its definition,
C(s) = K (1 + 1/(Ti s) + Td s/(1 + s Td/N)) (no integral when Ti is empty, no derivative when Td
is 0, no filter when N is empty), P a first order, second order, integrating or open-loop unstable
process. The closed-loop poles are the zeros of the entire function F(s) = den R(s) + num R(s) e^(-s L),
which has no poles, so the number of zeros inside a closed contour is the turn of F around it
(the argument principle; Astrom and Murray, Feedback Systems, 2008, ch. 9, the Nyquist criterion -
from memory for the section). A zero with Re s >= 0 needs |R(s)| >= 1 (|e^(-s L)| <= 1 there),
so for a strictly proper R, or a biproper R whose high-frequency gain is below 1, every such zero
lies inside the half disc |s| < rho where |R| < 1 on and beyond its arc (rho starts at twice the
largest pole or zero of R and doubles until |R| < 0.9 on 400 half circles over [rho, 1000 rho]);
the contour is the rectangle
[eps, rho] x [-rho, rho], eps = 1e-9 rad/s, walked with steps bisected until arg F moves less
than 0.2 rad; the count must come out within 1e-6 of a whole number. Without dead time the count is
that of numpy.roots of den R + num R with a positive real part.

Rows with a known answer by hand derivation:
- an integrator with dead time under proportional control, K/s e^(-s L): the characteristic
  equation s + K e^(-s L) = 0 has a root at s = i pi/(2 L) when K = pi/(2 L) (marginal); below it
  stable, above it unstable (two roots, a conjugate pair, just above);
- a biproper loop whose high-frequency gain is c (a derivative without a filter on a first-order
  process): the neutral chain of roots lies at Re s = ln|c|/L (Hale and Verduyn Lunel, Introduction to
  Functional Differential Equations, 1993, ch. 9 - from memory), so c > 1 is unstable with
  infinitely many poles and c = 1 marginal; these rows carry the verdict only.
"""
import csv
import os

import numpy as np

OUT = os.path.join("src", "test", "resources", "org", "loopform", "analysis", "delay-loop-golden.csv")
EPS = 1e-9


def pid(k, ti, td, n):
    """num, den (descending) of K (1 + 1/(Ti s) + Td s/(1 + s Td/N))."""
    num = np.array([float(k)])
    den = np.array([1.0])
    if ti is not None:
        num = np.polyadd(np.polymul(num, [ti, 0.0]), [k])
        den = np.array([ti, 0.0])
    if td > 0:
        tf = 0.0 if n is None else td / n
        filt = [tf, 1.0] if tf > 0 else [1.0]
        num = np.polyadd(np.polymul(num, filt), np.polymul([k * td, 0.0], den))
        den = np.polymul(den, filt)
    return np.trim_zeros(num, "f"), np.trim_zeros(den, "f")


def rhp_count(num, den, dead):
    if dead == 0:
        roots = np.roots(np.polyadd(den, num))
        return int(np.sum(roots.real > EPS)), float(np.max(roots.real)) if len(roots) else None

    def r(s):
        return np.polyval(num, s) / np.polyval(den, s)

    def f(s):
        return np.polyval(den, s) + np.polyval(num, s) * np.exp(-s * dead)

    # start past every pole and zero of R and check |R| on 400 half circles out to 1000 rho: a few
    # radii alone can pass between them over a lightly damped resonance and leave its zeros outside
    rho = 2 * max([abs(x) for x in np.roots(den)] + [abs(x) for x in np.roots(num)] + [1.0])
    angles = np.linspace(-np.pi / 2, np.pi / 2, 2001)
    while max(np.max(np.abs(r(radius * np.exp(1j * angles)))) for radius in np.geomspace(rho, 1000 * rho, 400)) >= 0.9:
        rho *= 2
    rho *= 1.5
    corners = [EPS - 1j * rho, rho - 1j * rho, rho + 1j * rho, EPS + 1j * rho, EPS - 1j * rho]
    total = 0.0
    for a, b in zip(corners[:-1], corners[1:]):
        t = list(np.linspace(0.0, 1.0, 4001))
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
    return int(whole), None


def process(kind, *p):
    if kind == "fo":
        return [p[0]], [p[1], 1.0]
    if kind == "so":
        return [p[0]], np.polymul([p[1], 1.0], [p[2], 1.0])
    if kind == "int":
        return ([p[0]], [1.0, 0.0]) if len(p) == 1 else ([p[0]], [p[1], 1.0, 0.0])
    if kind == "unst":
        return [p[0]], [p[1], -1.0]
    if kind == "res":
        k, wn, z = p
        return [k * wn * wn], [1.0, 2 * z * wn, wn * wn]
    raise ValueError(kind)


def main():
    cases = [
        # id, process, (K, Ti, Td, N), dead time s, slowest rad/s
        ("fopdt-pi-stable", ("fo", 1.0, 10.0), (1.5, 8.0, 0.0, None), 2.0, 0.01),
        ("fopdt-pi-unstable", ("fo", 1.0, 10.0), (8.0, 8.0, 0.0, None), 2.0, 0.01),
        ("fopdt-pid-stable", ("fo", 2.0, 5.0), (1.5, 5.0, 1.0, 10.0), 1.0, 0.02),
        ("fopdt-pid-unstable", ("fo", 2.0, 5.0), (6.0, 5.0, 1.0, 10.0), 1.0, 0.02),
        ("sopdt-pid-stable", ("so", 1.0, 6.0, 2.0), (2.5, 7.0, 1.5, 10.0), 1.5, 0.01),
        ("sopdt-pid-unstable-long-delay", ("so", 1.0, 6.0, 2.0), (2.5, 7.0, 1.5, 100.0), 6.0, 0.01),
        ("resonant-pi-unstable", ("res", 1.0, 2.0, 0.05), (0.6, 1.5, 0.0, None), 0.3, 0.05),
        ("resonant-pi-stable", ("res", 1.0, 2.0, 0.05), (0.05, 1.5, 0.0, None), 0.3, 0.05),
        ("integrating-pi-stable", ("int", 0.1), (2.0, 20.0, 0.0, None), 3.0, 0.005),
        ("integrating-lag-pid-stable", ("int", 0.2, 2.0), (1.5, 12.0, 1.0, 10.0), 1.5, 0.005),
        ("integrating-pi-unstable", ("int", 0.5), (3.0, 4.0, 0.0, None), 2.0, 0.01),
        ("open-loop-unstable-pi-stable", ("unst", 1.0, 10.0), (3.0, 15.0, 0.0, None), 1.0, 0.005),
        ("open-loop-unstable-low-gain", ("unst", 1.0, 10.0), (0.7, 15.0, 0.0, None), 1.0, 0.005),
        ("open-loop-unstable-p-only", ("unst", 1.0, 10.0), (0.5, None, 0.0, None), 1.0, 0.01),
        ("open-loop-unstable-pid-long-delay", ("unst", 2.0, 5.0), (1.2, 8.0, 0.5, 10.0), 4.0, 0.01),
        ("integrator-p-below", ("int", 1.0), (0.9 * np.pi / 4, None, 0.0, None), 2.0, 0.01),
        ("integrator-p-above", ("int", 1.0), (1.1 * np.pi / 4, None, 0.0, None), 2.0, 0.01),
        ("integrator-p-at-ultimate", ("int", 1.0), (np.pi / 4, None, 0.0, None), 2.0, 0.01),
        ("biproper-below-one", ("fo", 1.0, 1.0), (0.3, None, 2.0, None), 0.5, 0.1),
        ("biproper-above-one", ("fo", 1.0, 1.0), (0.3, None, 4.0, None), 0.5, 0.1),
        ("biproper-at-one", ("fo", 1.0, 1.0), (0.5, None, 2.0, None), 0.5, 0.1),
        ("delay-free-pid-stable", ("so", 1.0, 6.0, 2.0), (2.5, 7.0, 1.5, 10.0), 0.0, 0.01),
        ("delay-free-unstable-process-p", ("unst", 1.0, 10.0), (0.5, None, 0.0, None), 0.0, 0.01),
        ("delay-free-resonant-pi-unstable", ("res", 1.0, 2.0, 0.05), (0.6, 0.2, 0.0, None), 0.0, 0.05),
    ]
    rows = []
    for ident, proc, (k, ti, td, n), dead, slowest in cases:
        pn, pd = process(*proc)
        cn, cd = pid(k, ti, td, n)
        num = np.polymul(cn, pn)
        den = np.polymul(cd, pd)
        rel = len(den) - len(num)
        if ident == "integrator-p-at-ultimate":
            # hand derivation above: a root on the axis at s = i pi/(2 L)
            s = 1j * np.pi / (2 * dead)
            assert abs(np.polyval(den, s) + np.polyval(num, s) * np.exp(-s * dead)) < 1e-12
            verdict, count = "marginal", 0
        elif dead > 0 and rel == 0:
            c = abs(num[0] / den[0])
            verdict = "unstable" if c > 1 + 1e-12 else ("marginal" if c >= 1 - 1e-12 else None)
            count = -1 if verdict == "unstable" else 0
            if verdict is None:
                count, _ = rhp_count(num, den, dead)
                verdict = "stable" if count == 0 else "unstable"
        else:
            count, _ = rhp_count(num, den, dead)
            verdict = "stable" if count == 0 else "unstable"
        rows.append([ident, " ".join(repr(float(x)) for x in num), " ".join(repr(float(x)) for x in den),
                     repr(float(dead)), repr(float(slowest)), verdict, str(count)])
        print(ident, verdict, count)
    with open(OUT, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["id", "num_desc", "den_desc", "dead_time_s", "slowest_rad_s", "verdict",
                    "unstable_poles (-1: infinitely many)"])
        w.writerows(rows)


if __name__ == "__main__":
    main()
