"""The shop's stock list: rows read to SI, bad rows refused in one line with file, line and column.

Unit factors are exact by definition: 1 in = 25.4 mm and 1 ft = 0.3048 m
(international yard and pound agreement, 1959), 1 lb = 0.45359237 kg (same
agreement). The rows are invented demo stock; the checks are the conversions.
"""

from __future__ import annotations

import pytest

from revolve.errors import FormatError
from revolve.formats.stock_list import MAX_ROWS, parse_stock_list, read_stock_list

HEADER = "shape,size,grade,price,length\n"


def test_rows_in_si_with_their_lines(tmp_path):
    path = tmp_path / "rack.csv"
    path.write_text(
        "# our rack, spring\n"
        "Shape,Size,Grade,Price,Length,Supplier\n"
        "round,1 1/2 in,12L14,9.75 USD per ft,12 ft,North Steel\n"
        "\n"
        "tube,2 x 1 1/4 in,1026,3.10 USD/lb,20 ft,\n"
        "hex,3/4 in,C360,USD 6/ft,12 ft,\n", encoding="utf-8")
    items = read_stock_list(str(path))
    assert [i.line for i in items] == [3, 5, 6]
    bar, tube, hexagon = items
    assert bar.outside_diameter == pytest.approx(1.5 * 0.0254, rel=1e-15)
    assert bar.price_basis == "m" and bar.price == pytest.approx(9.75 / 0.3048, rel=1e-15)
    assert bar.rack_length == pytest.approx(12 * 0.3048, rel=1e-15)
    assert bar.supplier == "North Steel" and bar.currency == "USD"
    assert (tube.outside_diameter, tube.inside_diameter) == (pytest.approx(0.0508),
                                                             pytest.approx(1.25 * 0.0254))
    assert tube.price_basis == "kg" and tube.price == pytest.approx(3.10 / 0.45359237, rel=1e-12)
    assert hexagon.shape == "hex" and hexagon.outside_diameter == pytest.approx(0.75 * 0.0254)
    # the price of a piece follows its basis
    assert bar.price_for(length=0.3048, mass=99.0) == pytest.approx(9.75)
    assert tube.price_for(length=99.0, mass=0.45359237) == pytest.approx(3.10)


def test_metric_rows_and_a_byte_order_mark():
    items = parse_stock_list("\ufeff" + HEADER + "round,50 mm,S355,12.40 EUR/m,3 m\n"
                             "tube,50 x 32 mm,S355,8.20 EUR/kg,6000 mm\n", file="r.csv")
    assert [(i.outside_diameter, i.inside_diameter, i.rack_length) for i in items] == [
        (0.05, 0.0, 3.0), (0.05, 0.032, 6.0)]


@pytest.mark.parametrize("row, where, text", [
    ("round,50,S355,12 EUR/m,3 m", "column 'size'", "size '50' has no unit"),
    ("round,50 mm,S355,12 EUR/m,3", "column 'length'", "length '3' has no unit"),
    ("round,50 mm,S355,12,3 m", "column 'price'", "'12' is not a price"),
    ("round,50 mm,S355,12 EUR/m²,3 m", "column 'price'", "a price per 'm²'"),
    ("round,50 mm,S355,-12 EUR/m,3 m", "column 'price'", "'-12 EUR/m' is not a price"),
    ("round,50 mm,S355,12 EUR USD/m,3 m", "column 'price'", "is not a price"),
    ("cone,50 mm,S355,12 EUR/m,3 m", "column 'shape'", "unknown shape 'cone'"),
    ("tube,50 x 60 mm,S355,12 EUR/m,3 m", "column 'size'", "the inside diameter of"),
    ("tube,50 mm,S355,12 EUR/m,3 m", "column 'size'", "a tube's size '50 mm' is its outside"),
    ("round,50 x 30 mm,S355,12 EUR/m,3 m", "column 'size'", "a round has one size"),
    ("round,50 kg,S355,12 EUR/m,3 m", "column 'size'", "size '50 kg' is not a length"),
    ("round,0 mm,S355,12 EUR/m,3 m", "column 'size'", "must be a positive length"),
    ("round,50 mm,,12 EUR/m,3 m", "column 'grade'", "the grade is empty"),
    ("round,50 mm,S355,12 EUR/m", None, "the row has 4 cells; the header has 5"),
    ("round,50 mm,S355,1e999 EUR/m,3 m", "column 'price'", "is not a price"),
    ('round,"50 mm,S355,12 EUR/m,3 m', None, "the line is not CSV"),
])
def test_bad_row_one_line_with_file_line_and_column(row, where, text):
    with pytest.raises(FormatError) as err:
        parse_stock_list(HEADER + "round,20 mm,S355,4 EUR/m,3 m\n" + row + "\n", file="rack.csv")
    message = str(err.value)
    prefix = "rack.csv:3: " + (f"{where}: " if where else "")
    assert message.startswith(prefix), message
    assert text in message and "\n" not in message


@pytest.mark.parametrize("text, start", [
    ("shape,size,grade,price\nround,50 mm,S,1/m\n", "rack.csv:1: the header has no column 'length'"),
    ("shape,size,grade,price,length,colour\n", "rack.csv:1: column 6: unknown column 'colour'"),
    ("shape,size,grade,price,length,size\n", "rack.csv:1: the column 'size' is given twice"),
    ("", "rack.csv:1: the stock list is empty"),
    (HEADER + "round,20 mm,S,4 EUR/m,3 m\nround,30 mm,S,4 USD/m,3 m\n",
     "rack.csv:3: column 'price': the price is in USD, but line 2 is in EUR"),
    (HEADER + "round,20 mm,S355,4 EUR/m,3 m\nround,20.0 mm,s355,5 EUR/m,6 m\n",
     "rack.csv:3: this round 20.0 mm s355 is already on line 2"),
    (HEADER + "round,20 mm,S," + "9" * 300 + " EUR/m,3 m\n",
     "rack.csv:2: column 'price': the cell has 306 characters"),
])
def test_bad_file_one_line(text, start):
    with pytest.raises(FormatError) as err:
        parse_stock_list(text, file="rack.csv")
    assert str(err.value).startswith(start), str(err.value)
    assert "\n" not in str(err.value)


def test_too_many_rows_is_refused():
    rows = "".join(f"round,{k + 1} mm,S,1 EUR/m,3 m\n" for k in range(MAX_ROWS + 1))
    with pytest.raises(FormatError, match=f"more than {MAX_ROWS} rows"):
        parse_stock_list(HEADER + rows, file="rack.csv")


def test_unreadable_files(tmp_path):
    binary = tmp_path / "rack.csv"
    binary.write_bytes(HEADER.encode() + b"round,20 mm,S,4 EUR/m,3 m\nround,\xff mm\n")
    with pytest.raises(FormatError) as err:
        read_stock_list(str(binary))
    assert str(err.value) == f"{binary}:3: the stock list is not UTF-8 text"
    nul = tmp_path / "nul.csv"
    nul.write_bytes(HEADER.encode() + b"round,20\x00 mm,S,4 EUR/m,3 m\n")
    with pytest.raises(FormatError) as err:
        read_stock_list(str(nul))
    assert str(err.value).startswith(f"{nul}:2: the line holds a NUL character")
    with pytest.raises(FormatError) as err:
        read_stock_list(str(tmp_path / "missing.csv"))
    assert str(err.value).startswith(f"{tmp_path / 'missing.csv'}: cannot read the stock list")
