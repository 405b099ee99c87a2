"""Safe parsing of untrusted expression text into the package's own expression trees.

Profile files and drawings carry expressions such as ``40 - x^2/90``,
``25*cos(t)`` or ``sqrt(3)*10``. They are parsed here by a hand-written
tokenizer and recursive-descent parser that accepts only a whitelist and builds
a small immutable tree (:class:`Expr`); the text never reaches ``eval``,
``exec``, ``sympify`` or ``parse_expr``. Decimals become exact fractions,
never floats.

Grammar (``^`` and ``**`` are powers, right-associative, binding tighter than
unary minus, so ``-2^2`` is -4 and ``2^3^2`` is 512)::

    expression := term (("+" | "-") term)*
    term       := factor (("*" | "/") factor)*
    factor     := ("+" | "-")* power
    power      := atom (("^" | "**") factor)?
    atom       := number | variable | "pi" | "e" | function "(" arguments ")"
                | "(" expression ")"

A tree holds exact numbers (:class:`fractions.Fraction`) where they were written
exactly, the constants ``pi`` and ``e``, sums, differences, products,
quotients, negations, powers with a rational exponent, the whitelisted
functions and the variables. Trees compare and hash by structure, compile to
numpy functions (:meth:`Expr.numpy_function`), differentiate
(:meth:`Expr.derivative`), print back in this grammar (:meth:`Expr.text`) and,
for exact results only, become sympy expressions (:meth:`Expr.to_sympy`, which
imports sympy then and only then). Parsing and numeric work import neither
sympy nor mpmath; :func:`constant_float` uses mpmath (30 digits, rounded once)
for a constant that is not a plain fraction.

Hostile input is refused before any real work (see the ``MAX_*`` limits):
exponents must fold to a rational number no larger than ``MAX_EXPONENT``, no
numerator or denominator may exceed ``MAX_BITS`` bits, no constant part may
exceed 2^MAX_BITS in size, and functions and roots may nest only
``MAX_NESTING`` deep. Constant parts are checked in floating point as they are
built (undefined, not real, too large).
"""

from __future__ import annotations

import cmath
import math
import re
from fractions import Fraction

from revolve.errors import ExpressionError, indefinite

TYPE_CHECKING = False    # avoids importing typing at start-up
if TYPE_CHECKING:  # pragma: no cover
    from collections.abc import Sequence

    import sympy

__all__ = ["Expr", "parse_expression", "parse_number", "exact_number", "as_expression", "as_sympy",
           "numpy_functions", "constant_float", "FUNCTIONS", "CONSTANTS"]

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
#: Functions a tree may hold: the parser's (``sqrt`` becomes a power) and ``sign``, the
#: derivative of ``abs``.
_TREE_FUNCTIONS = ("sin", "cos", "tan", "asin", "acos", "atan", "sinh", "cosh", "tanh", "exp",
                   "log", "abs", "atan2", "sign")
_NUMPY_NAMES = {"asin": "arcsin", "acos": "arccos", "atan": "arctan", "atan2": "arctan2"}
_SYMPY_NAMES = {"abs": "Abs"}
_HALF = Fraction(1, 2)

# Patterns as text: ``re`` compiles each on its first use and keeps it (a run that parses no
# expression text pays nothing for them).
_TOKEN = r"""(?x)
    (?P<space>[ \t\r\n]+)
  | (?P<number>(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?)
  | (?P<name>[A-Za-z_][A-Za-z0-9_]*)
  | (?P<op>\*\*|[-+*/^(),])
"""
_DECIMAL = r"([+-]?)([0-9]*)(?:\.([0-9]*))?(?:[eE]([+-]?[0-9]+))?"


def _sympy():
    import sympy
    return sympy


def _fraction(text: str) -> Fraction:
    """Exact Fraction of decimal text such as ``-1.5e-3`` (no float on the way)."""
    sign, whole, fraction, exponent = re.fullmatch(_DECIMAL, text).groups()
    fraction = fraction or ""
    shift = int(exponent or 0) - len(fraction)
    numerator = int((whole + fraction) or "0") * (10 ** max(shift, 0))
    value = Fraction(numerator, 10 ** max(-shift, 0))
    return -value if sign == "-" else value


def _rational(text: str):
    """Exact sympy Rational of decimal text (for :func:`exact_number`)."""
    value = _fraction(text)
    return _sympy().Rational(value.numerator, value.denominator)


def _shown(word: str) -> str:
    """A token as quoted in a message, cut short if it is long."""
    return word if len(word) <= 20 else word[:17] + "..."


def _fraction_bits(v: Fraction) -> int:
    return max(abs(v.numerator).bit_length(), v.denominator.bit_length())


# -- the tree ---------------------------------------------------------------------------

_NAN = complex(math.nan, 0.0)
_INF = complex(math.inf, 0.0)


