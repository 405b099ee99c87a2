"""Turning job: envelope, stock, removal, bars, times and cost against hand-worked figures.

Each check names its source beside it. The trade formulas come from CHECKS.md
"Turning" (common practice, no source); solids from CRC *Standard
Mathematical Tables* (from memory); independent figures from sympy
(``sympy.integrate`` disk integrals) and shapely (polygon bounds).
The profiles used are invented; they are inputs, never check values.
"""

from __future__ import annotations

import math
from dataclasses import replace
from functools import lru_cache
from pathlib import Path

import pytest
import sympy

from revolve.errors import FormatError, MaterialError, RevolveError
from revolve.formats import load_profile
from revolve.geometry.checks import prepare
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Loop, Profile, Revolution
from revolve.geometry.segments import Line, arc_from_centre
from revolve.jobs import turning as tu
from revolve.jobs import turning_data as td

ROOT = Path(__file__).resolve().parents[2]
SHAFT = ROOT / "profiles" / "turned-stepped-shaft.toml"
SLEEVE = ROOT / "profiles" / "turned-sleeve-inch.toml"
INCH = 0.0254          # 1 in = 25.4 mm: international yard and pound agreement, 1959
STEEL = 7850.0         # carbon steel, kg/m³: common practice, no source


def rel(a, b):
    return abs(a - b) / abs(b)


def figures(path, unit=None, axis=None):
    """Measurement, prepared profile and metre factor of a profile file."""
    from revolve.units import factor

    doc = load_profile(str(path), unit=unit)
    ax = axis or doc.axis or Axis.x()
    rev = Revolution(doc.profile, ax, doc.angle_degrees or 360.0)
    return measure(rev), prepare(doc.profile, ax), factor(doc.profile.unit, "length")


@lru_cache(maxsize=None)
def shaft_moments():
    """∫ r² dz and ∫ z r² dz of the stepped shaft (sympy.integrate, disk method).

    Pieces: chamfer r = 9 + z (0..1), journal r = 10 (1..40), collar r = 18 (40..60), crown
    r = −6 + √(26² − (z − 70)²) (60..80), integrated in u = z − 70.
    """
    z, u = sympy.symbols("z u", real=True)
    crown = sympy.expand((-6 + sympy.sqrt(676 - u ** 2)) ** 2)
    zeroth = (sympy.integrate((9 + z) ** 2, (z, 0, 1)) + 100 * 39 + 324 * 20
              + sympy.integrate(crown, (u, -10, 10)))
    first = (sympy.integrate(z * (9 + z) ** 2, (z, 0, 1))
             + sympy.integrate(100 * z, (z, 1, 40)) + sympy.integrate(324 * z, (z, 40, 60))
             + sympy.integrate((u + 70) * crown, (u, -10, 10)))
    return float(zeroth), float(first)


def shaft_volume_mm3():
    """V = π ∫ r² dz, mm³."""
    return math.pi * shaft_moments()[0]


def shaft_centre_mm():
    """Axial centre of mass, ∫ z r² dz / ∫ r² dz, mm from the left end."""
    zeroth, first = shaft_moments()
    return first / zeroth


METRIC = td.load_bar_list("metric")
INCHES = td.load_bar_list("inch")
ROUGH = tu.CuttingData.from_trade_units(200, 0.3, 3)
FINISH = tu.CuttingData.from_trade_units(260, 0.12, 0.5)


def metric_allowances(**changes):
    d = METRIC.defaults
    a = tu.Allowances(d.turning_allowance, d.bore_allowance, d.facing_allowance,
                      d.parting_width, d.holding_length)
    return replace(a, **changes)


# -- envelope --------------------------------------------------------------------------


def test_envelope_counts_the_arc_crest_not_only_the_ends():
    m, prep, f = figures(SHAFT)
    env = tu.envelope(prep, f)
    # Circular segment height h = R − √(R² − (c/2)²) = 26 − 24 = 2 over the 18 mm ends
    # (CRC Standard Mathematical Tables, from memory): largest radius 20 mm.
    assert rel(env.max_radius, 0.020) < 1e-12
    assert rel(env.diameter, 0.040) < 1e-12
    assert rel(env.length, 0.080) < 1e-12
    assert env.min_radius == 0.0 and not env.through_bore


def test_envelope_against_shapely_bounds_of_a_dense_polygon():
    shapely = pytest.importorskip("shapely")

    m, prep, f = figures(SHAFT)
    env = tu.envelope(prep)
    pts = [tuple(p) for s in prep.paths[0] for p in s.flatten(max_angle=1e-4)[:-1]]
    zmin, rmin, zmax, rmax = shapely.geometry.Polygon(pts).bounds    # shapely Polygon.bounds
    # A polygon inscribed in the arcs can only fall short of the exact crest, by at most the
    # sagitta of one chord, R (1 − cos(Δ/2)).
    assert rmax <= env.max_radius * (1 + 1e-15)
    assert env.max_radius - rmax <= 26 * (1 - math.cos(0.5e-4)) + 1e-12
    assert (zmin, zmax) == (env.z_start, env.z_end)


