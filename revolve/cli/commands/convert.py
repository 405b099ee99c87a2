"""``revolve convert``: a drawing (SVG path data, SVG, DXF) or a point list into a profile file.

The command reads the drawing and reports what it found (loops, open chains,
gaps closed, entities skipped and why, where the unit and the axis came
from), and writes the project's profile file (TOML). The work is
:func:`revolve.jobs.converting.convert_drawing`: what it writes is checked
exactly as ``revolve measure`` checks what it reads and read back before it
is written, so a file that ``revolve measure`` would refuse is never written.
An existing file is replaced only with ``--force``.

Loops and chains of a drawing that are not joined to its main outline are
warned about and left out unless ``--keep-strays`` is given.
"""

from __future__ import annotations

import os
import sys
from typing import Any, Optional

import typer

from revolve.cli import options
from revolve.errors import RevolveError


def run_convert(drawing: Optional[str], output: str, *, path_data: Optional[str] = None,
                path_id: Optional[str] = None, layer: Optional[str] = None, axis: Any = None,
                axis_layer: Optional[str] = None, gap_tolerance: Optional[float] = None,
                open_chains: bool = False, units: Optional[str] = None,
                name: Optional[str] = None, force: bool = False, as_json: bool = False,
                keep_strays: bool = False) -> int:
    """Convert, write and report; returns the exit code (errors raise RevolveError)."""
    from revolve.cli.common import check_output
    from revolve.jobs.converting import convert_drawing
    from revolve.render import output as render

    check_output(output, (".toml",), "profiles", force=force)
    if drawing is not None and os.path.exists(output) and \
            os.path.abspath(drawing) == os.path.abspath(output):
        raise RevolveError("the output would replace the input", option="--output")
    job = convert_drawing(drawing, output, path_data=path_data, path_id=path_id, layer=layer,
                          axis=axis, axis_layer=axis_layer, gap_tolerance=gap_tolerance,
                          open_chains=open_chains, units=units, name=name,
                          keep_strays=keep_strays)
    render.write_outputs({output: (job.text, "--output")}, force=force)
    if as_json:
        for warning in job.result.extra["report"]["warnings"]:
            print(f"revolve: warning: {warning}", file=sys.stderr)   # seen beside the JSON
        sys.stdout.write(render.json_text(job.result) + "\n")
    else:
        render.show(job.result)
    return 0


def register(app: typer.Typer) -> None:
    @app.command("convert")
    def convert_command(
        drawing: Optional[str] = typer.Argument(None, help="The drawing: .svg, .svgpath (bare "
                                                           "SVG path data), .dxf, or a point "
                                                           "list / profile file."),
        output: str = typer.Option(..., "-o", "--output", help="The profile file to write "
                                                               "(.toml)."),
        path_data: Optional[str] = typer.Option(None, "--path-data",
                                                help="SVG path data given here instead of a "
                                                     "file, e.g. 'M0 10 H40 V20 H0 Z'."),
        path_id: Optional[str] = typer.Option(None, "--path-id",
                                              help="SVG: the id of one path, shape or group "
                                                   "to read. Default: every path and shape "
                                                   "drawn."),
        layer: Optional[str] = typer.Option(None, "--layer", help="DXF: read only this layer."),
        axis: Optional[Any] = options.axis_option(),
        axis_layer: Optional[str] = typer.Option(None, "--axis-layer",
                                                 help="DXF: a layer whose lines are centre "
                                                      "lines."),
        gap_tolerance: Optional[float] = typer.Option(None, "--gap-tolerance",
                                                      help="DXF: ends closer than this are "
                                                           "joined (drawing units; default the "
                                                           "larger of 1e-4 of the drawing's size "
                                                           "and 0.001 in, at most 1e-3 of the "
                                                           "size)."),
        open_chains: bool = typer.Option(False, "--open",
                                         help="DXF: keep ends that meet nothing as open chains "
                                              "(surfaces only)."),
        keep_strays: bool = typer.Option(False, "--keep-strays",
                                         help="Keep loops and chains not joined to the main "
                                              "outline (the largest loop; loops inside it are "
                                              "holes). Default: warn and leave them out."),
        units: Optional[str] = options.units_option(),
        name: Optional[str] = typer.Option(None, "--name", help="Profile name for the file."),
        force: bool = options.force_option(),
        as_json: bool = options.json_option(),
    ) -> None:
        """Convert a drawing into a profile file, reporting what was found."""
        code = run_convert(drawing, output, path_data=path_data, path_id=path_id, layer=layer,
                           axis=axis, axis_layer=axis_layer, gap_tolerance=gap_tolerance,
                           open_chains=open_chains, units=units, name=name, force=force,
                           as_json=as_json, keep_strays=keep_strays)
        if code:
            raise typer.Exit(code)
