"""Pictures of a profile and of its revolved solid (PNG or SVG, matplotlib).

:func:`profile_picture` draws the half-profile as the user drew it: the
section filled and hatched, every face in its own colour with a legend, the
axis as a centre line (long dash, short dash), the section centroid and the
boundary centroid marked and labelled with their distances from the axis,
the length along the axis and the diameters (Ø) across it dimensioned as a
machinist reads them, and the key results in a caption. Titles and captions are
wrapped by their measured width, the legend kept inside the picture, and the
centroid labels placed clear of every other text.

:func:`solid_picture` draws the revolved solid in 3-D (shaded triangles of
:func:`revolve.geometry.mesh.revolve_mesh`, faces in the same colours); a
partial revolution is shown open, its cut faces in the section's grey. It
projects the triangles itself (orthographic), leaves out back faces of a closed
solid, cuts long triangles small (:func:`split_long_triangles`) and paints them
far to near in one collection (:func:`painter_order`), so a bore or groove never
shows through the surface in front of it.

matplotlib is imported inside the functions (never at start-up) and only its
object interface is used (``Figure`` with the Agg canvas), so no global
backend is switched. Colours come from matplotlib's default ``tab10`` cycle.
Both give the picture's bytes; the command writes them under the one
overwrite rule (:func:`revolve.render.output.write_outputs`). The picture has
exactly the requested size in pixels (PNG) or in points at 72 per inch for
``dpi`` pixels per inch (SVG). Units are a
:class:`revolve.jobs.results.OutputUnits` (:func:`revolve.jobs.measuring.part_units`);
numbers are written as the tables write them (:mod:`revolve.render.numbers`).

Examples
--------
>>> picture_format("part.PNG"), picture_format("part.svg")
('png', 'svg')
>>> picture_format("part.jpg")
Traceback (most recent call last):
...
revolve.errors.FormatError: part.jpg: pictures are written as .png or .svg, not ".jpg"
"""

from __future__ import annotations

import math
import os
from typing import List, Optional, Sequence, Tuple

import numpy as np

from revolve.errors import FormatError, RevolveError
from revolve.render.drawing import (AXIS_COLOUR, AXIS_DASHES, CUT_FACE_COLOUR, SECTION_FILL,
                                    SECTION_HATCH, draw_section, face_styles, sketch_paths)
from revolve.render.numbers import group_digits, number as _number

#: Picture formats by file name ending.
FORMATS = {".png": "png", ".svg": "svg"}


def fmt(value, digits: int = 6) -> str:
    """A figure in a picture: ``digits`` significant figures, as the tables write them."""
    return _number(value, digits)


class _Shown:
    """The output units of a picture as factors from the profile's unit (and from kg)."""

    def __init__(self, units, profile_unit: str):
        from revolve import units as registry

        si = registry.factor(profile_unit, "length")
        self.length, self.area = units.unit("length"), units.unit("area")
        self.volume, self.mass = units.unit("volume"), units.unit("mass")
        self.length_factor = units.show(si, "length")
        self.area_factor = units.show(si ** 2, "area")
        self.volume_factor = units.show(si ** 3, "volume")
        self.mass_factor = units.show(1.0, "mass")

def picture_format(path: str) -> str:
    """``"png"`` or ``"svg"`` from the file name's ending; anything else is refused."""
    ext = os.path.splitext(os.fspath(path))[1].lower()
    if ext not in FORMATS:
        raise FormatError(f'pictures are written as .png or .svg, not "{ext or path}"', file=path)
    return FORMATS[ext]


def _figure(width: int, height: int, dpi: int):
    from matplotlib.figure import Figure

    if not (isinstance(width, int) and isinstance(height, int)) or width < 200 or height < 150 \
            or width > 10000 or height > 10000:
        raise RevolveError(f"the picture size must be whole pixels, at least 200 × 150 and at most "
                           f"10000 × 10000, got {width} × {height}")
    if not (isinstance(dpi, int) and 30 <= dpi <= 1200):
        raise RevolveError(f"the picture resolution must be 30 to 1200 pixels per inch, got {dpi}")
    return Figure(figsize=(width / dpi, height / dpi), dpi=dpi)


def figure_bytes(fig, path: str) -> bytes:
    """A figure's file contents in the format its name says (PNG or SVG).

    >>> figure_bytes(_figure(300, 200, 100), "p.png")[:4]
    b'\x89PNG'
    """
    import io

    from matplotlib.backends.backend_agg import FigureCanvasAgg

    kind = picture_format(path)
    FigureCanvasAgg(fig)
    metadata = {"Software": "revolve"} if kind == "png" else {"Creator": "revolve"}
    buffer = io.BytesIO()
    fig.savefig(buffer, format=kind, dpi=fig.dpi, metadata=metadata)
    return buffer.getvalue()


# -- the profile --------------------------------------------------------------------

def _wrapped(fig, text: str, room: float, **font) -> List[str]:
    """``text`` cut at spaces into lines no wider than ``room`` pixels as ``font`` draws them.

    A word wider than the room stays on its own line.

    >>> fig = _figure(400, 300, 100)
    >>> lines = _wrapped(fig, "one two three four five six seven eight nine ten", 120, fontsize=10)
    >>> len(lines) > 1, " ".join(lines)
    (True, 'one two three four five six seven eight nine ten')
    >>> _wrapped(fig, "unbreakable", 5, fontsize=10)
    ['unbreakable']
    >>> _wrapped(fig, "", 100, fontsize=10)
    ['']
    """
    from matplotlib.backends.backend_agg import FigureCanvasAgg

    if fig.canvas is None or not isinstance(fig.canvas, FigureCanvasAgg):
        FigureCanvasAgg(fig)
    renderer = fig.canvas.get_renderer()
    probe = fig.text(0, 0, "", **font)
    lines: List[str] = []
    for paragraph in text.split("\n"):
        line = ""
        for word in paragraph.split(" "):
            trial = f"{line} {word}" if line else word
            probe.set_text(trial)
            if line and probe.get_window_extent(renderer).width > room:
                lines.append(line)
                line = word
            else:
                line = trial
        lines.append(line)
    probe.remove()
    return lines


