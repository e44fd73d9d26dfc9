#!/usr/bin/env python3
"""Writes the INVENTED example records of Plant K-7 (see examples/README.md). numpy only; fixed seeds.

    python3 examples/records/generate.py      # from the repository root; rewrites examples/records/

Independent of loopform's own code: the processes are simulated here from their textbook equations and
the old controllers from the textbook discrete PID, so replaying these records through loopform is a
check of loopform, not of itself.

- tic-104-bump.csv: a bump test on TIC-104 in manual (output stepped up, then back), FOPDT K = 2 %/%,
  T = 60 s, L = 10 s (the model in examples/loops/tic-104.yaml), analytic step responses superposed
  (y = K du (1 - exp(-(t - t0 - L)/T)), Seborg, Edgar & Mellichamp, 2nd ed., 2004, ch. 5), white noise
  0.15 % of span, PV in 0..150 degC, output in %, ISO timestamps every second.
- tic-104-relay.csv: a relay-feedback test on the same process (relay +-5 % about 50 %, hysteresis
  0.2 % of span on the error; Astrom & Hagglund 1984), the process integrated exactly per 0.05 s step
  (zero-order hold: y+ = a y + (1 - a) K u, a = exp(-h/T)), logged every 0.5 s with 0.1 % noise.
- replay/TAG.csv: closed-loop trends as a historian would log them for FIC-105, PIC-401, TIC-301 and PIC-402,
  the old controllers simulated on FOPDT processes with measurement noise, setpoint changes, load steps
  and (PIC-401) a manual period. The discrete process is y(k+1) = a y(k) + (1 - a)(K u(k - d) + load)
  (Astrom & Wittenmark, Computer-Controlled Systems, 1997, ch. 2 - from memory); the controller the
  positional series PID of the old system with backward differences (Wittenmark, Astrom & Arzen,
  Computer Control: An Overview, IFAC 2002, Table 3): the PI part acts on e' = e + (Td - Tf) D[e],
  D[e] = Tf/(Tf + h) D[e](k-1) + (e(k) - e(k-1))/(Tf + h), Tf = Td/10; in manual the integral tracks the
  output (bumpless transfer, common practice). FIC-105's controller really ran with its reset at 15 s:
  replay-loops.csv, the first draft of the list, took that 15 for minutes (on purpose, for replay to find).
  PIC-402's really ran with its reset at 0.8 repeats per minute (75 s); plant-k7-loops.csv took the 0.8 for
  minutes per repeat (on purpose, for the demo's replay to find).
"""
import datetime
import os

import numpy as np

HERE = os.path.dirname(os.path.abspath(__file__))


def fmt(x):
    return f"{x:.4f}".rstrip("0").rstrip(".") if abs(x) >= 1e-9 else "0"


def bump():
    rng = np.random.default_rng(104)
    k, tau, dead = 2.0, 60.0, 10.0
    moves = [(60.0, 10.0), (480.0, -10.0)]
    t = np.arange(0.0, 901.0, 1.0)
    u = np.full_like(t, 35.0)
    y = np.full_like(t, 40.0)
    for at, du in moves:
        u[t >= at] += du
        since = t - at - dead
        y += np.where(since > 0, k * du * (1 - np.exp(-np.clip(since, 0, None) / tau)), 0.0)
    y += 0.15 * rng.standard_normal(t.size)
    start = datetime.datetime(2031, 3, 14, 9, 0, 0)
    with open(os.path.join(HERE, "tic-104-bump.csv"), "w", newline="\n") as f:
        f.write("time,output,pv\n")
        for tk, uk, yk in zip(t, u, y):
            stamp = (start + datetime.timedelta(seconds=float(tk))).isoformat()
            f.write(f"{stamp},{fmt(uk)},{fmt(yk * 1.5)}\n")


def relay():
    rng = np.random.default_rng(1041)
    k, tau, dead, h, log_every = 2.0, 60.0, 10.0, 0.05, 10
    d, bias, hyst, sp = 5.0, 50.0, 0.2, 40.0
    steps = int(round(900.0 / h)) + 1
    delay = int(round(dead / h))
    a = np.exp(-h / tau)
    y = 40.0
    u = bias + d
    history = [bias] * (delay + 1)
    rows = []
    for n in range(steps):
        measured = y + (0.1 * rng.standard_normal() if n % log_every == 0 else 0.0)
        e = sp - y
        if e > hyst:
            u = bias + d
        elif e < -hyst:
            u = bias - d
        if n % log_every == 0:
            rows.append((n * h, u, measured))
        history.append(u)
        y = a * y + (1 - a) * (k * history[-delay - 2] + 40.0 - k * bias)
    with open(os.path.join(HERE, "tic-104-relay.csv"), "w", newline="\n") as f:
        f.write("time,output,pv\n")
        for tk, uk, yk in rows:
            f.write(f"{fmt(tk)},{fmt(uk)},{fmt(yk * 1.5)}\n")


