#!/usr/bin/env python3
"""The scripted alternative, written for the benchmark: the linear work of a loop audit in numpy/scipy.

Usage: bench/reference_audit.py LOOPS.csv OUT.csv [--jobs N]

Reads the list bench/make_loops.py writes (series-pb-min tunings, FOPDT / SOPDT / integrating
models, seconds) and, per loop, does the linear work an engineer's script would do:
  * converts the series tuning to the ideal structure (Kc' = Kc (1 + Td/Ti), Ti' = Ti + Td,
    Td' = Ti Td / (Ti + Td); e.g. Astrom and Hagglund, "Advanced PID Control", 2006, sec. 3.4),
    filter Tf = Td'/10;
  * samples the process exactly with a zero-order hold at the target scan, fractional dead time
    included (modified z-transform through scipy.linalg.expm; Astrom and Wittenmark,
    "Computer-Controlled Systems", 3rd ed., 1997, sec. 2.3);
  * the discrete PID as a positional algorithm: backward-difference integral, backward-difference
    filtered derivative on the measurement (setpoint path without derivative);
  * closed-loop stability from the roots of the characteristic polynomial;
  * gain and phase margins, crossover, Ms and delay margin on a 2,000-point logarithmic grid, for the
    target loop (z = exp(j w h)) and for the continuous design loop (s = j w, delay exp(-j w L));
  * linear setpoint and load step responses (scipy.signal.lfilter) of the target loop over
    30 / crossover, and of the design loop on a fine step (horizon / 2000) as its reference;
    IAE, overshoot and peak of each.
No output limits, no saturation, no findings: the linear core only. Writes one row per loop.
"""
import csv
import math
import multiprocessing
import sys

import numpy as np
from scipy.linalg import expm
from scipy.signal import lfilter, ss2tf

GRID = 2000


def seconds(cell):
    cell = cell.strip()
    if not cell:
        return None
    return float(cell.split()[0].rstrip("s"))


def plant_ss(row):
    k = float(row["process_gain"])
    model = row["model"]
    if model == "fopdt":
        t = seconds(row["time_constant"])
        return np.array([[-1 / t]]), np.array([[1 / t]]), np.array([[k]])
    if model == "sopdt":
        t1, t2 = seconds(row["time_constant"]), seconds(row["time_constant_2"])
        a = np.array([[-1 / t1, 0.0], [1 / t2, -1 / t2]])
        return a, np.array([[1 / t1], [0.0]]), np.array([[0.0, k]])
    lag = seconds(row["lag"]) or 0.0
    if lag > 0:
        a = np.array([[-1 / lag, 0.0], [1.0, 0.0]])
        return a, np.array([[1 / lag], [0.0]]), np.array([[0.0, k]])
    return np.array([[0.0]]), np.array([[1.0]]), np.array([[k]])


def zoh_integrals(a, b, t):
    """exp(A t) and int_0^t exp(A s) ds B, from one matrix exponential."""
    n = a.shape[0]
    m = np.zeros((n + 1, n + 1))
    m[:n, :n] = a
    m[:n, n:] = b
    e = expm(m * t)
    return e[:n, :n], e[:n, n:]


def sampled_tf(a, b, c, dead, h):
    """G(z) = (N0 z + N1) / (D z^(d+1)), the ZOH-sampled process with dead time d h + tau."""
    d = int(math.floor(dead / h + 1e-12))
    tau = dead - d * h
    phi, _ = zoh_integrals(a, b, h)
    e1, g0 = zoh_integrals(a, b, h - tau)
    _, gt = zoh_integrals(a, b, tau)
    g1 = e1 @ gt
    n0, den = ss2tf(phi, g0, c, np.zeros((1, 1)))
    n1, _ = ss2tf(phi, g1, c, np.zeros((1, 1)))
    num = np.polyadd(np.polymul(n0[0], [1.0, 0.0]), n1[0])
    den = np.polymul(den, np.r_[1.0, np.zeros(d + 1)])
    return np.trim_zeros(num, "f"), den


