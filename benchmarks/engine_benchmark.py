"""Engine speed and accuracy, side by side with reference computations in one run.

Run:  python benchmarks/engine_benchmark.py [--quick]  (needs the test extras: shapely)

``--quick`` (a smoke run) stops the polylines at 10⁴ vertices, repeats each timing
once and the start-up twice.

Prints ratios, never absolute promises: the machines are shared and noisy.

1. Section integrals (area + centroid, plus every moment the engine needs) of
   polylines with 10³ … 10⁶ vertices, against shapely's ``Polygon.area`` and
   ``Polygon.centroid`` on the same vertices; the best of several repeats each.
2. An arc-only profile (a torus section: two half circles) against the closed
   form 2π²Rr², next to a 1000-vertex polygon approximation of the same circle.
3. Start-up: wall time of ``revolve measure`` on a line-and-arc profile, next to
   ``python -c "import numpy, typer"`` (the floor for any numpy + typer program).
"""

from __future__ import annotations

import math
import statistics
import subprocess
import sys
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from revolve.geometry.integrals import COL, polygon_moments  # noqa: E402


def best_of(fn, repeats=5):
    times = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        out = fn()
        times.append(time.perf_counter() - t0)
    return min(times), out


def wavy_ring(n, seed=0):
    """A star-shaped simple polygon around (0, 50), well clear of the axis y = 0."""
    rng = np.random.default_rng(seed)
    a = np.linspace(0, 2 * np.pi, n, endpoint=False)
    r = 20 + 2 * np.sin(7 * a) + rng.uniform(-0.5, 0.5, n)
    return r * np.cos(a), 50 + r * np.sin(a)


def engine_section(x, y):
    # every section moment the engine uses (area, first and second moments, ∫∫ r³ dA)
    v = polygon_moments(x, y, lengths=False)
    a = v[COL["M00"]]
    return a, v[COL["M10"]] / a, v[COL["M01"]] / a


def shapely_section(x, y):
    from shapely.geometry import Polygon

    p = Polygon(np.column_stack([x, y]))
    c = p.centroid
    return p.area, c.x, c.y


def section_benchmark(sizes=(10 ** 3, 10 ** 4, 10 ** 5, 10 ** 6), repeats=None):
    print("1. section integrals of an n-vertex polyline: engine vs shapely (area + centroid)")
    print(f"{'vertices':>10} {'engine s':>10} {'shapely s':>10} {'engine/shapely':>15} {'area rel. diff':>15} "
          f"{'centroid diff':>14}")
    for n in sizes:
        x, y = wavy_ring(n)
        reps = repeats or (7 if n < 10 ** 6 else 5)
        # alternate the two so that both see the same load on a shared machine
        te, ts = float("inf"), float("inf")
        for _ in range(reps):
            t, (ae, xe, ye) = best_of(lambda: engine_section(x, y), 1)
            te = min(te, t)
            t, (as_, xs, ys) = best_of(lambda: shapely_section(x, y), 1)
            ts = min(ts, t)
        print(f"{n:>10} {te:>10.5f} {ts:>10.5f} {te / ts:>15.2f} {abs(ae - as_) / as_:>15.1e} "
              f"{math.hypot(xe - xs, ye - ys):>14.1e}")


def arc_benchmark():
    from revolve.geometry.measure import measure
    from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    from revolve.geometry.segments import arc_from_centre

    R, r = 50.0, 7.5
    top = arc_from_centre((R + r, 0.0), (R - r, 0.0), (R, 0.0), clockwise=False)
    bottom = arc_from_centre((R - r, 0.0), (R + r, 0.0), (R, 0.0), clockwise=False)
    exact_v = 2 * math.pi ** 2 * R * r * r          # CRC Standard Mathematical Tables (from memory)
    exact_s = 4 * math.pi ** 2 * R * r
    m = measure(Revolution(Profile(loops=(Loop((top, bottom)),)), Axis.y()))
    a = np.linspace(0, 2 * np.pi, 1000, endpoint=False)
    poly = Loop.from_points(np.column_stack([R + r * np.cos(a), r * np.sin(a)]))
    mp = measure(Revolution(Profile(loops=(poly,)), Axis.y()))
    print("\n2. torus R = 50, r = 7.5 about y: relative error against 2π²Rr² and 4π²Rr")
    print(f"   exact arcs (2 segments):       volume {abs(m.volume / exact_v - 1):.1e}   "
          f"surface {abs(m.surface_total / exact_s - 1):.1e}")
    print(f"   1000-vertex polygon:           volume {abs(mp.volume / exact_v - 1):.1e}   "
          f"surface {abs(mp.surface_total / exact_s - 1):.1e}")


def startup_benchmark(repeats=7):
    prof = str(ROOT / "profiles" / "grooved-pulley.toml")

    # As an installed package runs: with compiled bytecode (pip writes it at install
    # time), so let Python cache it here too and warm the cache with one run first.
    import os

    env = {k: v for k, v in os.environ.items() if k != "PYTHONDONTWRITEBYTECODE"}

    def wall(cmd):
        subprocess.run(cmd, check=True, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, env=env)
        t = []
        for _ in range(repeats):
            t0 = time.perf_counter()
            subprocess.run(cmd, check=True, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL,
                           env=env)
            t.append(time.perf_counter() - t0)
        return min(t), statistics.median(t)

    base = wall([sys.executable, "-c", "import numpy, typer"])
    run = wall([sys.executable, "-m", "revolve", "measure", prof])
    print("\n3. start-up, best / median of", repeats, "runs (wall seconds)")
    print(f"   python -c 'import numpy, typer'        {base[0]:.3f} / {base[1]:.3f}")
    print(f"   revolve measure grooved-pulley.toml     {run[0]:.3f} / {run[1]:.3f}")
    print(f"   ratio measure / floor (best)            {run[0] / base[0]:.2f}")
    print(f"   at a 0.26 s floor this ratio gives       {0.26 * run[0] / base[0]:.2f} s (target 0.6 s)")


def main():
    import argparse

    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--quick", action="store_true", help="a smoke run: small sizes, few repeats")
    quick = ap.parse_args().quick
    if quick:
        section_benchmark((10 ** 3, 10 ** 4), repeats=1)
    else:
        section_benchmark()
    arc_benchmark()
    startup_benchmark(2 if quick else 7)


if __name__ == "__main__":
    main()
