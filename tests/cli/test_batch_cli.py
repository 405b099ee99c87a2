"""`revolve measure` and `revolve turn` over many files: one row per part, errors kept, exit 2.

Check values: the volume of a ring π (R² − r²) h — CRC Standard Mathematical
Tables (from memory); each ring of a batch has its own sizes, so a row out of
order fails its check. The bundled profiles are invented scenarios and are
only compared between the one-file and the many-files outputs.
"""

from __future__ import annotations

import csv
import io
import json
import math
import sys
from pathlib import Path

import pytest

from revolve.cli.app import main
from revolve.cli.commands.measure import run_measure
from revolve.cli.commands.turning import run_turn

ROOT = Path(__file__).resolve().parents[2]
PROFILES = [p for p in sorted((ROOT / "profiles").glob("*.toml"))
            if "[[loop]]" in p.read_text(encoding="utf-8")] + sorted((ROOT / "profiles").glob("*.txt"))
SHAFT = str(ROOT / "profiles" / "turned-stepped-shaft.toml")
SLEEVE = str(ROOT / "profiles" / "turned-sleeve-inch.toml")
BUSHING = str(ROOT / "profiles" / "flanged-bushing.toml")


def run(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main([str(a) for a in args])
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def rings(folder: Path, count: int):
    out = []
    for k in range(count):
        inner, outer, length = 2 + k % 5, 9 + k % 7, 10 + k
        path = folder / f"ring-{k:03d}.txt"
        path.write_text(f"0,{inner}\n{length},{inner}\n{length},{outer}\n0,{outer}\n",
                        encoding="utf-8")
        out.append((str(path), math.pi * (outer ** 2 - inner ** 2) * length))
    return out


def measure_args(**over):
    args = dict(axis=None, angle=None, material=None, density=None, as_json=True, exact=False,
                units=None, length_unit=None, area_unit=None, volume_unit=None, mass_unit=None,
                tolerance=1e-9)
    args.update(over)
    return args


# -- measure --------------------------------------------------------------------------------


def test_many_files_json_lines_equal_each_single_file_json(capsys):
    code, out, err = run(["measure", *PROFILES, "--json"], capsys)
    assert code == 0, err
    lines = out.splitlines()
    assert len(lines) == len(PROFILES)
    for line, path in zip(lines, PROFILES):
        many = json.loads(line)
        assert many.pop("file") == str(path)
        c1, single, e1 = run(["measure", path, "--json"], capsys)
        assert c1 == 0, e1
        assert many == json.loads(single), path.name


def test_folder_gives_one_row_per_part_and_the_ring_volumes(tmp_path, capsys):
    parts = rings(tmp_path, 4)
    code, out, err = run(["measure", tmp_path, "--json", "--units", "mm"], capsys)
    assert code == 0, err
    rows = [json.loads(line) for line in out.splitlines()]
    assert [r["file"] for r in rows] == [p for p, _ in parts]
    for r, (_, volume) in zip(rows, parts):
        assert math.isclose(r["volume"], volume, rel_tol=1e-13)


def test_bad_file_in_the_middle_keeps_the_other_rows_and_exits_2(tmp_path, capsys):
    parts = rings(tmp_path, 4)
    broken = tmp_path / "ring-001b.txt"          # sorted between ring-001 and ring-002
    broken.write_text("0,1\n2,1\n", encoding="utf-8")
    out_csv = tmp_path / "out" / "rows.csv"
    out_csv.parent.mkdir()
    for extra in (["--json"], [], ["--csv", out_csv]):
        code, out, err = run(["measure", tmp_path, "--units", "mm", *extra], capsys)
        assert code == 2, (out, err)
        assert "Traceback" not in err
        lines = err.splitlines()
        assert len(lines) == 1 and lines[0].startswith("revolve: error: ")
        assert str(broken) in lines[0]
        if extra == ["--json"]:
            rows = [json.loads(line) for line in out.splitlines()]
            assert [r["file"] for r in rows] == [parts[0][0], parts[1][0], str(broken),
                                                 parts[2][0], parts[3][0]]
            assert str(broken) in rows[2]["error"] and "volume" not in rows[2]
            for r, (_, volume) in zip(rows[:2] + rows[3:], parts):
                assert math.isclose(r["volume"], volume, rel_tol=1e-13)
        else:
            assert "5 parts, 1 refused" in out
            row = [line for line in out.splitlines() if line.startswith(str(broken))]
            assert len(row) == 1 and "error: " in row[0]
            for path, _ in parts:
                assert path in out
    rows = list(csv.DictReader(out_csv.open(encoding="utf-8")))
    assert [r["file"] for r in rows] == [parts[0][0], parts[1][0], str(broken), parts[2][0],
                                         parts[3][0]]
    assert rows[2]["error"] and rows[2]["volume"] == ""
    for r, (_, volume) in zip(rows[:2] + rows[3:], parts):
        assert math.isclose(float(r["volume"]), volume, rel_tol=1e-13)
        assert r["volume_unit"] == "mm³" and r["crosscheck_agrees"] == "true"


def test_csv_units_beside_every_figure_in_a_mixed_batch(tmp_path, capsys):
    out_csv = tmp_path / "rows.csv"
    code, out, err = run(["measure", SHAFT, SLEEVE, "--csv", out_csv], capsys)
    assert code == 0, err
    rows = list(csv.DictReader(out_csv.open(encoding="utf-8")))
    assert [(r["profile_unit"], r["volume_unit"], r["mass_unit"]) for r in rows] == \
        [("mm", "mm³", "kg"), ("in", "in³", "lb")]     # inch work in inch-pound units


def test_pool_and_serial_give_the_same_output(tmp_path, capsys):
    rings(tmp_path, 20)
    outputs = []
    for workers, serial_below in ((1, None), (2, 2)):
        code = run_measure([str(tmp_path)], **measure_args(units="mm"), workers=workers,
                           serial_below=serial_below)
        out, err = capsys.readouterr()
        assert code == 0, err
        outputs.append(out)
    assert outputs[0] == outputs[1] and len(outputs[0].splitlines()) == 20


def test_progress_bar_only_on_a_terminal_and_never_in_stdout(tmp_path, capsys, monkeypatch):
    parts = rings(tmp_path, 100)

    class Terminal(io.StringIO):
        def isatty(self):
            return True

    fake = Terminal()
    monkeypatch.setattr(sys, "stderr", fake)
    code = run_measure([str(tmp_path)], **measure_args(units="mm"), workers=1)
    out, _ = capsys.readouterr()
    assert code == 0
    rows = [json.loads(line) for line in out.splitlines()]         # nothing but JSON lines
    assert [r["file"] for r in rows] == [p for p, _ in parts]
    assert "measuring" in fake.getvalue()


def test_exact_needs_one_file(capsys):
    code, out, err = run(["measure", SHAFT, BUSHING, "--exact"], capsys)
    assert code == 2 and out == ""
    assert err.startswith("revolve: error: --exact: give one file") and err.count("\n") == 1


@pytest.mark.parametrize("args, must", [
    (["--workers", "0"], "--workers: give a whole number of at least 1"),
    (["--units", "litre"], "--units: 'litre'"),
    (["--volume-unit", "gallon"], "--volume-unit:"),
    (["--density", "-3"], "--density:"),
])
def test_bad_options_are_refused_once(tmp_path, capsys, args, must):
    rings(tmp_path, 3)
    out_csv = tmp_path / "never.csv"
    code, out, err = run(["measure", tmp_path, *args, "--csv", out_csv], capsys)
    assert code == 2 and out == ""
    assert err.count("\n") == 1 and must in err, err
    assert not out_csv.exists()


def test_a_folder_without_profiles_is_refused(tmp_path, capsys):
    code, out, err = run(["measure", tmp_path, "--json"], capsys)
    assert code == 2 and out == ""
    assert str(tmp_path) in err and "no profile files" in err


# -- turn -----------------------------------------------------------------------------------


def test_turn_pool_and_serial_give_the_same_quotes(tmp_path, capsys):
    folder = tmp_path / "parts"
    folder.mkdir()
    for k in range(6):
        for src in (SHAFT, BUSHING):
            (folder / f"{k}-{Path(src).name}").write_text(Path(src).read_text(encoding="utf-8"),
                                                          encoding="utf-8")
    outputs = []
    for workers, serial_below in ((1, None), (2, 2)):
        code = run_turn([str(folder)], as_json=True, quantity=[10], workers=workers,
                        serial_below=serial_below)
        out, err = capsys.readouterr()
        assert code == 0, err
        outputs.append(json.loads(out))
    assert outputs[0] == outputs[1]
    parts = outputs[0]["parts"]
    assert [Path(p["file"]).name for p in parts] == sorted(p.name for p in folder.iterdir())
    # a solid round bar: stock volume π/4 D² L (CRC, from memory); D, L in mm, V in cm³
    assert outputs[0]["units"]["volume"] == "cm³" and outputs[0]["units"]["length"] == "mm"
    for p in parts:
        if p["stock_kind"] == "bar" and not p["stock_inside_diameter"]:
            assert math.isclose(p["stock_volume"],
                                math.pi / 4 * p["stock_diameter"] ** 2 * p["stock_length"] / 1000,
                                rel_tol=1e-12)


def test_turn_inch_part_first_then_a_metric_one_uses_the_metric_list(capsys):
    # The bar list follows the profiles: inch only when every one is drawn in inches.
    code, out, err = run(["turn", SLEEVE, SHAFT, "--json"], capsys)
    assert code == 0, err
    found = json.loads(out)
    code, out, err = run(["turn", SLEEVE, SHAFT, "--json", "--bar-list", "metric"], capsys)
    assert code == 0, err
    assert found == json.loads(out)
    code, out, err = run(["turn", SLEEVE, SHAFT], capsys)
    assert "metric bar list" in out


def test_turn_many_rows_are_plain_text_with_a_total(capsys):
    code, out, err = run(["turn", SHAFT, BUSHING, "--stock-price", "2/kg", "--machine-rate",
                          "60"], capsys)
    assert code == 0, err
    table = out.split("\n\n")[0].splitlines()
    assert table[0].startswith("2 turned parts")
    assert set(table[2]) <= {"-", " "}                       # a plain rule under the header
    assert [line.split()[0] for line in table[3:6]] == ["turned-stepped-shaft",
                                                      "flanged-bushing", "total"]
    batch = [float(line.split()[-1].replace(",", "")) for line in table[3:5]]
    assert float(table[5].split()[-1].replace(",", "")) == pytest.approx(sum(batch), abs=0.011)


def test_an_existing_csv_is_refused_before_any_part_is_measured(tmp_path, capsys):
    parts = tmp_path / "parts"
    parts.mkdir()
    rings(parts, 3)
    out_csv = tmp_path / "rows.csv"
    out_csv.write_text("keep\n", encoding="utf-8")
    code, out, err = run(["measure", parts, "--csv", out_csv], capsys)
    assert code == 2 and out == "" and err.count("\n") == 1
    assert err.startswith("revolve: error: --csv: ") and "--force" in err, err
    assert out_csv.read_text(encoding="utf-8") == "keep\n"
    code, out, err = run(["measure", parts, "--csv", out_csv, "--force"], capsys)
    assert code == 0, err
    rows = list(csv.DictReader(out_csv.open(encoding="utf-8")))
    assert len(rows) == 3 and all(r["volume_unit"] == "mm³" for r in rows)
