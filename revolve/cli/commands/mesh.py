"""``revolve mesh``: a triangle mesh of the revolved solid as a binary STL file.

The chord tolerance (``--tolerance``) is the largest distance allowed between
the true surface and its triangles; the mesh's volume and area, measured
from its triangles, are printed beside the exact figures so the user sees
what the tolerance costs. Nothing is written when the input is refused.
"""

from __future__ import annotations

import os
from typing import Optional

import typer

from revolve.cli import common
from revolve.errors import FormatError, RevolveError, quoted

#: Default chord tolerance as a fraction of the profile's size (its bounding-box diagonal).
DEFAULT_RELATIVE_TOLERANCE = 1e-3
#: Finest chord tolerance, as a fraction of the size: an STL file's 32-bit floats keep about
#: 7 significant digits (a relative step of 1.2e-7), so a finer promise could not be kept.
FINEST_RELATIVE_TOLERANCE = 1e-6


def chord_tolerance(text: Optional[str], unit: str, profile_unit: str, size: float,
                    finest: Optional[float] = None,
                    why: str = "an STL file keeps about 7 significant digits") -> float:
    """The chord tolerance in the profile's unit, from ``--tolerance`` (a bare number is in ``unit``).

    A tolerance below ``finest`` times the part's size (default
    :data:`FINEST_RELATIVE_TOLERANCE`) is refused, saying ``why``.

    >>> chord_tolerance("0.5", "mm", "cm", 10.0)
    0.05
    >>> chord_tolerance(None, "mm", "mm", 200.0)
    0.2
    >>> chord_tolerance("-1", "mm", "mm", 1.0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --tolerance: the chord tolerance must be a positive length, got '-1'
    >>> chord_tolerance("1e-300", "mm", "mm", 100.0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --tolerance: an STL file keeps about 7 significant digits: give at least 0.0001 mm (1e-06 of the part's size)
    """
    import math

    from revolve import units as unit_table
    from revolve.errors import UnitError

    if text is None:
        return DEFAULT_RELATIVE_TOLERANCE * size
    try:
        si = unit_table.parse_quantity(text, "length", default_unit=unit)
    except UnitError as e:
        raise common.fail_unit("--tolerance", e)
    value = si / unit_table.factor(profile_unit, "length")
    if not (math.isfinite(value) and value > 0):
        raise RevolveError(f"the chord tolerance must be a positive length, got {quoted(text)}",
                           option="--tolerance")
    relative = FINEST_RELATIVE_TOLERANCE if finest is None else finest
    if value < relative * size:
        shown = relative * size * unit_table.factor(profile_unit, "length") \
            / unit_table.factor(unit, "length")
        raise RevolveError(f"{why}: give at least {shown:.3g} {unit} ({relative:g} of the "
                           f"part's size)", option="--tolerance")
    return value


def check_output(path: str, endings: tuple, what: str, option: Optional[str] = "--output") -> None:
    """Refuse, before any work, an output name with the wrong ending or that cannot be written.

    >>> check_output("part.obj", (".stl",), "meshes")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --output: part.obj: meshes are written as .stl files, not ".obj"
    >>> check_output("no/such/folder/t.csv", (".csv",), "tables", option="--csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --csv: no/such/folder/t.csv: the folder for this file does not exist
    """
    from revolve.formats.files import check_target

    ext = os.path.splitext(path)[1].lower()
    if ext not in endings:
        given = f'"{ext}"' if ext else "a name without an ending"
        raise FormatError(f'{what} are written as {" or ".join(endings)} files, not {given}',
                          file=path, option=option)
    folder = os.path.dirname(os.path.abspath(path))
    if not os.path.isdir(folder):
        raise FormatError("the folder for this file does not exist", file=path, option=option)
    if os.path.isdir(path):
        raise FormatError("this is a folder; give a file name", file=path, option=option)
    check_target(path, option)


def json_key(quantity: str) -> str:
    """A JSON key from a row's quantity name.

    >>> json_key("area, relative difference")
    'area_relative_difference'
    """
    import re

    return re.sub(r"[^0-9a-z]+", "_", quantity.lower()).strip("_")


