'''The project's profile file (TOML): its schema and its reader.

Schema
------
Every length is in the file's ``units``; every number may be an integer, a
decimal, or a string holding an expression (``"sqrt(3)*10"``, ``"pi/2"``) that
is read by the whitelist parser in :mod:`revolve.expr`::

    name = "Flanged bushing"      # optional
    units = "mm"                  # optional, default "mm": the unit of every coordinate
    material = "carbon steel"     # optional; or density = "7850 kg/m^3" (not both)
    angle = 360                   # optional, degrees, above 0 and at most 360
    orientation = "vertical"      # optional: "vertical" or "horizontal", how the vessel stands
                                  # (used by level tables; the axis points up when vertical)

    [axis]                        # optional; without it the caller's default (sketch x axis)
    along = "x"                   # "x" or "y"; or instead both of
    # point = [0, 0]
    # direction = [1, 0]

    [[loop]]                      # a closed loop; repeat for more (a loop inside another is a hole)
    face = "outside"              # optional face name for segments that give none
    start = [0, 10]
    segments = [
      { line_to = [40, 10], face = "bore" },
      { arc_to = [50, 20], radius = 10, side = "left" },   # optional major = true
      { arc_to = [60, 10], centre = [60, 20], turn = "cw" },
      { y = "40 - x^2/90", to_x = 60 },
      { x = "12 + y^2/50", to_y = 0 },
      { x = "25*cos(t)", y = "25*sin(t)", t_from = 0, t_to = "pi/2" },
      { close = true },
    ]

    [[chain]]                     # an open chain: a surface only (sheet, shell)
    start = [0, 50]
    segments = [ { line_to = [10, 50] }, { points_to = [[20, 52], [30, 55]] } ]

Segment kinds, each written as one inline table and each starting where the
previous one ended (the first at ``start``):

``line_to = [x, y]``
    a straight line to the point.
``arc_to = [x, y], radius = r, side = "left" | "right"``
    a circular arc of radius ``r`` lying on that side of the chord, looking
    from its start to its end; ``major = true`` takes the arc longer than a
    half circle.
``arc_to = [x, y], centre = [cx, cy], turn = "cw" | "ccw"``
    a circular arc about the centre, clockwise or counter-clockwise.
``y = "f(x)", to_x = b``
    the curve y = f(x) from the current point to x = b.
``x = "g(y)", to_y = b``
    the curve x = g(y) from the current point to y = b.
``x = "x(t)", y = "y(t)", t_from = a, t_to = b``
    a parametric curve.
``points_to = [[x1, y1], [x2, y2], ...]``
    straight edges from the current point through every listed point, in
    order; read as one polyline (its numbers go straight into one array, so
    a list of 10⁵ points reads in a fraction of a second). The list may span
    many lines, one point per line.
``close = true``
    a straight line back to the loop's start (last segment of a loop only;
    nothing is added when the loop is already back at its start).

Every segment may carry ``face = "name"``. A curve must start at the current
point (within 1e-9 of the profile's size). Whether loops close and do not
cross is checked later, by the engine.

Limits: the text is refused before it is decoded when brackets nest more
than :data:`MAX_NESTING` deep, an unquoted word (a number) is longer than
:data:`~revolve.formats.values.MAX_NUMBER_CHARS` characters, a string is
longer than :data:`MAX_STRING_CHARS`, or the file is longer than
:data:`MAX_TEXT_CHARS`; plain numbers other than 0 must lie between 2.2e-308
and 1.8e308 in size; a ``points_to`` list may hold at most
:data:`MAX_POLYLINE_POINTS` points. Each refusal is one line naming the file,
the line and the key (for a point of ``points_to``, its line and index).

Examples
--------
>>> doc = parse_profile_text("""
... units = "mm"
... angle = 180
... [[loop]]
... start = [0, 10]
... segments = [
...   { line_to = [40, 10], face = "bore" },
...   { line_to = [40, 20] },
...   { arc_to = [0, 20], radius = 20, side = "left" },
...   { close = true },
... ]
... """, file="bush.toml")
>>> doc.angle_degrees, doc.profile.unit, len(doc.profile.loops[0].segments)
(180.0, 'mm', 4)
>>> seg = doc.profile.loops[0].segments[0]
>>> seg.end, seg.face, str(seg.where)
((40.0, 10.0), 'bore', 'bush.toml:7: loop 1, segment 1')
>>> parse_profile_text("unit = 'mm'", file="a.toml")
Traceback (most recent call last):
...
revolve.errors.FormatError: a.toml:1: unknown key "unit"; did you mean "units"?
'''

from __future__ import annotations

import difflib
import math
import re
from fractions import Fraction
from typing import Any, Dict, Iterable, List, Optional, Tuple

from revolve.errors import ExpressionError, FormatError, SegmentError
from revolve.formats.document import ProfileDocument
from revolve.formats.files import read_text
from revolve.formats.source_lines import find_oversize, scan_lines
from revolve.formats.values import (MAX_NUMBER_CHARS, SMALLEST_NUMBER, Value, check_length_unit, describe,
                                    exact_tree, fail, is_one_line, number, point, quote,
                                    toml_float)
