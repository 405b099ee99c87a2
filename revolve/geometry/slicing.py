"""The independent cross-check: washers for volume, ∫ r ds quadrature for surface.

Volume is computed here by slicing the solid perpendicular to the axis. At
axial position ``z`` the slice is a set of washers whose area, per radian of
revolution, is ``½ Σ ± r_i(z)²`` over the points where the boundary crosses the
slice plane (outer crossings add, inner ones subtract). The slice area is
integrated over ``z`` with breakpoints at every vertex and every point where
the boundary turns back along the axis, by Gauss–Legendre quadrature in the
variable φ of ``z = (a + b)/2 - (b - a)/2 · cos φ`` (which smooths the square-
root behaviour of an arc at its turning points), comparing two orders and
splitting intervals until they agree. Each crossing's part of a slice interval
is integrated between its own ends there, so when the slices would cut too many
crossings (a noisy outline) the intervals may be coarser than the vertices
(:func:`first_partition`); the pieces and intervals are arrays, and the work is
O(n log n) for n vertices on real outlines (see :func:`_interval_sums`).

Surface is ∫ r ds along every segment by Gauss–Legendre quadrature of the
parametrisation, again comparing two orders.

Neither uses the closed forms of :mod:`revolve.geometry.integrals`.

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
from dataclasses import dataclass
from typing import List, Sequence, Tuple

import numpy as np

from revolve.geometry.segments import Arc, Curve, Line, Segment

_GL_CACHE: dict = {}


def gauss_legendre(n: int) -> Tuple[np.ndarray, np.ndarray]:
    """Gauss–Legendre nodes and weights on [-1, 1] (numpy), cached.

    >>> x, w = gauss_legendre(3)
    >>> round(float(w.sum()), 14)
    2.0
    """
    if n not in _GL_CACHE:
        _GL_CACHE[n] = np.polynomial.legendre.leggauss(n)
    return _GL_CACHE[n]


@dataclass(frozen=True)
class Piece:
    """A part of a frame segment along which ``z`` moves one way only."""

    z_from: float
    z_to: float
    kind: str
    params: tuple  # line: (z0, r0, z1, r1); arc: (cz, cr, R, s, u_e, r_e, √(R² − u_e²));
    #                curve: (curve, t_a, t_b)
    factor: float  # loop orientation and hole sign


def monotone_pieces(seg: Segment, factor: float) -> List[Piece]:
    """Split a frame segment where it turns back along the axis.

    >>> from revolve.geometry.segments import arc_from_centre
    >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
    >>> [(p.z_from, p.z_to) for p in monotone_pieces(half, 1.0)]
    [(1.0, -1.0)]
    >>> full_top = arc_from_centre((0.0, 1.0), (0.0, -1.0), (0.0, 0.0), clockwise=True)
    >>> [(round(p.z_from, 12), round(p.z_to, 12)) for p in monotone_pieces(full_top, 1.0)]
    [(0.0, 1.0), (1.0, 0.0)]
    """
    if isinstance(seg, Line):
        (z0, r0), (z1, r1) = seg.start, seg.end
        if z0 == z1:
            return []
        return [Piece(z0, z1, "line", (z0, r0, z1, r1), factor)]
    if isinstance(seg, Arc):
        a0, a1 = seg.angles()
        lo, hi = min(a0, a1), max(a0, a1)
        cuts = [k * math.pi for k in range(math.ceil(lo / math.pi), math.floor(hi / math.pi) + 1)
                if lo < k * math.pi < hi]
        angles = [a0] + (cuts if a1 > a0 else cuts[::-1]) + [a1]
        cz, cr = seg.centre
        R = seg.radius
        out = []
        for b0, b1 in zip(angles[:-1], angles[1:]):
            mid = (b0 + b1) / 2
            s = 1.0 if math.sin(mid) > 0 else -1.0
            z_from = seg.start[0] if b0 == a0 else cz + R * math.cos(b0)
            z_to = seg.end[0] if b1 == a1 else cz + R * math.cos(b1)
            # A known point of the piece for the radius (see _radius_at): its start, as
            # u_e = z_e − cz, r_e and √(R² − u_e²) = |r_e − cr|, each without a square root
            # of a rounded difference (exactly ±R, cr and 0 at a turning point).
            if b0 == a0:
                ue, re, root_e = seg.start[0] - cz, seg.start[1], abs(seg.start[1] - cr)
            else:
                ue, re, root_e = (R if round(b0 / math.pi) % 2 == 0 else -R), cr, 0.0
            if z_from != z_to:
                out.append(Piece(z_from, z_to, "arc", (cz, cr, R, s, ue, re, root_e), factor))
        return out
    if isinstance(seg, Curve):
        ts = [seg.t_start] + seg.turning_parameters(0)
        ts.append(seg.t_end)
        out = []
        for ta, tb in zip(ts[:-1], ts[1:]):
            za = float(seg.evaluate(np.array([ta]))[0][0])
            zb = float(seg.evaluate(np.array([tb]))[0][0])
            if za != zb:
                out.append(Piece(za, zb, "curve", (seg, ta, tb), factor))
        return out
    raise TypeError(type(seg).__name__)


def _radius_at(piece: Piece, z: np.ndarray) -> np.ndarray:
    if piece.kind == "line":
        z0, r0, z1, r1 = piece.params
        return r0 + (z - z0) * ((r1 - r0) / (z1 - z0))
    if piece.kind == "arc":
        # r(z) = cr + s √(R² − u²), u = z − cz, written from a known point (cz + u_e, r_e) of the
        # piece as r_e + s (u_e − u)(u_e + u) / (√(R² − u²) + √(R² − u_e²)): the same value,
        # without the cancellation of cr against the root when the centre is far (a flat arc).
        cz, cr, R, s, ue, re, root_e = piece.params
        u = z - cz
        root = np.sqrt(np.maximum((R - u) * (R + u), 0.0))
        with np.errstate(invalid="ignore", divide="ignore"):
            r = re + s * (ue - u) * (ue + u) / (root + root_e)
        return np.where(root + root_e > 0, r, cr + s * root)
    curve, ta, tb = piece.params
    return curve.evaluate(curve_parameter_at(curve, ta, tb, z, coordinate=0))[1]


def curve_parameter_at(curve: Curve, ta: float, tb: float, targets, coordinate: int = 0,
                       iterations: int = 70) -> np.ndarray:
    """Parameters where a curve, monotone in one coordinate on [ta, tb], reaches each target.

    ``coordinate`` 0 inverts x(t) (the axial z in the frame), 1 inverts y(t)
    (the radius). Vectorised bisection over the targets.

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> c = Curve(t ** 2, t, 0.0, 2.0)
    >>> [round(float(v), 12) for v in curve_parameter_at(c, 0.0, 2.0, np.array([1.0, 4.0]))]
    [1.0, 2.0]
    >>> [round(float(v), 12) for v in curve_parameter_at(c, 0.0, 2.0, np.array([0.5]), coordinate=1)]
    [0.5]
    """
    targets = np.asarray(targets, dtype=float)
    start = float(curve.evaluate(np.array([ta]))[coordinate][0])
    rising = float(curve.evaluate(np.array([tb]))[coordinate][0]) > start
    lo = np.full(targets.shape, ta, dtype=float)
    hi = np.full(targets.shape, tb, dtype=float)
    for _ in range(iterations):
        mid = 0.5 * (lo + hi)
        value = curve.evaluate(mid)[coordinate]
        below = (value < targets) if rising else (value > targets)
        lo = np.where(below, mid, lo)
        hi = np.where(below, hi, mid)
    return 0.5 * (lo + hi)


@dataclass(frozen=True)
class PieceTable:
    """The monotone pieces of a profile's loops as arrays, for the washers.

    ``lo`` and ``hi`` are each piece's extent along the axis and ``sign`` is
    ``-direction × factor`` (the sign its ``r²`` takes in the slice). Lines
    and arcs keep their parameters in columns (``line``: z0, r0, z1, r1;
    ``arc``: cz, cr, R, s, u_e, r_e, √(R² − u_e²), as in :class:`Piece`);
    curves stay :class:`Piece` objects (few, each inverted by bisection).
    Rows of ``lo``, ``hi`` and ``sign`` list the lines, then the arcs, then
    the curves.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> prep = prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> t = piece_table(prep, [1.0])
    >>> t.count, t.lo.tolist(), t.hi.tolist(), t.sign.tolist()
    (2, [0.0, 0.0], [2.0, 2.0], [-1.0, 1.0])
    """

    lo: np.ndarray
    hi: np.ndarray
    sign: np.ndarray
    line: np.ndarray            # (n_lines, 4)
    arc: np.ndarray             # (n_arcs, 7)
    curves: Tuple[Piece, ...]

    @property
    def count(self) -> int:
        return int(self.lo.size)


def piece_table(prep, loop_factors: Sequence[float]) -> PieceTable:
    """Split every loop segment of a prepared profile into monotone pieces, as arrays.

    Lines go straight into columns (no object per vertex); arcs and curves go
    through :func:`monotone_pieces`. Open chains enclose nothing and are left out.
    An empty profile gives an empty table:

    >>> from revolve.geometry.checks import PreparedProfile
    >>> piece_table(PreparedProfile((), (), (), 1.0, 1.0, 1e-9), []).count
    0
    """
    line_rows: List[np.ndarray] = []
    line_factor: List[np.ndarray] = []
    others: List[Piece] = []
    loop_no = 0
    for segs, closed in zip(prep.paths, prep.closed):
        if not closed:
            continue
        f = float(loop_factors[loop_no])
        loop_no += 1
        ends = [s.start + s.end for s in segs if isinstance(s, Line)]
        if ends:
            rows = np.array(ends, dtype=float).reshape(-1, 4)
            rows = rows[rows[:, 0] != rows[:, 2]]           # across the axis: no washer
            line_rows.append(rows)
            line_factor.append(np.full(len(rows), f))
        for s in segs:
            if not isinstance(s, Line):
                others.extend(monotone_pieces(s, f))
    line = np.concatenate(line_rows) if line_rows else np.zeros((0, 4))
    lf = np.concatenate(line_factor) if line_factor else np.zeros(0)
    arcs = [p for p in others if p.kind == "arc"]
    curves = tuple(p for p in others if p.kind == "curve")
    arc = np.array([p.params for p in arcs], dtype=float).reshape(-1, 7)
    ends_of = np.array([(p.z_from, p.z_to, p.factor) for p in arcs + list(curves)],
                       dtype=float).reshape(-1, 3)
    z_from = np.concatenate([line[:, 0], ends_of[:, 0]])
    z_to = np.concatenate([line[:, 2], ends_of[:, 1]])
    factor = np.concatenate([lf, ends_of[:, 2]])
    direction = np.where(z_to > z_from, 1.0, -1.0)
    return PieceTable(np.minimum(z_from, z_to), np.maximum(z_from, z_to), -direction * factor,
                      line, arc, curves)


def _line_radius(p: np.ndarray, z: np.ndarray) -> np.ndarray:
    """r(z) along line pieces; ``p`` rows (z0, r0, z1, r1) broadcast against ``z``."""
    z0, r0, z1, r1 = (p[:, k:k + 1] for k in range(4))
    return r0 + (z - z0) * ((r1 - r0) / (z1 - z0))


def _arc_radius(p: np.ndarray, z: np.ndarray) -> np.ndarray:
    """r(z) along arc pieces, as in :func:`_radius_at` (rows of the seven arc parameters)."""
    cz, cr, R, s, ue, re, root_e = (p[:, k:k + 1] for k in range(7))
    u = z - cz
    root = np.sqrt(np.maximum((R - u) * (R + u), 0.0))
    with np.errstate(invalid="ignore", divide="ignore"):
        r = re + s * (ue - u) * (ue + u) / (root + root_e)
    return np.where(root + root_e > 0, r, cr + s * root)


#: Most (piece, interval) pairs evaluated at once by :func:`_interval_sums` (bounds memory).
PAIR_BLOCK = 1 << 13


def _interval_sums(table: PieceTable, a: np.ndarray, b: np.ndarray, orders: Sequence[int],
                   r_ref: float = 0.0) -> List[np.ndarray]:
    """∫ of the slice function over each interval [a_k, b_k], once per quadrature order.

    The intervals must be sorted and must not overlap (so ``b`` is sorted
    too). A piece, monotone in z, then meets a contiguous run of intervals:
    those with ``b > lo`` and ``a < hi``, found by two binary searches. The
    (piece, interval) pairs are expanded from those runs; each pair is the
    piece's washer over its part ``[max(a, lo), min(b, hi)]`` of the
    interval; every node of every pair is evaluated at once, and the pairs
    are summed into their intervals with ``np.bincount``. Where every piece
    end is an interval end (as :func:`washer_volume` starts on smooth
    outlines), a piece's part of an interval is the whole interval.

    Cost: O((n + m) log m + P · order) for n pieces, m intervals and P pairs.
    P is the number of times the interval ends cut the boundary, plus n:
    about 2m on an outline made of a few monotone chains along the axis; as
    many as n · m for pathological partitions (many long pieces over the same
    range, a noisy outline cut at every vertex), which is why
    :func:`washer_volume` coarsens its first partition until P is O(n).

    Each piece contributes ``sign · ∫ (r − r_ref)(r + r_ref) dz`` with n
    Gauss–Legendre nodes in φ, ``z = (c + d)/2 − (d − c)/2 · cos φ`` on its
    part [c, d] of the interval.
    """
    m = a.size
    out = [np.zeros(m) for _ in orders]
    if m == 0 or table.count == 0:
        return out
    rules = []
    for n in orders:
        x, w = gauss_legendre(n)
        phi = (x + 1) * (math.pi / 2)                      # nodes on [0, π]
        rules.append((np.cos(phi), w * (math.pi / 2) * np.sin(phi)))   # dz = (b−a)/2 sin φ dφ
    first = np.searchsorted(b, table.lo, side="right")     # first interval with b > lo
    stop = np.searchsorted(a, table.hi, side="left")       # intervals with a < hi end here
    count = np.maximum(stop - first, 0)
    n_line, n_arc = len(table.line), len(table.arc)
    kinds = (("line", 0, n_line), ("arc", n_line, n_line + n_arc))
    for kind, k0, k1 in kinds:
        if k1 == k0:
            continue
        params = table.line if kind == "line" else table.arc
        radius = _line_radius if kind == "line" else _arc_radius
        cnt = count[k0:k1]
        ends = np.cumsum(cnt)
        total = int(ends[-1])
        for lo_pair in range(0, total, PAIR_BLOCK):
            hi_pair = min(total, lo_pair + PAIR_BLOCK)
            # Pair q belongs to the piece whose cumulative count first exceeds q.
            q = np.arange(lo_pair, hi_pair)
            piece = np.searchsorted(ends, q, side="right")
            iv = first[k0 + piece] + (q - (ends[piece] - cnt[piece]))
            p = params[piece]
            sign = table.sign[k0 + piece]
            c = np.maximum(a[iv], table.lo[k0 + piece])
            d = np.minimum(b[iv], table.hi[k0 + piece])
            mid, half = (c + d) / 2, (d - c) / 2
            for res, (cphi, wphi) in zip(out, rules):
                z = mid[:, None] - half[:, None] * cphi[None, :]
                r = radius(p, z)
                # Every loop crosses a slice as often going one way as the other, so
                # r² − r_ref² sums to the same washer area, without losing digits when
                # a thin section lies far from the axis.
                val = np.einsum("ij,j->i", (r - r_ref) * (r + r_ref), wphi) * half * sign
                res += np.bincount(iv, weights=val, minlength=m)
    for j, pc in enumerate(table.curves):
        k = n_line + n_arc + j
        if count[k] <= 0:
            continue
        sel = np.arange(first[k], first[k] + count[k])
        c = np.maximum(a[sel], table.lo[k])
        d = np.minimum(b[sel], table.hi[k])
        mid, half = (c + d) / 2, (d - c) / 2
        for res, (cphi, wphi) in zip(out, rules):
            z = mid[:, None] - half[:, None] * cphi[None, :]
            r = _radius_at(pc, z)
            res[sel] += table.sign[k] * np.einsum("ij,j->i", (r - r_ref) * (r + r_ref), wphi) * half
    return out


#: Most (piece, interval) pairs per piece the first partition of the washers may give.
PAIRS_PER_PIECE = 8


def first_partition(table: PieceTable) -> np.ndarray:
    """The interval ends the washers start from: every piece end, or a subset of them.

    Every piece end (where the slice function has a kink) is an interval end
    unless the slices cut so many pieces that the (piece, interval) pairs would
    pass :data:`PAIRS_PER_PIECE` per piece, as on a noisy outline whose zigzags
    are longer along the axis than the spacing of its points. Then every k-th
    end is kept, k doubling until they fit: each slice interval then holds the
    parts of the pieces that cross it, each piece integrated over its own part
    (its kinks stay at the ends of its parts). The cost of the choice is
    O(n log n) per try, with at most log₂ n tries.

    >>> t = PieceTable(np.array([0.0, 0.0]), np.array([2.0, 2.0]), np.array([-1.0, 1.0]),
    ...                np.zeros((2, 4)), np.zeros((0, 7)), ())
    >>> first_partition(t).tolist()
    [0.0, 2.0]
    """
    breaks = np.unique(np.concatenate([table.lo, table.hi]))
    limit = PAIRS_PER_PIECE * table.count + 64
    step = 1
    edges = breaks
    while edges.size > 2:
        pairs = int((np.searchsorted(edges, table.hi, side="left")
                     - np.searchsorted(edges, table.lo, side="right") + 1).sum())
        if pairs <= limit:
            break
        step *= 2
        edges = breaks[::step]
        if edges[-1] != breaks[-1]:
            edges = np.append(edges, breaks[-1])
    return edges


#: Most slice intervals :func:`washer_volume` evaluates (each with 3 × 24 nodes per piece).
MAX_SLICE_INTERVALS = 20_000


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

    The slice intervals are kept sorted, so each round costs O(m log m) for m
    intervals plus the work of :func:`_interval_sums` on the pairs of pieces
    and intervals, which :func:`first_partition` keeps O(n) for n pieces.
    """
    table = piece_table(prep, loop_factors)
    if table.count == 0:
        return 0.0, 0.0
    breaks = first_partition(table)
    ends = np.fromiter((c for p in prep.paths for s in p for c in (s.start[1], s.end[1])),
                       dtype=float)
    r_ref = float((ends.min() + ends.max()) / 2)
    a, b = breaks[:-1], breaks[1:]
    value = 0.0
    error = 0.0
    n = 24
    r_far = max(abs(float(ends.min())), abs(float(ends.max())))
    budget = a.size + max_intervals
    used = 0
    for round_no in range(max_rounds):
        used += a.size
        with np.errstate(all="ignore"):
            coarse, fine = _interval_sums(table, a, b, (n, 2 * n), r_ref)
        diff = np.abs(fine - coarse)
        finite = np.isfinite(fine) & np.isfinite(diff)
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
        bound = table.count * r_far * r_far * (b - a)
        unsure = good & (~finite | (diff > rel_tol * scale))
        value += float(np.where(finite, fine, 0.0)[good].sum())
        error += float(np.where(unsure, np.where(finite, diff, 0.0) + bound, diff)[good].sum())
        if good.all():
            break
        # Halve the rest; each pair of halves stays in place, so the intervals stay sorted.
        ab, bb = a[~good], b[~good]
        m = (ab + bb) / 2
        a = np.column_stack([ab, m]).ravel()
        b = np.column_stack([m, bb]).ravel()
    return abs(value) * angle / 2, error * angle / 2


