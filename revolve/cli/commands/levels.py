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
``notes`` and ``cautions``. ``--csv FILE`` writes the rows, ``--picture``
the level picture (PNG or SVG), ``--report`` a self-contained HTML report
(each refused if the file exists, unless ``--force``; all or none).

Gauge tables (issue 13): ``--tilt``, ``--gauge-point``, ``--reference-height``
with ``--ullage``, ``--datum-offset``, ``--level-format``, ``--deadwood``,
``--shell-temperature``/``--base-temperature`` with ``--shell-material`` or
``--expansion``, ``--uncertainty``; the job is the same
(:mod:`revolve.jobs.gauge_table` holds the parts).
"""

from __future__ import annotations

from typing import Any, List, Optional

import typer

from revolve.cli import options

#: The command line's names of the job's settings (the job's errors name these).
NAMES = {"orientation": "--orientation", "axis": "--axis", "step": "--step", "count": "--count",
         "at": "--at", "volumes": "--volume", "percent": "--percent",
         "level_unit": "--level-unit", "volume_unit": "--volume-unit",
         "area_unit": "--area-unit", "units": "--units", "tolerance": "--tolerance",
         "tilt": "--tilt", "gauge_point": "--gauge-point",
         "reference_height": "--reference-height", "ullage": "--ullage",
         "datum_offset": "--datum-offset", "level_format": "--level-format",
         "deadwood": "--deadwood", "shell_temperature": "--shell-temperature",
         "base_temperature": "--base-temperature", "shell_material": "--shell-material",
         "expansion": "--expansion", "uncertainty": "--uncertainty"}
#: Past this many rows, a table written to --csv is not also printed.
PRINTED_ROWS = 40


def run_levels(profile: str, *, csv_file: Optional[str], force: bool, as_json: bool,
               picture: Optional[str] = None, report: Optional[str] = None,
               **settings: Any) -> int:
    """Build the table, write its files, show it; the exit code (1: a cross-check disagrees)."""
    import sys
    from dataclasses import replace

    from revolve.jobs.levels import level_table
    from revolve.render import output

    options.check_report(report, force)
    targets = [(p, o) for p, o in ((csv_file, "--csv"), (picture, "--picture")) if p]
    if targets:
        from revolve.formats.files import check_target

        for path, option in targets:
            check_target(path, option=option, replace=force)
        if picture:
            from revolve.errors import RevolveError
            from revolve.render.pictures import picture_format

            try:
                picture_format(picture)
            except RevolveError as e:
                raise e.located(option="--picture")
    result = level_table(profile, names=NAMES, **settings)
    files = {}
    if csv_file:
        files[csv_file] = (output.csv_text(result, "levels"), "--csv")
    if picture or report:
        from revolve.render.level_picture import picture_of

        figure = picture_of(result)
        if picture:
            from revolve.render.pictures import figure_bytes

            files[picture] = (figure_bytes(figure, picture), "--picture")
        if report:
            from revolve.render.report import report_html, svg_of

            html = report_html(result, title=f"Level table: {result.table('space').title}",
                               pictures=[("Volume and wetted area against level", svg_of(figure))])
            files[report] = (html, "--report")
    if files:
        output.write_outputs(files, force=force)
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
        if check["capacity_difference"] > check["tolerance"]:
            what = (f"the capacity and its washer cross-check disagree by "
                    f"{check['capacity_difference']:.1e} (more than {check['tolerance']:g})")
        else:
            what = (f"the tilted table and its chord-sum cross-check disagree by "
                    f"{check['tilted_difference']:.1e} of the capacity (more than "
                    f"{check['tilted_bound']:g})")
        print(f"revolve: {what}; do not use this table without finding out why", file=sys.stderr)
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
            help="A row every STEP of level (of innage above the datum plate with "
                 "--datum-offset), the empty and full levels, and the volume to the next row: "
                 "'1/8 in', '50 mm'; a bare number is in the level unit."),
        count: Optional[int] = typer.Option(None, "--count", help="COUNT equal intervals from "
                                                                  "empty to full (COUNT + 1 rows; "
                                                                  "default 10)."),
        at: Optional[List[Any]] = typer.Option(
            None, "--at", click_type=options.LENGTH_LIST, metavar="LENGTHS",
            help="Levels (innages with --datum-offset), e.g. '100 mm,250 mm', 3' 4 1/8\" or "
                 "100,250 (bare numbers in the level unit)."),
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
        tilt: Optional[str] = typer.Option(
            None, "--tilt", metavar="DEGREES",
            help="Angle of the axis from its drawn orientation, at most 45. Horizontal: "
                 "positive raises the end the axis points to; vertical: a lean "
                 "(its sign does not change a volume). Levels are then plumb heights at the "
                 "gauge point."),
        gauge_point: Optional[Any] = typer.Option(
            None, "--gauge-point", click_type=options.LENGTH, metavar="LENGTH",
            help="Where the gauge is: its distance along the axis from the vessel's end at the "
                 "start of the axis. Default: mid-length (horizontal), the bottom (vertical)."),
        reference_height: Optional[Any] = typer.Option(
            None, "--reference-height", click_type=options.LENGTH, metavar="LENGTH",
            help="Height of the gauge's reference point above the datum plate (for ullages)."),
        ullage: Optional[List[Any]] = typer.Option(
            None, "--ullage", click_type=options.LENGTH_LIST, metavar="LENGTHS",
            help="Rows at these ullages (down from the reference point): the same as "
                 "--at H-U1,H-U2,..."),
        datum_offset: Optional[Any] = typer.Option(
            None, "--datum-offset", click_type=options.LENGTH, metavar="LENGTH",
            help="Height of the datum plate above the lowest inside point; --at and --step "
                 "are then innages (dips above the plate)."),
        level_format: Optional[str] = typer.Option(
            None, "--level-format", metavar="FORMAT",
            help="auto (default: feet-inches-fractions beside in and ft levels), decimal or "
                 "feet-inches."),
        deadwood: Optional[str] = typer.Option(
            None, "--deadwood", metavar="FILE.toml",
            help="Deadwood and fittings: a TOML file of item tables (a volume from/to a level, "
                 "or a body's profile); a deducted column per row."),
        shell_temperature: Optional[str] = typer.Option(
            None, "--shell-temperature", metavar="TEMP", help="Shell temperature, e.g. '35 °C'."),
        base_temperature: Optional[str] = typer.Option(
            None, "--base-temperature", metavar="TEMP",
            help="The table's base (calibration) temperature, e.g. '15 °C' or '60 °F'."),
        shell_material: Optional[str] = typer.Option(
            None, "--shell-material", metavar="NAME",
            help="Shell material for its expansion coefficient: carbon_steel, stainless_304, "
                 "stainless_316, aluminium."),
        expansion: Optional[str] = typer.Option(
            None, "--expansion", metavar="COEFF",
            help="The shell's linear expansion coefficient instead, e.g. '12e-6 /K'."),
        uncertainty: Optional[str] = typer.Option(
            None, "--uncertainty", metavar="FILE.toml",
            help="Tolerances (diameter, length, thickness, head crown, knuckle, angle, depth, "
                 "tilt, reading) and the vessel's dimensions: each row's standard uncertainty "
                 "(GUM) with its largest contributor."),
        picture: Optional[str] = typer.Option(
            None, "--picture", metavar="FILE", help="Write the level picture (.png or .svg)."),
        report: Optional[str] = options.report_option(),
    ) -> None:
        """Fill-level table: volume and wetted inside area at each level, or level for a volume.

        The profile is the liquid space: a closed loop that is the inside of the
        vessel, closed along the axis (as revolve vessel writes it), or an open
        chain that is the inside wall with both ends on the axis. Vertical: the
        axis direction points up, level = height above the lowest inside point.
        Horizontal: level = depth above the lowest inside point. The
        orientation comes from --orientation, else from the file's
        orientation key; with neither the command refuses.

        Gauge tables: --tilt DEGREES (horizontal: positive raises the end at the
        end of the axis; vertical: a lean), --gauge-point, --reference-height with
        --ullage, --datum-offset (then --at and --step are innages), --deadwood
        FILE, the shell temperature factor, --uncertainty FILE.

        Tables are geometry only; tables for custody transfer need certified
        calibration by an accredited body.
        """
        code = run_levels(profile, csv_file=csv_file, force=force, as_json=as_json,
                          picture=picture, report=report,
                          orientation=orientation, axis=axis, step=step, count=count,
                          at=at or None, volumes=volume or None, percent=percent or None,
                          level_unit=level_unit, volume_unit=volume_unit, area_unit=area_unit,
                          units=units, tolerance=tolerance, tilt=tilt, gauge_point=gauge_point,
                          reference_height=reference_height, ullage=ullage or None,
                          datum_offset=datum_offset, level_format=level_format,
                          deadwood=deadwood, shell_temperature=shell_temperature,
                          base_temperature=base_temperature, shell_material=shell_material,
                          expansion=expansion, uncertainty=uncertainty)
        if code:
            raise typer.Exit(code)
