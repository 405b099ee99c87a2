"""A shop's own stock list: the bars and tubes on its rack, with prices, from a CSV file.

One row per stock item on one line, with a header row naming the columns (any order,
any case)::

    shape,size,grade,price,length
    round,50 mm,S355,12.40 EUR/m,3 m
    tube,50 x 32 mm,S355,8.20 EUR/kg,6 m
    round,1 1/2 in,12L14,9.75 USD per ft,12 ft

* ``shape``: ``round``, ``tube``, ``hex`` or ``square`` (hex and square by
  their size across flats);
* ``size``: a length with its unit; a tube is ``outside x inside`` (``x`` or
  ``×``) with one unit at the end or one on each;
* ``grade``: the material grade as the shop writes it;
* ``price``: an amount, an optional three-letter currency, and ``/`` or
  ``per`` with a length unit (price per length) or a mass unit (price per
  mass);
* ``length``: the length on the rack, with its unit.

Optional columns ``supplier`` and ``note`` are kept as text; any other column
is refused. Blank lines and lines starting with ``#`` are skipped. Units are
never guessed: a number without its unit is refused. Every number is
converted to SI once here (metres; money per metre or per kg). A bad row is
refused with the file, its line and the column, in one line.

Examples
--------
>>> text = "shape,size,grade,price,length\\nround,50 mm,S355,12.40 EUR/m,3 m\\n" \\
...        "tube,50 x 32 mm,S355,8.20 EUR/kg,6 m\\n"
>>> items = parse_stock_list(text, file="rack.csv")
>>> [(i.shape, i.outside_diameter, i.inside_diameter, i.price, i.price_basis) for i in items]
[('round', 0.05, 0.0, 12.4, 'm'), ('tube', 0.05, 0.032, 8.2, 'kg')]
>>> items[0].line, items[0].currency, items[0].rack_length
(2, 'EUR', 3.0)
"""

from __future__ import annotations

import csv
import io
import math
import re
from dataclasses import dataclass
from typing import Dict, List, Optional, Tuple

from revolve.errors import FormatError, RevolveError, quoted

SHAPES = ("round", "tube", "hex", "square")
REQUIRED = ("shape", "size", "grade", "price", "length")
OPTIONAL = ("supplier", "note")
#: Bounds on what is read: file size, rows, characters in one cell.
MAX_BYTES = 2_000_000
MAX_ROWS = 20_000
MAX_CELL = 200

_PRICE = re.compile(r"\s*(?:(?P<before>[A-Za-z]{3})\s*)?(?P<amount>[0-9]+(?:\.[0-9]*)?|\.[0-9]+)"
                    r"\s*(?P<after>[A-Za-z]{3})?\s*(?:/|\bper\b)\s*(?P<unit>\S.*?)\s*\Z")
_TUBE = re.compile(r"\s*(?P<od>[^x×]+?)\s*[x×]\s*(?P<id>[^x×]+?)\s*\Z")


@dataclass(frozen=True)
class StockItem:
    """One row of a stock list, in SI: metres, and money per metre or per kg.

    ``price_basis`` is ``"m"`` (``price`` per metre) or ``"kg"`` (per
    kilogram); ``line`` is the row's line in its file.

    Examples
    --------
    >>> bar = StockItem("round", 0.05, 0.0, "S355", 12.4, "m", "EUR", 3.0)
    >>> round(bar.price_for(length=0.5, mass=7.7), 9)          # 0.5 m at 12.40 a metre
    6.2
    >>> StockItem("tube", 0.05, 0.032, "S355", 8.2, "kg", None, 6.0).price_for(0.5, 2.0)
    16.4
    """

    shape: str
    outside_diameter: float
    inside_diameter: float
    grade: str
    price: float
    price_basis: str
    currency: Optional[str]
    rack_length: float
    line: Optional[int] = None
    file: Optional[str] = None
    size_text: str = ""
    supplier: str = ""
    note: str = ""

    def price_for(self, length: float, mass: float) -> float:
        """Money for a piece of ``length`` metres weighing ``mass`` kg."""
        return self.price * (length if self.price_basis == "m" else mass)


def _unit_kind(unit: str) -> Optional[str]:
    from revolve import units

    for kind in ("length", "mass"):
        try:
            units.factor(unit, kind)
        except RevolveError:
            continue
        return kind
    return None


