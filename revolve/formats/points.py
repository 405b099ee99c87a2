"""Plain point lists: one ``x,y`` pair per line, read as one closed polygon.

The numbers on a line may be separated by a comma, a semicolon, a tab or
spaces. ``#`` starts a comment; blank lines are ignored; the first
non-comment line may be a header of words (``x,y``). The polygon is closed
implicitly: a last point equal to the first is dropped. Lengths are in the
``unit`` the caller gives (default ``"mm"``); the file cannot say.

The loop is one :class:`~revolve.geometry.kinds.polyline.Polyline`: the
points go straight into an ``(n, 2)`` float array and the source line of each
vertex into an integer array, with no Python object per vertex. A plain file
is read in a few vectorised passes over its bytes; anything unusual (quotes,
a line that is not two numbers, a number out of range) sends the reader to a
careful pass, line by line, that names the first bad line. Exact values
(:class:`fractions.Fraction`) are kept only when asked (``exact=True``, the
command line's ``--exact``).

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
>>> poly = loop.segments[0]
>>> poly.kind, poly.points.tolist()
('polyline', [[0.0, 10.0], [20.0, 10.0], [20.0, 15.0], [0.0, 15.0], [0.0, 10.0]])
>>> poly.lines.tolist(), str(poly.where_at(1))
([3, 4, 5, 6, 3], 'ring.txt:4')
>>> doc.line_of("loop 1, segment 2")
4
>>> parse_points_text("0,0\\n1,0\\n3.5\\n", file="pts.txt")
Traceback (most recent call last):
...
revolve.errors.FormatError: pts.txt:3: expected two numbers "x,y", got "3.5"
"""

from __future__ import annotations

import re
from fractions import Fraction
from functools import lru_cache
from typing import List, Optional, Tuple

from revolve.errors import FormatError
from revolve.formats.document import ProfileDocument, SourceLines
from revolve.formats.files import read_text
from revolve.formats.values import (LARGEST_NUMBER, MAX_NUMBER_CHARS, PLAIN_NUMBER, SMALLEST_NUMBER,
                                    check_length_unit, plain_fraction, quote)
from revolve.geometry.profile import Loop, Profile
from revolve.geometry.segments import Where

_SEPARATOR = re.compile(r"\s*[,;]\s*|\s+")
_NOT_FINITE = re.compile(r"[+-]?(nan|inf|infinity)\Z", re.IGNORECASE)
#: Characters that str.splitlines takes as line breaks besides \n and \r\n: a file holding
#: any of them (or a lone \r) is read by the careful pass, which splits lines the same way.
_ODD_BREAKS = ("\x0b", "\x0c", "\x1c", "\x1d", "\x1e", "\x85", "\u2028", "\u2029")