def _frame(fig, title: Optional[str], caption: Sequence[str], fs: float) -> Tuple[float, float]:
    """Write the title (top) and the caption (bottom), each wrapped to the picture's width.

    Returns the caption's top and the title's bottom as fractions of the
    figure's height: the drawing goes between them.
    """
    width, height = fig.get_size_inches() * fig.dpi
    room = width * 0.94
    px = fig.dpi / 72.0
    lines = [w for line in caption for w in _wrapped(fig, line, room, fontsize=fs)]
    fig.text(0.03, 0.02, "\n".join(lines), fontsize=fs, va="bottom", ha="left",
             linespacing=1.45, color="#222222")
    caption_top = 0.02 + (len(lines) * fs * 1.45 + 0.6 * fs) * px / height
    if not title:
        return caption_top, 0.97
    heading = _wrapped(fig, title, room, fontsize=fs * 1.35, fontweight="bold")
    fig.text(0.03, 1.0 - 0.9 * fs * px / height, "\n".join(heading), fontsize=fs * 1.35,
             fontweight="bold", va="top", ha="left", linespacing=1.2)
    return caption_top, 1.0 - (0.9 + len(heading) * 1.35 * 1.2 * 1.2 + 0.3) * fs * px / height


def _caption_lines(m, u, revolution, density_label: Optional[str], extra: Sequence[str] = ()) -> List[str]:
    f = fmt
    first = [f"revolved {float(revolution.angle_degrees):g}° about {_axis_text(revolution.axis)}"]
    if m.has_solid:
        first.append(f"section area {f(m.area * u.area_factor)} {u.area}")
        first.append(f"volume {f(m.volume * u.volume_factor)} {u.volume}")
    surface = f"surface {f(m.surface_total * u.area_factor)} {u.area}"
    if m.cut_face_area is not None:
        surface += f" swept + 2 × {f(m.cut_face_area * u.area_factor)} {u.area} cut faces"
    first.append(surface)
    lines = ["   ·   ".join(first)]
    if m.mass is not None:
        lines.append(f"mass {f(m.mass * u.mass_factor)} {u.mass} (estimate from nominal geometry)"
                     + (f"   ·   {density_label}" if density_label else ""))
    if m.crosscheck is not None:
        parts = []
        if m.has_solid:
            parts.append(f"volume {m.crosscheck.volume_difference:.1e}")
        parts.append(f"surface {m.crosscheck.surface_difference:.1e}")
        lines.append("second computation (washers, quadrature of r ds), relative difference: "
                     + ", ".join(parts))
    lines += list(extra)
    return lines


def _axis_text(axis) -> str:
    d = axis.unit_direction()
    p = (float(axis.point[0]), float(axis.point[1]))
    if p == (0.0, 0.0) and d == (1.0, 0.0):
        return "the sketch x axis"
    if p == (0.0, 0.0) and d == (0.0, 1.0):
        return "the sketch y axis"
    return (f"the axis through ({fmt(p[0], 6)}, {fmt(p[1], 6)}) "
            f"along ({fmt(d[0], 4)}, {fmt(d[1], 4)})")


def _dimension(ax, feature_a, feature_b, line_a, line_b, text, arrows, gap, colour="#333333",
               fontsize=9):
    """A dimension line from ``line_a`` to ``line_b`` with extension lines from the features.

    ``feature_b`` may be None (a diameter drawn from the axis: one extension
    line, one arrowhead at ``line_b``). The text sits on the line's middle,
    turned along it and kept upright. Returns sample points of the ink it put
    down (for placing labels clear of it).
    """
    la, lb = np.asarray(line_a, float), np.asarray(line_b, float)
    ink = []
    for f, q in ((feature_a, la), (feature_b, lb)):
        if f is None:
            continue
        f = np.asarray(f, float)
        if arrows == "-|>":   # a diameter: the extension line ends at the line's far end
            q = lb
        d = q - f
        n = np.linalg.norm(d)
        if n <= 1e-12 * (gap or 1.0):
            continue
        e0, e1 = f + d / n * min(0.15 * gap, 0.3 * n), q + d / n * 0.25 * gap
        ax.plot([e0[0], e1[0]], [e0[1], e1[1]], color=colour, lw=0.6, zorder=4)
        ink.append(np.linspace(e0, e1, 24))
    ax.annotate("", xy=lb, xytext=la, zorder=4,
                arrowprops=dict(arrowstyle=arrows, color=colour, lw=0.8, shrinkA=0, shrinkB=0,
                                mutation_scale=9))
    ink.append(np.linspace(la, lb, 60))
    mid = (la + lb) / 2
    angle = math.degrees(math.atan2(lb[1] - la[1], lb[0] - la[0]))
    if angle > 90.5 or angle <= -89.5:
        angle -= 180.0 * np.sign(angle) if angle != 0 else 0.0
    ax.text(mid[0], mid[1], text, rotation=angle, rotation_mode="anchor", ha="center",
            va="center", fontsize=fontsize, color=colour, zorder=5,
            bbox=dict(boxstyle="round,pad=0.2", fc="white", ec="none"))
    return np.vstack(ink)