def _length(text: str, what: str, fail, *, unit: Optional[str] = None) -> Tuple[float, str]:
    """A length cell in metres and its unit; ``unit`` is used when the text has none."""
    from revolve import units
    from revolve.inputs import parse_length

    try:
        value = parse_length(text)
    except RevolveError as err:
        raise fail(f"{what} {quoted(text)} is not a length: {err.message}")
    u = value.unit or unit
    if u is None:
        raise fail(f"{what} {quoted(text)} has no unit; write it with its unit, such as "
                   f"'{'3 m' if what == 'length' else '50 mm'}'")
    metres = value.value * units.factor(u, "length")
    if not (math.isfinite(metres) and metres > 0):
        raise fail(f"{what} {quoted(text)} must be a positive length")
    return metres, u


def parse_stock_list(text: str, file: Optional[str] = None) -> Tuple[StockItem, ...]:
    """Read a stock list from CSV text (see the module's description).

    Parameters
    ----------
    text : str
        The file's text.
    file : str, optional
        The file's name, for messages.

    Returns
    -------
    tuple of StockItem
        In the file's order.

    Raises
    ------
    FormatError
        One line naming the file, the line and the column: a missing or
        unknown column, a shape not in :data:`SHAPES`, a number without its
        unit, a price per something that is neither a length nor a mass, a
        tube whose bore is not smaller than its outside, a second currency, a
        row given twice, or more than :data:`MAX_ROWS` rows.

    Examples
    --------
    >>> parse_stock_list("shape,size,grade,price,length\\nround,50,S355,12 EUR/m,3 m\\n", "r.csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: r.csv:2: column 'size': size '50' has no unit; write it with its unit, such as '50 mm'
    >>> parse_stock_list("shape,size,grade,price\\n", "r.csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: r.csv:1: the header has no column 'length'; the columns are shape, size, grade, price, length (and optionally supplier, note)
    >>> parse_stock_list("", "r.csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: r.csv:1: the stock list is empty; it needs a header row: shape, size, grade, price, length
    >>> parse_stock_list("shape,size,grade,price,length\\n# nothing yet\\n")
    ()
    """
    if len(text) > MAX_BYTES:
        raise FormatError(f"the stock list is larger than {MAX_BYTES} characters", file=file)
    rows = _rows(text, file)
    header = next(rows, None)
    if header is None:
        raise FormatError("the stock list is empty; it needs a header row: "
                          f"{', '.join(REQUIRED)}", file=file, line=1)
    head_line, names = header
    columns: Dict[str, int] = {}
    for k, name in enumerate(names):
        key = name.strip().lower()
        if key not in REQUIRED + OPTIONAL:
            raise FormatError(f"unknown column {quoted(name.strip())}; the columns are "
                              f"{', '.join(REQUIRED)} (and optionally {', '.join(OPTIONAL)})",
                              file=file, line=head_line, place=f"column {k + 1}")
        if key in columns:
            raise FormatError(f"the column {quoted(key)} is given twice", file=file,
                              line=head_line)
        columns[key] = k
    for key in REQUIRED:
        if key not in columns:
            raise FormatError(f"the header has no column {quoted(key)}; the columns are "
                              f"{', '.join(REQUIRED)} (and optionally {', '.join(OPTIONAL)})",
                              file=file, line=head_line)
    items: List[StockItem] = []
    seen: Dict[tuple, int] = {}
    currency: Optional[Tuple[str, int]] = None
    for line, cells in rows:
        if len(items) >= MAX_ROWS:
            raise FormatError(f"the stock list has more than {MAX_ROWS} rows", file=file,
                              line=line)
        if len(cells) != len(names):
            raise FormatError(f"the row has {len(cells)} cells; the header has {len(names)}",
                              file=file, line=line)
        cell = {key: cells[k].strip() for key, k in columns.items()}
        item = _item(cell, file, line)
        if item.currency is not None:
            if currency is not None and currency[0] != item.currency:
                raise FormatError(f"the price is in {item.currency}, but line {currency[1]} is in "
                                  f"{currency[0]}; use one currency in a stock list", file=file,
                                  line=line, place="column 'price'")
            currency = currency or (item.currency, line)
        key = (item.shape, round(item.outside_diameter, 9), round(item.inside_diameter, 9),
               item.grade.lower())
        if key in seen:
            raise FormatError(f"this {item.shape} {item.size_text} {item.grade} is already on "
                              f"line {seen[key]}", file=file, line=line)
        seen[key] = line
        items.append(item)
    return tuple(items)


