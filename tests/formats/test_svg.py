"""Tests of revolve.formats.svg: SVG path data and SVG files read as profiles.

The path strings are our own, written in the style of the examples of the
SVG specification's path section (relative moves, implicit repeats, compact
numbers, arc flags without separators). References, named beside each check:

* the SVG path grammar and the arc implementation notes (W3C SVG 1.1,
  "Paths" and appendix F.6; SVG 2, "Paths"), from memory: what a path means;
* known geometry built in the test: arcs drawn from a chosen centre, radius
  and sweep (the reader must find that centre again), ellipses from their
  semi-axes and rotation;
* published: CRC Standard Mathematical Tables (from memory): ellipse sector
  area pi a b / 4 between the ends of two semi-axes, circle area, torus
  volume 2 pi^2 R r^2;
* reference library: sympy (``sympy.integrate`` of the Green's theorem area
  of the Bernstein form written in the test, ``sympy.expand`` to compare
  polynomials);
* reference library: shapely (``Polygon.area``, ``Polygon.centroid``) of a
  finely sampled outline, for areas and for Pappus volumes;
* profiles built directly with revolve.geometry constructors: imported
  volumes must equal theirs.
"""

from __future__ import annotations

import math
import re
import textwrap
from fractions import Fraction

import numpy as np
import pytest
import sympy
from hypothesis import given, settings
from hypothesis import strategies as st
from shapely.geometry import Polygon

from revolve.errors import FormatError, ProfileError, UnitError
from revolve.formats.svg import (PathDataError, _subpaths, parse_path_data, parse_transform,
                                 path_data_profile, read_path_data_file, read_svg)
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Loop, Profile, Revolution
from revolve.geometry.segments import Arc, Curve, Line, arc_from_centre, curve_from_expressions

T = sympy.Symbol("t", real=True)


def segments_of(d, **kw):
    doc, _ = path_data_profile(d, **kw)
    return doc.profile.loops[0].segments


def bernstein(points):
    """The Bézier curve of the control points in Bernstein form (sympy), written here."""
    n = len(points) - 1
    xs = [sympy.Rational(str(p[0])) for p in points]
    ys = [sympy.Rational(str(p[1])) for p in points]
    x = sum(sympy.binomial(n, k) * (1 - T) ** (n - k) * T ** k * xs[k] for k in range(n + 1))
    y = sum(sympy.binomial(n, k) * (1 - T) ** (n - k) * T ** k * ys[k] for k in range(n + 1))
    return x, y


def same_polynomial(a, b) -> bool:
    return sympy.expand(a - b) == 0


def flip(points):
    """SVG (y down) to profile (y up), as the module documents."""
    return [(p[0], -p[1]) for p in points]


def sample(segments, n=20000):
    """A fine polygon through the segments, evaluated here (not with the engine's flatten)."""
    pts = []
    for s in segments:
        if isinstance(s, Line):
            pts.append(s.start)
        elif isinstance(s, Arc):
            a0 = math.atan2(s.start[1] - s.centre[1], s.start[0] - s.centre[0])
            a = a0 + np.linspace(0, s.sweep(), n, endpoint=False)
            pts += list(zip(s.centre[0] + s.radius * np.cos(a),
                            s.centre[1] + s.radius * np.sin(a)))
        else:
            fx = sympy.lambdify(T, s.x_expr, "numpy")
            fy = sympy.lambdify(T, s.y_expr, "numpy")
            t = np.linspace(s.t_start, s.t_end, n, endpoint=False)
            pts += list(zip(np.broadcast_to(fx(t), t.shape), np.broadcast_to(fy(t), t.shape)))
    return Polygon(pts)


def quick(revolution):
    """The engine's measurement by quadrature only (sympy's exact attempt takes seconds)."""
    return measure(revolution, symbolic=False)


def volume(profile, axis=None):
    return quick(Revolution(profile, axis or Axis.x(), 360.0)).volume


def rel(a, b):
    return abs(a - b) / abs(b)


# -- the grammar --------------------------------------------------------------------------

def test_compact_numbers_split_where_the_grammar_says():
    # SVG grammar (from memory): a second "." or a sign starts a new number
    cmds = parse_path_data("M1.5.5-1-2.25e1 1e+2,3E-1")
    assert [c.letter for c in cmds] == ["M", "L", "L"]
    assert [a for c in cmds for a in c.args] == [Fraction(3, 2), Fraction(1, 2), Fraction(-1),
                                                 Fraction(-45, 2), Fraction(100), Fraction(3, 10)]
    assert [c.implicit for c in cmds] == [False, True, True]


