"""`revolve measure` end to end: every bundled example, JSON keys, exit codes, bad input.

Figures here are checked against published formulas (sources beside each);
the bundled examples are invented scenarios and are only run, never used as
check values.
"""

from __future__ import annotations

import json
import math
import subprocess
import sys
from pathlib import Path

import pytest

from revolve.cli.app import main

ROOT = Path(__file__).resolve().parents[2]
# Every bundled profile (profiles/ also holds other example inputs, e.g. coating systems).
PROFILES = [p for p in sorted((ROOT / "profiles").glob("*.toml"))
            if "[[loop]]" in p.read_text(encoding="utf-8")] + sorted((ROOT / "profiles").glob("*.txt"))


def run(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main(list(args))
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def write(tmp_path, name, text):
    p = tmp_path / name
    p.write_text(text, encoding="utf-8")
    return str(p)


SQUARE = """
units = "mm"
[[loop]]
start = [0, 1]
segments = [
  { line_to = [2, 1] },
  { line_to = [2, 3] },
  { line_to = [0, 3] },
  { close = true },
]
"""


@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.name)
def test_every_example_profile_measures_and_cross_checks(path, capsys):
    code, out, err = run(["measure", str(path), "--json"], capsys)
    assert code == 0, err
    data = json.loads(out)
    for key in ("area", "centroid", "perimeter", "volume", "surface_area", "crosscheck"):
        assert key in data
    assert data["crosscheck"]["agrees"] is True
    assert data["volume"] > 0
    assert math.isclose(data["crosscheck"]["volume"], data["volume"], rel_tol=1e-9)


def test_every_example_profile_prints_a_table(capsys):
    for path in PROFILES:
        code, out, err = run(["measure", str(path)], capsys)
        assert code == 0, err
        assert "volume" in out and "Cross-check" in out


def test_hollow_cylinder_json(tmp_path, capsys):
    # Washer/cylinder volume π (R² − r²) h — CRC Standard Mathematical Tables (from memory)
    code, out, _ = run(["measure", write(tmp_path, "sq.toml", SQUARE), "--json"], capsys)
    assert code == 0
    d = json.loads(out)
    assert math.isclose(d["volume"], math.pi * (9 - 1) * 2, rel_tol=1e-13)
    assert math.isclose(d["area"], 4, rel_tol=1e-14)
    assert d["centroid"] == pytest.approx([1, 2], rel=1e-14)
    assert math.isclose(d["perimeter"], 8, rel_tol=1e-14)
    # lateral areas 2π r h of both cylinders plus two annuli π (R² − r²) — CRC (from memory)
    assert math.isclose(d["surface_area"], 2 * math.pi * 2 * (1 + 3) + 2 * math.pi * 8, rel_tol=1e-13)


def test_output_units(tmp_path, capsys):
    # 1 L = 10⁶ mm³ (SI definition); 1 in = 25.4 mm (1959 international agreement)
    f = write(tmp_path, "sq.toml", SQUARE)
    code, out, _ = run(["measure", f, "--json", "--volume-unit", "L", "--length-unit", "in"], capsys)
    d = json.loads(out)
    assert math.isclose(d["volume"], 16 * math.pi * 1e-6, rel_tol=1e-13)
    assert math.isclose(d["perimeter"], 8 / 25.4, rel_tol=1e-13)
    assert math.isclose(d["area"], 4 / 25.4 ** 2, rel_tol=1e-13)


def test_mass_and_inertia_of_a_cylinder(tmp_path, capsys):
    # solid cylinder: m = ρ π r² h, I = m r²/2 — any dynamics text, e.g. Beer & Johnston (from memory)
    f = write(tmp_path, "rod.toml", 'units = "m"\n[[loop]]\nstart = [0, 0]\nsegments = [\n'
              '  { line_to = [2, 0] },\n  { line_to = [2, 0.5] },\n  { line_to = [0, 0.5] },\n'
              '  { close = true },\n]\n')
    code, out, _ = run(["measure", f, "--json", "--density", "1000 kg/m^3", "--length-unit", "m"], capsys)
    d = json.loads(out)
    m = 1000 * math.pi * 0.25 * 2
    assert math.isclose(d["mass"], m, rel_tol=1e-13)
    assert math.isclose(d["inertia_axis"], m * 0.25 / 2, rel_tol=1e-12)
    assert d["cautions"], "mass output must carry the lifting caution"


