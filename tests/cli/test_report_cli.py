"""``--report FILE.html`` on measure, vessel, turn and coat, end to end.

Each command is run once with ``--json`` and ``--report``: the report must parse, its tables
must hold the figures of the JSON printed by the same run, formatted as the terminal formats
them (revolve.render.output.cell), each part's section must be an inline SVG, the sources and
cautions must be there, and nothing outside the file may be referenced. The overwrite rule
(``--force``) and bad names (one line naming --report, exit 2, nothing written) are checked
for every command. The figures themselves are checked against references in each command's
own tests; the profiles used here are the bundled invented examples (run, never used as
reference values).
"""

from __future__ import annotations

import json
import re
import shutil
import subprocess
from pathlib import Path

import pytest

from revolve.cli.app import main
from revolve.jobs.results import Field
from revolve.render.output import cell

ROOT = Path(__file__).resolve().parents[2]
BUSHING = str(ROOT / "profiles" / "flanged-bushing.toml")
PULLEY = str(ROOT / "profiles" / "grooved-pulley.toml")
SHAFT = str(ROOT / "profiles" / "turned-stepped-shaft.toml")
SLEEVE = str(ROOT / "profiles" / "turned-sleeve-inch.toml")
SYSTEM = str(ROOT / "examples" / "coating-idler-system.toml")
VESSEL = ["--diameter", "1000", "--length", "1500", "--head", "ellipsoidal", "--thickness", "6",
          "--material", "carbon_steel", "--liquid", "water"]


def run(args, capsys):
    with pytest.raises(SystemExit) as exc:
        main(list(args))
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def shown(value, f: Field) -> str:
    text = cell(value, f)
    return text[:-2] if f.style == "percent" and text.endswith(" %") else text


def check_tables(p, result, data, occurrence=0):
    """Every table of ``result`` (its fields) holds ``data``'s figures (the command's JSON)."""
    for t in result.tables:
        rows = p.table(t.key, occurrence)
        if t.figures:
            figures = data[t.key]
            expected = [[f.label.strip(), shown(figures[f.key], f)] for f in t.fields
                        if f.key in figures]
            assert [row[:2] for row in rows[1:]] == expected, t.key
        else:
            fields = [f for f in t.fields if any(f.key in row for row in data[t.key])]
            assert rows[1:] == [[cell(row.get(f.key), f) for f in fields]
                                for row in data[t.key]], t.key


@pytest.fixture
def self_contained(html_page):
    """A check that a written report stands alone; it gives the parsed page."""
    return lambda path: check_self_contained(path, html_page)


def check_self_contained(path, html_page):
    page = Path(path).read_text(encoding="utf-8")
    p = html_page(page)
    assert page.startswith("<!DOCTYPE html>") and page.rstrip().endswith("</html>")
    assert not re.search(r"https?:|ftp:|file:|//[a-z]", page, re.I)
    assert {"script", "link", "img", "iframe", "object", "embed"}.isdisjoint(p.tags)
    for tag, name, value in p.attrs:
        assert name != "src" and not name.startswith("on"), (tag, name)
        if name in ("href", "xlink:href"):
            assert value.startswith("#") or value.startswith("data:image/"), (tag, value)
    return p


def text_of(p) -> str:
    return " ".join("".join(p.text).split())


# -- each command: one run gives the JSON and the report --------------------------------------

def test_measure_report_holds_the_json_figures(self_contained, tmp_path, capsys):
    import revolve

    report = tmp_path / "bushing.html"
    code, out, err = run(["measure", BUSHING, "--material", "carbon_steel", "--json",
                          "--report", str(report)], capsys)
    assert code == 0, err
    data = json.loads(out)
    p = self_contained(report)
    assert p.tags.count("svg") == 1                       # the section picture, inline
    figures = {row[0]: row[1:] for row in p.table("figures")[1:]}
    units = data["units"]
    for label, key, role in (("volume", "volume", "volume"), ("section area", "area", "area"),
                             ("mass", "mass", "mass"), ("surface, swept total", "surface_area",
                                                         "area")):
        assert figures[label] == [cell(data[key], Field(key, label, role)), units[role]], label
    for face, value in data["surface_by_face"].items():
        assert figures[f"surface: {face}"][0] == cell(value, Field(face, face, "area"))
    # the library's result is the same (the one code path): its tables hold the same figures
    lib = revolve.measure(BUSHING, material="carbon_steel")
    assert lib.to_dict() == data
    text = text_of(p)
    assert "Measurement: Flanged bushing, idler end" in text
    assert "Sources of materials and data" in text and "Carbon steel, 7850 kg/m³" in text
    assert data["cautions"][0] in text
    assert "cross-check" in text.lower()


