"""`revolve picture` end to end: PNG and SVG files of the expected size, bad input refused.

References, named beside each check:

* reference library matplotlib (``matplotlib.image.imread``) reading the PNG
  back: its shape is the picture's size in pixels;
* the standard library's XML parser (``xml.etree.ElementTree``) for SVG; the SVG
  size in points is pixels × 72 / dpi (1 pt = 1/72 in, common practice, no source);
* matplotlib's default colour cycle ``tab10`` (``matplotlib.colormaps``): each
  face's colour must appear in the picture.

The bundled example profiles are invented scenarios: they are only drawn.
"""

from __future__ import annotations

import subprocess
import sys
import xml.etree.ElementTree as ET
from pathlib import Path

import matplotlib.image
import numpy as np
import pytest
from matplotlib import colormaps

from revolve.cli.app import main

ROOT = Path(__file__).resolve().parents[2]
PROFILES = [p for p in sorted((ROOT / "profiles").glob("*.toml"))
            if "[[loop]]" in p.read_text(encoding="utf-8") or "[[chain]]" in p.read_text(encoding="utf-8")]
PROFILES += sorted((ROOT / "profiles").glob("*.txt"))

RING = """
units = "mm"
name = "Test ring"
[[loop]]
start = [0, 1]
segments = [
  { line_to = [2, 1], face = "bore" },
  { line_to = [2, 3], face = "end" },
  { line_to = [0, 3], face = "outside" },
  { close = true, face = "end" },
]
"""

SHELL = """
units = "mm"
[[chain]]
start = [0, 0]
segments = [
  { arc_to = [10, 10], centre = [0, 10], turn = "ccw", face = "shell" },
  { line_to = [10, 30], face = "wall" },
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


def colours_present(png, colours, tol=0.02):
    """Which of ``colours`` (RGB 0..1) occur among the picture's pixels (within ``tol``)."""
    img = matplotlib.image.imread(str(png))[..., :3].reshape(-1, 3)
    return [bool(np.any(np.all(np.abs(img - np.array(c)) < tol, axis=1))) for c in colours]


def svg_size(path):
    root = ET.parse(str(path)).getroot()   # the standard library's XML parser
    assert root.tag.endswith("svg")
    return float(root.get("width").rstrip("pt")), float(root.get("height").rstrip("pt"))


@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.name)
def test_every_example_profile_picture(path, tmp_path, capsys):
    png = tmp_path / "p.png"
    code, out, err = run(["picture", path, "-o", png], capsys)
    assert code == 0, err
    assert "wrote" in out
    img = matplotlib.image.imread(str(png))
    assert img.shape[:2] == (800, 1200)                  # default 1200 × 800 px
    # Face k is drawn in tab10's colour k (matplotlib's default cycle): every face that sweeps
    # a surface shows (a face lying on the axis sweeps none: Pappus, zero mean radius).
    import revolve
    from revolve.formats import load_profile
    faces = load_profile(str(path)).profile.faces()
    swept = revolve.measure(str(path), units="mm" if path.suffix == ".txt" else None) \
        .measurement.surface_by_face
    tab10 = colormaps["tab10"].colors
    expected = [tab10[k] for k, face in enumerate(faces[:10]) if swept.get(face, 0.0) > 0.0]
    assert expected and all(colours_present(png, expected))


@pytest.mark.parametrize("path", PROFILES[:3], ids=lambda p: p.name)
def test_every_example_solid_picture(path, tmp_path, capsys):
    png = tmp_path / "s.png"
    code, out, err = run(["picture", path, "-o", png, "--3d", "--width", 640, "--height", 480], capsys)
    assert code == 0, err
    assert matplotlib.image.imread(str(png)).shape[:2] == (480, 640)


@pytest.mark.parametrize("width, height, dpi", [(400, 300, 100), (1000, 250, 100), (333, 777, 150)])
def test_png_has_the_requested_size(tmp_path, capsys, width, height, dpi):
    profile = write(tmp_path, "ring.toml", RING)
    for extra in ([], ["--3d"]):
        png = tmp_path / "r.png"
        code, _, err = run(["picture", profile, "-o", png, "--width", width, "--height", height,
                            "--dpi", dpi, "--force"] + extra, capsys)
        assert code == 0, err
        img = matplotlib.image.imread(str(png))   # matplotlib
        assert img.shape[:2] == (height, width)
        # Not blank: white background, dark text and coloured faces.
        assert img[..., :3].min() < 0.3 and img[..., :3].max() > 0.95


def test_svg_is_xml_of_the_right_size(tmp_path, capsys):
    profile = write(tmp_path, "ring.toml", RING)
    for extra in ([], ["--3d", "--angle", "240"]):
        svg = tmp_path / "r.svg"
        code, _, err = run(["picture", profile, "-o", svg, "--width", 900, "--height", 600,
                            "--force"] + extra, capsys)
        assert code == 0, err
        w, h = svg_size(svg)
        assert (w, h) == pytest.approx((900 * 72 / 100, 600 * 72 / 100))
        text = svg.read_text(encoding="utf-8")
        for word in ("bore", "outside", "section area", "volume"):
            assert word in text
        if not extra:
            assert "section centroid" in text and "boundary centroid" in text and "axis" in text


