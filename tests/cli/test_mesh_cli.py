"""`revolve mesh` end to end, and the CSV and JSON of its results (revolve.render.output).

References, named beside each check:

* reference library trimesh (``trimesh.load``, ``.volume``, ``.area``,
  ``.is_watertight``) measuring the STL files the command writes;
* CRC *Standard Mathematical Tables and Formulae* (from memory): torus,
  hollow cylinder;
* 1 in = 25.4 mm (international yard and pound agreement, 1959);
* the standard library's ``csv`` and ``json`` modules reading what we write.

The bundled example profiles are invented scenarios: they are only run and
compared with the engine's own exact figures, never used as check values.
"""

from __future__ import annotations

import csv
import json
import math
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest
import trimesh

from revolve.cli.app import main

ROOT = Path(__file__).resolve().parents[2]
# Profiles only (profiles/ also holds other inputs, such as coating systems).
PROFILES = [p for p in sorted((ROOT / "profiles").glob("*.toml"))
            if "[[loop]]" in p.read_text(encoding="utf-8") or "[[chain]]" in p.read_text(encoding="utf-8")]
PROFILES += sorted((ROOT / "profiles").glob("*.txt"))

TORUS = """
units = "mm"
[[loop]]
start = [1, 3]
segments = [
  { arc_to = [-1, 3], centre = [0, 3], turn = "ccw", face = "tube" },
  { arc_to = [1, 3], centre = [0, 3], turn = "ccw", face = "tube" },
]
"""

TUBE = """
units = "mm"
[[loop]]
start = [0, 1]
segments = [
  { line_to = [2, 1], face = "bore" },
  { line_to = [2, 3], face = "end" },
  { line_to = [0, 3], face = "outside" },
  { close = true, face = "end" },
]
"""


def run(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main([str(a) for a in args])
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def write(tmp_path, name, text):
    p = tmp_path / name
    p.write_text(text, encoding="utf-8")
    return str(p)


@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.name)
def test_every_example_meshes_watertight(path, tmp_path, capsys):
    stl = tmp_path / "part.stl"
    code, out, err = run(["mesh", path, "-o", stl, "--json"], capsys)
    assert code == 0, err
    data = json.loads(out)
    tm = trimesh.load(str(stl))
    assert tm.is_watertight and tm.is_winding_consistent and tm.volume > 0
    assert data["command"] == "mesh" and isinstance(data["closed"], bool)
    data = data["mesh"]
    assert len(tm.faces) == data["triangles"]
    if "[[chain]]" in Path(path).read_text(encoding="utf-8"):
        # A vessel's inside wall drawn from the axis round to the axis closes on itself,
        # but the profile has no section of its own to compare volumes with.
        return
    # The command's own report agrees with trimesh's reading of the file (float32 corners).
    assert math.isclose(tm.volume, data["mesh_volume"], rel_tol=1e-5)
    assert math.isclose(tm.area, data["mesh_area"], rel_tol=1e-5)
    # The default tolerance (1/1000 of the size) keeps the volume within about 1 %.
    assert data["volume_relative_difference"] < 1e-2


def test_torus_stl_approaches_crc_as_the_tolerance_shrinks(tmp_path, capsys):
    # CRC (from memory): V = 2π² R r², S = 4π² R r with R = 3, r = 1 (mm).
    profile = write(tmp_path, "torus.toml", TORUS)
    tolerances = (0.04, 0.02, 0.01, 0.005)
    errs = []
    for tol in tolerances:
        stl = tmp_path / f"t{tol}.stl"
        code, _, err = run(["mesh", profile, "-o", stl, "--chord-tolerance", tol], capsys)
        assert code == 0, err
        tm = trimesh.load(str(stl))
        assert tm.is_watertight
        errs.append((abs(tm.volume / (2 * math.pi ** 2 * 3) - 1), abs(tm.area / (4 * math.pi ** 2 * 3) - 1)))
    errs = np.array(errs)
    for col in (0, 1):
        assert np.all(np.diff(errs[:, col]) < 0)
        ratio = errs[:, col] / np.array(tolerances)
        assert ratio.max() / ratio.min() < 2.0


