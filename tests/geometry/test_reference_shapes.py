"""Solids of revolution against published formulas.

Each row of CHECKS.md "Geometry of revolution" (and the mass-property table
values used for the same solids), with its source beside the check. Shapes
are drawn in the frame of their axis and placed in the sketch four ways
(plain x axis, rotated and moved, mirrored onto the right of the axis, the
y axis), so the frame mapping is exercised as well. Relative tolerance
1e-12 for lines and arcs, 1e-10 for curves; the engine's own cross-check
(washers and ∫ r ds quadrature) must agree to 1e-9.
"""

from __future__ import annotations

import math
from fractions import Fraction

import pytest
import sympy

from geometry_testkit import (CROSS_TOL, CURVE_TOL, IDENTITY, LINE_ARC_TOL, PLACEMENT_IDS,
                              PLACEMENTS, T, Placement, assert_rel, circle_loop, polygon,
                              revolution)
from revolve.geometry.measure import measure
from revolve.geometry.profile import Loop
from revolve.geometry.segments import Line, arc_from_centre, arc_from_radius, curve_from_expressions

placements = pytest.mark.parametrize("p", PLACEMENTS, ids=PLACEMENT_IDS)


def _agrees(m):
    cc = m.crosscheck
    assert cc is not None
    assert cc.agrees(CROSS_TOL), (cc.volume_difference, cc.surface_difference)
    return cc


def sphere_loop(r: float) -> Loop:
    """Upper half circle about the origin and the diameter on the axis."""
    arc = arc_from_centre((r, 0.0), (-r, 0.0), (0.0, 0.0), clockwise=False, face="sphere")
    return Loop((arc, Line((-r, 0.0), (r, 0.0), face="axis")))


# -- sphere --------------------------------------------------------------------------

@placements
@pytest.mark.parametrize("r", [1.0, 2.5, 0.037])
def test_sphere(p, r):
    m = measure(revolution([sphere_loop(r)], p=p))
    # CRC Standard Mathematical Tables (from memory): V = 4/3 π r³
    assert_rel(m.volume, 4 / 3 * math.pi * r ** 3, LINE_ARC_TOL, "sphere volume")
    # CRC Standard Mathematical Tables (from memory): S = 4 π r²
    assert_rel(m.surface_total, 4 * math.pi * r ** 2, LINE_ARC_TOL, "sphere surface")
    assert_rel(m.surface_by_face["sphere"], 4 * math.pi * r ** 2, LINE_ARC_TOL, "sphere face")
    assert abs(m.surface_by_face["axis"]) <= LINE_ARC_TOL * 4 * math.pi * r ** 2  # a face on the axis sweeps nothing
    _agrees(m)


def test_sphere_from_arc_by_radius():
    # The same sphere, its arc given by radius and side instead of centre.
    r = 1.75
    arc = arc_from_radius((r, 0.0), (-r, 0.0), radius=r, side="left")
    m = measure(revolution([Loop((arc, Line((-r, 0.0), (r, 0.0))))]))
    # CRC Standard Mathematical Tables (from memory): V = 4/3 π r³, S = 4 π r²
    assert_rel(m.volume, 4 / 3 * math.pi * r ** 3, LINE_ARC_TOL, "sphere volume")
    assert_rel(m.surface_total, 4 * math.pi * r ** 2, LINE_ARC_TOL, "sphere surface")


# -- spherical cap -------------------------------------------------------------------

def cap_loop(r: float, h: float) -> Loop:
    """The cap of height h of a sphere of radius r, cut perpendicular to the axis."""
    zc = r - h
    a = math.sqrt(2 * r * h - h * h)
    arc = arc_from_centre((r, 0.0), (zc, a), (0.0, 0.0), clockwise=False, face="cap")
    return Loop((arc, Line((zc, a), (zc, 0.0), face="flat"), Line((zc, 0.0), (r, 0.0), face="axis")))


@placements
@pytest.mark.parametrize("r,h", [(3.0, 0.5), (3.0, 3.0), (3.0, 4.5), (0.8, 0.01)])
def test_spherical_cap(p, r, h):
    m = measure(revolution([cap_loop(r, h)], p=p))
    # CRC Standard Mathematical Tables (from memory): V = π h² (3r − h)/3
    assert_rel(m.volume, math.pi * h * h * (3 * r - h) / 3, LINE_ARC_TOL, "cap volume")
    # CRC Standard Mathematical Tables (from memory): curved area 2 π r h
    assert_rel(m.surface_by_face["cap"], 2 * math.pi * r * h, LINE_ARC_TOL, "cap curved area")
    # CRC Standard Mathematical Tables (from memory): circle area π a², a² = 2rh − h² (chord half-length)
    assert_rel(m.surface_by_face["flat"], math.pi * (2 * r * h - h * h), LINE_ARC_TOL, "cap base")
    _agrees(m)