@pytest.mark.parametrize("clockwise, expect_r, expect_z", [
    # Upper half of a circle of radius 5 about (10, 12): crest r = 17 (geometry).
    (False, 17.0, (5.0, 15.0)),
    # Lower half, the arc dipping towards the axis: the crest is the ends, r = 12;
    # the dip sets the smallest radius, 7.
    (True, 12.0, (5.0, 15.0)),
])
def test_envelope_of_semicircular_arcs(clockwise, expect_r, expect_z):
    arc = arc_from_centre((15.0, 12.0), (5.0, 12.0), (10.0, 12.0), clockwise=clockwise)
    if clockwise:
        # travelling from (15, 12) clockwise about the centre goes below it
        loop = Loop((Line((5.0, 12.0), (5.0, 20.0)), Line((5.0, 20.0), (15.0, 20.0)),
                     Line((15.0, 20.0), (15.0, 12.0)), arc))
    else:
        loop = Loop((Line((5.0, 12.0), (15.0, 12.0)), arc_from_centre(
            (15.0, 12.0), (5.0, 12.0), (10.0, 12.0), clockwise=False)))
    env = tu.envelope(prepare(Profile(loops=(loop,)), Axis.x()))
    assert (env.z_start, env.z_end) == expect_z
    if clockwise:
        assert env.max_radius == 20.0 and env.min_radius == pytest.approx(7.0, rel=1e-15)
        assert env.through_bore
    else:
        assert env.max_radius == pytest.approx(expect_r, rel=1e-15)
        assert env.min_radius == 12.0


def test_envelope_of_a_ball_end_bulging_along_the_axis():
    # A quarter circle of radius 10 closing a ⌀20 pin: it bulges to z = 40 + 10 (geometry).
    quarter = arc_from_centre((40.0, 10.0), (50.0, 0.0), (40.0, 0.0), clockwise=True)
    loop = Loop((Line((0.0, 0.0), (0.0, 10.0)), Line((0.0, 10.0), (40.0, 10.0)), quarter,
                 Line((50.0, 0.0), (0.0, 0.0))))
    env = tu.envelope(prepare(Profile(loops=(loop,)), Axis.x()))
    assert env.z_end == 50.0 and env.max_radius == 10.0


def test_envelope_in_a_tilted_sketch_matches_the_axis_frame():
    # The same sleeve placed on a 30° axis: the envelope is measured along the axis.
    m, prep, f = figures(SLEEVE)
    plain = tu.envelope(prep, f)
    c, s = math.cos(math.pi / 6), math.sin(math.pi / 6)
    doc = load_profile(str(SLEEVE))

    def place(p):
        return (3.0 + p[0] * c - p[1] * s, -1.0 + p[0] * s + p[1] * c)

    segs = tuple(Line(place(x.start), place(x.end), face=x.face) for x in doc.profile.loops[0].segments)
    tilted = Profile(loops=(Loop(segs),), unit="in")
    env = tu.envelope(prepare(tilted, Axis((3.0, -1.0), (c, s))), f)
    for a, b in ((env.length, plain.length), (env.max_radius, plain.max_radius),
                 (env.min_radius, plain.min_radius)):
        assert rel(a, b) < 1e-12


# -- part ------------------------------------------------------------------------------


def test_part_volume_mass_and_centre_against_sympy():
    m, prep, f = figures(SHAFT)
    part = tu.part_figures(m, prep, STEEL, f)
    volume = shaft_volume_mm3()              # sympy.integrate, disk method
    assert rel(part.volume, volume * 1e-9) < 1e-12
    assert rel(part.mass, STEEL * volume * 1e-9) < 1e-12
    assert rel(part.centre_of_mass_from_start, shaft_centre_mm() * 1e-3) < 1e-12
    # every face keeps its area; the segment on the axis sweeps none
    assert part.surface_by_face["axis"] == 0.0
    # journal ⌀20 × 39: lateral area 2π r L (CRC, from memory)
    assert rel(part.surface_by_face["journal"], 2 * math.pi * 0.010 * 0.039) < 1e-12


def test_part_refuses_a_part_revolution_and_open_chains():
    m, prep, f = figures(SHAFT)
    doc = load_profile(str(SHAFT))
    half = measure(Revolution(doc.profile, Axis.x(), 270.0))
    with pytest.raises(RevolveError, match="full revolution"):
        tu.part_figures(half, prep, STEEL, f)
    from revolve.geometry.profile import Chain
    sheet = Profile(chains=(Chain.from_points([(0, 5), (10, 5)]),))
    with pytest.raises(RevolveError, match="solid section"):
        tu.part_figures(measure(Revolution(sheet, Axis.x())), prepare(sheet, Axis.x()), STEEL)


def test_enclosed_hollow_is_counted():
    outer = Loop.from_points([(0, 0), (40, 0), (40, 20), (0, 20)])
    hole = Loop.from_points([(10, 5), (30, 5), (30, 10), (10, 10)])
    p = Profile(loops=(outer, hole))
    part = tu.part_figures(measure(Revolution(p, Axis.x())), prepare(p, Axis.x()), STEEL, 1e-3)
    assert part.hollows == 1


