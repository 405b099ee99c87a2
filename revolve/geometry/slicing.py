"""The independent cross-check: washers for volume, ∫ r ds quadrature for surface.

Volume is computed here by slicing the solid perpendicular to the axis. At
axial position ``z`` the slice is a set of washers whose area, per radian of
revolution, is ``½ Σ ± r_i(z)²`` over the points where the boundary crosses the
slice plane (outer crossings add, inner ones subtract). The slice area is
integrated over ``z`` with breakpoints at every vertex and every point where
the boundary turns back along the axis, by Gauss–Legendre quadrature in the
variable φ of ``z = (a + b)/2 - (b - a)/2 · cos φ`` (which smooths the square-
root behaviour of an arc at its turning points), comparing two orders and
splitting intervals until they agree; a straight crossing, whose ``r²`` is a
quadratic in ``z``, takes the two-node rule in ``z``, which is exact (its
rounding is bounded instead). Each crossing's part of a slice interval
is integrated between its own ends there, so when the slices would cut too many
crossings (a noisy outline), or when every crossing takes an exact rule (an
outline of straight edges: equal slices, about one per 64 pieces, found with no
sort), the intervals may be coarser than the vertices (:func:`first_partition`);
the pieces and intervals are arrays, and the work is O(n log n) for n vertices
on real outlines (O(n) on straight ones; see :func:`_interval_sums`).

Surface is ∫ r ds along every segment by Gauss–Legendre quadrature of the
parametrisation, again comparing two orders.

Neither uses the closed forms of :mod:`revolve.geometry.integrals`. Nothing here
asks which kind a segment is: each kind gives, through the segment contract
(:mod:`revolve.geometry.kinds.base`) and four class methods kept for this
module at the end of each kind's class (``washer_pieces``: its monotone pieces
along the axis as array rows; ``washer_radius``: the radius of such a piece at
given axial positions; ``washer_degree``: whether that radius is a polynomial
of ``z``; ``r_ds_rows``: its ∫ r ds by quadrature), what the slices need. A
polyline gives its edges as rows of a view of its vertex array, so a
10⁶-vertex outline costs a sort and a few passes over memory, in blocks.

Examples
--------
A 2 × 2 square from r = 1 to r = 3: washers give π (3² - 1²) · 2 = 16 π.

>>> from revolve.geometry.profile import Loop, Profile, Axis
>>> from revolve.geometry.checks import prepare
>>> prep = prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
>>> v, err = washer_volume(prep, [1.0], 2 * math.pi)
>>> round(v / math.pi, 10)
16.0
>>> s, err = surface_by_quadrature(prep, 2 * math.pi)
>>> round(float(sum(s)) / math.pi, 10)   # two flat ends 2·π(9-1) plus cylinders 2π·1·2 + 2π·3·2
32.0
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from functools import cached_property
from typing import Dict, List, Optional, Sequence, Tuple

import numpy as np

from revolve.geometry.quadrature import gauss_legendre
from revolve.geometry.segments import Segment

@dataclass(frozen=True)
class Piece:
    """A part of a frame segment along which ``z`` moves one way only (one object: for few pieces).

    ``params`` is the kind's row from ``washer_pieces`` (for example a line's
    ``(z0, r0, z1, r1)``) and ``segment`` the frame segment it belongs to.
    """

    z_from: float
    z_to: float
    kind: str
    params: tuple
    factor: float  # loop orientation and hole sign
    segment: Optional[Segment] = field(default=None, compare=False, repr=False)


def monotone_pieces(seg: Segment, factor: float) -> List[Piece]:
    """Split a frame segment where it turns back along the axis, one :class:`Piece` each.

    For tests and small tools; the washers themselves keep pieces as array
    rows (:func:`piece_table`). Pieces across the axis direction are left out.

    >>> from revolve.geometry.segments import arc_from_centre
    >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
    >>> [(p.z_from, p.z_to) for p in monotone_pieces(half, 1.0)]
    [(1.0, -1.0)]
    >>> full_top = arc_from_centre((0.0, 1.0), (0.0, -1.0), (0.0, 0.0), clockwise=True)
    >>> [(round(p.z_from, 12), round(p.z_to, 12)) for p in monotone_pieces(full_top, 1.0)]
    [(0.0, 1.0), (1.0, 0.0)]
    """
    z_from, z_to, _, params = type(seg).washer_pieces([seg])
    return [Piece(float(a), float(b), seg.kind, tuple(float(v) for v in row), factor, seg)
            for a, b, row in zip(z_from, z_to, np.asarray(params)) if a != b]


def _radius_at(piece: Piece, z: np.ndarray) -> np.ndarray:
    """The radius of one :class:`Piece` at axial positions ``z`` (any shape).

    >>> from revolve.geometry.segments import Line
    >>> [p] = monotone_pieces(Line((0.0, 1.0), (2.0, 3.0)), 1.0)
    >>> _radius_at(p, np.array([0.5, 1.0])).tolist()
    [1.5, 2.0]
    """
    z = np.asarray(z, dtype=float)
    seg = piece.segment
    r = type(seg).washer_radius([seg], np.array([piece.params], dtype=float), z.reshape(1, -1))
    return np.asarray(r).reshape(z.shape)


def curve_parameter_at(curve, ta: float, tb: float, targets, coordinate: int = 0,
                       iterations: int = 70) -> np.ndarray:
    """Parameters where a curve, monotone in one coordinate on [ta, tb], reaches each target.

    ``coordinate`` 0 inverts x(t) (the axial z in the frame), 1 inverts y(t)
    (the radius). Vectorised bisection over the targets
    (:meth:`Curve.monotone_parameters <revolve.geometry.kinds.curve.Curve.monotone_parameters>`).

    >>> import sympy
    >>> from revolve.geometry.segments import Curve
    >>> t = sympy.Symbol("t", real=True)
    >>> c = Curve(t ** 2, t, 0.0, 2.0)
    >>> [round(float(v), 12) for v in curve_parameter_at(c, 0.0, 2.0, np.array([1.0, 4.0]))]
    [1.0, 2.0]
    >>> [round(float(v), 12) for v in curve_parameter_at(c, 0.0, 2.0, np.array([0.5]), coordinate=1)]
    [0.5]
    """
    return curve.monotone_parameters(coordinate, ta, tb, targets, iterations)


@dataclass(frozen=True, eq=False)
class PieceGroup:
    """The pieces of one segment kind: rows ``start:stop`` of a :class:`PieceTable`.

    ``kind`` is the segments' class (its ``washer_radius`` and ``washer_degree``
    are called), ``segments`` the sequence its ``washer_pieces`` was given, and
    ``params`` the pieces' rows.
    """

    kind: type
    segments: tuple
    params: np.ndarray
    start: int
    stop: int


@dataclass(frozen=True, eq=False)
class PieceTable:
    """The monotone pieces of a profile's loops as arrays, for the washers.

    ``z_from``, ``z_to`` are each piece's axial position at its start and
    end, ``factor`` its loop's factor (one number when every piece has the
    same), ``rising`` whether ``z_to > z_from``; ``lo`` and ``hi`` are its
    extent along the axis, and ``sign`` is ``-direction × factor`` (the sign
    its ``r²`` takes in the slice): these three are found when first asked for,
    and :meth:`ends` gives them for some rows only (the washers take them block
    by block, so no full-size array is made for them). The pieces of each kind
    are contiguous rows, described by ``groups``, each kind's pieces in the
    order of their segments along the loops.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> prep = prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> t = piece_table(prep, [1.0])
    >>> t.count, t.lo.tolist(), t.hi.tolist(), t.sign.tolist(), [g.kind.kind for g in t.groups]
    (2, [0.0, 0.0], [2.0, 2.0], [-1.0, 1.0], ['polyline'])
    >>> [v.tolist() for v in t.ends(slice(1, 2))]
    [[0.0], [2.0], [1.0]]
    """

    z_from: np.ndarray
    z_to: np.ndarray
    factor: object
    groups: Tuple[PieceGroup, ...]
    rising: np.ndarray

    @property
    def count(self) -> int:
        return int(self.z_from.size)

    def ends(self, rows):
        """``(lo, hi, sign)`` of the pieces ``rows`` (a slice or an index array).

        (No piece has ``z_from == z_to``: the lower end is the smaller one,
        whichever way it runs.)
        """
        zf, zt, up = self.z_from[rows], self.z_to[rows], self.rising[rows]
        f = self.factor if np.isscalar(self.factor) else self.factor[rows]
        return np.minimum(zf, zt), np.maximum(zf, zt), np.where(up, np.negative(f), f)

    @cached_property
    def lo(self) -> np.ndarray:
        return np.minimum(self.z_from, self.z_to)

    @cached_property
    def hi(self) -> np.ndarray:
        return np.maximum(self.z_from, self.z_to)

    @cached_property
    def sign(self) -> np.ndarray:
        return self.ends(slice(None))[2]

    def extent(self) -> float:
        """The pieces' total extent along the axis, ``Σ (hi − lo)`` (in blocks: no full-size array)."""
        n, block = self.count, 1 << 16
        work = np.empty(min(n, block))
        total = 0.0
        for i in range(0, n, block):
            d = work[:min(n, i + block) - i]
            np.subtract(self.z_to[i:i + block], self.z_from[i:i + block], out=d)
            np.abs(d, out=d)
            total += float(d.sum())
        return total


