"""``revolve picture``: a picture of the profile, or with ``--3d`` of the revolved solid.

The file name's ending chooses the format (``.png`` or ``.svg``). The
profile picture shows the section, the axis, both centroids, the faces in
colour, the length along the axis and the diameters (Ø) across it, and the key results; the 3-D picture
shows the solid shaded, a partial revolution open (drawn by
:mod:`revolve.render.pictures`). Nothing is written when the input is
refused, and an existing file is replaced only with ``--force``.
"""

from __future__ import annotations

from typing import Any, Optional

import typer

from revolve.cli import options


def run_picture(profile: str, output: str, solid: bool, axis: Any, angle: Optional[float],
                units: Optional[str], material: Optional[str], density: Any, width: int,
                height: int, dpi: int, chord: Any, length_unit: Optional[str],
                area_unit: Optional[str], volume_unit: Optional[str], mass_unit: Optional[str],
                force: bool = False) -> int:
    """Measure and draw one profile, write the picture, say what was written; the exit code."""
    import os

    from revolve.cli import common
    from revolve.errors import RevolveError
    from revolve.jobs import meshing
    from revolve.jobs.measuring import measure_document, parse_axis, part_units
    from revolve.materials import material_or_density

    common.check_output(output, (".png", ".svg"), "pictures", force=force)
    for name, value in (("--width", width), ("--height", height)):
        if not 200 <= value <= 10000:
            raise RevolveError(f"give a size from 200 to 10000 pixels, got {value}", option=name)
    if not 30 <= dpi <= 1200:
        raise RevolveError(f"give 30 to 1200 pixels per inch, got {dpi}", option="--dpi")
    u = part_units("mm", length_unit, area_unit, volume_unit, mass_unit)      # refused early
    if density is not None and not isinstance(density, str):
        density = repr(float(density))
    dens, label, _ = material_or_density(material, density)
    doc = common.load(profile, unit=units)
    part = measure_document(doc, axis=parse_axis(axis) if isinstance(axis, str) else axis,
                            angle=angle, density=dens, density_label=label)
    rev, m = part.revolution, part.measurement
    u = picture_units(doc, length_unit, area_unit, volume_unit, mass_unit)
    title = doc.name or os.path.basename(doc.file or "profile")

    from revolve.render import output as render, pictures

    drawing = dict(units=u, title=title, density_label=part.density_label, width=width,
                   height=height, dpi=dpi)
    if solid:
        tol = None
        if chord is not None:
            from revolve.geometry.checks import prepare

            tol = meshing.chord_tolerance(
                chord, u.unit("length"), doc.profile.unit, prepare(rev.profile, rev.axis).size,
                finest=meshing.FINEST_PICTURE_TOLERANCE,
                why="a picture needs no finer chord tolerance (revolve mesh makes finer meshes)")
        data, mesh = pictures.solid_picture(rev, m, output, tolerance=tol, **drawing)
        from revolve.render.numbers import group_digits

        detail = f"3-D, {group_digits(str(len(mesh.triangles)))} triangles"
    else:
        data = pictures.profile_picture(rev, m, output, **drawing)
        detail = "profile"
    render.write_outputs({output: (data, "--output")}, force=force)
    size_text = f"{width} × {height} px" if output.lower().endswith(".png") else \
        f"{width * 72 / dpi:g} × {height * 72 / dpi:g} pt"
    from revolve.jobs.results import Result

    cautions = ("lifting",) if m.mass is not None else ()
    render.show(Result("picture", u, {"profile": doc.file, "output": output}, (),
                       (f"wrote {output} ({detail}, {size_text})",), cautions))
    return 0


def picture_units(doc, length: Optional[str] = None, area: Optional[str] = None,
                  volume: Optional[str] = None, mass: Optional[str] = None):
    """The units a picture shows: a part's (its drawing's unit), or for a vessel's liquid space
    (``section = "space"``) the vessel trade's (litres, m²), as level tables show; the user's
    options over either.

    >>> from types import SimpleNamespace
    >>> from revolve.geometry.profile import Profile
    >>> tank = SimpleNamespace(profile=Profile(unit="mm"), section="space")
    >>> picture_units(tank).unit("volume"), picture_units(tank, volume="m3").unit("volume")
    ('L', 'm³')
    >>> part = SimpleNamespace(profile=Profile(unit="mm"), section="material")
    >>> picture_units(part).unit("volume")
    'mm³'
    """
    from revolve.jobs.measuring import part_units

    if getattr(doc, "section", "material") != "space":
        return part_units(doc.profile.unit, length, area, volume, mass)
    from revolve.jobs.results import trade_units

    given = {"length": length, "area": area, "volume": volume, "mass": mass}
    return trade_units("vessel", doc.profile.unit,
                       {role: unit for role, unit in given.items() if unit is not None},
                       options={role: f"--{role}-unit" for role in given})


def register(app: typer.Typer) -> None:
    @app.command("picture")
    def picture_command(
        profile: str = typer.Argument(..., help="Profile file (.toml or a plain list of x,y "
                                                "points)."),
        output: str = typer.Option(..., "--output", "-o", help="Picture to write: .png or .svg."),
        solid: bool = typer.Option(False, "--3d", help="Draw the revolved solid in 3-D instead "
                                                       "of the profile."),
        axis: Optional[Any] = options.axis_option(),
        angle: Optional[float] = options.angle_option(),
        units: Optional[str] = options.units_option(),
        material: Optional[str] = options.material_option(),
        density: Optional[Any] = options.density_option(),
        width: int = typer.Option(1200, "--width", help="Width in pixels."),
        height: int = typer.Option(800, "--height", help="Height in pixels."),
        dpi: int = typer.Option(100, "--dpi", help="Pixels per inch: the printed size (SVG in "
                                                   "points); the drawing looks the same."),
        chord: Optional[Any] = options.chord_tolerance_option(),
        length_unit: Optional[str] = options.unit_option("length", "length",
                                                         "Length unit shown."),
        area_unit: Optional[str] = options.unit_option("area", "area", "Area unit shown."),
        volume_unit: Optional[str] = options.unit_option("volume", "volume",
                                                         "Volume unit shown."),
        mass_unit: Optional[str] = options.unit_option("mass", "mass", "Mass unit shown."),
        force: bool = options.force_option(),
    ) -> None:
        """Draw the profile (or with --3d the revolved solid) as a PNG or SVG picture.

        With --3d, --chord-tolerance sets the mesh drawn (at least 1/2000 of the
        part's size; default: chosen for the picture).
        """
        code = run_picture(profile, output, solid, axis, angle, units, material, density, width,
                           height, dpi, chord, length_unit, area_unit, volume_unit, mass_unit,
                           force)
        if code:
            raise typer.Exit(code)
