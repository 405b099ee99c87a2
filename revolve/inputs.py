"""Values people type: lengths with fractions and feet-inches, lists, money, percentages.

The command line (:mod:`revolve.cli.options`) and the library read typed
values through these parsers, so ``--step "1/8 in"`` and
``levels(step="1/8 in")`` mean the same. Each parser reads its text with a
regular expression (a whitelist; never Python's evaluator), bounds the size
of what it reads, and raises :class:`~revolve.errors.RevolveError` with a
sentence saying what to write instead; the caller adds the option's name.

Lengths
    ``12``, ``12.5 mm``, ``1/8 in``, ``3 1/2 in``, ``-0.25in``, and
    feet-inches as inch shops write them: ``3' 4 1/8"``, ``3'``, ``4 1/8"``,
    ``3 ft 4 in``. A bare number takes the unit the command documents (the
    drawing's unit, as a rule); the unit is never guessed otherwise.

Examples
--------
>>> parse_length("1/8 in")
Length(value=0.125, unit='in')
>>> round(parse_length("3 1/2 in").metres(), 12)
0.0889
>>> parse_length("3' 4 1/8\\"")
Length(value=40.125, unit='in')
>>> parse_length("12").metres("mm")
0.012
>>> parse_length("12").metres()
Traceback (most recent call last):
...
revolve.errors.UnitError: '12' has no unit; write it like '12 mm'
>>> parse_length("1/0 in")
Traceback (most recent call last):
...
revolve.errors.RevolveError: '1/0 in': a fraction cannot have 0 below the line
>>> parse_list("200, 50,100", int)
[200, 50, 100]
>>> parse_money("1250.50 EUR"), parse_money("80")
(Money(amount=1250.5, currency='EUR'), Money(amount=80.0, currency=None))
"""

from __future__ import annotations

import math
import re
from fractions import Fraction
from typing import Callable, List, NamedTuple, Optional, TypeVar

from revolve.errors import RevolveError, UnitError, quoted

__all__ = ["Length", "Money", "parse_length", "parse_list", "parse_money", "parse_percent",
           "MAX_TEXT", "MAX_ITEMS"]

#: Longest text any of these parsers reads.
MAX_TEXT = 200
#: Most items in one list.
MAX_ITEMS = 100_000

T = TypeVar("T")

_DECIMAL = r"(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d{1,3})?"
_FRACTION = r"\d{1,9}/\d{1,9}"
# a plain number, a fraction, or a whole number and a fraction ("3 1/2", "3-1/2")
_AMOUNT = rf"(?:\d{{1,9}}(?:\s+|-){_FRACTION}|{_FRACTION}|{_DECIMAL})"
_UNIT = r"[A-Za-zµ_][A-Za-zµ_0-9²³^]*"
# Patterns as text: ``re`` compiles each on its first use and keeps it.
_SIMPLE = rf"\s*(?P<sign>[+-]?)\s*(?P<amount>{_AMOUNT})\s*(?P<unit>{_UNIT})?\s*\Z"
# feet and inches: 3' 4 1/8"   3'   4 1/8"   3 ft 4 in   3ft
_FEET_INCHES = (rf"\s*(?P<sign>[+-]?)\s*(?:(?P<feet>{_AMOUNT})\s*(?:'|′|ft\b))?\s*"
                rf"(?:(?P<inches>{_AMOUNT})\s*(?:\"|″|''|in\b))?\s*\Z")


class Length(NamedTuple):
    """A typed length: its number and its unit as written (None for a bare number)."""

    value: float
    unit: Optional[str]

    def metres(self, default_unit: Optional[str] = None) -> float:
        """The length in metres; a bare number takes ``default_unit`` (refused without one)."""
        from revolve import units

        unit = self.unit or default_unit
        if unit is None:
            raise UnitError(f"{quoted(_short(self.value))} has no unit; write it like "
                            f"'{_short(self.value)} mm'")
        return self.value * units.factor(unit, "length")

    def in_unit(self, unit: str, default_unit: Optional[str] = None) -> float:
        """The length in ``unit`` (a bare number is in ``default_unit``, else in ``unit``)."""
        from revolve import units

        if self.unit is None and default_unit is None:
            return self.value
        return self.metres(default_unit or unit) / units.factor(unit, "length")


