#!/usr/bin/env python3
"""Writes the sampled-loop reference: closed-loop poles, crossings and margins of discrete loops.

Run from the repository root:  python3 src/test/python/write_sampled_loop_golden.py
It writes src/test/resources/org/loopform/analysis/sampled-loop-golden.csv (deterministic, a few
seconds). SampledLoopGoldenTest reads it.

Independent of loopform's Java code: numpy and scipy only.

Loops (all INVENTED): first order (FOPDT), second order (SOPDT, overdamped and lightly damped),
integrating (with and without a lag) and open-loop unstable processes, each with a dead time that
is generally not a whole number of scans, under a discrete PI or PID as a scan controller runs it.

Process, sampled exactly through a zero-order hold (Astrom and Wittenmark, Computer-Controlled
Systems, 3rd ed., 1997, ch. 2, sampling a system with a time delay - from memory for the section):
with the dead time L = d h + tau (0 <= tau < h),
  x(k+1) = Phi x(k) + Gamma0 u(k-d) + Gamma1 u(k-d-1),
  Phi = e^(A h), Gamma0 = Gamma(h - tau), Gamma1 = e^(A (h - tau)) Gamma(tau),
  Gamma(t) = integral_0^t e^(A s) ds B,
read off scipy.linalg.expm of [[A t, B t], [0, 0]]. The state u(k-d-1) is added (state
augmentation), so the pulse transfer function from u(k-d) to y is H(z) with one extra pole at
z = 0 when tau > 0, and the whole loop carries z^-d.

Controller (positional algorithm, backward-difference integral and filtered backward-difference
derivative; Wittenmark, Astrom and Arzen, "Computer Control: An Overview", IFAC Professional Brief,
2002, Table 3 - from memory for the table): I(k) = I(k-1) + (K/Ti) h e(k),
D(k) = a D(k-1) + K Td g (e(k) - e(k-1)), a = Tf/(Tf + h), g = 1/(Tf + h), Tf = Td/N, so
  C(z) = K + (K h/Ti) z/(z - 1) + K Td g (z - 1)/(z - a).
The open loop is L(z) = R(z) z^-d with R = C H.

Stability (Astrom and Wittenmark 1997, ch. 3, stability of sampled systems - from memory): the
closed-loop poles are the roots of the characteristic polynomial den_R(z) z^d + num_R(z) (no
cancellation), by numpy.roots; the count outside the unit circle, the largest magnitude and every
magnitude (so that the count outside any other circle can be checked too).

Margins (Astrom and Murray, Feedback Systems, 2008, ch. 9-10, the Nyquist criterion and stability
margins - from memory for the sections) on z = e^(i w h), w over [low, pi/h]:
- gain crossovers: every sign change of |L| - 1 on a grid of 400,000 points, refined by brentq;
- phase crossovers: every pass of L across the negative real axis (a sign change of Im L with
  Re L < 0), refined by brentq on Im L; at the Nyquist frequency z = -1 L is real, and a negative
  L(-1) is a phase crossover there;
- gain margin: the smallest 1/|L| >= 1 over the phase crossovers; lower gain margin: the largest
  1/|L| < 1; phase margin: 180 + arg L wrapped into (-180, 180] degrees at the gain
  crossover where it is smallest in size (nearest -1), with its sign, and that crossover; delay margin: the smallest
  ((180 + arg L) mod 360, in rad) / w over the gain crossovers;
- every gain crossover with its own phase and delay margin, every phase crossover with its 1/|L|,
  in rising frequency, and |L| at the band's low end;
- Ms = max 1/|1 + L| over the band: the grid, then a zoom (2,001 points, forty times) around the
  twenty best grid points; where it is read.
Edge cases: a loop with its largest closed-loop pole 1e-4 inside and 1e-4 outside the unit circle
and one 1e-10 from it (gain found by brentq on the largest root magnitude); a loop whose phase is
-180 degrees exactly at the Nyquist frequency; several gain and phase crossovers (lightly damped
process); a conditionally stable loop (lower gain margin); open-loop unstable processes.
Accuracy: roots of these low-degree polynomials to about 1e-13; crossings to about 1e-14 relative.
"""
import csv
import os

import numpy as np
from scipy import linalg, optimize, signal

OUT = os.path.join("src", "test", "resources", "org", "loopform", "analysis", "sampled-loop-golden.csv")


