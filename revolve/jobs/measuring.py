"""Measuring one part: the rule that turns a file (or a profile) plus settings into a
revolution and a measurement, and the one JSON form of the result.

The command line (``revolve measure``) and the library (:func:`revolve.measure`)
both call the functions here, so the library's ``to_dict()`` and the command's
``--json`` are the same object by construction.

* :func:`parse_axis`, :func:`revolution_for`: the axis and angle rule (the
  given value, else the file's, else the sketch x axis and 360°);
* densities come from :mod:`revolve.materials` (:func:`~revolve.materials.density_value`,
  :func:`~revolve.materials.material_or_density`, :func:`~revolve.materials.file_density`);
* :func:`part_units`: the output units of a part (the ``part`` trade's
  defaults of :func:`revolve.jobs.results.trade_units`, then the options);
* :func:`measure_document`, :func:`measurement_dict`, :func:`part_json`;
* :func:`measure_result` and :class:`MeasureResult` (a
  :class:`~revolve.jobs.results.Result`: the figures and cross-check tables
  for the renderer, the ``measure --json`` object from :meth:`~MeasureResult.to_dict`);
* :func:`measure`: the library's entry point.

Examples
--------
>>> from revolve.geometry.profile import Loop, Profile
>>> ring = Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),), unit="mm")
>>> r = measure(ring, density="1 g/cm^3")
>>> round(r.volume, 6), r.units["volume"]          # π (3² − 1²) · 2 = 16π mm³
(50.265482, 'mm³')
>>> round(r.mass * 1e6, 6), r.units["mass"]        # 16π mm³ at 1000 kg/m³, in mg
(50.265482, 'kg')
"""

from __future__ import annotations

import os
import re
from dataclasses import dataclass
from fractions import Fraction
from typing import Any, Dict, Optional, Tuple

from revolve.errors import RevolveError, UnitError, quoted
from revolve.geometry.profile import Axis, Revolution
from revolve.jobs.results import CAUTIONS, Result
from revolve.materials import density_value, file_density, material_or_density

#: Relative tolerance of the cross-check unless told otherwise (``--tolerance``).
DEFAULT_TOLERANCE = 1e-9

#: The sketch x axis with its exact description (as ``--axis x`` gives it).
X_AXIS_EXACT = ((Fraction(0), Fraction(0)), (Fraction(1), Fraction(0)))

#: Largest size of a number in ``--axis``: a coordinate whose cube still fits a float with room.
AXIS_LIMIT = 1e99

_AXIS_NUMBER = re.compile(r"[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?")


def parse_axis(text: Optional[str], option: str = "--axis") -> Optional[Axis]:
    """``x``, ``y`` or ``X0,Y0,DX,DY`` (a point on the axis and its direction); None stays None.

    Each number is a plain decimal (``1.5``, ``-2e3``) of size at most
    :data:`AXIS_LIMIT`; anything else is refused with ``option`` named
    (``--axis`` on the command line, ``axis`` in the library).

    >>> parse_axis("1,2,0")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --axis: give x, y or four numbers X0,Y0,DX,DY, got '1,2,0'
    >>> parse_axis("1e999,0,1,0")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --axis: X0 = 1e999 is out of range; each number must be between -1e+99 and 1e+99
    >>> parse_axis("0,0,nan,1")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --axis: DX = 'nan' is not a number; give four numbers X0,Y0,DX,DY such as 0,0,1,0
    >>> parse_axis("-0,0,-0,1e-3").direction
    (0.0, 0.001)
    """
    if text is None:
        return None
    t = text.strip().lower()
    if t in ("x", "+x"):
        return Axis((0.0, 0.0), (1.0, 0.0), exact=((Fraction(0), Fraction(0)), (Fraction(1), Fraction(0))))
    if t in ("y", "+y"):
        return Axis((0.0, 0.0), (0.0, 1.0), exact=((Fraction(0), Fraction(0)), (Fraction(0), Fraction(1))))
    parts = [p.strip() for p in t.replace(";", ",").split(",")]
    if len(parts) != 4:
        raise RevolveError(f"give x, y or four numbers X0,Y0,DX,DY, got {quoted(text)}",
                           option=option)
    vals = []
    for name, part in zip(("X0", "Y0", "DX", "DY"), parts):
        number = _AXIS_NUMBER.fullmatch(part) if len(part) <= 40 else None
        if number is None:
            raise RevolveError(f"{name} = {quoted(part)} is not a number; give four numbers "
                               f"X0,Y0,DX,DY such as 0,0,1,0", option=option)
        exponent = number.group(1)
        # Fraction would build 10**exponent exactly: refuse absurd exponents before it does.
        if exponent is not None and abs(int(exponent)) > 400:
            if float(part[:number.start(1) - 1]) == 0:
                part = "0"
            elif int(exponent) < 0:
                raise RevolveError(f"{name} = {part} is too small to tell from 0; write 0",
                                   option=option)
        huge = part != "0" and exponent is not None and int(exponent) > 400
        value = None if huge else Fraction(part)
        if huge or abs(value) > AXIS_LIMIT:
            raise RevolveError(f"{name} = {part} is out of range; each number must be between "
                               f"{-AXIS_LIMIT:g} and {AXIS_LIMIT:g}", option=option)
        vals.append(value)
    fl = [float(v) for v in vals]
    if fl[2] == 0 and fl[3] == 0:
        raise RevolveError("the direction DX,DY is zero; give a direction such as 1,0",
                           option=option)
    return Axis((fl[0], fl[1]), (fl[2], fl[3]), exact=((vals[0], vals[1]), (vals[2], vals[3])))


