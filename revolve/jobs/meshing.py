"""Meshing a revolved part: the chord tolerance rule and the figures ``revolve mesh`` reports.

* :func:`chord_tolerance`: ``--chord-tolerance`` (a length with its unit; a
  bare number is in the output length unit) in the profile's unit, refused
  below a fraction of the part's size;
* :func:`mesh_part`: the mesh of a revolution, its STL bytes, and a
  :class:`~revolve.jobs.results.Result` comparing the mesh's area and volume
  with the exact ones (so the user sees what the tolerance costs).

No printing and no files here: the command writes the STL and the CSV
through :func:`revolve.render.output.write_outputs`.

Examples
--------
>>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
>>> ring = Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),), unit="mm")
>>> job = mesh_part(Revolution(ring, Axis.x()), "0.01 mm")
>>> d = job.result.to_dict()
>>> d["units"]["volume"], d["mesh"]["open_edges"], d["closed"]
('mm³', 0, True)
>>> abs(d["mesh"]["mesh_volume"] / (16 * 3.141592653589793) - 1) < 1e-2   # π (3² − 1²) 2
True
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Optional

from revolve.errors import RevolveError, UnitError

#: Default chord tolerance as a fraction of the profile's size (its bounding-box diagonal).
DEFAULT_RELATIVE_TOLERANCE = 1e-3
#: Finest chord tolerance, as a fraction of the size: an STL file's 32-bit floats keep about
#: 7 significant digits (a relative step of 1.2e-7), so a finer promise could not be kept.
FINEST_RELATIVE_TOLERANCE = 1e-6
#: Finest chord tolerance of a picture: finer detail is far below a pixel, and the mesh (and
#: the time to draw it) would grow without bound.
FINEST_PICTURE_TOLERANCE = 1 / 2000


def chord_tolerance(given: Any, shown_unit: str, profile_unit: str, size: float, *,
                    finest: float = FINEST_RELATIVE_TOLERANCE,
                    why: str = "an STL file keeps about 7 significant digits",
                    option: str = "--chord-tolerance") -> float:
    """The chord tolerance in the profile's unit; None gives 1/1000 of the part's size.

    ``given`` is a :class:`revolve.inputs.Length` or its text (``"0.05 mm"``,
    ``"1/64 in"``); a bare number is in ``shown_unit`` (the output length
    unit). A tolerance below ``finest`` times the part's size is refused,
    saying ``why``; errors name ``option``.

    >>> chord_tolerance("0.5", "mm", "cm", 10.0)
    0.05
    >>> chord_tolerance(None, "mm", "mm", 200.0)
    0.2
    >>> chord_tolerance("-1", "mm", "mm", 1.0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --chord-tolerance: the chord tolerance must be a positive length, got -1 mm
    >>> chord_tolerance("1e-300", "mm", "mm", 100.0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --chord-tolerance: an STL file keeps about 7 significant digits: give at least 0.0001 mm (1e-06 of the part's size)
    >>> chord_tolerance("3 kg", "mm", "mm", 1.0)
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --chord-tolerance: 'kg' is a mass unit, not a length unit
    """
    from revolve import units
    from revolve.inputs import parse_length

    if given is None:
        return DEFAULT_RELATIVE_TOLERANCE * size
    try:
        length = parse_length(given) if isinstance(given, str) else given
        value = length.in_unit(profile_unit, shown_unit)
    except (RevolveError, UnitError) as e:
        raise e.located(option=option)
    if not (math.isfinite(value) and value > 0):
        raise RevolveError(f"the chord tolerance must be a positive length, got "
                           f"{length.value:g} {length.unit or shown_unit}", option=option)
    if value < finest * size:
        shown = finest * size * units.factor(profile_unit, "length") \
            / units.factor(shown_unit, "length")
        raise RevolveError(f"{why}: give at least {shown:.3g} {shown_unit} ({finest:g} of the "
                           f"part's size)", option=option)
    return value


@dataclass(frozen=True)
class MeshJob:
    """A meshed part: the mesh (profile units), its STL bytes and the figures to report."""

    mesh: Any
    stl: bytes
    result: Any


def mesh_part(revolution, tolerance: Any = None, *, length_unit: Optional[str] = None,
              name: Optional[str] = None, profile_file: Optional[str] = None,
              output: Optional[str] = None) -> MeshJob:
    """Mesh ``revolution`` to a chord tolerance; the STL's coordinates in ``length_unit``.

    ``output`` (the STL's name) only appears in the table's title and errors.

    ``length_unit`` defaults to the profile's unit; the area and volume are
    shown in its square and cube (:func:`revolve.jobs.measuring.part_units`).
    """
    from revolve import units
    from revolve.formats.stl import stl_bytes
    from revolve.geometry.checks import prepare
    from revolve.geometry.measure import measure
    from revolve.geometry.mesh import revolve_mesh
    from revolve.jobs.measuring import part_units
    from revolve.jobs.results import Field, Result, Table

    profile_unit = revolution.profile.unit
    u = part_units(profile_unit, length_unit)
    shown = u.unit("length")
    size = prepare(revolution.profile, revolution.axis).size
    tol = chord_tolerance(tolerance, shown, profile_unit, size)
    mesh = revolve_mesh(revolution, tol)
    exact = measure(revolution, crosscheck=False)
    si = units.factor(profile_unit, "length")
    header = f"revolve mesh, unit {shown}, {name or 'profile'}"
    stl = stl_bytes(mesh.vertices, mesh.triangles, header=header,
                    scale=u.show(si, "length"), file=output)
    fields = [Field("triangles", "triangles", style="count"),
              Field("vertices", "vertices", style="count"),
              Field("angular_steps", "angular steps", style="count"),
              Field("chord_tolerance", "chord tolerance", "length"),
              Field("open_edges", "open edges", style="count"),
              Field("mesh_area", "mesh area", "area"),
              Field("exact_area", "exact area", "area"),
              Field("area_relative_difference", "area, relative difference", digits=2),
              Field("mesh_volume", "mesh volume", "volume"),
              Field("exact_volume", "exact volume", "volume"),
              Field("volume_relative_difference", "volume, relative difference", digits=2)]
    area = mesh.area()
    exact_area = exact.surface_total + 2 * (exact.cut_face_area or 0.0)
    row = {"triangles": int(len(mesh.triangles)), "vertices": int(len(mesh.vertices)),
           "angular_steps": int(mesh.angular_steps), "chord_tolerance": mesh.tolerance * si,
           "open_edges": int(mesh.open_edge_count()), "mesh_area": area * si ** 2,
           "exact_area": exact_area * si ** 2, "area_relative_difference": _relative(area, exact_area)}
    notes = []
    if mesh.closed:
        volume = mesh.volume()
        row["mesh_volume"] = volume * si ** 3
        if exact.has_solid:
            row["exact_volume"] = exact.volume * si ** 3
            row["volume_relative_difference"] = _relative(volume, exact.volume)
    else:
        notes.append("The profile has open chains, so the mesh is an open surface (no volume; "
                     "not for printing as a solid).")
    table = Table("mesh", f"{name or 'profile'}: mesh written to {output}" if output else
                  (name or "mesh"), tuple(fields), (row,), figures=True)
    inputs = {"profile": profile_file, "name": name, "unit": profile_unit, "output": output,
              "angle_degrees": float(revolution.angle_degrees)}
    result = Result("mesh", u, inputs, (table,), tuple(notes),
                    extra={"closed": bool(mesh.closed)})
    return MeshJob(mesh, stl, result)


def _relative(got: float, want: float) -> float:
    return abs(got - want) / abs(want) if want else float("nan")
