"""Tilted level tables (revolve.geometry.tilted) against outside references.

Each check names its reference beside it. The geometry of a tilt is written
here from the rotation itself (world height of a point of the vessel), not
from the module's formulas.
"""

from __future__ import annotations

import math
from pathlib import Path

import numpy as np
import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st
from scipy.integrate import dblquad, quad

from revolve.errors import RevolveError
from revolve.formats import load_profile
from revolve.geometry.checks import prepare
from revolve.geometry.profile import Axis, Loop, Profile
from revolve.geometry.tilted import (tilted_crosscheck, tilted_level_for_volume, tilted_levels,
                                     tilted_pieces, tilted_range)
from revolve.jobs.levels import liquid_space, table_at_levels as level_table

ROOT = Path(__file__).resolve().parents[2]
VESSELS = ("vessel-brew-kettle.toml", "vessel-diesel-day-tank.toml", "vessel-rainwater-tank.toml")


def _cylinder(radius: float, length: float, along: str = "x"):
    """A cylinder with flat ends: the rectangle between the axis and the wall."""
    if along == "x":
        pts = [(0, 0), (length, 0), (length, radius), (0, radius)]
        return prepare(Profile(loops=(Loop.from_points(pts),)), Axis.x())
    pts = [(0, 0), (radius, 0), (radius, length), (0, length)]
    return prepare(Profile(loops=(Loop.from_points(pts),)), Axis.y())


def _space(name, orientation):
    doc = load_profile(str(ROOT / "profiles" / name))
    return liquid_space(doc.profile, doc.axis, orientation=orientation)


# -- references ------------------------------------------------------------------------------

def _horizontal_reference(R, L, tilt_deg, h, z_gauge):
    """scipy dblquad over the liquid region of a horizontal cylinder with flat ends, tilted.

    The vessel is turned about the horizontal axis across it by α, raising the
    end at larger z: a point at (w up, z along) has world height
    ``w cos α + z sin α``. The gauge reference is the bottom line (w = −R) at
    z = z_gauge, so the liquid surface is at height ``c = −R cos α + z_gauge
    sin α + h``. Across each slice the liquid holds the chords ``2 √(R² − w²)``
    for ``w`` below the surface; with ``w = −R cos θ`` the integrand is
    ``2 R² sin² θ``, smooth. Reference: scipy.integrate.dblquad.
    """
    a = math.radians(tilt_deg)
    c = -R * math.cos(a) + z_gauge * math.sin(a) + h

    def theta_top(z):
        w_top = (c - z * math.sin(a)) / math.cos(a)
        return math.acos(min(1.0, max(-1.0, -w_top / R)))

    v, _ = dblquad(lambda t, z: 2.0 * R * R * math.sin(t) ** 2, 0.0, L, 0.0, theta_top,
                   epsabs=1e-13, epsrel=1e-13)
    return v


def _vertical_reference(R, L, tilt_deg, h):
    """scipy dblquad over the liquid region of a vertical cylinder with flat ends, leaning.

    The top leans by α toward −w: a point at (w across, z up the axis) has world
    height ``w sin α + z cos α``; the gauge point is the bottom centre (w = 0,
    z = 0), so the surface is at height ``h``. Reference: scipy.integrate.dblquad.
    """
    a = math.radians(tilt_deg)

    def theta_top(z):
        w_top = (h - z * math.cos(a)) / math.sin(a)
        return math.acos(min(1.0, max(-1.0, -w_top / R)))

    v, _ = dblquad(lambda t, z: 2.0 * R * R * math.sin(t) ** 2, 0.0, L, 0.0, theta_top,
                   epsabs=1e-13, epsrel=1e-13)
    return v


def _crc_segment(r, height):
    """Circular segment of a given height; CRC Standard Mathematical Tables (from memory)."""
    height = min(max(height, 0.0), 2 * r)
    return r * r * math.acos((r - height) / r) - (r - height) * math.sqrt(
        max(2 * r * height - height * height, 0.0))


# -- tilted horizontal cylinder ----------------------------------------------------------------

