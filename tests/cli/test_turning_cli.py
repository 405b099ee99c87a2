"""`revolve turn` end to end: the quote table, JSON in SI, CSV, many parts, bad input.

Figures are checked against hand-worked values with the CHECKS.md turning
formulas (common practice, no source) and solids from CRC *Standard
Mathematical Tables* (from memory); units by their definitions (1 in =
25.4 mm, international yard and pound agreement, 1959; 1 lb = 0.45359237 kg,
same agreement). The example profiles are invented inputs, never check values.
"""

from __future__ import annotations

import csv
import json
import math
import os
import re
import subprocess
import sys
from pathlib import Path

import pytest

from revolve.cli.app import main

ROOT = Path(__file__).resolve().parents[2]
SHAFT = str(ROOT / "profiles" / "turned-stepped-shaft.toml")
SLEEVE = str(ROOT / "profiles" / "turned-sleeve-inch.toml")
INCH = 0.0254            # 1959 agreement
# The sleeve by hand, π Σ (R² − r²) L per step, in inches (CRC, from memory): 0.96875 π in³
SLEEVE_IN3 = 0.96875 * math.pi


def run(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main(["turn", *map(str, args)])
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def rel(a, b):
    return abs(a - b) / abs(b)


def write(folder, name, text):
    p = Path(folder) / name
    p.write_text(text, encoding="utf-8")
    return str(p)


PIN = """
name = "Plain pin"
units = "mm"
material = "carbon steel"
[[loop]]
start = [0, 0]
segments = [
  { line_to = [50, 0], face = "axis" },
  { line_to = [50, 15], face = "end" },
  { line_to = [0, 15], face = "outside" },
  { close = true, face = "end" },
]
"""


# -- one part ---------------------------------------------------------------------------


def cost_rows(d):
    return {row["item"]: row for row in d["cost"]}


def test_one_part_quote_table_reads_like_a_quote(capsys):
    code, out, err = run([SHAFT, "-q", "200", "--stock-price", "2.40/kg", "--machine-rate", "85",
                          "--setup-time", "45", "--currency", "EUR"], capsys)
    assert code == 0, err
    assert err == ""
    for text in ("Stepped shaft, crowned collar", "round bar", "42 mm", "stock length per part",
                 "parts per bar", "Bars, 200 parts", "utilisation", "roughing", "finishing",
                 "spindle speeds", "Cost and price, batch of 200", "EUR", "Caution",
                 "Operations in order", "part off", "How each operation is timed"):
        assert text in out, text
    assert "Times and costs are estimates" in out
    # parts per bar floor((3000 − 100) / 85) = 34 (common practice, no source)
    assert re.search(r"parts per bar .*│\s+34\s+│", out)
    # n = 1000 vc / (π D) = 1000 · 200 / (π · 42) = 1516 rev/min (common practice, no source)
    assert re.search(r"roughing\s+│\s+200\s+│.*│\s+42\s+│\s+1516\s+│", out)


def test_json_keys_and_hand_worked_figures(capsys):
    code, out, err = run([SHAFT, "--json"], capsys)
    assert code == 0, err
    d = json.loads(out)
    for key in ("command", "inputs", "units", "part", "faces", "stock", "removed", "bars",
                "allowances", "cutting", "times", "cost", "notes", "cautions"):
        assert key in d, key
    assert d["units"]["length"] == "mm" and d["units"]["mass"] == "kg"
    assert d["units"]["volume"] == "cm³" and d["units"]["cutting_distance/time"] == "m/min"
    s = d["stock"]
    # ⌀40 (crown) + 2 allowance = the 42 mm bar; 80 + 2·1 + 3 + 0 = 85 mm (common practice)
    assert s["stock_diameter"] == 42.0
    assert rel(s["stock_length"], 85.0) < 1e-12
    # stock V = π r² L (CRC, from memory), here in cm³; mass at 7850 kg/m³ (common practice)
    assert rel(s["stock_volume"], math.pi * 2.1 ** 2 * 8.5) < 1e-12
    assert rel(s["stock_mass"], 7850 * math.pi * 0.021 ** 2 * 0.085) < 1e-12
    r = d["removed"]
    assert rel(r["removed_volume"], s["stock_volume"] - d["part"]["part_volume"]) < 1e-12
    assert r["utilisation_percent"] == pytest.approx(
        100 * d["part"]["part_mass"] / s["stock_mass"], rel=1e-15)
    assert d["bars"]["parts_per_bar"] == 34 and d["bars"]["bars_needed"] == 1
    t = d["times"]
    # Q = vc ap f = 200 m/min × 3 mm × 0.3 mm/rev = 180 cm³/min (common practice, no source)
    assert rel(t["metal_removal_rate"], 180) < 1e-12
    assert rel(t["roughing_time"], r["chip_volume"] / 180) < 1e-12
    # finishing A / (vc f) with vc 260 m/min, f 0.12 mm/rev (the steel table row), in minutes
    assert rel(t["finishing_time"],
               d["part"]["finished_surface"] * 1e-4 / (260 * 0.12e-3)) < 1e-12
    rough, fin = d["cutting"]
    assert (rough["cutting_speed"], rough["feed_per_rev"], rough["depth_of_cut"]) == \
        pytest.approx((200, 0.3, 3), rel=1e-12)
    assert rel(rough["spindle_speed_rpm"], 1000 * 200 / (math.pi * 42)) < 1e-12
    c = cost_rows(d)
    assert c["total"]["per_part"] is None and c["total"]["how"].startswith("incomplete")
    assert d["cautions"] == [
        "Times and costs are estimates; cutting data comes from the tool supplier. Guard rotating "
        "stock and respect the machine's speed limit for the part's size and balance."]


def test_removed_is_stock_minus_part_exactly_through_the_library():
    import revolve

    q = revolve.quote_turning(SHAFT).quote
    assert q.removal.removed_volume == q.stock.volume - q.part.volume      # SI, exact
    assert q.removal.utilisation == pytest.approx(q.part.mass / q.stock.mass, rel=1e-15)


def test_costs_by_hand(capsys):
    code, out, err = run([SHAFT, "--json", "-q", "200", "--stock-price", "12/m", "--machine-rate",
                          "1.5/min", "--setup-time", "0.75 h", "--handling-time", "30 s"], capsys)
    assert code == 0, err
    d = json.loads(out)
    c, t = cost_rows(d), d["times"]
    assert t["handling_time"] == 0.5 and t["setup_time"] == 45.0                # minutes
    assert rel(c["stock"]["per_part"], 12 * 0.085) < 1e-12              # per metre × stock length
    assert rel(c["machine time"]["per_part"], 90 * t["cycle_time"] / 60) < 1e-12   # 1.5/min = 90/h
    assert rel(c["set-up"]["batch"], 90 * 0.75) < 1e-12
    assert rel(c["total"]["batch"],
               200 * (c["stock"]["per_part"] + c["machine time"]["per_part"]) + 67.5) < 1e-12
    assert rel(c["total"]["per_part"], c["total"]["batch"] / 200) < 1e-12
    # whole bars: 6 bars of 3 m at 12/m
    code, out, err = run([SHAFT, "--json", "-q", "200", "--stock-price", "12/m", "--whole-bars"],
                         capsys)
    d = json.loads(out)
    assert d["bars"]["bars_needed"] == 6
    assert rel(cost_rows(d)["stock"]["batch"], 6 * 3.0 * 12) < 1e-12


def test_price_per_pound_round_trip(capsys):
    # 1.10 per lb is 1.10 / 0.45359237 per kg (1 lb = 0.45359237 kg, 1959 agreement)
    _, out_lb, _ = run([SHAFT, "--json", "--stock-price", "1.10/lb"], capsys)
    _, out_kg, _ = run([SHAFT, "--json", "--stock-price", f"{1.10 / 0.45359237!r}/kg"], capsys)
    a, b = cost_rows(json.loads(out_lb)), cost_rows(json.loads(out_kg))
    assert rel(a["stock"]["per_part"], b["stock"]["per_part"]) < 1e-12


def test_currency_written_with_the_price(capsys):
    code, out, err = run([SHAFT, "--json", "--stock-price", "2.40 EUR/kg"], capsys)
    assert code == 0, err
    d = json.loads(out)
    assert d["units"]["money"] == "EUR" and d["inputs"]["currency"] == "EUR"


def test_cutting_data_override_scales_the_time(capsys):
    _, base, _ = run([SHAFT, "--json"], capsys)
    _, fast, _ = run([SHAFT, "--json", "--roughing", "vc=400", "--finishing", "f=0.24"], capsys)
    b, f = json.loads(base), json.loads(fast)
    # t = V / (vc ap f) and A / (vc f): doubling vc or f halves the time (common practice)
    assert rel(f["times"]["roughing_time"], b["times"]["roughing_time"] / 2) < 1e-12
    assert rel(f["times"]["finishing_time"], b["times"]["finishing_time"] / 2) < 1e-12
    assert f["inputs"]["cutting_data_source"] == "given"
    assert b["inputs"]["cutting_data_source"] == "typical, common practice, no source"


def test_speed_limit_is_flagged_and_used(capsys):
    code, out, err = run([SHAFT, "--json", "--max-speed", "1200"], capsys)
    assert code == 0
    d = json.loads(out)
    assert d["times"]["speed_limit_rpm"] == 1200
    assert all(row["over_limit"] for row in d["cutting"])
    assert "over the machine limit" in err and err.count("\n") == 1
    assert any("over the machine limit" in n for n in d["notes"])
    _, free, _ = run([SHAFT, "--json"], capsys)
    assert d["times"]["finishing_time"] > json.loads(free)["times"]["finishing_time"]
    # a limit well above every speed needed changes nothing but the solid part's centre,
    # where the spindle would pass any limit; a high limit still costs only a little time
    _, high, err = run([SHAFT, "--json", "--max-speed", "100000"], capsys)
    h = json.loads(high)
    assert err == "" and not h["cutting"][0]["over_limit"]
    assert rel(h["times"]["roughing_time"], json.loads(free)["times"]["roughing_time"]) < 1e-3


def test_no_finish_leaves_a_face_out(capsys):
    _, out, _ = run([SHAFT, "--json", "--no-finish", "right end", "--no-finish", "left end"],
                    capsys)
    d = json.loads(out)
    faces = {row["face"]: row["finished"] for row in d["faces"]}
    assert faces["right end"] is False and faces["left end"] is False and faces["crown"] is True
    # end faces are discs and annuli: π r² (CRC, from memory): right end r = 18, left end r = 9
    # (in cm²: 1.8 and 0.9 cm)
    _, full, _ = run([SHAFT, "--json"], capsys)
    f = json.loads(full)
    assert rel(f["part"]["finished_surface"] - d["part"]["finished_surface"],
               math.pi * (1.8 ** 2 + 0.9 ** 2)) < 1e-12


def test_blank_of_given_length(capsys):
    code, out, err = run([SHAFT, "--json", "--blank", "45", "--blank-length", "90"], capsys)
    assert code == 0, err
    d = json.loads(out)
    s = d["stock"]
    assert s["stock_kind"] == "blank" and "bars" not in d
    assert s["stock_diameter"] == 45.0 and s["stock_length"] == 90.0
    assert rel(s["stock_volume"], math.pi * 2.25 ** 2 * 9.0) < 1e-12          # cm³


def test_lengths_take_fractions_and_units(capsys):
    # parting width 1/8 in = 3.175 mm (1959 agreement): 80 + 2 + 3.175 = 85.175 mm
    code, out, err = run([SHAFT, "--json", "--parting-width", "1/8 in"], capsys)
    assert code == 0, err
    assert rel(json.loads(out)["stock"]["stock_length"], 85.175) < 1e-12
    code, out, err = run([SHAFT, "--json", "--blank", "2 in", "--blank-length", "3 1/2 in"],
                         capsys)
    assert code == 0, err
    s = json.loads(out)["stock"]
    assert rel(s["stock_diameter"], 50.8) < 1e-12 and s["stock_label"] == "2 in"
    assert rel(s["stock_length"], 88.9) < 1e-12


# -- inch ---------------------------------------------------------------------------------


def test_inch_part_inch_list_and_units(capsys):
    code, out, err = run([SLEEVE, "--json", "--stock", "lighter"], capsys)
    assert code == 0, err
    d = json.loads(out)
    s = d["stock"]
    assert d["units"]["length"] == "in" and d["units"]["cutting_distance/time"] == "ft/min"
    assert s["stock_label"] == "2 × 1 in"
    assert s["stock_diameter"] == 2.0 and s["stock_inside_diameter"] == 1.0
    assert rel(d["part"]["part_volume"], SLEEVE_IN3) < 1e-12
    # 2.5 + 2/32 + 1/8 = 2.6875 in; floor((144 − 4) / 2.6875) = 52 (common practice, no source)
    assert rel(s["stock_length"], 2.6875) < 1e-12
    assert d["bars"]["parts_per_bar"] == 52
    code, out, err = run([SLEEVE], capsys)
    assert "in³" in out and re.search(r"│ lb\b", out) and "2 in" in out and "ft/min" in out


def test_inch_csv_round_trip_with_a_millimetre_drawing(tmp_path, capsys):
    # The same sleeve drawn in mm (× 25.4) quoted from the inch list gives the same CSV row.
    text = Path(SLEEVE).read_text(encoding="utf-8")
    mm = re.sub(r"(?<![\w.])(\d+\.?\d*)(?=[,\]])", lambda k: repr(float(k.group(1)) * 25.4),
                text).replace('units = "in"', 'units = "mm"')
    mm_file = write(tmp_path, "sleeve-mm.toml", mm)
    out_csv = tmp_path / "q.csv"
    code, out, err = run([SLEEVE, mm_file, "--bar-list", "inch", "--csv", out_csv], capsys)
    assert code == 0, err
    rows = list(csv.DictReader(out_csv.open(encoding="utf-8")))
    assert len(rows) == 2
    a, b = rows
    for key in a:
        if key in ("file", "name"):
            continue
        try:
            x, y = float(a[key]), float(b[key])
        except ValueError:
            assert a[key] == b[key], key
            continue
        assert x == pytest.approx(y, rel=1e-11), key
    assert float(a["stock_diameter (in)"]) == 2.0 and float(a["part_volume (in³)"]) == \
        pytest.approx(SLEEVE_IN3, rel=1e-11)
    # lb from kg: 1 lb = 0.45359237 kg (1959 agreement)
    assert float(a["part_mass (lb)"]) == pytest.approx(
        8800 * SLEEVE_IN3 * INCH ** 3 / 0.45359237, rel=1e-11)


# -- many parts ---------------------------------------------------------------------------


def test_many_parts_one_row_each_and_csv(tmp_path, capsys):
    pin = write(tmp_path, "pin.toml", PIN)
    out_csv = tmp_path / "quote.csv"
    code, out, err = run([SHAFT, SLEEVE, pin, "-q", "10", "--stock-price", "2/kg",
                          "--machine-rate", "60", "--csv", out_csv], capsys)
    assert code == 0, err
    assert "3 turned parts" in out and "10 of each" in out and "total" in out
    for stem in ("turned-stepped-shaft", "turned-sleeve-inch", "pin"):
        assert stem in out
    rows = list(csv.DictReader(out_csv.open(encoding="utf-8")))
    assert [r["file"] for r in rows] == [SHAFT, SLEEVE, pin]
    pin_row = rows[2]
    # pin ⌀30 × 50: 32 mm bar, 50 + 2 + 3 = 55 mm, V = π 15² 50 (CRC, from memory)
    assert pin_row["stock_label"] == "32 mm" and float(pin_row["stock_length (mm)"]) == \
        pytest.approx(55.0, rel=1e-15)
    assert float(pin_row["part_volume (cm³)"]) == pytest.approx(math.pi * 15 ** 2 * 50 / 1000,
                                                                 rel=1e-11)
    assert float(pin_row["utilisation_percent (%)"]) == pytest.approx(
        100 * 30 ** 2 * 50 / (32 ** 2 * 55), rel=1e-11)
    assert [n for n in os.listdir(tmp_path) if n.startswith(".")] == []   # no temporary left


def test_many_parts_json_and_quantity_per_part(tmp_path, capsys):
    pin = write(tmp_path, "pin.toml", PIN)
    code, out, err = run([SHAFT, pin, "--json", "-q", "5,7"], capsys)
    assert code == 0, err
    d = json.loads(out)
    assert [p["quantity"] for p in d["parts"]] == [5, 7]
    assert d["units"]["volume"] == "cm³" and d["inputs"]["quantity"] == [5, 7]
    assert len(d["cautions"]) == 1


def test_folder_of_profiles_leaves_out_other_inputs(tmp_path, capsys):
    write(tmp_path, "a-pin.toml", PIN)
    write(tmp_path, "b-pin.toml", PIN.replace("Plain pin", "Second pin"))
    write(tmp_path, "paint.toml", 'name = "a coating system"\n[[coat]]\ndft_um = 60\n')
    code, out, err = run([tmp_path], capsys)
    assert code == 0, err
    assert "2 turned parts" in out and "left out" in out and "paint.toml" in out
    assert "no [[loop]] or [[chain]]" in " ".join(out.split())


def test_names_with_brackets_are_shown_as_written(tmp_path, capsys):
    f = write(tmp_path, "seal.toml", PIN.replace('face = "outside"', 'face = "[seal] land"')
              .replace("Plain pin", "Pin [rev B]"))
    code, out, err = run([f], capsys)
    assert code == 0, err
    assert "[seal] land" in out and "Pin [rev B]" in out


def test_bad_file_among_good_ones_keeps_its_row(tmp_path, capsys):
    broken = write(tmp_path, "broken.toml", PIN.replace("{ close = true, face = \"end\" },", ""))
    out_csv = tmp_path / "rows.csv"
    code, out, err = run([SHAFT, broken, "--csv", out_csv], capsys)
    assert code == 2
    assert err.count("\n") == 1 and err.startswith("revolve: error: ") and broken in err
    assert "not closed" in err and "Traceback" not in err
    row = [line for line in out.splitlines() if line.startswith("broken")]
    assert len(row) == 1 and "error: " in row[0]
    rows = list(csv.DictReader(out_csv.open(encoding="utf-8")))
    assert [r["file"] for r in rows] == [SHAFT, broken]
    assert rows[1]["error"] and rows[1]["part_volume (cm³)"] == "" and not rows[0]["error"]


def test_existing_csv_is_refused_without_force(tmp_path, capsys):
    out_csv = tmp_path / "q.csv"
    out_csv.write_text("keep\n", encoding="utf-8")
    code, out, err = run([SHAFT, "--csv", out_csv], capsys)
    assert code == 2 and out == "" and err.count("\n") == 1
    assert "--csv" in err and "--force" in err
    assert out_csv.read_text(encoding="utf-8") == "keep\n"
    code, out, err = run([SHAFT, "--csv", out_csv, "--force"], capsys)
    assert code == 0, err
    assert out_csv.read_text(encoding="utf-8").startswith("file,name,material,part_diameter (mm)")


# -- bad input: exit 2, one line naming the file or option, nothing written ----------------


def _bad(tmp_path, capsys, args, *must):
    out_csv = tmp_path / "never.csv"
    code, out, err = run([*args, "--csv", out_csv], capsys)
    assert code == 2, (out, err)
    assert out == ""
    assert err.count("\n") == 1 and err.startswith("revolve: error: "), err
    assert "Traceback" not in err
    for text in must:
        assert text in err, (text, err)
    assert not out_csv.exists()
    assert [n for n in os.listdir(tmp_path) if n.startswith(".")] == []
    return err


def test_unknown_material(tmp_path, capsys):
    _bad(tmp_path, capsys, [SHAFT, "--material", "unobtainium"], "--material", "unknown material")


def test_material_in_the_file_unknown(tmp_path, capsys):
    f = write(tmp_path, "p.toml", PIN.replace("carbon steel", "cheese"))
    _bad(tmp_path, capsys, [f], f, ":4:", "material", "cheese")


def test_liquid_cannot_be_turned(tmp_path, capsys):
    _bad(tmp_path, capsys, [SHAFT, "--material", "water"], "--material", "cannot be turned")


@pytest.mark.parametrize("option", ["--turning-allowance", "--facing-allowance", "--parting-width",
                                    "--holding-length", "--bore-allowance", "--remnant"])
def test_negative_allowance(tmp_path, capsys, option):
    _bad(tmp_path, capsys, [SHAFT, option, "-1"], option, "zero or positive")


def test_part_larger_than_every_bar(tmp_path, capsys):
    big = write(tmp_path, "wheel.toml", PIN.replace(", 15]", ", 400]"))     # ⌀800 mm
    _bad(tmp_path, capsys, [big], big, "stock", "largest in the list is 300 mm")


def test_empty_folder(tmp_path, capsys):
    folder = tmp_path / "parts"
    folder.mkdir()
    _bad(tmp_path, capsys, [folder], str(folder), "no profile files")


def test_bad_file_alone_writes_nothing(tmp_path, capsys):
    broken = write(tmp_path, "broken.toml", PIN.replace("{ close = true, face = \"end\" },", ""))
    _bad(tmp_path, capsys, [broken], broken, "not closed")


def test_not_a_profile_file(tmp_path, capsys):
    junk = write(tmp_path, "junk.toml", "this is = = not toml")
    _bad(tmp_path, capsys, [junk], junk)


def test_missing_file(tmp_path, capsys):
    _bad(tmp_path, capsys, [tmp_path / "nope.toml"], "nope.toml", "no such file")


@pytest.mark.parametrize("args, must", [
    (["--stock-price", "3"], "--stock-price"),
    (["--stock-price", "3/h"], "neither a mass nor a length"),
    (["--roughing", "vc=fast"], "--roughing"),
    (["--finishing", "vc=0"], "--finishing"),
    (["--max-speed", "-5"], "--max-speed"),
    (["--setup-time", "3 kg"], "--setup-time"),
    (["--bar-list", "imperial"], "--bar-list"),
    (["--stock", "pipe"], "--stock"),
    (["--stock", "tube"], "no through bore"),
    (["--blank", "39"], "--blank"),
    (["--blank-length", "90"], "--blank-length"),
    (["--blank", "45", "--whole-bars"], "--whole-bars"),
    (["--blank", "45", "--stock", "tube"], "--blank"),
    (["--bar-length", "150"], "--bar-length"),
    (["--no-finish", "crownn"], "--no-finish"),
    (["-q", "0"], "--quantity"),
    (["-q", "2,3"], "--quantity"),
    (["-q", "2,,3"], "--quantity"),
    (["--parting-width", "three"], "--parting-width"),
    (["--bar-length", "1/0 in"], "--bar-length"),
    (["--remnant", "3 kg"], "--remnant"),
    (["--blank", "2 x 1 kg"], "--blank"),
    (["--stock-price", "2.40 EUR/kg", "--currency", "USD"], "--currency"),
    (["--axis", "1,2"], "--axis"),
])
def test_bad_options(tmp_path, capsys, args, must):
    _bad(tmp_path, capsys, [SHAFT, *args], must)


def test_part_revolution_is_refused(tmp_path, capsys):
    f = write(tmp_path, "half.toml", PIN.replace('units = "mm"', 'units = "mm"\nangle = 180'))
    _bad(tmp_path, capsys, [f], f, "full revolution")


# -- start-up -------------------------------------------------------------------------------


def test_quoting_lines_and_arcs_imports_no_heavy_library(tmp_path):
    code = (
        "import sys\n"
        "import revolve.cli.commands.turning\n"
        "assert 'revolve.jobs.turning' not in sys.modules, 'jobs imported at start-up'\n"
        "from revolve.cli.app import main\n"
        "try:\n"
        f"    main(['turn', {SHAFT!r}, '--json', '--max-speed', '2000'])\n"
        "except SystemExit:\n"
        "    pass\n"
        "heavy = [m for m in ('scipy', 'sympy', 'pint', 'matplotlib', 'ezdxf', 'trimesh')"
        " if m in sys.modules]\n"
        "print('HEAVY', heavy, file=sys.stderr)\n"
    )
    r = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=tmp_path)
    assert "HEAVY []" in r.stderr, r.stderr[-2000:]


