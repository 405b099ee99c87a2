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
from revolve.jobs.results import CAUTIONS

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
@given(option=st.sampled_from(["--step", "--at", "--ullage"]),
       items=st.lists(st.tuples(_AMOUNTS, _UNITS), min_size=1, max_size=3))
@example(option="--step", items=[("1/8", " in")])
@example(option="--at", items=[("3 1/2", " in"), ("254", " mm")])
@example(option="--at", items=[("1/0", " in")])
@example(option="--ullage", items=[("3 1/2", " in"), ("30", " in")])
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
                  "--csv", str(out_csv), "--json",
                  *(["--reference-height", "2 ft"] if option == "--ullage" else [])])
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


# -- gauge tables (issue 13): tilt, readings, increments, deadwood, temperature, uncertainty ----

DIESEL = ROOT / "profiles" / "vessel-diesel-day-tank.toml"
DEADWOOD = ROOT / "examples" / "deadwood-diesel-day-tank.toml"
UNCERTAINTY = ROOT / "examples" / "uncertainty-diesel-day-tank.toml"


def _json(args, capsys):
    code, out, err = run(["levels", *args, "--json"], capsys)
    assert code == 0, err
    return json.loads(out)


@pytest.mark.parametrize("tilt", [-3.0, 1.5, 4.0])
def test_tilted_table_against_scipy_quad_of_circular_segments(tmp_path, capsys, tilt):
    # CHECKS.md "tilted horizontal cylinder, flat ends": V = ∫ A_seg(d(s)) ds with
    # d(s) = h/cos α − s tan α (s along the axis from the gauge point at mid-length);
    # A_seg: CRC circular segment (from memory); integrated with scipy.integrate.quad
    from scipy.integrate import quad

    path = write(tmp_path, "lying.toml", LYING_MM)
    d = _json([path, "--orientation", "horizontal", "--tilt", str(tilt), "--count", "6",
               "--volume-unit", "mm^3"], capsys)
    a = math.radians(tilt)
    R, L = 500.0, 2000.0

    def area(depth):
        depth = min(max(depth, 0.0), 2 * R)
        return segment(R, depth) if depth < 2 * R else math.pi * R * R

    for row in d["levels"]:
        h = row["level"]
        ref = quad(lambda s: area(h / math.cos(a) - s * math.tan(a)), -L / 2, L / 2,
                   limit=200, epsabs=1e-6, epsrel=1e-12)[0]
        assert row["volume"] == pytest.approx(ref, rel=1e-9, abs=1e-9 * math.pi * R * R * L)
    assert d["crosscheck"]["agrees"] and d["crosscheck"]["tilted_difference"] < 1e-4
    assert d["gauge"]["tilt_degrees"] == tilt
    assert gauging_caution() in d["cautions"]


def gauging_caution():
    from revolve.jobs.gauging import CALIBRATION_CAUTION

    return CALIBRATION_CAUTION


@pytest.mark.parametrize("path,orientation", [(DIESEL, "horizontal"),
                                              (ROOT / "profiles" / "vessel-brew-kettle.toml",
                                               "vertical")])
def test_tilt_through_the_command_is_tilted_levels_and_zero_is_the_level_table(path, orientation,
                                                                               capsys):
    # the command against the tilted engine called directly, and --tilt 0 against the untilted
    # table (clipping / horizontal segments, checked against CRC formulas in tests/jobs)
    from revolve.formats import load_profile
    from revolve.geometry.tilted import tilted_levels
    from revolve.jobs.levels import liquid_space

    doc = load_profile(str(path))
    space = liquid_space(doc.profile, doc.axis, orientation=orientation)
    tilted = _json([str(path), "--orientation", orientation, "--tilt", "2.5", "--count", "8",
                    "--level-unit", doc.profile.unit, "--volume-unit", f"{doc.profile.unit}^3"],
                   capsys)
    levels = [r["level"] for r in tilted["levels"]]
    v = tilted_levels(space.prepared, levels, 2.5, orientation)[0]
    assert [r["volume"] for r in tilted["levels"]] == pytest.approx(list(v), rel=1e-12, abs=1e-9)
    level = _json([str(path), "--orientation", orientation, "--count", "8"], capsys)
    zero = _json([str(path), "--orientation", orientation, "--count", "8", "--tilt", "0"],
                 capsys)
    assert [r["level"] for r in zero["levels"]] == pytest.approx(
        [r["level"] for r in level["levels"]], abs=1e-9)
    cap = level["space"]["capacity"]
    for a, b in zip(zero["levels"], level["levels"]):
        assert a["volume"] == pytest.approx(b["volume"], abs=1e-9 * cap)