from revolve.geometry.profile import Axis, Chain, Loop, Profile
from revolve.geometry.segments import (Line, Where, arc_from_centre, arc_from_radius,
                                       curve_from_expressions)

#: Keys allowed at the top of the file.
TOP_KEYS = ("name", "units", "material", "density", "section", "angle", "orientation", "axis",
            "loop", "chain")
#: Values of ``section``: what the loops enclose.
SECTIONS = ("material", "space")
#: The values of ``orientation``.
ORIENTATIONS = ("vertical", "horizontal")
#: Most brackets (``[`` or ``{``) open at once; a profile needs 4 at most.
MAX_NESTING = 16
#: Most characters in one string (names, expressions), quotes included.
MAX_STRING_CHARS = 1000
#: Most characters in a profile file.
MAX_TEXT_CHARS = 20_000_000
#: Keys allowed in a [[loop]] or [[chain]] table.
PATH_KEYS = ("face", "start", "segments")
#: Keys allowed in the [axis] table.
AXIS_KEYS = ("along", "point", "direction")
#: Required and optional keys of each segment shape.
SHAPES: Dict[str, Tuple[Tuple[str, ...], Tuple[str, ...]]] = {
    "line": (("line_to",), ("face",)),
    "arc by radius": (("arc_to", "radius", "side"), ("major", "face")),
    "arc by centre": (("arc_to", "centre", "turn"), ("face",)),
    "curve y(x)": (("y", "to_x"), ("face",)),
    "curve x(y)": (("x", "to_y"), ("face",)),
    "parametric curve": (("x", "y", "t_from", "t_to"), ("face",)),
    "close": (("close",), ("face",)),
    "polyline": (("points_to",), ("face",)),
}
#: Every key a segment may have.
SEGMENT_KEYS = tuple(dict.fromkeys(k for req, opt in SHAPES.values() for k in req + opt))
_CURVE_KEYS = ("x", "y", "to_x", "to_y", "t_from", "t_to")
#: Largest allowed distance of a curve's start from the current point, times the profile's size.
CURVE_START_TOLERANCE = 1e-9

_DEFAULT_UNIT = "mm"
#: Most points in one ``points_to`` list.
MAX_POLYLINE_POINTS = 1_000_000

# A points_to list in its plain form (numbers as TOML writes them, no comments, no
# underscores) is read straight into an array before the TOML reader sees the text;
# any other form is left to the TOML reader and read point by point.
_PLAIN = r"[+-]?(?:0|[1-9][0-9]*)(?:\.[0-9]+)?(?:[eE][+-]?[0-9]+)?"
_PAIR = r"\[[ \t]*" + _PLAIN + r"[ \t]*,[ \t]*" + _PLAIN + r"[ \t]*\]"
_POINTS_KEY = re.compile(r"\bpoints_to[ \t]*=[ \t]*(?=\[)")
_POINTS_BODY = re.compile(r"\[\s*(?:" + _PAIR + r"\s*,\s*)*" + _PAIR + r"\s*,?\s*\]")
_ZERO = re.compile(r"[+-]?[0.]+(?:[eE].*)?\Z")
_BRACKETS_TO_SPACES = str.maketrans("[],", "   ")


def read_profile_file(path: str, *, unit: Optional[str] = None) -> ProfileDocument:
    """Read a profile file (TOML) from ``path``.

    Parameters
    ----------
    path : str
        File name; used as given in every message and ``Where``.
    unit : str, optional
        Length unit to use when the file gives no ``units``; a file that
        gives a different one is refused rather than silently rescaled.

    Returns
    -------
    ProfileDocument

    Examples
    --------
    >>> read_profile_file("missing.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: missing.toml: no such file; check the name and folder
    """
    return parse_profile_text(read_text(path), file=path, unit=unit)


def parse_profile_text(text: str, *, file: Optional[str] = None,
                       unit: Optional[str] = None) -> ProfileDocument:
    """Read a profile from the text of a profile file.

    Parameters
    ----------
    text : str
        The TOML text.
    file : str, optional
        File name for messages.
    unit : str, optional
        As for :func:`read_profile_file`.

    Returns
    -------
    ProfileDocument

    Raises
    ------
    FormatError
        Malformed TOML, unknown keys, wrong types, NaN or infinity, both
        material and density, an empty loop, an unknown axis, ``close`` in a
        chain, an empty file.
    SegmentError
        An impossible segment (arc radius too short, curve not starting at
        the current point, ...).
    ExpressionError
        An expression refused by :mod:`revolve.expr`, located at its segment.

    Examples
    --------
    >>> parse_profile_text('units = "mm"\\nangle = ]', file="a.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: a.toml:2: malformed TOML: Invalid value (at line 2, column 9)
    >>> parse_profile_text("  \\n", file="a.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: a.toml: the file is empty
    """
    if not text.strip():
        raise FormatError("the file is empty", file=file)
    if len(text) > MAX_TEXT_CHARS:
        raise FormatError(f"the file has {len(text)} characters; a profile file may have at most "
                          f"{MAX_TEXT_CHARS}", file=file)
    from revolve.datafiles import toml

    tomllib = toml()
    original = text
    text, blocks, shifts = _take_point_lists(text)
    _check_sizes(text, file, shifts)
    try:
        data = tomllib.loads(text, parse_float=toml_float)
    except tomllib.TOMLDecodeError as exc:
        message = str(exc)
        found = re.search(r"at line (\d+)", message)
        line = _line_in_file(int(found.group(1)), shifts) if found else None
        if found:
            message = message.replace(found.group(), f"at line {line}")
        raise FormatError(f"malformed TOML: {message}", file=file, line=line) from None
    except (ValueError, RecursionError, MemoryError) as exc:  # bounded above; never shown raw
        raise FormatError(f"the TOML reader could not read the file "
                          f"({type(exc).__name__}); simplify it", file=file) from None
    lines = scan_lines(text)
    if shifts:
        lines = {key: _line_in_file(line, shifts) for key, line in lines.items()}
    reader = _Reader(file, lines)
    reader.blocks, reader.source = blocks, original
    return reader.document(data, unit)


