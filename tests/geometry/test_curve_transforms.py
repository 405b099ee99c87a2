"""A curve moved, mirrored or reversed keeps its base expressions and an affine map.

The numbers of a transformed curve must equal those of the curve written out
with the transformed expressions. The reference here is independent of the
engine's map: the test substitutes ``u = p t + q`` into the base expressions
and applies the matrix with sympy (``xreplace``), differentiates with
``sympy.diff`` and evaluates with ``evalf`` at 30 digits; the engine applies
the map numerically to the values of the base functions. A copy must cost no
compilation: a vessel with two ellipsoidal heads, built, drawn in the sketch
and measured, compiles its ellipse once (``compiled_curve.cache_info``).
"""

from __future__ import annotations

import math
from fractions import Fraction
from pathlib import Path

import numpy as np
import pytest
import sympy
from hypothesis import example, given
from hypothesis import strategies as st

from revolve.geometry.frame import to_frame
from revolve.geometry.profile import Axis
from revolve.geometry.segments import Curve, compiled_curve, curve_from_expressions

T = sympy.Symbol("t", real=True)
#: A base curve with every kind of term: polynomial, trigonometric, a root.
BASE_X = 2 + T ** 2 / 3 + sympy.cos(T)
BASE_Y = 1 + T * sympy.sqrt(1 + T ** 2) + sympy.sin(2 * T) / 5
T0, T1 = 0.25, 1.75


def reference(x, y, matrix=(1, 0, 0, 1), offset=(0, 0), p=1, q=0):
    """The transformed expressions, built by substitution (sympy numbers from the floats)."""
    S = sympy.Rational  # the exact value of each float: no rounding in the reference
    u = S(p) * T + S(q)
    X, Y = x.xreplace({T: u}), y.xreplace({T: u})
    m00, m01, m10, m11 = (S(v) for v in matrix)
    return (m00 * X + m01 * Y + S(offset[0]), m10 * X + m11 * Y + S(offset[1]))


def values(x, y, ts):
    """(x, y, dx/dt, dy/dt) of expressions at ``ts``, evaluated by sympy's evalf (30 digits)."""
    exprs = (x, y, sympy.diff(x, T), sympy.diff(y, T))
    return np.array([[float(e.evalf(30, subs={T: sympy.Rational(tv)})) for tv in ts]
                     for e in exprs])


def assert_close(got, want, rel=1e-13):
    got = np.asarray(got, dtype=float)
    scale = np.maximum(np.abs(want), 1.0)
    assert np.all(np.abs(got - want) <= rel * scale), (got, want)


TS = [T0, 0.5, 1.0, 1.3, T1]


def test_translation_mirror_and_reversal_match_the_substituted_expressions():
    base = curve_from_expressions(BASE_X, BASE_Y, T0, T1)
    moved = base.translated(-3.5, 0.25)
    mirrored = moved.transformed((0.0, 1.0, 1.0, 0.0))     # the vessel's swap of x and y
    back = mirrored.reversed()
    cases = [
        (moved, reference(BASE_X, BASE_Y, offset=(-3.5, 0.25))),
        (mirrored, reference(BASE_X, BASE_Y, (0, 1, 1, 0), (0.25, -3.5))),
        (back, reference(BASE_X, BASE_Y, (0, 1, 1, 0), (0.25, -3.5), p=-1, q=T0 + T1)),
    ]
    for curve, (rx, ry) in cases:
        want = values(rx, ry, TS)
        assert_close(np.array(curve.evaluate(TS)), want)
        # The curve built from the transformed expressions gives the same numbers.
        built = curve_from_expressions(rx, ry, T0, T1)
        assert_close(np.array(built.evaluate(TS)), want)
        # The mapped expressions, built on demand, are the transformed ones.
        assert_close(values(curve.x_expr, curve.y_expr, TS), want)


