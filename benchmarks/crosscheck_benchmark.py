"""The independent cross-check on one polyline of 10⁴ … 10⁶ vertices, side by side with references.

Run:  python benchmarks/crosscheck_benchmark.py [--sizes 10000,100000,1000000]
      [--shapes smooth,noisy] [--repeats 3] [--prepare] [--profile N]

For each outline (the ``smooth`` and ``noisy`` rings of ``pointlist_benchmark.py``:
star-shaped about (0, 50), radius 20 + 2 sin 7a, noise ±0.1 point spacing or
±0.5 absolute) it times, in this process and alternated so that each sees the
same load on a shared machine (best of ``--repeats``):

* ``cross-check``: :func:`revolve.geometry.slicing.washer_volume` plus
  :func:`revolve.geometry.slicing.surface_by_quadrature` on the outline held
  as ONE :class:`~revolve.geometry.segments.Polyline` (its loop factor
  computed beforehand);
* ``shapely``: ``shapely.Polygon(points).area`` on the same vertices;
* ``loadtxt``: ``numpy.loadtxt`` of the same vertices from a CSV file (numpy
  reading the array once more: the floor of any program that reads a point list).

It prints seconds, the ratios cross-check/shapely and cross-check/loadtxt,
the peak memory the cross-check allocates (``tracemalloc``, which numpy reports
to) next to the size of the vertex array, and the relative difference of the
washer volume from shapely's area and centroid through Pappus–Guldinus.

The profile is placed in the axis frame directly (the ring lies above the x
axis, so the frame is the sketch): ``prepare()`` is not timed here (see
``pointlist_benchmark.py``); ``--prepare`` runs it instead (slow on the noisy
ring: its self-intersection test). ``--profile N`` runs the cross-check on the
N-vertex noisy ring under cProfile and prints the 20 functions with the most
own time.

Prints ratios, never absolute promises: the machines are shared and noisy.
"""

from __future__ import annotations

import argparse
import atexit
import math
import shutil
import sys
import tempfile
import time
import tracemalloc
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(Path(__file__).resolve().parent))

from pointlist_benchmark import noisy, ring  # noqa: E402

from revolve.geometry.checks import PreparedProfile, prepare  # noqa: E402
from revolve.geometry.profile import Axis, Loop, Profile  # noqa: E402
from revolve.geometry.segments import Polyline  # noqa: E402
from revolve.geometry.slicing import surface_by_quadrature, washer_volume  # noqa: E402


def outline(shape: str, n: int) -> np.ndarray:
    return ring(n, 0.1) if shape == "smooth" else noisy(n)


def prepared(points: np.ndarray, through_prepare: bool):
    """The ring as one closed polyline, in the frame of the x axis."""
    closed = np.vstack([points, points[:1]])
    if through_prepare:
        return prepare(Profile(loops=(Loop((Polyline(closed),)),)), Axis.x())
    size = float(np.hypot(*(points.max(axis=0) - points.min(axis=0))))
    return PreparedProfile(((Polyline(closed),),), (True,), (0,), 1.0, size, 1e-9 * size)


def cross_check(prep, factors):
    v, _ = washer_volume(prep, factors, 2 * math.pi)
    s, _ = surface_by_quadrature(prep, 2 * math.pi)
    return v, float(sum(s))


def timed(fn):
    t0 = time.perf_counter()
    out = fn()
    return time.perf_counter() - t0, out


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--sizes", default="10000,100000,1000000")
    ap.add_argument("--shapes", default="smooth,noisy")
    ap.add_argument("--repeats", type=int, default=3)
    ap.add_argument("--prepare", action="store_true")
    ap.add_argument("--profile", type=int, default=0)
    args = ap.parse_args(argv)
    import shapely

    work = Path(tempfile.mkdtemp(prefix="revolve-crosscheck-"))
    atexit.register(shutil.rmtree, work, True)      # no files left behind
    print("washer_volume + surface_by_quadrature on one polyline, against shapely.Polygon(...).area "
          "and numpy.loadtxt of the same vertices (best of %d)" % args.repeats)
    print(f"{'shape':>7} {'vertices':>9} {'washers s':>10} {'surface s':>10} {'check s':>8} "
          f"{'shapely s':>10} {'loadtxt s':>10} {'/shapely':>9} {'/loadtxt':>9} {'peak MB':>8} "
          f"{'array MB':>9} {'|ΔV|/V':>9}")
    for shape in args.shapes.split(","):
        for n in (int(s) for s in args.sizes.split(",")):
            pts = outline(shape, n)
            path = work / f"{shape}-{n}.csv"
            np.savetxt(path, pts, delimiter=",", fmt="%.17g")
            prep = prepared(pts, args.prepare)
            factors = prep.loop_factors
            best = {}
            for _ in range(args.repeats):
                for name, fn in (
                        ("washers", lambda: washer_volume(prep, factors, 2 * math.pi)),
                        ("surface", lambda: surface_by_quadrature(prep, 2 * math.pi)),
                        ("shapely", lambda: shapely.Polygon(pts).area),
                        ("loadtxt", lambda: np.loadtxt(path, delimiter=","))):
                    t, _ = timed(fn)
                    best[name] = min(best.get(name, math.inf), t)
            tracemalloc.start()
            volume, _ = cross_check(prep, factors)
            peak = tracemalloc.get_traced_memory()[1] / 2 ** 20
            tracemalloc.stop()
            poly = shapely.Polygon(pts)
            reference = 2 * math.pi * poly.centroid.y * poly.area
            check = best["washers"] + best["surface"]
            print(f"{shape:>7} {n:>9} {best['washers']:>10.4f} {best['surface']:>10.4f} {check:>8.3f} "
                  f"{best['shapely']:>10.4f} {best['loadtxt']:>10.3f} "
                  f"{check / best['shapely']:>8.1f}× {check / best['loadtxt']:>8.2f}× {peak:>8.0f} "
                  f"{pts.nbytes / 2 ** 20:>9.0f} {abs(volume - reference) / reference:>9.1e}",
                  flush=True)
    if args.profile:
        import cProfile
        import pstats

        prep = prepared(outline("noisy", args.profile), args.prepare)
        factors = prep.loop_factors
        print(f"\ncProfile of the cross-check on the {args.profile}-vertex noisy ring (own time, top 20):")
        pr = cProfile.Profile()
        pr.enable()
        cross_check(prep, factors)
        pr.disable()
        pstats.Stats(pr).sort_stats("tottime").print_stats(20)


if __name__ == "__main__":
    main()
