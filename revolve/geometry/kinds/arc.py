"""Circular arcs.

An arc's exact inputs say how it was given: :class:`ArcByRadius` (two ends, a
radius, the side of the chord and whether it is the major arc) or
:class:`ArcByCentre` (two ends, the centre and the direction of travel).

Examples
--------
>>> arc = arc_from_radius((1.0, 0.0), (0.0, 1.0), radius=1.0, side="right")
>>> round(arc.centre[0], 12), round(arc.centre[1], 12), arc.clockwise
(0.0, 0.0, False)
>>> round(arc.sweep(), 12) == round(math.pi / 2, 12)
True
"""

from __future__ import annotations

import math
import sys
from dataclasses import dataclass, field, replace
from typing import Any, NamedTuple, Optional, Union

from revolve.geometry.kinds.base import (FLAT_ARC_RATIO, IDENTITY_MATRIX, Point, SegmentKind, Where,
                                         finite_point, map_point, segment_error)


class ArcByRadius(NamedTuple):
    """Exact inputs of an arc given by its ends and radius."""

    how: str
    start: Any
    end: Any
    radius: Any
    side: str
    major: bool


class ArcByCentre(NamedTuple):
    """Exact inputs of an arc given by its ends and centre."""

    how: str
    start: Any
    end: Any
    centre: Any
    clockwise: bool


ArcExact = Union[ArcByRadius, ArcByCentre]


