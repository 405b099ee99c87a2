"""Tests of revolve.formats.dxf: DXF drawings written with ezdxf in the test, read back.

References, named beside each check:

* reference library: ezdxf — it writes every drawing here, and its own
  geometry is the reference for what the entities mean: ``ezdxf.math.bulge_to_arc``
  for polyline bulges, ``ezdxf.math.BSpline.point`` (and ``BSpline`` with
  weights) for splines, ``Ellipse.construction_tool().vertices`` for ellipses,
  an arc's ``start_point``/``end_point`` for the extrusion's mirror;
* published: CRC Standard Mathematical Tables (from memory): hollow
  cylinder, torus 2 pi^2 R r^2, prolate spheroid 4/3 pi a b^2, ellipse
  quarter pi a b / 4;
* reference library: shapely (``Polygon.area``) of outlines sampled with
  ezdxf's own evaluation;
* the DXF reference's $INSUNITS codes (from memory): 1 inch, 4 millimetre;
* profiles built directly with revolve.geometry constructors: imported
  volumes must equal theirs.
"""

from __future__ import annotations

import math

import ezdxf
import numpy as np
import pytest
from ezdxf.math import BSpline, bulge_to_arc
from shapely.geometry import Polygon

from revolve.errors import FormatError, ProfileError, UnitError
from revolve.formats.dxf import bezier_pieces, read_dxf
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Loop, Profile, Revolution
from revolve.geometry.segments import Arc, Curve, Line, arc_from_centre


def new_drawing(insunits=4):
    doc = ezdxf.new("R2010", setup=True)
    doc.header["$INSUNITS"] = insunits
    return doc, doc.modelspace()


def save(doc, tmp_path, name="part.dxf"):
    path = str(tmp_path / name)
    doc.saveas(path)
    return path


def quick(profile, axis, angle=360.0):
    return measure(Revolution(profile, axis, angle), symbolic=False)


def sampled_area(segments, n=4000):
    pts = []
    for s in segments:
        if isinstance(s, Line):
            pts.append(s.start)
        elif isinstance(s, Arc):
            a0 = math.atan2(s.start[1] - s.centre[1], s.start[0] - s.centre[0])
            a = a0 + np.linspace(0, s.sweep(), n, endpoint=False)
            pts += list(zip(s.centre[0] + s.radius * np.cos(a),
                            s.centre[1] + s.radius * np.sin(a)))
        else:
            t = np.linspace(s.t_start, s.t_end, n, endpoint=False)
            x, y, _, _ = s.evaluate(t)
            pts += list(zip(x, y))
    return Polygon(pts).area


# -- lines, arcs, circles ----------------------------------------------------------------------

def test_lines_chain_into_a_loop_and_the_centre_line_is_the_axis(tmp_path):
    doc, msp = new_drawing()
    # drawn out of order and in mixed directions, on purpose
    msp.add_line((40, 20), (40, 10))
    msp.add_line((0, 10), (40, 10))
    msp.add_line((0, 20), (40, 20))
    msp.add_line((0, 10), (0, 20))
    msp.add_line((-5, 0), (45, 0), dxfattribs={"linetype": "CENTER"})
    profile_doc, report = read_dxf(save(doc, tmp_path))
    assert len(profile_doc.profile.loops) == 1 and not profile_doc.profile.chains
    assert profile_doc.axis.point == (-5.0, 0.0) and profile_doc.axis.direction == (50.0, 0.0)
    assert report.axis.startswith("from the centre line LINE #5")
    assert profile_doc.profile.unit == "mm" and report.unit_source.endswith("($INSUNITS = 4)")
    assert profile_doc.exact and not report.gaps_closed
    v = quick(profile_doc.profile, profile_doc.axis).volume
    direct = Profile(loops=(Loop.from_points([(0, 10), (40, 10), (40, 20), (0, 20)]),))
    assert v == pytest.approx(quick(direct, Axis.x()).volume, rel=1e-14)
    # published: CRC (from memory), hollow cylinder pi (R^2 - r^2) L
    assert v == pytest.approx(math.pi * (20 ** 2 - 10 ** 2) * 40, rel=1e-12)


