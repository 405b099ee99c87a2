"""`revolve vessel` end to end: summary, JSON, the profile files it writes, bad input.

Checks against published formulas (sources beside each); the written
profile must give the same capacity through `revolve measure` and a level
table through `revolve levels`.
"""

from __future__ import annotations

import json
import math

import pytest

from revolve.cli.app import main
from revolve.jobs.results import CAUTIONS


def run(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main(list(args))
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def test_json_summary_and_files(tmp_path, capsys):
    inside, wall = tmp_path / "tank.toml", tmp_path / "wall.toml"
    code, out, err = run(["vessel", "--diameter", "1.2 m", "--length", "2400", "--head",
                          "ellipsoidal", "--thickness", "6", "--material", "carbon_steel",
                          "--liquid-density", "850 kg/m^3", "--orientation", "horizontal",
                          "-o", str(inside), "--wall-output", str(wall), "--volume-unit", "L",
                          "--json"], capsys)
    assert code == 0, err
    s = json.loads(out)
    R, L = 600.0, 2400.0
    # CRC: cylinder π R² L; two 2:1 heads 2 · π D³/24 (spheroid; 2:1 common practice); mm³ -> L
    cap = (math.pi * R * R * L + 2 * math.pi * (2 * R) ** 3 / 24) * 1e-6
    v = s["vessel"]
    assert v["capacity"] == pytest.approx(cap, rel=1e-13)
    assert s["heads"][0]["volume"] == pytest.approx(math.pi * 1200 ** 3 / 24 * 1e-6, rel=1e-12)
    assert s["heads"][0]["depth"] == 300.0 and s["heads"][0]["depth_outside"] == 306.0
    assert v["outside_diameter"] == pytest.approx(1212.0, rel=1e-15)
    assert v["liquid_mass"] == pytest.approx(850 * cap * 1e-3, rel=1e-13)
    assert v["mass_full"] == pytest.approx(v["metal_mass"] + v["liquid_mass"], rel=1e-14)
    assert v["centre_of_mass_full"] == pytest.approx(L / 2, rel=1e-12)
    assert s["units"]["capacity"] == "L" and s["units"]["area"] == "m²"
    assert CAUTIONS["vessel"] in s["cautions"] and CAUTIONS["lifting"] in s["cautions"]
    assert s["files"] == {"liquid_space": str(inside), "wall": str(wall)}
    assert s["crosscheck"]["agrees"] is True
    # The written profile is the liquid space: measure gives the capacity.
    code, out, err = run(["measure", str(inside), "--volume-unit", "L", "--json"], capsys)
    assert code == 0, err
    assert json.loads(out)["volume"] == pytest.approx(cap, rel=1e-13)
    # The wall carries its material: measure gives the metal's mass.
    code, out, err = run(["measure", str(wall), "--json"], capsys)
    assert json.loads(out)["mass"] == pytest.approx(v["metal_mass"], rel=1e-13)
    # And levels reads it: half full lying down is half the capacity.
    code, out, err = run(["levels", str(inside), "--orientation", "horizontal", "--at", "600",
                          "--volume-unit", "L", "--json"], capsys)
    assert code == 0, err
    assert json.loads(out)["levels"][0]["volume"] == pytest.approx(cap / 2, rel=1e-12)


def test_screen_summary(tmp_path, capsys):
    out_file = tmp_path / "rain.toml"
    code, out, err = run(["vessel", "--diameter", "2400", "--length", "2000", "--head-1",
                          "torispherical-10", "--head-2", "conical:angle=75", "-o",
                          str(out_file), "--volume-unit", "L", "--name", "Rain tank"], capsys)
    assert code == 0, err
    for text in ("Rain tank", "torispherical-10, crown 2400, knuckle 240 mm",
                 "conical, half-angle 75°", "capacity", "custody transfer",
                 f"revolve levels {out_file}", "Caution"):
        assert text in out, text
    assert out_file.exists()
    assert 'name = "Rain tank"' in out_file.read_text(encoding="utf-8")


def test_hemispherical_sphere_in_us_units(capsys):
    code, out, err = run(["vessel", "--diameter", "48", "--units", "in", "--length", "0",
                          "--head", "hemispherical", "--volume-unit", "US_gallon", "--json"],
                         capsys)
    assert code == 0, err
    s = json.loads(out)
    # CRC: sphere 4/3 π r³; 1 US gal = 231 in³ (US customary definition)
    assert s["vessel"]["capacity"] == pytest.approx(4 / 3 * math.pi * 24 ** 3 / 231, rel=1e-13)
    assert s["units"]["capacity"] == "US gal"
    assert "metal_mass" not in s["vessel"] and "mass_full" not in s["vessel"]
    assert s["cautions"] == [CAUTIONS["vessel"]]


@pytest.mark.parametrize("args,expected", [
    (["--head", "torispherical:crown=400"], "--head: head 1: the crown radius 400 is less than"),
    (["--head-1", "flat", "--head-2", "conical:angle=95"], "--head-2: head 2: the cone's "
                                                            "half-angle must be between 0 and 90"),
    (["--head", "dished"], "--head: unknown head 'dished'"),
    (["--head-1", "flat"], "--head-2: give the heads"),
    ([], "--head: give the heads"),
    (["--head", "flat", "--head-1", "flat"], "--head: give --head for both ends"),
    (["--head", "flat", "--diameter", "big"], "--diameter: 'big' is not a length"),
    (["--head", "flat", "--diameter", "1/0 in"], "--diameter: '1/0 in': a fraction cannot"),
    (["--head", "flat", "--thickness", "1/4 kg"], "--thickness: 'kg' is a mass unit"),
    (["--head", "flat", "--area-unit", "L"], "--area-unit: 'L' is a volume unit"),
    (["--head", "flat", "--diameter", "3 kg"], "--diameter: 'kg' is a mass unit"),
    (["--head", "flat", "--length", "-5"], "--length: the shell length must not be negative"),
    (["--head", "flat", "--thickness", "0"], "--thickness: the wall thickness must be positive"),
    (["--head", "flat", "--wall-output", "WALL"], "--wall-output: a wall profile needs a wall"),
    (["--head", "flat", "--material", "carbon_steel"], "--material: the metal's mass needs"),
    (["--head", "flat", "--thickness", "5", "--material", "unobtainium"], "--material:"),
    (["--head", "flat", "--liquid-density", "-3 kg/m^3"], "--liquid-density:"),
    (["--head", "ellipsoidal", "--thickness", "130", "--dimensions", "outside"],
     "--head: head 1: the wall thickness (130) is not less than an eighth"),
    (["--head", "flat", "--dimensions", "middle"], "--dimensions: give inside or outside"),
    (["--head", "flat", "--volume-unit", "mm"], "--volume-unit: 'mm' is a length unit"),
    (["--head", "flat", "--units", "L"], "--units: 'L' is a volume unit"),
])
def test_bad_input(tmp_path, capsys, args, expected):
    out_file = tmp_path / "vessel.toml"
    wall = tmp_path / "WALL.toml"
    base = ["vessel", "--diameter", "1000", "--length", "1500", "-o", str(out_file)]
    args = [str(wall) if a == "WALL" else a for a in args]
    if "--diameter" in args:
        i = base.index("--diameter")
        del base[i:i + 2]
    if "--length" in args:
        i = base.index("--length")
        del base[i:i + 2]
    code, out, err = run(base + args, capsys)
    assert code == 2, (out, err)
    lines = err.strip().splitlines()
    assert len(lines) == 1 and "Traceback" not in err
    assert expected in lines[0], lines[0]
    assert not out_file.exists() and not wall.exists()
    assert out == ""


# -- bare densities are kg/m³, as the help says (family: a density option without a unit) -----

def test_bare_densities_are_kg_per_cubic_metre(capsys):
    code, out, err = run(["vessel", "--diameter", "1000", "--length", "1500", "--head",
                          "hemispherical", "--thickness", "10", "--density", "7850",
                          "--liquid-density", "850", "--json"], capsys)
    assert code == 0, err
    s = json.loads(out)
    R, t, L = 500.0, 10.0, 1500.0
    # CRC (from memory): hollow cylinder π (R_o² − R_i²) L; spherical shell 4/3 π (R_o³ − R_i³)
    # (two hemispherical heads make one sphere); cylinder π R² L and sphere 4/3 π R³ for the liquid.
    metal = math.pi * ((R + t) ** 2 - R ** 2) * L + 4 / 3 * math.pi * ((R + t) ** 3 - R ** 3)
    liquid = math.pi * R * R * L + 4 / 3 * math.pi * R ** 3
    assert s["vessel"]["metal_mass"] == pytest.approx(7850 * metal * 1e-9, rel=1e-12)
    assert s["vessel"]["liquid_mass"] == pytest.approx(850 * liquid * 1e-9, rel=1e-12)


# -- two outputs: both or neither (family: an output path that cannot be written) ------------

@pytest.mark.parametrize("existed", [False, True])
@pytest.mark.parametrize("kind", ["missing folder", "a folder"])
def test_unwritable_wall_output_leaves_no_liquid_space_file(tmp_path, capsys, existed, kind):
    inside = tmp_path / "v.toml"
    if existed:
        inside.write_text("previous", encoding="utf-8")
    if kind == "a folder":
        wall = tmp_path / "w.toml"
        wall.mkdir()
    else:
        wall = tmp_path / "no such folder" / "w.toml"
    before = sorted(p.name for p in tmp_path.iterdir())
    code, out, err = run(["vessel", "--diameter", "1000", "--length", "1500", "--head", "flat",
                          "--thickness", "8", "-o", str(inside), "--wall-output", str(wall),
                          "--force"], capsys)
    assert code == 2 and out == ""
    assert err.count("\n") == 1 and err.startswith("revolve: error: --wall-output: "), err
    assert sorted(p.name for p in tmp_path.iterdir()) == before
    if existed:
        assert inside.read_text(encoding="utf-8") == "previous"
    else:
        assert not inside.exists()


def test_bare_density_is_written_with_its_unit(tmp_path, capsys):
    wall = tmp_path / "w.toml"
    code, _, err = run(["vessel", "--diameter", "1000", "--length", "1500", "--head",
                        "hemispherical", "--thickness", "10", "--density", "7850",
                        "--wall-output", str(wall)], capsys)
    assert code == 0, err
    assert 'density = "7850.0 kg/m^3"' in wall.read_text(encoding="utf-8")
    code, out, err = run(["measure", str(wall), "--json"], capsys)
    assert code == 0, err
    R, t, L = 500.0, 10.0, 1500.0
    # CRC (from memory): hollow cylinder and spherical shell, as above.
    metal = math.pi * ((R + t) ** 2 - R ** 2) * L + 4 / 3 * math.pi * ((R + t) ** 3 - R ** 3)
    assert json.loads(out)["mass"] == pytest.approx(7850 * metal * 1e-9, rel=1e-9)


def test_vessel_command_with_curved_heads_imports_no_sympy(tmp_path):
    # Issue 10: symbolic only where asked. Ellipsoidal heads are curves (expression trees,
    # compiled by the package); building, measuring and printing them needs no sympy.
    import os
    import subprocess
    import sys
    from pathlib import Path

    root = Path(__file__).resolve().parents[2]
    code = (
        "import sys, contextlib, io\n"
        "from revolve.cli.app import main\n"
        "with contextlib.redirect_stdout(io.StringIO()):\n"
        "    try:\n"
        "        main(['vessel', '--diameter', '2000', '--length', '5000', '--head-1',\n"
        "              'ellipsoidal', '--head-2', 'torispherical', '--thickness', '10'])\n"
        "    except SystemExit as stop:\n"
        "        assert not stop.code, stop.code\n"
        "print([m for m in ('sympy', 'mpmath', 'scipy') if m in sys.modules])\n")
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          cwd=tmp_path, env={**os.environ, "PYTHONPATH": str(root)})
    assert done.returncode == 0, done.stderr[-2000:]
    assert done.stdout.strip() == "[]"


