"""SVG basic shapes (rect, circle, ellipse, line, polyline, polygon) read as profiles.

References, named beside each check:

* published: CRC Standard Mathematical Tables (from memory): circle area pi r^2,
  ellipse area pi a b; a rounded rectangle is the rectangle less four corner
  rectangles rx by ry plus four quarter ellipses: w h - (4 - pi) rx ry, its
  centroid at the centre by symmetry;
* reference library: shapely (``Polygon.area``, ``Polygon.centroid``,
  ``shapely.affinity.affine_transform``) for polygons under transforms;
* the SVG 2 specification, "Basic shapes" (from memory): a rect's rx alone
  stands for ry too, and each is at most half its side; a shape of zero
  width or radius is not drawn.

Every profile is revolved about an axis below it and measured; the section
area and centroid are the engine's, checked against the references above.
"""

from __future__ import annotations

import math
import textwrap

import pytest
from shapely import affinity
from shapely.geometry import Polygon

from revolve.errors import FormatError
from revolve.formats.svg import read_svg
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Revolution


def write(tmp_path, body: str, name: str = "part.svg") -> str:
    path = tmp_path / name
    path.write_text('<svg xmlns="http://www.w3.org/2000/svg">\n' + textwrap.dedent(body) +
                    "\n</svg>\n", encoding="utf-8")
    return str(path)


def section(doc, below: float = -1000.0):
    """Area and centroid of the section, about a horizontal axis well below it."""
    m = measure(Revolution(doc.profile, Axis((0.0, below), (1.0, 0.0)), 360.0), symbolic=False)
    return m.area, m.centroid


def test_rounded_rect_area_and_centroid(tmp_path):
    name = write(tmp_path, '<rect x="10" y="20" width="60" height="30" rx="5" ry="3"/>')
    doc, report = read_svg(name)
    area, centroid = section(doc)
    assert area == pytest.approx(60 * 30 - (4 - math.pi) * 5 * 3, rel=1e-12)   # CRC
    assert centroid[0] == pytest.approx(40, rel=1e-12)
    assert centroid[1] == pytest.approx(-35, rel=1e-12)   # y flipped: the drawing's up is +y
    assert report.loops[0].source.startswith("rect #1 (no id)")


def test_rect_corner_radius_rules(tmp_path):
    # rx alone stands for ry; rx beyond half the width is cut to it (SVG 2, from memory)
    doc, _ = read_svg(write(tmp_path, '<rect width="20" height="40" rx="15"/>'))
    area, _ = section(doc)
    assert area == pytest.approx(20 * 40 - (4 - math.pi) * 10 * 15, rel=1e-12)
    # a plain rect is four lines, exactly
    doc, _ = read_svg(write(tmp_path, '<rect x="1" y="2" width="3" height="4"/>', "plain.svg"))
    assert [s.kind for s in doc.profile.loops[0].segments] == ["line"] * 4
    assert section(doc)[0] == pytest.approx(12, rel=1e-15)


def test_circle_is_exact_arcs_under_translate_and_scale(tmp_path):
    doc, _ = read_svg(write(tmp_path, '<g transform="translate(100 0) scale(2)">'
                                      '<circle cx="15" cy="25" r="5"/></g>'))
    segments = doc.profile.loops[0].segments
    assert [s.kind for s in segments] == ["arc"] * 4
    area, centroid = section(doc)
    assert area == pytest.approx(math.pi * 10 ** 2, rel=1e-13)   # CRC, r = 2 x 5
    assert centroid == pytest.approx((130.0, -50.0), rel=1e-13)


def test_rotated_ellipse_area_and_centroid(tmp_path):
    doc, _ = read_svg(write(tmp_path, '<ellipse cx="40" cy="25" rx="8" ry="4" '
                                      'transform="rotate(30 40 25)"/>'))
    area, centroid = section(doc)
    assert area == pytest.approx(math.pi * 8 * 4, rel=1e-10)     # CRC, pi a b
    assert centroid[0] == pytest.approx(40, rel=1e-10)
    assert centroid[1] == pytest.approx(-25, rel=1e-10)


@pytest.mark.parametrize("matrix", [(1, 0, 0, 1, 0, 0), (2, 0.5, -0.25, 1.5, 7, -3),
                                    (0, 1, -1, 0, 10, 10)])
