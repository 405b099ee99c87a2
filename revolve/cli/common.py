"""Pieces every command shares: loading a profile from the options, the files to read and write.

* :func:`load`, :func:`revolution_from_options`: a profile file (``--units``
  for files that do not say) and its revolution (the axis and angle rule of
  :func:`revolve.jobs.measuring.revolution_for`);
* :func:`profile_paths`: the files named, and the profile files of the folders named;
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

import math
import os
import re
import sys
from typing import Any, Dict, List, Optional, Tuple

from revolve.errors import FormatError, RevolveError, UnitError


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


# -- until turn, coat, levels and vessel are on the shared core ------------------------------
# These commands still read the helpers below (and the jobs layer's rules through this
# module, see _MOVED); delete each one when no module of revolve/ names it any more.

#: Names that moved to the jobs layer, still found here by the commands not yet converted.
_MOVED = ("CAUTIONS", "material_or_density", "output_units", "parse_axis")


def __getattr__(name: str):
    if name in _MOVED:
        from revolve.jobs import measuring

        return getattr(measuring, name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


def fmt(value: Any, digits: int = 10) -> str:
    """A number for a table: ``digits`` significant digits, no exponent for ordinary sizes.

    The old formatting of the commands not yet converted; new tables use
    :func:`revolve.render.numbers.number` through the renderer.
    """
    if value is None:
        return "—"
    try:
        v = float(value)
    except (TypeError, ValueError):
        return str(value)
    if not math.isfinite(v):
        return "—"
    if v == 0:
        return "0"
    mag = abs(v)
    if 1e-4 <= mag < 1e12:
        decimals = max(0, digits - 1 - int(math.floor(math.log10(mag))))
        s = f"{v:.{decimals}f}"
        if "." in s:
            s = s.rstrip("0").rstrip(".")
        return s
    return f"{v:.{digits - 1}e}"


def print_json(obj: Dict[str, Any]) -> None:
    """Strict JSON on standard output (the renderer's :func:`revolve.render.output.json_text`)."""
    from revolve.render.output import json_text

    sys.stdout.write(json_text(obj) + "\n")


def console():
    """The renderer's rich console on standard output (:func:`revolve.render.output.console`)."""
    from revolve.render.output import console as make

    return make()


def caution_panel(kinds) -> Any:
    from rich.panel import Panel

    from revolve.jobs.measuring import CAUTIONS

    text = "\n".join(CAUTIONS[k] for k in kinds)
    return Panel(text, title="Caution", title_align="left", border_style="yellow", expand=False)


def fail_unit(option: str, exc: UnitError) -> UnitError:
    """The unit error ``exc`` about ``option`` (named once, first, when it is printed).

    >>> print(fail_unit("--film-unit", UnitError("unknown length unit 'mlis'")))
    --film-unit: unknown length unit 'mlis'
    """
    return exc.located(option=option)


# -- many files ------------------------------------------------------------------------------


def _not_a_profile(path: str) -> bool:
    """A TOML file in a folder that holds no [[loop]] or [[chain]] (e.g. a coating system)."""
    if os.path.splitext(path)[1].lower() != ".toml":
        return False
    try:
        with open(path, "rb") as handle:
            text = handle.read().decode("utf-8", "replace")
    except OSError:
        return False
    return not re.search(r"^\s*\[\[\s*(loop|chain)\s*\]\]", text, re.M)


def profile_paths(items: List[str], skip: Optional[str] = None) -> Tuple[List[str], List[str]]:
    """Files named, and the profile files inside folders named (sorted, not hidden).

    Returns the paths to read and the files of the folders left out because
    they are TOML files with no loop or chain (other kinds of input). ``skip``
    (the ``--csv`` target) is never read. A file named on its own is always read.

    >>> profile_paths(["a.toml", "b.txt"])
    (['a.toml', 'b.txt'], [])
    >>> import tempfile
    >>> profile_paths([tempfile.mkdtemp()])  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: ...: no profile files (.toml, ...) in this folder
    """
    from revolve.formats import READERS

    out: List[str] = []
    left_out: List[str] = []
    skip_abs = os.path.abspath(skip) if skip else None
    for item in items:
        if os.path.isdir(item):
            found = sorted(
                os.path.join(item, n) for n in os.listdir(item)
                if not n.startswith(".") and os.path.splitext(n)[1].lower() in READERS
                and os.path.isfile(os.path.join(item, n))
                and os.path.abspath(os.path.join(item, n)) != skip_abs)
            others = [f for f in found if _not_a_profile(f)]
            if others:
                skipped = set(others)
                found = [f for f in found if f not in skipped]
            if not found:
                known = ", ".join(sorted(READERS, key=lambda e: (e != ".toml", e)))
                raise RevolveError(f"no profile files ({known}) in this folder", file=item)
            out.extend(found)
            left_out.extend(others)
        else:
            out.append(item)
    return out, left_out
