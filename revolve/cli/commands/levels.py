"""``revolve levels``: fill-level table of a vessel (or any revolved profile), and the inverse.

The profile is the **liquid space** (see :mod:`revolve.jobs.levels`): a
closed loop that is the inside of the vessel, normally closed along the axis
(what ``revolve vessel`` writes), or an open chain that is the inside wall
with both ends on the axis. Holes (loops inside loops) are taken out. The
revolution must be a full turn.

``--orientation vertical``: the axis stands upright, its direction pointing
up; the level is the height of the liquid surface above the lowest inside
point. ``--orientation horizontal``: the axis lies level; the level is the
depth of liquid above the lowest inside point. Without the option the
profile file's ``orientation`` is used (``revolve vessel`` writes it); the
option wins over the file, and the table says which was used. Where
neither says, the command refuses rather than guess.

Rows: ``--step S`` (0, S, 2S, ... and the full level), ``--count N`` (N equal
intervals, N + 1 rows; the default is 10), ``--at L1,L2,...``; or the
inverse, the level holding each of ``--volume V1,V2,...`` or ``--percent
P1,P2,...`` (of the capacity). Levels are in ``--level-unit`` (default: the
profile's unit), volumes in ``--volume-unit`` (default: the level unit
cubed; L, m^3, US_gallon, imperial_gallon, bbl, ...), wetted areas in
``--area-unit`` (default: the level unit squared).

``--json`` prints a list with one object per row: ``level``, ``volume``,
``percent`` (of the capacity), ``wetted_area`` (inside surface below the
liquid surface), ``volume_error`` (estimate; 0 where exact), the units
``level_unit``, ``volume_unit``, ``area_unit``, ``orientation``,
``orientation_from`` (``"file"`` or ``"--orientation"``), ``capacity`` and
``caution``; inverse rows also give the ``volume_asked`` or
``percent_asked``. ``--csv FILE`` writes the rows for a spreadsheet.
"""

from __future__ import annotations

import math
from typing import List, Optional

import typer

from revolve.cli import common
from revolve.errors import RevolveError, UnitError

DEFAULT_TOLERANCE = 1e-9
DEFAULT_COUNT = 10


def _numbers(values: Optional[List[str]], option: str) -> List[float]:
    """Numbers from repeated options and comma-separated lists: ``--at 1,2 --at 3``."""
    out: List[float] = []
    for text in values or []:
        for item in str(text).replace(";", ",").split(","):
            item = item.strip()
            if not item:
                continue
            try:
                v = float(item)
            except ValueError:
                raise RevolveError(f"{item!r} is not a number; give numbers separated by commas",
                                   place=option)
            if not math.isfinite(v):
                raise RevolveError(f"{item!r} is not a finite number", place=option)
            out.append(v)
    if values and not out:
        raise RevolveError("give at least one number", place=option)
    return out


def _level_unit(text: Optional[str], profile_unit: str) -> str:
    from revolve import units

    if text is None:
        return profile_unit
    try:
        units.factor(text, "length")
        return units.canonical(text, "length")
    except UnitError as e:
        raise common.fail_unit("--level-unit", e)


def _output_units(profile_unit: str, level_unit: str, area_unit: Optional[str],
                  volume_unit: Optional[str]):
    from revolve import units

    names = {}
    for option, text, kind in (("--volume-unit", volume_unit, "volume"),
                               ("--area-unit", area_unit, "area")):
        names[kind] = None
        if text is not None:
            try:
                names[kind] = units.canonical(text, kind)
            except UnitError as e:
                raise common.fail_unit(option, e)
    u = common.output_units(profile_unit, level_unit, names["area"], names["volume"])
    return u, u.volume, u.area


def _mode(step, count, at, volume, percent) -> str:
    given = [name for name, v in (("--step", step), ("--count", count), ("--at", at),
                                  ("--volume", volume), ("--percent", percent)) if v]
    if len(given) > 1:
        raise RevolveError(f"give one of --step, --count, --at, --volume and --percent, not "
                           f"{' and '.join(given)}", place=given[1])
    return given[0] if given else "--count"


