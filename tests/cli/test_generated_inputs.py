"""Generated inputs through the whole command line: files and options a user might give.

Input families: profile files (TOML documents with nested arrays, huge or tiny numbers, odd
strings and keys), point lists (odd separators, extreme and denormal numbers, long tokens), SVG
path data and elements, DXF drawings written by ezdxf and then truncated or mutated, and the
options of the commands that read them.

For every input the tool must end with exit code 0 (done), 1 (the two computations disagree)
or 2 (bad input, one line on standard error, ``revolve: error: ...``); it must never show a
traceback, never run without bound, and never leave an output file behind after exit 2.
Reference: the project's own exit-code contract (README, "Exit code"); no figures are checked
here.
"""

from __future__ import annotations

import io
import json as json_module
import math
import os
import signal
from contextlib import contextmanager, redirect_stderr, redirect_stdout
from pathlib import Path

import ezdxf
import pytest
from hypothesis import HealthCheck, example, given, settings
from hypothesis import strategies as st

from revolve.cli.app import main

ROOT = Path(__file__).resolve().parents[2]
#: Wall-clock bound for one command on one generated input (seconds).
TIME_LIMIT = 60


class Runaway(Exception):
    """Raised by the alarm when a command runs past TIME_LIMIT."""


@contextmanager
def time_limit(seconds):
    def on_alarm(signum, frame):
        raise Runaway(f"the command ran past {seconds} s")

    previous = signal.signal(signal.SIGALRM, on_alarm)
    signal.alarm(seconds)
    try:
        yield
    finally:
        signal.alarm(0)
        signal.signal(signal.SIGALRM, previous)


def run_cli(argv):
    """Run the console entry point in-process; return (exit code, stdout, stderr)."""
    out, err = io.StringIO(), io.StringIO()
    code = 0
    with redirect_stdout(out), redirect_stderr(err), time_limit(TIME_LIMIT):
        try:
            main(list(argv))
        except SystemExit as exc:
            code = exc.code if isinstance(exc.code, int) else (0 if exc.code is None else 1)
    return code, out.getvalue(), err.getvalue()


def check_contract(argv, outputs=()):
    """The exit-code contract: 0, 1 or 2; exit 2 is one line; no output left after exit 2."""
    for path in outputs:
        if os.path.exists(path):
            os.remove(path)
    code, out, err = run_cli(argv)
    assert code in (0, 1, 2), (argv, code, err)
    assert "Traceback" not in out + err, (argv, err)
    if code == 2:
        lines = err.strip("\n").split("\n")
        assert len(lines) == 1, (argv, err)
        assert lines[0].startswith("revolve: error: "), (argv, err)
        for path in outputs:
            assert not os.path.exists(path), (argv, path, err)
    return code, out, err


# -- building blocks --------------------------------------------------------------------------

NUMBER_TEXT = st.one_of(
    st.integers(-10**6, 10**6).map(str),
    st.floats(allow_nan=True, allow_infinity=True).map(repr),
    st.sampled_from(["1e999", "-1e999", "5e-324", "1e90", "1e-300", "nan", "inf", "-0", "0x10",
                     "1_000", "1/3", "3 1/2", "", " ", "1e", "--1", "9" * 120]),
)
ODD_TEXT = st.one_of(
    st.text(max_size=20),
    st.sampled_from(["x\ny", "mm", "in", "kg/m^3", "7850", "steel", "gallon", "\u00b3", "'\"",
                     "{{", "]]", "\x00"]),
)


def toml_value(depth=3):
    leaf = st.one_of(NUMBER_TEXT.filter(lambda s: s.strip() and " " not in s.strip()),
                     ODD_TEXT.map(lambda s: '"' + s.replace("\\", "\\\\").replace('"', '\\"')
                                  .replace("\n", "\\n").replace("\x00", "") + '"'),
                     st.sampled_from(["true", "false"]))
    return st.recursive(leaf, lambda inner: st.lists(inner, max_size=4).map(
        lambda xs: "[" + ", ".join(xs) + "]"), max_leaves=12)


SEGMENT_KEYS = ["line_to", "arc_to", "radius", "centre", "x", "y", "to_x", "from_x", "face",
                "close", "bogus"]


@st.composite
def profile_files(draw):
    lines = []
    if draw(st.booleans()):
        units = draw(st.sampled_from(['"mm"', '"in"', '"parsec"', "3"]))
        lines.append(f"units = {units}")
    if draw(st.booleans()):
        lines.append(f"axis = {draw(toml_value())}")
    if draw(st.booleans()):
        lines.append(f"density = {draw(toml_value())}")
    if draw(st.booleans()):
        lines.append(f'orientation = "{draw(st.sampled_from(["vertical", "horizontal", "up"]))}"')
    lines.append("[[loop]]")
    lines.append(f"start = [{draw(NUMBER_TEXT.filter(lambda s: s.strip()))}, 1]")
    segs = []
    for _ in range(draw(st.integers(0, 5))):
        key = draw(st.sampled_from(SEGMENT_KEYS))
        segs.append(f"{{ {key} = {draw(toml_value())} }}")
    if draw(st.booleans()):
        segs.append("{ close = true }")
    lines.append("segments = [" + ", ".join(segs) + "]")
    if draw(st.booleans()):  # deep nesting of arrays
        depth = draw(st.integers(1, 3000))
        lines.append("deep = " + "[" * depth + "]" * depth)
    return "\n".join(lines) + "\n"