@dataclass(frozen=True)
class Arc(SegmentKind):
    """A circular arc from ``start`` to ``end`` about ``centre``.

    ``clockwise`` gives the direction of travel; the sweep is always below one
    full turn. Build arcs with :func:`arc_from_radius` or :func:`arc_from_centre`,
    which check the inputs.

    >>> a = arc_from_centre((2.0, 0.0), (-2.0, 0.0), centre=(0.0, 0.0), clockwise=False)
    >>> round(a.length(), 12) == round(2 * math.pi, 12)
    True
    """

    start: Point
    end: Point
    centre: Point
    clockwise: bool
    face: Optional[str] = None
    where: Optional[Where] = field(default=None, compare=False, repr=False)
    exact: Optional[ArcExact] = field(default=None, compare=False, repr=False)

    kind = "arc"

    def __post_init__(self):
        ex = self.exact
        if ex is not None and not isinstance(ex, (ArcByRadius, ArcByCentre)):
            object.__setattr__(self, "exact", (ArcByRadius if ex[0] == "radius" else ArcByCentre)(*ex))

    @property
    def radius(self) -> float:
        return math.hypot(self.start[0] - self.centre[0], self.start[1] - self.centre[1])

    def angles(self) -> tuple[float, float]:
        """Start angle and end angle (radians); their difference is the signed sweep."""
        a0 = math.atan2(self.start[1] - self.centre[1], self.start[0] - self.centre[0])
        return a0, a0 + self.sweep()

    def sweep(self) -> float:
        """Signed sweep in radians: positive counter-clockwise, never a full turn.

        >>> arc_from_radius((0.0, 0.0), (2.0, 0.0), radius=1.0, side="left").sweep() < 0
        True
        """
        a0 = math.atan2(self.start[1] - self.centre[1], self.start[0] - self.centre[0])
        a1 = math.atan2(self.end[1] - self.centre[1], self.end[0] - self.centre[0])
        d = a1 - a0
        if self.clockwise:
            while d >= 0:
                d -= 2 * math.pi
            while d < -2 * math.pi:
                d += 2 * math.pi
        else:
            while d <= 0:
                d += 2 * math.pi
            while d > 2 * math.pi:
                d -= 2 * math.pi
        # The difference of two angles far from zero keeps only their absolute precision
        # (about 1e-16 rad): for a flat arc (radius ≫ chord) take the sweep from the chord,
        # 2 asin(chord / 2R), which keeps its relative precision.
        R = self.radius
        chord = math.hypot(self.end[0] - self.start[0], self.end[1] - self.start[1])
        if 0 < R and math.isfinite(R) and chord < 2 * R:
            small = 2 * math.asin(chord / (2 * R))
            if abs(d) < 1.0:
                d = math.copysign(small, d)
            elif abs(d) > 2 * math.pi - 1.0:
                d = math.copysign(2 * math.pi - small, d)
        return d

    def length(self) -> float:
        return self.radius * abs(self.sweep())

    def reversed(self) -> "Arc":
        """The arc travelled the other way, its exact inputs turned round too.

        >>> a = arc_from_radius((0.0, 0.0), (2.0, 0.0), radius=1.0, exact=("radius", (0, 0), (2, 0), 1, "left", False))
        >>> a.reversed().exact.side, a.reversed().clockwise != a.clockwise
        ('right', True)
        """
        ex = self.exact
        if isinstance(ex, ArcByRadius):
            ex = ex._replace(start=ex.end, end=ex.start, side="right" if ex.side == "left" else "left")
        elif isinstance(ex, ArcByCentre):
            ex = ex._replace(start=ex.end, end=ex.start, clockwise=not ex.clockwise)
        return replace(self, start=self.end, end=self.start, clockwise=not self.clockwise, exact=ex)

    # -- the segment protocol: the parameter is the fraction 0…1 of the sweep ---------------

    def parameter_range(self):
        return (0.0, 1.0)

    def _special(self, a: float):
        """The exact point at an angle that is a multiple of π/2 (within rounding), else None."""
        k = round(a / (math.pi / 2))
        if abs(a - k * math.pi / 2) > 8 * sys.float_info.epsilon * max(1.0, abs(a)):
            return None
        cx, cy = self.centre
        R = self.radius
        return [(cx + R, cy), (cx, cy + R), (cx - R, cy), (cx, cy - R)][k % 4]

    def points_at(self, params):
        import numpy as np

        s = np.asarray(params, dtype=float).reshape(-1)
        a0 = math.atan2(self.start[1] - self.centre[1], self.start[0] - self.centre[0])
        d = self.sweep()
        a = a0 + s * d
        R = self.radius
        out = np.column_stack([self.centre[0] + R * np.cos(a), self.centre[1] + R * np.sin(a)])
        # the exact point at multiples of π/2 (as _special, for all parameters at once)
        k = np.round(a / (math.pi / 2))
        near = np.abs(a - k * (math.pi / 2)) <= 8 * sys.float_info.epsilon * np.maximum(1.0, np.abs(a))
        if near.any():
            cx, cy = self.centre
            table = np.array([(cx + R, cy), (cx, cy + R), (cx - R, cy), (cx, cy - R)])
            out[near] = table[np.mod(k[near], 4).astype(int)]
        out[s == 1.0] = self.end
        out[s == 0.0] = self.start
        return out

    def point_at(self, s: float) -> Point:
        x, y = self.points_at([s])[0]
        return (float(x), float(y))

    def tangents_at(self, params):
        import numpy as np

        s = np.asarray(params, dtype=float).reshape(-1)
        a0 = math.atan2(self.start[1] - self.centre[1], self.start[0] - self.centre[0])
        d = self.sweep()
        a = a0 + s * d
        R = self.radius
        return np.column_stack([-R * d * np.sin(a), R * d * np.cos(a)])

    def turning_parameters(self, coordinate: int):
        """Fractions of the sweep where ``x`` (0: angles kπ) or ``y`` (1: π/2 + kπ) turns back.

        >>> arc_from_centre((0.0, 1.0), (0.0, -1.0), (0.0, 0.0), clockwise=True).turning_parameters(0)
        [0.5]
        """
        a0, a1 = self.angles()
        d = a1 - a0
        lo, hi = min(a0, a1), max(a0, a1)
        base = 0.0 if coordinate == 0 else math.pi / 2
        ks = range(math.ceil((lo - base) / math.pi), math.floor((hi - base) / math.pi) + 1)
        out = sorted((base + k * math.pi - a0) / d for k in ks if lo < base + k * math.pi < hi)
        return [s for s in out if 0.0 < s < 1.0]

    def bounds(self):
        """Exact box: the ends and the quadrant points inside the sweep.

        >>> arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False).bounds()
        (-1.0, 0.0, 1.0, 1.0)
        """
        pts = [self.start, self.end]
        for c in (0, 1):
            pts += [tuple(p) for p in self.points_at(self.turning_parameters(c))]
        xs, ys = [p[0] for p in pts], [p[1] for p in pts]
        return (float(min(xs)), float(min(ys)), float(max(xs)), float(max(ys)))

    def parameters_at(self, coordinate: int, value: float):
        """Fractions of the sweep where ``x`` (0) or ``y`` (1) equals ``value``.

        >>> a = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
        >>> [round(s, 12) for s in a.parameters_at(1, 0.5)]     # sin a = 1/2: 30° and 150°
        [0.166666666667, 0.833333333333]
        """
        a0 = math.atan2(self.start[1] - self.centre[1], self.start[0] - self.centre[0])
        d = self.sweep()
        out = []
        for lo, hi in self.monotone_ranges(coordinate):
            pa, pb = self.points_at([lo, hi])
            va, vb = float(pa[coordinate]), float(pb[coordinate])
            if va == value:
                s = lo
            elif vb == value:
                s = hi
            elif (va < value) != (vb < value):
                u = (value - self.centre[coordinate]) / self.radius
                u = min(1.0, max(-1.0, u))
                base = math.acos(u) if coordinate == 0 else math.asin(u)
                cands = ([base, -base] if coordinate == 0 else [base, math.pi - base])
                aa, ab = a0 + lo * d, a0 + hi * d
                s = None
                for c in cands:
                    k = math.floor((min(aa, ab) - c) / (2 * math.pi))
                    for j in (k, k + 1, k + 2):
                        ang = c + 2 * math.pi * j
                        if min(aa, ab) - 1e-12 <= ang <= max(aa, ab) + 1e-12:
                            s = min(hi, max(lo, (ang - a0) / d))
                            break
                    if s is not None:
                        break
                if s is None:
                    continue
            else:
                continue
            if not out or out[-1] != s:
                out.append(s)
        return out

    def split_at(self, params) -> tuple:
        if not len(params):
            return (self,)
        pts = [self.start] + [self.point_at(s) for s in params] + [self.end]
        return tuple(replace(self, start=p, end=q, exact=None) for p, q in zip(pts[:-1], pts[1:]))

    def transformed(self, matrix=IDENTITY_MATRIX, offset=(0.0, 0.0), exact=None):
        a, b, c, d = matrix
        mirror = a * d - b * c < 0
        return replace(self, start=map_point(self.start, matrix, offset),
                       end=map_point(self.end, matrix, offset),
                       centre=map_point(self.centre, matrix, offset),
                       clockwise=(not self.clockwise) if mirror else self.clockwise, exact=None)

    def translated(self, dx: float, dy: float = 0.0):
        if dx == 0 and dy == 0:
            return self

        def mv(p):
            return (p[0] + dx, p[1] + dy)
        return replace(self, start=mv(self.start), end=mv(self.end), centre=mv(self.centre),
                       exact=None)

    def is_flat(self) -> bool:
        """Is the arc so flat (radius beyond FLAT_ARC_RATIO × chord, or not finite) it is a line?

        >>> arc_from_radius((0.0, 0.0), (1.0, 0.0), radius=1e200).is_flat()
        True
        >>> arc_from_radius((0.0, 0.0), (1.0, 0.0), radius=1e3).is_flat()
        False
        """
        chord = math.hypot(self.end[0] - self.start[0], self.end[1] - self.start[1])
        R = self.radius
        return not (math.isfinite(R) and math.isfinite(self.centre[0])
                    and math.isfinite(self.centre[1]) and R <= FLAT_ARC_RATIO * chord)

    def straightened(self):
        """A flat arc (see :meth:`is_flat`) as the line of its chord; else the arc.

        >>> arc_from_radius((0.0, 0.0), (1.0, 0.0), radius=1e12, face="top").straightened()
        Line(start=(0.0, 0.0), end=(1.0, 0.0), face='top')
        """
        if self.is_flat():
            from revolve.geometry.kinds.line import Line
            return Line(self.start, self.end, face=self.face, where=self.where)
        return self

    def snapped(self, tiny: float):
        def snap(p):
            return (0.0 if abs(p[0]) < tiny else p[0], 0.0 if abs(p[1]) < tiny else p[1])
        a, b, c = snap(self.start), snap(self.end), snap(self.centre)
        if (a, b, c) == (self.start, self.end, self.centre):
            return self
        return replace(self, start=a, end=b, centre=c)

    def flatten(self, max_angle: float = math.pi / 36, curve_pieces: int = 64):
        """Points every ``max_angle`` at most, the ends exact.

        >>> len(arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False).flatten())
        37
        """
        import numpy as np

        if self.is_flat():
            return np.array([self.start, self.end], dtype=float)
        a0, a1 = self.angles()
        m = max(2, int(math.ceil(abs(a1 - a0) / max_angle)))
        a = np.linspace(a0, a1, m + 1)
        pts = np.column_stack([self.centre[0] + self.radius * np.cos(a),
                               self.centre[1] + self.radius * np.sin(a)])
        pts[0], pts[-1] = self.start, self.end
        return pts

    @classmethod
    def integral_rows(cls, segments, symbolic: bool = False):
        """Closed forms for every arc at once.

        >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
        >>> v, e, how = Arc.integral_rows([half])
        >>> round(float(v[0][0]), 12) == round(math.pi, 12), how
        (True, ('closed form',))
        """
        import numpy as np

        from revolve.geometry.integrals import arc_integrals, closed_form_errors

        # The sweep itself, not the difference of the two angles (which loses its digits
        # on a flat arc).
        par = np.array([(a.centre[0], a.centre[1], a.radius, a.angles()[0], a.sweep())
                        for a in segments], dtype=float).reshape(-1, 5)
        ends = np.array([a.start + a.end for a in segments], dtype=float).reshape(-1, 4)
        values = arc_integrals(par[:, 0], par[:, 1], par[:, 2], par[:, 3], par[:, 4],
                               ends[:, :2], ends[:, 2:])
        return values, closed_form_errors(values), ("closed form",) * len(segments)

    # -- for meshes and pictures (mesh.py) ----------------------------------------------

    def flatten_to_tolerance(self, tolerance: float, most_pieces: int = 1_000_000):
        """Points whose chords stay within ``tolerance`` of the arc, shape (m + 1, 2).

        The arc is cut into the fewest equal pieces whose sagitta
        ``R (1 - cos(Δ/2))`` is at most ``tolerance`` (exact, through
        :func:`revolve.geometry.mesh.chord_steps`); the ends are the arc's own.

        Raises
        ------
        RevolveError
            When that needs more than ``most_pieces`` pieces.

        >>> quarter = arc_from_centre((1.0, 0.0), (0.0, 1.0), (0.0, 0.0), clockwise=False)
        >>> len(quarter.flatten_to_tolerance(1 - math.cos(math.pi / 8)))   # sagitta of 45°
        3
        >>> quarter.flatten_to_tolerance(10.0)[[0, -1]].tolist()            # coarse: quarter turns
        [[1.0, 0.0], [0.0, 1.0]]
        >>> quarter.flatten_to_tolerance(1e-12, most_pieces=100)
        Traceback (most recent call last):
        ...
        revolve.errors.RevolveError: the chord tolerance 1e-12 needs more than 100 pieces on one arc; use a larger tolerance
        """
        import numpy as np

        from revolve.errors import RevolveError

        n = self.fewest_chords(tolerance)
        if n > most_pieces:
            raise RevolveError(f"the chord tolerance {tolerance:g} needs more than {most_pieces:,} "
                               "pieces on one arc; use a larger tolerance")
        a0, a1 = self.angles()
        a = np.linspace(a0, a1, n + 1)
        pts = np.column_stack([self.centre[0] + self.radius * np.cos(a),
                               self.centre[1] + self.radius * np.sin(a)])
        pts[0], pts[-1] = self.start, self.end
        return pts

    def fewest_chords(self, tolerance: float) -> int:
        """How many chords :meth:`flatten_to_tolerance` gives: exact for an arc.

        >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
        >>> half.fewest_chords(1.0), half.fewest_chords(1 - math.cos(math.pi / 8))
        (2, 4)
        """
        from revolve.geometry.mesh import chord_steps

        a0, a1 = self.angles()
        return chord_steps(self.radius, a1 - a0, tolerance)

    # -- for profile files (writer.py) ---------------------------------------------------

    def describe_to(self, out) -> None:
        """Tell a profile writer ``out`` what the arc is, through its primitive ``arc``.

        ``out.arc(start, end, centre, clockwise, exact, where)``; ``exact`` is
        the typed record of how the arc was given (:class:`ArcByRadius`,
        :class:`ArcByCentre`) or None.

        >>> class Out:
        ...     def arc(self, start, end, centre, clockwise, exact, where):
        ...         print(start, end, centre, clockwise, exact)
        >>> arc_from_centre((1.0, 0.0), (0.0, 1.0), (0.0, 0.0), clockwise=False).describe_to(Out())
        (1.0, 0.0) (0.0, 1.0) (0.0, 0.0) False None
        """
        out.arc(self.start, self.end, self.centre, self.clockwise, self.exact, self.where)

    # -- for drawings: closing gaps between entities (dxf.py) ---------------------------

    def with_end_moved(self, point, at_start: bool = False):
        """None: an arc's end cannot move without changing its circle (a gap is bridged instead).

        >>> arc_from_centre((1.0, 0.0), (0.0, 1.0), (0.0, 0.0), clockwise=False).with_end_moved((0.0, 1.1)) is None
        True
        """
        return None

    # -- for level tables (clipping.py, horizontal.py)

    @classmethod
    def _cut_angles(cls, segments, step: float):
        """Every arc's angle range cut at the multiples of ``step`` inside it, for many arcs at once.

        The vectorised form of :meth:`turning_parameters` (``step = π``: where x
        turns back; ``π/2``: where x or y does). Returns ``(centre_x, centre_y,
        radius)`` per arc (arrays), and per piece, in travel order: its arc's
        index, its angle from and to, and the multiple ``k`` of ``step`` at each
        end (NaN at the arc's own ends; a piece end at ``k step`` is exact).

        >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
        >>> (cx, cy, R), (arc, a, b, ka, kb) = Arc._cut_angles([half], math.pi / 2)
        >>> arc.tolist(), [round(float(v), 6) for v in b], ka.tolist(), kb.tolist()
        ([0, 0], [1.570796, 3.141593], [nan, 1.0], [1.0, nan])
        >>> left = arc_from_centre((-0.6, -0.8), (-0.6, 0.8), (0.0, 0.0), clockwise=True)
        >>> Arc._cut_angles([left], math.pi)[1][3].tolist()     # through the angle -π
        [nan, -1.0]
        """
        import numpy as np

        par = np.array([(s.centre[0], s.centre[1], s.radius) + s.angles() for s in segments],
                       dtype=float).reshape(-1, 5)
        cx, cy, R, a0, a1 = par.T
        n = len(par)
        lo, hi = np.minimum(a0, a1), np.maximum(a0, a1)
        k = np.ceil(lo / step)[:, None] + np.arange(5)[None, :]      # a sweep is below 2π
        valid = (k * step > lo[:, None]) & (k * step < hi[:, None])
        down = (a1 < a0)[:, None]
        key = np.where(valid, np.where(down, -k, k), np.inf)
        order = np.argsort(key, axis=1, kind="stable")
        k = np.take_along_axis(k, order, axis=1)
        count = valid.sum(axis=1)
        width = k.shape[1] + 2
        ends_k = np.full((n, width), np.nan)
        cols = np.arange(width)[None, :]
        inner = (cols >= 1) & (cols <= count[:, None])
        ends_k[inner] = k[:, :width - 2][np.arange(width - 2)[None, :] < count[:, None]]
        angle = np.where(inner, ends_k * step, 0.0)
        angle[:, 0] = a0
        angle[np.arange(n), count + 1] = a1
        pieces = (cols[:, :-1] <= count[:, None])          # piece m runs from end m to m + 1
        arc = np.broadcast_to(np.arange(n)[:, None], pieces.shape)[pieces]
        a_from, a_to = angle[:, :-1][pieces], angle[:, 1:][pieces]
        k_from, k_to = ends_k[:, :-1][pieces], ends_k[:, 1:][pieces]
        return (cx, cy, R), (arc, a_from, a_to, k_from, k_to)

    @classmethod
    def axial_level_table(cls, segments, factors):
        """Arcs in the axis frame cut where ``z`` turns back, as circular rows (vertical tables).

        Rows: centre, radius, angle from, angle to, then the ends (z0, r0, z1, r1):
        the arc's own ends, or the exact points ``(cz ± R, cr)`` where it was cut.

        >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
        >>> [round(float(v), 12) for v in Arc.axial_level_table([half], [1.0]).rows[0]]
        [0.0, 0.0, 1.0, 0.0, 3.14159265359, 1.0, 0.0, -1.0, 0.0]
        >>> Arc.axial_level_table([half.reversed().transformed((0.0, 1.0, 1.0, 0.0))], [1.0]).rows.shape
        (2, 9)
        """
        import numpy as np

        from revolve.geometry.clipping import CircularPieces

        (cx, cy, R), (arc, a_from, a_to, k_from, k_to) = cls._cut_angles(segments, math.pi)
        se = np.array([s.start + s.end for s in segments], dtype=float).reshape(-1, 4)

        def end(k, own):
            own_end = np.isnan(k)
            sign = np.where(np.nan_to_num(k) % 2 == 0, 1.0, -1.0)
            return (np.where(own_end, own[:, 0], cx[arc] + sign * R[arc]),
                    np.where(own_end, own[:, 1], cy[arc]))

        z0, r0 = end(k_from, se[arc][:, 0:2])
        z1, r1 = end(k_to, se[arc][:, 2:4])
        rows = np.column_stack([cx[arc], cy[arc], R[arc], a_from, a_to, z0, r0, z1, r1])
        return CircularPieces(rows, np.asarray(factors, dtype=float)[arc])

    def _sub_arc(self, start, end):
        """The part from ``start`` to ``end``: an arc, or its chord when so short that its sweep
        is lost in rounding (a sweep of a few ulps would read as a full turn).

        >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
        >>> [p.kind for p in half._sub_arc((0.0, 1.0), (-1.0, 0.0))], half._sub_arc((0.0, 1.0), (0.0, 1.0))
        (['arc'], ())
        """
        if start == end:
            return ()
        part = replace(self, start=start, end=end, exact=None)
        if abs(part.sweep()) <= math.pi * (1 + 1e-9):
            return (part,)
        from revolve.geometry.kinds.line import Line
        return (Line(start, end, face=self.face, where=self.where),)

    def part_below(self, level: float, tolerance: float = 0.0):
        """``(parts with x < level, ())``: arcs about the same centre (an arc never lies flat).

        The radius at a cut is found from the lower end of its piece
        (``√((R - u)(R + u))``), so a level a hair above a rounded bottom keeps its
        digits; no point is moved onto the level.

        >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
        >>> [(p.start, p.end) for p in half.part_below(0.0)[0]]
        [((0.0, 1.0), (-1.0, 0.0))]
        >>> half.part_below(-1.0), len(half.part_below(1.0)[0])
        (((), ()), 1)
        """
        from revolve.geometry.clipping import _arc_cut

        (cz, cr), R = self.centre, self.radius
        rows = type(self).axial_level_table([self], [1.0]).rows
        points = [self.start] + [(float(z), float(r)) for z, r in rows[:-1, 7:9]] + [self.end]
        angles = [float(a) for a in rows[:, 3]] + [float(rows[-1, 4])]
        if max(z for z, _ in points) <= level:
            return (self,), ()          # wholly below (or touching from below): as it is
        out = []
        for k in range(len(points) - 1):
            start, end = points[k], points[k + 1]
            za, zb = start[0], end[0]
            if max(za, zb) <= level:
                out.extend(self._sub_arc(start, end))
                continue
            if min(za, zb) >= level:
                continue
            _, rc = _arc_cut(cz, cr, R, angles[k], angles[k + 1], level, z_low=min(za, zb))
            cut = (level, float(rc))
            out.extend(self._sub_arc(start, cut) if za < zb else self._sub_arc(cut, end))
        return tuple(out), ()

    @classmethod
    def radial_level_table(cls, segments, factors, z_ref: float = 0.0):
        """Arcs cut at every quarter turn (r and z monotone on each), as circular rows.

        The centre's z is measured from ``z_ref``; the angles inside are exact
        multiples of π/2.

        >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
        >>> t = Arc.radial_level_table([half], [1.0])
        >>> [[round(float(v), 6) for v in row] for row in t.arc]
        [[0.0, 0.0, 1.0, 0.0, 1.570796], [0.0, 0.0, 1.0, 1.570796, 3.141593], [0.0, 0.0, 1.0, 0.0, 3.141593]]
        """
        import numpy as np

        from revolve.geometry.horizontal import CircularRows

        (cx, cy, R), (arc, a_from, a_to, _, _) = cls._cut_angles(segments, math.pi / 2)
        centres = np.column_stack([cx - z_ref, cy, R])
        return CircularRows.from_pieces(centres, arc, a_from, a_to, np.asarray(factors, dtype=float))

    # -- for the washer cross-check (slicing.py) ------------------------------------------

    @classmethod
    def washer_pieces(cls, segments):
        """Pieces of many arcs along which the axial position moves one way, as arrays.

        Each arc is cut at its :meth:`monotone_ranges` in ``z`` (where it
        turns back along the axis); the ends come from :meth:`points_at`
        (exact at a turning point). See :meth:`Line.washer_pieces
        <revolve.geometry.kinds.line.Line.washer_pieces>` for what is
        returned; an arc's row is ``cz, cr, R, s, u_e, r_e, √(R² − u_e²)``: the
        centre, the radius, the side of the centre the piece lies on (``s`` =
        ±1) and a known point of the piece (its start, ``u_e = z_e − cz``)
        given without the square root of a rounded difference (exactly ``±R``,
        ``cr`` and 0 at a turning point), for :meth:`washer_radius`.

        Examples
        --------
        >>> top = arc_from_centre((0.0, 1.0), (0.0, -1.0), (0.0, 0.0), clockwise=True)
        >>> zf, zt, counts, params = Arc.washer_pieces([top])
        >>> zf.tolist(), zt.tolist(), counts.tolist()
        ([0.0, 1.0], [1.0, 0.0], [2])
        >>> params[1].tolist()        # below the centre, from the turning point (1, 0)
        [0.0, 0.0, 1.0, -1.0, 1.0, 0.0, 0.0]
        """
        import numpy as np

        rows, counts = [], []
        for arc in segments:
            (cz, cr), R = arc.centre, arc.radius
            a0, d = arc.angles()[0], arc.sweep()
            ranges = arc.monotone_ranges(0)
            for p0, p1 in ranges:
                (z0, _), (z1, _) = arc.points_at([p0, p1])
                s = 1.0 if math.sin(a0 + 0.5 * (p0 + p1) * d) > 0 else -1.0
                if p0 == 0.0:
                    ue, re, root_e = arc.start[0] - cz, arc.start[1], abs(arc.start[1] - cr)
                else:
                    ue, re, root_e = (R if z0 > cz else -R), cr, 0.0
                rows.append((z0, z1, cz, cr, R, s, ue, re, root_e))
            counts.append(len(ranges))
        table = np.array(rows, dtype=float).reshape(-1, 9)
        return table[:, 0], table[:, 1], np.array(counts, dtype=np.int64), table[:, 2:]

    @classmethod
    def washer_radius(cls, segments, params, z):
        """The radius at axial positions ``z`` (rows (m, q)) along arc pieces ``params`` (m, 7).

        ``r(z) = cr + s √(R² − u²)``, ``u = z − cz``, written from the piece's
        known point as ``r_e + s (u_e − u)(u_e + u) / (√(R² − u²) + √(R² − u_e²))``:
        the same value, without the cancellation of ``cr`` against the root when
        the centre is far (a flat arc).

        >>> import numpy as np
        >>> top = arc_from_centre((0.0, 1.0), (0.0, -1.0), (0.0, 0.0), clockwise=True)
        >>> _, _, _, params = Arc.washer_pieces([top])
        >>> r = Arc.washer_radius([top], params, np.array([[0.6, 1.0], [0.6, 0.0]]))
        >>> [[round(float(v), 12) for v in row] for row in r]
        [[0.8, 0.0], [-0.8, -1.0]]
        """
        import numpy as np

        cz, cr, R, s, ue, re, root_e = (params[:, k:k + 1] for k in range(7))
        u = z - cz
        root = np.sqrt(np.maximum((R - u) * (R + u), 0.0))
        with np.errstate(invalid="ignore", divide="ignore"):
            r = re + s * (ue - u) * (ue + u) / (root + root_e)
        return np.where(root + root_e > 0, r, cr + s * root)

    @classmethod
    def washer_degree(cls):
        """None: the radius along an arc is not a polynomial of ``z``.

        The washers then use Gauss–Legendre in ``φ``, ``z = mid − half·cos φ``,
        which smooths the square-root behaviour at a turning point.

        >>> Arc.washer_degree() is None
        True
        """
        return None

    @classmethod
    def r_ds_rows(cls, segments, n: int = 32, rel_tol: float = 1e-14):
        """``∫ r ds`` along each arc by Gauss–Legendre in the angle, ``n`` and ``2n`` nodes.

        Returns ``(values, errors)``: the finer sum and the difference of the two.
        ``r = r0 + R (sin θ − sin θ0)`` is taken as a product, without cancellation
        against a far centre.

        >>> half = arc_from_centre((1.0, 0.0), (-1.0, 0.0), (0.0, 0.0), clockwise=False)
        >>> v, e = Arc.r_ds_rows([half])          # ∫ sin θ dθ over [0, π] = 2
        >>> round(float(v[0]), 13), bool(e[0] < 1e-13)
        (2.0, True)
        """
        import numpy as np

        from revolve.geometry.quadrature import gauss_legendre

        par = np.array([(a.start[1], a.radius, a.angles()[0], a.sweep()) for a in segments],
                       dtype=float).reshape(-1, 4)
        r0, R, a0, d = par.T
        out = []
        for m in (n, 2 * n):
            x, w = gauss_legendre(m)
            half = ((x[None, :] + 1) / 4) * d[:, None]          # (θ − θ0)/2
            r = r0[:, None] + 2 * R[:, None] * np.cos(a0[:, None] + half) * np.sin(half)
            out.append(np.einsum("ij,j->i", r, w) * R * np.abs(d) / 2)
        return out[1], np.abs(out[1] - out[0])



