"""Pieces every command shares: options, loading, units, number formatting, output.

Rendering (tables, JSON, CSV) lives in the CLI, never in the engine. Heavy
libraries are imported inside functions only.

Examples
--------
>>> parse_axis("y")
Axis(point=(0.0, 0.0), direction=(0.0, 1.0))
>>> parse_axis("0,5,1,1").direction
(1.0, 1.0)
>>> fmt(1234.56789, 6), fmt(float("nan")), fmt(None)
('1234.57', '—', '—')
"""

from __future__ import annotations

import json
import math
import os
import re
import sys
from dataclasses import dataclass
from fractions import Fraction
from typing import Any, Dict, List, Optional, Tuple

from revolve.errors import RevolveError, UnitError, quoted
from revolve.geometry.profile import Axis

CAUTIONS = {
    "lifting": "Mass and centre of mass are estimates from nominal geometry. Rigging and lifts "
               "are planned by a competent person under local rules.",
    "vessel": "Capacity and level tables are geometry only. Wall and head thickness for "
              "pressure, supports and nozzles are for the applicable code and a licensed "
              "engineer; tables for custody transfer need certified calibration.",
    "coating": "Quantities are estimates. Follow the coating's data sheet; ventilation, fire and "
               "confined-space rules apply to work inside vessels; respect local rules on emissions.",
    "turning": "Times and costs are estimates; cutting data comes from the tool supplier. Guard "
               "rotating stock and respect the machine's speed limit for the part's size and balance.",
    "rotating": "A part spun fast stores energy: balance and speed limits are for the machine "
                "maker's data and local rules.",
}


#: Largest size of a number in ``--axis``: a coordinate whose cube still fits a float with room.
AXIS_LIMIT = 1e99

_AXIS_NUMBER = re.compile(r"[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?")