def pid_z(kc, ti, td, tf, h):
    """C(z) feedback path and C_r(z) setpoint path (no derivative), as (num, den) in powers of z."""
    # P + I: kc + kc h/ti * z/(z-1); D: kc td/(tf+h) (z-1)/(z - tf/(tf+h))
    pole = tf / (tf + h)
    den = np.polymul([1.0, -1.0], [1.0, -pole])
    pi_num = np.polymul(np.polyadd(np.polymul([kc], [1.0, -1.0]), [kc * h / ti, 0.0]), [1.0, -pole])
    d_num = np.polymul([kc * td / (tf + h)], np.polymul([1.0, -1.0], [1.0, -1.0]))
    return np.polyadd(pi_num, d_num), pi_num, den


def margins(loop_values, w):
    """Crossover, phase margin, gain margin, Ms, delay margin from L(jw) on the grid."""
    mag = np.abs(loop_values)
    ms = float(np.max(1 / np.abs(1 + loop_values)))
    lm = np.log(mag)
    idx = np.nonzero(np.sign(lm[:-1]) != np.sign(lm[1:]))[0]
    wc = pm = dm = float("nan")
    if idx.size:
        i = idx[0]
        f = lm[i] / (lm[i] - lm[i + 1])
        wc = w[i] + f * (w[i + 1] - w[i])
        ph = np.unwrap(np.angle(loop_values))
        phc = ph[i] + f * (ph[i + 1] - ph[i])
        pm = math.degrees(math.pi + phc)
        pm = (pm + 180) % 360 - 180
        dm = math.radians(pm) / wc if pm > 0 else 0.0
    im = loop_values.imag
    jdx = np.nonzero((np.sign(im[:-1]) != np.sign(im[1:])) & (loop_values.real[:-1] < 0))[0]
    gm = float("inf")
    if jdx.size:
        j = jdx[0]
        f = im[j] / (im[j] - im[j + 1])
        re = loop_values.real[j] + f * (loop_values.real[j + 1] - loop_values.real[j])
        gm = -1 / re
    return wc, pm, gm, ms, dm


def closed_loop(pn, pd, cn, cd):
    """y/r = P Cr/(1 + P C) and y/d = P Cd... as polynomials in z of one degree (lfilter form)."""
    char = np.polyadd(np.polymul(pd, cd[0]), np.polymul(pn, cn[0]))
    return char


def step_metrics(y, dt, step):
    e = np.abs(step - y)
    iae = float(np.sum(e) * dt)
    over = float(max(0.0, (np.max(y) - step) / step * 100))
    return iae, over


def as_lfilter(num, den):
    n = len(den) - len(num)
    return np.r_[np.zeros(n), num], den


def responses(pn, pd, c_fb, c_sp, c_den, steps, step_pct=10.0):
    char = np.polyadd(np.polymul(pd, c_den), np.polymul(pn, c_fb))
    sp_num = np.polymul(pn, c_sp)
    ld_num = np.polymul(pn, c_den)
    u = np.full(steps, step_pct)
    y_sp = lfilter(*as_lfilter(sp_num, char), u)
    y_ld = lfilter(*as_lfilter(ld_num, char), u)
    return char, y_sp, y_ld


