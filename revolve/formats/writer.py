'''Writing a profile as the project's profile file (TOML).

The writer is the reader's inverse: ``load_profile(write_profile(x))``
rebuilds the same geometry, float for float. Every segment kind tells the
writer what it is through the segment contract (``describe_to``, with three
primitives: straight edges through points, an arc, a curve), so the writer
never asks which kind it holds. Straight edges are written as ``line_to``
(the last one of a loop that returns to its start as ``close = true``): a
line is one, a polyline one ``points_to`` list (it reads back as one
polyline, float for float); arcs as
``arc_to`` with ``centre`` and ``turn``, curves as parametric ``x``/``y``
expressions of ``t``. Where a segment carries its exact
inputs (as the readers set them) and they agree with its floats, those are
written instead (an arc given by its radius keeps its radius and side), so
exact results survive a round trip too. Floats are written with Python's
shortest round-tripping ``repr`` (at most 17 significant digits).

Files are written atomically: a temporary file beside the target, then a
rename.

Examples
--------
>>> from revolve.geometry.profile import Loop, Profile, Axis
>>> from revolve.geometry.segments import Line, arc_from_centre
>>> loop = Loop((Line((0.0, 1.0), (2.0, 1.0), face="bore"),
...              arc_from_centre((2.0, 1.0), (2.0, 3.0), (2.0, 2.0), clockwise=False),
...              Line((2.0, 3.0), (0.0, 1.0))))
>>> print(profile_text(Profile(loops=(loop,), unit="mm"), axis=Axis.x(), angle=360))
# Profile file of revolve; every coordinate is in the units below.
units = "mm"
angle = 360
<BLANKLINE>
[axis]
along = "x"
<BLANKLINE>
[[loop]]
start = [0.0, 1.0]
segments = [
  { line_to = [2.0, 1.0], face = "bore" },
  { arc_to = [2.0, 3.0], centre = [2.0, 2.0], turn = "ccw" },
  { close = true },
]
<BLANKLINE>
'''

from __future__ import annotations

import math
import os
from typing import Any, List, Optional, Sequence, Tuple, Union

from revolve.errors import ExpressionError, FormatError, ProfileError
from revolve.formats.document import ProfileDocument
from revolve.formats.files import write_text_atomically
from revolve.formats.profile_file import CURVE_START_TOLERANCE, ORIENTATIONS
from revolve.formats.values import (describe, exact_literal, exact_to_float,
                                    float_literal, toml_string)
from revolve.geometry.profile import Axis, Profile
from revolve.geometry.segments import Arc, arc_from_centre, arc_from_radius

_HEADER = "# Profile file of revolve; every coordinate is in the units below."


def write_profile(document_or_profile: Union[ProfileDocument, Profile], path_or_stream: Any, *,
                  axis: Optional[Axis] = None, angle: Optional[float] = None,
                  material: Optional[str] = None, density: Optional[str] = None,
                  name: Optional[str] = None, orientation: Optional[str] = None) -> None:
    """Write a profile as a profile file, atomically.

    Parameters
    ----------
    document_or_profile : ProfileDocument or Profile
        What to write. A document's axis, angle, material, density, name and
        orientation are written unless overridden by the keyword arguments.
    path_or_stream : str, os.PathLike or text stream
        A file name (written through a temporary file and a rename) or an
        open text stream (anything with ``write``).
    axis, angle, material, density, name : optional
        Settings to write; ``material`` and ``density`` exclude each other.
    orientation : {"vertical", "horizontal"}, optional
        How the vessel stands, for level tables.

    Raises
    ------
    ProfileError
        A segment that does not start where the previous one ends.
    FormatError
        Both material and density, a curve whose expression cannot be
        written in the file's syntax, a file that cannot be written.

    Examples
    --------
    >>> import io
    >>> from revolve.geometry.profile import Loop, Profile
    >>> out = io.StringIO()
    >>> write_profile(Profile(loops=(Loop.from_points([(0, 1), (1, 1), (0, 2)]),)), out,
    ...               density="1000 kg/m^3")
    >>> print(out.getvalue().splitlines()[2])
    density = "1000 kg/m^3"

    An empty profile writes only its units (reading it back is refused: no loops or chains):

    >>> out = io.StringIO()
    >>> write_profile(Profile(), out)
    >>> out.getvalue().splitlines()[1:]
    ['units = "mm"']
    """
    text = profile_text(document_or_profile, axis=axis, angle=angle, material=material,
                        density=density, name=name, orientation=orientation)
    if hasattr(path_or_stream, "write"):
        path_or_stream.write(text)
    else:
        write_text_atomically(os.fspath(path_or_stream), text)


