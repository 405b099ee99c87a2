'''SVG path data and SVG files as profiles.

The path data grammar is the W3C one (SVG 1.1 and SVG 2, "Paths", the
``d`` attribute): the commands ``M L H V A C S Q T Z``, each absolute
(upper case) or relative (lower case); a command repeated implicitly by
further numbers (after a moveto they are linetos); numbers written
compactly (``1.5.5`` is 1.5 then .5, ``-1-2`` is -1 then -2, ``1e-3``);
arc flags written as single digits with or without separators
(``a5 5 0 1010 0``). A hand-written scanner reads it; nothing is evaluated.
Every number is kept exact (a :class:`fractions.Fraction` of its decimal
text) and relative commands add exactly, so a path drawn with relative moves
closes exactly when its figures say it does.

Segments
--------
* ``L H V`` and the closing line of ``Z`` become straight lines;
* ``A`` is converted from the endpoint form to the centre form as the SVG
  implementation notes say (out-of-range radii scaled up, zero radii made a
  line, an arc to its own start left out). A circular arc (equal radii once
  scaled, under a transform that keeps circles round) becomes an exact
  :class:`~revolve.geometry.segments.Arc`; an elliptical one a parametric
  curve ``x = cx + a cos t + b sin t``, ``y = cy + c cos t + d sin t``;
* ``Q T C S`` become polynomial curves in ``t`` from 0 to 1 with exact
  rational coefficients (their area integrals are exact; lengths are left to
  the engine's quadrature). A Bézier whose control points lie on its chord
  is a straight line and is written as one.

Subpaths: one closed by ``Z`` (or ending exactly where it started) is a
loop; any other is an open chain (a surface only). A subpath with nothing
but a moveto draws nothing and is left out.

Shapes: ``<rect>`` (with ``rx``/``ry`` rounded corners), ``<circle>``,
``<ellipse>``, ``<line>``, ``<polyline>`` and ``<polygon>`` are read as the
path SVG 2 defines for each (:func:`shape_commands`), so their circles stay
exact arcs. An SVG file gives every path and shape it draws (or those of the
element or group chosen by id); loops and chains not joined to the main
outline -- the loop of largest area, whose directly nested loops are its
holes -- are warned about and left out unless asked for
(:func:`revolve.formats.drawings.separate_strays`). Text, images, ``<use>``
references and elements not drawn by themselves are reported as skipped.

Numbers: every number is at most 1e15 in size
(:data:`revolve.formats.drawings.MAX_COORDINATE`), and so is every point
and every entry of the transforms once composed: squares and cubes of
larger numbers (areas, volumes, moments) overflow, so they are refused with
the allowed range.

Coordinates
-----------
SVG's y axis points down the page. The profile's y axis points up, so the
reader flips it: a point (x, y) of the drawing becomes (x, -y), and the
drawing's up is the profile's +y (an arc's turn is mirrored with it). The
``transform`` attributes of the path and of the groups around it
(``matrix``, ``translate``, ``scale``, ``rotate``, ``skewX``, ``skewY``)
are applied first. A transform in a ``style`` attribute and a path inside a
nested ``<svg>`` viewport are refused.

Units: coordinates are user units. When the root ``<svg>`` states its size
in physical units (``width="210mm"`` with a ``viewBox``), a user unit is
that size over the viewBox width, and the coordinates are scaled into the
width's unit (``mm``, ``cm`` or ``in``; ``pt``, ``pc`` and ``px`` become
inches, ``Q`` millimetres). Otherwise user units are taken to be the
``unit`` given (default ``mm``). A ``unit`` that disagrees with a stated
size is refused.

The XML is read with :mod:`xml.etree.ElementTree` after a first pass with
expat that refuses any entity declaration and any DTD internal subset (an
"entity bomb" expands without limit); a plain ``<!DOCTYPE svg PUBLIC ...>``
is allowed (no DTD is ever fetched, and with no declarations there is no
entity to expand -- what defusedxml guards against, with line numbers for
messages besides). The file is at most :data:`MAX_SVG_BYTES`, with at most
:data:`MAX_ELEMENTS` elements nested at most :data:`MAX_DEPTH` deep.

Examples
--------
>>> doc, report = path_data_profile("M 0 10 H 40 V 20 A 10 10 0 0 1 30 30 H 0 Z", unit="mm")
>>> [seg.kind for seg in doc.profile.loops[0].segments]
['line', 'line', 'arc', 'line', 'line']
>>> arc = doc.profile.loops[0].segments[2]
>>> arc.start, arc.end, arc.centre, arc.clockwise
((40.0, -20.0), (30.0, -30.0), (30.0, -20.0), True)
>>> [c.letter for c in parse_path_data("m1.5.5-1-2z")], parse_path_data("m1.5.5-1-2z")[1].args
(['m', 'l', 'z'], (Fraction(-1, 1), Fraction(-2, 1)))
>>> path_data_profile("M 0 0 L 10 0 Q 5", file="part.svgpath")
Traceback (most recent call last):
...
revolve.errors.FormatError: part.svgpath: path data: character 17: expected the curve's control point y after "Q", got the end of the path data
'''

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from fractions import Fraction
from typing import Any, Dict, List, Optional, Sequence, Tuple, Union

from revolve.errors import FormatError
from revolve.formats.document import ProfileDocument
from revolve.formats.drawings import (MAX_COORDINATE, DrawingReport, Skipped, check_file_size,
                                      check_no_crossings, one_line, separate_strays,
                                      summarise_paths)
from revolve.formats.files import read_text
from revolve.formats.values import check_length_unit
from revolve.geometry.profile import Chain, Loop, Profile
from revolve.geometry.segments import (Line, Where, arc_from_centre, arc_from_radius,
                                       curve_from_expressions)

Number = Union[Fraction, float]
Point = Tuple[Number, Number]
#: An affine map (a, b, c, d, e, f): x' = a x + c y + e, y' = b x + d y + f (SVG's order).
Affine = Tuple[Number, Number, Number, Number, Number, Number]

IDENTITY: Affine = (Fraction(1), Fraction(0), Fraction(0), Fraction(1), Fraction(0), Fraction(0))
#: SVG's y axis points down; the profile's up: (x, y) -> (x, -y).
FLIP_Y: Affine = (Fraction(1), Fraction(0), Fraction(0), Fraction(-1), Fraction(0), Fraction(0))

#: Longest number literal accepted, and the largest decimal exponent.
MAX_LITERAL = 40
MAX_EXPONENT = 99
#: Rational curve coefficients larger than this (numerator or denominator) are written as floats.
MAX_EXACT_DIGITS = 25

_WSP = " \t\n\r\f"
_NUMBER = re.compile(r"[+-]?(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]+)?")
_ARGUMENTS = {
    "M": ("the move's x", "the move's y"),
    "L": ("the line's end point x", "the line's end point y"),
    "H": ("the line's end x",),
    "V": ("the line's end y",),
    "C": ("the curve's first control point x", "the curve's first control point y",
          "the curve's second control point x", "the curve's second control point y",
          "the curve's end point x", "the curve's end point y"),
    "S": ("the curve's second control point x", "the curve's second control point y",
          "the curve's end point x", "the curve's end point y"),
    "Q": ("the curve's control point x", "the curve's control point y",
          "the curve's end point x", "the curve's end point y"),
    "T": ("the curve's end point x", "the curve's end point y"),
    "A": ("the arc's x radius", "the arc's y radius", "the arc's x-axis rotation",
          "the arc's large-arc flag (0 or 1)", "the arc's sweep flag (0 or 1)",
          "the arc's end point x", "the arc's end point y"),
    "Z": (),
}
_FLAGS = {"the arc's large-arc flag (0 or 1)", "the arc's sweep flag (0 or 1)"}


@dataclass(frozen=True)
class PathCommand:
    """One command of path data with its numbers.

    ``letter`` is as written (or ``L``/``l`` for the implicit linetos after a
    moveto, and the same letter again for a repetition); ``position`` is the
    1-based character where it starts; ``implicit`` says whether the letter
    was left out.
    """

    letter: str
    args: Tuple[Fraction, ...]
    position: int
    implicit: bool = False


class PathDataError(ValueError):
    """A syntax error in path data, at a 1-based character position."""

    def __init__(self, message: str, position: int):
        super().__init__(message)
        self.message = message
        self.position = position


def _shown(text: str, pos: int) -> str:
    if pos >= len(text):
        return "the end of the path data"
    piece = one_line(text[pos:pos + 12])
    return '"' + piece + ('..."' if len(text) > pos + 12 else '"')