def test_arc_flags_need_no_separators():
    # SVG grammar: each flag is the single digit 0 or 1
    for d in ("M0 0a25 25 -30 1150-25", "M0 0 a25,25 -30 1,1 50,-25", "M0,0a25 25-30 1 1 50-25"):
        (arc,) = [c for c in parse_path_data(d) if c.letter == "a"]
        assert arc.args == (25, 25, -30, 1, 1, 50, -25)


def test_implicit_repeats_after_each_command():
    # SVG: numbers after a moveto are linetos of the same kind (relative after "m")
    cmds = parse_path_data("m 10 10 5 0 0 5 H 1 2 3 v1-1")
    assert [c.letter for c in cmds] == ["m", "l", "l", "H", "H", "H", "v", "v"]
    doc, _ = path_data_profile("m 10 10 5 0 0 5 -5 0")
    ends = [s.end for s in doc.profile.chains[0].segments]
    assert ends == [(15.0, -10.0), (15.0, -15.0), (10.0, -15.0)]


def test_relative_commands_after_close_start_from_the_subpath_start():
    # SVG: after "z" the current point is the subpath's first point
    doc, _ = path_data_profile("m 10 10 h 20 v 10 h -20 z m 5 3 h 4 v 2 h -4 z")
    outer, inner = doc.profile.loops
    assert inner.segments[0].start == (15.0, -13.0)
    assert [s.end for s in inner.segments] == [(19.0, -13.0), (19.0, -15.0), (15.0, -15.0),
                                               (15.0, -13.0)]
    doc, _ = path_data_profile("M 10 10 h 5 v 5 z m 1 7 h 1", keep_strays=True)
    assert doc.profile.chains[0].segments[0].start == (11.0, -17.0)
    # a drawing command right after "z" starts a new subpath at the same first point
    subpaths = _subpaths(parse_path_data("M 10 10 h 5 v 5 z l 1 7"))
    assert [s.closed for s in subpaths] == [True, False]
    assert subpaths[1].items[0][1:3] == ((10, 10), (11, 17))


def test_relative_moves_add_exactly_and_close_exactly():
    # 0.1 added ten times in binary floats is not 1; the reader keeps decimals exact
    d = "M 0 1 " + "h 0.1 " * 10 + "v 1 " + "h -0.1 " * 10 + "z"
    doc, _ = path_data_profile(d)
    segs = doc.profile.loops[0].segments
    assert segs[9].end == (1.0, -1.0) and segs[20].end == (0.0, -2.0)
    assert len(segs) == 22 and segs[21].end == (0.0, -1.0)
    assert doc.exact and segs[9].exact[2:] == (Fraction(1), Fraction(-1))
    # the same in floats drifts: 0.1 added ten times is not 1 (from memory, IEEE 754 doubles)
    assert sum([0.1] * 10) != 1.0


@pytest.mark.parametrize("d, position, words", [
    ("L 1 2", 1, 'must start with a moveto'),
    ("M 0 0 L 10", 11, "the line's end point y"),
    ("M 0 0 X 5", 7, "expected a command letter"),
    ("M0 0 L 1,, 2", 10, "the line's end point y"),
    ("M 0 0 A 5 5 0 2 0 10 0", 15, "large-arc flag"),
    ("M 0,0,", 7, "a comma must be followed by a number"),
    ("M 0 0 Z 5", 9, '"Z" takes no numbers'),
    ("M 1e400 0", 3, "exponent"),
    ("M, 0 0", 2, "the move's x"),
])
def test_syntax_errors_name_the_character(d, position, words):
    with pytest.raises(PathDataError) as info:
        parse_path_data(d)
    assert info.value.position == position and words in info.value.message
    with pytest.raises(FormatError) as info:
        path_data_profile(d, file="p.svgpath")
    assert str(info.value).startswith(f"p.svgpath: path data: character {position}: ")


def test_nothing_drawn_is_refused():
    with pytest.raises(FormatError, match="draws nothing"):
        path_data_profile("M 1 1 m 2 2 z")
    with pytest.raises(FormatError, match="draws nothing"):
        path_data_profile("   ")


# -- lines and the y flip ---------------------------------------------------------------------

