"""The one renderer: any :class:`~revolve.jobs.results.Result` as human tables, CSV or JSON.

* **Tables** (rich): each table of the result with its title; numbers through
  :mod:`revolve.render.numbers` (six significant figures, grouped digits, no
  float noise); the unit beside every figure — in the column heading for a
  table of rows, in its own column for a table of figures; then the notes
  and a caution panel.
* **CSV**: one table of the result, a header line whose columns say their
  unit (``volume (L)``), every digit kept (``repr`` of the float).
* **JSON**: :meth:`Result.to_dict`, strict (NaN becomes null), indented.

Files are written through :class:`revolve.formats.files.OutputSet` (all or
nothing) under the one overwrite rule: an existing file is replaced only with
``--force`` (see :data:`OVERWRITE_RULE`).

Examples
--------
>>> from revolve.jobs.results import Field, Result, Table, trade_units
>>> u = trade_units("vessel", "mm")
>>> t = Table("levels", "Level table", (Field("level", "level", "level"),
...                                     Field("volume", "volume", "capacity"),
...                                     Field("percent", "full", style="percent")),
...           ({"level": 0.0, "volume": 0.0, "percent": 0.0},
...            {"level": 2.0, "volume": 20.943951023931955, "percent": 100.00000000000004}))
>>> r = Result("levels", u, {"profile": "tank.toml"}, (t,))
>>> print(csv_text(r), end="")
level (mm),volume (L),full (%)
0.0,0.0,0.0
2000.0,20943.951023931953,100.00000000000004
>>> print(text(r, width=60).replace(chr(0x202f), " "))
Level table
level (mm) ┃ volume (L) ┃  full
━━━━━━━━━━━╇━━━━━━━━━━━━╇━━━━━━
         0 │          0 │   0 %
      2000 │     20 944 │ 100 %
"""

from __future__ import annotations

import math
import sys
from typing import Any, Dict, List, Optional

from revolve.jobs.results import Field, Result, Table
from revolve.render import numbers

__all__ = ["OVERWRITE_RULE", "cell", "csv_text", "json_text", "clean_json", "text", "show",
           "write_outputs"]

#: The rule every command follows for the files it writes (the README states it).
OVERWRITE_RULE = ("A command never replaces an existing file unless --force is given; it checks "
                  "every output before any work, and writes all its files or none.")


def clean_json(obj: Any) -> Any:
    """Replace NaN/inf by None and tuples by lists, recursively, for strict JSON.

    >>> clean_json({"a": (1.0, float("inf"))})
    {'a': [1.0, None]}
    """
    if isinstance(obj, float):
        return obj if math.isfinite(obj) else None
    if isinstance(obj, dict):
        return {str(k): clean_json(v) for k, v in obj.items()}
    if isinstance(obj, (list, tuple)):
        return [clean_json(v) for v in obj]
    return obj


def json_text(obj: Any) -> str:
    """Strict JSON (NaN and infinities become null), indented, UTF-8 characters kept.

    >>> print(json_text({"v": float("nan"), "unit": "mm³"}))
    {
      "v": null,
      "unit": "mm³"
    }
    """
    import json     # only for --json: the tables need none of it

    if isinstance(obj, Result):
        obj = obj.to_dict()
    return json.dumps(clean_json(obj), indent=2, ensure_ascii=False)


def cell(value: Any, f: Field, significant: int = numbers.SIGNIFICANT) -> str:
    """One value (already in its output unit) as a table shows it.

    >>> cell(12.5, Field("p", "p", style="money")), cell(3, Field("n", "n", style="count"))
    ('12.50', '3')
    >>> cell(True, Field("ok", "ok", style="text")), cell(None, Field("v", "v"))
    ('yes', '—')
    """
    if value is None:
        return numbers.MISSING
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, (list, tuple)):
        return ", ".join(cell(v, f, significant) for v in value)
    if isinstance(value, str) or f.style == "text":
        return str(value)
    digits = f.digits or significant
    if f.style == "money":
        return numbers.money(value)
    if f.style == "percent":
        return numbers.percent(value, digits)
    if f.style == "count":
        return numbers.group_digits(str(int(value))) if float(value).is_integer() else \
            numbers.number(value, digits)
    return numbers.number(value, digits)


