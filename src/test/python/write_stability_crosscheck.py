#!/usr/bin/env python3
"""Writes the stability and margin cross-check: loop files and one golden CSV.

Run from the repository root:  python3 src/test/python/write_stability_crosscheck.py
It writes src/test/resources/crosscheck/loops/*.yaml and src/test/resources/crosscheck/golden.csv
(deterministic: a fixed seed; about five minutes on one core).

Independent of loopform's Java code: numpy and scipy only. python-control would be the natural
second opinion, but it is not installable on the machines this project is built on (no PyPI), so
everything below is written out here from the textbook definitions.

Loops (all INVENTED): random first order (FOPDT), second order by damping and natural frequency
(SOPDT), integrating (with and without a lag) and general transfer-function processes, all with
dead time, under ideal PI or PID tunings (filter ratio N in {5, 8, 10, 20, 100}) derived from each
process's own ultimate gain and period with random detuning, and target scans from a
five-hundredth of the ultimate period to nearly all of it; plus the special classes listed in
SPECIAL below (several gain crossovers, lightly damped resonances, integrators with dead time,
conditionally stable loops, phase crossovers at the Nyquist frequency, sampled loops made
unstable by the scan, positive feedback from a negative process gain, N = 100, marginal loops).
The tuning is written in the `ideal` form; the target is `ideal`, `ideal-pb-repeats` (band,
repeats per minute, action flag: the same law and algorithm) or `ideal-velocity` (velocity form,
N fixed at 10: used only for N = 10 or PI, where the conversion is exact).

Design loop (continuous): L(s) = C_y(s) P(s) e^(-s L) with the ideal law written from its
definition, C_y(s) = K (1 + 1/(Ti s) + Td s/(1 + s Td/N)), i.e. (d s + p + i/s)/(1 + Tf s) with
Tf = Td/N, p = K (1 + Tf/Ti), i = K/Ti, d = K (Tf + Td) (Astrom and Hagglund, PID Controllers,
2nd ed., ISA 1995, ch. 3 - from memory for the section).

Target loop (sampled, scan h): the process put into state space (scipy.signal.tf2ss) and sampled
through a zero-order hold exactly, with the dead time L = d h + tau (0 <= tau < h) by state
augmentation, x(k+1) = Phi x(k) + Gamma0 u(k-d) + Gamma1 u(k-d-1), Gamma0 = Gamma(h - tau),
Gamma1 = Phi(h - tau) Gamma(tau), Phi(t) and Gamma(t) read off scipy.linalg.expm of
[[A t, B t], [0, 0]] (Astrom and Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 2,
sampling a system with a time delay - from memory); checked here against
scipy.signal.cont2discrete. The controller is the catalog forms' algorithm (positional or
velocity; backward-difference integral, I(k) = I(k-1) + (K/Ti) h e(k); backward-difference
filtered derivative D(k) = a D(k-1) + g (x(k) - x(k-1)), a = Tf/(Tf + h), g = 1/(Tf + h), and
1/h without a filter; Wittenmark, Astrom and Arzen, "Computer Control: An Overview", IFAC
Professional Brief, 2002, Table 3). Its pulse transfer function
C_y(z) = K + (K/Ti) h z/(z - 1) + K Td g (z - 1)/(z - a) is checked here against a scan-by-scan
run of the algorithm's own equations.

Stability.
- Target: the closed-loop state matrix (process states, the delay line u(k-1)..u(k-d-1), the
  controller's states) and its eigenvalues by numpy.linalg.eigvals: `stable` when the largest
  magnitude is below 1 - 1e-9, `marginal` within 1e-9 of 1, `unstable` above.
- Design: the number of closed-loop poles in the right half plane by the argument principle
  (Astrom and Murray, Feedback Systems, 2008, ch. 9, the Nyquist criterion - from memory for the
  section) applied to the characteristic quasi-polynomial F(s) = Dc Dp + Nc Np e^(-s L), which has
  no poles, so no open-loop pole needs counting: Z = n/2 - (arg F(i inf) - arg F(0))/pi, n the
  degree of Dc Dp, with arg F unwrapped on a grid refined until it moves less than 0.3 rad
  between points, and the tail beyond the grid added from the roots of Dc Dp (|L| < 1 there). Z
  must come out within 1e-6 of an integer. Confirmed for every loop by the eigenvalues of the loop
  sampled at a fine step (0.02 / the highest frequency with |L| >= 0.5, at most 1,000
  delay states): the same count of eigenvalues outside the unit circle. `marginal` when
  min |1 + L(i w)| < 1e-7.

Margins (definitions after Astrom and Murray 2008, section 9.3; for sampled loops Astrom and
Wittenmark 1997, ch. 7 - both from memory for the section), on a grid that starts with 1,000
points a decade (plus linear steps of 0.5/L rad/s where the dead time turns the phase) and is
bisected until neighbouring points differ by less than 0.02 rad in phase and 2 % in |L|, then:
- gain crossovers: every sign change of |L| - 1, refined by scipy.optimize.brentq (xtol 1e-15,
  rtol 1e-15); each local extremum of |L| closer than 5 % to 1 is refined by
  scipy.optimize.minimize_scalar to catch two crossovers between grid points;
- phase crossovers (-180 deg mod 360): every pass of L across the negative real axis, found as a
  jump of numpy.angle by more than pi and refined by brentq on angle(-L); near-tangent passes as
  above; for the sampled loop the Nyquist frequency itself (z = -1, where L is real) is a phase
  crossover when L(-1) < 0;
- gain margin: the smallest 1/|L| > 1 over the phase crossovers; lower gain margin: the largest
  1/|L| < 1; phase margin: 180 deg + arg L wrapped into (-180, 180] at the gain crossover where
  it is smallest in size (the crossover nearest -1, needing the least lag or lead to reach it),
  with its sign; delay margin: the smallest over the gain crossovers of ((180 deg + arg L) mod 360,
  in rad) / w; Ms: the largest 1/|1 + L| (grid, then minimize_scalar around the best minima of
  |1 + L| and the band ends). Empty in the CSV where the quantity does not exist.
- band: the design loop from 1e-3 times its lowest corner frequency to beyond the frequency
  where |L| has fallen, monotonically, so far that neither a larger 1/|L| < 1 nor a larger Ms can
  lie further up (one whole turn of the dead time past it is included, so the first phase
  crossover of the tail, the largest of the tail, is seen); the sampled loop to pi/h.
Accuracy: crossings to about 1e-13 relative in frequency; margins and Ms to 1e-10 relative or
better, which is far inside the test's 1e-6. Loops whose figures are fragile (a closed-loop pole
within 1e-3 of the stability boundary, a crossing near a tangency, the two stability methods
disagreeing) are discarded and redrawn for the random classes; the special loops must pass.
The margins are written for unstable loops too (they are properties of the frequency response);
for marginal loops they are left empty and not compared.
"""
import csv
import math
import os
import sys

import numpy as np
from scipy.linalg import expm
from scipy.optimize import brentq, minimize_scalar
from scipy.signal import cont2discrete, lfilter, tf2ss

