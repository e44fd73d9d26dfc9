#!/usr/bin/env python3
"""Writes an invented loop list (CSV) for the benchmarks: INVENTED DATA, no real plant.

Usage: bench/make_loops.py N [SEED] > loops.csv

A plant's mix, from fast flow loops to slow temperature loops:
  flow         FOPDT, T 2-8 s,      L 0.3-1.5 s,  PI,  target scan 0.25 s
  pressure     FOPDT, T 10-40 s,    L 1-4 s,      PI,  target scan 0.5 s
  level        integrating (lag 0-20 s), L 2-10 s, PI,  target scan 1 s
  temperature  SOPDT, T1 100-600 s, T2 10-60 s, L 10-60 s, PID, target scan 1 s
  composition  FOPDT, T 200-900 s,  L 30-200 s,   PID, target scan 2 s
Tunings follow the SIMC rules (Skogestad, "Simple analytic rules for model reduction and PID
controller tuning", J. Process Control 13 (2003), rules (21)-(27), series PID) with the closed-loop
time constant tau_c drawn from 0.4 L to 3 L and a detuning factor on the gain (0.6-1.8), so that the
list holds robust, tight and a few too aggressive loops. Every third row has no source scan (the
design loop is then the continuous law). Source form series-pb-min (band %, Ti and Td in minutes).
"""
import random
import sys


def simc_fopdt(k, t, l, tc):
    kc = t / (k * (tc + l))
    ti = min(t, 4 * (tc + l))
    return kc, ti, 0.0


def simc_sopdt(k, t1, t2, l, tc):
    kc = t1 / (k * (tc + l))
    ti = min(t1, 4 * (tc + l))
    return kc, ti, t2


def simc_integrating(k, l, tc):
    kc = 1.0 / (k * (tc + l))
    return kc, 4 * (tc + l), 0.0


def main():
    n = int(sys.argv[1]) if len(sys.argv) > 1 else 10000
    rnd = random.Random(int(sys.argv[2]) if len(sys.argv) > 2 else 20261203)
    cols = ["tag", "form", "pb", "ti", "td", "scan", "target_scan", "pv_range", "output_range", "model",
            "process_gain", "time_constant", "time_constant_2", "dead_time", "lag"]
    out = [",".join(cols)]
    kinds = ["flow", "pressure", "level", "temperature", "composition"]
    for i in range(1, n + 1):
        kind = kinds[i % len(kinds)]
        detune = rnd.uniform(0.6, 1.8)
        t2 = lag = ""
        if kind == "flow":
            k, t, l = rnd.uniform(0.6, 1.4), rnd.uniform(2, 8), rnd.uniform(0.3, 1.5)
            kc, ti, td = simc_fopdt(k, t, l, rnd.uniform(0.4, 3) * l)
            model, scan, tscan, pv, tag = "fopdt", "1 s", "0.25 s", "0..50", "FIC"
        elif kind == "pressure":
            k, t, l = rnd.uniform(0.5, 2), rnd.uniform(10, 40), rnd.uniform(1, 4)
            kc, ti, td = simc_fopdt(k, t, l, rnd.uniform(0.4, 3) * l)
            model, scan, tscan, pv, tag = "fopdt", "1 s", "0.5 s", "0..10", "PIC"
        elif kind == "level":
            k, l, lg = rnd.uniform(0.005, 0.05), rnd.uniform(2, 10), rnd.uniform(0, 20)
            kc, ti, td = simc_integrating(k, l + lg, rnd.uniform(0.4, 3) * (l + lg))
            t, lag = "", "%.1f s" % lg
            model, scan, tscan, pv, tag = "integrating", "1 s", "1 s", "0..100", "LIC"
        elif kind == "temperature":
            k, t, t2v, l = rnd.uniform(0.5, 3), rnd.uniform(100, 600), rnd.uniform(10, 60), rnd.uniform(10, 60)
            kc, ti, td = simc_sopdt(k, t, t2v, l, rnd.uniform(0.4, 3) * l)
            t2 = "%.0f s" % t2v
            model, scan, tscan, pv, tag = "sopdt", "1 s", "1 s", "0..200", "TIC"
        else:
            k, t, l = rnd.uniform(0.5, 2), rnd.uniform(200, 900), rnd.uniform(30, 200)
            kc, ti, _ = simc_fopdt(k, t, l, rnd.uniform(0.4, 3) * l)
            td = min(l / 2, ti / 4)
            model, scan, tscan, pv, tag = "fopdt", "2 s", "2 s", "0..5", "AIC"
        kc *= detune
        if i % 3 == 0:
            scan = ""  # no source scan: the design loop is the continuous law
        row = ["%s-%05d" % (tag, i), "series-pb-min", "%.1f" % (100.0 / kc), "%.3f" % (ti / 60.0),
               "%.3f" % (td / 60.0), scan, tscan, pv, "0..100", model, "%.4g" % k,
               "" if t == "" else "%.1f s" % t, t2, "%.2f s" % l, lag]
        out.append(",".join(row))
    sys.stdout.write("\n".join(out) + "\n")


if __name__ == "__main__":
    main()
