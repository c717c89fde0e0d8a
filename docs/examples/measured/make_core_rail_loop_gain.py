#!/usr/bin/env python3
"""Writes core-rail-loop-gain.csv: a synthetic bench measurement of the demo design's loop gain (our own scenario).

The model's loop gain comes from `loopshaper bode` on docs/examples/core-rail-12v-to-1v0.json; every fourth point is
kept, the gain is raised by 1.0 dB and the phase lowered by 3 degrees (as a real board with a little more gain and
some extra delay might show), the phase is wrapped into (-180, 180] and the frequency is written in kHz, with an
extra "Coherence" column, as a network analyser would export it.

Run from the repository root:  /usr/bin/python3 docs/examples/measured/make_core_rail_loop_gain.py
"""
import csv
import io
import os
import subprocess

root = os.path.dirname(os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__)))))
bode = subprocess.run(
    ["dotnet", "run", "--project", os.path.join(root, "src", "LoopShaper.Cli"), "--", "bode",
     os.path.join(root, "docs", "examples", "core-rail-12v-to-1v0.json")],
    check=True, capture_output=True, text=True).stdout
rows = list(csv.DictReader(io.StringIO(bode)))[::4]


def wrap(deg):
    w = (deg + 180.0) % 360.0 - 180.0
    return 180.0 if w == -180.0 else w


with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "core-rail-loop-gain.csv"), "w", newline="") as f:
    f.write("# Synthetic loop-gain measurement of docs/examples/core-rail-12v-to-1v0.json (make_core_rail_loop_gain.py)\n")
    f.write("Frequency (kHz),Gain (dB),Phase (deg),Coherence\n")
    for r in rows:
        khz = float(r["frequency_hz"]) / 1000.0
        f.write(f"{khz:.6g},{float(r['loop_mag_db']) + 1.0:.4f},{wrap(float(r['loop_phase_deg']) - 3.0):.3f},0.99\n")