SEED = 20260607
OUT_DIR = os.path.join("src", "test", "resources", "crosscheck")
LOOP_DIR = os.path.join(OUT_DIR, "loops")

POINTS_PER_DECADE = 1000
MAX_PHASE_STEP_RAD = 0.02
MAX_LOG_MAGNITUDE_STEP = 0.02
# where |L| < QUIET the grid need only keep the phase step below QUIET_PHASE_STEP_RAD (< pi, so
# no pass of the negative real axis is lost); a gain margin above 1/QUIET = 20 found there is
# exact, but a near-tangent pair of passes that far out is not searched for
QUIET = 0.05
QUIET_PHASE_STEP_RAD = 1.0
MARGINAL_POLE = 1e-9
MARGINAL_RETURN_DIFFERENCE = 1e-7
FRAGILE = 1e-3
FINE_STEP_MAX_DELAY_STATES = 1000

RANDOM_COUNTS = {"fopdt": 48, "sopdt": 44, "integrating": 40, "tf": 44}


# ---------------------------------------------------------------- loop description

def sig(x, digits=6):
    return float("%.*g" % (digits, x))


class Fragile(Exception):
    """The loop's figures sit too close to a boundary to be a fair test."""


def make_loop(name, klass, note, process, kc, ti, td, n, target, scan):
    """process: dict(model=..., num=[...], den=[...], dead=L, yaml='{...}')."""
    return dict(name=name, klass=klass, note=note, process=process, kc=float(kc), ti=float(ti), td=float(td),
                n=float(n), target=target, scan=float(scan))


def fopdt(k, t, dead):
    k, t, dead = sig(k), sig(t), sig(dead)
    return dict(model="fopdt", num=[k], den=[t, 1.0], dead=dead,
                yaml="{model: fopdt, gain: %r, time_constant: %r s, dead_time: %r s}" % (k, t, dead))


def sopdt(k, zeta, wn, dead):
    k, zeta, wn, dead = sig(k), sig(zeta), sig(wn), sig(dead)
    t = 1.0 / wn  # the model's standard form K / (T^2 s^2 + 2 zeta T s + 1), T = 1/wn
    return dict(model="sopdt", num=[k], den=[t * t, 2 * zeta * t, 1.0], dead=dead,
                yaml="{model: sopdt, gain: %r, damping: %r, natural_frequency: %r rad/s, dead_time: %r s}"
                     % (k, zeta, wn, dead))


def integrating(k, dead, lag=0.0):
    k, dead, lag = sig(k), sig(dead), sig(lag)
    den = [lag, 1.0, 0.0] if lag > 0 else [1.0, 0.0]
    lag_text = ", lag: %r s" % lag if lag > 0 else ""
    return dict(model="integrating", num=[k], den=den, dead=dead,
                yaml="{model: integrating, gain: %r%s, dead_time: %r s}" % (k, lag_text, dead))


def general_tf(num, den, dead):
    num = [sig(c, 8) for c in num]
    den = [sig(c, 8) for c in den]
    dead = sig(dead)
    return dict(model="tf", num=num, den=den, dead=dead,
                yaml="{model: tf, num: [%s], den: [%s], dead_time: %r s}"
                     % (", ".join(repr(c) for c in num), ", ".join(repr(c) for c in den), dead))


# ---------------------------------------------------------------- the design loop

def controller_terms(lp):
    """(p, i, d, tf) of C_y = (d s + p + i/s)/(1 + tf s) for the ideal law."""
    k, ti, td = lp["kc"], lp["ti"], lp["td"]
    tf = td / lp["n"] if td > 0 else 0.0
    i = k / ti if ti > 0 else 0.0
    p = k + tf * i
    d = k * (tf + td)
    return p, i, d, tf


def controller_polynomials(lp):
    """C_y(s) = Nc(s)/Dc(s), highest power first, no common factor."""
    p, i, d, tf = controller_terms(lp)
    filter_den = np.array([tf, 1.0]) if tf > 0 else np.array([1.0])
    if i != 0:
        num = np.array([d, p, i]) if d != 0 else np.array([p, i])
        return num, np.polymul(filter_den, [1.0, 0.0])
    num = np.array([d, p]) if d != 0 else np.array([p])
    return num, filter_den


def controller_s(lp, s):
    """The ideal law from its definition, K (1 + 1/(Ti s) + Td s/(1 + s Td/N))."""
    k, ti, td, n = lp["kc"], lp["ti"], lp["td"], lp["n"]
    c = np.full(s.shape, k, dtype=complex)
    if ti > 0:
        c = c + k / (ti * s)
    if td > 0:
        c = c + k * td * s / (1 + s * td / n)
    return c


def process_s(lp, s):
    pr = lp["process"]
    return np.polyval(pr["num"], s) / np.polyval(pr["den"], s) * np.exp(-s * pr["dead"])


def design_response(lp):
    def response(w):
        s = 1j * np.asarray(w, dtype=float)
        return controller_s(lp, s) * process_s(lp, s)
    return response


def corner_frequencies(lp):
    """Moduli of the nonzero poles and zeros of process and controller, and 1/L."""
    pr = lp["process"]
    nc, dc = controller_polynomials(lp)
    roots = np.concatenate([np.roots(pr["num"]), np.roots(pr["den"]), np.roots(nc), np.roots(dc)])
    mods = [abs(r) for r in roots if abs(r) > 1e-12]
    if pr["dead"] > 0:
        mods.append(1.0 / pr["dead"])
    if not mods:
        mods = [1.0]  # a loop of integrators alone: any decade will do as the centre
    return min(mods), max(mods)


# ---------------------------------------------------------------- the target loop

def process_state_space(lp):
    pr = lp["process"]
    a, b, c, d = tf2ss(pr["num"], pr["den"])
    assert np.allclose(d, 0), "strictly proper processes only"
    return a, b, c


def hold_matrices(a, b, t):
    """Phi(t), Gamma(t) of a zero-order hold over t seconds, by expm of the augmented matrix."""
    nx = a.shape[0]
    m = np.zeros((nx + 1, nx + 1))
    m[:nx, :nx] = a * t
    m[:nx, nx:] = b * t
    e = expm(m)
    return e[:nx, :nx], e[:nx, nx:]


def split_delay(dead, h):
    d = int(math.floor(dead / h + 1e-12))
    tau = dead - d * h
    if tau < 1e-12 * h:
        tau = 0.0
    return d, tau


def sampled_process(a, b, c, dead, h):
    """Phi, Gamma0, Gamma1, C, d for x(k+1) = Phi x + Gamma0 u(k-d) + Gamma1 u(k-d-1)."""
    d, tau = split_delay(dead, h)
    phi, gamma_h = hold_matrices(a, b, h)
    if tau == 0.0:
        return phi, gamma_h, np.zeros_like(gamma_h), c, d
    phi_rest, gamma0 = hold_matrices(a, b, h - tau)
    _, gamma_tau = hold_matrices(a, b, tau)
    return phi, gamma0, phi_rest @ gamma_tau, c, d


