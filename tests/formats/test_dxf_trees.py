"""DXF splines and ellipses become the package's own expression trees: reading imports no sympy.

References: the area of a half ellipse, π·a·b/2, and the prolate spheroid's
volume 4/3·π·a·b² (CRC, from memory); ezdxf's own evaluation of the spline
(``BSpline.point``) with shapely's ``Polygon.area`` for the spline outline.
"""

from __future__ import annotations

import json
import math
import subprocess
import sys
from pathlib import Path

import ezdxf
import pytest

ROOT = Path(__file__).resolve().parents[2]


def drawing(tmp_path):
    doc = ezdxf.new("R2010")
    doc.header["$INSUNITS"] = 4
    msp = doc.modelspace()
    a, b = 30.0, 12.0
    msp.add_ellipse((0, 0), (a, 0, 0), b / a, 0, math.pi)     # the top half, from (a, 0)
    msp.add_line((-a, 0), (a, 0))
    msp.add_open_spline([(0, 50), (10, 70), (25, 45), (40, 70), (50, 50)], degree=3)
    msp.add_line((50, 50), (50, 42))
    msp.add_line((50, 42), (0, 42))
    msp.add_line((0, 42), (0, 50))
    path = tmp_path / "part.dxf"
    doc.saveas(path)
    return path


def test_reading_splines_and_ellipses_imports_no_sympy(tmp_path):
    path = drawing(tmp_path)
    code = ("import json, sys\n"
            "from revolve.formats.dxf import read_dxf\n"
            "from revolve.geometry.measure import measure\n"
            "from revolve.geometry.profile import Axis, Profile, Revolution\n"
            f"doc, report = read_dxf({str(path)!r}, keep_strays=True)\n"
            "kinds = sorted(s.kind for p in doc.profile.loops for s in p.segments)\n"
            "areas = sorted(measure(Revolution(Profile(loops=(p,)), Axis.x()), symbolic=False)"
            ".area for p in doc.profile.loops)\n"
            "print(kinds.count('curve'), json.dumps(areas))\n"
            "print(sorted(m for m in sys.modules if m.split('.')[0] == 'sympy'))\n")
    run = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT,
                         env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"})
    assert run.returncode == 0, run.stderr
    counts, modules = run.stdout.strip().splitlines()[-2:]
    assert modules == "[]"
    curves, areas = counts.split(" ", 1)
    assert curves == "3"            # one elliptical arc, two spline spans
    half_ellipse = json.loads(areas)[0]
    assert half_ellipse == pytest.approx(math.pi * 30.0 * 12.0 / 2, rel=1e-12)


def test_spline_and_ellipse_trees_measure_as_the_references(tmp_path):
    from shapely.geometry import Polygon

    from revolve.expr import Expr
    from revolve.formats.dxf import read_dxf
    from revolve.geometry.measure import measure
    from revolve.geometry.profile import Axis, Profile, Revolution

    doc, _ = read_dxf(str(drawing(tmp_path)), keep_strays=True)
    loops = sorted(doc.profile.loops, key=lambda p: p.segments[0].start[1])
    curves = [s for p in loops for s in p.segments if s.kind == "curve"]
    assert all(isinstance(c.base_x, Expr) and isinstance(c.base_y, Expr) for c in curves)
    ellipse, spline = (measure(Revolution(Profile(loops=(p,)), Axis.x()), symbolic=False)
                       for p in loops)
    a, b = 30.0, 12.0
    assert ellipse.volume == pytest.approx(4 / 3 * math.pi * a * b * b, rel=1e-10)
    tool = ezdxf.math.BSpline([(0, 50), (10, 70), (25, 45), (40, 70), (50, 50)], order=4)
    outline = [tuple(p)[:2] for p in tool.approximate(20000)] + [(50, 42), (0, 42)]
    assert spline.area == pytest.approx(Polygon(outline).area, rel=1e-7)