def test_tilted_inverse_lookups_give_back_their_volumes(capsys):
    # the level found for a volume holds that volume (scipy brentq on the tilted table)
    d = _json([str(DIESEL), "--tilt", "-2", "--volume", "100 L,1500 L,3000 L"], capsys)
    assert [r["volume"] for r in d["levels"]] == pytest.approx([100, 1500, 3000], rel=1e-9)
    p = _json([str(DIESEL), "--tilt", "-2", "--percent", "50"], capsys)
    assert p["levels"][0]["percent"] == pytest.approx(50.0, rel=1e-9)
    level = _json([str(DIESEL), "--percent", "50"], capsys)
    assert p["levels"][0]["level"] != pytest.approx(level["levels"][0]["level"], abs=1e-3)


def test_ullage_is_at_reference_height_minus_ullage_and_round_trips(tmp_path, capsys):
    # innage = H − ullage, level = innage + datum offset (the definitions of the gauge datum,
    # common practice, no source); volumes: CRC cylinder π r² h
    path = write(tmp_path, "drum.toml", DRUM_IN)
    by_ullage = _json([path, "--reference-height", "2 ft", "--datum-offset", "1/2 in",
                       "--ullage", "1 ft,3 1/4 in,20 in", "--volume-unit", "in^3"], capsys)
    by_innage = _json([path, "--reference-height", "2 ft", "--datum-offset", "1/2 in",
                       "--at", "12 in,20 3/4 in,4 in", "--volume-unit", "in^3"], capsys)
    for u, i, asked in zip(by_ullage["levels"], by_innage["levels"], (12, 3.25, 20)):
        assert u["ullage"] == pytest.approx(asked, abs=1e-12)
        assert u["innage"] == pytest.approx(24 - asked, abs=1e-12)
        assert u["level"] == pytest.approx(24 - asked + 0.5, abs=1e-12)
        assert i["ullage"] == pytest.approx(u["ullage"], abs=1e-12)     # and back
        assert u["volume"] == pytest.approx(i["volume"], rel=1e-14)
        assert u["volume"] == pytest.approx(math.pi * 100 * u["level"], rel=1e-13)
    assert by_ullage["gauge"]["reading"] == "ullage"
    assert by_ullage["space"]["reference_height"] == 24
    assert by_ullage["space"]["datum_offset"] == 0.5


def test_increments_sum_to_the_capacity_and_each_is_a_slice(tmp_path, capsys):
    # CRC: cylinder π r² h; the increments of a table from empty to full add up to the capacity
    path = write(tmp_path, "drum.toml", DRUM_IN)
    d = _json([path, "--step", "1/8 in", "--volume-unit", "in^3"], capsys)
    rows = d["levels"]
    inc = [r["increment"] for r in rows]
    assert inc[-1] is None
    assert math.fsum(inc[:-1]) == pytest.approx(d["space"]["capacity"], rel=1e-13)
    assert inc[:-1] == pytest.approx([math.pi * 100 / 8] * 192, rel=1e-12)
    # a partial last increment, in mm on a lying vessel: 1 cm steps
    lying = write(tmp_path, "lying.toml", LYING_MM)
    d = _json([lying, "--orientation", "horizontal", "--step", "3 cm", "--volume-unit", "mm^3"],
              capsys)
    rows = d["levels"]
    assert rows[-1]["level"] == 1000 and rows[-2]["level"] == 990
    assert math.fsum(r["increment"] for r in rows[:-1]) == pytest.approx(
        2000 * math.pi * 500 ** 2, rel=1e-12)


