"""Turning quotes: from a file (or a profile) and the options as typed, to a :class:`TurningResult`.

The command line (``revolve turn``) and the library (:func:`quote_turning`,
:func:`quote_turning_many`) both call this module, so a result's ``to_dict()``
is exactly what ``revolve turn FILE --json`` prints. Each part is read once,
measured once (the measurement carries its prepared profile, which the
envelope and the speed-limited times read), and quoted by
:func:`revolve.jobs.turning.quote`.

Options are read here from the same text a user types: lengths with their
unit or fractions (``"1/8 in"``; a bare number is in the bar list's unit, mm
or in), prices ``"2.40/kg"``, ``"12 EUR/m"``, rates ``"85/h"``, times
``"45"`` (minutes) or ``"30 s"``, cutting data ``"vc=220,f=0.25"``.

The times are those of the operations in order
(:mod:`revolve.jobs.operations`): the envelope's features (largest diameter,
through bore) with the grooves and blind bore given, the profile below the
largest diameter roughed at one removal rate Q, finishing A / (vc f) over
the finished faces; the single removal-rate times stay in the ``times``
table as checks. Cost and price come from
:func:`revolve.jobs.operations.price_batch` (set-up, scrap, overhead,
margin); a shop's stock list (:mod:`revolve.formats.stock_list`) replaces
the built-in sizes and prices.

Units follow the ``turning`` trade (:func:`revolve.jobs.results.trade_units`):
mm, cm², cm³, kg and minutes for metric work, in, in², in³, lb for an inch
bar list; cutting speeds in m/min (ft/min), feeds and depths in mm (in) per
revolution, spindle speeds in rev/min.

Examples
--------
>>> from revolve.geometry.profile import Loop, Profile
>>> pin = Profile(loops=(Loop.from_points([(0, 0), (50, 0), (50, 15), (0, 15)], face="all"),),
...               unit="mm", name="pin")
>>> r = quote_turning(pin, material="carbon steel", quantity=100)
>>> d = r.to_dict()
>>> r.stock_label, round(d["stock"]["stock_length"], 9), d["bars"]["parts_per_bar"]
('32 mm', 55.0, 52)
>>> r.to_dict()["units"]["volume"], r.to_dict()["units"]["cutting_distance/time"]
('cm³', 'm/min')
"""

from __future__ import annotations

import math
import os
import re
from dataclasses import dataclass, field as dc_field, replace
from typing import Any, Dict, List, Mapping, Optional, Sequence, Tuple

from revolve.errors import RevolveError, quoted
from revolve.jobs.results import Field, OutputUnits, Result, Table, trade_units

__all__ = ["TurnOptions", "TurningResult", "quote_turning", "quote_turning_many",
           "quote_document", "parts_result", "quote_with", "quote_many_with", "DEFAULT_TOLERANCE"]

#: Relative tolerance of the cross-check unless told otherwise (``--tolerance``).
DEFAULT_TOLERANCE = 1e-9

_INCH_UNITS = ("in", "ft", "yd", "mil")


def system_of(unit: str) -> str:
    """The bar list a drawing in ``unit`` takes by default.

    >>> system_of("in"), system_of("mm")
    ('inch', 'metric')
    """
    return "inch" if unit in _INCH_UNITS else "metric"


# -- reading the options -------------------------------------------------------------------


def read_length(value: Any, option: str, unit: str, default: Optional[float] = None,
                positive: bool = False) -> Optional[float]:
    """A length in metres from text (``"3"``, ``"1/8 in"``), a :class:`~revolve.inputs.Length`,
    a bare number (in ``unit``) or a pint quantity; None gives ``default``.

    >>> read_length("3", "--parting-width", "mm"), read_length("1/8 in", "--x", "mm")
    (0.003, 0.003175)
    >>> read_length("-1", "--facing-allowance", "mm")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --facing-allowance: must be zero or positive, got '-1'
    >>> read_length("3 kg", "--remnant", "mm")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --remnant: 'kg' is a mass unit, not a length unit
    """
    from revolve.inputs import Length, parse_length

    if value is None:
        return default
    try:
        if isinstance(value, Length):
            metres = value.metres(unit)
        elif hasattr(value, "to") and hasattr(value, "magnitude"):        # a pint quantity
            metres = float(value.to("m").magnitude)
        else:
            metres = parse_length(value).metres(unit)
    except RevolveError as e:
        raise e.located(option=option)
    except Exception:    # pint's own errors: the caller's quantity is not a length
        raise RevolveError(f"{quoted(str(value))} is not a length", option=option) from None
    if metres < 0 or (positive and metres == 0):
        shown = value if isinstance(value, str) else f"{metres:g} m"
        raise RevolveError(f"must be {'positive' if positive else 'zero or positive'}, got "
                           f"{quoted(str(shown).strip())}", option=option)
    return metres


def read_blank(text: Optional[str], length: Any, unit: str):
    """``--blank OD`` or ``OD x ID`` (and ``--blank-length``) as a StockSize, or None.

    A unit written after the inside diameter holds for both (``"2 x 1 in"``).

    >>> b = read_blank("60x30", "85", "mm")
    >>> b.outside_diameter, b.inside_diameter, b.length, b.label
    (0.06, 0.03, 0.085, '60 × 30 mm')
    >>> read_blank("2 x 1 in", None, "mm").label
    '2 × 1 in'
    >>> read_blank(None, "85", "mm")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --blank-length: give --blank with it
    """
    from revolve.inputs import parse_length
    from revolve.jobs.turning import StockSize
    from revolve.units import factor

    if text is None:
        if length is not None:
            raise RevolveError("give --blank with it", option="--blank-length")
        return None
    parts = [p.strip() for p in re.split(r"[x×X*]", str(text))]
    if len(parts) not in (1, 2) or not all(parts):
        raise RevolveError(f"give the outside diameter, or outside x inside, e.g. '60' or '60x30'; "
                           f"got {quoted(text)}", option="--blank")
    shown = unit
    if len(parts) == 2:
        try:
            first, last = parse_length(parts[0]), parse_length(parts[1])
        except RevolveError as e:
            raise e.located(option="--blank")
        if first.unit is None and last.unit is not None:
            parts[0] = f"{parts[0]} {last.unit}"
        shown = last.unit or first.unit or unit
    else:
        try:
            shown = parse_length(parts[0]).unit or unit
        except RevolveError as e:
            raise e.located(option="--blank")
    od = read_length(parts[0], "--blank", unit, positive=True)
    idia = read_length(parts[1], "--blank", unit) if len(parts) == 2 else 0.0
    if idia >= od:
        raise RevolveError("the inside diameter must be smaller than the outside", option="--blank")
    blen = read_length(length, "--blank-length", unit, positive=True)
    f = factor(shown, "length")
    label = f"{od / f:.6g}" + (f" × {idia / f:.6g}" if idia else "") + f" {shown}"
    return StockSize(od, idia, label, "blank", "given", blen)


_PER = re.compile(r"\s*(?P<amount>[^/]+?)\s*(?:/|\bper\s)\s*(?P<unit>\S+)\s*\Z", re.I)


def read_stock_price(text: Optional[str]) -> Tuple[Optional[float], str, Optional[str]]:
    """``2.40/kg``, ``1.10/lb``, ``12 EUR/m``, ``1.55/ft`` -> (price per kg or per m, basis, currency).

    The amount is read as money (:func:`revolve.inputs.parse_money`).

    >>> read_stock_price("2.40/kg"), read_stock_price("6 EUR per m")
    ((2.4, 'kg', None), (6.0, 'm', 'EUR'))
    >>> round(read_stock_price("1/lb")[0], 9)        # 1 lb = 0.45359237 kg (1959)
    2.204622622
    >>> read_stock_price("2.40")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --stock-price: say what the price is per, e.g. '2.40/kg', '1.10/lb', '5.10/m' or '1.55/ft'; got '2.40'
    """
    from revolve import units
    from revolve.inputs import parse_money

    if text is None:
        return None, "kg", None
    m = _PER.fullmatch(str(text))
    if m is None:
        raise RevolveError(f"say what the price is per, e.g. '2.40/kg', '1.10/lb', '5.10/m' or "
                           f"'1.55/ft'; got {quoted(str(text).strip())}", option="--stock-price")
    try:
        money = parse_money(m.group("amount"))
    except RevolveError as e:
        raise e.located(option="--stock-price")
    unit = m.group("unit")
    for kind, basis in (("mass", "kg"), ("length", "m")):
        try:
            return money.amount / units.factor(unit, kind), basis, money.currency
        except RevolveError:
            continue
    raise RevolveError(f"{quoted(unit)} is neither a mass nor a length unit; give a price per kg, "
                       f"lb, m or ft", option="--stock-price")


