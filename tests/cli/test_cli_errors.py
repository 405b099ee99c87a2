"""Errors on the command line: one line, ``revolve: error: ...``, exit 2, nothing written.

Input families named here:

* **mistakes the command-line parser finds** (an unknown option, a missing
  argument or value, a value that is not a number, an extra argument, an
  unknown command): once a multi-line box, now one line in the tool's own form;
* **text with line breaks or control characters** in an option or a file
  name: quoted or escaped, never a second line;
* **several outputs of one command**, one of which cannot be written: all
  or none (:class:`revolve.formats.files.OutputSet`);
* **generated options** for ``measure``, ``mesh`` and ``picture`` (hypothesis):
  random option names and hostile values (``1e999``, ``nan``, ``-0``, a line
  break, empty, very long text).

The outside reference for the one-line rule and the exit codes is the
project's own contract (README, "Exit codes"); for the output transaction,
POSIX ``rename`` semantics as Python's :func:`os.replace` documents them.
"""

from __future__ import annotations

import contextlib
import io
import os
import stat
import subprocess
import sys
import tempfile

import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st

import revolve
from revolve.cli.app import main
from revolve.errors import FormatError, RevolveError, one_line, quoted
from revolve.formats.files import OutputSet, check_target

SQUARE = "0,1\n2,1\n2,3\n0,3\n"


