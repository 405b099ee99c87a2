"""Safe parsing of untrusted expression text into exact sympy objects.

Profile files and drawings carry expressions such as ``40 - x^2/90``,
``25*cos(t)`` or ``sqrt(3)*10``. They are parsed here by a hand-written
tokenizer and recursive-descent parser that accepts only a whitelist and builds
sympy objects directly; the text never reaches ``eval``, ``exec``, ``sympify``
or ``parse_expr``. Decimals become exact rationals, never floats.

Grammar (``^`` and ``**`` are powers, right-associative, binding tighter than
unary minus, so ``-2^2`` is -4 and ``2^3^2`` is 512)::

    expression := term (("+" | "-") term)*
    term       := factor (("*" | "/") factor)*
    factor     := ("+" | "-")* power
    power      := atom (("^" | "**") factor)?
    atom       := number | variable | "pi" | "e" | function "(" arguments ")"
                | "(" expression ")"

Hostile input is refused before sympy does real work (see the ``MAX_*``
limits): exponents must fold to a rational number no larger than
``MAX_EXPONENT``, no numerator or denominator may exceed ``MAX_BITS`` bits, no
constant part may exceed 2^MAX_BITS in size, and functions and roots may nest
only ``MAX_NESTING`` deep. Functions of anything but plain numbers are kept as
written (``sin(-t)`` stays so), because simplifying them makes sympy ask its
assumption system questions that can take very long. sympy is imported only
when an expression is parsed.
"""

from __future__ import annotations

import re

from revolve.errors import ExpressionError, indefinite

TYPE_CHECKING = False    # avoids importing typing at start-up
if TYPE_CHECKING:  # pragma: no cover
    from collections.abc import Sequence

    import sympy

__all__ = ["parse_expression", "parse_number", "exact_number", "FUNCTIONS", "CONSTANTS"]

MAX_DEPTH = 30          # nesting of parentheses and function calls
MAX_TOKENS = 200
MAX_LITERAL = 30        # characters in one number literal
MAX_DECIMAL_EXPONENT = 99   # 1e99 is allowed, 1e100 is not
MAX_EXPONENT = 64       # |n| in x^n
MAX_NESTING = 4         # functions and roots inside one another, as in sin(sqrt(x))
MAX_BITS = 1024         # size of any numerator or denominator (about 1e308)

FUNCTIONS = {"sqrt": 1, "sin": 1, "cos": 1, "tan": 1, "asin": 1, "acos": 1, "atan": 1,
             "sinh": 1, "cosh": 1, "tanh": 1, "exp": 1, "log": 1, "abs": 1, "atan2": 2}
CONSTANTS = ("pi", "e")
_GROWING = ("exp", "sinh", "cosh")   # their argument's constants must stay small
_GROWING_LIMIT = 709                  # e^709 is about 2^1023
_HINTS = {"ln": "log", "arcsin": "asin", "arccos": "acos", "arctan": "atan"}

_TOKEN = re.compile(r"""
    (?P<space>[ \t\r\n]+)
  | (?P<number>(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?)
  | (?P<name>[A-Za-z_][A-Za-z0-9_]*)
  | (?P<op>\*\*|[-+*/^(),])
""", re.VERBOSE)
_DECIMAL = re.compile(r"([+-]?)([0-9]*)(?:\.([0-9]*))?(?:[eE]([+-]?[0-9]+))?")


def _sympy():
    import sympy
    return sympy


def _rational(text: str):
    """Exact sympy Rational of decimal text such as ``-1.5e-3`` (no float on the way)."""
    sign, whole, fraction, exponent = _DECIMAL.fullmatch(text).groups()
    fraction = fraction or ""
    shift = int(exponent or 0) - len(fraction)
    numerator = int((whole + fraction) or "0") * (10 ** max(shift, 0))
    value = _sympy().Rational(numerator, 10 ** max(-shift, 0))
    return -value if sign == "-" else value


def _shown(word: str) -> str:
    """A token as quoted in a message, cut short if it is long."""
    return word if len(word) <= 20 else word[:17] + "..."