def _short(v: float) -> str:
    return f"{v:g}"


def _amount(text: str, whole: str) -> Fraction:
    text = text.strip()
    mixed = re.fullmatch(r"(\d+)(?:\s+|-)(\d+)/(\d+)", text)
    if mixed:
        a, b, c = (int(g) for g in mixed.groups())
        if c == 0:
            raise RevolveError(f"{quoted(whole)}: a fraction cannot have 0 below the line")
        return a + Fraction(b, c)
    if "/" in text:
        b, c = (int(g) for g in text.split("/"))
        if c == 0:
            raise RevolveError(f"{quoted(whole)}: a fraction cannot have 0 below the line")
        return Fraction(b, c)
    return Fraction(text)


def parse_length(text: str) -> Length:
    """Read a typed length (see the module's description for the forms).

    >>> parse_length("-2.5mm"), parse_length("3 ft 4 in"), parse_length("0.5 ft")
    (Length(value=-2.5, unit='mm'), Length(value=40.0, unit='in'), Length(value=0.5, unit='ft'))
    >>> parse_length("3 1/2 kg")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: 'kg' is a mass unit, not a length unit
    >>> parse_length("three")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: 'three' is not a length; write a number and a unit such as '12.5 mm', '1/8 in' or 3' 4 1/8"
    """
    from revolve import units

    if not isinstance(text, str):
        if isinstance(text, (int, float)) and not isinstance(text, bool) and math.isfinite(text):
            return Length(float(text), None)
        raise RevolveError(f"a length must be text or a number, not {type(text).__name__}")
    if len(text) > MAX_TEXT:
        raise RevolveError(f"a length of {len(text)} characters is too long")
    simple = re.fullmatch(_SIMPLE, text)
    if simple is not None:
        value = _amount(simple.group("amount"), text.strip())
        if simple.group("sign") == "-":
            value = -value
        unit = simple.group("unit")
        if unit is not None:
            units.factor(unit, "length")      # refuses a unit that is not a length
        return Length(_finite(value, text), unit)
    fi = re.fullmatch(_FEET_INCHES, text)
    if fi is not None and (fi.group("feet") or fi.group("inches")):
        inches = Fraction(0)
        if fi.group("feet"):
            inches += 12 * _amount(fi.group("feet"), text.strip())
        if fi.group("inches"):
            inches += _amount(fi.group("inches"), text.strip())
        if fi.group("sign") == "-":
            inches = -inches
        return Length(_finite(inches, text), "in")
    raise RevolveError(f"{quoted(text.strip())} is not a length; write a number and a unit such as "
                       f"'12.5 mm', '1/8 in' or 3' 4 1/8\"")


def _finite(value: Fraction, text: str) -> float:
    try:
        v = float(value)
    except OverflowError:
        v = math.inf
    if not math.isfinite(v):
        raise RevolveError(f"{quoted(text.strip())} is too large")
    return v


def parse_list(text: str, item: Callable[[str], T], what: str = "value") -> List[T]:
    """Comma-separated items, each read by ``item`` (an error names the item's place).

    >>> parse_list("1.5, 2", float)
    [1.5, 2.0]
    >>> parse_list("1,,2", float)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: item 2 is empty; separate the values by single commas, such as 200,50,100
    """
    if not isinstance(text, str):
        return [item(text)]
    parts = text.split(",")
    if len(parts) > MAX_ITEMS:
        raise RevolveError(f"more than {MAX_ITEMS} values in one list")
    out = []
    for n, part in enumerate(parts, 1):
        if not part.strip():
            raise RevolveError(f"item {n} is empty; separate the values by single commas, "
                               f"such as 200,50,100")
        try:
            out.append(item(part.strip()))
        except (ValueError, RevolveError) as e:
            if isinstance(e, RevolveError):
                raise
            raise RevolveError(f"item {n}, {quoted(part.strip())}, is not a {what}") from None
    return out


