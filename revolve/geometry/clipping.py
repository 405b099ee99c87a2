"""Clipping a section at an axial level: the part with ``z <= level``, and level volumes.

A prepared profile (see :mod:`revolve.geometry.checks`) lies in the axis
frame: ``z`` along the axis, ``r`` the distance from it. Cutting the
revolved solid by the plane perpendicular to the axis at ``z = level`` cuts
its section along the straight line ``z = level``; the part of the solid
below the plane is the revolution of the part of the section below that
line. This module builds that part exactly and measures it:

* :func:`clip_section` returns the clipped section as a prepared profile.
  Each segment gives its own part below the level (its kind's
  ``part_below``): lines are cut into lines, polylines into runs of the same
  array, arcs into arcs about the same centre, curves into the same curve on
  a shorter parameter interval (the cut parameter found by bisection on the
  parameter, to the last bit). Where the boundary leaves the
  half plane ``z <= level`` and comes back, a straight cut is added along the
  line ``z = level`` (the liquid surface, for a vessel). This is the
  half-plane step of Sutherland–Hodgman clipping, which stays exact for a
  section of any shape: the winding number of the clipped loop equals the
  original one below the level and zero above it, so Green's theorem gives
  the area moments of the clipped part exactly, even where cuts overlap.
* Pappus–Guldinus on the clipped section (volume = 2π ∫∫ r dA) is the
  volume below the level; the swept area of the original boundary below the
  level (2π ∫ r ds, the cuts left out) is the wetted inside surface.
* :func:`vertical_levels` does the same for many levels at once: a piece
  wholly below a level counts whole (the whole pieces' sums, sorted by their
  tops, are accumulated once), and only the pieces a level crosses are cut,
  with the closed forms of sub-lines and sub-arcs (and cumulative
  Gauss–Legendre sums for curves). A table of a thousand levels on a
  thousand lines costs a few sorts and a few thousand closed forms.

Each kind gives its segments as a table of *pieces* along which ``z`` moves
one way only (its ``axial_level_table``: straight, circular or parametric
rows, see :func:`axial_pieces`); each piece crosses a level at most once. No
algorithm here asks which kind a segment is.

Both computations use Green's theorem in the form ``∫∫ r dA = -½ ∮ r² dz``,
with ``r`` measured from a reference radius ``r₀`` near the bottom
(``∫∫ r dA = r₀ A + ∫∫ (r - r₀) dA``). Only differences of ``z`` enter, so
the straight cuts along the level (``dz = 0``) add nothing and need no
pairing, and every term is of the size of the part it measures: a level a
hair above the bottom gives its tiny volume to full relative precision
instead of as the difference of large moments. Arcs are taken as their chord
plus the circular segment between chord and arc (area ``R² (Δ - sin Δ)/2``,
its ``Δ - sin Δ`` by series for small sweeps; centroid ``4 R sin³(Δ/2) /
(3 (Δ - sin Δ))`` from the centre, from memory of the standard tables), which
stays exact for the short arcs near a rounded bottom.

Points exactly on the level count as above it (the half plane is open), so
each crossing is counted once when a level passes through a vertex. No
vertex is moved onto the level: the volume is a continuous function of the
level down to the last bit. A flat face (perpendicular to the axis) lying in
the level plane, within the profile's tolerance, is part of the cut, not of
the section, but it is *wetted*: the wetted area includes it, so that the
wetted area at a level equals its limit from above (a flat bottom is wetted
at the level of the bottom itself).

Examples
--------
A ring of square section, z from 0 to 2 and r from 1 to 3 (volume 16π),
cut at z = 0.5: a quarter of it.

>>> from revolve.geometry.profile import Loop, Profile, Axis
>>> from revolve.geometry.checks import prepare
>>> prep = prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
>>> clipped = clip_section(prep, 0.5)
>>> round(clipped_volume(clipped) / math.pi, 12)
4.0
>>> [s.kind for s in clipped.prepared.paths[0]]
['polyline', 'line', 'polyline']
>>> levels = vertical_levels(prep, [0.0, 0.5, 2.0])
>>> [round(float(v) / math.pi, 12) for v in levels.volume]
[0.0, 4.0, 16.0]

A level below the section leaves nothing:

>>> clip_section(prep, -1.0).prepared.paths
()
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Dict, List, Optional, Sequence, Tuple

import numpy as np

from revolve.geometry.checks import PreparedProfile
from revolve.geometry.segments import Line, Segment
from revolve.geometry.quadrature import gauss_legendre

#: Face name given to the straight cuts along the level (the liquid surface of a vessel).
CUT_FACE = "cut at the level"

TWO_PI = 2.0 * math.pi


# -- pieces monotone along the axis, as tables of rows ---------------------------------
#
# Each segment kind turns its segments into one of the tables below through its class
# method ``axial_level_table`` (see revolve/geometry/kinds/*.py): lines and polyline edges
# become straight rows, arcs circular rows, and anything else parametric rows, which use
# only the segment contract (points_at, tangents_at). Every table answers the same
# questions, vectorised over its rows: the whole pieces' sums and the sums of the parts
# below given levels. The algorithms below never ask which kind a segment is.

def parameters_at_values(seg, pa: float, pb: float, targets, coordinate: int = 0,
                         iterations: int = 70) -> np.ndarray:
    """Parameters in [pa, pb] where ``seg`` (monotone in ``coordinate`` there) reaches each target.

    Vectorised bisection on the segment contract (:meth:`points_at`), for any kind.

    >>> import sympy
    >>> from revolve.geometry.segments import Curve
    >>> t = sympy.Symbol("t", real=True)
    >>> c = Curve(t ** 2, t, 0.0, 2.0)
    >>> [round(float(v), 12) for v in parameters_at_values(c, 0.0, 2.0, [1.0, 4.0])]
    [1.0, 2.0]
    >>> [round(float(v), 12) for v in parameters_at_values(c, 0.0, 2.0, [0.5], coordinate=1)]
    [0.5]
    """
    targets = np.asarray(targets, dtype=float)
    ends = seg.points_at([pa, pb])[:, coordinate]
    rising = float(ends[1]) > float(ends[0])
    lo = np.full(targets.shape, pa, dtype=float)
    hi = np.full(targets.shape, pb, dtype=float)
    for _ in range(iterations):
        mid = 0.5 * (lo + hi)
        with np.errstate(all="ignore"):
            value = seg.points_at(mid.ravel())[:, coordinate].reshape(mid.shape)
        below = (value < targets) if rising else (value > targets)
        lo = np.where(below, mid, lo)
        hi = np.where(below, hi, mid)
    return 0.5 * (lo + hi)


class StraightPieces:
    """Straight pieces: rows ``z0, r0, z1, r1`` in travel order, with their loop factors.

    Lines give one row each, a polyline one row per edge (see ``axial_level_table``).

    >>> t = StraightPieces(np.array([[0.0, 1.0, 2.0, 1.0]]), np.array([1.0]))
    >>> t.full(1.0).tolist()                       # a cylinder wall at r = 1 from z = 0 to 2
    [[-0.0, -0.0, 2.0]]
    >>> t.partial(np.array([0]), np.array([0.5]), 0.0).tolist()
    [[-0.5, -0.25, 0.5]]
    """

    def __init__(self, rows: np.ndarray, factor: np.ndarray):
        self.rows = np.asarray(rows, dtype=float).reshape(-1, 4)
        self.factor = np.asarray(factor, dtype=float).reshape(-1)
        self.ends = self.rows

    def full(self, r_ref: float) -> np.ndarray:
        """Area, ∫∫ (r - r_ref) dA and ∫ r ds of whole pieces (Green with dz only), (n, 3)."""
        z0, r0, z1, r1 = self.rows.T
        a, m, _ = _line_piece(z0, r0 - r_ref, z1, r1 - r_ref, 0.0)
        _, _, rd = _line_piece(z0, r0, z1, r1, 0.0)
        return np.column_stack([a, m, rd])

    def partial(self, rows: np.ndarray, levels: np.ndarray, r_ref: float) -> np.ndarray:
        """The same for the part of piece ``rows[k]`` below ``levels[k]`` (crossing inside)."""
        z0, r0, z1, r1 = self.rows[rows].T
        rising = z1 > z0
        zlo, zhi = np.minimum(z0, z1), np.maximum(z0, z1)
        rlo, rhi = np.where(rising, r0, r1), np.where(rising, r1, r0)
        # the radius at the cut, from the lower end and measured from r_ref (never formed
        # as r itself, which would round away a sliver's width)
        rc_ref = (rlo - r_ref) + (levels - zlo) / (zhi - zlo) * (rhi - rlo)
        za = np.where(rising, z0, levels)
        ra = np.where(rising, r0 - r_ref, rc_ref)
        zb = np.where(rising, levels, z1)
        rb = np.where(rising, rc_ref, r1 - r_ref)
        a, m, _ = _line_piece(za, ra, zb, rb, 0.0)
        _, _, rd = _line_piece(za, ra + r_ref, zb, rb + r_ref, 0.0)
        return np.column_stack([a, m, rd])

    def error(self, r_ref: float) -> float:
        return 0.0


class CircularPieces:
    """Arc pieces monotone in z: rows ``cz, cr, R, angle from, angle to, z0, r0, z1, r1``.

    The end points are the segment's own (or the exact quadrant points where an arc
    was split), so neighbouring pieces join exactly.

    >>> half = CircularPieces(np.array([[0.0, 0.0, 1.0, 0.0, math.pi, 1.0, 0.0, -1.0, 0.0]]),
    ...                       np.array([1.0]))
    >>> a, m, rds = half.full(0.0)[0]          # half disc: π/2, 2/3, and 2 (a sphere's 4π/2π)
    >>> [round(float(v), 12) for v in (a - math.pi / 2, m, rds)]
    [0.0, 0.666666666667, 2.0]
    """

    def __init__(self, rows: np.ndarray, factor: np.ndarray):
        self.rows = np.asarray(rows, dtype=float).reshape(-1, 9)
        self.factor = np.asarray(factor, dtype=float).reshape(-1)
        self.ends = self.rows[:, 5:9]

    def full(self, r_ref: float) -> np.ndarray:
        cz, cr, R, a0, a1, z0, r0, z1, r1 = self.rows.T
        a, m, rd = _arc_piece(cr - r_ref, R, a0, a1, z0, r0 - r_ref, z1, r1 - r_ref, r_ref,
                              shifted=True)
        return np.column_stack([a, m, rd])

    def partial(self, rows: np.ndarray, levels: np.ndarray, r_ref: float) -> np.ndarray:
        cz, cr, R, a0, a1, z0, r0, z1, r1 = self.rows[rows].T
        rising = z1 > z0
        ac, rc = _arc_cut(cz, cr, R, a0, a1, levels, z_low=np.minimum(z0, z1), r_ref=r_ref)
        r0, r1 = r0 - r_ref, r1 - r_ref
        za, ra, pa = np.where(rising, z0, levels), np.where(rising, r0, rc), np.where(rising, a0, ac)
        zb, rb, pb = np.where(rising, levels, z1), np.where(rising, rc, r1), np.where(rising, ac, a1)
        a, m, rd = _arc_piece(cr - r_ref, R, pa, pb, za, ra, zb, rb, r_ref, shifted=True)
        return np.column_stack([a, m, rd])

    def error(self, r_ref: float) -> float:
        return 0.0


class ParametricPieces:
    """Pieces of any kind monotone in z, ``(segment, p_from, p_to)``, by cumulative quadrature.

    Uses only the segment contract (``points_at``, ``tangents_at``): curves come here,
    and so would any kind without closed forms.

    >>> import sympy
    >>> from revolve.geometry.segments import Curve
    >>> t = sympy.Symbol("t", real=True)
    >>> wall = ParametricPieces(((Curve(t, 1 + 0 * t, 0.0, 2.0), 0.0, 2.0),), np.array([1.0]))
    >>> [round(float(v), 12) for v in wall.partial(np.array([0]), np.array([0.5]), 0.0)[0]]
    [-0.5, -0.25, 0.5]
    """

    def __init__(self, pieces, factor: np.ndarray):
        self.pieces = tuple(pieces)
        self.factor = np.asarray(factor, dtype=float).reshape(-1)
        ends = [seg.points_at([pa, pb]).reshape(-1) for seg, pa, pb in self.pieces]
        self.ends = np.array(ends, dtype=float).reshape(-1, 4)
        self._cumulative: Dict[float, list] = {}

    def cumulative(self, r_ref: float) -> list:
        if r_ref not in self._cumulative:
            self._cumulative[r_ref] = [_Cumulative(seg, pa, pb, r_ref) for seg, pa, pb in self.pieces]
        return self._cumulative[r_ref]

    def full(self, r_ref: float) -> np.ndarray:
        return np.array([c.total() for c in self.cumulative(r_ref)], dtype=float).reshape(-1, 3)

    def partial(self, rows: np.ndarray, levels: np.ndarray, r_ref: float) -> np.ndarray:
        out = np.zeros((rows.size, 3))
        cums = self.cumulative(r_ref)
        for row in np.unique(rows):
            sel = rows == row
            seg, pa, pb = self.pieces[row]
            cum = cums[row]
            tc = parameters_at_values(seg, pa, pb, levels[sel], coordinate=0)
            phi = cum.phi_of(tc)
            out[sel] = cum.upto(phi) if self.ends[row, 2] > self.ends[row, 0] else cum.after(phi)
        return out

    def error(self, r_ref: float) -> float:
        return float(sum(abs(f) * c.error for f, c in zip(self.factor, self.cumulative(r_ref))))


@dataclass(frozen=True, eq=False)
class AxialPieces:
    """A prepared profile's closed loops as tables of pieces monotone in ``z``.

    ``tables`` holds one table per segment kind present (from each kind's
    ``axial_level_table``: :class:`StraightPieces`, :class:`CircularPieces`
    or :class:`ParametricPieces`), each with its rows' loop factors (see
    :attr:`~revolve.geometry.checks.PreparedProfile.loop_factors`). All in the
    frame. ``z_min`` and ``z_max`` are the lowest and highest axial positions of
    the loops; ``r_ref`` is the distance from the axis of the lowest point, the
    reference radius of the moments (see the module notes).
    """

    tables: tuple
    z_min: float = 0.0
    z_max: float = 0.0
    r_ref: float = 0.0


def _loop_segments(prep: PreparedProfile, loop_factors: Sequence[float]):
    loop_no = 0
    for segs, closed in zip(prep.paths, prep.closed):
        if not closed:
            continue
        f = float(loop_factors[loop_no])
        loop_no += 1
        for s in segs:
            yield s, f


def kind_groups(pairs):
    """``(segment, factor)`` pairs grouped by segment kind: {kind class: (segments, factors)}.

    >>> g = kind_groups([(Line((0.0, 1.0), (1.0, 1.0)), 1.0), (Line((1.0, 1.0), (0.0, 1.0)), -1.0)])
    >>> [(k.__name__, len(s), f) for k, (s, f) in g.items()]
    [('Line', 2, [1.0, -1.0])]
    """
    groups: dict = {}
    for s, f in pairs:
        segs, fs = groups.setdefault(type(s), ([], []))
        segs.append(s)
        fs.append(f)
    return groups


def _lowest(tables) -> Tuple[float, float, float]:
    """``(z_min, z_max, r at the lowest point)`` of the tables' piece ends."""
    ends = np.vstack([t.ends for t in tables] + [np.zeros((0, 4))])
    if not ends.size:
        return 0.0, 0.0, 0.0
    pts = np.vstack([ends[:, :2], ends[:, 2:]])
    low = int(np.argmin(pts[:, 0]))
    return float(pts[low, 0]), float(pts[:, 0].max()), float(pts[low, 1])