class Expr:
    """A node of an expression tree: immutable, compared and hashed by structure.

    Every node knows, from its children, whether it holds a variable, how deeply
    functions and roots nest in it (``nesting``), the largest bit size of its
    exact numbers (``bits``), the largest magnitude of its constant parts
    (``largest``) and, when it holds no variable, its value in floating point
    (``approx``, a complex number: non-real, infinite or NaN values are how
    the parser finds bad input).

    >>> a = parse_expression("t^2 + 1")
    >>> a == parse_expression("t ^ 2 + 1"), hash(a) == hash(parse_expression("t**2+1"))
    (True, True)
    >>> a.text(), a.derivative().text()
    ('t^2 + 1', '2*t')
    """

    __slots__ = ("_hash", "_sympy_value", "variables", "nesting", "bits", "largest", "approx")
    _fields: tuple = ()

    def _init(self, children) -> None:
        object.__setattr__(self, "_hash", None)
        object.__setattr__(self, "_sympy_value", None)
        variables = frozenset().union(*(c.variables for c in children)) if children else frozenset()
        object.__setattr__(self, "variables", variables)
        object.__setattr__(self, "nesting", max((c.nesting for c in children), default=0))
        object.__setattr__(self, "bits", max((c.bits for c in children), default=0))
        if variables:
            largest = max((c.largest for c in children), default=0.0)
            object.__setattr__(self, "largest", largest)
            object.__setattr__(self, "approx", None)
        else:
            try:
                value = self._approx()
            except (ValueError, ZeroDivisionError):
                value = _NAN
            except OverflowError:
                value = _INF
            object.__setattr__(self, "approx", value)
            size = abs(value) if value == value else math.inf
            object.__setattr__(self, "largest", size)

    def _approx(self) -> complex:  # pragma: no cover - every node overrides it
        raise NotImplementedError

    def __setattr__(self, name, value):
        raise AttributeError("expression trees are immutable")

    def _key(self) -> tuple:
        return tuple(getattr(self, f) for f in self._fields)

    def __eq__(self, other) -> bool:
        if self is other:
            return True
        if type(self) is not type(other):
            return NotImplemented if not isinstance(other, Expr) else False
        return self._key() == other._key()

    def __ne__(self, other) -> bool:
        equal = self.__eq__(other)
        return equal if equal is NotImplemented else not equal

    def __hash__(self) -> int:
        h = self._hash
        if h is None:
            h = hash((type(self).__name__, self._key()))
            object.__setattr__(self, "_hash", h)
        return h

    def __reduce__(self):
        return (type(self), self._key())

    def __repr__(self) -> str:
        return f"Expr({self.text()!r})"

    def __str__(self) -> str:
        return self.text()

    # -- arithmetic for code that builds trees (numbers become exact numbers) ---------

    def __add__(self, other):
        return add(self, as_expression(other))

    def __radd__(self, other):
        return add(as_expression(other), self)

    def __sub__(self, other):
        return sub(self, as_expression(other))

    def __rsub__(self, other):
        return sub(as_expression(other), self)

    def __mul__(self, other):
        return mul(self, as_expression(other))

    def __rmul__(self, other):
        return mul(as_expression(other), self)

    def __truediv__(self, other):
        return div(self, as_expression(other))

    def __rtruediv__(self, other):
        return div(as_expression(other), self)

    def __neg__(self):
        return neg(self)

    def __pow__(self, exponent):
        return power(self, Fraction(exponent))

    # -- reading -------------------------------------------------------------------

    @property
    def is_constant(self) -> bool:
        """Whether the tree holds no variable."""
        return not self.variables

    def exact_value(self):
        """The exact Fraction of a plain number node, else None.

        >>> parse_number("0.1 + 0.2").exact_value(), parse_number("pi").exact_value()
        (Fraction(3, 10), None)
        """
        return None

    def __float__(self) -> float:
        """The float of a constant tree (see :func:`constant_float` for the rounded-once value).

        >>> float(parse_number("sqrt(2)^2 + 1/4"))
        2.25
        """
        if self.variables:
            raise TypeError(f"{self.text()} has a variable; it is not a number")
        exact = self.exact_value()
        if exact is not None:
            return float(exact)
        value = self.approx
        if value != value or abs(value.imag) > 1e-12 * abs(value.real):
            raise ValueError(f"{self.text()} is not a real number")
        return value.real

    def children(self) -> tuple:
        return ()

    # -- precedence for printing: 1 sums, 2 products, 3 negation, 4 powers, 5 atoms
    level = 5

    def text(self) -> str:
        """The tree in the parser's grammar (``^`` for powers); parsing it gives the same value.

        >>> parse_expression("-(t + 1)*2 - 3/t^-2 + sqrt(t)").text()
        '-(t + 1)*2 - 3/t^-2 + sqrt(t)'
        """
        raise NotImplementedError  # pragma: no cover

    def _wrapped(self, level: int) -> str:
        return f"({self.text()})" if self.level < level else self.text()

    # -- rebuilding ------------------------------------------------------------------

    def substitute(self, values: dict) -> "Expr":
        """The tree with variables replaced by trees (``values`` maps a name to a tree).

        Numbers fold on the way, so a substituted constant becomes a number where it can.

        >>> parse_expression("25 - x^2/180", ["x"]).substitute({"x": Num(0)})
        Expr('25')
        >>> parse_expression("x + 1", ["x"]).substitute({"x": Var("t")}).text()
        't + 1'
        """
        if not self.variables & set(values):
            return self
        return self._rebuild([c.substitute(values) for c in self.children()])

    def _rebuild(self, children) -> "Expr":  # pragma: no cover - leaves have no children
        return self

    def derivative(self, variable: str = "t") -> "Expr":
        """The derivative in ``variable`` by the usual rules, with 0 and 1 folded away.

        >>> parse_expression("sin(t)^2").derivative().text()
        '2*sin(t)*cos(t)'
        >>> parse_expression("abs(t - 1)").derivative().text()
        'sign(t - 1)'
        >>> parse_expression("pi*x", ["x"]).derivative("t")
        Expr('0')
        """
        if variable not in self.variables:
            return ZERO
        return self._derivative(variable)

    def _derivative(self, variable: str) -> "Expr":  # pragma: no cover
        raise NotImplementedError

    # -- numbers for numpy ------------------------------------------------------------

    def numpy_function(self, variable: str = "t"):
        """A numpy function of one array (the ``variable``) computing this tree.

        Each distinct node becomes one numpy operation (the same calls a code
        printer would write), so the values agree with sympy's ``lambdify`` to
        rounding; see :func:`numpy_functions`. The result is an array of the
        argument's shape, or a float for a constant tree (broadcast by the caller).

        >>> import numpy as np
        >>> f = parse_expression("2*sin(t)/(1 + t^2) - sqrt(t)").numpy_function()
        >>> bool(abs(f(np.array([1.0]))[0] - (math.sin(1.0) - 1.0)) < 1e-15)
        True
        >>> parse_expression("x", ["x"]).numpy_function("t")
        Traceback (most recent call last):
        ...
        revolve.errors.ExpressionError: the expression uses 'x'; only 't' is allowed here
        """
        others = sorted(self.variables - {variable})
        if others:
            raise ExpressionError(f"the expression uses '{others[0]}'; only '{variable}' is "
                                  "allowed here")
        run = numpy_functions((self,), variable)
        return lambda u: run(u)[0]


    def to_sympy(self):
        """The same expression built with sympy (imported here; for exact results only).

        Built the way the parser used to build it, so sympy's own simplifications
        (``sin(pi/6)`` is 1/2, ``sqrt(8)`` is 2 sqrt(2)) apply; functions of anything
        but plain numbers are kept as written. Variables are real symbols.

        >>> parse_expression("25*cos(t) + 0.25").to_sympy()
        25*cos(t) + 1/4
        >>> parse_expression("acos(sqrt(2)/2) + sqrt(t)^2").to_sympy()
        t + pi/4
        """
        value = self._sympy_value
        if value is None:
            value = self._to_sympy(_sympy())
            object.__setattr__(self, "_sympy_value", value)
        return value

    def _to_sympy(self, sp):  # pragma: no cover
        raise NotImplementedError


