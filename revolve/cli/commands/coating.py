"""``revolve coat``: areas to coat by face, and the coating quantities for a batch of parts.

One or more profile files, each with a quantity; the faces to coat (all by
default, or face names and the groups ``outside``, ``inside``, ``ends``, by
the side of the material a surface faces, see :mod:`revolve.jobs.coating`;
``--mask`` leaves faces out); a coating system of one coat from options or of
several coats from a small TOML file (see :mod:`revolve.jobs.coating`).

Units, also listed under ``units`` in the JSON: areas in m² (``--area-unit``,
e.g. ft^2), paint volumes in L (``--volume-unit``, e.g. US_gal), films in µm
(``--film-unit mil``), spreading rates in area unit per volume unit, volume
solids and loss in %, prices per volume unit, costs in the currency given.
``--us`` switches the defaults to ft², US gal and mils.

JSON keys: ``area`` {``per_face``, ``total``} for the whole batch; ``parts``,
one entry per profile with its own ``area`` {``per_face``, ``total`` (one
part), ``batch`` (times its quantity)}, ``surfaces`` (every piece, counted or
not, and why) and its ``coats``; ``coats``, one entry per coat with ``dft``,
``volume_solids``, ``loss``, ``wet_film``, ``spreading_rate_theoretical``,
``spreading_rate_practical``, ``area``, ``volume`` (to buy, losses included),
``volume_theoretical``, ``price``, ``cost``; ``total``; ``notes``; ``cautions``.
"""

from __future__ import annotations

from typing import List, Optional

import typer

from revolve.cli import common
from revolve.errors import RevolveError

DEFAULT_TOLERANCE = 1e-9


# -- reading the inputs ---------------------------------------------------------------


def _quantities(values: Optional[List[int]], count: int) -> List[int]:
    values = list(values or [])
    if not values:
        values = [1]
    for q in values:
        if q < 1:
            raise RevolveError(f"the number of parts must be a whole number of at least 1, got {q}",
                               place="--quantity")
    if len(values) == 1:
        return values * count
    if len(values) != count:
        raise RevolveError(f"give --quantity once (for every profile) or once per profile, in "
                           f"order ({count} profile{'s' if count != 1 else ''}), got it "
                           f"{len(values)} times",
                           place="--quantity")
    return values


def _system(path, name, dft, volume_solids, loss, price_litre, price_gallon, currency,
            film_unit):
    from revolve.formats.files import read_text
    from revolve.jobs import coating

    single = {"--dft": dft, "--volume-solids": volume_solids, "--loss": loss,
              "--price-per-litre": price_litre, "--price-per-gallon": price_gallon,
              "--coat-name": name}
    given = [k for k, v in single.items() if v is not None]
    if path is not None:
        if given:
            raise RevolveError(f"give either --system FILE or the options of one coat, not both "
                               f"({', '.join(given)} given with --system)")
        system = coating.parse_coating_system(read_text(path), file=path)
        if currency:
            from dataclasses import replace
            system = replace(system, currency=currency)
        return system
    if dft is None and volume_solids is None and loss is None:
        raise RevolveError("no coating given: use --system FILE for a coating system, or --dft, "
                           "--volume-solids and --loss for one coat")
    where = {"dft": (None, None, "--dft"), "dft_um": (None, None, "--dft"),
             "dft_mils": (None, None, "--dft"),
             "volume_solids": (None, None, "--volume-solids"), "loss": (None, None, "--loss"),
             "price_per_litre": (None, None, "--price-per-litre"),
             "price_per_us_gallon": (None, None, "--price-per-gallon"),
             "name": (None, None, "--coat-name")}
    film = {} if dft is None else dict([coating.read_film_thickness(dft, film_unit)])
    coat = coating.make_coat(name, **film, volume_solids=volume_solids, loss=loss,
                             price_per_litre=price_litre, price_per_us_gallon=price_gallon,
                             where=where)
    return coating.CoatingSystem((coat,), None, currency or None, None)


