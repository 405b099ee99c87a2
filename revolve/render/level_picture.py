"""The picture of a level table: volume (and wetted area) against level, the vessel beside it.

Level runs up the page, as in the vessel: the left panel draws the vessel's
half-profile (radius across, level up) with horizontal marks at given levels
(the heads' tangent lines, say); the right panel shares that level scale and
draws the volume below each level (bottom axis) and the wetted area (top
axis), with the capacity as a vertical line. Units come in the display
spelling of :class:`~revolve.jobs.results.OutputUnits` (``m³``, ``US gal``);
tick labels use :mod:`revolve.render.numbers`. The layout is matplotlib's
constrained layout, and mark labels that would touch one another are moved
apart, so that no label overlaps another or leaves the canvas.

matplotlib is imported inside the function only (never at start-up); the
figure is a bare :class:`matplotlib.figure.Figure` (no pyplot, no global
state). Turn it into inline SVG with :func:`revolve.render.report.svg_of`.
"""

from __future__ import annotations

import textwrap
from typing import Optional, Sequence, Tuple

import numpy as np

__all__ = ["level_picture", "picture_of", "label_boxes"]

VOLUME_COLOUR = "#1f77b4"
AREA_COLOUR = "#d62728"
MARK_COLOUR = "#555555"
WALL_COLOUR = "#222222"


def _ticks(axis) -> None:
    from matplotlib.ticker import FuncFormatter

    from revolve.render import numbers

    axis.set_major_formatter(FuncFormatter(lambda v, _pos: numbers.number(v, 6)))


