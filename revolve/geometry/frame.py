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

from revolve.geometry.profile import Axis
from revolve.geometry.segments import Segment


def point_to_frame(p, axis: Axis, side: float):
    """Frame coordinates ``(z, r)`` of a sketch point, with ``r`` mirrored by ``side``.

    >>> point_to_frame((3.0, -4.0), Axis.x(), side=-1.0)
    (3.0, 4.0)
    """
    z, r = axis.to_frame(float(p[0]), float(p[1]))
    return (float(z), float(side * r))


def to_frame(segment: Segment, axis: Axis, side: float) -> Segment:
    """The same segment with sketch coordinates replaced by axis-frame coordinates.

    ``z = u·(p − P)`` and ``r = side·(u × (p − P))``: a translation, then a rotation
    (and a mirror when ``side`` is −1), through the segment's own
    :meth:`~revolve.geometry.kinds.base.SegmentKind.transformed`, whatever its kind.
    """
    ux, uy = axis.unit_direction()
    px, py = float(axis.point[0]), float(axis.point[1])
    if (ux, uy, px, py, side) == (1.0, 0.0, 0.0, 0.0, 1.0):
        return segment
    return segment.translated(-px, -py).transformed((ux, uy, -side * uy, side * ux))