def test_levels_in_feet_inches_and_fractions(tmp_path, capsys):
    # text that reads back (revolve.inputs.parse_length) to the level, to the nearest 1/16 in
    from revolve.inputs import parse_length

    path = write(tmp_path, "drum.toml", DRUM_IN)
    d = _json([path, "--at", "1' 4 1/8\"", "--at", "0.3 in"], capsys)
    texts = [r["level_text"] for r in d["levels"]]
    assert texts == ['1\' 4 1/8"', '0\' 0 5/16"']
    for r in d["levels"]:
        assert parse_length(r["level_text"]).value == pytest.approx(r["level"], abs=1 / 32)
    step = _json([path, "--step", "1/64 in"], capsys)
    assert step["levels"][1]["level_text"] == '0\' 0 1/64"'
    plain = _json([path, "--at", "3 in", "--level-format", "decimal"], capsys)
    assert "level_text" not in plain["levels"][0]
    mm = _json([path, "--at", "3 in", "--level-unit", "mm"], capsys)
    assert "level_text" not in mm["levels"][0]
    forced = _json([path, "--at", "3 in", "--level-unit", "mm", "--level-format", "feet-inches"],
                   capsys)
    assert forced["levels"][0]["level_text"] == '0\' 3"'


def test_shell_temperature_factor_against_its_formula(tmp_path, capsys):
    # CTSh = 1 + 2αΔT + α²ΔT² (API MPMS ch. 12.1.1, from memory); α = 6.2e-6 /°F
    path = write(tmp_path, "drum.toml", DRUM_IN)
    plain = _json([path, "--count", "4"], capsys)
    hot = _json([path, "--count", "4", "--shell-temperature", "95 °F", "--base-temperature",
                 "60 °F", "--expansion", "6.2e-6 /°F"], capsys)
    alpha, dT = 6.2e-6, 35.0          # per °F and °F: αΔT has no unit
    factor = 1 + 2 * alpha * dT + (alpha * dT) ** 2
    assert hot["space"]["shell_factor"] == pytest.approx(factor, rel=1e-14)
    for a, b in zip(hot["levels"], plain["levels"]):
        assert a["volume"] == pytest.approx(factor * b["volume"], rel=1e-14)
    assert any("CTSh = 1 + 2αΔT + α²ΔT²" in n and "API MPMS" in n for n in hot["notes"])
    assert gauging_caution() in hot["cautions"]
    steel = _json([path, "--count", "1", "--shell-temperature", "35 degC",
                   "--base-temperature", "15 °C", "--shell-material", "carbon steel"], capsys)
    # carbon steel about 12e-6 /K (common practice, no source); the table's figure 11.16e-6
    alpha_steel = (steel["space"]["shell_factor"] - 1) / (2 * 20)     # first order in αΔT
    assert alpha_steel == pytest.approx(12e-6, rel=0.1)


def test_deadwood_example_deducts_each_item(capsys):
    # spread items: the volume times the share of their range below the level (the definition);
    # the heater tube: a horizontal cylinder r = 30 mm, 2 m long, on the axis: 2 m × the CRC
    # circular segment of the depth above its bottom (570 mm above the lowest inside point)
    plain = _json([str(DIESEL), "--at", "100 mm,600 mm,1100 mm", "--volume-unit", "m^3"], capsys)
    d = _json([str(DIESEL), "--at", "100 mm,600 mm,1100 mm", "--volume-unit", "m^3",
               "--deadwood", str(DEADWOOD)], capsys)

    def spread(v, lo, hi, h):
        return v * min(max((h - lo) / (hi - lo), 0.0), 1.0)

    for row, base, h in zip(d["levels"], plain["levels"], (100, 600, 1100)):
        tube = 2.0 * segment(0.03, min(max((h - 570) / 1000, 0.0), 0.06)) if h > 570 else 0.0
        expected = (spread(2.4e-3, 30, 1200, h) + spread(0.9e-3, 150, 900, h) - 3.5e-3 + tube)
        assert row["deducted"] == pytest.approx(expected, rel=1e-9, abs=1e-12)
        assert row["volume"] == pytest.approx(base["volume"] - expected, rel=1e-12)
        assert row["vessel_volume"] == pytest.approx(base["volume"], rel=1e-14)