def test_y_is_flipped_and_volume_equals_the_profile_built_directly():
    # a ring section 40 long, radii 10..20 about the axis y = 0 (drawn below it in SVG terms)
    doc, report = path_data_profile("M0,10 H40 V20 H0 Z", unit="mm")
    direct = Loop.from_points([(0, -10), (40, -10), (40, -20), (0, -20)])
    # direct is one polyline: its vertices after the first are the ends of its edges
    assert [s.end for s in doc.profile.loops[0].segments] == \
        [tuple(p) for p in direct.segments[0].points[1:].tolist()]
    v = volume(doc.profile)
    assert v == pytest.approx(volume(Profile(loops=(direct,))), rel=1e-14)
    # published: CRC (from memory), hollow cylinder pi (R^2 - r^2) L
    assert v == pytest.approx(math.pi * (20 ** 2 - 10 ** 2) * 40, rel=1e-12)
    assert any("y axis points down" in n for n in report.notes)
    assert report.unit == "mm" and report.unit_source == "given"


def test_open_subpaths_are_chains_and_closed_ones_loops():
    d = "M 0 0 L 10 0 L 10 10 M 20 0 h 5 v 5 h -5 v -5"
    doc, report = path_data_profile(d, keep_strays=True)
    assert len(doc.profile.chains) == 1 and len(doc.profile.loops) == 1
    assert any("without a Z" in n for n in report.notes)
    assert [p.kind for p in report.loops + report.chains] == ["loop", "chain"]
    # by default the chain, not joined to the loop, is warned about and left out
    doc, report = path_data_profile(d)
    assert len(doc.profile.chains) == 0 and len(doc.profile.loops) == 1
    assert len(report.warnings) == 1 and "chain 1" in report.warnings[0]
    assert "--keep-strays" in report.warnings[0]


def test_zero_length_pieces_are_left_out_and_reported():
    doc, report = path_data_profile("M 0 0 L 0 0 L 10 0 L 10 10 Z")
    assert len(doc.profile.loops[0].segments) == 3
    assert any("zero length" in n for n in report.notes)


# -- arcs ------------------------------------------------------------------------------------

ARC_CASES = [  # centre (SVG coordinates), radius, start angle and signed sweep in degrees
    ((0, 0), 10, 0, 90), ((5, -3), 7.5, 30, 200), ((-2, 4), 3, 250, -60),
    ((10, 10), 12, 45, -300), ((0, 0), 5, 90, 180), ((1, 1), 2, 10, -179),
]


@pytest.mark.parametrize("centre, radius, start, sweep", ARC_CASES)
def test_arc_finds_the_centre_it_was_drawn_from(centre, radius, start, sweep):
    # known geometry: endpoints on a chosen circle; flags from the sweep (SVG F.6.2 meanings)
    a0, a1 = math.radians(start), math.radians(start + sweep)
    p0 = (centre[0] + radius * math.cos(a0), centre[1] + radius * math.sin(a0))
    p1 = (centre[0] + radius * math.cos(a1), centre[1] + radius * math.sin(a1))
    large = 1 if abs(sweep) > 180 else 0
    positive = 1 if sweep > 0 else 0
    d = f"M {p0[0]!r} {p0[1]!r} A {radius} {radius} 0 {large} {positive} {p1[0]!r} {p1[1]!r}"
    doc, _ = path_data_profile(d)
    (arc,) = doc.profile.chains[0].segments
    assert isinstance(arc, Arc)
    # after the flip the centre is (cx, -cy) and the turn is mirrored
    assert arc.centre == pytest.approx((centre[0], -centre[1]), abs=1e-9)
    assert arc.radius == pytest.approx(radius, rel=1e-12)
    assert arc.sweep() == pytest.approx(-math.radians(sweep), rel=1e-9)


def test_arc_rotation_does_not_matter_for_a_circle():
    plain = segments_of("M 10 0 A 10 10 0 0 1 0 10 L 0 0 Z")[0]
    turned = segments_of("M 10 0 A 10 10 37 0 1 0 10 L 0 0 Z")[0]
    assert turned.centre == pytest.approx(plain.centre, abs=1e-12)
    assert turned.clockwise == plain.clockwise and isinstance(turned, Arc)


def test_radii_too_small_are_scaled_up_to_a_half_circle():
    # SVG F.6.6: radii scaled by sqrt(lambda) until the ellipse just reaches both ends
    doc, report = path_data_profile("M 0 0 A 1 1 0 0 1 10 0 Z")
    arc = doc.profile.loops[0].segments[0]
    assert arc.centre == (5.0, 0.0) and arc.radius == 5.0
    assert abs(arc.sweep()) == pytest.approx(math.pi, rel=1e-15)
    assert arc.exact[0] == "centre" and arc.exact[3] == (Fraction(5), Fraction(0))


