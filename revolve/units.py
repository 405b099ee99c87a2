"""Units: exact factors to SI for the common units, and the one pint registry.

Numbers carry units only at the edges of the program; inside, everything is a
plain float in SI (metre, square metre, cubic metre, kilogram, kg/m³, second).
This module turns unit names and quantity strings into those floats.

Two paths:

* a **fast path**, a small table of exact factors (kept as integer ratios) for
  the units people actually type -- mm, in, ft, L, US gal, kg, lb, kg/m³ and
  so on. It needs nothing heavier than :mod:`re`, so ``revolve measure``
  starts quickly;
* a **pint path** for everything else, through the one package-wide
  :func:`registry`, which is created only when first needed (importing pint
  and building a registry costs about half a second).

Definitions used by the fast path (all exact):

* 1 in = 25.4 mm (international yard and pound agreement, 1959);
* 1 lb = 0.45359237 kg (international yard and pound agreement, 1959);
* 1 US gal = 231 in³ (US customary definition);
* 1 imperial gal = 4.54609 L (UK Weights and Measures Act 1985);
* 1 oil barrel (``bbl``) = 42 US gal (common practice);
* 1 mil (``mil``, ``thou``) = 0.001 in, a length -- in pint ``mil`` is an
  angle, so the fast path is what gives it its coating-trade meaning.

Names that mean different things on the two sides of the Atlantic (``gallon``,
``barrel``, ``ton``, ``pint``, ``quart``, ``fluid_ounce``) are refused with a
message saying which spelling to use, rather than guessed.

Examples
--------
>>> factor("mm", "length")
0.001
>>> convert(1.0, "in", "mm", "length")
25.4
>>> parse_quantity("7.85 g/cm^3", "density")
7850.0
>>> canonical("mm2")
'mm²'
>>> factor("kg", "length")
Traceback (most recent call last):
...
revolve.errors.UnitError: 'kg' is a mass unit, not a length unit
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from typing import Any, Optional

from revolve.errors import UnitError, quoted

__all__ = [
    "KINDS",
    "SI_UNITS",
    "canonical",
    "convert",
    "exact_factor",
    "factor",
    "fast_units",
    "parse_quantity",
    "registry",
]

#: The kinds of quantity this module converts, in the order they are listed.
KINDS = ("length", "area", "volume", "mass", "density", "time")

#: The SI unit (display spelling) that :func:`factor` converts each kind to.
SI_UNITS = {"length": "m", "area": "m²", "volume": "m³", "mass": "kg",
            "density": "kg/m³", "time": "s"}

# pint dimensionality of each kind, for checking units that only pint knows.
_PINT_DIMENSION = {"length": "[length]", "area": "[length] ** 2",
                   "volume": "[length] ** 3", "mass": "[mass]",
                   "density": "[mass] / [length] ** 3", "time": "[time]"}
_PINT_SI = {"length": "meter", "area": "meter ** 2", "volume": "meter ** 3",
            "mass": "kilogram", "density": "kilogram / meter ** 3",
            "time": "second"}


@dataclass(frozen=True)
class _Unit:
    """One fast-path unit: its kind, exact factor num/den to SI, display."""

    kind: str
    num: int
    den: int
    display: str

    def power(self, n: int, kind: str) -> "_Unit":
        sup = {2: "²", 3: "³"}[n]
        return _Unit(kind, self.num ** n, self.den ** n, self.display + sup)


def _ratio(num: int, den: int) -> tuple[int, int]:
    g = math.gcd(num, den)
    return num // g, den // g


# (display, kind, numerator, denominator, case-sensitive symbols,
#  case-insensitive names).  Factors are exact ratios to the SI unit.
_INCH = (254, 10_000)                                  # 1959 agreement
_IN3 = (_INCH[0] ** 3, _INCH[1] ** 3)
_US_GALLON = (231 * _IN3[0], _IN3[1])                  # US customary
_TABLE_ROWS = (
    # lengths, in metres
    ("mm", "length", 1, 1000, ("mm",),
     ("millimetre", "millimetres", "millimeter", "millimeters")),
    ("cm", "length", 1, 100, ("cm",),
     ("centimetre", "centimetres", "centimeter", "centimeters")),
    ("dm", "length", 1, 10, ("dm",),
     ("decimetre", "decimetres", "decimeter", "decimeters")),
    ("m", "length", 1, 1, ("m",), ("metre", "metres", "meter", "meters")),
    ("km", "length", 1000, 1, ("km",),
     ("kilometre", "kilometres", "kilometer", "kilometers")),
    ("µm", "length", 1, 1_000_000, ("um",),
     ("micrometre", "micrometres", "micrometer", "micrometers", "micron",
      "microns")),
    ("in", "length", *_INCH, ("in",), ("inch", "inches")),
    ("ft", "length", 12 * _INCH[0], _INCH[1], ("ft",), ("foot", "feet")),
    ("yd", "length", 36 * _INCH[0], _INCH[1], ("yd",), ("yard", "yards")),
    ("mil", "length", _INCH[0], 1000 * _INCH[1], ("mil",),
     ("mils", "thou")),
    # volumes that are not a length cubed, in cubic metres
    ("L", "volume", 1, 1000, ("L", "l"),
     ("litre", "litres", "liter", "liters")),
    ("mL", "volume", 1, 1_000_000, ("mL", "ml"),
     ("millilitre", "millilitres", "milliliter", "milliliters")),
    ("US gal", "volume", *_US_GALLON, (),
     ("gal", "usgal", "us_gal", "us_gallon", "us_gallons",
      "us_liquid_gallon")),
    ("imp gal", "volume", 454_609, 100_000_000, (),        # UK WMA 1985
     ("impgal", "imp_gal", "imperial_gallon", "imperial_gallons",
      "uk_gallon", "uk_gallons", "ukgal")),
    ("bbl", "volume", 42 * _US_GALLON[0], _US_GALLON[1], (),
     ("bbl", "oil_barrel", "oil_barrels", "oil_bbl")),    # common practice
    # masses, in kilograms
    ("kg", "mass", 1, 1, ("kg",), ("kilogram", "kilograms")),
    ("g", "mass", 1, 1000, ("g",), ("gram", "grams")),
    ("mg", "mass", 1, 1_000_000, ("mg",), ("milligram", "milligrams")),
    ("t", "mass", 1000, 1, ("t",), ("tonne", "tonnes", "metric_ton")),
    ("lb", "mass", 45_359_237, 100_000_000, ("lb", "lbs"),   # 1959
     ("pound", "pounds")),
    # times, in seconds
    ("s", "time", 1, 1, ("s",), ("sec", "second", "seconds")),
    ("min", "time", 60, 1, ("min",), ("minute", "minutes")),
    ("h", "time", 3600, 1, ("h",), ("hr", "hour", "hours")),
)

_SYMBOLS: dict[str, _Unit] = {}
_NAMES: dict[str, _Unit] = {}
for _display, _kind, _num, _den, _syms, _names in _TABLE_ROWS:
    _unit = _Unit(_kind, *_ratio(_num, _den), _display)
    for _s in _syms:
        _SYMBOLS[_s] = _unit
    for _n in _names:
        _NAMES[_n] = _unit
del _display, _kind, _num, _den, _syms, _names, _unit, _s, _n

# Names pint would silently read one way (US) although many people mean the
# other (imperial, or long/short ton). Refused with a pointer instead.
_AMBIGUOUS = {
    "gallon": "write 'US_gallon' (231 in³) or 'imperial_gallon' (4.54609 L)",
    "barrel": "write 'oil_barrel' or 'bbl' (42 US gal), or the volume in L",
    "ton": "write 't' or 'tonne' (1000 kg), or the mass in lb",
    "pint": "write the volume in L or mL",
    "quart": "write the volume in L or mL",
    "fluid_ounce": "write the volume in mL",
    "floz": "write the volume in mL",
    "fl_oz": "write the volume in mL",
}

_SUPERSCRIPTS = str.maketrans({"²": "^2", "³": "^3", "µ": "u", "μ": "u",
                               "\u2009": " ", "\u00a0": " "})
# Patterns are compiled on first use (re keeps them): a short run needs few of them.
_POWER_SUFFIX = r"^(.*?[A-Za-z])\^?([23])$"
_SPACES_AROUND = r"\s*([/^])\s*"
_NUMBER = r"(?s)\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$"

_LOOKUP_CACHE: dict[str, Optional[_Unit]] = {}
_PINT_CACHE: dict[tuple[str, str], float] = {}
_REGISTRY: Any = None


def registry() -> Any:
    """Return the package's one pint ``UnitRegistry``, creating it on first use.

    Everything in revolve that needs pint should use this registry, so that
    quantities from different modules can be combined.

    Returns
    -------
    pint.UnitRegistry
        The shared registry (the same object on every call).

    Examples
    --------
    >>> registry() is registry()
    True
    >>> registry().Quantity(1, "inch").to("mm").magnitude
    25.4
    """
    global _REGISTRY
    if _REGISTRY is None:
        import pint  # heavy: only when a unit is outside the fast table

        _REGISTRY = pint.UnitRegistry()
    return _REGISTRY


def _normalise(unit: str) -> str:
    """Spelling used for fast-table look-up ('mm ^ 2' -> 'mm^2', 'µm' -> 'um')."""
    text = unit.translate(_SUPERSCRIPTS).replace("**", "^").strip()
    if not any(ch.isspace() for ch in text):     # nothing to join (most spellings)
        return text
    text = re.sub(_SPACES_AROUND, r"\1", text)
    return re.sub(r"\s+", "_", text)


def _lookup(key: str) -> Optional[_Unit]:
    """The fast-table unit for a normalised spelling, or None."""
    if key in _LOOKUP_CACHE:
        return _LOOKUP_CACHE[key]
    found = _SYMBOLS.get(key) or _NAMES.get(key.lower())
    if found is None and key.count("/") == 1:
        top, bottom = (_lookup(part) for part in key.split("/"))
        if (top is not None and bottom is not None and top.kind == "mass"
                and bottom.kind == "volume"):
            num, den = _ratio(top.num * bottom.den, top.den * bottom.num)
            found = _Unit("density", num, den,
                          f"{top.display}/{bottom.display}")
    if found is None and "/" not in key:
        match = re.match(_POWER_SUFFIX, key)
        if match:
            base = _SYMBOLS.get(match.group(1)) or _NAMES.get(
                match.group(1).lower())
            if base is not None and base.kind == "length":
                n = int(match.group(2))
                found = base.power(n, "area" if n == 2 else "volume")
    _LOOKUP_CACHE[key] = found
    return found


def _a(kind: str) -> str:
    """'a length', 'an area'."""
    return ("an " if kind[0] in "aeiou" else "a ") + kind


def _check_kind(kind: str) -> None:
    if kind not in KINDS:
        raise ValueError(f"kind must be one of {', '.join(KINDS)}, not {kind!r}")


def fast_units(kind: Optional[str] = None) -> tuple[str, ...]:
    """List the spellings the fast path knows without pint.

    Areas and volumes of every length symbol (``mm^2``, ``mm2``, ``mm²``, ...)
    and every mass/volume density (``kg/m^3``, ``lb/in^3``, ...) are accepted
    too; the list gives one ``^`` spelling of each.

    Parameters
    ----------
    kind : str, optional
        One of :data:`KINDS`; all kinds when omitted.

    Returns
    -------
    tuple of str
        Spellings, sorted.

    Examples
    --------
    >>> fast_units("time")
    ('h', 'hour', 'hours', 'hr', 'min', 'minute', 'minutes', 's', 'sec', 'second', 'seconds')
    >>> "kg/m^3" in fast_units("density") and "mm^2" in fast_units("area")
    True
    """
    if kind is not None:
        _check_kind(kind)
    spellings = set(_SYMBOLS) | set(_NAMES)
    lengths = [s for s, u in _SYMBOLS.items() if u.kind == "length"]
    spellings |= {f"{s}^{n}" for s in lengths for n in (2, 3)}
    masses = [s for s, u in _SYMBOLS.items() if u.kind == "mass"]
    volumes = [s for s in spellings if _lookup(s).kind == "volume"]
    spellings |= {f"{m}/{v}" for m in masses for v in volumes}
    return tuple(sorted(s for s in spellings
                        if kind is None or _lookup(s).kind == kind))


def _suggest(unit: str, kind: str) -> str:
    """' did you mean ...?' text for an unknown unit, from the fast table."""
    import difflib  # only on the error path

    candidates = fast_units(kind)
    key = _normalise(unit)
    close = difflib.get_close_matches(key, candidates, n=3, cutoff=0.6)
    if not close:
        close = difflib.get_close_matches(key.lower(),
                                          [c.lower() for c in candidates],
                                          n=3, cutoff=0.6)
    if close:
        return "; did you mean " + " or ".join(f"'{c}'" for c in close) + "?"
    return f"; known {kind} units include {_COMMON[kind]}"


_COMMON = {"length": "mm, m, in, ft", "area": "mm^2, m^2, in^2, ft^2",
           "volume": "m^3, L, US_gallon, imperial_gallon, bbl",
           "mass": "kg, g, t, lb", "density": "kg/m^3, g/cm^3, lb/in^3",
           "time": "s, min, h"}


def _refuse_ambiguous(unit: str, key: str, kind: Optional[str] = None) -> None:
    """Refuse a unit name with several meanings; when a ``kind`` was asked for and the
    name is of another kind in every meaning, say that instead (it is the real mistake)."""
    bare = key.lower()
    singular = bare[:-1] if bare.endswith("s") else bare
    for word in (bare, singular):
        if word in _AMBIGUOUS:
            word_kind = "mass" if word == "ton" else "volume"
            if kind is not None and kind != word_kind:
                raise UnitError(f"{quoted(unit.strip())} is {_a(word_kind)} unit, "
                                f"not {_a(kind)} unit")
            raise UnitError(f"{quoted(unit)} is ambiguous: {_AMBIGUOUS[word]}")


_POWER_OP = r"\^|\*\*"
_SAFE_EXPONENT = r"\s*\(?\s*[+-]?\d(?:\.\d+)?\s*\)?"


def _guard_for_pint(text: str, what: str) -> None:
    """Refuse text that could make pint's evaluator work for a long time.

    pint evaluates integer powers exactly, so ``9**9**9`` would hang. Only a
    single-digit exponent on a unit name or a bracket is let through.
    """
    if len(text) > 100:
        raise UnitError(f"{what} is too long ({len(text)} characters)")
    for match in re.finditer(_POWER_OP, text):
        before = text[:match.start()].rstrip()
        after = text[match.end():]
        exponent = re.match(_SAFE_EXPONENT, after)
        if (not before or not (before[-1].isalpha() or before[-1] == ")")
                or exponent is None
                or re.match(_POWER_OP, after[exponent.end():].lstrip())):
            raise UnitError(f"{what} has a power that is not a single digit "
                            f"on a unit name: {quoted(text.strip())}")


# pint's name for each fast-table unit. Words of the fast table are replaced
# by these before pint sees them, so that a word means the same on both paths
# (pint's own 'bbl' is a 31.5 gal barrel and its 'mil' an angle).
_PINT_NAMES = {
    "mm": "millimeter", "cm": "centimeter", "dm": "decimeter", "m": "meter",
    "km": "kilometer", "µm": "micrometer", "in": "inch", "ft": "foot",
    "yd": "yard", "mil": "thou", "L": "liter", "mL": "milliliter",
    "US gal": "US_liquid_gallon", "imp gal": "imperial_gallon",
    "bbl": "oil_barrel", "kg": "kilogram", "g": "gram", "mg": "milligram",
    "t": "metric_ton", "lb": "pound", "s": "second", "min": "minute",
    "h": "hour",
}
# A word: not the exponent of a number such as 1e3.
_WORD = (r"(?<![0-9.])[A-Za-z_]\w*"
         r"|(?<=[0-9.])(?![eE][+-]?\d)[A-Za-z_]\w*")


def _pint_text(unit: str, what: str) -> str:
    """Text for pint: checked by the guard, fast-table words renamed."""
    text = unit.translate(_SUPERSCRIPTS).strip()
    _guard_for_pint(text, what)

    def rename(match: "re.Match[str]") -> str:
        word = match.group(0)
        _refuse_ambiguous(word, word)
        found = _SYMBOLS.get(word) or _NAMES.get(word.lower())
        return _PINT_NAMES[found.display] if found is not None else word

    return re.sub(_WORD, rename, text)


def _pint_factor(unit: str, kind: str) -> float:
    """SI factor of a unit only pint knows; checks the dimension."""
    text = _pint_text(unit, f"unit {quoted(unit)}")
    cached = _PINT_CACHE.get((text, kind))
    if cached is not None:
        return cached
    ureg = registry()
    try:
        parsed = ureg.parse_units(text)
    except Exception:  # pint raises many kinds for junk input
        raise UnitError(f"unknown {kind} unit {quoted(unit)}"
                        + _suggest(unit, kind)) from None
    if parsed.dimensionality != ureg.get_dimensionality(_PINT_DIMENSION[kind]):
        dim = str(parsed.dimensionality)
        raise UnitError(f"{quoted(unit)} is not {_a(kind)} unit (its dimension is "
                        f"{dim if dim != 'dimensionless' else 'none'}); "
                        f"{kind} units include {_COMMON[kind]}")
    try:
        value = float(ureg.Quantity(1.0, parsed).to(_PINT_SI[kind]).magnitude)
    except Exception:
        raise UnitError(f"cannot convert {quoted(unit)} to {SI_UNITS[kind]}") from None
    if not math.isfinite(value) or value <= 0.0:
        raise UnitError(f"{quoted(unit)} has no usable factor to {SI_UNITS[kind]}")
    _PINT_CACHE[(text, kind)] = value
    return value


def _fast(unit: str, kind: str) -> Optional[_Unit]:
    """The fast-table unit of the right kind, None if only pint may know it."""
    if not isinstance(unit, str):
        raise UnitError(f"a unit must be text, not {type(unit).__name__}")
    key = _normalise(unit)
    if not key:
        raise UnitError(f"no {kind} unit given")
    found = _lookup(key)
    if found is None:
        _refuse_ambiguous(unit, key, kind)
        return None
    if found.kind != kind:
        raise UnitError(f"{quoted(unit.strip())} is {_a(found.kind)} unit, "
                        f"not {_a(kind)} unit")
    return found


def factor(unit: str, kind: str) -> float:
    """Return the factor that converts a value in ``unit`` to SI.

    Parameters
    ----------
    unit : str
        A unit such as ``"mm"``, ``"in^2"``, ``"mm²"``, ``"US_gallon"``,
        ``"lb/ft^3"``, or anything pint knows of the right dimension.
    kind : str
        One of :data:`KINDS`; the unit must be of this kind.

    Returns
    -------
    float
        Value in SI = value in ``unit`` × factor.

    Raises
    ------
    UnitError
        If the unit is unknown (with close known spellings suggested), of
        another kind, or ambiguous.

    Examples
    --------
    >>> factor("in", "length")
    0.0254
    >>> factor("mm^2", "area") == factor("mm2", "area") == factor("mm²", "area")
    True
    >>> factor("g/cm^3", "density")
    1000.0
    >>> factor("hour", "time")
    3600.0
    >>> factor("mmm", "length")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: unknown length unit 'mmm'; did you mean 'mm'?
    >>> factor("gallon", "volume")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: 'gallon' is ambiguous: write 'US_gallon' (231 in³) or 'imperial_gallon' (4.54609 L)
    """
    _check_kind(kind)
    found = _fast(unit, kind)
    if found is not None:
        return found.num / found.den
    return _pint_factor(unit, kind)


def exact_factor(unit: str, kind: str):
    """Return the exact SI factor of a fast-path unit as a Fraction.

    Parameters
    ----------
    unit, kind : str
        As for :func:`factor`.

    Returns
    -------
    fractions.Fraction or None
        The exact factor, or None if the unit is known only to pint.

    Examples
    --------
    >>> exact_factor("in", "length")
    Fraction(127, 5000)
    >>> exact_factor("US_gallon", "volume") == 231 * exact_factor("in^3", "volume")
    True
    >>> exact_factor("furlong", "length") is None
    True
    """
    from fractions import Fraction

    _check_kind(kind)
    found = _fast(unit, kind)
    if found is None:
        _pint_factor(unit, kind)  # raises if unknown or of the wrong kind
        return None
    return Fraction(found.num, found.den)


def convert(value: Any, from_unit: str, to_unit: str, kind: str) -> Any:
    """Convert a value (float or numpy array) between two units of one kind.

    Between two fast-path units the ratio is formed exactly before rounding,
    so ``1 in`` is exactly the float ``25.4`` mm.

    Parameters
    ----------
    value : float or array_like
        The value(s) in ``from_unit``.
    from_unit, to_unit : str
        Units of the same kind.
    kind : str
        One of :data:`KINDS`.

    Returns
    -------
    float or numpy.ndarray
        The value(s) in ``to_unit``.

    Examples
    --------
    >>> convert(1.0, "US_gallon", "in^3", "volume")
    231.0
    >>> convert(1.0, "bbl", "gal", "volume")
    42.0
    >>> convert(2.0, "ft", "in", "length")
    24.0
    >>> convert(0.0, "m", "mm", "length")
    0.0
    """
    _check_kind(kind)
    source, target = _fast(from_unit, kind), _fast(to_unit, kind)
    if source is not None and target is not None:
        ratio = (source.num * target.den) / (source.den * target.num)
    else:
        ratio = factor(from_unit, kind) / factor(to_unit, kind)
    result = value * ratio
    return float(result) if isinstance(value, (int, float)) else result


def _parse_with_pint(text: str, kind: str) -> float:
    """Whole-expression parse ('1/2 in', '3 ft + 4 in') for what the fast
    path cannot split into number + unit."""
    if not text.strip():
        raise UnitError(f"no {kind} given")
    if not any(c.isdigit() for c in text):
        raise UnitError(f"{quoted(text.strip())} has no number; write it like "
                        f"'2.5 {_example(kind)}'")
    cleaned = _pint_text(text, f"quantity {quoted(text.strip())}")
    ureg = registry()
    try:
        quantity = ureg.parse_expression(cleaned)
    except Exception:
        raise UnitError(f"cannot read {quoted(text.strip())} as {_a(kind)}; write a "
                        f"number and a unit, like '2.5 {_example(kind)}'"
                        ) from None
    if not hasattr(quantity, "units") or quantity.dimensionless:
        raise UnitError(f"{quoted(text.strip())} has no unit; write it like "
                        f"'2.5 {_example(kind)}'")
    if quantity.dimensionality != ureg.get_dimensionality(
            _PINT_DIMENSION[kind]):
        raise UnitError(f"{quoted(text.strip())} is not {_a(kind)} (its dimension is "
                        f"{quantity.dimensionality})")
    try:
        return float(quantity.to(_PINT_SI[kind]).magnitude)
    except Exception:
        raise UnitError(f"cannot convert {quoted(text.strip())} to "
                        f"{SI_UNITS[kind]}") from None


def _example(kind: str) -> str:
    return {"length": "mm", "area": "mm^2", "volume": "L", "mass": "kg",
            "density": "kg/m^3", "time": "min"}[kind]


def parse_quantity(text: str, kind: str,
                   default_unit: Optional[str] = None) -> float:
    """Read a quantity such as ``"7850 kg/m^3"`` or ``"2.5 in"`` into SI.

    A number followed by a fast-path unit needs no pint. A number followed by
    another unit name goes to pint for the unit only; text that is not a
    number and a unit (``"1/2 in"``) is parsed by pint's own expression
    reader (never Python ``eval``), with large powers refused.

    Parameters
    ----------
    text : str
        The quantity.
    kind : str
        One of :data:`KINDS`.
    default_unit : str, optional
        Unit for a bare number; without it a bare number is an error.

    Returns
    -------
    float
        The value in SI (see :data:`SI_UNITS`).

    Raises
    ------
    UnitError
        If the text is not a finite number with a unit of the right kind.

    Examples
    --------
    >>> parse_quantity("2.5 in", "length")
    0.0635
    >>> parse_quantity("7850 kg/m^3", "density")
    7850.0
    >>> parse_quantity("12", "length", default_unit="mm")
    0.012
    >>> parse_quantity("-0 mm", "length")
    -0.0
    >>> parse_quantity("12", "length")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: '12' has no unit; write it like '12 mm'
    >>> parse_quantity("1,5 mm", "length")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: '1,5 mm': write the decimal point as '.', and no thousands separator
    """
    _check_kind(kind)
    if not isinstance(text, str):
        raise UnitError(f"{_a(kind)} must be given as text, not "
                        f"{type(text).__name__}")
    match = re.fullmatch(_NUMBER, text)
    if match is not None:
        number, unit = match.groups()
        if not unit:
            if default_unit is None:
                raise UnitError(f"{quoted(text.strip())} has no unit; write it like "
                                f"'{number if len(number) <= 20 else 2.5} "
                                f"{_example(kind)}'")
            unit = default_unit
        if unit[0] == "," and unit[1:2].isdigit():
            raise UnitError(f"{quoted(text.strip())}: write the decimal point as "
                            f"'.', and no thousands separator")
        found = _fast(unit, kind)
        if found is not None:
            value = float(number) * found.num / found.den
        else:
            try:
                value = _parse_with_pint(text if match.group(2) else
                                         f"{number} {unit}", kind)
            except UnitError:
                first = unit.translate(_SUPERSCRIPTS)[0]
                if first.isalpha() or first == "_":
                    factor(unit, kind)  # the clearer, unit-naming error
                raise
    else:
        value = _parse_with_pint(text, kind)
    if not math.isfinite(value):
        raise UnitError(f"{quoted(text.strip())} is not a finite {kind}")
    return value


def canonical(unit: str, kind: Optional[str] = None) -> str:
    """Return the display spelling of a unit (``"mm2"`` -> ``"mm²"``).

    Parameters
    ----------
    unit : str
        Any spelling :func:`factor` accepts.
    kind : str, optional
        If given, the unit must be of this kind.

    Returns
    -------
    str
        The short display form: ``mm``, ``µm``, ``in²``, ``L``, ``US gal``,
        ``imp gal``, ``kg/m³``; pint's short pretty form for other units.

    Examples
    --------
    >>> [canonical(u) for u in ("millimetre", "um", "in^2", "l", "usgal")]
    ['mm', 'µm', 'in²', 'L', 'US gal']
    >>> canonical("kg/m3", "density")
    'kg/m³'
    >>> canonical("kg", "length")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: 'kg' is a mass unit, not a length unit
    """
    if kind is not None:
        _check_kind(kind)
        found = _fast(unit, kind)
        if found is None:
            _pint_factor(unit, kind)
    else:
        if not isinstance(unit, str) or not _normalise(unit):
            raise UnitError("no unit given")
        key = _normalise(unit)
        found = _lookup(key)
        if found is None:
            _refuse_ambiguous(unit, key)
    if found is not None:
        return found.display
    text = _pint_text(unit, f"unit {quoted(unit)}")
    try:
        return f"{registry().parse_units(text):~P}"
    except Exception:
        raise UnitError(f"unknown unit {quoted(unit)}") from None