def test_material_removed_block_shows_volume_and_mass_for_each_quantity(capsys):
    # issue 9: the holding piece was shown in cm³ next to the chips in kg. Each quantity of
    # the block now has a volume row and a mass row. Holding piece: π/4 · 42² · 20 mm³ of
    # the 42 mm bar (cylinder, CRC from memory) at 7850 kg/m³ (common practice, no source).
    code, out, err = run([SHAFT, "--holding-length", "20"], capsys)
    assert code == 0, err
    block = out.split("Material removed", 1)[1].split("utilisation", 1)[0]
    for what in ("removed", "holding piece (offcut),", "chips,"):
        assert re.search(re.escape(what) + r" ?volume[^│\n]*│\s+[\d.]+\s+│ cm³", block), what
        assert re.search(re.escape(what) + r" ?mass[^│\n]*│\s+[\d.]+\s+│ kg", block), what
    code, out, err = run([SHAFT, "--holding-length", "20", "--json"], capsys)
    d = json.loads(out)
    r = d["removed"]
    offcut = math.pi / 4 * 4.2 ** 2 * 2.0            # cm³
    assert rel(r["offcut_volume"], offcut) < 1e-12
    assert rel(r["offcut_mass"], 7850 * offcut * 1e-6) < 1e-12
    assert rel(r["offcut_mass"] + r["chip_mass"], r["removed_mass"]) < 1e-12


