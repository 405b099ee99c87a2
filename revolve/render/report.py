"""Self-contained HTML reports of any :class:`~revolve.jobs.results.Result` (or many of them).

A report is one HTML file that opens without network access: the style sheet
is inline, pictures are inline SVG text made by matplotlib (:func:`svg_of`),
no external fonts or scripts. It holds the inputs, the pictures, every table
of each result with the unit in each heading, the notes (the cross-check
line), the sources of materials and data, and the cautions
(:data:`revolve.jobs.results.CAUTIONS`).

The figures are the terminal's: values come from :meth:`Table.json
<revolve.jobs.results.Table.json>` through the result's
:class:`~revolve.jobs.results.OutputUnits` (the JSON's numbers) and are
formatted by :func:`revolve.render.output.cell` (six significant figures,
grouped digits). Every text a user gave (file names, face names, inputs) is
escaped.

Several results (many parts) give one report: a summary table first, then a
page per part. The print style sheet keeps margins safe on A4 and Letter,
repeats a long table's header on every page, never breaks inside a row and
starts each part on a new page.

Examples
--------
>>> from revolve.jobs.results import Field, Result, Table, trade_units
>>> t = Table("main", "Part", (Field("volume", "volume", "volume"),), ({"volume": 1e-6},),
...           figures=True)
>>> page = report_html(Result("measure", trade_units("part", "mm"), {"profile": "<a>.toml"}, (t,)),
...                    title="Bush & sleeve")
>>> "<title>Bush &amp; sleeve</title>" in page, "&lt;a&gt;.toml" in page, "<a>.toml" in page
(True, True, False)
>>> "<td class=\\"num\\">1000</td>" in page
True
>>> report_html([], title="Nothing")
Traceback (most recent call last):
...
ValueError: a report needs at least one result
"""

from __future__ import annotations

import json
import re
from html import escape
from typing import Any, Iterable, List, Mapping, Optional, Sequence, Tuple, Union

from revolve.jobs.results import Field, Result, Table
from revolve.render.output import _heading, cell, write_outputs

__all__ = ["report_html", "report_for", "write_report", "svg_of", "STYLE"]

#: The report's style sheet, screen and print (inline in every report).
STYLE = """
:root { color-scheme: light; }
body { font-family: "DejaVu Sans", "Liberation Sans", Arial, Helvetica, sans-serif;
       font-size: 10.5pt; line-height: 1.35; color: #111; background: #fff;
       max-width: 190mm; margin: 1.5em auto; padding: 0 1em; }
h1 { font-size: 16pt; margin: 0 0 0.4em; overflow-wrap: anywhere; }
h2 { font-size: 13pt; margin: 1.2em 0 0.4em; border-bottom: 1px solid #999;
     overflow-wrap: anywhere; break-after: avoid; page-break-after: avoid; }
h3 { font-size: 11pt; margin: 1em 0 0.3em; break-after: avoid; page-break-after: avoid; }
table { border-collapse: collapse; margin: 0.3em 0 0.9em; font-size: 9.5pt; max-width: 100%; }
caption { text-align: left; font-weight: bold; padding: 0.2em 0; caption-side: top; }
th, td { border: 1px solid #bbb; padding: 0.15em 0.45em; vertical-align: top; }
th { background: #eee; text-align: left; font-weight: 600; }
thead th { text-align: center; }
td.num { text-align: right; white-space: nowrap; font-variant-numeric: tabular-nums; }
td.text { overflow-wrap: anywhere; }
thead { display: table-header-group; }
tfoot { display: table-footer-group; }
tr, th, td { break-inside: avoid; page-break-inside: avoid; }
figure { margin: 0.5em 0 1em; break-inside: avoid; page-break-inside: avoid; }
figure svg { display: block; width: 100%; height: auto; max-height: 125mm; }
figcaption { font-size: 9pt; color: #333; }
p.note { margin: 0.3em 0; }
div.caution { border: 1.5px solid #b58900; background: #fdf6e3; padding: 0.4em 0.7em;
              margin: 0.8em 0; break-inside: avoid; page-break-inside: avoid; }
div.caution h3 { margin: 0 0 0.2em; }
ul.sources { padding-left: 1.2em; }
section.part { break-before: page; page-break-before: always; }
section.part.first { break-before: auto; page-break-before: auto; }
.meta { color: #444; font-size: 9pt; }
@page { margin: 16mm 14mm 18mm 14mm; }
@media print {
  body { max-width: none; margin: 0; padding: 0; font-size: 9.5pt; }
  table { font-size: 8.5pt; }
  a { color: inherit; text-decoration: none; }
  /* a part's picture, tables and cautions on one page */
  figure { margin: 0.2em 0 0.4em; }
  figure svg { max-height: 80mm; }
  th, td { padding: 0.05em 0.4em; }
  section.part > h2:first-child { margin-top: 0; }
}
"""