def read_rate(text: Optional[str]) -> Tuple[Optional[float], Optional[str]]:
    """Machine rate per hour: ``85``, ``85/h``, ``1.5/min``, ``85 EUR/h`` -> (per hour, currency).

    >>> read_rate("85"), read_rate("1.5/min"), read_rate(None)
    ((85.0, None), (90.0, None), (None, None))
    >>> read_rate("fast")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --machine-rate: give a rate per hour such as '85' or '85/h'; got 'fast'
    """
    from revolve import units
    from revolve.inputs import parse_money

    if text is None:
        return None, None
    m = _PER.fullmatch(str(text))
    try:
        money = parse_money(m.group("amount") if m else str(text))
        per = units.factor(m.group("unit"), "time") if m else 3600.0
    except RevolveError:
        raise RevolveError(f"give a rate per hour such as '85' or '85/h'; got "
                           f"{quoted(str(text).strip())}", option="--machine-rate") from None
    return money.amount * 3600.0 / per, money.currency


def read_time(text: Optional[str], option: str) -> float:
    """A time in seconds; a bare number is in minutes.

    >>> read_time("45", "--setup-time"), read_time("30 s", "--handling-time"), read_time(None, "x")
    (2700.0, 30.0, 0.0)
    """
    from revolve import units

    if text is None:
        return 0.0
    try:
        value = units.parse_quantity(str(text), "time", default_unit="min")
    except RevolveError as e:
        raise e.located(option=option)
    if value < 0:
        raise RevolveError(f"must be zero or positive, got {quoted(str(text).strip())}",
                           option=option)
    return value


def read_speed(text: Any) -> Optional[float]:
    """Machine speed limit in rev/min (``3000`` or ``3000 rpm``) -> rev/s.

    >>> read_speed("3000 rpm"), read_speed(None)
    (50.0, None)

    A pint quantity of rotation per time (``Quantity(3000, "1/min")``) is read in rev/min.
    """
    if text is None:
        return None
    if hasattr(text, "magnitude") and hasattr(text, "to"):              # a pint quantity
        try:
            text = float(text.to("1/min").magnitude)
        except Exception:                                               # not per time
            text = str(text)
    t = re.sub(r"\s*(rpm|rev/min|r/min|min\^-1|1/min)\s*$", "", str(text).strip(), flags=re.I)
    try:
        value = float(t) if len(t) < 40 else math.nan
    except ValueError:
        value = math.nan
    if math.isnan(value):
        raise RevolveError(f"give the spindle speed limit in rev/min, e.g. '3000'; got "
                           f"{quoted(str(text).strip())}", option="--max-speed")
    if not math.isfinite(value) or value <= 0:
        raise RevolveError(f"must be positive, got {quoted(str(text).strip())}",
                           option="--max-speed")
    return value / 60.0


# vc, f, ap: the units each may be written in, as (length unit, time unit or None)
_CUT_UNITS = {
    "vc": {"m/min": ("m", "min"), "ft/min": ("ft", "min"), "sfm": ("ft", "min"),
           "fpm": ("ft", "min"), "m/s": ("m", "s")},
    "f": {"mm": ("mm", None), "mm/rev": ("mm", None), "in": ("in", None), "in/rev": ("in", None),
          "ipr": ("in", None)},
    "ap": {"mm": ("mm", None), "in": ("in", None)},
}
_CUT_DEFAULT = {"metric": {"vc": "m/min", "f": "mm/rev", "ap": "mm"},
                "inch": {"vc": "sfm", "f": "in/rev", "ap": "in"}}
_CUT_ITEM = re.compile(r"\s*(vc|f|ap)\s*=\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d{1,3})?)\s*"
                       r"([A-Za-z/]*)\s*$")


def read_cutting(text: Optional[str], base, system: str, option: str):
    """Override some of vc, f, ap: ``vc=220,f=0.25`` (bare numbers in the list's trade units).

    >>> from revolve.jobs.turning import CuttingData
    >>> base = CuttingData.from_trade_units(200, 0.3, 3)
    >>> read_cutting("vc=250, ap=2mm", base, "metric", "--roughing").trade_units()
    (250.0, 0.3, 2.0)
    >>> read_cutting("vc=500sfm,f=0.012in", base, "metric", "--roughing").trade_units()
    (152.4, 0.3048, 3.0)
    >>> read_cutting("speed=3", base, "metric", "--roughing")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --roughing: write vc=..., f=..., ap=... separated by commas (vc in m/min, f in mm/rev, ap in mm); got 'speed=3'
    """
    from revolve.units import factor

    if text is None:
        return base
    d = _CUT_DEFAULT[system]
    names = {"vc": "cutting_speed", "f": "feed", "ap": "depth_of_cut"}
    changes = {}
    for item in str(text).split(",")[:10]:
        m = _CUT_ITEM.fullmatch(item)
        if m is None:
            raise RevolveError(f"write vc=..., f=..., ap=... separated by commas (vc in {d['vc']}, "
                               f"f in {d['f']}, ap in {d['ap']}); got {quoted(item.strip())}",
                               option=option)
        key, number, unit = m.group(1), float(m.group(2)), (m.group(3) or d[m.group(1)]).lower()
        if unit not in _CUT_UNITS[key]:
            raise RevolveError(f"{key} in {', '.join(_CUT_UNITS[key])}, not {quoted(unit)}",
                               option=option)
        if not number > 0:
            raise RevolveError(f"{key} must be positive, got {m.group(2)}", option=option)
        length, time = _CUT_UNITS[key][unit]
        changes[names[key]] = number * factor(length, "length") / (
            factor(time, "time") if time else 1.0)
    try:
        return replace(base, **changes)
    except RevolveError as e:
        raise RevolveError(e.message, option=option) from None


def read_percent(value: Any, option: str, below_100: bool = False) -> float:
    """A percentage (``"3%"``, ``"3"`` or a number) from 0 to 100; 0 when not given.

    >>> read_percent("3 %", "--scrap"), read_percent(12.5, "--overhead"), read_percent(None, "x")
    (3.0, 12.5, 0.0)
    >>> read_percent("100", "--margin", below_100=True)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --margin: must be below 100 % (a share of the price), got '100'
    """
    from revolve.inputs import parse_percent

    if value is None:
        return 0.0
    try:
        v = parse_percent(value) if isinstance(value, str) else parse_percent(f"{float(value)!r}")
    except (RevolveError, TypeError, ValueError) as e:
        raise RevolveError(getattr(e, "message", f"{value!r} is not a percentage"),
                           option=option) from None
    if below_100 and v >= 100:
        raise RevolveError(f"must be below 100 % (a share of the price), got "
                           f"{quoted(str(value).strip())}", option=option)
    return v


def read_grooves(text: Optional[str], unit: str) -> Optional[Tuple[int, float, float]]:
    """``--grooves "N x WIDTH x DEPTH"`` -> (count, width m, radial depth m), or None.

    Bare lengths are in ``unit``; a unit after the depth holds for the width too.

    >>> read_grooves("2 x 3 x 1.5", "mm"), read_grooves("1 x 1/8 x 1/16 in", "mm")
    ((2, 0.003, 0.0015), (1, 0.003175, 0.0015875))
    >>> read_grooves("2 x 3", "mm")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --grooves: write the count, width and depth, e.g. '2 x 3 x 1.5' (mm); got '2 x 3'
    """
    if text is None:
        return None
    parts = [p.strip() for p in re.split(r"[x×X*]", str(text)[:200])]
    if len(parts) != 3 or not parts[0].isdigit() or len(parts[0]) > 4 or not all(parts):
        raise RevolveError(f"write the count, width and depth, e.g. '2 x 3 x 1.5' ({unit}); got "
                           f"{quoted(str(text).strip())}", option="--grooves")
    width, depth = _pair(parts[1], parts[2], "--grooves", unit)
    return int(parts[0]), width, depth


def read_blind_bore(text: Optional[str], unit: str) -> Optional[Tuple[float, float]]:
    """``--blind-bore "DIAMETER x DEPTH"`` -> (diameter m, depth m from the faced end), or None.

    >>> read_blind_bore("12 x 20", "mm"), read_blind_bore(None, "mm")
    ((0.012, 0.02), None)
    >>> read_blind_bore("12", "mm")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --blind-bore: write the diameter and depth, e.g. '12 x 20' (mm); got '12'
    """
    if text is None:
        return None
    parts = [p.strip() for p in re.split(r"[x×X*]", str(text)[:200])]
    if len(parts) != 2 or not all(parts):
        raise RevolveError(f"write the diameter and depth, e.g. '12 x 20' ({unit}); got "
                           f"{quoted(str(text).strip())}", option="--blind-bore")
    return _pair(parts[0], parts[1], "--blind-bore", unit)


def _pair(first: str, last: str, option: str, unit: str) -> Tuple[float, float]:
    from revolve.inputs import parse_length

    try:
        written = parse_length(last).unit
        if parse_length(first).unit is None and written is not None:
            first = f"{first} {written}"
    except RevolveError as e:
        raise e.located(option=option)
    return (read_length(first, option, unit, positive=True),
            read_length(last, option, unit, positive=True))


