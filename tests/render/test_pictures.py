"""The pictures themselves: hidden faces stay hidden in 3-D, labels never overlap nor leave the canvas.

References, named beside each check:

* matplotlib's PNG reader (``matplotlib.image.imread``) for the pixels drawn;
* matplotlib's default colour cycle ``tab10`` (``matplotlib.colormaps``) for
  which face a pixel belongs to;
* the painter's rule (draw far to near so that near surfaces cover far ones),
  common practice in computer graphics, no source.

The tube below is an invented test part; the bundled profiles are only drawn.
"""

from __future__ import annotations

import io
from pathlib import Path

import matplotlib.image
import numpy as np
import pytest
from matplotlib import colormaps
from matplotlib.text import Text

import revolve
from revolve.render import pictures

ROOT = Path(__file__).resolve().parents[2]
TAB10 = np.array(colormaps["tab10"].colors)

TUBE = """
units = "mm"
name = "Tube"
[[loop]]
start = [0, 10]
segments = [
  { line_to = [120, 10], face = "bore" },
  { line_to = [120, 16], face = "end" },
  { line_to = [0, 16], face = "outside" },
  { close = true, face = "end" },
]
"""


def _measured(tmp_path, text, **options):
    p = tmp_path / "part.toml"
    p.write_text(text, encoding="utf-8")
    return revolve.measure(str(p), **options)


def _hue_of(img, index):
    """Pixels of any shade of tab10 colour ``index``: same chromaticity, clearly coloured."""
    rgb = img[..., :3].astype(float)
    chroma = rgb / np.maximum(rgb.sum(axis=-1, keepdims=True), 1e-9)
    base = TAB10[index] / TAB10[index].sum()
    coloured = (rgb.max(axis=-1) - rgb.min(axis=-1)) > 0.1
    return (np.abs(chroma - base).max(axis=-1) < 0.03) & coloured


def _solid_png(result, **view):
    data, _ = pictures.solid_picture(result.revolution, result.measurement, "p.png",
                                     units=result.units, title=None, width=900, height=600, **view)
    return matplotlib.image.imread(io.BytesIO(data), format="png")


def test_a_bore_stays_hidden_behind_the_outside(tmp_path):
    # Seen from outside, the bore (tab10 0) shows only through the open end: no bore pixel
    # may lie left of the end face (tab10 1), i.e. over the outside wall. Old faults showed
    # streaks of bore along the whole tube (one depth per long strip).
    img = _solid_png(_measured(tmp_path, TUBE))
    bore, end, outside = (_hue_of(img, k) for k in (0, 1, 2))
    assert outside.sum() > 20_000 and end.sum() > 1_000 and bore.sum() > 200
    first_end_column = np.nonzero(end.any(axis=0))[0].min()
    assert np.count_nonzero(bore[:, : first_end_column - 2]) == 0


def test_from_the_other_end_only_the_outside_and_end_show(tmp_path):
    # Turned round (azimuth + 180°), the near end is x = 0: the bore still shows only there.
    img = _solid_png(_measured(tmp_path, TUBE), azimuth=122.0)
    bore, end = _hue_of(img, 0), _hue_of(img, 1)
    last_end_column = np.nonzero(end.any(axis=0))[0].max()
    assert np.count_nonzero(bore[:, last_end_column + 2:]) == 0


def test_painter_order_is_far_to_near():
    # Two stacked squares' triangles in scrambled order along a slanted view.
    view = np.array([1.0, 1.0, 1.0]) / np.sqrt(3.0)
    tri = np.array([[0.0, 0, 0], [1, 0, 0], [0, 1, 0]])
    stack = np.array([tri + k * view for k in (3.0, -2.0, 5.0, 0.0)])
    assert pictures.painter_order(stack, view).tolist() == [1, 3, 0, 2]


def test_long_triangles_are_cut_small_and_cover_the_same_area():
    rng = np.random.default_rng(5)
    tris = rng.uniform(-50, 50, size=(40, 3, 3))
    parts, source = pictures.split_long_triangles(tris, 5.0)
    edges = np.linalg.norm(parts[:, [1, 2, 0]] - parts, axis=2)
    assert edges.max() <= 5.0

    def area(t):  # half the cross product's length (vector algebra, common practice)
        return 0.5 * np.linalg.norm(np.cross(t[:, 1] - t[:, 0], t[:, 2] - t[:, 0]), axis=1)

    assert np.allclose(np.bincount(source, weights=area(parts), minlength=40), area(tris))
    # Each piece keeps its triangle's facing (same normal direction).
    n_parts = np.cross(parts[:, 1] - parts[:, 0], parts[:, 2] - parts[:, 0])
    n_tris = np.cross(tris[:, 1] - tris[:, 0], tris[:, 2] - tris[:, 0])[source]
    assert np.all(np.einsum("ij,ij->i", n_parts, n_tris) > 0)


