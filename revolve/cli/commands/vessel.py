"""``revolve vessel``: build a vessel from its diameter, shell length and heads; summarise it.

Heads (``--head`` for both ends, ``--head-1`` / ``--head-2`` for one; head 1
is at the start of the axis, the bottom of a vertical vessel): ``flat``,
``hemispherical``, ``ellipsoidal`` (2:1), ``torispherical`` (crown = D,
knuckle = 6 % D), ``torispherical-10`` (crown = D, knuckle = 10 % D, the DIN
28011 proportions), ``torispherical-80`` (crown = 80 % D, knuckle = 15.4 % D,
the DIN 28013 proportions), ``conical:angle=A`` (half-angle in degrees);
settings after a colon, e.g. ``torispherical:crown=1100,knuckle=8%`` or
``conical:angle=30,knuckle=50`` (lengths in the vessel's unit or % of D).

The profile written with ``--output`` is the **liquid space**: the inside
wall from the axis round to the axis, closed along the axis, as one loop
(faces ``head 1``, ``shell``, ``head 2``). ``revolve measure FILE`` gives its
capacity and inside surface; ``revolve levels FILE`` its
level table. ``--wall-output`` writes the metal section (with
``--thickness``), with the material, so that ``revolve measure`` gives the
metal's mass.

JSON keys: ``vessel`` (diameter, dimensions, inside_diameter,
outside_diameter, shell_length, thickness, orientation), ``heads`` (per head:
kind, description, crown, knuckle, angle, depth, depth_outside, volume,
inside_area), ``capacity``, ``shell_volume``, ``inside_length``,
``outside_length``, ``inside_area``, ``outside_area``, ``metal_volume``,
``metal``, ``metal_mass``, ``liquid``, ``liquid_mass``, ``mass_full``,
``centre_of_mass`` (liquid, empty, full: along the axis from the tangent
line of head 1), ``units``, ``files``, ``crosscheck``, ``notes``, ``cautions``.
"""

from __future__ import annotations

import math
import re
from typing import Optional

import typer

from revolve.cli import common
from revolve.errors import RevolveError, UnitError

DEFAULT_TOLERANCE = 1e-9
_QUANTITY = re.compile(r"^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*([^\d\s].*)?$")


def _length(text: str, unit: str, option: str) -> float:
    """A length such as ``1200`` (in the vessel's unit) or ``1.2 m``, in the vessel's unit."""
    from revolve import units

    m = _QUANTITY.match(str(text))
    if not m:
        raise RevolveError(f"give a number, optionally with a unit (e.g. 1200 or '1.2 m'), "
                           f"got {text!r}", place=option)
    value = float(m.group(1))
    if not math.isfinite(value):
        raise RevolveError(f"{text!r} is not a finite number", place=option)
    if m.group(2):
        try:
            value = units.convert(value, m.group(2).strip(), unit, "length")
        except UnitError as e:
            raise common.fail_unit(option, e)
    return value


def _density(material: Optional[str], density: Optional[str], what: str, m_opt: str,
             d_opt: str):
    """Density (kg/m³), a label and the material's key from a material name or a density
    (a bare number is kg/m³), or (None, None, None)."""
    return common.material_or_density(material, density, material_option=m_opt,
                                      density_option=d_opt)


