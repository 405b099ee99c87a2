"""Properties that must hold for any scene (hypothesis).

The figures of a revolution do not depend on where the scene sits in the
sketch, on which way the loops are travelled, or on how a segment is cut
into pieces; they scale as k³ (volume) and k² (areas); and a hole takes
away exactly the solid it would make on its own. The hole check uses an
outside reference: a circular hole removes a torus, V = 2 π² R r² and
S = 4 π² R r (CRC Standard Mathematical Tables, from memory).

Scenes: a rectangle whose far edge bulges as a circular arc, anywhere on
one side of the axis (its near edge may lie on the axis), optionally with
a circular hole, loops travelled either way.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import pytest
import sympy
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from geometry_testkit import (CROSS_TOL, T, Placement, assert_rel, circle_loop, reverse_loop,
                              revolution)
from revolve.geometry.measure import measure
from revolve.geometry.profile import Loop
from revolve.geometry.segments import Line, arc_from_radius, curve_from_expressions

SETTINGS = settings(max_examples=40, deadline=None,
                    suppress_health_check=[HealthCheck.too_slow])
#: Relative tolerance for figures that went through different rounding.
TOL = 1e-11


@dataclass(frozen=True)
class Scene:
    z0: float
    r0: float
    width: float
    height: float
    bulge: float          # arc radius = width/2 · (1 + bulge)
    hole: float           # hole radius as a fraction of the largest that fits; 0 = none
    outer_ccw: bool
    hole_ccw: bool

    def loops(self, k: float = 1.0, with_hole: bool = True):
        z0, r0, w, h = k * self.z0, k * self.r0, k * self.width, k * self.height
        a, b, c, d = (z0, r0), (z0 + w, r0), (z0 + w, r0 + h), (z0, r0 + h)
        top = arc_from_radius(c, d, radius=w / 2 * (1 + self.bulge), side="right", face="top")
        outer = Loop((Line(a, b, face="near"), Line(b, c, face="end"), top, Line(d, a, face="end")))
        if not self.outer_ccw:
            outer = reverse_loop(outer)
        loops = [outer]
        if with_hole and self.hole > 0:
            loops.append(circle_loop(*self.hole_centre(k), self.hole_radius(k), ccw=self.hole_ccw,
                                     face="hole"))
        return loops

    def hole_centre(self, k=1.0):
        return (k * (self.z0 + self.width / 2), k * (self.r0 + self.height / 2))

    def hole_radius(self, k=1.0):
        return k * self.hole * 0.45 * min(self.width, self.height)


scenes = st.builds(
    Scene,
    z0=st.floats(-5.0, 5.0),
    r0=st.one_of(st.just(0.0), st.floats(0.0, 5.0)),
    width=st.floats(0.5, 4.0),
    height=st.floats(0.5, 4.0),
    # Not near 0: an arc barely longer than half a circle is ill-conditioned in its radius.
    bulge=st.floats(0.05, 3.0),
    hole=st.one_of(st.just(0.0), st.floats(0.2, 1.0)),
    outer_ccw=st.booleans(),
    hole_ccw=st.booleans(),
)
placements = st.builds(Placement, px=st.floats(-50.0, 50.0), py=st.floats(-50.0, 50.0),
                       angle=st.floats(-math.pi, math.pi), side=st.sampled_from([1.0, -1.0]))
angles = st.sampled_from([360.0, 90.0, 237.5])


def _same(m, ref, tol=TOL):
    assert_rel(m.volume, ref.volume, tol, "volume")
    assert_rel(m.area, ref.area, tol, "area")
    assert_rel(m.surface_total, ref.surface_total, tol, "surface")
    assert_rel(m.perimeter, ref.perimeter, tol, "perimeter")
    assert_rel(m.centroid_distance, ref.centroid_distance, tol, "centroid distance")
    assert set(m.surface_by_face) == set(ref.surface_by_face)
    scale = ref.surface_total
    for name, v in ref.surface_by_face.items():
        assert abs(m.surface_by_face[name] - v) <= tol * scale, name
    assert m.crosscheck.agrees(CROSS_TOL)


@SETTINGS
@given(scene=scenes, p=placements, angle=angles)
def test_moving_the_whole_scene_changes_nothing(scene, p, angle):
    ref = measure(revolution(scene.loops(), angle=angle))
    m = measure(revolution(scene.loops(), p=p, angle=angle))
    _same(m, ref)
    # The centroid moves with the scene.
    want = p.point(*ref.centroid)
    size = math.hypot(scene.width, scene.height) + abs(p.px) + abs(p.py) + abs(scene.z0) + scene.r0
    assert math.dist(m.centroid, want) <= TOL * size


@SETTINGS
@given(scene=scenes, angle=angles)
def test_reversing_every_loop_changes_nothing(scene, angle):
    ref = measure(revolution(scene.loops(), angle=angle))
    m = measure(revolution([reverse_loop(l) for l in scene.loops()], angle=angle))
    _same(m, ref)
    assert math.dist(m.centroid, ref.centroid) <= TOL * (1 + abs(scene.z0) + scene.r0)


@SETTINGS
@given(scene=scenes, which=st.integers(0, 5), s=st.floats(0.05, 0.95), angle=angles)
def test_splitting_a_segment_changes_nothing(scene, which, s, angle):
    loops = scene.loops()
    ref = measure(revolution(loops, angle=angle))
    # Pick a segment of the outer loop or of the hole (lines and arcs both occur).
    k = which % len(loops)
    segs = list(loops[k].segments)
    j = which % len(segs)
    first, second = segs[j].split(s)
    loops[k] = Loop(tuple(segs[:j] + [first, second] + segs[j + 1:]))
    m = measure(revolution(loops, angle=angle))
    _same(m, ref)


@SETTINGS
@given(scene=scenes, k=st.floats(0.01, 100.0), angle=angles)
def test_scaling_by_k(scene, k, angle):
    ref = measure(revolution(scene.loops(), angle=angle))
    m = measure(revolution(scene.loops(k), angle=angle))
    assert_rel(m.volume, k ** 3 * ref.volume, TOL, "volume ∝ k³")
    assert_rel(m.area, k ** 2 * ref.area, TOL, "area ∝ k²")
    assert_rel(m.surface_total, k ** 2 * ref.surface_total, TOL, "surface ∝ k²")
    assert_rel(m.perimeter, k * ref.perimeter, TOL, "perimeter ∝ k")
    assert_rel(m.centroid_distance, k * ref.centroid_distance, TOL, "distance ∝ k")


@SETTINGS
@given(scene=scenes.filter(lambda s: s.hole > 0), p=placements)
def test_holes_subtract_regardless_of_orientation(scene, p):
    solid = measure(revolution(scene.loops(with_hole=False), p=p))
    holed = measure(revolution(scene.loops(), p=p))
    R = scene.hole_centre()[1]
    r = scene.hole_radius()
    # CRC Standard Mathematical Tables (from memory): a circular hole removes a torus, V = 2 π² R r²
    assert_rel(holed.volume, solid.volume - 2 * math.pi ** 2 * R * r * r, TOL, "volume")
    # CRC Standard Mathematical Tables (from memory): circle area π r²
    assert_rel(holed.area, solid.area - math.pi * r * r, TOL, "area")
    # CRC Standard Mathematical Tables (from memory): the hole adds the torus surface 4 π² R r
    assert_rel(holed.surface_total, solid.surface_total + 4 * math.pi ** 2 * R * r, TOL, "surface")
    assert_rel(holed.surface_by_face["hole"], 4 * math.pi ** 2 * R * r, TOL, "hole face")
    assert holed.crosscheck.agrees(CROSS_TOL)


# -- curves: the same properties, fewer examples (quadrature is slower) ----------------

def _curve_scene(z0, r0, w, amp):
    """Region under r = r0 + 1 + amp sin(π (z − z0)/w) for z0 ≤ z ≤ z0 + w."""
    top = curve_from_expressions(
        T, r0 + 1 + amp * sympy.sin(sympy.pi * (T - z0) / w), z0 + w, z0, face="top")
    a, b = (z0, r0), (z0 + w, r0)
    return Loop((Line(a, b), Line(b, top.start), top, Line(top.end, a)))


curve_scenes = st.tuples(st.floats(-3.0, 3.0), st.floats(0.0, 3.0), st.floats(0.5, 3.0),
                         st.floats(-0.8, 2.0))


@settings(max_examples=5, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(scene=curve_scenes, p=placements, s=st.floats(0.1, 0.9))
def test_curve_scene_moved_reversed_and_split(scene, p, s):
    loop = _curve_scene(*scene)
    ref = measure(revolution([loop]), symbolic=False)
    tol = 1e-10
    _same(measure(revolution([loop], p=p), symbolic=False), ref, tol)
    _same(measure(revolution([reverse_loop(loop)]), symbolic=False), ref, tol)
    segs = list(loop.segments)
    first, second = segs[2].split(s)
    split = Loop(tuple(segs[:2] + [first, second] + segs[3:]))
    _same(measure(revolution([split]), symbolic=False), ref, tol)


@pytest.mark.parametrize("angle", [360.0, 45.0])
def test_profile_on_the_right_of_the_axis_gives_the_same_figures(angle):
    # The same drawing mirrored across the axis: on the right of the direction instead of the left.
    scene = Scene(0.5, 1.0, 2.0, 1.5, 0.7, 0.6, True, False)
    left = measure(revolution(scene.loops(), angle=angle))
    right = measure(revolution(scene.loops(), p=Placement(0.0, 0.0, 0.0, -1.0), angle=angle))
    assert right.side == -1.0 and left.side == 1.0
    _same(right, left, 1e-13)