def test_zero_radius_is_a_line_and_an_arc_to_its_start_is_left_out():
    # SVG F.6.2: rx = 0 or ry = 0 makes a straight line; equal ends draw nothing
    doc, report = path_data_profile("M 0 0 A 0 5 0 0 1 10 0 A 3 3 0 0 1 10 0 L 10 10 Z")
    kinds = [s.kind for s in doc.profile.loops[0].segments]
    assert kinds == ["line", "line", "line"]
    assert any("zero radius" in n for n in report.notes)
    assert any("ending where it starts" in n for n in report.notes)


def test_circle_of_two_arcs_revolves_into_a_torus():
    # published: CRC (from memory), torus V = 2 pi^2 R r^2; R = 30, r = 5, drawn below y = 0
    d = "M 25 30 a 5 5 0 0 1 10 0 a 5,5 0 0,1 -10,0 z"
    doc, _ = path_data_profile(d)
    assert [s.kind for s in doc.profile.loops[0].segments] == ["arc", "arc"]
    assert volume(doc.profile) == pytest.approx(2 * math.pi ** 2 * 30 * 5 ** 2, rel=1e-12)
    assert doc.exact


def test_elliptical_arc_sector_area():
    # published: CRC (from memory), the quarter of an ellipse has area pi a b / 4
    for rotation in (0, 30, -115):
        c, s = math.cos(math.radians(rotation)), math.sin(math.radians(rotation))
        a, b, cx, cy = 20.0, 8.0, 50.0, 40.0
        p0 = (cx + a * c, cy + a * s)          # end of the major semi-axis
        p1 = (cx - b * s, cy + b * c)          # end of the minor semi-axis
        d = f"M {cx} {cy} L {p0[0]!r} {p0[1]!r} A {a} {b} {rotation} 0 1 {p1[0]!r} {p1[1]!r} Z"
        doc, report = path_data_profile(d)
        segs = doc.profile.loops[0].segments
        curve = segs[1]
        assert isinstance(curve, Curve) and not doc.exact
        assert any("elliptical" in n for n in report.notes)
        # every point of the curve lies on the ellipse (known geometry), in profile coordinates
        t = np.linspace(curve.t_start, curve.t_end, 50)
        x, y, _, _ = curve.evaluate(t)
        u, v = x - cx, -y - cy
        along, across = u * c + v * s, -u * s + v * c
        assert np.allclose((along / a) ** 2 + (across / b) ** 2, 1.0, atol=1e-12)
        m = quick(Revolution(doc.profile, Axis.x(), 360.0))
        assert m.area == pytest.approx(math.pi * a * b / 4, rel=1e-10)
        # reference library: shapely, the sampled outline
        assert sample(segs).area == pytest.approx(math.pi * a * b / 4, rel=1e-6)


def test_elliptical_arc_with_scaled_radii():
    # F.6.6 for an ellipse: radii 2 and 1 scaled up to 10 and 5 reach (0,0) -> (20,0): half ellipse
    doc, _ = path_data_profile("M 0 0 A 2 1 0 0 0 20 0 Z")
    m = quick(Revolution(doc.profile, Axis.x(), 360.0))
    # published: CRC (from memory), half an ellipse has area pi a b / 2; revolved about its
    # major axis it is a prolate spheroid, V = 4/3 pi a b^2
    assert m.area == pytest.approx(math.pi * 10 * 5 / 2, rel=1e-10)
    assert m.volume == pytest.approx(4 / 3 * math.pi * 10 * 5 ** 2, rel=1e-9)


# -- Béziers ---------------------------------------------------------------------------------