@pytest.mark.parametrize("name,angle", [("flanged-bushing.toml", None), ("grooved-pulley.toml", 270.0),
                                        ("tilted-ring.toml", 270.0)])
def test_bundled_solids_draw(name, angle):
    result = revolve.measure(str(ROOT / "profiles" / name), angle=angle)
    img = _solid_png(result)
    assert img.shape[:2] == (600, 900)


# -- labels: none overlaps another, none leaves the canvas -------------------------------

PROFILES = sorted((ROOT / "profiles").glob("*.toml")) + sorted((ROOT / "profiles").glob("*.txt"))


def _text_boxes(fig):
    """Every non-empty text artist's box in pixels, after drawing (matplotlib's own layout)."""
    fig.canvas.draw()
    renderer = fig.canvas.get_renderer()
    texts = list(fig.texts)
    for ax in fig.axes:
        texts += list(ax.texts)
    for legend in fig.legends:
        texts += list(legend.get_texts()) + [legend.get_title()]
    boxes = []
    for t in texts:
        if t.get_visible() and t.get_text().strip():
            # The text's own box (an annotation's would include its leader line).
            e = Text.get_window_extent(t, renderer)
            boxes.append((t.get_text(), e.x0, e.y0, e.x1, e.y1))
    return boxes


def _assert_clear(fig):
    width, height = fig.get_size_inches() * fig.dpi
    boxes = _text_boxes(fig)
    assert boxes
    for text, x0, y0, x1, y1 in boxes:
        assert x0 >= 0 and y0 >= 0 and x1 <= width + 0.5 and y1 <= height + 0.5, (text, x0, y0, x1, y1)
    for i, a in enumerate(boxes):
        for b in boxes[i + 1:]:
            overlap = min(a[3], b[3]) - max(a[1], b[1]) > 0 and min(a[4], b[4]) - max(a[2], b[2]) > 0
            assert not overlap, (a, b)


def _measure(path):
    return revolve.measure(str(path), units="mm" if path.suffix == ".txt" else None)


@pytest.mark.parametrize("size", [(1200, 800, 100), (500, 360, 100), (1600, 1000, 150)])
@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.name)
def test_profile_labels_do_not_overlap_or_leave_the_picture(path, size):
    result = _measure(path)
    w, h, dpi = size
    fig = pictures.profile_figure(result.revolution, result.measurement, units=result.units,
                                  title=result.document.name if hasattr(result, "document") else path.stem,
                                  density_label=None, width=w, height=h, dpi=dpi)
    _assert_clear(fig)


@pytest.mark.parametrize("path", PROFILES[:4], ids=lambda p: p.name)
def test_solid_labels_do_not_overlap_or_leave_the_picture(path):
    result = _measure(path)
    fig, _ = pictures.solid_figure(result.revolution, result.measurement, units=result.units,
                                   title="A title long enough to need more than one line in a "
                                         "narrow picture of a revolved part", width=500, height=360)
    _assert_clear(fig)


def test_a_long_title_is_wrapped_inside_the_picture(tmp_path):
    result = _measured(tmp_path, TUBE)
    title = "A very long title " * 8
    fig = pictures.profile_figure(result.revolution, result.measurement, units=result.units,
                                  title=title, width=600, height=400)
    _assert_clear(fig)
    heading = [t for t in fig.texts if t.get_text().startswith("A very")][0]
    assert heading.get_text().count("\n") >= 1


def test_diameters_are_dimensioned_across_the_axis(tmp_path):
    # Tube of bore radius 10 mm and outside radius 16 mm, 120 mm long (the file above):
    # a diameter is twice the radius (Ø, common practice in machine drawing, no source).
    result = _measured(tmp_path, TUBE)
    fig = pictures.profile_figure(result.revolution, result.measurement, units=result.units)
    texts = {t.get_text() for t in fig.axes[0].texts}
    assert {"Ø32 mm", "Ø20 mm", "120 mm"} <= texts
    assert not any(t == "6 mm" for t in texts)       # no radial extent where a diameter is read


def test_a_face_on_the_axis_is_not_in_the_legend():
    result = revolve.measure(str(ROOT / "profiles" / "vessel-rainwater-tank.toml"))
    fig = pictures.profile_figure(result.revolution, result.measurement, units=result.units)
    legend = [t.get_text() for t in fig.legends[0].get_texts()]
    # "other" is the closing line along the axis: it sweeps no surface (zero area by Pappus).
    assert result.measurement.surface_by_face.get("other", 0.0) == 0.0
    assert "other" not in legend and "shell" in legend
