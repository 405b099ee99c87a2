"""``revolve measure``: section, volume, surface by face, mass, and the cross-check.

One file gives the full tables (or one JSON object). Several files, or a
folder, give one row per part: a plain table, JSON lines (``--json``: one
object per line, the single-file object with ``file`` first) or a CSV
(``--csv``). A part that is refused keeps its row, with the error; the exit
code is then 2. The parts are measured by :func:`revolve.jobs.batch.run_many`
(on every core for large batches); their rows are made in
:mod:`revolve.cli.rows`. One file's figures are a
:class:`revolve.jobs.measuring.MeasureResult`, shown by the one renderer
(:mod:`revolve.render.output`).
"""

from __future__ import annotations

import os
import sys
from typing import Any, List, Optional

import typer

from revolve.cli import options
from revolve.errors import RevolveError
from revolve.jobs.measuring import DEFAULT_TOLERANCE

__all__ = ["run_measure", "register"]


def run_measure(profile, axis: Any, angle: Optional[float], material: Optional[str],
                density: Any, as_json: bool, exact: bool, units: Optional[str],
                length_unit: Optional[str], area_unit: Optional[str], volume_unit: Optional[str],
                mass_unit: Optional[str], tolerance: float, csv_path: Optional[str] = None,
                *, force: bool = False, workers: Optional[int] = None,
                serial_below: Optional[int] = None, report: Optional[str] = None) -> int:
    """Measure one file (tables or JSON) or many (one row per part); the exit code.

    ``profile`` is a file name or a list of files and folders. One file that
    is not a folder gives the full tables (or the JSON object); anything
    else one row per part. ``axis`` and ``density`` are text or already
    parsed (an :class:`~revolve.geometry.profile.Axis`, a density in kg/m³).
    Exit code 0, 1 when a cross-check disagrees, 2 when a part is refused
    (the other rows are still given). ``report``: also write the HTML report
    (``--report``; many parts: a summary, then a page per part measured).
    """
    from revolve.cli import common
    from revolve.formats.paths import profile_paths
    from revolve.jobs import batch
    from revolve.jobs.measuring import measure_result, parse_axis, part_units
    from revolve.materials import material_or_density

    items = [profile] if isinstance(profile, str) else [os.fspath(p) for p in profile]
    batch.check_workers(workers)
    if csv_path is not None:
        common.check_output(csv_path, (".csv",), "tables", option="--csv", force=force)
    if not 0 < tolerance:
        raise RevolveError(f"must be a positive number, got {tolerance:g}", option="--tolerance")
    single = len(items) == 1 and not os.path.isdir(items[0])
    paths, left_out = ([items[0]], []) if single else profile_paths(items, skip=csv_path)
    options.check_report(report, force, len(paths))
    if exact and not single:
        raise RevolveError("give one file with --exact; closed forms are worked out one part "
                           "at a time", option="--exact")
    batch.check_units(units)
    part_units("mm", length_unit, area_unit, volume_unit, mass_unit)      # refused once
    if density is not None and not isinstance(density, str):
        density = repr(float(density))
    dens, dens_label, _ = material_or_density(material, density)
    task = batch.MeasureTask(axis=parse_axis(axis) if isinstance(axis, str) else axis,
                             angle=angle, units=units, density=dens, density_label=dens_label,
                             exact=exact)
    if not single:
        from revolve.cli.rows import JsonRow, run_batch

        code = run_batch(paths, left_out, task, as_json, csv_path,
                         JsonRow(length_unit, area_unit, volume_unit, mass_unit, tolerance),
                         force=force, workers=workers, serial_below=serial_below)
        if report is not None:
            _batch_report(report, paths, task, (length_unit, area_unit, volume_unit, mass_unit),
                          tolerance, force)
        return code

    part = batch.measure_part(paths[0], task)
    exact_out = None
    if exact:
        from revolve.geometry.exact import exact_results

        exact_out = exact_results(part.document, part.revolution, part.measurement,
                                  exact_angle=angle)
    u = part_units(part.document.profile.unit, length_unit, area_unit, volume_unit, mass_unit)
    result = measure_result(part, u, tolerance=tolerance, exact_out=exact_out)
    return show_result(result, as_json, csv_path, force, report)


