'''DXF drawings as profiles, read through ezdxf.

ezdxf is imported only when a drawing is read. Entities of the model space
become segments:

* ``LINE`` a straight line;
* ``ARC`` an exact circular arc (counter-clockwise about its extrusion, so an
  arc drawn with the extrusion pointing down turns clockwise in the plan);
* ``CIRCLE`` a loop of two half-circle arcs;
* ``LWPOLYLINE`` and 2-D ``POLYLINE`` straight lines, and exact arcs where a
  vertex has a bulge (bulge = tan(sweep / 4), positive counter-clockwise;
  radius = chord (1 + bulge²) / (4 |bulge|)); a 3-D polyline lying flat is
  read as lines. The vertices are read into one array (an ``LWPOLYLINE``
  straight from ezdxf's vertex array) and checked all at once; a run of at
  least :data:`POLYLINE_EDGES` straight edges becomes one polyline segment
  (:class:`~revolve.geometry.segments.Polyline`, no object per vertex, its
  place naming the vertices it spans), a shorter run stays lines with their
  exact decimal ends;
* ``SPLINE`` exact curve pieces: on each knot span a B-spline is one
  polynomial (a ratio of two polynomials when it has weights), found here by
  the Cox–de Boor recursion and written as a curve in ``t`` from 0 to 1; a
  degree-1 spline is a polyline. Degrees above :data:`MAX_SPLINE_DEGREE`
  and splines given only by fit points are refused (skipped, with the
  reason), never flattened;
* ``ELLIPSE`` the parametric curve ``centre + major cos t + minor sin t``
  (an ellipse with ratio 1 is a circle and becomes arcs).

Block references (``INSERT``) are expanded: their entities are placed by the
insertion point, scales and rotation (through ezdxf's
``Insert.virtual_entities``), nested references in turn, at most
:data:`MAX_BLOCK_DEPTH` deep.

Entities are then chained end to end: ends closer than the gap tolerance
are joined. Its default (:func:`default_gap_tolerance`) is the larger of
1e-4 of the drawing's size (the diagonal of its extent) and 0.001 in
(0.0254 mm) in the drawing's unit -- the rounding CAD exports commonly
leave -- but never more than 1e-3 of the size. A gap wider than 1e-9 of the size is
closed by moving a straight end (of a line or a polyline) onto the other end,
or, between two arcs or curves, by a short straight line; each such gap is
reported.
Chains that close become loops; ends that meet nothing are refused unless
open chains are allowed (a surface only), with the nearest free end and its
distance in the message. Three or more ends meeting, and a profile crossing
itself after chaining, are refused. Loops and chains not joined to the main
outline (the loop of largest area; loops directly inside it are its holes)
are strays: each is warned about and left out unless asked for
(:func:`revolve.formats.drawings.separate_strays`).

Every number read is checked: finite, and within ±1e15 of the drawing's
unit (:data:`revolve.formats.drawings.MAX_COORDINATE`). Whatever ezdxf
raises on a broken file or entity becomes one :class:`FormatError` line
naming the file (and the entity).

Other entities (text, dimensions, hatches, points...)
are skipped and reported with the reason, as are entities on layers that are
off or frozen, on layers other than the one chosen, exact duplicates, and
entities smaller than the gap tolerance.

The axis: a ``LINE``, ``XLINE`` or ``RAY`` drawn with a centre linetype
(``CENTER``, ``CENTER2``, ``CENTRE``...) or on a layer whose name says axis,
centre or center (or on the layer given as the axis layer) is a centre line,
not part of the profile. Centre lines on one straight line give the axis;
centre lines that disagree are refused unless the axis is given.

Units come from the header variable ``$INSUNITS``; a drawing without one
(0, unitless) is in the unit given, default ``mm``. A unit given that
disagrees with ``$INSUNITS`` is refused.

Examples
--------
>>> bulge_arc((0.0, 0.0), (2.0, 0.0), 1.0).centre     # a half circle, counter-clockwise
(1.0, 0.0)
>>> bulge_arc((0.0, 0.0), (2.0, 0.0), 1.0).clockwise
False
>>> [float(c) for c in bezier_pieces([(0, 0), (1, 2), (2, 0)], [0, 0, 0, 1, 1, 1], 2)[0][2]]
[0.0, 4.0, -4.0]
'''

from __future__ import annotations

import math
import os
from dataclasses import dataclass
from fractions import Fraction
from typing import Any, Dict, List, Optional, Sequence, Tuple

from revolve.errors import FormatError, RevolveError, UnitError
from revolve.formats.document import ProfileDocument
from revolve.formats.drawings import (DrawingReport, GapClosed, Skipped, check_file_size,
                                      MAX_COORDINATE, check_no_crossings, checked_number,
                                      one_line, separate_strays, summarise_paths)
from revolve.formats.values import check_length_unit
from revolve.geometry.profile import Axis, Chain, Loop, Profile
from revolve.geometry.segments import (Arc, Line, Polyline, Where, arc_from_centre,
                                       arc_from_radius, curve_from_expressions)

#: Gap tolerance for chaining, as a fraction of the drawing's size, unless one is given ...
DEFAULT_RELATIVE_TOLERANCE = 1e-4
#: ... but at least this many millimetres (0.001 in), in the drawing's unit ...
DEFAULT_ABSOLUTE_TOLERANCE_MM = 0.0254
#: ... and never more than this fraction of the size.
MAX_DEFAULT_RELATIVE_TOLERANCE = 1e-3
#: The option that sets the gap tolerance, named in messages.
GAP_OPTION = "--gap-tolerance"
#: Gaps up to this fraction of the size are within the engine's own tolerance and not reported.
JOIN_TOLERANCE = 1e-9
#: A bulge this small (sagitta under 2.5e-10 of the chord) is a straight line.
BULGE_STRAIGHT = 1e-9
#: Deepest nesting of block references expanded, and the most entities read.
MAX_BLOCK_DEPTH = 8
MAX_ENTITIES = 100_000
#: Highest spline degree read exactly.
MAX_SPLINE_DEGREE = 5
#: A drawing polyline's run of at least this many straight edges is read as one polyline
#: segment (one array); shorter runs stay lines, each with its exact decimal ends.
POLYLINE_EDGES = 64

#: $INSUNITS codes of the DXF reference and the unit names revolve uses for them.
INSUNITS = {1: "in", 2: "ft", 4: "mm", 5: "cm", 6: "m", 7: "km", 9: "mil", 10: "yd",
            13: "um", 14: "dm"}
_INSUNITS_NAMES = {0: "unitless", 3: "miles", 8: "microinches", 11: "ångströms",
                   12: "nanometres", 15: "decametres", 16: "hectometres", 17: "gigametres",
                   18: "astronomical units", 19: "light years", 20: "parsecs",
                   21: "US survey feet", 22: "US survey inches", 23: "US survey yards",
                   24: "US survey miles"}

