"""Gauging calculations: datum, increments, feet-inches text, deadwood, shell temperature, GUM.

Outside references, named beside each check:

* unit definitions: 1 ft = 12 in (international yard and pound agreement, 1959);
* CRC *Standard Mathematical Tables and Formulae* (from memory): cylinder π r² h, circular
  segment A = r² acos((r − d)/r) − (r − d) √(2 r d − d²), sphere, cone;
* the shell temperature correction of API MPMS Chapter 12.1.1 / EI HM1 Part 1,
  CTSh = 1 + 2αΔT + α²ΔT², and its printed factor 1.00086 for a 129 °F mild steel shell on a
  60 °F table (α = 6.2e-6 /°F), both as quoted in a published gauging training handbook,
  read while writing this test (the standard itself not seen);
* JCGM 100:2008 (GUM), 5.1.2 (law of propagation for uncorrelated inputs), 4.3.7
  (rectangular a/√3) and 4.3.9 (triangular a/√6), published;
* JCGM 101:2008 (GUM Supplement 1): a Monte Carlo propagation of the same model, with numpy's
  random generator and a fixed seed as the independent computation.
"""

from __future__ import annotations

import math
from fractions import Fraction

import numpy as np
import pytest
from hypothesis import example, given
from hypothesis import strategies as st

from revolve.errors import MaterialError, RevolveError
from revolve.geometry.profile import Axis, Chain, Loop, Profile
from revolve.inputs import parse_length
from revolve.jobs.gauging import (CALIBRATION_CAUTION, GUM_METHOD, SHELL_FORMULA, SHELL_SOURCE,
                                  RevolvedItem, SpreadItem, Tolerance, combined_uncertainty,
                                  deadwood_at, find_expansion, format_feet_inches,
                                  increment_levels, innage_from_level, innage_from_ullage,
                                  level_from_innage, level_from_ullage, load_expansion,
                                  parse_expansion, per_increment, shell_correction,
                                  shell_correction_factor, shell_temperature,
                                  ullage_from_innage)
from revolve.jobs.levels import liquid_space, table_at_levels as level_table


def one_line_error(exc_info) -> str:
    text = str(exc_info.value)
    assert "\n" not in text and text.strip() == text and text
    return text


def upright_cylinder(R: float, H: float, unit: str = "m"):
    """A vertical cylinder, flat bottom and top, drawn as a chain from the axis round."""
    wall = Chain.from_points([(0, 0), (R, 0), (R, H), (0, H)])
    return liquid_space(Profile(chains=(wall,), unit=unit), Axis.y(), orientation="vertical")


def lying_cylinder(R: float, L: float, unit: str = "m"):
    """A horizontal cylinder with flat ends, axis along x."""
    wall = Chain.from_points([(0, 0), (0, R), (L, R), (L, 0)])
    return liquid_space(Profile(chains=(wall,), unit=unit), Axis.x(), orientation="horizontal")


def segment_area(r: float, d: float) -> float:
    """CRC (from memory): circular segment of a circle of radius r, height d (clipped)."""
    d = min(max(d, 0.0), 2 * r)
    return r * r * math.acos((r - d) / r) - (r - d) * math.sqrt(max(2 * r * d - d * d, 0.0))


# -- gauge datum, innage and ullage ----------------------------------------------------------

@given(H=st.floats(0.5, 40.0), share=st.floats(0.0, 1.0), offset=st.floats(-0.5, 0.5))
@example(H=12.0, share=0.0, offset=0.0)
@example(H=12.0, share=1.0, offset=0.3)
def test_innage_ullage_level_round_trips(H, share, offset):
    ullage = share * H
    innage = innage_from_ullage(H, [ullage])
    # definition of ullage (common practice, no source): reference height minus innage
    assert innage[0] == pytest.approx(H - ullage, abs=1e-12 * H)
    assert ullage_from_innage(H, innage)[0] == pytest.approx(ullage, abs=1e-12 * H)
    level = level_from_innage(innage, offset)
    assert level[0] == pytest.approx(H - ullage + offset, abs=1e-12 * H)
    assert innage_from_level(level, offset)[0] == pytest.approx(innage[0], abs=1e-12 * H)
    assert level_from_ullage(H, [ullage], offset)[0] == pytest.approx(level[0], abs=1e-12 * H)