def test_arc_is_exact_with_ezdxf_geometry(tmp_path):
    doc, msp = new_drawing()
    # a bush with a rounded end: quarter arc of radius 5 about (35, 15)
    msp.add_line((0, 10), (40, 10))
    msp.add_line((40, 10), (40, 15))
    arc = msp.add_arc((35, 15), 5, 0, 90)
    msp.add_line((35, 20), (0, 20))
    msp.add_line((0, 20), (0, 10))
    profile_doc, _ = read_dxf(save(doc, tmp_path))
    (got,) = [s for s in profile_doc.profile.loops[0].segments if isinstance(s, Arc)]
    # reference library: ezdxf, the entity's centre, radius and end points
    assert got.centre == pytest.approx(tuple(arc.dxf.center)[:2], abs=1e-12)
    assert got.radius == pytest.approx(arc.dxf.radius, rel=1e-15)
    assert {tuple(np.round(got.start, 9)), tuple(np.round(got.end, 9))} == \
        {tuple(np.round(tuple(arc.start_point)[:2], 9)), tuple(np.round(tuple(arc.end_point)[:2], 9))}
    direct = Loop((Line((0.0, 10.0), (40.0, 10.0)), Line((40.0, 10.0), (40.0, 15.0)),
                   arc_from_centre((40.0, 15.0), (35.0, 20.0), (35.0, 15.0), clockwise=False),
                   Line((35.0, 20.0), (0.0, 20.0)), Line((0.0, 20.0), (0.0, 10.0))))
    assert quick(profile_doc.profile, Axis.x()).volume == pytest.approx(
        quick(Profile(loops=(direct,)), Axis.x()).volume, rel=1e-13)


def test_arc_with_downward_extrusion_is_mirrored(tmp_path):
    doc, msp = new_drawing()
    # OCS with extrusion (0, 0, -1): x is mirrored; the arc turns clockwise in the plan
    arc = msp.add_arc((-35, 15), 5, 0, 90, dxfattribs={"extrusion": (0, 0, -1)})
    start, end = tuple(arc.start_point)[:2], tuple(arc.end_point)[:2]   # (35, 15), (35, 20)
    msp.add_line(end, (0, 20))
    msp.add_line((0, 20), (0, 10))
    msp.add_line((0, 10), (40, 10))
    msp.add_line((40, 10), (40, 15))
    msp.add_line((40, 15), start)
    profile_doc, _ = read_dxf(save(doc, tmp_path))
    (got,) = [s for s in profile_doc.profile.loops[0].segments if isinstance(s, Arc)]
    assert got.centre == pytest.approx((35.0, 15.0), abs=1e-12)
    # the arc runs from ezdxf's WCS start point to its end point, clockwise (or the reverse)
    if got.start == pytest.approx(start, abs=1e-12):
        assert got.clockwise and got.end == pytest.approx(end, abs=1e-12)
    else:
        assert not got.clockwise and got.start == pytest.approx(end, abs=1e-12)
    # mirrored in x: the quarter lies towards -x, +y of the centre (from (30, 15) to (35, 20))
    mid = got.point_at(0.5)
    assert mid[0] < 35 and mid[1] > 15
    assert start == pytest.approx((30.0, 15.0), abs=1e-12)


def test_circle_is_two_arcs_and_revolves_into_a_torus(tmp_path):
    doc, msp = new_drawing()
    msp.add_circle((0, 30), 5)
    profile_doc, report = read_dxf(save(doc, tmp_path))
    assert [s.kind for s in profile_doc.profile.loops[0].segments] == ["arc", "arc"]
    # published: CRC (from memory), torus V = 2 pi^2 R r^2
    m = quick(profile_doc.profile, Axis.x())
    assert m.volume == pytest.approx(2 * math.pi ** 2 * 30 * 25, rel=1e-12)
    assert report.notes and "no centre line" in report.notes[0]


# -- polylines with bulges --------------------------------------------------------------------

def test_lwpolyline_bulges_match_ezdxf_bulge_to_arc(tmp_path):
    doc, msp = new_drawing()
    points = [(0, 10, 0), (30, 10, 0.4), (40, 18, 0), (40, 25, -0.7), (20, 25, 0), (0, 25, 0)]
    msp.add_lwpolyline(points, format="xyb", close=True)
    profile_doc, _ = read_dxf(save(doc, tmp_path))
    arcs = [s for s in profile_doc.profile.loops[0].segments if isinstance(s, Arc)]
    assert len(arcs) == 2
    for (x0, y0, b), (x1, y1, _), got in [(points[1], points[2], arcs[0]),
                                          (points[3], points[4], arcs[1])]:
        # reference library: ezdxf.math.bulge_to_arc -> centre, start angle, end angle, radius
        centre, a0, a1, radius = bulge_to_arc((x0, y0), (x1, y1), b)
        assert got.centre == pytest.approx(tuple(centre)[:2], abs=1e-12)
        assert got.radius == pytest.approx(radius, rel=1e-12)
        assert got.clockwise == (b < 0)
        assert abs(got.sweep()) == pytest.approx(4 * math.atan(abs(b)), rel=1e-12)


def test_major_bulge_and_old_polyline(tmp_path):
    doc, msp = new_drawing()
    # a bulge above 1 sweeps more than half a turn: here 3/4 of a circle of radius 5
    b = math.tan(3 * math.pi / 2 / 4)
    p = msp.add_polyline2d([(30, 20), (35, 25), (0, 25), (0, 20)], close=True)
    vertices = list(p.vertices)
    vertices[0].dxf.bulge = b
    profile_doc, _ = read_dxf(save(doc, tmp_path))
    (arc,) = [s for s in profile_doc.profile.loops[0].segments if isinstance(s, Arc)]
    centre, a0, a1, radius = bulge_to_arc((30, 20), (35, 25), b)
    assert arc.centre == pytest.approx(tuple(centre)[:2], abs=1e-12)
    assert abs(arc.sweep()) == pytest.approx(3 * math.pi / 2, rel=1e-12)