def axial_pieces(prep: PreparedProfile, loop_factors: Optional[Sequence[float]] = None) -> AxialPieces:
    """Split the closed loops of a prepared profile into tables of pieces monotone along the axis.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> prep = prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> p = axial_pieces(prep, [1.0])
    >>> [type(t).__name__ for t in p.tables], p.tables[0].rows.shape, (p.z_min, p.z_max, p.r_ref)
    (['StraightPieces'], (4, 4), (0.0, 2.0, 1.0))
    """
    if loop_factors is None:
        loop_factors = prep.loop_factors
    groups = kind_groups(_loop_segments(prep, loop_factors))
    tables = tuple(kind.axial_level_table(segs, fs) for kind, (segs, fs) in groups.items())
    tables = tuple(t for t in tables if len(t.factor))
    return AxialPieces(tables, *_lowest(tables))


# -- clipping one level, segment by segment -------------------------------------------

def _arc_cut(cz, cr, R, a_from, a_to, z, z_low=None, r_ref=0.0):
    """Angle and radius where a z-monotone arc piece reaches axial position ``z`` (vectorised).

    ``z_low`` (optional) is the piece's lower end as stored: the distances
    ``R ± (z - cz)`` are then taken through it, ``(z - z_low) + (R + z_low -
    cz)``, so that a level a hair above the bottom of a rounded end keeps its
    digits (the radius comes from ``√((R - u)(R + u))``, not from an angle).
    The radius is returned measured from ``r_ref``.

    >>> level = -1.0 + 1e-12
    >>> h = level + 1.0               # the height above the bottom the float level really has
    >>> angle, r = _arc_cut(0.0, 0.0, 1.0, 0.0, math.pi, level)
    >>> bool(abs(float(r) / math.sqrt(2 * h - h * h) - 1) < 1e-15)   # r = √(2 h - h²)
    True
    """
    mid = 0.5 * (np.asarray(a_from, dtype=float) + a_to)
    s = np.where(np.sin(mid) >= 0, 1.0, -1.0)
    if z_low is None:
        u = z - cz
        r_plus_u, r_minus_u = R + u, R - u
    else:
        u = z - cz
        lifted = z - z_low
        r_plus_u = lifted + ((z_low - cz) + R)
        r_minus_u = (R - (z_low - cz)) - lifted
    r_plus_u = np.clip(r_plus_u, 0.0, 2.0 * R)
    r_minus_u = np.clip(r_minus_u, 0.0, 2.0 * R)
    h = np.sqrt(r_plus_u * r_minus_u)
    base = np.arctan2(s * h, np.clip(u, -R, R))      # in (-π, π], on the right half turn
    turns = np.round((mid - base) / TWO_PI)
    return base + turns * TWO_PI, (cr - r_ref) + s * h


