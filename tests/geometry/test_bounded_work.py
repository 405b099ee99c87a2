"""Every input ends in bounded time and memory: a result with an honest error, or a refusal.

Input families, each named in its test: a curve with a pole inside its range,
a highly oscillating curve, a point list with a denormal (subnormal)
coordinate, huge coordinates, a huge axis. A refusal is a RevolveError (one
line, the segment named); a result must carry an error estimate that covers
the true value, taken from a closed form or from scipy.integrate.quad.

The hang checks run in a subprocess with a timeout, so that a regression fails
instead of hanging the suite. Nothing here times the engine.
"""

from __future__ import annotations

import math
import os
import subprocess
import sys
import textwrap

import numpy as np
import pytest
import sympy
from hypothesis import example, given, settings
from hypothesis import strategies as st

from geometry_testkit import T
from revolve.errors import ProfileError, RevolveError, SegmentError
from revolve.expr import parse_expression
from revolve.geometry.checks import PreparedProfile
from revolve.geometry.integrals import adaptive_quadrature
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Loop, Profile, Revolution
from revolve.geometry.segments import (COORDINATE_LIMIT, Line, Where, curve_from_expressions,
                                       find_pole)
from revolve.geometry.slicing import washer_volume

X = sympy.Symbol("x", real=True)
ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))


def _explicit(text: str, a: float, b: float, where=None):
    """y = f(x) from a to b, parsed by the whitelist parser, as the profile reader does."""
    y = parse_expression(text, ("x",)).to_sympy().xreplace({X: T})
    return curve_from_expressions(T, y, a, b, where=where)


def _under_curve(curve, a: float, b: float) -> Loop:
    """The region between the x axis and a curve y = f(x) > 0 from a to b."""
    (xa, ya), (xb, yb) = curve.start, curve.end
    return Loop((Line((a, 0.0), (xa, ya)), curve, Line((xb, yb), (b, 0.0)), Line((b, 0.0), (a, 0.0))))


def _measure_points(points, axis=None):
    return measure(Revolution(Profile(loops=(Loop.from_points(points),)), axis or Axis.x()))


# -- pole curve --------------------------------------------------------------------------

def test_pole_curve_is_refused_near_the_pole():
    # pole curve: tan has a pole at π/2 (any calculus text, from memory), inside 0..4.
    where = Where(file="lid.toml", line=6, place="loop 1, segment 2")
    with pytest.raises(SegmentError) as info:
        _explicit("2 + tan(x)", 0.0, 4.0, where=where)
    message = str(info.value)
    assert message.startswith("lid.toml:6: loop 1, segment 2: the curve is not finite near t = ")
    t = float(message.split("near t = ")[1].split()[0])
    assert abs(t - math.pi / 2) < 1e-4
    assert "\n" not in message


@pytest.mark.parametrize("text,pole", [("1/(x - 1.3)^2", 1.3), ("3 + 1/(x - 0.7)", 0.7),
                                       ("log(abs(x - 2.2))", 2.2)])
def test_pole_curves_of_other_kinds(text, pole):
    # pole curve: 1/(x - p)^k and log|x - p| are unbounded at p (common practice, no source).
    with pytest.raises(SegmentError, match="not finite near t = "):
        _explicit(text, 0.0, 4.0)
    assert abs(find_pole(_explicit_unchecked(text, 0.0, 4.0)) - pole) < 1e-3


def _explicit_unchecked(text, a, b):
    from revolve.geometry.segments import Curve
    return Curve(T, parse_expression(text, ("x",)).to_sympy().xreplace({X: T}), a, b)


