"""HTML reports (revolve.render.report) and the level-table picture (revolve.render.level_picture).

The reports are read back with the standard library's html.parser and, where Chromium is
installed (Debian's package; .ci/run installs it), in a real headless browser: its parsed DOM
must hold the JSON's figures and its printed PDF the expected pages (counted by poppler's
pdfinfo, text read by pdftotext, or the PDF's own /Type /Page objects).

The numbers below are invented demo figures (no reference values are checked here): what is
checked is that the report shows exactly what Result.to_dict() holds, formatted as the
terminal formats it, with nothing outside the file referenced and user text escaped.
"""

from __future__ import annotations

import re
import shutil
import subprocess

import numpy as np
import pytest

from revolve.errors import RevolveError
from revolve.jobs.results import Field, Result, Table, trade_units
from revolve.render import numbers
from revolve.render.level_picture import label_boxes, level_picture
from revolve.render.output import cell
from revolve.render.report import report_html, svg_of, write_report

HOSTILE = 'tank "A" <script>alert(1)</script> & <img src=x onerror=alert(2)>.toml'


def _vessel_result(n: int = 11, name: str = HOSTILE) -> Result:
    u = trade_units("vessel", "mm")
    rows = tuple({"level": 0.01 * i, "volume": 0.0123456789 * i, "wetted": 0.05 * i,
                  "percent": 100.0 * i / (n - 1) if n > 1 else 100.0} for i in range(n))
    levels = Table("levels", "Level table", (
        Field("level", "level", "level"), Field("volume", "volume", "capacity"),
        Field("wetted", "wetted area", "area"), Field("percent", "full", style="percent")), rows)
    summary = Table("vessel", "Vessel", (
        Field("capacity", "capacity", "capacity"), Field("area", "inside area", "area"),
        Field("face", "largest face", style="text")),
        ({"capacity": 20.943951023931955, "area": 12.566370614359172, "face": "<b>shell</b>"},),
        figures=True)
    return Result("levels", u, {"profile": name, "step": "10 mm"}, (summary, levels),
                  notes=("cross-check (washers): relative difference 3.2e-13 <i>ok</i>",),
                  cautions=("vessel",), extra={"sources": ["steel 7850 kg/m³: <from memory>"]})


def _part(name: str, volume: float, unit: str = "mm") -> Result:
    u = trade_units("part", unit)
    main = Table("part", "Part", (Field("volume", "volume", "volume"), Field("mass", "mass", "mass"),
                                  Field("cost", "material cost", style="money")),
                 ({"volume": volume, "mass": volume * 7850.0, "cost": volume * 7850.0 * 2.5},),
                 figures=True)
    return Result("measure", u.with_currency("EUR"), {"profile": name}, (main,),
                  notes=(f"cross-check: {name}",), cautions=("lifting",))


def _expected(r: Result, key: str):
    """The JSON's figures of table ``key`` formatted as the terminal shows them."""
    t = r.table(key)
    data = r.to_dict()[key]
    if t.figures:
        out = []
        for f in t.fields:
            text = cell(data[f.key], f)
            out.append(text[:-2] if f.style == "percent" and text.endswith(" %") else text)
        return out
    return [[cell(row[f.key], f) for f in t.fields] for row in data]


def _check_tables(p, r: Result):
    for t in r.tables:
        rows = p.table(t.key)
        if t.figures:
            assert [row[1] for row in rows[1:]] == _expected(r, t.key)
            assert [row[0] for row in rows[1:]] == [f.label for f in t.fields]
        else:
            assert rows[1:] == _expected(r, t.key)


def test_tables_hold_the_json_figures_with_units_in_headings(html_page):
    r = _vessel_result()
    p = html_page(report_html(r, title="Tank T1"))
    _check_tables(p, r)
    # headings carry their units (the JSON's "units" object), as the terminal shows them
    assert p.table("levels")[0] == ["level (mm)", "volume (L)", "wetted area (m²)", "full"]
    assert r.to_dict()["units"] == {"capacity": "L", "area": "m²", "level": "mm"}
    assert p.table("vessel")[1:3] == [["capacity", "20" + numbers.GROUP + "944", "L"],
                                       ["inside area", "12.5664", "m²"]]
    assert p.table("levels")[-1][-1] == "100 %"        # 100.00000000000004 has no float noise
    text = "".join(p.text)
    assert "cross-check (washers): relative difference 3.2e-13 <i>ok</i>" in text
    from revolve.jobs.results import CAUTIONS
    assert CAUTIONS["vessel"] in text and "steel 7850 kg/m³: <from memory>" in text