def run_vessel(diameter: str, length: str, head: Optional[str], head_1: Optional[str],
               head_2: Optional[str], unit: str, dimensions: str, thickness: Optional[str],
               material: Optional[str], density: Optional[str], liquid: Optional[str],
               liquid_density: Optional[str], orientation: str, output: Optional[str],
               wall_output: Optional[str], length_unit: Optional[str],
               volume_unit: Optional[str], area_unit: Optional[str], mass_unit: Optional[str],
               as_json: bool, tolerance: float, name: Optional[str] = None) -> int:
    """Build, write and summarise; return the exit code (1: a cross-check disagrees)."""
    import sys

    from revolve import units
    from revolve.jobs import vessel as jv

    try:
        unit = units.canonical(unit, "length")
    except UnitError as e:
        raise common.fail_unit("--units", e)
    length_unit, area_unit, volume_unit, mass_unit = (
        _unit(text, kind, option) for text, kind, option in (
            (length_unit, "length", "--length-unit"), (area_unit, "area", "--area-unit"),
            (volume_unit, "volume", "--volume-unit"), (mass_unit, "mass", "--mass-unit")))
    orientation = (orientation or "vertical").strip().lower()
    if orientation not in ("vertical", "horizontal"):
        raise RevolveError(f"give vertical or horizontal, got {orientation!r}",
                           place="--orientation")
    dimensions = (dimensions or "inside").strip().lower()
    if dimensions not in ("inside", "outside"):
        raise RevolveError(f"give inside or outside, got {dimensions!r}", place="--dimensions")
    if not tolerance > 0:
        raise RevolveError("must be a positive number", place="--tolerance")
    D = _length(diameter, unit, "--diameter")
    L = _length(length, unit, "--length")
    if not D > 0:
        raise RevolveError(f"the diameter must be positive, got {D:g}", place="--diameter")
    if L < 0:
        raise RevolveError(f"the shell length must not be negative, got {L:g}", place="--length")
    t = None if thickness is None else _length(thickness, unit, "--thickness")
    if head and (head_1 or head_2):
        raise RevolveError("give --head for both ends, or --head-1 and --head-2, not both",
                           place="--head")
    text_1, text_2 = (head, head) if head else (head_1, head_2)
    if not text_1 or not text_2:
        missing = "--head-1" if not text_1 else "--head-2"
        raise RevolveError("give the heads: --head KIND for both ends, or --head-1 and --head-2 "
                           "(flat, hemispherical, ellipsoidal, torispherical, torispherical-10, "
                           "torispherical-80, conical:angle=A)", place=missing if head_1 or head_2
                           else "--head")
    spec_1 = jv.parse_head(text_1, D, place="--head" if head else "--head-1")
    spec_2 = jv.parse_head(text_2, D, place="--head" if head else "--head-2")
    metal_d, metal_label, metal_key = _density(material, density, "metal", "--material",
                                               "--density")
    liquid_d, liquid_label, _ = _density(liquid, liquid_density, "liquid", "--liquid",
                                         "--liquid-density")
    if wall_output and t is None:
        raise RevolveError("a wall profile needs a wall thickness; give --thickness",
                           place="--wall-output")
    if (metal_d is not None) and t is None:
        raise RevolveError("the metal's mass needs a wall thickness; give --thickness",
                           place="--material" if material else "--density")
    if output and wall_output and output == wall_output:
        raise RevolveError("the liquid space and the wall need two different files",
                           place="--wall-output")
    try:
        design = jv.build_vessel(D, L, spec_1, spec_2, thickness=t, dimensions=dimensions,
                                 unit=unit)
    except RevolveError as e:
        raise _option_error(e, head)
    u = common.output_units(unit, length_unit, area_unit, volume_unit, mass_unit)
    summary = jv.summarise(design, metal_density=metal_d, liquid_density=liquid_d,
                           si_length=u.si_length)
    description = jv.describe(design)
    name = name.strip() if name and name.strip() else description
    texts = {}
    from revolve.formats.writer import profile_text

    profile, axis = jv.sketch_profile(design, orientation, "inside", name=name)
    if output:
        texts[output] = profile_text(profile, axis=axis, angle=360, section="space",
                                     orientation=orientation)
    if wall_output:
        wall, axis_w = jv.sketch_profile(design, orientation, "wall", name=name + " (wall)")
        texts[wall_output] = profile_text(wall, axis=axis_w, angle=360, orientation=orientation,
                                          material=metal_key if metal_key else None,
                                          density=None if metal_key or metal_d is None
                                          else f"{metal_d!r} kg/m^3")
    # Everything is worked out first; then both files are written together, or neither is.
    from revolve.formats.files import OutputSet

    with OutputSet() as out:
        for path, text in texts.items():
            out.text(path, text, option="--output" if path == output else "--wall-output")
    files = {"liquid_space": output, "wall": wall_output}
    if as_json:
        common.print_json(summary_dict(summary, u, orientation, metal_label, liquid_label, files,
                                       tolerance))
    else:
        _print(summary, u, orientation, metal_label, liquid_label, files, name, description)
    if not summary.crosscheck_difference <= tolerance:
        print(f"revolve: the two computations disagree by {summary.crosscheck_difference:.1e} "
              f"(more than {tolerance:g}); do not use these figures without finding out why",
              file=sys.stderr)
        return 1
    return 0


def _unit(text: Optional[str], kind: str, option: str) -> Optional[str]:
    """The display spelling of an output unit (None stays None), refused with the option's name."""
    from revolve import units

    if text is None:
        return None
    try:
        return units.canonical(text, kind)
    except UnitError as e:
        raise common.fail_unit(option, e)


def _option_error(e: RevolveError, both: Optional[str]) -> RevolveError:
    place = e.place or ""
    if place in ("head 1", "head 2"):
        option = "--head" if both else ("--head-1" if place == "head 1" else "--head-2")
        return type(e)(e.message, place=f"{option} ({place})")
    if place in ("diameter", "length", "thickness", "dimensions"):
        return type(e)(e.message, place=f"--{place}")
    return e


