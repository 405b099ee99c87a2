"""Turned parts as operations in order: face, turn, drill, bore, groove, part off, each timed.

A part is described by its **features** (:class:`Features`): the outer
diameters with their lengths, a bore (diameter and depth), grooves (count,
width, depth at a diameter) and the diameter where it is parted off.
:func:`plan_operations` lays the operations out in the usual order and times
each from its own cutting data (:class:`OperationData`, per operation and
material group in ``revolve/data/operations.toml``), listing the formula it
used. :func:`price_batch` adds set-up, scrap, overhead and margin.

Everything is a plain float in SI units: metres, seconds, metres per second
(cutting speed vc), metres per revolution (feed f), metres (depth of cut ap),
revolutions per second (spindle speed n). Inch shops give sfm and in/rev to
:meth:`OperationData.from_inch`, which converts once.

The trade formulas (all "common practice, no source"):

* spindle speed ``n = vc / (π D)``, capped at the machine's speed limit;
* one pass along the axis ``t = L / (f n)``;
* a radial pass (facing, grooving, parting) at constant cutting speed from
  radius R in to r: ``t = π (R² − r²) / (vc f)``, and where the speed limit
  caps the spindle (below ``r_c = vc / (2π n_max)``) ``t = Δr / (f n_max)``;
* twist drilling ``t = (hole depth + point length) / (f n)``, point length
  ``(d/2) / tan(point angle / 2)`` (118° drill: about 0.30 d).

Approach, retract, tool change and rapid moves are not counted: add them to
the set-up or to a margin.

Examples
--------
A steel pin ⌀30 × 50 mm from ⌀32 bar, with a ⌀12 × 20 mm bore:

>>> data = operation_data_for("steel")
>>> part = Features(outer_steps=(OuterStep(0.030, 0.050),), bore_diameter=0.012,
...                 bore_depth=0.020)
>>> plan = plan_operations(part, stock_diameter=0.032, data=data)
>>> [op.name for op in plan.operations]
['face', 'rough turn', 'finish turn', 'centre drill', 'drill', 'bore', 'part off']
>>> plan.cycle_time == sum(op.time for op in plan.operations)
True
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from functools import lru_cache
from typing import Any, Dict, Mapping, Optional, Tuple

from revolve.errors import FormatError, RevolveError
from revolve.inputs import checked_number

#: The operations in the order they are done.
OPERATIONS = ("face", "rough turn", "finish turn", "centre drill", "drill", "bore", "groove",
              "part off")
#: Operations whose data carry a depth of cut ap.
WITH_DEPTH = ("face", "rough turn", "finish turn", "bore")
#: Groups of the material table that can be turned.
GROUPS = ("steel", "stainless", "cast iron", "aluminium", "copper alloy", "titanium", "plastic",
          "other")
_DATA_FILE = "operations.toml"
_RULE_KEYS = ("min_boring_bar_diameter", "largest_drill", "bore_stock", "drill_point_angle",
              "centre_drill_diameter", "centre_drill_depth", "groove_tool_width",
              "tailstock_ratio", "steady_rest_ratio", "depth_per_diameter", "feed_per_diameter",
              "deep_hole_ratio")
_RULE_UNITS = {"mm": 0.001, "degree": math.pi / 180.0, "1": 1.0}
#: Relative slack when comparing sizes (a nanometre per metre).
_SLACK = 1e-9
#: Most passes one operation may take (a bound on the work and on a typo such as ap = 0.001 mm).
MAX_PASSES = 10_000

#: Cautions a turning quote shows.
CAUTIONS = (
    "Times and costs are estimates from nominal geometry and typical cutting data.",
    "Cutting data (vc, f, ap) comes from the tool supplier for the tool, grade and machine used.",
    "Guard rotating parts, chucks and bar ends; never reach into a running machine.",
    "Respect the machine's speed limit for the part's size, chucking and balance; "
    "long parts need support (tailstock or steady rest).",
)


# --------------------------------------------------------------------------- data

@dataclass(frozen=True)
class OperationData:
    """Cutting data of one operation: vc (m/s), f (m/rev), ap (m, None for plunging and drilling).

    Examples
    --------
    >>> d = OperationData.from_metric(200, 0.3, 3)          # m/min, mm/rev, mm
    >>> round(d.cutting_speed, 12), d.feed, d.depth_of_cut
    (3.333333333333, 0.0003, 0.003)
    >>> d.trade_units("metric")
    (200.0, 0.3, 3.0)

    An inch shop's 650 sfm and 0.012 in/rev, entered as such and shown as such
    (1 ft = 0.3048 m, 1 in = 0.0254 m, 1959 agreement):

    >>> i = OperationData.from_inch(650, 0.012, 0.1)
    >>> i.trade_units("inch")
    (650.0, 0.012, 0.1)
    >>> round(i.cutting_speed * 60, 6)                      # m/min
    198.12
    >>> OperationData.from_metric(25, 0.15).depth_of_cut is None
    True
    >>> OperationData.from_metric(0, 0.1)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: cutting speed vc: must be a positive number, got 0.0
    """

    cutting_speed: float
    feed: float
    depth_of_cut: Optional[float] = None

    def __post_init__(self):
        object.__setattr__(self, "cutting_speed", checked_number(self.cutting_speed, "cutting speed vc"))
        object.__setattr__(self, "feed", checked_number(self.feed, "feed f"))
        if self.depth_of_cut is not None:
            object.__setattr__(self, "depth_of_cut", checked_number(self.depth_of_cut, "depth of cut ap"))

    @classmethod
    def from_metric(cls, vc_m_per_min: float, f_mm_per_rev: float,
                    ap_mm: Optional[float] = None) -> "OperationData":
        """From m/min, mm/rev and mm."""
        return cls(float(vc_m_per_min) / 60.0, float(f_mm_per_rev) / 1000.0,
                   None if ap_mm is None else float(ap_mm) / 1000.0)

    @classmethod
    def from_inch(cls, sfm: float, ipr: float, doc_in: Optional[float] = None) -> "OperationData":
        """From surface feet per minute, inches per revolution and inches (converted here, once)."""
        from revolve.units import factor

        foot, inch = factor("ft", "length"), factor("in", "length")
        return cls(float(sfm) * foot / 60.0, float(ipr) * inch,
                   None if doc_in is None else float(doc_in) * inch)

    def trade_units(self, system: str = "metric") -> Tuple[Optional[float], ...]:
        """(vc, f, ap) as a shop writes them: m/min, mm/rev, mm, or sfm, in/rev, in (12 digits)."""
        from revolve.units import factor

        if system == "inch":
            speed, length = factor("ft", "length") / 60.0, factor("in", "length")
        elif system == "metric":
            speed, length = 1.0 / 60.0, 0.001
        else:
            raise RevolveError(f"unknown unit system {system!r}; use metric or inch")
        ap = None if self.depth_of_cut is None else self.depth_of_cut / length
        return tuple(None if v is None else float(f"{v:.12g}")
                     for v in (self.cutting_speed / speed, self.feed / length, ap))


@dataclass(frozen=True)
class Rules:
    """The planning rules in SI (metres, radians, plain ratios), each with its source.

    Examples
    --------
    >>> r = load_rules()
    >>> r.min_boring_bar_diameter, r.largest_drill, round(math.degrees(r.drill_point_angle), 9)
    (0.008, 0.04, 118.0)
    >>> r.sources["tailstock_ratio"].startswith("rule of thumb, common practice")
    True
    >>> Rules(**{**r.__dict__, "largest_drill": 0.005})
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: rules: the largest drill (0.005 m) must be larger than the smallest boring bar (0.008 m)
    """

    min_boring_bar_diameter: float = 0.008
    largest_drill: float = 0.040
    bore_stock: float = 0.002
    drill_point_angle: float = math.radians(118.0)
    centre_drill_diameter: float = 0.0063
    centre_drill_depth: float = 0.004
    groove_tool_width: float = 0.003
    tailstock_ratio: float = 4.0
    steady_rest_ratio: float = 10.0
    depth_per_diameter: float = 0.25
    feed_per_diameter: float = 0.02
    deep_hole_ratio: float = 5.0
    sources: Mapping[str, str] = field(default_factory=dict, compare=False)

    def __post_init__(self):
        for key in _RULE_KEYS:
            object.__setattr__(self, key, checked_number(getattr(self, key), key.replace("_", " ")))
        if not self.drill_point_angle < math.pi:
            raise RevolveError("the drill point angle must be below 180°", place="rules")
        if self.largest_drill <= self.min_boring_bar_diameter:
            raise RevolveError(f"the largest drill ({self.largest_drill:g} m) must be larger than "
                               f"the smallest boring bar ({self.min_boring_bar_diameter:g} m)",
                               place="rules")
        if self.bore_stock >= self.min_boring_bar_diameter:
            raise RevolveError("the bore stock must be smaller than the smallest boring bar",
                               place="rules")


@lru_cache(maxsize=None)
def _table() -> Dict[str, Any]:
    from revolve.datafiles import bundled_text, toml

    return toml().loads(bundled_text(_DATA_FILE))


def load_rules(system: str = "metric") -> Rules:
    """The planning rules of ``revolve/data/operations.toml``, in SI, with their sources.

    An inch shop (``system="inch"``) takes a size rule's ``inch`` value (in
    inches: a 1/16 in bore stock, not 0.0787 in) where the row has one.

    Examples
    --------
    >>> load_rules("inch").bore_stock == 0.0625 * 0.0254, load_rules().bore_stock
    (True, 0.002)
    """
    rules = _table().get("rules", {})
    values, sources = {}, {}
    for key in _RULE_KEYS:
        row = rules.get(key)
        if not isinstance(row, dict) or row.get("unit") not in _RULE_UNITS \
                or not isinstance(row.get("source"), str) or not row["source"].strip():
            raise FormatError("needs a value, a unit (mm, degree or 1) and a source",
                              file=_DATA_FILE, place=f"rules.{key}")
        if system == "inch" and "inch" in row:
            from revolve.units import factor

            values[key] = checked_number(row["inch"], f"rules.{key}.inch") * factor("in", "length")
        else:
            values[key] = checked_number(row.get("value"), f"rules.{key}") * _RULE_UNITS[row["unit"]]
        sources[key] = row["source"]
    return Rules(**values, sources=sources)


def operation_data_for(group: str) -> Dict[str, OperationData]:
    """Cutting data of every operation for one material group, in SI.

    Examples
    --------
    >>> d = operation_data_for("aluminium")
    >>> d["drill"].trade_units(), d["rough turn"].trade_units()
    ((80.0, 0.2, None), (500.0, 0.3, 4.0))
    >>> operation_data_for("cheese")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: no cutting data for the material group 'cheese'; groups: steel, stainless, cast iron, aluminium, copper alloy, titanium, plastic, other
    """
    table = _table().get(group) if group in GROUPS else None
    if table is None:
        from revolve.errors import quoted

        raise RevolveError(f"no cutting data for the material group {quoted(group)}; groups: "
                           f"{', '.join(GROUPS)}")
    out = {}
    for op in OPERATIONS:
        row = table.get(op)
        if not isinstance(row, dict) or ("ap" in row) != (op in WITH_DEPTH):
            raise FormatError(f"needs vc and f{' and ap' if op in WITH_DEPTH else ''}",
                              file=_DATA_FILE, place=f"{group}.{op}")
        out[op] = OperationData.from_metric(row.get("vc"), row.get("f"), row.get("ap"))
    return out


def _step(value: float, step: float) -> float:
    return float(f"{max(step, round(value / step) * step):.12g}")


def as_shop_writes(data: Mapping[str, OperationData], system: str) -> Dict[str, OperationData]:
    """The cutting data as a shop of ``system`` writes it: inch shops in round sfm and in/rev.

    The table is metric; an inch shop's figures are its rows rounded to the
    steps such shops use (sfm to 5 below 200 and to 25 above, in/rev to
    0.0005, depth of cut to 0.005 in; common practice, no source), so a
    quote shows 650 sfm, not 656.2. Metric data are returned as they are.

    Examples
    --------
    >>> d = as_shop_writes(operation_data_for("steel"), "inch")
    >>> d["rough turn"].trade_units("inch"), d["drill"].trade_units("inch")
    ((650.0, 0.012, 0.12), (80.0, 0.006, None))
    >>> as_shop_writes({}, "inch")
    {}
    """
    if system != "inch":
        return dict(data)
    out = {}
    for op, d in data.items():
        vc, f, ap = d.trade_units("inch")
        out[op] = OperationData.from_inch(_step(vc, 5.0 if vc < 200 else 25.0), _step(f, 0.0005),
                                          None if ap is None else _step(ap, 0.005))
    return out


def data_source(group: str) -> str:
    """Where a group's cutting data comes from.

    >>> data_source("steel")
    'typical, common practice, no source (from memory)'
    """
    operation_data_for(group)
    return _table()[group]["source"]


# --------------------------------------------------------------------------- formulas

def spindle_speed(cutting_speed: float, diameter: float,
                  speed_limit: Optional[float] = None) -> float:
    """n = vc / (π D) in rev/s, capped at ``speed_limit`` (rev/s); the limit (or inf) at D = 0.

    Examples
    --------
    >>> round(spindle_speed(200 / 60, 0.05) * 60, 6)      # 1000 × 200 / (π × 50) rev/min
    1273.239545
    >>> spindle_speed(200 / 60, 0.05, speed_limit=20.0) * 60      # capped at 1200 rev/min
    1200.0
    >>> spindle_speed(1.0, 0.0), spindle_speed(1.0, 0.0, 50.0)
    (inf, 50.0)
    """
    n = math.inf if diameter <= 0 else cutting_speed / (math.pi * diameter)
    return n if speed_limit is None else min(n, speed_limit)


def pass_time(length: float, feed: float, speed: float) -> float:
    """One pass along the axis: t = L / (f n), in seconds.

    >>> pass_time(0.05, 0.0002, 1000 / 60)      # 50 mm at 0.2 mm/rev and 1000 rev/min: 15 s
    15.0
    >>> pass_time(0.0, 0.0002, 10.0)
    0.0
    """
    return max(0.0, length) / (feed * speed)


def radial_pass_time(outer_radius: float, inner_radius: float, cutting_speed: float, feed: float,
                     speed_limit: Optional[float] = None) -> float:
    """A radial pass in from R to r at constant cutting speed, capped by the speed limit, in s.

    With n(ρ) = min(vc/(2πρ), n_max), t = ∫ dρ / (f n(ρ)): π (R² − r²)/(vc f)
    where the spindle is not capped, Δr/(f n_max) below r_c = vc/(2π n_max).

    Examples
    --------
    Facing ⌀50 to the centre at 200 m/min and 0.25 mm/rev, no limit:
    π · 25² mm² / (200 000 mm/min · 0.25 mm) = 0.03927 min:

    >>> round(radial_pass_time(0.025, 0.0, 200 / 60, 0.00025) / 60, 6)
    0.03927
    >>> radial_pass_time(0.01, 0.01, 1.0, 0.001)
    0.0

    Capped at 1000 rev/min: r_c = 200 000/(2π·1000) = 31.83 mm > 25 mm, so the
    whole pass runs at 1000 rev/min: 25 mm / (0.25 mm · 1000 /min) = 0.1 min:

    >>> round(radial_pass_time(0.025, 0.0, 200 / 60, 0.00025, 1000 / 60) / 60, 12)
    0.1
    """
    if outer_radius <= inner_radius:
        return 0.0
    r_c = 0.0 if speed_limit is None else cutting_speed / (2.0 * math.pi * speed_limit)
    free_in = max(inner_radius, r_c)
    t = 0.0
    if outer_radius > free_in:
        t += math.pi * (outer_radius ** 2 - free_in ** 2) / (cutting_speed * feed)
    if r_c > inner_radius:
        t += (min(r_c, outer_radius) - inner_radius) / (feed * speed_limit)
    return t


def drill_point_length(diameter: float, point_angle: float = math.radians(118.0)) -> float:
    """Axial length of a twist drill's point: (d/2) / tan(point angle / 2), in metres.

    Examples
    --------
    >>> round(drill_point_length(0.010) * 1000, 4)        # 118°: 5 / tan 59° mm
    3.0043
    >>> drill_point_length(0.0)
    0.0
    """
    return 0.5 * diameter / math.tan(0.5 * point_angle)


def drill_time(depth: float, diameter: float, data: OperationData,
               speed_limit: Optional[float] = None,
               point_angle: float = math.radians(118.0)) -> float:
    """Twist-drill time t = (hole depth + point length) / (f n), n = vc/(π d) capped, in s.

    Examples
    --------
    ⌀10 × 30 mm at 25 m/min and 0.15 mm/rev: n = 25 000/(π · 10) = 795.8 rev/min,
    t = (30 + 3.004) mm / (0.15 mm × 795.8 /min) = 0.2765 min:

    >>> d = OperationData.from_metric(25, 0.15)
    >>> round(drill_time(0.030, 0.010, d) / 60, 4)
    0.2765
    >>> drill_time(0.0, 0.010, d) > 0                    # the point still has to go in
    True
    """
    n = spindle_speed(data.cutting_speed, diameter, speed_limit)
    return (max(0.0, depth) + drill_point_length(diameter, point_angle)) / (data.feed * n)


def equal_passes(stock: float, depth_of_cut: float, what: str = "operation") -> int:
    """Passes that take ``stock`` off at no more than ``depth_of_cut`` each: ceil(stock / ap).

    >>> equal_passes(0.0035, 0.003), equal_passes(0.003, 0.003), equal_passes(0.0, 0.003)
    (2, 1, 0)
    >>> equal_passes(1.0, 1e-6, "rough turn")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: rough turn: 1000000 passes is more than 10000; check the depth of cut
    """
    if stock <= 0:
        return 0
    count = max(1, math.ceil(stock / depth_of_cut * (1 - _SLACK)))
    if count > MAX_PASSES:
        raise RevolveError(f"{count} passes is more than {MAX_PASSES}; check the depth of cut",
                           place=what)
    return count


# --------------------------------------------------------------------------- features

@dataclass(frozen=True)
class OuterStep:
    """One outside diameter and its length along the axis, in metres."""

    diameter: float
    length: float

    def __post_init__(self):
        checked_number(self.diameter, "outer step diameter")
        checked_number(self.length, "outer step length")


@dataclass(frozen=True)
class Grooves:
    """``count`` grooves of ``width`` and radial ``depth``, cut at ``diameter`` (metres)."""

    count: int
    width: float
    depth: float
    diameter: float

    def __post_init__(self):
        if isinstance(self.count, bool) or not isinstance(self.count, int) or self.count < 0:
            raise RevolveError(f"must be a whole number of zero or more, got {self.count!r}",
                               place="groove count")
        checked_number(self.width, "groove width")
        checked_number(self.depth, "groove depth")
        checked_number(self.diameter, "groove diameter")
        if 2 * self.depth >= self.diameter:
            raise RevolveError("the groove is deeper than the radius it is cut in",
                               place="groove depth")


@dataclass(frozen=True)
class Features:
    """What a turned part is made of, in metres.

    ``outer_steps`` are the finished outside diameters with their lengths (the
    part's length is their sum); ``bore_diameter`` and ``bore_depth`` describe
    one bore from the faced end (0 for none; a depth of the whole length is a
    through bore); ``part_off_diameter`` is where the part is cut from the bar
    (default: the last step's diameter).

    Examples
    --------
    >>> f = Features((OuterStep(0.03, 0.02), OuterStep(0.02, 0.01)), bore_diameter=0.01,
    ...              bore_depth=0.03)
    >>> round(f.length, 12), f.through_bore, f.part_off_at
    (0.03, True, 0.02)
    >>> Features(())
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: features: a turned part needs at least one outer diameter
    >>> Features((OuterStep(0.02, 0.01),), bore_diameter=0.02, bore_depth=0.01)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: bore diameter: the bore (0.02 m) must be smaller than the smallest outer diameter (0.02 m)
    """

    outer_steps: Tuple[OuterStep, ...]
    bore_diameter: float = 0.0
    bore_depth: float = 0.0
    grooves: Optional[Grooves] = None
    part_off_diameter: Optional[float] = None

    def __post_init__(self):
        object.__setattr__(self, "outer_steps", tuple(self.outer_steps))
        if not self.outer_steps:
            raise RevolveError("a turned part needs at least one outer diameter", place="features")
        checked_number(self.bore_diameter, "bore diameter", zero=True)
        checked_number(self.bore_depth, "bore depth", zero=True)
        if (self.bore_diameter > 0) != (self.bore_depth > 0):
            raise RevolveError("give both the bore diameter and its depth, or neither",
                               place="bore")
        smallest = min(s.diameter for s in self.outer_steps)
        if self.bore_diameter >= smallest:
            raise RevolveError(f"the bore ({self.bore_diameter:g} m) must be smaller than the "
                               f"smallest outer diameter ({smallest:g} m)", place="bore diameter")
        if self.bore_depth > self.length * (1 + _SLACK):
            raise RevolveError("the bore is deeper than the part is long", place="bore depth")
        if self.part_off_diameter is not None:
            checked_number(self.part_off_diameter, "part-off diameter")

    @property
    def length(self) -> float:
        return math.fsum(s.length for s in self.outer_steps)

    @property
    def through_bore(self) -> bool:
        return self.bore_diameter > 0 and self.bore_depth >= self.length * (1 - _SLACK)

    @property
    def part_off_at(self) -> float:
        return self.part_off_diameter if self.part_off_diameter is not None \
            else self.outer_steps[-1].diameter


def features_from_profile(prepared, length_factor: float = 1.0) -> Features:
    """The features the profile's envelope gives: one outer diameter over the length, a through bore.

    From :func:`revolve.geometry.envelope.extent` (every segment's bounds): the
    largest diameter over the whole length and, when the section keeps clear
    of the axis, a through bore at the smallest diameter. Steps, blind bores
    and grooves are not found from the envelope: give them as
    :class:`Features` (the envelope is what the engine already offers; a step
    finder would redo geometry).

    Examples
    --------
    A ⌀40 × 30 mm bush with a ⌀20 through bore:

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> bush = Profile(loops=(Loop.from_points([(0, 10), (30, 10), (30, 20), (0, 20)]),))
    >>> f = features_from_profile(prepare(bush, Axis.x()), length_factor=0.001)
    >>> f.outer_steps, f.bore_diameter, f.through_bore
    ((OuterStep(diameter=0.04, length=0.03),), 0.02, True)
    >>> pin = Profile(loops=(Loop.from_points([(0, 0), (30, 0), (30, 20), (0, 20)]),))
    >>> features_from_profile(prepare(pin, Axis.x()), 0.001).bore_diameter
    0.0
    """
    from revolve.errors import ProfileError
    from revolve.geometry.envelope import extent

    box = extent(prepared)
    if box is None:
        raise ProfileError("turning needs a solid section (a closed loop); this profile has only "
                           "open chains")
    f = float(length_factor)
    through = box.r_min > prepared.tolerance
    bore = 2.0 * box.r_min * f if through else 0.0
    length = box.length * f
    return Features((OuterStep(box.diameter * f, length),), bore_diameter=bore,
                    bore_depth=length if through else 0.0)


# --------------------------------------------------------------------------- plan

@dataclass(frozen=True)
class Operation:
    """One operation: its time (s), passes, spindle speed (rev/s, the first pass's) and formula.

    ``data`` is the cutting data it was timed with (shown in m/min and mm/rev,
    or sfm and in/rev, through :meth:`OperationData.trade_units`).
    """

    name: str
    time: float
    passes: int
    spindle_speed: float
    formula: str
    detail: str = ""
    data: Optional[OperationData] = None


@dataclass(frozen=True)
class Plan:
    """The operations in order, the warnings, and the stock diameter (m)."""

    operations: Tuple[Operation, ...]
    warnings: Tuple[str, ...]
    stock_diameter: float

    @property
    def cycle_time(self) -> float:
        """Sum of the operations' times, in seconds (no rapids, no tool changes)."""
        return math.fsum(op.time for op in self.operations)


def _mm(v: float, unit: str = "mm") -> str:
    """A length in metres as text in ``unit`` (mm or in), four figures."""
    if unit == "mm":
        return f"{v * 1000:.4g} mm"
    from revolve.units import factor

    return f"{v / factor(unit, 'length'):.4g} {unit}"


def _turn(name: str, from_d: float, to_d: float, length: float, data: OperationData,
          limit: Optional[float], what: str, unit: str = "mm") -> Optional[Operation]:
    """Passes along the axis from diameter ``from_d`` down to ``to_d`` (or up, boring)."""
    stock = abs(from_d - to_d) / 2.0
    count = equal_passes(stock, data.depth_of_cut, name)
    if count == 0:
        return None
    step = 2.0 * stock / count * (1 if to_d > from_d else -1)
    total, first = 0.0, None
    for k in range(count):
        d = from_d + step * (k if step < 0 else k + 1)   # the surface being cut at vc
        n = spindle_speed(data.cutting_speed, d, limit)
        first = n if first is None else first
        total += pass_time(length, data.feed, n)
    return Operation(name, total, count, first,
                     "t = Σ L / (f n), n = vc / (π D) per pass (capped at the speed limit), "
                     "passes = ceil(stock / ap)",
                     f"{what}: {count} × {_mm(stock / count, unit)} over {_mm(length, unit)}", data)


def plan_operations(features: Features, stock_diameter: float,
                    data: Mapping[str, OperationData], rules: Optional[Rules] = None,
                    speed_limit: Optional[float] = None,
                    overhang: Optional[float] = None, facing_allowance: float = 0.0,
                    stock_bore: float = 0.0, unit: str = "mm") -> Plan:
    """Lay out and time the operations of one part, in the usual order.

    Order: face the bar end, rough turn each outer step (from the stock
    diameter to the step diameter plus the finishing depth on each side),
    finish turn it in one pass, centre drill and drill (from solid), bore to
    size, cut the grooves, part off. The bore rule (``rules``, common
    practice): a bore below the smallest boring bar is drilled to size; a
    larger bore is drilled to ``min(largest drill, bore − bore stock)`` and
    bored. Parting runs from the part-off diameter to the bore (through
    bores) or the centre.

    Parameters
    ----------
    features : Features
    stock_diameter : float
        The bar's diameter, m (no smaller than the largest outer step).
    data : mapping
        :class:`OperationData` for every name of :data:`OPERATIONS`.
    rules : Rules, optional
        Default :func:`load_rules`.
    speed_limit : float, optional
        The machine's (or the chucking's) top spindle speed, rev/s.
    overhang : float, optional
        Unsupported length out of the chuck, m; default the part's length.
    facing_allowance : float
        Stock faced off the bar end, m: ceil(allowance / ap) facing passes,
        at least one.
    stock_bore : float
        The stock's own bore, m (a tube): no centre drill nor drill, the bore
        is bored from it; facing and parting stop at it.
    unit : str
        The length unit of the details and warnings (mm or in).

    Returns
    -------
    Plan

    Examples
    --------
    Facing a ⌀20 mm steel bar end at 200 m/min, 0.25 mm/rev, no speed limit:
    π · 10² / (200 000 · 0.25) min (common practice, no source):

    >>> data = operation_data_for("steel")
    >>> plan = plan_operations(Features((OuterStep(0.02, 0.01),)), 0.02, data)
    >>> [op.name for op in plan.operations]
    ['face', 'part off']
    >>> round(plan.operations[0].time, 9) == round(math.pi * 100 / 50_000 * 60, 9)
    True

    A long thin part is warned about (rule of thumb, common practice):

    >>> plan = plan_operations(Features((OuterStep(0.01, 0.15),)), 0.012, data)
    >>> plan.warnings[0]
    'length over diameter 15 (150 mm over 10 mm) is above 10: support the part with a steady rest (rule of thumb, common practice, no source)'

    From a ⌀40 × 24 mm tube to a ⌀36 part with a ⌀28 bore: no drilling, the bore
    is bored from the tube's ⌀24:

    >>> tube = plan_operations(Features((OuterStep(0.036, 0.02),), 0.028, 0.02), 0.04, data,
    ...                        stock_bore=0.024)
    >>> [op.name for op in tube.operations]
    ['face', 'rough turn', 'finish turn', 'bore', 'part off']
    >>> plan_operations(Features((OuterStep(0.03, 0.01),)), 0.02, data)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: stock diameter: the stock (20 mm) is smaller than the part (30 mm)
    """
    rules = rules or load_rules()
    missing = [op for op in OPERATIONS if op not in data]
    if missing:
        raise RevolveError(f"no cutting data for {', '.join(missing)}", place="cutting data")
    stock = checked_number(stock_diameter, "stock diameter")
    stock_bore = checked_number(stock_bore, "stock bore", zero=True)
    if stock_bore > 0 and (features.bore_diameter < stock_bore * (1 - _SLACK)
                           or not features.through_bore):
        raise RevolveError(f"the stock's bore ⌀{_mm(stock_bore, unit)} is larger than the part's bore "
                           f"or the part has no through bore", place="stock bore")
    if speed_limit is not None:
        speed_limit = checked_number(speed_limit, "speed limit")
    largest = max(s.diameter for s in features.outer_steps)
    if stock < largest * (1 - _SLACK):
        raise RevolveError(f"the stock ({_mm(stock, unit)}) is smaller than the part ({_mm(largest, unit)})",
                           place="stock diameter")
    ops, deep = [], []
    limit = speed_limit

    for what, diameter in (("part-off diameter", features.part_off_at),
                           ("groove diameter", features.grooves.diameter
                            if features.grooves is not None else 0.0)):
        if diameter > stock * (1 + _SLACK):
            raise RevolveError(f"the {what.split()[0]} at ⌀{_mm(diameter, unit)} is outside the stock "
                               f"(⌀{_mm(stock, unit)})", place=what)

    # face the bar end
    face = data["face"]
    n = spindle_speed(face.cutting_speed, stock, limit)
    facings = max(1, equal_passes(checked_number(facing_allowance, "facing allowance", zero=True),
                                  face.depth_of_cut, "face"))
    ops.append(Operation("face", facings * radial_pass_time(stock / 2, stock_bore / 2,
                                                            face.cutting_speed, face.feed, limit),
                         facings, n,
                         "t = π (R² − r²) / (vc f) at constant vc; Δr / (f n max) where capped",
                         f"⌀{_mm(stock, unit)} to " + (f"⌀{_mm(stock_bore, unit)}" if stock_bore
                                                 else "the centre"), face))

    # rough and finish turn each step
    finish = data["finish turn"]
    rough_ops, finish_ops = [], []
    for k, s in enumerate(features.outer_steps, 1):
        roughed = min(stock, s.diameter + 2.0 * finish.depth_of_cut)
        op = _turn("rough turn", stock, roughed, s.length, data["rough turn"], limit,
                   f"step {k}", unit)
        if op:
            rough_ops.append(op)
        op = _turn("finish turn", roughed, s.diameter, s.length, finish, limit, f"step {k}", unit)
        if op:
            finish_ops.append(op)
    for group in (rough_ops, finish_ops):
        if group:
            ops.append(Operation(group[0].name, math.fsum(o.time for o in group),
                                 sum(o.passes for o in group), group[0].spindle_speed,
                                 group[0].formula, "; ".join(o.detail for o in group),
                                 group[0].data))

    # centre drill, drill, bore
    bore_d, depth = features.bore_diameter, features.bore_depth
    if bore_d > 0 and stock_bore > 0:
        if stock_bore < bore_d * (1 - _SLACK):
            ops.append(_turn("bore", stock_bore, bore_d, depth, data["bore"], limit, "bore", unit))
    elif bore_d > 0:
        cd = data["centre drill"]
        n = spindle_speed(cd.cutting_speed, rules.centre_drill_diameter, limit)
        ops.append(Operation("centre drill", pass_time(rules.centre_drill_depth, cd.feed, n), 1,
                             n, "t = depth / (f n), n = vc / (π D)",
                             f"⌀{_mm(rules.centre_drill_diameter, unit)} × "
                             f"{_mm(rules.centre_drill_depth, unit)}", cd))
        if bore_d < rules.min_boring_bar_diameter:
            drill_d, why = bore_d, "drilled to size: below the smallest boring bar " \
                f"⌀{_mm(rules.min_boring_bar_diameter, unit)} (common practice)"
        else:
            drill_d = min(rules.largest_drill, bore_d - rules.bore_stock)
            why = (f"the largest drill ⌀{_mm(rules.largest_drill, unit)}, then bored"
                   if drill_d == rules.largest_drill
                   else f"{_mm(rules.bore_stock, unit)} under size, then bored") + " (common practice)"
        drill = data["drill"]
        n = spindle_speed(drill.cutting_speed, drill_d, limit)
        point = drill_point_length(drill_d, rules.drill_point_angle)
        ops.append(Operation("drill", drill_time(depth, drill_d, drill, limit,
                                                 rules.drill_point_angle), 1, n,
                             "t = (depth + point length) / (f n), point = (d/2) / tan(angle/2), "
                             "n = vc / (π d)",
                             f"⌀{_mm(drill_d, unit)} × {_mm(depth, unit)} + point {_mm(point, unit)}; {why}",
                             drill))
        if depth > rules.deep_hole_ratio * drill_d:
            deep.append(f"drill: a hole {depth / drill_d:.3g} diameters deep (⌀{_mm(drill_d, unit)} × "
                        f"{_mm(depth, unit)}) is above {rules.deep_hole_ratio:g}: peck drill or use a "
                        f"deep-hole drill (rule of thumb, common practice, no source)")
        if drill_d < bore_d * (1 - _SLACK):
            op = _turn("bore", drill_d, bore_d, depth, data["bore"], limit, "bore", unit)
            ops.append(op)

    # grooves
    g = features.grooves
    if g is not None and g.count > 0:
        gd = data["groove"]
        plunges = max(1, math.ceil(g.width / rules.groove_tool_width * (1 - _SLACK)))
        one = radial_pass_time(g.diameter / 2, g.diameter / 2 - g.depth, gd.cutting_speed,
                               gd.feed, limit)
        ops.append(Operation("groove", g.count * plunges * one, g.count * plunges,
                             spindle_speed(gd.cutting_speed, g.diameter, limit),
                             "t = count × plunges × π (R² − r²) / (vc f), plunges = "
                             "ceil(width / tool width)",
                             f"{g.count} × {_mm(g.width, unit)} wide, {_mm(g.depth, unit)} deep at "
                             f"⌀{_mm(g.diameter, unit)}; {plunges} plunge(s) of a "
                             f"{_mm(rules.groove_tool_width, unit)} tool", gd))

    # part off
    po = data["part off"]
    inner = bore_d / 2 if features.through_bore else 0.0
    at = features.part_off_at
    ops.append(Operation("part off", radial_pass_time(at / 2, inner, po.cutting_speed, po.feed,
                                                      limit), 1,
                         spindle_speed(po.cutting_speed, at, limit),
                         "t = π (R² − r²) / (vc f) at constant vc; Δr / (f n max) where capped",
                         f"⌀{_mm(at, unit)} to " + (f"⌀{_mm(bore_d, unit)}" if inner else "the centre"),
                         po))

    return Plan(tuple(ops), warnings(features, stock, data, rules, overhang, unit) + tuple(deep),
                stock)


def warnings(features: Features, stock_diameter: float, data: Mapping[str, OperationData],
             rules: Optional[Rules] = None, overhang: Optional[float] = None,
             unit: str = "mm") -> Tuple[str, ...]:
    """Slender-part and implausible cutting-data warnings (rules of thumb, common practice).

    Slenderness is the unsupported length (``overhang``, default the part's
    length) over the smallest finished outer diameter: above
    ``rules.tailstock_ratio`` a tailstock, above ``rules.steady_rest_ratio`` a
    steady rest. Turning, facing and boring data are implausible when ap is
    above ``depth_per_diameter`` × the stock diameter, f is above
    ``feed_per_diameter`` × the stock diameter, or f is above ap.

    Examples
    --------
    >>> data = operation_data_for("steel")
    >>> warnings(Features((OuterStep(0.02, 0.06),)), 0.022, data)      # L/D = 3: nothing to say
    ()
    >>> warnings(Features((OuterStep(0.02, 0.1),)), 0.022, data)[0]
    'length over diameter 5 (100 mm over 20 mm) is above 4: support the part with a tailstock (rule of thumb, common practice, no source)'
    >>> w = warnings(Features((OuterStep(0.004, 0.01),)), 0.005, data)
    >>> [x for x in w if "rough turn" in x][0]
    'rough turn: the depth of cut 3 mm is more than 0.25 × the stock diameter 5 mm: implausible (rule of thumb, common practice, no source)'
    """
    rules = rules or load_rules()
    out = []
    length = features.length if overhang is None else checked_number(overhang, "overhang")
    thinnest = min(s.diameter for s in features.outer_steps)
    ratio = length / thinnest
    tag = "(rule of thumb, common practice, no source)"
    text = f"length over diameter {ratio:.3g} ({_mm(length, unit)} over {_mm(thinnest, unit)})"
    if ratio > rules.steady_rest_ratio:
        out.append(f"{text} is above {rules.steady_rest_ratio:g}: support the part with a steady "
                   f"rest {tag}")
    elif ratio > rules.tailstock_ratio:
        out.append(f"{text} is above {rules.tailstock_ratio:g}: support the part with a "
                   f"tailstock {tag}")
    for op in WITH_DEPTH:
        d = data[op]
        if d.depth_of_cut > rules.depth_per_diameter * stock_diameter:
            out.append(f"{op}: the depth of cut {_mm(d.depth_of_cut, unit)} is more than "
                       f"{rules.depth_per_diameter:g} × the stock diameter {_mm(stock_diameter, unit)}: "
                       f"implausible {tag}")
        if d.feed > rules.feed_per_diameter * stock_diameter:
            out.append(f"{op}: the feed {_mm(d.feed, unit)}/rev is more than "
                       f"{rules.feed_per_diameter:g} × the stock diameter {_mm(stock_diameter, unit)}: "
                       f"implausible {tag}")
        if d.feed > d.depth_of_cut:
            out.append(f"{op}: the feed {_mm(d.feed, unit)}/rev is more than the depth of cut "
                       f"{_mm(d.depth_of_cut, unit)}: implausible {tag}")
    return tuple(out)


# --------------------------------------------------------------------------- the shop's stock

def choose_from_stock(items, outside_needed: float, grade: Optional[str] = None,
                      largest_inside: float = 0.0):
    """The smallest item of a shop's stock list that covers the part (common practice, no source).

    ``items`` are rows of :func:`revolve.formats.stock_list.parse_stock_list`
    (anything with ``shape``, ``outside_diameter``, ``inside_diameter`` and
    ``grade``). Round bar covers a part whose largest diameter (with its
    turning allowance) is ``outside_needed`` m; a tube also needs its bore no
    larger than ``largest_inside`` m (0: no tube). ``grade`` (any case) picks
    one grade. The smallest outside diameter wins; a tie goes to the row
    first in the file. Hex and square bar are not chosen.

    Examples
    --------
    >>> from revolve.formats.stock_list import parse_stock_list
    >>> rack = parse_stock_list("shape,size,grade,price,length\\n"
    ...                         "round,40 mm,S355,9 EUR/m,3 m\\nround,35 mm,S355,8 EUR/m,3 m\\n"
    ...                         "round,36 mm,304,30 EUR/m,3 m\\ntube,36 x 20 mm,S355,3 EUR/kg,3 m\\n")
    >>> choose_from_stock(rack, 0.034, "s355").size_text
    '35 mm'
    >>> choose_from_stock(rack, 0.034, largest_inside=0.022).size_text
    '35 mm'
    >>> choose_from_stock(rack, 0.0355, "S355", largest_inside=0.022).size_text
    '36 x 20 mm'
    >>> choose_from_stock(rack, 0.045)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: stock list: nothing on the stock list covers ⌀45 mm; add a larger bar or use the built-in sizes
    """
    fits = []
    for item in items:
        if grade is not None and item.grade.lower() != grade.lower():
            continue
        if item.outside_diameter < outside_needed * (1 - _SLACK):
            continue
        if item.shape == "round" or (item.shape == "tube" and item.inside_diameter
                                     <= largest_inside * (1 + _SLACK)):
            fits.append(item)
    if not fits:
        where = "" if grade is None else f" in {grade}"
        raise RevolveError(f"nothing on the stock list covers ⌀{_mm(outside_needed)}{where}; "
                           f"add a larger bar or use the built-in sizes", place="stock list")
    return min(fits, key=lambda i: i.outside_diameter)


# --------------------------------------------------------------------------- batch price

@dataclass(frozen=True)
class BatchPrice:
    """Cost and price of a batch; money in the user's currency, times in seconds.

    ``cost = set-up + machine time of every part started + material``;
    ``overhead = cost × overhead %``; ``price = (cost + overhead) / (1 − margin %)``
    (the margin is a share of the price).
    """

    quantity: int
    started: int
    bars: Optional[int]
    setup_time: float
    cycle_time: float
    machine_cost: float
    material_cost: float
    cost: float
    overhead: float
    price: float
    notes: Tuple[str, ...]

    @property
    def price_per_part(self) -> float:
        return self.price / self.quantity


def quantity_started(quantity: int, scrap_percent: float = 0.0) -> int:
    """Parts to start so that ``quantity`` good ones remain: ceil(q × (1 + scrap/100)).

    >>> quantity_started(100, 3), quantity_started(100, 0), quantity_started(7, 10), quantity_started(0, 5)
    (103, 100, 8, 0)
    """
    return math.ceil(quantity * (1.0 + scrap_percent / 100.0) * (1 - _SLACK))


def price_batch(cycle_time: float, quantity: int, machine_rate: float, *,
                setup_time: float = 0.0, scrap_percent: float = 0.0,
                parts_per_bar: Optional[int] = None, bar_price: Optional[float] = None,
                material_per_part: Optional[float] = None, overhead_percent: float = 0.0,
                margin_percent: float = 0.0) -> BatchPrice:
    """Cost and price of ``quantity`` good parts (common practice, no source).

    Parameters
    ----------
    cycle_time : float
        Seconds per part (:attr:`Plan.cycle_time`).
    quantity : int
        Good parts wanted (at least 1).
    machine_rate : float
        Money per hour of machine and operator time.
    setup_time : float
        Seconds, once per batch; an explicit input (a note says so when it is zero).
    scrap_percent : float
        Raises the parts started (:func:`quantity_started`) and so the bars.
    parts_per_bar, bar_price : optional
        Bars needed = ceil(started / parts per bar), each at ``bar_price``.
    material_per_part : float, optional
        Instead of bars: material money per part started.
    overhead_percent, margin_percent : float
        Overhead on the cost; margin as a share of the price (below 100).

    Examples
    --------
    100 parts at 120 s, 60 an hour, 1 h set-up, 5 % scrap, 12 parts per bar at
    30 a bar, 20 % overhead, 25 % margin, worked by hand: started 105, bars
    ceil(105/12) = 9, machine 60 + 105 × 2 = 270, material 270, cost 540,
    overhead 108, price 648 / 0.75 = 864:

    >>> p = price_batch(120, 100, 60, setup_time=3600, scrap_percent=5, parts_per_bar=12,
    ...                 bar_price=30, overhead_percent=20, margin_percent=25)
    >>> p.started, p.bars, p.machine_cost, p.material_cost, p.cost, p.overhead, round(p.price, 9)
    (105, 9, 270.0, 270.0, 540.0, 108.0, 864.0)
    >>> price_batch(60, 1, 60).notes[0]
    'the set-up time is zero: add it if the machine has to be set up for this job'
    >>> price_batch(60, 1, 60, margin_percent=100)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: margin: must be from 0 up to (not including) 100 %, got 100
    """
    if isinstance(quantity, bool) or not isinstance(quantity, int) or quantity < 1:
        raise RevolveError(f"must be a whole number of 1 or more, got {quantity!r}",
                           place="quantity")
    cycle = checked_number(cycle_time, "cycle time", zero=True)
    rate = checked_number(machine_rate, "machine rate", zero=True)
    setup = checked_number(setup_time, "set-up time", zero=True)
    scrap = checked_number(scrap_percent, "scrap allowance", zero=True)
    overhead_p = checked_number(overhead_percent, "overhead", zero=True)
    margin_p = checked_number(margin_percent, "margin", zero=True)
    if margin_p >= 100:
        raise RevolveError(f"must be from 0 up to (not including) 100 %, got {margin_p:g}",
                           place="margin")
    notes = []
    if setup == 0:
        notes.append("the set-up time is zero: add it if the machine has to be set up for this "
                     "job")
    started = quantity_started(quantity, scrap)
    bars = None
    material = 0.0
    if parts_per_bar is not None:
        if isinstance(parts_per_bar, bool) or not isinstance(parts_per_bar, int) \
                or parts_per_bar < 1:
            raise RevolveError(f"must be a whole number of 1 or more, got {parts_per_bar!r}",
                               place="parts per bar")
        bars = math.ceil(started / parts_per_bar)
        if bar_price is not None:
            material = bars * checked_number(bar_price, "bar price", zero=True)
    if material_per_part is not None:
        if bar_price is not None:
            raise RevolveError("give a bar price or a material price per part, not both",
                               place="material")
        material = started * checked_number(material_per_part, "material per part", zero=True)
    if bar_price is None and material_per_part is None:
        notes.append("no material price given: the cost is machine time only")
    machine = rate * (setup + started * cycle) / 3600.0
    cost = machine + material
    overhead = cost * overhead_p / 100.0
    price = (cost + overhead) / (1.0 - margin_p / 100.0)
    return BatchPrice(quantity, started, bars, setup, cycle, machine, material, cost, overhead,
                      price, tuple(notes))