def test_gum_uncertainty_of_the_example_and_its_largest_contributor(capsys):
    # JCGM 100:2008 5.1.2 with the derivatives by hand: V = π D² L/4 + (π/6) D² (h1 + h2)
    # (cylinder and half spheroids, CRC from memory; 2:1 heads h = D/4, common practice), the
    # head depths toleranced apart: ∂V/∂D = π D L/2 + (π/3) D (h1 + h2), ∂V/∂L = π D²/4,
    # ∂V/∂h = π D²/6; rectangular u = a/√3, normal u = a/k (GUM 4.3.7, 4.3.9)
    d = _json([str(DIESEL), "--count", "4", "--uncertainty", str(UNCERTAINTY),
               "--volume-unit", "m^3"], capsys)
    D, L, h = 1.2, 2.4, 0.3
    uD, uL, uh = 0.003 / math.sqrt(3), 0.004 / 2, 0.003 / math.sqrt(3)
    expected = math.sqrt(((math.pi * D * L / 2 + math.pi / 3 * D * 2 * h) * uD) ** 2
                         + (math.pi * D ** 2 / 4 * uL) ** 2
                         + 2 * (math.pi * D ** 2 / 6 * uh) ** 2)
    assert d["space"]["capacity_uncertainty"] == pytest.approx(expected, rel=1e-5)
    assert d["levels"][-1]["largest_contributor"] == "diameter"
    assert d["levels"][0]["volume_uncertainty"] < 1e-5 * expected      # empty: next to nothing
    assert any("JCGM 100:2008" in n for n in d["notes"])
    assert any("shell diameter" in n and "largest contributors" in n for n in d["notes"])
    assert any("head 1 inside depth u = 0.001732 m" in n for n in d["notes"])


RAINWATER = ROOT / "profiles" / "vessel-rainwater-tank.toml"
RAINWATER_UNCERTAINTY = ROOT / "examples" / "uncertainty-rainwater-tank.toml"


def test_head_radii_and_cone_angle_of_the_rainwater_example(capsys):
    # the torispherical bottom's radii and the cone roof's angle count in the capacity's u
    # (JCGM 100:2008 5.1.2), and a level in the shell has a smaller u than the full vessel
    d = _json([str(RAINWATER), "--at", "1000 mm,1500 mm", "--uncertainty",
               str(RAINWATER_UNCERTAINTY), "--volume-unit", "m^3"], capsys)
    note = next(n for n in d["notes"] if "largest contributors" in n)
    for words in ("head 1 crown radius", "head 1 knuckle radius", "head 2 cone half-angle"):
        assert words in note
    assert d["space"]["capacity_uncertainty"] > d["levels"][0]["volume_uncertainty"] > 0
    assert d["levels"][0]["largest_contributor"] in ("diameter", "head_1_crown",
                                                     "head_1_knuckle")


def test_picture_and_report(tmp_path, capsys):
    from PIL import Image

    picture, report = tmp_path / "t.png", tmp_path / "t.html"
    code, out, err = run(["levels", str(DIESEL), "--tilt", "1", "--step", "100 mm",
                          "--datum-offset", "10 mm", "--picture", str(picture),
                          "--report", str(report)], capsys)
    assert code == 0, err
    with Image.open(picture) as im:
        assert im.format == "PNG" and im.size[0] > 300
    page = report.read_text(encoding="utf-8")
    assert page.count("<svg") == 1 and "Gauge table" in page and "innage (mm)" in page
    assert "accredited body" in page and "http" not in page.split("<svg", 1)[1]
    svg = tmp_path / "t.svg"
    code, out, err = run(["levels", str(DIESEL), "--picture", str(svg)], capsys)
    assert code == 0 and svg.read_text(encoding="utf-8").lstrip().startswith("<?xml")


@pytest.mark.parametrize("option,name", [("--picture", "t.png"), ("--report", "t.html"),
                                         ("--csv", "t.csv")])