def test_faces_have_distinct_colours(tmp_path, capsys):
    # Three faces: tab10's first three colours, all present; the fourth is not used.
    profile = write(tmp_path, "ring.toml", RING)
    png = tmp_path / "r.png"
    code, _, _ = run(["picture", profile, "-o", png], capsys)
    assert code == 0
    tab10 = colormaps["tab10"].colors
    assert colours_present(png, tab10[:4]) == [True, True, True, False]


def test_open_chain_and_partial_revolution(tmp_path, capsys):
    profile = write(tmp_path, "shell.toml", SHELL)
    for extra in ([], ["--3d"], ["--3d", "--angle", "120"]):
        png = tmp_path / "s.png"
        code, _, err = run(["picture", profile, "-o", png, "--force"] + extra, capsys)
        assert code == 0, err
        assert matplotlib.image.imread(str(png)).shape[:2] == (800, 1200)
    svg = tmp_path / "s.svg"
    code, _, _ = run(["picture", profile, "-o", svg], capsys)
    assert "surface only" in svg.read_text(encoding="utf-8")


def test_mass_in_the_caption_with_the_caution(tmp_path, capsys):
    profile = write(tmp_path, "ring.toml", RING)
    svg = tmp_path / "r.svg"
    code, out, _ = run(["picture", profile, "-o", svg, "--material", "carbon steel"], capsys)
    assert code == 0
    assert "mass" in svg.read_text(encoding="utf-8")
    assert "competent" in out   # the lifting caution of the CLI


# -- bad input: exit 2, one line, nothing written ----------------------------------------

@pytest.mark.parametrize("extra, message", [
    (["-o", "p.jpg"], "p.jpg"),
    (["-o", "p.png", "--width", "50"], "--width"),
    (["-o", "p.png", "--height", "20000"], "--height"),
    (["-o", "p.png", "--dpi", "5"], "--dpi"),
    (["-o", "p.png", "--angle", "0"], "--angle"),
    (["-o", "p.png", "--axis", "q"], "--axis"),
    (["-o", "p.png", "--3d", "--chord-tolerance", "-1"], "--chord-tolerance"),
    (["-o", "p.png", "--3d", "--tolerance", "0.01"], "--tolerance: no such option"),
    # Finer than 1/2000 of the size: once minutes of drawing and half a gigabyte.
    (["-o", "p.png", "--3d", "--chord-tolerance", "1e-9"],
     "--chord-tolerance: a picture needs no finer chord tolerance"),
    (["-o", "p.png", "--material", "unobtainium"], "--material: unknown material 'unobtainium'"),
    (["-o", "p.png", "--volume-unit", "gallon"], "--volume-unit: 'gallon' is ambiguous"),
    (["-o", "p.png", "--density", "7850 kg"], "--density: 'kg' is a mass unit"),
    (["-o", "p.png", "--width", "wide"], "--width: give a whole number, got 'wide'"),
    (["-o", "missing/p.png"], "folder"),
])
def test_bad_options(tmp_path, capsys, monkeypatch, extra, message):
    monkeypatch.chdir(tmp_path)
    profile = write(tmp_path, "ring.toml", RING)
    code, _, err = run(["picture", profile] + extra, capsys)
    assert code == 2
    assert err.count("\n") == 1 and err.startswith("revolve: error:") and message in err, err
    assert sorted(p.name for p in tmp_path.iterdir()) == ["ring.toml"]


def test_bad_profile_keeps_the_old_picture(tmp_path, capsys):
    bad = write(tmp_path, "bad.toml", RING.replace("[0, 3] }", "[0, 5] }").replace("close = true", "line_to = [1, 9]"))
    png = tmp_path / "p.png"
    png.write_bytes(b"previous")
    code, _, err = run(["picture", bad, "-o", png, "--force"], capsys)
    assert code == 2 and "bad.toml" in err and err.count("\n") == 1
    assert png.read_bytes() == b"previous"


def test_existing_picture_is_refused_without_force_and_replaced_with_it(tmp_path, capsys):
    profile = write(tmp_path, "ring.toml", RING)
    png = tmp_path / "p.png"
    png.write_bytes(b"previous")
    code, out, err = run(["picture", profile, "-o", png], capsys)
    assert code == 2 and out == "" and err.count("\n") == 1
    assert err.startswith("revolve: error: --output: ") and "--force" in err, err
    assert png.read_bytes() == b"previous"
    code, out, err = run(["picture", profile, "-o", png, "--force"], capsys)
    assert code == 0, err
    assert matplotlib.image.imread(str(png)).shape[:2] == (800, 1200)


