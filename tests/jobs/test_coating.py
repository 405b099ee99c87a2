"""Tests of revolve.jobs.coating: areas to coat by face, coats, quantities, the system file.

References, named beside each check:

* trade formulas — "common practice, no source": theoretical spreading rate
  m²/L = 10 × volume solids % / DFT µm; practical = theoretical × (1 − loss);
  WFT = DFT × 100 / volume solids %. The tests also derive them from first
  principles (a litre of paint leaves VS % of a litre as dry film of the given
  thickness), written out in the test, not taken from the module;
* US units — "derived from unit definitions": 1 US gal = 231 in³ (US customary
  definition), 1 in = 25.4 mm (international yard and pound agreement, 1959),
  so at 1 mil and 100 % solids one US gallon covers 231 / 0.001 / 144 =
  1604.17 ft²;
* areas of known shapes — CRC *Standard Mathematical Tables and Formulae*
  (from memory): cylinder lateral 2πrh, disc πr², sphere 4πr², cone lateral
  π r √(r² + h²), paraboloid lateral π r/(6h²) · [(r² + 4h²)^(3/2) − r³].

The bundled example coating system (examples/coating-idler-system.toml) and
example profiles are invented; they are only read and run, never check values
except where a published formula gives the figure independently.
"""

from __future__ import annotations

import math
from fractions import Fraction
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from revolve.errors import FormatError, RevolveError
from revolve.formats import load_profile
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Chain, Loop, Profile, Revolution
from revolve.geometry.segments import Line, arc_from_centre
from revolve.jobs import coating
from revolve.jobs.coating import (Chosen, Coat, CoatingError, CoatingSystem, PartArea, Surface,
                                  area_by_face, check_names, coated_area, estimate, make_coat,
                                  parse_coating_system, parse_film_thickness, select,
                                  spreading_rate_in, surfaces)

ROOT = Path(__file__).resolve().parents[2]
PI = math.pi


def rel(a, b):
    return abs(a - b) / abs(b)


# -- shapes, drawn in the frame of the x axis (x along the axis, y the radius) --------


def tube(r_in, r_out, h, faces=("bore", "end", "outside", "end")):
    """A tube section: bore line, right end, outside line, left end."""
    pts = [(0.0, r_in), (h, r_in), (h, r_out), (0.0, r_out)]
    segs = tuple(Line(pts[i], pts[(i + 1) % 4], face=faces[i]) for i in range(4))
    return Profile(loops=(Loop(segs),))


def solid_cylinder(r, h):
    """Axis line (sweeps nothing), right end disc, outside, left end disc."""
    return tube(0.0, r, h, faces=("axis", "right end", "outside", "left end"))


def sphere(r):
    top = arc_from_centre((r, 0.0), (-r, 0.0), (0.0, 0.0), clockwise=False, face="sphere")
    return Profile(loops=(Loop((top, Line((-r, 0.0), (r, 0.0), face="axis"))),))


def cone(r, h):
    """Apex on the axis at x = 0, base disc of radius r at x = h."""
    return Profile(loops=(Loop((Line((0.0, 0.0), (h, r), face="lateral"),
                                Line((h, r), (h, 0.0), face="base"),
                                Line((h, 0.0), (0.0, 0.0), face="axis"))),))


def run(profile, angle=360.0, axis=None):
    return measure(Revolution(profile, axis or Axis.x(), angle))


def by(found, **want):
    return [s for s in found if all(getattr(s, k) == v for k, v in want.items())]


# -- coats: the trade formulas -----------------------------------------------------------


def test_theoretical_spreading_rate_common_practice():
    # m²/L = 10 × VS % / DFT µm — common practice, no source
    assert coating.spreading_rate_theoretical(100, 100) == 10.0
    assert coating.spreading_rate_theoretical(60, 75) == pytest.approx(8.0, rel=1e-15)
    assert coating.spreading_rate_theoretical(52, 50) == pytest.approx(10.4, rel=1e-15)


