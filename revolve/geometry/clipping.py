"""Clipping a section at an axial level: the part with ``z <= level``, and level volumes.

A prepared profile (see :mod:`revolve.geometry.checks`) lies in the axis
frame: ``z`` along the axis, ``r`` the distance from it. Cutting the
revolved solid by the plane perpendicular to the axis at ``z = level`` cuts
its section along the straight line ``z = level``; the part of the solid
below the plane is the revolution of the part of the section below that
line. This module builds that part exactly and measures it:

* :func:`clip_section` returns the clipped section as a prepared profile.
  Lines are cut into lines, arcs into arcs about the same centre, curves into
  the same curve on a shorter parameter interval (the cut parameter found by
  bisection on the parameter, to the last bit). Where the boundary leaves the
  half plane ``z <= level`` and comes back, a straight cut is added along the
  line ``z = level`` (the liquid surface, for a vessel). This is the
  half-plane step of Sutherland–Hodgman clipping, which stays exact for a
  section of any shape: the winding number of the clipped loop equals the
  original one below the level and zero above it, so Green's theorem gives
  the area moments of the clipped part exactly, even where cuts overlap.
* Pappus–Guldinus on the clipped section (volume = 2π ∫∫ r dA) is the
  volume below the level; the swept area of the original boundary below the
  level (2π ∫ r ds, the cuts left out) is the wetted inside surface.
* :func:`vertical_levels` does the same for many levels at once, vectorised
  over levels and segment pieces, with the closed forms of sub-lines and
  sub-arcs written out (and cumulative Gauss–Legendre sums for curves), so a
  level table of a thousand rows costs a few numpy passes.

A segment is first split into *pieces* along which ``z`` moves one way only
(:func:`axial_pieces`); each such piece crosses a level at most once.

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
['line', 'line', 'line', 'line']
>>> levels = vertical_levels(prep, [0.0, 0.5, 2.0])
>>> [round(float(v) / math.pi, 12) for v in levels.volume]
[0.0, 4.0, 16.0]

A level below the section leaves nothing:

>>> clip_section(prep, -1.0).prepared.paths
()
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import List, Optional, Sequence, Tuple

import numpy as np

from revolve.geometry.checks import PreparedProfile
from revolve.geometry.segments import Arc, Curve, Line, Segment
from revolve.geometry.slicing import curve_parameter_at, gauss_legendre

#: Face name given to the straight cuts along the level (the liquid surface of a vessel).
CUT_FACE = "cut at the level"

TWO_PI = 2.0 * math.pi


# -- splitting segments into pieces monotone along the axis ----------------------------

def _arc_cut_angles(arc: Arc, step: float) -> List[float]:
    """Angles strictly inside the arc's sweep that are multiples of ``step``, in travel order."""
    a0, a1 = arc.angles()
    lo, hi = min(a0, a1), max(a0, a1)
    cuts = [k * step for k in range(math.ceil(lo / step), math.floor(hi / step) + 1)
            if lo < k * step < hi]
    return cuts if a1 > a0 else cuts[::-1]


def split_arc(arc: Arc, step: float) -> List[Tuple[float, float]]:
    """The arc's angle range cut at the multiples of ``step``: [(from, to), ...] in travel order.

    ``step = π`` splits where ``z`` turns back, ``π/2`` also where ``r`` does.

    >>> from revolve.geometry.segments import arc_from_centre
    >>> a = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
    >>> [(round(p, 12), round(q, 12)) for p, q in split_arc(a, math.pi / 2)]
    [(0.0, 1.570796326795), (1.570796326795, 3.14159265359)]
    """
    a0, a1 = arc.angles()
    angles = [a0] + _arc_cut_angles(arc, step) + [a1]
    return [(p, q) for p, q in zip(angles[:-1], angles[1:]) if p != q]


def split_curve(curve: Curve, which: Sequence[int]) -> List[Tuple[float, float]]:
    """The curve's parameter interval cut where ``dz/dt`` (2) and/or ``dr/dt`` (3) turn."""
    ts = sorted(set(t for w in which for t in curve.turning_parameters(w - 2)),
                reverse=curve.t_end < curve.t_start)
    ts = [curve.t_start] + ts + [curve.t_end]
    return [(p, q) for p, q in zip(ts[:-1], ts[1:]) if p != q]