def _resample(points: np.ndarray, spacing: float) -> np.ndarray:
    """Points along a polyline no farther apart than ``spacing``.

    >>> _resample(np.array([[0.0, 0.0], [1.0, 0.0]]), 0.3).tolist()
    [[0.0, 0.0], [0.25, 0.0], [0.5, 0.0], [0.75, 0.0], [1.0, 0.0]]
    """
    p, q = points[:-1], points[1:]
    n = np.maximum(1, np.ceil(np.hypot(*(q - p).T) / spacing)).astype(int)
    chord = np.repeat(np.arange(len(p)), n)
    step = (np.arange(int(n.sum())) - np.repeat(np.cumsum(n) - n, n) + 1) / np.repeat(n, n)
    return np.vstack([points[:1], p[chord] + (q - p)[chord] * step[:, None]])


def _place_labels(fig, ax, marks, ink_data: np.ndarray, fontsize: float, dpi: int) -> None:
    """Label each mark where its box covers the least ink, inside the axes, clear of other labels.

    ``marks`` holds (text, data point); ``ink_data`` are sample points (data
    coordinates) of lines already drawn. Candidate places lie around the mark
    at a few distances; the first label's box is an obstacle for the second.
    """
    renderer = fig.canvas.get_renderer()
    to_px = ax.transData.transform
    ink = to_px(ink_data) if len(ink_data) else np.zeros((0, 2))
    bounds = ax.get_window_extent(renderer)
    taken: List[Tuple[float, float, float, float]] = []
    for drawn in ax.texts:   # dimensions and the axis's name are obstacles too
        if drawn.get_text().strip():
            e = drawn.get_window_extent(renderer)
            taken.append((e.x0 - 3, e.y0 - 3, e.x1 + 3, e.y1 + 3))
    px_per_pt = dpi / 72.0
    marks_px = [to_px(np.asarray(p, float)[None])[0] for _, p in marks]
    angles = np.radians([45, 135, -45, -135, 90, -90, 0, 180, 22, 158, -22, -158, 68, 112, -68, -112])
    for (text, p), anchor in zip(marks, marks_px):
        probe = ax.text(0, 0, text, fontsize=fontsize * 0.9, transform=None)
        box = probe.get_window_extent(renderer)
        probe.remove()
        w, h = box.width + 10 * px_per_pt, box.height + 8 * px_per_pt
        best, best_score = None, None
        for radius in (34, 56, 84, 120):
            r = radius * px_per_pt
            for k, a in enumerate(angles):
                dx, dy = r * math.cos(a), r * 0.75 * math.sin(a)
                x0 = anchor[0] + dx - (0 if dx > 1 else (w if dx < -1 else w / 2))
                y0 = anchor[1] + dy - (0 if dy > 1 else (h if dy < -1 else h / 2))
                x1, y1 = x0 + w, y0 + h
                score = 0.0
                out = max(0.0, bounds.x0 - x0) + max(0.0, x1 - bounds.x1) + \
                    max(0.0, bounds.y0 - y0) + max(0.0, y1 - bounds.y1)
                score += 50.0 * out + (3000.0 if out > 0 else 0.0)
                if len(ink):
                    inside = (ink[:, 0] > x0) & (ink[:, 0] < x1) & (ink[:, 1] > y0) & (ink[:, 1] < y1)
                    score += 4.0 * float(np.count_nonzero(inside))
                for q in marks_px:  # never cover a mark
                    if x0 - 6 < q[0] < x1 + 6 and y0 - 6 < q[1] < y1 + 6:
                        score += 400.0
                for (tx0, ty0, tx1, ty1) in taken:
                    ox = max(0.0, min(x1, tx1) - max(x0, tx0))
                    oy = max(0.0, min(y1, ty1) - max(y0, ty0))
                    score += 5.0 * ox * oy / px_per_pt + (2000.0 if ox * oy > 0 else 0.0)
                score += 0.6 * radius + 0.5 * k  # near and in the usual places first
                if best_score is None or score < best_score:
                    best_score, best = score, (dx, dy, (x0, y0, x1, y1))
        dx, dy, rect = best
        taken.append(rect)
        ax.annotate(text, xy=p, xytext=(dx / px_per_pt, dy / px_per_pt), textcoords="offset points",
                    fontsize=fontsize * 0.9, ha="left" if dx > 1 else ("right" if dx < -1 else "center"),
                    va="bottom" if dy > 1 else ("top" if dy < -1 else "center"), zorder=7,
                    bbox=dict(boxstyle="round,pad=0.3", fc="white", ec="#999999", lw=0.6, alpha=0.94),
                    arrowprops=dict(arrowstyle="-", color="#555555", lw=0.7, shrinkA=0, shrinkB=5))


def profile_picture(revolution, measurement, path: str, *, units, title: Optional[str] = None,
                    density_label: Optional[str] = None, width: int = 1200, height: int = 800,
                    dpi: int = 100) -> bytes:
    """Draw the profile with its axis, centroids, faces, dimensions and key results.

    Parameters
    ----------
    revolution : revolve.geometry.profile.Revolution
    measurement : revolve.geometry.measure.Measurement
        Its results go into the caption and place the centroids.
    path : str
        The file's name: its ending (``.png`` or ``.svg``) chooses the format.
    units : revolve.jobs.results.OutputUnits
        Units of the dimensions and the caption.
    title : str, optional
        Heading (the profile's name).
    density_label : str, optional
        Where the density came from, shown beside the mass.
    width, height, dpi : int
        Picture size in pixels and its resolution.

    Examples
    --------
    >>> import os, tempfile
    >>> from revolve.jobs.measuring import part_units
    >>> from revolve.geometry.measure import measure
    >>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    >>> rev = Revolution(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> out = os.path.join(tempfile.mkdtemp(), "ring.png")
    >>> data = profile_picture(rev, measure(rev), out, units=part_units("mm"), width=400, height=300)
    >>> with open(out, "wb") as f:
    ...     _ = f.write(data)
    >>> import matplotlib.image
    >>> matplotlib.image.imread(out).shape[:2]
    (300, 400)
    """
    picture_format(path)
    return figure_bytes(profile_figure(revolution, measurement, units=units, title=title,
                                       density_label=density_label, width=width, height=height,
                                       dpi=dpi), path)


