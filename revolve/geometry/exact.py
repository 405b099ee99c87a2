"""Closed forms of area, volume and surface when every input is exact.

Used by ``revolve measure --exact``. Each segment's exact inputs (integers,
decimal fractions, expression strings: see the segments' ``exact`` field) are
turned into sympy numbers and the same Green's-theorem sums as the numeric
engine are formed symbolically: lines and arcs in closed form, curves by
``sympy.integrate`` within a time budget. A closed form is only reported when
its value agrees with the numeric result, so a symbolic slip can never print a
wrong figure.

Examples
--------
A 3 × 3 square from r = 0 to 3 about x, swept 360°: a cylinder of volume 27π.

>>> from fractions import Fraction as F
>>> from revolve.geometry.profile import Loop, Profile, Revolution, Axis
>>> from revolve.geometry.segments import Line
>>> pts = [(0, 0), (3, 0), (3, 3), (0, 3)]
>>> segs = tuple(Line(pts[i], pts[(i + 1) % 4], exact=tuple(F(v) for v in pts[i] + pts[(i + 1) % 4]))
...              for i in range(4))
>>> prof = Profile(loops=(Loop(segs),))
>>> from revolve.geometry.measure import measure
>>> rev = Revolution(prof, Axis((0, 0), (1, 0), exact=((F(0), F(0)), (F(1), F(0)))))
>>> exact_closed_forms(prof, rev, measure(rev), F(360))["volume"]
'27*pi'
"""

from __future__ import annotations

import math
from fractions import Fraction
from typing import Any, Dict, Optional

from revolve.errors import indefinite


class NotExact(Exception):
    """An input has no exact value, or sympy gave up within its budget."""


def _sym(v: Any):
    import sympy

    if isinstance(v, bool):
        raise NotExact("a flag is not a number")
    if isinstance(v, Fraction):
        return sympy.Rational(v.numerator, v.denominator)
    if isinstance(v, int):
        return sympy.Integer(v)
    if isinstance(v, str):
        from revolve.expr import parse_number
        return parse_number(v)
    if isinstance(v, float):
        raise NotExact("a coordinate is a binary float")
    if hasattr(v, "is_number") and v.is_number:
        return v
    raise NotExact(f"no exact value for {v!r}")


def _pt(p):
    return (_sym(p[0]), _sym(p[1]))


def exact_closed_forms(profile, revolution, measurement, angle_degrees,
                       budget_seconds: float = 8.0) -> Dict[str, Any]:
    """Closed forms (as text) of area, volume and surfaces; raises NotExact when unavailable."""
    import sympy
    from revolve.geometry.integrals import _run_with_budget

    ax = revolution.axis
    if ax.exact is None:
        raise NotExact("the axis has no exact definition")
    (px, py), (dx, dy) = _pt(ax.exact[0]), _pt(ax.exact[1])
    norm = sympy.sqrt(dx * dx + dy * dy)
    side = int(measurement.side)

    def frame(p):
        x, y = p
        return (((x - px) * dx + (y - py) * dy) / norm, side * (dx * (y - py) - dy * (x - px)) / norm)

    theta = _sym(angle_degrees) * sympy.pi / 180
    factors = list(measurement.section.loop_factors)
    t = sympy.Symbol("t", real=True)
    area = sympy.Integer(0)
    first = sympy.Integer(0)   # ∫∫ r dA
    faces: Dict[str, Any] = {}
    loop_no = 0
    from revolve.geometry.profile import UNNAMED_FACE

    for path in profile.paths:
        f = 0
        if path.closed:
            f = int(factors[loop_no])
            loop_no += 1
        for seg in path.segments:
            if seg.exact is None and seg.kind != "curve":
                raise NotExact(f"{indefinite(seg.kind)} has no exact inputs")
            if seg.kind == "line":
                x0, y0, x1, y1 = (_sym(v) for v in seg.exact)
                (z0, r0), (z1, r1) = frame((x0, y0)), frame((x1, y1))
                c = z0 * r1 - z1 * r0
                m00, m01 = c / 2, c * (r0 + r1) / 6
                length = sympy.sqrt((x1 - x0) ** 2 + (y1 - y0) ** 2)
                lr = length * (r0 + r1) / 2
            elif seg.kind == "arc":
                m00, m01, lr = _arc_terms(seg, frame, side)
            else:
                m00, m01, lr = _curve_terms(seg, frame, t, budget_seconds, _run_with_budget)
            area += f * m00
            first += f * m01
            name = seg.face or UNNAMED_FACE
            faces[name] = faces.get(name, 0) + theta * lr

    def simple(e):
        r = _run_with_budget(lambda: sympy.simplify(e), budget_seconds / 4)
        return r if r is not None else e

    out: Dict[str, Any] = {}
    checks = []
    if any(p.closed for p in profile.paths):
        a_s, v_s = simple(area), simple(theta * first)
        checks += [(a_s, measurement.area), (v_s, measurement.volume)]
        out["area"], out["volume"] = str(a_s), str(v_s)
    face_s = {k: simple(v) for k, v in faces.items()}
    if len(face_s) > 1 and face_s.get(UNNAMED_FACE) == 0:
        del face_s[UNNAMED_FACE]  # segments on the axis sweep nothing
    total = simple(sum(faces.values()))
    checks += [(v, measurement.surface_by_face[k]) for k, v in face_s.items()]
    checks.append((total, measurement.surface_total))
    out["surface_by_face"] = {k: str(v) for k, v in face_s.items()}
    out["surface_area"] = str(total)
    for expr, num in checks:
        val = float(sympy.N(expr, 30))
        if not math.isclose(val, num, rel_tol=1e-9, abs_tol=1e-12 * max(1.0, abs(num))):
            raise NotExact(f"the closed form {expr} does not match the computed {num:.12g}")
    return {k: (v.replace("**", "^") if isinstance(v, str) else
                {a: b.replace("**", "^") for a, b in v.items()}) for k, v in out.items()}


