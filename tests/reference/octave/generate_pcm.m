## generate_pcm.m -- reference responses, margins and crossings of peak current-mode buck loops for LoopShaper's
## OctavePcmReferenceTests (tests/LoopShaper.Models.Tests/OctavePcmReferenceTests.cs).
##
## Run from the repository root:
##   octave-cli --no-gui tests/reference/octave/generate_pcm.m
## Needs GNU Octave with the control package (Debian: octave, octave-control). Writes, beside this script:
##   pcm_loops.csv      one row per loop: the scenario's numbers, the derived slopes and gains, margin() outputs
##   pcm_crossings.csv  every gain and phase crossing of T = Gc Gvc and of the current loop Ti, by fzero
##   pcm_responses.csv  Gvc, Ti, line-to-output and output impedance at spot frequencies
## Output is deterministic (no dates).
##
## The model is Ridley's (R. B. Ridley, "A New, Continuous-Time Model for Current-Mode Control", IEEE Trans. Power
## Electronics 6(2), 1991): d = Fm (vc - Ri He(s) iL + kf vg + kr v), Fm = 1/(mc Sn Ts), mc = 1 + Se/Sn,
## He(s) = 1 + s/(wn Qz) + s^2/wn^2, wn = pi/Ts, Qz = -2/pi, buck kf = -(D Ts Ri/L)(1 - D/2), kr = Ts Ri/(2 L).
## The power stage is the averaged buck with inductor DCR and capacitor ESR (Erickson & Maksimovic, 2nd ed., ch. 8),
## built here from its impedances: Y = 1/R + s C/(1 + s r C), Zs = DCR + s L, Gvd = Vin/(1 + Zs Y), Gid = Vin Y/(1 + Zs Y),
## Gvg = D/(1 + Zs Y), Gig = D Y/(1 + Zs Y), Gii = 1/(1 + Zs Y), Zo = Zs/(1 + Zs Y). The current loop is closed
## point by point with complex arithmetic (the reference responses) and, separately, with the control package's tf
## algebra (for margin()); the script checks that both agree. A modulator delay Td multiplies vout/vc by the exact
## e^(-s Td) (a constant delay leaves the period-to-period current map alone, Erickson & Maksimovic sec. 12.1); the
## control package 3.4 has no delays, so margin() sees the rational part of a delayed loop (margin_of says which).

1; # script file

pkg load control

function P = pade_tf (Td, n)
  ## Pade approximant of e^(-s Td) of order n, as in generate_margins.m (only for the closed-loop poles of a delayed loop).
  k = 0:n;
  c = factorial (2 * n - k) .* factorial (n) ./ (factorial (2 * n) .* factorial (k) .* factorial (n - k));
  P = zpk (roots (fliplr ((-1) .^ k .* c)) / Td, roots (fliplr (c)) / Td, (-1) ^ n);
endfunction

function S = scenario (name, what, Vin, Vout, I, fs, L, DCR, C, esr, Ri, rampKind, rampValue, Td, wi, fz, fp)
  S = struct ("name", name, "what", what, "Vin", Vin, "Vout", Vout, "I", I, "fs", fs, "L", L, "DCR", DCR, "C", C, ...
              "esr", esr, "Ri", Ri, "rampKind", rampKind, "rampValue", rampValue, "Td", Td, "wi", wi, "fz", fz, "fp", fp);
  Ts = 1 / fs;
  S.R = Vout / I;
  S.D = (Vout + I * DCR) / Vin;                       # CCM volt-second balance with the DCR (Erickson ch. 3)
  S.Sn = Ri * (Vin - Vout - I * DCR) / L;             # on-time inductor voltage
  S.Sf = Ri * (Vout + I * DCR) / L;                   # off-time inductor voltage
  switch (rampKind)
    case "slope"
      S.Se = rampValue;
    case "offSlope"
      S.Se = rampValue * S.Sf;
    case "mc"
      S.Se = (rampValue - 1) * S.Sn;
  endswitch
  S.mc = 1 + S.Se / S.Sn;
  S.Fm = 1 / (S.mc * S.Sn * Ts);
  S.kf = -(S.D * Ts * Ri / L) * (1 - S.D / 2);
  S.kr = Ts * Ri / (2 * L);
  S.wn = pi / Ts;
  S.Qz = -2 / pi;
  S.Qp = 1 / (pi * (S.mc * (1 - S.D) - 0.5));