def profile_figure(revolution, measurement, *, units, title: Optional[str] = None,
                   density_label: Optional[str] = None, width: int = 1200, height: int = 800,
                   dpi: int = 100, figures: bool = True):
    """The matplotlib ``Figure`` of :func:`profile_picture` (drawn on the Agg canvas).

    ``figures=False`` leaves the results out of the caption (only how the
    profile is revolved): a report shows them in its tables.

    >>> from revolve.jobs.measuring import part_units
    >>> from revolve.geometry.measure import measure
    >>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    >>> rev = Revolution(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> fig = profile_figure(rev, measure(rev), units=part_units("mm"))
    >>> sorted(t.get_text() for t in fig.axes[0].texts if t.get_text().startswith("Ø"))
    ['Ø2 mm', 'Ø6 mm']
    """
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.lines import Line2D
    from matplotlib.patches import Patch

    from revolve.geometry.checks import prepare

    m, u = measurement, _Shown(units, revolution.profile.unit)
    profile, axis = revolution.profile, revolution.axis
    prep = prepare(profile, axis)
    size = prep.size
    L = u.length_factor
    flat = sketch_paths(profile, size)
    allpts = np.vstack([q for fs in flat for q in fs])
    lo, hi = allpts.min(axis=0), allpts.max(axis=0)
    ux, uy = axis.unit_direction()
    along = np.array([ux, uy])
    origin = np.array([float(axis.point[0]), float(axis.point[1])])
    towards = prep.side * np.array([-uy, ux])  # from the axis towards the profile
    centre = (lo + hi) / 2
    axis_distance = abs(float(np.dot(centre - origin, towards)))
    show_axis = axis_distance <= 6.0 * size

    fig = _figure(width, height, dpi)
    FigureCanvasAgg(fig)
    scale = min(width, height * 1.5) / 1200.0 * 100.0 / dpi  # font scale for small pictures
    fs = max(7.0 * 100.0 / dpi, 10.0 * scale)
    caption = _caption_lines(m, u, revolution, density_label)
    if not figures:
        caption = caption[:1][0].split("   ·   ")[:1]
    caption_height, top = _frame(fig, title, caption, fs)
    ax = fig.add_axes([0.03, caption_height + 0.03, 0.72, top - caption_height - 0.04])
    ax.set_axis_off()

    verts, styles = draw_section(ax, profile, prep, flat, axis)

    # Legend of faces, outside the drawing on the right.
    handles = [Line2D([], [], color=c, linestyle=s, lw=2.4) for c, s in styles.values()]
    chain_only = _chain_faces(profile) - _loop_faces(profile)
    labels = [f"{n} (surface only)" if n in chain_only else n for n in styles]
    if verts:
        handles.append(Patch(facecolor=SECTION_FILL, edgecolor=SECTION_HATCH, hatch="////"))
        labels.append("section")
    handles.append(Line2D([], [], color=AXIS_COLOUR, lw=1.0, linestyle=AXIS_DASHES))
    labels.append("axis of revolution")
    _legend_beside(fig, ax, handles, labels, top, fs, handlelength=2.6)

    # The part in the axis frame: z along the axis, r from it.
    z_all, r_all = (allpts - origin) @ along, (allpts - origin) @ towards
    z0, z1, r0, r1 = float(z_all.min()), float(z_all.max()), float(r_all.min()), float(r_all.max())
    # the figures written on the dimensions are exact (each frame segment's bounds: an arc's
    # crest between the sketch's sample points counts), the lines are drawn at the samples
    bounds = np.array([seg.bounds() for path in prep.paths for seg in path])
    length_text = float(bounds[:, 2].max() - bounds[:, 0].min())
    outer_text, inner_text = float(bounds[:, 3].max()), float(bounds[:, 1].min())
    at = lambda z, r: origin + z * along + r * towards  # noqa: E731
    near = 1e-9 * size
    gap = 0.09 * max(z1 - z0, r1 - (0.0 if show_axis else r0), 1e-12 * size)
    # Dimensions as a machinist reads them: the length along the axis; diameters (Ø) across it
    # when the axis is in the picture, else the radial extent (the diameters go in the caption).
    dims = []   # (feature a, feature b, line a, line b, text, arrows)
    if z1 - z0 > 1e-12 * size:
        fa = allpts[np.argmax(np.where(np.abs(z_all - z0) <= near * 10, r_all, -np.inf))]
        fb = allpts[np.argmax(np.where(np.abs(z_all - z1) <= near * 10, r_all, -np.inf))]
        dims.append((fa, fb, at(z0, r1 + gap), at(z1, r1 + gap),
                     f"{fmt(length_text * L, 5)} {u.length}", "<|-|>"))
    solid_bore = r0 > 1e-6 * size
    if show_axis:
        if r1 > 1e-12 * size:
            f = allpts[np.argmax(np.where(np.abs(r_all - r1) <= near * 10, z_all, -np.inf))]
            dims.append((f, None, at(z1 + gap, 0.0), at(z1 + gap, r1),
                         f"Ø{fmt(2 * outer_text * L, 5)} {u.length}", "-|>"))
        if solid_bore:
            f = allpts[np.argmin(np.where(np.abs(r_all - r0) <= near * 10, z_all, np.inf))]
            dims.append((f, None, at(z0 - gap, 0.0), at(z0 - gap, r0),
                         f"Ø{fmt(2 * inner_text * L, 5)} {u.length}", "-|>"))
    elif r1 - r0 > 1e-12 * size:
        fa = allpts[np.argmax(np.where(np.abs(r_all - r0) <= near * 10, z_all, -np.inf))]
        fb = allpts[np.argmax(np.where(np.abs(r_all - r1) <= near * 10, z_all, -np.inf))]
        dims.append((fa, fb, at(z1 + gap, r0), at(z1 + gap, r1),
                     f"{fmt((outer_text - inner_text) * L, 5)} {u.length}", "<|-|>"))

    # The view: the profile, the foot of the axis beside it, room for the dimensions.
    view_pts = [allpts] + [np.array([d[2], d[3]]) for d in dims]
    if show_axis:
        view_pts.append(np.array([at(z0 - 1.4 * gap, 0.0), at(z1 + 1.4 * gap, 0.0)]))
    else:
        reach = float(np.max(np.abs((allpts - centre) @ towards)))
        arrow_start = centre - towards * (reach + 0.12 * size)
        arrow_end = arrow_start - towards * 0.15 * size
        view_pts.append(np.array([arrow_start, arrow_end]))
    every = np.vstack(view_pts)
    view_lo, view_hi = every.min(axis=0), every.max(axis=0)
    span = float(np.max(view_hi - view_lo)) or size
    view_lo, view_hi = view_lo - 0.07 * span, view_hi + 0.07 * span
    # Widen the view to the axes' own shape so that equal scales need no other change.
    box_w = ax.get_position().width * width
    box_h = ax.get_position().height * height
    vw, vh = view_hi - view_lo
    mid = (view_lo + view_hi) / 2
    if vw / vh < box_w / box_h:
        vw = vh * box_w / box_h
    else:
        vh = vw * box_h / box_w
    view_lo, view_hi = mid - (vw / 2, vh / 2), mid + (vw / 2, vh / 2)
    ax.set_xlim(view_lo[0], view_hi[0])
    ax.set_ylim(view_lo[1], view_hi[1])
    ax.set_aspect("equal", adjustable="box")

    ink = [_resample(np.vstack([p[:-1] for p in pieces] + [pieces[-1][-1:]]), span / 400.0)
           for pieces in flat]
    for fa, fb, la, lb, text, arrows in dims:
        ink.append(_dimension(ax, fa, fb, la, lb, text, arrows, gap, fontsize=fs * 0.95))

    # The axis: a centre line across the view, its direction arrowed and named.
    if show_axis:
        box = np.array([[view_lo[0], view_lo[1]], [view_lo[0], view_hi[1]],
                        [view_hi[0], view_lo[1]], [view_hi[0], view_hi[1]]])
        t = (box - origin) @ along
        a_pt, b_pt = origin + t.min() * along, origin + t.max() * along
        # Keep the arrow and the name inside the view: walk back from the far end.
        inside = lambda q: bool(np.all(q >= view_lo) and np.all(q <= view_hi))  # noqa: E731
        tip = b_pt
        for frac in np.linspace(1.0, 0.5, 51):
            tip = a_pt + frac * (b_pt - a_pt)
            if inside(tip) and inside(tip - 0.06 * span * along):
                break
        tip = tip - 0.05 * span * along
        ax.plot([a_pt[0], b_pt[0]], [a_pt[1], b_pt[1]], color=AXIS_COLOUR, lw=1.0,
                linestyle=AXIS_DASHES, zorder=2)
        ax.annotate("", xy=tip + 0.04 * span * along, xytext=tip, zorder=2,
                    arrowprops=dict(arrowstyle="-|>", color=AXIS_COLOUR, lw=1.0, mutation_scale=12))
        label_at = tip - 0.035 * span * towards
        angle = math.degrees(math.atan2(uy, ux))
        if angle > 90 or angle < -90:
            angle -= 180 * np.sign(angle)
        ax.text(label_at[0], label_at[1], "axis", rotation=angle, rotation_mode="anchor",
                ha="center", va="center", fontsize=fs, color=AXIS_COLOUR, style="italic", zorder=5,
                bbox=dict(boxstyle="round,pad=0.15", fc="white", ec="none", alpha=0.8))
        ink.append(np.linspace(a_pt, b_pt, 400))
        ink.append(np.repeat(label_at[None], 8, axis=0))
    else:
        ax.annotate(f"axis {fmt(axis_distance * L, 5)} {u.length} away", xy=arrow_end,
                    xytext=arrow_start, ha="center", va="center", fontsize=fs, color=AXIS_COLOUR,
                    style="italic", zorder=5, bbox=dict(boxstyle="round,pad=0.2", fc="white", ec="none"),
                    arrowprops=dict(arrowstyle="-|>", color=AXIS_COLOUR, lw=1.0))
        ink.append(np.linspace(arrow_start - 0.1 * size * along, arrow_start + 0.1 * size * along, 20))

    # Centroids: marked, then labelled where the labels cover the least.
    marks = []
    if m.has_solid and np.all(np.isfinite(m.centroid)):
        p = np.array(m.centroid)
        ax.plot([p[0]], [p[1]], marker="o", markersize=11, markerfacecolor="none",
                markeredgecolor="black", markeredgewidth=1.3, linestyle="none", zorder=6)
        ax.plot([p[0]], [p[1]], marker="+", markersize=15, color="black", mew=0.9, zorder=6)
        marks.append((f"section centroid\n{fmt(m.centroid_distance * L, 5)} {u.length} from the axis", p))
    if np.all(np.isfinite(m.boundary_centroid)):
        p = np.array(m.boundary_centroid)
        ax.plot([p[0]], [p[1]], marker="D", markersize=5, markerfacecolor="black",
                markeredgecolor="white", markeredgewidth=0.6, linestyle="none", zorder=6.5)
        marks.append((f"boundary centroid\n{fmt(m.boundary_centroid_distance * L, 5)} {u.length} "
                      "from the axis", p))
    _place_labels(fig, ax, marks, np.vstack(ink), fs, dpi)

    return fig


