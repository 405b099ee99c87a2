"""Curves given by expressions ``x(t)``, ``y(t)`` (or ``y = f(x)``).

The expressions come from the whitelist parser (:mod:`revolve.expr`), never
from ``eval``. A curve keeps its base expressions and an affine map
(:class:`CurveMap`), so moving, mirroring or reversing it compiles nothing again.

Examples
--------
>>> from revolve.expr import parse_expression
>>> c = curve_from_expressions(parse_expression("t"), parse_expression("t^2"), 0, 2)
>>> c.end, c.turning_parameters(1)
((2.0, 4.0), [])

Library code may still pass sympy expressions; they are converted to trees once:

>>> import sympy
>>> t = sympy.Symbol("t", real=True)
>>> curve_from_expressions(t, t ** 2, 0, 2).base_y == parse_expression("t^2")
True
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace
from functools import cached_property, lru_cache
from typing import Any, Callable, NamedTuple, Optional, Tuple

from revolve.geometry.kinds.base import (COORDINATE_LIMIT, IDENTITY_MATRIX, Point, SegmentKind, Where,
                                         combine, segment_error)


class CurveExact(NamedTuple):
    """The exact ends of a curve's parameter interval."""

    t_start: Any
    t_end: Any


@lru_cache(maxsize=256)
def compiled_curve(x_expr, y_expr) -> tuple[Callable, Callable, Callable, Callable]:
    """Numeric functions ``(x, y, dx/dt, dy/dt)`` of a curve's base expressions, compiled once.

    The expressions are the package's own trees (:class:`revolve.expr.Expr`), in
    ``t``; the derivatives are theirs (:meth:`~revolve.expr.Expr.derivative`) and
    every function is built by :meth:`~revolve.expr.Expr.numpy_function`, the one
    compiler: no sympy. The cache is keyed by the trees themselves (they compare
    and hash by structure), so every transformed, reversed or split copy of a
    curve shares one compilation. ``compiled_curve.cache_info().misses`` counts
    the compilations.

    >>> from revolve.expr import parse_expression
    >>> f = compiled_curve(parse_expression("t^2"), parse_expression("3*t"))
    >>> [float(g([2.0])[0]) for g in f]
    [4.0, 6.0, 4.0, 3.0]
    >>> compiled_curve(parse_expression("t ^ 2"), parse_expression("3 * t")) is f
    True
    """
    import numpy as np

    from revolve.expr import as_expression, numpy_functions

    x_expr, y_expr = as_expression(x_expr), as_expression(y_expr)
    run = numpy_functions((x_expr, y_expr, x_expr.derivative("t"), y_expr.derivative("t")), "t")

    def filled(v, tt):
        if type(v) is np.ndarray and v is not tt and v.shape == tt.shape and \
                v.dtype == np.float64:
            return v                 # a new array already (no copy needed)
        return np.broadcast_to(np.asarray(v, dtype=float), tt.shape).copy()

    def every(tt):
        tt = np.asarray(tt, dtype=float)
        return tuple(filled(v, tt) for v in run(tt))

    def one(k):
        def g(tt):
            tt = np.asarray(tt, dtype=float)
            return filled(run(tt)[k], tt)
        return g

    return CompiledCurve((one(0), one(1), one(2), one(3)), every)


class CompiledCurve(tuple):
    """The four functions ``(x, y, dx/dt, dy/dt)``, and :attr:`every`, all four in one pass."""

    def __new__(cls, functions, every):
        self = super().__new__(cls, functions)
        self.every = every
        return self


def _exact_number(v: float):
    """A float as an exact tree number: the integer when whole, else the float itself."""
    from revolve.expr import Num

    v = float(v)
    return Num(int(v)) if v.is_integer() else Num(v)


