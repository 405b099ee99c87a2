"""Output for many parts: a plain one-row-per-part table, JSON lines, and a progress bar.

A batch of a thousand parts must not spend its time drawing a table: the
rows are laid out here as plain aligned text (a header, a rule, one line per
part), which costs microseconds per row where a rich table costs
milliseconds. JSON lines are one compact object per line. The progress bar
is drawn on standard error, and only when that is a terminal, so it never
mixes with tables, JSON or CSV on standard output.

Examples
--------
>>> print(plain_table(["part", "volume"], [["a", "1.5 mm³"], ["bb", "12 mm³"]], right=(1,)))
part   volume
----  -------
a     1.5 mm³
bb     12 mm³
>>> json_line({"file": "a.toml", "volume": float("nan")})
'{"file": "a.toml", "volume": null}'
"""

from __future__ import annotations

import contextlib
import json
import sys
from typing import Callable, Iterator, Optional, Sequence

#: Runs with at least this many parts show a progress bar (when standard error is a terminal).
PROGRESS_FROM = 100


def plain_table(headers: Sequence[str], rows: Sequence[Sequence[str]],
                right: Sequence[int] = (), title: Optional[str] = None) -> str:
    """Rows of text as aligned columns (two spaces apart), with a header and a rule.

    ``right`` lists the columns aligned to the right (numbers). A row may be
    shorter than the header (its last cell then runs on, unaligned: an error
    message). No trailing spaces.

    >>> print(plain_table(["a", "b"], [["x"], ["y", "z"]], title="two"))
    two
    a  b
    -  -
    x
    y  z
    >>> plain_table(["a"], [])
    'a\\n-'
    """
    n = len(headers)
    widths = [len(h) for h in headers]
    for r in rows:
        if len(r) == n:
            for k, cell in enumerate(r):
                if len(cell) > widths[k]:
                    widths[k] = len(cell)
    right = set(right)

    def line(cells) -> str:
        if len(cells) < n:
            head = [c.rjust(widths[k]) if k in right else c.ljust(widths[k])
                    for k, c in enumerate(cells[:-1])]
            return "  ".join(head + [cells[-1]]).rstrip() if cells else ""
        return "  ".join(c.rjust(w) if k in right else c.ljust(w)
                         for k, (c, w) in enumerate(zip(cells, widths))).rstrip()

    out = [title] if title else []
    out.append(line(list(headers)))
    out.append("  ".join("-" * w for w in widths))
    out.extend(line(r) for r in rows)
    return "\n".join(out)


def json_line(obj) -> str:
    """One compact line of strict JSON (NaN and infinities become null), characters kept."""
    from revolve.cli.common import clean_json

    return json.dumps(clean_json(obj), ensure_ascii=False)


@contextlib.contextmanager
def progress_bar(total: int, what: str = "parts") -> Iterator[Optional[Callable[[int], None]]]:
    """A callback ``advance(n)`` drawing a bar on standard error, or None when none is shown.

    A bar is shown for :data:`PROGRESS_FROM` parts or more, and only when
    standard error is a terminal (never in a pipe, a file or a test).

    >>> with progress_bar(10**6) as advance:   # standard error is not a terminal here
    ...     advance is None
    True
    """
    stream = sys.stderr
    if total < PROGRESS_FROM or not getattr(stream, "isatty", lambda: False)():
        yield None
        return
    from rich.console import Console
    from rich.progress import (BarColumn, MofNCompleteColumn, Progress, TextColumn,
                               TimeRemainingColumn)

    with Progress(TextColumn(what), BarColumn(), MofNCompleteColumn(), TimeRemainingColumn(),
                  console=Console(file=stream), transient=True) as bar:
        job = bar.add_task(what, total=total)
        yield lambda n: bar.advance(job, n)