# -- stock -----------------------------------------------------------------------------


def test_smallest_bar_covering_diameter_plus_allowance_exact_fit():
    m, prep, f = figures(SHAFT)
    env = tu.envelope(prep, f)
    # 40 mm + 2 mm turning allowance = 42 mm: the 42 mm bar fits exactly.
    bar = tu.choose_stock(env, metric_allowances(turning=0.002), METRIC.round_bars, METRIC.tubes)
    assert bar.label == "42 mm" and bar.outside_diameter == 0.042
    # a hair more allowance and the next size up is needed
    bar = tu.choose_stock(env, metric_allowances(turning=0.00201), METRIC.round_bars, METRIC.tubes)
    assert bar.label == "45 mm"


def test_part_larger_than_every_bar_is_refused():
    env = tu.Envelope(0.0, 0.1, 0.16, 0.0, False)      # ⌀320 mm
    with pytest.raises(RevolveError) as exc:
        tu.choose_bar(METRIC.round_bars, env.diameter + 0.002)
    assert "largest in the list is 300 mm" in str(exc.value) and exc.value.place == "stock"
    with pytest.raises(RevolveError, match="12 in"):
        tu.choose_bar(INCHES.round_bars, 0.4, unit="in")


def test_tube_suits_the_bore_and_lighter_picks_it():
    m, prep, f = figures(SLEEVE)
    env = tu.envelope(prep, f)
    # bore 1 1/8 in; flange 1 7/8 in: need OD ≥ 1 7/8 + 1/16, bore of the tube ≤ 1 1/8 − 1/16
    a = tu.Allowances(turning=INCH / 16, bore=INCH / 16)
    tube = tu.choose_stock(env, a, INCHES.round_bars, INCHES.tubes, "tube", "in")
    assert tube.label == "2 × 1 in"
    assert tube.outside_diameter == 2 * INCH and tube.inside_diameter == 1 * INCH
    assert tu.choose_stock(env, a, INCHES.round_bars, INCHES.tubes, "lighter").label == "2 × 1 in"
    assert tu.choose_stock(env, a, INCHES.round_bars, INCHES.tubes, "bar").label == "2 in"
    # boundary: the tube's bore 1 in may equal the largest allowed bore exactly
    exact = tu.Allowances(turning=INCH / 16, bore=INCH / 8)
    assert tu.choose_stock(env, exact, INCHES.round_bars, INCHES.tubes, "tube").label == "2 × 1 in"
    # one step more and no listed tube suits; "lighter" falls back to the bar
    tight = tu.Allowances(turning=INCH / 16, bore=INCH / 8 + 1e-6)
    with pytest.raises(RevolveError, match="no tube"):
        tu.choose_stock(env, tight, INCHES.round_bars, INCHES.tubes, "tube")
    assert tu.choose_stock(env, tight, INCHES.round_bars, INCHES.tubes, "lighter").label == "2 in"


def test_no_tube_for_a_part_solid_at_the_axis():
    m, prep, f = figures(SHAFT)
    with pytest.raises(RevolveError, match="no through bore"):
        tu.choose_stock(tu.envelope(prep, f), metric_allowances(), METRIC.round_bars,
                        METRIC.tubes, "tube")


def test_stock_length_and_volume_by_hand():
    m, prep, f = figures(SHAFT)
    part = tu.part_figures(m, prep, STEEL, f)
    a = metric_allowances(turning=0.002, facing=0.001, parting_width=0.003, holding_length=0.0)
    # stock length = part 80 + 2 × 1 facing + 3 parting + 0 holding = 85 mm (common practice)
    length = tu.stock_length(part.envelope.length, a)
    assert rel(length, 0.085) < 1e-12
    stock = tu.stock_figures(METRIC.round_bars[[s.label for s in METRIC.round_bars].index("42 mm")],
                             length, STEEL)
    # cylinder V = π r² L (CRC, from memory): π · 21² · 85 mm³
    assert rel(stock.volume, math.pi * 21 ** 2 * 85 * 1e-9) < 1e-12
    assert rel(stock.mass, STEEL * math.pi * 21 ** 2 * 85 * 1e-9) < 1e-12
    # with a 15 mm holding length: 100 mm
    assert rel(tu.stock_length(0.080, replace(a, holding_length=0.015)), 0.100) < 1e-12


def test_removed_is_stock_minus_part_exactly():
    m, prep, f = figures(SHAFT)
    part = tu.part_figures(m, prep, STEEL, f)
    a = metric_allowances(holding_length=0.015)
    stock = tu.stock_figures(tu.StockSize(0.042), tu.stock_length(part.envelope.length, a), STEEL)
    cut = tu.removal(part, stock, a)
    assert cut.removed_volume == stock.volume - part.volume          # exactly, as floats
    assert cut.removed_mass == cut.removed_volume * STEEL
    # by hand: π · 21² · 100 mm³ − the sympy disk integral
    volume = shaft_volume_mm3()
    assert rel(cut.removed_volume, (math.pi * 21 ** 2 * 100 - volume) * 1e-9) < 1e-12
    # the holding piece leaves as an offcut: π/4 · 42² · 15; the rest as chips
    assert rel(cut.offcut_volume, math.pi / 4 * 42 ** 2 * 15 * 1e-9) < 1e-12
    assert cut.chip_volume == cut.removed_volume - cut.offcut_volume
    assert rel(cut.chip_mass, cut.chip_volume * STEEL) < 1e-15
    # utilisation = part mass / stock mass
    assert cut.utilisation == part.mass / stock.mass
    assert rel(cut.utilisation, volume / (math.pi * 21 ** 2 * 100)) < 1e-12