class Num(Expr):
    """A number: exact (an int or :class:`~fractions.Fraction`, kept as a Fraction) or a float.

    >>> Num(Fraction(1, 4)).text(), Num(0.5).text(), Num(2) == Num(2.0)
    ('1/4', '0.5', False)
    """

    __slots__ = ("value",)
    _fields = ("value",)

    def __init__(self, value):
        if isinstance(value, bool):
            raise TypeError("a flag is not a number")
        if isinstance(value, int):
            value = Fraction(value)
        elif not isinstance(value, (Fraction, float)):
            raise TypeError(f"{indefinite(type(value).__name__)} is not a number")
        object.__setattr__(self, "value", value)
        self._init(())
        if isinstance(value, Fraction):
            object.__setattr__(self, "bits", _fraction_bits(value))

    def _key(self) -> tuple:
        return (isinstance(self.value, float), self.value)

    def __reduce__(self):
        return (Num, (self.value,))

    def _approx(self) -> complex:
        return complex(float(self.value))

    def exact_value(self):
        return self.value if isinstance(self.value, Fraction) else None

    @property
    def level(self) -> int:
        v = self.value
        if isinstance(v, Fraction) and v.denominator != 1:
            return 2              # "1/2" and "-1/2" read as quotients
        if v < 0:
            return 3
        return 5

    def text(self) -> str:
        v = self.value
        if isinstance(v, float):
            return repr(v)
        if v.denominator == 1:
            return str(v.numerator)
        return f"{v.numerator}/{v.denominator}"

    def _derivative(self, variable):  # pragma: no cover - constants never get here
        return ZERO

    def _to_sympy(self, sp):
        v = self.value
        if isinstance(v, float):
            return sp.Float(v)
        return sp.Rational(v.numerator, v.denominator)


class Const(Expr):
    """``pi`` or ``e``."""

    __slots__ = ("name",)
    _fields = ("name",)

    def __init__(self, name: str):
        if name not in CONSTANTS:
            raise ValueError(f"unknown constant {name!r}")
        object.__setattr__(self, "name", name)
        self._init(())

    def _approx(self) -> complex:
        return complex(math.pi if self.name == "pi" else math.e)

    def text(self) -> str:
        return self.name

    def _to_sympy(self, sp):
        return sp.pi if self.name == "pi" else sp.E


class Var(Expr):
    """A variable, a real number named ``name``."""

    __slots__ = ("name",)
    _fields = ("name",)

    def __init__(self, name: str):
        object.__setattr__(self, "name", name)
        self._init(())
        object.__setattr__(self, "variables", frozenset((name,)))
        object.__setattr__(self, "approx", None)
        object.__setattr__(self, "largest", 0.0)

    def _approx(self) -> complex:
        return 0j                # replaced: a variable has no value

    def text(self) -> str:
        return self.name

    def substitute(self, values: dict) -> Expr:
        return values.get(self.name, self)

    def _derivative(self, variable):
        return ONE


    def _to_sympy(self, sp):
        return sp.Symbol(self.name, real=True)


class _Binary(Expr):
    __slots__ = ("left", "right")
    _fields = ("left", "right")
    symbol = ""

    def __init__(self, left: Expr, right: Expr):
        object.__setattr__(self, "left", left)
        object.__setattr__(self, "right", right)
        self._init((left, right))

    def children(self) -> tuple:
        return (self.left, self.right)


class Add(_Binary):
    __slots__ = ()
    level = 1

    def _approx(self):
        return self.left.approx + self.right.approx

    def text(self) -> str:
        return f"{self.left._wrapped(1)} + {self.right._wrapped(1)}"

    def _rebuild(self, children):
        return add(*children)

    def _derivative(self, v):
        return add(self.left.derivative(v), self.right.derivative(v))


    def _to_sympy(self, sp):
        return self.left.to_sympy() + self.right.to_sympy()


class Sub(_Binary):
    __slots__ = ()
    level = 1

    def _approx(self):
        return self.left.approx - self.right.approx

    def text(self) -> str:
        return f"{self.left._wrapped(1)} - {self.right._wrapped(2)}"

    def _rebuild(self, children):
        return sub(*children)

    def _derivative(self, v):
        return sub(self.left.derivative(v), self.right.derivative(v))


    def _to_sympy(self, sp):
        return self.left.to_sympy() - self.right.to_sympy()


class Mul(_Binary):
    __slots__ = ()
    level = 2

    def _approx(self):
        return self.left.approx * self.right.approx

    def text(self) -> str:
        return f"{self.left._wrapped(2)}*{self.right._wrapped(3)}"

    def _rebuild(self, children):
        return mul(*children)

    def _derivative(self, v):
        a, b = self.left, self.right
        return add(mul(a.derivative(v), b), mul(a, b.derivative(v)))


    def _to_sympy(self, sp):
        return self.left.to_sympy() * self.right.to_sympy()


class Div(_Binary):
    __slots__ = ()
    level = 2

    def _approx(self):
        return self.left.approx / self.right.approx

    def text(self) -> str:
        return f"{self.left._wrapped(2)}/{self.right._wrapped(3)}"

    def _rebuild(self, children):
        return div(*children)

    def _derivative(self, v):
        a, b = self.left, self.right
        da, db = a.derivative(v), b.derivative(v)
        if db == ZERO:
            return div(da, b)
        return div(sub(mul(da, b), mul(a, db)), power(b, Fraction(2)))


    def _to_sympy(self, sp):
        return self.left.to_sympy() / self.right.to_sympy()


class Neg(Expr):
    __slots__ = ("arg",)
    _fields = ("arg",)
    level = 3

    def __init__(self, arg: Expr):
        object.__setattr__(self, "arg", arg)
        self._init((arg,))

    def children(self):
        return (self.arg,)

    def _approx(self):
        return -self.arg.approx

    def text(self) -> str:
        return "-" + self.arg._wrapped(4)

    def _rebuild(self, children):
        return neg(children[0])

    def _derivative(self, v):
        return neg(self.arg.derivative(v))


    def _to_sympy(self, sp):
        return -self.arg.to_sympy()


