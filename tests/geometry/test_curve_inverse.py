"""Inverting a curve along one coordinate (the washer cross-check's slices) against closed forms.

Reference: on the quarter ellipse x = -a cos t, y = b sin t (0 ≤ t ≤ π/2) the parameter at a
given x is t = arccos(-x / a), and at a given y it is t = arcsin(y / b) (the inverse
functions, from memory). The targets crowd towards the ends, where the curve turns (x at the
pole, y at the equator) and a plain Newton step from a straight-line guess is slow.
"""

import math

import numpy as np
import pytest
import sympy

from revolve.geometry.segments import Curve

T = sympy.Symbol("t", real=True)
A, B = 500.0, 1000.0
QUARTER = Curve(-A * sympy.cos(T), B * sympy.sin(T), 0.0, math.pi / 2)


def _crowded(lo, hi):
    gaps = np.concatenate([[0.0], np.geomspace(1e-12, 1.0, 60)])
    return np.unique(np.concatenate([lo + (hi - lo) * gaps, hi - (hi - lo) * gaps]))


def test_axial_inverse_matches_arccos_near_the_pole():
    x = _crowded(-A, 0.0)
    t = QUARTER.monotone_parameters(0, 0.0, math.pi / 2, x)
    expected = np.arccos(np.clip(-x / A, -1.0, 1.0))
    # the value is found to rounding; near the pole t itself is fixed only to √(rounding)
    assert np.abs(QUARTER.evaluate(t)[0] - x).max() <= 4e-13
    far = np.abs(x + A) > 1e-6 * A
    assert np.abs(t - expected)[far].max() <= 1e-9


def test_radial_inverse_matches_arcsin_near_the_equator_and_runs_back():
    y = _crowded(0.0, B)
    t = QUARTER.monotone_parameters(1, math.pi / 2, 0.0, y)        # from the far end back
    assert np.abs(QUARTER.evaluate(t)[1] - y).max() <= 8e-13
    far = np.abs(y - B) > 1e-6 * B
    assert np.abs(t - np.arcsin(y / B))[far].max() <= 1e-9


@pytest.mark.parametrize("coordinate", [0, 1])
def test_every_target_is_found_inside_its_own_range(coordinate):
    lo = np.array([[0.0], [0.3], [1.0]])
    hi = np.array([[0.3], [1.0], [math.pi / 2]])
    ends = QUARTER.evaluate(np.concatenate([lo, hi]).ravel())[coordinate].reshape(2, 3)
    targets = ends[0][:, None] + (ends[1] - ends[0])[:, None] * np.linspace(0, 1, 9)[None, :]
    t = QUARTER.monotone_parameters(coordinate, lo, hi, targets)
    assert ((t >= lo - 1e-15) & (t <= hi + 1e-15)).all()
    assert np.abs(QUARTER.evaluate(t)[coordinate] - targets).max() <= 4e-13