def parse_axis(text: Optional[str]) -> Optional[Axis]:
    """``x``, ``y`` or ``X0,Y0,DX,DY`` (a point on the axis and its direction); None stays None.

    Each number is a plain decimal (``1.5``, ``-2e3``) of size at most
    :data:`AXIS_LIMIT`; anything else is refused with ``--axis`` named.

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
                           option="--axis")
    vals = []
    for name, part in zip(("X0", "Y0", "DX", "DY"), parts):
        number = _AXIS_NUMBER.fullmatch(part) if len(part) <= 40 else None
        if number is None:
            raise RevolveError(f"{name} = {quoted(part)} is not a number; give four numbers "
                               f"X0,Y0,DX,DY such as 0,0,1,0", option="--axis")
        exponent = number.group(1)
        # Fraction would build 10**exponent exactly: refuse absurd exponents before it does.
        if exponent is not None and abs(int(exponent)) > 400:
            if float(part[:number.start(1) - 1]) == 0:
                part = "0"
            elif int(exponent) < 0:
                raise RevolveError(f"{name} = {part} is too small to tell from 0; write 0",
                                   option="--axis")
        huge = part != "0" and exponent is not None and int(exponent) > 400
        value = None if huge else Fraction(part)
        if huge or abs(value) > AXIS_LIMIT:
            raise RevolveError(f"{name} = {part} is out of range; each number must be between "
                               f"{-AXIS_LIMIT:g} and {AXIS_LIMIT:g}", option="--axis")
        vals.append(value)
    fl = [float(v) for v in vals]
    if fl[2] == 0 and fl[3] == 0:
        raise RevolveError("the direction DX,DY is zero; give a direction such as 1,0",
                           option="--axis")
    return Axis((fl[0], fl[1]), (fl[2], fl[3]), exact=((vals[0], vals[1]), (vals[2], vals[3])))


def load(path: str, unit: Optional[str] = None, exact: bool = False):
    """Read a profile document (any supported format); ``unit`` comes from ``--units``.

    ``exact`` (from ``--exact``) keeps exact values where the reader would not otherwise.

    >>> load("p.txt", unit="gallon")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --units: 'gallon' is a volume unit, not a length unit
    """
    from revolve import units
    from revolve.formats import load_profile

    if unit is not None:
        try:
            units.factor(unit, "length")
        except UnitError as e:
            raise e.located(option="--units")
    return load_profile(path, unit=unit, exact=exact)


def revolution_from_options(profile: str, axis: Optional[str], angle: Optional[float],
                            units: Optional[str], exact: bool = False):
    """Load a profile and build its revolution from the options, the file, then the defaults.

    Returns ``(document, revolution)``; errors name the option or the file line.

    >>> import os, tempfile
    >>> path = os.path.join(tempfile.mkdtemp(), "p.txt")
    >>> with open(path, "w") as f:
    ...     _ = f.write("0,1\\n2,1\\n2,3\\n0,3\\n")
    >>> doc, rev = revolution_from_options(path, "y", 90.0, "cm")
    >>> rev.angle_degrees, rev.axis.direction, doc.profile.unit
    (90.0, (0.0, 1.0), 'cm')
    >>> revolution_from_options(path, None, 400.0, None)
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: --angle: the revolution angle must be above 0 and at most 360 degrees, got 400
    """
    from revolve.geometry.profile import Revolution

    doc = load(profile, unit=units, exact=exact)
    ax = parse_axis(axis) or doc.axis or parse_axis("x")
    ang = angle if angle is not None else (doc.angle_degrees if doc.angle_degrees is not None else 360.0)
    try:
        rev = Revolution(doc.profile, ax, ang)
    except RevolveError as e:
        raise e.located(file=None if angle is not None else doc.file,
                        line=None if angle is not None else doc.line_of("angle"),
                        place="--angle" if angle is not None else "angle")
    return doc, rev


#: The unit of a density option given as a bare number (``--density 7850``), as the help says.
BARE_DENSITY_UNIT = "kg/m^3"


def parse_density(text: str, option: Optional[str] = None) -> float:
    """A density option in kg/m³: a number with a unit, or a bare number in kg/m³.

    This is the one reader of density options (``--density``,
    ``--liquid-density``) for every command; errors name ``option``.

    >>> parse_density("7850"), parse_density("7.85 g/cm^3"), round(parse_density("0.284 lb/in^3"))
    (7850.0, 7850.0, 7861)
    >>> parse_density("-850", "--liquid-density")
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: --liquid-density: a density must be positive, not '-850'
    >>> parse_density("7850 kg", "--density")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --density: 'kg' is a mass unit, not a density unit
    """
    from revolve import materials

    try:
        return materials.density_from_text(text, default_unit=BARE_DENSITY_UNIT)
    except RevolveError as e:
        raise e.located(option=option)


def material_or_density(material: Optional[str], density: Optional[str], *,
                        material_option: str = "--material", density_option: str = "--density"):
    """``(density in kg/m³, label, material key)`` from a material option or a density option.

    ``(None, None, None)`` when neither is given; the key is None for a
    density. Errors name the option.

    >>> material_or_density("water", None)[0], material_or_density(None, "850")[:2]
    (998.2, (850.0, '850 kg/m³ (given)'))
    >>> material_or_density("Stahl", None)  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: --material: unknown material 'Stahl'...
    >>> material_or_density("water", "1000", material_option="--liquid",
    ...                     density_option="--liquid-density")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --liquid-density: give either --liquid or --liquid-density, not both
    """
    from revolve import materials

    if material is not None and density is not None:
        raise RevolveError(f"give either {material_option} or {density_option}, not both",
                           option=density_option)
    if material is not None:
        try:
            m = materials.find_material(material)
        except RevolveError as e:
            raise e.located(option=material_option)
        return m.density, f"{m.name}, {m.density:g} kg/m³ ({m.source})", m.key
    if density is not None:
        d = parse_density(density, density_option)
        return d, f"{d:g} kg/m³ (given)", None
    return None, None, None


def resolve_density(material: Optional[str], density: Optional[str], doc=None):
    """Density in kg/m³ and a label, from options first, else the file; (None, None) if none.

    A bare number in ``--density`` is taken as kg/m³ (:func:`parse_density`);
    the file's ``density`` carries its unit.

    >>> resolve_density(None, "7850")
    (7850.0, '7850 kg/m³ (given)')
    >>> resolve_density(None, None)
    (None, None)
    """
    from revolve import materials

    if material is None and density is None and doc is not None:
        where_file = doc.file
        if doc.material:
            try:
                m = materials.find_material(doc.material)
            except RevolveError as e:
                raise e.located(file=where_file, line=doc.line_of("material"), place="material")
            return m.density, f"{m.name}, {m.density:g} kg/m³ ({m.source})"
        if doc.density:
            try:
                d = materials.density_from_text(doc.density)
            except RevolveError as e:
                raise e.located(file=where_file, line=doc.line_of("density"), place="density")
            return d, f"{d:g} kg/m³ (from the file)"
        return None, None
    d, label, _ = material_or_density(material, density)
    return d, label


@dataclass(frozen=True)
class OutputUnits:
    """Units for output and the factors from the profile's length unit (or SI for mass)."""

    length: str
    area: str
    volume: str
    mass: str
    length_factor: float
    area_factor: float
    volume_factor: float
    mass_factor: float  # from kg
    si_length: float  # profile unit -> metre

    def inertia_unit(self) -> str:
        return f"{self.mass}·{self.length}²"