endfunction

## Point-by-point closed loops at angular frequencies w (row vector).
function [gvc, ti, gvgc, zoc, gc] = pointwise (S, w)
  s = 1i * w;
  Y = 1 / S.R + s * S.C ./ (1 + s * S.esr * S.C);
  Zs = S.DCR + s * S.L;
  den = 1 + Zs .* Y;
  gvd = S.Vin ./ den;  gid = S.Vin * Y ./ den;
  gvg = S.D ./ den;    gig = S.D * Y ./ den;    gii = 1 ./ den;   zo = Zs ./ den;
  he = 1 + s / (S.wn * S.Qz) + s .^ 2 / S.wn ^ 2;
  fm = S.Fm;
  delta = 1 + fm .* (S.Ri * he .* gid - S.kr * gvd);
  gvc = fm .* gvd ./ delta .* exp (-s * S.Td);
  gvgc = gvg + gvd .* fm .* (S.kf + S.kr * gvg - S.Ri * he .* gig) ./ delta;
  zoc = zo + gvd .* fm .* (S.Ri * he .* gii + S.kr * zo) ./ delta;
  ti = S.Fm * S.Ri * he .* gid;
  gc = S.wi ./ s .* (1 + s / (2 * pi * S.fz)) ./ (1 + s / (2 * pi * S.fp));
endfunction

## The same Gvc, without its delay, with the control package's tf algebra (for margin()).
function [T, Gvc] = tf_loop (S)
  s = tf ("s");
  Y = 1 / S.R + S.C * s / (1 + S.esr * S.C * s);
  Zs = S.DCR + S.L * s;
  Gvd = S.Vin / (1 + Zs * Y);
  Gid = S.Vin * Y / (1 + Zs * Y);
  He = 1 + s / (S.wn * S.Qz) + s ^ 2 / S.wn ^ 2;
  M = S.Fm;
  Gvc = minreal (Gvd * M / (1 + M * (S.Ri * He * Gid - S.kr * Gvd)), 1e-9);
  Gc = S.wi / s * (1 + s / (2 * pi * S.fz)) / (1 + s / (2 * pi * S.fp));
  T = minreal (Gc * Gvc, 1e-9);
endfunction

function s = num (x)
  if (isempty (x) || ! isfinite (x))
    s = "";
  else
    s = sprintf ("%.17g", x);
  endif
endfunction

## fzero crossings of a point-by-point response h(w) on a dense log grid: gain (|h| = 1) and phase (-180 + k 360).
function [gain, phase] = crossings (h, startHz, stopHz, integrators)
  n = ceil (log10 (stopHz / startHz) * 2000) + 1;
  f = logspace (log10 (startHz), log10 (stopHz), n);
  w = 2 * pi * f;
  H = h (w);
  ph = unwrap (angle (H));
  ph = ph - 2 * pi * round ((ph(1) + integrators * pi / 2) / (2 * pi));
  lnw = log (w);
  lm = log (abs (H));
  opts = optimset ("TolX", 1e-14);
  gain = zeros (0, 3);
  phase = zeros (0, 3);
  for i = 1:numel (f) - 1
    if (sign (lm(i)) != sign (lm(i + 1)))
      x = fzero (@(x) log (abs (h (exp (x)))), [lnw(i), lnw(i + 1)], opts);
      hx = h (exp (x));
      gain(end + 1, :) = [exp(x) / (2 * pi), 20 * log10(abs(hx)), (ph(i) + angle (hx / H(i))) * 180 / pi];
    endif
    lo = min (ph(i), ph(i + 1));
    hi = max (ph(i), ph(i + 1));
    for k = ceil ((lo / pi + 1) / 2):floor ((hi / pi + 1) / 2)
      level = (2 * k - 1) * pi;
      x = fzero (@(x) angle (h (exp (x)) * exp (-1i * level)), [lnw(i), lnw(i + 1)], opts);
      phase(end + 1, :) = [exp(x) / (2 * pi), level * 180 / pi, 20 * log10(abs(h (exp (x))))];
    endfor
  endfor