@dataclass(frozen=True)
class QuoteExtras:
    """What the operations and the price need besides the turning job (picklable)."""

    grooves: Optional[Tuple[int, float, float]] = None
    blind_bore: Optional[Tuple[float, float]] = None
    scrap: float = 0.0
    overhead: float = 0.0
    margin: float = 0.0
    stock_items: Tuple[Any, ...] = ()
    stock_list: Optional[str] = None


def quantities(values: Any, count: int) -> List[int]:
    """One quantity for every part, or one per part in order; default 1.

    >>> quantities(None, 2), quantities(5, 2), quantities([5, 7], 2)
    ([1, 1], [5, 5], [5, 7])
    >>> quantities([2, 3], 1)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --quantity: give one quantity (for every profile) or one per profile, in order (1 profile), got 2
    """
    if values is None:
        values = [1]
    elif isinstance(values, (int, str)) and not isinstance(values, bool):
        values = [values]
    out = []
    for q in values:
        if isinstance(q, bool) or not isinstance(q, int) or q < 1:
            raise RevolveError(f"must be a whole number of at least 1, got {q!r}",
                               option="--quantity")
        out.append(q)
    if len(out) == 1:
        return out * count
    if len(out) != count:
        raise RevolveError(f"give one quantity (for every profile) or one per profile, in order "
                           f"({count} profile{'s' if count != 1 else ''}), got {len(out)}",
                           option="--quantity")
    return out


@dataclass(frozen=True)
class TurnOptions:
    """The options of a quote as typed (text, or values of the shared option types).

    Picklable: the batch hands it to worker processes. :meth:`job` reads
    it in the units of a bar list (bare lengths in mm or in); every error
    names its option.
    """

    material: Optional[str] = None
    bar_list: Optional[str] = None
    stock: str = "bar"
    blank: Optional[str] = None
    blank_length: Any = None
    turning_allowance: Any = None
    bore_allowance: Any = None
    facing_allowance: Any = None
    parting_width: Any = None
    holding_length: Any = None
    bar_length: Any = None
    remnant: Any = None
    stock_price: Optional[str] = None
    machine_rate: Optional[str] = None
    setup_time: Optional[str] = None
    handling_time: Optional[str] = None
    whole_bars: bool = False
    roughing: Optional[str] = None
    finishing: Optional[str] = None
    max_speed: Any = None
    no_finish: Tuple[str, ...] = ()
    currency: Optional[str] = None
    axis: Any = None
    units: Optional[str] = None
    tolerance: float = DEFAULT_TOLERANCE
    drilling: Optional[str] = None
    grooves: Optional[str] = None
    blind_bore: Optional[str] = None
    scrap: Any = None
    overhead: Any = None
    margin: Any = None
    stock_list: Optional[str] = None
    grade: Optional[str] = None

    def check(self) -> None:
        """Refuse, before any file is read, what does not depend on the part."""
        from revolve.jobs import turning

        if self.stock not in turning.STOCK_CHOICES:
            raise RevolveError(f"choose {', '.join(turning.STOCK_CHOICES)}, not "
                               f"{quoted(self.stock)}", option="--stock")
        if not (isinstance(self.tolerance, (int, float)) and self.tolerance > 0):
            raise RevolveError("must be a positive number", option="--tolerance")
        if self.bar_list is not None:
            self.system_for("mm")
        if self.units is not None:
            from revolve.jobs.batch import check_units

            check_units(self.units)
        self.job(self.system_for("mm"))
        self.extras(self.system_for("mm"))

    def extras(self, system: str) -> QuoteExtras:
        """Grooves, a blind bore, scrap, overhead, margin and the shop's stock list, read."""
        from revolve.jobs.turning_data import load_bar_list

        unit = load_bar_list(system).unit
        items: Tuple[Any, ...] = ()
        if self.stock_list is not None:
            from revolve.formats.stock_list import read_stock_list

            if self.stock_price is not None:
                raise RevolveError("the price comes from the stock list; leave out --stock-price "
                                   "or --stock-list", option="--stock-price")
            if self.blank is not None:
                raise RevolveError("give either --blank or --stock-list, not both",
                                   option="--blank")
            items = read_stock_list(os.fspath(self.stock_list))
            if not items:
                raise RevolveError("the stock list has no rows", file=os.fspath(self.stock_list))
            grades = sorted({i.grade for i in items}, key=str.lower)
            if self.grade is None and len({g.lower() for g in grades}) > 1:
                raise RevolveError(f"the stock list holds grades {', '.join(grades)}; say which "
                                   f"with --grade", option="--grade")
            if self.grade is not None and self.grade.lower() not in {g.lower() for g in grades}:
                raise RevolveError(f"{quoted(self.grade)} is not on the stock list (grades: "
                                   f"{', '.join(grades)})", option="--grade")
        elif self.grade is not None:
            raise RevolveError("a grade picks rows of --stock-list; give the stock list too",
                               option="--grade")
        return QuoteExtras(read_grooves(self.grooves, unit), read_blind_bore(self.blind_bore, unit),
                           read_percent(self.scrap, "--scrap"),
                           read_percent(self.overhead, "--overhead"),
                           read_percent(self.margin, "--margin", below_100=True), items,
                           None if self.stock_list is None else os.fspath(self.stock_list))

    def system_for(self, unit: str) -> str:
        if self.bar_list is None:
            return system_of(unit)
        system = str(self.bar_list).strip().lower()
        from revolve.jobs.turning_data import load_bar_list

        load_bar_list(system)           # refuses an unknown list, naming --bar-list
        return system

    def currency_label(self) -> Optional[str]:
        """The currency: --currency, else the one written with a price or rate."""
        found = {c for c in (read_stock_price(self.stock_price)[2], read_rate(self.machine_rate)[1])
                 if c}
        if self.stock_list is not None:
            from revolve.formats.stock_list import read_stock_list

            found |= {i.currency for i in read_stock_list(os.fspath(self.stock_list)) if i.currency}
        given = self.currency.strip().upper() if self.currency else None
        if given is not None:
            found.add(given)
        if len(found) > 1:
            raise RevolveError(f"the prices are in different currencies ({', '.join(sorted(found))}); "
                               f"give one", option="--currency")
        return given or (found.pop() if found else None)

    def job(self, system: str):
        """The turning job (everything but the part and its material) for a bar list."""
        from revolve.jobs import turning, turning_data

        bl = turning_data.load_bar_list(system)
        d, unit = bl.defaults, bl.unit
        allowances = turning.Allowances(
            turning=read_length(self.turning_allowance, "--turning-allowance", unit,
                                d.turning_allowance),
            bore=read_length(self.bore_allowance, "--bore-allowance", unit, d.bore_allowance),
            facing=read_length(self.facing_allowance, "--facing-allowance", unit,
                               d.facing_allowance),
            parting_width=read_length(self.parting_width, "--parting-width", unit,
                                      d.parting_width),
            holding_length=read_length(self.holding_length, "--holding-length", unit,
                                       d.holding_length))
        blank = read_blank(self.blank, self.blank_length, unit)
        if blank is not None and self.stock != "bar":
            raise RevolveError("give either --blank or --stock tube/lighter, not both",
                               option="--blank")
        if blank is not None and self.whole_bars:
            raise RevolveError("a blank is not cut from bars; leave out --whole-bars or --blank",
                               option="--whole-bars")
        price, basis, _ = read_stock_price(self.stock_price)
        self.currency_label()
        prices = turning.Prices(stock_price=price, basis=basis,
                                machine_rate=read_rate(self.machine_rate)[0],
                                setup_time=read_time(self.setup_time, "--setup-time"),
                                handling_time=read_time(self.handling_time, "--handling-time"),
                                whole_bars=bool(self.whole_bars))
        placeholder = turning.CuttingData(1.0, 1.0, 1.0)
        for text, option in ((self.roughing, "--roughing"), (self.finishing, "--finishing"),
                             (self.drilling, "--drilling")):
            read_cutting(text, placeholder, system, option)        # refused before any file
        if self.drilling is not None and "ap" in re.findall(r"(\w+)\s*=", str(self.drilling)):
            raise RevolveError("a drill has no depth of cut; give vc and f", option="--drilling")
        return turning.TurningJob(
            allowances=allowances, roughing=placeholder, finishing=placeholder,
            bars=bl.round_bars, tubes=bl.tubes, choice=self.stock, blank=blank,
            bar_length=read_length(self.bar_length, "--bar-length", unit, d.bar_length,
                                   positive=True),
            remnant=read_length(self.remnant, "--remnant", unit, d.remnant), prices=prices,
            speed_limit=read_speed(self.max_speed), skip_faces=tuple(self.no_finish or ()),
            display_unit=unit)


# -- one part --------------------------------------------------------------------------------


@dataclass(frozen=True)
class PartQuote:
    """One quoted part: where it came from, its material, the quote, its operations and price.

    ``plan`` is the :class:`~revolve.jobs.operations.Plan` as quoted (the
    operations in order, each with its time and formula; the warnings);
    ``cycle`` = operations + handling, s; ``price`` the
    :class:`~revolve.jobs.operations.BatchPrice` (None without a machine rate
    nor a stock price); ``started`` the parts started (quantity + scrap).
    """

    file: Optional[str]
    name: str
    profile_unit: str
    material: Any
    cutting_source: str
    quote: Any
    agrees: bool
    system: str
    plan: Any = None
    cycle: float = 0.0
    quantity: int = 1
    started: int = 1
    price: Any = None
    extras: QuoteExtras = QuoteExtras()
    notes: Tuple[str, ...] = ()