def test_readings_outside_the_reference_height_are_refused():
    with pytest.raises(RevolveError) as e:
        innage_from_ullage(10.0, [1.0, 10.5])
    assert one_line_error(e) == ("ullage 10.5 m is outside 0 to the reference height 10 m; "
                                 "give ullages between them")
    with pytest.raises(RevolveError, match="innage -0.2 m is outside"):
        ullage_from_innage(10.0, [-0.2])
    with pytest.raises(RevolveError, match="below the datum plate"):
        innage_from_level([0.05], datum_offset=0.1)
    for bad in (0.0, -1.0, math.nan, "ten"):
        with pytest.raises(RevolveError) as e:
            innage_from_ullage(bad, [0.0])
        assert "reference height" in one_line_error(e)
    with pytest.raises(RevolveError, match="not a finite number"):
        innage_from_ullage(10.0, [math.inf])
    # a hair beyond either end is the end itself, not a refusal
    assert innage_from_ullage(10.0, [10.0 * (1 + 1e-14)]).tolist() == [0.0]


# -- increments ----------------------------------------------------------------------------

@given(H=st.floats(0.01, 30.0), step=st.floats(0.0005, 1.0))
@example(H=1.0, step=0.1)          # a whole number of steps that floats make awkward
@example(H=2.0, step=0.003175)     # 1/8 in in metres
@example(H=0.5, step=2.0)          # one step larger than the vessel
@example(H=1.0, step=0.9999999999999999)   # found by hypothesis: no hair-thin last row
def test_increment_levels(H, step):
    lv = increment_levels(H, step)
    assert lv[0] == 0.0 and lv[-1] == H
    gaps = np.diff(lv)
    assert np.all(gaps > 0)
    # every step but the last is the increment; the last is a partial one
    assert np.allclose(gaps[:-1], step, rtol=1e-9, atol=1e-12)
    assert gaps[-1] <= step * (1 + 1e-9)
    assert lv.size == math.ceil(H / step - 1e-9) + 1


def test_decimal_increments_give_decimal_levels():
    assert increment_levels(1.0, 0.1).tolist() == [round(0.1 * k, 1) for k in range(11)]
    assert increment_levels(0.01, 0.001)[9] == 0.009
    assert increment_levels(1.0, 1 / 3).tolist() == [0.0, 1 / 3, 2 / 3, 1.0]


def test_increments_sum_to_the_capacity():
    R, H = 1.25, 3.4
    space = upright_cylinder(R, H)
    lv = increment_levels(space.height, 0.07)
    table = level_table(space, lv)
    inc = per_increment(table.volume)
    assert math.isnan(inc[-1]) and inc.size == lv.size
    total = math.fsum(inc[:-1])
    capacity = math.pi * R * R * H          # CRC (from memory): cylinder π r² h
    assert total == pytest.approx(capacity, rel=4e-16 * lv.size)
    # the partial last row's increment is the partial slice of the cylinder
    assert inc[-2] == pytest.approx(math.pi * R * R * (H - lv[-2]), rel=1e-12)


def test_increments_of_a_lying_cylinder_sum_to_its_capacity():
    R, L = 0.8, 2.5
    space = lying_cylinder(R, L)
    inc = per_increment(level_table(space, increment_levels(space.height, 0.0254)).volume)
    assert math.fsum(inc[:-1]) == pytest.approx(math.pi * R * R * L, rel=1e-12)   # CRC