@st.composite
def point_lists(draw):
    separator = draw(st.sampled_from([",", " ", "\t", ";", ", ", ",,"]))
    rows = draw(st.lists(st.tuples(NUMBER_TEXT, NUMBER_TEXT), min_size=0, max_size=8))
    text = "\n".join(f"{a}{separator}{b}" for a, b in rows)
    if draw(st.booleans()):
        text = "# x, y in mm\n" + text
    return text + "\n"


SVG_COMMANDS = st.sampled_from(list("MmLlHhVvCcSsQqTtAaZz"))


@st.composite
def svg_files(draw):
    words = []
    for _ in range(draw(st.integers(1, 14))):
        words.append(draw(st.one_of(SVG_COMMANDS, NUMBER_TEXT.filter(lambda s: s.strip()))))
    d = " ".join(words)
    element = draw(st.sampled_from([
        f'<path d="{d}"/>',
        f'<path d="M0 0 H40 V20 H0 Z" transform="scale({draw(NUMBER_TEXT)})"/>',
        f'<circle cx="{draw(NUMBER_TEXT)}" cy="20" r="{draw(NUMBER_TEXT)}"/>',
        f'<ellipse cx="10" cy="{draw(NUMBER_TEXT)}" rx="5" ry="{draw(NUMBER_TEXT)}"/>',
        f'<rect x="0" y="0" width="{draw(NUMBER_TEXT)}" height="10" rx="{draw(NUMBER_TEXT)}"/>',
        f'<polygon points="0,0 {draw(NUMBER_TEXT)},0 10,{draw(NUMBER_TEXT)}"/>',
        f'<polyline points="{draw(NUMBER_TEXT)} 0 10 10"/>',
        f'<line x1="0" y1="0" x2="{draw(NUMBER_TEXT)}" y2="5"/>',
    ]))
    return ('<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" '
            f'viewBox="0 0 100 100">{element}</svg>')


def base_dxf_text():
    doc = ezdxf.new("R2010")
    doc.header["$INSUNITS"] = 4
    msp = doc.modelspace()
    msp.add_line((0, 10), (40, 10))
    msp.add_line((40, 10), (40, 20))
    msp.add_line((40, 20), (0, 20))
    msp.add_line((0, 20), (0, 10))
    msp.add_circle((100, 100), 3)
    msp.add_ellipse((60, 60), major_axis=(5, 0), ratio=0.5)
    msp.add_lwpolyline([(0, 30), (10, 30, 0.5), (10, 40)])
    stream = io.StringIO()
    doc.write(stream)
    return stream.getvalue()


DXF_TEXT = base_dxf_text()
DXF_LINES = DXF_TEXT.splitlines()


@st.composite
def dxf_files(draw):
    lines = list(DXF_LINES)
    # Mutate values in the ENTITIES section, then perhaps truncate.
    start = next(i for i, line in enumerate(lines) if line.strip() == "ENTITIES")
    for _ in range(draw(st.integers(0, 6))):
        i = draw(st.integers(start, len(lines) - 1))
        lines[i] = draw(st.one_of(NUMBER_TEXT, st.sampled_from(
            ["LINE", "ELLIPSE", "INSERT", "POLYLINE", "VERTEX", "SEQEND", "BOGUS", "0", "10",
             "1e9\n"])))
    if draw(st.booleans()):
        lines = lines[:draw(st.integers(0, len(lines)))]
    return "\n".join(lines) + "\n"


SETTINGS = settings(max_examples=40, deadline=None,
                    suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large,
                                           HealthCheck.filter_too_much])


# -- the tests ---------------------------------------------------------------------------------

@SETTINGS
@given(text=profile_files(), json=st.booleans())
@example(text="[[loop]]\nstart = [0, 1]\nsegments = []\ndeep = " + "[" * 2000 + "]" * 2000 + "\n",
         json=False)
@example(text='units = "mm"\n[[loop]]\nstart = [0, 1]\nsegments = [{ line_to = [' + "9" * 100001
         + ', 1] }]\n', json=True)
def test_generated_profile_files_measure_or_refuse(tmp_path_factory, text, json):
    path = tmp_path_factory.mktemp("profile") / "part.toml"
    path.write_text(text, encoding="utf-8")
    check_contract(["measure", str(path)] + (["--json"] if json else []))


