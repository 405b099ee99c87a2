"""The options every command shares, and parameter types that name their option in errors.

One idea has one name in every command (the README lists them):

=====================  ==========================================================
``--axis``             ``x``, ``y`` or ``X0,Y0,DX,DY``
``--angle``            revolution angle in degrees
``--units``            the drawing's length unit, when the file does not say
``--material``         a material of the table; ``--density`` a density (bare: kg/m³)
``-q``/``--quantity``  how many parts: one number, or a list ``200,50,100``
``--tolerance``        the relative tolerance of the cross-check (never a length)
``--chord-tolerance``  the largest distance of a chord from the true surface (mesh, picture)
``--json``/``--csv``   JSON on standard output / a CSV file
``-o``/``--output``    the file written
``--force``            replace files that exist (without it a command refuses them)
``--length-unit`` …    output units: ``--length-unit``, ``--area-unit``,
                       ``--volume-unit``, ``--mass-unit``
=====================  ==========================================================

The parameter types are click types (``click_type=`` of ``typer.Option``):
a value that does not parse fails at parse time with the option's name, in
the tool's one-line error form (``revolve: error: --step: …``), exit code 2.

Examples
--------
>>> LENGTH.convert("1/8 in", None, None)
Length(value=0.125, unit='in')
>>> INT_LIST.convert("200,50,100", None, None)
[200, 50, 100]
>>> AXIS.convert("y", None, None).direction
(0.0, 1.0)
"""

from __future__ import annotations

from typing import Any, Callable

import typer
from typer._click.types import ParamType

from revolve.errors import RevolveError


class _Fail(ParamType):
    """A click type that reads its text with one of the package's parsers.

    The parser's error sentence becomes click's error, which carries the
    parameter; the command line prints it as ``--option: sentence``.
    """

    def __init__(self, name: str, parse: Callable[[str], Any]):
        self.name = name
        self._parse = parse

    def convert(self, value: Any, param, ctx) -> Any:
        if not isinstance(value, str):
            return value                      # a default, or already converted
        try:
            return self._parse(value)
        except RevolveError as e:
            self.fail(str(e), param, ctx)


def _length(text: str):
    from revolve.inputs import parse_length

    return parse_length(text)


def _length_list(text: str):
    from revolve.inputs import parse_length, parse_list

    return parse_list(text, parse_length, "length")


def _int_list(text: str):
    from revolve.inputs import parse_list

    def whole(item: str) -> int:
        if not item.isdigit() or len(item) > 9 or int(item) < 1:
            raise RevolveError(f"{item!r} is not a whole number of 1 or more")
        return int(item)

    return parse_list(text, whole, "whole number")


def _money(text: str):
    from revolve.inputs import parse_money

    return parse_money(text)


def _percent(text: str):
    from revolve.inputs import parse_percent

    return parse_percent(text)


def _axis(text: str):
    from revolve.jobs.measuring import parse_axis

    return parse_axis(text, option=None)


def _density(text: str):
    from revolve.materials import parse_density

    return parse_density(text, option=None)


def unit_type(kind: str) -> ParamType:
    """A unit of ``kind`` (``length``, ``area``, ``volume``, ``mass``…), as its display spelling."""
    def parse(text: str) -> str:
        from revolve import units

        return units.canonical(text, kind)

    return _Fail(f"{kind} unit", parse)


#: A length with its unit, fractions and feet-inches allowed (``1/8 in``, ``3' 4 1/8"``).
LENGTH = _Fail("length", _length)
#: A comma-separated list of lengths.
LENGTH_LIST = _Fail("lengths", _length_list)
#: Whole numbers of 1 or more, one or a list (``200,50,100``).
INT_LIST = _Fail("counts", _int_list)
#: An amount of money with an optional currency code.
MONEY = _Fail("money", _money)
#: A percentage from 0 to 100.
PERCENT = _Fail("percent", _percent)
#: The axis: ``x``, ``y`` or ``X0,Y0,DX,DY``.
AXIS = _Fail("axis", _axis)
#: A density: a number and a unit, or a bare number in kg/m³.
DENSITY = _Fail("density", _density)