def _bits(expr) -> int:
    """Largest bit length of a numerator or denominator anywhere in ``expr``."""
    rationals = expr.atoms(_sympy().Rational)
    return max((max(abs(r.p).bit_length(), r.q.bit_length()) for r in rationals), default=0)


def _tokenize(text: str, max_length: int) -> list[tuple[str, str, int]]:
    if not isinstance(text, str):
        raise ExpressionError(f"an expression must be text, not {type(text).__name__}")
    if len(text) > max_length:
        raise ExpressionError(f"the expression is {len(text)} characters long; "
                              f"the limit is {max_length}")
    tokens, position = [], 0
    while position < len(text):
        match = _TOKEN.match(text, position)
        column = position + 1
        if match is None:
            char = text[position]
            shown = repr(char) if char.isascii() else f"'{char}' (U+{ord(char):04X})"
            raise ExpressionError(
                f"unexpected character {shown} at column {column}; only ASCII letters, "
                "digits, spaces, '.', ',', parentheses and + - * / ^ are allowed")
        kind, word = match.lastgroup, match.group()
        position = match.end()
        if kind == "space":
            continue
        if kind == "number":
            exponent = re.search(r"[eE]([+-]?[0-9]+)$", word)
            if len(word) > MAX_LITERAL or (exponent and
                                           abs(int(exponent.group(1))) > MAX_DECIMAL_EXPONENT):
                raise ExpressionError(
                    f"number '{word[:MAX_LITERAL]}' at column {column} is too long or too large; "
                    f"use at most {MAX_LITERAL} characters and exponents within "
                    f"±{MAX_DECIMAL_EXPONENT}")
        tokens.append((kind, word, column))
        if len(tokens) > MAX_TOKENS:
            raise ExpressionError(f"the expression has more than {MAX_TOKENS} tokens "
                                  f"(stopped at column {column})")
    if not tokens:
        raise ExpressionError("the expression is empty")
    return tokens