@settings(max_examples=60, deadline=None)
@given(vs=st.floats(0.5, 100), dft=st.floats(1, 5000))
def test_theoretical_rate_from_first_principles(vs, dft):
    # common practice, no source — derived here: one litre (1e-3 m³) leaves VS/100 of it as
    # dry film of thickness DFT (µm = 1e-6 m); area = volume / thickness.
    area_per_litre = 1e-3 * (vs / 100) / (dft * 1e-6)
    assert rel(coating.spreading_rate_theoretical(vs, dft), area_per_litre) < 1e-12
    c = make_coat(dft_um=dft, volume_solids=vs, loss=0)
    assert rel(c.litres_for(area_per_litre), 1.0) < 1e-12


def test_practical_spreading_rate_common_practice():
    # practical = theoretical × (1 − loss fraction) — common practice, no source
    c = make_coat(dft_um=75, volume_solids=60, loss=25)
    assert c.spreading_rate_theoretical == pytest.approx(8.0, rel=1e-15)
    assert c.spreading_rate_practical == pytest.approx(6.0, rel=1e-15)
    # losses raise what must be bought: 30 m² at 6 m²/L is 5 L, of which 3.75 L stays as film
    assert c.litres_for(30) == pytest.approx(5.0, rel=1e-15)
    assert c.litres_theoretical_for(30) == pytest.approx(3.75, rel=1e-15)
    assert make_coat(dft_um=75, volume_solids=60, loss=0).spreading_rate_practical == \
        pytest.approx(8.0, rel=1e-15)


def test_wet_film_thickness_common_practice():
    # WFT = DFT × 100 / VS — common practice, no source; the wet film times its solids
    # fraction is the dry film.
    assert coating.wet_film_um(75, 60) == pytest.approx(125.0, rel=1e-15)
    assert coating.wet_film_um(100, 100) == 100.0
    c = make_coat(dft_mils=3, volume_solids=65, loss=10)
    assert c.wet_film_um * 0.65 == pytest.approx(3 * 25.4, rel=1e-14)


def test_us_spreading_rate_derived_from_unit_definitions():
    # 1604.17 ft²/US gal at 1 mil, 100 % solids: 231 in³ / 0.001 in / 144 in² per ft²
    # — derived from unit definitions (US gal = 231 in³; 1 in = 25.4 mm, 1959)
    constant = Fraction(231) / Fraction(1, 1000) / 144
    assert float(constant) == pytest.approx(1604.1666666666667, rel=1e-15)
    assert round(float(constant), 2) == 1604.17
    one_mil = make_coat(dft_mils=1, volume_solids=100, loss=0)
    assert rel(spreading_rate_in(one_mil.spreading_rate_theoretical, "ft^2", "US_gal"),
               float(constant)) < 1e-12
    # the US rule of thumb in general: 1604.17 × VS/100 / DFT mils
    for vs, mils in ((65, 3), (52, 2), (80, 10)):
        c = make_coat(dft_mils=mils, volume_solids=vs, loss=0)
        got = spreading_rate_in(c.spreading_rate_theoretical, "ft^2", "US_gal")
        assert rel(got, float(constant) * vs / 100 / mils) < 1e-12


def test_us_gallons_for_an_area():
    # derived from unit definitions: 1604.17 ft² at 1 mil, 100 % solids need 1 US gal,
    # i.e. 231 in³ = 3.785411784 L
    c = make_coat(dft_mils=1, volume_solids=100, loss=0)
    ft2 = 0.3048 ** 2
    litres = c.litres_for(1604.1666666666667 * ft2)
    assert litres == pytest.approx(231 * 2.54 ** 3 / 1000, rel=1e-12)
    assert litres / coating.US_GALLON_LITRES == pytest.approx(1.0, rel=1e-12)


def test_price_per_us_gallon_is_per_litre_inside():
    # derived from unit definitions: 1 US gal = 3.785411784 L
    c = make_coat(dft_um=50, volume_solids=50, loss=0, price_per_us_gallon=3.785411784)
    assert c.price_per_litre == pytest.approx(1.0, rel=1e-12)
    assert c.cost_for(2.0) == pytest.approx(2.0, rel=1e-12)


