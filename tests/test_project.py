"""The project's own promises: the README's quick start and CI agree, start-up stays light."""

from __future__ import annotations

import re
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def quick_start_commands():
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    section = text.split("## Quick start", 1)[1].split("\n## ", 1)[0]
    return re.findall(r"```sh\n(.+?)\n```", section, flags=re.S)


def test_quick_start_is_two_commands_and_ci_runs_the_second():
    cmds = quick_start_commands()
    assert len(cmds) == 2
    assert "revolve measure profiles/" in cmds[0]
    assert "pytest" in cmds[1] and ".[test]" in cmds[1]
    ci = (ROOT / ".ci" / "run").read_text(encoding="utf-8")
    assert cmds[1].strip() in ci


def test_quick_start_example_exists():
    path = re.search(r"revolve measure (\S+)", quick_start_commands()[0]).group(1)
    assert (ROOT / path).is_file()


def test_measuring_lines_and_arcs_imports_no_heavy_library(tmp_path):
    # start-up budget: scipy, sympy and pint cost seconds to import; lines and arcs need none
    code = (
        "import sys\n"
        "from revolve.cli.app import main\n"
        "try:\n"
        f"    main(['measure', {str(ROOT / 'profiles' / 'grooved-pulley.toml')!r}, '--json'])\n"
        "except SystemExit:\n"
        "    pass\n"
        "heavy = [m for m in ('scipy', 'sympy', 'pint', 'matplotlib', 'ezdxf', 'trimesh', 'pydantic')"
        " if m in sys.modules]\n"
        "print('HEAVY', heavy, file=sys.stderr)\n"
    )
    r = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=tmp_path)
    assert "HEAVY []" in r.stderr, r.stderr[-2000:]
