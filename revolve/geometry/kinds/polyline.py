"""Polylines: many straight edges held as one array, with no Python object per vertex.

A point list, a long drawing polyline or a scanned outline becomes one
:class:`Polyline` whose vertices are an ``(n, 2)`` float array. Its parameter
is the vertex index: ``0`` at the first vertex, ``n − 1`` at the last, and
``i + f`` a fraction ``f`` of the way along edge ``i``. Every method works on
the whole array at once, so a 10⁶-vertex outline costs a few passes over
memory. Its integrals are the closed forms of lines, summed edge by edge.

``lines`` may give the source line of each vertex (for error messages);
``first_edge`` numbers its edges when the polyline is a piece of a longer path.

Examples
--------
>>> import numpy as np
>>> zigzag = Polyline(np.array([[0.0, 1.0], [1.0, 2.0], [2.0, 1.0], [3.0, 2.0]]))
>>> zigzag.start, zigzag.end, zigzag.turning_parameters(1)
((0.0, 1.0), (3.0, 2.0), [1.0, 2.0])
>>> zigzag.parameters_at(1, 1.5)
[0.5, 1.5, 2.5]
>>> [(p.start, p.end) for p in zigzag.split_at([1.0, 2.5])]
[((0.0, 1.0), (1.0, 2.0)), ((1.0, 2.0), (2.5, 1.5)), ((2.5, 1.5), (3.0, 2.0))]
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace
from typing import NamedTuple, Optional, Sequence

from revolve.geometry.kinds.base import IDENTITY_MATRIX, SegmentKind, Where, combine


class _Numpy:
    """numpy, imported on first use: reading a profile of lines and arcs must not import it."""

    def __getattr__(self, name):
        import numpy

        return getattr(numpy, name)


np = _Numpy()


class PolylineExact(NamedTuple):
    """Exact vertex coordinates, ``((x0, y0), (x1, y1), ...)``, for ``--exact`` only."""

    points: tuple


def map_points(points: np.ndarray, matrix=IDENTITY_MATRIX, offset=(0.0, 0.0)) -> np.ndarray:
    """``M·p + offset`` for every row, skipping zero and unit factors (exact for swaps).

    The same operations, in the same order, as
    :func:`revolve.geometry.kinds.base.map_point` on each point.

    >>> map_points(np.array([[2.0, 3.0]]), (0.0, 1.0, -1.0, 0.0), (1.0, 0.0)).tolist()
    [[4.0, -2.0]]
    """
    a, b, c, d = matrix
    x, y = points[:, 0], points[:, 1]
    out = np.empty_like(points)
    out[:, 0] = combine(a, x, b, y, offset[0])
    out[:, 1] = combine(c, x, d, y, offset[1])
    return out


@dataclass(frozen=True, eq=False)
class Polyline(SegmentKind):
    """Straight edges through ``points`` (an (n, 2) array, n ≥ 2), in order.

    Many points are held as one array (a point list of 10⁶ vertices is one
    segment, not 10⁶ objects); :meth:`revolve.Loop.from_points` builds one.

    Parameters
    ----------
    points : (n, 2) array_like
        The vertices in order, n ≥ 2.
    face : str, optional
        The face every edge belongs to.

    Examples
    --------
    >>> p = Polyline(np.array([[0.0, 0.0], [3.0, 4.0], [3.0, 5.0]]), face="side")
    >>> p.length(), p.bounds(), p.chord_count()
    (6.0, (0.0, 0.0, 3.0, 5.0), 2)

    Two equal points are a zero-length polyline; one point is refused:

    >>> Polyline(np.array([[1.0, 2.0], [1.0, 2.0]])).length()
    0.0
    >>> Polyline(np.array([[1.0, 2.0]]))
    Traceback (most recent call last):
    ...
    revolve.errors.SegmentError: a polyline needs an (n, 2) array of at least two points
    """

    points: np.ndarray
    face: Optional[str] = None
    where: Optional[Where] = field(default=None, repr=False)
    exact: Optional[PolylineExact] = field(default=None, repr=False)
    lines: Optional[np.ndarray] = field(default=None, repr=False)
    first_edge: int = field(default=0, repr=False)

    kind = "polyline"

    def __post_init__(self):
        pts = np.asarray(self.points, dtype=float)
        if pts.ndim != 2 or pts.shape[1] != 2 or len(pts) < 2:
            from revolve.geometry.kinds.base import segment_error

            raise segment_error("a polyline needs an (n, 2) array of at least two points",
                                self.where)
        if pts is self.points and pts.flags.writeable:
            pts = pts.copy()
        pts.flags.writeable = False
        object.__setattr__(self, "points", pts)

    def __eq__(self, other) -> bool:
        if not isinstance(other, Polyline):
            return NotImplemented
        return self.face == other.face and np.array_equal(self.points, other.points)

    def __hash__(self) -> int:
        return hash(("polyline", self.face, len(self.points), self.start, self.end))

    def __repr__(self) -> str:
        return (f"Polyline({len(self.points)} points from {self.start} to {self.end}, "
                f"face={self.face!r})")

    @property
    def start(self):
        return (float(self.points[0, 0]), float(self.points[0, 1]))

    @property
    def end(self):
        return (float(self.points[-1, 0]), float(self.points[-1, 1]))

    def edge_lengths(self) -> np.ndarray:
        d = np.diff(self.points, axis=0)
        return np.hypot(d[:, 0], d[:, 1])

    def length(self) -> float:
        return float(self.edge_lengths().sum())

    def parameter_range(self):
        return (0.0, float(len(self.points) - 1))

    def _locate(self, params):
        p = np.asarray(params, dtype=float).reshape(-1)
        i = np.clip(np.floor(p).astype(np.int64), 0, len(self.points) - 2)
        return p, i, p - i

    def points_at(self, params):
        p, i, f = self._locate(params)
        a, b = self.points[i], self.points[i + 1]
        out = a + f[:, None] * (b - a)
        whole = f == 0.0
        out[whole] = a[whole]
        end = f == 1.0
        out[end] = b[end]
        return out

    def tangents_at(self, params):
        _, i, _ = self._locate(params)
        return self.points[i + 1] - self.points[i]

    def turning_parameters(self, coordinate: int):
        """Vertices where ``x`` (0) or ``y`` (1) turns back (the first of a level run)."""
        d = np.diff(self.points[:, coordinate])
        nz = np.flatnonzero(d != 0)
        if nz.size < 2:
            return []
        s = d[nz] > 0
        k = np.flatnonzero(s[1:] != s[:-1])
        return [float(v) for v in nz[k] + 1]

    def parameters_at(self, coordinate: int, value: float):
        """Every parameter where ``x`` (0) or ``y`` (1) equals ``value`` (vertices once)."""
        c = self.points[:, coordinate]
        a, b = c[:-1], c[1:]
        at_vertex = np.flatnonzero(c == value).astype(float)
        cross = np.flatnonzero(((a < value) & (b > value)) | ((a > value) & (b < value)))
        f = (value - a[cross]) / (b[cross] - a[cross])
        return sorted(set(at_vertex.tolist()) | set((cross + f).tolist()))

    def bounds(self):
        # Kept once found (the points are read-only): preparing, the section and the washers
        # each ask for them, and each asking would be a pass over the whole array.
        box = self.__dict__.get("_bounds")
        if box is None:
            # column by column: a reduction along axis 0 of an (n, 2) array is many times slower
            x, y = self.points[:, 0], self.points[:, 1]
            box = (float(x.min()), float(y.min()), float(x.max()), float(y.max()))
            self.__dict__["_bounds"] = box        # frozen: the cache goes straight into the dict
        return box

    def split_at(self, params: Sequence[float]) -> tuple:
        if not len(params):
            return (self,)
        out = []
        ps = [0.0] + [float(p) for p in params] + [float(len(self.points) - 1)]
        for a, b in zip(ps[:-1], ps[1:]):
            ia, ib = int(math.ceil(a)), int(math.floor(b))
            inner = self.points[ia:ib + 1]
            parts = []
            if a != ia:
                parts.append(self.points_at([a]))
            parts.append(inner)
            if b != ib:
                parts.append(self.points_at([b]))
            pts = np.vstack(parts) if len(parts) > 1 else inner.copy()
            lines = None
            if self.lines is not None:
                lines = self.lines[min(int(a), len(self.lines) - 1):][:len(pts)]
                if len(lines) < len(pts):
                    lines = np.concatenate([lines, np.full(len(pts) - len(lines), lines[-1])])
            out.append(Polyline(pts, face=self.face, where=self.where, lines=lines,
                                first_edge=self.first_edge + int(a)))
        return tuple(out)

    def transformed(self, matrix=IDENTITY_MATRIX, offset=(0.0, 0.0), exact=None):
        return replace(self, points=_owned(map_points(self.points, matrix, offset)), exact=None)

    def translated(self, dx: float, dy: float = 0.0):
        if dx == 0 and dy == 0:
            return self
        # column by column: broadcasting over rows of two runs many times slower
        pts = np.empty_like(self.points)
        np.add(self.points[:, 0], dx, out=pts[:, 0])
        np.add(self.points[:, 1], dy, out=pts[:, 1])
        return replace(self, points=_owned(pts), exact=None)

    def reversed(self) -> "Polyline":
        ex = self.exact
        return replace(self, points=_owned(self.points[::-1].copy()),
                       exact=None if ex is None else PolylineExact(tuple(reversed(ex.points))),
                       lines=None if self.lines is None else self.lines[::-1].copy())

    def flatten(self, max_angle: float = math.pi / 36, curve_pieces: int = 64):
        return self.points

    def snapped(self, tiny: float):
        """The polyline with coordinates of magnitude below ``tiny`` set to zero (``+0.0``).

        Only a column whose range comes within ``tiny`` of zero is read, and the
        array is copied only when some coordinate changes; the copy keeps the
        bounds, found without another pass.

        >>> p = Polyline(np.array([[1e-20, 1.0], [2.0, 0.0], [-0.0, 3.0]]))
        >>> q = p.snapped(1e-12)
        >>> q.points.tolist(), q.bounds(), q.bounds() == Polyline(q.points).bounds()
        ([[0.0, 1.0], [2.0, 0.0], [0.0, 3.0]], (0.0, 0.0, 2.0, 3.0), True)
        >>> exact_zeros = Polyline(np.array([[0.0, 1.0], [2.0, 0.0]]))
        >>> exact_zeros.snapped(1e-12) is exact_zeros            # nothing to change: no copy
        True
        """
        box = list(self.bounds())
        pts = None
        for k in (0, 1):
            lo, hi = box[k], box[k + 2]
            if not (lo < tiny and hi > -tiny):
                continue                  # no coordinate of this column is that small
            col = self.points[:, k]
            small = np.less(col, tiny)                 # |col| < tiny, no float temporary
            small &= np.greater(col, -tiny)
            small = np.flatnonzero(small)
            small = small[(col[small] != 0.0) | np.signbit(col[small])]     # +0.0 stays as it is
            if not small.size:
                continue
            if pts is None:
                pts = self.points.copy()
            pts[small, k] = 0.0
            box[k] = 0.0 if abs(lo) < tiny else lo
            box[k + 2] = 0.0 if abs(hi) < tiny else hi
        if pts is None:
            return self
        out = replace(self, points=_owned(pts))
        out.__dict__["_bounds"] = tuple(box)
        return out

    def chord_count(self) -> int:
        return len(self.points) - 1

    def edge_count(self) -> int:
        """Each edge counts as one segment in messages.

        >>> Polyline(np.array([[0.0, 1.0], [1.0, 1.0], [1.0, 2.0]])).edge_count()
        2
        """
        return len(self.points) - 1

    def where_at(self, edge: int) -> Optional[Where]:
        """Where edge ``edge`` (0-based, of this polyline) came from: its first vertex's line.

        >>> p = Polyline(np.zeros((3, 2)) + [[0, 0], [1, 0], [1, 1]], where=Where("a.csv", 4),
        ...              lines=np.array([4, 5, 7]))
        >>> str(p.where_at(2))
        'a.csv:7'
        """
        w = self.where or Where()
        if self.lines is None or not len(self.lines):
            return w
        line = int(self.lines[min(max(edge, 0), len(self.lines) - 1)])
        return Where(w.file, line, w.place)

    @classmethod
    def integral_rows(cls, segments, symbolic: bool = False):
        """Each polyline's edges summed in closed form: one row per polyline.

        >>> square = Polyline(np.array([[0.0, 1.0], [1.0, 1.0], [1.0, 2.0], [0.0, 2.0], [0.0, 1.0]]))
        >>> v, e, how = Polyline.integral_rows([square])
        >>> float(v[0][0]), how
        (4.0, ('closed form',))
        """
        return cls.integral_rows_about(segments, symbolic)

    @classmethod
    def integral_rows_about(cls, segments, symbolic: bool = False, about=(0.0, 0.0)):
        """:meth:`integral_rows` of the polylines moved by ``−about``, with no moved copy.

        (:func:`~revolve.geometry.integrals.segment_integrals` asks for it when
        the moments are taken about a point other than the origin.)

        >>> square = Polyline(np.array([[1.0, 1.0], [2.0, 1.0], [2.0, 2.0], [1.0, 2.0], [1.0, 1.0]]))
        >>> v, e, how = Polyline.integral_rows_about([square], about=(1.0, 1.0))
        >>> float(v[0][3]), float(v[0][4])          # area 1, ∫∫ x dA = 0.5 about (1, 1)
        (1.0, 0.5)
        """
        from revolve.geometry.integrals import COLUMNS, polyline_sums

        values = np.zeros((len(segments), len(COLUMNS)))
        errors = np.zeros_like(values)
        for i, seg in enumerate(segments):
            values[i], errors[i] = polyline_sums(seg.points, about=about)
        return values, errors, ("closed form",) * len(segments)

    # -- for meshes and pictures (mesh.py) ----------------------------------------------

    def flatten_to_tolerance(self, tolerance: float, most_pieces: int = 1_000_000):
        """Points whose chords stay within ``tolerance``: the polyline's own vertices.

        Its edges are its chords, exactly, whatever the tolerance, so nothing
        is cut and ``most_pieces`` does not apply (the vertices are the input,
        not work the tolerance asks for; a mesh counts them first, with
        :meth:`fewest_chords`). The array itself is returned (read-only), no
        copy and no object per vertex.

        >>> p = Polyline(np.array([[0.0, 1.0], [1.0, 2.0], [2.0, 1.0]]))
        >>> p.flatten_to_tolerance(1e-9).tolist()
        [[0.0, 1.0], [1.0, 2.0], [2.0, 1.0]]
        >>> p.flatten_to_tolerance(0.1) is p.points
        True
        """
        return self.points

    def fewest_chords(self, tolerance: float) -> int:
        """How many chords :meth:`flatten_to_tolerance` gives: one per edge.

        >>> Polyline(np.array([[0.0, 1.0], [1.0, 2.0], [2.0, 1.0]])).fewest_chords(0.5)
        2
        """
        return len(self.points) - 1

    # -- for profile files (writer.py) ---------------------------------------------------

    def describe_to(self, out) -> None:
        """Tell a profile writer ``out`` what the polyline is, through its primitive ``straight``.

        ``out.straight(points, exact)`` gets the whole vertex array (no object
        per vertex) and the exact vertex coordinates, or None.

        >>> class Out:
        ...     def straight(self, points, exact):
        ...         print(points.tolist(), exact)
        >>> Polyline(np.array([[0.0, 1.0], [1.0, 2.0], [2.0, 1.0]])).describe_to(Out())
        [[0.0, 1.0], [1.0, 2.0], [2.0, 1.0]] None
        """
        out.straight(self.points, None if self.exact is None else self.exact.points)

    # -- for drawings: closing gaps between entities (dxf.py) ---------------------------

    def with_end_moved(self, point, at_start: bool = False):
        """The polyline with its last (or first) vertex moved onto ``point``.

        Its end edge is straight, so only that edge changes; None when the edge
        would have no length. One copy of the vertex array, no object per vertex.

        >>> p = Polyline(np.array([[0.0, 0.0], [1.0, 0.0], [1.0, 1.0]]))
        >>> p.with_end_moved((1.0, 1.001)).points.tolist()
        [[0.0, 0.0], [1.0, 0.0], [1.0, 1.001]]
        >>> p.with_end_moved((1.0, 0.0), at_start=True) is None
        True
        """
        k, neighbour = (0, 1) if at_start else (-1, -2)
        point = (float(point[0]), float(point[1]))
        if point == (float(self.points[neighbour, 0]), float(self.points[neighbour, 1])):
            return None
        pts = self.points.copy()
        pts[k] = point
        return replace(self, points=pts, exact=None)

    # -- for level tables (clipping.py, horizontal.py)

    @classmethod
    def axial_level_table(cls, segments, factors):
        """Every edge as a straight row ``z0, r0, z1, r1`` (one array, no object per edge).

        >>> p = Polyline(np.array([[0.0, 1.0], [1.0, 2.0], [2.0, 1.0]]))
        >>> t = Polyline.axial_level_table([p], [-1.0])
        >>> t.rows.tolist(), t.factor.tolist()
        ([[0.0, 1.0, 1.0, 2.0], [1.0, 2.0, 2.0, 1.0]], [-1.0, -1.0])
        """
        from revolve.geometry.clipping import StraightPieces

        return StraightPieces(*_edge_rows(segments, factors))

    def part_below(self, level: float, tolerance: float = 0.0):
        """``(runs of edges with x < level, flat edges in the level plane)``, as polylines.

        Edge by edge the same rule as :meth:`Line.part_below` (the cut from the lower
        end, with ``x`` exactly the level), on the whole array at once; consecutive
        kept edges stay one polyline.

        >>> zigzag = Polyline(np.array([[0.0, 1.0], [2.0, 2.0], [0.0, 3.0], [2.0, 4.0]]))
        >>> [p.points.tolist() for p in zigzag.part_below(1.0)[0]]
        [[[0.0, 1.0], [1.0, 1.5]], [[1.0, 2.5], [0.0, 3.0], [1.0, 3.5]]]
        >>> zigzag.part_below(5.0)[0] == (zigzag,), zigzag.part_below(0.0)
        (True, ((), ()))
        """
        P = self.points
        z = P[:, 0]
        z0, z1 = z[:-1], z[1:]
        lo, hi = np.minimum(z0, z1), np.maximum(z0, z1)
        flat = np.flatnonzero((z0 == z1) & (level <= z0) & (z0 <= level + tolerance))
        touching = tuple(Polyline(P[i:i + 2], face=self.face, where=self.where,
                                  first_edge=self.first_edge + int(i)) for i in flat)
        kept = lo < level
        if not kept.any():
            return (), touching
        if kept.all() and float(hi.max()) <= level:
            return (self,), touching
        rising = z1 > z0
        zl, zh = lo, hi
        rl, rh = np.where(rising, P[:-1, 1], P[1:, 1]), np.where(rising, P[1:, 1], P[:-1, 1])
        with np.errstate(divide="ignore", invalid="ignore"):
            rc = rl + (level - zl) / (zh - zl) * (rh - rl)      # from the lower end
        start, end = P[:-1].copy(), P[1:].copy()
        cut_start, cut_end = kept & (z0 > level), kept & (z1 > level)
        start[cut_start] = np.column_stack([np.full(cut_start.sum(), level), rc[cut_start]])
        end[cut_end] = np.column_stack([np.full(cut_end.sum(), level), rc[cut_end]])
        idx = np.flatnonzero(kept)
        # consecutive kept edges share their vertex unless it lies above the level
        join = (idx[1:] == idx[:-1] + 1) & (z[idx[1:]] <= level)
        bounds = np.concatenate([[0], np.flatnonzero(~join) + 1, [idx.size]])
        out = []
        for a, b in zip(bounds[:-1], bounds[1:]):
            edges = idx[a:b]
            pts = np.vstack([start[edges[:1]], end[edges]])
            lines = None if self.lines is None else self.lines[edges[0]:edges[-1] + 2]
            out.append(Polyline(pts, face=self.face, where=self.where, lines=lines,
                                first_edge=self.first_edge + int(edges[0])))
        return tuple(out), touching

    @classmethod
    def radial_level_table(cls, segments, factors, z_ref: float = 0.0):
        """Every edge as a straight row ``z0, r0, z1, r1`` with z from ``z_ref`` (one array).

        >>> p = Polyline(np.array([[0.0, 1.0], [1.0, 2.0], [2.0, 1.0]]))
        >>> Polyline.radial_level_table([p], [1.0], z_ref=1.0).line.tolist()
        [[-1.0, 1.0, 0.0, 2.0], [0.0, 2.0, 1.0, 1.0]]
        """
        from revolve.geometry.horizontal import StraightRows

        rows, f = _edge_rows(segments, factors)
        rows = rows.copy()
        rows[:, [0, 2]] -= z_ref
        return StraightRows(rows, f)


    # -- for the washer cross-check (slicing.py) ------------------------------------------

    @classmethod
    def washer_pieces(cls, segments):
        """The edges of many polylines as pieces for the washers, as array rows.

        Every edge is a piece (straight, so ``z`` moves one way along it). The
        rows ``z0, r0, z1, r1`` of one polyline are a read-only view of its
        vertex array (no copy, and no Python object per vertex); several
        polylines are concatenated. See :meth:`Line.washer_pieces
        <revolve.geometry.kinds.line.Line.washer_pieces>` for what is returned.

        Examples
        --------
        >>> p = Polyline(np.array([[0.0, 1.0], [2.0, 1.0], [2.0, 3.0], [0.0, 3.0]]))
        >>> zf, zt, counts, params = Polyline.washer_pieces([p])
        >>> zf.tolist(), zt.tolist(), counts.tolist()
        ([0.0, 2.0, 2.0], [2.0, 2.0, 0.0], [3])
        >>> params[2].tolist(), bool(np.shares_memory(params, p.points))
        ([2.0, 3.0, 0.0, 3.0], True)
        """
        from numpy.lib.stride_tricks import sliding_window_view

        rows = [sliding_window_view(np.ascontiguousarray(s.points).reshape(-1), 4)[::2]
                for s in segments]
        if len(rows) == 1:
            params = rows[0]
        else:
            params = np.concatenate(rows) if rows else np.zeros((0, 4))
        counts = np.array([len(s.points) - 1 for s in segments], dtype=np.int64)
        return params[:, 0], params[:, 2], counts, params

    @classmethod
    def washer_radius(cls, segments, params, z):
        """The radius at axial positions ``z`` (rows (m, q)) along edges given by rows ``params``.

        As :meth:`Line.washer_radius <revolve.geometry.kinds.line.Line.washer_radius>`.

        >>> Polyline.washer_radius([], np.array([[0.0, 1.0, 2.0, 3.0]]), np.array([[1.0]])).tolist()
        [[2.0]]
        """
        z0, r0, z1, r1 = (params[:, k:k + 1] for k in range(4))
        slope = np.subtract(r1, r0)
        slope /= z1 - z0
        r = np.subtract(z, z0)          # r0 + (z − z0)·slope, in one array
        r *= slope
        r += r0
        return r

    @classmethod
    def washer_degree(cls):
        """Degree of the radius as a polynomial of ``z`` along an edge: 1.

        >>> Polyline.washer_degree()
        1
        """
        return 1

    @classmethod
    def r_ds_rows(cls, segments, n: int = 32, rel_tol: float = 1e-14, block: int = 1 << 14):
        """``∫ r ds`` along each polyline, edge by edge by Gauss–Legendre: ``(values, errors)``.

        One value per polyline: the sum over its edges of two nodes per edge,
        the error the sum of the differences from one node (both exact on a
        straight edge). Worked in blocks of ``block`` edges, in place in a few
        arrays of that size (they stay in the processor's cache), each sum
        numpy's pairwise sum of a block (no BLAS).

        >>> square = Polyline(np.array([[0.0, 1.0], [2.0, 1.0], [2.0, 3.0], [0.0, 3.0], [0.0, 1.0]]))
        >>> v, e = Polyline.r_ds_rows([square])
        >>> v.tolist(), e.tolist()      # 2·1 + 2·2 + 2·3 + 2·2
        ([16.0], [0.0])
        """
        from revolve.geometry.quadrature import gauss_legendre

        (x1,), (w1,) = gauss_legendre(1)
        x2, w2 = gauss_legendre(2)
        # r at a node t ∈ [0, 1] of an edge is r0 + t·Δr; ds = |edge| dt, dt = ½ dx
        one_t, two_t = (x1 + 1) * 0.5, (x2 + 1) * 0.5
        values = np.zeros(len(segments))
        errors = np.zeros(len(segments))
        size = min(block, max((len(s.points) - 1 for s in segments), default=0))
        length, dr, two, node = (np.empty(size) for _ in range(4))
        for i, seg in enumerate(segments):
            pts = seg.points
            m = len(pts) - 1
            total = err = 0.0
            for j in range(0, m, block):
                k = min(m, j + block)
                w = k - j
                L, d, v, q = length[:w], dr[:w], two[:w], node[:w]
                r0 = pts[j:k, 1]
                np.subtract(pts[j + 1:k + 1, 0], pts[j:k, 0], out=L)
                np.subtract(pts[j + 1:k + 1, 1], r0, out=d)
                L *= L                               # the edge's length √(Δz² + Δr²), not
                np.multiply(d, d, out=q)             # np.hypot (many times slower; no square
                L += q                               # overflows or underflows here)
                np.sqrt(L, out=L)
                np.multiply(d, two_t[0], out=v)      # the two-node rule: Σ w r(node)
                v += r0
                if w2[0] != 1.0:
                    v *= w2[0]
                np.multiply(d, two_t[1], out=q)
                q += r0
                if w2[1] != 1.0:
                    q *= w2[1]
                v += q
                np.multiply(d, one_t, out=q)         # the one-node rule, then the difference
                q += r0
                q *= w1
                q -= v
                np.abs(q, out=q)
                v *= L
                q *= L
                total += float(v.sum())
                err += float(q.sum())
            values[i], errors[i] = 0.5 * total, 0.5 * err      # ds = |edge| · ½ dx on [−1, 1]
        return values, errors



def _owned(points):
    """A new array that nothing else holds, made read-only (so the polyline keeps it, no copy)."""
    points.flags.writeable = False
    return points


def _edge_rows(segments, factors):
    """Rows ``x0, y0, x1, y1`` of every edge of the polylines, and each edge's factor."""
    pts = [s.points for s in segments]
    if not pts:
        return np.zeros((0, 4)), np.zeros(0)
    rows = np.vstack([np.hstack([p[:-1], p[1:]]) for p in pts])
    return rows, np.repeat(np.asarray(factors, dtype=float), [len(p) - 1 for p in pts])
