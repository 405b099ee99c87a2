"""Many small parts in one run: `revolve measure FOLDER --json` and `revolve turn FOLDER`, serial vs pool.

Run:  python benchmarks/batch_benchmark.py [--parts 1000] [--repeats 3] [--before DIR]
      [--profile] [--keep]

It writes ``--parts`` invented profiles into a temporary folder with the project's own
writer (``revolve.formats.writer.write_profile``): half stepped shafts with a crowned
collar (an arc), half flanged bushings, each with a few dimensions varied from a fixed
seed, all in carbon steel. Then, alternating the runs so that each sees the same load on
a shared machine (best of ``--repeats``), it times these processes:

* ``start-up``:   ``python -m revolve --version`` (the floor for any command);
* ``measure, serial`` / ``measure, pool``: ``revolve measure FOLDER --json`` with
  ``--workers 1`` and with the default (one worker per core);
* ``turn, serial`` / ``turn, pool``: ``revolve turn FOLDER`` (the one-row-per-part table);
* ``turn, before`` (with ``--before DIR``, another checkout such as a worktree of main):
  the same ``turn`` command there.

It prints seconds, ms per part (whole process, and with the start-up taken off), the ratio
serial/pool, and the projected time for 10⁶ parts at the pool's rate per part (start-up
taken off, as a long run pays it once). The issue's target is under 3 ms per part using
every core.

``--profile`` also runs ``measure FOLDER --json`` in this process, serially, under
cProfile, and prints where the time per part goes: reading (formats, TOML), the engine
(geometry), output (JSON, CLI rendering) and the rest, plus the 15 functions with the
most own time.

Prints ratios, never absolute promises: the machines are shared and noisy.
"""

from __future__ import annotations

import argparse
import os
import random
import shutil
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))


def shaft(rng: random.Random):
    """A stepped shaft with a crowned collar: journal, shoulder, collar, crown (mm)."""
    from revolve.geometry.profile import Loop, Profile
    from revolve.geometry.segments import Line, arc_from_radius

    journal_r = rng.choice([8, 9, 10, 11, 12])
    collar_r = journal_r + rng.choice([5, 6, 8, 10])
    journal_l = rng.choice([30, 35, 40, 45])
    collar_l = rng.choice([15, 20, 25])
    crown_l = rng.choice([16, 20, 24])
    x1, x2, x3 = journal_l, journal_l + collar_l, journal_l + collar_l + crown_l
    points = [(0, 0), (0, journal_r - 1), (1, journal_r), (x1, journal_r), (x1, collar_r),
              (x2, collar_r)]
    faces = ["left end", "chamfer", "journal", "shoulder", "collar"]
    segments = [Line(a, b, face=f) for a, b, f in zip(points, points[1:], faces)]
    segments.append(arc_from_radius((x2, collar_r), (x3, collar_r), radius=crown_l * 1.3,
                                    side="left", face="crown"))
    segments += [Line((x3, collar_r), (x3, 0), face="right end"),
                 Line((x3, 0), (0, 0), face="axis")]
    return Profile(loops=(Loop(tuple(segments)),), unit="mm"), "Stepped shaft"


def bushing(rng: random.Random):
    """A flanged bushing: bore, outside diameter, flange (mm)."""
    from revolve.geometry.profile import Loop, Profile
    from revolve.geometry.segments import Line

    bore = rng.choice([8, 10, 12, 15])
    outside = bore + rng.choice([4, 6, 8])
    flange = outside + rng.choice([8, 10, 12])
    length = rng.choice([30, 40, 50])
    thick = rng.choice([6, 8, 10])
    points = [(1.5, bore), (length, bore), (length, outside), (thick, outside), (thick, flange),
              (0, flange), (0, bore + 1.5)]
    faces = ["bore", "end face", "outside diameter", "flange back", "flange rim", "flange face",
             "bore chamfer"]
    segments = [Line(a, b, face=f) for a, b, f in zip(points, points[1:] + points[:1], faces)]
    return Profile(loops=(Loop(tuple(segments)),), unit="mm"), "Flanged bushing"


def write_parts(folder: Path, count: int, seed: int = 7) -> None:
    from revolve.formats.writer import write_profile
    from revolve.geometry.profile import Axis

    rng = random.Random(seed)
    for k in range(count):
        profile, name = (shaft if k % 2 == 0 else bushing)(rng)
        write_profile(profile, folder / f"part-{k:06d}.toml", axis=Axis.x(),
                      material="carbon steel", name=f"{name} {k} (invented)")


def timed(args, env, before: str = "") -> float:
    env = dict(env, PYTHONPATH=before or str(ROOT))
    start = time.perf_counter()
    # Run outside any checkout: `python -m` puts the working folder first on sys.path.
    done = subprocess.run([sys.executable, "-m", "revolve", *args], env=env,
                          cwd=tempfile.gettempdir(),
                          stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True)
    seconds = time.perf_counter() - start
    if done.returncode not in (0, 1):
        raise SystemExit(f"revolve {' '.join(args[:2])} failed: {done.stderr.strip()}")
    return seconds


def _burn(n: int) -> int:
    total = 0
    for i in range(n):
        total += i * i
    return total


