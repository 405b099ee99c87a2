"""Point lists of 10³ … 10⁶ vertices: `revolve measure PTS --json`, before and after, in one run.

Run:  python benchmarks/pointlist_benchmark.py [--before DIR] [--sizes 1000,10000,100000,1000000]
      [--shapes smooth,noisy] [--timeout 600] [--profile N] [--no-library]

Each row times three processes on the same file, alternated so that they see the
same load on a shared machine (the best of ``--repeats`` runs each):

* ``after``:  ``python -m revolve measure PTS --json`` with this checkout first on
  PYTHONPATH (the cross-check included, as the command always runs it);
* ``before``: the same command with another checkout first on PYTHONPATH
  (``--before DIR``, e.g. a worktree of main; skipped without it);
* ``plain``:  a plain numpy process: ``numpy.loadtxt`` of the file and the shoelace
  area and centroid (the floor for any Python program that reads the file).

It prints wall seconds, the ratios after/plain and before/after, and the peak
memory of each revolve process (ru_maxrss of the child). Issue 10's targets, each
printed as a ratio:

* 10⁶ vertices: after/plain within 4×, peak memory under 400 MB;
* 10⁴ vertices: after / ``revolve measure`` of a four-line profile within 1.5×
  (the "vs 4 lines" column; the four-line time is measured in the same run);
* library: ``measure()`` of a loop made from the vertex array
  (``Loop.from_points(array)``) with the cross-check, within 5× of shapely's
  ``Polygon(array).area`` + ``.centroid`` on the same vertices. Each size runs in
  its own child process, which also times ``measure(..., crosscheck=False)`` so
  the cross-check's share is printed, and reports its peak memory. Two outlines, both
simple and star-shaped about (0, 50), radius 20 + 2 sin 7a, 10 ≤ r ≤ 80:

* ``smooth``: noise ±0.1 of the point spacing (a CMM trace or a dense drawing);
* ``noisy``:  noise ±0.5 (the outline of issue 10's measurements): at 10⁵ points the
  zigzags are ~400 spacings long, so every slice and every chord box meets
  hundreds of others.

``--profile N`` also runs the engine in this process under cProfile on the
N-vertex noisy file and prints the 25 functions with the most own time.

Prints ratios, never absolute promises: the machines are shared and noisy.
"""

from __future__ import annotations

import argparse
import atexit
import os
import shutil
import subprocess
import sys
import tempfile
import threading
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]

PLAIN = """
import sys, numpy as np
p = np.loadtxt(sys.argv[1], delimiter=",")
x, y = p[:, 0], p[:, 1]
xn, yn = np.roll(x, -1), np.roll(y, -1)
c = x * yn - xn * y
a = c.sum() / 2
print(a, ((x + xn) * c).sum() / (6 * a), ((y + yn) * c).sum() / (6 * a))
"""


def ring(n: int, noise_spacings: float, seed: int = 0) -> np.ndarray:
    """A star-shaped ring with radial noise of ± noise_spacings × the point spacing."""
    rng = np.random.default_rng(seed)
    a = np.linspace(0.0, 2 * np.pi, n, endpoint=False)
    spacing = 2 * np.pi * 20 / n
    r = 20 + 2 * np.sin(7 * a) + rng.uniform(-1, 1, n) * noise_spacings * spacing
    return np.column_stack([r * np.cos(a), 50 + r * np.sin(a)])


def noisy(n: int) -> np.ndarray:
    rng = np.random.default_rng(0)
    a = np.linspace(0.0, 2 * np.pi, n, endpoint=False)
    r = 20 + 2 * np.sin(7 * a) + rng.uniform(-0.5, 0.5, n)
    return np.column_stack([r * np.cos(a), 50 + r * np.sin(a)])


#: The command's work without the cross-check: read the file, measure, print JSON (a child
#: process like the command, to show what the cross-check costs on top).
NO_CHECK = """
import json, sys
sys.path.insert(0, sys.argv[2])
from revolve.formats import load_profile
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Revolution
m = measure(Revolution(load_profile(sys.argv[1]).profile, Axis.x()), crosscheck=False)
print(json.dumps({"volume": m.volume, "area": m.area, "surface": m.surface_total}))
"""