def load_with_unit(path: str, unit: Optional[str] = None, *, exact: bool = False,
                   option: str = "--units"):
    """Read a profile file; ``unit`` is the length unit of files that do not say (``--units``).

    >>> load_with_unit("p.txt", "gallon")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --units: 'gallon' is a volume unit, not a length unit
    """
    from revolve import units as registry
    from revolve.formats import load_profile

    if unit is not None:
        try:
            registry.factor(unit, "length")
        except UnitError as e:
            raise e.located(option=option)
    return load_profile(path, unit=unit, exact=exact)


def x_axis() -> Axis:
    """The sketch x axis, with its exact description (the default axis).

    >>> x_axis().direction
    (1.0, 0.0)
    """
    return Axis((0.0, 0.0), (1.0, 0.0), exact=X_AXIS_EXACT)


def revolution_for(doc, axis: Optional[Axis] = None, angle: Optional[float] = None, *,
                   angle_option: str = "--angle") -> Revolution:
    """The revolution of a document: the given axis and angle, else the file's, else x and 360°.

    This is the one rule for every command and the library. An angle that
    is refused names ``angle_option`` when it was given (``--angle`` on the
    command line, ``angle`` in the library), else the file's line.

    Examples
    --------
    >>> from revolve.formats.document import ProfileDocument
    >>> from revolve.geometry.profile import Loop, Profile
    >>> doc = ProfileDocument(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (0, 2)]),)))
    >>> rev = revolution_for(doc)
    >>> rev.axis.direction, rev.angle_degrees
    ((1.0, 0.0), 360.0)
    >>> revolution_for(doc, angle=0.0)
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: --angle: the revolution angle must be above 0 and at most 360 degrees, got 0
    """
    ax = axis or doc.axis or x_axis()
    ang = angle if angle is not None else (
        doc.angle_degrees if doc.angle_degrees is not None else 360.0)
    try:
        return Revolution(doc.profile, ax, ang)
    except RevolveError as e:
        given = angle is not None
        raise e.located(file=None if given else doc.file,
                        line=None if given else doc.line_of("angle"),
                        place=angle_option if given else "angle")


@dataclass(frozen=True)
class PartMeasurement:
    """One measured part: its document, revolution, measurement and density used.

    ``density`` is in kg/m³ (None when neither the settings nor the file give
    one); ``density_label`` says where it came from.
    """

    file: Optional[str]
    document: Any
    revolution: Any
    measurement: Any
    density: Optional[float] = None
    density_label: Optional[str] = None


