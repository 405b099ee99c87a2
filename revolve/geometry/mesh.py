"""A triangle mesh of a revolved profile, for viewing, printing and STL files.

The mesh is built from one number, the *chord tolerance* δ: the largest
distance allowed between the true surface and the flat triangles that stand
in for it, in the profile's length unit.

The budget is split in two halves. A point of a triangle lies within the
sweep's sagitta of the surface swept by the profile *chord* it was built on
(its distance from the axis falls short by at most ``r (1 - cos(Δφ/2))``
while its axial position stays on the chord), and every point of that swept
chord lies within the chord's sagitta of the true surface (turn the nearest
profile point by the same angle). The two distances add, so each is given
δ/2; for arcs an equal split is also the one that needs the fewest
triangles (their number goes as 1/√(s₁ s₂) with s₁ + s₂ = δ).

* Each segment of the profile (placed in the axis frame) is flattened into
  chords within δ/2 by its own kind (``flatten_to_tolerance``, part of the
  segment contract): a line is its own chord; an arc of radius ``R`` is cut
  into equal pieces whose sagitta ``R (1 - cos(Δ/2))`` is at most δ/2
  (exact); a curve is subdivided adaptively until the distance of probe
  points from each chord is within δ/2; a polyline's edges are its chords.
* The flattened profile is revolved in equal angular steps chosen with the
  same sagitta formula, within δ/2, on the largest distance from the axis.
* No mesh of more than :data:`MOST_TRIANGLES` triangles is built: a
  tolerance that would need more is refused before the work starts.
* Points on the axis become a single vertex (never a ring of copies), so no
  zero-area triangle is left in.
* Solid loops are oriented so that every triangle's normal points out of the
  solid; a full revolution of closed loops is a closed (watertight) surface.
  A partial revolution is capped with the two cut faces: the section polygon,
  holes bridged, triangulated by ear clipping. Open chains give open surfaces.

Vertices are in sketch coordinates: ``x`` and ``y`` as in the profile and
``z`` out of the sketch plane; the profile itself lies at angle 0 (``z = 0``)
and the sweep turns right-handed about the axis direction.

Examples
--------
A ring of square section 2 × 2, its inside 1 from the axis (volume 16π):

>>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
>>> ring = Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)])
>>> m = revolve_mesh(Revolution(Profile(loops=(ring,)), Axis.x()), tolerance=1e-3)
>>> m.closed, m.open_edge_count()
(True, 0)
>>> abs(m.volume() / (16 * math.pi) - 1) < 2e-3
True
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import List, Optional, Sequence, Tuple

import numpy as np

from revolve.errors import RevolveError
from revolve.geometry.checks import prepare
from revolve.geometry.profile import UNNAMED_FACE, Revolution
from revolve.geometry.segments import Segment

#: The largest angle one chord may span, on an arc or in the sweep (radians).
LARGEST_STEP = math.pi / 2

#: The mesh is refused beyond this many triangles (ask for a larger tolerance).
MOST_TRIANGLES = 20_000_000

#: :func:`chord_steps` never answers more than this (a count no mesh could use).
MOST_STEPS = 2 ** 53

#: Faces names given to the two flat ends of a partial revolution.
CUT_FACE_START = "cut face (start)"
CUT_FACE_END = "cut face (end)"


@dataclass(frozen=True, eq=False)
class TriangleMesh:
    """Triangles of a revolved profile.

    Attributes
    ----------
    vertices : ndarray, shape (n, 3)
        Sketch ``x``, ``y`` and the out-of-plane ``z``, in the profile's unit.
    triangles : ndarray of int, shape (m, 3)
        Vertex numbers; counter-clockwise seen from outside the solid.
    face_of : ndarray of int, shape (m,)
        Each triangle's face, an index into ``face_names``.
    face_names : tuple of str
        Faces of the profile in order of first appearance, then the cut faces.
    closed : bool
        True when the mesh should be watertight (closed loops only, full
        revolution or capped).
    tolerance : float
        The chord tolerance it was built with.
    angular_steps : int
        Number of equal steps of the sweep.
    """

    vertices: np.ndarray
    triangles: np.ndarray
    face_of: np.ndarray
    face_names: Tuple[str, ...]
    closed: bool
    tolerance: float
    angular_steps: int

    def corners(self) -> np.ndarray:
        """The three corners of every triangle, shape (m, 3, 3)."""
        return self.vertices[self.triangles]

    def normals(self) -> np.ndarray:
        """Unit normal of every triangle (pointing out of the solid), shape (m, 3).

        >>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
        >>> sq = Loop.from_points([(0, 1), (1, 1), (1, 2), (0, 2)])
        >>> m = revolve_mesh(Revolution(Profile(loops=(sq,)), Axis.x()), tolerance=0.1)
        >>> bool(np.allclose(np.linalg.norm(m.normals(), axis=1), 1.0))
        True
        """
        c = self.corners()
        n = np.cross(c[:, 1] - c[:, 0], c[:, 2] - c[:, 0])
        length = np.linalg.norm(n, axis=1)
        return n / np.where(length > 0, length, 1.0)[:, None]

    def triangle_areas(self) -> np.ndarray:
        """Area of every triangle."""
        c = self.corners()
        return 0.5 * np.linalg.norm(np.cross(c[:, 1] - c[:, 0], c[:, 2] - c[:, 0]), axis=1)

    def area(self) -> float:
        """Total area of the triangles."""
        return float(self.triangle_areas().sum())

    def volume(self) -> float:
        """Enclosed volume by the divergence theorem (meaningful when ``closed``).

        >>> empty = TriangleMesh(np.zeros((0, 3)), np.zeros((0, 3), int), np.zeros(0, int),
        ...                      (), True, 1.0, 0)
        >>> empty.volume(), empty.area()
        (0.0, 0.0)
        """
        c = self.corners()
        return float(np.einsum("ij,ij->i", c[:, 0], np.cross(c[:, 1], c[:, 2])).sum() / 6.0)

    def open_edge_count(self) -> int:
        """Number of edges used by exactly one triangle (0 for a watertight mesh).

        >>> one = TriangleMesh(np.eye(3), np.array([[0, 1, 2]]), np.zeros(1, int), ("f",), False, 1.0, 1)
        >>> one.open_edge_count(), one.is_consistently_oriented(), one.area() == math.sqrt(3) / 2
        (3, True, True)
        """
        return int(np.count_nonzero(_edge_use(self.triangles) == 1))

    def is_consistently_oriented(self) -> bool:
        """True when no directed edge is used twice (neighbours agree on their orientation)."""
        t = self.triangles
        directed = np.concatenate([t[:, [0, 1]], t[:, [1, 2]], t[:, [2, 0]]])
        if directed.size == 0:
            return True
        _, counts = np.unique(directed, axis=0, return_counts=True)
        return bool(counts.max() == 1)


def _edge_use(triangles: np.ndarray) -> np.ndarray:
    """How many triangles use each undirected edge."""
    t = triangles
    edges = np.concatenate([t[:, [0, 1]], t[:, [1, 2]], t[:, [2, 0]]])
    if edges.size == 0:
        return np.zeros(0, dtype=int)
    edges.sort(axis=1)
    _, counts = np.unique(edges, axis=0, return_counts=True)
    return counts


# -- chord tolerance ------------------------------------------------------------------

def chord_steps(radius: float, sweep: float, tolerance: float) -> int:
    """Fewest equal pieces of an arc of ``radius`` and ``sweep`` whose sagitta is within ``tolerance``.

    The sagitta of a chord spanning angle Δ is ``R (1 - cos(Δ/2)) = 2 R sin²(Δ/4)``;
    the second form stays exact for tolerances far below the radius. No piece
    spans more than :data:`LARGEST_STEP`, and the answer is at most
    :data:`MOST_STEPS` (the caller refuses a mesh that large).

    >>> chord_steps(10.0, math.pi, 10.0)   # tolerance as large as the radius: quarter turns
    2
    >>> n = chord_steps(10.0, 2 * math.pi, 0.01)
    >>> 10.0 * (1 - math.cos(math.pi / n)) <= 0.01 < 10.0 * (1 - math.cos(math.pi / (n - 1)))
    True
    >>> chord_steps(0.0, math.pi, 0.1)     # on the axis: nothing to follow
    2
    >>> chord_steps(1.0, math.pi, 1e-300) == MOST_STEPS   # far too fine: the cap, no error
    True
    """
    sweep = abs(float(sweep))
    if sweep == 0:
        return 1
    largest = LARGEST_STEP
    if radius > 0 and tolerance < radius:
        largest = min(largest, 4.0 * math.asin(math.sqrt(0.5 * tolerance / radius)))
    if not largest > 0:
        return MOST_STEPS
    pieces = sweep / largest * (1 - 1e-12)
    if not pieces < MOST_STEPS:
        return MOST_STEPS
    return max(int(math.ceil(pieces)), 1)


# -- flattening -----------------------------------------------------------------------

def flatten_segment(segment: Segment, tolerance: float, *, most_pieces: int = 1_000_000) -> np.ndarray:
    """Points along a segment whose chords stay within ``tolerance`` of it, shape (m + 1, 2).

    Start and end are the segment's own end points. Each kind flattens itself
    (``flatten_to_tolerance``): a line is its own chord, an arc is cut by the
    sagitta exactly (:func:`chord_steps`), a curve is subdivided adaptively,
    a polyline gives its own vertices.

    >>> from revolve.geometry.segments import Line, Polyline, arc_from_centre
    >>> flatten_segment(Line((0.0, 1.0), (2.0, 1.0)), 0.1).tolist()
    [[0.0, 1.0], [2.0, 1.0]]
    >>> quarter = arc_from_centre((1.0, 0.0), (0.0, 1.0), (0.0, 0.0), clockwise=False)
    >>> len(flatten_segment(quarter, 1 - math.cos(math.pi / 8)))   # sagitta of 45°: 2 pieces
    3
    >>> flatten_segment(Polyline(np.array([[0.0, 1.0], [1.0, 2.0], [2.0, 1.0]])), 0.1).shape
    (3, 2)
    """
    return segment.flatten_to_tolerance(tolerance, most_pieces)


@dataclass(frozen=True, eq=False)
class FlatPath:
    """A path of the profile as points in the axis frame (``z``, ``r``).

    ``faces[i]`` is the face number of the chord from point ``i`` to point
    ``i + 1`` (to point 0 after the last, for a loop).
    """

    points: np.ndarray
    faces: np.ndarray
    closed: bool
    depth: int = 0


def flatten_path(segments: Sequence[Segment], closed: bool, tolerance: float,
                 face_number, on_axis: float = 0.0, *,
                 most_pieces: int = 1_000_000) -> FlatPath:
    """Flatten a path's frame segments into one point list (no repeated joint points).

    ``face_number(segment)`` gives each chord's face number. Points with
    ``r <= on_axis`` are put exactly on the axis. No segment is cut into more
    than ``most_pieces`` chords (a :class:`RevolveError` says so).

    >>> from revolve.geometry.segments import Line
    >>> segs = (Line((0.0, 0.0), (2.0, 0.0)), Line((2.0, 0.0), (2.0, 1.0)), Line((2.0, 1.0), (0.0, 0.0)))
    >>> fp = flatten_path(segs, True, 0.1, lambda s: 0)
    >>> fp.points.tolist(), fp.faces.tolist()
    ([[0.0, 0.0], [2.0, 0.0], [2.0, 1.0]], [0, 0, 0])
    >>> flatten_path(segs[:2], False, 0.1, lambda s: 0).points.tolist()
    [[0.0, 0.0], [2.0, 0.0], [2.0, 1.0]]
    """
    pieces, faces = [], []
    for k, seg in enumerate(segments):
        p = flatten_segment(seg, tolerance, most_pieces=most_pieces)
        pieces.append(p[:-1])
        faces.append(np.full(len(p) - 1, face_number(seg), dtype=int))
    if not closed:
        pieces.append(np.asarray(segments[-1].end, dtype=float)[None, :])
    points = np.vstack(pieces)
    points[points[:, 1] <= on_axis, 1] = 0.0
    return FlatPath(points, np.concatenate(faces), closed)


def signed_area(points: np.ndarray) -> float:
    """Shoelace area of a closed polygon (positive counter-clockwise).

    >>> signed_area(np.array([[0.0, 0.0], [1.0, 0.0], [1.0, 1.0]]))
    0.5
    >>> signed_area(np.zeros((0, 2)))
    0.0
    """
    if len(points) < 3:
        return 0.0
    x, y = points[:, 0], points[:, 1]
    return float(0.5 * (np.dot(x, np.roll(y, -1)) - np.dot(np.roll(x, -1), y)))


def _oriented(path: FlatPath, counter_clockwise: bool) -> FlatPath:
    if (signed_area(path.points) > 0) == counter_clockwise:
        return path
    # Reverse, keeping point 0 first: point k becomes point (m - k) mod m and
    # the chord k of the reversed loop is the old chord m - 1 - k.
    pts = np.roll(path.points[::-1], 1, axis=0)
    return FlatPath(pts, path.faces[::-1].copy(), path.closed, path.depth)


# -- triangulation of the section -------------------------------------------------------

def _orient(a: np.ndarray, b: np.ndarray, c: np.ndarray) -> np.ndarray:
    """Twice the signed area of triangles a, b, c (arrays of points, broadcast)."""
    return (b[..., 0] - a[..., 0]) * (c[..., 1] - a[..., 1]) - \
        (b[..., 1] - a[..., 1]) * (c[..., 0] - a[..., 0])


def _blocked(p: np.ndarray, q: np.ndarray, e0: np.ndarray, e1: np.ndarray, eps: float,
             ignore: Optional[np.ndarray] = None) -> np.ndarray:
    """Does segment p-q (k, 2) meet any of the edges e0-e1 (n, 2)? Touching counts. Shape (k,).

    ``ignore`` (k, n) leaves out, for each segment, the edges it may share an end with.

    >>> e0, e1 = np.array([[0.0, -1.0]]), np.array([[0.0, 1.0]])
    >>> _blocked(np.array([[-1.0, 0.0], [1.0, 0.0]]), np.array([[1.0, 0.0], [2.0, 0.0]]), e0, e1, 1e-12).tolist()
    [True, False]
    """
    P, Q = p[:, None, :], q[:, None, :]
    A, B = e0[None, :, :], e1[None, :, :]
    d1, d2 = _orient(A, B, P), _orient(A, B, Q)
    d3, d4 = _orient(P, Q, A), _orient(P, Q, B)
    proper = (((d1 > eps) & (d2 < -eps)) | ((d1 < -eps) & (d2 > eps))) & \
        (((d3 > eps) & (d4 < -eps)) | ((d3 < -eps) & (d4 > eps)))

    def within(a, b, c):  # c inside the bounding box of a-b
        return (np.minimum(a[..., 0], b[..., 0]) <= c[..., 0]) & \
            (c[..., 0] <= np.maximum(a[..., 0], b[..., 0])) & \
            (np.minimum(a[..., 1], b[..., 1]) <= c[..., 1]) & \
            (c[..., 1] <= np.maximum(a[..., 1], b[..., 1]))

    touch = ((np.abs(d1) <= eps) & within(A, B, P)) | ((np.abs(d2) <= eps) & within(A, B, Q)) | \
        ((np.abs(d3) <= eps) & within(P, Q, A)) | ((np.abs(d4) <= eps) & within(P, Q, B))
    hit = proper | touch
    if ignore is not None:
        hit &= ~ignore
    return hit.any(axis=1)


def _copy_facing(xy: np.ndarray, poly: np.ndarray, position: int, target: np.ndarray) -> int:
    """Of the places where the vertex at ``position`` occurs in ``poly``, the one whose corner
    opens towards ``target`` (an earlier cut may have made the vertex occur twice).

    A cut joined at the wrong copy would cross that copy's other edges.
    """
    vid = poly[position]
    places = np.nonzero(poly == vid)[0]
    if len(places) == 1:
        return position
    p = xy[vid]
    d = target - p
    for k in places:
        w = xy[poly[(k + 1) % len(poly)]] - p   # towards the next vertex
        u = xy[poly[k - 1]] - p                  # towards the previous vertex
        # The inside (anticlockwise polygon) runs anticlockwise from w round to u.
        ang_u = math.atan2(w[0] * u[1] - w[1] * u[0], w @ u) % (2 * math.pi)
        ang_d = math.atan2(w[0] * d[1] - w[1] * d[0], w @ d) % (2 * math.pi)
        if 0 < ang_d < ang_u:
            return int(k)
    return position


def _bridge(xy: np.ndarray, outer: np.ndarray, holes: Sequence[np.ndarray], eps: float) -> np.ndarray:
    """Join the holes to the outer polygon by two-way cuts: one weakly simple polygon of vertex ids.

    Each hole is joined from its rightmost point to the nearest point of the
    polygon so far that it can see (the cut meets no edge of the polygon or
    of any hole).
    """
    poly = outer.copy()
    remaining = sorted(holes, key=lambda h: -float(xy[h, 0].max()))
    while remaining:
        hole = remaining.pop(0)
        hole = np.roll(hole, -int(np.argmax(xy[hole, 0])))
        m = int(hole[0])
        loops = [poly, hole] + remaining
        e0 = np.concatenate(loops)
        e1 = np.concatenate([np.roll(lp, -1) for lp in loops])
        order = np.argsort(np.hypot(*(xy[poly] - xy[m]).T), kind="stable")
        chosen = None
        batch = max(1, min(256, 4_000_000 // max(1, len(e0))))
        for start in range(0, len(order), batch):
            cand = order[start:start + batch]
            pid = poly[cand]
            ignore = (e0[None, :] == m) | (e1[None, :] == m) | \
                (e0[None, :] == pid[:, None]) | (e1[None, :] == pid[:, None])
            seen = ~_blocked(np.repeat(xy[[m]], len(cand), axis=0), xy[pid], xy[e0], xy[e1], eps,
                             ignore)
            if seen.any():
                chosen = int(cand[int(np.argmax(seen))])
                break
        if chosen is None:
            raise RevolveError("a hole of the section cannot be joined to its outside for the "
                               "cut faces; try a smaller chord tolerance")
        chosen = _copy_facing(xy, poly, chosen, xy[m])
        poly = np.concatenate([poly[:chosen + 1], hole, [m], poly[chosen:]])
    return poly


@dataclass(eq=False)
class _Corners:
    """Working state of ear clipping: the polygon's corners, what blocks, what is an ear.

    Corners are numbered by their place in the original polygon (``entry``)
    so that one sort of all of them by ``x`` serves every search.
    """

    xy: np.ndarray
    ids: np.ndarray          # vertex id of each original corner
    entry: np.ndarray        # original corner number at each current place
    cross: np.ndarray        # twice the signed area at each current place
    blocking: np.ndarray     # per original corner: reflex, flat or a cut's end, and still there
    sorted_x: np.ndarray
    sorted_entries: np.ndarray
    eps: float

    def corner_areas(self, places: np.ndarray) -> np.ndarray:
        n = len(self.entry)
        v = self.ids[self.entry]
        return _orient(self.xy[v[(places - 1) % n]], self.xy[v[places]], self.xy[v[(places + 1) % n]])

    def ears(self, places: np.ndarray, most_pairs: int = 2_000_000) -> np.ndarray:
        """Which corners at ``places`` are ears: convex, with no blocking corner in their triangle.

        Only a reflex or flat corner, or a copy of a cut's end, can lie in a
        convex corner's triangle; candidates come from the sort on ``x``.
        """
        n = len(self.entry)
        result = np.zeros(len(places), dtype=bool)
        convex = self.cross[places] > self.eps
        cand = places[convex]
        if cand.size == 0:
            return result
        v = self.ids[self.entry]
        own_ids = np.stack([v[(cand - 1) % n], v[cand], v[(cand + 1) % n]], axis=1)
        tri = self.xy[own_ids]
        lo = np.searchsorted(self.sorted_x, tri[:, :, 0].min(axis=1), side="left")
        hi = np.searchsorted(self.sorted_x, tri[:, :, 0].max(axis=1), side="right")
        counts = hi - lo
        ear = np.ones(len(cand), dtype=bool)
        start = 0
        while start < len(cand):
            cum = np.cumsum(counts[start:])
            stop = start + max(1, int(np.searchsorted(cum, most_pairs, side="right")))
            k = np.arange(start, stop)
            cnt = counts[k]
            total = int(cnt.sum())
            if total:
                owner = np.repeat(k, cnt)
                offset = np.arange(total) - np.repeat(np.cumsum(cnt) - cnt, cnt)
                e = self.sorted_entries[np.repeat(lo[k], cnt) + offset]
                live = self.blocking[e]
                owner, e = owner[live], e[live]
                pid = self.ids[e]
                p = self.xy[pid]
                pa, pb, pc = tri[owner, 0], tri[owner, 1], tri[owner, 2]
                inside = (_orient(pa, pb, p) >= -self.eps) & (_orient(pb, pc, p) >= -self.eps) & \
                    (_orient(pc, pa, p) >= -self.eps)
                own = (pid == own_ids[owner, 0]) | (pid == own_ids[owner, 1]) | (pid == own_ids[owner, 2])
                blocked = np.bincount(owner[inside & ~own] - start, minlength=len(k))[:len(k)]
                ear[k] = blocked == 0
            start = stop
        result[np.nonzero(convex)[0]] = ear
        return result


def _ear_clip(xy: np.ndarray, poly: np.ndarray, scale: float) -> np.ndarray:
    """Ear clipping of a (weakly simple, counter-clockwise) polygon given by vertex ids.

    Each round clips a set of ears no two of which are neighbours (so their
    triangles never overlap), then re-examines only the corners next to them:
    clipping only ever turns a reflex corner convex and removes corners, so a
    known ear stays an ear. When no known ear is left, every corner is
    examined again.
    """
    eps = 1e-14 * scale * scale
    if len(poly) < 3:
        return np.zeros((0, 3), dtype=int)
    uniq, counts = np.unique(poly, return_counts=True)
    repeated = np.zeros(int(poly.max()) + 1, dtype=bool)
    repeated[uniq[counts > 1]] = True
    order = np.argsort(xy[poly, 0], kind="stable")
    state = _Corners(xy=xy, ids=poly.copy(), entry=np.arange(len(poly)), cross=np.zeros(len(poly)),
                     blocking=np.zeros(len(poly), dtype=bool), sorted_x=xy[poly[order], 0],
                     sorted_entries=order, eps=eps)
    everywhere = np.arange(len(poly))
    state.cross = state.corner_areas(everywhere)
    state.blocking = (state.cross <= eps) | repeated[poly]
    ear = state.ears(everywhere)
    out: List[np.ndarray] = []
    while len(state.entry) > 3:
        n = len(state.entry)
        if not ear.any():
            ear = state.ears(np.arange(n))
        if not ear.any():
            convex = state.cross > eps
            if not convex.any():
                break  # nothing with an area is left
            # Numerical trouble: clip the most convex corner to keep going.
            ear[int(np.argmax(np.where(convex, state.cross, -np.inf)))] = True
        pos = np.arange(n)
        take = ear & (pos % 2 == 0)
        if n % 2 == 1 and take[0]:
            take[n - 1] = False
        if not take.any():
            take = ear & (pos % 2 == 1)
        sel = np.nonzero(take)[0]
        v = state.ids[state.entry]
        out.append(np.column_stack([v[(sel - 1) % n], v[sel], v[(sel + 1) % n]]))
        state.blocking[state.entry[sel]] = False
        keep = ~take
        new_place = np.cumsum(keep) - 1
        touched = np.unique(np.concatenate([(sel - 1) % n, (sel + 1) % n]))
        state.entry, state.cross, ear = state.entry[keep], state.cross[keep], ear[keep]
        dirty = new_place[touched]
        state.cross[dirty] = state.corner_areas(dirty)
        e = state.entry[dirty]
        state.blocking[e] = (state.cross[dirty] <= eps) | repeated[state.ids[e]]
        ear[dirty] = state.ears(dirty) if len(state.entry) > 3 else False
    v = state.ids[state.entry]
    if len(v) == 3 and _orient(xy[v[0]], xy[v[1]], xy[v[2]]) > eps:
        out.append(v[None, :])
    return np.vstack(out) if out else np.zeros((0, 3), dtype=int)


def triangulate_section(outer: np.ndarray, holes: Sequence[np.ndarray] = ()) -> np.ndarray:
    """Triangles covering a polygon with holes, as rows of point numbers.

    Points are numbered through ``outer`` then each hole in turn. The outer
    polygon may run either way; triangles come out counter-clockwise. Holes
    are joined to the outside by two-way cuts and the result is cut into
    triangles by ear clipping; no triangle has zero area.

    >>> square = np.array([[0, 0], [4, 0], [4, 4], [0, 4]], dtype=float)
    >>> tri = triangulate_section(square)
    >>> len(tri), float(sum(abs(signed_area(square[t])) for t in tri))
    (2, 16.0)
    >>> hole = np.array([[1, 1], [1, 3], [3, 3], [3, 1]], dtype=float)
    >>> pts = np.vstack([square, hole])
    >>> tri = triangulate_section(square, [hole])
    >>> len(tri), float(sum(signed_area(pts[t]) for t in tri))
    (8, 12.0)
    """
    outer = np.asarray(outer, dtype=float)
    loops = [outer] + [np.asarray(h, dtype=float) for h in holes]
    xy = np.vstack(loops)
    scale = float(np.ptp(xy, axis=0).max()) if len(xy) else 1.0
    scale = scale or 1.0
    numbers, first = [], 0
    for k, lp in enumerate(loops):
        ids = np.arange(first, first + len(lp))
        first += len(lp)
        want_ccw = k == 0
        if (signed_area(lp) > 0) != want_ccw:
            ids = ids[::-1]
        numbers.append(ids)
    poly = _bridge(xy, numbers[0], numbers[1:], 1e-14 * scale * scale) if len(numbers) > 1 else numbers[0]
    return _ear_clip(xy, poly, scale)


# -- the revolved mesh ----------------------------------------------------------------------

def _frame_basis(revolution: Revolution, side: float) -> np.ndarray:
    """Columns: axis direction u, in-plane direction n towards the profile, w = u × n."""
    ux, uy = revolution.axis.unit_direction()
    u = np.array([ux, uy, 0.0])
    n = side * np.array([-uy, ux, 0.0])
    return np.column_stack([u, n, np.cross(u, n)])


def _contains(poly: np.ndarray, p: np.ndarray) -> bool:
    """Even-odd point-in-polygon test."""
    x0, y0 = poly[:, 0], poly[:, 1]
    x1, y1 = np.roll(x0, -1), np.roll(y0, -1)
    crosses = (y0 > p[1]) != (y1 > p[1])
    with np.errstate(divide="ignore", invalid="ignore"):
        xi = x0 + (p[1] - y0) * (x1 - x0) / (y1 - y0)
    return bool(np.count_nonzero(crosses & (p[0] < xi)) % 2)


def _regions(loops: Sequence[FlatPath]) -> List[Tuple[int, List[int]]]:
    """Each solid loop (even depth) with the holes directly inside it."""
    out = []
    for k, lp in enumerate(loops):
        if lp.depth % 2:
            continue
        holes = [h for h, hp in enumerate(loops)
                 if hp.depth == lp.depth + 1 and _contains(lp.points, hp.points[0])]
        out.append((k, holes))
    return out


def revolve_mesh(revolution: Revolution, tolerance: float) -> TriangleMesh:
    """Triangle mesh of a revolution with chord tolerance ``tolerance`` (profile units).

    Raises
    ------
    ProfileError
        When the profile fails the engine's checks (see :func:`revolve.geometry.checks.prepare`).
    RevolveError
        When the tolerance is not a positive number, or so small that the mesh
        would exceed :data:`MOST_TRIANGLES` (refused before the work starts).

    Notes
    -----
    Half the tolerance goes to the profile's chords and half to the angular
    steps (see the module notes): every point of every triangle is within
    ``tolerance`` of the true surface.

    Examples
    --------
    A solid cylinder (radius 1, length 2) touching the axis along its length:
    the axis points collapse, the mesh is closed and has no zero-area triangle.

    >>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    >>> bar = Loop.from_points([(0, 0), (2, 0), (2, 1), (0, 1)])
    >>> m = revolve_mesh(Revolution(Profile(loops=(bar,)), Axis.x()), tolerance=0.01)
    >>> m.open_edge_count(), bool(m.triangle_areas().min() > 0), m.is_consistently_oriented()
    (0, True, True)
    >>> m.volume() > 0
    True

    A quarter of it is capped by its two cut faces:

    >>> q = revolve_mesh(Revolution(Profile(loops=(bar,)), Axis.x(), 90.0), tolerance=0.01)
    >>> q.open_edge_count(), sorted(q.face_names)[:2]
    (0, ['cut face (end)', 'cut face (start)'])
    >>> revolve_mesh(Revolution(Profile(loops=(bar,)), Axis.x()), tolerance=0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: the chord tolerance must be a positive number, got 0
    >>> revolve_mesh(Revolution(Profile(loops=(bar,)), Axis.x()), tolerance=1e-300)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: the chord tolerance 1e-300 would give more than 20,000,000 triangles; use a larger tolerance
    """
    try:
        tol = float(tolerance)
    except (TypeError, ValueError, OverflowError):
        raise RevolveError(f"the chord tolerance must be a positive number, got {tolerance!r}")
    if not (math.isfinite(tol) and tol > 0):
        raise RevolveError(f"the chord tolerance must be a positive number, got {tol:g}")
    prep = prepare(revolution.profile, revolution.axis)
    half = 0.5 * tol    # the profile's chords and the angular steps each take half

    def too_many() -> RevolveError:
        return RevolveError(f"the chord tolerance {tol:g} would give more than "
                            f"{MOST_TRIANGLES:,} triangles; use a larger tolerance")

    # Count before any work: every chord is swept in at least this many steps.
    theta = revolution.angle_radians
    full = revolution.full
    r_ends = max(max(s.start[1], s.end[1]) for segs in prep.paths for s in segs)
    least_steps = max(chord_steps(r_ends, theta, half), 4 if full else 1)
    least_chords = sum(s.fewest_chords(half) for segs in prep.paths for s in segs)
    if 2 * least_chords * least_steps > MOST_TRIANGLES:
        raise too_many()
    most_pieces = max(1, MOST_TRIANGLES // (2 * least_steps))
    names: List[str] = []

    def face_number(seg) -> int:
        name = seg.face or UNNAMED_FACE
        if name not in names:
            names.append(name)
        return names.index(name)

    loops: List[FlatPath] = []
    chains: List[FlatPath] = []
    depth_of = iter(prep.depths)
    for segs, closed in zip(prep.paths, prep.closed):
        try:
            fp = flatten_path(segs, closed, half, face_number, on_axis=prep.tolerance,
                              most_pieces=most_pieces)
        except RevolveError:
            raise too_many() from None
        if closed:
            d = next(depth_of)
            fp = _oriented(FlatPath(fp.points, fp.faces, True, d), counter_clockwise=d % 2 == 0)
            loops.append(fp)
        else:
            # A chain that starts and ends on the axis (a vessel's inside wall) sweeps a
            # closed surface: orient it like the loop it makes with the axis, normals out.
            if (fp.points[0, 1] <= prep.tolerance and fp.points[-1, 1] <= prep.tolerance
                    and signed_area(fp.points) < 0):
                fp = FlatPath(fp.points[::-1].copy(), fp.faces[::-1].copy(), False, fp.depth)
            chains.append(fp)
    paths = loops + chains
    r_max = max(float(p.points[:, 1].max()) for p in paths)
    steps = chord_steps(r_max, theta, half)
    if full:
        steps = max(steps, 4)
    ncols = steps if full else steps + 1
    n_chords = sum(len(p.faces) for p in paths)
    if 2 * n_chords * steps > MOST_TRIANGLES:
        raise too_many()
    phi = theta * np.arange(ncols) / steps
    cos, sin = np.cos(phi), np.sin(phi)

    frame_vertices: List[np.ndarray] = []
    tris: List[np.ndarray] = []
    tri_faces: List[np.ndarray] = []
    first_column: List[np.ndarray] = []
    last_column: List[np.ndarray] = []
    base = 0
    for p in paths:
        z, r = p.points[:, 0], p.points[:, 1]
        m = len(z)
        on = r == 0.0
        off_rank = np.cumsum(~on) - 1
        on_rank = np.cumsum(on) - 1
        n_off = int(np.count_nonzero(~on))
        vid = np.empty((m, ncols), dtype=np.int64)
        vid[~on] = base + off_rank[~on, None] * ncols + np.arange(ncols)[None, :]
        vid[on] = (base + n_off * ncols + on_rank[on])[:, None]
        ring = np.stack([np.repeat(z[~on], ncols), np.outer(r[~on], cos).ravel(),
                         np.outer(r[~on], sin).ravel()], axis=1)
        axis_pts = np.column_stack([z[on], np.zeros(int(on.sum())), np.zeros(int(on.sum()))])
        frame_vertices += [ring, axis_pts]
        base += n_off * ncols + int(on.sum())
        i = np.arange(len(p.faces))
        i2 = (i + 1) % m
        j = np.arange(steps)
        j2 = (j + 1) % ncols
        a, b = vid[i][:, j], vid[i2][:, j]
        c, d = vid[i2][:, j2], vid[i][:, j2]
        face = np.repeat(p.faces, steps)
        t1 = np.stack([a.ravel(), b.ravel(), c.ravel()], axis=1)
        t2 = np.stack([a.ravel(), c.ravel(), d.ravel()], axis=1)
        tris += [t1, t2]
        tri_faces += [face, face]
        first_column.append(vid[:, 0])
        last_column.append(vid[:, -1])
    if not full and loops:
        start_face, end_face = len(names), len(names) + 1
        names += [CUT_FACE_START, CUT_FACE_END]
        for outer, holes in _regions(loops):
            members = [outer] + holes
            local = triangulate_section(loops[outer].points, [loops[h].points for h in holes])
            # triangulate_section numbers points through the loops as given (their
            # orientation is already right, so no reversal happened inside).
            start_ids = np.concatenate([first_column[k] for k in members])
            end_ids = np.concatenate([last_column[k] for k in members])
            tris.append(start_ids[local][:, ::-1])  # the start face looks backwards
            tris.append(end_ids[local])
            tri_faces += [np.full(len(local), start_face), np.full(len(local), end_face)]
    triangles = np.vstack(tris) if tris else np.zeros((0, 3), dtype=np.int64)
    faces = np.concatenate(tri_faces) if tri_faces else np.zeros(0, dtype=int)
    keep = (triangles[:, 0] != triangles[:, 1]) & (triangles[:, 1] != triangles[:, 2]) & \
        (triangles[:, 2] != triangles[:, 0])
    triangles, faces = triangles[keep], faces[keep]
    frame = np.vstack(frame_vertices)
    basis = _frame_basis(revolution, prep.side)
    origin = np.array([float(revolution.axis.point[0]), float(revolution.axis.point[1]), 0.0])
    vertices = origin + frame @ basis.T
    return TriangleMesh(vertices=vertices, triangles=triangles, face_of=faces,
                        face_names=tuple(names), closed=not chains, tolerance=tol,
                        angular_steps=steps)