def check_hold_against_scipy(a, b, c, h):
    phi, gamma = hold_matrices(a, b, h)
    sp = cont2discrete((a, b, c, np.zeros((1, 1))), h, method="zoh")
    scale = max(1.0, np.max(np.abs(sp[1])))
    assert np.max(np.abs(phi - sp[0])) < 1e-9 * max(1.0, np.max(np.abs(sp[0]))), "Phi"
    assert np.max(np.abs(gamma - sp[1])) < 1e-9 * scale, "Gamma"


def discrete_controller(lp, h):
    """(Nc(z), Dc(z)) of the backward-difference PID, highest power of z first, no common factor."""
    k, ti, td = lp["kc"], lp["ti"], lp["td"]
    tf = td / lp["n"] if td > 0 else 0.0
    ki = k / ti if ti > 0 else 0.0
    kd = k * td
    a = tf / (tf + h)
    g = 1.0 / (tf + h)
    zm1 = np.array([1.0, -1.0])
    zma = np.array([1.0, -a])
    if ki != 0 and kd != 0:
        den = np.polymul(zm1, zma)
        num = np.polyadd(np.polyadd(k * den, ki * h * np.polymul([1.0, 0.0], zma)), kd * g * np.polymul(zm1, zm1))
    elif ki != 0:
        den = zm1
        num = np.polyadd(k * zm1, ki * h * np.array([1.0, 0.0]))
    elif kd != 0:
        den = zma
        num = np.polyadd(k * zma, kd * g * zm1)
    else:
        den, num = np.array([1.0]), np.array([k])
    return np.atleast_1d(num), np.atleast_1d(den)


def run_algorithm(lp, h, y, velocity):
    """The target's own scan equations with r = 0 (so e = -y), no limits: the output u(k)."""
    k, ti, td = lp["kc"], lp["ti"], lp["td"]
    tf = td / lp["n"] if td > 0 else 0.0
    ki = k / ti if ti > 0 else 0.0
    kd = k * td
    a, g = tf / (tf + h), 1.0 / (tf + h)
    integral, dstate, prev_y, prev_p, prev_dterm, u_prev = 0.0, 0.0, 0.0, 0.0, 0.0, 0.0
    out = np.zeros(len(y))
    for j, yk in enumerate(y):
        dstate = a * dstate + g * (yk - prev_y)
        e = -yk
        p = k * e
        dterm = -kd * dstate
        inc = ki * h * e
        if velocity:
            u = u_prev + (p - prev_p) + inc + (dterm - prev_dterm)
        else:
            integral += inc
            u = p + integral + dterm
        out[j] = u
        prev_y, prev_p, prev_dterm, u_prev = yk, p, dterm, u
    return out


def check_controller(lp, h):
    num, den = discrete_controller(lp, h)
    y = np.random.default_rng(3).standard_normal(300)
    expected = -lfilter(num, den, y)
    for velocity in (False, True):
        got = run_algorithm(lp, h, y, velocity)
        assert np.max(np.abs(got - expected)) < 1e-8 * max(1.0, np.max(np.abs(expected))), (lp["name"], velocity)


def closed_loop_matrix(phi, gamma0, gamma1, c, d, cnum, cden):
    """Closed loop of the sampled process and u = -C(z) y, the delay line u(k-1)..u(k-d-1) as states."""
    nx = phi.shape[0]
    if len(cden) > 1:
        ac, bc, cc, dc = tf2ss(cnum, cden)
    else:
        ac, bc, cc, dc = np.zeros((0, 0)), np.zeros((0, 1)), np.zeros((1, 0)), np.array([[cnum[0] / cden[0]]])
    nc = ac.shape[0]
    nl = d + 1
    size = nx + nl + nc
    m = np.zeros((size, size))
    ix, il, ic = slice(0, nx), slice(nx, nx + nl), slice(nx + nl, size)
    # u(k) = -(cc xc + dc c x) as a row over the state
    urow = np.zeros(size)
    urow[ix] = -(dc @ c).ravel()
    urow[ic] = -cc.ravel()

    def lagged(j):  # the row that gives u(k - j)
        if j == 0:
            return urow
        r = np.zeros(size)
        r[nx + j - 1] = 1.0
        return r
    m[ix, ix] = phi
    m[ix, :] += gamma0 @ lagged(d)[None, :]
    m[ix, :] += gamma1 @ lagged(d + 1)[None, :]
    m[nx, :] = urow
    for j in range(1, nl):
        m[nx + j, nx + j - 1] = 1.0
    if nc:
        m[ic, ic] = ac
        m[ic, ix] += bc @ c
    return m


def sampled_frequency_response(phi, gamma0, gamma1, c, d, h, cnum, cden):
    eye = np.eye(phi.shape[0])

    def response(w):
        w = np.atleast_1d(np.asarray(w, dtype=float))
        z = np.exp(1j * w * h)
        z = np.where(np.abs(w * h - math.pi) < 1e-13, -1.0 + 0j, z)
        q = 1 / z
        mats = z[:, None, None] * eye[None, :, :] - phi[None, :, :]
        rhs = gamma0[None, :, :] + gamma1[None, :, :] * q[:, None, None]
        x = np.linalg.solve(mats, rhs)
        p = (c[None, :, :] @ x)[:, 0, 0] * q ** d
        cz = np.polyval(cnum, z) / np.polyval(cden, z)
        return cz * p
    return response


def target_loop(lp):
    h = lp["scan"]
    a, b, c = process_state_space(lp)
    check_hold_against_scipy(a, b, c, h)
    check_controller(lp, h)
    phi, gamma0, gamma1, c, d = sampled_process(a, b, c, lp["process"]["dead"], h)
    cnum, cden = discrete_controller(lp, h)
    m = closed_loop_matrix(phi, gamma0, gamma1, c, d, cnum, cden)
    rho = float(np.max(np.abs(np.linalg.eigvals(m))))
    response = sampled_frequency_response(phi, gamma0, gamma1, c, d, h, cnum, cden)
    return rho, response


# ---------------------------------------------------------------- grids and crossings

def initial_grid(lo, hi, dead):
    decades = math.log10(hi / lo)
    w = np.geomspace(lo, hi, max(200, int(POINTS_PER_DECADE * decades)))
    if dead > 0:
        start = max(lo, 1.0 / dead)
        if start < hi:
            w = np.union1d(w, np.arange(start, hi, 0.5 / dead))
    w[0], w[-1] = lo, hi
    return np.unique(w)


def refine(response, w, values, bad_fn, max_rounds=40):
    for _ in range(max_rounds):
        bad = bad_fn(values)
        if not bad.any():
            return w, values
        mids = np.sqrt(w[:-1][bad] * w[1:][bad])
        wm = response(mids)
        w = np.concatenate([w, mids])
        values = np.concatenate([values, wm])
        order = np.argsort(w)
        w, values = w[order], values[order]
    raise Fragile("grid refinement did not settle")


def loop_grid(response, lo, hi, dead):
    w = initial_grid(lo, hi, dead)
    l = response(w)

    def bad(l):
        ratio = l[1:] / l[:-1]
        loud = np.maximum(np.abs(l[1:]), np.abs(l[:-1])) > QUIET
        step = np.where(loud, MAX_PHASE_STEP_RAD, QUIET_PHASE_STEP_RAD)
        return (np.abs(np.angle(ratio)) > step) | (loud & (np.abs(np.log(np.abs(ratio))) > MAX_LOG_MAGNITUDE_STEP))
    return refine(response, w, l, bad)