def test_vessel_report_holds_the_json_figures_and_the_liquid_space(self_contained, tmp_path,
                                                                   capsys):
    import revolve

    report, profile = tmp_path / "tank.html", tmp_path / "tank.toml"
    code, out, err = run(["vessel", *VESSEL, "--json", "--report", str(report),
                          "--output", str(profile)], capsys)
    assert code == 0, err
    data = json.loads(out)
    p = self_contained(report)
    lib = revolve.build_vessel(diameter=1000, length=1500, head="ellipsoidal", thickness=6,
                               material="carbon_steel", liquid="water")
    check_tables(p, lib, data)
    assert p.tags.count("svg") == 1 and profile.exists()
    text = text_of(p)
    assert "Section of liquid space" in text
    for caution in data["cautions"]:
        assert caution in text
    assert "liquid: Water" in text and "metal: Carbon steel" in text


def test_turn_report_holds_the_json_figures(self_contained, tmp_path, capsys):
    import revolve

    report = tmp_path / "quote.html"
    settings = ["-q", "40", "--stock-price", "2.40/kg", "--machine-rate", "85/h"]
    code, out, err = run(["turn", SHAFT, *settings, "--json", "--report", str(report)], capsys)
    assert code == 0, err
    data = json.loads(out)
    p = self_contained(report)
    lib = revolve.quote_turning(SHAFT, quantity=40, stock_price="2.40/kg", machine_rate="85/h")
    check_tables(p, lib, data)
    text = text_of(p)
    assert p.tags.count("svg") == 1 and data["cautions"][0] in text
    assert f"cutting data: {data['inputs']['cutting_data_source']}" in text


def test_turn_report_of_many_parts_has_a_summary_and_a_page_each(self_contained, tmp_path, capsys):
    import revolve

    report = tmp_path / "batch.html"
    code, out, err = run(["turn", SHAFT, BUSHING, "-q", "10,20", "--json", "--report",
                          str(report)], capsys)
    assert code == 0, err
    data = json.loads(out)
    p = self_contained(report)
    page = report.read_text(encoding="utf-8")
    assert page.count('<section class="part') == 2 and p.tags.count("svg") == 2
    summary = p.table("summary")
    assert [row[0] for row in summary[1:]] == [SHAFT, BUSHING]
    # each part's page holds the figures of that part's row of the JSON
    for k, (path, n) in enumerate(((SHAFT, 10), (BUSHING, 20))):
        row = data["parts"][k]
        lib = revolve.quote_turning(path, quantity=n, bar_list=data["inputs"]["bar_list"])
        check_tables(p, lib, lib.to_dict(), occurrence=k)
        figures = {r[0]: r[1] for r in p.table("part", k)[1:]}
        fields = {f.key: f for f in lib.table("part").fields}
        assert figures[fields["part_mass"].label] == cell(row["part_mass"], fields["part_mass"])


def test_coat_report_holds_the_json_figures(self_contained, tmp_path, capsys):
    import revolve

    report = tmp_path / "coat.html"
    code, out, err = run(["coat", PULLEY, BUSHING, "--system", SYSTEM, "-q", "10,20", "--json",
                          "--report", str(report)], capsys)
    assert code == 0, err
    data = json.loads(out)
    p = self_contained(report)
    lib = revolve.estimate_coating([PULLEY, BUSHING], system=SYSTEM, quantity=[10, 20])
    check_tables(p, lib, data)
    text = text_of(p)
    assert p.tags.count("svg") == 2                       # each part's section
    assert "coating system: Epoxy primer and polyurethane finish" in text
    for caution in data["cautions"]:
        assert caution in text


def test_measure_report_of_many_parts(self_contained, tmp_path, capsys):
    folder = tmp_path / "parts"
    folder.mkdir()
    for name in ("flanged-bushing.toml", "grooved-pulley.toml"):
        shutil.copy(ROOT / "profiles" / name, folder / name)
    (folder / "broken.toml").write_text("[[loop]]\nstart = [0, 1]\nsegments = []\n")
    report = tmp_path / "parts.html"
    code, out, err = run(["measure", str(folder), "--json", "--report", str(report)], capsys)
    assert code == 2 and "broken.toml" in err               # the refused part keeps its row
    rows = [json.loads(line) for line in out.splitlines()]
    p = self_contained(report)
    summary = p.table("summary")
    measured = [r for r in rows if "error" not in r]
    assert [row[0] for row in summary[1:]] == [r["file"] for r in measured]
    assert summary[0][1] == "revolved" or "volume" in " ".join(summary[0])
    for k, r in enumerate(measured):
        figures = {row[0]: row[1] for row in p.table("figures", k)[1:]}
        assert figures["volume"] == cell(r["volume"], Field("volume", "volume", "volume"))


# -- the overwrite rule and bad names, for every command --------------------------------------

COMMANDS = {
    "measure": ["measure", BUSHING],
    "vessel": ["vessel", *VESSEL],
    "turn": ["turn", SHAFT],
    "coat": ["coat", BUSHING, "--system", SYSTEM],
}


