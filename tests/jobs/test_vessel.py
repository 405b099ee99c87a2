"""The vessel builder: head geometry, volumes, wall, masses and centres of mass.

References beside each check: CRC formulas (sphere, spheroid, cylinder), the
flanged-and-dished approximation 0.0809 D³ (common practice, from memory),
torispherical geometry derived in the test and integrated exactly with sympy
(disk method), scipy.integrate.quad for the ellipse's parallel curve, and the
example profiles, which the builder must reproduce.
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest
import sympy
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from revolve.errors import ProfileError, RevolveError
from revolve.formats import load_profile
from revolve.formats.writer import profile_text
from revolve.geometry.segments import Arc, Curve
from revolve.jobs.levels import table_at_levels, liquid_space
from revolve.jobs.vessel import (HeadSpec, design_vessel, describe, parse_head, sketch_profile,
                                 summarise)

ROOT = Path(__file__).resolve().parents[2]
D = 1000.0


def vessel(head, length=2000.0, **kw):
    spec = parse_head(head, kw.get("diameter", D))
    return design_vessel(kw.pop("diameter", D), length, spec, spec, **kw)


# -- head volumes and depths -----------------------------------------------------------

def test_hemispherical_head():
    s = summarise(vessel("hemispherical"))
    # geometry (sphere), CRC: V = π D³/12; depth D/2
    assert s.heads[0].volume == pytest.approx(math.pi * D ** 3 / 12, rel=1e-13)
    assert s.heads[1].volume == pytest.approx(math.pi * D ** 3 / 12, rel=1e-13)
    assert s.heads[0].depth == D / 2
    # CRC: sphere surface 4π r², half per head
    assert s.heads[0].inside_area == pytest.approx(2 * math.pi * (D / 2) ** 2, rel=1e-13)


def test_ellipsoidal_head():
    s = summarise(vessel("ellipsoidal"))
    # geometry (spheroid), CRC; the 2:1 proportion is common practice: V = π D³/24, depth D/4
    assert s.heads[0].volume == pytest.approx(math.pi * D ** 3 / 24, rel=1e-12)
    assert s.heads[0].depth == D / 4
    # CRC (from memory): oblate spheroid surface 2πa² + π (c²/e) ln((1+e)/(1−e)), half per head
    a, c = D / 2, D / 4
    e = math.sqrt(1 - c * c / (a * a))
    full = 2 * math.pi * a * a + math.pi * c * c / e * math.log((1 + e) / (1 - e))
    assert s.heads[0].inside_area == pytest.approx(full / 2, rel=1e-12)
    assert all(isinstance(seg, Curve) for seg in vessel("ellipsoidal").inside.segments
               if seg.face == "head 1")


def test_flanged_and_dished_approximation():
    s = summarise(vessel("torispherical"))
    # common practice, from memory: crown D, knuckle 6 % D holds about 0.0809 D³ (within ~1 %)
    assert s.heads[0].volume / D ** 3 == pytest.approx(0.0809, rel=0.01)


def _torispherical_reference(Dv, crown, knuckle):
    """Depth and volume of a torispherical head, derived here and integrated with sympy.

    Knuckle centre at (u, ρ) = (0, R − k); crown centre on the axis at u = −c with
    c = √((L − k)² − (R − k)²), tangent to the knuckle where the line through both centres
    meets them; depth = L − c. Disk method: V = ∫ π ρ(u)² du, knuckle then crown.
    """
    R, L_, k = (sympy.nsimplify(v) for v in (Dv / 2, crown, knuckle))
    u = sympy.Symbol("u", real=True)
    c = sympy.sqrt((L_ - k) ** 2 - (R - k) ** 2)
    u_join = k * c / (L_ - k)                 # similar triangles along the line of centres
    rho_knuckle = (R - k) + sympy.sqrt(k ** 2 - u ** 2)
    rho_crown = sympy.sqrt(L_ ** 2 - (u + c) ** 2)
    V = sympy.integrate(sympy.pi * rho_knuckle ** 2, (u, 0, u_join)) + \
        sympy.integrate(sympy.pi * rho_crown ** 2, (u, u_join, L_ - c))
    return float(L_ - c), float(V)


@pytest.mark.parametrize("head,crown,knuckle", [
    ("torispherical", 1.0, 0.06),       # flanged and dished, common practice
    ("torispherical-10", 1.0, 0.10),    # DIN 28011 proportions (from memory)
    ("torispherical-80", 0.8, 0.154),   # DIN 28013 proportions (from memory)
])
def test_torispherical_heads_against_sympy(head, crown, knuckle):
    spec = parse_head(head, D)
    assert (spec.crown, spec.knuckle) == pytest.approx((crown * D, knuckle * D))
    s = summarise(design_vessel(D, 1000.0, spec, spec))
    depth, volume = _torispherical_reference(D, crown * D, knuckle * D)
    assert s.heads[0].depth == pytest.approx(depth, rel=1e-13)
    assert s.heads[0].volume == pytest.approx(volume, rel=1e-12)   # sympy (exact integral)


def test_knuckle_is_tangent_to_shell_and_crown():
    v = vessel("torispherical:crown=1100,knuckle=12%")
    segs = [s for s in v.inside.segments if s.face == "head 2"]
    knuckle, crown = segs
    assert isinstance(knuckle, Arc) and isinstance(crown, Arc)

    def tangent(arc, point):
        dx, dy = point[0] - arc.centre[0], point[1] - arc.centre[1]
        t = (-dy, dx) if not arc.clockwise else (dy, -dx)
        n = math.hypot(*t)
        return (t[0] / n, t[1] / n)

    # at the shell: along the axis; at the join: the same direction on both arcs
    t0 = tangent(knuckle, knuckle.start)
    assert abs(t0[1]) < 1e-12 and t0[0] > 0
    t1, t2 = tangent(knuckle, knuckle.end), tangent(crown, crown.start)
    assert abs(t1[0] * t2[1] - t1[1] * t2[0]) < 1e-12 and t1[0] * t2[0] + t1[1] * t2[1] > 0
    # the crown meets the axis square (its centre is on the axis)
    assert crown.centre[1] == 0.0 and crown.end[1] == 0.0


def test_conical_heads():
    alpha = 30.0
    s = summarise(vessel(f"conical:angle={alpha}"))
    R = D / 2
    h = R / math.tan(math.radians(alpha))
    # CRC (from memory): cone V = π r² h/3, lateral area π r √(r² + h²)
    assert s.heads[0].depth == pytest.approx(h, rel=1e-14)
    assert s.heads[0].volume == pytest.approx(math.pi * R * R * h / 3, rel=1e-13)
    assert s.heads[0].inside_area == pytest.approx(math.pi * R * math.hypot(R, h), rel=1e-13)
    with_knuckle = summarise(vessel("conical:angle=45,knuckle=100"))
    assert with_knuckle.heads[0].volume > math.pi * R ** 3 / 3   # the knuckle adds metal-free room
    assert with_knuckle.heads[0].depth > R


def test_flat_heads_and_a_plain_cylinder():
    s = summarise(vessel("flat", length=1500.0))
    # CRC: cylinder V = π r² h, surface 2π r h + 2 π r²
    assert s.capacity == pytest.approx(math.pi * 500 ** 2 * 1500, rel=1e-14)
    assert s.inside_area == pytest.approx(2 * math.pi * 500 * 1500 + 2 * math.pi * 500 ** 2,
                                          rel=1e-14)
    assert s.heads[0].volume == 0.0 and s.heads[0].depth == 0.0


# -- impossible proportions -------------------------------------------------------------

@pytest.mark.parametrize("head,message", [
    ("torispherical:crown=400", "less than the shell radius"),
    ("torispherical:crown=500", "hemispherical head"),
    ("torispherical:knuckle=500", "not less than the shell radius"),
    ("torispherical:knuckle=0", "must be positive"),
    ("conical:angle=90", "flat head"),
    ("conical:angle=0", "between 0 and 90"),
    ("conical:angle=30,knuckle=-5", "must not be negative"),
])
def test_impossible_heads_are_refused(head, message):
    with pytest.raises(ProfileError, match=message):
        vessel(head)


def test_bad_head_text_is_refused():
    for text, message in (("dished", "unknown head"), ("conical", "needs its half-angle"),
                          ("flat:angle=3", "--head: a flat head takes no settings"),
                          ("ellipsoidal:crown=3", "--head: an ellipsoidal head takes no settings"),
                          ("hemispherical:angle=3", "--head: a hemispherical head takes no"),
                          ("conical:angle=30,crown=3", "--head: a conical head has no setting 'crown'"),
                          ("torispherical:crown", "key=value"),
                          ("conical:angle=30%", "not a percentage"),
                          ("torispherical:crown=big", "must be a number")):
        with pytest.raises(RevolveError, match=message):
            parse_head(text, D, place="--head")


def test_wall_limits():
    with pytest.raises(ProfileError, match="fold over"):
        vessel("ellipsoidal", thickness=130.0, dimensions="outside")
    with pytest.raises(ProfileError, match="knuckle would vanish"):
        vessel("torispherical", thickness=70.0, dimensions="outside")
    with pytest.raises(RevolveError, match="two flat heads"):
        vessel("flat", length=0.0)
    with pytest.raises(RevolveError, match="positive"):
        vessel("flat", thickness=-1.0)


# -- the wall: thickness, metal, masses, centres of mass -----------------------------------

def test_spherical_vessel_metal_mass_and_centre():
    t = 10.0
    s = summarise(vessel("hemispherical", length=0.0, thickness=t), metal_density=7850.0,
                  liquid_density=998.2)
    R = D / 2
    # CRC: sphere V = 4/3 π r³ (the wall is the difference of two)
    assert s.capacity == pytest.approx(4 / 3 * math.pi * R ** 3, rel=1e-13)
    assert s.metal_volume == pytest.approx(4 / 3 * math.pi * ((R + t) ** 3 - R ** 3), rel=1e-12)
    assert s.outside_area == pytest.approx(4 * math.pi * (R + t) ** 2, rel=1e-13)
    assert s.metal_mass == pytest.approx(7850.0 * s.metal_volume * 1e-9, rel=1e-14)
    assert s.liquid_mass == pytest.approx(998.2 * s.capacity * 1e-9, rel=1e-14)
    assert abs(s.centre_of_mass_full) < 1e-9 and abs(s.centre_of_mass_empty) < 1e-9


def test_flat_ended_drum_centre_of_mass_by_hand():
    # Flat plates of thickness t at z = -t..0 and L..L+t, shell r = R..R+t over z = 0..L
    # (inside dimensions): centre of mass by parts (common sense: symmetric) and, for a
    # drum with a flat bottom but a hemispherical top, moved towards the top.
    R, L, t = 500.0, 1200.0, 8.0
    s = summarise(design_vessel(2 * R, L, HeadSpec("flat"), HeadSpec("flat"), thickness=t))
    plate = math.pi * (R + t) ** 2 * t
    shell = math.pi * ((R + t) ** 2 - R ** 2) * L
    assert s.metal_volume == pytest.approx(2 * plate + shell, rel=1e-13)   # CRC: cylinders
    assert s.centre_of_mass_empty == pytest.approx(L / 2, rel=1e-13)
    assert s.outside_length == pytest.approx(L + 2 * t)
    s2 = summarise(design_vessel(2 * R, L, HeadSpec("flat"), HeadSpec("hemispherical"),
                                thickness=t), metal_density=7850.0, liquid_density=1000.0)
    # the liquid: a cylinder (centre L/2) and a half ball (centre 3R/8 above its base; Beer &
    # Johnston, table of centroids, from memory)
    v_cyl, v_half = math.pi * R * R * L, 2 / 3 * math.pi * R ** 3
    want = (v_cyl * L / 2 + v_half * (L + 3 * R / 8)) / (v_cyl + v_half)
    assert s2.centre_of_mass_liquid == pytest.approx(want, rel=1e-13)
    assert s2.centre_of_mass_full == pytest.approx(
        (s2.metal_mass * s2.centre_of_mass_empty + s2.liquid_mass * want) / s2.mass_full, rel=1e-12)


@pytest.mark.parametrize("head", ["hemispherical", "torispherical", "torispherical-80",
                                  "conical:angle=40,knuckle=120"])
def test_outside_dimensions_are_the_inside_ones_offset(head):
    # With outside dimensions and wall t, the inside surface is the head with every radius
    # (diameter/2, crown, knuckle) t smaller — circles offset stay circles on the same centres.
    t = 12.0
    outside = parse_head(head, D)
    inside = HeadSpec(outside.kind,
                      crown=None if outside.crown is None else outside.crown - t,
                      knuckle=None if outside.knuckle is None else max(outside.knuckle - t, 0.0),
                      angle=outside.angle)
    a = summarise(design_vessel(D, 1500.0, outside, outside, thickness=t, dimensions="outside"))
    b = summarise(design_vessel(D - 2 * t, 1500.0, inside, inside))
    assert a.capacity == pytest.approx(b.capacity, rel=1e-12)
    assert a.inside_area == pytest.approx(b.inside_area, rel=1e-12)


def test_ellipsoidal_wall_against_scipy():
    # The outside of a 2:1 head of inside dimensions is the ellipse's parallel curve at
    # distance t; its volume beyond the tangent line by scipy.integrate.quad of π ρ² du/dτ.
    from scipy.integrate import quad

    R, t = D / 2, 10.0
    a_u, a_r = R / 2, R

    def u(tau):
        n = math.hypot(a_r * math.cos(tau), a_u * math.sin(tau))
        return a_u * math.cos(tau) + t * a_r * math.cos(tau) / n

    def rho(tau):
        n = math.hypot(a_r * math.cos(tau), a_u * math.sin(tau))
        return a_r * math.sin(tau) + t * a_u * math.sin(tau) / n

    def du(tau, h=1e-6):
        return (u(tau + h) - u(tau - h)) / (2 * h)

    outer_head = quad(lambda tau: -math.pi * rho(tau) ** 2 * du(tau), 0, math.pi / 2,
                      epsabs=0, epsrel=1e-11, limit=200)[0]
    inner_head = math.pi * D ** 3 / 24
    L = 1000.0
    shell = math.pi * ((R + t) ** 2 - R ** 2) * L
    s = summarise(vessel("ellipsoidal", length=L, thickness=t))
    assert s.metal_volume == pytest.approx(2 * (outer_head - inner_head) + shell, rel=1e-8)
    assert s.heads[0].depth_outside == pytest.approx(D / 4 + t)


# -- profiles written and read back ---------------------------------------------------------

@pytest.mark.parametrize("orientation", ["vertical", "horizontal"])
def test_written_profile_measures_the_same(orientation, tmp_path):
    from revolve.geometry.measure import measure
    from revolve.geometry.profile import Revolution

    v = design_vessel(D, 2000.0, parse_head("ellipsoidal", D), parse_head("torispherical-10", D),
                     thickness=6.0)
    s = summarise(v)
    for which, want in (("inside", s.capacity), ("wall", s.metal_volume)):
        prof, axis = sketch_profile(v, orientation, which, name=describe(v))
        path = tmp_path / f"{which}.toml"
        path.write_text(profile_text(prof, axis=axis, angle=360), encoding="utf-8")
        doc = load_profile(str(path))
        m = measure(Revolution(doc.profile, doc.axis), symbolic=False)
        assert m.volume == pytest.approx(want, rel=1e-13)
    if orientation == "vertical":   # the bottom head is at the bottom: level 0 there
        inside = load_profile(str(tmp_path / "inside.toml"))
        space = liquid_space(inside.profile, inside.axis)
        head1 = table_at_levels(space, [s.heads[0].depth]).volume[0]
        assert head1 == pytest.approx(math.pi * D ** 3 / 24, rel=1e-12)


EXAMPLES = {
    "vessel-diesel-day-tank.toml": ("ellipsoidal", "ellipsoidal", 1200.0, 2400.0, "horizontal"),
    "vessel-rainwater-tank.toml": ("torispherical-10", "conical:angle=75", 2400.0, 2000.0,
                                   "vertical"),
}


@pytest.mark.parametrize("name", sorted(EXAMPLES))
def test_examples_are_what_the_builder_writes(name):
    h1, h2, Dv, L, orientation = EXAMPLES[name]
    path = ROOT / "profiles" / name
    doc = load_profile(str(path))
    v = design_vessel(Dv, L, parse_head(h1, Dv), parse_head(h2, Dv))
    prof, axis = sketch_profile(v, orientation, name=doc.name)
    assert profile_text(prof, axis=axis, angle=360, section="space",
                        orientation=orientation) == path.read_text(encoding="utf-8")


def test_diesel_day_tank_capacity():
    doc = load_profile(str(ROOT / "profiles" / "vessel-diesel-day-tank.toml"))
    space = liquid_space(doc.profile, doc.axis, orientation="horizontal")
    R, L = 600.0, 2400.0
    # CRC: cylinder π R² L; two 2:1 heads 2 · π D³/24 (spheroid; 2:1 common practice)
    assert space.capacity == pytest.approx(math.pi * R * R * L + 2 * math.pi * (2 * R) ** 3 / 24,
                                           rel=1e-13)


# -- properties --------------------------------------------------------------------------

HEADS = st.sampled_from(["flat", "hemispherical", "ellipsoidal", "torispherical",
                         "torispherical-10", "torispherical-80", "conical:angle=35",
                         "conical:angle=60,knuckle=8%"])


@settings(max_examples=30, deadline=None)
@given(st.floats(100.0, 5000.0), st.one_of(st.just(0.0), st.floats(0.01, 3.0)), HEADS, HEADS,
       st.one_of(st.none(), st.floats(0.001, 0.05)), st.sampled_from(["inside", "outside"]))
def test_any_vessel_adds_up(Dv, length_ratio, h1, h2, t_ratio, dimensions):
    L = Dv * length_ratio
    t = None if t_ratio is None else Dv * t_ratio
    # two flat heads need a shell; with outside dimensions a flat plate (or a cone without a
    # knuckle) reaches into the shell, which must then be long enough for it
    assume(not (h1 == h2 == "flat" and L <= 2 * (t or 0) + 1e-6 * Dv))
    try:
        v = design_vessel(Dv, L, parse_head(h1, Dv), parse_head(h2, Dv), thickness=t,
                         dimensions=dimensions)
    except ProfileError as e:
        assert "overlap" in str(e) and dimensions == "outside" and L < 2 * t
        return
    s = summarise(v, metal_density=7850.0, liquid_density=1000.0)
    parts = s.heads[0].volume + s.shell_volume + s.heads[1].volume
    assert parts == pytest.approx(s.capacity, rel=1e-12)
    assert s.crosscheck_difference <= 1e-9
    Ri = v.inside_diameter / 2
    if dimensions == "inside":   # (outside: flat plates and mitred cones reach into the shell)
        assert s.shell_volume == pytest.approx(math.pi * Ri * Ri * L, rel=1e-9,
                                               abs=1e-9 * s.capacity)
    if t is not None:
        assert s.metal_volume > 0 and s.outside_area > s.inside_area
        assert s.mass_full == pytest.approx(s.metal_mass + s.liquid_mass)
        lo, hi = v.outside_poles
        assert lo <= s.centre_of_mass_full <= hi


def test_vertical_sketch_is_the_mirror_of_the_frame_by_the_segment_contract():
    # Drawing a vessel upright swaps (z, r) into (x, y): a mirror, which reverses every arc's
    # turn (common practice, no source); curves keep their base expressions (no new compile).
    import numpy as np

    v = design_vessel(D, 1500.0, parse_head("ellipsoidal", D), parse_head("torispherical", D),
                     thickness=8.0)
    for which in ("inside", "wall"):
        frame = (v.inside if which == "inside" else v.wall).segments
        sketch, _ = sketch_profile(v, "vertical", which)
        for a, b in zip(frame, sketch.loops[0].segments):
            assert type(a) is type(b)
            ts = np.linspace(*a.parameter_range(), 5)
            assert np.allclose(a.points_at(ts)[:, ::-1], b.points_at(ts), rtol=1e-12, atol=1e-9)
            if isinstance(a, Arc):
                assert b.clockwise is (not a.clockwise)
                assert b.centre == (a.centre[1], a.centre[0])
            if isinstance(a, Curve):
                assert b.base_x is a.base_x and b.base_y is a.base_y


# -- the library's job: revolve.build_vessel (issue 11) --------------------------------------

def test_build_vessel_takes_lengths_with_units_and_densities_with_units():
    import revolve

    r = revolve.build_vessel("4 ft", "6 ft", head="hemispherical", units="in",
                             thickness="1/4 in", density="0.284 lb/in^3", liquid_density="1000")
    v = r.to_dict()["vessel"]
    R, L, t = 24.0, 72.0, 0.25
    # CRC (from memory): cylinder π R² L plus a sphere 4/3 π R³; hollow cylinder and spherical
    # shell for the metal; 1 US gal = 231 in³, 1 lb = 0.45359237 kg, 1 in = 0.0254 m (exact)
    assert r.units.unit("capacity") == "US gal" and r.units.unit("mass") == "lb"
    assert v["capacity"] == pytest.approx((math.pi * R * R * L + 4 / 3 * math.pi * R ** 3) / 231,
                                          rel=1e-13)
    metal_in3 = math.pi * ((R + t) ** 2 - R ** 2) * L + 4 / 3 * math.pi * ((R + t) ** 3 - R ** 3)
    assert v["metal_mass"] == pytest.approx(0.284 * metal_in3, rel=1e-9)
    liquid_m3 = (math.pi * R * R * L + 4 / 3 * math.pi * R ** 3) * 0.0254 ** 3
    assert v["liquid_mass"] == pytest.approx(1000 * liquid_m3 / 0.45359237, rel=1e-12)


@pytest.mark.parametrize("kwargs,expected", [
    (dict(diameter="big"), "diameter: 'big' is not a length"),
    (dict(head=None), "head: give the heads"),
    (dict(head="torispherical:crown=400"), "head: head 1: the crown radius 400"),
    (dict(volume_unit="mm"), "volume_unit: 'mm' is a length unit"),
    (dict(density="7850"), "density: the metal's mass needs a wall thickness"),
])
def test_build_vessel_errors_name_the_setting(kwargs, expected):
    import revolve

    settings = dict(diameter=1000, length=1500, head="flat")
    settings.update(kwargs)
    with pytest.raises(revolve.RevolveError) as err:
        revolve.build_vessel(**settings)
    assert str(err.value).startswith(expected) and "\n" not in str(err.value)
