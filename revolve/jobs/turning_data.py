"""The turning tables: standard bar and tube sizes, default allowances, cutting data.

``revolve/data/bar_sizes.toml`` holds a metric (mm) and an inch list of round
bar diameters and tube (hollow bar) sizes, each with its source, and default
allowances and bar lengths per system. ``revolve/data/cutting_data.toml``
holds roughing and finishing cutting data (vc in m/min, f in mm/rev, ap in mm)
per material group of ``revolve/data/materials.toml``. Both are read once and
converted to SI (:mod:`revolve.jobs.turning` works in metres and seconds).

Examples
--------
>>> metric = load_bar_list("metric")
>>> metric.unit, metric.round_bars[0].label, metric.round_bars[0].outside_diameter
('mm', '3 mm', 0.003)
>>> inch = load_bar_list("inch")
>>> two = [s for s in inch.round_bars if s.label == "2 in"][0]
>>> two.outside_diameter == 2 * 0.0254          # 1 in = 25.4 mm (1959 agreement)
True
>>> [s.label for s in inch.round_bars if s.label.startswith("1 1/")][:2]
['1 1/16 in', '1 1/8 in']
>>> steel = cutting_data_for("steel")
>>> steel.roughing.trade_units(), steel.source
((200.0, 0.3, 3.0), 'typical, common practice, no source')
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from fractions import Fraction
from functools import lru_cache
from typing import Any, Dict, Mapping, Tuple

from revolve.errors import FormatError, MaterialError
from revolve.jobs.turning import CuttingData, StockSize

SYSTEMS = ("metric", "inch")
_BAR_FILE = "bar_sizes.toml"
_CUTTING_FILE = "cutting_data.toml"
#: Groups of the material table that can be turned (``liquid`` cannot).
TURNING_GROUPS = ("steel", "stainless", "cast iron", "aluminium", "copper alloy", "titanium",
                  "plastic", "other")
_DEFAULT_KEYS = ("bar_length", "remnant", "turning_allowance", "bore_allowance",
                 "facing_allowance", "parting_width", "holding_length")


@dataclass(frozen=True)
class StockDefaults:
    """Default bar length, remnant and allowances of one system, in metres."""

    bar_length: float
    remnant: float
    turning_allowance: float
    bore_allowance: float
    facing_allowance: float
    parting_width: float
    holding_length: float
    source: str


@dataclass(frozen=True)
class BarList:
    """One system's stock sizes (in metres) with the unit they are written in."""

    system: str
    unit: str
    round_bars: Tuple[StockSize, ...]
    tubes: Tuple[StockSize, ...]
    defaults: StockDefaults


@dataclass(frozen=True)
class GroupCuttingData:
    """Roughing and finishing cutting data of one material group."""

    group: str
    roughing: CuttingData
    finishing: CuttingData
    source: str


def size_text(value: float, unit: str) -> str:
    """A size as written in its list: decimals for mm, fractions to 1/64 for inches.

    >>> size_text(50.0, "mm"), size_text(2.25, "in"), size_text(0.3125, "in"), size_text(1.3, "in")
    ('50', '2 1/4', '5/16', '1.3')
    """
    if unit == "in":
        frac = Fraction(value).limit_denominator(64)
        den = frac.denominator
        if float(frac) == value and den != 1 and den & (den - 1) == 0:
            whole, rest = divmod(frac.numerator, frac.denominator)
            part = f"{rest}/{den}"
            return f"{whole} {part}" if whole else part
    return f"{value:g}"


def _toml():
    from revolve.datafiles import toml

    return toml()


def _read(name: str) -> str:
    from revolve.datafiles import bundled_text

    return bundled_text(name)


def _number(value: Any, file: str, place: str, *, positive: bool = True) -> float:
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value) \
            or value < 0 or (positive and value == 0):
        raise FormatError(f"must be a {'positive' if positive else 'non-negative'} number, not "
                          f"{value!r}", file=file, place=place)
    return float(value)


