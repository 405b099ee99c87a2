"""Tests of revolve.expr, the whitelist parser for untrusted expression text.

Outside references:
- reference library: sympy -- expected expressions are built by hand from sympy
  objects (``sympy.Symbol``, ``sympy.Rational``, ``sympy.sqrt`` ...), never by
  parsing text;
- reference library: Python's ``math`` module -- numeric values of every function;
- reference library: Python's ``decimal`` and ``fractions`` modules -- exact
  values of decimal literals and of integer arithmetic;
- published: the Python Language Reference, "Expressions" (operator precedence:
  ``**`` binds tighter than unary minus and is right-associative), from memory.
"""

from __future__ import annotations

import builtins
import contextlib
import math
import os
import subprocess
import sys
from decimal import Decimal
from fractions import Fraction

import pytest
import sympy
from hypothesis import assume, given, settings, strategies as st

from revolve.errors import ExpressionError, RevolveError
from revolve.expr import Expr, constant_float, exact_number, parse_expression, parse_number

t = sympy.Symbol("t", real=True)
x = sympy.Symbol("x", real=True)
R = sympy.Rational

# --------------------------------------------------------------------------- guards

FORBIDDEN_MODULES = {"os", "subprocess", "shutil", "socket", "pty", "ctypes", "pickle",
                     "marshal", "runpy", "code", "codeop", "importlib", "builtins", "sys"}
EXPR_MAY_IMPORT = {"sympy", "math", "numbers", "decimal", "fractions", "revolve"}


@contextlib.contextmanager
def nothing_runs():
    """Make every way of running text as code raise AssertionError inside the block."""
    import sympy.parsing.sympy_parser as sympy_parser
    real_import = builtins.__import__

    def guarded_import(name, globals=None, locals=None, fromlist=(), level=0):
        caller = (globals or {}).get("__name__", "")
        top = name.split(".")[0]
        if level == 0 and (top in FORBIDDEN_MODULES or
                           (caller.startswith("revolve") and top not in EXPR_MAY_IMPORT)):
            raise AssertionError(f"{caller} imported {name!r} while parsing")
        return real_import(name, globals, locals, fromlist, level)

    def forbidden(what):
        def call(*args, **kwargs):
            raise AssertionError(f"{what} was called while parsing")
        return call

    with pytest.MonkeyPatch.context() as patch:
        for name in ("eval", "exec", "compile"):
            patch.setattr(builtins, name, forbidden(name))
        for owner, name in ((sympy, "sympify"), (sympy, "parse_expr"), (sympy, "lambdify"),
                            (sympy_parser, "parse_expr"), (os, "system"), (os, "popen"),
                            (subprocess, "Popen")):
            patch.setattr(owner, name, forbidden(f"{owner.__name__}.{name}"))
        patch.setattr(builtins, "__import__", guarded_import)
        yield


def refused(text, variables=("t", "x"), **options) -> ExpressionError:
    with nothing_runs(), pytest.raises(ExpressionError) as caught:
        parse_expression(text, variables, **options)
    return caught.value


def test_the_guards_can_fail():
    with nothing_runs():
        with pytest.raises(AssertionError):
            eval("1")
        with pytest.raises(AssertionError):
            __import__("os")
        with pytest.raises(AssertionError):
            sympy.sympify("1")
        with pytest.raises(AssertionError):
            os.system("true")


# --------------------------------------------------------------------------- correct parses