def test_polygon_against_shapely_under_a_matrix(tmp_path, matrix):
    points = [(0, 0), (30, 0), (30, 10), (12, 10), (12, 22), (0, 22)]
    text = " ".join(f"{x},{y}" for x, y in points)
    a, b, c, d, e, f = matrix
    doc, _ = read_svg(write(tmp_path, f'<polygon transform="matrix({a} {b} {c} {d} {e} {f})" '
                                      f'points="{text}"/>'))
    # shapely's affine_transform takes [a, b, d, e, xoff, yoff] for x' = a x + b y + xoff
    reference = affinity.affine_transform(Polygon(points), [a, c, b, d, e, f])
    reference = affinity.scale(reference, 1, -1, origin=(0, 0))   # the reader's y flip
    area, centroid = section(doc)
    assert area == pytest.approx(reference.area, rel=1e-12)
    assert centroid == pytest.approx((reference.centroid.x, reference.centroid.y), rel=1e-12)


def test_rect_with_a_circle_hole_and_a_stray(tmp_path):
    body = ('<rect x="0" y="0" width="60" height="30"/><circle id="bore" cx="20" cy="15" r="5"/>'
            '<circle id="bolt" cx="100" cy="15" r="3"/><line x1="0" y1="40" x2="60" y2="40"/>')
    doc, report = read_svg(write(tmp_path, body))
    area, _ = section(doc)
    assert area == pytest.approx(60 * 30 - math.pi * 25, rel=1e-13)   # CRC: hole subtracted
    assert len(doc.profile.loops) == 2 and not doc.profile.chains
    assert len(report.warnings) == 2
    assert "circle 'bolt'" in report.warnings[0] and "left out" in report.warnings[0]
    assert "line #1" in report.warnings[1]
    doc, report = read_svg(write(tmp_path, body, "kept.svg"), keep_strays=True)
    assert len(doc.profile.loops) == 3 and len(doc.profile.chains) == 1
    assert all("kept as asked" in w for w in report.warnings)


def test_group_by_id_and_skipped_elements(tmp_path):
    body = ('<g id="part"><rect width="10" height="5"/></g>'
            '<defs><circle id="c" r="2"/></defs><text>note</text>'
            '<rect width="0" height="5" x="50"/><image href="x.png"/>'
            '<polyline points="20,0 30,0 30,5" display="none"/>')
    doc, report = read_svg(write(tmp_path, body), path_id="part")
    assert len(doc.profile.loops) == 1 and section(doc)[0] == pytest.approx(50)
    doc, report = read_svg(write(tmp_path, body, "all.svg"))
    reasons = {s.what.split(" (")[0]: s.reason for s in report.skipped}
    assert "inside <defs>" in reasons["circle 'c'"]
    assert reasons["<text>"] == "text is not geometry"
    assert "not drawn" in reasons["rect #2"]
    assert "not displayed" in reasons["polyline #1"]
    assert reasons["<image>"] == "an image is not geometry"


def test_polyline_alone_is_an_open_chain(tmp_path):
    doc, report = read_svg(write(tmp_path, '<polyline points="0,0 10,0 10,10"/>'))
    assert not doc.profile.loops and len(doc.profile.chains) == 1
    assert not report.warnings


@pytest.mark.parametrize("body, words", [
    ('<polygon points="0,0 1,0 1"/>', "odd count"),
    ('<polygon points="0,0 1,0 1,x"/>', "points: character"),
    ('<rect width="5mm" height="5"/>', "not a length in user units"),
    ('<circle r="1e999"/>', "exponent of 1e999"),
    ('<circle r="2e15"/>', "outside the range read"),
    ('<rect width="10" height="10" rx="-1"/>', "negative"),
    ('<g transform="scale(1e10) scale(1e10)"><rect width="1" height="1"/></g>',
     "scale or move by more than"),
    ('<path d="M 0 0 h 9e14 h 9e14 v 1 z"/>', "outside the range read"),
    ('<line x1="1" y1="1" x2="1" y2="1"/>', "draw nothing (line #1 (no id): it has zero length"),
])
def test_bad_shapes_are_refused_on_one_line(tmp_path, body, words):
    with pytest.raises(FormatError) as info:
        read_svg(write(tmp_path, body))
    text = str(info.value)
    assert words in text and "\n" not in text and text.startswith(str(tmp_path))


def test_measuring_a_drawing_with_a_stray_directly_is_refused(tmp_path):
    from revolve.formats.drawings import read_svg_file

    name = write(tmp_path, '<rect y="-20" width="40" height="10"/><circle cx="80" cy="-15" r="3"/>')
    with pytest.raises(FormatError) as info:
        read_svg_file(name)
    assert "circle #1" in str(info.value) and "revolve convert" in str(info.value)
    single = write(tmp_path, '<rect y="-20" width="40" height="10"/>', "single.svg")
    assert len(read_svg_file(single).profile.loops) == 1
