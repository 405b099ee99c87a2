"""Turning operations: each time against the trade formula worked in trade units, or scipy.

Sources beside each check: the turning formulas are "common practice, no
source" (CHECKS.md, Turning); the drill point length is geometry; unit
factors are exact by definition (1 in = 25.4 mm, 1 ft = 12 in, 1959
agreement); scipy.integrate.quad is the reference library for the radial
passes. Cutting data in the tests are inputs, not checks.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import example, given, strategies as st

from revolve.errors import FormatError, RevolveError
from revolve.jobs import operations as ops
from revolve.jobs.operations import (Features, Grooves, OperationData, OuterStep, Rules,
                                     drill_point_length, drill_time, equal_passes,
                                     features_from_profile, load_rules, operation_data_for,
                                     plan_operations, price_batch, quantity_started,
                                     radial_pass_time, warnings)

STEEL = operation_data_for("steel")


def by_name(plan):
    return {op.name: op for op in plan.operations}


def rpm(vc_m_min, d_mm):
    """n = 1000 vc / (π D), rev/min (common practice, no source)."""
    return 1000.0 * vc_m_min / (math.pi * d_mm)


# ---------------------------------------------------------------- drilling

def test_point_length_of_118_degree_drill_is_030_d():
    # geometry: D / (2 tan 59°) ≈ 0.30 D (CHECKS.md, second round)
    assert drill_point_length(0.02) / 0.02 == pytest.approx(1 / (2 * math.tan(math.radians(59))))
    assert drill_point_length(0.02) / 0.02 == pytest.approx(0.30, abs=0.001)


@pytest.mark.parametrize("d_mm, depth_mm, vc, f", [(10, 30, 25, 0.15), (6, 12, 12, 0.1),
                                                    (40, 80, 80, 0.2)])
def test_drill_time_in_trade_units(d_mm, depth_mm, vc, f):
    # t = (depth + point length) / (f n), n = 1000 vc / (π D): common practice, no source
    point = d_mm / (2 * math.tan(math.radians(59)))
    expected_min = (depth_mm + point) / (f * rpm(vc, d_mm))
    got = drill_time(depth_mm / 1000, d_mm / 1000, OperationData.from_metric(vc, f))
    assert got / 60 == pytest.approx(expected_min, rel=1e-12)


def test_drill_time_capped_by_the_speed_limit():
    # ⌀3 mm at 80 m/min wants 8488 rev/min; a 3000 rev/min machine runs at 3000
    data = OperationData.from_metric(80, 0.05)
    got = drill_time(0.01, 0.003, data, speed_limit=3000 / 60)
    expected_min = (10 + 1.5 / math.tan(math.radians(59))) / (0.05 * 3000)
    assert got / 60 == pytest.approx(expected_min, rel=1e-12)


def test_inch_shop_drill_time_with_sfm_and_ipr():
    # An inch shop's own formula: rpm = 12 sfm / (π D in), t = (depth + point) / (ipr · rpm)
    # (common practice, no source); the data are entered as sfm and in/rev.
    sfm, ipr, d_in, depth_in = 90.0, 0.006, 0.5, 1.25
    data = OperationData.from_inch(sfm, ipr)
    n = 12 * sfm / (math.pi * d_in)
    point = (d_in / 2) / math.tan(math.radians(59))
    expected_min = (depth_in + point) / (ipr * n)
    got = drill_time(depth_in * 0.0254, d_in * 0.0254, data)
    assert got / 60 == pytest.approx(expected_min, rel=1e-12)
    assert data.trade_units("inch") == (90.0, 0.006, None)


# ---------------------------------------------------------------- radial passes

@pytest.mark.parametrize("limit_rpm", [None, 800.0, 3000.0, 20000.0])
@pytest.mark.parametrize("outer, inner", [(0.025, 0.0), (0.025, 0.008), (0.004, 0.0)])
def test_radial_pass_against_scipy_quad(outer, inner, limit_rpm):
    # reference library: scipy.integrate.quad of dr / (f n(r)), n = min(vc/(2πr), n_max)
    from scipy.integrate import quad

    vc, f = 200 / 60, 0.00025
    limit = None if limit_rpm is None else limit_rpm / 60

    def dt(r):
        n = vc / (2 * math.pi * r) if r > 0 else math.inf
        return 1 / (f * (n if limit is None else min(n, limit)))

    points = [] if limit is None else [vc / (2 * math.pi * limit)]
    points = [p for p in points if inner < p < outer]
    expected, _ = quad(dt, inner, outer, points=points or None, epsabs=1e-13, epsrel=1e-12)
    assert radial_pass_time(outer, inner, vc, f, limit) == pytest.approx(expected, rel=1e-9)


def test_facing_without_limit_is_pi_r_squared_over_vc_f():
    # t = π R² / (vc f) in trade units: mm² / (mm/min · mm/rev): common practice, no source
    plan = plan_operations(Features((OuterStep(0.030, 0.02),)), 0.032, STEEL)
    face = by_name(plan)["face"]
    assert face.time / 60 == pytest.approx(math.pi * 16 ** 2 / (200_000 * 0.25), rel=1e-12)


# ---------------------------------------------------------------- turning passes

def test_rough_and_finish_turn_by_hand():
    # ⌀40 stock to ⌀30 × 50 mm, steel: finish ap 0.5 → rough to ⌀31; radial 4.5 mm at ap 3 →
    # 2 passes of 2.25 mm, cutting at ⌀40 and ⌀35.5; finish one pass at ⌀31.
    # t = L / (f n), n = 1000 vc / (π D): common practice, no source
    plan = plan_operations(Features((OuterStep(0.030, 0.050),)), 0.040, STEEL)
    got = by_name(plan)
    rough_min = sum(50 / (0.3 * rpm(200, d)) for d in (40, 35.5))
    finish_min = 50 / (0.12 * rpm(260, 31))
    assert got["rough turn"].passes == 2
    assert got["rough turn"].time / 60 == pytest.approx(rough_min, rel=1e-12)
    assert got["finish turn"].passes == 1
    assert got["finish turn"].time / 60 == pytest.approx(finish_min, rel=1e-12)
    assert "L / (f n)" in got["rough turn"].formula


def test_stock_at_size_needs_no_turning():
    plan = plan_operations(Features((OuterStep(0.032, 0.05),)), 0.032, STEEL)
    assert [op.name for op in plan.operations] == ["face", "part off"]


def test_two_steps_each_turned_over_its_own_length():
    # ⌀30 × 20 then ⌀20 × 10 from ⌀32; each step from the stock diameter (common practice)
    plan = plan_operations(Features((OuterStep(0.030, 0.02), OuterStep(0.020, 0.01))), 0.032,
                           STEEL)
    rough = by_name(plan)["rough turn"]
    # step 1: 32 → 31, 0.5 mm radial, 1 pass at ⌀32; step 2: 32 → 21, 5.5 mm, 2 passes at ⌀32, ⌀26.5
    expected = 20 / (0.3 * rpm(200, 32)) + sum(10 / (0.3 * rpm(200, d)) for d in (32, 26.5))
    assert rough.passes == 3
    assert rough.time / 60 == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize("stock, ap, passes", [(0.0035, 0.003, 2), (0.003, 0.003, 1),
                                               (0.0, 0.003, 0), (0.0030000000001, 0.003, 1)])
def test_equal_passes(stock, ap, passes):
    # ceil(stock / ap), an exact fit is one pass: common practice, no source
    assert equal_passes(stock, ap) == passes


# ---------------------------------------------------------------- the bore rule

def test_bore_below_the_smallest_boring_bar_is_drilled_to_size():
    # rule (common practice, no source, in data/operations.toml): below ⌀8 mm, drill to size
    part = Features((OuterStep(0.03, 0.04),), bore_diameter=0.006, bore_depth=0.015)
    got = by_name(plan_operations(part, 0.032, STEEL))
    assert "bore" not in got
    assert "⌀6 mm" in got["drill"].detail and "drilled to size" in got["drill"].detail
    assert got["drill"].time / 60 == pytest.approx(
        (15 + 3 / math.tan(math.radians(59))) / (0.15 * rpm(25, 6)), rel=1e-12)


def test_bore_between_is_drilled_under_size_then_bored():
    # ⌀20 bore: drill ⌀18 (2 mm bore stock on the diameter), bore 18 → 20: 1 mm radial, ap 1.5 → 1 pass
    part = Features((OuterStep(0.04, 0.03),), bore_diameter=0.020, bore_depth=0.03)
    got = by_name(plan_operations(part, 0.042, STEEL))
    assert "⌀18 mm" in got["drill"].detail
    assert got["bore"].passes == 1
    assert got["bore"].time / 60 == pytest.approx(30 / (0.15 * rpm(180, 20)), rel=1e-12)


def test_bore_above_the_largest_drill_is_drilled_to_it_then_bored():
    # ⌀60 bore: drill ⌀40 (largest), bore 40 → 60: 10 mm radial at ap 1.5 → 7 passes
    part = Features((OuterStep(0.08, 0.05),), bore_diameter=0.060, bore_depth=0.05)
    got = by_name(plan_operations(part, 0.082, STEEL))
    assert "⌀40 mm" in got["drill"].detail and "largest drill" in got["drill"].detail
    assert got["bore"].passes == 7
    step = 20 / 7
    expected = sum(50 / (0.15 * rpm(180, 40 + step * (k + 1))) for k in range(7))
    assert got["bore"].time / 60 == pytest.approx(expected, rel=1e-12)


def test_operations_in_order_with_grooves_and_part_off_to_the_through_bore():
    part = Features((OuterStep(0.04, 0.03),), bore_diameter=0.02, bore_depth=0.03,
                    grooves=Grooves(2, 0.004, 0.002, 0.04))
    plan = plan_operations(part, 0.042, STEEL)
    assert [op.name for op in plan.operations] == [
        "face", "rough turn", "finish turn", "centre drill", "drill", "bore", "groove", "part off"]
    got = by_name(plan)
    # grooves: 2 × ceil(4/3) = 4 plunges of π (20² − 18²) / (vc f) each (common practice, no source)
    assert got["groove"].passes == 4
    assert got["groove"].time / 60 == pytest.approx(4 * math.pi * (20 ** 2 - 18 ** 2)
                                                    / (120_000 * 0.08), rel=1e-12)
    # part off from ⌀40 to the ⌀20 through bore
    assert got["part off"].time / 60 == pytest.approx(math.pi * (20 ** 2 - 10 ** 2)
                                                      / (100_000 * 0.06), rel=1e-12)
    assert plan.cycle_time == pytest.approx(sum(op.time for op in plan.operations))
    assert all(op.formula for op in plan.operations)
    assert got["drill"].data == STEEL["drill"] and got["bore"].data == STEEL["bore"]


def test_blind_bore_parts_off_to_the_centre():
    part = Features((OuterStep(0.04, 0.03),), bore_diameter=0.02, bore_depth=0.01)
    got = by_name(plan_operations(part, 0.042, STEEL))
    assert got["part off"].time / 60 == pytest.approx(math.pi * 20 ** 2 / (100_000 * 0.06))


# ---------------------------------------------------------------- warnings

@pytest.mark.parametrize("length_mm, expect", [(80, None), (80.1, "tailstock"),
                                               (200, "tailstock"), (200.1, "steady rest")])
def test_slender_part_rule_of_thumb(length_mm, expect):
    # L/D above 4 → tailstock, above 10 → steady rest (rule of thumb, common practice, no source)
    w = warnings(Features((OuterStep(0.02, length_mm / 1000),)), 0.022, STEEL)
    if expect is None:
        assert w == ()
    else:
        assert expect in w[0] and "common practice" in w[0] and len(w) == 1


def test_overhang_is_the_unsupported_length():
    w = warnings(Features((OuterStep(0.02, 0.03),)), 0.022, STEEL, overhang=0.25)
    assert "steady rest" in w[0]


def test_implausible_depth_and_feed_for_a_small_stock():
    # ⌀5 stock: roughing ap 3 mm > 5/4; feed 0.3 > 5/50 = 0.1 mm (rule of thumb, common practice)
    w = warnings(Features((OuterStep(0.004, 0.01),)), 0.005, STEEL)
    assert any("rough turn: the depth of cut 3 mm" in x for x in w)
    assert any("rough turn: the feed 0.3 mm/rev" in x for x in w)
    assert not any("implausible" in x for x in warnings(Features((OuterStep(0.04, 0.05),)),
                                                        0.042, STEEL))


def test_feed_above_depth_is_implausible():
    data = dict(STEEL, **{"finish turn": OperationData.from_metric(260, 0.8, 0.5)})
    w = warnings(Features((OuterStep(0.05, 0.05),)), 0.052, data)
    assert any("finish turn: the feed 0.8 mm/rev is more than the depth of cut 0.5 mm" in x
               for x in w)


# ---------------------------------------------------------------- features from a profile

def test_features_from_a_measured_bush_match_its_drawing():
    # the drawing: ⌀50 × 40 mm with a ⌀22 through bore
    from revolve.geometry.checks import prepare
    from revolve.geometry.profile import Axis, Loop, Profile

    bush = Profile(loops=(Loop.from_points([(0, 11), (40, 11), (40, 25), (0, 25)]),))
    f = features_from_profile(prepare(bush, Axis.x()), length_factor=0.001)
    (step,) = f.outer_steps
    assert (step.diameter, step.length) == (pytest.approx(0.05), pytest.approx(0.04))
    assert f.bore_diameter == pytest.approx(0.022) and f.through_bore


# ---------------------------------------------------------------- batch price

def test_batch_price_by_hand():
    # worked by hand (common practice, no source): 50 parts, 3 % scrap → 52 started (51.5 up);
    # 10 per bar → 6 bars at 42; 90 s at 75/h plus 1.5 h set-up: 75 × (1.5 + 52 × 90/3600) = 210;
    # material 252; cost 462; overhead 15 % = 69.3; price 531.3 / (1 − 0.1) = 590.333…
    p = price_batch(90, 50, 75, setup_time=5400, scrap_percent=3, parts_per_bar=10, bar_price=42,
                    overhead_percent=15, margin_percent=10)
    assert (p.started, p.bars) == (52, 6)
    assert p.machine_cost == pytest.approx(210) and p.material_cost == pytest.approx(252)
    assert p.cost == pytest.approx(462) and p.overhead == pytest.approx(69.3)
    assert p.price == pytest.approx(531.3 / 0.9) and p.price_per_part == pytest.approx(531.3 / 45)
    assert p.notes == ()


def test_scrap_raises_the_bars_needed():
    assert price_batch(60, 100, 60, parts_per_bar=10).bars == 10
    assert price_batch(60, 100, 60, parts_per_bar=10, scrap_percent=1).bars == 11


@given(st.integers(0, 10_000), st.floats(0, 50, allow_nan=False))
@example(100, 3.0)
@example(7, 10.0)
def test_quantity_started_is_the_least_that_covers_the_scrap(q, scrap):
    # ceil(q (1 + s/100)): the least whole number not below it (common practice, no source)
    need = q * (1 + scrap / 100)
    n = quantity_started(q, scrap)
    assert n >= need * (1 - 1e-9) and n - 1 < need


def test_zero_setup_and_missing_material_are_said():
    notes = price_batch(30, 10, 60).notes
    assert any("set-up time is zero" in n for n in notes)
    assert any("no material price" in n for n in notes)


# ---------------------------------------------------------------- data and bad input

def test_every_row_of_the_data_file_has_a_source():
    table = ops._table()
    for group in ops.GROUPS:
        assert table[group]["source"].strip()
        assert set(operation_data_for(group)) == set(ops.OPERATIONS)
    rules = load_rules()
    assert set(rules.sources) == set(ops._RULE_KEYS)
    assert all(s.strip() for s in rules.sources.values())
    assert "common practice" in rules.sources["tailstock_ratio"]


def test_a_broken_data_file_is_named(monkeypatch):
    bad = dict(ops._table(), rules={"largest_drill": {"value": 40, "unit": "mm"}})
    monkeypatch.setattr(ops, "_table", lambda: bad)
    with pytest.raises(FormatError) as err:
        load_rules()
    assert str(err.value).startswith("operations.toml: rules.min_boring_bar_diameter:")
    assert "\n" not in str(err.value)


@pytest.mark.parametrize("make, text", [
    (lambda: Features((OuterStep(0.02, 0.01),), bore_diameter=0.01),
     "bore: give both the bore diameter and its depth, or neither"),
    (lambda: Features((OuterStep(0.02, 0.01),), bore_diameter=0.01, bore_depth=0.02),
     "bore depth: the bore is deeper than the part is long"),
    (lambda: Grooves(1, 0.003, 0.011, 0.02), "groove depth: the groove is deeper"),
    (lambda: OuterStep(-0.01, 0.01), "outer step diameter: must be a positive number"),
    (lambda: OperationData.from_inch(math.nan, 0.01), "cutting speed vc: must be a positive"),
    (lambda: price_batch(10, 0, 60), "quantity: must be a whole number of 1 or more"),
    (lambda: price_batch(10, 5, 60, bar_price=3, material_per_part=2),
     "material: give a bar price or a material price per part, not both"),
    (lambda: plan_operations(Features((OuterStep(0.02, 0.01),)), 0.022, {}),
     "cutting data: no cutting data for face"),
    (lambda: plan_operations(Features((OuterStep(0.02, 0.01),)), 0.022, STEEL,
                             speed_limit=0), "speed limit: must be a positive number"),
    (lambda: Rules(bore_stock=0.01), "rules: the bore stock must be smaller"),
])
def test_bad_input_one_line(make, text):
    with pytest.raises(RevolveError) as err:
        make()
    assert str(err.value).startswith(text)
    assert "\n" not in str(err.value)


def test_facing_allowance_takes_more_passes():
    # 5 mm faced off at ap 2 → ceil(5/2) = 3 passes of π R² / (vc f) (common practice, no source)
    plan = plan_operations(Features((OuterStep(0.03, 0.02),)), 0.032, STEEL, facing_allowance=0.005)
    face = by_name(plan)["face"]
    assert face.passes == 3
    assert face.time / 60 == pytest.approx(3 * math.pi * 16 ** 2 / (200_000 * 0.25), rel=1e-12)


@pytest.mark.parametrize("depth_mm, warned", [(30, False), (30.1, True)])
def test_deep_hole_warning(depth_mm, warned):
    # a hole deeper than 5 diameters: peck drilling (rule of thumb, common practice, no source);
    # ⌀6 is drilled to size (below the smallest boring bar)
    part = Features((OuterStep(0.03, 0.06),), bore_diameter=0.006, bore_depth=depth_mm / 1000)
    w = plan_operations(part, 0.032, STEEL).warnings
    assert any("peck drill" in x for x in w) == warned


@pytest.mark.parametrize("features, place", [
    (Features((OuterStep(0.02, 0.01),), part_off_diameter=0.03), "part-off diameter"),
    (Features((OuterStep(0.02, 0.01),), grooves=Grooves(1, 0.002, 0.001, 0.03)),
     "groove diameter"),
])
def test_cuts_outside_the_stock_are_refused(features, place):
    with pytest.raises(RevolveError) as err:
        plan_operations(features, 0.022, STEEL)
    assert str(err.value).startswith(f"{place}: the ") and "outside the stock" in str(err.value)


def test_a_typo_in_depth_of_cut_is_bounded():
    data = dict(STEEL, **{"rough turn": OperationData.from_metric(200, 0.3, 0.000001)})
    with pytest.raises(RevolveError, match="passes is more than"):
        plan_operations(Features((OuterStep(0.02, 0.01),)), 0.05, data)


def test_cautions_cover_the_turning_rules():
    text = " ".join(ops.CAUTIONS)
    for word in ("estimates", "tool supplier", "Guard rotating", "speed limit"):
        assert word in text


def test_stock_from_the_shops_list_and_its_price():
    # the smallest covering bar wins, a tie goes to the first row; the price comes from the list:
    # 55 mm of ⌀35 at 8.40 a metre = 0.462 (by hand)
    from revolve.formats.stock_list import parse_stock_list
    from revolve.jobs.operations import choose_from_stock

    rack = parse_stock_list("shape,size,grade,price,length\n"
                            "round,35 mm,S355,8.40 EUR/m,3 m\n"
                            "round,35 mm,C45,9.10 EUR/m,3 m\n"
                            "round,30 mm,S355,7.00 EUR/m,3 m\n", file="rack.csv")
    bar = choose_from_stock(rack, 0.032)
    assert (bar.grade, bar.line) == ("S355", 2)
    assert choose_from_stock(rack, 0.032, grade="c45").line == 3
    assert bar.price_for(length=0.055, mass=0.0) == pytest.approx(0.462)
    with pytest.raises(RevolveError, match="nothing on the stock list covers ⌀36 mm in S355"):
        choose_from_stock(rack, 0.036, grade="S355")


# -- tube stock and inch shops (issue 14) ----------------------------------------------------

def test_tube_stock_is_bored_from_its_own_bore_not_drilled():
    part = Features((OuterStep(0.036, 0.02),), bore_diameter=0.028, bore_depth=0.02)
    plan = plan_operations(part, 0.040, STEEL, stock_bore=0.024)
    ops_ = by_name(plan)
    assert "drill" not in ops_ and "centre drill" not in ops_
    # bore 24 → 28 mm, ap 1.5: ceil(2 / 1.5) = 2 passes of 1 mm, cut at ⌀26 then ⌀28;
    # t = Σ L / (f n), n = vc / (π D), vc 180 m/min, f 0.15 mm/rev (common practice, no source)
    minutes = sum(20 / (0.15 * 180e3 / (math.pi * d)) for d in (26, 28))
    assert ops_["bore"].passes == 2
    assert abs(ops_["bore"].time / 60 - minutes) / minutes < 1e-12
    # facing the tube end ⌀40 → ⌀24 at constant vc: π (R² − r²) / (vc f), mm and mm/min
    face = math.pi * (20 ** 2 - 12 ** 2) / (200e3 * 0.25)
    assert abs(ops_["face"].time / 60 - face) / face < 1e-12
    with pytest.raises(RevolveError, match="stock bore"):
        plan_operations(Features((OuterStep(0.036, 0.02),)), 0.040, STEEL, stock_bore=0.024)


def test_inch_shop_data_are_round_sfm_and_inch_per_rev():
    inch = ops.as_shop_writes(STEEL, "inch")
    for op, d in inch.items():
        sfm, ipr, doc = d.trade_units("inch")
        step = 5 if sfm < 200 else 25
        assert sfm == step * round(sfm / step), op
        assert abs(ipr / 0.0005 - round(ipr / 0.0005)) < 1e-9, op
        # within half a step of the metric row (1 ft = 0.3048 m, 1 in = 25.4 mm, 1959)
        vc, f, _ = STEEL[op].trade_units("metric")
        assert abs(sfm - vc / 0.3048) <= step / 2 + 1e-9, op
        assert abs(ipr - f / 25.4) <= 0.00025 + 1e-12, op
    assert ops.as_shop_writes(STEEL, "metric") == STEEL


def test_details_and_warnings_in_inches_for_an_inch_shop():
    plan = plan_operations(Features((OuterStep(0.0254, 0.127),)), 0.0254 * 1.125, STEEL,
                           unit="in")
    assert by_name(plan)["face"].detail == "⌀1.125 in to the centre"
    assert plan.warnings[0].startswith("length over diameter 5 (5 in over 1 in)")