def _legend_beside(fig, ax, handles, labels, top: float, fs: float, **options):
    """The faces' legend at the top right, inside the picture; the drawing ``ax`` ends left of it."""
    legend = fig.legend(handles, labels, loc="upper left", bbox_to_anchor=(0.77, top - 0.01),
                        frameon=False, fontsize=fs * 0.95, title="faces", title_fontsize=fs,
                        alignment="left", ncols=1 if len(labels) <= 24 else 2, **options)
    width = fig.get_size_inches()[0] * fig.dpi
    box = legend.get_window_extent(fig.canvas.get_renderer())
    left = min(0.77, max(0.45, (0.985 * width - box.width) / width))
    legend.set_bbox_to_anchor((left, top - 0.01), transform=fig.transFigure)
    pos = ax.get_position()
    ax.set_position([pos.x0, pos.y0, left - 0.02 - pos.x0, pos.height])
    return legend


def _chain_faces(profile) -> set:
    from revolve.geometry.profile import UNNAMED_FACE
    return {s.face or UNNAMED_FACE for c in profile.chains for s in c.segments}


def _loop_faces(profile) -> set:
    from revolve.geometry.profile import UNNAMED_FACE
    return {s.face or UNNAMED_FACE for c in profile.loops for s in c.segments}


# -- the solid --------------------------------------------------------------------------

