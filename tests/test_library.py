"""The library's public face (issue 11): ``revolve.measure`` against the command line's JSON, densities
with units against closed forms, the start-up rule, ``revolve.draw`` and the README's script."""

import json
import math
import os
import re
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest

import revolve
from revolve.render.output import clean_json

ROOT = Path(__file__).resolve().parents[1]
PYTHON = sys.executable
ENV = {**os.environ, "PYTHONPATH": str(ROOT)}

PROFILES = sorted(p for p in (ROOT / "profiles").iterdir() if not p.name.startswith("."))
#: examples/ holds a coating system (not a profile) and a drawing with a stray centre line, which
#: ``measure`` refuses (``convert`` takes it): its refusal must be the same sentence.
STRAY_DRAWING = ROOT / "examples" / "nozzle-outline.svg"


def _cli(*args):
    run = subprocess.run([PYTHON, "-m", "revolve", "measure", *map(str, args)], cwd=ROOT, env=ENV,
                         capture_output=True, text=True)
    return run


def _cli_json(*args):
    run = _cli(*args, "--json")
    assert run.returncode == 0, run.stderr
    return json.loads(run.stdout)


def _as_printed(d):
    """What the command line prints of a dict: strict JSON (NaN -> null, tuples -> lists)."""
    return json.loads(json.dumps(clean_json(d), ensure_ascii=False))


def _tube(r_in, r_out, length, unit="mm"):
    loop = revolve.Loop.from_points([(0, r_in), (length, r_in), (length, r_out), (0, r_out)])
    return revolve.Profile(loops=(loop,), unit=unit, name="tube")


# -- one code path: the library's dict is the command's JSON ------------------------------------


@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.name)
def test_to_dict_is_the_commands_json(path):
    assert _as_printed(revolve.measure(str(path)).to_dict()) == _cli_json(path)


def test_a_refused_drawing_gives_the_command_lines_sentence():
    run = _cli(STRAY_DRAWING, "--json")
    assert run.returncode == 2
    with pytest.raises(revolve.RevolveError) as caught:
        revolve.measure(str(STRAY_DRAWING))
    assert run.stderr.strip() == f"revolve: error: {caught.value}"


@pytest.mark.parametrize("options, kwargs", [
    (["--density", "7.85 g/cm^3"], {"density": "7.85 g/cm^3"}),
    (["--density", "7850"], {"density": 7850}),
    (["--material", "steel"], {"material": "steel"}),
    (["--angle", "90", "--axis", "x"], {"angle": 90.0, "axis": "x"}),
])
def test_options_give_the_same_json(options, kwargs):
    path = ROOT / "profiles" / "flanged-bushing.toml"
    assert _as_printed(revolve.measure(str(path), **kwargs).to_dict()) == _cli_json(path, *options)


def test_exact_gives_the_same_json():
    path = ROOT / "profiles" / "flanged-bushing.toml"
    assert _as_printed(revolve.measure(str(path), exact=True).to_dict()) == \
        _cli_json(path, "--exact")


def test_a_point_list_with_units_gives_the_same_json():
    path = ROOT / "profiles" / "spacer-points.txt"
    assert _as_printed(revolve.measure(str(path), units="in").to_dict()) == \
        _cli_json(path, "--units", "in")


# -- units are never guessed ----------------------------------------------------------------------


def test_density_with_units_gives_the_mass_in_kg():
    # Hollow cylinder: V = π (R² − r²) L (from memory). 20/30 mm radii, 50 mm long, 2.7 g/cm³.
    r = revolve.measure(_tube(20, 30, 50), density="2.7 g/cm^3")
    volume_m3 = math.pi * (0.030 ** 2 - 0.020 ** 2) * 0.050
    assert r.to_dict()["units"]["mass"] == "kg"
    assert r.mass == pytest.approx(2700 * volume_m3, rel=1e-12)
    # The same part drawn in inches, density in lb/in³: mass = ρ V with 1 lb = 0.45359237 kg.
    r = revolve.measure(_tube(1, 2, 3, unit="in"), density="0.3 lb/in^3")
    assert r.measurement.mass == pytest.approx(0.3 * math.pi * (4 - 1) * 3 * 0.45359237, rel=1e-12)
    # An inch drawing is shown in inch-pound units (README, "Units"): the same mass in lb.
    assert r.units["mass"] == "lb" and r.to_dict()["units"]["mass"] == "lb"
    assert r.mass == pytest.approx(0.3 * math.pi * (4 - 1) * 3, rel=1e-12)


def test_a_pint_quantity_is_a_density():
    import pint

    ureg = pint.UnitRegistry()
    r = revolve.measure(_tube(20, 30, 50), density=ureg.Quantity(8.9, "g/cm**3"))
    assert r.mass == pytest.approx(8900 * math.pi * (0.030 ** 2 - 0.020 ** 2) * 0.050, rel=1e-12)
    with pytest.raises(revolve.RevolveError, match=r"^density: .*is not a density"):
        revolve.measure(_tube(20, 30, 50), density=ureg.Quantity(8.9, "g"))