def test_increment_refusals():
    with pytest.raises(RevolveError) as e:
        increment_levels(10.0, 1e-6)
    assert "make the increment larger" in one_line_error(e)
    for h, s in ((0.0, 0.1), (1.0, 0.0), (1.0, -0.1), (math.inf, 0.1)):
        with pytest.raises(RevolveError, match="must be a positive number"):
            increment_levels(h, s)
    assert per_increment([]).size == 0


# -- feet, inches and fractions ---------------------------------------------------------------

def rounded(inches: float, denominator: int) -> Fraction:
    """Nearest 1/denominator inch, halves away from zero (computed with exact fractions)."""
    x = Fraction(abs(inches)) * denominator
    n = int(x) + (1 if x - int(x) >= Fraction(1, 2) else 0)
    return Fraction(n, denominator) * (1 if inches >= 0 else -1)


@given(inches=st.floats(-5000.0, 5000.0), denominator=st.sampled_from([8, 16, 32, 64]))
@example(inches=11 + 15 / 16 + 1 / 16, denominator=16)
@example(inches=11.99, denominator=64)
@example(inches=-0.001, denominator=8)
@example(inches=1 / 128, denominator=64)     # a half step: rounds up
def test_feet_inches_round_trip(inches, denominator):
    text = format_feet_inches(inches, denominator)
    back = parse_length(text)
    assert back.unit == "in"
    assert Fraction(back.value) == rounded(inches, denominator)
    feet, _, rest = text.lstrip("-").partition("' ")
    whole = int(rest.rstrip('"').split(" ")[0])
    assert 0 <= whole < 12          # 1 ft = 12 in: carried, never 12 inches shown
    assert abs(back.value - inches) <= 0.5 / denominator + 1e-9


def test_feet_inches_examples():
    # 1 ft = 12 in (the 1959 agreement); the fraction in lowest terms
    assert format_feet_inches(40.125) == '3\' 4 1/8"'
    assert format_feet_inches(40.125, 64) == '3\' 4 1/8"'
    assert format_feet_inches(11 + 15 / 16 + 1 / 16, 16) == '1\' 0"'
    assert format_feet_inches(11 + 31 / 32, 16) == '1\' 0"'       # 31/32 rounds up to 1
    assert format_feet_inches(-(12 * 3 + 4.5)) == '-3\' 4 1/2"'
    assert format_feet_inches(0.0) == format_feet_inches(-0.01) == '0\' 0"'
    assert format_feet_inches(3 / 64, 32) == '0\' 0 1/16"'        # 1.5/32 rounds up to 2/32
    assert parse_length(format_feet_inches(0.3 / 0.0254, 64)).metres() == pytest.approx(
        0.3, abs=0.0254 / 128)
    for bad in (3, 10, 128, True):
        with pytest.raises(RevolveError) as e:
            format_feet_inches(1.0, bad)
        assert "of an inch" in one_line_error(e)
    with pytest.raises(RevolveError, match="finite"):
        format_feet_inches(math.nan)


# -- deadwood and fittings ---------------------------------------------------------------------

def test_spread_item_by_hand():
    # 0.3 m³ spread evenly over 1 m to 4 m: 0.1 m³ per metre (arithmetic by hand)
    item = SpreadItem(0.3, 1.0, 4.0, name="ladder")
    got = item.volume_below([0.0, 1.0, 2.0, 3.5, 4.0, 6.0])
    assert got == pytest.approx([0.0, 0.0, 0.1, 0.25, 0.3, 0.3], abs=1e-15)
    sump = SpreadItem(0.05, 0.0, 0.0, name="sump", fitting=True)
    total = deadwood_at([0.0, 2.0, 5.0], [item, sump])
    assert total == pytest.approx([-0.05, 0.1 - 0.05, 0.3 - 0.05], abs=1e-15)


