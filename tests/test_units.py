"""Tests of revolve.units: the fast table against pint and the unit definitions.

Outside references, named beside each check:

* reference library: pint (``UnitRegistry.Quantity(...).to(...)``), for every
  fast-path factor, to 1e-12 relative;
* unit definitions, exact: 1 in = 25.4 mm (international yard and pound
  agreement, 1959); 1 US gal = 231 in³ (US customary definition);
  1 imperial gal = 4.54609 L (UK Weights and Measures Act 1985);
  1 oil barrel = 42 US gal (common practice); 1 lb = 0.45359237 kg
  (international yard and pound agreement, 1959).
"""

from __future__ import annotations

import math
import subprocess
import sys
from fractions import Fraction
from pathlib import Path

import numpy as np
import pytest

from revolve.errors import RevolveError, UnitError
from revolve.units import (KINDS, SI_UNITS, canonical, convert, exact_factor,
                           factor, fast_units, parse_quantity, registry)

ROOT = Path(__file__).resolve().parents[1]

# pint's name for each display unit of the fast table. Written out here, not
# taken from revolve.units, so that the module's own mapping is checked too.
PINT_NAME = {
    "mm": "millimeter", "cm": "centimeter", "dm": "decimeter", "m": "meter",
    "km": "kilometer", "µm": "micrometer", "in": "inch", "ft": "foot",
    "yd": "yard", "mil": "thou", "L": "liter", "mL": "milliliter",
    "US gal": "US_liquid_gallon", "imp gal": "imperial_gallon",
    "bbl": "oil_barrel", "kg": "kilogram", "g": "gram", "mg": "milligram",
    "t": "metric_ton", "lb": "pound", "s": "second", "min": "minute",
    "h": "hour",
}
PINT_SI = {"length": "meter", "area": "meter**2", "volume": "meter**3",
           "mass": "kilogram", "density": "kilogram/meter**3",
           "time": "second"}


def pint_expression(display: str) -> str:
    """pint unit expression for a display spelling such as 'lb/in³'."""
    if "/" in display:
        top, bottom = display.split("/")
        return f"({pint_expression(top)}) / ({pint_expression(bottom)})"
    if display[-1] in "²³":
        return f"({PINT_NAME[display[:-1]]})**{'²³'.index(display[-1]) + 2}"
    return PINT_NAME[display]


def kind_of_spelling() -> dict[str, str]:
    kinds: dict[str, str] = {}
    for kind in KINDS:
        for spelling in fast_units(kind):
            assert spelling not in kinds, f"{spelling} is in two kinds"
            kinds[spelling] = kind
    return kinds


ALL_SPELLINGS = sorted(kind_of_spelling().items())


@pytest.mark.parametrize("spelling, kind", ALL_SPELLINGS)
def test_every_fast_factor_agrees_with_pint(spelling, kind):
    # reference library: pint, Quantity(1, unit).to(SI unit), 1e-12 relative
    ureg = registry()
    expected = ureg.Quantity(1.0, ureg.parse_units(
        pint_expression(canonical(spelling)))).to(PINT_SI[kind]).magnitude
    assert math.isclose(factor(spelling, kind), expected, rel_tol=1e-12)


def test_fast_table_covers_every_kind_and_the_brief():
    kinds = dict(ALL_SPELLINGS)
    wanted = {
        "length": ["mm", "cm", "m", "um", "µm", "in", "ft", "millimetre",
                   "millimeter", "inch", "foot"],
        "area": ["mm^2", "m^2", "in^2", "ft^2", "cm^2"],
        "volume": ["m^3", "mm^3", "cm^3", "L", "l", "litre", "liter", "mL",
                   "gal", "usgal", "US_gallon", "impgal", "imperial_gallon",
                   "bbl", "oil_barrel", "in^3", "ft^3"],
        "mass": ["kg", "g", "t", "lb"],
        "density": ["kg/m^3", "g/cm^3", "lb/in^3", "lb/ft^3"],
        "time": ["s", "min", "h"],
    }
    for kind, spellings in wanted.items():
        for spelling in spellings:
            assert exact_factor(spelling, kind) is not None, spelling
            if "µ" not in spelling:
                assert kinds.get(spelling, kind) == kind


# --- exact definitions -------------------------------------------------------

def test_inch_is_25_4_mm_exactly():
    # international yard and pound agreement, 1959
    assert exact_factor("in", "length") == Fraction(254, 10_000)
    assert convert(1.0, "in", "mm", "length") == 25.4
    assert exact_factor("ft", "length") == 12 * exact_factor("in", "length")
    assert exact_factor("yd", "length") == 36 * exact_factor("in", "length")
    assert exact_factor("mil", "length") == exact_factor("in", "length") / 1000


