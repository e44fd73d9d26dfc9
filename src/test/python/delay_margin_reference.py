"""The exact delay margin of a sampled loop, for the golden scripts that write one (numpy only; no code
shared with loopform): the least extra process dead time at which the closed loop's largest pole reaches
the unit circle, found on the closed loop's eigenvalues with the process sampled again at each extra dead
time. Imported by write_check_golden.py, write_crossing_golden.py and write_stability_crosscheck.py."""
import numpy as np
from scipy.signal import tf2ss

# Beyond this many scans loopform keeps the reading PM / wc (check.SampledDelayMargin): its error is of the order of
# a scan there, and the closed loop with that many extra delay states is too large to search by eigenvalues.
EXACT_DELAY_MARGIN_MAX_SCANS = 20


def least_destabilizing_extra_dead_time(largest_pole, h, estimate):
    """The least extra process dead time (s) at which the sampled loop's largest closed-loop pole reaches 1.

    ``largest_pole(extra)`` samples the process again with dead time L + extra and returns the largest
    eigenvalue magnitude of the closed loop. Only a whole number of extra scans multiplies L(z) by z^-k,
    so PM / wc (``estimate``) is not the answer between whole scans (Astrom and Wittenmark,
    Computer-Controlled Systems, 3rd ed., 1997, ch. 2 - from memory); but one more scan than it puts the
    same crossover past -1, so the answer lies in (0, estimate + h]. Above EXACT_DELAY_MARGIN_MAX_SCANS
    scans the estimate is returned, as loopform does. Steps of at most h/20 (and at most
    400 steps) up to 1.1 (estimate + h), then 50 halvings of the step where the loop first turns unstable.
    """
    if estimate > EXACT_DELAY_MARGIN_MAX_SCANS * h:
        return estimate  # loopform keeps PM / wc there (never more than a scan too small); so does this reference
    top = 1.1 * (estimate + h)
    step = max(min(h / 20.0, top / 50.0), top / 400.0)
    x = 0.0
    while x < top:
        nx = x + step
        if largest_pole(nx) >= 1.0:
            a, b = x, nx
            for _ in range(50):
                mid = 0.5 * (a + b)
                if largest_pole(mid) >= 1.0:
                    b = mid
                else:
                    a = mid
            return 0.5 * (a + b)
        x = nx
    raise AssertionError("no destabilizing dead time up to %g s (PM/wc %g s)" % (top, estimate))


def pid_pulse(k, ti, td, tf, h):
    """The ideal PID run with backward differences, C(z) as num, den ascending in q = 1/z."""
    P = np.polynomial.polynomial
    num, den = np.array([k]), np.array([1.0])
    if ti > 0:
        n2, d2 = np.array([k * h / ti]), np.array([1.0, -1.0])
        num, den = P.polyadd(P.polymul(num, d2), P.polymul(n2, den)), P.polymul(den, d2)
    if td > 0:
        n2, d2 = k * td / (tf + h) * np.array([1.0, -1.0]), np.array([1.0, -tf / (tf + h)])
        num, den = P.polyadd(P.polymul(num, d2), P.polymul(n2, den)), P.polymul(den, d2)
    size = max(len(num), len(den))
    return np.pad(num, (0, size - len(num))), np.pad(den, (0, size - len(den)))


def closed_loop_largest_pole(pa, ga, ca, cnum, cden):
    """Largest |eigenvalue| of x+ = pa x + ga u, y = ca x, u = -C(z) y (C from ascending-in-q num, den)."""
    n = pa.shape[0]
    if len(cden) == 1:
        ac, bc, cc, dc = np.zeros((0, 0)), np.zeros((0, 1)), np.zeros((1, 0)), np.array([[cnum[0] / cden[0]]])
    else:
        ac, bc, cc, dc = tf2ss(cnum, cden)
    nc = ac.shape[0]
    m = np.zeros((n + nc, n + nc))
    m[:n, :n] = pa - ga @ dc @ ca
    m[:n, n:] = ga @ cc
    m[n:, :n] = -bc @ ca
    m[n:, n:] = ac
    return float(np.max(np.abs(np.linalg.eigvals(m))))