# -- the library: quote_turning(...).to_dict() is `revolve turn FILE --json` -----------------

TURNABLE = [ROOT / "profiles" / n for n in ("domed-lid.toml", "flanged-bushing.toml",
                                             "grooved-pulley.toml", "turned-sleeve-inch.toml",
                                             "turned-stepped-shaft.toml")]
SOLID_POINTS = [ROOT / "profiles" / "spacer-points.txt", ROOT / "profiles" / "tilted-ring.toml"]


@pytest.mark.parametrize("path", TURNABLE + SOLID_POINTS, ids=lambda p: p.name)
def test_library_to_dict_equals_the_command_json(path, capsys):
    import revolve
    from revolve.render.output import clean_json

    extra = ["--material", "aluminium 6061"] if path in SOLID_POINTS else []
    code, out, err = run([str(path), "--json", "-q", "25", "--stock-price", "3.10/kg",
                          "--machine-rate", "70/h", *extra], capsys)
    assert code == 0, err
    r = revolve.quote_turning(str(path), quantity=25, stock_price="3.10/kg", machine_rate="70/h",
                              material=extra[1] if extra else None)
    assert json.loads(json.dumps(clean_json(r.to_dict()), ensure_ascii=False)) == json.loads(out)
    assert "TurningResult" in repr(r) and "<table>" in r._repr_html_()