@pytest.mark.parametrize("kwargs, place", [
    (dict(dft_um=75, volume_solids=0, loss=10), "volume_solids"),
    (dict(dft_um=75, volume_solids=100.5, loss=10), "volume_solids"),
    (dict(dft_um=75, volume_solids=-5, loss=10), "volume_solids"),
    (dict(dft_um=-75, volume_solids=60, loss=10), "dft_um"),
    (dict(dft_um=0, volume_solids=60, loss=10), "dft_um"),
    (dict(dft_mils=-1, volume_solids=60, loss=10), "dft_mils"),
    (dict(dft_um=75000, volume_solids=60, loss=10), "dft_um"),
    (dict(dft_um=75, volume_solids=60, loss=100), "loss"),
    (dict(dft_um=75, volume_solids=60, loss=150), "loss"),
    (dict(dft_um=75, volume_solids=60, loss=-1), "loss"),
    (dict(dft_um=75, volume_solids=60), "loss"),
    (dict(dft_um=75, loss=5), "volume_solids"),
    (dict(volume_solids=60, loss=5), "dft"),
    (dict(dft_um=75, dft_mils=3, volume_solids=60, loss=5), "dft_mils"),
    (dict(dft_um=float("nan"), volume_solids=60, loss=5), "dft_um"),
    (dict(dft_um=75, volume_solids=float("inf"), loss=5), "volume_solids"),
    (dict(dft_um=True, volume_solids=60, loss=5), "dft_um"),
    (dict(dft_um="75", volume_solids=60, loss=5), "dft_um"),
    (dict(dft_um=75, volume_solids=60, loss=5, price_per_litre=-2), "price_per_litre"),
    (dict(dft_um=75, volume_solids=60, loss=5, price_per_litre=2, price_per_us_gallon=8),
     "price_per_us_gallon"),
])
def test_impossible_coats_are_refused_naming_the_input(kwargs, place):
    with pytest.raises(CoatingError) as exc:
        make_coat(**kwargs)
    assert exc.value.place == place
    assert "\n" not in str(exc.value)


def test_film_thickness_text():
    # 1 mil = 0.001 in = 25.4 µm (1959 agreement)
    assert parse_film_thickness("75") == 75.0
    assert parse_film_thickness("75 µm") == 75.0
    assert parse_film_thickness("3 mil") == pytest.approx(76.2, rel=1e-15)
    assert parse_film_thickness("3", "mil") == pytest.approx(76.2, rel=1e-15)
    assert parse_film_thickness("0.1 mm") == pytest.approx(100.0, rel=1e-15)
    for bad in ("", "thick", "5 kg", "75 µm µm"):
        with pytest.raises(CoatingError) as exc:
            parse_film_thickness(bad)
        assert exc.value.place == "--dft"


# -- quantities for a batch --------------------------------------------------------------


def test_estimate_adds_parts_and_coats():
    # litres = area / practical rate (common practice, no source), per coat and part
    primer = Coat("primer", 100, 50, 0, 2.0)        # 5 m²/L
    finish = Coat("finish", 50, 50, 50)             # 10 m²/L theoretical, 5 practical
    e = estimate(CoatingSystem((primer, finish)), [PartArea("a", 1.5, 4), PartArea("b", 2.0, 2)])
    assert e.area == 10.0 and e.quantity == 6
    assert [q.litres for q in e.coats] == pytest.approx([2.0, 2.0], rel=1e-15)
    assert [q.litres_theoretical for q in e.coats] == pytest.approx([2.0, 1.0], rel=1e-15)
    assert [p.litres for p in e.parts] == pytest.approx([2.4, 1.6], rel=1e-15)
    assert e.litres == pytest.approx(sum(p.litres for p in e.parts), rel=1e-15)
    assert e.cost == pytest.approx(4.0) and not e.cost_complete
    assert estimate(CoatingSystem((finish,)), [PartArea("a", 1.0)]).cost is None


@settings(max_examples=40, deadline=None)
@given(area=st.floats(1e-4, 1e3), q=st.integers(1, 10_000), vs=st.floats(1, 100),
       dft=st.floats(5, 2000), loss=st.floats(0, 95))
def test_quantity_scales_litres_linearly(area, q, vs, dft, loss):
    c = make_coat(dft_um=dft, volume_solids=vs, loss=loss)
    one = estimate(CoatingSystem((c,)), [PartArea("p", area, 1)]).litres
    many = estimate(CoatingSystem((c,)), [PartArea("p", area, q)]).litres
    assert rel(many, q * one) < 1e-12
    # and from first principles (common practice, no source): film volume / solids / (1 − loss)
    film_litres = area * dft * 1e-6 * 1000
    assert rel(one, film_litres / (vs / 100) / (1 - loss / 100)) < 1e-12


