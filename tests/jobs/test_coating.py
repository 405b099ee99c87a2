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
    # groups go by the sign of the radial part of the outward normal, however slanted:
    # a flat cone (r > h) still faces away from the axis; only a face square to the axis
    # (within ENDS_TOLERANCE) is an end
    assert by(surfaces(run(cone(8.0, 3.0))), face="lateral")[0].facing == "outside"
    assert by(surfaces(run(cone(8.0, 8.0 * coating.ENDS_TOLERANCE / 2))),
              face="lateral")[0].facing == "ends"
    assert by(surfaces(run(cone(8.0, 8.0 * coating.ENDS_TOLERANCE * 2))),
              face="lateral")[0].facing == "outside"


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


# -- groups by the side of the material a surface faces (issue 9) ----------------------
#
# Rule: the outward normal (out of the material) of each point of a closed section; its
# radial part towards the axis -> inside, away -> outside; pieces square to the axis ->
# ends. Pieces are split where they turn back along the axis, so a head's crown is inside
# (or outside) all the way to its pole.


def _vessel_surfaces(kind, D, L, t, which, space=False):
    from revolve.jobs.vessel import design_vessel, parse_head, sketch_profile

    design = design_vessel(D, L, parse_head(kind, D), parse_head(kind, D), thickness=t)
    profile, axis = sketch_profile(design, "vertical", which)
    return surfaces(run(profile, axis=axis), space=space)


def _group(found, facing):
    return coated_area(select(found, include=[facing]))


def oblate_spheroid_area(a, c):
    """Spheroid, equatorial a > polar c: S = 2πa² + π (c²/e) ln((1+e)/(1−e)) — CRC (from memory)."""
    e = math.sqrt(1 - c * c / (a * a))
    return 2 * PI * a * a + PI * (c * c / e) * math.log((1 + e) / (1 - e))


def test_vessel_wall_hemispherical_heads_inside_and_outside():
    # wall profile of a vessel, inside radius R, shell L, wall t: the inside is the
    # cylinder 2πRL plus two hemispheres 2πR² each; the outside 2π(R+t)L + 2·2π(R+t)²
    # — CRC (from memory). Nothing of a curved head is an "end".
    R, L, t = 1000.0, 3000.0, 8.0
    found = _vessel_surfaces("hemispherical", 2 * R, L, t, "wall")
    assert rel(_group(found, "inside"), 2 * PI * R * L + 2 * 2 * PI * R * R) < 1e-12
    Ro = R + t
    assert rel(_group(found, "outside"), 2 * PI * Ro * L + 2 * 2 * PI * Ro * Ro) < 1e-12
    assert _group(found, "ends") == 0.0


def test_vessel_wall_ellipsoidal_heads_inside_is_the_whole_inner_surface():
    # 2:1 ellipsoidal heads (depth D/4, common practice): each inside is half an oblate
    # spheroid with a = R, c = R/2 (spheroid area — CRC, from memory); plus the shell 2πRL.
    # The head crowns used to be counted as "ends" (15.04 m² for 18.33 m²).
    R, L, t = 1000.0, 1000.0, 8.0
    found = _vessel_surfaces("ellipsoidal", 2 * R, L, t, "wall")
    want = 2 * PI * R * L + oblate_spheroid_area(R, R / 2)
    assert rel(_group(found, "inside"), want) < 1e-9
    # the crowns face inside right to the pole: each head's inner face is one group
    assert {s.facing for s in by(found, face="head 1 inside")} == {"inside"}
    assert {s.facing for s in by(found, face="head 2 outside")} == {"outside"}
    assert _group(found, "ends") == 0.0