def test_spread_item_refusals():
    with pytest.raises(RevolveError) as e:
        SpreadItem(-0.1, 0.0, 1.0, name="pipe")
    assert one_line_error(e).startswith("item 'pipe': its volume -0.1 m³ is negative")
    with pytest.raises(RevolveError, match="give the lower level first"):
        SpreadItem(0.1, 2.0, 1.0)
    with pytest.raises(RevolveError, match="finite"):
        SpreadItem(0.1, 0.0, math.inf)


def test_revolved_coil_in_an_upright_tank():
    # A coil-like annulus r in [a, b], z in [z0, z1] inside an upright tank; the volume below a
    # level is π (b² − a²) × the wetted height of the ring (CRC, from memory: cylinder π r² h).
    R, H = 1.5, 4.0
    a, b, z0, z1 = 0.9, 1.05, 0.6, 2.2
    tank = upright_cylinder(R, H)
    ring = Profile(loops=(Loop.from_points([(a, z0), (b, z0), (b, z1), (a, z1)]),), unit="m")
    coil = RevolvedItem.from_profile(ring, Axis.y(), tank, name="heating coil")
    levels = np.array([0.0, 0.6, 1.0, 1.7, 2.2, 3.0, 4.0])
    expected = math.pi * (b * b - a * a) * np.clip(levels - z0, 0.0, z1 - z0)
    assert coil.volume_below(levels) == pytest.approx(expected, rel=1e-12, abs=1e-15)
    assert deadwood_at(levels, [coil]) == pytest.approx(expected, rel=1e-12, abs=1e-15)
    liquid = level_table(tank, levels).volume - deadwood_at(levels, [coil])
    assert liquid[-1] == pytest.approx(math.pi * (R * R * H - (b * b - a * a) * (z1 - z0)))


def test_revolved_item_in_another_unit_and_as_a_fitting():
    # the tank in metres, the coil drawn in millimetres: same figures in m and m³
    R, H = 1.5, 4.0
    a, b, z0, z1 = 900.0, 1050.0, 600.0, 2200.0
    tank = upright_cylinder(R, H)
    ring = Profile(loops=(Loop.from_points([(a, z0), (b, z0), (b, z1), (a, z1)]),), unit="mm")
    coil = RevolvedItem.from_profile(ring, Axis.y(), tank, fitting=True)
    assert coil.offset == pytest.approx(0.6, abs=1e-12)
    v = math.pi * (1.05 ** 2 - 0.9 ** 2) * 1.6           # CRC cylinder, from memory
    assert coil.volume == pytest.approx(v, rel=1e-12)
    assert deadwood_at([4.0], [coil])[0] == pytest.approx(-v, rel=1e-12)


def test_revolved_pipe_in_a_lying_cylinder():
    # A pipe (annulus a..b) along the axis of a lying cylinder, from x0 to x1: below a level h
    # from the bottom, its volume is (x1 − x0) × (segment(b, h − (R − b)) − segment(a, h − (R − a)))
    # with the circular segment of CRC (from memory).
    R, L = 1.0, 3.0
    a, b, x0, x1 = 0.25, 0.375, 0.5, 2.5     # dyadic: the levels below are exact in binary
    tank = lying_cylinder(R, L)
    pipe = Profile(loops=(Loop.from_points([(x0, a), (x1, a), (x1, b), (x0, b)]),), unit="m")
    item = RevolvedItem.from_profile(pipe, Axis.x(), tank)
    assert item.offset == pytest.approx(R - b, abs=1e-12)
    # 0.625: the pipe's bottom; 0.75 / 1.25: the bore's bottom and top; 1.375: the pipe's top
    levels = [0.0, 0.625, 0.7, 0.75, 1.0, 1.25, 1.3, 1.375, 2.0]
    expected = [(x1 - x0) * (segment_area(b, h - (R - b)) - segment_area(a, h - (R - a)))
                for h in levels]
    assert item.volume_below(levels) == pytest.approx(expected, rel=1e-9, abs=1e-12)