def test_nothing_outside_the_file_is_referenced(html_page):
    fig = level_picture([0, 1, 2], [0, 10, 20], [0.0, 3.0, 6.0], level_unit="m", volume_unit="m³",
                        area_unit="m²", capacity=20.0, profile=([0, 0, 2, 2], [0, 1.2, 1.2, 0]),
                        marks=[(0.4, "bottom tangent line")])
    pictures = [("Level table", svg_of(fig)), ("Again", svg_of(fig))]
    page = report_html(_vessel_result(), title="Tank", pictures=pictures)
    p = html_page(page)
    assert not re.search(r"https?:|ftp:|file:|//[a-z]", page, re.I)
    assert "@import" not in page and "@font-face" not in page
    assert {"script", "link", "img", "iframe", "object", "embed", "image"}.isdisjoint(p.tags)
    for tag, name, value in p.attrs:
        assert name != "src", (tag, name, value)
        if name in ("href", "xlink:href"):
            assert value.startswith("#"), (tag, value)
    for ref in re.findall(r"url\(([^)]*)\)", page):
        assert ref.startswith("#"), ref
    # two pictures in one page: ids stay unique, every local reference finds its target
    ids = [v for _, name, v in p.attrs if name == "id"]
    assert len(ids) == len(set(ids))
    targets = set(ids)
    for _, name, value in p.attrs:
        if name in ("href", "xlink:href"):
            assert value[1:] in targets, value
    for ref in re.findall(r"url\(#([^)]*)\)", page):
        assert ref in targets
    assert p.tags.count("svg") == 2


def test_user_text_is_escaped(html_page):
    r = _vessel_result(name=HOSTILE)
    page = report_html([r, _part(HOSTILE, 1e-6)], title=HOSTILE, sources=["<b>bold</b>"])
    p = html_page(page)
    assert "script" not in p.tags and "img" not in p.tags and "b" not in p.tags
    assert "i" not in p.tags
    assert not any(name.startswith("on") for _, name, _ in p.attrs)
    text = "".join(p.text)
    assert HOSTILE in text and "<b>shell</b>" in text and "<b>bold</b>" in text
    assert "<script>" not in page


def test_many_parts_give_a_summary_and_a_page_each(html_page):
    parts = [_part("a.toml", 1e-6), _part("b.toml", 2.5e-6), _part("c.toml", 1.25e-5)]
    page = report_html(parts, title="Batch")
    p = html_page(page)
    summary = p.table("summary")
    assert summary[0] == ["part", "volume (mm³)", "mass (kg)", "material cost (EUR)"]
    assert [row[0] for row in summary[1:]] == ["a.toml", "b.toml", "c.toml"]
    for row, r in zip(summary[1:], parts):
        assert row[1:] == _expected(r, "part")
    assert page.count('<section class="part"') == 3
    # a part per page in print; the summary's links point at the parts
    assert "section.part { break-before: page" in page
    # parts in different units: the summary puts each unit beside its figure
    mixed = html_page(report_html([_part("a.toml", 1e-6), _part("b.toml", 0.0254 ** 3, "in")],
                               title="Mixed")).table("summary")
    assert mixed[0][1] == "volume" and mixed[1][1] == "1000 mm³" and mixed[2][1] == "1 in³"


