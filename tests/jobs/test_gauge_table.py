"""Gauge tables (revolve.jobs.gauge_table and the gauge settings of revolve.level_table).

Outside references beside each check: JCGM 100:2008 (GUM) against a Monte Carlo run
(JCGM 101:2008) through the library path, unit definitions for temperatures, the
definitions of the gauge datum (common practice, no source), CRC formulas.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

import revolve
from revolve.errors import RevolveError
from revolve.geometry.profile import Axis, Chain, Profile
from revolve.jobs.gauge_table import (make_gauge, parse_expansion, parse_temperature,
                                      read_uncertainty, step_levels)
from revolve.jobs.levels import liquid_space
from revolve.jobs.vessel import design_vessel, parse_head, sketch_profile


def _vessel(D, L, head="hemispherical"):
    design = design_vessel(D, L, parse_head(head, D), parse_head(head, D), unit="mm")
    return sketch_profile(design, "vertical")


def test_gum_against_monte_carlo_through_the_library():
    # JCGM 100:2008 (law of propagation) against JCGM 101:2008 (propagation of distributions):
    # an upright vessel with hemispherical heads, D ± 3 mm (rectangular), L ± 4 mm (normal,
    # k = 2), the gauge reading ± 2 mm (rectangular); rows in the bottom head, the shell and
    # the top head, where the volume is not linear in D
    D, L = 1200.0, 2000.0
    levels = np.array([150.0, 1500.0, 3000.0])
    profile, axis = _vessel(D, L)
    tolerance = {"vessel": {"diameter": f"{D} mm", "length": f"{L} mm", "head": "hemispherical"},
                 "tolerance": {"diameter": "3 mm",
                               "length": {"value": "4 mm", "distribution": "normal",
                                          "coverage": 2},
                               "reading": "2 mm"}}
    gum = revolve.level_table(profile, orientation="vertical", axis=axis, volume_unit="m^3",
                              at=[f"{h} mm" for h in levels], uncertainty=tolerance)
    u_rows = np.array([r["volume_uncertainty"] for r in gum.rows])
    u_cap = gum.to_dict()["space"]["capacity_uncertainty"]
    rng = np.random.default_rng(101)
    n = 800
    d = rng.uniform(D - 3, D + 3, n)
    length = rng.normal(L, 2.0, n)
    reading = rng.uniform(-2, 2, n)
    caps, rows = [], []
    for k in range(n):
        p, ax = _vessel(d[k], length[k])
        r = revolve.level_table(p, orientation="vertical", axis=ax, volume_unit="m^3",
                                at=[f"{h} mm" for h in levels + reading[k]])
        caps.append(r.capacity)
        rows.append([row["volume"] for row in r.rows])
    mc_rows = np.std(np.array(rows), axis=0, ddof=1)
    # 800 draws: the standard deviation's own sampling error is about 2.5 %; allow 3 times that
    assert u_rows == pytest.approx(mc_rows, rel=0.075)
    assert u_cap == pytest.approx(np.std(caps, ddof=1), rel=0.075)
    assert [r["largest_contributor"] for r in gum.rows] == ["reading", "diameter", "diameter"]


def test_gum_with_no_tolerance_of_the_dimensions_needs_no_vessel():
    # a reading tolerance alone: u(V) = |dV/dh| u(h) = π r² a/√3 in a cylinder (CRC π r² h;
    # GUM 4.3.7 rectangular)
    drum = Profile(chains=(Chain.from_points([(0, 0), (500, 0), (500, 2000), (0, 2000)]),),
                   unit="mm")
    r = revolve.level_table(drum, orientation="vertical", axis="y", at="1 m", volume_unit="m^3",
                            uncertainty={"tolerance": {"reading": "3 mm"}})
    assert r.rows[0]["volume_uncertainty"] == pytest.approx(
        math.pi * 0.25 * 0.003 / math.sqrt(3), rel=1e-6)
    assert r.to_dict()["space"]["capacity_uncertainty"] == 0.0


def test_temperatures_and_coefficients_with_their_units():
    # unit definitions: °F = 9/5 °C + 32, K = °C + 273.15
    assert parse_temperature("212 °F") == pytest.approx(100.0, abs=1e-12)
    assert parse_temperature("-40 degF") == pytest.approx(-40.0, abs=1e-12)
    assert parse_temperature("273.15 K") == pytest.approx(0.0, abs=1e-12)
    assert parse_temperature("20 °C") == 20.0
    assert parse_expansion("5e-6 /°F") == pytest.approx(9e-6, rel=1e-15)
    for text in ("20", "20 °X", "-500 K", "warm", "1e999 °C"):
        with pytest.raises(RevolveError):
            parse_temperature(text)
    for text in ("1e-5", "1e-5 /m", "2e-3 /K", "-1e-5 /K"):
        with pytest.raises(RevolveError):
            parse_expansion(text)


def test_step_levels_count_from_the_datum_plate():
    # innages of whole increments above the datum plate (common practice, no source)
    assert step_levels(0.0, 1.0, 0.25).tolist() == [0.0, 0.25, 0.5, 0.75, 1.0]
    assert step_levels(-0.05, 0.5, 0.2, origin=0.03).tolist() == [-0.05, 0.03, 0.23, 0.43, 0.5]
    assert step_levels(0.0, 0.1, 1.0).tolist() == [0.0, 0.1]
    with pytest.raises(RevolveError):
        step_levels(0.0, 1.0, 1e-9)


def test_gauge_point_of_an_upright_vessel_moves_the_level_zero():
    # a level read above an axis point 0.3 up a cylinder: V = π r² (h + 0.3) (CRC)
    drum = liquid_space(Profile(chains=(Chain.from_points([(0, 0), (1, 0), (1, 2), (0, 2)]),)),
                        Axis.y())
    g = make_gauge(drum, None, 0.3)
    v = g.forward([-0.3, 0.0, 1.0, 1.7])[0]
    assert v == pytest.approx(np.pi * np.array([0.0, 0.3, 1.3, 2.0]), rel=1e-14)
    assert g.inverse([np.pi * 1.3]) == pytest.approx([1.0], rel=1e-12)


def test_uncertainty_file_refusals(tmp_path):
    for text, words in (
            ('[tolerance]\ndiameter = "1 mm"\n', "needs the vessel's dimensions"),
            ('[vessel]\ndiameter = "1 m"\n[tolerance]\nreading = "1 mm"\n',
             "give the vessel's length"),
            ('[tolerance]\ntilt = "1 mm"\n', "in degrees"),
            ('[tolerance]\nreading = { value = "1 mm", distribution = "flat" }\n',
             "rectangular, triangular or normal"),
            ('[tolerance]\nreading = "-1 mm"\n', "not negative"),
            ('[tolerances]\nreading = "1 mm"\n', "unknown key 'tolerances'"),
            ("[tolerance]\n", "give the tolerances")):
        path = tmp_path / "u.toml"
        path.write_text(text, encoding="utf-8")
        with pytest.raises(RevolveError) as e:
            read_uncertainty(str(path))
        assert words in str(e.value) and str(path) in str(e.value) and "\n" not in str(e.value)