def decimal_fraction(text: str) -> Fraction:
    """The exact value of a decimal literal such as ``-1.5e-3``, with size limits.

    >>> decimal_fraction("-1.5e-3"), decimal_fraction(".5"), decimal_fraction("7.")
    (Fraction(-3, 2000), Fraction(1, 2), Fraction(7, 1))
    >>> decimal_fraction("1e400")
    Traceback (most recent call last):
    ...
    ValueError: the exponent of 1e400 is beyond 99
    >>> decimal_fraction("2e15")
    Traceback (most recent call last):
    ...
    ValueError: the number 2e15 is outside the range read (-1e+15 to 1e+15); squares and cubes of larger numbers overflow
    """
    if len(text) > MAX_LITERAL:
        raise ValueError(f"the number {text[:20]}... is longer than {MAX_LITERAL} characters")
    mantissa, _, exponent = text.lower().partition("e")
    power = int(exponent) if exponent else 0
    if abs(power) > MAX_EXPONENT:
        raise ValueError(f"the exponent of {text} is beyond {MAX_EXPONENT}")
    sign = -1 if mantissa.startswith("-") else 1
    mantissa = mantissa.lstrip("+-")
    whole, _, decimals = mantissa.partition(".")
    digits = int((whole or "0") + decimals)
    power -= len(decimals)
    value = Fraction(digits * 10 ** power) if power >= 0 else Fraction(digits, 10 ** -power)
    if value > MAX_COORDINATE:
        raise ValueError(f"the number {text} is outside the range read ({-MAX_COORDINATE:g} to "
                         f"{MAX_COORDINATE:g}); squares and cubes of larger numbers overflow")
    return sign * value


class _Scanner:
    """Reads path data (and transform lists) one token at a time."""

    def __init__(self, text: str):
        self.text = text
        self.pos = 0

    def at_end(self) -> bool:
        return self.pos >= len(self.text)

    def peek(self) -> str:
        return self.text[self.pos] if self.pos < len(self.text) else ""

    def skip_wsp(self) -> None:
        text, n = self.text, len(self.text)
        while self.pos < n and text[self.pos] in _WSP:
            self.pos += 1

    def skip_comma_wsp(self) -> bool:
        """Skip ``wsp* ,? wsp*``; True when a comma was skipped."""
        self.skip_wsp()
        if self.peek() == ",":
            self.pos += 1
            self.skip_wsp()
            return True
        return False

    def at_number(self) -> bool:
        ch = self.peek()
        return ch != "" and ch in "+-.0123456789"

    def number(self, what: str, after: str) -> Fraction:
        m = _NUMBER.match(self.text, self.pos)
        if m is None:
            raise PathDataError(f'expected {what} after "{after}", got '
                                f"{_shown(self.text, self.pos)}", self.pos + 1)
        try:
            value = decimal_fraction(m.group())
        except ValueError as exc:
            raise PathDataError(str(exc), self.pos + 1) from None
        self.pos = m.end()
        return value

    def flag(self, what: str, after: str) -> Fraction:
        ch = self.peek()
        if ch not in ("0", "1") or ch == "":
            raise PathDataError(f'expected {what} after "{after}", got '
                                f"{_shown(self.text, self.pos)}", self.pos + 1)
        self.pos += 1
        return Fraction(int(ch))


def parse_path_data(d: str) -> Tuple[PathCommand, ...]:
    """Read SVG path data into commands, checking its grammar.

    Parameters
    ----------
    d : str
        The value of a ``d`` attribute.

    Returns
    -------
    tuple of PathCommand

    Raises
    ------
    PathDataError
        With the 1-based character position of the first error.

    Examples
    --------
    >>> [(c.letter, [str(a) for a in c.args]) for c in parse_path_data("M10,20l5-5h.5e1")]
    [('M', ['10', '20']), ('l', ['5', '-5']), ('h', ['5'])]
    >>> [str(a) for a in parse_path_data("M0 0a25 25 -30 1150-25")[1].args]
    ['25', '25', '-30', '1', '1', '50', '-25']
    >>> parse_path_data("")
    ()
    >>> parse_path_data("L 1 2")
    Traceback (most recent call last):
    ...
    revolve.formats.svg.PathDataError: path data must start with a moveto ("M" or "m"), got "L"
    >>> parse_path_data("M 1 2 Z 3")
    Traceback (most recent call last):
    ...
    revolve.formats.svg.PathDataError: "Z" takes no numbers, got "3"
    """
    s = _Scanner(d)
    s.skip_wsp()
    commands: List[PathCommand] = []
    if s.at_end():
        return ()
    if s.peek() not in "Mm":
        raise PathDataError(f'path data must start with a moveto ("M" or "m"), got '
                            f'"{one_line(s.peek())}"', s.pos + 1)
    while not s.at_end():
        letter = s.peek()
        if letter.upper() not in _ARGUMENTS or not letter.isalpha():
            raise PathDataError(f"expected a command letter (one of M L H V A C S Q T Z, or "
                                f"lower case), got {_shown(d, s.pos)}", s.pos + 1)
        position = s.pos + 1
        s.pos += 1
        names = _ARGUMENTS[letter.upper()]
        s.skip_wsp()
        if not names:
            commands.append(PathCommand(letter, (), position))
            if s.at_number() or s.peek() == ",":
                raise PathDataError(f'"{letter}" takes no numbers, got {_shown(d, s.pos)}',
                                    s.pos + 1)
            continue
        current, implicit = letter, False
        while True:
            args: List[Fraction] = []
            for k, name in enumerate(names):
                if k:
                    s.skip_comma_wsp()
                if name in _FLAGS:
                    args.append(s.flag(name, letter))
                else:
                    args.append(s.number(name, letter))
            commands.append(PathCommand(current, tuple(args), position, implicit))
            comma = s.skip_comma_wsp()
            if s.at_number():
                position = s.pos + 1
                implicit = True
                current = {"M": "L", "m": "l"}.get(letter, letter)
                continue
            if comma:
                raise PathDataError(f"a comma must be followed by a number, got "
                                    f"{_shown(d, s.pos)}", s.pos + 1)
            break
    return tuple(commands)


# -- affine maps ---------------------------------------------------------------------------

def compose(outer: Affine, inner: Affine) -> Affine:
    """The map applying ``inner`` first, then ``outer``.

    >>> compose(FLIP_Y, (Fraction(2), 0, 0, Fraction(2), Fraction(1), Fraction(1)))[3:]
    (Fraction(-2, 1), Fraction(1, 1), Fraction(-1, 1))
    """
    a1, b1, c1, d1, e1, f1 = outer
    a2, b2, c2, d2, e2, f2 = inner
    return (a1 * a2 + c1 * b2, b1 * a2 + d1 * b2, a1 * c2 + c1 * d2, b1 * c2 + d1 * d2,
            a1 * e2 + c1 * f2 + e1, b1 * e2 + d1 * f2 + f1)


def apply(m: Affine, p: Point) -> Point:
    """Image of a point.

    >>> apply(FLIP_Y, (Fraction(1), Fraction(2)))
    (Fraction(1, 1), Fraction(-2, 1))
    """
    a, b, c, d, e, f = m
    return (a * p[0] + c * p[1] + e, b * p[0] + d * p[1] + f)


