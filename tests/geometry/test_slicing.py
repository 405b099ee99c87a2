"""The washer cross-check (revolve.geometry.slicing) on polylines, lines and arcs.

References:

* shapely (reference library): ``Polygon.area`` and ``Polygon.centroid`` with
  Pappus–Guldinus' first theorem V = 2π ȳ A, and ``Polygon.length`` with
  ``Polygon.boundary.centroid`` and the second theorem S = 2π ȳ_L L
  (Stewart, *Calculus*, "Moments and centers of mass", from memory);
* closed forms from memory: a regular N-gon of circumradius ρ has area
  (N/2) ρ² sin(2π/N) and perimeter 2Nρ sin(π/N), both centred at its centre;
  a half disc of radius a has its centroid 4a/(3π) from its diameter; a
  solid cylinder of radius a and length h has volume π a² h and surface
  2π a h + 2π a²;
* the same points given as one polyline and as separate lines must give the
  same washers (the polyline is a storage form, not another geometry).

Nothing here is timed.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import assume, example, given
from hypothesis import strategies as st
from shapely.geometry import Polygon

from revolve.geometry.checks import prepare
from revolve.geometry.profile import Axis, Loop, Profile
from revolve.geometry.segments import Line, Polyline, arc_from_centre
from revolve.geometry.slicing import (_radius_at, first_partition, monotone_pieces, piece_table,
                                      surface_by_quadrature, washer_volume)

FULL = 2 * math.pi


def closed(points):
    pts = np.asarray(points, dtype=float)
    return np.vstack([pts, pts[:1]])


def polyline_loop(points):
    return Loop((Polyline(closed(points)),))


def cross_check(loops, axis=None):
    prep = prepare(Profile(loops=tuple(loops)), axis or Axis.x())
    v, ve = washer_volume(prep, prep.loop_factors, FULL)
    s, se = surface_by_quadrature(prep, FULL)
    return v, ve, float(sum(s)), float(sum(se)), prep


def regular_polygon(n, rho, centre_r, phase=0.3):
    a = phase + np.linspace(0.0, 2 * math.pi, n, endpoint=False)
    return np.column_stack([rho * np.cos(a), centre_r + rho * np.sin(a)])


def pappus_by_shapely(points, holes=()):
    poly = Polygon(points, [h for h in holes])
    assert poly.is_valid
    volume = FULL * poly.centroid.y * poly.area
    surface = FULL * poly.boundary.centroid.y * poly.length
    return volume, surface


# -- (a) one polyline and the same points as lines ----------------------------------------------

@pytest.mark.parametrize("n,noise", [(7, 0.0), (500, 0.0), (2000, 0.3)])
def test_polyline_and_lines_give_the_same_washers(n, noise):
    rng = np.random.default_rng(n)
    a = np.linspace(0.0, 2 * math.pi, n, endpoint=False)
    rad = 10 + 2 * np.sin(5 * a) + rng.uniform(-noise, noise, n)
    pts = np.column_stack([rad * np.cos(a), 30 + rad * np.sin(a)])
    vp, vpe, sp, spe, _ = cross_check([polyline_loop(pts)])
    vl, vle, sl, sle, _ = cross_check([Loop.from_points(pts.tolist())])
    assert abs(vp - vl) <= 1e-12 * vl
    assert abs(sp - sl) <= 1e-12 * sl
    # and both against shapely + Pappus
    v_ref, s_ref = pappus_by_shapely(pts)
    assert abs(vp - v_ref) <= 1e-12 * v_ref
    assert abs(sp - s_ref) <= 1e-12 * s_ref


def test_polyline_with_an_arc_and_lines_with_an_arc_agree_with_the_closed_form():
    # rectangle [1, 3] × [1, 2] with a half disc of radius 1 on top (centre (2, 2)), about x:
    # A = 2 + π/2, ȳ A = 2·1.5 + (π/2)(2 + 4/(3π)) (half-disc centroid, from memory);
    # S = 2π (1·1.5 + 2·1 + 1·1.5 + ∫₀^π (2 + sin θ) dθ) = 2π (5 + 2π + 2).
    arc = arc_from_centre((3.0, 2.0), (1.0, 2.0), (2.0, 2.0), clockwise=False)
    corner = [(1.0, 2.0), (1.0, 1.0), (3.0, 1.0), (3.0, 2.0)]
    as_polyline = Loop((Polyline(np.array(corner)), arc))
    as_lines = Loop(tuple(Line(p, q) for p, q in zip(corner[:-1], corner[1:])) + (arc,))
    v_ref = FULL * (3.0 + (math.pi / 2) * (2 + 4 / (3 * math.pi)))
    s_ref = FULL * (7 + 2 * math.pi)
    vp, vpe, sp, spe, prep = cross_check([as_polyline])
    vl, vle, sl, sle, _ = cross_check([as_lines])
    assert [g.kind.kind for g in piece_table(prep, prep.loop_factors).groups] == ["polyline", "arc"]
    assert abs(vp - vl) <= 1e-12 * v_ref and abs(sp - sl) <= 1e-12 * s_ref
    assert abs(vp - v_ref) <= 1e-12 * v_ref and vpe <= 1e-10 * v_ref
    assert abs(sp - s_ref) <= 1e-12 * s_ref and spe <= 1e-10 * s_ref


# -- (b) outside references -------------------------------------------------------------------

@pytest.mark.parametrize("n", [3, 4, 6, 64, 4096])
def test_regular_polygon_ring_matches_the_closed_forms(n):
    rho, R = 2.0, 5.0
    v, ve, s, se, _ = cross_check([polyline_loop(regular_polygon(n, rho, R))])
    area = n / 2 * rho * rho * math.sin(2 * math.pi / n)
    perimeter = 2 * n * rho * math.sin(math.pi / n)
    assert abs(v - FULL * R * area) <= 1e-12 * FULL * R * area
    assert abs(s - FULL * R * perimeter) <= 1e-12 * FULL * R * perimeter
    assert ve <= 1e-12 * v and se <= 1e-12 * s


def test_solid_cylinder_touching_the_axis():
    # a 2 × 1 rectangle lying on the axis (clockwise), as one polyline: π·1²·2 and 2π·1·2 + 2π·1²
    v, ve, s, se, _ = cross_check([polyline_loop([(0, 0), (0, 1), (2, 1), (2, 0)])])
    assert abs(v - 2 * math.pi) <= 1e-13 * v
    assert abs(s - 6 * math.pi) <= 1e-13 * s


def test_ring_with_a_hole_against_shapely():
    outer = regular_polygon(300, 4.0, 10.0)
    hole = regular_polygon(7, 1.5, 10.5, phase=0.1)[::-1]          # clockwise, inside
    v, _, s, _, prep = cross_check([polyline_loop(outer), polyline_loop(hole)])
    v_ref, s_ref = pappus_by_shapely(outer, holes=[hole])
    assert abs(v - v_ref) <= 1e-12 * v_ref
    assert abs(s - s_ref) <= 1e-12 * s_ref


def test_noisy_polyline_is_sliced_coarser_and_agrees_with_shapely():
    rng = np.random.default_rng(3)
    n = 20_000
    a = np.linspace(0.0, 2 * math.pi, n, endpoint=False)
    rad = 20 + 2 * np.sin(7 * a) + rng.uniform(-0.5, 0.5, n)
    pts = np.column_stack([rad * np.cos(a), 50 + rad * np.sin(a)])
    v, ve, s, se, prep = cross_check([polyline_loop(pts)])
    table = piece_table(prep, prep.loop_factors)
    assert first_partition(table).size < np.unique(np.concatenate([table.lo, table.hi])).size
    v_ref, s_ref = pappus_by_shapely(pts)
    assert abs(v - v_ref) <= 1e-11 * v_ref and ve <= 1e-9 * v_ref
    assert abs(s - s_ref) <= 1e-11 * s_ref


def test_the_axis_may_be_any_line():
    # the same regular hexagon ring measured about the y axis (x ↔ y swapped)
    pts = regular_polygon(6, 1.0, 3.0)
    v, _, s, _, _ = cross_check([polyline_loop(pts[:, ::-1])], Axis.y())
    area = 3 * math.sin(math.pi / 3)
    assert abs(v - FULL * 3.0 * area) <= 1e-12 * v
    assert abs(s - FULL * 3.0 * 6.0) <= 1e-12 * s


# -- the polyline stays one array ---------------------------------------------------------------

def test_polyline_pieces_are_rows_of_its_vertex_array():
    pts = regular_polygon(1000, 2.0, 5.0)
    prep = prepare(Profile(loops=(polyline_loop(pts),)), Axis.x())
    table = piece_table(prep, prep.loop_factors)
    [group] = table.groups
    assert group.kind is Polyline and len(group.segments) == 1
    frame = group.segments[0].points
    # every edge not across the axis direction is one row (z0, r0, z1, r1)
    edges = np.column_stack([frame[:-1], frame[1:]])
    edges = edges[edges[:, 0] != edges[:, 2]]
    assert np.array_equal(group.params, edges)
    assert table.count == len(edges)


def test_monotone_pieces_and_radius_of_a_small_polyline():
    zigzag = Polyline(np.array([[0.0, 1.0], [2.0, 3.0], [1.0, 4.0], [1.0, 5.0], [3.0, 5.0]]))
    pieces = monotone_pieces(zigzag, 1.0)
    assert [(p.z_from, p.z_to) for p in pieces] == [(0.0, 2.0), (2.0, 1.0), (1.0, 3.0)]
    assert _radius_at(pieces[0], np.array([0.5, 1.5])).tolist() == [1.5, 2.5]
    assert _radius_at(pieces[1], np.array([1.5])).tolist() == [3.5]


# -- (c) random star-shaped polygons --------------------------------------------------------------

star = st.integers(3, 60).flatmap(lambda n: st.tuples(
    st.lists(st.floats(0.0, 1.0, allow_nan=False), min_size=n, max_size=n),
    st.lists(st.floats(0.2, 1.0, allow_nan=False), min_size=n, max_size=n),
    st.floats(1.5, 40.0), st.booleans()))


@given(star)
@example(([0.0, 0.5, 0.75], [1.0, 1.0, 0.2], 1.5, True))
@example(([0.0, 0.25, 0.5, 0.75], [1.0, 1.0, 1.0, 1.0], 1.5, False))
def test_random_star_shaped_polygons_against_shapely(case):
    fractions, radii, centre_r, clockwise = case
    # angles spread over the turn (a sorted list, kept apart), so the polygon is star-shaped
    steps = np.asarray(fractions) + 0.05
    a = 2 * math.pi * np.cumsum(steps) / steps.sum()
    pts = np.column_stack([np.asarray(radii) * np.cos(a), centre_r + np.asarray(radii) * np.sin(a)])
    if clockwise:
        pts = pts[::-1]
    poly = Polygon(pts)
    assume(poly.is_valid and poly.area > 1e-3)
    v, ve, s, se, _ = cross_check([polyline_loop(pts)])
    v_ref, s_ref = pappus_by_shapely(pts)
    assert abs(v - v_ref) <= 1e-12 * v_ref and ve <= 1e-12 * v_ref
    assert abs(s - s_ref) <= 1e-12 * s_ref
    vl, _, sl, _, _ = cross_check([Loop.from_points(pts.tolist())])
    assert abs(v - vl) <= 1e-12 * v_ref and abs(s - sl) <= 1e-12 * s_ref


def test_long_arc_cut_by_the_slices_of_a_dense_polyline():
    # Upper half: a polyline of 5000 vertices on a circle of radius 20 about (0, 50); lower half:
    # one arc, cut by every slice of the polyline. Reference: shapely's area and centroid of the
    # polygon half (closed along the diameter) plus the half disc below (centroid 4a/(3π) from
    # its diameter, from memory), through Pappus–Guldinus; surface likewise from shapely's
    # boundary less the diameter, plus the half circle (centroid 2a/π from it, from memory).
    a = np.linspace(0.0, math.pi, 5000)
    pts = np.column_stack([20 * np.cos(a), 50 + 20 * np.sin(a)])
    pts[0], pts[-1] = (20.0, 50.0), (-20.0, 50.0)
    arc = arc_from_centre((-20.0, 50.0), (20.0, 50.0), (0.0, 50.0), clockwise=False)
    v, ve, s, se, _ = cross_check([Loop((Polyline(pts), arc))])
    half = Polygon(pts)
    half_disc = math.pi * 400 / 2
    v_ref = FULL * (half.area * half.centroid.y + half_disc * (50 - 80 / (3 * math.pi)))
    chain_moment = half.boundary.centroid.y * half.length - 50.0 * 40.0
    s_ref = FULL * (chain_moment + math.pi * 20 * (50 - 40 / math.pi))
    assert abs(v - v_ref) <= 1e-12 * v_ref and ve <= 1e-12 * v_ref
    assert abs(s - s_ref) <= 1e-12 * s_ref
