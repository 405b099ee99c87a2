"""Segment kinds of a profile: lines, circular arcs, expression curves and polylines.

Segments are immutable value objects in the sketch plane (coordinates ``x``,
``y`` as plain floats). Each may carry a ``face`` name, used to group surface
results, and a :class:`Where` telling the file and line it came from, used in
error messages. A segment may also carry its exact inputs (a typed record of
fractions or sympy numbers) so that ``--exact`` can produce closed forms;
numeric work never needs them.

Every kind lives in its own module under :mod:`revolve.geometry.kinds` and
keeps the contract of :class:`~revolve.geometry.kinds.base.SegmentKind`; this
module is the one place that lists them, with their constructors.

Examples
--------
>>> seg = Line((0.0, 1.0), (3.0, 1.0), face="bore")
>>> seg.length()
3.0
>>> arc = arc_from_radius((1.0, 0.0), (0.0, 1.0), radius=1.0, side="right")
>>> round(arc.centre[0], 12), round(arc.centre[1], 12), arc.clockwise
(0.0, 0.0, False)
>>> import math
>>> round(arc.sweep(), 12) == round(math.pi / 2, 12)
True
>>> [k.kind for k in KINDS]
['line', 'arc', 'curve', 'polyline']
"""

from __future__ import annotations

from typing import Union

from revolve.geometry.kinds.arc import Arc, ArcByCentre, ArcByRadius, arc_from_centre, arc_from_radius
from revolve.geometry.kinds.base import (COORDINATE_LIMIT, FLAT_ARC_RATIO, IDENTITY_MATRIX, SIZE_LIMIT,
                                         Point, SegmentKind, Where)
from revolve.geometry.kinds.curve import (IDENTITY, Curve, CurveExact, CurveMap, compiled_curve,
                                          curve_from_expressions, find_pole)
from revolve.geometry.kinds.line import Line, LineExact
from revolve.geometry.kinds.polyline import Polyline, PolylineExact, map_points

#: Every segment kind, in the order the engine lists them.
KINDS = (Line, Arc, Curve, Polyline)

Segment = Union[Line, Arc, Curve, Polyline]

__all__ = ["Arc", "ArcByCentre", "ArcByRadius", "COORDINATE_LIMIT", "Curve", "CurveExact", "CurveMap",
           "FLAT_ARC_RATIO", "IDENTITY", "IDENTITY_MATRIX", "KINDS", "Line", "LineExact", "Point",
           "Polyline", "PolylineExact", "SIZE_LIMIT", "Segment", "SegmentKind", "Where",
           "arc_from_centre", "arc_from_radius", "compiled_curve", "curve_from_expressions",
           "find_pole", "map_points"]