def level_picture(levels, volumes, wetted_areas=None, *, level_unit: str, volume_unit: str,
                  area_unit: Optional[str] = None, capacity: Optional[float] = None,
                  profile: Optional[Tuple[Sequence[float], Sequence[float]]] = None,
                  marks: Sequence[Tuple[float, str]] = (), title: Optional[str] = None,
                  size: Tuple[float, float] = (7.5, 4.8), profile_title: str = "vessel"):
    """A matplotlib Figure of a level table, values already in their display units.

    Parameters
    ----------
    levels, volumes : array_like
        The table's levels and the volume below each (same length, >= 1).
    wetted_areas : array_like, optional
        The wetted area at each level (a second axis, at the top).
    level_unit, volume_unit, area_unit : str
        Display units (``mm``, ``L``, ``m²``); ``area_unit`` is needed with
        ``wetted_areas``.
    capacity : float, optional
        The vessel's capacity in ``volume_unit`` (a vertical line).
    profile : (z, r) arrays, optional
        The vessel's half-profile in ``level_unit`` (level up, radius across),
        drawn in a panel beside the chart on the same level scale.
    marks : sequence of (level, label)
        Horizontal marks (the heads' tangent lines), drawn across both panels.
    title : str, optional
        Wrapped to fit the canvas.
    profile_title : str
        The vessel panel's title ("vessel"; "end view" for a lying vessel's circle).

    Examples
    --------
    >>> fig = level_picture([0, 1, 2], [0, 10, 20], [0.0, 3.0, 6.0], level_unit="m",
    ...                     volume_unit="m³", area_unit="m²", capacity=20,
    ...                     profile=([0, 0, 2, 2], [0, 1.2, 1.2, 0]), marks=[(0.5, "tangent")])
    >>> [ax.get_ylabel() for ax in fig.axes][:2], fig.axes[1].get_xlabel()
    (['level (m)', ''], 'volume (m³)')
    >>> level_picture([0.0], [0.0], level_unit="mm", volume_unit="L").axes[0].get_xlabel()
    'volume (L)'
    >>> level_picture([0, 1], [0, 1, 2], level_unit="mm", volume_unit="L")
    Traceback (most recent call last):
    ...
    ValueError: levels and volumes differ in length (2 and 3)
    """
    from matplotlib.figure import Figure

    levels = np.asarray(levels, dtype=float).ravel()
    volumes = np.asarray(volumes, dtype=float).ravel()
    if levels.size != volumes.size:
        raise ValueError(f"levels and volumes differ in length ({levels.size} and {volumes.size})")
    if levels.size == 0:
        raise ValueError("a level picture needs at least one level")
    areas = None
    if wetted_areas is not None:
        areas = np.asarray(wetted_areas, dtype=float).ravel()
        if areas.size != levels.size:
            raise ValueError(f"levels and wetted areas differ in length ({levels.size} and "
                             f"{areas.size})")
        if not area_unit:
            raise ValueError("wetted areas need their unit (area_unit)")

    fig = Figure(figsize=size, layout="constrained")
    if profile is not None:
        z, r = (np.asarray(a, dtype=float).ravel() for a in profile)
        if z.size != r.size or z.size == 0:
            raise ValueError("the profile needs as many radii as levels (z, r)")
        # The vessel panel about to scale: its width over the plot height as 2.3 radii over the
        # level span (the plot height taken as 70 % of the figure's), kept between 15 % and 55 %.
        both = np.r_[z, levels]
        span = max(float(np.nanmax(both) - np.nanmin(both)), 1e-300)
        share = 0.7 * size[1] * 2.3 * max(float(np.nanmax(np.abs(r))), 1e-300) / span / size[0]
        share = min(max(share, 0.15), 0.55)
        grid = fig.add_gridspec(1, 2, width_ratios=(share, 1 - share))
        side = fig.add_subplot(grid[0, 0])
        chart = fig.add_subplot(grid[0, 1], sharey=side)
    else:
        side = None
        chart = fig.add_subplot()

    handles = []
    handles += chart.plot(volumes, levels, color=VOLUME_COLOUR, lw=1.8, marker="." if levels.size < 30 else None,
                          label=f"volume ({volume_unit})")
    chart.set_xlabel(f"volume ({volume_unit})")
    _ticks(chart.xaxis)
    _ticks(chart.yaxis)
    chart.grid(True, color="#dddddd", lw=0.6)
    if capacity is not None:
        handles.append(chart.axvline(capacity, color=VOLUME_COLOUR, lw=1, ls=(0, (5, 3)),
                                     label=f"capacity {_number(capacity)} {volume_unit}"))
    if areas is not None:
        top = chart.twiny()
        handles += top.plot(areas, levels, color=AREA_COLOUR, lw=1.5, ls=(0, (6, 2, 1, 2)),
                            label=f"wetted area ({area_unit})")
        top.set_xlabel(f"wetted area ({area_unit})", color=AREA_COLOUR)
        top.tick_params(axis="x", colors=AREA_COLOUR)
        top.set_xlim(left=0)
        _ticks(top.xaxis)
    chart.set_xlim(left=0)

    level_label = f"level ({level_unit})"
    if side is not None:
        side.plot(r, z, color=WALL_COLOUR, lw=1.6)
        side.plot(-r, z, color=WALL_COLOUR, lw=0.8, alpha=0.35)
        side.axvline(0, color="#444444", lw=0.7, ls=(0, (10, 3, 2, 3)))
        reach = 1.12 * max(float(np.nanmax(np.abs(r))), 1e-300)
        side.set_xlim(-reach, reach)
        side.set_ylabel(level_label)
        side.set_xlabel(f"radius ({level_unit})")
        _ticks(side.xaxis)
        side.tick_params(axis="x", labelsize=8)
        side.set_title(profile_title, fontsize=9)
        chart.tick_params(axis="y", labelleft=False)
    else:
        chart.set_ylabel(level_label)

    for level, _label in marks:
        for ax in (side, chart):
            if ax is not None:
                ax.axhline(level, color=MARK_COLOUR, lw=0.8, ls=(0, (2, 2)))
    # Mark labels, outside the chart on the right (the lines cross both panels), name their level
    # too: marks closer than a label's height are stacked and still told apart.
    mark_texts = [chart.annotate(
        f"{textwrap.shorten(str(label), 28)}, {_number(level)} {level_unit}", xy=(1.0, level),
        xycoords=("axes fraction", "data"), xytext=(4, 0), textcoords="offset points",
        ha="left", va="center", fontsize=7.5, color=MARK_COLOUR, annotation_clip=False)
        for level, label in marks]

    chart.legend(handles=handles, loc="lower right", fontsize=8, framealpha=0.9)
    if title:
        fig.suptitle(textwrap.fill(str(title), 70), fontsize=11)
    _separate(fig, mark_texts)
    return fig



