"""Bad geometry is refused with ProfileError (or SegmentError); fine edge cases are accepted.

The refusals come from revolve.geometry.checks.prepare (through measure),
the segment constructors and Revolution. What counts as bad is plain
geometry; the accepted edge cases are checked against CRC Standard
Mathematical Tables (from memory) so that "accepted" also means "right".
"""

from __future__ import annotations

import math

import pytest
import sympy

from geometry_testkit import LINE_ARC_TOL, T, assert_rel, circle_loop, polygon, reverse_loop
from revolve.errors import ProfileError, RevolveError, SegmentError
from revolve.geometry.checks import prepare
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Chain, Loop, Profile, Revolution
from revolve.geometry.segments import (Line, Where, arc_from_centre, arc_from_radius,
                                       curve_from_expressions)

SQUARE = [(0.0, 1.0), (2.0, 1.0), (2.0, 3.0), (0.0, 3.0)]


def _measure(*loops, axis=None, chains=()):
    return measure(Revolution(Profile(loops=tuple(loops), chains=tuple(chains)), axis or Axis.x()))


# -- not closed, not joined ------------------------------------------------------------

def test_loop_not_closed():
    segs = (Line((0.0, 1.0), (2.0, 1.0)), Line((2.0, 1.0), (2.0, 3.0)), Line((2.0, 3.0), (0.0, 3.0)))
    with pytest.raises(ProfileError, match="not closed"):
        _measure(Loop(segs))


def test_segments_do_not_join():
    segs = (Line((0.0, 1.0), (2.0, 1.0)), Line((2.1, 1.0), (2.0, 3.0)), Line((2.0, 3.0), (0.0, 1.0)))
    with pytest.raises(ProfileError, match="loop 1, segment 2"):
        _measure(Loop(segs))


def test_error_carries_file_and_line():
    bad = Line((0.0, -1.0), (2.0, 1.0), where=Where(file="part.toml", line=7))
    loop = Loop((bad, Line((2.0, 1.0), (0.0, 3.0)), Line((0.0, 3.0), (0.0, -1.0))))
    with pytest.raises(ProfileError) as info:
        _measure(loop)
    assert info.value.file == "part.toml" and info.value.line == 7
    assert str(info.value).startswith("part.toml:7:")


# -- self-intersection -----------------------------------------------------------------

def test_bow_tie():
    with pytest.raises(ProfileError, match="intersects itself"):
        _measure(polygon([(0.0, 1.0), (2.0, 3.0), (2.0, 1.0), (0.0, 3.0)]))


def test_arc_crossing_a_line_of_its_own_loop():
    # A half disc whose arc bulges through the far side of a thin rectangle-shaped loop.
    arc = arc_from_centre((3.0, 2.0), (1.0, 2.0), (2.0, 2.0), clockwise=False)
    loop = Loop((arc, Line((1.0, 2.0), (1.0, 2.5)), Line((1.0, 2.5), (3.0, 2.5)),
                 Line((3.0, 2.5), (3.0, 2.0))))
    with pytest.raises(ProfileError, match="intersects itself"):
        _measure(loop)


def test_hole_crossing_the_outer_loop():
    hole = reverse_loop(polygon([(1.0, 2.0), (3.0, 2.0), (3.0, 2.5), (1.0, 2.5)]))
    with pytest.raises(ProfileError, match="intersects itself"):
        _measure(polygon(SQUARE), hole)


def test_two_loops_overlapping():
    other = polygon([(1.0, 2.0), (3.0, 2.0), (3.0, 4.0), (1.0, 4.0)])
    with pytest.raises(ProfileError, match="intersects itself"):
        _measure(polygon(SQUARE), other)


def test_hole_touching_the_outer_loop():
    hole = circle_loop(1.0, 2.0, 1.0)              # touches the square's top and bottom edges
    with pytest.raises(ProfileError, match="intersects itself"):
        _measure(polygon(SQUARE), hole)


def test_chain_crossing_a_loop():
    chain = Chain.from_points([(1.0, 0.5), (1.0, 4.0)])
    with pytest.raises(ProfileError, match="intersects itself"):
        _measure(polygon(SQUARE), chains=(chain,))


# -- the axis --------------------------------------------------------------------------

