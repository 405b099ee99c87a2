"""The profile writer through the segment contract: every kind written and read back.

References: shapely (``Polygon.area``, ``Polygon.centroid``) measures the
written and re-read outline independently of the engine; the geometry must
come back float for float (the writer's promise: Python's shortest
round-tripping ``repr``, common practice, no source).
"""

from __future__ import annotations

from fractions import Fraction

import numpy as np
import pytest
from shapely.geometry import Polygon

from revolve.errors import ProfileError
from revolve.formats import parse_profile_text
from revolve.formats.writer import profile_text
from revolve.geometry.kinds.polyline import PolylineExact
from revolve.geometry.profile import Axis, Chain, Loop, Profile
from revolve.geometry.segments import Line, Polyline, arc_from_centre


def wavy(n=1000):
    """A closed wavy outline 1.7 to 4.3 from the x axis, irrational coordinates."""
    a = np.linspace(0.0, 2 * np.pi, n + 1)
    r = 1.0 + 0.3 * np.sin(5 * a)
    pts = np.column_stack([r * np.cos(a), 3.0 + r * np.sin(a)])
    pts[-1] = pts[0]
    return pts


def vertices(path):
    """The vertices of a re-read path of lines: every start, then the last end."""
    return np.array([s.start for s in path.segments] + [path.segments[-1].end])


def test_a_polyline_loop_is_written_and_read_back_float_for_float():
    pts = wavy()
    profile = Profile(loops=(Loop((Polyline(pts, face="scan"),)),), unit="mm")
    text = profile_text(profile, axis=Axis.x())
    assert text.count("points_to") == 1 and "line_to" not in text
    back = parse_profile_text(text).profile
    loop = back.loops[0]
    assert len(loop.segments) == 1 and loop.segments[0].kind == "polyline"  # one polyline
    assert np.array_equal(loop.segments[0].points, pts)        # float for float
    assert {s.face for s in loop.segments} == {"scan"}
    # shapely on the re-read outline agrees with shapely on the original vertices
    assert Polygon(loop.segments[0].points).area == Polygon(pts).area
    assert Polygon(loop.segments[0].points).centroid.equals(Polygon(pts).centroid)


def test_a_polyline_among_lines_and_arcs_in_a_chain_and_a_loop():
    # A chain: line, polyline, arc; a loop: polyline closed by a line. Each read back
    # at the same places, the arc about the same centre.
    zig = Polyline(np.array([[1.0, 5.0], [1.5, 6.0], [2.0, 5.0], [2.5, 6.0]]), face="zig")
    chain = Chain((Line((0.0, 5.0), (1.0, 5.0)), zig,
                   arc_from_centre((2.5, 6.0), (3.5, 6.0), (3.0, 6.0), clockwise=True)))
    box = Polyline(np.array([[0.0, 1.0], [4.0, 1.0], [4.0, 3.0], [0.0, 3.0]]))
    loop = Loop((box, Line((0.0, 3.0), (0.0, 1.0), face="end")))
    back = parse_profile_text(profile_text(Profile(loops=(loop,), chains=(chain,)))).profile
    c = back.chains[0].segments
    assert [s.kind for s in c] == ["line", "polyline", "arc"]
    assert np.array_equal(c[1].points, zig.points)
    assert c[1].face == "zig"
    assert c[2].centre == (3.0, 6.0) and c[2].clockwise
    lp = back.loops[0].segments
    assert np.array_equal(lp[0].points, box.points) and lp[-1].kind == "line"
    assert lp[-1].face == "end"


def test_exact_polyline_vertices_are_written_exactly():
    # Vertices known as fractions (1/3 is no float) are written as fractions and come
    # back exact; the floats still agree with the fractions.
    ex = ((Fraction(0), Fraction(1)), (Fraction(1, 3), Fraction(1)), (Fraction(1, 3), Fraction(2)))
    pts = np.array([[float(x), float(y)] for x, y in ex])
    chain = Chain((Polyline(pts, exact=PolylineExact(ex)),))
    text = profile_text(Profile(chains=(chain,)))
    assert "1/3" in text
    back = parse_profile_text(text).profile.chains[0]
    assert np.array_equal(back.segments[0].points, pts)
    assert [str(v) for v in back.segments[0].exact.points[2]] == ["1/3", "2"]   # as written


def test_a_gap_after_a_polyline_is_refused_naming_the_segment():
    pl = Polyline(np.array([[0.0, 1.0], [1.0, 1.0], [1.0, 2.0]]))
    chain = Chain((pl, Line((1.5, 2.0), (2.0, 2.0))))
    with pytest.raises(ProfileError, match=r"^chain 1, segment 2: segment 2 starts at \(1.5, 2.0\)"):
        profile_text(Profile(chains=(chain,)))