@dataclass(frozen=True)
class ClippedProfile:
    """The part of a prepared profile's section below a level.

    ``prepared`` is a prepared profile (same side, size and tolerance as the
    original) holding, per loop that reaches below the level, its clipped
    loop; ``cut`` marks, per segment of each path, the straight cuts added
    along the level; ``loops`` gives the index of the original loop of each
    path, and ``factors`` its loop factor (see :attr:`~revolve.geometry.checks.PreparedProfile.loop_factors`).
    ``touching`` holds the flat faces lying in the level plane (within the
    profile's tolerance) that are not part of the section below: wetted by
    the liquid all the same, even when nothing is below (a flat bottom at
    its own level).
    """

    prepared: PreparedProfile
    cut: Tuple[Tuple[bool, ...], ...]
    loops: Tuple[int, ...]
    factors: Tuple[float, ...]
    level: float
    touching: Tuple[Segment, ...] = ()


def clip_section(prep: PreparedProfile, level: float,
                 loop_factors: Optional[Sequence[float]] = None) -> ClippedProfile:
    """The part of a prepared profile's section with ``z < level``, as closed loops.

    Chains are left out (they bound nothing). Each segment gives its own part
    below the level (its kind's ``part_below``): arcs stay arcs about the same
    centre, curves keep their expressions on a shorter interval, a polyline
    stays one array per run below the level. Straight cuts along
    ``z = level`` close each loop (face :data:`CUT_FACE`).

    Parameters
    ----------
    prep : PreparedProfile
        A checked profile in the axis frame.
    level : float
        Axial position of the cut, in the frame (measured from the axis point).
    loop_factors : sequence of float, optional
        Per loop, see :attr:`~revolve.geometry.checks.PreparedProfile.loop_factors` (worked out when not given).

    Returns
    -------
    ClippedProfile

    Examples
    --------
    Half a sphere of radius 1 (a half circle on the axis) cut at its middle:

    >>> from revolve.geometry.segments import arc_from_centre
    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
    >>> prep = prepare(Profile(loops=(Loop((half, Line((-1.0, 0.0), (1.0, 0.0)))),)), Axis.x())
    >>> c = clip_section(prep, 0.0)
    >>> [s.kind for s in c.prepared.paths[0]], c.cut[0]
    (['arc', 'line', 'line'], (False, False, True))
    >>> round(clipped_volume(c) / (2 * math.pi / 3), 12)   # a half ball, 2π/3
    1.0
    """
    level = float(level)
    tol = prep.tolerance
    factors = tuple(loop_factors) if loop_factors is not None else prep.loop_factors
    paths, cuts, loops, depths, touching = [], [], [], [], []
    loop_no = -1
    for segs, closed in zip(prep.paths, prep.closed):
        if not closed:
            continue
        loop_no += 1
        kept: List[Segment] = []
        for s in segs:
            below, touch = s.part_below(level, tol)
            kept.extend(below)
            touching.extend(touch)
        if not kept:
            continue
        out: List[Segment] = []
        is_cut: List[bool] = []
        for k, s in enumerate(kept):
            out.append(s)
            is_cut.append(False)
            nxt = kept[(k + 1) % len(kept)]
            a, b = s.end, nxt.start
            if a != b:
                # Where the boundary crossed the level both ends lie on it; elsewhere this
                # closes a gap of a few ulps (the loop must close for Green's theorem).
                out.append(Line(a, b, face=CUT_FACE))
                is_cut.append(True)
        paths.append(tuple(out))
        cuts.append(tuple(is_cut))
        loops.append(loop_no)
        depths.append(prep.depths[loop_no])
    clipped = PreparedProfile(tuple(paths), tuple(True for _ in paths), tuple(depths),
                              prep.side, prep.size, tol)
    return ClippedProfile(clipped, tuple(cuts), tuple(loops),
                          tuple(float(factors[k]) for k in loops), level, tuple(touching))


