"""Large profiles (10⁴ vertices) against shapely: the washers and the self-intersection test.

References (reference library: shapely):

* ``Polygon.area`` and ``Polygon.centroid`` with Pappus–Guldinus V = 2π ȳ A
  (Stewart, *Calculus*, "Moments and centers of mass", from memory) for the
  washer volume of the independent cross-check;
* ``LinearRing.is_simple`` / ``Polygon.is_valid`` for the self-intersection
  test, and ``LineString.intersects`` for the pair of edges it names.

The outlines are a 10⁴-gon approximating a circle (a torus section), a smooth
wavy ring, and a noisy ring whose zigzags are far longer along the axis than
the spacing of its points (so each slice crosses hundreds of edges). Nothing
here is timed.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from shapely.geometry import LinearRing, LineString, Polygon

from revolve.geometry.checks import RELATIVE_TOLERANCE, find_self_intersection, prepare
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Loop, Profile, Revolution
from revolve.geometry.slicing import first_partition, piece_table, washer_volume

N = 10_000


def torus_section(n=N, R=50.0, r=20.0):
    """A regular n-gon of circumradius r about (0, R): a torus section about the x axis."""
    a = np.linspace(0.0, 2 * math.pi, n, endpoint=False)
    return np.column_stack([r * np.cos(a), R + r * np.sin(a)])


def wavy_ring(n=N, noise=0.0, seed=1):
    """A star-shaped (hence simple) ring about (0, 50): radius 20 + 2 sin 7a + noise."""
    rng = np.random.default_rng(seed)
    a = np.linspace(0.0, 2 * math.pi, n, endpoint=False)
    rad = 20 + 2 * np.sin(7 * a) + rng.uniform(-noise, noise, n)
    return np.column_stack([rad * np.cos(a), 50 + rad * np.sin(a)])


def pappus_volume_by_shapely(pts):
    poly = Polygon(pts)
    assert poly.is_valid
    return 2 * math.pi * poly.centroid.y * poly.area


def crosscheck_volume(pts):
    m = measure(Revolution(Profile(loops=(Loop.from_points(pts.tolist()),)), Axis.x()))
    return m.crosscheck.volume, m.crosscheck.volume_error, m


@pytest.mark.parametrize("name,pts", [("torus 10⁴-gon", torus_section()),
                                      ("smooth wavy ring", wavy_ring()),
                                      ("noisy ring", wavy_ring(noise=0.5))])
def test_washers_on_large_polygons_agree_with_shapely_and_pappus(name, pts):
    ref = pappus_volume_by_shapely(pts)
    v, err, m = crosscheck_volume(pts)
    assert abs(v - ref) <= 1e-11 * ref, name
    assert err <= 1e-9 * ref, name
    # and the closed forms agree with the same outside reference
    assert abs(m.volume - ref) <= 1e-11 * ref, name


def test_noisy_ring_is_sliced_coarser_than_its_vertices_with_the_same_volume():
    # noisy ring: the slices at every vertex would cut ~10⁶ (piece, interval) pairs; the first
    # partition keeps fewer ends, and the volume still matches shapely + Pappus.
    pts = wavy_ring(noise=0.5)
    prep = prepare(Profile(loops=(Loop.from_points(pts.tolist()),)), Axis.x())
    table = piece_table(prep, [1.0])
    edges = first_partition(table)
    assert edges.size < np.unique(np.concatenate([table.lo, table.hi])).size
    v, err = washer_volume(prep, [-1.0 if _clockwise(pts) else 1.0], 2 * math.pi)
    ref = pappus_volume_by_shapely(pts)
    assert abs(v - ref) <= 1e-11 * ref


def _clockwise(pts):
    return not LinearRing(pts).is_ccw


def test_straight_outline_is_cut_into_equal_slices():
    # Straight edges take an exact rule on any part of a slice, so the first partition cuts
    # the axis into equal slices (a power of two of them, at most one per 2^EXACT_SLICE_SHIFT
    # pieces), found without a sort; every piece's run of slices holds both its ends. The
    # volume is checked against shapely + Pappus above.
    from revolve.geometry.slicing import EXACT_SLICE_SHIFT, _partition

    prep = prepare(Profile(loops=(Loop.from_points(torus_section().tolist()),)), Axis.x())
    table = piece_table(prep, [1.0])
    edges, [(start, first, count)] = _partition(table)
    slices = edges.size - 1
    assert slices & (slices - 1) == 0 and 1 < slices <= table.count >> EXACT_SLICE_SHIFT
    assert edges[0] == table.lo.min() and edges[-1] == table.hi.max()
    width = np.diff(edges)
    assert np.all(np.abs(width - width.mean()) <= 1e-12 * width.mean())
    last = first + count - 1
    assert start == 0 and np.all(count >= 1)
    assert np.all((edges[first] <= table.lo) & (table.lo <= edges[first + 1]))
    assert np.all((edges[last] <= table.hi) & (table.hi <= edges[last + 1]))


def test_slice_of_each_position_matches_a_binary_search():
    # Reference: numpy.searchsorted over the slice edges (a binary search, no arithmetic),
    # on positions at the edges, one spacing either side of them, and between them.
    from revolve.geometry.slicing import _cells

    z_lo, z_hi, slices = 0.1, 0.1 + 0.3 * 1024, 1024
    edges = z_lo + (z_hi - z_lo) / slices * np.arange(slices + 1)
    edges[-1] = z_hi
    rng = np.random.default_rng(5)
    z = np.concatenate([edges, np.nextafter(edges, np.inf), np.nextafter(edges, -np.inf),
                        rng.uniform(z_lo, z_hi, 5000)])
    z = np.clip(z, z_lo, z_hi)
    expected = np.minimum(np.searchsorted(edges, z, side="right") - 1, slices - 1)
    assert _cells(z, z_lo, slices / (z_hi - z_lo), edges).tolist() == expected.tolist()


def test_straight_outline_too_short_for_equal_slices_is_sliced_at_its_piece_ends():
    # Far along the axis, 10⁻³ long: equal slices would be narrower than 2²⁰ spacings of the
    # coordinates, so the partition keeps every 2^EXACT_SLICE_SHIFT-th piece end instead;
    # the washers still agree with the closed forms (Pappus), themselves checked above, as
    # far as positions that carry only about seven digits of the extent allow.
    from revolve.geometry.slicing import EXACT_SLICE_SHIFT

    pts = torus_section(R=2.0, r=1e-3) + [1e9, 0.0]
    prep = prepare(Profile(loops=(Loop.from_points(pts.tolist()),)), Axis.x())
    table = piece_table(prep, [1.0])
    ends = np.unique(np.concatenate([table.lo, table.hi]))
    step = 2 ** EXACT_SLICE_SHIFT
    edges = first_partition(table)
    assert edges.tolist() == ends[::step].tolist() + ([ends[-1]] if (ends.size - 1) % step else [])
    m = measure(Revolution(Profile(loops=(Loop.from_points(pts.tolist()),)), Axis.x()))
    assert abs(m.crosscheck.volume - m.volume) <= 1e-6 * m.volume


def test_outline_of_arcs_is_sliced_at_every_piece_end():
    # Arcs are integrated by two compared rules and halved where they disagree: a smooth
    # outline of arcs keeps every piece end as a slice end (the partition is not coarsened).
    from revolve.geometry.segments import Line, arc_from_centre

    bumps = [arc_from_centre((2.0 * i, 30.0), (2.0 * (i + 1), 30.0), (2.0 * i + 1.0, 29.0),
                             clockwise=True) for i in range(40)]
    loop = Loop(tuple(bumps) + (Line((80.0, 30.0), (80.0, 10.0)), Line((80.0, 10.0), (0.0, 10.0)),
                                Line((0.0, 10.0), (0.0, 30.0))))
    table = piece_table(prepare(Profile(loops=(loop,)), Axis.x()), [1.0])
    assert first_partition(table).size == np.unique(np.concatenate([table.lo, table.hi])).size == 41


# -- self-intersection ----------------------------------------------------------------------

def _chords(pts):
    return [np.vstack([pts, pts[:1]])]


def plant_crossing(pts, at):
    """Edge at+2 moved across edge at (P to Q): through its middle, perpendicular to it."""
    pts = pts.copy()
    p, q = pts[at], pts[at + 1]
    mid, d = (p + q) / 2, q - p
    normal = np.array([-d[1], d[0]]) / 4
    pts[at + 2], pts[at + 3] = mid + normal, mid - normal
    return pts


@pytest.mark.parametrize("noise", [0.0, 0.01, 0.5])
def test_clean_large_outline_has_no_self_intersection(noise):
    pts = wavy_ring(noise=noise)
    assert LinearRing(pts).is_simple
    size = float(np.hypot(*(pts.max(axis=0) - pts.min(axis=0))))
    assert find_self_intersection(_chords(pts), [True], RELATIVE_TOLERANCE * size) is None


@pytest.mark.parametrize("noise", [0.0, 0.01, 0.5])
@pytest.mark.parametrize("at", [17, 5003, 9990])
def test_planted_crossing_in_a_large_outline_is_found(noise, at):
    pts = plant_crossing(wavy_ring(noise=noise), at)
    ring = LinearRing(pts)
    assert not ring.is_simple
    size = float(np.hypot(*(pts.max(axis=0) - pts.min(axis=0))))
    hit = find_self_intersection(_chords(pts), [True], RELATIVE_TOLERANCE * size)
    assert hit is not None
    pa, ca, pb, cb = hit
    assert (pa, pb) == (0, 0) and ca < cb and abs(ca - cb) > 1
    n = len(pts)
    ea = LineString([pts[ca], pts[(ca + 1) % n]])
    eb = LineString([pts[cb], pts[(cb + 1) % n]])
    assert ea.intersects(eb)
    assert at - 10 <= ca <= at + 10


def test_planted_crossing_is_named_by_prepare():
    pts = plant_crossing(wavy_ring(), 400)
    from revolve.errors import ProfileError

    with pytest.raises(ProfileError, match="the profile intersects itself: this segment meets loop 1, "
                                           "segment 403"):
        prepare(Profile(loops=(Loop.from_points(pts.tolist()),)), Axis.x())


def test_touching_chains_count_within_the_tolerance():
    # Two chains, one ending within the tolerance of the other's middle (touching counts),
    # and a third well clear: shapely's LineString.distance says which pairs touch.
    a = np.column_stack([np.linspace(0, 10, 5001), np.full(5001, 1.0)])
    b = np.column_stack([np.full(2001, 5.0001), np.linspace(1.0 + 5e-10, 3.0, 2001)])
    c = np.column_stack([np.linspace(0, 10, 3001), np.full(3001, 4.0)])
    tol = 1e-9 * 10
    assert LineString(a).distance(LineString(b)) <= tol
    assert LineString(a).distance(LineString(c)) > tol
    hit = find_self_intersection([a, b, c], [False, False, False], tol)
    assert hit is not None and (hit[0], hit[2]) == (0, 1)
    assert find_self_intersection([a, c], [False, False], tol) is None


@settings(max_examples=60, deadline=None)
@given(st.integers(0, 2 ** 32 - 1), st.integers(4, 200), st.booleans(), st.sampled_from(["random", "ring"]))
def test_every_candidate_index_agrees_with_shapely_is_simple(seed, n, closed, shape):
    # Random points (crossings everywhere) or a noisy ring (crossings rare): with the chains'
    # boxes paired by the x sweep, the y sweep or the grid, the finder must find a crossing
    # exactly when shapely's is_simple says
    # the line is not simple (touching within 1e-12 does not occur with these random points).
    rng = np.random.default_rng(seed)
    if shape == "random":
        pts = rng.normal(size=(n, 2))
    else:
        a = np.sort(rng.uniform(0.0, 2 * math.pi, n))
        pts = np.column_stack([np.cos(a), np.sin(a)]) * (1 + rng.uniform(-0.2, 0.2, (n, 1)))
    line = LinearRing(pts) if closed else LineString(pts)
    chord = np.vstack([pts, pts[:1]]) if closed else pts
    answers = {ix: find_self_intersection([chord], [closed], 1e-12, index=ix)
               for ix in ("x", "y", "grid", None)}
    assert len(set(answers.values())) == 1, answers
    assert (answers[None] is None) == line.is_simple


@pytest.mark.parametrize("noise", [0.0, 0.5])
def test_polygon_moments_of_a_large_outline_agree_with_shapely(noise):
    # polygon_moments (summed without BLAS) against shapely's Polygon.area, .centroid, .length.
    from revolve.geometry.integrals import COL, polygon_moments

    pts = wavy_ring(noise=noise)
    poly = Polygon(pts)
    v = polygon_moments(pts[:, 0], pts[:, 1])
    assert abs(v[COL["M00"]] - poly.area) <= 1e-13 * poly.area
    assert abs(v[COL["M10"]] / v[COL["M00"]] - poly.centroid.x) <= 1e-12 * 50
    assert abs(v[COL["M01"]] / v[COL["M00"]] - poly.centroid.y) <= 1e-12 * 50
    assert abs(v[COL["length"]] - poly.length) <= 1e-12 * poly.length