def run_mesh(profile: str, output: str, tolerance: Optional[str], axis: Optional[str],
             angle: Optional[float], units: Optional[str], length_unit: Optional[str],
             as_json: bool, csv_path: Optional[str]) -> int:
    from revolve.cli.tables import csv_text, mesh_rows
    from revolve.formats.files import OutputSet
    from revolve.formats.stl import stl_bytes
    from revolve.geometry.checks import prepare
    from revolve.geometry.measure import measure
    from revolve.geometry.mesh import revolve_mesh

    check_output(output, (".stl",), "meshes")
    if csv_path is not None:
        check_output(csv_path, (".csv",), "tables", option="--csv")
    doc, rev = common.revolution_from_options(profile, axis, angle, units)
    u = common.output_units(doc.profile.unit, length_unit)
    size = prepare(rev.profile, rev.axis).size
    tol = chord_tolerance(tolerance, u.length, doc.profile.unit, size)
    mesh = revolve_mesh(rev, tol)
    exact = measure(rev, crosscheck=False)
    rows = mesh_rows(mesh, exact, u, file=output)
    name = (doc.name or os.path.basename(doc.file or "profile"))
    header = f"revolve mesh, unit {u.length}, {name}"
    # Both files are written together, or neither is (see revolve.formats.files.OutputSet).
    with OutputSet() as out:
        out.binary(output, stl_bytes(mesh.vertices, mesh.triangles, header=header,
                                     scale=u.length_factor, file=output), option="--output")
        if csv_path is not None:
            out.text(csv_path, csv_text(rows), option="--csv")
    if as_json:
        out = {json_key(r["quantity"]): r["value"] for r in rows}
        out["units"] = {"length": u.length, "area": u.area, "volume": u.volume}
        out["closed"] = bool(mesh.closed)
        out["profile"] = {"file": doc.file, "name": doc.name, "unit": doc.profile.unit}
        common.print_json(out)
    else:
        from rich.table import Table

        t = Table(show_edge=False, pad_edge=False)
        t.add_column("quantity")
        t.add_column("value", justify="right")
        t.add_column("unit")
        for r in rows:
            if r["quantity"] == "file":
                continue
            v = r["value"]
            text = f"{v:,}" if isinstance(v, int) else (f"{v:.2e}" if "difference" in r["quantity"]
                                                         else common.fmt(v, 8))
            t.add_row(r["quantity"], text, r["unit"])
        con = common.console()
        con.print(f"{name}: mesh written to {output}")
        con.print(t)
        if not mesh.closed:
            con.print("note: the profile has open chains, so the mesh is an open surface "
                      "(no volume; not for printing as a solid)")
    return 0


def register(app: typer.Typer) -> None:
    @app.command("mesh")
    def mesh_command(
        profile: str = typer.Argument(..., help="Profile file (.toml or a plain list of x,y points)."),
        output: str = typer.Option(..., "--output", "-o", help="The STL file to write (.stl)."),
        tolerance: Optional[str] = typer.Option(
            None, "--tolerance",
            help="Chord tolerance: the largest distance between the true surface and its "
                 "triangles, e.g. 0.01 or '0.001 in' (a bare number is in the STL's length unit), "
                 "at least 1e-6 of the profile's size. Default: 1/1000 of the profile's size."),
        axis: Optional[str] = typer.Option(None, "--axis", help="x, y, or X0,Y0,DX,DY. Default: "
                                                                "the file's axis, else x."),
        angle: Optional[float] = typer.Option(None, "--angle", help="Revolution angle in degrees, "
                                                                     "above 0 and up to 360."),
        units: Optional[str] = typer.Option(None, "--units", help="Length unit of the coordinates "
                                                                  "for files that do not say."),
        length_unit: Optional[str] = typer.Option(None, "--length-unit",
                                                  help="Length unit of the STL coordinates "
                                                       "(default: the profile's)."),
        as_json: bool = typer.Option(False, "--json", help="Print JSON instead of a table."),
        csv_path: Optional[str] = typer.Option(None, "--csv", help="Also write the figures to this "
                                                                   "CSV file."),
    ) -> None:
        """Write a triangle mesh of the revolved solid as a binary STL file."""
        code = run_mesh(profile, output, tolerance, axis, angle, units, length_unit, as_json, csv_path)
        if code:
            raise typer.Exit(code)