#: Triangles the 3-D picture aims to stay under (matplotlib sorts and draws each one).
PICTURE_TRIANGLES = 40_000


def picture_mesh(revolution, tolerance: Optional[float] = None):
    """A mesh fine enough to look smooth and coarse enough to draw quickly.

    Without a ``tolerance``: 1/2000 of the profile's size, doubled until the
    mesh has at most :data:`PICTURE_TRIANGLES` triangles.

    >>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    >>> rev = Revolution(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> len(picture_mesh(rev).triangles) <= PICTURE_TRIANGLES
    True
    """
    from revolve.geometry.checks import prepare
    from revolve.geometry.mesh import revolve_mesh

    if tolerance is not None:
        return revolve_mesh(revolution, tolerance)
    size = prepare(revolution.profile, revolution.axis).size
    tol = size / 2000.0
    mesh = revolve_mesh(revolution, tol)
    while len(mesh.triangles) > PICTURE_TRIANGLES:
        tol *= 2.0
        mesh = revolve_mesh(revolution, tol)
    return mesh


def _rotate(v: np.ndarray, k: np.ndarray, angle: float) -> np.ndarray:
    """Rotate vectors ``v`` (n, 3) by ``angle`` about the unit vector ``k`` (Rodrigues).

    >>> _rotate(np.array([[1.0, 0.0, 0.0]]), np.array([0.0, 0.0, 1.0]), math.pi / 2).round(12).tolist()
    [[0.0, 1.0, 0.0]]
    """
    c, s = math.cos(angle), math.sin(angle)
    return v * c + np.cross(k, v) * s + np.outer(v @ k, k) * (1.0 - c)


def _opening_turn(revolution, turn: np.ndarray, axis_dir: np.ndarray, view: np.ndarray) -> float:
    """Angle about the axis that brings the middle of the missing wedge towards the viewer."""
    from revolve.geometry.checks import prepare

    side = prepare(revolution.profile, revolution.axis).side
    ux, uy = revolution.axis.unit_direction()
    u3 = np.array([ux, uy, 0.0])
    n3 = side * np.array([-uy, ux, 0.0])
    w3 = np.cross(u3, n3)
    theta = revolution.angle_radians
    middle = theta + (2 * math.pi - theta) / 2
    gap = turn @ (math.cos(middle) * n3 + math.sin(middle) * w3)
    target = view - (view @ axis_dir) * axis_dir
    if np.linalg.norm(target) < 1e-9:  # looking along the axis: any turn will do
        return 0.0
    target = target / np.linalg.norm(target)
    return math.atan2(float(np.cross(gap, target) @ axis_dir), float(gap @ target))


def view_frame(elevation: float, azimuth: float):
    """Unit vectors (towards the viewer, right, up) of an orthographic view, in degrees.

    The same convention as matplotlib's ``view_init``: z is up, ``azimuth`` turns
    about z from +x, ``elevation`` raises the eye above the xy plane.

    >>> [(v.round(12) + 0.0).tolist() for v in view_frame(0.0, 0.0)]
    [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]]
    >>> (view_frame(90.0, 0.0)[0].round(12) + 0.0).tolist()   # looking straight down
    [0.0, 0.0, 1.0]
    """
    e, a = math.radians(elevation), math.radians(azimuth)
    view = np.array([math.cos(e) * math.cos(a), math.cos(e) * math.sin(a), math.sin(e)])
    right = np.array([-math.sin(a), math.cos(a), 0.0])
    up = np.cross(view, right)
    return view, right, up


