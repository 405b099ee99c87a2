"""``revolve turn``: stock, material removed, times and a costed quote for turned parts.

One or more profile files (or folders of them). For each part: volume, mass,
centre of mass and finished surface; the smallest standard round bar that
covers the largest diameter plus the turning allowance (``--stock tube`` a
hollow bar that suits the bore, ``--stock lighter`` whichever of the two is
lighter, ``--blank`` a blank of your own); the stock length (part length +
facing allowance at each end + parting width + holding length), its volume
and mass; the volume removed (stock − part), chips and utilisation; parts per
bar and bars for the quantity; roughing time V / Q with Q = vc · ap · f,
finishing time A / (vc · f), spindle speeds n = 1000 vc / (π D); and the cost
of stock, machine time and set-up per part and per batch.

The times are estimates: roughing counts every chip (facing and parting
included) at the roughing rate, finishing one pass over each finished face;
put loading, a slower parting-off and gauging in ``--handling-time``. Without
``--max-speed`` the cutting speed is taken to hold right down to the centre;
with it, the spindle is capped and the times follow t = L / (f n) there.

Units. Bare numbers in options are in the bar list's units: ``--bar-list
metric`` (mm; vc in m/min, f in mm/rev, ap in mm) or ``--bar-list inch`` (in;
vc in ft/min, f and ap in in). The default list follows the profile's unit.
Any length may carry its unit (``3mm``, ``0.125 in``). Tables and ``--csv``
use the list's units (mm, cm², cm³, kg or in, in², in³, lb) and minutes;
``--json`` uses SI (m, m², m³, kg, s) throughout, except keys that name their
unit (``vc_m_per_min``, ``f_mm_per_rev``, ``ap_mm``, ``*_rpm``); money is a
plain number in the currency given.

JSON keys of a part: ``part_volume``, ``part_mass``, ``part_diameter``,
``part_length``, ``bore_diameter``, ``centre_of_mass_axial``,
``centre_of_mass_from_start``, ``finished_surface_by_face``,
``finished_surface``, ``stock_kind``, ``stock_label``, ``stock_diameter``,
``stock_inside_diameter``, ``stock_length``, ``stock_volume``, ``stock_mass``,
``removed_volume``, ``removed_mass``, ``chip_volume``, ``chip_mass``,
``offcut_volume``, ``offcut_mass``, ``utilisation``, ``bars``, ``cutting_data``,
``spindle_speed_rpm``, ``times``, ``cost``, ``allowances``, ``notes``,
``cautions``. One part prints that object; several print ``{"units": ...,
"parts": [...]}``.
"""

from __future__ import annotations

import math
import os
import re
import sys
from dataclasses import dataclass
from typing import Dict, List, Optional, Tuple

import typer

from revolve.cli import common
from revolve.errors import RevolveError

DEFAULT_TOLERANCE = 1e-9
INCH_UNITS = ("in", "ft", "yd", "mil")


# -- reading the options ----------------------------------------------------------------


def length_option(text: Optional[str], option: str, unit: str, default: float,
                  positive: bool = False) -> float:
    """A length option in metres; a bare number is in ``unit``; None gives ``default``.

    >>> length_option("3", "--parting-width", "mm", 0.0), length_option("0.125in", "--x", "mm", 0.0)
    (0.003, 0.003175)
    >>> length_option("-1", "--facing-allowance", "mm", 0.0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --facing-allowance: must be zero or positive, got '-1'
    """
    from revolve import units

    if text is None:
        return default
    try:
        value = units.parse_quantity(text, "length", default_unit=unit)
    except RevolveError as e:
        raise RevolveError(e.message, place=option) from None
    if value < 0 or (positive and value == 0):
        raise RevolveError(f"must be {'positive' if positive else 'zero or positive'}, got "
                           f"{text.strip()!r}", place=option)
    return value


def blank_option(text: Optional[str], length: Optional[str], unit: str):
    """``--blank OD`` or ``OD x ID`` (and ``--blank-length``) as a StockSize, or None.

    >>> b = blank_option("60x30", "85", "mm")
    >>> b.outside_diameter, b.inside_diameter, b.length, b.label
    (0.06, 0.03, 0.085, '60 × 30 mm')
    >>> blank_option(None, "85", "mm")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --blank-length: give --blank with it
    """
    from revolve.jobs.turning import StockSize
    from revolve.units import factor

    if text is None:
        if length is not None:
            raise RevolveError("give --blank with it", place="--blank-length")
        return None
    parts = [p.strip() for p in re.split(r"[x×X*]", text)]
    if len(parts) not in (1, 2) or not all(parts):
        raise RevolveError(f"give the outside diameter, or outside x inside, e.g. '60' or '60x30'; "
                           f"got {text!r}", place="--blank")
    od = length_option(parts[0], "--blank", unit, 0.0, positive=True)
    idia = length_option(parts[1], "--blank", unit, 0.0) if len(parts) == 2 else 0.0
    if idia >= od:
        raise RevolveError("the inside diameter must be smaller than the outside", place="--blank")
    blen = None if length is None else length_option(length, "--blank-length", unit, 0.0,
                                                     positive=True)
    f = factor(unit, "length")
    label = f"{od / f:.6g}" + (f" × {idia / f:.6g}" if idia else "") + f" {unit}"
    return StockSize(od, idia, label, "blank", "given", blen)


_PRICE = re.compile(r"\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+))\s*(?:/|per\s)\s*(\S+)\s*$", re.I)


def stock_price_option(text: Optional[str]) -> Tuple[Optional[float], str]:
    """``2.40/kg``, ``1.10/lb``, ``5.10/m``, ``1.55/ft`` -> (price per kg or per m, basis).

    >>> stock_price_option("2.40/kg"), stock_price_option("6 per m")
    ((2.4, 'kg'), (6.0, 'm'))
    >>> round(stock_price_option("1/lb")[0], 9)        # 1 lb = 0.45359237 kg (1959)
    2.204622622
    >>> stock_price_option("2.40")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --stock-price: say what the price is per, e.g. '2.40/kg', '1.10/lb', '5.10/m' or '1.55/ft'; got '2.40'
    """
    from revolve import units

    if text is None:
        return None, "kg"
    m = _PRICE.fullmatch(text)
    if m is None:
        raise RevolveError(f"say what the price is per, e.g. '2.40/kg', '1.10/lb', '5.10/m' or "
                           f"'1.55/ft'; got {text.strip()!r}", place="--stock-price")
    value, unit = float(m.group(1)), m.group(2)
    if value < 0:
        raise RevolveError(f"must be zero or positive, got {text.strip()!r}", place="--stock-price")
    for kind, basis in (("mass", "kg"), ("length", "m")):
        try:
            return value / units.factor(unit, kind), basis
        except RevolveError:
            continue
    raise RevolveError(f"'{unit}' is neither a mass nor a length unit; give a price per kg, lb, "
                       f"m or ft", place="--stock-price")