def at(response, x):
    return complex(response(np.array([x]))[0])


def gain_crossovers(response, w, l):
    f = lambda x: math.log(abs(at(response, x)))
    mag = np.log(np.abs(l))
    found = []
    for k in np.nonzero(np.diff(np.sign(mag)))[0]:
        if mag[k] == 0.0:
            found.append(w[k])
            continue
        found.append(brentq(f, w[k], w[k + 1], xtol=1e-15 * w[k], rtol=1e-15))
    # extrema of |L| close to 1: two crossings may hide between grid points
    mid = mag[1:-1]
    ext = ((mid >= mag[:-2]) & (mid >= mag[2:])) | ((mid <= mag[:-2]) & (mid <= mag[2:]))
    for k in np.nonzero(ext & (np.abs(mid) <= 0.05))[0] + 1:
        lm = mag[k]
        is_max = lm >= mag[k - 1] and lm >= mag[k + 1]
        sign = -1.0 if is_max else 1.0
        res = minimize_scalar(lambda x: sign * f(x), bounds=(w[k - 1], w[k + 1]), method="bounded",
                              options={"xatol": 1e-14 * w[k]})
        ext = f(res.x)
        if abs(ext) < 1e-6:
            raise Fragile("|L| touches 1 at %.6g rad/s" % res.x)
        if np.sign(ext) != np.sign(lm) and np.sign(mag[k - 1]) == np.sign(lm) and np.sign(mag[k + 1]) == np.sign(lm):
            found.append(brentq(f, w[k - 1], res.x, xtol=1e-15 * w[k], rtol=1e-15))
            found.append(brentq(f, res.x, w[k + 1], xtol=1e-15 * w[k], rtol=1e-15))
    return sorted(found)


def phase_crossovers(response, w, l):
    """Passes of L across the negative real axis inside the grid (not its end points)."""
    f = lambda x: float(np.angle(-at(response, x)))
    u = np.angle(-l)  # 0 on the negative real axis, continuous there
    found = []
    jumps = np.abs(np.diff(np.angle(l))) > math.pi
    for k in np.nonzero(jumps)[0]:
        if u[k] == 0.0:
            found.append(w[k])
            continue
        found.append(brentq(f, w[k], w[k + 1], xtol=1e-15 * w[k], rtol=1e-15))
    near = np.abs(u) < 0.05
    mid = u[1:-1]
    ext = ((mid >= u[:-2]) & (mid >= u[2:])) | ((mid <= u[:-2]) & (mid <= u[2:]))
    for k in np.nonzero(ext & near[1:-1] & near[:-2] & near[2:])[0] + 1:
        is_max = u[k] >= u[k - 1] and u[k] >= u[k + 1]
        sign = -1.0 if is_max else 1.0
        res = minimize_scalar(lambda x: sign * f(x), bounds=(w[k - 1], w[k + 1]), method="bounded",
                              options={"xatol": 1e-14 * w[k]})
        ext = f(res.x)
        if abs(ext) < 1e-7:
            raise Fragile("the phase touches -180 deg at %.6g rad/s" % res.x)
        if np.sign(ext) != np.sign(u[k]) and np.sign(u[k - 1]) == np.sign(u[k]) == np.sign(u[k + 1]):
            found.append(brentq(f, w[k - 1], res.x, xtol=1e-15 * w[k], rtol=1e-15))
            found.append(brentq(f, res.x, w[k + 1], xtol=1e-15 * w[k], rtol=1e-15))
    return sorted(found)


def sensitivity_peak(response, w, l, extra=()):
    rd = np.abs(1 + l)
    candidates = []
    interior = np.nonzero((rd[1:-1] <= rd[:-2]) & (rd[1:-1] <= rd[2:]))[0] + 1
    best = sorted(interior, key=lambda k: rd[k])[:6]
    for k in best:
        res = minimize_scalar(lambda x: abs(1 + at(response, x)), bounds=(w[k - 1], w[k + 1]), method="bounded",
                              options={"xatol": 1e-14 * w[k]})
        candidates.append((min(res.fun, rd[k]), res.x if res.fun < rd[k] else w[k]))
    candidates.append((rd[0], w[0]))
    candidates.append((rd[-1], w[-1]))
    candidates.extend(extra)
    value, where = min(candidates)
    return 1.0 / value, where


def margins_from(response, w, l, gain_x, phase_x):
    """phase_x: list of (frequency, L value) at the phase crossovers."""
    pm, pm_w, dm = None, None, None
    for x in gain_x:
        phi = float(np.angle(at(response, x)))
        raw = phi + math.pi  # in (0, 2 pi]
        wrapped = raw - 2 * math.pi if raw > math.pi else raw
        if abs(wrapped) < FRAGILE * 1e-3:
            raise Fragile("a gain crossover sits on -180 deg")
        deg = math.degrees(wrapped)
        if pm is None or abs(deg) < abs(pm):
            pm, pm_w = deg, x  # the crossover nearest -1: the smallest phase change, lag or lead
        delay = (raw % (2 * math.pi)) / x
        dm = delay if dm is None else min(dm, delay)
    gm, gm_w, lgm, lgm_w = None, None, None, None
    for x, value in phase_x:
        g = 1.0 / abs(value)
        if abs(g - 1.0) < 1e-6:
            raise Fragile("a phase crossover sits on the unit circle")
        if g > 1 and (gm is None or g < gm):
            gm, gm_w = g, x
        if g < 1 and (lgm is None or g > lgm):
            lgm, lgm_w = g, x
    return dict(gain_margin=gm, gain_margin_rad_s=gm_w, lower_gain_margin=lgm, lower_gain_margin_rad_s=lgm_w,
                phase_margin_deg=pm, crossover_rad_s=pm_w, delay_margin_s=dm,
                gain_crossovers=len(gain_x), phase_crossovers=len(phase_x))


# ---------------------------------------------------------------- design loop: margins and stability

def design_band(lp):
    """Band bottom, and the frequency beyond which |L| falls monotonically and stays small."""
    low_corner, high_corner = corner_frequencies(lp)
    lo = low_corner * 1e-3
    response = design_response(lp)
    top = high_corner * 100.0
    while abs(at(response, top)) > 0.5:
        top *= 10.0
    return lo, top


