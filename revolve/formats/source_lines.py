"""Line numbers of the parts of a profile file, found by a light scan of its text.

``tomllib`` gives values but not where they were written, so error messages
get their line numbers from this scan. It reads the text once, skipping
strings and comments, and records

* ``"units"``, ``"angle"``, ... : the line of each top-level key;
* ``"axis"``: the ``[axis]`` header (or an ``axis = {...}`` key), and
  ``"axis.along"`` etc. for its keys;
* ``"loop 2"``, ``"chain 1"``: the ``[[loop]]`` / ``[[chain]]`` headers, and
  ``"loop 2.start"`` etc. for their keys;
* ``"loop 2, segment 3"``: the line where that segment's value (normally an
  inline table) starts in the ``segments = [...]`` array, or its
  ``[[loop.segments]]`` header.

A file laid out some other way simply has fewer entries; callers then leave
the line out of their messages. The scan assumes the text is valid TOML
(run it after ``tomllib`` accepted the text).

Examples
--------
>>> text = '''units = "mm"
... [[loop]]
... start = [0, 1]
... segments = [
...   { line_to = [2, 1] },  # a comment with { a brace
...   { line_to = [2, 3], face = "end" }, { close = true },
... ]
... '''
>>> found = scan_lines(text)
>>> found["units"], found["loop 1"], found["loop 1.start"]
(1, 2, 3)
>>> [found[f"loop 1, segment {i}"] for i in (1, 2, 3)]
[5, 6, 6]
"""

from __future__ import annotations

import re
from typing import Dict, NamedTuple, Optional

_HEADER = re.compile(r"\[\[\s*([^\[\]\n]*?)\s*\]\]|\[\s*([^\[\]\n]*?)\s*\]")
_KEY = re.compile(r"((?:[A-Za-z0-9_-]+|\"[^\"\n]*\"|'[^'\n]*')"
                  r"(?:\s*\.\s*(?:[A-Za-z0-9_-]+|\"[^\"\n]*\"|'[^'\n]*'))*)\s*=")
_PATH_KINDS = ("loop", "chain")
_DOT_OUTSIDE_QUOTES = re.compile(r"\.(?=(?:[^\"']*[\"'][^\"']*[\"'])*[^\"']*$)")


def _clean_key(key: str) -> str:
    """``a . "b"`` -> ``a.b``."""
    parts = _DOT_OUTSIDE_QUOTES.split(key)
    return ".".join(p.strip().strip("\"'") for p in parts)


def _skip_string(text: str, i: int) -> tuple[int, int]:
    """Index after the string starting at ``i`` and the number of newlines inside it."""
    quote = text[i]
    triple = text.startswith(quote * 3, i)
    if triple:
        j = i + 3
        while True:
            k = text.find(quote * 3, j)
            if k < 0:
                return len(text), text.count("\n", i)
            if quote == '"':
                backslashes = 0
                m = k - 1
                while m >= j and text[m] == "\\":
                    backslashes += 1
                    m -= 1
                if backslashes % 2:
                    j = k + 1
                    continue
            end = k + 3
            # up to two more quotes may belong to the content ("""a"""" is legal)
            while end < len(text) and text[end] == quote and end - k < 5:
                end += 1
            return end, text.count("\n", i, end)
    j = i + 1
    while j < len(text):
        c = text[j]
        if c == "\\" and quote == '"':
            j += 2
            continue
        if c == quote:
            return j + 1, 0
        if c == "\n":
            return j, 0
        j += 1
    return j, 0