FOUR_LINES = """units = "mm"
[[loop]]
start = [0, 10]
segments = [{ line_to = [20, 10] }, { line_to = [20, 15] }, { line_to = [0, 15] }, { close = true }]
"""

LIBRARY = """
import json, math, resource, sys, time
import numpy as np
sys.path.insert(0, sys.argv[2])
import shapely
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Loop, Profile, Revolution

pts = np.load(sys.argv[1])
out = {}
def best(f, repeats):
    t = None
    for _ in range(repeats):
        t0 = time.perf_counter()
        value = f()
        dt = time.perf_counter() - t0
        t = dt if t is None else min(t, dt)
    return t, value
repeats = int(sys.argv[3])

def shapely_area_centroid():
    poly = shapely.Polygon(pts)
    return poly.area, poly.centroid

def engine(check):
    return measure(Revolution(Profile(loops=(Loop.from_points(pts),)), Axis.x()), crosscheck=check)

out["shapely"], (area, centroid) = best(shapely_area_centroid, repeats)
out["no_check"], m = best(lambda: engine(False), repeats)
out["volume_error"] = abs(m.volume - 2 * math.pi * centroid.y * area) / m.volume
out["with_check"], _ = best(lambda: engine(True), 1 if len(pts) > 100000 else repeats)
out["peak_mb"] = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
print(json.dumps(out))
"""


def library(path, timeout, cwd, repeats):
    """The library timings of one vertex array (.npy) in a child process, or None."""
    import json

    try:
        done = subprocess.run([sys.executable, "-c", LIBRARY, str(path), str(ROOT), str(repeats)],
                              capture_output=True, text=True, timeout=timeout, cwd=cwd)
    except subprocess.TimeoutExpired:
        return None
    if done.returncode != 0:
        return None
    return json.loads(done.stdout.strip().splitlines()[-1])


def run(cmd, pythonpath, timeout, cwd):
    """Wall seconds and peak memory (MB) of one child process, or (None, None) on timeout."""
    env = dict(os.environ)
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    if pythonpath:
        env["PYTHONPATH"] = str(pythonpath)
    t0 = time.perf_counter()
    # cwd: a neutral folder, so that `python -m revolve` finds the package on PYTHONPATH
    # and not in the folder the benchmark was started from
    child = subprocess.Popen(cmd, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, env=env,
                             cwd=cwd)
    timer = threading.Timer(timeout, child.kill)
    timer.start()
    try:
        _, status, usage = os.wait4(child.pid, 0)     # this child's own peak memory
    finally:
        timer.cancel()
    child.returncode = status
    wall = time.perf_counter() - t0
    if status != 0:
        return None, None
    return wall, usage.ru_maxrss / 1024


def fmt(t):
    return "   —   " if t is None else f"{t:7.2f}"