def read_points_file(path: str, *, unit: Optional[str] = None,
                     exact: bool = False) -> ProfileDocument:
    """Read a point list from ``path`` as one closed loop (one polyline).

    Parameters
    ----------
    path : str
        File name, used as given in messages.
    unit : str, optional
        Length unit of the coordinates, default ``"mm"``.
    exact : bool, optional
        Keep every coordinate's exact value (for ``--exact``); slower.

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
    return parse_points_text(read_text(path), file=path, unit=unit, exact=exact)


#: load_profile passes ``exact=True`` to readers that say they take it.
read_points_file.takes_exact = True


def _fields(content: str) -> List[str]:
    return [f.strip().strip('"').strip() for f in _SEPARATOR.split(content.strip())]


def parse_points_text(text: str, *, file: Optional[str] = None,
                      unit: Optional[str] = None, exact: bool = False) -> ProfileDocument:
    """Read a point list from its text.

    Parameters
    ----------
    text : str
        The file's text.
    file : str, optional
        File name for messages.
    unit : str, optional
        Length unit, default ``"mm"``.
    exact : bool, optional
        Keep the exact value of every coordinate in the polyline's ``exact``
        field (a :class:`~revolve.geometry.kinds.polyline.PolylineExact`).

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
    >>> doc = parse_points_text("0.1 0\\n1 0\\n1 1e-1\\n", exact=True)
    >>> doc.profile.loops[0].segments[0].exact.points[0]
    (Fraction(1, 10), Fraction(0, 1))
    """
    import numpy as np

    from revolve.geometry.kinds.polyline import Polyline, PolylineExact

    if not text.strip():
        raise FormatError("the file is empty", file=file)
    unit = unit or "mm"
    check_length_unit(unit, Where(file))
    fast = None if exact else _fast_points(text)
    if fast is not None:
        points, lines = fast
        exact_points = None
    else:
        fractions, line_list = _careful_points(text, file)
        exact_points = tuple(fractions)
        points = np.array([(float(x), float(y)) for x, y in fractions], dtype=float).reshape(-1, 2)
        lines = np.array(line_list, dtype=np.int64)
    # Closed back to the first point, which keeps its line.
    points = np.concatenate([points, points[:1]])
    lines = np.concatenate([lines, lines[:1]])
    where = Where(file, int(lines[0]))
    poly = Polyline(points, where=where, lines=lines,
                    exact=PolylineExact(exact_points + exact_points[:1]) if exact else None)
    loop = Loop((poly,), where=Where(file, int(lines[0]), "loop 1"))
    profile = Profile(loops=(loop,), unit=unit, file=file)
    source = SourceLines({"loop 1": int(lines[0])}, {"loop 1": lines[:-1]})
    return ProfileDocument(profile=profile, exact=True, source_lines=source)


def _careful_points(text: str, file: Optional[str]) -> Tuple[list, list]:
    """Line by line, with exact values: the points, their lines, or the first bad line's error."""
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
    return points, lines


def _fast_points(text: str):
    """The points and their lines of a plain point list, vectorised; None when unsure.

    None means "read it carefully": the careful pass then either reads the
    file (the same points) or names the first bad line. Every check here is a
    condition under which the careful pass would accept the line and give the
    same float (numpy parses decimal literals correctly rounded, as
    ``float(Fraction(text))`` does).

    >>> pts, lines = _fast_points("x,y\\r\\n0,1 # first\\r\\n\\r\\n2;1\\r\\n2\\t3\\r\\n")
    >>> pts.tolist(), lines.tolist()
    ([[0.0, 1.0], [2.0, 1.0], [2.0, 3.0]], [2, 4, 5])
    >>> _fast_points("0,0\\n1,,0\\n0,1\\n") is None      # an empty field: careful pass
    True
    >>> _fast_points("0,0\\n1,0\\n1,0\\n0,1\\n") is None  # a repeated point: careful pass
    True
    """
    import numpy as np

    if not text.strip() or '"' in text or any(ch in text for ch in _ODD_BREAKS):
        return None
    raw = text.encode("utf-8")
    # A lone carriage return is a line break for splitlines: leave it to the careful pass.
    if raw.count(b"\r") != raw.count(b"\r\n"):
        return None
    # The first content line may be a header of words: the careful rule decides.
    pos = 0
    while True:
        end = raw.find(b"\n", pos)
        end = len(raw) if end < 0 else end
        if raw[pos:end].split(b"#", 1)[0].strip():
            break
        if end >= len(raw):
            return None
        pos = end + 1
    fields = _fields(raw[pos:end].decode("utf-8").split("#", 1)[0])
    header = (pos, end) if not any(PLAIN_NUMBER.match(f) or _NOT_FINITE.match(f)
                                   for f in fields) else (0, 0)
    # Whole lines a block at a time: the temporary arrays stay small.
    values, lines, literals = [], [], []
    start, line0 = 0, 0
    while start < len(raw):
        stop = raw.find(b"\n", start + _BLOCK_BYTES)
        stop = len(raw) if stop < 0 else stop + 1
        block = _fast_block(raw[start:stop], line0, (header[0] - start, header[1] - start))
        if block is None:
            return None
        if block[0].size:
            values.append(block[0])
            lines.append(block[1])
            literals.append(block[2])
        line0 += raw.count(b"\n", start, stop)
        start = stop
    if not values:
        return None
    pts = np.concatenate(values).reshape(-1, 2)
    lines = np.concatenate(lines)
    if np.all(pts[-1] == pts[0]):
        if literals[0][0] != literals[-1][1]:
            return None       # equal floats from different literals: decided exactly
        pts, lines = pts[:-1], lines[:-1]
    if len(pts) < 3 or np.any(np.all(pts[1:] == pts[:-1], axis=1)):
        return None
    return pts, lines