_CENTRE_LINETYPES = ("CENTER", "CENTRE")
_CENTRE_LAYER_WORDS = ("axis", "centre", "center")
_SKIP_REASONS = {
    "TEXT": "text is not geometry", "MTEXT": "text is not geometry",
    "ATTRIB": "text is not geometry", "ATTDEF": "text is not geometry",
    "DIMENSION": "a dimension is not geometry", "ARC_DIMENSION": "a dimension is not geometry",
    "LEADER": "a leader is not geometry", "MLEADER": "a leader is not geometry",
    "MULTILEADER": "a leader is not geometry", "TOLERANCE": "a tolerance frame is not geometry",
    "HATCH": "a hatch is a fill, not a boundary; the boundary's own entities are read",
    "MPOLYGON": "a fill, not a boundary", "SOLID": "a filled area, not a boundary",
    "TRACE": "a filled area, not a boundary", "WIPEOUT": "a mask, not geometry",
    "POINT": "a point is not a boundary", "XLINE": "an infinite construction line",
    "RAY": "an infinite construction line", "IMAGE": "an image is not geometry",
    "VIEWPORT": "a viewport is not geometry", "3DFACE": "a 3-D face is not a profile",
    "3DSOLID": "a 3-D solid is not a profile", "MESH": "a mesh is not a profile",
    "REGION": "a region is not read; explode it into its boundary entities",
    "BODY": "a 3-D body is not a profile", "SURFACE": "a surface is not a profile",
    "MLINE": "a multiline is not read; explode it", "HELIX": "a helix is not a profile",
}


def _xy(v) -> Tuple[float, float]:
    """A point's x and y, each checked: finite and within the range read."""
    return (checked_number(v[0], "an x coordinate"), checked_number(v[1], "a y coordinate"))


def _xyz(v) -> Tuple[float, float, float]:
    return _xy(v) + ((checked_number(v[2], "a z coordinate") if len(v) > 2 else 0.0),)


def _value(v, what: str) -> float:
    return checked_number(v, what)


def _dec(value: float) -> Fraction:
    """The shortest decimal that gives this float, as an exact fraction (what the file wrote)."""
    return Fraction(repr(float(value)))


def _dec_point(p) -> Tuple[Fraction, Fraction]:
    return (_dec(p[0]), _dec(p[1]))


def bulge_arc(start, end, bulge: float, where: Optional[Where] = None) -> Arc:
    """The arc of a polyline vertex's bulge, from ``start`` to ``end``.

    ``bulge`` is tan(sweep / 4): positive counter-clockwise; 1 is a half circle.

    Examples
    --------
    >>> a = bulge_arc((0.0, 0.0), (1.0, 1.0), -math.tan(math.pi / 8))   # quarter turn clockwise
    >>> [round(v, 12) + 0.0 for v in a.centre], a.clockwise, round(a.radius, 12)
    ([1.0, 0.0], True, 1.0)
    """
    chord = math.hypot(end[0] - start[0], end[1] - start[1])
    b = abs(float(bulge))
    if b <= BULGE_STRAIGHT:
        return Line(tuple(start), tuple(end), where=where)
    radius = chord * (1 + b * b) / (4 * b)
    side = "right" if bulge > 0 else "left"
    return arc_from_radius(start, end, radius, side=side, major=b > 1, where=where)


def bezier_pieces(control: Sequence[Sequence[float]], knots: Sequence[float], degree: int,
                  weights: Optional[Sequence[float]] = None):
    """Power-basis coefficients of each knot span of a B-spline, in a local ``t`` from 0 to 1.

    On the span [u_k, u_k+1] the curve is ``(X(t)/W(t), Y(t)/W(t))`` with
    ``u = u_k + (u_k+1 - u_k) t``; the basis functions are built by the
    Cox–de Boor recursion as polynomials in ``t``. Only the valid range
    [u_degree, u_n] is used (n control points); empty spans are left out.

    Returns
    -------
    list of (span, X, Y, W)
        ``span`` is (u_k, u_k+1); X, Y, W are numpy coefficient arrays, lowest
        power first (W is the constant 1 without weights).

    Examples
    --------
    >>> pieces = bezier_pieces([(0, 0), (1, 1), (2, 0), (3, 1)], [0, 0, 0, 1, 2, 2, 2], 2)
    >>> [p[0] for p in pieces]
    [(0.0, 1.0), (1.0, 2.0)]
    >>> [float(c) for c in pieces[1][1]], [float(c) for c in pieces[1][2]]
    ([1.5, 1.0, 0.5], [0.5, -1.0, 1.5])
    """
    import numpy as np
    from numpy.polynomial import polynomial as P

    U = np.asarray(knots, dtype=float)
    C = np.asarray(control, dtype=float)[:, :2]
    n, p = len(C), int(degree)
    W = np.ones(n) if not weights else np.asarray(weights, dtype=float)
    whole = U[n] - U[p]
    out = []
    for k in range(p, n):
        a, b = float(U[k]), float(U[k + 1])
        h = b - a
        if h <= 1e-14 * max(abs(whole), 1e-300):
            continue
        N = {k: np.array([1.0])}
        for j in range(1, p + 1):
            nxt = {}
            for i in range(k - j, k + 1):
                term = np.zeros(1)
                if i in N and U[i + j] != U[i]:
                    term = P.polyadd(term, P.polymul(np.array([a - U[i], h]) / (U[i + j] - U[i]),
                                                     N[i]))
                if i + 1 in N and U[i + j + 1] != U[i + 1]:
                    lin = np.array([U[i + j + 1] - a, -h]) / (U[i + j + 1] - U[i + 1])
                    term = P.polyadd(term, P.polymul(lin, N[i + 1]))
                nxt[i] = term
            N = nxt
        X = np.zeros(p + 1)
        Y = np.zeros(p + 1)
        Wt = np.zeros(p + 1)
        for i, basis in N.items():
            c = np.zeros(p + 1)
            c[:len(basis)] = basis
            X += W[i] * C[i, 0] * c
            Y += W[i] * C[i, 1] * c
            Wt += W[i] * c
        out.append(((a, b), X, Y, Wt))
    return out


def _number_tree(value: float):
    """A float as a tree number: an exact integer when whole (so zeros and ones fold), else the float.

    >>> _number_tree(2.0), _number_tree(0.25)
    (Expr('2'), Expr('0.25'))
    """
    from revolve.expr import Num

    value = float(value)
    return Num(int(value)) if value.is_integer() and abs(value) < 2 ** 53 else Num(value)