@pytest.mark.parametrize("text, expected", [
    ("40 - x^2/90", 40 - x**2 / 90),
    ("25*cos(t)", 25 * sympy.cos(t)),
    ("sqrt(3)*10", 10 * sympy.sqrt(3)),
    ("pi/2", sympy.pi / 2),
    ("e", sympy.E),
    ("e^2", sympy.exp(2)),
    ("2*pi*t - t^3/6", 2 * sympy.pi * t - t**3 / 6),
    ("(1 - (x/50)^2)^0.5 * 30", 30 * sympy.sqrt(1 - (x / 50) ** 2)),
    ("x^-1 + t**2", 1 / x + t**2),
    ("1/x^2", x**-2),
    ("abs(t - 3)", sympy.Abs(t - 3)),
    ("sqrt(t)^2", t),
    ("(t^2)^(1/2)", sympy.Abs(t)),
    ("  3 *\tt\n", 3 * t),
    ("-(t + 1)", -t - 1),
    ("sin(pi/6)", R(1, 2)),
    ("acos(sqrt(2)/2)", sympy.pi / 4),
    ("atan2(1, -1)", 3 * sympy.pi / 4),
    ("log(e)", 1),
    ("exp(0)", 1),
])
def test_parses_equal_sympy_built_by_hand(text, expected):   # reference library: sympy
    with nothing_runs():
        parsed = parse_expression(text, ("t", "x"))
    assert isinstance(parsed, Expr)
    assert parsed.to_sympy() == expected


def test_variables_are_real_symbols_that_other_modules_can_rebuild():
    parsed = parse_expression("t").to_sympy()
    assert parsed == sympy.Symbol("t", real=True)
    assert parsed != sympy.Symbol("t")
    assert parsed.is_real
    assert parse_expression("radius*2", ["radius"]).to_sympy() == \
        2 * sympy.Symbol("radius", real=True)
    assert parse_expression("y", "y").to_sympy() == sympy.Symbol("y", real=True)   # one name


@pytest.mark.parametrize("name, reference", [   # reference library: Python's math module
    ("sqrt", math.sqrt), ("sin", math.sin), ("cos", math.cos), ("tan", math.tan),
    ("asin", math.asin), ("acos", math.acos), ("atan", math.atan), ("sinh", math.sinh),
    ("cosh", math.cosh), ("tanh", math.tanh), ("exp", math.exp), ("log", math.log),
    ("abs", abs),
])
@pytest.mark.parametrize("value", [0.3, 0.7])
def test_every_function_agrees_with_math(name, reference, value):
    tree = parse_expression(f"{name}(t)")
    parsed = tree.to_sympy()
    assert parsed == getattr(sympy, {"abs": "Abs"}.get(name, name))(t)   # reference: sympy
    assert float(parsed.subs(t, value)) == pytest.approx(reference(value), rel=1e-14)
    negative = parse_expression(f"{name}(-t)").to_sympy().subs(t, value)
    if name not in ("sqrt", "log"):
        assert float(negative) == pytest.approx(reference(-value), rel=1e-14)
    compiled = tree.numpy_function()                          # the package's own compiler
    assert float(compiled(value)) == pytest.approx(reference(value), rel=1e-14)


def test_atan2_agrees_with_math_in_every_quadrant():   # reference library: math.atan2
    parsed = parse_expression("atan2(t, x)", ("t", "x")).to_sympy()
    for y_value, x_value in ((0.3, 0.8), (0.3, -0.8), (-0.3, -0.8), (-0.3, 0.8)):
        assert float(parsed.subs({t: y_value, x: x_value})) == \
            pytest.approx(math.atan2(y_value, x_value), rel=1e-14)


# --------------------------------------------------------------------------- precedence

@pytest.mark.parametrize("text, expected", [    # Python Language Reference, from memory
    ("-2^2", -2**2), ("2^3^2", 2**3**2), ("2**3**2", 2**3**2), ("(-2)^2", (-2) ** 2),
    ("2^-1", R(1, 2)), ("-2^-2", R(-1, 4)), ("2^-3^2", R(1, 2**9)), ("1-2-3", 1 - 2 - 3),
    ("8/4/2", 1), ("6/2*3", 9), ("2*3^2", 2 * 3**2), ("2+3*4", 2 + 3 * 4),
    ("(2+3)*4", (2 + 3) * 4), ("--2", 2), ("+-+2", -2), ("2*-3", -6), ("2^+2", 4),
    ("2 - -3", 5), ("(2^3)^2", 64),
])
def test_precedence_and_associativity(text, expected):
    assert parse_expression(text).to_sympy() == expected
    assert parse_expression(text).exact_value() == expected     # folded to a number


