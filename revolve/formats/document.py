"""What a profile reader returns: the profile and the settings written beside it.

Examples
--------
>>> from revolve.geometry.profile import Loop, Profile
>>> doc = ProfileDocument(Profile(loops=(Loop.from_points([(0, 1), (1, 1), (0, 2)]),)))
>>> doc.axis is None, doc.angle_degrees, doc.exact, doc.name, doc.orientation
(True, None, True, None, None)
>>> doc.line_of("angle") is None
True
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any, Iterator, Mapping, Optional

from revolve.geometry.profile import Axis, Profile
from revolve.geometry.segments import Where


class SourceLines(Mapping):
    """Line numbers of parts of a file, with a path's segments looked up in an array.

    A point list of 10⁶ vertices keeps the line of each vertex in one integer
    array; ``"loop 1, segment k"`` is answered from it (the line of the
    segment's first vertex) without a dictionary entry per segment.

    >>> import numpy as np
    >>> lines = SourceLines({"loop 1": 3}, {"loop 1": np.array([3, 4, 7])})
    >>> lines["loop 1"], lines.get("loop 1, segment 3"), lines.get("loop 1, segment 4")
    (3, 7, None)
    >>> len(lines), sorted(lines)[:2]
    (4, ['loop 1', 'loop 1, segment 1'])
    """

    def __init__(self, fixed: Mapping[str, int], paths: Mapping[str, Any]):
        self._fixed = dict(fixed)
        self._paths = dict(paths)

    def __getitem__(self, part: str) -> int:
        if part in self._fixed:
            return self._fixed[part]
        path, sep, segment = part.partition(", segment ")
        lines = self._paths.get(path)
        if sep and lines is not None and segment.isdigit() and 1 <= int(segment) <= len(lines):
            return int(lines[int(segment) - 1])
        raise KeyError(part)

    def __iter__(self) -> Iterator[str]:
        yield from self._fixed
        for path, lines in self._paths.items():
            for k in range(len(lines)):
                yield f"{path}, segment {k + 1}"

    def __len__(self) -> int:
        return len(self._fixed) + sum(len(v) for v in self._paths.values())


@dataclass(frozen=True)
class ProfileDocument:
    """A profile read from a file, with the axis, angle and material the file gives.

    Attributes
    ----------
    profile : Profile
        The loops and chains, with ``unit`` and ``file`` set.
    axis : Axis or None
        The axis the file gives, or None when it gives none (the caller's
        default then applies, normally the sketch x axis).
    angle_degrees : float or None
        Sweep angle in (0, 360], or None when not given.
    material : str or None
        Material name as written (the caller looks it up).
    density : str or None
        Density text as written, e.g. ``"7850 kg/m^3"`` (the caller resolves it).
    section : str
        What the loops enclose: ``"material"`` (a solid part, the default) or
        ``"space"`` (empty space such as a vessel's liquid space: the
        material is around the loops, so their surfaces face the other way).
    exact : bool
        True when every number came from an integer, a decimal literal or an
        expression, so exact results can be derived from the segments'
        ``exact`` inputs.
    angle_exact : Fraction, str or None
        The angle as written (a Fraction for a plain number, the text of an
        expression), for exact results.
    orientation : str or None
        ``"vertical"`` or ``"horizontal"``: how the vessel stands, when the
        file says (level tables use it); None when it does not.
    source_lines : Mapping[str, int]
        Line numbers of parts of the file (``"material"``, ``"density"``,
        ``"angle"``, ``"axis"``, ``"loop 1"``, ``"loop 1, segment 3"``, ...)
        so that later errors about them can name the line.
    """

    profile: Profile
    axis: Optional[Axis] = None
    angle_degrees: Optional[float] = None
    material: Optional[str] = None
    density: Optional[str] = None
    exact: bool = True
    section: str = "material"
    source_lines: Mapping[str, int] = field(default_factory=dict, compare=False, hash=False)
    angle_exact: Any = field(default=None, compare=False)
    orientation: Optional[str] = None

    @property
    def name(self) -> Optional[str]:
        """The profile's name, if the file gives one."""
        return self.profile.name

    @property
    def file(self) -> Optional[str]:
        """The file name as given to the reader."""
        return self.profile.file

    def line_of(self, part: str) -> Optional[int]:
        """Line number of ``part`` (e.g. ``"density"``), or None when unknown."""
        return self.source_lines.get(part)

    def where(self, part: str) -> Where:
        """A :class:`Where` for errors about ``part`` of the file.

        >>> from revolve.geometry.profile import Profile
        >>> doc = ProfileDocument(Profile(file="a.toml"), source_lines={"density": 4})
        >>> str(doc.where("density"))
        'a.toml:4: density'
        """
        return Where(file=self.file, line=self.line_of(part), place=part)
