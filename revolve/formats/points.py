"""Plain point lists: one ``x,y`` pair per line, read as one closed polygon.

The numbers on a line may be separated by a comma, a semicolon, a tab or
spaces. ``#`` starts a comment; blank lines are ignored; the first
non-comment line may be a header of words (``x,y``). The polygon is closed
implicitly: a last point equal to the first is dropped. Lengths are in the
``unit`` the caller gives (default ``"mm"``); the file cannot say.

Numbers are kept exact (as :class:`fractions.Fraction`) in each line's
``exact`` field, so exact results are possible from a point list too.

Examples
--------
>>> doc = parse_points_text('''# a ring section
... x, y
... 0, 10
... 20, 10
... 20; 15
... 0\\t15
... ''', file="ring.txt")
>>> loop = doc.profile.loops[0]
>>> [seg.end for seg in loop.segments]
[(20.0, 10.0), (20.0, 15.0), (0.0, 15.0), (0.0, 10.0)]
>>> str(loop.segments[1].where)
'ring.txt:4: loop 1, segment 2'
>>> parse_points_text("0,0\\n1,0\\n3.5\\n", file="pts.txt")
Traceback (most recent call last):
...
revolve.errors.FormatError: pts.txt:3: expected two numbers "x,y", got "3.5"
"""

from __future__ import annotations

import re
from fractions import Fraction
from typing import List, Optional, Tuple

from revolve.errors import FormatError
from revolve.formats.document import ProfileDocument
from revolve.formats.files import read_text
from revolve.formats.values import PLAIN_NUMBER, check_length_unit, plain_fraction, quote
from revolve.geometry.profile import Loop, Profile
from revolve.geometry.segments import Line, Where

#: File name endings read as point lists.
POINT_EXTENSIONS = (".txt", ".csv", ".xy", ".dat", ".pts")

_SEPARATOR = re.compile(r"\s*[,;]\s*|\s+")
_NOT_FINITE = re.compile(r"[+-]?(nan|inf|infinity)\Z", re.IGNORECASE)


def read_points_file(path: str, *, unit: Optional[str] = None) -> ProfileDocument:
    """Read a point list from ``path`` as one closed loop of lines.

    Parameters
    ----------
    path : str
        File name, used as given in messages.
    unit : str, optional
        Length unit of the coordinates, default ``"mm"``.

    Returns
    -------
    ProfileDocument
        No axis, angle or material: the caller supplies them.

    Examples
    --------
    >>> read_points_file("nowhere.csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: nowhere.csv: no such file; check the name and folder
    """
    return parse_points_text(read_text(path), file=path, unit=unit)


def _fields(content: str) -> List[str]:
    return [f.strip().strip('"').strip() for f in _SEPARATOR.split(content.strip())]


def parse_points_text(text: str, *, file: Optional[str] = None,
                      unit: Optional[str] = None) -> ProfileDocument:
    """Read a point list from its text.

    Parameters
    ----------
    text : str
        The file's text.
    file : str, optional
        File name for messages.
    unit : str, optional
        Length unit, default ``"mm"``.

    Returns
    -------
    ProfileDocument

    Raises
    ------
    FormatError
        A line that is not two numbers, NaN or infinity, a header that is not
        the first line, a point repeating the previous one, fewer than three
        points, a number longer than 100 characters or outside the normal
        range of floats (0 aside).

    Examples
    --------
    >>> parse_points_text("0 0\\n1 0\\n0 0\\n", file="p.xy")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: p.xy: a point list needs at least 3 distinct points, got 2
    >>> parse_points_text("0 0\\n1 nan\\n", file="p.xy")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: p.xy:2: "nan" is not a finite number
    >>> parse_points_text("0 0\\n1 0\\n1 1e-999999999\\n", file="p.xy")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: p.xy:3: y is too small; numbers other than 0 must lie between 2.2e-308 and 1.8e308 in size
    """
    if not text.strip():
        raise FormatError("the file is empty", file=file)
    unit = unit or "mm"
    check_length_unit(unit, Where(file))
    points: List[Tuple[Fraction, Fraction]] = []
    lines: List[int] = []
    seen_content = False
    for number, raw_line in enumerate(text.splitlines(), 1):
        content = raw_line.split("#", 1)[0].strip()
        if not content:
            continue
        fields = _fields(content)
        numeric = [bool(PLAIN_NUMBER.match(f)) for f in fields]
        first = not seen_content
        seen_content = True
        if not any(numeric) and not any(_NOT_FINITE.match(f) for f in fields):
            if first:
                continue  # a header line such as "x,y"
            raise FormatError(f'expected two numbers "x,y", got {quote(content)} (a header is '
                              "allowed only as the first line)", file=file, line=number)
        for f in fields:
            if _NOT_FINITE.match(f):
                raise FormatError(f"{quote(f)} is not a finite number", file=file, line=number)
        if len(fields) != 2 or not all(numeric):
            raise FormatError(f'expected two numbers "x,y", got {quote(content)}', file=file,
                              line=number)
        where = Where(file, number)
        p = (plain_fraction(fields[0], "x", where), plain_fraction(fields[1], "y", where))
        if points and p == points[-1]:
            raise FormatError(f"point ({quote(fields[0], 25)[1:-1]}, {quote(fields[1], 25)[1:-1]}) "
                              "repeats the previous one; remove it", file=file, line=number)
        points.append(p)
        lines.append(number)
    if len(points) >= 2 and points[-1] == points[0]:
        points.pop()
        lines.pop()
    if len(points) < 3:
        raise FormatError(f"a point list needs at least 3 distinct points, got {len(points)}",
                          file=file)
    segments = []
    count = len(points)
    for i in range(count):
        a, b = points[i], points[(i + 1) % count]
        place = f"loop 1, segment {i + 1}"
        segments.append(Line((float(a[0]), float(a[1])), (float(b[0]), float(b[1])),
                             where=Where(file, lines[i], place), exact=a + b))
    loop = Loop(tuple(segments), where=Where(file, lines[0], "loop 1"))
    profile = Profile(loops=(loop,), unit=unit, file=file)
    source = {f"loop 1, segment {i + 1}": line for i, line in enumerate(lines)}
    source["loop 1"] = lines[0]
    return ProfileDocument(profile=profile, exact=True, source_lines=source)