BIG = "big"


def _tree(leaf_count: int = 12):
    """Random arithmetic written with the fewest parentheses, and its exact value."""
    leaves = st.integers(0, 9).map(lambda n: (str(n), Fraction(n), 9))

    def wrap(node, needed):
        return f"({node[0]})" if needed else node[0]

    def binary(args):
        op, a, b = args
        level = 4 if op in "+-" else 5
        text = wrap(a, a[2] < level) + op + wrap(b, b[2] <= level)
        if BIG in (a[1], b[1]):
            return text, BIG, level
        if a[1] is None or b[1] is None or (op == "/" and b[1] == 0):
            return text, None, level
        value = {"+": a[1] + b[1], "-": a[1] - b[1], "*": a[1] * b[1]}.get(op)
        return text, a[1] / b[1] if op == "/" else value, level

    def negate(a):
        value = a[1] if a[1] in (None, BIG) else -a[1]
        return "-" + wrap(a, a[2] < 6), value, 6

    def power(args):
        a, k = args
        text = wrap(a, a[2] < 9) + "^" + str(k)
        if a[1] in (None, BIG):
            return text, a[1], 7
        if a[1] == 0 and k < 0:
            return text, None, 7
        if max(abs(a[1].numerator), a[1].denominator).bit_length() * abs(k) > 200:
            return text, BIG, 7          # too big to be worth computing here
        return text, a[1] ** k, 7

    def extend(children):
        return (st.tuples(st.sampled_from("+-*/"), children, children).map(binary)
                | children.map(negate)
                | st.tuples(children, st.integers(-2, 2)).map(power))

    return st.recursive(leaves, extend, max_leaves=leaf_count)


@settings(max_examples=300, deadline=None)
@given(_tree())
def test_random_arithmetic_matches_fractions(node):   # reference library: fractions
    text, value, _ = node
    assume(len(text) <= 150 and text.count("(") <= 30 and value is not BIG)
    if value is None:
        with pytest.raises(ExpressionError, match="division by zero|undefined"):
            parse_expression(text, ())
    else:
        assert parse_expression(text, ()).exact_value() == value


# --------------------------------------------------------------------------- exact decimals

@pytest.mark.parametrize("text, expected", [
    ("0.1", R(1, 10)), ("0.1 + 0.2", R(3, 10)), ("0.25", R(1, 4)), ("1.5e-3", R(3, 2000)),
    (".5", R(1, 2)), ("5.", 5), ("2E3", 2000), ("1e99", sympy.Integer(10) ** 99),
    ("1e-99", R(1, 10**99)), ("0000.5000", R(1, 2)), ("123456789012345678901234567890",
                                                      123456789012345678901234567890),
])
def test_decimals_are_exact(text, expected):
    parsed = parse_expression(text).to_sympy()
    assert parsed == expected and parsed.is_Rational


@settings(max_examples=200, deadline=None)
@given(st.from_regex(r"[0-9]{1,12}(\.[0-9]{0,12})?([eE][+-]?[0-9]{1,2})?", fullmatch=True))
def test_decimal_text_matches_the_decimal_module(text):   # reference library: decimal
    exact = Fraction(Decimal(text))
    assert parse_number(text).exact_value() == exact


# --------------------------------------------------------------------------- messages

