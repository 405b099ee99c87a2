"""Tests of revolve.materials and the material table.

Outside references, named beside each check (see CHECKS.md, "Materials"):
CRC Handbook of Chemistry and Physics (from memory) for the pure elements and
water; common practice, no source, for the engineering alloys and plastics.
Unit conversions of densities are checked against the exact definitions of
the inch and the pound (international yard and pound agreement, 1959).
"""

from __future__ import annotations

import dataclasses
import math
import subprocess
import sys
from pathlib import Path

import pytest

from revolve.errors import MaterialError, RevolveError, UnitError
from revolve.materials import (GROUPS, Material, density_from_text,
                               find_material, load_materials, parse_materials)

ROOT = Path(__file__).resolve().parents[1]
CRC = "CRC Handbook of Chemistry and Physics (from memory)"
TRADE = "common practice, no source"


# --- the table against CHECKS.md ------------------------------------------------

@pytest.mark.parametrize("key, density, source", [
    ("water", 998.2, CRC),            # water, 20 °C: CRC Handbook (from memory)
    ("aluminium", 2700.0, CRC),       # CRC Handbook (from memory)
    ("copper", 8960.0, CRC),          # CRC Handbook (from memory)
    ("iron", 7874.0, CRC),            # CRC Handbook (from memory)
    ("titanium", 4506.0, CRC),        # CRC Handbook (from memory)
    ("lead", 11340.0, CRC),           # CRC Handbook (from memory)
    ("carbon_steel", 7850.0, TRADE),  # common practice, no source
    ("brass", 8440.0, TRADE),         # about 8440: common practice, no source
    ("grey_cast_iron", 7200.0, TRADE),  # about 7200: common practice, no source
])
def test_density_matches_the_reference(key, density, source):
    material = find_material(key)
    assert material.density == density
    assert material.reference == source


@pytest.mark.parametrize("key", ["stainless_304", "stainless_316"])
def test_austenitic_stainless_is_in_range(key):
    # austenitic stainless (18-8): 7900-8000, common practice, no source
    material = find_material(key)
    assert 7900.0 <= material.density <= 8000.0
    assert material.group == "stainless"
    assert material.reference.startswith(TRADE)


def test_every_row_names_an_allowed_source():
    handbook = {"water", "aluminium", "copper", "iron", "titanium", "lead"}
    for material in load_materials():
        if material.key in handbook:
            assert material.reference == CRC, material.key
        else:
            # anything not from the handbook list is a trade figure
            assert material.reference.startswith(TRADE), material.key


def test_sources_shown_to_users_carry_no_provenance_note():
    # issue 9: users read "Water … (CRC Handbook … (from memory))". The note stays in the
    # data (for the tests above); the source users read is plain, with no brackets.
    for material in load_materials():
        assert "memory" not in material.source and "(" not in material.source, material.key
    water = find_material("water")
    assert (water.source, water.note) == ("CRC Handbook of Chemistry and Physics", "from memory")


@pytest.mark.parametrize("command", [
    ["measure", "{profile}", "--material", "water"],
    ["vessel", "--diameter", "1000", "--length", "500", "--head", "flat", "--thickness", "5",
     "--material", "steel", "--liquid", "water"],
    ["turn", "{profile}", "--material", "aluminium"],
])
def test_command_output_shows_sources_plainly(command, capsys):
    from revolve.cli.app import main

    profile = str(ROOT / "profiles" / "turned-stepped-shaft.toml")
    with pytest.raises(SystemExit) as exc:
        main([a.format(profile=profile) for a in command])
    out, err = capsys.readouterr()
    assert exc.value.code in (0, None), err
    assert "memory" not in out
    import re
    shown = re.findall(r"kg/m³ \(([^\n]*?)\)", out)    # the source beside each density
    assert shown and all("(" not in s and ")" not in s for s in shown), shown
    assert "CRC Handbook of Chemistry and Physics" in out or "common practice" in out


