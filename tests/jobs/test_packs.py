"""Coating purchases: packs, two-pack mixes, thinner, preparation, stripe coat, face groups, labour.

Every check is worked by hand from first principles (pack rounding and mix
ratios: common practice, no source, CHECKS.md "Turning and coating, second
round"), against a brute-force enumeration of pack combinations (a second,
independent search), against the drawing of a known profile for edge
lengths (circle circumference 2πr, geometry), or against the CRC area
formulas for a revolved tube (CRC Standard Mathematical Tables, from memory).
"""

from __future__ import annotations

import itertools
import math

import pytest
from hypothesis import example, given, settings, strategies as st

from revolve.errors import RevolveError
from revolve.geometry.checks import prepare
from revolve.geometry.profile import Axis, Chain, Loop, Profile, Revolution
from revolve.geometry.segments import Line, arc_from_centre
from revolve.jobs import packs
from revolve.jobs.packs import (Pack, Product, System, SystemCoat, buy, choose_packs,
                                face_group_estimate, labour, preparation, profile_edges,
                                stripe_coat)


# ---------------------------------------------------------------- pack rounding

def test_round_up_to_one_pack_size_by_hand():
    # ceil(litres / pack size) (common practice, no source): 23 L in 5 L tins → 5 tins
    for rule in ("fewest", "least left over"):
        c = choose_packs(23, (Pack(5.0, 50.0),), rule)
        assert c.counts == ((Pack(5.0, 50.0), 5),) and c.litres == 25.0 and c.cost == 250.0
    assert choose_packs(20, (Pack(5.0),), "fewest").packs == 4          # exact fit, no extra tin


def test_cheapest_by_hand():
    # 11 L from 1 L at 12, 5 L at 45, 10 L at 80 (worked by hand):
    # 10 + 1 = 92; 5 + 5 + 1 = 102; 10 + 10 = 160; 5 + 5 + 5 = 135; 1 × 11 = 132 → 10 L + 1 L
    c = choose_packs(11, (Pack(1.0, 12.0), Pack(5.0, 45.0), Pack(10.0, 80.0)))
    assert c.text() == "1 × 10 L + 1 × 1 L" and c.cost == 92.0


def test_cheaper_big_tin_beats_a_closer_fit():
    # 9 L from 4 L at 50 and 10 L at 70: 3 × 4 L = 150 (12 L) vs 1 × 10 L = 70 → 10 L
    c = choose_packs(9, (Pack(4.0, 50.0), Pack(10.0, 70.0)))
    assert c.text() == "1 × 10 L" and c.surplus == 1.0
    # least left over instead: 4 + 4 + ... can't make 9; 10 (1 over) vs 12 (3 over) → also 10 L
    assert choose_packs(9, (Pack(4.0), Pack(10.0)), "least left over").text() == "1 × 10 L"


def test_least_left_over_mixes_sizes():
    # 6.5 L from 2.5 L and 4 L: 2.5 + 4 = 6.5 exactly (0 over) by hand
    c = choose_packs(6.5, (Pack(2.5), Pack(4.0)), "least left over")
    assert c.text() == "1 × 4 L + 1 × 2.5 L" and c.surplus == 0.0


def brute_force(need, packs_, rule):
    """Every combination with up to need/size + 1 of each pack: the best by the rule's key."""
    best = None
    ranges = [range(int(math.ceil(need / p.size)) + 1) for p in packs_]
    for counts in itertools.product(*ranges):
        litres = sum(p.size * n for p, n in zip(packs_, counts))
        if litres < need - 1e-9:
            continue
        cost = round(sum((p.price or 0) * n for p, n in zip(packs_, counts)), 9)
        count = sum(counts)
        vol = round(litres, 9)
        key = {"cheapest": (cost, count, vol), "fewest": (count, vol, cost),
               "least left over": (vol, count, cost)}[rule]
        best = key if best is None or key < best else best
    return best


@settings(max_examples=60)
@given(need=st.integers(0, 120).map(lambda v: v / 4),
       sizes=st.lists(st.sampled_from([0.5, 1.0, 2.5, 4.0, 5.0, 10.0, 20.0]), min_size=1,
                      max_size=3, unique=True),
       prices=st.lists(st.integers(1, 200), min_size=3, max_size=3),
       rule=st.sampled_from(packs.RULES))
@example(need=12.0, sizes=[5.0, 20.0], prices=[40, 120, 1], rule="cheapest")
@example(need=29.75, sizes=[2.5, 4.0, 20.0], prices=[1, 1, 1], rule="least left over")
def test_choice_matches_brute_force_enumeration(need, sizes, prices, rule):
    # a second, independent search: enumerate every count of every pack
    tins = tuple(Pack(s, float(p)) for s, p in zip(sizes, prices))
    c = choose_packs(need, tins, rule)
    assert c.litres >= need - 1e-9
    cost = round(c.cost, 9)
    key = {"cheapest": (cost, c.packs, round(c.litres, 9)),
           "fewest": (c.packs, round(c.litres, 9), cost),
           "least left over": (round(c.litres, 9), c.packs, cost)}[rule]
    assert key == brute_force(need, tins, rule)


