"""Pieces every command shares: options, loading, units, number formatting, output.

Rendering (tables, JSON, CSV) lives in the CLI, never in the engine. Heavy
libraries are imported inside functions only.

Examples
--------
>>> parse_axis("y")
Axis(point=(0.0, 0.0), direction=(0.0, 1.0))
>>> parse_axis("0,5,1,1").direction
(1.0, 1.0)
>>> fmt(1234.56789, 6), fmt(float("nan")), fmt(None)
('1234.57', '—', '—')
"""

from __future__ import annotations

import json
import math
import os
import re
import sys
from typing import Any, Dict, List, Optional, Tuple

from revolve.errors import RevolveError, UnitError
# The rules shared with the library live in the jobs layer; commands use them through here.
from revolve.jobs.measuring import (CAUTIONS, OutputUnits, material_or_density, output_units,
                                    parse_axis, resolve_density, revolution_for)

#: Names the commands read from here: the shared rules, which live in the jobs layer.
REEXPORTED = (CAUTIONS, OutputUnits, material_or_density, output_units, parse_axis,
              resolve_density)


def load(path: str, unit: Optional[str] = None, exact: bool = False):
    """Read a profile document (any supported format); ``unit`` comes from ``--units``.

    ``exact`` (from ``--exact``) keeps exact values where the reader would not otherwise.

    >>> load("p.txt", unit="gallon")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --units: 'gallon' is a volume unit, not a length unit
    """
    from revolve import units
    from revolve.formats import load_profile

    if unit is not None:
        try:
            units.factor(unit, "length")
        except UnitError as e:
            raise e.located(option="--units")
    return load_profile(path, unit=unit, exact=exact)


def revolution_from_options(profile: str, axis: Optional[str], angle: Optional[float],
                            units: Optional[str], exact: bool = False):
    """Load a profile and build its revolution from the options, the file, then the defaults.

    Returns ``(document, revolution)``; errors name the option or the file line.

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
    doc = load(profile, unit=units, exact=exact)
    rev = revolution_for(doc, parse_axis(axis), angle)
    return doc, rev


def fmt(value: Any, digits: int = 10) -> str:
    """A number for a table: ``digits`` significant digits, no exponent for ordinary sizes."""
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


def clean_json(obj: Any) -> Any:
    """Replace NaN/inf by None and tuples by lists, recursively, for strict JSON."""
    if isinstance(obj, float):
        return obj if math.isfinite(obj) else None
    if isinstance(obj, dict):
        return {str(k): clean_json(v) for k, v in obj.items()}
    if isinstance(obj, (list, tuple)):
        return [clean_json(v) for v in obj]
    return obj


def print_json(obj: Dict[str, Any]) -> None:
    sys.stdout.write(json.dumps(clean_json(obj), indent=2, ensure_ascii=False) + "\n")


def console():
    """A rich console on standard output (wide enough not to wrap tables in pipes)."""
    from rich.console import Console

    return Console(width=None if sys.stdout.isatty() else 110, highlight=False)


def caution_panel(kinds) -> Any:
    from rich.panel import Panel

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
