"""The contract every segment kind keeps, and what all kinds share.

A segment kind is one module in :mod:`revolve.geometry.kinds` with one frozen
dataclass that subclasses :class:`SegmentKind`. Every algorithm of the engine
(integrals, washers, clipping, horizontal levels, mesh, envelope, writers)
works through the methods below and never asks which kind it holds, so a new
kind is one module plus its tests (see DEVELOPERS.md, "Adding a segment kind").

Each segment has a *parameter* running over :meth:`SegmentKind.parameter_range`
from its start to its end: a fraction 0…1 for a line or an arc, ``t`` for a
curve, the vertex index 0…n−1 for a polyline. Methods that find or cut at
places speak in that parameter, so cutting a polyline at a vertex is exact.

Coordinates are plain floats in the sketch plane (``x``, ``y``); in the axis
frame ``x`` is the axial position ``z`` and ``y`` the radius ``r``.

Examples
--------
>>> from revolve.geometry.segments import Line
>>> seg = Line((0.0, 1.0), (4.0, 3.0))
>>> seg.bounds(), seg.parameters_at(0, 1.0)
((0.0, 1.0, 4.0, 3.0), [0.25])
>>> [s.end for s in seg.split_at([0.5])]
[(2.0, 2.0), (4.0, 3.0)]
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, ClassVar, List, Optional, Sequence, Tuple

Point = Tuple[float, float]

#: Largest coordinate magnitude the engine accepts, in the profile's unit. Moments of
#: inertia need fifth powers of coordinates (∫∫ r³ dA): 1e15 keeps them near 1e75, far
#: from overflow, and far above any real part in any length unit.
COORDINATE_LIMIT = 1e15
#: An arc whose radius is more than this many times its chord is straight within the
#: engine's tolerance (its sagitta is below 1.25e-9 of the chord) and is measured as a line.
FLAT_ARC_RATIO = 1e8
#: Smallest profile size (diagonal of the bounding box) the engine accepts: below it
#: squares and cubes of lengths fall into floating-point underflow.
SIZE_LIMIT = 1e-15
#: The matrix of a map that leaves every point where it is.
IDENTITY_MATRIX = (1.0, 0.0, 0.0, 1.0)


@dataclass(frozen=True)
class Where:
    """Where a segment came from, for error messages.

    >>> str(Where(file="a.toml", line=7, place="loop 1, segment 2"))
    'a.toml:7: loop 1, segment 2'
    >>> str(Where())
    ''
    """

    file: Optional[str] = None
    line: Optional[int] = None
    place: Optional[str] = None

    def __str__(self) -> str:
        head = ""
        if self.file:
            head = self.file + (f":{self.line}" if self.line is not None else "")
        return ": ".join(p for p in (head, self.place) if p)


def finite_point(p: Any, what: str, where: Optional[Where]) -> Point:
    """``p`` as a pair of finite floats, or a :class:`~revolve.errors.SegmentError`.

    >>> finite_point(("1", 2), "arc start", None)
    (1.0, 2.0)
    >>> finite_point((1, float("nan")), "arc start", None)
    Traceback (most recent call last):
    ...
    revolve.errors.SegmentError: arc start (1.0, nan) is not a finite number
    """
    try:
        x, y = float(p[0]), float(p[1])
    except (TypeError, ValueError, IndexError):
        raise segment_error(f"{what} must be a pair of numbers, got {p!r}", where)
    if not (math.isfinite(x) and math.isfinite(y)):
        raise segment_error(f"{what} ({x}, {y}) is not a finite number", where)
    return (x, y)


def segment_error(message: str, where: Optional[Where]):
    """A :class:`~revolve.errors.SegmentError` placed at ``where``."""
    from revolve.errors import SegmentError

    where = where or Where()
    return SegmentError(message, file=where.file, line=where.line, place=where.place)


def map_point(p: Point, matrix, offset=(0.0, 0.0)) -> Point:
    """``M·p + offset`` for one point, skipping zero and unit factors (exact for swaps).

    >>> map_point((2.0, 3.0), (0.0, 1.0, -1.0, 0.0), (1.0, 0.0))
    (4.0, -2.0)
    """
    a, b, c, d = matrix
    x, y = p
    return (combine(a, x, b, y, offset[0]), combine(c, x, d, y, offset[1]))


def combine(a: float, u, b: float, w, c: float = 0.0):
    """``a·u + b·w + c`` for numbers or arrays, skipping zero terms and unit factors.

    Skipping keeps a term that the map drops from reaching the result (``0 × inf``
    would be nan) and keeps translations and swaps exact to the last bit; the
    result has no negative zeros. Every kind maps its points through this one
    function, so a line, a polyline and a curve moved alike agree to the bit.

    >>> combine(0.0, float("inf"), -1.0, 2.0, 0.5), combine(1.0, -0.0, 0.0, 3.0)
    (-1.5, 0.0)
    """
    out = None
    for k, v in ((a, u), (b, w)):
        if k == 0:
            continue
        term = v if k == 1 else (-v if k == -1 else k * v)
        out = term if out is None else out + term
    if out is None:
        if hasattr(u, "shape"):
            import numpy as np

            out = np.zeros_like(u)
        else:
            out = 0.0
    return out + c + 0.0


class SegmentKind:
    """The protocol of a segment kind (inherit it; override what the kind knows exactly).

    Required of a kind, besides the fields ``start``, ``end``, ``face``,
    ``where`` and ``exact`` (a typed record of exact inputs, or None):

    * ``kind`` — a short name ("line", "arc", "curve", "polyline");
    * :meth:`parameter_range`, :meth:`points_at`, :meth:`tangents_at`;
    * :meth:`turning_parameters` — where ``x`` or ``y`` turns back;
    * :meth:`split_at`, :meth:`transformed`, :meth:`reversed`;
    * :meth:`flatten` — points along the segment;
    * :meth:`integral_rows` — the exact section integrals of many segments of the
      kind at once (a class method).

    Everything else has a generic implementation here built on those, which a
    kind may replace by a closed form (bounds, length, parameters at a value).
    """

    kind: ClassVar[str] = "segment"
    start: Point
    end: Point
    face: Optional[str]
    where: Optional[Where]
    exact: Any

    # -- required --------------------------------------------------------------------

    def parameter_range(self) -> Tuple[float, float]:
        """The parameter at the start and at the end."""
        raise NotImplementedError

    def points_at(self, params):
        """Points at parameters ``params``, as an array of shape (m, 2)."""
        raise NotImplementedError

    def tangents_at(self, params):
        """Derivatives ``(dx/dp, dy/dp)`` at parameters ``params``, shape (m, 2)."""
        raise NotImplementedError

    def turning_parameters(self, coordinate: int) -> List[float]:
        """Parameters strictly inside the range where ``x`` (0) or ``y`` (1) turns back, in order."""
        raise NotImplementedError

    def split_at(self, params: Sequence[float]) -> tuple:
        """Pieces between the given parameters (sorted, strictly inside), in order."""
        raise NotImplementedError

    def transformed(self, matrix=IDENTITY_MATRIX, offset=(0.0, 0.0), exact=None):
        """The segment mapped by ``p -> M·p + offset`` (a mirror reverses an arc's turn)."""
        raise NotImplementedError

    def reversed(self):
        """The same segment travelled the other way (exact inputs kept)."""
        raise NotImplementedError

    def flatten(self, max_angle: float = math.pi / 36, curve_pieces: int = 64):
        """Points along the segment, start and end included, shape (m + 1, 2)."""
        raise NotImplementedError

    @classmethod
    def integral_rows(cls, segments: Sequence["SegmentKind"], symbolic: bool = False):
        """Section integrals of many segments of this kind: ``(values, errors, methods)``.

        ``values`` and ``errors`` have one row per segment and the columns of
        :data:`revolve.geometry.integrals.COLUMNS`; ``methods`` says how each
        row was found ("closed form", "quadrature", "symbolic", ...).
        """
        raise NotImplementedError

    # -- generic -----------------------------------------------------------------------

    def point_at(self, s: float) -> Point:
        """Point at fraction ``s`` in [0, 1] of the parameter range."""
        p0, p1 = self.parameter_range()
        x, y = self.points_at([p0 + s * (p1 - p0)])[0]
        return (float(x), float(y))

    def length(self) -> float:
        """Length, from the flattened points (kinds with a closed form override it)."""
        import numpy as np

        pts = self.flatten(math.pi / 720, 4096)
        return float(np.hypot(*np.diff(pts, axis=0).T).sum())

    def bounds(self) -> Tuple[float, float, float, float]:
        """``(x_min, y_min, x_max, y_max)``: exact wherever the turning points are."""
        import numpy as np

        p0, p1 = self.parameter_range()
        params = [p0, p1] + self.turning_parameters(0) + self.turning_parameters(1)
        pts = np.asarray(self.points_at(params), dtype=float)
        pts = np.vstack([pts, [self.start, self.end]])
        lo, hi = pts.min(axis=0), pts.max(axis=0)
        return (float(lo[0]), float(lo[1]), float(hi[0]), float(hi[1]))

    def monotone_ranges(self, coordinate: int) -> List[Tuple[float, float]]:
        """Parameter ranges along which ``x`` (0) or ``y`` (1) moves one way only.

        >>> from revolve.geometry.segments import arc_from_centre
        >>> arc = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
        >>> arc.monotone_ranges(1)        # y rises to the top of the half circle, then falls
        [(0.0, 0.5), (0.5, 1.0)]
        """
        p0, p1 = self.parameter_range()
        cuts = [p0] + self.turning_parameters(coordinate) + [p1]
        return list(zip(cuts[:-1], cuts[1:]))

    def parameters_at(self, coordinate: int, value: float) -> List[float]:
        """Parameters where ``x`` (0) or ``y`` (1) equals ``value``, one per monotone piece that reaches it.

        Each monotone piece is searched by bisection to the last bit (kinds
        with a closed form override this).
        """
        out = []
        for a, b in self.monotone_ranges(coordinate):
            fa = float(self.points_at([a])[0][coordinate]) - value
            fb = float(self.points_at([b])[0][coordinate]) - value
            if fa == 0:
                if not out or out[-1] != a:
                    out.append(a)
                continue
            if fb == 0:
                out.append(b)
                continue
            if (fa > 0) == (fb > 0):
                continue
            lo, hi = a, b
            for _ in range(200):
                m = 0.5 * (lo + hi)
                if m == lo or m == hi:
                    break
                fm = float(self.points_at([m])[0][coordinate]) - value
                if fm == 0:
                    lo = hi = m
                    break
                if (fm > 0) == (fa > 0):
                    lo = m
                else:
                    hi = m
            out.append(0.5 * (lo + hi))
        return out

    def translated(self, dx: float, dy: float = 0.0):
        """The segment moved by ``(dx, dy)``."""
        if dx == 0 and dy == 0:
            return self
        return self.transformed(IDENTITY_MATRIX, (dx, dy))

    def split(self, s: float = 0.5) -> tuple:
        """Two pieces, cut at fraction ``s`` of the parameter range."""
        p0, p1 = self.parameter_range()
        return self.split_at([p0 + s * (p1 - p0)])

    def straightened(self):
        """The segment as the kind the engine should measure it as (a flat arc is a line)."""
        return self

    def snapped(self, tiny: float):
        """The segment with stored coordinates below ``tiny`` in magnitude set to zero."""
        return self

    def chord_count(self) -> int:
        """How many chords :meth:`flatten` gives with its defaults (for sizing work)."""
        return len(self.flatten()) - 1

    def edge_count(self) -> int:
        """How many segments this one counts as in messages ("loop 1, segment 5"): one.

        A kind holding many edges (a polyline) counts each, and its
        :meth:`flatten` gives exactly those edges.
        """
        return 1

    def where_at(self, edge: int) -> Optional[Where]:
        """Where edge ``edge`` of the segment came from (for a one-edge kind, the segment)."""
        return self.where