@dataclass(frozen=True)
class CurveMap:
    """An affine map of a curve: ``(x, y) = M·(X(u), Y(u)) + v`` with ``u = p·t + q``.

    ``X``, ``Y`` are the base expressions in ``u``; ``M`` is ``matrix`` (row
    major ``m00, m01, m10, m11``), ``v`` the ``offset``; ``p``, ``q`` reparametrise.
    All are plain floats; ``exact`` optionally holds the same eight numbers as
    exact constant trees (:class:`revolve.expr.Expr`, for example ``pi/2``) when
    one of the composed maps was given exactly; they are read only when the
    mapped expressions are built symbolically (``Curve.x_expr``).

    >>> m = CurveMap(offset=(2.0, 0.0)).then(CurveMap(matrix=(0.0, 1.0, 1.0, 0.0)))
    >>> m.matrix, m.offset
    ((0.0, 1.0, 1.0, 0.0), (0.0, 2.0))
    >>> CurveMap().is_identity
    True
    """

    matrix: Tuple[float, float, float, float] = (1.0, 0.0, 0.0, 1.0)
    offset: Tuple[float, float] = (0.0, 0.0)
    p: float = 1.0
    q: float = 0.0
    exact: Optional[tuple] = field(default=None, compare=False)

    @property
    def is_identity(self) -> bool:
        return (self.matrix == (1.0, 0.0, 0.0, 1.0) and self.offset == (0.0, 0.0)
                and self.p == 1.0 and self.q == 0.0)

    def numbers(self) -> tuple:
        """The eight entries as exact trees: the exact ones if known, else from the floats.

        >>> [n.text() for n in CurveMap(offset=(0.5, 2.0)).numbers()]
        ['1', '0', '0', '1', '0.5', '2', '1', '0']
        """
        if self.exact is not None:
            return self.exact
        return tuple(_exact_number(v) for v in (*self.matrix, *self.offset, self.p, self.q))

    def _all_whole(self) -> bool:
        return all(float(v).is_integer() for v in (*self.matrix, *self.offset, self.p, self.q))

    def then(self, other: "CurveMap") -> "CurveMap":
        """This map followed by ``other`` (``other``'s parameter map applies first to ``t``).

        >>> CurveMap(p=-1.0, q=3.0).then(CurveMap(p=-1.0, q=3.0)).is_identity
        True
        """
        a00, a01, a10, a11 = self.matrix
        b00, b01, b10, b11 = other.matrix
        matrix = (b00 * a00 + b01 * a10, b00 * a01 + b01 * a11,
                  b10 * a00 + b11 * a10, b10 * a01 + b11 * a11)
        matrix = tuple(v + 0.0 for v in matrix)  # no negative zeros
        ox, oy = self.offset
        offset = (float(b00 * ox + b01 * oy + other.offset[0]) + 0.0,
                  float(b10 * ox + b11 * oy + other.offset[1]) + 0.0)
        # t -> u' = p' t + q' (other), then u = p u' + q (self).
        p = self.p * other.p
        q = self.p * other.q + self.q
        exact = None
        if (self.exact is not None or other.exact is not None) and \
                (self.exact is not None or self._all_whole()) and \
                (other.exact is not None or other._all_whole()):
            A, B = self.numbers(), other.numbers()
            exact = (B[0] * A[0] + B[1] * A[2], B[0] * A[1] + B[1] * A[3],
                     B[2] * A[0] + B[3] * A[2], B[2] * A[1] + B[3] * A[3],
                     B[0] * A[4] + B[1] * A[5] + B[4], B[2] * A[4] + B[3] * A[5] + B[5],
                     A[6] * B[6], A[6] * B[7] + A[7])
        return CurveMap(matrix, offset, p + 0.0, q + 0.0, exact)


IDENTITY = CurveMap()

#: Steps of the grid that narrows each bracket before the Newton steps of
#: :meth:`Curve.monotone_parameters`.
_GRID = 16


