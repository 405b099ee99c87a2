"""Exact integrals of each segment kind, vectorised over segments.

For a segment in a plane with coordinates ``(x, y)`` this module computes

* ``length``, ``length_x`` = ∫ x ds, ``length_y`` = ∫ y ds (first moments of length), and
* the area moments ``Mab`` = ∫∫ x^a y^b dA of the *sector* between the origin
  and the segment, for (a, b) in (0,0) (1,0) (0,1) (2,0) (1,1) (0,2) (0,3).

Summed over a closed loop the sector moments are the loop's area moments
(Green's theorem with the 1-form f (x dy - y dx)/(a+b+2), exact for every
homogeneous f). Lines and arcs are closed-form: lines by polynomial formulas,
arcs by expanding the integrand as a trigonometric polynomial and integrating
each harmonic exactly, with ``∫ e^{ikθ} dθ = e^{ikθm} 2 sin(kΔ/2)/k`` so that
short arcs lose no digits. Curves are integrated symbolically by sympy when it
finishes within a time budget, otherwise by adaptive quadrature whose error
estimate is returned.

The engine calls these on segments already placed in the axis frame
(``x`` = axial position ``z``, ``y`` = distance ``r`` from the axis).

Examples
--------
Unit square as four lines: area 1, centroid (0.5, 0.5).

>>> from revolve.geometry.segments import Line
>>> pts = [(0.0, 0.0), (1.0, 0.0), (1.0, 1.0), (0.0, 1.0)]
>>> segs = [Line(pts[i], pts[(i + 1) % 4]) for i in range(4)]
>>> res = segment_integrals(segs)
>>> tot = res.values.sum(axis=0)
>>> [float(round(tot[COLUMNS.index(k)], 12)) for k in ("length", "M00", "M10", "M01", "M03")]
[4.0, 1.0, 0.5, 0.5, 0.25]

An empty list gives empty arrays:

>>> segment_integrals([]).values.shape
(0, 10)
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Sequence

import numpy as np

from revolve.geometry.segments import Curve, Segment

#: Column names of :attr:`SegmentIntegrals.values`.
COLUMNS = ("length", "length_x", "length_y",
           "M00", "M10", "M01", "M20", "M11", "M02", "M03")
#: Exponents (a, b) of the area moment columns, in order.
EXPONENTS = ((0, 0), (1, 0), (0, 1), (2, 0), (1, 1), (0, 2), (0, 3))
COL = {name: i for i, name in enumerate(COLUMNS)}


@dataclass(frozen=True)
class SegmentIntegrals:
    """Per-segment integrals: ``values`` and absolute ``errors``, both shape (n, 10).

    ``method`` is one string per segment: "closed form", "symbolic" or "quadrature".
    """

    values: np.ndarray
    errors: np.ndarray
    method: tuple


def line_integrals(x0, y0, x1, y1) -> np.ndarray:
    """Closed-form integrals of straight segments, shape (n, 10).

    >>> v = line_integrals(np.array([0.0]), np.array([1.0]), np.array([2.0]), np.array([1.0]))
    >>> [float(a) for a in v[0, :3]]
    [2.0, 2.0, 2.0]
    >>> line_integrals(np.array([1.0]), np.array([1.0]), np.array([1.0]), np.array([1.0]))[0, 0]
    np.float64(0.0)
    """
    x0, y0, x1, y1 = (np.asarray(a, dtype=float) for a in (x0, y0, x1, y1))
    out = np.empty((x0.size, len(COLUMNS)))
    L = np.hypot(x1 - x0, y1 - y0)
    c = x0 * y1 - x1 * y0
    out[:, 0] = L
    out[:, 1] = L * (x0 + x1) / 2
    out[:, 2] = L * (y0 + y1) / 2
    out[:, 3] = c / 2
    out[:, 4] = c * (x0 + x1) / 6
    out[:, 5] = c * (y0 + y1) / 6
    out[:, 6] = c * (x0 * x0 + x0 * x1 + x1 * x1) / 12
    out[:, 7] = c * (2 * x0 * y0 + x0 * y1 + x1 * y0 + 2 * x1 * y1) / 24
    out[:, 8] = c * (y0 * y0 + y0 * y1 + y1 * y1) / 12
    out[:, 9] = c * (y0 + y1) * (y0 * y0 + y1 * y1) / 20
    return out


def _times_first_harmonic(p: np.ndarray, minus, zero, plus) -> np.ndarray:
    """Multiply trigonometric polynomials ``p`` (n, m) by ``minus e^{-iθ} + zero + plus e^{iθ}``."""
    n, m = p.shape
    out = np.zeros((n, m + 2), dtype=complex)
    out[:, :m] += p * minus[:, None]
    out[:, 1:m + 1] += p * zero[:, None]
    out[:, 2:] += p * plus[:, None]
    return out


def _integrate_harmonics(p: np.ndarray, mid, sweep) -> np.ndarray:
    """∫ p(θ) dθ over [mid - sweep/2, mid + sweep/2] for trigonometric polynomials p (n, 2K+1)."""
    K = (p.shape[1] - 1) // 2
    k = np.arange(-K, K + 1)
    with np.errstate(invalid="ignore", divide="ignore"):
        weight = np.where(k == 0, sweep[:, None],
                          2.0 * np.sin(k * sweep[:, None] / 2) / np.where(k == 0, 1, k))
    phase = np.exp(1j * k * mid[:, None])
    return np.real(np.sum(p * phase * weight, axis=1))


def arc_integrals(cx, cy, radius, start_angle, sweep) -> np.ndarray:
    """Closed-form integrals of circular arcs, shape (n, 10).

    A half circle of radius 1 about the origin from angle 0 to π: length π,
    ∫ y ds = 2 and sector area π/2.

    >>> v = arc_integrals(np.array([0.0]), np.array([0.0]), np.array([1.0]),
    ...                   np.array([0.0]), np.array([math.pi]))
    >>> [round(float(v[0, i]), 12) for i in (0, 2, 3)] == [round(math.pi, 12), 2.0, round(math.pi / 2, 12)]
    True
    """
    cx, cy, R, a0, d = (np.asarray(a, dtype=float) for a in (cx, cy, radius, start_angle, sweep))
    n = cx.size
    mid = a0 + d / 2
    one = np.ones((n, 1), dtype=complex)
    zx = (R / 2 + 0j, cx + 0j, R / 2 + 0j)                    # x = cx + R cos θ
    zy = (0.5j * R, cy + 0j, -0.5j * R)                      # y = cy + R sin θ
    w = (R * cx / 2 + 0.5j * R * cy, R * R + 0j, R * cx / 2 - 0.5j * R * cy)  # x y' - y x'
    out = np.empty((n, len(COLUMNS)))
    sgn = np.sign(d)
    out[:, 0] = R * np.abs(d)
    out[:, 1] = R * sgn * _integrate_harmonics(_times_first_harmonic(one, *zx), mid, d)
    out[:, 2] = R * sgn * _integrate_harmonics(_times_first_harmonic(one, *zy), mid, d)
    for j, (a, b) in enumerate(EXPONENTS):
        p = _times_first_harmonic(one, *w)
        for _ in range(a):
            p = _times_first_harmonic(p, *zx)
        for _ in range(b):
            p = _times_first_harmonic(p, *zy)
        out[:, 3 + j] = _integrate_harmonics(p, mid, d) / (a + b + 2)
    return out


# -- curves --------------------------------------------------------------------------

#: Seconds sympy may spend on the exact integrals of one curve before quadrature is used.
SYMBOLIC_BUDGET_SECONDS = 1.2


def _curve_integrand(curve: Curve):
    def f(t):
        x, y, dx, dy = curve.evaluate(np.atleast_1d(t))
        ds = np.hypot(dx, dy)
        w = x * dy - y * dx
        cols = [ds, x * ds, y * ds]
        cols += [x ** a * y ** b * w / (a + b + 2) for a, b in EXPONENTS]
        return np.stack(cols, axis=-1)[0] if np.ndim(t) == 0 else np.stack(cols, axis=-1)
    return f


def adaptive_quadrature(f, a: float, b: float, rel_tol: float = 1e-13, n: int = 16,
                        max_rounds: int = 50):
    """Vectorised adaptive Gauss–Legendre of a vector-valued ``f`` over [a, b].

    ``f`` takes an array of points (m,) and returns (m, k). Each interval is
    integrated with n and 2n nodes; intervals whose two results differ by more
    than their share of ``rel_tol`` × ∫|f_k| (column by column) are halved and
    done again, all intervals of a round in one call of ``f``. Returns
    ``(values (k,), errors (k,))``; the error is the sum of the differences.

    >>> v, e = adaptive_quadrature(lambda x: np.stack([np.sqrt(x), x ** 2], axis=-1), 0.0, 1.0)
    >>> [round(float(c), 12) for c in v], bool(e.max() < 1e-10)
    ([0.666666666667, 0.333333333333], True)
    """
    from revolve.geometry.slicing import gauss_legendre

    x1, w1 = gauss_legendre(n)
    x2, w2 = gauss_legendre(2 * n)
    lo, hi = np.array([a], dtype=float), np.array([b], dtype=float)
    width = abs(b - a)
    total = err = scale = None
    for _ in range(max_rounds):
        mid, half = (lo + hi) / 2, (hi - lo) / 2
        m = lo.size
        pts = np.concatenate([(mid[:, None] + half[:, None] * x1).ravel(),
                              (mid[:, None] + half[:, None] * x2).ravel()])
        vals = np.asarray(f(pts), dtype=float)
        k = vals.shape[-1]
        v1 = vals[:m * n].reshape(m, n, k)
        v2 = vals[m * n:].reshape(m, 2 * n, k)
        i1 = np.einsum("mnk,n->mk", v1, w1) * half[:, None]
        i2 = np.einsum("mnk,n->mk", v2, w2) * half[:, None]
        if total is None:
            total, err = np.zeros(k), np.zeros(k)
            absolute = np.einsum("mnk,n->k", np.abs(v2), w2 * abs(half[0]))
            scale = np.where(absolute > 0, absolute, 1.0)
        diff = np.abs(i2 - i1)
        share = rel_tol * scale[None, :] * (np.abs(hi - lo) / width)[:, None]
        ok = np.all(diff <= share, axis=1) | (np.abs(hi - lo) <= 1e-14 * width)
        total += i2[ok].sum(axis=0)
        err += diff[ok].sum(axis=0)
        if ok.all():
            break
        lo, hi, mid = lo[~ok], hi[~ok], mid[~ok]
        lo, hi = np.concatenate([lo, mid]), np.concatenate([mid, hi])
    else:
        total += i2[~ok].sum(axis=0)
        err += diff[~ok].sum(axis=0)
    return total, err


def curve_integrals_numeric(curve: Curve, rel_tol: float = 1e-13):
    """Adaptive quadrature of every column; returns (values, errors).

    The parameter is mapped as t = mid − half·cos φ, so the square-root
    behaviour of a curve with a vertical tangent at an end becomes smooth in
    φ and the quadrature converges fast there too.

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> v, e = curve_integrals_numeric(Curve(t, 1 + 0 * t, 0.0, 2.0))
    >>> round(float(v[0]), 12), bool(e[0] < 1e-10)
    (2.0, True)
    >>> v, e = curve_integrals_numeric(Curve(t, sympy.sqrt(1 - t ** 2), 1.0, -1.0))  # half circle
    >>> round(float(v[0]), 12) == round(math.pi, 12)
    True
    """
    f = _curve_integrand(curve)
    t0, t1 = curve.t_start, curve.t_end
    mid, half = (t0 + t1) / 2, (t1 - t0) / 2

    def g(phi):
        v = f(mid - half * np.cos(phi)) * (half * np.sin(phi))[:, None]
        # Where t rounds onto an end with an infinite slope the true integrand
        # tends to zero (the map's sin φ wins over the square-root singularity).
        return np.nan_to_num(v, nan=0.0, posinf=0.0, neginf=0.0)

    with np.errstate(all="ignore"):
        val, err = adaptive_quadrature(g, 0.0, math.pi, rel_tol=rel_tol)
    if t1 < t0:  # ds = |p'(t)| |dt|: lengths stay positive when t runs backwards
        val[:3] = -val[:3]
    return val, err


def _run_with_budget(fn, seconds: float):
    """Run ``fn()``; return its value, or None when it takes longer than ``seconds``.

    Uses a real-time interval timer, so it only limits work on the main thread
    of a Unix process; elsewhere it returns None at once and the caller falls
    back to quadrature. The timer repeats every 50 ms until the work stops, so
    an alarm swallowed by a finalizer inside sympy is raised again.

    >>> _run_with_budget(lambda: 2 + 2, 1.0)
    4
    """
    import signal
    import threading

    if threading.current_thread() is not threading.main_thread() or not hasattr(signal, "setitimer"):
        return None

    class _Timeout(Exception):
        pass

    state = {"done": False}

    def on_alarm(signum, frame):
        # Raise only inside sympy's own work: an alarm landing in a garbage-collector
        # callback or finalizer would be swallowed there; the timer fires again soon.
        name = frame.f_code.co_filename if frame is not None else ""
        if not state["done"] and ("sympy" in name or "mpmath" in name):
            raise _Timeout()

    old = signal.signal(signal.SIGALRM, on_alarm)
    try:
        try:
            signal.setitimer(signal.ITIMER_REAL, seconds, 0.05)
            try:
                return fn()
            finally:
                state["done"] = True
                signal.setitimer(signal.ITIMER_REAL, 0)
        except _Timeout:
            return None
        except Exception:  # sympy failing on an integral is not the user's fault: use quadrature
            return None
    finally:
        state["done"] = True
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, old)


def curve_integrals_symbolic(curve: Curve, budget: float = SYMBOLIC_BUDGET_SECONDS):
    """Exact sympy integrals of each column, or None for those that don't finish in the budget.

    Returns a list of 10 sympy expressions or None entries.
    """
    import sympy

    t = sympy.Symbol("t", real=True)
    x, y = curve.x_expr, curve.y_expr
    dx, dy = sympy.diff(x, t), sympy.diff(y, t)
    a_, b_ = (curve.exact if curve.exact else (None, None))
    t0 = sympy.nsimplify(curve.t_start) if a_ is None else _exact(a_)
    t1 = sympy.nsimplify(curve.t_end) if b_ is None else _exact(b_)
    ds = sympy.sqrt(dx ** 2 + dy ** 2)
    w = sympy.expand(x * dy - y * dx)
    integrands = [ds, x * ds, y * ds] + [sympy.expand(x ** a * y ** b * w) / (a + b + 2)
                                         for a, b in EXPONENTS]
    results = []
    deadline_each = budget / len(integrands)
    backwards = bool(curve.t_end < curve.t_start)
    for k, g in enumerate(integrands):
        r = _run_with_budget(lambda g=g: sympy.integrate(g, (t, t0, t1)), deadline_each)
        if r is not None and k < 3 and backwards:
            r = -r  # ds = |p'(t)| |dt|
        if r is not None and (r.has(sympy.Integral) or not r.is_number or r.has(sympy.zoo, sympy.nan)):
            r = None
        results.append(r)
    return results


def _exact(v):
    import sympy
    from fractions import Fraction

    if isinstance(v, Fraction):
        return sympy.Rational(v.numerator, v.denominator)
    if isinstance(v, str):
        from revolve.expr import parse_number
        return parse_number(v)
    return sympy.nsimplify(v)


def curve_integrals(curve: Curve, symbolic: bool = True):
    """Integrals of one curve: symbolic where sympy finishes in time, else quadrature.

    Returns ``(values, errors, method)``. A symbolic value that disagrees with
    the quadrature beyond its error estimate is not trusted.

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> v, e, how = curve_integrals(Curve(t, t ** 2, 0.0, 1.0))   # y = x², 0..1
    >>> how.startswith("symbolic"), round(float(v[COL["M00"]]), 12)   # sector area 1/6
    (True, 0.166666666667)
    """
    values, errors = curve_integrals_numeric(curve)
    method = "quadrature"
    if symbolic:
        exact = curve_integrals_symbolic(curve)
        got_all = True
        for i, r in enumerate(exact):
            if r is None:
                got_all = False
                continue
            try:
                val = float(r.evalf(20))
            except (TypeError, ValueError):
                got_all = False
                continue
            scale = max(abs(values[i]), 1e-300)
            if math.isfinite(val) and abs(val - values[i]) <= max(1e3 * errors[i], 1e-9 * scale):
                values[i] = val
                errors[i] = abs(val) * 1e-16
            else:
                got_all = False
        if got_all:
            method = "symbolic"
        elif any(r is not None for r in exact):
            method = "symbolic and quadrature"
    return values, errors, method


# -- all kinds -----------------------------------------------------------------------

def segment_integrals(segments: Sequence[Segment], symbolic: bool = True) -> SegmentIntegrals:
    """Integrals of every segment, in order, lines and arcs vectorised by kind."""
    n = len(segments)
    values = np.zeros((n, len(COLUMNS)))
    errors = np.zeros((n, len(COLUMNS)))
    method = ["closed form"] * n
    kinds = np.array([s.kind for s in segments], dtype=object)
    li = np.flatnonzero(kinds == "line")
    if li.size:
        se = np.array([(segments[i].start + segments[i].end) for i in li], dtype=float)
        values[li] = line_integrals(se[:, 0], se[:, 1], se[:, 2], se[:, 3])
    ai = np.flatnonzero(kinds == "arc")
    if ai.size:
        arcs = [segments[i] for i in ai]
        par = np.array([(a.centre[0], a.centre[1], a.radius) + a.angles() for a in arcs])
        values[ai] = arc_integrals(par[:, 0], par[:, 1], par[:, 2], par[:, 3], par[:, 4] - par[:, 3])
    for i in np.flatnonzero(kinds == "curve"):
        v, e, how = curve_integrals(segments[i], symbolic=symbolic)
        values[i], errors[i], method[i] = v, e, how
    # Closed forms still round: carry a rounding estimate so the report is honest.
    closed = np.array([m == "closed form" for m in method], dtype=bool)
    if closed.any():
        errors[closed] = np.abs(values[closed]) * 8 * np.finfo(float).eps
    return SegmentIntegrals(values, errors, tuple(method))


def polygon_moments(x, y, lengths: bool = True, block: int = 1 << 15) -> np.ndarray:
    """Sums of every column over a closed polygon given by its vertex arrays, shape (10,).

    The fast path for long point lists: the same closed forms as
    :func:`line_integrals`, summed with dot products and no per-segment table,
    in blocks that stay in the processor's cache, so a 10⁶-vertex outline costs
    a few passes over memory. ``lengths=False`` skips the three length columns
    (left as NaN) when only the section is wanted.

    >>> v = polygon_moments(np.array([0.0, 1.0, 1.0, 0.0]), np.array([0.0, 0.0, 1.0, 1.0]))
    >>> [float(v[COL[k]]) for k in ("length", "M00", "M10", "M01", "M11")]
    [4.0, 1.0, 0.5, 0.5, 0.25]
    >>> polygon_moments(np.array([]), np.array([]))[COL["M00"]]
    np.float64(0.0)
    """
    x = np.asarray(x, dtype=float)
    y = np.asarray(y, dtype=float)
    out = np.zeros(len(COLUMNS))
    n = x.size
    if n == 0:
        return out
    xc = np.concatenate([x, x[:1]])
    yc = np.concatenate([y, y[:1]])
    acc = np.zeros(len(COLUMNS))
    for i in range(0, n, block):
        j = min(n, i + block)
        x0, x1, y0, y1 = xc[i:j], xc[i + 1:j + 1], yc[i:j], yc[i + 1:j + 1]
        c = x0 * y1
        c -= x1 * y0
        sx = x0 + x1
        sy = y0 + y1
        q = y0 * y1
        acc[3] += c.sum()
        acc[4] += c @ sx
        acc[5] += c @ sy
        acc[6] += c @ (sx * sx) - c @ (x0 * x1)
        acc[7] += c @ (sx * sy) + c @ (x0 * y0) + c @ (x1 * y1)
        acc[8] += c @ (sy * sy) - c @ q
        acc[9] += c @ (sy * sy * sy) - 2 * (c @ (sy * q))
        if lengths:
            L = np.hypot(x1 - x0, y1 - y0)
            acc[0] += L.sum()
            acc[1] += L @ sx
            acc[2] += L @ sy
    out[:] = acc / np.array([1, 2, 2, 2, 6, 6, 12, 24, 12, 20])
    if not lengths:
        out[:3] = np.nan
    return out
