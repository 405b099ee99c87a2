"""The package's own data tables and the one TOML reader every file format uses.

The tables (materials, bar sizes, cutting data, operations, expansion
coefficients) are TOML files in ``revolve/data`` beside this module; an
installed package keeps them there (``package-data`` in ``pyproject.toml``).
They are read as plain files: :mod:`importlib.resources` would cost a run
about 9 ms of imports (zipfile, tempfile) for files that are never zipped.

Examples
--------
>>> "[[material]]" in bundled_text("materials.toml")
True
>>> toml().loads('a = 1')
{'a': 1}
"""

from __future__ import annotations

import os

DATA_FOLDER = os.path.join(os.path.dirname(os.path.abspath(__file__)), "data")


def bundled_text(name: str) -> str:
    """The text of the package's data file ``name`` (a file of ``revolve/data``)."""
    with open(os.path.join(DATA_FOLDER, name), encoding="utf-8") as handle:
        return handle.read()


def toml():
    """The TOML reader: :mod:`tomllib` (Python 3.11+) or its backport ``tomli`` (3.10)."""
    try:
        import tomllib
    except ModuleNotFoundError:  # pragma: no cover - Python 3.10
        import tomli as tomllib  # type: ignore[no-redef]
    return tomllib