class Pow(Expr):
    """``base ^ exponent`` with an exact rational exponent (``sqrt`` is the power 1/2)."""

    __slots__ = ("base", "exponent")
    _fields = ("base", "exponent")
    level = 4

    def __init__(self, base: Expr, exponent: Fraction):
        object.__setattr__(self, "base", base)
        object.__setattr__(self, "exponent", Fraction(exponent))
        self._init((base,))
        if self.exponent.denominator != 1:
            object.__setattr__(self, "nesting", base.nesting + 1)

    def children(self):
        return (self.base,)

    def _approx(self):
        b, p = self.base.approx, self.exponent
        if p.denominator == 1:
            if b == 0 and p < 0:
                raise ZeroDivisionError
            return b ** int(p)
        if b.imag == 0 and b.real >= 0:
            return complex(b.real ** float(p))
        return b ** float(p)            # the principal value: not real

    def text(self) -> str:
        p = self.exponent
        if p == _HALF:
            return f"sqrt({self.base.text()})"
        if p.denominator == 1:
            shown = str(p.numerator)
        else:
            shown = f"({p.numerator}/{p.denominator})"
        return f"{self.base._wrapped(5)}^{shown}"

    def _rebuild(self, children):
        return power(children[0], self.exponent)

    def _derivative(self, v):
        p = self.exponent
        inner = self.base.derivative(v)
        return mul(mul(Num(p), power(self.base, p - 1)), inner)


    def _to_sympy(self, sp):
        p = self.exponent
        return sp.Pow(self.base.to_sympy(), sp.Rational(p.numerator, p.denominator))


class Call(Expr):
    """A whitelisted function of one argument (two for ``atan2``)."""

    __slots__ = ("name", "args")
    _fields = ("name", "args")

    def __init__(self, name: str, args: tuple):
        if name not in _TREE_FUNCTIONS:
            raise ValueError(f"unknown function {name!r}")
        object.__setattr__(self, "name", name)
        object.__setattr__(self, "args", tuple(args))
        self._init(self.args)
        object.__setattr__(self, "nesting", max(a.nesting for a in self.args) + 1)

    def children(self):
        return self.args

    def _approx(self):
        name, args = self.name, [a.approx for a in self.args]
        if name == "atan2":
            (y, x) = args
            if y.imag or x.imag:
                return _NAN if y != y or x != x else complex(0.0, 1.0)
            if y == 0 and x == 0:
                raise ValueError("atan2(0, 0)")
            return complex(math.atan2(y.real, x.real))
        (a,) = args
        if name == "abs":
            return complex(abs(a))
        if name == "sign":
            return complex((a.real > 0) - (a.real < 0))
        if name == "tan" and abs(cmath.cos(a)) <= 4 * 2.0 ** -52 * max(1.0, abs(a)):
            raise ValueError("a pole of tan")
        if name == "log" and a == 0:
            raise ValueError("log(0)")
        if name == "sqrt":   # pragma: no cover - a power in the tree
            return cmath.sqrt(a)
        return getattr(cmath, name)(a)

    def text(self) -> str:
        return f"{self.name}({', '.join(a.text() for a in self.args)})"

    def _rebuild(self, children):
        return call(self.name, tuple(children))

    def _derivative(self, v):
        name, args = self.name, self.args
        if name == "atan2":
            y, x = args
            dy, dx = y.derivative(v), x.derivative(v)
            return div(sub(mul(x, dy), mul(y, dx)),
                       add(power(x, Fraction(2)), power(y, Fraction(2))))
        (a,) = args
        one = ONE
        outer = {
            "sin": lambda: call("cos", (a,)),
            "cos": lambda: neg(call("sin", (a,))),
            "tan": lambda: add(one, power(call("tan", (a,)), Fraction(2))),
            "asin": lambda: power(sub(one, power(a, Fraction(2))), -_HALF),
            "acos": lambda: neg(power(sub(one, power(a, Fraction(2))), -_HALF)),
            "atan": lambda: div(one, add(one, power(a, Fraction(2)))),
            "sinh": lambda: call("cosh", (a,)),
            "cosh": lambda: call("sinh", (a,)),
            "tanh": lambda: sub(one, power(call("tanh", (a,)), Fraction(2))),
            "exp": lambda: self,
            "log": lambda: div(one, a),
            "abs": lambda: call("sign", (a,)),
            "sign": lambda: ZERO,
        }[name]()
        return mul(outer, a.derivative(v))


    def _to_sympy(self, sp):
        args = [a.to_sympy() for a in self.args]
        function = getattr(sp, _SYMPY_NAMES.get(self.name, self.name))
        if self.name == "sign":
            return function(*args)
        return function(*args, evaluate=all(_simple(a) for a in args))


ZERO = Num(0)
ONE = Num(1)


def numpy_functions(exprs, variable: str = "t"):
    """One numpy function computing several trees of one variable at once: the compiler.

    Every distinct subtree (trees compare by structure) is computed once per call,
    so a curve's coordinates and derivatives, which share ``sin(t)``, ``cos(t)``
    and the like, cost one numpy operation per distinct node. Constant subtrees
    are computed once, when compiling. Returns ``run(u) -> tuple`` of the
    values in the order of ``exprs`` (floats for constant trees).

    >>> import numpy as np
    >>> x, y = parse_expression("2*cos(t)"), parse_expression("sin(t)*cos(t)")
    >>> run = numpy_functions((x, y, x.derivative()))
    >>> [round(float(v[0]), 12) for v in run(np.array([0.5]))] == [round(2 * math.cos(0.5), 12),
    ...     round(math.sin(0.5) * math.cos(0.5), 12), round(-2 * math.sin(0.5), 12)]
    True
    >>> numpy_functions((parse_expression("x", ["x"]),))
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: the expression uses 'x'; only 't' is allowed here
    """
    import numpy as np

    for e in exprs:
        others = sorted(e.variables - {variable})
        if others:
            raise ExpressionError(f"the expression uses '{others[0]}'; only '{variable}' is "
                                  "allowed here")
    slots: dict = {}
    steps: list = []          # one function of the value list per distinct varying node
    constants: list = []      # (slot, value) for constant nodes

    def slot_of(node) -> int:
        found = slots.get(node)
        if found is not None:
            return found
        if not node.variables:
            index = len(steps)
            steps.append(None)
            constants.append((index, float(node)))
        elif isinstance(node, Var):
            index = len(steps)
            steps.append(None)
        else:
            children = [slot_of(c) for c in node.children()]
            index = len(steps)
            steps.append(_step(node, np, children))
        slots[node] = index
        return index

    outputs = [slot_of(e) for e in exprs]
    variable_slot = slots.get(Var(variable))
    program = [(i, f) for i, f in enumerate(steps) if f is not None]
    size = len(steps)

    def run(u):
        v = [None] * size
        for i, value in constants:
            v[i] = value
        if variable_slot is not None:
            v[variable_slot] = u
        for i, f in program:
            v[i] = f(v)
        return tuple(v[k] for k in outputs)

    return run