def design_figures(lp):
    response = design_response(lp)
    dead = lp["process"]["dead"]
    lo, top = design_band(lp)
    for _ in range(12):
        hi = top + (1.2 * 2 * math.pi / dead if dead > 0 else 9 * top)
        w, l = loop_grid(response, lo, hi, dead)
        tail = np.abs(l[w >= top])
        if np.any(np.diff(tail) > 1e-12 * tail[:-1]):
            raise Fragile("|L| is not monotone in the tail")
        ms, ms_w = sensitivity_peak(response, w, l)
        tail_bound = 1.0 / (1.0 - abs(l[-1])) if abs(l[-1]) < 1 else math.inf
        if tail_bound < ms * (1 - 1e-12):
            break
        if abs(l[-1]) < 1e-10:
            # |S| stays within 1e-10 of 1 beyond the band, and tends to 1: Ms is at least that limit
            ms, ms_w = max(ms, 1.0), (ms_w if ms >= 1.0 else math.inf)
            break
        top *= 10.0
    else:
        raise Fragile("the design band did not close")
    min_return = min_return_difference(response, w, l)
    if min_return < MARGINAL_RETURN_DIFFERENCE:
        return dict(stability="marginal", rhp_poles=None)
    if min_return < 10 * FRAGILE and lp.get("random"):
        raise Fragile("a closed-loop pole near the imaginary axis (min |1 + L| = %.3g)" % min_return)
    rhp = argument_principle(lp, w)
    fine = fine_step_count(lp, w, l)
    if rhp != fine:
        raise Fragile("argument principle %d against fine-step eigenvalues %d" % (rhp, fine))
    gain_x = gain_crossovers(response, w, l)
    phase_w = phase_crossovers(response, w, l)
    if dead > 0 and not any(x >= top for x in phase_w):
        raise Fragile("no phase crossover seen in the tail turn")
    figures = margins_from(response, w, l, gain_x, [(x, at(response, x)) for x in phase_w])
    figures["ms"], figures["ms_rad_s"] = ms, ms_w
    figures["rhp_poles"] = rhp
    figures["stability"] = "stable" if rhp == 0 else "unstable"
    return figures


def min_return_difference(response, w, l):
    """min |1 + L| over the band: the grid, then refined around its smallest value."""
    rd = np.abs(1 + l)
    k = int(np.argmin(rd))
    lo, hi = w[max(k - 1, 0)], w[min(k + 1, len(w) - 1)]
    res = minimize_scalar(lambda x: abs(1 + at(response, x)), bounds=(lo, hi), method="bounded",
                          options={"xatol": 1e-15 * w[k]})
    return min(res.fun, rd[k])


def argument_principle(lp, w_grid):
    """The number of right-half-plane zeros of F(s) = Dc Dp + Nc Np e^(-sL)."""
    pr = lp["process"]
    nc, dc = controller_polynomials(lp)
    num = np.polymul(nc, pr["num"])
    den = np.polymul(dc, pr["den"])
    dead = pr["dead"]

    def f(w):
        s = 1j * np.asarray(w, dtype=float)
        return np.polyval(den, s) + np.polyval(num, s) * np.exp(-s * dead)
    w = np.concatenate([[0.0], w_grid])
    values = f(w)

    def bad(v):
        return np.abs(np.angle(v[1:] / v[:-1])) > 0.3
    # refine() bisects geometrically; keep w = 0 out of it
    w_pos, v_pos = refine(f, w[1:], values[1:], bad)
    first = np.angle(v_pos[0] / values[0])
    assert abs(first) < 0.3, "F moves too much below the band bottom"
    delta = first + float(np.sum(np.angle(v_pos[1:] / v_pos[:-1])))
    top = w_pos[-1]
    roots = np.roots(den)
    tail = float(np.sum(math.pi / 2 - np.angle(1j * top - roots)))
    l_top = at(design_response(lp), top)
    tail -= float(np.angle(1 + l_top))
    n = len(den) - 1
    z = n / 2.0 - (delta + tail) / math.pi
    if abs(z - round(z)) > 1e-6:
        raise Fragile("argument principle count %.9f is not an integer" % z)
    return int(round(z))


def fine_step_count(lp, w, l):
    """Eigenvalues outside the unit circle of the design loop sampled at a fine step."""
    pr = lp["process"]
    dead = pr["dead"]
    nc, dc = controller_polynomials(lp)
    a, b, c = process_state_space(lp)
    if len(dc) > 1:
        ac, bc, cc, dcc = tf2ss(nc, dc)
    else:
        ac, bc, cc, dcc = np.zeros((0, 0)), np.zeros((0, 1)), np.zeros((1, 0)), np.array([[nc[0] / dc[0]]])
    na, nca = a.shape[0], ac.shape[0]
    # open loop e -> controller -> process -> y
    ag = np.zeros((na + nca, na + nca))
    ag[:nca, :nca] = ac
    ag[nca:, :nca] = b @ cc
    ag[nca:, nca:] = a
    bg = np.vstack([bc, b @ dcc])
    cg = np.hstack([np.zeros((1, nca)), c])
    loud = w[np.abs(l) >= 0.5]
    w_rel = loud.max() if len(loud) else w[0]
    step = 0.02 / w_rel
    if dead > 0:
        step = max(step, dead / FINE_STEP_MAX_DELAY_STATES)
    phi, gamma0, gamma1, cgd, d = sampled_process(ag, bg, cg, dead, step)
    m = closed_loop_matrix(phi, gamma0, gamma1, cgd, d, np.array([1.0]), np.array([1.0]))
    eig = np.abs(np.linalg.eigvals(m))
    return int(np.sum(eig > 1.0))


# ---------------------------------------------------------------- target loop: margins and stability

from delay_margin_reference import least_destabilizing_extra_dead_time  # noqa: E402 (shared with the other golden scripts)


def target_delay_margin(lp, estimate):
    """The exact delay margin of the target loop (see least_destabilizing_extra_dead_time)."""
    h = lp["scan"]
    a, b, c = process_state_space(lp)
    cnum, cden = discrete_controller(lp, h)

    def largest_pole(extra):
        phi, gamma0, gamma1, cc, d = sampled_process(a, b, c, lp["process"]["dead"] + extra, h)
        m = closed_loop_matrix(phi, gamma0, gamma1, cc, d, cnum, cden)
        return float(np.max(np.abs(np.linalg.eigvals(m))))
    return least_destabilizing_extra_dead_time(largest_pole, h, estimate)


def target_figures(lp):
    rho, response = target_loop(lp)
    if abs(rho - 1) <= MARGINAL_POLE:
        return dict(stability="marginal", largest_pole_magnitude=rho, rhp_poles=None)
    if lp.get("random") and abs(rho - 1) < FRAGILE:
        raise Fragile("a closed-loop pole near the unit circle (%.9f)" % rho)
    h = lp["scan"]
    nyquist = math.pi / h
    low_corner, _ = corner_frequencies(lp)
    lo = min(low_corner * 1e-3, nyquist * 1e-4)
    hi = nyquist * (1 - 1e-9)
    dead = lp["process"]["dead"]
    w, l = loop_grid(response, lo, hi, dead + h)
    end = at(response, nyquist)
    assert abs(end.imag) <= 1e-9 * abs(end), "L(-1) must be real"
    end = end.real
    gain_x = gain_crossovers(response, w, l)
    # the end point z = -1: a gain crossover between the last grid point and it
    if abs(abs(end) - 1) < 1e-9:
        raise Fragile("|L(-1)| = 1")
    if abs(end) < 1e-12 * np.max(np.abs(l)):
        end = 0.0  # a zero of the sampled loop at z = -1 (a hold of a double integrator): no crossing there
    elif np.sign(np.log(abs(l[-1]))) != np.sign(math.log(abs(end))):
        gain_x.append(brentq(lambda x: math.log(abs(at(response, x))), w[-1], nyquist, xtol=1e-15 * w[-1]))
    phase_w = [(x, at(response, x)) for x in phase_crossovers(response, w, l)]
    if end < 0:
        phase_w.append((nyquist, complex(end, 0.0)))
    figures = margins_from(response, w, l, gain_x, phase_w)
    figures["ms"], figures["ms_rad_s"] = sensitivity_peak(response, w, l, extra=[(abs(1 + end), nyquist)])
    if rho < 1 and figures.get("delay_margin_s") is not None:
        # the exact one: PM / wc holds for whole extra scans only
        figures["delay_margin_s"] = target_delay_margin(lp, figures["delay_margin_s"])
    if lp.get("random") and 1.0 / figures["ms"] < 10 * FRAGILE:
        raise Fragile("the Nyquist curve passes near -1")
    figures["nyquist_end_value"] = end
    figures["largest_pole_magnitude"] = rho
    figures["stability"] = "stable" if rho < 1 else "unstable"
    figures["rhp_poles"] = None
    return figures