class _Units:
    """Output units and the factors from m², L and µm."""

    def __init__(self, area: Optional[str], volume: Optional[str], film: Optional[str], us: bool):
        from revolve import units

        self.area_text = area or ("ft^2" if us else "m^2")
        self.volume_text = volume or ("US_gal" if us else "L")
        self.film_text = film or ("mil" if us else "um")
        try:
            self.area_factor = 1.0 / units.factor(self.area_text, "area")           # from m²
        except RevolveError as e:
            raise common.fail_unit("--area-unit", e)
        try:
            self.volume_factor = units.factor("L", "volume") / units.factor(self.volume_text,
                                                                            "volume")  # from L
        except RevolveError as e:
            raise common.fail_unit("--volume-unit", e)
        try:
            self.film_factor = 1e-6 / units.factor(self.film_text, "length")        # from µm
        except RevolveError as e:
            raise common.fail_unit("--film-unit", e)
        self.area = units.canonical(self.area_text)
        self.volume = units.canonical(self.volume_text)
        self.film = units.canonical(self.film_text)
        self.rate = f"{self.area}/{self.volume}"
        self.rate_factor = self.area_factor / self.volume_factor                    # from m²/L


class _Part:
    """A measured profile with its surfaces, choice and quantity."""

    def __init__(self, doc, measurement, found, quantity):
        self.doc = doc
        self.m = measurement
        self.found = found
        self.quantity = quantity
        self.chosen = ()
        self.si_area = 0.0  # profile unit² -> m²

    @property
    def name(self) -> str:
        return self.doc.name or self.doc.file


def _measure(path, axis, angle, unit, quantity):
    from revolve import units
    from revolve.geometry.measure import measure
    from revolve.jobs import coating

    doc, rev = common.revolution_from_options(path, axis, angle, unit)
    m = measure(rev)
    part = _Part(doc, m, coating.surfaces(m, space=getattr(doc, "section", "material") == "space"),
                 quantity)
    part.si_area = units.factor(doc.profile.unit, "length") ** 2
    return part


# -- the estimate as data -------------------------------------------------------------


def _money(value, currency) -> str:
    if value is None:
        return "—"
    return f"{value:,.2f}" + (f" {currency}" if currency else "")


def estimate_dict(parts, est, u: _Units, options: dict, notes: List[str], tolerance: float):
    """The JSON form of an estimate (see the module docstring)."""
    from revolve.jobs import coating

    A, V, R = u.area_factor, u.volume_factor, u.rate_factor
    currency = est.system.currency
    out = {
        "units": {"area": u.area, "volume": u.volume, "film": u.film, "spreading_rate": u.rate,
                  "volume_solids": "%", "loss": "%",
                  "price": f"{currency + ' ' if currency else ''}per {u.volume}",
                  "cost": currency or "the prices' currency"},
        "system": {"name": est.system.name, "file": est.system.file, "currency": currency,
                   "coats": len(est.system.coats), "dft_total": est.system.dft_in(u.film_text)},
        "faces": options,
    }
    batch_faces: dict = {}
    parts_out = []
    for p, pe in zip(parts, est.parts):
        faces = {k: v * p.si_area * A for k, v in coating.area_by_face(p.chosen).items()}
        for k, v in faces.items():
            batch_faces[k] = batch_faces.get(k, 0.0) + v * p.quantity
        c = p.m.crosscheck
        parts_out.append({
            "file": p.doc.file, "name": p.doc.name, "unit": p.doc.profile.unit,
            "angle_degrees": float(p.m.revolution.angle_degrees), "quantity": p.quantity,
            "area": {"per_face": faces, "total": pe.part.area_each * A,
                     "batch": pe.part.area_total * A},
            "surfaces": [{"face": ch.surface.face, "facing": ch.surface.facing,
                          "side": ch.surface.side, "area": ch.surface.area * p.si_area * A,
                          "included": ch.included, "reason": ch.reason} for ch in p.chosen],
            "surface_crosscheck": {"method": "quadrature of r ds along each segment",
                                   "surface_area": c.surface_area * p.si_area * A,
                                   "relative_difference": c.surface_difference,
                                   "tolerance": tolerance,
                                   "agrees": c.surface_difference <= tolerance},
            "coats": [{"name": q.coat.name, "volume": q.litres * V,
                       "volume_theoretical": q.litres_theoretical * V, "cost": q.cost}
                      for q in pe.coats],
            "volume": pe.litres * V, "cost": pe.cost,
        })
    out["parts"] = parts_out
    out["area"] = {"per_face": batch_faces, "total": est.area * A}
    out["coats"] = [{
        "name": q.coat.name, "dft": q.coat.dft_in(u.film_text),
        "volume_solids": q.coat.volume_solids, "loss": q.coat.loss,
        "wet_film": q.coat.wet_film_in(u.film_text),
        "spreading_rate_theoretical": q.coat.spreading_rate_theoretical * R,
        "spreading_rate_practical": q.coat.spreading_rate_practical * R,
        "area": q.area * A, "volume": q.litres * V, "volume_theoretical": q.litres_theoretical * V,
        "price": q.coat.price_in(u.volume_text),
        "cost": q.cost} for q in est.coats]
    out["total"] = {"quantity": est.quantity, "area": est.area * A, "volume": est.litres * V,
                    "cost": est.cost, "cost_complete": est.cost_complete}
    out["notes"] = list(notes)
    out["cautions"] = [common.CAUTIONS["coating"]]
    return out


