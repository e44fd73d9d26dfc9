## Writes the second, independent cross-check of the sampled loop's stability and margins, computed
## with GNU Octave 7.3.0 and its control package 3.4.0 (Debian bookworm: `apt-get install -y
## --no-install-recommends octave octave-control`).
##
## Regenerate from the repository root:
##   octave --no-gui --quiet src/test/octave/write_octave_golden.m
## It writes src/test/resources/octave/golden.csv and src/test/resources/octave/loops/*.yaml (a few
## seconds; deterministic: the loops are listed below, no random draw). The test suite reads the
## committed files and needs no Octave (OctaveCrossCheckTest).
##
## Every loop below is INVENTED for this check. Its dead time is a whole number d of scans, so the
## sampled process is exactly Octave's c2d (P, h, "zoh") times z^-d (the control package 3.4.0 has
## no input delay in c2d or margin, which is why fractional dead times are left to the numpy
## references). The target is the catalog form `ideal` (forms-catalog/ideal.yaml, algorithm
## defaults of forms-catalog/README.md: positional, backward-difference integral and derivative,
## filter Tf = Td/N on the derivative). Its pulse transfer function from the measurement, written
## out here from the algorithm (Wittenmark, Astrom and Arzen, "Computer Control: An Overview", IFAC
## Professional Brief, 2002, Table 3):
##   C(z) = K [1 + (h/Ti) z/(z - 1) + Td g (z - 1)/(z - a)],  a = Tf/(Tf + h),  g = 1/(Tf + h)
## (the integral term absent when Ti = 0, the derivative term when Td = 0). The open loop is
## L(z) = C(z) z^-d Pzoh(z), negative feedback.
##
## Computed with Octave's own functions:
## - stability: pole (feedback (L, 1)), its largest magnitude, isstable (feedback (L, 1));
## - margins as the package's margin (L) gives them: [GM, PM, wGM, wPM] (octave_* columns).
## The package's margin is not the definition loopform uses in every case, so the exact
## definitions are written out here as well, on the frequency response of the same transfer
## function (the package's tfdata, then polyval and fzero; definitions after Astrom and Murray,
## Feedback Systems, 2008, section 9.3; for sampled loops Astrom and Wittenmark,
## Computer-Controlled Systems, 3rd ed., 1997, ch. 7 - both from memory for the section):
## - phase crossovers: every theta = w h in (0, pi] where Im L(e^(i theta)) = 0 and Re L < 0, the
##   Nyquist frequency z = -1 included whenever L(-1) < 0 (L is real there);
## - gain margin: the smallest 1/|L| > 1 over them; lower gain margin: the largest 1/|L| < 1;
## - gain crossovers: every theta in (0, pi] where |L| = 1; phase margin: 180 deg + arg L wrapped
##   into (-180, 180] at the crossover where it is smallest in size (the crossover nearest -1),
##   with its sign; delay margin: the smallest over the crossovers of
##   (180 deg + arg L mod 360 deg, in rad) / w.
## Crossings are the sign changes of Im L and |L| - 1 on a fine logarithmic grid, each refined by
## fzero (see sign_changes). The columns gm_definition and pm_definition say whether margin (L)
## gives the exact figure (`margin`, to SAME relative), gives it 360 deg too high (`margin-360`) or
## not at all (`exact`: the test then compares loopform with the exact column; the reason is in
## `note`). What control 3.4.0's margin does differently, as read in its source (margin.m) and
## seen on these loops: with no gain margin above 1 it returns the largest one below 1 as the gain
## margin (loopform: the lower gain margin); it writes the phase margin as 180 + arg L in
## (0, 360] deg, so a negative margin comes out 360 deg too high; over several gain crossovers it
## takes the smallest of those values, not the crossover nearest -1; with no gain crossover it
## returns 180 deg (loopform: none); and it takes the crossings from roots () of polynomials whose
## unit-circle roots it keeps only within sqrt(eps) of |z| = 1, which loses them near z = 1 where
## an integrating loop's (z - 1)^2 clusters roots (integrator-03: no gain crossover found, true
## one at 0.1385 rad/s). Its test log (z)/(i h) > 0 could also lose the z = -1 crossing if roots ()
## returned -1 with a negative imaginary rounding; on these loops it did not.
## Octave prints an "X11 DISPLAY" note, and fzero "converged to a singular point" where it stops
## with f not small; a point that fails the ROOT test is no crossing and is dropped.

