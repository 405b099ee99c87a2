"""The ``revolve`` command line.

Each command lives in its own module under :mod:`revolve.cli.commands` and
exposes ``register(app)``; modules are found automatically, so adding a
command never edits this file. A run of one command imports the module named
like it (a name starting with the command's: ``turn`` is in ``turning.py``);
help, ``--version`` and unknown names import every module. Command modules
must import heavy libraries inside their functions.

Every error caused by input is printed as one line on standard error,
``revolve: error: ...``, with exit code 2 -- never a traceback, never a box.
That holds for the tool's own errors (:class:`~revolve.errors.RevolveError`)
and for the command-line parser's (an unknown option, a missing argument, a
value that is not a number), which :func:`usage_message` puts in the same
form, naming the option. Anything the message carries from the user's input
or a library is escaped so that it stays on one line.

Examples
--------
>>> import contextlib, io
>>> err = io.StringIO()
>>> with contextlib.redirect_stderr(err):
...     try:
...         main(["measure", "part.txt", "--angel", "90"])
...     except SystemExit as stop:
...         print(stop.code)
2
>>> print(err.getvalue(), end="")
revolve: error: --angel: no such option of 'revolve measure'; did you mean --angle?
"""

from __future__ import annotations

import importlib
import sys
from typing import Optional

import typer

from revolve.errors import RevolveError, one_line, quoted

PROGRAM = "revolve"

app = typer.Typer(
    name=PROGRAM,
    help="Volumes, surfaces, masses and level tables of parts made by revolving a 2-D profile; "
         "every figure is cross-checked by a second, independent computation.",
    invoke_without_command=True,
    add_completion=False,
    pretty_exceptions_enable=False,
)


_ALL_REGISTERED = []   # non-empty once every command module is registered on ``app``


def _command_modules():
    """The package of the command modules and their names (``*.py`` files of its folder)."""
    import os

    from revolve.cli import commands

    names = sorted({os.path.splitext(f)[0] for folder in commands.__path__
                    for f in os.listdir(folder) if f.endswith(".py")})
    return commands.__name__, [n for n in names if not n.startswith("_")]


def _register_commands(target=None, modules=None) -> None:
    """Register the commands of ``modules`` (default: every command module) on ``target``."""
    package, names = _command_modules()
    for name in names if modules is None else modules:
        module = importlib.import_module(f"{package}.{name}")
        register = getattr(module, "register", None)
        if register is not None:
            register(app if target is None else target)


def _full_app() -> typer.Typer:
    """``app`` with every command registered (imports every command module once)."""
    if not _ALL_REGISTERED:
        _register_commands()
        _ALL_REGISTERED.append(True)
    return app


def _show_version(value: bool) -> None:
    if value:
        from revolve import __version__

        print(f"{PROGRAM} {__version__}")
        raise typer.Exit(0)


@app.callback()
def _root(
    ctx: typer.Context,
    version: bool = typer.Option(False, "--version", is_eager=True, callback=_show_version,
                                 help="Print the version and stop."),
) -> None:
    """Volumes, surfaces, masses and level tables of parts made by revolving a 2-D profile."""
    if ctx.invoked_subcommand is None:      # `revolve` alone: the help, and success
        print(ctx.get_help())
        raise typer.Exit(0)


def _option_name(param) -> Optional[str]:
    """The name a user knows a parameter by: its long option, or an argument's metavar."""
    if param is None:
        return None
    opts = list(getattr(param, "opts", []) or [])
    if getattr(param, "param_type_name", "") == "argument" or not opts:
        return (getattr(param, "name", None) or "argument").upper()
    long = [o for o in opts if o.startswith("--")]
    return max(long or opts, key=len)


def _plain_option(text: str) -> str:
    """An option name as typed: as it is when it looks like one, else quoted."""
    if text.startswith("-") and len(text) <= 40 and text.isprintable() and " " not in text \
            and "'" not in text:
        return text
    return quoted(text)


