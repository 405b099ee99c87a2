"""``revolve measure``: section, volume, surface by face, mass, and the cross-check.

One file gives the full tables (or one JSON object). Several files, or a
folder, give one row per part: a plain table, JSON lines (``--json``: one
object per line, the single-file object with ``file`` first) or a CSV
(``--csv``). A part that is refused keeps its row, with the error; the exit
code is then 2. The parts are measured by :func:`revolve.jobs.batch.run_many`
(on every core for large batches).
"""

from __future__ import annotations

import functools
import os
import sys
from dataclasses import dataclass
from typing import List, Optional

import typer

from revolve.cli import common
from revolve.errors import RevolveError, one_line
from revolve.jobs.measuring import (DEFAULT_TOLERANCE, part_json,
                                    shown_faces)



def _table(m, u, title: str, density_label: Optional[str], tolerance: float, exact=None):
    from rich.table import Table

    L, A, V, M = u.length_factor, u.area_factor, u.volume_factor, u.mass_factor
    t = Table(title=title, title_justify="left", show_edge=False, pad_edge=False)
    t.add_column("quantity")
    t.add_column("value", justify="right")
    t.add_column("unit")
    f = common.fmt

    def row(name, value, unit="", style=None):
        t.add_row(name, value, unit, style=style)

    if m.has_solid:
        row("section area", f(m.area * A), u.area)
        row("section centroid (x, y)", f"{f(m.centroid[0] * L)}, {f(m.centroid[1] * L)}", u.length)
        row("  distance from the axis", f(m.centroid_distance * L), u.length)
        row("section perimeter", f(m.perimeter * L), u.length)
    row("boundary length", f(m.boundary_length * L), u.length)
    row("boundary centroid (x, y)",
        f"{f(m.boundary_centroid[0] * L)}, {f(m.boundary_centroid[1] * L)}", u.length)
    row("  distance from the axis", f(m.boundary_centroid_distance * L), u.length)
    t.add_section()
    if m.has_solid:
        row("volume  (θ · d · A)", f(m.volume * V), u.volume, style="bold")
        if exact and exact.get("volume"):
            row("  exact", exact["volume"], u.volume if exact.get("unit_is_profile") else "")
    for face, s in shown_faces(m).items():
        row(f"surface: {face}", f(s * A), u.area)
    row("surface, swept total  (θ · d_L · L)", f(m.surface_total * A), u.area, style="bold")
    if exact and exact.get("surface_area"):
        row("  exact", exact["surface_area"], u.area if exact.get("unit_is_profile") else "")
    if m.cut_face_area is not None:
        row("cut faces (two flat ends, each)", f(m.cut_face_area * A), u.area)
    if m.centre_of_mass_axial is not None:
        row("centre of mass along the axis", f(m.centre_of_mass_axial * L), u.length)
        if m.centre_of_mass_offset:
            row("  its distance from the axis", f(m.centre_of_mass_offset * L), u.length)
    if m.mass is not None:
        t.add_section()
        row("density", f(m.density / u.si_length ** 3), "kg/m³")
        row("mass", f(m.mass * M), u.mass, style="bold")
        row("moment of inertia about the axis", f(m.inertia_axis * M * L * L), u.inertia_unit())
        row("radius of gyration", f(m.radius_of_gyration * L), u.length)
    return t


def _check_table(m, u, tolerance):
    from rich.table import Table

    c = m.crosscheck
    t = Table(title="Cross-check (independent second computation)", title_justify="left",
              show_edge=False, pad_edge=False)
    t.add_column("figure")
    t.add_column("Pappus", justify="right")
    t.add_column("second method", justify="right")
    t.add_column("relative difference", justify="right")
    t.add_column("")
    f = common.fmt
    if m.has_solid:
        ok = c.volume_difference <= tolerance
        t.add_row(f"volume, {u.volume}", f(m.volume * u.volume_factor, 14),
                  f(c.volume * u.volume_factor, 14), f"{c.volume_difference:.1e}",
                  "ok" if ok else "DISAGREE", style=None if ok else "bold red")
    ok = c.surface_difference <= tolerance
    t.add_row(f"surface, {u.area}", f(m.surface_total * u.area_factor, 14),
              f(c.surface_area * u.area_factor, 14), f"{c.surface_difference:.1e}",
              "ok" if ok else "DISAGREE", style=None if ok else "bold red")
    return t


@dataclass(frozen=True)
class JsonRow:
    """Turns a measured part into its JSON object plus ``file``, where it was measured (picklable).

    Every part of a batch gets the object a single file's ``--json`` prints,
    with the file name first; the output units default to each part's own.
    """

    length_unit: Optional[str] = None
    area_unit: Optional[str] = None
    volume_unit: Optional[str] = None
    mass_unit: Optional[str] = None
    tolerance: float = DEFAULT_TOLERANCE

    def __call__(self, part) -> dict:
        u = _output_units(part.document.profile.unit, self.length_unit, self.area_unit,
                          self.volume_unit, self.mass_unit)
        return {"file": part.file, **part_json(part, u, self.tolerance)}