def test_groups_keys_and_densities_are_sane():
    table = load_materials()
    assert len({m.key for m in table}) == len(table)
    for material in table:
        assert material.group in GROUPS
        assert 500.0 < material.density < 25_000.0, material.key
    # every group that turning data is keyed by has at least one material
    assert {m.group for m in table} >= set(GROUPS) - {"other"}


def test_floating_plastics():
    # HDPE floats on water; PA6, POM and PTFE sink: common practice, no source
    water = find_material("water").density
    assert find_material("HDPE").density < water
    for name in ("PA6", "POM", "PTFE"):
        assert find_material(name).density > water


def test_same_alloy_family_agrees():
    # aluminium alloys 6061/6082 within 1 % of pure aluminium, brass and
    # bronze below pure copper: common practice, no source
    pure = find_material("aluminium").density
    for name in ("6061", "6082"):
        assert math.isclose(find_material(name).density, pure, rel_tol=0.01)
    copper = find_material("copper").density
    assert find_material("brass").density < copper
    assert find_material("bronze").density < copper


# --- finding by name -----------------------------------------------------------------

@pytest.mark.parametrize("text, key", [
    ("carbon_steel", "carbon_steel"), ("Carbon Steel", "carbon_steel"),
    ("MILD-STEEL", "carbon_steel"), ("  steel ", "carbon_steel"),
    ("ALUMINUM", "aluminium"), ("Aluminium (pure)", "aluminium"),
    ("stainless-304", "stainless_304"), ("1.4301", "stainless_304"),
    ("18/8", "stainless_304"), ("316L", "stainless_316"),
    ("gray cast iron", "grey_cast_iron"), ("Nylon 6", "nylon_pa6"),
    ("Water, 20 °C", "water"), ("h2o", "water"), ("POM-C", "acetal"),
])
def test_find_material_ignores_case_and_punctuation(text, key):
    assert find_material(text).key == key


def test_unknown_material_suggests_close_names():
    with pytest.raises(MaterialError) as info:
        find_material("stainles 304")
    assert "'stainles 304'" in str(info.value)
    assert "'stainless_304'" in str(info.value)


def test_unknown_material_without_close_names_lists_them():
    with pytest.raises(MaterialError) as info:
        find_material("xyzzy")
    message = str(info.value)
    assert "'xyzzy'" in message
    assert "carbon_steel" in message and "kg/m^3" in message


@pytest.mark.parametrize("bad", ["", "  ", "---", None, 7850])
def test_find_material_rejects_non_names(bad):
    with pytest.raises(MaterialError):
        find_material(bad)


def test_material_error_is_located_revolve_error():
    with pytest.raises(RevolveError) as info:
        find_material("brsas")
    located = info.value.located(file="shaft.toml", line=3)
    assert isinstance(located, MaterialError)
    assert str(located).startswith("shaft.toml:3: unknown material 'brsas'")


def test_material_is_frozen_and_the_table_cached():
    steel = find_material("steel")
    with pytest.raises(dataclasses.FrozenInstanceError):
        steel.density = 1.0
    assert load_materials() is load_materials()
    assert hash(steel) == hash(find_material("carbon_steel"))


# --- the table format ---------------------------------------------------------------

ROW = """
[[material]]
key = "{key}"
name = "{name}"
aliases = {aliases}
density_kg_m3 = {density}
group = "{group}"
source = "{source}"
"""


def row(**changes) -> str:
    fields = dict(key="demo", name="Demo", aliases='["demo alias"]',
                  density="1000", group="liquid", source="invented, demo only")
    fields.update(changes)
    return ROW.format(**fields)


def test_parse_materials_reads_a_good_row():
    (material,) = parse_materials(row())
    assert material == Material("demo", "Demo", 1000.0, "liquid",
                                "invented, demo only", ("demo alias",))
    # the optional note is read and kept apart from the source
    (noted,) = parse_materials(row() + 'note = "from memory"\n')
    assert (noted.source, noted.note) == ("invented, demo only", "from memory")


