"""Centroids of areas and arcs against the table of centroids.

Source of every expected position: Beer & Johnston, *Vector Mechanics for
Engineers: Statics*, table of centroids (from memory). The shapes are
drawn in the sketch at odd positions and angles, away from the axis, and
revolved about the x axis; ``measure`` reports the centroid of the section
and of the boundary in sketch coordinates, and their distances from the axis.
"""

from __future__ import annotations

import math

import pytest

from geometry_testkit import (CURVE_TOL, LINE_ARC_TOL, T, assert_rel, distance_to_line, polygon,
                              reverse_loop)
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Chain, Loop, Profile, Revolution
from revolve.geometry.segments import Line, arc_from_centre, curve_from_expressions


def _measure_loop(loop, axis=None):
    return measure(Revolution(Profile(loops=(loop,)), axis or Axis.x()))


def _unit(angle):
    return (math.cos(angle), math.sin(angle))


def _at(c, angle, dist):
    """The point ``dist`` from ``c`` in the direction ``angle``."""
    return (c[0] + dist * math.cos(angle), c[1] + dist * math.sin(angle))


def _assert_point(got, want, scale, tol, what):
    d = math.hypot(got[0] - want[0], got[1] - want[1])
    assert d <= tol * scale, f"{what}: got {got}, want {want} (off by {d:.3g}, scale {scale:g})"


# -- triangle ------------------------------------------------------------------------

@pytest.mark.parametrize("pts", [
    [(0.0, 1.0), (4.0, 1.0), (1.0, 4.0)],
    [(-3.2, 2.5), (5.1, 7.7), (0.4, 9.9)],
    [(0.0, 5.0), (10.0, 5.001), (20.0, 5.1)],        # long and thin
], ids=["plain", "skew", "thin"])
def test_triangle(pts):
    m = _measure_loop(polygon(pts))
    size = max(math.dist(a, b) for a in pts for b in pts)
    for i in range(3):
        a, b, opposite = pts[i], pts[(i + 1) % 3], pts[(i + 2) % 3]
        direction = (b[0] - a[0], b[1] - a[1])
        height = distance_to_line(opposite, a, direction)
        # Beer & Johnston, Statics, table of centroids (from memory): one third of each height from the base
        got = distance_to_line(m.centroid, a, direction)
        assert abs(got - height / 3) <= LINE_ARC_TOL * size, (i, got, height / 3)


# -- semicircle, quarter circle, sector ----------------------------------------------

@pytest.mark.parametrize("r,cx,cy,beta", [(1.0, 0.0, 3.0, 0.0), (2.5, 7.0, 6.0, 0.9),
                                          (0.01, -0.04, 0.02, 4.0)])
def test_semicircular_area(r, cx, cy, beta):
    # Diameter from c - r·u to c + r·u (u at angle beta); the arc bulges to the left of u.
    c = (cx, cy)
    a, b = _at(c, beta, r), _at(c, beta + math.pi, r)
    loop = Loop((arc_from_centre(a, b, c, clockwise=False), Line(b, a)))
    m = _measure_loop(loop)
    # Beer & Johnston, Statics, table of centroids (from memory): semicircular area, 4 r/(3π) from the diameter
    want = _at(c, beta + math.pi / 2, 4 * r / (3 * math.pi))
    _assert_point(m.centroid, want, r, LINE_ARC_TOL, "semicircle centroid")
    assert_rel(m.centroid_distance, want[1], LINE_ARC_TOL, "distance from the axis")
    # CRC Standard Mathematical Tables (from memory): half a circle, π r²/2
    assert_rel(m.area, math.pi * r * r / 2, LINE_ARC_TOL, "semicircle area")


@pytest.mark.parametrize("r,cx,cy,beta", [(1.0, 0.0, 0.5, 0.0), (3.0, -2.0, 8.0, 2.2)])
def test_quarter_circle(r, cx, cy, beta):
    c = (cx, cy)
    a, b = _at(c, beta, r), _at(c, beta + math.pi / 2, r)
    loop = Loop((Line(c, a), arc_from_centre(a, b, c, clockwise=False), Line(b, c)))
    m = _measure_loop(loop)
    # Beer & Johnston, Statics, table of centroids (from memory): quarter circle, 4 r/(3π) from each straight edge
    for edge in (_unit(beta), _unit(beta + math.pi / 2)):
        got = distance_to_line(m.centroid, c, edge)
        assert abs(got - 4 * r / (3 * math.pi)) <= LINE_ARC_TOL * r, (edge, got)


@pytest.mark.parametrize("alpha", [1e-3, 0.05, math.pi / 6, math.pi / 3, 3 * math.pi / 4, 0.95 * math.pi])
@pytest.mark.parametrize("reverse", [False, True], ids=["ccw", "cw"])
def test_sector(alpha, reverse):
    r, c, beta = 2.0, (1.0, 5.0), 0.4     # bisector at angle beta
    a, b = _at(c, beta - alpha, r), _at(c, beta + alpha, r)
    loop = Loop((Line(c, a), arc_from_centre(a, b, c, clockwise=False), Line(b, c)))
    if reverse:
        loop = reverse_loop(loop)
    m = _measure_loop(loop)
    # Beer & Johnston, Statics, table of centroids (from memory): sector of half-angle α, 2 r sin α/(3α) from the centre
    want = _at(c, beta, 2 * r * math.sin(alpha) / (3 * alpha))
    _assert_point(m.centroid, want, r, LINE_ARC_TOL, "sector centroid")
    # CRC Standard Mathematical Tables (from memory): sector area α r² (half-angle α)
    assert_rel(m.area, alpha * r * r, LINE_ARC_TOL, "sector area")