@pytest.mark.parametrize("tilt", [0.5, 3.0, -7.0, 25.0])
def test_tilted_horizontal_cylinder_against_scipy_dblquad(tilt):
    # reference: scipy.integrate.dblquad over the liquid region (see _horizontal_reference)
    R, L = 0.8, 5.0
    prep = _cylinder(R, L)
    lo, hi = tilted_range(prep, tilt, "horizontal")
    levels = np.linspace(lo, hi, 13)[1:-1]
    v, err, _ = tilted_levels(prep, levels, tilt, "horizontal")
    ref = np.array([_horizontal_reference(R, L, tilt, h, L / 2) for h in levels])
    cap = math.pi * R * R * L
    assert np.max(np.abs(v - ref)) <= 1e-12 * cap
    assert np.max(err) <= 1e-11 * cap


def test_tilted_horizontal_cylinder_gauge_at_an_end_against_scipy_dblquad():
    # reference: scipy.integrate.dblquad; the gauge point at the low end (z = 0)
    R, L, tilt = 1.0, 4.0, 4.0
    prep = _cylinder(R, L)
    levels = np.array([0.05, 0.4, 1.0, 1.7])
    v = tilted_levels(prep, levels, tilt, "horizontal", gauge_point=0.0)[0]
    ref = np.array([_horizontal_reference(R, L, tilt, h, 0.0) for h in levels])
    assert np.max(np.abs(v - ref)) <= 1e-12 * math.pi * R * R * L


def test_tilted_horizontal_cylinder_wetted_area_against_crc_arc_and_segments():
    # references: wetted wall = ∫ R·(central angle) dz, arc length R θ (CRC, from memory),
    # integrated by scipy.integrate.quad; each flat end wets a circular segment (CRC, from memory)
    R, L, tilt, h = 1.0, 6.0, 5.0, 0.9
    a = math.radians(tilt)
    prep = _cylinder(R, L)
    c = -R * math.cos(a) + (L / 2) * math.sin(a) + h

    def depth(z):       # height of the segment: R + chord position across the slice
        return R + (c - z * math.sin(a)) / math.cos(a)

    def angle(z):
        return 2.0 * math.acos(min(1.0, max(-1.0, (R - depth(z)) / R)))

    kinks = [z for z in ((c + R * math.cos(a)) / math.sin(a), (c - R * math.cos(a)) / math.sin(a))
             if 0.0 < z < L]                    # where the chord leaves the circle
    wall, _ = quad(lambda z: R * angle(z), 0.0, L, epsabs=1e-13, epsrel=1e-13, limit=200,
                   points=kinks or None)
    ends = _crc_segment(R, depth(0.0)) + _crc_segment(R, depth(L))
    wet = tilted_levels(prep, [h], tilt, "horizontal")[2][0]
    assert abs(wet - (wall + ends)) <= 1e-12 * (2 * math.pi * R * L)


def test_ungula_when_the_liquid_touches_one_end_only():
    # published: cylindrical wedge (ungula) cut by a plane through a diameter of its base,
    # height H at the far side: V = (2/3) r² H; CRC Standard Mathematical Tables (from memory).
    # Lying cylinder tilted by α, the surface through the centre of the low end (z = 0): the
    # liquid is an ungula on the lower half of that end, reaching H = r / tan α along the bottom.
    r, L, tilt = 1.0, 10.0, 20.0
    a = math.radians(tilt)
    H = r / math.tan(a)
    assert H < L                                 # the liquid touches only the low end
    prep = _cylinder(r, L)
    h = r * math.cos(a)                          # plumb from the bottom line to the end's centre
    v = tilted_levels(prep, [h], tilt, "horizontal", gauge_point=0.0)[0][0]
    assert abs(v - 2.0 / 3.0 * r * r * H) <= 1e-12 * math.pi * r * r * L


# -- leaning vertical cylinder -----------------------------------------------------------------

