"""Output for many parts: a plain one-row-per-part table, JSON lines, CSV rows, a progress bar.

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
import functools
import json
import sys
from dataclasses import dataclass
from typing import Callable, Iterator, Optional, Sequence

from revolve.jobs.measuring import DEFAULT_TOLERANCE

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
    from revolve.render.output import clean_json

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


# -- rows of `revolve measure` over many files --------------------------------------------------


@dataclass(frozen=True)
class JsonRow:
    """Turns a measured part into its JSON object plus ``file``, where it was measured (picklable).

    Every part of a batch gets the object a single file's ``--json`` prints,
    with the file name first; the output units default to each part's own
    (:func:`revolve.jobs.measuring.part_units`).
    """

    length_unit: Optional[str] = None
    area_unit: Optional[str] = None
    volume_unit: Optional[str] = None
    mass_unit: Optional[str] = None
    tolerance: float = DEFAULT_TOLERANCE

    def __call__(self, part) -> dict:
        from revolve.jobs.measuring import part_json

        u = _part_units(part.document.profile.unit, self.length_unit, self.area_unit,
                        self.volume_unit, self.mass_unit)
        return {"file": part.file, **part_json(part, u, self.tolerance)}


@functools.lru_cache(maxsize=64)
def _part_units(*units):
    """:func:`revolve.jobs.measuring.part_units`, once per profile unit in a batch (immutable)."""
    from revolve.jobs.measuring import part_units

    return part_units(*units)


#: Columns of ``--csv`` for several files: one row per part, each figure with its unit beside it.
BATCH_CSV_COLUMNS = ("file", "name", "profile_unit", "error", "area", "area_unit", "volume",
                     "volume_unit", "surface_area", "mass", "mass_unit", "centre_of_mass_axial",
                     "length_unit", "crosscheck_volume_difference",
                     "crosscheck_surface_difference", "crosscheck_agrees")


def batch_csv_row(d: dict) -> dict:
    """One CSV row of a batch from a part's :class:`JsonRow` object (see :data:`BATCH_CSV_COLUMNS`)."""
    u = d["units"]
    c = d.get("crosscheck") or {}
    return {"file": d["file"], "name": d["profile"]["name"], "profile_unit": d["profile"]["unit"],
            "area": d["area"], "area_unit": u["area"], "volume": d["volume"],
            "volume_unit": u["volume"], "surface_area": d["surface_area"],
            "mass": d.get("mass"), "mass_unit": u["mass"] if "mass" in d else None,
            "centre_of_mass_axial": d["centre_of_mass_axial"], "length_unit": u["length"],
            "crosscheck_volume_difference": c.get("volume_difference"),
            "crosscheck_surface_difference": c.get("surface_difference"),
            "crosscheck_agrees": c.get("agrees")}


def batch_cells(d: dict) -> list:
    """One row of the batch table from a part's :class:`JsonRow` object: file, volume, surface,
    mass, cross-check (the worst relative difference), each figure with its unit.

    >>> d = {"file": "a.toml", "units": {"volume": "mm³", "area": "mm²", "mass": "kg"},
    ...      "centroid": [1, 2], "volume": 100.00000000000004, "surface_area": 0.5,
    ...      "crosscheck": {"volume_difference": 1e-15, "surface_difference": 0.0,
    ...                     "agrees": True}}
    >>> batch_cells(d)
    ['a.toml', '100 mm³', '0.5 mm²', '—', 'ok 1.0e-15']
    """
    from revolve.render.numbers import MISSING, number

    u = d["units"]
    c = d.get("crosscheck")
    if c is None:
        check = MISSING
    else:
        worst = max(c["volume_difference"] if d["centroid"] is not None else 0.0,
                    c["surface_difference"])
        check = f"{'ok' if c['agrees'] else 'DISAGREE'} {worst:.1e}"
    mass = f"{number(d['mass'])} {u['mass']}" if "mass" in d else MISSING
    volume = f"{number(d['volume'])} {u['volume']}" if d["centroid"] is not None else MISSING
    return [d["file"], volume, f"{number(d['surface_area'])} {u['area']}", mass, check]