def test_library_quote_many_keeps_a_refused_file(tmp_path):
    import revolve

    b = revolve.quote_turning_many([SHAFT, tmp_path / "gone.toml"], quantity=[3, 4])
    rows = b.to_dict()["parts"]
    assert rows[0]["quantity"] == 3 and "no such file" in rows[1]["error"]
    assert [f for f, _ in b.failed] == [str(tmp_path / "gone.toml")]


def test_each_part_is_prepared_once(monkeypatch):
    # The quote reads the measurement's prepared profile instead of preparing again.
    import revolve
    from revolve.geometry import checks, measure

    calls = []
    real = checks.prepare

    def counting(*args, **kwargs):
        calls.append(1)
        return real(*args, **kwargs)

    monkeypatch.setattr(checks, "prepare", counting)
    monkeypatch.setattr(measure, "prepare", counting)
    revolve.quote_turning(SHAFT, max_speed="2000")
    assert len(calls) == 1


# -- generated option text: a quote or one line naming the option, never a traceback --------

from hypothesis import example, given, strategies as st  # noqa: E402


@given(st.sampled_from(["--parting-width", "--bar-length", "--blank", "--stock-price",
                        "--machine-rate", "--max-speed", "--roughing", "-q", "--grooves",
                        "--blind-bore", "--scrap", "--overhead", "--margin", "--drilling"]),
       st.text(alphabet="0123456789 ./-x,=EURkgminvcfap'\"", min_size=1, max_size=12))