def test_a_bare_number_is_kg_per_cubic_metre_whatever_the_profile_unit():
    # The documented rule (README, "--density"): a bare number is kg/m³, in mm and in inch profiles.
    for unit, metre in (("mm", 1e-3), ("in", 0.0254)):
        r = revolve.measure(_tube(20, 30, 50, unit=unit), density=7850)
        assert r.measurement.mass == pytest.approx(7850 * math.pi * (30 ** 2 - 20 ** 2) * 50 * metre ** 3,
                                       rel=1e-12)
        assert r.to_dict()["density_kg_m3"] == pytest.approx(7850)


@pytest.mark.parametrize("density", ["seven", "7850 kg", "-5 kg/m^3", "", True, [7850]])
def test_bad_density_is_refused_in_one_line(density):
    with pytest.raises(revolve.RevolveError) as caught:
        revolve.measure(_tube(20, 30, 50), density=density)
    text = str(caught.value)
    assert "\n" not in text and text.startswith("density: ")


def test_bad_density_has_the_command_lines_sentence(tmp_path):
    path = ROOT / "profiles" / "flanged-bushing.toml"
    run = _cli(path, "--density", "7850 kg")
    assert run.returncode == 2
    with pytest.raises(revolve.RevolveError) as caught:
        revolve.measure(str(path), density="7850 kg")
    assert run.stderr.strip() == f"revolve: error: --{caught.value}"


def test_other_bad_input_is_refused_in_one_line(tmp_path):
    for call, pattern in (
            (lambda: revolve.measure(3), r"give a file name, a Profile or a Revolution"),
            (lambda: revolve.measure(_tube(1, 2, 3), axis="1,2"), r"^axis: give x, y or four"),
            (lambda: revolve.measure(_tube(1, 2, 3), angle=400), r"^angle: the revolution angle"),
            (lambda: revolve.measure(_tube(1, 2, 3), material="unobtainium"), r"^material: unknown"),
            (lambda: revolve.measure(_tube(1, 2, 3), density=1, material="steel"), r"not both"),
            (lambda: revolve.measure(str(tmp_path / "gone.toml")), r"gone.toml: no such file"),
            (lambda: revolve.measure(str(tmp_path / "p.txt"), units="gallon"), r"^units: 'gallon'"),
    ):
        with pytest.raises(revolve.RevolveError, match=pattern) as caught:
            call()
        assert "\n" not in str(caught.value)


def test_measure_many_takes_density_with_units(tmp_path):
    # Solid cylinder r = 10 mm, h = 40 mm: V = π r² h (from memory), at 8.9 g/cm³ and as a bare number.
    path = tmp_path / "pin.txt"
    path.write_text("0,0\n40,0\n40,10\n0,10\n")
    volume_m3 = math.pi * 0.010 ** 2 * 0.040
    (with_units,) = revolve.measure_many([str(path)], density="8.9 g/cm^3")
    (bare,) = revolve.measure_many([str(path)], density=8900)
    assert with_units.value.measurement.mass == pytest.approx(8900 * volume_m3, rel=1e-12)
    assert bare.value.measurement.mass == pytest.approx(8900 * volume_m3, rel=1e-12)
    with pytest.raises(revolve.RevolveError, match="^density: "):
        revolve.measure_many([str(path)], density="heavy")


def test_a_curve_from_text_gives_a_hemisphere():
    # Quarter disc about x: a hemisphere, V = 2/3 π r³, surface 2 π r² + the flat disc π r² (from memory).
    r = 25.0
    loop = revolve.Loop((revolve.Line((0, 0), (r, 0), face="base"),
                         revolve.curve(x="25*cos(t)", y="25*sin(t)", t_from=0, t_to="pi/2",
                                       face="dome"),
                         revolve.Line((0, r), (0, 0), face="flat")))
    m = revolve.measure(revolve.Profile(loops=(loop,)))
    assert m.volume == pytest.approx(2 / 3 * math.pi * r ** 3, rel=1e-10)
    assert m.to_dict()["surface_by_face"]["dome"] == pytest.approx(2 * math.pi * r ** 2, rel=1e-10)
    assert m.to_dict()["surface_by_face"]["flat"] == pytest.approx(math.pi * r ** 2, rel=1e-10)


def test_curve_text_is_never_evaluated():
    for text in ("__import__('os').system('true')", "t.__class__", "lambda: 1"):
        with pytest.raises(revolve.RevolveError):
            revolve.curve(x=text, y="t", t_from=0, t_to=1)