def run_levels(profile: str, orientation: Optional[str], axis: Optional[str], step: Optional[float],
               count: Optional[int], at: Optional[List[str]], volume: Optional[List[str]],
               percent: Optional[List[str]], level_unit: Optional[str],
               volume_unit: Optional[str], area_unit: Optional[str], units: Optional[str],
               as_json: bool, csv_file: Optional[str], tolerance: float) -> int:
    """Build and print the table; return the exit code (1: the capacity cross-check disagrees)."""
    import sys

    import numpy as np

    from revolve.jobs import levels as jl

    if orientation is not None:
        orientation = orientation.strip().lower()
        if orientation not in jl.ORIENTATIONS:
            raise RevolveError(f"give vertical or horizontal, got {orientation!r}",
                               place="--orientation")
    if not tolerance > 0:
        raise RevolveError("must be a positive number", place="--tolerance")
    if step is not None and not (math.isfinite(step) and step > 0):
        raise RevolveError(f"the step must be a positive number, got {step:g}", place="--step")
    if count is not None and count < 1:
        raise RevolveError(f"the count must be 1 or more, got {count}", place="--count")
    mode = _mode(step, count, at, volume, percent)
    at_values = _numbers(at, "--at")
    volume_values = _numbers(volume, "--volume")
    percent_values = _numbers(percent, "--percent")
    doc = common.load(profile, unit=units)
    try:
        orientation, orientation_from = jl.choose_orientation(orientation, doc.orientation,
                                                              option="--orientation")
    except RevolveError as e:
        raise e.located(file=doc.file)
    lu = _level_unit(level_unit, doc.profile.unit)
    u, vu, au = _output_units(doc.profile.unit, lu, area_unit, volume_unit)
    ax = common.parse_axis(axis) or doc.axis or common.parse_axis("x")
    angle = doc.angle_degrees if doc.angle_degrees is not None else 360.0
    try:
        space = jl.liquid_space(doc.profile, ax, angle, orientation)
    except RevolveError as e:
        raise e.located(file=doc.file, line=doc.line_of(e.place) if e.place else None)
    L, V = u.length_factor, u.volume_factor
    full = space.height * L
    asked = None
    if mode == "--step":
        if full / step > jl.MAX_ROWS:
            raise RevolveError(f"a step of {step:g} {lu} gives {full / step:.3g} rows for a full "
                               f"level of {common.fmt(full)} {lu} (at most {jl.MAX_ROWS}); make "
                               "it larger", place="--step")
        table = jl.level_table(space, jl.levels_by_step(space, step / L))
    elif mode == "--count":
        n = count if count is not None else DEFAULT_COUNT
        if n > jl.MAX_ROWS:
            raise RevolveError(f"{n} rows are too many (at most {jl.MAX_ROWS})", place="--count")
        table = jl.level_table(space, jl.levels_by_count(space, n))
    elif mode == "--at":
        arr = np.array(at_values)
        for x in arr:
            if x < 0:
                raise RevolveError(f"level {x:g} {lu} is below the lowest inside point (0)",
                                   place="--at")
            if x > full * (1 + 1e-12):
                raise RevolveError(f"level {x:g} {lu} is above the full level "
                                   f"{common.fmt(full)} {lu}", place="--at")
        table = jl.level_table(space, np.minimum(arr / L, space.height))
    elif mode == "--volume":
        arr = np.array(volume_values)
        cap = space.capacity * V
        for x in arr:
            if x < 0:
                raise RevolveError(f"volume {x:g} {vu} is negative", place="--volume")
            if x > cap * (1 + 1e-12):
                raise RevolveError(f"volume {x:g} {vu} is more than the capacity "
                                   f"{common.fmt(cap)} {vu}", place="--volume")
        asked = ("volume_asked", arr)
        table = jl.level_for_volume(space, np.minimum(arr / V, space.capacity))
    else:
        arr = np.array(percent_values)
        for x in arr:
            if not 0 <= x <= 100:
                raise RevolveError(f"{x:g} % is outside 0 to 100 %", place="--percent")
        asked = ("percent_asked", arr)
        table = jl.level_for_percent(space, arr)
    rows = _rows(table, space, u, lu, vu, au, asked, orientation_from)
    csv_out = _csv_text(rows, lu, vu, au, asked) if csv_file else None
    if csv_out is not None:   # before any output: a failed write leaves nothing half done
        from revolve.formats.files import write_text_atomically

        write_text_atomically(csv_file, csv_out, option="--csv")
    if as_json:
        common.print_json(rows)
    else:
        _print(doc, space, table, rows, u, lu, vu, au, asked, csv_file, orientation_from)
    if not space.capacity_crosscheck <= tolerance:
        print(f"revolve: the capacity and its washer cross-check disagree by "
              f"{space.capacity_crosscheck:.1e} (more than {tolerance:g}); do not use this table "
              "without finding out why", file=sys.stderr)
        return 1
    return 0


