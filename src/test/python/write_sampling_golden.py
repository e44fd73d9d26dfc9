#!/usr/bin/env python3
"""Writes reference values for loopform's zero-order-hold sampling tests.

The reference is scipy.signal.cont2discrete(method='zoh') on delay-free processes, simulated
with scipy.signal.dlsim and evaluated with scipy.signal.dfreqresp.

Regenerate (from the repository root):
    python3 src/test/python/write_sampling_golden.py

loopform samples the output at t = k h just before u(k) takes effect; for the strictly proper
processes used here that is the same sample scipy's dlsim reports, so no shifting is needed.
"""
import csv
import os

import numpy as np
import scipy
from scipy import signal

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "org", "loopform", "lti")

# name, numerator (descending powers of s), denominator (descending), scan seconds
CASES = [
    ("first_order", [2.0], [5.0, 1.0], 0.5),
    ("second_order_underdamped", [1.5], [4.0, 0.8, 1.0], 0.25),
    ("third_order_lag", [1.0], np.polymul(np.polymul([1.0, 1.0], [1.0, 1.0]), [1.0, 1.0]).tolist(), 0.3),
    ("lead_lag_numerator", [4.0, 1.0], np.polymul([2.0, 1.0], [1.0, 1.0]).tolist(), 0.2),
]

STEPS = 60
OMEGAS_FRACTION_OF_NYQUIST = [0.001, 0.01, 0.05, 0.1, 0.3, 0.6, 0.9]


def input_sequence(n):
    # a deterministic, rich piecewise-constant input: a step, a ramp-like term and a sinusoid
    k = np.arange(n)
    return 1.0 + 0.5 * np.sin(0.7 * k) - 0.02 * k + np.where(k % 9 == 4, 0.8, 0.0)


def discretize(num, den, h):
    numd, dend, _ = signal.cont2discrete((num, den), h, method="zoh")
    # every case is strictly proper, so the leading z^n coefficient (the direct term) is zero;
    # trimming it keeps scipy's normalize() from warning about it
    numd = np.trim_zeros(np.atleast_1d(np.squeeze(numd)), "f")
    return numd, dend


def fmt(values):
    return " ".join(repr(float(v)) for v in values)


def main():
    os.makedirs(OUT, exist_ok=True)
    with open(os.path.join(OUT, "zoh-golden-cases.csv"), "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["case", "numerator_descending", "denominator_descending", "scan_seconds"])
        for name, num, den, h in CASES:
            w.writerow([name, fmt(num), fmt(den), repr(h)])
    with open(os.path.join(OUT, "zoh-golden-steps.csv"), "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["case", "k", "u", "y"])
        for name, num, den, h in CASES:
            numd, dend = discretize(num, den, h)
            u = input_sequence(STEPS)
            _, y = signal.dlsim((numd, dend, h), u)
            for k in range(STEPS):
                w.writerow([name, k, repr(float(u[k])), repr(float(y[k, 0]))])
    with open(os.path.join(OUT, "zoh-golden-frequency.csv"), "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["case", "omega_rad_per_second", "re", "im"])
        for name, num, den, h in CASES:
            numd, dend = discretize(num, den, h)
            nyquist = np.pi / h
            omegas = np.array(OMEGAS_FRACTION_OF_NYQUIST) * nyquist
            _, resp = signal.dfreqresp((numd, dend, h), w=omegas * h)
            for om, r in zip(omegas, resp):
                w.writerow([name, repr(float(om)), repr(float(r.real)), repr(float(r.imag))])
    print("wrote golden files with scipy", scipy.__version__, "to", os.path.normpath(OUT))


if __name__ == "__main__":
    main()