def _cos_sin_degrees(angle: Fraction) -> Tuple[Number, Number]:
    """cos and sin of an angle in degrees, exact at multiples of 90."""
    if angle % 90 == 0:
        k = int(angle // 90) % 4
        return [(Fraction(1), Fraction(0)), (Fraction(0), Fraction(1)),
                (Fraction(-1), Fraction(0)), (Fraction(0), Fraction(-1))][k]
    r = math.radians(float(angle))
    return math.cos(r), math.sin(r)


def _tan_degrees(angle: Fraction) -> Number:
    if angle % 180 == 0:
        return Fraction(0)
    if (angle - 45) % 180 == 0:
        return Fraction(1)
    if (angle + 45) % 180 == 0:
        return Fraction(-1)
    if (angle - 90) % 180 == 0:
        raise ValueError(f"a skew of {angle} degrees is infinite")
    return math.tan(math.radians(float(angle)))


_TRANSFORM_ARITY = {"matrix": (6,), "translate": (1, 2), "scale": (1, 2), "rotate": (1, 3),
                    "skewX": (1,), "skewY": (1,)}


def parse_transform(text: str) -> Affine:
    """Read an SVG ``transform`` attribute (a list of transforms, applied right to left).

    Raises
    ------
    PathDataError
        For anything outside the grammar, with the character position.

    Examples
    --------
    >>> parse_transform("translate(10) scale(2, 3)")
    (Fraction(2, 1), Fraction(0, 1), Fraction(0, 1), Fraction(3, 1), Fraction(10, 1), Fraction(0, 1))
    >>> parse_transform("rotate(90 1 1)")[4:]
    (Fraction(2, 1), Fraction(0, 1))
    >>> parse_transform("perspective(3)")
    Traceback (most recent call last):
    ...
    revolve.formats.svg.PathDataError: unknown transform "perspective"; matrix, translate, scale, rotate, skewX and skewY are read
    """
    s = _Scanner(text)
    total = IDENTITY
    s.skip_wsp()
    while not s.at_end():
        start = s.pos
        m = re.compile(r"[A-Za-z]+").match(text, s.pos)
        if m is None:
            raise PathDataError(f"expected a transform such as translate(...), got "
                                f"{_shown(text, s.pos)}", s.pos + 1)
        name = m.group()
        if name not in _TRANSFORM_ARITY:
            raise PathDataError(f'unknown transform "{name}"; matrix, translate, scale, rotate, '
                                "skewX and skewY are read", start + 1)
        s.pos = m.end()
        s.skip_wsp()
        if s.peek() != "(":
            raise PathDataError(f'expected "(" after "{name}", got {_shown(text, s.pos)}',
                                s.pos + 1)
        s.pos += 1
        s.skip_wsp()
        args: List[Fraction] = []
        while s.peek() != ")":
            if args:
                s.skip_comma_wsp()
            args.append(s.number("a number or \")\"", name))
            s.skip_wsp()
            if s.at_end():
                raise PathDataError(f'the transform "{name}" is not closed by ")"', s.pos + 1)
        s.pos += 1
        if len(args) not in _TRANSFORM_ARITY[name]:
            counts = " or ".join(str(n) for n in _TRANSFORM_ARITY[name])
            raise PathDataError(f'"{name}" takes {counts} numbers, got {len(args)}', start + 1)
        try:
            total = compose(total, _one_transform(name, args))
            _check_affine(total)
        except ValueError as exc:
            raise PathDataError(str(exc), start + 1) from None
        s.skip_comma_wsp()
    return total


def _check_affine(m: Affine) -> None:
    """Refuse a map whose entries are beyond :data:`MAX_COORDINATE` (it would overflow)."""
    if any(abs(v) > MAX_COORDINATE for v in m):
        raise ValueError(f"the transforms together scale or move by more than "
                         f"{MAX_COORDINATE:g}; squares and cubes of larger numbers overflow")


def _one_transform(name: str, v: Sequence[Fraction]) -> Affine:
    one, zero = Fraction(1), Fraction(0)
    if name == "matrix":
        return tuple(v)  # type: ignore[return-value]
    if name == "translate":
        return (one, zero, zero, one, v[0], v[1] if len(v) > 1 else zero)
    if name == "scale":
        sy = v[1] if len(v) > 1 else v[0]
        return (v[0], zero, zero, sy, zero, zero)
    if name == "rotate":
        c, s = _cos_sin_degrees(v[0])
        rot = (c, s, -s, c, zero, zero)
        if len(v) == 3:
            cx, cy = v[1], v[2]
            rot = compose((one, zero, zero, one, cx, cy), compose(rot, (one, zero, zero, one,
                                                                        -cx, -cy)))
        return rot
    if name == "skewX":
        return (one, zero, _tan_degrees(v[0]), one, zero, zero)
    return (one, _tan_degrees(v[0]), zero, one, zero, zero)


# -- from commands to segments in SVG user coordinates ---------------------------------

@dataclass
class _Subpath:
    """One subpath of an SVG path being read: where it starts, its items, whether it closes."""

    start: Point
    position: int
    items: List[tuple]
    closed: bool = False


def _subpaths(commands: Sequence[PathCommand]) -> List[_Subpath]:
    """Drawing items per subpath, in user coordinates, reflections resolved."""
    subpaths: List[_Subpath] = []
    current: Point = (Fraction(0), Fraction(0))
    sub: Optional[_Subpath] = None
    last_cubic: Optional[Point] = None
    last_quad: Optional[Point] = None
    for cmd in commands:
        letter, a, pos = cmd.letter, cmd.args, cmd.position
        rel = letter.islower()
        up = letter.upper()
        ox, oy = current if rel else (Fraction(0), Fraction(0))
        cubic_ctrl = quad_ctrl = None
        if up == "M":
            current = (ox + a[0], oy + a[1])
            sub = _Subpath(current, pos, [])
            subpaths.append(sub)
        elif up == "Z":
            if sub is not None and not sub.closed:
                if current != sub.start:
                    sub.items.append(("close", current, sub.start, pos, letter))
                sub.closed = True
                current = sub.start
        else:
            if sub is None or sub.closed:  # a drawing command after Z starts a new subpath
                sub = _Subpath(current, pos, [])
                subpaths.append(sub)
            p0 = current
            if up == "L":
                end = (ox + a[0], oy + a[1])
                sub.items.append(("line", p0, end, pos, letter))
            elif up == "H":
                end = (ox + a[0], p0[1])
                sub.items.append(("line", p0, end, pos, letter))
            elif up == "V":
                end = (p0[0], oy + a[0])
                sub.items.append(("line", p0, end, pos, letter))
            elif up in "CS":
                if up == "C":
                    c1 = (ox + a[0], oy + a[1])
                    rest = a[2:]
                else:
                    c1 = (2 * p0[0] - last_cubic[0], 2 * p0[1] - last_cubic[1]) \
                        if last_cubic is not None else p0
                    rest = a
                c2 = (ox + rest[0], oy + rest[1])
                end = (ox + rest[2], oy + rest[3])
                sub.items.append(("cubic", p0, c1, c2, end, pos, letter))
                cubic_ctrl = c2
            elif up in "QT":
                if up == "Q":
                    c1 = (ox + a[0], oy + a[1])
                    rest = a[2:]
                else:
                    c1 = (2 * p0[0] - last_quad[0], 2 * p0[1] - last_quad[1]) \
                        if last_quad is not None else p0
                    rest = a
                end = (ox + rest[0], oy + rest[1])
                sub.items.append(("quad", p0, c1, end, pos, letter))
                quad_ctrl = c1
            else:  # A
                end = (ox + a[5], oy + a[6])
                sub.items.append(("arc", p0, a[0], a[1], a[2], bool(a[3]), bool(a[4]), end, pos,
                                  letter))
            current = end
        last_cubic, last_quad = cubic_ctrl, quad_ctrl
    return subpaths


# -- segments in profile coordinates ---------------------------------------------------

def _exact(*values) -> bool:
    return all(isinstance(v, Fraction) for v in values)


def _floats(p: Point) -> Tuple[float, float]:
    return (float(p[0]), float(p[1]))


def _coefficient(value: Number):
    """An exact tree number for a small fraction, else the nearest float (and whether exact)."""
    from revolve.expr import Num

    if isinstance(value, Fraction):
        if max(abs(value.numerator), value.denominator) < 10 ** MAX_EXACT_DIGITS:
            return Num(value), True
        value = float(value)
    return Num(float(value)), False


def _polynomial(coefficients: Sequence[Number]):
    """Sum of c_k t^k as an expression tree, and whether every c_k stayed exact.

    >>> tree, exact = _polynomial([Fraction(1), Fraction(0), Fraction(-3, 2)])
    >>> tree.text(), exact
    ('1 - 3/2*t^2', True)
    """
    from revolve.expr import ZERO, Var

    t = Var("t")
    out, exact = ZERO, True
    for k, c in enumerate(coefficients):
        if c == 0:
            continue
        value, ok = _coefficient(c)
        exact = exact and ok
        out = out + value * t ** k
    return out, exact


def _straight(points: Sequence[Point]) -> bool:
    """Whether every control point lies on the chord between the ends (exact for Fractions)."""
    p0, p1 = points[0], points[-1]
    dx, dy = p1[0] - p0[0], p1[1] - p0[1]
    length2 = dx * dx + dy * dy
    if length2 == 0:
        return False
    exact = all(_exact(*p) for p in points)
    scale = math.sqrt(float(length2))
    for q in points[1:-1]:
        qx, qy = q[0] - p0[0], q[1] - p0[1]
        cross = dx * qy - dy * qx
        along = (dx * qx + dy * qy) / length2
        if exact:
            if cross != 0 or not (0 <= along <= 1):
                return False
        elif abs(float(cross)) > 1e-12 * scale * scale or not (-1e-12 <= float(along) <= 1 + 1e-12):
            return False
    return True


class _Builder:
    """Turns drawing items into segments through the affine map to profile coordinates."""

    def __init__(self, matrix: Affine, file: Optional[str], line: Optional[int], label: str):
        self.m = matrix
        self.file, self.line, self.label = file, line, label
        self.exact = True
        self.notes: List[str] = []
        self.straight_beziers = 0
        self.ellipses = 0
        a, b, c, d = matrix[:4]
        self.det = a * d - b * c
        if self.det == 0:
            raise FormatError("the transform flattens the drawing onto a line (its determinant "
                              "is zero)", file=file, line=line, place=label.rstrip(", ") or None)

    def where(self, subpath: int, letter: str, pos: int) -> Where:
        if pos <= 0:  # a shape element's own outline: its parts are counted, not positioned
            return Where(self.file, self.line, f"{self.label}part {-pos}")
        return Where(self.file, self.line, f"{self.label}subpath {subpath}, {letter} at "
                                           f"character {pos}")

    def mapped(self, p: Point, where: Where) -> Point:
        """``p`` in the profile's coordinates, refused beyond :data:`MAX_COORDINATE`."""
        q = apply(self.m, p)
        if abs(q[0]) > MAX_COORDINATE or abs(q[1]) > MAX_COORDINATE:
            raise FormatError(f"a point lands at ({float(q[0]):.3g}, {float(q[1]):.3g}), outside "
                              f"the range read ({-MAX_COORDINATE:g} to {MAX_COORDINATE:g} in the "
                              "profile's unit); squares and cubes of larger numbers overflow",
                              file=where.file, line=where.line, place=where.place)
        return q

    def line_segment(self, p0: Point, p1: Point, where: Where) -> Optional[Line]:
        q0, q1 = self.mapped(p0, where), self.mapped(p1, where)
        if q0 == q1:
            return None
        exact = (q0 + q1) if _exact(*q0, *q1) else None
        self.exact = self.exact and exact is not None
        return Line(_floats(q0), _floats(q1), where=where, exact=exact)

    def bezier(self, control: Sequence[Point], where: Where):
        q = [self.mapped(p, where) for p in control]
        if all(p == q[0] for p in q):
            return None
        if _straight(q):
            self.straight_beziers += 1
            return self.line_segment(control[0], control[-1], where)
        if len(q) == 3:
            (x0, y0), (x1, y1), (x2, y2) = q
            cx = (x0, 2 * (x1 - x0), x0 - 2 * x1 + x2)
            cy = (y0, 2 * (y1 - y0), y0 - 2 * y1 + y2)
        else:
            (x0, y0), (x1, y1), (x2, y2), (x3, y3) = q
            cx = (x0, 3 * (x1 - x0), 3 * (x0 - 2 * x1 + x2), x3 - x0 + 3 * (x1 - x2))
            cy = (y0, 3 * (y1 - y0), 3 * (y0 - 2 * y1 + y2), y3 - y0 + 3 * (y1 - y2))
        x_expr, ex = _polynomial(cx)
        y_expr, ey = _polynomial(cy)
        self.exact = self.exact and ex and ey
        return curve_from_expressions(x_expr, y_expr, 0, 1, where=where,
                                      exact=(Fraction(0), Fraction(1)))

    def arc(self, p0: Point, rx: Fraction, ry: Fraction, rotation: Fraction, large: bool,
            sweep: bool, p1: Point, where: Where):
        """The SVG implementation notes, F.6.2 (out-of-range parameters) and F.6.5 (centre form)."""
        if p0 == p1:
            self.notes.append(f"{where.place}: an arc ending where it starts draws nothing "
                              "and was left out")
            return None
        rx, ry = abs(rx), abs(ry)
        if rx == 0 or ry == 0:
            self.notes.append(f"{where.place}: an arc with a zero radius is a straight line")
            return self.line_segment(p0, p1, where)
        self.mapped(p0, where), self.mapped(p1, where)
        if max(rx, ry) * max(abs(v) for v in self.m[:4]) > MAX_COORDINATE:
            raise FormatError(f"the arc's radii ({float(rx):.3g}, {float(ry):.3g}) are beyond "
                              f"the range read ({MAX_COORDINATE:g} in the profile's unit); "
                              "squares and cubes of larger numbers overflow", file=where.file,
                              line=where.line, place=where.place)
        cphi, sphi = _cos_sin_degrees(rotation % 360)
        hx, hy = (p0[0] - p1[0]) / 2, (p0[1] - p1[1]) / 2
        x1p = cphi * hx + sphi * hy
        y1p = -sphi * hx + cphi * hy
        # F.6.6: radii too small for the chord are scaled up until they just reach.
        if rx == ry:  # a circle: lambda is (half the chord / r)^2, exact whatever the rotation
            lam = (hx * hx + hy * hy) / (rx * rx)
        else:
            lam = x1p * x1p / (rx * rx) + y1p * y1p / (ry * ry)
        scaled = lam >= 1
        frx, fry = float(rx), float(ry)
        if lam > 1:
            root = math.sqrt(float(lam))
            frx, fry = frx * root, fry * root
        fx1p, fy1p = float(x1p), float(y1p)
        # F.6.5.2 divided through by rx² ry², so that tiny or huge radii neither underflow
        # nor overflow: with u = x1'/rx, v = y1'/ry the factor is sqrt((1 - u² - v²)/(u² + v²)).
        u, v = fx1p / frx, fy1p / fry
        reach = u * u + v * v
        coef = math.sqrt(max((1 - reach) / reach, 0.0)) if not scaled and reach > 0 else 0.0
        if large == sweep:
            coef = -coef
        cxp, cyp = coef * frx * v, -coef * fry * u
        fc, fs = float(cphi), float(sphi)
        centre = (fc * cxp - fs * cyp + float(p0[0] + p1[0]) / 2,
                  fs * cxp + fc * cyp + float(p0[1] + p1[1]) / 2)

        def angle(ux, uy, vx, vy):
            return math.atan2(ux * vy - uy * vx, ux * vx + uy * vy)

        ux, uy = (fx1p - cxp) / frx, (fy1p - cyp) / fry
        vx, vy = (-fx1p - cxp) / frx, (-fy1p - cyp) / fry
        theta1 = angle(1.0, 0.0, ux, uy)
        dtheta = angle(ux, uy, vx, vy)
        if not sweep and dtheta > 0:
            dtheta -= 2 * math.pi
        elif sweep and dtheta < 0:
            dtheta += 2 * math.pi
        # The ellipse p(θ) = centre + R(φ) diag(rx, ry) (cos θ, sin θ), mapped to the profile.
        a, b, c, d, e, f = (float(v) for v in self.m)
        r00, r01, r10, r11 = fc * frx, -fs * fry, fs * frx, fc * fry
        m00, m01 = a * r00 + c * r10, a * r01 + c * r11
        m10, m11 = b * r00 + d * r10, b * r01 + d * r11
        col0, col1 = math.hypot(m00, m10), math.hypot(m01, m11)
        dot = m00 * m01 + m10 * m11
        q0, q1 = apply(self.m, p0), apply(self.m, p1)
        fq0, fq1 = _floats(q0), _floats(q1)
        counter_clockwise = (dtheta > 0) == (float(self.det) > 0)
        if rx == ry and abs(col0 - col1) <= 1e-12 * max(col0, col1) and \
                abs(dot) <= 1e-12 * col0 * col1:
            return self._circular(q0, q1, fq0, fq1, rx, scaled, counter_clockwise, large,
                                  col0, where)
        self.ellipses += 1
        self.exact = False
        cx = a * centre[0] + c * centre[1] + e
        cy = b * centre[0] + d * centre[1] + f
        from revolve.expr import Num, Var, call

        t = Var("t")
        cos_t, sin_t = call("cos", (t,)), call("sin", (t,))
        sign = 1.0
        t0, t1 = theta1, theta1 + dtheta
        if dtheta < 0:  # run t upwards: θ = -t
            sign, t0, t1 = -1.0, -theta1, -(theta1 + dtheta)
        x_expr = Num(float(cx)) + Num(float(m00)) * cos_t + Num(sign * m01) * sin_t
        y_expr = Num(float(cy)) + Num(float(m10)) * cos_t + Num(sign * m11) * sin_t
        return curve_from_expressions(x_expr, y_expr, t0, t1, where=where)

    def _circular(self, q0, q1, fq0, fq1, rx, scaled, ccw, large, radius, where):
        exact = _exact(*q0, *q1)
        if scaled:
            # The radius just reaches: a half circle about the chord's midpoint.
            mid = ((q0[0] + q1[0]) / 2, (q0[1] + q1[1]) / 2)
            ex = ("centre", q0, q1, mid, not ccw) if exact and _exact(*mid) else None
            self.exact = self.exact and ex is not None
            return arc_from_centre(fq0, fq1, _floats(mid), clockwise=not ccw, where=where,
                                   exact=ex)
        side = "right" if ccw else "left"
        r_exact = None
        a, b = self.m[0], self.m[1]
        if exact and _exact(a, b, rx):
            scale = _rational_sqrt(a * a + b * b)
            if scale is not None:
                r_exact = rx * scale
        ex = ("radius", q0, q1, r_exact, side, bool(large)) if r_exact is not None else None
        self.exact = self.exact and ex is not None
        return arc_from_radius(fq0, fq1, float(r_exact) if r_exact is not None else radius,
                               side=side, major=bool(large), where=where, exact=ex)


def _rational_sqrt(value: Fraction) -> Optional[Fraction]:
    """The exact square root of a fraction when it is rational.

    >>> _rational_sqrt(Fraction(9, 4)), _rational_sqrt(Fraction(2))
    (Fraction(3, 2), None)
    """
    n, d = value.numerator, value.denominator
    rn, rd = math.isqrt(n), math.isqrt(d)
    if rn * rn == n and rd * rd == d:
        return Fraction(rn, rd)
    return None


def path_profile(commands: Sequence[PathCommand], *, matrix: Affine = FLIP_Y,
                 unit: str = "mm", file: Optional[str] = None, line: Optional[int] = None,
                 label: str = "") -> Tuple[Profile, List[str], List[str], List[str], bool]:
    """Loops and chains of parsed path data, mapped to profile coordinates by ``matrix``.

    Returns the profile, each path's source and kind ("loop"/"chain"), notes,
    and whether every segment kept exact inputs.
    """
    builder = _Builder(matrix, file, line, label)
    loops, chains, sources, kinds, notes = [], [], [], [], []
    order: List[Tuple[str, int]] = []
    for k, sub in enumerate(_subpaths(commands), 1):
        segments = []
        for item in sub.items:
            command, pos, letter = item[0], item[-2], item[-1]
            where = builder.where(k, f'"{letter}"', pos)
            if command in ("line", "close"):
                seg = builder.line_segment(item[1], item[2], where)
                if seg is None and command == "line":
                    notes.append(f"{where.place}: a line of zero length was left out")
            elif command == "cubic":
                seg = builder.bezier(item[1:5], where)
                if seg is None:
                    notes.append(f"{where.place}: a curve of zero size was left out")
            elif command == "quad":
                seg = builder.bezier(item[1:4], where)
                if seg is None:
                    notes.append(f"{where.place}: a curve of zero size was left out")
            else:
                seg = builder.arc(*item[1:8], where=where)
            if seg is not None:
                segments.append(seg)
        source = f"subpath {k} (character {sub.position})" if sub.position > 0 else "outline"
        if not segments:
            continue
        first, last = segments[0].start, segments[-1].end
        closed = sub.closed or (not sub.closed and _ends_meet(sub))
        if closed and not sub.closed:
            notes.append(f"{label}subpath {k} ends where it starts without a Z; it is read as "
                         "a closed loop")
        where = Where(file, line, f"{label}subpath {k}")
        if closed:
            loops.append(Loop(tuple(segments), where=where))
            order.append(("loop", len(loops) - 1))
        else:
            chains.append(Chain(tuple(segments), where=where))
            order.append(("chain", len(chains) - 1))
        sources.append(source)
        kinds.append("loop" if closed else "chain")
        del first, last
    notes = builder.notes + notes
    if builder.straight_beziers:
        notes.append(f"{builder.straight_beziers} Bézier curve(s) with every control point on "
                     "the chord were read as straight lines")
    if builder.ellipses:
        notes.append(f"{builder.ellipses} elliptical arc(s) were read as parametric curves")
    # sources in the order of Profile.paths: loops first, then chains
    loop_src = [s for s, k in zip(sources, kinds) if k == "loop"]
    chain_src = [s for s, k in zip(sources, kinds) if k == "chain"]
    profile = Profile(loops=tuple(loops), chains=tuple(chains), unit=unit, file=file)
    return (profile, loop_src + chain_src, ["loop"] * len(loop_src) + ["chain"] * len(chain_src),
            notes, builder.exact)


def _ends_meet(sub: _Subpath) -> bool:
    if not sub.items:
        return False
    last = sub.items[-1]
    end = last[2] if last[0] in ("line", "close") else last[-3]
    return end == sub.start


# -- public readers ----------------------------------------------------------------------

def _located(exc: PathDataError, file, line, label) -> FormatError:
    return FormatError(f"character {exc.position}: {exc.message}", file=file, line=line,
                       place=(label + "path data").rstrip(", ") if label else "path data")


def _assemble(parts, *, unit: str, file: Optional[str], kind: str, unit_source: str,
              extra_notes: Sequence[str], skipped: Sequence[Skipped] = (),
              keep_strays: bool = False, nothing: Optional[FormatError] = None
              ) -> Tuple[ProfileDocument, DrawingReport]:
    """One profile from the pieces of one or more paths or shapes; strays left out unless kept.

    ``parts`` holds ``(profile, sources, kinds, notes, exact, label)`` of each
    element, from :func:`path_profile`.
    """
    loops, chains, loop_src, chain_src, notes = [], [], [], [], []
    exact = True
    for profile, sources, kinds, part_notes, part_exact, label in parts:
        for path, source, what in zip(profile.paths, sources, kinds):
            (loops if what == "loop" else chains).append(path)
            (loop_src if what == "loop" else chain_src).append(f"{label}{source}")
        notes.extend(n for n in part_notes if n not in notes)
        exact = exact and part_exact
    profile = Profile(loops=tuple(loops), chains=tuple(chains), unit=unit, file=file)
    if not profile.paths:
        raise nothing
    check_no_crossings(profile, file=file)
    profile, sources, kinds, warnings = separate_strays(profile, loop_src + chain_src,
                                                        keep=keep_strays)
    found_loops, found_chains = summarise_paths(profile, sources, kinds)
    all_notes = list(extra_notes) + ["SVG's y axis points down: the profile's y is the "
                                     "drawing's -y, so the drawing's up is +y"] + notes
    report = DrawingReport(source=file or "path data", kind=kind, unit=unit,
                           unit_source=unit_source, loops=found_loops, chains=found_chains,
                           skipped=tuple(skipped), notes=tuple(all_notes),
                           warnings=tuple(warnings))
    return ProfileDocument(profile=profile, exact=exact), report


def path_data_profile(d: str, *, unit: Optional[str] = None, file: Optional[str] = None,
                      line: Optional[int] = None, label: str = "",
                      matrix: Optional[Affine] = None, kind: str = "SVG path data",
                      unit_source: Optional[str] = None,
                      extra_notes: Sequence[str] = (), keep_strays: bool = False
                      ) -> Tuple[ProfileDocument, DrawingReport]:
    """A profile from SVG path data (a ``d`` string).

    Parameters
    ----------
    d : str
        The path data.
    unit : str, optional
        Length unit of a user unit, default ``"mm"``.
    file, line : optional
        Where the path data came from, for messages.
    label : str, optional
        Words naming the path in messages (``"path 'outline', "``).
    matrix : Affine, optional
        Map from user coordinates to the profile's; default :data:`FLIP_Y`.
    keep_strays : bool
        Keep subpaths not joined to the main outline (see
        :func:`revolve.formats.drawings.separate_strays`); they are warned
        about either way.

    Returns
    -------
    (ProfileDocument, DrawingReport)

    Raises
    ------
    FormatError
        A syntax error (with its character position), a number beyond the
        range read, or path data drawing nothing.
    ProfileError
        Subpaths that cross or touch.

    Examples
    --------
    >>> doc, report = path_data_profile("M0,0 c 10,0 10,10 0,10 z m 20 0 h 5 v 5")
    >>> [p.describe() for p in report.loops + report.chains]
    ['loop 1: 1 line, 1 curve; from subpath 1 (character 1)']
    >>> report.warnings     # doctest: +ELLIPSIS
    ('chain 1 (from subpath 2 (character 26)) is not joined to the main outline ...',)
    >>> doc.profile.loops[0].segments[0].y_expr
    20*t**3 - 30*t**2
    >>> path_data_profile("M 5 5 M 6 6")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: path data: the path data draws nothing (it only moves); give at least one line, arc or curve
    """
    if unit_source is None:
        unit_source = "given" if unit else "assumed: path data cannot say"
    unit = unit or "mm"
    check_length_unit(unit, Where(file, line))
    try:
        commands = parse_path_data(d)
    except PathDataError as exc:
        raise _located(exc, file, line, label) from None
    part = path_profile(commands, matrix=FLIP_Y if matrix is None else matrix, unit=unit,
                        file=file, line=line, label=label)
    nothing = FormatError("the path data draws nothing (it only moves); give at least one line, "
                          "arc or curve", file=file, line=line,
                          place=(label + "path data") if label else "path data")
    return _assemble([part + ("",)], unit=unit, file=file, kind=kind, unit_source=unit_source,
                     extra_notes=extra_notes, keep_strays=keep_strays, nothing=nothing)


def read_path_data_file(path: str, *, unit: Optional[str] = None, keep_strays: bool = False
                        ) -> Tuple[ProfileDocument, DrawingReport]:
    """Read a file whose whole text is SVG path data (ending ``.svgpath``).

    >>> read_path_data_file("nowhere.svgpath")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: nowhere.svgpath: no such file; check the name and folder
    """
    check_file_size(path, MAX_SVG_BYTES)
    text = read_text(path)
    return path_data_profile(text, unit=unit, file=path, keep_strays=keep_strays)


# -- SVG files ---------------------------------------------------------------------------

#: Largest SVG file read (bytes), most elements, and deepest nesting of elements.
MAX_SVG_BYTES = 16 * 1024 * 1024
MAX_ELEMENTS = 100_000
MAX_DEPTH = 200


def _local(tag: str) -> str:
    return tag.rsplit("}", 1)[-1].rsplit(":", 1)[-1]


class _Refused(Exception):
    def __init__(self, message: str, line: int):
        super().__init__(message)
        self.message, self.line = message, line


def parse_svg_xml(text: str, file: Optional[str] = None):
    """Parse SVG text safely: returns the root element and the line of every element in order.

    A first pass with expat refuses entity declarations and DTD internal
    subsets (nothing is ever expanded or fetched), more than
    :data:`MAX_ELEMENTS` elements and nesting deeper than :data:`MAX_DEPTH`,
    before :mod:`xml.etree.ElementTree` reads the text. The lines run over
    ``root.iter()`` (document order, the root first).

    Raises
    ------
    FormatError
        Not well-formed XML (with line and column), a refused declaration
        (naming the entity), too many or too deeply nested elements, or a
        root other than ``<svg>``.

    Examples
    --------
    >>> root, lines = parse_svg_xml('<svg xmlns="http://www.w3.org/2000/svg">\\n<path d="M0 0"/></svg>')
    >>> _local(root.tag), lines
    ('svg', [1, 2])
    >>> parse_svg_xml('<?xml version="1.0"?>\\n<!DOCTYPE svg [\\n<!ENTITY a "aaaa">\\n]>\\n<svg/>', "x.svg")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: x.svg:3: the file declares the XML entity "a" (line 3, column 12); entity declarations are refused because they can expand without limit; remove the DOCTYPE
    >>> parse_svg_xml("M 0 0 L 1 1", "x.svg")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: x.svg:1: this is not an SVG file: it is not well-formed XML (syntax error at line 1, column 1)
    >>> parse_svg_xml("<svg>" + "<g>" * 300 + "</g>" * 300 + "</svg>", "deep.svg")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: deep.svg:1: elements are nested more than 200 deep; flatten the groups
    """
    import xml.etree.ElementTree as ElementTree
    from xml.parsers import expat

    parser = expat.ParserCreate()
    lines: List[int] = []
    state: Dict[str, Any] = {"depth": 0}

    def doctype(name, system_id, public_id, has_internal_subset):
        state["subset"] = bool(has_internal_subset)
        state["doctype_line"] = parser.CurrentLineNumber

    def entity(name, is_parameter, *rest):
        raise _Refused(f'the file declares the XML entity "{one_line(name)}" (line '
                       f"{parser.CurrentLineNumber}, column {parser.CurrentColumnNumber + 1}); "
                       "entity declarations are refused because they can expand without limit; "
                       "remove the DOCTYPE", parser.CurrentLineNumber)

    def end_doctype():
        if state.get("subset"):
            line = state.get("doctype_line", parser.CurrentLineNumber)
            raise _Refused(f"the DOCTYPE (line {line}) has an internal subset of declarations; "
                           "it is refused for safety; remove it", line)

    def start(name, attributes):
        lines.append(parser.CurrentLineNumber)
        state["depth"] += 1
        if len(lines) > MAX_ELEMENTS:
            raise _Refused(f"the file has more than {MAX_ELEMENTS} elements; simplify it",
                           parser.CurrentLineNumber)
        if state["depth"] > MAX_DEPTH:
            raise _Refused(f"elements are nested more than {MAX_DEPTH} deep; flatten the groups",
                           parser.CurrentLineNumber)

    def end(name):
        state["depth"] -= 1

    parser.StartDoctypeDeclHandler = doctype
    parser.EndDoctypeDeclHandler = end_doctype
    parser.EntityDeclHandler = entity
    parser.UnparsedEntityDeclHandler = lambda name, *rest: entity(name, False)
    parser.StartElementHandler = start
    parser.EndElementHandler = end
    try:
        parser.Parse(text, True)
    except _Refused as exc:
        raise FormatError(exc.message, file=file, line=exc.line) from None
    except expat.ExpatError as exc:
        raise FormatError(f"this is not an SVG file: it is not well-formed XML "
                          f"({expat.ErrorString(exc.code)} at line {exc.lineno}, column "
                          f"{exc.offset + 1})", file=file, line=exc.lineno) from None
    try:
        root = ElementTree.fromstring(text)
    except ElementTree.ParseError as exc:
        line, column = exc.position
        raise FormatError(f"this is not an SVG file: it is not well-formed XML "
                          f"({one_line(exc.msg)}, line {line}, column {column + 1})",
                          file=file, line=line) from None
    if _local(root.tag) != "svg":
        raise FormatError(f"this is not an SVG file: its root element is "
                          f"<{one_line(_local(root.tag))[:40]}>, not <svg>", file=file, line=1)
    return root, lines


_LENGTH = re.compile(r"\s*([+-]?(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]+)?)\s*"
                     r"(mm|cm|in|pt|pc|px|Q|q|%|em|ex)?\s*\Z")
#: Physical units of an SVG length: the profile unit they become and the factor into it.
_PHYSICAL = {"mm": ("mm", Fraction(1)), "cm": ("cm", Fraction(1)), "in": ("in", Fraction(1)),
             "pt": ("in", Fraction(1, 72)), "pc": ("in", Fraction(1, 6)),
             "px": ("in", Fraction(1, 96)), "q": ("mm", Fraction(1, 4))}


def _length(text: Optional[str]):
    if text is None:
        return None
    m = _LENGTH.match(text)
    if m is None:
        return None
    try:
        return decimal_fraction(m.group(1)), (m.group(2) or "").lower()
    except ValueError:
        return None


def svg_user_unit(root, unit: Optional[str], file: Optional[str] = None):
    """The profile unit, the scale of one user unit in it, where that came from, and notes.

    >>> import xml.etree.ElementTree as ET
    >>> svg_user_unit(ET.fromstring('<svg width="100mm" height="50mm" viewBox="0 0 400 200"/>'), None)
    ('mm', Fraction(1, 4), 'from the drawing: width 100mm over a viewBox 400 wide', [])
    >>> svg_user_unit(ET.fromstring('<svg width="300" height="200"/>'), None)[:3]
    ('mm', Fraction(1, 1), 'assumed: the drawing states no physical size')
    >>> svg_user_unit(ET.fromstring('<svg width="2in" viewBox="0 0 2 1"/>'), "mm", "a.svg")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: a.svg: the drawing states its size in in (width 2in over a viewBox 2 wide) but the unit given is mm; leave the unit out
    """
    from revolve.errors import UnitError

    notes: List[str] = []
    width, height = _length(root.get("width")), _length(root.get("height"))
    box = root.get("viewBox")
    view = None
    if box is not None:
        try:
            view = [decimal_fraction(v) for v in re.split(r"[\s,]+", box.strip())]
        except ValueError:
            view = None
        if view is None or len(view) != 4 or view[2] <= 0 or view[3] <= 0:
            notes.append(f'the viewBox "{box}" is not four numbers with a positive size; ignored')
            view = None
    derived = None
    if width is not None and width[1] in _PHYSICAL and width[1] != "px" and width[0] > 0:
        name, factor = _PHYSICAL[width[1]]
        if view is not None:
            scale = width[0] * factor / view[2]
            text = f"width {root.get('width').strip()} over a viewBox {view[2]} wide"
            if height is not None and height[1] in _PHYSICAL and height[1] != "px" and \
                    _PHYSICAL[height[1]][0] == name and height[0] > 0:
                other = height[0] * _PHYSICAL[height[1]][1] / view[3]
                if other != scale:
                    scale = min(scale, other)
                    notes.append("the drawing's width and height scale its viewBox differently; "
                                 "the smaller scale is used (as SVG's default aspect ratio does)")
        else:
            name, scale = "in", Fraction(1, 96)
            text = (f"width {root.get('width').strip()} and no viewBox, so a user unit is a "
                    "CSS pixel, 1/96 in")
        derived = (name, scale, f"from the drawing: {text}")
    if derived is not None:
        if unit is not None and unit != derived[0]:
            raise UnitError(f"the drawing states its size in {derived[0]} "
                            f"({derived[2].split(': ', 1)[1]}) but the unit given is {unit}; "
                            "leave the unit out", file=file)
        return derived[0], derived[1], derived[2], notes
    if unit is not None:
        return unit, Fraction(1), "given", notes
    return "mm", Fraction(1), "assumed: the drawing states no physical size", notes


_NOT_DRAWN = ("defs", "symbol", "clipPath", "mask", "marker", "pattern")
#: Elements read: paths and the basic shapes.
SHAPES = ("path", "rect", "circle", "ellipse", "line", "polyline", "polygon")
#: Elements that hold others and are read through (a chosen id may name one of them).
_CONTAINERS = ("svg", "g", "a", "switch")
#: Elements that draw something that is not read, and why.
_NOT_READ = {"text": "text is not geometry", "image": "an image is not geometry",
             "use": "a <use> reference is not expanded; replace it by a copy of what it uses",
             "foreignObject": "foreign content is not read"}


def _attribute_length(el, name: str, default: Optional[Fraction], where: Where
                      ) -> Optional[Fraction]:
    """A shape's length attribute in user units (a plain number, or ``px``)."""
    text = el.get(name)
    if text is None or not text.strip():
        return default
    m = _LENGTH.match(text)
    if m is None or (m.group(2) or "px") != "px":
        raise FormatError(f'{name}="{one_line(text)[:30]}" is not a length in user units; '
                          "write a plain number", file=where.file, line=where.line,
                          place=where.place)
    try:
        return decimal_fraction(m.group(1))
    except ValueError as exc:
        raise FormatError(f"{name}: {exc}", file=where.file, line=where.line,
                          place=where.place) from None


def _arc_commands(rx, ry, points) -> List[PathCommand]:
    zero = Fraction(0)
    return [PathCommand("A", (rx, ry, zero, zero, Fraction(1), x, y), 0) for x, y in points]


def shape_commands(el, where: Where) -> Tuple[Optional[Tuple[PathCommand, ...]], str]:
    """The path commands of a basic shape, as SVG 2 defines its equivalent path.

    Returns ``(commands, reason)``: commands None when the shape is not
    rendered (a zero width, height or radius), with the reason. Positions
    are negative part numbers (-1, -2, ...), so messages name the part.

    * ``<rect>``: four sides and, with ``rx``/``ry`` (one given stands for
      both; each at most half the side), four elliptical corner arcs;
    * ``<circle>`` and ``<ellipse>``: four quarter arcs from (cx + rx, cy);
    * ``<line>``: one open line; ``<polyline>`` open, ``<polygon>`` closed.

    Examples
    --------
    >>> import xml.etree.ElementTree as ET
    >>> cmds, _ = shape_commands(ET.fromstring('<rect x="1" y="2" width="4" height="3" rx="1"/>'),
    ...                          Where())
    >>> [c.letter for c in cmds]
    ['M', 'H', 'A', 'V', 'A', 'H', 'A', 'V', 'A', 'Z']
    >>> shape_commands(ET.fromstring('<circle r="0"/>'), Where())
    (None, 'its radius is zero, so it is not drawn')
    >>> [str(a) for a in shape_commands(ET.fromstring('<polygon points="0,0 4,0 4,3"/>'),
    ...                                 Where())[0][2].args]
    ['4', '3']
    """
    tag = _local(el.tag)
    zero = Fraction(0)
    length = lambda name, default=zero: _attribute_length(el, name, default, where)  # noqa: E731
    out: List[Tuple[str, tuple]] = []
    if tag == "rect":
        x, y, w, h = length("x"), length("y"), length("width"), length("height")
        if w <= 0 or h <= 0:
            return None, "its width or height is zero or negative, so it is not drawn"
        rx, ry = length("rx", None), length("ry", None)
        if (rx is not None and rx < 0) or (ry is not None and ry < 0):
            raise FormatError("a corner radius (rx, ry) is negative", file=where.file,
                              line=where.line, place=where.place)
        rx = ry if rx is None else rx
        ry = rx if ry is None else ry
        rx, ry = min(rx or zero, w / 2), min(ry or zero, h / 2)
        if rx == 0 or ry == 0:
            rx = ry = zero
        one = Fraction(1)
        out.append(("M", (x + rx, y)))
        corners = [((x + w, y + ry), (x + w, y + h - ry), "V"),
                   ((x + w - rx, y + h), (x + rx, y + h), "H"),
                   ((x, y + h - ry), (x, y + ry), "V"),
                   ((x + rx, y), None, None)]
        if x + w - rx != x + rx:
            out.append(("H", (x + w - rx,)))
        for (cx, cy), then, letter in corners:
            if rx:
                out.append(("A", (rx, ry, zero, zero, one, cx, cy)))
            if then is not None and (then[0] != cx or then[1] != cy):
                out.append((letter, (then[1],) if letter == "V" else (then[0],)))
        out.append(("Z", ()))
    elif tag in ("circle", "ellipse"):
        cx, cy = length("cx"), length("cy")
        if tag == "circle":
            rx = ry = length("r")
        else:
            rx, ry = length("rx", None), length("ry", None)
            rx = ry if rx is None else rx
            ry = rx if ry is None else ry
            rx, ry = rx or zero, ry or zero
        if rx <= 0 or ry <= 0:
            return None, "its radius is zero, so it is not drawn"
        out.append(("M", (cx + rx, cy)))
        for px, py in ((cx, cy + ry), (cx - rx, cy), (cx, cy - ry), (cx + rx, cy)):
            out.append(("A", (rx, ry, zero, zero, Fraction(1), px, py)))
        out.append(("Z", ()))
    elif tag == "line":
        p0, p1 = (length("x1"), length("y1")), (length("x2"), length("y2"))
        if p0 == p1:
            return None, "it has zero length, so it is not drawn"
        out += [("M", p0), ("L", p1)]
    else:  # polyline, polygon
        s = _Scanner(el.get("points") or "")
        numbers: List[Fraction] = []
        try:
            s.skip_wsp()
            while not s.at_end():
                numbers.append(s.number("a coordinate", "points"))
                s.skip_comma_wsp()
        except PathDataError as exc:
            raise FormatError(f"points: character {exc.position}: {exc.message}",
                              file=where.file, line=where.line, place=where.place) from None
        if len(numbers) % 2:
            raise FormatError(f"points: {len(numbers)} numbers, an odd count; give x,y pairs",
                              file=where.file, line=where.line, place=where.place)
        pts = list(zip(numbers[::2], numbers[1::2]))
        if len(pts) < 2:
            return None, "it has fewer than two points, so it draws nothing"
        out.append(("M", pts[0]))
        out += [("L", p) for p in pts[1:]]
        if tag == "polygon":
            out.append(("Z", ()))
    return tuple(PathCommand(letter, tuple(args), -k)
                 for k, (letter, args) in enumerate(out, 1)), ""


def _hidden(chain) -> bool:
    for el in chain:
        if (el.get("display") or "").strip() == "none" or \
                re.search(r"(^|;)\s*display\s*:\s*none", el.get("style") or ""):
            return True
    return False


def read_svg(path: str, *, unit: Optional[str] = None, path_id: Optional[str] = None,
             keep_strays: bool = False) -> Tuple[ProfileDocument, DrawingReport]:
    """Read the paths and basic shapes of an SVG file as one profile.

    Every ``<path>``, ``<rect>``, ``<circle>``, ``<ellipse>``, ``<line>``,
    ``<polyline>`` and ``<polygon>`` drawn (with the transforms of it and
    of the groups around it) is read; loops and chains not joined to the
    main outline (the largest loop; loops inside it are holes) are warned
    about and left out unless ``keep_strays``. Elements that are not drawn
    by themselves (inside ``<defs>``, ``<symbol>``, ...; ``display="none"``)
    and elements not read (text, images, ``<use>``) are reported as skipped.

    Parameters
    ----------
    path : str
        The SVG file.
    unit : str, optional
        The length unit of a user unit, for drawings that state no physical
        size (default ``"mm"``); refused when it disagrees with one.
    path_id : str, optional
        The ``id`` of the one element to read: a path or shape, or a group
        (``<g>``) whose paths and shapes are read.
    keep_strays : bool
        Keep loops and chains not joined to the main outline.

    Returns
    -------
    (ProfileDocument, DrawingReport)

    Raises
    ------
    FormatError
        Not XML, refused declarations, no such element, nothing drawn, path
        data or transform errors (with their position), numbers beyond the
        range read.
    ProfileError
        Paths or shapes that cross or touch.

    Examples
    --------
    >>> import os, tempfile
    >>> name = os.path.join(tempfile.mkdtemp(), "ring.svg")
    >>> with open(name, "w") as f:
    ...     _ = f.write('<svg xmlns="http://www.w3.org/2000/svg" width="40mm" height="20mm" '
    ...                 'viewBox="0 0 40 20"><g transform="translate(0 20)">'
    ...                 '<path id="ring" d="M0-5h40v-10H0z"/></g></svg>')
    >>> doc, report = read_svg(name)
    >>> [seg.end for seg in doc.profile.loops[0].segments]
    [(40.0, -15.0), (40.0, -5.0), (0.0, -5.0), (0.0, -15.0)]
    >>> report.unit, report.unit_source
    ('mm', 'from the drawing: width 40mm over a viewBox 40 wide')
    >>> read_svg(name, path_id="hub")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: ...ring.svg: there is no element with id "hub"; the drawn elements are: path 'ring'
    """
    check_file_size(path, MAX_SVG_BYTES)
    text = read_text(path)
    root, lines = parse_svg_xml(text, path)
    elements = [el for el in root.iter() if isinstance(el.tag, str)]
    line_of = {id(el): (lines[k] if k < len(lines) else None) for k, el in enumerate(elements)}
    parents = {child: parent for parent in elements for child in parent}
    counts: Dict[str, int] = {}
    labels: Dict[int, str] = {}
    for el in elements:
        tag = _local(el.tag)
        if tag in SHAPES:
            counts[tag] = counts.get(tag, 0) + 1
            ident = el.get("id")
            labels[id(el)] = (f"{tag} '{one_line(ident)[:40]}'" if ident
                              else f"{tag} #{counts[tag]} (no id)")
    drawn = [el for el in elements if id(el) in labels]
    listing = ", ".join(labels[id(el)] for el in drawn[:12]) + (", ..." if len(drawn) > 12 else "")

    def chain_of(el):
        chain = [el]
        while chain[-1] in parents:
            chain.append(parents[chain[-1]])
        chain.reverse()  # root first
        return chain

    explicit = path_id is not None
    if explicit:
        chosen = next((el for el in elements if el.get("id") == path_id), None)
        if chosen is None:
            raise FormatError(f'there is no element with id "{one_line(path_id)[:40]}"; ' +
                              (f"the drawn elements are: {listing}" if drawn else
                               "the file has no path or shape"), file=path)
        tag = _local(chosen.tag)
        if tag in SHAPES:
            region = [chosen]
        elif tag in _CONTAINERS:
            region = [el for el in chosen.iter() if isinstance(el.tag, str)]
        else:
            raise FormatError(f'the element with id "{one_line(path_id)[:40]}" is a <{tag}>, '
                              "which draws nothing that is read; give the id of a path, a shape "
                              "(rect, circle, ellipse, line, polyline, polygon) or a group",
                              file=path, line=line_of.get(id(chosen)))
    else:
        region = elements
    skipped: List[Skipped] = []
    selected = []
    for el in region:
        tag = _local(el.tag)
        if tag not in SHAPES and tag not in _NOT_READ:
            continue
        chain = chain_of(el)
        name = labels.get(id(el)) or f"<{tag}> (line {line_of.get(id(el))})"
        hidden_in = next((_local(a.tag) for a in chain[:-1] if _local(a.tag) in _NOT_DRAWN), None)
        if tag in _NOT_READ:
            if hidden_in is None:
                skipped.append(Skipped(name, _NOT_READ[tag]))
            continue
        if hidden_in is not None and not (explicit and el is region[0]):
            skipped.append(Skipped(name, f"it is inside <{hidden_in}>, so it is not drawn by "
                                         "itself"))
            continue
        if _hidden(chain) and not (explicit and el is region[0]):
            skipped.append(Skipped(name, "it is not displayed (display: none)"))
            continue
        selected.append((el, chain))
    if not selected:
        if explicit:
            raise FormatError(f'the element with id "{one_line(path_id)[:40]}" holds no path or '
                              "shape that is drawn", file=path)
        raise FormatError("the file has no <path> or shape element (rect, circle, ellipse, "
                          "line, polyline, polygon) that is drawn; draw the profile with one",
                          file=path)
    unit_name, scale, unit_source, unit_notes = svg_user_unit(root, unit, path)
    base = compose(FLIP_Y, (scale, Fraction(0), Fraction(0), scale, Fraction(0), Fraction(0)))
    notes: List[str] = []
    parts = []
    for el, chain in selected:
        tag = _local(el.tag)
        line = line_of.get(id(el))
        name = labels[id(el)]
        label = name + ", "
        matrix = IDENTITY
        for outer in chain:
            outer_tag = _local(outer.tag)
            if outer_tag == "svg" and outer is not root:
                raise FormatError(f"the {tag} is inside a nested <svg> element, whose viewport "
                                  "is not read; move it out", file=path, line=line, place=name)
            if outer_tag in _NOT_DRAWN:
                note = f"{name} is inside <{outer_tag}>, so the drawing does not show it by itself"
                if note not in notes:
                    notes.append(note)
            style = outer.get("style") or ""
            if re.search(r"(^|;)\s*transform\s*:", style):
                raise FormatError(f"a transform in a style attribute (on <{outer_tag}>) is not "
                                  "read; use the transform attribute", file=path, line=line,
                                  place=name)
            transform = outer.get("transform")
            if transform is not None and transform.strip():
                try:
                    matrix = compose(matrix, parse_transform(transform))
                    _check_affine(matrix)
                except PathDataError as exc:
                    raise FormatError(f"transform of <{outer_tag}>: character {exc.position}: "
                                      f"{exc.message}", file=path, line=line,
                                      place=name) from None
                except ValueError as exc:
                    raise FormatError(f"transform of <{outer_tag}>: {exc}", file=path, line=line,
                                      place=name) from None
                note = (f'the transform "{one_line(transform.strip())[:60]}" of <{outer_tag}> '
                        "was applied")
                if note not in notes:
                    notes.append(note)
        matrix = compose(base, matrix)
        try:
            _check_affine(matrix)
        except ValueError as exc:
            raise FormatError(f"with the drawing's scale, {exc}", file=path, line=line,
                              place=name) from None
        where = Where(path, line, name)
        if tag == "path":
            d = el.get("d")
            if d is None or not d.strip():
                raise FormatError("the path has no path data (its d attribute is missing or "
                                  "empty)", file=path, line=line, place=name)
            try:
                commands = parse_path_data(d)
            except PathDataError as exc:
                raise _located(exc, path, line, label) from None
        else:
            commands, reason = shape_commands(el, where)
            if commands is None:
                skipped.append(Skipped(name, reason))
                continue
        part = path_profile(commands, matrix=matrix, unit=unit_name, file=path, line=line,
                            label=label)
        parts.append(part + (label,))
    if not parts:
        first = skipped[-1]
        raise FormatError(f"the paths and shapes of the file draw nothing ({first.what}: "
                          f"{first.reason})", file=path)
    if scale != 1:
        unit_notes.append(f"coordinates were scaled by {scale} into {unit_name}")
    first_line = line_of.get(id(selected[0][0]))
    nothing = FormatError("the paths and shapes read draw nothing (they only move)", file=path,
                          line=first_line if len(selected) == 1 else None,
                          place=(labels[id(selected[0][0])] + ", path data")
                          if len(selected) == 1 else None)
    return _assemble(parts, unit=unit_name, file=path, kind="SVG file", unit_source=unit_source,
                     extra_notes=notes + unit_notes, skipped=skipped, keep_strays=keep_strays,
                     nothing=nothing)