def test_crossing_the_axis_names_the_segment():
    loop = polygon([(0.0, 1.0), (2.0, 1.0), (2.0, -0.5), (3.0, -0.5), (3.0, 3.0), (0.0, 3.0)])
    with pytest.raises(ProfileError, match=r"^loop 1, segment 2: the profile crosses the axis"):
        _measure(loop)


def test_arc_dipping_across_the_axis():
    # Both ends above the axis, the arc's lowest point below it.
    arc = arc_from_centre((1.0, 0.5), (3.0, 0.5), (2.0, 1.0), clockwise=False)
    loop = Loop((arc, Line((3.0, 0.5), (3.0, 3.0)), Line((3.0, 3.0), (1.0, 3.0)),
                 Line((1.0, 3.0), (1.0, 0.5))))
    with pytest.raises(ProfileError, match="segment 1: the profile crosses the axis"):
        _measure(loop)


def test_curve_dipping_across_the_axis():
    curve = curve_from_expressions(T, 1 - 2 * sympy.sin(sympy.pi * T / 2) ** 2 + 0.5 * T, 0, 2)
    end = curve.end
    loop = Loop((curve, Line(end, (2.0, 3.0)), Line((2.0, 3.0), (0.0, 3.0)),
                 Line((0.0, 3.0), curve.start)))
    with pytest.raises(ProfileError, match="crosses the axis"):
        _measure(loop)


def test_whole_profile_on_the_axis():
    with pytest.raises(ProfileError, match="on the axis"):
        _measure(chains=(Chain.from_points([(0.0, 0.0), (5.0, 0.0)]),))


def test_zero_axis_direction():
    with pytest.raises(ProfileError, match="axis direction is zero"):
        _measure(polygon(SQUARE), axis=Axis((0.0, 0.0), (0.0, 0.0)))


def test_segments_on_the_axis_are_fine():
    # A cylinder drawn with its bottom edge on the axis (split in two pieces).
    r, length = 1.5, 4.0
    loop = polygon([(0.0, 0.0), (1.0, 0.0), (length, 0.0), (length, r), (0.0, r)])
    m = _measure(loop)
    # CRC Standard Mathematical Tables (from memory): cylinder V = π r² L, S = 2π r L + 2π r²
    assert_rel(m.volume, math.pi * r * r * length, LINE_ARC_TOL, "cylinder volume")
    assert_rel(m.surface_total, 2 * math.pi * r * length + 2 * math.pi * r * r, LINE_ARC_TOL,
               "cylinder surface")


def test_profile_touching_the_axis_at_a_point_is_fine():
    # A triangle standing on one corner on the axis: two cones back to back minus nothing.
    loop = polygon([(0.0, 0.0), (2.0, 1.0), (0.0, 2.0)])
    m = _measure(loop)
    # Stewart, Calculus, "Moments and centers of mass" (from memory): V = 2π ȳ A; ȳ = 1, A = 2
    assert_rel(m.volume, 2 * math.pi * 1.0 * 2.0, LINE_ARC_TOL, "volume")


@pytest.mark.parametrize("axis", [Axis((0.0, 0.0), (1.0, 0.0)), Axis((0.0, 0.0), (-1.0, 0.0)),
                                  Axis((-1.0, 0.0), (0.0, 1.0)), Axis((-1.0, 0.0), (0.0, -1.0))],
                         ids=["+x", "-x", "+y", "-y"])
def test_negative_side_gives_the_same_volume(axis):
    # The square lies left of +x and -y, right of -x and +y.
    m = _measure(polygon(SQUARE), axis=axis)
    ux, uy = axis.direction
    cx, cy = 1.0, 2.0
    d = abs((cx - axis.point[0]) * uy - (cy - axis.point[1]) * ux)
    # Stewart, Calculus, "Moments and centers of mass" (from memory): V = 2π d̄ A, A = 4
    assert_rel(m.volume, 2 * math.pi * d * 4.0, LINE_ARC_TOL, "volume")
    side = 1.0 if ((cx - axis.point[0]) * uy - (cy - axis.point[1]) * ux) < 0 else -1.0
    assert m.side == side


# -- degenerate loops and segments -----------------------------------------------------

def test_zero_area_loop():
    # Three points on one line: closed, but it encloses nothing.
    with pytest.raises(ProfileError, match="zero area"):
        _measure(polygon([(0.0, 1.0), (1.0, 1.0), (2.0, 1.0)]))


