"""Reading and writing the text of profile files, with plain one-line errors.

Readers get their text through :func:`read_text`, which turns every way a
file can be unusable (missing, a folder, unreadable, not UTF-8, empty) into a
:class:`~revolve.errors.FormatError` naming the file. Writers go through
:func:`write_text_atomically`, which writes a temporary file beside the
target and renames it into place, so a failure never leaves half a file.

Examples
--------
>>> import os, tempfile
>>> folder = tempfile.mkdtemp()
>>> target = os.path.join(folder, "a.txt")
>>> write_text_atomically(target, "0,1\\n1,1\\n")
>>> read_text(target)
'0,1\\n1,1\\n'
>>> sorted(os.listdir(folder))
['a.txt']
"""

from __future__ import annotations

import os
import tempfile

from revolve.errors import FormatError


def read_text(path: str) -> str:
    """Return the text of ``path`` decoded as UTF-8 (a leading byte-order mark is dropped).

    Parameters
    ----------
    path : str
        The file name as the user gave it; it is used unchanged in messages.

    Returns
    -------
    str
        The text, with Windows line ends left as they are.

    Raises
    ------
    FormatError
        When the file is missing, is a folder, cannot be read, is not UTF-8
        text, holds NUL bytes (a binary file) or is empty.

    Examples
    --------
    >>> read_text("no/such/file.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no/such/file.toml: no such file; check the name and folder
    >>> import tempfile
    >>> with tempfile.NamedTemporaryFile("wb", suffix=".txt", delete=False) as f:
    ...     _ = f.write(b"\\xff\\xfe1,2")
    >>> read_text(f.name)  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: ...: the file is not UTF-8 text (byte 0xff at offset 0); save it as UTF-8
    """
    try:
        with open(path, "rb") as handle:
            data = handle.read()
    except FileNotFoundError:
        raise FormatError("no such file; check the name and folder", file=path) from None
    except IsADirectoryError:
        raise FormatError("this is a folder, not a profile file", file=path) from None
    except PermissionError:
        raise FormatError("permission denied; the file cannot be read", file=path) from None
    except OSError as exc:
        raise FormatError(f"the file cannot be read ({exc.strerror or exc})", file=path) from None
    if data.startswith(b"\xef\xbb\xbf"):
        data = data[3:]
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError as exc:
        raise FormatError(f"the file is not UTF-8 text (byte 0x{data[exc.start]:02x} at offset "
                          f"{exc.start}); save it as UTF-8", file=path) from None
    if "\x00" in text:
        raise FormatError("the file holds NUL bytes; it is a binary file, not text", file=path)
    if not text.strip():
        raise FormatError("the file is empty", file=path)
    return text


def write_atomically(path: str, write, binary: bool = False) -> None:
    """Write a file through a temporary file beside it and a rename.

    ``write(handle)`` writes the contents to an open handle (text as UTF-8, or
    bytes with ``binary=True``). Either the whole new file is in place
    afterwards or the old one (if any) is untouched; the temporary file is
    removed on failure. A replaced file keeps its permissions.

    >>> write_atomically("no/such/folder/x.bin", lambda h: h.write(b""), binary=True)
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no/such/folder/x.bin: cannot write the file (No such file or directory)
    """
    path = os.fspath(path)
    folder = os.path.dirname(os.path.abspath(path))
    try:
        fd, temporary = tempfile.mkstemp(prefix=".", suffix=".part", dir=folder)
    except OSError as exc:
        raise FormatError(f"cannot write the file ({exc.strerror or exc})", file=path) from None
    try:
        handle = os.fdopen(fd, "wb") if binary else os.fdopen(fd, "w", encoding="utf-8", newline="\n")
        with handle:
            write(handle)
            handle.flush()
            os.fsync(handle.fileno())
        if os.path.exists(path):
            mode = os.stat(path).st_mode & 0o7777
        else:
            umask = os.umask(0)
            os.umask(umask)
            mode = 0o666 & ~umask
        try:
            os.chmod(temporary, mode)
        except OSError:
            pass
        os.replace(temporary, path)
    except BaseException as exc:
        try:
            os.unlink(temporary)
        except OSError:
            pass
        if isinstance(exc, OSError):
            raise FormatError(f"cannot write the file ({exc.strerror or exc})", file=path) from None
        raise


def write_text_atomically(path: str, text: str) -> None:
    """Write ``text`` to ``path`` as UTF-8, atomically (see :func:`write_atomically`).

    >>> write_text_atomically("no/such/folder/x.toml", "")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no/such/folder/x.toml: cannot write the file (No such file or directory)
    """
    write_atomically(path, lambda handle: handle.write(text))


def write_bytes_atomically(path: str, data: bytes) -> None:
    """Write ``data`` to ``path``, atomically (see :func:`write_atomically`).

    >>> write_bytes_atomically("no/such/folder/part.stl", b"")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no/such/folder/part.stl: cannot write the file (No such file or directory)
    """
    write_atomically(path, lambda handle: handle.write(data), binary=True)