def _poly_expr(coefficients, scale: float):
    """The polynomial ``Σ c_k t^k`` as a :class:`revolve.expr.Expr` tree (no sympy).

    Coefficients below 1e-14 of ``scale`` are dropped.

    >>> _poly_expr([1.0, 0.0, 0.5, 1e-20], 1.0).text()
    '1 + 0.5*t^2'
    >>> _poly_expr([0.0], 1.0).text()
    '0'
    """
    from revolve.expr import Num, Var

    t = Var("t")
    out = None
    for k, c in enumerate(coefficients):
        c = float(c)
        if abs(c) <= 1e-14 * scale:
            continue
        value = _number_tree(c)
        term = value if k == 0 else value * (t if k == 1 else t ** k)
        out = term if out is None else out + term
    return out if out is not None else Num(0)


@dataclass(frozen=True)
class _Piece:
    """Segments read from one drawing entity, with its label and number for messages."""

    segments: Tuple[Any, ...]
    label: str
    number: int


def _is_centre(entity, doc, axis_layer: Optional[str], layer: str) -> bool:
    if entity.dxftype() not in ("LINE", "XLINE", "RAY"):
        return False
    if axis_layer is not None and layer.casefold() == axis_layer.casefold():
        return True
    linetype = entity.dxf.get("linetype", "BYLAYER")
    if linetype.upper() == "BYLAYER":
        table = doc.layers.get(layer) if doc.layers.has_entry(layer) else None
        linetype = table.dxf.get("linetype", "Continuous") if table is not None else ""
    if linetype.upper().startswith(_CENTRE_LINETYPES):
        return True
    return any(word in layer.casefold() for word in _CENTRE_LAYER_WORDS)


def _plane_sign(entity) -> Optional[float]:
    """+1 or -1 for an entity drawn in the XY plane (extrusion ±Z), None otherwise."""
    e = entity.dxf.get("extrusion", (0.0, 0.0, 1.0))
    if abs(e[0]) > 1e-9 or abs(e[1]) > 1e-9 or abs(abs(e[2]) - 1) > 1e-9:
        return None
    return 1.0 if e[2] > 0 else -1.0


class _Unsupported(Exception):
    """An entity that cannot be read; the message is the reason."""


def _block_contents(insert, depth: int) -> List[Any]:
    """The entities of a block reference, placed by its insertion point, scale and rotation.

    ezdxf's ``Insert.virtual_entities`` does the placing (and turns a circle
    under unequal scales into an ellipse); nested references come back as
    references themselves and are expanded in turn, at most
    :data:`MAX_BLOCK_DEPTH` deep. Array references (rows and columns) give
    every copy.
    """
    if depth >= MAX_BLOCK_DEPTH:
        raise _Unsupported(f"block references are nested more than {MAX_BLOCK_DEPTH} deep")
    _xyz(insert.dxf.insert)
    for name in ("xscale", "yscale", "zscale"):
        if _value(insert.dxf.get(name, 1.0), f"the {name[0]} scale") == 0:
            raise _Unsupported(f"its {name[0]} scale is zero")
    _value(insert.dxf.get("rotation", 0.0), "the rotation")
    if insert.block() is None:
        raise _Unsupported(f"its block '{one_line(insert.dxf.get('name', '?'))}' is not defined")
    copies = list(insert.multi_insert()) if insert.mcount > 1 else [insert]
    if len(copies) > MAX_ENTITIES:
        raise _Unsupported(f"its array has more than {MAX_ENTITIES} copies")
    return [item for copy in copies for item in copy.virtual_entities()]


def _entity_segments(entity, label: str, file: Optional[str]) -> List[Any]:
    kind = entity.dxftype()
    where = Where(file, None, label)
    if kind == "LINE":
        p0, p1 = _xy(entity.dxf.start), _xy(entity.dxf.end)
        if p0 == p1:
            raise _Unsupported("it has zero length")
        return [Line(p0, p1, where=where, exact=_dec_point(p0) + _dec_point(p1))]
    if kind in ("ARC", "CIRCLE"):
        sign = _plane_sign(entity)
        if sign is None:
            raise _Unsupported("it is not drawn in the XY plane")
        radius = _value(entity.dxf.radius, "the radius")
        if not radius > 0:
            raise _Unsupported("its radius is zero")
        centre = _xy(entity.ocs().to_wcs(entity.dxf.center))
        full = kind == "CIRCLE" or (_value(entity.dxf.end_angle, "the end angle") -
                                    _value(entity.dxf.start_angle, "the start angle")) % 360 == 0
        if full:
            a = (centre[0] + radius, centre[1])
            b = (centre[0] - radius, centre[1])
            return [arc_from_centre(a, b, centre, False, where=where),
                    arc_from_centre(b, a, centre, False, where=where)]
        start, end = _xy(entity.start_point), _xy(entity.end_point)
        return [arc_from_centre(start, end, centre, clockwise=sign < 0, where=where)]
    if kind == "ELLIPSE":
        return _ellipse(entity, where)
    if kind == "LWPOLYLINE":
        import numpy as np

        sign = _plane_sign(entity)
        if sign is None:
            raise _Unsupported("it is not drawn in the XY plane")
        z = _value(entity.dxf.get("elevation", 0.0), "the elevation")
        # x, y, start width, end width, bulge: ezdxf keeps the vertices as one array
        table = np.asarray(entity.lwpoints.values, dtype=float).reshape(-1, 5)
        _check_columns(table[:, [0, 1, 4]], ("x coordinate", "y coordinate", "bulge"))
        xy = _ocs_to_wcs(entity.ocs(), table[:, 0], table[:, 1], z)
        return _polyline(xy, table[:, 4] * sign, bool(entity.closed), label, file)
    if kind == "POLYLINE":
        return _old_polyline(entity, label, file)
    if kind == "SPLINE":
        return _spline(entity, label, file)
    raise _Unsupported(_SKIP_REASONS.get(kind, f"{kind} entities are not read"))


def _check_columns(table, names: Sequence[str]) -> None:
    """Every number of a vertex table finite and within range, or the first bad one named.

    >>> import numpy as np
    >>> _check_columns(np.array([[0.0, 1.0], [2.0, float("inf")]]), ("x coordinate", "y coordinate"))
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: the y coordinate of vertex 2 is inf, not a finite number
    """
    import numpy as np

    bad = ~(np.abs(table) <= MAX_COORDINATE)   # nan too
    if bad.any():
        row, col = divmod(int(np.argmax(bad.ravel())), table.shape[1])
        checked_number(table[row, col], f"the {names[col]} of vertex {row + 1}")