def _source(table: Mapping, file: str, place: str) -> str:
    src = table.get("source")
    if not isinstance(src, str) or not src.strip():
        raise FormatError("every list needs a non-empty 'source'", file=file, place=place)
    return src


def parse_bar_sizes(text: str, system: str, file: str = _BAR_FILE) -> BarList:
    """Read one system of a bar-size table in the format of ``bar_sizes.toml``.

    Raises
    ------
    FormatError
        On bad TOML, a missing list or source, or a size that is not a positive number.

    Examples
    --------
    >>> bl = parse_bar_sizes('''
    ... [metric]
    ... unit = "mm"
    ... round_bar = { source = "invented, demo only", diameters = [10, 12] }
    ... tube = { source = "invented, demo only", sizes = [[12, 6]] }
    ... [metric.defaults]
    ... source = "invented, demo only"
    ... bar_length = 1000
    ... remnant = 50
    ... turning_allowance = 2
    ... bore_allowance = 2
    ... facing_allowance = 1
    ... parting_width = 3
    ... holding_length = 0
    ... ''', "metric", file="shop.toml")
    >>> [s.label for s in bl.round_bars], bl.tubes[0].label, bl.defaults.bar_length
    (['10 mm', '12 mm'], '12 × 6 mm', 1.0)
    >>> parse_bar_sizes('[metric]\\nunit = "mm"', "metric", file="shop.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: shop.toml: metric.round_bar: missing; give source and diameters
    """
    from revolve.units import factor

    tomllib = _toml()
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise FormatError(f"not valid TOML: {exc}", file=file) from None
    table = doc.get(system)
    if not isinstance(table, dict):
        raise FormatError(f"no [{system}] table", file=file)
    unit = table.get("unit")
    if unit not in ("mm", "in"):
        raise FormatError("unit must be \"mm\" or \"in\"", file=file, place=f"{system}.unit")
    to_m = factor(unit, "length")
    bars_t = table.get("round_bar")
    if not isinstance(bars_t, dict):
        raise FormatError("missing; give source and diameters", file=file,
                          place=f"{system}.round_bar")
    src = _source(bars_t, file, f"{system}.round_bar")
    diameters = bars_t.get("diameters")
    if not isinstance(diameters, list) or not diameters:
        raise FormatError("diameters must be a non-empty list", file=file,
                          place=f"{system}.round_bar")
    bars = []
    for k, d in enumerate(diameters, 1):
        d = _number(d, file, f"{system}.round_bar, diameter {k}")
        bars.append(StockSize(d * to_m, 0.0, f"{size_text(d, unit)} {unit}", "bar", src))
    tubes = []
    tube_t = table.get("tube")
    if tube_t is not None:
        if not isinstance(tube_t, dict):
            raise FormatError("must be a table with source and sizes", file=file,
                              place=f"{system}.tube")
        tsrc = _source(tube_t, file, f"{system}.tube")
        sizes = tube_t.get("sizes")
        if not isinstance(sizes, list):
            raise FormatError("sizes must be a list of [outside, inside] pairs", file=file,
                              place=f"{system}.tube")
        for k, pair in enumerate(sizes, 1):
            place = f"{system}.tube, size {k}"
            if not isinstance(pair, list) or len(pair) != 2:
                raise FormatError("each size is [outside diameter, inside diameter]", file=file,
                                  place=place)
            od, idia = (_number(v, file, place) for v in pair)
            if idia >= od:
                raise FormatError("the inside diameter must be smaller than the outside",
                                  file=file, place=place)
            tubes.append(StockSize(od * to_m, idia * to_m,
                                   f"{size_text(od, unit)} × {size_text(idia, unit)} {unit}",
                                   "tube", tsrc))
    dt = table.get("defaults")
    if not isinstance(dt, dict):
        raise FormatError("missing", file=file, place=f"{system}.defaults")
    dsrc = _source(dt, file, f"{system}.defaults")
    values = {}
    for key in _DEFAULT_KEYS:
        if key not in dt:
            raise FormatError(f"missing {key}", file=file, place=f"{system}.defaults")
        values[key] = _number(dt[key], file, f"{system}.defaults.{key}",
                              positive=key == "bar_length") * to_m
    bars.sort(key=lambda s: s.outside_diameter)
    return BarList(system, unit, tuple(bars), tuple(tubes), StockDefaults(source=dsrc, **values))


