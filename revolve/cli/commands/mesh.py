"""``revolve mesh``: a triangle mesh of the revolved solid as a binary STL file.

The chord tolerance (``--chord-tolerance``, a length) is the largest distance
allowed between the true surface and its triangles; the mesh's volume and
area, measured from its triangles, are printed beside the exact figures so
the user sees what the tolerance costs (:func:`revolve.jobs.meshing.mesh_part`).
The STL and the CSV are written together, or neither; an existing file is
replaced only with ``--force``.
"""

from __future__ import annotations

import os
import sys
from typing import Any, Optional

import typer

from revolve.cli import options


def run_mesh(profile: str, output: str, chord: Any, axis: Any, angle: Optional[float],
             units: Optional[str], length_unit: Optional[str], as_json: bool,
             csv_path: Optional[str], force: bool = False) -> int:
    """Mesh one profile, write the STL (and the CSV), print the figures; the exit code."""
    from revolve.cli import common
    from revolve.jobs.meshing import mesh_part
    from revolve.render import output as render

    common.check_output(output, (".stl",), "meshes", force=force)
    if csv_path is not None:
        common.check_output(csv_path, (".csv",), "tables", option="--csv", force=force)
    doc, rev = common.revolution_from_options(profile, axis, angle, units)
    name = doc.name or os.path.basename(doc.file or "profile")
    job = mesh_part(rev, chord, length_unit=length_unit, name=name, profile_file=doc.file,
                    output=output)
    files = {output: (job.stl, "--output")}
    if csv_path is not None:
        files[csv_path] = (render.csv_text(job.result), "--csv")
    render.write_outputs(files, force=force)
    if as_json:
        sys.stdout.write(render.json_text(job.result) + "\n")
    else:
        render.show(job.result)
    return 0


def register(app: typer.Typer) -> None:
    @app.command("mesh")
    def mesh_command(
        profile: str = typer.Argument(..., help="Profile file (.toml or a plain list of x,y "
                                                "points)."),
        output: str = typer.Option(..., "--output", "-o", help="The STL file to write (.stl)."),
        chord: Optional[Any] = options.chord_tolerance_option(),
        axis: Optional[Any] = options.axis_option(),
        angle: Optional[float] = options.angle_option(),
        units: Optional[str] = options.units_option(),
        length_unit: Optional[str] = options.unit_option(
            "length", "length", "Length unit of the STL coordinates (default: the drawing's)."),
        as_json: bool = options.json_option(),
        csv_path: Optional[str] = options.csv_option(),
        force: bool = options.force_option(),
    ) -> None:
        """Write a triangle mesh of the revolved solid as a binary STL file.

        The chord tolerance defaults to 1/1000 of the profile's size and may be
        no finer than 1e-6 of it (an STL keeps about 7 significant digits); a
        bare number is in the STL's length unit.
        """
        code = run_mesh(profile, output, chord, axis, angle, units, length_unit, as_json,
                        csv_path, force)
        if code:
            raise typer.Exit(code)