def _r_ds_line(segs: Sequence[Line], n: int) -> np.ndarray:
    x, w = gauss_legendre(n)
    s = (x + 1) / 2
    p = np.array([l.start + l.end for l in segs], dtype=float)
    L = np.hypot(p[:, 2] - p[:, 0], p[:, 3] - p[:, 1])
    r = p[:, 1:2] + s[None, :] * (p[:, 3:4] - p[:, 1:2])
    return (r @ w) * L / 2


def _r_ds_arc(segs: Sequence[Arc], n: int) -> np.ndarray:
    x, w = gauss_legendre(n)
    par = np.array([(a.start[1], a.radius, a.angles()[0], a.sweep()) for a in segs], dtype=float)
    r0, R, a0, d = par.T
    half = ((x[None, :] + 1) / 4) * d[:, None]          # (θ − θ0)/2
    # r = r0 + R (sin θ − sin θ0), as a product: no cancellation against a far centre.
    r = r0[:, None] + 2 * R[:, None] * np.cos(a0[:, None] + half) * np.sin(half)
    return (r @ w) * R * np.abs(d) / 2


def _r_ds_curve(c: Curve, n: int, rel_tol: float) -> Tuple[float, float]:
    """∫ r ds along a curve by adaptive Gauss–Legendre in φ, t = mid − half cos φ.

    The map is smooth at vertical tangents, as in the washers. Vectorised over
    intervals, with a bounded number of them (see
    :func:`revolve.geometry.integrals.adaptive_quadrature`).
    """
    from revolve.geometry.integrals import adaptive_quadrature

    ta, tb = c.t_start, c.t_end
    mid, half = (ta + tb) / 2, (tb - ta) / 2

    def g(phi):
        t = mid - half * np.cos(phi)
        _, r, dz, dr = c.evaluate(t)
        v = r * np.hypot(dz, dr) * np.sin(phi) * half
        return np.nan_to_num(v, nan=0.0, posinf=0.0, neginf=0.0)[:, None]

    with np.errstate(all="ignore"):
        total, err = adaptive_quadrature(g, 0.0, math.pi, rel_tol=rel_tol, n=n // 2)
    return abs(float(total[0])), float(err[0])


def surface_by_quadrature(prep, angle: float, n: int = 32,
                          rel_tol: float = 1e-14) -> Tuple[List[float], List[float]]:
    """Swept area of every segment, ``angle · ∫ r ds`` by quadrature; (areas, errors) in order."""
    segs = [s for p in prep.paths for s in p]
    out = np.zeros(len(segs))
    err = np.zeros(len(segs))
    li = [i for i, s in enumerate(segs) if isinstance(s, Line)]
    ai = [i for i, s in enumerate(segs) if isinstance(s, Arc)]
    if li:
        lo = _r_ds_line([segs[i] for i in li], 2)
        hi = _r_ds_line([segs[i] for i in li], 4)
        out[li], err[li] = hi, np.abs(hi - lo)
    if ai:
        lo = _r_ds_arc([segs[i] for i in ai], n)
        hi = _r_ds_arc([segs[i] for i in ai], 2 * n)
        out[ai], err[ai] = hi, np.abs(hi - lo)
    for i, s in enumerate(segs):
        if isinstance(s, Curve):
            out[i], err[i] = _r_ds_curve(s, n, rel_tol)
    return list(out * angle), list(err * angle)
