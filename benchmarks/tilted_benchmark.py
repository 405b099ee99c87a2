"""Tilted level tables: speed beside the untilted tables, and agreement with the cross-check.

Run:  python benchmarks/tilted_benchmark.py [--levels N] [--quick] [--before DIR]

For each bundled vessel profile and both orientations, in one run: a table of
N levels (default 1000) by the existing untilted table
(:func:`revolve.jobs.levels.table_at_levels`), by
:func:`revolve.geometry.tilted.tilted_levels` at no tilt and at 2°, and the
independent cross-check :func:`revolve.geometry.tilted.tilted_crosscheck` at 2°
(best of three each). Printed: times as ratios to the untilted table, the
largest difference at no tilt (relative to the capacity), the largest error
estimate, and the cross-check's largest difference. Also a surveyed wall of
999 polyline edges (an invented test shape) for scale. Ratios, never absolute
promises: the machines are shared and noisy. ``--quick`` (a smoke run) is 20
levels, each timing run once. The last line is the 2° time of the surveyed wall
over the slowest bundled vessel's.

``--before DIR`` (another checkout, e.g. ``git worktree add --detach DIR main``)
then times the 2° table of every row again, this checkout and DIR each in its own
child process, alternated (best of the runs of both rounds), and prints the times
side by side with the largest difference of their volumes (relative to the
capacity).
"""

from __future__ import annotations

import argparse
import os
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from revolve.formats import load_profile  # noqa: E402
from revolve.geometry.profile import Axis, Loop, Profile  # noqa: E402
from revolve.geometry.segments import Line, Polyline  # noqa: E402
from revolve.geometry.tilted import (tilted_crosscheck, tilted_levels, tilted_pieces,  # noqa: E402
                                     tilted_range)
from revolve.jobs.levels import liquid_space, table_at_levels  # noqa: E402

VESSELS = ("vessel-brew-kettle.toml", "vessel-diesel-day-tank.toml", "vessel-rainwater-tank.toml")


RUNS = 3


def best(fn, runs=None):
    runs = RUNS if runs is None else runs
    out, t = None, float("inf")
    for _ in range(runs):
        t0 = time.perf_counter()
        out = fn()
        t = min(t, time.perf_counter() - t0)
    return out, t


def surveyed_space():
    """A lying tank whose wall is a surveyed polyline of 999 edges (invented test shape)."""
    z = np.linspace(0.0, 4000.0, 1000)
    r = 1000.0 + 5.0 * np.sin(2 * np.pi * z / 500.0) + 2.0 * np.cos(2 * np.pi * z / 130.0)
    wall = Polyline(np.column_stack([z, r]))
    loop = Loop((Line((0.0, 0.0), (0.0, float(r[0]))), wall,
                 Line((4000.0, float(r[-1])), (4000.0, 0.0)), Line((4000.0, 0.0), (0.0, 0.0))))
    return liquid_space(Profile(loops=(loop,)), Axis.x(), orientation="horizontal")


#: A child's work with ``--before``: the 2° table of one row on the tree at argv[1] (its
#: best time of argv[5] runs; volumes saved to argv[6]).
CHILD = r"""
import sys, time, importlib.util
import numpy as np
root, name, orientation, n, runs, out = sys.argv[1:7]
sys.path.insert(0, root)
import revolve
assert revolve.__file__.startswith(root), revolve.__file__
from revolve.formats import load_profile
from revolve.geometry.tilted import tilted_levels, tilted_pieces, tilted_range
from revolve.jobs.levels import liquid_space
spec = importlib.util.spec_from_file_location("tb", sys.argv[7])
tb = importlib.util.module_from_spec(spec)
spec.loader.exec_module(tb)
if name == "surveyed":
    space = tb.surveyed_space()
else:
    doc = load_profile(root + "/profiles/" + name)
    space = liquid_space(doc.profile, doc.axis, orientation=orientation)
pc = tilted_pieces(space.prepared)
lo, hi = tilted_range(space.prepared, 2.0, orientation, pieces=pc)
lt = np.linspace(lo, hi, int(n))
best = float("inf")
for _ in range(int(runs)):
    t0 = time.perf_counter()
    v = tilted_levels(space.prepared, lt, 2.0, orientation, pieces=pc)[0]
    best = min(best, time.perf_counter() - t0)
np.save(out, v)
print(best, space.capacity)
"""