@dataclass(frozen=True)
class BatchRow:
    """What the many-files outputs need of a part, made where it was measured (small to send back).

    ``json`` is its JSON line, ``cells`` its table row, ``csv`` its CSV row
    (each None when that output was not asked for).
    """

    json: Optional[str]
    cells: Optional[list]
    csv: Optional[dict]
    agrees: bool
    has_mass: bool


@dataclass(frozen=True)
class RowMaker:
    """A measured part -> :class:`BatchRow` for the outputs asked for (picklable, run in workers)."""

    row: JsonRow
    json: bool = False
    table: bool = False
    csv: bool = False

    def __call__(self, part) -> BatchRow:
        d = self.row(part)
        c = d.get("crosscheck")
        return BatchRow(json=json_line(d) if self.json else None,
                        cells=batch_cells(d) if self.table else None,
                        csv=batch_csv_row(d) if self.csv else None,
                        agrees=c is None or c["agrees"], has_mass="mass" in d)


def run_batch(paths, left_out, task, as_json: bool, csv_path: Optional[str], row: JsonRow, *,
              force: bool = False, workers=None, serial_below=None) -> int:
    """Many files: one row per part (plain table, JSON lines, CSV); errors kept in their rows.

    JSON lines are written as the parts come (in input order), so that a long
    run holds only the small rows of the table or the CSV. The exit code: 2
    when a part was refused, 1 when a cross-check disagrees, else 0.
    """
    from revolve.errors import one_line
    from revolve.jobs import batch
    from revolve.jobs.results import CAUTIONS
    from revolve.render.output import rows_csv_text, write_outputs

    pool = {} if serial_below is None else {"serial_below": serial_below}
    maker = RowMaker(row, json=as_json, table=not as_json, csv=csv_path is not None)
    csv_rows, cells, failed, disagree = [], [], [], []
    count = any_mass = 0
    write = sys.stdout.write
    with progress_bar(len(paths), "measuring") as advance:
        for r in batch.iter_measure(paths, axis=task.axis, angle=task.angle, units=task.units,
                                    density=task.density, density_label=task.density_label,
                                    convert=maker, workers=workers, progress=advance, **pool):
            count += 1
            b = r.value
            if not r.ok:
                failed.append(r)
            elif not b.agrees:
                disagree.append(r.file)
            if csv_path is not None:
                csv_rows.append(b.csv if r.ok else {"file": r.file, "error": r.error})
            if as_json:
                write((b.json if r.ok else json_line({"file": r.file, "error": r.error})) + "\n")
            else:
                cells.append(b.cells if r.ok else [r.file, f"error: {r.error}"])
                any_mass = any_mass or (r.ok and b.has_mass)
    if csv_path is not None:
        write_outputs({csv_path: (rows_csv_text(csv_rows, BATCH_CSV_COLUMNS), "--csv")}, force=force)
    not_profiles = [f"left out {other}: not a profile (no [[loop]] or [[chain]])"
                    for other in left_out]
    if as_json:
        for line in not_profiles:
            print(f"revolve: {line}", file=sys.stderr)
    else:
        heads = ["file", "volume", "surface, swept total", "mass", "cross-check"]
        title = (f"{count} parts" + (f", {len(failed)} refused" if failed else "")
                 if len(failed) < count else f"{count} parts, every one refused")
        text = plain_table(heads, cells, right=(1, 2, 3), title=title)
        if any_mass:
            not_profiles.append("Caution: " + CAUTIONS["lifting"])
        write(text + "\n" + "".join(t + "\n" for t in not_profiles))
    for r in failed:
        print(f"revolve: error: {one_line(r.error)}", file=sys.stderr)
    if disagree:
        print(f"revolve: the two computations disagree by more than {row.tolerance:g} (relative) "
              f"for {', '.join(disagree)}; do not use these figures without finding out why",
              file=sys.stderr)
    if failed:
        return 2
    return 1 if disagree else 0