# -- shell temperature ------------------------------------------------------------------------

def test_shell_factor_against_the_published_formula_and_table():
    # API MPMS 12.1.1 / EI HM1 Part 1, as quoted in a gauging training handbook: mild steel,
    # α = 6.2e-6 /°F, table at 60 °F, shell at 129 °F -> 1.00086 (printed to 5 decimals)
    assert round(shell_correction_factor(129.0, 60.0, 6.2e-6), 5) == 1.00086
    # the same handbook's worked shell temperature: (7 × 135 °F + 80 °F) / 8 = 128.1 -> 128 °F
    assert round(shell_temperature(135.0, 80.0)) == 128
    alpha, dT = 11.16e-6, np.array([-40.0, -5.0, 0.0, 20.0, 150.0])
    expected = 1 + 2 * alpha * dT + alpha ** 2 * dT ** 2          # the published formula
    assert shell_correction_factor(15.0 + dT, 15.0, alpha) == pytest.approx(expected, rel=1e-15)
    assert shell_correction_factor(15.0, 15.0, alpha) == 1.0


def test_expansion_table_rows_carry_sources():
    rows = load_expansion()
    assert {r.key for r in rows} == {"carbon_steel", "stainless_304", "stainless_316", "aluminium"}
    for r in rows:
        assert r.source.strip() and r.note.strip()
    # the API's US customary figures converted by the definition of the degree: 1 K = 1.8 °F
    assert find_expansion("carbon steel").alpha == pytest.approx(6.2e-6 * 1.8, rel=1e-12)
    assert find_expansion("304").alpha == pytest.approx(9.6e-6 * 1.8, rel=1e-12)
    assert find_expansion("316").alpha == pytest.approx(8.83e-6 * 1.8, rel=1e-3)
    # CHECKS.md: carbon steel about 12e-6 /K, austenitic stainless about 17e-6 /K
    # (common practice, no source); aluminium 23.1e-6 /K (CRC Handbook, from memory)
    assert find_expansion("mild steel").alpha == pytest.approx(12e-6, rel=0.1)
    assert find_expansion("stainless 304").alpha == pytest.approx(17e-6, rel=0.1)
    assert find_expansion("stainless-316").alpha == pytest.approx(17e-6, rel=0.1)
    assert find_expansion("aluminum").alpha == pytest.approx(23.1e-6, rel=1e-9)


def test_shell_correction_says_which_formula_and_source():
    c = shell_correction(40.0, 15.0, "carbon steel")
    text = c.statement()
    assert "\n" not in text
    assert SHELL_FORMULA in text and SHELL_SOURCE in text and c.alpha_source in text
    assert "API MPMS Chapter 12.1.1" in SHELL_SOURCE
    assert c.factor == pytest.approx((1 + 11.16e-6 * 25.0) ** 2, rel=1e-15)
    assert "custody transfer" in CALIBRATION_CAUTION and "accredited" in CALIBRATION_CAUTION


def test_shell_correction_refusals():
    with pytest.raises(MaterialError) as e:
        shell_correction(40.0, 15.0, "unobtainium")
    assert "choose from carbon_steel" in one_line_error(e)
    with pytest.raises(MaterialError, match="between 0 and 1e-3"):
        shell_correction(40.0, 15.0, 0.5)
    with pytest.raises(RevolveError, match="shell temperature must be a finite"):
        shell_correction(math.nan, 15.0, "carbon steel")
    with pytest.raises(MaterialError) as e:
        parse_expansion('[[material]]\nkey = "x"\nname = "X"\naliases = []\n'
                        'alpha_per_kelvin = 1e-5\nsource = ""\nnote = ""', file="extra.toml")
    assert one_line_error(e) == "extra.toml: material 1: every row needs its source"
    with pytest.raises(MaterialError, match="not valid TOML"):
        parse_expansion("[[material", file="extra.toml")