def output_units(profile_unit: str, length: Optional[str] = None, area: Optional[str] = None,
                 volume: Optional[str] = None, mass: Optional[str] = None) -> OutputUnits:
    """Work out output units: each defaults to the profile's unit (squared, cubed) and kg.

    A unit that is refused names its option:

    >>> u = output_units("mm", volume="L")
    >>> u.area, u.volume, round(u.volume_factor, 15)
    ('mm²', 'L', 1e-06)
    >>> output_units("mm", volume="gallon")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --volume-unit: 'gallon' is ambiguous: write 'US_gallon' (231 in³) or 'imperial_gallon' (4.54609 L)
    >>> output_units("mm", length="kg")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --length-unit: 'kg' is a mass unit, not a length unit
    """
    from revolve import units

    def factor(text: str, kind: str, option: Optional[str]) -> float:
        try:
            return units.factor(text, kind)
        except UnitError as e:
            raise e.located(option=option)

    si = units.factor(profile_unit, "length")
    lu = length if length is not None else profile_unit
    au = area if area is not None else f"{lu}²"
    vu = volume if volume is not None else f"{lu}³"
    mu = mass if mass is not None else "kg"
    lf = si / factor(lu, "length", "--length-unit" if length is not None else None)
    af = si ** 2 / factor(_pow_unit(au, lu, 2), "area", "--area-unit" if area is not None else None)
    vf = si ** 3 / factor(_pow_unit(vu, lu, 3), "volume",
                          "--volume-unit" if volume is not None else None)
    mf = 1.0 / factor(mu, "mass", "--mass-unit" if mass is not None else None)
    return OutputUnits(lu, au, vu, mu, lf, af, vf, mf, si)


def _pow_unit(text: str, length: str, power: int) -> str:
    sup = {2: "²", 3: "³"}[power]
    if text == f"{length}{sup}":
        return f"{length}^{power}"
    return text


def fmt(value: Any, digits: int = 10) -> str:
    """A number for a table: ``digits`` significant digits, no exponent for ordinary sizes."""
    if value is None:
        return "—"
    try:
        v = float(value)
    except (TypeError, ValueError):
        return str(value)
    if not math.isfinite(v):
        return "—"
    if v == 0:
        return "0"
    mag = abs(v)
    if 1e-4 <= mag < 1e12:
        decimals = max(0, digits - 1 - int(math.floor(math.log10(mag))))
        s = f"{v:.{decimals}f}"
        if "." in s:
            s = s.rstrip("0").rstrip(".")
        return s
    return f"{v:.{digits - 1}e}"


def clean_json(obj: Any) -> Any:
    """Replace NaN/inf by None and tuples by lists, recursively, for strict JSON."""
    if isinstance(obj, float):
        return obj if math.isfinite(obj) else None
    if isinstance(obj, dict):
        return {str(k): clean_json(v) for k, v in obj.items()}
    if isinstance(obj, (list, tuple)):
        return [clean_json(v) for v in obj]
    return obj


def print_json(obj: Dict[str, Any]) -> None:
    sys.stdout.write(json.dumps(clean_json(obj), indent=2, ensure_ascii=False) + "\n")


def console():
    """A rich console on standard output (wide enough not to wrap tables in pipes)."""
    from rich.console import Console

    return Console(width=None if sys.stdout.isatty() else 110, highlight=False)


def caution_panel(kinds) -> Any:
    from rich.panel import Panel

    text = "\n".join(CAUTIONS[k] for k in kinds)
    return Panel(text, title="Caution", title_align="left", border_style="yellow", expand=False)


def fail_unit(option: str, exc: UnitError) -> UnitError:
    """The unit error ``exc`` about ``option`` (named once, first, when it is printed).

    >>> print(fail_unit("--film-unit", UnitError("unknown length unit 'mlis'")))
    --film-unit: unknown length unit 'mlis'
    """
    return exc.located(option=option)


# -- many files ------------------------------------------------------------------------------


def _not_a_profile(path: str) -> bool:
    """A TOML file in a folder that holds no [[loop]] or [[chain]] (e.g. a coating system)."""
    if os.path.splitext(path)[1].lower() != ".toml":
        return False
    try:
        with open(path, "rb") as handle:
            text = handle.read().decode("utf-8", "replace")
    except OSError:
        return False
    return not re.search(r"^\s*\[\[\s*(loop|chain)\s*\]\]", text, re.M)


def profile_paths(items: List[str], skip: Optional[str] = None) -> Tuple[List[str], List[str]]:
    """Files named, and the profile files inside folders named (sorted, not hidden).

    Returns the paths to read and the files of the folders left out because
    they are TOML files with no loop or chain (other kinds of input). ``skip``
    (the ``--csv`` target) is never read. A file named on its own is always read.

    >>> profile_paths(["a.toml", "b.txt"])
    (['a.toml', 'b.txt'], [])
    >>> import tempfile
    >>> profile_paths([tempfile.mkdtemp()])  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: ...: no profile files (.toml, ...) in this folder
    """
    from revolve.formats import READERS

    out: List[str] = []
    left_out: List[str] = []
    skip_abs = os.path.abspath(skip) if skip else None
    for item in items:
        if os.path.isdir(item):
            found = sorted(
                os.path.join(item, n) for n in os.listdir(item)
                if not n.startswith(".") and os.path.splitext(n)[1].lower() in READERS
                and os.path.isfile(os.path.join(item, n))
                and os.path.abspath(os.path.join(item, n)) != skip_abs)
            others = [f for f in found if _not_a_profile(f)]
            if others:
                skipped = set(others)
                found = [f for f in found if f not in skipped]
            if not found:
                known = ", ".join(sorted(READERS, key=lambda e: (e != ".toml", e)))
                raise RevolveError(f"no profile files ({known}) in this folder", file=item)
            out.extend(found)
            left_out.extend(others)
        else:
            out.append(item)
    return out, left_out
