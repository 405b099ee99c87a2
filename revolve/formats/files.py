"""Reading and writing the text of profile files, with plain one-line errors.

Readers get their text through :func:`read_text`, which turns every way a
file can be unusable (missing, a folder, unreadable, not UTF-8, empty) into a
:class:`~revolve.errors.FormatError` naming the file. Every writer goes
through one mechanism, :class:`OutputSet`: all the files a command writes are
first written to temporary files beside their targets and then moved into
place together, so a failure never leaves half a file, nor some of a
command's files without the others. :func:`write_text_atomically` and
:func:`write_bytes_atomically` are the one-file case.

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

import errno
import os
from dataclasses import dataclass
from typing import IO, Callable, Dict, List, Optional

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


def _cannot(path: str, number: int, option: Optional[str]) -> FormatError:
    return FormatError(f"cannot write the file ({os.strerror(number)})", file=path, option=option)


def check_target(path: str, option: Optional[str] = None, *, replace: bool = True) -> None:
    """Refuse, before anything is written, an output file name that cannot be written.

    The folder must exist and be writable, the name must be a file name (not
    a folder, not too long for the file system, no NUL character), and a file
    already there must be writable. Commands call this before their work;
    :class:`OutputSet` calls it again for every target before it writes any.

    Parameters
    ----------
    path : str
        The file name as the user gave it; it is used unchanged in messages.
    option : str, optional
        The command-line option that gave it, named in the message.
    replace : bool
        Whether a file already there may be replaced. Commands pass their
        ``--force`` flag (the one overwrite rule); the library replaces.

    Raises
    ------
    FormatError
        Naming the file (and the option) and saying why.

    Examples
    --------
    >>> check_target("no/such/folder/part.stl", option="--output")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --output: no/such/folder/part.stl: cannot write the file (No such file or directory)
    >>> import tempfile
    >>> check_target(tempfile.mkdtemp())  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: ...: cannot write the file (Is a directory)
    >>> check_target("")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no file name given
    """
    if not isinstance(path, str) or not path:
        raise FormatError("no file name given", option=option)
    if "\x00" in path:
        raise FormatError("a file name cannot hold a NUL character", file=path, option=option)
    folder = os.path.dirname(os.path.abspath(path))
    if not os.path.isdir(folder):
        parent = folder
        while parent and not os.path.exists(parent):
            up = os.path.dirname(parent)
            if up == parent:
                break
            parent = up
        number = errno.ENOTDIR if os.path.exists(parent) and not os.path.isdir(parent) else errno.ENOENT
        raise _cannot(path, number, option)
    if os.path.isdir(path):
        raise _cannot(path, errno.EISDIR, option)
    try:
        longest = os.pathconf(folder, "PC_NAME_MAX")
    except (OSError, ValueError, AttributeError):
        longest = 255
    if len(os.fsencode(os.path.basename(path))) > longest:
        raise _cannot(path, errno.ENAMETOOLONG, option)
    if not os.access(folder, os.W_OK | os.X_OK):
        raise _cannot(path, errno.EACCES, option)
    if not replace and os.path.lexists(path):
        raise FormatError("the file exists already; give --force to replace it", file=path,
                          option=option)
    if os.path.exists(path) and not os.access(path, os.W_OK):
        raise FormatError("the file is read-only; nothing was written", file=path, option=option)


@dataclass
class _Output:
    """One file of an output set: its target, writer and where it stands."""

    path: str
    write: Callable[[IO], object]
    binary: bool
    option: Optional[str]
    temporary: Optional[str] = None
    backup: Optional[str] = None
    moved: bool = False


class OutputSet:
    """Several output files written together: either all are in place afterwards, or none is.

    Add each output with :meth:`text`, :meth:`binary` or :meth:`add`; nothing
    touches the disk until :meth:`commit` (called on leaving a ``with`` block
    without an error). Commit first checks every target (:func:`check_target`,
    and no file named twice), then writes every output to a temporary file
    beside its target, and only when all of them are written moves them into
    place with :func:`os.replace`. On any failure the temporary files are
    removed and every target is left as it was: a file that was there keeps
    its old contents, a new name is not created. A replaced file keeps its
    permissions.

    Examples
    --------
    >>> import os, tempfile
    >>> folder = tempfile.mkdtemp()
    >>> good, bad = os.path.join(folder, "v.toml"), os.path.join(folder, "no", "w.toml")
    >>> with OutputSet() as out:
    ...     out.text(good, "name = 'vessel'\\n", option="--output")
    ...     out.text(bad, "name = 'wall'\\n", option="--wall-output")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --wall-output: .../no/w.toml: cannot write the file (No such file or directory)
    >>> os.listdir(folder)
    []
    >>> with OutputSet() as out:
    ...     out.text(good, "a\\n")
    ...     out.binary(os.path.join(folder, "m.stl"), b"\\x00")
    >>> sorted(os.listdir(folder))
    ['m.stl', 'v.toml']
    >>> with OutputSet() as out:
    ...     out.text(good, "b\\n")
    ...     out.text(os.path.join(folder, ".", "v.toml"), "c\\n", option="--csv")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --csv: ...v.toml: this file is given for two outputs; give another name
    """

    def __init__(self, *, replace: bool = True) -> None:
        self._outputs: List[_Output] = []
        self.replace = replace

    def __enter__(self) -> "OutputSet":
        return self

    def __exit__(self, kind, value, traceback) -> bool:
        if kind is None:
            self.commit()
        else:
            self._outputs = []
        return False

    def add(self, path: str, write: Callable[[IO], object], *, binary: bool = False,
            option: Optional[str] = None) -> None:
        """Add an output written by ``write(handle)`` (text as UTF-8, or bytes with ``binary``)."""
        self._outputs.append(_Output(os.fspath(path), write, binary, option))

    def text(self, path: str, text: str, *, option: Optional[str] = None) -> None:
        """Add a text output (UTF-8, ``\\n`` line ends)."""
        self.add(path, lambda handle: handle.write(text), option=option)

    def binary(self, path: str, data: bytes, *, option: Optional[str] = None) -> None:
        """Add a binary output."""
        self.add(path, lambda handle: handle.write(data), binary=True, option=option)

    def commit(self) -> None:
        """Check every target, write every temporary file, then move them all into place."""
        outputs, self._outputs = self._outputs, []
        seen: Dict[str, _Output] = {}
        for out in outputs:
            check_target(out.path, out.option, replace=self.replace)
            key = os.path.normcase(os.path.realpath(out.path))
            if key in seen:
                raise FormatError("this file is given for two outputs; give another name",
                                  file=out.path, option=out.option)
            seen[key] = out
        try:
            for out in outputs:
                _write_temporary(out)
            for out in outputs:
                if len(outputs) > 1 and os.path.lexists(out.path):
                    out.backup = _backup(out)
                _move(out)
        except BaseException:
            _roll_back(outputs)
            raise
        finally:
            for out in outputs:
                _remove(out.temporary)
        for out in outputs:
            _remove(out.backup)


def _folder(path: str) -> str:
    return os.path.dirname(os.path.abspath(path))


def _remove(name: Optional[str]) -> None:
    if name is not None:
        try:
            os.unlink(name)
        except OSError:
            pass


def _write_temporary(out: _Output) -> None:
    try:
        import tempfile     # only when writing: reading a file needs none of it

        fd, out.temporary = tempfile.mkstemp(prefix=".", suffix=".part", dir=_folder(out.path))
    except OSError as exc:
        raise _cannot(out.path, exc.errno or errno.EIO, out.option) from None
    try:
        handle = os.fdopen(fd, "wb") if out.binary else os.fdopen(fd, "w", encoding="utf-8",
                                                                  newline="\n")
        with handle:
            out.write(handle)
            handle.flush()
            os.fsync(handle.fileno())
        if os.path.exists(out.path):
            mode = os.stat(out.path).st_mode & 0o7777
        else:
            umask = os.umask(0)
            os.umask(umask)
            mode = 0o666 & ~umask
        try:
            os.chmod(out.temporary, mode)
        except OSError:
            pass
    except OSError as exc:
        raise FormatError(f"cannot write the file ({exc.strerror or exc})", file=out.path,
                          option=out.option) from None


def _backup(out: _Output) -> str:
    """A second name for the file now at the target, so that it can be put back."""
    import tempfile

    try:
        fd, name = tempfile.mkstemp(prefix=".", suffix=".old", dir=_folder(out.path))
        os.close(fd)
    except OSError as exc:
        raise _cannot(out.path, exc.errno or errno.EIO, out.option) from None
    try:
        os.unlink(name)
        os.link(out.path, name)
    except OSError:
        try:
            import shutil

            shutil.copy2(out.path, name)
        except OSError as exc:
            _remove(name)
            raise FormatError(f"cannot keep a copy of the file while replacing it "
                              f"({exc.strerror or exc})", file=out.path, option=out.option) from None
    return name


def _move(out: _Output) -> None:
    try:
        os.replace(out.temporary, out.path)
    except OSError as exc:
        raise FormatError(f"cannot write the file ({exc.strerror or exc})", file=out.path,
                          option=out.option) from None
    out.temporary = None
    out.moved = True


def _roll_back(outputs: List[_Output]) -> None:
    """Put back what was there before the outputs already moved into place."""
    for out in reversed(outputs):
        if not out.moved:  # its target was not touched: its second name is not needed
            _remove(out.backup)
            out.backup = None
            continue
        try:
            if out.backup is not None:
                os.replace(out.backup, out.path)
                out.backup = None
            else:
                os.unlink(out.path)
        except OSError:
            pass
        out.moved = False


def write_atomically(path: str, write, binary: bool = False, option: Optional[str] = None, *,
                     replace: bool = True) -> None:
    """Write one file through a temporary file beside it and a rename (an :class:`OutputSet` of one).

    ``write(handle)`` writes the contents to an open handle (text as UTF-8, or
    bytes with ``binary=True``). Either the whole new file is in place
    afterwards or the old one (if any) is untouched; the temporary file is
    removed on failure. A replaced file keeps its permissions.

    >>> write_atomically("no/such/folder/x.bin", lambda h: h.write(b""), binary=True)
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no/such/folder/x.bin: cannot write the file (No such file or directory)
    """
    with OutputSet(replace=replace) as out:
        out.add(path, write, binary=binary, option=option)


def write_text_atomically(path: str, text: str, option: Optional[str] = None, *,
                          replace: bool = True) -> None:
    """Write ``text`` to ``path`` as UTF-8, atomically (see :func:`write_atomically`).

    >>> write_text_atomically("no/such/folder/x.csv", "", option="--csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --csv: no/such/folder/x.csv: cannot write the file (No such file or directory)
    """
    write_atomically(path, lambda handle: handle.write(text), option=option, replace=replace)


def write_bytes_atomically(path: str, data: bytes, option: Optional[str] = None, *,
                           replace: bool = True) -> None:
    """Write ``data`` to ``path``, atomically (see :func:`write_atomically`).

    >>> write_bytes_atomically("no/such/folder/part.stl", b"")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no/such/folder/part.stl: cannot write the file (No such file or directory)
    """
    write_atomically(path, lambda handle: handle.write(data), binary=True, option=option,
                     replace=replace)