_SVG_START = re.compile(r"<svg\b", re.I)
_UNSAFE_SVG = re.compile(r"<\s*(script|foreignObject|iframe|object|embed|style|a)\b|"
                         r"\son\w+\s*=|javascript:|@import|url\(\s*['\"]?(?!#)", re.I)
#: A raster embedded in the picture itself (matplotlib's images with svg.image_inline).
_EMBEDDED_IMAGE = re.compile(r"data:image/(png|jpeg);base64,[A-Za-z0-9+/=\s]*$")
_HREF = re.compile(r"""\b(?:xlink:)?href\s*=\s*["']([^"']*)["']""", re.I)


def svg_of(figure) -> str:
    """A matplotlib Figure as inline SVG text for an HTML page.

    Text is drawn as paths (no font needed where the page is opened), the
    metadata, comments, XML declaration, doctype and namespace declarations
    are dropped (an HTML page needs none of them, and none points outside the
    file), and the fixed width and height give way to the view box so the
    picture scales to the page.

    Examples
    --------
    >>> from matplotlib.figure import Figure
    >>> fig = Figure(figsize=(2, 1))
    >>> _ = fig.add_subplot().plot([0, 1], [0, 1], label="a --> b")
    >>> text = svg_of(fig)
    >>> text.startswith("<svg"), "http" in text, "<!--" in text, "viewBox" in text
    (True, False, False, True)
    >>> svg_of(Figure(figsize=(1, 1))).startswith("<svg")      # an empty figure too
    True
    """
    import io

    import matplotlib

    buffer = io.StringIO()
    with matplotlib.rc_context({"svg.fonttype": "path", "svg.hashsalt": "revolve",
                                "svg.image_inline": True}):
        figure.savefig(buffer, format="svg",
                       metadata={"Creator": None, "Date": None, "Format": None, "Type": None})
    text = buffer.getvalue()
    start = _SVG_START.search(text)
    text = text[start.start():] if start else text
    text = re.sub(r"<!--.*?-->", "", text, flags=re.S)
    text = re.sub(r"<metadata>.*?</metadata>", "", text, flags=re.S)
    text = re.sub(r'\s+xmlns(?::\w+)?="[^"]*"', "", text)
    # matplotlib's style element ("*{stroke-linejoin: round; ...}") would style the whole page:
    # its (inherited) properties go on the picture's root instead
    rules = re.findall(r"<style[^>]*>\s*\*\s*\{([^}]*)\}\s*</style>", text)
    text = re.sub(r"<style[^>]*>.*?</style>", "", text, flags=re.S)
    if rules:
        style = escape(" ".join(rule.strip() for rule in rules), quote=True)
        text = re.sub(r"<svg\b", f'<svg style="{style}"', text, count=1)
    text = re.sub(r'(<svg\b[^>]*?)\s+width="[^"]*"', r"\1", text, count=1)
    text = re.sub(r'(<svg\b[^>]*?)\s+height="[^"]*"', r"\1", text, count=1)
    text = re.sub(r"\n\s*\n", "\n", text)
    return text.strip()


