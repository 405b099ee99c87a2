"""The independent cross-check: washers for volume, ∫ r ds quadrature for surface.

Volume is computed here by slicing the solid perpendicular to the axis. At
axial position ``z`` the slice is a set of washers whose area, per radian of
revolution, is ``½ Σ ± r_i(z)²`` over the points where the boundary crosses the
slice plane (outer crossings add, inner ones subtract). The slice area is
integrated over ``z`` with breakpoints at every vertex and every point where
the boundary turns back along the axis, by Gauss–Legendre quadrature in the
variable φ of ``z = (a + b)/2 - (b - a)/2 · cos φ`` (which smooths the square-
root behaviour of an arc at its turning points), comparing two orders and
splitting intervals until they agree.

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
        t = np.linspace(seg.t_start, seg.t_end, 1025)
        with np.errstate(all="ignore"):
            _, _, dz, _ = seg.evaluate(t)
        dz = np.nan_to_num(dz, nan=0.0, posinf=0.0, neginf=0.0)
        # Sign changes of dz/dt between neighbouring samples where it is not zero, so a
        # turning point that falls exactly on a sample is found too.
        nz = np.flatnonzero(np.sign(dz) != 0)
        change = np.sign(dz[nz[:-1]]) * np.sign(dz[nz[1:]]) < 0
        ts = [seg.t_start]
        for i, j in zip(nz[:-1][change], nz[1:][change]):
            ts.append(_root(lambda u: seg.evaluate(np.array([u]))[2][0], t[i], t[j]))
        ts.append(seg.t_end)
        out = []
        for ta, tb in zip(ts[:-1], ts[1:]):
            za = float(seg.evaluate(np.array([ta]))[0][0])
            zb = float(seg.evaluate(np.array([tb]))[0][0])
            if za != zb:
                out.append(Piece(za, zb, "curve", (seg, ta, tb), factor))
        return out
    raise TypeError(type(seg).__name__)


def _root(f, a: float, b: float) -> float:
    """Bisection for a sign change of f on [a, b] (to the last bit)."""
    fa = f(a)
    for _ in range(200):
        m = 0.5 * (a + b)
        if m == a or m == b:
            break
        fm = f(m)
        if (fm > 0) == (fa > 0):
            a, fa = m, fm
        else:
            b = m
    return 0.5 * (a + b)


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


def _interval_sums(pieces: Sequence[Piece], a: np.ndarray, b: np.ndarray, n: int,
                   r_ref: float = 0.0) -> np.ndarray:
    """∫ of the slice function over each interval [a_k, b_k] with n cos-mapped GL nodes."""
    x, w = gauss_legendre(n)
    phi = (x + 1) * (math.pi / 2)                      # nodes on [0, π]
    wphi = w * (math.pi / 2) * np.sin(phi)             # dz = (b - a)/2 sin φ dφ
    half = (b - a) / 2
    zk = ((a + b) / 2)[:, None] - half[:, None] * np.cos(phi)[None, :]
    total = np.zeros(a.shape)
    for p in pieces:
        lo, hi = min(p.z_from, p.z_to), max(p.z_from, p.z_to)
        inside = (a >= lo) & (b <= hi)
        if not inside.any():
            continue
        sel = np.flatnonzero(inside)
        r = _radius_at(p, zk[sel])
        direction = 1.0 if p.z_to > p.z_from else -1.0
        # Every loop crosses a slice as often going one way as the other, so
        # r² - r_ref² sums to the same washer area, without losing digits when
        # a thin section lies far from the axis.
        total[sel] += -direction * p.factor * ((r - r_ref) * (r + r_ref)) @ wphi * half[sel]
    return total


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
    """
    pieces: List[Piece] = []
    loop_no = 0
    for segs, closed in zip(prep.paths, prep.closed):
        if not closed:
            continue
        f = float(loop_factors[loop_no])
        loop_no += 1
        for s in segs:
            pieces.extend(monotone_pieces(s, f))
    if not pieces:
        return 0.0, 0.0
    breaks = np.unique(np.array([[p.z_from, p.z_to] for p in pieces]).ravel())
    ends = np.array([c for p in prep.paths for s in p for c in (s.start[1], s.end[1])])
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
            coarse = _interval_sums(pieces, a, b, n, r_ref)
            fine = _interval_sums(pieces, a, b, 2 * n, r_ref)
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
        bound = len(pieces) * r_far * r_far * (b - a)
        unsure = good & (~finite | (diff > rel_tol * scale))
        value += float(np.where(finite, fine, 0.0)[good].sum())
        error += float(np.where(unsure, np.where(finite, diff, 0.0) + bound, diff)[good].sum())
        if good.all():
            break
        ab, bb = a[~good], b[~good]
        m = (ab + bb) / 2
        a = np.concatenate([ab, m])
        b = np.concatenate([m, bb])
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