def csv_text(parts, est, u: _Units) -> str:
    """One row per part and coat, then each coat for all parts, then the total."""
    import csv
    import io

    A, V, R = u.area_factor, u.volume_factor, u.rate_factor
    cur = est.system.currency
    money = f" ({cur})" if cur else ""
    header = ["part", "file", "quantity", f"area_each ({u.area})", f"area ({u.area})", "coat",
              f"dft ({u.film})", "volume_solids (%)", "loss (%)", f"wet_film ({u.film})",
              f"spreading_rate_theoretical ({u.rate})", f"spreading_rate_practical ({u.rate})",
              f"volume ({u.volume})", f"volume_theoretical ({u.volume})",
              f"price ({cur + ' ' if cur else ''}per {u.volume})", f"cost{money}"]

    def num(v):
        return "" if v is None else repr(float(v))

    def coat_cells(q):
        c = q.coat
        return [c.name, num(c.dft_in(u.film_text)), num(c.volume_solids), num(c.loss),
                num(c.wet_film_in(u.film_text)), num(c.spreading_rate_theoretical * R),
                num(c.spreading_rate_practical * R), num(q.litres * V),
                num(q.litres_theoretical * V),
                num(c.price_in(u.volume_text)), num(q.cost)]

    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(header)
    for p, pe in zip(parts, est.parts):
        for q in pe.coats:
            w.writerow([p.name, p.doc.file, p.quantity, num(pe.part.area_each * A),
                        num(pe.part.area_total * A)] + coat_cells(q))
    for q in est.coats:
        w.writerow(["all parts", "", est.quantity, "", num(est.area * A)] + coat_cells(q))
    w.writerow(["all parts", "", est.quantity, "", num(est.area * A), "all coats"]
               + [""] * 6 + [num(est.litres * V),
                             num(_fsum(q.litres_theoretical for q in est.coats) * V),
                             "", num(est.cost)])
    return buf.getvalue()


def _fsum(values) -> float:
    import math

    return float(math.fsum(values))


# -- the estimate on screen -----------------------------------------------------------


def _facing_text(s) -> str:
    if s.side:
        return f"{s.facing} ({s.side} side)"
    if s.facing == "cut":
        return "cut (both)"
    return s.facing


def _part_heading(p) -> str:
    return (f"[bold]{p.name}[/bold]  ({p.doc.file}; revolved "
            f"{float(p.m.revolution.angle_degrees):g}°; {p.quantity} part{'s' if p.quantity != 1 else ''})")


def _face_table(p, pe, u):
    from rich.table import Table

    f = common.fmt
    A = p.si_area * u.area_factor
    t = Table(show_edge=False, pad_edge=False)
    t.add_column("face")
    t.add_column("facing")
    t.add_column(f"area, one part\n{u.area}", justify="right")
    left_out = not all(ch.included for ch in p.chosen)
    if left_out:
        t.add_column("")
    for ch in p.chosen:
        s = ch.surface
        cells = [s.face, _facing_text(s), f(s.area * A, 5)]
        if left_out:
            cells.append("" if ch.included else f"not counted: {ch.reason}")
        t.add_row(*cells, style=None if ch.included else "dim")
    t.add_section()
    pad = [""] if left_out else []
    t.add_row("one part", "", f(pe.part.area_each * u.area_factor, 5), *pad, style="bold")
    if p.quantity != 1:
        t.add_row(f"× {p.quantity} parts", "", f(pe.part.area_total * u.area_factor, 5), *pad,
                  style="bold")
    return t


def _parts_table(parts, est, u):
    from rich.table import Table

    f = common.fmt
    cur = est.system.currency
    t = Table(show_edge=False, pad_edge=False)
    t.add_column("part")
    t.add_column("quantity", justify="right")
    t.add_column(f"area each\n{u.area}", justify="right")
    t.add_column(f"area\n{u.area}", justify="right")
    t.add_column(f"paint, all coats\n{u.volume}", justify="right")
    t.add_column(f"cost\n{cur or ''}".rstrip(), justify="right")
    for p, pe in zip(parts, est.parts):
        t.add_row(p.name, str(p.quantity), f(pe.part.area_each * u.area_factor, 5),
                  f(pe.part.area_total * u.area_factor, 5), f(pe.litres * u.volume_factor, 4),
                  _money(pe.cost, None))
    t.add_section()
    t.add_row("total", str(est.quantity), "", f(est.area * u.area_factor, 5),
              f(est.litres * u.volume_factor, 4), _money(est.cost, None), style="bold")
    return t