@example("--parting-width", "1/0 in")
@example("-q", "0,1")
@example("--roughing", "vc=1e999")
@example("--grooves", "0 x 3 x 1")
@example("--grooves", "9999 x 1e-9 x 1")
@example("--blind-bore", "0 x 5")
@example("--margin", "99.99999")
def test_generated_option_text_is_quoted_or_refused_in_one_line(option, text):
    import contextlib
    import io

    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        try:
            main(["turn", SHAFT, "--json", option, text])
            code = 0
        except SystemExit as e:
            code = e.code
    assert "Traceback" not in err.getvalue()
    if code == 0:
        json.loads(out.getvalue())
    else:
        assert code == 2 and out.getvalue() == "", (option, text, err.getvalue())
        lines = err.getvalue().splitlines()
        assert len(lines) == 1 and lines[0].startswith("revolve: error: "), lines


# -- issue 14: operations, set-up, scrap, margin, the shop's stock, slender parts, inch shops ----
STOCK_LIST = ROOT / "examples" / "shop-stock-list.csv"
# Steel rows of revolve/data/operations.toml (typical, from memory), metric trade units.
STEEL_DRILL = (25.0, 0.15)            # vc m/min, f mm/rev


def ops_rows(d):
    return {row["operation"]: row for row in d["operations"]}