def _step(node, np, slots):
    """The numpy operation of one varying node, reading its children's slots."""
    if isinstance(node, (Add, Sub, Mul, Div)):
        a, b = slots
        if isinstance(node, Add):
            return lambda v: v[a] + v[b]
        if isinstance(node, Sub):
            return lambda v: v[a] - v[b]
        if isinstance(node, Mul):
            return lambda v: v[a] * v[b]
        return lambda v: v[a] / v[b]
    if isinstance(node, Neg):
        (a,) = slots
        return lambda v: -v[a]
    if isinstance(node, Pow):
        (a,), p = slots, node.exponent
        if p == _HALF:
            return lambda v: np.sqrt(v[a])
        if p == -_HALF:
            return lambda v: 1.0 / np.sqrt(v[a])
        if p == -1:
            return lambda v: 1.0 / v[a]
        if p.denominator == 1:
            k = int(p)
            return lambda v: v[a] ** k
        q = float(p)
        return lambda v: np.power(v[a], q)
    if isinstance(node, Call):
        f = getattr(np, _NUMPY_NAMES.get(node.name, node.name))
        if len(slots) == 1:
            (a,) = slots
            return lambda v: f(v[a])
        a, b = slots
        return lambda v: f(v[a], v[b])
    raise TypeError(f"cannot compile {node!r}")  # pragma: no cover


def _exact(e: Expr):
    return e.exact_value() if isinstance(e, Num) else None


def _number_of(value: Fraction) -> Expr:
    return Num(value)


def add(a: Expr, b: Expr) -> Expr:
    """``a + b``, folding exact numbers and zeros.

    >>> add(Num(1), Num(Fraction(1, 2))), add(Var("t"), ZERO)
    (Expr('3/2'), Expr('t'))
    """
    x, y = _exact(a), _exact(b)
    if x is not None and y is not None:
        return _number_of(x + y)
    if x == 0:
        return b
    if y == 0:
        return a
    if isinstance(b, Neg):
        return sub(a, b.arg)
    if y is not None and y < 0:
        return Sub(a, Num(-y))
    if isinstance(b, Mul) and (_exact(b.left) or 0) < 0:
        return Sub(a, mul(Num(-_exact(b.left)), b.right))
    return Add(a, b)


def sub(a: Expr, b: Expr) -> Expr:
    """``a - b``, folding exact numbers, zeros and ``a - a``.

    >>> sub(Var("t"), Var("t")), sub(ZERO, Var("t"))
    (Expr('0'), Expr('-t'))
    """
    x, y = _exact(a), _exact(b)
    if x is not None and y is not None:
        return _number_of(x - y)
    if y == 0:
        return a
    if x == 0:
        return neg(b)
    if a == b:
        return ZERO
    if isinstance(b, Neg):
        return add(a, b.arg)
    return Sub(a, b)


def neg(a: Expr) -> Expr:
    """``-a``, folding numbers and double negation."""
    x = _exact(a)
    if x is not None:
        return _number_of(-x)
    if isinstance(a, Num):
        return Num(-a.value)
    if isinstance(a, Neg):
        return a.arg
    return Neg(a)


def mul(a: Expr, b: Expr) -> Expr:
    """``a * b``, folding exact numbers, zeros, ones and signs.

    >>> mul(Num(2), Num(3)), mul(ZERO, Var("t")), mul(Num(-1), Var("t"))
    (Expr('6'), Expr('0'), Expr('-t'))
    """
    x, y = _exact(a), _exact(b)
    if x is not None and y is not None:
        return _number_of(x * y)
    if x == 0 or y == 0:
        return ZERO
    if x == 1:
        return b
    if y == 1:
        return a
    if x == -1:
        return neg(b)
    if y == -1:
        return neg(a)
    if isinstance(a, Neg) and isinstance(b, Neg):
        return mul(a.arg, b.arg)
    return Mul(a, b)


def div(a: Expr, b: Expr) -> Expr:
    """``a / b``, folding exact numbers and ones (the caller checks for a zero divisor)."""
    x, y = _exact(a), _exact(b)
    if x is not None and y is not None and y != 0:
        return _number_of(x / y)
    if x == 0 and y != 0:
        return ZERO
    if y == 1:
        return a
    if y == -1:
        return neg(a)
    if a == b and y is None:
        return ONE
    return Div(a, b)


def _rational_root(v: Fraction, q: int):
    """The exact q-th root of a non-negative fraction, or None (also for a large q).

    >>> _rational_root(Fraction(8, 27), 3), _rational_root(Fraction(2), 2), _rational_root(Fraction(1), 10**99)
    (Fraction(2, 3), None, None)
    """
    if v < 0 or q > MAX_EXPONENT:
        return None
    roots = []
    for part in (v.numerator, v.denominator):
        r = round(part ** (1.0 / q)) if part.bit_length() < 1000 else None
        if r is None:
            return None
        for c in (r - 1, r, r + 1):
            if c >= 0 and c ** q == part:
                roots.append(c)
                break
        else:
            return None
    return Fraction(roots[0], roots[1])


