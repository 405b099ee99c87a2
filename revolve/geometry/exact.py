"""Closed forms of area, volume and surface when every input is exact.

Used by ``revolve measure --exact``. Each segment's exact inputs (integers,
decimal fractions, expression strings: see the segments' ``exact`` field) are
turned into sympy numbers and the same Green's-theorem sums as the numeric
engine are formed symbolically: lines and arcs in closed form, curves by exact
polynomial integration where the integrand is a polynomial, otherwise by
``sympy.integrate`` in a separate worker process that is ended when its time
budget runs out (:func:`run_sympy`: no timer signals, so it is bounded in any
thread). A closed form is only reported when
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


_WORKER = r"""
import pickle, sys, sympy
tasks = pickle.load(sys.stdin.buffer)
out = []
for kind, *args in tasks:
    try:
        if kind == "integrate":
            out.append(sympy.integrate(args[0], (args[1], args[2], args[3])))
        else:
            out.append(sympy.simplify(args[0]))
    except Exception:
        out.append(None)
pickle.dump(out, sys.stdout.buffer)
"""


def run_sympy(tasks, seconds: float):
    """Run sympy ``integrate``/``simplify`` tasks in a worker process ended after ``seconds``.

    ``tasks`` is a list of ``("integrate", g, t, a, b)`` or ``("simplify", e)``
    with sympy expressions (built by the engine, never user text). Returns one
    result per task, None where sympy failed, or None for every task when the
    worker did not finish in time. The expressions travel pickled, to and from
    the worker only; no text is parsed on either side.

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> run_sympy([("integrate", t * sympy.sqrt(1 + t ** 2), t, 0, 1)], 60.0)
    [-1/3 + 2*sqrt(2)/3]
    >>> run_sympy([], 1.0)
    []
    """
    import pickle
    import subprocess
    import sys

    import sympy

    if not tasks:
        return []
    # The expressions travel pickled between this process and its own worker: no text is
    # ever parsed (sympify of a string would evaluate it). strict=True refuses strings.
    payload = pickle.dumps([(str(kind),) + tuple(sympy.sympify(a, strict=True) for a in rest)
                            for kind, *rest in tasks])
    try:
        done = subprocess.run([sys.executable, "-c", _WORKER], input=payload,
                              capture_output=True, timeout=seconds)
        results = pickle.loads(done.stdout) if done.returncode == 0 else None
    except (subprocess.TimeoutExpired, OSError, pickle.UnpicklingError, EOFError):
        return [None] * len(tasks)
    if not isinstance(results, list) or len(results) != len(tasks):
        return [None] * len(tasks)
    return results


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

    pending = []     # (face, factor, m00, m01, lr, integrals still to do in the worker)
    for path in profile.paths:
        f = 0
        if path.closed:
            f = int(factors[loop_no])
            loop_no += 1
        for seg in path.segments:
            if seg.exact is None and seg.kind != "curve":
                raise NotExact(f"{indefinite(seg.kind)} has no exact inputs")
            if seg.kind == "polyline":     # its edges are lines between exact vertices
                vertices = [_pt(p) for p in seg.exact.points]
                for a, b in zip(vertices[:-1], vertices[1:]):
                    pending.append((seg.face or UNNAMED_FACE, f, *_line_terms(a + b, frame), ()))
                continue
            if seg.kind == "line":
                m00, m01, lr = _line_terms(tuple(_sym(v) for v in seg.exact), frame)
                todo = ()
            elif seg.kind == "arc":
                m00, m01, lr = _arc_terms(seg, frame, side)
                todo = ()
            else:
                (m00, m01, lr), todo = _curve_terms(seg, frame, t)
            pending.append((seg.face or UNNAMED_FACE, f, m00, m01, lr, todo))
    tasks = [task[:5] for *_, todo in pending for _k, task in todo]
    results = iter(run_sympy(tasks, budget_seconds / 2))
    for name, f, *terms, todo in pending:
        for k, task in todo:
            v = next(results)
            if v is None or v.has(sympy.Integral):
                raise NotExact("sympy found no closed form for a curve's integral in time")
            terms[k] = -v if len(task) > 5 else v
        m00, m01, lr = terms
        area += f * m00
        first += f * m01
        faces[name] = faces.get(name, 0) + theta * lr

    def simple(exprs):
        # Already-short forms (16*pi, 3600*pi) are left alone: no worker for them.
        todo = [i for i, e in enumerate(exprs) if sympy.count_ops(e) > 2]
        done = run_sympy([("simplify", exprs[i]) for i in todo], budget_seconds / 2)
        out = list(exprs)
        for i, r in zip(todo, done):
            if r is not None:
                out[i] = r
        return out

    out: Dict[str, Any] = {}
    checks = []
    solid = any(p.closed for p in profile.paths)
    names = list(faces)
    done = simple(([area, theta * first] if solid else []) + [faces[k] for k in names]
                  + [sum(faces.values())])
    if solid:
        a_s, v_s = done[0], done[1]
        checks += [(a_s, measurement.area), (v_s, measurement.volume)]
        out["area"], out["volume"] = str(a_s), str(v_s)
        done = done[2:]
    face_s = dict(zip(names, done[:-1]))
    if len(face_s) > 1 and face_s.get(UNNAMED_FACE) == 0:
        del face_s[UNNAMED_FACE]  # segments on the axis sweep nothing
    total = done[-1]
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


def _line_terms(ends, frame):
    """Exact ∫∫ dA, ∫∫ r dA (Green's theorem) and ∫ r ds of the line from (x0, y0) to (x1, y1)."""
    import sympy

    x0, y0, x1, y1 = ends
    (z0, r0), (z1, r1) = frame((x0, y0)), frame((x1, y1))
    c = z0 * r1 - z1 * r0
    length = sympy.sqrt((x1 - x0) ** 2 + (y1 - y0) ** 2)
    return c / 2, c * (r0 + r1) / 6, length * (r0 + r1) / 2


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


def _curve_terms(seg, frame, t):
    """A curve's (m00, m01, lr) with the integrals that are polynomials done at once.

    Returns the three terms (None where not yet known) and the worker tasks for
    the rest as ``(index, task)`` pairs.
    """
    import sympy

    from revolve.geometry.integrals import _small_polynomial, polynomial_integral

    if not seg.exact:
        raise NotExact("the curve's interval has no exact value")
    t0, t1 = _sym(seg.exact[0]), _sym(seg.exact[1])
    # Expand only small polynomials here; anything else goes whole to the stoppable worker.
    small = _small_polynomial(seg.x_expr, t) and _small_polynomial(seg.y_expr, t)
    z, r = frame((seg.x_expr, seg.y_expr))
    dz, dr = sympy.diff(z, t), sympy.diff(r, t)
    w = sympy.expand(z * dr - r * dz) if small else z * dr - r * dz
    terms, todo = [None, None, None], []
    for k, g in enumerate((w / 2, r * w / 3, r * sympy.sqrt(dz * dz + dr * dr))):
        v = polynomial_integral(sympy.expand(g), t, t0, t1) if k < 2 and small else None
        if v is not None:
            terms[k] = v
        else:
            # ds = |p'(t)| |dt|: a length integral runs backwards with t.
            todo.append((k, ("integrate", g, t, t0, t1)
                         + (("backwards",) if k == 2 and seg.t_end < seg.t_start else ())))
    return tuple(terms), todo


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
