#!/usr/bin/env python3
"""Where the browser's main thread spends each change of a browser-benchmark run.

Reads the timeline that `BENCH_TRACE=1` writes (loopshaper-changes.trace.json in the temp folder; each change is
marked there by a console.timeStamp('bench change')) and prints, per change and as medians over all changes, the
main thread's self time in script, style, layout, paint and the other rendering phases, and the raster workers' time.
Usage: python3 tests/LoopShaper.Web.Bench/trace_breakdown.py [TRACE.json]
"""
import collections
import json
import os
import statistics
import sys
import tempfile

PHASES = ("FunctionCall", "UpdateLayoutTree", "Layout", "PrePaint", "Paint", "Layerize", "Commit")


def main() -> None:
    path = sys.argv[1] if len(sys.argv) > 1 else os.path.join(tempfile.gettempdir(), "loopshaper-changes.trace.json")
    events = json.load(open(path, encoding="utf-8"))["traceEvents"]
    threads = {(e["pid"], e["tid"]): e["args"]["name"] for e in events if e.get("ph") == "M" and e.get("name") == "thread_name"}
    marks = sorted(e["ts"] for e in events if e.get("name") == "TimeStamp" and "bench change" in json.dumps(e.get("args", {})))
    if len(marks) < 2:
        sys.exit("no 'bench change' marks in " + path)
    busiest = collections.Counter((e["pid"], e["tid"]) for e in events if threads.get((e["pid"], e["tid"])) == "CrRendererMain").most_common(1)[0][0]
    main_thread = sorted((e for e in events if (e["pid"], e["tid"]) == busiest and e.get("ph") == "X"), key=lambda e: (e["ts"], -e["dur"]))
    rows = []
    for start, stop in zip(marks, marks[1:]):
        own = collections.Counter()
        stack = []  # (event, end): self time = duration minus the children's
        for e in (e for e in main_thread if start <= e["ts"] < stop):
            while stack and stack[-1][1] <= e["ts"]:
                stack.pop()
            if stack:
                own[stack[-1][0]["name"]] -= e["dur"]
            own[e["name"]] += e["dur"]
            stack.append((e, e["ts"] + e["dur"]))
        raster = sum(e["dur"] for e in events if e.get("name") == "RasterTask" and start <= e["ts"] < stop)
        rows.append({"span": (stop - start) / 1000, **{p: own[p] / 1000 for p in PHASES}, "raster": raster / 1000})
    keys = ["span", *PHASES, "raster"]
    names = {"FunctionCall": "script", "UpdateLayoutTree": "style", "Layout": "layout", "PrePaint": "prepnt", "Paint": "paint", "Layerize": "layers", "Commit": "commit"}
    print("ms          " + "  ".join(f"{names.get(k, k):>6}" for k in keys))
    for i, r in enumerate(rows):
        print(f"change {i:3d}: " + "  ".join(f"{r[k]:6.1f}" for k in keys))
    print("median:     " + "  ".join(f"{statistics.median(r[k] for r in rows):6.1f}" for k in keys))


if __name__ == "__main__":
    main()