@dataclass(frozen=True)
class AxialPieces:
    """A prepared profile's closed loops as pieces monotone in ``z``, grouped by kind (arrays).

    Lines: ``line`` (n, 4) holds z0, r0, z1, r1 in travel order (radial lines,
    z0 == z1, included). Arcs: ``arc`` (n, 9) holds cz, cr, R, angle from,
    angle to, then the end points z from, r from, z to, r to (the segment's
    own vertices at its ends, so that neighbouring pieces join exactly).
    Curves: ``curves`` is a tuple of (curve, t_from, t_to). Each kind has its
    loop factor (see :attr:`~revolve.geometry.checks.PreparedProfile.loop_factors`) in ``*_factor``. All in
    the frame. ``z_min`` and ``z_max`` are the lowest and highest axial
    positions of the loops; ``r_ref`` is the distance from the axis of the
    lowest point, the reference radius of the moments (see the module notes).
    """

    line: np.ndarray
    line_factor: np.ndarray
    arc: np.ndarray
    arc_factor: np.ndarray
    curves: Tuple[Tuple[Curve, float, float], ...]
    curve_factor: np.ndarray
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


def _shifted_curve(curve: Curve, dz: float) -> Curve:
    if dz == 0:
        return curve
    return curve.translated(dz)


def axial_pieces(prep: PreparedProfile, loop_factors: Sequence[float]) -> AxialPieces:
    """Split the closed loops of a prepared profile into pieces monotone along the axis.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> prep = prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> p = axial_pieces(prep, [1.0])
    >>> p.line.shape, p.arc.shape, (p.z_min, p.z_max, p.r_ref)
    ((4, 4), (0, 9), (0.0, 2.0, 1.0))
    """
    lines, lf, arcs, af, curves, cf = [], [], [], [], [], []
    for s, f in _loop_segments(prep, loop_factors):
        if isinstance(s, Line):
            lines.append((s.start[0], s.start[1], s.end[0], s.end[1]))
            lf.append(f)
        elif isinstance(s, Arc):
            cz, cr, R = s.centre[0], s.centre[1], s.radius
            parts = split_arc(s, math.pi)
            for k, (p, q) in enumerate(parts):
                za, ra = s.start if k == 0 else (cz + R * math.cos(p), cr + R * math.sin(p))
                zb, rb = s.end if k == len(parts) - 1 else (cz + R * math.cos(q), cr + R * math.sin(q))
                arcs.append((cz, cr, R, p, q, za, ra, zb, rb))
                af.append(f)
        elif isinstance(s, Curve):
            for p, q in split_curve(s, (2,)):
                curves.append((s, p, q))
                cf.append(f)
        else:  # pragma: no cover - the segment kinds are closed
            raise TypeError(type(s).__name__)
    line = np.array(lines, dtype=float).reshape(-1, 4)
    arc = np.array(arcs, dtype=float).reshape(-1, 9)
    ends = [line[:, [0, 1]], line[:, [2, 3]], arc[:, [5, 6]], arc[:, [7, 8]]]
    for c, ta, tb in curves:
        z, r, _, _ = c.evaluate(np.array([ta, tb]))
        ends.append(np.column_stack([z, r]))
    ends = np.vstack(ends)
    # An arc's lowest point may lie inside it (only at a split, which is an end here).
    if not ends.size:
        return AxialPieces(line, np.array(lf, dtype=float), arc, np.array(af, dtype=float),
                           tuple(curves), np.array(cf, dtype=float))
    low = int(np.argmin(ends[:, 0]))
    return AxialPieces(line, np.array(lf, dtype=float), arc, np.array(af, dtype=float),
                       tuple(curves), np.array(cf, dtype=float), float(ends[:, 0].min()),
                       float(ends[:, 0].max()), float(ends[low, 1]))


# -- clipping one level, segment by segment -------------------------------------------

def _curve_parameter_at_z(curve: Curve, ta: float, tb: float, z: np.ndarray) -> np.ndarray:
    """Parameters where a curve monotone in z on [ta, tb] reaches each z."""
    return curve_parameter_at(curve, ta, tb, z, coordinate=0)


def _arc_angle_at_z(cz, cr, R, a_from, a_to, z):
    """Angle in a z-monotone arc piece where the arc reaches axial position ``z`` (vectorised)."""
    return _arc_cut(cz, cr, R, a_from, a_to, z)[0]


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