def test_exact_closed_form(tmp_path, capsys):
    # cylinder shell volume π (3² − 1²)·2 = 16π exactly (CRC, from memory)
    f = write(tmp_path, "sq.toml", SQUARE)
    code, out, _ = run(["measure", f, "--json", "--exact"], capsys)
    d = json.loads(out)
    assert d["exact"]["volume"] == "16*pi"


def test_partial_angle_reports_cut_faces(tmp_path, capsys):
    # Pappus–Guldinus with θ = π/2: V = θ d A (Stewart, Calculus, from memory)
    f = write(tmp_path, "sq.toml", SQUARE)
    code, out, _ = run(["measure", f, "--json", "--angle", "90"], capsys)
    d = json.loads(out)
    assert math.isclose(d["volume"], math.pi / 2 * 2 * 4, rel_tol=1e-13)
    assert math.isclose(d["cut_face_area"], 4, rel_tol=1e-14)


def test_axis_option_changes_the_axis(tmp_path, capsys):
    # the same square about the line y = 1 (its bottom edge): cylinder π 2² · 2 (CRC)
    f = write(tmp_path, "sq.toml", SQUARE)
    code, out, _ = run(["measure", f, "--json", "--axis", "0,1,1,0"], capsys)
    assert math.isclose(json.loads(out)["volume"], math.pi * 4 * 2, rel_tol=1e-13)


def test_disagreement_exits_1(tmp_path, capsys, monkeypatch):
    import revolve.geometry.measure as gm

    real = gm.washer_volume
    monkeypatch.setattr(gm, "washer_volume", lambda *a, **k: (real(*a, **k)[0] * (1 + 1e-6), 0.0))
    code, out, err = run(["measure", write(tmp_path, "sq.toml", SQUARE)], capsys)
    assert code == 1
    assert "disagree" in err


BAD = {
    "not closed": ('units = "mm"\n[[loop]]\nstart = [0, 1]\nsegments = [\n  { line_to = [2, 1] },\n'
                   '  { line_to = [2, 3] },\n  { line_to = [0, 3] },\n]\n', ["not closed", ":7:", "segment 3"]),
    "self-intersecting": ('[[loop]]\nstart = [0, 1]\nsegments = [\n  { line_to = [2, 3] },\n'
                          '  { line_to = [2, 1] },\n  { line_to = [0, 3] },\n  { close = true },\n]\n',
                          ["intersects itself", "segment"]),
    "crossing the axis": ('[[loop]]\nstart = [0, -1]\nsegments = [\n  { line_to = [2, -1] },\n'
                          '  { line_to = [2, 3] },\n  { line_to = [0, 3] },\n  { close = true },\n]\n',
                          ["crosses the axis", ":4:", "segment 1"]),
    "zero area": ('[[loop]]\nstart = [0, 1]\nsegments = [\n  { line_to = [2, 1] },\n  { close = true },\n]\n',
                  ["zero"]),
    "nan": ('[[loop]]\nstart = [0, nan]\nsegments = [\n  { line_to = [2, 1] },\n  { line_to = [2, 3] },\n'
            '  { close = true },\n]\n', ["finite"]),
    "inf": ('[[loop]]\nstart = [0, 1]\nsegments = [\n  { line_to = [inf, 1] },\n  { line_to = [2, 3] },\n'
            '  { close = true },\n]\n', ["finite"]),
    "arc radius too short": ('[[loop]]\nstart = [0, 1]\nsegments = [\n  { line_to = [4, 1] },\n'
                             '  { arc_to = [0, 1], radius = 1, side = "left" },\n]\n',
                             ["shorter than half the chord", ":5:"]),
    "unknown unit": ('units = "bananas"\n[[loop]]\nstart = [0, 1]\nsegments = [\n  { line_to = [2, 1] },\n'
                     '  { line_to = [2, 3] },\n  { close = true },\n]\n', ["bananas"]),
    "unknown material": ('material = "unobtainium"\n[[loop]]\nstart = [0, 1]\nsegments = [\n'
                         '  { line_to = [2, 1] },\n  { line_to = [2, 3] },\n  { close = true },\n]\n',
                         ["unobtainium", ":1:"]),
    "malformed file": ('[[loop]\nstart = [0, 1]\n', ["line"]),
    "unknown key": ('colour = "red"\n[[loop]]\nstart = [0, 1]\nsegments = [\n  { line_to = [2, 1] },\n'
                    '  { line_to = [2, 3] },\n  { close = true },\n]\n', ["colour"]),
    "unknown segment key": ('[[loop]]\nstart = [0, 1]\nsegments = [\n  { line_too = [2, 1] },\n'
                            '  { line_to = [2, 3] },\n  { close = true },\n]\n', ["line_too", ":4:"]),
    "hostile expression": ('[[loop]]\nstart = [0, 1]\nsegments = [\n  { line_to = [2, 1] },\n'
                           '  { y = "__import__(\'os\').system(\'touch PWNED\')", to_x = 0 },\n]\n',
                           [":5:"]),
    "zero-length segment": ('[[loop]]\nstart = [0, 1]\nsegments = [\n  { line_to = [0, 1] },\n'
                            '  { line_to = [2, 1] },\n  { line_to = [2, 3] },\n  { close = true },\n]\n',
                            ["zero length"]),
}