# -- the shared options, one declaration each ------------------------------------------------

def axis_option():
    return typer.Option(None, "--axis", click_type=AXIS, metavar="AXIS",
                        help="The axis of revolution: x, y, or X0,Y0,DX,DY (a point and a "
                             "direction). Default: the file's, else x.")


def angle_option():
    return typer.Option(None, "--angle", help="Revolution angle in degrees (0 < angle ≤ 360). "
                                              "Default: the file's, else 360.")


def units_option():
    return typer.Option(None, "--units", help="The drawing's length unit when the file does not "
                                              "say (mm, cm, m, in, ft).")


def material_option():
    return typer.Option(None, "--material", help="A material of the table (see the README); "
                                                 "gives the density.")


def density_option():
    return typer.Option(None, "--density", click_type=DENSITY, metavar="DENSITY",
                        help="Density with its unit, e.g. '7850 kg/m^3' or '0.284 lb/in^3'; a "
                             "bare number is kg/m³.")


def quantity_option(help_text: str = "How many parts: one number, or one per file as a list "
                                      "(200,50,100)."):
    return typer.Option(None, "--quantity", "-q", click_type=INT_LIST, metavar="N[,N…]",
                        help=help_text)


def tolerance_option(default: float):
    return typer.Option(default, "--tolerance",
                        help="Relative tolerance the cross-check is judged by (a ratio, not a "
                             "length).")


def chord_tolerance_option():
    return typer.Option(None, "--chord-tolerance", click_type=LENGTH, metavar="LENGTH",
                        help="Largest distance of a chord or facet from the true surface, with "
                             "its unit (e.g. '0.05 mm'); a bare number is in the drawing's unit.")


def json_option():
    return typer.Option(False, "--json", help="Print one JSON object instead of tables.")


def csv_option():
    return typer.Option(None, "--csv", help="Also write the table to this CSV file.")


def output_option(help_text: str):
    return typer.Option(None, "--output", "-o", help=help_text)


def force_option():
    return typer.Option(False, "--force", help="Replace output files that exist already "
                                               "(without it, a command refuses them).")


def unit_option(role: str, kind: str, help_text: str):
    """``--{role}-unit``: an output unit of ``kind``."""
    return typer.Option(None, f"--{role}-unit", click_type=unit_type(kind), metavar="UNIT",
                        help=help_text)


def report_option():
    """``--report FILE.html``: the command's report (:func:`report_files`)."""
    return typer.Option(None, "--report", metavar="FILE.html",
                        help="Also write a report: one self-contained HTML file with the "
                             "inputs, each part's section, every table, the sources and the "
                             "cautions; prints on A4 or Letter. Many parts: a summary, then a "
                             "page per part.")


#: The most parts one report holds (a page and a picture each; bounded work).
REPORT_MOST_PARTS = 200


def check_report(path, force: bool, parts: int = 1) -> None:
    """Refuse a ``--report`` name before any work: ending .html, its folder there, the one
    overwrite rule (an existing file only with ``--force``), at most :data:`REPORT_MOST_PARTS`
    parts. None: no report.

    >>> check_report("r.html", False, parts=201)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --report: a report holds at most 200 parts, not 201; report fewer files at a time
    """
    if path is None:
        return
    if parts > REPORT_MOST_PARTS:
        raise RevolveError(f"a report holds at most {REPORT_MOST_PARTS} parts, not {parts}; "
                           "report fewer files at a time", option="--report")
    from revolve.cli.common import check_output

    check_output(path, (".html",), "reports", option="--report", force=force)


def report_files(path, results, **how: Any) -> dict:
    """``{path: (html, "--report")}`` for :func:`revolve.render.output.write_outputs` (with the
    command's other files: all or none), or ``{}`` without ``--report``. ``how``: the
    options of :func:`revolve.render.report.report_for` (axis, angle, units, title)."""
    if path is None:
        return {}
    if isinstance(results, (list, tuple)) and not results:     # every part refused
        import sys

        print(f"revolve: no part could be reported; {path} not written", file=sys.stderr)
        return {}
    from revolve.render.report import report_for

    return {path: (report_for(results, **how), "--report")}