def zoh_with_delay(num_s, den_s, h, dead):
    """The pulse transfer function num(z)/den(z) from u(k-d) to y and d, dead = d h + tau."""
    a, b, c, dd = signal.tf2ss(num_s, den_s)
    n = a.shape[0]
    d = int(np.floor(dead / h + 1e-12))
    tau = dead - d * h
    if tau < 1e-12 * h:
        tau = 0.0

    def phi_gamma(t):
        m = np.zeros((n + 1, n + 1))
        m[:n, :n] = a * t
        m[:n, n:] = b * t
        e = linalg.expm(m)
        return e[:n, :n], e[:n, n:]

    phi, _ = phi_gamma(h)
    phi_rest, gamma0 = phi_gamma(h - tau)
    _, gamma_tau = phi_gamma(tau)
    gamma1 = phi_rest @ gamma_tau
    if tau == 0.0:
        num, den = signal.ss2tf(phi, gamma0, c, dd)
        poles = list(np.exp(np.roots(den_s) * h))
    else:
        aa = np.zeros((n + 1, n + 1))
        aa[:n, :n] = phi
        aa[:n, n:] = gamma1
        bb = np.vstack([gamma0, [[1.0]]])
        cc = np.hstack([c, [[0.0]]])
        num, den = signal.ss2tf(aa, bb, cc, dd)
        poles = list(np.exp(np.roots(den_s) * h))
    num = np.trim_zeros(np.atleast_1d(num[0]), "f")
    # the denominator from the exactly known poles (e^(p h), and z = 0 for the augmented state)
    den = np.real(np.poly(poles + ([0.0] if tau > 0 else [])))
    return num, den, d, poles


def controller(k, ti, td, n, h):
    """C(z) = num/den of the positional P/PI/PID (ti None: no integral) with its poles other than z = 0."""
    num = np.array([float(k)])
    den = np.array([1.0])
    poles = []
    if ti is not None:
        num = np.polyadd(np.polymul(num, [1.0, -1.0]), [k * h / ti, 0.0])
        den = np.array([1.0, -1.0])
        poles.append(1.0)
    if td > 0:
        tf = td / n
        a = tf / (tf + h)
        g = 1.0 / (tf + h)
        # over the common denominator den (z - a): num (z - a) + K Td g (z - 1) den
        num = np.polyadd(np.polymul(num, [1.0, -a]), k * td * g * np.polymul([1.0, -1.0], den))
        den = np.polymul(den, [1.0, -a])
        if a != 0:
            poles.append(a)
    return num, den, poles


class Loop:
    def __init__(self, ident, process, k, ti, td, n, h, dead):
        self.id = ident
        self.h = h
        pn, pd, self.d, ppoles = zoh_with_delay(process[0], process[1], h, dead)
        cn, cd, cpoles = controller(k, ti, td, n, h)
        self.num = np.polymul(cn, pn)
        self.den = np.polymul(cd, pd)
        self.poles = [p for p in cpoles + ppoles if abs(p) > 0]
        self.low = 1e-3 / h

    def char_poly(self):
        return np.polyadd(np.polymul(self.den, np.r_[1.0, np.zeros(self.d)]), self.num)

    def closed_loop_poles(self):
        return np.roots(self.char_poly())

    def l(self, w):
        z = np.exp(1j * np.asarray(w) * self.h)
        return np.polyval(self.num, z) / np.polyval(self.den, z) * z ** (-self.d)


def custom(ident, num, den, d, h):
    """A loop given straight as R(z) = num/den and d (for the far ends of the pole magnitude)."""
    loop = Loop.__new__(Loop)
    loop.id, loop.h, loop.d, loop.low = ident, h, d, 1e-3 / h
    loop.num, loop.den = np.array(num, dtype=float), np.array(den, dtype=float)
    loop.poles = [p for p in np.roots(loop.den) if abs(p) > 0]
    return loop


def scaled(loop, factor, ident):
    other = Loop.__new__(Loop)
    other.__dict__.update(loop.__dict__)
    other.id = ident
    other.num = loop.num * factor
    return other


def largest(loop):
    return float(np.max(np.abs(loop.closed_loop_poles())))


def with_largest_pole(loop, radius, lo, hi, ident):
    """The loop with its gain scaled so that its largest closed-loop pole has magnitude radius."""
    f = optimize.brentq(lambda s: largest(scaled(loop, s, ident)) - radius, lo, hi, xtol=1e-15, rtol=1e-15)
    return scaled(loop, f, ident)