@pytest.mark.parametrize("case", sorted(BAD))
def test_bad_input_is_one_line_exit_2(case, tmp_path, capsys, monkeypatch):
    monkeypatch.chdir(tmp_path)
    text, needles = BAD[case]
    f = write(tmp_path, "bad.toml", text)
    code, out, err = run(["measure", f], capsys)
    assert code == 2, (case, out, err)
    lines = err.strip().splitlines()
    assert len(lines) == 1, err
    assert "Traceback" not in err and out == ""
    assert "bad.toml" in err, err
    for n in needles:
        assert n in err, (case, err)
    assert not (tmp_path / "PWNED").exists()


def test_bad_options(tmp_path, capsys):
    f = write(tmp_path, "sq.toml", SQUARE)
    for args, needle in ((["--angle", "0"], "angle"), (["--angle", "400"], "angle"),
                         (["--axis", "1,2"], "--axis"), (["--volume-unit", "parsec"], "parsec"),
                         (["--material", "steel", "--density", "7850"], "not both"),
                         (["--density", "-5 kg/m^3"], "density")):
        code, out, err = run(["measure", f, *args], capsys)
        assert code == 2, (args, err)
        assert needle in err and "Traceback" not in err, (args, err)


def test_missing_file_and_points_file(tmp_path, capsys):
    code, out, err = run(["measure", str(tmp_path / "nope.toml")], capsys)
    assert code == 2 and "nope.toml" in err
    p = write(tmp_path, "pts.txt", "0,1\n2,1\n2,oops\n0,3\n")
    code, out, err = run(["measure", p], capsys)
    assert code == 2 and "pts.txt:3" in err


def test_console_script_subprocess_has_no_traceback(tmp_path):
    f = write(tmp_path, "bad.toml", BAD["crossing the axis"][0])
    r = subprocess.run([sys.executable, "-m", "revolve", "measure", f], capture_output=True, text=True)
    assert r.returncode == 2
    assert "Traceback" not in r.stderr and r.stderr.count("\n") == 1


def test_csv_matches_json(tmp_path, capsys):
    import csv

    f = write(tmp_path, "sq.toml", SQUARE)
    out_csv = tmp_path / "m.csv"
    code, out, _ = run(["measure", f, "--json", "--csv", str(out_csv)], capsys)
    assert code == 0
    d = json.loads(out)
    rows = list(csv.DictReader(out_csv.open(encoding="utf-8")))
    assert len(rows) == 1                      # one row: every figure, its unit in its heading
    assert math.isclose(float(rows[0]["volume (mm³)"]), d["volume"], rel_tol=1e-15)
    assert math.isclose(float(rows[0]["volume, second method (mm³)"]),
                        d["crosscheck"]["volume"], rel_tol=1e-15)
    assert rows[0]["mass (kg)"] if "mass" in d else "mass (kg)" not in rows[0]


def test_existing_csv_is_refused_without_force_and_replaced_with_it(tmp_path, capsys):
    import csv

    f = write(tmp_path, "sq.toml", SQUARE)
    out_csv = tmp_path / "m.csv"
    out_csv.write_text("keep me\n", encoding="utf-8")
    code, out, err = run(["measure", f, "--csv", str(out_csv)], capsys)
    assert code == 2 and out == "" and err.count("\n") == 1
    assert err.startswith("revolve: error: --csv: ") and "--force" in err, err
    assert out_csv.read_text(encoding="utf-8") == "keep me\n"
    code, out, err = run(["measure", f, "--csv", str(out_csv), "--force"], capsys)
    assert code == 0, err
    header = next(csv.reader(out_csv.open(encoding="utf-8")))
    assert header[:3] == ["revolved", "drawing unit", "section area (mm²)"]
    assert len(set(header)) == len(header)          # every column named once