# -- areas of known shapes ---------------------------------------------------------------


def test_solid_cylinder_lateral_and_ends():
    # cylinder lateral 2πrh, end discs πr² each — CRC (from memory)
    r, h = 3.0, 7.0
    found = surfaces(run(solid_cylinder(r, h)))
    assert {s.face for s in found} == {"outside", "right end", "left end"}  # the axis sweeps 0
    (out,) = by(found, facing="outside")
    assert rel(out.area, 2 * PI * r * h) < 1e-13
    ends = by(found, facing="ends")
    assert len(ends) == 2 and all(rel(s.area, PI * r * r) < 1e-13 for s in ends)
    assert rel(coated_area(select(found)), 2 * PI * r * h + 2 * PI * r * r) < 1e-13


def test_tube_groups_outside_inside_ends():
    # lateral 2πrh (bore and outside), annulus π (R² − r²) — CRC (from memory)
    r, R, h = 4.0, 5.0, 20.0
    found = surfaces(run(tube(r, R, h)))
    area = lambda names, **kw: coated_area(select(found, include=names, **kw))
    assert rel(area(["inside"]), 2 * PI * r * h) < 1e-13
    assert rel(area(["outside"]), 2 * PI * R * h) < 1e-13
    assert rel(area(["ends"]), 2 * PI * (R * R - r * r)) < 1e-13
    assert rel(area(["all"]), area(["inside", "outside", "ends"])) < 1e-15


def test_tube_drawn_clockwise_on_the_other_side_of_a_tilted_axis():
    # the same tube, mirrored onto the right of an axis at 30° and drawn the other way
    # round: groups and areas do not change (lateral 2πrh — CRC, from memory)
    r, R, h = 4.0, 5.0, 20.0
    c, s = math.cos(PI / 6), math.sin(PI / 6)
    place = lambda z, y: (1.0 + z * c + y * s, -2.0 + z * s - y * c)
    pts = [place(*p) for p in [(0.0, r), (0.0, R), (h, R), (h, r)]]
    names = ("end", "outside", "end", "bore")
    loop = Loop(tuple(Line(pts[i], pts[(i + 1) % 4], face=names[i]) for i in range(4)))
    found = surfaces(run(Profile(loops=(loop,)), axis=Axis((1.0, -2.0), (c, s))))
    assert rel(coated_area(select(found, include=["inside"])), 2 * PI * r * h) < 1e-12
    assert rel(coated_area(select(found, include=["outside"])), 2 * PI * R * h) < 1e-12
    assert [x.facing for x in by(found, face="bore")] == ["inside"]


def test_hole_in_a_section_faces_inside():
    # a square ring section with a round hole: the hole's surface is a torus, 4π² R a
    # — CRC (from memory); its outward normal (out of the material) points into the hole,
    # so it is not "ends"; the torus is split into the half facing away from and the half
    # facing the axis, but the total is the torus.
    Rc, a = 10.0, 1.0
    outer = Loop.from_points([(-3, 7), (3, 7), (3, 13), (-3, 13)], face="outside")
    upper = arc_from_centre((a, Rc), (-a, Rc), (0.0, Rc), clockwise=False, face="hole")
    lower = arc_from_centre((-a, Rc), (a, Rc), (0.0, Rc), clockwise=False, face="hole")
    m = run(Profile(loops=(outer, Loop((upper, lower)))))
    found = surfaces(m)
    hole = by(found, face="hole")
    assert rel(sum(s.area for s in hole), 4 * PI * PI * Rc * a) < 1e-12
    # upper half-circle of the hole: its material-outward normal points down, to the axis
    assert {s.facing for s in hole} == {"inside", "outside"}
    inside = by(found, face="hole", facing="inside")[0].area
    # ∫ 2π r ds over the upper half circle: 2π (π a Rc + 2 a²) — derived in the test
    assert rel(inside, 2 * PI * (PI * a * Rc + 2 * a * a)) < 1e-12


def test_sphere_all_outside():
    # sphere 4πr² — CRC (from memory); the diameter on the axis sweeps nothing
    found = surfaces(run(sphere(2.5)))
    assert [(s.face, s.facing) for s in found] == [("sphere", "outside")]
    assert rel(found[0].area, 4 * PI * 2.5 ** 2) < 1e-13