class _PointBlock:
    """A ``points_to`` list read straight from the text: its points as one array.

    ``body`` is the list's text, kept so that exact values (Fractions) are made
    only when asked for (:meth:`exact_points`); ``lines`` the line of each point.
    """

    def __init__(self, points, body: str, lines) -> None:
        self.points, self.body, self.lines = points, body, lines

    def tokens(self) -> List[str]:
        return self.body.translate(_BRACKETS_TO_SPACES).split()

    def exact_points(self) -> tuple:
        words = self.tokens()
        return tuple((Fraction(words[i]), Fraction(words[i + 1]))
                     for i in range(0, len(words), 2))

    def last_exact(self) -> Tuple[Fraction, Fraction]:
        inner = self.body.rstrip().rstrip("]").rstrip().rstrip(",")
        words = inner[inner.rindex("["):].translate(_BRACKETS_TO_SPACES).split()
        return Fraction(words[0]), Fraction(words[1])


class _LazyExactPoints:
    """The exact vertices of a polyline read from a file, made on first use.

    Plain measuring never asks for them, so a long ``points_to`` list costs
    no Fraction per vertex unless exact results are asked for.

    >>> pts = _LazyExactPoints((0, 0), lambda: ((Fraction(1, 2), 1),), 2)
    >>> len(pts), pts[1], list(reversed(pts))[0]
    (2, (Fraction(1, 2), 1), (Fraction(1, 2), 1))
    """

    def __init__(self, first, later, count: int) -> None:
        self._first, self._later, self._count, self._points = first, later, count, None

    def _all(self) -> tuple:
        if self._points is None:
            self._points = (self._first,) + tuple(self._later())
        return self._points

    def __len__(self) -> int:
        return self._count

    def __getitem__(self, index):
        return self._all()[index]

    def __iter__(self):
        return iter(self._all())

    def __reversed__(self):
        return reversed(self._all())


def _point_line(text: str, segment_line: int, index: int) -> Optional[int]:
    """The line of point ``index`` (1-based) of the first ``points_to`` list from a line on.

    A light scan (strings and comments skipped), used only for error messages.

    >>> _point_line('a = 1\\ns = [{ points_to = [\\n [1, 2], # [\\n [3, "x"]] }]', 2, 2)
    4
    """
    offset = 0
    for _ in range(segment_line - 1):
        offset = text.find("\n", offset) + 1
        if offset == 0:
            return None
    found = _POINTS_KEY.search(text, offset)
    if found is None:
        return None
    depth = count = 0
    line = segment_line + text.count("\n", offset, found.end())
    i = found.end()
    while i < len(text):
        ch = text[i]
        if ch == "\n":
            line += 1
        elif ch == "#":
            i = text.find("\n", i) - 1
            if i < 0:
                return None
        elif ch in "\"'":
            end = text.find(ch, i + 1)
            while ch == '"' and end > 0 and text[end - 1] == "\\":
                end = text.find(ch, end + 1)
            if end < 0:
                return None
            line += text.count("\n", i, end)
            i = end
        elif ch in "[{":
            depth += 1
            if depth == 2:
                count += 1
                if count == index:
                    return line
        elif ch in "]}":
            depth -= 1
            if depth == 0:
                return None
        i += 1
    return None