def rate_option(text: Optional[str]) -> Optional[float]:
    """Machine rate per hour: ``85``, ``85/h``, ``1.5/min``.

    >>> rate_option("85"), rate_option("1.5/min"), rate_option(None)
    (85.0, 90.0, None)
    """
    from revolve import units

    if text is None:
        return None
    m = _PRICE.fullmatch(text)
    try:
        if m is None:
            value, per = float(text), 3600.0
        else:
            value, per = float(m.group(1)), units.factor(m.group(2), "time")
    except (ValueError, RevolveError):
        raise RevolveError(f"give a rate per hour such as '85' or '85/h'; got {text.strip()!r}",
                           place="--machine-rate") from None
    if not math.isfinite(value) or value < 0:
        raise RevolveError(f"must be zero or positive, got {text.strip()!r}", place="--machine-rate")
    return value * 3600.0 / per


def time_option(text: Optional[str], option: str) -> float:
    """A time in seconds; a bare number is in minutes.

    >>> time_option("45", "--setup-time"), time_option("30 s", "--handling-time"), time_option(None, "x")
    (2700.0, 30.0, 0.0)
    """
    from revolve import units

    if text is None:
        return 0.0
    try:
        value = units.parse_quantity(text, "time", default_unit="min")
    except RevolveError as e:
        raise RevolveError(e.message, place=option) from None
    if value < 0:
        raise RevolveError(f"must be zero or positive, got {text.strip()!r}", place=option)
    return value


def speed_option(text: Optional[str]) -> Optional[float]:
    """Machine speed limit in rev/min (``3000`` or ``3000 rpm``) -> rev/s.

    >>> speed_option("3000 rpm"), speed_option(None)
    (50.0, None)
    """
    if text is None:
        return None
    t = re.sub(r"\s*(rpm|rev/min|r/min|min\^-1|1/min)\s*$", "", text.strip(), flags=re.I)
    try:
        value = float(t)
    except ValueError:
        raise RevolveError(f"give the spindle speed limit in rev/min, e.g. '3000'; got "
                           f"{text.strip()!r}", place="--max-speed") from None
    if not math.isfinite(value) or value <= 0:
        raise RevolveError(f"must be positive, got {text.strip()!r}", place="--max-speed")
    return value / 60.0


_CUT_UNITS = {
    "vc": {"m/min": 1 / 60, "ft/min": 0.3048 / 60, "sfm": 0.3048 / 60, "fpm": 0.3048 / 60,
           "m/s": 1.0},
    "f": {"mm": 1e-3, "mm/rev": 1e-3, "in": 0.0254, "in/rev": 0.0254, "ipr": 0.0254},
    "ap": {"mm": 1e-3, "in": 0.0254},
}
_CUT_DEFAULT = {"metric": {"vc": "m/min", "f": "mm/rev", "ap": "mm"},
                "inch": {"vc": "ft/min", "f": "in/rev", "ap": "in"}}
_CUT_ITEM = re.compile(r"\s*(vc|f|ap)\s*=\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*"
                       r"([A-Za-z/]*)\s*$")


def cutting_option(text: Optional[str], base, system: str, option: str):
    """Override some of vc, f, ap: ``vc=220,f=0.25`` (bare numbers in the list's units).

    >>> from revolve.jobs.turning import CuttingData
    >>> base = CuttingData.from_trade_units(200, 0.3, 3)
    >>> cutting_option("vc=250, ap=2mm", base, "metric", "--roughing").trade_units()
    (250.0, 0.3, 2.0)
    >>> cutting_option("vc=500sfm,f=0.012in", base, "metric", "--roughing").trade_units()
    (152.4, 0.3048, 3.0)
    >>> cutting_option("speed=3", base, "metric", "--roughing")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --roughing: write vc=..., f=..., ap=... separated by commas (vc in m/min, f in mm/rev, ap in mm); got 'speed=3'
    """
    from dataclasses import replace

    if text is None:
        return base
    d = _CUT_DEFAULT[system]
    fields = {"vc": "cutting_speed", "f": "feed", "ap": "depth_of_cut"}
    changes = {}
    for item in text.split(","):
        m = _CUT_ITEM.fullmatch(item)
        if m is None:
            raise RevolveError(f"write vc=..., f=..., ap=... separated by commas (vc in {d['vc']}, "
                               f"f in {d['f']}, ap in {d['ap']}); got {item.strip()!r}",
                               place=option)
        key, number, unit = m.group(1), float(m.group(2)), (m.group(3) or d[m.group(1)]).lower()
        if unit not in _CUT_UNITS[key]:
            raise RevolveError(f"{key} in {', '.join(_CUT_UNITS[key])}, not {unit!r}", place=option)
        if not number > 0:
            raise RevolveError(f"{key} must be positive, got {m.group(2)}", place=option)
        changes[fields[key]] = number * _CUT_UNITS[key][unit]
    try:
        return replace(base, **changes)
    except RevolveError as e:
        raise RevolveError(e.message, place=option) from None


def _quantities(values: Optional[List[int]], count: int) -> List[int]:
    values = list(values or [1])
    for q in values:
        if q < 1:
            raise RevolveError(f"must be a whole number of at least 1, got {q}", place="--quantity")
    if len(values) == 1:
        return values * count
    if len(values) != count:
        raise RevolveError(f"give --quantity once (for every profile) or once per profile, in order "
                           f"({count} profile{'s' if count != 1 else ''}), got it {len(values)} "
                           f"times", place="--quantity")
    return values


# -- display units ------------------------------------------------------------------------