def test_cone_lateral_and_base():
    # cone lateral π r √(r² + h²), base πr² — CRC (from memory)
    r, h = 3.0, 8.0
    found = surfaces(run(cone(r, h)))
    (lateral,) = by(found, face="lateral")
    assert lateral.facing == "outside"
    assert rel(lateral.area, PI * r * math.sqrt(r * r + h * h)) < 1e-13
    (base,) = by(found, face="base")
    assert base.facing == "ends" and rel(base.area, PI * r * r) < 1e-13
    # a flat cone (r > h) looks mostly along the axis: it counts as an end
    assert by(surfaces(run(cone(8.0, 3.0))), face="lateral")[0].facing == "ends"


def test_paraboloid_dome_of_the_example_lid():
    # paraboloid lateral π r/(6h²) · [(r² + 4h²)^(3/2) − r³] — CRC (from memory); the lid's
    # dome is y = 25 − x²/180 from x = 60: radius 60, height 60²/180 = 20
    doc = load_profile(str(ROOT / "profiles" / "domed-lid.toml"))
    found = surfaces(run(doc.profile, axis=doc.axis))
    r, h = 60.0, 20.0
    dome = sum(s.area for s in by(found, face="dome"))
    assert rel(dome, PI * r / (6 * h * h) * ((r * r + 4 * h * h) ** 1.5 - r ** 3)) < 1e-10
    (underside,) = by(found, face="underside")
    assert rel(underside.area, PI * 60.0 ** 2) < 1e-13   # disc πr² — CRC (from memory)


def test_pieces_add_up_to_the_engine_per_face():
    # every example profile: the pieces of each face add up to the measurement's figure
    for name in ("flanged-bushing.toml", "grooved-pulley.toml", "tilted-ring.toml"):
        doc = load_profile(str(ROOT / "profiles" / name))
        m = run(doc.profile, axis=doc.axis)
        found = surfaces(m)
        for face, want in m.surface_by_face.items():
            got = sum(s.area for s in by(found, face=face))
            assert got == pytest.approx(want, rel=1e-14, abs=0.0), (name, face)


def test_masking_a_face_removes_exactly_its_area():
    # bore of a tube: 2πrh — CRC (from memory); masking removes that and nothing else
    r, R, h = 4.0, 5.0, 20.0
    found = surfaces(run(tube(r, R, h)))
    full = coated_area(select(found))
    masked = coated_area(select(found, mask=["bore"]))
    assert rel(full - masked, 2 * PI * r * h) < 1e-12
    assert rel(masked, 2 * PI * R * h + 2 * PI * (R * R - r * r)) < 1e-13
    assert "bore" not in area_by_face(select(found, mask=["bore"]))
    # on a real example: each face in turn
    doc = load_profile(str(ROOT / "profiles" / "flanged-bushing.toml"))
    m = run(doc.profile, axis=doc.axis)
    found = surfaces(m)
    total = coated_area(select(found))
    for face, area in m.surface_by_face.items():
        assert total - coated_area(select(found, mask=[face])) == pytest.approx(area, rel=1e-12)


def test_mask_wins_over_include_and_group_words_mask_too():
    found = surfaces(run(tube(4.0, 5.0, 20.0)))
    chosen = select(found, include=["bore", "outside"], mask=["bore"])
    # pieces: bore, the two ends (one piece), outside
    assert [c.surface.face for c in chosen] == ["bore", "end", "outside"]
    assert [c.included for c in chosen] == [False, False, True]
    assert [c.reason for c in chosen][0] == "masked"
    assert rel(coated_area(select(found, mask=["ends"])), 2 * PI * (4 + 5) * 20) < 1e-13


def test_a_face_name_wins_over_a_group_word():
    # a profile calling its bore "outside": --faces outside means that face
    loop = Loop((Line((0.0, 4.0), (20.0, 4.0), face="outside"),
                 Line((20.0, 4.0), (20.0, 5.0), face="e"),
                 Line((20.0, 5.0), (0.0, 5.0), face="od"),
                 Line((0.0, 5.0), (0.0, 4.0), face="e")))
    found = surfaces(run(Profile(loops=(loop,))))
    assert rel(coated_area(select(found, include=["outside"])), 2 * PI * 4 * 20) < 1e-13


