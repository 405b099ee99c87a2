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
(:func:`axial_pieces`); each such piece crosses a level at most once. The
straight cuts need no pairing: a cut from the point where the boundary
leaves the half plane to the point where it comes back adds ``level · (r_b² -
r_a²)/6`` to ∫∫ r dA, so the sum over all cuts is the sum over crossing points
of ``∓ level · r²/6``, the sign given by the direction of the crossing.

Points exactly on the level count as above it (the half plane is open), so
each crossing is counted once when a level passes through a vertex, and a
flat face lying in the level plane is part of the cut, not of the section.

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

def _curve_turning_parameters(curve: Curve, which: int, samples: int = 1025) -> List[float]:
    """Parameters where ``dz/dt`` (which = 2) or ``dr/dt`` (which = 3) changes sign."""
    t = np.linspace(curve.t_start, curve.t_end, samples)
    with np.errstate(all="ignore"):
        d = curve.evaluate(t)[which]
    d = np.nan_to_num(d, nan=0.0, posinf=0.0, neginf=0.0)
    # Sign changes between neighbouring samples that are not zero: a sample may land exactly
    # on the turning point (a zero between a + and a -).
    nonzero = np.flatnonzero(d != 0)
    sg = np.sign(d[nonzero])
    flips = np.flatnonzero(sg[:-1] * sg[1:] < 0)
    out = []
    for k in flips:
        i, j = nonzero[k], nonzero[k + 1]
        if j > i + 1:            # zeros between: the turning point is the middle one
            out.append(float(t[(i + j) // 2]))
            continue
        a, b = float(t[i]), float(t[j])
        fa = float(curve.evaluate(np.array([a]))[which][0])
        for _ in range(200):
            m = 0.5 * (a + b)
            if m == a or m == b:
                break
            fm = float(curve.evaluate(np.array([m]))[which][0])
            if (fm > 0) == (fa > 0):
                a, fa = m, fm
            else:
                b = m
        out.append(0.5 * (a + b))
    return out


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
    ts = sorted(set(t for w in which for t in _curve_turning_parameters(curve, w)),
                reverse=curve.t_end < curve.t_start)
    ts = [curve.t_start] + ts + [curve.t_end]
    return [(p, q) for p, q in zip(ts[:-1], ts[1:]) if p != q]


@dataclass(frozen=True)
class AxialPieces:
    """A prepared profile's closed loops as pieces monotone in ``z``, grouped by kind (arrays).

    Lines: ``line`` (n, 4) holds z0, r0, z1, r1 in travel order (radial lines,
    z0 == z1, included). Arcs: ``arc`` (n, 5) holds cz, cr, R, angle from,
    angle to. Curves: ``curves`` is a tuple of (curve, t_from, t_to). Each
    kind has its loop factor (see :func:`section_loop_factors`) in
    ``*_factor``. ``z_ref`` is the middle of the profile along the axis;
    every ``z`` here is measured from it, so that moments lose no digits.
    ``z_min`` and ``z_max`` are the lowest and highest axial positions of the
    loops (in the frame, not measured from ``z_ref``).
    """

    line: np.ndarray
    line_factor: np.ndarray
    arc: np.ndarray
    arc_factor: np.ndarray
    curves: Tuple[Tuple[Curve, float, float], ...]
    curve_factor: np.ndarray
    z_ref: float
    z_min: float = 0.0
    z_max: float = 0.0


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
    import sympy
    return replace(curve, x_expr=curve.x_expr + sympy.Float(dz, 17))


def axial_pieces(prep: PreparedProfile, loop_factors: Sequence[float]) -> AxialPieces:
    """Split the closed loops of a prepared profile into pieces monotone along the axis.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> prep = prepare(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> p = axial_pieces(prep, [1.0])
    >>> p.z_ref, p.line.shape, p.arc.shape
    (1.0, (4, 4), (0, 5))
    """
    pairs = list(_loop_segments(prep, loop_factors))
    zs = [c for s, _ in pairs for c in (s.start[0], s.end[0])]
    z_ref = float((min(zs) + max(zs)) / 2) if zs else 0.0
    lines, lf, arcs, af, curves, cf = [], [], [], [], [], []
    for s, f in pairs:
        if isinstance(s, Line):
            lines.append((s.start[0] - z_ref, s.start[1], s.end[0] - z_ref, s.end[1]))
            lf.append(f)
        elif isinstance(s, Arc):
            cz, cr = s.centre[0] - z_ref, s.centre[1]
            for p, q in split_arc(s, math.pi):
                arcs.append((cz, cr, s.radius, p, q))
                af.append(f)
        elif isinstance(s, Curve):
            c = _shifted_curve(s, -z_ref)
            for p, q in split_curve(s, (2,)):
                curves.append((c, p, q))
                cf.append(f)
        else:  # pragma: no cover - the segment kinds are closed
            raise TypeError(type(s).__name__)
    line = np.array(lines, dtype=float).reshape(-1, 4)
    arc = np.array(arcs, dtype=float).reshape(-1, 5)
    ends = np.concatenate([line[:, [0, 2]].ravel(),
                           (arc[:, 0:1] + arc[:, 2:3] * np.cos(arc[:, 3:5])).ravel(),
                           np.array([float(c.evaluate(np.array([t]))[0][0])
                                     for c, ta, tb in curves for t in (ta, tb)])])
    z_min = float(ends.min()) + z_ref if ends.size else 0.0
    z_max = float(ends.max()) + z_ref if ends.size else 0.0
    return AxialPieces(line, np.array(lf, dtype=float), arc, np.array(af, dtype=float),
                       tuple(curves), np.array(cf, dtype=float), z_ref, z_min, z_max)


# -- clipping one level, segment by segment -------------------------------------------

def _curve_parameter_at_z(curve: Curve, ta: float, tb: float, z: np.ndarray) -> np.ndarray:
    """Parameters where a curve monotone in z on [ta, tb] reaches each z."""
    return curve_parameter_at(curve, ta, tb, z, coordinate=0)


def _arc_angle_at_z(cz, cr, R, a_from, a_to, z):
    """Angle in a z-monotone arc piece where the arc reaches axial position ``z`` (vectorised)."""
    mid = 0.5 * (a_from + a_to)
    s = np.where(np.sin(mid) >= 0, 1.0, -1.0)
    u = np.clip(z - cz, -R, R)
    h = np.sqrt(np.maximum((R - u) * (R + u), 0.0))
    base = np.arctan2(s * h, u)                      # in (-π, π], on the right half turn
    turns = np.round((mid - base) / TWO_PI)
    return base + turns * TWO_PI


@dataclass(frozen=True)
class ClippedProfile:
    """The part of a prepared profile's section below a level.

    ``prepared`` is a prepared profile (same side, size and tolerance as the
    original) holding, per loop that reaches below the level, its clipped
    loop; ``cut`` marks, per segment of each path, the straight cuts added
    along the level; ``loops`` gives the index of the original loop of each
    path, and ``factors`` its loop factor (see :func:`section_loop_factors`).
    ``touching`` holds the flat faces lying in the level plane: not part of
    the section below, but wetted by the liquid (unless nothing is below).
    """

    prepared: PreparedProfile
    cut: Tuple[Tuple[bool, ...], ...]
    loops: Tuple[int, ...]
    factors: Tuple[float, ...]
    level: float
    touching: Tuple[Segment, ...] = ()


def _kept_part(seg: Segment, level: float, tol: float) -> List[Segment]:
    """The parts of one frame segment with z < level, in travel order (pieces monotone in z)."""
    out: List[Segment] = []

    def snap(z):   # a vertex within the tolerance of the level is on it
        return level if abs(z - level) <= tol else z

    if isinstance(seg, Line):
        (z0, r0), (z1, r1) = seg.start, seg.end
        if z0 == z1:
            return [seg] if z0 < level - tol else []
        if max(snap(z0), snap(z1)) <= level:
            return [seg]
        if min(snap(z0), snap(z1)) >= level:
            return []
        s = (level - z0) / (z1 - z0)
        cut = (level, r0 + s * (r1 - r0))
        part = replace(seg, end=cut, exact=None) if z0 < z1 else replace(seg, start=cut, exact=None)
        return [part]
    if isinstance(seg, Arc):
        cz, cr = seg.centre
        R = seg.radius
        a_start, a_end = seg.angles()

        def at(angle):
            return (cz + R * math.cos(angle), cr + R * math.sin(angle))

        pieces = split_arc(seg, math.pi)
        if all(snap(cz + R * math.cos(p)) <= level and snap(cz + R * math.cos(q)) <= level
               for p, q in pieces) and max(snap(seg.start[0]), snap(seg.end[0])) <= level:
            return [seg]          # wholly below: keep it as it is
        for p, q in pieces:
            if R * abs(q - p) <= tol:
                continue          # a sliver of a few ulps would read as a full turn
            start = seg.start if p == a_start else at(p)
            end = seg.end if q == a_end else at(q)
            za, zb = snap(start[0]), snap(end[0])
            if max(za, zb) <= level:
                out.append(replace(seg, start=start, end=end, exact=None))
                continue
            if min(za, zb) >= level:
                continue
            a = float(_arc_angle_at_z(cz, cr, R, np.array(p), np.array(q), np.array(level)))
            # Keep only sub-arcs of real length: a sweep of a few ulps would read as a full turn.
            if za < zb and R * abs(a - p) > tol:
                out.append(replace(seg, start=start, end=(level, at(a)[1]), exact=None))
            elif za > zb and R * abs(q - a) > tol:
                out.append(replace(seg, start=(level, at(a)[1]), end=end, exact=None))
        return out
    if isinstance(seg, Curve):
        for p, q in split_curve(seg, (2,)):
            za = snap(float(seg.evaluate(np.array([p]))[0][0]))
            zb = snap(float(seg.evaluate(np.array([q]))[0][0]))
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
        return [s for s in out if abs(s.t_end - s.t_start) > 0 and s.length() > tol]
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
        Per loop, see :func:`section_loop_factors` (worked out when not given).

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
    factors = tuple(loop_factors) if loop_factors is not None else section_loop_factors(prep)
    paths, cuts, loops, depths, touching = [], [], [], [], []
    loop_no = -1
    for segs, closed in zip(prep.paths, prep.closed):
        if not closed:
            continue
        loop_no += 1
        kept: List[Segment] = []
        for s in segs:
            kept.extend(_kept_part(s, level, tol))
            if isinstance(s, Line) and s.start[0] == s.end[0] and abs(s.start[0] - level) <= tol:
                touching.append(s)
        if not kept:
            continue
        out: List[Segment] = []
        is_cut: List[bool] = []
        for k, s in enumerate(kept):
            out.append(s)
            is_cut.append(False)
            nxt = kept[(k + 1) % len(kept)]
            a, b = s.end, nxt.start
            if math.hypot(a[0] - b[0], a[1] - b[1]) > tol:
                # Only a crossing of the level leaves a gap: both ends lie on it.
                out.append(Line((level, a[1]), (level, b[1]), face=CUT_FACE))
                is_cut.append(True)
        paths.append(tuple(out))
        cuts.append(tuple(is_cut))
        loops.append(loop_no)
        depths.append(prep.depths[loop_no])
    clipped = PreparedProfile(tuple(paths), tuple(True for _ in paths), tuple(depths),
                              prep.side, prep.size, tol)
    return ClippedProfile(clipped, tuple(cuts), tuple(loops),
                          tuple(float(factors[k]) for k in loops), level,
                          tuple(touching) if paths else ())


def section_loop_factors(prep: PreparedProfile) -> Tuple[float, ...]:
    """Per closed loop, the factor (+1 or -1) that makes its signed integrals add or subtract.

    The sign of the loop's signed area times (-1) to the power of its nesting
    depth, as :func:`revolve.geometry.measure.section` counts them: a solid
    loop then adds and a hole subtracts, whichever way each one runs.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> outer = Loop.from_points([(0, 1), (4, 1), (4, 5), (0, 5)])          # counter-clockwise
    >>> hole = Loop.from_points([(1, 2), (2, 2), (2, 3), (1, 3)])           # counter-clockwise too
    >>> section_loop_factors(prepare(Profile(loops=(outer, hole)), Axis.x()))
    (1.0, -1.0)
    """
    from revolve.geometry.integrals import COL, segment_integrals

    out = []
    k = 0
    for segs, closed in zip(prep.paths, prep.closed):
        if not closed:
            continue
        z_ref = _middle(segs)
        area = float(segment_integrals([_shift(s, -z_ref) for s in segs],
                                       symbolic=False).values[:, COL["M00"]].sum())
        sign = 0.0 if area == 0 else (1.0 if area > 0 else -1.0)
        out.append(sign * (1.0 if prep.depths[k] % 2 == 0 else -1.0))
        k += 1
    return tuple(out)


def clipped_volume(clipped: ClippedProfile) -> float:
    """Pappus on a clipped section: 2π ∫∫ r dA, solid loops adding and holes subtracting."""
    from revolve.geometry.integrals import COL, segment_integrals

    total = 0.0
    for segs, f in zip(clipped.prepared.paths, clipped.factors):
        z_ref = _middle(segs)
        res = segment_integrals([_shift(s, -z_ref) for s in segs], symbolic=False)
        total += f * float(res.values[:, COL["M01"]].sum())
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


class _CurveCumulative:
    """Cumulative integrals of M01 and ∫ r ds along one curve piece, for any end parameter.

    The piece [ta, tb] is mapped to φ in [0, π] by t = m - h cos φ (smooth at
    ends with a vertical tangent); φ is cut into panels until 16- and
    32-point Gauss–Legendre agree, and partial integrals to any φ are the
    panel sums before it plus 32 nodes on the rest.
    """

    def __init__(self, curve: Curve, ta: float, tb: float, rel_tol: float = 1e-15):
        self.curve, self.ta, self.tb = curve, ta, tb
        self.mid, self.half = 0.5 * (ta + tb), 0.5 * (tb - ta)
        edges = np.linspace(0.0, math.pi, 9)
        for _ in range(40):
            lo = self._panels(edges[:-1], edges[1:], 16)
            hi = self._panels(edges[:-1], edges[1:], 32)
            scale = float(np.abs(hi).sum(axis=0).max()) or 1.0
            bad = np.abs(hi - lo).max(axis=1) > rel_tol * scale
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
        self.cumulative = np.vstack([np.zeros((1, 2)), np.cumsum(hi, axis=0)])
        self.error = float(np.abs(hi - lo).sum(axis=0).max())

    def _integrand(self, phi):
        t = self.mid - self.half * np.cos(phi)
        z, r, dz, dr = self.curve.evaluate(t)
        jac = self.half * np.sin(phi)
        w = z * dr - r * dz
        out = np.stack([r * w / 3.0 * jac, r * np.hypot(dz, dr) * np.abs(jac)], axis=-1)
        return np.nan_to_num(out, nan=0.0, posinf=0.0, neginf=0.0)

    def _panels(self, a, b, n):
        x, w = gauss_legendre(n)
        phi = 0.5 * (a + b)[:, None] + 0.5 * (b - a)[:, None] * x[None, :]
        vals = self._integrand(phi)                      # (panels, n, 2)
        return np.einsum("pnk,n->pk", vals, w) * (0.5 * (b - a))[:, None]

    def phi_of(self, t):
        c = np.clip((self.mid - np.asarray(t, dtype=float)) / self.half, -1.0, 1.0)
        return np.arccos(c)

    def upto(self, phi):
        """Integrals from φ = 0 to each φ (arrays), shape (len(phi), 2)."""
        phi = np.asarray(phi, dtype=float)
        k = np.clip(np.searchsorted(self.edges, phi, side="right") - 1, 0, len(self.edges) - 2)
        a = self.edges[k]
        return self.cumulative[k] + self._panels(a, phi, 32)

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
    closed forms of every kept sub-line and sub-arc, cumulative quadrature
    for curves, and the cut terms ``∓ level r²/6`` at each crossing.

    Examples
    --------
    A cone of radius 1 and height 1, point down at z = 0: V(h) = π h³/3.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> prep = prepare(Profile(loops=(Loop.from_points([(0, 0), (1, 1), (1, 0)]),)), Axis.x())
    >>> v = vertical_levels(prep, [0.5, 1.0]).volume
    >>> [round(float(x / (math.pi / 3)), 12) for x in v]
    [0.125, 1.0]
    """
    L = np.atleast_1d(np.asarray(levels, dtype=float))
    if pieces is None:
        if loop_factors is None:
            loop_factors = section_loop_factors(prep)
        pieces = axial_pieces(prep, loop_factors)
    pc = pieces
    Ls = L - pc.z_ref                                   # levels measured from z_ref
    m01 = np.zeros(L.shape)
    wet = np.zeros(L.shape)
    error = 0.0
    # Lines.
    tol = prep.tolerance
    empty = pc.z_min - pc.z_ref + tol                   # at or below this, nothing is wetted

    def snap(z, lv):   # a vertex within the tolerance of the level is on it
        return np.where(np.abs(z - lv) <= tol, lv, z)

    if pc.line.size:
        z0, r0, z1, r1 = (pc.line[:, i][:, None] for i in range(4))
        f = pc.line_factor[:, None]
        lv = Ls[None, :]
        radial = (z0 == z1)
        zs0, zs1 = snap(z0, lv), snap(z1, lv)
        zlo, zhi = np.minimum(zs0, zs1), np.maximum(zs0, zs1)
        dz = np.where(radial, 1.0, z1 - z0)
        s = np.clip((lv - z0) / dz, 0.0, 1.0)
        rc = r0 + s * (r1 - r0)
        crossing = ~radial & (zlo < lv) & (lv <= zhi)
        zc = np.where(crossing, lv, z0 + s * (z1 - z0))
        rising = z1 > z0
        # kept sub-line: from the start to the cut when rising, from the cut to the end otherwise
        a_z = np.where(rising, z0, zc)
        a_r = np.where(rising, r0, rc)
        b_z = np.where(rising, zc, z1)
        b_r = np.where(rising, rc, r1)
        mm, rd = _line_moments(a_z, a_r, b_z, b_r)
        kept = ~radial & (zlo < lv)
        radial_kept = radial & (z0 < lv - tol)
        # A flat face in the level plane is wetted (the liquid touches it), unless empty.
        radial_wet = radial_kept | (radial & (np.abs(z0 - lv) <= tol) & (lv > empty))
        mr, rdr = _line_moments(z0, r0, z1, r1)
        m01 += (f * (np.where(kept, mm, 0.0) + np.where(radial_kept, mr, 0.0))).sum(axis=0)
        wet += (np.where(kept, rd, 0.0) + np.where(radial_wet, rdr, 0.0)).sum(axis=0)
        direction = np.where(rising, 1.0, -1.0)
        m01 += (np.where(crossing, -direction * f * lv * rc * rc / 6.0, 0.0)).sum(axis=0)
    # Arcs.
    if pc.arc.size:
        cz, cr, R, a0, a1 = (pc.arc[:, i][:, None] for i in range(5))
        f = pc.arc_factor[:, None]
        lv = Ls[None, :]
        za, zb = cz + R * np.cos(a0), cz + R * np.cos(a1)
        zsa, zsb = snap(za, lv), snap(zb, lv)
        zlo, zhi = np.minimum(zsa, zsb), np.maximum(zsa, zsb)
        ac = _arc_angle_at_z(cz, cr, R, a0, a1, lv)
        full = lv >= zhi
        ac = np.where(full, np.where(za < zb, a1, a0), ac)
        ac = np.where(lv <= zlo, np.where(za < zb, a0, a1), ac)
        rising = za < zb
        p = np.where(rising, a0, ac)
        q = np.where(rising, ac, a1)
        mm, rd = _arc_moments(cz, cr, R, p, q)
        kept = zlo < lv
        m01 += (f * np.where(kept, mm, 0.0)).sum(axis=0)
        wet += np.where(kept, rd, 0.0).sum(axis=0)
        crossing = (zlo < lv) & (lv <= zhi)
        rc = cr + R * np.sin(ac)
        direction = np.where(rising, 1.0, -1.0)
        m01 += (np.where(crossing, -direction * f * lv * rc * rc / 6.0, 0.0)).sum(axis=0)
    # Curves.
    for (curve, ta, tb), f in zip(pc.curves, pc.curve_factor):
        cum = _CurveCumulative(curve, ta, tb)
        error += abs(f) * cum.error
        za = float(curve.evaluate(np.array([ta]))[0][0])
        zb = float(curve.evaluate(np.array([tb]))[0][0])
        zsa, zsb = snap(za, Ls), snap(zb, Ls)
        zlo, zhi = np.minimum(zsa, zsb), np.maximum(zsa, zsb)
        inside = (Ls > zlo) & (Ls < zhi)
        tc = np.where(Ls >= zhi, tb if za < zb else ta, ta if za < zb else tb)
        if inside.any():
            tc = tc.astype(float)
            tc[inside] = _curve_parameter_at_z(curve, ta, tb, Ls[inside])
        phi_c = cum.phi_of(tc)
        part = cum.upto(phi_c)                         # from ta to tc
        tot = cum.total()
        kept_vals = part if za < zb else tot[None, :] - part
        kept = Ls > zlo
        m01 += f * np.where(kept, kept_vals[:, 0], 0.0)
        wet += np.where(kept, kept_vals[:, 1], 0.0)
        crossing = (Ls > zlo) & (Ls <= zhi)
        if crossing.any():
            rc = curve.evaluate(tc)[1]
            direction = 1.0 if zb > za else -1.0
            m01 += np.where(crossing, -direction * f * Ls * rc * rc / 6.0, 0.0)
    return VerticalLevels(L, TWO_PI * m01, TWO_PI * wet, TWO_PI * error)
