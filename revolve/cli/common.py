"""Pieces every command shares: loading a profile from the options, the files to read and write.

* :func:`load`, :func:`revolution_from_options`: a profile file (``--units``
  for files that do not say) and its revolution (the axis and angle rule of
  :func:`revolve.jobs.measuring.revolution_for`);
* :func:`check_output`: an output name refused before any work (its ending, its
  folder, and an existing file without ``--force``).

Tables, CSV and JSON are the renderer's (:mod:`revolve.render.output`), numbers
for people :mod:`revolve.render.numbers`, options :mod:`revolve.cli.options`,
the axis, density and unit rules :mod:`revolve.jobs.measuring`. Heavy
libraries are imported inside functions only.

Examples
--------
>>> check_output("part.obj", (".stl",), "meshes")
Traceback (most recent call last):
...
revolve.errors.FormatError: --output: part.obj: meshes are written as .stl files, not ".obj"
"""

from __future__ import annotations

import os
from typing import Any, Optional

from revolve.errors import FormatError


def load(path: str, unit: Optional[str] = None, exact: bool = False):
    """Read a profile document (any supported format); ``unit`` comes from ``--units``.

    ``exact`` (from ``--exact``) keeps exact values where the reader would not otherwise.

    >>> load("p.txt", unit="gallon")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --units: 'gallon' is a volume unit, not a length unit
    """
    from revolve.jobs.measuring import load_with_unit

    return load_with_unit(path, unit, exact=exact)


def revolution_from_options(profile: str, axis: Any, angle: Optional[float],
                            units: Optional[str], exact: bool = False):
    """Load a profile and build its revolution from the options, the file, then the defaults.

    ``axis`` is the option's text or an already parsed axis. Returns
    ``(document, revolution)``; errors name the option or the file line.

    >>> import os, tempfile
    >>> path = os.path.join(tempfile.mkdtemp(), "p.txt")
    >>> with open(path, "w") as f:
    ...     _ = f.write("0,1\\n2,1\\n2,3\\n0,3\\n")
    >>> doc, rev = revolution_from_options(path, "y", 90.0, "cm")
    >>> rev.angle_degrees, rev.axis.direction, doc.profile.unit
    (90.0, (0.0, 1.0), 'cm')
    >>> revolution_from_options(path, None, 400.0, None)
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: --angle: the revolution angle must be above 0 and at most 360 degrees, got 400
    """
    from revolve.jobs.measuring import parse_axis, revolution_for

    doc = load(profile, unit=units, exact=exact)
    rev = revolution_for(doc, parse_axis(axis) if isinstance(axis, str) else axis, angle)
    return doc, rev


def check_output(path: str, endings: tuple, what: str, option: Optional[str] = "--output", *,
                 force: bool = False) -> None:
    """Refuse, before any work, an output name with the wrong ending or that cannot be written.

    An existing file is refused unless ``force`` (``--force``: the one
    overwrite rule, :data:`revolve.render.output.OVERWRITE_RULE`).

    >>> check_output("no/such/folder/t.csv", (".csv",), "tables", option="--csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --csv: no/such/folder/t.csv: the folder for this file does not exist
    >>> import tempfile
    >>> with tempfile.NamedTemporaryFile(suffix=".csv") as f:
    ...     check_output(f.name, (".csv",), "tables", option="--csv")   # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --csv: ....csv: the file exists already; give --force to replace it
    """
    from revolve.formats.files import check_target

    ext = os.path.splitext(path)[1].lower()
    if ext not in endings:
        given = f'"{ext}"' if ext else "a name without an ending"
        raise FormatError(f'{what} are written as {" or ".join(endings)} files, not {given}',
                          file=path, option=option)
    folder = os.path.dirname(os.path.abspath(path))
    if not os.path.isdir(folder):
        raise FormatError("the folder for this file does not exist", file=path, option=option)
    if os.path.isdir(path):
        raise FormatError("this is a folder; give a file name", file=path, option=option)
    check_target(path, option, replace=force)