@pytest.mark.parametrize("text, message", [
    ("1 + foo", "unknown name 'foo' at column 5; allowed names: t, x, pi, e, sqrt"),
    ("x@y", "unexpected character '@' at column 2"),
    ("2x", "missing operator between '2' and 'x' at column 2; write 2*x"),
    ("2 (t)", "missing operator between '2' and '(' at column 3; write 2*(...)"),
    ("(t)(x)", "missing operator between ')' and '(' at column 4"),
    ("x(2)", "missing operator between 'x' and '('"),
    ("2pi", "write 2*pi"),
    ("sin t", "function 'sin' at column 1 must be followed by '('"),
    ("sin(1, 2)", "function 'sin' at column 1 takes 1 argument(s), got 2"),
    ("atan2(1)", "takes 2 argument(s), got 1"),
    ("cos()", "takes 1 argument(s), got 0"),
    ("(1 + t", "expected ')' for the '(' at column 1 but found the end at column 7"),
    ("1)", "unexpected ')' at column 2"),
    ("1 +", "ends too early after '+' at column 3"),
    ("1,2", "unexpected ',' at column 2"),
    ("PI", "did you mean 'pi'?"),
    ("ln(2)", "did you mean 'log'?"),
    ("Sin(t)", "did you mean 'sin'?"),
    ("", "the expression is empty"),
    (" \t", "the expression is empty"),
])
def test_errors_name_the_token_and_column(text, message):
    error = refused(text)
    assert message in str(error)
    assert isinstance(error, RevolveError) and isinstance(error, ValueError)
    assert "\n" not in str(error)


def test_errors_can_be_located_in_a_file():
    error = refused("2x").located(file="lid.toml", line=7, place="loop 1, segment 2")
    assert str(error).startswith("lid.toml:7: loop 1, segment 2: missing operator")


@pytest.mark.parametrize("value", [None, 5, b"t", ["t"]])
def test_non_text_is_refused(value):
    with pytest.raises(ExpressionError, match="must be text"):
        parse_expression(value)


@pytest.mark.parametrize("variables", [("sin",), ("e",), ("2a",), ("",), ("a b",), (3,)])
def test_bad_variable_names_are_refused(variables):
    with pytest.raises(ExpressionError, match="cannot be a variable name"):
        parse_expression("1", variables)


# --------------------------------------------------------------------------- limits

def test_limits_accept_up_to_the_boundary():
    def parsed(text, **options):
        return parse_expression(text, **options).to_sympy()

    assert parsed("1+" * 99 + "1") == 100                       # 199 characters
    assert parsed("+".join(["1"] * 100), max_length=1000) == 100  # 199 tokens
    assert parsed("(" * 30 + "t" + ")" * 30) == t                 # depth 30
    assert parsed("9" * 30) == 10**30 - 1                         # 30-digit literal
    assert parsed("t^64 + t^-64") == t**64 + t**-64
    assert parsed("(2^31)^32") == 2**992
    assert parsed("sin(sin(sin(sin(t))))") == sympy.sin(sympy.sin(sympy.sin(sympy.sin(t))))
    assert parsed("exp(709) + exp(t/50)") == sympy.exp(709) + sympy.exp(t / 50)


@pytest.mark.parametrize("text, options, message", [
    ("1+" * 100 + "1", {}, "201 characters long; the limit is 200"),
    ("1+1", {"max_length": 2}, "the limit is 2"),
    ("+".join(["1"] * 101), {"max_length": 1000}, "more than 200 tokens"),
    ("(" * 31 + "t" + ")" * 31, {}, "nested deeper than 30"),
    ("9" * 31, {}, "too long or too large"),
    ("1e100", {}, "exponents within ±99"),
    ("1e-100", {}, "exponents within ±99"),
    ("t^65", {}, "exponent 65 of '^' at column 2 is too large"),
    ("t^-65", {}, "the limit is 64"),
    ("t^t", {}, "not a plain number"),
    ("2^t", {}, "not a plain number"),
    ("t^pi", {}, "not a plain number"),
    ("e^t", {}, "write exp(...) for a power of e"),
    ("(2^32)^32", {}, "beyond 1024 bits"),
    ("1e99*1e99*1e99*1e99", {}, "beyond 1024 bits"),
    ("exp(710)", {}, "beyond 709"),
    ("sinh(1000)", {}, "beyond 709"),
    ("exp(1e30*log(2))", {}, "beyond 709"),
    ("exp(-1000*t)", {}, "beyond 709"),
    ("sin(sin(sin(sin(sin(t)))))", {}, "more than 4 deep"),
    ("sqrt(sin(sqrt(sin(sqrt(t)))))", {}, "more than 4 deep"),
])
def test_limits_refuse_beyond_the_boundary(text, options, message):
    assert message in str(refused(text, **options))