def test_pound_is_0_45359237_kg_exactly():
    # international yard and pound agreement, 1959
    assert exact_factor("lb", "mass") == Fraction(45_359_237, 100_000_000)
    assert convert(1.0, "lb", "kg", "mass") == 0.45359237


def test_us_gallon_is_231_cubic_inches_exactly():
    # US customary definition; 1 in = 25.4 mm (1959 agreement)
    inch = Fraction(254, 10_000)
    assert exact_factor("in^3", "volume") == inch ** 3
    assert exact_factor("US_gallon", "volume") == 231 * inch ** 3
    assert exact_factor("gal", "volume") == exact_factor("usgal", "volume")
    assert convert(1.0, "gal", "in^3", "volume") == 231.0


def test_imperial_gallon_is_4_54609_litres_exactly():
    # UK Weights and Measures Act 1985; litre = cubic decimetre (SI, from memory)
    assert exact_factor("L", "volume") == exact_factor("dm^3", "volume")
    assert exact_factor("imperial_gallon", "volume") == \
        Fraction(454_609, 100_000) * exact_factor("L", "volume")
    assert convert(1.0, "impgal", "L", "volume") == 4.54609


def test_oil_barrel_is_42_us_gallons_exactly():
    # common practice
    assert exact_factor("bbl", "volume") == 42 * exact_factor("gal", "volume")
    assert convert(1.0, "oil_barrel", "US_gallon", "volume") == 42.0


def test_pint_bbl_is_not_what_the_fast_path_means():
    # reference library: pint calls a 31.5 US gal barrel 'bbl'; ours is the
    # oil barrel, so pint must never see the bare word
    ureg = registry()
    assert ureg.Quantity(1, "bbl").to("gallon").magnitude == pytest.approx(31.5)
    assert parse_quantity("1/2 bbl", "volume") == pytest.approx(
        21 * factor("gal", "volume"), rel=1e-12)


def test_coverage_of_one_us_gallon_at_one_mil():
    # derived from unit definitions (CHECKS.md, coatings): 231 in³ / 0.001 in
    # / 144 = 1604.17 ft² per US gal at 1 mil and 100 % solids
    coverage = (factor("gal", "volume") / factor("mil", "length")
                / factor("ft^2", "area"))
    assert math.isclose(coverage, 231 / 0.001 / 144, rel_tol=1e-12)
    assert round(coverage, 2) == 1604.17


# --- spellings ------------------------------------------------------------------

@pytest.mark.parametrize("spelling", ["mm2", "mm^2", "mm²", "mm**2",
                                      " mm ^ 2 ", "millimetre^2"])
def test_area_spellings(spelling):
    assert exact_factor(spelling, "area") == Fraction(1, 1_000_000)
    assert canonical(spelling) == "mm²"


@pytest.mark.parametrize("spelling", ["um", "µm", "μm", "micron", "Micrometre"])
def test_micrometre_spellings(spelling):
    # µ (micro sign) and μ (Greek mu) are different characters
    assert exact_factor(spelling, "length") == Fraction(1, 1_000_000)
    assert canonical(spelling) == "µm"


@pytest.mark.parametrize("spelling, display", [
    ("Millimetre", "mm"), ("MILLIMETERS", "mm"), ("INCH", "in"),
    ("feet", "ft"), ("l", "L"), ("ml", "mL"), ("US gal", "US gal"),
    ("UK_gallon", "imp gal"), ("kg/m3", "kg/m³"), ("g / cm³", "g/cm³"),
    ("lb/ft**3", "lb/ft³"), ("tonne", "t"), ("lbs", "lb"), ("hr", "h"),
])
def test_names_and_display(spelling, display):
    assert canonical(spelling) == display


def test_symbols_are_case_sensitive():
    # 'Mm' is a megametre to pint, 'MM' is not a length at all
    assert factor("Mm", "length") == pytest.approx(1e6, rel=1e-12)
    with pytest.raises(UnitError, match="'MM'"):
        factor("MM", "length")


def test_density_combinations():
    # 1 g/cm³ = 1000 kg/m³, from the metric prefixes
    assert factor("g/cm^3", "density") == 1000.0
    assert factor("kg/L", "density") == 1000.0
    assert factor("t/m^3", "density") == 1000.0
    # 1 lb/in³ from the 1959 definitions of the inch and the pound
    assert math.isclose(factor("lb/in^3", "density"),
                        0.45359237 / 0.0254 ** 3, rel_tol=1e-15)
    assert math.isclose(factor("lb/ft^3", "density"),
                        0.45359237 / (12 * 0.0254) ** 3, rel_tol=1e-15)


# --- pint fallback ------------------------------------------------------------------