def measure_document(doc, *, axis: Optional[Axis] = None, angle: Optional[float] = None,
                     density: Optional[float] = None,
                     density_label: Optional[str] = None,
                     angle_option: str = "--angle") -> PartMeasurement:
    """Measure a document's revolution (:func:`revolution_for`) with a density in kg/m³.

    Without a density, the file's ``material`` or ``density`` is used
    (:func:`file_density`). Errors are located in the file.

    Examples
    --------
    >>> from revolve.formats.document import ProfileDocument
    >>> from revolve.geometry.profile import Loop, Profile
    >>> doc = ProfileDocument(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),),
    ...                               unit="m"))
    >>> part = measure_document(doc, density=1000.0, density_label="water")
    >>> round(part.measurement.mass, 3)                # 16π m³ of water
    50265.482
    >>> measure_document(doc, angle=-1.0)
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: --angle: the revolution angle must be above 0 and at most 360 degrees, got -1
    """
    from revolve import units
    from revolve.geometry.measure import measure as measure_revolution

    rev = revolution_for(doc, axis, angle, angle_option=angle_option)
    if density is None:
        density, density_label = file_density(doc)
    si = units.factor(doc.profile.unit, "length")
    try:
        # Density is kg/m³; the engine works in the profile's unit: kg per (unit)³.
        m = measure_revolution(rev, density=None if density is None else density * si ** 3)
    except RevolveError as e:
        raise e.located(file=doc.file)
    return PartMeasurement(doc.file, doc, rev, m, density, density_label)


def shown_faces(m):
    """Surface by face, leaving out the unnamed group when it sweeps nothing (segments on the axis).

    >>> from types import SimpleNamespace
    >>> shown_faces(SimpleNamespace(surface_by_face={"bore": 2.0, "other": 0.0}))
    {'bore': 2.0}
    >>> shown_faces(SimpleNamespace(surface_by_face={"other": 0.0}))
    {'other': 0.0}
    """
    from revolve.geometry.profile import UNNAMED_FACE

    return {k: v for k, v in m.surface_by_face.items()
            if not (k == UNNAMED_FACE and v == 0.0 and len(m.surface_by_face) > 1)}


#: The option of each output unit role (errors name it).
UNIT_OPTIONS = {"length": "--length-unit", "area": "--area-unit", "volume": "--volume-unit",
                "mass": "--mass-unit"}


def part_units(profile_unit: str, length: Optional[str] = None, area: Optional[str] = None,
               volume: Optional[str] = None, mass: Optional[str] = None):
    """The output units of a measured part: the trade defaults of ``part``, then the user's.

    A part is shown in its drawing's unit (its square and cube) and kg — lb
    for an inch or foot drawing (:func:`revolve.jobs.results.trade_units`).
    A length unit given alone also sets the area and volume units (its
    square and cube). A refused unit names its option.

    >>> u = part_units("mm", volume="L")
    >>> u.unit("area"), u.unit("volume"), u.unit("mass·length²")
    ('mm²', 'L', 'kg·mm²')
    >>> part_units("mm", length="in").unit("area"), part_units("in").unit("mass")
    ('in²', 'lb')
    >>> part_units("mm", volume="gallon")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --volume-unit: 'gallon' is ambiguous: write 'US_gallon' (231 in³) or 'imperial_gallon' (4.54609 L)
    >>> part_units("mm", length="kg")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --length-unit: 'kg' is a mass unit, not a length unit
    """
    from revolve.jobs.results import trade_units

    overrides = {"length": length, "area": area, "volume": volume, "mass": mass}
    if length is not None:
        from revolve import units as registry

        try:
            shown = registry.canonical(length, "length")
        except UnitError as e:
            raise e.located(option=UNIT_OPTIONS["length"])
        overrides["area"] = area if area is not None else f"{shown}²"
        overrides["volume"] = volume if volume is not None else f"{shown}³"
    return trade_units("part", profile_unit, overrides, options=UNIT_OPTIONS)


def _units_json(u) -> Dict[str, str]:
    return {"length": u.unit("length"), "area": u.unit("area"), "volume": u.unit("volume"),
            "mass": u.unit("mass"), "inertia": u.unit("mass·length²")}