def test_vessel_wall_flat_heads_are_ends():
    # flat heads are square to the axis: ends, on both faces; the shell is 2πRL inside
    # and 2π(R+t)(L+2t) outside (it runs past the heads by t at each end) — CRC (from memory)
    R, L, t = 500.0, 1000.0, 10.0
    found = _vessel_surfaces("flat", 2 * R, L, t, "wall")
    assert rel(_group(found, "inside"), 2 * PI * R * L) < 1e-12
    assert rel(_group(found, "outside"), 2 * PI * (R + t) * (L + 2 * t)) < 1e-12
    # inner faces of the heads: 2πR²; outer faces: 2π(R+t)² — discs πr², CRC (from memory)
    assert rel(_group(found, "ends"), 2 * PI * R * R + 2 * PI * (R + t) ** 2) < 1e-12


def test_liquid_space_profile_counts_as_the_vessels_inside():
    # the liquid-space profile is a space (section = "space"): its wall is the tank's
    # inside, so masking "outside" leaves the whole inside: 2πRL + 2πR² per hemisphere
    R, L = 1000.0, 2000.0
    want = 2 * PI * R * L + 2 * 2 * PI * R * R
    found = _vessel_surfaces("hemispherical", 2 * R, L, None, "inside", space=True)
    assert rel(coated_area(select(found, mask=["outside"])), want) < 1e-12
    assert rel(_group(found, "inside"), want) < 1e-12
    # read as a solid (material inside the loop) the same loop faces outside instead
    solid = _vessel_surfaces("hemispherical", 2 * R, L, None, "inside", space=False)
    assert rel(_group(solid, "outside"), want) < 1e-12


def test_bushing_with_chamfers_groups_as_a_machinist_means():
    # a plain bushing (invented sizes): bore radius 10, outside radius 20, length 30, a
    # 45° chamfer of 1 on every edge. Bore and bore chamfers face the axis (inside); the
    # outside diameter and its chamfers face away (outside); the flat faces are ends.
    # cylinder lateral 2πrh, frustum lateral π (R + r) √((R − r)² + h²), annulus
    # π (R² − r²) — CRC (from memory)
    r, R, L, c = 10.0, 20.0, 30.0, 1.0
    pts = [(c, r), (L - c, r), (L, r + c), (L, R - c), (L - c, R), (c, R), (0.0, R - c),
           (0.0, r + c)]
    loop = Loop.from_points(pts)
    found = surfaces(run(Profile(loops=(loop,))))
    frustum = lambda a, b: PI * (a + b) * math.sqrt((a - b) ** 2 + c * c)
    assert rel(_group(found, "inside"), 2 * PI * r * (L - 2 * c) + 2 * frustum(r, r + c)) < 1e-12
    assert rel(_group(found, "outside"),
               2 * PI * R * (L - 2 * c) + 2 * frustum(R, R - c)) < 1e-12
    assert rel(_group(found, "ends"), 2 * PI * ((R - c) ** 2 - (r + c) ** 2)) < 1e-12


def test_polyline_outline_groups_shoulders_as_ends():
    # One Polyline loop (a point list held as one array): a bushing with chamfers, and a
    # stepped shaft whose shoulders lie between two diameters inside one z-monotone run.
    # cylinder lateral 2πrh, frustum lateral π (R + r) √((R − r)² + h²), annulus
    # π (R² − r²) — CRC (from memory)
    import numpy as np
    from revolve.geometry.segments import Polyline
    r, R, L, c = 10.0, 20.0, 30.0, 1.0
    pts = [(c, r), (L - c, r), (L, r + c), (L, R - c), (L - c, R), (c, R), (0.0, R - c),
           (0.0, r + c), (c, r)]
    found = surfaces(measure(Revolution(Profile(loops=(Loop((Polyline(np.array(pts)),)),))),
                             crosscheck=False))
    frustum = lambda a, b: PI * (a + b) * math.sqrt((a - b) ** 2 + c * c)
    assert rel(_group(found, "inside"), 2 * PI * r * (L - 2 * c) + 2 * frustum(r, r + c)) < 1e-12
    assert rel(_group(found, "outside"),
               2 * PI * R * (L - 2 * c) + 2 * frustum(R, R - c)) < 1e-12
    assert rel(_group(found, "ends"), 2 * PI * ((R - c) ** 2 - (r + c) ** 2)) < 1e-12
    # shaft: ⌀ 2·6 over 10, ⌀ 2·9 over 15, ⌀ 2·4 over 5, solid to the axis
    shaft = [(0.0, 0.0), (30.0, 0.0), (30.0, 4.0), (25.0, 4.0), (25.0, 9.0), (10.0, 9.0),
             (10.0, 6.0), (0.0, 6.0), (0.0, 0.0)]
    found = surfaces(measure(Revolution(Profile(loops=(Loop((Polyline(np.array(shaft)),)),))),
                             crosscheck=False))
    assert rel(_group(found, "outside"), 2 * PI * (6 * 10 + 9 * 15 + 4 * 5)) < 1e-12
    assert rel(_group(found, "ends"), PI * (6 * 6 + (9 * 9 - 6 * 6) + (9 * 9 - 4 * 4) + 4 * 4)) < 1e-12