pkg load control

GRID_POINTS = 200001;
GRID_START = pi * 1e-5;   # rad, theta = w h
SAME = 1e-6;
ROOT = 1e-7;   # |Im L|/|L| or ||L| - 1| left at a refined crossing (fzero stops near 1e-9 here)

out_dir = fullfile ("src", "test", "resources", "octave");
loop_dir = fullfile (out_dir, "loops");
if (! exist (loop_dir, "dir"))
  mkdir (loop_dir);
endif

## name, class, process model, process parameters, dead-time scans d, scan h (s), kc, ti (s), td (s), n, note
## fopdt: [gain, time constant s]; sopdt: [gain, damping, natural frequency rad/s];
## integrating: [gain 1/s, lag s (0: none)]
loops = {
  "fopdt-01", "fopdt", "fopdt", [1, 10], 1, 1.0, 2, 8, 0, 10, "PI on a lag-dominant process, one scan of dead time"
  "fopdt-02", "fopdt", "fopdt", [1, 10], 4, 0.5, 4, 8, 1, 10, "PID, dead time 2 s in four scans"
  "fopdt-03", "fopdt", "fopdt", [2, 30], 3, 2.0, 1.2, 30, 0, 10, "PI cancelling the lag"
  "fopdt-04", "fopdt", "fopdt", [1, 5], 5, 1.0, 0.5, 5, 0, 10, "PI, dead time equal to the lag"
  "fopdt-05", "slow-scan", "fopdt", [1.5, 20], 1, 4.0, 3, 12, 2, 8, "PID on a 4 s scan, N = 8"
  "fopdt-06", "slow-scan", "fopdt", [0.8, 100], 1, 10.0, 6, 50, 0, 10, "PI on a 10 s scan"
  "fopdt-07", "high-n", "fopdt", [1, 1], 1, 0.05, 5, 1, 0.5, 100, "PID with N = 100"
  "fopdt-08", "unstable-sampled", "fopdt", [1, 10], 2, 1.0, 8, 10, 0, 10, "PI gain above the sampled loop's ultimate gain"
  "fopdt-09", "unstable-sampled", "fopdt", [1, 10], 2, 1.0, 3.5, 2, 0, 10, "PI with too short an integral time"
  "fopdt-10", "positive-feedback", "fopdt", [-1, 60], 5, 1.0, 2, 60, 0, 10, "negative process gain, reverse-acting PI"
  "fopdt-11", "negative-gain-direct", "fopdt", [-1, 60], 5, 1.0, -2, 60, 0, 10, "negative process gain, direct-acting PI"
  "band-edge-01", "band-edge", "fopdt", [1, 10], 0, 5.0, 2, 8, 0, 10, "no dead time, 5 s scan: the phase reaches -180 deg only at z = -1"
  "band-edge-02", "band-edge", "fopdt", [1, 10], 0, 5.0, 3, 8, 0, 10, "as band-edge-01 with kc 3: GM just above 1 at z = -1"
  "band-edge-03", "band-edge", "fopdt", [1, 10], 0, 5.0, 5, 8, 0, 10, "as band-edge-01 with kc 5: unstable through z = -1"
  "band-edge-04", "band-edge", "sopdt", [1, 0.7, 0.2], 0, 5.0, 1, 8, 0, 10, "second order, no dead time, 5 s scan"
  "band-edge-05", "band-edge", "integrating", [0.1, 0], 0, 2.0, 1.5, 20, 0, 10, "integrator, no dead time, PI on a 2 s scan"
  "resonance-01", "several-crossovers", "sopdt", [1, 0.05, 1], 10, 0.5, 0.15, 5, 0, 10, "lightly damped resonance, three gain crossovers"
  "resonance-02", "several-crossovers", "sopdt", [1, 0.01, 1], 20, 0.25, 0.025, 5, 0, 10, "damping 0.01: two gain crossovers close together at the resonance"
  "resonance-03", "resonance", "sopdt", [1, 0.1, 2], 10, 0.1, 0.3, 2, 0, 10, "resonance at 2 rad/s, dead time 1 s"
  "resonance-04", "resonance", "sopdt", [2, 0.03, 0.5], 4, 0.5, 0.1, 10, 1, 10, "PID on a resonance at 0.5 rad/s"
  "resonance-05", "several-crossovers", "sopdt", [1, 0.02, 1], 4, 0.5, 0.05, 2, 0, 10, "stable with three gain crossovers, the one nearest -1 beyond -180 deg: a negative phase margin"
  "sopdt-01", "sopdt", "sopdt", [1, 0.7, 0.5], 2, 0.5, 1, 4, 1, 10, "PID, damping 0.7"
  "sopdt-02", "sopdt", "sopdt", [1, 1.5, 0.2], 3, 1.0, 1.5, 8, 0, 10, "overdamped, PI"
  "sopdt-03", "sopdt", "sopdt", [0.5, 0.3, 1], 5, 0.1, 2, 3, 0.5, 5, "PID with N = 5"
  "sopdt-04", "unstable-sampled", "sopdt", [1, 0.5, 1], 2, 0.5, 3, 2, 0, 10, "PI gain too high for the loop"
  "integrator-01", "integrator", "integrating", [0.05, 0], 5, 1.0, 0.5, 4, 0, 10, "integral time shorter than the dead time: unstable"
  "integrator-02", "integrator", "integrating", [0.05, 0], 5, 1.0, 0.5, 40, 0, 10, "integrator with dead time, PI"
  "integrator-03", "conditionally-stable", "integrating", [0.1, 10], 2, 0.05, 2, 5, 8, 10, "integrator with a lag, PID: a lower gain margin"
  "integrator-04", "integrator", "integrating", [0.2, 5], 4, 0.5, 0.8, 20, 0, 10, "integrator with a lag, PI"
  "integrator-05", "integrator", "integrating", [1, 0], 4, 0.25, 0.8, 8, 0.4, 8, "integrator, PID with N = 8"
  "integrator-06", "integrator", "integrating", [0.02, 0], 5, 2.0, 2, 0, 0, 10, "integrator under P only"
};