def power(base: Expr, exponent) -> Expr:
    """``base ^ exponent`` for a rational exponent, folding what is exact.

    ``(a^p)^q`` becomes ``a^(p q)`` when ``q`` is an integer or ``-1 < p <= 1``
    (the rule sympy follows for real ``a``), so ``sqrt(t)^2`` is ``t``.

    >>> power(Num(4), _HALF), power(power(Var("t"), _HALF), Fraction(2))
    (Expr('2'), Expr('t'))
    """
    p = Fraction(exponent)
    if p == 0:
        return ONE
    if p == 1:
        return base
    x = _exact(base)
    if x is not None:
        if p.denominator == 1:
            if x == 0 and p < 0:
                return Pow(base, p)       # refused by the parser, never folded
            return _number_of(x ** int(p))
        root = _rational_root(x, p.denominator)
        if root is not None:
            return _number_of(root ** p.numerator) if root or p > 0 else Pow(base, p)
        return Pow(base, p)
    if isinstance(base, Pow) and (p.denominator == 1 or -1 < base.exponent <= 1):
        return power(base.base, base.exponent * p)
    return Pow(base, p)


def call(name: str, args: tuple) -> Expr:
    """A function of the tree: ``name(*args)`` (``sqrt`` becomes the power 1/2)."""
    if name == "sqrt":
        return power(args[0], _HALF)
    return Call(name, tuple(args))


def _simple(value) -> bool:
    """Whether a sympy ``value`` is a product of rationals, pi, e and rational powers of rationals.

    sympy simplifies powers and functions of such numbers (``sqrt(8)``,
    ``sin(pi/6)``, ``acos(sqrt(2)/2)``) quickly; everything else is left as written.
    """
    factors = value.args if value.is_Mul else (value,)
    return all(f.is_Rational or f.is_NumberSymbol or
               (f.is_Pow and f.base.is_Rational and f.exp.is_Rational) for f in factors)


def constant_float(expr: Expr) -> float:
    """The float nearest a constant tree's value: exact fractions rounded once, others
    evaluated with mpmath to 30 digits and rounded once (the same float on every machine).

    >>> constant_float(parse_number("sqrt(3)*10")) == math.sqrt(300)
    True
    >>> constant_float(parse_number("1/3")) == 1 / 3
    True
    """
    exact = expr.exact_value()
    if exact is not None:
        return float(exact)
    if expr.variables:
        raise TypeError(f"{expr.text()} has a variable; it is not a number")
    import mpmath

    with mpmath.workdps(30):
        value = _mpmath(expr, mpmath)
        if isinstance(value, mpmath.mpc):
            if abs(value.imag) > 1e-25 * max(abs(value.real), 1e-300):
                raise ValueError(f"{expr.text()} is not a real number")
            value = value.real
        result = float(value)
    if not math.isfinite(result):
        raise ValueError(f"{expr.text()} is not a finite number")
    return result


def _mpmath(e: Expr, mp):
    if isinstance(e, Num):
        v = e.value
        return mp.mpf(v) if isinstance(v, float) else mp.mpf(v.numerator) / v.denominator
    if isinstance(e, Const):
        return +mp.pi if e.name == "pi" else mp.e + 0
    if isinstance(e, Neg):
        return -_mpmath(e.arg, mp)
    if isinstance(e, _Binary):
        a, b = _mpmath(e.left, mp), _mpmath(e.right, mp)
        return {Add: lambda: a + b, Sub: lambda: a - b, Mul: lambda: a * b,
                Div: lambda: a / b}[type(e)]()
    if isinstance(e, Pow):
        b, p = _mpmath(e.base, mp), e.exponent
        if p.denominator == 1:
            return b ** int(p)
        return mp.power(b, mp.mpf(p.numerator) / p.denominator)
    if isinstance(e, Call):
        args = [_mpmath(a, mp) for a in e.args]
        if e.name == "abs":
            return abs(args[0])
        if e.name == "sign":
            return mp.sign(args[0])
        return getattr(mp, e.name)(*args)
    raise TypeError(f"cannot evaluate {e!r}")  # pragma: no cover


_SYMPY_FUNCTIONS = {"sin": "sin", "cos": "cos", "tan": "tan", "asin": "asin", "acos": "acos",
                    "atan": "atan", "sinh": "sinh", "cosh": "cosh", "tanh": "tanh",
                    "exp": "exp", "log": "log", "Abs": "abs", "sign": "sign", "atan2": "atan2"}


def as_sympy(value, what: str = "as_sympy"):
    """A sympy object for a value that is one already, a number, or one of our trees — never text.

    The one door into sympy for values: it never calls ``sympify`` (which would evaluate a
    string), so text from a profile file reaches sympy only as the whitelist parser's tree
    (:meth:`Expr.to_sympy`). ``what`` names the caller in the refusal.

    >>> import sympy
    >>> as_sympy(parse_expression("t^2/2")), as_sympy(Fraction(1, 3)), as_sympy(7)
    (t**2/2, 1/3, 7)
    >>> as_sympy(sympy.pi) is sympy.pi, as_sympy(0.5)
    (True, 0.500000000000000)
    >>> as_sympy("__import__('os')")
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: give expression text to revolve.expr.parse_expression, not to as_sympy
    >>> as_sympy(True)
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: as_sympy takes a sympy expression, a number or an expression tree, not bool
    """
    import numbers

    sp = _sympy()
    if isinstance(value, Expr):
        return value.to_sympy()
    if isinstance(value, sp.Basic):
        return value
    if isinstance(value, (str, bytes)):
        raise ExpressionError(f"give expression text to revolve.expr.parse_expression, not to {what}")
    if isinstance(value, numbers.Number) and not isinstance(value, bool):
        if isinstance(value, numbers.Integral):
            return sp.Integer(int(value))
        if isinstance(value, Fraction):
            return sp.Rational(value.numerator, value.denominator)
        if isinstance(value, numbers.Real):
            return sp.Float(float(value))
    raise ExpressionError(f"{what} takes a sympy expression, a number or an expression tree, "
                          f"not {type(value).__name__}")


