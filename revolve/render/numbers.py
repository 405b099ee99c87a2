"""Numbers as people read them in tables: a fixed number of significant figures, grouped digits.

Every table the tool prints formats its figures here; JSON and CSV keep full
precision and never pass through this module.

The rules (stated in the README, "Numbers in tables"):

* :data:`SIGNIFICANT` (six) significant figures, as a quote or a drawing
  carries them; float noise disappears with the rounding (``100.00000000000004``
  prints ``100``, ``0.9999999999999999`` prints ``1``);
* trailing zeros after the decimal point are dropped;
* integer parts of five or more digits are grouped in threes with a narrow
  no-break space (U+202F), as the SI brochure recommends for long numbers
  (a thin space, never a comma or a point, which are decimal signs somewhere);
* sizes from 10⁻⁴ up to 10¹⁵ are written without an exponent; others as
  ``1.23457e-07``;
* money is written with two decimals and grouped, percentages with the same
  significant figures and a ``%`` sign;
* a missing figure (None, NaN) is an em dash.

Examples
--------
>>> number(100.00000000000004), number(0.9999999999999999), number(1234.5678)
('100', '1', '1234.57')
>>> print(number(20943951024.0), number(20943.951024), sep=" | ")   # grouped by U+202F
20 944 000 000 | 20 944
>>> number(8.4415e-05), number(-0.0)     # too small for its unit: choose a smaller unit
('8.4415e-05', '0')
>>> number(3.14159265e-9), number(None), number(float("nan"))
('3.14159e-09', '—', '—')
>>> print(money(1234567.891), percent(99.99999999999999), sep=" | ")
1 234 567.89 | 100 %
"""

from __future__ import annotations

import math
from typing import Any, Optional

__all__ = ["SIGNIFICANT", "GROUP", "MISSING", "number", "money", "percent", "group_digits"]

#: Significant figures of a figure in a table (JSON and CSV keep every digit).
SIGNIFICANT = 6
#: The digit-group separator: a narrow no-break space.
GROUP = "\u202f"
#: What a missing figure prints as.
MISSING = "—"


def group_digits(text: str) -> str:
    """Group the integer part of a plain decimal ``text`` in threes when it has five or more digits.

    >>> print(group_digits("12345.678"), group_digits("-1234"), group_digits("1234567"), sep=" | ")
    12 345.678 | -1234 | 1 234 567
    """
    sign = text[0] if text[:1] in "+-" else ""
    body = text[len(sign):]
    whole, dot, frac = body.partition(".")
    if len(whole) < 5 or not whole.isdigit():
        return text
    head = len(whole) % 3 or 3
    groups = [whole[:head]] + [whole[i:i + 3] for i in range(head, len(whole), 3)]
    return sign + GROUP.join(groups) + dot + frac


def _float(value: Any) -> Optional[float]:
    if value is None or isinstance(value, bool):
        return None
    try:
        v = float(value)
    except (TypeError, ValueError):
        return None
    return v if math.isfinite(v) else None


def number(value: Any, significant: int = SIGNIFICANT) -> str:
    """A figure for a table: ``significant`` significant figures, grouped, no float noise.

    Text that is not a number is returned as it is.

    >>> number(0), number(1e15), number(0.5, 2), number(12345678.9, 3).replace(GROUP, " ")
    ('0', '1e+15', '0.5', '12 300 000')
    >>> number("n/a")
    'n/a'
    """
    if isinstance(value, str):
        return value
    v = _float(value)
    if v is None:
        return MISSING
    if v == 0:
        return "0"
    rounded = float(f"{v:.{significant - 1}e}")     # the rounding removes float noise
    mag = abs(rounded)
    if 1e-4 <= mag < 1e15:
        decimals = max(0, significant - 1 - int(math.floor(math.log10(mag))))
        text = f"{rounded:.{decimals}f}"
        if "." in text:
            text = text.rstrip("0").rstrip(".")
        return group_digits(text)
    mantissa, _, exponent = f"{rounded:.{significant - 1}e}".partition("e")
    if "." in mantissa:
        mantissa = mantissa.rstrip("0").rstrip(".")
    return f"{mantissa}e{exponent}"


def money(value: Any) -> str:
    """An amount of money: two decimals, grouped (the currency is printed beside it by the caller).

    >>> money(0.005), money(12.5), money(None)
    ('0.01', '12.50', '—')
    """
    v = _float(value)
    if v is None:
        return MISSING
    return group_digits(f"{round(v + 0.0, 2):.2f}") if abs(v) < 1e15 else f"{v:.3e}"


def percent(value: Any, significant: int = SIGNIFICANT) -> str:
    """A percentage (``value`` already in percent), with its sign.

    >>> percent(12.5), percent(100.00000000000004), percent(None)
    ('12.5 %', '100 %', '—')
    """
    text = number(value, significant)
    return text if text == MISSING else f"{text} %"
