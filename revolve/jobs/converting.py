"""Converting a drawing (SVG path data, SVG, DXF) or a point list into a profile file.

:func:`convert_drawing` reads the drawing, checks what it would write exactly
as ``revolve measure`` checks what it reads (:func:`check_as_measure_would`:
the material or density through the same lookup, the angle, and the profile
against the axis -- or, with no axis known yet, for crossings alone), reads
the text back, and returns it with a :class:`~revolve.jobs.results.Result`
reporting what was found (paths, gaps closed, entities skipped and why,
where the unit and the axis came from). It writes nothing: the command
writes the file under the one overwrite rule.

Examples
--------
>>> job = convert_drawing(None, "ring.toml", path_data="M0,10 H40 V20 H0 Z", axis="x")
>>> job.text.splitlines()[0].startswith("#"), job.result.to_dict()["paths"][0]["lines"]
(True, 4)
>>> convert_drawing(None, "ring.toml")
Traceback (most recent call last):
...
revolve.errors.RevolveError: give a drawing file or --path-data, not both and not neither
"""

from __future__ import annotations

import os
from dataclasses import dataclass
from typing import Any, Optional

from revolve.errors import RevolveError

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
    from revolve.jobs.measuring import load_with_unit

    doc = load_with_unit(drawing, units)
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

    The material or density goes through :func:`revolve.materials.file_density`
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
    from revolve.materials import file_density
    from revolve.geometry.profile import Revolution

    file_density(doc)
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




@dataclass(frozen=True)
class ConvertJob:
    """A converted drawing: the profile file's text and the report as a result."""

    text: str
    result: Any


def convert_drawing(drawing: Optional[str], output: str, *, path_data: Optional[str] = None,
                    path_id: Optional[str] = None, layer: Optional[str] = None, axis: Any = None,
                    axis_layer: Optional[str] = None, gap_tolerance: Optional[float] = None,
                    open_chains: bool = False, units: Optional[str] = None,
                    name: Optional[str] = None, keep_strays: bool = False) -> ConvertJob:
    """Read, check and write to text a drawing; ``output`` names the file it will be read as."""
    from dataclasses import replace

    from revolve import units as registry
    from revolve.formats import parse_profile_text, profile_text
    from revolve.jobs.measuring import parse_axis, part_units
    from revolve.materials import file_density
    from revolve.jobs.results import Field, Result, Table

    given_axis = parse_axis(axis) if isinstance(axis, str) else axis
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
    file_density(written)
    si = registry.factor(report.unit, "length")
    counts = ["lines", "arcs", "curves"]
    found = report.loops + report.chains
    if any(p.polylines for p in found):
        counts.append("polylines")
    fields = ((Field("path", "path", style="text"),)
              + tuple(Field(c, c, style="count") for c in counts)
              + (Field("start", "starts at", "length"), Field("source", "from", style="text")))
    rows = tuple({"path": f"{p.kind} {p.index}", **{c: getattr(p, c) for c in counts},
                  "start": [p.start[0] * si, p.start[1] * si], "source": p.source}
                 for p in found)
    notes = []
    if report.tolerance is not None:
        notes.append(f"gap tolerance: {report.tolerance:.3g} {report.unit}")
    notes += [f"gap closed: {gap.describe()}" for gap in report.gaps_closed]
    notes += [f"skipped: {item.what}: {item.reason}" for item in report.skipped]
    if final_axis is not None:
        from revolve.jobs.measuring import axis_text

        notes.append(f"axis: {axis_text(final_axis)}" + (f", {report.axis}" if report.axis else ""))
    else:
        notes.append("axis: none in the file; give one to revolve measure with --axis")
    notes += [f"note: {note}" for note in report.notes]
    notes += [f"warning: {warning}" for warning in report.warnings]
    notes.append(f"wrote {output}")
    extra = {"output": output, "report": report.as_dict(),
             "axis": None if final_axis is None else
             {"point": list(final_axis.point), "direction": list(final_axis.direction)}}
    result = Result("convert", part_units(report.unit),
                    {"drawing": drawing, "path_data": path_data, "output": output},
                    (Table("paths", report.summary_line(), fields, rows),), tuple(notes), extra=extra)
    return ConvertJob(text, result)
