"""Horizontal level volumes (axis level) against published formulas and scipy.

References: the circular segment, the horizontal cylinder (segment × length),
the spherical cap, the two 2:1 heads of a horizontal vessel (derived below
from the sphere cap), and, for general profiles, scipy.integrate.quad of the
wetted slice area along the axis, with the slice radii found by the engine's
washer code (slicing._radius_at), not by the parametrisations used here.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import sympy
from hypothesis import given, settings
from hypothesis import strategies as st

from geometry_testkit import PLACEMENT_IDS, PLACEMENTS, T, circle_loop, place_loop
from revolve.geometry.checks import prepare
from revolve.geometry.horizontal import (horizontal_levels, horizontal_pieces, segment_area,
                                         segment_area_integral, wetted_arc)
from revolve.geometry.measure import measure
from revolve.geometry.profile import Loop, Profile, Revolution
from revolve.geometry.segments import Line, Polyline, arc_from_centre, curve_from_expressions

placements = pytest.mark.parametrize("p", PLACEMENTS, ids=PLACEMENT_IDS)
ERROR_BOUND = 1e-9       # of the capacity, the accuracy the horizontal tables promise


def crc_segment(r, h):
    """CRC Standard Mathematical Tables (from memory): circular segment of height h."""
    h = min(max(h, 0.0), 2 * r)
    return r * r * math.acos((r - h) / r) - (r - h) * math.sqrt(max(2 * r * h - h * h, 0.0))


def prepared(loops, p=PLACEMENTS[0]):
    prof = Profile(loops=tuple(place_loop(l, p) for l in loops))
    return prepare(prof, p.axis), Revolution(prof, p.axis)


def cylinder(R, L):
    return Loop.from_points([(0, 0), (L, 0), (L, R), (0, R)])


def ellipsoidal_vessel(R, L):
    """A shell of radius R and length L with a 2:1 head at each end (exact quarter ellipses)."""
    a = R / 2
    h1 = curve_from_expressions(-a * sympy.cos(T), R * sympy.sin(T), 0.0, math.pi / 2)
    h2 = curve_from_expressions(L + a * sympy.sin(T), R * sympy.cos(T), 0.0, math.pi / 2)
    return Loop((h1, Line((0.0, R), (L, R)), h2, Line((L + a, 0.0), (-a, 0.0))))


# -- the circular segment ----------------------------------------------------------------

def test_segment_area_matches_crc():
    for r in (0.5, 1.0, 7.0):
        for h in np.linspace(0, 2 * r, 23):
            assert abs(float(segment_area(r, h - r)) - crc_segment(r, h)) <= 1e-14 * r * r


def test_segment_area_integral_is_an_antiderivative_checked_with_sympy():
    # F(r, y) = r³/3 acos(-y/r) + 2/3 y r √(r² - y²) - y³/3 acosh(r/|y|); dF/dr = S (sympy).
    r, y = sympy.symbols("r y", positive=True)
    for yy in (sympy.Rational(1, 3), -sympy.Rational(2, 5)):
        F = (r ** 3 / 3 * sympy.acos(-yy / r) + sympy.Rational(2, 3) * yy * r * sympy.sqrt(r ** 2 - yy ** 2)
             - yy ** 3 / 3 * sympy.acosh(r / abs(yy)))
        S = r ** 2 * sympy.acos(-yy / r) + yy * sympy.sqrt(r ** 2 - yy ** 2)
        assert sympy.simplify(sympy.diff(F, r) - S) == 0
        # The same function as ours (both are 0 at r = |y| for y < 0 and π|y|³/3 for y > 0).
        for rv in (0.45, 0.8, 1.3):
            assert abs(float(segment_area_integral(rv, float(yy))) - float(F.subs(r, rv))) <= 1e-13


def test_wetted_arc_is_the_derivative_of_the_segment():
    # d/dr S(r, y) = 2 r acos(-y/r): the wetted arc length (sympy).
    r, y = sympy.symbols("r y", positive=True)
    S = r ** 2 * sympy.acos(-y / r) + y * sympy.sqrt(r ** 2 - y ** 2)
    assert sympy.simplify(sympy.diff(S, r) - 2 * r * sympy.acos(-y / r)) == 0
    assert abs(float(wetted_arc(2.0, 0.5)) - 4 * math.acos(-0.25)) < 1e-14


# -- published formulas ---------------------------------------------------------------

@placements
def test_horizontal_cylinder_is_segment_times_length(p):
    R, L = 0.6, 2.4
    prep, rev = prepared([cylinder(R, L)], p)
    h = np.linspace(0, 2 * R, 41)
    res = horizontal_levels(prep, h)
    cap = math.pi * R * R * L
    for hh, v, a in zip(h, res.volume, res.wetted_area):
        # CRC (from memory): horizontal cylinder V = L · (circular segment area)
        assert abs(v - L * crc_segment(R, hh)) <= 1e-13 * cap
        # wetted: the arc 2R acos((R-h)/R) along L, plus both flat ends (two segments).
        # At the very top and bottom the dry (or wet) strip is 2√(2Rδ) wide for a depth δ
        # short of full, so placing the drawing (a rounding of δ ≈ 1e-16 R) moves the area by
        # about 1e-8 of it there; elsewhere it agrees to rounding.
        wet = L * 2 * R * math.acos((R - hh) / R) + 2 * crc_segment(R, hh)
        edge = 0 < hh < 2 * R
        assert abs(a - wet) <= (1e-13 if edge or p.identity else 1e-7) * (2 * math.pi * R * L)


@placements
def test_ball_lying_is_a_spherical_cap(p):
    R = 1.3
    arc = arc_from_centre((R, 0.0), (-R, 0.0), (0.0, 0.0), clockwise=False)
    prep, rev = prepared([Loop((arc, Line((-R, 0.0), (R, 0.0))))], p)
    h = np.array([0.0, 0.01, 0.4, 1.3, 2.2, 2.6])
    res = horizontal_levels(prep, h)
    for hh, v, a in zip(h, res.volume, res.wetted_area):
        # CRC (from memory): spherical cap V = π h² (3r − h)/3, curved area 2 π r h
        # (to 1e-12 of the ball's volume and surface: the tables' accuracy is of the capacity)
        assert abs(v - math.pi * hh * hh * (3 * R - hh) / 3) <= 1e-12 * 4 / 3 * math.pi * R ** 3
        assert abs(a - 2 * math.pi * R * hh) <= 1e-12 * 4 * math.pi * R * R


@placements
def test_two_ellipsoidal_heads_of_a_horizontal_vessel(p):
    # Both 2:1 heads together are an ellipsoid with semi-axes R, R (radial) and R/2 (along the
    # axis): the ball of radius R squeezed by 1/2 along the axis. Lying with the axis level,
    # the depth is measured across the axis, so every slice parallel to the axis keeps its
    # depth and halves its length: V = ½ · π h² (3R − h)/3 = π h² (3R − h)/6.
    # Together with the shell: V = L · segment(h) + π h² (3R − h)/6 (CRC for both parts).
    R, L = 600.0, 2400.0
    prep, rev = prepared([ellipsoidal_vessel(R, L)], p)
    cap = measure(rev, symbolic=False).volume
    h = np.linspace(0, 2 * R, 61)
    res = horizontal_levels(prep, h)
    want = np.array([L * crc_segment(R, x) + math.pi * x * x * (3 * R - x) / 6 for x in h])
    assert np.max(np.abs(res.volume - want)) <= 1e-12 * cap
    assert abs(res.volume[-1] / cap - 1) <= 1e-12      # last row = capacity
    assert np.all(np.diff(res.volume) > 0)
    assert np.max(res.error) <= ERROR_BOUND * cap


# -- against scipy.integrate.quad for general profiles -------------------------------------

def _scipy_reference(prep, depth):
    """∫ Σ ± S(r_i(z), y) dz by scipy quad, with radii from the engine's washer code."""
    from scipy.integrate import quad

    from revolve.geometry.slicing import _radius_at, monotone_pieces

    factors = prep.loop_factors
    pieces = []
    k = 0
    for segs, closed in zip(prep.paths, prep.closed):
        for s in segs:
            pieces += monotone_pieces(s, factors[k])
        k += 1
    r_max = max(float(_radius_at(pc, np.array([z]))[0]) for pc in pieces
                for z in np.linspace(min(pc.z_from, pc.z_to), max(pc.z_from, pc.z_to), 201))
    y = depth - r_max

    def slice_area(z):
        total = 0.0
        for pc in pieces:
            lo, hi = min(pc.z_from, pc.z_to), max(pc.z_from, pc.z_to)
            if lo <= z <= hi:
                r = float(_radius_at(pc, np.array([z]))[0])
                direction = 1.0 if pc.z_to > pc.z_from else -1.0
                total += -direction * pc.factor * float(segment_area(r, y))
        return total

    breaks = sorted(set([pc.z_from for pc in pieces] + [pc.z_to for pc in pieces]))
    return abs(sum(quad(slice_area, a, b, epsabs=0.0, epsrel=1e-13, limit=400)[0]
                   for a, b in zip(breaks[:-1], breaks[1:])))