function P = process_tf (model, par)
  switch (model)
    case "fopdt"        # K / (T s + 1)
      P = tf (par(1), [par(2), 1]);
    case "sopdt"        # K / (s^2/wn^2 + 2 zeta s/wn + 1)
      wn = par(3);
      P = tf (par(1), [1/wn^2, 2*par(2)/wn, 1]);
    case "integrating"  # K / s, or K / (s (lag s + 1))
      if (par(2) > 0)
        P = tf (par(1), [par(2), 1, 0]);
      else
        P = tf (par(1), [1, 0]);
      endif
  endswitch
endfunction

function text = process_yaml (model, par, dead)
  switch (model)
    case "fopdt"
      text = sprintf ("{model: fopdt, gain: %.15g, time_constant: %.15g s, dead_time: %.15g s}", par(1), par(2), dead);
    case "sopdt"
      text = sprintf ("{model: sopdt, gain: %.15g, damping: %.15g, natural_frequency: %.15g rad/s, dead_time: %.15g s}",
                      par(1), par(2), par(3), dead);
    case "integrating"
      lag = "";
      if (par(2) > 0)
        lag = sprintf (", lag: %.15g s", par(2));
      endif
      text = sprintf ("{model: integrating, gain: %.15g%s, dead_time: %.15g s}", par(1), lag, dead);
  endswitch
endfunction

## The ideal form's algorithm as the target runs it, from the measurement (see the header).
function C = controller_tf (kc, ti, td, n, h)
  C = tf (kc, 1, h);
  if (ti > 0)
    C = C + tf (kc * h / ti * [1, 0], [1, -1], h);
  endif
  if (td > 0)
    tf_s = td / n;
    a = tf_s / (tf_s + h);
    g = 1 / (tf_s + h);
    C = C + tf (kc * td * g * [1, -1], [1, -a], h);
  endif
endfunction

function v = response_at (num, den, theta)
  z = exp (1i * theta);
  v = polyval (num, z) ./ polyval (den, z);
endfunction

