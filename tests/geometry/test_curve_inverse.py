"""Curve.monotone_parameters (the washers' z -> t) against closed-form inverses.

References: the ellipse z = -a·cos t, r = b·sin t inverted by hand,
t = arccos(-z/a), r = b·sqrt(1 - (z/a)²) (from memory), and the parabola
y = 25 - t²/180 solved for t; ranges run forwards and backwards, targets lie
at the ends and next to a turning point (where z is flat in t).
"""

from __future__ import annotations

import numpy as np
import pytest

from revolve.expr import parse_expression
from revolve.geometry.kinds.curve import Curve


def curve(x, y, t0, t1):
    return Curve(parse_expression(x, ["t"]), parse_expression(y, ["t"]), t0, t1)


@pytest.mark.parametrize("ta, tb", [(0.0, np.pi / 2), (np.pi / 2, 0.0)])
def test_ellipse_quarter_both_ways_and_near_its_turn(ta, tb):
    c = curve("-500*cos(t)", "1000*sin(t)", 0.0, np.pi / 2)    # z turns at t = 0
    targets = np.array([-500.0, -500.0 + 1e-9, -499.9, -300.0, -1e-6, 0.0])
    got = c.monotone_parameters(0, ta, tb, targets)
    # near the turn z is known only to rounding (an ulp of 500), which moves r by about
    # b·sqrt(2·ulp/a); elsewhere r agrees to 1e-12 of the head's size
    slack = 1000 * np.sqrt(4 * np.spacing(500.0) / 500)
    for value, t in zip(targets, got):
        r_got = float(c.evaluate(np.array([t]))[1][0])
        r_want = 1000 * np.sqrt(max(0.0, 1 - (value / 500) ** 2))
        assert r_got == pytest.approx(r_want, abs=1e-9 + slack)
        if abs(value + 500) > 1e-3:
            assert r_got == pytest.approx(r_want, rel=1e-12)
            assert t == pytest.approx(np.arccos(-value / 500), abs=1e-12)


def test_explicit_curve_run_backwards():
    c = curve("t", "25 - t^2/180", 60.0, 0.0)                  # y from 5 up to 25 as t runs back
    targets = np.array([[5.0, 10.0, 20.0, 25.0]])
    got = c.monotone_parameters(1, np.array([[60.0]]), np.array([[0.0]]), targets)
    want = np.sqrt((25 - targets) * 180)                         # solved by hand
    assert np.allclose(got, want, rtol=0, atol=1e-12)