def _ocs_to_wcs(ocs, x, y, z):
    """Sketch x and y of vertices given in an entity's object coordinates, shape (n, 2).

    The columns of ``ocs.ux``, ``ocs.uy``, ``ocs.uz`` (ezdxf's arbitrary axis
    algorithm) applied to all vertices at once; ``z`` is the elevation (one
    number, or one per vertex). Zero and unit factors are skipped, so the
    usual extrusions (0, 0, ±1) keep every coordinate exact.
    """
    import numpy as np

    from revolve.geometry.segments import map_points

    ux, uy, uz = ocs.ux, ocs.uy, ocs.uz
    xy = map_points(np.column_stack([x, y]), (ux[0], uy[0], ux[1], uy[1]))
    z = np.asarray(z, dtype=float)
    if np.any(z != 0):
        xy[:, 0] += uz[0] * z
        xy[:, 1] += uz[1] * z
    _check_columns(xy, ("x coordinate", "y coordinate"))
    return xy


def _polyline(xy, bulge, closed: bool, label: str, file) -> List[Any]:
    """Segments of a drawing polyline: vertices ``xy`` (n, 2), ``bulge[i]`` on the edge from vertex i.

    Zero-length edges are left out. Runs of at least :data:`POLYLINE_EDGES`
    straight edges become one :class:`Polyline`; shorter runs give lines (with
    exact decimal ends when the bulge is exactly 0); a bulge gives an arc.

    >>> import numpy as np
    >>> segs = _polyline(np.array([[0.0, 0], [1, 0], [1, 1], [1, 1]]), np.array([0.0, 1, 0, 0]),
    ...                  False, "LWPOLYLINE #1", None)
    >>> [s.kind for s in segs], str(segs[1].where)
    (['line', 'arc'], 'LWPOLYLINE #1, vertex 2')
    >>> t = np.linspace(0, 1, 101)
    >>> segs = _polyline(np.column_stack([t, t * t]), np.zeros(101), False, "LWPOLYLINE #2", None)
    >>> segs, str(segs[0].where)
    ([Polyline(101 points from (0.0, 0.0) to (1.0, 1.0), face=None)], 'LWPOLYLINE #2, vertices 1 to 101')
    """
    import numpy as np

    xy = np.asarray(xy, dtype=float).reshape(-1, 2)
    bulge = np.asarray(bulge, dtype=float).reshape(-1)
    count = len(xy)
    if count < 2:
        raise _Unsupported("it has fewer than two vertices")
    first = np.arange(count if closed else count - 1)
    second = (first + 1) % count
    kept = np.flatnonzero(np.any(xy[first] != xy[second], axis=1))
    if not kept.size:
        raise _Unsupported("every vertex is at the same point")
    straight = np.abs(bulge[first[kept]]) <= BULGE_STRAIGHT
    # runs of kept edges that are all straight or all bulged
    cuts = np.flatnonzero(straight[1:] != straight[:-1]) + 1
    segments: List[Any] = []
    for run in np.split(np.arange(kept.size), cuts):
        edges = kept[run]
        if straight[run[0]] and len(edges) >= POLYLINE_EDGES:
            pts = np.vstack([xy[first[edges[:1]]], xy[second[edges]]])
            v0, v1 = int(first[edges[0]]) + 1, int(second[edges[-1]]) + 1
            span = f"vertices {v0} to {v1}" if v1 > v0 else \
                f"vertices {v0} to {count} and back to {v1}"
            segments.append(Polyline(pts, where=Where(file, None, f"{label}, {span}"),
                                     first_edge=int(first[edges[0]])))
            continue
        for i in edges.tolist():
            p0 = (float(xy[first[i], 0]), float(xy[first[i], 1]))
            p1 = (float(xy[second[i], 0]), float(xy[second[i], 1]))
            where = Where(file, None, f"{label}, vertex {i + 1}")
            if bulge[i] == 0:
                segments.append(Line(p0, p1, where=where, exact=_dec_point(p0) + _dec_point(p1)))
            else:
                segments.append(bulge_arc(p0, p1, float(bulge[i]), where=where))
    return segments


def _old_polyline(entity, label: str, file) -> List[Any]:
    import numpy as np

    if entity.is_poly_face_mesh or entity.is_polygon_mesh:
        raise _Unsupported("a polygon mesh or polyface is not a profile")
    vertices = [v for v in entity.vertices if not (v.dxf.get("flags", 0) & 16)]
    # ezdxf holds each vertex as an entity: gather their numbers into one array
    table = np.array([tuple(v.dxf.location)[:3] + (v.dxf.get("bulge", 0.0),) for v in vertices],
                     dtype=float).reshape(-1, 4)
    _check_columns(table, ("x coordinate", "y coordinate", "z coordinate", "bulge"))
    if entity.is_2d_polyline:
        sign = _plane_sign(entity)
        if sign is None:
            raise _Unsupported("it is not drawn in the XY plane")
        xy = _ocs_to_wcs(entity.ocs(), table[:, 0], table[:, 1], table[:, 2])
        return _polyline(xy, table[:, 3] * sign, bool(entity.is_closed), label, file)
    zs = table[:, 2]
    if len(zs) and zs.max() - zs.min() > 1e-9 * max(1.0, float(np.abs(zs).max())):
        raise _Unsupported("a 3-D polyline that does not lie flat")
    return _polyline(table[:, :2], np.zeros(len(table)), bool(entity.is_closed), label, file)


def _ellipse(entity, where: Where) -> List[Any]:
    from revolve.expr import Var, call

    if _plane_sign(entity) is None:
        raise _Unsupported("it is not drawn in the XY plane")
    c = _xy(entity.dxf.center)
    major = _xy(entity.dxf.major_axis)
    ratio = _value(entity.dxf.ratio, "the ratio of its axes")
    if math.hypot(*major) == 0 or not 0 < ratio <= 1:
        raise _Unsupported(f"its axes are zero or its ratio of axes ({ratio:g}) is not above 0 "
                           "and at most 1")
    minor = _xy(entity.minor_axis)
    t0 = _value(entity.dxf.start_param, "the start parameter")
    t1 = _value(entity.dxf.end_param, "the end parameter")
    if abs(t0) > 1e6 or abs(t1) > 1e6:
        raise _Unsupported("its start or end parameter is beyond ±1e6 radians")
    while t1 <= t0:
        t1 += 2 * math.pi
    full = abs(t1 - t0 - 2 * math.pi) <= 1e-12
    if abs(ratio - 1) <= 1e-12:  # a circle
        def at(s):
            return (c[0] + major[0] * math.cos(s) + minor[0] * math.sin(s),
                    c[1] + major[1] * math.cos(s) + minor[1] * math.sin(s))
        clockwise = major[0] * minor[1] - major[1] * minor[0] < 0
        if full:
            return [arc_from_centre(at(t0), at(t0 + math.pi), c, clockwise, where=where),
                    arc_from_centre(at(t0 + math.pi), at(t0), c, clockwise, where=where)]
        return [arc_from_centre(at(t0), at(t1), c, clockwise, where=where)]
    t = Var("t")
    cos_t, sin_t = call("cos", (t,)), call("sin", (t,))
    F = _number_tree
    x = F(c[0]) + F(major[0]) * cos_t + F(minor[0]) * sin_t
    y = F(c[1]) + F(major[1]) * cos_t + F(minor[1]) * sin_t
    if full:
        return [curve_from_expressions(x, y, t0, t0 + math.pi, where=where),
                curve_from_expressions(x, y, t0 + math.pi, t1, where=where)]
    return [curve_from_expressions(x, y, t0, t1, where=where)]