def _arc_or_chord(seg: Arc, start, end) -> List[Segment]:
    """The part of ``seg`` from ``start`` to ``end``: an arc, or its chord when so short that
    its sweep is lost in rounding (a sweep of a few ulps would read as a full turn)."""
    if start == end:
        return []
    part = replace(seg, start=start, end=end, exact=None)
    if abs(part.sweep()) <= math.pi * (1 + 1e-9):
        return [part]
    return [Line(start, end, face=seg.face, where=seg.where)]


def _kept_part(seg: Segment, level: float) -> List[Segment]:
    """The parts of one frame segment with z < level, in travel order (pieces monotone in z).

    No point is moved: a vertex a hair below the level is below it.
    """
    out: List[Segment] = []
    if isinstance(seg, Line):
        z0, z1 = seg.start[0], seg.end[0]
        if max(z0, z1) <= level:
            return [seg] if min(z0, z1) < level else []
        if min(z0, z1) >= level:
            return []
        (zl, rl), (zh, rh) = sorted((seg.start, seg.end))
        cut = (level, rl + (level - zl) / (zh - zl) * (rh - rl))   # from the lower end
        part = replace(seg, end=cut, exact=None) if z0 < z1 else replace(seg, start=cut, exact=None)
        return [part]
    if isinstance(seg, Arc):
        cz, cr = seg.centre
        R = seg.radius
        a_start, a_end = seg.angles()

        def at(angle):
            return (cz + R * math.cos(angle), cr + R * math.sin(angle))

        pieces = split_arc(seg, math.pi)
        ends = [seg.start] + [at(q) for _, q in pieces[:-1]] + [seg.end]
        if max(z for z, _ in ends) <= level:
            return [seg]          # wholly below (or touching from below): keep it as it is
        for k, (p, q) in enumerate(pieces):
            start, end = ends[k], ends[k + 1]
            za, zb = start[0], end[0]
            if max(za, zb) <= level:
                out.extend(_arc_or_chord(seg, start, end))
                continue
            if min(za, zb) >= level:
                continue
            _, rc = _arc_cut(cz, cr, R, p, q, level, z_low=min(za, zb))
            cut = (level, float(rc))
            out.extend(_arc_or_chord(seg, start, cut) if za < zb else _arc_or_chord(seg, cut, end))
        return out
    if isinstance(seg, Curve):
        for p, q in split_curve(seg, (2,)):
            za = float(seg.evaluate(np.array([p]))[0][0])
            zb = float(seg.evaluate(np.array([q]))[0][0])
            if max(za, zb) <= level:
                out.append(replace(seg, t_start=p, t_end=q, exact=None))
                continue
            if min(za, zb) >= level:
                continue
            tc = float(_curve_parameter_at_z(seg, p, q, np.array([level]))[0])
            if za < zb:
                out.append(replace(seg, t_start=p, t_end=tc, exact=None))
            else:
                out.append(replace(seg, t_start=tc, t_end=q, exact=None))
        return [s for s in out if s.t_end != s.t_start]
    raise TypeError(type(seg).__name__)


def clip_section(prep: PreparedProfile, level: float,
                 loop_factors: Optional[Sequence[float]] = None) -> ClippedProfile:
    """The part of a prepared profile's section with ``z < level``, as closed loops.

    Chains are left out (they bound nothing). Arcs stay arcs about the same
    centre; curves keep their expressions on a shorter interval; straight
    cuts along ``z = level`` close each loop (face :data:`CUT_FACE`).

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
            kept.extend(_kept_part(s, level))
            if isinstance(s, Line) and s.start[0] == s.end[0] and level <= s.start[0] <= level + tol:
                touching.append(s)      # a flat face in the level plane, not below it
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
    relative precision.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> cone = prepare(Profile(loops=(Loop.from_points([(0, 0), (1, 1), (1, 0)]),)), Axis.x())
    >>> v = clipped_volume(clip_section(cone, 1e-9))      # π h³/3 at h = 1e-9
    >>> abs(v / (math.pi * 1e-27 / 3) - 1) < 1e-13
    True
    """
    total = 0.0
    for segs, f in zip(clipped.prepared.paths, clipped.factors):
        low = min((p for s in segs for p in (s.start, s.end)), key=lambda p: p[0])
        r_ref = float(low[1])
        area = moment = 0.0
        for s in segs:
            if isinstance(s, Line):
                a, m, _ = _line_piece(s.start[0], s.start[1], s.end[0], s.end[1], r_ref)
            elif isinstance(s, Arc):
                a0, a1 = s.angles()
                a, m, _ = _arc_piece(s.centre[1], s.radius, a0, a1, s.start[0], s.start[1],
                                     s.end[0], s.end[1], r_ref)
            else:
                a, m, _ = _CurveCumulative(s, s.t_start, s.t_end, r_ref).total()
            area += float(a)
            moment += float(m)
        total += f * (r_ref * area + moment)
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