def test_subprocess_error_has_no_traceback(tmp_path):
    res = subprocess.run([sys.executable, "-m", "revolve", "picture", str(tmp_path / "none.toml"),
                          "-o", str(tmp_path / "p.png")], capture_output=True, text=True)
    assert res.returncode == 2
    assert res.stderr.count("\n") == 1 and "Traceback" not in res.stderr and "none.toml" in res.stderr
    assert not (tmp_path / "p.png").exists()


def test_bare_density_is_kg_per_cubic_metre(tmp_path, capsys):
    # The caption's mass: a bare 7850 draws the same picture as '7850 kg/m^3' (README: a bare
    # density is kg/m³), and another density draws a different one (so the check can fail).
    profile = write(tmp_path, "ring.toml", RING)
    pictures = {}
    for density in ("7850", "7850 kg/m^3", "7.85 g/cm^3", "7.85"):
        png = tmp_path / f"{len(pictures)}.png"
        code, _, err = run(["picture", profile, "-o", png, "--width", 400, "--height", 300,
                            "--density", density], capsys)
        assert code == 0, err
        pictures[density] = matplotlib.image.imread(str(png))
    assert np.array_equal(pictures["7850"], pictures["7850 kg/m^3"])
    assert np.array_equal(pictures["7850"], pictures["7.85 g/cm^3"])
    assert not np.array_equal(pictures["7850"], pictures["7.85"])


def test_a_polyline_is_drawn_through_its_own_vertices(tmp_path):
    # The same zigzag outline as ONE Polyline and as lines between the same vertices. The
    # points drawn for the polyline are its vertices, none added (the segment contract's
    # flatten_to_tolerance); both pictures, flat and 3-D, show the same thing: the face's
    # colour (tab10's first) present, and nearly every pixel the same (the lines are drawn
    # one by one, so only their joints may differ by a few pixels).
    from revolve.jobs.measuring import part_units
    from revolve.render import drawing, pictures
    from revolve.geometry.measure import measure
    from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    from revolve.geometry.segments import Polyline

    pts = np.array([(0, 1), (1, 2), (2, 1.5), (3, 2.5), (4, 1), (4, 0.5), (0, 0.5), (0, 1)], float)
    poly = Polyline(pts, face="zigzag")
    drawn_pictures = {}
    for name, loop in (("polyline", Loop((poly,))), ("lines", Loop.from_points(pts, face="zigzag"))):
        rev = Revolution(Profile(loops=(loop,), unit="mm"), Axis.x())
        m = measure(rev, crosscheck=False)
        if name == "polyline":
            (drawn,) = drawing.sketch_paths(rev.profile, 5.0)[0]
            assert drawn is poly.points
        for kind in ("flat", "solid"):
            png = tmp_path / f"{name}-{kind}.png"
            draw = pictures.profile_picture if kind == "flat" else pictures.solid_picture
            data = draw(rev, m, str(png), units=part_units("mm"), width=600, height=400)
            png.write_bytes(data if kind == "flat" else data[0])
            drawn_pictures[name, kind] = matplotlib.image.imread(str(png))[..., :3]
    tab10 = colormaps["tab10"].colors
    for kind in ("flat", "solid"):
        a, b = drawn_pictures["polyline", kind], drawn_pictures["lines", kind]
        assert colours_present(tmp_path / f"polyline-{kind}.png", tab10[:1]) == [True]
        differ = np.any(np.abs(a - b) > 0.02, axis=-1).mean()
        assert differ < 0.005, f"{kind}: {differ:.2%} of the pixels differ"


def test_a_liquid_space_is_shown_in_the_vessel_trade_units():
    # Capacities in litres for a vessel (issue 12 trade defaults; 1 L = 10⁶ mm³, SI by
    # definition), a turned part in its drawing's unit.
    from revolve.cli.commands.picture import picture_units
    from revolve.formats import load_profile

    tank = load_profile(str(ROOT / "profiles" / "vessel-rainwater-tank.toml"))
    part = load_profile(str(ROOT / "profiles" / "flanged-bushing.toml"))
    assert tank.section == "space" and picture_units(tank).unit("volume") == "L"
    assert picture_units(tank).show(1.0, "volume") == pytest.approx(1000.0)   # 1 m³ = 1000 L
    assert picture_units(part).unit("volume") == "mm³"
    assert picture_units(tank, volume="m^3").unit("volume") == "m³"          # superscript


def test_bad_volume_unit_for_a_liquid_space_names_the_option(tmp_path, capsys):
    png = tmp_path / "t.png"
    code, out, err = run(["picture", ROOT / "profiles" / "vessel-rainwater-tank.toml", "-o", png,
                          "--volume-unit", "gallon"], capsys)
    assert code == 2 and "--volume-unit" in err and len(err.strip().splitlines()) == 1
    assert not png.exists()
