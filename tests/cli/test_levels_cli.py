"""`revolve levels` end to end: JSON rows, units, CSV, the inverse, every vessel example, bad input.

Figures are checked against published formulas (sources beside each); the
bundled examples are invented scenarios and are only run, never used as
check values.
"""

from __future__ import annotations

import csv
import json
import math
import subprocess
import sys
from pathlib import Path

import pytest

from revolve.cli.app import main
from revolve.jobs.measuring import CAUTIONS

ROOT = Path(__file__).resolve().parents[2]
EXAMPLES = sorted((ROOT / "profiles").glob("vessel-*.toml"))

# An upright cylinder of radius 10 in and height 24 in, drawn as a chain (axis along y).
DRUM_IN = """
units = "in"
orientation = "vertical"
[axis]
along = "y"
[[chain]]
start = [0, 0]
segments = [
  { line_to = [10, 0] },
  { line_to = [10, 24] },
  { line_to = [0, 24] },
]
"""

# A horizontal cylinder of radius 500 mm and length 2000 mm (a loop: the liquid space).
LYING_MM = """
units = "mm"
[[loop]]
start = [0, 0]
segments = [
  { line_to = [2000, 0] },
  { line_to = [2000, 500] },
  { line_to = [0, 500] },
  { close = true },
]
"""


