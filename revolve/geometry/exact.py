"""Closed forms of area, volume and surface when every input is exact.

Used by ``revolve measure --exact``. Each segment's exact inputs (integers,
decimal fractions, expression strings: see the segments' ``exact`` field) are
turned into sympy numbers and the same Green's-theorem sums as the numeric
engine are formed symbolically: lines and arcs in closed form, curves by exact
polynomial integration where the integrand is a polynomial, otherwise by
``sympy.integrate`` in a separate worker process (:func:`run_sympy`: no timer
signals, so it is bounded in any thread). A closed form is only reported when
its value agrees with the numeric result, so a symbolic slip can never print a
wrong figure.

The same input gives the same output on any machine under any load: what is
sent to sympy is decided before it runs, by size (an integrand of at most
:data:`MAX_INTEGRAND_OPS` operations, a result of at most
:data:`MAX_SIMPLIFY_OPS` to simplify), and the worker runs with a fixed hash
seed. Its wall-clock limit (:data:`SAFETY_SECONDS`) is only a last-resort
safety; when it is reached, the result says so (a note naming the limit as
depending on the machine), never silently.

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
from revolve.geometry.kinds.arc import ArcByCentre, ArcByRadius
from revolve.geometry.kinds.curve import CurveExact
from revolve.geometry.kinds.line import LineExact
from revolve.geometry.kinds.polyline import PolylineExact


class NotExact(Exception):
    """An input has no exact value, or sympy gave up within its bounds."""


#: Largest operation count (sympy's ``count_ops``) of a curve integrand sent to ``integrate``.
MAX_INTEGRAND_OPS = 60
#: Largest operation count of a closed form sent to ``simplify``; larger ones are printed as formed.
MAX_SIMPLIFY_OPS = 400
#: Wall-clock limit of one worker run: a last-resort safety against a machine that stalls,
#: never the budget that decides the result (see the module's notes); reported when reached.
SAFETY_SECONDS = 60.0


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


class _Stopped(list):
    """The results of a worker stopped at its time limit (all None)."""

    timed_out = True


def run_sympy(tasks, seconds: float):
    """Run sympy ``integrate``/``simplify`` tasks in a worker process ended after ``seconds``.

    ``tasks`` is a list of ``("integrate", g, t, a, b)`` or ``("simplify", e)``
    with sympy expressions (built by the engine, never user text). Returns one
    result per task, None where sympy failed, or None for every task when the
    worker did not finish in time (then the list's ``timed_out`` is True). The
    worker runs with ``PYTHONHASHSEED=0``, so its forms do not vary between
    runs. The expressions travel pickled, to and from the worker only; no text
    is parsed on either side.

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> run_sympy([("integrate", t * sympy.sqrt(1 + t ** 2), t, 0, 1)], 60.0)
    [-1/3 + 2*sqrt(2)/3]
    >>> run_sympy([], 1.0)
    []
    """
    import os
    import pickle
    import subprocess
    import sys

    if not tasks:
        return []
    from revolve.expr import as_sympy

    # The expressions travel pickled between this process and its own worker: no text is
    # ever parsed (as_sympy refuses strings; nothing here calls sympify).
    payload = pickle.dumps([(str(kind),) + tuple(as_sympy(a) for a in rest)
                            for kind, *rest in tasks])
    # A fixed hash seed: sympy's algorithms walk sets, so the same input gives the same form.
    env = {**os.environ, "PYTHONHASHSEED": "0"}
    try:
        done = subprocess.run([sys.executable, "-c", _WORKER], input=payload,
                              capture_output=True, timeout=seconds, env=env)
        results = pickle.loads(done.stdout) if done.returncode == 0 else None
    except subprocess.TimeoutExpired:
        return _Stopped([None] * len(tasks))
    except (OSError, pickle.UnpicklingError, EOFError):
        return [None] * len(tasks)
    if not isinstance(results, list) or len(results) != len(tasks):
        return [None] * len(tasks)
    return results


def _sym(v: Any):
    """The sympy number of an exact input (Fraction, int, expression text or tree, sympy)."""
    import sympy

    from revolve.expr import Expr, parse_number

    if isinstance(v, bool):
        raise NotExact("a flag is not a number")
    if isinstance(v, Fraction):
        return sympy.Rational(v.numerator, v.denominator)
    if isinstance(v, int):
        return sympy.Integer(v)
    if isinstance(v, str):
        v = parse_number(v)
    if isinstance(v, Expr):
        if v.variables or any(isinstance(n, float) for n in _numbers(v)):
            raise NotExact(f"no exact value for {v.text()}")
        return v.to_sympy()
    if isinstance(v, float):
        raise NotExact("a coordinate is a binary float")
    if hasattr(v, "is_number") and v.is_number:
        return v
    raise NotExact(f"no exact value for {v!r}")


def _numbers(tree):
    """The number values in a tree (to refuse binary floats as exact inputs)."""
    stack, out = [tree], []
    while stack:
        node = stack.pop()
        value = getattr(node, "value", None)
        if value is not None and not hasattr(node, "name"):
            out.append(value)
        stack.extend(node.children())
    return out


def _pt(p):
    return (_sym(p[0]), _sym(p[1]))


def exact_closed_forms(profile, revolution, measurement, angle_degrees,
                       safety_seconds: float = SAFETY_SECONDS) -> Dict[str, Any]:
    """Closed forms (as text) of area, volume and surfaces; raises NotExact when unavailable.

    Each segment's typed exact record decides its closed form (:data:`_TERMS`, by the
    record's type: a line's ends, an arc by radius or by centre, a curve's interval,
    a polyline's points). When the safety limit stopped ``simplify``, the forms are
    given as formed and ``note`` says so.
    """
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
            terms = _TERMS.get(type(seg.exact))
            if terms is None:
                raise NotExact(f"{indefinite(seg.kind)} has no exact inputs")
            (m00, m01, lr), todo = terms(seg, frame, side, t)
            pending.append((seg.face or UNNAMED_FACE, f, m00, m01, lr, todo))
    tasks = [task[:5] for *_, todo in pending for _k, task in todo]
    for task in tasks:
        ops = sympy.count_ops(task[1])
        if ops > MAX_INTEGRAND_OPS:
            raise NotExact(f"a curve's integrand has {ops} operations; exact integration is "
                           f"tried up to {MAX_INTEGRAND_OPS}")
        if not tried_exactly(task[1], t):
            raise NotExact("a curve's integral is not of a form tried exactly (a polynomial "
                           "times the square root of a polynomial of degree 2 at most, or a "
                           "polynomial in sin, cos, exp, sinh and cosh of a linear argument)")
    results = run_sympy(tasks, safety_seconds)
    if tasks and all(r is None for r in results) and _timed_out(results):
        raise NotExact(f"sympy's integrate did not finish within the safety limit of "
                       f"{safety_seconds:g} s (a limit that depends on the machine's speed "
                       "and load)")
    results = iter(results)
    for name, f, *terms, todo in pending:
        for k, task in todo:
            v = next(results)
            if v is None or v.has(sympy.Integral):
                raise NotExact("sympy found no closed form for a curve's integral")
            terms[k] = -v if len(task) > 5 else v
        m00, m01, lr = terms
        area += f * m00
        first += f * m01
        faces[name] = faces.get(name, 0) + theta * lr

    notes = []

    def simple(exprs):
        # Already-short forms (16*pi, 3600*pi) are left alone, and so are very long ones:
        # which forms go to simplify is decided by their size, before sympy runs.
        todo = [i for i, e in enumerate(exprs) if 2 < sympy.count_ops(e) <= MAX_SIMPLIFY_OPS]
        done = run_sympy([("simplify", exprs[i]) for i in todo], safety_seconds)
        if todo and _timed_out(done):
            notes.append(f"closed forms not simplified: sympy's simplify passed the safety "
                         f"limit of {safety_seconds:g} s (a limit that depends on the "
                         "machine's speed and load)")
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
    result = {k: (v.replace("**", "^") if isinstance(v, str) else
                  {a: b.replace("**", "^") for a, b in v.items()}) for k, v in out.items()}
    if notes:
        result["note"] = "; ".join(notes)
    return result


_TRANSCENDENTAL = ("sin", "cos", "exp", "sinh", "cosh")


def tried_exactly(g, t) -> bool:
    """Whether ``sympy.integrate`` is tried on the integrand ``g`` (decided before it runs).

    Two forms whose antiderivatives are elementary and that sympy integrates in
    bounded work are tried: a polynomial in ``t`` and square roots (or other
    rational powers) of polynomials of degree 2 at most; or a polynomial in
    ``t`` and ``sin``, ``cos``, ``exp``, ``sinh``, ``cosh`` of linear arguments.
    Anything else (nested roots, quotients by non-constant terms, mixed forms)
    is not sent, so the answer does not hang on how long sympy would search.

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> tried_exactly(t * sympy.sqrt(1 + t ** 2 / 8100), t), tried_exactly(t * sympy.cos(3 * t), t)
    (True, True)
    >>> tried_exactly(sympy.sqrt(1 + t ** 3), t), tried_exactly(sympy.sin(t) * sympy.sqrt(1 + t), t)
    (False, False)
    >>> tried_exactly(sympy.sqrt(9 * sympy.sin(t) ** 2 + 4 * sympy.cos(t) ** 2), t)
    False
    """
    from revolve.geometry.integrals import _degree_bound

    algebraic = transcendental = False
    from revolve.expr import as_sympy

    stack = [as_sympy(g)]
    while stack:
        node = stack.pop()
        if not node.has(t):
            continue
        if node.is_Pow and not (node.exp.is_Integer and node.exp >= 0):
            if not node.exp.is_Rational or node.exp.is_Integer:
                return False                     # a quotient by a term in t, or t^t
            degree = _degree_bound(node.base, t)
            if degree is None or degree > 2:
                return False
            algebraic = True
            continue
        if node.is_Function:
            if getattr(node.func, "__name__", "") not in _TRANSCENDENTAL or \
                    _degree_bound(node.args[0], t) != 1:
                return False
            transcendental = True
            continue
        if not (node.is_Add or node.is_Mul or node.is_Pow or node == t):
            return False
        stack.extend(node.args)
    return not (algebraic and transcendental)


def _timed_out(results) -> bool:
    """Whether :func:`run_sympy` stopped its worker at the time limit (it marks the list)."""
    return getattr(results, "timed_out", False)


def _line_terms(seg, frame, side, t):
    """A line's (m00, m01, lr) from its exact ends (:class:`LineExact`)."""
    ex = seg.exact
    return _edge_terms(_sym(ex.x0), _sym(ex.y0), _sym(ex.x1), _sym(ex.y1), frame), ()


def _edge_terms(x0, y0, x1, y1, frame):
    import sympy

    (z0, r0), (z1, r1) = frame((x0, y0)), frame((x1, y1))
    c = z0 * r1 - z1 * r0
    length = sympy.sqrt((x1 - x0) ** 2 + (y1 - y0) ** 2)
    return c / 2, c * (r0 + r1) / 6, length * (r0 + r1) / 2


def _polyline_terms(seg, frame, side, t):
    """A polyline's (m00, m01, lr): its exact points (:class:`PolylineExact`), edge by edge."""
    points = [_pt(p) for p in seg.exact.points]
    m00 = m01 = lr = 0
    for (x0, y0), (x1, y1) in zip(points[:-1], points[1:]):
        a, b, c = _edge_terms(x0, y0, x1, y1, frame)
        m00, m01, lr = m00 + a, m01 + b, lr + c
    return (m00, m01, lr), ()


def _arc_terms(seg, frame, side, t=None):
    """An arc's (m00, m01, lr) from its exact record (:class:`ArcByCentre` or :class:`ArcByRadius`)."""
    import sympy

    ex = seg.exact
    p0, p1 = _pt(ex.start), _pt(ex.end)
    if isinstance(ex, ArcByCentre):
        c = _pt(ex.centre)
        R = sympy.sqrt((p0[0] - c[0]) ** 2 + (p0[1] - c[1]) ** 2)
    else:
        R = _sym(ex.radius)
        ddx, ddy = p1[0] - p0[0], p1[1] - p0[1]
        chord = sympy.sqrt(ddx * ddx + ddy * ddy)
        h = sympy.sqrt(R * R - chord * chord / 4)
        sign = -1 if ex.side == "left" else 1
        if ex.major:
            sign = -sign
        c = ((p0[0] + p1[0]) / 2 + sign * h * (-ddy) / chord,
             (p0[1] + p1[1]) / 2 + sign * h * ddx / chord)
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
    return (m00, m01, lr), ()


def _curve_terms(seg, frame, side, t):
    """A curve's (m00, m01, lr) with the integrals that are polynomials done at once.

    Returns the three terms (None where not yet known) and the worker tasks for
    the rest as ``(index, task)`` pairs. The curve's expressions become sympy
    expressions here (``x_expr``/``y_expr``, built from its own trees).
    """
    import sympy

    from revolve.geometry.integrals import _small_polynomial, polynomial_integral

    if seg.exact is None or seg.exact.t_start is None or seg.exact.t_end is None:
        raise NotExact("the curve's interval has no exact value")
    t0, t1 = _sym(seg.exact.t_start), _sym(seg.exact.t_end)
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


#: The closed form of each kind of exact record: ``(m00, m01, lr)`` and worker tasks.
_TERMS = {LineExact: _line_terms, ArcByCentre: _arc_terms, ArcByRadius: _arc_terms,
          CurveExact: _curve_terms, PolylineExact: _polyline_terms}


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