def clipped_volume(clipped: ClippedProfile) -> float:
    """Pappus on a clipped section: 2π ∫∫ r dA, solid loops adding and holes subtracting.

    Each loop is summed as ``r₀ A + ∫∫ (r - r₀) dA`` with ``r₀`` the radius of
    its lowest point (see the module notes), so a sliver a hair deep keeps its
    relative precision. The sums are those of the level tables' whole pieces.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> cone = prepare(Profile(loops=(Loop.from_points([(0, 0), (1, 1), (1, 0)]),)), Axis.x())
    >>> v = clipped_volume(clip_section(cone, 1e-9))      # π h³/3 at h = 1e-9
    >>> abs(v / (math.pi * 1e-27 / 3) - 1) < 1e-13
    True
    """
    total = 0.0
    for segs, f in zip(clipped.prepared.paths, clipped.factors):
        groups = kind_groups((s, 1.0) for s in segs)
        tables = [kind.axial_level_table(ss, fs) for kind, (ss, fs) in groups.items()]
        _, _, r_ref = _lowest(tables)
        sums = sum(t.full(r_ref)[:, :2].sum(axis=0) for t in tables)
        total += f * (r_ref * float(sums[0]) + float(sums[1]))
    return TWO_PI * total

def clipped_wetted_area(clipped: ClippedProfile) -> float:
    """Swept area (2π ∫ r ds) of the original boundary below the level, the cuts left out.

    Flat faces lying in the level plane count (the liquid touches them).
    """
    from revolve.geometry.integrals import COL, segment_integrals

    segs = [s for path, cut in zip(clipped.prepared.paths, clipped.cut)
            for s, c in zip(path, cut) if not c] + list(clipped.touching)
    if not segs:
        return 0.0
    return TWO_PI * float(segment_integrals(segs, symbolic=False).values[:, COL["length_y"]].sum())

