"""Numbers in profile files: plain literals kept exact, expression strings parsed safely.

A number in a profile file is an integer, a decimal literal or a string
holding an expression such as ``"sqrt(3)*10"``. Each is turned into a
:class:`Value`: the float the engine works with and the exact input, which is

* a :class:`fractions.Fraction` for integers and decimal literals (no sympy
  is imported for these, to keep start-up fast),
* the original string for an expression (parsed by
  :func:`revolve.expr.parse_number`, never by Python's own evaluator), or
* an expression tree (:class:`revolve.expr.Expr`) for a coordinate that was
  computed, e.g. the end of a curve (a sympy number is taken too).

:func:`exact_to_float` gives the float of any of them (without sympy),
:func:`exact_tree` the expression tree, :func:`exact_to_sympy` a sympy number
(only for exact results), and :func:`exact_literal` writes one back as TOML text.

Examples
--------
>>> from decimal import Decimal, InvalidOperation, localcontext
>>> number(Decimal("0.1"), "x")
Value(value=0.1, exact=Fraction(1, 10))
>>> number(7, "x")
Value(value=7.0, exact=Fraction(7, 1))
>>> number("2.5e1", "x")
Value(value=25.0, exact=Fraction(25, 1))
>>> number(True, "radius")
Traceback (most recent call last):
...
revolve.errors.FormatError: radius must be a number, got true
"""

from __future__ import annotations

import math
import re
import sys
from decimal import Decimal, InvalidOperation, localcontext
from fractions import Fraction
from typing import Any, NamedTuple, Optional

from revolve.errors import ExpressionError, FormatError
from revolve.geometry.segments import Where

#: A plain decimal literal (what ``Fraction`` reads exactly), with optional sign and exponent.
PLAIN_NUMBER = re.compile(r"\s*[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?\s*\Z")

#: Digits carried when evaluating an exact expression to a float (then rounded once).
EVALUATION_DIGITS = 30
#: Most characters in one plain number (a longer one is refused before Python reads it).
MAX_NUMBER_CHARS = 100
#: Plain numbers other than 0 must lie within these sizes: the normal range of a float.
SMALLEST_NUMBER = sys.float_info.min
LARGEST_NUMBER = sys.float_info.max
#: Most characters of a text shown in a message.
QUOTE_CHARS = 40


class Value(NamedTuple):
    """A number as the engine uses it (``value``) and as it was written (``exact``)."""

    value: float
    exact: Any


def fail(message: str, where: Optional[Where]) -> FormatError:
    """A :class:`FormatError` at ``where``.

    >>> str(fail("bad", Where("a.toml", 3, "loop 1")))
    'a.toml:3: loop 1: bad'
    """
    where = where or Where()
    return FormatError(message, file=where.file, line=where.line, place=where.place)


def check_length_unit(unit: str, where: Optional[Where] = None) -> None:
    """Refuse a unit that is not a length unit, with the place in the file.

    Common units are checked from a small table without importing pint.

    >>> check_length_unit("in")
    >>> check_length_unit("kg", Where("a.toml", 2, "units"))
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: a.toml:2: units: 'kg' is a mass unit, not a length unit
    """
    from revolve.errors import UnitError
    from revolve.units import factor

    where = where or Where()
    if len(unit) > QUOTE_CHARS or not is_one_line(unit):
        raise UnitError(f"{quote(unit)} is not a length unit; length units include mm, m, in, "
                        "ft", file=where.file, line=where.line, place=where.place)
    try:
        factor(unit, "length")
    except UnitError as exc:
        raise exc.located(file=where.file, line=where.line, place=where.place) from None


def _control(code: int) -> bool:
    """Whether a character code is a control character or a line break of any kind."""
    return code < 0x20 or 0x7F <= code < 0xA0 or code in (0x2028, 0x2029)


