"""`revolve convert` end to end: drawings to profile files, the report, and bad input.

References, named beside each check:

* profiles built directly with revolve.geometry constructors (the Bézier
  from its Bernstein form written here with sympy): an imported profile must
  measure the same;
* reference library: shapely (``Polygon.area``, ``Polygon.centroid``) of the
  outline sampled here, with Pappus V = 2 pi d A (Stewart, *Calculus*,
  "Moments and centers of mass", from memory);
* reference library: ezdxf writes the DXF drawings;
* published: CRC Standard Mathematical Tables (from memory): hollow cylinder
  pi (R^2 - r^2) L.

The example drawing examples/nozzle-outline.svg is an invented scenario; it is
checked only against the independent computations above.
"""

from __future__ import annotations

import json
import math
import os
import subprocess
import sys
from pathlib import Path

import ezdxf
import numpy as np
import pytest
import sympy
from shapely.geometry import Polygon

from revolve.cli.app import main
from revolve.formats import load_profile
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Loop, Profile, Revolution
from revolve.geometry.segments import Line, arc_from_centre, curve_from_expressions

ROOT = Path(__file__).resolve().parents[2]
NOZZLE = str(ROOT / "examples" / "nozzle-outline.svg")
T = sympy.Symbol("t", real=True)


def run(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main(args)
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def refused(args, capsys, output):
    code, out, err = run(args, capsys)
    assert code == 2, (out, err)
    lines = err.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("revolve: error: ") and "Traceback" not in err
    assert not os.path.exists(output)
    return lines[0]


def nozzle_direct():
    """The nozzle drawn directly in the axis frame (z along the axis, r from it)."""
    bx = sum(sympy.binomial(3, k) * (1 - T) ** (3 - k) * T ** k * z
             for k, z in enumerate((25, 50, 70, 90)))
    by = sum(sympy.binomial(3, k) * (1 - T) ** (3 - k) * T ** k * r
             for k, r in enumerate((15, 15, 8, 8)))
    return Profile(loops=(Loop((
        Line((0.0, 4.0), (0.0, 20.0)), Line((0.0, 20.0), (10.0, 20.0)),
        arc_from_centre((10.0, 20.0), (15.0, 15.0), (10.0, 15.0), clockwise=True),
        Line((15.0, 15.0), (25.0, 15.0)),
        curve_from_expressions(bx, by, 0, 1),
        Line((90.0, 8.0), (100.0, 8.0)), Line((100.0, 8.0), (100.0, 4.0)),
        Line((100.0, 4.0), (0.0, 4.0)))),))


def test_example_nozzle_converts_and_measures_like_the_direct_profile(tmp_path, capsys):
    out_file = str(tmp_path / "nozzle.toml")
    code, out, err = run(["convert", NOZZLE, "--path-id", "nozzle", "--axis", "0,-45,1,0",
                          "-o", out_file], capsys)
    assert code == 0, err
    assert "1 loop" in out and f"wrote {out_file}" in out
    doc = load_profile(out_file)
    assert doc.axis.point == (0.0, -45.0) and doc.profile.unit == "mm"
    code, out, err = run(["measure", out_file, "--json"], capsys)
    assert code == 0, err
    got = json.loads(out)
    want = measure(Revolution(nozzle_direct(), Axis.x(), 360.0), symbolic=False)
    assert got["volume"] == pytest.approx(want.volume, rel=1e-12)
    assert got["surface_area"] == pytest.approx(want.surface_total, rel=1e-12)
    # reference library: shapely of the outline sampled here; Pappus V = 2 pi d A
    t = np.linspace(0, 1, 20001)
    curve = nozzle_direct().loops[0].segments[4]
    fx, fy = (sympy.lambdify(T, e, "numpy") for e in (curve.x_expr, curve.y_expr))
    a = np.linspace(math.pi / 2, 0, 5001)
    outline = ([(0, 4), (0, 20)] + list(zip(10 + 5 * np.cos(a), 15 + 5 * np.sin(a))) +
               list(zip(fx(t), fy(t))) + [(100, 8), (100, 4)])
    polygon = Polygon(outline)
    assert got["area"] == pytest.approx(polygon.area, rel=1e-6)
    assert got["volume"] == pytest.approx(2 * math.pi * polygon.centroid.y * polygon.area,
                                          rel=1e-6)


def test_json_report(tmp_path, capsys):
    out_file = str(tmp_path / "ring.toml")
    code, out, err = run(["convert", "--path-data", "M0,10 H40 V20 H0 Z m 50 0 h 5",
                          "-o", out_file, "--json", "--units", "in", "--name", "Ring"], capsys)
    assert code == 0, err
    report = json.loads(out)["report"]
    # the open chain "m 50 0 h 5" is not joined to the ring: warned about and left out
    assert [len(report["loops"]), len(report["chains"])] == [1, 0]
    assert len(report["warnings"]) == 1 and "--keep-strays" in report["warnings"][0]
    assert err.count("\n") == 1 and err.startswith("revolve: warning: chain 1")
    assert report["unit"] == "in" and report["unit_source"] == "given"
    doc = load_profile(out_file)
    assert doc.name == "Ring" and doc.profile.unit == "in" and doc.axis is None
    assert not doc.profile.chains
    code, out, err = run(["convert", "--path-data", "M0,10 H40 V20 H0 Z m 50 0 h 5",
                          "-o", out_file, "--json", "--force", "--keep-strays"], capsys)
    assert code == 0, err
    assert len(load_profile(out_file).profile.chains) == 1


def dxf_bush(tmp_path, name="bush.dxf", gap=0.0, extra=None):
    doc = ezdxf.new("R2010", setup=True)
    doc.header["$INSUNITS"] = 4
    msp = doc.modelspace()
    msp.add_lwpolyline([(0, 10), (40, 10), (40, 20), (0, 20 + gap)])
    msp.add_line((0, 20), (0, 10))
    msp.add_line((-5, 0), (45, 0), dxfattribs={"linetype": "CENTER"})
    msp.add_text("BUSH")
    if extra:
        extra(msp)
    path = str(tmp_path / name)
    doc.saveas(path)
    return path


def test_dxf_converts_with_its_centre_line_and_reports(tmp_path, capsys):
    out_file = str(tmp_path / "bush.toml")
    code, out, err = run(["convert", dxf_bush(tmp_path, gap=1e-5), "-o", out_file, "--json",
                          "--gap-tolerance", "1e-4"], capsys)
    assert code == 0, err
    data = json.loads(out)
    report = data["report"]
    assert report["axis"].startswith("from the centre line LINE #3")
    assert len(report["gaps_closed"]) == 1 and report["gaps_closed"][0]["size"] == \
        pytest.approx(1e-5, rel=1e-6)
    assert report["skipped"] == [{"what": report["skipped"][0]["what"],
                                  "reason": "text is not geometry"}]
    code, out, err = run(["measure", out_file, "--json"], capsys)
    # published: CRC (from memory), hollow cylinder pi (R^2 - r^2) L
    assert json.loads(out)["volume"] == pytest.approx(math.pi * (400 - 100) * 40, rel=1e-9)


def test_measure_reads_a_drawing_directly(tmp_path, capsys):
    code, out, err = run(["measure", dxf_bush(tmp_path), "--json"], capsys)
    assert code == 0, err
    assert json.loads(out)["volume"] == pytest.approx(math.pi * (400 - 100) * 40, rel=1e-12)
    svg = tmp_path / "ring.svg"
    svg.write_text('<svg xmlns="http://www.w3.org/2000/svg"><path d="M0,10 H40 V20 H0 Z"/></svg>')
    code, out, err = run(["measure", str(svg), "--json"], capsys)
    assert code == 0, err
    assert json.loads(out)["volume"] == pytest.approx(math.pi * (400 - 100) * 40, rel=1e-12)


def test_point_list_converts(tmp_path, capsys):
    out_file = str(tmp_path / "spacer.toml")
    code, out, err = run(["convert", str(ROOT / "profiles" / "spacer-points.txt"), "-o",
                          out_file], capsys)
    assert code == 0, err
    assert "point list" in out
    again = load_profile(out_file)
    original = load_profile(str(ROOT / "profiles" / "spacer-points.txt"))
    poly, = original.profile.loops[0].segments      # a point list is one polyline
    back, = again.profile.loops[0].segments         # written as one points_to, read as one
    assert back.kind == "polyline" and back.points.tolist() == poly.points.tolist()


def test_output_is_not_replaced_without_force(tmp_path, capsys):
    out_file = tmp_path / "ring.toml"
    out_file.write_text("# mine\n")
    code, out, err = run(["convert", "--path-data", "M0,10 H40 V20 H0 Z", "-o", str(out_file)],
                         capsys)
    assert code == 2 and "exists already; give --force" in err
    assert out_file.read_text() == "# mine\n"
    code, out, err = run(["convert", "--path-data", "M0,10 H40 V20 H0 Z", "-o", str(out_file),
                          "--force"], capsys)
    assert code == 0 and load_profile(str(out_file)).profile.loops


def test_bad_input_exits_2_with_one_line_and_writes_nothing(tmp_path, capsys):
    out_file = str(tmp_path / "out.toml")
    junk = tmp_path / "junk.dxf"
    junk.write_text("not a drawing at all\n")
    line = refused(["convert", str(junk), "-o", out_file], capsys, out_file)
    assert "junk.dxf: this is not a DXF drawing" in line
    text = tmp_path / "text.svg"
    text.write_text("M 0 0 L 1 1\n")
    line = refused(["convert", str(text), "-o", out_file], capsys, out_file)
    assert "text.svg:1: this is not an SVG file" in line
    bomb = tmp_path / "bomb.svg"
    bomb.write_text('<!DOCTYPE svg [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;">]>'
                    '<svg><path d="&b;"/></svg>')
    line = refused(["convert", str(bomb), "-o", out_file], capsys, out_file)
    assert 'declares the XML entity "a"' in line
    line = refused(["convert", dxf_bush(tmp_path, "gap.dxf", gap=0.5), "-o", out_file], capsys,
                   out_file)
    assert "the drawing does not close" in line and "LWPOLYLINE #1" in line

    def crossing(msp):
        msp.add_line((20, 5), (20, 25))
    line = refused(["convert", dxf_bush(tmp_path, "cross.dxf", extra=crossing), "-o", out_file,
                    "--open"], capsys, out_file)
    assert "after chaining, the profile intersects itself" in line
    line = refused(["convert", "--path-data", "M 0 0 L 5", "-o", out_file], capsys, out_file)
    assert "path data: character 10:" in line
    line = refused(["convert", "--path-data", "M0,10 H40 V20 H0 Z", "-o", out_file, "--axis",
                    "0,-15,1,0"], capsys, out_file)
    assert "crosses the axis" in line
    line = refused(["convert", NOZZLE, "--layer", "A", "-o", out_file], capsys, out_file)
    assert "--layer applies to DXF drawings only" in line
    line = refused(["convert", "-o", out_file], capsys, out_file)
    assert "give a drawing file or --path-data" in line
    line = refused(["convert", "--path-data", "M0 0 H1 V1 Z", "-o", str(tmp_path / "x.svg")],
                   capsys, str(tmp_path / "x.svg"))
    assert line.startswith("revolve: error: --output: ") and "written as .toml files" in line


def test_reader_registration_imports_nothing_heavy():
    code = ("import sys; import revolve.formats.drawings, revolve.cli.commands.convert, "
            "revolve.formats.svg; heavy = [m for m in ('ezdxf', 'sympy', 'scipy', 'numpy', "
            "'pint', 'matplotlib') if m in sys.modules]; print(heavy)")
    result = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                            cwd=str(ROOT), env={**os.environ, "PYTHONPATH": str(ROOT)})
    assert result.returncode == 0, result.stderr
    assert result.stdout.strip() == "[]"