def measurement_dict(m, u, *, density_label=None, tolerance=DEFAULT_TOLERANCE, si: float = 1e-3):
    """The JSON form of a measurement, in the output units (see README, "JSON keys").

    Parameters
    ----------
    m : Measurement
        The engine's measurement (profile units, mass in kg).
    u : revolve.jobs.results.OutputUnits
        Units to give the figures in (:func:`part_units`).
    density_label : str, optional
        Where the density came from (shown as ``density``).
    tolerance : float
        Relative tolerance the cross-check is judged by.
    si : float
        Metres per profile unit.

    Returns
    -------
    dict
        Plain floats, lists and strings; ``mass`` and its kin only with a
        density, ``crosscheck`` only when it was computed.

    Examples
    --------
    >>> from revolve.geometry.measure import measure
    >>> from revolve.geometry.profile import Axis, Chain, Loop, Profile, Revolution
    >>> ring = Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),))
    >>> d = measurement_dict(measure(Revolution(ring, Axis.x())), part_units("mm", volume="L"))
    >>> round(d["volume"], 10), d["units"]["volume"], "mass" in d       # 16π mm³ in litres
    (5.02655e-05, 'L', False)
    >>> sheet = Profile(chains=(Chain.from_points([(0, 1), (2, 1)]),))     # a surface only
    >>> d = measurement_dict(measure(Revolution(sheet, Axis.x())), part_units("mm"))
    >>> d["volume"], d["centroid"], round(d["surface_area"], 6)          # 2π · 1 · 2
    (0.0, None, 12.566371)
    """
    s = _si_figures(m, si)
    out = {
        "units": _units_json(u),
        "angle_degrees": float(m.revolution.angle_degrees),
        "axis": {"point": [u.show(v * si, "length") for v in m.revolution.axis.point],
                 "direction": list(m.revolution.axis.unit_direction())},
    }
    for key, role in _JSON_ROLES:
        out[key] = _shown(u, s[key], role)
    out["error_estimate"] = {"volume": u.show(s["error_estimate"]["volume"], "volume"),
                             "surface_area": u.show(s["error_estimate"]["surface_area"], "area")}
    out["methods"] = sorted(set(m.section.methods))
    if m.mass is not None:
        out["density_kg_m3"] = m.density / si ** 3
        out["density"] = density_label
        for key, role in (("mass", "mass"), ("inertia_axis", "mass·length²"),
                          ("radius_of_gyration", "length")):
            out[key] = u.show(s[key], role)
    if m.crosscheck is not None:
        c = m.crosscheck
        out["crosscheck"] = {
            "method": {"volume": "washers: slices perpendicular to the axis, Gauss–Legendre",
                       "surface_area": "quadrature of r ds along each segment"},
            "volume": u.show(c.volume * si ** 3, "volume"),
            "surface_area": u.show(c.surface_area * si ** 2, "area"),
            "volume_difference": c.volume_difference, "surface_difference": c.surface_difference,
            "tolerance": tolerance, "agrees": c.agrees(tolerance),
        }
    return out


# JSON key -> role, in the order of the README's "JSON keys" (after units, angle and axis).
_JSON_ROLES = (("area", "area"), ("centroid", "length"), ("centroid_distance", "length"),
               ("perimeter", "length"), ("boundary_length", "length"),
               ("boundary_centroid", "length"), ("boundary_centroid_distance", "length"),
               ("volume", "volume"), ("surface_area", "area"), ("surface_by_face", "area"),
               ("cut_face_area", "area"), ("centre_of_mass_axial", "length"),
               ("centre_of_mass_offset", "length"))


def _shown(u, value, role):
    if isinstance(value, dict):
        return {k: u.show(v, role) for k, v in value.items()}
    return u.show(value, role)


