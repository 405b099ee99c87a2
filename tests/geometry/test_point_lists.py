"""Point lists and long outlines at any size: one polyline array from the file to the section.

References (named beside each check):

* the regular polygon, from memory: an N-gon of circumradius ρ has area
  A = (N/2) ρ² sin(2π/N) and perimeter P = 2Nρ sin(π/N), and by its symmetry its
  centroid and the centroid of its boundary are its centre;
* Pappus–Guldinus (Stewart, *Calculus*, "Moments and centers of mass", from memory):
  V = 2π ȳ A and S = 2π ȳ_L P about the x axis;
* shapely (reference library): ``Polygon.area``, ``Polygon.centroid``, ``Polygon.length``;
* for the reader: Python's own ``float`` of each literal, and the careful line-by-line
  pass of the same reader (the vectorised pass must give what it gives, or defer to it).

Nothing here is timed.
"""

from __future__ import annotations

import json
import math

import numpy as np
import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st
from shapely.geometry import Polygon

from revolve.cli.app import main
from revolve.errors import FormatError, ProfileError
from revolve.formats import load_profile
from revolve.formats.points import _careful_points, _fast_points, parse_points_text
from revolve.geometry.checks import prepare
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Chain, Loop, Profile, Revolution
from revolve.geometry.segments import Line


def regular_polygon(n, rho=20.0, centre=(0.0, 50.0), turn=0.3):
    a = turn + 2 * np.pi * np.arange(n) / n
    return np.column_stack([centre[0] + rho * np.cos(a), centre[1] + rho * np.sin(a)])


def polygon_closed_forms(n, rho=20.0, height=50.0):
    """Area, perimeter, Pappus volume and surface of the regular n-gon about the x axis."""
    area = n / 2 * rho ** 2 * math.sin(2 * math.pi / n)
    perimeter = 2 * n * rho * math.sin(math.pi / n)
    return area, perimeter, 2 * math.pi * height * area, 2 * math.pi * height * perimeter