def _arc_moments(cz, cr, R, a, b):
    """M01 and ∫ r ds of arcs from angle a to b about (cz, cr), with well-conditioned differences."""
    d = b - a
    m = 0.5 * (a + b)
    sh = np.sin(0.5 * d)
    dsin = 2.0 * np.cos(m) * sh            # sin b - sin a
    dcos = -2.0 * np.sin(m) * sh           # cos b - cos a
    dsin2 = np.sin(a + b) * np.sin(d)      # sin² b - sin² a
    dsin2t = 2.0 * np.cos(a + b) * np.sin(d)  # sin 2b - sin 2a
    m01 = (R / 3.0) * (cr * cz * dsin - cr * cr * dcos + cr * R * d + R * cz * dsin2 / 2.0
                       + R * cr * (d / 2.0 - dsin2t / 4.0) - R * R * dcos)
    r_ds = R * np.sign(d) * (cr * d - R * dcos)
    return m01, r_ds


def d_minus_sin(d):
    """``d - sin d`` without cancellation (a series below 0.5), for arrays.

    >>> round(float(d_minus_sin(1e-6)) / (1e-18 / 6), 12)     # d³/6 to leading order
    1.0
    >>> abs(float(d_minus_sin(2.0)) - (2.0 - math.sin(2.0))) < 1e-16
    True
    """
    d = np.asarray(d, dtype=float)
    d2 = d * d
    series = d * d2 / 6.0 * (1 - d2 / 20.0 * (1 - d2 / 42.0 * (1 - d2 / 72.0 * (
        1 - d2 / 110.0 * (1 - d2 / 156.0)))))
    return np.where(np.abs(d) < 0.5, series, d - np.sin(d))


