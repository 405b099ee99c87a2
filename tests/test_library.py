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
    # The package metadata reads the same one place (pyproject: a dynamic version, by attribute).
    try:
        import tomllib
    except ImportError:                         # Python < 3.11
        import tomli as tomllib

    project = tomllib.loads((ROOT / "pyproject.toml").read_text(encoding="utf-8"))
    assert "version" not in project["project"] and "version" in project["project"]["dynamic"]
    assert project["tool"]["setuptools"]["dynamic"]["version"] == {"attr": "revolve.__version__"}


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


# -- every public name: a numpydoc Examples section (the doctests themselves run in the suite) ----


@pytest.mark.parametrize("name", [n for n in revolve.__all__ if n != "__version__"])
def test_every_public_name_has_a_numpydoc_example(name):
    import inspect

    doc = inspect.getdoc(getattr(revolve, name)) or ""
    assert re.search(r"^Examples\n--------\n", doc, re.M) and "\n>>> " in doc, name


# -- every result type: a readable repr and an HTML table that say their units ------------------

DRUM_POINTS = [(0, 0), (500, 0), (500, 1000), (0, 1000)]


def _drum():
    return revolve.Profile(loops=(revolve.Loop.from_points(DRUM_POINTS),), name="drum")


RESULTS = {
    "measure": (lambda: revolve.measure(_tube(20, 30, 50), density="7850 kg/m^3"),
                r"<MeasureResult tube: volume=\S+ mm³, surface_area=\S+ mm², mass=\S+ kg>", "mm³"),
    "vessel": (lambda: revolve.build_vessel("1 m", 0, head="hemispherical"),
               r"<VesselResult vessel, .*: capacity=523\.599 L, inside surface=3\.14159 m²>", "L"),
    "levels": (lambda: revolve.level_table(_drum(), orientation="vertical", axis="y",
                                           at="250 mm"),
               r"<LevelResult drum: 1 rows, vertical, capacity=785\.398 L>", "L"),
    "inverse levels": (lambda: revolve.level_table(_drum(), orientation="vertical", axis="y",
                                                   volumes="100 L, 200 L"),
                       r"<LevelResult drum: 2 rows, vertical, capacity=785\.398 L>", "L"),
    "turning": (lambda: revolve.quote_turning(ROOT / "profiles" / "turned-stepped-shaft.toml"),
                r"<TurningResult Stepped shaft, crowned collar: \S+ mm round bar, part \S+ kg, "
                r"stock \S+ kg, cycle \S+ min>", "mm"),
    "turning many": (lambda: revolve.quote_turning_many(
                         [ROOT / "profiles" / "turned-stepped-shaft.toml"]),
                     r"<TurningBatch turn: parts: 1 rows>", "mm"),
    "coating": (lambda: revolve.estimate_coating(_tube(20, 30, 50), dft="100 um",
                                                 volume_solids="50 %", loss=0),
                # 2π (R + r) L + 2π (R² − r²) = 6000π mm² (from memory), 200 µm wet over it.
                r"<CoatingResult: 1 part, area 0\.0188496 m², paint 3\.76991 mL>", "m²"),
}


@pytest.mark.parametrize("kind", RESULTS)
def test_every_result_has_a_readable_repr_and_an_html_table(kind):
    make, pattern, unit = RESULTS[kind]
    result = make()
    assert re.fullmatch(pattern, repr(result)), repr(result)
    page = result._repr_html_()
    assert "<table>" in page and "</table>" in page and unit in page
    assert "<script" not in page and "\n" not in repr(result)


def test_the_vessel_and_coating_reprs_agree_with_closed_forms():
    # Sphere: V = π d³ / 6 (from memory); a tube's surface 2π (R + r) L + 2π (R² − r²) (from memory).
    assert revolve.build_vessel("1 m", 0, head="hemispherical").capacity == \
        pytest.approx(math.pi / 6 * 1000, rel=1e-12)
    c = revolve.estimate_coating(_tube(20, 30, 50), dft="100 um", volume_solids="50 %", loss=0)
    area_mm2 = 2 * math.pi * (30 + 20) * 50 + 2 * math.pi * (30 ** 2 - 20 ** 2)
    assert c.area == pytest.approx(area_mm2 * 1e-6, rel=1e-9)                    # m²
    assert c.paint == pytest.approx(area_mm2 * 1e-6 * 100e-6 / 0.5 * 1e6, rel=1e-9)   # mL