def test_every_file_is_refused_without_force_and_replaced_with_it(tmp_path, capsys, option,
                                                                  name):
    target = tmp_path / name
    target.write_text("previous\n", encoding="utf-8")
    others = {"--picture": "o.png", "--report": "o.html", "--csv": "o.csv"}
    extra = [x for o, n in others.items() if o != option for x in (o, str(tmp_path / n))]
    args = ["levels", str(DIESEL), "--tilt", "1", "--count", "3", option, str(target), *extra]
    code, out, err = run(args, capsys)
    assert code == 2 and out == "" and err.count("\n") == 1
    assert err.startswith(f"revolve: error: {option}: ") and "--force" in err
    assert target.read_text(encoding="utf-8") == "previous\n"
    assert not any((tmp_path / n).exists() for o, n in others.items() if o != option)
    code, out, err = run(args + ["--force"], capsys)
    assert code == 0, err
    assert target.read_text(encoding="utf-8", errors="replace") != "previous\n"


BAD_DEADWOOD = {
    "unitless.toml": '[[item]]\nname = "coil"\nvolume = 20\nfrom = "0 m"\nto = "1 m"\n',
    "both.toml": '[[item]]\nname = "coil"\nvolume = "2 L"\nfrom = "0 m"\nto = "1 m"\n'
                 'profile = "x.toml"\n',
    "key.toml": '[[item]]\nname = "coil"\nvolumes = "2 L"\n',
    "empty.toml": 'title = "x"\n',
    "deep.toml": "x = " + "[" * 40 + "]" * 40 + "\n",
    "down.toml": '[[item]]\nname = "coil"\nvolume = "2 L"\nfrom = "1 m"\nto = "0.5 m"\n',
}