def _line_piece(za, ra, zb, rb, r_ref):
    """Area, ∫∫ (r - r_ref) dA and ∫ r ds contributed by straight pieces (arrays).

    Green's theorem with ``dz`` only: ``A = -∫ r' dz``, ``∫∫ r' dA = -½ ∫ r'² dz``.

    >>> [float(v) for v in _line_piece(1.0, 2.0, 0.0, 2.0, 1.0)]   # r' = 1 along dz = -1
    [1.0, 0.5, 2.0]
    """
    dz = zb - za
    a, b = ra - r_ref, rb - r_ref
    area = -dz * (a + b) / 2.0
    moment = -dz * (a * a + a * b + b * b) / 6.0
    r_ds = np.hypot(dz, rb - ra) * (ra + rb) / 2.0
    return area, moment, r_ds


def _arc_piece(cr, R, a_from, a_to, za, ra, zb, rb, r_ref, shifted=False):
    """Area, ∫∫ (r - r_ref) dA and ∫ r ds of arc pieces: the chord plus the circular segment.

    ``a_from``, ``a_to`` are the angles of the end points ``(za, ra)`` and
    ``(zb, rb)`` about the centre (radial distance ``cr``); a sweep is at most
    π. Below a quarter turn the sweep and its middle direction are taken from
    the chord (``Δ = 2 asin(c/2R)``, the chord's middle at ``R cos(Δ/2)`` from
    the centre), which keeps short arcs exact. With ``shifted``, ``cr``,
    ``ra`` and ``rb`` are given already measured from ``r_ref`` (so that a
    sliver's width is never rounded to the last bit of its radius).

    >>> a, m, rds = _arc_piece(0.0, 1.0, 0.0, math.pi, 1.0, 0.0, -1.0, 0.0, 0.0)   # half disc
    >>> [round(float(v), 12) for v in (a, m, rds)] == [round(math.pi / 2, 12), round(2 / 3, 12), 2.0]
    True
    """
    if not shifted:
        cr, ra, rb = cr - r_ref, ra - r_ref, rb - r_ref
    area, moment, _ = _line_piece(za, ra, zb, rb, 0.0)
    sweep = np.asarray(a_to, dtype=float) - a_from
    chord = np.hypot(zb - za, rb - ra)
    short = np.abs(sweep) < 0.5 * math.pi
    d = np.where(short, np.sign(sweep) * 2.0 * np.arcsin(np.clip(chord / (2.0 * R), 0.0, 1.0)),
                 sweep)
    half = 0.5 * d
    with np.errstate(invalid="ignore", divide="ignore"):
        sin_mid = np.where(short, (0.5 * (ra + rb) - cr) / (R * np.cos(half)),
                           np.sin(0.5 * (np.asarray(a_from, dtype=float) + a_to)))
    segment = R * R * d_minus_sin(d) / 2.0
    area = area + segment
    moment = moment + segment * cr + (2.0 / 3.0) * R ** 3 * np.sin(half) ** 3 * sin_mid
    r_ds = R * ((cr + r_ref) * np.abs(d) + 2.0 * R * np.sin(np.abs(half)) * sin_mid)
    return area, moment, r_ds


