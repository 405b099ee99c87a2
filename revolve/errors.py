"""The error hierarchy of revolve.

Every error a user can cause is a :class:`RevolveError` (a ``ValueError``).
It carries where it happened -- file, line, and a plain description of the
place such as ``"loop 1, segment 3"`` -- and renders as one sentence that says
what is wrong and, where it helps, what to do. The command line prints that
sentence and exits with code 2.

Examples
--------
>>> err = ProfileError("the loop is not closed", file="lid.toml", line=12,
...                    place="loop 1, segment 4")
>>> str(err)
'lid.toml:12: loop 1, segment 4: the loop is not closed'
>>> str(RevolveError("bad"))
'bad'
>>> isinstance(err, ValueError)
True
"""

from __future__ import annotations


class RevolveError(ValueError):
    """Base of every error caused by input; renders as one plain line."""

    def __init__(self, message: str, *, file: str | None = None,
                 line: int | None = None, place: str | None = None):
        super().__init__(message)
        self.message = message
        self.file = file
        self.line = line
        self.place = place

    def located(self, *, file: str | None = None, line: int | None = None,
                place: str | None = None) -> "RevolveError":
        """Return a copy of this error with missing location details filled in.

        >>> e = ExpressionError("unknown name 'foo'").located(file="a.toml", line=3)
        >>> str(e)
        "a.toml:3: unknown name 'foo'"
        """
        return type(self)(self.message,
                          file=self.file or file,
                          line=self.line if self.line is not None else line,
                          place=self.place or place)

    def __str__(self) -> str:
        where = ""
        if self.file:
            where = self.file + (f":{self.line}" if self.line is not None else "")
        elif self.line is not None:
            where = f"line {self.line}"
        parts = [p for p in (where, self.place) if p]
        return ": ".join(parts + [self.message])


class ProfileError(RevolveError):
    """The geometry is unusable: not closed, self-intersecting, crossing the axis, zero area."""


class SegmentError(ProfileError):
    """One segment is impossible (arc radius too short, zero length, not finite)."""


class ExpressionError(RevolveError):
    """An expression was refused by the whitelist parser or cannot be evaluated."""


class FormatError(RevolveError):
    """A file is malformed, has an unknown key, or is not what it says it is."""


class UnitError(RevolveError):
    """A unit is unknown or of the wrong kind."""


class MaterialError(RevolveError):
    """A material name is unknown or a density is invalid."""


class CrossCheckError(RevolveError):
    """The two independent computations disagree by more than the tolerance."""


def indefinite(noun: str) -> str:
    """``noun`` after "a" or "an", chosen by how it starts, for messages built from names.

    "an" before a vowel sound: a vowel letter, except the "yoo" and "wun" sounds
    of words such as unit, usual, one; and before a silent h (hour, honest).

    >>> indefinite("ellipsoidal head"), indefinite("hemispherical head"), indefinite("arc")
    ('an ellipsoidal head', 'a hemispherical head', 'an arc')
    >>> indefinite("unit"), indefinite("umbrella"), indefinite("one-off"), indefinite("hour")
    ('a unit', 'an umbrella', 'a one-off', 'an hour')
    >>> indefinite("2:1 head"), indefinite("")
    ('a 2:1 head', 'a ')
    """
    word = noun.lower()
    vowel = word[:1] in ("a", "e", "i", "o", "u")
    if word.startswith(("uni", "usu", "use", "uti", "ure", "uro", "eu", "ewe", "one", "once")):
        vowel = False
    if word.startswith(("hour", "honest", "honour", "honor", "heir")):
        vowel = True
    return ("an " if vowel else "a ") + noun
