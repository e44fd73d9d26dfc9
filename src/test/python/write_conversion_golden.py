#!/usr/bin/env python3
"""Golden frequency responses of PID laws, evaluated independently of loopform with scipy.

Each case is a tuning written in one controller structure. Its transfer function is built here
straight from the structure's textbook definition (Astrom & Hagglund, PID Controllers: Theory,
Design and Tuning, 2nd ed., ISA 1995, sec. 3.4), multiplied out with numpy polynomial algebra,
and evaluated with scipy.signal.freqs at log-spaced frequencies. loopform's tests convert the
same tuning into every catalog form it can write exactly and require the converted law to give
these responses.

Regenerate (from the repository root):
    python3 src/test/python/write_conversion_golden.py
"""
import csv
import os

import numpy as np
from scipy import signal

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "org", "loopform", "form",
                   "pid-frequency-response.csv")


def ideal(kc, ti, td, n):
    """Kc (1 + 1/(Ti s) + Td s / (1 + s Td/N)) as (num, den), highest power first."""
    tf = td / n if td > 0 else 0.0
    # Kc [ Ti s (1 + tf s) + (1 + tf s) + Ti Td s^2 ] / [ Ti s (1 + tf s) ]
    num = kc * np.polyadd(np.polyadd(np.polymul([ti, 0.0], [tf, 1.0]), [tf, 1.0]), [ti * td, 0.0, 0.0])
    den = np.polymul([ti, 0.0], [tf, 1.0])
    return num, den


def series(kc, ti, td, n):
    """Kc (1 + 1/(Ti s)) (1 + Td s) / (1 + s Td/N)."""
    tf = td / n if td > 0 else 0.0
    num = kc * np.polymul([ti, 1.0], [td, 1.0])
    den = np.polymul([ti, 0.0], [tf, 1.0])
    return num, den


def parallel(kp, ki, kd, n):
    """kp + ki/s + kd s / (1 + s Tf), Tf = (kd/kp)/N."""
    tf = (kd / kp) / n if kd > 0 else 0.0
    # [kp s (1 + tf s) + ki (1 + tf s) + kd s^2] / [s (1 + tf s)]
    num = np.polyadd(np.polyadd(np.polymul([kp, 0.0], [tf, 1.0]), np.polymul([ki], [tf, 1.0])), [kd, 0.0, 0.0])
    den = np.polymul([1.0, 0.0], [tf, 1.0])
    return num, den


# (case id, structure, values in SI seconds and %/%, N). Invented tunings covering slow and fast loops.
CASES = [
    ("ideal-slow", "ideal", (1.2, 240.0, 30.0, 10.0)),
    ("ideal-fast", "ideal", (0.45, 2.5, 0.2, 8.0)),
    ("ideal-pi", "ideal", (2.0, 90.0, 0.0, 10.0)),
    ("ideal-direct", "ideal", (-0.8, 60.0, 6.0, 12.0)),
    ("series-temperature", "series", (3.0, 600.0, 120.0, 10.0)),
    ("series-flow", "series", (0.3, 4.0, 0.5, 10.0)),
    ("parallel-level", "parallel", (4.0, 0.02, 20.0, 10.0)),
]

BUILD = {"ideal": ideal, "series": series, "parallel": parallel}


def main():
    omegas = np.logspace(-4, 2, 25)
    with open(OUT, "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["case", "structure", "a", "b", "c", "n", "omega_rad_s", "re", "im"])
        for case, structure, values in CASES:
            num, den = BUILD[structure](*values)
            _, h = signal.freqs(num, den, worN=omegas)
            for om, r in zip(omegas, h):
                w.writerow([case, structure, *[repr(float(v)) for v in values], repr(float(om)),
                            repr(float(r.real)), repr(float(r.imag))])
    print("wrote", os.path.normpath(OUT))


if __name__ == "__main__":
    main()
