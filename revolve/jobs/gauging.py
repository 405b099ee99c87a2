r"""Gauging calculations for level tables: datum, increments, inch text, deadwood, temperature, uncertainty.

Pure functions over plain numbers and callables (no printing, no files). Every
length is in metres, every volume in cubic metres, temperatures in kelvin or
degrees Celsius (only differences matter); the command converts on the way in
and out through :mod:`revolve.units`. The one exception is
:func:`format_feet_inches`, whose argument is a length in inches because its
output is inch text.

Gauge datum, innage and ullage
    A gauge is read from a **reference point** at the **reference height** ``H``
    above the **datum plate**; the datum plate lies ``datum_offset`` above the
    lowest inside point of the vessel (0 when the plate is at the bottom).
    **Innage** (dip) is the liquid depth above the datum plate, **ullage** the
    distance from the reference point down to the liquid: innage = H − ullage.
    The table's level (from the lowest inside point) is innage + datum_offset.

Increments
    :func:`increment_levels` gives levels at a fixed increment from 0 to the
    top, the last partial row included; :func:`per_increment` the column of
    volume per increment (each row's difference to the next row).

Deadwood and fittings
    Items that take up volume over a range of levels (coils, ladders,
    heating pipes: deadwood) or add it (a sump, a nozzle stub: fittings):
    :class:`SpreadItem` spreads a volume evenly over a level range,
    :class:`RevolvedItem` is a body given as its own profile on the vessel's
    axis, measured by the level engine. :func:`deadwood_at` sums them.

Shell temperature
    :func:`shell_correction` applies the correction factor for the effect of
    temperature on a steel tank shell, ``CTSh = 1 + 2αΔT + α²ΔT²``
    (:data:`SHELL_FORMULA`, :data:`SHELL_SOURCE`), with coefficients from
    ``revolve/data/expansion.toml`` (each row with its source).

Uncertainty
    :func:`combined_uncertainty` propagates standard uncertainties of the
    inputs through any model by the law of propagation of uncertainty of the
    GUM (JCGM 100:2008) for uncorrelated inputs, with sensitivities from
    central differences of the exact model; :class:`Tolerance` turns a
    tolerance into a standard uncertainty.

These are geometry and arithmetic; see :data:`CALIBRATION_CAUTION`.

Examples
--------
>>> innage_from_ullage(12.0, [2.5, 12.0]).tolist()
[9.5, 0.0]
>>> increment_levels(1.0, 0.3).tolist()
[0.0, 0.3, 0.6, 0.9, 1.0]
>>> format_feet_inches(40.125)
'3\' 4 1/8"'
>>> round(shell_correction(35.0, 15.0, "carbon steel").factor, 9)
1.00044645
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from fractions import Fraction
from functools import lru_cache
from typing import Any, Callable, Dict, Mapping, Optional, Sequence, Tuple, Union

import numpy as np

from revolve.errors import MaterialError, RevolveError, quoted

__all__ = [
    "CALIBRATION_CAUTION", "SHELL_FORMULA", "SHELL_TERMS", "SHELL_SOURCE", "GUM_METHOD", "MAX_ROWS",
    "innage_from_ullage", "ullage_from_innage", "level_from_innage", "innage_from_level",
    "level_from_ullage",
    "increment_levels", "per_increment",
    "format_feet_inches", "FRACTION_DENOMINATORS",
    "SpreadItem", "RevolvedItem", "deadwood_at",
    "Expansion", "load_expansion", "find_expansion", "ShellCorrection", "shell_correction",
    "shell_correction_factor", "shell_temperature",
    "Tolerance", "Uncertainty", "combined_uncertainty",
]

#: The caution a gauging command shows with its table.
CALIBRATION_CAUTION = ("Tables for custody transfer need certified calibration by an accredited "
                       "body; tilt and temperature corrections here are geometry and do not "
                       "replace one.")

#: Most rows an increment table may have (a tiny increment on a tall vessel is a mistake).
MAX_ROWS = 200_000


def _array(values, what: str) -> np.ndarray:
    try:
        arr = np.atleast_1d(np.asarray(values, dtype=float))
    except (TypeError, ValueError):
        raise RevolveError(f"give the {what} as numbers, got {quoted(values)}") from None
    if arr.ndim != 1:
        raise RevolveError(f"give the {what} as a list of numbers")
    if not np.all(np.isfinite(arr)):
        raise RevolveError(f"a {what[:-1] if what.endswith('s') else what} is not a finite number")
    return arr


def _positive(value, what: str) -> float:
    try:
        v = float(value)
    except (TypeError, ValueError):
        raise RevolveError(f"the {what} must be a number, got {quoted(value)}") from None
    if not math.isfinite(v) or v <= 0:
        raise RevolveError(f"the {what} must be a positive number, got {v:g}")
    return v


def _finite(value, what: str) -> float:
    try:
        v = float(value)
    except (TypeError, ValueError):
        raise RevolveError(f"the {what} must be a number, got {quoted(value)}") from None
    if not math.isfinite(v):
        raise RevolveError(f"the {what} must be a finite number, got {v:g}")
    return v


# -- gauge datum, innage, ullage ------------------------------------------------------------

def _readings(reference_height, readings, what: str) -> Tuple[float, np.ndarray]:
    H = _positive(reference_height, "reference height")
    arr = _array(readings, what + "s")
    slack = 1e-12 * H
    bad = (arr < -slack) | (arr > H + slack)
    if bad.any():
        raise RevolveError(f"{what} {arr[bad][0]:g} m is outside 0 to the reference height "
                           f"{H:g} m; give {what}s between them")
    return H, np.clip(arr, 0.0, H)


def innage_from_ullage(reference_height: float, ullages) -> np.ndarray:
    """Innages (liquid depth above the datum plate) for ullage readings, in metres.

    Parameters
    ----------
    reference_height : float
        Height of the gauge's reference point above the datum plate, m.
    ullages : float or sequence of float
        Distances from the reference point down to the liquid, m, each
        between 0 and ``reference_height``.

    Returns
    -------
    numpy.ndarray
        ``reference_height - ullage`` for each reading, m.

    Raises
    ------
    RevolveError
        A reading outside 0 to the reference height, or a reference height
        that is not positive.

    Examples
    --------
    >>> innage_from_ullage(10.0, [0.0, 3.25, 10.0]).tolist()
    [10.0, 6.75, 0.0]
    >>> innage_from_ullage(10.0, []).tolist()
    []
    >>> innage_from_ullage(10.0, [10.5])
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: ullage 10.5 m is outside 0 to the reference height 10 m; give ullages between them
    >>> innage_from_ullage(0.0, [0.0])
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: the reference height must be a positive number, got 0
    """
    H, u = _readings(reference_height, ullages, "ullage")
    return H - u


def ullage_from_innage(reference_height: float, innages) -> np.ndarray:
    """Ullages for innage readings (the inverse of :func:`innage_from_ullage`), in metres.

    Parameters
    ----------
    reference_height : float
        Height of the gauge's reference point above the datum plate, m.
    innages : float or sequence of float
        Liquid depths above the datum plate, m, each between 0 and
        ``reference_height``.

    Returns
    -------
    numpy.ndarray
        ``reference_height - innage`` for each reading, m.

    Examples
    --------
    >>> ullage_from_innage(10.0, [6.75, 0.0]).tolist()
    [3.25, 10.0]
    >>> ullage_from_innage(10.0, [-0.1])
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: innage -0.1 m is outside 0 to the reference height 10 m; give innages between them
    """
    H, i = _readings(reference_height, innages, "innage")
    return H - i


def level_from_innage(innages, datum_offset: float = 0.0) -> np.ndarray:
    """Levels above the lowest inside point for innages above a datum plate, in metres.

    ``datum_offset`` is the datum plate's height above the lowest inside point
    (m; 0 when the plate is at the bottom, negative when it lies below it,
    as in a sump).

    Parameters
    ----------
    innages : float or sequence of float
        Liquid depths above the datum plate, m.
    datum_offset : float
        The datum plate's height above the lowest inside point, m.

    Returns
    -------
    numpy.ndarray
        ``innage + datum_offset``: the table's levels, m.

    Examples
    --------
    >>> level_from_innage([0.0, 1.5], datum_offset=0.25).tolist()
    [0.25, 1.75]
    >>> level_from_innage([], 0.1).tolist()
    []
    """
    return _array(innages, "innages") + _finite(datum_offset, "datum plate offset")


def innage_from_level(levels, datum_offset: float = 0.0) -> np.ndarray:
    """Innages above the datum plate for levels above the lowest inside point, in metres.

    Parameters
    ----------
    levels : float or sequence of float
        Levels above the lowest inside point, m; none below the datum plate.
    datum_offset : float
        The datum plate's height above the lowest inside point, m.

    Returns
    -------
    numpy.ndarray
        ``level - datum_offset``, m.

    Raises
    ------
    RevolveError
        A level below the datum plate (a gauge cannot read it).

    Examples
    --------
    >>> innage_from_level([0.25, 1.75], datum_offset=0.25).tolist()
    [0.0, 1.5]
    >>> innage_from_level([0.1], datum_offset=0.25)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: level 0.1 m is below the datum plate (0.25 m above the lowest inside point); a gauge cannot read it
    """
    offset = _finite(datum_offset, "datum plate offset")
    lv = _array(levels, "levels")
    below = lv < offset - 1e-12 * max(abs(offset), 1.0)
    if below.any():
        raise RevolveError(f"level {lv[below][0]:g} m is below the datum plate ({offset:g} m above "
                           "the lowest inside point); a gauge cannot read it")
    return np.maximum(lv - offset, 0.0)


def level_from_ullage(reference_height: float, ullages, datum_offset: float = 0.0) -> np.ndarray:
    """Levels above the lowest inside point for ullage readings, in metres.

    The same as ``level_from_innage(innage_from_ullage(H, ullages), datum_offset)``.

    Examples
    --------
    >>> level_from_ullage(10.0, [2.0, 10.0], datum_offset=0.3).tolist()
    [8.3, 0.3]
    """
    return level_from_innage(innage_from_ullage(reference_height, ullages), datum_offset)


# -- increments ------------------------------------------------------------------------------

def increment_levels(height: float, increment: float) -> np.ndarray:
    """Levels from 0 to ``height`` at a fixed ``increment``, ending with the top (metres).

    Level k is ``k * increment`` (no running sum, so no drift); when the
    height is not a whole number of increments the last row is the top
    itself, a partial increment above the row before it. A height within
    1e-9 of an increment of a whole number of increments ends exactly there.

    Parameters
    ----------
    height : float
        The full level, m (positive).
    increment : float
        The step between rows, m: 0.001 for 1 mm, 0.003175 for 1/8 in.

    Raises
    ------
    RevolveError
        A height or increment that is not positive, or more than
        :data:`MAX_ROWS` rows.

    Examples
    --------
    >>> increment_levels(2.0, 0.5).tolist()
    [0.0, 0.5, 1.0, 1.5, 2.0]
    >>> increment_levels(0.1, 0.25).tolist()
    [0.0, 0.1]
    >>> increment_levels(1.0, 1e-9)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: an increment of 1e-09 m gives 1e+09 rows for a height of 1 m (most 200000); make the increment larger
    """
    H = _positive(height, "height")
    step = _positive(increment, "increment")
    rows = H / step
    if rows > MAX_ROWS:
        raise RevolveError(f"an increment of {step:g} m gives {rows:.3g} rows for a height of "
                           f"{H:g} m (most {MAX_ROWS}); make the increment larger")
    whole = round(rows)
    if abs(rows - whole) <= 1e-9 * max(whole, 1):
        n = int(whole)
    else:
        n = int(math.floor(rows))
        if n * step >= H:
            n -= 1
    lv = step * np.arange(n + 1, dtype=float)
    decimals = _decimals(step)
    if decimals is not None:     # 3 × 0.3 is 0.9, not 0.8999999999999999
        lv = np.round(lv, decimals)
    lv = lv[lv < H - 1e-9 * step]      # a row a hair below the top is the top
    return np.append(lv, H)


def _decimals(step: float) -> Optional[int]:
    """Decimal places of the step as written (0.003175 -> 6), or None past 12."""
    mantissa, _, exponent = repr(step).partition("e")
    places = len(mantissa.partition(".")[2].rstrip("0")) - int(exponent or 0)
    return max(places, 0) if places <= 12 else None


def per_increment(volumes) -> np.ndarray:
    """The volume per increment: each row's difference to the next row (NaN on the top row).

    The increments of a table from empty (volume 0) to full sum to the
    capacity (to the rounding of each difference: add them with
    :func:`math.fsum` over the finite ones).

    Parameters
    ----------
    volumes : sequence of float
        The table's volumes, m³, in level order.

    Returns
    -------
    numpy.ndarray
        ``volumes[k + 1] - volumes[k]`` for each row, m³; NaN on the top row,
        which has no row above it.

    Examples
    --------
    >>> per_increment([0.0, 1.0, 3.0, 3.5]).tolist()
    [1.0, 2.0, 0.5, nan]
    >>> per_increment([2.0]).tolist()
    [nan]
    >>> per_increment([]).tolist()
    []
    """
    v = _array(volumes, "volumes")
    if v.size == 0:
        return v
    return np.append(np.diff(v), np.nan)


# -- feet, inches and fractions ----------------------------------------------------------------

#: The fractions of an inch a level may be shown to.
FRACTION_DENOMINATORS = (2, 4, 8, 16, 32, 64)


def format_feet_inches(inches: float, denominator: int = 16) -> str:
    """A length in inches as feet, inches and a fraction, e.g. ``3' 4 1/8"``.

    Rounded to the nearest ``1/denominator`` inch (halves away from zero),
    the fraction in lowest terms, carried into inches and feet (11 63/64 in
    to the nearest 1/16 is ``1' 0"``). Feet are always shown (``0' 6 1/2"``)
    so that a column lines up; a negative length has one minus sign in
    front, and a length that rounds to zero has none. The text reads back
    with :func:`revolve.inputs.parse_length`.

    Parameters
    ----------
    inches : float
        The length in inches (not metres: this is inch text).
    denominator : int
        One of :data:`FRACTION_DENOMINATORS` (8, 16, 32 or 64 as a rule).

    Examples
    --------
    >>> format_feet_inches(40.125), format_feet_inches(12.0), format_feet_inches(0.0)
    ('3\\' 4 1/8"', '1\\' 0"', '0\\' 0"')
    >>> format_feet_inches(11 + 15 / 16 + 1 / 16)
    '1\\' 0"'
    >>> format_feet_inches(-6.5), format_feet_inches(-0.001), format_feet_inches(0.6, 64)
    ('-0\\' 6 1/2"', '0\\' 0"', '0\\' 0 19/32"')
    >>> format_feet_inches(1.0, 10)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: round to 1/2, 1/4, 1/8, 1/16, 1/32 or 1/64 of an inch, not 1/10
    """
    if isinstance(denominator, bool) or denominator not in FRACTION_DENOMINATORS:
        raise RevolveError("round to " + ", ".join(f"1/{d}" for d in FRACTION_DENOMINATORS[:-1])
                           + f" or 1/{FRACTION_DENOMINATORS[-1]} of an inch, not 1/{denominator}")
    value = _finite(inches, "length in inches")
    if abs(value) > 1e12:
        raise RevolveError(f"a length of {value:g} in is too large to write in feet and inches")
    exact = Fraction(abs(value)) * denominator
    units = int(exact)                          # whole 1/denominator steps, rounded down
    if exact - units >= Fraction(1, 2):         # half away from zero
        units += 1
    if units == 0:
        return "0' 0\""
    sign = "-" if value < 0 else ""
    feet, rest = divmod(units, 12 * denominator)
    whole, part = divmod(rest, denominator)
    text = f"{sign}{feet}' {whole}"
    if part:
        f = Fraction(part, denominator)
        text += f" {f.numerator}/{f.denominator}"
    return text + '"'


# -- deadwood and fittings -----------------------------------------------------------------------

@dataclass(frozen=True)
class SpreadItem:
    """A volume spread evenly over a range of levels (deadwood, or a fitting that adds).

    Between ``bottom`` and ``top`` the item's volume below the level grows
    linearly with the level; below ``bottom`` it is 0 and above ``top`` the
    whole ``volume``. With ``bottom == top`` the whole volume counts from that
    level up. Metres and cubic metres.

    Attributes
    ----------
    volume : float
        The item's volume, m³ (not negative).
    bottom, top : float
        The level range it spans, m above the lowest inside point.
    name : str
        A label for tables.
    fitting : bool
        True for a fitting that adds volume (a sump, a nozzle stub), False
        for deadwood that takes it up.

    Examples
    --------
    >>> ladder = SpreadItem(0.02, 0.0, 4.0, name="ladder")
    >>> ladder.volume_below([-1.0, 1.0, 4.0, 9.0]).tolist()
    [0.0, 0.005, 0.02, 0.02]
    >>> SpreadItem(0.01, 2.0, 1.0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: item '': its range runs from 2 m down to 1 m; give the lower level first
    """

    volume: float
    bottom: float
    top: float
    name: str = ""
    fitting: bool = False

    def __post_init__(self):
        v = _finite(self.volume, f"volume of item {quoted(self.name)}")
        if v < 0:
            raise RevolveError(f"item {quoted(self.name)}: its volume {v:g} m³ is negative; give "
                               "deadwood and fittings as positive volumes (fitting=True adds)")
        lo = _finite(self.bottom, f"bottom level of item {quoted(self.name)}")
        hi = _finite(self.top, f"top level of item {quoted(self.name)}")
        if hi < lo:
            raise RevolveError(f"item {quoted(self.name)}: its range runs from {lo:g} m down to "
                               f"{hi:g} m; give the lower level first")
        object.__setattr__(self, "volume", v)
        object.__setattr__(self, "bottom", lo)
        object.__setattr__(self, "top", hi)

    def volume_below(self, levels) -> np.ndarray:
        """The item's volume below each level, m³ (levels in m)."""
        lv = _array(levels, "levels")
        if self.top == self.bottom:
            return np.where(lv >= self.bottom, self.volume, 0.0)
        share = np.clip((lv - self.bottom) / (self.top - self.bottom), 0.0, 1.0)
        return self.volume * share


@dataclass(frozen=True)
class RevolvedItem:
    """A body of revolution on the vessel's axis, given as its own profile (coil, column, mixer).

    Measured by the level engine (:func:`revolve.jobs.levels.liquid_space`
    and :func:`revolve.jobs.levels.table_at_levels` on the body's profile) in the
    profile's unit and converted to metres; build it with
    :meth:`from_profile`.

    Attributes
    ----------
    space : LiquidSpace
        The body's profile as the level engine holds it.
    offset : float
        The vessel's level at which the body's own level 0 (its lowest
        point) lies, m.
    scale : float
        Metres per unit of the body's profile.
    name : str
    fitting : bool
        True when the body adds volume instead of taking it up.
    """

    space: Any
    offset: float
    scale: float
    name: str = ""
    fitting: bool = False

    @property
    def volume(self) -> float:
        """The body's whole volume, m³."""
        return float(self.space.capacity) * self.scale ** 3

    @classmethod
    def from_profile(cls, profile, axis, vessel_space, *, name: str = "",
                     fitting: bool = False) -> "RevolvedItem":
        """The body drawn as ``profile`` about ``axis``, inside ``vessel_space``.

        ``profile`` and ``vessel_space`` must be drawn about the same axis
        (same point and direction, in the same sketch) and stand the same
        way (the vessel's orientation is used for the body); their units may
        differ. Levels of both are from the lowest inside point of the
        vessel.

        Examples
        --------
        >>> from revolve.geometry.profile import Axis, Chain, Loop, Profile
        >>> from revolve.jobs.levels import liquid_space
        >>> tank = liquid_space(Profile(chains=(Chain.from_points(
        ...     [(0, 0), (1, 0), (1, 3), (0, 3)]),), unit="m"), Axis.y())
        >>> ring = Profile(loops=(Loop.from_points([(0.5, 1), (0.6, 1), (0.6, 2), (0.5, 2)]),),
        ...                unit="m")
        >>> coil = RevolvedItem.from_profile(ring, Axis.y(), tank, name="coil")
        >>> round(coil.offset, 12), round(coil.volume / (math.pi * 0.11), 12)
        (1.0, 1.0)
        >>> [round(float(v) / (math.pi * 0.11), 12) for v in coil.volume_below([0.5, 1.5, 3.0])]
        [0.0, 0.5, 1.0]
        """
        from revolve import units
        from revolve.jobs.levels import liquid_space

        space = liquid_space(profile, axis, orientation=vessel_space.orientation)
        scale = units.factor(profile.unit, "length")
        vessel_scale = units.factor(vessel_space.profile.unit, "length")
        if vessel_space.orientation == "vertical":
            # both bottoms are axial positions from the same axis point
            offset = space.bottom * scale - vessel_space.bottom * vessel_scale
        else:
            # levels start r_max below the axis
            offset = vessel_space.r_max * vessel_scale - space.r_max * scale
        return cls(space, float(offset), float(scale), name, fitting)

    def volume_below(self, levels) -> np.ndarray:
        """The body's volume below each vessel level, m³ (levels in m)."""
        from revolve.jobs.levels import table_at_levels

        lv = _array(levels, "levels")
        own = np.clip((lv - self.offset) / self.scale, 0.0, self.space.height)
        if own.size == 0:
            return own
        return np.asarray(table_at_levels(self.space, own).volume, dtype=float) * self.scale ** 3


def deadwood_at(levels, items: Sequence[Union[SpreadItem, RevolvedItem]]) -> np.ndarray:
    """The total volume deducted at each level: deadwood minus fittings, m³.

    Subtract it from the vessel's volume at the same levels to get the
    liquid's; a negative figure means the fittings add more than the
    deadwood takes.

    Parameters
    ----------
    levels : sequence of float
        Levels above the lowest inside point, m.
    items : sequence of SpreadItem or RevolvedItem
        Anything with ``volume_below(levels)`` and ``fitting``.

    Examples
    --------
    >>> items = [SpreadItem(0.04, 0.0, 2.0, name="heating pipes"),
    ...          SpreadItem(0.01, 0.0, 0.0, name="sump", fitting=True)]
    >>> deadwood_at([0.0, 1.0, 2.0], items).tolist()
    [-0.01, 0.01, 0.03]
    >>> deadwood_at([0.0, 1.0], []).tolist()
    [0.0, 0.0]
    """
    lv = _array(levels, "levels")
    total = np.zeros(lv.shape)
    for item in items:
        below = item.volume_below(lv)
        total = total - below if item.fitting else total + below
    return total


# -- shell temperature --------------------------------------------------------------------------

#: The shell temperature correction factor, as the output states it.
SHELL_FORMULA = "CTSh = 1 + 2αΔT + α²ΔT²"
#: What its terms are.
SHELL_TERMS = ("ΔT: shell temperature minus the table's base (calibration) temperature; "
               "α: the shell's linear expansion coefficient")
#: Where the formula comes from.
SHELL_SOURCE = ("API MPMS Chapter 12.1.1 / EI HM1 Part 1 (calculation of static petroleum "
                "quantities, upright cylindrical tanks)")

_EXPANSION_FILE = "expansion.toml"
_EXPANSION_FIELDS = ("key", "name", "aliases", "alpha_per_kelvin", "source", "note")


@dataclass(frozen=True)
class Expansion:
    """A shell material's linear expansion coefficient (per kelvin) and its source."""

    key: str
    name: str
    alpha: float
    source: str
    aliases: Tuple[str, ...] = ()
    note: str = ""


def _normal(name: str) -> str:
    return re.sub(r"[^a-z0-9]", "", str(name).lower())


def parse_expansion(text: str, file: str = _EXPANSION_FILE) -> Tuple[Expansion, ...]:
    """Read a table in the format of ``expansion.toml``.

    Examples
    --------
    >>> parse_expansion('[[material]]\\nkey = "x"', file="extra.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: extra.toml: material 1: missing field(s) name, aliases, alpha_per_kelvin, source, note
    """
    from revolve.datafiles import toml

    tomllib = toml()
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise MaterialError(f"not valid TOML: {exc}", file=file) from None
    rows = doc.get("material", [])
    if set(doc) - {"material"} or not isinstance(rows, list):
        raise MaterialError("only [[material]] tables belong here", file=file)
    out = []
    for i, raw in enumerate(rows, 1):
        place = f"material {i}"
        if not isinstance(raw, dict):
            raise MaterialError("each material must be a table", file=file, place=place)
        missing = [f for f in _EXPANSION_FIELDS if f not in raw]
        extra = sorted(set(raw) - set(_EXPANSION_FIELDS))
        if missing or extra:
            what = (f"missing field(s) {', '.join(missing)}" if missing
                    else f"unknown field(s) {', '.join(extra)}")
            raise MaterialError(what, file=file, place=place)
        alpha = raw["alpha_per_kelvin"]
        if isinstance(alpha, bool) or not isinstance(alpha, (int, float)) or \
                not (0 < alpha < 1e-3):
            raise MaterialError(f"alpha_per_kelvin must be a number between 0 and 1e-3, got "
                                f"{alpha!r}", file=file, place=place)
        if not str(raw["source"]).strip():
            raise MaterialError("every row needs its source", file=file, place=place)
        out.append(Expansion(str(raw["key"]), str(raw["name"]), float(alpha), str(raw["source"]),
                             tuple(str(a) for a in raw["aliases"]), str(raw["note"])))
    return tuple(out)


@lru_cache(maxsize=None)
def load_expansion() -> Tuple[Expansion, ...]:
    """The package's table of linear expansion coefficients (read once).

    Examples
    --------
    >>> [m.key for m in load_expansion()]
    ['carbon_steel', 'stainless_304', 'stainless_316', 'aluminium']
    """
    from revolve.datafiles import bundled_text

    return parse_expansion(bundled_text(_EXPANSION_FILE))


def find_expansion(name: str) -> Expansion:
    """A shell material by key, name or alias (case, spaces and punctuation ignored).

    Examples
    --------
    >>> find_expansion("Mild Steel").alpha
    1.116e-05
    >>> find_expansion("AISI-316").key
    'stainless_316'
    >>> find_expansion("copper")
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: no expansion coefficient for 'copper'; choose from carbon_steel, stainless_304, stainless_316, aluminium, or give the coefficient per kelvin
    """
    wanted = _normal(name)
    for m in load_expansion():
        if wanted in {_normal(n) for n in (m.key, m.name) + m.aliases}:
            return m
    keys = ", ".join(m.key for m in load_expansion())
    raise MaterialError(f"no expansion coefficient for {quoted(name)}; choose from {keys}, or "
                        "give the coefficient per kelvin")


def shell_correction_factor(shell_temperature, base_temperature, alpha):
    """CTSh = 1 + 2αΔT + α²ΔT² (:data:`SHELL_FORMULA`, :data:`SHELL_SOURCE`), ΔT = shell − base.

    Temperatures in kelvin or °C (one scale for both), ``alpha`` per kelvin;
    arrays broadcast. The factor is (1 + αΔT)², the growth of the shell's
    cross-section; multiply a table's volume by it.

    Parameters
    ----------
    shell_temperature, base_temperature : float or array
        K or °C (one scale for both); the base is the table's calibration
        temperature.
    alpha : float or array
        Linear expansion coefficient of the shell, per kelvin.

    Returns
    -------
    float or numpy.ndarray
        The factor (1 at the base temperature).

    Examples
    --------
    >>> shell_correction_factor(15.0, 15.0, 11.16e-6)
    1.0
    >>> round(float(shell_correction_factor(-5.0, 15.0, 11.16e-6)), 12)
    0.999553649818
    """
    dT = np.asarray(shell_temperature, dtype=float) - np.asarray(base_temperature, dtype=float)
    a = np.asarray(alpha, dtype=float)
    factor = 1.0 + 2.0 * a * dT + (a * dT) ** 2
    return float(factor) if factor.ndim == 0 else factor


def shell_temperature(liquid_temperature: float, ambient_temperature: float,
                      insulated: bool = False) -> float:
    """The tank shell temperature from the liquid's and the air's (K or °C).

    Not insulated: (7 × liquid + 1 × ambient) / 8; insulated: the liquid's
    (the practice of API MPMS Chapter 12.1.1 for upright tanks, as quoted by
    gauging handbooks).

    Examples
    --------
    >>> shell_temperature(57.0, 25.0), shell_temperature(57.0, 25.0, insulated=True)
    (53.0, 57.0)
    """
    tl = _finite(liquid_temperature, "liquid temperature")
    ta = _finite(ambient_temperature, "ambient temperature")
    return tl if insulated else (7.0 * tl + ta) / 8.0


@dataclass(frozen=True)
class ShellCorrection:
    """A shell temperature correction: the factor and what it came from (for the output)."""

    factor: float
    shell_temperature: float
    base_temperature: float
    alpha: float
    material: str
    alpha_source: str
    formula: str = SHELL_FORMULA
    source: str = SHELL_SOURCE

    def statement(self) -> str:
        """One line for the table: the factor, its inputs, the formula and the sources.

        >>> print(shell_correction(35.0, 15.0, 12e-6).statement())
        shell temperature correction CTSh = 1 + 2αΔT + α²ΔT² = 1.00048 (API MPMS Chapter 12.1.1 / EI HM1 Part 1 (calculation of static petroleum quantities, upright cylindrical tanks)); ΔT = 35 − 15 = 20 K; α = 1.2e-05 /K (given)
        """
        dT = self.shell_temperature - self.base_temperature
        alpha = (f"α = {self.alpha:.6g} /K (given)" if self.alpha_source == "given" else
                 f"α = {self.alpha:.6g} /K for {self.material} ({self.alpha_source})")
        return (f"shell temperature correction {self.formula} = {self.factor:.6g} "
                f"({self.source}); ΔT = {self.shell_temperature:g} − {self.base_temperature:g} = "
                f"{dT:g} K; {alpha}")


def shell_correction(shell_temperature: float, base_temperature: float,
                     material: Union[str, float]) -> ShellCorrection:
    """The shell temperature correction for a material of the table or a coefficient.

    The standard states the factor for upright cylindrical tanks whose
    tables were made for a base shell temperature; for other shapes (lying,
    spherical) it is not the standard's correction, and the caller should
    say so.

    Parameters
    ----------
    shell_temperature, base_temperature : float
        K or °C, one scale for both (the base temperature is the one the
        table was calibrated for: 15 °C or 60 °F as a rule).
    material : str or float
        A name from ``expansion.toml`` (:func:`find_expansion`) or the
        linear expansion coefficient per kelvin.

    Examples
    --------
    >>> c = shell_correction(35.0, 15.0, "stainless 304")
    >>> c.material, round(c.factor, 8)
    ('Stainless steel 304', 1.00069132)
    >>> shell_correction(35.0, 15.0, -1e-5)
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: the expansion coefficient must be between 0 and 1e-3 per kelvin, got -1e-05
    """
    ts = _finite(shell_temperature, "shell temperature")
    tb = _finite(base_temperature, "base temperature")
    if isinstance(material, str):
        m = find_expansion(material)
        alpha, name, source = m.alpha, m.name, m.source
    else:
        alpha = _finite(material, "expansion coefficient")
        if not 0 < alpha < 1e-3:
            raise MaterialError(f"the expansion coefficient must be between 0 and 1e-3 per kelvin, "
                                f"got {alpha:g}")
        name, source = "given", "given"
    return ShellCorrection(shell_correction_factor(ts, tb, alpha), ts, tb, alpha, name, source)


# -- uncertainty (GUM) ----------------------------------------------------------------------------

#: How :func:`combined_uncertainty` combines, as the output states it.
GUM_METHOD = ("law of propagation of uncertainty for uncorrelated inputs, JCGM 100:2008 (GUM) "
              "5.1.2: u_c² = Σ (∂f/∂x_i)² u²(x_i), sensitivities by central differences of the "
              "exact model")

_DIVISORS = {"rectangular": math.sqrt(3.0), "triangular": math.sqrt(6.0)}


@dataclass(frozen=True)
class Tolerance:
    """A tolerance ± ``half_width`` turned into a standard uncertainty (GUM 4.3.7, 4.3.9).

    ``rectangular`` (the default: any value within the tolerance equally
    likely): u = a/√3; ``triangular``: u = a/√6; ``normal``: the half-width
    is an expanded uncertainty with coverage factor ``coverage`` (2 for about
    95 %), u = a/k. Same unit as the input (metres for lengths).

    Examples
    --------
    >>> round(Tolerance(0.003).standard, 9), Tolerance(0.004, "normal", 2.0).standard
    (0.001732051, 0.002)
    >>> Tolerance(0.0).standard
    0.0
    >>> Tolerance(1.0, "uniform")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: a tolerance's distribution is rectangular, triangular or normal, not 'uniform'
    """

    half_width: float
    distribution: str = "rectangular"
    coverage: float = 2.0

    def __post_init__(self):
        a = _finite(self.half_width, "tolerance")
        if a < 0:
            raise RevolveError(f"a tolerance is a half-width, not negative: got {a:g}")
        if self.distribution not in ("rectangular", "triangular", "normal"):
            raise RevolveError("a tolerance's distribution is rectangular, triangular or normal, "
                               f"not {quoted(self.distribution)}")
        if self.distribution == "normal":
            _positive(self.coverage, "coverage factor")
        object.__setattr__(self, "half_width", a)

    @property
    def standard(self) -> float:
        """The standard uncertainty."""
        if self.distribution == "normal":
            return self.half_width / float(self.coverage)
        return self.half_width / _DIVISORS[self.distribution]


@dataclass(frozen=True, eq=False)
class Uncertainty:
    """The result of :func:`combined_uncertainty` (the model's units throughout).

    Attributes
    ----------
    value : numpy.ndarray
        The model's outputs at the given values.
    standard_uncertainty : numpy.ndarray
        Combined standard uncertainty u_c of each output.
    sensitivities : dict of str to numpy.ndarray
        ∂f/∂x_i for each input with an uncertainty.
    inputs : dict of str to float
        The standard uncertainty u(x_i) used for each input.
    largest : tuple of tuple of str
        For each output, the inputs in order of their contribution
        |∂f/∂x_i| u(x_i), largest first (inputs contributing nothing left out).
    method : str
    """

    value: np.ndarray
    standard_uncertainty: np.ndarray
    sensitivities: Dict[str, np.ndarray]
    inputs: Dict[str, float]
    largest: Tuple[Tuple[str, ...], ...]
    method: str = GUM_METHOD

    def contribution(self, name: str) -> np.ndarray:
        """|∂f/∂x_i| u(x_i) of one input, for each output."""
        return np.abs(self.sensitivities[name]) * self.inputs[name]

    def describe(self, index: int = 0) -> str:
        """The largest contributors of output ``index`` in words, for the table.

        >>> r = combined_uncertainty(lambda a, b: a + 2 * b, {"a": 1.0, "b": 1.0},
        ...                          {"a": 0.3, "b": 0.2})
        >>> r.describe()
        'u = 0.5; largest contributors: b (64 % of the variance), a (36 %)'
        >>> combined_uncertainty(lambda a: a, {"a": 1.0}, {}).describe()
        'u = 0; no input has an uncertainty'
        """
        u = float(self.standard_uncertainty[index])
        shares = self.shares(index)
        if not shares:
            return f"u = {u:.4g}; no input has an uncertainty"
        parts = [f"{name} ({100 * share:.0f} %{' of the variance' if k == 0 else ''})"
                 for k, (name, share) in enumerate(shares.items())]
        return f"u = {u:.4g}; largest contributors: " + ", ".join(parts)

    def shares(self, index: int = 0) -> Dict[str, float]:
        """Each input's share of the variance of output ``index`` (fractions summing to 1).

        >>> r = combined_uncertainty(lambda a, b: a + 2 * b, {"a": 1.0, "b": 1.0},
        ...                          {"a": 0.3, "b": 0.2})
        >>> {k: round(v, 6) for k, v in r.shares().items()}
        {'b': 0.64, 'a': 0.36}
        """
        total = float(self.standard_uncertainty[index]) ** 2
        return {n: (float(self.contribution(n)[index]) ** 2 / total if total else 0.0)
                for n in self.largest[index]}


def _step(run, x0, name, value, h):
    try:
        return run({**x0, name: value})
    except RevolveError as err:
        raise RevolveError(f"the model refuses {name} = {value:.10g} (a step of {h:g} from "
                           f"{x0[name]:g} for its sensitivity): {err}; give a value further "
                           "from the model's limit") from None


def combined_uncertainty(model: Callable[..., Any], values: Mapping[str, float],
                         uncertainties: Mapping[str, Union[float, Tolerance]], *,
                         relative_step: float = 1e-6) -> Uncertainty:
    """Standard uncertainty of a model's outputs from its inputs' (GUM, uncorrelated inputs).

    u_c²(y_j) = Σ_i c_ij² u²(x_i) with c_ij = ∂f_j/∂x_i (JCGM 100:2008, 5.1.2),
    the sensitivities from central differences of the exact model,
    c ≈ (f(x_i + h) − f(x_i − h)) / 2h with h = ``relative_step`` × max(|x_i|,
    u(x_i)). The model is called ``2n + 1`` times for ``n`` uncertain inputs.

    A first-order result: where the model is strongly non-linear over ±u a
    Monte Carlo run (JCGM 101:2008) is the better tool.

    Parameters
    ----------
    model : callable
        Called with the inputs as keyword arguments (floats, SI units);
        returns a float or a 1-D array of outputs (a whole level table).
    values : mapping of str to float
        The best estimate of every input the model takes.
    uncertainties : mapping of str to float or Tolerance
        Standard uncertainty of each uncertain input (same unit as the
        input), or a :class:`Tolerance` converted to one (rectangular: a/√3).
        Inputs left out are taken as exact.
    relative_step : float
        The difference step relative to the input's size.

    Raises
    ------
    RevolveError
        An uncertainty for an input the model does not take, a negative
        uncertainty, or a model whose outputs are not finite.

    Examples
    --------
    A cylinder's volume V = π D² L / 4, D = 2 m ± 1 mm (standard),
    L = 5 m ± 10 mm (rectangular tolerance):

    >>> cyl = lambda D, L: math.pi * D ** 2 * L / 4
    >>> r = combined_uncertainty(cyl, {"D": 2.0, "L": 5.0},
    ...                          {"D": 0.001, "L": Tolerance(0.010)})
    >>> round(float(r.standard_uncertainty[0]), 6), r.largest[0]
    (0.023994, ('L', 'D'))
    >>> float(combined_uncertainty(cyl, {"D": 2.0, "L": 5.0}, {}).standard_uncertainty[0])
    0.0
    >>> combined_uncertainty(cyl, {"D": 2.0, "L": 5.0}, {"T": 1.0})
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: an uncertainty is given for 'T', which is not an input of the model (inputs: D, L)
    """
    step = _positive(relative_step, "relative step")
    x0 = {name: _finite(v, f"value of {quoted(name)}") for name, v in values.items()}
    u: Dict[str, float] = {}
    for name, given in uncertainties.items():
        if name not in x0:
            raise RevolveError(f"an uncertainty is given for {quoted(name)}, which is not an input "
                               f"of the model (inputs: {', '.join(x0)})")
        s = given.standard if isinstance(given, Tolerance) else _finite(
            given, f"uncertainty of {quoted(name)}")
        if s < 0:
            raise RevolveError(f"the uncertainty of {quoted(name)} is negative ({s:g}); give a "
                               "standard uncertainty or a tolerance's half-width")
        u[name] = s

    def run(inputs):
        out = np.atleast_1d(np.asarray(model(**inputs), dtype=float))
        if out.ndim != 1 or not np.all(np.isfinite(out)):
            raise RevolveError("the model's outputs are not a list of finite numbers at "
                               + ", ".join(f"{k} = {v:g}" for k, v in inputs.items()))
        return out

    y = run(x0)
    sens: Dict[str, np.ndarray] = {}
    for name, s in u.items():
        h = step * max(abs(x0[name]), s)
        if h == 0.0:
            sens[name] = np.zeros_like(y)
            continue
        up, down = (_step(run, x0, name, x0[name] + d, h) for d in (h, -h))
        if up.shape != y.shape or down.shape != y.shape:
            raise RevolveError(f"the model gives a different number of outputs when "
                               f"{quoted(name)} changes; keep its outputs fixed")
        sens[name] = (up - down) / (2.0 * h)
    contributions = {n: np.abs(sens[n]) * u[n] for n in u}
    if contributions:
        uc = np.sqrt(np.sum([c ** 2 for c in contributions.values()], axis=0))
    else:
        uc = np.zeros_like(y)
    largest = tuple(
        tuple(n for n in sorted(contributions, key=lambda n: -contributions[n][j])
              if contributions[n][j] > 0)
        for j in range(y.size))
    return Uncertainty(y, uc, sens, u, largest)
