"""Building segments from text: :func:`curve`, an expression curve for library users.

The expressions go through the whitelist parser :func:`revolve.expr.parse_expression`
(never ``eval``, ``sympify`` or ``parse_expr``), exactly as the ``curve`` keys of
the profile file do; the ends may be numbers or constant expressions such as
``"pi/2"`` (:func:`revolve.expr.parse_number`).
"""

from __future__ import annotations

from typing import Optional, Union

from revolve.errors import RevolveError, SegmentError

Number = Union[int, float, str]


def _end(value: Number, name: str):
    """A float and its exact value from a number or constant text."""
    from fractions import Fraction

    from revolve.expr import constant_float, parse_number

    if isinstance(value, str):
        tree = parse_number(value)
        return constant_float(tree), tree
    if isinstance(value, bool) or not isinstance(value, (int, float, Fraction)):
        raise SegmentError(f'{name} must be a number or a constant such as "pi/2", got {value!r}')
    return float(value), None


def _expression(text, name: str, variable: str):
    from revolve.expr import parse_expression

    if not isinstance(text, str):
        raise SegmentError(f'{name} must be expression text such as {name}="25*cos(t)", '
                           f"got {type(text).__name__}")
    try:
        return parse_expression(text, variables=(variable,))
    except RevolveError as e:
        raise e.located(place=name) from None


def curve(*, x: Optional[str] = None, y: Optional[str] = None,
          t_from: Optional[Number] = None, t_to: Optional[Number] = None,
          x_from: Optional[Number] = None, x_to: Optional[Number] = None,
          y_from: Optional[Number] = None, y_to: Optional[Number] = None,
          face: Optional[str] = None):
    """A curve segment from expression text, as the profile file's curves.

    Three forms, as in the profile file:

    * ``curve(x="25*cos(t)", y="25*sin(t)", t_from=0, t_to="pi/2")``: parametric in ``t``;
    * ``curve(y="40 - x^2/90", x_from=0, x_to=30)``: ``y`` as a function of ``x``;
    * ``curve(x="12 + y^2/50", y_from=0, y_to=10)``: ``x`` as a function of ``y``.

    Parameters
    ----------
    x, y : str
        Expression text (``+ - * / ^``, parentheses, ``sqrt``, ``sin``, ``cos``,
        ``pi``, ... — the whitelist of :mod:`revolve.expr`); never evaluated as Python.
    t_from, t_to, x_from, x_to, y_from, y_to : float or str
        The interval, as numbers or constant expressions (``"pi/2"``).
    face : str, optional
        Face name for surface results.

    Returns
    -------
    Curve

    Examples
    --------
    >>> quarter = curve(x="25*cos(t)", y="25*sin(t)", t_from=0, t_to="pi/2")
    >>> [round(v, 12) for v in quarter.start], [round(v, 12) for v in quarter.end]
    ([25.0, 0.0], [0.0, 25.0])
    >>> round(quarter.length(), 9)              # a quarter of 2π·25
    39.26990817
    >>> crown = curve(y="40 - x^2/90", x_from=0, x_to=30)
    >>> crown.end
    (30.0, 30.0)
    >>> curve(y="40 - x^2/90", x_from=5, x_to=5)
    Traceback (most recent call last):
    ...
    revolve.errors.SegmentError: the curve's interval is empty (start equals end)
    >>> curve(x="__import__('os')", y="t", t_from=0, t_to=1)       # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.ExpressionError: x: ...
    >>> curve(y="x")
    Traceback (most recent call last):
    ...
    revolve.errors.SegmentError: give x and y with t_from and t_to, y with x_from and x_to, or x with y_from and y_to
    """
    from revolve.expr import Var
    from revolve.geometry.segments import curve_from_expressions

    t = Var("t")
    if x is not None and y is not None and t_from is not None and t_to is not None \
            and x_from is None and x_to is None and y_from is None and y_to is None:
        x_expr, y_expr = _expression(x, "x", "t"), _expression(y, "y", "t")
        (t0, _), (t1, _) = _end(t_from, "t_from"), _end(t_to, "t_to")
    elif y is not None and x is None and x_from is not None and x_to is not None \
            and t_from is None and t_to is None and y_from is None and y_to is None:
        x_expr, y_expr = t, _expression(y, "y", "x").substitute({"x": t})
        (t0, _), (t1, _) = _end(x_from, "x_from"), _end(x_to, "x_to")
    elif x is not None and y is None and y_from is not None and y_to is not None \
            and t_from is None and t_to is None and x_from is None and x_to is None:
        x_expr, y_expr = _expression(x, "x", "y").substitute({"y": t}), t
        (t0, _), (t1, _) = _end(y_from, "y_from"), _end(y_to, "y_to")
    else:
        raise SegmentError("give x and y with t_from and t_to, y with x_from and x_to, "
                           "or x with y_from and y_to")
    return curve_from_expressions(x_expr, y_expr, t0, t1, face=face)
