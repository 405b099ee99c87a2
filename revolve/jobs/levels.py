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
import os
from dataclasses import dataclass, field
from typing import Any, Optional, Tuple

import numpy as np

from revolve.errors import ProfileError, RevolveError, quoted
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
    factors = m.section.loop_factors               # the measurement's, not worked out again
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


@dataclass(frozen=True, eq=False)
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
LIBRARY_NAMES = {key: key for key in ("orientation", "axis", "step", "count", "at", "volumes",
                                      "percent", "level_unit", "volume_unit", "area_unit", "units",
                                      "tolerance", "tilt", "gauge_point", "reference_height",
                                      "ullage", "datum_offset", "level_format", "deadwood",
                                      "shell_temperature", "base_temperature", "shell_material",
                                      "expansion", "uncertainty")}
#: How levels may be written: "auto" is feet-inches for in and ft level units, else decimal.
LEVEL_FORMATS = ("auto", "decimal", "feet-inches")


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
    ``outline`` (not in the JSON) is the vessel drawn for the picture:
    (levels, radii) in the level unit and what it shows.

    Examples
    --------
    A standing drum 1 m across and 1 m tall: π/4 · 1² · 1 m³ = 785.398 L,
    a quarter of it at 250 mm; the empty level holds nothing:

    >>> drum = Profile(loops=(Loop.from_points([(0, 0), (500, 0), (500, 1000), (0, 1000)]),),
    ...                name="drum")
    >>> t = level_table(drum, orientation="vertical", axis="y", at="0 mm, 250 mm")
    >>> t
    <LevelResult drum: 2 rows, vertical, capacity=785.398 L>
    >>> [(row["level"], round(row["volume"], 6)) for row in t.rows]
    [(0.0, 0.0), (250.0, 196.349541)]
    >>> t.to_dict()["units"]["capacity"], t._repr_html_().startswith("<table>")
    ('L', True)
    """

    outline: Any = field(default=None, compare=False)

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
                tolerance: float = DEFAULT_TOLERANCE, tilt=None, gauge_point=None,
                reference_height=None, ullage=None, datum_offset=None,
                level_format: Optional[str] = None, deadwood=None, shell_temperature=None,
                base_temperature=None, shell_material=None, expansion=None, uncertainty=None,
                names=None):
    """A fill-level (gauge) table of a liquid space: forward by level, reading, or inverse.

    The same computation as ``revolve levels``: ``result.to_dict()`` is the
    object ``revolve levels FILE --json`` prints (with the same settings).

    Parameters
    ----------
    profile_or_path : str, os.PathLike, Profile, ProfileDocument or Revolution
        The liquid space (see the module notes): a profile file or a profile.
    orientation : "vertical" or "horizontal", optional
        Default: the file's ``orientation``; refused when neither says.
    axis : Axis or str, optional
        ``"x"``, ``"y"`` or ``"X0,Y0,DX,DY"``; default the file's, else x.
    step : length text or number, optional
        A row at every ``step`` of innage (from the datum plate; of level when
        there is none), with the empty and full levels, and a column of
        volume per increment.
    at : length text, numbers or lists, optional
        Rows at these innages (dips above the datum plate; levels when there
        is none): ``"10 mm,20 mm"``, ``["1/8 in", 0.5]``, ``"3' 4 1/8\\""``.
    ullage : length text, numbers or lists, optional
        Rows at these ullages, read down from the reference point at
        ``reference_height`` above the datum plate (``at = H - ullage``).
    count : int, optional
        ``count`` equal intervals from empty to full (default 10).
    volumes, percent : optional
        Inverse: the level holding each volume (``"500 L,1000 L"``; a bare
        number is in the capacity unit) or percentage of the capacity (both
        after deadwood and the shell factor).
    tilt : float or text, optional
        Degrees of the axis from its drawn orientation (at most 45; see
        :mod:`revolve.geometry.tilted`): horizontal, positive raises the end
        the axis points to; vertical, a lean (its sign does not matter).
    gauge_point : length, optional
        The gauge's distance along the axis from the vessel's end at the
        start of the axis; default mid-length (horizontal), 0 (vertical).
    reference_height, datum_offset : length, optional
        The reference point's height above the datum plate, and the datum
        plate's above the lowest inside point (default 0).
    level_format : "auto", "decimal" or "feet-inches"
        ``auto`` (default) adds feet-inches-fractions text for in and ft levels.
    deadwood : file name or sequence of items, optional
        Deadwood and fittings (a TOML file, see ``examples/deadwood-*.toml``,
        or :class:`revolve.jobs.gauging.SpreadItem`/``RevolvedItem`` objects).
    shell_temperature, base_temperature : temperature text, optional
        With ``shell_material`` (a name of ``data/expansion.toml``) or
        ``expansion`` (``"12e-6 /K"``): the shell temperature factor CTSh.
    uncertainty : file name or mapping, optional
        Tolerances (``[tolerance]``: diameter, length, tilt, reading) and, for
        diameter and length, the vessel's dimensions (``[vessel]`` as
        ``revolve vessel`` takes them; a profile file does not record them).
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
        Tables ``space`` (capacity, full level, inside surface, …) and
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
    >>> u = level_table(drum, orientation="vertical", axis="y", reference_height="1.9 m",
    ...                 ullage="400 mm")
    >>> [(round(row["ullage"], 9), round(row["innage"], 9)) for row in u.rows]
    [(400.0, 1500.0)]
    >>> level_table(drum, orientation="vertical", axis="y", step=1, count=3)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: count: give one of step, count, at, ullage, volumes and percent, not step and count
    """
    from revolve.jobs.measuring import as_document

    n = dict(LIBRARY_NAMES, **(names or {}))
    given = [key for key, v in (("step", step), ("count", count), ("at", at), ("ullage", ullage),
                                ("volumes", volumes), ("percent", percent))
             if v is not None and not (isinstance(v, (list, tuple)) and not v)]
    if len(given) > 1:
        raise RevolveError("give one of " + ", ".join(n[k] for k in ("step", "count", "at",
                                                                      "ullage", "volumes")) +
                           f" and {n['percent']}, not " + " and ".join(n[k] for k in given),
                           option=n[given[1]])
    mode = given[0] if given else "count"
    if orientation is not None:
        orientation = str(orientation).strip().lower()
        if orientation not in ORIENTATIONS:
            raise RevolveError(f"give vertical or horizontal, got {orientation!r}",
                               option=n["orientation"])
    from revolve.inputs import positive_tolerance

    tolerance = positive_tolerance(tolerance, n["tolerance"])
    if count is not None and (isinstance(count, bool) or not isinstance(count, (int, np.integer))
                              or count < 1):
        raise RevolveError(f"the count must be 1 or more, got {count!r}", option=n["count"])
    if count is not None and count > MAX_ROWS:
        raise RevolveError(f"{count} rows are too many (at most {MAX_ROWS})", option=n["count"])
    gauge = _gauge_settings(n, mode, tilt=tilt, reference_height=reference_height,
                            level_format=level_format, shell_temperature=shell_temperature,
                            base_temperature=base_temperature, shell_material=shell_material,
                            expansion=expansion)
    try:
        doc = as_document(profile_or_path, units)
    except RevolveError as e:
        if e.option == "units":
            e.option = n["units"]
        raise
    return _level_result(doc, n, mode, gauge, orientation=orientation, axis=axis, step=step,
                         count=count, at=at, ullage=ullage, volumes=volumes, percent=percent,
                         level_unit=level_unit, volume_unit=volume_unit, area_unit=area_unit,
                         tolerance=tolerance, gauge_point=gauge_point,
                         reference_height=reference_height, datum_offset=datum_offset,
                         deadwood=deadwood, uncertainty=uncertainty,
                         temperature=(shell_temperature, base_temperature, shell_material,
                                      expansion))


def _gauge_settings(n, mode, *, tilt, reference_height, level_format, shell_temperature,
                    base_temperature, shell_material, expansion) -> dict:
    """The settings that need no profile: tilt, level format, shell temperature (checked)."""
    from revolve.jobs import gauge_table, gauging

    out: dict = {}
    if tilt is not None:
        try:
            t = float(str(tilt).strip().removesuffix("°").removesuffix("deg").strip()) \
                if isinstance(tilt, str) else float(tilt)
        except (TypeError, ValueError):
            raise RevolveError(f"give the tilt in degrees, such as 0.5 or -1.2, got "
                               f"{quoted(str(tilt))}", option=n["tilt"]) from None
        from revolve.geometry.tilted import plane_coefficients

        _named(n["tilt"], plane_coefficients, t, "vertical")
        out["tilt"] = t
    else:
        out["tilt"] = None
    fmt = "auto" if level_format is None else str(level_format).strip().lower()
    if fmt not in LEVEL_FORMATS:
        raise RevolveError(f"give auto, decimal or feet-inches, got {quoted(str(level_format))}",
                           option=n["level_format"])
    out["level_format"] = fmt
    if mode == "ullage" and reference_height is None:
        raise RevolveError(f"ullages are read down from the reference point; give "
                           f"{n['reference_height']} too", option=n["ullage"])
    temperature = (shell_temperature, base_temperature, shell_material, expansion)
    out["shell"] = None
    if any(v is not None for v in temperature):
        for value, key in ((shell_temperature, "shell_temperature"),
                           (base_temperature, "base_temperature")):
            if value is None:
                raise RevolveError(f"the shell temperature factor needs {n['shell_temperature']} "
                                   f"and {n['base_temperature']} (the table's calibration "
                                   "temperature)", option=n[key])
        if (shell_material is None) == (expansion is None):
            raise RevolveError(f"give the shell's material ({n['shell_material']}) or its "
                               f"expansion coefficient ({n['expansion']}), one of them",
                               option=n["shell_material" if shell_material is None else
                                        "expansion"])
        ts = _named(n["shell_temperature"], gauge_table.parse_temperature, shell_temperature)
        tb = _named(n["base_temperature"], gauge_table.parse_temperature, base_temperature)
        if shell_material is not None:
            material = str(shell_material)
            out["shell"] = _named(n["shell_material"], gauging.shell_correction, ts, tb, material)
        else:
            alpha = _named(n["expansion"], gauge_table.parse_expansion, expansion)
            out["shell"] = gauging.shell_correction(ts, tb, alpha)
    return out


def _feet_inches_denominator(step_inches: Optional[float]) -> int:
    """1/16 inch, or finer when the step needs it (1/32, 1/64)."""
    if step_inches:
        for d in (16, 32, 64):
            if abs(step_inches * d - round(step_inches * d)) <= 1e-9 * max(1.0, step_inches * d):
                return d
    return 16


def _level_result(doc, n, mode, gauge, *, orientation, axis, step, count, at, ullage, volumes,
                  percent, level_unit, volume_unit, area_unit, tolerance, gauge_point,
                  reference_height, datum_offset, deadwood, uncertainty, temperature):
    """The table of :func:`level_table` once the settings that need no profile are checked."""
    shell_temperature, base_temperature, shell_material, expansion = temperature
    from revolve import units as registry
    from revolve.jobs import gauge_table, gauging
    from revolve.jobs.measuring import _axis_of, parse_axis
    from revolve.jobs.results import Field, Table, rows_of, trade_units
    from revolve.jobs.vessel import TradeUnits, snapped

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
    level_factor = shown.units["level"][1]                # one level unit in metres
    level_in_profile = level_factor / metre               # one level unit in profile units

    def in_lu(value, key):
        return _named(n[key], _length_in, value, lu, lu)

    tilt = gauge["tilt"]
    gp = None if gauge_point is None else in_lu(gauge_point, "gauge_point") * level_in_profile
    engine = _named(n["gauge_point"] if gauge_point is not None else n["tilt"],
                    gauge_table.make_gauge, space, tilt, gp)
    datum = 0.0 if datum_offset is None else in_lu(datum_offset, "datum_offset")   # level unit
    H = None
    if reference_height is not None:
        H = in_lu(reference_height, "reference_height")
        if not (math.isfinite(H) and H > 0):
            raise RevolveError(f"the reference height must be positive, got {H:g} {lu}",
                               option=n["reference_height"])
    low, high = (engine.low / level_in_profile, engine.high / level_in_profile)   # level unit
    if datum_offset is not None and not datum < high:
        raise RevolveError(f"the datum plate {datum:g} {lu} above the lowest inside point is at "
                           f"or above the full level {high:.6g} {lu}", option=n["datum_offset"])
    reading = "ullage" if mode == "ullage" else (
        "innage" if datum_offset is not None or H is not None else "level")

    items = ()
    if deadwood is not None:
        if isinstance(deadwood, (str, os.PathLike)):
            items = _named(n["deadwood"], gauge_table.read_deadwood, str(deadwood), space)
        else:
            items = tuple(deadwood)
    shell = gauge["shell"]
    factor = shell.factor if shell is not None else 1.0

    def deducted(levels_si):
        """Deadwood minus fittings below each table level (m³); their levels are depths above
        the lowest wet point (the empty level)."""
        if not items:
            return np.zeros(np.shape(levels_si))
        depth = np.maximum(np.asarray(levels_si, dtype=float) - engine.low * metre, 0.0)
        return gauging.deadwood_at(depth, items)

    def net(levels_si, geometric_m3):
        return factor * (np.asarray(geometric_m3) - deducted(levels_si))

    corrected = bool(items) or shell is not None
    asked_key, asked_values, step_lu = None, None, None

    def check_range(values, what, option, shift=0.0):
        for x in values:
            lv = x + shift
            if lv < low - 1e-12 * max(abs(high - low), 1.0) * 1.0:
                raise RevolveError(f"{what} {x:g} {lu} is below the lowest inside point "
                                   f"({low - shift:.6g} {lu})", option=option)
            if lv > high + 1e-12 * max(abs(high), abs(low)):
                raise RevolveError(f"{what} {x:g} {lu} is above the full level "
                                   f"{high - shift:.6g} {lu}", option=option)

    if mode == "step":
        s = in_lu(step, "step")
        if not (math.isfinite(s) and s > 0):
            raise RevolveError(f"the step must be a positive number, got {s:g} {lu}",
                               option=n["step"])
        if (high - low) / s > MAX_ROWS:
            raise RevolveError(f"a step of {s:g} {lu} gives {(high - low) / s:.3g} rows for a "
                               f"full level of {high - low:.6g} {lu} (at most {MAX_ROWS}); make "
                               "it larger", option=n["step"])
        step_lu = s
        lv = gauge_table.step_levels(low, high, s, datum) * level_in_profile
    elif mode == "count":
        lv = np.linspace(engine.low, engine.high, int(count or DEFAULT_COUNT) + 1)
        lv[-1] = engine.high
    elif mode in ("at", "ullage"):
        key = "at" if mode == "at" else "ullage"
        values = [in_lu(v, key) for v in _named(n[key], _items, at if mode == "at" else ullage)]
        if not values:
            raise RevolveError(f"give at least one {'level' if mode == 'at' else 'ullage'}",
                               option=n[key])
        if mode == "ullage":
            for u in values:
                if not 0 <= u <= H * (1 + 1e-12):
                    raise RevolveError(f"ullage {u:g} {lu} is outside 0 to the reference height "
                                       f"{H:g} {lu}", option=n["ullage"])
            asked_key, asked_values = "ullage", [u * level_factor for u in values]
            innages = [H - u for u in values]
            check_range(innages, "the innage of that ullage,", n["ullage"], datum)
        else:
            innages = values
            check_range(innages, "innage" if reading != "level" else "level", n["at"], datum)
        lv = np.clip((np.array(innages) + datum) * level_in_profile, engine.low, engine.high)
    else:
        cap_net = float(net([engine.high * metre], [space.capacity * metre ** 3])[0])
        if mode == "volumes":
            si = [_named(n["volumes"], _volume_si, v, shown)
                  for v in _named(n["volumes"], _items, volumes)]
            if not si:
                raise RevolveError("give at least one volume", option=n["volumes"])
            vu = shown.unit("capacity")
            for x in si:
                if x < 0:
                    raise RevolveError(f"volume {shown.show(x, 'capacity'):g} {vu} is negative",
                                       option=n["volumes"])
                if x > cap_net * (1 + 1e-12):
                    raise RevolveError(f"volume {shown.show(x, 'capacity'):g} {vu} is more than "
                                       f"the capacity {shown.show(cap_net, 'capacity'):.6g} {vu}",
                                       option=n["volumes"])
            asked_key, asked_values = "volume_asked", si
            targets = np.minimum(np.array(si), cap_net)
        else:
            asked_values = [_named(n["percent"], _percent_value, v)
                            for v in _named(n["percent"], _items, percent)]
            if not asked_values:
                raise RevolveError("give at least one percentage", option=n["percent"])
            asked_key = "percent_asked"
            targets = np.array(asked_values) / 100.0 * cap_net
        if not corrected:
            lv = engine.inverse(targets / metre ** 3)
        else:
            lv = _solve_levels(engine, lambda h: net(h * metre, engine.forward(h)[0] * metre ** 3),
                               targets)
    volume, error, wetted = engine.forward(lv)
    levels_si = np.asarray(lv) * metre
    geometric = np.asarray(volume) * metre ** 3
    net_volume = net(levels_si, geometric)
    capacity_geometric = space.capacity * metre ** 3
    capacity = float(net([engine.high * metre], [capacity_geometric])[0])
    fmt = gauge["level_format"]
    feet_inches = fmt == "feet-inches" or (fmt == "auto" and lu in ("in", "ft"))
    denominator = _feet_inches_denominator(
        step_lu * level_factor / 0.0254 if step_lu is not None else None)
    increments = gauging.per_increment(net_volume) if mode == "step" else None
    dead = deducted(levels_si)

    # -- uncertainty (GUM) -------------------------------------------------------------------
    spread = None
    if uncertainty is not None:
        spread = _named(n["uncertainty"], _uncertainty, uncertainty, space, metre, tilt,
                        gp, levels_si, net, capacity_geometric)

    rows = []
    for k in range(len(levels_si)):
        row = {} if asked_key is None else {asked_key: float(asked_values[k])}
        level_si = float(levels_si[k])
        innage_si = level_si - datum * level_factor
        if reading != "level":
            row["innage"] = innage_si
        if H is not None and mode != "ullage":
            row["ullage"] = H * level_factor - innage_si
        row["level"] = level_si
        if feet_inches:
            text_of = {"level": level_si, "innage": innage_si,
                       "ullage": row.get("ullage")}[reading]
            row[f"{reading}_text"] = gauging.format_feet_inches(text_of / 0.0254, denominator)
        row["volume"] = float(net_volume[k])
        if items:
            row["vessel_volume"] = float(geometric[k])
            row["deducted"] = float(dead[k])
        row["percent"] = snapped(100.0 * float(net_volume[k]) / capacity) if capacity else 0.0
        if increments is not None:
            row["increment"] = None if k == len(levels_si) - 1 else float(increments[k])
        row["wetted_area"] = float(wetted[k]) * metre ** 2
        row["volume_error"] = float(error[k]) * metre ** 3 * factor
        if spread is not None:
            row["volume_uncertainty"] = float(spread.standard_uncertainty[k + 1])
            row["largest_contributor"] = (spread.largest[k + 1][0] if spread.largest[k + 1]
                                          else "none")
        rows.append(row)
    fields = ()
    if asked_key == "volume_asked":
        fields += (Field("volume_asked", "volume asked", "capacity"),)
    elif asked_key == "percent_asked":
        fields += (Field("percent_asked", "asked", style="percent"),)
    if mode == "ullage":
        fields += (Field("ullage", "ullage (given)", "level"),)
    if reading != "level":
        fields += (Field("innage", "innage" + (" (given)" if mode == "at" else ""), "level"),)
    if H is not None and mode != "ullage":
        fields += (Field("ullage", "ullage", "level"),)
    fields += (Field("level", "level", "level"),)
    if feet_inches:
        fields += (Field(f"{reading}_text", f"{reading} (ft in)", style="text"),)
    fields += (Field("volume", "volume", "capacity"),)
    if items:
        fields += (Field("vessel_volume", "vessel volume", "capacity"),
                   Field("deducted", "deducted", "capacity"))
    fields += (Field("percent", "full", style="percent"),)
    if increments is not None:
        fields += (Field("increment", "to next row", "capacity"),)
    fields += (Field("wetted_area", "wetted area", "area"),
               Field("volume_error", "error estimate", "capacity", digits=2))
    if spread is not None:
        fields += (Field("volume_uncertainty", "u", "capacity", digits=2),
                   Field("largest_contributor", "main input", style="text"))

    figures = {"capacity": capacity, "full_level": engine.high * metre,
               "inside_area": space.inside_area * metre ** 2}
    figure_fields = [Field("capacity", "capacity", "capacity")]
    if corrected:
        figures["vessel_capacity"] = capacity_geometric
        figure_fields.append(Field("vessel_capacity", "vessel capacity (geometry)", "capacity"))
    if items:
        figures["deducted_full"] = float(deducted([engine.high * metre])[0])
        figure_fields.append(Field("deducted_full", "deducted when full (deadwood − fittings)",
                                   "capacity"))
    if shell is not None:
        figures["shell_factor"] = shell.factor
        figure_fields.append(Field("shell_factor", "shell temperature factor CTSh", digits=9))
    if spread is not None:
        figures["capacity_uncertainty"] = float(spread.standard_uncertainty[0])
        figure_fields.append(Field("capacity_uncertainty", "capacity's standard uncertainty",
                                   "capacity", digits=2))
    figure_fields.append(Field("full_level", "full level", "level"))
    if tilt is not None or gp is not None:
        figures["empty_level"] = engine.low * metre
        figure_fields.append(Field("empty_level", "empty level (at the gauge point)", "level"))
    figure_fields.append(Field("inside_area", "inside surface", "area"))
    if space.orientation == "horizontal":
        figures["axis_height"] = space.r_max * metre
        figure_fields.append(Field("axis_height", "axis above the lowest inside point", "level"))
    if datum_offset is not None:
        figures["datum_offset"] = datum * level_factor
        figure_fields.append(Field("datum_offset", "datum plate above the lowest inside point",
                                   "level"))
    if H is not None:
        figures["reference_height"] = H * level_factor
        figure_fields.append(Field("reference_height", "reference point above the datum plate",
                                   "level"))
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
    check = space.capacity_crosscheck
    crosscheck = {"capacity_difference": check, "tolerance": tolerance,
                  "agrees": bool(check <= tolerance)}
    cap_profile = space.capacity
    if tilt is not None or gp is not None:
        notes[0] = _gauge_note(space.orientation, tilt, engine, metre, shown, said)
    if tilt is not None:
        worst = float(np.max(error)) / cap_profile if cap_profile and len(error) else 0.0
        notes.append("volumes: chords of the tilted liquid plane integrated along the wall "
                     f"(Gauss–Legendre); largest error estimate {worst:.1e} of the capacity")
        pick = np.unique(np.linspace(0, len(lv) - 1, min(len(lv), gauge_table.CROSSCHECK_ROWS))
                         .round().astype(int))
        second = engine.crosscheck(np.asarray(lv)[pick])
        diff = float(np.max(np.abs(second - np.asarray(volume)[pick]))) / cap_profile
        notes.append(f"tilted cross-check (chord sums over the slices, no shared formula) at "
                     f"{pick.size} rows: largest difference {diff:.1e} of the capacity (allowed "
                     f"{gauge_table.CROSSCHECK_BOUND:g})")
        crosscheck.update(tilted_difference=diff, tilted_rows=int(pick.size),
                          tilted_bound=gauge_table.CROSSCHECK_BOUND)
        crosscheck["agrees"] = bool(crosscheck["agrees"] and diff <= gauge_table.CROSSCHECK_BOUND)
    elif space.orientation == "vertical":
        notes.append("volumes: the section clipped at each level, Pappus–Guldinus (exact)")
    else:
        worst = float(np.max(error)) / cap_profile if cap_profile and len(error) else 0.0
        notes.append("volumes: wetted circular segments integrated along the axis; largest "
                     f"error estimate {worst:.1e} of the capacity")
    if reading != "level":
        text = (f"readings: innage = level − {datum:g} {lu} (the datum plate above the lowest "
                "inside point)" if datum_offset is not None else
                "readings: innage = level (the datum plate at the lowest inside point)")
        if H is not None:
            text += f"; ullage = {H:g} {lu} (the reference point above the datum plate) − innage"
        notes.append(text)
    if items:
        listed = "; ".join(
            f"{it.name} ({'fitting, adds' if it.fitting else 'deadwood'}, "
            f"{shown.show(it.volume, 'capacity'):.6g} {shown.unit('capacity')})" for it in items)
        notes.append(f"deducted: deadwood minus fittings below each level: {listed}")
        if tilt is not None:
            notes.append("deadwood and fittings are taken by depth above the lowest wet point, "
                         "as in a level vessel")
    if shell is not None:
        notes.append(shell.statement() + " (temperatures in °C); volumes = CTSh × (vessel "
                     "volume − deducted)")
        if space.orientation != "vertical":
            notes.append("the standard states CTSh for upright cylindrical tanks; here it is the "
                         "same areal growth (1 + αΔT)² applied to a lying vessel (geometry)")
    if spread is not None:
        notes.append(f"uncertainty u: the standard uncertainty of each volume, main input: its "
                     f"largest contributor; {gauging.GUM_METHOD}")
        cap_u = shown.show(float(spread.standard_uncertainty[0]), "capacity")
        shares = spread.shares(0)
        named = ", ".join(f"{gauge_table.UNCERTAIN_INPUTS[k]} {100 * v:.0f} %"
                          for k, v in shares.items()) or "none"
        notes.append(f"capacity's standard uncertainty {cap_u:.3g} {shown.unit('capacity')}; "
                     f"largest contributors (share of the variance): {named}")
        notes.append("tolerances: " + "; ".join(
            f"{gauge_table.UNCERTAIN_INPUTS[k]} u = {v:.4g} "
            f"{gauge_table.input_unit(k)}" for k, v in spread.inputs.items()))
    cautions = ("vessel",)
    if tilt is not None or shell is not None or spread is not None:
        cautions += (gauging.CALIBRATION_CAUTION,)
    extra = {"profile": {"file": doc.file, "name": doc.profile.name, "unit": unit},
             "orientation": space.orientation,
             "orientation_from": "file" if from_file else "asked",
             "crosscheck": crosscheck}
    if tilt is not None or gp is not None or reading != "level":
        extra["gauge"] = {"tilt_degrees": tilt, "reading": reading,
                          "gauge_point": None if gp is None else gp * metre}
    inputs = {"profile": doc.file if doc.file else name, "orientation": asked_from,
              "rows_by": mode}
    def as_text(value):
        return None if value is None else f"{value:.12g} {lu}"

    for key, value in (("tilt", tilt),
                       ("gauge_point", None if gp is None else as_text(gp / level_in_profile)),
                       ("reference_height", as_text(H)),
                       ("datum_offset", None if datum_offset is None else as_text(datum)),
                       ("deadwood", deadwood if isinstance(deadwood, str) else
                        (None if deadwood is None else f"{len(items)} items")),
                       ("shell_temperature", None if shell is None else str(shell_temperature)),
                       ("base_temperature", None if shell is None else str(base_temperature)),
                       ("shell_material", None if shell_material is None else str(shell_material)),
                       ("expansion", None if expansion is None else str(expansion)),
                       ("uncertainty", uncertainty if isinstance(uncertainty, str) else
                        (None if uncertainty is None else "given"))):
        if value is not None:
            inputs[key] = value if isinstance(value, (int, float, str)) else str(value)
    title = "Gauge table" if reading != "level" or tilt is not None else "Level table"
    outline = _outline(space, engine, metre, level_factor)
    return LevelResult("levels", shown, inputs,
                       (Table("space", name, tuple(figure_fields), rows_of([figures]),
                              figures=True),
                        Table("levels", title, fields, rows_of(rows))),
                       tuple(notes), cautions, extra, outline=outline)


def _gauge_note(orientation, tilt, engine, metre, shown, said) -> str:
    lu = shown.unit("level")
    if engine.gauge_z is None:
        where = ("the middle of the length" if orientation == "horizontal" else
                 "the lowest point on the axis")
    else:
        along = shown.show((engine.gauge_z - engine.pieces.z_min) * metre, "level")
        where = f"{along:.6g} {lu} along the axis from its start"
    where = "gauge point: " + where
    if orientation == "horizontal":
        text = ("horizontal: level = plumb height of the liquid surface above the bottom line "
                "at the gauge point")
        if tilt is not None:
            text += f"; tilt {tilt:g}° (positive: the end the axis points to raised)"
    else:
        text = ("vertical: level = plumb height of the liquid surface above the axis at the "
                "gauge point")
        if tilt is not None:
            text += f"; leaning {abs(tilt):g}° (the direction of lean does not change a volume)"
    return f"{text}; {where} ({said})"


def _solve_levels(engine, forward_net, targets) -> np.ndarray:
    """Levels (profile units) where the monotone ``forward_net`` reaches each target (m³)."""
    from scipy.optimize import brentq

    grid = np.linspace(engine.low, engine.high, 65)
    gv = np.maximum.accumulate(forward_net(grid))
    out = np.empty(len(targets))
    for i, t in enumerate(targets):
        k = int(np.clip(np.searchsorted(gv, t, side="left"), 1, grid.size - 1))
        a, b = grid[k - 1], grid[k]
        fa, fb = gv[k - 1] - t, gv[k] - t
        if fa >= 0:
            out[i] = a
        elif fb <= 0:
            out[i] = b
        else:
            out[i] = brentq(lambda h: float(forward_net(np.array([h]))[0]) - t, a, b,
                            xtol=1e-13 * max(engine.high - engine.low, 1e-300), rtol=1e-15)
    return out


def _uncertainty(source, space, metre, tilt, gauge_point, levels_si, net, capacity_si):
    """The GUM combination for a table (capacity first, then each row)."""
    from revolve import units as registry
    from revolve.jobs import gauge_table, gauging

    dims, tolerances = gauge_table.read_uncertainty(source)
    if dims is not None:
        built = dims.space(space.orientation)
        cap = built.capacity * registry.factor(built.profile.unit, "length") ** 3
        if abs(cap - capacity_si) > 1e-9 * capacity_si:
            where = f"{source}: " if isinstance(source, (str, os.PathLike)) else ""
            raise RevolveError(f"{where}the vessel in [vessel] holds {cap:.6g} m³, the profile "
                               f"{capacity_si:.6g} m³; describe the vessel the profile was built "
                               "from (revolve vessel's diameter, length and heads)")
    model, values = gauge_table.uncertainty_model(dims, space, tilt=tilt, gauge_point=gauge_point,
                                                  levels_si=levels_si, net=net,
                                                  toleranced=tuple(tolerances))
    return gauging.combined_uncertainty(model, values, tolerances)


def _outline(space, engine, metre, level_factor):
    """The vessel's outline for the picture: (levels, radii) in the level unit, and marks."""
    pc = engine.pieces
    if space.orientation == "vertical":
        u = np.linspace(0.0, 1.0, 33)
        p = pc.pa[:, None] + (pc.pb - pc.pa)[:, None] * u[None, :]
        z, r, _, _ = pc.geometry(np.arange(len(pc)), p)
        ref = pc.z_min + engine.shift if engine.tilt is None else (
            engine.gauge_z if engine.gauge_z is not None else pc.z_min)
        # a NaN after each piece: the drawn line breaks there (a coil is not joined to the wall)
        gap = np.full((z.shape[0], 1), np.nan)
        z, r = np.hstack([z, gap]), np.hstack([r, gap])
        level = (z.ravel() - ref) * metre / level_factor
        return level, r.ravel() * metre / level_factor, "section"
    t = np.linspace(0.0, math.pi, 181)
    a = math.cos(math.radians(engine.tilt)) if engine.tilt else 1.0
    R = space.r_max * metre / level_factor
    return a * R * (1 - np.cos(t)), R * np.sin(t), "end view"