def _coats_table(est, u):
    from rich.table import Table

    f = common.fmt
    cur = est.system.currency
    t = Table(show_edge=False, pad_edge=False)
    for head in ("coat", f"DFT\n{u.film}", "volume\nsolids %", f"WFT\n{u.film}",
                 f"theoretical\n{u.rate}", "loss\n%", f"practical\n{u.rate}",
                 f"to buy\n{u.volume}", f"price\n{(cur + '/') if cur else 'per '}{u.volume}",
                 f"cost\n{cur or ''}".rstrip()):
        t.add_column(head, justify="left" if head == "coat" else "right")
    for q in est.coats:
        c = q.coat
        t.add_row(c.name, f(c.dft_in(u.film_text), 4), f(c.volume_solids, 4),
                  f(c.wet_film_in(u.film_text), 4), f(c.spreading_rate_theoretical * u.rate_factor, 4),
                  f(c.loss, 4), f(c.spreading_rate_practical * u.rate_factor, 4),
                  f(q.litres * u.volume_factor, 4),
                  "—" if c.price_per_litre is None else f"{c.price_in(u.volume_text):,.2f}",
                  _money(q.cost, None))
    t.add_section()
    t.add_row("total", f(est.system.dft_in(u.film_text), 4), "", "", "", "", "",
              f(est.litres * u.volume_factor, 4), "", _money(est.cost, None), style="bold")
    return t


# -- the command ----------------------------------------------------------------------


def run_coat(profiles: List[str], quantity: Optional[List[int]], faces: Optional[List[str]],
             mask: Optional[List[str]], sides: str, cut_faces: bool, system_file: Optional[str],
             coat_name: Optional[str], dft: Optional[str], volume_solids: Optional[float],
             loss: Optional[float], price_litre: Optional[float], price_gallon: Optional[float],
             currency: Optional[str], area_unit: Optional[str], volume_unit: Optional[str],
             film_unit: Optional[str], us: bool, axis: Optional[str], angle: Optional[float],
             unit: Optional[str], as_json: bool, csv_file: Optional[str],
             tolerance: float) -> int:
    """Work out and print the estimate; return the exit code (1: the cross-check disagrees)."""
    import sys

    from revolve.jobs import coating

    if not tolerance > 0:
        raise RevolveError("--tolerance must be a positive number")
    sides = (sides or "both").strip().lower()
    if sides not in coating.SIDES:
        raise RevolveError(f'give both, outer or inner, got "{sides}"', place="--sides")
    u = _Units(area_unit, volume_unit, film_unit, us)
    system = _system(system_file, coat_name, dft, volume_solids, loss, price_litre, price_gallon,
                     currency, u.film_text)
    counts = _quantities(quantity, len(profiles))
    parts = [_measure(path, axis, angle, unit, q) for path, q in zip(profiles, counts)]
    include, masked = coating.split_names(faces), coating.split_names(mask)
    known = [name for p in parts for name in coating.face_names(p.found)]
    single = profiles[0] if len(profiles) == 1 else None
    coating.check_names(include, known, "--faces", single)
    coating.check_names(masked, known, "--mask", single)
    notes: List[str] = []
    areas = []
    for p in parts:
        p.chosen = coating.select(p.found, include, masked, sides, cut_faces)
        each = coating.coated_area(p.chosen) * p.si_area
        by_face = tuple((k, v * p.si_area) for k, v in coating.area_by_face(p.chosen).items())
        areas.append(coating.PartArea(p.name, each, p.quantity, by_face))
        if any(ch.surface.kind == "chain" for ch in p.chosen):
            counted = {"both": "both sides counted", "outer": "one side counted (outer)",
                       "inner": "one side counted (inner)"}[sides]
            notes.append(f"{p.name}: an open chain is a sheet with two sides of equal area; "
                         f"{counted} (--sides)")
        if any(ch.surface.kind == "cut" and not ch.included for ch in p.chosen) and not cut_faces:
            notes.append(f"{p.name}: the flat cut faces of the {float(p.m.revolution.angle_degrees):g}° "
                         "revolution are not counted; add --cut-faces to coat them")
        if cut_faces and p.m.revolution.full:
            notes.append(f"{p.name}: a full revolution has no cut faces")
        if each == 0:
            notes.append(f"{p.name}: none of the faces chosen has any area on this part")
    if not any(a.area_each > 0 for a in areas):
        raise coating.CoatingError("nothing to coat: the faces chosen have no area on any part; "
                                   "check --faces, --mask and --sides", file=single,
                                   place="--faces" if include else "--mask")
    est = coating.estimate(system, areas)
    if not est.cost_complete and est.cost is not None:
        missing = ", ".join(c.name for c in system.coats if c.price_per_litre is None)
        notes.append(f"the cost leaves out the coats without a price: {missing}")
    options = {"include": list(include) or ["all"], "mask": list(masked), "sides": sides,
               "cut_faces": cut_faces}
    csv_out = csv_text(parts, est, u) if csv_file else None
    bad = [p for p in parts if not p.m.crosscheck.surface_difference <= tolerance]
    if csv_out is not None:  # before any output, so a failed write leaves nothing half done
        from revolve.formats.files import write_text_atomically

        write_text_atomically(csv_file, csv_out, option="--csv")
    if as_json:
        common.print_json(estimate_dict(parts, est, u, options, notes, tolerance))
    else:
        _print_estimate(parts, est, u, notes, options)
    if bad:
        for p in bad:
            print(f"revolve: {p.doc.file}: the two surface computations disagree by "
                  f"{p.m.crosscheck.surface_difference:.1e} (more than {tolerance:g}); do not "
                  "use these figures without finding out why", file=sys.stderr)
        return 1
    return 0