def picture_of(result, title: Optional[str] = None):
    """The picture of a :class:`~revolve.jobs.levels.LevelResult`: its rows, its vessel, its marks.

    Volumes are the table's (after deadwood and the shell factor); marks are
    the datum plate and the reference point where the table has them, and
    the empty level of a tilted table.

    >>> from revolve.geometry.profile import Chain, Profile
    >>> from revolve.jobs.levels import level_table
    >>> drum = Profile(chains=(Chain.from_points([(0, 0), (500, 0), (500, 2000), (0, 2000)]),),
    ...                unit="mm")
    >>> fig = picture_of(level_table(drum, orientation="vertical", axis="y", count=4,
    ...                              datum_offset="50 mm"))
    >>> fig.axes[1].get_xlabel(), [t.get_text() for t in fig.axes[1].texts]
    ('volume (L)', ['datum plate, 50 mm'])
    """
    rows = result.rows
    units = result.units
    space = result.table("space").json(units)
    levels = [r["level"] for r in rows]
    volumes = [r["volume"] for r in rows]
    areas = [r["wetted_area"] for r in rows]
    marks = []
    if "datum_offset" in space:
        marks.append((space["datum_offset"], "datum plate"))
        if "reference_height" in space:
            marks.append((space["datum_offset"] + space["reference_height"], "reference point"))
    if "empty_level" in space and abs(space["empty_level"]) > 0:
        marks.append((space["empty_level"], "empty"))
    outline = getattr(result, "outline", None)
    profile, profile_title = None, "vessel"
    if outline is not None:
        profile = (outline[0], outline[1])
        profile_title = "vessel" if outline[2] == "section" else "end view"
    order = sorted(range(len(levels)), key=lambda k: levels[k])
    return level_picture([levels[k] for k in order], [volumes[k] for k in order],
                         [areas[k] for k in order], level_unit=units.unit("level"),
                         volume_unit=units.unit("capacity"), area_unit=units.unit("area"),
                         capacity=space.get("capacity"), profile=profile, marks=marks,
                         title=title or result.table("space").title,
                         profile_title=profile_title)

def _number(value: float) -> str:
    from revolve.render import numbers

    return numbers.number(value, 6)


def label_boxes(fig):
    """The window extents of every visible, non-empty text of ``fig`` (after drawing it).

    Returns a list of ``(text, Bbox)``; the test of the picture checks that no
    two overlap and that all lie on the canvas.

    >>> from matplotlib.figure import Figure
    >>> fig = Figure(figsize=(2, 2))
    >>> ax = fig.add_subplot(); _ = ax.set_xlabel("x (mm)")
    >>> "x (mm)" in [t for t, _ in label_boxes(fig)]
    True
    """
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.text import Text

    if not isinstance(fig.canvas, FigureCanvasAgg):
        FigureCanvasAgg(fig)
    fig.canvas.draw()
    renderer = fig.canvas.get_renderer()
    hidden = _ticks_not_drawn(fig)
    out = []
    for artist in fig.findobj(Text):
        if not artist.get_visible() or not artist.get_text().strip() or id(artist) in hidden:
            continue
        out.append((artist.get_text(), artist.get_window_extent(renderer)))
    return out


def _ticks_not_drawn(fig) -> set:
    """Ids of tick labels matplotlib keeps but does not draw (ticks outside the view)."""
    hidden = set()
    for axes in fig.axes:
        for axis in (axes.xaxis, axes.yaxis):
            lo, hi = sorted(axis.get_view_interval())
            span = (hi - lo) or 1.0
            for tick in axis.get_major_ticks() + axis.get_minor_ticks():
                if not (tick.get_visible() and lo - 1e-9 * span <= tick.get_loc() <= hi + 1e-9 * span):
                    hidden.update((id(tick.label1), id(tick.label2)))
    return hidden


def _separate(fig, texts) -> None:
    """Stack mark labels that would touch one another upwards, in the order of their levels."""
    if len(texts) < 2:
        return
    from matplotlib.backends.backend_agg import FigureCanvasAgg

    FigureCanvasAgg(fig)
    fig.canvas.draw()
    renderer = fig.canvas.get_renderer()
    points_per_pixel = 72.0 / fig.dpi
    placed = []
    for t in sorted(texts, key=lambda t: t.xy[1]):
        box = t.get_window_extent(renderer)
        for _ in range(len(texts)):
            below = [b for b in placed if box.overlaps(b)]
            if not below:
                break
            lift = (max(b.y1 for b in below) - box.y0 + 1.5) * points_per_pixel
            x, y = t.get_position()
            t.set_position((x, y + lift))
            box = t.get_window_extent(renderer)
        placed.append(box)
