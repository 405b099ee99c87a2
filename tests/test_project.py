"""The project's own promises: the README's quick start and CI agree, start-up stays light."""

from __future__ import annotations

import re
import subprocess
import sys
from pathlib import Path

import pytest

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


SHORT_RUNS = {
    "vessel": ["vessel", "--diameter", "2000", "--length", "5000", "--head", "ellipsoidal",
               "--thickness", "10"],
    "measure a curve": ["measure", str(ROOT / "profiles" / "domed-lid.toml")],
}
#: Modules a short run does not need (start-up budget, measured in benchmarks/): the quadrature
#: needs no numpy.polynomial, the data tables no importlib.resources, reading a file no writer
#: (tempfile) and no other kind's reader, a vessel no measure job, the tables no emoji table.
NOT_AT_START = ("numpy.polynomial", "importlib.resources", "tempfile", "revolve.formats.drawings",
                "revolve.formats.writer", "rich._emoji_codes", "revolve.cli.rows")


@pytest.mark.parametrize("name", sorted(SHORT_RUNS))
def test_short_runs_import_only_what_they_use(tmp_path, name):
    code = (
        "import sys\n"
        "from revolve.cli.app import main\n"
        "try:\n"
        f"    main({SHORT_RUNS[name]!r})\n"
        "except SystemExit as stop:\n"
        "    assert stop.code == 0, stop.code\n"
        f"loaded = [m for m in {NOT_AT_START!r} if m in sys.modules]\n"
        f"loaded += ['revolve.jobs.measuring'] if {name == 'vessel'} and "
        "'revolve.jobs.measuring' in sys.modules else []\n"
        "print('LOADED', loaded, file=sys.stderr)\n"
    )
    r = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=tmp_path)
    assert "LOADED []" in r.stderr, r.stderr[-2000:]


def test_no_text_reaches_an_evaluating_parser():
    """Untrusted text (profile files, drawings, options) is parsed only by revolve.expr's
    whitelist parser. sympy's sympify and parse_expr evaluate strings, so none of sympify,
    parse_expr, eval and exec is called anywhere in the package: values enter sympy through
    revolve.expr.as_sympy, which refuses text. (Project rule; the scan can fail: it reads the
    source.)"""
    call = re.compile(r"\b(sympify|parse_expr|eval|exec)\s*\(([^()]*(?:\([^()]*\)[^()]*)*)\)")
    offenders = []
    for path in sorted((ROOT / "revolve").rglob("*.py")):
        for number, line in enumerate(path.read_text(encoding="utf-8").splitlines(), 1):
            code = line.split("#", 1)[0]
            for match in call.finditer(code):
                offenders.append(f"{path.relative_to(ROOT)}:{number}: {line.strip()}")
    assert offenders == []


def test_the_exact_worker_refuses_text():
    """The --exact worker gets pickled expressions; a string is refused before it is sent."""
    import pytest
    import sympy

    from revolve.geometry.exact import run_sympy

    from revolve.errors import ExpressionError

    with pytest.raises(ExpressionError, match="not to as_sympy"):
        run_sympy([("simplify", "__import__('os').getcwd()")], 5.0)
    t = sympy.Symbol("t", real=True)
    # sympy.integrate of t² on [0, 1] is 1/3 (reference library: sympy, in the worker)
    assert run_sympy([("integrate", t ** 2, t, 0, 1)], 60.0) == [sympy.Rational(1, 3)]


def test_version_is_written_in_one_place():
    # pyproject.toml takes the version from revolve.__version__ (setuptools' dynamic attr);
    # `revolve --version` prints the same attribute.
    import importlib.metadata

    import revolve

    text = (ROOT / "pyproject.toml").read_text()
    assert 'dynamic = ["version"]' in text and "\nversion = " not in text.split("[tool.")[0]
    assert 'attr = "revolve.__version__"' in text
    try:
        installed = importlib.metadata.version("revolve")
    except importlib.metadata.PackageNotFoundError:
        return   # run from a checkout on PYTHONPATH: nothing installed to compare
    assert installed == revolve.__version__