class _Cumulative:
    """Cumulative integrals of area, ∫∫ (r - r_ref) dA and ∫ r ds along one monotone piece.

    The columns are ``-∫ r' dz``, ``-½ ∫ r'² dz`` and ``∫ r ds`` with
    ``r' = r - r_ref``, from the segment contract alone (``points_at`` and
    ``tangents_at``). The piece [ta, tb] of the segment's parameter is mapped
    to φ in [0, π] by t = m - h cos φ (smooth at ends with a vertical
    tangent); φ is cut into panels until 16- and 32-point Gauss–Legendre
    agree, and partial integrals from either end to any φ are the panel sums
    on that side plus 32 nodes on the rest (never a difference of two large
    sums).

    >>> import sympy
    >>> from revolve.geometry.segments import Curve
    >>> t = sympy.Symbol("t", real=True)
    >>> c = _Cumulative(Curve(t, 2 + 0 * t, 0.0, 3.0), 0.0, 3.0, r_ref=1.0)   # r = 2, z 0..3
    >>> [round(float(v), 12) for v in c.total()]                           # -r'Δz, -r'²Δz/2, rΔz
    [-3.0, -1.5, 6.0]
    """

    def __init__(self, seg, ta: float, tb: float, r_ref: float = 0.0, rel_tol: float = 1e-15):
        self.seg, self.ta, self.tb, self.r_ref = seg, ta, tb, float(r_ref)
        self.mid, self.half = 0.5 * (ta + tb), 0.5 * (tb - ta)
        edges = np.linspace(0.0, math.pi, 9)
        for _ in range(40):
            lo = self._panels(edges[:-1], edges[1:], 16)
            hi = self._panels(edges[:-1], edges[1:], 32)
            scale = np.abs(hi).sum(axis=0)
            scale = np.where(scale > 0, scale, 1.0)
            bad = (np.abs(hi - lo) > rel_tol * scale).any(axis=1)
            if not bad.any():
                break
            mids = 0.5 * (edges[:-1] + edges[1:])[bad]
            edges = np.sort(np.concatenate([edges, mids]))
            if edges.size > 20_000:   # rounding in the segment, not the rule, limits the sums
                break
        if hi.shape[0] != edges.size - 1:
            lo = self._panels(edges[:-1], edges[1:], 16)
            hi = self._panels(edges[:-1], edges[1:], 32)
        self.edges = edges
        zero = np.zeros((1, 3))
        self.cumulative = np.vstack([zero, np.cumsum(hi, axis=0)])
        self.remaining = np.vstack([np.cumsum(hi[::-1], axis=0)[::-1], zero])
        diff = np.abs(hi - lo).sum(axis=0)
        #: Estimated error of the volume moment r_ref A + ∫∫ r' dA.
        self.error = float(abs(self.r_ref) * diff[0] + diff[1])

    def _t_of(self, phi):
        """t = m - h cos φ, written from the nearer end (ta + 2h sin²(φ/2) or tb - 2h cos²(φ/2))
        so that parameters a hair from either end keep their digits."""
        phi = np.asarray(phi, dtype=float)
        return np.where(phi <= 0.5 * math.pi, self.ta + 2.0 * self.half * np.sin(0.5 * phi) ** 2,
                        self.tb - 2.0 * self.half * np.cos(0.5 * phi) ** 2)

    def _integrand(self, phi):
        t = self._t_of(phi)
        with np.errstate(all="ignore"):
            r = self.seg.points_at(t.ravel())[:, 1].reshape(t.shape)
            tangent = self.seg.tangents_at(t.ravel())
        dz, dr = tangent[:, 0].reshape(t.shape), tangent[:, 1].reshape(t.shape)
        jac = self.half * np.sin(phi)
        rp = r - self.r_ref
        with np.errstate(all="ignore"):
            out = np.stack([-rp * dz * jac, -0.5 * rp * rp * dz * jac,
                            r * np.hypot(dz, dr) * np.abs(jac)], axis=-1)
        return np.nan_to_num(out, nan=0.0, posinf=0.0, neginf=0.0)

    def _panels(self, a, b, n):
        x, w = gauss_legendre(n)
        phi = 0.5 * (a + b)[:, None] + 0.5 * (b - a)[:, None] * x[None, :]
        vals = self._integrand(phi)                      # (panels, n, 3)
        return np.einsum("pnk,n->pk", vals, w) * (0.5 * (b - a))[:, None]

    def phi_of(self, t):
        """The inverse of ``_t_of``, from the nearer end as well."""
        t = np.asarray(t, dtype=float)
        if self.half == 0:
            return np.zeros(t.shape)
        from_start = np.clip((t - self.ta) / (2.0 * self.half), 0.0, 1.0)
        from_end = np.clip((self.tb - t) / (2.0 * self.half), 0.0, 1.0)
        return np.where(from_start <= 0.5, 2.0 * np.arcsin(np.sqrt(from_start)),
                        math.pi - 2.0 * np.arcsin(np.sqrt(from_end)))

    def _panel_of(self, phi):
        return np.clip(np.searchsorted(self.edges, phi, side="right") - 1, 0, len(self.edges) - 2)

    def upto(self, phi):
        """Integrals from φ = 0 to each φ (arrays), shape (len(phi), 3)."""
        phi = np.atleast_1d(np.asarray(phi, dtype=float))
        k = self._panel_of(phi)
        return self.cumulative[k] + self._panels(self.edges[k], phi, 32)

    def after(self, phi):
        """Integrals from each φ to φ = π (arrays), shape (len(phi), 3)."""
        phi = np.atleast_1d(np.asarray(phi, dtype=float))
        k = self._panel_of(phi)
        return self.remaining[k + 1] + self._panels(phi, self.edges[k + 1], 32)

    def total(self):
        return self.cumulative[-1]