@pytest.mark.parametrize("args,expected", [
    (["--tilt", "x"], "--tilt: give the tilt in degrees"),
    (["--tilt", "50"], "--tilt: a tilt of 50° is more than 45°"),
    (["--gauge-point", "9 m"], "--gauge-point: the gauge point 9000 is beyond"),
    (["--gauge-point", "x"], "--gauge-point: 'x' is not a length"),
    (["--reference-height", "0", "--ullage", "1"], "--reference-height: the reference height must"),
    (["--ullage", "100 mm"], "--ullage: ullages are read down from the reference point"),
    (["--reference-height", "1 m", "--ullage", "2 m"], "--ullage: ullage 2000 mm is outside 0"),
    (["--reference-height", "3 m", "--ullage", "10 mm"], "--ullage: the innage of that ullage,"),
    (["--datum-offset", "5 kg"], "--datum-offset: 'kg' is a mass unit"),
    (["--datum-offset", "-50 mm", "--at", "10 mm"],
     "--at: innage 10 mm is below the lowest inside point (50 mm)"),
    (["--datum-offset", "2 m", "--at", "0"], "--datum-offset: the datum plate 2000 mm above"),
    (["--level-format", "roman"], "--level-format: give auto, decimal or feet-inches"),
    (["--deadwood", "missing.toml"], "--deadwood: missing.toml: no such file"),
    (["--deadwood", "unitless.toml"], "unitless.toml:1: item 1 (coil): volume: '20' has no unit"),
    (["--deadwood", "both.toml"], "both.toml:1: item 1 (coil): give either a profile"),
    (["--deadwood", "key.toml"], "key.toml:1: item 1 (coil): unknown key 'volumes'"),
    (["--deadwood", "empty.toml"], "empty.toml: unknown key 'title'"),
    (["--deadwood", "deep.toml"], "deep.toml:1: nesting too large"),
    (["--deadwood", "down.toml"], "down.toml:1: item 1 (coil): its range runs from 1 m down"),
    (["--shell-temperature", "35"], "--base-temperature: the shell temperature factor needs"),
    (["--shell-temperature", "35", "--base-temperature", "15 °C", "--expansion", "1e-5 /K"],
     "--shell-temperature: '35' has no unit"),
    (["--shell-temperature", "35 °C", "--base-temperature", "15 °X", "--expansion", "1e-5 /K"],
     "--base-temperature: '°X' is not a temperature unit"),
    (["--shell-temperature", "35 °C", "--base-temperature", "15 °C"],
     "--shell-material: give the shell's material"),
    (["--shell-temperature", "35 °C", "--base-temperature", "15 °C", "--shell-material",
      "steel", "--expansion", "1e-5 /K"], "--expansion: give the shell's material"),
    (["--shell-temperature", "35 °C", "--base-temperature", "15 °C", "--shell-material",
      "copper"], "--shell-material: no expansion coefficient for 'copper'"),
    (["--shell-temperature", "35 °C", "--base-temperature", "15 °C", "--expansion", "1e-5"],
     "--expansion: '1e-5' has no unit"),
    (["--uncertainty", "missing.toml"], "--uncertainty: missing.toml: no such file"),
    (["--uncertainty", "nodims.toml"], "--uncertainty: nodims.toml:1: tolerance: diameter: a "
                                       "tolerance of the diameter needs"),
    (["--uncertainty", "other.toml"], "--uncertainty: other.toml: the vessel in [vessel] holds"),
    (["--uncertainty", "badkey.toml"], "--uncertainty: badkey.toml:1: tolerance: no tolerance can"),
    (["--uncertainty", "crown.toml"], "--uncertainty: crown.toml:5: tolerance: crown: the vessel "
                                      "has no head crown radius (heads ellipsoidal, ellipsoidal)"),
    (["--uncertainty", "wall.toml"], "--uncertainty: wall.toml:5: tolerance: thickness: the "
                                     "vessel has no wall thickness"),
    (["--picture", "t.gif"], "--picture: t.gif: pictures are written as .png or .svg"),
    (["--report", "nowhere/t.html"], "--report: "),
])
def test_bad_gauge_input(tmp_path, capsys, monkeypatch, args, expected):
    monkeypatch.chdir(tmp_path)
    for name, text in BAD_DEADWOOD.items():
        (tmp_path / name).write_text(text, encoding="utf-8")
    (tmp_path / "nodims.toml").write_text('[tolerance]\ndiameter = "1 mm"\n', encoding="utf-8")
    (tmp_path / "badkey.toml").write_text('[tolerance]\nwall = "1 mm"\n', encoding="utf-8")
    tank = '[vessel]\ndiameter = "1200 mm"\nlength = "2400 mm"\nhead = "ellipsoidal"\n'
    (tmp_path / "crown.toml").write_text(tank + '[tolerance]\ncrown = "1 mm"\n', encoding="utf-8")
    (tmp_path / "wall.toml").write_text(tank + '[tolerance]\nthickness = "1 mm"\n',
                                        encoding="utf-8")
    (tmp_path / "other.toml").write_text('[vessel]\ndiameter = "1300 mm"\nlength = "2400 mm"\n'
                                         'head = "ellipsoidal"\n[tolerance]\ndiameter = "1 mm"\n',
                                         encoding="utf-8")
    out_csv, picture = tmp_path / "out.csv", tmp_path / "out.png"
    code, out, err = run(["levels", str(DIESEL), *args, "--csv", str(out_csv),
                          *([] if "--picture" in args else ["--picture", str(picture)])], capsys)
    assert code == 2, err
    lines = err.strip().splitlines()
    assert len(lines) == 1 and "Traceback" not in err
    assert lines[0].startswith("revolve: error: ") and expected in lines[0], lines[0]
    assert out == "" and not out_csv.exists() and not picture.exists()


@pytest.mark.parametrize("args,kwargs", [
    (["--tilt", "1.5", "--gauge-point", "400 mm", "--count", "5"],
     dict(tilt=1.5, gauge_point="400 mm", count=5)),
    (["--reference-height", "1300 mm", "--ullage", "200 mm,700 mm", "--datum-offset", "20 mm"],
     dict(reference_height="1300 mm", ullage="200 mm,700 mm", datum_offset="20 mm")),
    (["--step", "1/2 ft", "--level-unit", "in"], dict(step="1/2 ft", level_unit="in")),
    (["--deadwood", str(DEADWOOD), "--percent", "20,80"],
     dict(deadwood=str(DEADWOOD), percent=[20, 80])),
    (["--shell-temperature", "30 °C", "--base-temperature", "15 °C", "--shell-material",
      "stainless 316", "--volume", "1000 L"],
     dict(shell_temperature="30 °C", base_temperature="15 °C", shell_material="stainless 316",
          volumes="1000 L")),
    (["--uncertainty", str(UNCERTAINTY), "--count", "3", "--tilt", "-0.5"],
     dict(uncertainty=str(UNCERTAINTY), count=3, tilt=-0.5)),
])
def test_library_to_dict_equals_the_json_for_gauge_options(args, kwargs, capsys):
    import revolve

    code, out, err = run(["levels", str(DIESEL), *args, "--json"], capsys)
    assert code == 0, err
    library = revolve.level_table(str(DIESEL), **kwargs).to_dict()
    assert json.loads(json.dumps(library)) == json.loads(out)


