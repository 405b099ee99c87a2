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
    len_pq = np.hypot(*(q - p).T)
    len_rs = np.hypot(*(s - r).T)
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
    cell function) with the registrations sorted by cell; the partners of a
    registration are the later ones in its cell. The cell size starts at the
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
    order = np.argsort(key, kind="stable")
    key, edge = key[order], edge[order]
    new = np.flatnonzero(key[1:] != key[:-1]) + 1
    group_end = np.append(new, total)
    group = np.concatenate([[0], np.cumsum(key[1:] != key[:-1])]) if total else np.zeros(0, int)
    span = group_end[group] - np.arange(total) - 1

    def cell(x, y):
        return np.floor((x - ox) / h).astype(np.int64) * rows + np.floor((y - oy) / h).astype(np.int64)

    return edge, span, key, cell


def find_self_intersection(chains: Sequence[np.ndarray], closed: Sequence[bool], tol: float,
                           chunk: int = 500_000,
                           index: Optional[str] = None) -> Optional[Tuple[int, int, int, int]]:
    """First pair of non-adjacent chords that meet, as (path_a, chord_a, path_b, chord_b).

    ``chains`` holds each path's points (m + 1, 2). Two chords are candidates
    when their boxes overlap: ``[x_min − tol, x_max + tol]`` on x and
    ``[y_min, y_max + tol]`` on y. The candidates come from whichever of three
    indexes gives the fewest pairs to test, each counted exactly beforehand in
    O(n log n): a sweep over x, a sweep over y, or a uniform grid whose cells
    hold the chords whose boxes cover them (a pair is tested only in the cell
    that holds the low corner of the overlap of their boxes, so once). On real
    outlines the grid's pairs are O(n); no index helps when the boxes of many
    chords truly overlap (a noisy outline whose zigzags are far longer than
    the spacing of its points: the pairs grow as (total length)² / area).
    The exact orientation test then runs vectorised over the candidates, in
    chunks of ``chunk`` pairs (their temporaries stay near 100 MB). ``index``
    ("x", "y" or "grid") forces one index (for tests); the answer is the same
    whichever is used.

    >>> bow = [np.array([[0, 0], [2, 2], [2, 0], [0, 2], [0, 0]], dtype=float)]
    >>> find_self_intersection(bow, [True], 1e-9)
    (0, 0, 0, 2)
    >>> square = [np.array([[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]], dtype=float)]
    >>> find_self_intersection(square, [True], 1e-9) is None
    True
    """
    starts, ends, path_of, index_of, count_of = [], [], [], [], []
    for k, pts in enumerate(chains):
        m = len(pts) - 1
        if m < 1:
            continue
        starts.append(pts[:-1])
        ends.append(pts[1:])
        path_of.append(np.full(m, k))
        index_of.append(np.arange(m))
        count_of.append(np.full(m, m))
    if not starts:
        return None
    a = np.vstack(starts)
    b = np.vstack(ends)
    path = np.concatenate(path_of)
    idx = np.concatenate(index_of)
    cnt = np.concatenate(count_of)
    is_closed = np.asarray(closed, dtype=bool)[path]
    x0 = np.minimum(a[:, 0], b[:, 0]) - tol
    x1 = np.maximum(a[:, 0], b[:, 0]) + tol
    y0 = np.minimum(a[:, 1], b[:, 1])
    y1 = np.maximum(a[:, 1], b[:, 1]) + tol
    n = len(a)
    choices = {}
    for name, lo, hi in (("x", x0, x1), ("y", y0, y1)):
        if name == "y" and index is None and choices and choices["x"][0] <= 3 * n:
            break       # the x sweep is already down to three pairs per chord: take it
        if index in (None, name):
            order, span = _sweep_order(lo, hi)
            choices[name] = (int(span.sum()), order, span, None, None)
    # The grid costs a sort of its registrations: build it only when a sweep is not already
    # down to a few pairs per chord (or when asked for).
    few = bool(choices) and min(c[0] for c in choices.values()) <= 4 * n
    grid = _grid_order(x0, x1, y0, y1, 4 * n + 1024) \
        if index == "grid" or (index is None and not few) else None
    if grid is not None:
        edge, span, key, cell = grid
        choices["grid"] = (int(span.sum()), edge, span, key, cell)
    if not choices:
        order, span = _sweep_order(x0, x1)
        choices["x"] = (int(span.sum()), order, span, None, None)
    total, ids, span, key, cell = min(choices.values(), key=lambda c: c[0])
    # The boxes in the index's order, so that a position's partners are read nearby.
    bx0, bx1, by0, by1 = x0[ids], x1[ids], y0[ids], y1[ids]
    cum = np.cumsum(span)
    best = None
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
        near = (bx0[p] <= bx1[q]) & (bx0[q] <= bx1[p]) & (by0[p] <= by1[q]) & (by0[q] <= by1[p])
        p, q = p[near], q[near]
        i, j = ids[p], ids[q]
        same = path[i] == path[j]
        diff = np.abs(idx[i] - idx[j])
        adjacent = same & ((diff == 1) | (is_closed[i] & (diff == cnt[i] - 1)))
        keep = (~adjacent) & (i != j)
        if cell is not None:
            keep &= cell(np.maximum(x0[i], x0[j]), np.maximum(y0[i], y0[j])) == key[p]
        i, j = i[keep], j[keep]
        if i.size:
            hit = _segments_cross(a[i], b[i], a[j], b[j], tol)
            if hit.any():
                cand = [(int(path[x]), int(idx[x]), int(path[y]), int(idx[y]))
                        for x, y in zip(i[hit], j[hit])]
                cand = [c if (c[0], c[1]) <= (c[2], c[3]) else (c[2], c[3], c[0], c[1]) for c in cand]
                m = min(cand)
                best = m if best is None else min(best, m)
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
    allpts = np.concatenate(pieces) if pieces else np.zeros((0, 2))
    if allpts.size == 0:
        raise ProfileError("the profile has no segments")
    if not np.all(np.isfinite(allpts)):
        raise ProfileError("the profile has a coordinate that is not a finite number")
    check_coordinate_range(allpts)
    lo, hi = allpts.min(axis=0), allpts.max(axis=0)
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
    z_all, r_all = axis.to_frame(allpts[:, 0], allpts[:, 1])
    far = int(np.argmax(np.abs(r_all)))
    if abs(r_all[far]) <= tol:
        raise ProfileError("the whole profile lies on the axis; it would sweep nothing")
    side = 1.0 if r_all[far] > 0 else -1.0
    del z_all, r_all
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
    hit = find_self_intersection(chords, closed, tol)
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


def _check_path(path, k: int, tol: float) -> None:
    """Zero-length segments (a polyline's edges at once), joins and closure of path ``k``."""
    segs = path.segments
    if not segs:
        raise ProfileError(f"{'loop' if path.closed else 'chain'} {k} has no segments")
    number = 0
    for j, s in enumerate(segs):
        if s.edge_count() > 1:
            short = np.flatnonzero(s.edge_lengths() <= tol)
            if short.size:
                e = int(short[0])
                raise _fail_at("this segment has zero length; remove it", s, e,
                               _place(None, k, number + e + 1, path.closed))
        elif s.length() <= tol:
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