# ---------------------------------------------------------------- tunings and random loops

def ultimate(lp_process):
    """Ultimate gain and period of the process with dead time (lowest phase crossover)."""
    probe = dict(process=lp_process, kc=1.0, ti=0.0, td=0.0, n=10.0)
    low, high = corner_frequencies(probe)
    response = design_response(probe)
    w = initial_grid(low * 1e-3, min(high * 1e3, 10 * math.pi / lp_process["dead"]), lp_process["dead"])
    l = response(w)
    xs = phase_crossovers(response, w, l)
    if not xs:
        raise Fragile("no ultimate gain")
    x = xs[0]
    return 1.0 / abs(at(response, x)), 2 * math.pi / x


def random_tuning(rng, process, loop_sign):
    ku, tu = ultimate(process)
    detune = math.exp(rng.uniform(math.log(0.25), math.log(1.6)))
    if rng.uniform() < 0.4:
        kc, ti, td, n = 0.45 * ku * detune, tu / 1.2 * math.exp(rng.uniform(math.log(0.3), math.log(3))), 0.0, 10.0
    else:
        kc = 0.6 * ku * detune
        ti = tu / 2 * math.exp(rng.uniform(math.log(0.3), math.log(3)))
        td = tu / 8 * math.exp(rng.uniform(math.log(0.3), math.log(3)))
        n = float(rng.choice([5.0, 8.0, 10.0, 10.0, 10.0, 20.0, 100.0]))
    scan = tu * 10 ** rng.uniform(-2.7, -0.1)
    scan = max(scan, process["dead"] / 400.0)
    return loop_sign * sig(kc, 4), sig(ti, 4), sig(td, 4), n, sig(scan, 3)


def log_uniform(rng, lo, hi):
    return math.exp(rng.uniform(math.log(lo), math.log(hi)))


def random_process(rng, model):
    if model == "fopdt":
        t = log_uniform(rng, 1, 300)
        return fopdt(log_uniform(rng, 0.2, 5), t, t * log_uniform(rng, 0.02, 2))
    if model == "sopdt":
        zeta = rng.uniform(0.15, 2.0)
        if abs(zeta - 1) < 0.03:
            zeta += 0.1
        wn = log_uniform(rng, 0.005, 2)
        return sopdt(log_uniform(rng, 0.2, 5), zeta, wn, log_uniform(rng, 0.05, 2) / wn)
    if model == "integrating":
        lag = log_uniform(rng, 0.5, 50) if rng.uniform() < 0.5 else 0.0
        return integrating(log_uniform(rng, 0.002, 0.5), log_uniform(rng, 0.5, 30), lag)
    # general: 2 to 4 poles (a complex pair sometimes, an integrator sometimes), maybe a zero
    scale = log_uniform(rng, 1, 100)
    den = np.array([1.0])
    order = int(rng.integers(2, 5))
    k = 0
    while k < order:
        if order - k >= 2 and rng.uniform() < 0.3:
            wn = log_uniform(rng, 0.3, 3) / scale
            zeta = rng.uniform(0.2, 0.8)
            den = np.polymul(den, [1 / wn ** 2, 2 * zeta / wn, 1.0])
            k += 2
        else:
            den = np.polymul(den, [scale * log_uniform(rng, 0.05, 1.5), 1.0])
            k += 1
    gain = log_uniform(rng, 0.3, 3)
    if rng.uniform() < 0.15:
        den = np.polymul(den, [1.0, 0.0])
        gain /= scale * 5
    num = np.array([gain])
    if rng.uniform() < 0.5:
        tz = scale * log_uniform(rng, 0.05, 1.0)
        num = gain * np.array([tz if rng.uniform() < 0.6 else -tz, 1.0])
    return general_tf(num, den, scale * log_uniform(rng, 0.02, 0.8))


def target_for(rng, n, td, ti):
    x = rng.uniform()
    if x < 0.25:
        return "ideal-pb-repeats"
    if x < 0.4 and ti > 0 and (td == 0 or n == 10.0):
        return "ideal-velocity"
    return "ideal"


def random_loops(rng):
    loops = []
    for model, count in RANDOM_COUNTS.items():
        made = 0
        while made < count:
            process = random_process(rng, model)
            try:
                ultimate(process)
            except Fragile:
                continue
            loop_sign = -1.0 if rng.uniform() < 0.1 else 1.0
            kc, ti, td, n, scan = random_tuning(rng, process, loop_sign)
            if loop_sign < 0:
                # a direct-acting controller on a negative-gain process: negative feedback, tuned as its mirror
                process = flip_process_sign(process)
            name = "random-%s-%03d" % (model, made + 1)
            lp = make_loop(name, "random-" + model, "random %s, %s" % (model, "PID" if td > 0 else "PI"),
                           process, kc, ti, td, n, target_for(rng, n, td, ti), scan)
            lp["random"] = True
            try:
                lp["design"] = design_figures(lp)
                lp["target_figures"] = target_figures(lp)
            except Fragile as why:
                print("  redraw %s: %s" % (name, why), file=sys.stderr)
                continue
            loops.append(lp)
            made += 1
            print(name, lp["design"]["stability"], lp["target_figures"]["stability"], file=sys.stderr)
    return loops


def flip_process_sign(process):
    if process["model"] == "fopdt":
        return fopdt(-process["num"][0], process["den"][0], process["dead"])
    if process["model"] == "sopdt":
        t2, two_zeta_t, _ = process["den"]
        t = math.sqrt(t2)
        return sopdt(-process["num"][0], two_zeta_t / (2 * t), 1 / t, process["dead"])
    if process["model"] == "integrating":
        lag = process["den"][0] if len(process["den"]) == 3 else 0.0
        return integrating(-process["num"][0], process["dead"], lag)
    return general_tf([-c for c in process["num"]], process["den"], process["dead"])


# ---------------------------------------------------------------- special loops