@dataclass(frozen=True)
class DisplayUnits:
    """Units of the tables and the CSV: the bar list's system."""

    system: str
    length: str
    area: str
    volume: str
    mass: str
    length_factor: float  # metre -> display
    area_factor: float
    volume_factor: float
    mass_factor: float

    @classmethod
    def of(cls, system: str) -> "DisplayUnits":
        """The units of ``system`` ("metric" or "inch").

        >>> u = DisplayUnits.of("inch")
        >>> u.length, u.mass, round(u.length_factor * 0.0254, 12)
        ('in', 'lb', 1.0)
        """
        if system == "inch":
            i = 0.0254
            return cls("inch", "in", "in²", "in³", "lb", 1 / i, 1 / i ** 2, 1 / i ** 3,
                       1 / 0.45359237)
        return cls("metric", "mm", "cm²", "cm³", "kg", 1e3, 1e4, 1e6, 1.0)

    def cutting(self, cd) -> str:
        """vc, f, ap as the trade writes them in this system.

        >>> from revolve.jobs.turning import CuttingData
        >>> DisplayUnits.of("metric").cutting(CuttingData.from_trade_units(200, 0.3, 3))
        'vc 200 m/min, f 0.3 mm/rev, ap 3 mm'
        >>> DisplayUnits.of("inch").cutting(CuttingData.from_trade_units(304.8, 0.254, 2.54))
        'vc 1000 ft/min, f 0.01 in/rev, ap 0.1 in'
        """
        if self.system == "inch":
            return (f"vc {cd.cutting_speed * 60 / 0.3048:.4g} ft/min, f {cd.feed / 0.0254:.4g} "
                    f"in/rev, ap {cd.depth_of_cut / 0.0254:.4g} in")
        vc, f, ap = cd.trade_units()
        return f"vc {vc:.4g} m/min, f {f:.4g} mm/rev, ap {ap:.4g} mm"

    def rate(self, q: float) -> str:
        """A metal removal rate (m³/s), in cm³/min or in³/min.

        >>> DisplayUnits.of("metric").rate(180e-6 / 60)
        '180 cm³/min'
        """
        return f"{q * 60 * self.volume_factor:.4g} {self.volume}/min"


def _system_of(unit: str) -> str:
    return "inch" if unit in INCH_UNITS else "metric"


# -- one part -----------------------------------------------------------------------------


@dataclass(frozen=True)
class PartQuote:
    file: str
    name: str
    material: object
    cutting_source: str
    quote: object
    agrees: bool


def _quote_doc(doc, path: str, settings: dict, quantity: int) -> PartQuote:
    """Quote a part from its document, already read (each file is read once)."""
    from dataclasses import replace

    from revolve import materials, units
    from revolve.geometry.checks import prepare
    from revolve.geometry.measure import measure
    from revolve.geometry.profile import Revolution
    from revolve.jobs import turning, turning_data

    ax = settings["axis"] or doc.axis or common.parse_axis("x")
    angle = doc.angle_degrees if doc.angle_degrees is not None else 360.0
    try:
        rev = Revolution(doc.profile, ax, angle)
    except RevolveError as e:
        raise e.located(file=doc.file, line=doc.line_of("angle"), place="angle")
    name_given = settings["material"]
    if name_given:
        try:
            material = materials.find_material(name_given)
        except RevolveError as e:
            raise e.located(place="--material")
    elif doc.material:
        try:
            material = materials.find_material(doc.material)
        except RevolveError as e:
            raise e.located(file=doc.file, line=doc.line_of("material"), place="material")
    else:
        where = "the file gives only a density; " if doc.density else ""
        raise RevolveError(f"{where}give --material NAME (the material sets the density and the "
                           f"cutting data)", file=doc.file, place="material")
    try:
        group = turning_data.cutting_data_for(material.group)
    except RevolveError as e:
        raise e.located(file=doc.file if not name_given else None,
                        place="--material" if name_given else "material")
    system = settings["system"]
    job = settings["job"]
    job = replace(job,
                  roughing=cutting_option(settings["roughing"], group.roughing, system,
                                          "--roughing"),
                  finishing=cutting_option(settings["finishing"], group.finishing, system,
                                           "--finishing"),
                  prices=replace(job.prices, quantity=quantity))
    length_factor = units.factor(doc.profile.unit, "length")
    try:
        prep = prepare(doc.profile, ax)
        m = measure(rev)
        q = turning.quote(m, prep, material.density, job, length_factor)
    except RevolveError as e:
        raise e.located(file=doc.file)
    agrees = m.crosscheck is None or m.crosscheck.agrees(settings["tolerance"])
    return PartQuote(doc.file or path, doc.name or os.path.basename(path), material,
                     group.source, q, agrees)


# -- JSON and CSV -------------------------------------------------------------------------


def _quote_dict(pq: PartQuote, currency: Optional[str]) -> Dict:
    """A part's quote as a JSON object, SI units (see the module docs)."""
    q = pq.quote
    p, s, r, t, c, job = q.part, q.stock, q.removal, q.times, q.cost, q.job
    e = p.envelope
    a = job.allowances

    def rpm(rev_per_s):
        return None if rev_per_s is None else float(f"{rev_per_s * 60.0:.12g}")

    def cd(x):
        vc, f, ap = x.trade_units()
        return {"vc_m_per_min": vc, "f_mm_per_rev": f, "ap_mm": ap}

    out = {
        "units": {"length": "m", "area": "m²", "volume": "m³", "mass": "kg", "time": "s",
                  "density": "kg/m³", "money": currency or None},
        "file": pq.file, "name": pq.name,
        "material": {"key": pq.material.key, "name": pq.material.name,
                     "density": pq.material.density, "group": pq.material.group,
                     "source": pq.material.source},
        "part_volume": p.volume, "part_mass": p.mass,
        "part_diameter": e.diameter, "part_length": e.length,
        "bore_diameter": e.bore_diameter if e.through_bore else None,
        "centre_of_mass_axial": p.centre_of_mass_axial,
        "centre_of_mass_from_start": p.centre_of_mass_from_start,
        "finished_surface_by_face": {k: p.surface_by_face[k] for k in t.finished_faces},
        "finished_surface": t.finished_area,
        "stock_kind": s.size.kind, "stock_label": s.size.label, "stock_source": s.size.source,
        "stock_diameter": s.size.outside_diameter,
        "stock_inside_diameter": s.size.inside_diameter,
        "stock_length": s.length, "stock_volume": s.volume, "stock_mass": s.mass,
        "removed_volume": r.removed_volume, "removed_mass": r.removed_mass,
        "chip_volume": r.chip_volume, "chip_mass": r.chip_mass, "offcut_volume": r.offcut_volume,
        "offcut_mass": r.offcut_mass,
        "utilisation": r.utilisation,
        "allowances": {"turning_on_diameter": a.turning, "bore_on_diameter": a.bore,
                       "facing_per_end": a.facing, "parting_width": a.parting_width,
                       "holding_length": a.holding_length},
        "bars": None if q.bars is None else {
            "bar_length": q.bars.bar_length, "remnant": q.bars.remnant,
            "length_per_part": q.bars.length_per_part, "parts_per_bar": q.bars.parts_per_bar,
            "quantity": q.bars.quantity, "bars_needed": q.bars.bars_needed,
            "parts_on_last_bar": q.bars.parts_on_last_bar,
            "unused_per_bar": q.bars.unused_per_bar},
        "cutting_data": {"roughing": cd(job.roughing), "finishing": cd(job.finishing),
                         "source": pq.cutting_source if _is_table(pq) else "given"},
        "metal_removal_rate": _mrr(job.roughing),
        "spindle_speed_rpm": {"roughing_at_stock_diameter": rpm(t.roughing_speed),
                              "finishing_at_part_diameter": rpm(t.finishing_speed),
                              "limit": rpm(t.speed_limit),
                              "roughing_over_limit": t.roughing_limited,
                              "finishing_over_limit": t.finishing_limited,
                              "roughing_limit_diameter": t.roughing_limit_diameter or None,
                              "finishing_limit_diameter": t.finishing_limit_diameter or None},
        "times": {"roughing": t.roughing, "finishing": t.finishing, "handling": t.handling,
                  "cycle": t.cycle, "setup": t.setup},
        "cost": {"quantity": c.quantity, "stock_per_part": c.stock_per_part,
                 "machine_per_part": c.machine_per_part, "setup_per_part": c.setup_per_part,
                 "per_part": c.per_part, "stock_batch": c.stock_batch,
                 "machine_batch": c.machine_batch, "setup_batch": c.setup_batch,
                 "batch": c.batch, "complete": c.complete,
                 "whole_bars": bool(job.prices.whole_bars and q.bars is not None)},
        "crosscheck_agrees": pq.agrees,
        "notes": list(_notes(pq)),
        "cautions": [common.CAUTIONS["turning"]],
    }
    return out