def torispherical_cone_vessel(hole=False):
    """A torispherical head (crown D, knuckle 10 % D), a shell, a cone with a knuckle."""
    D, L = 1000.0, 1500.0
    R, crown, knuckle = D / 2, D, 0.1 * D
    uc = -math.sqrt((crown - knuckle) ** 2 - (R - knuckle) ** 2)
    depth = crown + uc
    ck = (0.0, R - knuckle)
    n = math.hypot(ck[0] - uc, ck[1])
    join = (uc + crown * (ck[0] - uc) / n, crown * ck[1] / n)
    crown_arc = arc_from_centre((-depth, 0.0), (-join[0], join[1]), (-uc, 0.0), clockwise=True)
    knuckle_arc = arc_from_centre((-join[0], join[1]), (0.0, R), (0.0, R - knuckle), clockwise=True)
    a, k2 = math.radians(30), 50.0
    kk = (L + k2 * math.sin(a), R - k2 + k2 * math.cos(a))
    cone_knuckle = arc_from_centre((L, R), kk, (L, R - k2), clockwise=True)
    apex = (kk[0] + kk[1] / math.tan(a), 0.0)
    loops = [Loop((crown_arc, knuckle_arc, Line((0.0, R), (L, R)), cone_knuckle, Line(kk, apex),
                   Line(apex, (-depth, 0.0))))]
    if hole:   # a heating coil: a torus tube inside the liquid space
        loops.append(circle_loop(700.0, 300.0, 40.0))
    return loops


