"""Pappus–Guldinus for partial angles and arbitrary axes.

The expected volume is θ · d̄ · A and the expected surface θ · d̄_L · L with
A, L and the centroids taken from the tables (not from the engine), and d̄
the distance of that centroid from the axis line, worked out here.

Sources: Pappus–Guldinus, Stewart, *Calculus*, "Moments and centers of
mass" (from memory); centroids from Beer & Johnston, *Vector Mechanics for
Engineers: Statics*, table of centroids (from memory); areas from CRC
*Standard Mathematical Tables and Formulae* (from memory).
"""

from __future__ import annotations

import math

import pytest

from geometry_testkit import LINE_ARC_TOL, assert_rel, distance_to_line, polygon
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Loop, Profile, Revolution
from revolve.geometry.segments import Line, arc_from_centre

ANGLES = [90.0, 200.0, 17.5, 360.0]
#: Axes as (point, direction); each shape below lies wholly on one side of each.
AXES = [((0.0, 0.0), (1.0, 0.0)),
        ((-3.0, -6.0), (2.0, 1.0)),
        ((10.0, 0.0), (0.0, -1.0)),         # the shapes lie on the right of this one
        ((0.0, 20.0), (-1.0, 0.3))]


def _semicircle(r=1.5, c=(2.0, 4.0), beta=0.3):
    a = (c[0] + r * math.cos(beta), c[1] + r * math.sin(beta))
    b = (c[0] - r * math.cos(beta), c[1] - r * math.sin(beta))
    loop = Loop((arc_from_centre(a, b, c, clockwise=False, face="round"), Line(b, a, face="flat")))
    n = (-math.sin(beta), math.cos(beta))              # towards the arc
    # Beer & Johnston, Statics, table of centroids (from memory): semicircular area 4r/(3π), arc 2r/π
    area_centroid = (c[0] + 4 * r / (3 * math.pi) * n[0], c[1] + 4 * r / (3 * math.pi) * n[1])
    arc_centroid = (c[0] + 2 * r / math.pi * n[0], c[1] + 2 * r / math.pi * n[1])
    # CRC Standard Mathematical Tables (from memory): half a circle, π r²/2; half the circumference π r
    area = math.pi * r * r / 2
    pieces = [(math.pi * r, arc_centroid, "round"), (2 * r, c, "flat")]
    return loop, area, area_centroid, pieces


def _triangle():
    pts = [(1.0, 3.0), (5.0, 2.0), (3.0, 6.5)]
    # Beer & Johnston, Statics, table of centroids (from memory): one third of each height from
    # the base, i.e. the mean of the corners
    centroid = (sum(p[0] for p in pts) / 3, sum(p[1] for p in pts) / 3)
    (x0, y0), (x1, y1), (x2, y2) = pts
    area = abs((x1 - x0) * (y2 - y0) - (x2 - x0) * (y1 - y0)) / 2
    pieces = []
    for i in range(3):
        a, b = pts[i], pts[(i + 1) % 3]
        pieces.append((math.dist(a, b), ((a[0] + b[0]) / 2, (a[1] + b[1]) / 2), "other"))
    return polygon(pts), area, centroid, pieces


SHAPES = {"semicircle": _semicircle, "triangle": _triangle}


@pytest.mark.parametrize("shape", sorted(SHAPES))
@pytest.mark.parametrize("axis", AXES, ids=["x", "oblique", "right-side", "reversed"])
@pytest.mark.parametrize("angle", ANGLES)
def test_pappus_volume_surface_and_cut_faces(shape, axis, angle):
    loop, area, centroid, pieces = SHAPES[shape]()
    m = measure(Revolution(Profile(loops=(loop,)), Axis(*axis), angle))
    theta = math.radians(angle)
    d = distance_to_line(centroid, *axis)
    # Stewart, Calculus, "Moments and centers of mass" (from memory): V = θ · d̄ · A
    assert_rel(m.volume, theta * d * area, LINE_ARC_TOL, "Pappus volume")
    assert_rel(m.centroid_distance, d, LINE_ARC_TOL, "centroid distance")
    # Stewart, Calculus (from memory): S = θ · d̄_L · L, summed over the pieces of the boundary
    length = sum(L for L, _, _ in pieces)
    d_L = sum(L * distance_to_line(q, *axis) for L, q, _ in pieces) / length
    assert_rel(m.surface_total, theta * d_L * length, LINE_ARC_TOL, "Pappus surface")
    assert_rel(m.boundary_centroid_distance, d_L, LINE_ARC_TOL, "boundary centroid distance")
    for name in {f for _, _, f in pieces}:
        want = sum(theta * L * distance_to_line(q, *axis) for L, q, f in pieces if f == name)
        assert_rel(m.surface_by_face[name], want, LINE_ARC_TOL, f"face {name}")
    # A partial revolution has two cut faces, each the section itself.
    if angle == 360.0:
        assert m.cut_face_area is None
    else:
        assert_rel(m.cut_face_area, area, LINE_ARC_TOL, "cut face")
    assert m.crosscheck.agrees(1e-9)


@pytest.mark.parametrize("angle", [1e-6, 0.5, 359.999])
def test_pappus_volume_is_proportional_to_angle(angle):
    # Stewart, Calculus, "Moments and centers of mass" (from memory): V = θ · d̄ · A, linear in θ
    loop, area, centroid, _ = _semicircle()
    m = measure(Revolution(Profile(loops=(loop,)), Axis.x(), angle))
    assert_rel(m.volume, math.radians(angle) * centroid[1] * area, LINE_ARC_TOL, "volume")
