#!/usr/bin/env python3
"""Times the 10,000 loop evaluations of a Monte Carlo run in SciPy and in LoopShaper, and prints the ratio from one run.

Run from the repository root with Debian's python3-scipy:  /usr/bin/python3 tests/LoopShaper.Bench/scipy_monte_carlo.py [DESIGN.json]
It first runs the C# benchmark (tests/LoopShaper.Bench --mc-export), which draws the 10,000 samples of a Monte Carlo
run (seed 1, uniform, the design's tolerances), builds each sample's loop gain, times the core evaluating all of them
(1000 log-spaced points plus every margin, on one thread and on every core) and writes the loops to a JSON file.
SciPy then evaluates the same loops the same way (scipy.signal.freqs_zpk on 1000 points, margins as in
scipy_margins.py: a dense grid and scipy.optimize.brentq), one process on one core, and the script prints both times,
their ratios, and the largest phase-margin difference between the two.
"""
import json, os, subprocess, sys, tempfile, time
import numpy as np
from scipy_margins import response, margins, zpk_of

def main():
    root = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
    design = sys.argv[1] if len(sys.argv) > 1 else "core-rail-12v-to-1v0.json"
    out = os.path.join(tempfile.mkdtemp(), "mc-loops.json")
    subprocess.run(["dotnet", "run", "-c", "Release", "--project", os.path.join(root, "tests", "LoopShaper.Bench"), "--",
                    "--mc-export", out, "--design", design], check=True)
    run = json.load(open(out))
    f0, f1 = run["startHz"], run["stopHz"]
    w = 2 * np.pi * np.logspace(np.log10(f0), np.log10(f1), 1000)
    loops = [zpk_of(L) + (L["delayS"], L["phaseMarginDeg"]) for L in run["loops"]]

    worst = 0.0
    t = time.perf_counter()
    for z, p, k, d, pm_core in loops:
        response(z, p, k, w, d)
        gc, _ = margins(z, p, k, d, f0, f1)
        if gc and pm_core is not None:
            # The phase margin at the lowest crossover (the core reports the smallest over all crossovers; the
            # example loops have one).
            h = response(z, p, k, np.array([gc[0]]), d)[0]
            pm = 180 + np.degrees(np.angle(h))
            pm = (pm + 180) % 360 - 180
            worst = max(worst, abs(pm - pm_core))
    scipy_s = time.perf_counter() - t

    print(f"design: {run['design']}, {len(loops)} loops, 1000 points + margins each")
    print(f"SciPy (one core):            {scipy_s:8.3f} s")
    print(f"LoopShaper, one thread:      {run['oneThreadS']:8.3f} s   ratio SciPy / LoopShaper {scipy_s / run['oneThreadS']:6.1f}")
    print(f"LoopShaper, {run['cores']} cores:        {run['allCoresS']:8.3f} s   ratio SciPy / LoopShaper {scipy_s / run['allCoresS']:6.1f}")
    print(f"largest phase-margin difference SciPy vs LoopShaper: {worst:.2e} deg")

if __name__ == "__main__":
    sys.exit(main())