@pytest.mark.parametrize("tilt", [1.0, 10.0, -30.0])
def test_leaning_vertical_cylinder_plane_across_the_shell_only(tilt):
    # geometry: a plane through the axis at axial distance s from a flat bottom, meeting only
    # the shell, cuts off π r² s (half a turn about that axis point maps the wedge above the
    # mid-plane onto the one below it); s = h / cos α for the plumb level h. Cylinder
    # volume π r² s: CRC (from memory).
    R, L = 1.0, 3.0
    a = math.radians(tilt)
    prep = _cylinder(R, L, along="y")
    s = np.array([0.6, 1.2, 2.0, 2.4])
    assert np.all(s - R * math.tan(abs(a)) > 0) and np.all(s + R * math.tan(abs(a)) < L)
    v = tilted_levels(prep, s * math.cos(a), tilt, "vertical")[0]
    assert np.max(np.abs(v - math.pi * R * R * s)) <= 1e-12 * math.pi * R * R * L


def test_leaning_vertical_cylinder_across_the_bottom_against_scipy_dblquad():
    # reference: scipy.integrate.dblquad over the liquid region (see _vertical_reference)
    R, L, tilt = 1.0, 2.0, 20.0
    prep = _cylinder(R, L, along="y")
    levels = np.array([-0.2, 0.1, 0.3, 1.8, 2.1])
    v = tilted_levels(prep, levels, tilt, "vertical")[0]
    ref = np.array([_vertical_reference(R, L, tilt, h) for h in levels])
    assert np.max(np.abs(v - ref)) <= 1e-12 * math.pi * R * R * L


# -- no tilt: the existing tables ----------------------------------------------------------------

@pytest.mark.parametrize("name", VESSELS)
@pytest.mark.parametrize("orientation", ["vertical", "horizontal"])
def test_no_tilt_reproduces_the_level_tables(name, orientation):
    # the existing level tables (clipping for vertical, horizontal segments), themselves
    # checked against published formulas in tests/jobs/test_levels.py
    space = _space(name, orientation)
    levels = np.linspace(0.0, space.height, 41)
    ref = level_table(space, levels)
    v, err, wet = tilted_levels(space.prepared, levels, 0.0, orientation)
    assert np.max(np.abs(v - ref.volume)) <= 1e-9 * space.capacity
    assert np.max(np.abs(wet - ref.wetted_area)) <= 1e-8 * space.inside_area
    assert np.max(err) <= 1e-9 * space.capacity


@pytest.mark.parametrize("name", VESSELS)
@pytest.mark.parametrize("orientation", ["vertical", "horizontal"])
def test_empty_and_full_levels(name, orientation):
    # geometry: below the lowest inside point nothing, above the highest the capacity
    # (Pappus–Guldinus capacity of the liquid space, revolve.jobs.levels.liquid_space)
    space = _space(name, orientation)
    lo, hi = tilted_range(space.prepared, 2.5, orientation)
    v = tilted_levels(space.prepared, [lo - 1.0, lo, hi, hi + 1.0], 2.5, orientation)[0]
    assert v[0] == 0.0 and v[1] <= 1e-12 * space.capacity
    assert abs(v[2] - space.capacity) <= 1e-10 * space.capacity
    assert abs(v[3] - space.capacity) <= 1e-10 * space.capacity


# -- the independent cross-check agrees --------------------------------------------------------

@pytest.mark.parametrize("name", VESSELS)
def test_crosscheck_agrees_on_the_vessels(name):
    # the (z, w) chord sum of tilted_crosscheck shares no formula with tilted_levels
    for orientation in ("vertical", "horizontal"):
        space = _space(name, orientation)
        lo, hi = tilted_range(space.prepared, 3.0, orientation)
        levels = np.linspace(lo, hi, 7)
        v = tilted_levels(space.prepared, levels, 3.0, orientation)[0]
        cc = tilted_crosscheck(space.prepared, levels, 3.0, orientation, slices=800, rows=800)
        assert np.max(np.abs(cc - v)) <= 5e-5 * space.capacity


# -- the inverse ---------------------------------------------------------------------------------

def test_inverse_round_trip():
    # scipy.optimize.brentq on the forward table: the level found holds the volume asked for
    space = _space("vessel-diesel-day-tank.toml", "horizontal")
    pc = tilted_pieces(space.prepared)
    volumes = np.array([0.0, 0.01, 0.3, 0.5, 0.77, 1.0]) * space.capacity
    h = tilted_level_for_volume(space.prepared, volumes, 1.5, "horizontal", pieces=pc)
    back = tilted_levels(space.prepared, h, 1.5, "horizontal", pieces=pc)[0]
    assert np.max(np.abs(back - volumes)) <= 1e-12 * space.capacity
    assert np.all(np.diff(h) > 0)