def special_loops():
    s = []

    def add(klass, note, process, kc, ti, td, n, target, scan):
        s.append(make_loop("%s-%02d" % (klass, sum(1 for x in s if x["klass"] == klass) + 1), klass, note,
                           process, kc, ti, td, n, target, scan))

    # several gain crossovers: a resonance lifts |L| above 1 again after the first crossover
    add("several-crossovers", "SOPDT damping 0.05 with PI: three gain crossovers, stable, delay margin 1.30 s",
        sopdt(1, 0.05, 1, 5.21), 0.15, 5, 0, 10, "ideal", 0.5)
    add("several-crossovers", "SOPDT damping 0.01: two gain crossovers 1.6 % apart at the resonance",
        sopdt(1, 0.01, 1, 5.21), 0.025, 5, 0, 10, "ideal", 0.1)
    add("several-crossovers", "as 01, band and repeats target", sopdt(1, 0.05, 1, 5.21), 0.15, 5, 0, 10,
        "ideal-pb-repeats", 0.5)
    add("several-crossovers", "damping 0.02, PI", sopdt(1, 0.02, 2, 1.3), 0.05, 2, 0, 10, "ideal", 0.05)
    add("several-crossovers", "damping 0.03, PID N 10", sopdt(2, 0.03, 0.5, 3.1), 0.04, 6, 0.5, 10,
        "ideal-velocity", 0.2)
    add("several-crossovers", "damping 0.04, PI, slow scan", sopdt(1, 0.04, 1, 2.7), 0.12, 3, 0, 10, "ideal", 1.0)
    add("several-crossovers", "resonance under a slow pole",
        general_tf([1.0], np.polymul([20.0, 1.0], [1.0, 0.06, 1.0]), 0.8), 0.3, 25, 0, 10, "ideal", 0.2)
    add("several-crossovers", "damping 0.015, PI, fast scan", sopdt(1, 0.015, 3, 0.9), 0.04, 1, 0, 10,
        "ideal-pb-repeats", 0.02)

    # lightly damped resonances (damping 0.01 to 0.05)
    for k, (zeta, wn, dead, kc, ti, td, n, target, scan) in enumerate([
            (0.01, 1.0, 0.5, 0.005, 2.0, 0.0, 10, "ideal", 0.1),
            (0.02, 0.2, 2.0, 0.02, 20.0, 0.0, 10, "ideal", 0.5),
            (0.03, 5.0, 0.1, 0.03, 0.5, 0.02, 10, "ideal", 0.01),
            (0.05, 1.0, 1.0, 0.08, 3.0, 0.3, 20, "ideal-pb-repeats", 0.1),
            (0.04, 0.05, 10.0, 0.05, 60.0, 0.0, 10, "ideal-velocity", 2.0),
            (0.01, 2.0, 0.3, 0.01, 1.0, 0.0, 10, "ideal", 0.05)]):
        add("resonance", "SOPDT damping %g, natural frequency %g rad/s" % (zeta, wn), sopdt(1, zeta, wn, dead),
            kc, ti, td, n, target, scan)
    add("resonance", "slow pole and a damping 0.02 mode",
        general_tf([2.0], np.polymul([10.0, 1.0], [0.25, 0.02, 1.0]), 0.4), 0.2, 10, 0, 10, "ideal", 0.1)
    add("resonance", "damping 0.05 mode with a zero",
        general_tf([3.0, 1.0], np.polymul([5.0, 1.0], [1.0, 0.1, 1.0]), 1.0), 0.1, 5, 0.5, 10, "ideal", 0.2)

    # integrators with dead time
    add("integrator", "integrating PI with Ti < L: unstable", integrating(0.05, 5), 0.5, 4, 0, 10, "ideal", 0.5)
    add("integrator", "integrating PI with Ti < L, slow scan: unstable", integrating(0.05, 5), 0.5, 4, 0, 10,
        "ideal-pb-repeats", 2.0)
    add("integrator", "integrating PI, SIMC-like", integrating(0.05, 5), 2.0, 40, 0, 10, "ideal", 0.5)
    add("integrator", "integrating PI, SIMC-like, fractional delay", integrating(0.02, 3.7), 6.0, 30, 0, 10,
        "ideal-velocity", 0.9)
    add("integrator", "integrating with lag, PID", integrating(0.01, 2, 20), 15, 40, 10, 10, "ideal", 0.3)
    add("integrator", "integrating with lag, PI too fast: unstable", integrating(0.05, 2, 10), 3, 5, 0, 10,
        "ideal", 0.4)
    add("integrator", "integrating PID, scan above the dead time", integrating(0.1, 1.5), 2.5, 12, 0.6, 10,
        "ideal-pb-repeats", 2.5)
    add("integrator", "integrating, no dead time, PI", integrating(0.2, 0), 1.0, 10, 0, 10, "ideal", 0.5)

    # conditionally stable: stable for gains between 0.56x and 56.5x
    cs = integrating(0.1, 0.1, 10)
    add("conditionally-stable", "integrating 0.1 with lag 10 s, dead time 0.1 s, PID kc 2 ti 5 td 8 n 10",
        cs, 2, 5, 8, 10, "ideal", 0.05)
    add("conditionally-stable", "as 01 at half the gain: below the lower gain margin, unstable",
        cs, 1, 5, 8, 10, "ideal", 0.05)
    add("conditionally-stable", "as 01 at 0.8 of the gain: just stable", cs, 1.6, 5, 8, 10, "ideal-velocity", 0.05)
    add("conditionally-stable", "as 01, faster scan", cs, 2, 5, 8, 10, "ideal-pb-repeats", 0.01)
    add("conditionally-stable", "as 01, slower scan", cs, 2, 5, 8, 10, "ideal", 0.2)
    add("conditionally-stable", "as 01, 20x the gain", cs, 40, 5, 8, 10, "ideal", 0.01)

    # the phase reaches -180 deg only at the Nyquist frequency of the sampled loop
    add("band-edge", "FOPDT 1, 10 s, 1 s; PI kc 2 ti 8 s; scan 5 s: GM 2.30 at z = -1",
        fopdt(1, 10, 1), 2, 8, 0, 10, "ideal", 5)
    add("band-edge", "FOPDT 1, 10 s, no dead time; PI kc 3 ti 8 s; scan 5 s: GM 1.037",
        fopdt(1, 10, 0), 3, 8, 0, 10, "ideal", 5)
    add("band-edge", "as 01 at a 4 s scan", fopdt(1, 10, 1), 2, 8, 0, 10, "ideal-pb-repeats", 4)
    add("band-edge", "as 01 at a 3 s scan", fopdt(1, 10, 1), 2, 8, 0, 10, "ideal", 3)
    add("band-edge", "as 02 at a 6 s scan, kc 1.5", fopdt(1, 10, 0), 1.5, 8, 0, 10, "ideal-velocity", 6)
    add("band-edge", "FOPDT 2, 60 s, 5 s; PI kc 1.2 ti 50 s; scan 20 s", fopdt(2, 60, 5), 1.2, 50, 0, 10, "ideal", 20)
    add("band-edge", "SOPDT overdamped, slow scan", sopdt(1, 1.5, 0.1, 2), 1.0, 25, 0, 10, "ideal", 12)
    add("band-edge", "FOPDT, PID slow scan", fopdt(1, 20, 2), 2.0, 20, 2, 10, "ideal", 8)

    # sampled loops the scan makes unstable (the design loop is stable)
    add("unstable-sampled", "FOPDT 1, 10 s, no dead time; PI kc 3 ti 8 s; scan 7 s", fopdt(1, 10, 0), 3, 8, 0, 10,
        "ideal", 7)
    add("unstable-sampled", "FOPDT 1, 10 s, 1 s; PI kc 4 ti 8 s; scan 6 s", fopdt(1, 10, 1), 4, 8, 0, 10, "ideal", 6)
    add("unstable-sampled", "PID whose derivative kicks at a slow scan", fopdt(1, 10, 1), 5, 6, 1.5, 10, "ideal", 4.5)
    add("unstable-sampled", "SOPDT PID, slow scan", sopdt(1, 0.7, 0.5, 0.5), 2.5, 4, 0.8, 10, "ideal-pb-repeats", 1.2)
    add("unstable-sampled", "integrating PI, scan of eight times the dead time", integrating(0.1, 1), 3, 8, 0, 10,
        "ideal", 8.0)
    add("unstable-sampled", "FOPDT PI, velocity form, slow scan", fopdt(2, 30, 3), 3, 25, 0, 10, "ideal-velocity", 15)

    # negative process gain: a reverse-acting controller is positive feedback; a direct-acting one is not
    neg = [("fopdt", fopdt(-1, 60, 5), 2, 60, 0, 1.0),
           ("sopdt", sopdt(-1.5, 0.7, 0.1, 3), 1.0, 20, 3, 0.5),
           ("integrating", integrating(-0.05, 5), 2.0, 40, 0, 0.5),
           ("tf", general_tf([-2.0], np.polymul([30.0, 1.0], [5.0, 1.0]), 4), 1.5, 30, 2, 1.0)]
    for model, process, kc, ti, td, scan in neg:
        add("positive-feedback", "%s, process gain negative, reverse-acting PI(D): unstable" % model,
            process, kc, ti, td, 10, "ideal-pb-repeats" if model in ("fopdt", "tf") else "ideal", scan)
    for model, process, kc, ti, td, scan in neg:
        add("negative-gain-direct", "%s, process gain negative, direct-acting PI(D): stable" % model,
            process, -kc, ti, td, 10, "ideal-pb-repeats" if model in ("sopdt", "integrating") else "ideal", scan)

    # high filter ratio N
    add("high-n", "FOPDT 1, 1 s, 0.05 s; PID kc 5 ti 1 s td 0.5 s n 100: design unstable",
        fopdt(1, 1, 0.05), 5, 1, 0.5, 100, "ideal", 0.01)
    add("high-n", "as 01, slower scan", fopdt(1, 1, 0.05), 5, 1, 0.5, 100, "ideal-pb-repeats", 0.05)
    add("high-n", "FOPDT 1, 10 s, 1 s; ZN PID with n 100", fopdt(1, 10, 1), 6, 3, 0.5, 100, "ideal", 0.05)
    add("high-n", "SOPDT PID n 100", sopdt(1, 0.8, 0.5, 1), 1.2, 4, 0.8, 100, "ideal", 0.1)
    add("high-n", "integrating with lag, PID n 100", integrating(0.02, 1, 5), 8, 20, 3, 100, "ideal", 0.1)
    add("high-n", "FOPDT, PID n 50, slow scan", fopdt(1, 10, 1), 4, 5, 0.8, 50, "ideal", 0.5)

    # marginal loops: a closed-loop pole on the boundary
    add("marginal", "integrator 0.5, P kc 4, scan 1 s: sampled pole at z = -1",
        integrating(0.5, 0), 4, 0, 0, 10, "ideal", 1.0)
    add("marginal", "double integrator, P kc 1: design poles at +-i",
        general_tf([1.0], [1.0, 0.0, 0.0], 0), 1, 0, 0, 10, "ideal", 0.1)
    return s