def _mrr(cd) -> float:
    from revolve.jobs.turning import metal_removal_rate

    return metal_removal_rate(cd)


def _is_table(pq: PartQuote) -> bool:
    from revolve.jobs.turning_data import cutting_data_for

    g = cutting_data_for(pq.material.group)
    return (pq.quote.job.roughing == g.roughing and pq.quote.job.finishing == g.finishing)


def _notes(pq: PartQuote) -> List[str]:
    q = pq.quote
    t = q.times
    out = list(q.notes)
    if t.speed_limit is not None:
        lim = t.speed_limit * 60
        if t.roughing_limited:
            out.append(f"roughing at the stock diameter needs {t.roughing_speed * 60:.0f} rev/min, "
                       f"over the machine limit of {lim:.0f} rev/min; the times use the limit")
        if t.finishing_limited:
            out.append(f"finishing at the part's largest diameter needs "
                       f"{t.finishing_speed * 60:.0f} rev/min, over the machine limit of "
                       f"{lim:.0f} rev/min; the times use the limit")
    if t.speed_limit is None and q.part.envelope.min_radius < 0.25 * q.part.envelope.max_radius:
        out.append("no --max-speed given: the times assume the cutting speed holds down to the "
                   "smallest diameter (facing to the centre); give the machine's limit for "
                   "realistic times")
    if not pq.agrees:
        out.append("the engine's two volume/surface computations disagree; do not use these "
                   "figures without finding out why")
    return out


def _csv_row(pq: PartQuote, u: DisplayUnits, currency: Optional[str]) -> Dict:
    """One CSV row of a part, in the display units (named in each column)."""
    q = pq.quote
    p, s, r, t, c = q.part, q.stock, q.removal, q.times, q.cost
    L, A, V, M = u.length_factor, u.area_factor, u.volume_factor, u.mass_factor
    money = f"_{currency}" if currency else ""
    e = p.envelope
    row = {
        "file": pq.file, "name": pq.name, "material": pq.material.key,
        f"part_diameter_{u.length}": e.diameter * L, f"part_length_{u.length}": e.length * L,
        f"bore_diameter_{u.length}": e.bore_diameter * L if e.through_bore else None,
        f"part_volume_{u.volume}": p.volume * V, f"part_mass_{u.mass}": p.mass * M,
        f"finished_surface_{u.area}": t.finished_area * A,
        "stock": s.size.label, "stock_kind": s.size.kind,
        f"stock_diameter_{u.length}": s.size.outside_diameter * L,
        f"stock_inside_diameter_{u.length}": s.size.inside_diameter * L,
        f"stock_length_{u.length}": s.length * L,
        f"stock_volume_{u.volume}": s.volume * V, f"stock_mass_{u.mass}": s.mass * M,
        f"removed_volume_{u.volume}": r.removed_volume * V,
        f"removed_mass_{u.mass}": r.removed_mass * M,
        f"chip_volume_{u.volume}": r.chip_volume * V, f"chip_mass_{u.mass}": r.chip_mass * M,
        f"offcut_volume_{u.volume}": r.offcut_volume * V,
        f"offcut_mass_{u.mass}": r.offcut_mass * M, "utilisation_percent": r.utilisation * 100,
        "quantity": c.quantity,
        "parts_per_bar": None if q.bars is None else q.bars.parts_per_bar,
        "bars_needed": None if q.bars is None else q.bars.bars_needed,
        "roughing_min": t.roughing / 60, "finishing_min": t.finishing / 60,
        "cycle_min": t.cycle / 60, "setup_min": t.setup / 60,
        f"stock_per_part{money}": c.stock_per_part, f"machine_per_part{money}": c.machine_per_part,
        f"setup_per_part{money}": c.setup_per_part, f"cost_per_part{money}": c.per_part,
        f"batch_cost{money}": c.batch,
    }
    # Plain ASCII column names (cm3, in2) for spreadsheets and scripts; 12 significant digits
    # drop the noise of converting to SI and back (45.00000000000001).
    ascii_name = str.maketrans({"²": "2", "³": "3"})
    return {k.translate(ascii_name): float(f"{v:.12g}") if isinstance(v, float) else v
            for k, v in row.items()}


# -- tables --------------------------------------------------------------------------------


def _money(v, currency) -> str:
    if v is None:
        return "—"
    return f"{v:,.2f}" + (f" {currency}" if currency else "")


def _minutes(seconds: float) -> str:
    return common.fmt(seconds / 60.0, 4)