def test_csv_not_written_on_bad_input(tmp_path, capsys):
    f = write(tmp_path, "bad.toml", BAD["crossing the axis"][0])
    out_csv = tmp_path / "m.csv"
    code, out, err = run(["measure", f, "--csv", str(out_csv)], capsys)
    assert code == 2 and not out_csv.exists()


# -- densities: a bare number is kg/m³, as the help and the README say ------------------------

@pytest.mark.parametrize("density, rho", [("7850", 7850.0), ("7850 kg/m^3", 7850.0),
                                          ("7.85 g/cm^3", 7850.0), ("1e3", 1000.0)])
def test_bare_density_is_kg_per_cubic_metre(tmp_path, capsys, density, rho):
    f = write(tmp_path, "sq.toml", SQUARE)
    code, out, err = run(["measure", f, "--json", "--density", density], capsys)
    assert code == 0, err
    # CRC (from memory): hollow cylinder V = π (R² − r²) h = π (3² − 1²) · 2 mm³; m = ρ V.
    volume_m3 = math.pi * (9 - 1) * 2 * 1e-9
    assert json.loads(out)["mass"] == pytest.approx(rho * volume_m3, rel=1e-13)


# -- every message names its option (family: option values refused by the unit, material
# and axis readers), on one line even when the value holds a line break ----------------------

@pytest.mark.parametrize("args, start", [
    (["--volume-unit", "gallon"], "--volume-unit: 'gallon' is ambiguous"),
    (["--volume-unit", "x\ny"], "--volume-unit: unknown volume unit 'x\\ny'"),
    (["--area-unit", "kg"], "--area-unit: 'kg' is a mass unit"),
    (["--length-unit", ""], "--length-unit: "),
    (["--mass-unit", "furlong"], "--mass-unit: "),
    (["--material", "Stahl"], "--material: unknown material 'Stahl'"),
    (["--material", ""], "--material: no material name given"),
    (["--density", "0"], "--density: a density must be positive"),
    (["--density", "7850 kg"], "--density: 'kg' is a mass unit"),
    (["--density", "1e999"], "--density: '1e999' is not a finite density"),
    (["--axis", "1e999,0,1,0"], "--axis: X0 = 1e999 is out of range"),
    (["--axis", "0,0,1,1e999999999"], "--axis: DY = 1e999999999 is out of range"),
    (["--axis", "0,0,0,0"], "--axis: the direction DX,DY is zero"),
    (["--axis", "0,0,1,nan"], "--axis: DY = 'nan' is not a number"),
    (["--angle", "x\ny"], "--angle: give a number, got 'x\\ny'"),
    (["--tolerance", "nan"], "--tolerance: must be a positive number"),
    (["--csv", "figures.txt"], "--csv: "),
])
def test_option_errors_name_the_option(tmp_path, capsys, args, start):
    f = write(tmp_path, "sq.toml", SQUARE)
    code, out, err = run(["measure", f, *args], capsys)
    assert code == 2 and out == ""
    assert err.count("\n") == 1 and err.startswith("revolve: error: " + start), err
    assert sorted(p.name for p in tmp_path.iterdir()) == ["sq.toml"]


def test_units_option_is_named(tmp_path, capsys):
    f = write(tmp_path, "p.txt", "0,1\n2,1\n2,3\n0,3\n")
    code, out, err = run(["measure", f, "--units", "gallon"], capsys)
    assert code == 2 and err.startswith(
        "revolve: error: --units: 'gallon' is a volume unit, not a length unit"), err


def test_tables_show_six_significant_figures_and_units_with_superscripts(tmp_path, capsys):
    # Hollow cylinder π (3² − 1²) · 2 = 16π = 50.2655 mm³ to six significant figures (CRC, from
    # memory); in m³ the same volume is 5.02655e-08; units print with superscripts, never ^.
    f = write(tmp_path, "sq.toml", SQUARE)
    code, out, err = run(["measure", f], capsys)
    assert code == 0, err
    volume = [line for line in out.splitlines() if line.startswith("volume  ")]
    assert volume and "50.2655 │ mm³" in volume[0], out
    assert "^" not in out and "mm²" in out
    code, out, err = run(["measure", f, "--volume-unit", "m^3", "--mass-unit", "g",
                          "--density", "7850"], capsys)
    assert code == 0, err
    assert "5.02655e-08 │ m³" in out and "^" not in out
    # 7850 kg/m³ × 16π mm³ = 0.394584 g (six significant figures)
    assert "0.394584 │ g" in out, out