def _scoped_svg(svg: str, prefix: str) -> str:
    """``svg`` with its ids made unique in the page, after refusing anything that is not a picture."""
    text = svg.strip()
    if not text.lower().startswith("<svg"):
        raise ValueError("a picture must be SVG text starting with <svg (see svg_of)")
    bad = _UNSAFE_SVG.search(text)
    if bad:
        raise ValueError(f"a picture may not hold {bad.group(0).strip()!r}: pictures are inline "
                         "SVG without scripts or outside references")
    for ref in _HREF.findall(text):
        if not (ref.startswith("#") or _EMBEDDED_IMAGE.match(ref)):
            raise ValueError(f"a picture may refer only to its own parts, not to {ref!r}")
    text = re.sub(r'\bid="([^"]+)"', lambda m: f'id="{prefix}{m.group(1)}"', text)
    text = re.sub(r'((?:xlink:)?href=")#([^"]+)"', lambda m: f'{m.group(1)}#{prefix}{m.group(2)}"',
                  text)
    text = re.sub(r"url\(#([^)]+)\)", lambda m: f"url(#{prefix}{m.group(1)})", text)
    return text


def _unit(f: Field, r: Result) -> str:
    if f.style == "percent":
        return "%"
    if f.style == "money":
        return r.units.currency or ""
    return r.units.unit(f.role)


def _figure_value(value: Any, f: Field) -> str:
    shown = cell(value, f)
    if f.style == "percent" and shown.endswith(" %"):
        shown = shown[:-2]
    return shown


def _td(text: str, f: Optional[Field]) -> str:
    kind = "text" if f is None or f.style == "text" else "num"
    return f'<td class="{kind}">{escape(text)}</td>'


def _table_html(t: Table, r: Result) -> str:
    shown = t.json(r.units)
    caption = f"<caption>{escape(t.title)}</caption>"
    if t.figures:
        body = []
        for f in t.fields:
            if f.key in shown:
                body.append(f"<tr><th scope=\"row\">{escape(f.label)}</th>"
                            f"{_td(_figure_value(shown[f.key], f), f)}"
                            f"<td class=\"unit\">{escape(_unit(f, r))}</td></tr>")
        head = "<thead><tr><th>quantity</th><th>value</th><th>unit</th></tr></thead>"
        return (f'<table class="figures" data-key="{escape(t.key)}">{caption}{head}'
                f"<tbody>{''.join(body)}</tbody></table>")
    fields = [f for f in t.fields if any(f.key in row for row in shown)]
    head = "".join(f'<th scope="col">{escape(_heading(f, r) if f.style != "percent" else f.label)}'
                   "</th>" for f in fields)
    body = "".join("<tr>" + "".join(_td(cell(row.get(f.key), f), f) for f in fields) + "</tr>"
                   for row in shown)
    return (f'<table class="rows" data-key="{escape(t.key)}">{caption}<thead><tr>{head}</tr></thead>'
            f"<tbody>{body}</tbody></table>")


def _input_text(value: Any) -> str:
    if isinstance(value, str):
        return value
    if value is None:
        return "—"
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, (int, float)):
        return repr(value)
    return json.dumps(value, ensure_ascii=False, default=str)


def _inputs_html(r: Result) -> str:
    if not r.inputs:
        return ""
    rows = "".join(f'<tr><th scope="row">{escape(str(k))}</th><td class="text">'
                   f"{escape(_input_text(v))}</td></tr>" for k, v in r.inputs.items())
    return (f'<table class="inputs"><caption>Inputs</caption>'
            f"<thead><tr><th>input</th><th>given</th></tr></thead><tbody>{rows}</tbody></table>")


