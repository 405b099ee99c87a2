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
from typing import Callable, Dict, Optional

from revolve.errors import FormatError
from revolve.formats.document import ProfileDocument
from revolve.formats.points import POINT_EXTENSIONS, read_points_file
from revolve.formats.profile_file import parse_profile_text, read_profile_file
from revolve.formats.writer import profile_text, write_profile

__all__ = ["READERS", "ProfileDocument", "load_profile", "parse_profile_text",
           "profile_text", "register_reader", "write_profile"]

#: A reader: ``reader(path, unit=None) -> ProfileDocument``.
Reader = Callable[..., ProfileDocument]

#: Readers by file name ending (lower case, with the dot).
READERS: Dict[str, Reader] = {".toml": read_profile_file}
READERS.update({extension: read_points_file for extension in POINT_EXTENSIONS})
from revolve.formats.drawings import DRAWING_READERS  # noqa: E402 (imports no reader yet)
READERS.update(DRAWING_READERS)


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
    >>> register_reader("SKETCH", read_points_file)
    >>> READERS[".sketch"] is read_points_file
    True
    >>> del READERS[".sketch"]
    """
    extension = extension.lower()
    if not extension.startswith("."):
        extension = "." + extension
    READERS[extension] = reader


def load_profile(path, *, unit: Optional[str] = None, exact: bool = False) -> ProfileDocument:
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