def before_after(before, n, runs):
    """The 2° table of every row, this tree and ``before`` alternated in child processes."""
    rows = [(name, o) for name in VESSELS for o in ("vertical", "horizontal")]
    rows.append(("surveyed", "horizontal"))
    trees = {"after": str(ROOT), "before": str(Path(before).resolve())}
    print(f"\n2° table of {n} levels: this checkout (after) and {trees['before']} (before), "
          f"each in its own process, alternated; best of {2 * runs} runs")
    print(f"{'profile':<34} {'drawn':<10} {'after ms':>9} {'before ms':>10} {'after/before':>13}"
          f" {'|Δ| / cap':>10}")
    env = {k: v for k, v in os.environ.items() if k != "PYTHONPATH"}
    with tempfile.TemporaryDirectory() as tmp:
        for name, orientation in rows:
            best_t, cap = {"after": float("inf"), "before": float("inf")}, 0.0
            for _ in range(2):
                for tree, root in trees.items():
                    out = str(Path(tmp) / f"{tree}.npy")
                    done = subprocess.run([sys.executable, "-c", CHILD, root, name, orientation,
                                           str(n), str(runs), out, str(Path(__file__).resolve())],
                                          env=env, capture_output=True, text=True, check=True)
                    t, cap = (float(x) for x in done.stdout.split())
                    best_t[tree] = min(best_t[tree], t)
            diff = np.max(np.abs(np.load(str(Path(tmp) / "after.npy"))
                                 - np.load(str(Path(tmp) / "before.npy")))) / cap
            label = "surveyed wall, 999 polyline edges" if name == "surveyed" else name
            print(f"{label:<34} {orientation:<10} {best_t['after'] * 1e3:9.1f}"
                  f" {best_t['before'] * 1e3:10.1f} {best_t['after'] / best_t['before']:12.2f}×"
                  f" {diff:10.1e}")


def row(label, space, orientation, n):
    lv = np.linspace(0.0, space.height, n)
    ref, t_ref = best(lambda: table_at_levels(space, lv))
    pc = tilted_pieces(space.prepared)
    (v0, e0, _), t0 = best(lambda: tilted_levels(space.prepared, lv, 0.0, orientation, pieces=pc))
    lo, hi = tilted_range(space.prepared, 2.0, orientation, pieces=pc)
    lt = np.linspace(lo, hi, n)
    (v2, e2, _), t2 = best(lambda: tilted_levels(space.prepared, lt, 2.0, orientation, pieces=pc))
    few = lt[:: max(1, n // 20)]
    cc, tc = best(lambda: tilted_crosscheck(space.prepared, few, 2.0, orientation, pieces=pc), 1)
    v_few = tilted_levels(space.prepared, few, 2.0, orientation, pieces=pc)[0]
    cap = space.capacity
    print(f"{label:<34} {orientation:<10} {t_ref * 1e3:9.1f} {t0 / t_ref:8.1f}× {t2 / t_ref:8.1f}×"
          f" {tc / t_ref:8.1f}×   {np.max(np.abs(v0 - ref.volume)) / cap:9.1e}"
          f" {max(e0.max(), e2.max()) / cap:9.1e} {np.max(np.abs(cc - v_few)) / cap:9.1e}")
    return t2


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--levels", type=int, default=1000)
    parser.add_argument("--quick", action="store_true", help="a smoke run: 20 levels, one run each")
    parser.add_argument("--before", metavar="DIR", default=None,
                        help="another checkout: its 2° tables timed beside this one's")
    args = parser.parse_args()
    global RUNS
    n = args.levels
    if args.quick:
        n, RUNS = 20, 1
    print(f"{n} levels; times as ratios to the untilted table (best of {RUNS})")
    print(f"{'profile':<34} {'drawn':<10} {'untilted':>9} {'tilt 0':>9} {'tilt 2°':>9}"
          f" {'x-check':>9}   {'Δ tilt 0':>9} {'err est':>9} {'Δ x-chk':>9}")
    print(f"{'':<34} {'':<10} {'ms':>9} {'':>9} {'':>9} {'(n/20)':>9}   {'/cap':>9}"
          f" {'/cap':>9} {'/cap':>9}")
    bundled = []
    for name in VESSELS:
        doc = load_profile(str(ROOT / "profiles" / name))
        for orientation in ("vertical", "horizontal"):
            bundled.append(row(name, liquid_space(doc.profile, doc.axis, orientation=orientation),
                               orientation, n))
    t_wall = row("surveyed wall, 999 polyline edges", surveyed_space(), "horizontal", n)
    print(f"tilt 2°: surveyed wall / slowest bundled vessel = {t_wall / max(bundled):.1f}×"
          f" ({t_wall * 1e3:.0f} ms / {max(bundled) * 1e3:.0f} ms)")
    if args.before:
        before_after(args.before, n, RUNS)


if __name__ == "__main__":
    main()
