"""Clipping a section at an axial level, and vertical level volumes, against outside references.

Each solid is drawn in the frame of its axis and placed in the sketch several
ways (geometry_testkit placements), so the frame mapping is exercised too.
Three computations are compared with each other and with published formulas:
the clipped section through Pappus (clip_section + clipped_volume), the
vectorised table (vertical_levels), and the engine's washer cross-check run
on the clipped section (an independent slicing method).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st

from geometry_testkit import (PLACEMENT_IDS, PLACEMENTS, T, assert_rel, circle_loop, place_loop,
                              polygon, reverse_loop)
from revolve.geometry.checks import prepare
from revolve.geometry.clipping import (CUT_FACE, clip_section, clipped_volume,
                                       clipped_wetted_area,
                                       vertical_levels)
from revolve.geometry.profile import Loop, Profile
from revolve.geometry.segments import (Arc, Curve, Line, Polyline, arc_from_centre,
                                       curve_from_expressions)
from revolve.geometry.slicing import washer_volume

TOL = 1e-12
placements = pytest.mark.parametrize("p", PLACEMENTS, ids=PLACEMENT_IDS)


def prepared(loops, p):
    prof = Profile(loops=tuple(place_loop(l, p) for l in loops))
    return prepare(prof, p.axis)


def ball(r):
    """A ball of radius r: the upper half circle from z = r to z = -r, closed on the axis."""
    arc = arc_from_centre((r, 0.0), (-r, 0.0), (0.0, 0.0), clockwise=False, face="sphere")
    return Loop((arc, Line((-r, 0.0), (r, 0.0), face="axis")))


def three_ways(prep, level):
    """Volume below ``level`` by the clipped section, the vectorised table and washers."""
    c = clip_section(prep, level)
    a = clipped_volume(c)
    b = float(vertical_levels(prep, [level]).volume[0])
    # (the washers read a polyline's edges as lines until slicing takes polylines)
    w = washer_volume(c.prepared, c.factors, 2 * math.pi)[0] \
        if c.prepared.paths else 0.0
    return a, b, w, c


# -- published formulas ----------------------------------------------------------------

@placements
@pytest.mark.parametrize("h", [0.0, 0.3, 1.0, 1.7, 2.0])
def test_ball_below_a_level_is_a_spherical_cap(p, h):
    r = 1.0
    prep = prepared([ball(r)], p)
    level = -r + h   # z measured from the centre; the liquid fills from z = -r up
    for got in three_ways(prep, level)[:3]:
        # CRC Standard Mathematical Tables (from memory): spherical cap V = π h² (3r − h)/3
        assert_rel(got, math.pi * h * h * (3 * r - h) / 3, TOL, f"cap h={h}")


@placements
@pytest.mark.parametrize("h", [0.25, 1.0, 1.75])
def test_wetted_area_of_a_spherical_cap(p, h):
    r = 1.0
    prep = prepared([ball(r)], p)
    c = clip_section(prep, -r + h)
    # CRC (from memory): curved area of a spherical cap 2 π r h
    assert_rel(clipped_wetted_area(c), 2 * math.pi * r * h, TOL, "cap area")
    assert_rel(float(vertical_levels(prep, [-r + h]).wetted_area[0]), 2 * math.pi * r * h, TOL,
               "cap area, table")


@placements
def test_cone_point_down(p):
    # A cone of radius 2 and height 3, point at z = 0: V(h) = π (2h/3)² h/3.
    cone = polygon([(0, 0), (3, 2), (3, 0)])
    prep = prepared([cone], p)
    for h in (0.5, 1.5, 3.0):
        r = 2 * h / 3
        for got in three_ways(prep, h)[:3]:
            # CRC (from memory): right circular cone V = π r² h/3
            assert_rel(got, math.pi * r * r * h / 3, TOL, f"cone h={h}")
        c = clip_section(prep, h)
        top = math.pi * r * r if h == 3.0 else 0.0   # the flat top, touched when full
        # CRC (from memory): lateral area π r √(r² + h²)
        assert_rel(clipped_wetted_area(c), math.pi * r * math.sqrt(r * r + h * h) + top, TOL,
                   "cone lateral")


@placements
def test_frustum_with_a_bore_and_any_direction(p):
    # A ring whose outside is a frustum (r 3 -> 2 over z 0..4) with a bore of radius 1,
    # drawn clockwise: the washer between the frustum and the bore.
    ring = reverse_loop(polygon([(0, 1), (4, 1), (4, 2), (0, 3)]))
    prep = prepared([ring], p)
    h = 2.5
    R_top = 3 - h / 4
    # CRC (from memory): frustum V = π h (R² + R r + r²)/3, minus the bore π 1² h
    want = math.pi * h * (9 + 3 * R_top + R_top ** 2) / 3 - math.pi * h
    for got in three_ways(prep, h)[:3]:
        assert_rel(got, want, TOL, "frustum ring")


@placements
def test_hole_inside_the_liquid_space(p):
    # A cylinder r <= 3, z in 0..6, with a torus hole (tube radius 0.5 about r = 2, z = 3).
    outer = polygon([(0, 0), (6, 0), (6, 3), (0, 3)])
    hole = circle_loop(3.0, 2.0, 0.5)
    prep = prepared([outer, hole], p)
    full = three_ways(prep, 6.0)
    # CRC (from memory): torus V = 2 π² R r²; cylinder π r² h
    want = math.pi * 9 * 6 - 2 * math.pi ** 2 * 2 * 0.25
    for got in full[:3]:
        assert_rel(got, want, TOL, "cylinder minus torus")
    half = three_ways(prep, 3.0)
    for got in half[:3]:
        assert_rel(got, math.pi * 9 * 3 - math.pi ** 2 * 2 * 0.25, TOL, "half the torus")


@placements
def test_paraboloid_dish_is_clipped_by_root_finding(p):
    # A dish r² = 2 z (z = r²/2 as a curve x = t²/2, y = t): V(h) = π r² h/2 with r² = 2h.
    dish = curve_from_expressions(T ** 2 / 2, T, 0.0, 2.0)
    loop = Loop((dish, Line((2.0, 2.0), (2.0, 0.0)), Line((2.0, 0.0), (0.0, 0.0))))
    prep = prepared([loop], p)
    for h in (0.3, 1.1, 2.0):
        c = clip_section(prep, h)
        kinds = [s.kind for s in c.prepared.paths[0]]
        assert "curve" in kinds
        for got in three_ways(prep, h)[:3]:
            # CRC (from memory): paraboloid of revolution V = π r² h/2
            assert_rel(got, math.pi * 2 * h * h / 2, 1e-12, f"paraboloid h={h}")
        # CRC (from memory): lateral area π r/(6h²) [(r² + 4h²)^{3/2} − r³]
        r = math.sqrt(2 * h)
        lateral = math.pi * r / (6 * h * h) * ((r * r + 4 * h * h) ** 1.5 - r ** 3)
        top = math.pi * 2 * h if h == 2.0 else 0.0   # the flat top, touched when full
        assert_rel(clipped_wetted_area(c), lateral + top, 1e-12, "paraboloid lateral")
        assert_rel(float(vertical_levels(prep, [h]).wetted_area[0]), lateral + top, 1e-12,
                   "paraboloid lateral, table")


# -- what clipping builds ---------------------------------------------------------------

def test_clipped_arcs_stay_arcs_and_curves_keep_their_expressions():
    r = 2.0
    arc = arc_from_centre((r, 0.0), (-r, 0.0), (0.0, 0.0), clockwise=False)
    loop = Loop((arc, Line((-r, 0.0), (r, 0.0))))
    c = clip_section(prepare(Profile(loops=(loop,)), PLACEMENTS[0].axis), 0.5)
    arcs = [s for s in c.prepared.paths[0] if isinstance(s, Arc)]
    assert arcs and all(a.centre == (0.0, 0.0) and abs(a.radius - r) < 1e-15 for a in arcs)
    cuts = [s for s, is_cut in zip(c.prepared.paths[0], c.cut[0]) if is_cut]
    assert len(cuts) == 1 and cuts[0].face == CUT_FACE
    assert cuts[0].start[0] == 0.5 and cuts[0].end[0] == 0.5
    dish = curve_from_expressions(T ** 2 / 2, T, 0.0, 2.0)
    loop = Loop((dish, Line((2.0, 2.0), (2.0, 0.0)), Line((2.0, 0.0), (0.0, 0.0))))
    c = clip_section(prepare(Profile(loops=(loop,)), PLACEMENTS[0].axis), 0.5)
    curve = next(s for s in c.prepared.paths[0] if isinstance(s, Curve))
    assert curve.x_expr == dish.x_expr and curve.y_expr == dish.y_expr
    assert abs(curve.t_end - 1.0) < 1e-15   # z = t²/2 = 0.5 at t = 1


def test_levels_through_vertices_and_a_flat_face_count_once():
    # A stepped bore: r = 2 for z in 0..1, r = 1 for z in 1..2 (a flat face at z = 1).
    step = polygon([(0, 0), (0, 2), (1, 2), (1, 1), (2, 1), (2, 0)])
    prep = prepare(Profile(loops=(step,)), PLACEMENTS[0].axis)
    for level, want in ((1.0, math.pi * 4), (2.0, math.pi * 5), (0.0, 0.0)):
        for got in three_ways(prep, level)[:3]:
            assert abs(got - want) <= TOL * math.pi * 5
    # The flat face at the level is wetted (the liquid touches it): 2π·2·1 + base 4π + ring 3π
    area = float(vertical_levels(prep, [1.0]).wetted_area[0])
    assert_rel(area, 2 * math.pi * 2 + 4 * math.pi + 3 * math.pi, TOL, "stepped area")
    assert_rel(clipped_wetted_area(clip_section(prep, 1.0)), area, TOL, "stepped area, clipped")
    # Empty, the level at the flat bottom: the bottom disc (CRC, from memory: π r², r = 2) is
    # wetted, as it is a hair above (the wetted area is continuous from above); below it,
    # nothing is.
    for got in (float(vertical_levels(prep, [0.0]).wetted_area[0]),
                clipped_wetted_area(clip_section(prep, 0.0))):
        assert_rel(got, 4 * math.pi, TOL, "flat bottom at its own level")
    assert float(vertical_levels(prep, [-0.5]).wetted_area[0]) == 0.0
    assert clipped_wetted_area(clip_section(prep, -0.5)) == 0.0


def test_loop_factors_follow_direction_and_nesting():
    outer = polygon([(0, 1), (4, 1), (4, 5), (0, 5)])
    hole = polygon([(1, 2), (2, 2), (2, 3), (1, 3)])
    prep = prepare(Profile(loops=(reverse_loop(outer), hole)), PLACEMENTS[0].axis)
    assert prep.loop_factors == (-1.0, -1.0)


# -- properties ------------------------------------------------------------------------

def star_polygon(radii):
    """A star-shaped polygon about (z, r) = (0, 6), away from the axis, one vertex per radius."""
    a = np.linspace(0, 2 * np.pi, len(radii), endpoint=False)
    return polygon([(float(rr * math.cos(t)), 6.0 + float(rr * math.sin(t))) for rr, t in zip(radii, a)])


@st.composite
def star_loops(draw):
    n = draw(st.integers(5, 12))
    return star_polygon(draw(st.lists(st.floats(1.0, 4.0), min_size=n, max_size=n)))


@settings(max_examples=40, deadline=None)
@given(star_loops(), st.lists(st.floats(-4.5, 4.5), min_size=2, max_size=8))
# Found on a fresh clone: a regular octagon, its vertices at z = ±6e-17 and a level 1e-9 above
# them. Vertices within the profile's tolerance of a level were moved onto it, differently by
# the two computations (3.9e-8 apart); now no vertex moves and both agree to rounding.
@example(star_polygon([1.0] * 8), [0.0, 1e-9])
def test_volume_never_decreases_and_both_ways_agree(loop, levels):
    prep = prepare(Profile(loops=(loop,)), PLACEMENTS[0].axis)
    levels = sorted(levels)
    table = vertical_levels(prep, levels)
    assert np.all(np.diff(table.volume) >= -1e-12 * max(1.0, abs(table.volume[-1])))
    assert np.all(np.diff(table.wetted_area) >= -1e-12 * max(1.0, abs(table.wetted_area[-1])))
    full = float(vertical_levels(prep, [10.0]).volume[0])
    for lv, v in zip(levels, table.volume):
        c = clip_section(prep, lv)
        assert abs(clipped_volume(c) - v) <= 1e-11 * full
        if c.prepared.paths:   # washers on the clipped section: the independent slicing method
            assert abs(washer_volume(c.prepared, c.factors,
                                     2 * math.pi)[0] - v) <= 1e-10 * full


# -- a hair above the bottom -----------------------------------------------------------------

def tiny_depth_cases():
    """(name, prepared profile, bottom z, reference volume at height h above the bottom).

    Every shape is drawn with exactly representable numbers in the frame (identity
    placement), so the float level ``bottom + h`` has an exact height above the bottom
    (computed exactly, in mpmath) and the references can be held to rounding.
    """
    import mpmath

    ax = PLACEMENTS[0].axis
    circle_at_6 = circle_loop(0.0, 6.0, 1.0)
    dish = curve_from_expressions(T ** 2 / 2, T, 0.0, 2.0)

    def cone(h):      # CRC (from memory): right circular cone, r = 2h/3 here, V = π r² h/3
        return mpmath.pi * (2 * h / 3) ** 2 * h / 3

    def cap(h):       # CRC (from memory): spherical cap V = π h² (3r − h)/3, r = 1
        return mpmath.pi * h * h * (3 - h) / 3

    def wedge(h):     # Pappus (Stewart, from memory) on the triangle of apex (0, 6) and slope 1:
        return 2 * mpmath.pi * 6 * h * h   # area h², centroid at r = 6 (Beer & Johnston, from memory)

    def tube(h):      # Pappus on the circular segment of height h of a circle of radius 1 at r = 6:
        # CRC (from memory) A = r² acos((r − h)/r) − (r − h) √(2rh − h²); centroid at r = 6.
        return 2 * mpmath.pi * 6 * (mpmath.acos(1 - h) - (1 - h) * mpmath.sqrt(2 * h - h * h))

    def paraboloid(h):   # CRC (from memory): V = π r² h/2 with r² = 2h
        return mpmath.pi * 2 * h * h / 2

    def ring(h):      # CRC (from memory): a hollow cylinder, radii 1 and 3: V = π (3² − 1²) h
        return mpmath.pi * 8 * h

    return [
        ("cone tip on the axis", prepare(Profile(loops=(polygon([(0, 0), (3, 2), (3, 0)]),)), ax),
         0.0, cone),
        ("ball bottom on the axis", prepare(Profile(loops=(ball(1.0),)), ax), -1.0, cap),
        ("vertex away from the axis", prepare(Profile(loops=(polygon([(0, 6), (2, 8), (4, 6), (2, 4)]),)),
                                              ax), 0.0, wedge),
        ("round bottom away from the axis", prepare(Profile(loops=(circle_at_6,)), ax), -1.0, tube),
        ("curve bottom", prepare(Profile(loops=(Loop((dish, Line((2.0, 2.0), (2.0, 0.0)),
                                                      Line((2.0, 0.0), (0.0, 0.0)))),)), ax), 0.0,
         paraboloid),
        ("flat bottom", prepare(Profile(loops=(polygon([(0, 1), (2, 1), (2, 3), (0, 3)]),)), ax), 0.0,
         ring),
    ]


@pytest.mark.parametrize("exponent", range(-12, -2))
def test_tiny_depths_above_a_bottom_are_exact(exponent):
    # Once the volume was a difference of moments of the whole section (measured from its
    # middle), so a level 1e-12 above the bottom lost up to 1e-4 of its volume; now every
    # term is of the size of the part it measures.
    import mpmath

    mpmath.mp.dps = 40
    for name, prep, bottom, reference in tiny_depth_cases():
        level = bottom + 10.0 ** exponent
        h = mpmath.mpf(level) - mpmath.mpf(bottom)          # the float level's real height
        want = float(reference(h))
        table = float(vertical_levels(prep, [level]).volume[0])
        assert_rel(table, want, 1e-13, f"{name}, table, h = 1e{exponent}")
        clipped = clip_section(prep, level)
        got = clipped_volume(clipped)
        # The clipped section stores its cut points as coordinates: each may be rounded to
        # the last bit of its radius, which moves the area by at most h · ulp(r) per cut.
        r = max(abs(p[1]) for path in clipped.prepared.paths for s in path for p in (s.start, s.end))
        rounding = 2 * math.pi * r * float(h) * 2 * math.ulp(r)
        assert abs(got - want) <= 1e-13 * want + rounding, f"{name}, clipped, h = 1e{exponent}"
        if name in ("cone tip on the axis", "ball bottom on the axis", "curve bottom"):
            assert_rel(got, want, 1e-13, f"{name}, clipped, h = 1e{exponent}")


# -- polylines: one array, the same tables as its edges drawn as lines ----------------------

def _placed(points, p):
    return [p.point(float(z), float(r)) for z, r in points]


def polyline_loop(points, p=PLACEMENTS[0]):
    """The closed outline through ``points`` (frame) as one Polyline, placed by ``p``."""
    pts = _placed(points, p)
    return Loop((Polyline(np.array(pts + [pts[0]], dtype=float)),))


def line_loop(points, p=PLACEMENTS[0]):
    pts = _placed(points, p)
    return Loop(tuple(Line(a, b) for a, b in zip(pts, pts[1:] + pts[:1])))


def wavy_vessel(n=400, seed=7):
    """A vessel wall drawn as a dense outline: a flat bottom, a wavy wall, a conical roof."""
    rng = np.random.default_rng(seed)
    z = np.linspace(0.0, 10.0, n)
    r = 3.0 + 0.2 * np.sin(z * 3.0) + 0.01 * rng.standard_normal(n)
    wall = list(zip(z.tolist(), r.tolist()))
    return [(0.0, 0.0)] + wall + [(11.0, 1.0), (11.0, 0.0)]


POLYLINE_SHAPES = {
    "stepped bore": [(0, 0), (0, 2), (1, 2), (1, 1), (2, 1), (2, 0)],
    "star off the axis": [(float(r * math.cos(a)), 6.0 + float(r * math.sin(a)))
                          for r, a in zip([1.0, 3.5, 1.5, 4.0, 2.0, 3.0, 1.2],
                                          np.linspace(0, 2 * np.pi, 7, endpoint=False))],
    "wavy vessel": wavy_vessel(),
}


@placements
@pytest.mark.parametrize("shape", list(POLYLINE_SHAPES))
def test_polyline_gives_the_tables_of_its_edges_as_lines(p, shape):
    points = POLYLINE_SHAPES[shape]
    poly = prepare(Profile(loops=(polyline_loop(points, p),)), p.axis)
    lines = prepare(Profile(loops=(line_loop(points, p),)), p.axis)
    assert [s.kind for s in poly.paths[0]] == ["polyline"]
    zs = np.array([z for z, _ in points], dtype=float)
    # levels through every vertex, between them, below and above everything
    levels = np.concatenate([zs, np.linspace(zs.min() - 1, zs.max() + 1, 97)])
    a, b = vertical_levels(poly, levels), vertical_levels(lines, levels)
    full_v, full_a = float(np.abs(b.volume).max()), float(np.abs(b.wetted_area).max())
    assert np.max(np.abs(a.volume - b.volume)) <= 1e-12 * full_v
    assert np.max(np.abs(a.wetted_area - b.wetted_area)) <= 1e-12 * full_a
    for level in levels[::9]:
        cp, cl = clip_section(poly, level), clip_section(lines, level)
        # a polyline stays a few arrays, never one object per vertex
        assert all(s.kind in ("polyline", "line") for path in cp.prepared.paths for s in path)
        assert sum(len(path) for path in cp.prepared.paths) <= 4 * len(points) // 10 + 8
        assert abs(clipped_volume(cp) - clipped_volume(cl)) <= 1e-12 * full_v
        assert abs(clipped_wetted_area(cp) - clipped_wetted_area(cl)) <= 1e-12 * full_a


@placements
def test_polyline_frustum_and_cylinder(p):
    # A frustum (r 1 -> 2 over z 0..3) on a cylinder (r = 2, z 3..5), its walls drawn with
    # many collinear vertices. CRC (from memory): frustum V = π h (R² + R r + r²)/3, lateral
    # area π (R + r) √((R − r)² + h²); cylinder V = π r² h, lateral 2π r h; discs π r².
    wall = [(3.0 * t, 1.0 + t) for t in np.linspace(0, 1, 31)]
    wall += [(3.0 + 2.0 * t, 2.0) for t in np.linspace(0, 1, 21)[1:]]
    points = [(0.0, 0.0)] + wall + [(5.0, 0.0)]
    prep = prepare(Profile(loops=(polyline_loop(points, p),)), p.axis)

    def frustum(h):
        r1 = 1.0 + h / 3.0
        return math.pi * h * (1.0 + r1 + r1 * r1) / 3.0, math.pi * (1.0 + r1) * math.hypot(r1 - 1.0, h)

    hs = [0.0, 0.7, 3.0, 4.2, 5.0]
    table = vertical_levels(prep, hs)
    for h, v, area in zip(hs, table.volume, table.wetted_area):
        want_v, want_a = frustum(min(h, 3.0))
        want_a += math.pi                                   # the bottom disc, r = 1
        if h > 3.0:
            want_v += math.pi * 4.0 * (h - 3.0)
            want_a += 2 * math.pi * 2.0 * (h - 3.0)
        if h == 5.0:
            want_a += 4 * math.pi                           # the flat top, touched when full
        assert abs(v - want_v) <= 1e-12 * 70.0, h
        assert abs(area - want_a) <= 1e-12 * 70.0, h
        assert abs(clipped_volume(clip_section(prep, h)) - want_v) <= 1e-12 * 70.0, h


# -- the arcs' rows for many arcs at once keep the segment contract ------------------------------

@settings(max_examples=60, deadline=None)
@given(st.floats(-3.0, 3.0), st.floats(0.5, 3.0), st.floats(0.2, 2.0), st.floats(-7.0, 7.0),
       st.floats(0.05, 6.2), st.booleans())
@example(0.0, 1.0, 1.0, -2.5, 1.0, True)            # through the angle -π, clockwise
def test_arc_rows_follow_the_contract(cz, cr, R, a0, sweep, clockwise):
    d = -sweep if clockwise else sweep
    start = (cz + R * math.cos(a0), cr + R * math.sin(a0))
    end = (cz + R * math.cos(a0 + d), cr + R * math.sin(a0 + d))
    arc = arc_from_centre(start, end, (cz, cr), clockwise=clockwise)
    rows = type(arc).axial_level_table([arc], [1.0]).rows
    # the pieces run from the start to the end through the points where z turns back
    # (Arc.monotone_ranges and points_at), and z is monotone along each
    cuts = [b for _, b in arc.monotone_ranges(0)[:-1]]
    want = np.vstack([[arc.start], arc.points_at(cuts).reshape(-1, 2), [arc.end]])
    got = np.vstack([rows[:, 5:7], rows[-1:, 7:9]])
    assert got.shape == want.shape
    assert np.allclose(got, want, rtol=0, atol=1e-12 * (abs(cz) + abs(cr) + R))
    assert np.allclose(rows[1:, 5:7], rows[:-1, 7:9], rtol=0, atol=0)   # joined exactly
    ang = rows[:, 3:5]
    assert np.allclose(np.column_stack([cz + R * np.cos(ang[:, 0]), cr + R * np.sin(ang[:, 0])]),
                       rows[:, 5:7], rtol=0, atol=1e-12 * (abs(cz) + abs(cr) + R))


@settings(max_examples=30, deadline=None)
@given(star_loops(), st.lists(st.floats(-4.5, 4.5), min_size=1, max_size=8))
@example(star_polygon([1.0] * 8), [0.0, 1e-9])
def test_star_polyline_and_lines_agree(loop, levels):
    # the star's vertices (Loop.from_points makes one polyline of them)
    points = [tuple(q) for s in loop.segments for q in s.flatten()[:-1].tolist()]
    poly = prepare(Profile(loops=(polyline_loop(points),)), PLACEMENTS[0].axis)
    lines = prepare(Profile(loops=(line_loop(points),)), PLACEMENTS[0].axis)
    a, b = vertical_levels(poly, levels), vertical_levels(lines, levels)
    full = float(vertical_levels(lines, [10.0]).volume[0])
    assert np.max(np.abs(a.volume - b.volume)) <= 1e-12 * full
    assert np.max(np.abs(a.wetted_area - b.wetted_area)) <= 1e-12 * float(
        vertical_levels(lines, [10.0]).wetted_area[0])
    for lv in levels[:2]:
        assert abs(clipped_volume(clip_section(poly, lv)) - clipped_volume(clip_section(lines, lv))) \
            <= 1e-12 * full