endfunction

## ---------------------------------------------------------------------------------------------------------------
## The loops (our own scenarios). Gc = wi/s (1 + s/wz)/(1 + s/wp).
## ---------------------------------------------------------------------------------------------------------------
loops = {};
## (a) 12 V to 3.3 V at 4 A, 500 kHz, 4.7 uH (DCR 12 mOhm), 100 uF with ESR 4 mOhm; Ri = 0.1 V/A, Se = Sf / 2;
##     Type II with its zero near the load pole, wi for a crossover near 50 kHz.
loops{end + 1} = scenario ("a_pcm_type2", "12 V to 3.3 V with Se = Sf/2", 12, 3.3, 4, 500e3, 4.7e-6, 12e-3, 100e-6, 4e-3, 0.1, "offSlope", 0.5, 0, 2.2e4, 2.2e3, 250e3);
## (b) 5 V to 3.3 V at 2 A (D = 0.67), 1 MHz, 1 uH (DCR 8 mOhm), 47 uF with ESR 3 mOhm; Ri = 0.2 V/A, mc = 1.8
##     (Qp about 2.8: lightly damped sampling pole); Type II for about 80 kHz.
loops{end + 1} = scenario ("b_pcm_high_duty", "5 V to 3.3 V at D = 0.67 with mc = 1.8", 5, 3.3, 2, 1e6, 1e-6, 8e-3, 47e-6, 3e-3, 0.2, "mc", 1.8, 0, 7e4, 4e3, 300e3);
## (c) loop (a) with a 100 ns comparator and driver delay.
loops{end + 1} = scenario ("c_pcm_delay", "loop (a) with a 100 ns modulator delay", 12, 3.3, 4, 500e3, 4.7e-6, 12e-3, 100e-6, 4e-3, 0.1, "offSlope", 0.5, 100e-9, 2.2e4, 2.2e3, 250e3);
## (d) 24 V to 5 V at 1 A, 300 kHz, 22 uH (DCR 30 mOhm), 66 uF with ESR 10 mOhm; Ri = 0.5 V/A, Se = 50 mV/us.
loops{end + 1} = scenario ("d_pcm_slope", "24 V to 5 V with Se = 50 kV/s", 24, 5, 1, 300e3, 22e-6, 30e-3, 66e-6, 10e-3, 0.5, "slope", 5e4, 0, 6e3, 1.2e3, 150e3);

here = fileparts (mfilename ("fullpath"));
control = pkg ("list", "control");
header = sprintf ("# generated by tests/reference/octave/generate_pcm.m with GNU Octave %s and control %s\n", OCTAVE_VERSION, control{1}.version);
fl = fopen (fullfile (here, "pcm_loops.csv"), "w");
fc = fopen (fullfile (here, "pcm_crossings.csv"), "w");
fr = fopen (fullfile (here, "pcm_responses.csv"), "w");
fprintf (fl, "%s", header);
fprintf (fl, "loop,description,vin_v,vout_v,load_a,fs_hz,l_h,dcr_ohm,c_f,esr_ohm,ri_ohm,ramp_kind,ramp_value,delay_s,wi_rad_s,fz_hz,fp_hz,duty,sn_v_per_s,sf_v_per_s,se_v_per_s,mc,fm_per_v,kf,kr,qp,margin_of,octave_gm_db,octave_wgm_rad_s,octave_pm_deg,octave_wpm_rad_s,closed_loop_stable\n");
fprintf (fc, "%s", header);
fprintf (fc, "loop,function,kind,frequency_hz,level_deg,magnitude_db,phase_deg\n");
fprintf (fr, "%s", header);
fprintf (fr, "loop,function,frequency_hz,re,im\n");