def _middle(segs) -> float:
    zs = [c for s in segs for c in (s.start[0], s.end[0])]
    return (min(zs) + max(zs)) / 2


def _shift(seg: Segment, dz: float) -> Segment:
    if isinstance(seg, Line):
        return replace(seg, start=(seg.start[0] + dz, seg.start[1]), end=(seg.end[0] + dz, seg.end[1]))
    if isinstance(seg, Arc):
        return replace(seg, start=(seg.start[0] + dz, seg.start[1]), end=(seg.end[0] + dz, seg.end[1]),
                       centre=(seg.centre[0] + dz, seg.centre[1]))
    return _shifted_curve(seg, dz)


# -- many levels at once ----------------------------------------------------------------

def _line_moments(z0, r0, z1, r1):
    """M01 (∫∫ r dA sector moment) and ∫ r ds of straight pieces (arrays)."""
    c = z0 * r1 - z1 * r0
    m01 = c * (r0 + r1) / 6.0
    r_ds = np.hypot(z1 - z0, r1 - r0) * (r0 + r1) / 2.0
    return m01, r_ds


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


class _CurveCumulative:
    """Cumulative integrals of area, ∫∫ (r - r_ref) dA and ∫ r ds along one curve piece.

    The columns are ``-∫ r' dz``, ``-½ ∫ r'² dz`` and ``∫ r ds`` with
    ``r' = r - r_ref``. The piece [ta, tb] is mapped to φ in [0, π] by
    t = m - h cos φ (smooth at ends with a vertical tangent); φ is cut into
    panels until 16- and 32-point Gauss–Legendre agree, and partial integrals
    from either end to any φ are the panel sums on that side plus 32 nodes on
    the rest (never a difference of two large sums).
    """

    def __init__(self, curve: Curve, ta: float, tb: float, r_ref: float = 0.0,
                 rel_tol: float = 1e-15):
        self.curve, self.ta, self.tb, self.r_ref = curve, ta, tb, float(r_ref)
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
            if edges.size > 20_000:   # rounding in the curve, not the rule, limits the sums
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
        _, r, dz, dr = self.curve.evaluate(t)
        jac = self.half * np.sin(phi)
        rp = r - self.r_ref
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