class _Parser:
    """Recursive descent over the token list; only parentheses recurse."""

    def __init__(self, tokens, variables: Sequence[str]):
        sp = _sympy()
        self.sp, self.tokens, self.index, self.depth = sp, tokens, 0, 0
        self.names = {name: sp.Symbol(name, real=True) for name in variables}
        self.names.update(pi=sp.pi, e=sp.E)
        self.functions = {"sqrt": sp.sqrt, "sin": sp.sin, "cos": sp.cos, "tan": sp.tan,
                          "asin": sp.asin, "acos": sp.acos, "atan": sp.atan, "sinh": sp.sinh,
                          "cosh": sp.cosh, "tanh": sp.tanh, "exp": sp.exp, "log": sp.log,
                          "abs": sp.Abs, "atan2": sp.atan2}

    def peek(self) -> tuple[str, str, int]:
        if self.index < len(self.tokens):
            return self.tokens[self.index]
        last = self.tokens[-1]
        return ("end", "", last[2] + len(last[1]))

    def take(self) -> tuple[str, str, int]:
        token = self.peek()
        self.index += 1
        return token

    def parse(self):
        value = self.expression()
        kind, word, column = self.peek()
        if kind != "end":
            raise ExpressionError(f"unexpected '{_shown(word)}' at column {column}")
        return value

    def expression(self):
        value = self.term()
        while self.peek()[1] in ("+", "-"):
            op = self.take()
            right = self.term()
            self.check_size(value, right, op)
            value = self.checked(value + right if op[1] == "+" else value - right, op)
        return value

    def term(self):
        value = self.factor()
        while True:
            kind, word, column = self.peek()
            if kind in ("number", "name") or word == "(":
                before = self.tokens[self.index - 1][1]
                left = "(...)" if before == ")" else before
                right = "(...)" if word == "(" else word
                raise ExpressionError(f"missing operator between '{_shown(before)}' and "
                                      f"'{_shown(word)}' at column {column}; write "
                                      f"{_shown(left)}*{_shown(right)} for a product")
            if word not in ("*", "/"):
                return value
            op = self.take()
            right = self.factor()
            self.check_size(value, right, op)
            if word == "/":
                if right == 0:
                    raise ExpressionError(f"division by zero at column {op[2]}")
            value = self.checked(value * right if word == "*" else value / right, op)

    def factor(self):
        negative = False
        while self.peek()[1] in ("+", "-"):
            negative ^= self.take()[1] == "-"
        value = self.power()
        return -value if negative else value

    def power(self):
        base = self.atom()
        if self.peek()[1] not in ("^", "**"):
            return base
        op = self.take()
        exponent = self.factor()      # right-associative, may carry a sign
        where = f"'{op[1]}' at column {op[2]}"
        if not exponent.is_Rational:
            hint = "; write exp(...) for a power of e" if base == self.sp.E else ""
            raise ExpressionError(f"the exponent of {where} is not a plain number; exponents "
                                  f"must be numbers such as 2, -1 or 1/2{hint}")
        if abs(exponent) > MAX_EXPONENT:
            raise ExpressionError(f"the exponent {exponent} of {where} is too large; "
                                  f"the limit is {MAX_EXPONENT}")
        if max(_bits(base), 1) * -(-abs(exponent.p) // exponent.q) > MAX_BITS:
            raise ExpressionError(f"the power at {where} gives a number beyond "
                                  f"{MAX_BITS} bits")
        if base == 0 and exponent < 0:
            raise ExpressionError(f"division by zero at column {op[2]}")
        return self.checked(self.sp.Pow(base, exponent), op)

    def atom(self):
        kind, word, column = self.take()
        if kind == "number":
            return _rational(word)
        if kind == "name" and word in self.functions:
            return self.call(word, column)
        if kind == "name":
            if word in self.names:
                return self.names[word]
            hint = _HINTS.get(word) or next(
                (name for name in (*self.names, *FUNCTIONS) if name.lower() == word.lower()), None)
            allowed = ", ".join((*self.names, *FUNCTIONS))
            raise ExpressionError(f"unknown name '{_shown(word)}' at column {column}"
                                  + (f" (did you mean '{hint}'?)" if hint else "")
                                  + f"; allowed names: {allowed}")
        if word == "(":
            return self.group(column)
        if kind == "end":
            before = self.tokens[-1]
            raise ExpressionError(f"the expression ends too early after '{before[1]}' "
                                  f"at column {before[2]}")
        raise ExpressionError(f"unexpected '{_shown(word)}' at column {column}")

    def group(self, column: int, arguments: bool = False):
        """Parse after '(' up to the matching ')'; a list when ``arguments``."""
        self.depth += 1
        if self.depth > MAX_DEPTH:
            raise ExpressionError(f"parentheses at column {column} are nested deeper "
                                  f"than {MAX_DEPTH} levels")
        values = []
        if not (arguments and self.peek()[1] == ")"):
            values.append(self.expression())
            while arguments and self.peek()[1] == ",":
                self.take()
                values.append(self.expression())
        kind, word, where = self.take()
        if word != ")":
            found = f"'{_shown(word)}'" if kind != "end" else "the end"
            raise ExpressionError(f"expected ')' for the '(' at column {column} "
                                  f"but found {found} at column {where}")
        self.depth -= 1
        return values if arguments else values[0]

    def call(self, name: str, column: int):
        kind, word, where = self.take()
        if word != "(":
            raise ExpressionError(f"function '{name}' at column {column} must be followed "
                                  f"by '(', as in {name}(x)")
        arguments = self.group(where, arguments=True)
        if len(arguments) != FUNCTIONS[name]:
            raise ExpressionError(f"function '{name}' at column {column} takes "
                                  f"{FUNCTIONS[name]} argument(s), got {len(arguments)}")
        if name in _GROWING and _constants(arguments[0])[0] > _GROWING_LIMIT:
            raise ExpressionError(f"the argument of '{name}' at column {column} has a number "
                                  f"beyond {_GROWING_LIMIT} in size; the result would be "
                                  f"beyond 2^{MAX_BITS}")
        evaluate = all(_simple(argument) for argument in arguments)
        value = self.functions[name](*arguments, evaluate=evaluate)
        return self.checked(value, ("name", name, column))

    def check_size(self, left, right, op) -> None:
        if _bits(left) + _bits(right) > MAX_BITS:
            raise ExpressionError(f"the result of '{op[1]}' at column {op[2]} has "
                                  f"numbers beyond {MAX_BITS} bits")

    def checked(self, value, op):
        """Refuse undefined, non-real or oversized results, naming the operator."""
        sp, where = self.sp, f"'{op[1]}' at column {op[2]}"
        if _bits(value) > MAX_BITS:
            raise ExpressionError(f"{where} gives a number beyond {MAX_BITS} bits")
        if value.has(sp.zoo, sp.nan, sp.oo, -sp.oo):
            raise ExpressionError(f"{where} gives an undefined value "
                                  "(a division by zero or a pole)")
        if _nesting(value) > MAX_NESTING:
            raise ExpressionError(f"{where} nests functions and roots more than "
                                  f"{MAX_NESTING} deep; simplify the expression")
        largest, real = _constants(value)
        if largest > 2 ** MAX_BITS:
            raise ExpressionError(f"{where} gives a number beyond 2^{MAX_BITS} in size")
        if not real:
            raise ExpressionError(f"{where} gives a number that is not real")
        return value


def _simple(value) -> bool:
    """Whether ``value`` is a product of rationals, pi, e and rational powers of rationals.

    sympy simplifies powers and functions of such numbers (``sqrt(8)``,
    ``sin(pi/6)``, ``acos(sqrt(2)/2)``) quickly; everything else is left as written.
    """
    factors = value.args if value.is_Mul else (value,)
    return all(f.is_Rational or f.is_NumberSymbol or
               (f.is_Pow and f.base.is_Rational and f.exp.is_Rational) for f in factors)


def _nesting(value) -> int:
    """How deeply functions and fractional powers are nested in ``value``."""
    inner = max((_nesting(argument) for argument in value.args), default=0)
    layered = value.is_Function or (value.is_Pow and not value.exp.is_Integer)
    return inner + 1 if layered else inner


def _constants(value) -> tuple[float, bool]:
    """Largest magnitude of the constant parts of ``value`` and whether all are real.

    The constant parts are the largest subexpressions without variables (in
    ``t*exp(3) + 2`` they are ``exp(3)`` and ``2``). They are evaluated to 15
    digits; a part that cannot be evaluated counts as infinitely large. Keeping
    every constant below 2^MAX_BITS keeps later numeric work bounded (``sin`` of
    a huge number needs pi to as many digits).
    """
    sp = _sympy()
    largest, real, stack = 0.0, True, [value]
    while stack:
        node = stack.pop()
        if node.is_Symbol or node.is_NumberSymbol:
            continue
        if not node.is_number:
            stack.extend(node.args)
            continue
        if node.has(sp.I):
            real = False
            continue
        try:
            re_part, im_part = (float(abs(part)) for part in node.evalf(15).as_real_imag())
        except (ArithmeticError, ValueError, TypeError):   # e.g. OverflowError in mpmath
            return float("inf"), real
        if re_part != re_part or im_part != im_part:       # nan: could not be evaluated
            return float("inf"), real
        largest = max(largest, re_part, im_part)
        real = real and im_part <= 1e-12 * re_part
    return largest, real


def parse_expression(text: str, variables: Sequence[str] = ("t",), *,
                     max_length: int = 200) -> "sympy.Expr":
    """Parse untrusted expression text into an exact sympy expression.

    Parameters
    ----------
    text : str
        The expression, e.g. ``"40 - x^2/90"``. Whitespace is ignored.
    variables : sequence of str
        Names allowed as variables; each becomes ``sympy.Symbol(name, real=True)``.
    max_length : int
        Longest text accepted, in characters.

    Returns
    -------
    sympy.Expr
        The expression; decimals are exact rationals.

    Raises
    ------
    revolve.errors.ExpressionError
        For anything outside the grammar or beyond a limit; the message names the
        offending token and its column.

    Examples
    --------
    >>> parse_expression("40 - x^2/90", ["x"])
    40 - x**2/90
    >>> parse_expression("25*cos(t) + 0.25")
    25*cos(t) + 1/4
    >>> parse_expression("-2^2"), parse_expression("2**3^2"), parse_expression("pi/2")
    (-4, 512, pi/2)
    >>> parse_expression("2x", ["x"])
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: missing operator between '2' and 'x' at column 2; write 2*x for a product
    >>> parse_expression("   ")
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: the expression is empty
    >>> parse_expression("1/(t - t)")
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: division by zero at column 2
    """
    if isinstance(variables, str):
        variables = (variables,)
    for name in variables:
        if not (isinstance(name, str) and re.fullmatch(r"[A-Za-z_][A-Za-z0-9_]*", name)):
            raise ExpressionError(f"{name!r} cannot be a variable name; use letters, "
                                  "digits and '_' starting with a letter")
        if name in FUNCTIONS or name in CONSTANTS:
            raise ExpressionError(f"'{name}' cannot be a variable name; it is a built-in name")
    return _Parser(_tokenize(text, max_length), tuple(variables)).parse()


def parse_number(text: str, *, max_length: int = 200) -> "sympy.Expr":
    """Parse untrusted text that must give a finite real number, kept exact.

    Parameters
    ----------
    text : str
        An expression without variables, e.g. ``"sqrt(2)*10"``.
    max_length : int
        Longest text accepted, in characters.

    Returns
    -------
    sympy.Expr
        The exact value, e.g. ``10*sqrt(2)``.

    Raises
    ------
    revolve.errors.ExpressionError
        If the text is refused by :func:`parse_expression` or is not a finite real.

    Examples
    --------
    >>> parse_number("sqrt(2)*10")
    10*sqrt(2)
    >>> parse_number("0.1") + parse_number("0.2") == parse_number("0.3")
    True
    >>> parse_number("-0")
    0
    >>> parse_number("acos(2)")
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: 'acos' at column 1 gives a number that is not real
    >>> parse_number("2*t")   # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: unknown name 't' at column 3; allowed names: pi, e, ...
    """
    # Every operation was checked for a finite real result while parsing.
    return parse_expression(text, (), max_length=max_length)


def exact_number(value) -> "sympy.Expr":
    """Convert a number from a file or from code to an exact sympy number.

    ``int`` gives an Integer, ``decimal.Decimal`` and ``fractions.Fraction`` their
    exact value, ``float`` the Rational of its shortest text (``repr``), so 0.1
    gives 1/10; ``str`` goes through :func:`parse_number`. A sympy number is
    returned as it is if finite and real. ``bool`` and everything else is refused.

    Examples
    --------
    >>> exact_number(0.1), exact_number(3), exact_number("pi/4")
    (1/10, 3, pi/4)
    >>> from decimal import Decimal
    >>> exact_number(Decimal("2.50")), exact_number(-0.0), exact_number(1e-05)
    (5/2, 0, 1/100000)
    >>> exact_number(True)
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: True is not a number; write 1 or 0
    >>> exact_number(float("nan"))
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: nan is not a finite number
    """
    import math
    import numbers
    from decimal import Decimal
    from fractions import Fraction
    if isinstance(value, bool):
        raise ExpressionError(f"{value} is not a number; write 1 or 0")
    if isinstance(value, str):
        return parse_number(value)
    sp = _sympy()
    if isinstance(value, numbers.Integral):
        value = int(value)
        if value.bit_length() > MAX_BITS:
            raise ExpressionError(f"the integer is beyond {MAX_BITS} bits")
        return sp.Integer(value)
    if isinstance(value, float):
        if not math.isfinite(value):
            raise ExpressionError(f"{value} is not a finite number")
        return _rational(float.__repr__(value))
    if isinstance(value, Decimal):
        if not value.is_finite():
            raise ExpressionError(f"{value} is not a finite number")
        if abs(value.adjusted()) > 400:
            raise ExpressionError(f"{value} is too large or too small to use exactly")
        value = Fraction(value)
    if isinstance(value, Fraction):
        number = sp.Rational(value.numerator, value.denominator)
        if _bits(number) > MAX_BITS:
            raise ExpressionError(f"the fraction is beyond {MAX_BITS} bits")
        return number
    if isinstance(value, sp.Expr) and value.is_number:
        largest, real = _constants(value)
        if largest > 2 ** MAX_BITS or not real or value.has(sp.zoo, sp.nan):
            raise ExpressionError(f"{_shown(str(value))} is not a finite real number")
        return value
    raise ExpressionError(f"{indefinite(type(value).__name__)} cannot be used as a number")