def from_sympy(value) -> Expr:
    """A tree of a sympy expression made by code (never text): numbers, ``pi``, ``E``,
    symbols, sums, products, rational powers and the parser's functions.

    For the library's callers that still build curves with sympy; each expression is
    converted once.

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> from_sympy(3 * t ** 2 / 90 + sympy.sqrt(2) * sympy.sin(t) + sympy.Float(0.5)).text()
    't^2/30 + sqrt(2)*sin(t) + 0.5'
    >>> from_sympy("__import__('os')")
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: give expression text to revolve.expr.parse_expression, not to from_sympy
    >>> from_sympy(sympy.gamma(t))
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: gamma(t) cannot be used in a curve; use the functions sqrt, sin, cos, tan, asin, acos, atan, sinh, cosh, tanh, exp, log, abs, atan2
    """
    if isinstance(value, Expr):
        return value
    v = as_sympy(value, "from_sympy")
    sp = _sympy()
    if v.is_Symbol:
        return Var(v.name)
    if v.is_Rational:
        return Num(Fraction(int(v.p), int(v.q)))
    if v.is_Float:
        return Num(float(v))
    if v is sp.pi:
        return Const("pi")
    if v is sp.E:
        return Const("e")
    if v.is_Add:
        terms = [from_sympy(a) for a in v.as_ordered_terms()]
        out = terms[0]
        for term in terms[1:]:
            out = add(out, term)
        return out
    if v.is_Mul:
        factors = list(v.as_ordered_factors())
        ups, downs = [], []
        for f in factors:
            if f.is_Pow and f.exp.is_Rational and f.exp < 0:
                downs.append(f.base if f.exp == -1 else sp.Pow(f.base, -f.exp))
            elif f.is_Rational and f.q != 1 and f.p in (1, -1):
                ups.append(sp.Integer(f.p))
                downs.append(sp.Integer(f.q))
            else:
                ups.append(f)
        out = ONE
        for f in ups:
            out = mul(out, from_sympy(f))
        if downs:
            bottom = ONE
            for f in downs:
                bottom = mul(bottom, from_sympy(f))
            out = div(out, bottom)
        return out
    if v.is_Pow:
        if v.exp.is_Rational:
            return power(from_sympy(v.base), Fraction(int(v.exp.p), int(v.exp.q)))
        if v.base is sp.E:
            return call("exp", (from_sympy(v.exp),))
    name = getattr(v.func, "__name__", "")
    if v.is_Function and name in _SYMPY_FUNCTIONS:
        return call(_SYMPY_FUNCTIONS[name], tuple(from_sympy(a) for a in v.args))
    raise ExpressionError(f"{_shown(str(v))} cannot be used in a curve; use the functions "
                          + ", ".join(FUNCTIONS))


def as_expression(value) -> Expr:
    """A tree for a tree, a plain number (int, Fraction, float) or a sympy expression.

    >>> as_expression(2), as_expression(0.5), as_expression(parse_expression("t")).text()
    (Expr('2'), Expr('0.5'), 't')
    """
    if isinstance(value, Expr):
        return value
    if isinstance(value, (int, Fraction, float)) and not isinstance(value, bool):
        return Num(value)
    return from_sympy(value)


# -- the parser ---------------------------------------------------------------------------

def _tokenize(text: str, max_length: int) -> list[tuple[str, str, int]]:
    if not isinstance(text, str):
        raise ExpressionError(f"an expression must be text, not {type(text).__name__}")
    if len(text) > max_length:
        raise ExpressionError(f"the expression is {len(text)} characters long; "
                              f"the limit is {max_length}")
    tokens, position, token = [], 0, re.compile(_TOKEN)
    while position < len(text):
        match = token.match(text, position)
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


def _is_zero(value: Expr) -> bool:
    """Whether a tree is zero: the number 0, or a constant whose value is exactly 0."""
    return value == ZERO or (not value.variables and value.approx == 0)


