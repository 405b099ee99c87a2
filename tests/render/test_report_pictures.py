"""The section picture of a report (revolve.render.pictures.section_svg, report_for's pictures).

References: the sagitta of a circular arc, s = R − √(R² − (c/2)²) (elementary geometry, from
memory): the stepped shaft's crown (R = 26 mm over a 20 mm chord at radius 18 mm) bulges
26 − √(676 − 100) = 2 mm, so its largest diameter is 2 × 20 = 40 mm exactly.
"""

from __future__ import annotations

from pathlib import Path

from revolve.jobs.measuring import measure, part_units
from revolve.render.pictures import profile_figure, section_svg
from revolve.render.report import report_for

ROOT = Path(__file__).resolve().parents[2]
SHAFT = str(ROOT / "profiles" / "turned-stepped-shaft.toml")


def _texts(fig):
    return [t.get_text() for t in fig.texts] + [t.get_text() for t in fig.axes[0].texts]


def test_a_diameter_at_an_arc_crest_is_written_exactly():
    r = measure(SHAFT)
    fig = profile_figure(r.revolution, r.measurement, units=part_units("mm"), width=400,
                         height=260)
    texts = _texts(fig)
    assert "Ø40 mm" in texts and "80 mm" in texts, texts        # not Ø39.95 from the samples


def test_a_report_picture_leaves_the_figures_to_the_tables():
    r = measure(SHAFT, material="carbon_steel")
    fig = profile_figure(r.revolution, r.measurement, units=part_units("mm"), width=400,
                         height=260, figures=False)
    caption = " ".join(_texts(fig))
    assert "revolved 360° about the sketch x axis" in caption
    assert "volume" not in caption and "mass" not in caption
    full = " ".join(_texts(profile_figure(r.revolution, r.measurement, units=part_units("mm"),
                                          width=400, height=260)))
    assert "volume" in full and "mass" in full                 # the picture command keeps them
    svg = section_svg(r.revolution, r.measurement, units=part_units("mm"), width=300, height=200)
    assert svg.startswith("<svg") and "<text" not in svg       # text as paths: no font needed


def test_a_tall_vessel_gets_a_square_picture():
    import revolve

    tall = revolve.build_vessel(diameter=1000, length=3000, head="ellipsoidal")
    wide = revolve.build_vessel(diameter=1000, length=3000, head="ellipsoidal",
                                orientation="horizontal")
    import re

    def box(page):
        w, h = map(float, re.search(r'viewBox="0 0 ([\d.]+) ([\d.]+)"', page).groups())
        return w / h

    assert abs(box(report_for(tall, width=400, height=240)) - 1.0) < 1e-9
    assert abs(box(report_for(wide, width=400, height=240)) - 400 / 240) < 1e-9
