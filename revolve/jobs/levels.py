"""Level tables: volume and wetted inside area against liquid level, and the inverse.

Works for any revolved profile, not only the vessels of :mod:`revolve.jobs.vessel`.

What the profile means for a level table
-----------------------------------------
The profile describes the **liquid space**, the inside of the vessel:

* a **closed loop** is space the liquid can fill. The usual drawing is one
  loop: the inside wall from the axis round to the axis, closed by a
  segment along the axis (this is what ``revolve vessel`` writes). A loop
  inside another is a hole (a central column, a pipe through the vessel).
* an **open chain** is the inside wall alone, drawn from the axis round to
  the axis; the liquid space is the region between the chain and the axis.
  Both its ends must lie on the axis.

The revolution must be a full turn. A profile of the *wall* (the metal
section) is not a liquid space: its table would be the metal's, not the
liquid's.

Orientation and level
---------------------
* **vertical**: the axis is vertical and its direction points up; the level
  is the height of the liquid surface above the lowest inside point,
  measured along the axis.
* **horizontal**: the axis is level; the level is the depth of liquid above
  the lowest inside point, which lies ``r_max`` below the axis (``r_max``:
  the largest inside radius). Full is ``2 r_max``.

The wetted area counts a flat face lying in the liquid's plane as wetted, so
at every level it equals its value a hair above: a flat bottom is wetted at
level 0 (lying down, the plane touches the shell along a line of no area).

A profile file says which with ``orientation = "vertical"`` or
``"horizontal"`` (``revolve vessel`` writes it); :func:`choose_orientation`
takes the one asked for, else the file's, and refuses to guess when
neither says.

Vertical volumes are exact (the section clipped at the level, then
Pappus–Guldinus, :mod:`revolve.geometry.clipping`); horizontal ones integrate
the wetted circular segment along the axis (:mod:`revolve.geometry.horizontal`),
in closed form for straight pieces and by Gauss–Legendre quadrature elsewhere,
with an error estimate per row. The inverse (level for a volume) solves the
forward table by bracketed regula falsi (Illinois) to 1e-13 of the capacity.

Capacity and level tables are geometry only; tables for custody transfer
need certified calibration.

Examples
--------
An upright cylinder of radius 1 and height 2 drawn as a chain from the
axis round to the axis:

>>> from revolve.geometry.profile import Axis, Chain, Profile
>>> wall = Chain.from_points([(0, 0), (1, 0), (1, 2), (0, 2)])
>>> space = liquid_space(Profile(chains=(wall,)), Axis.y(), orientation="vertical")
>>> round(space.capacity / math.pi, 12), space.height
(2.0, 2.0)
>>> table = level_table(space, levels_by_count(space, 4))
>>> [round(float(v) / math.pi, 12) for v in table.volume]
[0.0, 0.5, 1.0, 1.5, 2.0]
>>> [round(float(x), 12) for x in level_for_volume(space, [0.5 * math.pi]).level]
[0.5]
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Optional, Tuple

import numpy as np

from revolve.errors import ProfileError, RevolveError
from revolve.geometry.checks import PreparedProfile, prepare
from revolve.geometry.profile import Axis, Loop, Profile, Revolution
from revolve.geometry.segments import Line

ORIENTATIONS = ("vertical", "horizontal")
#: Most rows a table may have (a step far too small for the vessel is a mistake, not a wish).
MAX_ROWS = 200_000
#: Relative tolerance of the inverse, on the volume (of the capacity).
INVERSE_TOLERANCE = 1e-13


def choose_orientation(asked: Optional[str], written: Optional[str], *,
                       option: str = "orientation") -> Tuple[str, str]:
    """The orientation of a level table: the one asked for, else the file's; never a guess.

    Parameters
    ----------
    asked : str or None
        The orientation the user asked for (an option), if any.
    written : str or None
        The orientation the profile file gives, if any.
    option : str
        How the user asks for it, for messages (``"--orientation"``).

    Returns
    -------
    orientation : str
        ``"vertical"`` or ``"horizontal"``.
    source : str
        Where it came from, for the table: ``"from the file"``, ``"from
        --orientation"``, or, when the two differ, ``"from --orientation;
        the file says horizontal"`` (what was asked for wins).

    Raises
    ------
    RevolveError
        When neither says (at ``option``), or either is not an orientation.

    Examples
    --------
    >>> choose_orientation(None, "horizontal")
    ('horizontal', 'from the file')
    >>> choose_orientation("vertical", "horizontal", option="--orientation")
    ('vertical', 'from --orientation; the file says horizontal')
    >>> choose_orientation(None, None, option="--orientation")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --orientation: the profile does not say how the vessel stands; give --orientation vertical or horizontal (or write orientation = "vertical" or "horizontal" in the profile file)
    """
    for text in (asked, written):
        if text is not None and text not in ORIENTATIONS:
            raise RevolveError(f"give vertical or horizontal, got {text!r}", place=option)
    if asked is None and written is None:
        raise RevolveError(f"the profile does not say how the vessel stands; give {option} "
                           'vertical or horizontal (or write orientation = "vertical" or '
                           '"horizontal" in the profile file)', place=option)
    if asked is None:
        return written, "from the file"
    if written is None or written == asked:
        return asked, f"from {option}"
    return asked, f"from {option}; the file says {written}"


@dataclass(frozen=True)
class LiquidSpace:
    """A profile's liquid space, checked and ready for level tables (profile units).

    Attributes
    ----------
    profile : Profile
        The liquid space as closed loops (chains closed along the axis).
    axis : Axis
    orientation : str
        "vertical" or "horizontal".
    prepared : PreparedProfile
        The loops in the axis frame.
    factors : tuple of float
        Loop factors (solid +, hole -; see the clipping module).
    capacity : float
        Volume of the full space (Pappus–Guldinus).
    capacity_crosscheck : float
        Relative difference of the capacity from the engine's washer cross-check.
    inside_area : float
        Swept area of the whole inside boundary (the wetted area when full).
    height : float
        The full level: axial extent (vertical) or 2 r_max (horizontal).
    bottom : float
        Vertical: axial position (from the axis point) of the lowest inside
        point; horizontal: minus r_max (the lowest point's height from the axis).
    r_max : float
        Largest distance of the space from the axis.
    """

    profile: Profile
    axis: Axis
    orientation: str
    prepared: PreparedProfile
    factors: tuple
    capacity: float
    capacity_crosscheck: float
    inside_area: float
    height: float
    bottom: float
    r_max: float
    pieces: Any = None


def _close_chains(profile: Profile, axis: Axis) -> Profile:
    """The profile with each chain (ends on the axis) closed by a segment along the axis."""
    if not profile.chains:
        return profile
    prep = prepare(profile, axis)   # checks every path, gives the tolerance
    n_loops = len(profile.loops)
    loops = list(profile.loops)
    for k, chain in enumerate(profile.chains):
        frame = prep.paths[n_loops + k]
        start, end = frame[0].start, frame[-1].end
        for name, point, seg in (("starts", start, chain.segments[0]),
                                 ("ends", end, chain.segments[-1])):
            if abs(point[1]) > prep.tolerance:
                where = seg.where
                x, y = axis.from_frame(point[0], point[1], prep.side)
                raise ProfileError(
                    f"the chain {name} at ({x:.6g}, {y:.6g}), off the axis; for a level table a "
                    "chain is the inside wall drawn from the axis round to the axis (or give the "
                    "liquid space as a closed loop)",
                    file=where.file if where else profile.file,
                    line=where.line if where else None,
                    place=f"chain {k + 1}")
        closing = Line(chain.segments[-1].end, chain.segments[0].start)
        loops.append(Loop(tuple(chain.segments) + (closing,), where=chain.where))
    return Profile(loops=tuple(loops), unit=profile.unit, name=profile.name, file=profile.file)


def liquid_space(profile: Profile, axis: Axis, angle_degrees: float = 360.0,
                 orientation: str = "vertical") -> LiquidSpace:
    """Check a profile as a liquid space (see the module notes) and measure its capacity.

    Raises
    ------
    ProfileError
        A partial revolution, a chain with an end off the axis, or any
        problem :func:`revolve.geometry.checks.prepare` finds.
    RevolveError
        An unknown orientation.

    Examples
    --------
    >>> from revolve.geometry.profile import Chain
    >>> open_cup = Chain.from_points([(0, 0), (1, 0), (1, 2)])
    >>> liquid_space(Profile(chains=(open_cup,), file="cup.toml"), Axis.y())
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: cup.toml: chain 1: the chain ends at (1, 2), off the axis; for a level table a chain is the inside wall drawn from the axis round to the axis (or give the liquid space as a closed loop)
    """
    from revolve.geometry.clipping import axial_pieces
    from revolve.geometry.horizontal import horizontal_pieces
    from revolve.geometry.measure import measure

    if orientation not in ORIENTATIONS:
        raise RevolveError(f"the orientation must be vertical or horizontal, got {orientation!r}")
    try:
        angle = float(angle_degrees)
    except (TypeError, ValueError):
        angle = float("nan")
    if angle != 360.0:
        raise ProfileError(f"a level table needs a full revolution (360°), not {angle_degrees:g}°; "
                           "leave the angle out or make it 360", place="angle")
    closed = _close_chains(profile, axis)
    if not closed.loops:
        raise ProfileError("the profile has no closed loop or chain to hold liquid")
    m = measure(Revolution(closed, axis, 360.0), symbolic=False)
    prep = prepare(closed, axis)
    factors = prep.loop_factors
    if orientation == "vertical":
        pieces = axial_pieces(prep, factors)
        bottom, top = pieces.z_min, pieces.z_max
        r_max = horizontal_pieces(prep, factors).r_max
        height = top - bottom
    else:
        pieces = horizontal_pieces(prep, factors)
        r_max = pieces.r_max
        bottom, height = -r_max, 2.0 * r_max
    check = m.crosscheck.volume_difference if m.crosscheck is not None else float("nan")
    return LiquidSpace(closed, axis, orientation, prep, factors, m.volume, check, m.surface_total,
                       height, bottom, r_max, pieces)


@dataclass(frozen=True)
class LevelTable:
    """Rows of a level table (arrays, profile units; percent of the capacity).

    ``error`` is an estimate of each row's volume error (absolute; zero for
    rows found in closed form).
    """

    level: np.ndarray
    volume: np.ndarray
    percent: np.ndarray
    wetted_area: np.ndarray
    error: np.ndarray
    space: LiquidSpace

    def __len__(self) -> int:
        return int(self.level.size)


def _forward(space: LiquidSpace, levels: np.ndarray):
    """Volume, wetted area and error estimate at levels (from the lowest inside point)."""
    from revolve.geometry.clipping import vertical_levels
    from revolve.geometry.horizontal import horizontal_levels

    if space.orientation == "vertical":
        res = vertical_levels(space.prepared, space.bottom + levels, pieces=space.pieces)
        volume, area, err = res.volume, res.wetted_area, np.full(levels.shape, res.error)
    else:
        res = horizontal_levels(space.prepared, levels, pieces=space.pieces)
        volume, area, err = res.volume, res.wetted_area, res.error
    return volume, area, err


def check_levels(space: LiquidSpace, levels) -> np.ndarray:
    """Levels as an array, refused when below 0 or above the full height.

    A level within 1e-12 of the height beyond either end is taken as the end.

    >>> from revolve.geometry.profile import Chain
    >>> wall = Chain.from_points([(0, 0), (1, 0), (1, 2), (0, 2)])
    >>> space = liquid_space(Profile(chains=(wall,)), Axis.y())
    >>> check_levels(space, [2.5])
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: level 2.5 is above the full level 2 (in the profile's unit)
    """
    arr = np.atleast_1d(np.asarray(levels, dtype=float))
    if arr.ndim != 1:
        raise RevolveError("give the levels as a list of numbers")
    if not np.all(np.isfinite(arr)):
        raise RevolveError("a level is not a finite number")
    slack = 1e-12 * space.height
    low = arr < -slack
    high = arr > space.height + slack
    if low.any():
        raise RevolveError(f"level {arr[low][0]:g} is below the lowest inside point (0)")
    if high.any():
        raise RevolveError(f"level {arr[high][0]:g} is above the full level {space.height:g} "
                           "(in the profile's unit)")
    return np.clip(arr, 0.0, space.height)


def level_table(space: LiquidSpace, levels) -> LevelTable:
    """Volume, percent of capacity and wetted inside area at each level (profile units).

    >>> from revolve.geometry.profile import Chain
    >>> wall = Chain.from_points([(0, 0), (0, 1), (2, 1), (2, 0)])     # lying along x
    >>> space = liquid_space(Profile(chains=(wall,)), Axis.x(), orientation="horizontal")
    >>> t = level_table(space, [1.0])       # half full, lying down
    >>> round(float(t.percent[0]), 12), round(float(t.wetted_area[0]) / math.pi, 12)
    (50.0, 3.0)
    """
    lv = check_levels(space, levels)
    volume, area, err = _forward(space, lv)
    percent = 100.0 * volume / space.capacity if space.capacity else np.zeros_like(volume)
    return LevelTable(lv, volume, percent, area, err, space)


def levels_by_step(space: LiquidSpace, step: float, start: float = 0.0) -> np.ndarray:
    """Levels from ``start`` up in steps of ``step``, ending with the full level.

    >>> from revolve.geometry.profile import Chain
    >>> wall = Chain.from_points([(0, 0), (1, 0), (1, 2), (0, 2)])
    >>> space = liquid_space(Profile(chains=(wall,)), Axis.y())
    >>> levels_by_step(space, 0.75).tolist()
    [0.0, 0.75, 1.5, 2.0]
    >>> levels_by_step(space, 0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: the step must be a positive number, got 0
    """
    try:
        step = float(step)
    except (TypeError, ValueError):
        raise RevolveError(f"the step must be a number, got {step!r}")
    if not math.isfinite(step) or step <= 0:
        raise RevolveError(f"the step must be a positive number, got {step:g}")
    rows = (space.height - start) / step
    if rows > MAX_ROWS:
        raise RevolveError(f"a step of {step:g} gives {rows:.3g} rows (most {MAX_ROWS}); "
                           "make the step larger")
    n = int(math.floor(rows * (1 + 1e-12)))
    lv = start + step * np.arange(n + 1)
    lv = lv[lv < space.height * (1 - 1e-12)]
    return np.append(lv, space.height)


def levels_by_count(space: LiquidSpace, count: int) -> np.ndarray:
    """``count`` equal intervals from empty to full: ``count + 1`` levels.

    >>> from revolve.geometry.profile import Chain
    >>> wall = Chain.from_points([(0, 0), (1, 0), (1, 2), (0, 2)])
    >>> levels_by_count(liquid_space(Profile(chains=(wall,)), Axis.y()), 4).tolist()
    [0.0, 0.5, 1.0, 1.5, 2.0]
    """
    if isinstance(count, bool) or not isinstance(count, (int, np.integer)) or count < 1:
        raise RevolveError(f"the count must be a whole number of 1 or more, got {count!r}")
    if count > MAX_ROWS:
        raise RevolveError(f"a count of {count} is too many rows (most {MAX_ROWS})")
    lv = np.linspace(0.0, space.height, int(count) + 1)
    lv[-1] = space.height
    return lv


def level_for_volume(space: LiquidSpace, volumes) -> LevelTable:
    """The inverse: the level at which the space holds each volume (profile units).

    Raises when a volume is negative or more than the capacity. Solved by
    regula falsi (Illinois) on brackets from a forward table, vectorised over
    the volumes, until the forward volume agrees to 1e-13 of the capacity.

    >>> from revolve.geometry.profile import Chain
    >>> wall = Chain.from_points([(0, 0), (0, 1), (2, 1), (2, 0)])     # lying along x
    >>> space = liquid_space(Profile(chains=(wall,)), Axis.x(), orientation="horizontal")
    >>> t = level_for_volume(space, [0.0, math.pi, 2 * math.pi])    # empty, half, full
    >>> [round(float(x), 12) for x in t.level]
    [0.0, 1.0, 2.0]
    >>> level_for_volume(space, [7.0])
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: volume 7 is more than the capacity 6.28319 (in the profile's unit cubed)
    """
    v = np.atleast_1d(np.asarray(volumes, dtype=float))
    if not np.all(np.isfinite(v)):
        raise RevolveError("a volume is not a finite number")
    cap = space.capacity
    slack = 1e-12 * cap
    if (v < -slack).any():
        raise RevolveError(f"volume {v[v < -slack][0]:g} is negative")
    if (v > cap + slack).any():
        raise RevolveError(f"volume {v[v > cap + slack][0]:g} is more than the capacity {cap:.6g} "
                           "(in the profile's unit cubed)")
    v = np.clip(v, 0.0, cap)
    grid = levels_by_count(space, 64)
    gv, _, _ = _forward(space, grid)
    gv[0], gv[-1] = 0.0, cap
    gv = np.maximum.accumulate(gv)
    k = np.clip(np.searchsorted(gv, v, side="left"), 1, grid.size - 1)
    lo, hi = grid[k - 1].copy(), grid[k].copy()
    flo, fhi = gv[k - 1] - v, gv[k] - v
    at_lo = np.abs(flo) <= INVERSE_TOLERANCE * cap
    at_hi = np.abs(fhi) <= INVERSE_TOLERANCE * cap
    level = np.where(at_lo, lo, np.where(at_hi, hi, 0.5 * (lo + hi)))
    done = at_lo | at_hi
    side = np.zeros(v.shape)    # Illinois: which end was kept last time
    for _ in range(200):
        todo = np.flatnonzero(~done)
        if todo.size == 0:
            break
        a, b, fa, fb = lo[todo], hi[todo], flo[todo], fhi[todo]
        with np.errstate(divide="ignore", invalid="ignore"):
            x = np.where(fb != fa, (a * fb - b * fa) / (fb - fa), 0.5 * (a + b))
        bad = ~((x > a) & (x < b))
        x = np.where(bad, 0.5 * (a + b), x)
        fx = _forward(space, x)[0] - v[todo]
        level[todo] = x
        ok = (np.abs(fx) <= INVERSE_TOLERANCE * cap) | ((b - a) <= 4e-16 * max(space.height, 1e-300))
        done[todo[ok]] = True
        left = fx < 0   # the root is above x: x becomes the new low end
        # Illinois step: halve the function value at the end kept twice in a row.
        keep_hi = left & (side[todo] > 0)
        keep_lo = ~left & (side[todo] < 0)
        fhi[todo[keep_hi]] *= 0.5
        flo[todo[keep_lo]] *= 0.5
        lo[todo[left]], flo[todo[left]] = x[left], fx[left]
        hi[todo[~left]], fhi[todo[~left]] = x[~left], fx[~left]
        side[todo] = np.where(left, 1.0, -1.0)
    return level_table(space, level)


def level_for_percent(space: LiquidSpace, percents) -> LevelTable:
    """The level for each percentage of the capacity (0 to 100).

    >>> from revolve.geometry.profile import Chain
    >>> wall = Chain.from_points([(0, 0), (1, 0), (1, 2), (0, 2)])
    >>> space = liquid_space(Profile(chains=(wall,)), Axis.y())
    >>> [round(float(x), 12) for x in level_for_percent(space, [25, 100]).level]
    [0.5, 2.0]
    >>> level_for_percent(space, [120])
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: 120 % is outside 0 to 100 %
    """
    p = np.atleast_1d(np.asarray(percents, dtype=float))
    if not np.all(np.isfinite(p)):
        raise RevolveError("a percentage is not a finite number")
    bad = (p < 0) | (p > 100)
    if bad.any():
        raise RevolveError(f"{p[bad][0]:g} % is outside 0 to 100 %")
    return level_for_volume(space, p / 100.0 * space.capacity)