def _pictures_html(pictures: Sequence[Tuple[str, str]], prefix: str) -> str:
    out = []
    for k, (caption, svg) in enumerate(pictures):
        out.append(f"<figure>{_scoped_svg(svg, f'{prefix}p{k}-')}"
                   f"<figcaption>{escape(caption)}</figcaption></figure>")
    return "".join(out)


def _cautions_html(cautions: Iterable[str]) -> str:
    from revolve.jobs.results import CAUTIONS

    texts = list(dict.fromkeys(CAUTIONS.get(c, c) for c in cautions))
    if not texts:
        return ""
    return ('<div class="caution"><h3>Caution</h3>'
            + "".join(f"<p>{escape(t)}</p>" for t in texts) + "</div>")


def _sources_of(r: Result) -> List[str]:
    given = r.extra.get("sources") if isinstance(r.extra, Mapping) else None
    if isinstance(given, str):
        return [given]
    if isinstance(given, Mapping):
        return [f"{k}: {v}" for k, v in given.items()]
    return [str(s) for s in given] if given else []


def _sources_html(items: Sequence[str]) -> str:
    items = list(dict.fromkeys(items))
    if not items:
        return ""
    return ('<h3>Sources of materials and data</h3><ul class="sources">'
            + "".join(f"<li>{escape(s)}</li>" for s in items) + "</ul>")


def _part_name(r: Result, k: int) -> str:
    for key in ("profile", "file", "name", "part"):
        value = r.inputs.get(key) if isinstance(r.inputs, Mapping) else None
        if isinstance(value, str) and value:
            return value
    return f"part {k + 1}"


def _shown_row(r: Result, key: str) -> Tuple[Optional[Table], Mapping[str, Any]]:
    """Table ``key`` of ``r`` and its figures (a table of rows: its first row) in output units."""
    t = next((t for t in r.tables if t.key == key), None)
    if t is None:
        return None, {}
    shown = t.json(r.units)
    return t, (shown if t.figures else (shown[0] if shown else {}))


def _summary_html(results: Sequence[Result], names: Sequence[str],
                  summary: Optional[Sequence[Tuple[str, str]]] = None) -> str:
    """One row per part: the figures ``summary`` names as ``(table key, field key)`` pairs, by
    default every figure of each part's first table of figures (else its first table)."""
    columns: List[Tuple[str, Field]] = []       # (table key, field) in first-seen order
    seen = set()
    if summary is None:
        for r in results:
            t = next((t for t in r.tables if t.figures), r.tables[0] if r.tables else None)
            if t is None:
                continue
            _, shown = _shown_row(r, t.key)
            for f in t.fields:
                if f.key in shown and (t.key, f.key) not in seen and f.style != "text":
                    seen.add((t.key, f.key))
                    columns.append((t.key, f))
    else:
        for key, field_key in summary:
            for r in results:
                t, shown = _shown_row(r, key)
                f = next((f for f in t.fields if f.key == field_key), None) if t else None
                if f is not None and field_key in shown:
                    columns.append((key, f))
                    break
    heads, cells = [], [[] for _ in results]
    for key, f in columns:
        units = {_unit(f, r) for r in results if _shown_row(r, key)[0] is not None}
        one = len(units) == 1
        unit = next(iter(units)) if one else ""
        heads.append(f"{f.label} ({unit})" if one and unit else f.label)
        for i, r in enumerate(results):
            _, shown = _shown_row(r, key)
            if f.key not in shown:
                cells[i].append(_td("—", f))
                continue
            value = _figure_value(shown[f.key], f) if one else cell(shown[f.key], f)
            own = _unit(f, r)
            if not one and own and f.style != "percent":
                value = f"{value} {own}"
            cells[i].append(_td(value, f))
    head = '<th scope="col">part</th>' + "".join(f'<th scope="col">{escape(h)}</th>' for h in heads)
    body = "".join(f'<tr><td class="text"><a href="#part-{i + 1}">{escape(name)}</a></td>'
                   + "".join(row) + "</tr>" for i, (name, row) in enumerate(zip(names, cells)))
    return (f'<table class="summary"><caption>Summary ({len(results)} parts)</caption>'
            f"<thead><tr>{head}</tr></thead><tbody>{body}</tbody></table>")


