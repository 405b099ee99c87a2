"""The self-intersection finder against a brute-force all-pairs test (the outside reference).

Reference: the textbook segment-intersection predicate — two segments meet when
each one's ends lie on opposite sides of the other's line, or an end lies on
the other segment (Cormen, Leiserson, Rivest & Stein, *Introduction to
Algorithms*, "Determining whether any pair of segments intersects",
SEGMENTS-INTERSECT with ON-SEGMENT; from memory) — applied to *every* pair of
non-adjacent chords, O(n²), in exact integer arithmetic with numpy. It shares
no code with :func:`revolve.geometry.checks.find_self_intersection`, which
picks its candidate pairs from monotone chains and tests them with a
tolerance.

The vertices lie on an integer grid (scaled by a power of two, so exactly):
vertical and level chords, collinear chords that overlap, chords that touch
end to middle, repeated points (zero-length chords) and back-and-forth runs
are all common. On such a grid two chords that do not meet are at least
1/(longest chord) apart, far beyond the finder's tolerance (1e-9 of the size),
so the exact answer and the finder's must be the same pair: the smallest
(path_a, chord_a, path_b, chord_b).
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st

from revolve.geometry import checks
from revolve.geometry.checks import find_self_intersection


def brute_force_first_meeting(paths, closed):
    """Every non-adjacent pair of chords by the exact integer predicate; the smallest that meets."""
    rows = []
    for k, (pts, c) in enumerate(zip(paths, closed)):
        for i in range(len(pts) - 1):
            rows.append((k, i, len(pts) - 1, c, *pts[i], *pts[i + 1]))
    if not rows:
        return None
    t = np.array([r[:3] + (int(r[3]),) for r in rows], dtype=np.int64)
    seg = np.array([r[4:] for r in rows], dtype=np.int64)
    path, idx, count, clo = t.T
    I, J = np.triu_indices(len(rows), k=1)
    same = path[I] == path[J]
    d = np.abs(idx[I] - idx[J])
    adjacent = same & ((d == 1) | ((clo[I] == 1) & (d == count[I] - 1)))
    I, J = I[~adjacent], J[~adjacent]
    p, q, r, s = seg[I, 0:2], seg[I, 2:4], seg[J, 0:2], seg[J, 2:4]

    def direction(a, b, c):        # cross product (b − a) × (c − a), exact in int64 here
        return (b[:, 0] - a[:, 0]) * (c[:, 1] - a[:, 1]) - (b[:, 1] - a[:, 1]) * (c[:, 0] - a[:, 0])

    def on_segment(a, b, c):       # c, collinear with a-b, lies within its box
        return ((np.minimum(a[:, 0], b[:, 0]) <= c[:, 0]) & (c[:, 0] <= np.maximum(a[:, 0], b[:, 0])) &
                (np.minimum(a[:, 1], b[:, 1]) <= c[:, 1]) & (c[:, 1] <= np.maximum(a[:, 1], b[:, 1])))

    d1, d2, d3, d4 = direction(r, s, p), direction(r, s, q), direction(p, q, r), direction(p, q, s)
    meet = ((((d1 > 0) & (d2 < 0)) | ((d1 < 0) & (d2 > 0))) &
            (((d3 > 0) & (d4 < 0)) | ((d3 < 0) & (d4 > 0))))
    meet |= ((d1 == 0) & on_segment(r, s, p)) | ((d2 == 0) & on_segment(r, s, q)) | \
        ((d3 == 0) & on_segment(p, q, r)) | ((d4 == 0) & on_segment(p, q, s))
    if not meet.any():
        return None
    pairs = [(int(path[a]), int(idx[a]), int(path[b]), int(idx[b])) for a, b in zip(I[meet], J[meet])]
    return min(pairs)


def run_finder(paths, closed, scale_exponent, few_pairs, chunk, block=0, deep=False):
    """The finder; ``block`` > 0 forces the block path with blocks of that many chords
    (``deep``: with every level of blocks of two there can be)."""
    scale = 2.0 ** scale_exponent
    chords = [np.asarray(p, dtype=float).reshape(-1, 2) * scale for p in paths]
    everything = np.concatenate(chords)
    size = float(np.hypot(*(everything.max(axis=0) - everything.min(axis=0)))) or scale
    saved = checks.FEW_PAIRS, checks.BLOCK, checks.FAN, checks.LEVEL_FROM
    checks.FEW_PAIRS = few_pairs          # 0: every pair of chains through the binary searches
    checks.BLOCK = block or checks.BLOCK
    if deep:
        checks.FAN, checks.LEVEL_FROM = 2, -1
    try:
        return find_self_intersection(chords, closed, 1e-9 * size, chunk=chunk,
                                      blocks=True if block else None)
    finally:
        checks.FEW_PAIRS, checks.BLOCK, checks.FAN, checks.LEVEL_FROM = saved


point = st.tuples(st.integers(0, 6), st.integers(0, 6))
steps = st.lists(st.tuples(st.integers(-1, 2), st.integers(-1, 2)), min_size=1, max_size=40)


@st.composite
def polyline(draw):
    """Random grid points, or a walk of small steps (long runs monotone in x and y)."""
    if draw(st.booleans()):
        pts = draw(st.lists(point, min_size=2, max_size=25))
    else:
        start = draw(point)
        walk = np.cumsum(np.array([start] + draw(steps)), axis=0)
        pts = [tuple(int(v) for v in row) for row in walk]
    if draw(st.booleans()):
        return pts + [pts[0]], True
    return pts, False


@settings(max_examples=300, deadline=None)
@given(st.lists(polyline(), min_size=1, max_size=3), st.integers(-3, 3), st.sampled_from([0, 16]),
       st.sampled_from([3, 500_000]))
# Degenerate cases, each found by the brute force and needing the finder's special handling:
@example([([(0, 0), (0, 2), (0, 1), (0, 3)], False)], 0, 16, 500_000)     # vertical back-and-forth
@example([([(0, 0), (4, 0), (4, 1), (2, 0), (1, 0)], False)], 0, 0, 3)    # collinear overlap, far apart
@example([([(0, 0), (4, 0), (4, 1), (2, 1), (2, 0)], False)], 0, 0, 500_000)   # end touches a middle
@example([([(0, 0), (1, 0), (1, 0), (2, 0), (2, 1)], False)], 0, 16, 500_000)  # zero-length chord
@example([([(0, 0), (1, 1), (1, 1), (1, 1), (0, 0)], True)], -3, 0, 3)   # a run of repeated points
@example([([(0, 0), (3, 0)], False), ([(3, 0), (3, 2)], False)], 0, 16, 500_000)  # paths share an end
@example([([(0, 0), (1, 0), (2, 0), (3, 0), (4, 0), (5, 0), (5, 1), (3, 1), (3, 0)], False)],
         0, 0, 3)                                                          # a long chain, searched
@example([([(0, 0), (1, 1), (2, 2), (3, 3), (3, 1), (6, 1)], False)], 2, 0, 500_000)
# Repeated points in a later path (its chords of no length are numbered after the first path's):
@example([([(10, 10), (11, 10), (12, 10), (13, 10)], False),
          ([(0, 0), (1, 1), (1, 1), (1, 1), (0, 0)], True)], 0, 16, 500_000)
@example([([(6, 6), (6, 5), (6, 4)], False), ([(0, 0), (2, 0), (2, 0), (2, 0), (1, 0)], False)],
         0, 0, 500_000)
def test_finder_agrees_with_brute_force_all_pairs(paths, scale_exponent, few_pairs, chunk):
    expected = brute_force_first_meeting([p for p, _ in paths], [c for _, c in paths])
    got = run_finder([p for p, _ in paths], [c for _, c in paths], scale_exponent, few_pairs, chunk)
    assert got == expected


@settings(max_examples=300, deadline=None)
@given(st.lists(polyline(), min_size=1, max_size=3), st.integers(-3, 3), st.sampled_from([3, 500_000]),
       st.sampled_from([1, 2, 3, 8]), st.booleans())
@example([([(0, 0), (0, 2), (0, 1), (0, 3)], False)], 0, 500_000, 1, True)   # vertical back-and-forth
@example([([(0, 0), (4, 0), (4, 1), (2, 0), (1, 0)], False)], 0, 3, 2, False)   # collinear overlap
@example([([(0, 0), (4, 0), (4, 1), (2, 1), (2, 0)], False)], 0, 500_000, 2, True)   # end on a middle
@example([([(0, 0), (1, 1), (1, 1), (1, 1), (0, 0)], True)], -3, 3, 1, True)   # repeated points
@example([([(6, 6), (6, 5), (6, 4)], False), ([(0, 0), (2, 0), (2, 0), (2, 0), (1, 0)], False)],
         0, 500_000, 3, False)                                            # blocks across two paths
def test_block_path_agrees_with_brute_force_all_pairs(paths, scale_exponent, chunk, block, deep):
    # The block path (blocks of `block` chords, kept apart by directions across them; `deep`:
    # in every level of blocks of two blocks there can be) forced on every outline in place of
    # the chains' box index: the same first pair as the brute force.
    expected = brute_force_first_meeting([p for p, _ in paths], [c for _, c in paths])
    got = run_finder([p for p, _ in paths], [c for _, c in paths], scale_exponent, 16, chunk, block,
                     deep)
    assert got == expected


@pytest.mark.parametrize("index", ["x", "y", "grid"])
def test_every_chain_index_gives_the_brute_force_answer(index):
    # A staircase against a zigzag: many chains, many overlapping chain boxes.
    rng = np.random.default_rng(7)
    stair = np.cumsum(rng.integers(0, 3, size=(60, 2)), axis=0)
    zig = np.column_stack([np.arange(40), 20 + 15 * (np.arange(40) % 2)])
    expected = brute_force_first_meeting([stair.tolist(), zig.tolist()], [False, False])
    assert expected is not None          # the test can fail: they do cross
    size = float(np.hypot(*(np.vstack([stair, zig]).max(0) - np.vstack([stair, zig]).min(0))))
    got = find_self_intersection([stair.astype(float), zig.astype(float)], [False, False],
                                 1e-9 * size, index=index)
    assert got == expected