# ---------------------------------------------------------------- output

def loop_yaml(lp):
    tuning = "{form: ideal, kc: %r, ti: %r, td: %r, n: %r}" % (lp["kc"], lp["ti"], lp["td"], lp["n"])
    return ("# INVENTED LOOP for StabilityCrossCheckTest (%s): %s.\n"
            "# Written by src/test/python/write_stability_crosscheck.py; edit the script, not this file.\n"
            "tag: %s\nprocess: %s\ntuning: %s\ntarget: {form: %s, scan: %r s}\n"
            % (lp["klass"], lp["note"], lp["name"].upper(), lp["process"]["yaml"], tuning, lp["target"], lp["scan"]))


KEYS = ["stability", "rhp_poles", "largest_pole_magnitude", "gain_margin", "gain_margin_rad_s", "lower_gain_margin",
        "lower_gain_margin_rad_s", "phase_margin_deg", "crossover_rad_s", "delay_margin_s", "ms", "ms_rad_s",
        "gain_crossovers", "phase_crossovers"]
MARGIN_KEYS = {"gain_margin", "gain_margin_rad_s", "lower_gain_margin", "lower_gain_margin_rad_s",
               "phase_margin_deg", "crossover_rad_s", "delay_margin_s", "ms", "ms_rad_s"}


def fmt(key, figures):
    x = figures.get(key)
    if figures["stability"] == "marginal" and key in MARGIN_KEYS:
        return ""
    if x is None:
        return ""
    if isinstance(x, str):
        return x
    if isinstance(x, (int, np.integer)):
        return str(int(x))
    return repr(float(x))


def main():
    loops = []
    for lp in special_loops():
        lp["design"] = design_figures(lp)
        lp["target_figures"] = target_figures(lp)
        print(lp["name"], lp["design"]["stability"], lp["target_figures"]["stability"],
              "GM", lp["target_figures"].get("gain_margin"), file=sys.stderr)
        loops.append(lp)
    loops.extend(random_loops(np.random.default_rng(SEED)))
    # only now that every loop has its reference: replace the old files
    os.makedirs(LOOP_DIR, exist_ok=True)
    for old in os.listdir(LOOP_DIR):
        if old.endswith(".yaml"):
            os.remove(os.path.join(LOOP_DIR, old))
    rows = []
    for lp in loops:
        with open(os.path.join(LOOP_DIR, lp["name"] + ".yaml"), "w") as f:
            f.write(loop_yaml(lp))
        for which, figures in (("design", lp["design"]), ("target", lp["target_figures"])):
            rows.append([lp["name"] + ".yaml", lp["klass"], which] + [fmt(k, figures) for k in KEYS])
    with open(os.path.join(OUT_DIR, "golden.csv"), "w", newline="") as f:
        out = csv.writer(f, lineterminator="\n")
        out.writerow(["file", "class", "loop"] + KEYS)
        out.writerows(rows)
    counts = {}
    for lp in loops:
        counts[lp["klass"]] = counts.get(lp["klass"], 0) + 1
    print("loops:", len(loops), counts, file=sys.stderr)


if __name__ == "__main__":
    main()