# -- uncertainty (GUM) -----------------------------------------------------------------------

def cylinder(D, L):
    return math.pi * D ** 2 * L / 4


def test_tolerances_to_standard_uncertainties():
    # GUM 4.3.7 (rectangular, a/√3) and 4.3.9 (triangular, a/√6); a normal expanded
    # uncertainty U with coverage factor k gives U/k (GUM 6.2.1)
    assert Tolerance(0.006).standard == pytest.approx(0.006 / math.sqrt(3), rel=1e-15)
    assert Tolerance(0.006, "triangular").standard == pytest.approx(0.006 / math.sqrt(6))
    assert Tolerance(0.006, "normal", 3.0).standard == pytest.approx(0.002)
    with pytest.raises(RevolveError, match="not negative"):
        Tolerance(-1.0)


def test_cylinder_against_the_analytic_gum_result():
    D, L, uD, aL = 2.4, 7.5, 0.002, 0.015
    r = combined_uncertainty(cylinder, {"D": D, "L": L}, {"D": uD, "L": Tolerance(aL)})
    # GUM 5.1.2 with the derivatives by hand: ∂V/∂D = π D L / 2, ∂V/∂L = π D² / 4
    cD, cL = math.pi * D * L / 2, math.pi * D ** 2 / 4
    uL = aL / math.sqrt(3)
    assert r.sensitivities["D"][0] == pytest.approx(cD, rel=1e-8)
    assert r.sensitivities["L"][0] == pytest.approx(cL, rel=1e-8)
    assert r.standard_uncertainty[0] == pytest.approx(math.hypot(cD * uD, cL * uL), rel=1e-8)
    assert r.value[0] == pytest.approx(cylinder(D, L), rel=1e-15)
    first = "D" if cD * uD > cL * uL else "L"
    assert r.largest[0][0] == first
    assert sum(r.shares().values()) == pytest.approx(1.0)
    assert "JCGM 100:2008" in r.method and r.method == GUM_METHOD


def test_cylinder_against_monte_carlo():
    # JCGM 101:2008: propagate the distributions themselves; D normal, L rectangular
    D, L, uD, aL = 2.4, 7.5, 0.002, 0.015
    gum = combined_uncertainty(cylinder, {"D": D, "L": L}, {"D": uD, "L": Tolerance(aL)})
    rng = np.random.default_rng(20081)
    n = 200_000
    d = rng.normal(D, uD, n)
    length = rng.uniform(L - aL, L + aL, n)
    mc = np.std(cylinder(d, length), ddof=1)
    # 2·10⁵ draws: the standard deviation's own sampling error is about 0.2 %
    assert gum.standard_uncertainty[0] == pytest.approx(mc, rel=0.02)
    assert np.mean(cylinder(d, length)) == pytest.approx(gum.value[0], rel=1e-4)


def vessel_model(levels):
    """Capacity and volumes at ``levels`` of an upright vessel built by revolve.jobs.vessel:
    hemispherical bottom, conical top of a given depth (metres)."""
    from revolve.jobs.vessel import HeadSpec, design_vessel, sketch_profile

    def model(D, L, depth):
        angle = math.degrees(math.atan2(D / 2, depth))     # half-angle from the axis
        design = design_vessel(D, L, HeadSpec("hemispherical"),
                               HeadSpec("conical", angle=angle, knuckle=0.0), unit="m")
        profile, axis = sketch_profile(design, "vertical")
        space = liquid_space(profile, axis, orientation="vertical")
        return np.concatenate([[space.capacity], level_table(space, levels).volume])
    return model