# -- cone and frustum ----------------------------------------------------------------

@placements
@pytest.mark.parametrize("r,h", [(1.0, 1.0), (2.0, 7.5), (5.0, 0.3)])
def test_cone(p, r, h):
    loop = Loop((Line((0.0, 0.0), (h, 0.0), face="axis"),
                 Line((h, 0.0), (0.0, r), face="lateral"),
                 Line((0.0, r), (0.0, 0.0), face="base")))
    m = measure(revolution([loop], p=p))
    # CRC Standard Mathematical Tables (from memory): V = π r² h/3
    assert_rel(m.volume, math.pi * r * r * h / 3, LINE_ARC_TOL, "cone volume")
    # CRC Standard Mathematical Tables (from memory): lateral area π r √(r² + h²)
    assert_rel(m.surface_by_face["lateral"], math.pi * r * math.sqrt(r * r + h * h), LINE_ARC_TOL,
               "cone lateral")
    # CRC Standard Mathematical Tables (from memory): base circle π r²
    assert_rel(m.surface_by_face["base"], math.pi * r * r, LINE_ARC_TOL, "cone base")
    _agrees(m)


@placements
@pytest.mark.parametrize("R,r,h", [(2.0, 1.0, 3.0), (1.0, 4.0, 0.5), (10.0, 9.999, 2.0)])
def test_frustum(p, R, r, h):
    # Big end radius R at z = 0, small end radius r at z = h (r > R works the same).
    loop = polygon([(0.0, 0.0), (h, 0.0), (h, r), (0.0, R)])
    m = measure(revolution([loop], p=p))
    # CRC Standard Mathematical Tables (from memory): V = π h (R² + R r + r²)/3
    assert_rel(m.volume, math.pi * h * (R * R + R * r + r * r) / 3, LINE_ARC_TOL, "frustum volume")
    lateral = math.pi * (R + r) * math.sqrt((R - r) ** 2 + h * h)
    # CRC Standard Mathematical Tables (from memory): lateral π (R + r) √((R − r)² + h²), plus two end circles
    assert_rel(m.surface_total, lateral + math.pi * (R * R + r * r), LINE_ARC_TOL, "frustum surface")
    _agrees(m)


# -- torus ---------------------------------------------------------------------------

@placements
@pytest.mark.parametrize("R,r", [(3.0, 1.0), (1.0, 0.999), (20.0, 0.5), (100.0, 0.5), (2.0, 2.0)])
def test_torus(p, R, r):
    # R = r is the horn torus: the circle touches the axis at one point, which is allowed.
    m = measure(revolution([circle_loop(0.0, R, r)], p=p))
    # CRC Standard Mathematical Tables (from memory): V = 2 π² R r²
    assert_rel(m.volume, 2 * math.pi ** 2 * R * r * r, LINE_ARC_TOL, "torus volume")
    # CRC Standard Mathematical Tables (from memory): S = 4 π² R r
    assert_rel(m.surface_total, 4 * math.pi ** 2 * R * r, LINE_ARC_TOL, "torus surface")
    _agrees(m)


def test_torus_from_arcs_by_radius_clockwise():
    # The circle travelled clockwise, its two halves given by radius and side.
    R, r = 4.0, 1.5
    top, bottom = (0.0, R + r), (0.0, R - r)
    a1 = arc_from_radius(top, bottom, radius=r, side="left")    # via z = +r
    a2 = arc_from_radius(bottom, top, radius=r, side="left")    # via z = -r
    m = measure(revolution([Loop((a1, a2))]))
    # CRC Standard Mathematical Tables (from memory): V = 2 π² R r², S = 4 π² R r
    assert_rel(m.volume, 2 * math.pi ** 2 * R * r * r, LINE_ARC_TOL, "torus volume")
    assert_rel(m.surface_total, 4 * math.pi ** 2 * R * r, LINE_ARC_TOL, "torus surface")


# -- paraboloid ----------------------------------------------------------------------

