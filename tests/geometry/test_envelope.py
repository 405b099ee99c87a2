"""The envelope of a section and its radial integrals, against outside references.

References: closed forms for solids of revolution (from memory: cylinder, cone
frustum, sphere volume and moment of inertia, "Pappus–Guldinus" V = 2π ∫∫ r dA and
I = 2πρ ∫∫ r³ dA), ``sympy.integrate`` for the ramp integrals on simple sections,
``scipy.integrate.quad`` along curves, and ``shapely`` (``Polygon.intersection``,
``.area``, ``.centroid``) for polygons cut at a radius. Every profile is placed in the
sketch four ways (geometry_testkit.PLACEMENTS) so the axis frame is exercised too.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import sympy
from hypothesis import example, given, settings
from hypothesis import strategies as st

from geometry_testkit import (LINE_ARC_TOL, PLACEMENT_IDS, PLACEMENTS, T, assert_rel, circle_loop,
                              place_loop, polygon, reverse_loop)
from revolve.geometry.checks import prepare
from revolve.geometry.envelope import (extent, pieces_below, radial_area_integral,
                                       radial_boundary_integral, ramp_area_integral,
                                       ramp_boundary_integral)
from revolve.geometry.profile import Chain, Loop, Profile
from revolve.geometry.segments import Line, Polyline, arc_from_centre, curve_from_expressions

placements = pytest.mark.parametrize("p", PLACEMENTS, ids=PLACEMENT_IDS)


def prepared(loops, p, chains=()):
    prof = Profile(loops=tuple(place_loop(l, p) for l in loops), chains=tuple(chains))
    return prepare(prof, p.axis)


def sphere_loop(cz: float, R: float) -> Loop:
    """Upper half circle of radius R about (cz, 0) and its diameter on the axis."""
    arc = arc_from_centre((cz + R, 0.0), (cz - R, 0.0), (cz, 0.0), clockwise=False)
    return Loop((arc, Line((cz - R, 0.0), (cz + R, 0.0))))


# -- extent ------------------------------------------------------------------------------------

@placements
def test_extent_of_a_cylinder_tube_and_sphere(p):
    # the box of each section is its drawn size (common practice, no source)
    tube = polygon([(2, 5), (42, 5), (42, 16), (2, 16)])
    e = extent(prepared([tube], p))
    assert (e.z_min, e.z_max) == pytest.approx((2.0, 42.0), rel=1e-14, abs=1e-12)
    assert (e.r_min, e.r_max) == pytest.approx((5.0, 16.0), rel=1e-14)
    e = extent(prepared([sphere_loop(10.0, 7.0)], p))
    assert (e.z_min, e.z_max, e.r_max) == pytest.approx((3.0, 17.0, 7.0), rel=1e-14)
    assert e.r_min == pytest.approx(0.0, abs=1e-12)


@placements
def test_extent_counts_an_arc_crest_and_a_curve_crest_between_the_ends(p):
    # a full circle of radius 3 about (10, 8): r from 5 to 11, z from 7 to 13 (the circle's
    # quadrant points, none of them a segment end but two)
    e = extent(prepared([circle_loop(10.0, 8.0, 3.0)], p))
    assert (e.z_min, e.z_max, e.r_min, e.r_max) == pytest.approx((7, 13, 5, 11), rel=1e-14)
    # r = 10 + 4 sin(πz/20) on [0, 20]: crest 14 at z = 10 (calculus: the sine's maximum)
    bulge = curve_from_expressions(T, 10 + 4 * sympy.sin(sympy.pi * T / 20), 0, 20)
    loop = Loop((Line((0.0, 0.0), (20.0, 0.0)), Line((20.0, 0.0), (20.0, 10.0)),
                 bulge.reversed(), Line((0.0, 10.0), (0.0, 0.0))))
    assert extent(prepared([loop], p)).r_max == pytest.approx(14.0, rel=1e-12)


def test_extent_of_chains_only_is_none_and_chains_do_not_widen_it():
    from geometry_testkit import IDENTITY
    chain = Chain.from_points([(0, 1), (5, 1)])
    assert extent(prepare(Profile(chains=(chain,)), IDENTITY.axis)) is None
    wide = Chain.from_points([(-50, 40), (50, 40)])
    e = extent(prepared([polygon([(0, 0), (4, 0), (4, 2), (0, 2)])], IDENTITY, chains=[wide]))
    assert (e.z_min, e.z_max, e.r_max) == (0.0, 4.0, 2.0)


# -- area integrals: closed forms from memory ----------------------------------------------

@placements
def test_cylinder_volume_and_inertia(p):
    # solid cylinder R = 3, L = 8: V = πR²L, I = ½ m R² (from memory); V = 2π ∫∫ r dA and
    # I/ρ = 2π ∫∫ r³ dA (Pappus–Guldinus)
    R, L = 3.0, 8.0
    prep = prepared([polygon([(1, 0), (1 + L, 0), (1 + L, R), (1, R)])], p)
    V = math.pi * R * R * L
    assert_rel(2 * math.pi * radial_area_integral(prep, [0, 1]).value, V, LINE_ARC_TOL)
    assert_rel(2 * math.pi * radial_area_integral(prep, [0, 0, 0, 1]).value, V * R * R / 2,
               LINE_ARC_TOL)
    # the ramp max(0, c − r) over the rectangle: L c² / 2 (calculus)
    assert_rel(ramp_area_integral(prep, 1.25).value, L * 1.25 ** 2 / 2, LINE_ARC_TOL)
    assert_rel(ramp_area_integral(prep, 10.0).value, L * (10 * R - R * R / 2), LINE_ARC_TOL)


@placements
def test_cone_frustum_volume_and_inertia(p):
    # frustum of radii r1, r2 and height h: V = πh/3 (r1² + r1 r2 + r2²),
    # I = πρh/10 (r2⁵ − r1⁵)/(r2 − r1) (from memory)
    r1, r2, h = 2.0, 5.0, 6.0
    prep = prepared([polygon([(0, 0), (h, 0), (h, r2), (0, r1)])], p)
    V = math.pi * h / 3 * (r1 * r1 + r1 * r2 + r2 * r2)
    inertia = math.pi * h / 10 * (r2 ** 5 - r1 ** 5) / (r2 - r1)
    assert_rel(2 * math.pi * radial_area_integral(prep, [0, 1]).value, V, LINE_ARC_TOL)
    assert_rel(2 * math.pi * radial_area_integral(prep, [0, 0, 0, 1]).value, inertia, LINE_ARC_TOL)
    # the part below r = 3.5 of the slanted side: a rectangle h × r1 and a triangle under
    # the slant; sympy.integrate over the region, split at the slant
    z, r = sympy.symbols("z r", real=True)
    c = sympy.Rational(7, 2)
    slant = r1 + (r2 - r1) * z / h
    z_cross = sympy.solve(sympy.Eq(sympy.nsimplify(slant), c), z)[0]
    want = (sympy.integrate(sympy.integrate(c - r, (r, 0, sympy.nsimplify(slant))), (z, 0, z_cross))
            + sympy.integrate(sympy.integrate(c - r, (r, 0, c)), (z, z_cross, h)))
    assert_rel(ramp_area_integral(prep, 3.5).value, float(want), LINE_ARC_TOL)


@placements
def test_sphere_volume_inertia_and_a_cut_below_its_crest(p):
    # V = 4/3 π R³ and I = 2/5 m R² (from memory)
    R = 7.0
    prep = prepared([sphere_loop(10.0, R)], p)
    V = 4 / 3 * math.pi * R ** 3
    assert_rel(2 * math.pi * radial_area_integral(prep, [0, 1]).value, V, LINE_ARC_TOL)
    assert_rel(2 * math.pi * radial_area_integral(prep, [0, 0, 0, 1]).value, 0.4 * V * R * R,
               LINE_ARC_TOL)
    assert_rel(radial_area_integral(prep, [1.0]).value, math.pi * R * R / 2, LINE_ARC_TOL)
    # ∫∫ max(0, c − r) dA over the half disc = ∫₀ᶜ (c − r) 2√(R² − r²) dr (sympy.integrate)
    r = sympy.Symbol("r", positive=True)
    for c in (sympy.Rational(3), sympy.Rational(13, 2)):
        want = sympy.integrate((c - r) * 2 * sympy.sqrt(R ** 2 - r ** 2), (r, 0, c))
        assert_rel(ramp_area_integral(prep, float(c)).value, float(want), LINE_ARC_TOL)
    # at and above the crest the whole half disc counts: c A − ∫∫ r dA
    assert_rel(ramp_area_integral(prep, 9.0).value,
               9.0 * math.pi * R * R / 2 - 2 * R ** 3 / 3, LINE_ARC_TOL)


@placements
def test_ramp_over_a_tube_with_a_hole_subtracted(p):
    # a ring section (outer 2..6 in r, hole 3..4), cut at 5: sympy.integrate of (5 − r)
    # over the rectangle minus the hole
    outer = polygon([(0, 2), (10, 2), (10, 6), (0, 6)])
    hole = reverse_loop(polygon([(2, 3), (5, 3), (5, 4), (2, 4)]))
    prep = prepared([outer, hole], p)
    r = sympy.Symbol("r")
    want = 10 * sympy.integrate(5 - r, (r, 2, 5)) - 3 * sympy.integrate(5 - r, (r, 3, 4))
    assert_rel(ramp_area_integral(prep, 5.0).value, float(want), LINE_ARC_TOL)
    # the hole's own direction does not matter (one loop-sign rule)
    same = prepared([outer, reverse_loop(hole)], p)
    assert_rel(ramp_area_integral(same, 5.0).value, float(want), LINE_ARC_TOL)


def test_turning_g_on_a_trapezoid_against_sympy_piecewise():
    # g(r) = max(0, 1/n − 2πr/vc), the speed-limit term of turning, over a trapezoid
    # (z 0..30, r from 4 at z = 0 to 16 at z = 30), integrated by sympy.integrate of a
    # Piecewise over r then z.
    from geometry_testkit import IDENTITY
    prep = prepared([polygon([(0, 0), (30, 0), (30, 16), (0, 4)])], IDENTITY)
    vc, n = sympy.Rational(200), sympy.Rational(3)
    z, r = sympy.symbols("z r", real=True)
    g = sympy.Piecewise((1 / n - 2 * sympy.pi * r / vc, r < vc / (2 * sympy.pi * n)), (0, True))
    top = 4 + sympy.Rational(12, 30) * z
    want = float(sympy.integrate(sympy.integrate(g, (r, 0, top)), (z, 0, 30)))
    rc = float(vc / (2 * sympy.pi * n))
    got = 2 * math.pi / float(vc) * ramp_area_integral(prep, rc).value
    assert 4 < rc < 16                 # the limit radius cuts the slanted side
    assert_rel(got, want, 1e-12)


@placements
def test_curve_section_against_sympy_with_its_error_bound(p):
    # r = 2 + z² / 8 over z in [0, 4] down to the axis: ∫∫ r dA and the ramp at 3 by sympy
    top = curve_from_expressions(T, 2 + T ** 2 / 8, 0, 4)
    loop = Loop((Line((0.0, 0.0), (4.0, 0.0)), Line((4.0, 0.0), (4.0, 4.0)), top.reversed(),
                 Line((0.0, 2.0), (0.0, 0.0))))
    prep = prepared([loop], p)
    z, r = sympy.symbols("z r", real=True)
    f = 2 + z ** 2 / 8
    want = float(sympy.integrate(f ** 2 / 2, (z, 0, 4)))
    got = radial_area_integral(prep, [0, 1])
    assert abs(got.value - want) <= max(got.error, 1e-10 * want)
    zc = sympy.sqrt(8)                                            # f(zc) = 3
    cut = float(sympy.integrate(sympy.integrate(3 - r, (r, 0, f)), (z, 0, zc))
                + sympy.integrate(sympy.integrate(3 - r, (r, 0, 3)), (z, zc, 4)))
    got = ramp_area_integral(prep, 3.0)
    assert abs(got.value - cut) <= max(got.error, 1e-10 * cut)


# -- polygons against shapely ----------------------------------------------------------------

def _shapely_ramp(points, level):
    """∫∫ max(0, level − r) dA from shapely: the polygon cut by a box r < level."""
    import shapely
    poly = shapely.Polygon(points)
    zs = [q[0] for q in points]
    below = poly.intersection(shapely.box(min(zs) - 1, -1e9, max(zs) + 1, level))
    if below.is_empty:
        return 0.0
    return level * below.area - below.area * below.centroid.y


@placements
def test_polyline_loop_against_shapely(p):
    # a scanned outline: one Polyline of 2000 vertices, a wavy ring about r = 20
    th = np.linspace(0.0, 2 * math.pi, 2001)
    rad = 6 + 0.8 * np.sin(7 * th)
    pts = np.column_stack([30 + rad * np.cos(th), 20 + rad * np.sin(th)])
    pts[-1] = pts[0]
    placed = np.array([p.point(float(a), float(b)) for a, b in pts])    # the test kit's placement
    prep = prepare(Profile(loops=(Loop((Polyline(placed),)),)), p.axis)
    import shapely
    poly = shapely.Polygon(pts)
    assert_rel(radial_area_integral(prep, [0, 1]).value, poly.area * poly.centroid.y, 1e-11)
    for level in (15.0, 20.0, 23.3):
        assert_rel(ramp_area_integral(prep, level).value, _shapely_ramp(pts, level), 1e-11)
    e = extent(prep)
    lo, hi = pts.min(axis=0), pts.max(axis=0)
    assert (e.z_min, e.z_max, e.r_min, e.r_max) == pytest.approx((lo[0], hi[0], lo[1], hi[1]),
                                                                 rel=1e-13)


@settings(max_examples=60)
@given(st.lists(st.tuples(st.integers(0, 40), st.integers(1, 40)), min_size=3, max_size=9,
                unique_by=lambda q: q[0]),
       st.integers(0, 45))
@example(raw=[(0, 5), (10, 5), (20, 9), (30, 2)], level=5)     # a run along the level, a vertex on it
@example(raw=[(0, 3), (40, 3)], level=3)                        # the whole top on the level
def test_star_polygons_cut_at_any_level_against_shapely(raw, level):
    # a polygon whose top runs over distinct z (a "skyline") and whose bottom is r = 0, cut at
    # every whole level, vertices on the level included
    from geometry_testkit import IDENTITY
    top = sorted(raw)
    pts = [(top[0][0], 0.0), *[(float(a), float(b)) for a, b in top], (top[-1][0], 0.0)]
    if top[0][0] == top[-1][0]:
        return
    prep = prepared([polygon(pts)], IDENTITY)
    want = _shapely_ramp(pts, float(level))
    got = ramp_area_integral(prep, float(level)).value
    assert abs(got - want) <= 1e-11 * max(1.0, abs(want))


# -- boundary integrals -----------------------------------------------------------------------

def test_ramp_along_an_arc_against_scipy_quad():
    # a quarter-and-more arc of radius 5 about (0, 2) from angle −30° to 150°; ramp at 4.5
    from scipy.integrate import quad
    R, cr, a0, a1 = 5.0, 2.0, -math.pi / 6, 5 * math.pi / 6
    arc = arc_from_centre((R * math.cos(a0), cr + R * math.sin(a0)),
                          (R * math.cos(a1), cr + R * math.sin(a1)), (0.0, cr), clockwise=False)
    cuts = sorted([a0, a1] + [math.asin((4.5 - cr) / R), math.pi - math.asin((4.5 - cr) / R)])
    want = sum(quad(lambda a: max(0.0, 4.5 - cr - R * math.sin(a)) * R, x, y, epsabs=0,
                    epsrel=1e-13)[0] for x, y in zip(cuts, cuts[1:]))
    assert_rel(ramp_boundary_integral([arc], 4.5).value, want, LINE_ARC_TOL)
    assert_rel(ramp_boundary_integral([arc.reversed()], 4.5).value, want, LINE_ARC_TOL)
    # ∫ ds and ∫ r ds of the whole arc: R Δ and R (cr Δ + R (cos a0 − cos a1)) (calculus)
    d = a1 - a0
    assert_rel(radial_boundary_integral([arc], [1.0]).value, R * d, LINE_ARC_TOL)
    assert_rel(radial_boundary_integral([arc], [0.0, 1.0]).value,
               R * (cr * d + R * (math.cos(a0) - math.cos(a1))), LINE_ARC_TOL)


def test_ramp_along_a_curve_against_scipy_quad():
    from scipy.integrate import quad
    c = curve_from_expressions(T, 1 + sympy.sin(T) + T / 3, 0, 6)
    f = lambda t: max(0.0, 2.0 - (1 + math.sin(t) + t / 3)) * math.hypot(1.0, math.cos(t) + 1 / 3)
    pts = [0.0, 6.0] + [float(s) for s in c.parameters_at(1, 2.0)]
    pts = sorted(pts)
    want = sum(quad(f, a, b, epsabs=0, epsrel=1e-13)[0] for a, b in zip(pts, pts[1:]))
    got = ramp_boundary_integral([c], 2.0)
    assert abs(got.value - want) <= max(got.error, 1e-10 * want)


def test_pieces_below_keep_order_and_drop_a_run_along_the_level():
    line = Line((0.0, 0.0), (4.0, 4.0))
    assert [(q.start, q.end) for q in pieces_below([line.reversed()], 1.0)] == [((1.0, 1.0), (0.0, 0.0))]
    zig = Polyline(np.array([[0.0, 0.0], [1.0, 2.0], [2.0, 2.0], [3.0, 0.0], [4.0, 3.0]]))
    got = pieces_below([zig], 2.0)
    # the run along r = 2 from vertex 1 to 2 is dropped; the dip to (3, 0) is one piece up to
    # where the last edge crosses r = 2 at z = 3 + 2/3 (by hand)
    assert [(q.start, q.end) for q in got[:1]] == [((0.0, 0.0), (1.0, 2.0))]
    assert len(got) == 2 and got[1].start == (2.0, 2.0)
    assert got[1].end == pytest.approx((3 + 2 / 3, 2.0), rel=1e-15)
    assert got[1].points.tolist()[1] == [3.0, 0.0]


def test_degree_out_of_range_is_refused():
    from geometry_testkit import IDENTITY
    prep = prepared([polygon([(0, 0), (1, 0), (1, 1), (0, 1)])], IDENTITY)
    with pytest.raises(ValueError, match="degree at most 3"):
        radial_area_integral(prep, [0, 0, 0, 0, 1])
    with pytest.raises(ValueError, match="degree at most 1"):
        radial_boundary_integral([Line((0.0, 0.0), (1.0, 1.0))], [0, 0, 1])
    with pytest.raises(ValueError):
        radial_area_integral(prep, [])