# -- splines and ellipses ------------------------------------------------------------------

def test_bezier_pieces_reproduce_ezdxf_bspline():
    control = [(0, 0), (10, 25), (20, -5), (35, 30), (50, 10), (60, 20)]
    knots = [0, 0, 0, 0, 1, 3, 4, 4, 4, 4]   # clamped, non-uniform
    reference = BSpline(control, order=4, knots=knots)   # reference library: ezdxf
    for span, X, Y, W in bezier_pieces(control, knots, 3):
        t = np.linspace(0, 1, 9)
        u = span[0] + (span[1] - span[0]) * t
        want = np.array([tuple(reference.point(v))[:2] for v in u])
        got = np.column_stack([np.polynomial.polynomial.polyval(t, X),
                               np.polynomial.polynomial.polyval(t, Y)])
        assert np.allclose(got, want, atol=1e-11)
    weights = [1, 2, 0.5, 1, 3, 1]
    rational = BSpline(control, order=4, knots=knots, weights=weights)
    for span, X, Y, W in bezier_pieces(control, knots, 3, weights):
        t = np.linspace(0, 1, 9)
        u = span[0] + (span[1] - span[0]) * t
        want = np.array([tuple(rational.point(v))[:2] for v in u])
        w = np.polynomial.polynomial.polyval(t, W)
        got = np.column_stack([np.polynomial.polynomial.polyval(t, X) / w,
                               np.polynomial.polynomial.polyval(t, Y) / w])
        assert np.allclose(got, want, atol=1e-11)


@pytest.mark.parametrize("weights", [None, [1, 1.5, 0.7, 2, 1]])
def test_spline_outline_area_against_ezdxf_and_shapely(tmp_path, weights):
    doc, msp = new_drawing()
    control = [(0, 10), (10, 30), (25, 5), (40, 30), (50, 10)]
    if weights is None:
        spline = msp.add_open_spline(control, degree=3)
    else:
        spline = msp.add_rational_spline(control, weights, degree=3)
    msp.add_line((50, 10), (50, 2))
    msp.add_line((50, 2), (0, 2))
    msp.add_line((0, 2), (0, 10))
    profile_doc, report = read_dxf(save(doc, tmp_path))
    segments = profile_doc.profile.loops[0].segments
    curves = [s for s in segments if isinstance(s, Curve)]
    assert len(curves) == 2   # knots 0,0,0,0,1,2,2,2,2: two spans
    # reference library: ezdxf evaluates the same spline; shapely measures its outline
    tool = spline.construction_tool()
    u = np.linspace(0, tool.max_t, 20001)
    outline = [tuple(tool.point(v))[:2] for v in u] + [(50, 2), (0, 2)]
    want = Polygon(outline).area
    m = quick(profile_doc.profile, Axis.x())
    assert m.area == pytest.approx(want, rel=1e-7)
    assert sampled_area(segments) == pytest.approx(want, rel=1e-6)


def test_closed_periodic_spline_follows_ezdxf(tmp_path):
    doc, msp = new_drawing()
    spline = msp.add_spline(dxfattribs={})
    spline.set_closed([(0, 20, 0), (20, 20, 0), (20, 40, 0), (0, 40, 0)], degree=3)
    profile_doc, _ = read_dxf(save(doc, tmp_path))
    (loop,) = profile_doc.profile.loops
    assert all(isinstance(s, Curve) for s in loop.segments)
    tool = spline.construction_tool()
    knots = tool.knots()
    lo, hi = knots[3], knots[-4]   # the valid range of a degree-3 B-spline
    u = np.linspace(lo, hi, 4001)
    want = Polygon([tuple(tool.point(v))[:2] for v in u]).area   # reference library: ezdxf, shapely
    assert quick(profile_doc.profile, Axis.x()).area == pytest.approx(want, rel=1e-6)


def test_degree_one_spline_is_a_polyline_and_high_degree_is_refused(tmp_path):
    doc, msp = new_drawing()
    msp.add_open_spline([(0, 10), (20, 10), (20, 20)], degree=1)
    msp.add_line((20, 20), (0, 20))
    msp.add_line((0, 20), (0, 10))
    control = [(i, 30 + (i % 2)) for i in range(9)]
    msp.add_open_spline(control, degree=7)
    profile_doc, report = read_dxf(save(doc, tmp_path))
    assert [s.kind for s in profile_doc.profile.loops[0].segments] == ["line"] * 4
    assert any("degree 7 is outside 1 to 5" in s.reason for s in report.skipped)