class _Parser:
    """Recursive descent over the token list; only parentheses recurse."""

    def __init__(self, tokens, variables: Sequence[str]):
        self.tokens, self.index, self.depth = tokens, 0, 0
        self.names = {name: Var(name) for name in variables}
        self.names.update(pi=Const("pi"), e=Const("e"))

    def peek(self) -> tuple[str, str, int]:
        if self.index < len(self.tokens):
            return self.tokens[self.index]
        last = self.tokens[-1]
        return ("end", "", last[2] + len(last[1]))

    def take(self) -> tuple[str, str, int]:
        token = self.peek()
        self.index += 1
        return token

    def parse(self) -> Expr:
        value = self.expression()
        kind, word, column = self.peek()
        if kind != "end":
            raise ExpressionError(f"unexpected '{_shown(word)}' at column {column}")
        return value

    def expression(self) -> Expr:
        value = self.term()
        while self.peek()[1] in ("+", "-"):
            op = self.take()
            right = self.term()
            self.check_size(value, right, op)
            value = self.checked(add(value, right) if op[1] == "+" else sub(value, right), op)
        return value

    def term(self) -> Expr:
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
            if word == "/" and _is_zero(right):
                raise ExpressionError(f"division by zero at column {op[2]}")
            value = self.checked(mul(value, right) if word == "*" else div(value, right), op)

    def factor(self) -> Expr:
        negative = False
        while self.peek()[1] in ("+", "-"):
            negative ^= self.take()[1] == "-"
        value = self.power()
        return neg(value) if negative else value

    def power(self) -> Expr:
        base = self.atom()
        if self.peek()[1] not in ("^", "**"):
            return base
        op = self.take()
        exponent = self.factor()      # right-associative, may carry a sign
        where = f"'{op[1]}' at column {op[2]}"
        p = exponent.exact_value()
        if p is None:
            hint = "; write exp(...) for a power of e" if base == Const("e") else ""
            raise ExpressionError(f"the exponent of {where} is not a plain number; exponents "
                                  f"must be numbers such as 2, -1 or 1/2{hint}")
        if abs(p) > MAX_EXPONENT:
            shown = p.numerator if p.denominator == 1 else f"{p.numerator}/{p.denominator}"
            raise ExpressionError(f"the exponent {shown} of {where} is too large; "
                                  f"the limit is {MAX_EXPONENT}")
        if max(base.bits, 1) * -(-abs(p.numerator) // p.denominator) > MAX_BITS:
            raise ExpressionError(f"the power at {where} gives a number beyond "
                                  f"{MAX_BITS} bits")
        if p < 0 and _is_zero(base):
            raise ExpressionError(f"division by zero at column {op[2]}")
        return self.checked(power(base, p), op)

    def atom(self) -> Expr:
        kind, word, column = self.take()
        if kind == "number":
            return Num(_fraction(word))
        if kind == "name" and word in FUNCTIONS:
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

    def call(self, name: str, column: int) -> Expr:
        kind, word, where = self.take()
        if word != "(":
            raise ExpressionError(f"function '{name}' at column {column} must be followed "
                                  f"by '(', as in {name}(x)")
        arguments = self.group(where, arguments=True)
        if len(arguments) != FUNCTIONS[name]:
            raise ExpressionError(f"function '{name}' at column {column} takes "
                                  f"{FUNCTIONS[name]} argument(s), got {len(arguments)}")
        if name in _GROWING and arguments[0].largest > _GROWING_LIMIT:
            raise ExpressionError(f"the argument of '{name}' at column {column} has a number "
                                  f"beyond {_GROWING_LIMIT} in size; the result would be "
                                  f"beyond 2^{MAX_BITS}")
        return self.checked(call(name, tuple(arguments)), ("name", name, column))

    def check_size(self, left: Expr, right: Expr, op) -> None:
        if left.bits + right.bits > MAX_BITS:
            raise ExpressionError(f"the result of '{op[1]}' at column {op[2]} has "
                                  f"numbers beyond {MAX_BITS} bits")

    def checked(self, value: Expr, op) -> Expr:
        """Refuse undefined, non-real or oversized results, naming the operator."""
        where = f"'{op[1]}' at column {op[2]}"
        if value.bits > MAX_BITS:
            raise ExpressionError(f"{where} gives a number beyond {MAX_BITS} bits")
        approx = value.approx
        if approx is not None and approx != approx:
            raise ExpressionError(f"{where} gives an undefined value "
                                  "(a division by zero or a pole)")
        if value.nesting > MAX_NESTING:
            raise ExpressionError(f"{where} nests functions and roots more than "
                                  f"{MAX_NESTING} deep; simplify the expression")
        if value.largest > 2 ** MAX_BITS:
            raise ExpressionError(f"{where} gives a number beyond 2^{MAX_BITS} in size")
        if approx is not None and abs(approx.imag) > 1e-12 * abs(approx.real):
            raise ExpressionError(f"{where} gives a number that is not real")
        return value


def _check_variables(variables) -> tuple:
    if isinstance(variables, str):
        variables = (variables,)
    for name in variables:
        if not (isinstance(name, str) and re.fullmatch(r"[A-Za-z_][A-Za-z0-9_]*", name)):
            raise ExpressionError(f"{name!r} cannot be a variable name; use letters, "
                                  "digits and '_' starting with a letter")
        if name in FUNCTIONS or name in CONSTANTS:
            raise ExpressionError(f"'{name}' cannot be a variable name; it is a built-in name")
    return tuple(variables)


def parse_expression(text: str, variables: Sequence[str] = ("t",), *,
                     max_length: int = 200) -> Expr:
    """Parse untrusted expression text into an expression tree (:class:`Expr`).

    Parameters
    ----------
    text : str
        The expression, e.g. ``"40 - x^2/90"``. Whitespace is ignored.
    variables : sequence of str
        Names allowed as variables (each a real number).
    max_length : int
        Longest text accepted, in characters.

    Returns
    -------
    Expr
        The tree; decimals are exact fractions. ``.to_sympy()`` gives the sympy
        expression when an exact result is asked for.

    Raises
    ------
    revolve.errors.ExpressionError
        For anything outside the grammar or beyond a limit; the message names the
        offending token and its column.

    Examples
    --------
    >>> parse_expression("40 - x^2/90", ["x"])
    Expr('40 - x^2/90')
    >>> parse_expression("25*cos(t) + 0.25").to_sympy()
    25*cos(t) + 1/4
    >>> parse_expression("-2^2"), parse_expression("2**3^2"), parse_expression("pi/2")
    (Expr('-4'), Expr('512'), Expr('pi/2'))
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
    names = _check_variables(variables)
    return _Parser(_tokenize(text, max_length), names).parse()


def parse_number(text: str, *, max_length: int = 200) -> Expr:
    """Parse untrusted text that must give a finite real number, kept exact.

    Parameters
    ----------
    text : str
        An expression without variables, e.g. ``"sqrt(2)*10"``.
    max_length : int
        Longest text accepted, in characters.

    Returns
    -------
    Expr
        The exact value as a constant tree (``float()`` of it, or
        :func:`constant_float` for the value rounded once).

    Raises
    ------
    revolve.errors.ExpressionError
        If the text is refused by :func:`parse_expression` or is not a finite real.

    Examples
    --------
    >>> parse_number("sqrt(2)*10")
    Expr('sqrt(2)*10')
    >>> parse_number("0.1") + parse_number("0.2") == parse_number("0.3")
    True
    >>> parse_number("-0")
    Expr('0')
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


def _constants(value) -> tuple[float, bool]:
    """Largest magnitude of the constant parts of a sympy ``value`` and whether all are real."""
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


def exact_number(value) -> "sympy.Expr":
    """Convert a number from a file or from code to an exact sympy number (for exact results).

    ``int`` gives an Integer, ``decimal.Decimal`` and ``fractions.Fraction`` their
    exact value, ``float`` the Rational of its shortest text (``repr``), so 0.1
    gives 1/10; ``str`` goes through :func:`parse_number`, an :class:`Expr`
    through :meth:`Expr.to_sympy`. A sympy number is returned as it is if finite
    and real. ``bool`` and everything else is refused.

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
    import numbers
    from decimal import Decimal

    if isinstance(value, bool):
        raise ExpressionError(f"{value} is not a number; write 1 or 0")
    if isinstance(value, str):
        value = parse_number(value)
    if isinstance(value, Expr):
        if value.variables:
            raise ExpressionError(f"{_shown(value.text())} is not a number")
        return value.to_sympy()
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
        if _fraction_bits(value) > MAX_BITS:
            raise ExpressionError(f"the fraction is beyond {MAX_BITS} bits")
        return sp.Rational(value.numerator, value.denominator)
    if isinstance(value, sp.Expr) and value.is_number:
        largest, real = _constants(value)
        if largest > 2 ** MAX_BITS or not real or value.has(sp.zoo, sp.nan):
            raise ExpressionError(f"{_shown(str(value))} is not a finite real number")
        return value
    raise ExpressionError(f"{indefinite(type(value).__name__)} cannot be used as a number")