def test_partial_angle_and_inches(tmp_path, capsys):
    # A hollow cylinder r = 1..3, h = 2 (mm), swept 90°: V = (θ/2) (R² − r²) h (CRC sector,
    # from memory); written in inches (1 in = 25.4 mm): the volume is divided by 25.4³.
    profile = write(tmp_path, "tube.toml", TUBE)
    stl = tmp_path / "quarter.stl"
    code, out, err = run(["mesh", profile, "-o", stl, "--angle", 90, "--chord-tolerance", "0.001 mm",
                          "--length-unit", "in", "--json"], capsys)
    assert code == 0, err
    data = json.loads(out)
    assert data["units"]["length"] == "in" and data["units"]["volume"] == "in³"
    data = data["mesh"]
    tm = trimesh.load(str(stl))
    assert tm.is_watertight and tm.is_winding_consistent
    exact_mm3 = math.pi / 4 * (9 - 1) * 2
    assert math.isclose(tm.volume * 25.4 ** 3, exact_mm3, rel_tol=1e-3)
    assert math.isclose(data["exact_volume"] * 25.4 ** 3, exact_mm3, rel_tol=1e-12)
    # A bare tolerance is in the STL's unit: 0.001 in is 0.0254 mm.
    code, out, _ = run(["mesh", profile, "-o", stl, "--chord-tolerance", 0.001, "--length-unit", "in",
                        "--json", "--force"], capsys)
    assert math.isclose(json.loads(out)["mesh"]["chord_tolerance"], 0.001, rel_tol=1e-12)


def test_table_output_and_csv(tmp_path, capsys):
    profile = write(tmp_path, "tube.toml", TUBE)
    stl, table = tmp_path / "t.stl", tmp_path / "t.csv"
    code, out, err = run(["mesh", profile, "-o", stl, "--csv", table], capsys)
    assert code == 0, err
    assert "mesh written to" in out and "volume, relative difference" in out
    with table.open(encoding="utf-8") as f:
        rows = list(csv.DictReader(f))
    (row,) = rows                                   # one row, each column with its unit
    assert int(row["triangles"]) == len(trimesh.load(str(stl)).faces)
    # CRC (from memory): hollow cylinder V = π (R² − r²) h.
    assert math.isclose(float(row["exact volume (mm³)"]), math.pi * 8 * 2, rel_tol=1e-12)


# -- bad input: exit 2, one line, nothing written ----------------------------------------

@pytest.mark.parametrize("extra, message", [
    (["--chord-tolerance", "0"], "--chord-tolerance"),
    (["--chord-tolerance", "-0.1"], "--chord-tolerance"),
    (["--chord-tolerance", "3 kg"], "--chord-tolerance"),
    (["--chord-tolerance", "1e-13"], "give at least"),
    (["--chord-tolerance", "1e-300"], "give at least"),  # once a ZeroDivisionError in the mesher
    (["--chord-tolerance", "x\ny"], "--chord-tolerance: "),
    (["--angle", "0"], "--angle"),
    (["--angle", "361"], "--angle"),
    (["--axis", "1,2"], "--axis"),
    (["--length-unit", "furlongs_per_week"], ""),
    (["--csv", "table.txt"], "table.txt"),
])
def test_bad_options(tmp_path, capsys, monkeypatch, extra, message):
    monkeypatch.chdir(tmp_path)
    profile = write(tmp_path, "tube.toml", TUBE)
    code, out, err = run(["mesh", profile, "-o", "part.stl"] + extra, capsys)
    assert code == 2
    assert err.count("\n") == 1 and err.startswith("revolve: error:") and message in err
    assert "Traceback" not in err
    assert not (tmp_path / "part.stl").exists()
    assert sorted(p.name for p in tmp_path.iterdir()) == ["tube.toml"]


def test_bad_files(tmp_path, capsys):
    crossing = write(tmp_path, "cross.toml", TUBE.replace("[0, 1]", "[0, -1]").replace("[2, 1]", "[2, -1]"))
    for args, message in [
        (["mesh", crossing, "-o", tmp_path / "a.stl"], "cross.toml"),
        (["mesh", tmp_path / "missing.toml", "-o", tmp_path / "a.stl"], "no such file"),
        (["mesh", write(tmp_path, "t.toml", TUBE), "-o", tmp_path / "a.obj"], "a.obj"),
        (["mesh", write(tmp_path, "t.toml", TUBE), "-o", tmp_path / "none" / "a.stl"], "folder"),
    ]:
        code, _, err = run(args, capsys)
        assert code == 2 and err.count("\n") == 1 and message in err, err
    assert not list(tmp_path.glob("*.stl")) and not list(tmp_path.glob("*.obj"))


