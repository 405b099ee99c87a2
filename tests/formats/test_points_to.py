"""The ``points_to`` form of the profile file: one polyline, read into one array.

References: the shoelace formula for a polygon's area and centroid (from
memory), and shapely's ``Polygon.area`` / ``Polygon.centroid`` as an
independent library; bad input follows the project's rule (one line naming
file and place, exit 2, nothing written).
"""

from __future__ import annotations

import io
import subprocess
import sys
import time
from pathlib import Path

import numpy as np
import pytest

from revolve.errors import FormatError
from revolve.formats.profile_file import parse_profile_text
from revolve.formats.writer import write_profile
from revolve.geometry.kinds.polyline import Polyline
from revolve.geometry.profile import Loop, Profile

ROOT = Path(__file__).resolve().parents[2]

TEXT = """units = "mm"
[[loop]]
start = [0, 1]
segments = [
  { face = "side", points_to = [
    [2, 1],
    [2, 3],
    [1, 3.5],
  ] },
  { close = true },
]
"""


def test_points_to_is_one_polyline_and_measures_as_shapely():
    shapely = pytest.importorskip("shapely")
    from revolve.geometry.measure import measure
    from revolve.geometry.profile import Axis, Revolution

    doc = parse_profile_text(TEXT, file="p.toml")
    segs = doc.profile.loops[0].segments
    assert isinstance(segs[0], Polyline) and len(segs) == 2
    assert segs[0].points.tolist() == [[0, 1], [2, 1], [2, 3], [1, 3.5]]
    assert segs[0].face == "side" and str(segs[0].where) == "p.toml:5: loop 1, segment 1"
    assert segs[0].where_at(2).line == 7
    polygon = shapely.Polygon([(0, 1), (2, 1), (2, 3), (1, 3.5)])
    m = measure(Revolution(doc.profile, Axis.x()))
    assert m.section.area == pytest.approx(polygon.area, rel=1e-12)   # shapely Polygon.area
    # Pappus: volume = 2π · area · distance of the centroid from the x axis (from memory)
    assert m.volume == pytest.approx(2 * np.pi * polygon.area * polygon.centroid.y, rel=1e-12)


def test_plain_and_commented_lists_read_the_same():
    commented = TEXT.replace("[2, 3],", "[2, 3],   # a comment keeps it off the fast path")
    a = parse_profile_text(TEXT).profile.loops[0].segments[0]
    b = parse_profile_text(commented).profile.loops[0].segments[0]
    assert np.array_equal(a.points, b.points)
    assert list(a.exact.points) == list(b.exact.points)


def test_exact_values_are_made_only_on_request():
    seg = parse_profile_text(TEXT.replace("3.5", "0.1")).profile.loops[0].segments[0]
    assert seg.exact.points._points is None             # plain path: no Fraction per vertex
    from fractions import Fraction
    assert seg.exact.points[3] == (Fraction(1), Fraction(1, 10))


@pytest.mark.parametrize("bad, line, what", [
    ("[1, true]", 7, "points_to y must be a number"),
    ('[1, "sqrt("]', 7, "expression ends too early"),
    ("[1, nan]", 7, "points_to y is not a finite number"),
    ("[1, 2, 3]", 7, "points_to must be a pair"),
    ("[1, 1e-400]", 7, "points_to y is too small"),
])
def test_bad_point_names_line_and_index(bad, line, what):
    text = TEXT.replace("[2, 3],", f"{bad},")
    with pytest.raises(Exception) as info:
        parse_profile_text(text, file="p.toml")
    message = str(info.value)
    assert message.startswith(f"p.toml:{line}: loop 1, segment 1, point 2: ")
    assert "\n" not in message and what in message


def test_empty_and_wrong_points_to():
    for bad in ("[]", "3", '"a"'):
        text = TEXT.replace("points_to = [\n    [2, 1],\n    [2, 3],\n    [1, 3.5],\n  ]",
                            f"points_to = {bad}")
        with pytest.raises(FormatError, match=r"p.toml:5: loop 1, segment 1: points_to must"):
            parse_profile_text(text, file="p.toml")


def test_bad_point_cli_exit_2_nothing_written(tmp_path):
    src = tmp_path / "p.toml"
    src.write_text(TEXT.replace("[2, 3],", "[2, 3],\n    [2, 1e999],"))
    out = tmp_path / "out.toml"
    run = subprocess.run([sys.executable, "-m", "revolve", "convert", str(src), "-o", str(out)],
                         capture_output=True, text=True, cwd=ROOT,
                         env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"})
    assert run.returncode == 2, run.stderr
    assert "Traceback" not in run.stderr and len(run.stderr.strip().splitlines()) == 1
    assert f"{src}:8: loop 1, segment 1, point 3: points_to y is too large" in run.stderr
    assert not out.exists()


def test_write_polyline_reads_back_float_for_float():
    rng = np.random.default_rng(7)
    n = 100_000
    angle = np.linspace(0.0, np.pi, n)
    radius = 50.0 + rng.random(n)
    pts = np.column_stack([radius * np.cos(angle), 1.0 + radius * np.sin(angle)])
    pts[-1] = pts[0] * [-1, 1]     # ends on the same height, so a line closes it
    loop = Loop((Polyline(pts, face="skin"), ))
    profile = Profile(loops=(Loop(loop.segments + (Polyline(np.array([pts[-1], pts[0]])),)),))
    began = time.perf_counter()
    out = io.StringIO()
    write_profile(profile, out)
    text = out.getvalue()
    back = parse_profile_text(text)
    elapsed = time.perf_counter() - began
    print(f"\n10^5-point polyline written and read back in {elapsed:.3f} s")
    seg = back.profile.loops[0].segments[0]
    assert isinstance(seg, Polyline) and seg.face == "skin"
    assert np.array_equal(seg.points, pts)            # float for float
    assert text.count("points_to") == 1


def test_exact_results_from_a_points_to_list(tmp_path):
    # Pappus (from memory): V = 2π · A · ȳ; shoelace on (0,1), (2,1), (2,3), (1,3.5):
    # A = 7/2, ȳ = 85/42, so V = 85π/6 exactly.
    src = tmp_path / "p.toml"
    src.write_text(TEXT)
    run = subprocess.run([sys.executable, "-m", "revolve", "measure", str(src), "--exact",
                          "--json"], capture_output=True, text=True, cwd=ROOT,
                         env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"})
    assert run.returncode == 0, run.stderr
    assert "85*pi/6" in run.stdout