def _normalise(results, pictures) -> Tuple[List[Result], List[Sequence[Tuple[str, str]]]]:
    if isinstance(results, Result):
        results = [results]
        pictures = [pictures or ()]
    else:
        results = list(results)
        pictures = list(pictures) if pictures is not None else [() for _ in results]
    if not results:
        raise ValueError("a report needs at least one result")
    if len(pictures) != len(results):
        raise ValueError(f"pictures: one list per result is needed ({len(results)}), "
                         f"not {len(pictures)}")
    normal = []
    for item in pictures:
        item = list(item or ())
        for pair in item:
            if not (isinstance(pair, tuple) and len(pair) == 2 and all(isinstance(x, str) for x in pair)):
                raise ValueError("each picture is a (caption, SVG text) pair")
        normal.append(item)
    return results, normal


def report_html(results: Union[Result, Sequence[Result]], *, title: str,
                pictures: Optional[Sequence[Any]] = None,
                sources: Optional[Sequence[str]] = None,
                summary: Optional[Sequence[Tuple[str, str]]] = None) -> str:
    """One self-contained HTML report of one result or of many (one page per part).

    Parameters
    ----------
    results : Result or sequence of Result
        What to report. Several results get a summary table first (one row
        per part, from each part's first table of figures) and a page each.
    title : str
        The report's title (escaped).
    pictures : sequence, optional
        For one result: ``(caption, svg_text)`` pairs; for many: one such
        sequence per result (empty where a part has none). SVG text comes
        from :func:`svg_of`; anything with scripts or outside references is
        refused.
    sources : sequence of str, optional
        The sources of materials and data (shown with those a result holds
        in ``extra["sources"]``).
    summary : sequence of (str, str), optional
        Many parts: the summary's columns as ``(table key, field key)``
        pairs (default: every figure of each part's first table of figures).

    Returns
    -------
    str
        The HTML document.

    Examples
    --------
    >>> from revolve.jobs.results import Field, Result, Table, trade_units
    >>> u = trade_units("part", "in")
    >>> parts = [Result("measure", u, {"profile": name}, (Table("main", "Part",
    ...          (Field("volume", "volume", "volume"),), ({"volume": v},), figures=True),))
    ...          for name, v in (("a.toml", 0.0254 ** 3), ("b.toml", 2 * 0.0254 ** 3))]
    >>> page = report_html(parts, title="Two parts", sources=["steel: from memory"])
    >>> page.count('<section class="part'), "Summary (2 parts)" in page, "volume (in³)" in page
    (2, True, True)
    >>> report_html(parts[0], title="t", pictures=[("x", "<svg><script/></svg>")])
    Traceback (most recent call last):
    ...
    ValueError: a picture may not hold '<script': pictures are inline SVG without scripts or outside references
    """
    results, pictures = _normalise(results, pictures)
    many = len(results) > 1
    names = [_part_name(r, k) for k, r in enumerate(results)]
    all_sources = list(sources or ())
    for r in results:
        all_sources.extend(_sources_of(r))
    parts = []
    for k, (r, pics) in enumerate(zip(results, pictures)):
        heading = (f"<h2>{escape(names[k])}</h2>" if many else "")
        body = [heading, _inputs_html(r), _pictures_html(pics, f"r{k}-")]
        body.extend(_table_html(t, r) for t in r.tables)
        body.extend(f'<p class="note">{escape(n)}</p>' for n in r.notes)
        if many:
            body.append(_sources_html(_sources_of(r)))
            body.append(_cautions_html(r.cautions))
        first = " first" if k == 0 and not many else ""
        parts.append(f'<section class="part{first}" id="part-{k + 1}">{"".join(body)}</section>')
    commands = ", ".join(dict.fromkeys(r.command for r in results))
    top = [f"<h1>{escape(title)}</h1>",
           f'<p class="meta">revolve {escape(commands)}'
           f"{f' — {len(results)} parts' if many else ''}</p>"]
    if many:
        top.append(_summary_html(results, names, summary))
        top.append(_sources_html(all_sources))
        top.append(_cautions_html(c for r in results for c in r.cautions))
        closing = ""
    else:
        closing = _sources_html(all_sources) + _cautions_html(results[0].cautions)
    return ("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
            "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">"
            f"<title>{escape(title)}</title><style>{STYLE}</style></head>\n<body>"
            + "".join(top) + "\n" + "\n".join(parts) + closing + "\n</body></html>\n")