def _batch_report(report: str, paths, task, unit_names, tolerance: float, force: bool) -> None:
    """The many-parts report: every part that was measured (a refused one has its row's error)."""
    from revolve.jobs import batch
    from revolve.jobs.measuring import measure_result, part_units
    from revolve.render import output

    results = []
    for path in paths:
        try:
            part = batch.measure_part(path, task)
        except RevolveError:
            continue
        results.append(measure_result(part, part_units(part.document.profile.unit, *unit_names),
                                      tolerance=tolerance))
    output.write_outputs(options.report_files(report, results), force=force)


def show_result(result, as_json: bool, csv_path: Optional[str], force: bool,
                report: Optional[str] = None) -> int:
    """Print one part's result (tables or JSON), write its CSV and report (all or none); the
    exit code (1: disagree)."""
    from revolve.render import output

    files = options.report_files(report, result)
    if csv_path is not None:
        files[csv_path] = (output.csv_text(one_row(result)), "--csv")
    output.write_outputs(files, force=force)
    if as_json:
        sys.stdout.write(output.json_text(result) + "\n")
    else:
        output.show(result)
    if not result.agrees:
        print(f"revolve: the two computations disagree by more than {result.tolerance:g} "
              "(relative); do not use these figures without finding out why", file=sys.stderr)
        return 1
    return 0


def one_row(result):
    """The result with its figures and its cross-check as one table of figures (the CSV's row)."""
    from dataclasses import replace

    from revolve.jobs.results import Table

    fields, row = [], {}
    for t in result.tables:
        fields.extend(t.fields)
        row.update(t.rows[0])
    return replace(result, tables=(Table("figures", "figures", tuple(fields), (row,),
                                         figures=True),))


def register(app: typer.Typer) -> None:
    @app.command("measure")
    def measure_command(
        profile: List[str] = typer.Argument(..., help="Profile file: .toml (the project's "
                                            "format), a plain list of x,y points (.txt, .csv, "
                                            ".xy), SVG path data (.svg, .svgpath) or a DXF "
                                            "drawing. Several files or folders: one row per "
                                            "part."),
        axis: Optional[Any] = options.axis_option(),
        angle: Optional[float] = options.angle_option(),
        material: Optional[str] = options.material_option(),
        density: Optional[Any] = options.density_option(),
        as_json: bool = typer.Option(False, "--json", help="Print one JSON object instead of "
                                     "tables; for several files, one JSON object per line per "
                                     "part."),
        exact: bool = typer.Option(False, "--exact", help="Also give closed forms such as "
                                   "243*pi/5 when every input is exact (one file only)."),
        units: Optional[str] = options.units_option(),
        length_unit: Optional[str] = options.unit_option(
            "length", "length", "Output length unit (default: the drawing's)."),
        area_unit: Optional[str] = options.unit_option(
            "area", "area", "Output area unit (default: the length unit squared)."),
        volume_unit: Optional[str] = options.unit_option(
            "volume", "volume", "Output volume unit, e.g. L, m^3, US_gallon (default: the length "
            "unit cubed)."),
        mass_unit: Optional[str] = options.unit_option(
            "mass", "mass", "Output mass unit (default: kg; lb for an inch or foot drawing)."),
        tolerance: float = options.tolerance_option(DEFAULT_TOLERANCE),
        csv_path: Optional[str] = typer.Option(
            None, "--csv", help="Also write every figure of both tables to this CSV file (one "
            "row, each column with its unit); for several files, one row per part."),
        force: bool = options.force_option(),
        report: Optional[str] = options.report_option(),
        workers: Optional[int] = typer.Option(None, "--workers", help="Processes for many "
                                              "files: default one per core (from 32 files on); "
                                              "1 runs in one process."),
    ) -> None:
        """Measure a revolved profile: section, volume, surface by face, mass, cross-check.

        Several files or folders give one row per part; a file that is refused
        keeps its row with the error, the others are still measured, and the
        exit code is 2. Exit codes: 0 done, 1 a cross-check disagrees, 2 input
        refused.
        """
        code = run_measure(profile[0] if len(profile) == 1 else profile, axis, angle, material,
                           density, as_json, exact, units, length_unit, area_unit, volume_unit,
                           mass_unit, tolerance, csv_path=csv_path, force=force, workers=workers,
                           report=report)
        if code:
            raise typer.Exit(code)
