"""The envelope of a section and integrals of functions of the radius over it.

Pure math on a :class:`~revolve.geometry.checks.PreparedProfile` (axis frame:
``z`` along the axis, ``r`` from it), through the segment-kind contract only:

* :func:`extent` — the axial extent and the largest and smallest radius of the
  closed loops, from each segment's :meth:`bounds` (exact for lines, arcs and
  polylines; a curve's box comes from its turning points);
* :func:`radial_area_integral` — ∫∫ p(r) dA over the section, or over the part
  of it below a radius ``below``, for a polynomial ``p`` of degree ≤ 3;
* :func:`radial_boundary_integral` — ∫ p(r) ds along segments (degree ≤ 1),
  again optionally only where r < ``below``;
* :func:`ramp_area_integral` and :func:`ramp_boundary_integral` — the same for
  the ramp ``max(0, level − r)``, which is what a spindle speed limit adds to
  cutting times (:mod:`revolve.jobs.turning`).

How the integrals are exact
---------------------------
A polynomial in ``r`` integrates over a region through its moments
``M0k = ∫∫ r^k dA`` (k = 0…3), and each segment kind knows its sector moments
exactly (:mod:`revolve.geometry.integrals`; curves by the bounded quadrature
there, whose error estimate is carried through). A function that is a
polynomial below a radius ``c`` and zero above, like the ramp, needs the
moments of the section cut at ``r = c``. Each segment is split where its
radius crosses ``c`` (:meth:`parameters_at`, :meth:`split_at`) and only the
pieces below are kept; the moments are taken about a point *on* the line
``r = c``, where the sector form ``r^k (z dr − r dz)`` vanishes, so the part of
the cut region's boundary that runs along ``r = c`` contributes nothing and
need not be found. Summed with each loop's sign (solids add, holes subtract,
:attr:`PreparedProfile.loop_factors`) the pieces give the moments of the
section below ``c``: no sampling and no quadrature beyond the curves' own.

The functions turning needs are all of this form (a linear ramp cut at a
radius), so no general quadrature in ``r`` is offered here; a ``g`` that is not
piecewise polynomial in ``r`` would need one.

Examples
--------
A tube section 10 long between radii 1 and 3:

>>> from revolve.geometry.profile import Loop, Profile, Axis
>>> from revolve.geometry.checks import prepare
>>> tube = prepare(Profile(loops=(Loop.from_points([(0, 1), (10, 1), (10, 3), (0, 3)]),)), Axis.x())
>>> extent(tube)
Extent(z_min=0.0, z_max=10.0, r_min=1.0, r_max=3.0)
>>> radial_area_integral(tube, [0.0, 1.0]).value          # ∫∫ r dA = 10 (3² − 1²) / 2
40.0
>>> ramp_area_integral(tube, 2.0).value                   # ∫₁² (2 − r) dr × 10
5.0
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import List, Optional, Sequence, Tuple

import numpy as np

from revolve.geometry.integrals import COL, segment_integrals

#: The moment columns M00 … M03 (∫∫ r^k dA for k = 0…3), in order of k.
_AREA_COLUMNS = tuple(COL[name] for name in ("M00", "M01", "M02", "M03"))
#: The boundary columns ∫ ds and ∫ r ds, in order of k.
_LENGTH_COLUMNS = (COL["length"], COL["length_y"])


@dataclass(frozen=True)
class Extent:
    """The box of a section in the axis frame, in the profile's unit.

    >>> e = Extent(0.0, 40.0, 5.0, 16.0)
    >>> e.length, e.diameter
    (40.0, 32.0)
    """

    z_min: float
    z_max: float
    r_min: float
    r_max: float

    @property
    def length(self) -> float:
        """Axial length ``z_max − z_min``."""
        return self.z_max - self.z_min

    @property
    def diameter(self) -> float:
        """Largest diameter ``2 r_max``."""
        return 2.0 * self.r_max


@dataclass(frozen=True)
class Integral:
    """A value and a bound on its absolute error (from the curves' quadrature and rounding).

    >>> Integral(2.0, 0.0)
    Integral(value=2.0, error=0.0)
    """

    value: float
    error: float


def _loops(prepared) -> List[Tuple[tuple, float]]:
    """Each closed loop's segments with its sign (+1 solid, −1 hole, 0 no area)."""
    loops = [segs for segs, closed in zip(prepared.paths, prepared.closed) if closed]
    return list(zip(loops, prepared.loop_factors))


def extent(prepared) -> Optional[Extent]:
    """Axial extent and largest and smallest radius of a prepared profile's closed loops.

    Every segment's :meth:`bounds` counts, so an arc or curve that bulges past
    its ends counts at its crest. Chains hold no material and are left out.

    Parameters
    ----------
    prepared : PreparedProfile
        From :func:`revolve.geometry.checks.prepare`.

    Returns
    -------
    Extent or None
        None when the profile has no closed loop.

    Examples
    --------
    A collar 20 long whose top is an arc of radius 26 rising 2 above its ends at 18:

    >>> from revolve.geometry.profile import Loop, Profile, Axis, Chain
    >>> from revolve.geometry.segments import Line, arc_from_radius
    >>> from revolve.geometry.checks import prepare
    >>> top = arc_from_radius((20.0, 18.0), (0.0, 18.0), radius=26.0, side="right")
    >>> loop = Loop((Line((0.0, 0.0), (20.0, 0.0)), Line((20.0, 0.0), (20.0, 18.0)), top,
    ...              Line((0.0, 18.0), (0.0, 0.0))))
    >>> e = extent(prepare(Profile(loops=(loop,)), Axis.x()))
    >>> e.z_min, e.z_max, e.r_min, round(e.r_max, 12)
    (0.0, 20.0, 0.0, 20.0)
    >>> extent(prepare(Profile(chains=(Chain.from_points([(0, 1), (5, 1)]),)), Axis.x())) is None
    True
    """
    boxes = [s.bounds() for segs, closed in zip(prepared.paths, prepared.closed) if closed
             for s in segs]
    if not boxes:
        return None
    b = np.asarray(boxes, dtype=float)
    return Extent(float(b[:, 0].min()), float(b[:, 2].max()), float(b[:, 1].min()),
                  float(b[:, 3].max()))


def pieces_below(segments: Sequence, level: float, boxes=None) -> list:
    """The parts of ``segments`` where the radius (``y``) is below ``level``, in order.

    Each segment is cut where its radius equals ``level`` (:meth:`parameters_at`,
    :meth:`split_at`) and a piece is kept when its middle lies below. A piece
    that runs along ``r = level`` is dropped (it adds nothing to the integrals
    here). ``boxes`` may give each segment's :meth:`bounds` when already known.

    Examples
    --------
    >>> from revolve.geometry.segments import Line, arc_from_centre
    >>> [(p.start, p.end) for p in pieces_below([Line((0.0, 0.0), (4.0, 4.0))], 1.0)]
    [((0.0, 0.0), (1.0, 1.0))]
    >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
    >>> [tuple(round(v, 12) for v in p.end) for p in pieces_below([half], 0.5)]
    [(0.866025403784, 0.5), (-1.0, 0.0)]
    >>> pieces_below([Line((0.0, 2.0), (1.0, 2.0))], 2.0), pieces_below([], 1.0)
    ([], [])
    """
    out = []
    for k, seg in enumerate(segments):
        _, y_lo, _, y_hi = seg.bounds() if boxes is None else boxes[k]
        if y_hi < level:
            out.append(seg)
            continue
        if y_lo >= level:
            continue
        p0, p1 = seg.parameter_range()
        lo, hi = min(p0, p1), max(p0, p1)
        cuts = sorted({p for p in seg.parameters_at(1, level) if lo < p < hi},
                      reverse=p1 < p0)
        for piece in seg.split_at(cuts):
            q0, q1 = piece.parameter_range()
            if float(piece.points_at([0.5 * (q0 + q1)])[0][1]) < level:
                out.append(piece)
    return out


def _shift(coefficients: Sequence[float], level: float) -> np.ndarray:
    """Coefficients of ``p(r)`` written as a polynomial in ``u = r − level``.

    >>> _shift([1.0, 2.0, 3.0], 1.0).tolist()    # 1 + 2r + 3r² = 6 + 8u + 3u²
    [6.0, 8.0, 3.0]
    """
    c = np.asarray(coefficients, dtype=float)
    out = np.zeros_like(c)
    for k, ck in enumerate(c):
        for j in range(k + 1):
            out[j] += ck * math.comb(k, j) * level ** (k - j)
    return out


def _check_degree(coefficients, most: int, what: str) -> None:
    if not 1 <= len(coefficients) <= most + 1:
        raise ValueError(f"{what} takes a polynomial of degree at most {most} "
                         f"(1 to {most + 1} coefficients), got {len(coefficients)}")


def _reference(segments) -> Tuple[float, float]:
    """The middle of the segments' ends: moments about it lose no digits far from the origin.

    >>> from revolve.geometry.segments import Line
    >>> _reference([Line((1e9, 1.0), (1e9 + 2.0, 3.0))]), _reference([])
    ((1000000001.0, 2.0), (0.0, 0.0))
    """
    if not segments:
        return 0.0, 0.0
    e = np.asarray([s.start + s.end for s in segments], dtype=float).reshape(-1, 2)
    lo, hi = e.min(axis=0), e.max(axis=0)
    return float(lo[0] + hi[0]) / 2, float(lo[1] + hi[1]) / 2


def radial_area_integral(prepared, coefficients: Sequence[float],
                         below: Optional[float] = None) -> Integral:
    """∫∫ p(r) dA over the section (holes subtracted), or over its part where r < ``below``.

    ``p(r) = c₀ + c₁ r + c₂ r² + c₃ r³`` from the section moments M00 … M03
    (see the module notes); exact for lines, arcs and polylines, curves by
    their quadrature with its error estimate.

    Parameters
    ----------
    prepared : PreparedProfile
        From :func:`revolve.geometry.checks.prepare`; only closed loops count.
    coefficients : sequence of float
        ``c₀, c₁, …`` (one to four), in the profile's unit system.
    below : float, optional
        Integrate only where ``r < below``.

    Returns
    -------
    Integral

    Examples
    --------
    A disc of radius 2 and thickness 1 (a rectangle 1 × 2 on the axis):

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> disc = prepare(Profile(loops=(Loop.from_points([(0, 0), (1, 0), (1, 2), (0, 2)]),)), Axis.x())
    >>> radial_area_integral(disc, [1.0]).value, radial_area_integral(disc, [0, 0, 0, 1]).value
    (2.0, 4.0)
    >>> radial_area_integral(disc, [1.0], below=0.5).value
    0.5
    >>> radial_area_integral(disc, [1.0], below=0.0).value      # nothing below the axis
    0.0
    """
    _check_degree(coefficients, 3, "radial_area_integral")
    loops = _loops(prepared)
    every = [s for segs, _ in loops for s in segs]
    z_ref, r_mid = _reference(every)
    level = r_mid if below is None else float(below)
    pieces, signs = [], []
    for segs, sign in loops:
        kept = list(segs) if below is None else pieces_below(segs, level)
        pieces += [p.translated(-z_ref, -level) for p in kept]
        signs += [sign] * len(kept)
    if not pieces:
        return Integral(0.0, 0.0)
    res = segment_integrals(pieces)
    sign = np.asarray(signs, dtype=float)
    cols = list(_AREA_COLUMNS[:len(coefficients)])
    moments = (sign[:, None] * res.values[:, cols]).sum(axis=0)
    errors = (np.abs(sign)[:, None] * res.errors[:, cols]).sum(axis=0)
    d = _shift(coefficients, level)
    return Integral(float((d * moments).sum()), float((np.abs(d) * errors).sum()))


def radial_boundary_integral(segments: Sequence, coefficients: Sequence[float],
                             below: Optional[float] = None) -> Integral:
    """∫ p(r) ds along ``segments``, or along their parts where r < ``below``; p of degree ≤ 1.

    From each piece's exact length and ∫ r ds (curves by quadrature).

    Examples
    --------
    >>> from revolve.geometry.segments import Line, arc_from_centre
    >>> radial_boundary_integral([Line((0.0, 0.0), (0.0, 4.0))], [1.0, 1.0]).value   # ∫₀⁴ (1 + r) dr
    12.0
    >>> radial_boundary_integral([Line((0.0, 0.0), (0.0, 4.0))], [1.0], below=1.5).value
    1.5
    >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
    >>> round(radial_boundary_integral([half], [0.0, 1.0]).value, 12)          # ∫ r ds = 2 R²
    2.0
    >>> radial_boundary_integral([], [1.0])
    Integral(value=0.0, error=0.0)
    """
    _check_degree(coefficients, 1, "radial_boundary_integral")
    segments = list(segments)
    z_ref, r_mid = _reference(segments)
    level = r_mid if below is None else float(below)
    kept = segments if below is None else pieces_below(segments, level)
    if not kept:
        return Integral(0.0, 0.0)
    res = segment_integrals([p.translated(-z_ref, -level) for p in kept])
    cols = list(_LENGTH_COLUMNS[:len(coefficients)])
    d = _shift(coefficients, level)
    return Integral(float((d * res.values[:, cols].sum(axis=0)).sum()),
                    float((np.abs(d) * res.errors[:, cols].sum(axis=0)).sum()))


def ramp_area_integral(prepared, level: float) -> Integral:
    """∫∫ max(0, level − r) dA over the section (holes subtracted).

    Examples
    --------
    A rectangle 2 long from r = 0 to r = 3, cut at 1: 2 × ∫₀¹ (1 − r) dr = 1.

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> box = prepare(Profile(loops=(Loop.from_points([(0, 0), (2, 0), (2, 3), (0, 3)]),)), Axis.x())
    >>> round(ramp_area_integral(box, 1.0).value, 12), ramp_area_integral(box, 0.0).value
    (1.0, 0.0)
    """
    return radial_area_integral(prepared, [float(level), -1.0], below=level)


def ramp_boundary_integral(segments: Sequence, level: float) -> Integral:
    """∫ max(0, level − r) ds along ``segments``.

    Examples
    --------
    >>> from revolve.geometry.segments import Line
    >>> ramp_boundary_integral([Line((0.0, 0.0), (0.0, 4.0))], 2.0).value    # ∫₀² (2 − r) dr
    2.0
    """
    return radial_boundary_integral(segments, [float(level), -1.0], below=level)
