"""Level tables of liquid spaces: vertical and horizontal, forward and inverse.

Outside references, named beside each check: the spherical cap and the
ellipsoidal cap for vertical bottoms (derived below), the paraboloid of
revolution, and trimesh — a triangle mesh of the liquid body, revolved with
``trimesh.creation.revolve`` and cut with ``Trimesh.slice_plane`` at the
level, whose volume and area must converge to ours as the mesh is refined.
Hypothesis checks that volume never decreases with level and that the
inverse returns the level it was given.
"""

from __future__ import annotations

import math
from pathlib import Path

import numpy as np
import pytest
import sympy
from hypothesis import given, settings
from hypothesis import strategies as st

from revolve.errors import ProfileError, RevolveError
from revolve.formats import load_profile
from revolve.geometry.profile import Axis, Chain, Loop, Profile
from revolve.geometry.segments import Arc, Curve, Line, arc_from_centre, curve_from_expressions
from revolve.jobs.levels import (MAX_ROWS, check_levels, level_for_percent, level_for_volume,
                                 table_at_levels, levels_by_count, levels_by_step, liquid_space)

ROOT = Path(__file__).resolve().parents[2]
T = sympy.Symbol("t", real=True)
EXAMPLES = sorted((ROOT / "profiles").glob("vessel-*.toml"))


def upright(points_r_z, **kw):
    """A chain drawn with the axis along y: points (r, z) from the axis round to the axis."""
    return Profile(chains=(Chain.from_points(points_r_z),), **kw)


def hemispherical_bottom_tank(R=1.0, H=2.0):
    """Vertical: a hemispherical bottom (centre at z = 0) and a flat top at z = H."""
    bottom = arc_from_centre((0.0, -R), (R, 0.0), (0.0, 0.0), clockwise=False)
    return Profile(chains=(Chain((bottom, Line((R, 0.0), (R, H)), Line((R, H), (0.0, H)))),))


def ellipsoidal_bottom_tank(R=0.6, a=0.3, H=1.0):
    """Vertical: a semi-ellipsoidal bottom, semi-axes R (radial) and a (axial), then a shell."""
    bottom = curve_from_expressions(R * sympy.sin(T), -a * sympy.cos(T), 0.0, math.pi / 2)
    return Profile(chains=(Chain((bottom, Line((R, 0.0), (R, H)), Line((R, H), (0.0, H)))),))


# -- the liquid space -----------------------------------------------------------------

def test_chain_and_loop_describe_the_same_space():
    chain = upright([(0, 0), (1, 0), (1, 2), (0, 2)])
    loop = Profile(loops=(Loop.from_points([(0, 0), (1, 0), (1, 2), (0, 2)]),))
    a = liquid_space(chain, Axis.y())
    b = liquid_space(loop, Axis.y())
    assert a.capacity == pytest.approx(b.capacity, rel=1e-15)
    assert a.capacity == pytest.approx(2 * math.pi, rel=1e-15)   # CRC: cylinder π r² h
    assert a.height == 2.0 and a.bottom == 0.0


def test_refusals_name_the_place():
    with pytest.raises(ProfileError, match="chain 1: the chain ends at"):
        liquid_space(upright([(0, 0), (1, 0), (1, 2)]), Axis.y())
    with pytest.raises(ProfileError, match="full revolution"):
        liquid_space(upright([(0, 0), (1, 0), (1, 2), (0, 2)]), Axis.y(), angle_degrees=180)
    with pytest.raises(RevolveError, match="vertical or horizontal"):
        liquid_space(upright([(0, 0), (1, 0), (1, 2), (0, 2)]), Axis.y(), orientation="sideways")
    space = liquid_space(upright([(0, 0), (1, 0), (1, 2), (0, 2)]), Axis.y())
    with pytest.raises(RevolveError, match="below the lowest"):
        check_levels(space, [-0.5])
    with pytest.raises(RevolveError, match="positive"):
        levels_by_step(space, -1.0)
    with pytest.raises(RevolveError, match="rows"):
        levels_by_step(space, 2.0 / (MAX_ROWS * 10))
    with pytest.raises(RevolveError, match="more than the capacity"):
        level_for_volume(space, [7.0])
    with pytest.raises(RevolveError, match="outside 0 to 100"):
        level_for_percent(space, [-1])