def _plain_block(body: str, first_line: int) -> Optional[_PointBlock]:
    """The points of a plain ``points_to`` list, or None to leave it to the TOML reader.

    None when a number is too long, not finite as a float, or too small (the
    point-by-point reading then refuses it with its line and index).

    >>> block = _plain_block("[[1, 2],\\n [3.5, -4e1]]", 7)
    >>> block.points.tolist(), block.lines.tolist(), block.exact_points()[1]
    ([[1.0, 2.0], [3.5, -40.0]], [7, 8], (Fraction(7, 2), Fraction(-40, 1)))
    >>> _plain_block("[[1, 2], [1e999, 0]]", 1) is None
    True
    """
    import numpy as np

    words = body.translate(_BRACKETS_TO_SPACES).split()
    if len(words) > 2 * MAX_POLYLINE_POINTS or max(map(len, words)) > MAX_NUMBER_CHARS:
        return None
    values = np.fromiter(map(float, words), dtype=float, count=len(words))
    size = np.abs(values)
    if not np.isfinite(values).all():
        return None
    tiny = size < SMALLEST_NUMBER
    if tiny.any() and (size[tiny] != 0).any() or \
            not all(_ZERO.match(words[i]) for i in np.flatnonzero(tiny)):
        return None
    codes = np.frombuffer(body.encode("ascii"), dtype=np.uint8)
    opens = np.flatnonzero(codes == ord("["))[1:]
    lines = first_line + np.cumsum(codes == ord("\n"))[opens]
    return _PointBlock(values.reshape(-1, 2), body, lines)


def _take_point_lists(text: str) -> Tuple[str, Dict[str, _PointBlock], List[Tuple[int, int]]]:
    """Read plain ``points_to`` lists straight into arrays; the text with markers in their place.

    Each plain list is replaced by a one-string list holding a marker (with a
    random part no file can guess), on one line, so the TOML reader and the
    size and line scans see a short text. Also returns, for each list taken
    out, its line in the shortened text and the line breaks it held, so that
    :func:`_line_in_file` gives back the lines of the file.

    >>> text, blocks, shifts = _take_point_lists('s = [\\n  { points_to = [[1, 2],\\n [3, 4]] },\\n]')
    >>> text.count("\\n"), [b.points.tolist() for b in blocks.values()], shifts
    (2, [[[1.0, 2.0], [3.0, 4.0]]], [(2, 1)])
    """
    blocks: Dict[str, _PointBlock] = {}
    shifts: List[Tuple[int, int]] = []
    if "points_to" not in text:
        return text, blocks, shifts
    import secrets

    token = secrets.token_hex(8)
    pieces: List[str] = []
    done = counted = line = removed = 0
    at = text.find("points_to")
    while at >= 0:
        key = _POINTS_KEY.match(text, at) if at == 0 or not (
            text[at - 1].isalnum() or text[at - 1] in "_-") else None
        body = None
        if key is not None:
            line_start = text.rfind("\n", 0, at) + 1
            before = text[line_start:at]
            # inside a comment or a string: left to the TOML reader
            if not ("#" in before or before.count('"') % 2 or before.count("'") % 2):
                body = _POINTS_BODY.match(text, key.end())
        block = None
        if body is not None:
            line += text.count("\n", counted, key.end())
            counted = key.end()
            block = _plain_block(body.group(), line + 1)
        if block is None:
            at = text.find("points_to", at + 9)
            continue
        marker = f"revolve-points-{token}-{len(blocks)}"
        blocks[marker] = block
        breaks = body.group().count("\n")
        pieces += [text[done:key.end()], f'["{marker}"]']
        shifts.append((line + 1 - removed, breaks))
        line += breaks
        removed += breaks
        done = counted = body.end()
        at = text.find("points_to", done)
    if not blocks:
        return text, blocks, shifts
    pieces.append(text[done:])
    return "".join(pieces), blocks, shifts


def _line_in_file(line: Optional[int], shifts: List[Tuple[int, int]]) -> Optional[int]:
    """The file's line of a line of the text shortened by :func:`_take_point_lists`.

    >>> [_line_in_file(n, [(2, 1), (4, 10)]) for n in (1, 2, 3, 4, 5)]
    [1, 2, 4, 5, 16]
    """
    if line is None:
        return None
    return line + sum(breaks for at, breaks in shifts if at < line)


def _check_sizes(text: str, file: Optional[str], shifts: List[Tuple[int, int]] = ()) -> None:
    """Refuse deep nesting, long numbers and long strings before the TOML reader sees them.

    >>> _check_sizes("angle = " + "9" * 101, "a.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: a.toml:1: angle: a number (or other unquoted word) of 101 characters is too long; write at most 100
    >>> _check_sizes("[[loop]]\\nsegments = " + "[" * 17, "a.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: a.toml:2: segments: brackets nest 17 deep; a profile file needs at most 4 (the limit is 16)
    """
    found = find_oversize(text, max_depth=MAX_NESTING, max_word=MAX_NUMBER_CHARS,
                          max_string=MAX_STRING_CHARS)
    if found is None:
        return
    if found.kind == "nesting":
        message = (f"brackets nest {found.size} deep; a profile file needs at most 4 "
                   f"(the limit is {MAX_NESTING})")
    elif found.kind == "word":
        message = (f"a number (or other unquoted word) of {found.size} characters is too long; "
                   f"write at most {MAX_NUMBER_CHARS}")
    else:
        message = (f"a string of {found.size} characters is too long; write at most "
                   f"{MAX_STRING_CHARS}")
    place = None if found.key is None else (
        found.key if re.fullmatch(r"[A-Za-z0-9_.-]{1,40}", found.key) else quote(found.key))
    raise FormatError(message, file=file, line=_line_in_file(found.line, list(shifts)),
                      place=place)