# -- properties -------------------------------------------------------------------------------

_KETTLE = _space("vessel-brew-kettle.toml", "vertical")     # a curve, a line, an arc and a hole
_KETTLE_PIECES = tilted_pieces(_KETTLE.prepared)


@settings(max_examples=25)
@given(tilt=st.floats(-45.0, 45.0), orientation=st.sampled_from(["vertical", "horizontal"]),
       fractions=st.lists(st.floats(-0.1, 1.1), min_size=2, max_size=6))
@example(tilt=0.0, orientation="vertical", fractions=[0.0, 0.15, 0.15])
@example(tilt=45.0, orientation="horizontal", fractions=[-0.1, 1.1])
def test_volume_bounded_and_nondecreasing(tilt, orientation, fractions):
    # geometry: a liquid volume lies between 0 and the capacity (Pappus–Guldinus) and grows
    # with the level
    prep = _KETTLE.prepared
    lo, hi = tilted_range(prep, tilt, orientation, pieces=_KETTLE_PIECES)
    levels = np.sort(lo + np.array(fractions) * (hi - lo))
    v = tilted_levels(prep, levels, tilt, orientation, pieces=_KETTLE_PIECES)[0]
    cap = _KETTLE.capacity
    assert np.all(v >= -1e-12 * cap) and np.all(v <= cap * (1 + 1e-12))
    assert np.all(np.diff(v) >= -1e-12 * cap)


def test_monotone_over_a_fine_table():
    # geometry: the volume below a rising plane never shrinks
    space = _space("vessel-rainwater-tank.toml", "horizontal")
    lo, hi = tilted_range(space.prepared, 6.0, "horizontal")
    v = tilted_levels(space.prepared, np.linspace(lo, hi, 401), 6.0, "horizontal")[0]
    assert np.all(np.diff(v) >= -1e-13 * space.capacity)
    assert np.all(np.diff(v)[1:-1] > 0)


# -- bad input ---------------------------------------------------------------------------------

@pytest.mark.parametrize("tilt, orientation, levels, words", [
    (50.0, "horizontal", [0.5], "more than 45°"),
    (float("nan"), "horizontal", [0.5], "not a finite number"),
    ("steep", "vertical", [0.5], "number of degrees"),
    (1.0, "sideways", [0.5], "vertical or horizontal"),
    (1.0, "vertical", [float("nan")], "finite numbers"),
])
def test_bad_input_is_refused_in_one_sentence(tilt, orientation, levels, words):
    prep = _cylinder(1.0, 2.0)
    with pytest.raises(RevolveError) as info:
        tilted_levels(prep, levels, tilt, orientation)
    assert words in str(info.value) and "\n" not in str(info.value)


def test_inverse_refuses_volumes_outside_the_space():
    prep = _cylinder(1.0, 2.0)
    with pytest.raises(RevolveError, match="negative"):
        tilted_level_for_volume(prep, [-1.0], 2.0, "horizontal")


@pytest.mark.parametrize("orientation", ["vertical", "horizontal"])
@pytest.mark.parametrize("tilt", [3.0, -17.0, 40.0])
def test_tilted_ball_holds_a_spherical_cap(orientation, tilt):
    # published: spherical cap of depth t, V = π t² (3R − t)/3; CRC (from memory). A ball
    # turned about its centre is the same ball, so the cap depth is the plumb depth below
    # the surface of the ball's lowest point, R below the centre.
    from revolve.geometry.segments import Line, arc_from_centre

    R = 1.3
    half = arc_from_centre((R, 0.0), (-R, 0.0), (0.0, 0.0), clockwise=False)
    prep = prepare(Profile(loops=(Loop((half, Line((-R, 0.0), (R, 0.0)))),)), Axis.x())
    a = math.radians(tilt)
    # the gauge point: horizontal, the bottom line (w = -R) at the middle, height -R cos α;
    # vertical, the axis at its lowest point z = -R, height -R cos α too
    gauge_height = -R * math.cos(a)
    levels = np.linspace(-0.5, 2.8, 12)
    v = tilted_levels(prep, levels, tilt, orientation)[0]
    t = np.clip(levels + gauge_height + R, 0.0, 2 * R)
    ref = math.pi * t * t * (3 * R - t) / 3
    assert np.max(np.abs(v - ref)) <= 1e-12 * (4 / 3 * math.pi * R ** 3)