def _material_of(doc, given: Optional[str]):
    from revolve import materials

    if given:
        try:
            return materials.find_material(given), True
        except RevolveError as e:
            raise e.located(option="--material")
    if doc.material:
        try:
            return materials.find_material(doc.material), False
        except RevolveError as e:
            raise e.located(file=doc.file, line=doc.line_of("material"), place="material")
    where = "the file gives only a density; " if doc.density else ""
    raise RevolveError(f"{where}give --material NAME (the material sets the density and the "
                       f"cutting data)", file=doc.file, place="material")


def _axis_of(axis):
    from revolve.jobs.measuring import parse_axis

    return parse_axis(axis) if isinstance(axis, str) else axis


def _stock_from_list(extras: QuoteExtras, options: TurnOptions, job, env):
    """The smallest row of the shop's stock list covering the part, as the job's only stock."""
    from revolve.jobs import operations, turning

    a = job.allowances
    inside = 0.0 if job.choice == "bar" else turning.largest_inside_diameter(env, a)
    try:
        item = operations.choose_from_stock(extras.stock_items,
                                            turning.required_outside_diameter(env, a),
                                            options.grade, inside)
    except RevolveError as e:
        raise e.located(file=extras.stock_list)
    tube = item.shape == "tube"
    size = turning.StockSize(item.outside_diameter, item.inside_diameter,
                             f"{item.size_text} {item.grade}", "tube" if tube else "bar",
                             f"{os.path.basename(extras.stock_list)} line {item.line}")
    return replace(job, bars=() if tube else (size,), tubes=(size,) if tube else (),
                   choice="tube" if tube else "bar",
                   prices=replace(job.prices, stock_price=item.price, basis=item.price_basis),
                   bar_length=job.bar_length if options.bar_length is not None
                   else item.rack_length)


def _cut(data, op):
    from revolve.jobs.turning import CuttingData

    return CuttingData(data[op].cutting_speed, data[op].feed, data[op].depth_of_cut)


def quote_document(doc, options: TurnOptions, quantity: int, system: str, job=None) -> PartQuote:
    """Quote one part read from a document: measured once, its prepared profile reused.

    ``job`` is ``(TurningJob, QuoteExtras)`` read once for a batch (default: read here).
    """
    from revolve.jobs import operations, turning, turning_data
    from revolve.jobs.measuring import measure_document
    from revolve import units

    material, given = _material_of(doc, options.material)
    try:
        turning_data.cutting_data_for(material.group)
        table = operations.as_shop_writes(operations.operation_data_for(material.group), system)
    except RevolveError as e:
        raise e.located(file=None if given else doc.file,
                        option="--material" if given else None,
                        place=None if given else "material")
    job, extras = job or (options.job(system), options.extras(system))
    data = dict(table)
    for op, text, option in (("rough turn", options.roughing, "--roughing"),
                             ("finish turn", options.finishing, "--finishing"),
                             ("drill", options.drilling, "--drilling")):
        data[op] = read_cutting(text, table[op], system, option)
    started = operations.quantity_started(quantity, extras.scrap)
    job = replace(job, roughing=_cut(data, "rough turn"), finishing=_cut(data, "finish turn"),
                  prices=replace(job.prices, quantity=started))
    part = measure_document(doc, axis=_axis_of(options.axis), density=material.density,
                            density_label=material.name)
    m = part.measurement
    lf = units.factor(doc.profile.unit, "length")
    try:
        if extras.stock_items:
            job = _stock_from_list(extras, options, job, turning.envelope(m.prepared, lf))
        q = turning.quote(m, m.prepared, material.density, job, lf)
        plan = _plan(q, m.prepared, lf, data, extras, job, system)
    except RevolveError as e:
        raise e.located(file=doc.file)
    agrees = m.crosscheck is None or m.crosscheck.agrees(options.tolerance)
    # the provenance note ("from memory") stays in the data file; users read the source plainly
    source = re.sub(r"\s*\(from memory\)", "", operations.data_source(material.group)) + (
        "; rounded as inch shops write them" if system == "inch" else "")
    source = source if data == table else "given"
    name = doc.name or (os.path.splitext(os.path.basename(doc.file))[0] if doc.file else "part")
    cycle = plan.cycle_time + q.times.handling
    price, notes = _price(q, cycle, quantity, extras, job)
    return PartQuote(doc.file, name, doc.profile.unit, material, source, q, agrees, system,
                     plan, cycle, quantity, started, price, extras, tuple(notes))


def _plan(q, prepared, lf: float, data, extras: QuoteExtras, job, system: str):
    """The operations of the part: the envelope's features, the grooves and blind bore given,
    the profile below the largest diameter roughed at Q, finishing over the finished faces."""
    from revolve.jobs import operations as ops_

    unit = "in" if system == "inch" else "mm"
    f = ops_.features_from_profile(prepared, lf)
    env, size = q.part.envelope, q.stock.size
    if extras.blind_bore is not None:
        if f.bore_diameter > 0:
            raise RevolveError("the part already has a through bore; a blind bore is for a "
                               "bore the profile does not show", option="--blind-bore")
        try:
            f = replace(f, bore_diameter=extras.blind_bore[0], bore_depth=extras.blind_bore[1])
        except RevolveError as e:
            raise RevolveError(e.message, option="--blind-bore") from None
    if extras.grooves is not None:
        count, width, depth = extras.grooves
        if count * width > env.length * (1 + 1e-9):
            raise RevolveError(f"{count} grooves of this width are "
                               f"wider together than the part is long", option="--grooves")
        try:
            f = replace(f, grooves=ops_.Grooves(count, width, depth, env.diameter))
        except RevolveError as e:
            raise RevolveError(e.message, option="--grooves") from None
    rules = ops_.load_rules(system)
    plan = ops_.plan_operations(f, size.outside_diameter, data, rules, job.speed_limit,
                                facing_allowance=job.allowances.facing,
                                stock_bore=size.inside_diameter, unit=unit)
    # what the envelope does not show: steps, tapers, arcs and hollows below the largest
    # diameter, outside the through bore, the blind bore and the grooves
    cylinder = math.pi / 4 * (env.diameter ** 2 - f.bore_diameter ** 2) * env.length
    if f.bore_diameter and not f.through_bore:
        cylinder = math.pi / 4 * (env.diameter ** 2 * env.length
                                  - f.bore_diameter ** 2 * f.bore_depth)
    if f.grooves is not None:
        g = f.grooves
        cylinder -= g.count * g.width * math.pi * (g.diameter * g.depth - g.depth ** 2)
    left = cylinder - q.part.volume
    out = []
    rough = data["rough turn"]
    fin = data["finish turn"]
    rate = rough.cutting_speed * rough.feed * rough.depth_of_cut
    for op in plan.operations:
        if op.name == "finish turn":
            continue
        out.append(op)
        if op.name == "rough turn" or (op.name == "face" and not any(
                o.name == "rough turn" for o in plan.operations)):
            if left > 1e-6 * q.part.volume:
                out.append(ops_.Operation(
                    "rough to the profile", left / rate, 1,
                    ops_.spindle_speed(rough.cutting_speed, env.diameter, job.speed_limit),
                    "t = V / Q, Q = vc · f · ap (rough turn data)",
                    f"V = {_volume_text(left, unit)} below ⌀{ops_._mm(env.diameter, unit)}: "
                    f"steps, tapers, arcs", rough))
            if q.times.finishing > 0:
                out.append(ops_.Operation(
                    "finish turn", q.times.finishing, 1,
                    ops_.spindle_speed(fin.cutting_speed, env.diameter, job.speed_limit),
                    "t = A / (vc f) over the finished faces (n capped at the speed limit)",
                    f"A = {_area_text(q.times.finished_area, unit)}: "
                    f"{', '.join(q.times.finished_faces)}", fin))
    return ops_.Plan(tuple(out), plan.warnings, plan.stock_diameter)


def _volume_text(v: float, unit: str) -> str:
    from revolve.units import factor

    shown = "cm" if unit == "mm" else unit
    return f"{v / factor(shown, 'length') ** 3:.4g} {shown}³"


def _area_text(a: float, unit: str) -> str:
    from revolve.units import factor

    shown = "cm" if unit == "mm" else unit
    return f"{a / factor(shown, 'length') ** 2:.4g} {shown}²"