def piece_table(prep, loop_factors: Sequence[float]) -> PieceTable:
    """Split every loop segment of a prepared profile into monotone pieces, as arrays.

    The segments are grouped by kind and each group's ``washer_pieces`` gives
    its rows at once (a polyline's rows are a view of its vertices: no object
    per vertex). Pieces across the axis direction (``z_from == z_to``) enclose
    no washer and are left out. Open chains enclose nothing and are left out.
    An empty profile gives an empty table:

    >>> from revolve.geometry.checks import PreparedProfile
    >>> piece_table(PreparedProfile((), (), (), 1.0, 1.0, 1e-9), []).count
    0
    """
    by_kind: Dict[type, Tuple[list, list]] = {}
    loop_no = 0
    for segs, closed in zip(prep.paths, prep.closed):
        if not closed:
            continue
        f = float(loop_factors[loop_no])
        loop_no += 1
        kinds = set(map(type, segs))
        if len(kinds) == 1:                  # a loop of one kind (a point list): at once
            group = by_kind.setdefault(kinds.pop(), ([], []))
            group[0].extend(segs)
            group[1].extend([f] * len(segs))
            continue
        for s in segs:
            group = by_kind.setdefault(type(s), ([], []))
            group[0].append(s)
            group[1].append(f)
    parts = []
    start = 0
    groups = []
    for kind, (segs, factors) in by_kind.items():
        z_from, z_to, counts, params = kind.washer_pieces(segs)
        z_from = np.asarray(z_from, dtype=float)
        z_to = np.asarray(z_to, dtype=float)
        f0 = float(factors[0]) if factors else 0.0
        # One loop (a point list): its factor is one number, not an array per piece.
        factor = f0 if all(f == f0 for f in factors) else \
            np.repeat(np.asarray(factors, dtype=float), counts)
        across = z_from == z_to
        if across.any():
            keep = ~across
            z_from, z_to, params = z_from[keep], z_to[keep], params[keep]
            if not np.isscalar(factor):
                factor = factor[keep]
        if not z_from.size:
            continue
        parts.append((z_from, z_to, factor))
        # kept as given (a polyline's rows are a view of its vertices): the washers read them
        # mostly in slices of consecutive rows, so a contiguous copy would cost more than it saves
        groups.append(PieceGroup(kind, tuple(segs), np.asarray(params, dtype=float),
                                 start, start + z_from.size))
        start += z_from.size
    if not parts:
        empty = np.zeros(0)
        return PieceTable(empty, empty, 0.0, (), np.zeros(0, dtype=bool))
    if len(parts) == 1:
        z_from, z_to, factor = parts[0]
    else:
        z_from, z_to, factor = (np.concatenate([np.broadcast_to(v, z.shape) for v, z in
                                                zip(c, (p[0] for p in parts))]) for c in zip(*parts))
    return PieceTable(z_from, z_to, factor, tuple(groups), z_to > z_from)


