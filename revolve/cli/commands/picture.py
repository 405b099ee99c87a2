"""``revolve picture``: a picture of the profile, or with ``--3d`` of the revolved solid.

The file name's ending chooses the format (``.png`` or ``.svg``). The
profile picture shows the section, the axis, both centroids, the faces in
colour, the bounding-box dimensions and the key results; the 3-D picture
shows the solid shaded, a partial revolution open. Nothing is written when
the input is refused.
"""

from __future__ import annotations

from typing import Optional

import typer

from revolve.cli import common

#: Finest chord tolerance a picture takes, as a fraction of the part's size: finer detail is
#: far below a pixel, and the mesh (and the time to draw it) would grow without bound.
FINEST_RELATIVE_TOLERANCE = 1 / 2000


def run_picture(profile: str, output: str, solid: bool, axis: Optional[str], angle: Optional[float],
                units: Optional[str], material: Optional[str], density: Optional[str],
                width: int, height: int, dpi: int, tolerance: Optional[str],
                length_unit: Optional[str], area_unit: Optional[str], volume_unit: Optional[str],
                mass_unit: Optional[str]) -> int:
    import os

    from revolve.cli.commands.mesh import chord_tolerance, check_output
    from revolve.errors import RevolveError

    check_output(output, (".png", ".svg"), "pictures")
    for name, value in (("--width", width), ("--height", height)):
        if not 200 <= value <= 10000:
            raise RevolveError(f"give a size from 200 to 10000 pixels, got {value}", option=name)
    if not 30 <= dpi <= 1200:
        raise RevolveError(f"give 30 to 1200 pixels per inch, got {dpi}", option="--dpi")
    doc, rev = common.revolution_from_options(profile, axis, angle, units)
    dens, dens_label = common.resolve_density(material, density, doc)
    u = common.output_units(doc.profile.unit, length_unit, area_unit, volume_unit, mass_unit)

    from revolve.cli import render
    from revolve.geometry.measure import measure

    m = measure(rev, density=None if dens is None else dens * u.si_length ** 3)
    title = doc.name or os.path.basename(doc.file or "profile")
    if solid:
        tol = None
        if tolerance is not None:
            from revolve.geometry.checks import prepare
            size = prepare(rev.profile, rev.axis).size
            tol = chord_tolerance(tolerance, u.length, doc.profile.unit, size,
                                  finest=FINEST_RELATIVE_TOLERANCE,
                                  why="a picture needs no finer chord tolerance (revolve mesh "
                                      "makes finer meshes)")
        mesh = render.solid_picture(rev, m, output, units=u, title=title, density_label=dens_label,
                                    width=width, height=height, dpi=dpi, tolerance=tol)
        detail = f"3-D, {len(mesh.triangles):,} triangles"
    else:
        render.profile_picture(rev, m, output, units=u, title=title, density_label=dens_label,
                               width=width, height=height, dpi=dpi)
        detail = "profile"
    size_text = f"{width} × {height} px" if output.lower().endswith(".png") else \
        f"{width * 72 / dpi:g} × {height * 72 / dpi:g} pt"
    con = common.console()
    con.print(f"wrote {output} ({detail}, {size_text})")
    if m.mass is not None:
        con.print(common.caution_panel(["lifting"]))
    return 0


def register(app: typer.Typer) -> None:
    @app.command("picture")
    def picture_command(
        profile: str = typer.Argument(..., help="Profile file (.toml or a plain list of x,y points)."),
        output: str = typer.Option(..., "--output", "-o", help="Picture to write: .png or .svg."),
        solid: bool = typer.Option(False, "--3d", help="Draw the revolved solid in 3-D instead of "
                                                       "the profile."),
        axis: Optional[str] = typer.Option(None, "--axis", help="x, y, or X0,Y0,DX,DY. Default: "
                                                                "the file's axis, else x."),
        angle: Optional[float] = typer.Option(None, "--angle", help="Revolution angle in degrees, "
                                                                     "above 0 and up to 360."),
        units: Optional[str] = typer.Option(None, "--units", help="Length unit of the coordinates "
                                                                  "for files that do not say."),
        material: Optional[str] = typer.Option(None, "--material", help="Material name, for the "
                                                                         "mass in the caption."),
        density: Optional[str] = typer.Option(None, "--density", help="Density, e.g. '7850 kg/m^3' "
                                                                       "(a bare number is kg/m³), "
                                                                       "for the mass in the caption."),
        width: int = typer.Option(1200, "--width", help="Width in pixels."),
        height: int = typer.Option(800, "--height", help="Height in pixels."),
        dpi: int = typer.Option(100, "--dpi", help="Pixels per inch: the printed size (SVG in points); the "
                                                   "drawing looks the same."),
        tolerance: Optional[str] = typer.Option(None, "--tolerance",
                                                help="With --3d: chord tolerance of the mesh drawn, "
                                                     "at least 1/2000 of the part's size "
                                                     "(default: chosen for the picture)."),
        length_unit: Optional[str] = typer.Option(None, "--length-unit", help="Length unit shown."),
        area_unit: Optional[str] = typer.Option(None, "--area-unit", help="Area unit shown."),
        volume_unit: Optional[str] = typer.Option(None, "--volume-unit", help="Volume unit shown."),
        mass_unit: Optional[str] = typer.Option(None, "--mass-unit", help="Mass unit shown."),
    ) -> None:
        """Draw the profile (or with --3d the revolved solid) as a PNG or SVG picture."""
        code = run_picture(profile, output, solid, axis, angle, units, material, density, width,
                           height, dpi, tolerance, length_unit, area_unit, volume_unit, mass_unit)
        if code:
            raise typer.Exit(code)
