#!/usr/bin/env python3
"""Times the same 1000-point loop response plus margin search in SciPy, for the loops of the example designs,
and prints the ratio to LoopShaper's time from one run.

Run from the repository root with Debian's python3-scipy:  /usr/bin/python3 tests/LoopShaper.Bench/scipy_margins.py
It first runs the C# benchmark, which writes the loops (zeros, poles, gain) and its own timings to a JSON file.
The SciPy side: scipy.signal.freqs_zpk on 1000 log-spaced points plus a dense 20000-point grid, sign changes of
|T| - 1 and of the phase + 180 + k 360, each refined with scipy.optimize.brentq on the analytic response.
"""
import json, subprocess, sys, tempfile, time, os
import numpy as np
from scipy import signal, optimize

def response(z, p, k, w, delay):
    _, h = signal.freqs_zpk(z, p, k, worN=w)
    return h * np.exp(-1j * w * delay)

def margins(z, p, k, delay, f0, f1):
    w = 2 * np.pi * np.logspace(np.log10(f0), np.log10(f1), 20000)
    h = response(z, p, k, w, delay)
    lm = np.log(np.abs(h))
    ph = np.unwrap(np.angle(h))
    gc, pc = [], []
    for i in np.nonzero(np.sign(lm[:-1]) != np.sign(lm[1:]))[0]:
        gc.append(optimize.brentq(lambda x: np.log(abs(response(z, p, k, np.array([x]), delay)[0])), w[i], w[i + 1], xtol=1e-12 * w[i]))
    lev = (ph + np.pi) / (2 * np.pi)
    for i in np.nonzero(np.floor(lev[:-1]) != np.floor(lev[1:]))[0]:
        target = np.floor(max(lev[i], lev[i + 1])) * 2 * np.pi - np.pi
        def g(x, t=target, i=i):
            hh = response(z, p, k, np.array([w[i], x]), delay)
            a = np.unwrap(np.angle(hh))
            return a[1] - ph[i] + (ph[i] - t)
        try:
            pc.append(optimize.brentq(g, w[i], w[i + 1], xtol=1e-12 * w[i]))
        except ValueError:
            pass
    return gc, pc

def zpk_of(L):
    """Zeros, poles (rad/s) and zpk gain of an exported loop.

    Bode gain K s^n prod(1 - s/z)/prod(1 - s/p) -> zpk gain K prod(-1/z) / prod(-1/p) over the non-zero roots."""
    z = np.array([complex(a, b) for a, b in L["zerosRadPerS"]])
    p = np.array([complex(a, b) for a, b in L["polesRadPerS"]])
    k = L["gain"] * np.prod([-1 / x for x in z if x != 0]).real / np.prod([-1 / x for x in p if x != 0]).real
    return z, p, k

def main():
    root = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
    out = os.path.join(tempfile.mkdtemp(), "loops.json")
    subprocess.run(["dotnet", "run", "-c", "Release", "--project", os.path.join(root, "tests", "LoopShaper.Bench"), "--", "--export", out], check=True)
    loops = json.load(open(out))
    print(f"{'design':36} {'scipy us':>10} {'loopshaper us':>14} {'ratio':>7}")
    ratios = []
    for L in loops:
        z, p, k = zpk_of(L)
        f0, f1, d = L["startHz"], L["stopHz"], L["delayS"]
        w = 2 * np.pi * np.logspace(np.log10(f0), np.log10(f1), 1000)
        reps = 20
        t = time.perf_counter()
        for _ in range(reps):
            response(z, p, k, w, d)
            margins(z, p, k, d, f0, f1)
        us = (time.perf_counter() - t) / reps * 1e6
        ratio = us / L["responseAndMarginsUs"]
        ratios.append(ratio)
        print(f"{L['design']:36} {us:10.1f} {L['responseAndMarginsUs']:14.1f} {ratio:7.1f}")
    print(f"geometric-mean ratio SciPy / LoopShaper: {np.exp(np.mean(np.log(ratios))):.1f} (aim: at least 10)")

if __name__ == "__main__":
    sys.exit(main())
