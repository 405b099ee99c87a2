"""``revolve convert``: a drawing (SVG path data, SVG, DXF) or a point list into a profile file.

The command reads the drawing, reports what it found (loops, open chains,
gaps closed, entities skipped and why, where the unit and the axis came
from) and writes the project's profile file (TOML) atomically. What it
writes is checked exactly as ``revolve measure`` checks what it reads
(:func:`check_as_measure_would`): the material or density through the same
lookup, the angle, and the profile against the axis (one side of it, no
crossings) -- or, with no axis known yet, for crossings alone -- and the file
is read back before it is written, so a file that ``revolve measure`` would
refuse is never written.

Loops and chains of a drawing that are not joined to its main outline are
warned about and left out unless ``--keep-strays`` is given.
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
                 axis=None, axis_layer=None, gap_tolerance=None, open_chains=False, units=None,
                 keep_strays=False):
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
        return path_data_profile(path_data, unit=units, keep_strays=keep_strays)
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

        return read_svg(drawing, unit=units, path_id=path_id, keep_strays=keep_strays)
    if kind == "path data":
        from revolve.formats.svg import read_path_data_file

        return read_path_data_file(drawing, unit=units, keep_strays=keep_strays)
    if kind == "dxf":
        from revolve.formats.dxf import read_dxf

        return read_dxf(drawing, unit=units, layer=layer, axis=axis, axis_layer=axis_layer,
                        tolerance=gap_tolerance, open_chains=open_chains,
                        keep_strays=keep_strays)
    _reject("--keep-strays", keep_strays, "drawings (SVG, DXF)")
    doc = common.load(drawing, unit=units)
    profile = doc.profile
    paths = profile.paths
    loops, chains = summarise_paths(profile, ["the file"] * len(paths),
                                    ["loop" if p.closed else "chain" for p in paths])
    what = "profile file" if extension == ".toml" else "point list"
    source = "from the file" if extension == ".toml" else ("given" if units else "assumed (mm)")
    return doc, DrawingReport(source=drawing, kind=what, unit=profile.unit, unit_source=source,
                              loops=loops, chains=chains)


def check_as_measure_would(doc, axis) -> None:
    """Check a document as ``revolve measure`` checks what it reads, without measuring.

    The material or density goes through :func:`revolve.cli.common.resolve_density`
    (the lookup ``measure`` uses); the angle and the axis build a
    :class:`~revolve.geometry.profile.Revolution` and the profile is prepared
    against the axis (:func:`revolve.geometry.checks.prepare`: closure, one
    side of the axis, no crossings). With no axis known yet, the profile is
    checked for crossings alone (the same test, which needs no axis).

    Raises
    ------
    RevolveError
        Naming the input file and line (or the option).
    """
    from revolve.formats.drawings import check_no_crossings
    from revolve.geometry.checks import prepare
    from revolve.geometry.profile import Revolution

    common.resolve_density(None, None, doc)
    if axis is None:
        check_no_crossings(doc.profile, file=doc.file)
        return
    angle = doc.angle_degrees if doc.angle_degrees is not None else 360.0
    try:
        Revolution(doc.profile, axis, angle)
    except RevolveError as exc:
        raise exc.located(file=doc.file, line=doc.line_of("angle"), place="angle") from None
    try:
        prepare(doc.profile, axis)
    except RevolveError as exc:
        raise exc.located(file=doc.file) from None


def run_convert(drawing: Optional[str], output: str, *, path_data: Optional[str] = None,
                path_id: Optional[str] = None, layer: Optional[str] = None,
                axis: Optional[str] = None, axis_layer: Optional[str] = None,
                gap_tolerance: Optional[float] = None, open_chains: bool = False,
                units: Optional[str] = None, name: Optional[str] = None, force: bool = False,
                as_json: bool = False, keep_strays: bool = False) -> int:
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
                               open_chains=open_chains, units=units, keep_strays=keep_strays)
    final_axis = given_axis or doc.axis
    if given_axis is not None and report.axis is None:
        report = replace(report, axis="given")
    check_as_measure_would(doc, final_axis)
    profile = doc.profile
    if name is not None:
        profile = replace(profile, name=name)
    doc = replace(doc, profile=profile, axis=final_axis)
    text = profile_text(doc)
    written = parse_profile_text(text, file=output)  # what is written must read back
    common.resolve_density(None, None, written)
    write_text_atomically(output, text, option="--output")
    if as_json:
        _warn(report)
        out = {"output": output, "report": report.as_dict(),
               "axis": None if final_axis is None else
               {"point": list(final_axis.point), "direction": list(final_axis.direction)}}
        common.print_json(out)
        return 0
    _print_report(report, output, final_axis)
    return 0


def _warn(report) -> None:
    """With --json, each warning also as one line on standard error, where it is seen."""
    import sys

    for warning in report.warnings:
        print(f"revolve: warning: {warning}", file=sys.stderr)


def _print_report(report, output: str, axis) -> None:
    from rich.table import Table

    con = common.console()
    con.print(report.summary_line())
    if report.loops or report.chains:
        table = Table(show_edge=False, pad_edge=False)
        counts = ["lines", "arcs", "curves"]
        if any(p.polylines for p in report.loops + report.chains):
            counts.append("polylines")
        for column in ["path"] + counts + ["starts at", "from"]:
            table.add_column(column, justify="right" if column in counts else "left")
        for p in report.loops + report.chains:
            table.add_row(f"{p.kind} {p.index}", *(str(getattr(p, c)) for c in counts),
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
    for warning in report.warnings:
        con.print(f"warning: {warning}")
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
                                              help="SVG: the id of one path, shape or group "
                                                   "to read. Default: every path and shape "
                                                   "drawn."),
        layer: Optional[str] = typer.Option(None, "--layer", help="DXF: read only this layer."),
        axis: Optional[str] = typer.Option(None, "--axis",
                                           help="x, y, or X0,Y0,DX,DY; written to the file. "
                                                "Default: a DXF centre line, if any."),
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
                           as_json=as_json, keep_strays=keep_strays)
        if code:
            raise typer.Exit(code)