def test_pieces_of_a_reversed_curve_keep_their_place():
    base = curve_from_expressions(BASE_X, BASE_Y, T0, T1)
    first, second = base.reversed().split(0.3)
    rx, ry = reference(BASE_X, BASE_Y, p=-1, q=T0 + T1)
    for piece in (first, second):
        ts = list(np.linspace(piece.t_start, piece.t_end, 5))
        assert_close(np.array(piece.evaluate(ts)), values(rx, ry, ts))
    assert first.end == second.start


@pytest.mark.parametrize("point, direction, side", [
    ((3.5, -1.25), (math.cos(0.7), math.sin(0.7)), 1.0),
    ((-2.0, 4.0), (math.cos(2.3), math.sin(2.3)), -1.0),
    ((0.0, 0.0), (0.0, 1.0), -1.0),
])
def test_axis_frame_of_a_curve_matches_the_rotated_expressions(point, direction, side):
    # z = u·(p − P), r = side · (u × (p − P)) (common practice, no source): the frame map
    # written out by hand on the expressions.
    axis = Axis(point, direction)
    ux, uy = axis.unit_direction()
    px, py = point
    base = curve_from_expressions(BASE_X, BASE_Y, T0, T1)
    framed = to_frame(base, axis, side)
    S = sympy.Rational
    dx, dy = BASE_X - S(px), BASE_Y - S(py)
    z = S(ux) * dx + S(uy) * dy
    r = S(side) * (S(ux) * dy - S(uy) * dx)
    want = values(z, r, TS)
    assert_close(np.array(framed.evaluate(TS)), want, rel=1e-12)
    assert_close(values(framed.x_expr, framed.y_expr, TS), want, rel=1e-12)


@given(angle=st.floats(-math.pi, math.pi), dx=st.floats(-1e3, 1e3), dy=st.floats(-1e3, 1e3),
       mirror=st.booleans(), reverse=st.booleans())
@example(angle=0.0, dx=0.0, dy=0.0, mirror=True, reverse=True)
def test_any_rigid_map_matches_the_substituted_expressions(angle, dx, dy, mirror, reverse):
    c, s = math.cos(angle), math.sin(angle)
    m = -1.0 if mirror else 1.0
    matrix = (c, -m * s, s, m * c)
    base = curve_from_expressions(BASE_X, BASE_Y, T0, T1)
    curve = base.transformed(matrix, (dx, dy))
    p, q = 1, 0
    if reverse:
        curve, p, q = curve.reversed(), -1, T0 + T1
    rx, ry = reference(BASE_X, BASE_Y, matrix, (dx, dy), p, q)
    want = values(rx, ry, TS)
    # Rounding of one product and one sum per coordinate, relative to the largest term.
    assert_close(np.array(curve.evaluate(TS)), want, rel=1e-13)


def test_copies_share_one_compilation():
    x, y = T ** 3 + sympy.Rational(1, 7), sympy.exp(T / 3)   # expressions no other test uses
    compiled_curve.cache_clear()
    base = curve_from_expressions(x, y, 0.0, 1.0)
    copies = [base.translated(1.5), base.reversed(), base.transformed((0, 1, 1, 0)),
              base.reversed().split(0.5)[1].translated(0.0, -2.0)]
    for c in copies:
        c.evaluate([0.5])
    assert compiled_curve.cache_info().misses == 1
    # and the copies sit where the substituted expressions put them
    rx, ry = reference(x, y, offset=(0, -2), p=-1, q=1)
    assert_close(np.array(copies[-1].evaluate([0.75])), values(rx, ry, [0.75]))


def test_vessel_with_two_ellipsoidal_heads_compiles_its_ellipse_once():
    from revolve.geometry.measure import measure
    from revolve.geometry.profile import Revolution
    from revolve.jobs.vessel import design_vessel, parse_head, sketch_profile, summarise

    D, L = 1234.0, 2345.0   # sizes no other test uses; the count starts from an empty cache
    compiled_curve.cache_clear()
    spec = parse_head("ellipsoidal", D)
    design = design_vessel(D, L, spec, spec)
    summary = summarise(design)
    profile, axis = sketch_profile(design, "vertical", "inside")
    drawn = measure(Revolution(profile, axis), symbolic=False)
    assert compiled_curve.cache_info().misses == 1
    # A 2:1 ellipsoidal head holds π D³/24 (spheroid, CRC, from memory; 2:1 is common practice).
    head = math.pi * D ** 3 / 24
    assert summary.heads[0].volume == pytest.approx(head, rel=1e-12)
    assert summary.heads[1].volume == pytest.approx(head, rel=1e-12)
    assert drawn.volume == pytest.approx(2 * head + math.pi * D ** 2 / 4 * L, rel=1e-12)