def test_cubic_is_its_bernstein_polynomial_with_exact_area():
    pts = [(0, 0), (10, 20), (30, 20), (40, 0)]
    doc, _ = path_data_profile("M0,0 C10,20 30,20 40,0 Z")
    curve, closing = doc.profile.loops[0].segments
    bx, by = bernstein(flip(pts))
    assert same_polynomial(curve.x_expr, bx) and same_polynomial(curve.y_expr, by)
    assert curve.exact == (0, 1) and doc.exact
    # reference library: sympy, Green's theorem over the curve and the closing chord
    green = sympy.integrate(sympy.expand((bx * sympy.diff(by, T) - by * sympy.diff(bx, T)) / 2), (T, 0, 1))
    exact_area = float(abs(green))   # the chord from (40, 0) back to (0, 0) adds nothing
    m = measure(Revolution(doc.profile, Axis((0.0, 5.0), (1.0, 0.0)), 360.0), symbolic=True)
    assert m.area == pytest.approx(exact_area, rel=1e-13)
    assert "symbolic" in m.section.methods[0] or "symbolic" in " ".join(m.section.methods)
    plain = measure(Revolution(doc.profile, Axis((0.0, 5.0), (1.0, 0.0)), 360.0))
    assert plain.area == pytest.approx(exact_area, rel=1e-13) and plain.section.methods[0] == "quadrature"
    # reference library: shapely, the sampled outline
    assert sample(doc.profile.loops[0].segments).area == pytest.approx(exact_area, rel=1e-6)


def test_smooth_and_shorthand_curves_reflect_the_previous_control_point():
    # SVG: S reflects the previous C/S second control point; T the previous Q/T control point
    doc, _ = path_data_profile("M 0 0 Q 10 20 20 0 T 40 0 L 40 -30 L 0 -30 Z")
    q, t = doc.profile.loops[0].segments[:2]
    assert same_polynomial(t.x_expr, bernstein(flip([(20, 0), (30, -20), (40, 0)]))[0])
    assert same_polynomial(t.y_expr, bernstein(flip([(20, 0), (30, -20), (40, 0)]))[1])
    doc, _ = path_data_profile("M 0 0 c 5 10 15 10 20 0 s 15 -10 20 0 v 20 h -40 z")
    c, s = doc.profile.loops[0].segments[:2]
    bx, by = bernstein(flip([(20, 0), (25, -10), (35, -10), (40, 0)]))
    assert same_polynomial(s.x_expr, bx) and same_polynomial(s.y_expr, by)
    # a T or S with no curve before it takes the current point as the control point
    doc, _ = path_data_profile("M 0 0 S 10 10 20 0 L 20 20 L 0 20 Z")
    bx, by = bernstein(flip([(0, 0), (0, 0), (10, 10), (20, 0)]))
    first = doc.profile.loops[0].segments[0]
    assert same_polynomial(first.x_expr, bx) and same_polynomial(first.y_expr, by)


def test_bezier_area_against_shapely_and_sympy_for_a_wavy_outline():
    d = "M 0 0 C 5 -8 15 -8 20 0 S 35 8 40 0 Q 50 -10 60 0 T 80 0 V 15 H 0 Z"
    doc, _ = path_data_profile(d)
    segs = doc.profile.loops[0].segments
    # reference library: sympy, Green's theorem on each curve's own Bernstein form
    controls = [[(0, 0), (5, -8), (15, -8), (20, 0)], [(20, 0), (25, 8), (35, 8), (40, 0)],
                [(40, 0), (50, -10), (60, 0)], [(60, 0), (70, 10), (80, 0)]]
    area = sympy.Integer(0)
    for pts in controls:
        bx, by = bernstein(flip(pts))
        area += sympy.integrate(sympy.expand((bx * sympy.diff(by, T) - by * sympy.diff(bx, T)) / 2), (T, 0, 1))
    for (x0, y0), (x1, y1) in [((80, 0), (80, -15)), ((80, -15), (0, -15)), ((0, -15), (0, 0))]:
        area += sympy.Rational(x0 * y1 - x1 * y0, 2)
    m = quick(Revolution(doc.profile, Axis((0.0, 10.0), (1.0, 0.0)), 360.0))
    assert m.area == pytest.approx(float(abs(area)), rel=1e-13)
    polygon = sample(segs)
    assert polygon.area == pytest.approx(float(abs(area)), rel=1e-6)
    # Pappus with shapely's centroid: V = 2 pi (distance of the centroid) A
    assert m.volume == pytest.approx(2 * math.pi * abs(polygon.centroid.y - 10.0) * polygon.area,
                                     rel=1e-6)


def test_straight_beziers_become_lines():
    doc, report = path_data_profile("M 0 0 C 2 0 5 0 10 0 Q 10 5 10 10 L 0 10 Z")
    assert [s.kind for s in doc.profile.loops[0].segments] == ["line", "line", "line", "line"]
    assert any("straight lines" in n for n in report.notes)


