"""The engine's Gauss–Legendre rule and Legendre tables against numpy and against exactness.

References: ``numpy.polynomial.legendre.leggauss`` and ``legvander`` (an independent
library's rule, made by the same published method, and its table of P_j(x)); an n-node Gauss–Legendre rule integrates every polynomial of
degree at most 2n − 1 exactly on [-1, 1] (Abramowitz and Stegun 25.4.29, from memory),
∫ x^k dx = 2 / (k + 1) for even k and 0 for odd k.
"""

import numpy as np
import pytest

from revolve.geometry.quadrature import _legendre_nodes, gauss_legendre, legendre_table


@pytest.mark.parametrize("n", list(range(1, 65)) + [100, 128, 200, 400])
def test_nodes_and_weights_match_numpys_rule(n):
    x, w = _legendre_nodes(n)
    X, W = np.polynomial.legendre.leggauss(n)
    assert np.abs(x - X).max() <= 4e-16
    assert np.abs(w - W).max() <= 2e-14          # numpy's own weights are off by ~1e-14 here
    assert abs(w.sum() - 2.0) <= 1e-15
    assert np.array_equal(x, -x[::-1]) and np.array_equal(w, w[::-1])


@pytest.mark.parametrize("n", [1, 2, 3, 7, 16, 24, 48])   # numpy's rule: within 1e-14 too
def test_rule_is_exact_up_to_degree_2n_minus_1(n):
    x, w = gauss_legendre(n)
    for k in range(2 * n):
        exact = 2.0 / (k + 1) if k % 2 == 0 else 0.0
        assert float(np.dot(w, x ** k)) == pytest.approx(exact, abs=2e-14)


def test_the_rule_is_cached_and_a_run_needs_no_numpy_polynomial():
    import subprocess
    import sys

    assert gauss_legendre(9) is gauss_legendre(9)
    code = ("import sys; from revolve.geometry.quadrature import gauss_legendre; gauss_legendre(24); "
            "print('numpy.polynomial' in sys.modules)")
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          check=True)
    assert done.stdout.strip() == "False"


@pytest.mark.parametrize("degree", [0, 1, 2, 5, 23, 47])
def test_legendre_table_matches_numpys_vandermonde_matrix(degree):
    x = np.linspace(-1.0, 1.0, 41)
    expected = np.polynomial.legendre.legvander(x, degree)
    assert np.abs(legendre_table(x, degree) - expected).max() <= 4e-15


def test_a_curve_measure_imports_no_numpy_polynomial(tmp_path):
    import subprocess
    import sys
    from pathlib import Path

    lid = Path(__file__).resolve().parents[2] / "profiles" / "domed-lid.toml"
    code = ("import sys; from revolve.cli.app import main\n"
            "try:\n    main(['measure', sys.argv[1], '--json'])\n"
            "except SystemExit as stop:\n    assert stop.code == 0, stop.code\n"
            "print('numpy.polynomial' in sys.modules, file=sys.stderr)")
    done = subprocess.run([sys.executable, "-c", code, str(lid)], capture_output=True, text=True,
                          check=True, cwd=tmp_path)
    assert done.stderr.strip().splitlines()[-1] == "False"
