"""Vessels from parameters: a cylindrical shell closed by a head at each end.

A vessel is given by its diameter, the length of its straight shell (from
the tangent line of one head to that of the other) and a head at each end:

``flat``
    a flat plate at the tangent line.
``hemispherical``
    half a sphere of the shell's radius; depth D/2.
``ellipsoidal``
    the 2:1 semi-ellipsoidal head: a quarter ellipse with semi-axes D/2
    (radial) and D/4 (axial), written as the exact parametric curve
    ``(D/4 cos t, D/2 sin t)``; depth D/4. (The 2:1 proportion is common
    practice.)
``torispherical``
    a crown (a sphere of radius ``crown``) joined to the shell by a knuckle
    (a torus of radius ``knuckle``), tangent at both joins. Default
    proportions crown = D and knuckle = 6 % of D, the usual flanged-and-dished
    head (common practice). ``torispherical-10``: crown = D, knuckle = 10 % of
    D, the proportions of DIN 28011; ``torispherical-80``: crown = 80 % of D,
    knuckle = 15.4 % of D, the proportions of DIN 28013 (both standards state
    them on the outside diameter, so give outside dimensions to follow them;
    from memory). ``crown=`` and ``knuckle=`` override the radii.
``conical``
    a cone of half-angle ``angle`` (degrees, between the wall and the axis),
    joined to the shell directly or through a knuckle of radius ``knuckle``.

A head is written ``KIND`` or ``KIND:key=value,...``, e.g.
``torispherical:crown=1200,knuckle=10%`` or ``conical:angle=30,knuckle=50``;
a length is a number in the vessel's unit or a percentage of the diameter.

Dimensions are **inside** (the default) or **outside**: the diameter, the
crown and knuckle radii and the ellipse describe that surface, and the other
surface lies the wall thickness away (circles and lines offset exactly; the
ellipse's offset is the exact parallel curve, itself a parametric curve;
corners — a flat plate on the shell, a cone without knuckle, the cone's
point — are mitred). The tangent lines are on the stated surface.

Geometry is exact: lines, arcs and the ellipse curve, never a tessellation.
The torispherical head is checked for tangency at the knuckle, and
proportions that cannot be built are refused with the reason.

Frame: the axis is ``z`` from the tangent line of head 1 (the bottom of a
vertical vessel) towards head 2; ``r`` is the distance from the axis. The
profile written for ``revolve measure`` and ``revolve levels`` is the
**liquid space**: the inside wall from the pole of head 1 round to the pole
of head 2, closed along the axis (see :mod:`revolve.jobs.levels`); the wall
(metal section) can be written as a second profile.

The results are geometry only: wall and head thickness for pressure,
supports and nozzles are for the applicable code and a licensed engineer.

Examples
--------
A 2:1 ellipsoidal head holds π D³/24 beyond its tangent line:

>>> v = design_vessel(1000.0, 2000.0, parse_head("ellipsoidal", 1000.0),
...                  parse_head("hemispherical", 1000.0))
>>> s = summarise(v)
>>> round(s.heads[0].volume / (math.pi * 1000.0 ** 3 / 24), 12), s.heads[0].depth
(1.0, 250.0)
>>> round(s.capacity / (math.pi * 500.0 ** 2 * 2000 + math.pi * 1000.0 ** 3 * (1 / 24 + 1 / 12)), 12)
1.0
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass, field, replace
from fractions import Fraction
from typing import Any, Dict, List, Optional, Tuple

from revolve.errors import ProfileError, RevolveError, indefinite
from revolve.geometry.profile import Axis, Loop, Profile
from revolve.jobs.results import OutputUnits, Result

HEAD_KINDS = ("flat", "hemispherical", "ellipsoidal", "torispherical", "torispherical-10",
              "torispherical-80", "conical")
#: Proportions (crown, knuckle) of the named torispherical heads, as fractions of the diameter.
TORISPHERICAL_PROPORTIONS = {
    "torispherical": (1.0, 0.06),      # flanged and dished, common practice
    "torispherical-10": (1.0, 0.10),   # DIN 28011 proportions (from memory)
    "torispherical-80": (0.8, 0.154),  # DIN 28013 proportions (from memory)
}
_KEYS = {"flat": (), "hemispherical": (), "ellipsoidal": (),
         "torispherical": ("crown", "knuckle"), "torispherical-10": ("crown", "knuckle"),
         "torispherical-80": ("crown", "knuckle"), "conical": ("angle", "knuckle")}
_PLAIN = r"^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$"   # compiled on first use (re keeps it)
#: Largest mismatch allowed in the tangency checks, relative to the diameter.
TANGENCY_TOLERANCE = 1e-9


# -- head specifications ------------------------------------------------------------------

@dataclass(frozen=True)
class HeadSpec:
    """One head: its kind and, where they apply, radii (vessel units) and half-angle (degrees).

    ``crown`` and ``knuckle`` are on the stated surface (inside or outside).
    """

    kind: str
    crown: Optional[float] = None
    knuckle: Optional[float] = None
    angle: Optional[float] = None

    def describe(self, unit: str = "") -> str:
        """A short label, e.g. ``torispherical, crown 1000, knuckle 60 mm``.

        >>> HeadSpec("conical", angle=30.0, knuckle=0.0).describe("mm")
        'conical, half-angle 30°'
        """
        u = f" {unit}" if unit else ""
        if self.kind in TORISPHERICAL_PROPORTIONS:
            return f"{self.kind}, crown {self.crown:g}, knuckle {self.knuckle:g}{u}"
        if self.kind == "conical":
            text = f"conical, half-angle {self.angle:g}°"
            return text + (f", knuckle {self.knuckle:g}{u}" if self.knuckle else "")
        if self.kind == "ellipsoidal":
            return "ellipsoidal 2:1"
        return self.kind


def _value(text: str, diameter: float, what: str, place: str, allow_percent: bool = True) -> float:
    t = text.strip()
    percent = t.endswith("%")
    if percent:
        if not allow_percent:
            raise RevolveError(f"{what} is an angle in degrees, not a percentage", place=place)
        t = t[:-1].strip()
    if re.match(_PLAIN, t):
        v = float(t)
    else:
        from revolve.expr import constant_float, parse_number
        try:
            v = constant_float(parse_number(t))
        except (RevolveError, TypeError, ValueError):
            raise RevolveError(f"{what} must be a number{' or a percentage' if allow_percent else ''}"
                               f", got {text.strip()!r}", place=place)
    if not math.isfinite(v):
        raise RevolveError(f"{what} must be a finite number, got {text.strip()!r}", place=place)
    return v * diameter / 100.0 if percent else v


def parse_head(text: str, diameter: float, place: str = "head") -> HeadSpec:
    """Read a head written ``KIND`` or ``KIND:key=value,...`` (see the module notes).

    Percentages are of ``diameter`` (the stated one). Named proportions are
    filled in; the geometry is checked later, by :func:`design_vessel`.

    >>> parse_head("torispherical", 1000.0)
    HeadSpec(kind='torispherical', crown=1000.0, knuckle=60.0, angle=None)
    >>> parse_head("torispherical-80:knuckle=150", 2000.0)
    HeadSpec(kind='torispherical-80', crown=1600.0, knuckle=150.0, angle=None)
    >>> parse_head("conical:angle=30,knuckle=5%", 800.0)
    HeadSpec(kind='conical', crown=None, knuckle=40.0, angle=30.0)
    >>> parse_head("dished", 1000.0, place="--head-1")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --head-1: unknown head 'dished'; choose from flat, hemispherical, ellipsoidal, torispherical, torispherical-10, torispherical-80, conical
    >>> parse_head("conical", 1000.0, place="--head")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --head: a conical head needs its half-angle, e.g. conical:angle=30
    """
    if not isinstance(text, str) or not text.strip():
        raise RevolveError("no head given; choose from " + ", ".join(HEAD_KINDS), place=place)
    kind, _, rest = text.strip().partition(":")
    kind = kind.strip().lower().replace("_", "-").replace(" ", "-")
    aliases = {"hemisphere": "hemispherical", "hemi": "hemispherical", "2:1": "ellipsoidal",
               "elliptical": "ellipsoidal", "semi-ellipsoidal": "ellipsoidal",
               "cone": "conical", "plate": "flat"}
    kind = aliases.get(kind, kind)
    if kind not in HEAD_KINDS:
        raise RevolveError(f"unknown head {kind!r}; choose from " + ", ".join(HEAD_KINDS),
                           place=place)
    values: Dict[str, float] = {}
    if rest.strip():
        for item in rest.split(","):
            key, eq, val = item.partition("=")
            key = key.strip().lower()
            if not eq or not key:
                raise RevolveError(f"write the head's settings as key=value, got {item.strip()!r}",
                                   place=place)
            if key not in _KEYS[kind]:
                head = indefinite(f"{kind} head")
                if not _KEYS[kind]:
                    raise RevolveError(f"{head} takes no settings, got {key!r}", place=place)
                raise RevolveError(f"{head} has no setting {key!r} (settings: "
                                   f"{', '.join(_KEYS[kind])})", place=place)
            if key in values:
                raise RevolveError(f"{key} is given twice", place=place)
            values[key] = _value(val, diameter, key, place, allow_percent=key != "angle")
    if kind in TORISPHERICAL_PROPORTIONS:
        c, k = TORISPHERICAL_PROPORTIONS[kind]
        return HeadSpec(kind, crown=values.get("crown", c * diameter),
                        knuckle=values.get("knuckle", k * diameter))
    if kind == "conical":
        if "angle" not in values:
            raise RevolveError("a conical head needs its half-angle, e.g. conical:angle=30",
                               place=place)
        return HeadSpec(kind, angle=values["angle"], knuckle=values.get("knuckle", 0.0))
    return HeadSpec(kind)


# -- head geometry in local coordinates -----------------------------------------------------
# u: distance outward from the tangent line (along the axis, away from the shell);
# rho: distance from the axis. Primitives run from the shell junction to the pole.

@dataclass(frozen=True)
class _LineP:
    """A straight piece of a head, in local coordinates."""

    start: Tuple[float, float]
    end: Tuple[float, float]


@dataclass(frozen=True)
class _ArcP:
    """A circular piece of a head (crown or knuckle), in local coordinates."""

    centre: Tuple[float, float]
    radius: float
    start: Tuple[float, float]
    end: Tuple[float, float]


@dataclass(frozen=True)
class _EllipseP:
    """u = a_u cos τ + w n_u, rho = a_r sin τ + w n_rho, τ from π/2 (junction) to 0 (pole)."""

    a_u: float
    a_r: float
    offset: float

    @property
    def start(self):
        return (0.0, self.a_r + self.offset)

    @property
    def end(self):
        return (self.a_u + self.offset, 0.0)


def _fail(message: str, place: str) -> ProfileError:
    return ProfileError(message, place=place)


def _torispherical(R: float, crown: float, knuckle: float, w: float, place: str):
    """Crown and knuckle of a torispherical head whose stated surface has radius R, offset by w."""
    D = 2 * R
    if not (knuckle > 0):
        raise _fail(f"the knuckle radius must be positive, got {knuckle:g}", place)
    if knuckle >= R:
        raise _fail(f"the knuckle radius {knuckle:g} is not less than the shell radius {R:g}; "
                    "make it smaller (6 % to 15 % of the diameter is usual)", place)
    if crown < R * (1 + 1e-12) and crown > R * (1 - 1e-12):
        raise _fail(f"a crown radius equal to the shell radius ({R:g}) is a hemispherical head; "
                    "choose hemispherical", place)
    if crown < R:
        raise _fail(f"the crown radius {crown:g} is less than the shell radius {R:g}: the crown "
                    "cannot reach the knuckle tangentially; make it larger than the radius "
                    "(about the diameter is usual)", place)
    if knuckle + w <= 0:
        raise _fail(f"the wall thickness ({-w:g}) is not less than the knuckle radius "
                    f"({knuckle:g}); the inside knuckle would vanish", place)
    uc = -math.sqrt((crown - knuckle) ** 2 - (R - knuckle) ** 2)     # crown centre on the axis
    ck = (0.0, R - knuckle)                                          # knuckle centre
    dx, dy = ck[0] - uc, ck[1]
    n = math.hypot(dx, dy)
    ex, ey = dx / n, dy / n
    rc, rk = crown + w, knuckle + w
    join = (uc + rc * ex, rc * ey)                                   # crown meets knuckle
    # Tangent continuity: the join lies on both circles and both radii there are parallel.
    on_knuckle = math.hypot(join[0] - ck[0], join[1] - ck[1]) - rk
    cross = (join[0] - uc) * (join[1] - ck[1]) - (join[1]) * (join[0] - ck[0])
    if abs(on_knuckle) > TANGENCY_TOLERANCE * D or abs(cross) > TANGENCY_TOLERANCE * D * D:
        raise _fail("the crown and the knuckle do not meet tangentially (a construction "
                    "error); please report these proportions", place)
    if not (join[0] > 0 and join[1] > 0):
        raise _fail("the crown and knuckle radii give no knuckle between the shell and the "
                    "crown; check the proportions", place)
    junction = (0.0, R + w)
    pole = (uc + rc, 0.0)
    return [_ArcP(ck, rk, junction, join), _ArcP((uc, 0.0), rc, join, pole)], junction, pole


def _conical(R: float, angle: float, knuckle: float, w: float, place: str):
    if not (0 < angle < 90):
        raise _fail(f"the cone's half-angle must be between 0 and 90 degrees, got {angle:g}"
                    + ("; a half-angle of 90° is a flat head" if angle == 90 else ""), place)
    if knuckle < 0:
        raise _fail(f"the knuckle radius must not be negative, got {knuckle:g}", place)
    if knuckle >= R:
        raise _fail(f"the knuckle radius {knuckle:g} is not less than the shell radius {R:g}",
                    place)
    a = math.radians(angle)
    sa, ca, ta = math.sin(a), math.cos(a), math.tan(a)
    ck = (0.0, R - knuckle)
    if knuckle + w > 0:
        rk = knuckle + w
        k = (ck[0] + rk * sa, ck[1] + rk * ca)
        apex = (k[0] + k[1] / ta, 0.0)
        junction = (0.0, R + w)
        return [_ArcP(ck, rk, junction, k), _LineP(k, apex)], junction, apex
    # No knuckle on this surface: the cone wall offset by w, mitred to the shell and the axis.
    k0 = (ck[0] + knuckle * sa, ck[1] + knuckle * ca)
    base = (k0[0] + w * sa, k0[1] + w * ca)          # a point on the offset cone line
    s_j = (base[1] - (R + w)) / sa
    junction = (base[0] + s_j * ca, R + w)
    s_a = base[1] / sa
    apex = (base[0] + s_a * ca, 0.0)
    return [_LineP(junction, apex)], junction, apex


def _head_primitives(spec: HeadSpec, R: float, w: float, place: str):
    """Primitives (junction to pole), the junction and the pole of a head at offset w."""
    if spec.kind == "flat":
        junction, pole = (w, R + w), (w, 0.0)
        return [_LineP(junction, pole)], junction, pole
    if spec.kind == "hemispherical":
        rr = R + w
        junction, pole = (0.0, rr), (rr, 0.0)
        return [_ArcP((0.0, 0.0), rr, junction, pole)], junction, pole
    if spec.kind == "ellipsoidal":
        if w <= -R / 4:
            raise _fail(f"the wall thickness ({-w:g}) is not less than an eighth of the diameter "
                        f"({R / 4:g}), the smallest radius of curvature of a 2:1 head; the inside "
                        "surface would fold over", place)
        e = _EllipseP(R / 2, R, w)
        return [e], e.start, e.end
    if spec.kind in TORISPHERICAL_PROPORTIONS:
        return _torispherical(R, spec.crown, spec.knuckle, w, place)
    if spec.kind == "conical":
        return _conical(R, spec.angle, spec.knuckle, w, place)
    raise _fail(f"unknown head {spec.kind!r}", place)  # pragma: no cover


# -- from local primitives to frame segments ---------------------------------------------

def _number(v: float):
    """A float as an exact tree number: the integer when whole (and small), else the float."""
    from revolve.expr import Num

    v = float(v)
    return Num(int(v)) if v.is_integer() and abs(v) < 2 ** 53 else Num(v)


def _ellipse_base(e: _EllipseP, face: str):
    """The base curve of an ellipse primitive, built and checked once for both heads."""
    key = (e, face)
    if key not in _ELLIPSE_BASES:
        from revolve.expr import Var, call
        from revolve.geometry.segments import Curve

        t = Var("t")
        au, ar, w = _number(e.a_u), _number(e.a_r), _number(e.offset)
        c, s = call("cos", (t,)), call("sin", (t,))
        norm = (ar ** 2 * c ** 2 + au ** 2 * s ** 2) ** Fraction(1, 2)
        u = au * c + (w * ar * c / norm if e.offset else 0)
        rho = ar * s + (w * au * s / norm if e.offset else 0)
        if len(_ELLIPSE_BASES) >= 64:       # bounded: a long-running process builds many vessels
            _ELLIPSE_BASES.clear()
        # Finite for every τ by construction (a_u, a_r > 0, so the norm is never 0): built
        # directly, without the sampling and pole search that a user's curve goes through.
        _ELLIPSE_BASES[key] = Curve(u, rho, 0.0, math.pi / 2, face=face,
                                    exact=(Fraction(0), "pi/2"))
    return _ELLIPSE_BASES[key]


_ELLIPSE_BASES: Dict[Tuple[_EllipseP, str], Any] = {}


def _ellipse_curve(e: _EllipseP, head: int, length: float, face: str):
    """The ellipse primitive as a frame curve: head 1 from the pole, head 2 to the pole.

    Both heads share one base curve, the primitive ``(u(τ), ρ(τ))`` for τ from
    the pole (0) to the junction (π/2), built as expression trees (no sympy);
    each head is that curve under an affine map (head 1: z = -u; head 2:
    z = L + u with τ = π/2 - t), so the numeric functions are compiled once for both.
    """
    from revolve.expr import Const, Num
    from revolve.geometry.segments import CurveMap

    base = _ellipse_base(e, face)
    if head == 1:   # τ = t from the pole (t = 0) to the junction (t = π/2); z = -u
        return base.transformed((-1.0, 0.0, 0.0, 1.0))
    # τ = π/2 - t from the junction (t = 0) to the pole (t = π/2); z = L + u
    one, zero = Num(1), Num(0)
    return replace(base, affine=CurveMap((1.0, 0.0, 0.0, 1.0), (float(length), 0.0),
                                         -1.0, math.pi / 2,
                                         exact=(one, zero, zero, one, _number(length), zero,
                                                -one, Const("pi") / 2)))


def _frame_point(p, head: int, length: float):
    u, rho = p
    return (0.0 - u, rho) if head == 1 else (length + u, rho)


def _frame_segments(prims, head: int, length: float, face: str):
    """Frame segments of a head: head 1 from the pole to the junction, head 2 the other way."""
    from revolve.geometry.segments import Line, arc_from_centre

    out = []
    for prim in prims:
        if isinstance(prim, _EllipseP):
            out.append(_ellipse_curve(prim, head, length, face))
            continue
        a, b = _frame_point(prim.start, head, length), _frame_point(prim.end, head, length)
        if head == 1:
            a, b = b, a
        if isinstance(prim, _LineP):
            out.append(Line(a, b, face=face))
        else:
            c = _frame_point(prim.centre, head, length)
            cross = (a[0] - c[0]) * (b[1] - c[1]) - (a[1] - c[1]) * (b[0] - c[0])
            out.append(arc_from_centre(a, b, c, clockwise=cross < 0, face=face))
    return out if head == 2 else out[::-1]


def _surface(spec1: HeadSpec, spec2: HeadSpec, R: float, length: float, w: float, faces):
    """Frame segments of one surface (offset w from the stated one), pole 1 to pole 2."""
    from revolve.geometry.segments import Line

    p1, j1, pole1 = _head_primitives(spec1, R, w, "head 1")
    p2, j2, pole2 = _head_primitives(spec2, R, w, "head 2")
    z1 = _frame_point(j1, 1, length)[0]
    z2 = _frame_point(j2, 2, length)[0]
    if z2 < z1:
        raise ProfileError("the heads overlap: the shell is too short for these heads and this "
                           "wall", place="length")
    segs = _frame_segments(p1, 1, length, faces[0])
    if z2 - z1 > 1e-9 * R:   # a shell shorter than that is no shell (and no segment)
        segs.append(Line((z1, R + w), (z2, R + w), face=faces[1]))
    segs += _frame_segments(p2, 2, length, faces[2])
    return segs, _frame_point(pole1, 1, length), _frame_point(pole2, 2, length)


# -- the vessel ----------------------------------------------------------------------------

@dataclass(frozen=True)
class VesselDesign:
    """A vessel built from parameters (vessel units; the frame of the module notes).

    ``inside`` is the liquid-space loop in the frame (z along the axis from
    the tangent line of head 1, r from the axis); ``wall`` the metal
    section's loop, or None without a thickness. ``inside_diameter`` and
    ``outside_diameter`` follow from the stated diameter and the thickness;
    ``poles`` are the axial positions where the inside of head 1 and head 2
    meet the axis (``outside_poles`` the same for the outside).
    """

    diameter: float
    length: float
    heads: Tuple[HeadSpec, HeadSpec]
    thickness: Optional[float]
    dimensions: str
    unit: str
    inside: Loop
    wall: Optional[Loop]
    inside_diameter: float
    outside_diameter: Optional[float]
    poles: Tuple[float, float]
    outside_poles: Optional[Tuple[float, float]]
    notes: Tuple[str, ...] = field(default=())


def _common_practice_notes(spec: HeadSpec, D: float, which: str) -> List[str]:
    notes = []
    if spec.kind in TORISPHERICAL_PROPORTIONS:
        if spec.crown > D * (1 + 1e-12):
            notes.append(f"{which}: a crown radius larger than the diameter is outside the usual "
                         "proportions (common practice)")
        if spec.knuckle < 0.06 * D * (1 - 1e-12):
            notes.append(f"{which}: a knuckle under 6 % of the diameter is outside the usual "
                         "proportions (common practice)")
    return notes


def design_vessel(diameter: float, length: float, head_1: HeadSpec, head_2: HeadSpec, *,
                 thickness: Optional[float] = None, dimensions: str = "inside",
                 unit: str = "mm") -> VesselDesign:
    """Build the inside (and, with a thickness, the wall) of a vessel; exact geometry.

    Parameters
    ----------
    diameter : float
        The shell's diameter on the stated surface (``dimensions``).
    length : float
        The straight shell from tangent line to tangent line (0 for a vessel
        made of two heads only).
    head_1, head_2 : HeadSpec
        Head 1 is at the start of the axis (the bottom of a vertical vessel).
    thickness : float, optional
        Wall thickness, the same for the shell and both heads.
    dimensions : "inside" or "outside"
        Which surface ``diameter`` and the head radii describe.
    unit : str
        The length unit of every number.

    Examples
    --------
    >>> v = design_vessel(1000.0, 1500.0, HeadSpec("flat"), HeadSpec("hemispherical"),
    ...                  thickness=10.0)
    >>> [s.kind for s in v.inside.segments]
    ['line', 'line', 'arc', 'line']
    >>> v.outside_diameter
    1020.0
    >>> design_vessel(1000.0, 1000.0, HeadSpec("torispherical", crown=400.0, knuckle=60.0),
    ...              HeadSpec("flat"))
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: head 1: the crown radius 400 is less than the shell radius 500: the crown cannot reach the knuckle tangentially; make it larger than the radius (about the diameter is usual)
    """
    for name, value in (("diameter", diameter), ("length", length)):
        if not isinstance(value, (int, float)) or not math.isfinite(value):
            raise RevolveError(f"the {name} must be a finite number", place=name)
    if not diameter > 0:
        raise RevolveError(f"the diameter must be positive, got {diameter:g}", place="diameter")
    if length < 0:
        raise RevolveError(f"the shell length must not be negative, got {length:g}", place="length")
    if length <= 1e-9 * diameter and head_1.kind == "flat" and head_2.kind == "flat":
        raise RevolveError("two flat heads need a shell between them; give a length above 0",
                           place="length")
    if dimensions not in ("inside", "outside"):
        raise RevolveError(f"dimensions must be inside or outside, got {dimensions!r}",
                           place="dimensions")
    t = None if thickness is None else float(thickness)
    if t is not None:
        if not math.isfinite(t) or t <= 0:
            raise RevolveError(f"the wall thickness must be positive, got {thickness:g}",
                               place="thickness")
        if dimensions == "outside" and t >= diameter / 2:
            raise RevolveError(f"the wall thickness {t:g} is not less than the outside radius "
                               f"{diameter / 2:g}", place="thickness")
    R = diameter / 2.0
    w_in = 0.0 if dimensions == "inside" or t is None else -t
    w_out = None if t is None else (t if dimensions == "inside" else 0.0)
    inside, pole1, pole2 = _surface(head_1, head_2, R, length, w_in, ("head 1", "shell", "head 2"))
    from revolve.geometry.segments import Line
    inside_loop = Loop(tuple(inside) + (Line(pole2, pole1),))
    wall_loop = None
    o1 = o2 = None
    if t is not None:
        outside, o1, o2 = _surface(head_1, head_2, R, length, w_out,
                                   ("head 1 outside", "shell outside", "head 2 outside"))
        inner = _reverse(_surface(head_1, head_2, R, length, w_in,
                                  ("head 1 inside", "shell inside", "head 2 inside"))[0])
        wall_loop = Loop(tuple(outside) + (Line(o2, pole2),) + tuple(inner) + (Line(pole1, o1),))
    notes = _common_practice_notes(head_1, diameter, "head 1") + \
        _common_practice_notes(head_2, diameter, "head 2")
    d_in = 2 * (R + w_in)
    d_out = None if t is None else 2 * (R + w_out)
    return VesselDesign(float(diameter), float(length), (head_1, head_2), t, dimensions, unit,
                        inside_loop, wall_loop, d_in, d_out, (pole1[0], pole2[0]),
                        None if o1 is None else (o1[0], o2[0]), tuple(notes))


def _reverse(segs):
    return [s.reversed() for s in segs[::-1]]


# -- drawing the vessel in the sketch ------------------------------------------------------

def _to_sketch(seg, orientation: str):
    """Frame segment -> sketch: horizontal keeps (z, r) as (x, y); vertical draws (r, z).

    The swap is a mirror, applied through the segment contract (``transformed``):
    an arc's turn reverses, a curve keeps its base expressions (no recompilation).
    """
    if orientation == "horizontal":
        return seg
    return seg.transformed((0.0, 1.0, 1.0, 0.0))


def sketch_profile(design: VesselDesign, orientation: str = "vertical", which: str = "inside",
                   name: Optional[str] = None) -> Tuple[Profile, Axis]:
    """The liquid space (or the wall) as a sketch profile and its axis, for the profile file.

    Vertical vessels are drawn with the axis along the sketch y (up) and the
    radius along x; horizontal ones with the axis along x.

    >>> v = design_vessel(1000.0, 1000.0, HeadSpec("flat"), HeadSpec("flat"))
    >>> p, axis = sketch_profile(v, "vertical")
    >>> axis.direction, p.loops[0].segments[0].start, p.loops[0].segments[0].end
    ((0.0, 1.0), (0.0, 0.0), (500.0, 0.0))
    """
    if orientation not in ("vertical", "horizontal"):
        raise RevolveError(f"the orientation must be vertical or horizontal, got {orientation!r}")
    loop = design.inside if which == "inside" else design.wall
    if loop is None:
        raise RevolveError("the vessel has no wall thickness, so there is no wall to draw")
    segs = tuple(_to_sketch(s, orientation) for s in loop.segments)
    axis = Axis.y() if orientation == "vertical" else Axis.x()
    return Profile(loops=(Loop(segs),), unit=design.unit, name=name), axis


def describe(design: VesselDesign) -> str:
    """A one-line name for the vessel, e.g. for the profile file.

    >>> describe(design_vessel(1200.0, 3000.0, HeadSpec("ellipsoidal"), HeadSpec("ellipsoidal")))
    'vessel, inside diameter 1200 mm, shell 3000 mm, heads ellipsoidal 2:1 / ellipsoidal 2:1'
    """
    u = design.unit
    text = (f"vessel, {design.dimensions} diameter {design.diameter:g} {u}, "
            f"shell {design.length:g} {u}, heads {design.heads[0].describe(u)} / "
            f"{design.heads[1].describe(u)}")
    if design.thickness is not None:
        text += f", wall {design.thickness:g} {u}"
    return text


# -- summary ------------------------------------------------------------------------------

@dataclass(frozen=True)
class HeadSummary:
    """One head's figures (vessel units): inside depth beyond its tangent line, the volume
    there, its inside surface; outside depth with a thickness."""

    which: str
    spec: HeadSpec
    depth: float
    depth_outside: Optional[float]
    volume: float
    inside_area: float


@dataclass(frozen=True)
class VesselSummary:
    """Everything ``revolve vessel`` reports, in vessel units and kg.

    Centres of mass are along the axis from the tangent line of head 1.
    Densities are in kg/m³; ``si_length`` converts the vessel unit to metres.
    """

    design: VesselDesign
    capacity: float
    shell_volume: float
    heads: Tuple[HeadSummary, HeadSummary]
    inside_length: float
    outside_length: Optional[float]
    inside_area: float
    shell_inside_area: float
    outside_area: Optional[float]
    metal_volume: Optional[float]
    metal_density: Optional[float]
    metal_mass: Optional[float]
    liquid_density: Optional[float]
    liquid_mass: Optional[float]
    mass_full: Optional[float]
    centre_of_mass_liquid: float
    centre_of_mass_empty: Optional[float]
    centre_of_mass_full: Optional[float]
    crosscheck_difference: float
    notes: Tuple[str, ...]


def summarise(design: VesselDesign, metal_density: Optional[float] = None,
              liquid_density: Optional[float] = None, si_length: float = 1e-3) -> VesselSummary:
    """Capacity, heads, surfaces, metal, masses and centres of mass of a vessel.

    ``metal_density`` and ``liquid_density`` are in kg/m³; ``si_length`` is
    the vessel unit in metres (1e-3 for mm). Every volume and surface comes
    from the engine (Pappus–Guldinus, with its independent cross-check);
    head volumes from the section clipped at the tangent lines.

    >>> v = design_vessel(1000.0, 0.0, HeadSpec("hemispherical"), HeadSpec("hemispherical"),
    ...                  thickness=10.0)
    >>> s = summarise(v, metal_density=7850.0, liquid_density=1000.0)
    >>> round(s.capacity / (4 / 3 * math.pi * 500.0 ** 3), 12)           # a sphere
    1.0
    >>> round(s.metal_volume / (4 / 3 * math.pi * (510.0 ** 3 - 500.0 ** 3)), 12)
    1.0
    >>> round(s.centre_of_mass_full, 9), round(s.liquid_mass, 6)   # kg: 1000 kg/m³ × π/6 m³
    (0.0, 523.598776)
    """
    from revolve.geometry.checks import prepare
    from revolve.geometry.clipping import vertical_levels
    from revolve.geometry.measure import measure
    from revolve.geometry.profile import Revolution

    axis = Axis.x()
    inside_profile = Profile(loops=(design.inside,), unit=design.unit)
    m_in = measure(Revolution(inside_profile, axis), symbolic=False)
    prep = m_in.prepared or prepare(inside_profile, axis)   # the measurement's, not again
    below = vertical_levels(prep, [0.0, design.length], m_in.section.loop_factors)
    v_head1 = float(below.volume[0])
    v_head2 = m_in.volume - float(below.volume[1])
    shell_volume = float(below.volume[1]) - v_head1
    faces = m_in.surface_by_face
    pole1_z, pole2_z = design.poles
    depth1, depth2 = -pole1_z, pole2_z - design.length
    check = m_in.crosscheck.volume_difference if m_in.crosscheck else 0.0
    check = max(check, m_in.crosscheck.surface_difference if m_in.crosscheck else 0.0)
    m_wall = None
    outside_area = metal_volume = metal_mass = None
    d1o = d2o = None
    outside_length = None
    if design.wall is not None:
        m_wall = measure(Revolution(Profile(loops=(design.wall,), unit=design.unit), axis),
                         symbolic=False)
        metal_volume = m_wall.volume
        outside_area = sum(v for k, v in m_wall.surface_by_face.items() if k.endswith("outside"))
        o1, o2 = design.outside_poles
        d1o, d2o = -o1, o2 - design.length
        outside_length = o2 - o1
        if m_wall.crosscheck:
            check = max(check, m_wall.crosscheck.volume_difference,
                        m_wall.crosscheck.surface_difference)
        if metal_density is not None:
            metal_mass = metal_density * metal_volume * si_length ** 3
    liquid_mass = None if liquid_density is None else liquid_density * m_in.volume * si_length ** 3
    com_liquid = m_in.centre_of_mass_axial
    com_empty = None if m_wall is None else m_wall.centre_of_mass_axial
    com_full = None
    mass_full = None
    if liquid_mass is not None and metal_mass is not None:
        mass_full = metal_mass + liquid_mass
        com_full = (metal_mass * com_empty + liquid_mass * com_liquid) / mass_full
    heads = (HeadSummary("head 1", design.heads[0], depth1, d1o, v_head1, faces.get("head 1", 0.0)),
             HeadSummary("head 2", design.heads[1], depth2, d2o, v_head2, faces.get("head 2", 0.0)))
    return VesselSummary(design, m_in.volume, shell_volume, heads, pole2_z - pole1_z,
                         outside_length, m_in.surface_total, faces.get("shell", 0.0), outside_area,
                         metal_volume, metal_density, metal_mass, liquid_density, liquid_mass,
                         mass_full, com_liquid, com_empty, com_full, check, design.notes)


# -- the job: a vessel from text settings, as a result --------------------------------------

#: Largest relative difference allowed between the two computations.
DEFAULT_TOLERANCE = 1e-9
#: The library's names of the settings (the command line passes its option names instead).
LIBRARY_NAMES = {key: key for key in ("diameter", "length", "head", "head_1", "head_2", "units",
                                      "dimensions", "thickness", "material", "density", "liquid",
                                      "liquid_density", "orientation", "length_unit",
                                      "volume_unit", "area_unit", "mass_unit", "tolerance",
                                      "name")}
_HEAD_HELP = ("flat, hemispherical, ellipsoidal, torispherical, torispherical-10, "
              "torispherical-80, conical:angle=A")


def snapped(value: float) -> float:
    """``value`` to 15 significant digits, the decimal precision of a float.

    A unit conversion or a ratio leaves noise in the last bits
    (5.999999999999999 for 6 in, 62.499999999999986 %); the 15-digit form
    drops it and changes a value by less than 1e-15 of itself, so the JSON
    and the CSV keep the figures' full precision without the noise.

    >>> snapped(0.1524 / 0.0254), snapped(62.499999999999986), snapped(20943.951023931953)
    (6.0, 62.5, 20943.951023932)
    """
    if not isinstance(value, float) or not math.isfinite(value):
        return value
    return float(f"{value:.15g}")


@dataclass(frozen=True)
class TradeUnits(OutputUnits):
    """Output units whose shown values carry no last-bit noise (see :func:`snapped`)."""

    def show(self, value: Any, role: Optional[str]) -> Any:
        shown = OutputUnits.show(self, value, role)
        return [snapped(v) for v in shown] if isinstance(shown, list) else snapped(shown)


@dataclass(frozen=True, repr=False)
class VesselResult(Result):
    """A built vessel and its figures; ``to_dict()`` is ``revolve vessel --json``.

    ``design`` is the :class:`VesselDesign` (exact geometry, vessel units),
    ``summary`` the :class:`VesselSummary`; :meth:`profile_text` and
    :meth:`wall_text` give the profile files ``revolve vessel`` writes.
    ``capacity`` is in the capacity unit (``units.unit("capacity")``).

    Examples
    --------
    No shell between two hemispherical heads is a sphere, π/6 · 1³ m³
    (from memory):

    >>> ball = build_vessel("1 m", 0, head="hemispherical")
    >>> round(ball.capacity, 6), round(math.pi / 6 * 1000, 6), ball.units.unit("capacity")
    (523.598776, 523.598776, 'L')
    >>> ball            # doctest: +ELLIPSIS
    <VesselResult vessel, inside diameter 1000 mm, shell 0 mm, ...: capacity=523.599 L, ...>
    >>> ball._repr_html_().startswith("<table>")
    True
    """

    design: Optional[VesselDesign] = None
    summary: Optional[VesselSummary] = None
    orientation: str = "vertical"
    name: str = ""
    metal_key: Optional[str] = None

    @property
    def capacity(self) -> float:
        return self.table("vessel").json(self.units)["capacity"]

    def __repr__(self) -> str:
        figures = self.table("vessel").json(self.units)
        text = (f"capacity={figures['capacity']:.6g} {self.units.unit('capacity')}, "
                f"inside surface={figures['inside_area']:.6g} {self.units.unit('area')}")
        if "metal_mass" in figures:
            text += f", metal={figures['metal_mass']:.6g} {self.units.unit('mass')}"
        return f"<VesselResult {self.name}: {text}>"

    def profile_text(self) -> str:
        """The liquid space as a profile file (for ``revolve measure`` and ``revolve levels``)."""
        from revolve.formats.writer import profile_text

        profile, axis = sketch_profile(self.design, self.orientation, "inside", name=self.name)
        return profile_text(profile, axis=axis, angle=360, section="space",
                            orientation=self.orientation)

    def wall_text(self) -> str:
        """The wall (metal section) as a profile file, with its material or density."""
        from revolve.formats.writer import profile_text

        wall, axis = sketch_profile(self.design, self.orientation, "wall",
                                    name=self.name + " (wall)")
        density = self.summary.metal_density
        return profile_text(wall, axis=axis, angle=360, orientation=self.orientation,
                            material=self.metal_key or None,
                            density=None if self.metal_key or density is None
                            else f"{density!r} kg/m^3")


def _vessel_length(value, unit: str, option: str) -> float:
    """A length (``1200``, ``"1.2 m"``, ``"3' 4 1/8\\""``, a Length or pint quantity) in ``unit``."""
    from revolve.inputs import Length, parse_length

    try:
        if isinstance(value, Length):
            length = value
        elif hasattr(value, "to") and hasattr(value, "magnitude"):
            length = Length(float(value.to("m").magnitude), "m")
        else:
            length = parse_length(value)
        return length.in_unit(unit, unit)
    except RevolveError as e:
        raise e.located(option=option)


def _material(material, density, material_option: str, density_option: str):
    """(kg/m³, label, material key) from a material name or a density (text, number, pint)."""
    from revolve.materials import density_value, material_or_density

    if density is None or isinstance(density, str) or material is not None:
        return material_or_density(material, density if density is None or isinstance(
            density, str) else repr(density), material_option=material_option,
            density_option=density_option)
    d, label = density_value(density, density_option)
    return d, label, None


def build_vessel(diameter, length, *, head: Optional[str] = None, head_1: Optional[str] = None,
                 head_2: Optional[str] = None, units: str = "mm", dimensions: str = "inside",
                 thickness=None, material: Optional[str] = None, density=None,
                 liquid: Optional[str] = None, liquid_density=None,
                 orientation: str = "vertical", name: Optional[str] = None,
                 length_unit: Optional[str] = None, volume_unit: Optional[str] = None,
                 area_unit: Optional[str] = None, mass_unit: Optional[str] = None,
                 tolerance: float = DEFAULT_TOLERANCE, names=None) -> VesselResult:
    """Build a vessel from its diameter, shell length and heads; its capacity, surfaces and masses.

    The same computation as ``revolve vessel``: ``result.to_dict()`` is the
    object ``revolve vessel --json`` prints (``files`` empty).

    Parameters
    ----------
    diameter, length : length text, number, Length or pint quantity
        Shell diameter and straight shell (tangent line to tangent line; 0
        for two heads only): ``"1.2 m"``, ``"48 in"``; a bare number is in ``units``.
    head, head_1, head_2 : str
        Both heads, or head 1 (start of the axis, the bottom) and head 2:
        ``flat``, ``hemispherical``, ``ellipsoidal``, ``torispherical``,
        ``torispherical-10``, ``torispherical-80``, ``conical:angle=A`` (see
        the module notes for the settings).
    units : str
        The vessel's length unit (of bare numbers and of the profile files).
    dimensions : "inside" or "outside"
        The surface the diameter and head radii describe.
    thickness : length, optional
        Wall thickness (shell and heads); needed for the metal.
    material, density : optional
        The metal: a material of the table, or a density with its unit
        (``"7850 kg/m^3"``; a bare number is kg/m³).
    liquid, liquid_density : optional
        The contents, likewise (``"water"``, ``"850 kg/m^3"``).
    orientation : "vertical" or "horizontal"
        How the profile files draw it (and how ``revolve levels`` reads them).
    length_unit, volume_unit, area_unit, mass_unit : str, optional
        Output units; defaults by the vessel trade: lengths in ``units``,
        capacities and volumes in L (US gal for inch or foot work), areas
        in m² (ft²), masses in kg (lb).
    tolerance : float
        Relative difference allowed between the two computations
        (``result.extra["crosscheck"]["agrees"]``).
    names : mapping, optional
        The names errors give the settings (:data:`LIBRARY_NAMES`; the
        command line passes its option names).

    Returns
    -------
    VesselResult

    Examples
    --------
    A sphere of 1 m made of two hemispherical heads holds π/6 m³:

    >>> r = build_vessel("1 m", 0, head="hemispherical")
    >>> round(r.capacity, 6), r.units.unit("capacity")
    (523.598776, 'L')
    >>> r                                                   # doctest: +ELLIPSIS
    <VesselResult vessel, inside diameter 1000 mm, ...: capacity=523.599 L, inside surface=3.14159 m²>
    >>> build_vessel(1000, 500, head="flat", thickness=0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: thickness: the wall thickness must be positive, got 0
    """
    from revolve import units as registry
    from revolve.jobs.results import Field, Table, rows_of, trade_units

    n = dict(LIBRARY_NAMES, **(names or {}))
    try:
        unit = registry.canonical(units, "length")
    except RevolveError as e:
        raise e.located(option=n["units"])
    overrides = {"length": length_unit, "level": length_unit, "diameter": length_unit,
                 "area": area_unit, "capacity": volume_unit, "volume": volume_unit,
                 "mass": mass_unit}
    opts = {"length": n["length_unit"], "level": n["length_unit"],
            "diameter": n["length_unit"], "area": n["area_unit"], "capacity": n["volume_unit"],
            "volume": n["volume_unit"], "mass": n["mass_unit"]}
    shown = trade_units("vessel", unit, overrides, options=opts)
    shown = TradeUnits(shown.units, shown.currency)
    orientation = str(orientation or "vertical").strip().lower()
    if orientation not in ("vertical", "horizontal"):
        raise RevolveError(f"give vertical or horizontal, got {orientation!r}",
                           option=n["orientation"])
    dimensions = str(dimensions or "inside").strip().lower()
    if dimensions not in ("inside", "outside"):
        raise RevolveError(f"give inside or outside, got {dimensions!r}", option=n["dimensions"])
    from revolve.inputs import positive_tolerance

    tolerance = positive_tolerance(tolerance, n["tolerance"])
    D = _vessel_length(diameter, unit, n["diameter"])
    L = _vessel_length(length, unit, n["length"])
    if not D > 0:
        raise RevolveError(f"the diameter must be positive, got {D:g}", option=n["diameter"])
    if L < 0:
        raise RevolveError(f"the shell length must not be negative, got {L:g}",
                           option=n["length"])
    t = None if thickness is None else _vessel_length(thickness, unit, n["thickness"])
    if head and (head_1 or head_2):
        raise RevolveError(f"give {n['head']} for both ends, or {n['head_1']} and {n['head_2']}, "
                           "not both", option=n["head"])
    text_1, text_2 = (head, head) if head else (head_1, head_2)
    if not text_1 or not text_2:
        missing = n["head_1"] if not text_1 else n["head_2"]
        raise RevolveError(f"give the heads: {n['head']} KIND for both ends, or {n['head_1']} and "
                           f"{n['head_2']} ({_HEAD_HELP})",
                           option=missing if head_1 or head_2 else n["head"])
    spec_1 = parse_head(text_1, D, place=n["head"] if head else n["head_1"])
    spec_2 = parse_head(text_2, D, place=n["head"] if head else n["head_2"])
    metal_d, metal_label, metal_key = _material(material, density, n["material"], n["density"])
    liquid_d, liquid_label, _ = _material(liquid, liquid_density, n["liquid"],
                                          n["liquid_density"])
    if metal_d is not None and t is None:
        raise RevolveError("the metal's mass needs a wall thickness; give " + n["thickness"],
                           option=n["material"] if material else n["density"])
    try:
        design = design_vessel(D, L, spec_1, spec_2, thickness=t, dimensions=dimensions,
                               unit=unit)
    except RevolveError as e:
        place = e.place or ""
        if place in ("head 1", "head 2"):
            option = n["head"] if head else n["head_1" if place == "head 1" else "head_2"]
            raise type(e)(e.message, option=option, place=place) from None
        if place in ("diameter", "length", "thickness", "dimensions"):
            raise type(e)(e.message, option=n[place]) from None
        raise
    metre = registry.factor(unit, "length")
    s = summarise(design, metal_density=metal_d, liquid_density=liquid_d, si_length=metre)
    description = describe(design)
    title = name.strip() if name and name.strip() else description

    def si(value, power=1):
        return None if value is None else value * metre ** power

    figures = {
        "inside_diameter": si(design.inside_diameter),
        "outside_diameter": si(design.outside_diameter), "shell_length": si(design.length),
        "thickness": si(design.thickness), "inside_length": si(s.inside_length),
        "outside_length": si(s.outside_length),
        "capacity": si(s.capacity, 3), "shell_volume": si(s.shell_volume, 3),
        "inside_area": si(s.inside_area, 2), "shell_inside_area": si(s.shell_inside_area, 2),
        "outside_area": si(s.outside_area, 2), "metal_volume": si(s.metal_volume, 3),
        "metal_mass": s.metal_mass, "liquid_mass": s.liquid_mass, "mass_full": s.mass_full,
        "centre_of_mass_liquid": si(s.centre_of_mass_liquid),
        "centre_of_mass_empty": si(s.centre_of_mass_empty),
        "centre_of_mass_full": si(s.centre_of_mass_full)}
    figure_fields = (
        Field("inside_diameter", "inside diameter", "length"),
        Field("outside_diameter", "outside diameter", "length"),
        Field("shell_length", "straight shell (tangent to tangent)", "length"),
        Field("thickness", "wall thickness", "length"),
        Field("inside_length", "inside length (pole to pole)", "length"),
        Field("outside_length", "outside length", "length"),
        Field("capacity", "capacity", "capacity"),
        Field("shell_volume", "  of it in the shell", "capacity"),
        Field("inside_area", "inside surface", "area"),
        Field("shell_inside_area", "  of it on the shell", "area"),
        Field("outside_area", "outside surface", "area"),
        Field("metal_volume", "metal volume", "volume"),
        Field("metal_mass", "metal mass (empty)", "mass"),
        Field("liquid_mass", "liquid mass, full", "mass"),
        Field("mass_full", "mass full", "mass"),
        Field("centre_of_mass_liquid", "centre of mass of the liquid, full", "length"),
        Field("centre_of_mass_empty", "centre of mass, empty", "length"),
        Field("centre_of_mass_full", "centre of mass, full", "length"))
    heads = []
    for h in s.heads:
        row = {"which": h.which, "kind": h.spec.kind, "description": h.spec.describe(unit),
               "crown": si(h.spec.crown), "knuckle": si(h.spec.knuckle),
               "angle_degrees": h.spec.angle, "depth": si(h.depth),
               "depth_outside": si(h.depth_outside), "volume": si(h.volume, 3),
               "inside_area": si(h.inside_area, 2)}
        heads.append({k: v for k, v in row.items() if v is not None})
    head_fields = (Field("which", "head", style="text"),
                   Field("description", "kind", style="text"),
                   Field("depth", "depth", "length"),
                   Field("depth_outside", "depth outside", "length"),
                   Field("volume", "volume", "capacity"),
                   Field("inside_area", "inside area", "area"))
    notes = ["heads: depth and volume beyond the tangent line (where the head meets the shell)",
             "centres of mass: along the axis from the tangent line of head 1",
             f"drawn {orientation}; head 1 is at the start of the axis"
             + (" (the bottom)" if orientation == "vertical" else " (the left end)")]
    if title != description:
        notes.insert(0, description)
    if metal_label:
        notes.append(f"metal: {metal_label}")
    if liquid_label:
        notes.append(f"liquid: {liquid_label}")
    notes += list(s.notes)
    notes.append(f"cross-check: largest relative difference {s.crosscheck_difference:.1e}")
    check = s.crosscheck_difference
    inputs = {"unit": unit, "dimensions": dimensions,
              "heads": [spec_1.describe(unit), spec_2.describe(unit)],
              "orientation": orientation, "name": title}
    extra = {"description": description, "metal": metal_label, "liquid": liquid_label,
             "files": {"liquid_space": None, "wall": None},
             "crosscheck": {"largest_difference": check, "tolerance": tolerance,
                            "agrees": bool(check <= tolerance)}}
    cautions = ("vessel",) + (("lifting",) if s.metal_mass is not None else ())
    return VesselResult(
        "vessel", shown, inputs,
        (Table("vessel", title, figure_fields,
               rows_of([{k: v for k, v in figures.items() if v is not None}]), figures=True),
         Table("heads", "Heads", head_fields, rows_of(heads))),
        tuple(notes), cautions, extra, design=design, summary=s, orientation=orientation,
        name=title, metal_key=metal_key)