def test_bad_pictures_and_arguments_are_refused(html_page):
    r = _vessel_result()
    for svg in ('<svg><script>alert(1)</script></svg>', '<svg onload="x()"></svg>',
                '<svg><use href="other.svg#a"/></svg>', '<svg><image href="a.png"/></svg>',
                '<p>not a picture</p>', '<svg style="background:url(http://x/)"></svg>'):
        with pytest.raises(ValueError):
            report_html(r, title="t", pictures=[("x", svg)])
    # a raster inside the picture (an image drawn by matplotlib) is embedded, and accepted
    from matplotlib.figure import Figure
    fig = Figure(figsize=(2, 2))
    fig.add_subplot().imshow(np.arange(16.0).reshape(4, 4))
    page = report_html(r, title="t", pictures=[("raster", svg_of(fig))])
    images = [v for tag, name, v in html_page(page).attrs
              if tag == "image" and name.endswith("href")]
    assert len(images) == 1 and images[0].startswith("data:image/png;base64,")
    with pytest.raises(ValueError, match="one list per result"):
        report_html([r, r], title="t", pictures=[[]])
    with pytest.raises(ValueError, match="at least one result"):
        report_html([], title="t")


def test_write_report_follows_the_overwrite_rule(tmp_path):
    path = tmp_path / "r.html"
    write_report(str(path), "<p>first</p>", force=False)
    with pytest.raises(RevolveError, match="--report: .*exists already; give --force"):
        write_report(str(path), "<p>second</p>", force=False)
    assert path.read_text() == "<p>first</p>"
    write_report(str(path), "<p>second</p>", force=True)
    assert path.read_text() == "<p>second</p>"


def _tank():
    """An invented vertical tank: 2:1 ellipsoidal heads, radius 600 mm, shell 1500 mm."""
    radius, head, shell = 600.0, 300.0, 1500.0
    t = np.linspace(0.0, np.pi / 2, 40)
    z = np.r_[head - head * np.cos(t), head + shell + head * np.sin(t)]
    r = np.r_[radius * np.sin(t), radius * np.cos(t)]
    levels = np.linspace(0.0, 2 * head + shell, 61)
    volumes = np.interp(levels, z, np.cumsum(np.r_[0, np.diff(z)] * r ** 2)) * np.pi / 1e6
    areas = np.linspace(0.0, 4.9, levels.size)
    return levels, volumes, areas, (z, r), [(head, "bottom head tangent line"),
                                            (head + shell, "top head tangent line")]


@pytest.mark.parametrize("with_profile", [True, False])
@pytest.mark.parametrize("title", [None, "Level table of the invented tank " + "T-1 " * 30])
def test_level_picture_labels_stay_on_the_canvas_and_apart(with_profile, title):
    levels, volumes, areas, profile, marks = _tank()
    close = marks + [(310.0, "inlet nozzle centre line")]     # 10 mm above a tangent line
    fig = level_picture(levels, volumes, areas, level_unit="mm", volume_unit="L", area_unit="m²",
                        capacity=float(volumes[-1]), profile=profile if with_profile else None,
                        marks=close, title=title)
    boxes = label_boxes(fig)
    texts = [t for t, _ in boxes]
    assert "volume (L)" in texts and "wetted area (m²)" in texts and "level (mm)" in texts
    assert not any("^" in t for t in texts)
    canvas = fig.bbox
    for text, box in boxes:
        assert canvas.x0 - 0.5 <= box.x0 and box.x1 <= canvas.x1 + 0.5, text
        assert canvas.y0 - 0.5 <= box.y0 and box.y1 <= canvas.y1 + 0.5, text
    for i, (a, box_a) in enumerate(boxes):
        for b, box_b in boxes[i + 1:]:
            assert not box_a.overlaps(box_b), (a, b)


def test_level_picture_refuses_mismatched_arrays():
    with pytest.raises(ValueError, match="differ in length"):
        level_picture([0, 1], [0, 1], [0, 1, 2], level_unit="mm", volume_unit="L", area_unit="m²")
    with pytest.raises(ValueError, match="area_unit"):
        level_picture([0, 1], [0, 1], [0, 1], level_unit="mm", volume_unit="L")
    with pytest.raises(ValueError, match="at least one level"):
        level_picture([], [], level_unit="mm", volume_unit="L")


# ---------------------------------------------------------------- a real browser (Chromium)

def _chromium():
    for name in ("chromium", "chromium-browser", "google-chrome"):
        path = shutil.which(name)
        if path:
            return path
    return None


