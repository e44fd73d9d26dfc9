#!/usr/bin/env python3
"""Golden deviations for the nearest fit, evaluated independently of loopform with numpy.

For each case a source law (a tuning in its structure, with its derivative filter) and the
"values kept" law (the same gain, integral and derivative times, by the textbook relations of
Astrom & Hagglund, PID Controllers, 2nd ed., ISA 1995, sec. 3.4, written with the target's fixed
filter ratio) are evaluated at frequencies near the loop's crossover. The file holds the source's
response (re, im) and the kept law's gain and phase deviation from it. loopform's nearest fit must
be no worse there than keeping the values.

A second file holds loops with a process: the source law's response and the kept law's deviation
at frequencies from a tenth to three times the design loop's crossover (found here with numpy).

Regenerate (from the repository root):
    python3 src/test/python/write_nearest_fit_golden.py
"""
import csv
import os

import numpy as np

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "org", "loopform", "form",
                   "nearest-fit-golden.csv")


def ideal(kc, ti, td, n, s):
    """Kc (1 + 1/(Ti s) + Td s / (1 + s Td/N)) at complex s."""
    return kc * (1 + 1 / (ti * s) + td * s / (1 + s * td / n))


def series(kc, ti, td, n, s):
    """Kc (1 + 1/(Ti s)) (1 + Td s) / (1 + s Td/N) at complex s."""
    return kc * (1 + 1 / (ti * s)) * (1 + td * s) / (1 + s * td / n)


def series_to_ideal_textbook(kc, ti, td):
    """Astrom & Hagglund 1995, sec. 3.4: Kc = Kc'(1 + Td'/Ti'), Ti = Ti' + Td', Td = Ti'Td'/(Ti' + Td')."""
    return kc * (1 + td / ti), ti + td, ti * td / (ti + td)


CASES = [
    # id, source form and values, target form, kept law, frequencies near crossover (rad/s)
    ("ideal-1-60-10", "ideal", "kc=1 ti=60 td=10", "ideal-fixed-n8",
     lambda s: ideal(1, 60, 10, 10, s), lambda s: ideal(1, 60, 10, 8, s), [0.03, 0.035, 0.04, 0.045, 0.05]),
    ("series-2-10-2", "series", "kc=2 ti=10 td=2", "ideal-fixed-n8",
     lambda s: series(2, 10, 2, 10, s), lambda s: ideal(*series_to_ideal_textbook(2, 10, 2), 8, s),
     [0.1, 0.15, 0.2, 0.3, 0.4]),
]


CROSSOVER_OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "org", "loopform", "form",
                             "nearest-fit-crossover-golden.csv")


def fopdt(k, t, l, s):
    """K e^(-L s) / (T s + 1) at complex s."""
    return k * np.exp(-l * s) / (t * s + 1)


def crossover(controller, process):
    """The gain crossover of controller * process: |L(i w)| = 1, by bisection on a log grid (numpy only)."""
    w = np.logspace(-6, 2, 200001)
    m = np.abs(controller(1j * w) * process(1j * w)) - 1
    k = int(np.nonzero(np.sign(m[:-1]) != np.sign(m[1:]))[0][0])
    lo, hi = w[k], w[k + 1]
    for _ in range(200):
        mid = np.sqrt(lo * hi)
        if (abs(controller(1j * mid) * process(1j * mid)) - 1) * m[k] > 0:
            lo = mid
        else:
            hi = mid
    return float(np.sqrt(lo * hi))


# Loops with a process: the nearest fit is weighted around the design loop's crossover. Each case's
# loop is given in the Java test by its file (the invented demo loop TIC-301) or written out there.
# The kept law is the textbook relations (sec. 3.4) as the target holds them.
CROSSOVER_CASES = [
    # TIC-301 (invented demo loop): series-pb-min pb=60 (Kc' = 100/60), ti 6 min, td 0.3 min, N = 10,
    # FOPDT 1.5, 300 s, 30 s; target plant-k7-target, ideal with N fixed at 10.
    ("tic-301", lambda s: series(100 / 60, 360, 18, 10, s),
     lambda s: ideal(*series_to_ideal_textbook(100 / 60, 360, 18), 10, s),
     lambda s: fopdt(1.5, 300, 30, s)),
    # An unfiltered series law (n=off) 2, 100 s, 20 s into ideal-fixed-n8, same process.
    ("series-off-into-n8", lambda s: series(2, 100, 20, np.inf, s),
     lambda s: ideal(*series_to_ideal_textbook(2, 100, 20), 8, s),
     lambda s: fopdt(1.5, 300, 30, s)),
]


def write_crossover():
    with open(CROSSOVER_OUT, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["case", "crossover_rad_s", "omega_rad_s", "source_re", "source_im",
                    "kept_gain_db", "kept_phase_deg"])
        for cid, source, kept, process in CROSSOVER_CASES:
            wc = crossover(source, process)
            for factor in [0.1, 0.2, 0.5, 1.0, 1.5, 2.0, 3.0]:
                om = wc * factor
                a = source(1j * om)
                ratio = kept(1j * om) / a
                w.writerow([cid, repr(wc), repr(om), repr(a.real), repr(a.imag),
                            repr(float(abs(20 * np.log10(abs(ratio))))),
                            repr(float(abs(np.degrees(np.angle(ratio)))))])


def main():
    with open(OUT, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["case", "from", "values", "to", "omega_rad_s", "source_re", "source_im",
                    "kept_gain_db", "kept_phase_deg"])
        for cid, src, values, dst, source, kept, omegas in CASES:
            for om in omegas:
                s = 1j * om
                a = source(s)
                b = kept(s)
                ratio = b / a
                w.writerow([cid, src, values, dst, repr(om), repr(a.real), repr(a.imag),
                            repr(float(abs(20 * np.log10(abs(ratio))))), repr(float(abs(np.degrees(np.angle(ratio)))))])


if __name__ == "__main__":
    main()
    write_crossover()