def test_tilted_tank_with_ellipsoidal_heads_against_scipy_dblquad():
    # reference: scipy.integrate.dblquad over the liquid region of the bundled diesel day tank
    # (2:1 ellipsoidal heads as curves, semi-axes 600 across and 300 along), its radius
    # written here from the ellipse: r = 600 √(1 − (u/300)²) on each head
    space = _space("vessel-diesel-day-tank.toml", "horizontal")
    R, A, L = 600.0, 300.0, 2400.0
    tilt = 1.5
    a = math.radians(tilt)

    def radius(z):
        u = -z if z < 0 else (z - L if z > L else 0.0)
        return R * math.sqrt(max(0.0, 1.0 - (u / A) ** 2))

    def volume(h):
        c = -R * math.cos(a) + (L / 2) * math.sin(a) + h       # gauge: bottom line, middle

        def theta_top(z):
            r = radius(z)
            if r == 0.0:
                return 0.0
            w_top = (c - z * math.sin(a)) / math.cos(a)
            return math.acos(min(1.0, max(-1.0, -w_top / r)))

        total = 0.0
        for z0, z1 in ((-A, 0.0), (0.0, L), (L, L + A)):
            part, _ = dblquad(lambda t, z: 2.0 * radius(z) ** 2 * math.sin(t) ** 2, z0, z1,
                              0.0, theta_top, epsabs=1e-6, epsrel=1e-13)
            total += part
        return total

    levels = np.array([-20.0, 5.0, 300.0, 640.0, 1190.0])
    v = tilted_levels(space.prepared, levels, tilt, "horizontal")[0]
    ref = np.array([volume(h) for h in levels])
    assert np.max(np.abs(v - ref)) <= 1e-12 * space.capacity


# -- the empty level of a vessel with dished heads ---------------------------------------------

@pytest.mark.parametrize("tilt", [0.0, 1.5, -7.0, 30.0])
def test_empty_level_of_a_leaning_vessel_with_a_hemispherical_bottom(tilt):
    # geometry (sphere, CRC from memory): a hemispherical bottom of radius R whose pole is the
    # gauge point; leaning by α, its lowest point lies R below the centre, which is R cos α
    # above the pole: the empty level is -R (1 - cos α), and the full level (the flat top's
    # highest rim point) is (R + L) cos α + R |sin α| above the pole.
    from revolve.geometry.segments import Line, arc_from_centre

    R, L = 0.6, 1.5
    bottom = arc_from_centre((0.0, 0.0), (R, R), (0.0, R), clockwise=False)
    loop = Loop((bottom, Line((R, R), (R, R + L)), Line((R, R + L), (0.0, R + L)),
                 Line((0.0, R + L), (0.0, 0.0))))
    prep = prepare(Profile(loops=(loop,)), Axis.y())
    lo, hi = tilted_range(prep, tilt, "vertical")
    a = math.radians(tilt)
    assert lo == pytest.approx(-R * (1 - math.cos(a)), abs=1e-12)
    assert hi == pytest.approx((R + L) * math.cos(a) + R * abs(math.sin(a)), rel=1e-12)


# -- walls of many pieces (arrays, several chunks of pairs and blocks of nodes) ---------------

def _polyline_cylinder(R, L, edges, along):
    """A cylinder whose wall is one polyline of ``edges`` collinear edges (a surveyed wall)."""
    from revolve.geometry.segments import Line, Polyline

    t = np.linspace(0.0, L, edges + 1)
    if along == "x":
        wall = Polyline(np.column_stack([t, np.full_like(t, R)]))
        loop = Loop((Line((0.0, 0.0), (0.0, R)), wall, Line((L, R), (L, 0.0)),
                     Line((L, 0.0), (0.0, 0.0))))
        return prepare(Profile(loops=(loop,)), Axis.x())
    wall = Polyline(np.column_stack([np.full_like(t, R), t]))
    loop = Loop((Line((0.0, 0.0), (R, 0.0)), wall, Line((R, L), (0.0, L)),
                 Line((0.0, L), (0.0, 0.0))))
    return prepare(Profile(loops=(loop,)), Axis.y())


