"""Broken, mutated and generated drawings: a result or one plain error, never anything else.

Input families, each named in its test:

* DXF text written by ezdxf (the reference library for what a DXF file is),
  then truncated or with lines replaced, deleted or given hostile numbers;
* SVG path data and SVG elements built from a grammar with hostile numbers;
* the same through ``revolve convert`` on the command line: exit code 0, 1
  or 2, no traceback, one line per error, no output file after exit 2.

A reader may succeed or raise :class:`~revolve.errors.RevolveError`
(FormatError, ProfileError, ...); any other exception is a defect. Each
failure found while writing these tests is kept as an explicit case (the
``CRASHES`` list and the ``@example`` lines) beside the test it broke.
"""

from __future__ import annotations

import io
import os
import re

import ezdxf
import pytest
from hypothesis import HealthCheck, example, given, settings
from hypothesis import strategies as st

from revolve.cli.app import main
from revolve.errors import FormatError, RevolveError
from revolve.formats.dxf import read_dxf
from revolve.formats.svg import path_data_profile, read_svg

HOSTILE = ["1e308", "-1e308", "inf", "-inf", "nan", "1e999", "0", "-1", "x", "", "1e9",
           "999999", "LINE", "BOGUS", "ENDSEC", "EOF", "10", "0.0", "  0", "SECTION"]


def dxf_text() -> str:
    """A small drawing with every entity kind the reader knows, written by ezdxf."""
    doc = ezdxf.new("R2010")
    doc.header["$INSUNITS"] = 4
    msp = doc.modelspace()
    msp.add_lwpolyline([(0, 10, 0), (40, 10, 0.3), (40, 20, 0), (0, 20, 0)], format="xyb",
                       close=True)
    msp.add_circle((20, 15), 2)
    msp.add_ellipse((100, 15), (5, 0), 0.5)
    msp.add_spline([(0, 30), (10, 40), (20, 30), (30, 40)])
    msp.add_polyline2d([(0, 50), (10, 50), (10, 60)])
    msp.add_arc((0, 0), 5, 0, 90)
    block = doc.blocks.new("PIN")
    block.add_circle((0, 0), 1)
    msp.add_blockref("PIN", (20, 12), dxfattribs={"xscale": 0.5, "yscale": 0.5})
    msp.add_line((-5, 0), (45, 0), dxfattribs={"linetype": "CENTER"})
    out = io.StringIO()
    doc.write(out)
    return out.getvalue()


BASE = dxf_text()
LINES = BASE.splitlines()
ENTITIES = (LINES.index("ENTITIES"), len(LINES) - LINES[::-1].index("ENTITIES") +
            LINES[LINES.index("ENTITIES"):].index("ENDSEC"))


def read_or_refuse(path, **options):
    """Read a DXF; a RevolveError is a proper refusal. Returns the message or None."""
    try:
        read_dxf(path, **options)
    except RevolveError as exc:
        text = str(exc)
        assert "\n" not in text and "\r" not in text, text
        assert path in text, text
        return text
    return None


# Cases that escaped as other exceptions before the reader checked its numbers and
# wrapped ezdxf in one place: (what, text replaced, replacement).
CRASHES = [
    ("truncated in the header (StopIteration in ezdxf)", None, 40),
    ("truncated in the entities", None, ENTITIES[0] + 60),
    ("a bogus entity type (DXFAttributeError)", "  0\nLINE\n", "  0\nBOGUS\n"),
    ("a coordinate of 1e308 (cKDTree overflow)", " 10\n40.0\n", " 10\n1e308\n"),
    ("-inf as a coordinate (Fraction('-inf'))", " 20\n10.0\n", " 20\n-inf\n"),
    ("nan as a radius", " 40\n2.0\n", " 40\nnan\n"),
    ("a group code of 1e9 with a newline in ezdxf's message", " 10\n0.0\n", "1e9\n0.0\n"),
    ("an infinite group code (OverflowError)", " 20\n50.0\n", "inf\n50.0\n"),
]


@pytest.mark.parametrize("what, old, new", CRASHES, ids=[c[0] for c in CRASHES])
def test_known_crashes_are_plain_errors(tmp_path, what, old, new):
    if old is None:
        text = "\n".join(LINES[:new])
    else:
        assert old in BASE
        text = BASE.replace(old, new, 1)
    path = str(tmp_path / "broken.dxf")
    with open(path, "w") as handle:
        handle.write(text)
    read_or_refuse(path, open_chains=True)


