"""Drawing a profile on a matplotlib Axes: the one drawing code of the picture command and
:func:`revolve.draw`.

matplotlib is imported inside the functions only (never at start-up), and only
its object interface is used, so no global backend is switched. Colours come
from matplotlib's default ``tab10`` cycle.
"""

from __future__ import annotations

from typing import Dict, List, Sequence, Tuple

import numpy as np

#: Fill, hatch and outline colours of the section (and of cut faces in 3-D).
SECTION_FILL = "#ececec"
SECTION_HATCH = "#b4b4b4"
CUT_FACE_COLOUR = "#c9c9c9"
AXIS_COLOUR = "#444444"

#: The axis's centre-line dash pattern (long dash, short dash).
AXIS_DASHES = (0, (14, 3, 2, 3))

#: Line styles used after the ten colours of tab10 have been used once each.
_STYLES = ("-", (0, (6, 2)), (0, (1, 1.5)), (0, (6, 2, 1, 2)))


def face_styles(names: Sequence[str]) -> Dict[str, Tuple[str, object]]:
    """Colour and line style of each face: tab10 in order, then again with other dashes.

    >>> s = face_styles([f"f{i}" for i in range(12)])
    >>> s["f0"][0] == s["f10"][0], s["f0"][1] == s["f10"][1]
    (True, False)
    >>> face_styles([])
    {}
    """
    from matplotlib import colormaps

    colours = colormaps["tab10"].colors
    return {name: (colours[k % 10], _STYLES[(k // 10) % len(_STYLES)]) for k, name in enumerate(names)}


def sketch_paths(profile, size: float):
    """Flattened sketch points of every segment, grouped by path.

    Each segment flattens itself to a chord tolerance of 1/3000 of the
    profile's size (far below a pixel) through the segment contract
    (``flatten_to_tolerance``); a polyline gives its own vertices.

    >>> from revolve.geometry.profile import Loop, Profile
    >>> paths = sketch_paths(Profile(loops=(Loop.from_points([(0, 1), (1, 1), (0, 2)]),)), 1.0)
    >>> [p.tolist() for p in paths[0]]
    [[[0.0, 1.0], [1.0, 1.0], [0.0, 2.0], [0.0, 1.0]]]
    """
    tol = size / 3000.0
    return [[s.flatten_to_tolerance(tol) for s in p.segments] for p in profile.paths]


def _loop_polygon(pieces: List[np.ndarray]) -> np.ndarray:
    return np.vstack([p[:-1] for p in pieces])


def draw_section(ax, profile, prep, flat, axis=None):
    """Draw the section (filled, hatched) and every face in its colour on ``ax``.

    ``prep`` is the profile's :func:`~revolve.geometry.checks.prepare` and
    ``flat`` its :func:`sketch_paths`. With the ``axis`` given, a face lying
    on the axis (it sweeps no surface, such as the closing line of a vessel's
    liquid space) is drawn as a thin grey edge and left out of the styles.
    Returns the section's outline vertices (empty for chains only) and the
    face styles, for a legend; each face's line is labelled with its name.

    >>> from matplotlib.figure import Figure
    >>> from revolve.geometry.checks import prepare
    >>> from revolve.geometry.profile import Axis, Loop, Profile
    >>> p = Profile(loops=(Loop.from_points([(0, 1), (1, 1), (0, 2)], face="cone"),))
    >>> ax = Figure().add_subplot()
    >>> verts, styles = draw_section(ax, p, prepare(p, Axis.x()), sketch_paths(p, 1.0))
    >>> list(styles), len(ax.lines)
    (['cone'], 1)
    """
    from matplotlib.patches import PathPatch
    from matplotlib.path import Path as MplPath

    from revolve.geometry.mesh import signed_area
    from revolve.geometry.profile import UNNAMED_FACE

    verts, codes = [], []
    loop_no = 0
    for pieces, closed in zip(flat, prep.closed):
        if not closed:
            continue
        poly = _loop_polygon(pieces)
        depth = prep.depths[loop_no]
        loop_no += 1
        if (signed_area(poly) > 0) != (depth % 2 == 0):
            poly = poly[::-1]
        verts += [poly, poly[:1]]
        codes += [MplPath.MOVETO] + [MplPath.LINETO] * (len(poly) - 1) + [MplPath.CLOSEPOLY]
    if verts:
        ax.add_patch(PathPatch(MplPath(np.vstack(verts), codes), facecolor=SECTION_FILL,
                               edgecolor=SECTION_HATCH, hatch="////", lw=0, zorder=1))

    # Faces: one colour each, one line per face and kind of path (gaps between segments).
    styles = face_styles(profile.faces())
    strokes: Dict[Tuple[str, bool], List[np.ndarray]] = {}
    gap_row = np.full((1, 2), np.nan)
    on_axis = _on_axis_test(axis, prep.size)
    for path_pieces, p in zip(flat, profile.paths):
        for pts, seg in zip(path_pieces, p.segments):
            face = seg.face or UNNAMED_FACE
            key = (None if on_axis(pts) else face, p.closed)
            strokes.setdefault(key, []).extend([pts, gap_row])
    drawn = set()
    for (face, closed), parts in strokes.items():
        line = np.vstack(parts[:-1])
        if face is None:   # on the axis: an edge of the section, no surface
            ax.plot(line[:, 0], line[:, 1], color=SECTION_HATCH, lw=1.0, zorder=2.5,
                    label="_on the axis")
            continue
        colour, style = styles[face]
        drawn.add(face)
        ax.plot(line[:, 0], line[:, 1], color=colour, linestyle=style, lw=2.2 if closed else 3.0,
                solid_capstyle="round", solid_joinstyle="round", zorder=3, label=face)

    return verts, {name: s for name, s in styles.items() if name in drawn}


def _on_axis_test(axis, size: float):
    """A test of flattened points: do they all lie on ``axis`` (within 1e-9 of the size)?

    >>> from revolve.geometry.profile import Axis
    >>> test = _on_axis_test(Axis.x(), 1.0)
    >>> test(np.array([[0.0, 0.0], [2.0, 0.0]])), test(np.array([[0.0, 0.0], [2.0, 1.0]]))
    (True, False)
    >>> _on_axis_test(None, 1.0)(np.zeros((2, 2)))
    False
    """
    if axis is None:
        return lambda pts: False
    ux, uy = axis.unit_direction()
    normal = np.array([-uy, ux])
    origin = np.array([float(axis.point[0]), float(axis.point[1])])
    return lambda pts: bool(np.all(np.abs((pts - origin) @ normal) <= 1e-9 * size))


def draw(profile_or_result, ax=None, *, axis=None, angle=None, units=None):
    """Draw a profile (its section, faces and axis) on a matplotlib Axes and return the Axes.

    Parameters
    ----------
    profile_or_result : str, os.PathLike, Profile, Revolution or MeasureResult
        A profile file, a profile built in Python, or what :func:`revolve.measure`
        gave (its revolution is drawn).
    ax : matplotlib.axes.Axes, optional
        Where to draw; default a new Axes on a new ``Figure`` (no pyplot
        state is touched).
    axis, angle, units
        As for :func:`revolve.measure` (the axis drawn; ``units`` for point
        lists).

    Returns
    -------
    matplotlib.axes.Axes
        ``ax`` itself when given: the faces as lines (one per face and kind of
        path, segments separated by NaN rows), the section as a hatched patch,
        the axis as a grey centre line across the profile, equal scales.

    Examples
    --------
    >>> from matplotlib.figure import Figure
    >>> from revolve.geometry.profile import Loop, Profile
    >>> ring = Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)], face="ring"),))
    >>> ax = Figure().add_subplot()
    >>> draw(ring, ax) is ax
    True
    >>> [l.get_label() for l in ax.lines]
    ['ring', 'axis']
    >>> draw("no/such/file.toml")           # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no/such/file.toml: no such file...

    A part touching the axis is drawn like any other; errors name the argument:

    >>> disc = Profile(loops=(Loop.from_points([(0, 0), (2, 0), (2, 3), (0, 3)]),))
    >>> draw(disc, axis="x").get_aspect()
    1.0
    >>> draw(disc, angle=400)
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: angle: the revolution angle must be above 0 and at most 360 degrees, got 400
    """
    from revolve.geometry.checks import prepare
    from revolve.jobs.measuring import MeasureResult, _axis_of, as_document, revolution_for

    if isinstance(profile_or_result, MeasureResult):
        revolution = profile_or_result.revolution
    else:
        revolution = revolution_for(as_document(profile_or_result, units), _axis_of(axis), angle,
                                    angle_option="angle")
    if ax is None:
        from matplotlib.figure import Figure

        ax = Figure().add_subplot()
    profile, line = revolution.profile, revolution.axis
    prep = prepare(profile, line)
    flat = sketch_paths(profile, prep.size)
    draw_section(ax, profile, prep, flat, line)
    points = np.vstack([q for pieces in flat for q in pieces])
    lo, hi = points.min(axis=0), points.max(axis=0)
    along = np.array(line.unit_direction())
    origin = np.array([float(line.point[0]), float(line.point[1])])
    reach = (np.array([[lo[0], lo[1]], [lo[0], hi[1]], [hi[0], lo[1]], [hi[0], hi[1]]])
             - origin) @ along
    margin = 0.05 * (reach.max() - reach.min() or prep.size)
    a, b = origin + (reach.min() - margin) * along, origin + (reach.max() + margin) * along
    ax.plot([a[0], b[0]], [a[1], b[1]], color=AXIS_COLOUR, lw=1.0, linestyle=AXIS_DASHES,
            zorder=2, label="axis")
    ax.set_aspect("equal", adjustable="datalim")
    ax.autoscale_view()
    return ax

