"""Straight lines.

Examples
--------
>>> seg = Line((0.0, 1.0), (3.0, 1.0), face="bore")
>>> seg.length(), seg.turning_parameters(0)
(3.0, [])
>>> Line((0.0, 0.0), (2.0, 4.0), exact=(0, 0, 2, 4)).reversed().exact
LineExact(x0=2, y0=4, x1=0, y1=0)
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace
from typing import Any, NamedTuple, Optional, Sequence

from revolve.geometry.kinds.base import IDENTITY_MATRIX, Point, SegmentKind, Where, map_point


class LineExact(NamedTuple):
    """The exact coordinates of a line's ends (fractions, decimals or sympy numbers)."""

    x0: Any
    y0: Any
    x1: Any
    y1: Any


@dataclass(frozen=True)
class Line(SegmentKind):
    """A straight segment from ``start`` to ``end``; its parameter is the fraction 0…1.

    Parameters
    ----------
    start, end : (float, float)
        The ends, in the profile's unit.
    face : str, optional
        The face the segment belongs to (surfaces are reported by face).

    Examples
    --------
    >>> Line((0.0, 0.0), (3.0, 4.0)).length()
    5.0
    >>> Line((0.0, 0.0), (3.0, 4.0), face="cone").points_at([0.5]).tolist()
    [[1.5, 2.0]]

    A zero-length line is allowed (it adds nothing), and one on the axis
    sweeps no surface:

    >>> Line((1.0, 1.0), (1.0, 1.0)).length()
    0.0
    >>> import revolve
    >>> loop = revolve.Loop((revolve.Line((0, 0), (4, 0), face="axis"),
    ...                      revolve.Line((4, 0), (4, 2)), revolve.Line((4, 2), (0, 0))))
    >>> revolve.measure(revolve.Profile(loops=(loop,))).to_dict()["surface_by_face"]["axis"]
    0.0
    """

    start: Point
    end: Point
    face: Optional[str] = None
    where: Optional[Where] = field(default=None, compare=False, repr=False)
    exact: Optional[LineExact] = field(default=None, compare=False, repr=False)

    kind = "line"

    def __post_init__(self):
        if self.exact is not None and not isinstance(self.exact, LineExact):
            object.__setattr__(self, "exact", LineExact(*self.exact))

    def length(self) -> float:
        return math.hypot(self.end[0] - self.start[0], self.end[1] - self.start[1])

    def parameter_range(self):
        return (0.0, 1.0)

    def point_at(self, s: float) -> Point:
        """Point at fraction ``s`` in [0, 1] of the way along.

        >>> Line((0.0, 0.0), (2.0, 0.0)).point_at(0.25)
        (0.5, 0.0)
        """
        if s == 0:
            return self.start
        if s == 1:
            return self.end
        return (self.start[0] + s * (self.end[0] - self.start[0]),
                self.start[1] + s * (self.end[1] - self.start[1]))

    def points_at(self, params):
        import numpy as np

        s = np.asarray(params, dtype=float).reshape(-1, 1)
        a, b = np.array(self.start), np.array(self.end)
        out = a + s * (b - a)
        out[s[:, 0] == 1.0] = b
        return out

    def tangents_at(self, params):
        import numpy as np

        n = np.asarray(params, dtype=float).size
        return np.tile([self.end[0] - self.start[0], self.end[1] - self.start[1]], (n, 1))

    def turning_parameters(self, coordinate: int):
        return []

    def parameters_at(self, coordinate: int, value: float):
        """Where ``x`` (0) or ``y`` (1) equals ``value``: at most one parameter.

        >>> Line((0.0, 0.0), (4.0, 2.0)).parameters_at(1, 0.5)
        [0.25]
        >>> Line((0.0, 1.0), (4.0, 1.0)).parameters_at(1, 1.0)   # along the line: its start
        [0.0]
        """
        a, b = self.start[coordinate], self.end[coordinate]
        if a == value:
            return [0.0]
        if b == value:
            return [1.0]
        if (a < value) == (b < value):
            return []
        return [(value - a) / (b - a)]

    def bounds(self):
        (x0, y0), (x1, y1) = self.start, self.end
        return (min(x0, x1), min(y0, y1), max(x0, x1), max(y0, y1))

    def split_at(self, params: Sequence[float]) -> tuple:
        pts = [self.start] + [self.point_at(s) for s in params] + [self.end]
        if not params:
            return (self,)
        return tuple(replace(self, start=p, end=q, exact=None) for p, q in zip(pts[:-1], pts[1:]))

    def transformed(self, matrix=IDENTITY_MATRIX, offset=(0.0, 0.0), exact=None):
        return replace(self, start=map_point(self.start, matrix, offset),
                       end=map_point(self.end, matrix, offset), exact=None)

    def translated(self, dx: float, dy: float = 0.0):
        if dx == 0 and dy == 0:
            return self
        return replace(self, start=(self.start[0] + dx, self.start[1] + dy),
                       end=(self.end[0] + dx, self.end[1] + dy), exact=None)

    def reversed(self) -> "Line":
        ex = self.exact
        return replace(self, start=self.end, end=self.start,
                       exact=None if ex is None else LineExact(ex.x1, ex.y1, ex.x0, ex.y0))

    def flatten(self, max_angle: float = math.pi / 36, curve_pieces: int = 64):
        """The two ends.

        >>> Line((0.0, 0.0), (1.0, 1.0)).flatten().tolist()
        [[0.0, 0.0], [1.0, 1.0]]
        """
        import numpy as np

        return np.array([self.start, self.end], dtype=float)

    def snapped(self, tiny: float):
        """Ends with coordinates below ``tiny`` set to zero.

        >>> Line((5e-324, 0.5625), (2.5, 0.5625)).snapped(1e-15)
        Line(start=(0.0, 0.5625), end=(2.5, 0.5625), face=None)
        """
        a, b = _snap(self.start, tiny), _snap(self.end, tiny)
        return self if (a, b) == (self.start, self.end) else replace(self, start=a, end=b)

    def chord_count(self) -> int:
        return 1

    @classmethod
    def integral_rows(cls, segments, symbolic: bool = False):
        """Closed forms for every line at once.

        >>> v, e, how = Line.integral_rows([Line((1.0, 0.0), (1.0, 2.0))])
        >>> float(v[0][0]), how
        (2.0, ('closed form',))
        """
        import numpy as np

        from revolve.geometry.integrals import closed_form_errors, line_integrals

        se = np.array([s.start + s.end for s in segments], dtype=float).reshape(-1, 4)
        values = line_integrals(se[:, 0], se[:, 1], se[:, 2], se[:, 3])
        return values, closed_form_errors(values), ("closed form",) * len(segments)

    # -- for meshes and pictures (mesh.py) ----------------------------------------------

    def flatten_to_tolerance(self, tolerance: float, most_pieces: int = 1_000_000):
        """Points whose chords stay within ``tolerance`` of the segment, shape (m + 1, 2).

        A line is its own chord: its two ends, whatever the tolerance.

        >>> Line((0.0, 1.0), (2.0, 1.0)).flatten_to_tolerance(0.1).tolist()
        [[0.0, 1.0], [2.0, 1.0]]
        >>> Line((1.0, 1.0), (1.0, 1.0)).flatten_to_tolerance(1e-9).shape   # zero length
        (2, 2)
        """
        import numpy as np

        return np.array([self.start, self.end], dtype=float)

    def fewest_chords(self, tolerance: float) -> int:
        """The fewest chords :meth:`flatten_to_tolerance` gives (to refuse a mesh before any work).

        >>> Line((0.0, 0.0), (5.0, 0.0)).fewest_chords(1e-6)
        1
        """
        return 1

    # -- for profile files (writer.py) ---------------------------------------------------

    def describe_to(self, out) -> None:
        """Tell a profile writer ``out`` what the line is, through its primitive ``straight``.

        ``out.straight(points, exact)`` takes the points from the start through
        each vertex (here the two ends) and their exact coordinates, or None.

        >>> class Out:
        ...     def straight(self, points, exact):
        ...         print(points, exact)
        >>> Line((0.0, 1.0), (2.0, 1.0), exact=(0, 1, 2, 1)).describe_to(Out())
        ((0.0, 1.0), (2.0, 1.0)) ((0, 1), (2, 1))
        >>> Line((0.0, 1.0), (2.0, 1.0)).describe_to(Out())
        ((0.0, 1.0), (2.0, 1.0)) None
        """
        ex = self.exact
        out.straight((self.start, self.end),
                     None if ex is None else ((ex.x0, ex.y0), (ex.x1, ex.y1)))

    # -- for drawings: closing gaps between entities (dxf.py) ---------------------------

    def with_end_moved(self, point, at_start: bool = False):
        """The line with its end (or start) moved onto ``point``; None if it would have no length.

        A straight end can move without changing the rest of the segment's shape.

        >>> Line((0.0, 0.0), (1.0, 0.0)).with_end_moved((1.0, 1e-6))
        Line(start=(0.0, 0.0), end=(1.0, 1e-06), face=None)
        >>> Line((0.0, 0.0), (1.0, 0.0)).with_end_moved((1.0, 0.0), at_start=True) is None
        True
        """
        point = (float(point[0]), float(point[1]))
        if point == (self.end if at_start else self.start):
            return None
        if at_start:
            return replace(self, start=point, exact=None)
        return replace(self, end=point, exact=None)

    # -- for level tables (clipping.py, horizontal.py)

    @classmethod
    def axial_level_table(cls, segments, factors):
        """Lines in the axis frame as straight rows ``z0, r0, z1, r1`` (vertical level tables).

        >>> t = Line.axial_level_table([Line((0.0, 1.0), (2.0, 1.0))], [1.0])
        >>> t.rows.tolist(), t.factor.tolist()
        ([[0.0, 1.0, 2.0, 1.0]], [1.0])
        """
        import numpy as np

        from revolve.geometry.clipping import StraightPieces

        rows = np.array([s.start + s.end for s in segments], dtype=float).reshape(-1, 4)
        return StraightPieces(rows, np.asarray(factors, dtype=float))

    def part_below(self, level: float, tolerance: float = 0.0):
        """``(parts with x < level, flat parts lying in the level plane)``, as tuples of lines.

        The cut point is found from the lower end, with ``x`` exactly the level; a
        line perpendicular to ``x`` within ``tolerance`` above the level touches it.

        >>> Line((0.0, 1.0), (4.0, 3.0)).part_below(1.0)
        ((Line(start=(0.0, 1.0), end=(1.0, 1.5), face=None),), ())
        >>> Line((2.0, 1.0), (2.0, 3.0)).part_below(2.0, 1e-9)   # a flat face at the level
        ((), (Line(start=(2.0, 1.0), end=(2.0, 3.0), face=None),))
        >>> Line((5.0, 1.0), (6.0, 1.0)).part_below(2.0)
        ((), ())
        """
        z0, z1 = self.start[0], self.end[0]
        touching = (self,) if z0 == z1 and level <= z0 <= level + tolerance else ()
        if max(z0, z1) <= level:
            return ((self,) if min(z0, z1) < level else ()), touching
        if min(z0, z1) >= level:
            return (), touching
        (zl, rl), (zh, rh) = sorted((self.start, self.end))
        cut = (level, rl + (level - zl) / (zh - zl) * (rh - rl))   # from the lower end
        part = replace(self, end=cut, exact=None) if z0 < z1 else replace(self, start=cut, exact=None)
        return (part,), touching

    @classmethod
    def radial_level_table(cls, segments, factors, z_ref: float = 0.0):
        """Lines as straight rows ``z0, r0, z1, r1`` with z from ``z_ref`` (horizontal tables).

        >>> Line.radial_level_table([Line((3.0, 1.0), (5.0, 2.0))], [1.0], z_ref=4.0).line.tolist()
        [[-1.0, 1.0, 1.0, 2.0]]
        """
        import numpy as np

        from revolve.geometry.horizontal import StraightRows

        rows = np.array([s.start + s.end for s in segments], dtype=float).reshape(-1, 4)
        rows[:, [0, 2]] -= z_ref
        return StraightRows(rows, np.asarray(factors, dtype=float))

    # -- for the washer cross-check (slicing.py) ------------------------------------------

    @classmethod
    def washer_pieces(cls, segments):
        """Pieces of many lines along which the axial position moves one way, as arrays.

        Parameters
        ----------
        segments : sequence of Line
            Lines in the axis frame (``x`` is the axial position ``z``, ``y`` the radius).

        Returns
        -------
        z_from, z_to : ndarray
            Each piece's axial position at its start and at its end (a line across
            the axis direction gives a piece with ``z_from == z_to``, which the
            washers leave out).
        counts : ndarray of int
            How many pieces each segment gives, in order (a line: one).
        params : ndarray, shape (pieces, 4)
            One row per piece for :meth:`washer_radius`: the ends ``z0, r0, z1, r1``.

        Examples
        --------
        >>> zf, zt, counts, params = Line.washer_pieces([Line((0.0, 1.0), (2.0, 3.0))])
        >>> zf.tolist(), zt.tolist(), counts.tolist(), params.tolist()
        ([0.0], [2.0], [1], [[0.0, 1.0, 2.0, 3.0]])
        >>> [a.shape for a in Line.washer_pieces([])]
        [(0,), (0,), (0,), (0, 4)]
        """
        import numpy as np

        rows = _end_rows(segments)
        return rows[:, 0], rows[:, 2], np.ones(len(rows), dtype=np.int64), rows

    @classmethod
    def washer_radius(cls, segments, params, z):
        """The radius at axial positions ``z`` along pieces of :meth:`washer_pieces`.

        ``params`` holds the pieces' rows (shape (m, 4)) and ``z`` one row of
        positions per piece (shape (m, q)), each within its piece's extent;
        ``segments`` (the sequence given to :meth:`washer_pieces`) is not needed
        by a line.

        Examples
        --------
        >>> import numpy as np
        >>> Line.washer_radius([], np.array([[0.0, 1.0, 2.0, 3.0]]), np.array([[0.5, 2.0]])).tolist()
        [[1.5, 3.0]]
        """
        z0, r0, z1, r1 = (params[:, k:k + 1] for k in range(4))
        return r0 + (z - z0) * ((r1 - r0) / (z1 - z0))

    @classmethod
    def washer_degree(cls):
        """Degree of the radius as a polynomial of ``z`` along a piece: 1 (None if not polynomial).

        The washers integrate ``r²`` over each piece's part of a slice with
        Gauss–Legendre rules in ``z`` of ``degree + 1`` and ``degree + 2`` nodes
        (exact for this kind, compared all the same) instead of the smoothing
        substitution that arcs and curves need.

        >>> Line.washer_degree()
        1
        """
        return 1

    @classmethod
    def r_ds_rows(cls, segments, n: int = 32, rel_tol: float = 1e-14):
        """``∫ r ds`` along each line by Gauss–Legendre quadrature: ``(values, errors)``.

        ``r`` is linear along a line, so one node (the middle) and two nodes
        are both exact; their difference is the error estimate. ``n`` and
        ``rel_tol`` (used by curved kinds) change nothing here.

        >>> v, e = Line.r_ds_rows([Line((0.0, 1.0), (0.0, 3.0)), Line((0.0, 0.0), (3.0, 4.0))])
        >>> v.tolist(), e.tolist()
        ([4.0, 10.0], [0.0, 0.0])
        """
        rows = _end_rows(segments)
        return _r_ds_straight(rows[:, 0], rows[:, 1], rows[:, 2], rows[:, 3])