def test_fit_point_spline_is_skipped_and_the_gap_names_it(tmp_path):
    doc, msp = new_drawing()
    msp.add_spline(fit_points=[(0, 10), (10, 15), (20, 10)])
    msp.add_line((20, 10), (20, 2))
    msp.add_line((20, 2), (0, 2))
    msp.add_line((0, 2), (0, 10))
    with pytest.raises(FormatError) as info:
        read_dxf(save(doc, tmp_path))
    text = str(info.value)
    assert "the drawing does not close" in text and "SPLINE #1" in text
    assert "fit points only" in text


def test_half_ellipse_revolves_into_a_spheroid(tmp_path):
    doc, msp = new_drawing()
    a, b = 30.0, 12.0
    msp.add_ellipse((0, 0), (a, 0, 0), b / a, 0, math.pi)
    msp.add_line((-a, 0), (a, 0))
    profile_doc, _ = read_dxf(save(doc, tmp_path))
    segs = profile_doc.profile.loops[0].segments
    assert [s.kind for s in segs].count("curve") == 1
    m = quick(profile_doc.profile, Axis.x())
    # published: CRC (from memory), prolate spheroid 4/3 pi a b^2, half ellipse pi a b / 2
    assert m.area == pytest.approx(math.pi * a * b / 2, rel=1e-12)
    assert m.volume == pytest.approx(4 / 3 * math.pi * a * b * b, rel=1e-10)


def test_rotated_ellipse_arc_follows_ezdxf(tmp_path):
    doc, msp = new_drawing()
    major = (20 * math.cos(0.4), 20 * math.sin(0.4), 0)
    ellipse = msp.add_ellipse((50, 40), major, 0.45, 0.3, 2.2)
    tool = ellipse.construction_tool()
    params = np.linspace(0.3, 2.2, 7)
    want = [tuple(v)[:2] for v in tool.vertices(params)]   # reference library: ezdxf
    msp.add_line(want[-1], (50, 40))
    msp.add_line((50, 40), want[0])
    profile_doc, _ = read_dxf(save(doc, tmp_path))
    (curve,) = [s for s in profile_doc.profile.loops[0].segments if isinstance(s, Curve)]
    x, y, _, _ = curve.evaluate(params if curve.t_start < curve.t_end else params[::-1])
    got = list(zip(x, y))
    if math.dist(got[0], want[0]) > 1e-6:
        got = got[::-1]
    assert np.allclose(got, want, atol=1e-10)


def test_circle_made_as_an_ellipse_of_ratio_one_is_arcs(tmp_path):
    doc, msp = new_drawing()
    msp.add_ellipse((0, 30), (5, 0, 0), 1.0)
    profile_doc, _ = read_dxf(save(doc, tmp_path))
    assert [s.kind for s in profile_doc.profile.loops[0].segments] == ["arc", "arc"]
    m = quick(profile_doc.profile, Axis.x())
    assert m.volume == pytest.approx(2 * math.pi ** 2 * 30 * 25, rel=1e-12)   # CRC, torus


# -- chaining, gaps, layers, units ------------------------------------------------------------

def rectangle_with_gap(msp, gap, last=None):
    msp.add_line((0, 10), (40, 10))
    msp.add_line((40, 10), (40, 20))
    msp.add_line((40, 20), (0, 20))
    msp.add_line((0, 20), last or (0, 10 + gap))


def test_small_gaps_are_closed_and_reported(tmp_path):
    doc, msp = new_drawing()
    rectangle_with_gap(msp, 1e-6)
    profile_doc, report = read_dxf(save(doc, tmp_path), tolerance=1e-5)
    (gap,) = report.gaps_closed
    assert gap.size == pytest.approx(1e-6, rel=1e-6) and "straight line" in gap.how
    assert "LINE #4" in " ".join(gap.between) and "LINE #1" in " ".join(gap.between)
    loop = profile_doc.profile.loops[0]
    for a, b in zip(loop.segments, loop.segments[1:] + loop.segments[:1]):
        assert a.end == b.start
    with pytest.raises(FormatError) as info:
        read_dxf(save(doc, tmp_path, "again.dxf"), tolerance=1e-7)
    text = str(info.value)
    assert "does not close" in text and "1e-06 away" in text and "gap tolerance 1e-07" in text


def test_gap_between_two_arcs_is_bridged(tmp_path):
    doc, msp = new_drawing()
    # a lens: two arcs meeting at 60 degrees, the lower one lowered by 2e-6 (lifted, they cross)
    msp.add_arc((0, 20), 10, 30, 150)
    msp.add_arc((0, 30 - 2e-6), 10, 210, 330)
    profile_doc, report = read_dxf(save(doc, tmp_path), tolerance=1e-5)
    assert len(report.gaps_closed) == 2
    for gap in report.gaps_closed:
        assert gap.how == "added a short straight line across it"
        assert gap.size == pytest.approx(2e-6, rel=1e-6)
    kinds = [s.kind for s in profile_doc.profile.loops[0].segments]
    assert sorted(kinds) == ["arc", "arc", "line", "line"]