def test_ellipse_with_zero_axes_and_polyline_with_empty_vertex(tmp_path):
    doc = ezdxf.new("R2010")
    msp = doc.modelspace()
    msp.add_lwpolyline([(0, 10), (40, 10), (40, 20), (0, 20)], close=True)
    msp.add_ellipse((100, 15), (5, 0), 0.5)
    msp.add_polyline2d([(0, 50), (10, 50), (10, 60)])
    out = io.StringIO()
    doc.write(out)
    text = out.getvalue()
    # the ellipse's major axis (group codes 11/21) made zero: ZeroDivisionError before
    zero = re.sub(r"ELLIPSE(.*?) 11\n5\.0\n", lambda m: "ELLIPSE" + m.group(1) + " 11\n0.0\n",
                  text, count=1, flags=re.S)
    assert zero != text
    path = str(tmp_path / "ellipse.dxf")
    with open(path, "w") as handle:
        handle.write(zero)
    doc_read, report = read_dxf(path, open_chains=True)
    assert any("ELLIPSE" in s.what and "zero" in s.reason for s in report.skipped)
    # a VERTEX with its coordinates removed
    empty = re.sub(r"(VERTEX\n.*?AcDb2dVertex\n) 10\n10\.0\n 20\n50\.0\n 30\n0\.0\n", r"\1",
                   text, count=1, flags=re.S)
    assert empty != text
    path = str(tmp_path / "vertex.dxf")
    with open(path, "w") as handle:
        handle.write(empty)
    read_or_refuse(path, open_chains=True)


def test_newline_in_a_library_message_is_escaped(tmp_path):
    path = str(tmp_path / "code.dxf")
    with open(path, "w") as handle:
        handle.write(BASE.replace(" 10\n0.0\n", "1e9\n0.0\n", 1))
    text = read_or_refuse(path)
    assert text is not None and "this is not a DXF drawing that can be read" in text
    assert '"1e9\\n"' in text


def test_block_references_nested_too_deep_are_skipped(tmp_path):
    doc = ezdxf.new("R2010")
    msp = doc.modelspace()
    msp.add_lwpolyline([(0, 10), (40, 10), (40, 20), (0, 20)], close=True)
    loop = doc.blocks.new("LOOP")          # a block that refers to itself
    loop.add_blockref("LOOP", (1, 1))
    msp.add_blockref("LOOP", (0, 0))
    path = str(tmp_path / "self.dxf")
    doc.saveas(path)
    _, report = read_dxf(path)
    assert any("nested more than" in s.reason for s in report.skipped)


@st.composite
def mutated_dxf(draw):
    lines = list(LINES)
    for _ in range(draw(st.integers(1, 4))):
        if not lines:
            break
        inside = draw(st.booleans())
        low, high = (ENTITIES if inside else (0, len(lines)))
        k = draw(st.integers(min(low, len(lines) - 1), min(high, len(lines)) - 1))
        how = draw(st.sampled_from(["replace", "delete", "truncate", "number"]))
        if how == "replace":
            lines[k] = draw(st.sampled_from(HOSTILE))
        elif how == "delete":
            del lines[k]
        elif how == "truncate":
            lines = lines[:k]
        else:
            lines[k] = repr(draw(st.floats(allow_nan=True, allow_infinity=True)))
    return "\n".join(lines)


@settings(max_examples=60, deadline=None,
          suppress_health_check=[HealthCheck.function_scoped_fixture, HealthCheck.too_slow])
@given(text=mutated_dxf())
@example(text="\n".join(LINES[:40]))
@example(text=BASE.replace("  0\nLINE\n", "  0\nBOGUS\n", 1))
@example(text=BASE.replace(" 10\n40.0\n", " 10\n1e308\n", 1))
@example(text=BASE.replace(" 20\n10.0\n", " 20\n-inf\n", 1))
def test_mutated_dxf_reads_or_is_refused(tmp_path, text):
    """Family: ezdxf-written DXF text, truncated or mutated."""
    path = str(tmp_path / "mutated.dxf")
    with open(path, "w") as handle:
        handle.write(text)
    read_or_refuse(path, open_chains=True)


NUMBERS = st.one_of(st.integers(-100, 100).map(str),
                    st.floats(allow_nan=False, allow_infinity=False, width=32).map(repr),
                    st.sampled_from(["1e999", "-1e999", "1e99", "1e15", "2e15", "1e-99",
                                     "5e-324", "0", ".5.5", "1e", "-", "nan", "inf"]))
LETTERS = st.sampled_from(list("MLHVACSQTZmlhvacsqtz"))


@st.composite
def path_data(draw):
    parts = ["M", draw(NUMBERS), draw(NUMBERS)]
    for _ in range(draw(st.integers(0, 8))):
        parts.append(draw(LETTERS))
        parts.extend(draw(st.lists(NUMBERS, max_size=7)))
    return " ".join(parts)


@settings(max_examples=150, deadline=None)
@given(d=path_data())
@example(d="M 0 0 L 1e99 0 L 1e99 1e99 Z")          # cubes of 1e99 overflow: refused
@example(d="M 0 0 h 9e14 h 9e14 v 1 z")             # relative moves beyond the range
@example(d="M 0 0 A 1e-99 1e-99 0 0 1 1 0 Z")
@example(d="M 0 1e999 L 1 1 Z")
@example(d="M 0 0 x\ny")                          # the input's own newline, quoted
@example(d="\x0b M 0 0")
def test_generated_path_data_reads_or_is_refused(d):
    """Family: SVG path data from the grammar with hostile numbers."""
    try:
        path_data_profile(d)
    except RevolveError as exc:
        assert "\n" not in str(exc)


