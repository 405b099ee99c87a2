"""The segment-kind contract, checked kind by kind against outside references.

References: shapely (``LineString.length``, ``Polygon.area``/``centroid``) for
polylines; a dense sampling of the kind's own parametric formula is *not* used
as a reference for its integrals, only for bounds and turning points, where the
closed form (x = cx + R cos a turns at a = kπ, from memory) is checked against
numpy sampling of ``cos``/``sin`` directly.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import shapely
import sympy
from hypothesis import example, given, strategies as st

from revolve.geometry.integrals import COL, segment_integrals
from revolve.geometry.segments import (KINDS, Arc, ArcByCentre, ArcByRadius, Curve, Line, Polyline,
                                       arc_from_centre, arc_from_radius, curve_from_expressions)

T = sympy.Symbol("t", real=True)


def samples():
    return [
        Line((0.0, 1.0), (3.0, 2.5), face="a"),
        arc_from_centre((3.0, 1.0), (-1.0, 1.0), (1.0, 1.0), clockwise=False),
        arc_from_radius((0.0, 2.0), (2.0, 2.0), radius=1.5, side="right", major=True),
        curve_from_expressions(T, 2 + sympy.sin(T), 0, 6),
        Polyline(np.array([[0.0, 1.0], [1.0, 3.0], [2.0, 2.0], [2.5, 4.0], [1.0, 5.0]])),
    ]


def dense(seg, n=200_001):
    p0, p1 = seg.parameter_range()
    return seg.points_at(np.linspace(p0, p1, n))


def test_every_kind_is_listed_and_keeps_the_contract():
    assert {k.kind for k in KINDS} == {"line", "arc", "curve", "polyline"}
    for seg in samples():
        for name in ("parameter_range", "points_at", "tangents_at", "turning_parameters",
                     "split_at", "transformed", "reversed", "flatten", "integral_rows"):
            assert getattr(type(seg), name) is not getattr(KINDS[0].__mro__[-2], name, None)


@pytest.mark.parametrize("seg", samples(), ids=lambda s: s.kind)
def test_bounds_enclose_dense_samples_and_are_reached(seg):
    # Reference: numpy sampling of the segment's own points at 2·10⁵ parameters.
    pts = dense(seg)
    x0, y0, x1, y1 = seg.bounds()
    lo, hi = pts.min(axis=0), pts.max(axis=0)
    scale = float(np.abs(pts).max())
    assert x0 <= lo[0] + 1e-12 * scale and y0 <= lo[1] + 1e-12 * scale
    assert x1 >= hi[0] - 1e-12 * scale and y1 >= hi[1] - 1e-12 * scale
    assert np.allclose([x0, y0, x1, y1], [lo[0], lo[1], hi[0], hi[1]], atol=1e-9 * scale)


@pytest.mark.parametrize("seg", samples(), ids=lambda s: s.kind)
@pytest.mark.parametrize("coordinate", [0, 1])
def test_monotone_ranges_really_are_monotone(seg, coordinate):
    for a, b in seg.monotone_ranges(coordinate):
        v = seg.points_at(np.linspace(a, b, 2001))[:, coordinate]
        d = np.diff(v)
        tol = 1e-12 * max(1.0, float(np.abs(v).max()))
        assert (d >= -tol).all() or (d <= tol).all()


@pytest.mark.parametrize("seg", samples(), ids=lambda s: s.kind)
@pytest.mark.parametrize("coordinate", [0, 1])
def test_parameters_at_hit_the_value(seg, coordinate):
    x0, y0, x1, y1 = seg.bounds()
    lo, hi = (x0, x1) if coordinate == 0 else (y0, y1)
    for f in (0.13, 0.49, 0.77):   # no value equal to a turning vertex (a touch)
        value = lo + f * (hi - lo)
        params = seg.parameters_at(coordinate, value)
        assert params, (seg.kind, value)
        got = seg.points_at(params)[:, coordinate]
        assert np.allclose(got, value, rtol=0, atol=1e-12 * max(1.0, abs(value)))
        # As many as the dense samples cross the value (reference: sign changes in numpy).
        v = dense(seg, 20_001)[:, coordinate] - value
        s = v > 0
        crossings = int(np.count_nonzero(s[1:] != s[:-1]))
        assert len(params) == crossings


@pytest.mark.parametrize("seg", samples(), ids=lambda s: s.kind)
def test_split_pieces_join_and_keep_the_length(seg):
    p0, p1 = seg.parameter_range()
    cuts = [p0 + 0.3 * (p1 - p0), p0 + 0.55 * (p1 - p0)]
    pieces = seg.split_at(cuts)
    assert len(pieces) == 3
    assert pieces[0].start == seg.start and pieces[-1].end == seg.end
    for a, b in zip(pieces[:-1], pieces[1:]):
        assert a.end == b.start
    assert math.isclose(sum(p.length() for p in pieces), seg.length(), rel_tol=1e-12)


@pytest.mark.parametrize("seg", samples(), ids=lambda s: s.kind)
def test_mirror_keeps_length_and_negates_signed_area(seg):
    mirrored = seg.transformed((1.0, 0.0, 0.0, -1.0), (0.0, 10.0))
    a = segment_integrals([seg]).values[0]
    b = segment_integrals([mirrored]).values[0]
    assert math.isclose(a[COL["length"]], b[COL["length"]], rel_tol=1e-12)
    # Green's sector area ½∮(x dy − y dx) about the origin flips sign under y -> 10 − y,
    # minus 10 × ½(x_end − x_start) from the offset: common practice, no source.
    dx = seg.end[0] - seg.start[0]
    assert math.isclose(b[COL["M00"]], -a[COL["M00"]] - 5.0 * dx, rel_tol=1e-12, abs_tol=1e-12)


@pytest.mark.parametrize("seg", samples(), ids=lambda s: s.kind)
def test_reversed_is_the_same_path_backwards(seg):
    r = seg.reversed()
    assert r.start == seg.end and r.end == seg.start
    assert math.isclose(r.length(), seg.length(), rel_tol=1e-12)
    a = segment_integrals([seg]).values[0]
    b = segment_integrals([r]).values[0]
    assert math.isclose(b[COL["M00"]], -a[COL["M00"]], rel_tol=1e-12, abs_tol=1e-13)


def test_arc_reversal_keeps_exact_inputs_turned_round():
    a = arc_from_radius((0.0, 0.0), (2.0, 0.0), radius=1.0, side="left",
                        exact=("radius", (0, 0), (2, 0), 1, "left", False))
    assert isinstance(a.exact, ArcByRadius)
    r = a.reversed()
    assert r.exact == ArcByRadius("radius", (2, 0), (0, 0), 1, "right", False)
    # Rebuilt from its exact inputs, the reversed arc is the same arc backwards.
    again = arc_from_radius(r.exact.start, r.exact.end, radius=r.exact.radius, side=r.exact.side)
    assert np.allclose(again.centre, a.centre) and again.clockwise == r.clockwise
    c = arc_from_centre((1.0, 0.0), (0.0, 1.0), (0.0, 0.0), clockwise=False,
                        exact=("centre", (1, 0), (0, 1), (0, 0), False))
    assert c.reversed().exact == ArcByCentre("centre", (0, 1), (1, 0), (0, 0), True)


@given(st.lists(st.tuples(st.floats(-50, 50), st.floats(0.5, 80)), min_size=3, max_size=60))
@example([(0.0, 1.0), (1.0, 1.0), (0.0, 2.0)])
def test_polyline_integrals_match_shapely(points):
    # Reference: shapely.Polygon area and centroid, LineString length.
    pts = np.array(points + points[:1], dtype=float)
    poly = shapely.Polygon(pts)
    if not poly.is_valid or poly.area < 1e-6:
        return
    v = segment_integrals([Polyline(pts)]).values[0]
    assert math.isclose(v[COL["length"]], shapely.LineString(pts).length, rel_tol=1e-12)
    assert math.isclose(abs(v[COL["M00"]]), poly.area, rel_tol=1e-9)
    assert math.isclose(v[COL["M10"]] / v[COL["M00"]], poly.centroid.x, rel_tol=1e-9, abs_tol=1e-9)
    assert math.isclose(v[COL["M01"]] / v[COL["M00"]], poly.centroid.y, rel_tol=1e-9, abs_tol=1e-9)


def test_polyline_equals_its_lines():
    # The same edges as separate lines: each column summed (line closed forms from memory
    # are checked elsewhere against sympy; here the two kinds must agree to rounding).
    pts = np.array([[0.0, 1.0], [1.0, 3.0], [2.0, 2.0], [2.5, 4.0], [0.0, 1.0]])
    lines = [Line(tuple(a), tuple(b)) for a, b in zip(pts[:-1], pts[1:])]
    a = segment_integrals(lines).values.sum(axis=0)
    b = segment_integrals([Polyline(pts)]).values[0]
    assert np.allclose(a, b, rtol=1e-14, atol=1e-14)


def test_curve_kind_is_symbolic_only_when_asked():
    c = curve_from_expressions(T, T ** 2, 0, 1)
    assert segment_integrals([c]).method == ("quadrature",)
    assert segment_integrals([c], symbolic=True).method[0].startswith("symbolic")


def test_kinds_refuse_nothing_silently():
    with pytest.raises(ValueError):
        Polyline(np.zeros((1, 2)))
    assert isinstance(samples()[1], Arc) and isinstance(samples()[3], Curve)