def is_one_line(text: str) -> bool:
    """Whether a text has no line break or other control character (a tab is allowed).

    >>> is_one_line("carbon\\tsteel"), is_one_line("a\\nb"), is_one_line("a\\u2028b")
    (True, False, False)
    """
    return not any(_control(ord(ch)) and ch != "\t" for ch in text)


def quote(text: Any, limit: int = QUOTE_CHARS) -> str:
    """A user's text for a message: in double quotes, on one line, shortened.

    Line breaks, tabs and other control characters are escaped as in a
    Python or TOML string, so a message never spans two lines; a long text
    keeps its first characters and ends in ``...``.

    >>> print(quote("ab"), quote('say "hi"'), quote("two\\nlines"), quote("x" * 50, 10))
    "ab" "say \\"hi\\"" "two\\nlines" "xxxxxxx..."
    """
    text = str(text)
    shortened = len(text) > limit
    if shortened:
        text = text[:max(limit - 3, 1)]
    out = []
    for ch in text:
        code = ord(ch)
        if ch in '"\\':
            out.append("\\" + ch)
        elif ch == "\n":
            out.append("\\n")
        elif ch == "\r":
            out.append("\\r")
        elif ch == "\t":
            out.append("\\t")
        elif _control(code):
            out.append(f"\\u{code:04x}")
        else:
            out.append(ch)
    return '"' + "".join(out) + ('..."' if shortened else '"')


def describe(value: Any) -> str:
    """How a TOML value is named in messages (a text quoted on one line, see :func:`quote`).

    >>> describe(True), describe("ab"), describe([1, 2]), describe({"a": 1})
    ('true', '"ab"', 'a list', 'a table')
    >>> print(describe("a\\nb"))
    "a\\nb"
    """
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, str):
        return quote(value)
    if isinstance(value, list):
        return "a list"
    if isinstance(value, dict):
        return "a table"
    if isinstance(value, Decimal):
        return str(value)
    return repr(value) if not isinstance(value, (int, float)) else str(value)


def number(raw: Any, what: str, where: Optional[Where] = None) -> Value:
    """Read one number: an integer, a decimal, or a string holding an expression.

    Parameters
    ----------
    raw : int, Decimal, float or str
        The value as TOML decoded it (decimals as :class:`~decimal.Decimal`).
    what : str
        What the number is, for messages (``"radius"``, ``"start x"``).
    where : Where, optional
        The place in the file, for messages.

    Returns
    -------
    Value
        The float and the exact input.

    Raises
    ------
    FormatError
        For a value of the wrong type, NaN or infinity.
    ExpressionError
        For an expression the whitelist parser refuses (location filled in).

    Examples
    --------
    >>> from decimal import Decimal, localcontext
    >>> number(Decimal("nan"), "radius", Where("a.toml", 4, "loop 1, segment 2"))
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: a.toml:4: loop 1, segment 2: radius is not a finite number (nan and inf are refused)
    >>> number([1, 2], "angle")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: angle must be a number, got a list
    """
    if isinstance(raw, OversizeNumber):
        return Value(0.0, plain_fraction(raw.text, what, where))   # raises: too large or small
    if isinstance(raw, bool) or not isinstance(raw, (int, Decimal, float, str)):
        raise fail(f"{what} must be a number, got {describe(raw)}", where)
    if isinstance(raw, str):
        if PLAIN_NUMBER.match(raw):
            exact: Any = plain_fraction(raw, what, where)
        else:
            value = _expression_value(raw, what, where)
            return Value(value, raw)
    elif isinstance(raw, Decimal):
        exact = _decimal_fraction(raw, what, where)
    elif isinstance(raw, float):
        if not math.isfinite(raw):
            raise fail(f"{what} is not a finite number (nan and inf are refused)", where)
        exact = _decimal_fraction(Decimal(raw), what, where)
    else:
        if raw.bit_length() > 1100:
            raise fail(f"{what} is too large; {_RANGE_HINT}", where)
        exact = Fraction(raw)
    return Value(_float_in_range(exact, what, where), exact)


