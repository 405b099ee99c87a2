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
import sys
from dataclasses import dataclass
from fractions import Fraction
from typing import Any, Dict, Optional

from revolve.errors import RevolveError, UnitError
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


def parse_axis(text: Optional[str]) -> Optional[Axis]:
    """``x``, ``y`` or ``X0,Y0,DX,DY`` (a point on the axis and its direction); None stays None.

    >>> parse_axis("1,2,0") 
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --axis: give x, y or four numbers X0,Y0,DX,DY, got '1,2,0'
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
        raise RevolveError(f"--axis: give x, y or four numbers X0,Y0,DX,DY, got {text!r}")
    try:
        vals = [Fraction(p) for p in parts]
    except (ValueError, ZeroDivisionError):
        raise RevolveError(f"--axis: {text!r} is not four numbers X0,Y0,DX,DY")
    fl = [float(v) for v in vals]
    if fl[2] == 0 and fl[3] == 0:
        raise RevolveError("--axis: the direction DX,DY is zero; give a direction such as 1,0")
    return Axis((fl[0], fl[1]), (fl[2], fl[3]), exact=((vals[0], vals[1]), (vals[2], vals[3])))


def load(path: str, unit: Optional[str] = None):
    """Read a profile document (any supported format)."""
    from revolve.formats import load_profile

    return load_profile(path, unit=unit)


def revolution_from_options(profile: str, axis: Optional[str], angle: Optional[float],
                            units: Optional[str]):
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

    doc = load(profile, unit=units)
    ax = parse_axis(axis) or doc.axis or parse_axis("x")
    ang = angle if angle is not None else (doc.angle_degrees if doc.angle_degrees is not None else 360.0)
    try:
        rev = Revolution(doc.profile, ax, ang)
    except RevolveError as e:
        raise e.located(file=None if angle is not None else doc.file,
                        line=None if angle is not None else doc.line_of("angle"),
                        place="--angle" if angle is not None else "angle")
    return doc, rev


def resolve_density(material: Optional[str], density: Optional[str], doc=None):
    """Density in kg/m³ and a label, from options first, else the file; (None, None) if none.

    A bare number is taken as kg/m³.
    """
    from revolve import materials

    if material and density:
        raise RevolveError("give either --material or --density, not both")
    where_file = doc.file if doc is not None else None
    if material is None and density is None and doc is not None:
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
    if material:
        m = materials.find_material(material)
        return m.density, f"{m.name}, {m.density:g} kg/m³ ({m.source})"
    if density:
        try:
            d = materials.density_from_text(density)
        except RevolveError as e:
            raise e.located(place="--density")
        return d, f"{d:g} kg/m³ (given)"
    return None, None


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

    >>> u = output_units("mm", volume="L")
    >>> u.area, u.volume, round(u.volume_factor, 15)
    ('mm²', 'L', 1e-06)
    """
    from revolve import units

    si = units.factor(profile_unit, "length")
    lu = length or profile_unit
    au = area or (f"{lu}²" if area is None else area)
    vu = volume or f"{lu}³"
    mu = mass or "kg"
    lf = si / units.factor(lu, "length")
    af = si ** 2 / units.factor(_pow_unit(au, lu, 2), "area")
    vf = si ** 3 / units.factor(_pow_unit(vu, lu, 3), "volume")
    mf = 1.0 / units.factor(mu, "mass")
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
    return UnitError(f"{option}: {exc.message}")