def _quote_table(pq: PartQuote, u: DisplayUnits, currency: Optional[str]):
    from rich.table import Table

    q = pq.quote
    p, s, r, t, job = q.part, q.stock, q.removal, q.times, q.job
    e = p.envelope
    a = job.allowances
    L, A, V, M = u.length_factor, u.area_factor, u.volume_factor, u.mass_factor
    f = lambda v, d=6: common.fmt(v, d)  # noqa: E731
    ln = lambda v: f(v * L)  # noqa: E731
    from rich.markup import escape

    title = escape(f"{pq.name}  ({pq.file})\n{pq.material.name}, {pq.material.density:g} kg/m³ "
                   f"({pq.material.source}); {pq.material.group} cutting data")
    tb = Table(title=title, title_justify="left", show_edge=False, pad_edge=False)
    tb.add_column("")
    tb.add_column("value", justify="right")
    tb.add_column("unit")
    tb.add_column("how", overflow="fold")
    row = tb.add_row

    row("[bold]Part", "", "", "")
    row("largest diameter", ln(e.diameter), u.length, "over every segment, arc crests included")
    row("length along the axis", ln(e.length), u.length, "")
    if e.through_bore:
        row("smallest bore", ln(e.bore_diameter), u.length, "")
    row("volume", f(p.volume * V), u.volume, "Pappus: 2π · d · A")
    row("mass", f(p.mass * M), u.mass, f"volume × {p.density:g} kg/m³")
    row("centre of mass from the first end", ln(p.centre_of_mass_from_start), u.length,
        "along the axis")
    for face in t.finished_faces:
        row(escape(f"  finished: {face}"), f(p.surface_by_face[face] * A), u.area, "")
    skipped = [k for k, v in p.surface_by_face.items() if v > 0 and k not in t.finished_faces]
    row("finished surface", f(t.finished_area * A), u.area,
        escape("not finished: " + ", ".join(skipped)) if skipped else "every face")
    tb.add_section()
    row("[bold]Stock", "", "", "")
    kind = {"bar": "round bar", "tube": "tube (hollow bar)", "blank": "blank (given)"}[s.size.kind]
    src = f"{u.system} list, {s.size.source}" if s.size.kind != "blank" else ""
    row(kind, escape(s.size.label), "", src)
    if s.size.kind != "blank":
        row("  needed outside diameter", ln(e.diameter + a.turning), u.length,
            f"{ln(e.diameter)} + turning allowance {ln(a.turning)} on the diameter")
        if s.size.kind == "tube":
            row("  largest stock bore", ln(max(0.0, e.bore_diameter - a.bore)), u.length,
                f"{ln(e.bore_diameter)} − bore allowance {ln(a.bore)} on the diameter")
    how = (f"{ln(e.length)} part + 2 × {ln(a.facing)} facing + {ln(a.parting_width)} parting + "
           f"{ln(a.holding_length)} holding" if s.size.length is None else "given")
    row("stock length per part", ln(s.length), u.length, how)
    row("stock volume", f(s.volume * V), u.volume, "π/4 (D² − d²) · length")
    row("stock mass", f(s.mass * M), u.mass, "")
    tb.add_section()
    row("[bold]Material removed", "", "", "")
    row("removed volume", f(r.removed_volume * V), u.volume, "stock − part")
    row("removed mass", f(r.removed_mass * M), u.mass, "")
    if r.offcut_volume > 0:
        row("  holding piece (offcut), volume", f(r.offcut_volume * V), u.volume,
            "held in the chuck, left whole as an offcut")
        row("  holding piece (offcut), mass", f(r.offcut_mass * M), u.mass, "")
        row("  chips, volume", f(r.chip_volume * V), u.volume, "removed less the holding piece")
        row("  chips, mass", f(r.chip_mass * M), u.mass, "")
    row("utilisation", f"{r.utilisation * 100:.1f}", "%", "part mass / stock mass")
    if q.bars is not None:
        b = q.bars
        tb.add_section()
        row("[bold]Bars", "", "", "")
        row("bar length", ln(b.bar_length), u.length, f"remnant {ln(b.remnant)}")
        row("parts per bar", str(b.parts_per_bar), "",
            f"floor(({ln(b.bar_length)} − {ln(b.remnant)}) / {ln(b.length_per_part)})")
        row(f"bars for {b.quantity} part{'s' if b.quantity != 1 else ''}", str(b.bars_needed), "",
            f"last bar: {b.parts_on_last_bar} part{'s' if b.parts_on_last_bar != 1 else ''}")
    tb.add_section()
    row("[bold]Time per part", "", "", "")
    from revolve.jobs.turning import metal_removal_rate

    row("roughing", _minutes(t.roughing), "min",
        f"chips {f(r.chip_volume * V)} {u.volume} / Q; Q = vc·ap·f = "
        f"{u.rate(metal_removal_rate(job.roughing))} ({u.cutting(job.roughing)})")
    row("  spindle speed at the stock diameter", f"{t.roughing_speed * 60:.0f}", "rev/min",
        f"n = vc / (π D), D = {ln(s.size.outside_diameter)} {u.length}"
        + ("  OVER THE LIMIT" if t.roughing_limited else ""))
    fin = job.finishing
    row("finishing", _minutes(t.finishing), "min",
        f"A / (vc·f) = {f(t.finished_area * A)} {u.area} at {u.cutting(fin).rsplit(', ap', 1)[0]}")
    row("  spindle speed at the largest diameter", f"{t.finishing_speed * 60:.0f}", "rev/min",
        f"D = {ln(e.diameter)} {u.length}" + ("  OVER THE LIMIT" if t.finishing_limited else ""))
    if t.speed_limit is not None:
        def below(d, what):
            if d >= s.size.outside_diameter:
                return f"all of the {what}"
            return f"{what} below ⌀{ln(d)} {u.length}"
        row("  machine speed limit", f"{t.speed_limit * 60:.0f}", "rev/min",
            f"reached in {below(t.roughing_limit_diameter, 'roughing')} and "
            f"{below(t.finishing_limit_diameter, 'finishing')}; the times use the limit there "
            f"(t = L / (f n))")
    if t.handling:
        row("handling", _minutes(t.handling), "min", "given")
    row("cycle", _minutes(t.cycle), "min", "roughing + finishing + handling")
    if t.setup:
        row("set-up, once per batch", _minutes(t.setup), "min", "given")
    return tb


def _cost_table(pq: PartQuote, currency: Optional[str], price_text: Optional[str],
                rate_text: Optional[str]):
    from rich.table import Table

    c = pq.quote.cost
    job = pq.quote.job
    tb = Table(title=f"Cost, batch of {c.quantity}", title_justify="left", show_edge=False,
               pad_edge=False)
    tb.add_column("")
    tb.add_column("per part", justify="right")
    tb.add_column("batch", justify="right")
    tb.add_column("how", overflow="fold")
    pr = job.prices
    if pr.stock_price is None:
        stock_how = "no --stock-price given"
    else:
        stock_how = f"at {price_text.strip()}" + (" per stock length" if pr.basis == "m" else
                                                   " × stock mass")
        if pr.whole_bars and pq.quote.bars is not None:
            stock_how += f", {pq.quote.bars.bars_needed} whole bars"
    rate_how = "no --machine-rate given" if pr.machine_rate is None else \
        f"{pr.machine_rate:.6g} per hour × cycle" + (f" ({rate_text.strip()})" if "/" in rate_text
                                                     else "")
    tb.add_row("stock", _money(c.stock_per_part, currency), _money(c.stock_batch, currency),
               stock_how)
    tb.add_row("machine time", _money(c.machine_per_part, currency),
               _money(c.machine_batch, currency), rate_how)
    tb.add_row("set-up", _money(c.setup_per_part, currency), _money(c.setup_batch, currency),
               "rate × set-up time, shared over the batch")
    tb.add_section()
    tb.add_row("[bold]total", _money(c.per_part, currency), _money(c.batch, currency),
               "" if c.complete else "incomplete: give " + " and ".join(
                   o for o, v in (("--stock-price", pr.stock_price), ("--machine-rate", pr.machine_rate))
                   if v is None),
               style="bold")
    return tb