def run(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main([str(a) for a in args])
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def one_error_line(err: str) -> str:
    assert err.endswith("\n") and err.count("\n") == 1, repr(err)
    assert err.startswith("revolve: error: "), repr(err)
    assert "Traceback" not in err and "╭" not in err and "│" not in err
    return err[len("revolve: error: "):-1]


@pytest.fixture
def square(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    path = tmp_path / "p.txt"
    path.write_text(SQUARE, encoding="utf-8")
    return str(path)


# -- the parser's own mistakes ----------------------------------------------------------------

@pytest.mark.parametrize("args, expected", [
    (["measure", "P", "--bogus"], "--bogus: no such option of 'revolve measure'"),
    (["measure", "P", "--angel", "90"], "--angel: no such option of 'revolve measure'; "
                                        "did you mean --angle?"),
    (["measure"], "PROFILE: this argument is missing; see 'revolve measure --help'"),
    (["mesh", "P"], "--output: this option is required; see 'revolve mesh --help'"),
    (["measure", "P", "--angle", "abc"], "--angle: give a number, got 'abc'"),
    (["measure", "P", "--angle", "x\ny"], "--angle: give a number, got 'x\\ny'"),
    (["measure", "P", "--angle", ""], "--angle: give a number, got ''"),
    (["picture", "P", "-o", "p.png", "--width", "1e999"], "--width: give a whole number, "
                                                          "got '1e999'"),
    (["picture", "P", "-o", "p.png", "--dpi", "9" * 5000], "--dpi: give a whole number, got "
                                                           "'" + "9" * 40 + "…"),
    (["mesh", "P", "-o", "m.stl", "--chord-tolerance"], "--chord-tolerance: give a value after "
                                                          "this option"),
    (["mesh", "P", "-o", "m.stl", "--tolerance", "1"], "--tolerance: no such option of "
                                                       "'revolve mesh'; did you mean"),
    (["measure", "P", "--json=yes"], "--json: this option takes no value"),
    (["mesh", "P", "-o", "m.stl", "extra"], "unexpected extra argument 'extra'"),
    (["mash", "P"], "no such command 'mash'; did you mean 'mesh'?"),
    (["measure", "P", "--x\ny"], "'--x\\ny': no such option"),
])
def test_parser_errors_are_one_line(square, capsys, args, expected):
    code, out, err = run([square if a == "P" else a for a in args], capsys)
    assert code == 2 and out == ""
    assert one_error_line(err).startswith(expected)
    assert sorted(os.listdir(".")) == ["p.txt"]


def test_help_version_and_no_arguments(capsys):
    code, out, _ = run(["--version"], capsys)
    assert code == 0 and out == f"revolve {revolve.__version__}\n"
    code, out, _ = run(["measure", "--help"], capsys)
    assert code == 0 and "Usage: revolve measure" in out and "--density" in out
    code, out, err = run([], capsys)  # no arguments: the help, no error line
    assert "Usage: revolve" in out + err and "revolve: error" not in err


def test_console_script_path_prints_one_line(tmp_path):
    # The same entry point as the installed console script (revolve.cli.app:main).
    res = subprocess.run([sys.executable, "-m", "revolve", "measure", "x.txt", "--nope"],
                         capture_output=True, text=True, cwd=str(tmp_path))
    assert res.returncode == 2 and res.stdout == ""
    assert one_error_line(res.stderr).startswith("--nope: no such option")


# -- line breaks and control characters in what the user typed --------------------------------

def test_file_name_with_a_line_break_stays_on_one_line(square, capsys):
    code, _, err = run(["measure", "no\nsuch\rfile\x1b.txt"], capsys)
    assert code == 2
    assert one_error_line(err).startswith("no\\nsuch\\rfile\\x1b.txt: no such file")


def test_error_text_is_always_one_line():
    # A library's message with a line break (ezdxf: 'Invalid group code "1e9\n"').
    err = FormatError('Invalid group code "1e9\n"', file="a.dxf", line=3)
    assert str(err) == 'a.dxf:3: Invalid group code "1e9\\n"'
    assert one_line("\u2028\x00\x85") == "\\u2028\\x00\\x85"
    assert quoted("a\nb") == "'a\\nb'" and "\n" not in quoted("x\n" * 100)
    located = RevolveError("bad value").located(option="--volume-unit", file="f.toml")
    assert str(located) == "--volume-unit: f.toml: bad value"
    assert str(located.located(option="--other")) == "--volume-unit: f.toml: bad value"


# -- several outputs: all or none -------------------------------------------------------------

def test_output_set_writes_all_or_none(tmp_path):
    first, second = tmp_path / "a.toml", tmp_path / "b.csv"
    first.write_text("old a", encoding="utf-8")
    os.chmod(first, 0o640)
    with OutputSet() as out:
        out.text(str(first), "new a")
        out.binary(str(second), b"new b")
    assert first.read_text(encoding="utf-8") == "new a" and second.read_bytes() == b"new b"
    assert stat.S_IMODE(os.stat(first).st_mode) == 0o640  # a replaced file keeps its mode
    assert sorted(os.listdir(tmp_path)) == ["a.toml", "b.csv"]


def test_output_set_failing_writer_leaves_every_target_untouched(tmp_path):
    first, second = tmp_path / "a.toml", tmp_path / "b.png"
    first.write_text("old a", encoding="utf-8")

    def broken(handle):
        handle.write(b"half")
        raise FormatError("the picture could not be drawn")

    with pytest.raises(FormatError, match="could not be drawn"):
        with OutputSet() as out:
            out.text(str(first), "new a")
            out.add(str(second), broken, binary=True)
    assert first.read_text(encoding="utf-8") == "old a" and not second.exists()
    assert sorted(os.listdir(tmp_path)) == ["a.toml"]


def test_output_set_checks_every_target_before_writing(tmp_path):
    first = tmp_path / "a.toml"
    with pytest.raises(FormatError) as caught:
        with OutputSet() as out:
            out.text(str(first), "new a", option="--output")
            out.text(str(tmp_path / "missing" / "b.toml"), "b", option="--wall-output")
    assert str(caught.value).startswith("--wall-output: ")
    assert "No such file or directory" in str(caught.value)
    assert os.listdir(tmp_path) == []
    with pytest.raises(FormatError, match="given for two outputs"):
        with OutputSet() as out:
            out.text(str(first), "1", option="--output")
            out.text(os.path.join(str(tmp_path), ".", "a.toml"), "2", option="--csv")
    assert os.listdir(tmp_path) == []


def test_output_set_writes_nothing_when_the_block_fails(tmp_path):
    with pytest.raises(ZeroDivisionError):
        with OutputSet() as out:
            out.text(str(tmp_path / "a.toml"), "a")
            1 / 0
    assert os.listdir(tmp_path) == []


@pytest.mark.parametrize("name, reason", [
    ("", "no file name given"), ("a\x00b.csv", "NUL"), ("f" * 300 + ".csv", "too long"),
])
def test_check_target_refuses_names_that_cannot_be_written(tmp_path, name, reason):
    with pytest.raises(FormatError, match=reason):
        check_target(str(tmp_path / name) if name else name, option="--csv")


# -- generated options (hypothesis) -----------------------------------------------------------

COMMANDS = {
    "measure": (["measure", "p.txt"],
                ["--axis", "--angle", "--units", "--material", "--density", "--length-unit",
                 "--area-unit", "--volume-unit", "--mass-unit", "--tolerance", "--csv", "--json",
                 "--exact", "--force"]),
    "mesh": (["mesh", "p.txt", "-o", "m.stl"],
             ["--chord-tolerance", "--axis", "--angle", "--units", "--length-unit", "--csv",
              "--json", "-o", "--output", "--force"]),
    "picture": (["picture", "p.txt", "-o", "p.svg", "--width", "300", "--height", "200"],
                ["--3d", "--axis", "--angle", "--units", "--material", "--density", "--dpi",
                 "--chord-tolerance", "--length-unit", "--area-unit", "--volume-unit",
                 "--mass-unit", "-o", "--force"]),
}
HOSTILE = ["1e999", "-1e999", "nan", "inf", "-inf", "-0", "0", "1", "-1", "1e-300", "5e-324",
           "x\ny", "", " ", "\r", "\x1b[31m", "9" * 5000, "a" * 300, "1,2,3,4", "0,0,1,0",
           "1e999,0,1,0", "x", "y", "mm", "in", "gallon", "US_gallon", "L", "kg/m^3", "7850",
           "7850 kg", "steel", "Stahl", "water", "90", "360", "720", "m.csv", "sub/m.csv",
           "m.stl", "p.png", "q.svg", "--json", "-", "9**9**9", "1/0 mm", "0.5 in"]
NAMES = sorted({name for _, names in COMMANDS.values() for name in names}) + [
    "--bogus", "-x", "--", "---", "--Angle", "--json=1", "-o=", "--angle=", "--density=7850"]
# Text without digits, so that no generated width or tolerance makes a huge picture or mesh
# (the time the engine takes is not what this test is about); numbers come from HOSTILE.
WORDS = st.text(st.characters(blacklist_categories=("Nd", "Cs")), max_size=20)


@st.composite
def command_lines(draw):
    command = draw(st.sampled_from(sorted(COMMANDS)))
    base, known = COMMANDS[command]
    pairs = draw(st.lists(st.tuples(st.sampled_from(known) | st.sampled_from(NAMES),
                                    st.sampled_from(HOSTILE) | WORDS), min_size=1, max_size=3))
    args = list(base)
    for name, value in pairs:
        args.append(name)
        if name not in ("--json", "--exact", "--3d") or draw(st.booleans()):
            args.append(value)
    return args


def _run_in(folder, args):
    out, err = io.StringIO(), io.StringIO()
    here = os.getcwd()
    os.chdir(folder)
    try:
        with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
            try:
                main(args)
            except SystemExit as stop:
                code = stop.code
            else:
                code = 0
    finally:
        os.chdir(here)
    return code, out.getvalue(), err.getvalue()


@settings(max_examples=60, deadline=None)
@given(command_lines())
@example(["measure", "p.txt", "--axis", "1e999,0,1,0"])  # was an OverflowError
@example(["measure", "p.txt", "--axis", "0,0,1,1e999999999"])  # Fraction would build 10**1e9
@example(["measure", "p.txt", "--volume-unit", "x\ny"])  # a line break in the message
@example(["measure", "p.txt", "--density", "7850"])  # a bare density: kg/m³
@example(["mesh", "p.txt", "-o", "m.stl", "--chord-tolerance", "1e-300"])  # was a ZeroDivisionError
@example(["mesh", "p.txt", "-o", "m.stl", "--csv", "sub/m.csv"])  # second output unwritable
@example(["mesh", "p.txt", "-o", "m.stl", "--csv", "m.stl"])  # one file for two outputs
@example(["picture", "p.txt", "-o", "p.svg", "--width", "300", "--height", "200", "--3d",
          "--chord-tolerance", "1e-9"])  # drew for minutes
@example(["measure", "p.txt", "--angle", "\x00"])  # NUL in an option value
@example(["measure", "p.txt", "--angle", "5e-324"])  # was a ZeroDivisionError in measure
@example(["measure", "p.txt", "--csv", "a\x00.csv"])  # NUL in an output name
def test_generated_options_end_cleanly(args):
    with tempfile.TemporaryDirectory() as folder:
        with open(os.path.join(folder, "p.txt"), "w", encoding="utf-8") as handle:
            handle.write(SQUARE)
        code, out, err = _run_in(folder, args)
        left = sorted(os.listdir(folder))
    assert code in (0, 1, 2), (code, err)
    assert "Traceback" not in out + err
    assert not [name for name in left if name.endswith((".part", ".old"))], left
    if code == 2:
        assert err.count("\n") == 1 and err.endswith("\n"), repr(err)
        assert err.startswith("revolve: error: "), repr(err)
        assert left == ["p.txt"], (args, err, left)