def test_pint_fallback_matches_fast_path():
    # the same unit reached two ways: pint's expression vs the exact table
    assert math.isclose(factor("foot * inch", "area"),
                        12 * factor("in^2", "area"), rel_tol=1e-12)
    assert math.isclose(factor("kilogram / m**3", "density"), 1.0,
                        rel_tol=1e-12)
    assert math.isclose(factor("pound / US_liquid_gallon", "density"),
                        factor("lb/gal", "density"), rel_tol=1e-12)
    assert exact_factor("furlong", "length") is None


def test_pint_fallback_checks_the_dimension():
    with pytest.raises(UnitError, match="'newton' is not a length unit"):
        factor("newton", "length")
    with pytest.raises(UnitError, match="'furlong' is not an area unit"):
        factor("furlong", "area")


def test_registry_is_shared():
    import pint

    assert registry() is registry()
    assert isinstance(registry(), pint.UnitRegistry)


# --- errors --------------------------------------------------------------------------

def test_wrong_kind_names_both_kinds():
    with pytest.raises(UnitError, match="'kg' is a mass unit, not a length unit"):
        factor("kg", "length")
    with pytest.raises(UnitError, match="'in' is a length unit, not a volume"):
        convert(1.0, "in", "L", "volume")


@pytest.mark.parametrize("typo, kind, hint", [
    ("mmm", "length", "'mm'"), ("inchez", "length", "'inches'"),
    ("kg/m4", "density", "'kg/m^3'"), ("litrs", "volume", "'litre'"),
    ("kg/m^4", "density", "kg/m^3"),     # known to pint, wrong dimension
    ("parsec", "volume", "m^3, L"),      # nothing close: the common units
])
def test_unknown_unit_suggests_close_ones(typo, kind, hint):
    with pytest.raises(UnitError) as info:
        factor(typo, kind)
    message = str(info.value)
    assert f"'{typo}'" in message
    assert hint in message


@pytest.mark.parametrize("word", ["gallon", "gallons", "barrel", "ton", "Tons",
                                  "pint", "quart"])
def test_ambiguous_names_are_refused(word):
    kind = "mass" if word.lower().startswith("ton") else "volume"
    with pytest.raises(UnitError, match="ambiguous"):
        factor(word, kind)
    with pytest.raises(UnitError, match="ambiguous"):
        parse_quantity(f"1/2 {word}", kind)


def test_unit_error_is_a_revolve_error_with_location():
    with pytest.raises(RevolveError) as info:
        factor("parsec", "volume")
    located = info.value.located(file="tank.toml", line=4, place="[shell]")
    assert isinstance(located, UnitError)
    assert str(located).startswith("tank.toml:4: [shell]: 'parsec'")


def test_unknown_kind_is_a_programming_error():
    with pytest.raises(ValueError, match="kind must be one of"):
        factor("mm", "money")


def test_large_powers_are_refused_before_pint_evaluates_them():
    # pint evaluates integer powers exactly: 9**9**9 would not finish.
    # Run in a child process so that a regression fails instead of hanging.
    code = (
        "from revolve.units import parse_quantity, factor\n"
        "from revolve.errors import UnitError\n"
        "for call in (lambda: parse_quantity('9**9**9 m', 'length'),\n"
        "             lambda: parse_quantity('(9)^9^9 m', 'length'),\n"
        "             lambda: factor('m^9^9^9', 'area'),\n"
        "             lambda: factor('m^(9^9)', 'area')):\n"
        "    try:\n"
        "        call()\n"
        "    except UnitError:\n"
        "        pass\n"
        "    else:\n"
        "        raise SystemExit('accepted')\n"
        "print('refused')\n")
    result = subprocess.run([sys.executable, "-c", code], capture_output=True,
                            text=True, timeout=120, cwd=ROOT)
    assert result.stdout.strip() == "refused", result.stderr


# --- parse_quantity ---------------------------------------------------------------

@pytest.mark.parametrize("text, kind, expected", [
    ("7850 kg/m^3", "density", 7850.0),
    ("7.85 g/cm^3", "density", 7850.0),
    ("2.5 in", "length", 2.5 * 0.0254),
    ("2.5in", "length", 2.5 * 0.0254),
    (".5 in", "length", 0.5 * 0.0254),
    ("1e3 mm", "length", 1.0),
    ("-3 mm", "length", -0.003),
    ("12 mm²", "area", 12e-6),
    ("5 US gal", "volume", 5 * 231 * 0.0254 ** 3),
    ("2 imp gal", "volume", 2 * 4.54609e-3),
    ("90 min", "time", 5400.0),
    ("1/2 in", "length", 0.5 * 0.0254),             # pint expression path
    ("3 ft + 4 in", "length", 40 * 0.0254),         # pint expression path
    ("2 kg m^-3", "density", 2.0),                  # pint unit path
])
def test_parse_quantity(text, kind, expected):
    assert math.isclose(parse_quantity(text, kind), expected, rel_tol=1e-12)