def _plain_exact(value: Any) -> Any:
    """An exact number tree as a Fraction (like every plain number); anything else unchanged.

    >>> from revolve.expr import parse_number
    >>> _plain_exact(parse_number("25 - 0^2/180")), _plain_exact(parse_number("pi/2"))
    (Fraction(25, 1), Expr('pi/2'))
    """
    exact = getattr(value, "exact_value", None)
    if exact is not None and exact() is not None:
        return exact()
    return value


def _same_length_unit(a: str, b: str) -> bool:
    """Whether two spellings name the same length unit ("mm", "millimetre")."""
    from revolve.errors import UnitError
    from revolve.units import factor

    try:
        return factor(a, "length") == factor(b, "length")
    except UnitError:
        return False


def _suggestion(key: str, options: Iterable[str]) -> str:
    """'; did you mean "x"?' or the list of valid keys."""
    options = list(options)
    close = difflib.get_close_matches(key, options, n=1, cutoff=0.6)
    if close:
        return f'; did you mean "{close[0]}"?'
    return "; the keys here are " + ", ".join(options)


class _Reader:
    """Turns decoded TOML into a document; knows the file and the line map."""

    def __init__(self, file: Optional[str], lines: Dict[str, int]):
        self.file = file
        self.lines = lines
        self.blocks: Dict[str, _PointBlock] = {}
        self.source: Optional[str] = None
        self.curve_checks: List[tuple] = []
        self.angle_exact: Any = None

    def where(self, key: str, place: Optional[str] = None) -> Where:
        """Where for the part ``key`` of the line map, shown as ``place``."""
        line = self.lines.get(key)
        if line is None and "." in key:
            line = self.lines.get(key.rsplit(".", 1)[0])
        return Where(self.file, line, place)

    # -- the whole file ---------------------------------------------------------------

    def document(self, data: Dict[str, Any], unit: Optional[str]) -> ProfileDocument:
        for key in data:
            if key not in TOP_KEYS:
                hint = _suggestion(key, TOP_KEYS)
                if key in PATH_KEYS or key in SEGMENT_KEYS:
                    hint = "; it belongs under a [[loop]] or [[chain]] header"
                raise fail(f"unknown key {quote(key)}{hint}", self.where(key))
        name = self.text(data, "name")
        units = self.units(data, unit)
        material = self.text(data, "material")
        density = data.get("density")
        if density is not None and not isinstance(density, str):
            raise fail(f"density needs its unit: write it as text such as "
                       f'density = "7850 kg/m^3", got {describe(density)}',
                       self.where("density", "density"))
        if density is not None and not density.strip():
            raise fail("density is empty", self.where("density", "density"))
        if density is not None and not is_one_line(density):
            raise fail(f"density must be one line of text, without line breaks or control "
                       f"characters, got {describe(density)}", self.where("density", "density"))
        if material is not None and density is not None:
            raise fail("give material or density, not both",
                       self.where("density", "density"))
        section = self.text(data, "section") or "material"
        if section not in SECTIONS:
            raise fail(f'section must be "material" (a solid part) or "space" (the space inside '
                       f'a vessel), got {describe(section)}', self.where("section", "section"))
        angle = self.angle(data.get("angle"))
        orientation = self.orientation(data.get("orientation"))
        axis = self.axis(data["axis"]) if "axis" in data else None
        loops = tuple(self.path("loop", i, t) for i, t in self.tables(data, "loop"))
        chains = tuple(self.path("chain", i, t) for i, t in self.tables(data, "chain"))
        if not loops and not chains:
            raise FormatError("the file has no [[loop]] or [[chain]]; a profile needs at least "
                              "one", file=self.file)
        self.check_curve_starts(loops + chains)
        profile = Profile(loops=loops, chains=chains, unit=units, name=name, file=self.file)
        return ProfileDocument(profile=profile, axis=axis, angle_degrees=angle,
                               material=material, density=density, exact=True,
                               section=section,
                               orientation=orientation,
                               angle_exact=self.angle_exact,
                               source_lines=dict(self.lines))

    def text(self, data: Dict[str, Any], key: str) -> Optional[str]:
        value = data.get(key)
        if value is None:
            return None
        if not isinstance(value, str) or not value.strip():
            raise fail(f"{key} must be a non-empty text in quotes, got {describe(value)}",
                       self.where(key, key))
        if not is_one_line(value):
            raise fail(f"{key} must be one line of text, without line breaks or control "
                       f"characters, got {describe(value)}", self.where(key, key))
        return value.strip()

    def units(self, data: Dict[str, Any], unit: Optional[str]) -> str:
        written = self.text(data, "units")
        where = self.where("units", "units")
        if written is not None and unit is not None and written != unit \
                and not _same_length_unit(written, unit):
            raise fail(f"the file gives units = {quote(written)} but {quote(unit)} was asked "
                       "for; remove one of the two", where)
        chosen = written or unit or _DEFAULT_UNIT
        check_length_unit(chosen, where if written is not None else Where(self.file))
        return chosen

    def angle(self, raw: Any) -> Optional[float]:
        if raw is None:
            return None
        where = self.where("angle", "angle")
        value = number(raw, "angle", where)
        if not 0.0 < value.value <= 360.0:
            raise fail(f"angle must be above 0 and at most 360 degrees, got {value.value:g}",
                       where)
        self.angle_exact = value.exact
        return value.value

    def orientation(self, raw: Any) -> Optional[str]:
        if raw is None:
            return None
        if raw not in ORIENTATIONS:
            raise fail(f'orientation must be "vertical" or "horizontal", got {describe(raw)}',
                       self.where("orientation", "orientation"))
        return raw

    def tables(self, data: Dict[str, Any], kind: str) -> List[Tuple[int, Any]]:
        raw = data.get(kind, [])
        if isinstance(raw, dict):
            raise fail(f"write [[{kind}]] with two brackets, one header for each {kind}",
                       self.where(kind, kind))
        if not isinstance(raw, list):
            raise fail(f"{kind} must be given as [[{kind}]] tables, got {describe(raw)}",
                       self.where(kind, kind))
        return list(enumerate(raw, 1))

    # -- axis -------------------------------------------------------------------------

    def axis(self, raw: Any) -> Axis:
        where = self.where("axis", "axis")
        if not isinstance(raw, dict):
            raise fail(f'axis must be a table ([axis] with along = "x", or point and direction), '
                       f"got {describe(raw)}", where)
        for key in raw:
            if key not in AXIS_KEYS:
                raise fail(f"unknown key {quote(key)} in the axis{_suggestion(key, AXIS_KEYS)}",
                           self.where(f"axis.{key}", "axis"))
        zero, one = Fraction(0), Fraction(1)
        if "along" in raw:
            if "point" in raw or "direction" in raw:
                raise fail("give the axis as along, or as point and direction, not both", where)
            along = raw["along"]
            if along in ("x", "y"):
                direction = (one, zero) if along == "x" else (zero, one)
                return Axis((0.0, 0.0), (float(direction[0]), float(direction[1])),
                            exact=((zero, zero), direction))
            raise fail(f'unknown axis {describe(along)}: along must be "x" or "y" '
                       "(or give point and direction)", self.where("axis.along", "axis"))
        if "point" not in raw or "direction" not in raw:
            raise fail('the axis needs along = "x" or "y", or both point and direction', where)
        px, py = point(raw["point"], "axis point", self.where("axis.point", "axis"))
        dx, dy = point(raw["direction"], "axis direction", self.where("axis.direction", "axis"))
        if dx.value == 0 and dy.value == 0:
            raise fail("the axis direction is zero; give a direction such as [1, 0]",
                       self.where("axis.direction", "axis"))
        return Axis((px.value, py.value), (dx.value, dy.value),
                    exact=((px.exact, py.exact), (dx.exact, dy.exact)))

    # -- loops and chains -------------------------------------------------------------

    def path(self, kind: str, index: int, table: Any):
        label = f"{kind} {index}"
        where = self.where(label, label)
        if not isinstance(table, dict):
            raise fail(f"{label} must be a table, got {describe(table)}", where)
        for key in table:
            if key not in PATH_KEYS:
                hint = _suggestion(key, PATH_KEYS)
                if key in SEGMENT_KEYS:
                    hint = "; segment keys belong inside segments = [ {...}, ... ]"
                raise fail(f"unknown key {quote(key)} in the {kind}{hint}",
                           self.where(f"{label}.{key}", label))
        face = self.face(table.get("face"), self.where(f"{label}.face", label))
        if "start" not in table:
            raise fail(f"the {kind} has no start point; add start = [x, y]", where)
        start = point(table["start"], "start", self.where(f"{label}.start", f"{label}, start"))
        raw_segments = table.get("segments")
        if raw_segments is None or raw_segments == []:
            raise fail(f"the {kind} has no segments; add "
                       "segments = [ { line_to = [x, y] }, ... ]", where)
        if not isinstance(raw_segments, list):
            raise fail(f"segments must be a list of inline tables, got {describe(raw_segments)}",
                       self.where(f"{label}.segments", label))
        current = start
        segments = []
        for j, raw in enumerate(raw_segments, 1):
            place = f"{label}, segment {j}"
            seg_where = Where(self.file, self.lines.get(place), place)
            segment, current = self.segment(raw, kind, current, start, face, seg_where,
                                             last=j == len(raw_segments))
            if segment is not None:
                segments.append(segment)
        if not segments:
            raise fail(f"the {kind} has no segments besides close", where)
        return (Loop if kind == "loop" else Chain)(tuple(segments), where=where)

    def face(self, raw: Any, where: Where) -> Optional[str]:
        if raw is None:
            return None
        if not isinstance(raw, str) or not raw.strip():
            raise fail(f"face must be a non-empty name in quotes, got {describe(raw)}", where)
        if not is_one_line(raw):
            raise fail(f"face must be one line of text, without line breaks or control "
                       f"characters, got {describe(raw)}", where)
        return raw.strip()

    # -- segments ---------------------------------------------------------------------

    def shape(self, raw: Dict[str, Any], where: Where) -> str:
        kinds = [k for k in ("line_to", "arc_to", "close", "points_to") if k in raw]
        if any(k in raw for k in _CURVE_KEYS):
            kinds.append("a curve (x/y)")
        if not kinds:
            raise fail("the segment has no kind; give line_to, points_to, arc_to, a curve "
                       "(x and/or y) or close = true", where)
        if len(kinds) > 1:
            raise fail(f"the segment is ambiguous: it has {' and '.join(kinds)}; "
                       "give one kind per segment", where)
        kind = kinds[0]
        if kind == "line_to":
            return "line"
        if kind == "close":
            return "close"
        if kind == "points_to":
            return "polyline"
        if kind == "arc_to":
            if "radius" in raw and "centre" in raw:
                raise fail("give the arc a radius (with side) or a centre (with turn), not both",
                           where)
            if "radius" in raw:
                return "arc by radius"
            if "centre" in raw:
                return "arc by centre"
            raise fail('arc_to needs radius = r with side = "left" or "right", '
                       'or centre = [x, y] with turn = "cw" or "ccw"', where)
        if "x" in raw and "y" in raw:
            return "parametric curve"
        if "y" in raw:
            return "curve y(x)"
        if "x" in raw:
            return "curve x(y)"
        raise fail('a curve needs expressions: y = "f(x)" with to_x, x = "g(y)" with to_y, '
                   "or x and y of t with t_from and t_to", where)

    def segment(self, raw: Any, kind: str, current, start, default_face, where: Where,
                last: bool):
        """One segment from ``current``; returns it (or None) and the new current point."""
        if not isinstance(raw, dict):
            raise fail("a segment must be an inline table such as { line_to = [x, y] }, "
                       f"got {describe(raw)}", where)
        for key in raw:
            if key not in SEGMENT_KEYS:
                raise fail(f"unknown key {quote(key)} in the segment"
                           f"{_suggestion(key, SEGMENT_KEYS)}",
                           where)
        shape = self.shape(raw, where)
        required, optional = SHAPES[shape]
        for key in raw:
            if key not in required and key not in optional:
                raise fail(f'"{key}" does not belong in a segment that is a {shape}', where)
        for key in required:
            if key not in raw:
                raise fail(f'a {shape} needs "{key}"', where)
        face = self.face(raw.get("face"), where) or default_face
        p0 = (current[0].value, current[1].value)
        e0 = (current[0].exact, current[1].exact)
        if shape == "close":
            if raw["close"] is not True:
                raise fail(f"close must be true, got {describe(raw['close'])}; "
                           "remove it if the loop is not to be closed here", where)
            if kind == "chain":
                raise fail("close belongs in a loop only; a chain is open (end it with line_to, "
                           "or make it a [[loop]])", where)
            if not last:
                raise fail("close must be the last segment of its loop", where)
            if p0 == (start[0].value, start[1].value):
                return None, current
            return Line(p0, (start[0].value, start[1].value), face=face, where=where,
                        exact=e0 + (start[0].exact, start[1].exact)), start
        if shape == "polyline":
            return self.polyline(raw["points_to"], current, face, where)
        if shape == "line":
            x1, y1 = point(raw["line_to"], "line_to", where)
            return Line(p0, (x1.value, y1.value), face=face, where=where,
                        exact=e0 + (x1.exact, y1.exact)), (x1, y1)
        if shape.startswith("arc"):
            x1, y1 = point(raw["arc_to"], "arc_to", where)
            p1, e1 = (x1.value, y1.value), (x1.exact, y1.exact)
            if shape == "arc by radius":
                radius = number(raw["radius"], "radius", where)
                side = self.choice(raw["side"], "side", ("left", "right"), where)
                major = raw.get("major", False)
                if not isinstance(major, bool):
                    raise fail(f"major must be true or false, got {describe(major)}", where)
                arc = arc_from_radius(p0, p1, radius.value, side=side, major=major, face=face,
                                      where=where,
                                      exact=("radius", e0, e1, radius.exact, side, major))
            else:
                cx, cy = point(raw["centre"], "centre", where)
                turn = self.choice(raw["turn"], "turn", ("cw", "ccw"), where)
                arc = arc_from_centre(p0, p1, (cx.value, cy.value), clockwise=turn == "cw",
                                      face=face, where=where,
                                      exact=("centre", e0, e1, (cx.exact, cy.exact),
                                             turn == "cw"))
            return arc, (x1, y1)
        return self.curve(raw, shape, current, face, where)

    def polyline(self, raw: Any, current, face, where: Where):
        """A ``points_to`` list as one :class:`Polyline` from ``current``; and its last point.

        A plain list was read into an array before the TOML reader
        (:func:`_take_point_lists`); any other is read point by point here, each
        bad number refused with its line and index. Exact values are made only
        when exact results ask for them (:class:`_LazyExactPoints`).
        """
        import numpy as np

        from revolve.geometry.kinds.polyline import Polyline, PolylineExact

        block = None
        if isinstance(raw, list) and len(raw) == 1 and isinstance(raw[0], str):
            block = self.blocks.get(raw[0])
        if block is not None:
            body, lines = block.points, block.lines
            last = block.last_exact()
            later = block.exact_points
        else:
            if not isinstance(raw, list) or not raw:
                raise fail(f"points_to must be a list of points [[x1, y1], [x2, y2], ...], "
                           f"got {describe(raw) if raw != [] else 'an empty list'}", where)
            if len(raw) > MAX_POLYLINE_POINTS:
                raise fail(f"points_to has {len(raw)} points; a list may have at most "
                           f"{MAX_POLYLINE_POINTS}", where)
            pairs = [point(p, "points_to", self.point_where(where, i))
                     for i, p in enumerate(raw, 1)]
            body = np.array([(x.value, y.value) for x, y in pairs], dtype=float)
            lines = None
            last = (pairs[-1][0].exact, pairs[-1][1].exact)

            def later(pairs=pairs):
                return tuple((x.exact, y.exact) for x, y in pairs)
        first = (current[0].exact, current[1].exact)
        points = np.vstack([[(current[0].value, current[1].value)], body])
        if lines is not None:
            lines = np.concatenate([[where.line or 0], lines])
        polyline = Polyline(points, face=face, where=where, lines=lines,
                            exact=PolylineExact(_LazyExactPoints(first, later, len(points))))
        return polyline, (Value(float(points[-1, 0]), last[0]),
                          Value(float(points[-1, 1]), last[1]))

    def point_where(self, where: Where, index: int) -> Where:
        """Where point ``index`` (1-based) of the ``points_to`` list of a segment is written."""
        line = where.line
        if line is not None and self.source is not None:
            found = _point_line(self.source, line, index)
            line = found if found is not None else line
        return Where(where.file, line, f"{where.place}, point {index}")

    def choice(self, raw: Any, key: str, options: Tuple[str, ...], where: Where) -> str:
        if raw in options:
            return raw
        listed = " or ".join(f'"{o}"' for o in options)
        raise fail(f"{key} must be {listed}, got {describe(raw)}", where)

    def expression(self, raw: Any, key: str, variable: str, where: Where):
        if not isinstance(raw, str):
            example = {"x": "12 + y^2/50", "y": "40 - x^2/90"}[key] if variable != "t" \
                else "25*cos(t)"
            raise fail(f'{key} must be an expression in quotes such as {key} = "{example}", '
                       f"got {describe(raw)}", where)
        from revolve.expr import parse_expression

        try:
            return parse_expression(raw, variables=(variable,))
        except ExpressionError as exc:
            raise exc.located(file=where.file, line=where.line, place=where.place) from None

    def curve(self, raw: Dict[str, Any], shape: str, current, face, where: Where):
        from revolve.expr import Var

        t = Var("t")
        if shape == "parametric curve":
            x_expr = self.expression(raw["x"], "x", "t", where)
            y_expr = self.expression(raw["y"], "y", "t", where)
            t0 = number(raw["t_from"], "t_from", where)
            t1 = number(raw["t_to"], "t_to", where)
            end_exact = None
        elif shape == "curve y(x)":
            x_expr, y_expr = t, self.expression(raw["y"], "y", "x", where).substitute({"x": t})
            t0, t1 = current[0], number(raw["to_x"], "to_x", where)
            end_exact = (t1.exact, None)
        else:
            x_expr, y_expr = self.expression(raw["x"], "x", "y", where).substitute({"y": t}), t
            t0, t1 = current[1], number(raw["to_y"], "to_y", where)
            end_exact = (None, t1.exact)
        curve = curve_from_expressions(x_expr, y_expr, t0.value, t1.value, face=face,
                                       where=where, exact=(t0.exact, t1.exact))
        self.curve_checks.append((curve, (current[0].value, current[1].value), where))
        t_end = exact_tree(t1.exact)
        ex = end_exact[0] if end_exact and end_exact[0] is not None else \
            x_expr.substitute({"t": t_end})
        ey = end_exact[1] if end_exact and end_exact[1] is not None else \
            y_expr.substitute({"t": t_end})
        x_end, y_end = curve.end
        return curve, (Value(x_end, _plain_exact(ex)), Value(y_end, _plain_exact(ey)))

    def check_curve_starts(self, paths) -> None:
        """Each curve must start at the current point, within a tolerance scaled to the size."""
        if not self.curve_checks:
            return
        xs, ys = [], []
        for path in paths:
            for seg in path.segments:
                for px, py in (seg.start, seg.end):
                    xs.append(px)
                    ys.append(py)
        size = math.hypot(max(xs) - min(xs), max(ys) - min(ys))
        tolerance = CURVE_START_TOLERANCE * size
        for curve, expected, where in self.curve_checks:
            sx, sy = curve.start
            if math.hypot(sx - expected[0], sy - expected[1]) > tolerance:
                raise SegmentError(
                    f"the curve starts at ({sx:.12g}, {sy:.12g}) but the current point is "
                    f"({expected[0]:.12g}, {expected[1]:.12g}); make the curve start where the "
                    "previous segment ends", file=where.file, line=where.line,
                    place=where.place)