for n = 1:numel (loops)
  S = loops{n};
  [T, Gvc] = tf_loop (S);

  ## The tf algebra and the point-by-point loop must be the same function.
  wchk = 2 * pi * logspace (1, 6.5, 60);
  [gvc, ~, ~, ~, gc] = pointwise (S, wchk);
  ref = reshape (squeeze (freqresp (Gvc, wchk)), size (wchk));
  if (max (abs (ref .* exp (-1i * wchk * S.Td) ./ gvc - 1)) > 1e-6)
    error ("generate_pcm: tf algebra and point-by-point loop differ for %s by %g", S.name, max (abs (ref ./ gvc - 1)));
  endif

  [gm, pm, wgm, wpm] = margin (T);
  ## Closed-loop poles, a delay replaced by an 8th-order Pade approximant, through a state-space realisation of the
  ## zeros and poles (the expanded polynomial of the delayed loop loses its roots).
  if (S.Td == 0)
    stable = all (real (pole (feedback (T, 1))) < 0);
    marginOf = "loop";
  else
    stable = all (real (pole (feedback (ss (zpk (T) * pade_tf (S.Td, 8)), 1))) < 0);
    marginOf = "rational part";
  endif
  fprintf (fl, "%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%d\n", ...
           S.name, S.what, num (S.Vin), num (S.Vout), num (S.I), num (S.fs), num (S.L), num (S.DCR), num (S.C), num (S.esr), ...
           num (S.Ri), S.rampKind, num (S.rampValue), num (S.Td), num (S.wi), num (S.fz), num (S.fp), num (S.D), num (S.Sn), ...
           num (S.Sf), num (S.Se), num (S.mc), num (S.Fm), num (S.kf), num (S.kr), num (S.Qp), marginOf, ...
           num (20 * log10 (gm)), num (wgm), num (pm), num (wpm), stable);

  ## Crossings of the outer loop T = Gc Gvc (1 Hz to 10 MHz) and of the current loop Ti (1 Hz to fs).
  hT = @(w) nthargout (5, @pointwise, S, w) .* nthargout (1, @pointwise, S, w);
  hTi = @(w) nthargout (2, @pointwise, S, w);
  [g, p] = crossings (hT, 1, 1e7, 1);
  for i = 1:rows (g)
    fprintf (fc, "%s,loop,gain,%s,,%s,%s\n", S.name, num (g(i, 1)), num (g(i, 2)), num (g(i, 3)));
  endfor
  for i = 1:rows (p)
    fprintf (fc, "%s,loop,phase,%s,%s,%s,\n", S.name, num (p(i, 1)), num (p(i, 2)), num (p(i, 3)));
  endfor
  [g, p] = crossings (hTi, 1, S.fs, 0);
  for i = 1:rows (g)
    fprintf (fc, "%s,current,gain,%s,,%s,%s\n", S.name, num (g(i, 1)), num (g(i, 2)), num (g(i, 3)));
  endfor

  ## Spot values.
  spots = [10, 100, 1e3, 5e3, 2e4, 5e4, 1e5, 2e5, S.fs / 2 * 0.98, S.fs, 2e6];
  [gvc, ti, gvgc, zoc] = pointwise (S, 2 * pi * spots);
  names = {"gvc", "ti", "gvg", "zout"};
  vals = {gvc, ti, gvgc, zoc};
  for k = 1:numel (names)
    for i = 1:numel (spots)
      fprintf (fr, "%s,%s,%s,%s,%s\n", S.name, names{k}, num (spots(i)), num (real (vals{k}(i))), num (imag (vals{k}(i))));
    endfor
  endfor
  printf ("%-18s D %.4f mc %.4f Qp %.3f; margin(): GM %g dB at %g Hz, PM %g deg at %g Hz; stable %d\n", S.name, S.D, S.mc, S.Qp, ...
          20 * log10 (gm), wgm / (2 * pi), pm, wpm / (2 * pi), stable);
endfor
fclose (fl);
fclose (fc);
fclose (fr);
