"""Rows of plain dicts as CSV, for outputs whose rows carry their own units.

Most tables are a :class:`revolve.jobs.results.Result` and go through the one
renderer (:func:`revolve.render.output.csv_text`). The rows here are for what
does not fit one set of units: ``revolve measure`` over many files (each part
in its own drawing's units, a unit column beside each figure, see
:mod:`revolve.cli.rows`). Values stay plain numbers at full precision (``repr``);
a missing value is written empty. :func:`write_csv` is kept for ``turn`` until
it is on the renderer.

Examples
--------
>>> import os, tempfile
>>> path = os.path.join(tempfile.mkdtemp(), "t.csv")
>>> write_csv([{"quantity": "volume", "value": 1 / 3, "unit": "mm³"},
...            {"quantity": "mass", "value": None, "unit": "kg"}], path)
>>> with open(path, encoding="utf-8") as f:
...     print(f.read(), end="")
quantity,value,unit
volume,0.3333333333333333,mm³
mass,,kg
"""

from __future__ import annotations

import csv
import io
import math
from typing import Any, Dict, Iterable, Optional, Sequence

Row = Dict[str, Any]


def _cell(value: Any) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return repr(value) if math.isfinite(value) else ""
    return str(value)


def csv_text(rows: Iterable[Row], columns: Optional[Sequence[str]] = None) -> str:
    """CSV text of rows: a header line, then one line per row.

    Columns are ``columns`` if given, else every key in order of first
    appearance. Floats keep every digit (``repr``); None and NaN are empty.

    >>> print(csv_text([{"a": 1, "b": "x, y"}, {"a": float("nan"), "c": True}]), end="")
    a,b,c
    1,"x, y",
    ,,true
    >>> csv_text([])
    ''
    """
    rows = list(rows)
    if columns is None:
        seen: Dict[str, None] = {}
        for r in rows:
            for k in r:
                seen.setdefault(str(k), None)
        columns = list(seen)
    if not columns:
        return ""
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(columns)
    for r in rows:
        writer.writerow([_cell(r.get(c)) for c in columns])
    return buffer.getvalue()


def write_csv(rows: Iterable[Row], path: str, columns: Optional[Sequence[str]] = None,
              option: Optional[str] = "--csv") -> None:
    """Write rows as a CSV file (UTF-8, ``\\n`` line ends), atomically.

    >>> write_csv([{"a": 1}], "no/such/folder/t.csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --csv: no/such/folder/t.csv: cannot write the file (No such file or directory)
    """
    from revolve.formats.files import write_text_atomically

    write_text_atomically(path, csv_text(rows, columns), option=option)
