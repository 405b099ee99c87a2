"""Placing segments in the axis frame.

The engine measures everything in the *axis frame*: ``z`` is the position
along the axis (from the axis point, in the axis direction) and ``r`` the
distance from the axis. A segment in the frame is a segment of the same kind
whose ``x`` is ``z`` and whose ``y`` is ``r``. The map from the sketch is a
rotation, followed by a mirror when the profile lies on the right of the
axis direction (so that ``r`` is never negative); a mirror reverses arcs.

Examples
--------
>>> from revolve.geometry.segments import Line
>>> from revolve.geometry.profile import Axis
>>> to_frame(Line((1.0, 2.0), (1.0, 5.0)), Axis.y(), side=-1.0)
Line(start=(2.0, 1.0), end=(5.0, 1.0), face=None)
"""

from __future__ import annotations

from dataclasses import replace

from revolve.geometry.profile import Axis
from revolve.geometry.segments import Arc, Curve, Line, Segment


def point_to_frame(p, axis: Axis, side: float):
    """Frame coordinates ``(z, r)`` of a sketch point, with ``r`` mirrored by ``side``.

    >>> point_to_frame((3.0, -4.0), Axis.x(), side=-1.0)
    (3.0, 4.0)
    """
    z, r = axis.to_frame(float(p[0]), float(p[1]))
    return (float(z), float(side * r))


def to_frame(segment: Segment, axis: Axis, side: float) -> Segment:
    """The same segment with sketch coordinates replaced by axis-frame coordinates."""
    if isinstance(segment, Line):
        return replace(segment, start=point_to_frame(segment.start, axis, side),
                       end=point_to_frame(segment.end, axis, side))
    if isinstance(segment, Arc):
        return replace(segment, start=point_to_frame(segment.start, axis, side),
                       end=point_to_frame(segment.end, axis, side),
                       centre=point_to_frame(segment.centre, axis, side),
                       clockwise=segment.clockwise if side > 0 else not segment.clockwise)
    if isinstance(segment, Curve):
        ux, uy = axis.unit_direction()
        px, py = float(axis.point[0]), float(axis.point[1])
        if (ux, uy, px, py, side) == (1.0, 0.0, 0.0, 0.0, 1.0):
            return segment
        # z = u·(p - P), r = side·(u × (p - P)): a translation, then a rotation (and mirror).
        # The curve keeps its base expressions; only its affine map changes.
        return segment.translated(-px, -py).transformed(
            (ux, uy, -side * uy, side * ux))
    raise TypeError(f"unknown segment kind {type(segment).__name__}")