def test_steep_but_bounded_curve_is_measured():
    # Not a pole: y = 1 + e^(5x) on 0..2 is steep and bounded. Volume π ∫ y² dx in closed
    # form (elementary integral): π [x + 2 e^(5x)/5 + e^(10x)/10] from 0 to 2.
    curve = _explicit("1 + exp(5*x)", 0.0, 2.0)
    m = measure(Revolution(Profile(loops=(_under_curve(curve, 0.0, 2.0),)), Axis.x()))
    exact = math.pi * ((2 + 2 * math.exp(10) / 5 + math.exp(20) / 10) - (2 / 5 + 1 / 10))
    assert abs(m.volume - exact) <= max(m.volume_error, 1e-12 * exact)


def test_curve_not_finite_inside_is_refused_by_the_quadrature():
    # non-finite integrand: 1 + √(|x − 0.5| − 0.25) is not real for 0.25 < x < 0.75. Built
    # directly (no sampling at construction), the quadrature itself must refuse it rather
    # than count the gap as zero.
    from revolve.geometry.integrals import curve_integrals_numeric
    from revolve.geometry.segments import Curve

    curve = Curve(T, 1 + sympy.sqrt(sympy.Abs(T - 0.5) - 0.25), 0.0, 1.0)
    with pytest.raises(SegmentError, match="not finite near t = "):
        curve_integrals_numeric(curve)


# -- highly oscillating curve ------------------------------------------------------------

def test_highly_oscillating_curve_is_refused_with_the_segment_named():
    # highly oscillating curve: |sin(1000 x)| has about 3183 kinks on 0..10.
    where = Where(file="roll.toml", line=6, place="loop 1, segment 2")
    curve = _explicit("2 + abs(sin(1000*x))", 0.0, 10.0, where=where)
    with pytest.raises(SegmentError) as info:
        measure(Revolution(Profile(loops=(_under_curve(curve, 0.0, 10.0),)), Axis.x()))
    assert str(info.value).startswith("roll.toml:6: loop 1, segment 2: the curve oscillates")


def test_oscillating_curve_result_or_refusal_is_honest():
    # highly oscillating curve, milder: y = 2 + |sin(40 x)| on 0..1 (13 kinks). Reference:
    # scipy.integrate.quad of π y² with the kinks given as break points.
    from scipy.integrate import quad

    kinks = [k * math.pi / 40 for k in range(1, 13)]
    ref, ref_err = quad(lambda x: math.pi * (2 + abs(math.sin(40 * x))) ** 2, 0, 1,
                        points=kinks, limit=500, epsabs=1e-13, epsrel=1e-13)
    curve = _explicit("2 + abs(sin(40*x))", 0.0, 1.0)
    try:
        m = measure(Revolution(Profile(loops=(_under_curve(curve, 0.0, 1.0),)), Axis.x()))
    except RevolveError as e:
        assert "oscillates" in str(e)
        return
    assert abs(m.volume - ref) <= m.volume_error + ref_err + 1e-12 * ref


@pytest.mark.parametrize("k", [40, 300])
def test_kinked_curve_error_estimate_covers_the_true_value(k):
    # highly oscillating curve with kinks: y = 2 + |sin(k x)| on 0..1. A kink close to the
    # end of a quadrature interval once hid from both rules (error 3e-6, estimate 3e-12).
    # Closed form (elementary integrals, from memory): π ∫ y² = π (4 + 4 I₁ + I₂) with
    # I₁ = ∫|sin kx| = (2N + 1 − cos(k − Nπ))/k, N = ⌊k/π⌋, and I₂ = 1/2 − sin(2k)/(4k).
    N = math.floor(k / math.pi)
    exact = math.pi * (4 + 4 * (2 * N + 1 - math.cos(k - N * math.pi)) / k
                       + 0.5 - math.sin(2 * k) / (4 * k))
    curve = _explicit(f"2 + abs(sin({k}*x))", 0.0, 1.0)
    m = measure(Revolution(Profile(loops=(_under_curve(curve, 0.0, 1.0),)), Axis.x()))
    assert abs(m.volume - exact) <= m.volume_error + 1e-13 * exact
    assert abs(m.crosscheck.volume - exact) <= m.crosscheck.volume_error + 1e-13 * exact