def _si_figures(m, si: float) -> Dict[str, Any]:
    """The measurement's figures in SI (m, m², m³, kg, kg·m²); None where they do not apply."""
    L, A, V = si, si ** 2, si ** 3
    solid = m.has_solid

    def opt(v, f):
        return None if v is None else v * f

    out = {
        "area": m.area * A,
        "centroid": [m.centroid[0] * L, m.centroid[1] * L] if solid else None,
        "centroid_distance": m.centroid_distance * L if solid else None,
        "perimeter": m.perimeter * L,
        "boundary_length": m.boundary_length * L,
        "boundary_centroid": [m.boundary_centroid[0] * L, m.boundary_centroid[1] * L],
        "boundary_centroid_distance": m.boundary_centroid_distance * L,
        "volume": m.volume * V,
        "surface_area": m.surface_total * A,
        "surface_by_face": {k: v * A for k, v in shown_faces(m).items()},
        "cut_face_area": opt(m.cut_face_area, A),
        "centre_of_mass_axial": opt(m.centre_of_mass_axial, L),
        "centre_of_mass_offset": opt(m.centre_of_mass_offset, L),
        "error_estimate": {"volume": m.volume_error * V, "surface_area": m.surface_error * A},
        "crosscheck_volume": None if m.crosscheck is None else m.crosscheck.volume * V,
        "crosscheck_surface_area": None if m.crosscheck is None else m.crosscheck.surface_area * A,
    }
    if m.mass is not None:
        out.update(mass=m.mass, inertia_axis=m.inertia_axis * A, density=m.density / V,
                   radius_of_gyration=m.radius_of_gyration * L)
    return out


def part_json(part, u, tolerance: float = DEFAULT_TOLERANCE, exact_out=None) -> dict:
    """The object ``revolve measure --json`` prints for one measured part (a :class:`PartMeasurement`).

    :func:`measurement_dict` plus ``profile`` (file, name, unit), ``exact``
    when closed forms were asked for, and ``cautions`` (lifting, with a mass).

    Examples
    --------
    >>> from revolve.formats.document import ProfileDocument
    >>> from revolve.geometry.profile import Loop, Profile
    >>> doc = ProfileDocument(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (0, 2)]),),
    ...                               name="cone ring"))
    >>> d = part_json(measure_document(doc), part_units("mm"))
    >>> d["profile"], d["cautions"]
    ({'file': None, 'name': 'cone ring', 'unit': 'mm'}, [])
    >>> len(part_json(measure_document(doc, density=1000.0), part_units("mm"))["cautions"])
    1
    """
    from revolve import units

    m, doc = part.measurement, part.document
    si = units.factor(doc.profile.unit, "length")
    out = measurement_dict(m, u, density_label=part.density_label, tolerance=tolerance, si=si)
    out["profile"] = {"file": doc.file, "name": doc.name, "unit": doc.profile.unit}
    if exact_out is not None:
        out["exact"] = exact_out
    out["cautions"] = [CAUTIONS[k] for k in _cautions(m)]
    return out


def _cautions(m) -> Tuple[str, ...]:
    return ("lifting",) if m.mass is not None else ()


# -- the result: tables for people, the JSON above for programs --------------------------------


def axis_text(axis) -> str:
    """How a table title names the axis.

    >>> axis_text(Axis((0.0, 0.0), (0.0, 1.0))), axis_text(Axis((0.0, 2.5), (1.0, 1.0)))
    ('the sketch y axis', 'the axis through (0, 2.5) along (0.707107, 0.707107)')
    """
    from revolve.render.numbers import number

    d = axis.unit_direction()
    p = tuple(axis.point)
    if p == (0.0, 0.0) and d in ((1.0, 0.0), (0.0, 1.0)):
        return f"the sketch {'x' if d == (1.0, 0.0) else 'y'} axis"
    return (f"the axis through ({number(p[0])}, {number(p[1])}) "
            f"along ({number(d[0])}, {number(d[1])})")


