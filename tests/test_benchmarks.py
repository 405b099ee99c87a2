"""Every script in benchmarks/ still runs: each in a child process with its smallest settings.

A smoke test only: it checks that the script exits with 0 and prints the labels of its
rows, so that a change of the library's API cannot leave a benchmark broken unnoticed.
It asserts nothing about time (speed is read from the benchmarks' printed ratios, never
asserted). A script added to benchmarks/ without a line in SMOKE fails the first test, so
no benchmark is left out silently.
"""

from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
BENCHMARKS = ROOT / "benchmarks"

#: script -> (its smallest settings, labels its output must contain)
SMOKE = {
    "batch_benchmark.py": (
        ["--parts", "6", "--repeats", "1"],
        ["start-up", "measure, serial", "measure, pool", "turn, serial", "turn, pool",
         "projected for 10^6 parts"]),
    "crosscheck_benchmark.py": (
        ["--sizes", "1000", "--repeats", "1"],
        ["washer_volume + surface_by_quadrature", " smooth      1000 ", "  noisy      1000 "]),
    "curve_benchmark.py": (
        ["--runs", "1"],
        ["vessel, two ellipsoidal heads", "measure, curve profile",
         "200 distinct curves built (library)", "vessel engine only, imports excluded"]),
    "engine_benchmark.py": (
        ["--quick"],
        ["1. section integrals", "2. torus", "exact arcs (2 segments)", "1000-vertex polygon",
         "3. start-up", "ratio measure / floor"]),
    "engine_targets.py": (
        ["--quick", "--repeats", "1"],
        ["1. measure 100,000-vertex point list", "2. measure 10,000-vertex point list",
         "3. library measure", "3b. library measure", "3c. library measure",
         "4. vessel, two ellipsoidal heads",
         "4. measure domed-lid.toml --json (a curve)", "5. vertical 1000-level table",
         "5. horizontal 1000-level table", "6. measure over a folder"]),
    "levels_benchmark.py": (
        ["--levels", "20", "--baseline-levels", "1"],
        ["vertical level tables", "horizontal level tables", "surveyed tank, 1001 lines",
         "surveyed tank, one 1003-point polyline", "corrugated tank, 998 arcs + 3 lines",
         "2:1 ellipsoidal tank, 4 segments (curves)"]),
    "pointlist_benchmark.py": (
        ["--sizes", "1000", "--repeats", "1"],
        ["four-line profile:", " smooth      1000 ", "  noisy      1000 ",
         "library: measure(Loop.from_points(array))"]),
    "startup_benchmark.py": (
        ["--quick"],
        ["bare start-up", "measure domed-lid.toml --json (a curve)",
         "vessel, two ellipsoidal heads", "vessel, torispherical heads, 10 mm wall",
         "vessel, ellipsoidal heads, 10 mm wall"]),
    "tilted_benchmark.py": (
        ["--quick"],
        ["vessel-brew-kettle.toml            vertical",
         "vessel-brew-kettle.toml            horizontal",
         "vessel-diesel-day-tank.toml        vertical",
         "vessel-diesel-day-tank.toml        horizontal",
         "vessel-rainwater-tank.toml         vertical",
         "vessel-rainwater-tank.toml         horizontal",
         "surveyed wall, 999 polyline edges  horizontal"]),
}


def test_every_benchmark_has_a_smoke_run():
    scripts = sorted(p.name for p in BENCHMARKS.glob("*.py"))
    assert scripts == sorted(SMOKE), "give each script in benchmarks/ its smallest settings in SMOKE"


@pytest.mark.parametrize("script", sorted(SMOKE))
def test_benchmark_runs(script, tmp_path):
    args, labels = SMOKE[script]
    env = dict(os.environ, PYTHONPATH=str(ROOT), TMPDIR=str(tmp_path))
    done = subprocess.run([sys.executable, str(BENCHMARKS / script)] + args, cwd=tmp_path,
                          env=env, capture_output=True, text=True, timeout=300)
    assert done.returncode == 0, f"{script} failed:\n{done.stdout[-2000:]}\n{done.stderr[-4000:]}"
    missing = [label for label in labels if label not in done.stdout]
    assert not missing, f"{script} printed no row {missing}:\n{done.stdout[-3000:]}"
