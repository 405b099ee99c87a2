"""``revolve vessel``: build a vessel from its diameter, shell length and heads; summarise it.

The work is :func:`revolve.jobs.vessel.build_vessel` (also ``revolve.build_vessel``);
this module declares the options, writes the files and shows the result.

Heads (``--head`` for both ends, ``--head-1`` / ``--head-2`` for one; head 1
is at the start of the axis, the bottom of a vertical vessel): ``flat``,
``hemispherical``, ``ellipsoidal`` (2:1), ``torispherical`` (crown = D,
knuckle = 6 % D), ``torispherical-10`` (DIN 28011 proportions),
``torispherical-80`` (DIN 28013 proportions), ``conical:angle=A``; settings
after a colon, e.g. ``torispherical:crown=1100,knuckle=8%``.

``--output`` writes the **liquid space** (for ``revolve measure`` and
``revolve levels``), ``--wall-output`` the metal section with its material;
both files or neither, and an existing file only with ``--force``.

JSON: one object — ``command``, ``inputs``, ``units``, ``description``,
``metal``, ``liquid``, ``files``, ``crosscheck``, ``vessel`` (the figures:
diameters, lengths, capacity, surfaces, metal, masses, centres of mass from
the tangent line of head 1), ``heads`` (a list), ``notes``, ``cautions``.
"""

from __future__ import annotations

from typing import Any, Optional

import typer

from revolve.cli import options

#: The command line's names of the job's settings (the job's errors name these).
NAMES = {"diameter": "--diameter", "length": "--length", "head": "--head",
         "head_1": "--head-1", "head_2": "--head-2", "units": "--units",
         "dimensions": "--dimensions", "thickness": "--thickness", "material": "--material",
         "density": "--density", "liquid": "--liquid", "liquid_density": "--liquid-density",
         "orientation": "--orientation", "length_unit": "--length-unit",
         "volume_unit": "--volume-unit", "area_unit": "--area-unit", "mass_unit": "--mass-unit",
         "tolerance": "--tolerance", "name": "--name"}


def run_vessel(*, output: Optional[str], wall_output: Optional[str], force: bool,
               as_json: bool, report: Optional[str] = None, **settings: Any) -> int:
    """Build, write (profiles, ``--report``) and show; the exit code (1: the two computations
    disagree)."""
    import sys
    from dataclasses import replace

    from revolve.errors import RevolveError
    from revolve.jobs.vessel import build_vessel
    from revolve.render import output as render

    if wall_output and settings.get("thickness") is None:
        raise RevolveError("a wall profile needs a wall thickness; give --thickness",
                           option="--wall-output")
    if output and wall_output and output == wall_output:
        raise RevolveError("the liquid space and the wall need two different files",
                           option="--wall-output")
    if output or wall_output:         # the files module only when there are files to write
        from revolve.formats.files import check_target

        for path, option in ((output, "--output"), (wall_output, "--wall-output")):
            if path:
                check_target(path, option=option, replace=force)
    options.check_report(report, force)
    result = build_vessel(names=NAMES, **settings)
    files = {}
    if output:
        files[output] = (result.profile_text(), "--output")
    if wall_output:
        files[wall_output] = (result.wall_text(), "--wall-output")
    written = {"liquid_space": output, "wall": wall_output}
    files.update(options.report_files(report, replace(result, extra={**result.extra,
                                                                       "files": written})))
    if files:
        render.write_outputs(files, force=force)    # every file together, or none
    notes = result.notes
    if output:
        notes += (f"wrote {output}: the liquid space", f"  revolve measure {output}",
                  f"  revolve levels {output}")
    if wall_output:
        notes += (f"wrote {wall_output}: the wall (metal section)",)
    result = replace(result, extra={**result.extra, "files": written})
    if as_json:
        print(render.json_text(result))
    else:
        render.show(replace(result, notes=notes))
    check = result.extra["crosscheck"]
    if not check["agrees"]:
        print(f"revolve: the two computations disagree by {check['largest_difference']:.1e} "
              f"(more than {check['tolerance']:g}); do not use these figures without finding "
              "out why", file=sys.stderr)
        return 1
    return 0