def _figure_tables(part, u, tolerance: float, exact_out) -> Tuple[Any, Any]:
    """The figures table and the cross-check table of a measured part (values in SI)."""
    from revolve import units
    from revolve.jobs.results import Field, Table

    m, doc, rev = part.measurement, part.document, part.revolution
    s = _si_figures(m, units.factor(doc.profile.unit, "length"))
    fields, row = [], {}

    def add(key, label, role, value, style="number"):
        if value is not None:
            fields.append(Field(key, label, role, style))
            row[key] = value

    add("revolution", "revolved", None, f"{float(rev.angle_degrees):g}° about "
        f"{axis_text(rev.axis)}", "text")
    add("drawing_unit", "drawing unit", None, doc.profile.unit, "text")
    if m.has_solid:
        add("area", "section area", "area", s["area"])
        add("centroid", "section centroid (x, y)", "length", s["centroid"])
        add("centroid_distance", "section centroid, distance from the axis", "length",
            s["centroid_distance"])
        add("perimeter", "section perimeter", "length", s["perimeter"])
    add("boundary_length", "boundary length", "length", s["boundary_length"])
    add("boundary_centroid", "boundary centroid (x, y)", "length", s["boundary_centroid"])
    add("boundary_centroid_distance", "boundary centroid, distance from the axis", "length",
        s["boundary_centroid_distance"])
    exact_out = exact_out or {}
    if m.has_solid:
        add("volume", "volume", "volume", s["volume"])
        add("exact_volume", "volume, exact" + _exact_unit(exact_out, doc), None,
            exact_out.get("volume"), "text")
    for face, value in s["surface_by_face"].items():
        add(f"surface: {face}", f"surface: {face}", "area", value)
    add("surface_area", "surface, swept total", "area", s["surface_area"])
    add("exact_surface_area", "surface, exact" + _exact_unit(exact_out, doc, 2), None,
        exact_out.get("surface_area"), "text")
    add("cut_face_area", "cut faces (two flat ends, each)", "area", s["cut_face_area"])
    add("centre_of_mass_axial", "centre of mass along the axis", "length",
        s["centre_of_mass_axial"])
    if m.centre_of_mass_offset:
        add("centre_of_mass_offset", "centre of mass, distance from the axis", "length",
            s["centre_of_mass_offset"])
    if m.mass is not None:
        add("density", "density", "density", s["density"])
        add("mass", "mass", "mass", s["mass"])
        add("inertia_axis", "moment of inertia about the axis", "mass·length²", s["inertia_axis"])
        add("radius_of_gyration", "radius of gyration", "length", s["radius_of_gyration"])
    name = doc.name or doc.file or "profile"
    figures = Table("figures", name, tuple(fields), (row,), figures=True)
    c = m.crosscheck
    if c is None:
        return figures, None
    cfields, crow = [], {}
    for key, label, role, pappus, second, diff, applies in (
            ("volume", "volume", "volume", s["volume"], s["crosscheck_volume"],
             c.volume_difference, m.has_solid),
            ("surface", "surface", "area", s["surface_area"], s["crosscheck_surface_area"],
             c.surface_difference, True)):
        if not applies:
            continue
        ok = diff <= tolerance
        cfields += [Field(f"{key}_pappus", f"{label}, Pappus", role),
                    Field(f"{key}_second", f"{label}, second method", role),
                    Field(f"{key}_difference", f"{label}, relative difference", None, digits=2),
                    Field(f"{key}_verdict", f"{label}, verdict", None, "text")]
        crow.update({f"{key}_pappus": pappus, f"{key}_second": second,
                     f"{key}_difference": diff, f"{key}_verdict": "ok" if ok else "DISAGREE"})
    check = Table("crosscheck", "Cross-check (independent second computation)",
                  tuple(cfields), (crow,), figures=True)
    return figures, check


def _exact_unit(exact_out, doc, power: int = 3) -> str:
    if exact_out.get("unit_is_profile"):
        return f" ({doc.profile.unit}{'²' if power == 2 else '³'})"
    return ""