def _number_message(message: str) -> Optional[str]:
    """click's "'abc' is not a valid float." as our sentence, or None if it is another message."""
    import ast
    import re

    match = re.fullmatch(r"(?s)(.*) is not a valid (float|integer|int)\.", message)
    if match is None:
        return None
    try:
        value = ast.literal_eval(match.group(1))  # a repr of a str, written by click
    except (ValueError, SyntaxError, MemoryError, RecursionError):
        return None
    if not isinstance(value, str):
        return None
    what = "a number" if match.group(2) == "float" else "a whole number"
    return f"give {what}, got {quoted(value)}"


def usage_message(exc) -> str:
    """One line, in the tool's own form, for an error of the command-line parser (click).

    The option (or argument) concerned is named first, as in the tool's own
    errors; the command's ``--help`` is pointed to where it helps.

    >>> from typer._click.exceptions import NoSuchOption, UsageError
    >>> usage_message(NoSuchOption("--bogus", possibilities=["--axis"]))
    '--bogus: no such option; did you mean --axis?'
    >>> usage_message(NoSuchOption("--x\\ny"))
    "'--x\\\\ny': no such option"
    >>> usage_message(UsageError("No such command 'mash'. Did you mean 'mesh'?"))
    "no such command 'mash'; did you mean 'mesh'?"
    >>> from typer._click.exceptions import BadParameter
    >>> usage_message(BadParameter("'z' is not one of 'a', 'b'.", param_hint="'--kind'"))
    "--kind: 'z' is not one of 'a', 'b'"
    """
    import re

    from typer._click import exceptions as ce

    ctx = getattr(exc, "ctx", None)
    command = f"'{ctx.command_path}'" if ctx is not None and ctx.command_path else None
    see = f"; see '{ctx.command_path} --help'" if command else ""
    if isinstance(exc, ce.NoSuchOption):
        text = f"{_plain_option(exc.option_name)}: no such option" + (f" of {command}" if command
                                                                      else "")
        close = sorted(p for p in exc.possibilities or () if p != "--help")
        if close:
            text += f"; did you mean {' or '.join(close)}?"
        return text
    if isinstance(exc, ce.MissingParameter):
        name = _option_name(exc.param) or "an argument"
        if getattr(exc.param, "param_type_name", "") == "argument":
            return f"{name}: this argument is missing{see}"
        return f"{name}: this option is required{see}"
    if isinstance(exc, ce.BadParameter):
        name = _option_name(exc.param)
        if name is None and exc.param_hint:
            hint = exc.param_hint
            name = (hint if isinstance(hint, str) else " / ".join(hint)).strip("'\"")
        message = _number_message(exc.message) or exc.message.rstrip(".")
        return f"{name}: {message}" if name else message
    if isinstance(exc, ce.BadOptionUsage):
        name = _plain_option(exc.option_name)
        if "requires" in exc.message:
            return f"{name}: give a value after this option{see}"
        if "does not take a value" in exc.message:
            return f"{name}: this option takes no value{see}"
        return f"{name}: {exc.message.rstrip('.')}"
    message = exc.format_message().strip()
    extra = re.fullmatch(r"(?s)Got unexpected extra arguments?(?:\(s\))? \((.*)\)\.?", message)
    if extra is not None:
        return f"unexpected extra argument {quoted(extra.group(1))}; put options after the " \
               f"command and give each value once{see}"
    message = message.replace(". Did you mean", "; did you mean")
    message = message[:1].lower() + message[1:]
    return message.rstrip(".") + ("" if "did you mean" in message else see)


def _fail(message: str) -> None:
    print(f"{PROGRAM}: error: {one_line(message)}", file=sys.stderr)
    sys.exit(2)