def test_old_file_kept_on_error(tmp_path, capsys):
    profile = write(tmp_path, "tube.toml", TUBE)
    stl = tmp_path / "part.stl"
    stl.write_bytes(b"previous")
    code, _, _ = run(["mesh", profile, "-o", stl, "--chord-tolerance", "1e-12", "--force"],
                     capsys)
    assert code == 2 and stl.read_bytes() == b"previous"


def test_subprocess_error_has_no_traceback(tmp_path):
    profile = write(tmp_path, "tube.toml", TUBE)
    res = subprocess.run([sys.executable, "-m", "revolve", "mesh", profile, "-o",
                          str(tmp_path / "p.stl"), "--chord-tolerance", "nonsense"],
                         capture_output=True, text=True, cwd=str(tmp_path))
    assert res.returncode == 2
    assert res.stderr.count("\n") == 1 and "Traceback" not in res.stderr
    assert not (tmp_path / "p.stl").exists()


# -- outputs: full precision, the one overwrite rule -----------------------------------------

def test_measure_csv_matches_the_measure_json(tmp_path, capsys):
    profile = write(tmp_path, "tube.toml", TUBE)
    table = tmp_path / "m.csv"
    code, out, _ = run(["measure", profile, "--json", "--volume-unit", "L", "--csv", table], capsys)
    assert code == 0
    js = json.loads(out)
    with table.open(encoding="utf-8") as f:
        (back,) = list(csv.DictReader(f))
    # Full precision survives the CSV (repr of floats), and agrees with the JSON.
    assert float(back["volume (L)"]) == js["volume"]
    assert float(back["section area (mm²)"]) == js["area"]
    assert float(back["surface: bore (mm²)"]) == js["surface_by_face"]["bore"]
    assert float(back["volume, second method (L)"]) == js["crosscheck"]["volume"]
    # CRC (from memory): hollow cylinder V = π (R² − r²) h = 16π mm³ = 16π·1e-6 L.
    assert math.isclose(float(back["volume (L)"]), 16 * math.pi * 1e-6, rel_tol=1e-13)
    assert back["volume, verdict"] == "ok"


def test_existing_stl_is_refused_without_force_and_replaced_with_it(tmp_path, capsys):
    profile = write(tmp_path, "tube.toml", TUBE)
    stl = tmp_path / "m.stl"
    stl.write_bytes(b"previous mesh")
    code, out, err = run(["mesh", profile, "-o", stl], capsys)
    assert code == 2 and out == "" and err.count("\n") == 1
    assert err.startswith("revolve: error: --output: ") and "--force" in err, err
    assert stl.read_bytes() == b"previous mesh"
    code, out, err = run(["mesh", profile, "-o", stl, "--force"], capsys)
    assert code == 0, err
    assert trimesh.load(str(stl)).is_watertight


def test_tolerance_is_not_a_chord_length_any_more(tmp_path, capsys):
    # --tolerance is the relative cross-check tolerance everywhere; mesh has none.
    profile = write(tmp_path, "tube.toml", TUBE)
    code, out, err = run(["mesh", profile, "-o", tmp_path / "m.stl", "--tolerance", "0.01"],
                         capsys)
    assert code == 2 and err.startswith("revolve: error: --tolerance: no such option"), err
    assert "--chord-tolerance" in err
    assert not (tmp_path / "m.stl").exists()


# -- several outputs: both files or neither (family: an output path that cannot be written) ---

def _unwritable(tmp_path, kind):
    """A CSV path that cannot be written, of several kinds (the tests run as root, so a
    read-only folder would not do)."""
    if kind == "missing folder":
        return str(tmp_path / "no such folder" / "figures.csv")
    if kind == "a folder":
        folder = tmp_path / "figures.csv"
        folder.mkdir()
        return str(folder)
    if kind == "under a file":
        (tmp_path / "plain").write_text("x", encoding="utf-8")
        return str(tmp_path / "plain" / "figures.csv")
    if kind == "name too long":
        return str(tmp_path / ("f" * 300 + ".csv"))
    raise AssertionError(kind)