def test_head_two_keeps_its_exact_expressions():
    # Head 2 is head 1's base ellipse reparametrised by τ = π/2 − t: its mapped expressions
    # must be the exact ellipse z = L + a_u sin t, r = a_r cos t (no rounded π/2 in them).
    from revolve.jobs.vessel import design_vessel, parse_head

    D, L = 1000.0, 2000.0
    spec = parse_head("ellipsoidal", D)
    design = design_vessel(D, L, spec, spec)
    heads = [s for s in design.inside.segments if isinstance(s, Curve)]
    assert len(heads) == 2
    head2 = next(s for s in heads if s.face == "head 2")
    assert head2.x_expr.atoms(sympy.Float) == set() and head2.y_expr.atoms(sympy.Float) == set()
    assert sympy.simplify(head2.x_expr - (L + D / 4 * sympy.sin(T))) == 0
    assert sympy.simplify(head2.y_expr - D / 2 * sympy.cos(T)) == 0
    head1 = next(s for s in heads if s.face == "head 1")
    assert sympy.simplify(head1.x_expr + D / 4 * sympy.cos(T)) == 0
    assert sympy.simplify(head1.y_expr - D / 2 * sympy.sin(T)) == 0


def test_copies_keep_their_functions_when_the_cache_is_full():
    # Copies carry the compiled functions with them: a profile with more curves than the
    # cache holds must not compile any curve again when its pieces are moved or reversed.
    x, y = T ** 5 - T / 9, sympy.cos(T / 7)   # expressions no other test uses
    base = curve_from_expressions(x, y, 0.0, 2.0)
    compiled_curve.cache_clear()               # as if many other curves had pushed it out
    piece = base.split(0.25)[1].reversed().translated(2.0, 1.0).transformed((0, 1, 1, 0))
    got = np.array(piece.evaluate([0.5, 1.5]))
    assert compiled_curve.cache_info().misses == 0
    rx, ry = reference(x, y, (0, 1, 1, 0), (1.0, 2.0), p=-1, q=0.5 + 2.0)
    assert_close(got, values(rx, ry, [0.5, 1.5]))


#: One expression for each function of the parser's whitelist, with quotients, roots and
#: powers; their derivatives bring in sign(t) (from |t|) and negative powers.
EXPRESSIONS = [
    "sqrt(1 + t^2) / (2 + sin(t))", "cos(t)^3 - tan(t/2)", "asin(t/3) + acos(t/4)",
    "atan(t) * atan2(t, 2)", "1/sqrt(1 + t^2)", "1/t", "sinh(t/2) - cosh(t/3) + tanh(t)",
    "exp(-t) * log(1 + t)",
    "abs(t - 1) + t^(1/3)", "t^-2 + 3/t - 1/sqrt(t)", "pi * exp(t) - e", "(t^2 - 1)^5 / 7",
]


@pytest.mark.parametrize("text", EXPRESSIONS)
def test_compiled_functions_match_sympy_evalf(text):
    from revolve.expr import parse_expression

    y = parse_expression(text, ("t",))
    ts = [0.3, 0.8, 1.25, 1.9]
    got = np.array([f(ts) for f in compiled_curve(parse_expression("t"), y)])
    want = values(T, y.to_sympy(), ts)      # sympy's diff and evalf: the outside reference
    assert_close(got, want, rel=1e-14)


# -- --exact: closed forms from the curve's trees, the same on any machine ------------------

DOMED_LID = Path(__file__).resolve().parents[2] / "profiles" / "domed-lid.toml"