def _spline(entity, label: str, file) -> List[Any]:
    degree = int(entity.dxf.degree)
    control = [_xyz(p) for p in entity.control_points]
    if not control:
        raise _Unsupported("it is given by fit points only, whose curve depends on the program "
                           "that drew it; save it with control points")
    if not 1 <= degree <= MAX_SPLINE_DEGREE:
        raise _Unsupported(f"its degree {degree} is outside 1 to {MAX_SPLINE_DEGREE}")
    knots = [_value(u, "a knot") for u in entity.knots]
    if len(knots) != len(control) + degree + 1:
        raise _Unsupported(f"it has {len(knots)} knots but {len(control)} control points of "
                           f"degree {degree} need {len(control) + degree + 1}")
    if any(b < a for a, b in zip(knots, knots[1:])):
        raise _Unsupported("its knots decrease")
    weights = [_value(w, "a weight") for w in entity.weights]
    if weights and len(weights) != len(control):
        raise _Unsupported("it has a different number of weights and control points")
    if weights and min(weights) <= 0:
        raise _Unsupported("it has a weight that is not positive")
    zs = [float(p[2]) for p in control]
    if max(zs) - min(zs) > 1e-9 * max(1.0, max(abs(z) for z in zs)):
        raise _Unsupported("it does not lie in one plane parallel to XY")
    rational = bool(weights) and max(weights) - min(weights) > 1e-15 * max(weights)
    scale = max(max(abs(p[0]), abs(p[1])) for p in control) or 1.0
    if degree == 1:  # straight lines between the control points
        import numpy as np

        pts = np.array([_xy(p) for p in control], dtype=float)
        return _polyline(pts, np.zeros(len(pts)), False, label, file)
    pieces = bezier_pieces(control, knots, degree, weights if rational else None)
    if not pieces:
        raise _Unsupported("its knot vector has no span of positive length")
    segments = []
    for j, (span, X, Y, W) in enumerate(pieces, 1):
        where = Where(file, None, f"{label}, span {j} of {len(pieces)}")
        if rational:
            wscale = max(abs(float(v)) for v in W)
            den = _poly_expr(W / wscale, 1.0)
            x = _poly_expr(X / wscale, scale) / den
            y = _poly_expr(Y / wscale, scale) / den
        else:
            x = _poly_expr(X / W[0], scale)
            y = _poly_expr(Y / W[0], scale)
        if "t" not in x.variables and "t" not in y.variables:
            continue
        segments.append(curve_from_expressions(x, y, 0, 1, where=where,
                                               exact=(Fraction(0), Fraction(1))))
    if not segments:
        raise _Unsupported("every span of it is a single point")
    return segments


# -- chaining ------------------------------------------------------------------------------

def default_gap_tolerance(size: float, unit: str) -> float:
    """The gap tolerance used when none is given, in the drawing's unit.

    The larger of 1e-4 of the drawing's size and 0.001 in (0.0254 mm), but
    at most 1e-3 of the size.

    Examples
    --------
    >>> default_gap_tolerance(2.5, "in")      # a small part drawn in inches: 0.001 in
    0.001
    >>> default_gap_tolerance(1000.0, "mm")   # a large one: 1e-4 of its size
    0.1
    >>> default_gap_tolerance(5.0, "mm")      # a tiny one: 1e-3 of its size
    0.005
    """
    from revolve.units import factor

    absolute = DEFAULT_ABSOLUTE_TOLERANCE_MM * 1e-3 / factor(unit, "length")
    value = min(max(DEFAULT_RELATIVE_TOLERANCE * size, absolute),
                MAX_DEFAULT_RELATIVE_TOLERANCE * size)
    return float(f"{value:.12g}")


def _reverse(segments) -> Tuple[Any, ...]:
    return tuple(s.reversed() for s in reversed(segments))


def _distance(p, q) -> float:
    return math.hypot(p[0] - q[0], p[1] - q[1])


def _join(path: List[Any], nxt: List[Any], labels: Tuple[str, str], tiny: float,
          gaps: List[GapClosed], file) -> None:
    """Make ``nxt`` start where ``path`` ends: a gap is closed on a line, or bridged."""
    a, b = path[-1].end, nxt[0].start
    gap = _distance(a, b)
    if gap == 0:
        return
    how = None
    moved_end = path[-1].with_end_moved(b)
    moved_start = None if moved_end is not None else nxt[0].with_end_moved(a, at_start=True)
    if moved_end is not None:
        path[-1] = moved_end
        how = "moved the end of the straight line"
    elif moved_start is not None:
        nxt[0] = moved_start
        how = "moved the end of the straight line"
    elif gap > tiny:
        nxt.insert(0, Line(a, b, where=Where(file, None,
                                             f"the short line closing the gap between "
                                             f"{labels[0]} and {labels[1]}")))
        how = "added a short straight line across it"
    if gap > tiny and how is not None:
        gaps.append(GapClosed(((a[0] + b[0]) / 2, (a[1] + b[1]) / 2), gap, labels, how))


