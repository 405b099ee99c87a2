"""Tilted level tables: speed beside the untilted tables, and agreement with the cross-check.

Run:  python benchmarks/tilted_benchmark.py [--levels N] [--quick]

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
levels, each timing run once.
"""

from __future__ import annotations

import argparse
import sys
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


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--levels", type=int, default=1000)
    parser.add_argument("--quick", action="store_true", help="a smoke run: 20 levels, one run each")
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
    for name in VESSELS:
        doc = load_profile(str(ROOT / "profiles" / name))
        for orientation in ("vertical", "horizontal"):
            row(name, liquid_space(doc.profile, doc.axis, orientation=orientation), orientation, n)
    row("surveyed wall, 999 polyline edges", surveyed_space(), "horizontal", n)


if __name__ == "__main__":
    main()
