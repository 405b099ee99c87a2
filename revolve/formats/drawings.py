"""Profiles from drawings: the readers' shared report, checks, and lazy entry points.

The drawing readers live in :mod:`revolve.formats.svg` (SVG path data and
SVG files) and :mod:`revolve.formats.dxf` (DXF through ezdxf). Importing
this module imports neither of them, nor sympy, numpy or ezdxf: the reader
functions here import the real reader when they are called.
:data:`revolve.formats.READERS` names them by file ending and imports this
module only when a drawing is read.

Each reader returns a :class:`~revolve.formats.document.ProfileDocument`
and, through its ``*_drawing`` function, a :class:`DrawingReport`: the
loops and open chains it found, the gaps it closed, what it skipped and why,
where the unit and the axis came from.

Examples
--------
>>> report = DrawingReport(source="a.svg", kind="SVG file", unit="mm",
...                        unit_source="assumed: the drawing does not say")
>>> report.as_dict()["loops"], report.summary_line()
([], 'a.svg (SVG file): no loops, no open chains; unit mm (assumed: the drawing does not say)')
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Any, Dict, Optional, Sequence, Tuple

from revolve.errors import FormatError, ProfileError
from revolve.formats.document import ProfileDocument

#: Largest coordinate (or other length) a drawing may hold, in its own unit: squares and cubes
#: of it (areas, volumes, second moments) stay far inside the range of floating point.
MAX_COORDINATE = 1e15
#: Largest drawing file read, in bytes.
MAX_DRAWING_BYTES = 64 * 1024 * 1024


def one_line(text: Any) -> str:
    """``text`` with every control character (newline, tab, ...) escaped as Python writes it.

    Messages from libraries or from a user's own input may carry a newline;
    an error must stay one line.

    >>> one_line('Invalid group code "1e9\\n"')
    'Invalid group code "1e9\\\\n"'
    >>> one_line("plain")
    'plain'
    """
    text = str(text)
    return "".join(repr(ch)[1:-1] if (ord(ch) < 32 or 127 <= ord(ch) < 160) else ch
                   for ch in text)


def checked_number(value: Any, what: str, *, file: Optional[str] = None,
                   line: Optional[int] = None, place: Optional[str] = None) -> float:
    """``value`` as a float, refused unless finite and within :data:`MAX_COORDINATE`.

    Raises
    ------
    FormatError
        Naming ``what``, the value and the allowed range.

    Examples
    --------
    >>> checked_number("2.5", "x")
    2.5
    >>> checked_number(1e308, "the centre's x", file="a.dxf", place="CIRCLE #1")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: a.dxf: CIRCLE #1: the centre's x is 1e+308, outside the range read (-1e+15 to 1e+15 in the drawing's unit); squares and cubes of larger numbers overflow
    >>> checked_number(float("nan"), "a bulge")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: a bulge is nan, not a finite number
    """
    try:
        v = float(value)
    except (TypeError, ValueError, OverflowError):
        raise FormatError(f"{what} is not a number ({one_line(repr(value))[:40]})", file=file,
                          line=line, place=place) from None
    if not math.isfinite(v):
        raise FormatError(f"{what} is {v}, not a finite number", file=file, line=line,
                          place=place)
    if abs(v) > MAX_COORDINATE:
        raise FormatError(f"{what} is {v:g}, outside the range read (-{MAX_COORDINATE:g} to "
                          f"{MAX_COORDINATE:g} in the drawing's unit); squares and cubes of "
                          "larger numbers overflow", file=file, line=line, place=place)
    return v


def check_file_size(path: str, limit: int = MAX_DRAWING_BYTES) -> None:
    """Refuse a drawing larger than ``limit`` bytes (a missing file is left to the reader).

    >>> check_file_size("no_such_file.dxf")
    """
    import os

    try:
        size = os.path.getsize(path)
    except OSError:
        return
    if size > limit:
        raise FormatError(f"the drawing is {size / 2 ** 20:.0f} MiB, more than the "
                          f"{limit / 2 ** 20:.0f} MiB read; simplify or split it", file=path)


@dataclass(frozen=True)
class PathFound:
    """One loop or open chain a reader found.

    Attributes
    ----------
    kind : str
        ``"loop"`` or ``"chain"``.
    index : int
        Its number among the profile's loops (or chains), from 1.
    lines, arcs, curves : int
        How many segments of each kind it has.
    polylines : int
        How many polyline segments (long runs of straight edges held as one
        array) it has.
    start : tuple of float
        Its first point, in the profile's coordinates.
    source : str
        Where it came from: a subpath and its position in the path data, or
        the drawing entities it was chained from.
    """

    kind: str
    index: int
    lines: int
    arcs: int
    curves: int
    start: Tuple[float, float]
    source: str
    polylines: int = 0

    def as_dict(self) -> Dict[str, Any]:
        return {"kind": self.kind, "index": self.index, "lines": self.lines, "arcs": self.arcs,
                "curves": self.curves, "polylines": self.polylines, "start": list(self.start),
                "source": self.source}

    def describe(self) -> str:
        """One line, e.g. ``loop 1: 3 lines, 1 arc from subpath 1 (character 1)``.

        >>> PathFound("loop", 1, 3, 1, 0, (0.0, 0.0), "subpath 1").describe()
        'loop 1: 3 lines, 1 arc; from subpath 1'
        >>> PathFound("loop", 1, 0, 0, 0, (0.0, 0.0), "LWPOLYLINE #1", polylines=1).describe()
        'loop 1: 1 polyline; from LWPOLYLINE #1'
        """
        parts = [f"{n} {word}{'' if n == 1 else 's'}"
                 for n, word in ((self.lines, "line"), (self.arcs, "arc"), (self.curves, "curve"),
                                 (self.polylines, "polyline"))
                 if n]
        return f"{self.kind} {self.index}: {', '.join(parts) or 'no segments'}; from {self.source}"


@dataclass(frozen=True)
class GapClosed:
    """A gap between two ends that the reader closed because it was within the tolerance.

    ``how`` says what was done: an end of a straight line moved onto the other
    end, or a short straight line added across the gap.
    """

    at: Tuple[float, float]
    size: float
    between: Tuple[str, str]
    how: str

    def as_dict(self) -> Dict[str, Any]:
        return {"at": list(self.at), "size": self.size, "between": list(self.between),
                "how": self.how}

    def describe(self) -> str:
        """One line.

        >>> GapClosed((1.0, 2.0), 1e-7, ("LINE #1", "ARC #2"), "moved the line's end").describe()
        "gap of 1e-07 at (1, 2) between LINE #1 and ARC #2: moved the line's end"
        """
        return (f"gap of {self.size:.3g} at ({self.at[0]:.6g}, {self.at[1]:.6g}) between "
                f"{self.between[0]} and {self.between[1]}: {self.how}")


@dataclass(frozen=True)
class Skipped:
    """Something in the drawing that is not part of the profile, and why."""

    what: str
    reason: str

    def as_dict(self) -> Dict[str, str]:
        return {"what": self.what, "reason": self.reason}


@dataclass(frozen=True)
class DrawingReport:
    """What a drawing reader found, for the ``convert`` command to print.

    Attributes
    ----------
    source : str
        The file name, or ``"path data"`` for a ``d`` string given directly.
    kind : str
        ``"SVG path data"``, ``"SVG file"``, ``"DXF drawing"``, ...
    unit, unit_source : str
        The profile's length unit and where it came from.
    loops, chains : tuple of PathFound
    gaps_closed : tuple of GapClosed
    skipped : tuple of Skipped
    axis : str or None
        Where the axis came from, when the drawing gives one.
    tolerance : float or None
        The gap tolerance used for chaining, in the profile's unit.
    notes : tuple of str
        Anything else worth knowing (a coordinate flip, an assumption).
    warnings : tuple of str
        What the user must look at: loops or chains not joined to the main
        outline (left out unless asked for), anything read on an assumption
        that changes the figures.
    """

    source: str
    kind: str
    unit: str
    unit_source: str
    loops: Tuple[PathFound, ...] = ()
    chains: Tuple[PathFound, ...] = ()
    gaps_closed: Tuple[GapClosed, ...] = ()
    skipped: Tuple[Skipped, ...] = ()
    axis: Optional[str] = None
    tolerance: Optional[float] = None
    notes: Tuple[str, ...] = field(default=())
    warnings: Tuple[str, ...] = field(default=())

    def as_dict(self) -> Dict[str, Any]:
        """The report as plain JSON-ready values."""
        return {"source": self.source, "kind": self.kind, "unit": self.unit,
                "unit_source": self.unit_source,
                "loops": [p.as_dict() for p in self.loops],
                "chains": [p.as_dict() for p in self.chains],
                "gaps_closed": [g.as_dict() for g in self.gaps_closed],
                "skipped": [s.as_dict() for s in self.skipped],
                "axis": self.axis, "tolerance": self.tolerance, "notes": list(self.notes),
                "warnings": list(self.warnings)}

    def summary_line(self) -> str:
        """One line: how many loops and chains, and the unit."""
        def count(n: int, word: str) -> str:
            return f"no {word}s" if n == 0 else f"{n} {word}{'' if n == 1 else 's'}"

        return (f"{self.source} ({self.kind}): {count(len(self.loops), 'loop')}, "
                f"{count(len(self.chains), 'open chain')}; unit {self.unit} ({self.unit_source})")


def summarise_paths(profile, sources: Sequence[str], kind_of: Sequence[str]) -> Tuple[
        Tuple[PathFound, ...], Tuple[PathFound, ...]]:
    """:class:`PathFound` entries for a profile's loops and chains.

    ``sources`` and ``kind_of`` run over ``profile.paths`` (loops first).

    >>> from revolve.geometry.profile import Loop, Profile
    >>> loops, chains = summarise_paths(
    ...     Profile(loops=(Loop.from_points([(0, 1), (1, 1), (0, 2)]),)), ["points"], ["loop"])
    >>> loops[0].describe(), chains
    ('loop 1: 1 polyline; from points', ())
    """
    loops, chains = [], []
    for path, source, kind in zip(profile.paths, sources, kind_of):
        kinds = [s.kind for s in path.segments]
        start = path.segments[0].start if path.segments else (float("nan"), float("nan"))
        target = loops if kind == "loop" else chains
        target.append(PathFound(kind, len(target) + 1, kinds.count("line"), kinds.count("arc"),
                                kinds.count("curve"), (float(start[0]), float(start[1])), source,
                                kinds.count("polyline")))
    return tuple(loops), tuple(chains)


#: The convert option that keeps stray loops and chains.
KEEP_STRAYS_OPTION = "--keep-strays"


def separate_strays(profile, sources: Sequence[str], *, keep: bool = False):
    """Find the loops and chains not joined to the main outline; leave them out unless ``keep``.

    The main outline is the loop enclosing the largest area (with no loops,
    the longest open chain). A loop directly inside it is a hole and stays;
    anything else -- a loop beside it, an island inside one of its holes, an
    open chain when there are loops, another open chain when there are none
    -- is a stray: drawn apart from the part, it would add its own volume.
    The profile must not cross itself (see :func:`check_no_crossings`), so
    one point of a loop tells whether it lies inside another.

    Parameters
    ----------
    profile : Profile
    sources : sequence of str
        Where each path came from, over ``profile.paths`` (loops first).
    keep : bool
        Keep the strays (they are still warned about).

    Returns
    -------
    (Profile, list of str, list of str, list of str)
        The profile, the sources and kinds ("loop"/"chain") of its paths, and
        one warning per stray.

    Examples
    --------
    >>> from revolve.geometry.profile import Loop, Profile
    >>> square = lambda x, y, a: Loop.from_points([(x, y), (x + a, y), (x + a, y + a), (x, y + a)])
    >>> part = Profile(loops=(square(0, 10, 40), square(10, 20, 5), square(60, 10, 4)))
    >>> kept, sources, kinds, warnings = separate_strays(part, ["outline", "hole", "circle"])
    >>> len(kept.loops), sources
    (2, ['outline', 'hole'])
    >>> warnings   # doctest: +NORMALIZE_WHITESPACE
    ['loop 3 (from circle) is not joined to the main outline (loop 1, from outline) and lies outside it; it was left out (--keep-strays keeps it)']
    >>> len(separate_strays(part, ["a", "b", "c"], keep=True)[0].loops)
    3
    >>> separate_strays(Profile(), [])[3]
    []
    """
    from dataclasses import replace

    import numpy as np

    from revolve.geometry.checks import _point_in_polygon

    paths = profile.paths
    if len(paths) < 2:
        return profile, list(sources), ["loop" if p.closed else "chain" for p in paths], []
    flat = []
    for p in paths:
        pieces = [s.flatten() for s in p.segments]
        flat.append(np.vstack([pieces[0]] + [f[1:] for f in pieces[1:]]) if pieces
                    else np.zeros((0, 2)))
    loops = [k for k, p in enumerate(paths) if p.closed]

    def area(poly) -> float:
        x, y = poly[:, 0], poly[:, 1]
        return abs(float(np.dot(x, np.roll(y, -1)) - np.dot(y, np.roll(x, -1)))) / 2

    def length(poly) -> float:
        return float(np.hypot(*np.diff(poly, axis=0).T).sum()) if len(poly) > 1 else 0.0

    def probe(poly):
        return (poly[0] + poly[1]) / 2 if len(poly) > 1 else poly[0]

    def closed_poly(poly):
        return poly if np.array_equal(poly[0], poly[-1]) else np.vstack([poly, poly[:1]])

    boxes = [(f.min(axis=0), f.max(axis=0)) if len(f) else (np.zeros(2), np.zeros(2))
             for f in flat]

    def inside(k: int, m: int) -> bool:
        if not (np.all(boxes[m][0] <= boxes[k][0]) and np.all(boxes[k][1] <= boxes[m][1])):
            return False  # k's extent is not within m's: it cannot lie inside m
        px, py = probe(flat[k])
        return _point_in_polygon(float(px), float(py), closed_poly(flat[m]))

    def name(k: int) -> str:
        number = (loops.index(k) + 1) if paths[k].closed else (k - len(loops) + 1)
        return f"{'loop' if paths[k].closed else 'chain'} {number} (from {sources[k]})"

    if loops:
        main = max(loops, key=lambda k: area(flat[k]))
    else:
        main = max(range(len(paths)), key=lambda k: length(flat[k]))
    stray = []
    for k in range(len(paths)):
        if k == main:
            continue
        if paths[k].closed and paths[main].closed and inside(k, main):
            depth = sum(inside(k, m) for m in loops if m != k)
            if depth == 1:
                continue  # a hole in the main outline
            where = "inside one of its holes"
        elif paths[main].closed and inside(k, main):
            where = "inside it"
        else:
            where = "outside it"
        stray.append((k, where))
    main_name = name(main).replace(" (from ", ", from ")[:-1]
    warnings = [f"{name(k)} is not joined to the main outline ({main_name}) and lies {where}; "
                + ("it was kept as asked" if keep else
                   f"it was left out ({KEEP_STRAYS_OPTION} keeps it)")
                for k, where in stray]
    drop = set() if keep else {k for k, _ in stray}
    kept = [k for k in range(len(paths)) if k not in drop]
    new = replace(profile, loops=tuple(paths[k] for k in kept if paths[k].closed),
                  chains=tuple(paths[k] for k in kept if not paths[k].closed))
    return (new, [sources[k] for k in kept],
            ["loop" if paths[k].closed else "chain" for k in kept], warnings)


def check_no_crossings(profile, *, file: Optional[str] = None, after: str = "") -> None:
    """Refuse a profile whose loops and chains cross or touch one another or themselves.

    The test is the engine's own (:func:`revolve.geometry.checks.find_self_intersection`
    on the flattened segments, tolerance 1e-9 of the profile's size); it needs
    no axis, so a drawing can be checked before one is known. The message
    names both segments by their ``where`` (the drawing entity or the place
    in the path data).

    Parameters
    ----------
    profile : Profile
    file : str, optional
        File name for the message when a segment carries none.
    after : str, optional
        Words put before the message, e.g. ``"after chaining, "``.

    Raises
    ------
    ProfileError

    Examples
    --------
    >>> from revolve.geometry.profile import Loop, Profile
    >>> check_no_crossings(Profile(loops=(Loop.from_points([(0, 0), (2, 0), (2, 2), (0, 2)]),)))
    >>> bow = Profile(loops=(Loop.from_points([(0, 0), (2, 2), (2, 0), (0, 2)]),))
    >>> check_no_crossings(bow, file="bow.svg")
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: bow.svg: loop 1, segment 1: the profile intersects itself: this segment meets loop 1, segment 3; a boundary must not cross or touch itself
    """
    import numpy as np

    from revolve.geometry.checks import RELATIVE_TOLERANCE, _chord_place, find_self_intersection

    paths = profile.paths
    if not paths:
        return
    flat = [[s.flatten() for s in p.segments] for p in paths]
    points = [f for fs in flat for f in fs]
    if not points:
        return
    allpts = np.vstack(points)
    size = float(np.hypot(*(allpts.max(axis=0) - allpts.min(axis=0))))
    chords = [np.vstack([fs[0]] + [f[1:] for f in fs[1:]]) if fs else np.zeros((0, 2))
              for fs in flat]
    closed = [p.closed for p in paths]
    hit = find_self_intersection(chords, closed, RELATIVE_TOLERANCE * size)
    if hit is None:
        return
    pa, ca, pb, cb = hit
    # segment index, edge in it and number in messages (a polyline's edges count one each)
    sa, _, na = _chord_place(paths[pa].segments, flat[pa], ca)
    sb, _, nb = _chord_place(paths[pb].segments, flat[pb], cb)

    def name(k: int, j: int, number: int) -> str:
        seg = paths[k].segments[j]
        where = getattr(seg, "where", None)
        if where is not None and where.place:
            return where.place
        return f"{'loop' if closed[k] else 'chain'} {k + 1}, segment {number}"

    seg = paths[pa].segments[sa]
    where = getattr(seg, "where", None)
    raise ProfileError(f"{after}the profile intersects itself: this segment meets "
                       f"{name(pb, sb, nb)}; a boundary must not cross or touch itself",
                       file=(where.file if where is not None and where.file else file),
                       place=name(pa, sa, na))


# -- lazy entry points -----------------------------------------------------------------

def _no_strays(result) -> ProfileDocument:
    """The document of a reader's result, refused when the drawing has strays.

    A command that measures a drawing directly has no report to show, so a
    loop or chain apart from the main outline is refused rather than left
    out in silence; ``revolve convert`` reports it and leaves it out (or
    keeps it with ``--keep-strays``).
    """
    doc, report = result
    if report.warnings:
        first = report.warnings[0].split(" and lies ")[0]
        more = f" (and {len(report.warnings) - 1} more)" if len(report.warnings) > 1 else ""
        raise FormatError(f"{first}{more}; run revolve convert on the drawing, which reports "
                          f"it and leaves it out ({KEEP_STRAYS_OPTION} keeps it), and use the "
                          "profile file it writes", file=report.source)
    return doc


def read_svg_file(path: str, *, unit: Optional[str] = None) -> ProfileDocument:
    """Read the paths and shapes of an SVG file (see :func:`revolve.formats.svg.read_svg`).

    A loop or chain not joined to the main outline is refused here (see
    ``_no_strays``): only ``revolve convert`` reports and leaves them out.

    >>> read_svg_file("no_such_drawing.svg")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no_such_drawing.svg: no such file; check the name and folder
    """
    from revolve.formats.svg import read_svg

    return _no_strays(read_svg(path, unit=unit))


def read_svg_path_file(path: str, *, unit: Optional[str] = None) -> ProfileDocument:
    """Read a file holding bare SVG path data (see :func:`revolve.formats.svg.read_path_data_file`)."""
    from revolve.formats.svg import read_path_data_file

    return _no_strays(read_path_data_file(path, unit=unit))


def read_dxf_file(path: str, *, unit: Optional[str] = None) -> ProfileDocument:
    """Read a DXF drawing (see :func:`revolve.formats.dxf.read_dxf`); ezdxf is imported now.

    >>> read_dxf_file("no_such_drawing.dxf")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no_such_drawing.dxf: no such file; check the name and folder
    """
    from revolve.formats.dxf import read_dxf

    return _no_strays(read_dxf(path, unit=unit))