def machine_ratio(repeats: int) -> float:
    """What this machine gives for parallel pure-Python work: serial time / pool time.

    The same loop once per core, one after another and then in a process pool of one
    worker per core: on a dedicated machine the ratio is the number of cores; on a shared
    virtual machine it is often less, and it bounds what any pool can reach here.
    """
    from concurrent.futures import ProcessPoolExecutor

    cores = os.cpu_count() or 1
    n = 3_000_000
    best_serial = best_pool = float("inf")
    with ProcessPoolExecutor(cores) as pool:
        list(pool.map(_burn, [1] * cores))  # workers started
        for _ in range(repeats):
            t = time.perf_counter()
            for _ in range(cores):
                _burn(n)
            best_serial = min(best_serial, time.perf_counter() - t)
            t = time.perf_counter()
            list(pool.map(_burn, [n] * cores))
            best_pool = min(best_pool, time.perf_counter() - t)
    return best_serial / best_pool


def profile_measure(folder: Path, count: int) -> None:
    import cProfile
    import contextlib
    import io
    import pstats

    from revolve.cli.commands.measure import run_measure

    def run():
        with contextlib.redirect_stdout(io.StringIO()):
            run_measure([str(folder)], None, None, None, None, True, False, None, None, None,
                        None, None, 1e-9, workers=1)

    run()  # warm: imports and caches
    prof = cProfile.Profile()
    prof.enable()
    run()
    prof.disable()
    stats = pstats.Stats(prof)
    total = stats.total_tt

    def cumulative(path_end: str, function: str) -> float:
        """The largest cumulative time of a function of that name in that file (the outermost)."""
        return max([v[3] for (f, _, name), v in stats.stats.items()
                    if f.replace("\\", "/").endswith(path_end) and name == function] or [0.0])

    phases = {
        "reading the file (formats: checks, TOML, line scan, segments)":
            cumulative("revolve/formats/__init__.py", "load_profile"),
        "engine (geometry.measure: prepare, integrals, cross-check)":
            cumulative("revolve/geometry/measure.py", "measure"),
        "the part's row (JSON object and line, in the worker)":
            cumulative("revolve/cli/commands/measure.py", "__call__"),
    }
    phases["the rest (batch layer, writing, listing the folder)"] = total - sum(phases.values())
    print(f"\nmeasure --json, serial, in this process under cProfile: {total / count * 1e3:.2f} "
          f"ms per part (profiling adds overhead)")
    for name, own in phases.items():
        print(f"  {name:64s} {own / count * 1e3:6.3f} ms/part  {100 * own / total:5.1f} %")
    print()
    stats.sort_stats("cumulative").print_stats(r"load_profile|parse_profile_text|find_oversize|"
                                                r"scan_lines|tomllib.*loads|\(document\)|"
                                                r"\(measure\)|\(prepare\)|\(section\)|"
                                                r"washer_volume|surface_by_quadrature")
    stats.sort_stats("tottime").print_stats(12)


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--parts", type=int, default=1000)
    ap.add_argument("--repeats", type=int, default=3)
    ap.add_argument("--before", default="", help="another checkout to time `turn` in")
    ap.add_argument("--profile", action="store_true")
    ap.add_argument("--keep", action="store_true", help="keep the folder of parts")
    a = ap.parse_args()

    folder = Path(tempfile.mkdtemp(prefix="revolve-batch-"))
    try:
        t0 = time.perf_counter()
        write_parts(folder, a.parts)
        print(f"{a.parts} invented parts written in {time.perf_counter() - t0:.1f} s to {folder}; "
              f"{os.cpu_count()} cores")
        env = dict(os.environ)
        runs = {
            "start-up": ["--version"],
            "measure, serial": ["measure", str(folder), "--json", "--workers", "1"],
            "measure, pool": ["measure", str(folder), "--json"],
            "turn, serial": ["turn", str(folder), "--workers", "1"],
            "turn, pool": ["turn", str(folder)],
        }
        if a.before:
            runs["turn, before"] = ["turn", str(folder)]
        best = {k: float("inf") for k in runs}
        ceiling = 0.0
        for _ in range(a.repeats):
            # Between the rounds: what the machine gives a pool just now (shared machines vary).
            ceiling = max(ceiling, machine_ratio(1))
            for name, args in runs.items():
                before = a.before if name.endswith("before") else ""
                best[name] = min(best[name], timed(args, env, before))
        start = best["start-up"]
        n = a.parts
        print(f"\n{'run':18s} {'seconds':>8s} {'ms/part':>8s} {'ms/part, start-up off':>22s}")
        for name, sec in best.items():
            per = "" if name == "start-up" else f"{sec / n * 1e3:8.2f}"
            off = "" if name == "start-up" else f"{(sec - start) / n * 1e3:22.2f}"
            print(f"{name:18s} {sec:8.2f} {per:>8s} {off:>22s}")
        print()
        for job in ("measure", "turn"):
            serial, pool = best[f"{job}, serial"], best[f"{job}, pool"]
            per = (pool - start) / n
            print(f"{job}: serial / pool = {(serial - start) / (pool - start):.2f}x "
                  f"(start-up off); pool {per * 1e3:.2f} ms per part; projected for 10^6 parts: "
                  f"{per * 1e6 / 60:.0f} min ({per * 1e6 / 3600:.2f} h); target < 3 ms per part: "
                  f"{'met' if per < 3e-3 else 'not met'}")
        print(f"this machine: pure-Python work on {os.cpu_count()} cores in a pool runs "
              f"{ceiling:.2f}x faster than serially (best of the rounds; the most a pool can give here)")
        if a.before:
            print(f"turn: before / pool = {(best['turn, before'] - start) / (best['turn, pool'] - start):.2f}x"
                  f", before / serial = {(best['turn, before'] - start) / (best['turn, serial'] - start):.2f}x")
        if a.profile:
            profile_measure(folder, n)
    finally:
        if not a.keep:
            shutil.rmtree(folder, ignore_errors=True)


if __name__ == "__main__":
    main()
