"""Uncertainty of a gauge table from the head dimensions and the wall thickness (issue 13).

The model rebuilds the vessel with each dimension changed (revolve.jobs.gauge_table); the
GUM combination differentiates it. Outside references, named beside each check:

* CRC *Standard Mathematical Tables and Formulae* (from memory): cylinder π r² h; an
  ellipsoid of revolution with equatorial radius a and polar semi-axis c holds (4/3) π a² c,
  so a head (half of it) of diameter D and depth h holds (π/6) D² h;
* JCGM 100:2008 (GUM), 5.1.2 (law of propagation for uncorrelated inputs) and 4.3.7
  (rectangular a/√3), published;
* JCGM 101:2008 (GUM Supplement 1): a Monte Carlo run of the same model, numpy's random
  generator with a fixed seed as the independent computation; the tool's own model is drawn
  a few hundred times (each draw rebuilds and measures the vessel), and the draws are also
  put through the model's linearisation (JCGM 101 §8 compares the two propagations) so that
  the sampling error cancels in that comparison.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

import revolve
from revolve.errors import FormatError
from revolve.jobs.gauge_table import VesselDimensions, read_uncertainty, uncertainty_model
from revolve.jobs.gauging import Tolerance, combined_uncertainty


def _identity(levels_si, geometric_m3):
    return np.asarray(geometric_m3, dtype=float)


def _gum(dims, tolerances, levels_si=()):
    """The GUM result of the vessel's model (capacity first, then each level in metres)."""
    space = dims.space("vertical")
    model, values = uncertainty_model(dims, space, tilt=None, gauge_point=None,
                                      levels_si=np.asarray(levels_si, dtype=float),
                                      net=_identity, toleranced=tuple(tolerances))
    return model, values, combined_uncertainty(model, values, tolerances)


def _monte_carlo(model, values, tolerances, gum, draws, seed):
    """The capacity's standard deviation over rectangular draws (JCGM 101), and the same
    draws through the GUM linearisation y0 + Σ c_i (x_i − x_i0)."""
    rng = np.random.default_rng(seed)
    names = sorted(tolerances)
    x = {n: rng.uniform(values[n] - tolerances[n].half_width,
                        values[n] + tolerances[n].half_width, draws) for n in names}
    y = np.array([model(**dict(values, **{n: x[n][j] for n in names}))[0]
                  for j in range(draws)])
    linear = sum(gum.sensitivities[n][0] * (x[n] - values[n]) for n in names)
    return np.std(y, ddof=1), np.std(linear, ddof=1), y


# -- a vertical cylinder with 2:1 ellipsoidal heads --------------------------------------------

D, L = 1.2, 2.0                    # metres (the vessel is described in mm)
H = D / 4                          # 2:1 head: depth a quarter of the diameter (common practice)
ELLIPSOIDAL = VesselDimensions(1200.0, 2000.0, "ellipsoidal", "ellipsoidal", "mm")
ELLIPSOIDAL_TOLERANCES = {"diameter": Tolerance(0.004), "length": Tolerance(0.006),
                          "head_1_depth": Tolerance(0.005), "head_2_depth": Tolerance(0.005)}


def test_ellipsoidal_heads_sensitivities_against_the_closed_form():
    # V = π D² L/4 + (π/6) D² h1 + (π/6) D² h2 (CRC, from memory: cylinder and half spheroids)
    z = 0.9                                         # a level in the shell (0.3 m to 2.3 m)
    model, values, r = _gum(ELLIPSOIDAL, ELLIPSOIDAL_TOLERANCES, [z])
    assert values["head_1_depth"] == pytest.approx(H, rel=1e-12)
    capacity = math.pi * D ** 2 * L / 4 + 2 * math.pi / 6 * D ** 2 * H
    row = math.pi / 6 * D ** 2 * H + math.pi * D ** 2 / 4 * (z - H)
    assert r.value == pytest.approx([capacity, row], rel=1e-10)
    expected = {
        "diameter": [math.pi * D * L / 2 + math.pi / 3 * D * 2 * H,
                     math.pi / 3 * D * H + math.pi * D / 2 * (z - H)],
        "length": [math.pi * D ** 2 / 4, 0.0],
        # the bottom head deeper by dh lifts the shell: the row loses π D²/4 − π D²/6
        "head_1_depth": [math.pi / 6 * D ** 2, -math.pi * D ** 2 / 12],
        "head_2_depth": [math.pi / 6 * D ** 2, 0.0],
    }
    for name, c in expected.items():
        assert r.sensitivities[name] == pytest.approx(c, rel=1e-6, abs=1e-6), name
    u = {n: t.half_width / math.sqrt(3) for n, t in ELLIPSOIDAL_TOLERANCES.items()}
    combined = math.sqrt(sum((expected[n][0] * u[n]) ** 2 for n in u))
    assert r.standard_uncertainty[0] == pytest.approx(combined, rel=1e-6)
    assert r.largest[0][0] == "diameter"
    assert r.largest[1][0] == "diameter" and "head_2_depth" not in r.largest[1]