def _row_cells(pq: PartQuote, u: DisplayUnits, one_qty: bool) -> List[str]:
    """The cells of a part's row in the many-parts table (display units)."""
    L, M = u.length_factor, u.mass_factor
    f = lambda v: common.fmt(v, 4)  # noqa: E731
    q = pq.quote
    e = q.part.envelope
    b = q.bars
    c = q.cost
    label = q.stock.size.label
    if q.stock.size.kind == "blank":
        label = "blank " + label
    cells = [os.path.splitext(os.path.basename(pq.file))[0], pq.material.key,
             f"{f(e.diameter * L)} × {f(e.length * L)}", label,
             f(q.stock.length * L), f(q.part.mass * M), f(q.stock.mass * M),
             f"{q.removal.utilisation * 100:.0f}"]
    if not one_qty:
        cells.append(str(c.quantity))
    cells += ["—" if b is None else str(b.bars_needed), _minutes(q.times.cycle),
              _money(c.per_part, None), _money(c.batch, None)]
    return cells


def _rows_text(rows: List["QuoteRow"], u: DisplayUnits, currency: Optional[str],
               quantities: List[int]) -> str:
    """One row per part as plain aligned text (cheap for thousands of parts), and the total."""
    from revolve.cli.rows import plain_table

    one_qty = len(set(quantities)) == 1
    title = f"{len(rows)} turned parts, {u.system} bar list"
    if one_qty:
        title += f", {quantities[0]} of each"
    heads = [("part", "left"), ("material", "left"), (f"⌀ × length, {u.length}", "right"),
             ("stock", "left"), (f"stock length, {u.length}", "right"),
             (f"part, {u.mass}", "right"), (f"stock, {u.mass}", "right"), ("used %", "right")]
    if not one_qty:
        heads.append(("qty", "right"))
    heads += [("bars", "right"), ("min/part", "right"), ("per part", "right"),
              ("batch", "right")]
    cells = [r.cells for r in rows]
    costs = [r.batch_cost for r in rows if r.batch_cost is not None]
    if costs:
        cells.append(["total"] + [""] * (len(heads) - 2) + [_money(math.fsum(costs), currency)])
    return plain_table([h for h, _ in heads], cells,
                       right=[k for k, (_, just) in enumerate(heads) if just == "right"],
                       title=title)


@dataclass(frozen=True)
class QuoteRow:
    """What the many-parts outputs need of a quoted part, made where it was quoted (small)."""

    file: str
    cells: List[str]
    json: Optional[Dict]
    csv: Optional[Dict]
    batch_cost: Optional[float]
    notes: List[str]
    agrees: bool
    speed_limited: bool
    speed_limit_rpm: Optional[float]


@dataclass(frozen=True)
class TurnOutcome:
    """One part of ``turn``: the profile's unit (None if unread) and its quote or its error."""

    unit: Optional[str]
    quote: object = None
    error: Optional[RevolveError] = None


@dataclass(frozen=True)
class TurnTask:
    """Quote one ``(path, quantity)`` (picklable; run by :func:`revolve.jobs.batch.run_many`).

    With ``rows`` the outcome carries a :class:`QuoteRow` (what the many-parts
    table, JSON and CSV need) instead of the whole quote.
    """

    settings: Dict
    currency: Optional[str] = None
    rows: bool = False
    one_qty: bool = True
    want_json: bool = False
    want_csv: bool = False

    def __call__(self, item) -> TurnOutcome:
        path, quantity = item
        try:
            doc = common.load(path, unit=self.settings["units"])
        except RevolveError as e:
            return TurnOutcome(None, error=e)
        try:
            pq = _quote_doc(doc, path, self.settings, quantity)
        except RevolveError as e:
            return TurnOutcome(doc.profile.unit, error=e)
        if not self.rows:
            return TurnOutcome(doc.profile.unit, quote=pq)
        u = DisplayUnits.of(self.settings["system"])
        t = pq.quote.times
        row = QuoteRow(
            file=pq.file, cells=_row_cells(pq, u, self.one_qty),
            json=_quote_dict(pq, self.currency) if self.want_json else None,
            csv=_csv_row(pq, u, self.currency) if self.want_csv else None,
            batch_cost=pq.quote.cost.batch, notes=_notes(pq), agrees=pq.agrees,
            speed_limited=bool(t.roughing_limited or t.finishing_limited),
            speed_limit_rpm=None if t.speed_limit is None else t.speed_limit * 60)
        return TurnOutcome(doc.profile.unit, quote=row)


# -- the command ---------------------------------------------------------------------------


