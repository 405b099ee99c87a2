"""Predicates on profiles: closure, the side of the axis, self-intersection, nesting.

:func:`prepare` runs every check the engine relies on and returns the profile
placed in the axis frame (see :mod:`revolve.geometry.frame`). A failed check
raises :class:`~revolve.errors.ProfileError` naming the segment and, where
the segment came from a file, the file and line.

Examples
--------
>>> from revolve.geometry.profile import Loop, Profile, Axis
>>> ring = Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),))
>>> prep = prepare(ring, Axis.x())
>>> prep.side, prep.depths
(1.0, (0,))
>>> crossing = Profile(loops=(Loop.from_points([(0, -1), (2, -1), (2, 3), (0, 3)]),))
>>> prepare(crossing, Axis.x())
Traceback (most recent call last):
...
revolve.errors.ProfileError: loop 1, segment 1: the profile crosses the axis here (point (0, -1) is on the other side); a section must lie on one side of the axis, touching it at most
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import cached_property
from typing import Optional, Sequence, Tuple

import numpy as np

from revolve.errors import ProfileError
from revolve.geometry.frame import to_frame
from revolve.geometry.profile import Axis, Profile
from revolve.geometry.segments import COORDINATE_LIMIT, SIZE_LIMIT, Segment, Where

#: Relative tolerance (of the profile's size) for closure, axis contact and touching.
RELATIVE_TOLERANCE = 1e-9
#: Axis-frame coordinates smaller than this fraction of the profile's size are zero:
#: a coordinate such as 5e-324 next to 2.5 is rounding noise, and keeping it would make
#: slopes (Δr/Δz) and step counts overflow.
SNAP_FRACTION = 1e-15


@dataclass(frozen=True)
class PreparedProfile:
    """A checked profile in the axis frame.

    ``paths`` holds the frame segments of each loop, then each chain;
    ``closed`` says which paths are loops; ``depths`` is each loop's nesting
    depth (odd = a hole); ``side`` is +1 when the sketch profile lies on the
    left of the axis direction, -1 when on the right; ``size`` is the diagonal
    of its bounding box. A polyline stays one segment (one array): no
    algorithm needs a Python object per vertex.
    """

    paths: Tuple[Tuple[Segment, ...], ...]
    closed: Tuple[bool, ...]
    depths: Tuple[int, ...]
    side: float
    size: float
    tolerance: float

    @cached_property
    def loop_factors(self) -> Tuple[float, ...]:
        """Per closed loop, +1 or −1 so that solids add and holes subtract (:func:`loop_factor`).

        >>> from revolve.geometry.profile import Loop, Profile, Axis
        >>> outer = Loop.from_points([(0, 1), (4, 1), (4, 5), (0, 5)])          # counter-clockwise
        >>> hole = Loop.from_points([(1, 2), (2, 2), (2, 3), (1, 3)])           # counter-clockwise too
        >>> prepare(Profile(loops=(outer, hole)), Axis.x()).loop_factors
        (1.0, -1.0)
        """
        from revolve.geometry.integrals import COL, segment_integrals

        out = []
        loops = [segs for segs, closed in zip(self.paths, self.closed) if closed]
        for segs, depth in zip(loops, self.depths):
            z0, r0, z1, r1 = _box(segs)
            moved = [s.translated(-(z0 + z1) / 2, -(r0 + r1) / 2) for s in segs]
            area = float(segment_integrals(moved).values[:, COL["M00"]].sum())
            out.append(loop_factor(area, depth))
        return tuple(out)


def _edge_count(seg) -> int:
    """How many segments ``seg`` counts as in messages (a polyline: one per edge)."""
    return seg.edge_count()


def loop_factor(signed_area: float, depth: int) -> float:
    """The one rule for a loop's sign: the sign of its area times (−1) to its nesting depth.

    A solid loop then adds and a hole subtracts, whichever way each one runs; a
    loop of zero area counts nothing.

    >>> loop_factor(2.5, 0), loop_factor(2.5, 1), loop_factor(-2.5, 1), loop_factor(0.0, 0)
    (1.0, -1.0, 1.0, 0.0)
    """
    if signed_area == 0:
        return 0.0
    return (1.0 if signed_area > 0 else -1.0) * (1.0 if depth % 2 == 0 else -1.0)


def _box(segs) -> Tuple[float, float, float, float]:
    b = np.array([s.bounds() for s in segs], dtype=float).reshape(-1, 4)
    return float(b[:, 0].min()), float(b[:, 1].min()), float(b[:, 2].max()), float(b[:, 3].max())


def _place(seg: Segment, path_no: int, seg_no: int, closed: bool) -> str:
    return f"{'loop' if closed else 'chain'} {path_no}, segment {seg_no}"


def _fail(message: str, seg: Optional[Segment] = None, place: Optional[str] = None):
    where = getattr(seg, "where", None)
    return ProfileError(message,
                        file=where.file if where else None,
                        line=where.line if where else None,
                        place=(where.place if where and where.place else place))


def _min_distance_from_axis(seg: Segment) -> Tuple[float, Tuple[float, float]]:
    """Lowest ``r`` along a frame segment and where it occurs (exact where its turning points are)."""
    pts = np.vstack([seg.flatten(math.pi / 180, 512), seg.points_at(seg.turning_parameters(1))])
    i = int(np.argmin(pts[:, 1]))
    return float(pts[i, 1]), (float(pts[i, 0]), float(pts[i, 1]))


def _segments_cross(p, q, r, s, tol):
    """Vectorised test: does chord p-q meet chord r-s (touching counts)?"""
    def orient(a, b, c):
        return (b[:, 0] - a[:, 0]) * (c[:, 1] - a[:, 1]) - (b[:, 1] - a[:, 1]) * (c[:, 0] - a[:, 0])

    d1, d2 = orient(r, s, p), orient(r, s, q)
    d3, d4 = orient(p, q, r), orient(p, q, s)
    # √(Δx² + Δy²), not np.hypot (many times slower): |coordinates| ≤ 1e15, no square overflows
    len_pq = np.sqrt(np.square(q[:, 0] - p[:, 0]) + np.square(q[:, 1] - p[:, 1]))
    len_rs = np.sqrt(np.square(s[:, 0] - r[:, 0]) + np.square(s[:, 1] - r[:, 1]))
    # Orientation values are areas: compare with tolerance × length.
    t_rs = tol * np.maximum(len_rs, tol)
    t_pq = tol * np.maximum(len_pq, tol)
    proper = (((d1 > t_rs) & (d2 < -t_rs)) | ((d1 < -t_rs) & (d2 > t_rs))) & \
             (((d3 > t_pq) & (d4 < -t_pq)) | ((d3 < -t_pq) & (d4 > t_pq)))

    def on_segment(a, b, c, d, t):
        # c lies on a-b (|d| small) within its bounding box
        inside = (np.minimum(a[:, 0], b[:, 0]) - tol <= c[:, 0]) & (c[:, 0] <= np.maximum(a[:, 0], b[:, 0]) + tol) & \
                 (np.minimum(a[:, 1], b[:, 1]) - tol <= c[:, 1]) & (c[:, 1] <= np.maximum(a[:, 1], b[:, 1]) + tol)
        return (np.abs(d) <= t) & inside

    # Touching needs an orientation within its tolerance: test only those pairs.
    near = np.flatnonzero((np.abs(d1) <= t_rs) | (np.abs(d2) <= t_rs) |
                          (np.abs(d3) <= t_pq) | (np.abs(d4) <= t_pq))
    if near.size:
        p, q, r, s = p[near], q[near], r[near], s[near]
        t_rs, t_pq = t_rs[near], t_pq[near]
        proper[near] |= on_segment(r, s, p, d1[near], t_rs) | on_segment(r, s, q, d2[near], t_rs) | \
            on_segment(p, q, r, d3[near], t_pq) | on_segment(p, q, s, d4[near], t_pq)
    return proper


def _sweep_order(lo: np.ndarray, hi: np.ndarray) -> Tuple[np.ndarray, np.ndarray]:
    """Boxes sorted by their low end on one axis, and how many boxes after each start before its high end.

    The partners of sorted position p are positions p + 1 … p + span[p]: the
    boxes whose interval on this axis overlaps p's and starts no earlier.
    """
    order = np.argsort(lo, kind="stable")
    ls = lo[order]
    span = np.searchsorted(ls, hi[order], side="right") - np.arange(len(order)) - 1
    return order, np.maximum(span, 0)


def _grid_order(x0, x1, y0, y1, n_limit: int):
    """Boxes registered in the cells of a uniform grid that they cover, grouped by cell.

    Returns (edge of each registration, span, cell key of each registration,
    cell function) with the registrations sorted by cell and in a cell by the
    low end on x; the partners of a registration are the later ones in its
    cell that start on x before it ends. The cell size starts at the
    median box size and doubles until at most ``n_limit`` registrations are
    made, so long boxes cannot blow up the index. ``None`` if the boxes are
    degenerate (all of zero size).
    """
    n = len(x0)
    extent = np.maximum(x1 - x0, y1 - y0)
    h = float(np.median(extent))
    ox, oy = float(x0.min()), float(y0.min())
    whole = max(float(x1.max()) - ox, float(y1.max()) - oy)
    h = max(h, whole / 2.0 ** 24)
    if not (h > 0 and math.isfinite(h)):
        return None
    while True:
        cx0 = np.floor((x0 - ox) / h).astype(np.int64)
        cx1 = np.floor((x1 - ox) / h).astype(np.int64)
        cy0 = np.floor((y0 - oy) / h).astype(np.int64)
        cy1 = np.floor((y1 - oy) / h).astype(np.int64)
        wide = cy1 - cy0 + 1
        reg = (cx1 - cx0 + 1) * wide
        total = int(reg.sum())
        if total <= n_limit or h >= whole:
            break
        h *= 2
    rows = int(cy1.max()) + 1
    edge = np.repeat(np.arange(n), reg)
    off = np.arange(total) - np.repeat(np.cumsum(reg) - reg, reg)
    key = (cx0[edge] + off // wide[edge]) * rows + (cy0[edge] + off % wide[edge])
    # By cell, and in a cell by the low end on x: a registration's partners are then the
    # later ones of its cell up to the last that starts on x before it ends (a sweep in
    # each cell, found by binary search), not every later one of the cell.
    order = np.lexsort((x0[edge], key))
    key, edge = key[order], edge[order]
    new = np.flatnonzero(key[1:] != key[:-1]) + 1
    group_end = np.append(new, total)
    group = np.concatenate([[0], np.cumsum(key[1:] != key[:-1])]) if total else np.zeros(0, int)
    lo_x, hi_x = x0[edge], x1[edge]
    low = np.arange(1, total + 1)                    # first partner candidate: the next one
    high = group_end[group]
    live = np.flatnonzero(low < high)
    while live.size:
        l, u = low[live], high[live]
        mid = (l + u) >> 1
        past = lo_x[mid] > hi_x[live]                # starts after this box ends on x
        low[live] = np.where(past, l, mid + 1)
        high[live] = np.where(past, mid, u)
        live = live[low[live] < high[live]]
    span = low - np.arange(total) - 1

    def cell(x, y):
        return np.floor((x - ox) / h).astype(np.int64) * rows + np.floor((y - oy) / h).astype(np.int64)

    return edge, span, key, cell


def _box_pairs(x0, x1, y0, y1, chunk: int, index: Optional[str] = None):
    """Pairs of boxes that overlap, each once, in blocks of about ``chunk``: yields (i, j) arrays.

    Boxes overlap when ``x0[i] <= x1[j]``, ``x0[j] <= x1[i]`` and the same on y.
    The pairs come from whichever of three indexes gives the fewest to test,
    each counted exactly beforehand in O(n log n): a sweep over x, a sweep over
    y, or a uniform grid whose cells hold the boxes that cover them (a pair is
    kept only in the cell that holds the low corner of the overlap of the two
    boxes, so once). ``index`` ("x", "y" or "grid") forces one (for tests).
    """
    n = len(x0)
    choices = {}
    for name, lo, hi in (("x", x0, x1), ("y", y0, y1)):
        if name == "y" and index is None and choices and choices["x"][0] <= 8 * n:
            # the x sweep is already down to eight pairs per box: take it (a second sweep, a
            # sort and a search of every box, costs about what expanding a few pairs per box
            # does, so it could not save more than it costs)
            break
        if index in (None, name):
            order, span = _sweep_order(lo, hi)
            choices[name] = (int(span.sum()), order, span, None, None, name)
    # The grid costs a sort of its registrations: build it only when a sweep is not already
    # down to a few pairs per box (or when asked for).
    few = bool(choices) and min(c[0] for c in choices.values()) <= 16 * n
    grid = _grid_order(x0, x1, y0, y1, 4 * n + 1024) \
        if index == "grid" or (index is None and not few) else None
    if grid is not None:
        edge, span, key, cell = grid
        choices["grid"] = (int(span.sum()), edge, span, key, cell, "grid")
    if not choices:
        order, span = _sweep_order(x0, x1)
        choices["x"] = (int(span.sum()), order, span, None, None, "x")
    total, ids, span, key, cell, name = min(choices.values(), key=lambda c: c[0])
    # The boxes in the index's order, so that a position's partners are read nearby. A sweep's
    # partners overlap on its own axis already (each starts between the other's ends there):
    # only the other axis is compared.
    bx0, bx1 = (x0[ids], x1[ids]) if name != "x" else (None, None)
    by0, by1 = (y0[ids], y1[ids]) if name != "y" else (None, None)
    cum = np.cumsum(span)
    start = 0
    while start < len(ids) and total:
        # Owners start … stop − 1 (about `chunk` pairs), each with partners p + 1 … p + span[p].
        done = int(cum[start - 1]) if start else 0
        stop = max(start + 1, int(np.searchsorted(cum, done + chunk, side="right")))
        owners = np.arange(start, stop)
        start = stop
        sp = span[owners]
        p = np.repeat(owners, sp)
        if not p.size:
            continue
        q = p + 1 + (np.arange(p.size) - np.repeat(np.cumsum(sp) - sp, sp))
        near = None
        if bx0 is not None:
            near = (bx0[p] <= bx1[q]) & (bx0[q] <= bx1[p])
        if by0 is not None:
            on_y = (by0[p] <= by1[q]) & (by0[q] <= by1[p])
            near = on_y if near is None else near & on_y
        p, q = p[near], q[near]
        i, j = ids[p], ids[q]
        keep = i != j
        if cell is not None:
            keep &= cell(np.maximum(x0[i], x0[j]), np.maximum(y0[i], y0[j])) == key[p]
        if keep.any():
            yield i[keep], j[keep]


def _step_signs(vx: np.ndarray, vy: np.ndarray, slack: float, block: int = 1 << 16,
                signs: bool = True):
    """The signs of the steps between consecutive rows of ``vx``, ``vy`` (int8), and the rows
    whose steps are within ``slack`` on both axes; in blocks, with no full-size float array.
    ``signs=False`` finds the rows only (the signs are None).

    >>> sx, sy, tiny = _step_signs(np.array([0.0, 1.0, 1.0, 0.5]), np.array([0.0, 0.0, 1e-9, 2.0]), 1e-6)
    >>> sx.tolist(), sy.tolist(), tiny.tolist()
    ([1, 0, -1], [0, 1, 1], [1])
    """
    m = max(vx.size - 1, 0)
    sx, sy = (np.empty(m, dtype=np.int8), np.empty(m, dtype=np.int8)) if signs else (None, None)
    dx, dy = np.empty(min(m, block)), np.empty(min(m, block))
    small = np.empty(min(m, block), dtype=bool)
    more = np.empty(min(m, block), dtype=bool)
    tiny = []
    for i in range(0, m, block):
        j = min(m, i + block)
        k = j - i
        for v, d, s in ((vx, dx[:k], sx), (vy, dy[:k], sy)):
            np.subtract(v[i + 1:j + 1], v[i:j], out=d)
            if signs:                                 # (d > 0) − (d < 0), as int8
                np.greater(d, 0.0, out=small[:k])
                np.less(d, 0.0, out=more[:k])
                np.subtract(small[:k].view(np.int8), more[:k].view(np.int8), out=s[i:j])
        sm, mo = small[:k], more[:k]
        np.less_equal(dx[:k], slack, out=sm)
        np.greater_equal(dx[:k], -slack, out=mo)
        sm &= mo
        if sm.any():
            np.less_equal(dy[:k], slack, out=mo)
            sm &= mo
            np.greater_equal(dy[:k], -slack, out=mo)
            sm &= mo
            tiny.append(np.flatnonzero(sm) + i)
    return sx, sy, (np.concatenate(tiny) if tiny else np.zeros(0, dtype=np.int64))


def _turns(d: np.ndarray) -> np.ndarray:
    """Positions k ≥ 1 where step ``d[k]`` runs against the last non-zero step before it.

    Zero steps run neither way and never start a new run.

    >>> _turns(np.array([1.0, 2.0, 0.0, -1.0, 0.0, -3.0, 0.0, 2.0])).tolist()
    [3, 7]
    >>> _turns(np.array([0.0, 0.0, -1.0, 1.0])).tolist()
    [3]
    """
    return _sign_turns((d > 0).view(np.int8) - (d < 0).view(np.int8))


def _sign_turns(s: np.ndarray) -> np.ndarray:
    """:func:`_turns` of the steps' signs ``s`` (int8: −1, 0 or 1).

    >>> _sign_turns(np.array([1, 1, 0, -1, 0, -1, 0, 1], dtype=np.int8)).tolist()
    [3, 7]
    """
    if s.size < 2:
        return np.zeros(0, dtype=np.int64)
    if np.all(s):
        return np.flatnonzero(s[1:] != s[:-1]) + 1
    last = np.where(s != 0, np.arange(s.size), 0)
    np.maximum.accumulate(last, out=last)
    before = s[last[:-1]]                    # the last non-zero step at or before k − 1
    k = np.flatnonzero((s[1:] != 0) & (before != 0) & (s[1:] != before)) + 1
    return k


class _Chains:
    """Paths cut into chains monotone in both x and y, for box queries by binary search.

    Chain ``c`` holds chords ``start[c] … start[c] + length[c] − 1`` of the
    concatenated paths. Taken in *sorted* order (reversed where x falls along
    the path) its vertices' x are non-decreasing and its y monotone, so the
    low and high ends of its chords' boxes are sorted on both axes and the
    chords whose boxes overlap a given box are one run of sorted positions,
    found by four binary searches over the vertex array (one gather a step,
    no array per chord).
    """

    def __init__(self, vx, vy, starts, n, chord_vertex, tol):
        self.vx, self.vy, self.tol = vx, vy, tol
        self.start = starts
        self.length = np.append(starts[1:], n) - starts
        first = chord_vertex(starts)                 # the chain's first vertex along the path
        self.first = first
        last = first + self.length
        sx, sy, ex, ey = vx[first], vy[first], vx[last], vy[last]
        self.rev = ex < sx                           # x falls along the path
        # Sorted vertex t of chain c is vertex base[c] + step[c] · t.
        self.base = np.where(self.rev, last, first)
        self.step = np.where(self.rev, -1, 1)
        self.neg = np.where(self.rev, sy, ey) < np.where(self.rev, ey, sy)   # y falls, sorted
        self.x0 = np.minimum(sx, ex) - tol
        self.x1 = np.maximum(sx, ex) + tol
        self.y0 = np.minimum(sy, ey)
        self.y1 = np.maximum(sy, ey) + tol

    def _end_box(self, a, b):
        """The box of the monotone run from vertex row ``a`` to ``b`` (padded as a chain's)."""
        ax, ay, bx, by = self.vx[a], self.vy[a], self.vx[b], self.vy[b]
        return (np.minimum(ax, bx) - self.tol, np.maximum(ax, bx) + self.tol,
                np.minimum(ay, by), np.maximum(ay, by) + self.tol)

    def next_apart(self, p, q):
        """Of chain pairs (p, q), which are consecutive along a path and cannot meet.

        Consecutive chains (``q = p + 1``, sharing p's last vertex) always have
        overlapping boxes. Every pair of their chords but the two at the shared
        vertex (never tested: they are adjacent) holds a chord of p without its
        last chord or one of q without its first, each a monotone run whose box
        is that of its end vertices: when neither run's box meets the other
        chain's box, no chord box of p meets one of q (the same comparisons).
        """
        lo, hi = np.minimum(p, q), np.maximum(p, q)
        out = (hi == lo + 1) & (self.first[lo] + self.length[lo] == self.first[hi])   # same path
        k = np.flatnonzero(out)
        if not k.size:
            return out
        lo, hi = lo[k], hi[k]
        shared = self.first[hi]
        meets = np.zeros(k.size, dtype=bool)
        for run, other, longer in ((lo, hi, self.length[lo] > 1), (hi, lo, self.length[hi] > 1)):
            # the run: p up to the vertex before the shared one, or q from the vertex after it
            if run is lo:
                a, b = self.first[lo], shared - 1
            else:
                a, b = shared + 1, shared + self.length[hi]
            x0, x1, y0, y1 = self._end_box(a, b)
            meets |= longer & (x0 <= self.x1[other]) & (self.x0[other] <= x1) & \
                (y0 <= self.y1[other]) & (self.y0[other] <= y1)
        out[k[meets]] = False
        return out

    def chord(self, c, k):
        """Chord id at sorted position ``k`` of chain ``c``."""
        return np.where(self.rev[c], self.start[c] + self.length[c] - 1 - k, self.start[c] + k)

    def _first(self, c, pred, q0, q1):
        """First sorted position k of each chain ``c`` where ``pred`` holds (it holds from there on).

        ``pred(base, step, k, neg, q0, q1)`` is evaluated on the live queries only.
        """
        lo = np.zeros(c.size, dtype=np.int64)
        hi = self.length[c]
        base, step, neg = self.base[c], self.step[c], self.neg[c]
        live = np.flatnonzero(hi > 0)
        while live.size:
            l, h = lo[live], hi[live]
            mid = (l + h) >> 1
            ok = pred(base[live], step[live], mid, neg[live], q0[live], q1[live])
            lo[live] = np.where(ok, l, mid + 1)
            hi[live] = np.where(ok, mid, h)
            live = live[lo[live] < hi[live]]
        return lo

    def meeting(self, c, x0, x1, y0, y1):
        """Per query, the run ``[first, stop)`` of sorted positions of chain ``c`` whose chord
        boxes overlap the box ``x0 … x1, y0 … y1`` (the same comparisons as box against box)."""
        vx, vy, tol = self.vx, self.vy, self.tol
        # Chord k of a sorted chain runs from sorted vertex k (low x) to k + 1 (high x); on y
        # the low end is vertex k, or k + 1 where y falls.
        first_x = self._first(c, lambda b, s, k, g, q, _: vx[b + s * (k + 1)] + tol >= q, x0, x0)
        stop_x = self._first(c, lambda b, s, k, g, q, _: vx[b + s * k] - tol > q, x1, x1)

        def y_started(b, s, k, g, lo, hi):           # box high end ≥ lo
            v = vy[b + s * (k + 1)]
            return np.where(g, v <= hi, v + tol >= lo)   # falling: its low end ≤ hi

        def y_passed(b, s, k, g, lo, hi):            # box low end > hi
            v = vy[b + s * k]
            return np.where(g, v + tol < lo, v > hi)     # falling: its high end < lo

        first_y = self._first(c, y_started, y0, y1)
        stop_y = self._first(c, y_passed, y0, y1)
        first = np.maximum(first_x, first_y)
        return first, np.maximum(np.minimum(stop_x, stop_y), first)


def _expand(first, stop):
    """(owner, position) for every position of every run ``first[o] … stop[o] − 1``.

    >>> [v.tolist() for v in _expand(np.array([0, 5]), np.array([2, 6]))]
    [[0, 0, 1], [0, 1, 5]]
    """
    count = stop - first
    owner = np.repeat(np.arange(count.size), count)
    pos = np.arange(owner.size) - np.repeat(np.cumsum(count) - count, count) + first[owner]
    return owner, pos


#: Pairs of chains with at most this many pairs of chords are tested chord by chord, no search.
FEW_PAIRS = 16


def _expand_blocks(first, stop, block: int):
    """:func:`_expand` in pieces of at most about ``block`` positions (runs longer than
    ``block`` are cut), so that no expansion outgrows memory.

    >>> [[v.tolist() for v in b] for b in _expand_blocks(np.array([0, 5]), np.array([3, 6]), 2)]
    [[[0, 0], [0, 1]], [[0, 1], [2, 5]]]
    """
    count = stop - first
    if int(count.sum()) <= block:
        yield _expand(first, stop)
        return
    parts = np.maximum(-(-count // block), 1)
    owner = np.repeat(np.arange(count.size), parts)
    k = np.arange(owner.size) - np.repeat(np.cumsum(parts) - parts, parts)
    f = first[owner] + k * block
    s = np.minimum(f + block, stop[owner])
    cum = np.cumsum(s - f)
    start = 0
    while start < f.size:
        done = int(cum[start - 1]) if start else 0
        end = max(start + 1, int(np.searchsorted(cum, done + block, side="right")))
        o, pos = _expand(f[start:end], s[start:end])
        yield owner[start:end][o], pos
        start = end


#: The block path of :func:`find_self_intersection` (outlines whose chords' boxes meet by the
#: hundred): chords in the finest blocks, blocks of a level in one of the level above, and
#: directions (over half a turn) onto which every block is projected.
BLOCK = 8
FAN = 4
DIRECTIONS = 8
#: A level of blocks above is built while the box index would give more than this many pairs a block.
LEVEL_FROM = 16
#: The block path is taken when the box index would give more than this many pairs a chain.
BLOCK_FROM = 64


class _Blocks:
    """Blocks of ``size`` consecutive chords, with what tells two of them apart.

    Per block: its box (padded by ``margin``), its extents on :data:`DIRECTIONS`
    directions (a polytope around it), its main direction (of its vertices'
    spread) with its extent across it, and a centre with the radius of a disc
    about it that holds the block. Coordinates are taken from ``origin``.
    """

    def __init__(self, vx, vy, n, chord_vertex, size, margin, origin):
        nb = -(-n // size)
        self.nb = nb
        self.fc = np.arange(nb, dtype=np.int64) * size
        lc = np.minimum(self.fc + size, n) - 1
        self.size = lc - self.fc + 1
        rs, re = chord_vertex(self.fc), chord_vertex(lc) + 1
        # The rows of block k are rs[k] … re[k]: reduceat takes rs[k] … rs[k + 1] − 1 (which
        # ends at re[k], or at re[k] − 1 where the next block starts on the same vertex).

        def extent(v):
            return (np.minimum(np.minimum.reduceat(v, rs), v[re]),
                    np.maximum(np.maximum.reduceat(v, rs), v[re]))

        x0, x1 = extent(vx)
        y0, y1 = extent(vy)
        self.x0, self.x1, self.y0, self.y1 = x0 - margin, x1 + margin, y0 - margin, y1 + margin
        angle = np.arange(DIRECTIONS) * (math.pi / DIRECTIONS)
        self.lo = np.empty((DIRECTIONS, nb))
        self.hi = np.empty((DIRECTIONS, nb))
        for k, (c, s) in enumerate(zip(np.cos(angle), np.sin(angle))):
            self.lo[k], self.hi[k] = extent(vx * c + vy * s)
        px, py = vx - origin[0], vy - origin[1]
        count = np.diff(np.append(rs, vx.size))
        row_block = np.repeat(np.arange(nb), count)
        mx = np.add.reduceat(px, rs) / count
        my = np.add.reduceat(py, rs) / count
        dx, dy = px - mx[row_block], py - my[row_block]
        sxx = np.add.reduceat(dx * dx, rs)
        syy = np.add.reduceat(dy * dy, rs)
        sxy = np.add.reduceat(dx * dy, rs)
        main = 0.5 * np.arctan2(2 * sxy, sxx - syy)
        self.nx, self.ny = -np.sin(main), np.cos(main)            # across the main direction
        self.a0, self.a1 = extent(px * self.nx[row_block] + py * self.ny[row_block])
        end = px[re] * self.nx + py[re] * self.ny
        self.a0, self.a1 = np.minimum(self.a0, end), np.maximum(self.a1, end)
        self.mx, self.my = mx, my
        ex, ey = px[re] - mx, py[re] - my
        self.radius = np.sqrt(np.maximum(np.maximum.reduceat(dx * dx + dy * dy, rs),
                                         ex * ex + ey * ey))
        self.margin = margin
        # Each block's rows (the last repeated to fill: about n in all), for exact extents.
        self.rows = np.minimum(rs[:, None] + np.arange(int((re - rs).max()) + 1), re[:, None])
        self.vx, self.vy = vx, vy

    def count(self) -> int:
        """Pairs of blocks the box index would give (the fewer of the sweeps over x and y)."""
        return min(int(_sweep_order(self.x0, self.x1)[1].sum()),
                   int(_sweep_order(self.y0, self.y1)[1].sum()))

    def apart(self, a, b):
        """Of block pairs (a, b), which are apart by more than the margin on some direction
        (so that no point of one comes within the margin of a point of the other)."""
        m = self.margin
        out = ~((self.x0[a] <= self.x1[b]) & (self.x0[b] <= self.x1[a]) &
                (self.y0[a] <= self.y1[b]) & (self.y0[b] <= self.y1[a]))
        # the polytopes, on the directions nearest that of the line between the centres
        theta = np.arctan2(self.my[b] - self.my[a], self.mx[b] - self.mx[a])
        near = np.rint(theta * (DIRECTIONS / math.pi)).astype(np.int64)
        for shift in (0, 1, -1):
            k = (near + shift) % DIRECTIONS
            out |= (self.hi[k, a] + m < self.lo[k, b]) | (self.hi[k, b] + m < self.lo[k, a])
        # across either block's main direction: its own extent there, and the other's within
        # the other's own extent, moved by (its centre and its radius) × the turn between them
        for p, q in ((a, b), (b, a)):
            flip = np.where(self.nx[p] * self.nx[q] + self.ny[p] * self.ny[q] < 0, -1.0, 1.0)
            dx = self.nx[p] - flip * self.nx[q]
            dy = self.ny[p] - flip * self.ny[q]
            shift = self.mx[q] * dx + self.my[q] * dy
            slack = self.radius[q] * np.sqrt(dx * dx + dy * dy)
            q0 = np.where(flip > 0, self.a0[q], -self.a1[q]) + shift - slack
            q1 = np.where(flip > 0, self.a1[q], -self.a0[q]) + shift + slack
            out |= (self.a1[p] + m < q0) | (q1 + m < self.a0[p])
        # The pairs left: exact extents of both across their mean main direction (the second's
        # turned to agree), in pieces of about 2²⁰ rows.
        live = np.flatnonzero(~out)
        step = max(1, (1 << 20) // self.rows.shape[1])
        for k in range(0, live.size, step):
            piece = live[k:k + step]
            pa, pb = a[piece], b[piece]
            flip = np.where(self.nx[pa] * self.nx[pb] + self.ny[pa] * self.ny[pb] < 0, -1.0, 1.0)
            nx, ny = self.nx[pa] + flip * self.nx[pb], self.ny[pa] + flip * self.ny[pb]
            ra, rb = self.rows[pa], self.rows[pb]
            qa = self.vx[ra] * nx[:, None] + self.vy[ra] * ny[:, None]
            qb = self.vx[rb] * nx[:, None] + self.vy[rb] * ny[:, None]
            mm = m * np.sqrt(nx * nx + ny * ny)               # |n| is up to 2: the margin with it
            out[piece] = (qa.max(axis=1) + mm < qb.min(axis=1)) | \
                (qb.max(axis=1) + mm < qa.min(axis=1))
        return out


def _block_pairs(vx, vy, n: int, chord_vertex, box, margin: float, chunk: int, budget: int):
    """Pairs of chords to test on an outline whose chords' boxes meet by the hundred, or ``None``.

    Consecutive chords are grouped in blocks of :data:`BLOCK`, those in blocks
    of :data:`FAN` blocks, and so on up to a level where the blocks' boxes meet
    a few times a block (:class:`_Blocks`). There the pairs of blocks whose
    boxes overlap are tried for a gap of more than ``margin`` on a direction
    (:meth:`_Blocks.apart`): the polytopes' directions nearest the line between
    their centres, and across either block's main direction. Blocks apart have
    no chords that come within ``margin`` of each other, so none of their
    chords meet; a zigzag outline's spikes are thin across, so only
    neighbouring blocks are left. The blocks in the pairs left (and each block
    with itself) are paired a level down and tried again, down to the finest
    blocks, whose chords are yielded in pairs (the same box test as everywhere
    else: a superset of the pairs that meet). ``None`` — take the box index
    instead — when the pairs would be more than ``budget`` (the box index's own
    count), so the worst case costs about what the box index does.
    """
    origin = ((float(vx.min()) + float(vx.max())) / 2, (float(vy.min()) + float(vy.max())) / 2)
    levels = [_Blocks(vx, vy, n, chord_vertex, BLOCK, margin, origin)]
    size = BLOCK
    while levels[-1].nb > FAN and levels[-1].count() > LEVEL_FROM * levels[-1].nb:
        size *= FAN
        levels.append(_Blocks(vx, vy, n, chord_vertex, size, margin, origin))
    top = levels[-1]
    if top.count() * 4 > budget:
        return None
    kept_a, kept_b = [], []
    for a, b in _box_pairs(top.x0, top.x1, top.y0, top.y1, chunk):
        keep = ~top.apart(a, b)
        kept_a.append(a[keep])
        kept_b.append(b[keep])
    a = np.concatenate(kept_a + [np.arange(top.nb)])
    b = np.concatenate(kept_b + [np.arange(top.nb)])
    for level in reversed(levels[:-1]):
        # children: blocks FAN·A … FAN·A + FAN − 1 of the level below
        pair, ca = _expand(a * FAN, np.minimum(a * FAN + FAN, level.nb))
        entry, cb = _expand(np.zeros(pair.size, dtype=np.int64),
                            np.minimum(b[pair] * FAN + FAN, level.nb) - b[pair] * FAN)
        ca, cb = ca[entry], cb + b[pair[entry]] * FAN
        same = a[pair[entry]] == b[pair[entry]]
        ca, cb, same = ca[~same | (ca <= cb)], cb[~same | (ca <= cb)], same[~same | (ca <= cb)]
        if ca.size * 4 > budget:
            return None
        test = ca != cb
        keep = np.ones(ca.size, dtype=bool)
        keep[test] = ~level.apart(ca[test], cb[test])
        a, b = ca[keep], cb[keep]
    finest = levels[0]
    if int((finest.size[a] * finest.size[b]).sum()) > budget:
        return None
    return _chords_of_blocks(a, b, finest.fc, finest.size, box, chunk)


def _chords_of_blocks(a, b, fc, size, box, chunk: int):
    """Every pair of chords, one of block ``a[k]`` and one of block ``b[k]`` (of a block with
    itself: each pair once), whose boxes overlap; in pieces of about ``chunk`` pairs."""
    cum = np.cumsum(size[a] * size[b])
    start = 0
    while start < a.size:
        done = int(cum[start - 1]) if start else 0
        stop = max(start + 1, int(np.searchsorted(cum, done + chunk, side="right")))
        pa_, pb_ = a[start:stop], b[start:stop]
        start = stop
        pair, i = _expand(fc[pa_], fc[pa_] + size[pa_])
        entry, j = _expand(np.zeros(pair.size, dtype=np.int64), size[pb_][pair])
        i, j = i[entry], j + fc[pb_][pair[entry]]
        keep = (pa_[pair[entry]] != pb_[pair[entry]]) | (i < j)
        i, j = i[keep], j[keep]
        x0i, x1i, y0i, y1i = box(i)
        x0j, x1j, y0j, y1j = box(j)
        near = (x0i <= x1j) & (x0j <= x1i) & (y0i <= y1j) & (y0j <= y1i)
        if near.any():
            yield i[near], j[near]


def find_self_intersection(chains: Sequence[np.ndarray], closed: Sequence[bool], tol: float,
                           chunk: int = 1 << 16, index: Optional[str] = None,
                           bounds=None, blocks: Optional[bool] = None) -> Optional[Tuple[int, int, int, int]]:
    """First pair of non-adjacent chords that meet, as (path_a, chord_a, path_b, chord_b).

    ``chains`` holds each path's points (m + 1, 2); "first" is the smallest
    (path_a, chord_a, path_b, chord_b) with (path_a, chord_a) < (path_b, chord_b).
    Two chords are tested when their boxes overlap: ``[x_min − tol, x_max + tol]``
    on x and ``[y_min, y_max + tol]`` on y (every pair that meets does).

    The paths are cut into chains along which neither x nor y turns back (a
    zero step, vertical or level, turns neither way), with numpy in a few
    passes. In such a chain the chords' boxes are sorted on both axes, so the
    chords of a chain whose boxes overlap a box are one run, found by binary
    search. The chains' own boxes go through an index (a sweep over x, over y,
    or a uniform grid, whichever gives the fewest pairs, counted beforehand;
    ``index`` forces one, for tests); for each pair of overlapping chains the
    chords of the shorter that meet the other's box are found, then for each
    of those the run of the other's chords that its box meets (consecutive
    chains, whose boxes always meet at their shared vertex, are first compared
    by the boxes of their runs without the two chords at that vertex, which
    leaves out almost all of them; :meth:`_Chains.next_apart`). Within one
    chain, two non-adjacent chords can overlap only across chords shorter than
    about 2·tol on both axes (each step along a chain moves away on both
    axes): those few pairs are added directly. On a real outline the cost is
    a few passes over the vertices plus O(c log n) for c chains (those where
    the outline turns back, noise included). On a noisy outline whose zigzags
    turn at almost every vertex the chains are single chords and the work is
    that of the chords' boxes in the index, which grows as
    (total length)² / area where the zigzags truly overlap: when the index
    would give more than :data:`BLOCK_FROM` pairs a chain (counted first; an
    outline noisy only in places has such chains too),
    blocks of consecutive chords, in levels (blocks of blocks), are paired
    instead and kept apart by a direction across them (:func:`_block_pairs`;
    a zigzag's spikes are thin across, so only neighbouring blocks are left,
    level after level: about 10 pairs a chord), unless that would leave more
    pairs than the index. ``blocks``
    forces that path on (on any outline) or off, for tests. The exact
    orientation test runs vectorised on the candidates, in blocks of about
    ``chunk`` pairs.

    >>> bow = [np.array([[0, 0], [2, 2], [2, 0], [0, 2], [0, 0]], dtype=float)]
    >>> find_self_intersection(bow, [True], 1e-9)
    (0, 0, 0, 2)
    >>> square = [np.array([[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]], dtype=float)]
    >>> find_self_intersection(square, [True], 1e-9) is None
    True
    >>> back = [np.array([[0, 0], [0, 2], [0, 1], [0, 3]], dtype=float)]   # up, down, up again
    >>> find_self_intersection(back, [False], 1e-9)
    (0, 0, 0, 2)
    >>> find_self_intersection([np.zeros((1, 2))], [False], 1e-9) is None   # no chord at all
    True

    ``bounds`` may give a box ``(x_min, y_min, x_max, y_max)`` holding all the
    points when the caller has one already (it scales the tolerance under which
    chords count as almost no length: a larger box only adds candidates).
    """
    used = [(k, np.asarray(p, dtype=float)) for k, p in enumerate(chains) if len(p) >= 2]
    if not used:
        return None
    counts = np.array([len(p) - 1 for _, p in used], dtype=np.int64)
    offsets = np.concatenate([[0], np.cumsum(counts)])
    path_no = np.array([k for k, _ in used], dtype=np.int64)
    path_closed = np.asarray(closed, dtype=bool)[path_no]
    n = int(offsets[-1])
    single = len(used) == 1
    V = used[0][1] if single else np.concatenate([p for _, p in used])
    vx, vy = V[:, 0], V[:, 1]
    # Within a chain, two non-adjacent chords meet only across chords shorter than about
    # 2·tol on both axes: `slack` bounds those (the scale is that of the chains' boxes).
    if bounds is None:
        bounds = (vx.min(), vy.min(), vx.max(), vy.max())
    x_lo, y_lo, x_hi, y_hi = (float(v) for v in bounds)
    scale = max(abs(x_lo - tol), abs(x_hi + tol), abs(y_lo), abs(y_hi + tol))
    slack = 4 * tol + 16 * np.finfo(float).eps * scale
    sx, sy, tiny = _step_signs(vx, vy, slack)
    if single:
        def ordinal(i):
            return np.zeros(np.shape(i), dtype=np.int64)
    else:
        junction = offsets[1:-1] + np.arange(len(used) - 1)     # rows joining two paths
        sx, sy = np.delete(sx, junction), np.delete(sy, junction)
        tiny = tiny[~np.isin(tiny, junction)]
        tiny -= np.searchsorted(junction, tiny)                 # rows to chord ids

        def ordinal(i):
            return np.searchsorted(offsets, i, side="right") - 1

    def chord_vertex(i):                     # vertex row where chord i starts
        return i if single else i + ordinal(i)

    starts = np.sort(np.concatenate([[0], _sign_turns(sx), _sign_turns(sy),
                                     offsets[1:-1]]).astype(np.int64))
    starts = starts[np.concatenate([[True], starts[1:] != starts[:-1]])]
    if 2 * starts.size > n:
        # A noisy outline turns back at most vertices: chains of a chord or two gain nothing
        # over the chords themselves, whose boxes are smaller.
        starts = np.arange(n, dtype=np.int64)
    ch = _Chains(vx, vy, starts, n, chord_vertex, tol)
    best = None

    def box(i):
        v = chord_vertex(i)
        ax, ay, bx, by = vx[v], vy[v], vx[v + 1], vy[v + 1]
        return (np.minimum(ax, bx) - tol, np.maximum(ax, bx) + tol,
                np.minimum(ay, by), np.maximum(ay, by) + tol)

    def test(i, j):
        nonlocal best
        diff = np.abs(i - j)
        if single:                        # one path: chord numbers are chord ids
            distant = (diff > 1) & ((diff != n - 1) | ~path_closed[0])
            keep = np.flatnonzero(distant)
            pi = pj = np.zeros(keep.size, dtype=np.int64)
            i, j = i[keep], j[keep]
            ii, jj = i, j
        else:
            pi, pj = ordinal(i), ordinal(j)
            ii, jj = i - offsets[pi], j - offsets[pj]
            diff = np.abs(ii - jj)
            adjacent = (pi == pj) & ((diff == 1) | (path_closed[pi] & (diff == counts[pi] - 1)))
            keep = np.flatnonzero(~adjacent & (i != j))
            i, j, pi, pj, ii, jj = i[keep], j[keep], pi[keep], pj[keep], ii[keep], jj[keep]
        if not keep.size:
            return
        vi, vj = i + pi, j + pj
        hit = np.flatnonzero(_segments_cross(V[vi], V[vi + 1], V[vj], V[vj + 1], tol))
        if not hit.size:
            return
        pa, ca, pb, cb = path_no[pi[hit]], ii[hit], path_no[pj[hit]], jj[hit]
        swap = (pb < pa) | ((pb == pa) & (cb < ca))
        pa, ca, pb, cb = (np.where(swap, pb, pa), np.where(swap, cb, ca),
                          np.where(swap, pa, pb), np.where(swap, ca, cb))
        k = np.lexsort((cb, pb, ca, pa))[0]
        found = (int(pa[k]), int(ca[k]), int(pb[k]), int(cb[k]))
        best = found if best is None else min(best, found)

    # Within a chain: runs of chords shorter than about 2·tol on both axes (`tiny`), with a
    # chord on either side (a superset, put through the same box test as the pairs across
    # chains).
    if tiny.size:
        gap = np.diff(tiny) > 1
        lo = np.maximum(tiny[np.concatenate([[True], gap])] - 1, 0)
        hi = np.minimum(tiny[np.concatenate([gap, [True]])] + 1, n - 1)      # inclusive
        for run, first_i in _expand_blocks(lo, hi + 1, chunk):
            count = np.maximum(hi[run] - first_i - 1, 0)          # partners i + 2 … hi
            for own, j in _expand_blocks(first_i + 2, first_i + 2 + count, chunk):
                i = first_i[own]
                x0i, x1i, y0i, y1i = box(i)
                x0j, x1j, y0j, y1j = box(j)
                near = (x0i <= x1j) & (x0j <= x1i) & (y0i <= y1j) & (y0j <= y1i)
                if near.any():
                    test(i[near], j[near])

    # Chains whose boxes meet by the hundred (a zigzag outline, or a noisy stretch of one, whose
    # chains are a chord or two): blocks of chords kept apart by a direction across them
    # (_block_pairs), unless that would not pay.
    pairs = None
    if index is None and blocks is not False:
        count = min(int(_sweep_order(ch.x0, ch.x1)[1].sum()), int(_sweep_order(ch.y0, ch.y1)[1].sum()))
        if blocks or count > BLOCK_FROM * starts.size:
            pairs = _block_pairs(vx, vy, n, chord_vertex, box, 4 * slack, chunk,
                                 np.iinfo(np.int64).max if blocks else count)
    if pairs is not None:
        for i, j in pairs:
            test(i, j)
    # Across chains: overlapping chain boxes; then the chords of the shorter chain that meet
    # the other's box, and for each of those the run of the other's chords that its box meets.
    for ca_, cb_ in (_box_pairs(ch.x0, ch.x1, ch.y0, ch.y1, chunk, index) if pairs is None else ()):
        apart = ch.next_apart(ca_, cb_)      # consecutive chains whose boxes meet only at their join
        if apart.any():
            ca_, cb_ = ca_[~apart], cb_[~apart]
        short = ch.length[cb_] < ch.length[ca_]
        qa, qb = np.where(short, cb_, ca_), np.where(short, ca_, cb_)
        ones = ch.length[qb] == 1          # two single chords: their boxes overlap, test them
        if ones.any():
            test(ch.start[qa[ones]], ch.start[qb[ones]])
            qa, qb = qa[~ones], qb[~ones]
        # Short chains (a single chord against a few): every pair of their chords, box-tested.
        few = ch.length[qa] * ch.length[qb] <= FEW_PAIRS
        if few.any():
            fa, fb = qa[few], qb[few]
            pair, pa = _expand(ch.start[fa], ch.start[fa] + ch.length[fa])
            entry, pb = _expand(np.zeros(pair.size, dtype=np.int64), ch.length[fb][pair])
            pa, pb = pa[entry], pb + ch.start[fb][pair[entry]]
            x0a, x1a, y0a, y1a = box(pa)
            x0b, x1b, y0b, y1b = box(pb)
            near = (x0a <= x1b) & (x0b <= x1a) & (y0a <= y1b) & (y0b <= y1a)
            test(pa[near], pb[near])
            qa, qb = qa[~few], qb[~few]
        if not qa.size:
            continue
        f, s = ch.meeting(qa, ch.x0[qb], ch.x1[qb], ch.y0[qb], ch.y1[qb])
        for owner, pos in _expand_blocks(f, s, chunk):
            ia, cb = ch.chord(qa[owner], pos), qb[owner]
            f2, s2 = ch.meeting(cb, *box(ia))
            for o, p in _expand_blocks(f2, s2, chunk):
                test(ia[o], ch.chord(cb[o], p))
    return best


def _point_in_polygon(px: float, py: float, poly: np.ndarray) -> bool:
    """Even-odd rule, vectorised over the polygon's edges."""
    x0, y0 = poly[:-1, 0], poly[:-1, 1]
    x1, y1 = poly[1:, 0], poly[1:, 1]
    crosses = (y0 > py) != (y1 > py)
    with np.errstate(divide="ignore", invalid="ignore"):
        xi = x0 + (py - y0) * (x1 - x0) / (y1 - y0)
    return bool(np.count_nonzero(crosses & (px < xi)) % 2)


def check_coordinate_range(points) -> None:
    """Refuse coordinates beyond ±:data:`~revolve.geometry.segments.COORDINATE_LIMIT`.

    Squares, cubes and the fifth powers in moments of inertia of larger
    coordinates overflow (or come close); the message gives the allowed range.

    >>> check_coordinate_range(np.array([[0.0, 1e15], [-3.0, 2.0]]))
    >>> check_coordinate_range(np.array([[0.0, 1e90]]))
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: the profile has a coordinate of 1e+90; the allowed range is |coordinate| ≤ 1e+15 in the profile's unit: give the profile in a larger unit or nearer the origin
    """
    pts = np.asarray(points, dtype=float)
    if pts.size == 0:
        return
    big = np.abs(pts)
    worst = float(big.max())
    if not worst <= COORDINATE_LIMIT:
        v = float(pts.flat[int(np.argmax(big))])
        raise ProfileError(f"the profile has a coordinate of {v:g}; the allowed range is "
                           f"|coordinate| ≤ {COORDINATE_LIMIT:g} in the profile's unit: give the "
                           "profile in a larger unit or nearer the origin")


def prepare(profile: Profile, axis: Axis) -> PreparedProfile:
    """Check a profile against an axis and place it in the axis frame.

    Every check runs on arrays: a polyline's edges are checked all at once
    (zero length, coordinate range, the side of the axis, self-intersection,
    nesting), so a 10⁶-vertex outline costs a few passes over its vertices. A
    failure names the segment as the profile numbers it (a polyline's edges
    are its segments: "loop 1, segment 5") and, for a segment from a file,
    the file and line (a polyline's edge: the line of its first vertex).

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> prep = prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> [(s.kind, s.chord_count()) for s in prep.paths[0]], prep.size
    ([('polyline', 4)], 2.8284271247461903)
    >>> prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 1), (0, 3)]),)), Axis.x())
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: loop 1, segment 2: this segment has zero length; remove it
    """
    paths = profile.paths
    if not paths:
        raise ProfileError("the profile has no loops or chains; give at least one closed loop")
    closed = tuple(p.closed for p in paths)
    # Sketch points of every segment, for size, side and intersections.
    flat = [[s.flatten() for s in p.segments] for p in paths]
    pieces = [f for fs in flat for f in fs]
    allpts = (pieces[0] if len(pieces) == 1 else np.concatenate(pieces)) if pieces \
        else np.zeros((0, 2))
    if allpts.size == 0:
        raise ProfileError("the profile has no segments")
    # One pass a column for the box, which also answers the finiteness and range checks: a
    # NaN comes out of min and max, and so does an infinite or out-of-range coordinate.
    # (column by column: a reduction along axis 0 of an (n, 2) array is many times slower)
    lo = np.array([allpts[:, 0].min(), allpts[:, 1].min()])
    hi = np.array([allpts[:, 0].max(), allpts[:, 1].max()])
    if not (np.all(np.isfinite(lo)) and np.all(np.isfinite(hi))):
        raise ProfileError("the profile has a coordinate that is not a finite number")
    if not max(float(np.abs(lo).max()), float(np.abs(hi).max())) <= COORDINATE_LIMIT:
        check_coordinate_range(allpts)
    size = float(np.hypot(*(hi - lo)))
    if size == 0:
        raise ProfileError("the profile has zero size: every point is the same")
    if size < SIZE_LIMIT:
        raise ProfileError(f"the profile is too small ({size:.3g} across); the allowed range is "
                           f"{SIZE_LIMIT:g} to {COORDINATE_LIMIT:g} in the profile's unit: give it "
                           "in a smaller unit")
    tol = RELATIVE_TOLERANCE * size
    for k, p in enumerate(paths, start=1):
        _check_path(p, k, tol)
    # Which side of the axis?
    r_far = _farthest_from_axis(allpts, lo, hi, axis)
    if abs(r_far) <= tol:
        raise ProfileError("the whole profile lies on the axis; it would sweep nothing")
    side = 1.0 if r_far > 0 else -1.0
    frame_paths = []
    for k, p in enumerate(paths, start=1):
        fsegs = tuple(to_frame(s.straightened(), axis, side).snapped(SNAP_FRACTION * size)
                      for s in p.segments)
        number = 0
        for s, fs in zip(p.segments, fsegs):
            low = fs.bounds()[1]               # exact: a kind's bounds include its turning points
            if low < -tol:
                edge, (zq, rq) = _lowest_place(fs, tol)
                x, y = axis.from_frame(zq, rq, side)
                raise _fail_at(f"the profile crosses the axis here (point ({x:.6g}, {y:.6g}) is on "
                               "the other side); a section must lie on one side of the axis, "
                               "touching it at most", s, edge, _place(None, k, number + edge + 1,
                                                                       p.closed))
            number += _edge_count(s)
        frame_paths.append(fsegs)
    # Self-intersection, loops and chains together (in the sketch: a rigid map changes nothing).
    chords = [fs[0] if len(fs) == 1 else
              (np.concatenate([fs[0]] + [f[1:] for f in fs[1:]]) if fs else np.zeros((0, 2)))
              for fs in flat]
    hit = find_self_intersection(chords, closed, tol, bounds=(lo[0], lo[1], hi[0], hi[1]))
    if hit is not None:
        pa, ca, pb, cb = hit
        sa, ea, na = _chord_place(paths[pa].segments, flat[pa], ca)
        _, _, nb = _chord_place(paths[pb].segments, flat[pb], cb)
        other = _place(None, pb + 1, nb, closed[pb])
        raise _fail_at(f"the profile intersects itself: this segment meets {other}; "
                       "a section boundary must not cross or touch itself",
                       paths[pa].segments[sa], ea, _place(None, pa + 1, na, closed[pa]))
    # Nesting depth of each loop (odd = hole): a point of each loop against the others.
    loops = [chords[k] for k in range(len(paths)) if closed[k]]
    depths = []
    for k, poly in enumerate(loops):
        px, py = poly[0]
        if len(poly) > 1:
            px, py = (poly[0] + poly[1]) / 2
        depths.append(sum(_point_in_polygon(px, py, other)
                          for m, other in enumerate(loops) if m != k))
    prep = PreparedProfile(tuple(frame_paths), closed, tuple(depths), side, size, tol)
    return prep


def _farthest_from_axis(points: np.ndarray, lo, hi, axis: Axis) -> float:
    """The signed distance from the axis (:meth:`Axis.to_frame`) of the first point farthest from it.

    An axis along x or y reads it from the box ``lo``, ``hi`` of the points (no
    pass over them) unless the box's two sides are equally far (then which comes
    first decides, as for any other axis: a pass over the points).

    >>> pts = np.array([[0.0, 1.0], [2.0, -3.0], [4.0, 3.0]])
    >>> lo, hi = pts.min(axis=0), pts.max(axis=0)
    >>> _farthest_from_axis(pts, lo, hi, Axis.x()), _farthest_from_axis(pts, lo, hi, Axis.y())
    (-3.0, -4.0)
    >>> _farthest_from_axis(pts, lo, hi, Axis((0.0, 0.0), (1.0, 1.0)))
    -3.5355339059327373
    """
    ux, uy = axis.unit_direction()
    px, py = float(axis.point[0]), float(axis.point[1])
    if uy == 0.0 or ux == 0.0:
        # r = ux·(y − py) or −uy·(x − px): its extremes are at the box's sides
        k, u, p = (1, ux, py) if uy == 0.0 else (0, -uy, px)
        a, b = u * (float(lo[k]) - p), u * (float(hi[k]) - p)
        if abs(a) != abs(b):
            return a if abs(a) > abs(b) else b
    _, r_all = axis.to_frame(points[:, 0], points[:, 1])
    return float(r_all[int(np.argmax(np.abs(r_all)))])


def _within(values: np.ndarray, bound: float) -> np.ndarray:
    """``|values| ≤ bound`` as a boolean array, with no float temporary (two comparisons).

    >>> _within(np.array([-2.0, -1.0, 0.0, 1.0, np.nan]), 1.0).tolist()
    [False, True, True, True, False]
    """
    out = np.less_equal(values, bound)
    out &= np.greater_equal(values, -bound)
    return out


def _check_path(path, k: int, tol: float) -> None:
    """Zero-length segments (a polyline's edges at once), joins and closure of path ``k``."""
    segs = path.segments
    if not segs:
        raise ProfileError(f"{'loop' if path.closed else 'chain'} {k} has no segments")
    number = 0
    for j, s in enumerate(segs):
        if s.edge_count() > 1:            # its flattened chords are its edges
            pts = s.flatten()
            # An edge no longer than tol is no longer than tol on either axis: the exact
            # lengths only of those (hypot over every edge costs more than these passes).
            short = _step_signs(pts[:, 0], pts[:, 1], tol, signs=False)[2]
            if short.size:
                short = short[np.hypot(pts[short + 1, 0] - pts[short, 0],
                                       pts[short + 1, 1] - pts[short, 1]) <= tol]
            if short.size:
                e = int(short[0])
                raise _fail_at("this segment has zero length; remove it", s, e,
                               _place(None, k, number + e + 1, path.closed))
        elif math.dist(s.start, s.end) <= tol and s.length() <= tol:   # length ≥ chord
            raise _fail("this segment has zero length; remove it", s,
                        _place(s, k, number + 1, path.closed))
        if j > 0:
            prev = segs[j - 1].end
            gap = math.hypot(s.start[0] - prev[0], s.start[1] - prev[1])
            if gap > tol:
                raise _fail_at(f"this segment starts at ({s.start[0]:g}, {s.start[1]:g}) but the "
                               f"previous one ends at ({prev[0]:g}, {prev[1]:g}); segments must join",
                               s, 0, _place(s, k, number + 1, path.closed))
        number += _edge_count(s)
    if path.closed:
        first, last = segs[0].start, segs[-1].end
        gap = math.hypot(first[0] - last[0], first[1] - last[1])
        if gap > tol:
            s = segs[-1]
            raise _fail_at(f"the loop is not closed: it ends at ({last[0]:g}, {last[1]:g}) but "
                           f"starts at ({first[0]:g}, {first[1]:g}); add a segment back to the start",
                           s, _edge_count(s) - 1, _place(s, k, number, True))


def _fail_at(message: str, seg: Segment, edge: int, place: str):
    """:func:`_fail` for edge ``edge`` of a segment (a polyline names the edge's own line)."""
    where = seg.where_at(edge) or Where()
    return ProfileError(message, file=where.file, line=where.line, place=place)


def _lowest_place(seg: Segment, tol: float) -> Tuple[int, Tuple[float, float]]:
    """The first edge of a frame segment that reaches below ``−tol`` and its lowest point.

    One edge for a line, an arc or a curve (its lowest point exact where its
    turning points are); a polyline's first edge with a vertex below.
    """
    if seg.edge_count() > 1:          # its flattened chords are its edges
        pts = seg.flatten()
        i = int(np.argmax(pts[:, 1] < -tol))
        edge = max(i - 1, 0)          # the first edge that holds vertex i
        a, b = pts[edge], pts[edge + 1]
        q = a if a[1] <= b[1] else b
        return edge, (float(q[0]), float(q[1]))
    rmin, point = _min_distance_from_axis(seg)
    return 0, point


def _chord_owner(flat_segments: Sequence[np.ndarray], chord: int) -> int:
    """Index of the segment that a path's chord number belongs to."""
    counts = np.cumsum([len(f) - 1 for f in flat_segments])
    return int(np.searchsorted(counts, chord, side="right"))


def _chord_place(segments, flat_segments: Sequence[np.ndarray], chord: int) -> Tuple[int, int, int]:
    """For a path's chord number: its segment's index, its edge in that segment, and the
    segment number in messages (a polyline's edges count one each)."""
    counts = np.cumsum([len(f) - 1 for f in flat_segments])
    j = int(np.searchsorted(counts, chord, side="right"))
    before = sum(_edge_count(s) for s in segments[:j])
    if segments[j].edge_count() > 1:
        edge = chord - (int(counts[j - 1]) if j else 0)
        return j, edge, before + edge + 1
    return j, 0, before + 1