def test_open_tank_chain_inner_side_is_the_tanks_inside():
    # an open tank drawn as a chain (surface only): bottom disc πR² and wall 2πRH — CRC
    # (from memory). The inner side is the side that faces the axis: the wall's inner
    # side is "inside", the bottom's inner side (facing up, into the tank) is an end.
    R, H = 1.0, 2.0
    tank = Chain((Line((0.0, 0.0), (0.0, R), face="bottom"),
                  Line((0.0, R), (H, R), face="wall")))
    found = surfaces(run(Profile(chains=(tank,))))
    assert [(s.face, s.side, s.facing) for s in found] == [
        ("bottom", "outer", "ends"), ("bottom", "inner", "ends"),
        ("wall", "outer", "outside"), ("wall", "inner", "inside")]
    assert rel(coated_area(select(found, sides="inner")), PI * R * R + 2 * PI * R * H) < 1e-13
    # the same chain drawn the other way round has the same inner side
    back = Chain((Line((H, R), (0.0, R), face="wall"), Line((0.0, R), (0.0, 0.0), face="bottom")))
    again = surfaces(run(Profile(chains=(back,))))
    assert rel(coated_area(select(again, sides="inner", include=["inside"])),
               2 * PI * R * H) < 1e-13


def test_dome_chain_inner_side_inside_to_the_crown():
    # a hemispherical shell drawn as a chain: 2πR² per side — CRC (from memory); its
    # inner side faces the axis at every point, right up to the pole
    R = 3.0
    dome = Chain((arc_from_centre((0.0, R), (R, 0.0), (0.0, 0.0), clockwise=True, face="dome"),))
    found = surfaces(run(Profile(chains=(dome,))))
    inner = [s for s in found if s.side == "inner"]
    assert [s.facing for s in inner] == ["inside"]
    assert rel(inner[0].area, 2 * PI * R * R) < 1e-13


def test_torus_hole_splits_at_the_top_and_bottom():
    # a circular hole in a square ring section, drawn as two arcs that meet at 45°, not at
    # the hole's top and bottom: the hole's surface is the torus 4π²Rc a
    # (CRC, from memory); the half of it nearer the axis faces away from the axis
    # (outward from the material into the hole) and the far half faces the axis:
    # ∫ 2π r ds over the far half circle = 2π (π a Rc + 2 a²) — derived in the test
    Rc, a = 10.0, 1.0
    outer = Loop.from_points([(-3, 7), (3, 7), (3, 13), (-3, 13)], face="outside")
    s2 = math.sqrt(0.5)
    p = (a * s2, Rc + a * s2)
    q = (-a * s2, Rc - a * s2)
    one = arc_from_centre(p, q, (0.0, Rc), clockwise=False, face="hole")
    two = arc_from_centre(q, p, (0.0, Rc), clockwise=False, face="hole")
    found = surfaces(run(Profile(loops=(outer, Loop((one, two))))))
    assert rel(coated_area(select(found, include=["hole"])), 4 * PI * PI * Rc * a) < 1e-12
    inside = by(found, face="hole", facing="inside")[0].area
    assert rel(inside, 2 * PI * (PI * a * Rc + 2 * a * a)) < 1e-12