def _price(q, cycle: float, quantity: int, extras: QuoteExtras, job):
    """The batch's cost and price (operations.price_batch), and its notes."""
    from revolve.jobs import operations, turning

    pr, bars, stock = job.prices, q.bars, q.stock
    per_piece = turning.stock_price_of(pr, stock.length, stock.mass)
    bar_price = None
    if pr.whole_bars and bars is not None and per_piece is not None:
        bar_mass = stock.size.section_area * bars.bar_length * (stock.mass / stock.volume)
        bar_price = turning.stock_price_of(pr, bars.bar_length, bar_mass)
        per_piece = None
    p = operations.price_batch(cycle, quantity, pr.machine_rate or 0.0,
                               setup_time=pr.setup_time, scrap_percent=extras.scrap,
                               parts_per_bar=bars.parts_per_bar if bars is not None else None,
                               bar_price=bar_price, material_per_part=per_piece,
                               overhead_percent=extras.overhead, margin_percent=extras.margin)
    return p, [n for n in p.notes if not n.startswith("no material price")]


# -- the result --------------------------------------------------------------------------------

def _f(key, label, role=None, style="number", digits=None):
    return Field(key, label, role, style, digits)


PART_FIELDS = (
    _f("part_diameter", "largest diameter (arc crests included)", "diameter"),
    _f("part_length", "length along the axis", "length"),
    _f("bore_diameter", "smallest through bore", "diameter"),
    _f("part_volume", "volume (Pappus: 2π · d · A)", "volume"),
    _f("part_mass", "mass", "mass"),
    _f("centre_of_mass_from_start", "centre of mass from the first end", "length"),
    _f("centre_of_mass_axial", "centre of mass along the axis from its point", "length"),
    _f("finished_surface", "finished surface", "area"),
)
FACE_FIELDS = (_f("face", "face", style="text"), _f("area", "area", "area"),
               _f("finished", "finished", style="text"))
STOCK_FIELDS = (
    _f("stock_label", "stock", style="text"),
    _f("stock_kind", "kind", style="text"),
    _f("stock_source", "list", style="text"),
    _f("needed_diameter", "needed outside diameter (part + turning allowance)", "diameter"),
    _f("largest_stock_bore", "largest stock bore (bore − bore allowance)", "diameter"),
    _f("stock_diameter", "outside diameter", "diameter"),
    _f("stock_inside_diameter", "inside diameter", "diameter"),
    _f("stock_length", "stock length per part (part + 2 facing + parting + holding)", "length"),
    _f("stock_volume", "stock volume (π/4 (D² − d²) · length)", "volume"),
    _f("stock_mass", "stock mass", "mass"),
)
REMOVED_FIELDS = (
    _f("removed_volume", "removed volume (stock − part)", "volume"),
    _f("removed_mass", "removed mass", "mass"),
    _f("offcut_volume", "holding piece (offcut), volume", "volume"),
    _f("offcut_mass", "holding piece (offcut), mass", "mass"),
    _f("chip_volume", "chips, volume", "volume"),
    _f("chip_mass", "chips, mass", "mass"),
    _f("utilisation_percent", "utilisation (part mass / stock mass)", style="percent", digits=3),
)
BAR_FIELDS = (
    _f("bar_length", "bar length", "length"),
    _f("remnant", "remnant per bar", "length"),
    _f("length_per_part", "length per part", "length"),
    _f("parts_per_bar", "parts per bar (floor((bar − remnant) / length per part))", style="count"),
    _f("quantity", "quantity", style="count"),
    _f("started", "parts started (quantity + scrap allowance)", style="count"),
    _f("bars_needed", "bars needed (for the parts started)", style="count"),
    _f("parts_on_last_bar", "parts on the last bar", style="count"),
    _f("unused_per_bar", "unused per bar", "length"),
)
CUTTING_FIELDS = (
    _f("pass", "pass", style="text"),
    _f("cutting_speed", "vc", "cutting_distance/time", digits=4),
    _f("feed_per_rev", "f per rev", "length", digits=4),
    _f("depth_of_cut", "ap", "length", digits=4),
    _f("at_diameter", "at ⌀", "diameter"),
    _f("spindle_speed_rpm", "n = vc / (π D), rev/min", style="count", digits=4),
    _f("over_limit", "over the limit", style="text"),
)
OPERATION_FIELDS = (
    _f("operation", "operation", style="text"),
    _f("time", "time", "time", digits=4),
    _f("passes", "passes", style="count"),
    _f("spindle_speed_rpm", "n, rev/min", style="count", digits=4),
    _f("cutting_speed", "vc", "cutting_distance/time", digits=4),
    _f("feed_per_rev", "f per rev", "length", digits=4),
    _f("depth_of_cut", "ap", "length", digits=4),
)
FORMULA_FIELDS = (_f("operation", "operation", style="text"),
                  _f("detail", "what", style="text"), _f("formula", "formula", style="text"))
TIME_FIELDS = (
    _f("operations_time", "operations (the list above)", "time", digits=4),
    _f("handling_time", "handling", "time", digits=4),
    _f("cycle_time", "cycle (operations + handling)", "time", digits=4),
    _f("metal_removal_rate", "check: metal removal rate Q = vc · ap · f", "volume/time",
       digits=4),
    _f("roughing_time", "check: all chips at one rate (chips / Q)", "time", digits=4),
    _f("finishing_time", "check: finishing (A / (vc · f))", "time", digits=4),
    _f("setup_time", "set-up, once per batch", "time", digits=4),
    _f("speed_limit_rpm", "machine speed limit, rev/min", style="count"),
    _f("roughing_limit_diameter", "roughing at the limit below ⌀", "diameter"),
    _f("finishing_limit_diameter", "finishing at the limit below ⌀", "diameter"),
)
COST_FIELDS = (_f("item", "", style="text"), _f("per_part", "per part", "money", "money"),
               _f("batch", "batch", "money", "money"), _f("how", "how", style="text"))
ALLOWANCE_FIELDS = (
    _f("turning_on_diameter", "turning allowance, on the diameter", "length"),
    _f("bore_on_diameter", "bore allowance, on the diameter", "length"),
    _f("facing_per_end", "facing allowance, each end", "length"),
    _f("parting_width", "parting width", "length"),
    _f("holding_length", "holding length", "length"),
)
#: Columns of the many-parts table (and of every CSV): one row per part, figures in the units,
#: each headed by its key (``part_volume (cm³)``).
ROW_FIELDS = tuple(replace(f, label=f.key) for f in (
    (_f("file", "file", style="text"), _f("name", "name", style="text"),
     _f("material", "material", style="text"))
    + tuple(f for f in PART_FIELDS)
    + tuple(f for f in STOCK_FIELDS if f.key not in ("stock_source",))
    + REMOVED_FIELDS
    + tuple(f for f in BAR_FIELDS if f.key in ("parts_per_bar", "quantity", "started",
                                                "bars_needed"))
    + tuple(f for f in TIME_FIELDS if f.key.endswith("_time"))
    + (_f("stock_per_part", "stock per part", "money", "money"),
       _f("machine_per_part", "machine per part", "money", "money"),
       _f("setup_per_part", "set-up per part", "money", "money"),
       _f("cost_per_part", "cost per part", "money", "money"),
       _f("batch_cost", "batch cost", "money", "money"),
       _f("price_per_part", "price per part", "money", "money"),
       _f("batch_price", "batch price", "money", "money"),
       _f("crosscheck_agrees", "cross-check agrees", style="text"),
       _f("error", "error", style="text"))
))

_KIND_TEXT = {"bar": "round bar", "tube": "tube (hollow bar)", "blank": "blank (given)"}


def units_for(system: str, currency: Optional[str]) -> OutputUnits:
    """The turning trade's units for a bar list, and the currency.

    >>> u = units_for("inch", "USD")
    >>> u.unit("volume"), u.unit("cutting_distance/time"), u.unit("volume/time"), u.unit("money")
    ('in³', 'ft/min', 'in³/min', 'USD')
    """
    return trade_units("turning", "in" if system == "inch" else "mm", currency=currency)


