"""Level volumes with the axis horizontal: circular segments integrated along the axis.

With the axis level, a liquid depth ``d`` measured from the lowest inside
point puts the liquid surface at height ``y = d - r_max`` above the axis,
``r_max`` being the largest distance of the section from the axis. A slice
of the revolved solid perpendicular to the axis is a set of circles (rings
for sections with holes) about the axis; the wetted part of a circle of
radius ``r`` is the circular segment below ``y``, of area

    S(r, y) = r² acos(-y/r) + y √(r² - y²)      for |y| < r,

0 below the circle and π r² above it (the circular segment area of CRC
*Standard Mathematical Tables*, written with the height ``r + y``). As for
washers (:mod:`revolve.geometry.slicing`), the wetted area of a slice is
``Σ ± S(r_i(z), y)`` over the points where the section's boundary crosses the
slice, and the volume is its integral along the axis, a line integral
``-∮ S(r, y) dz`` around each loop (Green's theorem; at full depth S = π r²
and this is the washer volume).

The wetted surface is the same sum for the boundary itself: at a boundary
point of radius ``r`` the wetted arc of the circle is ``2 r acos(-y/r)``
(= ∂S/∂r), so the wetted area is ``∫ 2 r acos(-y/r) ds`` along every
segment.

Each kind gives its segments as a table (its ``radial_level_table``:
straight, circular or parametric rows, see :func:`horizontal_pieces`); no
algorithm here asks which kind a segment is. How each piece is integrated
(pieces monotone in both ``z`` and ``r``, so that a level meets a piece's
circles tangentially at most once):

* straight pieces in closed form: a cylinder ``S(r, y) Δz``; a cone
  ``Δz/Δr · [F(r₁, y) - F(r₀, y)]`` with ``F = ∫ S dr`` (below); a flat face
  ``S(r₁, y) - S(r₀, y)`` of wetted area. A cone so steep in ``r`` that the
  difference would lose digits goes to quadrature instead;
* a piece entirely below or above the level in closed form (nothing, or the
  whole washer π ∫ r² dz and surface 2π ∫ r ds);
* many pieces shallow in ``r`` (a corrugated or surveyed shell) by groups:
  the series of ``S`` about each group's middle radius, with each piece's
  moments ∫ (r - c)^k dz found once (see :func:`segment_taylor` and the notes
  before it), where its error estimate allows;
* everything else by Gauss–Legendre quadrature, vectorised over levels and
  pieces: lines in ``z``, arcs in their angle, curves in their parameter.
  Where a level is tangent to a piece's circles (``r = |y|``) the piece is
  split there and the nodes of the wetted side are gathered towards the
  split by ``p = p* + (p₁ - p*) u²``, which makes the integrand's
  ``(r - |y|)^{3/2}`` behaviour smooth in ``u``; curves use
  ``p = m - h cos(π u)`` throughout (smooth at ends with a vertical tangent).
  Each interval's error is estimated from how fast the Legendre
  coefficients of its integrand fall off (:func:`_error_estimate`), and
  intervals are halved until the estimate is small; the sum of the
  estimates is reported with the result.

``F(r, y) = r³/3 · acos(-y/r) + 2/3 · y r √(r² - y²) - y³/3 · acosh(r/|y|)``
for ``r ≥ |y|`` (and π r³/3 or 0 when the circle is wholly below or above
the liquid surface); its derivative in ``r`` is ``S``, which the tests check
against sympy.

Examples
--------
A cylinder of radius 1 and length 2 half full: half its volume, 2 · π/2.

>>> from revolve.geometry.profile import Loop, Profile, Axis
>>> from revolve.geometry.checks import prepare
>>> prep = prepare(Profile(loops=(Loop.from_points([(0, 0), (2, 0), (2, 1), (0, 1)]),)), Axis.x())
>>> res = horizontal_levels(prep, [0.0, 1.0, 2.0])
>>> [round(float(v) / math.pi, 12) for v in res.volume]
[0.0, 1.0, 2.0]
>>> [round(float(a) / math.pi, 12) for a in res.wetted_area]   # 2 π r L plus the two ends
[0.0, 3.0, 6.0]
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Optional, Sequence, Tuple

import numpy as np

from revolve.geometry.checks import PreparedProfile
from revolve.geometry.clipping import (_arc_moments, _loop_segments, d_minus_sin, kind_groups,
                                       parameters_at_values)
from revolve.geometry.integrals import _end_weights
from revolve.geometry.quadrature import gauss_legendre, legendre_table

PI = math.pi
#: Steepest cone (|Δz/Δr|) integrated in closed form; steeper ones go to quadrature.
CLOSED_FORM_SLOPE = 1e3
#: Narrowest interval (of a piece's parameter range, in u) that is still halved.
MIN_WIDTH = 2.0 ** -24


# -- the circular segment and its integrals ---------------------------------------------

def _straight_classes(dz, dr, length):
    """Straight rows sorted for the closed forms: cylinders, radial faces, cones and steep ones.

    Returns the four masks and, for the cones, ``dz/dr`` and ``length/|dr|``
    (zero elsewhere). A cone steeper than :data:`CLOSED_FORM_SLOPE` goes to
    quadrature (its closed form would cancel).

    >>> import numpy as np
    >>> c = _straight_classes(np.array([2.0, 0.0, 1.0]), np.array([0.0, 1.0, 1.0]),
    ...                       np.array([2.0, 1.0, 2 ** 0.5]))
    >>> [m.tolist() for m in c[:4]], c[4].tolist()
    ([[True, False, False], [False, True, False], [False, False, True], [False, False, False]], [0.0, 0.0, 1.0])
    """
    cyl = (dr == 0)
    radial = (dz == 0)
    cone = ~cyl & ~radial & (np.abs(dz) <= CLOSED_FORM_SLOPE * np.abs(dr))
    steep = ~cyl & ~radial & ~cone
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio = np.where(cone, dz / np.where(dr == 0, 1.0, dr), 0.0)
        lratio = np.where(cone, length / np.where(dr == 0, 1.0, np.abs(dr)), 0.0)
    return cyl, radial, cone, steep, ratio, lratio


def _half_angle(r, r_plus_y, r_minus_y):
    """acos(-y/r) without lost digits near the bottom or the top of the circle.

    Below the axis it is 2 asin(√((r + y)/(2r))), above it π - 2 asin(√((r - y)/(2r))):
    the argument of the asin stays small where acos itself would be ill-conditioned.
    """
    below = r_plus_y <= r_minus_y
    small = np.minimum(r_plus_y, r_minus_y)
    q = np.divide(small, 2.0 * r, out=np.zeros(np.broadcast(small, r).shape), where=r > 0)
    a = 2.0 * np.arcsin(np.sqrt(np.clip(q, 0.0, 1.0)))
    return np.where(below, a, PI - a) * (r > 0)


def segment_area(r, y, r_plus_y=None, r_minus_y=None):
    """Area of a circle of radius ``r`` about the axis below the height ``y`` (arrays).

    ``r_plus_y`` and ``r_minus_y`` may give ``r + y`` and ``r - y`` computed
    without cancellation (the heights of the segment and of the rest), for
    liquid surfaces very near the bottom or the top of the circle.

    >>> round(float(segment_area(1.0, 0.0)) / math.pi, 15)          # half the circle
    0.5
    >>> float(segment_area(2.0, -3.0)), round(float(segment_area(2.0, 5.0)) / math.pi, 15)
    (0.0, 4.0)
    >>> r, h = 1.0, 0.3                     # CRC: r² acos((r-h)/r) - (r-h) √(2rh - h²)
    >>> ref = r * r * math.acos((r - h) / r) - (r - h) * math.sqrt(2 * r * h - h * h)
    >>> abs(float(segment_area(r, h - r)) - ref) < 1e-15
    True
    """
    r = np.asarray(r, dtype=float)
    y = np.asarray(y, dtype=float)
    rpy = np.clip((r + y) if r_plus_y is None else np.asarray(r_plus_y, dtype=float), 0.0, None)
    rmy = np.clip((r - y) if r_minus_y is None else np.asarray(r_minus_y, dtype=float), 0.0, None)
    angle = _half_angle(r, rpy, rmy)
    # The smaller part as r² (θ - sin θ)/2 (θ its central angle, θ - sin θ by series): a
    # depth a hair above the bottom keeps its digits (r² acos + y √… would cancel).
    below = rpy <= rmy
    small = 0.5 * r * r * d_minus_sin(2.0 * np.where(below, angle, PI - angle))
    s = np.where(below, small, PI * r * r - small)
    return np.where((rpy > 0) & (rmy > 0), s, np.where(rpy <= 0, 0.0, PI * r * r))


def wetted_arc(r, y, r_plus_y=None, r_minus_y=None):
    """Length of the arc of a circle of radius ``r`` below the height ``y``: 2 r acos(-y/r).

    >>> round(float(wetted_arc(1.0, 0.0)) / math.pi, 15), float(wetted_arc(1.0, -2.0))
    (1.0, 0.0)
    """
    r = np.asarray(r, dtype=float)
    y = np.asarray(y, dtype=float)
    rpy = np.clip((r + y) if r_plus_y is None else np.asarray(r_plus_y, dtype=float), 0.0, None)
    rmy = np.clip((r - y) if r_minus_y is None else np.asarray(r_minus_y, dtype=float), 0.0, None)
    return 2.0 * r * _half_angle(r, rpy, rmy)


def segment_area_integral(r, y):
    """F(r, y) = ∫ S(r, y) dr, continuous in r (0 at r = 0; see the module notes).

    >>> y = 0.25
    >>> h = 1e-6
    >>> d = (segment_area_integral(0.8 + h, y) - segment_area_integral(0.8 - h, y)) / (2 * h)
    >>> abs(float(d) - float(segment_area(0.8, y))) < 1e-8
    True
    >>> round(float(segment_area_integral(1.0, 2.0)) / math.pi, 15)   # π r³/3: wholly under
    0.333333333333333
    """
    r = np.asarray(r, dtype=float)
    y = np.asarray(y, dtype=float)
    ay = np.abs(y)
    inside = r > ay
    rr = np.where(inside, r, ay + 1.0)       # harmless values where not used
    angle = _half_angle(rr, rr + y, rr - y)
    chord = np.sqrt(np.clip((rr - ay) * (rr + ay), 0.0, None))
    with np.errstate(divide="ignore", invalid="ignore"):
        t = np.where(ay > 0, np.log1p((rr - ay + chord) / np.where(ay > 0, ay, 1.0)), 0.0)
    f = rr ** 3 / 3.0 * angle + 2.0 / 3.0 * y * rr * chord - y ** 3 / 3.0 * t
    outside = np.where(y >= 0, PI * r ** 3 / 3.0, 0.0)
    return np.where(inside, f, outside)


# -- many shallow pieces at once: the segment as a series about a middle radius ----------------
#
# A level not tangent to a piece's circles (|y| < r all along it) needs S(r, y) only where
# r stays near the piece's radii. About a middle radius c, S(c + δ, y) = Σ S_k δ^k converges
# for |δ| < c - |y| (the tangent circle r = |y| is the nearest singularity), so a group of
# pieces with radii within c ± h gives -Σ S_k(c, y) Σ f ∫ (r - c)^k dz: the moments
# ∫ (r - c)^k dz and ∫ (r - c)^k ds are found once per piece (Gauss–Legendre, on the table's
# own parametrisation), the coefficients once per group and level. The series is used where
# h/(c - |y|) <= SERIES_RATIO and its estimated error (the last terms, and the moments'
# quadrature difference) is within the group's share of the tolerance; a level above the
# whole group (every circle under the liquid) takes S = π r² exactly; everything else goes
# to the piece-by-piece sorting below. A corrugated shell of a thousand shallow arcs is one
# group: a thousand levels cost a few thousand series.

#: Largest ratio of a group's half width in r to the distance to the tangent circle.
SERIES_RATIO = 0.1
#: Terms of the series (enough for SERIES_RATIO to the last bit; the error is checked).
SERIES_TERMS = 18
#: Groups: pieces with their smallest radius in the same step of 1/SERIES_BINS in log₂ r.
SERIES_BINS = 512
#: A piece joins a group only when its own radii lie within this fraction of its smallest.
SERIES_SHALLOW = 1.0 / 512
#: Fewer pieces than this in a table: the pieces are sorted one by one (as cheap).
SERIES_MIN_PIECES = 16


def segment_taylor(c, y, terms: int = SERIES_TERMS):
    """Taylor coefficients ``S_k`` of ``S(c + δ, y)`` in ``δ`` (arrays, shape (…, terms + 1)).

    For ``c > |y|``: ``S' = 2 r acos(-y/r)`` and ``d acos(-y/r)/dr = -y g`` with
    ``g = (r⁴ - y² r²)^(-1/2)``, whose coefficients follow from those of the
    quartic by the power recurrence of series (J. C. P. Miller's formula, from
    memory: ``n P₀ g_n = Σ_j ((α + 1) j - n) P_j g_{n-j}``, α = -1/2).

    >>> c, y, delta = 2.0, 0.5, 0.1
    >>> s = segment_taylor(np.array([c]), np.array([y]))[0]
    >>> approx = float(np.polynomial.polynomial.polyval(delta, s))
    >>> abs(approx - float(segment_area(c + delta, y))) < 1e-15 * float(segment_area(c + delta, y))
    True
    >>> bool(abs(s[1] - 2 * c * math.acos(-y / c)) < 1e-15 * s[1])     # S' = 2 r acos(-y/r)
    True
    """
    c = np.asarray(c, dtype=float)
    y = np.asarray(y, dtype=float)
    ay = np.abs(y)
    rho = c - ay
    c2, y2 = c * c, y * y
    P = [c2 * rho * (c + ay), 2.0 * c * (2.0 * c2 - y2), 6.0 * c2 - y2, 4.0 * c,
         np.ones_like(c)]
    g = [1.0 / np.sqrt(P[0])]
    for n in range(1, terms):
        acc = np.zeros_like(c)
        for j in range(1, min(n, 4) + 1):
            acc = acc + (0.5 * j - n) * P[j] * g[n - j]
        g.append(acc / (n * P[0]))
    theta = [_half_angle(c, c + y, c - y)] + [-y * g[n - 1] / n for n in range(1, terms)]
    out = [segment_area(c, y, c + y, c - y)]
    for n in range(1, terms + 1):
        r_theta = c * theta[n - 1] + (theta[n - 2] if n >= 2 else 0.0)    # [r θ]_{n-1}
        out.append(2.0 * r_theta / n)
    return np.stack(out, axis=-1)


def _moments(table, rows, centre, pa, pb, terms: int, nodes: int):
    """``∫ (r - centre)^k dz`` and ``∫ (r - centre)^k ds`` over table rows, k = 0…terms."""
    x, w = gauss_legendre(nodes)
    n = rows.size
    mapping = COSINE if table.cosine else STRAIGHT
    jobs = _Jobs(np.zeros(n, dtype=int), rows, np.zeros(n, dtype=int),
                 np.full(n, mapping), pa[rows], pb[rows], np.zeros(n), np.ones(n))
    u = 0.5 + 0.5 * x[None, :] * np.ones((n, 1))
    p, dp = _parameter(jobs, u)
    r, dz, ds, _ = table.radii(rows, p, 0.0)
    jac = 0.5 * dp * w[None, :]
    with np.errstate(all="ignore"):
        gz = np.nan_to_num(dz * jac)
        gs = np.nan_to_num(ds * np.abs(jac))
    delta = r - centre[:, None]
    mz, ms = np.empty((n, terms + 1)), np.empty((n, terms + 1))
    # Σ_nodes δ^k g for k = 0…terms, by repeated multiplication of the weights by δ
    wz, ws = gz.copy(), gs.copy()
    for k in range(terms + 1):
        mz[:, k] = wz.sum(axis=1)
        ms[:, k] = ws.sum(axis=1)
        if k < terms:
            wz *= delta
            ws *= delta
    return mz, ms


def _series_levels(table, kind, y, V, A, pa, pb, budget):
    """Levels of a table's shallow pieces by groups (see the notes above).

    Adds what it settles to ``V``, ``A`` (and its error estimate to the budget's
    array) and returns the (whole index, level index) pairs left for
    :func:`_sort_wholes`, or None when the table is left to it entirely.
    """
    tol_v, tol_a, E, _ = budget
    nY = y.size
    lo, hi = table.whole_r[:, 0], table.whole_r[:, 1]
    ok = (lo > 0) & (hi - lo <= SERIES_SHALLOW * lo) & getattr(table, "series_ok", True)
    if ok.sum() < SERIES_MIN_PIECES or nY == 0:
        return None
    members = np.flatnonzero(ok)
    bins, group = np.unique(np.floor(np.log2(lo[members]) * SERIES_BINS), return_inverse=True)
    nG = bins.size
    g_lo = np.full(nG, np.inf)
    g_hi = np.full(nG, -np.inf)
    np.minimum.at(g_lo, group, lo[members])
    np.maximum.at(g_hi, group, hi[members])
    centre, half = 0.5 * (g_lo + g_hi), 0.5 * (g_hi - g_lo)
    # the moments of each member's cut rows, about its group's middle radius
    first, stop = table.quarters[members, 0], table.quarters[members, 1]
    count = stop - first
    owner = np.repeat(np.arange(members.size), count)
    rows = np.repeat(first, count) + (np.arange(count.sum()) - np.repeat(np.cumsum(count) - count,
                                                                          count))
    K = SERIES_TERMS
    at = centre[group[owner]]
    if getattr(table, "polynomial", False):
        # r is linear in the parameter: (K + 2)/2 nodes integrate every moment exactly
        mz, ms = _moments(table, rows, at, pa, pb, K, K // 2 + 2)
        mz2, ms2 = mz, ms
    else:
        mz, ms = _moments(table, rows, at, pa, pb, K, 32)
        mz2, ms2 = _moments(table, rows, at, pa, pb, K, 24)
    f = table.factor[rows][:, None]
    into = group[owner]
    order = np.argsort(into, kind="stable")
    starts = np.searchsorted(into[order], np.arange(nG), side="left")

    def by_group(values):
        return np.add.reduceat(values[order], starts, axis=0)

    FM, NM = by_group(f * mz), by_group(ms)
    dFM, dNM = by_group(np.abs(f * (mz - mz2))), by_group(np.abs(ms - ms2))
    size = np.bincount(group, minlength=nG)[:, None]
    yy = y[None, :]
    above = yy >= g_hi[:, None]
    below = yy <= -g_hi[:, None]
    rho = centre[:, None] - np.abs(yy)
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio = np.where(rho > 0, half[:, None] / np.where(rho > 0, rho, 1.0), np.inf)
    near = ~above & ~below & (ratio <= SERIES_RATIO)
    done = above | below
    # every circle under the liquid: S = π r² exactly, W = 2π r
    c = centre[:, None]
    full_v = -PI * (c * c * FM[:, 0:1] + 2.0 * c * FM[:, 1:2] + FM[:, 2:3])
    full_a = 2.0 * PI * (c * NM[:, 0:1] + NM[:, 1:2])
    full_e = PI * (c * c * dFM[:, 0:1] + 2.0 * c * dFM[:, 1:2] + dFM[:, 2:3])
    V += np.where(above, full_v, 0.0).sum(axis=0)
    A += np.where(above, full_a, 0.0).sum(axis=0)
    E += np.where(above, full_e, 0.0).sum(axis=0)
    gi, li = np.nonzero(near)
    if gi.size:
        S = segment_taylor(centre[gi], y[li], K + 1)               # (pairs, K + 2)
        W = S[:, 1:] * np.arange(1, K + 2)                          # W_k = (k + 1) S_{k+1}
        S = S[:, :K + 1]
        v = -(S * FM[gi]).sum(axis=1)
        a = (W * NM[gi]).sum(axis=1)
        tail = np.abs(S[:, -2:] * FM[gi][:, -2:]).sum(axis=1)
        err_v = 10.0 * tail + (np.abs(S) * dFM[gi]).sum(axis=1)
        err_a = 10.0 * np.abs(W[:, -2:] * NM[gi][:, -2:]).sum(axis=1) + (np.abs(W) * dNM[gi]).sum(axis=1)
        good = (err_v <= tol_v * size[gi, 0]) & (err_a <= tol_a * size[gi, 0]) \
            & np.isfinite(v) & np.isfinite(a)
        V += np.bincount(li[good], weights=v[good], minlength=nY)
        A += np.bincount(li[good], weights=a[good], minlength=nY)
        E += np.bincount(li[good], weights=err_v[good], minlength=nY)
        done[gi[good], li[good]] = True
    # what is left: the members of each group at its other levels, and every other piece
    gl, ll = np.nonzero(~done)
    by_group = np.argsort(group, kind="stable")
    g_first = np.searchsorted(group[by_group], np.arange(nG), side="left")
    g_count = np.bincount(group, minlength=nG)
    reps = g_count[gl]
    ramp = np.arange(reps.sum()) - np.repeat(np.cumsum(reps) - reps, reps)
    left_w = members[by_group[np.repeat(g_first[gl], reps) + ramp]]
    left_y = np.repeat(ll, reps)
    others = np.flatnonzero(~ok)
    W_all = np.concatenate([left_w, np.repeat(others, nY)])
    Y_all = np.concatenate([left_y, np.tile(np.arange(nY), others.size)])
    return W_all, Y_all


# -- pieces: one table per segment kind ----------------------------------------------------
#
# Each segment kind turns its segments into one of the tables below through its class
# method ``radial_level_table`` (revolve/geometry/kinds/*.py): lines and polyline edges
# become straight rows (closed forms), arcs circular rows (cut at every quarter turn),
# anything else parametric rows (cut where r turns back; the segment contract only).
# Every table answers the same questions for :func:`horizontal_levels`: sort its rows
# against the levels into closed forms and quadrature jobs, and give r, dz/dp, ds/dp at
# parameters of its rows. The algorithm never asks which kind a segment is.

class StraightRows:
    """Straight pieces: rows ``z0, r0, z1, r1`` (z from the profile's middle), loop factors.

    >>> t = StraightRows(np.array([[-1.0, 2.0, 1.0, 2.0]]), np.array([1.0]))
    >>> t.extent(), t.size
    ((-1.0, 1.0, 2.0), 1)
    """

    cosine = False
    #: r is linear in the parameter (z): Gauss–Legendre moments are exact
    polynomial = True

    def __init__(self, rows: np.ndarray, factor: np.ndarray):
        self.line = np.asarray(rows, dtype=float).reshape(-1, 4)
        self.factor = np.asarray(factor, dtype=float).reshape(-1)
        self.size = len(self.factor)
        # each row is its own whole piece (r is monotone along a line), for the series
        n = self.size
        self.whole = np.arange(n)
        self.quarters = np.column_stack([np.arange(n), np.arange(n) + 1]).reshape(-1, 2)
        self.whole_r = np.sort(self.line[:, [1, 3]], axis=1)
        #: pieces the series may take: not a flat face (its parameter, z, does not move)
        self.series_ok = self.line[:, 0] != self.line[:, 2]

    def extent(self) -> Tuple[float, float, float]:
        """``(z_lo, z_hi, r_max)`` of the rows (z from the profile's middle)."""
        if not self.size:
            return math.inf, -math.inf, 0.0
        z, r = self.line[:, [0, 2]], self.line[:, [1, 3]]
        return float(z.min()), float(z.max()), float(r.max())

    def sort_levels(self, kind: int, jobs: "_Jobs", y, d, r_max: float, V, A, budget=None) -> None:
        """Closed forms of every row at every level into ``V``, ``A``; nearly flat cones to ``jobs``.

        Many shallow rows go through the series first (:func:`_series_levels`); the
        (row, level) pairs it leaves take the closed forms pair by pair.
        """
        if not self.size:
            return
        if budget is not None:
            pairs = _series_levels(self, kind, y, V, A, self.line[:, 0], self.line[:, 2], budget)
            if pairs is not None:
                self._closed_pairs(kind, jobs, pairs[0], pairs[1], y, d, r_max, V, A)
                return
        nY = d.size
        z0, r0, z1, r1 = (self.line[:, i][:, None] for i in range(4))
        f = self.factor[:, None]
        yy = y[None, :]
        dz, dr = z1 - z0, r1 - r0
        length = np.hypot(dz, dr)
        # S, F and the wetted arc at each distinct end radius once (lines share their ends).
        radii, where_ = np.unique(np.concatenate([self.line[:, 1], self.line[:, 3]]),
                                  return_inverse=True)
        ru = radii[:, None]
        top = (2.0 * r_max - d)[None, :]           # r_max - y: the height left above the liquid
        rpy, rmy = (ru - r_max) + d[None, :], (ru - r_max) + top
        S_u = segment_area(ru, yy, rpy, rmy)
        i0, i1 = where_[:self.size], where_[self.size:]
        s0, s1 = S_u[i0], S_u[i1]
        cyl, radial, cone, steep, ratio, lratio = _straight_classes(dz, dr, length)
        vol = np.where(cyl, s0 * dz, 0.0)
        if cone.any():
            F_u = segment_area_integral(ru, yy)
            vol = vol + np.where(cone, ratio * (F_u[i1] - F_u[i0]), 0.0)
        area = np.where(radial | cone, np.where(radial, 1.0, lratio) * np.abs(s1 - s0), 0.0)
        if cyl.any():
            W_u = wetted_arc(ru, yy, rpy, rmy)
            area = area + np.where(cyl, W_u[i0] * length, 0.0)
        V += (-f * vol).sum(axis=0)
        A += area.sum(axis=0)
        # Nearly flat cones: quadrature, split where the level is tangent.
        st = np.flatnonzero(steep[:, 0])
        if st.size:
            rows, lv = np.repeat(st, nY), np.tile(np.arange(nY), st.size)
            L_ = self.line
            _sort_pairs(jobs, kind, rows, lv, L_[:, 0], L_[:, 2], L_[:, 1], L_[:, 3], self.factor,
                        y, self.parameter_at_r, V, A, washer=self.washer)

    def _closed_pairs(self, kind, jobs, rows, lv, y, d, r_max, V, A) -> None:
        """The closed forms of :meth:`sort_levels` for given (row, level) pairs."""
        if rows.size == 0:
            return
        z0, r0, z1, r1 = (self.line[rows, i] for i in range(4))
        f = self.factor[rows]
        yy, dd = y[lv], d[lv]
        top = 2.0 * r_max - dd
        dz, dr = z1 - z0, r1 - r0
        length = np.hypot(dz, dr)
        rpy0, rmy0 = (r0 - r_max) + dd, (r0 - r_max) + top
        s0 = segment_area(r0, yy, rpy0, rmy0)
        s1 = segment_area(r1, yy, (r1 - r_max) + dd, (r1 - r_max) + top)
        cyl, radial, cone, steep, ratio, lratio = _straight_classes(dz, dr, length)
        vol = np.where(cyl, s0 * dz, 0.0)
        if cone.any():
            vol = vol + np.where(cone, ratio * (segment_area_integral(r1, yy)
                                                - segment_area_integral(r0, yy)), 0.0)
        area = np.where(radial | cone, np.where(radial, 1.0, lratio) * np.abs(s1 - s0), 0.0)
        if cyl.any():
            area = area + np.where(cyl, wetted_arc(r0, yy, rpy0, rmy0) * length, 0.0)
        V += np.bincount(lv, weights=-f * vol, minlength=V.size)
        A += np.bincount(lv, weights=area, minlength=A.size)
        if steep.any():
            L_ = self.line
            _sort_pairs(jobs, kind, rows[steep], lv[steep], L_[:, 0], L_[:, 2], L_[:, 1], L_[:, 3],
                        self.factor, y, self.parameter_at_r, V, A, washer=self.washer)

    def parameter_at_r(self, rows, rr):
        """z (the parameter of straight rows) where rows reach radii ``rr``."""
        z0, r0, z1, r1 = (self.line[rows, i] for i in range(4))
        return z0 + (rr - r0) * (z1 - z0) / (r1 - r0)

    def washer(self, rows, a, b):
        """Washer volume and swept surface of rows between z = a and z = b."""
        z0, r0, z1, r1 = (self.line[rows, i] for i in range(4))
        slope = (r1 - r0) / (z1 - z0)
        ra, rb = r0 + (a - z0) * slope, r0 + (b - z0) * slope
        vol = _line_washer(a, ra, b, rb)
        surf = 2.0 * PI * np.hypot(b - a, rb - ra) * (ra + rb) / 2.0
        return vol, surf

    def radii(self, rows, p, r_max: float):
        """r, dz/dp, ds/dp and r - r_max at parameters ``p`` (z) of rows (shape of p)."""
        z0, r0, z1, r1 = (self.line[rows, i][:, None] for i in range(4))
        slope = (r1 - r0) / (z1 - z0)
        step = (p - z0) * slope
        return (r0 + step, np.ones(p.shape), np.broadcast_to(np.sqrt(1.0 + slope * slope), p.shape),
                (r0 - r_max) + step)

    def rounding(self) -> float:
        return 0.0


class _SplitRows:
    """Rows cut where r turns back (``rows``, r monotone on each) and the whole segments.

    ``whole`` are the row indices of the whole segments, ``whole_r`` their r range and
    ``quarters[k]`` the first and stop row of whole segment k's cut rows. Whole rows
    are used where no level is tangent to their circles; cut rows where one is.
    """

    def _sort(self, kind, jobs, y, V, A, pa, pb, ra, rb, washer, budget=None):
        pairs = None if budget is None else _series_levels(self, kind, y, V, A, pa, pb, budget)
        sub = _sort_wholes(jobs, kind, self.whole, self.whole_r, self.quarters, pa, pb,
                           self.factor, y, V, A, washer=washer, pairs=pairs)
        if sub is not None:
            _sort_pairs(jobs, kind, sub[0], sub[1], pa, pb, ra, rb, self.factor, y,
                        self.parameter_at_r, V, A, washer=washer)


class CircularRows(_SplitRows):
    """Arcs: rows ``cz, cr, R, angle from, angle to`` (cz from the profile's middle).

    Built by :meth:`from_pieces` from each arc's centre and radius and its pieces
    between the ends and every quarter turn inside.

    >>> t = CircularRows.from_pieces(np.array([[0.0, 0.0, 1.0]]), np.array([0, 0]),
    ...                              np.array([0.0, math.pi / 2]), np.array([math.pi / 2, math.pi]),
    ...                              np.array([1.0]))
    >>> t.arc.shape, t.whole.tolist(), t.quarters.tolist(), t.whole_r.tolist()
    ((3, 5), [2], [[0, 2]], [[0.0, 1.0]])
    """

    cosine = False

    def __init__(self, arc, factor, whole, whole_r, quarters):
        self.arc, self.factor = arc, factor
        self.whole, self.whole_r, self.quarters = whole, whole_r, quarters
        self.size = len(factor)

    @classmethod
    def from_pieces(cls, centres, arc, a_from, a_to, factors) -> "CircularRows":
        """From each arc's ``(cz, cr, R)`` and its pieces (``arc`` index, angles from and to,
        grouped by arc in travel order, with no level tangent inside any)."""
        n = len(centres)
        quarters = np.column_stack([centres[arc], a_from, a_to]).reshape(-1, 5)
        first = np.searchsorted(arc, np.arange(n), side="left")
        stop = np.searchsorted(arc, np.arange(n), side="right")
        wholes = np.column_stack([centres, a_from[first], a_to[stop - 1]]).reshape(-1, 5)
        nq = len(quarters)
        # r at the pieces' ends: its range over each whole arc
        r_from = quarters[:, 1] + quarters[:, 2] * np.sin(a_from)
        r_to = quarters[:, 1] + quarters[:, 2] * np.sin(a_to)
        lo, hi = np.minimum(r_from, r_to), np.maximum(r_from, r_to)
        whole_r = np.column_stack([np.minimum.reduceat(lo, first), np.maximum.reduceat(hi, first)]) \
            if nq else np.zeros((0, 2))
        return cls(np.vstack([quarters, wholes]),
                   np.concatenate([factors[arc], factors]).astype(float),
                   np.arange(nq, nq + n), whole_r.reshape(-1, 2),
                   np.column_stack([first, stop]).astype(int).reshape(-1, 2))

    def extent(self) -> Tuple[float, float, float]:
        if not self.size:
            return math.inf, -math.inf, 0.0
        cz, cr, R, a0, a1 = self.arc.T
        z = np.concatenate([cz + R * np.cos(a0), cz + R * np.cos(a1)])
        return float(z.min()), float(z.max()), float(self.whole_r[:, 1].max())

    def sort_levels(self, kind, jobs, y, d, r_max, V, A, budget=None) -> None:
        if not self.size:
            return
        cz, cr, R, a0, a1 = self.arc.T
        self._sort(kind, jobs, y, V, A, a0, a1, cr + R * np.sin(a0), cr + R * np.sin(a1),
                   self.washer, budget)

    def parameter_at_r(self, rows, rr):
        cz, cr, R, a0, a1 = (self.arc[rows, i] for i in range(5))
        return _arc_angle_at_r(cz, cr, R, a0, a1, rr)

    def washer(self, rows, a, b):
        cz, cr, R = (self.arc[rows, i] for i in range(3))
        vol = _arc_washer(cz, cr, R, a, b)
        _, r_ds = _arc_moments(cz, cr, R, a, b)
        return vol, 2.0 * PI * r_ds

    def radii(self, rows, p, r_max: float):
        cr, R = (self.arc[rows, i][:, None] for i in (1, 2))
        st = np.sin(p)
        r = cr + R * st
        return r, -R * st, np.broadcast_to(R, p.shape), r - r_max

    def rounding(self) -> float:
        """Arcs are written about their centres; for a flat arc (radius ≫ chord) the terms of
        size (|cr| + R)² R |sweep| cancel to a much smaller volume. Their rounding is part of
        the error, so the estimate stays honest (negligible for ordinary arcs)."""
        cz, cr, R, a0, a1 = (self.arc[self.whole, i] for i in range(5))
        return 16 * np.finfo(float).eps * float(np.sum(PI * (np.abs(cr) + R) ** 2 * R
                                                       * np.abs(a1 - a0)))


class ParametricRows(_SplitRows):
    """Pieces of any kind by quadrature: ``(segment, p from, p to)``, the segment contract only.

    >>> import sympy
    >>> from revolve.geometry.segments import Curve
    >>> t = sympy.Symbol("t", real=True)
    >>> dome = Curve(sympy.cos(t), sympy.sin(t), 0.0, math.pi)
    >>> rows = ParametricRows.from_parameters([(dome, [0.0, math.pi / 2, math.pi])], [1.0])
    >>> [(round(a, 6), round(b, 6)) for _, a, b in rows.curves], rows.whole_r.tolist()
    ([(0.0, 1.570796), (1.570796, 3.141593), (0.0, 3.141593)], [[0.0, 1.0]])
    """

    cosine = True

    def __init__(self, curves, factor, whole, whole_r, quarters, extent):
        self.curves, self.factor = curves, factor
        self.whole, self.whole_r, self.quarters = whole, whole_r, quarters
        self._extent = extent
        self.size = len(factor)

    @classmethod
    def from_parameters(cls, segments, factors) -> "ParametricRows":
        """From ``(segment, parameters)`` per segment: its ends and where r turns back, in order."""
        parts, pf, wholes, wf, wr, wq = [], [], [], [], [], []
        z_lo, z_hi = math.inf, -math.inf
        for (seg, params), f in zip(segments, factors):
            first = len(parts)
            parts += [(seg, p, q) for p, q in zip(params[:-1], params[1:]) if p != q]
            pf += [f] * (len(parts) - first)
            rs = seg.points_at(params)[:, 1]
            wholes.append((seg, params[0], params[-1]))
            wf.append(f)
            wr.append((float(rs.min()), float(rs.max())))
            wq.append((first, len(parts)))
            x0, _, x1, _ = seg.bounds()
            z_lo, z_hi = min(z_lo, x0), max(z_hi, x1)
        nc = len(parts)
        whole_r = np.array(wr, dtype=float).reshape(-1, 2)
        r_max = float(whole_r[:, 1].max()) if len(wr) else 0.0
        return cls(tuple(parts + wholes), np.array(pf + wf, dtype=float),
                   np.arange(nc, nc + len(wholes)), whole_r, np.array(wq, dtype=int).reshape(-1, 2),
                   (z_lo, z_hi, r_max))

    def extent(self) -> Tuple[float, float, float]:
        return self._extent

    def sort_levels(self, kind, jobs, y, d, r_max, V, A, budget=None) -> None:
        if not self.size:
            return
        ta = np.array([c[1] for c in self.curves])
        tb = np.array([c[2] for c in self.curves])
        ends = np.array([c[0].points_at([c[1], c[2]])[:, 1] for c in self.curves])
        self._sort(kind, jobs, y, V, A, ta, tb, ends[:, 0], ends[:, 1], None, budget)

    def parameter_at_r(self, rows, rr):
        out = np.empty(rr.shape)
        for row in np.unique(rows):
            m = rows == row
            seg, ta, tb = self.curves[row]
            out[m] = parameters_at_values(seg, ta, tb, rr[m], coordinate=1)
        return out

    def radii(self, rows, p, r_max: float):
        r, dz, ds = (np.empty(p.shape) for _ in range(3))
        for row in np.unique(rows):
            m = rows == row
            seg = self.curves[row][0]
            pp = p[m]
            with np.errstate(all="ignore"):
                r[m] = seg.points_at(pp.ravel())[:, 1].reshape(pp.shape)
                tangent = seg.tangents_at(pp.ravel())
                dz[m] = tangent[:, 0].reshape(pp.shape)
                ds[m] = np.hypot(tangent[:, 0], tangent[:, 1]).reshape(pp.shape)
        return r, dz, ds, r - r_max

    def rounding(self) -> float:
        return 0.0


@dataclass(frozen=True, eq=False)
class HorizontalPieces:
    """The closed loops of a prepared profile, ready for level integrals.

    ``tables`` holds one table per segment kind present (each kind's
    ``radial_level_table``: :class:`StraightRows`, :class:`CircularRows` or
    :class:`ParametricRows`). ``z`` is measured from ``z_ref``, the middle of
    the profile; ``r_max`` is the largest distance from the axis and
    ``length`` the axial extent.
    """

    tables: tuple
    z_ref: float
    r_max: float
    length: float


def horizontal_pieces(prep: PreparedProfile,
                      loop_factors: Optional[Sequence[float]] = None) -> HorizontalPieces:
    """Split the closed loops for :func:`horizontal_levels` (see :class:`HorizontalPieces`).

    >>> from revolve.geometry.segments import Line, arc_from_centre
    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
    >>> p = horizontal_pieces(prepare(Profile(loops=(Loop((half, Line((-1.0, 0.0), (1.0, 0.0)))),)), Axis.x()))
    >>> [type(t).__name__ for t in p.tables], p.r_max, p.length
    (['CircularRows', 'StraightRows'], 1.0, 2.0)
    """
    if loop_factors is None:
        loop_factors = prep.loop_factors
    pairs = list(_loop_segments(prep, loop_factors))
    if not pairs:
        return HorizontalPieces((), 0.0, 0.0, 0.0)
    zs = [c for s, _ in pairs for c in (s.start[0], s.end[0])]
    z_ref = float((min(zs) + max(zs)) / 2)
    r_max = max(max(s.start[1], s.end[1]) for s, _ in pairs)
    groups = kind_groups(pairs)
    tables = tuple(kind.radial_level_table(segs, fs, z_ref) for kind, (segs, fs) in groups.items())
    tables = tuple(t for t in tables if t.size)
    z_lo, z_hi = min(zs) - z_ref, max(zs) - z_ref
    for t in tables:
        lo, hi, rm = t.extent()
        z_lo, z_hi, r_max = min(z_lo, lo), max(z_hi, hi), max(r_max, rm)
    return HorizontalPieces(tables, z_ref, float(r_max), float(z_hi - z_lo))


# -- closed forms ---------------------------------------------------------------------------

def _arc_washer(cz, cr, R, a, b):
    """π ∫ r² dz along arcs from angle a to b (signed, dz = -R sin θ dθ)."""
    d = b - a
    m = 0.5 * (a + b)
    sh = np.sin(0.5 * d)
    dcos = -2.0 * np.sin(m) * sh
    dsin2t = 2.0 * np.cos(a + b) * np.sin(d)
    ca, cb = np.cos(a), np.cos(b)
    dcos3 = dcos * (ca * ca + ca * cb + cb * cb)
    return -PI * R * (-cr * cr * dcos + 2.0 * cr * R * (d / 2.0 - dsin2t / 4.0)
                      + R * R * (-dcos + dcos3 / 3.0))


def _line_washer(z0, r0, z1, r1):
    return PI * (z1 - z0) * (r0 * r0 + r0 * r1 + r1 * r1) / 3.0


# -- quadrature jobs -------------------------------------------------------------------------

#: How a job's variable u in [0, 1] maps to the piece's parameter p on [pa, pb]:
#: straight, squared towards pa or towards pb (a tangency there: (p - p*)^{3/2} becomes
#: smooth in u), or p = m - h cos(π u) (curves: smooth at ends with a vertical tangent).
STRAIGHT, TOWARDS_START, TOWARDS_END, COSINE = 0, 1, 2, 3


@dataclass(eq=False)
class _Jobs:
    """Intervals still to integrate: table and row, level, parameter map, u range."""

    kind: np.ndarray     # which table of HorizontalPieces.tables the piece is a row of
    piece: np.ndarray
    level: np.ndarray    # index into the levels
    mapping: np.ndarray
    pa: np.ndarray
    pb: np.ndarray
    ua: np.ndarray
    ub: np.ndarray

    FIELDS = ("kind", "piece", "level", "mapping", "pa", "pb", "ua", "ub")

    @classmethod
    def empty(cls):
        z = np.zeros(0)
        i = np.zeros(0, dtype=int)
        return cls(i, i, i, i, z, z, z, z)

    def extend(self, kind, piece, level, pa, pb, mapping) -> None:
        n = np.size(piece)
        if n == 0:
            return
        new = (np.full(n, kind, dtype=int), np.asarray(piece, dtype=int).ravel(),
               np.asarray(level, dtype=int).ravel(),
               np.broadcast_to(np.asarray(mapping, dtype=int), (n,)).ravel(),
               np.asarray(pa, dtype=float).ravel(), np.asarray(pb, dtype=float).ravel(),
               np.zeros(n), np.ones(n))
        for name, arr in zip(self.FIELDS, new):
            setattr(self, name, np.concatenate([getattr(self, name), arr]))

    def take(self, mask) -> "_Jobs":
        return _Jobs(*(getattr(self, f)[mask] for f in self.FIELDS))

    def halve(self) -> "_Jobs":
        mid = 0.5 * (self.ua + self.ub)
        parts = [np.tile(getattr(self, f), 2) for f in self.FIELDS[:6]]
        return _Jobs(*parts, np.concatenate([self.ua, mid]), np.concatenate([mid, self.ub]))

    def __len__(self) -> int:
        return self.kind.size


def _concat(parts) -> _Jobs:
    if not parts:
        return _Jobs.empty()
    return _Jobs(*(np.concatenate([getattr(p, f) for p in parts]) for f in _Jobs.FIELDS))


def _parameter(jobs: _Jobs, u):
    """p(u) and dp/du for each job's mapping (arrays shaped like u)."""
    pa, pb = jobs.pa[:, None], jobs.pb[:, None]
    span = pb - pa
    mp = jobs.mapping
    if not mp.any():                                   # all straight: the common case
        return pa + span * u, np.broadcast_to(span, u.shape)
    p = np.empty(u.shape)
    dp = np.empty(u.shape)
    for kind in np.unique(mp):
        rows = np.flatnonzero(mp == kind)
        uu, a, b, sp = u[rows], pa[rows], pb[rows], span[rows]
        if kind == STRAIGHT:
            p[rows], dp[rows] = a + sp * uu, sp
        elif kind == TOWARDS_START:
            p[rows], dp[rows] = a + sp * uu * uu, 2.0 * sp * uu
        elif kind == TOWARDS_END:
            p[rows], dp[rows] = b - sp * (1.0 - uu) ** 2, 2.0 * sp * (1.0 - uu)
        else:
            p[rows] = 0.5 * (a + b) - 0.5 * sp * np.cos(PI * uu)
            dp[rows] = 0.5 * PI * sp * np.sin(PI * uu)
    return p, dp


_RULES: dict = {}


def _rule(n: int):
    """Gauss–Legendre nodes and a (n, 5) weight matrix: the integral and the Legendre
    coefficients of degrees n-1 ... n-4 of the integrand's interpolant."""
    if n not in _RULES:
        x, w = gauss_legendre(n)
        V = legendre_table(x, n - 1)
        coefficients = [(2 * k + 1) / 2.0 * w * V[:, k] for k in (n - 1, n - 2, n - 3, n - 4)]
        _RULES[n] = (x, np.column_stack([w] + coefficients))
    return _RULES[n]


def _error_estimate(q: np.ndarray, n: int) -> np.ndarray:
    """Error of an n-point Gauss–Legendre sum from the decay of its last Legendre coefficients.

    ``q`` holds, per interval, the sum and the coefficients a_{n-1} ... a_{n-4}
    (see :func:`_rule`). With the coefficients falling by a factor ρ per degree
    (measured from the last two pairs), the first one the rule misses, a_{2n},
    is about a_{n-1} ρ^{n+1}; where they do not fall (ρ = 1) the estimate is
    the last coefficients themselves, which is generous. Times 10 for safety.
    """
    last = np.maximum(np.abs(q[:, 1]), np.abs(q[:, 2]))
    before = np.maximum(np.abs(q[:, 3]), np.abs(q[:, 4]))
    with np.errstate(divide="ignore", invalid="ignore"):
        rho = np.where(before > 0, np.sqrt(last / np.where(before > 0, before, 1.0)), 1.0)
    rho = np.where(last > 0, np.minimum(rho, 1.0), 0.0)
    return 20.0 * last * rho ** (n + 1)


def _radii(jobs: _Jobs, pieces: HorizontalPieces, p):
    """r, dz/dp, ds/dp and r - r_max at parameters p of jobs, each from its table."""
    first = int(jobs.kind[0]) if len(jobs) else 0
    if (jobs.kind == first).all():      # one table: the common case, no scattering
        return pieces.tables[first].radii(jobs.piece, p, pieces.r_max)
    out = [np.empty(p.shape) for _ in range(4)]
    for k in np.unique(jobs.kind):
        sel = np.flatnonzero(jobs.kind == k)
        vals = pieces.tables[int(k)].radii(jobs.piece[sel], p[sel], pieces.r_max)
        for o, v in zip(out, vals):
            o[sel] = v
    return tuple(out)


def _evaluate_jobs(jobs: _Jobs, pieces: HorizontalPieces, y, depth, n: int):
    """Quadrature of S dz/dp and W ds/dp over each job with n nodes.

    Returns the two integrals and their error estimates (arrays (jobs,), see
    :func:`_error_estimate`).
    """
    x, weights = _rule(n)
    # The interval's two ends too: a kink of the boundary in the sliver between an end
    # and the nearest node is seen by no rule, but the end value then departs from the
    # interpolant (below).
    x = np.concatenate([x, [-1.0, 1.0]])
    half_u = 0.5 * (jobs.ub - jobs.ua)
    u = 0.5 * (jobs.ua + jobs.ub)[:, None] + half_u[:, None] * x[None, :]
    p, dp = _parameter(jobs, u)
    r, dz, ds, r_less_max = _radii(jobs, pieces, p)
    yy = y[jobs.level][:, None]
    d = depth[jobs.level][:, None]
    rpy = np.clip(r_less_max + d, 0.0, None)                        # r + y = (r - r_max) + depth
    rmy = np.clip(r_less_max + (2.0 * pieces.r_max - d), 0.0, None)  # r - y, the same way
    jac = dp * half_u[:, None]
    with np.errstate(all="ignore"):
        angle = _half_angle(r, rpy, rmy)                              # acos(-y/r)
        area = r * r * angle + yy * np.sqrt(rpy * rmy)                   # S: 0 and π r² at the ends
        gv = area * dz * jac
        ga = (2.0 * r * angle) * ds * np.abs(jac)
    if any(t.cosine for t in pieces.tables):
        # a curve's derivative may be infinite at an end node of a cosine map
        gv, ga = np.nan_to_num(gv), np.nan_to_num(ga)
    # einsum, not matmul: a BLAS call for an inner size of n is slower than a plain loop
    qv = np.einsum("jn,nk->jk", gv[:, :n], weights)
    qa = np.einsum("jn,nk->jk", ga[:, :n], weights)
    ev, ea = _error_estimate(qv, n), _error_estimate(qa, n)
    # End check (not at a piece's own ends, where a map may make the integrand 0 or undefined):
    # a kink hidden in an end sliver moves the end value away from the interpolant by about
    # the jump of slope times the sliver, and the sliver holds at most that times its width.
    to_lo, to_hi = _end_weights(n)
    sliver = 1.0 - float(x[:n].max())
    inner_lo, inner_hi = jobs.ua > 0.0, jobs.ub < 1.0
    for g, e in ((gv, ev), (ga, ea)):
        with np.errstate(all="ignore"):
            miss = (np.abs(g[:, :n] @ to_lo - g[:, n]) * inner_lo
                    + np.abs(g[:, :n] @ to_hi - g[:, n + 1]) * inner_hi) * sliver
        np.maximum(e, np.nan_to_num(miss, nan=np.inf, posinf=np.inf), out=e)
    return qv[:, 0], qa[:, 0], ev, ea


def _arc_angle_at_r(cz, cr, R, a, b, rr):
    """Angle in an arc piece within one quarter turn where cr + R sin θ = rr (vectorised)."""
    mid = 0.5 * (a + b)
    q = np.floor(mid / (PI / 2))
    qm = np.mod(q, 4)
    base = (q - qm) * (PI / 2)
    v = np.clip((rr - cr) / R, -1.0, 1.0)
    t0 = np.arctan2(v, np.sqrt(np.maximum((1 - v) * (1 + v), 0.0)))   # asin(v)
    return base + np.where(qm == 0, t0, np.where(qm == 3, 2 * PI + t0, PI - t0))



@dataclass(frozen=True, eq=False)
class HorizontalLevels:
    """Volume and wetted inside area at each depth (arrays, profile units).

    ``error`` is the estimate of the quadrature error in the volume at each
    depth (absolute): the sum of the intervals' estimates (zero where every
    piece is in closed form).
    """

    depth: np.ndarray
    volume: np.ndarray
    wetted_area: np.ndarray
    error: np.ndarray
    r_max: float


def horizontal_levels(prep: PreparedProfile, depths, loop_factors: Optional[Sequence[float]] = None,
                      pieces: Optional[HorizontalPieces] = None, rel_tol: float = 1e-11,
                      order: int = 8, max_rounds: int = 30, max_jobs: int = 3_000_000,
                      chunk: int = 4096, max_work: int = 4_000_000) -> HorizontalLevels:
    """Volume and wetted area at each liquid depth, the axis horizontal.

    Parameters
    ----------
    prep : PreparedProfile
        The liquid space (closed loops) in the axis frame.
    depths : array_like
        Depths of liquid measured from the lowest inside point (``r_max``
        below the axis), in the profile's unit; 0 is empty, ``2 r_max`` full.
    loop_factors : sequence of float, optional
        As :attr:`revolve.geometry.checks.PreparedProfile.loop_factors` (worked out when not given).
    pieces : HorizontalPieces, optional
        Reuse the split of an earlier call.
    rel_tol : float
        Target for the sum of the error estimates at one depth, relative to
        the volume (π r_max² · length) or surface (2π r_max · length) of the
        bounding cylinder: each interval may carry this divided by the number
        of pieces; intervals above that are halved.
    order : int
        Gauss–Legendre nodes per interval on straight and squared maps
        (lines and arcs); curves, on the cosine map, use twice as many.
    max_rounds, max_jobs, max_work : int
        Limits of the halving: after that many rounds, once more intervals
        than ``max_jobs`` wait, or once the intervals evaluated so far and
        those waiting pass ``max_work`` (which bounds the time of a call
        whatever the curve), the last round takes what is left (with its
        error estimate, which is reported).

    Returns
    -------
    HorizontalLevels

    Examples
    --------
    A ball of radius 1 (a half circle on the axis) filled to depth h holds a
    spherical cap, π h² (3 - h)/3 (CRC):

    >>> from revolve.geometry.segments import Line, arc_from_centre
    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
    >>> prep = prepare(Profile(loops=(Loop((half, Line((-1.0, 0.0), (1.0, 0.0)))),)), Axis.x())
    >>> h = 0.7
    >>> v = horizontal_levels(prep, [h]).volume[0]
    >>> bool(abs(v / (math.pi * h * h * (3 - h) / 3) - 1) < 1e-12)
    True
    """
    d = np.atleast_1d(np.asarray(depths, dtype=float))
    pc = pieces if pieces is not None else horizontal_pieces(prep, loop_factors)
    Rm = pc.r_max
    y = d - Rm
    nY = d.size
    V = np.zeros(nY)
    A = np.zeros(nY)
    E = np.zeros(nY)
    jobs = _Jobs.empty()
    share = rel_tol / max(1, sum(t.size for t in pc.tables))
    tol_v = share * PI * Rm * Rm * max(pc.length, Rm)
    tol_a = share * 2.0 * PI * Rm * max(pc.length, Rm)
    for kind, table in enumerate(pc.tables):
        table.sort_levels(kind, jobs, y, d, Rm, V, A, budget=(tol_v, tol_a, E, Rm))
    # Quadrature, vectorised over levels and pieces, halving intervals not yet resolved.
    factors = tuple(t.factor for t in pc.tables)
    round_no = 0
    work = 0
    while len(jobs):
        final = round_no >= max_rounds
        work += len(jobs)
        undone = []
        for start in range(0, len(jobs), chunk):
            part = jobs.take(slice(start, start + chunk))
            cosine = part.mapping == COSINE
            if not cosine.any():
                v, a, ev, ea = _evaluate_jobs(part, pc, y, d, order)
            else:
                v, a, ev, ea = (np.empty(len(part)) for _ in range(4))
                for sel, n in ((~cosine, order), (cosine, 2 * order)):
                    if sel.any():
                        v[sel], a[sel], ev[sel], ea[sel] = _evaluate_jobs(part.take(sel), pc, y,
                                                                          d, n)
            fac = np.empty(len(part))
            for kind, arr in enumerate(factors):
                m = part.kind == kind
                if m.any():
                    fac[m] = arr[part.piece[m]]
            # Stop halving where rounding, not the rule, limits the estimate (intervals a
            # millionth of the piece, or too many of them): the estimate is reported.
            good = (ev <= tol_v) & (ea <= tol_a) | ((part.ub - part.ua) < MIN_WIDTH) | final
            np.add.at(V, part.level[good], -fac[good] * v[good])
            np.add.at(A, part.level[good], a[good])
            np.add.at(E, part.level[good], ev[good])
            if not good.all():
                undone.append(part.take(~good).halve())
        jobs = _concat(undone)
        round_no += 1
        if len(jobs) > max_jobs or work + len(jobs) > max_work:
            max_rounds = round_no       # the next round is the last: it takes what is left
    E += sum(t.rounding() for t in pc.tables)
    return HorizontalLevels(d, V, A, E, Rm)




def _sort_wholes(jobs: _Jobs, kind: int, whole_rows, whole_r, quarters, pa, pb, factor, y,
                 V, A, washer, pairs=None):
    """Whole arcs or curves against levels: closed forms and whole-piece jobs.

    ``pairs`` (whole index, level index) limits the work to those pairs (all
    by default). Returns the (quarter row, level) pairs where a level is
    tangent to a whole piece's circles, for :func:`_sort_pairs`, or None.
    """
    nW, nY = whole_rows.size, y.size
    if nW == 0:
        return None
    if pairs is None:
        W = np.broadcast_to(np.arange(nW)[:, None], (nW, nY))
        Y = np.broadcast_to(np.arange(nY)[None, :], (nW, nY))
    else:
        W, Y = pairs
        if W.size == 0:
            return None
    rlo, rhi = whole_r[W, 0], whole_r[W, 1]
    yy = y[Y]
    above = yy >= rhi
    whole = (yy > -rhi) & ~above & (np.abs(yy) < rlo)
    split = (yy > -rhi) & ~above & ~whole
    curve = washer is None
    if above.any():
        rows, lv = whole_rows[W[above]], Y[above]
        if not curve:
            vol, surf = washer(rows, pa[rows], pb[rows])
            np.add.at(V, lv, -factor[rows] * vol)
            np.add.at(A, lv, surf)
        else:
            jobs.extend(kind, rows, lv, pa[rows], pb[rows], COSINE)
    if whole.any():
        rows, lv = whole_rows[W[whole]], Y[whole]
        jobs.extend(kind, rows, lv, pa[rows], pb[rows], COSINE if curve else STRAIGHT)
    if not split.any():
        return None
    w_, lv = W[split], Y[split]
    first, stop = quarters[w_, 0], quarters[w_, 1]
    count = stop - first
    rows = np.repeat(first, count) + (np.arange(count.sum()) - np.repeat(np.cumsum(count) - count,
                                                                           count))
    return rows, np.repeat(lv, count)


def _sort_pairs(jobs: _Jobs, kind: int, rows, lv, pa, pb, ra, rb, factor, y, param_at_r,
                V, A, washer) -> None:
    """Sort (piece, level) pairs into closed forms and quadrature jobs, split at tangency.

    ``rows``, ``lv``: the pairs (piece row, level index). Per piece row:
    ``pa``, ``pb`` the parameter interval, ``ra``, ``rb`` r at its ends (r is
    monotone on these pieces), ``factor`` the loop factor.
    ``washer(rows, a, b)`` gives the washer volume and surface of
    sub-intervals in closed form (None for curves: quadrature throughout).
    """
    if rows.size == 0:
        return
    lo = np.minimum(ra[rows], rb[rows])
    hi = np.maximum(ra[rows], rb[rows])
    yv = y[lv]
    below = yv <= -hi                          # liquid surface under the whole piece: nothing
    above = yv >= hi                           # over the whole piece: the full washer
    whole = ~below & ~above & (np.abs(yv) < lo)
    split = ~below & ~above & ~whole           # tangent inside the piece or at its end
    curve = washer is None
    if above.any():
        r_, l_ = rows[above], lv[above]
        if not curve:
            vol, surf = washer(r_, pa[r_], pb[r_])
            np.add.at(V, l_, -factor[r_] * vol)
            np.add.at(A, l_, surf)
        else:
            jobs.extend(kind, r_, l_, pa[r_], pb[r_], COSINE)
    if whole.any():
        r_, l_ = rows[whole], lv[whole]
        jobs.extend(kind, r_, l_, pa[r_], pb[r_], COSINE if curve else STRAIGHT)
    if split.any():
        r_, l_ = rows[split], lv[split]
        ps = param_at_r(r_, np.abs(y[l_]))
        rising = rb[r_] > ra[r_]
        # The part with r > |y| is integrated, its nodes gathered towards the tangency;
        # the part with r < |y| lies wholly above or below the liquid surface.
        mapping = COSINE if curve else np.where(rising, TOWARDS_START, TOWARDS_END)
        jobs.extend(kind, r_, l_, np.where(rising, ps, pa[r_]), np.where(rising, pb[r_], ps),
                    mapping)
        wet = y[l_] > 0
        if wet.any():
            in_a = np.where(rising, pa[r_], ps)[wet]
            in_b = np.where(rising, ps, pb[r_])[wet]
            if not curve:
                vol, surf = washer(r_[wet], in_a, in_b)
                np.add.at(V, l_[wet], -factor[r_[wet]] * vol)
                np.add.at(A, l_[wet], surf)
            else:
                jobs.extend(kind, r_[wet], l_[wet], in_a, in_b, COSINE)
