"""Profiles, axes and revolutions: the value objects the engine measures.

A :class:`Profile` is one or more closed :class:`Loop` s (a solid section;
loops inside other loops are holes, whatever their direction) and/or open
:class:`Chain` s (a surface only: a sheet, a shell, a tank wall). An
:class:`Axis` is any line in the sketch plane. A :class:`Revolution` puts a
profile, an axis and an angle together; it is what
:func:`revolve.geometry.measure.measure` takes.

Examples
--------
>>> square = Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)])
>>> square.segments[0].chord_count(), square.segments[-1].end
(4, (0.0, 1.0))
>>> Axis.x().direction, Axis.y().direction
((1.0, 0.0), (0.0, 1.0))
>>> rev = Revolution(Profile(loops=(square,)), Axis.x(), 90.0)
>>> round(rev.angle_radians, 12) == round(math.pi / 2, 12)
True
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Iterable, Optional, Sequence, Tuple

from revolve.errors import ProfileError
from revolve.geometry.segments import COORDINATE_LIMIT, Point, Segment, Where


@dataclass(frozen=True)
class Loop:
    """A closed sequence of segments, each starting where the previous one ends.

    A loop bounds a section: revolved, it gives a volume and a surface.

    Parameters
    ----------
    segments : tuple of segments
        Lines, arcs, curves or polylines in order; the last ends where the
        first starts (checked when the profile is measured, by place).
    where : optional
        Where the loop came from in a file, for messages.

    Examples
    --------
    A 2 × 2 square 1 above the axis, from segments or from its corners:

    >>> import revolve
    >>> Loop = revolve.Loop                 # the public name (doctests may run on a copy of this module)
    >>> square = Loop((revolve.Line((0, 1), (2, 1)), revolve.Line((2, 1), (2, 3)),
    ...                revolve.Line((2, 3), (0, 3)), revolve.Line((0, 3), (0, 1))))
    >>> len(square.segments), Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]).segments[0].kind
    (4, 'polyline')

    Swept about x it is a tube, π (3² − 1²) · 2 = 16π; a loop touching the
    axis sweeps a solid, π 3² · 2 = 18π:

    >>> round(revolve.measure(revolve.Profile(loops=(square,))).volume / math.pi, 12)
    16.0
    >>> disc = Loop.from_points([(0, 0), (2, 0), (2, 3), (0, 3)])
    >>> round(revolve.measure(revolve.Profile(loops=(disc,))).volume / math.pi, 12)
    18.0

    An empty or open loop can be built, and is refused when measured:

    >>> revolve.measure(revolve.Profile(loops=(Loop(()),)))
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: the profile has no segments
    >>> revolve.measure(revolve.Profile(loops=(Loop(square.segments[:2]),)))
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: loop 1, segment 2: the loop is not closed: it ends at (2, 3) but starts at (0, 1); add a segment back to the start
    """

    segments: Tuple[Segment, ...]
    where: Optional[Where] = field(default=None, compare=False, repr=False)

    closed = True

    @classmethod
    def from_points(cls, points: Iterable[Sequence[float]], face: Optional[str] = None,
                    where: Optional[Where] = None) -> "Loop":
        """A polygon loop through ``points`` (a sequence of pairs or an (n, 2) array).

        The loop is one :class:`~revolve.geometry.kinds.polyline.Polyline`
        closed back to the first point (a last point equal to the first is
        not repeated); its edges are the polygon's sides, in order.

        >>> loop = Loop.from_points([(0, 0), (1, 0), (0, 1)])
        >>> seg, = loop.segments
        >>> seg.kind, seg.chord_count(), seg.points[-1].tolist()
        ('polyline', 3, [0.0, 0.0])
        >>> Loop.from_points([(0, 0), (1, 0), (0, 1), (0, 0)]).segments == loop.segments
        True
        >>> Loop.from_points([]).segments
        ()
        """
        if hasattr(points, "__array__"):
            # One copy, already closed: the polyline keeps it (read-only) without another.
            given = np.asarray(points, dtype=float).reshape(-1, 2)
            n = len(given)
            if n >= 2 and given[0, 0] == given[-1, 0] and given[0, 1] == given[-1, 1]:
                n -= 1
            if not n:
                return cls((), where=where)
            pts = np.empty((n + 1, 2))
            pts[:n] = given[:n]
            pts[n] = pts[0]
            pts.flags.writeable = False
            return cls((_polyline(pts, face, where),), where=where)
        pts = _point_array(points)
        if len(pts) >= 2 and pts[0, 0] == pts[-1, 0] and pts[0, 1] == pts[-1, 1]:
            pts = pts[:-1]
        if not len(pts):
            return cls((), where=where)
        return cls((_polyline(np.concatenate([pts, pts[:1]]), face, where),), where=where)


@dataclass(frozen=True)
class Chain:
    """An open sequence of segments: a surface without a section (sheet or shell).

    Parameters
    ----------
    segments : tuple of segments
        Lines, arcs, curves or polylines in order, each starting where the
        previous one ends.
    where : optional
        Where the chain came from in a file, for messages.

    Examples
    --------
    A straight wall 4 long at radius 2 sweeps a cylinder's side, 2π · 2 · 4 =
    16π, and no volume:

    >>> import revolve
    >>> Chain = revolve.Chain               # the public name (doctests may run on a copy of this module)
    >>> wall = Chain.from_points([(0, 2), (4, 2)])
    >>> r = revolve.measure(revolve.Profile(chains=(wall,)))
    >>> r.volume, round(r.surface_area / math.pi, 12)
    (0.0, 16.0)

    A chain lying on the axis sweeps nothing, and is refused:

    >>> revolve.measure(revolve.Profile(chains=(Chain.from_points([(0, 0), (4, 0)]),)))
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: the whole profile lies on the axis; it would sweep nothing
    """

    segments: Tuple[Segment, ...]
    where: Optional[Where] = field(default=None, compare=False, repr=False)

    closed = False

    @classmethod
    def from_points(cls, points: Iterable[Sequence[float]], face: Optional[str] = None,
                    where: Optional[Where] = None) -> "Chain":
        """An open polyline through ``points`` (a sequence of pairs or an (n, 2) array).

        The chain is one :class:`~revolve.geometry.kinds.polyline.Polyline`.

        >>> chain = Chain.from_points([(0, 1), (1, 1), (2, 2)])
        >>> [s.chord_count() for s in chain.segments], chain.segments[0].end
        ([2], (2.0, 2.0))
        >>> Chain.from_points([(0, 1)]).segments
        ()
        """
        pts = _point_array(points)
        if len(pts) < 2:
            return cls((), where=where)
        return cls((_polyline(pts, face, where),), where=where)


class _Numpy:
    """numpy, imported on first use: reading a profile of lines and arcs must not import it."""

    def __getattr__(self, name):
        import numpy

        return getattr(numpy, name)


np = _Numpy()


def _point_array(points):
    """``points`` as an (n, 2) float array (a copy when it is given as an array)."""
    if hasattr(points, "__array__"):
        pts = np.array(points, dtype=float)
    else:
        pts = np.array([(float(p[0]), float(p[1])) for p in points], dtype=float)
    return pts.reshape(-1, 2)


def _polyline(pts, face, where):
    from revolve.geometry.kinds.polyline import Polyline

    return Polyline(pts, face=face, where=where)


@dataclass(frozen=True)
class Profile:
    """A half-profile: closed loops (section) and open chains (surface only).

    ``unit`` is the length unit of every coordinate (a plain name such as
    ``"mm"``); the engine itself is unit-free.

    Parameters
    ----------
    loops : tuple of Loop
        Closed loops: the section (a loop inside another is a hole).
    chains : tuple of Chain
        Open chains: surfaces without a section.
    unit : str
        The length unit of every coordinate; default ``"mm"``.
    name, file : str, optional
        The part's name and the file it came from, for results and messages.

    Examples
    --------
    >>> ring = Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)], face="ring"),),
    ...                unit="in", name="ring")
    >>> ring.faces(), ring.unit
    (('ring',), 'in')

    An empty profile has no faces, and measuring it is refused:

    >>> Profile().faces()
    ()
    >>> import revolve
    >>> revolve.measure(revolve.Profile())
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: the profile has no loops or chains; give at least one closed loop
    """

    loops: Tuple[Loop, ...] = ()
    chains: Tuple[Chain, ...] = ()
    unit: str = "mm"
    name: Optional[str] = None
    file: Optional[str] = None

    @property
    def paths(self) -> Tuple:
        """Loops first, then chains."""
        return tuple(self.loops) + tuple(self.chains)

    def segments(self) -> Tuple[Segment, ...]:
        """Every segment, loops first.

        >>> Profile(loops=(Loop.from_points([(0, 1), (1, 1), (0, 2)]),)).segments()[0].kind
        'polyline'
        """
        return tuple(s for p in self.paths for s in p.segments)

    def faces(self) -> Tuple[str, ...]:
        """Face names in order of first appearance; unnamed segments are grouped as 'other'.

        >>> Profile(loops=(Loop.from_points([(0, 1), (1, 1), (0, 2)], face="cone"),)).faces()
        ('cone',)
        """
        seen: dict = {}
        for s in self.segments():
            seen.setdefault(s.face or UNNAMED_FACE, None)
        return tuple(seen)


UNNAMED_FACE = "other"


@dataclass(frozen=True)
class Axis:
    """The axis of revolution: a point on it and a direction, in sketch coordinates.

    Parameters
    ----------
    point : (float, float)
        A point on the axis.
    direction : (float, float)
        Its direction (any length but zero); :meth:`x` and :meth:`y` are the
        sketch axes.

    Examples
    --------
    >>> Axis.y(), [round(c, 12) for c in Axis((0, 0), (1, 1)).unit_direction()]
    (Axis(point=(0.0, 0.0), direction=(0.0, 1.0)), [0.707106781187, 0.707106781187])
    >>> Axis((0, 0), (0, 5)).unit_direction()
    (0.0, 1.0)
    >>> Axis((0, 0), (0, 0)).unit_direction()
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: the axis direction is zero; give a direction such as 1,0
    """

    point: Point = (0.0, 0.0)
    direction: Point = (1.0, 0.0)
    exact: Optional[tuple] = field(default=None, compare=False, repr=False)

    def __post_init__(self):
        """Refuse an axis whose point or direction is not a pair of finite numbers in range.

        The allowed range is that of profile coordinates, ``|value| ≤ 1e15``
        (:data:`~revolve.geometry.segments.COORDINATE_LIMIT`).

        >>> Axis((1e999, 0.0), (1.0, 0.0))
        Traceback (most recent call last):
        ...
        revolve.errors.ProfileError: the axis point (inf, 0) is not a pair of finite numbers within ±1e+15 (the allowed range of coordinates)
        >>> Axis((0.0, 0.0), (1e300, 1.0))
        Traceback (most recent call last):
        ...
        revolve.errors.ProfileError: the axis direction (1e+300, 1) is not a pair of finite numbers within ±1e+15 (the allowed range of coordinates)
        """
        for name, pair in (("point", self.point), ("direction", self.direction)):
            try:
                a, b = float(pair[0]), float(pair[1])
            except (TypeError, ValueError, IndexError, OverflowError):
                raise ProfileError(f"the axis {name} must be a pair of numbers, got {pair!r}")
            if not (abs(a) <= COORDINATE_LIMIT and abs(b) <= COORDINATE_LIMIT):
                raise ProfileError(f"the axis {name} ({a:g}, {b:g}) is not a pair of finite numbers "
                                   f"within ±{COORDINATE_LIMIT:g} (the allowed range of coordinates)")

    @classmethod
    def x(cls) -> "Axis":
        return cls((0.0, 0.0), (1.0, 0.0))

    @classmethod
    def y(cls) -> "Axis":
        return cls((0.0, 0.0), (0.0, 1.0))

    def unit_direction(self) -> Point:
        dx, dy = float(self.direction[0]), float(self.direction[1])
        n = math.hypot(dx, dy)
        if not math.isfinite(n) or n == 0:
            raise ProfileError("the axis direction is zero; give a direction such as 1,0")
        return (dx / n, dy / n)

    def to_frame(self, x, y):
        """Axial position ``z`` and signed distance ``r`` (left of the direction is positive).

        Works on floats and numpy arrays.

        >>> Axis.y().to_frame(3.0, 4.0)
        (4.0, -3.0)
        """
        ux, uy = self.unit_direction()
        px, py = float(self.point[0]), float(self.point[1])
        dx, dy = x - px, y - py
        return dx * ux + dy * uy, ux * dy - uy * dx

    def from_frame(self, z, r, side: float = 1.0):
        """Sketch coordinates of axial position ``z`` and distance ``r`` on ``side`` (+1 or -1).

        >>> Axis.y().from_frame(4.0, 3.0, side=-1.0)
        (3.0, 4.0)
        """
        ux, uy = self.unit_direction()
        px, py = float(self.point[0]), float(self.point[1])
        r = r * side
        return px + z * ux - r * uy, py + z * uy + r * ux


@dataclass(frozen=True)
class Revolution:
    """A profile swept about an axis through ``angle_degrees`` in (0, 360].

    Parameters
    ----------
    profile : Profile
        The half-profile.
    axis : Axis
        The axis of revolution; default the sketch x axis.
    angle_degrees : float
        The angle swept, above 0 and at most 360 (default).

    Examples
    --------
    A quarter turn of a 2 × 2 square 1 above the axis: a quarter of the
    tube's 16π:

    >>> import revolve
    >>> loop = revolve.Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)])
    >>> quarter = revolve.Revolution(revolve.Profile(loops=(loop,)), revolve.Axis.x(), 90)
    >>> round(revolve.measure(quarter).volume / math.pi, 12)
    4.0
    >>> Revolution(Profile(loops=(loop,)), Axis.x(), 0)
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: the revolution angle must be above 0 and at most 360 degrees, got 0
    """

    profile: Profile
    axis: Axis = field(default_factory=Axis.x)
    angle_degrees: float = 360.0

    def __post_init__(self):
        a = self.angle_degrees
        try:
            a = float(a)
        except (TypeError, ValueError):
            raise ProfileError(f"the revolution angle must be a number, got {a!r}")
        if not math.isfinite(a) or not (0.0 < a <= 360.0):
            raise ProfileError(f"the revolution angle must be above 0 and at most 360 degrees, "
                               f"got {a:g}")
        if a < 1e-9:  # tinier angles underflow in the radians and the moments (5e-324 did)
            raise ProfileError(f"the revolution angle {a:g} is too small to sweep anything; "
                               f"give at least 1e-09 degrees")

    @property
    def angle_radians(self) -> float:
        return math.radians(float(self.angle_degrees))

    @property
    def full(self) -> bool:
        return float(self.angle_degrees) == 360.0
