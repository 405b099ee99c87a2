"""``revolve turn``: stock, material removed, times and a costed quote for turned parts.

The options, the call to :mod:`revolve.jobs.turning_quote` and the renderer;
the work (reading options, measuring once, quoting) is the job's, shared with
:func:`revolve.quote_turning`. One file prints the quote's tables (or its
JSON object); several files or a folder print one plain row per part and the
batch total (or one JSON object with the parts in a list). ``--csv`` writes
one row per part, each column with its unit; files are written under the one
overwrite rule (``--force``).
"""

from __future__ import annotations

import math
import os
import sys
from dataclasses import replace
from typing import Any, List, Optional

import typer

from revolve.cli import options

#: Columns of the plain many-parts table (keys of the job's rows) and their short headings.
ROW_COLUMNS = {"material": "material", "part_diameter": "⌀", "part_length": "length",
               "stock_label": "stock", "stock_length": "stock length", "part_mass": "part",
               "stock_mass": "stock", "utilisation_percent": "used", "quantity": "qty",
               "bars_needed": "bars", "cycle_time": "cycle", "cost_per_part": "cost",
               "price_per_part": "price", "batch_cost": "batch cost"}


def _rows_text(result, one_qty: bool) -> str:
    """One row per part as plain aligned text (cheap for thousands of parts), and the total."""
    from revolve.cli.rows import plain_table
    from revolve.render.numbers import money
    from revolve.render.output import cell

    table = result.table("parts")
    fields = {f.key: f for f in table.fields}
    cols = [k for k in ROW_COLUMNS if not (one_qty and k == "quantity")]
    u = result.units
    heads = ["part"]
    for k in cols:
        f = fields[k]
        unit = "%" if f.style == "percent" else u.unit(f.role)
        heads.append(ROW_COLUMNS[k] + (f", {unit}" if unit else ""))
    cells, costs = [], []
    for row in table.rows:
        stem = os.path.splitext(os.path.basename(row["file"]))[0]
        if row.get("error"):
            cells.append([stem, f"error: {row['error']}"])
            continue
        cells.append([stem] + [cell(u.show(row.get(k), fields[k].role), fields[k]).replace(" %", "")
                               for k in cols])
        if row.get("batch_cost") is not None:
            costs.append(row["batch_cost"])
    if costs:
        cells.append(["total"] + [""] * (len(cols) - 1) + [money(math.fsum(costs))])
    title = table.title
    quantities = result.inputs["quantity"]
    if one_qty:
        title += f", {quantities[0]} of each"
    right = [k for k, c in enumerate(cols, 1) if fields[c].style != "text"]
    return plain_table(heads, cells, right=right, title=title)


def run_turn(profiles: List[str], *, csv_file: Optional[str] = None, as_json: bool = False,
             force: bool = False, quantity: Any = None, workers: Optional[int] = None,
             serial_below: Optional[int] = None, report: Optional[str] = None,
             **settings: Any) -> int:
    """Quote every profile; print tables or JSON, write the CSV; the exit code.

    Exit codes: 0 done, 1 a cross-check disagrees, 2 a file or option refused
    (a refused file keeps its row in a batch; the other parts are quoted).
    """
    from revolve.formats.paths import profile_paths
    from revolve.cli.rows import progress_bar
    from revolve.formats.files import check_target
    from revolve.jobs import turning_quote as tq
    from revolve.render import output

    opts = tq._options(settings.pop("material", None), settings.pop("bar_list", None),
                       settings.pop("stock", "bar"), settings)
    if csv_file is not None:
        check_target(csv_file, "--csv", replace=force)
    paths, left_out = profile_paths(profiles, skip=csv_file)
    options.check_report(report, force, len(paths))
    how = {"axis": opts.axis, "units": opts.units}        # the report's pictures read the files
    left = [f"left out {o}: not a profile (no [[loop]] or [[chain]])" for o in left_out]
    counts = tq.quantities(quantity, len(paths))
    if len(profiles) == 1 and len(paths) == 1 and not os.path.isdir(profiles[0]):
        r = tq.quote_with(paths[0], opts, counts[0])
        files = {} if csv_file is None else {csv_file: (output.csv_text(
            tq.parts_result([tq.row_of(r.part)], r.part.system, opts)), "--csv")}
        output.write_outputs({**files, **options.report_files(report, r, **how)}, force=force)
        if as_json:
            print(output.json_text(r))
        else:
            print(r.heading)
            output.show(r)
            for line in left + ([f"wrote {csv_file}"] if csv_file else []):
                print(line)
        return _warn([(r.part.file, r.agrees, r.speed_limited, r.quote.times.speed_limit)],
                     opts.tolerance, 0)
    with progress_bar(len(paths), "quoting") as advance:
        b = tq.quote_many_with(paths, opts, counts, workers=workers, serial_below=serial_below,
                               progress=advance)
    files = {} if csv_file is None else {csv_file: (output.csv_text(b, "parts"), "--csv")}
    each = replace(opts, bar_list=b.inputs["bar_list"])      # one page per part quoted, as b
    files.update(options.report_files(report, [tq.quote_with(f, each, n) for f, n, o in zip(
        paths, counts, b.outcomes) if o.error is None] if report else [], **how))
    output.write_outputs(files, force=force)
    if as_json:
        print(output.json_text(b))
    else:
        text = [_rows_text(b, len(set(counts)) == 1), ""]
        text += [f"note: {n}" for n in b.notes] + left
        text += [f"wrote {csv_file}"] if csv_file else []
        sys.stdout.write("\n".join(text) + "\n")
        output.show(type(b)("turn", b.units, {}, (), (), b.cautions))
    for f, error in b.failed:
        print(f"revolve: error: {error}", file=sys.stderr)
    limit = [o.row.get("speed_limit_rpm") if o.row else None for o in b.outcomes]
    return _warn([(f, o.agrees, o.speed_limited, lim and lim / 60) for f, o, lim in
                  zip(b.files, b.outcomes, limit)], opts.tolerance, 2 if b.failed else 0)


