## generate_margins.m -- reference margins, crossings and closed-loop step figures for LoopShaper's
## OctaveReferenceTests (tests/LoopShaper.Core.Tests/OctaveReferenceTests.cs).
##
## Run from the repository root:
##   octave-cli --no-gui tests/reference/octave/generate_margins.m
## Needs GNU Octave with the control package (Debian: octave, octave-control). Writes, beside this script:
##   margins.csv       one row per loop: margin() outputs, closed-loop stability, analysed range
##   crossings.csv     every gain and phase crossing in the range, found with fzero on the exact response
##   responses.csv     |T| and continuous phase at a few frequencies (proves both sides build the same T)
##   steps.csv         closed-loop step figures from step() on a fine grid
##   step_samples.csv  some of the step samples themselves
## Output is deterministic (no dates); rerunning on the same versions reproduces the files.
##
## Conventions (shared/CONVENTIONS.md): T is the loop gain with the error amplifier's inversion taken out, so the
## critical point is -1; frequencies in the files are in Hz unless a column says rad_s; phase is continuous,
## unwrapped from the low end and anchored so that a loop with n integrators starts near -90 n degrees.

1; # script file, not a function file

pkg load control

## ---------------------------------------------------------------------------------------------------------------
## Building blocks, each an explicit factor so that the C# test builds exactly the same T(s).
## ---------------------------------------------------------------------------------------------------------------

## (1 + s / (2 pi f)): a real left-half-plane zero factor at f Hz (a pole factor is its inverse).
function F = corner (fHz)
  F = tf ([1 / (2 * pi * fHz), 1], 1);
endfunction

## Voltage-mode buck, duty cycle to output (Erickson & Maksimovic, Fundamentals of Power Electronics, 2nd ed.,
## ch. 8, with the capacitor ESR r and inductor DCR RL): vout/d = Vin Z / (Z + RL + s L), Z = R || (r + 1/(s C)).
## Multiplied out: Vin R (1 + s C r) / (s^2 L C (R + r) + s (L + RL C (R + r) + R C r) + RL + R).
function G = buck_vd (Vin, R, L, RL, C, r)
  G = tf (Vin * R * [C * r, 1], [L * C * (R + r), L + RL * C * (R + r) + R * C * r, RL + R]);
endfunction

## Type II: wi / s * (1 + s/wz) / (1 + s/wp); wi in rad/s (integrator unity-gain angular frequency), corners in Hz.
function Gc = type2 (wi, fz, fp)
  Gc = wi * tf (1, [1, 0]) * corner (fz) / corner (fp);
endfunction

## Type III: wi / s * (1 + s/wz1)(1 + s/wz2) / ((1 + s/wp1)(1 + s/wp2)).
function Gc = type3 (wi, fz1, fz2, fp1, fp2)
  Gc = wi * tf (1, [1, 0]) * corner (fz1) * corner (fz2) / (corner (fp1) * corner (fp2));
endfunction

## Pade approximant of e^(-s Td) of order n: c_k = (2n-k)! n! / ((2n)! k! (n-k)!), numerator sum (-1)^k c_k (s Td)^k,
## denominator sum c_k (s Td)^k (Golub & Van Loan, Matrix Computations, sec. 9.3, from memory). The control package
## 3.4 has neither delays nor pade, so it is written out here. The polynomials are solved in x = s Td and the roots
## scaled by 1/Td: coefficients Td^k (1e-53 for k = 8) would be dropped as zeros by tf. Leading coefficients
## (-1)^n c_n Td^n over c_n Td^n leave the gain (-1)^n.
function P = pade_tf (Td, n)
  k = 0:n;
  c = factorial (2 * n - k) .* factorial (n) ./ (factorial (2 * n) .* factorial (k) .* factorial (n - k));
  P = zpk (roots (fliplr ((-1) .^ k .* c)) / Td, roots (fliplr (c)) / Td, (-1) ^ n);
endfunction

## Exact frequency response T(j w) e^(-j w Td) (freqresp evaluates the rational part; the delay is applied exactly).
function h = resp (T, Td, w)
  h = reshape (squeeze (freqresp (T, w)), size (w)) .* exp (-1i * w * Td);
endfunction

## ---------------------------------------------------------------------------------------------------------------
## The loops (our own scenarios). 12 V in, 1.2 V out, 500 kHz switching, 1 V PWM ramp (modulator gain 1/Vm = 1).
## ---------------------------------------------------------------------------------------------------------------
Vm = 1.0;
loops = struct ("name", {}, "what", {}, "T", {}, "Td", {}, "integrators", {}, "startHz", {}, "stopHz", {}, ...
                "pade", {}, "stepS", {});

