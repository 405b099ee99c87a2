"""``revolve measure``: section, volume, surface by face, mass, and the cross-check."""

from __future__ import annotations

from typing import Optional

import typer

from revolve.cli import common
from revolve.errors import RevolveError

DEFAULT_TOLERANCE = 1e-9


def shown_faces(m):
    """Surface by face, leaving out the unnamed group when it sweeps nothing (segments on the axis)."""
    from revolve.geometry.profile import UNNAMED_FACE

    return {k: v for k, v in m.surface_by_face.items()
            if not (k == UNNAMED_FACE and v == 0.0 and len(m.surface_by_face) > 1)}


def measurement_dict(m, u: "common.OutputUnits", *, density_label=None, tolerance=DEFAULT_TOLERANCE):
    """The JSON form of a measurement, in the output units (see README, "JSON keys")."""
    L, A, V, M = u.length_factor, u.area_factor, u.volume_factor, u.mass_factor
    sec = m.section
    out = {
        "units": {"length": u.length, "area": u.area, "volume": u.volume, "mass": u.mass,
                  "inertia": u.inertia_unit()},
        "angle_degrees": float(m.revolution.angle_degrees),
        "axis": {"point": [float(v) * L for v in m.revolution.axis.point],
                 "direction": list(m.revolution.axis.unit_direction())},
        "area": m.area * A,
        "centroid": [m.centroid[0] * L, m.centroid[1] * L] if m.has_solid else None,
        "centroid_distance": m.centroid_distance * L if m.has_solid else None,
        "perimeter": m.perimeter * L,
        "boundary_length": m.boundary_length * L,
        "boundary_centroid": [m.boundary_centroid[0] * L, m.boundary_centroid[1] * L],
        "boundary_centroid_distance": m.boundary_centroid_distance * L,
        "volume": m.volume * V,
        "surface_area": m.surface_total * A,
        "surface_by_face": {k: v * A for k, v in shown_faces(m).items()},
        "cut_face_area": None if m.cut_face_area is None else m.cut_face_area * A,
        "centre_of_mass_axial": None if m.centre_of_mass_axial is None else m.centre_of_mass_axial * L,
        "centre_of_mass_offset": None if m.centre_of_mass_offset is None else m.centre_of_mass_offset * L,
        "error_estimate": {"volume": m.volume_error * V, "surface_area": m.surface_error * A},
        "methods": sorted(set(sec.methods)),
    }
    if m.mass is not None:
        out["density_kg_m3"] = m.density / u.si_length ** 3
        out["density"] = density_label
        out["mass"] = m.mass * M
        # inertia: kg·(profile unit)² -> mass unit·(length unit)²
        out["inertia_axis"] = m.inertia_axis * M * L * L
        out["radius_of_gyration"] = m.radius_of_gyration * L
    if m.crosscheck is not None:
        c = m.crosscheck
        out["crosscheck"] = {
            "method": {"volume": "washers: slices perpendicular to the axis, Gauss–Legendre",
                       "surface_area": "quadrature of r ds along each segment"},
            "volume": c.volume * V, "surface_area": c.surface_area * A,
            "volume_difference": c.volume_difference, "surface_difference": c.surface_difference,
            "tolerance": tolerance, "agrees": c.agrees(tolerance),
        }
    return out


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


def run_measure(profile: str, axis: Optional[str], angle: Optional[float], material: Optional[str],
                density: Optional[str], as_json: bool, exact: bool, units: Optional[str],
                length_unit: Optional[str], area_unit: Optional[str], volume_unit: Optional[str],
                mass_unit: Optional[str], tolerance: float, csv_path: Optional[str] = None) -> int:
    from revolve.geometry.measure import measure
    if csv_path is not None:
        from revolve.cli.commands.mesh import check_output
        check_output(csv_path, (".csv",), "tables", option="--csv")
    if not 0 < tolerance:
        raise RevolveError(f"must be a positive number, got {tolerance:g}", option="--tolerance")

    doc, rev = common.revolution_from_options(profile, axis, angle, units, exact=exact)
    ax, ang = rev.axis, rev.angle_degrees
    dens, dens_label = common.resolve_density(material, density, doc)
    u = common.output_units(doc.profile.unit, length_unit, area_unit, volume_unit, mass_unit)
    # Density is kg/m³; the engine works in the profile's unit: kg per (unit)³.
    try:
        m = measure(rev, density=None if dens is None else dens * u.si_length ** 3)
    except RevolveError as e:
        raise e.located(file=doc.file)
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
        out = measurement_dict(m, u, density_label=dens_label, tolerance=tolerance)
        out["profile"] = {"file": doc.file, "name": doc.name, "unit": doc.profile.unit}
        if exact_out is not None:
            out["exact"] = exact_out
        cautions = ["lifting"] if m.mass is not None else []
        out["cautions"] = [common.CAUTIONS[k] for k in cautions]
        common.print_json(out)
    else:
        con = common.console()
        name = doc.name or doc.file
        axis_text = _axis_text(ax)
        title = (f"{name}\nrevolved {float(ang):g}° about {axis_text}; "
                 f"profile in {doc.profile.unit}")
        con.print(_table(m, u, title, dens_label, tolerance, exact_out))
        con.print()
        con.print(_check_table(m, u, tolerance))
        if exact and exact_out is not None and exact_out.get("note"):
            con.print(f"exact: {exact_out['note']}")
        for note in m.notes:
            con.print(f"note: {note}")
        if m.mass is not None:
            con.print(f"material: {dens_label}")
            con.print(common.caution_panel(["lifting"]))
    if m.crosscheck is not None and not m.crosscheck.agrees(tolerance):
        import sys
        print(f"revolve: the two computations disagree by more than {tolerance:g} (relative); "
              "do not use these figures without finding out why", file=sys.stderr)
        return 1
    return 0


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
        profile: str = typer.Argument(..., help="Profile file: .toml (the project's format), a "
                                                "plain list of x,y points (.txt, .csv, .xy), SVG "
                                                "path data (.svg, .svgpath) or a DXF drawing."),
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
        as_json: bool = typer.Option(False, "--json", help="Print JSON instead of tables."),
        exact: bool = typer.Option(False, "--exact", help="Also give closed forms such as 243*pi/5 "
                                                          "when every input is exact."),
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
                                                    "this CSV file (table, quantity, value, unit)."),
    ) -> None:
        """Measure a revolved profile: section, volume, surface by face, mass, cross-check."""
        code = run_measure(profile, axis, angle, material, density, as_json, exact, units,
                           length_unit, area_unit, volume_unit, mass_unit, tolerance,
                           csv_path=csv_path)
        if code:
            raise typer.Exit(code)