_RANGE_HINT = "numbers other than 0 must lie between 2.2e-308 and 1.8e308 in size"


def _float_in_range(exact: Fraction, what: str, where: Optional[Where]) -> float:
    """The float of an exact number, refused outside the normal range of floats."""
    try:
        value = float(exact)
    except OverflowError:
        value = math.inf
    if not math.isfinite(value):
        raise fail(f"{what} is too large; {_RANGE_HINT}", where)
    if exact and abs(value) < SMALLEST_NUMBER:
        raise fail(f"{what} is too small; {_RANGE_HINT}", where)
    return value


class OversizeNumber(NamedTuple):
    """A TOML float Python's decimal module cannot hold (an exponent of 19 digits or more)."""

    text: str


def toml_float(text: str) -> Any:
    """The ``parse_float`` of the TOML reader: a Decimal, or :class:`OversizeNumber`.

    The reader then refuses an oversize number with the key it belongs to
    instead of letting :class:`decimal.InvalidOperation` escape.

    >>> toml_float("2.5"), toml_float("1e99999999999999999999")
    (Decimal('2.5'), OversizeNumber(text='1e99999999999999999999'))
    """
    try:
        return Decimal(text)
    except (InvalidOperation, ValueError):
        return OversizeNumber(text)


def _decimal_fraction(raw: Decimal, what: str, where: Optional[Where]) -> Fraction:
    """A finite Decimal as a Fraction, refused when too long, too large or too small.

    The size is checked on the exponent before any digit is expanded, so a
    number such as ``1e999999999`` is refused at once.
    """
    if not raw.is_finite():
        raise fail(f"{what} is not a finite number (nan and inf are refused)", where)
    digits = len(raw.as_tuple().digits)
    if digits > MAX_NUMBER_CHARS:
        raise fail(f"{what} has {digits} digits; a number may have at most {MAX_NUMBER_CHARS}",
                   where)
    if raw and not -400 <= raw.adjusted() <= 400:   # far outside the range of floats
        raise fail(f"{what} is too {'large' if raw.adjusted() > 0 else 'small'}; {_RANGE_HINT}",
                   where)
    exact = Fraction(raw)
    _float_in_range(exact, what, where)
    return exact


def plain_fraction(text: str, what: str, where: Optional[Where] = None) -> Fraction:
    """The exact value of a plain decimal literal (``"2.5e1"``), with bounded work.

    A literal longer than :data:`MAX_NUMBER_CHARS` characters, or whose size
    lies outside :data:`SMALLEST_NUMBER` to :data:`LARGEST_NUMBER` (the normal
    range of floats; 0 aside), is refused with a :class:`FormatError`; the
    size is judged from the exponent before Python expands any digit.

    >>> plain_fraction(" -2.5e1 ", "x")
    Fraction(-25, 1)
    >>> plain_fraction("1" * 101, "start x", Where("a.toml", 2, "loop 1"))
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: a.toml:2: loop 1: start x is 101 characters long; a number may have at most 100
    >>> plain_fraction("1e999999999", "radius")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: radius is too large; numbers other than 0 must lie between 2.2e-308 and 1.8e308 in size
    >>> plain_fraction("1e-320", "radius")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: radius is too small; numbers other than 0 must lie between 2.2e-308 and 1.8e308 in size
    """
    text = text.strip()
    if len(text) > MAX_NUMBER_CHARS:
        raise fail(f"{what} is {len(text)} characters long; a number may have at most "
                   f"{MAX_NUMBER_CHARS}", where)
    try:
        raw = Decimal(text)
    except (InvalidOperation, ValueError):   # an exponent beyond the decimal module's
        size = "small" if re.search(r"[eE]-", text) else "large"
        raise fail(f"{what} is too {size}; {_RANGE_HINT}", where) from None
    return _decimal_fraction(raw, what, where)