## (a) Type II on a polymer output capacitor: L 1 uH (DCR 2 mOhm), C 470 uF with ESR 15 mOhm (ESR zero 22.6 kHz),
##     6 A load (R = 0.2 Ohm); zero at 4 kHz, pole at fs/2 = 250 kHz, wi set for a 40 kHz crossover.
loops(end + 1) = struct ("name", "a_type2_buck", "what", "voltage-mode buck with Type II", ...
  "T", type2 (32200, 4e3, 250e3) * buck_vd (12, 0.2, 1e-6, 2e-3, 470e-6, 15e-3) / Vm, "Td", 0, "integrators", 1, ...
  "startHz", 1, "stopHz", 1e7, "pade", 0, "stepS", 2e-4);

## (b) Type III on ceramics: L 1 uH (DCR 2 mOhm), C 200 uF with ESR 5 mOhm (ESR zero 159 kHz), 10 A (R = 0.12 Ohm);
##     zeros at the LC corner (11 kHz), poles at the ESR zero and fs/2, wi set for a 50 kHz crossover.
Tb = type3 (24400, 11e3, 11e3, 159e3, 250e3) * buck_vd (12, 0.12, 1e-6, 2e-3, 200e-6, 5e-3) / Vm;
loops(end + 1) = struct ("name", "b_type3_buck", "what", "voltage-mode buck with Type III", ...
  "T", Tb, "Td", 0, "integrators", 1, "startHz", 1, "stopHz", 1e7, "pade", 0, "stepS", 2e-4);

## (c) loop (b) with a 250 ns pure delay (PWM and driver propagation, half a switching period).
loops(end + 1) = struct ("name", "c_type3_buck_delay", "what", "loop (b) with a 250 ns delay", ...
  "T", Tb, "Td", 250e-9, "integrators", 1, "startHz", 1, "stopHz", 1e7, "pade", 8, "stepS", 2e-4);

## (d) conditionally stable: light load 1 A (R = 1.2 Ohm), C 200 uF with ESR 2 mOhm, so the LC pair is lightly damped
##     (Q about 8.6); Type III zeros well above it (20 kHz), poles at 300 and 500 kHz, 60 kHz crossover. The phase
##     dips below -180 degrees at the resonance while |T| > 1, then recovers.
loops(end + 1) = struct ("name", "d_conditionally_stable", "what", "voltage-mode buck with Type III zeros above the LC corner", ...
  "T", type3 (87700, 20e3, 20e3, 300e3, 500e3) * buck_vd (12, 1.2, 1e-6, 2e-3, 200e-6, 2e-3) / Vm, ...
  "Td", 0, "integrators", 1, "startHz", 1, "stopHz", 1e7, "pade", 0, "stepS", 4e-4);

## (e) custom plant with a right-half-plane zero (as a user would type it, in coefficients):
##     30 (1 - s/wrz) / (s^2/w0^2 + s/(Q w0) + 1), frz = 12 kHz, f0 = 1.5 kHz, Q = 0.8; Type II, zero 100 Hz,
##     pole 5 kHz, wi = 20 rad/s (crossover near 400 Hz).
w0e = 2 * pi * 1.5e3;
Ge = tf (30 * [-1 / (2 * pi * 12e3), 1], [1 / w0e ^ 2, 1 / (0.8 * w0e), 1]);
loops(end + 1) = struct ("name", "e_rhp_zero", "what", "custom plant with a RHP zero and Type II", ...
  "T", type2 (20, 100, 5e3) * Ge, "Td", 0, "integrators", 1, "startHz", 1, "stopHz", 1e7, "pade", 0, "stepS", 0.1);

## (f) several gain crossovers: the lightly damped plant of (d) under a slow Type II (zero 1 kHz, pole 100 kHz,
##     wi = 150 rad/s). The loop falls below 0 dB near 300 Hz, then the resonance peak lifts it above 0 dB again.
loops(end + 1) = struct ("name", "f_several_crossovers", "what", "voltage-mode buck with a slow Type II and its resonance above 0 dB", ...
  "T", type2 (150, 1e3, 100e3) * buck_vd (12, 1.2, 1e-6, 2e-3, 200e-6, 2e-3) / Vm, ...
  "Td", 0, "integrators", 1, "startHz", 1, "stopHz", 1e7, "pade", 0, "stepS", 0.01);

