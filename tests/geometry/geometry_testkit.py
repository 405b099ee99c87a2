"""Helpers shared by the geometry reference tests (not a test module).

Nothing here computes a reference value: the helpers only build profiles,
place them in the sketch plane and compare numbers. Shapes are written in
the *frame* of their axis (``z`` along the axis, ``r`` from it) and then
placed anywhere in the sketch with :func:`place`, with code of our own that
does not use the engine's frame mapping.

Examples
--------
>>> p = Placement(1.0, 2.0, math.pi / 2, 1.0)
>>> [round(v, 12) for v in p.point(3.0, 0.5)]
[0.5, 5.0]
>>> rel_err(1.0 + 1e-13, 1.0) < 1e-12
True
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Iterable, Sequence

import numpy as np
import sympy

from revolve.geometry.profile import Axis, Chain, Loop, Profile, Revolution
from revolve.geometry.segments import Arc, Curve, Line, Polyline, arc_from_centre

#: The parameter symbol every curve uses.
T = sympy.Symbol("t", real=True)

#: Relative tolerances of the brief: closed forms, curves, cross-check.
LINE_ARC_TOL = 1e-12
CURVE_TOL = 1e-10
CROSS_TOL = 1e-9


def rel_err(got: float, want: float) -> float:
    """Relative difference of ``got`` from ``want`` (absolute when ``want`` is 0)."""
    scale = abs(want) if want != 0 else 1.0
    return abs(got - want) / scale


def assert_rel(got: float, want: float, tol: float, what: str = "") -> None:
    """Fail with both numbers shown when ``got`` is not within ``tol`` of ``want``."""
    err = rel_err(float(got), float(want))
    assert err <= tol, f"{what}: got {got!r}, want {want!r} (relative error {err:.3g} > {tol:g})"


@dataclass(frozen=True)
class Placement:
    """Where a frame drawing goes in the sketch: the axis point, its angle, and the side.

    ``side`` is +1 to put the profile on the left of the axis direction and
    -1 to mirror it onto the right.
    """

    px: float = 0.0
    py: float = 0.0
    angle: float = 0.0
    side: float = 1.0

    @property
    def axis(self) -> Axis:
        return Axis((self.px, self.py), (math.cos(self.angle), math.sin(self.angle)))

    def point(self, z: float, r: float) -> tuple:
        c, s = math.cos(self.angle), math.sin(self.angle)
        return (self.px + z * c - self.side * r * s, self.py + z * s + self.side * r * c)

    @property
    def identity(self) -> bool:
        return (self.px, self.py, self.angle, self.side) == (0.0, 0.0, 0.0, 1.0)


IDENTITY = Placement()
#: A few placements of the scene: plain, rotated and moved, mirrored, about the y axis.
PLACEMENTS = (
    IDENTITY,
    Placement(3.5, -1.25, 0.7, 1.0),
    Placement(-2.0, 4.0, 2.3, -1.0),
    Placement(0.0, 0.0, math.pi / 2, -1.0),
)
PLACEMENT_IDS = ("x-axis", "rotated", "mirrored", "y-axis")


def place(seg, p: Placement):
    """The segment drawn in the frame, placed in the sketch by ``p``."""
    if p.identity:
        return seg
    if isinstance(seg, Line):
        return Line(p.point(*seg.start), p.point(*seg.end), face=seg.face)
    if isinstance(seg, Arc):
        # A mirror reverses the direction of travel.
        cw = seg.clockwise if p.side > 0 else not seg.clockwise
        return arc_from_centre(p.point(*seg.start), p.point(*seg.end), p.point(*seg.centre),
                               clockwise=cw, face=seg.face)
    if isinstance(seg, Curve):
        c, s = sympy.Float(math.cos(p.angle), 17), sympy.Float(math.sin(p.angle), 17)
        side = sympy.Integer(int(p.side))
        x = sympy.Float(p.px, 17) + seg.x_expr * c - side * seg.y_expr * s
        y = sympy.Float(p.py, 17) + seg.x_expr * s + side * seg.y_expr * c
        return Curve(x, y, seg.t_start, seg.t_end, face=seg.face)
    if isinstance(seg, Polyline):
        return Polyline(np.array([p.point(*q) for q in seg.points.tolist()]), face=seg.face)
    raise TypeError(type(seg).__name__)


def place_loop(loop: Loop, p: Placement) -> Loop:
    return Loop(tuple(place(s, p) for s in loop.segments))


def place_chain(chain: Chain, p: Placement) -> Chain:
    return Chain(tuple(place(s, p) for s in chain.segments))


def revolution(loops: Sequence[Loop] = (), chains: Sequence[Chain] = (),
               p: Placement = IDENTITY, angle: float = 360.0) -> Revolution:
    """A revolution of frame-drawn loops and chains, placed by ``p``."""
    prof = Profile(loops=tuple(place_loop(l, p) for l in loops),
                   chains=tuple(place_chain(c, p) for c in chains))
    return Revolution(prof, p.axis, angle)


def circle_loop(cz: float, cr: float, radius: float, ccw: bool = True,
                face: str | None = None) -> Loop:
    """A full circle as two half arcs (counter-clockwise unless ``ccw`` is False)."""
    east, west = (cz + radius, cr), (cz - radius, cr)
    upper = arc_from_centre(east, west, (cz, cr), clockwise=False, face=face)
    lower = arc_from_centre(west, east, (cz, cr), clockwise=False, face=face)
    loop = Loop((upper, lower))
    return loop if ccw else reverse_loop(loop)


def reverse_segment(seg):
    """The same segment travelled the other way (our own construction)."""
    if isinstance(seg, Line):
        return Line(seg.end, seg.start, face=seg.face)
    if isinstance(seg, Arc):
        return Arc(seg.end, seg.start, seg.centre, not seg.clockwise, face=seg.face)
    if isinstance(seg, Curve):
        sub = {T: seg.t_start + seg.t_end - T}
        return Curve(seg.x_expr.subs(sub), seg.y_expr.subs(sub), seg.t_start, seg.t_end,
                     face=seg.face)
    if isinstance(seg, Polyline):
        return Polyline(seg.points[::-1].copy(), face=seg.face)
    raise TypeError(type(seg).__name__)


def reverse_loop(loop: Loop) -> Loop:
    return Loop(tuple(reverse_segment(s) for s in reversed(loop.segments)))


def polygon(points: Iterable[Sequence[float]], face: str | None = None) -> Loop:
    return Loop.from_points(points, face=face)


def distance_to_line(q, point, direction) -> float:
    """Unsigned distance of ``q`` from the line through ``point`` along ``direction``."""
    dx, dy = direction
    n = math.hypot(dx, dy)
    return abs((q[0] - point[0]) * dy - (q[1] - point[1]) * dx) / n