def test_ellipsoidal_heads_combined_against_monte_carlo():
    model, values, r = _gum(ELLIPSOIDAL, ELLIPSOIDAL_TOLERANCES)
    u = float(r.standard_uncertainty[0])
    # JCGM 101 on the closed form (the model checked above): 2·10⁵ draws, sampling error ~0.2 %
    rng = np.random.default_rng(101)
    n = 200_000
    x = {k: rng.uniform(values[k] - t.half_width, values[k] + t.half_width, n)
         for k, t in ELLIPSOIDAL_TOLERANCES.items()}
    v = (math.pi * x["diameter"] ** 2 * x["length"] / 4
         + math.pi / 6 * x["diameter"] ** 2 * (x["head_1_depth"] + x["head_2_depth"]))
    assert u == pytest.approx(np.std(v, ddof=1), rel=0.01)
    # JCGM 101 on the tool's own model (each draw rebuilds the vessel): 200 draws
    mc, linear, y = _monte_carlo(model, values, ELLIPSOIDAL_TOLERANCES, r, 200, 2008)
    assert mc == pytest.approx(linear, rel=0.005)          # the same draws, linearised
    assert mc == pytest.approx(u, rel=0.2)                 # 200 draws: ~5 % sampling error
    closed = (math.pi * D ** 2 * L / 4 + 2 * math.pi / 6 * D ** 2 * H)
    assert abs(np.mean(y) - closed) < 4 * u / math.sqrt(200)


def test_without_a_depth_tolerance_a_two_to_one_head_follows_the_diameter():
    # V = π D² L/4 + π D³/12 (two 2:1 heads, CRC/common practice): ∂V/∂D = π D L/2 + π D²/4
    model, values, r = _gum(ELLIPSOIDAL, {"diameter": Tolerance(0.004)})
    assert "head_1_depth" not in values
    assert r.sensitivities["diameter"][0] == pytest.approx(
        math.pi * D * L / 2 + math.pi * D ** 2 / 4, rel=1e-6)


# -- torispherical heads -------------------------------------------------------------------------

TORISPHERICAL = VesselDimensions(1000.0, 1500.0, "torispherical:crown=1000,knuckle=100",
                                 "torispherical:crown=1000,knuckle=100", "mm")
RADII = {"head_1_crown": Tolerance(0.030), "head_1_knuckle": Tolerance(0.010),
         "head_2_crown": Tolerance(0.030), "head_2_knuckle": Tolerance(0.010)}


def test_torispherical_radii_contribute_and_agree_with_monte_carlo():
    model, values, r = _gum(TORISPHERICAL, RADII)
    for name in RADII:
        c = r.sensitivities[name][0]
        assert math.isfinite(c) and c != 0.0, name
    # geometry: the head's depth h = Rc − √((Rc − rk)² − (R − rk)²) falls as the crown radius
    # Rc grows (a flatter dish) and rises with the knuckle radius rk, and so does its volume
    assert r.sensitivities["head_1_crown"][0] < 0 < r.sensitivities["head_1_knuckle"][0]
    assert r.sensitivities["head_1_crown"][0] == pytest.approx(
        r.sensitivities["head_2_crown"][0], rel=1e-6)
    u = float(r.standard_uncertainty[0])
    assert u > 0
    # JCGM 101 on the tool's model: 250 draws (~4.5 % sampling error of a standard deviation)
    mc, linear, _ = _monte_carlo(model, values, RADII, r, 250, 101)
    assert mc == pytest.approx(linear, rel=0.02)
    assert mc == pytest.approx(u, rel=0.15)


def test_torispherical_radii_in_a_level_table():
    # end to end: the library's level_table with the tolerances by their short names
    space = TORISPHERICAL.space("vertical")
    result = revolve.level_table(
        space.profile, orientation="vertical", axis="y", count=3, volume_unit="m^3",
        uncertainty={"vessel": {"diameter": "1000 mm", "length": "1500 mm",
                                "head": "torispherical:crown=1000,knuckle=100"},
                     "tolerance": {"crown": "30 mm", "knuckle": "10 mm"}})
    d = result.to_dict()
    _, _, r = _gum(TORISPHERICAL, RADII)
    assert d["space"]["capacity_uncertainty"] == pytest.approx(
        float(r.standard_uncertainty[0]), rel=1e-6)
    assert d["levels"][-1]["largest_contributor"].startswith("head_")
    assert any("head 1 crown radius" in n and "largest contributors" in n for n in d["notes"])


# -- wall thickness --------------------------------------------------------------------------------