def summary_dict(s, u, orientation, metal_label, liquid_label, files, tolerance):
    """The JSON form of a vessel summary, in the output units."""
    L, A, V, M = u.length_factor, u.area_factor, u.volume_factor, u.mass_factor
    d = s.design

    def opt(value, factor):
        return None if value is None else value * factor

    heads = []
    for h in s.heads:
        spec = h.spec
        heads.append({
            "which": h.which, "kind": spec.kind, "description": spec.describe(d.unit),
            "crown": opt(spec.crown, L), "knuckle": opt(spec.knuckle, L),
            "angle_degrees": spec.angle,
            "depth": h.depth * L, "depth_outside": opt(h.depth_outside, L),
            "volume": h.volume * V, "inside_area": h.inside_area * A,
        })
    return {
        "vessel": {"diameter": d.diameter * L, "dimensions": d.dimensions,
                   "inside_diameter": d.inside_diameter * L,
                   "outside_diameter": opt(d.outside_diameter, L),
                   "shell_length": d.length * L, "thickness": opt(d.thickness, L),
                   "orientation": orientation, "description": _describe(d)},
        "heads": heads,
        "capacity": s.capacity * V,
        "shell_volume": s.shell_volume * V,
        "inside_length": s.inside_length * L,
        "outside_length": opt(s.outside_length, L),
        "inside_area": s.inside_area * A,
        "shell_inside_area": s.shell_inside_area * A,
        "outside_area": opt(s.outside_area, A),
        "metal_volume": opt(s.metal_volume, V),
        "metal": metal_label,
        "metal_mass": opt(s.metal_mass, M),
        "liquid": liquid_label,
        "liquid_mass": opt(s.liquid_mass, M),
        "mass_full": opt(s.mass_full, M),
        "centre_of_mass": {"from": "the tangent line of head 1, along the axis",
                           "liquid": s.centre_of_mass_liquid * L,
                           "empty": opt(s.centre_of_mass_empty, L),
                           "full": opt(s.centre_of_mass_full, L)},
        "units": {"length": u.length, "area": u.area, "volume": u.volume, "mass": u.mass},
        "files": files,
        "crosscheck": {"largest_difference": s.crosscheck_difference, "tolerance": tolerance,
                       "agrees": bool(s.crosscheck_difference <= tolerance)},
        "notes": list(s.notes),
        "cautions": [common.CAUTIONS["vessel"]] + (
            [common.CAUTIONS["lifting"]] if s.metal_mass is not None else []),
    }


def _describe(d) -> str:
    from revolve.jobs.vessel import describe
    return describe(d)


def _print(s, u, orientation, metal_label, liquid_label, files, name, description):
    from rich.table import Table

    L, A, V, M = u.length_factor, u.area_factor, u.volume_factor, u.mass_factor
    f = common.fmt
    d = s.design
    con = common.console()
    con.print(f"[bold]{name}[/bold]")
    if name != description:
        con.print(description)
    con.print(f"drawn {orientation}; head 1 is at the start of the axis"
              + (" (the bottom)" if orientation == "vertical" else " (the left end)"))
    t = Table(show_edge=False, pad_edge=False)
    t.add_column("head")
    t.add_column("kind")
    t.add_column(f"depth, {u.length}", justify="right")
    walled = any(h.depth_outside is not None for h in s.heads)
    if walled:
        t.add_column(f"outside, {u.length}", justify="right")
    t.add_column(f"volume, {u.volume}", justify="right")
    t.add_column(f"inside area, {u.area}", justify="right")
    for h in s.heads:
        cells = [h.which, h.spec.describe(d.unit), f(h.depth * L)]
        if walled:
            cells.append(f(h.depth_outside * L))
        t.add_row(*cells, f(h.volume * V), f(h.inside_area * A))
    con.print(t)
    con.print("heads: depth and volume beyond the tangent line (where the head meets the shell)")
    con.print()
    q = Table(show_edge=False, pad_edge=False)
    q.add_column("quantity")
    q.add_column("value", justify="right")
    q.add_column("unit")
    q.add_row("inside diameter", f(d.inside_diameter * L), u.length)
    if d.outside_diameter is not None:
        q.add_row("outside diameter", f(d.outside_diameter * L), u.length)
    q.add_row("straight shell (tangent to tangent)", f(d.length * L), u.length)
    q.add_row("inside length (pole to pole)", f(s.inside_length * L), u.length)
    if s.outside_length is not None:
        q.add_row("outside length", f(s.outside_length * L), u.length)
    q.add_section()
    q.add_row("capacity", f(s.capacity * V), u.volume, style="bold")
    q.add_row("  shell", f(s.shell_volume * V), u.volume)
    q.add_row("inside surface", f(s.inside_area * A), u.area)
    if s.outside_area is not None:
        q.add_row("outside surface", f(s.outside_area * A), u.area)
    if s.metal_volume is not None:
        q.add_section()
        q.add_row("metal volume", f(s.metal_volume * V), u.volume)
        if s.metal_mass is not None:
            q.add_row("metal mass (empty)", f(s.metal_mass * M), u.mass, style="bold")
    if s.liquid_mass is not None:
        q.add_row("liquid mass, full", f(s.liquid_mass * M), u.mass)
    if s.mass_full is not None:
        q.add_row("mass full", f(s.mass_full * M), u.mass, style="bold")
    q.add_section()
    q.add_row("centre of mass of the liquid, full", f(s.centre_of_mass_liquid * L), u.length)
    if s.centre_of_mass_empty is not None:
        q.add_row("centre of mass, empty", f(s.centre_of_mass_empty * L), u.length)
    if s.centre_of_mass_full is not None:
        q.add_row("centre of mass, full", f(s.centre_of_mass_full * L), u.length)
    con.print(q)
    con.print("centres of mass: along the axis from the tangent line of head 1")
    if metal_label:
        con.print(f"metal: {metal_label}")
    if liquid_label:
        con.print(f"liquid: {liquid_label}")
    for note in s.notes:
        con.print(f"note: {note}")
    con.print(f"cross-check: largest relative difference {s.crosscheck_difference:.1e}")
    if files.get("liquid_space"):
        path = files["liquid_space"]
        con.print(f"wrote {path}: the liquid space", soft_wrap=True)
        con.print(f"  revolve measure {path}", soft_wrap=True)
        con.print(f"  revolve levels {path}", soft_wrap=True)
    if files.get("wall"):
        con.print(f"wrote {files['wall']}: the wall (metal section)", soft_wrap=True)
    kinds = ["vessel"] + (["lifting"] if s.metal_mass is not None else [])
    con.print(common.caution_panel(kinds))