@functools.lru_cache(maxsize=64)
def _output_units(*units):
    """:func:`common.output_units`, worked out once per profile unit in a batch (immutable)."""
    return common.output_units(*units)


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
    mass, cross-check (the worst relative difference), each figure with its unit."""
    u = d["units"]
    f = common.fmt
    c = d.get("crosscheck")
    if c is None:
        check = "—"
    else:
        worst = max(c["volume_difference"] if d["centroid"] is not None else 0.0,
                    c["surface_difference"])
        check = f"{'ok' if c['agrees'] else 'DISAGREE'} {worst:.1e}"
    mass = f"{f(d['mass'], 6)} {u['mass']}" if "mass" in d else "—"
    volume = f"{f(d['volume'], 6)} {u['volume']}" if d["centroid"] is not None else "—"
    return [d["file"], volume, f"{f(d['surface_area'], 6)} {u['area']}", mass, check]


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
        from revolve.cli.rows import json_line

        d = self.row(part)
        c = d.get("crosscheck")
        return BatchRow(json=json_line(d) if self.json else None,
                        cells=batch_cells(d) if self.table else None,
                        csv=batch_csv_row(d) if self.csv else None,
                        agrees=c is None or c["agrees"], has_mass="mass" in d)


def run_measure(profile, axis: Optional[str], angle: Optional[float], material: Optional[str],
                density: Optional[str], as_json: bool, exact: bool, units: Optional[str],
                length_unit: Optional[str], area_unit: Optional[str], volume_unit: Optional[str],
                mass_unit: Optional[str], tolerance: float, csv_path: Optional[str] = None,
                *, workers: Optional[int] = None, serial_below: Optional[int] = None) -> int:
    """Measure one file (tables or JSON) or many (one row per part); the exit code.

    ``profile`` is a file name or a list of files and folders. One file that
    is not a folder gives the full tables (or the JSON object); anything
    else one row per part. Exit code 0, 1 when a cross-check disagrees, 2
    when a part is refused (the other rows are still given).
    """
    from revolve.jobs import batch

    items = [profile] if isinstance(profile, str) else list(profile)
    batch.check_workers(workers)
    if csv_path is not None:
        from revolve.cli.commands.mesh import check_output
        check_output(csv_path, (".csv",), "tables", option="--csv")
    if not 0 < tolerance:
        raise RevolveError(f"must be a positive number, got {tolerance:g}", option="--tolerance")
    single = len(items) == 1 and not os.path.isdir(items[0])
    paths, left_out = ([items[0]], []) if single else common.profile_paths(items, skip=csv_path)
    if exact and not single:
        raise RevolveError("give one file with --exact; closed forms are worked out one part "
                           "at a time", option="--exact")
    batch.check_units(units)
    common.output_units("mm", length_unit, area_unit, volume_unit, mass_unit)  # refused once
    dens, dens_label, _ = common.material_or_density(material, density)
    task = batch.MeasureTask(axis=common.parse_axis(axis), angle=angle, units=units,
                             density=dens, density_label=dens_label, exact=exact)
    if not single:
        return _run_batch(paths, left_out, task, as_json, csv_path,
                          JsonRow(length_unit, area_unit, volume_unit, mass_unit, tolerance),
                          workers=workers, serial_below=serial_below)

    part = batch.measure_part(paths[0], task)
    doc, rev, m = part.document, part.revolution, part.measurement
    ax, ang = rev.axis, rev.angle_degrees
    u = common.output_units(doc.profile.unit, length_unit, area_unit, volume_unit, mass_unit)
    exact_out = None
    if exact:
        from revolve.geometry.exact import exact_results
        exact_out = exact_results(doc, rev, m, exact_angle=angle if angle is not None else None)
    if csv_path is not None:
        from revolve.cli.tables import csv_text, measure_rows
        from revolve.formats.files import OutputSet
        with OutputSet() as files:
            files.text(csv_path, csv_text(measure_rows(m, u, tolerance=tolerance)), option="--csv")
    if as_json:
        common.print_json(part_json(part, u, tolerance, exact_out))
    else:
        con = common.console()
        name = doc.name or doc.file
        axis_text = _axis_text(ax)
        title = (f"{name}\nrevolved {float(ang):g}° about {axis_text}; "
                 f"profile in {doc.profile.unit}")
        con.print(_table(m, u, title, part.density_label, tolerance, exact_out))
        con.print()
        con.print(_check_table(m, u, tolerance))
        if exact and exact_out is not None and exact_out.get("note"):
            con.print(f"exact: {exact_out['note']}")
        for note in m.notes:
            con.print(f"note: {note}")
        if m.mass is not None:
            con.print(f"material: {part.density_label}")
            con.print(common.caution_panel(["lifting"]))
    if m.crosscheck is not None and not m.crosscheck.agrees(tolerance):
        print(f"revolve: the two computations disagree by more than {tolerance:g} (relative); "
              "do not use these figures without finding out why", file=sys.stderr)
        return 1
    return 0


def _run_batch(paths, left_out, task, as_json: bool, csv_path: Optional[str], row: JsonRow, *,
               workers=None, serial_below=None) -> int:
    """Many files: one row per part (plain table, JSON lines, CSV); errors kept in their rows.

    JSON lines are written as the parts come (in input order), so that a long
    run holds only the small rows of the table or the CSV.
    """
    from revolve.cli.rows import json_line, plain_table, progress_bar
    from revolve.jobs import batch

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
        from revolve.cli.tables import csv_text
        from revolve.formats.files import OutputSet
        with OutputSet() as files:
            files.text(csv_path, csv_text(csv_rows, BATCH_CSV_COLUMNS), option="--csv")
    if as_json:
        for other in left_out:
            print(f"revolve: left out {other}: not a profile (no [[loop]] or [[chain]])",
                  file=sys.stderr)
    else:
        heads = ["file", "volume", "surface, swept total", "mass", "cross-check"]
        title = (f"{count} parts" + (f", {len(failed)} refused" if failed else "")
                 if len(failed) < count else f"{count} parts, every one refused")
        text = plain_table(heads, cells, right=(1, 2, 3), title=title)
        tail = [f"left out {other}: not a profile (no [[loop]] or [[chain]])"
                for other in left_out]
        if any_mass:
            tail.append("Caution: " + common.CAUTIONS["lifting"])
        write(text + "\n" + "".join(t + "\n" for t in tail))
    for r in failed:
        print(f"revolve: error: {one_line(r.error)}", file=sys.stderr)
    if disagree:
        print(f"revolve: the two computations disagree by more than {row.tolerance:g} (relative) "
              f"for {', '.join(disagree)}; do not use these figures without finding out why",
              file=sys.stderr)
    if failed:
        return 2
    return 1 if disagree else 0


def _axis_text(ax) -> str:
    d = ax.unit_direction()
    p = ax.point
    if tuple(p) == (0.0, 0.0) and d == (1.0, 0.0):
        return "the sketch x axis"
    if tuple(p) == (0.0, 0.0) and d == (0.0, 1.0):
        return "the sketch y axis"
    return f"the axis through ({common.fmt(p[0])}, {common.fmt(p[1])}) along ({common.fmt(d[0], 6)}, {common.fmt(d[1], 6)})"


def register(app: typer.Typer) -> None:
    @app.command("measure")
    def measure_command(
        profile: List[str] = typer.Argument(..., help="Profile file: .toml (the project's "
                                             "format), a plain list of x,y points (.txt, .csv, "
                                             ".xy), SVG path data (.svg, .svgpath) or a DXF "
                                             "drawing. Several files or folders: one row per "
                                             "part."),
        axis: Optional[str] = typer.Option(None, "--axis",
                                           help="x, y, or X0,Y0,DX,DY: a point on the axis and its "
                                                "direction. Default: the file's axis, else x."),
        angle: Optional[float] = typer.Option(None, "--angle", help="Revolution angle in degrees, "
                                                                     "above 0 and up to 360."),
        material: Optional[str] = typer.Option(None, "--material", help="Material name from the "
                                                                         "material table."),
        density: Optional[str] = typer.Option(None, "--density", help="Density, e.g. '7850 kg/m^3' "
                                                                       "or '0.284 lb/in^3' (a bare "
                                                                       "number is kg/m³)."),
        as_json: bool = typer.Option(False, "--json", help="Print JSON instead of tables; for "
                                     "several files, one JSON object per line per part."),
        exact: bool = typer.Option(False, "--exact", help="Also give closed forms such as 243*pi/5 "
                                                          "when every input is exact (one file "
                                                          "only)."),
        units: Optional[str] = typer.Option(None, "--units", help="Length unit of the coordinates "
                                                                  "for files that do not say "
                                                                  "(plain point lists). Default mm."),
        length_unit: Optional[str] = typer.Option(None, "--length-unit", help="Output length unit."),
        area_unit: Optional[str] = typer.Option(None, "--area-unit", help="Output area unit."),
        volume_unit: Optional[str] = typer.Option(None, "--volume-unit",
                                                  help="Output volume unit, e.g. L, m^3, US_gallon."),
        mass_unit: Optional[str] = typer.Option(None, "--mass-unit", help="Output mass unit (kg, lb)."),
        tolerance: float = typer.Option(DEFAULT_TOLERANCE, "--tolerance",
                                        help="Largest relative difference allowed between the two "
                                             "computations before the exit code is 1."),
        csv_path: Optional[str] = typer.Option(None, "--csv",
                                               help="Also write every figure of both tables to "
                                                    "this CSV file (table, quantity, value, unit); "
                                                    "for several files, one row per part."),
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
        code = run_measure(profile[0] if len(profile) == 1 else profile, axis, angle, material, density, as_json, exact, units,
                           length_unit, area_unit, volume_unit, mass_unit, tolerance,
                           csv_path=csv_path, workers=workers)
        if code:
            raise typer.Exit(code)