def test_many_edge_wall_tilted_horizontal_against_scipy_dblquad():
    # reference: scipy.integrate.dblquad (see _horizontal_reference); 400 edges × 60 levels are
    # more pairs than one chunk holds, so the chunks and blocks of nodes are exercised
    R, L, tilt = 0.8, 5.0, 2.0
    prep = _polyline_cylinder(R, L, 400, "x")
    lo, hi = tilted_range(prep, tilt, "horizontal")
    levels = np.linspace(lo, hi, 60)
    v, err, _ = tilted_levels(prep, levels, tilt, "horizontal")
    cap = math.pi * R * R * L
    some = [1, 7, 20, 31, 45, 58]
    ref = np.array([_horizontal_reference(R, L, tilt, levels[i], L / 2) for i in some])
    assert np.max(np.abs(v[some] - ref)) <= 1e-12 * cap
    assert np.max(err) <= 1e-11 * cap
    assert v[0] == 0.0 and abs(v[-1] - cap) <= 1e-12 * cap


def test_many_edge_wall_leaning_vertical_plane_across_the_shell_only():
    # geometry as in test_leaning_vertical_cylinder_plane_across_the_shell_only: π r² s, the
    # slices below the plane wholly wet (frusta in closed form), the others cut by the chord
    R, L, tilt = 1.0, 3.0, 10.0
    a = math.radians(tilt)
    prep = _polyline_cylinder(R, L, 300, "y")
    s = np.linspace(0.3, 2.7, 41)
    v = tilted_levels(prep, s * math.cos(a), tilt, "vertical")[0]
    assert np.max(np.abs(v - math.pi * R * R * s)) <= 1e-12 * math.pi * R * R * L


@pytest.mark.parametrize("name, orientation", [("vessel-brew-kettle.toml", "vertical"),
                                               ("vessel-diesel-day-tank.toml", "horizontal")])
def test_straight_pieces_as_arrays_agree_with_their_segments(name, orientation):
    # the same table with every piece evaluated through its segment (points_at, tangents_at;
    # no end points kept): the array path is only a faster way to the same numbers
    import dataclasses

    space = _space(name, orientation)
    pc = tilted_pieces(space.prepared)
    assert pc.straight.any()
    lo, hi = tilted_range(space.prepared, 2.0, orientation, pieces=pc)
    levels = np.linspace(lo, hi, 41)
    fast = tilted_levels(space.prepared, levels, 2.0, orientation, pieces=pc)
    plain = tilted_levels(space.prepared, levels, 2.0, orientation,
                          pieces=dataclasses.replace(pc, ends=None))
    for x, y in zip(fast[::2], plain[::2]):       # volume, wetted area
        assert np.max(np.abs(x - y)) <= 1e-13 * max(float(np.max(np.abs(y))), 1.0)


def test_segment_area_and_wetted_arc_against_crc():
    # circular segment of height h: r² acos((r-h)/r) - (r-h) √(2rh - h²); its arc 2 r acos((r-h)/r)
    # (CRC Standard Mathematical Tables, from memory), for depths across the whole circle
    from revolve.geometry.tilted import _segment_and_arc

    r = 1.7
    h = np.concatenate([np.geomspace(1e-3, 1.0, 40) * r, r * (2.0 - np.geomspace(1e-3, 1.0, 40))])
    area, arc = _segment_and_arc(np.full(h.size, r), h.copy(), 2 * r - h)
    ref = np.array([_crc_segment(r, x) for x in h])
    ref_arc = 2 * r * np.arccos((r - h) / r)
    assert np.max(np.abs(area - ref)) <= 1e-13 * math.pi * r * r
    assert np.max(np.abs(arc - ref_arc)) <= 1e-13 * 2 * math.pi * r
