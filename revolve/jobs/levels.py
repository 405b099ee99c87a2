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
>>> table = table_at_levels(space, levels_by_count(space, 4))
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
from revolve.jobs.results import Result

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
    prep = m.prepared or prepare(closed, axis)     # the measurement's, not again
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


def table_at_levels(space: LiquidSpace, levels) -> LevelTable:
    """Volume, percent of capacity and wetted inside area at each level (profile units).

    >>> from revolve.geometry.profile import Chain
    >>> wall = Chain.from_points([(0, 0), (0, 1), (2, 1), (2, 0)])     # lying along x
    >>> space = liquid_space(Profile(chains=(wall,)), Axis.x(), orientation="horizontal")
    >>> t = table_at_levels(space, [1.0])       # half full, lying down
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
    return table_at_levels(space, level)


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


# -- the job: a level table from a profile or a file, as a result ---------------------------

#: Default number of intervals when no way of choosing the rows is given.
DEFAULT_COUNT = 10
#: Largest relative difference allowed between the capacity and its cross-check.
DEFAULT_TOLERANCE = 1e-9
#: The library's names of the settings (the command line passes its option names instead).
LIBRARY_NAMES = {"orientation": "orientation", "axis": "axis", "step": "step", "count": "count",
                 "at": "at", "volumes": "volumes", "percent": "percent",
                 "level_unit": "level_unit", "volume_unit": "volume_unit",
                 "area_unit": "area_unit", "units": "units", "tolerance": "tolerance"}


def _items(value) -> list:
    """Flatten a setting given as text lists (``"10 mm,20 mm"``), numbers, or lists of either."""
    if value is None:
        return []
    if isinstance(value, str):
        from revolve.inputs import parse_list

        return parse_list(value, lambda item: item, "value")
    if isinstance(value, (list, tuple, np.ndarray)) and not hasattr(value, "unit"):
        out = []
        for v in value:
            out.extend(_items(v))
        return out
    return [value]


def _length_in(value, unit: str, default_unit: str) -> float:
    """A length (text with a unit or fraction, a ``Length``, a number in ``default_unit``) in ``unit``."""
    from revolve.inputs import Length, parse_length

    if isinstance(value, Length):
        length = value
    elif hasattr(value, "to") and hasattr(value, "magnitude"):       # a pint quantity
        length = Length(float(value.to("m").magnitude), "m")
    else:
        length = parse_length(value)
    return length.in_unit(unit, default_unit)


def _volume_si(value, shown) -> float:
    """A volume (``"500 L"``, a number in the output volume unit, a pint quantity) in m³."""
    import re

    from revolve import units as registry

    if hasattr(value, "to") and hasattr(value, "magnitude"):
        return float(value.to("m**3").magnitude)
    if isinstance(value, (int, float, np.floating)) and not isinstance(value, bool):
        v = float(value)
        if not math.isfinite(v):
            raise RevolveError(f"{v!r} is not a finite number")
        return shown.read(v, "capacity")
    text = str(value)
    m = re.fullmatch(r"\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d{1,3})?)\s*"
                     r"([A-Za-zµ_][A-Za-zµ_0-9²³^]*)?\s*", text[:200])
    if m is None:
        raise RevolveError(f"{text.strip()!r} is not a number; give volumes such as 500 or "
                           "'500 L', separated by commas")
    v = float(m.group(1))
    if not math.isfinite(v):
        raise RevolveError(f"{text.strip()!r} is not a finite number")
    if m.group(2):
        return v * registry.factor(m.group(2), "volume")
    return shown.read(v, "capacity")


def _named(option, fn, *args):
    """``fn(*args)``, its errors naming ``option``."""
    try:
        return fn(*args)
    except RevolveError as e:
        raise e.located(option=option)


def _percent_value(value) -> float:
    from revolve.inputs import parse_percent

    if isinstance(value, (int, float, np.floating)) and not isinstance(value, bool):
        v = float(value)
        if not (math.isfinite(v) and 0 <= v <= 100):
            raise RevolveError(f"{v:g} % is outside 0 to 100 %")
        return v
    return parse_percent(str(value))


@dataclass(frozen=True, repr=False)
class LevelResult(Result):
    """A level table with its liquid space; ``to_dict()`` is ``revolve levels --json``.

    ``rows`` are the table's rows in the output units (as in the JSON);
    ``capacity`` is in the capacity unit (``units.unit("capacity")``).
    """

    @property
    def rows(self):
        return self.table("levels").json(self.units)

    @property
    def capacity(self) -> float:
        return self.table("space").json(self.units)["capacity"]

    def __repr__(self) -> str:
        return (f"<LevelResult {self.table('space').title}: {len(self.table('levels').rows)} rows, "
                f"{self.extra['orientation']}, capacity={self.capacity:.6g} "
                f"{self.units.unit('capacity')}>")


def level_table(profile_or_path, *, orientation: Optional[str] = None, axis=None, step=None,
                count: Optional[int] = None, at=None, volumes=None, percent=None,
                level_unit: Optional[str] = None, volume_unit: Optional[str] = None,
                area_unit: Optional[str] = None, units: Optional[str] = None,
                tolerance: float = DEFAULT_TOLERANCE, names=None):
    """A fill-level table of a liquid space (forward by level, or inverse by volume or percent).

    The same computation as ``revolve levels``: ``result.to_dict()`` is the
    object ``revolve levels FILE --json`` prints.

    Parameters
    ----------
    profile_or_path : str, os.PathLike, Profile, ProfileDocument or Revolution
        The liquid space (see the module notes): a profile file or a profile.
    orientation : "vertical" or "horizontal", optional
        Default: the file's ``orientation``; refused when neither says.
    axis : Axis or str, optional
        ``"x"``, ``"y"`` or ``"X0,Y0,DX,DY"``; default the file's, else x.
    step, at : length text, numbers or lists, optional
        Forward rows: a row every ``step`` (and the full level), or at each
        level of ``at`` (``"10 mm,20 mm"``, ``["1/8 in", 0.5]``). A bare
        number is in the level unit.
    count : int, optional
        Forward rows: ``count`` equal intervals (default 10).
    volumes : volume text, numbers or lists, optional
        Inverse: the level holding each volume (``"500 L,1000 L"``; a bare
        number is in the capacity unit).
    percent : numbers or text, optional
        Inverse: the level holding each percentage of the capacity.
    level_unit, volume_unit, area_unit : str, optional
        Output units: levels (default the drawing's unit), capacities
        (default L, US gal for inch/foot drawings), wetted areas (m², ft²).
    units : str, optional
        Length unit of files that do not say (point lists); default mm.
    tolerance : float
        Relative difference allowed between the capacity and its washer
        cross-check (``result.extra["crosscheck"]["agrees"]``).
    names : mapping, optional
        The names errors give the settings (:data:`LIBRARY_NAMES`; the
        command line passes its option names, ``--step``, ``--volume``…).

    Returns
    -------
    LevelResult
        Tables ``space`` (capacity, full level, inside surface) and
        ``levels`` (the rows), values shown in ``result.units``.

    Examples
    --------
    An upright drum, radius 0.5 m and 2 m high (π/2 m³ = 1570.8 L):

    >>> from revolve.geometry.profile import Chain, Profile
    >>> drum = Profile(chains=(Chain.from_points([(0, 0), (500, 0), (500, 2000), (0, 2000)]),),
    ...                unit="mm")
    >>> r = level_table(drum, orientation="vertical", axis="y", step="500 mm")
    >>> [row["level"] for row in r.rows], round(r.capacity, 3), r.units.unit("capacity")
    ([0.0, 500.0, 1000.0, 1500.0, 2000.0], 1570.796, 'L')
    >>> r
    <LevelResult liquid space: 5 rows, vertical, capacity=1570.8 L>
    >>> [round(row["level"], 9) for row in level_table(drum, orientation="vertical", axis="y",
    ...                                                volumes="0 L").rows]    # empty: level 0
    [0.0]
    >>> level_table(drum, orientation="vertical", axis="y", step=1, count=3)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: count: give one of step, count, at, volumes and percent, not step and count
    """
    from revolve import units as registry
    from revolve.jobs.measuring import _axis_of, as_document, parse_axis
    from revolve.jobs.results import Field, Table, rows_of, trade_units
    from revolve.jobs.vessel import TradeUnits, snapped

    n = dict(LIBRARY_NAMES, **(names or {}))
    given = [key for key, v in (("step", step), ("count", count), ("at", at),
                                ("volumes", volumes), ("percent", percent))
             if v is not None and not (isinstance(v, (list, tuple)) and not v)]
    if len(given) > 1:
        raise RevolveError("give one of " + ", ".join(n[k] for k in ("step", "count", "at")) +
                           f", {n['volumes']} and {n['percent']}, not "
                           + " and ".join(n[k] for k in given), option=n[given[1]])
    mode = given[0] if given else "count"
    if orientation is not None:
        orientation = str(orientation).strip().lower()
        if orientation not in ORIENTATIONS:
            raise RevolveError(f"give vertical or horizontal, got {orientation!r}",
                               option=n["orientation"])
    try:
        tolerance = float(tolerance)
    except (TypeError, ValueError):
        tolerance = float("nan")
    if not tolerance > 0:
        raise RevolveError("the tolerance must be a positive number", option=n["tolerance"])
    if count is not None and (isinstance(count, bool) or not isinstance(count, (int, np.integer))
                              or count < 1):
        raise RevolveError(f"the count must be 1 or more, got {count!r}", option=n["count"])
    if count is not None and count > MAX_ROWS:
        raise RevolveError(f"{count} rows are too many (at most {MAX_ROWS})", option=n["count"])
    try:
        doc = as_document(profile_or_path, units)
    except RevolveError as e:
        if e.option == "units":
            e.option = n["units"]
        raise
    try:
        asked_from, written = orientation, doc.orientation
        orientation, source = choose_orientation(orientation, doc.orientation,
                                                 option=n["orientation"])
    except RevolveError as e:
        raise e.located(file=doc.file)
    from_file = source == "from the file"
    unit = doc.profile.unit
    overrides = {"level": level_unit, "capacity": volume_unit, "volume": volume_unit,
                 "area": area_unit}
    options = {"level": n["level_unit"], "capacity": n["volume_unit"],
               "volume": n["volume_unit"], "area": n["area_unit"]}
    for role in ("level", "capacity", "area"):
        if overrides[role] is not None and not isinstance(overrides[role], str):
            raise RevolveError(f"give the unit as text, got {overrides[role]!r}",
                               option=options[role])
    shown = trade_units("vessel", unit, overrides, options=options)
    shown = TradeUnits(shown.units, shown.currency)
    ax = (_axis_of(axis) if not isinstance(axis, str) else parse_axis(axis, n["axis"])) \
        or doc.axis or parse_axis("x")
    angle = doc.angle_degrees if doc.angle_degrees is not None else 360.0
    try:
        space = liquid_space(doc.profile, ax, angle, orientation)
    except RevolveError as e:
        raise e.located(file=doc.file, line=doc.line_of(e.place) if e.place else None)
    metre = registry.factor(unit, "length")           # one profile unit in metres
    lu = shown.unit("level")
    full_shown = shown.show(space.height * metre, "level")
    level_factor = shown.units["level"][1]                # one level unit in metres
    level_in_profile = level_factor / metre               # one level unit in profile units
    asked_key, asked_values = None, None

    if mode == "step":
        s = _named(n["step"], _length_in, step, lu, lu)
        if not (math.isfinite(s) and s > 0):
            raise RevolveError(f"the step must be a positive number, got {s:g} {lu}",
                               option=n["step"])
        if full_shown / s > MAX_ROWS:
            raise RevolveError(f"a step of {s:g} {lu} gives {full_shown / s:.3g} rows for a full "
                               f"level of {full_shown:.6g} {lu} (at most {MAX_ROWS}); make it "
                               "larger", option=n["step"])
        table = table_at_levels(space, levels_by_step(space, s * level_in_profile))
    elif mode == "count":
        table = table_at_levels(space, levels_by_count(space, int(count or DEFAULT_COUNT)))
    elif mode == "at":
        values = [_named(n["at"], _length_in, v, lu, lu) for v in _named(n["at"], _items, at)]
        if not values:
            raise RevolveError("give at least one level", option=n["at"])
        for x in values:
            if x < 0:
                raise RevolveError(f"level {x:g} {lu} is below the lowest inside point (0)",
                                   option=n["at"])
            if x > full_shown * (1 + 1e-12):
                raise RevolveError(f"level {x:g} {lu} is above the full level "
                                   f"{full_shown:.6g} {lu}", option=n["at"])
        table = table_at_levels(space, np.minimum(np.array(values) * level_in_profile,
                                                  space.height))
    elif mode == "volumes":
        si = [_named(n["volumes"], _volume_si, v, shown) for v in _named(n["volumes"], _items, volumes)]
        if not si:
            raise RevolveError("give at least one volume", option=n["volumes"])
        cap_si = space.capacity * metre ** 3
        vu = shown.unit("capacity")
        for x in si:
            if x < 0:
                raise RevolveError(f"volume {shown.show(x, 'capacity'):g} {vu} is negative",
                                   option=n["volumes"])
            if x > cap_si * (1 + 1e-12):
                raise RevolveError(f"volume {shown.show(x, 'capacity'):g} {vu} is more than the "
                                   f"capacity {shown.show(cap_si, 'capacity'):.6g} {vu}",
                                   option=n["volumes"])
        asked_key, asked_values = "volume_asked", si
        table = level_for_volume(space, np.minimum(np.array(si) / metre ** 3, space.capacity))
    else:
        asked_values = [_named(n["percent"], _percent_value, v)
                        for v in _named(n["percent"], _items, percent)]
        if not asked_values:
            raise RevolveError("give at least one percentage", option=n["percent"])
        asked_key = "percent_asked"
        table = level_for_percent(space, asked_values)
    rows = []
    for k in range(len(table)):
        row = {} if asked_key is None else {asked_key: float(asked_values[k])}
        row.update(level=float(table.level[k]) * metre,
                   volume=float(table.volume[k]) * metre ** 3,
                   percent=snapped(float(table.percent[k])),
                   wetted_area=float(table.wetted_area[k]) * metre ** 2,
                   volume_error=float(table.error[k]) * metre ** 3)
        rows.append(row)
    fields = ((Field("volume_asked", "volume asked", "capacity"),
               Field("percent_asked", "asked", style="percent")) if asked_key else ()) + (
        Field("level", "level", "level"), Field("volume", "volume", "capacity"),
        Field("percent", "full", style="percent"),
        Field("wetted_area", "wetted area", "area"),
        Field("volume_error", "error estimate", "capacity", digits=2))
    figures = {"capacity": space.capacity * metre ** 3,
               "full_level": space.height * metre,
               "inside_area": space.inside_area * metre ** 2}
    figure_fields = [Field("capacity", "capacity", "capacity"),
                     Field("full_level", "full level", "level"),
                     Field("inside_area", "inside surface", "area")]
    if space.orientation == "horizontal":
        figures["axis_height"] = space.r_max * metre
        figure_fields.append(Field("axis_height", "axis above the lowest inside point", "level"))
    name = doc.profile.name or doc.file or "liquid space"
    if space.orientation == "vertical":
        how = ("vertical: the axis upright (its direction up); level = height of the liquid "
               "surface above the lowest inside point")
    else:
        how = ("horizontal: the axis level; level = depth of liquid above the lowest inside "
               "point")
    said = "from the file" if from_file else (
        "as asked" + (f"; the file says {written}" if written not in (None, orientation) else ""))
    notes = [f"{how} ({said})",
             f"capacity by Pappus–Guldinus; the washer cross-check differs by "
             f"{space.capacity_crosscheck:.1e} (relative)"]
    if space.orientation == "vertical":
        notes.append("volumes: the section clipped at each level, Pappus–Guldinus (exact)")
    else:
        worst = float(table.error.max()) / space.capacity if space.capacity and len(table) else 0.0
        notes.append("volumes: wetted circular segments integrated along the axis; largest "
                     f"error estimate {worst:.1e} of the capacity")
    check = space.capacity_crosscheck
    extra = {"profile": {"file": doc.file, "name": doc.profile.name, "unit": unit},
             "orientation": space.orientation,
             "orientation_from": "file" if from_file else "asked",
             "crosscheck": {"capacity_difference": check, "tolerance": tolerance,
                            "agrees": bool(check <= tolerance)}}
    inputs = {"profile": doc.file if doc.file else name, "orientation": asked_from,
              "rows_by": mode}
    return LevelResult("levels", shown, inputs,
               (Table("space", name, tuple(figure_fields), rows_of([figures]), figures=True),
                Table("levels", "Level table", fields, rows_of(rows))),
               tuple(notes), ("vessel",), extra)