# -- errors name the library's argument, never the command's --option --------------------------

SHAFT = ROOT / "profiles" / "turned-stepped-shaft.toml"
RAINWATER = ROOT / "profiles" / "vessel-rainwater-tank.toml"
ONE_COAT = dict(dft="100 um", volume_solids=50, loss=0)

BAD_ARGUMENTS = [
    (lambda: revolve.measure(SHAFT, angle=400), "angle"),
    (lambda: revolve.measure_many([SHAFT], units="gallon"), "units"),
    (lambda: revolve.measure_many([SHAFT], workers=0), "workers"),
    (lambda: revolve.draw(SHAFT, angle=400), "angle"),
    (lambda: revolve.build_vessel("wide", "1 m", head="flat"), "diameter"),
    (lambda: revolve.build_vessel("1 m", "1 m", head="flat", thickness=6, density="7850 kg"),
     "density"),
    (lambda: revolve.level_table(RAINWATER, step="-1 mm"), "step"),
    (lambda: revolve.level_table(RAINWATER, at="1 kg"), "at"),
    (lambda: revolve.level_table(RAINWATER, volumes="1 kg"), "volumes"),
    (lambda: revolve.quote_turning(SHAFT, material="water"), "material"),
    (lambda: revolve.quote_turning(SHAFT, quantity=0), "quantity"),
    (lambda: revolve.quote_turning(SHAFT, stock_price="cheap"), "stock_price"),
    (lambda: revolve.quote_turning(SHAFT, turning_allowance="3 kg"), "turning_allowance"),
    (lambda: revolve.quote_turning(SHAFT, blank_length="100 mm"), "blank_length"),
    (lambda: revolve.quote_turning(SHAFT, grade="S355"), "grade"),
    (lambda: revolve.quote_turning(SHAFT, max_speed="fast"), "max_speed"),
    (lambda: revolve.quote_turning_many([SHAFT], quantity=[1, 2]), "quantity"),
    (lambda: revolve.quote_turning_many([SHAFT], workers=0), "workers"),
    (lambda: revolve.estimate_coating(SHAFT, angle=400, **ONE_COAT), "angle"),
    (lambda: revolve.estimate_coating(SHAFT, dft="thick", volume_solids=50, loss=0), "dft"),
    (lambda: revolve.estimate_coating(SHAFT, stripe_band=5, **ONE_COAT), "stripe_band"),
]


@pytest.mark.parametrize("call, name", BAD_ARGUMENTS, ids=[n for _, n in BAD_ARGUMENTS])
def test_library_errors_name_the_argument_in_one_sentence(call, name):
    with pytest.raises(revolve.RevolveError) as caught:
        call()
    text = str(caught.value)
    assert re.search(rf"(^|: ){name}: ", text), text
    assert "--" not in text and "\n" not in text


def test_an_unknown_turning_setting_is_named():
    with pytest.raises(revolve.RevolveError, match=r"^unknown setting 'colour'; "):
        revolve.quote_turning(SHAFT, colour="red")


# -- units are never guessed in the jobs: text with units, pint quantities, documented bare numbers


def test_job_lengths_take_pint_quantities_and_text_alike():
    import pint

    ureg = pint.UnitRegistry()
    by_text = revolve.build_vessel("1.2 m", "50 cm", head="flat")
    by_pint = revolve.build_vessel(ureg.Quantity(1.2, "m"), ureg.Quantity(0.5, "m"), head="flat")
    # A flat-ended cylinder: V = π/4 D² L (from memory).
    assert by_pint.capacity == pytest.approx(by_text.capacity, rel=1e-12)
    assert by_text.capacity == pytest.approx(math.pi / 4 * 1.2 ** 2 * 0.5 * 1000, rel=1e-12)
    levels = [revolve.level_table(_drum(), orientation="vertical", axis="y", at=at).rows
              for at in ("25 cm", ureg.Quantity(0.25, "m"), [250])]
    assert levels[0] == levels[1] == levels[2]
    # π/4 · 1² · 0.25 m³ (from memory), in L.
    assert levels[0][0]["volume"] == pytest.approx(math.pi / 4 * 0.25 * 1000, rel=1e-12)
    inverse = [revolve.level_table(_drum(), orientation="vertical", axis="y", volumes=v).rows
               for v in ("0.19634954084936207 m^3", ureg.Quantity(196.34954084936207, "L"),
                         196.34954084936207)]
    assert [r[0]["level"] for r in inverse] == pytest.approx([250, 250, 250], rel=1e-9)