def register(app: typer.Typer) -> None:
    @app.command("vessel")
    def vessel_command(
        diameter: str = typer.Option(..., "--diameter", help="Shell diameter, e.g. 1200 (in "
                                                             "--units) or '1.2 m'."),
        length: str = typer.Option(..., "--length", help="Straight shell, tangent line to "
                                                         "tangent line (0 for two heads only)."),
        head: Optional[str] = typer.Option(None, "--head", help="Both heads: flat, "
                                                                "hemispherical, ellipsoidal, "
                                                                "torispherical, torispherical-10, "
                                                                "torispherical-80, "
                                                                "conical:angle=A."),
        head_1: Optional[str] = typer.Option(None, "--head-1", help="Head at the start of the "
                                                                    "axis (bottom)."),
        head_2: Optional[str] = typer.Option(None, "--head-2", help="Head at the end of the "
                                                                    "axis (top)."),
        units: str = typer.Option("mm", "--units", help="Length unit of the inputs and of the "
                                                        "profile file."),
        dimensions: str = typer.Option("inside", "--dimensions", help="inside or outside: the "
                                                                      "surface the diameter and "
                                                                      "head radii describe."),
        thickness: Optional[str] = typer.Option(None, "--thickness", help="Wall thickness "
                                                                          "(shell and heads)."),
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
        output: Optional[str] = typer.Option(None, "--output", "-o",
                                             help="Write the liquid space profile to this file."),
        wall_output: Optional[str] = typer.Option(None, "--wall-output",
                                                  help="Write the wall (metal section) profile "
                                                       "to this file."),
        length_unit: Optional[str] = typer.Option(None, "--length-unit", help="Output length "
                                                                              "unit."),
        volume_unit: Optional[str] = typer.Option(None, "--volume-unit",
                                                  help="Output volume unit: L, m^3, US_gallon, "
                                                       "imperial_gallon, bbl, ..."),
        area_unit: Optional[str] = typer.Option(None, "--area-unit", help="Output area unit."),
        mass_unit: Optional[str] = typer.Option(None, "--mass-unit", help="Output mass unit "
                                                                          "(kg, lb, t)."),
        name: Optional[str] = typer.Option(None, "--name", help="Name written in the profile "
                                                                "file (default: a description)."),
        as_json: bool = typer.Option(False, "--json", help="Print JSON instead of tables."),
        tolerance: float = typer.Option(DEFAULT_TOLERANCE, "--tolerance",
                                        help="Largest relative difference allowed between the "
                                             "two computations before the exit code is 1."),
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
        code = run_vessel(diameter, length, head, head_1, head_2, units, dimensions, thickness,
                          material, density, liquid, liquid_density, orientation, output,
                          wall_output, length_unit, volume_unit, area_unit, mass_unit, as_json,
                          tolerance, name)
        if code:
            raise typer.Exit(code)