@pytest.mark.parametrize("hole", [False, True], ids=["plain", "with a coil"])
def test_general_profile_against_scipy_quad(hole):
    prep, rev = prepared(torispherical_cone_vessel(hole))
    cap = measure(rev, symbolic=False).volume
    depths = [0.5, 37.0, 260.0, 340.0, 500.0, 660.0, 740.0, 999.0]
    res = horizontal_levels(prep, depths)
    for d, v in zip(depths, res.volume):
        ref = _scipy_reference(prep, d)
        assert abs(v - ref) <= ERROR_BOUND * cap, (d, v, ref)
    assert np.max(res.error) <= ERROR_BOUND * cap
    full = horizontal_levels(prep, [1000.0])
    assert abs(full.volume[0] / cap - 1) <= 1e-12
    assert abs(full.wetted_area[0] / measure(rev, symbolic=False).surface_total - 1) <= 1e-12


def test_curve_with_a_vertical_tangent_at_its_end():
    # A ball drawn as the curve y = √(R² − x²) (x from R to −R): the derivative is infinite at
    # both ends, where the curve meets the axis. CRC (from memory): spherical cap.
    R = 1.0
    c = curve_from_expressions(T, sympy.sqrt(R * R - T * T), R, -R)
    prep, rev = prepared([Loop((c, Line((-R, 0.0), (R, 0.0))))])
    h = np.array([0.2, 1.0, 1.9])
    res = horizontal_levels(prep, h)
    for hh, v in zip(h, res.volume):
        assert abs(v - math.pi * hh * hh * (3 * R - hh) / 3) <= ERROR_BOUND * 4 / 3 * math.pi