@pytest.mark.parametrize("command", sorted(COMMANDS))
def test_an_existing_report_is_refused_without_force(command, tmp_path, capsys):
    report, csv = tmp_path / "r.html", tmp_path / "r.csv"
    report.write_text("keep me", encoding="utf-8")
    extra = [] if command == "vessel" else ["--csv", str(csv)]
    code, out, err = run([*COMMANDS[command], "--report", str(report), *extra], capsys)
    assert code == 2 and out == ""
    assert err.count("\n") == 1 and "--report" in err and "--force" in err
    assert report.read_text(encoding="utf-8") == "keep me" and not csv.exists()
    code, out, err = run([*COMMANDS[command], "--report", str(report), "--force", *extra],
                         capsys)
    assert code == 0, err
    assert report.read_text(encoding="utf-8").startswith("<!DOCTYPE html>")


@pytest.mark.parametrize("command", sorted(COMMANDS))
@pytest.mark.parametrize("name,says", [("r.htm", 'not ".htm"'), ("r", "without an ending"),
                                       ("no-such-folder/r.html", "folder"),
                                       (".", "not")])
def test_a_bad_report_name_is_refused_before_any_work(command, name, says, tmp_path, capsys,
                                                      monkeypatch):
    monkeypatch.chdir(tmp_path)
    extra = ["--output", "v.toml"] if command == "vessel" else ["--csv", "r.csv"]
    code, out, err = run([*COMMANDS[command], "--report", name, *extra], capsys)
    assert code == 2 and out == ""
    assert err.startswith("revolve: error: --report: ") and err.count("\n") == 1, err
    assert says in err
    assert sorted(p.name for p in tmp_path.iterdir()) == []          # nothing written


# -- a real browser: a many-part measure report prints a page per part -------------------------

def test_in_a_browser_a_many_part_measure_report_prints_a_summary_and_a_page_each(tmp_path,
                                                                                   capsys):
    exe = next((shutil.which(n) for n in ("chromium", "chromium-browser", "google-chrome")
                if shutil.which(n)), None)
    if exe is None:
        pytest.skip("Chromium is not installed (apt-get install chromium); the printed report "
                    "was not checked")
    names = ("flanged-bushing.toml", "grooved-pulley.toml", "domed-lid.toml")
    folder = tmp_path / "parts"
    folder.mkdir()
    for name in names:
        shutil.copy(ROOT / "profiles" / name, folder / name)
    report, pdf = tmp_path / "parts.html", tmp_path / "parts.pdf"
    code, out, err = run(["measure", str(folder), "--material", "carbon_steel", "--report",
                          str(report)], capsys)
    assert code == 0, err
    for paper in ("A4", "letter"):
        page = report.read_text(encoding="utf-8").replace(
            "</style>", f"@page {{ size: {paper}; }}</style>", 1)
        source = tmp_path / f"parts-{paper}.html"
        source.write_text(page, encoding="utf-8")
        done = subprocess.run([exe, "--headless", "--no-sandbox", "--disable-gpu",
                               "--disable-dev-shm-usage", "--no-first-run",
                               f"--print-to-pdf={pdf}", "--no-pdf-header-footer",
                               source.as_uri()], cwd=tmp_path, capture_output=True, text=True,
                              timeout=60)
        assert done.returncode == 0 and pdf.exists(), done.stderr[-2000:]
        if shutil.which("pdftotext"):
            text = subprocess.run(["pdftotext", "-layout", str(pdf), "-"], capture_output=True,
                                  text=True, timeout=30, check=True).stdout
            pages = [t for t in text.split("\f") if t.strip()]
        else:
            pages = [""] * len(re.findall(rb"/Type\s*/Page(?!s)", pdf.read_bytes()))
        # the summary on its own page, then each part from a new page: one page, or two
        # where its tables run over (common practice for printed reports, no source)
        assert 1 + len(names) <= len(pages) <= 1 + 2 * len(names), (paper, len(pages))
        if any(pages):
            assert "Summary (3 parts)" in pages[0] and ".toml" not in pages[0].split(
                "Sources")[-1]
            # a part's page opens with its file name (the heading, perhaps wrapped), then Inputs
            heads = ["".join(text.split("Inputs")[0].split()) if "Inputs" in text else ""
                     for text in pages]
            expected = ["".join(str(folder / name).split()) for name in sorted(names)]
            starts = [k for k, head in enumerate(heads) if head in expected]
            assert [heads[k] for k in starts] == expected          # nothing above the heading
            ends = starts[1:] + [len(pages)]
            for k, end in zip(starts, ends):
                assert end - k in (1, 2) and "Caution" in "".join(pages[k:end])


@pytest.mark.parametrize("command", ["measure", "turn", "coat"])
def test_a_report_of_too_many_parts_is_refused_before_any_work(command, tmp_path, capsys,
                                                                monkeypatch):
    from revolve.cli import options

    monkeypatch.setattr(options, "REPORT_MOST_PARTS", 1)     # the bound, made small to test it
    extra = ["--system", SYSTEM] if command == "coat" else []
    report, csv = tmp_path / "r.html", tmp_path / "r.csv"
    code, out, err = run([command, BUSHING, SHAFT, *extra, "--csv", str(csv), "--report",
                          str(report)], capsys)
    assert code == 2 and out == "" and err.count("\n") == 1
    assert err.startswith("revolve: error: --report: a report holds at most 1 parts, not 2")
    assert not report.exists() and not csv.exists()