def test_a_large_order_is_bounded_and_right():
    # 10 000 L from 20 L at 100 and 5 L at 30: 500 × 20 L (cheapest per litre, exact fit)
    c = choose_packs(10_000, (Pack(5.0, 30.0), Pack(20.0, 100.0)))
    assert c.text() == "500 × 20 L" and c.cost == 50_000.0
    # 10 002 L: 500 × 20 + 1 × 5 = 50 030 beats 501 × 20 = 50 100
    assert choose_packs(10_002, (Pack(5.0, 30.0), Pack(20.0, 100.0))).text() == \
        "500 × 20 L + 1 × 5 L"


# ---------------------------------------------------------------- products

def test_two_pack_by_hand():
    # 3:1 by volume; 17 L mixed → base 12.75 L, hardener 4.25 L (common practice, no source).
    # Base in 15 L and 3.75 L, hardener in 5 L and 1.25 L, cheapest:
    # base: 15 L at 150 (2.25 over) vs 4 × 3.75 L = 15 L at 4 × 45 = 180 → 15 L;
    # hardener: 5 L at 60 vs 4 × 1.25 L = 5 L at 4 × 18 = 72 → 5 L; mixable min(15·4/3, 5·4) = 20 L
    epoxy = Product("tank lining", (Pack(15.0, 150.0), Pack(3.75, 45.0)), mix_ratio=(3, 1),
                    hardener_packs=(Pack(5.0, 60.0), Pack(1.25, 18.0)))
    p = buy(epoxy, 17)
    assert p.base_litres == pytest.approx(12.75) and p.hardener_litres == pytest.approx(4.25)
    assert p.base_litres / p.hardener_litres == pytest.approx(3.0)
    assert p.base.text() == "1 × 15 L" and p.hardener.text() == "1 × 5 L"
    assert p.mixable == pytest.approx(20.0) and p.cost == pytest.approx(210.0)


def test_hardener_can_limit_what_is_mixed():
    # 1:1, 3 L: base 1.5 → 1 × 2 L; hardener 1.5 → 2 × 1 L (cheapest 20 vs 1 × 4 L at 30);
    # mixable = min(2 × 2, 2 × 2) = 4 L (by hand)
    p = buy(Product("2K", (Pack(2.0, 25.0),), mix_ratio=(1, 1),
                    hardener_packs=(Pack(1.0, 10.0), Pack(4.0, 30.0))), 3)
    assert p.hardener.text() == "2 × 1 L" and p.mixable == pytest.approx(4.0)


def test_minimum_mix_and_thinner():
    # 0.6 L needed, minimum mix 1.5 L → 1.5 L mixed; thinner 10 % of 1.5 = 0.15 L → 1 × 0.5 L
    # (thinner = litres × % / 100: common practice, no source)
    product = Product("enamel", (Pack(1.0, 20.0),), minimum_mix=1.5, thinner_percent=10,
                      thinner_limit=15, thinner_packs=(Pack(0.5, 4.0),))
    p = buy(product, 0.6)
    assert p.mixed == 1.5 and p.base.text() == "2 × 1 L"
    assert p.thinner_litres == pytest.approx(0.15) and p.thinner.text() == "1 × 0.5 L"
    assert p.cost == pytest.approx(44.0)
    assert "minimum mix" in p.notes[0]
    big = buy(product, 8.0)
    assert big.mixed == 8.0 and big.thinner_litres == pytest.approx(0.8) and not big.notes


def test_thinner_without_packs_is_said():
    p = buy(Product("primer", (Pack(1.0, 9.0),), thinner_percent=5), 4)
    assert p.thinner is None and p.thinner_litres == pytest.approx(0.2)
    assert "no thinner packs" in p.notes[0]


# ---------------------------------------------------------------- preparation

def test_preparation_area_and_abrasive_by_hand():
    # area = coated + masked but prepared; abrasive = area × rate (common practice, no source)
    p = preparation(38.2, 4.3, abrasive_rate=25.0)
    assert p.area == pytest.approx(42.5) and p.abrasive == pytest.approx(1062.5)


# ---------------------------------------------------------------- edges and stripe coat