def run_turn(profiles: List[str], *, material: Optional[str] = None, axis: Optional[str] = None,
             units: Optional[str] = None, bar_list: Optional[str] = None, stock: str = "bar",
             blank: Optional[str] = None, blank_length: Optional[str] = None,
             turning_allowance: Optional[str] = None, bore_allowance: Optional[str] = None,
             facing_allowance: Optional[str] = None, parting_width: Optional[str] = None,
             holding_length: Optional[str] = None, bar_length: Optional[str] = None,
             remnant: Optional[str] = None, quantity: Optional[List[int]] = None,
             stock_price: Optional[str] = None, machine_rate: Optional[str] = None,
             setup_time: Optional[str] = None, handling_time: Optional[str] = None,
             whole_bars: bool = False, roughing: Optional[str] = None,
             finishing: Optional[str] = None, max_speed: Optional[str] = None,
             no_finish: Optional[List[str]] = None, currency: Optional[str] = None,
             as_json: bool = False, csv_file: Optional[str] = None,
             tolerance: float = DEFAULT_TOLERANCE, workers: Optional[int] = None,
             serial_below: Optional[int] = None) -> int:
    """Quote every profile; print tables or JSON, write CSV; nothing is written on an error.

    Every file is read once, by the part's own task; the parts run through
    :func:`revolve.jobs.batch.run_many` (on every core for large batches).
    """
    from revolve.jobs import batch, turning, turning_data

    batch.check_workers(workers)
    paths, left_out = common.profile_paths(profiles, skip=csv_file)
    if stock not in turning.STOCK_CHOICES:
        raise RevolveError(f"choose {', '.join(turning.STOCK_CHOICES)}, not {stock!r}",
                           place="--stock")
    if not tolerance > 0:
        raise RevolveError("must be a positive number", place="--tolerance")

    def settings_for(system: str) -> dict:
        """Every option read in the units of ``system``'s bar list (errors name the option)."""
        bl = turning_data.load_bar_list(system)
        d, unit = bl.defaults, bl.unit
        allowances = turning.Allowances(
            turning=length_option(turning_allowance, "--turning-allowance", unit,
                                  d.turning_allowance),
            bore=length_option(bore_allowance, "--bore-allowance", unit, d.bore_allowance),
            facing=length_option(facing_allowance, "--facing-allowance", unit, d.facing_allowance),
            parting_width=length_option(parting_width, "--parting-width", unit, d.parting_width),
            holding_length=length_option(holding_length, "--holding-length", unit,
                                         d.holding_length))
        the_blank = blank_option(blank, blank_length, unit)
        if the_blank is not None and stock != "bar":
            raise RevolveError("give either --blank or --stock tube/lighter, not both",
                               place="--blank")
        if the_blank is not None and whole_bars:
            raise RevolveError("a blank is not cut from bars; leave out --whole-bars or --blank",
                               place="--whole-bars")
        price, basis = stock_price_option(stock_price)
        prices = turning.Prices(stock_price=price, basis=basis,
                                machine_rate=rate_option(machine_rate),
                                setup_time=time_option(setup_time, "--setup-time"),
                                handling_time=time_option(handling_time, "--handling-time"),
                                whole_bars=whole_bars)
        placeholder = turning.CuttingData(1.0, 1.0, 1.0)
        job = turning.TurningJob(
            allowances=allowances, roughing=placeholder, finishing=placeholder,
            bars=bl.round_bars, tubes=bl.tubes, choice=stock, blank=the_blank,
            bar_length=length_option(bar_length, "--bar-length", unit, d.bar_length,
                                     positive=True),
            remnant=length_option(remnant, "--remnant", unit, d.remnant), prices=prices,
            speed_limit=speed_option(max_speed), skip_faces=tuple(no_finish or ()),
            display_unit=unit)
        return {"units": units, "axis": common.parse_axis(axis), "material": material,
                "system": system, "job": job, "roughing": roughing, "finishing": finishing,
                "tolerance": tolerance}

    if bar_list is None:
        # The profiles decide: inch when every one is drawn in inch units. Each file is read once,
        # by its part: quote with the first file's system, and again in the rare mixed batch whose
        # first file is in inches.
        try:
            first = common.load(paths[0], unit=units).profile.unit
        except RevolveError:
            first = "mm"  # reported properly when the part is quoted
        system = _system_of(first)
    else:
        system = bar_list.strip().lower()
    settings = settings_for(system)
    counts = _quantities(quantity, len(paths))
    many = len(paths) > 1
    task = TurnTask(settings, currency=currency, rows=many, one_qty=len(set(counts)) == 1,
                    want_json=as_json, want_csv=csv_file is not None)
    items = list(zip(paths, counts))

    def quote_all(task):
        from revolve.cli.rows import progress_bar

        with progress_bar(len(items), "quoting") as advance:
            pool = {} if serial_below is None else {"serial_below": serial_below}
            return [r.value for r in batch.run_many(task, items, workers=workers,
                                                    progress=advance, **pool)]

    outcomes = quote_all(task)
    if bar_list is None:
        found = "inch" if all(o.unit is not None and _system_of(o.unit) == "inch"
                              for o in outcomes) else "metric"
        if found != system:
            system = found
            settings = settings_for(system)
            task = TurnTask(settings, currency=task.currency, rows=task.rows,
                            one_qty=task.one_qty, want_json=task.want_json,
                            want_csv=task.want_csv)
            outcomes = quote_all(task)
    for o in outcomes:
        if o.error is not None:
            raise o.error
    u = DisplayUnits.of(system)
    if not many:
        return _print_one(outcomes[0].quote, u, currency, as_json, csv_file, stock_price,
                          machine_rate, tolerance, left_out)
    rows: List[QuoteRow] = [o.quote for o in outcomes]
    if csv_file is not None:
        from revolve.cli.tables import write_csv

        write_csv([r.csv for r in rows], csv_file)
    if as_json:
        common.print_json({"units": rows[0].json["units"], "parts": [r.json for r in rows],
                           "cautions": [common.CAUTIONS["turning"]]})
    else:
        out = [_rows_text(rows, u, currency, counts)]
        for r in rows:
            stem = os.path.splitext(os.path.basename(r.file))[0]
            out.extend(f"note: {stem}: {note}" for note in r.notes)
        out.extend(f"left out {other}: not a profile (no [[loop]] or [[chain]])"
                   for other in left_out)
        if csv_file is not None:
            out.append(f"wrote {csv_file}")
        sys.stdout.write("\n".join(out) + "\n\n")
        common.console().print(common.caution_panel(["turning"]))
    for r in rows:
        if r.speed_limited:
            print(f"revolve: {r.file}: the spindle speed needed is over the machine limit "
                  f"({r.speed_limit_rpm:.0f} rev/min); check the machine's limit for this "
                  f"stock's size and balance", file=sys.stderr)
    bad = [r.file for r in rows if not r.agrees]
    if bad:
        print(f"revolve: the two computations disagree by more than {tolerance:g} (relative) for "
              f"{', '.join(bad)}; do not use these figures without finding out why",
              file=sys.stderr)
        return 1
    return 0


def _print_one(pq: PartQuote, u: DisplayUnits, currency, as_json, csv_file, stock_price,
               machine_rate, tolerance, left_out) -> int:
    """One part: the quote and cost tables (or its JSON object), as before many parts existed."""
    if csv_file is not None:
        from revolve.cli.tables import write_csv

        write_csv([_csv_row(pq, u, currency)], csv_file)
    if as_json:
        common.print_json(_quote_dict(pq, currency))
    else:
        con = common.console()
        con.print(_quote_table(pq, u, currency))
        con.print()
        con.print(_cost_table(pq, currency, stock_price, machine_rate))
        for note in _notes(pq):
            con.print(f"note: {note}", markup=False)
        for other in left_out:
            con.print(f"left out {other}: not a profile (no [[loop]] or [[chain]])", markup=False)
        if csv_file is not None:
            con.print(f"wrote {csv_file}", markup=False)
        con.print()
        con.print(common.caution_panel(["turning"]))
    t = pq.quote.times
    if t.roughing_limited or t.finishing_limited:
        print(f"revolve: {pq.file}: the spindle speed needed is over the machine limit "
              f"({t.speed_limit * 60:.0f} rev/min); check the machine's limit for this "
              f"stock's size and balance", file=sys.stderr)
    if not pq.agrees:
        print(f"revolve: the two computations disagree by more than {tolerance:g} (relative) for "
              f"{pq.file}; do not use these figures without finding out why", file=sys.stderr)
        return 1
    return 0