def test_wall_thickness_of_a_vessel_given_by_its_outside_diameter():
    # flat heads, outside dimensions: the inside is (D − 2t) across and (L − 2t) long,
    # V = π (D − 2t)² (L − 2t)/4 (CRC, cylinder)
    Do, Lo, t = 1.0, 1.5, 0.010
    dims = VesselDimensions(1000.0, 1500.0, "flat", "flat", "mm", "outside", 10.0)
    tolerances = {"thickness": Tolerance(0.001), "diameter": Tolerance(0.002)}
    _, values, r = _gum(dims, tolerances)
    Di, Li = Do - 2 * t, Lo - 2 * t
    assert r.value[0] == pytest.approx(math.pi * Di ** 2 * Li / 4, rel=1e-10)
    assert r.sensitivities["thickness"][0] == pytest.approx(
        -math.pi * Di * Li - math.pi * Di ** 2 / 2, rel=1e-6)
    assert r.sensitivities["diameter"][0] == pytest.approx(math.pi * Di * Li / 2, rel=1e-6)
    # given by the inside diameter, the wall does not change the liquid space
    inside = VesselDimensions(1000.0, 1500.0, "flat", "flat", "mm", "inside", 10.0)
    _, _, r = _gum(inside, {"thickness": Tolerance(0.001)})
    assert r.sensitivities["thickness"][0] == pytest.approx(0.0, abs=1e-9)


def test_cone_angle_in_degrees():
    # a conical bottom of half-angle α under a cylinder: cone volume π R³/(3 tan α) (CRC)
    dims = VesselDimensions(1000.0, 1000.0, "conical:angle=60", "flat", "mm")
    _, values, r = _gum(dims, {"head_1_angle": Tolerance(1.0)})
    R, a = 0.5, math.radians(60.0)
    dcone = math.pi * R ** 3 / 3 * (-1 / math.sin(a) ** 2) * math.pi / 180   # per degree
    assert values["head_1_angle"] == 60.0
    assert r.sensitivities["head_1_angle"][0] == pytest.approx(dcone, rel=1e-6)


# -- refusals --------------------------------------------------------------------------------------

VESSEL = '[vessel]\ndiameter = "1200 mm"\nlength = "2400 mm"\nhead = "ellipsoidal"\n'


@pytest.mark.parametrize("text,expected", [
    (VESSEL + '[tolerance]\ncrown = "5 mm"\n',
     ":5: tolerance: crown: the vessel has no head crown radius (heads ellipsoidal, ellipsoidal)"),
    (VESSEL + '[tolerance]\nhead_1_knuckle = "5 mm"\n',
     ":5: tolerance: head_1_knuckle: the vessel has no head 1 knuckle radius (head 1 is "
     "ellipsoidal)"),
    (VESSEL + '[tolerance]\nthickness = "1 mm"\n',
     ":5: tolerance: thickness: the vessel has no wall thickness (no thickness in [vessel])"),
    ('[tolerance]\ndepth = "1 mm"\n',
     ":1: tolerance: depth: a tolerance of the depth needs the vessel's dimensions"),
    (VESSEL.replace("ellipsoidal", "conical:angle=30") + '[tolerance]\nangle = "1 mm"\n',
     ":5: tolerance: angle: '1 mm': give the tolerance of an angle in degrees"),
    (VESSEL + '[tolerance]\ndepth = "5 kg"\n', ":5: tolerance: depth: 'kg' is a mass unit"),
    (VESSEL + '[tolerance]\ndepth = "5 mm"\nhead_1_depth = "1 mm"\n',
     ":5: tolerance: head_1_depth: a tolerance of head 1 inside depth is given twice"),
    (VESSEL + 'head_1 = "flat"\n[tolerance]\ndepth = "5 mm"\n',
     ":1: vessel: head: give head (both ends) or head_1 and head_2, not both"),
    (VESSEL.replace("ellipsoidal", "torispherical:crown=400") + '[tolerance]\ncrown = "5 mm"\n',
     ":1: vessel: head 1: the crown radius 400 is less than the shell radius 600"),
    (VESSEL.replace("ellipsoidal", "torispherical") + '[tolerance]\ncrown = "700 mm"\n',
     ":5: tolerance: crown: the vessel cannot be built at 1200 mm − 700 mm (the crown radius 500 "
     "is less than the shell radius 600"),
    (VESSEL + '[tolerance]\ndepth = "0.3 m"\n',
     ":5: tolerance: depth: the vessel cannot be built at 300 mm − 300 mm (the depth must be "
     "positive)"),
    (VESSEL + '[tolerance]\nradius = "5 mm"\n',
     ":5: tolerance: no tolerance can be given for 'radius'"),
])
def test_refused_tolerances_name_the_file_and_the_key(tmp_path, text, expected):
    path = tmp_path / "tol.toml"
    path.write_text(text, encoding="utf-8")
    with pytest.raises(FormatError) as info:
        read_uncertainty(str(path))
    message = str(info.value)
    assert "\n" not in message
    assert message.startswith(str(path)) and expected in message, message