def test_removed_exact_with_a_tube_and_hand_worked_sleeve():
    m, prep, f = figures(SLEEVE)
    part = tu.part_figures(m, prep, 8800.0, f)
    # sleeve by hand, π (R² − r²) L per step (CRC, from memory), inches:
    # π[(0.8125² − 0.5625²) · 2 + (0.9375² − 0.5625²) · 0.5] = 0.96875 π in³
    assert rel(part.volume, 0.96875 * math.pi * INCH ** 3) < 1e-12
    a = tu.Allowances(INCH / 16, INCH / 16, INCH / 32, INCH / 8, 0.0)
    length = tu.stock_length(part.envelope.length, a)
    assert rel(length, 2.6875 * INCH) < 1e-12      # 2.5 + 2/32 + 1/8 in
    stock = tu.stock_figures(tu.StockSize(2 * INCH, 1 * INCH, kind="tube"), length, 8800.0)
    # tube π/4 (2² − 1²) · 2.6875 = 2.015625 π in³
    assert rel(stock.volume, 2.015625 * math.pi * INCH ** 3) < 1e-12
    cut = tu.removal(part, stock, a)
    assert cut.removed_volume == stock.volume - part.volume
    assert rel(cut.removed_volume, (2.015625 - 0.96875) * math.pi * INCH ** 3) < 1e-11
    assert rel(cut.utilisation, 0.96875 / 2.015625) < 1e-12


def test_blank_checks():
    env = tu.Envelope(0.0, 0.08, 0.020, 0.0, False)
    a = metric_allowances()
    with pytest.raises(RevolveError, match="smaller than the part"):
        tu.check_blank(tu.StockSize(0.039, kind="blank"), env, a)
    with pytest.raises(RevolveError, match="shorter than the part"):
        tu.check_blank(tu.StockSize(0.05, kind="blank", length=0.07), env, a)
    with pytest.raises(RevolveError, match="too large"):
        tu.check_blank(tu.StockSize(0.05, 0.01, kind="blank"), env, a)
    notes = tu.check_blank(tu.StockSize(0.041, kind="blank", length=0.082), env, a)
    assert len(notes) == 2 and "turning allowance" in notes[0] and "length" in notes[1]


# -- bars ------------------------------------------------------------------------------


@pytest.mark.parametrize("bar_mm, expect", [
    (2990.0, 34),      # (2990 − 100) / 85 = 34 exactly: an exact fit counts
    (2989.999, 33),    # one short by a micrometre
    (3000.0, 34),      # floor(2900 / 85) = floor(34.12)
    (3075.0, 35),      # (3075 − 100) / 85 = 35 exactly
    (185.0, 1),        # exactly one part
    (184.99, 0),       # no part at all
])
def test_parts_per_bar_boundaries(bar_mm, expect):
    # parts per bar = floor((bar length − remnant) / (part length + parting width))
    # (common practice, no source); the stock length already holds the facing allowances.
    assert tu.parts_per_bar(bar_mm / 1000, 0.100, 0.085) == expect


@pytest.mark.parametrize("bar_in, expect", [
    (143.75, 52),       # (143.75 − 4) / 2.6875 = 52 exactly, computed in metres
    (146.4375, 53),     # 53 exactly
    (146.4365, 52),     # a thousandth of an inch short
])
def test_parts_per_bar_in_inches_round_trip(bar_in, expect):
    # 1 in = 25.4 mm (international yard and pound agreement, 1959): the exact fit survives
    # the conversion to metres.
    assert tu.parts_per_bar(bar_in * INCH, 4 * INCH, 2.6875 * INCH) == expect


def test_bars_needed_and_last_bar():
    # bars = ceil(quantity / parts per bar) (common practice, no source)
    assert tu.bars_needed(204, 34) == 6 and tu.bars_needed(205, 34) == 7
    b = tu.bar_use(3.0, 0.1, 0.085, 200)
    assert (b.parts_per_bar, b.bars_needed, b.parts_on_last_bar) == (34, 6, 30)
    assert rel(b.unused_per_bar, 2.9 - 34 * 0.085) < 1e-9
    with pytest.raises(RevolveError, match="gives no part"):
        tu.bar_use(0.15, 0.1, 0.085, 1)


# -- cutting, times --------------------------------------------------------------------


def test_metal_removal_rate_and_spindle_speed_in_trade_units():
    # Q (cm³/min) = vc (m/min) × ap (mm) × f (mm/rev) (common practice, no source)
    q = tu.metal_removal_rate(ROUGH)
    assert rel(q * 1e6 * 60, 200 * 3 * 0.3) < 1e-12
    # n (rev/min) = 1000 vc / (π D), D in mm (common practice, no source)
    n = tu.spindle_speed(ROUGH.cutting_speed, 0.042)
    assert rel(n * 60, 1000 * 200 / (math.pi * 42)) < 1e-12