# -- vertical: published and derived formulas --------------------------------------------

def test_vertical_hemispherical_bottom_is_a_spherical_cap():
    R = 1.0
    space = liquid_space(hemispherical_bottom_tank(R), Axis.y())
    h = np.array([0.0, 0.1, 0.5, 1.0])
    t = table_at_levels(space, h)
    # CRC (from memory): spherical cap V = π h² (3r − h)/3, curved area 2 π r h
    assert np.allclose(t.volume, math.pi * h * h * (3 * R - h) / 3, rtol=1e-13, atol=1e-15)
    assert np.allclose(t.wetted_area, 2 * math.pi * R * h, rtol=1e-13, atol=1e-15)
    # above the bottom, the shell adds π R² per unit of level (CRC: cylinder)
    t2 = table_at_levels(space, [1.5])
    assert t2.volume[0] == pytest.approx(2 * math.pi / 3 + math.pi * 0.5, rel=1e-13)


def test_vertical_ellipsoidal_bottom():
    # An ellipsoidal bottom with semi-axes R (radial) and a (axial) is a ball of radius a
    # stretched radially by R/a. Stretching multiplies every volume by (R/a)², so the cap of
    # depth h holds (R/a)² · π h² (3a − h)/3 = π R² h² (3a − h)/(3a²) (sphere cap from CRC).
    R, a = 0.6, 0.3
    space = liquid_space(ellipsoidal_bottom_tank(R, a), Axis.y())
    for h in (0.05, 0.15, 0.3):
        v = table_at_levels(space, [h]).volume[0]
        assert v == pytest.approx(math.pi * R * R * h * h * (3 * a - h) / (3 * a * a), rel=1e-12)
    # the 2:1 head (a = R/2) below its tangent line: π D³/24 (CRC spheroid; 2:1 common practice)
    assert table_at_levels(space, [a]).volume[0] == pytest.approx(math.pi * (2 * R) ** 3 / 24,
                                                              rel=1e-12)


def test_vertical_flat_bottom_cone_roof_steps():
    # Cylinder r = 1 from z = 0 to 1, then a cone to a point at z = 2 (CRC: cylinder, frustum).
    space = liquid_space(upright([(0, 0), (1, 0), (1, 1), (0, 2)]), Axis.y())
    t = table_at_levels(space, [0.5, 1.0, 1.5, 2.0])
    r = 0.5
    want = [math.pi * 0.5, math.pi, math.pi + math.pi * 0.5 * (1 + r + r * r) / 3,
            math.pi + math.pi / 3]
    assert np.allclose(t.volume, want, rtol=1e-14)
    assert t.volume[-1] == pytest.approx(space.capacity, rel=1e-12)


def test_horizontal_cylinder_rows_and_percent():
    R, L = 1.0, 3.0
    space = liquid_space(Profile(loops=(Loop.from_points([(0, 0), (L, 0), (L, R), (0, R)]),)),
                         Axis.x(), orientation="horizontal")
    t = table_at_levels(space, levels_by_count(space, 4))
    # CRC (from memory): horizontal cylinder V = L (r² acos((r−h)/r) − (r−h) √(2rh − h²))
    want = [L * (R * R * math.acos((R - h) / R) - (R - h) * math.sqrt(2 * R * h - h * h))
            for h in t.level]
    assert np.allclose(t.volume, want, rtol=1e-13, atol=1e-15)
    assert t.percent[2] == pytest.approx(50.0, rel=1e-14)
    assert t.percent[-1] == pytest.approx(100.0, rel=1e-12)


# -- the bottom itself: the wetted area is its limit from above --------------------------------

def circular_segment(R, h):
    """CRC (from memory): area of a circular segment of height h, in mpmath (40 digits)."""
    import mpmath

    return R * R * mpmath.acos((R - h) / R) - (R - h) * mpmath.sqrt(2 * R * h - h * h)