def closed_loop(tag, pv_span, gain, ti, td, scan, kp, tau, dead, length, events, manual, seed):
    """events: (time, setpoint %, load %) changes; manual: (from, to, output %) or None."""
    rng = np.random.default_rng(seed)
    log = 1.0
    steps = int(round(length / log)) + 1
    per_scan = int(round(scan / log))
    delay = int(round(dead / log))
    a = np.exp(-log / tau)
    y = 40.0
    u = 40.0 / kp
    history = np.full(steps + delay + 1, u)
    tf = td / 10.0
    h = scan
    integral = u
    lead = 0.0
    previous = 0.0
    r, load = 40.0, 0.0
    with open(os.path.join(HERE, "replay", tag + ".csv"), "w", newline="\n") as f:
        f.write("time,setpoint,pv,output,mode\n")
        for k in range(steps):
            t = k * log
            for at, sp, ld in events:
                if t >= at:
                    r, load = sp, ld
            measured = y + 0.15 * rng.standard_normal()
            is_manual = manual is not None and manual[0] <= t < manual[1]
            if k % per_scan == 0:
                e = r - measured
                if td > 0:
                    lead = 0.0 if k == 0 else tf / (tf + h) * lead + (e - previous) / (tf + h)
                e_prime = e + (td - tf) * lead if td > 0 else e
                if k == 0:
                    integral = u - gain * e_prime
                proportional = gain * e_prime
                integral += gain * h / ti * e_prime
                u = manual[2] if is_manual else proportional + integral
                if is_manual:
                    integral = u - proportional
                previous = e
            f.write(f"{fmt(t)},{fmt(r * pv_span / 100)},{fmt(measured * pv_span / 100)},{fmt(u)},"
                    f"{'manual' if is_manual else 'auto'}\n")
            history[k + delay] = u
            y = a * y + (1 - a) * (kp * history[k] + load)


def main():
    bump()
    relay()
    # FIC-105: series PI, pb 250 % (gain 0.4), reset really 15 s; FOPDT 1.3 %/%, 6 s, 2 s; 0..80 m3/h
    closed_loop("FIC-105", 80.0, 100 / 250, 15.0, 0.0, 1.0, 1.3, 6.0, 2.0, 1200.0,
                [(0, 40, 0), (100, 45, 0), (400, 45, -4), (700, 38, -4), (950, 38, 2)], None, 105)
    # PIC-401: series PI, pb 110 %, 0.6 min; FOPDT 0.8 %/%, 20 s, 2 s; 0..10 bar; manual 600..800 s
    closed_loop("PIC-401", 10.0, 100 / 110, 36.0, 0.0, 1.0, 0.8, 20.0, 2.0, 1500.0,
                [(0, 40, 0), (100, 46, 0), (350, 46, -5), (1000, 42, -5), (1200, 42, 3)], (600, 800, 55.0), 401)
    # TIC-301: series PID, pb 60 %, 6 min, 0.3 min; FOPDT 1.5 %/%, 300 s, 30 s; 0..150 degC
    closed_loop("TIC-301", 150.0, 100 / 60, 360.0, 18.0, 1.0, 1.5, 300.0, 30.0, 5400.0,
                [(0, 40, 0), (300, 44, 0), (1800, 44, -4), (3300, 47, -4), (4300, 47, 2)], None, 301)
    # PIC-402: series PI, pb 130 %; the old console shows the reset as 0.8 REPEATS per minute (ti = 1.25 min =
    # 75 s), and plant-k7-loops.csv took the 0.8 for minutes per repeat (on purpose: the wrong unit the demo's
    # replay finds); FOPDT 1.1 %/%, 25 s, 3 s; 0..16 bar
    closed_loop("PIC-402", 16.0, 100 / 130, 75.0, 0.0, 1.0, 1.1, 25.0, 3.0, 1500.0,
                [(0, 40, 0), (100, 45, 0), (400, 45, -5), (800, 41, -5), (1100, 41, 3)], None, 402)


if __name__ == "__main__":
    main()