@pytest.mark.parametrize("kind", ["missing folder", "a folder", "under a file", "name too long"])
@pytest.mark.parametrize("existed", [False, True])
def test_unwritable_csv_leaves_no_stl(tmp_path, capsys, kind, existed):
    profile = write(tmp_path, "tube.toml", TUBE)
    stl = tmp_path / "m.stl"
    if existed:
        stl.write_bytes(b"previous mesh")
    csv_path = _unwritable(tmp_path, kind)
    before = sorted(p.name for p in tmp_path.iterdir())
    code, out, err = run(["mesh", profile, "-o", stl, "--csv", csv_path, "--force"], capsys)
    assert code == 2, err
    assert err.count("\n") == 1 and err.startswith("revolve: error: --csv: ")
    assert "Traceback" not in err and out == ""
    assert sorted(p.name for p in tmp_path.iterdir()) == before  # no temporary file either
    if existed:
        assert stl.read_bytes() == b"previous mesh"
    else:
        assert not stl.exists()


def test_csv_failing_while_moved_into_place_puts_the_old_stl_back(tmp_path, capsys, monkeypatch):
    # The second move fails after the first has happened (a disk error, say): the first
    # target gets its old contents back.
    import os as os_module

    profile = write(tmp_path, "tube.toml", TUBE)
    stl, table = tmp_path / "m.stl", tmp_path / "m.csv"
    stl.write_bytes(b"previous mesh")
    real_replace = os_module.replace

    def replace(source, target):
        if str(target).endswith(".csv"):
            raise OSError(5, "Input/output error")
        return real_replace(source, target)

    monkeypatch.setattr(os_module, "replace", replace)
    code, _, err = run(["mesh", profile, "-o", stl, "--csv", table, "--force"], capsys)
    assert code == 2 and err.count("\n") == 1 and "m.csv: cannot write the file" in err, err
    assert stl.read_bytes() == b"previous mesh" and not table.exists()
    assert sorted(p.name for p in tmp_path.iterdir()) == ["m.stl", "tube.toml"]


def test_mesh_and_csv_written_together(tmp_path, capsys):
    profile = write(tmp_path, "tube.toml", TUBE)
    stl, table = tmp_path / "m.stl", tmp_path / "m.csv"
    code, _, err = run(["mesh", profile, "-o", stl, "--csv", table], capsys)
    assert code == 0, err
    # CRC (from memory): hollow cylinder V = π (R² − r²) h = 16π; trimesh measures the STL.
    assert trimesh.load(str(stl)).volume == pytest.approx(16 * math.pi, rel=1e-2)
    assert table.read_text(encoding="utf-8").startswith("triangles,vertices,")
    assert sorted(p.name for p in tmp_path.iterdir()) == ["m.csv", "m.stl", "tube.toml"]


def test_a_drawing_polyline_meshes_through_its_own_vertices(tmp_path, capsys, monkeypatch):
    # A 1000-edge LWPOLYLINE (ezdxf) read as one polyline: its edges are the mesh's chords,
    # so the STL (trimesh) holds exactly the revolved polygon swept in n equal steps: its
    # volume is the Pappus volume (shapely Polygon.area and .centroid, V = 2π ȳ A, Stewart,
    # from memory) times (n / 2π) sin(2π / n), the inscribed regular n-gon (CRC, from
    # memory); within the STL's single precision.
    import ezdxf
    from shapely.geometry import Polygon

    a = np.linspace(0.0, 2 * np.pi, 1000, endpoint=False)
    r = 1.0 + 0.3 * np.sin(7 * a)
    doc = ezdxf.new("R2010", setup=True)
    doc.header["$INSUNITS"] = 4
    msp = doc.modelspace()
    outline = msp.add_lwpolyline(np.column_stack([r * np.cos(a), 3.0 + r * np.sin(a)]).tolist(),
                                 close=True)
    msp.add_line((-2, 0), (2, 0), dxfattribs={"linetype": "CENTER"})
    drawing = str(tmp_path / "wavy.dxf")
    doc.saveas(drawing)
    shape = Polygon(np.array(list(outline.get_points("xy")), dtype=float))
    pappus = 2 * math.pi * shape.centroid.y * shape.area
    stl = tmp_path / "wavy.stl"
    code, out, err = run(["mesh", drawing, "-o", stl, "--chord-tolerance", "0.02", "--json"], capsys)
    assert code == 0, err
    data = json.loads(out)["mesh"]
    n = data["angular_steps"]
    assert data["vertices"] == 1000 * n
    tm = trimesh.load(str(stl))
    assert tm.is_watertight and tm.is_winding_consistent
    assert tm.volume == pytest.approx(pappus * n / (2 * math.pi) * math.sin(2 * math.pi / n),
                                      rel=1e-5)