@dataclass(frozen=True, repr=False)
class MeasureResult(Result):
    """What :func:`measure` gives: the engine's measurement with its part, settings and units.

    A :class:`~revolve.jobs.results.Result` (its tables are the figures and
    the cross-check that ``revolve measure`` prints); ``measurement`` is the
    engine's :class:`~revolve.geometry.measure.Measurement` (plain floats in
    the profile's unit); :meth:`to_dict` is exactly what ``revolve measure
    FILE --json`` prints (the keys of the README's "JSON keys").

    Examples
    --------
    >>> from revolve.geometry.profile import Chain, Profile
    >>> r = measure(Profile(chains=(Chain.from_points([(0, 1), (2, 1)]),), name="sheet"))
    >>> r                                      # a surface only: no volume, no mass
    <MeasureResult sheet: volume=0 mm³, surface_area=12.5664 mm²>
    >>> r.mass is None, r.units["area"]
    (True, 'mm²')
    """

    part: Any = None
    exact: Optional[Dict[str, Any]] = None
    tolerance: float = DEFAULT_TOLERANCE

    @property
    def measurement(self):
        """The engine's measurement (profile units; mass in kg)."""
        return self.part.measurement

    @property
    def revolution(self) -> Revolution:
        """The revolution measured (profile, axis, angle)."""
        return self.part.revolution

    @property
    def profile(self):
        """The profile measured."""
        return self.part.revolution.profile

    @property
    def volume(self) -> float:
        """Volume in the JSON's volume unit (0 for a profile of chains only)."""
        return self.to_dict()["volume"]

    @property
    def surface_area(self) -> float:
        """Swept surface, every face, in the JSON's area unit."""
        return self.to_dict()["surface_area"]

    @property
    def mass(self) -> Optional[float]:
        """Mass in the JSON's mass unit, or None without a density."""
        return self.to_dict().get("mass")

    @property
    def agrees(self) -> bool:
        """Whether the cross-check agrees within the tolerance (True when there is none)."""
        c = self.measurement.crosscheck
        return c is None or c.agrees(self.tolerance)

    def to_dict(self) -> Dict[str, Any]:
        """The JSON object of ``revolve measure FILE --json`` for the same input."""
        return part_json(self.part, self.units, self.tolerance, self.exact)

    def __repr__(self) -> str:
        d = self.to_dict()
        u = d["units"]
        name = d["profile"]["name"] or d["profile"]["file"] or "profile"
        bits = [f"volume={d['volume']:.6g} {u['volume']}",
                f"surface_area={d['surface_area']:.6g} {u['area']}"]
        if "mass" in d:
            bits.append(f"mass={d['mass']:.6g} {u['mass']}")
        return f"<MeasureResult {name}: {', '.join(bits)}>"


def measure_result(part: PartMeasurement, units=None, *, tolerance: float = DEFAULT_TOLERANCE,
                   exact_out=None) -> MeasureResult:
    """A measured part as a :class:`MeasureResult`: tables, notes, cautions, units.

    ``units`` defaults to :func:`part_units` of the profile's unit.

    >>> from revolve.formats.document import ProfileDocument
    >>> from revolve.geometry.profile import Loop, Profile
    >>> doc = ProfileDocument(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (0, 2)]),)))
    >>> r = measure_result(measure_document(doc))
    >>> [t.key for t in r.tables], len(r.notes), r.agrees
    (['figures', 'crosscheck'], 1, True)
    """
    doc, m = part.document, part.measurement
    if units is None:
        units = part_units(doc.profile.unit)
    figures, check = _figure_tables(part, units, tolerance, exact_out)
    notes = ["volume = θ·d·A, surface = θ·d_L·L (Pappus–Guldinus); the cross-check slices "
             "washers and integrates r ds."]
    if exact_out and exact_out.get("note"):
        notes.append(f"exact: {exact_out['note']}")
    notes += [f"note: {n}" for n in m.notes]
    if m.mass is not None and part.density_label:
        notes.append(f"material: {part.density_label}")
    inputs = {"profile": doc.file, "name": doc.name, "unit": doc.profile.unit}
    return MeasureResult("measure", units, inputs,
                         (figures,) if check is None else (figures, check), tuple(notes),
                         _cautions(m), part=part, exact=exact_out, tolerance=tolerance)


def as_document(profile_or_path, units: Optional[str] = None):
    """A :class:`~revolve.formats.document.ProfileDocument` from a file name, a profile or a revolution.

    A file is read by :func:`revolve.formats.load_profile` (``units`` for
    files that do not say, e.g. point lists; default mm). A profile built in
    Python keeps its own ``unit`` and has no exact records.

    Examples
    --------
    >>> from revolve.geometry.profile import Loop, Profile
    >>> as_document(Profile(loops=(Loop.from_points([(0, 1), (1, 1), (0, 2)]),))).profile.unit
    'mm'
    >>> as_document(3)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: give a file name, a Profile or a Revolution, got int
    """
    from revolve.formats.document import ProfileDocument
    from revolve.geometry.profile import Profile

    if isinstance(profile_or_path, (str, os.PathLike)):
        return load_with_unit(os.fspath(profile_or_path), units, option="units")
    if isinstance(profile_or_path, ProfileDocument):
        return profile_or_path
    if isinstance(profile_or_path, Profile):
        return ProfileDocument(profile_or_path, exact=False)
    if isinstance(profile_or_path, Revolution):
        return ProfileDocument(profile_or_path.profile, axis=profile_or_path.axis,
                               angle_degrees=profile_or_path.angle_degrees, exact=False)
    raise RevolveError(f"give a file name, a Profile or a Revolution, got "
                       f"{type(profile_or_path).__name__}")