def _rows(table, space, u, lu, vu, au, asked, orientation_from):
    caution = common.CAUTIONS["vessel"]
    cap = space.capacity * u.volume_factor
    out = []
    for k in range(len(table)):
        row = {}
        if asked is not None:
            row[asked[0]] = float(asked[1][k])
        row.update({
            "level": float(table.level[k]) * u.length_factor,
            "volume": float(table.volume[k]) * u.volume_factor,
            "percent": float(table.percent[k]),
            "wetted_area": float(table.wetted_area[k]) * u.area_factor,
            "volume_error": float(table.error[k]) * u.volume_factor,
            "level_unit": lu, "volume_unit": vu, "area_unit": au,
            "orientation": space.orientation,
            "orientation_from": "file" if orientation_from == "from the file" else "--orientation",
            "capacity": cap, "caution": caution,
        })
        out.append(row)
    return out


def _ascii(unit: str) -> str:
    return unit.replace("²", "^2").replace("³", "^3").replace("µ", "u")


def _csv_text(rows, lu, vu, au, asked) -> str:
    import csv
    import io

    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    head = []
    if asked is not None:
        head.append(f"volume asked ({_ascii(vu)})" if asked[0] == "volume_asked"
                    else "percent asked")
    head += [f"level ({_ascii(lu)})", f"volume ({_ascii(vu)})", "percent of capacity",
             f"wetted area ({_ascii(au)})"]
    w.writerow(head)
    for r in rows:
        line = [repr(r[asked[0]])] if asked is not None else []
        line += [repr(r["level"]), repr(r["volume"]), repr(r["percent"]), repr(r["wetted_area"])]
        w.writerow(line)
    return buf.getvalue()


def _print(doc, space, table, rows, u, lu, vu, au, asked, csv_file, orientation_from):
    from rich.table import Table

    con = common.console()
    f = common.fmt
    name = doc.name or doc.file
    if space.orientation == "vertical":
        how = ("axis upright (its direction up); level = height of the liquid surface above "
               "the lowest inside point")
    else:
        how = ("axis level; level = depth of liquid above the lowest inside point "
               f"({f(space.r_max * u.length_factor)} {lu} below the axis)")
    cap = space.capacity * u.volume_factor
    con.print(f"[bold]{name}[/bold]")
    con.print(f"{space.orientation} ({orientation_from}): {how}")
    con.print(f"capacity {f(cap)} {vu}; full level {f(space.height * u.length_factor)} {lu}; "
              f"inside surface {f(space.inside_area * u.area_factor)} {au}")
    if csv_file and len(rows) > 40:
        con.print(f"wrote {len(rows)} rows to {csv_file}")
    else:
        t = Table(show_edge=False, pad_edge=False)
        if asked is not None:
            t.add_column(f"asked, {vu}" if asked[0] == "volume_asked" else "asked, %",
                         justify="right")
        t.add_column(f"level, {lu}", justify="right")
        t.add_column(f"volume, {vu}", justify="right")
        t.add_column("% of capacity", justify="right")
        t.add_column(f"wetted area, {au}", justify="right")
        for r in rows:
            cells = [f(r[asked[0]])] if asked is not None else []
            cells += [f(r["level"]), f(r["volume"]), f(r["percent"], 6), f(r["wetted_area"])]
            t.add_row(*cells)
        con.print(t)
        if csv_file:
            con.print(f"wrote {len(rows)} rows to {csv_file}")
    notes = [f"capacity by Pappus–Guldinus; the washer cross-check differs by "
             f"{space.capacity_crosscheck:.1e} (relative)"]
    if space.orientation == "vertical":
        notes.append("volumes: the section clipped at each level, Pappus–Guldinus (exact)")
    else:
        worst = float(table.error.max()) / space.capacity if space.capacity and len(table) else 0.0
        notes.append("volumes: wetted circular segments integrated along the axis; largest "
                     f"error estimate {worst:.1e} of the capacity")
    for n in notes:
        con.print(f"note: {n}")
    con.print(common.caution_panel(["vessel"]))