def _arc_terms(seg, frame, side):
    import sympy

    kind = seg.exact[0]
    if kind == "centre":
        _, p0, p1, c, _cw = seg.exact
        p0, p1, c = _pt(p0), _pt(p1), _pt(c)
        R = sympy.sqrt((p0[0] - c[0]) ** 2 + (p0[1] - c[1]) ** 2)
    elif kind == "radius":
        _, p0, p1, R, which, major = seg.exact
        p0, p1, R = _pt(p0), _pt(p1), _sym(R)
        ddx, ddy = p1[0] - p0[0], p1[1] - p0[1]
        chord = sympy.sqrt(ddx * ddx + ddy * ddy)
        h = sympy.sqrt(R * R - chord * chord / 4)
        sign = -1 if which == "left" else 1
        if major:
            sign = -sign
        c = ((p0[0] + p1[0]) / 2 + sign * h * (-ddy) / chord,
             (p0[1] + p1[1]) / 2 + sign * h * ddx / chord)
    else:
        raise NotExact("unknown arc form")
    (z0, r0), (z1, r1), (cz, cr) = frame(p0), frame(p1), frame(c)
    s0, c0, s1, c1 = (r0 - cr) / R, (z0 - cz) / R, (r1 - cr) / R, (z1 - cz) / R
    sweep_num = seg.sweep() * side  # a mirror reverses the direction
    a0 = sympy.atan2(r0 - cr, z0 - cz)
    a1 = sympy.atan2(r1 - cr, z1 - cz)
    base = float(sympy.N(a1 - a0))
    k = round((sweep_num - base) / (2 * math.pi))
    d = a1 - a0 + 2 * sympy.pi * k
    m00 = (R * R * d + R * (cz * (s1 - s0) - cr * (c1 - c0))) / 2
    int_sin_cos = (s1 * s1 - s0 * s0) / 2
    int_sin2 = d / 2 - (s1 * c1 - s0 * c0) / 2
    m01 = (cr * R * R * d + cr * R * cz * (s1 - s0) - cr * cr * R * (c1 - c0)
           - R ** 3 * (c1 - c0) + R * R * cz * int_sin_cos + R * R * cr * int_sin2) / 3
    sgn = 1 if sweep_num > 0 else -1
    lr = R * sgn * (cr * d - R * (c1 - c0))
    return m00, m01, lr


def _curve_terms(seg, frame, t, budget, run):
    import sympy

    if not seg.exact:
        raise NotExact("the curve's interval has no exact value")
    t0, t1 = _sym(seg.exact[0]), _sym(seg.exact[1])
    z, r = frame((seg.x_expr, seg.y_expr))
    dz, dr = sympy.diff(z, t), sympy.diff(r, t)
    w = sympy.expand(z * dr - r * dz)
    out = []
    for k, g in enumerate((w / 2, r * w / 3, r * sympy.sqrt(dz * dz + dr * dr))):
        v = run(lambda g=g: sympy.integrate(g, (t, t0, t1)), budget / 3)
        if v is None or v.has(sympy.Integral):
            raise NotExact("sympy found no closed form for a curve's integral in time")
        if k == 2 and seg.t_end < seg.t_start:
            v = -v  # ds = |p'(t)| |dt|
        out.append(v)
    return tuple(out)


def exact_results(doc, revolution, measurement, exact_angle: Optional[float] = None) -> Dict[str, Any]:
    """What ``--exact`` prints: closed forms, or a note saying why there are none."""
    unit = doc.profile.unit
    if not doc.exact:
        return {"note": "not every input is exact, so there are no closed forms"}
    angle = exact_angle if exact_angle is not None else revolution.angle_degrees
    try:
        ang = Fraction(str(angle)) if not isinstance(angle, Fraction) else angle
        out = exact_closed_forms(doc.profile, revolution, measurement, ang)
    except NotExact as e:
        return {"note": f"no closed form: {e}"}
    except (ValueError, TypeError, ZeroDivisionError) as e:
        return {"note": f"no closed form: {e}"}
    out["units"] = {"area": f"{unit}²", "volume": f"{unit}³"}
    out["unit_is_profile"] = True
    return out