def _print_estimate(parts, est, u, notes, options):
    con = common.console()
    f = common.fmt
    n = est.quantity
    kinds = len(parts)
    chosen = ", ".join(options["include"])
    if options["mask"]:
        chosen += "; masked: " + ", ".join(options["mask"])
    con.print(f"[bold]Coating estimate[/bold]: {n} part{'s' if n != 1 else ''}"
              + (f" of {kinds} kinds" if kinds > 1 else "")
              + f"; faces: {chosen}; total {f(est.area * u.area_factor, 5)} {u.area}, "
                f"{f(est.litres * u.volume_factor, 4)} {u.volume} of paint"
              + (f", {_money(est.cost, est.system.currency)}" if est.cost is not None else ""))
    for p, pe in zip(parts, est.parts):
        con.print()
        con.print(_part_heading(p))
        con.print(_face_table(p, pe, u))
    if kinds > 1:
        con.print()
        con.print("[bold]Parts[/bold]")
        con.print(_parts_table(parts, est, u))
    con.print()
    name = est.system.name or "one coat, from the options"
    where = f" ({est.system.file})" if est.system.file else ""
    con.print(f"[bold]Coats[/bold]: {name}{where}; each coat over "
              f"{f(est.area * u.area_factor, 5)} {u.area}")
    con.print(_coats_table(est, u))
    con.print("to buy = area ÷ practical spreading rate; practical = theoretical × (1 − loss %/100); "
              "theoretical = 10 × volume solids % ÷ DFT in m²/L with DFT in µm"
              + (" (= 1604.17 × volume solids %/100 ÷ DFT in ft²/US gal with DFT in mils)"
                 if u.volume == "US gal" else "")
              + "; WFT = DFT × 100 ÷ volume solids %")
    for note in notes:
        con.print(f"note: {note}")
    con.print(common.caution_panel(["coating"]))