def _exact_of(path, **options):
    from revolve.formats import load_profile
    from revolve.geometry.exact import exact_closed_forms
    from revolve.geometry.measure import measure
    from revolve.geometry.profile import Revolution

    doc = load_profile(path)
    rev = Revolution(doc.profile, doc.axis)
    return exact_closed_forms(doc.profile, rev, measure(rev), Fraction(360), **options)


def test_exact_closed_forms_of_a_curve_profile_match_sympy_integrate():
    # The domed lid: y = 25 - x²/180 from x = 60 to 0 over a 60 × 5 step, about the y axis.
    # Reference: sympy.integrate of the washer/shell integrals written out here (volume
    # 2π ∫ x y dx, section area ∫ y dx, dome surface 2π ∫ x sqrt(1 + y'²) dx).
    x = sympy.Symbol("x", real=True)
    y = 25 - x ** 2 / 180
    volume = 2 * sympy.pi * sympy.integrate(x * y, (x, 0, 60))
    area = sympy.integrate(y, (x, 0, 60))
    dome = 2 * sympy.pi * sympy.integrate(x * sympy.sqrt(1 + sympy.diff(y, x) ** 2), (x, 0, 60))
    out = _exact_of(DOMED_LID)
    parsed = {k: _sympy_of(out[k]) for k in ("volume", "area")}
    assert sympy.simplify(parsed["volume"] - volume) == 0
    assert sympy.simplify(parsed["area"] - area) == 0
    assert sympy.simplify(_sympy_of(out["surface_by_face"]["dome"]) - dome) == 0
    assert "note" not in out
    assert _exact_of(DOMED_LID) == out            # the same forms again


def _sympy_of(text):
    """A closed form printed by --exact, read back by the whitelist parser (never sympify)."""
    from revolve.expr import parse_number

    return parse_number(text).to_sympy()


def test_exact_safety_limit_is_reported_as_such():
    # The wall-clock limit is only a safety: when it is reached the answer says so and names
    # it as machine-dependent, never a silent change of the result.
    from revolve.geometry.exact import NotExact

    with pytest.raises(NotExact, match="safety limit of 0.001 s"):
        _exact_of(DOMED_LID, safety_seconds=0.001)


def test_exact_refuses_large_integrands_before_running_sympy(monkeypatch):
    # Which integrals go to sympy is decided by their size, before it runs: a curve whose
    # integrand is beyond MAX_INTEGRAND_OPS gets a note at once, whatever the machine's load.
    import revolve.geometry.exact as exact

    ran = []
    monkeypatch.setattr(exact, "run_sympy", lambda tasks, seconds: ran.append(tasks) or [])
    monkeypatch.setattr(exact, "MAX_INTEGRAND_OPS", 3)
    with pytest.raises(exact.NotExact, match="exact integration is tried up to 3"):
        _exact_of(DOMED_LID)
    assert ran == []


def test_exact_does_not_send_integrals_outside_the_tried_forms(monkeypatch, tmp_path):
    # y = 2 + x³/100: its length integrand sqrt(1 + 9x⁴/10⁴) has no elementary antiderivative
    # (an elliptic integral, from memory); it is not sent to sympy at all, so the note is the
    # same on any machine. The volume's integrand is a polynomial and needs no worker.
    import revolve.geometry.exact as exact

    path = tmp_path / "cubic.toml"
    path.write_text('units = "mm"\n[axis]\nalong = "x"\n[[loop]]\nstart = [0, 0]\n'
                    'segments = [\n  { line_to = [0, 2] },\n'
                    '  { y = "2 + x^3/100", to_x = 5 },\n  { line_to = [5, 0] },\n'
                    '  { close = true },\n]\n', encoding="utf-8")
    ran = []
    monkeypatch.setattr(exact, "run_sympy", lambda tasks, seconds: ran.append(tasks) or [])
    with pytest.raises(exact.NotExact, match="not of a form tried exactly"):
        _exact_of(path)
    assert ran == []