SLEEVE = '''name = "Sleeve"
units = "mm"
{extra}
[axis]
along = "x"

[[loop]]
start = [0, 10]
segments = [{{ line_to = [40, 10] }}, {{ line_to = [40, 20] }}, {{ line_to = [0, 20] }},
            {{ close = true }}]
'''


@pytest.mark.parametrize("extra, words", [
    ('density = "seven thousand"', "density"),
    ('density = "-7850 kg/m^3"', "density"),
    ('density = "1e999 kg/m^3"', "density"),
    ('material = "unobtainium"', "unknown material"),
])
def test_convert_checks_material_and_density_as_measure_does(tmp_path, capsys, extra, words):
    """Family: profile files whose material or density measure would refuse."""
    source = tmp_path / "in.toml"
    source.write_text(SLEEVE.format(extra=extra))
    out_file = str(tmp_path / "out.toml")
    measure_code, _, measure_err = run(["measure", str(source)], capsys)
    assert measure_code == 2        # measure refuses it ...
    line = refused(["convert", str(source), "-o", out_file], capsys, out_file)
    assert words in line and str(source) in line     # ... and so does convert
    assert line.split(": ", 2)[2] == measure_err.strip().split(": ", 2)[2]


def test_convert_refuses_a_self_intersecting_point_list(tmp_path, capsys):
    """Family: point lists that cross themselves (a bow tie), with and without an axis."""
    bow = tmp_path / "bow.txt"
    bow.write_text("0,10\n20,30\n20,10\n0,30\n")
    out_file = str(tmp_path / "out.toml")
    line = refused(["convert", str(bow), "-o", out_file], capsys, out_file)
    assert "intersects itself" in line and "bow.txt" in line
    line = refused(["convert", str(bow), "-o", out_file, "--axis", "x"], capsys, out_file)
    assert "intersects itself" in line