def split_long_triangles(corners: np.ndarray, longest: float, most: int = 400_000):
    """Triangles (n, 3, 3) cut in two across their longest edge until no edge exceeds ``longest``.

    A painter's order by one depth per triangle is only right when the
    triangles are small beside the part: a strip of a bore as long as the part
    has the depth of its middle. Each cut keeps the triangle's orientation. At
    most ``most`` triangles come back (the rest stay longer). Returns the
    triangles and, for each, the index of the triangle it came from.

    >>> t = np.array([[[0.0, 0, 0], [4, 0, 0], [0, 1, 0]]])
    >>> parts, source = split_long_triangles(t, 1.5)
    >>> len(parts) > 1, source.tolist() == [0] * len(parts)
    (True, True)
    >>> float(np.linalg.norm(parts[:, [1, 2, 0]] - parts, axis=2).max()) <= 1.5
    True
    >>> len(split_long_triangles(t[:0], 1.0)[0])   # none
    0
    """
    source = np.arange(len(corners))
    for _ in range(60):
        edges = np.linalg.norm(corners[:, [1, 2, 0]] - corners, axis=2)  # edge k: corner k to k+1
        first = np.argmax(edges, axis=1)
        cut = edges[np.arange(len(corners)), first] > longest
        count = int(np.count_nonzero(cut))
        if count == 0 or len(corners) + count > most:
            break
        t = corners[cut]
        k = first[cut]
        rows = np.arange(len(t))
        a, b, c = t[rows, k], t[rows, (k + 1) % 3], t[rows, (k + 2) % 3]
        m = (a + b) / 2
        corners = np.concatenate([corners[~cut], np.stack([a, m, c], axis=1),
                                  np.stack([m, b, c], axis=1)])
        source = np.concatenate([source[~cut], source[cut], source[cut]])
    return corners, source


def painter_order(corners: np.ndarray, view: np.ndarray) -> np.ndarray:
    """Indices of triangles (n, 3, 3) from the farthest to the nearest along ``view`` (towards the eye).

    Drawn in this order, nearer triangles cover farther ones (the painter's
    rule); ties keep their order.

    >>> near = [[0.0, 0, 5], [1, 0, 5], [0, 1, 5]]
    >>> far = [[0.0, 0, -5], [1, 0, -5], [0, 1, -5]]
    >>> painter_order(np.array([near, far]), np.array([0.0, 0, 1])).tolist()
    [1, 0]
    >>> painter_order(np.zeros((0, 3, 3)), np.array([0.0, 0, 1])).tolist()
    []
    """
    depth = corners.mean(axis=1) @ np.asarray(view, float)
    return np.argsort(depth, kind="stable")


def solid_picture(revolution, measurement, path: str, *, units, title: Optional[str] = None,
                  density_label: Optional[str] = None, width: int = 1200, height: int = 800,
                  dpi: int = 100, tolerance: Optional[float] = None, elevation: float = 22.0,
                  azimuth: float = -58.0):
    """Draw the revolved solid in 3-D, shaded, faces coloured; returns the bytes and the mesh drawn.

    The sketch plane faces the viewer as in :func:`profile_picture` (sketch
    ``x`` to the right, ``y`` up) and the sweep comes out of it towards the
    viewer, so a partial revolution shows its open side and its cut faces.

    Examples
    --------
    >>> import os, tempfile
    >>> from revolve.jobs.measuring import part_units
    >>> from revolve.geometry.measure import measure
    >>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    >>> rev = Revolution(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)),
    ...                  Axis.x(), 270)
    >>> data, mesh = solid_picture(rev, measure(rev), "ring.svg", units=part_units("mm"),
    ...                            width=400, height=300)
    >>> data.lstrip().startswith(b"<?xml"), mesh.closed
    (True, True)
    """
    picture_format(path)
    fig, mesh = solid_figure(revolution, measurement, units=units, title=title,
                             density_label=density_label, width=width, height=height, dpi=dpi,
                             tolerance=tolerance, elevation=elevation, azimuth=azimuth)
    return figure_bytes(fig, path), mesh