@pytest.mark.parametrize("h,symbolic", [(2.0, True), (0.5, False)])
def test_paraboloid(h, symbolic):
    # r = √z for 0 ≤ z ≤ h: top radius r = √h. The tangent is vertical at the apex.
    r = math.sqrt(h)
    curve = curve_from_expressions(T, sympy.sqrt(T), 0, h, face="lateral")
    loop = Loop((curve, Line((h, r), (h, 0.0), face="top"), Line((h, 0.0), (0.0, 0.0), face="axis")))
    m = measure(revolution([loop]), symbolic=symbolic)
    # CRC Standard Mathematical Tables (from memory): V = π r² h/2
    assert_rel(m.volume, math.pi * r * r * h / 2, CURVE_TOL, "paraboloid volume")
    # CRC Standard Mathematical Tables (from memory): lateral π r/(6h²) · [(r² + 4h²)^(3/2) − r³]
    lateral = math.pi * r / (6 * h * h) * ((r * r + 4 * h * h) ** 1.5 - r ** 3)
    assert_rel(m.surface_by_face["lateral"], lateral, CURVE_TOL, "paraboloid lateral")
    _agrees(m)


def test_paraboloid_placed_and_quadrature_only():
    # Same solid, rotated and moved in the sketch, integrated without sympy.
    h = 1.5
    r = math.sqrt(h)
    p = PLACEMENTS[1]
    curve = curve_from_expressions(T, sympy.sqrt(T), 0, h, face="lateral")
    loop = Loop((curve, Line((h, r), (h, 0.0)), Line((h, 0.0), (0.0, 0.0))))
    m = measure(revolution([loop], p=p), symbolic=False)
    # CRC Standard Mathematical Tables (from memory): V = π r² h/2, lateral π r/(6h²) · [(r² + 4h²)^(3/2) − r³]
    assert_rel(m.volume, math.pi * r * r * h / 2, CURVE_TOL, "paraboloid volume")
    lateral = math.pi * r / (6 * h * h) * ((r * r + 4 * h * h) ** 1.5 - r ** 3)
    assert_rel(m.surface_by_face["lateral"], lateral, CURVE_TOL, "paraboloid lateral")
    _agrees(m)


def test_paraboloid_short():
    # r = √z up to h = 0.25 (top radius 0.5): the same solid as above, only smaller.
    h = 0.25
    r = math.sqrt(h)
    curve = curve_from_expressions(T, sympy.sqrt(T), 0, h, face="lateral")
    loop = Loop((curve, Line((h, r), (h, 0.0)), Line((h, 0.0), (0.0, 0.0))))
    m = measure(revolution([loop]), symbolic=False)
    # CRC Standard Mathematical Tables (from memory): V = π r² h/2, lateral π r/(6h²) · [(r² + 4h²)^(3/2) − r³]
    assert_rel(m.volume, math.pi * r * r * h / 2, CURVE_TOL, "paraboloid volume")
    lateral = math.pi * r / (6 * h * h) * ((r * r + 4 * h * h) ** 1.5 - r ** 3)
    assert_rel(m.surface_by_face["lateral"], lateral, CURVE_TOL, "paraboloid lateral")


@pytest.mark.parametrize("r", [2.0, 0.75])
def test_sphere_from_explicit_curve(r):
    # Upper half circle as the explicit curve r(z) = √(r² − z²), travelled from z = r to z = −r.
    curve = curve_from_expressions(T, sympy.sqrt(r * r - T ** 2), r, -r)
    m = measure(revolution([Loop((curve, Line((-r, 0.0), (r, 0.0))))]), symbolic=False)
    # CRC Standard Mathematical Tables (from memory): V = 4/3 π r³, S = 4 π r²
    assert_rel(m.volume, 4 / 3 * math.pi * r ** 3, CURVE_TOL, "sphere volume")
    assert_rel(m.surface_total, 4 * math.pi * r ** 2, CURVE_TOL, "sphere surface")
    _agrees(m)


def test_unit_sphere_from_explicit_curve():
    curve = curve_from_expressions(T, sympy.sqrt(1 - T ** 2), 1, -1)
    m = measure(revolution([Loop((curve, Line((-1.0, 0.0), (1.0, 0.0))))]), symbolic=False)
    # CRC Standard Mathematical Tables (from memory): V = 4/3 π r³, S = 4 π r², r = 1
    assert_rel(m.volume, 4 / 3 * math.pi, CURVE_TOL, "sphere volume")
    assert_rel(m.surface_total, 4 * math.pi, CURVE_TOL, "sphere surface")


# -- spheroids -----------------------------------------------------------------------