# -- arcs (boundary centroid of an open chain) ---------------------------------------

@pytest.mark.parametrize("r,cx,cy,beta", [(1.0, 0.0, 2.0, 0.0), (4.0, 3.0, 9.0, -1.1)])
def test_semicircular_arc(r, cx, cy, beta):
    c = (cx, cy)
    a, b = _at(c, beta, r), _at(c, beta + math.pi, r)
    m = measure(Revolution(Profile(chains=(Chain((arc_from_centre(a, b, c, clockwise=False),)),)),
                           Axis.x()))
    # Beer & Johnston, Statics, table of centroids (from memory): semicircular arc, 2 r/π from the diameter
    want = _at(c, beta + math.pi / 2, 2 * r / math.pi)
    _assert_point(m.boundary_centroid, want, r, LINE_ARC_TOL, "arc centroid")
    assert_rel(m.boundary_centroid_distance, want[1], LINE_ARC_TOL, "distance from the axis")
    assert_rel(m.boundary_length, math.pi * r, LINE_ARC_TOL, "arc length")
    assert m.volume == 0.0 and m.area == 0.0          # a chain has no section


@pytest.mark.parametrize("alpha", [1e-3, 0.3, math.pi / 2, 2.5, 0.99 * math.pi])
@pytest.mark.parametrize("clockwise", [False, True], ids=["ccw", "cw"])
def test_circular_arc(alpha, clockwise):
    r, c, beta = 1.5, (-2.0, 4.0), 2.0
    a, b = _at(c, beta - alpha, r), _at(c, beta + alpha, r)
    arc = arc_from_centre(b, a, c, clockwise=True) if clockwise else \
        arc_from_centre(a, b, c, clockwise=False)
    m = measure(Revolution(Profile(chains=(Chain((arc,)),)), Axis.x()))
    # Beer & Johnston, Statics, table of centroids (from memory): arc of half-angle α, r sin α/α from the centre
    want = _at(c, beta, r * math.sin(alpha) / alpha)
    _assert_point(m.boundary_centroid, want, r, LINE_ARC_TOL, "arc centroid")
    assert_rel(m.boundary_length, 2 * alpha * r, LINE_ARC_TOL, "arc length")


# -- parabolic spandrel --------------------------------------------------------------

@pytest.mark.parametrize("k,a,symbolic", [(0.5, 2.0, True), (3.0, 0.7, False)])
def test_parabolic_spandrel(k, a, symbolic):
    # Region under y = k x² for 0 ≤ x ≤ a, revolved about the line y = -1.
    h = k * a * a
    curve = curve_from_expressions(T, k * T ** 2, 0, a)
    loop = Loop((curve, Line((a, h), (a, 0.0)), Line((a, 0.0), (0.0, 0.0))))
    m = measure(Revolution(Profile(loops=(loop,)), Axis((0.0, -1.0), (1.0, 0.0))), symbolic=symbolic)
    # Beer & Johnston, Statics, table of centroids (from memory): spandrel area a h/3, x̄ = 3a/4, ȳ = 3h/10
    assert_rel(m.area, a * h / 3, CURVE_TOL, "spandrel area")
    _assert_point(m.centroid, (3 * a / 4, 3 * h / 10), max(a, h), CURVE_TOL, "spandrel centroid")
    assert_rel(m.centroid_distance, 1.0 + 3 * h / 10, CURVE_TOL, "distance from the axis")


# -- centroids of volumes and of an annular sector ----------------------------------

@pytest.mark.parametrize("angle", [30.0, 90.0, 200.0, 359.0])
def test_partial_ring_centre_of_mass(angle):
    # A rectangle r1..r2 swept through θ is an annular sector extruded along the axis; its
    # centre of mass lies on the bisector at the centroid of the annular sector.
    r1, r2, z0, z1 = 1.5, 4.0, -1.0, 2.0
    loop = polygon([(z0, r1), (z1, r1), (z1, r2), (z0, r2)])
    m = measure(Revolution(Profile(loops=(loop,)), Axis.x(), angle))
    alpha = math.radians(angle) / 2
    # Beer & Johnston, Statics, table of centroids (from memory): sector 2 r sin α/(3α), area α r²;
    # the annular sector is the outer sector minus the inner one.
    outer, inner = alpha * r2 * r2, alpha * r1 * r1
    want = (outer * 2 * r2 * math.sin(alpha) / (3 * alpha)
            - inner * 2 * r1 * math.sin(alpha) / (3 * alpha)) / (outer - inner)
    assert_rel(m.centre_of_mass_offset, want, LINE_ARC_TOL, "centre of mass offset")
    assert_rel(m.centre_of_mass_axial, (z0 + z1) / 2, LINE_ARC_TOL, "centre of mass along the axis")


def test_full_revolution_centre_of_mass_on_axis():
    m = _measure_loop(polygon([(0.0, 1.0), (2.0, 1.0), (2.0, 3.0), (0.0, 3.0)]))
    assert m.centre_of_mass_offset == 0.0