def arc_from_radius(start: Point, end: Point, radius: float, side: str = "left",
                    major: bool = False, face: Optional[str] = None,
                    where: Optional[Where] = None, exact: Optional[tuple] = None) -> "Arc":
    """An arc through two points with a given radius.

    ``side`` says on which side of the chord, looking from ``start`` to
    ``end``, the arc lies ("left" or "right"). ``major=True`` takes the arc
    longer than a half circle. A radius shorter than half the chord is refused.

    Parameters
    ----------
    start, end : (float, float)
        The ends, in the profile's unit.
    radius : float
        The radius, at least half the chord.
    side : {"left", "right"}
        The side of the chord the arc bows to, looking from start to end.
    major : bool
        Take the arc longer than a half circle.
    face : str, optional
        The face the arc belongs to.

    Returns
    -------
    Arc

    Examples
    --------
    A half circle of radius 1 (length π):

    >>> a = arc_from_radius((0.0, 0.0), (2.0, 0.0), radius=1.0, side="right")
    >>> [round(v, 12) for v in a.centre], a.clockwise
    ([1.0, 0.0], False)
    >>> round(a.length() / math.pi, 12)
    1.0
    >>> arc_from_radius((0.0, 0.0), (0.0, 0.0), radius=1.0)
    Traceback (most recent call last):
    ...
    revolve.errors.SegmentError: arc start and end are the same point; an arc needs two distinct ends
    >>> arc_from_radius((0.0, 0.0), (2.0, 0.0), radius=0.9)
    Traceback (most recent call last):
    ...
    revolve.errors.SegmentError: arc radius 0.9 is shorter than half the chord (1); make the radius at least 1
    """
    start = finite_point(start, "arc start", where)
    end = finite_point(end, "arc end", where)
    try:
        radius = float(radius)
    except (TypeError, ValueError):
        raise segment_error(f"arc radius must be a number, got {radius!r}", where)
    if not math.isfinite(radius) or radius <= 0:
        raise segment_error(f"arc radius must be a positive finite number, got {radius}", where)
    if side not in ("left", "right"):
        raise segment_error(f"arc side must be 'left' or 'right', got {side!r}", where)
    dx, dy = end[0] - start[0], end[1] - start[1]
    chord = math.hypot(dx, dy)
    if chord == 0:
        raise segment_error("arc start and end are the same point; an arc needs two distinct ends", where)
    half = chord / 2
    if radius < half * (1 - 1e-12):
        raise segment_error(f"arc radius {radius:g} is shorter than half the chord ({half:g}); "
                     f"make the radius at least {half:g}", where)
    h = math.sqrt(max(radius * radius - half * half, 0.0))
    mx, my = (start[0] + end[0]) / 2, (start[1] + end[1]) / 2
    lx, ly = -dy / chord, dx / chord  # unit normal pointing left of the chord
    # A minor arc lying on the left has its centre on the right, and vice versa.
    sign = -1.0 if side == "left" else 1.0
    if major:
        sign = -sign
    centre = (mx + sign * h * lx, my + sign * h * ly)
    # Arc on the left of the chord is travelled clockwise (bowing up then down).
    clockwise = side == "left"
    return Arc(start, end, centre, clockwise, face=face, where=where, exact=exact)