# -- units by the vessel trade (issue 12): litres and m², US gallons and ft² -------------------

def test_default_units_follow_the_trade_not_the_drawing(capsys):
    code, out, err = run(["vessel", "--diameter", "2000", "--length", "5000", "--head", "flat",
                          "--json"], capsys)
    assert code == 0, err
    s = json.loads(out)
    # CRC: cylinder π R² L = π · 1² · 5 m³; 1 L = 1e-3 m³ (SI); lateral 2πRL + 2 πR² in m²
    assert s["units"]["capacity"] == "L" and s["units"]["area"] == "m²"
    assert s["vessel"]["capacity"] == pytest.approx(math.pi * 5 * 1000, rel=1e-13)
    assert s["vessel"]["inside_area"] == pytest.approx(2 * math.pi * 5 + 2 * math.pi, rel=1e-13)
    code, out, err = run(["vessel", "--diameter", "2000", "--length", "5000", "--head", "flat"],
                         capsys)
    assert "mm³" not in out and "15 708" in out.replace("\u202f", " ")
    # --volume-unit moves volumes only; areas keep m² (or follow --area-unit)
    code, out, err = run(["vessel", "--diameter", "2000", "--length", "5000", "--head", "flat",
                          "--volume-unit", "m3", "--area-unit", "cm^2", "--json"], capsys)
    s = json.loads(out)
    assert s["units"]["capacity"] == "m³" and s["units"]["area"] == "cm²"
    assert s["vessel"]["capacity"] == pytest.approx(math.pi * 5, rel=1e-13)
    assert s["vessel"]["inside_area"] == pytest.approx((2 * math.pi * 5 + 2 * math.pi) * 1e4,
                                                       rel=1e-13)