def test_open_chain_both_sides_double_the_area():
    # a cylindrical sheet of radius 2, length 5: lateral 2πrh — CRC (from memory) per side
    shell = Chain((Line((0.0, 2.0), (5.0, 2.0), face="shell"),))
    found = surfaces(run(Profile(chains=(shell,))))
    assert [(s.side, s.facing) for s in found] == [("outer", "outside"), ("inner", "inside")]
    one = 2 * PI * 2 * 5
    assert rel(coated_area(select(found, sides="both")), 2 * one) < 1e-13
    assert rel(coated_area(select(found, sides="inner")), one) < 1e-13
    assert rel(coated_area(select(found, sides="outer")), one) < 1e-13
    assert rel(coated_area(select(found, include=["inside"])), one) < 1e-13
    assert rel(area_by_face(select(found))["shell"], 2 * one) < 1e-13
    with pytest.raises(CoatingError):
        select(found, sides="top")


def test_open_tank_chain_with_a_solid_in_one_profile():
    # tank: bottom disc πR² plus wall 2πRH — CRC (from memory), each on both sides; a solid
    # ring beside it keeps its own single surface
    tank = Chain((Line((0.0, 0.0), (0.0, 1.0), face="bottom"),
                  Line((0.0, 1.0), (2.0, 1.0), face="wall")))
    ring = Loop.from_points([(3, 1), (4, 1), (4, 2), (3, 2)], face="ring")
    found = surfaces(run(Profile(loops=(ring,), chains=(tank,))))
    one_side = PI * 1.0 + 2 * PI * 1.0 * 2.0
    ring_area = 2 * PI * 1 * 1 + 2 * PI * 2 * 1 + 2 * PI * (4 - 1)
    assert rel(coated_area(select(found, mask=["ring"])), 2 * one_side) < 1e-13
    assert rel(coated_area(select(found, sides="outer")), one_side + ring_area) < 1e-13


def test_partial_revolution_cut_faces_when_asked():
    # a 90° sector of a square-section ring: lateral θ r h, and two cut faces, each the
    # section's area (here 1 × 1) — Pappus–Guldinus, Stewart, Calculus (from memory)
    sq = Loop.from_points([(0, 1), (1, 1), (1, 2), (0, 2)], face="ring")
    m = run(Profile(loops=(sq,)), angle=90.0)
    found = surfaces(m)
    swept = (PI / 2) * (1 * 1 + 2 * 1 + 2 * ((4 - 1) / 2))  # θ ∫ r ds, ∫ r ds = 1 + 2 + 1.5 + 1.5
    assert rel(coated_area(select(found)), swept) < 1e-13
    assert rel(coated_area(select(found, cut_faces=True)), swept + 2.0) < 1e-13
    (cut,) = by(found, kind="cut")
    assert cut.face == coating.CUT_FACE and cut.facing == coating.CUT
    assert [c.reason for c in select(found) if c.surface.kind == "cut"] == \
        ["add --cut-faces to count them"]
    assert coated_area(select(found, mask=[coating.CUT_FACE], cut_faces=True)) == \
        pytest.approx(swept, rel=1e-13)
    # a full revolution has none
    assert not by(surfaces(run(Profile(loops=(sq,)))), kind="cut")


def test_unknown_face_names_suggest_close_ones():
    with pytest.raises(CoatingError) as exc:
        check_names(["bore", "flange bak"], ["bore", "flange back", "rim"], "--mask", "a.toml")
    text = str(exc.value)
    assert text.startswith("a.toml: --mask: ") and '"flange back"' in text
    assert "\n" not in text
    with pytest.raises(CoatingError) as exc:
        check_names(["Outside"], ["bore"], "--faces")
    assert '"outside"' in str(exc.value)
    with pytest.raises(CoatingError) as exc:
        check_names(["zzz"], ["bore"], "--faces")
    assert "did you mean" not in str(exc.value) and "bore" in str(exc.value)
    check_names(["ends", "all", "bore"], ["bore"], "--faces")  # no error


def test_surface_label_and_split_names():
    assert Surface("wall", "inside", 1.0, "chain", "inner").label == "wall, inner side"
    assert coating.split_names(["a,b", " c ", ","]) == ("a", "b", "c")


# -- the coating-system file -------------------------------------------------------------