def test_curve_pieces_split_where_the_curve_turns_back():
    # one parametric curve drawing a whole circle (x = 3 cos t, y = 10 + 3 sin t, starting
    # off its top and bottom): a torus 4π²Rr (CRC, from memory); the far half faces away
    # from the axis: ∫ 2π r ds over the far half circle = 2π(π r R + 2r²), derived here
    from revolve.expr import parse_expression
    from revolve.geometry.segments import curve_from_expressions

    x = parse_expression("3*cos(t)")
    y = parse_expression("10 + 3*sin(t)")
    circle = curve_from_expressions(x, y, 0.5, 0.5 + 2 * math.pi, face="ring")
    found = surfaces(run(Profile(loops=(Loop((circle,)),))))
    assert rel(coated_area(select(found)), 4 * PI * PI * 10 * 3) < 1e-9
    out = coated_area(select(found, include=["outside"]))
    assert rel(out, 2 * PI * (PI * 3 * 10 + 2 * 9)) < 1e-9


def test_curve_functions_leave_nothing_in_the_line_cache():
    # The doctest of parse_film_thickness failed with KeyError '<lambdifygenerated-N>' in
    # linecache.checkcache depending on what ran before: sympy's lambdify stores its source
    # in linecache and deletes it when the function is collected; a collection during
    # checkcache's loop removed a key the loop then read. Curves keep no such entry now.
    import gc
    import linecache
    import os

    from revolve.expr import parse_expression
    from revolve.geometry.segments import curve_from_expressions

    linecache.getlines(coating.__file__)       # a real file in the cache, as doctest has
    keep = []
    for k in range(3):
        c = curve_from_expressions(parse_expression(f"t + {k}"),
                                   parse_expression("t^2 + 1"), 0.0, 1.0)
        c.evaluate([0.5])
        keep.append(c)
    assert not [k for k in linecache.cache if "lambdifygenerated" in k]
    real_stat = os.stat

    def stat_with_a_collection(path, *args, **kwargs):   # a collection in the middle
        keep.clear()
        gc.collect()
        return real_stat(path, *args, **kwargs)

    try:
        os.stat = stat_with_a_collection
        linecache.checkcache()                   # raised KeyError before the fix
    finally:
        os.stat = real_stat


# -- films read back as the user wrote them (issue 9: "0.9999999999999999 mil") ----------


@given(st.decimals(min_value="0.001", max_value="1000", places=3, allow_nan=False,
                   allow_infinity=False))
def test_film_thickness_reads_back_unchanged_in_its_own_unit(number):
    # 1 mil = 0.001 in = 25.4 µm exactly (1959 agreement); what the user types in mils comes
    # back in mils as typed, and in µm as the exact product
    text = str(number)
    key, value = coating.read_film_thickness(text, "mil")
    coat = make_coat(**{key: value}, volume_solids=50, loss=0)
    assert coat.dft_in("mil") == float(number)
    assert coat.dft_in("um") == float(Fraction(text) * Fraction(254, 10))
    assert coat.wet_film_in("mil") == float(Fraction(text) * 2)     # WFT = DFT × 100 / 50
    from_file = make_coat(dft_mils=float(text), volume_solids=50, loss=0)
    assert from_file.dft_in("mil") == float(number)