def test_roughing_and_finishing_time_by_hand():
    # roughing t = V / Q: 90 cm³ at 180 cm³/min = 0.5 min
    assert rel(tu.roughing_time(90e-6, ROUGH), 30.0) < 1e-12
    # finishing t = A / (vc f): 100 cm² at 260 m/min × 0.12 mm/rev = 0.01 / (260/60 × 1.2e-4) s
    assert rel(tu.finishing_time(0.01, FINISH), 0.01 / (260 / 60 * 0.12e-3)) < 1e-12


def _cylinder(r_part, length):
    """A solid ⌀2r × L part (frame coordinates, mm)."""
    p = Profile(loops=(Loop.from_points([(0, 0), (length, 0), (length, r_part), (0, r_part)],
                                        face="face"),))
    return prepare(p, Axis.x())


def test_finishing_an_end_face_at_the_speed_limit():
    # A disc end face from r = 0 to R = 50 mm, vc 260 m/min, f 0.12 mm/rev, limit 1000 rev/min.
    # Below r_c = vc / (2π n) the spindle runs at the limit: one pass t = L/(f n) there
    # (common practice, no source), and A/(vc f) above it:
    # t = r_c / (f n) + π (R² − r_c²) / (vc f).
    disc = Profile(loops=(Loop((Line((0, 0), (5, 0), face="axis"), Line((5, 0), (5, 50), face="end"),
                                Line((5, 50), (0, 50), face="rim"), Line((0, 50), (0, 0), face="back"))),))
    prep = prepare(disc, Axis.x())
    vc, f, n = 260 / 60, 0.12e-3, 1000 / 60
    R = 0.050
    rc = vc / (2 * math.pi * n)
    assert rc < R
    want = rc / (f * n) + math.pi * (R ** 2 - rc ** 2) / (vc * f)
    area = math.pi * R ** 2
    got = tu.finishing_time_limited(prep, ["end"], area, FINISH, n, 1e-3)
    assert rel(got, want) < 1e-12
    # with the limit above every speed needed it is plain A / (vc f)
    fast = tu.finishing_time_limited(prep, ["rim"], 2 * math.pi * R * 0.005, FINISH, 1e6, 1e-3)
    assert rel(fast, tu.finishing_time(2 * math.pi * R * 0.005, FINISH)) < 1e-12


def test_finishing_a_diameter_entirely_at_the_limit_is_one_pass_l_over_fn():
    # ⌀20 × 40 outside diameter, limit 1000 rev/min, vc 260 m/min would need 4138 rev/min:
    # t = L / (f n) (common practice, no source).
    prep = prepare(Profile(loops=(Loop(tuple(
        Line(a, b, face="face") for a, b in (((0, 0), (40, 0)), ((40, 0), (40, 10)),
                                             ((40, 10), (0, 10)), ((0, 10), (0, 0))))),)),
        Axis.x())                                          # its sides as Line segments
    n = 1000 / 60
    side = [s for s in prep.paths[0] if s.start[1] == 10.0 and s.end[1] == 10.0]
    assert len(side) == 1
    prep2 = replace(prep, paths=((replace(side[0], face="od"),) + tuple(
        s for s in prep.paths[0] if s is not side[0]),))
    got = tu.finishing_time_limited(prep2, ["od"], 2 * math.pi * 0.010 * 0.040, FINISH, n, 1e-3)
    assert rel(got, 0.040 / (0.12e-3 * n)) < 1e-12


def test_roughing_at_the_limit_is_passes_times_l_over_fn():
    # Turning ⌀60 stock down to ⌀20 over 40 mm: (R − r)/ap passes, each t = L/(f n) when the
    # limit holds the spindle over the whole cut (common practice, no source).
    prep = _cylinder(10.0, 40.0)
    stock = tu.StockSize(0.060)
    chips = math.pi * (0.030 ** 2 - 0.010 ** 2) * 0.040
    n = 100 / 60                         # 100 rev/min: vc 200 m/min would need 1061 at ⌀60
    got = tu.roughing_time_limited(chips, 0.040, stock, prep, ROUGH, n, 1e-3)
    passes = (0.030 - 0.010) / ROUGH.depth_of_cut
    assert rel(got, passes * 0.040 / (ROUGH.feed * n)) < 1e-10
    # limit reached part of the way: t = L/(ap f) [ (r_c − r)/n + π (R² − r_c²)/vc ]
    n = 1500 / 60
    rc = ROUGH.cutting_speed / (2 * math.pi * n)
    assert 0.010 < rc < 0.030
    want = 0.040 / (ROUGH.depth_of_cut * ROUGH.feed) * (
        (rc - 0.010) / n + math.pi * (0.030 ** 2 - rc ** 2) / ROUGH.cutting_speed)
    got = tu.roughing_time_limited(chips, 0.040, stock, prep, ROUGH, n, 1e-3)
    assert rel(got, want) < 1e-10
    # no limit: V / Q
    assert tu.roughing_time_limited(chips, 0.040, stock, prep, ROUGH, None, 1e-3) == \
        tu.roughing_time(chips, ROUGH)


