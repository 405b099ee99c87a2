"""``revolve convert``: a drawing (SVG path data, SVG, DXF) or a point list into a profile file.

The command reads the drawing, reports what it found (loops, open chains,
gaps closed, entities skipped and why, where the unit and the axis came
from) and writes the project's profile file (TOML) atomically. The file is
read back before it is written, and when an axis is known the profile is
checked against it (one side of the axis, no crossings), so a file that
``revolve measure`` would refuse is never written.
"""

from __future__ import annotations

import os
from typing import Optional

import typer

from revolve.cli import common
from revolve.errors import FormatError, RevolveError

_DRAWING_KINDS = {".svg": "svg", ".svgpath": "path data", ".dxf": "dxf"}


def _reject(option: str, value, applies: str) -> None:
    if value not in (None, False):
        raise RevolveError(f"{option} applies to {applies} only")


def read_drawing(drawing: Optional[str], path_data: Optional[str], *, path_id=None, layer=None,
                 axis=None, axis_layer=None, gap_tolerance=None, open_chains=False, units=None):
    """Read any supported input; returns (ProfileDocument, DrawingReport)."""
    from revolve.formats.drawings import DrawingReport, summarise_paths

    if (drawing is None) == (path_data is None):
        raise RevolveError("give a drawing file or --path-data, not both and not neither")
    if path_data is not None:
        from revolve.formats.svg import path_data_profile

        _reject("--layer", layer, "DXF drawings")
        _reject("--axis-layer", axis_layer, "DXF drawings")
        _reject("--gap-tolerance", gap_tolerance, "DXF drawings")
        _reject("--open", open_chains, "DXF drawings (SVG subpaths say themselves whether "
                                       "they are closed)")
        _reject("--path-id", path_id, "SVG files")
        return path_data_profile(path_data, unit=units)
    extension = os.path.splitext(drawing)[1].lower()
    kind = _DRAWING_KINDS.get(extension)
    if kind != "dxf":
        _reject("--layer", layer, "DXF drawings")
        _reject("--axis-layer", axis_layer, "DXF drawings")
        _reject("--gap-tolerance", gap_tolerance, "DXF drawings")
        _reject("--open", open_chains, "DXF drawings (SVG subpaths say themselves whether "
                                       "they are closed)")
    if kind != "svg":
        _reject("--path-id", path_id, "SVG files")
    if kind == "svg":
        from revolve.formats.svg import read_svg

        return read_svg(drawing, unit=units, path_id=path_id)
    if kind == "path data":
        from revolve.formats.svg import read_path_data_file

        return read_path_data_file(drawing, unit=units)
    if kind == "dxf":
        from revolve.formats.dxf import read_dxf

        return read_dxf(drawing, unit=units, layer=layer, axis=axis, axis_layer=axis_layer,
                        tolerance=gap_tolerance, open_chains=open_chains)
    from revolve.formats import load_profile

    doc = load_profile(drawing, unit=units)
    profile = doc.profile
    paths = profile.paths
    loops, chains = summarise_paths(profile, ["the file"] * len(paths),
                                    ["loop" if p.closed else "chain" for p in paths])
    what = "profile file" if extension == ".toml" else "point list"
    source = "from the file" if extension == ".toml" else ("given" if units else "assumed (mm)")
    return doc, DrawingReport(source=drawing, kind=what, unit=profile.unit, unit_source=source,
                              loops=loops, chains=chains)