def test_pieces_keep_whole_arcs_and_quarters():
    R = 1.0
    arc = arc_from_centre((R, 0.0), (-R, 0.0), (0.0, 0.0), clockwise=False)
    pc = horizontal_pieces(prepare(Profile(loops=(Loop((arc, Line((-R, 0.0), (R, 0.0)))),)),
                                   PLACEMENTS[0].axis))
    arcs = next(t for t in pc.tables if hasattr(t, "arc"))
    assert arcs.whole.size == 1 and arcs.quarters.tolist() == [[0, 2]]
    assert pc.r_max == 1.0 and pc.length == 2.0


# -- properties ------------------------------------------------------------------------

@settings(max_examples=25, deadline=None)
@given(st.floats(0.2, 3.0), st.one_of(st.just(0.0), st.floats(0.01, 5.0)), st.floats(0.05, 0.9),
       st.lists(st.floats(0.0, 1.0), min_size=3, max_size=12))
def test_volume_never_decreases_with_depth(R, L, bulge, fractions):
    # A shell with a spherical-cap head at each end (cap height bulge·R): any proportions.
    h = bulge * R
    rho = (R * R + h * h) / (2 * h)     # the sphere through the cap's rim and pole
    head1 = arc_from_centre((-h, 0.0), (0.0, R), (rho - h, 0.0), clockwise=True)
    head2 = arc_from_centre((L, R), (L + h, 0.0), (L - rho + h, 0.0), clockwise=True)
    shell = (Line((0.0, R), (L, R)),) if L > 0 else ()
    segs = (head1,) + shell + (head2, Line((L + h, 0.0), (-h, 0.0)))
    prep, rev = prepared([Loop(segs)])
    cap = measure(rev, symbolic=False).volume
    depths = np.sort(np.array(fractions) * 2 * R)
    res = horizontal_levels(prep, np.append(depths, 2 * R))
    assert np.all(np.diff(res.volume) >= -ERROR_BOUND * cap)
    assert abs(res.volume[-1] / cap - 1) <= 1e-12
    assert np.all(res.volume >= -ERROR_BOUND * cap) and np.all(res.volume <= cap * (1 + 1e-12))


# -- polylines: one array, the same tables as its edges drawn as lines ----------------------

def _outline(points, p, as_polyline):
    pts = [p.point(float(z), float(r)) for z, r in points]
    if as_polyline:
        return Profile(loops=(Loop((Polyline(np.array(pts + [pts[0]], dtype=float)),)),))
    return Profile(loops=(Loop(tuple(Line(a, b) for a, b in zip(pts, pts[1:] + pts[:1]))),))