@pytest.mark.parametrize("h", [0.0, 1e-9])
def test_flat_bottom_is_wetted_at_its_own_level_upright(h):
    # Convention: a flat face lying in the liquid's plane is wetted, so a flat bottom counts at
    # level 0 exactly as it does a hair above (once: 0 at level 0, the whole disc at 1 mm).
    # Upright cylinder R = 1: CRC (from memory) V = π R² h, wetted π R² + 2 π R h.
    R = 1.0
    space = liquid_space(upright([(0, 0), (R, 0), (R, 2), (0, 2)]), Axis.y(), orientation="vertical")
    t = table_at_levels(space, [h])
    assert t.volume[0] == pytest.approx(math.pi * R * R * h, rel=1e-14, abs=0.0)
    assert t.wetted_area[0] == pytest.approx(math.pi * R * R + 2 * math.pi * R * h, rel=1e-14,
                                             abs=0.0)


@pytest.mark.parametrize("h", [0.0, 1e-9])
def test_horizontal_bottom_line_has_no_area_at_level_0(h):
    # Lying down, nothing flat lies in the liquid's plane at the bottom: the end discs are
    # upright and the shell touches the plane along a line. So the wetted area is 0 at level 0
    # and grows continuously: the shell's wetted arc 2 R acos((R − h)/R) along L plus two
    # circular segments (CRC, from memory); the volume is L times the segment.
    import mpmath

    mpmath.mp.dps = 40
    R, L = 1.0, 2.0
    space = liquid_space(upright([(0, 0), (0, R), (L, R), (L, 0)]), Axis.x(),
                         orientation="horizontal")
    t = table_at_levels(space, [h])
    hh = mpmath.mpf(h)
    segment = circular_segment(R, hh)
    wetted = 2 * R * mpmath.acos((R - hh) / R) * L + 2 * segment
    if h == 0:
        assert t.volume[0] == 0.0 and t.wetted_area[0] == 0.0
    else:
        assert t.volume[0] == pytest.approx(float(L * segment), rel=1e-13, abs=0.0)
        assert t.wetted_area[0] == pytest.approx(float(wetted), rel=1e-13, abs=0.0)


def test_round_bottom_starts_from_nothing():
    # A hemispherical bottom touches the level-0 plane at one point: wetted area 0 there, and
    # the cap's 2 π R h just above (CRC, from memory), in the profile's own frame.
    space = liquid_space(hemispherical_bottom_tank(1.0), Axis.y(), orientation="vertical")
    t = table_at_levels(space, [0.0, 1e-9])
    h = (space.bottom + 1e-9) - space.bottom      # the height the float level really has
    assert t.wetted_area[0] == 0.0
    assert t.wetted_area[1] == pytest.approx(2 * math.pi * h, rel=1e-12, abs=0.0)


# -- trimesh: the liquid body as a triangle mesh, cut at the level -------------------------

def _frame_points(seg, n):
    """Points along a frame segment (our own flattening, from the segment's definition)."""
    if isinstance(seg, Line):
        return np.array([seg.start, seg.end])
    if isinstance(seg, Arc):
        a0, a1 = seg.angles()
        a = np.linspace(a0, a1, n + 1)
        return np.column_stack([seg.centre[0] + seg.radius * np.cos(a),
                                seg.centre[1] + seg.radius * np.sin(a)])
    if isinstance(seg, Curve):
        z, r, _, _ = seg.evaluate(np.linspace(seg.t_start, seg.t_end, n + 1))
        return np.column_stack([z, r])
    raise TypeError(type(seg).__name__)


def _meshes(space, n):
    """One closed trimesh per loop of the liquid space (axis = trimesh's z), +1 solid, -1 hole."""
    import trimesh

    out = []
    for segs, depth in zip(space.prepared.paths, space.prepared.depths):
        f = 1.0 if depth % 2 == 0 else -1.0
        pts = np.vstack([_frame_points(s, n)[:-1] for s in segs])
        pts = np.vstack([pts, pts[:1]])
        line = np.column_stack([pts[:, 1], pts[:, 0]])    # (r, z)
        area2 = np.sum(line[:-1, 0] * line[1:, 1] - line[1:, 0] * line[:-1, 1])
        if area2 < 0:                                     # counter-clockwise: normals out
            line = line[::-1]
        on_axis = np.abs(line[:, 0]) < 1e-12
        line[on_axis, 0] = 0.0
        # trimesh revolves an open line string: start and end on the axis where the loop
        # touches it, else (a hole) the closed ring itself
        if on_axis.any():
            k = int(np.flatnonzero(on_axis)[0])
            ring = np.vstack([line[k:-1], line[:k + 1]])
            ends = np.flatnonzero(np.abs(ring[:, 0]) < 1e-12)
            ring = ring[: ends[ends > 0][0] + 1] if (ends > 0).any() else ring
        else:
            ring = line
        out.append((trimesh.creation.revolve(ring, sections=4 * n), f))
    return out


