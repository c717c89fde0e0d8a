#!/usr/bin/python3
"""Reference margins of docs/examples/custom-boost-led-driver-rhp-zero.json, computed independently of LoopShaper.

Run with Debian's SciPy: /usr/bin/python3 custom_boost_margins.py > custom_boost_margins.json

Plant (factor form, each factor 1 at DC):
    G(s) = 30 (1 - s/wr)(1 + s/we) / (1 + s/(w0 Q) + (s/w0)^2) e^(-s Td)
Type III placement (Erickson & Maksimovic, 2nd ed., sec. 9.5):
    Gc(s) = (wi/s)(1 + s/wz1)(1 + s/wz2) / ((1 + s/wp1)(1 + s/wp2)),  wi chosen so that |T(j 2 pi fc)| = 1.
Margins as in shared/CONVENTIONS.md: gain crossover |T| = 1, PM = 180 + phase; phase crossover where the
continuous phase is -180 + k 360, GM = -20 log10 |T|. The phase is the sum of the factor angles (continuous by
construction); roots are refined with scipy.optimize.brentq.
"""
import json
import numpy as np
from scipy.optimize import brentq

K, F_RHP, F_ESR, F0, Q, TD = 30.0, 15e3, 25e3, 1.2e3, 3.0, 1.5e-6
FC, FZ1, FZ2, FP1, FP2 = 2e3, 600.0, 1e3, 15e3, 40e3
START, STOP = 1.0, 1e6


def shape_mag(f):
    """|T(j 2 pi f)| / wi."""
    x = f / F0
    plant = K * np.hypot(1, f / F_RHP) * np.hypot(1, f / F_ESR) / np.hypot(1 - x * x, x / Q)
    comp = np.hypot(1, f / FZ1) * np.hypot(1, f / FZ2) / (2 * np.pi * f * np.hypot(1, f / FP1) * np.hypot(1, f / FP2))
    return plant * comp


WI = 1.0 / shape_mag(FC)


def mag(f):
    return WI * shape_mag(f)


def phase_deg(f):
    x = f / F0
    a = -np.arctan(f / F_RHP) + np.arctan(f / F_ESR) - np.arctan2(x / Q, 1 - x * x)
    a += -np.pi / 2 + np.arctan(f / FZ1) + np.arctan(f / FZ2) - np.arctan(f / FP1) - np.arctan(f / FP2)
    a += -2 * np.pi * f * TD
    return np.degrees(a)


def roots(g):
    f = np.logspace(np.log10(START), np.log10(STOP), 200001)
    v = g(f)
    idx = np.nonzero(np.sign(v[:-1]) != np.sign(v[1:]))[0]
    return [brentq(g, f[i], f[i + 1], xtol=1e-12, rtol=1e-14) for i in idx]


gain_crossovers = [{"frequencyHz": fc, "phaseMarginDeg": 180 + phase_deg(fc)} for fc in roots(lambda f: np.log(mag(f)))]
phase_crossovers = []
for k in range(0, 4):
    level = -180 - 360 * k
    for f in roots(lambda f, lv=level: phase_deg(f) - lv):
        phase_crossovers.append({"frequencyHz": f, "criticalPhaseDeg": level, "gainMarginDb": -20 * np.log10(mag(f))})
phase_crossovers.sort(key=lambda p: p["frequencyHz"])
print(json.dumps({
    "source": "tests/LoopShaper.Cli.Tests/Reference/custom_boost_margins.py (SciPy brentq on the factor form)",
    "integratorHz": WI / (2 * np.pi),
    "gainCrossovers": gain_crossovers,
    "phaseCrossovers": phase_crossovers,
}, indent=2))