def drill_minutes(depth_mm, d_mm, vc=STEEL_DRILL[0], f=STEEL_DRILL[1], angle=118.0):
    """t = (hole depth + point length) / (f n), n = vc / (π d), point = (d/2) / tan(angle/2)
    (common practice, no source)."""
    n = vc * 1000 / (math.pi * d_mm)
    return (depth_mm + d_mm / 2 / math.tan(math.radians(angle / 2))) / (f * n)


def test_operations_are_listed_in_order_with_formulas(capsys):
    code, out, err = run([SHAFT, "--json", "--grooves", "2 x 3 x 1.5"], capsys)
    assert code == 0, err
    d = json.loads(out)
    names = [r["operation"] for r in d["operations"]]
    assert names == ["face", "rough turn", "rough to the profile", "finish turn", "groove",
                     "part off"]
    assert [r["operation"] for r in d["operation_formulas"]] == names
    assert all(r["formula"].startswith("t = ") for r in d["operation_formulas"])
    t = d["times"]
    assert rel(t["operations_time"], math.fsum(r["time"] for r in d["operations"])) < 1e-12
    assert rel(t["cycle_time"], t["operations_time"] + t["handling_time"]) < 1e-12
    # two grooves 3 mm wide, 1.5 mm deep at ⌀40, one plunge of a 3 mm tool each, at constant
    # vc: t = π (R² − r²) / (vc f), R = 20, r = 18.5 mm; vc 120 m/min, f 0.08 (common practice)
    g = ops_rows(d)["groove"]
    assert rel(g["time"], 2 * math.pi * (20 ** 2 - 18.5 ** 2) / (120e3 * 0.08)) < 1e-12
    # facing the ⌀42 bar end to the centre: π R² / (vc f), vc 200 m/min, f 0.25 mm/rev
    assert rel(ops_rows(d)["face"]["time"], math.pi * 21 ** 2 / (200e3 * 0.25)) < 1e-12


@pytest.mark.parametrize("bore, drill_d, bored", [("12 x 20", 10.0, True), ("6 x 15", 6.0, False)])
def test_drill_time_from_feed_and_point_length(tmp_path, capsys, bore, drill_d, bored):
    import revolve

    f = write(tmp_path, "pin.toml", PIN)
    code, out, err = run([f, "--json", "--blind-bore", bore], capsys)
    assert code == 0, err
    d = json.loads(out)
    depth = float(bore.split("x")[1])
    ops = ops_rows(d)
    # a bore of 8 mm or more is drilled 2 mm under size and bored; a smaller one drilled to
    # size (the bore rule of operations.toml, common practice, no source)
    assert rel(ops["drill"]["time"], drill_minutes(depth, drill_d)) < 1e-12
    assert rel(ops["drill"]["spindle_speed_rpm"], 25e3 / (math.pi * drill_d)) < 1e-12
    assert ("bore" in ops) is bored and "centre drill" in ops
    lib = revolve.quote_turning(f, blind_bore=bore)
    drill = [op for op in lib.operations if op.name == "drill"][0]
    assert rel(drill.time / 60, drill_minutes(depth, drill_d)) < 1e-12