def _rows(text: str, file: Optional[str] = None):
    """(line number, cells) of every row that is not blank or a comment."""
    if text.startswith("\ufeff"):
        text = text[1:]
    lines = text.splitlines()
    for number, raw in enumerate(lines, 1):
        if not raw.strip() or raw.lstrip().startswith("#"):
            continue
        if "\x00" in raw:
            raise FormatError("the line holds a NUL character; is this a CSV file?",
                              file=file, line=number)
        try:
            cells = next(csv.reader(io.StringIO(raw), strict=True))
        except csv.Error as err:
            raise FormatError(f"the line is not CSV: {err}", file=file, line=number)
        yield number, cells


def _item(cell: Dict[str, str], file: Optional[str], line: int) -> StockItem:
    from revolve import units

    def fail_in(column: str):
        return lambda message: FormatError(message, file=file, line=line,
                                           place=f"column {quoted(column)}")

    for key, value in cell.items():
        if len(value) > MAX_CELL:
            raise fail_in(key)(f"the cell has {len(value)} characters, more than {MAX_CELL}")
    shape = cell["shape"].lower()
    if shape not in SHAPES:
        raise fail_in("shape")(f"unknown shape {quoted(cell['shape'])}; use one of "
                               f"{', '.join(SHAPES)}")
    size = cell["size"]
    fail = fail_in("size")
    if shape == "tube":
        m = _TUBE.fullmatch(size)
        if m is None:
            raise fail(f"a tube's size {quoted(size)} is its outside x inside diameter, such as "
                       f"'50 x 32 mm'")
        inside, unit = _length(m.group("id"), "the inside diameter", fail)
        outside, _ = _length(m.group("od"), "the outside diameter", fail, unit=unit)
        if inside >= outside:
            raise fail(f"the inside diameter of {quoted(size)} must be smaller than the outside")
    else:
        if _TUBE.fullmatch(size):
            raise fail(f"a {shape} has one size, not {quoted(size)}")
        outside, _ = _length(size, "size", fail)
        inside = 0.0
    grade = cell["grade"]
    if not grade:
        raise fail_in("grade")("the grade is empty; write the material grade")
    fail = fail_in("price")
    m = _PRICE.fullmatch(cell["price"])
    if m is None or (m.group("before") and m.group("after")):
        raise fail(f"{quoted(cell['price'])} is not a price; write an amount, a currency and "
                   f"what it is per, such as '12.40 EUR/m' or '3.10 per kg'")
    unit = m.group("unit")
    kind = _unit_kind(unit)
    if kind is None:
        raise fail(f"a price per {quoted(unit)}: the price must be per a length (m, ft) or a "
                   f"mass (kg, lb)")
    amount = float(m.group("amount"))
    price = amount / units.factor(unit, kind)
    if not math.isfinite(price):
        raise fail(f"{quoted(cell['price'])} is too large")
    code = m.group("before") or m.group("after")
    rack, _ = _length(cell["length"], "length", fail_in("length"))
    return StockItem(shape, outside, inside, grade, price, "m" if kind == "length" else "kg",
                     code.upper() if code else None, rack, line, file, size,
                     cell.get("supplier", ""), cell.get("note", ""))


def read_stock_list(path: str) -> Tuple[StockItem, ...]:
    """Read a stock list file (UTF-8 CSV; see :func:`parse_stock_list`).

    Examples
    --------
    >>> read_stock_list("/nonexistent/rack.csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: /nonexistent/rack.csv: cannot read the stock list: No such file or directory
    """
    try:
        with open(path, "rb") as handle:
            data = handle.read(MAX_BYTES + 1)
    except OSError as err:
        raise FormatError(f"cannot read the stock list: {err.strerror or err}", file=path)
    if len(data) > MAX_BYTES:
        raise FormatError(f"the stock list is larger than {MAX_BYTES} bytes", file=path)
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError as err:
        line = data[:err.start].count(b"\n") + 1
        raise FormatError("the stock list is not UTF-8 text", file=path, line=line)
    try:
        return parse_stock_list(text, file=path)
    except FormatError as err:
        raise err.located(file=path)