def register(app: typer.Typer) -> None:
    @app.command("coat")
    def coat_command(
        profiles: List[str] = typer.Argument(..., help="One or more profile files (.toml, or x,y "
                                                       "point lists); one kind of part each."),
        quantity: Optional[List[int]] = typer.Option(
            None, "--quantity", "-n", help="Number of parts: once for every profile, or once per "
                                           "profile in the same order. Default 1."),
        faces: Optional[List[str]] = typer.Option(
            None, "--faces", help="Faces to coat, comma-separated or repeated: face names of the "
                                  "profile, or the groups inside (the normal out of the material "
                                  "points towards the axis), outside (away from it), ends "
                                  "(square to the axis), or all. A face name wins over a group "
                                  "of the same spelling. Default all."),
        mask: Optional[List[str]] = typer.Option(
            None, "--mask", help="Faces or groups to leave uncoated (masked), as for --faces."),
        sides: str = typer.Option("both", "--sides", help="Open chains (sheets, shells): count "
                                                          "both sides, or only the outer or the "
                                                          "inner one (the side facing the axis "
                                                          "over more of the area). Both have "
                                                          "the same area."),
        cut_faces: bool = typer.Option(False, "--cut-faces", help="Also coat the two flat cut "
                                                                  "faces of a revolution below "
                                                                  "360°."),
        system_file: Optional[str] = typer.Option(
            None, "--system", help="Coating-system file (TOML) with one \\[\\[coat]] table per coat: "
                                   "name, dft_um or dft_mils, volume_solids, loss, "
                                   "price_per_litre or price_per_us_gallon."),
        coat_name: Optional[str] = typer.Option(None, "--coat-name", help="Name of the one coat."),
        dft: Optional[str] = typer.Option(None, "--dft", help="Dry film thickness of one coat, "
                                                              "e.g. 75 (in the film unit: µm, or "
                                                              "mils with --us), '75 um', '3 mil'."),
        volume_solids: Optional[float] = typer.Option(None, "--volume-solids",
                                                      help="Volume solids of the coat, % (from "
                                                           "the data sheet)."),
        loss: Optional[float] = typer.Option(None, "--loss", help="Loss factor, %: overspray, "
                                                                  "losses on the part and waste "
                                                                  "(0 for none)."),
        price_litre: Optional[float] = typer.Option(None, "--price-per-litre",
                                                    help="Price of the coat per litre."),
        price_gallon: Optional[float] = typer.Option(None, "--price-per-gallon",
                                                     help="Price of the coat per US gallon."),
        currency: Optional[str] = typer.Option(None, "--currency", help="Currency label for "
                                                                        "prices and costs."),
        area_unit: Optional[str] = typer.Option(None, "--area-unit", help="Area unit: m^2 "
                                                                          "(default), ft^2, ..."),
        volume_unit: Optional[str] = typer.Option(None, "--volume-unit",
                                                  help="Paint volume unit: L (default), US_gal."),
        film_unit: Optional[str] = typer.Option(None, "--film-unit", help="Film thickness unit: "
                                                                          "um (default) or mil."),
        us: bool = typer.Option(False, "--us", help="US units by default: ft², US gal, mils."),
        axis: Optional[str] = typer.Option(None, "--axis", help="x, y, or X0,Y0,DX,DY for every "
                                                                "profile. Default: each file's "
                                                                "axis, else x."),
        angle: Optional[float] = typer.Option(None, "--angle", help="Revolution angle in degrees "
                                                                     "for every profile."),
        units: Optional[str] = typer.Option(None, "--units", help="Length unit of plain point "
                                                                  "lists. Default mm."),
        as_json: bool = typer.Option(False, "--json", help="Print JSON instead of tables."),
        csv_file: Optional[str] = typer.Option(None, "--csv", help="Also write one row per part "
                                                                   "and coat, and totals, to "
                                                                   "this CSV file."),
        tolerance: float = typer.Option(DEFAULT_TOLERANCE, "--tolerance",
                                        help="Largest relative difference allowed between the "
                                             "two surface computations before the exit code "
                                             "is 1."),
    ) -> None:
        """Coating estimate: areas to coat by face, and paint per coat for a batch of parts.

        Theoretical spreading rate, m²/L = 10 × volume solids % ÷ DFT in µm.
        Practical = theoretical × (1 − loss %/100). WFT = DFT × 100 ÷ volume solids %.
        Paint to buy = area ÷ practical spreading rate, for each coat.
        Groups, by the normal pointing out of the material at each point:
        inside (towards the axis), outside (away from it), ends (parallel to
        the axis: faces square to it). A vessel's head crowns are inside on
        the wall profile; the liquid-space profile (section = "space") is the
        vessel's inside. Open chains: the inner side faces the axis.
        Units: areas m², paint L, films µm, rates m²/L; --us gives ft², US gal, mils.
        JSON: area (per_face, total); parts; coats, each with dft, wet_film,
        spreading_rate_theoretical, spreading_rate_practical, volume and cost;
        total; units (the unit of every figure); notes; cautions.
        """
        code = run_coat(profiles, quantity, faces, mask, sides, cut_faces, system_file,
                        coat_name, dft, volume_solids, loss, price_litre, price_gallon, currency,
                        area_unit, volume_unit, film_unit, us, axis, angle, units, as_json,
                        csv_file, tolerance)
        if code:
            raise typer.Exit(code)