def test_drilling_data_given_sets_the_drill_time(tmp_path, capsys):
    f = write(tmp_path, "pin.toml", PIN)
    code, out, err = run([f, "--json", "--blind-bore", "6 x 15", "--drilling", "vc=30,f=0.1"],
                         capsys)
    assert code == 0, err
    d = json.loads(out)
    assert rel(ops_rows(d)["drill"]["time"], drill_minutes(15, 6, 30, 0.1)) < 1e-12
    assert d["inputs"]["cutting_data_source"] == "given"


def test_scrap_raises_parts_started_and_bars(tmp_path, capsys):
    import revolve

    f = write(tmp_path, "pin.toml", PIN)
    _, plain, _ = run([f, "--json", "-q", "104"], capsys)
    code, out, err = run([f, "--json", "-q", "104", "--scrap", "3%"], capsys)
    assert code == 0, err
    p, d = json.loads(plain)["bars"], json.loads(out)["bars"]
    # 52 parts a bar (floor((3000 − 100) / 55)); ceil(104 × 1.03) = 108 started (by hand)
    assert p["parts_per_bar"] == d["parts_per_bar"] == 52
    assert (p["started"], p["bars_needed"]) == (104, 2)
    assert (d["started"], d["bars_needed"]) == (108, 3)
    lib = revolve.quote_turning(f, quantity=104, scrap="3%").to_dict()["bars"]
    assert (lib["started"], lib["bars_needed"]) == (108, 3)


def test_setup_overhead_and_margin_give_the_price(tmp_path, capsys):
    import revolve

    f = write(tmp_path, "pin.toml", PIN)
    args = ["-q", "100", "--stock-price", "2.40/kg", "--machine-rate", "85/h",
            "--setup-time", "30", "--scrap", "5", "--overhead", "15%", "--margin", "20%"]
    code, out, err = run([f, "--json", *args], capsys)
    assert code == 0, err
    d = json.loads(out)
    c, t = cost_rows(d), d["times"]
    started = 105                                                       # ceil(100 × 1.05)
    assert rel(c["machine time"]["batch"], 85 * started * t["cycle_time"] / 60) < 1e-12
    assert rel(c["set-up"]["batch"], 85 * 0.5) < 1e-12
    assert rel(c["stock"]["batch"], started * 2.40 * d["stock"]["stock_mass"]) < 1e-12
    cost = c["total"]["batch"]
    assert rel(c["overhead"]["batch"], 0.15 * cost) < 1e-12
    # margin as a share of the price: price = cost × 1.15 / (1 − 0.20) (common practice)
    assert rel(c["price"]["batch"], cost * 1.15 / 0.8) < 1e-12
    assert rel(c["price"]["per_part"], c["price"]["batch"] / 100) < 1e-12
    assert not any("set-up time is zero" in n for n in d["notes"])
    lib = revolve.quote_turning(f, quantity=100, stock_price="2.40/kg", machine_rate="85/h",
                                setup_time="30", scrap="5", overhead="15%", margin="20%")
    assert rel(lib.price_per_part, c["price"]["per_part"]) < 1e-12
    _, zero, _ = run([f, "--json", "--machine-rate", "85"], capsys)
    assert any("set-up time is zero" in n for n in json.loads(zero)["notes"])


def test_stock_list_replaces_the_sizes_and_gives_the_price(capsys):
    import revolve

    code, out, err = run([SHAFT, "--json", "-q", "20", "--stock-list", STOCK_LIST,
                          "--grade", "c45"], capsys)
    assert code == 0, err
    d = json.loads(out)
    s = d["stock"]
    # the shaft needs ⌀42 (⌀40 + 2 mm): the smallest C45 round bar covering it is 45 mm
    assert s["stock_label"] == "45 mm C45" and s["stock_diameter"] == 45
    assert s["stock_source"] == "shop-stock-list.csv line 5"
    assert d["bars"]["bar_length"] == 3000                          # the rack length, 3 m
    # 12.90 EUR per metre × the stock length per part (mm → m), 20 parts
    assert rel(cost_rows(d)["stock"]["batch"], 20 * 12.90 * s["stock_length"] / 1000) < 1e-12
    assert d["units"]["money"] == "EUR"
    lib = revolve.quote_turning(SHAFT, quantity=20, stock_list=str(STOCK_LIST), grade="C45")
    assert lib.stock_label == "45 mm C45"


def test_stock_list_bad_row_names_file_and_line(tmp_path, capsys):
    rack = write(tmp_path, "rack.csv", "shape,size,grade,price,length\n"
                 "round,45 mm,C45,12.90 EUR/m,3 m\nround,50,C45,15 EUR/m,3 m\n")
    err = _bad(tmp_path, capsys, [SHAFT, "--stock-list", rack], "rack.csv:3", "no unit")
    assert "column 'size'" in err


@pytest.mark.parametrize("args, must", [
    (["--scrap", "120"], "--scrap"),
    (["--overhead", "ten"], "--overhead"),
    (["--margin", "100"], "--margin"),
    (["--grooves", "2 x 3"], "--grooves"),
    (["--grooves", "2 x 3 x 25"], "--grooves"),
    (["--grooves", "30 x 3 x 1"], "wider together than the part"),
    (["--blind-bore", "12"], "--blind-bore"),
    (["--blind-bore", "12 x 500"], "--blind-bore"),
    (["--drilling", "vc=25,ap=1"], "--drilling"),
    (["--grade", "C45"], "--grade"),
    (["--stock-list", STOCK_LIST], "--grade"),
    (["--stock-list", STOCK_LIST, "--grade", "S355"], "--grade"),
    (["--stock-list", STOCK_LIST, "--grade", "C45", "--stock-price", "2/kg"], "--stock-price"),
    (["--stock-list", "/nonexistent/rack.csv"], "/nonexistent/rack.csv"),
    (["--stock-list", STOCK_LIST, "--grade", "C45", "--blank", "45"], "--blank"),
])
def test_bad_issue14_options(tmp_path, capsys, args, must):
    _bad(tmp_path, capsys, [SHAFT, *args], must)


