"""The output layer's shared core: numbers for people, units by trade, typed inputs, one overwrite rule."""

from __future__ import annotations

import os
import subprocess
import sys

import pytest
from hypothesis import example, given, strategies as st

from revolve.errors import RevolveError, FormatError
from revolve.inputs import parse_length, parse_list, parse_money
from revolve.jobs.results import Field, Result, Table, trade_units
from revolve.render import numbers, output

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


# -- numbers -----------------------------------------------------------------------------------

@pytest.mark.parametrize("value, shown", [
    (100.00000000000004, "100"), (0.9999999999999999, "1"), (2.5, "2.5"),
    (1234.56789, "1234.57"), (-0.000123456789, "-0.000123457"), (0.0, "0"),
])
def test_no_float_noise(value, shown):
    assert numbers.number(value) == shown


def test_grouping_follows_the_si_brochure():
    # SI brochure (BIPM, 9th ed., 5.4.4): digits may be grouped in threes by a thin space,
    # never by a comma or a point; a four-digit integer part need not be grouped.
    assert numbers.number(1234.0) == "1234"
    assert numbers.number(123456.0) == "123\u202f456"
    assert numbers.money(1234567.891) == "1\u202f234\u202f567.89"


@given(st.floats(allow_nan=False, allow_infinity=False, min_value=-1e300, max_value=1e300))
@example(100.00000000000004)
@example(1e-300)
def test_six_significant_figures_round_trip(value):
    # the figure read back is the value rounded to six significant figures (Python's own
    # '%.5e' rounding is the reference)
    shown = numbers.number(value).replace(numbers.GROUP, "")
    assert float(shown) == pytest.approx(float(f"{value:.5e}"), rel=1e-12, abs=0)


# -- units by trade ----------------------------------------------------------------------------

def test_trade_defaults():
    # 1 US gallon = 231 in³ (US customary definition) = 3.785411784 L
    vessel_in = trade_units("vessel", "in")
    assert vessel_in.unit("capacity") == "US gal"
    assert vessel_in.show(3.785411784e-3, "capacity") == pytest.approx(1.0, rel=1e-15)
    assert trade_units("vessel", "mm").unit("capacity") == "L"
    assert trade_units("coating", "mm").unit("area") == "m²"
    assert trade_units("part", "mm").unit("volume") == "mm³"


def test_a_refused_output_unit_names_its_option():
    with pytest.raises(RevolveError, match="^--volume-unit: 'kg' is a mass unit"):
        trade_units("vessel", "mm", {"capacity": "kg"}, options={"capacity": "--volume-unit"})


def test_json_has_metadata_once_and_rows_in_a_list():
    u = trade_units("vessel", "mm")
    t = Table("levels", "Levels", (Field("level", "level", "level"),
                                   Field("volume", "volume", "capacity")),
              ({"level": 0.0, "volume": 0.0}, {"level": 1.0, "volume": 1.0}))
    d = Result("levels", u, {"profile": "t.toml"}, (t,), cautions=("vessel",)).to_dict()
    assert d["units"] == {"level": "mm", "capacity": "L"}
    assert d["levels"] == [{"level": 0.0, "volume": 0.0}, {"level": 1000.0, "volume": 1000.0}]
    assert len(d["cautions"]) == 1 and all("cautions" not in row for row in d["levels"])


# -- typed inputs ------------------------------------------------------------------------------

@pytest.mark.parametrize("text, inches", [
    ("1/8 in", 0.125), ("3 1/2 in", 3.5), ("3-1/2 in", 3.5), ("3' 4 1/8\"", 40.125),
    ("3'", 36.0), ("4 1/8\"", 4.125), ("3 ft 4 in", 40.0), ("-1/4in", -0.25),
])
def test_lengths_as_inch_shops_write_them(text, inches):
    # 1 ft = 12 in (common practice, no source needed beyond the definition of the foot)
    assert parse_length(text).in_unit("in") == pytest.approx(inches, rel=1e-15)


@pytest.mark.parametrize("text", ["", "1/0 in", "three", "1 kg", "1e999 mm", "1 2 in", "''"])
def test_bad_lengths_are_refused(text):
    with pytest.raises(RevolveError):
        parse_length(text)


@given(st.text(max_size=30))
@example("3' 4 1/8\"")
@example("9" * 300)
def test_any_text_gives_a_length_or_a_revolve_error(text):
    try:
        parse_length(text)
    except RevolveError:
        pass


def test_lists_and_money():
    assert parse_list("200,50,100", int) == [200, 50, 100]
    assert parse_money("EUR 12.5") == (12.5, "EUR")
    with pytest.raises(RevolveError, match="item 2 is empty"):
        parse_list("1,,2", int)


# -- one overwrite rule ------------------------------------------------------------------------

def test_existing_files_are_kept_without_force(tmp_path):
    a, b = tmp_path / "a.csv", tmp_path / "b.csv"
    a.write_text("old\n")
    with pytest.raises(FormatError, match="exists already; give --force"):
        output.write_outputs({str(b): ("new\n", "--csv"), str(a): ("new\n", "--json-file")},
                             force=False)
    assert a.read_text() == "old\n" and not b.exists()       # nothing written half-way
    output.write_outputs({str(a): ("new\n", "--csv")}, force=True)
    assert a.read_text() == "new\n"


# -- the command line --------------------------------------------------------------------------

def test_revolve_alone_prints_help_and_succeeds():
    env = dict(os.environ, PYTHONPATH=ROOT)
    r = subprocess.run([sys.executable, "-m", "revolve"], capture_output=True, text=True, env=env)
    assert r.returncode == 0 and "Usage" in r.stdout and "measure" in r.stdout
