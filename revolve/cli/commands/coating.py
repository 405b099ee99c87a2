"""``revolve coat``: areas to coat by face, and the coating quantities for a batch of parts.

Options here; the work is :func:`revolve.jobs.coating.run` (the library's
:func:`revolve.estimate_coating`), the output :mod:`revolve.render.output`.
Profiles are files or folders (:func:`revolve.formats.paths.profile_paths`: a
coating-system TOML inside a folder is not a profile and is left out).

Units by the coating trade: areas m² (ft² when every drawing is in inches or
feet, or with ``--us``), paint L (US gal), films µm (mil), spreading rates in
area per paint unit. Small parts: when every part's coated area would show
below 0.01 m² (ft²), areas are in cm² (in²); paint below 0.01 L (US gal) for
every coat is in mL. ``--area-unit``, ``--volume-unit`` and ``--film-unit``
choose others. JSON (``--json``): one object with ``inputs`` and ``units``
once, the tables ``surfaces``, ``parts``, ``coats``, ``paint`` (each coat for
the batch), ``quantities`` (part × coat; what ``--csv`` writes) and
``total``, then ``notes`` and ``cautions``; with the options of what is
bought and done (``--packs``…, ``--stripe-band``/``--stripe-percent``,
``--prepare``/``--abrasive``, ``--application-rate``/``--labour-rate``) or a
system file with packs, also ``packs``, ``stripe``, ``preparation`` and
``labour`` (:mod:`revolve.jobs.packs`). Existing files are replaced only
with ``--force``.
"""

from __future__ import annotations

from typing import Any, List, Optional

import typer

from revolve.cli import options


def run_coat(profiles: List[str], *, csv_file: Optional[str], as_json: bool, force: bool,
             report: Optional[str] = None, **inputs: Any) -> int:
    """Estimate, write the CSV and the report, print; return the exit code (1: a cross-check
    disagrees)."""
    import sys

    from revolve.formats.paths import profile_paths
    from revolve.formats.files import check_target
    from revolve.jobs import coating
    from revolve.render import output

    if csv_file:
        check_target(csv_file, option="--csv", replace=force)      # before any work
    paths, left_out = profile_paths(profiles, skip=csv_file)
    options.check_report(report, force, len(paths))
    result = coating.run(paths, names=coating.CLI_NAMES, left_out=left_out, **inputs)
    files = options.report_files(report, result, axis=inputs.get("axis"),
                                 angle=inputs.get("angle"), units=inputs.get("units"))
    if csv_file:
        files[csv_file] = (output.csv_text(result, "quantities"), "--csv")
    output.write_outputs(files, force=force)
    if as_json:
        sys.stdout.write(output.json_text(result) + "\n")
    else:
        output.show(_for_screen(result))
    for name, difference in result.disagreements:
        print(f"revolve: {name}: the two surface computations disagree by {difference:.1e} "
              f"(more than {result.inputs['tolerance']:g}); do not use these figures without "
              "finding out why", file=sys.stderr)
    return 1 if result.disagreements else 0


def _for_screen(result):
    """One part: its name once (in the parts table), no table by part and coat. The packs
    table leaves out which coats each product is for (a note says so) to fit the screen."""
    from dataclasses import replace

    def narrow(t, key):
        return replace(t, fields=tuple(f for f in t.fields if f.key != key))

    tables = tuple(narrow(t, "coats") if t.key == "packs" else t for t in result.tables)
    if len(result.table("parts").rows) == 1:
        tables = tuple(narrow(t, "part") if t.key == "surfaces" else t for t in tables
                       if t.key != "quantities")
    return replace(result, tables=tables)