def run(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main(list(args))
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def write_points(path, pts, header="x,y\n"):
    with open(path, "w", encoding="utf-8") as f:
        f.write(header)
        np.savetxt(f, pts, delimiter=",", fmt="%.17g")
    return str(path)


# -- measured through the command line and the library --------------------------------------

def test_regular_polygon_point_list_through_the_command_line(tmp_path, capsys):
    n = 100_000
    path = write_points(tmp_path / "ring.csv", regular_polygon(n))
    code, out, err = run(["measure", path, "--json"], capsys)
    assert code == 0, err
    got = json.loads(out)
    area, perimeter, volume, surface = polygon_closed_forms(n)
    assert got["area"] == pytest.approx(area, rel=1e-11)                  # regular polygon
    assert got["perimeter"] == pytest.approx(perimeter, rel=1e-11)
    assert got["centroid"] == pytest.approx([0.0, 50.0], abs=1e-9)         # its symmetry
    assert got["volume"] == pytest.approx(volume, rel=1e-11)               # Pappus
    assert got["surface_area"] == pytest.approx(surface, rel=1e-11)
    poly = Polygon(regular_polygon(n))                                     # shapely
    assert got["area"] == pytest.approx(poly.area, rel=1e-12)
    assert got["centroid"][1] == pytest.approx(poly.centroid.y, rel=1e-12)
    assert got["crosscheck"]["agrees"] is True


def test_regular_polygon_of_a_million_vertices_from_arrays():
    n = 1_000_000
    pts = regular_polygon(n)
    m = measure(Revolution(Profile(loops=(Loop.from_points(pts),)), Axis.x()), crosscheck=False)
    area, perimeter, volume, surface = polygon_closed_forms(n)
    assert m.area == pytest.approx(area, rel=1e-11)
    assert m.perimeter == pytest.approx(perimeter, rel=1e-11)
    assert m.volume == pytest.approx(volume, rel=1e-11)
    assert m.surface_total == pytest.approx(surface, rel=1e-11)
    poly = Polygon(pts)                                                    # shapely
    assert m.area == pytest.approx(poly.area, rel=1e-12)
    assert m.centroid[0] == pytest.approx(poly.centroid.x, abs=1e-9)
    assert m.centroid[1] == pytest.approx(poly.centroid.y, rel=1e-12)
    assert m.perimeter == pytest.approx(poly.length, rel=1e-12)
    # the measurement carries the prepared profile: one polyline, whole
    assert m.prepared is not None and [s.kind for s in m.prepared.paths[0]] == ["polyline"]


def test_point_list_read_from_a_file_has_no_object_per_vertex(tmp_path):
    n = 20_000
    pts = regular_polygon(n)
    doc = load_profile(write_points(tmp_path / "ring.xy", pts, header="# a scanned ring\n"))
    poly, = doc.profile.loops[0].segments
    assert poly.kind == "polyline" and poly.points.shape == (n + 1, 2)
    # every vertex exactly as Python's float reads its literal (savetxt wrote 17 digits)
    assert np.array_equal(poly.points[:-1], np.array([[float(repr(x)), float(repr(y))]
                                                      for x, y in pts.tolist()]))
    assert poly.lines[:3].tolist() == [2, 3, 4] and poly.lines[-1] == 2
    assert doc.line_of(f"loop 1, segment {n}") == n + 1
    assert poly.exact is None


# -- bad input through the fast reader ------------------------------------------------------

@pytest.mark.parametrize("bad, message", [
    ("12.5,1x", 'expected two numbers "x,y", got "12.5,1x"'),
    ("12.5,,3", 'expected two numbers "x,y", got "12.5,,3"'),
    ("12.5,3,4", 'expected two numbers "x,y", got "12.5,3,4"'),
    ("12.5,1e400", "y is too large"),
    ("12.5,inf", '"inf" is not a finite number'),
    ("1-2,3", 'expected two numbers "x,y", got "1-2,3"'),
])
def test_bad_number_in_the_middle_of_a_long_list_names_its_line(tmp_path, capsys, bad, message):
    n = 50_000
    lines = [f"{x!r},{y!r}" for x, y in regular_polygon(n).tolist()]
    lines[31_415] = bad                                   # file line 31 416 (no header)
    path = tmp_path / "scan.csv"
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")
    out_csv = tmp_path / "figures.csv"
    code, out, err = run(["measure", str(path), "--csv", str(out_csv)], capsys)
    assert code == 2
    assert len(err.strip().splitlines()) == 1                 # one line
    assert err.startswith(f"revolve: error: {path}:31416: ") and message in err
    assert not out_csv.exists()                           # nothing written
    assert not out


def test_repeated_point_in_a_long_list_is_named(tmp_path):
    lines = [f"{x!r},{y!r}" for x, y in regular_polygon(30_000).tolist()]
    lines.insert(20_000, lines[19_999])
    with pytest.raises(FormatError, match=r"scan\.csv:20001: point \(.*\) repeats the previous one"):
        parse_points_text("\n".join(lines), file="scan.csv")


def test_axis_crossing_in_a_point_list_names_the_edge_and_its_line():
    # a comment and a header shift the lines: vertex k is on line k + 3
    pts = regular_polygon(1000, rho=20.0, centre=(0.0, 10.0))         # dips to y = -10
    text = "# scan\nx,y\n" + "\n".join(f"{x!r},{y!r}" for x, y in pts.tolist()) + "\n"
    doc = parse_points_text(text, file="dip.csv")
    with pytest.raises(ProfileError) as info:
        prepare(doc.profile, Axis.x())
    message = str(info.value)
    # the first vertex below the axis (y < 0), as a loop of Line segments would be named
    first = int(np.argmax(pts[:, 1] < -1e-9 * 60))
    edge = max(first - 1, 0)
    assert message.startswith(f"dip.csv:{edge + 3}: loop 1, segment {edge + 1}: the profile "
                              "crosses the axis here")


def test_zero_length_edge_of_a_polyline_is_named():
    pts = [(0, 1), (2, 1), (2, 1 + 1e-13), (2, 3), (0, 3)]
    with pytest.raises(ProfileError, match="loop 1, segment 2: this segment has zero length"):
        prepare(Profile(loops=(Loop.from_points(pts),)), Axis.x())


def test_exact_point_list_keeps_its_closed_forms(tmp_path, capsys):
    path = tmp_path / "ring.txt"
    path.write_text("0,10\n20,10\n20,15\n0,15\n", encoding="utf-8")
    code, out, err = run(["measure", str(path), "--json", "--exact"], capsys)
    assert code == 0, err
    got = json.loads(out)
    # a hollow cylinder 20 long, radii 10 and 15: π (15² − 10²) 20 = 2500π (from memory)
    assert got["exact"]["volume"] == "2500*pi"
    assert got["volume"] == pytest.approx(2500 * math.pi, rel=1e-14)


# -- the vectorised pass against the careful pass --------------------------------------------

_FIELD = st.one_of(st.floats(allow_nan=False, allow_infinity=False, width=64).map(repr),
                   st.integers(-10 ** 20, 10 ** 20).map(str),
                   st.sampled_from(["1.", ".5", "+3", "-0", "0e5", "1E-3", "1e-400", "1e309", "1-2",
                                    "1e", "e1", ".", "+", "1..2", "nan", "x", "", "2.5e+10"]))
_SEP = st.sampled_from([",", ";", " ", "\t", " , ", ",,", ", ;", ""])


@st.composite
def _texts(draw):
    rows = []
    if draw(st.booleans()):
        rows.append(draw(st.sampled_from(["x,y", "X;Y # header", "# only a comment", ""])))
    for _ in range(draw(st.integers(0, 8))):
        fields = draw(st.lists(_FIELD, min_size=1, max_size=3))
        row = draw(_SEP).join(fields)
        if draw(st.integers(0, 5)) == 0:
            row += draw(st.sampled_from([" # note", "#", "\t", " ", ","]))
        rows.append(row)
    return draw(st.sampled_from(["\n", "\r\n"])).join(rows) + draw(st.sampled_from(["", "\n"]))


@settings(max_examples=300, deadline=None)
@given(_texts())
@example("0,0\n1,0\n0,1\n0,0\n")
@example("x,y\r\n0;0 # a\r\n\r\n1\t0\r\n0 , 1\r\n")
@example("0,0\n1,0\n0,1\n0.0,0\n")              # last point equal to the first, written otherwise
@example("0,0\n1,1e-400\n0,1\n")
@example("")
def test_fast_pass_gives_what_the_careful_pass_gives(text):
    fast = _fast_points(text)
    try:
        careful = _careful_points(text, "t.txt")
    except FormatError:
        careful = None
    if fast is None:
        return                        # the careful pass decides (and names the bad line)
    assert careful is not None, text
    points, lines = careful
    assert fast[0].tolist() == [[float(x), float(y)] for x, y in points]
    assert fast[1].tolist() == lines


# -- polylines and lines measure alike -------------------------------------------------------

@st.composite
def _star_polygons(draw):
    """A star-shaped (hence simple) polygon about (0, 30), 3…40 vertices, off the axis."""
    n = draw(st.integers(3, 40))
    angles = sorted(set(draw(st.lists(st.floats(0, 2 * math.pi, exclude_max=True), min_size=n,
                                      max_size=n))))
    gaps = np.diff(angles + [angles[0] + 2 * math.pi]) if len(angles) >= 3 else [0.0]
    if min(gaps) < 1e-3 or max(gaps) >= math.pi * 0.99:      # not star-shaped about the centre
        angles = list(np.linspace(0, 2 * math.pi, n, endpoint=False))
    radii = draw(st.lists(st.floats(1.0, 20.0), min_size=len(angles), max_size=len(angles)))
    return [(r * math.cos(a), 30 + r * math.sin(a)) for a, r in zip(angles, radii)]


def _lines(pts, closed=True):
    pairs = list(zip(pts, pts[1:] + pts[:1])) if closed else list(zip(pts[:-1], pts[1:]))
    return tuple(Line(p, q) for p, q in pairs)


@settings(max_examples=60, deadline=None)
@given(_star_polygons(), st.sampled_from([Axis.x(), Axis((0.0, -5.0), (1.0, 0.2))]),
       st.sampled_from([360.0, 90.0]))
@example([(0.0, 29.0), (2.0, 31.0), (-1.0, 32.0)], Axis.x(), 360.0)
# Found while searching (the generator then made polygons that were not star-shaped): a
# crossing polygon; both forms must refuse it, naming the same segments.
@example([(1.0, 30.0), (0.5403023058681398, 30.841470984807895),
          (-0.4161468365471424, 30.90929742682568), (1.920340573300732, 29.44116900360215)],
         Axis.x(), 360.0)
def test_polyline_and_line_segments_measure_alike(pts, axis, angle):
    polyline = Revolution(Profile(loops=(Loop.from_points(pts),)), axis, angle)
    lines = Revolution(Profile(loops=(Loop(_lines(pts)),)), axis, angle)
    if not Polygon(pts).is_valid:                   # shapely: the polygon crosses itself
        with pytest.raises(ProfileError) as one:
            measure(polyline)
        with pytest.raises(ProfileError) as other:
            measure(lines)
        assert str(one.value) == str(other.value) and "intersects itself" in str(one.value)
        return
    as_polyline = measure(polyline)
    as_lines = measure(lines)
    for name in ("area", "perimeter", "volume", "surface_total", "boundary_length",
                 "centroid_distance"):
        a, b = getattr(as_polyline, name), getattr(as_lines, name)
        assert a == pytest.approx(b, rel=1e-12, abs=1e-12 * max(1.0, abs(b))), name
    for a, b in zip(as_polyline.centroid, as_lines.centroid):
        assert a == pytest.approx(b, rel=1e-12, abs=1e-11)
    # and both against shapely's area of the same vertices
    assert as_polyline.area == pytest.approx(Polygon(pts).area, rel=1e-12)


@settings(max_examples=30, deadline=None)
@given(_star_polygons())
def test_open_chain_polyline_and_lines_sweep_the_same_surface(pts):
    chain = measure(Revolution(Profile(chains=(Chain.from_points(pts),)), Axis.x()))
    lines = measure(Revolution(Profile(chains=(Chain(_lines(pts, closed=False)),)), Axis.x()))
    assert chain.surface_total == pytest.approx(lines.surface_total, rel=1e-12)
    assert chain.boundary_length == pytest.approx(lines.boundary_length, rel=1e-12)


@pytest.mark.parametrize("block", [1, 7, 64])
def test_reading_in_blocks_gives_the_same_points(monkeypatch, block):
    # the vectorised pass reads whole lines a block at a time; any block size gives the careful
    # pass's points and lines (comments, blank lines, a header and Windows line ends included)
    import revolve.formats.points as points

    rows = ["# scan of a ring", "x;y"] + [f"{x!r},{y!r}" + (" # mark" if k % 7 == 0 else "")
                                         for k, (x, y) in enumerate(regular_polygon(200).tolist())]
    rows[50:50] = ["", "   ", "# a note"]
    text = "\r\n".join(rows + [rows[2]]) + "\r\n"       # last point repeats the first
    monkeypatch.setattr(points, "_BLOCK_BYTES", block)
    pts, lines = _fast_points(text)
    careful, careful_lines = _careful_points(text, "t.csv")
    assert pts.tolist() == [[float(x), float(y)] for x, y in careful]
    assert lines.tolist() == careful_lines and len(careful) == 200