@pytest.mark.parametrize("tilt", [2.0, -2.0])
def test_the_sign_of_the_tilt(tmp_path, capsys, tilt):
    # geometry: a positive tilt raises the end the axis points to, so a gauge at the axis's
    # start stands at the low end (empty level 0); a negative one makes that end the high one,
    # whose bottom line is L sin α above the lowest point
    path = write(tmp_path, "lying.toml", LYING_MM)
    d = _json([path, "--orientation", "horizontal", "--gauge-point", "0", "--tilt", str(tilt),
               "--count", "2"], capsys)
    a = math.radians(abs(tilt))
    expected = 0.0 if tilt > 0 else -2000 * math.sin(a)
    assert d["space"]["empty_level"] == pytest.approx(expected, abs=1e-9)
    assert d["space"]["full_level"] == pytest.approx(
        1000 * math.cos(a) + (2000 * math.sin(a) if tilt > 0 else 0.0), rel=1e-12)


@pytest.mark.parametrize("args", [
    dict(tilt=1.0, step="100 mm", datum_offset="10 mm", reference_height="1100 mm"),
    dict(count=4, deadwood=str(DEADWOOD), level_unit="in", volume_unit="US_gallon"),
])
def test_the_level_picture_of_a_gauge_table_reads_cleanly(args):
    # no label overlaps another or leaves the canvas (label_boxes: matplotlib's own extents)
    import revolve
    from revolve.render.level_picture import label_boxes, picture_of

    result = revolve.level_table(str(DIESEL), **args)
    fig = picture_of(result)
    boxes = label_boxes(fig)
    texts = [t for t, _ in boxes]
    assert f"volume ({result.units.unit('capacity')})" in texts and "end view" in texts
    canvas = fig.bbox
    for text, box in boxes:
        assert canvas.x0 - 0.5 <= box.x0 and box.x1 <= canvas.x1 + 0.5, text
        assert canvas.y0 - 0.5 <= box.y0 and box.y1 <= canvas.y1 + 0.5, text
    for i, (a, box_a) in enumerate(boxes):
        for b, box_b in boxes[i + 1:]:
            assert not box_a.overlaps(box_b), (a, b)


from hypothesis import strategies as _st  # noqa: E402


@settings(max_examples=25, deadline=None)
@given(tilt=_st.one_of(_st.floats(-60, 60), _st.sampled_from([0.0, 45.0, -45.0, 45.5])),
       orientation=_st.sampled_from(["vertical", "horizontal"]),
       count=_st.integers(1, 12))
@example(tilt=45.5, orientation="vertical", count=3)
@example(tilt=-44.9, orientation="horizontal", count=5)
def test_generated_tilts(tilt, orientation, count):
    # a bounded, non-decreasing table from empty to the Pappus capacity, or one line naming --tilt
    import contextlib
    import io

    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        with pytest.raises(SystemExit) as stop:
            main(["levels", str(DIESEL), "--orientation", orientation, "--tilt", repr(tilt),
                  "--count", str(count), "--json"])
    if abs(tilt) > 45:
        assert stop.value.code == 2
        (line,) = err.getvalue().strip().splitlines()
        assert line.startswith("revolve: error: --tilt: ") and out.getvalue() == ""
        return
    assert stop.value.code in (0, None), err.getvalue()
    d = json.loads(out.getvalue())
    volumes = [r["volume"] for r in d["levels"]]
    cap = d["space"]["capacity"]
    assert volumes[0] == pytest.approx(0.0, abs=1e-9 * cap)
    assert volumes[-1] == pytest.approx(cap, rel=1e-9)
    assert all(b >= a - 1e-9 * cap for a, b in zip(volumes, volumes[1:]))