def _warn(parts, tolerance: float, code: int) -> int:
    for file, _, limited, limit in parts:
        if limited:
            print(f"revolve: {file}: the spindle speed needed is over the machine limit "
                  f"({limit * 60:.0f} rev/min); check the machine's limit for this stock's "
                  f"size and balance", file=sys.stderr)
    bad = [file for file, agrees, _, _ in parts if not agrees]
    if bad:
        print(f"revolve: the two computations disagree by more than {tolerance:g} (relative) for "
              f"{', '.join(bad)}; do not use these figures without finding out why",
              file=sys.stderr)
    return code or (1 if bad else 0)


def _length(name: str, help_text: str):
    return typer.Option(None, name, click_type=options.LENGTH, metavar="LENGTH", help=help_text
                        + " A bare number is in the bar list's unit (mm or in); '1/8 in' works.")


def register(app: typer.Typer) -> None:
    @app.command("turn")
    def turn_command(
        profiles: List[str] = typer.Argument(..., help="Profile files, or folders of them."),
        material: Optional[str] = typer.Option(None, "--material", help="Material of the table "
                                               "(default: the file's); sets the density and the "
                                               "cutting data."),
        bar_list: Optional[str] = typer.Option(None, "--bar-list", help="metric or inch stock "
                                               "list. Default: inch for inch profiles."),
        stock: str = typer.Option("bar", "--stock", help="bar, tube (hollow bar suiting the "
                                  "bore), or lighter (whichever weighs less)."),
        blank: Optional[str] = typer.Option(None, "--blank", help="Your own blank: OD or OD x ID, "
                                            "e.g. 60, 60x30 or '2 x 1 in'."),
        blank_length: Optional[Any] = _length("--blank-length", "Length of the blank."),
        turning_allowance: Optional[Any] = _length("--turning-allowance", "Added to the largest "
                                                   "diameter. Default 2 mm / 1/16 in."),
        bore_allowance: Optional[Any] = _length("--bore-allowance", "Taken off the smallest bore "
                                                "for a tube. Default 2 mm / 1/16 in."),
        facing_allowance: Optional[Any] = _length("--facing-allowance", "Faced off each end. "
                                                  "Default 1 mm / 1/32 in."),
        parting_width: Optional[Any] = _length("--parting-width", "Parting tool or saw width. "
                                               "Default 3 mm / 1/8 in."),
        holding_length: Optional[Any] = _length("--holding-length", "Grip length per part. "
                                                "Default 0."),
        bar_length: Optional[Any] = _length("--bar-length", "Bar length. Default 3000 mm / "
                                            "144 in."),
        remnant: Optional[Any] = _length("--remnant", "Left at the end of each bar. Default "
                                         "100 mm / 4 in."),
        quantity: Optional[Any] = options.quantity_option(),
        stock_price: Optional[str] = typer.Option(None, "--stock-price", help="Price of stock per "
                                                  "kg, lb, m or ft, e.g. 2.40/kg or '5.10 EUR/m'."),
        machine_rate: Optional[str] = typer.Option(None, "--machine-rate", help="Machine rate per "
                                                   "hour, e.g. 85 or 85/h."),
        setup_time: Optional[str] = typer.Option(None, "--setup-time", help="Set-up time for the "
                                                 "batch, e.g. 45 (minutes) or 1.5 h."),
        handling_time: Optional[str] = typer.Option(None, "--handling-time", help="Loading, "
                                                    "parting, gauging per part, e.g. 30 s."),
        whole_bars: bool = typer.Option(False, "--whole-bars", help="Charge every bar the batch "
                                        "needs in full."),
        roughing: Optional[str] = typer.Option(None, "--roughing", help="Roughing data, e.g. "
                                               "vc=220,f=0.3,ap=3 (m/min, mm/rev, mm; inch list: "
                                               "sfm, in/rev, in)."),
        finishing: Optional[str] = typer.Option(None, "--finishing", help="Finishing data, e.g. "
                                                "vc=280,f=0.1."),
        drilling: Optional[str] = typer.Option(None, "--drilling", help="Drilling data, e.g. "
                                               "vc=25,f=0.15 (inch list: sfm, in/rev)."),
        max_speed: Optional[str] = typer.Option(None, "--max-speed", help="The machine's spindle "
                                                "speed limit, rev/min; the times use it."),
        grooves: Optional[str] = typer.Option(None, "--grooves", help="Grooves the profile does "
                                              "not show: N x WIDTH x DEPTH, e.g. '2 x 3 x 1.5', "
                                              "cut at the largest diameter."),
        blind_bore: Optional[str] = typer.Option(None, "--blind-bore", help="A blind bore the "
                                                 "profile does not show: DIAMETER x DEPTH from "
                                                 "the faced end, e.g. '12 x 20'."),
        scrap: Optional[float] = typer.Option(None, "--scrap", click_type=options.PERCENT,
                                              help="Scrap allowance, e.g. 3%: more parts "
                                              "started, more bars."),
        overhead: Optional[float] = typer.Option(None, "--overhead", click_type=options.PERCENT,
                                                 help="Overhead on the cost, e.g. 15%."),
        margin: Optional[float] = typer.Option(None, "--margin", click_type=options.PERCENT,
                                               help="Margin as a share of the price (below 100 "
                                               "%), e.g. 20%."),
        stock_list: Optional[str] = typer.Option(None, "--stock-list", help="The shop's stock "
                                                 "list (CSV: shape, size, grade, price, length); "
                                                 "replaces the built-in sizes and gives the price."),
        grade: Optional[str] = typer.Option(None, "--grade", help="The grade to take from "
                                            "--stock-list."),
        no_finish: Optional[List[str]] = typer.Option(None, "--no-finish", help="A face left as "
                                                      "roughed or parted. Repeat for more."),
        currency: Optional[str] = typer.Option(None, "--currency", help="Currency, e.g. EUR."),
        axis: Optional[Any] = options.axis_option(),
        units: Optional[str] = options.units_option(),
        as_json: bool = options.json_option(),
        csv_file: Optional[str] = typer.Option(None, "--csv", help="Also write one row per part "
                                               "to this CSV file (units in the headings)."),
        force: bool = options.force_option(),
        report: Optional[str] = options.report_option(),
        tolerance: float = options.tolerance_option(1e-9),
        workers: Optional[int] = typer.Option(None, "--workers", help="Processes for many parts: "
                                              "default one per core (from 32 parts on)."),
    ) -> None:
        """Quote turned parts: stock, material removed, bars, times and cost."""
        code = run_turn(profiles, material=material, axis=axis, units=units, bar_list=bar_list,
                        stock=stock, blank=blank, blank_length=blank_length,
                        turning_allowance=turning_allowance, bore_allowance=bore_allowance,
                        facing_allowance=facing_allowance, parting_width=parting_width,
                        holding_length=holding_length, bar_length=bar_length, remnant=remnant,
                        quantity=quantity, stock_price=stock_price, machine_rate=machine_rate,
                        setup_time=setup_time, handling_time=handling_time,
                        whole_bars=whole_bars, roughing=roughing, finishing=finishing,
                        max_speed=max_speed, no_finish=tuple(no_finish or ()),
                        drilling=drilling, grooves=grooves, blind_bore=blind_bore, scrap=scrap,
                        overhead=overhead, margin=margin, stock_list=stock_list, grade=grade,
                        currency=currency, as_json=as_json, csv_file=csv_file, force=force,
                        tolerance=tolerance, workers=workers, report=report)
        if code:
            raise typer.Exit(code)