def test_vessel_capacity_and_rows_against_the_analytic_gum_result():
    D, L, depth = 2.0, 3.0, 0.6
    levels = np.array([1.5, 2.5, 3.8])              # all within the shell (1 m to 4 m)
    values = {"D": D, "L": L, "depth": depth}
    tolerances = {"D": Tolerance(0.004), "L": Tolerance(0.010), "depth": Tolerance(0.020)}
    r = combined_uncertainty(vessel_model(levels), values, tolerances)
    R = D / 2
    # CRC (from memory): hemisphere π D³/12, cylinder π D² L/4, cone π R² h/3
    capacity = math.pi * D ** 3 / 12 + math.pi * D ** 2 * L / 4 + math.pi * R * R * depth / 3
    rows = math.pi * D ** 3 / 12 + math.pi * D ** 2 / 4 * (levels - R)
    assert r.value == pytest.approx(np.concatenate([[capacity], rows]), rel=1e-12)
    # derivatives by hand
    c_D = np.concatenate([[math.pi * D ** 2 / 4 + math.pi * D * L / 2 + math.pi * D * depth / 6],
                          math.pi * D ** 2 / 4 + math.pi * D / 2 * (levels - R)
                          - math.pi * D ** 2 / 8])
    c_L = np.concatenate([[math.pi * D ** 2 / 4], np.zeros(levels.size)])
    c_h = np.concatenate([[math.pi * R * R / 3], np.zeros(levels.size)])
    assert r.sensitivities["D"] == pytest.approx(c_D, rel=1e-7)
    assert r.sensitivities["L"] == pytest.approx(c_L, rel=1e-7, abs=1e-6)
    assert r.sensitivities["depth"] == pytest.approx(c_h, rel=1e-7, abs=1e-6)
    u = {k: t.standard for k, t in tolerances.items()}
    expected = np.sqrt((c_D * u["D"]) ** 2 + (c_L * u["L"]) ** 2 + (c_h * u["depth"]) ** 2)
    assert r.standard_uncertainty == pytest.approx(expected, rel=1e-6)
    # the ranking of the contributors, from the same derivatives by hand
    analytic = sorted(("D", "L", "depth"), key=lambda k: -abs({"D": c_D, "L": c_L,
                                                              "depth": c_h}[k][0]) * u[k])
    assert list(r.largest[0]) == analytic
    assert r.largest[1] == ("D",)            # a row in the shell depends on D alone
    words = r.describe(0)
    assert words.startswith(f"u = {expected[0]:.4g}; largest contributors: {analytic[0]} (")
    assert r.describe(1).endswith("D (100 % of the variance)")


def test_uncertainty_refusals():
    with pytest.raises(RevolveError) as e:
        combined_uncertainty(cylinder, {"D": 1.0, "L": 1.0}, {"T": 0.1})
    assert "not an input of the model" in one_line_error(e)
    with pytest.raises(RevolveError, match="is negative"):
        combined_uncertainty(cylinder, {"D": 1.0, "L": 1.0}, {"D": -0.1})
    with pytest.raises(RevolveError, match="not a list of finite numbers"):
        combined_uncertainty(lambda x: math.nan * x, {"x": 0.0}, {})
    with pytest.raises(RevolveError) as e:
        combined_uncertainty(vessel_model(np.array([1.0])), {"D": 2.0, "L": 3.0, "depth": 1e-9},
                             {"depth": 0.01})
    assert one_line_error(e).startswith("the model refuses depth = -")
    with pytest.raises(RevolveError, match="different number of outputs"):
        combined_uncertainty(lambda x: np.ones(3 if x > 1 else 2), {"x": 1.0}, {"x": 0.1})
    with pytest.raises(RevolveError, match="relative step"):
        combined_uncertainty(cylinder, {"D": 1.0, "L": 1.0}, {}, relative_step=0.0)
    # an input at zero with no uncertainty contributes nothing and is not differentiated
    r = combined_uncertainty(lambda a, b: a + b, {"a": 0.0, "b": 1.0}, {"a": 0.0, "b": 0.5})
    assert r.largest == (("b",),) and r.standard_uncertainty[0] == pytest.approx(0.5)