def test_inch_drawing_defaults_to_us_gallons_and_square_feet(capsys):
    code, out, err = run(["vessel", "--diameter", "4 ft", "--units", "in", "--length", "0",
                          "--head", "hemispherical", "--thickness", "1/4 in", "--json"], capsys)
    assert code == 0, err
    s = json.loads(out)
    # CRC: sphere 4/3 π r³ and 4 π r²; 1 US gal = 231 in³; 1 ft² = 144 in² (1959 agreement)
    assert (s["units"]["capacity"], s["units"]["area"], s["units"]["length"]) == \
        ("US gal", "ft²", "in")
    assert s["vessel"]["capacity"] == pytest.approx(4 / 3 * math.pi * 24 ** 3 / 231, rel=1e-13)
    assert s["vessel"]["inside_area"] == pytest.approx(4 * math.pi * 24 ** 2 / 144, rel=1e-13)
    assert s["vessel"]["outside_diameter"] == pytest.approx(48.5, rel=1e-15)


# -- the one overwrite rule: -o and --wall-output refuse an existing file unless --force -------

def test_existing_output_is_refused_without_force_and_replaced_with_it(tmp_path, capsys):
    inside = tmp_path / "v.toml"
    inside.write_text("previous", encoding="utf-8")
    args = ["vessel", "--diameter", "1000", "--length", "1500", "--head", "flat", "-o",
            str(inside)]
    code, out, err = run(args, capsys)
    assert code == 2 and out == "" and err.count("\n") == 1
    assert err.startswith("revolve: error: --output: ") and "--force" in err
    assert inside.read_text(encoding="utf-8") == "previous"
    code, out, err = run(args + ["--force"], capsys)
    assert code == 0, err
    assert 'section = "space"' in inside.read_text(encoding="utf-8")


# -- the library: revolve.build_vessel(...).to_dict() is the command's --json -------------------

@pytest.mark.parametrize("args,kwargs", [
    (["--diameter", "1.2 m", "--length", "2400", "--head", "ellipsoidal", "--thickness", "6",
      "--material", "carbon_steel", "--liquid", "water", "--orientation", "horizontal"],
     dict(diameter="1.2 m", length=2400, head="ellipsoidal", thickness="6",
          material="carbon_steel", liquid="water", orientation="horizontal")),
    (["--diameter", "48", "--units", "in", "--length", "3 ft", "--head-1", "torispherical",
      "--head-2", "conical:angle=30", "--volume-unit", "L"],
     dict(diameter=48, units="in", length="3 ft", head_1="torispherical",
          head_2="conical:angle=30", volume_unit="L")),
])
def test_library_to_dict_equals_the_json(args, kwargs, capsys):
    import revolve

    code, out, err = run(["vessel", *args, "--json"], capsys)
    assert code == 0, err
    assert json.loads(json.dumps(revolve.build_vessel(**kwargs).to_dict())) == json.loads(out)