def check(row, target_scan_override):
    h = target_scan_override or seconds(row["target_scan"])
    kc_s = 100.0 / float(row["pb"])
    ti_s = float(row["ti"]) * 60
    td_s = float(row["td"]) * 60
    kc = kc_s * (1 + td_s / ti_s)
    ti = ti_s + td_s
    td = ti_s * td_s / (ti_s + td_s)
    tf = td / 10
    a, b, c = plant_ss(row)
    dead = seconds(row["dead_time"])
    # target loop: exact ZOH process, discrete PID
    pn, pd = sampled_tf(a, b, c, dead, h)
    c_fb, c_sp, c_den = pid_z(kc, ti, td, tf, h)
    char = np.polyadd(np.polymul(pd, c_den), np.polymul(pn, c_fb))
    radius = float(np.max(np.abs(np.roots(char))))
    # design loop: continuous, margins on a grid
    w_low = 1e-3 / max(ti, dead, 1.0)
    w_c = np.logspace(math.log10(w_low), math.log10(100 / max(h, 1e-3)), GRID)
    s = 1j * w_c
    p_s = (c @ np.linalg.solve(np.eye(a.shape[0])[None, :, :] * s[:, None, None] - a[None, :, :],
                               np.broadcast_to(b, (GRID,) + b.shape)))[:, 0, 0] * np.exp(-s * dead)
    c_s = kc * (1 + 1 / (ti * s) + td * s / (1 + tf * s))
    dwc, dpm, dgm, dms, ddm = margins(p_s * c_s, w_c)
    w_d = np.logspace(math.log10(w_low), math.log10(math.pi / h), GRID)
    z = np.exp(1j * w_d * h)
    l_z = np.polyval(pn, z) / np.polyval(pd, z) * np.polyval(c_fb, z) / np.polyval(c_den, z)
    twc, tpm, tgm, tms, tdm = margins(l_z, w_d)
    wc = dwc if math.isfinite(dwc) else twc
    horizon = max(30 / wc, 5 * dead) if math.isfinite(wc) and wc > 0 else 20 * max(ti, dead + 1)
    n_target = int(min(horizon / h, 200000))
    _, ty_sp, ty_ld = responses(pn, pd, c_fb, c_sp, c_den, n_target)
    # design reference: the continuous law on a fine step
    hf = horizon / 2000
    fn, fd = sampled_tf(a, b, c, dead, hf)
    f_fb, f_sp, f_den = pid_z(kc, ti, td, max(tf, hf), hf)
    _, dy_sp, dy_ld = responses(fn, fd, f_fb, f_sp, f_den, 2000)
    t_iae, t_over = step_metrics(ty_sp, h, 10.0)
    d_iae, d_over = step_metrics(dy_sp, hf, 10.0)
    t_load = float(np.sum(np.abs(ty_ld)) * h)
    d_load = float(np.sum(np.abs(dy_ld)) * hf)
    verdict = "unstable" if radius >= 1 else ("fail" if tms > 3 or tpm < 20 else "pass")
    return [row["tag"], verdict, "%.6g" % radius, "%.6g" % dpm, "%.6g" % tpm, "%.6g" % dgm, "%.6g" % tgm,
            "%.6g" % dms, "%.6g" % tms, "%.6g" % ddm, "%.6g" % tdm, "%.6g" % d_iae, "%.6g" % t_iae,
            "%.6g" % d_over, "%.6g" % t_over, "%.6g" % d_load, "%.6g" % t_load]


def work(args):
    rows, scan = args
    return [check(r, scan) for r in rows]


def main():
    src, dst = sys.argv[1], sys.argv[2]
    jobs = int(sys.argv[sys.argv.index("--jobs") + 1]) if "--jobs" in sys.argv else 1
    with open(src, newline="") as f:
        rows = list(csv.DictReader(f))
    if jobs > 1:
        chunks = [rows[i::jobs] for i in range(jobs)]
        with multiprocessing.Pool(jobs) as pool:
            results = [r for part in pool.map(work, [(c, None) for c in chunks]) for r in part]
    else:
        results = work((rows, None))
    with open(dst, "w", newline="") as f:
        out = csv.writer(f)
        out.writerow(["tag", "verdict", "target_pole_radius", "design_pm_deg", "target_pm_deg", "design_gm",
                      "target_gm", "design_ms", "target_ms", "design_delay_margin_s", "target_delay_margin_s",
                      "design_sp_iae_pct_s", "target_sp_iae_pct_s", "design_sp_overshoot_pct",
                      "target_sp_overshoot_pct", "design_load_iae_pct_s", "target_load_iae_pct_s"])
        out.writerows(results)


if __name__ == "__main__":
    main()