def test_curve_coefficients_too_long_to_write_exactly_become_floats():
    digits = "1.0000000000000000000000000000001"   # 33 characters: exact, but huge fractions
    doc, _ = path_data_profile(f"M 0 0 C {digits} 3 7 {digits} 9 0 Z")
    assert not doc.exact
    curve = doc.profile.loops[0].segments[0]
    assert curve.x_expr.atoms(sympy.Float)


# -- transforms and files ------------------------------------------------------------------------

def test_transform_lists_compose_right_to_left():
    # SVG: "translate(10) scale(2, 3)" scales first, then translates
    m = parse_transform("translate(10,5) scale(2 3)")
    assert m == (2, 0, 0, 3, 10, 5)
    m = parse_transform("matrix(1 2 3 4 5 6)")
    assert m == (1, 2, 3, 4, 5, 6)
    a, b, c, d, e, f = parse_transform("rotate(30)")
    assert (a, b, c, d) == pytest.approx((math.cos(math.pi / 6), math.sin(math.pi / 6),
                                          -math.sin(math.pi / 6), math.cos(math.pi / 6)))
    assert parse_transform("skewX(45)")[2] == 1
    for bad, words in [("scale(1 2 3)", "takes 1 or 2"), ("translate(1", "not closed"),
                       ("skewX(90)", "infinite"), ("rotate 5", 'expected "("')]:
        with pytest.raises(PathDataError, match=re.escape(words)):
            parse_transform(bad)


def write(tmp_path, name, text):
    path = tmp_path / name
    path.write_text(textwrap.dedent(text).lstrip(), encoding="utf-8")
    return str(path)


def test_svg_file_by_id_with_group_and_path_transforms(tmp_path):
    name = write(tmp_path, "part.svg", """\
        <?xml version="1.0" encoding="UTF-8"?>
        <!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd">
        <svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 100 100">
          <path id="frame" d="M0 0 H100 V100 H0 Z"/>
          <g transform="translate(10 20)">
            <path id="section" transform="scale(2)" d="M0,5 h10 v5 h-10 z"/>
          </g>
        </svg>""")
    doc, report = read_svg(name, path_id="section")
    # translate(10 20) scale(2): (x, y) -> (2x + 10, 2y + 20), then the flip
    assert [s.end for s in doc.profile.loops[0].segments] == [
        (30.0, -30.0), (30.0, -40.0), (10.0, -40.0), (10.0, -30.0)]
    assert any("translate(10 20)" in n for n in report.notes)
    assert report.unit_source.startswith("assumed")
    with pytest.raises(FormatError, match="no element with id \"hub\"; the drawn elements are: "
                                          "path 'frame', path 'section'"):
        read_svg(name, path_id="hub")
    # without an id both are read: the section lies inside the frame, so it is its hole
    doc, report = read_svg(name)
    assert len(doc.profile.loops) == 2 and not report.warnings


def test_non_uniform_scale_makes_a_circle_elliptical(tmp_path):
    name = write(tmp_path, "squash.svg", """\
        <svg xmlns="http://www.w3.org/2000/svg">
          <path transform="scale(2 1)" d="M 0 0 L 10 0 A 10 10 0 0 0 0 -10 Z"/>
        </svg>""")
    doc, _ = read_svg(name)
    segs = doc.profile.loops[0].segments
    assert isinstance(segs[1], Curve)
    # published: CRC (from memory), quarter ellipse a = 20, b = 10
    m = quick(Revolution(doc.profile, Axis((0.0, -1.0), (1.0, 0.0)), 360.0))
    assert m.area == pytest.approx(math.pi * 20 * 10 / 4, rel=1e-10)


def test_physical_size_sets_the_unit_and_scale(tmp_path):
    name = write(tmp_path, "sized.svg", """\
        <svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="50mm" viewBox="0 0 400 200">
          <path d="M 0 40 H 400 V 80 H 0 Z"/>
        </svg>""")
    doc, report = read_svg(name)
    assert doc.profile.unit == "mm"
    assert [s.end for s in doc.profile.loops[0].segments][:2] == [(100.0, -10.0), (100.0, -20.0)]
    assert report.unit_source == "from the drawing: width 100mm over a viewBox 400 wide"
    read_svg(name, unit="mm")
    with pytest.raises(UnitError, match="states its size in mm .* the unit given is in"):
        read_svg(name, unit="in")
    inches = write(tmp_path, "points.svg", """\
        <svg xmlns="http://www.w3.org/2000/svg" width="144pt" height="72pt" viewBox="0 0 144 72">
          <path d="M 0 0 H 72 V 36 Z"/>
        </svg>""")
    doc, _ = read_svg(inches)
    # CSS: 1pt = 1/72 in (from memory)
    assert doc.profile.unit == "in" and doc.profile.loops[0].segments[0].end == (1.0, 0.0)