def arc_from_centre(start: Point, end: Point, centre: Point, clockwise: bool,
                    face: Optional[str] = None, where: Optional[Where] = None,
                    tolerance: float = 1e-9, exact: Optional[tuple] = None) -> "Arc":
    """An arc about a given centre; start and end must be equally far from it.

    Parameters
    ----------
    start, end, centre : (float, float)
        The ends and the centre, in the profile's unit.
    clockwise : bool
        The direction from start to end.
    face : str, optional
        The face the arc belongs to.
    tolerance : float
        Relative difference allowed between the two radii.

    Returns
    -------
    Arc

    Examples
    --------
    A quarter circle of radius 2 about the origin (length π):

    >>> q = arc_from_centre((2.0, 0.0), (0.0, 2.0), (0.0, 0.0), clockwise=False)
    >>> round(q.length() / math.pi, 12), q.bounds()
    (1.0, (0.0, 0.0, 2.0, 2.0))
    >>> arc_from_centre((1.0, 0.0), (1.0, 0.0), (0.0, 0.0), clockwise=False)
    Traceback (most recent call last):
    ...
    revolve.errors.SegmentError: arc start and end are the same point; split a full circle into two arcs
    >>> arc_from_centre((1.0, 0.0), (0.0, 2.0), (0.0, 0.0), clockwise=False)
    Traceback (most recent call last):
    ...
    revolve.errors.SegmentError: arc start is 1 from the centre but the end is 2; they must be equal
    """
    start = finite_point(start, "arc start", where)
    end = finite_point(end, "arc end", where)
    centre = finite_point(centre, "arc centre", where)
    r0 = math.hypot(start[0] - centre[0], start[1] - centre[1])
    r1 = math.hypot(end[0] - centre[0], end[1] - centre[1])
    if r0 == 0:
        raise segment_error("arc centre coincides with its start point", where)
    if abs(r0 - r1) > tolerance * max(r0, r1):
        raise segment_error(f"arc start is {r0:g} from the centre but the end is {r1:g}; "
                     "they must be equal", where)
    if start == end:
        raise segment_error("arc start and end are the same point; split a full circle into two arcs",
                     where)
    return Arc(start, end, centre, bool(clockwise), face=face, where=where, exact=exact)