def register(app: typer.Typer) -> None:
    @app.command("levels")
    def levels_command(
        profile: str = typer.Argument(..., help="Profile of the liquid space: a closed loop (the "
                                                "inside, closed along the axis) or a chain (the "
                                                "inside wall, both ends on the axis)."),
        orientation: Optional[str] = typer.Option(None, "--orientation",
                                                  help="vertical (axis upright, its direction "
                                                       "up) or horizontal (axis level). "
                                                       "Default: the file's orientation; "
                                                       "refused when neither says."),
        axis: Optional[str] = typer.Option(None, "--axis",
                                           help="x, y, or X0,Y0,DX,DY. Default: the file's axis, "
                                                "else x. Vertical: the direction points up."),
        step: Optional[float] = typer.Option(None, "--step", help="A row every STEP of level "
                                                                  "(level unit), and the full "
                                                                  "level."),
        count: Optional[int] = typer.Option(None, "--count", help="COUNT equal intervals from "
                                                                  "empty to full (COUNT + 1 rows; "
                                                                  "default 10)."),
        at: Optional[List[str]] = typer.Option(None, "--at", help="Levels, e.g. 100,250,400 "
                                                                  "(level unit)."),
        volume: Optional[List[str]] = typer.Option(None, "--volume",
                                                   help="Inverse: the level holding each volume, "
                                                        "e.g. 500,1000 (volume unit)."),
        percent: Optional[List[str]] = typer.Option(None, "--percent",
                                                    help="Inverse: the level holding each "
                                                         "percentage of the capacity, e.g. 10,90."),
        level_unit: Optional[str] = typer.Option(None, "--level-unit",
                                                 help="mm, cm, m, in, ft. Default: the profile's "
                                                      "unit."),
        volume_unit: Optional[str] = typer.Option(None, "--volume-unit",
                                                  help="L, m^3, US_gallon, imperial_gallon, bbl, "
                                                       "... Default: the level unit cubed."),
        area_unit: Optional[str] = typer.Option(None, "--area-unit",
                                                help="Wetted area unit. Default: the level unit "
                                                     "squared."),
        units: Optional[str] = typer.Option(None, "--units", help="Length unit of plain point "
                                                                  "lists. Default mm."),
        as_json: bool = typer.Option(False, "--json", help="Print a JSON list of rows."),
        csv_file: Optional[str] = typer.Option(None, "--csv", help="Also write the rows to this "
                                                                   "CSV file."),
        tolerance: float = typer.Option(DEFAULT_TOLERANCE, "--tolerance",
                                        help="Largest relative difference allowed between the "
                                             "capacity and its cross-check before the exit "
                                             "code is 1."),
    ) -> None:
        """Fill-level table: volume and wetted inside area at each level, or level for a volume.

        The profile is the liquid space: a closed loop that is the inside of the
        vessel, closed along the axis (as revolve vessel writes it), or an open
        chain that is the inside wall with both ends on the axis. Vertical: the
        axis direction points up, level = height above the lowest inside point.
        Horizontal: level = depth above the lowest inside point. The
        orientation comes from --orientation, else from the file's
        orientation key; with neither the command refuses. JSON: a list of
        rows with level, volume, percent, wetted_area, volume_error, the
        units, orientation, orientation_from, capacity and caution.

        Tables are geometry only; tables for custody transfer need certified
        calibration.
        """
        code = run_levels(profile, orientation, axis, step, count, at, volume, percent,
                          level_unit, volume_unit, area_unit, units, as_json, csv_file,
                          tolerance)
        if code:
            raise typer.Exit(code)