#: Bytes of a point list that the vectorised pass reads at once (whole lines).
_BLOCK_BYTES = 1 << 21


def _fast_block(chunk: bytes, line0: int, blank):
    """Numbers, vertex lines and the first and last points' literals of whole lines; None when unsure.

    ``line0`` lines come before the block; bytes ``blank[0]:blank[1]`` (a
    header, in block offsets) are skipped.
    """
    import warnings

    import numpy as np

    b = np.frombuffer(chunk, dtype=np.uint8)
    size = len(b)
    nl = np.flatnonzero(b == 10)
    kind = _classes()[b]                     # what each byte is (see _class_table)
    lo, hi = max(blank[0], 0), min(blank[1], size)
    if lo < hi:
        kind[lo:hi] = _BLANK
    # Comments: from the first "#" of a line to its end.
    hashes = np.flatnonzero(b == 35)
    if hashes.size:
        line_end = np.append(nl, size)
        line_of_hash = np.searchsorted(nl, hashes)
        first = np.unique(line_of_hash, return_index=True)[1]
        delta = np.zeros(size + 1, dtype=np.int8)
        delta[hashes[first]] += 1
        delta[line_end[line_of_hash[first]]] -= 1
        kind[np.cumsum(delta[:-1], dtype=np.int8) > 0] = _BLANK
    # Outside comments and the header only number characters, separators and line ends.
    if np.any(kind == _OTHER):
        return None
    token = kind >= _DIGIT
    edges = np.flatnonzero(token[1:] != token[:-1]) + 1          # where tokens start or stop
    if size and token[0]:
        edges = np.concatenate([[0], edges])
    if size and token[-1]:
        edges = np.append(edges, size)
    del token
    starts, stops = edges[0::2], edges[1::2]
    empty = np.zeros(0)
    if not starts.size:
        return empty, np.zeros(0, dtype=np.int64), None
    if int((stops - starts).max()) > MAX_NUMBER_CHARS:
        return None
    line_of = np.searchsorted(nl, starts)                 # line of each token in the block
    per_line = np.bincount(line_of, minlength=len(nl) + 1)
    if np.any((per_line != 0) & (per_line != 2)):
        return None
    # A separator "," or ";" must stand between the two numbers of its line.
    sep_pos = np.flatnonzero(kind == _SEPARATOR_BYTE)
    if sep_pos.size:
        sep_line = np.searchsorted(nl, sep_pos)
        if np.bincount(sep_line).max() > 1 or np.any(per_line[sep_line] != 2):
            return None
        before = np.searchsorted(starts, sep_pos)        # tokens starting before the separator
        if np.any(before - np.searchsorted(line_of, sep_line) != 1):
            return None
    special = np.flatnonzero(kind > _DIGIT)
    if not _plain_numbers(b, starts, kind[special], special):
        return None
    clean = np.where(kind >= _DIGIT, b, np.uint8(32))
    del kind
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        values = np.fromstring(clean.tobytes(), dtype=float, sep=" ")
    if values.size != starts.size:
        return None
    magnitude = np.abs(values)
    # Near the ends of the float range the exact value decides: the careful pass.
    if not np.all(np.isfinite(values)) or np.any(magnitude > LARGEST_NUMBER / 2) \
            or np.any((magnitude < 2 * SMALLEST_NUMBER) & (magnitude != 0)):
        return None
    zero = np.flatnonzero(values == 0)
    if zero.size > 10_000:
        return None
    for k in zero.tolist():
        # a number too small for a float reads as 0: the careful pass refuses it
        if not _mantissa_zero(chunk[starts[k]:stops[k]]):
            return None

    def literal(k):
        return (chunk[starts[k]:stops[k]], chunk[starts[k + 1]:stops[k + 1]])

    return values, line_of[::2] + line0 + 1, (literal(0), literal(len(starts) - 2))


