"""``revolve levels``: fill-level table of a vessel (or any revolved profile), and the inverse.

The work is :func:`revolve.jobs.levels.level_table` (also ``revolve.level_table``);
this module declares the options and shows the result. The profile is the
**liquid space** (see :mod:`revolve.jobs.levels`).

Rows: ``--step S`` (0, S, 2S, … and the full level), ``--count N`` (N equal
intervals; default 10), ``--at L1,L2,…``; or the inverse, the level holding
each of ``--volume V1,V2,…`` or ``--percent P1,P2,…``. Levels take units and
fractions (``--step "1/8 in"``, ``--at "10 mm,20 mm"``); a bare number is in
the level unit (``--level-unit``, default the drawing's unit). A bare volume
is in the capacity unit (``--volume-unit``, default L, US gal for inch or
foot drawings); wetted areas follow ``--area-unit`` (default m², ft²).

``--json`` prints one object: ``command``, ``inputs``, ``units``,
``profile``, ``orientation``, ``orientation_from`` (``file`` or ``asked``),
``crosscheck``, ``space`` (capacity, full level, inside surface), ``levels``
(the rows: ``level``, ``volume``, ``percent``, ``wetted_area``,
``volume_error``; inverse rows also ``volume_asked`` or ``percent_asked``),
``notes`` and ``cautions``. ``--csv FILE`` writes the rows (refused if the
file exists, unless ``--force``).
"""

from __future__ import annotations

from typing import Any, List, Optional

import typer

from revolve.cli import options

#: The command line's names of the job's settings (the job's errors name these).
NAMES = {"orientation": "--orientation", "axis": "--axis", "step": "--step", "count": "--count",
         "at": "--at", "volumes": "--volume", "percent": "--percent",
         "level_unit": "--level-unit", "volume_unit": "--volume-unit",
         "area_unit": "--area-unit", "units": "--units", "tolerance": "--tolerance"}
#: Past this many rows, a table written to --csv is not also printed.
PRINTED_ROWS = 40


def run_levels(profile: str, *, csv_file: Optional[str], force: bool, as_json: bool,
               **settings: Any) -> int:
    """Build the table, write the CSV, show it; the exit code (1: the cross-check disagrees)."""
    import sys
    from dataclasses import replace

    from revolve.jobs.levels import level_table
    from revolve.render import output

    if csv_file:
        from revolve.formats.files import check_target

        check_target(csv_file, option="--csv", replace=force)
    result = level_table(profile, names=NAMES, **settings)
    if csv_file:
        output.write_outputs({csv_file: (output.csv_text(result, "levels"), "--csv")},
                             force=force)
    if as_json:
        print(output.json_text(result))
    else:
        shown = result
        rows = len(result.table("levels").rows)
        if csv_file:
            kept = result.tables if rows <= PRINTED_ROWS else (result.table("space"),)
            shown = replace(result, tables=kept,
                            notes=result.notes + (f"wrote {rows} rows to {csv_file}",))
        output.show(shown)
    check = result.extra["crosscheck"]
    if not check["agrees"]:
        print(f"revolve: the capacity and its washer cross-check disagree by "
              f"{check['capacity_difference']:.1e} (more than {check['tolerance']:g}); do not "
              "use this table without finding out why", file=sys.stderr)
        return 1
    return 0


def register(app: typer.Typer) -> None:
    @app.command("levels")
    def levels_command(
        profile: str = typer.Argument(..., help="Profile of the liquid space: a closed loop (the "
                                                "inside, closed along the axis) or a chain (the "
                                                "inside wall, both ends on the axis)."),
        orientation: Optional[str] = typer.Option(
            None, "--orientation", help="vertical (axis upright, its direction up) or horizontal "
                                        "(axis level). Default: the file's orientation; "
                                        "refused when neither says."),
        axis: Optional[Any] = options.axis_option(),
        step: Optional[Any] = typer.Option(
            None, "--step", click_type=options.LENGTH, metavar="LENGTH",
            help="A row every STEP of level, and the full level: '1/8 in', '50 mm'; a bare "
                 "number is in the level unit."),
        count: Optional[int] = typer.Option(None, "--count", help="COUNT equal intervals from "
                                                                  "empty to full (COUNT + 1 rows; "
                                                                  "default 10)."),
        at: Optional[List[Any]] = typer.Option(
            None, "--at", click_type=options.LENGTH_LIST, metavar="LENGTHS",
            help="Levels, e.g. '100 mm,250 mm' or 100,250 (bare numbers in the level unit)."),
        volume: Optional[List[str]] = typer.Option(
            None, "--volume", help="Inverse: the level holding each volume, e.g. '500 L,1000 L' "
                                   "(bare numbers in the volume unit)."),
        percent: Optional[List[str]] = typer.Option(
            None, "--percent", help="Inverse: the level holding each percentage of the "
                                    "capacity, e.g. 10,90."),
        level_unit: Optional[str] = options.unit_option(
            "level", "length", "Unit of the levels. Default: the drawing's unit."),
        volume_unit: Optional[str] = options.unit_option(
            "volume", "volume", "Unit of volumes and capacity. Default: L (US gal for inch or "
                                "foot drawings)."),
        area_unit: Optional[str] = options.unit_option(
            "area", "area", "Unit of wetted areas. Default: m² (ft² for inch or foot "
                            "drawings)."),
        units: Optional[str] = options.units_option(),
        as_json: bool = options.json_option(),
        csv_file: Optional[str] = options.csv_option(),
        force: bool = options.force_option(),
        tolerance: float = options.tolerance_option(1e-9),
    ) -> None:
        """Fill-level table: volume and wetted inside area at each level, or level for a volume.

        The profile is the liquid space: a closed loop that is the inside of the
        vessel, closed along the axis (as revolve vessel writes it), or an open
        chain that is the inside wall with both ends on the axis. Vertical: the
        axis direction points up, level = height above the lowest inside point.
        Horizontal: level = depth above the lowest inside point. The
        orientation comes from --orientation, else from the file's
        orientation key; with neither the command refuses.

        Tables are geometry only; tables for custody transfer need certified
        calibration.
        """
        code = run_levels(profile, csv_file=csv_file, force=force, as_json=as_json,
                          orientation=orientation, axis=axis, step=step, count=count,
                          at=at or None, volumes=volume or None, percent=percent or None,
                          level_unit=level_unit, volume_unit=volume_unit, area_unit=area_unit,
                          units=units, tolerance=tolerance)
        if code:
            raise typer.Exit(code)