class Money(NamedTuple):
    """An amount and its currency as written (None when only a number was given)."""

    amount: float
    currency: Optional[str]


_MONEY = (rf"\s*(?:(?P<before>[A-Za-z]{{3}})\s*)?(?P<amount>{_DECIMAL})"
          rf"\s*(?P<after>[A-Za-z]{{3}})?\s*\Z")


def parse_money(text: str) -> Money:
    """An amount of money: a number, with a three-letter currency code before or after it.

    >>> parse_money("EUR 12"), parse_money("12.5usd")
    (Money(amount=12.0, currency='EUR'), Money(amount=12.5, currency='USD'))
    >>> parse_money("-3 EUR")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: '-3 EUR' is not an amount of money; write a number of zero or more with an optional currency code, such as '12.50 EUR'
    """
    m = re.fullmatch(_MONEY, text) if isinstance(text, str) and len(text) <= MAX_TEXT else None
    if m is None or (m.group("before") and m.group("after")):
        raise RevolveError(f"{quoted(str(text).strip())} is not an amount of money; write a number "
                           f"of zero or more with an optional currency code, such as '12.50 EUR'")
    amount = float(m.group("amount"))
    if not math.isfinite(amount):
        raise RevolveError(f"{quoted(text.strip())} is too large")
    code = m.group("before") or m.group("after")
    return Money(amount, code.upper() if code else None)


def parse_percent(text: str, low: float = 0.0, high: float = 100.0) -> float:
    """A percentage, with or without its ``%`` sign, between ``low`` and ``high``.

    >>> parse_percent("12.5 %"), parse_percent("3")
    (12.5, 3.0)
    >>> parse_percent("120")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: '120' is not a percentage from 0 to 100
    """
    m = re.fullmatch(rf"\s*(?P<v>[+-]?{_DECIMAL})\s*%?\s*", text) \
        if isinstance(text, str) and len(text) <= MAX_TEXT else None
    v = float(m.group("v")) if m else math.nan
    if not (low <= v <= high):
        raise RevolveError(f"{quoted(str(text).strip())} is not a percentage from {low:g} to {high:g}")
    return v


def positive_tolerance(value, option: str) -> float:
    """The cross-check's relative tolerance: a number (or its text) above zero, else an error
    naming ``option`` (the library's argument or the command line's option).

    >>> positive_tolerance("1e-6", "tolerance")
    1e-06
    >>> positive_tolerance(0, "--tolerance")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --tolerance: the tolerance must be a positive number
    """
    try:
        tolerance = float(value)
    except (TypeError, ValueError):
        tolerance = float("nan")
    if not tolerance > 0:
        raise RevolveError("the tolerance must be a positive number", option=option)
    return tolerance


def checked_number(value, place: str, *, zero: bool = False) -> float:
    """A number given as a number (not text, not a bool): finite and positive, or ≥ 0 with
    ``zero``; otherwise a :class:`~revolve.errors.RevolveError` naming ``place``.

    >>> checked_number(2, "feed"), checked_number(0, "scrap", zero=True)
    (2.0, 0.0)
    >>> checked_number(True, "feed")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: feed: must be a positive number, got True
    """
    ok = (not isinstance(value, bool) and isinstance(value, (int, float))
          and math.isfinite(value) and (value >= 0 if zero else value > 0))
    if not ok:
        raise RevolveError(f"must be a {'non-negative' if zero else 'positive'} number, "
                           f"got {value!r}", place=place)
    return float(value)