def test_there_and_back_loop():
    with pytest.raises(ProfileError, match="zero area"):
        _measure(polygon([(0.0, 1.0), (2.0, 3.0)]))


def test_zero_length_segment():
    segs = (Line((0.0, 1.0), (2.0, 1.0)), Line((2.0, 1.0), (2.0, 1.0)), Line((2.0, 1.0), (2.0, 3.0)),
            Line((2.0, 3.0), (0.0, 1.0)))
    with pytest.raises(ProfileError, match="loop 1, segment 2: this segment has zero length"):
        _measure(Loop(segs))


def test_empty_profile():
    with pytest.raises(ProfileError):
        prepare(Profile(), Axis.x())


@pytest.mark.parametrize("flip", [(False, False, False), (True, False, True), (False, True, True)])
def test_island_inside_a_hole_is_solid_again(flip):
    loops = [polygon([(0.0, 1.0), (6.0, 1.0), (6.0, 7.0), (0.0, 7.0)]),
             polygon([(1.0, 2.0), (5.0, 2.0), (5.0, 6.0), (1.0, 6.0)]),
             polygon([(2.0, 3.0), (4.0, 3.0), (4.0, 5.0), (2.0, 5.0)])]
    loops = [reverse_loop(l) if f else l for l, f in zip(loops, flip)]
    m = _measure(*loops)
    # Stewart, Calculus (from memory): V = 2π ȳ A; all three squares have ȳ = 4; A = 36 − 16 + 4
    assert_rel(m.volume, 2 * math.pi * 4.0 * 24.0, LINE_ARC_TOL, "volume")
    assert_rel(m.area, 24.0, LINE_ARC_TOL, "area")


# -- segments refused by their constructors --------------------------------------------

def test_arc_radius_shorter_than_half_the_chord():
    with pytest.raises(SegmentError, match="shorter than half the chord"):
        arc_from_radius((0.0, 1.0), (4.0, 1.0), radius=1.999)


def test_arc_radius_exactly_half_the_chord_is_a_half_circle():
    arc = arc_from_radius((0.0, 1.0), (4.0, 1.0), radius=2.0)
    assert_rel(arc.length(), 2 * math.pi, LINE_ARC_TOL, "half circle")


@pytest.mark.parametrize("radius", [0.0, -1.0, float("nan"), float("inf")])
def test_arc_radius_not_positive_finite(radius):
    with pytest.raises(SegmentError):
        arc_from_radius((0.0, 1.0), (4.0, 1.0), radius=radius)


def test_arc_ends_at_different_distances_from_the_centre():
    with pytest.raises(SegmentError, match="must be equal"):
        arc_from_centre((1.0, 0.0), (0.0, 2.0), (0.0, 0.0), clockwise=False)


def test_arc_with_coincident_ends():
    with pytest.raises(SegmentError):
        arc_from_radius((1.0, 1.0), (1.0, 1.0), radius=1.0)
    with pytest.raises(SegmentError):
        arc_from_centre((1.0, 1.0), (1.0, 1.0), (0.0, 1.0), clockwise=False)


def test_curve_not_finite_on_its_interval():
    with pytest.raises(SegmentError, match="not finite"):
        curve_from_expressions(T, 1 / (T - 1), 0, 2)


def test_curve_empty_interval():
    with pytest.raises(SegmentError, match="empty"):
        curve_from_expressions(T, T, 1, 1)


def test_segment_errors_are_profile_errors():
    assert issubclass(SegmentError, ProfileError) and issubclass(ProfileError, RevolveError)


# -- the revolution angle --------------------------------------------------------------

@pytest.mark.parametrize("angle", [0.0, -10.0, 400.0, 360.0001, float("nan"), float("inf"), "ninety"])
def test_bad_revolution_angle(angle):
    with pytest.raises(ProfileError, match="angle"):
        Revolution(Profile(loops=(polygon(SQUARE),)), Axis.x(), angle)


@pytest.mark.parametrize("angle", [1e-9, 360.0, 359.99])
def test_good_revolution_angle(angle):
    m = measure(Revolution(Profile(loops=(polygon(SQUARE),)), Axis.x(), angle))
    # Stewart, Calculus, "Moments and centers of mass" (from memory): V = θ d̄ A, d̄ = 2, A = 4
    assert_rel(m.volume, math.radians(angle) * 2.0 * 4.0, LINE_ARC_TOL, "volume")
