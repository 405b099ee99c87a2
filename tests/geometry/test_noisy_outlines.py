"""The self-intersection finder on noisy outlines against shapely (the outside reference).

Reference: shapely's ``LinearRing.is_simple`` and ``Polygon.is_valid`` (GEOS), a
separate implementation that shares no code with
:func:`revolve.geometry.checks.find_self_intersection`. The outlines are rings
with radial noise whose zigzags are hundreds of point spacings long, so that
every chord's box meets hundreds of others: the case the finder's block path
(blocks of chords kept apart by a direction across them) is for. Each check is
run with the block path forced on, forced off and chosen by the finder, and the
three must name the same pair. shapely is a test-only dependency.
"""

from __future__ import annotations

import numpy as np
import pytest

from revolve.errors import ProfileError
from revolve.geometry.checks import find_self_intersection, prepare
from revolve.geometry.profile import Axis, Loop, Profile

shapely = pytest.importorskip("shapely")


def noisy_star(n, seed, noise=0.5, part=1.0):
    """A seven-pointed star of radius about 20 with radial noise ±``noise`` (an invented shape),
    on the first ``part`` (0…1) of its outline only when ``part`` < 1: a scan noisy in places,
    whose chains are long where it is smooth and a chord or two where it is noisy."""
    rng = np.random.default_rng(seed)
    a = np.linspace(0.0, 2 * np.pi, n, endpoint=False)
    r = 20 + 2 * np.sin(7 * a) + np.where(a < 2 * np.pi * part, rng.uniform(-noise, noise, n), 0)
    return np.column_stack([r * np.cos(a), 50 + r * np.sin(a)])


def finder(xy, blocks):
    ring = np.vstack([xy, xy[:1]])
    size = float(np.hypot(*(ring.max(axis=0) - ring.min(axis=0))))
    return find_self_intersection([ring], [True], 1e-9 * size, blocks=blocks)


def all_three(xy):
    """The finder's answer with the block path chosen, forced on and forced off (all the same)."""
    got = {blocks: finder(xy, blocks) for blocks in (None, True, False)}
    assert got[None] == got[True] == got[False], got
    return got[None]


@pytest.mark.parametrize("n, seed", [(20_000, 0), (20_000, 1), (20_000, 2), (100_000, 0)])
def test_noisy_star_is_simple_as_shapely_says(n, seed):
    xy = noisy_star(n, seed)
    assert shapely.LinearRing(xy).is_simple and shapely.Polygon(xy).is_valid   # shapely: simple
    assert all_three(xy) is None


def planted_crossing(xy, i, j):
    """The outline with vertex ``i`` moved across to just beyond vertex ``j`` (radially):
    its two chords now cross the outline near ``j``."""
    out = xy.copy()
    centre = np.array([0.0, 50.0])
    out[i] = centre + (xy[j] - centre) * 1.05
    return out


@pytest.mark.parametrize("i, j", [(100, 130), (5000, 5040), (19_990, 10), (7000, 14_000)])
def test_planted_crossing_found_as_shapely_finds_it(i, j):
    xy = planted_crossing(noisy_star(20_000, 3), i, j)
    assert not shapely.LinearRing(xy).is_simple                # shapely: it crosses itself
    hit = all_three(xy)
    assert hit is not None
    _, ca, _, cb = hit
    assert {(i - 1) % len(xy), i} & {ca, cb}       # one of the moved vertex's two chords


def test_planted_crossing_agrees_with_shapely_on_many_outlines():
    # Random plants on small noisy stars (still zigzags hundreds of spacings long): the finder
    # says "crosses" exactly when shapely says "not simple".
    rng = np.random.default_rng(11)
    seen = {True: 0, False: 0}
    for trial in range(40):
        xy = noisy_star(3000, 100 + trial)
        if trial % 2:
            i = int(rng.integers(0, 3000))
            j = (i + int(rng.integers(2, 1500))) % 3000
            xy = planted_crossing(xy, i, j)
        simple = bool(shapely.LinearRing(xy).is_simple)
        seen[simple] += 1
        assert (all_three(xy) is None) == simple, trial
    assert seen[True] and seen[False]          # both answers met: the test can fail either way


def test_prepare_names_the_same_place_on_either_path(monkeypatch):
    # The message names the first pair: the block path changes nothing a user reads.
    from revolve.geometry import checks

    xy = planted_crossing(noisy_star(20_000, 4), 12_345, 12_400)
    profile = Profile(loops=(Loop.from_points(xy),))
    messages = []
    for blocks in (True, False):
        original = checks.find_self_intersection

        def forced(*args, _original=original, _blocks=blocks, **kwargs):
            return _original(*args, blocks=_blocks, **kwargs)

        monkeypatch.setattr(checks, "find_self_intersection", forced)
        with pytest.raises(ProfileError) as caught:
            prepare(profile, Axis.x())
        messages.append(str(caught.value))
        monkeypatch.setattr(checks, "find_self_intersection", original)
    assert messages[0] == messages[1]
    assert "intersects itself" in messages[0] and "loop 1, segment 1234" in messages[0]


def test_touching_within_tolerance_is_found_on_either_path():
    # A vertex moved onto a far chord's midpoint: a touch (shapely may see it a rounding error
    # off; the finder's tolerance counts it as touching, on both paths).
    xy = noisy_star(20_000, 5)
    out = xy.copy()
    out[8000] = (xy[9000] + xy[9001]) / 2
    assert all_three(out) is not None


@pytest.mark.parametrize("n, part", [(20_000, 0.5), (60_000, 0.15)])
def test_partly_noisy_outline_takes_the_block_path_and_agrees_with_shapely(n, part, monkeypatch):
    # Noise on half (or less) of the outline: the smooth stretch is a few long chains, the
    # noisy one chains of a chord or two whose boxes meet by the hundred. The finder takes the
    # block path there too (the box index's pairs grow as the square of the noisy stretch),
    # and says what shapely says, planted crossings in the noisy stretch and from either
    # stretch across the ring included, on either path.
    from revolve.geometry import checks

    taken = []
    original = checks._block_pairs

    def watched(*args, **kwargs):
        taken.append(True)
        return original(*args, **kwargs)

    monkeypatch.setattr(checks, "_block_pairs", watched)
    xy = noisy_star(n, 7, part=part)
    assert shapely.LinearRing(xy).is_simple                    # shapely: simple
    assert finder(xy, None) is None and taken                  # chosen, not forced
    assert all_three(xy) is None
    noisy_end = int(n * part)
    smooth = (noisy_end + n) // 2
    for i, j in ((noisy_end // 3, noisy_end // 3 + 40),         # within the noisy stretch
                 (smooth, (smooth + n // 2) % n),               # from the smooth one, across
                 (noisy_end // 2, (noisy_end // 2 + n // 2) % n)):   # from the noisy one, across
        bent = planted_crossing(xy, i, j)
        assert not shapely.LinearRing(bent).is_simple          # shapely: it crosses itself
        hit = all_three(bent)
        assert hit is not None and {(i - 1) % n, i} & {hit[1], hit[3]}