def spheroid_loop(a: float, c: float) -> Loop:
    """Half ellipse z = c cos t, r = a sin t (t from 0 to π) and the polar axis."""
    half = curve_from_expressions(c * sympy.cos(T), a * sympy.sin(T), 0, sympy.pi, face="shell")
    return Loop((half, Line((-c, 0.0), (c, 0.0), face="axis")))


@pytest.mark.parametrize("a,c,symbolic", [(1.0, 2.0, True), (0.5, 3.0, False)])
def test_prolate_spheroid(a, c, symbolic):
    m = measure(revolution([spheroid_loop(a, c)]), symbolic=symbolic)
    e = math.sqrt(1 - a * a / (c * c))
    # CRC Standard Mathematical Tables (from memory): V = 4/3 π a² c
    assert_rel(m.volume, 4 / 3 * math.pi * a * a * c, CURVE_TOL, "prolate volume")
    # CRC Standard Mathematical Tables (from memory): prolate S = 2πa² (1 + c·asin(e)/(a e)), e² = 1 − a²/c²
    assert_rel(m.surface_total, 2 * math.pi * a * a * (1 + c * math.asin(e) / (a * e)), CURVE_TOL,
               "prolate surface")
    _agrees(m)


@pytest.mark.parametrize("a,c,symbolic", [(2.0, 1.0, True), (3.0, 0.5, False)])
def test_oblate_spheroid(a, c, symbolic):
    m = measure(revolution([spheroid_loop(a, c)]), symbolic=symbolic)
    e = math.sqrt(1 - c * c / (a * a))
    # CRC Standard Mathematical Tables (from memory): V = 4/3 π a² c
    assert_rel(m.volume, 4 / 3 * math.pi * a * a * c, CURVE_TOL, "oblate volume")
    # CRC Standard Mathematical Tables (from memory): oblate S = 2πa² + π (c²/e) ln((1+e)/(1−e)), e² = 1 − c²/a²
    s = 2 * math.pi * a * a + math.pi * (c * c / e) * math.log((1 + e) / (1 - e))
    assert_rel(m.surface_total, s, CURVE_TOL, "oblate surface")
    _agrees(m)


def test_prolate_spheroid_on_y_axis_quadrature_only():
    a, c = 1.0, 2.0
    m = measure(revolution([spheroid_loop(a, c)], p=PLACEMENTS[3]), symbolic=False)
    e = math.sqrt(1 - a * a / (c * c))
    # CRC Standard Mathematical Tables (from memory): V = 4/3 π a² c, prolate S = 2πa² (1 + c·asin(e)/(a e))
    assert_rel(m.volume, 4 / 3 * math.pi * a * a * c, CURVE_TOL, "prolate volume")
    assert_rel(m.surface_total, 2 * math.pi * a * a * (1 + c * math.asin(e) / (a * e)), CURVE_TOL,
               "prolate surface")


# -- circular segment ----------------------------------------------------------------

@placements
@pytest.mark.parametrize("r,h", [(2.0, 0.3), (2.0, 2.0), (2.0, 3.1), (1.0, 0.05)])
def test_circular_segment_area(p, r, h):
    # Circle of radius r centred 10 from the axis; chord parallel to the axis cutting off height h.
    cz, cr = 1.0, 10.0
    y = cr + r - h                 # chord level; the segment lies above it
    half = math.sqrt(2 * r * h - h * h)
    west, east = (cz - half, y), (cz + half, y)
    # Travelled east -> west over the top: counter-clockwise about the centre.
    if h <= r:
        arc = arc_from_radius(east, west, radius=r, side="right")
    else:
        arc = arc_from_radius(east, west, radius=r, side="right", major=True)
    loop = Loop((arc, Line(west, east)))
    m = measure(revolution([loop], p=p))
    # CRC Standard Mathematical Tables (from memory): A = r² acos((r − h)/r) − (r − h) √(2 r h − h²)
    area = r * r * math.acos((r - h) / r) - (r - h) * math.sqrt(2 * r * h - h * h)
    assert_rel(m.area, area, LINE_ARC_TOL, "segment area")
    _agrees(m)