@dataclass(frozen=True, eq=False)
class VerticalLevels:
    """Volume and wetted inside area below each level (arrays, profile units)."""

    level: np.ndarray
    volume: np.ndarray
    wetted_area: np.ndarray
    error: float  # estimate of the quadrature error of curve pieces (volume, absolute)


def vertical_levels(prep: PreparedProfile, levels,
                    loop_factors: Optional[Sequence[float]] = None,
                    pieces: Optional[AxialPieces] = None) -> VerticalLevels:
    """Volume and wetted area below each level ``z = level`` (frame units), vectorised.

    The same figures as :func:`clip_section` with :func:`clipped_volume` and
    :func:`clipped_wetted_area`, computed for all levels together, each as
    ``-½ ∫ r² dz`` about the radius of the lowest point (the cuts along the
    level add nothing; see the module notes). A piece below a level counts
    whole: the whole pieces are sorted by their top and summed once
    (cumulative sums), and each level takes the sum of those below it. Only
    the pieces a level crosses are cut, found by sorting too, so a table costs
    O((pieces + levels) log) plus one closed form per crossing. Cut points are
    never formed as coordinates: their distance from the reference radius is
    taken from the lower end of the piece, so a level a hair above the bottom
    gets its sliver to full relative precision.

    Examples
    --------
    A cone of radius 1 and height 1, point down at z = 0: V(h) = π h³/3,
    down to the tiniest depths.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> prep = prepare(Profile(loops=(Loop.from_points([(0, 0), (1, 1), (1, 0)]),)), Axis.x())
    >>> v = vertical_levels(prep, [0.5, 1.0, 1e-12]).volume
    >>> [round(float(x / (math.pi / 3 * h ** 3)), 12) for x, h in zip(v, [0.5, 1.0, 1e-12])]
    [1.0, 1.0, 1.0]

    A flat bottom is wetted at its own level (a ring, r from 1 to 3, z from 0 to 2):

    >>> ring = prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> [round(float(a) / math.pi, 12) for a in vertical_levels(ring, [-1.0, 0.0]).wetted_area]
    [0.0, 8.0]

    No level, or no loop, gives empty or zero rows:

    >>> vertical_levels(ring, []).volume.size
    0
    """
    L = np.atleast_1d(np.asarray(levels, dtype=float)).ravel()
    if pieces is None:
        pieces = axial_pieces(prep, loop_factors)
    r_ref = pieces.r_ref
    tol = prep.tolerance
    tables = pieces.tables
    nL = L.size
    if not tables or nL == 0:
        zero = np.zeros(nL)
        return VerticalLevels(L, zero, zero.copy(), 0.0)
    ends = np.vstack([t.ends for t in tables])
    factor = np.concatenate([t.factor for t in tables])
    first = np.cumsum([0] + [len(t.factor) for t in tables])
    zlo = np.minimum(ends[:, 0], ends[:, 2])
    zhi = np.maximum(ends[:, 0], ends[:, 2])
    # Whole pieces: a piece counts whole from its top up. A flat face (perpendicular to the
    # axis: no area, only wetted surface) counts from a tolerance below it: the wetted area
    # at a level is its limit from above (a flat bottom is wetted at its own level).
    full = np.vstack([t.full(r_ref) for t in tables])
    full[:, :2] *= factor[:, None]
    flat = zlo == zhi
    starts = np.where(flat, zhi - tol, zhi)
    order = np.argsort(starts, kind="stable")
    running = np.vstack([np.zeros((1, 3)), np.cumsum(full[order], axis=0)])
    sums = running[np.searchsorted(starts[order], L, side="right")]
    # Crossed pieces: those with zlo < level < zhi, each a run of the sorted levels.
    level_order = np.argsort(L, kind="stable")
    sorted_levels = L[level_order]
    i0 = np.searchsorted(sorted_levels, zlo, side="right")
    i1 = np.searchsorted(sorted_levels, zhi, side="left")
    count = np.where(flat, 0, np.maximum(i1 - i0, 0))
    total = int(count.sum())
    if total:
        piece = np.repeat(np.arange(zlo.size), count)
        ramp = np.arange(total) - np.repeat(np.cumsum(count) - count, count)
        lv = level_order[np.repeat(i0, count) + ramp]
        for k, t in enumerate(tables):
            sel = (piece >= first[k]) & (piece < first[k + 1])
            if not sel.any():
                continue
            rows, at = piece[sel] - first[k], lv[sel]
            part = t.partial(rows, L[at], r_ref)
            part[:, :2] *= t.factor[rows][:, None]
            for c in range(3):
                sums[:, c] += np.bincount(at, weights=part[:, c], minlength=nL)
    error = sum(t.error(r_ref) for t in tables)
    m01 = r_ref * sums[:, 0] + sums[:, 1]
    return VerticalLevels(L, TWO_PI * m01, TWO_PI * sums[:, 2], TWO_PI * error)