@dataclass(frozen=True, eq=False)
class _Rule:
    """Quadrature nodes for one kind's pieces on a slice part [c, d]: ``z = mid + half·x``.

    ``weights`` has two columns, the coarse and the fine rule (each zero on
    the other's nodes), or one column when the rule is exact for the kind
    (both estimates are then that one); the integral is ``half · Σ weights · f(z)``.
    """

    x: np.ndarray
    weights: np.ndarray

    @property
    def exact(self) -> bool:
        return self.weights.shape[1] == 1


def _rule(degree: Optional[int], n: int) -> _Rule:
    """The rules used on a piece: one exact rule in ``z`` for a polynomial radius, else two in ``φ``.

    A radius of degree ``k`` in ``z`` makes ``r²`` of degree ``2k``: Gauss–Legendre
    with ``k + 1`` nodes is exact, and a second rule would only add rounding
    (its rounding is bounded instead, see :func:`washer_volume`). Otherwise
    ``n`` and ``2n`` nodes in ``φ``, ``z = mid − half·cos φ`` (smooth at a
    turning point), compared.

    >>> r = _rule(1, 24)
    >>> r.x.size, r.exact, [round(float(v), 14) for v in r.weights.sum(axis=0)]
    (2, True, [2.0])
    >>> r = _rule(None, 24)            # ∫ sin φ dφ · π/2 over [0, π] = 2
    >>> r.x.size, r.exact, [round(float(v), 12) for v in r.weights.sum(axis=0)]
    (72, False, [2.0, 2.0])
    """
    if degree is not None:
        x, w = gauss_legendre(degree + 1)
        return _Rule(x, w[:, None])
    parts = []
    for k in (n, 2 * n):
        x, w = gauss_legendre(k)
        phi = (x + 1) * (math.pi / 2)                    # nodes on [0, π]
        parts.append((-np.cos(phi), w * (math.pi / 2) * np.sin(phi)))   # dz = half sin φ dφ
    x = np.concatenate([p[0] for p in parts])
    weights = np.zeros((x.size, 2))
    weights[:parts[0][0].size, 0] = parts[0][1]
    weights[parts[0][0].size:, 1] = parts[1][1]
    return _Rule(x, weights)


#: Most quadrature nodes (pairs × nodes per pair) evaluated at once (512 kB an array: in cache).
NODE_BLOCK = 1 << 16


#: A part of a piece at most this fraction of the piece's extent along the axis is integrated
#: with :data:`SMALL_PART_ORDER` nodes (and twice as many) instead of the washers' full order:
#: a short part of a smooth piece needs few nodes, and the comparison of the two rules still
#: decides whether its interval is halved.
SMALL_PART = 1.0 / 64
SMALL_PART_ORDER = 8


def _part_sums(group: PieceGroup, params: np.ndarray, mid: np.ndarray, half: np.ndarray,
               rule: _Rule, r_ref: float) -> np.ndarray:
    """``Σ w · (r − r_ref)(r + r_ref)`` at the rule's nodes of parts ``mid ± half``, per part.

    One column per rule of ``rule`` (shape (pairs,) for an exact rule, else
    (pairs, 2)). The nodes are laid out node by node (``z`` is the transpose
    of a (nodes, pairs) array), so every operation runs along the pairs.
    """
    nodes = np.empty((rule.x.size, mid.size))
    for j, x in enumerate(rule.x):
        np.multiply(half, x, out=nodes[j])
        nodes[j] += mid
    r = group.kind.washer_radius(group.segments, params, nodes.T)
    # Every loop crosses a slice as often going one way as the other, so r² − r_ref² sums
    # to the same washer area, without losing digits when a thin section lies far from
    # the axis.
    if rule.exact:
        # node by node, along the pairs (one column of r each): many times faster than the
        # same operations on the (pairs, nodes) array, whose rows are a few nodes long
        w = rule.weights[:, 0]
        sums = work = None
        for j in range(w.size):
            col = r[:, j]
            val = np.subtract(col, r_ref)
            work = np.add(col, r_ref, out=work)
            val *= work
            if w[j] != 1.0:
                val *= w[j]
            if sums is None:
                sums = val
            else:
                sums += val
        return sums
    val = np.subtract(r, r_ref)
    if isinstance(r, np.ndarray) and r.flags.writeable and r.base is None:
        r += r_ref                    # a fresh array of the kind's: no second temporary
    else:
        r = r + r_ref
    val *= r
    return np.einsum("ij,jk->ik", val, rule.weights)