@pytest.mark.parametrize("text", ["1/0", "t/0", "1/(t - t)", "0^-1", "log(0)", "tan(pi/2)",
                                  "atan2(0, 0)"])
def test_undefined_values_are_refused(text):
    assert "division by zero" in str(refused(text)) or "undefined" in str(refused(text))


@pytest.mark.parametrize("text", ["sqrt(-1)", "log(-1)", "acos(2)", "asin(3)", "(-8)^(1/3)",
                                  "sqrt(1 - pi)"])
def test_non_real_numbers_are_refused(text):
    assert "not real" in str(refused(text))


# --------------------------------------------------------------------------- hostile input

HOSTILE = [
    "__import__('os').system('echo x')", "().__class__", "x.__class__", "lambda: 1",
    "import os", "open('f')", "exec('1')", "eval('1')", "x if 1 else 2", "[1]", "{}",
    '"str"', "a;b", "9^9^9^9", "2^1000000", "10**10**10", "x" * 10_000, "1+" * 5000 + "1",
    "(" * 5000 + "1" + ")" * 5000, "1e999999", "x@y", "x\\y", "\\x41", "t\\\n+1",
    "\u0445 + 1",            # Cyrillic letter that looks like x
    "t \u2212 1",            # minus sign
    "\uff12*t",              # fullwidth digit 2
    "\u0661 + t",            # Arabic-Indic digit one
    "t\u00b2",               # superscript two
    "sympy.exp(1)", "Symbol('x')", "t._sympy_()", "globals()", "os", "sys", "__builtins__",
    "t.__dict__", "getattr(t, 'x')", "foo(1)", "Abs(t)", "ln(t)", "E", "I", "oo", "zoo",
    "nan", "Integer(2)", "t == 1", "t < 1", "t % 2", "t & 1", "~t", "t // 2", "`t`", "$t",
    "t # comment", "1_000", "0x10", "1j", "t\x00", "#", "?", "!t",
    "exp(exp(exp(9)))", "tan(exp(700)^64)", "sin(1e99^64)", "(((((((((((1)))))))))))^99",
]


@pytest.mark.parametrize("text", HOSTILE, ids=range(len(HOSTILE)))
def test_hostile_input_is_refused_without_running_anything(text, capfd):
    refused(text)
    refused(text, max_length=20_000)       # past the length limit, the other limits hold
    assert "x" not in capfd.readouterr().out


@pytest.mark.parametrize("text, message", [
    ("9^9^9^9", "exponent 387420489"), ("2^1000000", "exponent 1000000"),
    ("10**10**10", "exponent 10000000000"), ("1e999999", "too long or too large"),
    ("x" * 10_000, "10000 characters long"), ("(" * 5000 + "1" + ")" * 5000, "characters long"),
])
def test_hostile_input_is_stopped_by_a_limit_before_any_work(text, message):
    assert message in str(refused(text))


def test_deep_nesting_is_stopped_by_a_limit_even_when_length_is_allowed():
    assert "more than 200 tokens" in str(refused("(" * 5000 + "1" + ")" * 5000,
                                                 max_length=20_000))
    assert "nested deeper than 30" in str(refused("(" * 40 + "1" + ")" * 40))