def point(raw: Any, what: str, where: Optional[Where] = None) -> tuple[Value, Value]:
    """Read a pair ``[x, y]`` of numbers.

    Examples
    --------
    >>> [v.value for v in point([0, "1/4"], "start")]
    [0.0, 0.25]
    >>> point([1, 2, 3], "line_to", Where("a.toml", 9, "loop 1, segment 1"))
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: a.toml:9: loop 1, segment 1: line_to must be a pair [x, y], got a list of 3
    """
    if not isinstance(raw, list):
        raise fail(f"{what} must be a pair [x, y], got {describe(raw)}", where)
    if len(raw) != 2:
        raise fail(f"{what} must be a pair [x, y], got a list of {len(raw)}", where)
    return number(raw[0], f"{what} x", where), number(raw[1], f"{what} y", where)


def _expression_value(text: str, what: str, where: Optional[Where]) -> float:
    """Float value of an expression string, located errors."""
    where = where or Where()
    try:
        from revolve.expr import parse_number

        expr = parse_number(text)
    except ExpressionError as exc:
        raise exc.located(file=where.file, line=where.line, place=where.place) from None
    try:
        value = exact_to_float(expr)
    except (TypeError, ValueError, OverflowError, ArithmeticError):
        raise fail(f"{what} {describe(text)} is not a real number", where) from None
    if not math.isfinite(value):
        raise fail(f"{what} {describe(text)} is not a finite number", where)
    return value


def exact_to_float(exact: Any) -> float:
    """The float nearest an exact value (Fraction, expression string or tree, sympy number).

    Values that are not plain fractions are evaluated to 30 digits and rounded
    once (:func:`revolve.expr.constant_float`, without sympy), so the same input
    always gives the same float.

    >>> exact_to_float(Fraction(1, 3)) == 1 / 3
    True
    >>> exact_to_float("sqrt(3)*10") == math.sqrt(300)
    True
    """
    if isinstance(exact, (Fraction, int)):
        return float(exact)
    from revolve.expr import Expr, constant_float

    if isinstance(exact, str):
        if PLAIN_NUMBER.match(exact):
            return float(Fraction(exact.strip()))
        from revolve.expr import parse_number

        exact = parse_number(exact)
    if isinstance(exact, Expr):
        return constant_float(exact)
    import sympy

    value = sympy.N(exact, EVALUATION_DIGITS)
    if not value.is_real:
        raise ValueError("not a real number")
    return float(value)


def exact_tree(exact: Any):
    """The expression tree of an exact value (Fraction, int, expression string, tree).

    >>> exact_tree(Fraction(3, 4)), exact_tree("pi/2")
    (Expr('3/4'), Expr('pi/2'))
    """
    from revolve.expr import Expr, Num, as_expression, parse_number

    if isinstance(exact, (Fraction, int)) and not isinstance(exact, bool):
        return Num(exact)
    if isinstance(exact, str):
        if PLAIN_NUMBER.match(exact):
            return Num(Fraction(exact.strip()))
        return parse_number(exact)
    if isinstance(exact, Expr):
        return exact
    return as_expression(exact)


def exact_to_sympy(exact: Any):
    """The sympy number of an exact value (imports sympy: for exact results only).

    >>> exact_to_sympy(Fraction(3, 4)), exact_to_sympy("pi/2")
    (3/4, pi/2)
    """
    import sympy

    from revolve.expr import Expr

    if isinstance(exact, Fraction):
        return sympy.Rational(exact.numerator, exact.denominator)
    if isinstance(exact, int):
        return sympy.Integer(exact)
    if isinstance(exact, (str, Expr)):
        return exact_tree(exact).to_sympy()
    return exact