def ratio(a, b):
    return "   —  " if a is None or b is None else f"{a / b:6.1f}×"


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--before", help="another checkout of revolve to time side by side")
    ap.add_argument("--sizes", default="1000,10000,100000,1000000")
    ap.add_argument("--shapes", default="smooth,noisy")
    ap.add_argument("--repeats", type=int, default=3)
    ap.add_argument("--timeout", type=float, default=600.0)
    ap.add_argument("--profile", type=int, default=0)
    ap.add_argument("--no-library", action="store_true", help="skip the library-vs-shapely rows")
    args = ap.parse_args(argv)
    sizes = [int(s) for s in args.sizes.split(",")]
    shapes = args.shapes.split(",")
    work = Path(tempfile.mkdtemp(prefix="revolve-bench-"))
    atexit.register(shutil.rmtree, work, True)      # no files left behind
    py = sys.executable
    print(f"revolve measure PTS --json: after = {ROOT}, before = {args.before or '(not given)'}")
    if args.before:
        Path(args.before, "revolve", "__init__.py").stat()     # a checkout, or stop here
    four = work / "four-lines.toml"
    four.write_text(FOUR_LINES)
    four_cmd = [py, "-m", "revolve", "measure", str(four), "--json"]
    four_best = None
    for _ in range(args.repeats):
        t, _m = run(four_cmd, ROOT, args.timeout, work)
        if t is not None:
            four_best = t if four_best is None else min(four_best, t)
    print(f"four-line profile: {fmt(four_best)} s")
    print("(no check = the same file read and measured in a child process without the "
          "cross-check; its ratio to plain is the engine's own share)")
    print(f"{'shape':>7} {'vertices':>9} {'plain s':>8} {'after s':>8} {'before s':>8} "
          f"{'after/plain':>12} {'vs 4 lines':>11} {'before/after':>13} {'after MB':>9} "
          f"{'before MB':>10} {'no check s':>11} {'no check/plain':>15} {'no check MB':>12}")
    library_rows = []
    for shape in shapes:
        for n in sizes:
            pts = ring(n, 0.1) if shape == "smooth" else noisy(n)
            path = work / f"{shape}-{n}.csv"
            np.savetxt(path, pts, delimiter=",", fmt="%.17g")
            plain_cmd = [py, "-c", PLAIN, str(path)]
            cmd = [py, "-m", "revolve", "measure", str(path), "--json"]
            no_check_cmd = [py, "-c", NO_CHECK, str(path), str(ROOT)]
            best = {"plain": None, "after": None, "before": None, "no check": None}
            mem = {"after": None, "before": None, "no check": None}
            slow = set()
            for _ in range(args.repeats):
                for name, pp, c in (("plain", None, plain_cmd), ("after", ROOT, cmd),
                                    ("before", args.before, cmd), ("no check", None, no_check_cmd)):
                    if name == "before" and not args.before or name in slow:
                        continue
                    t, m = run(c, pp, args.timeout, work)
                    if t is None:
                        slow.add(name)
                        best[name] = None
                        continue
                    # one run is enough for anything slower than 20 s
                    if t > 20:
                        slow.add(name)
                    best[name] = t if best[name] is None else min(best[name], t)
                    if m is not None and name in mem:
                        mem[name] = m if mem[name] is None else max(mem[name], m)
            print(f"{shape:>7} {n:>9} {fmt(best['plain'])} {fmt(best['after'])} {fmt(best['before'])} "
                  f"{ratio(best['after'], best['plain']):>12} {ratio(best['after'], four_best):>11} "
                  f"{ratio(best['before'], best['after']):>13} "
                  f"{(mem['after'] or float('nan')):>9.0f} {(mem['before'] or float('nan')):>10.0f} "
                  f"{fmt(best['no check']):>11} {ratio(best['no check'], best['plain']):>15} "
                  f"{(mem['no check'] or float('nan')):>12.0f}",
                  flush=True)
            if not args.no_library:
                npy = work / f"{shape}-{n}.npy"
                np.save(npy, pts)
                library_rows.append((shape, n, library(npy, args.timeout, work, args.repeats)))
    if library_rows:
        print("\nlibrary: measure(Loop.from_points(array)) vs shapely Polygon(array).area + .centroid")
        print(f"{'shape':>7} {'vertices':>9} {'shapely s':>10} {'no check s':>11} {'check s':>8} "
              f"{'no check/shapely':>17} {'check/shapely':>14} {'check share':>12} {'MB':>6} "
              f"{'rel. diff':>10}")
        for shape, n, r in library_rows:
            if r is None:
                print(f"{shape:>7} {n:>9}   (did not finish within the timeout)")
                continue
            share = (r["with_check"] - r["no_check"]) / r["with_check"]
            print(f"{shape:>7} {n:>9} {r['shapely']:>10.4f} {r['no_check']:>11.4f} "
                  f"{r['with_check']:>8.3f} {ratio(r['no_check'], r['shapely']):>17} "
                  f"{ratio(r['with_check'], r['shapely']):>14} {share:>11.0%} {r['peak_mb']:>6.0f} "
                  f"{r['volume_error']:>10.1e}")
    if args.profile:
        profile(args.profile)


def profile(n):
    import cProfile
    import pstats

    sys.path.insert(0, str(ROOT))
    from revolve.geometry.measure import measure
    from revolve.geometry.profile import Axis, Loop, Profile, Revolution

    pts = noisy(n)
    print(f"\ncProfile of measure() on the {n}-vertex noisy ring (own time, top 25):")
    pr = cProfile.Profile()
    pr.enable()
    measure(Revolution(Profile(loops=(Loop.from_points(pts),)), Axis.x()))
    pr.disable()
    pstats.Stats(pr).sort_stats("tottime").print_stats(25)


if __name__ == "__main__":
    main()