def _chain_pieces(pieces: List[_Piece], tolerance: float, tiny: float, file,
                  open_chains: bool, skipped_hint: str):
    """Join pieces end to end; returns (paths, gaps) with each path (segments, closed, labels)."""
    import numpy as np
    from scipy.spatial import cKDTree

    n = len(pieces)
    ends = np.array([[p.segments[0].start, p.segments[-1].end] for p in pieces],
                    dtype=float).reshape(2 * n, 2)
    parent = list(range(2 * n))

    def root(i: int) -> int:
        while parent[i] != i:
            parent[i] = parent[parent[i]]
            i = parent[i]
        return i

    for i, j in cKDTree(ends).query_pairs(tolerance, output_type="ndarray"):
        ri, rj = root(int(i)), root(int(j))
        if ri != rj:
            parent[max(ri, rj)] = min(ri, rj)
    node = [root(i) for i in range(2 * n)]
    members: Dict[int, List[int]] = {}
    for e, v in enumerate(node):
        members.setdefault(v, []).append(e)
    for v, ends_here in members.items():
        if len(ends_here) > 2:
            names = ", ".join(pieces[e // 2].label for e in ends_here[:6])
            x, y = ends[ends_here[0]]
            raise FormatError(f"at ({x:.6g}, {y:.6g}) {len(ends_here)} ends meet ({names}); a "
                              "profile boundary cannot branch: remove the extra entities, choose "
                              f"a layer, or lower the gap tolerance ({GAP_OPTION}, now "
                              f"{tolerance:.3g})",
                              file=file)
    visited = [False] * n
    walks = []

    def walk(first_end: int):
        seq = []
        e = first_end
        while True:
            piece, side = divmod(e, 2)
            visited[piece] = True
            seq.append((piece, side == 1))
            exit_end = 2 * piece + (1 - side)
            others = [m for m in members[node[exit_end]] if m != exit_end]
            if not others:
                return seq, False
            if visited[others[0] // 2]:
                return seq, others[0] == first_end
            e = others[0]

    for e in range(2 * n):  # open chains first, from their free ends
        if not visited[e // 2] and len(members[node[e]]) == 1:
            walks.append(walk(e))
    for piece in range(n):
        if not visited[piece]:
            walks.append(walk(2 * piece))
    if not open_chains:
        free = [e for e in range(2 * n) if len(members[node[e]]) == 1]
        if free:
            walk_of = {piece: k for k, (seq, _) in enumerate(walks) for piece, _ in seq}
            _refuse_open(free, ends, pieces, tolerance, file, skipped_hint, walk_of)
    gaps: List[GapClosed] = []
    paths = []
    for seq, closed in walks:
        segs: List[Any] = []
        labels: List[str] = []
        previous = None
        for piece, backwards in seq:
            part = list(_reverse(pieces[piece].segments) if backwards else pieces[piece].segments)
            if segs:
                _join(segs, part, (previous, pieces[piece].label), tiny, gaps, file)
            segs.extend(part)
            previous = pieces[piece].label
            labels.append(pieces[piece].label)
        if closed:
            head = [segs[0]]
            _join(segs, head, (previous, pieces[seq[0][0]].label), tiny, gaps, file)
            if len(head) == 2:  # a short line across the gap, at the end of the loop
                segs.append(head[0])
            else:
                segs[0] = head[0]
        paths.append((segs, closed, labels))
    return paths, gaps


def _refuse_open(free, ends, pieces, tolerance, file, skipped_hint, walk_of) -> None:
    import numpy as np

    e = free[0]
    others = [f for f in free if f != e]
    here = ends[e]
    label = pieces[e // 2].label
    which = "starts" if e % 2 == 0 else "ends"
    text = (f"the drawing does not close: {label} {which} at ({here[0]:.6g}, {here[1]:.6g}) and "
            "meets nothing")
    if others:
        d = np.hypot(*(ends[others] - here).T)
        k = int(np.argmin(d))
        f = others[k]
        whose = ("the other end of the same chain" if walk_of[e // 2] == walk_of[f // 2]
                 else pieces[f // 2].label)
        text += (f"; the nearest free end ({whose}, at ({ends[f][0]:.6g}, {ends[f][1]:.6g})) is "
                 f"{d[k]:.3g} away, more than the gap tolerance {tolerance:.3g}")
    text += (f"; close the gap in the drawing, raise the gap tolerance ({GAP_OPTION}, now "
             f"{tolerance:.3g}), or allow open chains (--open, surfaces only)")
    raise FormatError(text + skipped_hint, file=file)


# -- units and axis -------------------------------------------------------------------------

def _drawing_unit(doc, unit: Optional[str], file) -> Tuple[str, str]:
    code = doc.header.get("$INSUNITS", 0)
    try:
        code = int(code)
    except (TypeError, ValueError):
        code = 0
    if code == 0:
        return (unit or "mm"), ("given" if unit else
                                "assumed: the drawing is unitless ($INSUNITS = 0 or missing)")
    name = INSUNITS.get(code)
    if name is None:
        if unit is not None:
            return unit, (f"given (the drawing's unit, {_INSUNITS_NAMES.get(code, code)}, "
                          f"$INSUNITS = {code}, is not one revolve reads)")
        raise UnitError(f"the drawing's unit ({_INSUNITS_NAMES.get(code, 'code ' + str(code))}, "
                        f"$INSUNITS = {code}) is not one revolve reads; give the unit of its "
                        "coordinates", file=file)
    if unit is not None:
        from revolve.units import canonical

        if canonical(unit, "length") != canonical(name, "length"):
            raise UnitError(f"the drawing says its unit is {name} ($INSUNITS = {code}) but the "
                            f"unit given is {unit}; leave the unit out", file=file)
    return name, f"from the drawing ($INSUNITS = {code})"


def _centre_line(entity) -> Tuple[Tuple[float, float], Tuple[float, float], Any]:
    if entity.dxftype() == "LINE":
        p, q = _xy(entity.dxf.start), _xy(entity.dxf.end)
        return p, (q[0] - p[0], q[1] - p[1]), q
    p = _xy(entity.dxf.start)
    return p, _xy(entity.dxf.unit_vector), None


def _axis_from(candidates, file, tolerance) -> Tuple[Optional[Axis], Optional[str]]:
    lines = []
    for label, entity in candidates:
        p, d, q = _centre_line(entity)
        if math.hypot(*d) == 0:
            continue
        lines.append((label, p, d, q))
    if not lines:
        return None, None
    lines.sort(key=lambda item: -math.hypot(*item[2]))
    label, p, d, q = lines[0]
    n = math.hypot(*d)
    u = (d[0] / n, d[1] / n)
    flip = (u[0] < 0) if abs(u[0]) >= abs(u[1]) else (u[1] < 0)
    for other, p2, d2, q2 in lines[1:]:
        n2 = math.hypot(*d2)
        cross = abs(u[0] * d2[1] - u[1] * d2[0]) / n2
        offset = abs(u[0] * (p2[1] - p[1]) - u[1] * (p2[0] - p[0]))
        if cross > 1e-9 or offset > tolerance:
            names = ", ".join(item[0] for item in lines[:5])
            raise FormatError(f"the centre lines do not lie on one line ({names}); give the axis "
                              "to revolve convert (--axis) or move the other centre lines to "
                              "another layer", file=file)
    if q is not None:
        start, end = (q, p) if flip else (p, q)
        # the point on the axis: the lowest end of any centre line along the direction
        ends = [pt for _, p2, _, q2 in lines for pt in (p2, q2) if pt is not None]
        direction = (end[0] - start[0], end[1] - start[1])
        low = min(ends, key=lambda pt: (pt[0] - start[0]) * direction[0] +
                  (pt[1] - start[1]) * direction[1])
        e0, e1 = _dec_point(start), _dec_point(end)
        exact = (_dec_point(low), (e1[0] - e0[0], e1[1] - e0[1]))
        axis = Axis(low, direction, exact=exact)
    else:
        direction = (-d[0], -d[1]) if flip else d
        axis = Axis(p, direction, exact=(_dec_point(p), _dec_point(direction)))
    more = f" and {len(lines) - 1} more on the same line" if len(lines) > 1 else ""
    return axis, f"from the centre line {label}{more}"


# -- the reader -----------------------------------------------------------------------------

def _label(kind: str, number: int, entity) -> str:
    handle = entity.dxf.get("handle", None)
    layer = entity.dxf.get("layer", "0")
    return f"{kind} #{number} (" + (f"handle {handle}, " if handle else "") + f"layer {layer})"


def _detail(exc: BaseException, path: Optional[str] = None) -> str:
    """A library's message on one line, without the file name (the error names it).

    >>> _detail(ValueError('Invalid group code "1e9\\n" at line 3.'))
    'Invalid group code "1e9\\\\n" at line 3.'
    >>> _detail(StopIteration())
    'StopIteration: the file ends early'
    """
    detail = str(exc)
    if path:
        detail = detail.replace(f"'{path}'", "").replace(path, "")
    detail = one_line(detail.strip())[:200]
    if isinstance(exc, (StopIteration, EOFError)):
        return f"{type(exc).__name__}: the file ends early"
    if "is not a DXF file" in detail or not detail:
        return "it does not start like a DXF file"
    return detail


def _open(path: str):
    import logging

    import ezdxf

    if not os.path.exists(path):
        raise FormatError("no such file; check the name and folder", file=path)
    if os.path.isdir(path):
        raise FormatError("this is a folder, not a drawing", file=path)
    check_file_size(path)
    log = logging.getLogger("ezdxf")
    level = log.level
    log.setLevel(logging.CRITICAL)
    try:
        return ezdxf.readfile(path)
    except PermissionError:
        raise FormatError("permission denied; the file cannot be read", file=path) from None
    except (MemoryError, RecursionError):
        raise FormatError("the drawing is too large or too deeply nested to read",
                          file=path) from None
    except Exception as exc:  # noqa: BLE001 - ezdxf's parser raises many kinds on broken files
        raise FormatError(f"this is not a DXF drawing that can be read ({_detail(exc, path)})",
                          file=path) from None
    finally:
        log.setLevel(level)


def read_dxf(path: str, *, unit: Optional[str] = None, layer: Optional[str] = None,
             axis: Optional[Axis] = None, axis_layer: Optional[str] = None,
             tolerance: Optional[float] = None, open_chains: bool = False,
             keep_strays: bool = False) -> Tuple[ProfileDocument, DrawingReport]:
    """Read a DXF drawing's model space as a profile.

    Parameters
    ----------
    path : str
        The drawing.
    unit : str, optional
        Unit of the coordinates when ``$INSUNITS`` does not say (default
        ``"mm"``); refused when it disagrees.
    layer : str, optional
        Read only entities on this layer (any case); centre lines are
        looked for on every layer.
    axis : Axis, optional
        The axis; otherwise it comes from the centre lines, if any.
    axis_layer : str, optional
        A layer whose lines are centre lines, whatever their linetype.
    tolerance : float, optional
        The gap tolerance for chaining, in the drawing's unit; default
        :func:`default_gap_tolerance`.
    open_chains : bool
        Keep ends that meet nothing as open chains (surfaces only) instead
        of refusing them.
    keep_strays : bool
        Keep loops and chains not joined to the main outline (they are
        warned about either way).

    Returns
    -------
    (ProfileDocument, DrawingReport)

    Raises
    ------
    FormatError
        Not a DXF file; nothing to read; branching ends; open ends (unless
        allowed); disagreeing centre lines.
    UnitError
        A unit that disagrees with ``$INSUNITS``.
    ProfileError
        The profile crossing itself after chaining.

    Examples
    --------
    >>> import os, tempfile, ezdxf
    >>> drawing = ezdxf.new(setup=True)
    >>> drawing.header["$INSUNITS"] = 4
    >>> msp = drawing.modelspace()
    >>> _ = msp.add_lwpolyline([(0, 10), (40, 10), (40, 20), (0, 20)], close=True)
    >>> _ = msp.add_line((-5, 0), (45, 0), dxfattribs={"linetype": "CENTER"})
    >>> name = os.path.join(tempfile.mkdtemp(), "sleeve.dxf")
    >>> drawing.saveas(name)
    >>> doc, report = read_dxf(name)
    >>> len(doc.profile.loops[0].segments), doc.profile.unit, doc.axis.direction
    (4, 'mm', (50.0, 0.0))
    >>> report.axis  # doctest: +ELLIPSIS
    'from the centre line LINE #2 (handle ..., layer 0)'
    """
    drawing = _open(path)
    unit_name, unit_source = _drawing_unit(drawing, unit, path)
    check_length_unit(unit_name, Where(path))
    msp = drawing.modelspace()
    skipped: Dict[Tuple[str, str], List[str]] = {}
    pieces: List[_Piece] = []
    centres = []
    layers_seen: Dict[str, int] = {}
    chosen = layer.casefold() if layer is not None else None

    def skip(what: str, kind: str, reason: str) -> None:
        skipped.setdefault((kind, reason), []).append(what)

    counter = [0]

    def read_entity(entity, number: int, context: str, depth: int,
                    inherited_layer: Optional[str]) -> None:
        counter[0] += 1
        if counter[0] > MAX_ENTITIES:
            raise FormatError(f"the drawing has more than {MAX_ENTITIES} entities (block "
                              "references expanded); simplify it", file=path)
        label = f"entity #{number}{context}"
        kind = "entity"
        try:
            kind = entity.dxftype()
            label = _label(kind, number, entity) + context
            layer_name = entity.dxf.get("layer", "0")
            if inherited_layer is not None and layer_name == "0":
                layer_name = inherited_layer  # block contents on layer 0 take the reference's
            if _is_centre(entity, drawing, axis_layer, layer_name):
                centres.append((label, entity))
                return
            table = drawing.layers.get(layer_name) if drawing.layers.has_entry(layer_name) \
                else None
            if kind not in _SKIP_REASONS:
                layers_seen[layer_name] = layers_seen.get(layer_name, 0) + 1
            if chosen is not None and layer_name.casefold() != chosen:
                skip(label, f"on layer {layer_name}",
                     f"not on the chosen layer {one_line(layer)[:60]}")
                return
            if chosen is None and table is not None and (table.is_off() or table.is_frozen()):
                skip(label, f"on layer {layer_name}", f"the layer {layer_name} is off or frozen")
                return
            if any(word in layer_name.casefold() for word in _CENTRE_LAYER_WORDS) and \
                    kind not in ("LINE", "XLINE", "RAY"):
                skip(label, kind, "it is on a centre-line layer")
                return
            if kind == "INSERT":
                contents = _block_contents(entity, depth)
                name = one_line(entity.dxf.get("name", "?"))
                inside = f" in block '{name}' of {label}"
                for k, item in enumerate(contents, 1):
                    read_entity(item, k, inside, depth + 1, layer_name)
                return
            segments = _entity_segments(entity, label, path)
            pieces.append(_Piece(tuple(segments), label, number))
        except _Unsupported as exc:
            skip(label, kind, str(exc))
        except RevolveError as exc:
            raise exc.located(file=path, place=label) from None
        except (MemoryError, RecursionError):
            raise FormatError("the entity is too large or too deeply nested to read", file=path,
                              place=label) from None
        except Exception as exc:  # noqa: BLE001 - ezdxf raises many kinds on broken entities
            raise FormatError(f"the entity cannot be read ({_detail(exc)})", file=path,
                              place=label) from None

    try:
        entities = list(msp)
    except Exception as exc:  # noqa: BLE001
        raise FormatError(f"the model space cannot be read ({_detail(exc)})", file=path) from None
    for number, entity in enumerate(entities, 1):
        read_entity(entity, number, "", 0, None)
    if chosen is not None and not any(name.casefold() == chosen for name in layers_seen):
        names = ", ".join(sorted(layers_seen)) or "none"
        raise FormatError(f'there is no geometry on layer "{one_line(layer)[:60]}"; layers '
                          f"with entities: {one_line(names)}", file=path)
    skipped_list = _skipped_list(skipped)
    hint = _hint(skipped_list)
    if not pieces:
        raise FormatError("the drawing has no lines, arcs, polylines, splines or ellipses to "
                          "read in its model space" + hint, file=path)
    size = _size(pieces)
    if size == 0:
        raise FormatError("every entity of the drawing is at one point", file=path)
    if tolerance is None:
        tolerance = default_gap_tolerance(size, unit_name)
    elif not (math.isfinite(tolerance) and 0 < tolerance <= MAX_COORDINATE):
        raise FormatError(f"the gap tolerance must be a positive number up to "
                          f"{MAX_COORDINATE:g}, got {tolerance:g}", file=None,
                          place=GAP_OPTION)
    pieces, more = _remove_duplicates_and_specks(pieces, tolerance)
    skipped_list += more
    hint = _hint(skipped_list)
    if not pieces:
        raise FormatError("every entity is smaller than the gap tolerance" + hint, file=path)
    tiny = JOIN_TOLERANCE * size
    paths, gaps = _chain_pieces(pieces, tolerance, tiny, path, open_chains, hint)
    loops, chains, loop_src, chain_src = [], [], [], []
    for segs, closed, labels in paths:
        source = ", ".join(labels[:6]) + (f" and {len(labels) - 6} more" if len(labels) > 6 else "")
        if closed:
            loops.append(Loop(tuple(segs), where=Where(path, None, None)))
            loop_src.append(source)
        else:
            chains.append(Chain(tuple(segs), where=Where(path, None, None)))
            chain_src.append(source)
    profile = Profile(loops=tuple(loops), chains=tuple(chains), unit=unit_name, file=path)
    check_no_crossings(profile, file=path, after="after chaining, ")
    profile, sources, kinds, warnings = separate_strays(profile, loop_src + chain_src,
                                                        keep=keep_strays)
    axis_note = "given" if axis is not None else None
    if axis is None:
        axis, axis_note = _axis_from(centres, path, tolerance)
    elif centres:
        axis_note = f"given (the drawing's {len(centres)} centre line(s) were not used)"
    found_loops, found_chains = summarise_paths(profile, sources, kinds)
    notes = []
    if axis is None:
        notes.append("the drawing has no centre line (a line with a CENTER linetype or on a "
                     "layer named axis or centre); give the axis")
    exact = all(getattr(s, "exact", None) is not None for s in profile.segments())
    report = DrawingReport(source=path, kind="DXF drawing", unit=unit_name,
                           unit_source=unit_source, loops=found_loops, chains=found_chains,
                           gaps_closed=tuple(gaps), skipped=tuple(skipped_list), axis=axis_note,
                           tolerance=tolerance, notes=tuple(notes), warnings=tuple(warnings))
    return ProfileDocument(profile=profile, axis=axis, exact=exact), report


def _skipped_list(skipped) -> List[Skipped]:
    out = []
    for (kind, reason), labels in skipped.items():
        if len(labels) == 1:
            out.append(Skipped(labels[0], reason))
        else:
            shown = ", ".join(labels[:3]) + (", ..." if len(labels) > 3 else "")
            what = f"{len(labels)} entities {kind}" if kind.startswith("on ") else \
                f"{len(labels)} {kind} entities"
            out.append(Skipped(f"{what} ({shown})", reason))
    return out


def _hint(skipped: List[Skipped]) -> str:
    if not skipped:
        return ""
    first = skipped[0]
    more = f" and {len(skipped) - 1} more kind(s)" if len(skipped) > 1 else ""
    return f" (skipped: {first.what}: {first.reason}{more})"


def _flat(piece: _Piece):
    """The piece's points along every segment (the contract's ``flatten``), shape (m, 2)."""
    import numpy as np

    return np.vstack([s.flatten() for s in piece.segments])


def _size(pieces: List[_Piece]) -> float:
    import numpy as np

    boxes = np.array([[f.min(axis=0), f.max(axis=0)] for f in map(_flat, pieces)])
    lo, hi = boxes[:, 0].min(axis=0), boxes[:, 1].max(axis=0)
    return math.hypot(float(hi[0] - lo[0]), float(hi[1] - lo[1]))


def _key(piece: _Piece):
    """What makes two pieces exact duplicates: the same kinds through the same points.

    Each segment's flattened points, in the direction that starts at the
    smaller end, rounded to 1e-12 of their size (so one drawn backwards
    matches), as bytes: one object per segment, none per vertex.
    """
    import numpy as np

    parts = []
    for s in piece.segments:
        pts = s.flatten()
        if tuple(pts[0]) > tuple(pts[-1]):
            pts = pts[::-1]
        scale = float(np.abs(pts).max()) or 1.0
        parts.append((s.kind, (np.round(pts / scale, 12) + 0.0).tobytes()))
    return tuple(sorted(parts))


def _remove_duplicates_and_specks(pieces: List[_Piece], tolerance: float):
    seen: Dict[Any, str] = {}
    kept, skipped = [], []
    for piece in pieces:
        pts = _flat(piece)
        extent = pts.max(axis=0) - pts.min(axis=0)
        if math.hypot(float(extent[0]), float(extent[1])) <= tolerance:
            skipped.append(Skipped(piece.label, f"it is smaller than the gap tolerance "
                                                f"{tolerance:.3g}"))
            continue
        key = _key(piece)
        if key in seen:
            skipped.append(Skipped(piece.label, f"it is an exact duplicate of {seen[key]}"))
            continue
        seen[key] = piece.label
        kept.append(piece)
    return kept, skipped
