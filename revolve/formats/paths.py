"""The profile files a command or a batch reads: files named, and the profile files of folders named.

A folder gives its profile files (every ending a reader knows, sorted, hidden
files left out); a TOML file in a folder that holds no ``[[loop]]`` or
``[[chain]]`` (a coating system, a deadwood list) is left out and reported. A
file named on its own is always read. The command line and the library's
batch functions use this one rule.
"""

from __future__ import annotations

import os
import re
from typing import List, Optional, Tuple

from revolve.errors import RevolveError


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