ALPHABET = "0123456789.eE+-*/^(),tx pisqrcoanlbh_"
PIECES = ["t", "x", "pi", "e", "sqrt", "sin", "cos", "tan", "asin", "acos", "atan", "sinh",
          "cosh", "tanh", "exp", "log", "abs", "atan2", "(", ")", ",", "+", "-", "*", "/",
          "^", "**", "0", "1", "2", "9", "64", "0.5", "1e99", "1e-99", "1e30", " "]


@settings(max_examples=400, deadline=None)
@given(st.one_of(st.text(ALPHABET, max_size=60),
                 st.lists(st.sampled_from(PIECES), max_size=60).map("".join)))
def test_random_text_parses_or_raises_expression_error(text):
    with nothing_runs():
        try:
            value = parse_expression(text[:200], ("t", "x"))
        except ExpressionError:
            return
    assert isinstance(value, Expr)
    assert value.variables <= {"t", "x"}


# --------------------------------------------------------------------------- parse_number

@pytest.mark.parametrize("text, expected", [
    ("sqrt(2)*10", 10 * sympy.sqrt(2)), ("sqrt(2)^2", 2), ("0.25", R(1, 4)),
    ("-pi", -sympy.pi), ("2^0.5", sympy.sqrt(2)), ("exp(1)", sympy.E), ("-0", 0),
    ("sin(pi/6)", R(1, 2)), ("1/3", R(1, 3)),
])
def test_parse_number_is_exact(text, expected):   # reference library: sympy
    assert parse_number(text).to_sympy() == expected
    assert constant_float(parse_number(text)) == float(sympy.N(expected, 30))


def test_parse_number_keeps_other_values_exact_and_right():   # reference: math
    value = parse_number("log(e^3) + sin(1)").to_sympy()
    assert value.is_number and not value.is_Float
    assert float(value) == pytest.approx(3 + math.sin(1), rel=1e-15)


@pytest.mark.parametrize("text, message", [
    ("t", "unknown name 't'"), ("2*x", "unknown name 'x'"), ("acos(2)", "not real"),
    ("1/0", "division by zero"), ("", "empty"), ("log(0)", "undefined"),
])
def test_parse_number_refuses_variables_and_non_finite_values(text, message):
    with pytest.raises(ExpressionError, match=message):
        parse_number(text)


# --------------------------------------------------------------------------- exact_number

@pytest.mark.parametrize("value, expected", [
    (3, 3), (-7, -7), (Decimal("0.1"), R(1, 10)), (Decimal("2.50"), R(5, 2)),
    (Decimal("-1.5E-3"), R(-3, 2000)), (0.1, R(1, 10)), (1 / 3, R(3333333333333333, 10**16)),
    (1e300, sympy.Integer(10) ** 300), (5e-324, R(5, 10**324)), (-0.0, 0), (2.5, R(5, 2)),
    ("sqrt(2)", sympy.sqrt(2)), (Fraction(1, 3), R(1, 3)), (R(2, 7), R(2, 7)),
    (sympy.sqrt(3), sympy.sqrt(3)), (sympy.pi, sympy.pi),
])
def test_exact_number(value, expected):   # reference: decimal and repr of float
    result = exact_number(value)
    assert result == expected and isinstance(result, sympy.Expr)
    if isinstance(value, float):
        exact = Fraction(Decimal(repr(value)))
        assert result == R(exact.numerator, exact.denominator)


def test_exact_number_takes_numpy_scalars():
    numpy = pytest.importorskip("numpy")
    assert exact_number(numpy.float64(0.1)) == R(1, 10)
    assert exact_number(numpy.int64(7)) == 7


@pytest.mark.parametrize("value, message", [
    (True, "True is not a number"), (False, "False is not a number"),
    (float("nan"), "not a finite number"), (float("inf"), "not a finite number"),
    (Decimal("NaN"), "not a finite number"), (Decimal("-Infinity"), "not a finite number"),
    (Decimal("1e999999"), "too large or too small"), (2**2000, "beyond 1024 bits"),
    (None, "NoneType cannot be used"), ([1], "list cannot be used"),
    (complex(1, 2), "complex cannot be used"), (sympy.I, "not a finite real"),
    (sympy.zoo, "not a finite real"), (sympy.Symbol("x"), "Symbol cannot be used"),
    ("t", "unknown name 't'"),
])
def test_exact_number_refuses(value, message):
    with pytest.raises(ExpressionError, match=message):
        exact_number(value)