def _end_rows(segments):
    """The ends ``x0, y0, x1, y1`` of many lines as an (n, 4) array (no list of tuples).

    >>> _end_rows([Line((0.0, 1.0), (2.0, 3.0))]).tolist()
    [[0.0, 1.0, 2.0, 3.0]]
    """
    from itertools import chain

    import numpy as np

    values = chain.from_iterable(s.start + s.end for s in segments)
    return np.fromiter(values, dtype=float, count=4 * len(segments)).reshape(-1, 4)


def _r_ds_straight(z0, r0, z1, r1, work=None):
    """Per edge, ``∫ r ds`` by Gauss–Legendre with 2 nodes and the difference from 1 node.

    Shared by lines and polylines (the edges of both are straight).

    >>> import numpy as np
    >>> v, e = _r_ds_straight(np.array([0.0]), np.array([1.0]), np.array([0.0]), np.array([3.0]))
    >>> v.tolist(), e.tolist()
    ([4.0], [0.0])
    """
    import numpy as np

    from revolve.geometry.quadrature import gauss_legendre

    # The same operations in the same order as written out plainly, in place: at 10⁶ edges
    # every full-size temporary saved is a pass over memory saved. ``work`` may give four
    # arrays of the edges' count to work in (a caller going block by block reuses them).
    if work is None:
        work = np.empty((4, np.shape(z0)[0]))
    dr, half, one, two = work
    np.subtract(r1, r0, out=dr)
    np.subtract(z1, z0, out=half)
    np.hypot(half, dr, out=half)
    half *= 0.5
    (x1,), (w1,) = gauss_legendre(1)
    x2, w2 = gauss_legendre(2)
    np.multiply(dr, (x1 + 1) * 0.5, out=one)
    one += r0
    one *= w1
    np.multiply(dr, (x2[0] + 1) * 0.5, out=two)
    two += r0
    two *= w2[0]
    node = np.multiply(dr, (x2[1] + 1) * 0.5, out=dr)
    node += r0
    node *= w2[1]
    two += node
    one -= two                       # the difference (its sign does not matter)
    np.abs(one, out=one)
    one *= half
    two *= half
    return two, one




def _snap(p: Point, tiny: float) -> Point:
    return (0.0 if abs(p[0]) < tiny else p[0], 0.0 if abs(p[1]) < tiny else p[1])