def solid_figure(revolution, measurement, *, units, title: Optional[str] = None,
                 density_label: Optional[str] = None, width: int = 1200, height: int = 800,
                 dpi: int = 100, tolerance: Optional[float] = None, elevation: float = 22.0,
                 azimuth: float = -58.0):
    """The matplotlib ``Figure`` of :func:`solid_picture` and the mesh drawn.

    >>> from revolve.jobs.measuring import part_units
    >>> from revolve.geometry.measure import measure
    >>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    >>> rev = Revolution(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> fig, mesh = solid_figure(rev, measure(rev), units=part_units("mm"), width=400, height=300)
    >>> len(fig.axes[0].collections)   # the triangles (one collection) and the centre line
    2
    """
    from matplotlib.collections import LineCollection, PolyCollection
    from matplotlib.colors import to_rgb
    from matplotlib.patches import Patch

    from revolve.geometry.mesh import CUT_FACE_END, CUT_FACE_START

    mesh = picture_mesh(revolution, tolerance)
    m, u = measurement, _Shown(units, revolution.profile.unit)
    # Sketch (x, y, z) -> picture (x, -z, y): the sketch plane stands facing the viewer.
    turn = np.array([[1.0, 0.0, 0.0], [0.0, 0.0, -1.0], [0.0, 1.0, 0.0]])
    vertices = mesh.vertices @ turn.T
    normals = mesh.normals() @ turn.T
    view, right, up = view_frame(elevation, azimuth)
    ux, uy = revolution.axis.unit_direction()
    d3 = turn @ np.array([ux, uy, 0.0])
    p3 = turn @ np.array([float(revolution.axis.point[0]), float(revolution.axis.point[1]), 0.0])
    if not revolution.full:
        # Turn the part about its axis so that the middle of the missing wedge faces the viewer.
        alpha = _opening_turn(revolution, turn, d3, view)
        vertices = p3 + _rotate(vertices - p3, d3, alpha)
        normals = _rotate(normals, d3, alpha)
    corners = vertices[mesh.triangles]
    light = view + 0.6 * up - 0.35 * right
    light /= np.linalg.norm(light)
    lambert = normals @ light
    if not mesh.closed:  # open surfaces are seen from both sides
        lambert = np.abs(lambert)
    shade = 0.42 + 0.58 * ((np.clip(lambert, -1.0, 1.0) + 1.0) / 2.0) ** 1.6  # soft, wrapped light

    names = list(mesh.face_names)
    styles = face_styles([n for n in names if n not in (CUT_FACE_START, CUT_FACE_END)])
    base = np.array([to_rgb(styles[n][0]) if n in styles else to_rgb(CUT_FACE_COLOUR) for n in names])
    base = base if len(base) else np.zeros((0, 3))
    rgb = np.clip(base[mesh.face_of] * shade[:, None], 0.0, 1.0) if len(mesh.face_of) else np.zeros((0, 3))
    # A closed surface never shows the back of a triangle (back faces culled); the rest are
    # cut small beside the part and drawn far to near, all in one collection.
    front = (normals @ view > 0) if mesh.closed else np.ones(len(corners), dtype=bool)
    corners, rgb = corners[front], rgb[front]
    lo, hi = vertices.min(axis=0), vertices.max(axis=0)
    biggest = float((hi - lo).max()) or 1.0
    corners, source = split_long_triangles(corners, biggest / 30.0)
    order = painter_order(corners, view)
    corners, rgb = corners[order], rgb[source[order]]
    flat = np.stack([corners @ right, corners @ up], axis=-1)

    fig = _figure(width, height, dpi)
    scale = min(width, height * 1.5) / 1200.0 * 100.0 / dpi
    fs = max(7.0 * 100.0 / dpi, 10.0 * scale)
    extra = [f"drawn from a mesh of {group_digits(str(len(mesh.triangles)))} triangles "
             f"(chord tolerance {fmt(mesh.tolerance * u.length_factor, 3)} {u.length})"]
    caption = _caption_lines(m, u, revolution, density_label, extra)
    caption_height, top = _frame(fig, title, caption, fs)
    ax = fig.add_axes([0.03, caption_height + 0.02, 0.72, top - caption_height - 0.04])
    ax.set_axis_off()
    ax.add_collection(PolyCollection(flat, facecolors=rgb, edgecolors=rgb, linewidths=0.5,
                                     antialiaseds=False, zorder=1))

    used = {names[k] for k in np.unique(mesh.face_of)}
    handles = [Patch(facecolor=styles[n][0]) for n in styles if n in used]
    labels = [n for n in styles if n in used]
    if any(n in (CUT_FACE_START, CUT_FACE_END) for n in names):
        handles.append(Patch(facecolor=CUT_FACE_COLOUR))
        labels.append("cut faces")
    _legend_beside(fig, ax, handles, labels, top, fs)

    # The axis of revolution, a centre line a little longer than the part, over the part
    # as on a drawing.
    t = (vertices - p3) @ d3
    ends = p3 + np.outer([t.min() - 0.12 * biggest, t.max() + 0.12 * biggest], d3)
    ends2 = np.stack([ends @ right, ends @ up], axis=-1)
    ax.add_collection(LineCollection([ends2], colors=AXIS_COLOUR, linewidths=1.0,
                                     linestyles=[AXIS_DASHES], zorder=3))
    shown = np.vstack([flat.reshape(-1, 2), ends2]) if len(flat) else ends2
    v_lo, v_hi = shown.min(axis=0), shown.max(axis=0)
    pad = 0.04 * float((v_hi - v_lo).max() or 1.0)
    v_lo, v_hi = v_lo - pad, v_hi + pad
    box = ax.get_position()
    shape = box.width * width / (box.height * height)
    vw, vh = v_hi - v_lo
    vw, vh = max(vw, vh * shape), max(vh, vw / shape)
    mid = (v_lo + v_hi) / 2
    ax.set_xlim(mid[0] - vw / 2, mid[0] + vw / 2)
    ax.set_ylim(mid[1] - vh / 2, mid[1] + vh / 2)
    ax.set_aspect("equal", adjustable="box")

    return fig, mesh


def section_svg(revolution, measurement, *, units, title: Optional[str] = None,
                width: int = 600, height: int = 360) -> str:
    """The 2-D section picture (:func:`profile_figure`, results left to the tables) as inline SVG.

    For reports (:func:`revolve.render.report.report_for`): text as paths,
    nothing outside the picture referenced (:func:`revolve.render.report.svg_of`).

    >>> from revolve.jobs.measuring import part_units
    >>> from revolve.geometry.measure import measure
    >>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    >>> rev = Revolution(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> text = section_svg(rev, measure(rev), units=part_units("mm"), width=300, height=200)
    >>> text.startswith("<svg"), "http" in text
    (True, False)
    """
    from revolve.render.report import svg_of

    return svg_of(profile_figure(revolution, measurement, units=units, title=title, width=width,
                                 height=height, figures=False))