# --------------------------------------------------------------------------- start-up

PACKAGE_ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


def test_importing_the_module_does_not_import_sympy():
    code = "import sys, revolve.expr; print('sympy' in sys.modules, 'mpmath' in sys.modules)"
    result = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                            check=True, env={**os.environ, "PYTHONPATH": PACKAGE_ROOT})
    assert result.stdout.split() == ["False", "False"]


# --------------------------------------------------------------------------- the own tree
# Outside reference: sympy -- ``sympy.diff`` for derivatives and ``sympy.lambdify`` (numpy)
# for values of the same expression, built from the tree by ``to_sympy``; the tree's own
# derivative and compiler never see sympy.

import numpy as np                                          # noqa: E402
from hypothesis import example                              # noqa: E402

from revolve.expr import from_sympy                         # noqa: E402

_LEAVES = ["t", "2", "0.5", "3/4", "pi", "e", "1.25"]
_UNARY = ["sin", "cos", "tan", "atan", "sinh", "cosh", "tanh", "exp", "sqrt", "abs",
          "log", "asin", "acos"]


def _expression_text():
    """Random expressions of the parser's grammar in ``t`` (text, never sympy)."""
    leaves = st.sampled_from(_LEAVES)

    def extend(children):
        binary = st.tuples(children, st.sampled_from(["+", "-", "*", "/"]), children).map(
            lambda a: f"({a[0]}) {a[1]} ({a[2]})")
        unary = st.tuples(st.sampled_from(_UNARY), children).map(lambda a: f"{a[0]}({a[1]}/4)")
        powers = st.tuples(children, st.sampled_from(["2", "3", "-1", "1/2", "-2"])).map(
            lambda a: f"({a[0]})^({a[1]})")
        two = st.tuples(children, children).map(lambda a: f"atan2({a[0]}, 1 + ({a[1]})^2)")
        return binary | unary | powers | two | children.map(lambda a: f"-({a})")

    return st.recursive(leaves, extend, max_leaves=8)


def _parsed_or_none(text):
    try:
        return parse_expression(text)
    except ExpressionError:
        return None


TS = np.array([0.15, 0.4, 0.77, 1.1, 1.6])


def _agree(got, want):
    """Values agree to 1e-9 where the reference is a real number of moderate size."""
    got = np.broadcast_to(np.asarray(got, dtype=float), TS.shape)
    want = np.broadcast_to(np.asarray(want, dtype=float), TS.shape)
    ok = np.isfinite(want) & (np.abs(want) < 1e12)
    scale = np.maximum(np.abs(want), 1.0)
    bad = ok & ~(np.abs(got - want) <= 1e-9 * scale)
    return not bad.any(), ok


@settings(max_examples=300, deadline=None)
@given(_expression_text())
@example("sqrt(t)^2")
@example("abs(t - 1) * exp(-(t)/4)")
@example("atan2(t, 1 + (t)^2) / (t - 3/4)")
def test_tree_values_and_derivatives_match_sympy(text):     # reference: sympy diff, lambdify
    tree = _parsed_or_none(text)
    assume(tree is not None)
    reference = tree.to_sympy()
    with np.errstate(all="ignore"):
        want = sympy.lambdify(t, reference, modules="numpy")(TS)
        want_d = sympy.lambdify(t, sympy.diff(reference, t), modules="numpy")(TS)
        got = tree.numpy_function()(TS)
        got_d = tree.derivative().numpy_function()(TS)
    same, ok = _agree(got, want)
    assert same, (text, got, want)
    same_d, ok_d = _agree(got_d, want_d)
    assert same_d, (text, got_d, want_d)