def test_default_tolerance_scales_with_the_drawing(tmp_path):
    # A 41 mm part: the floor of 0.001 in = 0.0254 mm applies (1 in = 25.4 mm, exact by
    # definition; 0.001 in as the rounding of CAD exports: common practice, no source).
    doc, msp = new_drawing()
    rectangle_with_gap(msp, 0.02)
    profile_doc, report = read_dxf(save(doc, tmp_path))
    assert report.tolerance == pytest.approx(0.0254, rel=1e-12)
    assert len(report.gaps_closed) == 1
    # A 4 m part: 1e-4 of its size (the diagonal of its extent).
    doc, msp = new_drawing()
    for a, b in [((0, 1000), (4000, 1000)), ((4000, 1000), (4000, 2000)),
                 ((4000, 2000), (0, 2000)), ((0, 2000), (0, 1000.3))]:
        msp.add_line(a, b)
    profile_doc, report = read_dxf(save(doc, tmp_path, "big.dxf"))
    assert report.tolerance == pytest.approx(1e-4 * math.hypot(4000, 1000), rel=1e-12)
    assert len(profile_doc.profile.loops) == 1


def test_inch_drawing_with_a_half_thou_gap_closes(tmp_path):
    # The case of the issue: a 2 in bush drawn in inches ($INSUNITS 1, from memory) whose
    # export left a 0.0005 in gap; the gap is closed and the area is the rectangle's
    # (shapely Polygon.area as the reference).
    doc, msp = new_drawing(insunits=1)
    for a, b in [((0, 0.5), (2, 0.5)), ((2, 0.5), (2, 1)), ((2, 1), (0, 1)), ((0, 1), (0, 0.5005))]:
        msp.add_line(a, b)
    profile_doc, report = read_dxf(save(doc, tmp_path))
    assert report.tolerance == pytest.approx(0.001)
    assert len(report.gaps_closed) == 1
    reference = Polygon([(0, 0.5), (2, 0.5), (2, 1), (0, 1)])
    m = quick(profile_doc.profile, Axis((0.0, 0.0), (1.0, 0.0)))
    assert m.area == pytest.approx(reference.area, rel=1e-12)
    # Pappus-Guldinus (from memory): V = 2 pi ybar A, ybar from shapely's centroid
    assert m.volume == pytest.approx(2 * math.pi * reference.centroid.y * reference.area,
                                     rel=1e-12)


def test_gap_error_names_the_option(tmp_path):
    doc, msp = new_drawing(insunits=1)
    for a, b in [((0, 0.5), (2, 0.5)), ((2, 0.5), (2, 1)), ((2, 1), (0, 1)), ((0, 1), (0, 0.51))]:
        msp.add_line(a, b)
    with pytest.raises(FormatError) as info:
        read_dxf(save(doc, tmp_path))
    assert "--gap-tolerance" in str(info.value) and "\n" not in str(info.value)
    profile_doc, report = read_dxf(save(doc, tmp_path), tolerance=0.02)
    assert len(profile_doc.profile.loops) == 1


def test_open_chains_are_kept_only_when_allowed(tmp_path):
    doc, msp = new_drawing()
    # a tank wall: a surface only
    msp.add_line((0, 50), (100, 50))
    msp.add_arc((100, 40), 10, 0, 90)
    name = save(doc, tmp_path)
    with pytest.raises(FormatError) as info:
        read_dxf(name)
    assert "the other end of the same chain" in str(info.value)
    profile_doc, report = read_dxf(name, open_chains=True)
    assert len(profile_doc.profile.chains) == 1 and len(report.chains) == 1
    assert not profile_doc.profile.loops


def test_three_ends_meeting_are_refused(tmp_path):
    doc, msp = new_drawing()
    rectangle_with_gap(msp, 0)
    msp.add_line((40, 20), (60, 30))
    with pytest.raises(FormatError, match=r"at \(40, 20\) 3 ends meet .*cannot branch"):
        read_dxf(save(doc, tmp_path))


def test_self_intersection_after_chaining_names_the_entities(tmp_path):
    doc, msp = new_drawing()
    msp.add_line((0, 10), (20, 30))
    msp.add_line((20, 30), (20, 10))
    msp.add_line((20, 10), (0, 30))
    msp.add_line((0, 30), (0, 10))
    with pytest.raises(ProfileError) as info:
        read_dxf(save(doc, tmp_path))
    text = str(info.value)
    assert "after chaining, the profile intersects itself" in text
    assert "LINE #1" in text and "LINE #3" in text