def test_kinked_curve_level_table_error_covers_the_true_value():
    # highly oscillating curve in a horizontal level table: full depth holds the whole
    # solid, π ∫ y² (closed form as above, k = 40); at the axis height every circle is half
    # wetted (CRC segment area r² acos(−y/r) + y √(r² − y²) at y = 0, from memory).
    from revolve.geometry.checks import prepare
    from revolve.geometry.horizontal import horizontal_levels

    k = 40
    N = math.floor(k / math.pi)
    full = math.pi * (4 + 4 * (2 * N + 1 - math.cos(k - N * math.pi)) / k
                      + 0.5 - math.sin(2 * k) / (4 * k))
    curve = _explicit(f"2 + abs(sin({k}*x))", 0.0, 1.0)
    prep = prepare(Profile(loops=(_under_curve(curve, 0.0, 1.0),)), Axis.x())
    r_max = 3.0                     # 2 + |sin| reaches 3 on 0..1 (k = 40)

    res = horizontal_levels(prep, [2 * r_max, r_max])
    assert abs(res.volume[0] - full) <= res.error[0] + 1e-13 * full

    # Liquid surface at the axis height (depth r_max): every slice is half wetted.
    assert abs(res.volume[1] - full / 2) <= res.error[1] + 1e-13 * full


def test_high_power_curve_with_rounding_noise_is_measured():
    # An expression whose values carry rounding noise above the quadrature's target: the
    # 4096th power amplifies the rounding of 1 + x/10. Nothing is expanded symbolically.
    # Volume π ∫₀^b (1 + x/10)^8192 dx = π · 10/8193 · [(1 + b/10)^8193 − 1] (power rule).
    b = 0.001
    curve = _explicit("((x/10 + 1)^64)^64", 0.0, b)
    m = measure(Revolution(Profile(loops=(_under_curve(curve, 0.0, b),)), Axis.x()))
    exact = math.pi * 10 / 8193 * math.expm1(8193 * math.log1p(b / 10))
    assert abs(m.volume - exact) <= m.volume_error + 1e-12 * exact
    assert m.crosscheck.agrees(1e-9)


def test_bounded_quadrature_error_covers_the_true_value():
    # highly oscillating integrand, few intervals: ∫₀^π |sin(k x)| dx = 2 for integer k
    # (elementary integral). Whatever the budget, the estimate must cover the miss.
    f = lambda x: np.abs(np.sin(333 * x))[:, None]  # noqa: E731
    for budget in (4, 64, 1024):
        info = {}
        v, e = adaptive_quadrature(f, 0.0, math.pi, max_intervals=budget, info=info)
        assert info["exhausted"]
        assert abs(v[0] - 2.0) <= e[0]


def test_symbolic_step_runs_in_any_thread_and_ends():
    # The exact step uses no timer signals: a curve measured in a worker thread still gets
    # its exact area moments (y = x² on 0..1 under the curve: area 1/3, from calculus).
    import threading

    out = {}

    def work():
        curve = _explicit("x^2 + 1", 0.0, 1.0)
        out["m"] = measure(Revolution(Profile(loops=(_under_curve(curve, 0.0, 1.0),)), Axis.x()), symbolic=True)

    th = threading.Thread(target=work)
    th.start()
    th.join(120)
    assert not th.is_alive()
    m = out["m"]
    assert any(how.startswith("symbolic") for how in m.section.methods)
    assert math.isclose(m.area, 4 / 3, rel_tol=1e-14)   # ∫₀¹ (x² + 1) dx = 4/3


def test_sympy_worker_is_stopped_when_its_time_is_up():
    # The --exact worker process is ended after its budget; the caller gets None, not a hang.
    from revolve.geometry.exact import run_sympy

    g = sympy.sqrt(1 + T ** 3 + T ** 7) * sympy.log(1 + T ** 5)   # no elementary antiderivative
    assert run_sympy([("integrate", g, T, 0, 1)], 0.2) == [None]