def test_finished_faces_skip_and_unknown_face():
    faces = {"bore": 1.0, "od": 2.0, "axis": 0.0}
    assert tu.finished_faces(faces) == {"bore": 1.0, "od": 2.0}
    assert tu.finished_faces(faces, ["bore"]) == {"od": 2.0}
    with pytest.raises(RevolveError) as exc:
        tu.finished_faces(faces, ["od2"])
    assert exc.value.option == "--no-finish"


# -- cost ------------------------------------------------------------------------------


def _times(cycle_rough=60.0, cycle_finish=30.0, handling=30.0, setup=2700.0):
    return tu.Times(cycle_rough, cycle_finish, handling, setup, 0.0, 0.0, None, False, False,
                    0.0, 0.0, 0.0, ())


def test_cost_per_kg_per_part_and_batch():
    stock = tu.stock_figures(tu.StockSize(0.042), 0.085, STEEL)
    prices = tu.Prices(stock_price=2.40, basis="kg", machine_rate=85.0, setup_time=2700.0,
                       quantity=200)
    c = tu.cost(prices, stock, _times())
    # stock: 2.40 × stock mass; machine: 85/h × 2 min; set-up: 85/h × 45 min over 200 parts
    assert rel(c.stock_per_part, 2.40 * stock.mass) < 1e-12
    assert rel(c.machine_per_part, 85 * 2 / 60) < 1e-12
    assert rel(c.setup_batch, 85 * 0.75) < 1e-12 and rel(c.setup_per_part, 85 * 0.75 / 200) < 1e-12
    assert rel(c.per_part, 2.40 * stock.mass + 85 / 30 + 85 * 0.75 / 200) < 1e-12
    assert rel(c.batch, c.per_part * 200) < 1e-12 and c.complete


def test_cost_per_metre_and_whole_bars():
    stock = tu.stock_figures(tu.StockSize(0.042), 0.085, STEEL)
    bars = tu.bar_use(3.0, 0.1, 0.085, 200)          # 6 bars
    per_m = tu.Prices(stock_price=12.0, basis="m", quantity=200)
    c = tu.cost(per_m, stock, _times(), bars)
    assert rel(c.stock_per_part, 12.0 * 0.085) < 1e-12
    whole = tu.cost(replace(per_m, whole_bars=True), stock, _times(), bars)
    assert rel(whole.stock_batch, 6 * 12.0 * 3.0) < 1e-12
    assert rel(whole.stock_per_part, 6 * 36.0 / 200) < 1e-12
    # per kg, whole bars: 6 bars of π/4 · 0.042² · 3 m of steel
    kg = tu.cost(tu.Prices(2.0, "kg", quantity=200, whole_bars=True), stock, _times(), bars)
    assert rel(kg.stock_batch, 6 * 2.0 * STEEL * math.pi / 4 * 0.042 ** 2 * 3.0) < 1e-12
    # no machine rate: machine and set-up are unknown, the total covers the stock only
    assert c.machine_per_part is None and c.setup_batch is None and not c.complete


def test_bad_inputs_are_refused():
    with pytest.raises(RevolveError, match="facing allowance"):
        tu.Allowances(facing=-0.001)
    with pytest.raises(RevolveError, match="--quantity"):
        tu.Prices(quantity=0)
    with pytest.raises(RevolveError, match="feed"):
        tu.CuttingData(1.0, -1.0, 1.0)
    with pytest.raises(RevolveError, match="--max-speed"):
        tu.TurningJob(tu.Allowances(), ROUGH, FINISH, speed_limit=0.0)


# -- the whole quote, and the unit round trip ------------------------------------------


def _job(bars, allowances, system_unit="mm", **kw):
    return tu.TurningJob(allowances, ROUGH, FINISH, bars=bars.round_bars, tubes=bars.tubes,
                         bar_length=bars.defaults.bar_length, remnant=bars.defaults.remnant,
                         display_unit=system_unit, **kw)


def test_quote_of_the_shaft_by_hand():
    m, prep, f = figures(SHAFT)
    q = tu.quote(m, prep, STEEL, _job(METRIC, metric_allowances()), f)
    volume = shaft_volume_mm3()
    assert rel(q.part.volume, volume * 1e-9) < 1e-12      # SI inside: m³
    assert q.stock.size.label == "42 mm" and rel(q.stock.length, 0.085) < 1e-12
    assert q.bars.parts_per_bar == 34
    assert q.removal.removed_volume == q.stock.volume - q.part.volume
    # roughing t = chips / Q, all faces but the one on the axis finished, A / (vc f)
    assert rel(q.times.roughing, q.removal.chip_volume / tu.metal_removal_rate(ROUGH)) < 1e-15
    area = m.surface_total * f * f
    assert rel(q.times.finished_area, area) < 1e-12
    assert rel(q.times.finishing, area / (FINISH.cutting_speed * FINISH.feed)) < 1e-12
    assert "axis" not in q.times.finished_faces


