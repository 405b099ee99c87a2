"""Gauss–Legendre rules and Legendre polynomial tables, for every quadrature of the engine.

Made with numpy alone (no ``numpy.polynomial``, whose six modules would cost
every run of a curve some milliseconds of imports): the rule by the method of
``numpy.polynomial.legendre.leggauss`` (eigenvalues of the Jacobi matrix, Golub
and Welsch 1969, one Newton step), the table of P_0 … P_k at given points by the
three-term recurrence. The tests compare both with numpy's functions.

Examples
--------
>>> x, w = gauss_legendre(3)
>>> round(float(w.sum()), 14), round(float((w * x ** 4).sum()), 14)    # ∫ x⁴ = 2/5
(2.0, 0.4)
>>> legendre_table(np.array([0.5]), 2).tolist()                           # P_2(½) = -1/8
[[1.0, 0.5, -0.125]]
"""

from __future__ import annotations

from typing import Tuple

import numpy as np

__all__ = ["gauss_legendre", "legendre_table"]

_GL_CACHE: dict = {}


def gauss_legendre(n: int) -> Tuple[np.ndarray, np.ndarray]:
    """Gauss–Legendre nodes and weights on [-1, 1], made once per ``n``.

    >>> x, w = gauss_legendre(3)
    >>> round(float(w.sum()), 14)
    2.0
    """
    if n not in _GL_CACHE:
        _GL_CACHE[n] = _legendre_nodes(n)
    return _GL_CACHE[n]


def _legendre_nodes(n: int) -> Tuple[np.ndarray, np.ndarray]:
    """Gauss–Legendre rule of ``n`` nodes, made as ``numpy.polynomial.legendre.leggauss`` makes it.

    The same method — eigenvalues of the symmetric Jacobi matrix (Golub and Welsch 1969),
    one Newton step on P_n, weights proportional to 1 / (P_{n-1}(x) P_n'(x)) scaled to sum
    to 2, both made symmetric; the tests compare it with ``leggauss``.
    """
    if n == 1:
        return np.zeros(1), np.full(1, 2.0)
    k = np.arange(1.0, n)
    off = k / np.sqrt(4.0 * k * k - 1.0)
    x = np.linalg.eigvalsh(np.diag(off, 1) + np.diag(off, -1))

    def legendre(x):        # P_{n-1}, P_n and P_n' by the three-term recurrences
        before, p = np.ones_like(x), x.copy()
        slope = np.ones_like(x)
        for j in range(2, n + 1):
            slope = x * slope + j * p          # P_j' = x P_{j-1}' + j P_{j-1}
            before, p = p, ((2 * j - 1) * x * p - (j - 1) * before) / j
        return before, p, slope

    _, p, dp = legendre(x)
    x = x - p / dp
    before, _, dp = legendre(x)
    w = 1.0 / (before * dp)
    x, w = 0.5 * (x - x[::-1]), 0.5 * (w + w[::-1])       # symmetric, as the exact rule is
    return x, w * (2.0 / w.sum())


def legendre_table(x: np.ndarray, degree: int) -> np.ndarray:
    """``P_j(x_i)`` for j = 0 … ``degree``: rows by point, as ``legvander`` gives them.

    >>> legendre_table(np.array([-1.0, 1.0]), 3).tolist()
    [[1.0, -1.0, 1.0, -1.0], [1.0, 1.0, 1.0, 1.0]]
    """
    x = np.asarray(x, dtype=float)
    out = np.empty(x.shape + (degree + 1,))
    out[..., 0] = 1.0
    if degree > 0:
        out[..., 1] = x
    for j in range(2, degree + 1):
        out[..., j] = ((2 * j - 1) * x * out[..., j - 1] - (j - 1) * out[..., j - 2]) / j
    return out