@dataclass(frozen=True)
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
    :func:`clipped_wetted_area`, computed for all levels together: the
    closed forms of every kept sub-line and sub-arc (chord plus circular
    segment) and cumulative quadrature for curves, each as ``-½ ∫ r² dz``
    about the radius of the lowest point (the cuts along the level add
    nothing; see the module notes). Cut points are never formed as
    coordinates: their distance from that radius is taken from the lower end
    of the piece, so a level a hair above the bottom gets its sliver to full
    relative precision.

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
    """
    L = np.atleast_1d(np.asarray(levels, dtype=float))
    if pieces is None:
        if loop_factors is None:
            loop_factors = prep.loop_factors
        pieces = axial_pieces(prep, loop_factors)
    pc = pieces
    r_ref = pc.r_ref
    area = np.zeros(L.shape)        # Σ f A            (see the module notes)
    moment = np.zeros(L.shape)      # Σ f ∫∫ (r - r_ref) dA
    wet = np.zeros(L.shape)
    error = 0.0
    tol = prep.tolerance
    lv = L[None, :]
    # Lines. A kept sub-line runs from its lower end to the level (or to its upper end).
    if pc.line.size:
        z0, r0, z1, r1 = (pc.line[:, i][:, None] for i in range(4))
        f = pc.line_factor[:, None]
        radial = (z0 == z1)
        rising = z1 > z0
        zlo, zhi = np.minimum(z0, z1), np.maximum(z0, z1)
        rlo, rhi = np.where(rising, r0, r1), np.where(rising, r1, r0)
        s = np.clip((lv - zlo) / np.where(radial, 1.0, zhi - zlo), 0.0, 1.0)
        # the radius at the cut, from the lower end and measured from r_ref (never
        # formed as r itself, which would round away a sliver's width)
        rc_ref = (rlo - r_ref) + s * (rhi - rlo)
        crossing = ~radial & (zlo < lv) & (lv < zhi)
        zc = np.where(crossing, lv, np.where(rising, z1, z0))
        rc_ref = np.where(crossing, rc_ref, np.where(rising, r1, r0) - r_ref)
        # kept sub-line: from the start to the cut when rising, from the cut to the end otherwise
        za = np.where(rising, z0, zc)
        ra_ref = np.where(rising, r0 - r_ref, rc_ref)
        zb = np.where(rising, zc, z1)
        rb_ref = np.where(rising, rc_ref, r1 - r_ref)
        a, m, _ = _line_piece(za, ra_ref, zb, rb_ref, 0.0)
        _, _, rd = _line_piece(za, ra_ref + r_ref, zb, rb_ref + r_ref, 0.0)
        kept = ~radial & (zlo < lv)
        area += (f * np.where(kept, a, 0.0)).sum(axis=0)
        moment += (f * np.where(kept, m, 0.0)).sum(axis=0)
        # A flat face is wetted when it lies below the level or in its plane (within the
        # tolerance): the wetted area at a level is its limit from above.
        radial_wet = radial & (z0 <= lv + tol)
        _, _, rdr = _line_piece(z0, r0, z1, r1, 0.0)
        wet += (np.where(kept, rd, 0.0) + np.where(radial_wet, rdr, 0.0)).sum(axis=0)
    # Arcs: the kept sub-arc from its lower end to the level, as chord plus segment.
    if pc.arc.size:
        cz, cr, R, a0, a1, z0, r0, z1, r1 = (pc.arc[:, i][:, None] for i in range(9))
        f = pc.arc_factor[:, None]
        rising = z1 > z0
        zlo, zhi = np.minimum(z0, z1), np.maximum(z0, z1)
        # radii measured from r_ref from here on (see _arc_piece)
        ac, rc = _arc_cut(cz, cr, R, a0, a1, lv, z_low=zlo, r_ref=r_ref)
        r0, r1 = r0 - r_ref, r1 - r_ref
        crossing = (zlo < lv) & (lv < zhi)
        zc = np.where(crossing, lv, np.where(rising, z1, z0))
        rc = np.where(crossing, rc, np.where(rising, r1, r0))
        ac = np.where(crossing, ac, np.where(rising, a1, a0))
        za, ra, pa = np.where(rising, z0, zc), np.where(rising, r0, rc), np.where(rising, a0, ac)
        zb, rb, pb = np.where(rising, zc, z1), np.where(rising, rc, r1), np.where(rising, ac, a1)
        a, m, rd = _arc_piece(cr - r_ref, R, pa, pb, za, ra, zb, rb, r_ref, shifted=True)
        kept = zlo < lv
        area += (f * np.where(kept, a, 0.0)).sum(axis=0)
        moment += (f * np.where(kept, m, 0.0)).sum(axis=0)
        wet += np.where(kept, rd, 0.0).sum(axis=0)
    # Curves.
    for (curve, ta, tb), f in zip(pc.curves, pc.curve_factor):
        cum = _CurveCumulative(curve, ta, tb, r_ref)
        error += abs(f) * cum.error
        za = float(curve.evaluate(np.array([ta]))[0][0])
        zb = float(curve.evaluate(np.array([tb]))[0][0])
        zlo, zhi = min(za, zb), max(za, zb)
        inside = (L > zlo) & (L < zhi)
        tc = np.where(L >= zhi, tb if za < zb else ta, ta if za < zb else tb).astype(float)
        if inside.any():
            tc[inside] = _curve_parameter_at_z(curve, ta, tb, L[inside])
        phi_c = cum.phi_of(tc)
        kept_vals = cum.upto(phi_c) if za < zb else cum.after(phi_c)
        kept = L > zlo
        area += f * np.where(kept, kept_vals[:, 0], 0.0)
        moment += f * np.where(kept, kept_vals[:, 1], 0.0)
        wet += np.where(kept, kept_vals[:, 2], 0.0)
    m01 = r_ref * area + moment
    return VerticalLevels(L, TWO_PI * m01, TWO_PI * wet, TWO_PI * error)