def profile_text(document_or_profile: Union[ProfileDocument, Profile], *,
                 axis: Optional[Axis] = None, angle: Optional[float] = None,
                 material: Optional[str] = None, density: Optional[str] = None,
                 name: Optional[str] = None, section: Optional[str] = None,
                 orientation: Optional[str] = None) -> str:
    """The text of the profile file for a profile (see :func:`write_profile`).

    Examples
    --------
    >>> from revolve.geometry.profile import Axis, Loop, Profile
    >>> tank = Profile(loops=(Loop.from_points([(0, 0), (9, 0), (9, 2), (0, 2)]),))
    >>> profile_text(tank, axis=Axis.x(), orientation="horizontal").splitlines()[2]
    'orientation = "horizontal"'
    >>> profile_text(tank, orientation="upside down")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: orientation must be "vertical" or "horizontal", got "upside down"
    >>> from revolve.geometry.profile import Chain, Profile
    >>> print(profile_text(Profile(chains=(Chain.from_points([(0, 5), (3, 5)]),), unit="in")))
    # Profile file of revolve; every coordinate is in the units below.
    units = "in"
    <BLANKLINE>
    [[chain]]
    start = [0.0, 5.0]
    segments = [
      { line_to = [3.0, 5.0] },
    ]
    <BLANKLINE>
    """
    angle_exact = None
    if isinstance(document_or_profile, ProfileDocument):
        doc = document_or_profile
        profile = doc.profile
        axis = axis if axis is not None else doc.axis
        if angle is None:
            angle, angle_exact = doc.angle_degrees, doc.angle_exact
        if material is None and density is None:
            material, density = doc.material, doc.density
        section = section if section is not None else doc.section
        if orientation is None:
            orientation = doc.orientation
    elif isinstance(document_or_profile, Profile):
        profile = document_or_profile
    else:
        raise TypeError(f"expected a ProfileDocument or a Profile, got "
                        f"{type(document_or_profile).__name__}")
    name = name if name is not None else profile.name
    if material is not None and density is not None:
        raise FormatError("give material or density, not both")
    if orientation is not None and orientation not in ORIENTATIONS:
        raise FormatError(f'orientation must be "vertical" or "horizontal", got '
                          f"{describe(orientation)}")
    out = [_HEADER]
    if name is not None:
        out.append(f"name = {toml_string(name)}")
    out.append(f"units = {toml_string(profile.unit)}")
    if material is not None:
        out.append(f"material = {toml_string(material)}")
    if density is not None:
        out.append(f"density = {toml_string(density)}")
    if section not in (None, "material"):
        out.append(f"section = {toml_string(section)}")
    if angle is not None:
        angle = float(angle)
        text = _number(angle_exact, angle) if angle_exact is not None else _plain(angle)
        out.append(f"angle = {text}")
    if orientation is not None:
        out.append(f"orientation = {toml_string(orientation)}")
    if axis is not None:
        out += [""] + _axis_lines(axis)
    size = _size(profile)
    for kind, paths in (("loop", profile.loops), ("chain", profile.chains)):
        for index, path in enumerate(paths, 1):
            out += [""] + _path_lines(kind, index, path, size)
    return "\n".join(out) + "\n"


def _plain(value: float) -> str:
    """An integral float as an integer literal, any other as its repr."""
    if value.is_integer() and abs(value) < 2 ** 53:
        return str(int(value))
    return float_literal(value)