def test_no_algorithm_asks_which_segment_kind_it_holds():
    # Issue 10's contract: outside revolve/geometry/kinds/ nothing tests a segment's class or
    # its kind name; every algorithm calls the contract (kinds/base.py) instead.
    import re

    asks = re.compile(r"isinstance\([^)]*\b(Line|Arc|Curve|Polyline)\b"
                      r"|\bkind\s*(==|!=|in)\s*\(?\s*[\"'](line|arc|curve|polyline)[\"']"
                      r"|type\([^)]*\)\s+is\s+(Line|Arc|Curve|Polyline)\b")
    found = []
    for path in sorted((ROOT / "revolve").rglob("*.py")):
        if "kinds" in path.parts:
            continue
        for no, line in enumerate(path.read_text(encoding="utf-8").splitlines(), start=1):
            if asks.search(line):
                found.append(f"{path.relative_to(ROOT)}:{no}: {line.strip()}")
    assert not found, "\n".join(found)


def test_the_command_line_runs_blas_on_one_thread_unless_told(tmp_path):
    """A command-line process sets one BLAS thread before numpy loads (numpy reads the
    setting then); the user's own setting wins; a process that has numpy already is left
    alone. (Project rule: small linear algebra, process-pool batches.)"""
    import os

    code = ("import os, sys\n"
            "from revolve.cli.app import BLAS_THREAD_SETTINGS, _one_blas_thread\n"
            "_one_blas_thread()\n"
            "print(','.join(os.environ.get(n, '-') for n in BLAS_THREAD_SETTINGS))\n")
    env = {k: v for k, v in os.environ.items() if k not in ("OPENBLAS_NUM_THREADS",
                                                             "MKL_NUM_THREADS")}
    fresh = subprocess.run([sys.executable, "-c", code], env=env, capture_output=True,
                           text=True, check=True, cwd=tmp_path)
    assert fresh.stdout.strip() == "1,1"
    told = subprocess.run([sys.executable, "-c", code], env={**env, "OPENBLAS_NUM_THREADS": "2"},
                          capture_output=True, text=True, check=True, cwd=tmp_path)
    assert told.stdout.strip() == "2,1"
    loaded = subprocess.run([sys.executable, "-c", "import numpy\n" + code], env=env,
                            capture_output=True, text=True, check=True, cwd=tmp_path)
    assert loaded.stdout.strip() == "-,-"


def test_the_program_ends_without_a_collection_pass_and_main_leaves_the_collector_alone(tmp_path):
    """The ``revolve`` script and ``python -m revolve`` run ``cli.app.run``, which freezes the
    collector's objects as the process ends (shutdown then skips a cycle search over them, see
    ``run``); calling ``main`` in a process of one's own (the tests, a notebook) freezes
    nothing. Checked with ``gc.get_freeze_count`` in an exit handler, which runs after both."""
    import tomllib

    scripts = tomllib.loads((ROOT / "pyproject.toml").read_text())["project"]["scripts"]
    assert scripts == {"revolve": "revolve.cli.app:run"}
    assert "run()" in (ROOT / "revolve" / "__main__.py").read_text()
    vessel = ["vessel", "--diameter", "1000", "--length", "2000", "--head", "flat"]
    watch = ("import atexit, gc, sys\n"
             "atexit.register(lambda: print('FROZEN', gc.get_freeze_count() > 0, file=sys.stderr))\n"
             "from revolve.cli import app\n")
    for call, frozen in ((f"sys.argv[1:] = {vessel!r}; app.run()", True),
                         (f"app.main({vessel!r})", False)):
        r = subprocess.run([sys.executable, "-c", watch + call], capture_output=True, text=True,
                           cwd=tmp_path)
        assert r.returncode == 0 and f"FROZEN {frozen}" in r.stderr, (call, r.stderr[-2000:])


def test_records_holding_arrays_compare_by_identity():
    """A dataclass that holds numpy arrays has ``eq=False``: the generated field-wise ``==``
    would raise ("truth value of an array is ambiguous") and its hash would fail. (Project
    rule, as numpy's own arrays refuse ``bool(a == b)``; the scan reads every module.)"""
    import dataclasses
    import importlib

    wrong = []
    for path in sorted((ROOT / "revolve").rglob("*.py")):
        name = ".".join(path.relative_to(ROOT).with_suffix("").parts)
        if name.endswith(("__main__", "__init__")):
            continue
        module = importlib.import_module(name)
        for value in vars(module).values():
            if (isinstance(value, type) and dataclasses.is_dataclass(value)
                    and value.__module__ == name and value.__dataclass_params__.eq
                    and any("ndarray" in str(f.type) for f in dataclasses.fields(value))):
                wrong.append(f"{name}.{value.__name__}")
    assert wrong == []
