r"""The error hierarchy of revolve.

Every error a user can cause is a :class:`RevolveError` (a ``ValueError``).
It carries where it happened -- the command-line option, file, line, and a
plain description of the place such as ``"loop 1, segment 3"`` -- and renders
as one sentence that says what is wrong and, where it helps, what to do. The
command line prints that sentence and exits with code 2.

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

An error about a command-line option carries the option's name, rendered
once, first. Text the user typed is inserted with :func:`quoted`, and the
rendered sentence is always one line (:func:`one_line` is the last resort):

>>> text = "gal\nlon"
>>> print(UnitError(f"unknown volume unit {quoted(text)}", option="--volume-unit"))
--volume-unit: unknown volume unit 'gal\nlon'
>>> print(RevolveError("a library said\nsomething"))
a library said\nsomething
"""

from __future__ import annotations

#: Longest piece of user text shown in a message; the middle of longer text is left out.
QUOTED_LIMIT = 80


def quoted(text: object, limit: int = QUOTED_LIMIT) -> str:
    r"""User text for a message: quoted and escaped as Python's ``repr`` does, shortened if long.

    Newlines, tabs and other control characters come out as escapes (``\n``),
    so the message stays on one line; text longer than ``limit`` characters
    keeps its beginning and end with ``…`` between and says how long it was.

    Examples
    --------
    >>> print(quoted("gallon"))
    'gallon'
    >>> print(quoted("x\ny"))
    'x\ny'
    >>> print(quoted("7" * 200, limit=10))
    '77777…77777' (200 characters)
    >>> print(quoted(""))
    ''
    """
    text = str(text)
    if len(text) <= limit:
        return repr(text)
    half = max(1, limit // 2)
    head, tail = repr(text[:half]), repr(text[-half:])
    if head[0] == tail[0]:  # both in the same quotes: join them into one quoted piece
        return f"{head[:-1]}…{tail[1:]} ({len(text)} characters)"
    return f"{head}…{tail} ({len(text)} characters)"


def _escape(ch: str) -> str:
    special = {"\n": "\\n", "\r": "\\r", "\t": "\\t"}
    if ch in special:
        return special[ch]
    code = ord(ch)
    if code < 0x100:
        return f"\\x{code:02x}"
    return f"\\u{code:04x}" if code < 0x10000 else f"\\U{code:08x}"


def one_line(text: str) -> str:
    r"""The text with every line break and control character escaped: one printable line.

    The last resort that keeps a message on one line whatever it carries (a
    library's message, a file name); where user text is inserted,
    :func:`quoted` is the better tool.

    Examples
    --------
    >>> print(one_line('Invalid group code "1e9\n"'))
    Invalid group code "1e9\n"
    >>> print(one_line("tab\there, bell\x07, line\u2028end, \udcff"))
    tab\there, bell\x07, line\u2028end, \udcff
    >>> one_line("plain, with ünïcödé, ³ and spaces")
    'plain, with ünïcödé, ³ and spaces'
    """
    text = str(text)
    if text.isprintable():
        return text
    return "".join(ch if ch.isprintable() else _escape(ch) for ch in text)


class RevolveError(ValueError):
    """Base of every error caused by input; renders as one plain line.

    Parameters
    ----------
    message : str
        What is wrong and what to do, one sentence.
    file, line, place : optional
        Where in the input: file name, line number, and a description such
        as ``"loop 1, segment 3"`` or a key of the file.
    option : str, optional
        The command-line option the error is about, such as ``"--density"``;
        rendered once, before everything else.

    Examples
    --------
    >>> print(MaterialError("unknown material 'Stahl'", option="--material"))
    --material: unknown material 'Stahl'
    >>> print(FormatError("cannot write the file", file="w.toml", option="--wall-output"))
    --wall-output: w.toml: cannot write the file
    """

    def __init__(self, message: str, *, file: str | None = None,
                 line: int | None = None, place: str | None = None,
                 option: str | None = None):
        super().__init__(message)
        self.message = message
        self.file = file
        self.line = line
        self.place = place
        self.option = option

    def located(self, *, file: str | None = None, line: int | None = None,
                place: str | None = None, option: str | None = None) -> "RevolveError":
        """Return a copy of this error with missing location details filled in.

        Details the error already has are kept; an option already named is not
        named twice.

        >>> e = ExpressionError("unknown name 'foo'").located(file="a.toml", line=3)
        >>> str(e)
        "a.toml:3: unknown name 'foo'"
        >>> e = UnitError("'gallon' is ambiguous").located(option="--volume-unit")
        >>> str(e.located(option="--volume-unit"))
        "--volume-unit: 'gallon' is ambiguous"
        """
        copy = type(self).__new__(type(self))
        copy.__dict__.update(self.__dict__)
        ValueError.__init__(copy, self.message)
        copy.file = self.file or file
        copy.line = self.line if self.line is not None else line
        copy.place = self.place or place
        copy.option = self.option or option
        if copy.option and copy.place == copy.option:
            copy.place = None
        return copy

    def __str__(self) -> str:
        where = ""
        if self.file:
            where = str(self.file) + (f":{self.line}" if self.line is not None else "")
        elif self.line is not None:
            where = f"line {self.line}"
        parts = [p for p in (self.option, where, self.place) if p]
        return one_line(": ".join([str(p) for p in parts] + [str(self.message)]))


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