def surveyed_wall(n=300, seed=3):
    """A lying tank drawn as a dense outline: ends on the axis, a slightly uneven shell,
    steep cones at the ends and a nearly flat one (quadrature) in the middle."""
    rng = np.random.default_rng(seed)
    z = np.linspace(0.0, 20.0, n)
    r = 4.0 + 0.05 * np.sin(z) + 0.002 * rng.standard_normal(n)
    r[n // 2] = r[n // 2 - 1] + 1e-5             # a cone steeper than CLOSED_FORM_SLOPE
    return [(0.0, 0.0), (-1.0, 2.0)] + list(zip(z.tolist(), r.tolist())) + [(21.0, 2.0), (20.0, 0.0)]


@placements
def test_polyline_gives_the_tables_of_its_edges_as_lines(p):
    points = surveyed_wall()
    poly = prepare(_outline(points, p, True), p.axis)
    lines = prepare(_outline(points, p, False), p.axis)
    assert [s.kind for s in poly.paths[0]] == ["polyline"]
    depths = np.concatenate([np.linspace(0.0, 8.2, 61), [4.0, 8.0 - 1e-9]])
    a, b = horizontal_levels(poly, depths), horizontal_levels(lines, depths)
    assert horizontal_pieces(poly).r_max == horizontal_pieces(lines).r_max
    assert np.max(np.abs(a.volume - b.volume)) <= 1e-12 * float(b.volume.max())
    assert np.max(np.abs(a.wetted_area - b.wetted_area)) <= 1e-12 * float(b.wetted_area.max())


@placements
def test_polyline_cylinder_is_segment_times_length(p):
    # A cylinder of radius 2 and length 5, its shell drawn with 50 collinear vertices.
    R, L = 2.0, 5.0
    points = [(0.0, 0.0)] + [(float(z), R) for z in np.linspace(0.0, L, 50)] + [(L, 0.0)]
    prep = prepare(_outline(points, p, True), p.axis)
    h = np.array([0.0, 0.3, 1.0, 2.0, 3.7, 4.0])
    res = horizontal_levels(prep, h)
    for hh, v, a in zip(h, res.volume, res.wetted_area):
        # CRC (from memory): horizontal cylinder V = L · (circular segment area); the wetted
        # shell is L times the wetted arc 2 R acos((R − h)/R), plus both wetted end segments.
        assert abs(v - L * crc_segment(R, hh)) <= 1e-12 * math.pi * R * R * L
        # At the very top and bottom a placed drawing's rounding moves the area by about 1e-8
        # of it (see test_horizontal_cylinder_is_segment_times_length).
        want = L * 2 * R * math.acos((R - hh) / R) + 2 * crc_segment(R, hh)
        edge = 0 < hh < 2 * R
        tol = 1e-12 if edge or p.identity else 1e-7
        assert abs(a - want) <= tol * (2 * math.pi * R * L + 2 * math.pi * R * R)


# -- many shallow arcs: the series about a group's middle radius ----------------------------

def ball_of_arcs(R, n):
    """A ball of radius R: its half circle drawn as n arcs about the same centre."""
    a = np.linspace(0.0, math.pi, n + 1)
    pts = [(R * math.cos(t), R * math.sin(t)) for t in a]
    pts[0], pts[-1] = (R, 0.0), (-R, 0.0)
    arcs = tuple(arc_from_centre(p, q, (0.0, 0.0), clockwise=False) for p, q in zip(pts, pts[1:]))
    return Loop(arcs + (Line((-R, 0.0), (R, 0.0)),))


@pytest.mark.parametrize("p", PLACEMENTS[:2], ids=PLACEMENT_IDS[:2])
def test_ball_of_many_arcs_is_a_spherical_cap(p):
    # 400 arcs: those near the equator are shallow in r and go through the series.
    R = 1.5
    prep, rev = prepared([ball_of_arcs(R, 400)], p)
    h = np.concatenate([np.linspace(0.0, 2 * R, 101), [1e-9, R - 1e-9, 2 * R - 1e-9]])
    res = horizontal_levels(prep, h)
    cap = 4.0 / 3.0 * math.pi * R ** 3
    for hh, v, a, e in zip(h, res.volume, res.wetted_area, res.error):
        # CRC (from memory): spherical cap V = π h² (3R − h)/3, curved area 2π R h; the
        # flat face on the axis has no area
        assert abs(v - math.pi * hh * hh * (3 * R - hh) / 3) <= 1e-12 * cap, hh
        assert abs(a - 2 * math.pi * R * hh) <= 1e-11 * 4 * math.pi * R * R, hh
        assert e <= ERROR_BOUND * cap


def test_series_and_piece_by_piece_agree(monkeypatch):
    # A lying shell of 300 shallow arcs (a corrugated wall) with a ring of 60 shallow arcs
    # (a coil, hole) inside: the same table by the series and by quadrature piece by piece.
    import revolve.geometry.horizontal as horizontal

    L, R, n = 30.0, 4.0, 300
    z = np.linspace(0.0, L, n + 1)
    wall = tuple(arc_from_centre((float(a), R), (float(b), R), (0.5 * (a + b), R - 0.6),
                                 clockwise=True) for a, b in zip(z, z[1:]))
    shell = Loop((Line((0.0, 0.0), (0.0, R)),) + wall + (Line((L, R), (L, 0.0)), Line((L, 0.0), (0.0, 0.0))))
    a = np.linspace(0.0, -2 * math.pi, 61)         # clockwise: a hole
    ring = [(15.0 + 0.3 * math.cos(t), 2.0 + 0.3 * math.sin(t)) for t in a]
    ring[-1] = ring[0]
    coil = Loop(tuple(arc_from_centre(p, q, (15.0, 2.0), clockwise=True)
                      for p, q in zip(ring, ring[1:])))
    prep, rev = prepared([shell, coil])
    depths = np.linspace(0.0, 2 * horizontal_pieces(prep).r_max, 57)
    calls = []
    series = horizontal.segment_taylor
    monkeypatch.setattr(horizontal, "segment_taylor", lambda c, y, k: calls.append(c.size) or series(c, y, k))
    fast = horizontal_levels(prep, depths)
    assert sum(calls) >= 40          # the series did take most levels of the corrugated wall
    monkeypatch.setattr(horizontal, "SERIES_MIN_PIECES", 10 ** 9)
    slow = horizontal_levels(prep, depths)
    cap = measure(rev, symbolic=False).volume
    assert np.max(np.abs(fast.volume - slow.volume)) <= 1e-12 * cap
    assert np.max(np.abs(fast.wetted_area - slow.wetted_area)) <= 1e-12 * float(slow.wetted_area.max())
    assert abs(fast.volume[-1] / cap - 1) <= 1e-12


def test_series_of_curves_and_piece_by_piece_agree(monkeypatch):
    # A lying shell whose wall is 24 shallow curves r = R + 0.002 sin(2π (z - z_k)) (one wave
    # each, so r turns back inside each): parametric rows through the series and without it.
    import revolve.geometry.horizontal as horizontal

    R, n = 3.0, 24
    wall = tuple(curve_from_expressions(T, R + 0.002 * sympy.sin(2 * sympy.pi * (T - k)),
                                        float(k), float(k + 1)) for k in range(n))
    loop = Loop((Line((0.0, 0.0), (0.0, R)),) + wall + (Line((n, R), (n, 0.0)), Line((n, 0.0), (0.0, 0.0))))
    prep, rev = prepared([loop])
    depths = np.linspace(0.0, 2 * horizontal_pieces(prep).r_max, 41)
    calls = []
    series = horizontal.segment_taylor
    monkeypatch.setattr(horizontal, "segment_taylor", lambda c, y, k: calls.append(c.size) or series(c, y, k))
    fast = horizontal_levels(prep, depths)
    assert sum(calls) >= 30
    monkeypatch.setattr(horizontal, "SERIES_MIN_PIECES", 10 ** 9)
    slow = horizontal_levels(prep, depths)
    cap = measure(rev, symbolic=False).volume
    assert np.max(np.abs(fast.volume - slow.volume)) <= 1e-11 * cap
    assert np.max(np.abs(fast.wetted_area - slow.wetted_area)) <= 1e-11 * float(slow.wetted_area.max())
    assert np.max(fast.error) <= ERROR_BOUND * cap
    assert abs(fast.volume[-1] / cap - 1) <= 1e-12
