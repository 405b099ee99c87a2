"""Reading and writing profile files.

:func:`load_profile` picks a reader by the file name's ending from
:data:`READERS`; other modules add readers with :func:`register_reader`.
Built in are the project's profile file (``.toml``, see
:mod:`revolve.formats.profile_file` for its schema) and plain point lists
(``.txt``, ``.csv``, ``.xy``, ``.dat``, ``.pts``, see
:mod:`revolve.formats.points`). :func:`write_profile` writes the project's
profile file.

A reader is called as ``reader(path, unit=unit)`` and returns a
:class:`ProfileDocument`; it reads the file itself (through
:func:`revolve.formats.files.read_text` for text formats). A reader whose
attribute ``takes_exact`` is true is also given ``exact=True`` when exact
values are asked for (``--exact``): the point-list reader keeps them only then.

Importing this package and reading a profile of lines and arcs with plain
numbers imports neither sympy, scipy nor pint.

Examples
--------
>>> import os, tempfile
>>> folder = tempfile.mkdtemp()
>>> path = os.path.join(folder, "washer.toml")
>>> with open(path, "w") as f:
...     _ = f.write('''units = "mm"
... [[loop]]
... start = [0, 5]
... segments = [{ line_to = [2, 5] }, { line_to = [2, 9] }, { line_to = [0, 9] }, { close = true }]
... ''')
>>> doc = load_profile(path)
>>> doc.profile.unit, len(doc.profile.loops[0].segments), doc.exact
('mm', 4, True)
>>> from revolve.formats import write_profile     # imported on first use
>>> again = os.path.join(folder, "again.toml")
>>> write_profile(doc, again)
>>> load_profile(again).profile.loops == doc.profile.loops
True
>>> step = os.path.join(folder, "part.step")
>>> open(step, "w").close()
>>> load_profile(step)  # doctest: +ELLIPSIS
Traceback (most recent call last):
...
revolve.errors.FormatError: ...part.step: unknown kind of file ".step"; profiles are read from .toml, .csv, ...
"""

from __future__ import annotations

import os
from typing import TYPE_CHECKING, Any, Callable, Dict, Optional

from revolve.errors import FormatError

if TYPE_CHECKING:                         # pragma: no cover - for type checkers only
    from revolve.formats.document import ProfileDocument

__all__ = ["POINT_EXTENSIONS", "READERS", "ProfileDocument", "load_profile", "parse_profile_text",
           "profile_text", "register_reader", "write_profile"]

#: A reader: ``reader(path, unit=None) -> ProfileDocument``.
Reader = Callable[..., "ProfileDocument"]

#: The package's names that live in its modules, imported on first use (PEP 562), so that
#: reading one kind of file imports only that kind's reader.
_LAZY = {"ProfileDocument": "revolve.formats.document",
         "parse_profile_text": "revolve.formats.profile_file",
         "profile_text": "revolve.formats.writer", "write_profile": "revolve.formats.writer"}


def __getattr__(name: str) -> Any:
    if name in _LAZY:
        import importlib

        return getattr(importlib.import_module(_LAZY[name]), name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


def _reader(module: str, name: str, takes_exact: bool = False) -> Reader:
    """The reader ``module.name``, imported when it is first called.

    >>> r = _reader("revolve.formats.points", "read_points_file", takes_exact=True)
    >>> r.__name__, r.takes_exact
    ('read_points_file', True)
    """
    def read(path, **settings):
        import importlib

        return getattr(importlib.import_module(module), name)(path, **settings)

    read.__name__ = read.__qualname__ = name
    read.__doc__ = f"{module}.{name}, imported on first use."
    read.takes_exact = takes_exact          # type: ignore[attr-defined]
    return read


#: File name endings of plain point lists.
POINT_EXTENSIONS = (".txt", ".csv", ".xy", ".dat", ".pts")

#: Readers by file name ending (lower case, with the dot): the project's profile file, plain
#: point lists (:mod:`revolve.formats.points`) and drawings (:mod:`revolve.formats.drawings`).
READERS: Dict[str, Reader] = {".toml": _reader("revolve.formats.profile_file", "read_profile_file")}
READERS.update({extension: _reader("revolve.formats.points", "read_points_file", True)
                for extension in POINT_EXTENSIONS})
READERS.update({".svg": _reader("revolve.formats.drawings", "read_svg_file"),
                ".svgpath": _reader("revolve.formats.drawings", "read_svg_path_file"),
                ".dxf": _reader("revolve.formats.drawings", "read_dxf_file")})


def register_reader(extension: str, reader: Reader) -> None:
    """Make :func:`load_profile` read files ending in ``extension`` with ``reader``.

    Parameters
    ----------
    extension : str
        The ending, with or without the dot, in any case (``".svg"``).
    reader : callable
        Called as ``reader(path, unit=unit)``; returns a :class:`ProfileDocument`.

    Examples
    --------
    >>> from revolve.formats.points import read_points_file
    >>> register_reader("SKETCH", read_points_file)
    >>> READERS[".sketch"] is read_points_file
    True
    >>> del READERS[".sketch"]
    """
    extension = extension.lower()
    if not extension.startswith("."):
        extension = "." + extension
    READERS[extension] = reader


def load_profile(path, *, unit: Optional[str] = None, exact: bool = False) -> "ProfileDocument":
    """Read a profile from a file, choosing the reader by the file name's ending.

    Parameters
    ----------
    path : str or os.PathLike
        The file; its name is used as given in every message.
    unit : str, optional
        Length unit of the coordinates. Point lists use it (default
        ``"mm"``); a profile file uses it only when it gives no ``units`` and
        refuses a different one.
    exact : bool, optional
        Keep the exact value of every number where the reader can (a point
        list keeps them only when asked; a profile file always does).

    Returns
    -------
    ProfileDocument

    Raises
    ------
    FormatError
        A missing file, an unknown ending, or whatever the reader refuses;
        also :class:`~revolve.errors.SegmentError` and
        :class:`~revolve.errors.ExpressionError`, located in the file.

    Examples
    --------
    >>> load_profile("no_such_part.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no_such_part.toml: no such file; check the name and folder
    >>> import os, tempfile
    >>> path = os.path.join(tempfile.mkdtemp(), "tri.csv")
    >>> with open(path, "w") as f:
    ...     _ = f.write("0,1\\n0.5,1\\n0,2\\n")
    >>> load_profile(path).profile.loops[0].segments[0].exact is None
    True
    >>> load_profile(path, exact=True).profile.loops[0].segments[0].exact.points[1]
    (Fraction(1, 2), Fraction(1, 1))

    An empty file is refused, naming it:

    >>> empty = os.path.join(tempfile.mkdtemp(), "empty.csv")
    >>> open(empty, "w").close()
    >>> load_profile(empty)                  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: ...empty.csv: the file is empty
    """
    name = os.fspath(path)
    if not os.path.exists(name):
        raise FormatError("no such file; check the name and folder", file=name)
    extension = os.path.splitext(name)[1].lower()
    reader = READERS.get(extension)
    if reader is None:
        known = ", ".join(sorted(READERS, key=lambda e: (e != ".toml", e)))
        raise FormatError(f'unknown kind of file "{extension or name}"; profiles are read from '
                          f"{known}", file=name)
    if exact and getattr(reader, "takes_exact", False):
        return reader(name, unit=unit, exact=True)
    return reader(name, unit=unit)