def test_film_units_converted_exactly_and_errors_echo_the_users_unit():
    assert make_coat(dft_um=50.8, volume_solids=50, loss=0).dft_in("mil") == 2.0
    assert make_coat(dft_mils=2.4, volume_solids=50, loss=0).dft_um == 60.96
    system = CoatingSystem((make_coat(dft_mils=1, volume_solids=50, loss=0),
                            make_coat(dft_mils=0.1, volume_solids=50, loss=0),
                            make_coat(dft_mils=0.2, volume_solids=50, loss=0)))
    assert system.dft_in("mil") == 1.3                                 # not 1.3000000000000003
    with pytest.raises(CoatingError, match="got 0 mils"):
        make_coat(**dict([coating.read_film_thickness("0", "mil")]), volume_solids=50, loss=0)
    for text in ("1e999", "1e-999", "9" * 60):
        key, value = coating.read_film_thickness(text, "mil")        # no overflow, no hang
        with pytest.raises(CoatingError):
            make_coat(**{key: value}, volume_solids=50, loss=0)


def test_section_space_survives_a_round_trip_through_the_profile_file():
    # the key that tells coat a loop is a space is read, written back and read again
    from revolve.formats import parse_profile_text, profile_text

    text = ('section = "space"\n[[loop]]\nstart = [0, 0]\nsegments = [ { line_to = [4, 0] },'
            ' { line_to = [4, 1] }, { line_to = [0, 1] }, { close = true } ]\n')
    doc = parse_profile_text(text, file="s.toml")
    assert doc.section == "space"
    again = parse_profile_text(profile_text(doc), file="again.toml")
    assert again.section == "space"
    assert parse_profile_text(text.replace('section = "space"\n', ""), file="m.toml").section \
        == "material"
    assert 'section' not in profile_text(parse_profile_text(text.replace('"space"', '"material"')))


@settings(max_examples=60, deadline=None)
@given(r=st.floats(0.5, 50.0), wall=st.floats(0.05, 20.0), length=st.floats(0.1, 100.0),
       tilt=st.floats(-3.1, 3.1), start=st.integers(0, 3), backwards=st.booleans())
def test_any_tube_on_any_axis_groups_by_the_side_of_its_material(r, wall, length, tilt, start,
                                                                 backwards):
    # a tube section placed on an axis through (1, -2) at any angle, drawn from any corner
    # in either direction: bore 2πrL inside, outside 2πRL, two annuli π(R² − r²) ends —
    # CRC (from memory)
    R = r + wall
    c, s = math.cos(tilt), math.sin(tilt)
    place = lambda z, y: (1.0 + z * c - y * s, -2.0 + z * s + y * c)   # noqa: E731
    corners = [(0.0, r), (length, r), (length, R), (0.0, R)]
    corners = corners[start:] + corners[:start]
    if backwards:
        corners.reverse()
    loop = Loop.from_points([place(*p) for p in corners])    # one polyline
    found = surfaces(run(Profile(loops=(loop,)), axis=Axis((1.0, -2.0), (c, s))))
    assert rel(_group(found, "inside"), 2 * PI * r * length) < 1e-9
    assert rel(_group(found, "outside"), 2 * PI * R * length) < 1e-9
    assert rel(_group(found, "ends"), 2 * PI * (R * R - r * r)) < 1e-9


def test_vessel_wall_torispherical_heads_the_issues_vessel():
    # issue 9's vessel: inside diameter 1500, shell 3000, torispherical heads (crown Rc = D,
    # knuckle rk = 6 % D, common practice), wall 8: "inside" counted 15.04 m² of 18.32 m².
    # Each head's inside, derived in the test: the crown is a spherical cap, curved area
    # 2π Rc h with h = Rc (1 − cos φ) (CRC, from memory), φ the crown's half-angle with
    # sin φ = (R − rk) / (Rc − rk); the knuckle an arc of radius rk whose centre is R − rk
    # from the axis, turning from the shell through ψ = π/2 − φ, swept area
    # ∫ 2π (R − rk + rk cos θ) rk dθ = 2π rk [(R − rk) ψ + rk sin ψ] (derived here). The
    # shell is 2πRL (CRC, from memory).
    D, L = 1500.0, 3000.0
    R, Rc, rk = D / 2, D, 0.06 * D
    phi = math.asin((R - rk) / (Rc - rk))
    psi = PI / 2 - phi
    head = (2 * PI * Rc * Rc * (1 - math.cos(phi))
            + 2 * PI * rk * ((R - rk) * psi + rk * math.sin(psi)))
    want = 2 * PI * R * L + 2 * head
    found = _vessel_surfaces("torispherical", D, L, 8.0, "wall")
    assert rel(_group(found, "inside"), want) < 1e-9
    assert round(want / 1e6, 2) == 18.32