## ---------------------------------------------------------------------------------------------------------------
## Crossings by fzero on the exact response, bracketed on a dense log grid (2000 points per decade: the phase moves
## at most about 1 degree between points for every loop here, so unwrap is safe and no crossing pair hides between
## two points).
## ---------------------------------------------------------------------------------------------------------------
function [f, h, ph] = dense (L, extraHz)
  n = ceil (log10 (L.stopHz / L.startHz) * 2000) + 1;
  f = unique ([logspace(log10(L.startHz), log10(L.stopHz), n), extraHz]);
  f(1) = L.startHz;
  f(end) = L.stopHz;
  h = resp (L.T, L.Td, 2 * pi * f);
  ph = unwrap (angle (h));
  ph = ph - 2 * pi * round ((ph(1) + L.integrators * pi / 2) / (2 * pi));   # anchor: n integrators start at -90 n
endfunction

function [gain, phase] = crossings (L)
  [f, h, ph] = dense (L, []);
  lnw = log (2 * pi * f);
  lm = log (abs (h));
  opts = optimset ("TolX", 1e-14);
  gain = zeros (0, 3);    # f_hz, mag_db, phase_deg
  phase = zeros (0, 3);   # f_hz, level_deg, mag_db
  for i = 1:numel (f) - 1
    if (sign (lm(i)) != sign (lm(i + 1)))
      x = fzero (@(x) log (abs (resp (L.T, L.Td, exp (x)))), [lnw(i), lnw(i + 1)], opts);
      hx = resp (L.T, L.Td, exp (x));
      phx = ph(i) + angle (hx / h(i));          # continuous phase carried from the grid point
      gain(end + 1, :) = [exp(x) / (2 * pi), 20 * log10(abs(hx)), phx * 180 / pi];
    endif
    lo = min (ph(i), ph(i + 1));
    hi = max (ph(i), ph(i + 1));
    for k = ceil ((lo / pi + 1) / 2):floor ((hi / pi + 1) / 2)
      level = (2 * k - 1) * pi;                 # -180 + k 360 degrees
      if (ph(i) == level || ph(i + 1) == level)
        error ("generate_margins: a grid point lies exactly on a critical phase; shift the grid");
      endif
      x = fzero (@(x) angle (resp (L.T, L.Td, exp (x)) * exp (-1i * level)), [lnw(i), lnw(i + 1)], opts);
      hx = resp (L.T, L.Td, exp (x));
      phase(end + 1, :) = [exp(x) / (2 * pi), level * 180 / pi, 20 * log10(abs(hx))];
    endfor
  endfor
endfunction

## Step figures with the definitions of LoopShaper's StepMetrics: overshoot % of the final value, 10-90 % rise and
## 2 % settling (last exit from the band) by linear interpolation between samples.
function [yf, peak, tpeak, over, rise, settle] = step_figures (t, y, yf)
  [peak, ip] = max (y);
  tpeak = t(ip);
  over = 100 * max (0, (peak - yf) / yf);
  first = @(level) find ((y(1:end - 1) - level) .* (y(2:end) - level) <= 0 & y(2:end) != y(1:end - 1), 1);
  i10 = first (0.1 * yf);
  i90 = first (0.9 * yf);
  cross = @(i, level) t(i) + (t(i + 1) - t(i)) * (level - y(i)) / (y(i + 1) - y(i));
  rise = cross (i90, 0.9 * yf) - cross (i10, 0.1 * yf);
  band = 0.02 * abs (yf);
  last = find (abs (y - yf) > band, 1, "last");
  if (isempty (last))
    settle = 0;
  elseif (last == numel (y))
    error ("generate_margins: the step has not settled; lengthen the simulated time");
  else
    e0 = abs (y(last) - yf);
    e1 = abs (y(last + 1) - yf);
    settle = t(last) + min (max ((e0 - band) / (e0 - e1), 0), 1) * (t(last + 1) - t(last));
  endif
endfunction

function s = num (x)
  if (isempty (x) || ! isfinite (x))
    s = "";
  else
    s = sprintf ("%.17g", x);
  endif
endfunction

## ---------------------------------------------------------------------------------------------------------------
## Run and write.
## ---------------------------------------------------------------------------------------------------------------
here = fileparts (mfilename ("fullpath"));
control = pkg ("list", "control");
header = sprintf ("# generated by tests/reference/octave/generate_margins.m with GNU Octave %s and control %s\n", ...
                  OCTAVE_VERSION, control{1}.version);