def _sections(pq: PartQuote) -> Dict[str, Dict[str, Any]]:
    """The quote's figures by table, in SI (m, m², m³, kg, s, m/s; money as is)."""
    q = pq.quote
    p, s, r, t, job = q.part, q.stock, q.removal, q.times, q.job
    e, a = p.envelope, job.allowances
    part = {"part_diameter": e.diameter, "part_length": e.length,
            "part_volume": p.volume, "part_mass": p.mass,
            "centre_of_mass_from_start": p.centre_of_mass_from_start,
            "centre_of_mass_axial": p.centre_of_mass_axial,
            "finished_surface": t.finished_area}
    if e.through_bore:
        part["bore_diameter"] = e.bore_diameter
    stock = {"stock_label": s.size.label, "stock_kind": s.size.kind,
             "stock_source": s.size.source, "stock_diameter": s.size.outside_diameter,
             "stock_inside_diameter": s.size.inside_diameter, "stock_length": s.length,
             "stock_volume": s.volume, "stock_mass": s.mass}
    if s.size.kind != "blank":
        stock["needed_diameter"] = e.diameter + a.turning
    if s.size.kind == "tube":
        stock["largest_stock_bore"] = max(0.0, e.bore_diameter - a.bore)
    removed = {"removed_volume": r.removed_volume, "removed_mass": r.removed_mass,
               "chip_volume": r.chip_volume, "chip_mass": r.chip_mass,
               "utilisation_percent": r.utilisation * 100.0}
    if r.offcut_volume > 0:
        removed.update(offcut_volume=r.offcut_volume, offcut_mass=r.offcut_mass)
    bars = None
    if q.bars is not None:
        b = q.bars
        bars = {"bar_length": b.bar_length, "remnant": b.remnant,
                "length_per_part": b.length_per_part, "parts_per_bar": b.parts_per_bar,
                "quantity": pq.quantity, "started": pq.started, "bars_needed": b.bars_needed,
                "parts_on_last_bar": b.parts_on_last_bar, "unused_per_bar": b.unused_per_bar}
    from revolve.jobs.turning import metal_removal_rate

    times = {"operations_time": pq.plan.cycle_time, "handling_time": t.handling,
             "cycle_time": pq.cycle, "metal_removal_rate": metal_removal_rate(job.roughing),
             "roughing_time": t.roughing, "finishing_time": t.finishing, "setup_time": t.setup}
    operations = [{"operation": op.name, "time": op.time, "passes": op.passes,
                   "spindle_speed_rpm": op.spindle_speed * 60.0,
                   "cutting_speed": op.data.cutting_speed, "feed_per_rev": op.data.feed,
                   "depth_of_cut": op.data.depth_of_cut, "formula": op.formula,
                   "detail": op.detail} for op in pq.plan.operations]
    if t.speed_limit is not None:
        times.update(speed_limit_rpm=t.speed_limit * 60.0,
                     roughing_limit_diameter=t.roughing_limit_diameter,
                     finishing_limit_diameter=t.finishing_limit_diameter)
    cutting = [
        {"pass": "roughing", "cutting_speed": job.roughing.cutting_speed,
         "feed_per_rev": job.roughing.feed, "depth_of_cut": job.roughing.depth_of_cut,
         "at_diameter": s.size.outside_diameter, "spindle_speed_rpm": t.roughing_speed * 60.0,
         "over_limit": t.roughing_limited},
        {"pass": "finishing", "cutting_speed": job.finishing.cutting_speed,
         "feed_per_rev": job.finishing.feed, "depth_of_cut": job.finishing.depth_of_cut,
         "at_diameter": e.diameter, "spindle_speed_rpm": t.finishing_speed * 60.0,
         "over_limit": t.finishing_limited}]
    faces = [{"face": k, "area": v, "finished": k in t.finished_faces}
             for k, v in p.surface_by_face.items() if v > 0]
    allowances = {"turning_on_diameter": a.turning, "bore_on_diameter": a.bore,
                  "facing_per_end": a.facing, "parting_width": a.parting_width,
                  "holding_length": a.holding_length}
    return {"part": part, "faces": faces, "stock": stock, "removed": removed, "bars": bars,
            "cutting": cutting, "operations": operations, "times": times,
            "allowances": allowances, "cost": _costs(pq)}


def _costs(pq: PartQuote) -> Dict[str, Optional[float]]:
    """Batch and per-part money (per good part); None where the price or rate is missing."""
    pr, p, q = pq.quote.job.prices, pq.price, pq.quantity
    stock = p.material_cost if pr.stock_price is not None else None
    rate = pr.machine_rate
    setup = None if rate is None else rate * p.setup_time / 3600.0
    machine = None if rate is None else p.machine_cost - setup
    known = [v for v in (stock, machine, setup) if v is not None]
    cost = math.fsum(known) if known else None
    k = (1 + pq.extras.overhead / 100.0) / (1 - pq.extras.margin / 100.0)
    out = {"stock_batch": stock, "machine_batch": machine, "setup_batch": setup,
           "batch_cost": cost, "overhead_batch": None if cost is None
           else cost * pq.extras.overhead / 100.0, "batch_price": None if cost is None
           else cost * k}
    for key in list(out):
        out[key.replace("batch_", "").replace("_batch", "") + "_per_part"] = \
            None if out[key] is None else out[key] / q
    return {"stock_per_part": out["stock_per_part"], "machine_per_part": out["machine_per_part"],
            "setup_per_part": out["setup_per_part"], "cost_per_part": out["cost_per_part"],
            "overhead_per_part": out["overhead_per_part"], "price_per_part": out["price_per_part"],
            "stock_batch": stock, "machine_batch": machine, "setup_batch": setup,
            "batch_cost": cost, "overhead_batch": out["overhead_batch"],
            "batch_price": out["batch_price"]}


def notes_of(pq: PartQuote) -> List[str]:
    """The quote's notes: hollows, blank allowances, speed limits, the cross-check."""
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
    skipped = [k for k, v in q.part.surface_by_face.items()
               if v > 0 and k not in t.finished_faces]
    if skipped:
        out.append("not finished: " + ", ".join(skipped))
    if not pq.agrees:
        out.append("the engine's two volume/surface computations disagree; do not use these "
                   "figures without finding out why")
    out.extend(f"warning: {w}" for w in pq.plan.warnings)
    out.extend(pq.notes)
    if pq.extras.scrap:
        out.append(f"scrap allowance {pq.extras.scrap:g} %: {pq.started} parts started for "
                   f"{pq.quantity} good ones")
    return out


def _cost_rows(pq: PartQuote, options: TurnOptions) -> Tuple[Dict[str, Any], ...]:
    c, pr, bars, ex = _costs(pq), pq.quote.job.prices, pq.quote.bars, pq.extras
    if pr.stock_price is None:
        stock_how = "no --stock-price given"
    else:
        cur = options.currency_label()
        shown = (f"{pr.stock_price:.2f}{' ' + cur if cur else ''}/{pr.basis} from "
                 f"{os.path.basename(ex.stock_list)}"
                 if ex.stock_list else str(options.stock_price).strip())
        stock_how = f"at {shown}" + (" per stock length" if pr.basis == "m"
                                     else " × stock mass")
        if pr.whole_bars and bars is not None:
            stock_how += f", {bars.bars_needed} whole bars"
        stock_how += f", {pq.started} parts started"
    rate_how = ("no --machine-rate given" if pr.machine_rate is None else
                f"{pr.machine_rate:.6g} per hour × cycle × {pq.started} parts started")
    missing = [o for o, v in (("--stock-price", pr.stock_price), ("--machine-rate", pr.machine_rate))
               if v is None]
    rows = [{"item": "stock", "per_part": c["stock_per_part"], "batch": c["stock_batch"],
             "how": stock_how},
            {"item": "machine time", "per_part": c["machine_per_part"],
             "batch": c["machine_batch"], "how": rate_how},
            {"item": "set-up", "per_part": c["setup_per_part"], "batch": c["setup_batch"],
             "how": "rate × set-up time, shared over the batch"},
            {"item": "total", "per_part": c["cost_per_part"], "batch": c["batch_cost"],
             "how": "cost" if not missing else "incomplete: give " + " and ".join(missing)},
            {"item": "overhead", "per_part": c["overhead_per_part"],
             "batch": c["overhead_batch"], "how": f"{ex.overhead:g} % of the cost"},
            {"item": "price", "per_part": c["price_per_part"], "batch": c["batch_price"],
             "how": f"(cost + overhead) / (1 − {ex.margin:g} % margin)"}]
    return tuple(rows)