def test_unknown_entities_are_skipped_with_reasons(tmp_path):
    doc, msp = new_drawing()
    rectangle_with_gap(msp, 0)
    msp.add_text("BUSH 40 x 20")
    msp.add_point((5, 5))
    block = doc.blocks.new("BOLT")
    block.add_circle((0, 0), 1)
    msp.add_blockref("BOLT", (60, 60))
    msp.add_line((0, 10), (40, 10))   # drawn twice
    profile_doc, report = read_dxf(save(doc, tmp_path))
    reasons = {s.what.split(" (")[0]: s.reason for s in report.skipped}
    assert reasons["TEXT #5"] == "text is not geometry"
    assert reasons["POINT #6"] == "a point is not a boundary"
    assert reasons["LINE #8"].startswith("it is an exact duplicate of LINE #1")
    # the block's circle is expanded at (60, 60): a loop apart from the part, left out
    assert len(profile_doc.profile.loops) == 1
    assert len(report.warnings) == 1 and "INSERT #7" in report.warnings[0]
    assert "--keep-strays" in report.warnings[0]


def test_layer_choice(tmp_path):
    doc, msp = new_drawing()
    doc.layers.add("PROFILE")
    doc.layers.add("BORDER")
    for a, b in [((0, 10), (40, 10)), ((40, 10), (40, 20)), ((40, 20), (0, 20)), ((0, 20), (0, 10))]:
        msp.add_line(a, b, dxfattribs={"layer": "PROFILE"})
    msp.add_line((-50, -50), (90, -50), dxfattribs={"layer": "BORDER"})
    name = save(doc, tmp_path)
    with pytest.raises(FormatError, match="does not close"):
        read_dxf(name)
    profile_doc, report = read_dxf(name, layer="profile")
    assert len(profile_doc.profile.loops) == 1
    assert any("not on the chosen layer" in s.reason for s in report.skipped)
    with pytest.raises(FormatError, match='no geometry on layer "HOLES"; layers with entities: '
                                          'BORDER, PROFILE'):
        read_dxf(name, layer="HOLES")


def test_axis_from_a_layer_name_and_disagreeing_centre_lines(tmp_path):
    doc, msp = new_drawing()
    doc.layers.add("Axis")
    rectangle_with_gap(msp, 0)
    msp.add_line((50, 0), (-10, 0), dxfattribs={"layer": "Axis"})
    profile_doc, report = read_dxf(save(doc, tmp_path))
    # drawn right to left; the direction is turned to +x and the point is its lowest end
    assert profile_doc.axis.direction == (60.0, 0.0) and profile_doc.axis.point == (-10.0, 0.0)
    msp.add_line((20, -5), (20, 40), dxfattribs={"linetype": "CENTER"})
    name = save(doc, tmp_path, "two.dxf")
    with pytest.raises(FormatError, match="centre lines do not lie on one line"):
        read_dxf(name)
    profile_doc, report = read_dxf(name, axis=Axis.x())
    assert profile_doc.axis == Axis.x() and report.axis.startswith("given")


def test_units_from_the_header(tmp_path):
    doc, msp = new_drawing(insunits=1)
    rectangle_with_gap(msp, 0)
    name = save(doc, tmp_path)
    profile_doc, report = read_dxf(name)
    assert profile_doc.profile.unit == "in" and report.unit_source == "from the drawing ($INSUNITS = 1)"
    read_dxf(name, unit="inch")
    with pytest.raises(UnitError, match=r"unit is in \(\$INSUNITS = 1\) but the unit given is mm"):
        read_dxf(name, unit="mm")
    doc, msp = new_drawing(insunits=0)
    rectangle_with_gap(msp, 0)
    name = save(doc, tmp_path, "plain.dxf")
    assert read_dxf(name)[0].profile.unit == "mm"
    assert read_dxf(name, unit="cm")[0].profile.unit == "cm"
    assert read_dxf(name)[1].unit_source.startswith("assumed")
    doc, msp = new_drawing(insunits=11)
    rectangle_with_gap(msp, 0)
    with pytest.raises(UnitError, match="ångströms"):
        read_dxf(save(doc, tmp_path, "tiny.dxf"))


# -- files that are not what they say -------------------------------------------------------

def test_not_a_dxf(tmp_path):
    junk = tmp_path / "junk.dxf"
    junk.write_text("this is a shopping list\nmilk\n", encoding="utf-8")
    with pytest.raises(FormatError, match=r"junk.dxf: this is not a DXF drawing that can be read"):
        read_dxf(str(junk))
    binary = tmp_path / "binary.dxf"
    binary.write_bytes(bytes(range(256)) * 4)
    with pytest.raises(FormatError, match="not a DXF drawing"):
        read_dxf(str(binary))
    with pytest.raises(FormatError, match="no such file"):
        read_dxf(str(tmp_path / "missing.dxf"))


