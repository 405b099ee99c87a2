"""Curves: whole-command times before and after, side by side with a bare start-up.

Run:  python benchmarks/curve_benchmark.py [--before PATH] [--runs N] [--profile]

Prints ratios, never absolute promises: the machines are shared and noisy. Whole
commands spend most of their time importing, so a change of a tenth of a second in
them is near the noise between runs; the two library lines time the curve work
itself. (Curves no longer import sympy unless ``--exact`` is asked; see
``startup_benchmark.py`` for the start-up ratios of issue 10.)

Each command runs as a fresh process (the way a user runs it), N times
(default 5), alternating between the variants so that load on the machine
falls on all of them alike; the median is kept. The variants:

* ``bare``: ``python -c "import numpy, typer"``, the floor of any command;
* ``after``: this checkout's code (``PYTHONPATH`` set to it);
* ``before``: another checkout given with ``--before`` (for example the main
  branch before a change), if given.

Commands (invented inputs):

* ``revolve vessel --diameter 2000 --length 5000 --head ellipsoidal``: two
  ellipsoidal heads (curves), built, drawn in the sketch and measured;
* ``revolve measure spindle.toml``: a waisted spindle whose waist is the curve
  ``y = 20 + 5 sin(x/10)`` (x in 0..100 mm);
* 200 distinct cubic curves parsed and built with ``curve_from_expressions``
  in one process (a drawing with many splines);
* the vessel's engine work alone (build, summarise, draw, measure), timed
  inside the process after the imports, so start-up noise stays out.

With ``--profile`` the "after" variant of each command also runs once under
cProfile and the functions with the most cumulative time are printed.
"""

from __future__ import annotations

import argparse
import os
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]

SPINDLE = """\
name = "benchmark: waisted spindle (invented)"
units = "mm"
angle = 360

[axis]
along = "x"

[[loop]]
start = [0.0, 0.0]
segments = [
  { line_to = [0.0, 20.0] },
  { y = "20 + 5*sin(x/10)", to_x = 100 },
  { line_to = [100.0, 0.0] },
  { close = true },
]
"""

#: 200 distinct cubic curves, as a drawing with many splines gives (each checked and compiled).
MANY_CURVES = """\
from revolve.expr import parse_expression
from revolve.geometry.segments import curve_from_expressions
for k in range(200):
    curve_from_expressions(parse_expression(f"{k} + 3*t + t^2/7"),
                           parse_expression(f"2 + {k / 3!r}*t^3"), 0.0, 1.0)
"""

#: The vessel's engine work in one process, imports done first (prints its own seconds).
VESSEL_ENGINE = """\
import time, numpy
from revolve.geometry.measure import measure
from revolve.geometry.profile import Revolution
from revolve.jobs.vessel import design_vessel, parse_head, sketch_profile, summarise
t0 = time.perf_counter()
spec = parse_head("ellipsoidal", 2000.0)
design = design_vessel(2000.0, 5000.0, spec, spec)
summarise(design)
profile, axis = sketch_profile(design, "vertical", "inside")
measure(Revolution(profile, axis), symbolic=False)
print(time.perf_counter() - t0)
"""


def run(argv, pythonpath, cwd):
    env = dict(os.environ)
    if pythonpath is None:
        env.pop("PYTHONPATH", None)
    else:
        env["PYTHONPATH"] = str(pythonpath)
    t0 = time.perf_counter()
    done = subprocess.run([sys.executable] + argv, cwd=cwd, env=env,
                          stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    elapsed = time.perf_counter() - t0
    if done.returncode != 0:
        raise SystemExit(f"{' '.join(argv)} failed ({done.returncode}):\n"
                         + done.stderr.decode(errors="replace")[-2000:])
    return elapsed, done.stdout


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--before", type=Path, default=None,
                    help="a checkout of the code before the change (its root directory)")
    ap.add_argument("--runs", type=int, default=5)
    ap.add_argument("--profile", action="store_true")
    args = ap.parse_args()

    with tempfile.TemporaryDirectory() as tmp:
        (Path(tmp) / "spindle.toml").write_text(SPINDLE, encoding="utf-8")
        commands = {
            "vessel, two ellipsoidal heads": ["-m", "revolve", "vessel", "--diameter", "2000",
                                              "--length", "5000", "--head", "ellipsoidal"],
            "measure, curve profile": ["-m", "revolve", "measure", "spindle.toml"],
            "200 distinct curves built (library)": ["-c", MANY_CURVES],
            "vessel engine only, imports excluded (library)": ["-c", VESSEL_ENGINE],
        }
        variants = {"after": ROOT}
        if args.before is not None:
            variants["before"] = args.before.resolve()
        bare = ["-c", "import numpy, typer"]
        print(f"python {sys.version.split()[0]}; median of {args.runs} runs, each a new process")
        for name, argv in commands.items():
            times = {"bare": []} | {v: [] for v in variants}
            outputs = {}
            for _ in range(args.runs):
                times["bare"].append(run(bare, None, tmp)[0])
                for v, path in variants.items():
                    t, out = run(argv, path, tmp)
                    if argv[-1] is VESSEL_ENGINE:   # it times itself, without start-up
                        t, out = float(out), b""
                    times[v].append(t)
                    outputs[v] = out
            med = {k: statistics.median(v) for k, v in times.items()}
            print(f"\n{name}")
            for k, v in med.items():
                rel = ("" if argv[-1] is VESSEL_ENGINE
                       else f"   {v / med['bare']:5.2f}× bare start-up")
                if k != "bare" or rel:
                    print(f"  {k:7s} {v:7.3f} s{rel}")
            if "before" in med:
                print(f"  before / after: {med['before'] / med['after']:.2f}×   "
                      f"(same output: {outputs['before'] == outputs['after']})")
            if args.profile:
                prof = Path(tmp) / "out.prof"
                if argv[0] != "-m":
                    continue
                run(["-m", "cProfile", "-o", str(prof)] + argv, ROOT, tmp)
                import pstats
                print("  cProfile (after), top cumulative:")
                stats = pstats.Stats(str(prof), stream=sys.stdout)
                stats.sort_stats("cumulative").print_stats(18)


if __name__ == "__main__":
    main()