def decimal_text(value: Fraction) -> Optional[str]:
    """The exact decimal literal of a fraction, or None when it has no finite one.

    >>> decimal_text(Fraction(1, 8)), decimal_text(Fraction(-5)), decimal_text(Fraction(1, 3))
    ('0.125', '-5', None)
    >>> decimal_text(Fraction(3, 10**20))
    '3e-20'
    """
    den = value.denominator
    twos = fives = 0
    while den % 2 == 0:
        den //= 2
        twos += 1
    while den % 5 == 0:
        den //= 5
        fives += 1
    if den != 1:
        return None
    if value.denominator == 1:
        return str(value.numerator)
    places = max(twos, fives)

    with localcontext() as ctx:
        ctx.prec = len(str(abs(value.numerator))) + places + 5
        d = Decimal(value.numerator) / Decimal(value.denominator)
    text = format(d.normalize(), "f") if places <= 12 else format(d.normalize(), "e")
    if "e" in text:
        mantissa, exponent = text.split("e")
        text = f"{mantissa}e{int(exponent)}"
    return text


def float_literal(value: float) -> str:
    """TOML text of a float that reads back as the same float (shortest repr).

    >>> float_literal(0.1), float_literal(1e16), float_literal(-0.0), float_literal(3.0)
    ('0.1', '1e+16', '-0.0', '3.0')
    """
    value = float(value)
    if not math.isfinite(value):
        raise ValueError(f"cannot write the non-finite number {value!r}")
    return repr(value)


def expression_text(expr) -> str:
    """Text of an expression (a tree or a sympy expression) in the project's syntax (``^``).

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> expression_text(3 * t**2 / 90 + sympy.sqrt(2))
    't^2/30 + sqrt(2)'
    >>> from revolve.expr import parse_number
    >>> expression_text(parse_number("pi / 2"))
    'pi/2'
    """
    text = getattr(expr, "text", None)
    if callable(text):       # an expression tree prints itself (no sympy)
        return text()
    from sympy.printing.str import StrPrinter

    class Printer(StrPrinter):
        """Sympy's string printer with the spellings revolve.expr reads."""

        def _print_Float(self, expr):
            if expr._prec <= 53:
                return float_literal(float(expr))
            return StrPrinter({"full_prec": True})._print_Float(expr)

        def _print_Exp1(self, expr):
            return "exp(1)"

        def _print_Abs(self, expr):
            return "abs(" + self._print(expr.args[0]) + ")"

        def _print_ImaginaryUnit(self, expr):
            raise ValueError("the expression is not real")

    return Printer().doprint(expr).replace("**", "^")


def exact_literal(exact: Any) -> str:
    """TOML text of an exact value: a plain literal when possible, else a quoted expression.

    >>> exact_literal(Fraction(5, 2)), exact_literal(Fraction(1, 3)), exact_literal("pi/2")
    ('2.5', '"1/3"', '"pi/2"')
    """
    if isinstance(exact, int):
        exact = Fraction(exact)
    if getattr(exact, "is_Rational", False):
        exact = Fraction(int(exact.p), int(exact.q))
    plain = getattr(exact, "exact_value", None)      # an expression tree that is a fraction
    if plain is not None and plain() is not None:
        exact = plain()
    if isinstance(exact, Fraction):
        text = decimal_text(exact)
        if text is not None:
            return text
        return toml_string(f"{exact.numerator}/{exact.denominator}")
    if isinstance(exact, str):
        return exact.strip() if PLAIN_NUMBER.match(exact) else toml_string(exact)
    return toml_string(expression_text(exact))


def toml_string(text: str) -> str:
    """A TOML basic string holding ``text``.

    >>> print(toml_string('a "b" \\\\ c'))
    "a \\"b\\" \\\\ c"
    """
    out = ['"']
    for ch in text:
        code = ord(ch)
        if ch == '"':
            out.append('\\"')
        elif ch == "\\":
            out.append("\\\\")
        elif code < 0x20 or code == 0x7F:
            out.append(f"\\u{code:04x}")
        else:
            out.append(ch)
    out.append('"')
    return "".join(out)