def margins(loop):
    top = np.pi / loop.h
    w = np.geomspace(loop.low, top, 400_000)
    w[-1] = top
    lw = loop.l(w)
    mag = np.abs(lw)
    gains = []
    for i in np.nonzero(np.diff(np.sign(mag - 1)) != 0)[0]:
        wc = optimize.brentq(lambda x: abs(loop.l(x)) - 1, w[i], w[i + 1], xtol=1e-300, rtol=1e-15)
        gains.append(wc)
    phases = []
    im = lw.imag
    for i in np.nonzero(np.diff(np.sign(im)) != 0)[0]:
        if lw.real[i] < 0 and lw.real[i + 1] < 0:
            wp = optimize.brentq(lambda x: loop.l(x).imag, w[i], w[i + 1], xtol=1e-300, rtol=1e-15)
            phases.append(wp)
    end = loop.l(top)
    if end.real < 0 and (not phases or abs(phases[-1] - top) > 1e-9 * top):
        phases.append(top)
    gm = lgm = wgm = None
    for wp in phases:
        inv = 1 / abs(loop.l(wp))
        if inv >= 1 and (gm is None or inv < gm):
            gm, wgm = inv, wp
        if inv < 1 and (lgm is None or inv > lgm):
            lgm = inv
    pm = wpm = dm = None
    for wc in gains:
        ang = np.degrees(np.angle(loop.l(wc)))
        p = 180.0 + ang
        p = (p + 180.0) % 360.0 - 180.0
        if p <= -180.0:
            p += 360.0
        if pm is None or abs(p) < abs(pm):  # the crossover nearest -1: least lag or lead
            pm, wpm = p, wc
        delay = np.radians((180.0 + ang) % 360.0) / wc
        if dm is None or delay < dm:
            dm = delay
    gain_list = []
    for wc in gains:
        ang = np.degrees(np.angle(loop.l(wc)))
        p = (180.0 + ang + 180.0) % 360.0 - 180.0
        if p <= -180.0:
            p += 360.0
        gain_list.append("%r:%r:%r" % (float(wc), float(p), float(np.radians((180.0 + ang) % 360.0) / wc)))
    phase_list = ["%r:%r" % (float(wp), float(1 / abs(loop.l(wp)))) for wp in phases]
    s = 1 / np.abs(1 + lw)
    ms, wms = float(s.max()), float(w[s.argmax()])
    for i in np.argsort(s)[-20:]:
        lo, hi = w[max(i - 1, 0)], w[min(i + 1, len(w) - 1)]
        # zoom: 2,001 points across the bracket, keep the best point's neighbours, 40 times
        # (scipy's bounded minimize_scalar stops at sqrt(eps) relative, too coarse for a pole
        # 1e-10 from the circle)
        for _ in range(40):
            x = np.linspace(lo, hi, 2001)
            v = np.abs(1 + loop.l(x))
            j = int(v.argmin())
            if 1 / v[j] > ms:
                ms, wms = float(1 / v[j]), float(x[j])
            lo, hi = x[max(j - 1, 0)], x[min(j + 1, 2000)]
            if hi - lo <= 4e-16 * hi:
                break
    return dict(gm=gm, wgm=wgm, lgm=lgm, pm=pm, wpm=wpm, dm=dm, ms=ms, wms=wms,
                gains=len(gains), phases=len(phases), gain_list=" ".join(gain_list),
                phase_list=" ".join(phase_list), low_gain=float(mag[0]))


def fopdt(k, t):
    return [k], [t, 1.0]


def sopdt(k, t1, t2):
    return [k], np.polymul([t1, 1.0], [t2, 1.0])


def resonant(k, wn, zeta):
    return [k * wn * wn], [1.0, 2 * zeta * wn, wn * wn]


def integrating(k, t=0.0):
    return ([k], [1.0, 0.0]) if t == 0 else ([k], [t, 1.0, 0.0])


def unstable(k, t):
    return [k], [t, -1.0]