@dataclass(frozen=True)
class Curve(SegmentKind):
    """A curve given by expressions ``x(t)``, ``y(t)`` for ``t`` from ``t_start`` to ``t_end``.

    ``base_x`` and ``base_y`` are expression trees (:class:`revolve.expr.Expr`)
    in the variable ``t`` that came from the whitelist parser, never from
    ``eval``; a sympy expression or a number given here (by library code) is
    converted to a tree once, on construction.
    An explicit curve ``y = f(x)`` is the parametric curve ``(t, f(t))``.
    ``affine`` maps the base curve into place (a :class:`CurveMap`): moving,
    mirroring or reversing a curve composes the map and keeps the base
    expressions, so their numeric functions are compiled once for all copies
    (:func:`compiled_curve`). ``x_expr`` and ``y_expr`` are the mapped
    expressions, built only when something reads them symbolically.

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> c = Curve(t, t ** 2, 0.0, 1.0).transformed(offset=(5.0, 0.0)).reversed()
    >>> c.x_expr, c.y_expr
    (6 - t, (1 - t)**2)
    >>> [float(v[0]) for v in c.evaluate([0.25])]
    [5.75, 0.5625, -1.0, -1.5]
    """

    base_x: Any
    base_y: Any
    t_start: float
    t_end: float
    face: Optional[str] = None
    where: Optional[Where] = field(default=None, compare=False, repr=False)
    exact: Optional[CurveExact] = field(default=None, compare=False, repr=False)
    affine: CurveMap = field(default=IDENTITY, repr=False)
    #: ``(base_x, base_y, functions)`` once evaluated; ``dataclasses.replace`` carries it to
    #: copies (moved, reversed, split), so they neither compile nor look up the cache again,
    #: and a profile with more curves than the cache holds never compiles a curve twice.
    _compiled: Optional[tuple] = field(default=None, compare=False, repr=False)

    kind = "curve"

    def __post_init__(self):
        from revolve.expr import Expr, as_expression

        for name in ("base_x", "base_y"):
            value = getattr(self, name)
            if not isinstance(value, Expr):
                object.__setattr__(self, name, as_expression(value))
        if self.exact is not None and not isinstance(self.exact, CurveExact):
            object.__setattr__(self, "exact", CurveExact(*self.exact))

    def _functions(self):
        c = self._compiled
        if c is None or c[0] is not self.base_x or c[1] is not self.base_y:
            c = (self.base_x, self.base_y, compiled_curve(self.base_x, self.base_y))
            object.__setattr__(self, "_compiled", c)
        return c[2]

    @cached_property
    def _mapped(self) -> tuple:
        """The mapped expressions as sympy expressions (imports sympy: exact results only)."""
        import sympy

        X, Y = self.base_x.to_sympy(), self.base_y.to_sympy()
        if self.affine.is_identity:
            return X, Y
        t = sympy.Symbol("t", real=True)
        m00, m01, m10, m11, v0, v1, p, q = (n.to_sympy() for n in self.affine.numbers())
        if (self.affine.p, self.affine.q) != (1.0, 0.0):
            sub = {s: p * t + q for s in (X.free_symbols | Y.free_symbols) if s.name == "t"}
            X, Y = X.subs(sub), Y.subs(sub)
        return m00 * X + m01 * Y + v0, m10 * X + m11 * Y + v1

    @property
    def x_expr(self):
        """The mapped expression of ``x`` in ``t`` (built on first use)."""
        return self._mapped[0]

    @property
    def y_expr(self):
        """The mapped expression of ``y`` in ``t`` (built on first use)."""
        return self._mapped[1]

    def evaluate(self, t):
        """Return ``(x, y, dx/dt, dy/dt)`` as numpy arrays at parameters ``t``."""
        import numpy as np

        every = self._functions().every
        m = self.affine
        with np.errstate(all="ignore"):
            if m.p == 1.0 and m.q == 0.0:
                u = t
            else:
                t = np.asarray(t, dtype=float)
                u = m.q - t if m.p == -1.0 else m.p * t + m.q
            X, Y, dX, dY = every(u)
            if m is IDENTITY:
                return X, Y, dX, dY
            if m.p != 1.0:
                dX, dY = (-dX, -dY) if m.p == -1.0 else (m.p * dX, m.p * dY)
            a, b, c, d = m.matrix
            return (combine(a, X, b, Y, m.offset[0]), combine(c, X, d, Y, m.offset[1]),
                    combine(a, dX, b, dY), combine(c, dX, d, dY))

    def transformed(self, matrix=IDENTITY_MATRIX, offset=(0.0, 0.0),
                    exact: Optional[tuple] = None) -> "Curve":
        """The curve mapped by ``(x, y) -> M·(x, y) + offset`` (no recompilation).

        ``exact`` may give the six numbers (matrix then offset) exactly: expression
        trees, exact numbers (int, Fraction) or sympy numbers.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> Curve(t, t ** 2, 0.0, 1.0).transformed((0.0, 1.0, 1.0, 0.0)).x_expr
        t**2
        """
        matrix = tuple(float(v) for v in matrix)
        offset = tuple(float(v) for v in offset)
        full = None
        if exact is not None:
            from revolve.expr import as_expression
            full = tuple(as_expression(v) for v in tuple(exact) + (1, 0))
        step = CurveMap(matrix, offset, exact=full)  # type: ignore[arg-type]
        return replace(self, affine=self.affine.then(step))

    def translated(self, dx: float, dy: float = 0.0) -> "Curve":
        """The curve moved by ``(dx, dy)``.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> Curve(t, t, 0.0, 1.0).translated(0.5).x_expr
        t + 0.5
        """
        if dx == 0 and dy == 0:
            return self
        return self.transformed(offset=(dx, dy))

    def bounds(self) -> Tuple[float, float, float, float]:
        """``(x_min, y_min, x_max, y_max)`` through the turning points, kept on the curve.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> Curve(t, (t - 1) ** 2, 0.0, 3.0).bounds()
        (0.0, 0.0, 3.0, 4.0)
        """
        found = self.__dict__.get("_bounds")
        if found is None:
            found = super().bounds()
            object.__setattr__(self, "_bounds", found)     # not a field: copies start afresh
        return found

    @property
    def start(self) -> Point:
        x, y, _, _ = self.evaluate([self.t_start])
        return (float(x[0]), float(y[0]))

    @property
    def end(self) -> Point:
        x, y, _, _ = self.evaluate([self.t_end])
        return (float(x[0]), float(y[0]))

    def length(self) -> float:
        from revolve.geometry.integrals import curve_length
        return curve_length(self)

    def point_at(self, s: float) -> Point:
        t = self.t_start + s * (self.t_end - self.t_start)
        x, y, _, _ = self.evaluate([t])
        return (float(x[0]), float(y[0]))

    def turning_parameters(self, coordinate: int = 0, samples: int = 1025) -> list[float]:
        """Parameters inside the interval where ``x`` (coordinate 0) or ``y`` (1) turns back.

        The derivative is sampled at ``samples`` points; each sign change between
        neighbouring non-zero samples is narrowed by bisection to the last bit, and a run
        of exact zeros between a + and a - gives its middle sample. In the axis frame
        ``x`` is the position along the axis and ``y`` the radius, so splitting a curve
        at these parameters gives pieces along which that coordinate moves one way only
        (used by washers, clipping, horizontal levels and coating groups alike).

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> Curve(t, (t - 1) ** 2, 0.0, 3.0).turning_parameters(1)   # y = (t-1)² turns at t = 1
        [1.0]
        >>> Curve(t, t, 0.0, 1.0).turning_parameters(0)               # monotone: none
        []

        The answer is kept on the curve (which is immutable): bounds, washers,
        clipping and the checks all ask for it, and each search costs some sixty
        evaluations of the curve.
        """
        found = self.__dict__.get("_turning")
        if found is None:
            found = {}
            object.__setattr__(self, "_turning", found)    # not a field: copies start afresh
        key = (coordinate, samples)
        if key not in found:
            found[key] = tuple(self._turning_search(coordinate, samples))
        return list(found[key])

    def _turning_search(self, coordinate: int, samples: int) -> list[float]:
        import numpy as np

        which = 2 + coordinate
        t = np.linspace(self.t_start, self.t_end, samples)
        with np.errstate(all="ignore"):
            d = self.evaluate(t)[which]
        d = np.nan_to_num(np.asarray(d, dtype=float) * np.ones_like(t), nan=0.0, posinf=0.0,
                          neginf=0.0)
        nonzero = np.flatnonzero(d != 0)
        signs = np.sign(d[nonzero])
        out = []
        for k in np.flatnonzero(signs[:-1] * signs[1:] < 0):
            i, j = nonzero[k], nonzero[k + 1]
            if j > i + 1:            # exact zeros between: the turning point is the middle one
                out.append(float(t[(i + j) // 2]))
                continue
            a, b = float(t[i]), float(t[j])
            fa = float(self.evaluate(np.array([a]))[which][0])
            for _ in range(200):
                m = 0.5 * (a + b)
                if m == a or m == b:
                    break
                fm = float(self.evaluate(np.array([m]))[which][0])
                if (fm > 0) == (fa > 0):
                    a, fa = m, fm
                else:
                    b = m
            out.append(0.5 * (a + b))
        return out

    def reversed(self) -> "Curve":
        # t -> t_start + t_end - t keeps the same parameter interval.
        step = CurveMap(p=-1.0, q=self.t_start + self.t_end)
        return replace(self, affine=self.affine.then(step), exact=None)

    # -- the segment protocol: the parameter is t -------------------------------------

    def parameter_range(self):
        return (self.t_start, self.t_end)

    def points_at(self, params):
        import numpy as np

        x, y, _, _ = self.evaluate(np.asarray(params, dtype=float).reshape(-1))
        return np.column_stack([x, y])

    def tangents_at(self, params):
        import numpy as np

        _, _, dx, dy = self.evaluate(np.asarray(params, dtype=float).reshape(-1))
        return np.column_stack([dx, dy])

    def split_at(self, params) -> tuple:
        """Pieces between parameters ``params`` (values of ``t``), in order.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> [(p.t_start, p.t_end) for p in Curve(t, t, 0.0, 2.0).split_at([0.5, 1.0])]
        [(0.0, 0.5), (0.5, 1.0), (1.0, 2.0)]
        """
        if not len(params):
            return (self,)
        ts = [self.t_start] + [float(p) for p in params] + [self.t_end]
        return tuple(replace(self, t_start=a, t_end=b, exact=None) for a, b in zip(ts[:-1], ts[1:]))

    def flatten(self, max_angle: float = math.pi / 36, curve_pieces: int = 64):
        """``curve_pieces`` equal steps of ``t``.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> Curve(t, t ** 2, 0.0, 1.0).flatten(curve_pieces=2).tolist()
        [[0.0, 0.0], [0.5, 0.25], [1.0, 1.0]]
        """
        import numpy as np

        return self.points_at(np.linspace(self.t_start, self.t_end, curve_pieces + 1))

    def chord_count(self) -> int:
        return 64

    @classmethod
    def integral_rows(cls, segments, symbolic: bool = False):
        """Quadrature with an error estimate; with ``symbolic``, closed forms where sympy finds them."""
        import numpy as np

        from revolve.geometry.integrals import COLUMNS, curve_integrals

        values = np.zeros((len(segments), len(COLUMNS)))
        errors = np.zeros_like(values)
        methods = []
        for i, seg in enumerate(segments):
            values[i], errors[i], how = curve_integrals(seg, symbolic=symbolic)
            methods.append(how)
        return values, errors, tuple(methods)

    def split(self, s: float = 0.5) -> tuple["Curve", "Curve"]:
        tm = self.t_start + s * (self.t_end - self.t_start)
        return replace(self, t_end=tm, exact=None), replace(self, t_start=tm, exact=None)

    # -- for meshes and pictures (mesh.py) ----------------------------------------------

    def flatten_to_tolerance(self, tolerance: float, most_pieces: int = 1_000_000, *,
                             first_pieces: int = 16, deepest: int = 40):
        """Points whose chords stay within ``tolerance`` of the curve, shape (m + 1, 2).

        Adaptive subdivision in ``t``: from ``first_pieces`` equal steps, a piece
        is halved while one of its probe points (at 1/4, 1/2 and 3/4 of it) lies
        farther than ``tolerance`` from its chord, at most ``deepest`` times
        (pieces still too far then are kept as they are). The ends are the
        curve's own.

        Raises
        ------
        RevolveError
            When more than ``most_pieces`` pieces would be needed.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> Curve(t, 2 * t, 0.0, 1.0).flatten_to_tolerance(0.1).shape          # straight: 16 steps
        (17, 2)
        >>> pts = Curve(t, t ** 2, 0.0, 1.0).flatten_to_tolerance(1e-4)
        >>> pts[0].tolist(), pts[-1].tolist(), bool(abs(pts[:, 1] - pts[:, 0] ** 2).max() == 0)
        ([0.0, 0.0], [1.0, 1.0], True)
        >>> Curve(t, t ** 2, 0.0, 1.0).flatten_to_tolerance(1e-12, most_pieces=50)
        Traceback (most recent call last):
        ...
        revolve.errors.RevolveError: the chord tolerance 1e-12 needs more than 50 pieces on one curve; use a larger tolerance
        """
        import numpy as np

        from revolve.errors import RevolveError

        def off_chord(p, a, b):
            """Distance of points ``p`` (k, q, 2) from chords ``a``-``b`` (k, 2)."""
            ab = np.broadcast_to((b - a)[:, None, :], p.shape)
            ap = p - a[:, None, :]
            ll = np.einsum("kqi,kqi->kq", ab, ab)
            with np.errstate(invalid="ignore", divide="ignore"):
                s = np.clip(np.einsum("kqi,kqi->kq", ap, ab) / ll, 0.0, 1.0)
            s = np.where(ll > 0, s, 0.0)
            return np.linalg.norm(ap - s[..., None] * ab, axis=-1)

        probes = np.array([0.25, 0.5, 0.75])
        lo = np.linspace(self.t_start, self.t_end, first_pieces + 1)
        a, b = lo[:-1], lo[1:]
        finished = []
        for _ in range(deepest):
            if a.size == 0:
                break
            tp = a[:, None] + (b - a)[:, None] * probes
            x, y, _, _ = self.evaluate(np.concatenate([a, b, tp.ravel()]))
            xy = np.column_stack([x, y])
            k = a.size
            pa, pb, pp = xy[:k], xy[k:2 * k], xy[2 * k:].reshape(k, probes.size, 2)
            bad = ~(off_chord(pp, pa, pb).max(axis=1) <= tolerance)  # NaN counts as bad
            finished.append(a[~bad])
            mid = (a[bad] + b[bad]) / 2
            a, b = np.concatenate([a[bad], mid]), np.concatenate([mid, b[bad]])
            if sum(f.size for f in finished) + a.size > most_pieces:
                raise RevolveError(f"the chord tolerance {tolerance:g} needs more than "
                                   f"{most_pieces:,} pieces on one curve; use a larger tolerance")
        finished.append(a)  # pieces still too far after the deepest split are kept as they are
        t = np.sort(np.concatenate(finished + [np.array([self.t_end])]))
        if self.t_end < self.t_start:
            t = t[::-1]
        x, y, _, _ = self.evaluate(t)
        pts = np.column_stack([x, y])
        pts[0], pts[-1] = self.start, self.end
        return pts

    def fewest_chords(self, tolerance: float) -> int:
        """The fewest chords :meth:`flatten_to_tolerance` gives: its first equal steps.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> Curve(t, t ** 2, 0.0, 1.0).fewest_chords(0.1)
        16
        """
        return 16

    # -- for profile files (writer.py) ---------------------------------------------------

    def describe_to(self, out) -> None:
        """Tell a profile writer ``out`` what the curve is, through its primitive ``curve``.

        ``out.curve(x_expr, y_expr, t_start, t_end, exact)`` with the mapped
        expressions in ``t`` as :class:`revolve.expr.Expr` trees (:meth:`mapped_trees`,
        no sympy) and the exact ends of the interval (or None).

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> class Out:
        ...     def curve(self, x, y, t0, t1, exact):
        ...         print(x, y, t0, t1, exact)
        >>> Curve(t, t ** 2, 0.0, 1.0).translated(1.0).describe_to(Out())
        t + 1 t^2 0.0 1.0 None
        """
        x_tree, y_tree = self.mapped_trees()
        out.curve(x_tree, y_tree, self.t_start, self.t_end, self.exact)

    # -- for drawings: closing gaps between entities (dxf.py) ---------------------------

    def with_end_moved(self, point, at_start: bool = False):
        """None: a curve's end cannot move without changing its expressions (a gap is bridged instead).

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> Curve(t, t ** 2, 0.0, 1.0).with_end_moved((1.0, 1.01)) is None
        True
        """
        return None

    # -- for level tables (clipping.py, horizontal.py)

    @classmethod
    def axial_level_table(cls, segments, factors):
        """Curves cut where ``z`` turns back, as parametric rows ``(curve, t from, t to)``.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> table = Curve.axial_level_table([Curve(sympy.sin(t), t, 0.0, 3.0)], [1.0])
        >>> [(round(a, 9), round(b, 9)) for _, a, b in table.pieces]      # z = sin t turns at π/2
        [(0.0, 1.570796327), (1.570796327, 3.0)]
        """
        from revolve.geometry.clipping import ParametricPieces

        rows, fs = [], []
        for s, f in zip(segments, factors):
            for a, b in s.monotone_ranges(0):
                if a != b:
                    rows.append((s, a, b))
                    fs.append(f)
        return ParametricPieces(rows, fs)

    def part_below(self, level: float, tolerance: float = 0.0):
        """``(parts with x < level, ())``: the same curve on shorter intervals.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> [(p.t_start, round(p.t_end, 12)) for p in Curve(t ** 2, t, 0.0, 2.0).part_below(1.0)[0]]
        [(0.0, 1.0)]
        """
        from revolve.geometry.clipping import parameters_at_values

        out = []
        for p, q in self.monotone_ranges(0):
            za, zb = (float(v) for v in self.points_at([p, q])[:, 0])
            if max(za, zb) <= level:
                out.append(replace(self, t_start=p, t_end=q, exact=None))
                continue
            if min(za, zb) >= level:
                continue
            tc = float(parameters_at_values(self, p, q, [level], coordinate=0)[0])
            if za < zb:
                out.append(replace(self, t_start=p, t_end=tc, exact=None))
            else:
                out.append(replace(self, t_start=tc, t_end=q, exact=None))
        return tuple(s for s in out if s.t_end != s.t_start), ()

    @classmethod
    def radial_level_table(cls, segments, factors, z_ref: float = 0.0):
        """Curves moved by ``-z_ref`` along x and cut where r turns back, as parametric rows.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> table = Curve.radial_level_table([Curve(t, sympy.sin(t), 0.0, 3.0)], [1.0], z_ref=1.0)
        >>> [(round(a, 9), round(b, 9)) for _, a, b in table.curves]   # r = sin t turns at π/2
        [(0.0, 1.570796327), (1.570796327, 3.0), (0.0, 3.0)]
        >>> table.extent()[:2]
        (-1.0, 2.0)
        """
        from revolve.geometry.horizontal import ParametricRows

        items = []
        for s in segments:
            ranges = s.monotone_ranges(1)
            items.append((s.translated(-z_ref), [a for a, _ in ranges] + [ranges[-1][1]]))
        return ParametricRows.from_parameters(items, factors)

    # -- for the washer cross-check (slicing.py) ------------------------------------------

    def monotone_parameters(self, coordinate: int, t_from, t_to, targets, iterations: int = 70):
        """Parameters where the curve, monotone in a coordinate on ``[t_from, t_to]``, reaches ``targets``.

        ``coordinate`` 0 inverts ``x(t)`` (the axial ``z`` in the frame), 1
        inverts ``y(t)`` (the radius). ``t_from`` and ``t_to`` broadcast
        against ``targets`` (one range per row, or one for all). Vectorised
        safeguarded Newton: each step uses the derivative that :meth:`evaluate`
        gives with the value, keeps a bracket that always holds the root, and
        halves the bracket instead when a Newton step would leave it; a row
        stops when its value is within rounding of the target or its step is
        within a few units in the last place, and all stop after ``iterations``
        steps (the bound of plain bisection, which needs them all).

        >>> import numpy as np, sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> c = Curve(t ** 2, t, 0.0, 2.0)
        >>> [round(float(v), 12) for v in c.monotone_parameters(0, 0.0, 2.0, np.array([1.0, 4.0]))]
        [1.0, 2.0]
        >>> c.monotone_parameters(0, np.array([[0.0], [2.0]]), np.array([[1.0], [1.0]]),
        ...                       np.array([[0.25], [1.0]])).round(12).tolist()
        [[0.5], [1.0]]
        >>> abs(float(c.monotone_parameters(0, 0.0, 2.0, np.array([2.0]))[0]) - 2 ** 0.5) < 1e-15
        True
        >>> c.monotone_parameters(0, 0.0, 2.0, np.array([])).shape     # no targets
        (0,)
        >>> round(float(c.monotone_parameters(0, 2.0, 0.0, np.array([2.0]))[0]) ** 2, 14)  # run back
        2.0
        """
        import numpy as np

        targets = np.asarray(targets, dtype=float)
        ta = np.asarray(t_from, dtype=float)
        tb = np.asarray(t_to, dtype=float)
        lo = np.array(np.broadcast_to(ta, targets.shape), dtype=float)
        hi = np.array(np.broadcast_to(tb, targets.shape), dtype=float)
        if not targets.size:
            return 0.5 * (lo + hi)
        eps = np.finfo(float).eps
        with np.errstate(all="ignore"):
            # A grid over every row's range, all rows in one evaluation (its ends are the
            # range's ends): it gives the ends' values and narrows every bracket to one step,
            # so Newton starts next to its root and takes a few steps, not a dozen (each step
            # is an evaluation of every row).
            grid = lo[..., None] + np.linspace(0.0, 1.0, _GRID + 1) * (hi - lo)[..., None]
            grid[..., -1] = hi
            point = self.evaluate(grid.reshape(-1))
            values = point[coordinate].reshape(grid.shape)
            slopes = point[coordinate + 2].reshape(grid.shape)
            va, vb = values[..., 0], values[..., -1]
            rising = vb > va
            # start where the chord between the ends reaches the target (inside the bracket)
            share = np.clip((targets - va) / (vb - va), 0.0, 1.0)
            t = np.where(np.isfinite(share), lo + share * (hi - lo), 0.5 * (lo + hi))
            floor = 1e-8 * np.maximum(np.abs(lo), np.abs(hi))   # for a root at t = 0
            level = eps * np.maximum(np.abs(va), np.abs(vb))     # half an ulp of the ends
            past = np.where(rising[..., None], values >= targets[..., None],
                            values <= targets[..., None])
            j = np.clip(_GRID + 1 - past.sum(axis=-1), 1, _GRID)[..., None]  # first point past

            def at(a, k):
                return np.take_along_axis(a, k, -1)[..., 0]

            v0, v1, g0, g1 = at(values, j - 1), at(values, j), at(grid, j - 1), at(grid, j)
            known = np.isfinite(v0) & np.isfinite(v1) & np.isfinite(t)
            lo, hi = np.where(known, g0, lo), np.where(known, g1, hi)
            share = np.clip((targets - v0) / (v1 - v0), 0.0, 1.0)
            # Where the step starts or ends flat (a turning point: the ends of a monotone
            # range usually are), the value grows as the square of the distance from there.
            rise = np.abs(v1 - v0)
            flat0 = np.abs(at(slopes, j - 1) * (g1 - g0)) < 0.25 * rise
            flat1 = np.abs(at(slopes, j) * (g1 - g0)) < 0.25 * rise
            share = np.where(flat0 & ~flat1, np.sqrt(share),
                             np.where(flat1 & ~flat0, 1.0 - np.sqrt(1.0 - share), share))
            t = np.where(known & np.isfinite(share), g0 + share * (g1 - g0), t)
            for _ in range(iterations):
                point = self.evaluate(t)
                value, slope = point[coordinate], point[coordinate + 2]
                below = np.where(rising, value < targets, value > targets)
                hit = np.abs(value - targets) <= level   # as near as the floats can tell
                lo = np.where(below & ~hit, t, lo)
                hi = np.where(~below & ~hit, t, hi)
                newton = t - (value - targets) / slope
                inside = np.isfinite(newton) & ((newton - lo) * (newton - hi) < 0)  # lo > hi too
                step = np.where(hit, t, np.where(inside, newton, 0.5 * (lo + hi)))
                tiny = 4 * eps * np.maximum(np.abs(step), floor)
                settled = hit | (np.abs(step - t) <= tiny) | (np.abs(hi - lo) <= tiny)
                t = step
                if settled.all():
                    break
        return t

    @classmethod
    def washer_pieces(cls, segments):
        """Pieces of many curves along which the axial position moves one way, as arrays.

        Each curve is cut at its :meth:`monotone_ranges` in ``z`` (its
        :meth:`turning_parameters`); see :meth:`Line.washer_pieces
        <revolve.geometry.kinds.line.Line.washer_pieces>` for what is
        returned. A curve's row is ``t_a, t_b, k``: the piece's parameter range
        and the index of its curve in ``segments``, for :meth:`washer_radius`.

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> zf, zt, counts, params = Curve.washer_pieces([Curve(t * (2 - t), t + 1, 0.0, 2.0)])
        >>> zf.tolist(), zt.tolist(), counts.tolist(), params.tolist()
        ([0.0, 1.0], [1.0, 0.0], [2], [[0.0, 1.0, 0.0], [1.0, 2.0, 0.0]])
        """
        import numpy as np

        rows, counts = [], []
        for k, seg in enumerate(segments):
            ranges = seg.monotone_ranges(0)
            for ta, tb in ranges:
                za, zb = seg.points_at([ta, tb])[:, 0]
                rows.append((za, zb, ta, tb, k))
            counts.append(len(ranges))
        table = np.array(rows, dtype=float).reshape(-1, 5)
        return table[:, 0], table[:, 1], np.array(counts, dtype=np.int64), table[:, 2:]

    @classmethod
    def washer_radius(cls, segments, params, z):
        """The radius at axial positions ``z`` (rows (m, q)) along curve pieces ``params`` (m, 3).

        Each row's parameter is found by :meth:`monotone_parameters` on its
        curve (``segments[k]``), all rows of one curve at once.

        >>> import numpy as np, sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> c = Curve(t * (2 - t), t + 1, 0.0, 2.0)
        >>> _, _, _, params = Curve.washer_pieces([c])
        >>> Curve.washer_radius([c], params, np.array([[0.75], [0.75]])).round(12).tolist()
        [[1.5], [2.5]]
        """
        import numpy as np

        z = np.asarray(z, dtype=float)
        out = np.empty(z.shape)
        owner = params[:, 2].astype(np.int64)
        for k in sorted(set(owner.tolist())):   # not np.unique: it imports numpy.ma (~20 ms)
            rows = np.flatnonzero(owner == k)
            seg = segments[int(k)]
            t = seg.monotone_parameters(0, params[rows, 0:1], params[rows, 1:2], z[rows])
            out[rows] = seg.evaluate(t)[1]
        return out

    @classmethod
    def washer_degree(cls):
        """None: the radius along a curve is not taken as a polynomial of ``z``.

        >>> Curve.washer_degree() is None
        True
        """
        return None

    @classmethod
    def r_ds_rows(cls, segments, n: int = 32, rel_tol: float = 1e-14):
        """``∫ r ds`` along each curve by adaptive Gauss–Legendre in ``φ``: ``(values, errors)``.

        ``t = mid − half·cos φ`` keeps the integrand smooth at vertical tangents;
        vectorised over intervals, with a bounded number of them (see
        :func:`revolve.geometry.integrals.adaptive_quadrature`).

        >>> import sympy
        >>> t = sympy.Symbol("t", real=True)
        >>> v, e = Curve.r_ds_rows([Curve(3 * t, 4 * t, 0.0, 1.0)])   # r = 4t, ds = 5 dt: 10
        >>> round(float(v[0]), 12), bool(e[0] < 1e-12)
        (10.0, True)
        """
        import numpy as np

        from revolve.geometry.integrals import adaptive_quadrature

        values = np.zeros(len(segments))
        errors = np.zeros(len(segments))
        for i, c in enumerate(segments):
            ta, tb = c.t_start, c.t_end
            mid, half = (ta + tb) / 2, (tb - ta) / 2

            def g(phi, c=c, mid=mid, half=half):
                t = mid - half * np.cos(phi)
                _, r, dz, dr = c.evaluate(t)
                v = r * np.hypot(dz, dr) * np.sin(phi) * half
                return np.nan_to_num(v, nan=0.0, posinf=0.0, neginf=0.0)[:, None]

            with np.errstate(all="ignore"):
                total, err = adaptive_quadrature(g, 0.0, math.pi, rel_tol=rel_tol, n=n // 2)
            values[i], errors[i] = abs(float(total[0])), float(err[0])
        return values, errors

    # -- for profile files (writer.py): the mapped expressions as the package's own trees

    def mapped_trees(self) -> tuple:
        """The mapped expressions of ``x`` and ``y`` in ``t`` as :class:`revolve.expr.Expr` trees.

        The curve's map (:class:`CurveMap`) applied to its base trees with the
        trees' own operations (exact map numbers where known), so writing a
        curve imports no sympy. Zero and unit factors fold away.

        >>> from revolve.expr import parse_expression
        >>> base = parse_expression("t^2", ["t"])
        >>> c = Curve(parse_expression("t", ["t"]), base, 0.0, 1.0)
        >>> [e.text() for e in c.transformed(offset=(5.0, 0.0)).reversed().mapped_trees()]
        ['-t + 1 + 5', '(-t + 1)^2']
        >>> [e.text() for e in c.mapped_trees()]
        ['t', 't^2']
        """
        from revolve.expr import Var

        X, Y = self.base_x, self.base_y
        m = self.affine
        if m.is_identity:
            return X, Y
        m00, m01, m10, m11, v0, v1, p, q = m.numbers()
        if (m.p, m.q) != (1.0, 0.0):
            u = p * Var("t") + q
            X, Y = X.substitute({"t": u}), Y.substitute({"t": u})
        return m00 * X + m01 * Y + v0, m10 * X + m11 * Y + v1




def curve_from_expressions(x_expr, y_expr, t_start, t_end, face=None, where=None,
                           exact=None) -> Curve:
    """Build a parametric curve, checking the interval and that it evaluates finitely.

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> c = curve_from_expressions(t, 2 * t, 0, 1)
    >>> [round(v, 12) for v in c.end]
    [1.0, 2.0]
    >>> curve_from_expressions(t, 1 / t, 0, 1)
    Traceback (most recent call last):
    ...
    revolve.errors.SegmentError: the curve is not finite at t = 0; keep the interval where it is defined
    """
    import numpy as np

    try:
        t0, t1 = float(t_start), float(t_end)
    except (TypeError, ValueError):
        raise segment_error("the curve's interval must be two numbers", where)
    if not (math.isfinite(t0) and math.isfinite(t1)):
        raise segment_error("the curve's interval must be finite", where)
    if t0 == t1:
        raise segment_error("the curve's interval is empty (start equals end)", where)
    c = Curve(x_expr, y_expr, t0, t1, face=face, where=where, exact=exact)
    tt = np.linspace(t0, t1, 257)
    with np.errstate(all="ignore"):
        try:
            vals = c.evaluate(tt)
        except Exception as exc:  # a compiled expression failing is the input's fault
            raise segment_error(f"the curve cannot be evaluated ({exc})", where)
    for k, arr in enumerate(vals):
        bad = ~np.isfinite(arr)
        if k >= 2:
            # A derivative may be infinite at an end (a vertical tangent): the integrals
            # stay finite and the quadrature maps such ends smoothly.
            bad[[0, -1]] = False
        if bad.any():
            raise segment_error(f"the curve is not finite at t = {tt[np.argmax(bad)]:g}; "
                         "keep the interval where it is defined", where)
    pole = find_pole(c)
    if pole is not None:
        raise segment_error(f"the curve is not finite near t = {pole:.6g} (it grows beyond "
                     f"±{COORDINATE_LIMIT:g} there); keep the interval where it is defined", where)
    return c


def find_pole(curve: Curve, samples: int = 257, zooms: int = 60, points: int = 33):
    """Parameter near which a curve's coordinates grow without bound, or None.

    The curve is sampled; around every sample where ``|x|`` or ``|y|`` is a local
    maximum (the few largest), the neighbourhood is sampled again more finely,
    following the growth, until the interval reaches the resolution of the
    parameter. A pole shows as values beyond :data:`COORDINATE_LIMIT` (or not
    finite); a bounded curve settles on a finite maximum. The work is bounded:
    at most ``8 × zooms × points`` evaluations after the first samples.

    >>> import sympy
    >>> t = sympy.Symbol("t", real=True)
    >>> round(find_pole(Curve(t, 2 + sympy.tan(t), 0.0, 4.0)), 6)        # π/2
    1.570796
    >>> find_pole(Curve(t, sympy.exp(10 * t), 0.0, 2.0)) is None         # steep, but bounded
    True
    >>> find_pole(Curve(t, 2 + abs(sympy.sin(1000 * t)), 0.0, 10.0)) is None
    True
    """
    import numpy as np

    t0, t1 = sorted((float(curve.t_start), float(curve.t_end)))
    tt = np.linspace(t0, t1, samples)

    def size(t):
        x, y, _, _ = curve.evaluate(t)
        with np.errstate(all="ignore"):
            m = np.maximum(np.abs(x), np.abs(y))
        return np.where(np.isfinite(m), m, np.inf)

    m = size(tt)
    if not np.all(m <= COORDINATE_LIMIT):
        return float(tt[np.argmax(~(m <= COORDINATE_LIMIT))])
    peaks = np.flatnonzero((m >= np.roll(m, 1)) & (m >= np.roll(m, -1)))
    peaks = peaks[np.argsort(-m[peaks], kind="stable")][:8]
    for i in peaks:
        a, b = tt[max(i - 1, 0)], tt[min(i + 1, samples - 1)]
        for _ in range(zooms):
            u = np.linspace(a, b, points)
            mu = size(u)
            j = int(np.argmax(mu))
            if not mu[j] <= COORDINATE_LIMIT:
                return float(u[j])
            na, nb = u[max(j - 1, 0)], u[min(j + 1, points - 1)]
            if not (a < na or nb < b) or nb - na <= 4 * np.spacing(max(abs(na), abs(nb))):
                break
            a, b = na, nb
    return None