@lru_cache(maxsize=None)
def load_bar_list(system: str) -> BarList:
    """The package's bar list of ``system`` ("metric" or "inch"), read once.

    >>> load_bar_list("imperial")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --bar-list: choose metric or inch, not 'imperial'
    """
    if system not in SYSTEMS:
        from revolve.errors import RevolveError

        raise RevolveError(f"choose metric or inch, not {system!r}", option="--bar-list")
    text = _read(_BAR_FILE)
    return parse_bar_sizes(text, system, file=_BAR_FILE)


def parse_cutting_data(text: str, file: str = _CUTTING_FILE) -> Dict[str, GroupCuttingData]:
    """Read a cutting-data table in the format of ``cutting_data.toml`` into SI.

    Every turning group must be present, each with a source, ``roughing`` and
    ``finishing`` tables of ``vc`` (m/min), ``f`` (mm/rev) and ``ap`` (mm).

    Examples
    --------
    >>> parse_cutting_data('[steel]\\nsource = "x"\\nroughing = { vc = 200, f = 0.3, ap = 3 }',
    ...                    file="cd.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: cd.toml: steel.finishing: missing; give vc, f and ap
    """
    tomllib = _toml()
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise FormatError(f"not valid TOML: {exc}", file=file) from None
    unknown = sorted(set(doc) - set(TURNING_GROUPS))
    if unknown:
        raise FormatError(f"unknown group(s) {', '.join(unknown)}; groups are "
                          f"{', '.join(TURNING_GROUPS)}", file=file)
    out = {}
    for group, table in doc.items():
        if not isinstance(table, dict):
            raise FormatError("must be a table", file=file, place=group)
        src = _source(table, file, group)
        sets = []
        for kind in ("roughing", "finishing"):
            t = table.get(kind)
            place = f"{group}.{kind}"
            if not isinstance(t, dict):
                raise FormatError("missing; give vc, f and ap", file=file, place=place)
            if sorted(t) != ["ap", "f", "vc"]:
                raise FormatError("give exactly vc (m/min), f (mm/rev) and ap (mm)", file=file,
                                  place=place)
            sets.append(CuttingData.from_trade_units(
                *(_number(t[k], file, f"{place}.{k}") for k in ("vc", "f", "ap"))))
        out[group] = GroupCuttingData(group, sets[0], sets[1], src)
    return out


@lru_cache(maxsize=None)
def load_cutting_data() -> Mapping[str, GroupCuttingData]:
    """The package's cutting data by material group, read once.

    >>> sorted(load_cutting_data()) == sorted(TURNING_GROUPS)
    True
    """
    from types import MappingProxyType

    text = _read(_CUTTING_FILE)
    table = parse_cutting_data(text, file=_CUTTING_FILE)
    missing = [g for g in TURNING_GROUPS if g not in table]
    if missing:
        raise FormatError(f"missing group(s) {', '.join(missing)}", file=_CUTTING_FILE)
    return MappingProxyType(table)


def cutting_data_for(group: str) -> GroupCuttingData:
    """Cutting data of a material group; a group that cannot be turned is refused.

    >>> cutting_data_for("liquid")
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: a material of group 'liquid' cannot be turned; choose a solid material
    """
    table = load_cutting_data()
    if group not in table:
        raise MaterialError(f"a material of group {group!r} cannot be turned; choose a solid "
                            f"material")
    return table[group]