def _agrees(exact: Any, value: float) -> bool:
    """Whether an exact input still gives exactly this float."""
    try:
        return exact is not None and exact_to_float(exact) == float(value)
    except (TypeError, ValueError, ArithmeticError, ExpressionError):
        return False


def _number(exact: Any, value: float) -> str:
    return exact_literal(exact) if _agrees(exact, value) else float_literal(value)


def _pair(exact: Optional[Sequence], value: Sequence[float]) -> str:
    ex = exact if exact is not None else (None, None)
    return f"[{_number(ex[0], value[0])}, {_number(ex[1], value[1])}]"


def _axis_lines(axis: Axis) -> List[str]:
    point = (float(axis.point[0]), float(axis.point[1]))
    direction = (float(axis.direction[0]), float(axis.direction[1]))
    if point == (0.0, 0.0) and direction in ((1.0, 0.0), (0.0, 1.0)):
        return ["[axis]", f'along = "{"x" if direction == (1.0, 0.0) else "y"}"']
    exact = axis.exact or (None, None)
    return ["[axis]", f"point = {_pair(exact[0], point)}",
            f"direction = {_pair(exact[1], direction)}"]


def _size(profile: Profile) -> float:
    """Diagonal of the box of the profile's flattened points (0 for an empty profile)."""
    import numpy as np

    pts = [seg.flatten() for seg in profile.segments()]
    if not pts:
        return 0.0
    allpts = np.vstack(pts)
    lo, hi = allpts.min(axis=0), allpts.max(axis=0)
    return math.hypot(float(hi[0] - lo[0]), float(hi[1] - lo[1]))


class _PathText:
    """The records of one loop or chain, written as each segment describes itself.

    A segment calls one of the primitives below from its ``describe_to``
    (part of the segment contract): ``straight`` for straight edges through
    points, ``arc``, ``curve``. ``current`` is where the path has reached;
    ``loop_start`` is set while the last segment of a loop is described, so
    that a straight edge back to the start is written ``close = true``.
    """

    def __init__(self, start) -> None:
        self.current = start
        self.start_exact: Optional[Tuple] = None
        self.described = False
        self.loop_start = None
        self.face: Optional[str] = None
        self.place = ""
        self.records: List[str] = []

    def _begin(self, exact_start) -> None:
        if not self.described:
            self.start_exact = None if exact_start is None else tuple(exact_start)
            self.described = True

    def _add(self, body: str) -> None:
        if self.face is not None:
            body += f", face = {toml_string(self.face)}"
        self.records.append(f"  {{ {body} }},")

    def straight(self, points, exact=None) -> None:
        """Straight edges from ``points[0]`` through every later point (exact pairs, or None).

        One edge is written ``line_to`` (or ``close = true``); more as one
        ``points_to`` list, one point per line.
        """
        rows = points.tolist() if hasattr(points, "tolist") else [list(p) for p in points]
        self._begin(None if exact is None else exact[0])
        if len(rows) > 2:
            self._points_to(rows, exact)
            return
        last = len(rows) - 1
        for i in range(1, len(rows)):
            end = (float(rows[i][0]), float(rows[i][1]))
            if i == last and self.loop_start is not None and end == self.loop_start:
                self._add("close = true")
            else:
                self._add(f"line_to = {_pair(None if exact is None else exact[i], end)}")
        self.current = (float(rows[last][0]), float(rows[last][1]))

    def _points_to(self, rows, exact) -> None:
        if exact is None:
            import numpy as np

            if not np.isfinite(np.asarray(rows[1:], dtype=float)).all():
                raise FormatError("cannot write a non-finite coordinate", place=self.place)
            # repr is float_literal's text (shortest round-tripping), for all rows at once
            items = [f"    [{float(x)!r}, {float(y)!r}]," for x, y in rows[1:]]
        else:
            items = [f"    {_pair(exact[i], (float(rows[i][0]), float(rows[i][1])))},"
                     for i in range(1, len(rows))]
        head = "  { " if self.face is None else f"  {{ face = {toml_string(self.face)}, "
        self.records.append(head + "points_to = [\n" + "\n".join(items) + "\n  ] },")
        self.current = (float(rows[-1][0]), float(rows[-1][1]))

    def arc(self, start, end, centre, clockwise, exact=None, where=None) -> None:
        """A circular arc to ``end`` about ``centre`` (exact inputs as the arc keeps them)."""
        self._begin(None if exact is None else exact.start)
        self._add(_arc_body(end, centre, clockwise, exact, where, self.current))
        self.current = end

    def curve(self, x_expr, y_expr, t_start, t_end, exact=None) -> None:
        """A parametric curve ``(x(t), y(t))`` for ``t`` from ``t_start`` to ``t_end``."""
        self._begin(None)
        self._add(_curve_body(x_expr, y_expr, t_start, t_end, exact, self.place))