@dataclass(frozen=True, repr=False)
class TurningResult(Result):
    """A turned part's quote: tables part, faces, stock, removed, bars, allowances, cutting,
    operations, operation_formulas, times, cost (with overhead and price).

    The properties give the main figures in SI (m, m³, kg, s) and money.

    Examples
    --------
    >>> from revolve.geometry.profile import Loop, Profile
    >>> pin = Profile(loops=(Loop.from_points([(0, 0), (50, 0), (50, 15), (0, 15)]),), name="pin")
    >>> r = quote_turning(pin, material="carbon steel")
    >>> r             # doctest: +ELLIPSIS
    <TurningResult pin: 32 mm round bar, part 0.277442 kg, stock 0.347234 kg, cycle ... min>
    >>> r.to_dict()["command"], r.cost_per_part is None       # no prices given, no cost
    ('turn', True)
    >>> "<table>" in r._repr_html_()
    True
    """

    quote: Any = dc_field(default=None, compare=False)
    part: Optional[PartQuote] = dc_field(default=None, compare=False)

    def __repr__(self) -> str:
        q = self.quote
        c = self.cost_per_part
        cost = "" if c is None else f", {c:.2f} per part"
        return (f"<TurningResult {self.part.name}: {q.stock.size.label} "
                f"{_KIND_TEXT[q.stock.size.kind]}, part {q.part.mass:.6g} kg, stock "
                f"{q.stock.mass:.6g} kg, cycle {self.cycle_time / 60:.4g} min{cost}>")

    @property
    def heading(self) -> str:
        """The part, its file and its material, as the quote's first lines.

        >>> from revolve.geometry.profile import Loop, Profile
        >>> pin = Profile(loops=(Loop.from_points([(0, 0), (5, 0), (5, 1), (0, 1)]),), name="pin")
        >>> print(quote_turning(pin, material="carbon steel").heading)
        pin
        Carbon steel, 7850 kg/m³ (common practice, no source)
        """
        pq = self.part
        m = pq.material
        return (pq.name + (f"  ({pq.file})" if pq.file else "")
                + f"\n{m.name}, {m.density:g} kg/m³ ({m.source})")

    def _repr_html_(self) -> str:
        from html import escape

        from revolve.render.output import html

        return "<p>" + escape(self.heading).replace("\n", "<br>") + "</p>\n" + html(self)

    @property
    def volume(self) -> float:
        """Part volume, m³."""
        return self.quote.part.volume

    @property
    def mass(self) -> float:
        """Part mass, kg."""
        return self.quote.part.mass

    @property
    def stock_label(self) -> str:
        """The stock chosen, as its list writes it (``"42 mm"``, ``"2 × 1 in"``)."""
        return self.quote.stock.size.label

    @property
    def cycle_time(self) -> float:
        """Time per part (the operations + handling), s."""
        return self.part.cycle

    @property
    def operations(self) -> Tuple[Any, ...]:
        """The operations in order (:class:`revolve.jobs.operations.Operation`)."""
        return self.part.plan.operations

    @property
    def cost_per_part(self) -> Optional[float]:
        """Cost per good part in the currency, None without a price or a rate."""
        return _costs(self.part)["cost_per_part"]

    @property
    def price_per_part(self) -> Optional[float]:
        """Price per good part (cost, overhead and margin), None without a price or a rate."""
        return _costs(self.part)["price_per_part"]

    @property
    def agrees(self) -> bool:
        """The engine's two computations agree within the tolerance."""
        return self.part.agrees

    @property
    def speed_limited(self) -> bool:
        """A spindle speed needed is over ``max_speed``."""
        t = self.quote.times
        return bool(t.roughing_limited or t.finishing_limited)


def _inputs(pq: PartQuote, options: TurnOptions, currency) -> Dict[str, Any]:
    m = pq.material
    return {"file": pq.file, "name": pq.name, "profile_unit": pq.profile_unit,
            "material": m.key, "material_name": m.name, "density_kg_m3": m.density,
            "material_group": m.group, "material_source": m.source,
            "cutting_data_source": pq.cutting_source, "bar_list": pq.system,
            "stock": options.stock, "quantity": pq.quantity, "currency": currency,
            "tolerance": options.tolerance, "scrap_percent": pq.extras.scrap,
            "overhead_percent": pq.extras.overhead, "margin_percent": pq.extras.margin,
            "stock_list": pq.extras.stock_list, "grooves": options.grooves,
            "blind_bore": options.blind_bore}


def result_of(pq: PartQuote, options: TurnOptions) -> TurningResult:
    """The one-part result of a quoted part (what ``revolve turn FILE`` shows)."""
    currency = options.currency_label()
    sec = _sections(pq)
    m = pq.material
    q = pq.quote
    tables = [Table("part", "Part", PART_FIELDS, (sec["part"],), figures=True),
              Table("faces", "Surface by face", FACE_FIELDS, tuple(sec["faces"])),
              Table("stock", f"Stock: {_KIND_TEXT[q.stock.size.kind]}", STOCK_FIELDS,
                    (sec["stock"],), figures=True),
              Table("removed", "Material removed", REMOVED_FIELDS, (sec["removed"],),
                    figures=True)]
    if sec["bars"] is not None:
        tables.append(Table("bars", f"Bars, {q.bars.quantity} part"
                            f"{'s' if q.bars.quantity != 1 else ''}", BAR_FIELDS,
                            (sec["bars"],), figures=True))
    tables += [Table("allowances", "Allowances", ALLOWANCE_FIELDS, (sec["allowances"],),
                     figures=True),
               Table("cutting", f"Cutting data ({m.group}: {pq.cutting_source}) and spindle "
                     f"speeds", CUTTING_FIELDS,
                     tuple(sec["cutting"])),
               Table("operations", "Operations in order, per part", OPERATION_FIELDS,
                     tuple(sec["operations"])),
               Table("operation_formulas", "How each operation is timed", FORMULA_FIELDS,
                     tuple(sec["operations"])),
               Table("times", "Time per part", TIME_FIELDS, (sec["times"],), figures=True),
               Table("cost", f"Cost and price, batch of {pq.quantity}", COST_FIELDS,
                     _cost_rows(pq, options))]
    return TurningResult("turn", units_for(pq.system, currency), _inputs(pq, options, currency),
                         tuple(tables), tuple(notes_of(pq)), ("turning",),
                         {"crosscheck_agrees": pq.agrees}, quote=q, part=pq)


def row_of(pq: PartQuote) -> Dict[str, Any]:
    """A part's row of the many-parts table (SI), every figure of the quote flat."""
    sec = _sections(pq)
    row: Dict[str, Any] = {"file": pq.file, "name": pq.name, "material": pq.material.key}
    for key in ("part", "stock", "removed", "times", "cost"):
        row.update(sec[key])
    if sec["bars"] is not None:
        row.update({k: sec["bars"][k] for k in ("parts_per_bar", "bars_needed")})
    row["quantity"] = pq.quantity
    row["started"] = pq.started
    row["crosscheck_agrees"] = pq.agrees
    return row


def parts_result(rows: Sequence[Mapping[str, Any]], system: str, options: TurnOptions,
                 notes: Sequence[str] = ()) -> Result:
    """Many parts: one table of rows (a refused part's row holds its ``error``)."""
    currency = options.currency_label()
    inputs = {"bar_list": system, "stock": options.stock, "currency": currency,
              "material": options.material, "tolerance": options.tolerance}
    n = len(rows)
    return Result("turn", units_for(system, currency), inputs,
                  (Table("parts", f"{n} turned part{'s' if n != 1 else ''}, {system} bar list",
                         ROW_FIELDS, tuple(rows)),), tuple(notes), ("turning",))


# -- the work of one part, for the batch --------------------------------------------------------


@dataclass(frozen=True)
class PartOutcome:
    """One part of a batch, small enough to come back from a worker: its row, notes and flags."""

    unit: Optional[str]
    row: Optional[Dict[str, Any]] = None
    notes: Tuple[str, ...] = ()
    agrees: bool = True
    speed_limited: bool = False
    error: Optional[str] = None


@dataclass(frozen=True)
class TurnTask:
    """Quote one ``(path, quantity)`` with a bar list (picklable; run by ``batch.run_many``)."""

    options: TurnOptions
    system: str
    job: Any = None

    def __call__(self, item) -> PartOutcome:
        from revolve.formats import load_profile

        path, quantity = item
        try:
            doc = load_profile(path, unit=self.options.units)
        except RevolveError as e:
            return PartOutcome(None, error=str(e.located(file=path)))
        try:
            pq = quote_document(doc, self.options, quantity, self.system, self.job)
        except RevolveError as e:
            return PartOutcome(doc.profile.unit, error=str(e.located(file=doc.file or path)))
        t = pq.quote.times
        return PartOutcome(doc.profile.unit, row_of(pq), tuple(notes_of(pq)), pq.agrees,
                           bool(t.roughing_limited or t.finishing_limited))


# -- the library ---------------------------------------------------------------------------------


def _options(material, bar_list, stock, kwargs) -> TurnOptions:
    """The options read and checked once (errors name the option)."""
    kwargs = dict(kwargs)
    no_finish = kwargs.pop("no_finish", ()) or ()
    if isinstance(no_finish, str):
        no_finish = (no_finish,)
    unknown = sorted(set(kwargs) - {f for f in TurnOptions.__dataclass_fields__})
    if unknown:
        raise RevolveError(f"unknown setting {quoted(unknown[0])}; give the options of "
                           f"revolve turn by their names, such as stock_price or blank")
    opts = TurnOptions(material=material, bar_list=bar_list, stock=stock,
                       no_finish=tuple(no_finish), **kwargs)
    opts.check()
    return opts


_OPTION = re.compile(r"--([a-z][a-z0-9]*(?:-[a-z0-9]+)*)")


def _library_named(error: RevolveError) -> RevolveError:
    """``error`` naming the library's argument (``stock_price``) where it names the option.

    Every option of ``revolve turn`` is the keyword of :func:`quote_turning`
    with its dashes turned to underscores, so the rule needs no table.

    Examples
    --------
    >>> print(_library_named(RevolveError("give --blank with it", option="--blank-length")))
    blank_length: give blank with it
    """
    def name(text):
        return _OPTION.sub(lambda m: m.group(1).replace("-", "_"), text) if text else text

    copy = error.located()
    copy.option, copy.message = name(error.option), name(error.message)
    copy.args = (copy.message,)
    return copy


