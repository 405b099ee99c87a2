"""revolve.jobs.batch: many parts in input order, serial or in a pool, errors kept in their rows.

Check values come from a published formula: the volume of a hollow cylinder
(ring) π (R² − r²) h and its swept surface 2π (R + r) h + 2π (R² − r²) — CRC
Standard Mathematical Tables (from memory). Each ring of a batch has its own
sizes, so a row out of order or mixed with another fails its check.
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest

from revolve.cli.rows import JsonRow
from revolve.errors import RevolveError
from revolve.jobs import batch

ROOT = Path(__file__).resolve().parents[2]


def ring_text(inner: float, outer: float, length: float) -> str:
    """A rectangle x in [0, length], y in [inner, outer]: revolved about x, a ring (a point list)."""
    return f"0,{inner}\n{length},{inner}\n{length},{outer}\n0,{outer}\n"


def rings(folder: Path, count: int):
    """``count`` rings of different sizes as point lists, with their (R, r, h)."""
    out = []
    for k in range(count):
        inner, outer, length = 2 + k % 5, 9 + k % 7, 10 + k
        path = folder / f"ring-{k:03d}.txt"
        path.write_text(ring_text(inner, outer, length), encoding="utf-8")
        out.append((str(path), outer, inner, length))
    return out


def ring_volume(outer, inner, length):
    return math.pi * (outer ** 2 - inner ** 2) * length


def test_every_ring_matches_its_closed_form_in_order(tmp_path):
    parts = rings(tmp_path, 12)
    results = batch.measure_many([p for p, *_ in parts], units="mm")
    assert [r.file for r in results] == [p for p, *_ in parts]
    for r, (_, outer, inner, length) in zip(results, parts):
        assert r.ok, r.error
        m = r.value.measurement
        assert math.isclose(m.volume, ring_volume(outer, inner, length), rel_tol=1e-13)
        surface = 2 * math.pi * (outer + inner) * length + 2 * math.pi * (outer ** 2 - inner ** 2)
        assert math.isclose(m.surface_total, surface, rel_tol=1e-13)


def test_pool_gives_the_same_results_as_serial_in_input_order(tmp_path):
    parts = rings(tmp_path, 30)
    bundled = sorted(str(p) for p in (ROOT / "profiles").glob("*.toml"))
    paths = [p for p, *_ in parts] + bundled + [p for p, *_ in parts[:5]]  # repeats too
    row = JsonRow()
    serial = batch.measure_many(paths, units="mm", convert=row, workers=1)
    # A small chunk and threshold force the pool, with more chunks than are handed out at once.
    pooled = batch.run_many(batch.MeasureTask(units="mm", convert=row), paths, workers=2,
                            serial_below=2, chunk=3)
    assert [r.file for r in pooled] == paths
    assert pooled == serial
    for r, (_, outer, inner, length) in zip(pooled, parts):
        assert math.isclose(r.value["volume"], ring_volume(outer, inner, length), rel_tol=1e-13)


def test_a_bad_file_keeps_its_row_and_the_others(tmp_path):
    parts = rings(tmp_path, 6)
    broken = tmp_path / "broken.txt"
    broken.write_text("0,1\n2,1\n", encoding="utf-8")        # two points: no loop
    missing = str(tmp_path / "missing.txt")
    paths = [p for p, *_ in parts[:3]] + [str(broken), missing] + [p for p, *_ in parts[3:]]
    for workers, serial_below in ((1, 32), (2, 2)):
        results = batch.measure_many(paths, units="mm", workers=workers,
                                     serial_below=serial_below, convert=JsonRow())
        assert [r.ok for r in results] == [True] * 3 + [False, False] + [True] * 3
        assert str(broken) in results[3].error and "\n" not in results[3].error
        assert results[4].error == f"{missing}: no such file; check the name and folder"
        good = [r for r in results if r.ok]
        for r, (_, outer, inner, length) in zip(good, parts):
            assert math.isclose(r.value["volume"], ring_volume(outer, inner, length),
                                rel_tol=1e-13)


def test_progress_counts_every_part_serial_and_pooled(tmp_path):
    paths = [p for p, *_ in rings(tmp_path, 9)]
    for workers, serial_below in ((1, 32), (2, 2)):
        seen = []
        batch.measure_many(paths, units="mm", workers=workers, serial_below=serial_below,
                           progress=seen.append)
        assert sum(seen) == len(paths)


def test_settings_are_refused_once_before_any_file(tmp_path):
    # The library names its argument; the command line's path (iter_measure) its option.
    with pytest.raises(RevolveError, match="^units: 'litre'"):
        batch.measure_many([str(tmp_path / "never.txt")], units="litre")
    with pytest.raises(RevolveError, match="^--units: 'litre'"):
        batch.iter_measure([str(tmp_path / "never.txt")], units="litre")
    with pytest.raises(RevolveError, match="^--workers: "):
        batch.run_many(len, ["a"], workers=0)


def test_density_and_angle_settings_apply_to_every_part(tmp_path):
    # mass = ρ V; a quarter turn sweeps a quarter of the ring (Pappus, from memory)
    parts = rings(tmp_path, 3)
    results = batch.measure_many([p for p, *_ in parts], units="mm", angle=90.0,
                                 density=7850.0, density_label="7850 kg/m³ (given)")
    for r, (_, outer, inner, length) in zip(results, parts):
        volume = ring_volume(outer, inner, length) / 4
        assert math.isclose(r.value.measurement.volume, volume, rel_tol=1e-13)
        assert math.isclose(r.value.measurement.mass, 7850.0 * volume * 1e-9, rel_tol=1e-13)


def test_chunk_sizes_cover_every_item_once():
    for count in (1, 2, 7, 64, 1000, 5000):
        for workers in (1, 2, 3, 8):
            size = batch.chunk_size(count, workers)
            assert 1 <= size <= batch.LARGEST_CHUNK
            # common practice, no source: a few chunks per worker balance the load
            assert math.ceil(count / size) >= min(count, workers) or size == batch.LARGEST_CHUNK