def register(app: typer.Typer) -> None:
    @app.command("turn")
    def turn_command(
        profiles: List[str] = typer.Argument(..., help="Profile files, or folders of them."),
        material: Optional[str] = typer.Option(None, "--material", help="Material name from the "
                                               "material table (default: the file's); it sets the "
                                               "density and the cutting data."),
        bar_list: Optional[str] = typer.Option(None, "--bar-list", help="metric or inch stock "
                                               "list; bare numbers in options are in its units "
                                               "(mm or in). Default: inch for inch profiles."),
        stock: str = typer.Option("bar", "--stock", help="bar (round bar), tube (hollow bar "
                                  "suiting the bore), or lighter (whichever weighs less)."),
        blank: Optional[str] = typer.Option(None, "--blank", help="Your own blank instead of the "
                                            "list: OD or OD x ID, e.g. 60 or 60x30."),
        blank_length: Optional[str] = typer.Option(None, "--blank-length", help="Length of the "
                                                   "blank (default: the stock length rule)."),
        turning_allowance: Optional[str] = typer.Option(None, "--turning-allowance", help="Added "
                                                        "to the largest diameter (on the "
                                                        "diameter). Default 2 mm / 1/16 in."),
        bore_allowance: Optional[str] = typer.Option(None, "--bore-allowance", help="Taken off the "
                                                     "smallest bore for a tube's bore (on the "
                                                     "diameter). Default 2 mm / 1/16 in."),
        facing_allowance: Optional[str] = typer.Option(None, "--facing-allowance", help="Faced off "
                                                       "each end. Default 1 mm / 1/32 in."),
        parting_width: Optional[str] = typer.Option(None, "--parting-width", help="Parting tool "
                                                    "or saw width. Default 3 mm / 1/8 in."),
        holding_length: Optional[str] = typer.Option(None, "--holding-length", help="Grip length "
                                                     "per part (a blank held on its own). "
                                                     "Default 0."),
        bar_length: Optional[str] = typer.Option(None, "--bar-length", help="Bar length. Default "
                                                 "3000 mm / 144 in."),
        remnant: Optional[str] = typer.Option(None, "--remnant", help="Left over at the end of "
                                              "each bar. Default 100 mm / 4 in."),
        quantity: Optional[List[int]] = typer.Option(None, "--quantity", "-q", help="Parts in the "
                                                     "batch: once for every profile, or once per "
                                                     "profile in order. Default 1."),
        stock_price: Optional[str] = typer.Option(None, "--stock-price", help="Price of stock per "
                                                  "kg, lb, m or ft, e.g. 2.40/kg or 5.10/m."),
        machine_rate: Optional[str] = typer.Option(None, "--machine-rate", help="Machine rate per "
                                                   "hour, e.g. 85 or 85/h."),
        setup_time: Optional[str] = typer.Option(None, "--setup-time", help="Set-up time for the "
                                                 "batch, e.g. 45 (minutes) or 1.5 h."),
        handling_time: Optional[str] = typer.Option(None, "--handling-time", help="Loading, "
                                                    "parting, gauging per part, e.g. 0.5 (minutes) "
                                                    "or 30 s."),
        whole_bars: bool = typer.Option(False, "--whole-bars", help="Charge every bar the batch "
                                        "needs in full, remnants included."),
        roughing: Optional[str] = typer.Option(None, "--roughing", help="Override roughing data, "
                                               "e.g. vc=220,f=0.3,ap=3 (m/min, mm/rev, mm; "
                                               "inch list: ft/min, in/rev, in)."),
        finishing: Optional[str] = typer.Option(None, "--finishing", help="Override finishing "
                                                "data, e.g. vc=280,f=0.1."),
        max_speed: Optional[str] = typer.Option(None, "--max-speed", help="The machine's spindle "
                                                "speed limit for this work, rev/min; speeds over "
                                                "it are flagged and the times use it."),
        no_finish: Optional[List[str]] = typer.Option(None, "--no-finish", help="A face left as "
                                                      "roughed or parted: no finishing time. "
                                                      "Repeat for more."),
        currency: Optional[str] = typer.Option(None, "--currency", help="Currency label, e.g. EUR."),
        axis: Optional[str] = typer.Option(None, "--axis", help="x, y, or X0,Y0,DX,DY. Default: "
                                           "the file's axis, else x."),
        units: Optional[str] = typer.Option(None, "--units", help="Length unit of plain point "
                                            "lists. Default mm."),
        as_json: bool = typer.Option(False, "--json", help="Print JSON (SI units) instead of "
                                     "tables."),
        csv_file: Optional[str] = typer.Option(None, "--csv", help="Also write one row per part "
                                               "to this CSV file (table units)."),
        tolerance: float = typer.Option(DEFAULT_TOLERANCE, "--tolerance", help="Largest relative "
                                        "difference allowed between the engine's two "
                                        "computations before the exit code is 1."),
        workers: Optional[int] = typer.Option(None, "--workers", help="Processes for many "
                                              "parts: default one per core (from 32 parts on); "
                                              "1 runs in one process."),
    ) -> None:
        """Quote turned parts: stock, material removed, bars, times and cost."""
        code = run_turn(profiles, material=material, axis=axis, units=units, bar_list=bar_list,
                        stock=stock, blank=blank, blank_length=blank_length,
                        turning_allowance=turning_allowance, bore_allowance=bore_allowance,
                        facing_allowance=facing_allowance, parting_width=parting_width,
                        holding_length=holding_length, bar_length=bar_length, remnant=remnant,
                        quantity=quantity, stock_price=stock_price, machine_rate=machine_rate,
                        setup_time=setup_time, handling_time=handling_time,
                        whole_bars=whole_bars, roughing=roughing, finishing=finishing,
                        max_speed=max_speed, no_finish=no_finish, currency=currency,
                        as_json=as_json, csv_file=csv_file, tolerance=tolerance,
                        workers=workers)
        if code:
            raise typer.Exit(code)