def _app_for(argv) -> typer.Typer:
    """The app with only the command that ``argv`` names, else the whole app.

    typer turns every registered command into a click command (reading each
    function's signature and type hints) before it dispatches; for one command
    that is most of the start-up of a short run. The one command keeps the
    root's options and callback, so its help, errors and exit codes are the
    same as through the whole app.

    >>> [c.name for c in _app_for(["vessel", "--help"]).registered_commands]
    ['vessel']
    >>> _app_for(["--version"]) is app, _app_for(["mash"]) is app
    (True, True)
    """
    first = argv[0] if argv else None
    chosen = []
    if first is not None and not _ALL_REGISTERED and first.isidentifier():
        # A command lives in the module of its name (``turn`` in ``turning``): import only the
        # modules whose name starts with it, not every command's module.
        _, names = _command_modules()
        scratch = typer.Typer()
        _register_commands(scratch, [n for n in names if n.startswith(first)])
        chosen = [c for c in scratch.registered_commands if c.name == first]
    if len(chosen) != 1:
        full = _full_app()
        chosen = [c for c in full.registered_commands if first is not None and c.name == first]
        if len(chosen) != 1:
            return full
    one = typer.Typer(name=PROGRAM, help=app.info.help, invoke_without_command=True,
                      add_completion=False, pretty_exceptions_enable=False)
    one.registered_callback = app.registered_callback
    one.registered_commands = chosen
    return one


#: numpy's BLAS libraries read their thread count from these when numpy is first imported.
BLAS_THREAD_SETTINGS = ("OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS")


def _one_blas_thread() -> None:
    """Run numpy's BLAS on one thread in a command-line process, unless the user says otherwise.

    The commands' linear algebra is small (quadrature rules, 2 × 2 maps) and a batch uses the
    cores through a process pool, so BLAS threads only spin beside the work (about a tenth
    of a short run on a two-core machine) and would oversubscribe the pool's cores. Set
    before numpy is first imported, i.e. only when the command line starts a process;
    a process that imported numpy already (a notebook, the tests) is left alone.
    """
    if "numpy" not in sys.modules:
        import os

        for name in BLAS_THREAD_SETTINGS:
            os.environ.setdefault(name, "1")


def main(argv=None) -> None:
    """Run the command line on ``argv`` (default: the process's); input errors become one line, exit 2.

    Always ends with :class:`SystemExit` carrying the exit code: 0 done, 1 a
    cross-check disagrees, 2 the input (or an option) is refused, 130
    interrupted.
    """
    from typer._click import exceptions as ce

    _one_blas_thread()
    try:
        code = _app_for(sys.argv[1:] if argv is None else list(argv))(
            args=argv, prog_name=PROGRAM, standalone_mode=False)
    except ce.NoArgsIsHelpError as exc:  # the help text has been printed: no error line
        sys.exit(exc.exit_code)
    except ce.ClickException as exc:
        _fail(usage_message(exc))
    except RevolveError as exc:
        _fail(str(exc))
    except (KeyboardInterrupt, typer.Abort):
        print(f"{PROGRAM}: interrupted", file=sys.stderr)
        sys.exit(130)
    sys.exit(code if isinstance(code, int) else 0)


def run() -> None:
    """The program's entry point (the ``revolve`` script, ``python -m revolve``): :func:`main`, then exit.

    The process ends with the command, and its memory goes back to the system with it.
    Before the interpreter shuts down, every object is moved to the garbage collector's
    permanent generation (``gc.freeze``), so the shutdown does not search them all for
    reference cycles, work that would be thrown away with the process (a tenth of a short
    run, measured by ``benchmarks/startup_benchmark.py``). Objects outside cycles are still
    released as their modules are cleared, and standard output and error are flushed as
    usual; every file a command writes is closed (and moved into place) before it returns.
    A process that calls :func:`main` itself (the tests, a notebook) is left alone.
    """
    import gc

    try:
        main()
    finally:
        gc.freeze()


if __name__ == "__main__":  # pragma: no cover
    run()