def test_example_coating_system_file():
    path = ROOT / "examples" / "coating-idler-system.toml"
    s = parse_coating_system(path.read_text(encoding="utf-8"), file=str(path))
    assert s.currency == "EUR" and len(s.coats) == 2 and s.name
    for c in s.coats:
        # common practice, no source
        assert rel(c.spreading_rate_theoretical, 10 * c.volume_solids / c.dft_um) < 1e-15
        assert 0 < c.loss < 100 and c.price_per_litre > 0


def test_coating_system_file_all_keys():
    text = """
name = "lining"
currency = "USD"
[[coat]]
name = "first"
dft_mils = 4
volume_solids = 100
loss = 20
price_per_us_gallon = 75.70823568
[[coat]]
dft_um = 100
volume_solids = 50
loss = 0
"""
    s = parse_coating_system(text, file="s.toml")
    first, second = s.coats
    assert first.dft_um == pytest.approx(101.6, rel=1e-15)       # 1 mil = 25.4 µm (1959)
    assert first.price_per_litre == pytest.approx(20.0, rel=1e-12)  # 1 US gal = 3.785411784 L
    assert second.name == "coat 2" and second.price_per_litre is None
    assert s.dft_um == pytest.approx(201.6, rel=1e-15)


@pytest.mark.parametrize("text, line, words", [
    ('[[coat]]\ndft_um = 60\nvolume_solid = 58\nloss = 5\n', 3, 'did you mean "volume_solids"'),
    ('name = "x"\n[[coat]]\ndft_um = 60\nvolume_solids = 58\nloss = 5\ncolour = "red"\n', 6,
     'unknown key "colour"'),
    ('loss = 5\n[[coat]]\ndft_um = 60\n', 1, "belongs under a [[coat]] header"),
    ('[[coat]]\ndft_um = 60\nvolume_solids = 0\nloss = 5\n', 3, "volume solids must be above 0"),
    ('[[coat]]\ndft_um = 60\nvolume_solids = 101\nloss = 5\n', 3, "at most 100"),
    ('[[coat]]\ndft_um = -60\nvolume_solids = 50\nloss = 5\n', 2, "must be above 0"),
    ('[[coat]]\ndft_um = 60\nvolume_solids = 50\nloss = 100\n', 4, "below 100"),
    ('[[coat]]\ndft_um = 60\nvolume_solids = "50%"\nloss = 5\n', 3, "plain number"),
    ('[[coat]]\ndft_um = 60\nvolume_solids = 50\nloss = nan\n', 4, "finite"),
    ('[[coat]]\ndft_um = 60\nvolume_solids = 50\nloss = 5\n\n[[coat]]\ndft_um = 6\nloss = 1\n', 6,
     "coat 2, volume_solids: the volume solids (%) are missing"),
    ('[[coat]]\ndft_um = 60\nvolume_solids = 50\nloss = \n', 4, "malformed TOML"),
    ('[coat]\ndft_um = 60\n', 1, "two brackets"),
    ('name = 5\n[[coat]]\ndft_um = 60\n', 1, "non-empty text"),
])
def test_bad_coating_files_name_file_and_line(text, line, words):
    with pytest.raises(RevolveError) as exc:
        parse_coating_system(text, file="sys.toml")
    message = str(exc.value)
    assert message.startswith(f"sys.toml:{line}: "), message
    assert words in message and "\n" not in message


def test_coating_file_without_coats_or_empty():
    for text in ('name = "nothing"\n', "  \n", "coat = []\n"):
        with pytest.raises(FormatError) as exc:
            parse_coating_system(text, file="e.toml")
        assert str(exc.value).startswith("e.toml")


def test_coating_file_inline_array_of_coats():
    s = parse_coating_system('coat = [ { dft_um = 50, volume_solids = 50, loss = 0 } ]\n')
    assert s.coats[0].spreading_rate_theoretical == 10.0   # 10 × 50 / 50, common practice


def test_key_lines_skip_multiline_strings():
    text = 'name = """two\nloss = 5\n"""\n[[coat]]\nloss = 3\n'
    assert coating.key_lines(text) == {"name": 1, "coat 1": 4, "coat 1.loss": 5}


def test_chosen_is_frozen():
    c = Chosen(Surface("a", "ends", 1.0), True)
    with pytest.raises(Exception):
        c.included = False  # type: ignore[misc]