def test_path_data_file(tmp_path):
    name = write(tmp_path, "ring.svgpath", "M0,10 H40 V20 H0 Z\n")
    doc, report = read_path_data_file(name, unit="in")
    assert doc.profile.unit == "in" and report.kind == "SVG path data"
    with pytest.raises(FormatError, match=r"ring2.svgpath: path data: character 11: "):
        read_path_data_file(write(tmp_path, "ring2.svgpath", "M0,10 Q40\n"))


def test_error_in_a_path_names_its_line(tmp_path):
    name = write(tmp_path, "bad.svg", """\
        <svg xmlns="http://www.w3.org/2000/svg">
          <g>

            <path id="p" d="M 0 0 L 5 5 L"/>
          </g>
        </svg>""")
    with pytest.raises(FormatError) as info:
        read_svg(name)
    assert str(info.value).startswith(f"{name}:4: path 'p', path data: character 14: ")


# -- bad input ---------------------------------------------------------------------------------

def test_not_xml_is_refused_with_its_position(tmp_path):
    name = write(tmp_path, "not.svg", "M 0 0 L 10 10 Z\n")
    with pytest.raises(FormatError, match=r"not.svg:1: this is not an SVG file: it is not "
                                          r"well-formed XML \(syntax error at line 1, column 1\)"):
        read_svg(name)
    name = write(tmp_path, "html.svg", "<html><body/></html>")
    with pytest.raises(FormatError, match="its root element is <html>, not <svg>"):
        read_svg(name)
    name = write(tmp_path, "cut.svg", '<svg xmlns="http://www.w3.org/2000/svg">\n<path d="M0 0"')
    with pytest.raises(FormatError, match=r"cut.svg:2: .*line 2"):
        read_svg(name)


def test_entity_bomb_is_refused_before_any_expansion(tmp_path):
    lol = "".join(f'  <!ENTITY lol{k} "{("&lol" + str(k - 1) + ";") * 10}">\n'
                  for k in range(1, 10))
    name = write(tmp_path, "bomb.svg",
                 '<?xml version="1.0"?>\n<!DOCTYPE svg [\n  <!ENTITY lol0 "lol">\n' + lol +
                 ']>\n<svg xmlns="http://www.w3.org/2000/svg"><path d="&lol9;"/></svg>\n')
    with pytest.raises(FormatError) as info:
        read_svg(name)
    text = str(info.value)
    assert 'declares the XML entity "lol0" (line 3,' in text and text.startswith(f"{name}:3: ")
    external = write(tmp_path, "xxe.svg", '<!DOCTYPE svg [<!ENTITY x SYSTEM "file:///etc/passwd">]>'
                                          '<svg><path d="&x;"/></svg>')
    with pytest.raises(FormatError, match='declares the XML entity "x"'):
        read_svg(external)
    subset = write(tmp_path, "subset.svg", '<!DOCTYPE svg [<!ATTLIST path d CDATA "M0 0 H9">]>'
                                           '<svg><path/></svg>')
    with pytest.raises(FormatError, match="internal subset"):
        read_svg(subset)


def test_refused_structures(tmp_path):
    nested = write(tmp_path, "nested.svg", '<svg xmlns="http://www.w3.org/2000/svg"><svg x="5">'
                                           '<path d="M0 0 H5 V5 Z"/></svg></svg>')
    with pytest.raises(FormatError, match="nested <svg>"):
        read_svg(nested)
    styled = write(tmp_path, "styled.svg", '<svg><path style="fill:none; transform: scale(2)" '
                                           'd="M0 0 H5 V5 Z"/></svg>')
    with pytest.raises(FormatError, match="transform in a style attribute"):
        read_svg(styled)
    shape = write(tmp_path, "text.svg", '<svg><text id="t">A</text><path d="M0 0 H5 V5 Z"/></svg>')
    with pytest.raises(FormatError, match=r'id "t" is a <text>, which draws nothing'):
        read_svg(shape, path_id="t")
    empty = write(tmp_path, "empty.svg", '<svg><path id="e"/></svg>')
    with pytest.raises(FormatError, match="no path data"):
        read_svg(empty)
    flat = write(tmp_path, "flat.svg", '<svg><path transform="scale(1 0)" d="M0 0 H5 V5 Z"/></svg>')
    with pytest.raises(FormatError, match="determinant is zero"):
        read_svg(flat)