## Angles theta in (0, pi] where f changes sign: a grid of GRID_POINTS angles spaced evenly in
## log theta from GRID_START to pi, each sign change refined by fzero. Below GRID_START the (z - 1)^2
## of an integrating process under integral action cancels in polyval to rounding noise in Im L
## (a spurious crossing at theta about 1e-8 was seen); no crossing of these loops lies below 1e-3,
## which the script checks. The grid's relative step, about 6e-5, is far finer than the closest pair of crossings in these loops (1.6 % apart); roots () of
## the margin polynomials is not used for this, because near z = 1 it loses unit-circle roots
## (an integrator's (z - 1)^2 makes a cluster there).
function thetas = sign_changes (f, grid)
  values = f (grid);
  k = find (sign (values(1:end-1)) .* sign (values(2:end)) < 0);
  thetas = zeros (1, numel (k));
  for j = 1:numel (k)
    thetas(j) = fzero (f, [grid(k(j)), grid(k(j) + 1)], optimset ("TolX", 1e-16));
  endfor
endfunction

function s = num_text (x)
  if (isempty (x) || isnan (x))
    s = "";
  else
    s = sprintf ("%.17g", x);
  endif
endfunction

function s = raw_text (x)
  if (isinf (x))
    s = "Inf";
  elseif (isnan (x))
    s = "NaN";
  else
    s = sprintf ("%.17g", x);
  endif
endfunction

fid = fopen (fullfile (out_dir, "golden.csv"), "w");
fprintf (fid, "file,class,stability,largest_pole_magnitude,closed_loop_poles,gain_margin,gain_margin_rad_s,");
fprintf (fid, "lower_gain_margin,lower_gain_margin_rad_s,phase_margin_deg,crossover_rad_s,delay_margin_s,");
fprintf (fid, "gain_crossovers,phase_crossovers,nyquist_phase_crossover,octave_gain_margin,octave_gain_margin_rad_s,");
fprintf (fid, "octave_phase_margin_deg,octave_crossover_rad_s,gm_definition,pm_definition,note\n");