def register(app: typer.Typer) -> None:
    @app.command("coat")
    def coat_command(
        profiles: List[str] = typer.Argument(..., help="Profile files (.toml, x,y point lists, "
                                                       "drawings) or folders of them; one kind "
                                                       "of part each."),
        quantity: Optional[Any] = options.quantity_option(
            "How many of each part: one number for every profile, or one per profile in order "
            "(200,50,100). Default 1."),
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
                                                          "over more of the area)."),
        cut_faces: bool = typer.Option(False, "--cut-faces", help="Also coat the two flat cut "
                                                                  "faces of a revolution below "
                                                                  "360°."),
        system: Optional[str] = typer.Option(
            None, "--system", help="Coating-system file (TOML) with one \\[\\[coat]] table per coat: "
                                   "name, dft_um or dft_mils, volume_solids, loss, "
                                   "price_per_litre or price_per_us_gallon, and what it is "
                                   "bought as (packs_litres, pack_prices, mix_ratio, …); or "
                                   "\\[\\[group]] tables (name, faces, \\[\\[group.coat]]) for a "
                                   "system per face group."),
        coat_name: Optional[str] = typer.Option(None, "--coat-name", help="Name of the one coat."),
        dft: Optional[str] = typer.Option(None, "--dft", help="Dry film thickness of one coat "
                                                              "with its unit, e.g. '75 um' or "
                                                              "'3 mil'; a bare number is in the "
                                                              "film unit (µm; mil with --us)."),
        volume_solids: Optional[Any] = typer.Option(
            None, "--volume-solids", click_type=options.PERCENT, metavar="PERCENT",
            help="Volume solids of the coat, % (from the data sheet)."),
        loss: Optional[Any] = typer.Option(
            None, "--loss", click_type=options.PERCENT, metavar="PERCENT",
            help="Loss factor, %: overspray, losses on the part and waste (0 for none)."),
        price_per_litre: Optional[Any] = typer.Option(
            None, "--price-per-litre", click_type=options.MONEY, metavar="MONEY",
            help="Price of the coat per litre, e.g. '21.50 EUR'."),
        price_per_gallon: Optional[Any] = typer.Option(
            None, "--price-per-gallon", click_type=options.MONEY, metavar="MONEY",
            help="Price of the coat per US gallon, e.g. '81.40 USD'."),
        currency: Optional[str] = typer.Option(None, "--currency", help="Currency code of the "
                                                                        "prices (a label; never "
                                                                        "converted)."),
        area_unit: Optional[str] = options.unit_option("area", "area", "Area unit: m² (default), "
                                                                       "ft², cm²…"),
        paint_unit: Optional[str] = options.unit_option("volume", "volume", "Paint unit: L "
                                                                            "(default), US_gal, "
                                                                            "mL…"),
        film_unit: Optional[str] = options.unit_option("film", "length", "Film thickness unit: "
                                                                         "um (default) or mil."),
        us: bool = typer.Option(False, "--us", help="Inch-pound units whatever the drawings: "
                                                    "ft², US gal, mils."),
        axis: Optional[Any] = options.axis_option(),
        angle: Optional[float] = options.angle_option(),
        units: Optional[str] = options.units_option(),
        as_json: bool = options.json_option(),
        csv_file: Optional[str] = typer.Option(None, "--csv", help="Also write one row per part "
                                                                   "and coat to this CSV file."),
        force: bool = options.force_option(),
        report: Optional[str] = options.report_option(),
        tolerance: float = options.tolerance_option(1e-9),
        packs: Optional[str] = typer.Option(
            None, "--packs", metavar="SIZES", help="Pack sizes the one coat is sold in, each with "
            "its unit and optionally its price after @: '20 L @ 120 EUR, 5 L @ 40, 1 L @ 12'. "
            "(A system file gives packs_litres per coat.)"),
        mix_ratio: Optional[str] = typer.Option(
            None, "--mix-ratio", metavar="BASE:HARDENER", help="Two-pack product: mixing ratio "
            "by volume, e.g. '4:1' (with --hardener-packs)."),
        hardener_packs: Optional[str] = typer.Option(
            None, "--hardener-packs", metavar="SIZES", help="Hardener pack sizes, as --packs."),
        minimum_mix: Optional[str] = typer.Option(
            None, "--minimum-mix", metavar="VOLUME", help="Least mixed at a time, with its "
            "unit, e.g. '2 L'."),
        thinner: Optional[Any] = typer.Option(
            None, "--thinner", click_type=options.PERCENT, metavar="PERCENT",
            help="Thinner, % by volume of the mixed product."),
        thinner_limit: Optional[Any] = typer.Option(
            None, "--thinner-limit", click_type=options.PERCENT, metavar="PERCENT",
            help="The data sheet's most thinner, %; more is refused."),
        thinner_packs: Optional[str] = typer.Option(
            None, "--thinner-packs", metavar="SIZES", help="Thinner pack sizes, as --packs."),
        pack_rule: Optional[str] = typer.Option(
            None, "--pack-rule", metavar="RULE", help="How packs are chosen: cheapest, fewest or "
            "'least left over'. Default: cheapest when every pack has a price, else fewest."),
        prepare: Optional[List[str]] = typer.Option(
            None, "--prepare", help="Masked faces or groups that are prepared (blasted) all the "
                                    "same, as for --mask; adds the preparation table."),
        abrasive: Optional[str] = typer.Option(
            None, "--abrasive", metavar="RATE", help="Abrasive used per area prepared, with its "
            "units, e.g. '25 kg/m^2' or '5 lb/ft^2'."),
        stripe_band: Optional[Any] = typer.Option(
            None, "--stripe-band", click_type=options.LENGTH, metavar="LENGTH",
            help="Stripe coat on edges: band width with its unit, e.g. '50 mm'; edges are the "
                 "profile's corners swept round the axis."),
        stripe_percent: Optional[Any] = typer.Option(
            None, "--stripe-percent", click_type=options.PERCENT, metavar="PERCENT",
            help="Stripe coat as a percentage of the coated area instead."),
        application_rate: Optional[str] = typer.Option(
            None, "--application-rate", metavar="RATE", help="Area applied per hour for one "
            "coat, e.g. '12 m^2/h' (or time per area, '5 min/m^2')."),
        labour_rate: Optional[Any] = typer.Option(
            None, "--labour-rate", click_type=options.MONEY, metavar="MONEY",
            help="Labour cost per hour, e.g. '45 EUR' (with --application-rate)."),
    ) -> None:
        """Coating estimate: areas to coat by face, and paint per coat for a batch of parts.

        Theoretical spreading rate, m²/L = 10 × volume solids % ÷ DFT in µm.
        Practical = theoretical × (1 − loss %/100). WFT = DFT × 100 ÷ volume solids %.
        Paint to buy = area ÷ practical spreading rate, for each coat.
        Groups, by the normal pointing out of the material at each point:
        inside (towards the axis), outside (away from it), ends (square to
        the axis). A vessel's head crowns are inside on the wall profile; the
        liquid-space profile (section = "space") is the vessel's inside. Open
        chains: the inner side faces the axis.
        Units: areas m², paint L, films µm (ft², US gal, mil for inch or foot
        drawings or with --us); small parts in cm² (in²) and mL.
        """
        code = run_coat(profiles, csv_file=csv_file, as_json=as_json, force=force, report=report,
                        quantity=quantity, faces=faces, mask=mask, sides=sides,
                        cut_faces=cut_faces, system=system, coat_name=coat_name, dft=dft,
                        volume_solids=volume_solids, loss=loss, price_per_litre=price_per_litre,
                        price_per_gallon=price_per_gallon, currency=currency,
                        area_unit=area_unit, paint_unit=paint_unit, film_unit=film_unit, us=us,
                        axis=axis, angle=angle, units=units, tolerance=tolerance, packs=packs,
                        mix_ratio=mix_ratio, hardener_packs=hardener_packs,
                        minimum_mix=minimum_mix, thinner=thinner, thinner_limit=thinner_limit,
                        thinner_packs=thinner_packs, pack_rule=pack_rule, prepare=prepare,
                        abrasive=abrasive, stripe_band=stripe_band,
                        stripe_percent=stripe_percent, application_rate=application_rate,
                        labour_rate=labour_rate)
        if code:
            raise typer.Exit(code)