def test_inch_sleeve_round_trip_through_millimetres(tmp_path):
    # The sleeve drawn in inches and the same sleeve drawn in millimetres (× 25.4, the 1959
    # definition) give the same stock from the inch list, and the same figures in SI.
    text = SLEEVE.read_text(encoding="utf-8")
    import re
    mm_text = re.sub(r"(?<![\w.])(\d+\.?\d*)(?=[,\]])", lambda k: repr(float(k.group(1)) * 25.4),
                     text).replace('units = "in"', 'units = "mm"')
    mm_file = tmp_path / "sleeve-mm.toml"
    mm_file.write_text(mm_text, encoding="utf-8")
    a = tu.Allowances(INCH / 16, INCH / 16, INCH / 32, INCH / 8, 0.0)
    quotes = []
    for path in (SLEEVE, mm_file):
        m, prep, f = figures(path)
        quotes.append(tu.quote(m, prep, 8800.0, _job(INCHES, a, "in", choice="tube"), f))
    qi, qm = quotes
    assert qi.stock.size.label == qm.stock.size.label == "2 × 1 in"
    assert qi.stock.size.outside_diameter == 2 * 0.0254
    for a_, b_ in ((qi.part.volume, qm.part.volume), (qi.stock.length, qm.stock.length),
                   (qi.stock.volume, qm.stock.volume),
                   (qi.removal.removed_volume, qm.removal.removed_volume),
                   (qi.times.roughing, qm.times.roughing), (qi.times.finishing, qm.times.finishing)):
        assert rel(a_, b_) < 1e-12
    assert qi.bars.parts_per_bar == qm.bars.parts_per_bar == 52   # floor(140 / 2.6875)
    # and from the metric list: ⌀47.625 + 2 = 49.625 mm -> the 50 mm bar
    m, prep, f = figures(SLEEVE)
    q = tu.quote(m, prep, 8800.0, _job(METRIC, metric_allowances(), "mm"), f)
    assert q.stock.size.label == "50 mm"


# -- the tables ------------------------------------------------------------------------


def test_bar_lists_are_sorted_sourced_and_exact_in_inches():
    for bl in (METRIC, INCHES):
        d = [s.outside_diameter for s in bl.round_bars]
        assert d == sorted(d) and len(set(d)) == len(d)
        assert all(s.source == "common practice, no source" for s in bl.round_bars + bl.tubes)
        assert all(0 < s.inside_diameter < s.outside_diameter for s in bl.tubes)
        assert bl.defaults.source == "common practice, no source"
    # every inch size is its decimal inches × 0.0254 m (1959 agreement)
    import tomllib
    raw = tomllib.loads((ROOT / "revolve" / "data" / "bar_sizes.toml").read_text(encoding="utf-8"))
    for value, size in zip(raw["inch"]["round_bar"]["diameters"], INCHES.round_bars):
        assert size.outside_diameter == value * 0.0254
    for (od, idia), size in zip(raw["inch"]["tube"]["sizes"], INCHES.tubes):
        assert (size.outside_diameter, size.inside_diameter) == (od * 0.0254, idia * 0.0254)


def test_cutting_data_covers_every_solid_group():
    from revolve.materials import GROUPS

    table = td.load_cutting_data()
    assert set(table) == set(GROUPS) - {"liquid"}
    for g in table.values():
        assert g.source == "typical, common practice, no source"
        assert g.finishing.feed < g.roughing.feed and g.finishing.depth_of_cut < g.roughing.depth_of_cut
    with pytest.raises(MaterialError, match="cannot be turned"):
        td.cutting_data_for("liquid")


def test_bad_tables_are_refused():
    with pytest.raises(FormatError, match="unknown group"):
        td.parse_cutting_data('[unobtainium]\nsource = "x"', file="cd.toml")
    with pytest.raises(FormatError, match="positive number"):
        td.parse_cutting_data('[steel]\nsource = "x"\nroughing = { vc = -1, f = 0.3, ap = 3 }\n'
                              'finishing = { vc = 1, f = 0.1, ap = 0.5 }', file="cd.toml")
    with pytest.raises(FormatError, match="inside diameter"):
        td.parse_bar_sizes('[metric]\nunit = "mm"\nround_bar = { source = "x", diameters = [5] }\n'
                           'tube = { source = "x", sizes = [[10, 12]] }', "metric")


# -- independent integrations (scipy.integrate) ------------------------------------------


def test_envelope_of_a_curve_with_an_interior_crest():
    # r = 10 + 4 sin(π z / 20) for z in [0, 20]: the crest r = 14 at z = 10 lies inside the
    # curve, not at an end (calculus: the sine's maximum).
    from revolve.geometry.segments import curve_from_expressions
    t = sympy.Symbol("t", real=True)
    bulge = curve_from_expressions(t, 10 + 4 * sympy.sin(sympy.pi * t / 20), 0, 20)
    loop = Loop((Line((0.0, 0.0), (20.0, 0.0)), Line((20.0, 0.0), (20.0, 10.0)),
                 bulge.reversed(), Line((0.0, 10.0), (0.0, 0.0))))
    env = tu.envelope(prepare(Profile(loops=(loop,)), Axis.x()))
    assert env.max_radius == pytest.approx(14.0, rel=1e-12)