def test_convert_of_a_good_profile_keeps_its_material(tmp_path, capsys):
    source = tmp_path / "in.toml"
    source.write_text(SLEEVE.format(extra='material = "carbon steel"'))
    out_file = str(tmp_path / "out.toml")
    code, out, err = run(["convert", str(source), "-o", out_file], capsys)
    assert code == 0, err
    assert load_profile(out_file).material == "carbon steel"


def test_stray_dxf_circle_through_convert(tmp_path, capsys):
    """The issue's case end to end: warned, left out, and kept with --keep-strays."""
    def stray(msp):
        msp.add_circle((80, 15), 3)
    drawing = dxf_bush(tmp_path, "stray.dxf", extra=stray)
    out_file = str(tmp_path / "out.toml")
    code, out, err = run(["convert", drawing, "-o", out_file], capsys)
    assert code == 0, err
    assert "warning: loop 2 (from CIRCLE #5" in out and "--keep-strays" in out
    assert len(load_profile(out_file).profile.loops) == 1
    code, out, err = run(["convert", drawing, "-o", out_file, "--force", "--keep-strays"],
                         capsys)
    assert code == 0, err
    assert len(load_profile(out_file).profile.loops) == 2
    line = refused(["convert", "--path-data", "M0 0 H1 V1 Z", "-o", str(tmp_path / "p.toml"),
                    "--gap-tolerance", "1"], capsys, str(tmp_path / "p.toml"))
    assert "--gap-tolerance applies to DXF drawings only" in line