def _browser(*args, cwd):
    exe = _chromium()
    if exe is None:
        pytest.skip("Chromium is not installed and could not be installed (apt-get install "
                    "chromium); the browser checks of the reports did not run")
    run = subprocess.run([exe, "--headless", "--no-sandbox", "--disable-gpu",
                          "--disable-dev-shm-usage", "--no-first-run", *args],
                         cwd=cwd, capture_output=True, text=True, timeout=60)
    assert run.returncode == 0, run.stderr[-2000:]
    return run


def _pdf_pages(path) -> list:
    """The text of each page (pdftotext) or, without poppler, empty texts per /Type /Page."""
    if shutil.which("pdftotext"):
        out = subprocess.run(["pdftotext", "-layout", str(path), "-"], capture_output=True,
                             text=True, timeout=30, check=True).stdout
        pages = out.split("\f")
        return pages[:-1] if pages and not pages[-1].strip() else pages
    data = path.read_bytes()
    return [""] * len(re.findall(rb"/Type\s*/Page(?!s)", data))


def _print(page_html: str, tmp_path, name: str):
    source = tmp_path / f"{name}.html"
    source.write_text(page_html, encoding="utf-8")
    pdf = tmp_path / f"{name}.pdf"
    _browser(f"--print-to-pdf={pdf}", "--no-pdf-header-footer", source.as_uri(), cwd=tmp_path)
    assert pdf.exists() and pdf.stat().st_size > 0
    return _pdf_pages(pdf)


def test_in_a_browser_the_dom_holds_the_json_figures_and_a_screenshot_renders(html_page, tmp_path):
    levels, volumes, areas, profile, marks = _tank()
    fig = level_picture(levels, volumes, areas, level_unit="mm", volume_unit="L", area_unit="m²",
                        capacity=float(volumes[-1]), profile=profile, marks=marks)
    r = _vessel_result()
    source = tmp_path / "report.html"
    source.write_text(report_html(r, title="Tank T1", pictures=[("Level table", svg_of(fig))]),
                      encoding="utf-8")
    run = _browser("--dump-dom", source.as_uri(), cwd=tmp_path)
    dom = html_page(run.stdout)
    _check_tables(dom, r)
    assert dom.tags.count("svg") == 1 and "path" in dom.tags
    shot = tmp_path / "shot.png"
    _browser(f"--screenshot={shot}", "--window-size=1000,1400", "--hide-scrollbars",
             source.as_uri(), cwd=tmp_path)
    assert shot.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n" and shot.stat().st_size > 20_000


@pytest.mark.parametrize("paper", ["A4", "letter"])
def test_in_a_browser_a_long_table_prints_on_several_pages_with_its_headings(tmp_path, paper):
    r = _vessel_result(n=301)
    page = report_html(r, title="Tank T1, every 10 mm")
    page = page.replace("</style>", f"@page {{ size: {paper}; }}</style>", 1)
    pages = _print(page, tmp_path, f"long-{paper}")
    # 301 rows of about 14 px at 8.5 pt: several pages on either paper (common practice, no source)
    assert 4 <= len(pages) <= 12, len(pages)
    if any(pages):
        last_row = _expected(r, "levels")[-1][0]
        assert last_row in pages[-1] or last_row in pages[-2]
        # every page that shows rows of the table shows its headings again (thead repeated)
        for number, text in enumerate(pages, 1):
            if re.search(r"^\s*\d[\d\u202f ]*\s+\d", text, re.M):
                assert "level (mm)" in text and "volume (L)" in text, number


def test_in_a_browser_many_parts_print_a_page_each(tmp_path):
    parts = [_part(f"part-{k}.toml", 1e-6 * (k + 1)) for k in range(3)]
    pages = _print(report_html(parts, title="Batch of three"), tmp_path, "batch")
    assert len(pages) == 4                      # the summary, then one page per part
    if any(pages):
        assert "Summary (3 parts)" in pages[0]
        for k in range(3):
            assert f"part-{k}.toml" in pages[k + 1] and f"cross-check: part-{k}.toml" in pages[k + 1]