def register(app: typer.Typer) -> None:
    @app.command("vessel")
    def vessel_command(
        diameter: Any = typer.Option(..., "--diameter", click_type=options.LENGTH,
                                     metavar="LENGTH", help="Shell diameter, e.g. 1200 (in "
                                                            "--units) or '1.2 m' or '48 in'."),
        length: Any = typer.Option(..., "--length", click_type=options.LENGTH, metavar="LENGTH",
                                   help="Straight shell, tangent line to tangent line (0 for two "
                                        "heads only)."),
        head: Optional[str] = typer.Option(None, "--head", help="Both heads: flat, "
                                                                "hemispherical, ellipsoidal, "
                                                                "torispherical, torispherical-10, "
                                                                "torispherical-80, "
                                                                "conical:angle=A."),
        head_1: Optional[str] = typer.Option(None, "--head-1", help="Head at the start of the "
                                                                    "axis (bottom)."),
        head_2: Optional[str] = typer.Option(None, "--head-2", help="Head at the end of the "
                                                                    "axis (top)."),
        units: str = typer.Option("mm", "--units", help="Length unit of bare numbers and of "
                                                        "the profile files."),
        dimensions: str = typer.Option("inside", "--dimensions", help="inside or outside: the "
                                                                      "surface the diameter and "
                                                                      "head radii describe."),
        thickness: Optional[Any] = typer.Option(None, "--thickness", click_type=options.LENGTH,
                                                metavar="LENGTH", help="Wall thickness (shell "
                                                                       "and heads), e.g. '1/4 in'."),
        material: Optional[str] = typer.Option(None, "--material", help="Metal, from the "
                                                                        "material table."),
        density: Optional[str] = typer.Option(None, "--density", help="Metal density, e.g. "
                                                                      "'7850 kg/m^3' (a bare "
                                                                      "number is kg/m³)."),
        liquid: Optional[str] = typer.Option(None, "--liquid", help="Liquid from the material "
                                                                    "table, e.g. water."),
        liquid_density: Optional[str] = typer.Option(None, "--liquid-density",
                                                     help="Liquid density, e.g. '850 kg/m^3' "
                                                          "(a bare number is kg/m³)."),
        orientation: str = typer.Option("vertical", "--orientation",
                                        help="How the profile file draws it: vertical (axis "
                                             "along y, up) or horizontal (axis along x)."),
        output: Optional[str] = options.output_option("Write the liquid space profile to this "
                                                      "file."),
        wall_output: Optional[str] = typer.Option(None, "--wall-output",
                                                  help="Write the wall (metal section) profile "
                                                       "to this file."),
        force: bool = options.force_option(),
        report: Optional[str] = options.report_option(),
        length_unit: Optional[str] = options.unit_option("length", "length", "Output length "
                                                         "unit. Default: --units."),
        volume_unit: Optional[str] = options.unit_option(
            "volume", "volume", "Output volume unit. Default: L (US gal for in/ft)."),
        area_unit: Optional[str] = options.unit_option(
            "area", "area", "Output area unit. Default: m² (ft² for in/ft)."),
        mass_unit: Optional[str] = options.unit_option(
            "mass", "mass", "Output mass unit. Default: kg (lb for in/ft)."),
        name: Optional[str] = typer.Option(None, "--name", help="Name written in the profile "
                                                                "file (default: a description)."),
        as_json: bool = options.json_option(),
        tolerance: float = options.tolerance_option(1e-9),
    ) -> None:
        """Build a vessel from diameter, shell length and heads; write its profile; summarise.

        Heads: KIND or KIND:key=value,... with lengths in --units or % of the
        diameter: flat, hemispherical, ellipsoidal (2:1), torispherical (crown D,
        knuckle 6 % D; crown= and knuckle= to change them), torispherical-10
        (crown D, knuckle 10 % D: DIN 28011 proportions), torispherical-80 (crown
        80 % D, knuckle 15.4 % D: DIN 28013 proportions), conical:angle=A (half-angle
        in degrees; knuckle= optional). Example: --head-1 conical:angle=30,knuckle=50.

        The profile written (--output) is the liquid space: the inside wall from
        the axis round to the axis, closed along the axis, ready for revolve
        measure and revolve levels. Summary: capacity, each head's depth and
        volume, inside and outside surface, metal volume and mass, mass full,
        centres of mass empty and full (along the axis from head 1's tangent line).

        Geometry only: wall and head thickness for pressure, supports and nozzles
        are for the applicable code and a licensed engineer.
        """
        code = run_vessel(
            output=output, wall_output=wall_output, force=force, as_json=as_json, report=report,
            diameter=diameter, length=length, head=head, head_1=head_1, head_2=head_2,
            units=units, dimensions=dimensions, thickness=thickness, material=material,
            density=density, liquid=liquid, liquid_density=liquid_density,
            orientation=orientation, name=name, length_unit=length_unit,
            volume_unit=volume_unit, area_unit=area_unit, mass_unit=mass_unit,
            tolerance=tolerance)
        if code:
            raise typer.Exit(code)