def _heading(f: Field, r: Result) -> str:
    unit = "%" if f.style == "percent" else r.units.unit(f.role)
    if f.style == "money" and r.units.currency and "/" not in (f.role or ""):
        unit = r.units.currency
    return f"{f.label} ({unit})" if unit else f.label


def _csv_cell(value: Any) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return repr(value) if math.isfinite(value) else ""
    if isinstance(value, (list, tuple)):
        return " ".join(_csv_cell(v) for v in value)
    return str(value)


def rows_csv_text(rows, columns=None) -> str:
    """Plain rows (dicts) as CSV: for rows that carry their own units, such as ``revolve
    measure`` over many files (each part in its own drawing's units, a unit column beside
    each figure). Columns are ``columns`` if given, else every key in order of first
    appearance; cells as in :func:`csv_text` (every digit; None and NaN empty).

    >>> print(rows_csv_text([{"a": 1, "b": "x, y"}, {"a": float("nan"), "c": True}]), end="")
    a,b,c
    1,"x, y",
    ,,true
    >>> rows_csv_text([])
    ''
    """
    import csv
    import io

    rows = list(rows)
    if columns is None:
        columns = list(dict.fromkeys(str(k) for row in rows for k in row))
    if not columns:
        return ""
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(columns)
    for row in rows:
        writer.writerow([_csv_cell(row.get(c)) for c in columns])
    return buffer.getvalue()


def csv_text(r: Result, key: Optional[str] = None) -> str:
    """One table of ``r`` (``key``, else the first table of rows) as CSV, every digit kept."""
    import csv
    import io

    table = r.table(key) if key else next((t for t in r.tables if not t.figures), r.tables[0])
    rows = table.json(r.units)
    rows = [rows] if table.figures else rows
    fields = [f for f in table.fields if any(f.key in row for row in rows)]
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow([_heading(f, r) for f in fields])
    for row in rows:
        writer.writerow([_csv_cell(row.get(f.key)) for f in fields])
    return buffer.getvalue()


def _rich_table(t: Table, r: Result):
    from rich.markup import escape
    from rich.table import Table as RichTable

    # The title is printed above the table by renderables() (a table's own title would wrap
    # to the table's width: a long part name over a narrow table of figures).
    rt = RichTable(show_edge=False, pad_edge=False)
    shown = t.json(r.units)
    if t.figures:
        rt.add_column("quantity")
        rt.add_column("value", justify="right")
        rt.add_column("unit")
        for f in t.fields:
            if f.key in shown:
                unit = "%" if f.style == "percent" else (r.units.currency or "") \
                    if f.style == "money" and "/" not in (f.role or "") else r.units.unit(f.role)
                value = shown[f.key]
                text_value = cell(value, f)
                if f.style == "percent" and text_value.endswith(" %"):
                    text_value = text_value[:-2]
                rt.add_row(escape(f.label), escape(text_value), unit)
        return rt
    fields = [f for f in t.fields if any(f.key in row for row in shown)]
    for f in fields:
        rt.add_column(escape(_heading(f, r) if f.style != "percent" else f.label),
                      justify="left" if f.style == "text" else "right")
    for row in shown:
        rt.add_row(*[escape(cell(row.get(f.key), f)) for f in fields])
    return rt


def renderables(r: Result) -> List[Any]:
    """The rich objects that show ``r``: its tables, its notes, its caution panel."""
    from rich.panel import Panel
    from rich.text import Text

    out: List[Any] = []
    for n, t in enumerate(r.tables):
        if t.title:
            out.append(Text(("\n" if n else "") + t.title, style="italic"))
        out.append(_rich_table(t, r))
    for note in r.notes:
        out.append(Text(note))          # plain text: brackets in names stay as written
    if r.cautions:
        from revolve.jobs.results import CAUTIONS

        out.append(Panel(Text("\n".join(CAUTIONS.get(c, c) for c in r.cautions)),
                         title=Text("Caution"), title_align="left", border_style="yellow",
                         expand=False))
    return out