def _group_sums(table: PieceTable, group: PieceGroup, pieces, first: np.ndarray,
                count: np.ndarray, a: np.ndarray, b: np.ndarray, rule: _Rule, r_ref: float,
                out: np.ndarray, small_rule: Optional[_Rule] = None) -> None:
    """Add one kind's washers over the intervals to ``out`` (m, 2): coarse and fine rule.

    ``pieces`` are rows of the table (of this group; an int array, or an int
    when they are the rows from there on), piece ``pieces[i]`` meeting the
    ``count[i]`` intervals from ``first[i]`` on. When the rows are consecutive
    (an int), every piece's part of its first interval is taken in blocks of
    consecutive rows (slices of the table, no gathering), and only the pieces
    that meet more intervals go on to the rest of theirs. Otherwise the
    (piece, interval) pairs are expanded in blocks of at most
    :data:`NODE_BLOCK` nodes. With ``small_rule``, parts no longer than
    :data:`SMALL_PART` of their piece take that rule.
    """
    if not count.size:
        return
    block = max(1024, NODE_BLOCK // (small_rule or rule).x.size)
    few = a.size <= 4 * block           # few intervals: sum into all of them
    args = (group, a, b, rule, r_ref, out, small_rule, few)
    if isinstance(pieces, (int, np.integer)) and int(count.min()) < 1:
        pieces = np.arange(pieces, pieces + count.size)      # some meet none: pair by pair
    if isinstance(pieces, (int, np.integer)):
        base = pieces - group.start
        for p0 in range(0, count.size, block):
            p1 = min(count.size, p0 + block)
            rows = slice(pieces + p0, pieces + p1)
            f = table.factor if np.isscalar(table.factor) else table.factor[rows]
            _add_parts(first[p0:p1], table.z_from[rows], table.z_to[rows], f,
                       group.params[base + p0:base + p1], *args)
        more = np.flatnonzero(count > 1)
        if more.size:
            _group_sums(table, group, pieces + more, first[more] + 1, count[more] - 1, a, b,
                        rule, r_ref, out, small_rule)
        return
    ends = np.cumsum(count)
    total = int(ends[-1])
    if total == 0:
        return
    starts = ends - count
    for q0 in range(0, total, block):
        q1 = min(total, q0 + block)
        p0 = int(np.searchsorted(ends, q0, side="right"))
        p1 = int(np.searchsorted(ends, q1 - 1, side="right")) + 1
        own = np.minimum(ends[p0:p1], q1) - np.maximum(starts[p0:p1], q0)
        local = np.repeat(np.arange(p0, p1), own)
        iv = np.take(first, local) + (np.arange(q0, q1) - np.take(starts, local))
        piece = np.take(pieces, local)
        f = table.factor if np.isscalar(table.factor) else table.factor[piece]
        # indexing, not np.take(axis=0): take copies a strided view (a polyline's rows) whole
        params = group.params[piece - group.start]
        _add_parts(iv, table.z_from[piece], table.z_to[piece], f, params, *args)


def _add_parts(iv, z_from, z_to, factor, params, group: PieceGroup, a, b, rule: _Rule,
               r_ref: float, out: np.ndarray, small_rule: Optional[_Rule], few: bool) -> None:
    """Add the washers of pieces (rows ``z_from, z_to, factor, params``) over their parts of
    intervals ``iv`` to ``out`` (see :func:`_group_sums`).

    A piece's part of its interval runs from ``p`` (its start, moved into the
    interval) to ``q`` (its end, likewise); ``(p − q)/2`` is the half-width
    with the sign the part's ``r²`` takes in the slice (``−direction``), so no
    ends or signs are sorted out first. The rules' nodes are symmetric, so
    the nodes ``mid ± half·x`` are the same whichever way the part runs.
    """
    # Contiguous copies first: numpy's vector loops skip strided operands (a polyline's rows
    # are a view of its vertex array), and each index array is converted once, not per use.
    iv = np.asarray(iv, dtype=np.intp)
    z_from, z_to = np.ascontiguousarray(z_from), np.ascontiguousarray(z_to)
    lower = np.take(a, iv)
    upper = np.take(b, iv)
    p = np.maximum(lower, z_from)
    np.minimum(p, upper, out=p)
    q = np.maximum(lower, z_to, out=lower)
    np.minimum(q, upper, out=q)
    half = np.subtract(p, q, out=upper)
    half *= 0.5
    small = None
    if small_rule is not None:
        # the part no longer than SMALL_PART of its piece: |p − q| ≤ SMALL_PART · |z_to − z_from|
        small = np.abs(half) * 2 <= SMALL_PART * np.abs(np.subtract(z_to, z_from))
        if small.all():
            rule_here, small = small_rule, None
        elif not small.any():
            rule_here, small = rule, None
    else:
        rule_here = rule
    p += q
    p *= 0.5                          # the middle
    if small is None:
        sums = _part_sums(group, params, p, half, rule_here, r_ref)
    else:
        sums = np.empty((p.size, 2))
        for sel, rl in ((small, small_rule), (~small, rule)):
            sums[sel] = _part_sums(group, params[sel], p[sel], half[sel], rl, r_ref)
    if not np.isscalar(factor):
        half *= factor
    if few:
        lo_iv, span = 0, a.size
    else:                             # the intervals these parts lie in
        lo_iv = int(iv.min())
        span = int(iv.max()) + 1 - lo_iv
        iv = iv - lo_iv
    scale = float(factor) if np.isscalar(factor) else 1.0      # ±1 (or 0): exact
    if sums.ndim == 1:
        sums *= half
        add = np.bincount(iv, weights=sums, minlength=span)
        if scale != 1.0:
            add *= scale
        out[lo_iv:lo_iv + span, 0] += add
        out[lo_iv:lo_iv + span, 1] += add
    else:
        sums *= half[:, None]
        for k in range(2):
            add = np.bincount(iv, weights=sums[:, k], minlength=span)
            if scale != 1.0:
                add *= scale
            out[lo_iv:lo_iv + span, k] += add


def _interval_sums(table: PieceTable, a: np.ndarray, b: np.ndarray, runs, n: int = 24,
                   r_ref: float = 0.0) -> Tuple[np.ndarray, np.ndarray]:
    """∫ of the slice function over each interval [a_k, b_k], by the coarse and the fine rules.

    The intervals must be sorted and must not overlap (so ``b`` is sorted
    too). A piece, monotone in z, then meets a contiguous run of intervals.
    ``runs`` gives, per group of the table, ``(pieces, first, count)``: the
    pieces to take and the run of intervals each meets (from
    :func:`_partition` or :func:`_runs`). The (piece, interval) pairs are
    expanded from those runs; each pair is the piece's washer over its part
    ``[max(a, lo), min(b, hi)]`` of the interval; the nodes of a block of
    pairs are evaluated at once, and the pairs are summed into their
    intervals with ``np.bincount``. Where every piece end is an interval end
    (as :func:`washer_volume` starts on smooth outlines), a piece's part of an
    interval is the whole interval.

    Cost: O(P · nodes) for P pairs, plus finding the runs (a binary search per
    piece, or none on the first partition). P is the number of times the
    interval ends cut the boundary, plus n: about 2m on an outline made of a
    few monotone chains along the axis; as many as n · m for pathological
    partitions (many long pieces over the same range, a noisy outline cut at
    every vertex), which is why :func:`washer_volume` coarsens its first
    partition until P is O(n).

    Each piece contributes ``sign · ∫ (r − r_ref)(r + r_ref) dz`` by the
    rules of :func:`_rule` for its kind on its part of the interval (with
    :data:`SMALL_PART_ORDER` nodes on a part no longer than :data:`SMALL_PART`
    of a piece that is not a polynomial of ``z``). Returns
    the coarse and fine sums per interval.
    """
    out = np.zeros((a.size, 2))
    if a.size == 0 or table.count == 0:
        return out[:, 0], out[:, 1]
    for group, (pieces, first, count) in zip(table.groups, runs):
        if count.size:
            degree = group.kind.washer_degree()
            small = None if degree is not None else _rule(None, min(n, SMALL_PART_ORDER))
            _group_sums(table, group, pieces, first, count, a, b, _rule(degree, n), r_ref, out,
                        small)
    return out[:, 0], out[:, 1]


def _runs(table: PieceTable, a: np.ndarray, b: np.ndarray, pieces=None):
    """Per group, the pieces (of ``pieces``, default all) meeting any interval, with their runs.

    A piece meets the intervals with ``b > lo`` and ``a < hi``: two binary
    searches. Pieces meeting none are dropped (the next rounds only halve
    these intervals, so they meet none of those either). :func:`washer_volume`
    passes only the pieces that met an interval it halves.
    """
    out = []
    for k, group in enumerate(table.groups):
        idx = pieces[k] if pieces is not None else group.start
        if isinstance(idx, (int, np.integer)):
            idx = np.arange(idx, group.stop)
        first = np.searchsorted(b, table.lo[idx], side="right")
        stop = np.searchsorted(a, table.hi[idx], side="left")
        count = stop - first
        keep = count > 0
        out.append((idx[keep], first[keep], count[keep]))
    return out


#: Most (piece, interval) pairs per piece the first partition of the washers may give.
PAIRS_PER_PIECE = 4
#: When every kind's radius is a polynomial of ``z`` (exact rules, nothing to refine), the
#: first partition cuts the axis into equal slices, at most one per 2^k pieces, k = this.
EXACT_SLICE_SHIFT = 6


def _cells(z: np.ndarray, z_lo: float, scale: float, edges: np.ndarray,
           block: int = 1 << 16) -> np.ndarray:
    """The slice ``k`` with ``edges[k] <= z < edges[k + 1]`` of each ``z`` (the last one closed).

    ``x = (z − z_lo) · scale`` gives it as ``⌊x⌋`` wherever ``x`` lies farther than
    1/1024 from a whole number: the caller makes the slices at least 2²⁰ spacings of
    its coordinates wide, so rounding moves ``x`` and the edges by far less. The
    few nearer ones are settled by comparing ``z`` with the edges themselves.
    Worked in blocks of ``block`` values in one buffer (no full-size float array).

    >>> _cells(np.array([0.0, 0.5, 1.0, 2.9, 3.0]), 0.0, 1.0, np.array([0.0, 1.0, 2.0, 3.0])).tolist()
    [0, 0, 1, 2, 2]
    """
    last = edges.size - 2
    out = np.empty(z.size, dtype=np.int32)
    work = np.empty(min(z.size, block))
    for i in range(0, z.size, block):
        zb = z[i:i + block]
        x = work[:zb.size]
        k = out[i:i + block]
        np.subtract(zb, z_lo, out=x)
        x *= scale
        np.copyto(k, x, casting="unsafe")        # z ≥ z_lo: truncation is the floor
        x -= k                                   # |fraction − ½| > ½ − 1/1024: near an edge
        x -= 0.5
        np.abs(x, out=x)
        near = np.flatnonzero(x > 0.5 - 1.0 / 1024)
        np.minimum(k, last, out=k)
        if near.size:
            zn, kn = zb[near], k[near]
            kn -= zn < edges[kn]
            kn += (zn >= edges[kn + 1]) & (kn < last)
            k[near] = kn
    return out


def _even_partition(table: PieceTable):
    """Equal slices along the axis and the run of them each piece meets, with no sort.

    For tables whose every kind takes an exact rule (:func:`_partition`). The
    slices start at one per 2^:data:`EXACT_SLICE_SHIFT` pieces (a power of two
    of them) and are doubled in width until the (piece, slice) pairs fit
    :data:`PAIRS_PER_PIECE` per piece; a piece's ends are located by
    arithmetic (:func:`_cells`), O(n) in all. None when the axis extent is too
    short against its position to be cut that finely in floating point.

    >>> from revolve.geometry.segments import Line
    >>> segs = (Line((0.0, 1.0), (4.0, 1.0)), Line((4.0, 3.0), (0.0, 3.0)))
    >>> _, _, _, params = Line.washer_pieces(segs)
    >>> t = PieceTable(np.array([0.0, 4.0]), np.array([4.0, 0.0]), 1.0,
    ...                (PieceGroup(Line, segs, params, 0, 2),), np.array([True, False]))
    >>> edges, [(start, first, count)] = _even_partition(t)
    >>> edges.tolist(), first.tolist(), count.tolist()
    ([0.0, 4.0], [0, 0], [1, 1])
    """
    n = table.count
    z_from, z_to = table.z_from, table.z_to
    # the pieces that do not end where the next one starts (few: where a loop ends)
    unlinked = np.append(np.flatnonzero(z_to[:-1] != z_from[1:]), n - 1)
    loose = z_to[unlinked]
    z_lo = min(float(z_from.min()), float(loose.min()))
    z_hi = max(float(z_from.max()), float(loose.max()))
    slices = 1 << max(0, (n >> EXACT_SLICE_SHIFT).bit_length() - 1)      # a power of two
    width = (z_hi - z_lo) / slices
    if not width > 2.0 ** 20 * np.spacing(max(abs(z_lo), abs(z_hi))):
        return None
    edges = z_lo + width * np.arange(slices + 1)
    edges[-1] = z_hi
    scale = slices / (z_hi - z_lo)
    start = _cells(z_from, z_lo, scale, edges)
    end = _cells(loose, z_lo, scale, edges)
    # A piece starts in slice start[i] and ends in start[i + 1] (the next one's start), or
    # for an unlinked piece in its own end's slice: it meets slices low … low + apart.
    low = np.empty(n, dtype=start.dtype)
    apart = np.empty(n, dtype=start.dtype)
    np.minimum(start[:n - 1], start[1:n], out=low[:-1])
    np.subtract(start[1:n], start[:n - 1], out=apart[:-1])
    np.abs(apart, out=apart)
    low[unlinked] = np.minimum(start[unlinked], end)
    apart[unlinked] = np.abs(end - start[unlinked])
    del start, end
    limit = PAIRS_PER_PIECE * n + 64
    shift = 0
    if int(apart.sum(dtype=np.int64)) + n > limit:
        # too many pairs: wider slices (rare: an outline that zigzags along the axis)
        high = low + apart
        while slices >> shift > 1:
            shift += 1
            if int((high >> shift).sum(dtype=np.int64)) - int((low >> shift).sum(dtype=np.int64)) \
                    + n <= limit:
                break
        np.right_shift(low, shift, out=low)
        np.right_shift(high, shift, out=high)
        np.subtract(high, low, out=apart)
        del high
    first, count = low, apart
    count += 1
    edges = edges[::1 << shift]
    return edges, [(g.start, first[g.start:g.stop], count[g.start:g.stop]) for g in table.groups]


def _partition(table: PieceTable):
    """The first slice intervals and, per group, the run of them each piece meets.

    Every distinct piece end is a break; each piece's ends are located among
    them by one sort (its permutation gives each end its rank), using that a
    piece usually starts where the one before it ended (so ``n`` values are
    sorted, not ``2n``); a merge sort where the outline runs along the axis in
    few monotone runs (about one pass), else quicksort. With
    ``step`` breaks per interval, a piece between breaks ``L < H`` meets
    intervals ``L // step … (H − 1) // step``: the pairs for a choice of
    ``step`` are counted in O(n) without any search. ``step`` doubles from 1
    until the pairs fit :data:`PAIRS_PER_PIECE` per piece.

    When every kind takes an exact rule the slices are equal instead, with no
    sort (:func:`_even_partition`), unless the profile is too short along the
    axis for its position to be cut that finely; then every
    2^:data:`EXACT_SLICE_SHIFT`-th piece end at least is kept.

    Returns ``(edges, runs)`` as :func:`_interval_sums` takes them.
    """
    if all(g.kind.washer_degree() is not None for g in table.groups):
        # Exact rules only: a piece's part of any slice is as exact as of another, and no
        # interval will be halved: equal slices, found without a sort, serve as well.
        even = _even_partition(table)
        if even is not None:
            return even
    n = table.count
    z_from, z_to = table.z_from, table.z_to
    # the pieces that do not end where the next one starts (few: where a loop ends)
    unlinked = np.append(np.flatnonzero(z_to[:-1] != z_from[1:]), n - 1)
    values = np.concatenate([z_from, z_to[unlinked]])
    # A real outline runs along the axis in few monotone runs: a merge sort takes them in
    # about one pass. A noisy one turns back at most vertices: quicksort is faster there.
    rising = table.rising
    turns = int(np.count_nonzero(rising[1:] != rising[:-1]))
    order = np.argsort(values, kind="stable" if turns * 16 < n else "quicksort")
    ordered = values[order]
    new = np.empty(ordered.size, dtype=bool)
    new[:1] = True
    np.not_equal(ordered[1:], ordered[:-1], out=new[1:])
    breaks = ordered[new]
    # Ranks in 32 bits where they fit: half the memory traffic in every pass below.
    rank_type = np.int32 if values.size < 2 ** 31 - 2 else np.int64
    rank = np.cumsum(new, dtype=rank_type)
    rank -= 1
    where = np.empty(values.size, dtype=rank_type)
    where[order] = rank
    del order, ordered, new, rising, rank
    # A piece starts at rank where[i] and ends at where[i + 1] (the next one's start), or for
    # an unlinked piece at its own end's rank, stored after the starts.
    low = np.empty(n, dtype=where.dtype)
    high = np.empty(n, dtype=where.dtype)
    np.minimum(where[:n - 1], where[1:n], out=low[:-1])
    np.maximum(where[:n - 1], where[1:n], out=high[:-1])
    ends = where[n:]
    low[unlinked] = np.minimum(where[unlinked], ends)
    high[unlinked] = np.maximum(where[unlinked], ends)
    high -= 1                                      # the last elementary interval met
    del where, values, ends
    limit = PAIRS_PER_PIECE * n + 64
    intervals = breaks.size - 1
    # The pairs with 2^k breaks an interval are at least (P₁ − n) / 2^k for the P₁ pairs of
    # every break (and fall as k grows): start from the first k that bound allows.
    beyond = int(high.sum(dtype=np.int64)) - int(low.sum(dtype=np.int64))
    shift = max(0, math.ceil(math.log2(beyond / max(limit - n, 1)))) if beyond else 0
    if all(g.kind.washer_degree() is not None for g in table.groups):
        # Exact rules only: a piece's part of a wider slice is as exact as of a narrow one,
        # and no interval will be halved; wider slices cut fewer pieces and sum fewer values.
        shift = max(shift, EXACT_SLICE_SHIFT)
    while True:
        step = 1 << shift
        first = low >> shift if shift else low
        count = high >> shift if shift else high.copy()
        count -= first
        count += 1
        if int(count.sum(dtype=np.int64)) <= limit or step >= intervals:
            break
        shift += 1
    edges = breaks[::step]
    if edges[-1] != breaks[-1]:
        edges = np.append(edges, breaks[-1])
    runs = [(g.start, first[g.start:g.stop], count[g.start:g.stop]) for g in table.groups]
    return edges, runs


def first_partition(table: PieceTable) -> np.ndarray:
    """The interval ends the washers start from: every piece end, or a subset of them.

    Every piece end (where the slice function has a kink) is an interval end
    unless the slices cut so many pieces that the (piece, interval) pairs would
    pass :data:`PAIRS_PER_PIECE` per piece, as on a noisy outline whose zigzags
    are longer along the axis than the spacing of its points. Then every k-th
    end is kept, k doubling until they fit: each slice interval then holds the
    parts of the pieces that cross it, each piece integrated over its own part
    (its kinks stay at the ends of its parts). When every kind's radius is a
    polynomial of ``z`` (straight pieces: exact rules, no interval is ever
    halved) the slices need not end at piece ends at all: the axis is cut into
    equal slices, at most one per 2^:data:`EXACT_SLICE_SHIFT` pieces, and each
    piece end is located by arithmetic, in O(n) with no sort
    (:func:`_even_partition`). Otherwise the cost of the choice is one sort and
    O(n) per try, with at most log₂ n tries (:func:`_partition`).

    >>> from revolve.geometry.segments import Line
    >>> segs = (Line((0.0, 1.0), (2.0, 1.0)), Line((2.0, 3.0), (0.0, 3.0)))
    >>> _, _, _, params = Line.washer_pieces(segs)
    >>> t = PieceTable(np.array([0.0, 2.0]), np.array([2.0, 0.0]), 1.0,
    ...                (PieceGroup(Line, segs, params, 0, 2),), np.array([True, False]))
    >>> first_partition(t).tolist()
    [0.0, 2.0]
    """
    return _partition(table)[0]


#: Most slice intervals :func:`washer_volume` evaluates (each with 3 × 24 nodes per piece).
MAX_SLICE_INTERVALS = 20_000


def _radius_range(table: PieceTable) -> Tuple[float, float]:
    """Smallest and largest radius of the pieces (the reference radius and error scale of the washers).

    A kind whose radius is linear in ``z`` along a piece (``washer_degree()
    == 1``: straight pieces, many of them) has its extremes at the piece
    ends, evaluated at once by its ``washer_radius``; any other kind (arcs,
    curves: few), and a kind whose few segments hold many pieces each (a
    polyline's edges), answers each segment's ``bounds()`` (every kind's
    bounds include its turning points).

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> from revolve.geometry.segments import Line, arc_from_centre
    >>> prep = prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> _radius_range(piece_table(prep, [1.0]))
    (1.0, 3.0)
    >>> top = arc_from_centre((2.0, 0.0), (-2.0, 0.0), (0.0, 0.0), clockwise=False)
    >>> ball = prepare(Profile(loops=(Loop((top, Line((-2.0, 0.0), (2.0, 0.0)))),)), Axis.x())
    >>> _radius_range(piece_table(ball, [1.0]))       # the top of the arc, not its ends
    (0.0, 2.0)
    """
    lo, hi = math.inf, -math.inf
    for g in table.groups:
        if len(g.segments) * 64 <= g.stop - g.start:
            # Few segments holding many pieces (a polyline's edges): their bounds, a pass each.
            for seg in g.segments:
                _, r0, _, r1 = seg.bounds()
                lo, hi = min(lo, r0), max(hi, r1)
        elif g.kind.washer_degree() == 1:
            z = np.empty((2, g.stop - g.start))
            z[0], z[1] = table.lo[g.start:g.stop], table.hi[g.start:g.stop]
            with np.errstate(all="ignore"):      # a piece too short for its slope: not counted
                r = g.kind.washer_radius(g.segments, g.params, z.T)
            r = r[np.isfinite(r)]
            if r.size:
                lo, hi = min(lo, float(r.min())), max(hi, float(r.max()))
        else:
            for seg in g.segments:
                _, r0, _, r1 = seg.bounds()
                lo, hi = min(lo, r0), max(hi, r1)
    return (lo, hi) if lo <= hi else (0.0, 0.0)


def washer_volume(prep, loop_factors: Sequence[float], angle: float,
                  rel_tol: float = 1e-14, max_rounds: int = 40,
                  max_intervals: int = MAX_SLICE_INTERVALS) -> Tuple[float, float]:
    """Volume by washers: ``angle/2 · ∫ Σ ± r(z)² dz``; returns (volume, error estimate).

    ``loop_factors`` gives, per loop, +1 or -1 so that solid loops add and
    holes subtract whatever their direction. The work is bounded: intervals
    narrower than the resolution of ``z`` are not halved, and after
    ``max_rounds`` rounds or ``max_intervals`` intervals evaluated (past the
    first), those not yet resolved are taken with their difference plus the
    washer area they hold as the error estimate (honest, if not tight).

    Kinds whose radius is a polynomial of ``z`` (straight pieces) are
    integrated exactly by one rule; for them the error estimate is a rounding
    bound: 16 ulps of the largest ``|r² − r_ref²|`` times the pieces' total
    extent along the axis (a bound on the sum of the magnitudes of all the
    (piece, interval) values).

    The first partition costs one sort of the piece ends, or O(n) with no
    sort when every piece takes an exact rule (:func:`_partition`);
    each later round costs O(m log m) for the m intervals left plus the work of
    :func:`_interval_sums` on the pairs of pieces and intervals, only for the
    pieces that met an unresolved interval in the round before (found from
    their runs by a prefix count, with no search). On an outline
    of straight edges (lines, polylines) the first round resolves every
    interval.
    """
    table = piece_table(prep, loop_factors)
    if table.count == 0:
        return 0.0, 0.0
    breaks, runs = _partition(table)
    r_low, r_high = _radius_range(table)
    r_ref = (r_low + r_high) / 2
    r_far = max(abs(r_low), abs(r_high))
    a, b = breaks[:-1], breaks[1:]
    value = 0.0
    largest = max(abs((r_high - r_ref) * (r_high + r_ref)), abs((r_low - r_ref) * (r_low + r_ref)))
    extent = table.extent()
    error = 16 * np.finfo(float).eps * largest * extent
    n = 24
    budget = a.size + max_intervals
    used = 0
    pending: list = []          # per group, the pieces that met an interval being halved
    for round_no in range(max_rounds):
        used += a.size
        if round_no:
            runs = _runs(table, a, b, pending)
        with np.errstate(all="ignore"):
            coarse, fine = _interval_sums(table, a, b, runs, n, r_ref)
        diff = np.abs(fine - coarse)
        finite = np.isfinite(fine) & np.isfinite(diff)
        if finite.all():
            scale = max(abs(value) + float(np.abs(fine).sum()), 1e-300)
            if float(diff.max()) <= rel_tol * scale:    # every interval resolved
                value += float(fine.sum())
                error += float(diff.sum())
                break
        scale = max(abs(value) + float(np.abs(fine[finite]).sum()), 1e-300)
        # An interval too narrow to halve (its middle rounds onto an end) is done.
        narrow = (b - a) <= 4 * np.spacing(np.maximum(np.abs(a), np.abs(b)))
        good = (finite & (diff <= rel_tol * scale)) | narrow
        last = round_no == max_rounds - 1 or used + 2 * int((~good).sum()) > budget
        if last:
            good[:] = True
        # Where the rule could not resolve an interval (or a slope overflowed on one too
        # narrow to halve), its washers lie between nothing and a disc of the farthest
        # radius for each crossing: that bound is its error.
        unsure = good & (~finite | (diff > rel_tol * scale))
        value += float(np.where(finite, fine, 0.0)[good].sum())
        bound = table.count * r_far * r_far * (b - a)
        error += float(np.where(unsure, np.where(finite, diff, 0.0) + bound, diff)[good].sum())
        if good.all():
            break
        # Only the pieces that meet an interval left unresolved meet any of its halves.
        unresolved = np.concatenate([[0], np.cumsum(~good)])
        pending = []
        for pieces, first, count in runs:
            if isinstance(pieces, (int, np.integer)):
                pieces = np.arange(pieces, pieces + first.size)
            pending.append(pieces[unresolved[first + count] > unresolved[first]])
        # Halve the rest; each pair of halves stays in place, so the intervals stay sorted.
        ab, bb = a[~good], b[~good]
        m = (ab + bb) / 2
        a = np.column_stack([ab, m]).ravel()
        b = np.column_stack([m, bb]).ravel()
    return abs(value) * angle / 2, error * angle / 2


def surface_by_quadrature(prep, angle: float, n: int = 32,
                          rel_tol: float = 1e-14) -> Tuple[List[float], List[float]]:
    """Swept area of every segment, ``angle · ∫ r ds`` by quadrature; (areas, errors) in order.

    Each kind's segments are taken at once by its ``r_ds_rows`` (a polyline
    gives one area, the sum over its edges).

    >>> from revolve.geometry.checks import PreparedProfile
    >>> surface_by_quadrature(PreparedProfile((), (), (), 1.0, 1.0, 1e-9), 1.0)
    ([], [])
    """
    segs = [s for p in prep.paths for s in p]
    out = np.zeros(len(segs))
    err = np.zeros(len(segs))
    kinds = list(map(type, segs))
    if len(set(kinds)) == 1:                 # one kind (a point list): all at once
        out[:], err[:] = kinds[0].r_ds_rows(segs, n, rel_tol)
        return list(out * angle), list(err * angle)
    groups: Dict[type, List[int]] = {}
    for i, kind in enumerate(kinds):
        groups.setdefault(kind, []).append(i)
    for kind, idx in groups.items():
        v, e = kind.r_ds_rows([segs[i] for i in idx], n, rel_tol)
        out[idx], err[idx] = v, e
    return list(out * angle), list(err * angle)