def test_crossing_subpaths_are_refused_naming_both():
    with pytest.raises(ProfileError) as info:
        path_data_profile("M 0 0 L 20 20 L 20 0 L 0 20 Z", file="bow.svgpath")
    text = str(info.value)
    assert text.startswith("bow.svgpath: subpath 1, \"L\" at character 7: the profile intersects "
                           "itself: this segment meets subpath 1, \"L\" at character 22")
    with pytest.raises(ProfileError, match="intersects itself"):
        path_data_profile("M 0 0 H 10 V 10 H 0 Z M 5 5 H 15 V 15 H 5 Z")


def test_curves_written_by_the_reader_evaluate_where_they_start():
    # the segments the reader builds join end to end within the engine's tolerance
    doc, _ = path_data_profile("M 3 4 c 1 2 3 4 5 6 a 4 2 10 0 1 3 -2 q 1 1 2 -3 z")
    segs = doc.profile.loops[0].segments
    for a, b in zip(segs, segs[1:] + segs[:1]):
        assert math.dist(a.end, b.start) <= 1e-12


def test_curve_from_expressions_matches_direct_build():
    # the imported quarter circle (an exact arc) and a parametric one built directly agree
    doc, _ = path_data_profile("M 0 10 L 0 20 A 10 10 0 0 0 10 10 Z")
    direct = Loop((Line((0.0, -10.0), (0.0, -20.0)),
                   arc_from_centre((0.0, -20.0), (10.0, -10.0), (0.0, -10.0), clockwise=False),
                   Line((10.0, -10.0), (0.0, -10.0))))
    assert volume(doc.profile) == pytest.approx(volume(Profile(loops=(direct,))), rel=1e-14)
    by_curve = Loop((Line((0.0, -10.0), (0.0, -20.0)),
                     curve_from_expressions(10 * sympy.sin(T), -10 - 10 * sympy.cos(T), 0,
                                            math.pi / 2),
                     Line((10.0, -10.0), (0.0, -10.0))))
    assert volume(doc.profile) == pytest.approx(volume(Profile(loops=(by_curve,))), rel=1e-10)


def test_scaled_circle_is_exact_at_any_rotation():
    # half the chord is 5 and the radius 5: lambda is exactly 1 whatever the x-axis rotation
    doc, _ = path_data_profile("M 0 0 A 5 5 33 0 1 6 8 Z")
    arc = doc.profile.loops[0].segments[0]
    assert arc.exact[0] == "centre" and arc.exact[3] == (Fraction(3), Fraction(-4))


@settings(max_examples=300, deadline=None)
@given(st.text(alphabet="MmLlHhVvCcSsQqTtAaZz0123456789.,-+eE \t\n", max_size=60))
def test_any_text_is_read_or_refused_with_a_position(text):
    # the scanner never fails in any other way, and positions lie inside the text (+1 at the end)
    try:
        commands = parse_path_data(text)
    except PathDataError as exc:
        assert 1 <= exc.position <= len(text) + 1
    else:
        for c in commands:
            assert len(c.args) == {"M": 2, "L": 2, "H": 1, "V": 1, "C": 6, "S": 4, "Q": 4,
                                   "T": 2, "A": 7, "Z": 0}[c.letter.upper()]


@settings(max_examples=60, deadline=None)
@given(st.lists(st.tuples(st.sampled_from("LHVCSQTAlhvcsqta"),
                          st.lists(st.integers(-20, 20), min_size=7, max_size=7)),
                min_size=1, max_size=5), st.booleans())
def test_any_valid_path_gives_a_profile_or_a_plain_error(commands, close):
    # whatever the geometry (zero lengths, crossings, degenerate arcs), only RevolveError escapes
    from revolve.errors import RevolveError
    from revolve.formats.svg import _ARGUMENTS

    parts = []
    for letter, numbers in commands:
        count = len(_ARGUMENTS[letter.upper()])
        values = [abs(v) % 2 if letter.upper() == "A" and k in (3, 4) else v
                  for k, v in enumerate(numbers[:count])]
        parts.append(letter + " " + " ".join(map(str, values)))
    d = "M 1 2 " + " ".join(parts) + (" z" if close else "")
    try:
        doc, report = path_data_profile(d)
    except RevolveError:
        return
    assert doc.profile.paths