def run_convert(drawing: Optional[str], output: str, *, path_data: Optional[str] = None,
                path_id: Optional[str] = None, layer: Optional[str] = None,
                axis: Optional[str] = None, axis_layer: Optional[str] = None,
                gap_tolerance: Optional[float] = None, open_chains: bool = False,
                units: Optional[str] = None, name: Optional[str] = None, force: bool = False,
                as_json: bool = False) -> int:
    """Convert, write and report; returns the exit code (errors raise RevolveError)."""
    from dataclasses import replace

    from revolve.formats import parse_profile_text, profile_text
    from revolve.formats.files import write_text_atomically

    if not output.lower().endswith(".toml"):
        raise RevolveError(f"-o {output}: the profile file is TOML; give a name ending in .toml")
    if os.path.exists(output) and not force:
        raise FormatError("the output file exists already; give --force to replace it",
                          file=output)
    if drawing is not None and os.path.exists(output) and \
            os.path.abspath(drawing) == os.path.abspath(output):
        raise RevolveError("-o: the output would replace the input")
    given_axis = common.parse_axis(axis)
    doc, report = read_drawing(drawing, path_data, path_id=path_id, layer=layer, axis=given_axis,
                               axis_layer=axis_layer, gap_tolerance=gap_tolerance,
                               open_chains=open_chains, units=units)
    final_axis = given_axis or doc.axis
    if given_axis is not None and report.axis is None:
        report = replace(report, axis="given")
    if final_axis is not None:
        from revolve.geometry.checks import prepare

        prepare(doc.profile, final_axis)
    profile = doc.profile
    if name is not None:
        profile = replace(profile, name=name)
    doc = replace(doc, profile=profile, axis=final_axis)
    text = profile_text(doc)
    parse_profile_text(text, file=output)  # what is written must read back
    write_text_atomically(output, text)
    if as_json:
        out = {"output": output, "report": report.as_dict(),
               "axis": None if final_axis is None else
               {"point": list(final_axis.point), "direction": list(final_axis.direction)}}
        common.print_json(out)
        return 0
    _print_report(report, output, final_axis)
    return 0


def _print_report(report, output: str, axis) -> None:
    from rich.table import Table

    con = common.console()
    con.print(report.summary_line())
    if report.loops or report.chains:
        table = Table(show_edge=False, pad_edge=False)
        for column in ("path", "lines", "arcs", "curves", "starts at", "from"):
            table.add_column(column, justify="right" if column in ("lines", "arcs", "curves")
                             else "left")
        for p in report.loops + report.chains:
            table.add_row(f"{p.kind} {p.index}", str(p.lines), str(p.arcs), str(p.curves),
                          f"{common.fmt(p.start[0], 8)}, {common.fmt(p.start[1], 8)}", p.source)
        con.print(table)
    if report.tolerance is not None:
        con.print(f"gap tolerance: {report.tolerance:.3g} {report.unit}")
    for gap in report.gaps_closed:
        con.print(f"gap closed: {gap.describe()}")
    for item in report.skipped:
        con.print(f"skipped: {item.what}: {item.reason}")
    if axis is not None:
        con.print(f"axis: through ({common.fmt(axis.point[0])}, {common.fmt(axis.point[1])}) "
                  f"along ({common.fmt(axis.direction[0])}, {common.fmt(axis.direction[1])})"
                  + (f", {report.axis}" if report.axis else ""))
    else:
        con.print("axis: none in the file; give one to revolve measure with --axis")
    for note in report.notes:
        con.print(f"note: {note}")
    con.print(f"wrote {output}")


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
                                              help="SVG: the id of the <path> to read (needed "
                                                   "when the file has several)."),
        layer: Optional[str] = typer.Option(None, "--layer", help="DXF: read only this layer."),
        axis: Optional[str] = typer.Option(None, "--axis",
                                           help="x, y, or X0,Y0,DX,DY; written to the file. "
                                                "Default: a DXF centre line, if any."),
        axis_layer: Optional[str] = typer.Option(None, "--axis-layer",
                                                 help="DXF: a layer whose lines are centre "
                                                      "lines."),
        gap_tolerance: Optional[float] = typer.Option(None, "--gap-tolerance",
                                                      help="DXF: ends closer than this are "
                                                           "joined (drawing units; default 1e-6 "
                                                           "of the drawing's size)."),
        open_chains: bool = typer.Option(False, "--open",
                                         help="DXF: keep ends that meet nothing as open chains "
                                              "(surfaces only)."),
        units: Optional[str] = typer.Option(None, "--units",
                                            help="Length unit of the coordinates when the "
                                                 "drawing does not say. Default mm."),
        name: Optional[str] = typer.Option(None, "--name", help="Profile name for the file."),
        force: bool = typer.Option(False, "--force", help="Replace the output file if it "
                                                          "exists."),
        as_json: bool = typer.Option(False, "--json", help="Print the report as JSON."),
    ) -> None:
        """Convert a drawing into a profile file, reporting what was found."""
        code = run_convert(drawing, output, path_data=path_data, path_id=path_id, layer=layer,
                           axis=axis, axis_layer=axis_layer, gap_tolerance=gap_tolerance,
                           open_chains=open_chains, units=units, name=name, force=force,
                           as_json=as_json)
        if code:
            raise typer.Exit(code)