def quote_turning(profile_or_path, *, material: Optional[str] = None, quantity: int = 1,
                  bar_list: Optional[str] = None, stock: str = "bar",
                  **settings: Any) -> TurningResult:
    """Quote a turned part: stock, material removed, bars, times and cost.

    The same computation as ``revolve turn``; ``result.to_dict()`` is exactly
    the object ``revolve turn FILE --json`` prints.

    Parameters
    ----------
    profile_or_path : str, os.PathLike, Profile, ProfileDocument or Revolution
        A profile file or a profile built in Python (a full revolution).
    material : str, optional
        A material of the table (``"carbon steel"``); it sets the density and
        the cutting data. Default: the file's ``material``.
    quantity : int
        Parts in the batch (bars needed, set-up shared, batch cost).
    bar_list : {"metric", "inch"}, optional
        Stock list; bare lengths are in its unit (mm or in). Default: inch
        for an inch drawing, else metric.
    stock : {"bar", "tube", "lighter"}
        Round bar, tube (hollow bar) suiting the bore, or whichever is lighter.
    **settings
        The other options of ``revolve turn`` by their names, as text:
        ``blank="60x30"``, ``blank_length``, ``turning_allowance="1/16 in"``,
        ``bore_allowance``, ``facing_allowance``, ``parting_width``,
        ``holding_length``, ``bar_length``, ``remnant``,
        ``stock_price="2.40/kg"``, ``machine_rate="85/h"``, ``setup_time="45"``
        (minutes), ``handling_time="30 s"``, ``whole_bars=True``,
        ``roughing="vc=220,f=0.3"``, ``finishing``, ``max_speed="3000"``
        (rev/min), ``no_finish=("bore",)``, ``currency="EUR"``, ``axis``,
        ``units`` (of point lists), ``tolerance``; the operations and the
        price: ``drilling="vc=25,f=0.15"``, ``grooves="2 x 3 x 1.5"``,
        ``blind_bore="12 x 20"``, ``scrap="3%"``, ``overhead="15%"``,
        ``margin="20%"``, ``stock_list="rack.csv"``, ``grade="S355"``.

    Returns
    -------
    TurningResult

    Raises
    ------
    revolve.RevolveError
        With the command line's one-sentence message (naming the option).

    Examples
    --------
    >>> from revolve.geometry.profile import Loop, Profile
    >>> pin = Profile(loops=(Loop.from_points([(0, 0), (50, 0), (50, 15), (0, 15)]),), name="pin")
    >>> r = quote_turning(pin, material="carbon steel", quantity=10, stock_price="2.40/kg",
    ...                   machine_rate="85/h")
    >>> r
    <TurningResult pin: 32 mm round bar, part 0.277442 kg, stock 0.347234 kg, cycle 0.414 min, 1.42 per part>
    >>> [op.name for op in r.operations]
    ['face', 'rough turn', 'finish turn', 'part off']

    By hand (steel table row; common practice, no source): face π·16²/(200 000·0.25)
    = 0.01608 min, rough turn 50/(0.3·200 000/(π·32)) = 0.08378 min, finish turn
    A/(vc f) = (π·30·50 + 2π·15²)/(260 000·0.12) = 0.1963 min, part off
    π·15²/(100 000·0.06) = 0.1178 min:

    >>> round(r.cycle_time / 60, 4)
    0.414
    >>> p = quote_turning(pin, material="carbon steel", quantity=100, stock_price="2.40/kg",
    ...                   machine_rate="85/h", setup_time="30", scrap="3%", margin="20%")
    >>> p.to_dict()["bars"]["started"], round(p.price_per_part / p.cost_per_part, 12)
    (103, 1.25)
    >>> round(r.volume * 1e9, 3) == round(math.pi * 15 ** 2 * 50, 3)      # π r² L, mm³
    True
    >>> round(r.to_dict()["stock"]["stock_mass"], 6)      # π/4 · 32² · 55 mm³ at 7850 kg/m³
    0.347234
    >>> quote_turning(pin, material="water")
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: material: a material of group 'liquid' cannot be turned; choose a solid material
    >>> quote_turning(pin, material="carbon steel", quantity=0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: quantity: must be a whole number of at least 1, got 0
    >>> quote_turning(pin, material="carbon steel", turning_allowance="1 kg")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: turning_allowance: 'kg' is a mass unit, not a length unit

    Lengths are text with a unit (``"1/16 in"``) or a pint quantity; a bare
    number is in the bar list's unit (mm, or in for an inch bar list), and
    prices and rates say what they are per (``"2.40/kg"``, ``"85/h"``).
    """
    try:
        opts = _options(material, bar_list, stock, settings)
        return quote_with(profile_or_path, opts, quantities(quantity, 1)[0])
    except RevolveError as e:
        raise _library_named(e) from None


def quote_with(profile_or_path, opts: TurnOptions, quantity: int) -> TurningResult:
    """:func:`quote_turning` with the options already read (the command line's entry)."""
    from revolve.jobs.measuring import as_document

    doc = as_document(profile_or_path, opts.units)
    system = opts.system_for(doc.profile.unit)
    return result_of(quote_document(doc, opts, quantity, system), opts)


@dataclass(frozen=True, repr=False)
class TurningBatch(Result):
    """Many parts' quotes: the ``parts`` table, and what each part reported."""

    outcomes: Tuple[Any, ...] = dc_field(default=(), compare=False)
    files: Tuple[str, ...] = dc_field(default=(), compare=False)

    @property
    def failed(self) -> List[Tuple[str, str]]:
        """``(file, error)`` of every part that was refused."""
        return [(f, o.error) for f, o in zip(self.files, self.outcomes) if o.error is not None]


def quote_turning_many(paths: Sequence[Any], *, material: Optional[str] = None,
                       quantity: Any = 1, bar_list: Optional[str] = None, stock: str = "bar",
                       workers: Optional[int] = None, serial_below: Optional[int] = None,
                       progress=None, **settings: Any) -> TurningBatch:
    """Quote many files: one row per part (``revolve turn FILES…``), on every core for many.

    The bar list follows the drawings (inch only when every one is drawn in
    inches) unless ``bar_list`` is given. A file that is refused keeps its
    row, with its ``error``; the others are still quoted. ``quantity`` is
    one number or one per path. Other settings as :func:`quote_turning`.

    Examples
    --------
    >>> import tempfile, pathlib
    >>> folder = pathlib.Path(tempfile.mkdtemp())
    >>> _ = (folder / "pin.txt").write_text(chr(10).join(["0,0", "50,0", "50,15", "0,15"]))
    >>> b = quote_turning_many([folder / "pin.txt", folder / "gone.txt"], material="carbon steel",
    ...                        quantity=[10, 5])
    >>> b.to_dict()["parts"][0]["quantity"], [error for _, error in b.failed]   # doctest: +ELLIPSIS
    (10, ['...gone.txt: no such file; check the name and folder'])
    >>> quote_turning_many([])
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: give at least one profile file
    >>> quote_turning_many(["a.toml"], quantity=[1, 2])     # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: quantity: give one quantity (for every profile) or one per profile...
    """
    from revolve.jobs import batch

    try:
        batch.check_workers(workers, option="workers")
        opts = _options(material, bar_list, stock, settings)
        files = [os.fspath(p) for p in paths]
        if not files:
            raise RevolveError("give at least one profile file")
        return quote_many_with(files, opts, quantities(quantity, len(files)), workers=workers,
                               serial_below=serial_below, progress=progress)
    except RevolveError as e:
        raise _library_named(e) from None


def quote_many_with(files: Sequence[str], opts: TurnOptions, counts: Sequence[int], *,
                    workers: Optional[int] = None, serial_below: Optional[int] = None,
                    progress=None) -> "TurningBatch":
    """:func:`quote_turning_many` with the options already read (the command line's entry)."""
    from revolve.jobs import batch

    batch.check_workers(workers)
    items = list(zip(files, counts))
    pool = {} if serial_below is None else {"serial_below": serial_below}

    def run(system: str):
        task = TurnTask(opts, system, (opts.job(system), opts.extras(system)))
        return [r.value if r.ok else PartOutcome(None, error=r.error)
                for r in batch.run_many(task, items, workers=workers, progress=progress, **pool)]

    if opts.bar_list is not None:
        system = opts.system_for("mm")
        outcomes = run(system)
    else:
        from revolve.formats import load_profile

        try:
            first = load_profile(files[0], unit=opts.units).profile.unit
        except RevolveError:
            first = "mm"            # reported in its row
        system = system_of(first)
        outcomes = run(system)
        found = "inch" if all(o.unit is not None and system_of(o.unit) == "inch"
                              for o in outcomes) else "metric"
        if found != system:
            system = found
            outcomes = run(system)
    rows, notes = [], []
    for f, o in zip(files, outcomes):
        rows.append(o.row if o.row is not None else {"file": f, "error": o.error})
        stem = os.path.splitext(os.path.basename(f))[0]
        notes.extend(f"{stem}: {n}" for n in o.notes)
    base = parts_result(rows, system, opts, notes)
    return TurningBatch(base.command, base.units, {**base.inputs, "quantity": counts},
                        base.tables, base.notes, base.cautions, outcomes=tuple(outcomes),
                        files=tuple(files))