@pytest.mark.parametrize("shape", ["thin ring", "thin segment"])
def test_thin_section_far_from_axis_keeps_digits(shape):
    # Inputs exact in binary, so any lost digit is the engine's (once lost about 1e-10).
    if shape == "thin ring":
        # A 1.4 × 2⁻¹⁰ rectangle 1024 from the axis; area and volume exact in rationals.
        r0, d, z0, z1 = 1024.0, 2.0 ** -10, 0.3, 1.7
        loop = polygon([(z0, r0), (z1, r0), (z1, r0 + d), (z0, r0 + d)])
        length = Fraction(z1) - Fraction(z0)
        area = float(length * Fraction(d))
        # CRC Standard Mathematical Tables (from memory): hollow cylinder V = π (R² − r²) L
        volume = math.pi * float((Fraction(r0 + d) ** 2 - Fraction(r0) ** 2) * length)
    else:
        # Circular segment of height s = 2⁻¹⁰ cut from a circle of radius 5s whose centre is
        # 1024 from the axis; the chord ends (±3s, 1024 + 4s) lie exactly on the circle.
        s, cr = 2.0 ** -10, 1024.0
        east, west, c = (3 * s, cr + 4 * s), (-3 * s, cr + 4 * s), (0.0, cr)
        loop = Loop((arc_from_centre(east, west, c, clockwise=False), Line(west, east)))
        # CRC Standard Mathematical Tables (from memory): A = r² acos((r − h)/r) − (r − h) √(2 r h − h²),
        # here r = 5s, h = s: A = s² (25 acos(4/5) − 12)
        area = s * s * (25 * math.acos(0.8) - 12)
        volume = None
    m = measure(revolution([loop]))
    assert_rel(m.area, area, LINE_ARC_TOL, "area")
    if volume is not None:
        assert_rel(m.volume, volume, LINE_ARC_TOL, "volume")
    _agrees(m)


# -- mass properties of the same solids ---------------------------------------------

@placements
def test_solid_sphere_inertia(p):
    r, rho = 1.3, 7.85
    m = measure(revolution([sphere_loop(r)], p=p), density=rho)
    mass = rho * 4 / 3 * math.pi * r ** 3
    assert_rel(m.mass, mass, LINE_ARC_TOL, "sphere mass")
    # Beer & Johnston, Vector Mechanics for Engineers, mass moments of inertia table (from memory): I = 2/5 m r²
    assert_rel(m.inertia_axis, 0.4 * mass * r * r, LINE_ARC_TOL, "sphere inertia")
    assert_rel(m.radius_of_gyration, math.sqrt(0.4) * r, LINE_ARC_TOL, "sphere gyration")


@pytest.mark.parametrize("a,b", [(0.0, 2.0), (1.0, 2.0)])
def test_cylinder_inertia(a, b):
    # Solid (a = 0) or hollow cylinder, radii a..b, length 3.
    rho, length = 2.0, 3.0
    m = measure(revolution([polygon([(0.0, a), (length, a), (length, b), (0.0, b)])]), density=rho)
    mass = rho * math.pi * (b * b - a * a) * length
    # Beer & Johnston, Vector Mechanics for Engineers, mass moments of inertia table (from memory):
    # solid cylinder ½ m b²; a hollow one is the difference of two solid ones, ½ m (a² + b²)
    assert_rel(m.inertia_axis, 0.5 * mass * (a * a + b * b), LINE_ARC_TOL, "cylinder inertia")


def test_cone_inertia_and_centre_of_mass():
    r, h, rho = 1.5, 4.0, 3.0
    loop = polygon([(0.0, 0.0), (h, 0.0), (0.0, r)])
    m = measure(revolution([loop]), density=rho)
    mass = rho * math.pi * r * r * h / 3
    # Beer & Johnston, Vector Mechanics for Engineers, mass moments of inertia table (from memory): I = 3/10 m r²
    assert_rel(m.inertia_axis, 0.3 * mass * r * r, LINE_ARC_TOL, "cone inertia")
    # Beer & Johnston, Vector Mechanics for Engineers, table of centroids of volumes (from memory): h/4 from the base
    assert_rel(m.centre_of_mass_axial, h / 4, LINE_ARC_TOL, "cone centre of mass")
    assert m.centre_of_mass_offset == 0.0


@pytest.mark.parametrize("p", [IDENTITY, Placement(1.0, 2.0, -0.4, 1.0)], ids=["x-axis", "rotated"])
def test_hemisphere_centre_of_mass(p):
    r = 2.0
    arc = arc_from_centre((r, 0.0), (0.0, r), (0.0, 0.0), clockwise=False)
    loop = Loop((arc, Line((0.0, r), (0.0, 0.0)), Line((0.0, 0.0), (r, 0.0))))
    m = measure(revolution([loop], p=p))
    # Beer & Johnston, Vector Mechanics for Engineers, table of centroids of volumes (from memory): 3r/8 from the flat face
    assert_rel(m.centre_of_mass_axial, 3 * r / 8, LINE_ARC_TOL, "hemisphere centre of mass")