def test_slender_part_is_warned_about(tmp_path, capsys):
    long_pin = PIN.replace("[50, 0]", "[60, 0]").replace("[50, 15]", "[60, 5]") \
        .replace("[0, 15]", "[0, 5]")
    f = write(tmp_path, "long.toml", long_pin)
    code, out, err = run([f, "--json"], capsys)
    assert code == 0, err
    notes = json.loads(out)["notes"]
    # L/D = 60/10 = 6, above 4: a tailstock (rule of thumb, common practice, no source)
    assert any("length over diameter 6" in n and "tailstock" in n and "common practice" in n
               for n in notes)
    code, out, _ = run([f, "--json", "--roughing", "ap=4"], capsys)
    # ap 4 mm is more than a quarter of the ⌀12 bar (rule of thumb, common practice)
    assert any("rough turn: the depth of cut 4 mm" in n and "implausible" in n
               for n in json.loads(out)["notes"])


def test_inch_shop_cutting_data_in_sfm_and_inch_per_rev(capsys):
    code, out, err = run([SLEEVE, "--json"], capsys)
    assert code == 0, err
    d = json.loads(out)
    assert d["units"]["cutting_distance/time"] == "ft/min"
    for row in d["operations"]:
        # round steps as inch shops write them (common practice, no source): sfm in 5s or 25s,
        # in/rev in 0.0005 in
        sfm, ipr = row["cutting_speed"], row["feed_per_rev"]
        assert abs(sfm / 5 - round(sfm / 5)) < 1e-9, row
        assert abs(ipr / 0.0005 - round(ipr / 0.0005)) < 1e-6, row
    code, out, err = run([SLEEVE, "--json", "--roughing", "vc=500,f=0.012,ap=0.08"], capsys)
    rough = ops_rows(json.loads(out))["rough turn"]
    assert (rough["cutting_speed"], rough["feed_per_rev"], rough["depth_of_cut"]) == \
        pytest.approx((500, 0.012, 0.08), rel=1e-12)


@pytest.mark.parametrize("path", [SHAFT, SLEEVE], ids=os.path.basename)
def test_library_equals_json_with_the_issue14_options(path, capsys):
    import revolve
    from revolve.render.output import clean_json

    opts = dict(quantity=40, machine_rate="70/h", setup_time="20", scrap="3%", overhead="10",
                margin="25%", grooves="1 x 3 x 1 mm", stock_list=str(STOCK_LIST), grade="C45")
    args = ["-q", "40", "--machine-rate", "70/h", "--setup-time", "20", "--scrap", "3%",
            "--overhead", "10", "--margin", "25%", "--grooves", "1 x 3 x 1 mm",
            "--stock-list", STOCK_LIST, "--grade", "C45"]
    code, out, err = run([path, "--json", *args], capsys)
    assert code == 0, err
    r = revolve.quote_turning(path, **opts)
    assert json.loads(json.dumps(clean_json(r.to_dict()), ensure_ascii=False)) == json.loads(out)


def test_inch_drill_time_with_the_inch_shop_sizes(capsys):
    code, out, err = run([SLEEVE, "--json"], capsys)
    assert code == 0, err
    d = json.loads(out)
    drill = ops_rows(d)["drill"]
    # the 1 1/8 in bore is drilled 1/16 in under size (inch rule of operations.toml, common
    # practice): ⌀1 1/16 in through the part's length; t = (depth + point) / (f n),
    # n = 12 sfm / (π d) rev/min with d in inches (1 ft = 12 in), point = (d/2) / tan 59°
    dia, depth = 1.0625, d["part"]["part_length"]
    n = 12 * drill["cutting_speed"] / (math.pi * dia)
    assert rel(drill["spindle_speed_rpm"], n) < 1e-12
    expect = (depth + dia / 2 / math.tan(math.radians(59))) / (drill["feed_per_rev"] * n)
    assert rel(drill["time"], expect) < 1e-12
    assert "⌀1.062 in × 2.5 in" in [r for r in d["operation_formulas"]
                                   if r["operation"] == "drill"][0]["detail"]


def test_stock_list_tube_is_bored_not_drilled(tmp_path, capsys):
    bushing = ROOT / "profiles" / "flanged-bushing.toml"
    out_csv = tmp_path / "q.csv"
    code, out, err = run([bushing, "--json", "-q", "30", "--stock", "tube", "--stock-list",
                          STOCK_LIST, "--grade", "C45", "--csv", out_csv], capsys)
    assert code == 0, err
    d = json.loads(out)
    s = d["stock"]
    # ⌀56 part + 2 mm needs ⌀58; the ⌀20 bore less 2 mm allows a stock bore up to 18 mm:
    # the 60 x 16 mm tube of the list
    assert s["stock_label"] == "60 x 16 mm C45" and s["stock_kind"] == "tube"
    names = [r["operation"] for r in d["operations"]]
    assert "drill" not in names and "centre drill" not in names and "bore" in names
    # 2.90 EUR per kg × stock mass × 30 parts
    assert rel(cost_rows(d)["stock"]["batch"], 30 * 2.90 * s["stock_mass"]) < 1e-12
    with open(out_csv, newline="", encoding="utf-8") as handle:
        row = next(csv.DictReader(handle))
    assert row["started"] == "30" and float(row["price_per_part (EUR)"]) > 0
