"""Curves are written from their own expression trees: writing imports no sympy.

References: the volume of a 2:1 ellipsoidal head, π·D³/24, and of a cylinder,
π·D²/4·L (from memory); the written file measured again must give them.
"""

from __future__ import annotations

import json
import math
import subprocess
import sys
from pathlib import Path

import pytest

from revolve.expr import parse_expression
from revolve.formats.profile_file import parse_profile_text
from revolve.formats.writer import profile_text
from revolve.geometry.kinds.curve import Curve
from revolve.geometry.profile import Chain, Profile

ROOT = Path(__file__).resolve().parents[2]


def test_vessel_written_without_sympy_reads_back_to_the_same_volume(tmp_path):
    target = tmp_path / "tank.toml"
    code = ("import contextlib, io, sys\n"
            "from revolve.cli.app import main\n"
            "out = io.StringIO()\n"
            "with contextlib.redirect_stdout(out):\n"
            "    try:\n"
            f"        main(['vessel', '--diameter', '1200', '--length', '3000', '--head',"
            f" 'ellipsoidal', '-o', {str(target)!r}, '--json'])\n"
            "    except SystemExit as exc:\n"
            "        assert not exc.code, exc.code\n"
            "print(sorted(m for m in sys.modules if m.split('.')[0] == 'sympy'))\n")
    run = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         cwd=ROOT, env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"})
    assert run.returncode == 0, run.stderr
    assert run.stdout.strip().splitlines()[-1] == "[]"
    text = target.read_text()
    assert 'x = "600*sin(t)"' in text
    measured = subprocess.run([sys.executable, "-m", "revolve", "measure", str(target), "--json"],
                              capture_output=True, text=True, cwd=ROOT,
                              env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"})
    assert measured.returncode == 0, measured.stderr
    volume = json.loads(measured.stdout)["volume"]
    D, L = 1200.0, 3000.0
    expected = math.pi * D ** 2 / 4 * L + 2 * math.pi * D ** 3 / 24
    assert volume == pytest.approx(expected, rel=1e-12)


def test_a_moved_mirrored_reversed_curve_is_written_as_its_mapped_tree():
    # x = t, y = t² moved by (2, 1), mirrored in y = x and reversed: checked against the
    # mapped curve worked by hand, x(t) = (1 - t)² + 1, y(t) = 1 - t + 2, at three points.
    base = Curve(parse_expression("t", ["t"]), parse_expression("t^2", ["t"]), 0.0, 1.0)
    moved = base.translated(2.0, 1.0).transformed((0.0, 1.0, 1.0, 0.0)).reversed()
    text = profile_text(Profile(chains=(Chain((moved,)),)))
    back = parse_profile_text(text).profile.chains[0].segments[0]
    for t in (0.0, 0.3, 1.0):
        x, y = (float(v[0]) for v in back.evaluate([t])[:2])
        assert x == pytest.approx((1 - t) ** 2 + 1, abs=1e-15)
        assert y == pytest.approx(1 - t + 2, abs=1e-15)