@given(st.decimals(min_value="0.01", max_value="10000", places=2, allow_nan=False,
                   allow_infinity=False))
def test_prices_read_back_as_the_user_wrote_them(number):
    # 1 US gal = 231 in³ = 3.785411784 L exactly (US customary definition, 1 in = 25.4 mm):
    # a price per gallon comes back per gallon unchanged, and per litre as the exact quotient
    price = float(number)
    coat = make_coat(dft_um=50, volume_solids=50, loss=0, price_per_us_gallon=price)
    assert coat.price_in("US_gal") == price
    assert coat.price_in("L") == float(Fraction(str(number)) / Fraction("3.785411784"))
    assert make_coat(dft_um=50, volume_solids=50, loss=0,
                     price_per_litre=price).price_in("L") == price


def test_surfaces_use_the_measurements_prepared_profile(monkeypatch):
    # the job measures once: surfaces() reads Measurement.prepared and never prepares again
    import revolve.geometry.checks as checks

    tube = Loop.from_points([(0, 1), (10, 1), (10, 2), (0, 2)])
    m = measure(Revolution(Profile(loops=(tube,))))
    assert m.prepared is not None

    def refuse(*args, **kwargs):
        raise AssertionError("prepared again")

    monkeypatch.setattr(checks, "prepare", refuse)
    # a tube: bore 2π·1·10, outside 2π·2·10, two annuli π(2² − 1²) — CRC (from memory)
    assert rel(sum(s.area for s in surfaces(m)), math.pi * (20 + 40 + 6)) < 1e-13


def test_example_system_per_face_group_with_packs():
    # the file's own numbers read back (a reading test; the arithmetic is checked by hand in
    # tests/jobs/test_packs.py and tests/cli/test_coating_cli.py)
    path = ROOT / "examples" / "coating-tank-groups.toml"
    s = parse_coating_system(path.read_text(encoding="utf-8"), file=str(path))
    assert s.coats == () and [g.name for g in s.groups] == ["lining", "outside paint"]
    assert [g.faces for g in s.groups] == [("inside",), ("outside", "ends")]
    lining = s.groups[0].coats[0].product
    assert lining.name == "two-pack epoxy lining" and lining.mix_ratio == (4.0, 1.0)
    assert [(p.size, p.price) for p in lining.packs] == [(16.0, 310.0), (4.0, 86.0)]
    assert [(p.size, p.price) for p in lining.hardener_packs] == [(4.0, 95.0), (1.0, 27.0)]
    assert (lining.minimum_mix, lining.thinner_percent, lining.thinner_limit) == (1.0, 5.0, 10.0)
    assert s.groups[0].coats[1].product == lining
    assert s.groups[1].coats[1].product is None and len(s.all_coats) == 4
    plans = s.plans()
    assert [(g, f, len(sub.coats)) for g, f, sub in plans] == [
        ("lining", ("inside",), 2), ("outside paint", ("outside", "ends"), 2)]


def test_group_file_lines_name_the_group_and_coat():
    text = ('name = "x"\n[[group]]\nname = "in"\nfaces = ["inside"]\n[[group.coat]]\n'
            'dft_um = 60\nvolume_solids = 50\nloss = 5\n[[group.coat]]\ndft_um = 60\n'
            'volume_solids = 0\nloss = 5\n')
    with pytest.raises(CoatingError) as err:
        parse_coating_system(text, file="s.toml")
    assert str(err.value).startswith("s.toml:11: group 1, coat 2, volume_solids: ")