for row = 1:rows (loops)
  [name, klass, model, par, d, h, kc, ti, td, n, note] = loops{row, :};
  dead = d * h;
  P = c2d (process_tf (model, par), h, "zoh");
  if (d > 0)
    P = P * tf (1, [1, zeros(1, d)], h);
  endif
  C = controller_tf (kc, ti, td, n, h);
  L = C * P;
  [num, den] = tfdata (L, "vector");

  ## stability with the package's functions
  T = feedback (L, 1);
  p = pole (T);
  rho = max (abs (p));
  if (isstable (T))
    stability = "stable";
  else
    stability = "unstable";
  endif
  if (abs (rho - 1) < 1e-5)   # a decision this close to the circle would test rounding, not the method
    error ("%s: largest closed-loop pole %.8g is within 1e-5 of the unit circle; choose another loop", name, rho);
  endif
  if (strcmp (stability, "stable") != (rho < 1))
    error ("%s: isstable and the largest pole %.6g disagree", name, rho);
  endif

  ## margins as the package gives them
  [o_gm, o_pm, o_wgm, o_wpm] = margin (L);

  ## the exact definitions, on the frequency response L(e^(i theta)) from the package's tfdata
  f_phase = @(t) imag (response_at (num, den, t));
  f_gain = @(t) abs (response_at (num, den, t)) - 1;
  grid = logspace (log10 (GRID_START), log10 (pi), GRID_POINTS);
  phase_thetas = sign_changes (f_phase, grid);
  if (real (response_at (num, den, pi)) < 0)
    phase_thetas = unique ([phase_thetas(abs (phase_thetas - pi) > 1e-9), pi]);
  endif
  values = response_at (num, den, phase_thetas);
  keep = real (values) < 0 & abs (imag (values)) < ROOT * abs (values);   # a sign change at a jump is no crossing
  phase_thetas = phase_thetas(keep);
  values = values(keep);
  nyquist = any (abs (phase_thetas - pi) < 1e-12);

  inverse = 1 ./ abs (values);
  gm = [];  wgm = [];  lgm = [];  wlgm = [];
  above = find (inverse > 1);
  if (! isempty (above))
    [gm, k] = min (inverse(above));
    wgm = phase_thetas(above(k)) / h;
  endif
  below = find (inverse < 1);
  if (! isempty (below))
    [lgm, k] = max (inverse(below));
    wlgm = phase_thetas(below(k)) / h;
  endif

  gain_thetas = sign_changes (f_gain, grid);
  gain_thetas = gain_thetas(abs (abs (response_at (num, den, gain_thetas)) - 1) < ROOT);
  if (any ([phase_thetas, gain_thetas] < 1e-3))
    error ("%s: a crossing below theta = 1e-3 rad, too near the grid's start; extend the grid", name);
  endif
  pm = [];  wpm = [];  dm = [];
  if (! isempty (gain_thetas))
    arg_deg = angle (response_at (num, den, gain_thetas)) * 180 / pi;
    margins = mod (180 + arg_deg + 180, 360) - 180;   # into [-180, 180)
    margins(margins == -180) = 180;
    [~, k] = min (abs (margins));
    pm = margins(k);
    wpm = gain_thetas(k) / h;
    dm = min (mod (180 + arg_deg, 360) * pi / 180 ./ (gain_thetas / h));
  endif

  ## does the package's margin give the exact figure? (to SAME relative: margin's unpolished
  ## roots () are good to about 1e-8 here)
  gm_def = "margin";
  gm_why = "";
  if (isempty (gm))
    if (! isinf (o_gm))
      gm_def = "exact";
      gm_why = "margin() returns the lower gain margin (below 1) as the gain margin when none lies above 1";
    endif
  elseif (isinf (o_gm) || abs (o_gm - gm) > SAME * gm || abs (o_wgm - wgm) > SAME * wgm)
    gm_def = "exact";
    if (nyquist && abs (wgm - pi / h) < 1e-12 * wgm)
      gm_why = "margin() misses the phase crossover at z = -1";
    else
      gm_why = "margin() misses the phase crossover of the gain margin";
    endif
  endif
  pm_def = "margin";
  pm_why = "";
  if (isempty (pm))
    pm_def = "exact";
    if (! isnan (o_wpm))
      pm_why = "margin() finds a gain crossover the exact search does not";
    else
      pm_why = "no gain crossover: margin() returns 180 deg, loopform none";
    endif
  elseif (isnan (o_wpm))
    pm_def = "exact";
    pm_why = "margin() misses every gain crossover (its unit-circle roots near z = 1 are lost)";
  elseif (abs (o_wpm - wpm) > SAME * wpm)
    pm_def = "exact";
    pm_why = "margin() takes the smallest signed margin over the crossovers, not the crossover nearest -1";
  elseif (abs (o_pm - pm) > SAME * max (abs (pm), 1))
    if (abs (o_pm - 360 - pm) <= SAME * max (abs (pm), 1))
      pm_def = "margin-360";
      pm_why = "margin() writes 180 + arg L in (0, 360] deg: a negative margin comes out 360 deg above";
    else
      pm_def = "exact";
      pm_why = "margin() gives another value at the same crossover";
    endif
  endif
  why = strjoin (cellfun (@(s) s, {gm_why, pm_why}(! cellfun (@isempty, {gm_why, pm_why})), "UniformOutput", false), "; ");

  fprintf (fid, "%s.yaml,%s,%s,%s,%d,%s,%s,%s,%s,%s,%s,%s,%d,%d,%d,%s,%s,%s,%s,%s,%s,\"%s\"\n", name, klass, stability,
           num_text (rho), numel (p), num_text (gm), num_text (wgm), num_text (lgm), num_text (wlgm), num_text (pm),
           num_text (wpm), num_text (dm), numel (gain_thetas), numel (phase_thetas), nyquist, raw_text (o_gm),
           raw_text (o_wgm), raw_text (o_pm), raw_text (o_wpm), gm_def, pm_def, why);

  if (ti > 0)
    tuning = sprintf ("{form: ideal, kc: %.15g, ti: %.15g, td: %.15g, n: %.15g}", kc, ti, td, n);
  else
    tuning = sprintf ("{form: ideal, kc: %.15g, ti: 0, td: %.15g, n: %.15g}", kc, td, n);
  endif
  y = fopen (fullfile (loop_dir, [name ".yaml"]), "w");
  fprintf (y, "# INVENTED LOOP for OctaveCrossCheckTest (%s): %s.\n", klass, note);
  fprintf (y, "# Written by src/test/octave/write_octave_golden.m; edit the script, not this file.\n");
  fprintf (y, "tag: %s\nprocess: %s\ntuning: %s\ntarget: {form: ideal, scan: %.15g s}\n", upper (name),
           process_yaml (model, par, dead), tuning, h);
  fclose (y);
  printf ("%-14s %-9s rho %.6f GM %s (margin %s) PM %s (margin %s) %s\n", name, stability, rho, num_text (gm),
          raw_text (o_gm), num_text (pm), raw_text (o_pm), why);
endfor
fclose (fid);