def scan_lines(text: str) -> Dict[str, int]:
    """Map the parts of a profile file to their 1-based line numbers.

    Parameters
    ----------
    text : str
        The file's text, already accepted by ``tomllib``.

    Returns
    -------
    dict
        Keys as described in the module docstring; parts not found are absent.

    Examples
    --------
    >>> scan_lines("")
    {}
    >>> found = scan_lines('[axis]\\nalong = "y"\\n[[chain]]\\n'
    ...                    '[[chain.segments]]\\nline_to = [1, 2]\\n')
    >>> found["axis"], found["axis.along"], found["chain 1"], found["chain 1, segment 1"]
    (1, 2, 3, 4)
    """
    found: Dict[str, int] = {}
    counts = {kind: 0 for kind in _PATH_KINDS}
    segment_counts: Dict[str, int] = {}
    table = ""          # label of the current table: "", "axis", "loop 1", ...
    path = None         # label of the current loop or chain, if the table is one
    depth: list = []    # brackets open in the current value
    pending = None      # a "segments =" key was just read for this path
    array_owner = None  # the path whose segments array is open at depth 1
    element = False     # the next value in that array starts a segment
    line = 1
    i, n = 0, len(text)
    line_start = True
    while i < n:
        c = text[i]
        if c == "\n":
            line += 1
            i += 1
            line_start = True
            continue
        if c in " \t\r":
            i += 1
            continue
        if c == "#":
            k = text.find("\n", i)
            i = n if k < 0 else k
            continue
        if line_start and not depth:
            line_start = False
            m = _HEADER.match(text, i) if c == "[" else None
            if m:
                name = _clean_key(m.group(1) if m.group(1) is not None else m.group(2))
                array = m.group(1) is not None
                pending = None
                if array and name in _PATH_KINDS:
                    counts[name] += 1
                    table = path = f"{name} {counts[name]}"
                    found.setdefault(table, line)
                elif array and path and name == path.split()[0] + ".segments":
                    segment_counts[path] = segment_counts.get(path, 0) + 1
                    table = f"{path}, segment {segment_counts[path]}"
                    found.setdefault(table, line)
                else:
                    table, path = name, None
                    found.setdefault(table, line)
                i = m.end()
                continue
            m = _KEY.match(text, i)
            if m:
                key = _clean_key(m.group(1))
                found.setdefault(f"{table}.{key}" if table else key, line)
                pending = path if (path and table == path and key == "segments") else None
                i = m.end()
                continue
        line_start = False
        if element and array_owner and depth == ["["] and c not in "],":
            segment_counts[array_owner] = segment_counts.get(array_owner, 0) + 1
            found.setdefault(f"{array_owner}, segment {segment_counts[array_owner]}", line)
            element = False
        if c in "\"'":
            i, newlines = _skip_string(text, i)
            line += newlines
            continue
        if c in "[{":
            if c == "[" and not depth and pending:
                array_owner, pending, element = pending, None, True
            depth.append(c)
        elif c in "]}":
            if depth:
                depth.pop()
            if not depth:
                array_owner = None
        elif c == "," and array_owner and depth == ["["]:
            element = True
        i += 1
    return found


class Oversize(NamedTuple):
    """The first part of a text that is too deep or too long (see :func:`find_oversize`).

    ``kind`` is ``"nesting"``, ``"word"`` (an unquoted word: a number, a
    bare key, true/false) or ``"string"``; ``line`` is 1-based; ``key`` is
    the last key written before it (None when there is none yet); ``size``
    is the depth or the number of characters.
    """

    kind: str
    line: int
    key: Optional[str]
    size: int


_TOKEN = re.compile(r"\n|#[^\n]*|[\[\]{}=,]|[\"']|[^\s\[\]{}=,#\"']+|[ \t\r\f\v]+")


def find_oversize(text: str, *, max_depth: int, max_word: int,
                  max_string: int) -> Optional[Oversize]:
    """Find brackets nested too deep, or a word or string too long, before TOML reads the text.

    The TOML reader is recursive and reads every number with Python's own
    ``int``; this scan bounds what it will be given. It does not need valid
    TOML: it skips comments and strings, counts ``[`` and ``{`` against
    ``]`` and ``}``, and measures unquoted words and strings.

    Parameters
    ----------
    text : str
        The file's text.
    max_depth : int
        Most brackets (``[`` or ``{``) open at once.
    max_word, max_string : int
        Most characters in one unquoted word (a number) and in one string
        (quotes included).

    Returns
    -------
    Oversize or None
        The first problem, or None when the text is within every bound.

    Examples
    --------
    >>> find_oversize('a = [[[1]]]\\nb = 12345', max_depth=3, max_word=5, max_string=10)
    >>> find_oversize('a = 1\\nb = [[[[1]]]]', max_depth=3, max_word=5, max_string=10)
    Oversize(kind='nesting', line=2, key='b', size=4)
    >>> find_oversize('x = 123456  # 1234567890', max_depth=3, max_word=5, max_string=10)
    Oversize(kind='word', line=1, key='x', size=6)
    >>> find_oversize('"a b" = "a very long text"', max_depth=3, max_word=5, max_string=10)
    Oversize(kind='string', line=1, key='a b', size=18)
    >>> find_oversize('', max_depth=1, max_word=1, max_string=2) is None
    True
    """
    depth = 0
    line = 1
    key: Optional[str] = None
    previous: Optional[str] = None   # the last word or string, a key if "=" follows
    i, n = 0, len(text)
    while i < n:
        c = text[i]
        if c in "\"'":
            end, newlines = _skip_string(text, i)
            if end - i > max_string:
                return Oversize("string", line, key, end - i)
            previous = text[i:end].strip("\"'")
            line += newlines
            i = end
            continue
        m = _TOKEN.match(text, i)
        if m is None:  # pragma: no cover - the pattern matches every character
            i += 1
            continue
        token = m.group()
        i = m.end()
        if token == "\n":
            line += 1
        elif token[0] == "#" or token.isspace():
            continue
        elif token in "[{":
            depth += 1
            if depth > max_depth:
                return Oversize("nesting", line, key, depth)
            previous = None
        elif token in "]}":
            depth = max(depth - 1, 0)
            previous = None
        elif token == "=":
            if previous is not None:
                key = previous
            previous = None
        elif token == ",":
            previous = None
        else:
            if len(token) > max_word:
                return Oversize("word", line, key, len(token))
            previous = token
    return None
