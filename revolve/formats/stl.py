"""Binary STL files: triangles for viewers, slicers and 3-D printers.

A binary STL file is an 80-byte header, a little-endian 32-bit triangle
count, and 50 bytes per triangle: the unit normal and the three corners as
32-bit floats, then a 16-bit "attribute byte count" (written as 0). The
corners of each triangle run counter-clockwise seen from outside. STL has no
unit; the header says which one the coordinates are in.

The header never begins with ``solid`` (that word marks the text form of
STL, and some readers would be misled). Files are written atomically: a
temporary file beside the target, then a rename, so a failure never leaves
half a file.

Examples
--------
>>> import os, tempfile
>>> folder = tempfile.mkdtemp()
>>> path = os.path.join(folder, "tetra.stl")
>>> v = np.array([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1]], dtype=float)
>>> t = np.array([[0, 2, 1], [0, 1, 3], [0, 3, 2], [1, 2, 3]])
>>> write_stl(path, v, t, header="tetrahedron, unit mm")
>>> os.path.getsize(path) == 84 + 50 * 4
True
>>> records = read_stl(path)
>>> records["normal"][0].tolist()
[0.0, 0.0, -1.0]
"""

from __future__ import annotations

from typing import Optional

import numpy as np

from revolve.errors import FormatError
from revolve.formats.files import write_bytes_atomically  # noqa: F401 (also used by callers)

#: One triangle of a binary STL file.
STL_RECORD = np.dtype([("normal", "<f4", (3,)), ("corners", "<f4", (3, 3)),
                       ("attribute", "<u2")])

HEADER_BYTES = 80


def stl_records(vertices: np.ndarray, triangles: np.ndarray) -> np.ndarray:
    """The STL records (structured array of :data:`STL_RECORD`) of a triangle mesh.

    Normals are computed from the corners (right-hand rule); a triangle with
    no area gets a zero normal.

    >>> r = stl_records(np.array([[0., 0, 0], [2, 0, 0], [0, 2, 0]]), np.array([[0, 1, 2]]))
    >>> r["normal"].tolist(), r["corners"][0, 1].tolist(), int(r["attribute"][0])
    ([[0.0, 0.0, 1.0]], [2.0, 0.0, 0.0], 0)
    >>> stl_records(np.zeros((0, 3)), np.zeros((0, 3), dtype=int)).size
    0
    """
    v = np.asarray(vertices, dtype=float)
    t = np.asarray(triangles, dtype=np.int64).reshape(-1, 3)
    corners = v[t]
    n = np.cross(corners[:, 1] - corners[:, 0], corners[:, 2] - corners[:, 0])
    length = np.linalg.norm(n, axis=1)
    n = n / np.where(length > 0, length, 1.0)[:, None]
    rec = np.zeros(len(t), dtype=STL_RECORD)
    rec["normal"] = n
    rec["corners"] = corners
    return rec


def _header_bytes(header: str) -> bytes:
    text = header.encode("ascii", "replace")[:HEADER_BYTES]
    if text[:5].lower() == b"solid":
        text = (b"binary " + text)[:HEADER_BYTES]
    return text.ljust(HEADER_BYTES, b" ")


def stl_bytes(vertices: np.ndarray, triangles: np.ndarray, header: str = "",
              scale: Optional[float] = None, file: Optional[str] = None) -> bytes:
    """The whole binary STL file as bytes.

    ``scale`` multiplies every coordinate first (a change of unit); ``file``
    is the name used in messages.

    >>> b = stl_bytes(np.eye(3), np.array([[0, 1, 2]]), header="solid part")
    >>> len(b), b[:12]
    (134, b'binary solid')
    >>> stl_bytes(np.eye(3), np.array([[0, 1, 2]]), scale=1e300, file="big.stl")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: big.stl: a mesh coordinate is larger than an STL file holds (3.4e+38); nothing written
    """
    v = np.asarray(vertices, dtype=float)
    if scale is not None:
        with np.errstate(over="ignore", invalid="ignore"):
            v = v * float(scale)
    if not np.all(np.isfinite(v)):
        raise FormatError("a mesh coordinate is not a finite number; nothing written", file=file)
    largest = float(np.finfo("<f4").max)
    if v.size and float(np.max(np.abs(v))) > largest:
        raise FormatError(f"a mesh coordinate is larger than an STL file holds ({largest:.3g}); "
                          f"nothing written", file=file)
    rec = stl_records(v, triangles)
    if len(rec) >= 2 ** 32:
        raise FormatError("too many triangles for an STL file (at most 4294967295)")
    return _header_bytes(header) + np.uint32(len(rec)).astype("<u4").tobytes() + rec.tobytes()


def write_stl(path: str, vertices: np.ndarray, triangles: np.ndarray, header: str = "",
              scale: Optional[float] = None) -> None:
    """Write a binary STL file atomically.

    Parameters
    ----------
    path : str
        Target file.
    vertices : ndarray, shape (n, 3)
        Corner coordinates.
    triangles : ndarray of int, shape (m, 3)
        Vertex numbers, counter-clockwise seen from outside.
    header : str
        Up to 80 ASCII characters (say the unit here).
    scale : float, optional
        Factor applied to every coordinate first (a change of unit).

    Examples
    --------
    >>> import os, tempfile
    >>> path = os.path.join(tempfile.mkdtemp(), "t.stl")
    >>> write_stl(path, np.eye(3), np.array([[0, 1, 2]]), header="unit in", scale=1 / 25.4)
    >>> bool(read_stl(path)["corners"][0, 0, 0] == np.float32(1 / 25.4))
    True
    """
    write_bytes_atomically(path, stl_bytes(vertices, triangles, header, scale=scale, file=path))


def read_stl(path: str) -> np.ndarray:
    """Read the records of a binary STL file (for checking what was written).

    >>> import tempfile
    >>> with tempfile.NamedTemporaryFile("wb", suffix=".stl", delete=False) as f:
    ...     _ = f.write(b"solid x" + b" " * 100 + b"endsolid x")
    >>> read_stl(f.name)  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: ...: not a binary STL file (its size does not match its triangle count)
    """
    try:
        with open(path, "rb") as handle:
            data = handle.read()
    except OSError as exc:
        raise FormatError(f"cannot read the file ({exc.strerror or exc})", file=path) from None
    if len(data) < HEADER_BYTES + 4:
        raise FormatError("not a binary STL file (shorter than its header)", file=path)
    count = int(np.frombuffer(data, "<u4", 1, HEADER_BYTES)[0])
    if len(data) != HEADER_BYTES + 4 + count * STL_RECORD.itemsize:
        raise FormatError("not a binary STL file (its size does not match its triangle count)",
                          file=path)
    return np.frombuffer(data, STL_RECORD, count, HEADER_BYTES + 4)