ELEMENTS = st.sampled_from([
    '<rect x="{0}" y="{1}" width="{2}" height="{3}" rx="{4}"/>',
    '<circle cx="{0}" cy="{1}" r="{2}"/>',
    '<ellipse cx="{0}" cy="{1}" rx="{2}" ry="{3}"/>',
    '<line x1="{0}" y1="{1}" x2="{2}" y2="{3}"/>',
    '<polyline points="{0},{1} {2},{3} {4}"/>',
    '<polygon points="{0} {1} {2} {3} {4} {0}"/>',
    '<g transform="scale({0}) rotate({1})"><rect width="{2}" height="{3}"/></g>',
    '<path transform="matrix({0} {1} {2} {3} {4} 0)" d="M0 0 h10 v10 z"/>',
])


@settings(max_examples=100, deadline=None,
          suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(elements=st.lists(st.tuples(ELEMENTS, st.lists(NUMBERS, min_size=5, max_size=5)),
                         min_size=1, max_size=3))
@example(elements=[('<circle cx="{0}" cy="{1}" r="{2}"/>', ["0", "0", "1e-99", "0", "0"])])
@example(elements=[('<g transform="scale({0}) rotate({1})"><rect width="{2}" height="{3}"/></g>',
                    ["1e99", "1e99", "1e99", "1", "0"])])
@example(elements=[('<path transform="matrix({0} {1} {2} {3} {4} 0)" d="M0 0 h10 v10 z"/>',
                    ["1e99", "0", "0", "1e99", "0"])])
def test_generated_svg_elements_read_or_are_refused(tmp_path, elements):
    """Family: SVG files of basic shapes and transforms with hostile numbers."""
    body = "".join(template.format(*numbers) for template, numbers in elements)
    path = str(tmp_path / "gen.svg")
    with open(path, "w") as handle:
        handle.write(f'<svg xmlns="http://www.w3.org/2000/svg">{body}</svg>')
    try:
        read_svg(path)
    except RevolveError as exc:
        assert "\n" not in str(exc) and path in str(exc)


def run_cli(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main(args)
    out, err = capsys.readouterr()
    return exc.value.code, out, err


@settings(max_examples=25, deadline=None,
          suppress_health_check=[HealthCheck.function_scoped_fixture, HealthCheck.too_slow])
@given(text=mutated_dxf(), d=path_data(),
       elements=st.lists(st.tuples(ELEMENTS, st.lists(NUMBERS, min_size=5, max_size=5)),
                         min_size=1, max_size=3))
@example(text="\n".join(LINES[:40]), d="M 0 0 L 1e99 0 L 1e99 1e99 Z",
         elements=[('<circle cx="{0}" cy="{1}" r="{2}"/>', ["0", "0", "1e-99", "0", "0"])])
def test_convert_exits_0_1_or_2_and_leaves_nothing_after_2(tmp_path, capsys, text, d, elements):
    """Family: the same mutated DXF, path data and SVG shapes through ``revolve convert``."""
    drawing = str(tmp_path / "in.dxf")
    with open(drawing, "w") as handle:
        handle.write(text)
    svg = str(tmp_path / "in.svg")
    with open(svg, "w") as handle:
        body = "".join(template.format(*numbers) for template, numbers in elements)
        handle.write(f'<svg xmlns="http://www.w3.org/2000/svg">{body}</svg>')
    for args, output in (([drawing], str(tmp_path / "a.toml")),
                         (["--path-data", d], str(tmp_path / "b.toml")),
                         ([svg], str(tmp_path / "c.toml"))):
        if os.path.exists(output):
            os.remove(output)
        code, out, err = run_cli(["convert", *args, "-o", output, "--axis", "0,-1e6,1,0"],
                                 capsys)
        assert code in (0, 1, 2)
        assert "Traceback" not in err + out
        if code == 2:
            assert not os.path.exists(output)
            assert err.count("\n") == 1 and err.startswith("revolve: ")


def test_format_error_is_a_revolve_error():
    assert issubclass(FormatError, RevolveError)


@pytest.mark.parametrize("d, transform", [
    ("M 0 0 L 1e99 0 L 1e99 1e99 Z", None),         # exit 0 with cubes of 1e99 before
    ("M 0 1 H 1 V 2 Z", "matrix(1e99 0 0 1e99 0 0) matrix(1e99 0 0 1e99 0 0) "
                        "matrix(1e99 0 0 1e99 0 0) matrix(1e99 0 0 1e99 0 0)"),  # OverflowError
    ("M 0 1 H 1 V 2 Z", "scale(1e99) scale(1e99) scale(1e99) scale(1e99)"),      # OverflowError
])
def test_huge_numbers_are_refused_with_the_range(tmp_path, d, transform):
    """Family: SVG numbers whose squares or cubes overflow."""
    path = str(tmp_path / "huge.svg")
    attribute = f' transform="{transform}"' if transform else ""
    with open(path, "w") as handle:
        handle.write(f'<svg xmlns="http://www.w3.org/2000/svg"><path{attribute} d="{d}"/></svg>')
    with pytest.raises(FormatError) as info:
        read_svg(path)
    text = str(info.value)
    assert "1e+15" in text and "\n" not in text
