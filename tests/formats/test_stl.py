"""Binary STL files written by revolve.formats.stl, read back by an independent reader.

References, named beside each check:

* reference library trimesh (``trimesh.load``, ``.volume``, ``.area``,
  ``.is_watertight``, ``.face_normals``) reading the files we write;
* the binary STL layout (80-byte header, little-endian uint32 count, 50 bytes
  a triangle: normal, three corners as float32, a uint16 attribute) — common
  practice, no source; decoded here with the standard library's ``struct``;
* CRC *Standard Mathematical Tables and Formulae* (from memory) for the torus;
* 1 in = 25.4 mm (international yard and pound agreement, 1959).
"""

from __future__ import annotations

import math
import os
import struct

import numpy as np
import pytest
import trimesh

from revolve.errors import FormatError
from revolve.formats.stl import STL_RECORD, read_stl, stl_bytes, write_stl
from revolve.geometry.mesh import revolve_mesh
from revolve.geometry.profile import Axis, Loop, Profile, Revolution
from revolve.geometry.segments import arc_from_centre

TETRA_V = np.array([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1]], dtype=float)
TETRA_T = np.array([[0, 2, 1], [0, 1, 3], [0, 3, 2], [1, 2, 3]])


def torus(R=3.0, r=1.0, degrees=360.0):
    c = Loop((arc_from_centre((r, R), (-r, R), (0.0, R), False, face="tube"),
              arc_from_centre((-r, R), (r, R), (0.0, R), False, face="tube")))
    return Revolution(Profile(loops=(c,)), Axis.x(), degrees)


def test_layout_decoded_with_struct(tmp_path):
    path = tmp_path / "tetra.stl"
    write_stl(str(path), TETRA_V, TETRA_T, header="tetrahedron, unit mm")
    data = path.read_bytes()
    assert len(data) == 80 + 4 + 50 * 4
    assert data[:80].rstrip(b" ") == b"tetrahedron, unit mm"
    (count,) = struct.unpack_from("<I", data, 80)
    assert count == 4
    for k, tri in enumerate(TETRA_T):
        rec = struct.unpack_from("<12fH", data, 84 + 50 * k)
        normal, corners, attribute = rec[:3], np.array(rec[3:12]).reshape(3, 3), rec[12]
        assert attribute == 0
        assert np.array_equal(corners, TETRA_V[tri])
        n = np.cross(corners[1] - corners[0], corners[2] - corners[0])
        assert np.allclose(normal, n / np.linalg.norm(n), atol=1e-7)


def test_header_never_starts_with_solid():
    # A binary file whose header begins "solid" is taken for text by some readers
    # (common practice, no source).
    data = stl_bytes(TETRA_V, TETRA_T, header="solid part")
    assert not data[:5].lower().startswith(b"solid")
    assert len(data[:80]) == 80


def test_trimesh_reads_a_closed_tetrahedron(tmp_path):
    path = str(tmp_path / "tetra.stl")
    write_stl(path, TETRA_V, TETRA_T)
    tm = trimesh.load(path)
    assert tm.is_watertight and tm.is_winding_consistent
    assert math.isclose(tm.volume, 1 / 6, rel_tol=1e-7)    # a corner of the unit cube
    assert np.allclose(tm.face_normals, read_stl(path)["normal"], atol=1e-6)


def test_revolved_torus_through_a_file_converges(tmp_path):
    # CRC (from memory): V = 2π² R r², S = 4π² R r. The STL, read by trimesh, approaches
    # both as the chord tolerance shrinks, the error about in proportion to it.
    rev = torus()
    exact_v, exact_s = 2 * math.pi ** 2 * 3, 4 * math.pi ** 2 * 3
    tolerances = (0.04, 0.01, 0.0025)
    errs = []
    for tol in tolerances:
        mesh = revolve_mesh(rev, tol)
        path = str(tmp_path / f"torus-{tol}.stl")
        write_stl(path, mesh.vertices, mesh.triangles, header="torus, unit mm")
        tm = trimesh.load(path)
        assert tm.is_watertight and tm.is_winding_consistent and tm.volume > 0
        assert len(tm.faces) == len(mesh.triangles)
        errs.append((abs(tm.volume - exact_v) / exact_v, abs(tm.area - exact_s) / exact_s))
    errs = np.array(errs)
    for col in (0, 1):
        assert np.all(np.diff(errs[:, col]) < 0)
        ratio = errs[:, col] / np.array(tolerances)
        assert ratio.max() / ratio.min() < 2.0


def test_scale_changes_the_unit(tmp_path):
    # 1 in = 25.4 mm (1959 agreement): a mesh in mm written in inches has its volume
    # divided by 25.4³.
    mesh = revolve_mesh(torus(30.0, 10.0), 0.05)
    mm, inch = str(tmp_path / "mm.stl"), str(tmp_path / "in.stl")
    write_stl(mm, mesh.vertices, mesh.triangles)
    write_stl(inch, mesh.vertices, mesh.triangles, scale=1 / 25.4)
    assert math.isclose(trimesh.load(inch).volume * 25.4 ** 3, trimesh.load(mm).volume, rel_tol=1e-5)


def test_float32_precision_is_enough():
    # Corners are stored as float32: the volume of the stored mesh stays within 1e-6.
    mesh = revolve_mesh(torus(), 0.01)
    rec = np.frombuffer(stl_bytes(mesh.vertices, mesh.triangles)[84:], dtype=STL_RECORD)
    c = rec["corners"].astype(float)
    vol = np.einsum("ij,ij->i", c[:, 0], np.cross(c[:, 1], c[:, 2])).sum() / 6
    assert math.isclose(vol, mesh.volume(), rel_tol=1e-6)


# -- atomic writes and bad files --------------------------------------------------------------

def test_missing_folder_writes_nothing(tmp_path):
    target = tmp_path / "no" / "part.stl"
    with pytest.raises(FormatError, match="cannot write the file"):
        write_stl(str(target), TETRA_V, TETRA_T)
    assert not (tmp_path / "no").exists()


def test_failure_leaves_the_old_file_and_no_leftovers(tmp_path):
    path = tmp_path / "part.stl"
    write_stl(str(path), TETRA_V, TETRA_T)
    before = path.read_bytes()
    bad = TETRA_V.copy()
    bad[1, 0] = np.nan
    with pytest.raises(FormatError, match="not a finite number"):
        write_stl(str(path), bad, TETRA_T)
    assert path.read_bytes() == before
    assert sorted(os.listdir(tmp_path)) == ["part.stl"]


def test_overwrite_replaces_the_whole_file(tmp_path):
    path = tmp_path / "part.stl"
    path.write_bytes(b"x" * 5000)
    write_stl(str(path), TETRA_V, TETRA_T)
    assert path.stat().st_size == 84 + 200
    assert sorted(os.listdir(tmp_path)) == ["part.stl"]


@pytest.mark.parametrize("content", [b"", b"solid x\nendsolid x\n", b"\0" * 80 + b"\x05\0\0\0" + b"\0" * 50])
def test_reader_refuses_what_is_not_binary_stl(tmp_path, content):
    path = tmp_path / "bad.stl"
    path.write_bytes(content)
    with pytest.raises(FormatError, match="not a binary STL file"):
        read_stl(str(path))