def stepped_shaft():
    """A drawn stepped collar, mm: ⌀60 × 20 then ⌀40 × 30, ⌀20 through bore, an R5 fillet
    blending the ⌀40 into the shoulder (a tangent arc, no corner)."""
    segs = (
        Line((0, 10), (50, 10), face="bore"),
        Line((50, 10), (50, 20), face="end"),
        Line((50, 20), (25, 20), face="outside"),
        arc_from_centre((25, 20), (20, 25), (25, 25), clockwise=True, face="outside"),
        Line((20, 25), (20, 30), face="shoulder"),
        Line((20, 30), (0, 30), face="outside"),
        Line((0, 30), (0, 10), face="end"),
    )
    return Profile(loops=(Loop(segs),))


def test_stripe_length_of_a_known_profile_against_its_drawing():
    # The drawing's corners (the fillet is tangent at both ends, so its ends are not corners):
    # (0,10) r10, (50,10) r10, (50,20) r20, (20,30) r30, (0,30) r30 → 2π (10+10+20+30+30) mm
    edges = profile_edges(prepare(stepped_shaft(), Axis.x()), length_factor=0.001)
    radii = sorted(round(e.radius * 1000, 9) for e in edges)
    assert radii == [10.0, 10.0, 20.0, 30.0, 30.0]
    assert sum(e.length for e in edges) == pytest.approx(2 * math.pi * 0.100, rel=1e-12)
    assert all(e.angle == pytest.approx(math.pi / 2) for e in edges)
    s = stripe_coat(sum(e.length for e in edges), 0.025)
    assert s.area == pytest.approx(2 * math.pi * 0.1 * 0.025)


def test_point_list_corners_and_a_half_revolution():
    # the same kind of outline as one point list; a 180° sweep halves every edge (π r)
    bush = Profile(loops=(Loop.from_points([(0, 10), (30, 10), (30, 20), (0, 20)]),))
    edges = profile_edges(prepare(bush, Axis.x()), sweep=math.pi)
    assert sum(e.length for e in edges) == pytest.approx(math.pi * 60)


def test_free_ends_of_a_sheet_and_a_face_filter():
    # an open wall, r = 500 from z 0 to 2000, then a 45° cone to r = 300: the free ends at
    # r 500 and r 300 and one corner at r 500 (turn of 45° > 30°)
    wall = Profile(chains=(Chain((Line((0, 500), (2000, 500), face="shell"),
                                 Line((2000, 500), (2200, 300), face="cone"))),))
    edges = profile_edges(prepare(wall, Axis.x()))
    kinds = sorted((e.kind, round(e.radius, 9)) for e in edges)
    assert kinds == [("corner", 500.0), ("free end", 300.0), ("free end", 500.0)]
    only = profile_edges(prepare(wall, Axis.x()), faces=["cone"])
    assert sorted(round(e.radius, 9) for e in only) == [300.0, 500.0]
    shallow = profile_edges(prepare(wall, Axis.x()), min_angle=math.radians(50))
    assert [e.kind for e in shallow] == ["free end", "free end"]


def test_stripe_coat_by_percentage():
    assert stripe_coat(coated_area=42.0, percent=7.5).area == pytest.approx(3.15)


# ---------------------------------------------------------------- systems by face group

def test_face_group_systems_sum_to_the_whole_of_a_revolved_tube():
    # A tube R = 0.5 m, r = 0.45 m, L = 2 m: inner 2π r L, outer 2π R L, ends 2 π (R² − r²)
    # (CRC, from memory). Lining inside (2 coats, 4 and 5 m²/L), paint outside and ends
    # (3 coats at 8 m²/L).
    from revolve.geometry.measure import measure

    R, r, L = 0.5, 0.45, 2.0
    loop = Loop((Line((0, r), (L, r), face="inner"), Line((L, r), (L, R), face="ends"),
                 Line((L, R), (0, R), face="outer"), Line((0, R), (0, r), face="ends")))
    m = measure(Revolution(Profile(loops=(loop,)), Axis.x()))
    lining = System("lining", (SystemCoat("epoxy 1", 4.0), SystemCoat("epoxy 2", 5.0)))
    paint = System("paint", tuple(SystemCoat(f"coat {k}", 8.0) for k in (1, 2, 3)))
    est = face_group_estimate(m.surface_by_face, {"inside": ["inner"],
                                                  "outside": ["outer", "ends"]},
                              {"inside": lining, "outside": paint})
    inner, outer, ends = 2 * math.pi * r * L, 2 * math.pi * R * L, 2 * math.pi * (R ** 2 - r ** 2)
    inside, outside = est.groups
    assert inside.area == pytest.approx(inner) and outside.area == pytest.approx(outer + ends)
    assert est.area == pytest.approx(inner + outer + ends) == pytest.approx(m.surface_total)
    assert inside.litres == pytest.approx((inner / 4, inner / 5))
    assert est.litres == pytest.approx(inner / 4 + inner / 5 + 3 * (outer + ends) / 8)
    assert est.coat_area == pytest.approx(2 * inner + 3 * (outer + ends))
    assert est.uncoated == ()
    # a face left out is reported, not silently coated
    part = face_group_estimate(m.surface_by_face, {"inside": ["inner"]}, {"inside": lining})
    assert set(part.uncoated) == {"ends", "outer"}
    assert part.area == pytest.approx(inner)