@SETTINGS
@given(text=point_lists())
@example(text="5e-324,0.5625\n2.5,0.5625\n2.5,0.9375\n0,0.9375\n")  # one near-vertical edge
@example(text="0,1e90\n1e90,1e90\n1e90,2e90\n0,2e90\n")  # cubes overflow
def test_generated_point_lists_measure_or_refuse(tmp_path_factory, text):
    path = tmp_path_factory.mktemp("points") / "part.txt"
    path.write_text(text, encoding="utf-8")
    code, out, _ = check_contract(["measure", str(path), "--json"])
    if code == 0:  # a result, then every main figure is a finite number (no silent null)
        data = json_module.loads(out)
        for key in ("area", "volume", "surface_area", "centroid_distance",
                    "centre_of_mass_axial", "centre_of_mass_offset"):
            assert isinstance(data[key], (int, float)) and math.isfinite(data[key]), (key, text)


@SETTINGS
@given(text=svg_files())
@example(text='<svg xmlns="http://www.w3.org/2000/svg"><path d="M0 0 L1e999 0 L1 1 Z"/></svg>')
def test_generated_svg_converts_or_refuses_and_leaves_nothing(tmp_path_factory, text):
    folder = tmp_path_factory.mktemp("svg")
    (folder / "part.svg").write_text(text, encoding="utf-8")
    output = str(folder / "part.toml")
    check_contract(["convert", str(folder / "part.svg"), "-o", output, "--axis", "x"],
                   outputs=[output])


@SETTINGS
@given(text=dxf_files())
@example(text=DXF_TEXT[: len(DXF_TEXT) // 2])  # truncated in the middle
def test_generated_dxf_converts_or_refuses_and_leaves_nothing(tmp_path_factory, text):
    folder = tmp_path_factory.mktemp("dxf")
    (folder / "part.dxf").write_text(text, encoding="utf-8")
    output = str(folder / "part.toml")
    check_contract(["convert", str(folder / "part.dxf"), "-o", output], outputs=[output])


OPTION_VALUES = st.one_of(NUMBER_TEXT, ODD_TEXT, st.sampled_from(
    ["x", "y", "1e999,0,1,0", "0,0,0,0", "0,0,1,0", "L", "gal", "US_gallon", "kg", "steel",
     "water", "7850", "7850 kg/m^3", "0.284 lb/in^3", "360", "0", "-5", "1e-300"]))
MEASURE_OPTIONS = ["--axis", "--angle", "--density", "--material", "--volume-unit",
                   "--length-unit", "--mass-unit", "--tolerance", "--bogus"]


@SETTINGS
@given(options=st.lists(st.tuples(st.sampled_from(MEASURE_OPTIONS), OPTION_VALUES), max_size=3),
       json=st.booleans())
@example(options=[("--axis", "1e999,0,1,0")], json=False)
@example(options=[("--volume-unit", "x\ny")], json=False)
@example(options=[("--density", "7850")], json=True)
@example(options=[("--bogus", "1")], json=False)
def test_generated_measure_options(options, json):
    argv = ["measure", str(ROOT / "profiles" / "flanged-bushing.toml")]
    for name, value in options:
        argv += [name, value]
    check_contract(argv + (["--json"] if json else []))


MESH_OPTIONS = ["--chord-tolerance", "--tolerance", "--angle", "--axis", "--force", "--bogus"]


@settings(max_examples=15, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(options=st.lists(st.tuples(st.sampled_from(MESH_OPTIONS), OPTION_VALUES), max_size=2))
@example(options=[("--chord-tolerance", "1e-300")])
@example(options=[("--chord-tolerance", "nan")])
@example(options=[("--chord-tolerance", "1/64 in")])
def test_generated_mesh_options_leave_nothing_after_a_refusal(tmp_path_factory, options):
    folder = tmp_path_factory.mktemp("mesh")
    output = str(folder / "part.stl")
    argv = ["mesh", str(ROOT / "profiles" / "spacer-points.txt"), "-o", output]
    for name, value in options:
        argv += [name, value]
    check_contract(argv, outputs=[output])


def test_an_unwritable_second_output_leaves_the_first_unwritten(tmp_path):
    output = str(tmp_path / "part.stl")
    code, _, err = check_contract(["mesh", str(ROOT / "profiles" / "spacer-points.txt"),
                                   "-o", output, "--csv", str(tmp_path / "missing" / "m.csv")],
                                  outputs=[output])
    assert code == 2, err
    assert not os.path.exists(output)


@pytest.mark.parametrize("argv", [
    ["measure"],                                            # missing argument
    ["measure", "x.toml", "--no-such-option"],              # unknown option
    ["measure", str(ROOT / "profiles" / "flanged-bushing.toml"), "--angle", "abc"],
    ["no-such-command"],
])
def test_usage_errors_are_one_line(argv):
    code, _, err = check_contract(argv)
    assert code == 2