def test_result_repr_and_html_say_their_units():
    r = revolve.measure(_tube(20, 30, 50), density="7850 kg/m^3")
    assert re.fullmatch(r"<MeasureResult tube: volume=\S+ mm³, surface_area=\S+ mm², mass=\S+ kg>",
                        repr(r))
    page = r._repr_html_()
    assert page.startswith("<table>") and "mm³" in page and "kg" in page and "<th>mass</th>" in page


# -- the public face ------------------------------------------------------------------------------


def test_every_public_name_is_there_and_documented():
    wanted = {"Line", "arc_from_radius", "arc_from_centre", "curve", "Polyline", "Loop", "Chain",
              "Profile", "Axis", "Revolution", "load_profile", "write_profile", "measure",
              "measure_many", "draw", "RevolveError", "__version__"}
    assert wanted <= set(revolve.__all__) <= set(dir(revolve))
    for name in revolve.__all__:
        value = getattr(revolve, name)
        if name != "__version__":
            assert value.__doc__, name


def test_version_agrees_with_the_command_line():
    run = subprocess.run([PYTHON, "-m", "revolve", "--version"], cwd=ROOT, env=ENV,
                         capture_output=True, text=True)
    assert run.stdout.split()[-1] == revolve.__version__


def test_importing_and_measuring_lines_and_arcs_stays_light():
    code = (
        "import sys, revolve\n"
        "loop = revolve.Loop((revolve.Line((0, 10), (30, 10)), revolve.Line((30, 10), (30, 14)),\n"
        "    revolve.arc_from_radius((30, 14), (26, 18), radius=4, side='right'),\n"
        "    revolve.Line((26, 18), (0, 18)), revolve.Line((0, 18), (0, 10))))\n"
        "revolve.measure(revolve.Profile(loops=(loop,)), density='7850 kg/m^3')\n"
        "revolve.measure('profiles/flanged-bushing.toml', density=7850).to_dict()\n"
        "print(sorted(m for m in ('scipy', 'sympy', 'pint', 'matplotlib', 'ezdxf') if m in sys.modules))\n"
    )
    run = subprocess.run([PYTHON, "-c", code], cwd=ROOT, env=ENV, capture_output=True, text=True)
    assert run.returncode == 0, run.stderr
    assert run.stdout.strip() == "[]"


# -- pictures -------------------------------------------------------------------------------------


def test_draw_returns_the_axes_and_draws_the_outline():
    from matplotlib.figure import Figure

    points = [(0, 10), (40, 10), (40, 16), (0, 16)]
    profile = revolve.Profile(loops=(revolve.Loop.from_points(points, face="body"),))
    ax = Figure().add_subplot()
    assert revolve.draw(profile, ax) is ax
    (outline,) = [line for line in ax.lines if line.get_label() == "body"]
    xy = np.column_stack([outline.get_xdata(), outline.get_ydata()])
    drawn = {tuple(p) for p in xy[~np.isnan(xy).any(axis=1)]}
    assert drawn == {tuple(map(float, p)) for p in points}
    (axis,) = [line for line in ax.lines if line.get_label() == "axis"]
    assert set(axis.get_ydata()) == {0.0}                       # the sketch x axis


def test_draw_takes_a_result_and_makes_its_own_axes():
    r = revolve.measure(_tube(20, 30, 50))
    ax = revolve.draw(r)
    assert ax.figure is not None and {line.get_label() for line in ax.lines} == {"other", "axis"}


# -- the README's script --------------------------------------------------------------------------


def test_readme_script_runs_and_prints_what_the_readme_says(tmp_path):
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    section = text[text.index("## Using revolve from Python"):]
    script = re.search(r"```python\n(.*?)```", section, re.S).group(1)
    printed = re.search(r"prints\n\n```text\n(.*?)```", section, re.S).group(1)
    run = subprocess.run([PYTHON, "-c", script], cwd=tmp_path, env=ENV, capture_output=True,
                         text=True)
    assert run.returncode == 0, run.stderr
    assert run.stdout == printed
    assert (tmp_path / "bushing.png").stat().st_size > 0
    # The bushing's volume against closed forms (from memory): rings π (R² − r²) L, less the
    # rounded corner, a spandrel of area (1 − π/4) ρ² whose centroid lies (10 − 3π) ρ / (3 (4 − π))
    # from each straight edge, swept about the axis (Pappus).
    volume = float(re.search(r"volume=(\S+) mm³", run.stdout).group(1))
    rings = math.pi * (16 ** 2 - 10 ** 2) * 40 + math.pi * (20 ** 2 - 16 ** 2) * 6
    spandrel = (1 - math.pi / 4) * 2 ** 2
    spandrel_y = 20 - (10 - 3 * math.pi) * 2 / (3 * (4 - math.pi))
    assert volume == pytest.approx(rings - 2 * math.pi * spandrel_y * spandrel, rel=1e-5)