fm = fopen (fullfile (here, "margins.csv"), "w");
fc = fopen (fullfile (here, "crossings.csv"), "w");
fr = fopen (fullfile (here, "responses.csv"), "w");
fs = fopen (fullfile (here, "steps.csv"), "w");
fy = fopen (fullfile (here, "step_samples.csv"), "w");
fprintf (fm, "%s", header);
fprintf (fm, "loop,description,start_hz,stop_hz,delay_s,margin_of,octave_gm_db,octave_wgm_rad_s,octave_pm_deg,octave_wpm_rad_s,closed_loop_stable,closed_loop_pade_order,gain_crossings,phase_crossings\n");
fprintf (fc, "%s", header);
fprintf (fc, "loop,kind,frequency_hz,level_deg,magnitude_db,phase_deg\n");
fprintf (fr, "%s", header);
fprintf (fr, "loop,frequency_hz,magnitude_db,phase_deg\n");
fprintf (fs, "%s", header);
fprintf (fs, "loop,pade_order,duration_s,samples,final_value,peak_value,peak_time_s,overshoot_pct,rise_time_s,settling_time_s\n");
fprintf (fy, "%s", header);
fprintf (fy, "loop,index,time_s,value\n");

for n = 1:numel (loops)
  L = loops(n);
  if (any (L.what == ","))
    error ("generate_margins: the description of %s must not contain a comma (CSV field)", L.name);
  endif

  ## margin() of the rational part: control 3.4 ignores (has no) delays, so for a delayed loop this is the
  ## delay-free loop; the test accounts for that.
  [gm, pm, wgm, wpm] = margin (L.T);
  if (L.Td == 0)
    marginOf = "loop";
  else
    marginOf = "rational part";
  endif

  [gain, phase] = crossings (L);

  Tr = L.T;
  if (L.Td != 0)
    Tr = L.T * pade_tf (L.Td, L.pade);
  endif
  closed = feedback (Tr, 1);
  stable = all (real (pole (closed)) < 0);

  fprintf (fm, "%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%d,%d,%d,%d\n", L.name, L.what, num (L.startHz), num (L.stopHz), ...
           num (L.Td), marginOf, num (20 * log10 (gm)), num (wgm), num (pm), num (wpm), stable, L.pade, ...
           rows (gain), rows (phase));
  for i = 1:rows (gain)
    fprintf (fc, "%s,gain,%s,,%s,%s\n", L.name, num (gain(i, 1)), num (gain(i, 2)), num (gain(i, 3)));
  endfor
  for i = 1:rows (phase)
    fprintf (fc, "%s,phase,%s,%s,%s,\n", L.name, num (phase(i, 1)), num (phase(i, 2)), num (phase(i, 3)));
  endfor

  ## Spot values of |T| and continuous phase: every decade and at each gain crossover.
  spots = [10 .^ (0:7), gain(:, 1)'];
  spots = spots(spots >= L.startHz & spots <= L.stopHz);
  [f, h, ph] = dense (L, spots);
  for s = spots
    [~, i] = min (abs (f - s));
    fprintf (fr, "%s,%s,%s,%s\n", L.name, num (f(i)), num (20 * log10 (abs (h(i)))), num (ph(i) * 180 / pi));
  endfor

  ## Closed-loop step on a fine grid; step() discretises with a zero-order hold, exact at the samples for a step.
  samples = 20001;
  t = linspace (0, L.stepS, samples);
  [y, ty] = step (closed, t);
  y = y(:);
  ty = ty(:);
  if (numel (ty) != samples)
    error ("generate_margins: step returned %d samples instead of %d", numel (ty), samples);
  endif
  yf = dcgain (closed);
  [yf, peak, tpeak, over, rise, settle] = step_figures (ty, y, yf);
  fprintf (fs, "%s,%d,%s,%d,%s,%s,%s,%s,%s,%s\n", L.name, L.pade, num (L.stepS), samples, num (yf), num (peak), ...
           num (tpeak), num (over), num (rise), num (settle));
  for i = 1:200:samples
    fprintf (fy, "%s,%d,%s,%s\n", L.name, i - 1, num (ty(i)), num (y(i)));
  endfor

  printf ("%-24s %d gain and %d phase crossings; margin(): GM %g dB at %g Hz, PM %g deg at %g Hz; stable %d; settles in %g s\n", ...
          L.name, rows (gain), rows (phase), 20 * log10 (gm), wgm / (2 * pi), pm, wpm / (2 * pi), stable, settle);
endfor

fclose (fm);
fclose (fc);
fclose (fr);
fclose (fs);
fclose (fy);