# -- denormal point list -----------------------------------------------------------------

DENORMAL = [(5e-324, 0.5625), (2.5, 0.5625), (2.5, 0.9375), (0.0, 0.9375)]


def test_denormal_point_list_measures_as_the_ring_it_is():
    # denormal point list: a 2.5-long ring from r = 0.5625 to 0.9375 (the 5e-324 is noise).
    # Washer volume π (R² − r²) L and surface 2π (R + r) L + 2 π (R² − r²) (CRC, from memory).
    m = _measure_points(DENORMAL)
    R, r, L = 0.9375, 0.5625, 2.5
    assert math.isclose(m.volume, math.pi * (R * R - r * r) * L, rel_tol=1e-13)
    assert math.isclose(m.surface_total, 2 * math.pi * ((R + r) * L + R * R - r * r), rel_tol=1e-13)
    assert m.crosscheck.agrees(1e-12)


def test_washers_stay_bounded_on_an_unsnapped_denormal_edge():
    # denormal point list, the mechanism itself: a frame edge from z = 0 to z = 5e-324 makes
    # the slope overflow. The washers must stop with a finite value and an honest error.
    pts = [(5e-324, 0.5625), (2.5, 0.5625), (2.5, 0.9375), (0.0, 0.9375)]
    segs = tuple(Line(pts[i], pts[(i + 1) % 4]) for i in range(4))
    prep = PreparedProfile((segs,), (True,), (0,), 1.0, 2.6, 2.6e-9)
    v, e = washer_volume(prep, [1.0], 2 * math.pi)
    exact = math.pi * (0.9375 ** 2 - 0.5625 ** 2) * 2.5   # CRC washer (from memory)
    assert math.isfinite(v) and math.isfinite(e)
    assert abs(v - exact) <= e + 1e-13 * exact


def test_denormal_only_profile_is_refused_as_too_small():
    # denormal point list: every coordinate subnormal; squares would underflow to zero.
    with pytest.raises(ProfileError, match="too small"):
        _measure_points([(0.0, 1e-310), (1e-310, 1e-310), (1e-310, 2e-310), (0.0, 2e-310)])


# -- huge coordinates --------------------------------------------------------------------

def test_huge_coordinates_are_refused_with_the_range():
    # huge coordinates: near 1e90 the squares and cubes of the moments overflow.
    with pytest.raises(ProfileError) as info:
        _measure_points([(0.0, 1e90), (1e90, 1e90), (1e90, 2e90), (0.0, 2e90)])
    assert "1e+15" in str(info.value) and "allowed range" in str(info.value)


def test_coordinates_at_the_limit_are_measured():
    # huge coordinates, the largest allowed: a square of side s at r from s to 2s, the limit.
    # Washer volume π ((2s)² − s²) s (CRC, from memory) and a finite centre of mass.
    s = COORDINATE_LIMIT / 2
    m = _measure_points([(0.0, s), (s, s), (s, 2 * s), (0.0, 2 * s)])
    assert math.isclose(m.volume, math.pi * 3 * s ** 3, rel_tol=1e-12)
    assert m.centre_of_mass_axial is not None and math.isclose(m.centre_of_mass_axial, s / 2,
                                                               rel_tol=1e-12)
    assert m.crosscheck.agrees(1e-9)