def test_parse_quantity_default_unit():
    assert parse_quantity("12", "length", default_unit="in") == \
        pytest.approx(12 * 0.0254, rel=1e-15)
    assert parse_quantity("12 mm", "length", default_unit="in") == \
        pytest.approx(0.012, rel=1e-15)


@pytest.mark.parametrize("text, kind, match", [
    ("12", "length", "has no unit"),
    ("mm", "length", "has no number"),
    ("", "length", "no length given"),
    ("1,5 mm", "length", "decimal point"),
    ("2 mmm", "length", "did you mean 'mm'"),
    ("5 kg", "volume", "mass unit, not a volume unit"),
    ("2 N", "length", "'N' is not a length unit"),
    ("nan mm", "length", "has no number"),
    ("1e999 m", "length", "not a finite length"),
    ("abc", "length", "has no number"),
    ("1/2", "length", "has no unit"),
])
def test_parse_quantity_errors(text, kind, match):
    with pytest.raises(UnitError, match=match):
        parse_quantity(text, kind)


def test_convert_arrays_and_scalars():
    values = np.array([0.0, 1.0, 2.5])
    np.testing.assert_allclose(convert(values, "in", "mm", "length"),
                               [0.0, 25.4, 63.5], rtol=1e-15)
    assert isinstance(convert(1, "m", "mm", "length"), float)
    assert convert(1.0, "m^3", "L", "volume") == 1000.0
    # through pint on one side
    assert math.isclose(convert(1.0, "furlong", "m", "length"),
                        factor("furlong", "length"), rel_tol=1e-15)


def test_si_units_are_factor_one():
    for kind, unit in SI_UNITS.items():
        assert factor(unit, kind) == 1.0


# --- start-up cost -----------------------------------------------------------------

FAST_USE = (
    "import revolve.units as u\n"
    "u.factor('mm', 'length'); u.factor('mm²', 'area')\n"
    "u.convert(1.0, 'in', 'mm', 'length'); u.canonical('kg/m3')\n"
    "u.parse_quantity('7850 kg/m^3', 'density')\n"
    "u.parse_quantity('2.5 US gal', 'volume'); u.fast_units('density')\n"
    "try:\n"
    "    u.factor('kg', 'length')\n"
    "except u.UnitError:\n"
    "    pass\n"
)


def loaded_modules(code: str) -> set[str]:
    code += "import sys\nprint(' '.join(sorted(sys.modules)))\n"
    result = subprocess.run([sys.executable, "-c", code], capture_output=True,
                            text=True, timeout=120, cwd=ROOT, check=True)
    return set(result.stdout.split())


def test_fast_path_does_not_import_pint():
    modules = loaded_modules(FAST_USE)
    assert "revolve.units" in modules
    assert "pint" not in modules
    assert not {"numpy", "scipy", "sympy"} & modules


def test_fallback_does_import_pint():
    # the control for the test above: the check can see pint when it is used
    modules = loaded_modules("import revolve.units as u\n"
                             "u.factor('furlong', 'length')\n")
    assert "pint" in modules


# Family: unit text with line breaks, control characters or great length, as typed in an option.
@pytest.mark.parametrize("call", [
    lambda t: factor(t, "volume"), lambda t: canonical(t, "length"),
    lambda t: parse_quantity(t, "density"), lambda t: parse_quantity("5 " + t, "length"),
])
@pytest.mark.parametrize("text", ["x\ny", "gal\rlon", "\x1b[31mmm", "q" * 5000, "1" * 5000 + "\n"])
def test_messages_quote_what_was_typed_on_one_line(call, text):
    with pytest.raises(UnitError) as caught:
        call(text)
    message = str(caught.value)
    assert "\n" not in message and "\r" not in message and "\x1b" not in message
    assert len(message) < 400, message  # long text is shortened, not repeated in full


def test_bare_number_default_unit_for_densities():
    # A bare density option is kg/m³ (README); without a default a bare number stays an error.
    assert parse_quantity("7850", "density", default_unit="kg/m^3") == 7850.0
    with pytest.raises(UnitError, match="has no unit"):
        parse_quantity("7850", "density")


@pytest.mark.parametrize("unit, kind, words", [
    ("gallon", "length", "'gallon' is a volume unit, not a length unit"),
    ("gallons", "area", "'gallons' is a volume unit, not an area unit"),
    ("ton", "volume", "'ton' is a mass unit, not a volume unit"),
    ("gallon", "volume", "'gallon' is ambiguous"),   # US 231 in³ or imperial 4.54609 L (CHECKS.md)
    ("ton", "mass", "'ton' is ambiguous"),            # short, long or metric: common practice, no source
])
def test_an_ambiguous_name_of_the_wrong_kind_says_the_kind(unit, kind, words):
    """Bad input: the real mistake is named first (a volume name given for a length)."""
    with pytest.raises(UnitError) as exc:
        factor(unit, kind)
    assert words in str(exc.value)