@settings(max_examples=200, deadline=None)
@given(_expression_text())
@example("-(-((t) / (-(0.5))))")       # once printed t/-1/2, which reads as (t/-1)/2
def test_tree_text_parses_back_to_the_same_tree_value(text):
    tree = _parsed_or_none(text)
    assume(tree is not None)
    again = parse_expression(tree.text())
    assert again.to_sympy().equals(tree.to_sympy()) is not False     # reference: sympy
    with np.errstate(all="ignore"):
        same, _ = _agree(again.numpy_function()(TS), tree.numpy_function()(TS))
    assert same


def test_trees_compare_and_hash_by_structure():
    a, b = parse_expression("t^2 + sin(t)/3"), parse_expression("t ** 2 + sin( t ) / 3")
    assert a == b and hash(a) == hash(b) and a is not b
    assert a != parse_expression("t^2 + sin(t)/4")
    assert parse_expression("2") != from_sympy(sympy.Float(2.0))    # exact and float differ
    assert {a: 1}[b] == 1


def test_trees_are_immutable_and_pickle():
    import pickle

    tree = parse_expression("sqrt(1 + t^2) - pi")
    with pytest.raises(AttributeError):
        tree.left = parse_expression("1")
    assert pickle.loads(pickle.dumps(tree)) == tree


def test_sympy_expressions_convert_once_and_back():   # reference: sympy built by hand
    s = 3 * t ** 2 / 90 + sympy.sqrt(2) * sympy.cos(t) - sympy.exp(t / 5) + sympy.pi
    tree = from_sympy(s)
    assert sympy.simplify(tree.to_sympy() - s) == 0
    with pytest.raises(ExpressionError, match="cannot be used"):
        from_sympy(sympy.gamma(t))


def test_derivative_folds_zero_and_one():
    assert parse_expression("3*t + pi").derivative().text() == "3"
    assert parse_expression("t").derivative().text() == "1"
    assert parse_expression("pi^2").derivative().text() == "0"


# --------------------------------------------------------------------------- no sympy when
# nothing exact is asked (issue 10: symbolic only where asked)

def _modules_after(code: str) -> list:
    script = ("import sys\n" + code + "\n"
              "print([m for m in ('sympy', 'mpmath', 'scipy') if m in sys.modules])\n")
    result = subprocess.run([sys.executable, "-c", script], capture_output=True, text=True,
                            env={**os.environ, "PYTHONPATH": PACKAGE_ROOT}, cwd=PACKAGE_ROOT)
    assert result.returncode == 0, result.stderr[-2000:]
    return result.stdout.strip().splitlines()[-1]


def test_measuring_a_curve_profile_imports_no_sympy():
    code = ("import revolve\n"
            "from revolve.cli.app import main\n"
            "import contextlib, io\n"
            "with contextlib.redirect_stdout(io.StringIO()):\n"
            "    try:\n"
            "        main(['measure', 'profiles/domed-lid.toml', '--json'])\n"
            "    except SystemExit:\n"
            "        pass\n")
    assert _modules_after(code) == "[]"


def test_building_and_measuring_an_ellipsoidal_vessel_imports_no_sympy():
    code = ("from revolve.jobs.vessel import design_vessel, parse_head, summarise, "
            "sketch_profile\n"
            "from revolve.geometry.measure import measure\n"
            "from revolve.geometry.profile import Revolution\n"
            "spec = parse_head('ellipsoidal', 1200.0)\n"
            "design = design_vessel(1200.0, 3000.0, spec, parse_head('torispherical', 1200.0),"
            " thickness=8.0)\n"
            "summarise(design)\n"
            "profile, axis = sketch_profile(design, 'vertical', 'inside')\n"
            "measure(Revolution(profile, axis))\n")
    assert _modules_after(code) == "[]"