@pytest.mark.parametrize("text, match", [
    (row(density="-5"), "positive number"),
    (row(density="0"), "positive number"),
    (row(density="true"), "positive number"),
    (row(density="nan"), "positive number"),
    (row(density='"7850"'), "positive number"),
    (row(group="wood"), "group must be one of"),
    (row(source=""), "source must be non-empty"),
    (row(key="Demo Key"), "key must be"),
    (row(aliases='"demo"'), "aliases must be a list"),
    (row(aliases='["!!"]'), "aliases must be a list"),
    (row() + row(key="other", name="Other"), "'demo alias' would find both"),
    (row() + row(key="other", name="DEMO"), "'DEMO' would find both"),
    (row().replace('source = "invented, demo only"\n', ""), "missing field"),
    (row() + "colour = 'red'\n", "unknown field"),
    (row() + "note = 5\n", "note must be non-empty"),
    (row() + "note = ''\n", "note must be non-empty"),
    ("[notes]\ntext = 'x'\n" + row(), "unknown top-level key"),
    ("material = 3\n", "array of tables"),
    ("[[material]\n", "not valid TOML"),
])
def test_parse_materials_refuses_bad_tables(text, match):
    with pytest.raises(MaterialError, match=match) as info:
        parse_materials(text, file="extra.toml")
    assert info.value.file == "extra.toml"


def test_bad_row_error_names_the_row():
    with pytest.raises(MaterialError) as info:
        parse_materials(row() + row(key="second", name="Second",
                                    aliases="[]", density="-1"))
    assert info.value.place == "material 2 (second)"


# --- densities as text ---------------------------------------------------------------

def test_density_from_text_metric():
    assert density_from_text("7.85 g/cm^3") == 7850.0
    assert density_from_text("7850 kg/m3") == 7850.0
    assert density_from_text("7.85 t/m³") == 7850.0
    assert density_from_text("1.14", default_unit="g/cm^3") == 1140.0


def test_density_from_text_us_units():
    # 1 in = 25.4 mm and 1 lb = 0.45359237 kg (international yard and pound
    # agreement, 1959)
    assert math.isclose(density_from_text("0.284 lb/in^3"),
                        0.284 * 0.45359237 / 0.0254 ** 3, rel_tol=1e-14)
    assert math.isclose(density_from_text("490 lb/ft^3"),
                        490 * 0.45359237 / (12 * 0.0254) ** 3, rel_tol=1e-14)


@pytest.mark.parametrize("text, error, match", [
    ("7850", UnitError, "has no unit"),
    ("7.85 mm", UnitError, "length unit, not a density unit"),
    ("-1 kg/m^3", MaterialError, "must be positive"),
    ("0 g/cm^3", MaterialError, "must be positive"),
    ("steel", UnitError, "has no number"),
])
def test_density_from_text_errors(text, error, match):
    with pytest.raises(error, match=match):
        density_from_text(text)


# --- start-up cost -------------------------------------------------------------------

def loaded_modules(code: str) -> set[str]:
    code += "import sys\nprint(' '.join(sorted(sys.modules)))\n"
    result = subprocess.run([sys.executable, "-c", code], capture_output=True,
                            text=True, timeout=120, cwd=ROOT, check=True)
    return set(result.stdout.split())


def test_materials_fast_path_does_not_import_pint():
    modules = loaded_modules(
        "import revolve.materials as m\n"
        "assert m.find_material('Mild steel').density == 7850.0\n"
        "assert m.density_from_text('7.85 g/cm^3') == 7850.0\n"
        "assert m.density_from_text('0.284 lb/in^3') > 7800\n"
        "try:\n"
        "    m.find_material('brsas')\n"
        "except m.MaterialError:\n"
        "    pass\n")
    assert "revolve.materials" in modules
    assert "pint" not in modules
    assert not {"numpy", "scipy", "sympy"} & modules