def html(r: Result) -> str:
    """The tables of ``r`` as HTML (for notebooks; figures formatted as in the terminal).

    >>> from revolve.jobs.results import Field, Result, Table, trade_units
    >>> t = Table("main", "Part", (Field("volume", "volume", "volume"),), ({"volume": 1e-6},),
    ...           figures=True)
    >>> print(html(Result("measure", trade_units("part", "mm"), {}, (t,))))
    <table><caption>Part</caption><tr><th>volume</th><td>1000</td><td>mm³</td></tr></table>
    """
    from html import escape

    parts = []
    for t in r.tables:
        shown = t.json(r.units)
        rows = []
        if t.figures:
            for f in t.fields:
                if f.key in shown:
                    unit = "%" if f.style == "percent" else r.units.unit(f.role)
                    rows.append(f"<tr><th>{escape(f.label)}</th><td>{escape(cell(shown[f.key], f))}"
                                f"</td><td>{escape(unit)}</td></tr>")
        else:
            fields = [f for f in t.fields if any(f.key in row for row in shown)]
            rows.append("<tr>" + "".join(f"<th>{escape(_heading(f, r))}</th>" for f in fields)
                        + "</tr>")
            for row in shown:
                rows.append("<tr>" + "".join(f"<td>{escape(cell(row.get(f.key), f))}</td>"
                                             for f in fields) + "</tr>")
        parts.append(f"<table><caption>{escape(t.title)}</caption>{''.join(rows)}</table>")
    for note in r.notes:
        parts.append(f"<p>{escape(note)}</p>")
    if r.cautions:
        from revolve.jobs.results import CAUTIONS

        parts.append("<p><strong>Caution:</strong> " + escape(
            " ".join(CAUTIONS.get(c, c) for c in r.cautions)) + "</p>")
    return "\n".join(parts)


def console(width: Optional[int] = None, file=None):
    """A rich console (wide enough not to wrap tables in pipes).

    Text is shown as written: no highlighting, and no emoji codes (a part named
    ``cap :ok:`` keeps its name; rich would otherwise load its emoji table and
    replace the code).

    >>> import io
    >>> buffer = io.StringIO()
    >>> console(40, buffer).print("cap :ok:")
    >>> buffer.getvalue()
    'cap :ok:\\n'
    """
    from rich.console import Console

    out = file or sys.stdout
    if width is None and not out.isatty():
        width = 110
    return Console(width=width, highlight=False, emoji=False, file=out)


def text(r: Result, width: int = 110) -> str:
    """The tables of ``r`` as plain text (what ``show`` prints, without colour)."""
    import io

    buffer = io.StringIO()
    c = console(width, buffer)
    for item in renderables(r):
        c.print(item)
    return "\n".join(line.rstrip() for line in buffer.getvalue().splitlines())


def show(r: Result, c=None) -> None:
    """Print ``r`` as tables on standard output (or console ``c``)."""
    c = c or console()
    for item in renderables(r):
        c.print(item)


def write_outputs(files: Dict[str, Any], *, force: bool) -> None:
    """Write a command's files together under :data:`OVERWRITE_RULE`.

    ``files`` maps a path to ``(text or bytes, option)``; nothing is written
    unless every target may be written.

    >>> import os, tempfile
    >>> path = os.path.join(tempfile.mkdtemp(), "t.csv")
    >>> write_outputs({path: ("a\\n", "--csv")}, force=False)
    >>> write_outputs({path: ("b\\n", "--csv")}, force=False)  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --csv: .../t.csv: the file exists already; give --force to replace it
    """
    from revolve.formats.files import OutputSet

    with OutputSet(replace=force) as out:
        for path, (data, option) in files.items():
            if isinstance(data, bytes):
                out.binary(path, data, option=option)
            else:
                out.text(path, data, option=option)