def test_a_bare_level_is_in_the_level_unit():
    # The documented rule: a bare number is in the level unit (here metres), never guessed.
    in_m = revolve.level_table(_drum(), orientation="vertical", axis="y", at=[0.25],
                               level_unit="m").rows
    assert in_m[0]["level"] == 0.25
    assert in_m[0]["volume"] == pytest.approx(math.pi / 4 * 0.25 * 1000, rel=1e-12)


def test_film_thickness_and_speed_take_pint_quantities():
    import pint

    ureg = pint.UnitRegistry()
    coat = {"volume_solids": 50, "loss": 0}
    paints = [revolve.estimate_coating(SHAFT, dft=d, **coat).paint
              for d in ("0.1 mm", ureg.Quantity(100, "um"), 100)]         # a bare number is µm
    assert paints[0] == pytest.approx(paints[1], rel=1e-12) == pytest.approx(paints[2], rel=1e-12)
    with pytest.raises(revolve.RevolveError, match=r"^dft: "):
        revolve.estimate_coating(SHAFT, dft=ureg.Quantity(4, "kg"), **coat)
    assert revolve.quote_turning(SHAFT, max_speed=ureg.Quantity(2000, "1/min")).to_dict() == \
        revolve.quote_turning(SHAFT, max_speed="2000 rpm").to_dict()
    assert revolve.quote_turning(SHAFT, turning_allowance=ureg.Quantity(0.2, "cm")).to_dict() == \
        revolve.quote_turning(SHAFT, turning_allowance="2 mm").to_dict() == \
        revolve.quote_turning(SHAFT, turning_allowance=2).to_dict()          # bare: mm (metric)


def test_readme_job_script_runs_and_agrees_with_closed_forms(tmp_path):
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    section = text[text.index("### A vessel and its level table"):]
    script = re.search(r"```python\n(.*?)```", section, re.S).group(1)
    printed = re.search(r"prints\n\n```text\n(.*?)```", section, re.S).group(1)
    run = subprocess.run([PYTHON, "-c", script], cwd=tmp_path, env=ENV, capture_output=True,
                         text=True)
    assert run.returncode == 0, run.stderr
    assert run.stdout == printed
    assert "build_vessel" in script and "level_table" in script
    # Closed forms (from memory): a cylinder π/4 D² L; a 2:1 ellipsoidal head of depth D/4 holds
    # π D³/24, and filled to y from its bottom π (a/b)² (b y² − y³/3) with a = D/2, b = D/4.
    d, shell = 0.6, 0.8
    head = math.pi * d ** 3 / 24
    capacity_l = 1000 * (math.pi / 4 * d ** 2 * shell + 2 * head)
    assert float(re.search(r"capacity=(\S+) L", run.stdout).group(1)) == \
        pytest.approx(capacity_l, rel=1e-5)
    a, b, y = d / 2, d / 4, 0.1
    rows = dict(re.findall(r"^\s*(\d+) mm\s+(\S+) L$", run.stdout, re.M))
    in_head = math.pi * (a / b) ** 2 * (b * y ** 2 - y ** 3 / 3)
    assert float(rows["100"]) == pytest.approx(1000 * in_head, abs=0.005)
    assert float(rows["200"]) == pytest.approx(1000 * (head + math.pi / 4 * d ** 2 * 0.05),
                                               abs=0.005)
    for litres, level in re.findall(r"^(\d+) L at (\S+) mm$", run.stdout, re.M):
        in_shell = (float(litres) / 1000 - head) / (math.pi / 4 * d ** 2)
        assert float(level) == pytest.approx(1000 * (b + in_shell), abs=0.05)