def _axis_of(axis) -> Optional[Axis]:
    if axis is None or isinstance(axis, Axis):
        return axis
    if isinstance(axis, str):
        return parse_axis(axis, option="axis")
    raise RevolveError(f"give the axis as an Axis, or as x, y or X0,Y0,DX,DY, got {axis!r}",
                       option="axis")


def measure(profile_or_path, *, axis=None, angle: Optional[float] = None, density: Any = None,
            material: Optional[str] = None, exact: bool = False,
            units: Optional[str] = None) -> MeasureResult:
    """Measure a part: section, volume, surface by face, mass, and the cross-check.

    The same computation as ``revolve measure``; ``result.to_dict()`` is
    exactly the object ``revolve measure FILE --json`` prints.

    Parameters
    ----------
    profile_or_path : str, os.PathLike, Profile, ProfileDocument or Revolution
        A profile file (any format :func:`revolve.load_profile` reads) or a
        profile built in Python.
    axis : Axis or str, optional
        ``"x"``, ``"y"``, ``"X0,Y0,DX,DY"`` or an :class:`Axis`; default: the
        file's axis, else the sketch x axis.
    angle : float, optional
        Revolution angle in degrees, above 0 and at most 360; default: the
        file's, else 360.
    density : str, pint quantity or float, optional
        With its unit (``"7850 kg/m^3"``, ``"0.284 lb/in^3"``, a pint
        quantity); a bare number is kg/m³, as on the command line, never per
        cubed profile unit. Default: the file's material or density, else no
        mass.
    material : str, optional
        A name from the material table (``"steel"``); not with ``density``.
    exact : bool
        Also work out closed forms (as ``--exact``; needs sympy).
    units : str, optional
        Length unit of files that do not say (point lists); default mm.

    Returns
    -------
    MeasureResult

    Raises
    ------
    revolve.RevolveError
        With the command line's one-sentence message.

    Examples
    --------
    >>> from revolve.geometry.profile import Loop, Profile
    >>> tube = Profile(loops=(Loop.from_points([(0, 10), (100, 10), (100, 12), (0, 12)]),),
    ...                unit="mm", name="tube")
    >>> r = measure(tube, density="7850 kg/m^3")
    >>> r
    <MeasureResult tube: volume=13823 mm³, surface_area=14099.5 mm², mass=0.108511 kg>
    >>> round(r.mass, 6)                     # π (12² − 10²) 100 mm³ × 7.85e-6 kg/mm³
    0.108511
    >>> measure(tube, density=7850).mass == r.mass       # a bare number is kg/m³
    True
    >>> round(measure(tube, angle=90).volume * 4 / r.volume, 12)    # a quarter turn
    1.0
    >>> measure(tube, density="7850 kg")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: density: 'kg' is a mass unit, not a density unit
    >>> measure(tube, density="7850", material="steel")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: density: give either material or density, not both
    >>> measure(tube, angle=400)             # the library names its own arguments
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: angle: the revolution angle must be above 0 and at most 360 degrees, got 400
    >>> measure(tube, axis="1,2")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: axis: give x, y or four numbers X0,Y0,DX,DY, got '1,2'
    >>> measure(Profile())                   # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: ...
    """
    doc = as_document(profile_or_path, units)
    if material is not None and density is not None:
        raise RevolveError("give either material or density, not both", option="density")
    if material is not None:
        dens, label, _ = material_or_density(material, None, material_option="material")
    else:
        dens, label = density_value(density)
    part = measure_document(doc, axis=_axis_of(axis), angle=angle, density=dens,
                            density_label=label, angle_option="angle")
    exact_out = None
    if exact:
        from revolve.geometry.exact import exact_results

        exact_out = exact_results(doc, part.revolution, part.measurement, exact_angle=angle)
    return measure_result(part, exact_out=exact_out)
