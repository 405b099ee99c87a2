"""The ``revolve`` command line.

Each command lives in its own module under :mod:`revolve.cli.commands` and
exposes ``register(app)``; modules are found automatically, so adding a
command never edits this file. Command modules must import heavy libraries
inside their functions: every module is imported at start-up.

Errors caused by input (:class:`~revolve.errors.RevolveError`) are printed as
one line on standard error with exit code 2 — never a traceback.
"""

from __future__ import annotations

import importlib
import pkgutil
import sys

import typer

from revolve.errors import RevolveError

app = typer.Typer(
    name="revolve",
    help="Volumes, surfaces, masses and level tables of parts made by revolving a 2-D profile; "
         "every figure is cross-checked by a second, independent computation.",
    no_args_is_help=True,
    add_completion=False,
    pretty_exceptions_enable=False,
)


def _register_commands() -> None:
    from revolve.cli import commands

    for info in sorted(pkgutil.iter_modules(commands.__path__), key=lambda m: m.name):
        if info.name.startswith("_"):
            continue
        module = importlib.import_module(f"{commands.__name__}.{info.name}")
        register = getattr(module, "register", None)
        if register is not None:
            register(app)


@app.callback()
def _root() -> None:
    """Volumes, surfaces, masses and level tables of parts made by revolving a 2-D profile."""


_register_commands()


def main(argv=None) -> None:
    """Entry point of the console script: run the app, turning input errors into exit code 2."""
    try:
        app(args=argv)  # standalone: usage errors print and exit 2 by themselves
    except RevolveError as exc:
        print(f"revolve: error: {exc}", file=sys.stderr)
        sys.exit(2)
    except KeyboardInterrupt:
        print("revolve: interrupted", file=sys.stderr)
        sys.exit(130)


if __name__ == "__main__":  # pragma: no cover
    main()