def loops():
    out = [
        Loop("fopdt-pi", fopdt(2.0, 10.0), 0.8, 8.0, 0.0, 10.0, 1.0, 2.5),
        Loop("fopdt-pid", fopdt(1.0, 5.0), 2.0, 5.0, 0.8, 8.0, 0.5, 1.3),
        Loop("fopdt-pi-slow-scan", fopdt(1.0, 4.0), 0.9, 4.0, 0.0, 10.0, 2.0, 1.0),
        Loop("fopdt-pi-unstable", fopdt(1.5, 3.0), 4.0, 2.0, 0.0, 10.0, 0.5, 2.2),
        Loop("sopdt-pid", sopdt(1.0, 6.0, 2.0), 2.5, 7.0, 1.5, 10.0, 0.4, 1.7),
        Loop("sopdt-pid-fast-filter", sopdt(0.5, 3.0, 1.0), 4.0, 3.5, 0.9, 20.0, 0.2, 0.75),
        Loop("resonant-pi", resonant(1.0, 2.0, 0.05), 0.2, 1.5, 0.0, 10.0, 0.05, 0.33),
        Loop("resonant-pid", resonant(1.0, 1.0, 0.1), 0.3, 2.0, 0.4, 8.0, 0.1, 0.27),
        Loop("integrating-pi", integrating(0.1), 2.0, 20.0, 0.0, 10.0, 1.0, 3.4),
        Loop("integrating-lag-pid", integrating(0.2, 2.0), 1.5, 12.0, 1.0, 10.0, 0.5, 1.6),
        Loop("integrating-pi-unstable", integrating(0.5), 3.0, 4.0, 0.0, 10.0, 1.0, 2.0),
        Loop("open-loop-unstable-pi", unstable(1.0, 10.0), 3.0, 15.0, 0.0, 10.0, 0.5, 1.2),
        Loop("open-loop-unstable-pid", unstable(2.0, 5.0), 1.2, 8.0, 0.5, 10.0, 0.25, 0.6),
        Loop("open-loop-unstable-low-gain", unstable(1.0, 10.0), 0.7, 15.0, 0.0, 10.0, 0.5, 1.2),
        Loop("whole-scan-delay", fopdt(1.0, 8.0), 1.2, 6.0, 0.0, 10.0, 1.0, 4.0),
        Loop("long-delay", fopdt(1.0, 20.0), 0.5, 18.0, 0.0, 10.0, 1.0, 17.6),
        Loop("pid-no-delay", fopdt(1.0, 2.0), 6.0, 1.0, 0.3, 10.0, 0.1, 0.0),
    ]
    # conditionally stable: an unstable lead-free process with a PID whose gain can fall too far
    out.append(Loop("conditional-unstable-process", unstable(1.0, 2.0), 4.0, 6.0, 0.6, 10.0, 0.1, 0.15))
    base = Loop("near-boundary", fopdt(1.0, 5.0), 1.0, 5.0, 0.0, 10.0, 0.5, 1.3)
    out.append(with_largest_pole(base, 1 - 1e-4, 0.5, 20.0, "pole-just-inside"))
    out.append(with_largest_pole(base, 1 + 1e-4, 0.5, 20.0, "pole-just-outside"))
    out.append(with_largest_pole(base, 1 + 1e-10, 0.5, 20.0, "pole-on-circle"))
    # a phase of exactly -180 degrees at z = -1: proportional control of a ZOH-sampled lag, one scan
    # of delay, makes L(-1) = -K b/(1 + a) real and negative
    out.append(Loop("nyquist-crossing", fopdt(1.0, 1.0), 1.0, None, 0.0, 10.0, 0.5, 0.5))
    out.append(Loop("nyquist-crossing-unstable", fopdt(1.0, 1.0), 4.0, None, 0.0, 10.0, 0.5, 0.5))
    # the far ends: 1 + L = z / (z - 0.5) has its only zero at z = 0 (deadbeat); a zero at
    # z = 0.5 - 1e20, far beyond e^40; a pole pair well inside and one well outside with delay
    out.append(custom("deadbeat", [0.5], [1.0, -0.5], 0, 1.0))
    out.append(custom("far-outside", [1e20], [1.0, -0.5], 0, 1.0))
    out.append(custom("well-inside-with-delay", [0.05], [1.0, -0.2], 3, 1.0))
    out.append(custom("well-outside-with-delay", [2.0], [1.0, -0.9], 2, 1.0))
    return out


def fmt(x):
    return "" if x is None else repr(float(x))


def main():
    rows = []
    for loop in loops():
        roots = loop.closed_loop_poles()
        mags = np.abs(roots)
        m = margins(loop)
        rows.append([loop.id, repr(loop.h), str(loop.d),
                     " ".join(repr(float(c)) for c in loop.num),
                     " ".join(repr(float(c)) for c in loop.den),
                     " ".join("%r:%r" % (float(np.real(p)), float(np.imag(p))) for p in loop.poles),
                     repr(loop.low), str(int(np.sum(mags > 1.0))), repr(float(mags.max())),
                     fmt(m["gm"]), fmt(m["wgm"]), fmt(m["lgm"]), fmt(m["pm"]), fmt(m["wpm"]), fmt(m["dm"]),
                     repr(float(m["ms"])), repr(float(m["wms"])), str(m["gains"]), str(m["phases"]),
                     " ".join(repr(float(x)) for x in np.sort(mags)),
                     m["gain_list"], m["phase_list"], repr(m["low_gain"])])
        print(loop.id, rows[-1][7:])
    with open(OUT, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["id", "scan_s", "delay_scans", "num_desc", "den_desc", "open_loop_poles", "low_rad_s",
                    "unstable_poles", "largest_pole_magnitude", "gain_margin", "phase_crossover_rad_s",
                    "lower_gain_margin", "phase_margin_deg", "gain_crossover_rad_s", "delay_margin_s",
                    "ms", "ms_rad_s", "gain_crossovers", "phase_crossovers", "pole_magnitudes",
                    "each_gain_crossover (rad/s:PM deg:DM s)", "each_phase_crossover (rad/s:1/|L|)",
                    "loop_gain_at_low"])
        w.writerows(rows)


if __name__ == "__main__":
    main()