@pytest.mark.parametrize("R", [1e4, 1e6, 3e7, 9e7, 1e200])
def test_flat_arc_of_huge_radius_keeps_its_digits(R):
    # huge coordinates in an arc: a unit chord bowed outwards by a radius R ≫ 1, whose
    # centre lies ~R away. Section area = the unit square + the circular segment
    # R² (h − sin h cos h), h = asin(1/2R), = R² (2h³/3 − 2h⁵/15 + …) (CRC, from memory).
    # Past 1e8 chords the arc is straight within tolerance and is measured as its chord;
    # a radius whose square overflows once ended in "cannot convert float NaN to integer".
    from revolve.geometry.segments import arc_from_radius

    top = arc_from_radius((1.0, 2.0), (0.0, 2.0), radius=R, side="right")
    loop = Loop((Line((0.0, 1.0), (1.0, 1.0)), Line((1.0, 1.0), (1.0, 2.0)), top,
                 Line((0.0, 2.0), (0.0, 1.0))))
    m = measure(Revolution(Profile(loops=(loop,)), Axis.x()))
    h = math.asin(0.5 / R)
    segment = (R * h) ** 2 * (2 * h / 3 - 2 * h ** 3 / 15)        # R h ≈ 1/2: no overflow
    assert math.isclose(m.area, 1 + segment, rel_tol=1e-14)
    assert m.crosscheck.agrees(1e-9)


def test_curve_with_huge_values_is_refused():
    # huge coordinates from a curve: e^(50x) passes 1e15 at x ≈ 0.69.
    with pytest.raises(SegmentError, match="not finite near"):
        _explicit("exp(50*x)", 0.0, 1.0)


# -- huge axis ---------------------------------------------------------------------------

@pytest.mark.parametrize("point,direction", [((1e999, 0.0), (1.0, 0.0)), ((0.0, 0.0), (1e999, 0.0)),
                                             ((0.0, 0.0), (float("nan"), 1.0)),
                                             ((1e16, 0.0), (1.0, 0.0)), ((0.0, 0.0), ("a", 1.0))])
def test_huge_axis_is_refused(point, direction):
    # huge axis: a point or direction beyond the coordinate range, or not a number.
    with pytest.raises(ProfileError, match="axis"):
        Axis(point, direction)


def test_axis_far_from_a_small_part_stays_finite():
    # huge axis within the range: a unit square whose centroid is 1e15 − 0.5 from the axis.
    # Pappus–Guldinus V = 2π d A (Stewart, Calculus, from memory).
    m = _measure_points([(0.0, 0.0), (1.0, 0.0), (1.0, 1.0), (0.0, 1.0)],
                        axis=Axis((0.0, 1e15), (1.0, 0.0)))
    assert math.isclose(m.volume, 2 * math.pi * (1e15 - 0.5), rel_tol=1e-9)


# -- the hang cases, in a subprocess with a timeout ----------------------------------------

def test_former_hangs_end_in_a_subprocess():
    # pole curve, highly oscillating curve, denormal point list: each once ran for minutes or
    # took gigabytes. A timeout turns a regression into a failure instead of a hung suite.
    code = textwrap.dedent("""
        from revolve.formats.profile_file import parse_profile_text
        from revolve.geometry.measure import measure
        from revolve.geometry.profile import Revolution, Axis
        from revolve.errors import RevolveError
        loop = '''units = "mm"
        [[loop]]
        start = [0, 0]
        segments = [{{ line_to = [0, 2] }}, {{ y = "{y}", to_x = {b} }},
                    {{ line_to = [{b}, 0] }}, {{ close = true }}]
        '''
        for y, b in (("2 + tan(x)", 4), ("2 + abs(sin(1000*x))", 10)):
            try:
                doc = parse_profile_text(loop.format(y=y, b=b), file="case.toml")
                measure(Revolution(doc.profile, Axis.x()))
                print("result")
            except RevolveError as e:
                print("refused", str(e).splitlines()[0][:40])
        from revolve.geometry.profile import Loop, Profile
        pts = [(5e-324, 0.5625), (2.5, 0.5625), (2.5, 0.9375), (0.0, 0.9375)]
        m = measure(Revolution(Profile(loops=(Loop.from_points(pts),)), Axis.x()))
        print("result", m.crosscheck.agrees(1e-12))
    """)
    env = dict(os.environ, PYTHONPATH=ROOT + os.pathsep + os.environ.get("PYTHONPATH", ""))
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          timeout=120, env=env, cwd=ROOT)
    assert done.returncode == 0, done.stderr[-2000:]
    lines = done.stdout.split("\n")
    assert lines[0].startswith("refused case.toml:")
    assert lines[1].startswith("refused case.toml:")
    assert lines[2] == "result True"