def _mesh_volume_below(meshes, space, level):
    """Volume and area of the mesh part below the liquid surface (trimesh slice_plane)."""
    total_v = total_a = 0.0
    for mesh, f in meshes:
        m = mesh.copy()
        if space.orientation == "vertical":
            origin, normal = np.array([0, 0, space.bottom + level]), np.array([0, 0, -1.0])
        else:
            origin, normal = np.array([-space.r_max + level, 0, 0]), np.array([-1.0, 0, 0])
        # With the plane through the origin the missing cap adds nothing to the
        # divergence-theorem volume, so the open cut mesh gives the volume below.
        m.apply_translation(-origin)
        cut = m.slice_plane([0, 0, 0], normal, cap=False)
        total_v += f * abs(cut.volume) if cut is not None and len(cut.faces) else 0.0
        total_a += cut.area if cut is not None and len(cut.faces) else 0.0
    return total_v, total_a


@pytest.mark.parametrize("orientation", ["vertical", "horizontal"])
@pytest.mark.parametrize("name", ["vessel-brew-kettle.toml", "vessel-rainwater-tank.toml"])
def test_trimesh_reference_converges(orientation, name):
    doc = load_profile(str(ROOT / "profiles" / name))
    space = liquid_space(doc.profile, doc.axis, orientation=orientation)
    levels = np.array([0.17, 0.5, 0.83]) * space.height
    ours = table_at_levels(space, levels)
    errors = []
    for n in (12, 24, 48):
        meshes = _meshes(space, n)
        got = np.array([_mesh_volume_below(meshes, space, lv)[0] for lv in levels])
        errors.append(np.max(np.abs(got - ours.volume)) / space.capacity)
    # trimesh (reference library): the mesh converges to our table, about 4× per halving
    assert errors[0] > errors[1] > errors[2], errors
    assert errors[2] < 3e-3 and errors[1] / errors[2] > 2.5, errors


# -- the inverse and properties ------------------------------------------------------------

def test_inverse_of_the_examples_agrees_with_the_forward_table():
    for path in EXAMPLES:
        doc = load_profile(str(path))
        for orientation in ("vertical", "horizontal"):
            space = liquid_space(doc.profile, doc.axis, orientation=orientation)
            forward = table_at_levels(space, levels_by_step(space, space.height / 7))
            back = level_for_volume(space, forward.volume)
            assert np.max(np.abs(back.volume - forward.volume)) <= 1e-12 * space.capacity
            interior = (forward.level > 0) & (forward.level < space.height)
            assert np.allclose(back.level[interior], forward.level[interior], rtol=1e-9,
                               atol=1e-9 * space.height)
            assert forward.volume[-1] == pytest.approx(space.capacity, rel=1e-12)
            assert np.all(np.diff(forward.volume) > 0)


@settings(max_examples=30, deadline=None)
@given(st.floats(0.2, 2.0), st.floats(0.0, 3.0), st.sampled_from(["vertical", "horizontal"]),
       st.lists(st.floats(0.0, 1.0), min_size=2, max_size=10))
def test_properties_monotonic_and_round_trip(R, H, orientation, fractions):
    # A hemispherical bottom, a shell of height H and a cone roof of half the radius's height.
    bottom = arc_from_centre((0.0, -R), (R, 0.0), (0.0, 0.0), clockwise=False)
    segs = [bottom] + ([Line((R, 0.0), (R, H))] if H > 1e-3 else [])
    top = H if H > 1e-3 else 0.0
    segs.append(Line((R, top), (0.0, top + R / 2)))
    space = liquid_space(Profile(chains=(Chain(tuple(segs)),)), Axis.y(), orientation=orientation)
    levels = np.sort(np.array(fractions)) * space.height
    t = table_at_levels(space, levels)
    assert np.all(np.diff(t.volume) >= -1e-9 * space.capacity)
    inverse = level_for_volume(space, t.volume)
    assert np.max(np.abs(inverse.volume - t.volume)) <= 1e-11 * space.capacity
    percent = level_for_percent(space, [0.0, 37.5, 100.0])
    assert percent.percent[1] == pytest.approx(37.5, abs=1e-9)
    assert percent.level[0] == 0.0 and percent.level[-1] == pytest.approx(space.height)