@pytest.mark.parametrize("value", ["-1", "0", "inf", "nan", "1e999"])
def test_bad_gap_tolerance_names_the_option(tmp_path, capsys, value):
    """Family: --gap-tolerance values that are not a positive finite length."""
    out_file = str(tmp_path / "out.toml")
    line = refused(["convert", dxf_bush(tmp_path), "-o", out_file, f"--gap-tolerance={value}"],
                   capsys, out_file)
    assert "--gap-tolerance: the gap tolerance must be a positive number" in line


def test_half_thou_gap_in_an_inch_drawing_converts(tmp_path, capsys):
    # The case: 0.0005 in left by a CAD export; the default (0.001 in for a part this
    # size: common practice, no source) closes it and the report says so.
    doc = ezdxf.new("R2010")
    doc.header["$INSUNITS"] = 1          # inches (DXF reference, from memory)
    msp = doc.modelspace()
    for a, b in [((0, 0.5), (2, 0.5)), ((2, 0.5), (2, 1)), ((2, 1), (0, 1)), ((0, 1), (0, 0.5005))]:
        msp.add_line(a, b)
    drawing = str(tmp_path / "inch.dxf")
    doc.saveas(drawing)
    out_file = str(tmp_path / "out.toml")
    code, out, err = run(["convert", drawing, "-o", out_file, "--json"], capsys)
    assert code == 0, err
    report = json.loads(out)["report"]
    assert report["tolerance"] == pytest.approx(0.001) and len(report["gaps_closed"]) == 1


def test_a_long_drawing_polyline_converts_to_one_polyline_through_its_vertices(tmp_path, capsys):
    # 2000 straight edges of a closed LWPOLYLINE: read as one polyline (the report says so),
    # written as one line_to per edge, read back through the very vertices ezdxf holds
    # (LWPolyline.get_points). Reference for the volume: shapely Polygon.area and .centroid
    # with Pappus V = 2π ȳ A (Stewart, from memory).
    a = np.linspace(0.0, 2 * np.pi, 2000, endpoint=False)
    r = 1.0 + 0.3 * np.sin(7 * a)
    doc = ezdxf.new("R2010", setup=True)
    doc.header["$INSUNITS"] = 4
    msp = doc.modelspace()
    outline = msp.add_lwpolyline(np.column_stack([r * np.cos(a), 3.0 + r * np.sin(a)]).tolist(),
                                 close=True)
    msp.add_line((-2, 0), (2, 0), dxfattribs={"linetype": "CENTER"})
    drawing = str(tmp_path / "wavy.dxf")
    doc.saveas(drawing)
    vertices = np.array(list(outline.get_points("xy")), dtype=float)
    out_file = str(tmp_path / "wavy.toml")
    code, out, err = run(["convert", drawing, "-o", out_file, "--json"], capsys)
    assert code == 0, err
    found = json.loads(out)["report"]["loops"][0]
    assert (found["polylines"], found["lines"], found["arcs"]) == (1, 0, 0)
    segments = load_profile(out_file).profile.loops[0].segments
    assert len(segments) == 1 and segments[0].kind == "polyline"    # one points_to list
    assert np.array_equal(segments[0].points[:-1], vertices)
    code, out, err = run(["measure", out_file, "--json"], capsys)
    assert code == 0, err
    shape = Polygon(vertices)
    assert json.loads(out)["volume"] == pytest.approx(2 * math.pi * shape.centroid.y * shape.area,
                                                      rel=1e-12)
    code, out, err = run(["convert", drawing, "-o", out_file, "--force"], capsys)
    assert code == 0, err
    assert "polylines" in out    # the table counts it