# -- property: any point list or simple curve gives a result or a RevolveError -------------

TINY = st.sampled_from([5e-324, 1e-310, 2.2e-308, 1e-300, 1e-200, -5e-324])
HUGE = st.sampled_from([1e15, 1e16, 1e90, 1e300, 1.7976931348623157e308, -1e90])
NORMAL = st.floats(min_value=-1e3, max_value=1e3, allow_nan=False, allow_infinity=False)
COORD = st.one_of(NORMAL, NORMAL, NORMAL, TINY, HUGE, st.just(0.0))


@st.composite
def point_lists(draw):
    pts = draw(st.lists(st.tuples(COORD, COORD), min_size=3, max_size=8))
    if draw(st.booleans()):   # near-duplicate points: a copy nudged by a few ulps
        i = draw(st.integers(0, len(pts) - 1))
        x, y = pts[i]
        k = draw(st.integers(1, 4))
        pts.insert(i + 1, (float(np.nextafter(x, 0.0)) if k % 2 else x,
                           y + k * math.ulp(y)))
    return pts


@settings(max_examples=150, deadline=None)
@given(point_lists(), st.sampled_from(["x", "y", "far"]))
@example([(5e-324, 0.5625), (2.5, 0.5625), (2.5, 0.9375), (0.0, 0.9375)], "x")   # denormal
@example([(0.0, 1e90), (1e90, 1e90), (1e90, 2e90), (0.0, 2e90)], "x")             # huge
@example([(0.0, 1e-310), (1e-310, 1e-310), (1e-310, 2e-310)], "y")               # all denormal
def test_point_lists_give_a_result_or_a_revolve_error(points, axis_name):
    axis = {"x": Axis.x(), "y": Axis.y(), "far": Axis((0.0, -1e15), (1.0, 0.0))}[axis_name]
    try:
        m = _measure_points(points, axis)
    except RevolveError as e:
        assert "\n" not in str(e)
        return
    assert math.isfinite(m.volume) and math.isfinite(m.surface_total)
    assert m.centre_of_mass_axial is None or math.isfinite(m.centre_of_mass_axial)


CURVES = ["{c} + x^2", "{c} + ((x/{k} + 1)^64)^64", "{c} + sin({k}*x)", "{c} + abs(sin({k}*x))", "{c} + tan(x)", "{c} + 1/(x - {k})",
          "{c} + sqrt(x)", "{c} + exp({k}*x)", "{c} + log(x + {k})", "{c} - x^3/{k}"]


@settings(max_examples=15, deadline=None)
@given(st.sampled_from(CURVES), st.sampled_from([0.5, 2.0, 3.0, 1e-3]),
       st.sampled_from([0.3, 1.0, 7.0, 50.0, 1e3]), st.sampled_from([0.5, 1.0, 4.0, 10.0]))
@example("{c} + tan(x)", 2.0, 1.0, 4.0)                  # pole curve
@example("{c} + abs(sin({k}*x))", 2.0, 1e3, 10.0)        # highly oscillating curve
def test_simple_curves_give_a_result_or_a_revolve_error(template, c, k, b):
    text = template.format(c=c, k=k)
    try:
        curve = _explicit(text, 0.0, b)
        m = measure(Revolution(Profile(loops=(_under_curve(curve, 0.0, b),)), Axis.x()))
    except RevolveError as e:
        assert "\n" not in str(e)
        return
    assert math.isfinite(m.volume) and math.isfinite(m.volume_error)