def run(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main(list(args))
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def write(tmp_path, name, text):
    p = tmp_path / name
    p.write_text(text, encoding="utf-8")
    return str(p)


def segment(r, h):
    """CRC Standard Mathematical Tables (from memory): circular segment of height h."""
    return r * r * math.acos((r - h) / r) - (r - h) * math.sqrt(2 * r * h - h * h)


def test_json_is_one_object_with_the_rows_in_a_list(tmp_path, capsys):
    path = write(tmp_path, "drum.toml", DRUM_IN)
    code, out, err = run(["levels", path, "--orientation", "vertical", "--step", "6",
                          "--volume-unit", "in^3", "--json"], capsys)
    assert code == 0, err
    d = json.loads(out)
    rows = d["levels"]
    assert isinstance(rows, list)
    assert [r["level"] for r in rows] == pytest.approx([0, 6, 12, 18, 24], rel=1e-15)
    # CRC: cylinder π r² h (in³)
    for r in rows:
        assert r["volume"] == pytest.approx(math.pi * 100 * r["level"], rel=1e-14, abs=1e-12)
        assert not {"level_unit", "volume_unit", "capacity", "caution", "orientation"} & set(r)
    assert d["units"] == {"level": "in", "capacity": "in³", "area": "ft²"}
    assert d["cautions"] == [CAUTIONS["vessel"]]
    assert d["space"]["capacity"] == pytest.approx(math.pi * 100 * 24, rel=1e-14)
    assert (d["orientation"], d["orientation_from"]) == ("vertical", "asked")
    assert d["crosscheck"]["agrees"] is True
    assert rows[-1]["percent"] == pytest.approx(100.0, rel=1e-12)


def test_units_us_gallons_and_feet(tmp_path, capsys):
    path = write(tmp_path, "drum.toml", DRUM_IN)
    code, out, err = run(["levels", path, "--at", "1", "--level-unit", "ft", "--volume-unit",
                          "US_gallon", "--area-unit", "ft^2", "--json"], capsys)
    assert code == 0, err
    d = json.loads(out)
    (row,) = d["levels"]
    # 1 US gal = 231 in³ (US customary definition); 1 ft = 12 in (1959 agreement)
    assert row["level"] == 1.0
    assert row["volume"] == pytest.approx(math.pi * 100 * 12 / 231, rel=1e-14)
    assert row["wetted_area"] == pytest.approx((math.pi * 100 + 2 * math.pi * 10 * 12) / 144,
                                               rel=1e-14)
    assert (d["units"]["capacity"], d["units"]["area"]) == ("US gal", "ft²")


def test_horizontal_table_and_csv(tmp_path, capsys):
    path = write(tmp_path, "lying.toml", LYING_MM)
    out_csv = tmp_path / "table.csv"
    code, out, err = run(["levels", path, "--orientation", "horizontal", "--count", "4",
                          "--volume-unit", "L", "--csv", str(out_csv), "--json"], capsys)
    assert code == 0, err
    rows = json.loads(out)["levels"]
    for r in rows:
        # CRC: horizontal cylinder, L × circular segment (mm³ -> L: 1e-6)
        assert r["volume"] == pytest.approx(2000 * segment(500, r["level"]) * 1e-6, rel=1e-13,
                                            abs=1e-12)
    with open(out_csv, newline="", encoding="utf-8") as f:
        table = list(csv.reader(f))
    assert table[0] == ["level (mm)", "volume (L)", "full (%)", "wetted area (m²)",
                        "error estimate (L)"]
    assert [float(x) for x in table[3][:2]] == [rows[2]["level"], rows[2]["volume"]]


def test_screen_table_shows_the_caution_and_the_datum(tmp_path, capsys):
    path = write(tmp_path, "lying.toml", LYING_MM)
    code, out, err = run(["levels", path, "--orientation", "horizontal", "--count", "2",
                          "--volume-unit", "L"], capsys)
    assert code == 0, err
    assert "custody transfer" in out and "lowest inside point" in out
    assert "capacity" in out and "1570.8" in out and "L" in out


def test_inverse_by_volume_and_percent(tmp_path, capsys):
    path = write(tmp_path, "lying.toml", LYING_MM)
    cap = math.pi * 500 ** 2 * 2000 * 1e-6
    code, out, err = run(["levels", path, "--orientation", "horizontal", "--volume-unit", "L",
                          "--volume", f"{cap / 2!r},100", "--json"], capsys)
    assert code == 0, err
    rows = json.loads(out)["levels"]
    assert rows[0]["volume_asked"] == pytest.approx(cap / 2)
    assert rows[0]["level"] == pytest.approx(500.0, rel=1e-12)
    assert 2000 * segment(500, rows[1]["level"]) * 1e-6 == pytest.approx(100.0, rel=1e-11)
    code, out, err = run(["levels", path, "--orientation", "horizontal", "--percent", "50",
                          "--percent", "0,100", "--json"], capsys)
    rows = json.loads(out)["levels"]
    assert [r["percent_asked"] for r in rows] == [50.0, 0.0, 100.0]
    assert [r["level"] for r in rows] == pytest.approx([500.0, 0.0, 1000.0], rel=1e-12)


@pytest.mark.parametrize("orientation", ["vertical", "horizontal"])
@pytest.mark.parametrize("path", EXAMPLES, ids=[p.name for p in EXAMPLES])
def test_every_vessel_example(path, orientation, capsys):
    code, out, err = run(["levels", str(path), "--orientation", orientation, "--count", "20",
                          "--json"], capsys)
    assert code == 0, err
    d = json.loads(out)
    rows = d["levels"]
    volumes = [r["volume"] for r in rows]
    assert all(b > a for a, b in zip(volumes, volumes[1:]))
    assert rows[-1]["volume"] == pytest.approx(d["space"]["capacity"], rel=1e-12)


def test_console_script_entry_point(tmp_path):
    path = write(tmp_path, "drum.toml", DRUM_IN)
    res = subprocess.run([sys.executable, "-m", "revolve", "levels", path, "--step", "12",
                          "--json"], capture_output=True, text=True, cwd=ROOT, timeout=120)
    assert res.returncode == 0, res.stderr
    rows = json.loads(res.stdout)["levels"]
    assert [r["level"] for r in rows] == pytest.approx([0, 12, 24], rel=1e-15)


# -- orientation: carried by the file, the option wins, never guessed -----------------------

def _vessel_then_levels(tmp_path, capsys, orientation, head, levels_args):
    """revolve vessel ... -o t.toml, then revolve levels t.toml (no --orientation): the JSON."""
    tank = tmp_path / "t.toml"
    code, out, err = run(["vessel", "--diameter", "2000", "--length", "5000", "--head", head,
                          "--orientation", orientation, "-o", str(tank), "--json"], capsys)
    assert code == 0, err
    assert f'orientation = "{orientation}"' in tank.read_text(encoding="utf-8")
    code, out, err = run(["levels", str(tank), *levels_args, "--volume-unit", "mm^3", "--json"],
                         capsys)
    assert code == 0, err
    return json.loads(out)


def test_horizontal_vessel_round_trip_uses_the_files_orientation(tmp_path, capsys):
    # The input family: a vessel written lying down, read back with no --orientation.
    d = _vessel_then_levels(tmp_path, capsys, "horizontal", "flat", ["--count", "4"])
    rows = d["levels"]
    assert (d["orientation"], d["orientation_from"]) == ("horizontal", "file")
    # Full level is the diameter (2000 mm), not the length (5000 mm).
    assert rows[-1]["level"] == pytest.approx(2000.0, rel=1e-15)
    assert [r["level"] for r in rows] == pytest.approx([0, 500, 1000, 1500, 2000], rel=1e-15)
    for r in rows:
        # CRC (from memory): horizontal cylinder, V = L · circular segment area
        assert r["volume"] == pytest.approx(5000 * segment(1000, r["level"]), rel=1e-12,
                                            abs=1e-6)


def test_horizontal_vessel_with_ellipsoidal_heads_round_trip(tmp_path, capsys):
    d = _vessel_then_levels(tmp_path, capsys, "horizontal", "ellipsoidal", ["--at", "700"])
    (row,) = d["levels"]
    R, h = 1000.0, 700.0
    # CRC (from memory): L · circular segment; both 2:1 heads together π h² (3R − h)/6
    # (a sphere cap of the same depth halved along the axis; see CHECKS.md)
    expected = 5000 * segment(R, h) + math.pi * h * h * (3 * R - h) / 6
    assert d["orientation"] == "horizontal"
    assert row["volume"] == pytest.approx(expected, rel=1e-9)


def test_vertical_vessel_round_trip_uses_the_files_orientation(tmp_path, capsys):
    d = _vessel_then_levels(tmp_path, capsys, "vertical", "flat", ["--count", "2"])
    rows = d["levels"]
    assert d["orientation"] == "vertical"
    # CRC (from memory): cylinder π r² h; full level is the length
    assert rows[-1]["level"] == pytest.approx(5000.0, rel=1e-15)
    for r in rows:
        assert r["volume"] == pytest.approx(math.pi * 1000 ** 2 * r["level"], rel=1e-13)


def test_option_overrides_the_file_and_the_table_says_so(tmp_path, capsys):
    path = write(tmp_path, "lying.toml", 'orientation = "horizontal"\n' + LYING_MM)
    code, out, err = run(["levels", path, "--orientation", "vertical", "--count", "1", "--json"],
                         capsys)
    assert code == 0, err
    d = json.loads(out)
    assert d["orientation"] == "vertical" and d["orientation_from"] == "asked"
    assert d["levels"][-1]["level"] == pytest.approx(2000.0)   # along the axis: the length
    code, out, err = run(["levels", path, "--orientation", "vertical", "--count", "1"], capsys)
    assert code == 0, err
    assert "(as asked; the file says horizontal)" in out


def test_every_vessel_example_says_its_orientation(capsys):
    # The bundled examples carry their own orientation; the day tank lies on its side.
    says = {}
    for path in EXAMPLES:
        code, out, err = run(["levels", str(path), "--count", "1", "--json"], capsys)
        assert code == 0, err
        d = json.loads(out)
        assert d["orientation_from"] == "file"
        says[path.name] = d["orientation"]
    assert says["vessel-diesel-day-tank.toml"] == "horizontal"
    assert says["vessel-rainwater-tank.toml"] == says["vessel-brew-kettle.toml"] == "vertical"


@pytest.mark.parametrize("name,text", [
    ("lying.toml", LYING_MM),                       # a profile file without orientation
    ("lying.csv", "0,0\n2000,0\n2000,500\n0,500\n"),  # a point list cannot say
])
def test_no_orientation_anywhere_is_refused(tmp_path, capsys, name, text):
    path = write(tmp_path, name, text)
    out_csv = tmp_path / "out.csv"
    code, out, err = run(["levels", path, "--count", "4", "--csv", str(out_csv)], capsys)
    assert code == 2 and out == ""
    lines = err.strip().splitlines()
    assert len(lines) == 1 and "Traceback" not in err
    assert name in lines[0] and "--orientation" in lines[0]
    assert not out_csv.exists()


def test_bad_orientation_in_the_file_names_file_line_and_key(tmp_path, capsys):
    path = write(tmp_path, "odd.toml", 'orientation = "on\\nits side"\n' + LYING_MM)
    code, out, err = run(["levels", path, "--count", "4"], capsys)
    assert code == 2
    (line,) = err.strip().splitlines()
    assert "odd.toml:1: orientation: orientation must be" in line
    assert '"on\\nits side"' in line     # the user's newline is shown escaped, on one line


# -- bad input: exit 2, one line naming the file or option, nothing written ----------------

OFF_AXIS = """
units = "mm"
orientation = "vertical"
[axis]
along = "y"
[[chain]]
start = [0, 0]
segments = [
  { line_to = [10, 0] },
  { line_to = [10, 24] },
]
"""

HALF_TURN = """
units = "mm"
angle = 180
orientation = "vertical"
[[loop]]
start = [0, 0]
segments = [ { line_to = [10, 0] }, { line_to = [10, 5] }, { line_to = [0, 5] }, { close = true } ]
"""


@pytest.mark.parametrize("text,args,expected", [
    (DRUM_IN, ["--at", "30"], "--at: level 30 in is above the full level 24 in"),
    (DRUM_IN, ["--at", "x"], "--at: 'x' is not a length"),
    (DRUM_IN, ["--at", "5 kg"], "--at: 'kg' is a mass unit"),
    (DRUM_IN, ["--at", "1,,2"], "--at: item 2 is empty"),
    (DRUM_IN, ["--step", "1/0 in"], "--step: '1/0 in': a fraction cannot have 0"),
    (DRUM_IN, ["--volume", "3 m"], "--volume: 'm' is a length unit"),
    (DRUM_IN, ["--area-unit", "mm"], "--area-unit: 'mm' is a length unit"),
    (DRUM_IN, ["--step", "0"], "--step: the step must be a positive number"),
    (DRUM_IN, ["--step", "1e-9"], "--step: a step of 1e-09 in gives"),
    (DRUM_IN, ["--count", "0"], "--count: the count must be 1 or more"),
    (DRUM_IN, ["--step", "2", "--count", "3"], "give one of --step, --count"),
    (DRUM_IN, ["--volume", "1e9"], "--volume: volume 1e+09 US gal is more than the capacity"),
    (DRUM_IN, ["--percent", "101"], "--percent: '101' is not a percentage from 0 to 100"),
    (DRUM_IN, ["--volume-unit", "kg"], "--volume-unit: 'kg' is a mass unit"),
    (DRUM_IN, ["--level-unit", "L"], "--level-unit: 'L' is a volume unit"),
    (DRUM_IN, ["--orientation", "sideways"], "--orientation: give vertical or horizontal"),
    (OFF_AXIS, [], "chain 1: the chain ends at (10, 24), off the axis"),
    (HALF_TURN, [], "bad.toml:3: angle: a level table needs a full revolution"),
    # hostile files (issue 9): deep nesting, a 100 001-digit number, a huge exponent
    ("name = " + "[" * 1000 + "]" * 1000 + DRUM_IN, [], "bad.toml:1: name: brackets nest 17 deep"),
    (DRUM_IN.replace("[10, 0]", "[1" + "0" * 100_000 + ", 0]"), [],
     "bad.toml:9: line_to: a number (or other unquoted word) of 100001 characters is too long"),
    (DRUM_IN.replace("[10, 0]", "[1e999999999, 0]"), [],
     "bad.toml:9: chain 1, segment 1: line_to x is too large"),
])
def test_bad_input(tmp_path, capsys, text, args, expected):
    path = write(tmp_path, "bad.toml", text)
    out_csv = tmp_path / "out.csv"
    code, out, err = run(["levels", path, *args, "--csv", str(out_csv)], capsys)
    assert code == 2
    lines = err.strip().splitlines()
    assert len(lines) == 1 and "Traceback" not in err
    assert expected in lines[0]
    if "chain" in expected:
        assert "bad.toml" in lines[0]
    assert not out_csv.exists()
    assert out == ""


def test_an_unwritable_csv_is_refused_naming_the_option(tmp_path, capsys):
    """Bad input: a --csv path in a missing folder; exit 2, one line naming --csv and the file."""
    path = write(tmp_path, "lying.toml", LYING_MM)
    target = tmp_path / "missing" / "t.csv"
    code, out, err = run(["levels", path, "--orientation", "horizontal", "--count", "3",
                          "--csv", str(target)], capsys)
    assert code == 2
    assert err.count("\n") == 1 and err.startswith("revolve: error: --csv: ")
    assert str(target) in err
    assert not target.exists()


# -- levels with units and fractions (issue 12) ------------------------------------------------

def test_step_and_levels_with_units_and_fractions(tmp_path, capsys):
    path = write(tmp_path, "drum.toml", DRUM_IN)
    code, out, err = run(["levels", path, "--step", "1/8 in", "--level-unit", "in", "--json"],
                         capsys)
    assert code == 0, err
    rows = json.loads(out)["levels"]
    # 24 in / (1/8 in) = 192 intervals, 193 rows; CRC: cylinder π r² h; 1 US gal = 231 in³
    assert len(rows) == 193 and rows[1]["level"] == 0.125
    assert rows[1]["volume"] == pytest.approx(math.pi * 100 * 0.125 / 231, rel=1e-13)
    code, out, err = run(["levels", path, "--at", "254 mm,1 ft", "--at", "3 1/2 in",
                          "--json"], capsys)
    assert code == 0, err
    rows = json.loads(out)["levels"]
    # 1 in = 25.4 mm exactly (1959 agreement)
    assert [r["level"] for r in rows] == pytest.approx([10.0, 12.0, 3.5], rel=1e-15)
    code, out, err = run(["levels", path, "--volume", "1 US_gallon,2", "--json"], capsys)
    rows = json.loads(out)["levels"]
    assert [r["level"] for r in rows] == pytest.approx([231 / (math.pi * 100),
                                                       462 / (math.pi * 100)], rel=1e-12)


def test_the_table_reads_cleanly(tmp_path, capsys):
    path = write(tmp_path, "lying.toml", LYING_MM)
    code, out, err = run(["levels", path, "--orientation", "horizontal", "--count", "2"], capsys)
    assert code == 0, err
    assert "100 %" in out and "100.0000" not in out and "m^" not in out
    assert "mm³" not in out and "1570.8" in out


# -- the one overwrite rule: --csv refuses an existing file unless --force --------------------

def test_existing_csv_is_refused_without_force_and_replaced_with_it(tmp_path, capsys):
    path = write(tmp_path, "lying.toml", LYING_MM)
    target = tmp_path / "t.csv"
    target.write_text("previous\n", encoding="utf-8")
    args = ["levels", path, "--orientation", "horizontal", "--count", "3", "--csv", str(target)]
    code, out, err = run(args, capsys)
    assert code == 2 and out == "" and err.count("\n") == 1
    assert err.startswith("revolve: error: --csv: ") and "--force" in err
    assert target.read_text(encoding="utf-8") == "previous\n"
    code, out, err = run(args + ["--force"], capsys)
    assert code == 0, err
    assert target.read_text(encoding="utf-8").startswith("level (mm),volume (L)")


# -- the library: revolve.level_table(...).to_dict() is the command's --json -------------------

@pytest.mark.parametrize("args,kwargs", [
    (["--count", "7"], dict(count=7)),
    (["--step", "1/8 in", "--level-unit", "in", "--area-unit", "ft^2"],
     dict(step="1/8 in", level_unit="in", area_unit="ft^2")),
    (["--at", "100 mm,0.3 m"], dict(at="100 mm,0.3 m")),
    (["--volume", "10 L,100", "--volume-unit", "US_gallon"],
     dict(volumes=["10 L", 100], volume_unit="US_gallon")),
    (["--percent", "5,50,95", "--orientation", "horizontal"],
     dict(percent=[5, 50, 95], orientation="horizontal")),
])
@pytest.mark.parametrize("path", EXAMPLES, ids=[p.name for p in EXAMPLES])
def test_library_to_dict_equals_the_json_for_every_vessel_example(path, args, kwargs, capsys):
    import revolve

    code, out, err = run(["levels", str(path), *args, "--json"], capsys)
    assert code == 0, err
    library = revolve.level_table(str(path), **kwargs).to_dict()
    assert json.loads(json.dumps(library)) == json.loads(out)


# -- generated options (hypothesis): a table that checks out, or one line naming the option ----

from hypothesis import example, given, settings  # noqa: E402
from hypothesis import strategies as st  # noqa: E402

_AMOUNTS = st.one_of(st.integers(0, 40).map(str), st.sampled_from(["1/8", "3 1/2", "0.5", "1/0",
                                                                   "-2", "2.5e1", "", "x"]))
_UNITS = st.sampled_from(["", " in", " mm", " ft", " cm", " kg", " L", "in", " furlong"])


@settings(max_examples=40, deadline=None)
@given(option=st.sampled_from(["--step", "--at"]),
       items=st.lists(st.tuples(_AMOUNTS, _UNITS), min_size=1, max_size=3))
@example(option="--step", items=[("1/8", " in")])
@example(option="--at", items=[("3 1/2", " in"), ("254", " mm")])
@example(option="--at", items=[("1/0", " in")])
def test_generated_levels_options(tmp_path_factory, option, items):
    import contextlib
    import io

    tmp = tmp_path_factory.mktemp("gen")
    path = write(tmp, "drum.toml", DRUM_IN)
    out_csv = tmp / "t.csv"
    value = ",".join(a + u for a, u in items)
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        with pytest.raises(SystemExit) as stop:
            main(["levels", path, option, value, "--level-unit", "in", "--volume-unit", "in^3",
                  "--csv", str(out_csv), "--json"])
    if stop.value.code == 2:
        (line,) = err.getvalue().strip().splitlines()
        assert line.startswith(f"revolve: error: {option}: ") and "Traceback" not in line
        assert out.getvalue() == "" and not out_csv.exists()
        return
    assert stop.value.code in (0, None), err.getvalue()
    d = json.loads(out.getvalue())
    for r in d["levels"]:
        # CRC: cylinder π r² h (r = 10 in), levels and volumes in in and in³
        assert 0 <= r["level"] <= 24 * (1 + 1e-15)
        assert r["volume"] == pytest.approx(math.pi * 100 * r["level"], rel=1e-13, abs=1e-9)
    assert out_csv.exists()