def write_report(path: str, html: str, force: bool, option: str = "--report") -> None:
    """Write a report under the one overwrite rule (:func:`revolve.render.output.write_outputs`).

    >>> import os, tempfile
    >>> path = os.path.join(tempfile.mkdtemp(), "r.html")
    >>> write_report(path, "<p>a</p>", force=False)
    >>> write_report(path, "<p>b</p>", force=False)  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --report: .../r.html: the file exists already; give --force to replace it
    >>> write_report(path, "<p>b</p>", force=True); open(path).read()
    '<p>b</p>'
    """
    write_outputs({path: (html, option)}, force=force)


#: The summary's columns of a many-parts report by command: (table key, field key).
SUMMARIES = {
    "measure": (("figures", "area"), ("figures", "volume"), ("figures", "surface_area"),
                ("figures", "mass"), ("crosscheck", "volume_verdict"),
                ("crosscheck", "surface_verdict")),
    "turn": (("part", "part_diameter"), ("part", "part_length"), ("part", "part_mass"),
             ("stock", "stock_label"), ("stock", "stock_mass"),
             ("removed", "utilisation_percent"), ("bars", "bars_needed"),
             ("times", "cycle_time")),
}

#: The report's title by command (then the part's name, for one part).
TITLES = {"measure": "Measurement", "vessel": "Vessel", "turn": "Turning quote",
          "coat": "Coating estimate", "levels": "Level table"}


def _measured_parts(r: Result, axis, angle, units) -> List[Tuple[str, Any, Any, Any]]:
    """``(name, revolution, measurement, output units)`` of each part a result is about.

    What the result holds is used as it is (a measured part, a vessel's
    design); otherwise the profile files its inputs name are read again with
    the command's ``axis``, ``angle`` and ``units`` and measured (quick
    beside drawing the picture).
    """
    from revolve.jobs.measuring import (measure_document, parse_axis, part_units,
                                        revolution_for)

    part = getattr(r, "part", None)
    if getattr(part, "measurement", None) is not None and getattr(part, "revolution", None):
        doc = part.document
        return [(doc.name or doc.file or "profile", part.revolution, part.measurement, r.units)]
    design = getattr(r, "design", None)
    if design is not None:                       # a vessel: the liquid space it writes
        from revolve.geometry.measure import measure
        from revolve.geometry.profile import Revolution
        from revolve.jobs.vessel import sketch_profile

        profile, shown_axis = sketch_profile(design, getattr(r, "orientation", "vertical"),
                                             "inside", name=getattr(r, "name", None))
        rev = Revolution(profile, shown_axis)
        return [("liquid space", rev, measure(rev),
                 part_units(profile.unit, length=r.units.unit("length")))]
    files = r.inputs.get("profiles") or [r.inputs.get("file")]
    out = []
    for path in files:
        if not isinstance(path, str) or not path:
            continue
        from revolve.formats import load_profile

        doc = load_profile(path, unit=units)
        given = parse_axis(axis) if isinstance(axis, str) else axis
        part = measure_document(doc, axis=revolution_for(doc, given, angle).axis, angle=angle)
        out.append((doc.name or path, part.revolution, part.measurement,
                    part_units(doc.profile.unit)))
    return out