def test_truncated_dxf(tmp_path):
    doc, msp = new_drawing()
    rectangle_with_gap(msp, 0)
    name = save(doc, tmp_path)
    text = open(name, encoding="utf-8").read()
    cut = tmp_path / "cut.dxf"
    cut.write_text(text[: len(text) // 2], encoding="utf-8")
    with pytest.raises(FormatError, match=r"cut.dxf: this is not a DXF drawing that can be read \("):
        read_dxf(str(cut))


def test_empty_drawing(tmp_path):
    doc, msp = new_drawing()
    msp.add_text("nothing here")
    with pytest.raises(FormatError, match=r"no lines, arcs, .* \(skipped: TEXT #1"):
        read_dxf(save(doc, tmp_path))


def _placed(polygon, insert, scale, rotation):
    """shapely: a block's outline placed as a DXF INSERT places it (scale, rotate, move)."""
    from shapely import affinity

    placed = affinity.scale(polygon, scale[0], scale[1], origin=(0, 0))
    placed = affinity.rotate(placed, rotation, origin=(0, 0))
    return affinity.translate(placed, insert[0], insert[1])


@pytest.mark.parametrize("insert, scale, rotation", [
    ((5, 10), (1, 1), 0), ((5, 10), (2, 1), 0), ((30, 40), (1.5, 1.5), 90),
    ((-20, 50), (1, 0.5), 30),
])
def test_block_reference_is_placed_like_shapely_places_it(tmp_path, insert, scale, rotation):
    # reference library: shapely affinity (scale, rotate, translate), Polygon.area/centroid
    outline = [(0, 0), (40, 0), (40, 10), (20, 25), (0, 10)]
    doc, msp = new_drawing()
    block = doc.blocks.new("SLEEVE")
    block.add_lwpolyline(outline, close=True)
    msp.add_blockref("SLEEVE", insert, dxfattribs={"xscale": scale[0], "yscale": scale[1],
                                                    "rotation": rotation})
    profile_doc, report = read_dxf(save(doc, tmp_path))
    reference = _placed(Polygon(outline), insert, scale, rotation)
    m = quick(profile_doc.profile, Axis((0.0, -1000.0), (1.0, 0.0)))
    assert m.area == pytest.approx(reference.area, rel=1e-12)
    assert m.centroid == pytest.approx((reference.centroid.x, reference.centroid.y), rel=1e-12)
    assert "in block 'SLEEVE' of INSERT #1" in report.loops[0].source


def test_nested_block_references_compose(tmp_path):
    # a circle (CRC, pi r^2, from memory) in an inner block, inside an outer block's ring
    doc, msp = new_drawing()
    inner = doc.blocks.new("BORE")
    inner.add_circle((0, 0), 4)
    outer = doc.blocks.new("BUSH")
    outer.add_lwpolyline([(-10, -10), (10, -10), (10, 10), (-10, 10)], close=True)
    outer.add_blockref("BORE", (2, 1), dxfattribs={"xscale": 0.5, "yscale": 0.5})
    msp.add_blockref("BUSH", (100, 50), dxfattribs={"xscale": 2, "yscale": 2, "rotation": 45})
    profile_doc, report = read_dxf(save(doc, tmp_path))
    assert len(profile_doc.profile.loops) == 2 and not report.warnings
    m = quick(profile_doc.profile, Axis((0.0, -1000.0), (1.0, 0.0)))
    assert m.area == pytest.approx(40 * 40 - math.pi * 4 ** 2, rel=1e-12)


def test_stray_circle_is_warned_and_left_out_unless_kept(tmp_path):
    # The case of the issue: a circle drawn away from the part was added to the volume.
    doc, msp = new_drawing()
    msp.add_lwpolyline([(0, 10), (40, 10), (40, 20), (0, 20)], close=True)
    msp.add_circle((20, 15), 3)       # a bore inside the outline: a hole, kept
    msp.add_circle((80, 15), 3)       # drawn apart from the part: a stray
    name = save(doc, tmp_path)
    profile_doc, report = read_dxf(name)
    axis = Axis((0.0, 0.0), (1.0, 0.0))
    ring = Polygon([(0, 10), (40, 10), (40, 20), (0, 20)])
    m = quick(profile_doc.profile, axis)
    assert m.area == pytest.approx(ring.area - math.pi * 9, rel=1e-12)   # shapely, CRC
    assert len(report.warnings) == 1 and "CIRCLE #3" in report.warnings[0]
    assert "lies outside it" in report.warnings[0] and "--keep-strays" in report.warnings[0]
    profile_doc, report = read_dxf(name, keep_strays=True)
    assert len(profile_doc.profile.loops) == 3 and "kept as asked" in report.warnings[0]


def test_island_inside_a_hole_is_a_stray(tmp_path):
    doc, msp = new_drawing()
    msp.add_lwpolyline([(0, 10), (40, 10), (40, 40), (0, 40)], close=True)
    msp.add_circle((20, 25), 10)
    msp.add_circle((20, 25), 3)       # inside the hole: material not joined to the part
    profile_doc, report = read_dxf(save(doc, tmp_path))
    assert len(profile_doc.profile.loops) == 2
    assert "inside one of its holes" in report.warnings[0]


def test_non_finite_and_huge_numbers_name_the_entity_and_the_range(tmp_path):
    doc, msp = new_drawing()
    msp.add_lwpolyline([(0, 10), (40, 10), (40, 20), (0, 20)], close=True)
    msp.add_line((0, 0), (1e300, 0))
    with pytest.raises(FormatError) as info:
        read_dxf(save(doc, tmp_path))
    text = str(info.value)
    assert "LINE #2" in text and "1e+300" in text and "1e+15" in text


# -- long polylines: one array, one segment -----------------------------------------------

def wavy_outline(n):
    """``n`` vertices of a closed wavy outline 1.7 to 4.3 from the x axis (the last not repeated)."""
    a = np.linspace(0.0, 2 * np.pi, n, endpoint=False)
    r = 1.0 + 0.3 * np.sin(7 * a)
    return np.column_stack([r * np.cos(a), 3.0 + r * np.sin(a)])


def test_a_hundred_thousand_vertex_lwpolyline_is_one_polyline_measured_like_shapely(tmp_path):
    # 10⁵ straight edges written by ezdxf; read back as ONE polyline segment (its vertices in
    # one array). Reference: the vertices as ezdxf holds them (LWPolyline.get_points),
    # shapely Polygon.area and .centroid, and Pappus V = 2π ȳ A (Stewart, from memory).
    from ezdxf.entities.lwpolyline import LWPolylinePoints

    doc, msp = new_drawing()
    big = msp.add_lwpolyline([(0, 0), (1, 0)], close=True)
    # ezdxf appends vertices one array copy at a time; its vertex array takes them all at
    # once (x, y, start width, end width, bulge per row)
    big.lwpoints = LWPolylinePoints(np.column_stack([wavy_outline(100_000),
                                                     np.zeros((100_000, 3))]).tolist())
    msp.add_line((-2, 0), (2, 0), dxfattribs={"linetype": "CENTER"})
    name = save(doc, tmp_path)
    profile_doc, report = read_dxf(name)
    (loop,) = profile_doc.profile.loops
    (seg,) = loop.segments
    assert seg.kind == "polyline" and len(seg.points) == 100_001
    assert seg.points[0].tolist() == seg.points[-1].tolist()
    assert str(seg.where).endswith("vertices 1 to 100000 and back to 1")
    assert report.loops[0].polylines == 1 and report.loops[0].lines == 0
    outline = np.array(list(big.get_points("xy")), dtype=float)   # ezdxf's own vertices
    assert np.array_equal(seg.points[:-1], outline)
    shape = Polygon(outline)
    pappus = 2 * math.pi * shape.centroid.y * shape.area
    m = measure(Revolution(profile_doc.profile, profile_doc.axis), crosscheck=False)
    assert m.area == pytest.approx(shape.area, rel=1e-12)
    assert m.centroid[1] == pytest.approx(shape.centroid.y, rel=1e-12)
    assert m.volume == pytest.approx(pappus, rel=1e-12)


def test_a_long_polyline_keeps_its_bulged_edge_as_an_arc(tmp_path):
    # 100 straight edges, one bulged edge (a half circle, bulge 1), 80 straight edges: a
    # polyline, the exact arc (ezdxf.math.bulge_to_arc), a polyline.
    doc, msp = new_drawing()
    low = [(x, 10.0, 0.0) for x in np.linspace(0, 40, 101)]
    low[-1] = (40.0, 10.0, 1.0)
    high = [(x, 20.0, 0.0) for x in np.linspace(40, 0, 81)]
    msp.add_lwpolyline(low + high, format="xyb", close=True)
    profile_doc, _ = read_dxf(save(doc, tmp_path))
    kinds = [s.kind for s in profile_doc.profile.loops[0].segments]
    assert kinds == ["polyline", "arc", "polyline"]      # the closing edge joins the last run
    arc = profile_doc.profile.loops[0].segments[1]
    centre, a0, a1, radius = bulge_to_arc((40, 10), (40, 20), 1.0)
    assert arc.centre == pytest.approx(tuple(centre)[:2], abs=1e-12)
    assert arc.radius == pytest.approx(radius, rel=1e-12)
    # Section: the 40 × 10 rectangle and a half disc of radius 5 (CRC, from memory).
    m = measure(Revolution(profile_doc.profile, Axis.x()), crosscheck=False)
    assert m.area == pytest.approx(400 + math.pi * 25 / 2, rel=1e-12)


def test_a_bad_vertex_of_a_long_polyline_is_named(tmp_path):
    doc, msp = new_drawing()
    pts = wavy_outline(500)
    pts[321] = (1e300, 3.0)
    msp.add_lwpolyline(pts.tolist(), close=True)
    with pytest.raises(FormatError) as info:
        read_dxf(save(doc, tmp_path))
    text = str(info.value)
    assert "\n" not in text and "LWPOLYLINE #1" in text
    assert "the x coordinate of vertex 322 is 1e+300" in text and "1e+15" in text