def _path_lines(kind: str, index: int, path, size: float) -> List[str]:
    segments = path.segments
    if not segments:
        raise ProfileError(f"{kind} {index} has no segments; there is nothing to write")
    start = segments[0].start
    text = _PathText(start)
    for j, seg in enumerate(segments, 1):
        current = text.current
        gap = math.hypot(seg.start[0] - current[0], seg.start[1] - current[1])
        if gap > CURVE_START_TOLERANCE * size:
            raise ProfileError(f"segment {j} starts at {seg.start} but the previous one ends at "
                               f"{current}; a profile file cannot hold a gap",
                               place=f"{kind} {index}, segment {j}")
        text.place = f"{kind} {index}, segment {j}"
        text.loop_start = start if kind == "loop" and j == len(segments) else None
        text.face = seg.face
        seg.describe_to(text)
        text.current = seg.end
    return ([f"[[{kind}]]", f"start = {_pair(text.start_exact, start)}", "segments = ["]
            + text.records + ["]"])


def _arc_body(end, centre, clockwise: bool, exact, where, current) -> str:
    if exact is not None and exact[0] == "radius":
        _, _, e1, radius, side, major = exact
        try:
            radius_value: Optional[float] = exact_to_float(radius)
        except (TypeError, ValueError, ArithmeticError, ExpressionError):
            radius_value = None
        if radius_value is not None and _agrees(e1[0], end[0]) and _agrees(e1[1], end[1]):
            try:
                again: Optional[Arc] = arc_from_radius(current, end, radius_value,
                                                       side=side, major=major)
            except ProfileError:
                again = None
            if again is not None and again.centre == centre and again.clockwise == clockwise:
                text = (f"arc_to = {_pair(e1, end)}, radius = {exact_literal(radius)}, "
                        f'side = "{side}"')
                return text + (", major = true" if major else "")
    end_exact = centre_exact = None
    if exact is not None and exact[0] == "centre" and bool(exact[4]) == clockwise:
        end_exact, centre_exact = exact[2], exact[3]
    # the reader rebuilds the arc with these checks; fail here rather than write a bad file
    arc_from_centre(current, end, centre, clockwise, where=where)
    return (f"arc_to = {_pair(end_exact, end)}, centre = {_pair(centre_exact, centre)}, "
            f'turn = "{"cw" if clockwise else "ccw"}"')


def _curve_body(x_expr, y_expr, t_start: float, t_end: float, exact, place: str) -> str:
    """The keys of a parametric curve, printed from its expression trees (no sympy)."""
    from revolve.expr import as_expression, parse_expression

    texts = []
    for expr in (x_expr, y_expr):
        expr = as_expression(expr)
        others = sorted(set(expr.variables) - {"t"})
        if others:
            raise FormatError(f"cannot write a curve in {', '.join(others)}: a curve's "
                              "expressions may use only t", place=place)
        text = expr.text()
        try:
            parse_expression(text, variables=("t",))
        except (ExpressionError, ValueError) as exc:
            raise FormatError(f"cannot write the curve expression {text[:80]} ({exc})",
                              place=place) from None
        texts.append(text)
    exact = exact or (None, None)
    return (f"x = {toml_string(texts[0])}, y = {toml_string(texts[1])}, "
            f"t_from = {_number(exact[0], t_start)}, t_to = {_number(exact[1], t_end)}")