def _tall(profile) -> bool:
    """Whether the sketch is taller than it is wide (each segment's exact bounds)."""
    bounds = [s.bounds() for s in profile.segments()]
    if not bounds:
        return False
    x0, y0 = min(b[0] for b in bounds), min(b[1] for b in bounds)
    x1, y1 = max(b[2] for b in bounds), max(b[3] for b in bounds)
    return (y1 - y0) > (x1 - x0)


def _data_sources(r: Result) -> List[str]:
    """Where a result's materials and data come from, as its inputs and JSON name them."""
    i, out = r.inputs, []
    d = r.to_dict()
    if i.get("material_name") and i.get("material_source"):
        density = i.get("density_kg_m3")
        out.append(f"material: {i['material_name']}"
                   + (f", {density:g} kg/m³" if isinstance(density, (int, float)) else "")
                   + f" ({i['material_source']})")
    if i.get("cutting_data_source"):
        out.append(f"cutting data: {i['cutting_data_source']}")
    if i.get("stock_list"):
        out.append(f"stock sizes and prices: {i['stock_list']}")
    for key, label in (("density", "density"), ("metal", "metal"), ("liquid", "liquid")):
        if isinstance(d.get(key), str) and d[key]:
            out.append(f"{label}: {d[key]}")
    system = i.get("system")
    if isinstance(system, Mapping):
        where = f"the file {system['file']}" if system.get("file") else "the command line"
        out.append(f"coating system: {system.get('name') or 'one coat'}, from {where} "
                   "(film thickness, volume solids and loss as given there; they belong to the "
                   "coating's data sheet)")
    return out


def report_for(results: Union[Result, Sequence[Result]], *, title: Optional[str] = None,
               axis: Any = None, angle: Optional[float] = None, units: Optional[str] = None,
               width: int = 600, height: int = 360) -> str:
    """The report of a command's result(s): each part's section picture, the data sources.

    The one path from a command's :class:`Result` to its ``--report``: the
    tables are the result's (the JSON's numbers), each part's 2-D section is
    drawn (:func:`revolve.render.pictures.section_svg`), the sources of
    materials and data are collected from the inputs, and the title is the
    command's with the part's name. ``axis``, ``angle``, ``units`` are the
    command's options, used where the picture must read a profile file again.

    Examples
    --------
    >>> from revolve.geometry.profile import Loop, Profile
    >>> from revolve.jobs.measuring import measure
    >>> ring = Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),), name="ring")
    >>> page = report_for(measure(ring, density="7850"), width=300, height=200)
    >>> "<title>Measurement: ring</title>" in page, page.count("<svg"), "density: " in page
    (True, 1, True)
    >>> report_for([])
    Traceback (most recent call last):
    ...
    ValueError: a report needs at least one result
    """
    from revolve.render.pictures import section_svg

    results = [results] if isinstance(results, Result) else list(results)
    if not results:
        raise ValueError("a report needs at least one result")
    pictures, sources = [], []
    for r in results:
        shown = []
        for name, rev, m, u in _measured_parts(r, axis, angle, units):
            # a tall sketch: a square picture (narrower, so its text stays as large on paper)
            w, h = (max(300, round(0.75 * width)),) * 2 if _tall(rev.profile) else (width, height)
            shown.append((f"Section of {name} (the half-profile revolved about the axis)",
                          section_svg(rev, m, units=u, title=name if len(results) > 1 else None,
                                      width=w, height=h)))
        pictures.append(shown)
        sources.extend(_data_sources(r))
    if title is None:
        command = results[0].command
        head = TITLES.get(command, f"revolve {command}")
        name = results[0].inputs.get("name") or _part_name(results[0], 0)
        title = (f"{head}: {name}" if len(results) == 1 and
                 command != "coat" else head + (f", {len(results)} parts" if len(results) > 1
                                                else ""))
    return report_html(results, title=title, pictures=pictures, sources=sources,
                       summary=SUMMARIES.get(results[0].command))