def test_litres_by_product_across_groups():
    primer = Product("zinc primer", (Pack(5.0),))
    a = System("a", (SystemCoat("p", 10.0, primer), SystemCoat("top", 5.0)))
    b = System("b", (SystemCoat("p", 10.0, primer),))
    est = face_group_estimate({"x": 20.0, "y": 30.0}, {"A": ["x"], "B": ["y"]}, {"A": a, "B": b})
    assert est.litres_by_product() == {"zinc primer": pytest.approx(5.0), "top": pytest.approx(4.0)}


# ---------------------------------------------------------------- labour

def test_labour_by_hand():
    # hours = area × coats / rate; cost = hours × labour rate (common practice, no source):
    # 40 m² × 3 coats at 15 m²/h = 8 h, at 52 an hour = 416
    job = labour(120.0, 15.0, 52.0)
    assert job.hours == pytest.approx(8.0) and job.cost == pytest.approx(416.0)


# ---------------------------------------------------------------- bad input

@pytest.mark.parametrize("make, text", [
    (lambda: Pack(-1.0), "pack size: must be a positive number"),
    (lambda: Pack(1.0, math.inf), "pack price: must be a non-negative number"),
    (lambda: choose_packs(3, (Pack(1.0),), "nearest"), "pack rule: unknown rule 'nearest'"),
    (lambda: choose_packs(3, ()), "pack sizes: the product has no pack sizes"),
    (lambda: choose_packs(3, (Pack(1.0), Pack(1.0000001)), "fewest"), "pack sizes: the pack sizes share only a 0.0001 mL step"),
    (lambda: choose_packs(500, (Pack(0.001), Pack(199.999)), "fewest"),
     "pack sizes: the pack sizes share only a 1 mL step"),
    (lambda: choose_packs(-2, (Pack(1.0),), "fewest"), "litres needed: must be a non-negative"),
    (lambda: Product("x", (Pack(1.0),), mix_ratio=(4, 0), hardener_packs=(Pack(1.0),)),
     "x: mixing ratio: must be a positive number"),
    (lambda: Product("x", (Pack(1.0),), hardener_packs=(Pack(1.0),)),
     "x: hardener packs need a mixing ratio"),
    (lambda: Product("x", (Pack(1.0),), thinner_percent=12, thinner_limit=5),
     "x: thinning 12 % is above the data sheet's limit of 5 %"),
    (lambda: preparation(10.0, -1.0), "masked but prepared area: must be a non-negative"),
    (lambda: stripe_coat(band_width=0.05), "stripe coat: give an edge length and a band width"),
    (lambda: SystemCoat("c", 0.0), "c: spreading rate: must be a positive number"),
    (lambda: System("s", ()), "s: a system needs at least one coat"),
    (lambda: face_group_estimate({"a": 1.0}, {"g": ["b"]}, {"g": System("s", (SystemCoat("c", 1.0),))}),
     "face groups: the group 'g' names the face 'b', which the profile does not have"),
    (lambda: face_group_estimate({"a": 1.0}, {"g": ["a"]}, {}), "face groups: the group 'g' has no system"),
    (lambda: labour(10.0, 0.0), "application rate: must be a positive number"),
])
def test_bad_input_one_line(make, text):
    with pytest.raises(RevolveError) as err:
        make()
    assert str(err.value).startswith(text)
    assert "\n" not in str(err.value)


def test_cautions_cover_the_coating_rules():
    text = " ".join(packs.CAUTIONS)
    for word in ("data sheet", "Ventilate", "confined-space", "pot life", "thinning limit"):
        assert word in text


def test_us_gallon_and_quart_packs_by_hand():
    # 1 US gal = 231 in³ = 3.785411784 L, 1 qt = a quarter of it (exact definitions);
    # 5 L needs 1 gal + 2 qt (1.5 gal = 5.678 L; 1 gal + 1 qt = 4.73 L is short) — by hand
    gal, qt = Pack(3.785411784, 80.0), Pack(0.946352946, 24.0)
    c = choose_packs(5.0, (gal, qt), "least left over")
    assert dict((p.size, n) for p, n in c.counts) == {3.785411784: 1, 0.946352946: 2}
    assert abs(c.litres - 1.5 * 3.785411784) < 1e-12
    # cheapest: 2 gal = 160 beats 1 gal + 2 qt = 128? no: 128 is less, so 1 gal + 2 qt
    assert choose_packs(5.0, (gal, qt), "cheapest").cost == 128.0
    assert [p.label for p in packs.parse_packs("1 US_gal @ 80, 1 qt @ 24")] == ["1 US gal", "1 qt"]