# -- orientation: the option, else the file; never a guess (issue 9) ------------------------

@pytest.mark.parametrize("asked,written,expected", [
    (None, "horizontal", ("horizontal", "from the file")),
    (None, "vertical", ("vertical", "from the file")),
    ("vertical", None, ("vertical", "from --orientation")),
    ("horizontal", "horizontal", ("horizontal", "from --orientation")),
    ("vertical", "horizontal", ("vertical", "from --orientation; the file says horizontal")),
])
def test_choose_orientation_option_wins_over_the_file(asked, written, expected):
    from revolve.jobs.levels import choose_orientation

    assert choose_orientation(asked, written, option="--orientation") == expected


@pytest.mark.parametrize("asked,written", [(None, None), ("sideways", None), (None, "up")])
def test_choose_orientation_refuses_to_guess(asked, written):
    from revolve.errors import RevolveError
    from revolve.jobs.levels import choose_orientation

    with pytest.raises(RevolveError) as err:
        choose_orientation(asked, written, option="--orientation")
    assert str(err.value).startswith("--orientation: ") and "\n" not in str(err.value)


# -- the library's job: revolve.level_table (issue 11) ---------------------------------------

def _drum():
    # An upright drum, radius 10 in and 24 in high, drawn as the inside wall (a chain).
    return Profile(chains=(Chain.from_points([(0, 0), (10, 0), (10, 24), (0, 24)]),), unit="in",
                   name="drum")


def test_level_table_takes_the_options_strings_and_bare_numbers_in_the_level_unit():
    import revolve

    # CRC (from memory): cylinder π r² h; 1 US gal = 231 in³ (US customary definition)
    by_text = revolve.level_table(_drum(), orientation="vertical", axis="y",
                                  at="3 1/2 in,254 mm,1 ft")
    by_numbers = revolve.level_table(_drum(), orientation="vertical", axis="y", at=[3.5, 10, 12])
    assert by_text.to_dict()["levels"] == by_numbers.to_dict()["levels"]
    assert by_text.units.unit("capacity") == "US gal" and by_text.units.unit("area") == "ft²"
    for row in by_text.rows:
        assert row["volume"] == pytest.approx(math.pi * 100 * row["level"] / 231, rel=1e-13)


def test_level_table_inverse_by_volume_with_units():
    import revolve

    r = revolve.level_table(_drum(), orientation="vertical", axis="y",
                            volumes=["231 in^3", 2], volume_unit="US_gallon")
    # 231 in³ = 1 US gal fills π · 10² · h = 231 in³
    assert [row["level"] for row in r.rows] == pytest.approx([231 / (100 * math.pi),
                                                              462 / (100 * math.pi)], rel=1e-12)
    assert [row["volume_asked"] for row in r.rows] == pytest.approx([1.0, 2.0], rel=1e-14)


@pytest.mark.parametrize("kwargs,expected", [
    (dict(step="1/0 in"), "step: '1/0 in': a fraction cannot have 0 below the line"),
    (dict(at="30 in"), "at: level 30 in is above the full level 24 in"),
    (dict(volumes="2 m"), "volumes: 'm' is a length unit"),
    (dict(percent=[120]), "percent: 120 % is outside 0 to 100 %"),
    (dict(count=0), "count: the count must be 1 or more"),
    (dict(step=1, at=2), "at: give one of step, count, at, ullage, volumes and percent, not step and at"),
    (dict(orientation="sideways"), "orientation: give vertical or horizontal"),
])
def test_level_table_errors_name_the_setting(kwargs, expected):
    import revolve

    kwargs.setdefault("orientation", "vertical")
    with pytest.raises(revolve.RevolveError) as err:
        revolve.level_table(_drum(), axis="y", **kwargs)
    assert str(err.value).startswith(expected) and "\n" not in str(err.value)