def test_limited_roughing_of_the_sleeve_against_scipy_dblquad():
    # time = (1/(ap f)) ∫∫ 2πr / min(vc, 2πr n) dA over the chip region (stock minus part);
    # the sleeve is made of rectangles, so scipy.integrate.dblquad integrates each exactly.
    from scipy.integrate import dblquad

    m, prep, f = figures(SLEEVE)
    stock = tu.StockSize(2 * INCH, 1 * INCH, kind="tube")
    cut_length = 2.6875 * INCH
    vc, n = ROUGH.cutting_speed, 1500 / 60
    rc = vc / (2 * math.pi * n)
    assert stock.inside_diameter / 2 < rc < stock.outside_diameter / 2

    def w(r, z):
        return 2 * math.pi * r / min(vc, 2 * math.pi * r * n)

    def box(z0, z1, r0, r1):
        pieces = sorted({r0, r1, min(max(rc, r0), r1)})
        return sum(dblquad(w, z0, z1, a, b, epsabs=0, epsrel=1e-13)[0]
                   for a, b in zip(pieces, pieces[1:]) if b > a)

    stock_part = box(0.0, cut_length, INCH / 2, INCH)
    # the part: body r 0.5625..0.8125 in over 2.5 in, flange r 0.8125..0.9375 in over 0.5 in
    part_integral = (box(0.0, 2.5 * INCH, 0.5625 * INCH, 0.8125 * INCH)
                     + box(0.0, 0.5 * INCH, 0.8125 * INCH, 0.9375 * INCH))
    want = (stock_part - part_integral) / (ROUGH.depth_of_cut * ROUGH.feed)
    chips = stock.section_area * cut_length - 0.96875 * math.pi * INCH ** 3
    got = tu.roughing_time_limited(chips, cut_length, stock, prep, ROUGH, n, f)
    assert rel(got, want) < 1e-9


def test_limited_finishing_of_the_crown_arc_against_scipy_quad():
    # The crown is an arc of radius 26 about (70, −6) mm from (60, 18) to (80, 18);
    # time = (1/f) ∫ 2πr / min(vc, 2πr n) ds, integrated along the arc by scipy.integrate.quad.
    from scipy.integrate import quad

    m, prep, f = figures(SHAFT)
    vc, feed, n = FINISH.cutting_speed, FINISH.feed, 2180 / 60
    rc = vc / (2 * math.pi * n)
    R, cr = 0.026, -0.006            # centre at z = 0.070 m
    half = math.asin(10 / 26)
    assert 0.018 < rc < 0.020        # the limit cuts across the crown

    def integrand(phi):
        r = cr + R * math.cos(phi)
        return 2 * math.pi * r / min(vc, 2 * math.pi * r * n) * R / feed

    edges = sorted([-half, half] + [s * math.acos((rc - cr) / R) for s in (-1, 1)])
    want = sum(quad(integrand, a, b, epsabs=0, epsrel=1e-13)[0] for a, b in zip(edges, edges[1:]))
    area = m.surface_by_face["crown"] * f * f
    got = tu.finishing_time_limited(prep, ["crown"], area, FINISH, n, f)
    # the correction is the exact ramp integral along the arc (geometry.envelope)
    assert rel(got, want) < 1e-12
    assert got > tu.finishing_time(area, FINISH)


def test_a_polyline_outline_gives_the_envelope_and_limited_times_of_its_shape():
    # A stepped shaft drawn as one Polyline (a point list held as one array): ⌀20 over 25 mm
    # then ⌀12 over 15 mm. Envelope: the vertices' extremes (numpy min/max of the array).
    # Roughing ⌀60 stock at the limit over the whole cut: passes × L/(f n) per step
    # (common practice, no source), the steps added.
    import numpy as np
    from revolve.geometry.segments import Polyline
    pts = np.array([(0.0, 0.0), (40.0, 0.0), (40.0, 6.0), (25.0, 6.0), (25.0, 10.0), (0.0, 10.0),
                    (0.0, 0.0)])
    prep = prepare(Profile(loops=(Loop((Polyline(pts),)),)), Axis.x())
    env = tu.envelope(prep, 1e-3)
    assert (env.z_start, env.z_end, env.max_radius, env.min_radius) == pytest.approx(
        (pts[:, 0].min() * 1e-3, pts[:, 0].max() * 1e-3, pts[:, 1].max() * 1e-3, 0.0), rel=1e-15)
    stock = tu.StockSize(0.060)
    n = 100 / 60
    chips = math.pi * (0.030 ** 2 * 0.040 - 0.010 ** 2 * 0.025 - 0.006 ** 2 * 0.015)
    got = tu.roughing_time_limited(chips, 0.040, stock, prep, ROUGH, n, 1e-3)
    want = sum((0.030 - r) / ROUGH.depth_of_cut * length / (ROUGH.feed * n)
               for r, length in ((0.010, 0.025), (0.006, 0.015)))
    assert rel(got, want) < 1e-10