def _mantissa_zero(literal: bytes) -> bool:
    """Whether a decimal literal's digits before its exponent are all zeros ("0.0e5")."""
    mantissa = re.split(rb"[eE]", literal, maxsplit=1)[0]
    return not re.search(rb"[1-9]", mantissa)


def _plain_numbers(work, starts, kinds, positions) -> bool:
    """Whether every token matches ``[+-]?(digits[.digits]|.digits)([eE][+-]?digits)?``.

    ``starts`` are the tokens' first bytes; ``positions`` the bytes other than
    digits and blanks (signs, exponent marks, points) and ``kinds`` their
    classes. Vectorised over the tokens: each sign, point and exponent mark is
    checked against its neighbours and its token.

    >>> import numpy as np
    >>> def ok(s):
    ...     w = np.frombuffer(s.encode(), dtype=np.uint8).copy()
    ...     special = np.flatnonzero(_classes()[w] > _DIGIT)
    ...     return _plain_numbers(w, np.array([0]), _classes()[w][special], special)
    >>> [ok(s) for s in ("1", "-1.5e+3", ".5", "1.", "+.5E-2", "1e", "1-2", "e5", ".", "1.2.3", "1e5e", ".e1",
    ...                  "1e.5", "+", "--1", "1e+")]
    [True, True, True, True, True, False, False, False, False, False, False, False, False, False, False, False]
    """
    import numpy as np

    size = len(work)
    digit = _classes() == _DIGIT
    is_e = _classes() == _MARK

    def neighbours(pos):
        prev = work[np.maximum(pos - 1, 0)]
        prev[pos == 0] = 32
        nxt = work[np.minimum(pos + 1, size - 1)]
        nxt[pos == size - 1] = 32
        return prev, nxt

    def owner(pos):
        return np.searchsorted(starts, pos, side="right") - 1

    signs = positions[kinds == _SIGN]
    if signs.size:
        prev, nxt = neighbours(signs)
        after_e = is_e[prev]
        at_start = starts[np.minimum(np.searchsorted(starts, signs), len(starts) - 1)] == signs
        if not np.all((after_e & digit[nxt]) | (at_start & (digit[nxt] | (nxt == 46)))):
            return False
    marks = positions[kinds == _MARK]
    e_of = np.full(len(starts), size + 1)
    if marks.size:
        own = owner(marks)
        if np.bincount(own).max() > 1:
            return False
        prev, nxt = neighbours(marks)
        if not np.all((digit[prev] | (prev == 46)) & (digit[nxt] | (nxt == 43) | (nxt == 45))):
            return False
        e_of[own] = marks
    dots = positions[kinds == _POINT]
    if dots.size:
        own = owner(dots)
        if np.bincount(own).max() > 1 or np.any(dots > e_of[own]):
            return False
        prev, nxt = neighbours(dots)
        if not np.all(digit[prev] | digit[nxt]):
            return False
    return True


def _class_table():
    import numpy as np

    table = np.full(256, _OTHER, dtype=np.uint8)
    for chars, code in ((b" \t\r\n", _BLANK), (b",;", _SEPARATOR_BYTE), (b"0123456789", _DIGIT),
                        (b"+-", _SIGN), (b"eE", _MARK), (b".", _POINT)):
        table[np.frombuffer(chars, dtype=np.uint8)] = code
    return table


# Byte classes of the vectorised reader, in this order: tokens are the bytes >= _DIGIT.
_BLANK, _SEPARATOR_BYTE, _DIGIT, _SIGN, _MARK, _POINT, _OTHER = range(7)


@lru_cache(maxsize=1)
def _classes():
    """The byte class table (built on first use: numpy is imported only when reading)."""
    return _class_table()
